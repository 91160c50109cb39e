"""The primary-drying design space against single runs at its grid points.

Each grid setting is run on its own through :func:`simulate_primary_drying` (time
integration, independent of the design space's Gauss-Legendre quadrature); the design space's
drying time, highest front temperature and safe flag must agree with that run.
"""

from __future__ import annotations

import dataclasses
import time

import numpy as np
import pytest

from service.core.drying import (
    STATUS_NO_DRIVING_FORCE,
    DesignSpaceCase,
    DriedLayerResistance,
    DryingLoad,
    EquipmentLimit,
    PrimaryDryingCase,
    Recipe,
    VialHeatTransfer,
    primary_drying_design_space,
    simulate_primary_drying,
    solve_sublimation_front,
)
from service.core.errors import InvalidInputError, OutOfRangeError

HEAT = VialHeatTransfer(contact=11.5, gas_conduction=0.28, gas_conduction_saturation=0.0035)
RESISTANCE = DriedLayerResistance(6.7e4, 7.7e7, 30.0)
LOAD = DryingLoad(500, 3.8e-4, 3.1e-4, 3.0e-3, 1000.0, 0.05, 2.4)
LIMIT = EquipmentLimit(np.array([1.0, 50.0]), np.array([1.0e-5, 2.0e-4]))
CRITICAL = 243.15  # K, -30 degC: an invented amorphous formulation


def _case(**changes: object) -> DesignSpaceCase:
    case = DesignSpaceCase(
        LOAD,
        HEAT,
        RESISTANCE,
        np.array([238.15, 253.15, 268.15, 283.15]),
        np.array([3.0, 10.0, 25.0]),
        CRITICAL,
        LIMIT,
    )
    return dataclasses.replace(case, **changes)  # type: ignore[arg-type]


def test_boundary_and_drying_time_match_single_runs_at_grid_points() -> None:
    space = primary_drying_design_space(_case())
    assert space.drying_time is not None
    assert np.any(space.safe) and not np.all(space.safe)
    for i, shelf in enumerate(space.shelf_temperatures):
        for j, pressure in enumerate(space.chamber_pressures):
            if space.status[i, j] == STATUS_NO_DRIVING_FORCE:
                assert not space.safe[i, j]
                continue
            recipe = Recipe(np.array([0.0]), np.array([shelf]), np.array([pressure]))
            run = simulate_primary_drying(
                PrimaryDryingCase(LOAD, HEAT, RESISTANCE, recipe, CRITICAL, equipment_limit=LIMIT)
            )
            names = {event.name for event in run.events}
            run_safe = (
                "critical-temperature-exceeded" not in names
                and "equipment-limit-exceeded" not in names
            )
            assert bool(space.safe[i, j]) == run_safe, (shelf, pressure)
            assert space.drying_time[i, j] == pytest.approx(run.summary.drying_time, rel=1e-7)
            assert space.front_temperature[i, j] == pytest.approx(
                run.summary.maximum_front_temperature, abs=1e-3
            )
            assert space.batch_sublimation_rate[i, j] == pytest.approx(
                run.summary.peak_batch_sublimation_rate, rel=1e-6
            )


def test_fastest_setting_is_the_shortest_safe_drying_time() -> None:
    space = primary_drying_design_space(_case())
    assert space.fastest is not None and space.drying_time is not None
    i, j = space.fastest
    assert space.safe[i, j]
    assert space.drying_time[i, j] == np.min(space.drying_time[space.safe])


def test_at_a_stated_thickness_equals_the_front_balance() -> None:
    space = primary_drying_design_space(_case(dried_layer_thickness=0.004))
    assert space.drying_time is None
    depth = LOAD.fill_depth
    front = solve_sublimation_front(
        space.shelf_temperatures[:, None],
        space.chamber_pressures[None, :],
        0.004,
        depth - 0.004,
        heat_transfer=HEAT,
        resistance=RESISTANCE,
        heat_transfer_area=LOAD.heat_transfer_area,
        product_area=LOAD.product_area,
        frozen_conductivity=LOAD.frozen_conductivity,
    )
    ok = front.status == 0
    np.testing.assert_array_equal(space.front_temperature[ok], front.front_temperature[ok])
    assert np.all(np.isnan(space.front_temperature[~ok]))
    assert space.fastest is not None
    i, j = space.fastest
    assert space.sublimation_rate[i, j] == np.max(space.sublimation_rate[space.safe])


def test_twenty_by_twenty_grid_is_one_vectorized_call() -> None:
    """A 20 x 20 grid over the whole run answers in well under a second (generous bound
    for a shared machine: 2 s; about 0.1 s measured)."""
    case = _case(
        shelf_temperatures=np.linspace(233.15, 283.15, 20),
        chamber_pressures=np.linspace(3.0, 30.0, 20),
    )
    primary_drying_design_space(case)
    start = time.perf_counter()
    space = primary_drying_design_space(case)
    assert time.perf_counter() - start < 2.0
    assert space.front_temperature.shape == (20, 20)


@pytest.mark.parametrize(
    ("changes", "error", "field"),
    [
        ({"dried_layer_thickness": 0.05}, OutOfRangeError, "dried_layer_thickness"),
        ({"shelf_temperatures": np.array([250.0, 240.0])}, InvalidInputError, "shelf_temperatures"),
        ({"chamber_pressures": np.array([700.0])}, OutOfRangeError, "chamber_pressures"),
        (
            {"shelf_temperatures": np.array([213.15]), "chamber_pressures": np.array([5.0, 9.0])},
            OutOfRangeError,
            "chamber_pressures",
        ),
        ({"chamber_pressures": np.array([0.5, 3.0])}, OutOfRangeError, "equipment_limit"),
    ],
    ids=["no-ice-left", "not-increasing", "above-triple-point", "nothing-sublimes", "limit-range"],
)
def test_bad_grids_name_the_field(
    changes: dict[str, object], error: type[Exception], field: str
) -> None:
    with pytest.raises(error) as raised:
        primary_drying_design_space(_case(**changes))
    assert raised.value.variable == field  # type: ignore[attr-defined]
