"""Invariants of the flash-freeze balance (hypothesis) and its error paths.

Sources: conservation of mass and energy (first law) and the monotonic dependence on the
initial temperature are physics, no external numbers; the 2 % agreement of the
hand method is the acceptance bound of the balance's specification.
"""

from __future__ import annotations

import numpy as np
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from service.core.balances import (
    Companion,
    FlashFreezeCase,
    HeatGain,
    companion_of,
    flash_freeze,
    named_solute,
    solution_freezing_point,
)
from service.core.errors import InvalidInputError, OutOfRangeError, UnsupportedStateError
from service.core.solutions.freezing import lowest_temperature

_SETTINGS = settings(max_examples=25, deadline=None)

initial_temperatures = st.floats(min_value=273.16, max_value=373.15)
water_masses = st.floats(min_value=1e-3, max_value=1e3)
ice_temperatures = st.floats(min_value=183.15, max_value=273.16)


@_SETTINGS
@given(initial_temperatures, water_masses, ice_temperatures)
def test_mass_is_conserved(initial: float, water: float, final: float) -> None:
    result = flash_freeze(
        FlashFreezeCase(initial_temperature=initial, water_mass=water, final_ice_temperature=final)
    )
    total = float(result.evaporated_mass + result.ice_mass + result.liquid_mass)
    assert total == pytest.approx(water, rel=4e-16, abs=0.0)
    stage_sum = sum(float(stage.evaporated_mass) for stage in result.stages)
    assert stage_sum == pytest.approx(float(result.evaporated_mass), rel=1e-14)


@_SETTINGS
@given(initial_temperatures, water_masses, st.one_of(st.none(), ice_temperatures))
def test_trajectory_fractions_are_never_negative(
    initial: float, water: float, final: float | None
) -> None:
    # Mass fractions of the water cannot be negative; round-off (|x| < 1e-12) is reported as
    # 0, so the trajectory starts at exactly 0 evaporated.
    result = flash_freeze(
        FlashFreezeCase(initial_temperature=initial, water_mass=water, final_ice_temperature=final)
    )
    trajectory = result.trajectory
    for fractions in (
        trajectory.evaporated_fraction_of_water,
        trajectory.ice_fraction,
        trajectory.liquid_fraction,
    ):
        assert np.all(fractions >= 0.0)
    assert float(trajectory.evaporated_fraction_of_water[0]) == 0.0


@_SETTINGS
@given(
    initial_temperatures,
    water_masses,
    st.floats(min_value=0.0, max_value=2.0),
    st.floats(min_value=0.0, max_value=2e4),
    st.one_of(st.none(), ice_temperatures),
)
def test_energy_balance_closes(
    initial: float, water: float, steel: float, heat: float, final: float | None
) -> None:
    case = FlashFreezeCase(
        initial_temperature=initial,
        water_mass=water,
        final_ice_temperature=final,
        companions=(companion_of("stainless steel", steel * water),),
        heat_gain=HeatGain(energy=heat * water),
    )
    balance = flash_freeze(case).energy_balance
    assert abs(float(balance.relative_residual)) < 1e-9
    closed = (
        balance.initial_energy
        + balance.heat_gained
        - balance.final_energy
        - balance.vapor_enthalpy
        - balance.boundary_work
    )
    assert abs(float(closed - balance.residual)) < 1e-9 * float(balance.vapor_enthalpy)


@settings(max_examples=10, deadline=None)
@given(
    st.floats(min_value=274.0, max_value=330.0),
    st.floats(min_value=0.01, max_value=0.2),
    st.floats(min_value=250.0, max_value=268.0),
)
def test_energy_balance_closes_for_a_freezing_solution(
    initial: float, fraction: float, final: float
) -> None:
    case = FlashFreezeCase(
        initial_temperature=initial,
        solute=named_solute("sucrose", fraction, "ideal"),
        final_ice_temperature=final,
    )
    result = flash_freeze(case)
    assert abs(float(result.energy_balance.relative_residual)) < 1e-9
    total = float(result.evaporated_mass + result.ice_mass + result.liquid_mass)
    assert total == pytest.approx(1.0, rel=4e-16, abs=0.0)


@settings(max_examples=10, deadline=None)
@given(
    st.sampled_from(["sodium chloride", "sucrose", "glycerol", "ethanol"]),
    st.floats(min_value=274.0, max_value=330.0),
    st.floats(min_value=0.01, max_value=0.05),
    st.floats(min_value=0.0, max_value=1.0),
)
def test_energy_balance_closes_for_a_non_ideal_freezing_solution(
    name: str, initial: float, fraction: float, depth: float
) -> None:
    # the named solute's published activity model (Pitzer, Norrish), to a final temperature
    # between 0.5 K below the onset and the end of the model's range
    solute = named_solute(name, fraction)
    assert solute.activity_model is not None
    onset = float(solution_freezing_point(solute))
    lowest = float(lowest_temperature(solute.activity_model)[0]) + 0.5
    final = onset - 0.5 - depth * (onset - 0.5 - lowest)
    result = flash_freeze(
        FlashFreezeCase(initial_temperature=initial, solute=solute, final_ice_temperature=final)
    )
    assert abs(float(result.energy_balance.relative_residual)) < 1e-9
    total = float(result.evaporated_mass + result.ice_mass + result.liquid_mass)
    assert total == pytest.approx(1.0, rel=4e-16, abs=0.0)


@_SETTINGS
@given(st.floats(min_value=273.16, max_value=372.0), st.floats(min_value=0.05, max_value=1.0))
def test_evaporated_fraction_rises_with_initial_temperature(lower: float, step: float) -> None:
    result = flash_freeze(FlashFreezeCase(initial_temperature=np.array([lower, lower + step])))
    fractions = result.evaporated_fraction_of_water
    assert fractions[1] > fractions[0]


@_SETTINGS
@given(initial_temperatures, st.one_of(st.none(), ice_temperatures))
def test_hand_method_agrees_within_two_percent(initial: float, final: float | None) -> None:
    result = flash_freeze(
        FlashFreezeCase(
            initial_temperature=initial, final_ice_temperature=final, method="mean-vapor-enthalpy"
        )
    )
    assert abs(float(result.comparison.relative_difference)) < 0.02
    assert float(result.evaporated_mass) == float(
        result.comparison.mean_vapor_enthalpy_evaporated_mass
    )


def test_sweep_returns_the_scalar_answers_in_order() -> None:
    temperatures = np.array([[280.0, 300.0], [320.0, 290.0]])
    swept = flash_freeze(FlashFreezeCase(initial_temperature=temperatures))
    assert swept.evaporated_mass.shape == (2, 2)
    assert swept.trajectory.temperature.shape == (2, 2, 64)
    for index, temperature in np.ndenumerate(temperatures):
        single = flash_freeze(FlashFreezeCase(initial_temperature=float(temperature)))
        assert swept.evaporated_mass[index] == pytest.approx(float(single.evaporated_mass), 1e-14)


def test_trajectory_has_at_least_50_points_and_ends_frozen() -> None:
    result = flash_freeze(
        FlashFreezeCase(
            initial_temperature=300.0,
            final_ice_temperature=250.0,
            nucleation_temperature=265.0,
            trajectory_points=50,
        )
    )
    trajectory = result.trajectory
    assert trajectory.temperature.size >= 50
    assert trajectory.temperature[0] == 300.0
    assert trajectory.ice_fraction[-1] == pytest.approx(float(result.ice_mass))
    assert np.all(np.diff(trajectory.evaporated_fraction_of_water) >= -1e-15)
    names = [stage.name for stage in result.stages]
    assert names == ["cooling", "supercooled cooling", "recalescence", "freezing", "ice cooling"]


def test_supercooling_forms_ice_at_once_and_changes_little_in_total() -> None:
    plain = flash_freeze(FlashFreezeCase(initial_temperature=293.15))
    supercooled = flash_freeze(
        FlashFreezeCase(initial_temperature=293.15, nucleation_temperature=263.15)
    )
    recalescence = supercooled.stages[2]
    # sensible heat of 10 K of liquid over the heat of fusion: about 4.2 * 10 / 333 of the water
    assert 0.10 < float(recalescence.ice_formed) < 0.14
    assert float(supercooled.evaporated_fraction_of_water) == pytest.approx(
        float(plain.evaporated_fraction_of_water), rel=2e-3
    )


def test_companions_and_heat_gain_raise_the_evaporation() -> None:
    plain = flash_freeze(FlashFreezeCase(initial_temperature=293.15))
    tray = flash_freeze(
        FlashFreezeCase(initial_temperature=293.15, companions=(Companion(1.0, 900.0),))
    )
    warm = flash_freeze(
        FlashFreezeCase(initial_temperature=293.15, heat_gain=HeatGain(power=5.0, duration=600.0))
    )
    assert float(tray.evaporated_mass) > float(plain.evaporated_mass)
    assert float(warm.evaporated_mass) > float(plain.evaporated_mass)
    assert float(warm.heat_gained) == pytest.approx(3000.0, rel=1e-10)


def test_condenser_load_is_vapor_enthalpy_minus_trap_ice() -> None:
    result = flash_freeze(FlashFreezeCase(initial_temperature=293.15, trap_temperature=233.15))
    assert result.condenser_load is not None
    per_kilogram = float(result.condenser_load / result.evaporated_mass)
    # between the sublimation heat at the trap and that plus vapor superheat: ~2.8-2.95 MJ/kg
    assert 2.80e6 < per_kilogram < 2.95e6


@pytest.mark.parametrize(
    ("case", "error"),
    [
        pytest.param(FlashFreezeCase(initial_temperature=270.0), OutOfRangeError, id="below-onset"),
        pytest.param(FlashFreezeCase(initial_temperature=380.0), OutOfRangeError, id="too-hot"),
        pytest.param(
            FlashFreezeCase(initial_temperature=290.0, water_mass=0.0), OutOfRangeError, id="mass"
        ),
        pytest.param(
            FlashFreezeCase(initial_temperature=float("nan")), InvalidInputError, id="nan"
        ),
        pytest.param(
            FlashFreezeCase(initial_temperature=[290.0, 260.0]), OutOfRangeError, id="sweep-element"
        ),
        pytest.param(
            FlashFreezeCase(initial_temperature=290.0, solute=named_solute("sucrose", 0.1)),
            InvalidInputError,
            id="solute-without-end",
        ),
        pytest.param(
            FlashFreezeCase(initial_temperature=290.0, nucleation_temperature=274.0),
            OutOfRangeError,
            id="nucleation-above-onset",
        ),
        pytest.param(
            FlashFreezeCase(initial_temperature=290.0, heat_gain=HeatGain(energy=1e7)),
            UnsupportedStateError,
            id="heat-gain-evaporates-all",
        ),
        pytest.param(
            FlashFreezeCase(initial_temperature=290.0, method="guess"),  # type: ignore[arg-type]
            InvalidInputError,
            id="method",
        ),
        pytest.param(
            FlashFreezeCase(initial_temperature=290.0, trajectory_points=10),
            InvalidInputError,
            id="few-points",
        ),
    ],
)
def test_invalid_cases_raise(case: FlashFreezeCase, error: type[Exception]) -> None:
    with pytest.raises(error):
        flash_freeze(case)


def test_out_of_range_error_names_the_sweep_element() -> None:
    with pytest.raises(OutOfRangeError) as caught:
        flash_freeze(FlashFreezeCase(initial_temperature=[290.0, 300.0, 260.0]))
    assert caught.value.index == 2
    assert caught.value.variable == "initial_temperature"
