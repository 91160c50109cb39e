"""Heat gained by the load from its surroundings during a balance.

The total is given as an energy, or as a constant power over a duration. How it
is spread along the path matters (heat gained at 20 degC and at 0 degC drives
different vapor enthalpies), and the time-temperature history is not known to a
balance. The assumption made here: the heat enters in proportion to the mass
evaporated. It holds exactly for constant power with a constant vapor removal
rate (pump or condenser limited), since then elapsed time is proportional to the
mass removed. Each kilogram of vapor then carries kappa = Q / m_evaporated of
gained heat, which acts as a reduction of its effective enthalpy: the balances
solve kappa * m_evaporated(kappa) = Q for kappa.
"""

from __future__ import annotations

from collections.abc import Callable
from dataclasses import dataclass
from typing import Final

import numpy as np
from numpy.typing import ArrayLike
from scipy.optimize import brentq

from service.core.errors import InvalidInputError, UnsupportedStateError

__all__ = ["HEAT_GAIN_ASSUMPTION", "HeatGain", "solve_heat_per_evaporated_mass"]

HEAT_GAIN_ASSUMPTION = (
    "Heat gain enters in proportion to the mass evaporated (exact for constant power with a "
    "constant vapor removal rate); it lowers the net enthalpy each kilogram of vapor takes away."
)


@dataclass(frozen=True)
class HeatGain:
    """Heat the load gains during the process: ``energy``, or ``power`` times ``duration``.

    Attributes
    ----------
    energy : array_like or None
        J, >= 0.
    power : array_like or None
        W, >= 0 (with ``duration``).
    duration : array_like or None
        s, >= 0 (with ``power``).
    """

    energy: ArrayLike | None = None
    power: ArrayLike | None = None
    duration: ArrayLike | None = None

    def total(self) -> float:
        """Total heat gained, J (scalar fields)."""
        if self.energy is not None:
            if self.power is not None or self.duration is not None:
                raise InvalidInputError(
                    "heat_gain", "give either energy, or power and duration, not both"
                )
            value = float(np.asarray(self.energy))
        elif self.power is not None and self.duration is not None:
            value = float(np.asarray(self.power)) * float(np.asarray(self.duration))
        else:
            raise InvalidInputError("heat_gain", "give energy, or both power and duration")
        if not np.isfinite(value) or value < 0.0:
            raise InvalidInputError("heat_gain", f"must be finite and >= 0 J, got {value!r}", value)
        return value


def solve_heat_per_evaporated_mass(
    total_heat: float,
    evaporated_mass: Callable[[float], float],
    upper_bound: float,
    available_water: float,
) -> float:
    """Solve kappa * evaporated_mass(kappa) = total_heat for kappa, J/kg.

    Parameters
    ----------
    total_heat : float
        J, >= 0.
    evaporated_mass : callable
        kg evaporated for a given kappa; increasing in kappa. May raise
        :class:`UnsupportedStateError` when kappa leaves no water.
    upper_bound : float
        J/kg, smallest net enthalpy difference along the path (kappa must stay below).
    available_water : float
        kg; the evaporated mass cannot exceed it.

    Raises
    ------
    UnsupportedStateError
        If the heat gain would evaporate all the water.
    """
    if total_heat == 0.0:
        return 0.0

    def mismatch(kappa: float) -> float:
        try:
            mass = evaporated_mass(kappa)
        except UnsupportedStateError:
            return np.inf
        if mass >= available_water:
            return np.inf
        return kappa * mass - total_heat

    guess = _secant_from_zero(total_heat, mismatch, evaporated_mass, upper_bound)
    if guess is not None:
        return guess
    low, high = 0.0, upper_bound
    value = mismatch(high)
    # Bisect until the upper end leaves water and overshoots the heat gain.
    while not (np.isfinite(value) and value > 0.0):
        middle = 0.5 * (low + high)
        value_middle = mismatch(middle)
        if np.isfinite(value_middle) and value_middle <= 0.0:
            low = middle
        else:
            high, value = middle, value_middle
        if high - low < 1e-12 * upper_bound:
            raise UnsupportedStateError(
                "heat_gain",
                f"a heat gain of {total_heat:.6g} J would evaporate all the water before the "
                "end state is reached",
                total_heat,
            )
    return float(brentq(mismatch, low, high, xtol=1e-12, rtol=1e-15, maxiter=200))


_SECANT_ITERATIONS: Final = 25
_SECANT_TOLERANCE: Final = 1e-13


def _secant_from_zero(
    total_heat: float,
    mismatch: Callable[[float], float],
    evaporated_mass: Callable[[float], float],
    upper_bound: float,
) -> float | None:
    """Secant iteration started from kappa = Q / m(0); None if it does not settle.

    The evaporated mass changes little with kappa (the heat gain is a correction to the
    latent-heat load), so the root lies close to Q / m(0) and a few path evaluations
    find it; the caller falls back to bracketing otherwise.
    """
    try:
        first_mass = evaporated_mass(0.0)
    except UnsupportedStateError:
        return None
    if not first_mass > 0.0:
        return None
    previous, previous_value = 0.0, -total_heat
    current = total_heat / first_mass
    for _ in range(_SECANT_ITERATIONS):
        if not 0.0 < current < upper_bound:
            return None
        value = mismatch(current)
        if not np.isfinite(value):
            return None
        if abs(value) <= _SECANT_TOLERANCE * total_heat:
            return current
        slope = (value - previous_value) / (current - previous)
        if slope <= 0.0:
            return None
        previous, previous_value = current, value
        current = current - value / slope
        if abs(current - previous) <= _SECANT_TOLERANCE * max(abs(current), 1.0):
            return current
    return None
