"""The thin HTTP layer: routers validate, call one core function, shape the answer."""
