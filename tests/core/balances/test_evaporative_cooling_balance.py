"""Evaporative (vacuum) cooling balance.

Sources named per case: the rule of thumb that produce loses about 1 % of its mass per
5-6 degC of vacuum cooling (common practice, no source); iceberg lettuce composition
and initial freezing point from ASHRAE Handbook - Refrigeration (2006), ch. 9, Table 3
(water 95.89 %, protein 1.01 %, fat 0.19 %, total carbohydrate 2.09 % of which fiber
1.40 %, ash 0.48 %, initial freezing point -0.2 degC); saturation pressures from
iapws 1.5.5 (IAPWS95 class).
"""

from __future__ import annotations

import numpy as np
import pytest
from iapws import IAPWS95

from service.core.balances import Companion, Composition, HeatGain
from service.core.balances.evaporative_cooling import (
    EvaporativeCoolingCase,
    evaporative_cooling,
)
from service.core.balances.uncertainty import (
    propagate_input_uncertainty,
)
from service.core.errors import InvalidInputError, OutOfRangeError, UnsupportedStateError

# ASHRAE Handbook - Refrigeration (2006), ch. 9, Table 3, lettuce, iceberg
LETTUCE = Composition(
    water=0.9589, protein=0.0101, fat=0.0019, carbohydrate=0.0069, fiber=0.0140, ash=0.0048
)
LETTUCE_FREEZING_POINT = 273.15 - 0.2  # K, same table


def _lettuce(**changes: object) -> EvaporativeCoolingCase:
    fields: dict[str, object] = {
        "product_mass": 1.0,
        "initial_temperature": 298.15,
        "final_temperature": 275.15,
        "composition": LETTUCE,
        "freezing_point": LETTUCE_FREEZING_POINT,
    }
    fields.update(changes)
    return EvaporativeCoolingCase(**fields)  # type: ignore[arg-type]


def test_lettuce_loses_one_percent_per_five_to_six_kelvin() -> None:
    # common practice, no source: ~1 % of mass per 5-6 degC; 25 -> 2 degC gives 3.5-5 %
    result = evaporative_cooling(_lettuce())
    assert 0.035 <= float(result.evaporated_fraction_of_product) <= 0.05


def test_pressures_are_saturation_pressures() -> None:
    # source: iapws 1.5.5 IAPWS95 class saturation at the initial and final temperatures
    result = evaporative_cooling(_lettuce())
    start = IAPWS95(T=298.15, x=0.0).P * 1e6
    final = IAPWS95(T=275.15, x=0.0).P * 1e6
    assert float(result.start_pressure) == pytest.approx(start, rel=1e-8)
    assert float(result.final_pressure) == pytest.approx(final, rel=1e-8)


def test_energy_closes_and_hand_method_agrees() -> None:
    # first law: sensible heat released + heat gained = latent heat carried off
    result = evaporative_cooling(
        _lettuce(companions=(Companion(0.2, 900.0),), heat_gain=HeatGain(energy=2000.0))
    )
    assert abs(float(result.relative_energy_residual)) < 1e-9
    assert abs(float(result.relative_difference)) < 0.02
    assert float(result.heat_gained) == pytest.approx(2000.0, rel=1e-10)


def test_lumped_specific_heat_matches_the_textbook_estimate() -> None:
    # hand estimate m c dT / L with L(13.5 degC) ~ 2.467 MJ/kg (iapws 1.5.5 IAPWS95)
    result = evaporative_cooling(
        EvaporativeCoolingCase(
            product_mass=1.0,
            initial_temperature=298.15,
            final_temperature=275.15,
            specific_heat=4000.0,
        )
    )
    latent = IAPWS95(T=286.65, x=1.0).h - IAPWS95(T=286.65, x=0.0).h
    estimate = 4000.0 * 23.0 / (latent * 1e3)
    assert float(result.evaporated_fraction_of_product) == pytest.approx(estimate, rel=0.02)


def test_prewetting_flows_and_condenser_load() -> None:
    result = evaporative_cooling(
        _lettuce(trap_temperature=253.15, cooling_time=1200.0, product_mass=500.0)
    )
    assert float(result.prewetting_water_mass) > float(result.evaporated_mass)
    assert float(result.prewetting_water_mass) < 1.1 * float(result.evaporated_mass)
    assert result.mean_vapor_mass_flow is not None
    assert float(result.mean_vapor_mass_flow) == pytest.approx(
        float(result.evaporated_mass) / 1200.0
    )
    assert result.condenser_load is not None
    assert 2.8e6 < float(result.condenser_load / result.evaporated_mass) < 2.95e6


def test_sweep_and_monotonic_in_initial_temperature() -> None:
    result = evaporative_cooling(_lettuce(initial_temperature=np.array([288.15, 298.15, 308.15])))
    assert result.evaporated_fraction_of_product.shape == (3,)
    assert np.all(np.diff(result.evaporated_fraction_of_product) > 0.0)


@pytest.mark.parametrize(
    ("changes", "error"),
    [
        pytest.param({"final_temperature": 300.0}, OutOfRangeError, id="final-above-initial"),
        pytest.param({"final_temperature": 298.15}, OutOfRangeError, id="final-equals-initial"),
        pytest.param({"final_temperature": 272.0}, UnsupportedStateError, id="below-freezing"),
        pytest.param({"specific_heat": 3900.0}, InvalidInputError, id="both-models"),
        pytest.param({"product_mass": -1.0}, OutOfRangeError, id="negative-mass"),
        pytest.param({"heat_gain": HeatGain(energy=1e9)}, UnsupportedStateError, id="heat"),
    ],
)
def test_invalid_cases_raise(changes: dict[str, object], error: type[Exception]) -> None:
    with pytest.raises(error):
        evaporative_cooling(_lettuce(**changes))


def test_freezing_error_points_to_the_flash_freeze_calculation() -> None:
    with pytest.raises(UnsupportedStateError) as caught:
        evaporative_cooling(_lettuce(final_temperature=270.0))
    assert "flash-freeze" in str(caught.value)


def test_missing_freezing_point_warns() -> None:
    result = evaporative_cooling(_lettuce(freezing_point=None))
    assert "freezing-point-assumed" in [w.code for w in result.warnings]


def test_input_and_property_uncertainty() -> None:
    # linear sensitivity: d(fraction)/d(T_initial) ~ fraction / (T_i - T_f)
    case = _lettuce()
    propagated = propagate_input_uncertainty(
        evaporative_cooling, case, {"initial_temperature": 0.5}, ("evaporated_fraction_of_product",)
    )
    base = float(evaporative_cooling(case).evaporated_fraction_of_product)
    expected = base / 23.0 * 0.5
    value = float(propagated.standard_uncertainty["evaporated_fraction_of_product"])
    assert value == pytest.approx(expected, rel=0.05)


def test_final_vapor_volume_flow_is_mean_mass_flow_at_final_vapor_density() -> None:
    # source: iapws 1.5.5 IAPWS95 class, saturated vapor density at the final 2 degC
    result = evaporative_cooling(_lettuce(cooling_time=1200.0, product_mass=500.0))
    assert result.final_vapor_volume_flow is not None and result.mean_vapor_volume_flow is not None
    density = IAPWS95(T=275.15, x=1.0).rho
    expected = float(result.evaporated_mass) / 1200.0 / density
    assert float(result.final_vapor_volume_flow) == pytest.approx(expected, rel=1e-7)
    # the mean averages over higher pressures, where the vapor is denser
    assert float(result.final_vapor_volume_flow) > float(result.mean_vapor_volume_flow)
    assert evaporative_cooling(_lettuce()).final_vapor_volume_flow is None
