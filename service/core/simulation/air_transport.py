"""Transport properties of the chamber gas: water vapor diffusing through air, air viscosity.

Both are low-density (dilute-gas) correlations: the product of diffusivity and pressure
and the viscosity do not depend on pressure, which holds while the mean free path of
the gas is small against the product (at 1 Pa and 20 degC the mean free path of air is
about 7 mm). At lower pressures the diffusion resistance of the air is negligible beside
the surface (kinetic) resistance anyway, so the continuum form is kept at every pressure.

Sources
-------
- Binary diffusivity: Fuller, E. N., Schettler, P. D. and Giddings, J. C. (1966), "A new
  method for prediction of binary gas-phase diffusion coefficients", Ind. Eng. Chem.
  58(5), 18-27, as given in Poling, B. E., Prausnitz, J. M. and O'Connell, J. P., *The
  Properties of Gases and Liquids*, 5th ed., McGraw-Hill (2001), eq. (11-4.4), with the
  diffusion volumes of its Table 11-1 (water 13.1, air 19.7) (from memory). Poling et al.
  state errors of a few percent for non-polar pairs, larger for polar ones.
- Air viscosity: Sutherland's law with the constants of White, F. M., *Viscous Fluid
  Flow*, 3rd ed., McGraw-Hill (2006), eq. (1-36) and Table 1-2 (mu_0 = 1.716e-5 Pa s at
  273 K, S = 111 K; here 273.15 K and 110.4 K) (from memory).
- Molar mass of dry air, 28.9647 g/mol: U.S. Standard Atmosphere, 1976 (from memory).
"""

from __future__ import annotations

from typing import Final

from service.core.properties.constants import MOLAR_MASS

__all__ = [
    "AIR_MOLAR_MASS",
    "MOLAR_GAS_CONSTANT",
    "air_viscosity",
    "vapor_air_diffusivity",
]

AIR_MOLAR_MASS: Final = 0.0289647
"""kg/mol, dry air (U.S. Standard Atmosphere, 1976; from memory)."""

MOLAR_GAS_CONSTANT: Final = 8.314462618
"""J/(mol K), CODATA 2018 (exact since the 2019 SI)."""

_FULLER_CONSTANT: Final = 1.43e-3
"""cm2/s with T in K, p in bar, molar masses in g/mol (Poling et al. 5th ed., eq. 11-4.4)."""
_WATER_DIFFUSION_VOLUME: Final = 13.1
_AIR_DIFFUSION_VOLUME: Final = 19.7
_SUTHERLAND_VISCOSITY: Final = 1.716e-5
_SUTHERLAND_REFERENCE: Final = 273.15
_SUTHERLAND_CONSTANT: Final = 110.4


def vapor_air_diffusivity(temperature: float, pressure: float) -> float:
    """Binary diffusivity of water vapor in air, m2/s (Fuller-Schettler-Giddings).

    Parameters
    ----------
    temperature : float
        Gas temperature, K; the correlation is used from 170 K to 500 K here.
    pressure : float
        Total pressure, Pa, > 0.

    Returns
    -------
    float
        D, m2/s.

    Notes
    -----
    D = 1.43e-3 T^1.75 / (p_bar M_AB^(1/2) [V_w^(1/3) + V_a^(1/3)]^2) cm2/s with
    M_AB = 2 / (1/M_w + 1/M_a) in g/mol and the diffusion volumes V_w = 13.1 and
    V_a = 19.7; D p is independent of pressure.

    References
    ----------
    Poling, Prausnitz and O'Connell, The Properties of Gases and Liquids, 5th ed. (2001),
    eq. (11-4.4) and Table 11-1 (from memory).

    Examples
    --------
    >>> round(vapor_air_diffusivity(298.15, 101325.0) * 1e5, 2)  # m2/s x 1e5
    2.5
    """
    water, air = MOLAR_MASS * 1e3, AIR_MOLAR_MASS * 1e3
    pair_mass = 2.0 / (1.0 / water + 1.0 / air)
    volumes = (_WATER_DIFFUSION_VOLUME ** (1.0 / 3.0) + _AIR_DIFFUSION_VOLUME ** (1.0 / 3.0)) ** 2
    centimetres = (
        _FULLER_CONSTANT * temperature**1.75 / ((pressure / 1e5) * pair_mass**0.5 * volumes)
    )
    return float(centimetres * 1e-4)


def air_viscosity(temperature: float) -> float:
    """Dynamic viscosity of dry air at low density, Pa s (Sutherland's law).

    Parameters
    ----------
    temperature : float
        K, about 170 K to 1000 K.

    Notes
    -----
    mu = mu_0 (T / T_0)^(3/2) (T_0 + S) / (T + S), mu_0 = 1.716e-5 Pa s, T_0 = 273.15 K,
    S = 110.4 K.

    References
    ----------
    White, Viscous Fluid Flow, 3rd ed. (2006), eq. (1-36), Table 1-2 (from memory).

    Examples
    --------
    >>> round(air_viscosity(300.0) * 1e7, 1)  # Pa s x 1e7
    184.6
    """
    ratio = temperature / _SUTHERLAND_REFERENCE
    return float(
        _SUTHERLAND_VISCOSITY
        * ratio**1.5
        * (_SUTHERLAND_REFERENCE + _SUTHERLAND_CONSTANT)
        / (temperature + _SUTHERLAND_CONSTANT)
    )
