"""Choi and Okos (1986) conductivity and density of water against IAPWS, and the mixing rule.

Sources: IAPWS R15-11 (thermal conductivity of ordinary water) and IAPWS-95 (density) as
computed by iapws 1.5.5 (IAPWS95 class, attributes k and rho) at 0.1 MPa (0.5 MPa at
100 degC and above, to stay liquid). Choi and Okos fitted their water polynomials to
handbook data of the time, so a few per cent near 0 degC and under 1 % above 20 degC is the
expected agreement (measured: +2.7 % at 0.5 degC, +0.9 % at 20 degC, under 0.6 % from 40 to
140 degC for the conductivity; density within 0.3 % everywhere).
"""

from __future__ import annotations

import pytest
from iapws import IAPWS95

from service.core.errors import InvalidInputError
from service.core.simulation.product_conductivity import (
    composition_conductivity,
    composition_density,
)

CASES = [
    # degC, conductivity tolerance (relative), density tolerance (relative)
    (0.5, 0.03, 0.003),
    (20.0, 0.01, 0.003),
    (40.0, 0.006, 0.003),
    (80.0, 0.006, 0.003),
    (140.0, 0.006, 0.003),
]


@pytest.mark.parametrize(("celsius", "conductivity_tolerance", "density_tolerance"), CASES)
def test_water_matches_iapws(
    celsius: float, conductivity_tolerance: float, density_tolerance: float
) -> None:
    temperature = 273.15 + celsius
    water = IAPWS95(T=temperature, P=0.101325 if celsius < 99.0 else 0.5)
    fractions = {"water": 1.0}
    assert composition_conductivity(fractions, temperature) == pytest.approx(
        float(water.k), rel=conductivity_tolerance
    )
    assert composition_density(fractions, temperature) == pytest.approx(
        float(water.rho), rel=density_tolerance
    )


def test_mixture_is_ordered_by_its_water_and_fat() -> None:
    # A lean cooked meat (invented composition) conducts less than water and more than
    # 0.3 W/(m K) (meats are 0.4-0.5 unfrozen: ASHRAE Handbook - Refrigeration 2006, ch. 9,
    # from memory); more fat lowers both its conductivity and its density.
    lean = {"water": 0.70, "protein": 0.27, "fat": 0.02, "ash": 0.01}
    fatty = {"water": 0.55, "protein": 0.20, "fat": 0.24, "ash": 0.01}
    temperature = 293.15
    water = composition_conductivity({"water": 1.0}, temperature)
    lean_value = composition_conductivity(lean, temperature)
    assert 0.3 < lean_value < water
    assert composition_conductivity(fatty, temperature) < lean_value
    assert composition_density(fatty, temperature) < composition_density(lean, temperature)


def test_outside_the_fitted_range_is_refused() -> None:
    with pytest.raises(InvalidInputError):
        composition_conductivity({"water": 1.0}, 200.0)
