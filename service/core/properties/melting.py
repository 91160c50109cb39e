"""Ice Ih - liquid water equilibrium along the melting curve.

The curve comes from IAPWS R14-08(2011) eq. (1) (ice Ih, 251.165 K to
273.16 K); ice properties from IAPWS R10-06(2009); liquid properties from
IAPWS-95 (IAPWS R6-95(2018)) at the same temperature and pressure. Both phases
share the IAPWS-95 reference state, so the difference of their enthalpies is
the latent heat of fusion.
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np
from numpy.typing import ArrayLike

from service.core.properties.helmholtz import fluid_properties_at
from service.core.properties.ice import ice_properties
from service.core.properties.phase import FloatArray, PhaseProperties
from service.core.properties.phase_lines import melting_pressure, melting_temperature
from service.core.validation import finite_array

__all__ = [
    "MeltingStates",
    "melting_by_pressure",
    "melting_by_temperature",
]


@dataclass(frozen=True)
class MeltingStates:
    """Coexisting ice Ih and liquid water on the melting curve.

    Attributes
    ----------
    temperature : ndarray
        K.
    pressure : ndarray
        Melting pressure, Pa.
    ice : PhaseProperties
        Ice Ih at (temperature, pressure), IAPWS R10-06(2009).
    liquid : PhaseProperties
        Liquid water at (temperature, pressure), IAPWS-95.
    latent_heat_of_fusion : ndarray
        h_liquid - h_ice, J/kg.
    """

    temperature: FloatArray
    pressure: FloatArray
    ice: PhaseProperties
    liquid: PhaseProperties
    latent_heat_of_fusion: FloatArray


def _states(temperature: FloatArray, pressure: FloatArray) -> MeltingStates:
    ice = ice_properties(temperature, pressure)
    liquid = fluid_properties_at(temperature, pressure, phase="liquid")
    latent_heat = np.asarray(liquid.specific_enthalpy - ice.specific_enthalpy, dtype=np.float64)
    return MeltingStates(
        temperature=temperature,
        pressure=pressure,
        ice=ice,
        liquid=liquid,
        latent_heat_of_fusion=latent_heat,
    )


def melting_by_temperature(temperature: ArrayLike) -> MeltingStates:
    """Ice Ih and liquid water in equilibrium at a given temperature.

    Parameters
    ----------
    temperature : array_like
        Temperature, K, 251.165 K <= T <= 273.16 K.

    Returns
    -------
    MeltingStates
        Melting pressure, ice and liquid properties and the latent heat of
        fusion, arrays of the shape of ``temperature``.

    Raises
    ------
    InvalidInputError
        For NaN or infinite input.
    OutOfRangeError
        For a temperature outside the range (first offending element named).

    Notes
    -----
    p = p_melt(T) from R14-08 eq. (1); ice from the R10-06 Gibbs function,
    liquid from IAPWS-95 at (T, p); L_fus = h_liquid - h_ice.

    References
    ----------
    IAPWS R14-08(2011) eq. (1); IAPWS R10-06(2009) eq. (1); IAPWS R6-95(2018).

    Examples
    --------
    >>> states = melting_by_temperature(273.16)
    >>> round(float(states.latent_heat_of_fusion) / 1e3, 2)
    333.44
    """
    temperature_array = finite_array(temperature, "temperature")
    pressure = melting_pressure(temperature_array)
    return _states(temperature_array, pressure)


def melting_by_pressure(pressure: ArrayLike) -> MeltingStates:
    """Ice Ih and liquid water in equilibrium at a given pressure.

    Parameters
    ----------
    pressure : array_like
        Pressure, Pa, 611.657 Pa <= p <= 208.566566 MPa; see
        :data:`service.core.properties.phase_lines.MELTING_PRESSURE_RANGE`.

    Returns
    -------
    MeltingStates
        Melting temperature, ice and liquid properties and the latent heat of
        fusion, arrays of the shape of ``pressure``.

    Raises
    ------
    InvalidInputError
        For NaN or infinite input.
    OutOfRangeError
        For a pressure outside the range (first offending element named).

    Notes
    -----
    T = T_melt(p), the inverse of R14-08 eq. (1) (vectorized Newton); then as
    :func:`melting_by_temperature` at (T, p).

    References
    ----------
    IAPWS R14-08(2011) eq. (1); IAPWS R10-06(2009) eq. (1); IAPWS R6-95(2018).

    Examples
    --------
    >>> states = melting_by_pressure(101325.0)
    >>> round(float(states.temperature), 4)
    273.1525
    """
    pressure_array = finite_array(pressure, "pressure")
    temperature = melting_temperature(pressure_array)
    return _states(temperature, pressure_array)
