"""Ice-fraction requests (POST body or GET query) -> the core lookup's SI inputs."""

from __future__ import annotations

from dataclasses import dataclass
from typing import Any

from fastapi import Request

from service.api.http.limits import check_batch_size
from service.api.http.models import QuantityValue, QuantityValues
from service.api.http.quantities import ParsedQuantity, read_quantity, require_exactly_one
from service.api.http.units import Dimension, parse_quantity_text
from service.core.balances.food_composition import Composition
from service.core.errors import InvalidInputError
from service.core.properties.phase import FloatArray
from service.settings import Settings

__all__ = ["IceFractionInputs", "read_ice_fraction"]

_GRAMS_PER_KILOGRAM = 1e-3


@dataclass(frozen=True)
class IceFractionInputs:
    """The lookup's inputs in SI; ``is_array`` if any was sent as a batch."""

    temperature: FloatArray
    pressure: FloatArray
    solute_name: str | None
    mass_fraction: FloatArray | None
    model: str
    absolute_salinity: FloatArray | None
    is_array: bool
    composition: Composition | None = None
    freezing_point: FloatArray | None = None


def _has_unit(raw: Any) -> bool:
    if isinstance(raw, str):
        return parse_quantity_text(raw, field="seawater.absolute_salinity")[1] is not None
    if isinstance(raw, QuantityValue | QuantityValues):
        return raw.unit is not None
    return False


def _read_salinity(raw: Any, field: str) -> ParsedQuantity:
    """A bare number is in g/kg; a number with a unit (g/kg, %, kg/kg) converts."""
    parsed = read_quantity(raw, field=field, dimension=Dimension.DIMENSIONLESS)
    if _has_unit(raw):
        return parsed
    return ParsedQuantity(si=parsed.si * _GRAMS_PER_KILOGRAM, is_array=parsed.is_array)


def read_ice_fraction(
    request: Request,
    *,
    temperature: Any,
    pressure: Any,
    solute_name: str | None,
    mass_fraction: Any,
    model: str,
    absolute_salinity: Any,
    solute_field: str = "solute",
    salinity_field: str = "seawater.absolute_salinity",
    composition: dict[str, Any] | None = None,
    freezing_point: Any = None,
    dissolved_solutes: dict[str, Any] | None = None,
) -> IceFractionInputs:
    """Read and check the inputs (exactly one mixture; equal batch lengths or one value).

    ``composition`` maps component names to their raw mass fractions (one value each),
    ``dissolved_solutes`` solute names to theirs (per kg of food)."""
    if composition is None:
        require_exactly_one((solute_field, solute_name), ("seawater", absolute_salinity))
    elif solute_name is not None or absolute_salinity is not None:
        raise InvalidInputError(
            f"{solute_field}, seawater, composition",
            "give exactly one of solute, seawater or composition",
        )
    if composition is None and freezing_point is not None:
        raise InvalidInputError(
            "freezing_point",
            "taken with a composition only: a solute's or seawater's freezing point comes "
            "from its own model",
        )
    t = read_quantity(temperature, field="temperature", dimension=Dimension.TEMPERATURE)
    p = read_quantity(pressure, field="pressure", dimension=Dimension.PRESSURE)
    parsed = {"temperature": t, "pressure": p}
    fraction = salinity = onset = None
    food = None
    if composition is not None:
        dissolved = tuple(
            (name, _one_fraction(raw, f"dissolved_solutes.{name}"))
            for name, raw in (dissolved_solutes or {}).items()
        )
        food = Composition(
            **{name: _one_fraction(raw, name) for name, raw in composition.items()},
            dissolved_solutes=dissolved,
        )
        if freezing_point is not None:
            onset = read_quantity(
                freezing_point, field="freezing_point", dimension=Dimension.TEMPERATURE
            )
            parsed["freezing_point"] = onset
    elif absolute_salinity is not None:
        salinity = _read_salinity(absolute_salinity, salinity_field)
        parsed[salinity_field] = salinity
    else:
        if mass_fraction is None:
            raise InvalidInputError(f"{solute_field}.mass_fraction", "required with a solute", None)
        fraction = read_quantity(
            mass_fraction,
            field=f"{solute_field}.mass_fraction",
            dimension=Dimension.DIMENSIONLESS,
        )
        parsed[f"{solute_field}.mass_fraction"] = fraction
    settings: Settings = request.app.state.settings
    sizes = {name: item.size for name, item in parsed.items()}
    check_batch_size(
        max(sizes.values()),
        settings.max_batch_points,
        noun="points",
        setting="TRIPOINT_MAX_BATCH_POINTS",
    )
    longest = max(sizes.values())
    for name, size in sizes.items():
        if size not in (1, longest):
            raise InvalidInputError(
                name,
                f"has {size} values where another input has {longest}; give equal "
                "lengths or one value",
            )
    return IceFractionInputs(
        temperature=t.si,
        pressure=p.si,
        solute_name=solute_name,
        mass_fraction=None if fraction is None else fraction.si,
        model=model,
        absolute_salinity=None if salinity is None else salinity.si,
        is_array=any(item.is_array for item in parsed.values()),
        composition=food,
        freezing_point=None if onset is None else onset.si,
    )


def _one_fraction(raw: Any, name: str) -> float:
    """One mass fraction of the composition (unit 1, or a unit such as %)."""
    field = f"composition.{name}"
    parsed = read_quantity(raw, field=field, dimension=Dimension.DIMENSIONLESS)
    if parsed.is_array or parsed.si.size != 1:
        raise InvalidInputError(field, "one value: a batch runs over temperature", None)
    return float(parsed.si[0])
