"""Sizing on the chamber simulation: the answer meets the target, 0.95 x of it does not.

External check: the pump-down law of a leak-free chamber, V dp/dt = -S p, gives the time
to fall from p0 to p as t = (V / S) ln(p0 / p) (O'Hanlon, J. F., A User's Guide to Vacuum
Technology, 3rd ed., Wiley 2003, ch. 3; from memory). With a negligible product (1 g of
water in 1 m3) the product follows the chamber pressure down its saturation line, so the
pump speed that brings it to 5 degC within 120 s is S = (V / t) ln(p0 / p_sat(5 degC)).
"""

from __future__ import annotations

import math
from dataclasses import replace

import pytest

from service.core.errors import InvalidInputError, OutOfRangeError
from service.core.properties.saturation import saturation_pressure
from service.core.simulation import (
    Chamber,
    Condenser,
    Product,
    Pump,
    ScheduleLimit,
    VacuumChamberCase,
    simulate_vacuum_chamber,
)
from service.core.simulation.case_fields import with_case_field
from service.core.sizing import (
    CoolingTarget,
    NoSolutionError,
    SizingCase,
    size_vacuum_chamber,
)

BAKERY = VacuumChamberCase(
    chamber=Chamber(free_volume=6.0, initial_pressure=101325.0, temperature=298.15, leak_rate=0.05),
    pump=Pump(nominal_speed=0.5, ultimate_pressure=200.0),
    product=Product(
        mass=300.0, initial_temperature=368.15, water_fraction=0.38, solids_specific_heat=1300.0
    ),
    condenser=Condenser(
        surface_temperature=248.15, vapor_conductance=2.0, refrigeration_capacity=60000.0
    ),
    end_time=1800.0,
    series_points=60,
)
"""Invented demo: 300 kg of bread from 95 degC, a 6 m3 chamber, a -25 degC trap."""
TARGET = CoolingTarget(temperature=298.15, time=300.0)


def _time_to_target(case: VacuumChamberCase, path: str, value: float) -> float | None:
    trial = replace(with_case_field(case, path, value), target_temperature=TARGET.temperature)
    return simulate_vacuum_chamber(trial).summary.target_time


@pytest.mark.parametrize(
    "path", ["pump.nominal_speed", "pump.speed_scale", "condenser.refrigeration_capacity"]
)
def test_sizing_answer_meets_target_and_95_percent_misses(path: str) -> None:
    result = size_vacuum_chamber(SizingCase(BAKERY, path, TARGET))
    met = _time_to_target(BAKERY, path, result.solution)
    assert met is not None and met <= TARGET.time
    short = _time_to_target(BAKERY, path, 0.95 * result.solution)
    assert short is None or short > TARGET.time
    assert result.relative_width <= 1e-3
    assert result.simulations <= 15
    assert result.simulation.summary.target_time == pytest.approx(met, rel=1e-12)
    assert result.margin_value == pytest.approx(0.9 * result.solution)
    assert result.margin.meets_target is False
    values = [point.value for point in result.design_curve]
    assert values == sorted(values) and len(values) >= 10


def test_sizing_pump_speed_matches_pump_down_law() -> None:
    case = VacuumChamberCase(
        chamber=Chamber(free_volume=1.0, initial_pressure=101325.0, temperature=293.15),
        pump=Pump(nominal_speed=0.05),
        product=Product(mass=1e-3, initial_temperature=293.15),
        end_time=600.0,
    )
    target = CoolingTarget(temperature=278.15, time=120.0)
    result = size_vacuum_chamber(
        SizingCase(case, "pump.nominal_speed", target, relative_tolerance=1e-5)
    )
    expected = 1.0 / 120.0 * math.log(101325.0 / float(saturation_pressure(278.15)))
    # the 1 g product's own vapor adds about 0.05 %
    assert result.solution == pytest.approx(expected, rel=2e-3)
    assert result.relative_width <= 1e-5


def test_sizing_decreasing_field_gives_largest_value() -> None:
    result = size_vacuum_chamber(SizingCase(BAKERY, "product.mass", TARGET))
    assert result.direction == -1
    assert _time_to_target(BAKERY, "product.mass", result.solution) <= TARGET.time  # type: ignore[operator]
    more = _time_to_target(BAKERY, "product.mass", 1.05 * result.solution)
    assert more is None or more > TARGET.time


def test_sizing_schedule_target() -> None:
    case = replace(BAKERY, target_temperature=298.15, schedule=(ScheduleLimit(180.0, 333.15),))
    result = size_vacuum_chamber(SizingCase(case, "pump.nominal_speed"))
    assert result.simulation.summary.schedule_met is True
    short = simulate_vacuum_chamber(
        with_case_field(case, "pump.nominal_speed", 0.95 * result.solution)
    )
    assert short.summary.schedule_met is False


def test_sizing_refuses_no_schedule_without_target() -> None:
    with pytest.raises(InvalidInputError, match="schedule"):
        size_vacuum_chamber(SizingCase(BAKERY, "pump.nominal_speed"))


def test_sizing_no_solution_names_pump_ultimate_pressure() -> None:
    case = replace(
        BAKERY,
        chamber=replace(BAKERY.chamber, leak_rate=0.0),
        pump=Pump(nominal_speed=0.5, ultimate_pressure=4000.0),
        condenser=None,
    )
    with pytest.raises(NoSolutionError, match="ultimate pressure") as caught:
        size_vacuum_chamber(SizingCase(case, "pump.nominal_speed", TARGET))
    assert len(caught.value.extra["limits"]) == 1  # type: ignore[arg-type]


def test_sizing_no_solution_names_trap_temperature() -> None:
    case = VacuumChamberCase(
        chamber=Chamber(free_volume=1.0, initial_pressure=101325.0, temperature=293.15),
        pump=Pump(nominal_speed=0.05, ultimate_pressure=1000.0),
        condenser=Condenser(surface_temperature=271.15, vapor_conductance=0.5),
        product=Product(mass=1.0, initial_temperature=293.15),
        end_time=1800.0,
    )
    with pytest.raises(NoSolutionError, match="trap temperature"):
        size_vacuum_chamber(
            SizingCase(case, "condenser.vapor_conductance", CoolingTarget(268.15, 600.0))
        )


def test_sizing_no_solution_names_freezing_point() -> None:
    case = VacuumChamberCase(
        chamber=Chamber(free_volume=1.0, initial_pressure=101325.0, temperature=293.15),
        pump=Pump(nominal_speed=0.05, ultimate_pressure=10.0),
        product=Product(mass=1.0, initial_temperature=293.15),
        end_time=1800.0,
    )
    with pytest.raises(NoSolutionError, match="freezing point"):
        size_vacuum_chamber(
            SizingCase(case, "pump.nominal_speed", CoolingTarget(263.15, 80.0), bracket=(0.05, 0.1))
        )


def test_sizing_no_solution_without_physical_limit_says_widen() -> None:
    with pytest.raises(NoSolutionError, match="widen the bracket"):
        size_vacuum_chamber(SizingCase(BAKERY, "pump.nominal_speed", TARGET, bracket=(0.05, 0.2)))


def test_sizing_bracket_end_meeting_target_is_flagged() -> None:
    result = size_vacuum_chamber(
        SizingCase(BAKERY, "pump.nominal_speed", TARGET, bracket=(1.0, 4.0))
    )
    assert result.at_bracket_end and result.solution == 1.0
    assert [w.code for w in result.warnings] == ["bracket-end-meets-target"]


@pytest.mark.parametrize(
    ("find", "match"),
    [
        ("product.water_fraction", "not monotone"),
        ("pump.colour", "not a field"),
        ("end_time", "not monotone"),
    ],
)
def test_sizing_refuses_fields(find: str, match: str) -> None:
    with pytest.raises(InvalidInputError, match=match):
        size_vacuum_chamber(SizingCase(BAKERY, find, TARGET))


def test_sizing_refuses_condenser_field_without_condenser() -> None:
    with pytest.raises(InvalidInputError, match="no condenser"):
        size_vacuum_chamber(
            SizingCase(replace(BAKERY, condenser=None), "condenser.vapor_conductance", TARGET)
        )


def test_sizing_refuses_nominal_speed_of_a_speed_curve() -> None:
    pump = Pump(0.5, 200.0, (100.0, 1000.0), (0.4, 0.5))
    with pytest.raises(InvalidInputError, match="speed_scale"):
        size_vacuum_chamber(SizingCase(replace(BAKERY, pump=pump), "pump.nominal_speed", TARGET))


def test_sizing_needs_bracket_for_unset_field() -> None:
    case = replace(BAKERY, chamber=replace(BAKERY.chamber, leak_rate=0.0))
    with pytest.raises(InvalidInputError, match="bracket"):
        size_vacuum_chamber(SizingCase(case, "chamber.leak_rate", TARGET))


def test_sizing_bracket_the_simulation_refuses() -> None:
    with pytest.raises(InvalidInputError, match="narrower bracket"):
        size_vacuum_chamber(
            SizingCase(BAKERY, "pump.ultimate_pressure", TARGET, bracket=(10.0, 2.0e5))
        )


@pytest.mark.parametrize(
    ("change", "name"),
    [
        ({"bracket": (2.0, 1.0)}, "bracket.upper"),
        ({"relative_tolerance": 0.5}, "relative_tolerance"),
        ({"target": CoolingTarget(380.0, 300.0)}, "target.temperature"),
        ({"target": CoolingTarget(298.15, -1.0)}, "target.time"),
    ],
)
def test_sizing_out_of_range_inputs(change: dict[str, object], name: str) -> None:
    sizing = replace(SizingCase(BAKERY, "pump.nominal_speed", TARGET), **change)  # type: ignore[arg-type]
    with pytest.raises(OutOfRangeError) as caught:
        size_vacuum_chamber(sizing)
    assert caught.value.variable == name
