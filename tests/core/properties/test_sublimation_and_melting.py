"""Ice - vapor and ice - liquid equilibrium states and their latent heats.

Ice from IAPWS R10-06(2009), curves from IAPWS R14-08(2011), fluid from
IAPWS-95 through ``service.core.properties.helmholtz.fluid_properties_at``.
"""

from __future__ import annotations

import warnings
from typing import Any

import numpy as np
import pytest
from iapws import IAPWS95
from iapws._iapws import _Ice

from service.core.errors import InvalidInputError, OutOfRangeError
from service.core.properties.constants import SPECIFIC_GAS_CONSTANT
from service.core.properties.melting import (
    MeltingStates,
    melting_by_pressure,
    melting_by_temperature,
)
from service.core.properties.phase import PhaseProperties
from service.core.properties.phase_lines import (
    melting_pressure,
    melting_temperature,
    sublimation_pressure,
    sublimation_temperature,
)
from service.core.properties.sublimation import (
    SublimationStates,
    sublimation_by_pressure,
    sublimation_by_temperature,
)

IAPWS_PACKAGE = "iapws 1.5.5 IAPWS95 class and _Ice"


def _iapws_fluid(temperature: float, pressure_mpa: float) -> Any:
    """iapws 1.5.5 IAPWS95 state; below 273.15 K it flags its states as extrapolated
    with a UserWarning, which is expected here and silenced for that call only."""
    with warnings.catch_warnings():
        warnings.filterwarnings("ignore", message="Using extrapolated values", category=UserWarning)
        return IAPWS95(T=temperature, P=pressure_mpa)


def _gibbs(phase: PhaseProperties) -> np.ndarray[Any, np.dtype[np.float64]]:
    return np.asarray(
        phase.specific_enthalpy - phase.temperature * phase.specific_entropy, dtype=np.float64
    )


# --- latent heats -------------------------------------------------------------------------


def test_latent_heat_of_fusion_at_triple_point_from_r10_06_table_6() -> None:
    """L = T_t (s_liquid - s_ice) at the triple point, where the Gibbs energies are equal.

    s_ice = -1220.69433940 J/(kg K) at (273.16 K, 611.657 Pa): IAPWS R10-06(2009)
    Table 6; s_liquid = 0 there by the IAPWS-95 reference state (IAPWS R6-95(2018)).
    Hence L = 273.16 K * 1220.69433940 J/(kg K) = 333444.866 J/kg (about 333.4 kJ/kg).
    """
    expected = 273.16 * 1220.69433940
    states = melting_by_temperature(273.16)
    assert float(states.latent_heat_of_fusion) == pytest.approx(expected, abs=0.01)
    assert float(states.pressure) == pytest.approx(611.657, rel=1e-15)


def test_latent_heat_of_sublimation_at_triple_point_from_memory() -> None:
    """About 2834.4 kJ/kg at the triple point (from memory: the value quoted with the
    IAPWS-95 / IAPWS-06 pair); tolerance 1 kJ/kg."""
    states = sublimation_by_temperature(273.16)
    assert float(states.latent_heat_of_sublimation) == pytest.approx(2834.4e3, abs=1.0e3)


def test_latent_heat_of_fusion_at_normal_melting_point_common_practice() -> None:
    """About 333.6 kJ/kg at 0 degC and atmospheric pressure (common practice, no source);
    tolerance 0.5 kJ/kg. IAPWS-95 with R10-06 gives about 333.43 kJ/kg at 101325 Pa."""
    states = melting_by_pressure(101325.0)
    assert float(states.latent_heat_of_fusion) == pytest.approx(333.6e3, abs=0.5e3)


@pytest.mark.parametrize("temperature", [273.16, 260.0, 250.0], ids=["273.16K", "260K", "250K"])
def test_latent_heat_of_sublimation_agrees_with_iapws_package(temperature: float) -> None:
    """iapws 1.5.5: IAPWS95(T, P) vapor minus _Ice(T, P), at the same R14-08 pressure."""
    states = sublimation_by_temperature(temperature)
    pressure_mpa = float(states.pressure) * 1e-6
    vapor = _iapws_fluid(temperature, pressure_mpa)
    expected = (vapor.h - _Ice(temperature, pressure_mpa)["h"]) * 1e3
    assert float(states.latent_heat_of_sublimation) == pytest.approx(expected, rel=1e-9), (
        IAPWS_PACKAGE
    )
    assert float(states.vapor.density) == pytest.approx(vapor.rho, rel=1e-9), IAPWS_PACKAGE


@pytest.mark.parametrize(
    "temperature", [273.152519, 273.15, 265.0], ids=["273.152519K", "273.15K", "265K"]
)
def test_latent_heat_of_fusion_agrees_with_iapws_package(temperature: float) -> None:
    """iapws 1.5.5: IAPWS95(T, P) liquid minus _Ice(T, P), at the same R14-08 pressure.

    Not at exactly 273.16 K: there p_melt = 611.657 Pa lies 2 mPa above the IAPWS-95
    saturation pressure and the iapws package's phase selection returns vapor."""
    states = melting_by_temperature(temperature)
    pressure_mpa = float(states.pressure) * 1e-6
    liquid = _iapws_fluid(temperature, pressure_mpa)
    expected = (liquid.h - _Ice(temperature, pressure_mpa)["h"]) * 1e3
    assert float(states.latent_heat_of_fusion) == pytest.approx(expected, rel=1e-9), IAPWS_PACKAGE
    assert float(states.liquid.density) == pytest.approx(liquid.rho, rel=1e-9), IAPWS_PACKAGE


# --- phase-equilibrium consistency --------------------------------------------------------


def test_sublimation_curve_is_an_equilibrium_of_the_two_formulations() -> None:
    """R14-08(2011) eq. (6) was fitted to the IAPWS-95 / R10-06 phase equilibrium
    (Wagner et al., J. Phys. Chem. Ref. Data 40, 043103 (2011)), so the Gibbs energies
    of ice and vapor agree on it. The mismatch, as the implied relative pressure error
    dg / (R T), measured at most 7e-5 above 200 K, 2.3e-4 above 100 K and 1.4e-3 at
    50 K (where the vapor is an IAPWS-95 extrapolation); bounds have a margin."""
    temperature = np.linspace(50.0, 273.16, 400)
    states = sublimation_by_temperature(temperature)
    implied = (_gibbs(states.vapor) - _gibbs(states.ice)) / (SPECIFIC_GAS_CONSTANT * temperature)
    assert np.max(np.abs(implied[temperature >= 200.0])) < 1e-4
    assert np.max(np.abs(implied[temperature >= 100.0])) < 5e-4
    assert np.max(np.abs(implied)) < 3e-3


def test_melting_curve_is_an_equilibrium_of_the_two_formulations() -> None:
    """As above for eq. (1): the Gibbs mismatch, as an implied pressure error
    dg / (v_liquid - v_ice), measured at most 3.5 kPa (2e-5 relative above 1 MPa)."""
    temperature = np.linspace(251.165, 273.16, 400)
    states = melting_by_temperature(temperature)
    volume_change = 1.0 / states.liquid.density - 1.0 / states.ice.density
    implied = (_gibbs(states.liquid) - _gibbs(states.ice)) / volume_change
    assert np.max(np.abs(implied)) < 1.0e4
    high = states.pressure > 1e6
    assert np.max(np.abs(implied[high] / states.pressure[high])) < 1e-4


@pytest.mark.parametrize("temperature", [100.0, 150.0, 200.0, 250.0, 273.16])
def test_sublimation_curve_obeys_clausius_clapeyron(temperature: float) -> None:
    """dp/dT of eq. (6) equals L / (T dv) within the fit's consistency (measured 4e-5)."""
    step = 1e-4
    upper = min(temperature + step, 273.16)
    lower = temperature - step
    slope = float(sublimation_pressure(upper) - sublimation_pressure(lower)) / (upper - lower)
    states = sublimation_by_temperature(temperature)
    volume_change = 1.0 / states.vapor.density - 1.0 / states.ice.density
    clapeyron = float(states.latent_heat_of_sublimation / (temperature * volume_change))
    assert slope == pytest.approx(clapeyron, rel=2e-4)


@pytest.mark.parametrize("temperature", [252.0, 260.0, 270.0, 273.16])
def test_melting_curve_obeys_clausius_clapeyron(temperature: float) -> None:
    """dp/dT of eq. (1) equals L / (T dv) within the fit's consistency (measured 1.2e-4)."""
    step = 1e-4
    upper = min(temperature + step, 273.16)
    lower = temperature - step
    slope = float(melting_pressure(upper) - melting_pressure(lower)) / (upper - lower)
    states = melting_by_temperature(temperature)
    volume_change = 1.0 / states.liquid.density - 1.0 / states.ice.density
    clapeyron = float(states.latent_heat_of_fusion / (temperature * volume_change))
    assert slope == pytest.approx(clapeyron, rel=5e-4)


# --- structure, round trips, shapes --------------------------------------------------------


def test_states_by_pressure_match_states_by_temperature() -> None:
    pressures = np.geomspace(1e-30, 611.657, 50)
    by_pressure = sublimation_by_pressure(pressures)
    np.testing.assert_allclose(by_pressure.temperature, sublimation_temperature(pressures))
    by_temperature = sublimation_by_temperature(by_pressure.temperature)
    np.testing.assert_allclose(
        by_temperature.latent_heat_of_sublimation,
        by_pressure.latent_heat_of_sublimation,
        rtol=1e-10,
    )
    melting_pressures = np.geomspace(611.657, 200e6, 50)
    melting = melting_by_pressure(melting_pressures)
    np.testing.assert_allclose(melting.temperature, melting_temperature(melting_pressures))
    np.testing.assert_array_equal(melting.pressure, melting_pressures)


def test_composed_results_keep_shape_and_types() -> None:
    temperature = np.linspace(200.0, 270.0, 6).reshape(3, 2)
    sublimation = sublimation_by_temperature(temperature)
    assert isinstance(sublimation, SublimationStates)
    assert sublimation.vapor.density.shape == (3, 2)
    assert sublimation.ice.density.shape == (3, 2)
    assert sublimation.latent_heat_of_sublimation.shape == (3, 2)
    melting = melting_by_temperature(np.full((2, 2), 260.0))
    assert isinstance(melting, MeltingStates)
    assert melting.latent_heat_of_fusion.shape == (2, 2)
    assert np.all(melting.liquid.density > melting.ice.density)


def test_vapor_at_50_kelvin_is_fast_and_ideal() -> None:
    """At 50 K (1.9e-40 Pa) the vapor is an ideal gas: rho = p / (R T) to round-off."""
    temperature = np.linspace(50.0, 60.0, 1000)
    states = sublimation_by_temperature(temperature)
    ideal = states.pressure / (SPECIFIC_GAS_CONSTANT * temperature)
    np.testing.assert_allclose(states.vapor.density, ideal, rtol=1e-12)
    assert np.all(states.latent_heat_of_sublimation > 2.6e6)


# --- errors --------------------------------------------------------------------------------


@pytest.mark.parametrize(
    ("function", "value", "variable"),
    [
        pytest.param(sublimation_by_temperature, 49.0, "temperature", id="sublimation-too-cold"),
        pytest.param(sublimation_by_temperature, 274.0, "temperature", id="sublimation-too-warm"),
        pytest.param(sublimation_by_pressure, 700.0, "pressure", id="sublimation-too-high"),
        pytest.param(melting_by_temperature, 250.0, "temperature", id="melting-too-cold"),
        pytest.param(melting_by_pressure, 300e6, "pressure", id="melting-too-high"),
        pytest.param(melting_by_pressure, 100.0, "pressure", id="melting-too-low"),
    ],
)
def test_out_of_range(function: Any, value: float, variable: str) -> None:
    with pytest.raises(OutOfRangeError) as caught:
        function(value)
    assert caught.value.variable == variable
    assert caught.value.value == value


@pytest.mark.parametrize(
    "function",
    [
        sublimation_by_temperature,
        sublimation_by_pressure,
        melting_by_temperature,
        melting_by_pressure,
    ],
)
def test_non_finite_input(function: Any) -> None:
    with pytest.raises(InvalidInputError):
        function([float("nan")])
