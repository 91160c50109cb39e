"""Companion masses: vessel, tray and inert solids that cool with the load.

A companion has a mass and a constant specific heat and no water to lose; it
stays at the load's temperature (uniform temperature is one of the balances'
assumptions), so it adds m c dT to the heat the evaporating water must remove.

Specific heats of the named materials are near-room-temperature values. Sources
per row below; values marked "from memory" were recalled, not read, and should
be checked against the cited table before they are relied on.
"""

from __future__ import annotations

from dataclasses import dataclass
from typing import Final

import numpy as np
from numpy.typing import ArrayLike

from service.core.balances.scalars import require_scalar_within
from service.core.errors import InvalidInputError

__all__ = [
    "MATERIAL_SPECIFIC_HEATS",
    "Companion",
    "MaterialSpecificHeat",
    "checked_heat_capacity",
    "companion_of",
    "heat_capacity",
]


@dataclass(frozen=True)
class MaterialSpecificHeat:
    """A tabulated specific heat, J/(kg K), with its source."""

    name: str
    specific_heat: float
    source: str


_INCROPERA: Final = (
    "Incropera, DeWitt, Bergman and Lavine, Fundamentals of Heat and Mass Transfer, "
    "6th ed., Wiley (2007)"
)

MATERIAL_SPECIFIC_HEATS: Final[dict[str, MaterialSpecificHeat]] = {
    "stainless steel": MaterialSpecificHeat(
        "stainless steel", 477.0, f"AISI 304 at 300 K, {_INCROPERA}, Table A.1 (from memory)"
    ),
    "aluminium": MaterialSpecificHeat(
        "aluminium", 903.0, f"pure aluminium at 300 K, {_INCROPERA}, Table A.1 (from memory)"
    ),
    "copper": MaterialSpecificHeat(
        "copper", 385.0, f"pure copper at 300 K, {_INCROPERA}, Table A.1 (from memory)"
    ),
    "glass (borosilicate)": MaterialSpecificHeat(
        "glass (borosilicate)",
        835.0,
        f"glass, Pyrex, at 300 K, {_INCROPERA}, Table A.3 (from memory)",
    ),
    "HDPE": MaterialSpecificHeat(
        "HDPE",
        1900.0,
        "high-density polyethylene near 20 degC, typical datasheet value (from memory, no table)",
    ),
}
"""Named common materials. Constant over the balance's temperature range (assumption)."""


@dataclass(frozen=True)
class Companion:
    """A mass that cools with the load without evaporating.

    Attributes
    ----------
    mass : array_like
        kg, >= 0.
    specific_heat : array_like
        J/(kg K), > 0, taken constant over the temperature range.
    name : str
        Label for reports (e.g. ``"tray"`` or a material name).
    """

    mass: ArrayLike
    specific_heat: ArrayLike
    name: str = "companion"


def companion_of(material: str, mass: ArrayLike, name: str | None = None) -> Companion:
    """A companion of a named material from :data:`MATERIAL_SPECIFIC_HEATS`.

    Raises
    ------
    InvalidInputError
        If the material is not in the table.
    """
    try:
        entry = MATERIAL_SPECIFIC_HEATS[material]
    except KeyError as error:
        known = ", ".join(sorted(MATERIAL_SPECIFIC_HEATS))
        raise InvalidInputError(
            "material", f"unknown material {material!r}; known: {known}", material
        ) from error
    return Companion(mass=mass, specific_heat=entry.specific_heat, name=name or material)


def heat_capacity(companions: tuple[Companion, ...]) -> float:
    """Sum of m c over scalar companions, J/K."""
    return float(
        sum(float(np.asarray(c.mass)) * float(np.asarray(c.specific_heat)) for c in companions)
    )


def checked_heat_capacity(
    companions: tuple[Companion, ...],
    index: int | None = None,
    *,
    specific_heat_max: float | None = None,
) -> float:
    """:func:`heat_capacity` after checking every companion's fields, J/K.

    Raises
    ------
    InvalidInputError
        A NaN or infinite mass or specific heat.
    OutOfRangeError
        A negative mass, or a specific heat below 0 or above ``specific_heat_max``
        (``None``: no upper limit), naming ``companions[i].<field>`` and the sweep
        element ``index``.
    """
    for position, companion in enumerate(companions):
        require_scalar_within(
            companion.mass, f"companions[{position}].mass", 0.0, None, "kg", "must be >= 0", index
        )
        require_scalar_within(
            companion.specific_heat,
            f"companions[{position}].specific_heat",
            0.0,
            specific_heat_max,
            "J/(kg K)",
            "must be >= 0",
            index,
        )
    return heat_capacity(companions)
