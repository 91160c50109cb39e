"""The neglected pressure work the simulation states is the size IAPWS-95 gives it."""

from __future__ import annotations

import re

import pytest
from iapws import IAPWS95

from service.core.simulation import Chamber, Product, Pump, VacuumChamberCase
from service.core.simulation.vacuum_chamber import simulate_vacuum_chamber


def test_stated_pressure_work_matches_iapws95_enthalpy_at_the_chamber_pressure() -> None:
    initial_pressure = 101325.0
    case = VacuumChamberCase(
        chamber=Chamber(free_volume=0.5, initial_pressure=initial_pressure, temperature=293.15),
        pump=Pump(nominal_speed=0.05),
        product=Product(mass=1.0, initial_temperature=293.15),
        end_time=30.0,
        series_points=10,
    )
    result = simulate_vacuum_chamber(case)
    statement = next(item for item in result.assumptions if "pressure work" in item)
    stated = float(re.search(r"about ([0-9.e+-]+) kJ per kg", statement).group(1)) * 1e3  # type: ignore[union-attr]
    # Independent: the iapws package's IAPWS-95, h(T, 1 atm) - h(T, p_sat(T)) at 20 degC.
    saturated = IAPWS95(T=293.15, x=0)
    compressed = IAPWS95(T=293.15, P=initial_pressure / 1e6)
    difference = (compressed.h - saturated.h) * 1e3  # J/kg
    assert difference == pytest.approx(94.0, abs=3.0)  # (1 - T beta) v (p - p_sat)
    assert stated == pytest.approx(difference, rel=0.1)
