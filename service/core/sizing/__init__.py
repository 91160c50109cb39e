"""Sizing on the chamber simulation: the value of one case field that just meets a target.

Public API: :func:`size_vacuum_chamber` with :class:`SizingCase` (a
:class:`~service.core.simulation.VacuumChamberCase`, the dotted path of the field to solve
for, a :class:`CoolingTarget` or the case's schedule) -> :class:`SizingResult`.
"""

from service.core.sizing.fields import SIZABLE_FIELDS, SizableField
from service.core.sizing.results import CoolingTarget, DesignPoint, SizingCase, SizingResult
from service.core.sizing.solve import (
    CURVE_POINTS,
    MARGIN_FACTOR,
    NoSolutionError,
    NotMonotoneError,
    size_vacuum_chamber,
)

__all__ = [
    "CURVE_POINTS",
    "MARGIN_FACTOR",
    "SIZABLE_FIELDS",
    "CoolingTarget",
    "DesignPoint",
    "NoSolutionError",
    "NotMonotoneError",
    "SizableField",
    "SizingCase",
    "SizingResult",
    "size_vacuum_chamber",
]
