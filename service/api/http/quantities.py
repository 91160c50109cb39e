"""Read quantity inputs (any accepted shape) into SI arrays; shape SI results for output."""

from __future__ import annotations

import math
from dataclasses import dataclass
from typing import Any, NoReturn

import numpy as np

from service.api.http.models import QuantityValue, QuantityValues
from service.api.http.sent_units import note_unit, sent_unit
from service.api.http.units import (
    Dimension,
    UnitSet,
    convert_from_si,
    convert_to_si,
    number_to_si,
    output_unit,
    parse_quantity_text,
    si_to_unit,
)
from service.core.errors import InvalidInputError
from service.core.properties.phase import FloatArray

__all__ = [
    "ParsedQuantity",
    "echo_output",
    "quantity_output",
    "read_quantity",
    "require_exactly_one",
    "scalar_output",
]

_DIFFERENCE_OF = {Dimension.TEMPERATURE: Dimension.TEMPERATURE_DIFFERENCE}


@dataclass(frozen=True)
class ParsedQuantity:
    """An input in SI: always a 1-D array; ``is_array`` says how it was sent."""

    si: FloatArray
    is_array: bool
    standard_uncertainty: FloatArray | None = None

    @property
    def size(self) -> int:
        """Number of points."""
        return int(self.si.size)


def require_exactly_one(
    first: tuple[str, object], second: tuple[str, object], *, prefix: str = ""
) -> None:
    """Refuse both or neither of two alternative inputs, each given as ``(name, value)``.

    Raises
    ------
    InvalidInputError
        Naming both fields (under ``prefix``) and whether both or neither were given.
    """
    (first_name, first_value), (second_name, second_value) = first, second
    if (first_value is None) != (second_value is None):
        return
    given = "both" if first_value is not None else "neither"
    raise InvalidInputError(
        f"{prefix}{first_name}, {prefix}{second_name}",
        f"give exactly one of {first_name} or {second_name} ({given} given)",
    )


def read_quantity(raw: Any, *, field: str, dimension: Dimension) -> ParsedQuantity:
    """Convert one input field to SI.

    Parameters
    ----------
    raw
        A number (default SI unit), a string ``"25 degC"``, a :class:`QuantityValue`,
        a :class:`QuantityValues` or a list of numbers.
    field
        Name of the input, used in error messages.
    dimension
        What kind of quantity the field holds.

    Raises
    ------
    InvalidInputError
        Unknown unit, wrong dimension, non-finite number, unreadable text.
    """
    unit: str | None
    uncertainty: float | None = None
    if isinstance(raw, bool):
        raise InvalidInputError(field, "expected a number, not a boolean", raw)
    if isinstance(raw, int | float):
        values: Any = float(raw)
        unit, is_array = None, False
    elif isinstance(raw, str):
        values, unit = parse_quantity_text(raw, field=field)
        is_array = False
    elif isinstance(raw, QuantityValue):
        values, unit, uncertainty, is_array = raw.value, raw.unit, raw.uncertainty, False
    elif isinstance(raw, QuantityValues):
        values, unit, uncertainty, is_array = raw.values, raw.unit, raw.uncertainty, True
    elif isinstance(raw, list):
        values, unit, is_array = raw, None, True
    else:
        raise InvalidInputError(field, f"unsupported input of type {type(raw).__name__}", None)
    note_unit(field, unit, dimension)
    if not is_array and uncertainty is None:
        # One number: the same conversion on a float, then one array (no numpy checks).
        if not math.isfinite(values):
            raise InvalidInputError(field, "values must be finite numbers", None)
        si_value = number_to_si(float(values), unit, dimension, field=field)
        if dimension is Dimension.TEMPERATURE and si_value < 0.0:
            _below_absolute_zero(field, float(values), unit)
        return ParsedQuantity(si=np.array([si_value]), is_array=False)
    array = np.atleast_1d(np.asarray(values, dtype=np.float64))
    if array.ndim != 1:
        raise InvalidInputError(field, "arrays must be flat lists of numbers", None)
    if array.size == 0:
        raise InvalidInputError(field, "an array needs at least one value", [])
    if not np.isfinite(array).all():
        raise InvalidInputError(field, "values must be finite numbers", None)
    si = convert_to_si(array, unit, dimension, field=field)
    if dimension is Dimension.TEMPERATURE and bool((si < 0.0).any()):
        index = int(np.flatnonzero(si < 0.0)[0])
        _below_absolute_zero(field, float(array[index]), unit, index if array.size > 1 else None)
    standard_uncertainty = None
    if uncertainty is not None:
        difference = _DIFFERENCE_OF.get(dimension, dimension)
        scale = convert_to_si(np.array([1.0]), unit, difference, field=field)[0]
        if difference is not dimension:
            scale -= convert_to_si(np.array([0.0]), unit, difference, field=field)[0]
        standard_uncertainty = np.full(si.shape, abs(uncertainty * scale))
    return ParsedQuantity(si=si, is_array=is_array, standard_uncertainty=standard_uncertainty)


def _below_absolute_zero(
    field: str, value: float, unit: str | None, index: int | None = None
) -> NoReturn:
    where = "" if index is None else f" (element {index})"
    raise InvalidInputError(
        field,
        f"{value:.10g} {unit or 'K'}{where} is below absolute zero "
        "(0 K = -273.15 degC = -459.67 degF)",
        value,
    )


def quantity_output(
    si_values: FloatArray | float,
    dimension: Dimension,
    unit_set: UnitSet,
    *,
    as_array: bool,
    divergent_as_null: bool = False,
) -> dict[str, Any]:
    """Shape SI results as ``{"value"|"values": ..., "unit": ...}`` in ``unit_set``.

    ``si_values`` is an array, or one Python float (a one-state answer, shaped as a
    ``value``). ``divergent_as_null`` is for quantities that physically diverge
    (isobaric heat capacity at the critical point): +infinity is reported as ``null``.
    Any other non-finite value is left for the response renderer to refuse as a defect.
    """
    if type(si_values) is float and not as_array:
        unit = output_unit(dimension, unit_set)
        if divergent_as_null and si_values == math.inf:
            return {"value": None, "unit": unit}
        if unit_set is UnitSet.SI:  # what convert_from_si answers for SI, without the call
            return {"value": si_values, "unit": unit}
        return {"value": convert_from_si(si_values, dimension, unit_set), "unit": unit}
    converted = convert_from_si(np.asarray(si_values, dtype=np.float64), dimension, unit_set)
    unit = output_unit(dimension, unit_set)
    values: Any = converted
    if divergent_as_null and np.isposinf(converted).any():
        values = [None if np.isposinf(item) else float(item) for item in converted.ravel()]
        if not as_array:
            return {"value": values[0], "unit": unit}
    if as_array:
        return {"values": values, "unit": unit}
    return {"value": float(converted.reshape(-1)[0]), "unit": unit}


def echo_output(
    field: str,
    si_values: FloatArray,
    dimension: Dimension,
    unit_set: UnitSet,
    *,
    as_array: bool,
) -> dict[str, Any]:
    """An input repeated in the answer: in the unit the caller sent ``field`` in (as
    noted during this request), else as :func:`quantity_output` gives it."""
    sent = sent_unit(field)
    if sent is None or sent.unit is None or sent.dimension is not dimension:
        return quantity_output(si_values, dimension, unit_set, as_array=as_array)
    values = [si_to_unit(float(item), sent.unit, dimension) for item in np.ravel(si_values)]
    values = [float(f"{item:.12g}") for item in values]
    if as_array:
        return {"values": values, "unit": sent.unit.strip()}
    return {"value": values[0], "unit": sent.unit.strip()}


def scalar_output(
    si_value: float | None, dimension: Dimension, unit_set: UnitSet
) -> dict[str, Any] | None:
    """One SI number as ``{"value": ..., "unit": ...}`` in ``unit_set``; ``None`` stays None."""
    if si_value is None:
        return None
    return quantity_output(float(si_value), dimension, unit_set, as_array=False)
