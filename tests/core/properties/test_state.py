"""State at (T, p): phase map and properties against independent references."""

from __future__ import annotations

import warnings

import numpy as np
import pytest
from iapws import IAPWS95
from iapws._iapws import _Ice

from service.core.errors import InvalidInputError, OutOfRangeError, UnsupportedStateError
from service.core.properties.state import state_at

# (id, T K, p Pa, expected stable phase) -- phase diagram of water; boundaries from
# IAPWS R14-08(2011) and the saturation curve of IAPWS R6-95(2018).
PHASE_CASES = [
    ("room-liquid", 293.15, 101_325.0, "liquid"),
    ("steam-at-1-bar", 400.0, 100_000.0, "vapor"),
    ("just-below-saturation", 373.124, 101_325.0, "liquid"),  # T_sat(1 atm) = 373.124 K
    ("just-above-saturation", 373.125, 101_325.0, "vapor"),
    ("ice-at-1-atm", 263.15, 101_325.0, "ice"),
    ("frost-vapor", 253.15, 50.0, "vapor"),  # p_sub(253.15 K) is about 103 Pa
    ("ice-near-frost-line", 253.15, 150.0, "ice"),
    ("liquid-under-pressure", 268.0, 70e6, "liquid"),  # p_melt(268 K) = 61.6 MPa (R14-08 eq. 1)
    ("ice-below-melting-pressure", 268.0, 55e6, "ice"),
    ("supercritical", 700.0, 30e6, "supercritical"),
    ("hot-gas", 700.0, 10e6, "vapor"),
    ("compressed-liquid", 600.0, 30e6, "liquid"),
]


@pytest.mark.parametrize(
    ("temperature", "pressure", "phase"),
    [case[1:] for case in PHASE_CASES],
    ids=[case[0] for case in PHASE_CASES],
)
def test_stable_phase(temperature: float, pressure: float, phase: str) -> None:
    assert state_at(temperature, pressure).phase[0] == phase


def test_liquid_and_vapor_match_iapws95() -> None:
    # Source: iapws 1.5.5, class IAPWS95 (independent implementation of IAPWS-95).
    cases = [(293.15, 101_325.0), (350.0, 5e6), (500.0, 1e5), (800.0, 20e6), (300.0, 1e3)]
    temperatures = np.array([case[0] for case in cases])
    pressures = np.array([case[1] for case in cases])
    result = state_at(temperatures, pressures)
    for index, (temperature, pressure) in enumerate(cases):
        reference = IAPWS95(T=temperature, P=pressure / 1e6)
        properties = result.properties
        assert properties.density[index] == pytest.approx(reference.rho, rel=1e-9)
        assert properties.specific_enthalpy[index] == pytest.approx(reference.h * 1e3, rel=1e-9)
        assert properties.specific_entropy[index] == pytest.approx(reference.s * 1e3, rel=1e-8)
        assert properties.specific_isobaric_heat_capacity[index] == pytest.approx(
            reference.cp * 1e3, rel=1e-8
        )


def test_ice_matches_r10_06_reference() -> None:
    # Source: iapws 1.5.5, iapws._iapws._Ice (independent implementation of R10-06).
    result = state_at(253.15, 101_325.0)
    reference = _Ice(253.15, 0.101325)
    assert result.phase[0] == "ice"
    assert result.properties.density[0] == pytest.approx(reference["rho"], rel=1e-12)
    assert result.properties.specific_enthalpy[0] == pytest.approx(reference["h"] * 1e3, rel=1e-12)


def test_metastable_liquid_on_request_matches_iapws95() -> None:
    result = state_at(263.15, 101_325.0, phase="liquid")
    assert bool(result.metastable[0])
    assert [advisory.code for advisory in result.advisories] == ["metastable", "extrapolated"]
    with warnings.catch_warnings():
        # iapws warns when it extrapolates below 273.15 K; that is expected here.
        warnings.simplefilter("ignore")
        reference = IAPWS95(T=263.15, P=0.101325)
    # Source: iapws 1.5.5 IAPWS95, supercooled liquid at -10 degC, 1 atm.
    assert result.properties.density[0] == pytest.approx(reference.rho, rel=1e-8)


def test_if97_formulation_differs_within_its_consistency() -> None:
    scientific = state_at(300.0, 1e6)
    industrial = state_at(300.0, 1e6, formulation="IAPWS-IF97")
    assert industrial.sources[0].formulation == "IAPWS-IF97"
    # IF97 reproduces IAPWS-95 liquid density within about 0.001 % here (R7-97(2012) Sec. 5,
    # consistency statement; from memory) -- a loose bound is used.
    assert industrial.properties.density[0] == pytest.approx(
        scientific.properties.density[0], rel=1e-4
    )


def test_batch_equals_scalar() -> None:
    temperatures = np.array([250.0, 300.0, 450.0, 700.0])
    pressures = np.array([1e5, 2e3, 5e5, 25e6])
    batch = state_at(temperatures, pressures)
    for index in range(temperatures.size):
        single = state_at(temperatures[index], pressures[index])
        assert single.phase[0] == batch.phase[index]
        assert single.properties.density[0] == batch.properties.density[index]


@pytest.mark.parametrize(
    ("temperature", "pressure", "phase", "error"),
    [
        (20.0, 1e5, None, OutOfRangeError),
        (1500.0, 1e5, None, OutOfRangeError),
        (300.0, 0.0, None, OutOfRangeError),
        (300.0, -5.0, None, OutOfRangeError),
        (300.0, 2e8, None, OutOfRangeError),
        (float("nan"), 1e5, None, InvalidInputError),
        (280.0, 1e5, "ice", UnsupportedStateError),
        (220.0, 1e5, "liquid", UnsupportedStateError),
        (700.0, 30e6, "liquid", UnsupportedStateError),
    ],
    ids=[
        "too-cold",
        "too-hot",
        "zero-pressure",
        "negative-pressure",
        "above-100-MPa",
        "nan",
        "superheated-ice",
        "too-supercooled",
        "supercritical-as-liquid",
    ],
)
def test_errors(temperature: float, pressure: float, phase: str | None, error: type) -> None:
    with pytest.raises(error):
        state_at(temperature, pressure, phase=phase)  # type: ignore[arg-type]


@pytest.mark.parametrize(
    ("temperature", "pressure", "volume", "enthalpy", "entropy", "isobaric_heat"),
    [
        # IAPWS R7-97(2012), Table 15 (region 2 check values), third column: T = 700 K,
        # p = 30 MPa, above the critical point but below the B23 boundary (30.48 MPa).
        (700.0, 30.0e6, 0.542946619e-2, 0.263149474e7, 0.517540298e4, 0.103505092e5),
    ],
    ids=["R7-97-table15-700K-30MPa"],
)
def test_if97_state_above_the_critical_temperature_is_region_2(
    temperature: float,
    pressure: float,
    volume: float,
    enthalpy: float,
    entropy: float,
    isobaric_heat: float,
) -> None:
    result = state_at(temperature, pressure, formulation="IAPWS-IF97")
    props = result.properties
    assert result.phase[0] == "supercritical"
    assert 1.0 / float(props.density[0]) == pytest.approx(volume, rel=1e-8)
    assert float(props.specific_enthalpy[0]) == pytest.approx(enthalpy, rel=1e-8)
    assert float(props.specific_entropy[0]) == pytest.approx(entropy, rel=1e-8)
    assert float(props.specific_isobaric_heat_capacity[0]) == pytest.approx(isobaric_heat, rel=1e-8)
    # Above B23 (region 3) stays refused with a reason naming it.
    with pytest.raises(OutOfRangeError, match="region 3"):
        state_at(700.0, 50.0e6, formulation="IAPWS-IF97")


def test_ice_at_the_triple_point_is_served() -> None:
    # IAPWS R10-06(2009), Table 6: ice Ih at T = 273.16 K, p = 611.657 Pa has
    # rho = 916.709492200 kg/m3. At the triple point ice coexists with liquid and vapor.
    result = state_at(273.16, 611.657, phase="ice")
    assert float(result.properties.density[0]) == pytest.approx(916.709492200, rel=1e-9)
    # -30 degC style rounding of the temperature changes nothing.
    again = state_at(0.01 + 273.15, 611.657, phase="ice")
    assert float(again.properties.density[0]) == pytest.approx(916.709492200, rel=1e-9)
    # Above the triple-point pressure at 273.16 K ice lies above its melting curve.
    with pytest.raises(UnsupportedStateError, match="melting curve"):
        state_at(273.16, 101325.0, phase="ice")


def test_fluid_below_the_triple_point_temperature_is_flagged_as_extrapolated() -> None:
    # IAPWS-95 is fitted at and above the melting and sublimation lines (R6-95(2018),
    # range of validity); below 273.16 K a liquid or vapor state is an extrapolation.
    result = state_at(np.array([263.15, 300.0, 263.15, 273.16]), np.array([1e5, 1e5, 100.0, 1e5]))
    assert list(result.phase) == ["ice", "liquid", "vapor", "liquid"]
    flagged = [item for item in result.advisories if item.code == "extrapolated"]
    assert len(flagged) == 1 and flagged[0].indices == (2,)
    supercooled = state_at(263.15, 1e5, phase="liquid")
    assert {item.code for item in supercooled.advisories} == {"metastable", "extrapolated"}
    assert not state_at(293.15, 1e5).advisories
