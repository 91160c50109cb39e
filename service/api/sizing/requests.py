"""Sizing request -> core sizing case (SI), the field's unit, and errors named in the request.

The case is read as the simulation reads it; errors the core raises about a case field
(``pump.nominal_speed``) are renamed under ``case.`` (``case.pump.nominal_speed``), the
path the sizing request uses.
"""

from __future__ import annotations

import contextlib
from collections.abc import Iterator
from dataclasses import replace
from typing import Any, Final

from pydantic import BaseModel

from service.api.http.models import QuantityValue
from service.api.http.quantities import read_quantity
from service.api.http.units import Dimension, number_to_si, parse_quantity_text
from service.api.simulations.answers import FIELD_DIMENSIONS
from service.api.simulations.requests import read_vacuum_chamber
from service.api.sizing.schemas import VacuumChamberSizingCreate
from service.core.errors import InvalidInputError, OutOfRangeError, UnsupportedStateError
from service.core.simulation.case_fields import CASE_FIELDS
from service.core.sizing import CoolingTarget, SizingCase

__all__ = ["FieldUnit", "case_errors_in_request", "read_sizing"]

_DIMENSIONS: Final = FIELD_DIMENSIONS

_SIZING_FIELDS: Final = frozenset(
    {
        "find",
        "bracket",
        "bracket.lower",
        "bracket.upper",
        "target",
        "target.temperature",
        "target.time",
        "relative_tolerance",
    }
)


class FieldUnit:
    """The unit the answer gives the field in, and the conversion from SI to it."""

    def __init__(self, dimension: Dimension, unit: str | None) -> None:
        self.dimension = dimension
        self.label = unit if unit is not None else _si_label(dimension)
        zero = number_to_si(0.0, unit, dimension, field="find")
        self._offset = zero
        self._scale = number_to_si(1.0, unit, dimension, field="find") - zero

    def from_si(self, value: float) -> float:
        """``value`` (SI) in this unit."""
        return (value - self._offset) / self._scale

    def output(self, value: float) -> dict[str, Any]:
        """``{"value", "unit"}`` of an SI value."""
        return {"value": self.from_si(value), "unit": self.label}


def _si_label(dimension: Dimension) -> str:
    return next(unit for unit, known in _DIMENSIONS.items() if known is dimension)


def _raw_field(body: VacuumChamberSizingCreate, path: str) -> Any:
    """The input the case gives at ``path`` (None where unset)."""
    part: Any = body.case
    for name in path.split("."):
        if not isinstance(part, BaseModel):
            return None
        part = getattr(part, name, None)
    return part


def _unit_of(raw: Any) -> str | None:
    if isinstance(raw, str):
        return parse_quantity_text(raw, field="find")[1]
    if isinstance(raw, QuantityValue):
        return raw.unit
    return None


def _one(raw: Any, path: str, dimension: Dimension) -> float:
    parsed = read_quantity(raw, field=path, dimension=dimension)
    if parsed.is_array or parsed.size != 1:
        raise InvalidInputError(path, "must be a single value")
    return float(parsed.si[0])


def read_sizing(
    body: VacuumChamberSizingCreate,
) -> tuple[SizingCase, FieldUnit, tuple[str, ...]]:
    """The sizing request as a core case, the unit of the answer, and HTTP assumptions.

    Raises
    ------
    InvalidInputError
        Unreadable quantity, unknown field, a case the simulation refuses to read.
    """
    with case_errors_in_request():
        case, notes = read_vacuum_chamber(body.case)
    known = CASE_FIELDS.get(body.find)
    if known is None:
        raise InvalidInputError(
            "find",
            f"{body.find!r} is not a field of the case; known: {', '.join(CASE_FIELDS)}",
            body.find,
        )
    dimension = _DIMENSIONS[known.unit]
    bracket = None
    unit = _unit_of(_raw_field(body, body.find))
    if body.bracket is not None:
        bracket = (
            _one(body.bracket.lower, "bracket.lower", dimension),
            _one(body.bracket.upper, "bracket.upper", dimension),
        )
        unit = unit or _unit_of(body.bracket.lower)
    target = None
    if not isinstance(body.target, str):
        target = CoolingTarget(
            temperature=_one(body.target.temperature, "target.temperature", Dimension.TEMPERATURE),
            time=_one(body.target.time, "target.time", Dimension.TIME),
        )
    sizing = SizingCase(
        case=case,
        find=body.find,
        target=target,
        bracket=bracket,
        relative_tolerance=body.relative_tolerance,
    )
    return sizing, FieldUnit(dimension, unit), notes


@contextlib.contextmanager
def case_errors_in_request() -> Iterator[None]:
    """Rename core errors about a case field to their path in the sizing request."""
    try:
        yield
    except (InvalidInputError, OutOfRangeError, UnsupportedStateError) as error:
        if error.variable in _SIZING_FIELDS or error.variable.startswith("case."):
            raise
        raise replace(error, variable=f"case.{error.variable}") from None
