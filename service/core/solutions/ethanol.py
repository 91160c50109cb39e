"""Ethanol in water: freezing point by Melinder's correlation, water activity from it.

Melinder (2010) fits the freezing temperature of aqueous ethyl alcohol as a polynomial in
the mass percentage x (0 to 60 %),

    t_F(x) = sum_i c_i (x - x_m)**i  (degC),   i = 0..5,   x_m = 29.2361 %,

(the temperature-independent column of the book's double polynomial). Here it is shifted by
-t_F(0) = +0.047 K so that pure water freezes at 0 degC, as the fit does not quite do.

The water activity of the solution is the activity that holds ice in equilibrium on this
line (Ferro Fontan and Chirife 1981): ln a_w(w) = (g_ice - g_liq) / (R T) at
T = 273.15 K + t_F(100 w) and 101325 Pa (IAPWS-95 metastable liquid, R10-06 ice), taken as
independent of temperature, as the Norrish constants are. It is tabulated lazily on a grid
of 2001 mass fractions from 0 to 0.5 and interpolated linearly (error below 1e-7 in ln a_w).

Range: 0 <= w <= 0.5, where the freezing line stays above 235 K (the end of the core's
supercooled-water reference; Melinder's fit goes on to 60 %).

Limits stated in answers: ethanol is volatile, but only the water's vapor pressure is
counted (ethanol's own partial pressure, large at these concentrations, is not); the
activity above the freezing line is the freezing line's (at 25 degC the measured water
activity of dilute ethanol is slightly higher); the heat of mixing of ethanol and water,
which is not small, is neglected like every solute's heat of dilution here. In the dilute
limit (below 5 %) the fit's depression lies 3-6 % below the cryoscopic law (tests).

References
----------
Melinder, A. (2010), *Properties of Secondary Working Fluids for Indirect Systems*, 2nd ed.,
International Institute of Refrigeration, Paris: ethyl alcohol, freezing point
coefficients (read from a public open-source transcription of the book's table, not from
the book). Ferro Fontan, C. and Chirife, J. (1981), The evaluation of water activity in
aqueous solutions from freezing point depression, J. Food Technol. 16, 21-30 (from memory).
IAPWS R6-95(2018), R10-06(2009).
"""

from __future__ import annotations

from functools import cache
from typing import Final

import numpy as np
from numpy.typing import ArrayLike

from service.core.properties.phase import FloatArray

__all__ = [
    "ETHANOL_CAUTION",
    "ETHANOL_MAXIMUM_MASS_FRACTION",
    "ETHANOL_SOURCE_TEXT",
    "ethanol_freezing_temperature",
    "ethanol_log_water_activity",
]

_CELSIUS_OFFSET: Final = 273.15
_REFERENCE_PERCENT: Final = 29.2361
"""x_m, mass percent (Melinder 2010, ethyl alcohol)."""

_COEFFICIENTS: Final = (-1.9410e01, -9.5400e-01, -2.6480e-03, 3.8510e-04, -2.8580e-07, -1.6700e-07)
"""c_0..c_5, degC per (mass %)**i: the freezing-point column of Melinder's (2010) ethyl
alcohol table."""

ETHANOL_MAXIMUM_MASS_FRACTION: Final = 0.5
"""Highest ethanol mass fraction taken: its freezing line, -37.6 degC, stays above 235 K."""

_GRID_POINTS: Final = 2001
_NORMAL_PRESSURE: Final = 101325.0

ETHANOL_SOURCE_TEXT: Final = (
    "Ethanol: freezing point by Melinder's correlation (Properties of Secondary Working "
    "Fluids for Indirect Systems, 2nd ed., IIR 2010, ethyl alcohol; shifted +0.047 K so that "
    "water freezes at 0 degC), water activity taken as that of ice on this line (Ferro "
    "Fontan and Chirife 1981, J. Food Technol. 16:21; from memory), independent of "
    "temperature; valid to w = 0.5; ethanol's own vapor and heat of mixing not counted"
)

ETHANOL_CAUTION: Final = (
    "Ethanol: only the water's vapor pressure is counted; ethanol is volatile and its own "
    "partial pressure (large at these concentrations) and its heat of mixing with water are "
    "not. Caution: ethanol vapor drawn through a vacuum pump or released from a chamber is "
    "flammable; follow the equipment maker's limits and local codes for flammable "
    "atmospheres."
)


def _melinder_celsius(percent: FloatArray) -> FloatArray:
    offset = percent - _REFERENCE_PERCENT
    total = np.zeros_like(offset)
    for power in range(len(_COEFFICIENTS) - 1, -1, -1):
        total = total * offset + _COEFFICIENTS[power]
    return np.asarray(total, dtype=np.float64)


_ZERO_SHIFT: Final = float(_melinder_celsius(np.zeros(1))[0])


def ethanol_freezing_temperature(mass_fraction: ArrayLike) -> FloatArray:
    """Freezing temperature of aqueous ethanol at 101325 Pa by Melinder's fit, K.

    Parameters
    ----------
    mass_fraction : array_like
        Ethanol mass / solution mass, 0 to 0.5 (validated by the caller).

    Returns
    -------
    ndarray
        K, 273.15 K at w = 0 (the fit shifted by +0.047 K).

    References
    ----------
    Melinder (2010), see the module docstring.

    Examples
    --------
    >>> round(float(ethanol_freezing_temperature(0.2)) - 273.15, 2)
    -11.07
    """
    percent = 100.0 * np.asarray(mass_fraction, dtype=np.float64)
    return np.asarray(_CELSIUS_OFFSET + _melinder_celsius(percent) - _ZERO_SHIFT, dtype=np.float64)


@cache
def _activity_table() -> tuple[FloatArray, FloatArray]:
    # Imported here: freezing imports aqueous, which reaches this module lazily.
    from service.core.solutions.freezing import ice_log_water_activity

    grid = np.linspace(0.0, ETHANOL_MAXIMUM_MASS_FRACTION, _GRID_POINTS)
    temperature = np.minimum(ethanol_freezing_temperature(grid), 273.16)
    log_activity = ice_log_water_activity(temperature, np.full(grid.shape, _NORMAL_PRESSURE))
    # At w = 0 the melting point at 101325 Pa is 273.1525 K, not the shifted fit's
    # 273.15 K: the table starts at exactly a_w = 1.
    log_activity = np.minimum(log_activity - log_activity[0], 0.0)
    log_activity[0] = 0.0
    return grid, np.asarray(log_activity, dtype=np.float64)


def ethanol_log_water_activity(mass_fraction: ArrayLike) -> FloatArray:
    """ln a_w of aqueous ethanol from its freezing line, dimensionless (<= 0).

    Parameters
    ----------
    mass_fraction : array_like
        Ethanol mass fraction, 0 to 0.5 (beyond it the table's end value holds; callers
        validate the range).

    Returns
    -------
    ndarray
        ln a_w, independent of temperature.
    """
    grid, log_activity = _activity_table()
    w = np.asarray(mass_fraction, dtype=np.float64)
    return np.asarray(np.interp(w, grid, log_activity), dtype=np.float64)
