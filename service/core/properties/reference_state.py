"""The one reference state of energies and entropies, for liquid, vapor and ice alike."""

from __future__ import annotations

from typing import Final

__all__ = ["REFERENCE_STATE", "REFERENCE_STATE_ID"]

REFERENCE_STATE: Final = (
    "IAPWS convention for liquid, vapor and ice alike: specific internal energy and specific "
    "entropy of saturated liquid water at the triple point (273.16 K, 611.657 Pa) are zero "
    "(IAPWS R6-95(2018)); the ice Ih Gibbs function of IAPWS R10-06(2009) is fixed to the "
    "same zero, and IAPWS-IF97 agrees with it within its consistency limits."
)

REFERENCE_STATE_ID: Final = "iapws-triple-point-liquid"
"""Stable id of :data:`REFERENCE_STATE`, by which compact answers cite it."""
