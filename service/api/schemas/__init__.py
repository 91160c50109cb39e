"""Request and response models, in pairs per operation, on one shared base."""
