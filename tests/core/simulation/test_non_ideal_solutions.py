"""Named solutes in the chamber simulation take their non-ideal activity models (Pitzer for
sodium chloride, Norrish for sucrose, IAPWS R13-08 for seawater, Melinder for ethanol), as the
balances and the ice-fraction lookup do.

Reference: the solution freezing functions of service.core.solutions.freezing (the
ice-fraction lookup's, checked against handbook freezing-point tables and, for seawater,
against gsw in tests/core/solutions/) evaluated at the simulated product's own water and
solute: the freezing onset at the concentration the product has when ice appears, and the
ice at the end temperature.
"""

from __future__ import annotations

import numpy as np
import pytest

from service.core.balances import named_solute
from service.core.simulation import Chamber, Product, Pump, VacuumChamberCase
from service.core.simulation.results import VacuumChamberResult
from service.core.simulation.vacuum_chamber import simulate_vacuum_chamber
from service.core.solutions.aqueous import solution_model
from service.core.solutions.freezing import solute_freezing_point, solution_freezing

CASES = [
    ("sodium chloride", 0.035),
    ("seawater", 0.03516504),
    ("sucrose", 0.10),
    ("ethanol", 0.10),
]


def _case(name: str, fraction: float, model: str = "non-ideal") -> VacuumChamberCase:
    return VacuumChamberCase(
        chamber=Chamber(free_volume=0.5, initial_pressure=101325.0, temperature=293.15),
        pump=Pump(nominal_speed=0.05, ultimate_pressure=10.0),
        product=Product(
            mass=1.0,
            initial_temperature=283.15,
            water_fraction=1.0 - fraction,
            solute=named_solute(name, fraction, model),  # type: ignore[arg-type]
        ),
        end_time=400.0,
        series_points=50,
    )


@pytest.mark.parametrize(("name", "fraction"), CASES, ids=[c[0] for c in CASES])
def test_freezing_starts_at_the_models_freezing_point_of_the_product_then(
    name: str, fraction: float
) -> None:
    result = simulate_vacuum_chamber(_case(name, fraction))
    event = next(e for e in result.events if e.name == "freezing-starts")
    water = (1.0 - fraction) - float(event.state.evaporated_mass[0])
    concentration = fraction / (fraction + water)
    pressure = float(event.state.product_vapor_pressure[0])
    expected = float(solute_freezing_point(solution_model(name), concentration, pressure))
    assert float(event.state.product_temperature[0]) == pytest.approx(expected, abs=2e-4)


@pytest.mark.parametrize(("name", "fraction"), CASES, ids=[c[0] for c in CASES])
def test_ice_at_the_end_is_the_models_ice_at_that_temperature(name: str, fraction: float) -> None:
    result = simulate_vacuum_chamber(_case(name, fraction))
    series = result.series
    temperature = float(series.product_temperature[-1])
    water = (1.0 - fraction) - float(series.evaporated_mass[-1])
    concentration = fraction / (fraction + water)
    reference = solution_freezing(
        solution_model(name), concentration, temperature, float(series.product_vapor_pressure[-1])
    )
    expected_ice = float(reference.ice_mass_fraction) * (fraction + water)
    simulated_ice = float(series.ice_fraction[-1]) * (1.0 - fraction)
    assert simulated_ice > 0.0
    assert simulated_ice == pytest.approx(expected_ice, rel=1e-3)
    assert abs(result.balance.relative_energy_residual) < 1e-9


def test_the_ideal_model_stays_available_and_freezes_deeper() -> None:
    real = simulate_vacuum_chamber(_case("sodium chloride", 0.035))
    ideal = simulate_vacuum_chamber(_case("sodium chloride", 0.035, "ideal"))

    def onset(result: VacuumChamberResult) -> float:
        events = result.events
        event = next(e for e in events if e.name == "freezing-starts")
        return float(event.state.product_temperature[0])

    # Raoult's law with i = 2 puts 3.5 % brine's onset about 0.18 K too deep (handbook:
    # -2.1 degC; CRC Handbook, concentrative properties of aqueous NaCl, from memory).
    assert onset(ideal) < onset(real) - 0.1
    assert np.isfinite(onset(ideal))
