"""Thermal conductivity and density of an unfrozen food from its composition (Choi and Okos).

Each component's conductivity and density is a polynomial in the temperature t (degC):

=============  ==========================================  ============================
component      k_i, W/(m K)                                rho_i, kg/m3
=============  ==========================================  ============================
water          0.57109 + 1.7625e-3 t - 6.7036e-6 t**2      997.18 + 3.1439e-3 t - 3.7574e-3 t**2
protein        0.17881 + 1.1958e-3 t - 2.7178e-6 t**2      1329.9 - 0.51840 t
fat            0.18071 - 2.7604e-4 t - 1.7749e-7 t**2      925.59 - 0.41757 t
carbohydrate   0.20141 + 1.3874e-3 t - 4.3312e-6 t**2      1599.1 - 0.31046 t
fiber          0.18331 + 1.2497e-3 t - 3.1683e-6 t**2      1311.5 - 0.36589 t
ash            0.32962 + 1.4011e-3 t - 2.9069e-6 t**2      2423.8 - 0.28063 t
=============  ==========================================  ============================

and the food's values follow the mixing rules Choi and Okos state:

    rho = 1 / sum_i (x_i / rho_i)                 (volumes additive)
    phi_i = (x_i / rho_i) rho                     (volume fractions)
    k = sum_i phi_i k_i                           (parallel model)

with x_i the mass fractions. The parallel model is the upper bound of the mixture's
conductivity (the series model 1 / k = sum_i phi_i / k_i the lower one); Choi and Okos
use it for unfrozen foods. Only the unfrozen product is covered (no ice row is used), and
no air: a porous product (bread, cake, a lettuce head) has a far lower density and
conductivity than its matrix, so for those give both directly.

Source
------
Choi, Y. and Okos, M. R. (1986), "Effects of temperature and composition on the thermal
properties of foods", in Le Maguer, M. and Jelen, P. (eds.), *Food Engineering and Process
Applications*, Vol. 1, Elsevier, pp. 93-101; as reproduced in ASHRAE Handbook -
Refrigeration (2006), ch. 9, Table 1. The coefficients are FROM MEMORY. They were compared
with a scanned quotation of the same equations in Toledo, R. T., *Fundamentals of Food
Process Engineering* (Springer; edition not checked), which agrees on every row except two
places read here as misprints of the scan: water's t**2 conductivity coefficient (quoted
6.7306e-6; 6.7036e-6 used, 0.03 % of k at 20 degC) and carbohydrate's t coefficient (quoted
0.013874, ten times the 1.3874e-3 used, which would make a sugar conduct better than water).
"""

from __future__ import annotations

from typing import Final

from service.core.errors import InvalidInputError

__all__ = [
    "CHOI_OKOS_CONDUCTIVITY_REFERENCE",
    "composition_conductivity",
    "composition_density",
]

CHOI_OKOS_CONDUCTIVITY_REFERENCE: Final = (
    "Thermal conductivity and density from composition: Choi, Y. and Okos, M. R. (1986), "
    "Effects of temperature and composition on the thermal properties of foods, Food "
    "Engineering and Process Applications Vol. 1, pp. 93-101 (as in ASHRAE Handbook - "
    "Refrigeration, 2006, ch. 9, Table 1; coefficients from memory), parallel model "
    "k = sum phi_i k_i on volume fractions."
)

_CELSIUS_OFFSET: Final = 273.15

_CONDUCTIVITY: Final[dict[str, tuple[float, float, float]]] = {
    "water": (0.57109, 1.7625e-3, -6.7036e-6),
    "protein": (0.17881, 1.1958e-3, -2.7178e-6),
    "fat": (0.18071, -2.7604e-4, -1.7749e-7),
    "carbohydrate": (0.20141, 1.3874e-3, -4.3312e-6),
    "fiber": (0.18331, 1.2497e-3, -3.1683e-6),
    "ash": (0.32962, 1.4011e-3, -2.9069e-6),
}
"""W/(m K), t in degC: A + B t + C t**2."""

_DENSITY: Final[dict[str, tuple[float, float, float]]] = {
    "water": (997.18, 3.1439e-3, -3.7574e-3),
    "protein": (1329.9, -0.5184, 0.0),
    "fat": (925.59, -0.41757, 0.0),
    "carbohydrate": (1599.1, -0.31046, 0.0),
    "fiber": (1311.5, -0.36589, 0.0),
    "ash": (2423.8, -0.28063, 0.0),
}
"""kg/m3, t in degC: A + B t + C t**2."""

_RANGE_CELSIUS: Final = (-40.0, 150.0)
"""degC: the range Choi and Okos fitted their polynomials over."""


def _polynomial(coefficients: tuple[float, float, float], celsius: float) -> float:
    a, b, c = coefficients
    return a + celsius * (b + celsius * c)


def _checked(fractions: dict[str, float], temperature: float) -> float:
    celsius = temperature - _CELSIUS_OFFSET
    low, high = _RANGE_CELSIUS
    if not low <= celsius <= high:
        raise InvalidInputError(
            "temperature", f"the Choi-Okos polynomials hold from {low} to {high} degC", celsius
        )
    unknown = set(fractions) - set(_CONDUCTIVITY)
    if unknown:
        raise InvalidInputError("composition", f"unknown components {sorted(unknown)}")
    if sum(fractions.values()) <= 0.0:
        raise InvalidInputError("composition", "the fractions sum to zero")
    return celsius


def composition_density(fractions: dict[str, float], temperature: float) -> float:
    """Density of an unfrozen, non-porous food from its mass fractions, kg/m3.

    Parameters
    ----------
    fractions : dict of str to float
        Mass fractions by component (``water``, ``protein``, ``fat``, ``carbohydrate``,
        ``fiber``, ``ash``); they are normalised by their sum.
    temperature : float
        K, from 233.15 K to 423.15 K (-40 to 150 degC).

    Returns
    -------
    float
        rho = 1 / sum_i (x_i / rho_i(t)), kg/m3.

    References
    ----------
    Choi and Okos (1986), as reproduced in ASHRAE Handbook - Refrigeration (2006), ch. 9.

    Examples
    --------
    >>> round(composition_density({"water": 1.0}, 293.15), 1)
    995.7
    """
    celsius = _checked(fractions, temperature)
    total = sum(fractions.values())
    volume = sum(
        fraction / total / _polynomial(_DENSITY[name], celsius)
        for name, fraction in fractions.items()
    )
    return 1.0 / volume


def composition_conductivity(fractions: dict[str, float], temperature: float) -> float:
    """Thermal conductivity of an unfrozen, non-porous food (parallel model), W/(m K).

    Parameters
    ----------
    fractions : dict of str to float
        Mass fractions by component, as for :func:`composition_density`.
    temperature : float
        K, from 233.15 K to 423.15 K.

    Returns
    -------
    float
        k = sum_i phi_i k_i(t) with the volume fractions phi_i = (x_i / rho_i) rho.

    References
    ----------
    Choi and Okos (1986), as reproduced in ASHRAE Handbook - Refrigeration (2006), ch. 9.

    Examples
    --------
    >>> round(composition_conductivity({"water": 1.0}, 293.15), 4)
    0.6037
    """
    celsius = _checked(fractions, temperature)
    total = sum(fractions.values())
    volumes = {
        name: fraction / total / _polynomial(_DENSITY[name], celsius)
        for name, fraction in fractions.items()
    }
    whole = sum(volumes.values())
    return sum(
        volume / whole * _polynomial(_CONDUCTIVITY[name], celsius)
        for name, volume in volumes.items()
    )
