"""A named solute's non-ideal water activity, tabulated for the simulation's inner loop.

The chamber simulation recovers the product's state from its energy many thousand times per
run; a non-ideal activity model (Pitzer, Norrish, IAPWS R13-08 seawater;
:mod:`service.core.solutions.aqueous`) inverted by bisection at every call would cost too
much. Once per run this module tabulates, for the product's solute mass m_s:

- the unfrozen water in equilibrium with ice, m_l(T) = m_s (1 - w_b(T)) / w_b(T), from the
  brine mass fraction w_b(T) where ln a_w(w_b, T) equals ice's ln a_w,ice(T) (the same table
  of ice equilibrium the simulation's frozen states use), as a cubic spline of w_b on
  [T_lowest, 273.16 K];
- ln a_w of the unfrozen solution without ice against its water mass, at the freezing
  onset's temperature (the models' temperature dependence is weak; as the balances take it).

T_lowest is where the brine reaches the model's highest mass fraction (sodium chloride: the
eutectic), or the liquid tables' end, whichever is warmer. Splines interpolate 400 nodes;
their error against the model is checked in the tests.
"""

from __future__ import annotations

import math
from typing import Final

import numpy as np
from scipy.interpolate import CubicSpline
from scipy.optimize import brentq

from service.core.errors import OutOfRangeError
from service.core.properties.constants import TRIPLE_POINT_TEMPERATURE
from service.core.simulation.path_tables import (
    LIQUID_TEMPERATURE_MIN,
    path_tables,
)
from service.core.solutions.aqueous import SolutionModel

__all__ = ["SolutionActivity"]

_NODES: Final = 400
_MODEL_FLOOR: Final = {"seawater": 250.0}
"""K: the lowest temperature a model is evaluated at (IAPWS R13-08's range)."""


class SolutionActivity:
    """Tabulated water activity of one solute mass in the product's water.

    Parameters
    ----------
    model : SolutionModel
        The solute's activity model.
    solute_mass : float
        kg, > 0.
    water_mass : float
        kg of water initially, > 0 (sets the freezing onset and the liquid table's range).

    Raises
    ------
    OutOfRangeError
        ``product.solute.mass_fraction`` above the model's range.
    """

    def __init__(self, model: SolutionModel, solute_mass: float, water_mass: float) -> None:
        self.model = model
        self.solute_mass = solute_mass
        initial = solute_mass / (solute_mass + water_mass)
        top = model.maximum_mass_fraction
        if initial > top:
            raise OutOfRangeError(
                "product.solute.mass_fraction",
                initial,
                0.0,
                top,
                "1",
                f"{model.name}: the {model.model} model is taken to w = {top}",
            )
        table = path_tables().solution
        # Brine in equilibrium with ice over the liquid tables' range, warmest node first.
        floor = max(LIQUID_TEMPERATURE_MIN, _MODEL_FLOOR.get(model.model, 0.0))
        temperatures = np.linspace(TRIPLE_POINT_TEMPERATURE, floor, _NODES)
        ice_log_activity = np.array([table.values(float(t))[0] for t in temperatures])
        ice_log_activity[0] = 0.0
        brine = model.mass_fraction_at_log_activity(ice_log_activity, temperatures)
        brine[0] = 0.0
        within = brine < top * (1.0 - 1e-9)  # bisection saturates at top for seawater
        lowest = float(temperatures[within][-1])
        if not within.all():
            # the edge where the brine reaches the model's end, between two nodes
            k = int(np.flatnonzero(~within)[0])
            lowest = float(
                brentq(
                    lambda t: table.values(t)[0] - float(model.log_water_activity(top, t)),
                    float(temperatures[k]),
                    float(temperatures[k - 1]),
                    xtol=1e-9,
                )
            )
        self.lowest_temperature = max(lowest, floor)
        keep = temperatures >= self.lowest_temperature - 1e-9
        self._brine = CubicSpline(temperatures[keep][::-1], brine[keep][::-1])
        self.freezing_onset = float(
            brentq(
                lambda t: float(self._brine(t)) - initial,
                self.lowest_temperature,
                TRIPLE_POINT_TEMPERATURE,
                xtol=1e-11,
            )
        )
        # ln a_w of the unfrozen solution against its mass fraction, at the onset.
        fractions = np.linspace(0.0, top, _NODES)
        log_activity = model.log_water_activity(fractions, self.freezing_onset)
        self._liquid = CubicSpline(fractions, log_activity)

    def unfrozen_water(self, temperature: float) -> tuple[float, float]:
        """(m_l, dm_l/dT) in equilibrium with ice at ``temperature`` K (< 273.16 K)."""
        w = float(self._brine(temperature))
        slope = float(self._brine(temperature, 1))
        if w <= 0.0:
            return math.inf, 0.0
        return self.solute_mass * (1.0 - w) / w, -self.solute_mass * slope / (w * w)

    def liquid_log_activity(self, water_mass: float) -> tuple[float, float]:
        """(ln a_w, d ln a_w / dm) of the solution with ``water_mass`` kg of water, no ice."""
        total = self.solute_mass + water_mass
        w = min(self.solute_mass / total, self.model.maximum_mass_fraction)
        return float(self._liquid(w)), float(self._liquid(w, 1)) * (-self.solute_mass / total**2)
