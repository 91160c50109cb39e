"""An independent free-convection evaporation rate, written from the handbook for the tests.

Not the service's code path: properties from tables at one temperature, the dilute-vapor
rate equation with the stagnant-film correction, Churchill's correlation typed out again.
Sources: Incropera, F. P., DeWitt, D. P., Bergman, T. L. and Lavine, A. S., Fundamentals of
Heat and Mass Transfer, 6th ed., Wiley (2007), Tables A.4 and A.8, eqs. 6.8 and 9.35,
sec. 6.7 (from memory); IAPWS-95 through iapws 1.5.5 for the saturated vapor.
"""

from __future__ import annotations

import math

from iapws import IAPWS95

__all__ = ["ATMOSPHERE", "free_convection_evaporation_flux"]

ATMOSPHERE = 101325.0  # Pa


_KINEMATIC_VISCOSITY = ((300.0, 15.89e-6), (350.0, 20.92e-6))
"""K, m2/s: air at 1 atm, Incropera 6th ed. Table A.4 (from memory)."""
_DIFFUSIVITY_298K = 0.26e-4
"""m2/s: H2O-air at 298 K and 1 atm, Incropera 6th ed. Table A.8 (from memory)."""


def free_convection_evaporation_flux(
    surface_temperature: float, gas_temperature: float, size: float
) -> float:
    """Evaporation of a wet sphere of diameter ``size`` (m) into still dry air at 1 atm,
    kg/(s m2).

    Properties at the film temperature T_f = (T_s + T_g)/2, Incropera's rule: kinematic
    viscosity interpolated linearly in Table A.4, the diffusivity of Table A.8 scaled as
    T^(3/2) (Incropera 6th ed. sec. 14.1.5, D ~ T^(3/2) / p for gases; from memory);
    Churchill's sphere correlation (eq. 9.35) with Pr -> Sc, Nu -> Sh (sec. 6.7); the rate
    of vapor through stagnant air n = (Sh D / L) (p M_w / (R T_f)) ln(1 / (1 - x_s)),
    x_s = p_sat(T_s) / p (the stagnant-film result, e.g. Incropera 6th ed. sec. 14.2; from
    memory); the buoyancy from ideal-gas densities of the air-vapor mixture.
    """
    film = 0.5 * (surface_temperature + gas_temperature)
    (t_low, nu_low), (t_high, nu_high) = _KINEMATIC_VISCOSITY
    kinematic = nu_low + (nu_high - nu_low) * (film - t_low) / (t_high - t_low)
    diffusivity = _DIFFUSIVITY_298K * (film / 298.0) ** 1.5
    vapor_pressure = IAPWS95(T=surface_temperature, x=1).P * 1e6  # Pa
    molar_air, molar_water, gas_constant = 28.97e-3, 18.015e-3, 8.314
    surface_density = ((ATMOSPHERE - vapor_pressure) * molar_air + vapor_pressure * molar_water) / (
        gas_constant * surface_temperature
    )
    air_density = ATMOSPHERE * molar_air / (gas_constant * gas_temperature)
    mean = 0.5 * (surface_density + air_density)
    rayleigh = (
        9.81 * abs(air_density - surface_density) / mean * size**3 / (kinematic * diffusivity)
    )
    schmidt = kinematic / diffusivity
    sherwood = 2.0 + 0.589 * rayleigh**0.25 / (1.0 + (0.469 / schmidt) ** (9 / 16)) ** (4 / 9)
    coefficient = sherwood * diffusivity / size
    concentration = ATMOSPHERE * molar_water / (gas_constant * film)  # kg/m3 per unit x
    fraction = vapor_pressure / ATMOSPHERE
    return float(coefficient * concentration * math.log(1.0 / (1.0 - fraction)))
