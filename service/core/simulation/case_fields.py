"""Scalar fields of a vacuum-chamber case named by their dotted path: read one, replace one.

Sizing (solve for one field) and calibration (estimate several) both name the unknown by
the path the simulation request uses (``pump.nominal_speed``, ``chamber.leak_rate``...).
This module is the one table of those paths, their SI units and what each one means, plus
the virtual field ``pump.speed_scale``: a factor on the pump's whole speed (nominal speed
and every point of its speed curve), relative to the case it is applied to.
"""

from __future__ import annotations

from dataclasses import dataclass, replace
from typing import Any, Final

from service.core.errors import InvalidInputError
from service.core.simulation.inputs import HeatGainRate, VacuumChamberCase

__all__ = [
    "CASE_FIELDS",
    "CaseField",
    "case_field_value",
    "with_case_field",
]


@dataclass(frozen=True)
class CaseField:
    """One scalar field of :class:`VacuumChamberCase`.

    Attributes
    ----------
    path : str
        Dotted path, as in the simulation request (``"pump.nominal_speed"``).
    unit : str
        SI unit of the value (``"1"`` for a dimensionless one).
    meaning : str
        One line for answers and error messages.
    """

    path: str
    unit: str
    meaning: str


def _fields(*rows: tuple[str, str, str]) -> dict[str, CaseField]:
    return {path: CaseField(path, unit, meaning) for path, unit, meaning in rows}


CASE_FIELDS: Final[dict[str, CaseField]] = _fields(
    ("chamber.free_volume", "m3", "gas volume of the chamber"),
    ("chamber.initial_pressure", "Pa", "air partial pressure at the start"),
    ("chamber.temperature", "K", "temperature of the chamber gas and walls"),
    ("chamber.leak_rate", "Pa*m3/s", "air leak throughput"),
    ("chamber.initial_vapor_pressure", "Pa", "water vapor partial pressure at the start"),
    ("pump.nominal_speed", "m3/s", "pump volume flow at the inlet (no speed curve)"),
    ("pump.ultimate_pressure", "Pa", "pressure where the pump's speed falls to zero"),
    ("pump.speed_scale", "1", "factor on the pump's whole speed, curve included"),
    ("pump.water_vapor_tolerance", "kg/s", "vapor mass flow the pump tolerates (checked only)"),
    ("condenser.surface_temperature", "K", "condenser (cold trap) surface temperature"),
    ("condenser.vapor_conductance", "m3/s", "vapor volume flow the condenser takes in"),
    ("condenser.ice_capacity", "kg", "ice the condenser holds"),
    ("condenser.refrigeration_capacity", "W", "cap on the condenser's heat removal"),
    ("product.mass", "kg", "initial product mass"),
    ("product.initial_temperature", "K", "initial product temperature"),
    ("product.water_fraction", "1", "mass fraction of water in the product"),
    ("product.solids_specific_heat", "J/(kg*K)", "specific heat of the non-water part"),
    ("product.exposed_area", "m2", "evaporating area (kinetic evaporation)"),
    ("product.evaporation_coefficient", "1", "evaporation coefficient (kinetic evaporation)"),
    (
        "product.characteristic_size",
        "m",
        "diameter of one item for the air's resistance (kinetic evaporation)",
    ),
    ("product.nucleation_temperature", "K", "where ice nucleates in the supercooled product"),
    (
        "product.interior.half_thickness_or_radius",
        "m",
        "half-thickness or radius of one item (interior conduction)",
    ),
    ("product.interior.thermal_conductivity", "W/(m*K)", "product conductivity (interior)"),
    ("product.interior.density", "kg/m3", "product density, pores included (interior)"),
    (
        "product.interior.pore_venting_time",
        "s",
        "time constant of vapor leaving a porous product's pores (interior)",
    ),
    ("heat_gain.power", "W", "constant heat into the product"),
    ("heat_gain.conductance", "W/K", "conductance from the surroundings to the product"),
    ("heat_gain.surroundings_temperature", "K", "temperature of the surroundings"),
    ("heat_gain.radiating_area", "m2", "product area exchanging radiation with the walls"),
    ("heat_gain.emissivity", "1", "effective emissivity of the product-wall exchange"),
    ("heat_gain.wall_temperature", "K", "temperature of the radiating walls"),
    ("heat_gain.contact_coefficient", "W/(m2*K)", "heat-transfer coefficient to the shelf"),
    ("heat_gain.contact_area", "m2", "product area touching the shelf or tray"),
    ("heat_gain.shelf_temperature", "K", "temperature of the shelf or tray"),
    ("end_time", "s", "latest end of the simulation"),
    ("target_temperature", "K", "product temperature that ends the simulation"),
)
"""Every scalar case field a sizing or calibration may name, by dotted path."""


def _known(path: str) -> CaseField:
    try:
        return CASE_FIELDS[path]
    except KeyError:
        known = ", ".join(CASE_FIELDS)
        raise InvalidInputError(
            path, f"not a scalar field of the chamber case; known fields: {known}", path
        ) from None


def case_field_value(case: VacuumChamberCase, path: str) -> float | None:
    """The value of one scalar field, SI; None where the field (or its parent) is unset.

    Parameters
    ----------
    case : VacuumChamberCase
    path : str
        A key of :data:`CASE_FIELDS`. ``pump.speed_scale`` reads as 1.0 (the case's own
        pump).

    Raises
    ------
    InvalidInputError
        Unknown path.
    """
    _known(path)
    if path == "pump.speed_scale":
        return 1.0
    head, _, name = path.rpartition(".")
    parent: Any = case
    for part in head.split(".") if head else ():
        parent = getattr(parent, part)
        if parent is None:
            return None
    value = getattr(parent, name)
    return None if value is None else float(value)


def with_case_field(case: VacuumChamberCase, path: str, value: float) -> VacuumChamberCase:
    """A copy of ``case`` with one scalar field set to ``value`` (SI).

    Parameters
    ----------
    case : VacuumChamberCase
    path : str
        A key of :data:`CASE_FIELDS`. ``pump.speed_scale`` multiplies the pump's nominal
        speed and every speed of its speed curve by ``value``. A ``heat_gain.*`` field on
        a case without heat gain starts from a zero heat gain.
    value : float
        New value in the field's SI unit. It is not range-checked here: the simulation
        validates the whole case.

    Raises
    ------
    InvalidInputError
        Unknown path, or a condenser field on a case without a condenser.
    """
    _known(path)
    if path == "pump.speed_scale":
        pump = case.pump
        return replace(
            case,
            pump=replace(
                pump,
                nominal_speed=pump.nominal_speed * value,
                speed_curve_speeds=tuple(speed * value for speed in pump.speed_curve_speeds),
            ),
        )
    head, _, name = path.rpartition(".")
    change: dict[str, Any] = {name: float(value)}
    if not head:
        return replace(case, **change)
    changed: VacuumChamberCase = _replaced(case, head.split("."), change, path)
    return changed


def _replaced(owner: Any, parts: list[str], change: dict[str, Any], path: str) -> Any:
    """A copy of ``owner`` with the field ``change`` set in its part ``parts`` (nested)."""
    parent = getattr(owner, parts[0])
    if parent is None:
        if parts != ["heat_gain"]:
            head = path.rpartition(".")[0]
            raise InvalidInputError(path, f"the case has no {head}; add one to vary {path}")
        parent = HeatGainRate()
    inner = (
        replace(parent, **change) if len(parts) == 1 else _replaced(parent, parts[1:], change, path)
    )
    return replace(owner, **{parts[0]: inner})
