"""Freezing at the triple point against the IAPWS latent heats.

Sources (values at T = 273.16 K, p = 611.657 Pa):
- h_liquid = 0.611783 J/kg and h_vapor = 2500.92 kJ/kg of saturated liquid and vapor:
  IAPWS-95, Wagner and Pruss, J. Phys. Chem. Ref. Data 31, 387 (2002), Table 13.1
  (from memory);
- h_ice = -333444.254 J/kg: IAPWS R10-06(2009), Table 6, check values at the triple point
  (from memory).
Latent heats: vaporization h_v - h_l = 2500.92 kJ/kg, fusion h_l - h_ice = 333.445 kJ/kg,
sublimation h_v - h_ice = 2834.36 kJ/kg (the IAPWS R14-08 sublimation line's Clausius-
Clapeyron value, about 2834.4 kJ/kg, Feistel and Wagner 2007, from memory).
Pure water freezing at the triple point evaporates m_v / m_l = L_fusion / L_sublimation.
"""

from __future__ import annotations

import pytest

from service.core.balances import FlashFreezeCase, flash_freeze

H_LIQUID = 0.611783  # J/kg, IAPWS-95 (Wagner and Pruss 2002, Table 13.1), from memory
H_VAPOR = 2500.92e3  # J/kg, IAPWS-95 (Wagner and Pruss 2002, Table 13.1), from memory
H_ICE = -333444.254  # J/kg, IAPWS R10-06(2009) Table 6, from memory


@pytest.fixture(scope="module")
def freezing_stage() -> object:
    result = flash_freeze(FlashFreezeCase(initial_temperature=273.16, water_mass=1.0))
    return result.stages[1]


@pytest.mark.parametrize(
    ("quantity", "expected", "tolerance"),
    [
        # IAPWS-95 Table 13.1 (Wagner and Pruss 2002), 2500.92 kJ/kg given to 0.01 kJ/kg
        pytest.param("vaporization", H_VAPOR - H_LIQUID, 6e-6, id="latent-heat-vaporization"),
        # R10-06(2009) Table 6 with IAPWS-95 liquid
        pytest.param("fusion", H_LIQUID - H_ICE, 2e-6, id="latent-heat-fusion"),
        # R10-06 ice with IAPWS-95 vapor
        pytest.param("sublimation", H_VAPOR - H_ICE, 6e-6, id="latent-heat-sublimation"),
    ],
)
def test_latent_heats_implied_by_the_freezing_stage(
    freezing_stage: object, quantity: str, expected: float, tolerance: float
) -> None:
    stage = freezing_stage
    evaporated = float(stage.evaporated_mass)  # type: ignore[attr-defined]
    ice = float(stage.ice_formed)  # type: ignore[attr-defined]
    heat_removed = float(stage.heat_removed)  # type: ignore[attr-defined]
    implied = {
        "vaporization": heat_removed / evaporated,  # vapor leaves the liquid
        "fusion": heat_removed / ice,  # the same heat freezes the ice
        "sublimation": heat_removed / evaporated + heat_removed / ice,
    }[quantity]
    assert implied == pytest.approx(expected, rel=tolerance)


def test_evaporated_fraction_at_the_triple_point() -> None:
    # IAPWS-95 Table 13.1 and R10-06 Table 6 (from memory): m_v/m = L_f / L_s
    expected = (H_LIQUID - H_ICE) / (H_VAPOR - H_ICE)
    result = flash_freeze(FlashFreezeCase(initial_temperature=273.16))
    assert float(result.evaporated_fraction_of_water) == pytest.approx(expected, rel=6e-6)
    assert float(result.ice_mass) == pytest.approx(1.0 - expected, rel=1e-6)
