"""Conduction inside the product against the exact series solutions of transient conduction,
against the lumped product at small Biot number, and its mass and energy closure.

Sources
-------
- Exact series solutions of one-dimensional transient conduction in a plane wall, an
  infinite cylinder and a sphere, initially uniform, with a convective surface (Biot number
  Bi = h R / k): Incropera, F. P., DeWitt, D. P., Bergman, T. L. and Lavine, A. S.,
  Fundamentals of Heat and Mass Transfer, 7th ed., Wiley (2011), sec. 5.5 (plane wall,
  eqs. 5.39a-c), 5.6.2 (cylinder, eqs. 5.47a-c) and 5.6.3 (sphere, eqs. 5.50a-c) (equation
  numbers from memory); a step in surface temperature is the limit Bi -> infinity, the
  eigenvalues (n - 1/2) pi, the zeros of J0 and n pi (Carslaw, H. S. and Jaeger, J. C.,
  Conduction of Heat in Solids, 2nd ed., Oxford (1959), secs. 3.3, 7.4 and 9.3; from
  memory). The series and their eigenvalues are computed here with scipy (scipy.special
  Bessel functions and their zeros, brentq for the convective eigenvalues).
- Lumped capacitance for Bi << 1: Incropera et al. (7th ed.), sec. 5.1-5.2; in a sphere the
  quasi-steady core-to-surface difference is Bi / 2 of the surface-to-surroundings
  difference (the same book's sec. 3.5, a sphere with uniform generation; from memory),
  so the bound
  used below, Bi times the initial difference, holds with a factor of two to spare.
- The water's specific heat for the diffusivity: iapws 1.5.5 (IAPWS95 class) at the mean
  temperature of the run and 0.1 MPa.
- The closures are the model's own conservation laws.
"""

from __future__ import annotations

import math
from collections.abc import Callable

import numpy as np
import pytest
from iapws import IAPWS95
from scipy.integrate import solve_ivp
from scipy.optimize import brentq
from scipy.special import j0, j1, jn_zeros

from service.core.balances import Companion, Composition
from service.core.errors import InvalidInputError, UnsupportedStateError
from service.core.simulation import (
    Chamber,
    Condenser,
    HeatGainRate,
    Product,
    ProductInterior,
    Pump,
    ScheduleLimit,
    VacuumChamberCase,
    VacuumChamberResult,
    simulate_vacuum_chamber,
)
from service.core.simulation.inputs import InteriorGeometry
from service.core.simulation.product_interior import InteriorGrid

SERIES_TOLERANCE = 0.01
"""Relative, on the temperature ratio theta = (T - T_s) / (T_0 - T_s) at the stated
Fourier numbers, as the issue asks. Measured, whole simulation with 30 nodes: at most
0.55 % for the core and 0.58 % for the mean (the step on a sphere at Fo = 0.3, where the
core ratio is 0.10), 0.14 % for the sphere at Bi = 5, 0.16 % for the cylinder, 0.04 % for
the slab; the grid alone with 40 nodes: at most 0.12 % (sphere)."""

CLOSURE_TOLERANCE = 1e-9
"""Relative, as the issue asks for the interior terms."""

FOURIER_NUMBERS = (0.1, 0.2, 0.3)
"""alpha t / R**2 at which the series are compared (the core ratio from 0.9 to 0.2)."""

TERMS = 60
"""Series terms: at Fo = 0.1 the 60th term is below exp(-(60 pi)**2 0.1), nothing."""

# A cooked product, invented for the tests: 65 % water, solids at 1.6 kJ/(kg K).
WATER_FRACTION = 0.65
SOLIDS_SPECIFIC_HEAT = 1600.0
CONDUCTIVITY = 0.45
DENSITY = 1050.0
INITIAL = 333.15
COOLANT = 283.15
SHAPE_INDEX = {"slab": 0, "cylinder": 1, "sphere": 2}


# -- the exact series ------------------------------------------------------------------------


def _eigenvalues(geometry: str, biot: float | None) -> list[float]:
    """zeta_n of the series: roots of the convective condition, or of the step (None)."""
    if biot is None:
        if geometry == "slab":
            return [(n + 0.5) * math.pi for n in range(TERMS)]
        if geometry == "sphere":
            return [(n + 1) * math.pi for n in range(TERMS)]
        return [float(z) for z in jn_zeros(0, TERMS)]
    conditions: dict[str, Callable[[float], float]] = {
        "slab": lambda z: z * math.tan(z) - biot,
        "cylinder": lambda z: z * float(j1(z)) - biot * float(j0(z)),
        "sphere": lambda z: 1.0 - z / math.tan(z) - biot,
    }
    condition = conditions[geometry]
    grid = np.linspace(1e-6, TERMS * math.pi, 200 * TERMS)
    values = [condition(float(z)) for z in grid]
    roots = []
    for left, right, f_left, f_right in zip(
        grid[:-1], grid[1:], values[:-1], values[1:], strict=True
    ):
        # a sign change that is a root, not a pole of tan or 1/tan or a zero of j0
        if f_left * f_right < 0 and abs(f_left - f_right) < 10.0 + 10.0 * biot:
            roots.append(brentq(condition, float(left), float(right), xtol=1e-14))
    return roots[:TERMS]


def _theta(geometry: str, biot: float | None, fourier: float, where: str) -> float:
    """theta at the centre (``"core"``) or the volume mean (``"mean"``)."""
    total = 0.0
    for z in _eigenvalues(geometry, biot):
        decay = math.exp(-z * z * fourier)
        if geometry == "slab":
            coefficient = 4.0 * math.sin(z) / (2.0 * z + math.sin(2.0 * z))
            mean = math.sin(z) / z
        elif geometry == "cylinder":
            coefficient = 2.0 * float(j1(z)) / (z * (float(j0(z)) ** 2 + float(j1(z)) ** 2))
            mean = 2.0 * float(j1(z)) / z
        else:
            coefficient = 4.0 * (math.sin(z) - z * math.cos(z)) / (2.0 * z - math.sin(2.0 * z))
            mean = 3.0 * (math.sin(z) - z * math.cos(z)) / z**3
        total += coefficient * decay * (1.0 if where == "core" else mean)
    return total


# -- the grid alone, with a step in surface temperature ----------------------------------------


@pytest.mark.parametrize("geometry", ["slab", "cylinder", "sphere"])
def test_grid_follows_the_series_for_a_step_in_surface_temperature(geometry: str) -> None:
    # The discretisation alone: interior nodes of unit capacity per volume and unit
    # conductivity and size, the surface node held at theta = 0 from t = 0 (Carslaw and
    # Jaeger's step; Incropera's series with Bi -> infinity).
    grid = InteriorGrid(geometry, 40)  # type: ignore[arg-type]
    fractions, conductances = grid.fractions, grid.face_factors

    def rates(t: float, theta: np.ndarray) -> np.ndarray:
        full = np.concatenate([theta, [0.0]])
        flows = conductances * (full[:-1] - full[1:])
        net = -flows.copy()
        net[1:] += flows[:-1]
        per_volume: np.ndarray = net / fractions[:-1]
        return per_volume

    solution = solve_ivp(
        rates,
        (0.0, max(FOURIER_NUMBERS)),
        np.ones(fractions.size - 1),
        method="BDF",
        rtol=1e-10,
        atol=1e-12,
        t_eval=FOURIER_NUMBERS,
    )
    for index, fourier in enumerate(FOURIER_NUMBERS):
        core = float(solution.y[0, index])
        mean = float(np.dot(fractions[:-1], solution.y[:, index]))
        assert core == pytest.approx(_theta(geometry, None, fourier, "core"), rel=SERIES_TOLERANCE)
        assert mean == pytest.approx(_theta(geometry, None, fourier, "mean"), rel=SERIES_TOLERANCE)


@pytest.mark.parametrize("geometry", ["slab", "cylinder", "sphere"])
def test_grid_volumes_and_conduction_conserve(geometry: str) -> None:
    # Node volumes sum to the whole; conduction only moves heat between nodes.
    grid = InteriorGrid(geometry, 17)  # type: ignore[arg-type]
    assert float(np.sum(grid.fractions)) == pytest.approx(1.0, abs=1e-15)
    shape = SHAPE_INDEX[geometry]
    # the outer half cell: 1 - (1 - dr/2)**(b + 1) of the volume, dr = 1/16
    assert grid.fractions[-1] == pytest.approx(1.0 - (1.0 - 1.0 / 32.0) ** (shape + 1))


# -- the whole simulation: a cooked product cooled on a cold surface ---------------------------


def _items(geometry: InteriorGeometry, radius: float) -> tuple[float, float]:
    """(mass, cooled area) of one sphere, one metre of cylinder or one m2 of slab."""
    shape = SHAPE_INDEX[geometry]
    volume = {"slab": 2.0 * radius, "cylinder": math.pi * radius**2}.get(
        geometry, 4.0 / 3.0 * math.pi * radius**3
    )
    return DENSITY * volume, volume * (shape + 1) / radius


def _contact_case(
    geometry: InteriorGeometry, radius: float, coefficient: float, nodes: int, end_time: float
) -> VacuumChamberCase:
    # The chamber stays at atmospheric pressure (the pump's ultimate pressure): nothing
    # boils, the product only loses heat to a surface at 10 degC through h over its area.
    mass, area = _items(geometry, radius)
    return VacuumChamberCase(
        chamber=Chamber(free_volume=0.5, initial_pressure=101325.0, temperature=293.15),
        pump=Pump(nominal_speed=0.05, ultimate_pressure=101325.0),
        product=Product(
            mass=mass,
            initial_temperature=INITIAL,
            water_fraction=WATER_FRACTION,
            solids_specific_heat=SOLIDS_SPECIFIC_HEAT,
            interior=ProductInterior(geometry, radius, CONDUCTIVITY, DENSITY, nodes=nodes),
        ),
        heat_gain=HeatGainRate(
            contact_coefficient=coefficient, contact_area=area, shelf_temperature=COOLANT
        ),
        end_time=end_time,
        series_points=2000,
    )


def _diffusivity() -> float:
    water = float(IAPWS95(T=0.5 * (INITIAL + COOLANT), P=0.101325).cp) * 1000.0
    specific_heat = WATER_FRACTION * water + (1.0 - WATER_FRACTION) * SOLIDS_SPECIFIC_HEAT
    return CONDUCTIVITY / (DENSITY * specific_heat)


def _ratio(result: VacuumChamberResult, values: np.ndarray, time: float) -> float:
    series = result.series
    return (float(np.interp(time, series.time, values)) - COOLANT) / (INITIAL - COOLANT)


@pytest.mark.parametrize(
    ("geometry", "biot"),
    [("sphere", 5.0), ("sphere", None), ("cylinder", None), ("slab", None), ("slab", 1.0)],
    ids=["sphere-Bi-5", "sphere-step", "cylinder-step", "slab-step", "slab-Bi-1"],
)
def test_core_lags_its_surface_as_the_series_says(
    geometry: InteriorGeometry, biot: float | None
) -> None:
    # A 5 cm cooked product: the core and the volume mean, as ratios, within 1 % of the
    # exact series at Fo = 0.1, 0.2, 0.3. The step is h = 1e5 W/(m2 K) (Bi = 1.1e4).
    radius = 0.05
    coefficient = 1e5 if biot is None else biot * CONDUCTIVITY / radius
    alpha = _diffusivity()
    end = max(FOURIER_NUMBERS) * radius**2 / alpha * 1.01
    result = simulate_vacuum_chamber(_contact_case(geometry, radius, coefficient, 30, end))
    series = result.series
    assert series.core_temperature is not None and series.surface_temperature is not None
    for fourier in FOURIER_NUMBERS:
        time = fourier * radius**2 / alpha
        core = _ratio(result, series.core_temperature, time)
        mean = _ratio(result, series.product_temperature, time)
        assert core == pytest.approx(_theta(geometry, biot, fourier, "core"), rel=SERIES_TOLERANCE)
        assert mean == pytest.approx(_theta(geometry, biot, fourier, "mean"), rel=SERIES_TOLERANCE)
        # the core lags its surface
        assert core > _ratio(result, series.surface_temperature, time)
    # nothing evaporates: the energy residual against the heat that left (J / J)
    balance = result.balance
    assert abs(balance.energy_residual) < CLOSURE_TOLERANCE * abs(balance.heat_gained)


def test_small_biot_number_agrees_with_the_lumped_product() -> None:
    # Bi = 0.01 (1 cm sphere, h = 0.45 W/(m2 K)): interior and lumped products cool alike.
    radius, biot = 0.01, 0.01
    interior = _contact_case("sphere", radius, biot * CONDUCTIVITY / radius, 20, 4.0e4)
    lumped_product = Product(
        mass=interior.product.mass,
        initial_temperature=INITIAL,
        water_fraction=WATER_FRACTION,
        solids_specific_heat=SOLIDS_SPECIFIC_HEAT,
    )
    lumped = VacuumChamberCase(
        chamber=interior.chamber,
        pump=interior.pump,
        product=lumped_product,
        heat_gain=interior.heat_gain,
        end_time=interior.end_time,
        series_points=interior.series_points,
    )
    with_interior = simulate_vacuum_chamber(interior)
    alone = simulate_vacuum_chamber(lumped)
    drop = INITIAL - COOLANT
    core = with_interior.series.core_temperature
    surface = with_interior.series.surface_temperature
    assert core is not None and surface is not None
    reference = np.interp(
        with_interior.series.time, alone.series.time, alone.series.product_temperature
    )
    assert float(np.max(np.abs(core - reference))) < biot * drop
    assert float(np.max(np.abs(surface - reference))) < biot * drop
    assert float(np.max(np.abs(with_interior.series.product_temperature - reference))) < (
        0.1 * biot * drop
    )
    # and the lumped product cools as exp(-h A t / (M c)) (Incropera et al., 7th ed., eq. 5.6)
    specific_heat = CONDUCTIVITY / (DENSITY * _diffusivity())
    time_constant = DENSITY * specific_heat * radius / (3.0 * biot * CONDUCTIVITY / radius)
    expected = math.exp(-alone.summary.end_time / time_constant)
    assert (alone.summary.final_temperature - COOLANT) / drop == pytest.approx(expected, rel=0.01)


def test_vacuum_cooled_product_closes_mass_and_energy_with_interior_terms() -> None:
    # Kinetic evaporation through the air, a condenser, a leak, wall radiation, shelf
    # contact and a companion on the surface node: mass and energy close to 1e-9, and the
    # core lags the surface throughout.
    result = simulate_vacuum_chamber(
        VacuumChamberCase(
            chamber=Chamber(
                free_volume=1.0, initial_pressure=101325.0, temperature=293.15, leak_rate=0.5
            ),
            pump=Pump(nominal_speed=0.05, ultimate_pressure=200.0),
            condenser=Condenser(
                surface_temperature=253.15, vapor_conductance=0.3, refrigeration_capacity=500.0
            ),
            product=Product(
                mass=3.0,
                initial_temperature=343.15,
                composition=Composition(water=0.65, protein=0.25, fat=0.08, ash=0.02),
                evaporation="kinetic",
                exposed_area=0.3,
                evaporation_coefficient=0.05,
                characteristic_size=0.1,
                interior=ProductInterior("sphere", 0.04, nodes=15),
            ),
            companions=(Companion(2.0, 477.0),),
            heat_gain=HeatGainRate(
                power=5.0,
                radiating_area=0.2,
                contact_coefficient=20.0,
                contact_area=0.02,
                shelf_temperature=283.15,
            ),
            end_time=1800.0,
        )
    )
    balance = result.balance
    assert abs(balance.relative_mass_residual) < CLOSURE_TOLERANCE
    assert abs(balance.relative_energy_residual) < CLOSURE_TOLERANCE
    series = result.series
    assert series.core_temperature is not None and series.surface_temperature is not None
    assert np.all(series.core_temperature[1:] > series.surface_temperature[1:])
    assert result.summary.final_core_temperature == pytest.approx(
        float(series.core_temperature[-1])
    )


def test_target_and_schedule_apply_to_the_core_by_default() -> None:
    # The core reaches the target last: the run stops on it; the schedule reads the core.
    radius = 0.05
    case = _contact_case("sphere", radius, 50.0, 20, 3.0e4)
    case = VacuumChamberCase(
        chamber=case.chamber,
        pump=case.pump,
        product=case.product,
        heat_gain=case.heat_gain,
        end_time=case.end_time,
        target_temperature=303.15,
        schedule=(ScheduleLimit(1800.0, 323.15),),
    )
    result = simulate_vacuum_chamber(case)
    assert result.summary.end_reason == "target-reached"
    assert result.summary.target_applies_to == "core"
    assert result.summary.final_core_temperature == pytest.approx(303.15, abs=1e-6)
    assert result.summary.final_temperature < 303.15
    check = result.schedule[0]
    assert check.applies_to == "core"
    core = result.series.core_temperature
    assert core is not None
    assert check.product_temperature == pytest.approx(
        float(np.interp(1800.0, result.series.time, core)), abs=0.05
    )


def test_freezing_inside_stops_the_run_with_a_warning() -> None:
    # Pure water boiling under vacuum: its surface reaches the triple point and would
    # freeze; the interior model stops there and says so.
    result = simulate_vacuum_chamber(
        VacuumChamberCase(
            chamber=Chamber(free_volume=0.5, initial_pressure=101325.0, temperature=293.15),
            pump=Pump(nominal_speed=0.05, ultimate_pressure=10.0),
            product=Product(
                mass=1.0,
                initial_temperature=293.15,
                interior=ProductInterior("slab", 0.02, 0.6, 1000.0, nodes=10),
            ),
            end_time=3600.0,
        )
    )
    assert result.summary.end_reason == "model-range-left"
    assert result.events[-1].name == "freezing-starts"
    assert "interior model does not follow freezing" in " ".join(
        warning.message for warning in result.warnings
    )


@pytest.mark.parametrize(
    ("product", "target", "error", "field"),
    [
        (
            Product(mass=1.0, initial_temperature=300.0, interior=ProductInterior("sphere", 0.05)),
            None,
            InvalidInputError,
            "product.interior.thermal_conductivity",
        ),
        (
            Product(
                mass=1.0,
                initial_temperature=300.0,
                interior=ProductInterior("sphere", 0.05, 0.5, 1000.0),
                nucleation_temperature=265.0,
            ),
            None,
            UnsupportedStateError,
            "product.interior",
        ),
        (
            Product(
                mass=1.0,
                initial_temperature=300.0,
                interior=ProductInterior("sphere", 0.05, 0.5, 1000.0),
            ),
            270.0,
            UnsupportedStateError,
            "target_temperature",
        ),
        (
            Product(
                mass=1.0,
                initial_temperature=300.0,
                interior=ProductInterior("sphere", 2.0, 0.5, 1000.0),
            ),
            None,
            Exception,
            "product.interior.half_thickness_or_radius",
        ),
    ],
    ids=["no-conductivity", "supercooling", "target-below-freezing", "too-large"],
)
def test_interior_input_refused_naming_the_field(
    product: Product, target: float | None, error: type[Exception], field: str
) -> None:
    with pytest.raises(error) as raised:
        simulate_vacuum_chamber(
            VacuumChamberCase(
                chamber=Chamber(free_volume=0.5, initial_pressure=101325.0, temperature=293.15),
                pump=Pump(nominal_speed=0.05),
                product=product,
                end_time=60.0,
                target_temperature=target,
            )
        )
    assert field in str(raised.value)


# -- pores: evaporation inside a porous product ----------------------------------------------


def _bread_rack(interior: ProductInterior | None) -> VacuumChamberCase:
    # A rack of bread from the oven (invented, after the README's bakery example): 40 kg at
    # 96 degC, 38 % water, in a 2.5 m3 cooler with a trap, to a 30 degC target.
    return VacuumChamberCase(
        chamber=Chamber(
            free_volume=2.5, initial_pressure=101300.0, temperature=298.15, leak_rate=0.02
        ),
        pump=Pump(nominal_speed=300.0 / 3600.0, ultimate_pressure=200.0),
        condenser=Condenser(
            surface_temperature=248.15, vapor_conductance=0.4, refrigeration_capacity=6000.0
        ),
        product=Product(
            mass=40.0,
            initial_temperature=369.15,
            water_fraction=0.38,
            solids_specific_heat=1300.0,
            interior=interior,
        ),
        companions=(Companion(25.0, 477.0),),
        end_time=3600.0,
        target_temperature=303.15,
    )


def _loaves(venting_time: float | None) -> ProductInterior:
    return ProductInterior("cylinder", 0.05, 0.2, 280.0, nodes=15, pore_venting_time=venting_time)


def test_porous_product_cools_between_free_venting_and_conduction_alone() -> None:
    # Ordered by the pores' resistance: the uniform product (vapor leaves every point at
    # once) reaches the target first, then pores venting in 1 s, then in 60 s; by
    # conduction alone the surface freezes before the core gets there. Physical ordering,
    # no published source; the fast-venting limit is the uniform product within 5 %.
    uniform = simulate_vacuum_chamber(_bread_rack(None)).summary.target_time
    fast = simulate_vacuum_chamber(_bread_rack(_loaves(1.0)))
    slow = simulate_vacuum_chamber(_bread_rack(_loaves(60.0)))
    closed = simulate_vacuum_chamber(_bread_rack(_loaves(None)))
    assert uniform is not None and fast.summary.target_time is not None
    assert slow.summary.target_time is not None
    assert uniform < fast.summary.target_time < slow.summary.target_time
    assert fast.summary.target_time == pytest.approx(uniform, rel=0.05)
    assert closed.summary.target_time is None
    assert closed.summary.end_reason == "model-range-left"  # the surface reached freezing
    assert closed.summary.final_core_temperature is not None
    assert closed.summary.final_core_temperature > 343.15
    for result in (fast, slow, closed):
        balance = result.balance
        assert abs(balance.relative_mass_residual) < CLOSURE_TOLERANCE
        assert abs(balance.relative_energy_residual) < CLOSURE_TOLERANCE


def test_pores_close_mass_and_energy_in_the_kinetic_mode() -> None:
    # Kinetic surface flux through the air plus boiling pores, heat from the walls.
    result = simulate_vacuum_chamber(
        VacuumChamberCase(
            chamber=Chamber(free_volume=1.0, initial_pressure=101325.0, temperature=293.15),
            pump=Pump(nominal_speed=0.05, ultimate_pressure=200.0),
            condenser=Condenser(surface_temperature=253.15, vapor_conductance=0.3),
            product=Product(
                mass=2.0,
                initial_temperature=318.15,
                water_fraction=0.9,
                solids_specific_heat=1500.0,
                evaporation="kinetic",
                exposed_area=0.5,
                evaporation_coefficient=0.05,
                interior=ProductInterior("sphere", 0.06, 0.4, 450.0, 12, "core", 10.0),
            ),
            heat_gain=HeatGainRate(radiating_area=0.2),
            end_time=1200.0,
        )
    )
    balance = result.balance
    assert abs(balance.relative_mass_residual) < CLOSURE_TOLERANCE
    assert abs(balance.relative_energy_residual) < CLOSURE_TOLERANCE
    core = result.series.core_temperature
    assert core is not None and float(core[-1]) < 318.15 - 10.0  # the pores cooled the core


def test_venting_time_is_recovered_from_a_logged_core_probe() -> None:
    # A core probe logged every 20 s from the 15 s-venting run (the model's own output, no
    # noise): the calibration finds the venting time from a 60 s start; a lumped case
    # cannot be compared with a core probe (422, naming the series).
    from service.core.calibration import (
        EstimatedParameter,
        MeasuredRun,
        MeasuredSeries,
        calibrate_vacuum_chamber,
    )

    truth = _bread_rack(_loaves(15.0))
    truth = VacuumChamberCase(
        chamber=truth.chamber,
        pump=truth.pump,
        condenser=truth.condenser,
        product=truth.product,
        companions=truth.companions,
        end_time=300.0,
    )
    logged = simulate_vacuum_chamber(truth).series
    assert logged.core_temperature is not None
    times = np.arange(0.0, 300.0, 20.0)
    probe = MeasuredSeries(
        "core_temperature", times, np.interp(times, logged.time, logged.core_temperature)
    )
    start = VacuumChamberCase(
        chamber=truth.chamber,
        pump=truth.pump,
        condenser=truth.condenser,
        product=Product(
            mass=40.0,
            initial_temperature=369.15,
            water_fraction=0.38,
            solids_specific_heat=1300.0,
            interior=_loaves(60.0),
        ),
        companions=truth.companions,
        end_time=300.0,
    )
    fitted = calibrate_vacuum_chamber(
        start,
        MeasuredRun(series=(probe,), pump_start=0.0),
        (EstimatedParameter("product.interior.pore_venting_time", 1.0, 300.0),),
    )
    assert fitted.estimates[0].value == pytest.approx(15.0, rel=0.02)
    lumped = VacuumChamberCase(
        chamber=truth.chamber,
        pump=truth.pump,
        product=Product(mass=40.0, initial_temperature=369.15),
        end_time=300.0,
    )
    with pytest.raises(InvalidInputError, match="core_temperature"):
        calibrate_vacuum_chamber(
            lumped,
            MeasuredRun(series=(probe,), pump_start=0.0),
            (EstimatedParameter("chamber.leak_rate", 0.0, 1.0),),
        )
