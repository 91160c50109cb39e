"""The simulated process against the flash-freeze balance, its own mass and energy
closure, a stiff case, the condenser's heat against iapws, and input validation.

Sources: the flash-freeze balance (service.core.balances.flash_freeze, itself checked
against iapws 1.5.5 in tests/core/balances); iapws 1.5.5 (IAPWS95 class, _Ice) for the
condenser's heat per kilogram; the model's own conservation laws for the closures.
"""

from __future__ import annotations

import warnings

import numpy as np
import pytest
from iapws import IAPWS95
from iapws._iapws import _Ice

from service.core.balances import Companion, FlashFreezeCase, flash_freeze, named_solute
from service.core.errors import InvalidInputError, OutOfRangeError, UnsupportedStateError
from service.core.simulation import (
    Chamber,
    Condenser,
    HeatGainRate,
    Product,
    Pump,
    ScheduleLimit,
    VacuumChamberCase,
    simulate_vacuum_chamber,
)
from service.core.simulation.condenser import CondenserCapture

FLASH_FREEZE_TOLERANCE = 5e-5
"""Relative. The simulation neglects the condensed phases' pressure work V dp that the
balance counts: about v_liquid (p_start - p_triple), 1.7 J per kg of water from 20 degC
(4e-6 of the evaporated mass) and 19 J per kg from 60 degC (3.2e-5)."""

CLOSURE_TOLERANCE = 1e-6
"""Relative, as the issue asks; the closures are in fact at round-off."""


def _chamber(volume: float = 0.5) -> Chamber:
    return Chamber(free_volume=volume, initial_pressure=101325.0, temperature=293.15)


@pytest.mark.parametrize(
    ("evaporation", "initial"),
    [("equilibrium", 293.15), ("equilibrium", 333.15), ("kinetic", 293.15)],
    ids=["equilibrium-20C", "equilibrium-60C", "kinetic-alpha-1"],
)
def test_large_pump_evaporates_the_flash_freeze_fraction(evaporation: str, initial: float) -> None:
    # Pure water, adiabatic: at "fully frozen" the evaporated fraction equals the
    # flash-freeze balance (service.core.balances.flash_freeze), whatever the rate.
    product = Product(
        mass=1.0,
        initial_temperature=initial,
        evaporation=evaporation,  # type: ignore[arg-type]
        exposed_area=0.05 if evaporation == "kinetic" else None,
        evaporation_coefficient=1.0 if evaporation == "kinetic" else None,
    )
    result = simulate_vacuum_chamber(
        VacuumChamberCase(
            chamber=_chamber(),
            pump=Pump(nominal_speed=50.0),
            product=product,
            end_time=3600.0,
        )
    )
    frozen = next(event for event in result.events if event.name == "fully-frozen")
    balance = flash_freeze(FlashFreezeCase(initial_temperature=initial))
    expected = float(balance.evaporated_fraction_of_water)
    # the vapor left in the chamber at that moment is part of what the product lost
    assert float(frozen.state.evaporated_mass[0]) == pytest.approx(
        expected, rel=FLASH_FREEZE_TOLERANCE
    )
    assert float(frozen.state.ice_fraction[0]) == pytest.approx(
        1.0 - expected, rel=FLASH_FREEZE_TOLERANCE
    )


def test_solution_matches_flash_freeze_at_the_same_end_temperature() -> None:
    # Sucrose solution, 10 % of water + solute, to 263.15 K: flash-freeze balance with the
    # same solute (its specific heat as the solids'), source service.core.balances.
    water, fraction = 1.0, 0.10
    solute = named_solute("sucrose", fraction, "ideal")
    solute_mass = fraction / (1.0 - fraction) * water
    balance = flash_freeze(
        FlashFreezeCase(initial_temperature=293.15, final_ice_temperature=263.15, solute=solute)
    )
    result = simulate_vacuum_chamber(
        VacuumChamberCase(
            chamber=_chamber(),
            pump=Pump(nominal_speed=50.0),
            product=Product(
                mass=water + solute_mass,
                initial_temperature=293.15,
                water_fraction=water / (water + solute_mass),
                solids_specific_heat=float(solute.specific_heat),  # type: ignore[arg-type]
                solute=solute,
            ),
            end_time=3600.0,
            target_temperature=263.15,
        )
    )
    assert result.summary.end_reason == "target-reached"
    assert result.summary.evaporated_mass == pytest.approx(float(balance.evaporated_mass), rel=1e-4)
    assert result.summary.ice_mass == pytest.approx(float(balance.ice_mass), rel=1e-4)


@pytest.mark.parametrize(
    "size", [None, 0.02, 1.0], ids=["air-limited-default-size", "air-limited-2cm", "air-limited-1m"]
)
def test_mass_and_energy_close_with_condenser_heat_gain_and_leak(size: float | None) -> None:
    # Conservation: water + chamber vapor + pumped + condensed; E0 + Q = E + H_vapor. The
    # kinetic mode evaporates through the chamber air (air-limited flux), for several sizes.
    result = simulate_vacuum_chamber(
        VacuumChamberCase(
            chamber=Chamber(
                free_volume=1.0, initial_pressure=101325.0, temperature=293.15, leak_rate=0.5
            ),
            pump=Pump(nominal_speed=0.05, ultimate_pressure=20.0),
            condenser=Condenser(
                surface_temperature=233.15,
                vapor_conductance=0.3,
                ice_capacity=0.05,
                refrigeration_capacity=500.0,
            ),
            product=Product(
                mass=3.0,
                initial_temperature=303.15,
                water_fraction=0.8,
                solids_specific_heat=1500.0,
                evaporation="kinetic",
                exposed_area=0.3,
                evaporation_coefficient=0.01,
                characteristic_size=size,
            ),
            companions=(Companion(2.0, 477.0),),
            heat_gain=HeatGainRate(power=10.0, conductance=1.0),
            end_time=3600.0,
        )
    )
    balance = result.balance
    assert abs(balance.relative_mass_residual) < CLOSURE_TOLERANCE
    assert abs(balance.relative_energy_residual) < CLOSURE_TOLERANCE
    assert balance.vapor_to_condenser > 0.05  # capacity exceeded: event and warning
    names = [event.name for event in result.events]
    assert "condenser-capacity-exceeded" in names
    assert "condenser-capacity-exceeded" in {warning.code for warning in result.warnings}
    # condenser load never above the refrigeration capacity (model cap)
    assert float(result.series.condenser_load.max()) <= 500.0 * (1 + 1e-12)


def test_stiff_small_chamber_large_pump_finishes() -> None:
    # 10 L chamber, 5 m3/s pump: time constant 2 ms against a one-hour run.
    result = simulate_vacuum_chamber(
        VacuumChamberCase(
            chamber=_chamber(volume=0.01),
            pump=Pump(nominal_speed=5.0, ultimate_pressure=1.0),
            product=Product(mass=0.2, initial_temperature=293.15),
            end_time=3600.0,
        )
    )
    assert result.summary.end_time == pytest.approx(3600.0)
    names = [event.name for event in result.events]
    assert names[:3] == ["flash-point", "freezing-starts", "fully-frozen"]
    assert abs(result.balance.relative_energy_residual) < CLOSURE_TOLERANCE
    # ice cools until its sublimation pressure meets the pump's ultimate pressure:
    # 1 Pa at about 212.6 K (IAPWS R14-08 sublimation curve; iapws 1.5.5 _Sublimation_Pressure)
    assert result.summary.final_temperature == pytest.approx(212.6, abs=0.2)


def test_events_are_ordered_and_schedule_checked() -> None:
    result = simulate_vacuum_chamber(
        VacuumChamberCase(
            chamber=_chamber(),
            pump=Pump(nominal_speed=0.05, ultimate_pressure=10.0),
            product=Product(mass=1.0, initial_temperature=293.15),
            end_time=1800.0,
            target_temperature=263.15,
            schedule=(ScheduleLimit(60.0, 290.0), ScheduleLimit(100.0, 274.0)),
        )
    )
    times = [event.time for event in result.events]
    assert times == sorted(times)
    for check in result.schedule:
        assert check.product_temperature is not None
        assert check.met == (check.product_temperature <= check.temperature_limit)
    # 100 s after the start the water is still cooling towards the triple point
    assert result.schedule[1].met is False
    assert result.summary.schedule_met is False
    assert "schedule-limit-missed" in [event.name for event in result.events]
    # evaporated mass never decreases in an adiabatic run; ice grows until fully frozen
    # (then it sublimes); ice + evaporated never exceed the initial water (1 kg)
    series = result.series
    assert np.all(np.diff(series.evaporated_mass) >= -1e-12)
    frozen = result.summary.fully_frozen_time
    assert frozen is not None
    growing = series.time <= frozen
    assert np.all(np.diff(series.ice_fraction[growing]) >= -1e-12)
    assert np.all(series.ice_fraction + series.evaporated_mass <= 1.0 + 1e-12)


def test_condenser_heat_per_kilogram_matches_iapws() -> None:
    # h_vapor(293.15 K, 100 Pa) - h_ice(233.15 K, p_sub): iapws 1.5.5 IAPWS95 class and
    # _Ice (R10-06), both with the IAPWS reference state.
    from service.core.properties.helmholtz import fluid_properties_at

    vapor = float(fluid_properties_at(293.15, 100.0, phase="vapor").specific_enthalpy)
    capture = CondenserCapture(Condenser(233.15, 1.0), 293.15, vapor)
    reference_vapor = IAPWS95(T=293.15, P=100e-6).h * 1e3
    with warnings.catch_warnings():
        # iapws warns "metastable ice" at the sublimation pressure itself (rounding)
        warnings.simplefilter("ignore", UserWarning)
        reference_ice = _Ice(233.15, capture.surface_pressure * 1e-6)["h"] * 1e3
    assert capture.heat_per_mass == pytest.approx(reference_vapor - reference_ice, rel=1e-6)


@pytest.mark.parametrize(
    ("change", "error", "field"),
    [
        (
            {"chamber": Chamber(free_volume=0.0, initial_pressure=1e5, temperature=293.15)},
            OutOfRangeError,
            "chamber.free_volume",
        ),
        (
            {"pump": Pump(nominal_speed=0.05, ultimate_pressure=2e5)},
            OutOfRangeError,
            "pump.ultimate_pressure",
        ),
        (
            {"product": Product(mass=1.0, initial_temperature=270.0)},
            OutOfRangeError,
            "product.initial_temperature",
        ),
        (
            {"product": Product(mass=1.0, initial_temperature=293.15, evaporation="kinetic")},
            InvalidInputError,
            "product.exposed_area",
        ),
        ({"end_time": float("nan")}, InvalidInputError, "end_time"),
        ({"target_temperature": 300.0}, OutOfRangeError, "target_temperature"),
        (
            {"chamber": Chamber(free_volume=0.5, initial_pressure=1000.0, temperature=293.15)},
            UnsupportedStateError,
            "chamber.initial_pressure",
        ),
    ],
    ids=[
        "volume",
        "ultimate",
        "starts-frozen",
        "kinetic-without-area",
        "nan-end",
        "target-above",
        "starts-below-vapor-pressure",
    ],
)
def test_invalid_input_names_the_field(change: dict[str, object], error: type, field: str) -> None:
    arguments: dict[str, object] = {
        "chamber": _chamber(),
        "pump": Pump(nominal_speed=0.05),
        "product": Product(mass=1.0, initial_temperature=293.15),
        "end_time": 600.0,
    }
    arguments.update(change)
    with pytest.raises(error) as caught:
        simulate_vacuum_chamber(VacuumChamberCase(**arguments))  # type: ignore[arg-type]
    assert getattr(caught.value, "variable", None) == field
