"""Uncertainty propagation of the balances.

Sources: the linear law of propagation (GUM, JCGM 100:2008, Sec. 5.1.2); the property
statements come from service.core.properties.uncertainty (IAPWS releases; see each statement's
basis, several "from memory").
"""

from __future__ import annotations

import numpy as np
import pytest

from service.core.balances import Companion, FlashFreezeCase, flash_freeze
from service.core.balances.uncertainty import (
    propagate_input_uncertainty,
    property_uncertainty_of_evaporation,
)
from service.core.errors import InvalidInputError


def test_water_mass_uncertainty_scales_linearly() -> None:
    # evaporated mass is proportional to the water mass: u = fraction * u_m
    case = FlashFreezeCase(initial_temperature=293.15, water_mass=2.0)
    result = propagate_input_uncertainty(
        flash_freeze, case, {"water_mass": 0.01}, ("evaporated_mass",)
    )
    fraction = float(flash_freeze(case).evaporated_fraction_of_water)
    assert float(result.standard_uncertainty["evaporated_mass"]) == pytest.approx(
        fraction * 0.01, rel=1e-9
    )


def test_uncertainties_combine_in_quadrature_and_work_on_sweeps() -> None:
    case = FlashFreezeCase(
        initial_temperature=np.array([280.0, 300.0]), companions=(Companion(0.5, 500.0),)
    )
    result = propagate_input_uncertainty(
        flash_freeze,
        case,
        {"initial_temperature": 0.5, "companions[0].mass": 0.05},
        ("evaporated_mass",),
    )
    parts = result.contribution["evaporated_mass"]
    combined = np.hypot(parts["initial_temperature"], parts["companions[0].mass"])
    np.testing.assert_allclose(result.standard_uncertainty["evaporated_mass"], combined)
    assert result.standard_uncertainty["evaporated_mass"].shape == (2,)


def test_one_sided_difference_at_a_range_limit() -> None:
    case = FlashFreezeCase(initial_temperature=273.16)
    result = propagate_input_uncertainty(
        flash_freeze, case, {"initial_temperature": 0.2}, ("evaporated_mass",)
    )
    assert float(result.standard_uncertainty["evaporated_mass"]) > 0.0


def test_unknown_field_and_negative_uncertainty_raise() -> None:
    case = FlashFreezeCase(initial_temperature=293.15)
    with pytest.raises(InvalidInputError):
        propagate_input_uncertainty(flash_freeze, case, {"nonsense": 1.0}, ("evaporated_mass",))
    with pytest.raises(InvalidInputError):
        propagate_input_uncertainty(
            flash_freeze, case, {"initial_temperature": -1.0}, ("evaporated_mass",)
        )


def test_property_uncertainty_uses_the_stated_values() -> None:
    result = flash_freeze(FlashFreezeCase(initial_temperature=293.15, final_ice_temperature=263.15))
    uncertainty = property_uncertainty_of_evaporation(result.stages)
    assert 0.0 < float(uncertainty.evaporated_mass) < 1e-3 * float(result.evaporated_mass)
    assert {"enthalpy_of_vaporization", "enthalpy_of_sublimation"} <= set(uncertainty.contribution)
    assert uncertainty.statements


def test_supercooled_stage_is_reported_not_covered() -> None:
    result = flash_freeze(FlashFreezeCase(initial_temperature=293.15, nucleation_temperature=265.0))
    uncertainty = property_uncertainty_of_evaporation(result.stages)
    assert "supercooled cooling" in uncertainty.not_covered
