"""Primary drying: the run over a recipe and the design space."""
