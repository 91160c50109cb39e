"""IAPWS-IF97 regions 1, 2 and 4 against independent implementations.

References used beside each check:
- "iapws 1.5.5 IAPWS97": the iapws package's own IF97 implementation (same release,
  independent code), compared on a grid in both regions and on the saturation line;
- "iapws 1.5.5 IAPWS95": the iapws package's IAPWS-95 implementation, for IF97's
  consistency with IAPWS-95 along the saturation line. The bounds used here are the
  measured deviations that the derived IF97 entries of service/core/uncertainty.py
  rest on, rounded up; a larger deviation would invalidate those entries.
"""

from __future__ import annotations

import numpy as np
import pytest
from iapws import IAPWS95, IAPWS97
from iapws.iapws97 import _PSat_T

from service.core.errors import InvalidInputError, OutOfRangeError
from service.core.properties.if97 import (
    IF97_SATURATION_MINIMUM_PRESSURE,
    if97_b23_pressure,
    if97_liquid_properties,
    if97_saturation_pressure,
    if97_saturation_temperature,
    if97_vapor_properties,
)
from service.core.properties.phase import PhaseProperties

# iapws 1.5.5 IAPWS97 evaluates the same equations; agreement is to rounding.
SAME_EQUATIONS_TOLERANCE = 1e-9


def _grid_liquid() -> list[tuple[float, float]]:
    points = []
    for t in np.linspace(274.0, 620.0, 12):
        p_sat = float(if97_saturation_pressure(t))
        for p in np.geomspace(max(p_sat * 1.01, 1.0e5), 99.0e6, 5):
            points.append((float(t), float(p)))
    return points


def _grid_vapor() -> list[tuple[float, float]]:
    points = []
    # iapws 1.5.5 IAPWS97 rejects p < 611.213 Pa, so the grid starts at 700 Pa and 280 K.
    for t in np.linspace(280.0, 1070.0, 12):
        if t <= 623.15:
            top = float(if97_saturation_pressure(t)) * 0.99
        else:
            top = min(float(if97_b23_pressure(min(t, 863.15))), 100.0e6) * 0.99
        for p in np.geomspace(700.0, top, 5):
            points.append((float(t), float(p)))
    return points


def _assert_matches_iapws97(
    points: list[tuple[float, float]], ours: PhaseProperties, region: int
) -> None:
    references = [IAPWS97(T=t, P=p / 1e6) for t, p in points]
    assert all(reference.region == region for reference in references)
    pairs = (
        (ours.density, [r.rho for r in references]),
        (ours.specific_enthalpy, [r.h * 1e3 for r in references]),
        (ours.specific_internal_energy, [r.u * 1e3 for r in references]),
        (ours.specific_entropy, [r.s * 1e3 for r in references]),
        (ours.specific_isobaric_heat_capacity, [r.cp * 1e3 for r in references]),
    )
    for actual, expected in pairs:
        np.testing.assert_allclose(actual, expected, rtol=SAME_EQUATIONS_TOLERANCE, atol=1e-6)


def test_liquid_matches_iapws_package_if97_on_grid() -> None:
    # Source: iapws 1.5.5 IAPWS97 (region 1), 60 points.
    points = _grid_liquid()
    t = np.array([pt[0] for pt in points])
    p = np.array([pt[1] for pt in points])
    _assert_matches_iapws97(points, if97_liquid_properties(t, p), region=1)


def test_vapor_matches_iapws_package_if97_on_grid() -> None:
    # Source: iapws 1.5.5 IAPWS97 (region 2), 60 points.
    points = _grid_vapor()
    t = np.array([pt[0] for pt in points])
    p = np.array([pt[1] for pt in points])
    _assert_matches_iapws97(points, if97_vapor_properties(t, p), region=2)


def test_saturation_line_matches_iapws_package_if97() -> None:
    # Source: iapws 1.5.5 IAPWS97 (region 4, x = 0) up to 623.15 K; above it the class
    # solves region 3, so Eq. 30 itself is compared, as iapws 1.5.5 iapws97._PSat_T.
    temperatures = np.linspace(273.16, 623.15, 30)
    expected = [IAPWS97(T=float(t), x=0.0).P * 1e6 for t in temperatures]
    np.testing.assert_allclose(
        if97_saturation_pressure(temperatures), expected, rtol=SAME_EQUATIONS_TOLERANCE
    )
    near_critical = np.linspace(623.15, 647.096, 10)
    np.testing.assert_allclose(
        if97_saturation_pressure(near_critical),
        [_PSat_T(float(t)) * 1e6 for t in near_critical],
        rtol=SAME_EQUATIONS_TOLERANCE,
    )


# Measured |IF97 - IAPWS-95| maxima (iapws 1.5.5 IAPWS95) on 273.16-623.15 K, rounded up;
# service/core/uncertainty.py derives its IF97 entries from these numbers.
IF97_VS_IAPWS95_BOUNDS = {
    "saturation_pressure": 1.76e-4,
    "saturated_liquid_density_to_373K": 1.6e-5,
    "saturated_liquid_density": 3.1e-5,
    "saturated_vapor_density": 4.2e-4,
    "liquid_isobaric_heat_capacity": 1.5e-3,
    "enthalpy_of_vaporization": 3.4e-4,
}


def test_saturation_states_agree_with_iapws95_within_derived_bounds() -> None:
    # Source: iapws 1.5.5 IAPWS95 (saturation by temperature, x = 0.5), 50 points.
    temperatures = np.linspace(273.16, 623.15, 50)
    p_sat = if97_saturation_pressure(temperatures)
    liquid = if97_liquid_properties(temperatures, p_sat)
    vapor = if97_vapor_properties(temperatures, p_sat)
    worst = dict.fromkeys(IF97_VS_IAPWS95_BOUNDS, 0.0)
    for k, t in enumerate(temperatures):
        reference = IAPWS95(T=float(t), x=0.5)
        deviations = {
            "saturation_pressure": p_sat[k] / (reference.P * 1e6) - 1.0,
            "saturated_liquid_density": liquid.density[k] / reference.Liquid.rho - 1.0,
            "saturated_vapor_density": vapor.density[k] / reference.Vapor.rho - 1.0,
            "liquid_isobaric_heat_capacity": liquid.specific_isobaric_heat_capacity[k]
            / (reference.Liquid.cp * 1e3)
            - 1.0,
            "enthalpy_of_vaporization": (vapor.specific_enthalpy[k] - liquid.specific_enthalpy[k])
            / ((reference.Vapor.h - reference.Liquid.h) * 1e3)
            - 1.0,
        }
        if t <= 373.15:
            deviations["saturated_liquid_density_to_373K"] = deviations["saturated_liquid_density"]
        for name, value in deviations.items():
            worst[name] = max(worst[name], abs(float(value)))
    for name, bound in IF97_VS_IAPWS95_BOUNDS.items():
        assert worst[name] <= bound, (name, worst[name])
    # IF97's saturation pressure is within 0.025 % of IAPWS-95 (the IAPWS-95 p_s
    # uncertainty entry, from memory) everywhere on this range.
    assert worst["saturation_pressure"] < 2.5e-4


def test_liquid_density_near_ambient_pressure_agrees_with_iapws95() -> None:
    # Source: iapws 1.5.5 IAPWS95 at 0.101325 MPa and 1 MPa, 273.16-373.12 K; bound
    # behind the derived IF97 "liquid_density" entry of service/core/uncertainty.py.
    temperatures = np.linspace(273.16, 373.12, 25)
    for pressure in (0.101325e6, 1.0e6):
        ours = if97_liquid_properties(temperatures, pressure)
        expected = [IAPWS95(T=float(t), P=pressure / 1e6).rho for t in temperatures]
        np.testing.assert_allclose(ours.density, expected, rtol=1.6e-5, atol=0.0)


def test_reference_state_is_the_iapws95_one() -> None:
    # Source: IAPWS R7-97(2012) Sec. 5.1 (u = 0, s = 0 for saturated liquid at the
    # triple point, as in IAPWS-95); agreement to the fit of Eq. 7.
    liquid = if97_liquid_properties(273.16, if97_saturation_pressure(273.16))
    assert abs(float(liquid.specific_internal_energy)) < 1.0e-3  # J/kg
    assert abs(float(liquid.specific_entropy)) < 1.0e-3  # J/(kg K)


def test_saturation_round_trip() -> None:
    # Source: IAPWS R7-97(2012) Sec. 8.2 (Eq. 31 is the inverse of Eq. 30).
    temperatures = np.linspace(273.15, 647.096, 200)
    back = if97_saturation_temperature(if97_saturation_pressure(temperatures))
    np.testing.assert_allclose(back, temperatures, rtol=1e-12, atol=0.0)


def test_vectorized_equals_scalar() -> None:
    # Source: none needed (internal consistency of the vectorized code).
    t = np.array([[300.0, 400.0], [500.0, 600.0]])
    p = np.array([[1.0e6, 2.0e6], [5.0e6, 20.0e6]])
    batch = if97_liquid_properties(t, p)
    assert batch.density.shape == (2, 2)
    for index in np.ndindex(t.shape):
        single = if97_liquid_properties(t[index], p[index])
        assert single.density.shape == ()
        assert float(single.density) == float(batch.density[index])
        assert float(single.specific_enthalpy) == float(batch.specific_enthalpy[index])
    vapor_batch = if97_vapor_properties(t, 1.0e3)
    for index in np.ndindex(t.shape):
        single = if97_vapor_properties(t[index], 1.0e3)
        assert float(single.specific_entropy) == float(vapor_batch.specific_entropy[index])
    np.testing.assert_array_equal(
        if97_saturation_pressure(t.ravel()),
        [float(if97_saturation_pressure(float(x))) for x in t.ravel()],
    )


def test_saturated_states_are_accepted_exactly_at_the_boundary() -> None:
    # Source: IAPWS R7-97(2012) Sec. 5 and 6 (regions 1 and 2 include p = p_sat(T)).
    pressures = np.array([1.0e3, 1.0e5, 1.0e6, 1.0e7])
    temperatures = if97_saturation_temperature(pressures)
    if97_liquid_properties(temperatures, pressures)
    if97_vapor_properties(temperatures, pressures)


@pytest.mark.parametrize(
    ("call", "variable", "fragment"),
    [
        pytest.param(
            lambda: if97_liquid_properties(650.0, 30e6),
            "temperature",
            "region 3",
            id="liquid-above-623K-region3",
        ),
        pytest.param(
            lambda: if97_liquid_properties(270.0, 1e6),
            "temperature",
            "273.15",
            id="liquid-below-273K",
        ),
        pytest.param(
            lambda: if97_liquid_properties(300.0, 1e3), "pressure", "vapor", id="liquid-below-psat"
        ),
        pytest.param(
            lambda: if97_liquid_properties(300.0, 101e6),
            "pressure",
            "100 MPa",
            id="liquid-above-100MPa",
        ),
        pytest.param(
            lambda: if97_vapor_properties(300.0, 1e4), "pressure", "liquid", id="vapor-above-psat"
        ),
        pytest.param(
            lambda: if97_vapor_properties(700.0, 50e6), "pressure", "region 3", id="vapor-above-B23"
        ),
        pytest.param(
            lambda: if97_vapor_properties(1100.0, 1e5),
            "temperature",
            "region 5",
            id="vapor-above-1073K-region5",
        ),
        pytest.param(
            lambda: if97_vapor_properties(900.0, 101e6),
            "pressure",
            "100 MPa",
            id="vapor-above-100MPa",
        ),
        pytest.param(
            lambda: if97_vapor_properties(400.0, 0.0),
            "pressure",
            "above zero",
            id="vapor-zero-pressure",
        ),
        pytest.param(
            lambda: if97_saturation_pressure(650.0),
            "temperature",
            "critical",
            id="psat-above-critical",
        ),
        pytest.param(
            lambda: if97_saturation_temperature(600.0),
            "pressure",
            "region 4",
            id="tsat-below-minimum",
        ),
        pytest.param(
            lambda: if97_saturation_temperature(23e6),
            "pressure",
            "region 4",
            id="tsat-above-critical",
        ),
    ],
)
def test_out_of_range_raises_with_region(call: object, variable: str, fragment: str) -> None:
    with pytest.raises(OutOfRangeError) as caught:
        call()  # type: ignore[operator]
    assert caught.value.variable == variable
    assert fragment in caught.value.reason


def test_out_of_range_names_first_offending_element() -> None:
    t = np.array([300.0, 350.0, 700.0, 800.0])
    with pytest.raises(OutOfRangeError) as caught:
        if97_liquid_properties(t, 10.0e6)
    assert caught.value.index == 2
    assert caught.value.value == 700.0
    assert caught.value.maximum == 623.15


def test_minimum_saturation_pressure_is_unrounded_release_value() -> None:
    # Source: IAPWS R7-97(2012) Sec. 8.2 states 611.213 Pa (rounded).
    assert pytest.approx(611.213, abs=5e-4) == IF97_SATURATION_MINIMUM_PRESSURE
    assert float(if97_saturation_temperature(IF97_SATURATION_MINIMUM_PRESSURE)) == pytest.approx(
        273.15, abs=1e-9
    )


@pytest.mark.parametrize("bad", [np.nan, np.inf, -np.inf], ids=["nan", "inf", "-inf"])
def test_non_finite_input_raises_invalid_input(bad: float) -> None:
    with pytest.raises(InvalidInputError) as caught:
        if97_liquid_properties([300.0, bad], 1.0e6)
    assert caught.value.variable == "temperature"
    with pytest.raises(InvalidInputError):
        if97_vapor_properties(400.0, [1.0e3, bad])
    with pytest.raises(InvalidInputError):
        if97_saturation_pressure(bad)
    with pytest.raises(InvalidInputError):
        if97_saturation_temperature(bad)


def test_non_numeric_and_unbroadcastable_inputs_raise_invalid_input() -> None:
    with pytest.raises(InvalidInputError):
        if97_saturation_pressure("hot")
    with pytest.raises(InvalidInputError):
        if97_liquid_properties([300.0, 310.0, 320.0], [1.0e6, 2.0e6])


def test_empty_input_gives_empty_output() -> None:
    state = if97_liquid_properties(np.array([]), np.array([]))
    assert state.density.shape == (0,)
    assert if97_saturation_temperature(np.array([])).shape == (0,)
