"""Primary drying over a recipe: ice balance, drying time, events, errors.

Checks: the ice mass the integration carries against the integral of the reported
sublimation rate (mass conservation); the drying time at constant settings against the
integral t = (m_0 / L_0) * integral of dl / m_dot(l), derived here with scipy's quad and
brentq; the published sensitivity of the drying time to the product temperature (about 13 %
shorter per degree warmer: X. Tang, M. J. Pikal, Pharm. Res. 21(2), 191-200 (2004), and
M. J. Pikal, J. Parenter. Sci. Technol. 39(3), 115-139 (1985); the figure recalled
"from memory").
"""

from __future__ import annotations

import dataclasses
import time

import numpy as np
import pytest
from scipy.integrate import quad, simpson
from scipy.optimize import brentq

from service.core.deadline import DeadlineExceededError, computation_deadline
from service.core.drying import (
    DriedLayerResistance,
    DryingLoad,
    EquipmentLimit,
    PrimaryDryingCase,
    Recipe,
    VialHeatTransfer,
    simulate_primary_drying,
)
from service.core.errors import InvalidInputError, OutOfRangeError
from service.core.properties.phase_lines import sublimation_pressure, sublimation_temperature
from service.core.properties.sublimation import sublimation_by_temperature

# Invented demo batch: 500 tubing vials, 3 mL of a 5 % sucrose-like solution each.
HEAT = VialHeatTransfer(contact=11.5, gas_conduction=0.28, gas_conduction_saturation=0.0035)
RESISTANCE = DriedLayerResistance(6.7e4, 7.7e7, 30.0)
LOAD = DryingLoad(
    container_count=500,
    heat_transfer_area=3.8e-4,
    product_area=3.1e-4,
    fill_mass=3.0e-3,
    solution_density=1000.0,
    solids_fraction=0.05,
    frozen_conductivity=2.4,
)


def _constant(shelf: float, pressure: float, **changes: object) -> PrimaryDryingCase:
    recipe = Recipe(np.array([0.0]), np.array([shelf]), np.array([pressure]))
    case = PrimaryDryingCase(LOAD, HEAT, RESISTANCE, recipe, critical_temperature=200.0)
    return dataclasses.replace(case, **changes)  # type: ignore[arg-type]


def _ramped() -> PrimaryDryingCase:
    """-40 degC shelf, ramp to -10 degC over 1 h, hold; a step from 8 Pa to 12 Pa at 10 h."""
    hour = 3600.0
    recipe = Recipe(
        np.array([0.0, hour, 10 * hour, 10 * hour]),
        np.array([233.15, 263.15, 263.15, 263.15]),
        np.array([8.0, 8.0, 8.0, 12.0]),
    )
    return PrimaryDryingCase(
        LOAD,
        HEAT,
        RESISTANCE,
        recipe,
        critical_temperature=243.15,
        condenser_capacity=1.0,
        equipment_limit=EquipmentLimit(np.array([1.0, 50.0]), np.array([1.0e-5, 5.0e-4])),
        series_points=2001,
    )


def test_ice_mass_is_conserved_over_the_run() -> None:
    """Initial ice = remaining + integral of the batch sublimation rate: the core's
    Gauss-Legendre balance to 1e-8 relative, and Simpson's rule over the reported series
    (2001 points plus events) to 1e-5."""
    result = simulate_primary_drying(_ramped())
    balance = result.balance
    assert balance.initial_ice == pytest.approx(500 * 3.0e-3 * 0.95, rel=1e-15)
    assert abs(balance.relative_residual) < 1e-8
    series = result.series
    integral = simpson(series.batch_sublimation_rate, x=series.time)
    assert integral == pytest.approx(balance.initial_ice - balance.remaining_ice, rel=1e-5)
    # the series' own ice: what is left plus what went to the condenser
    np.testing.assert_allclose(
        500 * series.ice_mass + series.condenser_ice, balance.initial_ice, rtol=1e-12
    )
    assert result.summary.end_reason == "dry"
    assert balance.remaining_ice == 0.0


def _independent_drying_time(shelf: float, pressure: float) -> float:
    """t = (m_0 / L_0) * integral over l from 0 to L_0 of dl / m_dot(l), with m_dot from the
    front balance solved here by brentq (core R14-08 pressure, core R10-06 / IAPWS-95
    latent heat evaluated exactly, not from the table)."""
    depth = 3.0e-3 / (1000.0 * 3.1e-4)
    ice = 3.0e-3 * 0.95
    kv = 11.5 + 0.28 * pressure / (1.0 + 0.0035 * pressure)

    def rate(dried: float) -> float:
        rp = 6.7e4 + 7.7e7 * dried / (1.0 + 30.0 * dried)
        frozen = depth - dried
        conductance = 1.0 / (1.0 / (3.8e-4 * kv) + frozen / (3.1e-4 * 2.4))

        def residual(front: float) -> float:
            latent = float(sublimation_by_temperature(front).latent_heat_of_sublimation)
            flow = 3.1e-4 * (float(sublimation_pressure(front)) - pressure) / rp
            return conductance * (shelf - front) - latent * flow

        low = float(sublimation_temperature(pressure))
        front = brentq(residual, low, min(shelf, 273.16), xtol=1e-10)
        return float(3.1e-4 * (float(sublimation_pressure(front)) - pressure) / rp)

    integral, _ = quad(lambda dried: 1.0 / rate(dried), 0.0, depth, epsabs=0.0, epsrel=1e-10)
    return float(ice / depth * integral)


@pytest.mark.parametrize(
    ("shelf", "pressure"), [(263.15, 10.0), (248.15, 5.0)], ids=["-10C-10Pa", "-25C-5Pa"]
)
def test_drying_time_at_constant_settings_matches_independent_integral(
    shelf: float, pressure: float
) -> None:
    result = simulate_primary_drying(_constant(shelf, pressure))
    expected = _independent_drying_time(shelf, pressure)
    assert result.summary.drying_time == pytest.approx(expected, rel=1e-6)


def test_drying_time_falls_about_13_percent_per_degree_of_product_temperature() -> None:
    """Published figure, from memory: each 1 degC rise of the product temperature in
    primary drying shortens it by about 13 % (Tang & Pikal 2004, Pharm. Res. 21(2) 191-200;
    Pikal 1985). Here, at 13.33 Pa (100 mTorr) and front temperatures near -30 to -25 degC,
    two shelf temperatures 5 K apart; the shortening per kelvin of the time-averaged front
    temperature must lie within 10 % to 16 %."""
    runs = []
    for shelf in (253.15, 258.15):
        result = simulate_primary_drying(
            _constant(shelf, 13.33, load=dataclasses.replace(LOAD, container_count=1))
        )
        series = result.series
        mean_front = np.trapezoid(series.front_temperature, series.time) / series.time[-1]
        assert result.summary.drying_time is not None
        runs.append((result.summary.drying_time, mean_front))
    (cold_time, cold_front), (warm_time, warm_front) = runs
    per_kelvin = 1.0 - np.exp(np.log(warm_time / cold_time) / (warm_front - cold_front))
    assert 0.10 < per_kelvin < 0.16


def test_events_of_a_ramped_recipe() -> None:
    result = simulate_primary_drying(_ramped())
    names = [event.name for event in result.events]
    assert "critical-temperature-exceeded" in names
    assert "condenser-capacity-reached" in names
    assert names[-1] == "primary-drying-ends"
    times = [event.time for event in result.events]
    assert times == sorted(times)
    crossing = next(e for e in result.events if e.name == "critical-temperature-exceeded")
    assert float(crossing.state.front_temperature[0]) == pytest.approx(243.15, abs=1e-5)
    full = next(e for e in result.events if e.name == "condenser-capacity-reached")
    assert float(full.state.condenser_ice[0]) == pytest.approx(1.0, rel=1e-6)
    assert result.summary.drying_time == result.summary.end_time
    assert result.summary.critical_temperature_first_exceeded == crossing.time
    # the pressure step at 10 h appears in the series
    assert 36000.0 in set(result.series.time.tolist())


def test_equipment_limit_event() -> None:
    """A dryer that takes only 1.8e-5 kg/s (a choked duct) is overrun at the start (the
    batch sublimes about 2.3e-5 kg/s) and back within it once the cake has grown."""
    limit = EquipmentLimit(np.array([5.0, 20.0]), np.array([1.8e-5, 1.8e-5]))
    result = simulate_primary_drying(_constant(263.15, 10.0, equipment_limit=limit))
    event = next(e for e in result.events if e.name == "equipment-limit-exceeded")
    assert event.time == 0.0
    back = next(e for e in result.events if e.name == "back-within-equipment-limit")
    assert float(back.state.batch_sublimation_rate[0]) == pytest.approx(1.8e-5, rel=1e-6)


def test_run_stops_at_the_maximum_duration_with_ice_left() -> None:
    result = simulate_primary_drying(_constant(248.15, 5.0, maximum_duration=3600.0))
    assert result.summary.end_reason == "maximum-duration"
    assert result.summary.drying_time is None
    assert result.events[-1].name == "maximum-duration-reached"
    assert result.balance.remaining_ice > 0.0


_TWO_POINTS = np.array([0.0, 60.0])
_SHORT_RECIPES = {
    "pressure-above-ice-vapor-pressure": Recipe(
        _TWO_POINTS, np.array([233.15, 238.15]), np.array([25.0, 25.0])
    ),
    "recipe-not-at-zero": Recipe(np.array([5.0]), np.array([263.15]), np.array([10.0])),
}


@pytest.mark.parametrize(
    ("changes", "field"),
    [
        ({"load": dataclasses.replace(LOAD, solids_fraction=1.0)}, "load.solids_fraction"),
        ({"load": dataclasses.replace(LOAD, fill_mass=0.0)}, "load.fill_mass"),
        (
            {"recipe": _SHORT_RECIPES["pressure-above-ice-vapor-pressure"]},
            "recipe[0].chamber_pressure",
        ),
        ({"recipe": _SHORT_RECIPES["recipe-not-at-zero"]}, "recipe[0].time"),
        ({"critical_temperature": 280.0}, "critical_temperature"),
        (
            {"resistance": DriedLayerResistance(0.0, 1.0, 0.0)},
            "dried_layer_resistance.at_zero_thickness",
        ),
        ({"heat_transfer": VialHeatTransfer(-1.0, 0.1, 0.0)}, "vial_heat_transfer.contact"),
        (
            {"equipment_limit": EquipmentLimit(np.array([20.0, 30.0]), np.array([1.0, 1.0]))},
            "equipment_limit",
        ),
    ],
    ids=[
        "no-ice",
        "empty-fill",
        "pressure-above-ice-vapor-pressure",
        "recipe-not-at-zero",
        "critical-above-melting",
        "zero-resistance",
        "negative-kv",
        "limit-does-not-cover-pressure",
    ],
)
def test_inputs_outside_the_model_name_the_field(changes: dict[str, object], field: str) -> None:
    with pytest.raises(OutOfRangeError) as raised:
        simulate_primary_drying(_constant(263.15, 10.0, **changes))
    assert raised.value.variable == field


def test_equipment_limit_points_must_increase() -> None:
    limit = EquipmentLimit(np.array([20.0, 5.0]), np.array([1.0, 1.0]))
    with pytest.raises(InvalidInputError, match="increasing"):
        simulate_primary_drying(_constant(263.15, 10.0, equipment_limit=limit))


def test_a_run_stops_at_the_callers_deadline() -> None:
    # The time limit of a request (service.core.deadline) stops the integration itself.
    with computation_deadline(0.0), pytest.raises(DeadlineExceededError):
        time.sleep(0.001)
        simulate_primary_drying(_ramped())
    with computation_deadline(60.0):  # a deadline not reached: the run completes
        assert simulate_primary_drying(_ramped()).summary.solver_steps > 0
