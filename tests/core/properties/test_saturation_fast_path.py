"""The tabulated saturation fast path against the exact IAPWS-95 solution and iapws.

Tolerances asserted here (measured maxima in parentheses, 20,001 points from the
triple point to the critical point):

- pressure, densities, latent heat: 1e-9 relative (3e-13, 6e-12, 2e-11);
- enthalpies and internal energies: 1e-9 relative plus 1e-4 J/kg absolute, the
  absolute part for values near zero at the triple point (h' = 0.61 J/kg,
  u' = 0 there; measured 1.5e-6 J/kg);
- entropies: 1e-9 relative plus 1e-7 J/(kg K) absolute (2.3e-9 J/(kg K));
- isobaric heat capacities: 1e-8 relative (1.5e-10).

Within 0.5 K of the critical point the fast path calls the exact solver itself.
"""

from __future__ import annotations

import warnings

import numpy as np
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from service.core.errors import InvalidInputError, OutOfRangeError
from service.core.properties.constants import CRITICAL_PRESSURE, CRITICAL_TEMPERATURE
from service.core.properties.helmholtz import fluid_properties, solve_saturation
from service.core.properties.if97 import (
    if97_liquid_properties,
    if97_saturation_pressure,
    if97_vapor_properties,
)
from service.core.properties.phase import FloatArray, PhaseProperties
from service.core.properties.saturation import (
    SaturationStates,
    saturation_by_pressure,
    saturation_by_temperature,
    saturation_pressure,
    saturation_temperature,
)

TRIPLE = 273.16
CRITICAL = CRITICAL_TEMPERATURE


def _close(actual: FloatArray, expected: FloatArray, rel: float, absolute: float = 0.0) -> float:
    """Largest error in units of the tolerance (pass when <= 1)."""
    error = np.abs(actual - expected)
    return float(np.max(error / (rel * np.abs(expected) + absolute)))


@pytest.fixture(scope="module")
def dense_grid() -> tuple[SaturationStates, PhaseProperties, PhaseProperties, FloatArray]:
    temperature = np.linspace(TRIPLE, CRITICAL, 20_001)
    fast = saturation_by_temperature(temperature)
    exact = solve_saturation(temperature)
    assert np.all(exact.converged)
    liquid = fluid_properties(exact.liquid_density, temperature)
    vapor = fluid_properties(exact.vapor_density, temperature)
    return fast, liquid, vapor, exact.pressure


def test_fast_path_pressure_density_latent_heat_match_exact(
    dense_grid: tuple[SaturationStates, PhaseProperties, PhaseProperties, FloatArray],
) -> None:
    # Source: exact IAPWS-95 phase equilibrium (service.core.properties.helmholtz.solve_saturation).
    fast, liquid, vapor, pressure = dense_grid
    assert _close(fast.pressure, pressure, 1e-9) <= 1.0
    assert _close(fast.liquid.density, liquid.density, 1e-9) <= 1.0
    assert _close(fast.vapor.density, vapor.density, 1e-9) <= 1.0
    latent = vapor.specific_enthalpy - liquid.specific_enthalpy
    assert _close(fast.latent_heat_of_vaporization, latent, 1e-9, 1e-4) <= 1.0


@pytest.mark.parametrize("phase", ["liquid", "vapor"])
def test_fast_path_caloric_properties_match_exact(
    dense_grid: tuple[SaturationStates, PhaseProperties, PhaseProperties, FloatArray],
    phase: str,
) -> None:
    # Source: exact IAPWS-95 phase equilibrium and fluid_properties at its densities.
    fast_states, liquid, vapor, _ = dense_grid
    fast: PhaseProperties = getattr(fast_states, phase)
    exact = liquid if phase == "liquid" else vapor
    assert _close(fast.specific_enthalpy, exact.specific_enthalpy, 1e-9, 1e-4) <= 1.0
    assert _close(fast.specific_internal_energy, exact.specific_internal_energy, 1e-9, 1e-4) <= 1.0
    assert _close(fast.specific_entropy, exact.specific_entropy, 1e-9, 1e-7) <= 1.0
    finite = fast_states.temperature < CRITICAL
    assert (
        _close(
            fast.specific_isobaric_heat_capacity[finite],
            exact.specific_isobaric_heat_capacity[finite],
            1e-8,
        )
        <= 1.0
    )


def test_fast_path_matches_iapws_package() -> None:
    # Source: iapws 1.5.5, IAPWS95 class, saturation by (T, x).
    iapws = pytest.importorskip("iapws")
    temperature = np.linspace(TRIPLE, 647.0, 150)
    with warnings.catch_warnings():
        warnings.simplefilter("ignore")
        reference = [iapws.IAPWS95(T=float(t), x=0.5) for t in temperature]
    states = saturation_by_temperature(temperature)

    def column(getter: str) -> FloatArray:
        phase, name = getter.split(".")
        return np.array([getattr(getattr(r, phase), name) for r in reference], dtype=np.float64)

    pressure = np.array([r.P for r in reference]) * 1e6
    assert _close(states.pressure, pressure, 1e-9) <= 1.0
    assert _close(states.liquid.density, column("Liquid.rho"), 1e-9) <= 1.0
    assert _close(states.vapor.density, column("Gas.rho"), 1e-9) <= 1.0
    assert _close(states.liquid.specific_enthalpy, column("Liquid.h") * 1e3, 1e-8, 1e-3) <= 1.0
    assert _close(states.vapor.specific_enthalpy, column("Gas.h") * 1e3, 1e-8, 1e-3) <= 1.0
    assert _close(states.liquid.specific_entropy, column("Liquid.s") * 1e3, 1e-8, 1e-6) <= 1.0
    assert _close(states.vapor.specific_entropy, column("Gas.s") * 1e3, 1e-8, 1e-6) <= 1.0
    assert (
        _close(states.liquid.specific_isobaric_heat_capacity, column("Liquid.cp") * 1e3, 1e-7)
        <= 1.0
    )
    assert _close(states.vapor.specific_isobaric_heat_capacity, column("Gas.cp") * 1e3, 1e-7) <= 1.0


def test_round_trip_temperature_pressure_temperature() -> None:
    temperature = np.concatenate(
        [
            np.linspace(TRIPLE, CRITICAL, 5_001),
            CRITICAL - np.logspace(-9, 0, 19),
        ]
    )
    pressure = saturation_by_temperature(temperature).pressure
    back = saturation_by_pressure(pressure)
    np.testing.assert_allclose(back.temperature, temperature, rtol=0.0, atol=1e-9)
    np.testing.assert_array_equal(back.pressure, pressure)
    light = saturation_temperature(pressure)
    np.testing.assert_allclose(light, temperature, rtol=0.0, atol=1e-9)


def test_light_functions_agree_with_full_states() -> None:
    temperature = np.linspace(TRIPLE, CRITICAL, 301)
    states = saturation_by_temperature(temperature)
    np.testing.assert_allclose(saturation_pressure(temperature), states.pressure, rtol=1e-14)


def test_critical_point() -> None:
    states = saturation_by_temperature(CRITICAL)
    assert float(states.pressure) == CRITICAL_PRESSURE
    assert float(states.liquid.density) == float(states.vapor.density) == 322.0
    assert float(states.latent_heat_of_vaporization) == 0.0
    assert float(saturation_by_pressure(CRITICAL_PRESSURE).temperature) == CRITICAL


def test_near_critical_states_are_ordered() -> None:
    temperature = CRITICAL - np.logspace(-10, 0, 41)
    states = saturation_by_temperature(temperature)
    assert np.all(states.liquid.density > 322.0)
    assert np.all(states.vapor.density < 322.0)
    assert np.all(states.latent_heat_of_vaporization > 0.0)
    assert np.all(np.diff(states.pressure) < 0.0)


def test_batch_equals_scalar() -> None:
    temperature = np.array([TRIPLE, 300.0, 373.15, 500.0, 646.9, 647.09, CRITICAL])
    batch = saturation_by_temperature(temperature)
    for index, value in enumerate(temperature):
        single = saturation_by_temperature(float(value))
        assert single.pressure.shape == ()
        for phase in ("liquid", "vapor"):
            for name in ("density", "specific_enthalpy", "specific_entropy"):
                np.testing.assert_allclose(
                    getattr(getattr(single, phase), name),
                    getattr(getattr(batch, phase), name)[index],
                    rtol=1e-13,
                )
    grid = saturation_by_temperature(temperature.reshape(7, 1))
    assert grid.liquid.specific_enthalpy.shape == (7, 1)


def test_celsius_round_off_at_the_triple_point_is_accepted() -> None:
    states = saturation_by_temperature(0.01 + 273.15)  # 273.15999999999997 K
    assert float(states.temperature) == TRIPLE


@pytest.mark.parametrize(
    ("temperature", "index"),
    [
        pytest.param(273.0, None, id="below-triple"),
        pytest.param(650.0, None, id="above-critical"),
        pytest.param([300.0, 400.0, 700.0], 2, id="third-element"),
    ],
)
def test_temperature_out_of_range(temperature: float | list[float], index: int | None) -> None:
    with pytest.raises(OutOfRangeError) as caught:
        saturation_by_temperature(temperature)
    assert caught.value.variable == "temperature"
    assert caught.value.unit == "K"
    assert caught.value.index == index
    assert caught.value.minimum == TRIPLE
    assert caught.value.maximum == CRITICAL


@pytest.mark.parametrize("pressure", [600.0, 23.0e6, -1.0])
def test_pressure_out_of_range(pressure: float) -> None:
    with pytest.raises(OutOfRangeError) as caught:
        saturation_by_pressure(pressure)
    assert caught.value.variable == "pressure"
    assert caught.value.unit == "Pa"
    with pytest.raises(OutOfRangeError):
        saturation_temperature(pressure)


@pytest.mark.parametrize("bad", [float("nan"), float("inf"), [300.0, float("nan")], "warm"])
def test_non_finite_input_is_rejected(bad: object) -> None:
    with pytest.raises(InvalidInputError):
        saturation_by_temperature(bad)  # type: ignore[arg-type]
    with pytest.raises(InvalidInputError):
        saturation_by_pressure(bad)  # type: ignore[arg-type]
    with pytest.raises(InvalidInputError):
        saturation_pressure(bad)  # type: ignore[arg-type]


def test_unknown_formulation_is_rejected() -> None:
    with pytest.raises(InvalidInputError):
        saturation_by_temperature(300.0, formulation="IAPWS-84")  # type: ignore[arg-type]


@settings(max_examples=200, deadline=None)
@given(
    st.floats(min_value=TRIPLE, max_value=CRITICAL),
    st.floats(min_value=1e-6, max_value=50.0),
)
def test_pressure_strictly_increases_with_temperature(temperature: float, gap: float) -> None:
    upper = min(temperature + gap, CRITICAL)
    if upper - temperature < 1e-6:
        return
    pressure = saturation_pressure(np.array([temperature, upper]))
    assert pressure[1] > pressure[0]


@settings(max_examples=200, deadline=None)
@given(
    st.floats(min_value=TRIPLE, max_value=CRITICAL),
    st.floats(min_value=1e-3, max_value=50.0),
)
def test_latent_heat_decreases_and_is_not_negative(temperature: float, gap: float) -> None:
    upper = min(temperature + gap, CRITICAL)
    if upper - temperature < 1e-3:
        return
    latent = saturation_by_temperature(np.array([temperature, upper])).latent_heat_of_vaporization
    assert np.all(latent >= 0.0)
    assert latent[1] < latent[0]


# --- IAPWS-IF97 branch -----------------------------------------------------------------


def test_if97_branch_composes_the_if97_functions() -> None:
    temperature = np.linspace(273.15, 623.15, 51)
    states = saturation_by_temperature(temperature, formulation="IAPWS-IF97")
    pressure = if97_saturation_pressure(temperature)
    np.testing.assert_array_equal(states.pressure, pressure)
    liquid = if97_liquid_properties(temperature, pressure)
    vapor = if97_vapor_properties(temperature, pressure)
    np.testing.assert_array_equal(states.liquid.specific_enthalpy, liquid.specific_enthalpy)
    np.testing.assert_array_equal(states.vapor.density, vapor.density)
    np.testing.assert_allclose(
        states.latent_heat_of_vaporization,
        vapor.specific_enthalpy - liquid.specific_enthalpy,
        rtol=1e-15,
    )
    back = saturation_by_pressure(states.pressure, formulation="IAPWS-IF97")
    np.testing.assert_allclose(back.temperature, temperature, rtol=0.0, atol=1e-9)


@pytest.mark.parametrize(
    ("temperature", "expected_mpa"),
    [
        pytest.param(300.0, 0.353658941e-2, id="300K"),  # IAPWS R7-97(2012) Table 35
        pytest.param(500.0, 0.263889776e1, id="500K"),  # IAPWS R7-97(2012) Table 35
        pytest.param(600.0, 0.123443146e2, id="600K"),  # IAPWS R7-97(2012) Table 35
    ],
)
def test_if97_saturation_pressure_check_values(temperature: float, expected_mpa: float) -> None:
    value = float(saturation_pressure(temperature, formulation="IAPWS-IF97"))
    assert value == pytest.approx(expected_mpa * 1e6, rel=5e-9)


def test_if97_rejects_region_3() -> None:
    with pytest.raises(OutOfRangeError, match="region 3") as caught:
        saturation_by_temperature(630.0, formulation="IAPWS-IF97")
    assert caught.value.maximum == 623.15
    with pytest.raises(OutOfRangeError, match="region 3"):
        saturation_by_pressure(20.0e6, formulation="IAPWS-IF97")
    with pytest.raises(OutOfRangeError):
        saturation_by_temperature(273.0, formulation="IAPWS-IF97")
