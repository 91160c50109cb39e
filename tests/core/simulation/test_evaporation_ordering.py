"""Kinetic evaporation on README-like chamber cases: physically ordered, balanced, and at
atmospheric pressure no faster than free convection allows.

Cases (invented for the tests, after the README's examples): a 600 kg pallet of lettuce
(95 % water) on a 40 kg steel rack with a 2 kW heat leak, 22 -> 2 degC in a 12 m3 cooler;
a 40 kg rack of bread at 96 degC (38 % water) to 30 degC in a 2.5 m3 bakery cooler.

Against the equilibrium mode the ordering is checked where that mode's premise holds, a
chamber of nearly pure vapor: from atmospheric air the kinetic mode can be the faster one,
because the equilibrium mode neglects evaporation into the air before the chamber reaches
the product's vapor pressure (the kinetic answer warns `evaporation-into-air`).

Sources: the ordering is the kinetic theory of evaporation, whose flux with evaporation
coefficient alpha is alpha times the largest one, alpha = 1 (Eames, Marr and Sabir, Int. J.
Heat Mass Transfer 40 (1997) 2963, from memory); the rate at t = 0 is checked against
Churchill's sphere correlation (Incropera et al., Fundamentals of Heat and Mass Transfer,
6th ed., Wiley 2007, eq. 9.35, with its Tables A.4 and A.8; from memory) computed in
test_air_limited_evaporation; the closures are the model's own conservation laws.
"""

from __future__ import annotations

from dataclasses import replace

import numpy as np
import pytest
from free_convection_support import free_convection_evaporation_flux
from iapws import IAPWS95

from service.core.balances import Companion
from service.core.simulation import (
    Chamber,
    Condenser,
    HeatGainRate,
    Product,
    Pump,
    VacuumChamberCase,
    VacuumChamberResult,
    simulate_vacuum_chamber,
)

CLOSURE_TOLERANCE = 1e-6
"""Relative, the tolerance of tests/core/simulation/test_process_balances.py."""

INTERPOLATION_TOLERANCE = 0.01
"""K. The reference run is read between its series points by linear interpolation (200
points); the product temperature is smooth, so the interpolation error is far below this
(measured: the ordering holds with no margin at all)."""


def _lettuce() -> VacuumChamberCase:
    return VacuumChamberCase(
        chamber=Chamber(
            free_volume=12.0, initial_pressure=101325.0, temperature=295.15, leak_rate=1.0
        ),
        pump=Pump(nominal_speed=1500.0 / 3600.0, ultimate_pressure=200.0),
        condenser=Condenser(
            surface_temperature=268.15, vapor_conductance=30.0, refrigeration_capacity=150e3
        ),
        product=Product(
            mass=600.0,
            initial_temperature=295.15,
            water_fraction=0.95,
            solids_specific_heat=1500.0,
            evaporation="kinetic",
            exposed_area=70.0,
            evaporation_coefficient=0.05,
            characteristic_size=0.15,
        ),
        companions=(Companion(40.0, 477.0),),
        heat_gain=HeatGainRate(power=2000.0),
        end_time=3600.0,
        target_temperature=275.15,
    )


def _bread() -> VacuumChamberCase:
    return VacuumChamberCase(
        chamber=Chamber(
            free_volume=2.5, initial_pressure=101300.0, temperature=298.15, leak_rate=0.02
        ),
        pump=Pump(nominal_speed=300.0 / 3600.0, ultimate_pressure=200.0),
        condenser=Condenser(
            surface_temperature=248.15,
            vapor_conductance=0.4,
            ice_capacity=5.0,
            refrigeration_capacity=6000.0,
        ),
        product=Product(
            mass=40.0,
            initial_temperature=369.15,
            water_fraction=0.38,
            solids_specific_heat=1300.0,
            evaporation="kinetic",
            exposed_area=4.0,
            evaporation_coefficient=0.05,
            characteristic_size=0.12,
        ),
        companions=(Companion(25.0, 477.0),),
        end_time=1800.0,
        target_temperature=303.15,
    )


CASES = [pytest.param(_lettuce, id="lettuce-pallet"), pytest.param(_bread, id="bread-rack")]


def _with_alpha(case: VacuumChamberCase, alpha: float) -> VacuumChamberCase:
    return replace(case, product=replace(case.product, evaporation_coefficient=alpha))


def _run(case: VacuumChamberCase) -> VacuumChamberResult:
    return simulate_vacuum_chamber(case)


@pytest.mark.parametrize("build", CASES)
@pytest.mark.parametrize("alpha", [0.05, 0.005])
def test_no_kinetic_run_outpaces_the_kinetic_theory_maximum(build: object, alpha: float) -> None:
    # The same air, a slower surface: the product is never colder at the same time and
    # reaches the target no sooner than with alpha = 1, the largest flux kinetic theory
    # allows.
    case = build()  # type: ignore[operator]
    fastest = _run(_with_alpha(case, 1.0))
    slower = _run(_with_alpha(case, alpha))
    assert fastest.summary.target_time is not None
    assert slower.summary.target_time is not None
    assert slower.summary.target_time >= fastest.summary.target_time
    inside = slower.series.time <= fastest.summary.end_time
    reference = np.interp(
        slower.series.time[inside], fastest.series.time, fastest.series.product_temperature
    )
    assert np.all(slower.series.product_temperature[inside] >= reference - INTERPOLATION_TOLERANCE)


@pytest.mark.parametrize("build", CASES)
def test_rate_at_the_start_is_the_free_convection_rate(build: object) -> None:
    # At t = 0 the chamber holds dry air at 1 atm: the rate is the area times the
    # free-convection flux of Incropera's correlation, computed independently in
    # free_convection_support (5 % budget stated in test_air_limited_evaporation), not the
    # surface flux.
    case = build()  # type: ignore[operator]
    result = _run(case)
    product = case.product
    rate = float(result.series.evaporation_rate[0])
    expected = product.exposed_area * free_convection_evaporation_flux(
        product.initial_temperature, case.chamber.temperature, product.characteristic_size
    )
    assert rate == pytest.approx(expected, rel=0.05)
    # ... against the Hertz-Knudsen-Langmuir flux alone, orders of magnitude above it
    vapor_pressure = IAPWS95(T=product.initial_temperature, x=0).P * 1e6
    surface_alone = (
        product.evaporation_coefficient
        * product.exposed_area
        * vapor_pressure
        / np.sqrt(2.0 * np.pi * 461.51805 * product.initial_temperature)
    )
    assert rate < 0.05 * surface_alone
    codes = {warning.code for warning in result.warnings}
    assert "air-limited-evaporation" in codes


@pytest.mark.parametrize("build", CASES)
def test_kinetic_runs_close_their_balances(build: object) -> None:
    result = _run(build())  # type: ignore[operator]
    assert result.summary.end_reason == "target-reached"
    assert abs(result.balance.relative_mass_residual) < CLOSURE_TOLERANCE
    assert abs(result.balance.relative_energy_residual) < CLOSURE_TOLERANCE


@pytest.mark.parametrize("build", CASES)
def test_evaporation_into_the_air_before_the_flash_point_is_reported(build: object) -> None:
    # The equilibrium mode neglects evaporation into the air before the chamber reaches the
    # product's vapor pressure; the kinetic mode has it, and says how much it was.
    case = build()  # type: ignore[operator]
    kinetic = _run(case)
    equilibrium = _run(replace(case, product=replace(case.product, evaporation="equilibrium")))
    flash = equilibrium.summary.flash_time
    assert flash is not None
    before = float(np.interp(flash, equilibrium.series.time, equilibrium.series.evaporated_mass))
    assert before == pytest.approx(0.0, abs=1e-9 * case.product.mass)
    warnings = {warning.code: warning.message for warning in kinetic.warnings}
    assert "evaporation-into-air" in warnings
    assert "evaporation-into-air" not in {warning.code for warning in equilibrium.warnings}


NEAR_VAPOR_TOLERANCE = 1e-4
"""K. Largest measured shortfalls below the equilibrium run: lettuce 1.4e-7 K (alpha = 0.05)
and 4.2e-5 K (alpha = 1, the kinetic-theory maximum), bread 3.4e-7 K and 4.3e-6 K; they come
from the evaporation into the 10 Pa of air that the equilibrium mode neglects before its
flash point (and from reading the equilibrium run between its series points). The tolerance
is about twice the largest (common practice, no source)."""


def _near_pure_vapor(case: VacuumChamberCase) -> VacuumChamberCase:
    # The chamber starts as nearly pure vapor at the product's vapor pressure (IAPWS-95 via
    # iapws), with 10 Pa of air: the premise of the equilibrium mode (the product boils into
    # its own vapor) holds, so no mode may evaporate faster than it.
    saturation = IAPWS95(T=case.product.initial_temperature, x=0).P * 1e6
    chamber = replace(
        case.chamber, initial_pressure=10.0, initial_vapor_pressure=0.99995 * saturation
    )
    return replace(case, chamber=chamber)


@pytest.mark.parametrize("build", CASES)
@pytest.mark.parametrize("alpha", [1.0, 0.05])
def test_no_kinetic_run_outpaces_equilibrium_in_near_pure_vapor(
    build: object, alpha: float
) -> None:
    case = _near_pure_vapor(_with_alpha(build(), alpha))  # type: ignore[operator]
    kinetic = _run(case)
    equilibrium = _run(replace(case, product=replace(case.product, evaporation="equilibrium")))
    assert kinetic.summary.target_time is not None
    assert equilibrium.summary.target_time is not None
    inside = kinetic.series.time <= equilibrium.summary.end_time
    reference = np.interp(
        kinetic.series.time[inside], equilibrium.series.time, equilibrium.series.product_temperature
    )
    assert np.all(kinetic.series.product_temperature[inside] >= reference - NEAR_VAPOR_TOLERANCE)
    # time to target not shorter, to the integration's event location (rtol 1e-8)
    assert kinetic.summary.target_time >= equilibrium.summary.target_time * (1.0 - 1e-6)
