"""Ice Ih - vapor equilibrium along the sublimation curve.

The curve comes from IAPWS R14-08(2011) eq. (6); ice properties from IAPWS
R10-06(2009); vapor properties from IAPWS-95 (IAPWS R6-95(2018)) at the same
temperature and pressure. Ice and vapor share the IAPWS-95 reference state, so
the difference of their enthalpies is the latent heat of sublimation.

Vapor below the triple point
----------------------------
IAPWS-95 states its validity for the stable fluid from the melting curve
upwards (lowest 251.165 K); the vapor on the sublimation curve below that, down
to 50 K at about 1.9e-40 Pa, is an extrapolation (see
:func:`service.core.properties.helmholtz.fluid_properties_at` for how its vapor branch is
extended). At these pressures the vapor is an ideal gas to round-off: the full
IAPWS-95 equation is evaluated, but its residual part is negligible there and
the properties are those of the ideal-gas part. The core does not warn about
this; callers that need to flag it can compare the temperature with 251.165 K.
Measured against the phase-equilibrium condition, the Gibbs energies of ice and
vapor on the R14-08 curve differ by at most 7e-5 R T above 200 K and 1.4e-3 R T
at 50 K (an implied relative error in the sublimation pressure).
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np
from numpy.typing import ArrayLike

from service.core.properties.helmholtz import fluid_properties_at
from service.core.properties.ice import ice_properties
from service.core.properties.phase import FloatArray, PhaseProperties
from service.core.properties.phase_lines import sublimation_pressure, sublimation_temperature
from service.core.validation import finite_array

__all__ = [
    "SublimationStates",
    "sublimation_by_pressure",
    "sublimation_by_temperature",
]


@dataclass(frozen=True)
class SublimationStates:
    """Coexisting ice Ih and water vapor on the sublimation curve.

    Attributes
    ----------
    temperature : ndarray
        K.
    pressure : ndarray
        Sublimation pressure, Pa.
    ice : PhaseProperties
        Ice Ih at (temperature, pressure), IAPWS R10-06(2009).
    vapor : PhaseProperties
        Water vapor at (temperature, pressure), IAPWS-95.
    latent_heat_of_sublimation : ndarray
        h_vapor - h_ice, J/kg.
    """

    temperature: FloatArray
    pressure: FloatArray
    ice: PhaseProperties
    vapor: PhaseProperties
    latent_heat_of_sublimation: FloatArray


def _states(temperature: FloatArray, pressure: FloatArray) -> SublimationStates:
    ice = ice_properties(temperature, pressure)
    vapor = fluid_properties_at(temperature, pressure, phase="vapor")
    latent_heat = np.asarray(vapor.specific_enthalpy - ice.specific_enthalpy, dtype=np.float64)
    return SublimationStates(
        temperature=temperature,
        pressure=pressure,
        ice=ice,
        vapor=vapor,
        latent_heat_of_sublimation=latent_heat,
    )


def sublimation_by_temperature(temperature: ArrayLike) -> SublimationStates:
    """Ice and vapor in equilibrium at a given temperature.

    Parameters
    ----------
    temperature : array_like
        Temperature, K, 50 K <= T <= 273.16 K.

    Returns
    -------
    SublimationStates
        Sublimation pressure, ice and vapor properties and the latent heat of
        sublimation, arrays of the shape of ``temperature``.

    Raises
    ------
    InvalidInputError
        For NaN or infinite input.
    OutOfRangeError
        For a temperature outside the range (first offending element named).

    Notes
    -----
    p = p_sub(T) from R14-08 eq. (6); ice from the R10-06 Gibbs function,
    vapor from IAPWS-95 at (T, p); L_sub = h_vapor - h_ice. Below 273.16 K the
    vapor side is an extrapolation of IAPWS-95 (see the module docstring).

    References
    ----------
    IAPWS R14-08(2011) eq. (6); IAPWS R10-06(2009) eq. (1); IAPWS R6-95(2018).

    Examples
    --------
    >>> states = sublimation_by_temperature(273.16)
    >>> round(float(states.latent_heat_of_sublimation) / 1e3, 1)
    2834.4
    """
    temperature_array = finite_array(temperature, "temperature")
    pressure = sublimation_pressure(temperature_array)
    return _states(temperature_array, pressure)


def sublimation_by_pressure(pressure: ArrayLike) -> SublimationStates:
    """Ice and vapor in equilibrium at a given pressure.

    Parameters
    ----------
    pressure : array_like
        Pressure, Pa, from p_sub(50 K) (about 1.93e-40 Pa) to 611.657 Pa; see
        :data:`service.core.properties.phase_lines.SUBLIMATION_PRESSURE_RANGE`.

    Returns
    -------
    SublimationStates
        Sublimation temperature, ice and vapor properties and the latent heat
        of sublimation, arrays of the shape of ``pressure``.

    Raises
    ------
    InvalidInputError
        For NaN or infinite input.
    OutOfRangeError
        For a pressure outside the range (first offending element named).

    Notes
    -----
    T = T_sub(p), the inverse of R14-08 eq. (6) (vectorized Newton); then as
    :func:`sublimation_by_temperature` at (T, p).

    References
    ----------
    IAPWS R14-08(2011) eq. (6); IAPWS R10-06(2009) eq. (1); IAPWS R6-95(2018).

    Examples
    --------
    >>> states = sublimation_by_pressure(100.0)
    >>> round(float(states.temperature), 2)
    252.82
    """
    pressure_array = finite_array(pressure, "pressure")
    temperature = sublimation_temperature(pressure_array)
    return _states(temperature, pressure_array)
