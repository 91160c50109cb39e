"""Calibrations: fit the chamber model to a measured run."""
