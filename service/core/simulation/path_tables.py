"""Property tables along the product's equilibrium paths, for the simulation's inner loop.

The process simulation evaluates a handful of properties of a scalar state thousands
of times (every right-hand-side call of the ODE solver). Calling the vectorized
property core for one point costs tens of microseconds of numpy overhead per call,
so the paths are fitted once (per process) by piecewise Chebyshev interpolation
(:func:`service.core.properties.chebyshev.fit_piecewise_chebyshev`) to the balances' own
equilibrium states (:mod:`service.core.balances.equilibrium_paths`), and the series
are summed here in plain Python floats.

Paths and outputs (all SI, IAPWS reference state):

- liquid, 243.15 K to 373.15 K: specific enthalpy of liquid water on its
  vapor-pressure curve (metastable IAPWS-95 below 273.16 K), ln of that vapor
  pressure, specific enthalpy of the saturated vapor;
- ice, 173.15 K to 273.16 K: specific enthalpy of ice Ih on the sublimation curve,
  ln of the sublimation pressure (R14-08), specific enthalpy of the vapor;
- freezing solution, 243.15 K to 273.16 K: ln a_w of a solution in equilibrium
  with ice (equal chemical potentials, IAPWS-95 liquid and R10-06 ice).

The fits interpolate at 10 Chebyshev points per 5 K segment; their error against the
equilibrium states they are fitted to is below 1e-9 relative, 1e-5 J/kg for enthalpies (checked in
tests/core/simulation/test_path_tables.py).

References
----------
IAPWS R6-95(2018); IAPWS R10-06(2009); IAPWS R14-08(2011). Piecewise Chebyshev
interpolation: Trefethen, L. N., *Approximation Theory and Approximation Practice*,
SIAM (2013), ch. 3 and 8.
"""

from __future__ import annotations

from dataclasses import dataclass
from functools import cache
from typing import Final

import numpy as np
from numpy.polynomial import chebyshev

from service.core.balances.equilibrium_paths import (
    LiquidVaporStates,
    freezing_solution_states,
    ice_vapor_states,
    liquid_vapor_states,
)
from service.core.properties.chebyshev import PiecewiseChebyshev, fit_piecewise_chebyshev
from service.core.properties.constants import TRIPLE_POINT_TEMPERATURE
from service.core.properties.phase import FloatArray

__all__ = [
    "ICE_TEMPERATURE_MIN",
    "LIQUID_TEMPERATURE_MAX",
    "LIQUID_TEMPERATURE_MIN",
    "PathTables",
    "ScalarSeries",
    "path_tables",
]

LIQUID_TEMPERATURE_MIN: Final = 243.15
"""K, lowest liquid (supercooled or solution) temperature, as in the balances."""

LIQUID_TEMPERATURE_MAX: Final = 373.15
"""K, the normal boiling point; the product starts at or below it."""

ICE_TEMPERATURE_MIN: Final = 173.15
"""K, lowest ice temperature, as in the balances."""

_SEGMENT_WIDTH: Final = 5.0
"""K per Chebyshev segment (the triple point falls on a segment end of the ice and
solution tables, which end there)."""

_DEGREE: Final = 9


class ScalarSeries:
    """Piecewise polynomial series of several outputs, summed in Python floats.

    Parameters
    ----------
    table : PiecewiseChebyshev
        A fit without variable transform.

    Notes
    -----
    Each segment's Chebyshev series (degree 9, local variable t in [-1, 1]) is
    converted once to monomial coefficients in t (:func:`numpy.polynomial.chebyshev.cheb2poly`;
    the conversion loses at most a few digits at this degree, far below the fit error)
    and summed by Horner's rule together with its derivative:
    d <- d t + v, v <- v t + c. Points outside the table are extrapolated from the end
    segments (callers stop at the table ends).
    """

    def __init__(self, table: PiecewiseChebyshev) -> None:
        if table.transform is not None:
            raise ValueError("ScalarSeries needs a fit without transform")
        self.lower = table.lower
        self.upper = table.upper
        self._count = table.segment_count
        self._width = (table.upper - table.lower) / self._count
        self._slope_scale = 2.0 / self._width
        outputs = table.output_count
        # [segment][output] -> monomial coefficients in t, highest degree first
        self._series = [
            [
                tuple(float(c) for c in chebyshev.cheb2poly(table.coefficients[:, o, s])[::-1])
                for o in range(outputs)
            ]
            for s in range(self._count)
        ]

    def _locate(self, x: float) -> tuple[int, float]:
        position = (x - self.lower) / self._width
        segment = int(position)
        if position < 0.0:
            segment = 0
        elif segment >= self._count:
            segment = self._count - 1
        return segment, 2.0 * (position - segment) - 1.0

    def values(self, x: float) -> list[float]:
        """All outputs at ``x``."""
        segment, t = self._locate(x)
        result = []
        for coefficients in self._series[segment]:
            value = 0.0
            for c in coefficients:
                value = value * t + c
            result.append(value)
        return result

    def values_and_slopes(self, x: float) -> tuple[list[float], list[float]]:
        """All outputs and their derivatives with respect to ``x`` at ``x``."""
        segment, t = self._locate(x)
        values = []
        slopes = []
        scale = self._slope_scale
        for coefficients in self._series[segment]:
            value = 0.0
            slope = 0.0
            for c in coefficients:
                slope = slope * t + value
                value = value * t + c
            values.append(value)
            slopes.append(slope * scale)
        return values, slopes


@dataclass(frozen=True)
class PathTables:
    """The three path tables.

    Attributes
    ----------
    liquid : ScalarSeries
        Outputs (h_liquid, ln p_vapor, h_vapor) of temperature, 243.15 K to 373.15 K.
    ice : ScalarSeries
        Outputs (h_ice, ln p_sublimation, h_vapor) of temperature, 173.15 K to 273.16 K.
    solution : ScalarSeries
        Output (ln a_w,) of a solution in equilibrium with ice, 243.15 K to 273.16 K.
    """

    liquid: ScalarSeries
    ice: ScalarSeries
    solution: ScalarSeries


def _condensed_vapor_columns(states: LiquidVaporStates) -> FloatArray:
    """(h_condensed, ln p, h_vapor) of a liquid or ice path, shape (3, points)."""
    return np.stack(
        [
            states.condensed.specific_enthalpy,
            np.log(states.pressure),
            states.vapor.specific_enthalpy,
        ]
    )


def _liquid_columns(temperature: FloatArray) -> FloatArray:
    return _condensed_vapor_columns(liquid_vapor_states(temperature))


def _ice_columns(temperature: FloatArray) -> FloatArray:
    return _condensed_vapor_columns(ice_vapor_states(temperature))


def _solution_columns(temperature: FloatArray) -> FloatArray:
    return np.asarray(freezing_solution_states(temperature).log_water_activity)[None, :]


def _segments(lower: float, upper: float) -> int:
    return max(1, round((upper - lower) / _SEGMENT_WIDTH))


@cache
def path_tables() -> PathTables:
    """The path tables, fitted on first use (about a second), then kept for the process."""
    fits = []
    for columns, lower, upper in (
        (_liquid_columns, LIQUID_TEMPERATURE_MIN, LIQUID_TEMPERATURE_MAX),
        (_ice_columns, ICE_TEMPERATURE_MIN, TRIPLE_POINT_TEMPERATURE),
        (_solution_columns, LIQUID_TEMPERATURE_MIN, TRIPLE_POINT_TEMPERATURE),
    ):
        table = fit_piecewise_chebyshev(
            columns, lower, upper, segment_count=_segments(lower, upper), degree=_DEGREE
        )
        fits.append(ScalarSeries(table))
    return PathTables(liquid=fits[0], ice=fits[1], solution=fits[2])
