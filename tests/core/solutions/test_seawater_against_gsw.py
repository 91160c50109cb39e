"""Seawater freezing against TEOS-10's general-purpose library ``gsw`` (test reference only).

gsw (the Python wrapper of GSW-C, TEOS-10) evaluates the same saline Gibbs function of
IAPWS R13-08 but with the IAPWS-09 pure-water Gibbs function instead of IAPWS-95; IAPWS
states the two agree within the uncertainty of IAPWS-95 in the ocean range, so agreement is
expected to a few tens of microkelvin (and 30 uK at 120 g/kg is what was measured). gsw takes
pressure as sea pressure in dbar (absolute pressure minus 101325 Pa) and returns degC.
Freezing of air-free seawater (gsw ``saturation_fraction=0``).
"""

from __future__ import annotations

import gsw
import numpy as np
import pytest

from service.core.errors import OutOfRangeError
from service.core.solutions.seawater import (
    brine_salinity,
    seawater_enthalpy,
    seawater_freezing,
    seawater_freezing_temperature,
)

SALINITIES_G_PER_KG = np.array([0.0, 1.0, 5.0, 10.0, 20.0, 35.16504, 42.0, 60.0, 90.0, 120.0])


@pytest.mark.parametrize("sea_pressure_dbar", [0.0, 100.0, 1000.0])
def test_freezing_temperature_matches_gsw(sea_pressure_dbar: float) -> None:
    pressure = 101325.0 + sea_pressure_dbar * 1e4
    salinity = SALINITIES_G_PER_KG if sea_pressure_dbar == 0.0 else SALINITIES_G_PER_KG[:7]
    ours = seawater_freezing_temperature(salinity / 1000.0, pressure) - 273.15
    reference = gsw.t_freezing(salinity, sea_pressure_dbar, 0.0)
    assert np.max(np.abs(ours - reference)) < 1e-4


@pytest.mark.parametrize("pressure", [100.0, 611.0, 1000.0])
def test_freezing_and_brine_at_vacuum_pressures_match_gsw(pressure: float) -> None:
    # A slurry tank under vacuum: at and below the triple-point pressure (611.657 Pa) the
    # pure-water end of the freezing line lies a few 1e-5 K above 273.16 K; gsw takes the
    # negative sea pressure (absolute - 101325 Pa, in dbar).
    sea_pressure = (pressure - 101325.0) / 1e4
    salinity = SALINITIES_G_PER_KG[1:7]
    ours = seawater_freezing_temperature(salinity / 1000.0, pressure) - 273.15
    reference = gsw.t_freezing(salinity, sea_pressure, 0.0)
    assert np.max(np.abs(ours - reference)) < 1e-4
    celsius = np.array([-0.5, -2.0, -5.0])
    brine = brine_salinity(celsius + 273.15, pressure) * 1000.0
    np.testing.assert_allclose(
        brine, gsw.SA_freezing_from_t(celsius, sea_pressure, 0.0), rtol=0, atol=5e-3
    )


def test_standard_seawater_freezes_at_minus_1_92() -> None:
    # TEOS-10: air-free standard seawater at 101325 Pa freezes at -1.9191 degC (gsw above);
    # the target: within 0.05 K of the TEOS-10 value.
    value = float(seawater_freezing_temperature(0.03516504)) - 273.15
    assert value == pytest.approx(float(gsw.t_freezing(35.16504, 0.0, 0.0)), abs=0.05)
    assert value == pytest.approx(-1.919, abs=0.001)


def test_brine_salinity_matches_gsw() -> None:
    celsius = np.array([-0.1, -1.0, -2.0, -3.5, -5.0, -6.5])
    ours = brine_salinity(celsius + 273.15) * 1000.0
    reference = gsw.SA_freezing_from_t(celsius, 0.0, 0.0)
    np.testing.assert_allclose(ours, reference, rtol=0, atol=5e-3)


def test_ice_fraction_and_enthalpy_match_gsw() -> None:
    bulk = np.array([5.0, 20.0, 35.16504, 35.16504, 60.0]) / 1000.0
    celsius = np.array([-1.0, -2.0, -2.0, -4.0, -5.0])
    result = seawater_freezing(bulk, celsius + 273.15)
    brine = gsw.SA_freezing_from_t(celsius, 0.0, 0.0)
    ice_fraction = 1.0 - bulk * 1000.0 / brine
    np.testing.assert_allclose(result.ice_mass_fraction, ice_fraction, rtol=0, atol=1e-6)
    mixture = (1.0 - ice_fraction) * gsw.enthalpy_t_exact(
        brine, celsius, 0.0
    ) + ice_fraction * gsw.enthalpy_ice(celsius, 0.0)
    # IAPWS-95 against IAPWS-09 water enthalpy: a few J/kg at most near 0 degC.
    np.testing.assert_allclose(result.specific_enthalpy, mixture, rtol=0, atol=5.0)


def test_seawater_at_minus_2_has_ice() -> None:
    # The case: 35 g/kg seawater at -2 degC holds a few percent ice.
    result = seawater_freezing(0.035, 271.15)
    assert 0.02 < float(result.ice_mass_fraction) < 0.06
    warm = seawater_freezing(0.035, 275.15)
    assert float(warm.ice_mass_fraction) == 0.0
    assert float(warm.brine_salinity) == pytest.approx(0.035)


def test_liquid_enthalpy_matches_gsw() -> None:
    salinity = np.array([10.0, 35.16504, 70.0])
    celsius = np.array([5.0, 20.0, 40.0])
    ours = seawater_enthalpy(salinity / 1000.0, celsius + 273.15)
    np.testing.assert_allclose(ours, gsw.enthalpy_t_exact(salinity, celsius, 0.0), atol=5.0)


def test_ice_fraction_rises_as_temperature_falls() -> None:
    celsius = np.linspace(-1.95, -6.0, 30)
    fraction = seawater_freezing(0.035, celsius + 273.15).ice_mass_fraction
    assert np.all(np.diff(fraction) > 0.0)


def test_too_cold_for_the_release_is_refused() -> None:
    with pytest.raises(OutOfRangeError) as caught:
        seawater_freezing(0.035, 263.15)
    assert caught.value.variable == "temperature"
    with pytest.raises(OutOfRangeError) as caught:
        brine_salinity(263.15)
    assert caught.value.variable == "temperature"


def test_out_of_range_salinity_and_warm_brine_are_refused() -> None:
    with pytest.raises(OutOfRangeError) as caught:
        seawater_freezing(0.13, 271.15)
    assert caught.value.variable == "absolute_salinity"
    with pytest.raises(OutOfRangeError) as caught:
        brine_salinity(274.0)
    assert caught.value.variable == "temperature"
