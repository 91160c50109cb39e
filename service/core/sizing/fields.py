"""Which case fields a sizing may solve for, and which way the cooling target moves with them.

A sizing answers "the smallest (or largest) value of one field that meets the target" by
bracketing and solving on the simulation; that is only the boundary of the feasible set
when the time to the target is monotone in the field. This table lists the fields for
which the model makes it so, with their direction:

- ``+1`` (more helps): pump speed (nominal or the factor on its curve), condenser vapor
  conductance and refrigeration capacity;
- ``-1`` (more hurts): pump ultimate pressure, condenser surface temperature, chamber free
  volume, air leak, product mass, constant heat gain.

Every other field of :data:`service.core.simulation.case_fields.CASE_FIELDS` is refused:
the product's initial temperature or water fraction, the heat-gain conductance, the
evaporation coefficient... move the time to the target both ways (or are the target
itself). The direction is also checked on the computed design curve.
"""

from __future__ import annotations

from dataclasses import dataclass
from typing import Final, Literal

from service.core.errors import InvalidInputError
from service.core.simulation.case_fields import CASE_FIELDS, CaseField
from service.core.simulation.inputs import SIMULATION_LIMITS, VacuumChamberCase

__all__ = ["SIZABLE_FIELDS", "SizableField", "sizable_field"]

BracketRule = Literal["scale", "condenser-temperature"]


@dataclass(frozen=True)
class SizableField:
    """A case field a sizing may solve for.

    Attributes
    ----------
    field : CaseField
        Path, SI unit and meaning.
    direction : {1, -1}
        +1 when a larger value shortens the time to the target, -1 when it lengthens it.
    bracket : {"scale", "condenser-temperature"}
        Default bracket: ``scale`` is [value / 100, value x 100] around the case's own
        value; ``condenser-temperature`` the whole condenser range, 173.15 K to 273.16 K.
    """

    field: CaseField
    direction: int
    bracket: BracketRule = "scale"


def _sizable(path: str, direction: int, bracket: BracketRule = "scale") -> SizableField:
    return SizableField(CASE_FIELDS[path], direction, bracket)


SIZABLE_FIELDS: Final[dict[str, SizableField]] = {
    item.field.path: item
    for item in (
        _sizable("pump.nominal_speed", 1),
        _sizable("pump.speed_scale", 1),
        _sizable("pump.ultimate_pressure", -1),
        _sizable("condenser.vapor_conductance", 1),
        _sizable("condenser.refrigeration_capacity", 1),
        _sizable("condenser.surface_temperature", -1, "condenser-temperature"),
        _sizable("chamber.free_volume", -1),
        _sizable("chamber.leak_rate", -1),
        _sizable("product.mass", -1),
        _sizable("heat_gain.power", -1),
    )
}
"""Fields a sizing may name in ``find``, by dotted path."""

_CONDENSER_TEMPERATURE_RANGE: Final = (
    float(SIMULATION_LIMITS["condenser_temperature_min"]),
    273.16,
)
_SCALE: Final = 100.0


def sizable_field(case: VacuumChamberCase, path: str) -> SizableField:
    """The sizable field ``path`` of ``case``, after checking the case can vary it.

    Raises
    ------
    InvalidInputError
        ``path`` is not a case field, is one in which the target is not monotone, or
        names a part the case lacks (a condenser field without a condenser, the nominal
        speed of a pump given by a speed curve).
    """
    if path not in SIZABLE_FIELDS:
        if path not in CASE_FIELDS:
            known = ", ".join(SIZABLE_FIELDS)
            raise InvalidInputError(
                "find", f"{path!r} is not a field of the case; sizable: {known}", path
            )
        known = ", ".join(SIZABLE_FIELDS)
        raise InvalidInputError(
            "find",
            f"the time to the target is not monotone in {path} (it can move both ways), so "
            f"no smallest value is defined; sizable fields: {known}",
            path,
        )
    if path.startswith("condenser.") and case.condenser is None:
        raise InvalidInputError("find", f"the case has no condenser to size ({path})", path)
    if path == "pump.nominal_speed" and case.pump.speed_curve_speeds:
        raise InvalidInputError(
            "find",
            "the pump is given by a speed curve, which replaces its nominal speed; solve for "
            "pump.speed_scale (a factor on the whole curve) instead",
            path,
        )
    return SIZABLE_FIELDS[path]


def default_bracket(item: SizableField, value: float | None) -> tuple[float, float]:
    """The bracket searched when the request gives none (SI).

    Raises
    ------
    InvalidInputError
        The field has no value in the case (and no natural range) to build it on.
    """
    if item.bracket == "condenser-temperature":
        return _CONDENSER_TEMPERATURE_RANGE
    if value is None or value <= 0.0:
        raise InvalidInputError(
            "bracket",
            f"the case gives no positive {item.field.path} to search around; state the "
            "bracket (lower and upper)",
            value,
        )
    return value / _SCALE, value * _SCALE
