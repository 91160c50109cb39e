"""Equipment checks of a chamber simulation: pump-inlet flow, vapor to the pump, trap.

The pump-inlet volume flow is S_eff(p) = S (1 - p_ult / p) (the model's pump law); the
trap's heat per kilogram captured is h_vapor(T_gas) - h_ice(T_trap), checked against the
iapws package 1.5.5 (IAPWS95 vapor, _Ice for ice Ih, IAPWS R10-06), both with the
reference state at the triple-point liquid.
"""

from __future__ import annotations

from dataclasses import replace

import pytest
from iapws import IAPWS95
from iapws._iapws import _Ice

from service.core.errors import OutOfRangeError
from service.core.simulation import (
    Chamber,
    Condenser,
    Product,
    Pump,
    VacuumChamberCase,
    simulate_vacuum_chamber,
)

TRAP = Condenser(
    surface_temperature=248.15,
    vapor_conductance=2.0,
    refrigeration_capacity=60000.0,
    ice_capacity=10.0,
)
CASE = VacuumChamberCase(
    chamber=Chamber(free_volume=6.0, initial_pressure=101325.0, temperature=298.15, leak_rate=0.05),
    pump=Pump(nominal_speed=0.5, ultimate_pressure=200.0),
    product=Product(
        mass=300.0, initial_temperature=368.15, water_fraction=0.38, solids_specific_heat=1300.0
    ),
    condenser=TRAP,
    end_time=1800.0,
    target_temperature=298.15,
)
"""Invented demo: a bakery cooler with 300 kg of bread."""


def _tolerating(tolerance: float) -> VacuumChamberCase:
    return replace(CASE, pump=replace(CASE.pump, water_vapor_tolerance=tolerance))


def test_pump_inlet_volume_flow_follows_the_pump_law() -> None:
    result = simulate_vacuum_chamber(CASE)
    checks = result.checks
    assert checks is not None
    assert checks.peak_pump_inlet_pressure == pytest.approx(101325.0)
    assert checks.peak_pump_inlet_volume_flow == pytest.approx(0.5 * (1 - 200.0 / 101325.0))
    end = result.summary.final_pressure
    assert checks.end_pump_inlet_pressure == pytest.approx(end)
    assert checks.end_pump_inlet_volume_flow == pytest.approx(0.5 * (1 - 200.0 / end))


def test_vapor_to_pump_and_trap_close_the_water_balance() -> None:
    result = simulate_vacuum_chamber(CASE)
    checks, balance = result.checks, result.balance
    assert checks is not None and checks.trap_ice is not None
    assert checks.pump_vapor_mass == balance.vapor_to_pump
    evaporated = balance.initial_water - balance.final_water
    chamber = balance.final_chamber_vapor - balance.initial_chamber_vapor
    assert checks.pump_vapor_mass + checks.trap_ice + chamber == pytest.approx(evaporated, rel=1e-6)
    assert checks.trap_ice_capacity_used == pytest.approx(checks.trap_ice / 10.0)


def test_water_vapor_tolerance_time() -> None:
    low = simulate_vacuum_chamber(_tolerating(1e-4))
    high = simulate_vacuum_chamber(_tolerating(1.0))
    assert low.checks is not None and high.checks is not None
    assert high.checks.time_above_water_vapor_tolerance == 0.0
    flash = low.summary.flash_time
    assert flash is not None
    above = low.checks.time_above_water_vapor_tolerance
    assert above is not None
    # above a tiny tolerance from (about) the flash point to the end
    assert above == pytest.approx(low.summary.end_time - flash, rel=0.05)
    assert simulate_vacuum_chamber(CASE).checks.time_above_water_vapor_tolerance is None  # type: ignore[union-attr]


def test_water_vapor_tolerance_is_validated() -> None:
    with pytest.raises(OutOfRangeError, match=r"pump\.water_vapor_tolerance"):
        simulate_vacuum_chamber(_tolerating(0.0))


def test_trap_load_capacity_and_limited_time() -> None:
    capped = simulate_vacuum_chamber(CASE).checks
    free = simulate_vacuum_chamber(
        replace(CASE, condenser=replace(TRAP, refrigeration_capacity=1.0e7))
    ).checks
    unstated = simulate_vacuum_chamber(
        replace(CASE, condenser=replace(TRAP, refrigeration_capacity=None))
    ).checks
    bare = simulate_vacuum_chamber(replace(CASE, condenser=None)).checks
    assert capped is not None and free is not None and unstated is not None and bare is not None
    assert capped.peak_trap_load == pytest.approx(60000.0)
    assert capped.trap_limited_time is not None and capped.trap_limited_time > 60.0
    assert free.trap_limited_time == 0.0 and unstated.trap_limited_time == 0.0
    assert free.peak_trap_load is not None and free.peak_trap_load > 60000.0
    assert bare.peak_trap_load is None and bare.trap_limited_time is None
    assert bare.trap_ice is None


def test_trap_heat_per_kilogram_matches_iapws_package() -> None:
    result = simulate_vacuum_chamber(
        replace(CASE, condenser=replace(TRAP, refrigeration_capacity=None))
    )
    summary = result.summary
    per_kg = summary.condenser_energy / summary.vapor_to_condenser
    vapor = IAPWS95(T=298.15, P=100.0e-6).h * 1e3  # J/kg, dilute vapor at 100 Pa
    ice = _Ice(248.15, 100.0e-6)["h"] * 1e3
    assert per_kg == pytest.approx(vapor - ice, rel=1e-4)
