"""Ice Ih (IAPWS R10-06(2009)) and its melting and sublimation curves (IAPWS R14-08(2011)).

Round trips of the inverse curves, agreement with the independent iapws package
(iapws 1.5.5: ``iapws._iapws._Ice``, ``_Melting_Pressure``,
``_Sublimation_Pressure``, which work in MPa and kJ), range and input errors,
and monotonicity invariants.
"""

from __future__ import annotations

from typing import Any

import numpy as np
import pytest
from hypothesis import assume, given, settings
from hypothesis import strategies as st
from iapws._iapws import _Ice, _Melting_Pressure, _Sublimation_Pressure

from service.core.errors import InvalidInputError, OutOfRangeError
from service.core.properties.ice import ice_gibbs_derivatives, ice_properties
from service.core.properties.ice_coefficients import ICE_RESIDUAL_ENTROPY
from service.core.properties.phase_lines import (
    MELTING_PRESSURE_RANGE,
    MELTING_TEMPERATURE_RANGE,
    SUBLIMATION_PRESSURE_RANGE,
    SUBLIMATION_TEMPERATURE_RANGE,
    melting_pressure,
    melting_temperature,
    sublimation_pressure,
    sublimation_temperature,
)

IAPWS_PACKAGE = "iapws 1.5.5"

# --- round trips -------------------------------------------------------------------


def test_melting_round_trip_on_dense_grid() -> None:
    """melting_temperature(melting_pressure(T)) == T over the whole ice Ih curve."""
    temperature = np.linspace(*MELTING_TEMPERATURE_RANGE, 20001)
    recovered = melting_temperature(melting_pressure(temperature))
    np.testing.assert_allclose(recovered, temperature, rtol=1e-13, atol=0.0)


def test_sublimation_round_trip_on_dense_grid() -> None:
    """sublimation_temperature(sublimation_pressure(T)) == T from 50 K to 273.16 K."""
    temperature = np.linspace(*SUBLIMATION_TEMPERATURE_RANGE, 20001)
    recovered = sublimation_temperature(sublimation_pressure(temperature))
    np.testing.assert_allclose(recovered, temperature, rtol=1e-13, atol=0.0)


def test_pressure_round_trips_on_dense_grid() -> None:
    """p -> T -> p closes to round-off for both curves."""
    melting = np.geomspace(*MELTING_PRESSURE_RANGE, 5001)
    # Near the triple point the curve is steep (about -13.5 MPa/K): one unit in the last
    # place of T (5.7e-14 K) moves p by about 1e-6 Pa, hence the absolute tolerance.
    np.testing.assert_allclose(
        melting_pressure(melting_temperature(melting)), melting, rtol=1e-11, atol=1e-4
    )
    sublimation = np.geomspace(*SUBLIMATION_PRESSURE_RANGE, 5001)
    np.testing.assert_allclose(
        sublimation_pressure(sublimation_temperature(sublimation)), sublimation, rtol=1e-11
    )


@settings(max_examples=200, deadline=None)
@given(st.floats(min_value=MELTING_TEMPERATURE_RANGE[0], max_value=MELTING_TEMPERATURE_RANGE[1]))
def test_melting_round_trip_property(temperature: float) -> None:
    recovered = float(melting_temperature(melting_pressure(temperature)))
    assert recovered == pytest.approx(temperature, rel=1e-13)


@settings(max_examples=200, deadline=None)
@given(
    st.floats(
        min_value=SUBLIMATION_TEMPERATURE_RANGE[0], max_value=SUBLIMATION_TEMPERATURE_RANGE[1]
    )
)
def test_sublimation_round_trip_property(temperature: float) -> None:
    recovered = float(sublimation_temperature(sublimation_pressure(temperature)))
    assert recovered == pytest.approx(temperature, rel=1e-13)


def test_curve_end_points() -> None:
    """Both curves meet at the triple point (R14-08(2011) eqs. (1) and (6) at T_t = 273.16 K
    give p_t = 611.657 Pa exactly by construction); the inverses return the range ends."""
    assert float(melting_pressure(273.16)) == pytest.approx(611.657, rel=1e-15)
    assert float(sublimation_pressure(273.16)) == pytest.approx(611.657, rel=1e-15)
    assert float(melting_temperature(611.657)) == 273.16
    assert float(sublimation_temperature(611.657)) == 273.16
    assert float(melting_temperature(MELTING_PRESSURE_RANGE[1])) == pytest.approx(
        251.165, rel=1e-13
    )
    assert float(sublimation_temperature(SUBLIMATION_PRESSURE_RANGE[0])) == pytest.approx(
        50.0, rel=1e-13
    )


def test_normal_melting_point() -> None:
    """IAPWS R10-06(2009) Table 6 uses T = 273.152519 K as the melting point at 101325 Pa,
    printed to 6 decimals; R14-08 eq. (1) inverted at 101325 Pa reproduces it."""
    assert float(melting_temperature(101325.0)) == pytest.approx(273.152519, abs=1e-6)


# --- agreement with the iapws package ------------------------------------------------


def _stable_ice_grid() -> tuple[np.ndarray[Any, np.dtype[np.float64]], ...]:
    """About 300 states strictly inside the stable ice Ih region."""
    temperature_grid, pressure_grid = np.meshgrid(
        np.linspace(50.0, 273.0, 24), np.geomspace(1e-3, 200e6, 24), indexing="ij"
    )
    temperature = temperature_grid.ravel()
    pressure = pressure_grid.ravel()
    above_sublimation = pressure > 1.01 * sublimation_pressure(temperature)
    melting_limit = np.where(
        temperature >= 251.2, melting_pressure(np.maximum(temperature, 251.2)), 208.0e6
    )
    stable = above_sublimation & (pressure < 0.99 * melting_limit)
    return temperature[stable], pressure[stable]


def test_ice_properties_agree_with_iapws_package() -> None:
    """iapws 1.5.5 ``_Ice`` (same release, independent implementation) on ~300 states."""
    temperature, pressure = _stable_ice_grid()
    assert temperature.size > 250
    ours = ice_properties(temperature, pressure)
    derivatives = ice_gibbs_derivatives(temperature, pressure)
    reference = [
        _Ice(float(t), float(p) * 1e-6) for t, p in zip(temperature, pressure, strict=True)
    ]

    def column(key: str, scale: float) -> np.ndarray[Any, np.dtype[np.float64]]:
        return np.array([state[key] * scale for state in reference])

    np.testing.assert_allclose(ours.density, column("rho", 1.0), rtol=1e-12, err_msg=IAPWS_PACKAGE)
    np.testing.assert_allclose(
        ours.specific_enthalpy, column("h", 1e3), rtol=1e-12, err_msg=IAPWS_PACKAGE
    )
    np.testing.assert_allclose(
        ours.specific_internal_energy, column("u", 1e3), rtol=1e-12, err_msg=IAPWS_PACKAGE
    )
    np.testing.assert_allclose(
        ours.specific_entropy, column("s", 1e3), rtol=1e-12, err_msg=IAPWS_PACKAGE
    )
    np.testing.assert_allclose(
        ours.specific_isobaric_heat_capacity, column("cp", 1e3), rtol=1e-11, err_msg=IAPWS_PACKAGE
    )
    np.testing.assert_allclose(
        derivatives.gibbs_energy, column("g", 1e3), rtol=1e-12, atol=1e-7, err_msg=IAPWS_PACKAGE
    )


def test_phase_lines_agree_with_iapws_package() -> None:
    """iapws 1.5.5 ``_Melting_Pressure`` (ice Ih) and ``_Sublimation_Pressure``, 200 points each."""
    melting_grid = np.linspace(*MELTING_TEMPERATURE_RANGE, 200)
    expected_melting = np.array([_Melting_Pressure(float(t), "Ih") * 1e6 for t in melting_grid])
    np.testing.assert_allclose(
        melting_pressure(melting_grid), expected_melting, rtol=1e-13, err_msg=IAPWS_PACKAGE
    )
    sublimation_grid = np.linspace(*SUBLIMATION_TEMPERATURE_RANGE, 200)
    expected_sublimation = np.array(
        [_Sublimation_Pressure(float(t)) * 1e6 for t in sublimation_grid]
    )
    np.testing.assert_allclose(
        sublimation_pressure(sublimation_grid),
        expected_sublimation,
        rtol=1e-12,
        err_msg=IAPWS_PACKAGE,
    )


# --- behaviour near 0 K, metastable states, shapes ------------------------------------


def test_ice_near_zero_kelvin_is_regular() -> None:
    """No floating-point warning as T -> 0 (pytest turns warnings into errors); the
    entropy tends to s0 of IAPWS R10-06(2009) Table 2 (eq. (1): the complex terms'
    T-derivative vanishes at T = 0), and c_p tends to zero."""
    temperature = np.array([1e-300, 1e-12, 1e-6, 1e-3, 1.0])
    ice = ice_properties(temperature, 101325.0)
    for field in (ice.density, ice.specific_enthalpy, ice.specific_entropy):
        assert np.all(np.isfinite(field))
    np.testing.assert_allclose(ice.specific_entropy[:3], ICE_RESIDUAL_ENTROPY, rtol=1e-12)
    assert np.all(ice.specific_isobaric_heat_capacity >= 0.0)
    assert float(ice.specific_isobaric_heat_capacity[-1]) < 1.0


def test_metastable_ice_is_extrapolated_without_warning() -> None:
    """Inside the R10-06 rectangle but beyond the melting or sublimation curve."""
    ice = ice_properties([273.16, 260.0, 200.0], [200e6, 200e6, 1e-6])
    assert np.all(np.isfinite(ice.density))
    assert np.all(ice.density > 900.0)


def test_shapes_are_preserved_and_broadcast() -> None:
    temperature = np.linspace(200.0, 270.0, 6).reshape(2, 3)
    ice = ice_properties(temperature, 1e5)
    assert ice.density.shape == (2, 3)
    assert ice.pressure.shape == (2, 3)
    assert ice_properties(250.0, 1e5).density.shape == ()
    assert melting_pressure(np.full((2, 3), 260.0)).shape == (2, 3)
    assert sublimation_temperature(np.full((2, 2), 10.0)).shape == (2, 2)
    assert isinstance(ice_properties(250.0, 1e5).density, np.ndarray)


# --- errors ----------------------------------------------------------------------------


@pytest.mark.parametrize(
    ("temperature", "pressure", "variable", "index"),
    [
        pytest.param(273.17, 1e5, "temperature", None, id="too-warm"),
        pytest.param(0.0, 1e5, "temperature", None, id="zero-kelvin"),
        pytest.param(-5.0, 1e5, "temperature", None, id="negative-temperature"),
        pytest.param([200.0, 300.0], 1e5, "temperature", 1, id="second-element"),
        pytest.param(200.0, 0.0, "pressure", None, id="zero-pressure"),
        pytest.param(200.0, 210.1e6, "pressure", None, id="too-high-pressure"),
        pytest.param(200.0, [1e5, 1e5, -1.0], "pressure", 2, id="third-pressure"),
    ],
)
def test_ice_out_of_range(
    temperature: float | list[float],
    pressure: float | list[float],
    variable: str,
    index: int | None,
) -> None:
    with pytest.raises(OutOfRangeError) as caught:
        ice_properties(temperature, pressure)
    assert caught.value.variable == variable
    assert caught.value.index == index
    assert caught.value.unit == ("K" if variable == "temperature" else "Pa")
    assert isinstance(caught.value, ValueError)


@pytest.mark.parametrize(
    ("temperature", "pressure"),
    [
        pytest.param(float("nan"), 1e5, id="nan-temperature"),
        pytest.param(200.0, float("inf"), id="inf-pressure"),
        pytest.param([200.0, float("nan")], 1e5, id="nan-in-array"),
        pytest.param("cold", 1e5, id="not-a-number"),
        pytest.param([200.0, 210.0], [1e5, 1e5, 1e5], id="shapes-do-not-broadcast"),
    ],
)
def test_ice_invalid_input(temperature: object, pressure: object) -> None:
    with pytest.raises(InvalidInputError):
        ice_properties(temperature, pressure)  # type: ignore[arg-type]


@pytest.mark.parametrize(
    ("function", "value", "valid_value", "variable", "unit"),
    [
        pytest.param(melting_pressure, 251.16, 260.0, "temperature", "K", id="melting-too-cold"),
        pytest.param(melting_pressure, 273.161, 260.0, "temperature", "K", id="melting-too-warm"),
        pytest.param(melting_temperature, 611.0, 1e6, "pressure", "Pa", id="melting-too-low"),
        pytest.param(melting_temperature, 208.6e6, 1e6, "pressure", "Pa", id="melting-too-high"),
        pytest.param(
            sublimation_pressure, 49.99, 200.0, "temperature", "K", id="sublimation-too-cold"
        ),
        pytest.param(
            sublimation_pressure, 273.17, 200.0, "temperature", "K", id="sublimation-too-warm"
        ),
        pytest.param(
            sublimation_temperature, 1e-41, 1.0, "pressure", "Pa", id="sublimation-too-low"
        ),
        pytest.param(
            sublimation_temperature, 612.0, 1.0, "pressure", "Pa", id="sublimation-too-high"
        ),
        pytest.param(sublimation_temperature, 0.0, 1.0, "pressure", "Pa", id="sublimation-zero"),
    ],
)
def test_phase_lines_out_of_range(
    function: Any, value: float, valid_value: float, variable: str, unit: str
) -> None:
    with pytest.raises(OutOfRangeError) as caught:
        function(value)
    assert caught.value.variable == variable
    assert caught.value.unit == unit
    assert caught.value.value == value
    assert caught.value.index is None
    with pytest.raises(OutOfRangeError) as caught_in_array:
        function([valid_value, value])
    assert caught_in_array.value.index == 1


@pytest.mark.parametrize(
    "function",
    [melting_pressure, melting_temperature, sublimation_pressure, sublimation_temperature],
)
@pytest.mark.parametrize("value", [float("nan"), float("inf"), -float("inf")])
def test_phase_lines_reject_non_finite(function: Any, value: float) -> None:
    with pytest.raises(InvalidInputError):
        function(value)


# --- invariants --------------------------------------------------------------------------


@settings(max_examples=300, deadline=None)
@given(
    st.floats(
        min_value=SUBLIMATION_TEMPERATURE_RANGE[0], max_value=SUBLIMATION_TEMPERATURE_RANGE[1]
    ),
    st.floats(
        min_value=SUBLIMATION_TEMPERATURE_RANGE[0], max_value=SUBLIMATION_TEMPERATURE_RANGE[1]
    ),
)
def test_sublimation_pressure_increases_with_temperature(first: float, second: float) -> None:
    low, high = sorted((first, second))
    assume(high - low > 1e-9)
    assert float(sublimation_pressure(low)) < float(sublimation_pressure(high))


@settings(max_examples=300, deadline=None)
@given(
    st.floats(min_value=MELTING_PRESSURE_RANGE[0], max_value=MELTING_PRESSURE_RANGE[1]),
    st.floats(min_value=MELTING_PRESSURE_RANGE[0], max_value=MELTING_PRESSURE_RANGE[1]),
)
def test_melting_temperature_decreases_with_pressure(first: float, second: float) -> None:
    """Ice Ih is less dense than the liquid, so its melting point falls under pressure."""
    low, high = sorted((first, second))
    assume(high - low > 1e-2)
    assert float(melting_temperature(low)) > float(melting_temperature(high))


@settings(max_examples=200, deadline=None)
@given(
    st.floats(min_value=1.0, max_value=273.16),
    st.floats(min_value=1e-3, max_value=210e6),
)
def test_ice_is_stable_thermodynamically(temperature: float, pressure: float) -> None:
    """Positive c_p and positive isothermal compressibility (-g_pp > 0) everywhere in range."""
    derivatives = ice_gibbs_derivatives(temperature, pressure)
    assert float(derivatives.second_temperature_derivative) < 0.0
    assert float(derivatives.second_pressure_derivative) < 0.0
    assert float(derivatives.pressure_derivative) > 0.0
