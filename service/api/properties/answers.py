"""Property answers: the phase blocks of saturation, phase-line and state lookups."""

from __future__ import annotations

from typing import Any

from service.api.http.quantities import quantity_output
from service.api.http.units import Dimension, UnitSet
from service.core.properties.phase import PhasePoint, PhaseProperties

__all__ = ["phase_output"]

_PHASE_FIELDS: tuple[tuple[str, Dimension, bool], ...] = (
    # name, dimension, diverges at the critical point (reported as null there)
    ("density", Dimension.DENSITY, False),
    ("specific_enthalpy", Dimension.SPECIFIC_ENERGY, False),
    ("specific_internal_energy", Dimension.SPECIFIC_ENERGY, False),
    ("specific_entropy", Dimension.SPECIFIC_ENTROPY, False),
    ("specific_isobaric_heat_capacity", Dimension.SPECIFIC_ENTROPY, True),
)


def phase_output(
    properties: PhaseProperties | PhasePoint, unit_set: UnitSet, *, as_array: bool
) -> dict[str, Any]:
    """The five phase properties of the API, in ``unit_set`` (arrays, or one state)."""
    return {
        name: quantity_output(
            getattr(properties, name),
            dimension,
            unit_set,
            as_array=as_array,
            divergent_as_null=divergent,
        )
        for name, dimension, divergent in _PHASE_FIELDS
    }
