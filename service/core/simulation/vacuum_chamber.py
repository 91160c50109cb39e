"""Vacuum-chamber process simulation: pump-down, flashing, freezing, sublimation over time.

One public function, :func:`simulate_vacuum_chamber`: it validates the case, builds the
ODE system (:mod:`service.core.simulation.chamber_model`), integrates it with scipy's
LSODA (switching automatically between non-stiff and stiff BDF methods) in segments
separated by events, and assembles events, a time series, a summary, the mass and
energy balances, the schedule check, assumptions and warnings.
"""

from __future__ import annotations

from collections.abc import Callable
from dataclasses import dataclass, field, replace
from typing import Any, Final

import numpy as np
from scipy.integrate import solve_ivp

from service.core.balances.companions import heat_capacity
from service.core.balances.scalars import require_scalar_within
from service.core.deadline import check_deadline
from service.core.errors import (
    NotConvergedError,
    OutOfRangeError,
    TripointError,
    UnsupportedStateError,
)
from service.core.properties.advisories import Advisory
from service.core.properties.constants import SPECIFIC_GAS_CONSTANT
from service.core.properties.helmholtz import fluid_properties_at
from service.core.properties.lookups import path_uncertainties
from service.core.properties.phase import FloatArray
from service.core.properties.sources import IAPWS_95, ICE_IH, MELTING_AND_SUBLIMATION
from service.core.simulation.air_limited_evaporation import (
    DEFAULT_CHARACTERISTIC_SIZE,
    AirLimitedEvaporation,
)
from service.core.simulation.chamber_model import (
    AIR,
    CONDENSED,
    CONDENSER_HEAT,
    ENERGY,
    HEAT_GAINED,
    PUMPED,
    STATE_SIZE,
    VAPOR,
    VAPOR_ENTHALPY,
    WATER,
    ChamberModel,
    Rates,
    Regime,
)
from service.core.simulation.checks import equipment_checks
from service.core.simulation.condenser import CondenserCapture
from service.core.simulation.inputs import (
    HeatGainRate,
    Product,
    TemperatureLocation,
    VacuumChamberCase,
    validate_case,
)
from service.core.simulation.load import LoadModel, load_model
from service.core.simulation.path_tables import (
    LIQUID_TEMPERATURE_MAX,
    LIQUID_TEMPERATURE_MIN,
)
from service.core.simulation.product_conductivity import (
    CHOI_OKOS_CONDUCTIVITY_REFERENCE,
    composition_conductivity,
    composition_density,
)
from service.core.simulation.product_interior import InteriorConduction
from service.core.simulation.pump import PumpingSpeed
from service.core.simulation.results import (
    ChamberStates,
    MassEnergyBalance,
    ScheduleCheck,
    SimulationEvent,
    SimulationSummary,
    VacuumChamberResult,
)
from service.core.solutions.ethanol import ETHANOL_CAUTION

__all__ = ["REFERENCES", "simulate_vacuum_chamber"]

REFERENCES: Final = (
    "Chamber air and vapor balances: Wang, L. and Sun, D.-W. (2002), Modelling vacuum "
    "cooling process of cooked meat - part 1: analysis of vacuum cooling system, "
    "Int. J. Refrigeration 25(7), 854-861 (from memory).",
    "Pump-down law V dp/dt = Q - S p and effective speed S (1 - p_ult/p): standard "
    "vacuum-technology result, e.g. O'Hanlon, J. F., A User's Guide to Vacuum Technology, "
    "3rd ed., Wiley (2003) (from memory).",
    "Hertz-Knudsen-Langmuir evaporation and impingement flux: Eames, I. W., Marr, N. J. and "
    "Sabir, H. (1997), The evaporation coefficient of water: a review, Int. J. Heat Mass "
    "Transfer 40(12), 2963-2973 (from memory).",
    "Air-limited evaporation (kinetic): binary diffusivity of water vapor in air by "
    "Fuller, Schettler and Giddings (1966), as given in Poling, B. E., Prausnitz, J. M. and "
    "O'Connell, J. P., The Properties of Gases and Liquids, 5th ed., McGraw-Hill (2001), "
    "eq. 11-4.4 (from memory); Sherwood number of a sphere in still gas from Churchill's "
    "natural-convection correlation by the heat and mass transfer analogy, as given in "
    "Incropera, F. P. et al., Fundamentals of Heat and Mass Transfer, 6th ed., Wiley (2007), "
    "eq. 9.35 (from memory); Stefan (log-mean) diffusion through stagnant air, Bird, R. B., "
    "Stewart, W. E. and Lightfoot, E. N., Transport Phenomena, 2nd ed., Wiley (2002), "
    "sec. 18.2 (from memory); air viscosity by Sutherland's law (White, F. M., Viscous "
    "Fluid Flow, 3rd ed., 2006; from memory).",
    "ODE integration: LSODA (Hindmarsh, A. C., ODEPACK, 1983; Petzold, L., SIAM J. Sci. "
    "Stat. Comput. 4, 136-148, 1983) as wrapped by scipy.integrate.solve_ivp.",
)

_RELATIVE_TOLERANCE: Final = 1e-8
_ABSOLUTE_SCALE: Final = 1e-10
_WATER_LEFT: Final = 1e-3
"""Fraction of the initial water below which the simulation stops (water exhausted)."""
_MAX_SEGMENTS: Final = 200
_FLASH_BAND: Final = 1e-9
_CONDENSING_BAND: Final = 1e-12
"""Hysteresis of the boiling switch. Boiling starts when the chamber pressure is
``_FLASH_BAND`` of the product's vapor pressure below it; it stops when the evaporation rate
falls below minus ``_CONDENSING_BAND`` times the water mass, per second. Without the band a
product at rest on the boundary (pump at its ultimate pressure, condenser at the product's
vapor pressure, no heat gain: both switching functions exactly zero) would switch regimes at
one instant forever. The band moves the flash point by 1e-9 of the pressure (about 1e-8 s
for a pump-down at 100 Pa/s) and lets at most 1e-12 kg/s per kg of water condense back on
the product before it counts as sealed (under 2e-9 of the water in 30 min)."""
_LATENT_SCALE: Final = 3.0e6
"""J/kg, scale of the product energy for the absolute tolerances."""
_LIQUID_VOLUME: Final = 1.0e-3
"""m3/kg, specific volume of liquid water to one digit (IAPWS-95: 1.0002e-3 at 20 degC),
for the size of the neglected pressure work stated in the assumptions."""
_AIR_LIMITED_SHARE: Final = 0.5
"""Warn when the air takes more than this share of the driving vapor-pressure difference
(the air-limited flux below half the surface flux alone)."""
_INTO_AIR_SHARE: Final = 0.01
"""Warn when more than this share of the evaporated water left before the flash point."""
_SOLUTION_ACTIVITY_WARNING: Final = 0.9
_DRIFT_WARNING: Final = 1e-6

EventFunction = Callable[[float, FloatArray], float]

_INTERIOR_REFERENCES: Final = (
    "Product interior: finite volumes on radial nodes (Patankar, S. V., Numerical Heat "
    "Transfer and Fluid Flow, Hemisphere, 1980, ch. 4; from memory), integrated by the "
    "method of lines with the chamber's stiff integrator.",
    CHOI_OKOS_CONDUCTIVITY_REFERENCE,
)


def _location(case: VacuumChamberCase) -> TemperatureLocation:
    """Where the target and the schedule are read: the interior option, else the (one)
    product temperature."""
    interior = case.product.interior
    return "mean" if interior is None else interior.target_applies_to


def _located(rates: Rates, location: TemperatureLocation) -> float:
    """The product temperature at ``location`` (K)."""
    if location == "core":
        return rates.core_temperature
    if location == "surface":
        return rates.surface_temperature
    return rates.product.temperature


def _coldest(rates: Rates) -> float:
    nodes = rates.node_temperatures
    return min(nodes) if nodes else rates.product.temperature


def _warmest(rates: Rates) -> float:
    nodes = rates.node_temperatures
    return max(nodes) if nodes else rates.product.temperature


@dataclass
class _Segment:
    start: float
    end: float
    regime: Regime
    solution: Any


@dataclass
class _Run:
    """Mutable bookkeeping of one simulation."""

    segments: list[_Segment] = field(default_factory=list)
    events: list[tuple[str, float, FloatArray, Regime, str]] = field(default_factory=list)
    fired: set[str] = field(default_factory=set)
    end_reason: str = "end-time"
    steps: int = 0


def _event(function: EventFunction, *, terminal: bool, direction: float) -> EventFunction:
    function.terminal = terminal  # type: ignore[attr-defined]
    function.direction = direction  # type: ignore[attr-defined]
    return function


def _event_functions(
    model: ChamberModel, case: VacuumChamberCase, load: LoadModel, run: _Run
) -> dict[str, EventFunction]:
    """The events watched in the current regime (name -> function with attributes)."""
    events: dict[str, EventFunction] = {}
    regime = model.regime
    if regime == "sealed" or (regime == "kinetic" and "flash-point" not in run.fired):
        events["flash-point"] = _event(
            lambda t, y: (
                model.rates(y).total_pressure
                - (1.0 - _FLASH_BAND) * model.rates(y).product.equilibrium_pressure
            ),
            terminal=regime == "sealed",
            direction=-1.0,
        )
    if regime == "boiling":
        condensing = _CONDENSING_BAND * load.water_mass
        events["boiling-stops"] = _event(
            lambda t, y: model.rates(y).surface_evaporation + condensing,
            terminal=True,
            direction=-1.0,
        )
    nucleation = case.product.nucleation_temperature
    if "freezing-starts" not in run.fired and model.product.supercooled:
        assert nucleation is not None
        # Supercooled: ice appears only at the nucleation temperature.
        events["freezing-starts"] = _event(
            lambda t, y: model.rates(y).product.temperature - nucleation,
            terminal=True,
            direction=-1.0,
        )
    elif "freezing-starts" not in run.fired:
        events["freezing-starts"] = _event(
            lambda t, y: model.rates(y).product.liquid_margin, terminal=True, direction=-1.0
        )
    if not model.product.has_solute and "fully-frozen" not in run.fired:
        events["fully-frozen"] = _event(
            lambda t, y: model.rates(y).product.frozen_margin, terminal=True, direction=-1.0
        )
    target = case.target_temperature
    location = _location(case)
    if target is not None:
        events["target-reached"] = _event(
            lambda t, y: _located(model.rates(y), location) - target,
            terminal=True,
            direction=-1.0,
        )
    condenser = case.condenser
    if (
        condenser is not None
        and condenser.ice_capacity is not None
        and "condenser-capacity-exceeded" not in run.fired
    ):
        capacity = condenser.ice_capacity
        events["condenser-capacity-exceeded"] = _event(
            lambda t, y: float(y[CONDENSED]) - capacity, terminal=False, direction=1.0
        )
    lowest = model.product.lowest_temperature
    events["model-range-left"] = _event(
        lambda t, y: _coldest(model.rates(y)) - lowest, terminal=True, direction=-1.0
    )
    events["model-range-left-above"] = _event(
        lambda t, y: LIQUID_TEMPERATURE_MAX - _warmest(model.rates(y)),
        terminal=True,
        direction=-1.0,
    )
    water_left = _WATER_LEFT * load.water_mass
    events["water-exhausted"] = _event(
        lambda t, y: float(y[WATER]) - water_left, terminal=True, direction=-1.0
    )
    return events


_STOPPING: Final = frozenset(
    {"target-reached", "model-range-left", "model-range-left-above", "water-exhausted"}
)
_ONCE: Final = frozenset(
    {"flash-point", "freezing-starts", "fully-frozen", "condenser-capacity-exceeded"}
)


def _check_nucleation(product: Product, onset: float) -> None:
    """Raise OutOfRangeError for a nucleation temperature outside [243.15 K, onset)."""
    if product.nucleation_temperature is None:
        return
    require_scalar_within(
        product.nucleation_temperature,
        "product.nucleation_temperature",
        LIQUID_TEMPERATURE_MIN,
        onset,
        "K",
        "supercooled water nucleates below the product's freezing point, and the liquid "
        "tables end at 243.15 K",
    )
    if product.nucleation_temperature >= onset:
        raise OutOfRangeError(
            "product.nucleation_temperature",
            product.nucleation_temperature,
            LIQUID_TEMPERATURE_MIN,
            onset,
            "K",
            "must lie below the product's freezing point (else no supercooling)",
        )


def _heat_gain_statement(gain: HeatGainRate) -> str:
    """The heat-gain assumption, naming only the terms the case uses."""
    terms = ["P + UA (T_surroundings - T_product)"]
    notes = []
    if gain.radiating_area > 0.0:
        terms.append("sigma eps A_r (T_wall^4 - T_product^4)")
        notes.append(
            f"wall radiation as a small grey body in a large enclosure, eps = "
            f"{gain.emissivity:g} (Stefan-Boltzmann constant, CODATA 2018)"
        )
    if gain.contact_coefficient > 0.0 and gain.contact_area > 0.0:
        terms.append("h_c A_c (T_shelf - T_product)")
        notes.append("shelf or tray contact by a constant heat-transfer coefficient")
    text = "Heat gain: Q = " + " + ".join(terms) + "."
    if notes:
        joined = "; ".join(notes)
        text += f" {joined[0].upper()}{joined[1:]}; walls and shelf at constant temperature."
    return text


def _detail(name: str, regime: Regime) -> str:
    return {
        "flash-point": "The chamber pressure has fallen to the product's vapor pressure: "
        + ("the product starts to boil." if regime != "kinetic" else "flashing starts."),
        "boiling-resumes": "The chamber pressure has fallen to the product's vapor pressure "
        "again: boiling resumes.",
        "boiling-stops": "The pump and condenser no longer draw vapor faster than the air "
        "pressure rises: the product stops boiling.",
        "freezing-starts": "Ice forms in the product.",
        "nucleation": "Ice nucleates in the supercooled product, which recalesces to its "
        "freezing line at once (adiabatic; no evaporation during the jump).",
        "fully-frozen": "All the product's water is frozen.",
        "target-reached": "The product has reached the target temperature.",
        "end-time": "The end time is reached.",
        "condenser-capacity-exceeded": "The ice on the condenser exceeds its capacity.",
        "model-range-left": "The product temperature leaves the model's range; the "
        "simulation stops.",
        "model-range-left-above": "The product temperature rises above 373.15 K; the "
        "simulation stops.",
        "water-exhausted": "The product has lost 99.9 % of its water; the simulation stops.",
        "interior-freezing": "Ice forms in the product; the interior model does not follow "
        "freezing inside the product, so the simulation stops here.",
    }[name]


def _integrate(
    model: ChamberModel,
    case: VacuumChamberCase,
    load: LoadModel,
    initial: FloatArray,
) -> _Run:
    run = _Run()
    chamber_scale = np.array(
        [
            case.chamber.initial_pressure + case.chamber.initial_vapor_pressure,
            load.water_mass,
            load.water_mass,
            load.water_mass * _LATENT_SCALE,
            load.water_mass,
            load.water_mass,
            load.water_mass * _LATENT_SCALE,
            load.water_mass * _LATENT_SCALE,
            load.water_mass * _LATENT_SCALE,
        ]
    )
    interior_scale = (
        np.zeros(0)
        if model.interior is None
        else load.water_mass * _LATENT_SCALE * model.interior.grid.fractions[:-1]
    )
    scale = np.concatenate([chamber_scale, interior_scale])
    t0, y0 = 0.0, initial

    def derivatives(time: float, state: FloatArray) -> FloatArray:
        check_deadline()  # a caller's time limit stops the integration here
        return model.derivatives(time, state)

    for _ in range(_MAX_SEGMENTS):
        events = _event_functions(model, case, load, run)
        names = list(events)
        try:
            solution = solve_ivp(
                derivatives,
                (t0, case.end_time),
                y0,
                method="LSODA",
                rtol=_RELATIVE_TOLERANCE,
                atol=_ABSOLUTE_SCALE * scale,
                events=list(events.values()),
                dense_output=True,
            )
        except ValueError as error:
            if isinstance(error, TripointError):
                raise
            # scipy's event location (brentq) refuses an event function whose sign at the
            # ends of a step differs between its two evaluations: the product hovers at a
            # regime boundary (e.g. boiling starting and stopping at the pump's ultimate
            # pressure with an air leak). Report it as a failed solve, not a crash.
            raise NotConvergedError(
                f"vacuum-chamber event location near t = {t0:.6g} s ({error})", run.steps, 0.0
            ) from None
        if solution.status < 0:
            raise NotConvergedError(
                f"vacuum-chamber ODE integration ({solution.message})", len(solution.t), 0.0
            )
        run.steps += len(solution.t) - 1
        regime = model.regime
        t1 = float(solution.t[-1])
        run.segments.append(_Segment(t0, t1, regime, solution.sol))
        stop_name: str | None = None
        for name, times, states in zip(names, solution.t_events, solution.y_events, strict=True):
            for time, state in zip(times, states, strict=True):
                if not events[name].terminal:  # type: ignore[attr-defined]
                    run.fired.add(name)
                    run.events.append(
                        (name, float(time), np.array(state), regime, _detail(name, regime))
                    )
                elif abs(float(time) - t1) <= 1e-12 * max(1.0, t1):
                    stop_name = name if stop_name is None or name in _STOPPING else stop_name
        t0, y0 = t1, np.array(solution.y[:, -1])
        if solution.status == 0 or stop_name is None:
            run.end_reason = "end-time"
            run.events.append(("end-time", t1, y0, regime, _detail("end-time", regime)))
            return run
        label = stop_name
        if stop_name == "flash-point":
            if "flash-point" in run.fired:
                label = "boiling-resumes"
            model.regime = "boiling"
        elif stop_name == "boiling-stops":
            model.regime = "sealed"
        elif stop_name == "freezing-starts" and model.product.supercooled:
            # Nucleation: the same energy and water now map onto the freezing path (the
            # adiabatic, instantaneous recalescence of the flash-freeze balance).
            model.product.supercooled = False
            model.product.nucleation_time = t1
            label = "nucleation"
        if stop_name == "freezing-starts" and model.interior is not None:
            run.events.append(
                ("freezing-starts", t1, y0, regime, _detail("interior-freezing", regime))
            )
            run.end_reason = "model-range-left"
            return run
        if stop_name in _ONCE:
            run.fired.add(stop_name)
        public = {
            "model-range-left-above": "model-range-left",
            "nucleation": stop_name,
        }.get(label, label)
        run.events.append((public, t1, y0, regime, _detail(label, regime)))
        if stop_name in _STOPPING:
            run.end_reason = public
            return run
        if t1 >= case.end_time:
            run.end_reason = "end-time"
            run.events.append(("end-time", t1, y0, regime, _detail("end-time", regime)))
            return run
    raise NotConvergedError(
        "vacuum-chamber simulation: too many regime changes (the product switches between "
        "boiling and not boiling)",
        _MAX_SEGMENTS,
        0.0,
    )


def _states(
    model: ChamberModel, load: LoadModel, times: FloatArray, ys: FloatArray, regimes: list[Regime]
) -> ChamberStates:
    """Derived quantities at states ``ys`` (shape (STATE_SIZE, n)) in their regimes."""
    count = times.size
    columns = np.empty((15, count))
    saved = model.regime
    saved_supercooled = model.product.supercooled
    r_gas = SPECIFIC_GAS_CONSTANT * model.gas_temperature
    for index in range(count):
        model.regime = regimes[index]
        model.product.supercooled = model.product.supercooled_at(float(times[index]))
        r = model.rates(ys[:, index])
        total = r.total_pressure
        columns[:, index] = (
            total,
            r.air_pressure,
            r.vapor_pressure,
            r.product.temperature,
            r.product.equilibrium_pressure,
            r.product.ice_mass,
            r.evaporation,
            r.pump_speed,
            r.vapor_to_pump,
            r.vapor_to_condenser,
            r.condenser_load,
            r.heat_gain,
            r_gas / total if total > 0.0 else 0.0,
            r.core_temperature,
            r.surface_temperature,
        )
    model.regime = saved
    model.product.supercooled = saved_supercooled
    volume_per_mass = columns[12]
    return ChamberStates(
        time=np.asarray(times, dtype=np.float64),
        total_pressure=columns[0],
        air_pressure=columns[1],
        vapor_pressure=columns[2],
        product_temperature=columns[3],
        product_vapor_pressure=columns[4],
        evaporated_mass=load.water_mass - ys[WATER],
        ice_fraction=columns[5] / load.water_mass,
        evaporation_rate=columns[6],
        pump_volume_flow=columns[7],
        vapor_mass_flow_to_pump=columns[8],
        vapor_volume_flow_to_pump=columns[8] * volume_per_mass,
        vapor_mass_flow_to_condenser=columns[9],
        vapor_volume_flow_to_condenser=columns[9] * volume_per_mass,
        condenser_load=columns[10],
        condenser_ice=np.asarray(ys[CONDENSED], dtype=np.float64),
        heat_gain_rate=columns[11],
        core_temperature=None if model.interior is None else columns[13],
        surface_temperature=None if model.interior is None else columns[14],
    )


def _series(model: ChamberModel, load: LoadModel, run: _Run, points: int) -> ChamberStates:
    end = run.segments[-1].end
    times = np.linspace(0.0, end, points)
    times = np.unique(np.concatenate([times, [event[1] for event in run.events]]))
    ys = np.empty((model.state_size, times.size))
    regimes: list[Regime] = ["sealed"] * times.size
    for number, segment in enumerate(run.segments):
        last = number == len(run.segments) - 1
        mask = (times >= segment.start) & ((times < segment.end) | last)
        if not mask.any():
            continue
        ys[:, mask] = segment.solution(times[mask])
        for index in np.flatnonzero(mask):
            regimes[int(index)] = segment.regime
    return _states(model, load, times, ys, regimes)


def _value_at(run: _Run, time: float) -> tuple[FloatArray, Regime] | None:
    for segment in run.segments:
        if segment.start <= time <= segment.end:
            return np.asarray(segment.solution(time), dtype=np.float64), segment.regime
    return None


def _schedule(
    model: ChamberModel, case: VacuumChamberCase, run: _Run
) -> tuple[list[ScheduleCheck], list[tuple[str, float, FloatArray, Regime, str]]]:
    checks: list[ScheduleCheck] = []
    missed: list[tuple[str, float, FloatArray, Regime, str]] = []
    location = _location(case)
    where = "product" if case.product.interior is None else f"product's {location}"
    for limit in sorted(case.schedule, key=lambda item: item.time):
        found = _value_at(run, limit.time)
        if found is None:
            target = case.target_temperature
            # the process ended at its target before this time: met if the target is within
            reached = (
                run.end_reason == "target-reached"
                and target is not None
                and target <= limit.temperature
            )
            met = True if reached else None
            checks.append(ScheduleCheck(limit.time, limit.temperature, None, met, location))
            continue
        y, regime = found
        saved, saved_supercooled = model.regime, model.product.supercooled
        model.regime = regime
        model.product.supercooled = model.product.supercooled_at(limit.time)
        temperature = _located(model.rates(y), location)
        model.regime, model.product.supercooled = saved, saved_supercooled
        met = temperature <= limit.temperature
        checks.append(ScheduleCheck(limit.time, limit.temperature, temperature, met, location))
        if not met:
            missed.append(
                (
                    "schedule-limit-missed",
                    limit.time,
                    y,
                    regime,
                    f"The {where} is at {temperature:.6g} K, above the schedule's limit of "
                    f"{limit.temperature:.6g} K at this time.",
                )
            )
    return checks, missed


def _interior_statement(case: VacuumChamberCase) -> str:
    interior = case.product.interior
    assert interior is not None
    surface = {
        "slab": "both faces",
        "cylinder": "its side (ends neglected)",
        "sphere": "its surface",
    }
    fractions = None if case.product.composition is None else case.product.composition.fractions()
    start = case.product.initial_temperature
    conductivity = interior.thermal_conductivity
    if conductivity is None:
        assert fractions is not None
        conductivity = composition_conductivity(fractions, start)
    density = interior.density
    if density is None:
        assert fractions is not None
        density = composition_density(fractions, start)
    return (
        f"Product interior: identical {interior.geometry}s of half-thickness or radius "
        f"{interior.half_thickness_or_radius:g} m losing heat and water through "
        f"{surface[interior.geometry]}; transient conduction on {interior.nodes} radial nodes "
        "(finite volumes, centre to surface; method of lines in the same stiff integrator), "
        "each node's phases in equilibrium and its temperature recovered from its energy and "
        "water on the equilibrium path; constant conductivity "
        f"{conductivity:.4g} W/(m K) and density {density:.4g} kg/m3 "
        + (
            "as given"
            if interior.thermal_conductivity is not None and interior.density is not None
            else "(those not given from the composition by Choi and Okos 1986 at the initial "
            "temperature, parallel model, non-porous)"
        )
        + ". Evaporation, heat gain and the companions act on the surface node; liquid "
        "water moves to the surface without resistance, so the water content stays uniform "
        "(each node gives up its share of the evaporated water at its own liquid enthalpy; "
        "a real product dries from its surface inward). "
        + (
            "No water evaporates inside the product (non-porous): for a porous product "
            "(bread, produce) give pore_venting_time, else its core cools more slowly here "
            "than it may in practice. "
            if interior.pore_venting_time is None
            else "Pores: an interior node whose vapor pressure exceeds the chamber pressure "
            "boils, its energy above the boiling point, (p_i - p) / (dp_i/dE_i), leaving "
            f"as latent heat with the time constant {interior.pore_venting_time:g} s "
            "(a stated model without a published value: fit it to a logged core "
            "temperature); below the boiling point no vapor leaves the pores. "
        )
        + "Unfrozen product only: the "
        "simulation stops when ice appears in any node. product_temperature is the volume "
        "mean; target and schedule apply to the "
        f"{interior.target_applies_to} temperature."
    )


def _assumptions(case: VacuumChamberCase) -> tuple[str, ...]:
    items = [
        "Chamber gas: ideal-gas mixture of air and water vapor, well mixed, isothermal at the "
        "chamber temperature; the air leaking in is at that temperature.",
        "Air balance V dp_a/dt = Q_leak - S_eff(p) p_a; vapor balance dm_v/dt = j - S_eff m_v/V "
        "- j_condenser; the pump takes each gas at its partial density.",
        "Pump: S_eff(p) = S(p) (1 - p_ult/p) above the ultimate pressure, 0 at or below it; "
        "S(p) nominal or the speed curve interpolated linearly in ln p, constant beyond its ends.",
        _interior_statement(case)
        if case.product.interior is not None
        else "Product: uniform temperature; its phases (liquid, ice, solution) in equilibrium with "
        "each other at every instant; state recovered from its water mass and energy through "
        "the equilibrium path"
        + (
            " (no supercooling: ice forms at the freezing onset)."
            if case.product.nucleation_temperature is None
            else f"; supercooled liquid (no ice) down to the nucleation temperature "
            f"{case.product.nucleation_temperature:.6g} K, then an instantaneous, adiabatic "
            "recalescence to the freezing line at the same energy and water mass, with no "
            "evaporation during the jump (as in the flash-freeze balance)."
        ),
        "Vapor leaves (or reaches) the product with the enthalpy of saturated vapor at the "
        "product temperature. The condensed phases are taken at their own vapor pressure: "
        "the pressure work V dp as the chamber falls from its initial pressure is neglected, "
        f"about {_LIQUID_VOLUME * case.chamber.initial_pressure / 1000.0:.2g} kJ per kg of "
        "water here (1e-3 m3/kg times the initial pressure), a few 1e-4 of a typical cooling "
        "load.",
        "Properties: IAPWS-95 (liquid, supercooled liquid, vapor), IAPWS R10-06 (ice Ih), "
        "IAPWS R14-08 (sublimation pressure), through piecewise Chebyshev tables fitted to "
        "the balances' equilibrium paths.",
        "Evaporated mass = water the product lost; ice_fraction = ice mass / initial water "
        "mass; evaporated_fraction_of_water = evaporated mass / initial water mass.",
        "Schedule: a limit is met when the product is at or below it at its time; a limit "
        "after the process ended at a target at or below it counts as met.",
        f"Integration: scipy solve_ivp LSODA, rtol {_RELATIVE_TOLERANCE:g}, in segments "
        "between events; events located on the dense output.",
    ]
    if case.product.evaporation == "kinetic":
        size = _characteristic_size(case)
        items.append(
            "Evaporation (kinetic): the Hertz-Knudsen-Langmuir surface flux j = alpha A "
            "(p_eq(T) - p_i) / sqrt(2 pi R T) in series with vapor diffusion through the "
            "chamber air, j = A k_c p / (R T_f) ln(p_a / (p - p_i)) (Stefan flow through "
            "stagnant air, log-mean form; p_i the vapor pressure between the two resistances, "
            "T_f the mean of product and chamber temperatures); negative j is condensation "
            "onto the product."
        )
        items.append(
            "Air's resistance: k_c = Sh D / L with D the diffusivity of water vapor in air by "
            "Fuller, Schettler and Giddings (Poling, Prausnitz and O'Connell, The Properties "
            "of Gases and Liquids, 5th ed., eq. 11-4.4; D p independent of pressure) and Sh "
            "of a sphere of diameter L in still gas from Churchill's natural-convection "
            "correlation by the heat and mass transfer analogy (Incropera et al., "
            "Fundamentals of Heat and Mass Transfer, 6th ed., eq. 9.35), buoyancy from the "
            "air-vapor densities at the surface and in the chamber; L = "
            f"{size:g} m"
            + (" (default)" if case.product.characteristic_size is None else "")
            + ". Still gas: forced flow in the chamber (pump suction, fans) is ignored, so "
            "the air's resistance is an upper bound; the flux tends to the surface flux as "
            "the air is pumped out."
        )
    else:
        items.append(
            "Evaporation (equilibrium): none while the chamber pressure is above the product's "
            "vapor pressure (evaporation into the air neglected); from the flash point on, the "
            "product boils and holds the chamber at its vapor pressure, p_a + p_v = p_eq."
        )
    if case.condenser is not None:
        items.append(
            "Condenser: captures C (p_v - p_sub(T_c)) / (R T_g) of vapor (C its vapor "
            "conductance), capped by refrigeration capacity / (h_v(T_g) - h_ice(T_c)); load = "
            "capture x (h_v(T_g) - h_ice(T_c)); its ice never sublimes back; capacity exceeded "
            "is reported but capture continues."
        )
    if case.heat_gain is not None:
        items.append(_heat_gain_statement(case.heat_gain))
    else:
        items.append("Adiabatic product: no heat exchange with shelf, walls or air.")
    if case.companions:
        items.append("Companion masses have constant specific heats and the product temperature.")
    if case.product.composition is not None:
        items.append(
            "Non-water part: Choi and Okos (1986) specific heats of protein, fat, carbohydrate, "
            "fiber and ash (coefficients from memory)."
        )
    if case.product.interior is not None:
        items.append(
            "Food safety: the core temperature here is the centre of an idealised shape with "
            "uniform properties; the real coldest-to-cool point, its probe position and the "
            "cooling limits and times that apply are set by local food codes and licensed "
            "practice (HACCP plan), not by this simulation."
        )
    if case.product.solute is not None:
        model = case.product.solute.activity_model
        items.append(
            (
                "Solute: ideal (Raoult) solution with effective molar mass and van 't Hoff "
                "factor (Heldman 1974)"
                if model is None
                else f"Solute: {model.source}; tabulated for the run (brine in equilibrium "
                "with ice against temperature, activity without ice at the freezing onset's "
                "temperature)"
            )
            + "; vapor pressure a_w p_liquid(T); part of the non-water mass, its heat in the "
            "solids' specific heat; no heat of mixing; the simulation stops where the brine "
            "leaves the model's range (sodium chloride: the eutectic)."
        )
        if case.product.solute.name == "ethanol":
            items.append(ETHANOL_CAUTION)
    return tuple(items)


def _warnings(
    case: VacuumChamberCase,
    load: LoadModel,
    run: _Run,
    series: ChamberStates,
    checks: list[ScheduleCheck],
    drift: float,
    condenser: CondenserCapture | None,
) -> tuple[Advisory, ...]:
    items: list[Advisory] = []
    names = {event[0] for event in run.events}
    if "condenser-capacity-exceeded" in names:
        items.append(
            Advisory(
                "condenser-capacity-exceeded",
                "The condenser holds more ice than its capacity before the end; results after "
                "that time assume it keeps capturing.",
            )
        )
    if any(check.met is False for check in checks):
        items.append(Advisory("schedule-missed", "The product misses at least one schedule limit."))
    if any(check.met is None for check in checks):
        items.append(
            Advisory(
                "schedule-not-evaluated",
                "The simulation ended before at least one schedule time; that limit is not "
                "evaluated.",
            )
        )
    if case.target_temperature is not None and run.end_reason != "target-reached":
        items.append(
            Advisory(
                "target-not-reached",
                "The product does not reach the target temperature within the simulation.",
            )
        )
    if "flash-point" not in names:
        items.append(
            Advisory(
                "no-flash-point",
                "The chamber pressure never falls to the product's vapor pressure.",
            )
        )
    interior_froze = case.product.interior is not None and "freezing-starts" in names
    if run.end_reason in ("model-range-left", "water-exhausted"):
        detail = "interior-freezing" if interior_froze else run.end_reason
        items.append(Advisory(run.end_reason, _detail(detail, "sealed")))
    if case.product.solute is not None:
        items.append(
            Advisory(
                "metastable",
                "Liquid water below 273.16 K (in the solution) uses the metastable extension "
                "of IAPWS-95.",
            )
        )
        activity = load.thermodynamics.water_activity(
            float(series.evaporated_mass[-1]), float(series.ice_fraction[-1]), load.water_mass
        )
        if activity < _SOLUTION_ACTIVITY_WARNING:
            items.append(
                Advisory(
                    "solution-concentrated",
                    f"The unfrozen solution ends with a water activity below "
                    f"{_SOLUTION_ACTIVITY_WARNING}; "
                    + (
                        "the ideal-solution model is outside its reliable range."
                        if case.product.solute is None or case.product.solute.activity_model is None
                        else "the brine is concentrated: check it against the solute's "
                        "validated range."
                    ),
                )
            )
    if load.composition_rescaled:
        items.append(
            Advisory(
                "composition-rescaled",
                "The composition's mass fractions did not sum to 1 and were rescaled.",
            )
        )
    if case.product.evaporation == "kinetic" and float(np.min(series.evaporation_rate)) < 0.0:
        items.append(
            Advisory(
                "condensation-on-product",
                "At times the chamber vapor pressure exceeds the product's vapor pressure and "
                "vapor condenses onto the product.",
            )
        )
    if case.product.evaporation == "kinetic":
        limited = _air_limited_advisory(series)
        if limited is not None:
            items.append(limited)
        into_air = _evaporation_into_air_advisory(load, run, series)
        if into_air is not None:
            items.append(into_air)
    if condenser is not None and condenser.surface_pressure >= float(series.vapor_pressure[-1]):
        items.append(
            Advisory(
                "condenser-too-warm",
                "The condenser's sublimation pressure is not below the final chamber vapor "
                "pressure: it no longer captures vapor at the end.",
            )
        )
    if drift > _DRIFT_WARNING:
        items.append(
            Advisory(
                "constraint-drift",
                f"The chamber vapor mass drifted {drift:.2g} (relative) from the boiling "
                "constraint during integration.",
            )
        )
    return tuple(items)


def _characteristic_size(case: VacuumChamberCase) -> float:
    size = case.product.characteristic_size
    return DEFAULT_CHARACTERISTIC_SIZE if size is None else float(size)


def _air_flux_ratio(case: VacuumChamberCase, series: ChamberStates) -> FloatArray:
    """At each series point, the kinetic flux with the air's resistance over the surface
    flux alone (1 where the surface flux is not positive)."""
    product = case.product
    flux = AirLimitedEvaporation(
        float(product.exposed_area or 0.0),
        float(product.evaporation_coefficient or 0.0),
        _characteristic_size(case),
        case.chamber.temperature,
    )
    surface = (
        series.product_temperature
        if series.surface_temperature is None
        else series.surface_temperature
    )
    ratio = np.ones(series.time.size)
    for index in range(series.time.size):
        solved = flux.solve(
            float(surface[index]),
            float(series.product_vapor_pressure[index]),
            float(series.vapor_pressure[index]),
            float(series.air_pressure[index]),
        )
        if solved.kinetic_rate > 0.0:
            ratio[index] = max(solved.rate, 0.0) / solved.kinetic_rate
    return ratio


def _air_limited_advisory(series: ChamberStates) -> Advisory | None:
    """A warning when the air limits the evaporation at some series points."""
    ratio = series.air_flux_ratio
    if ratio is None:
        return None
    limited = series.time[ratio < _AIR_LIMITED_SHARE]
    if not limited.size:
        return None
    slowest = float(np.min(ratio))
    return Advisory(
        "air-limited-evaporation",
        "Diffusion of vapor through the chamber air limits the evaporation (the flux is below "
        f"half the surface flux alone) at times from {limited[0]:.4g} s to {limited[-1]:.4g} s; "
        f"at its strongest the air cuts the flux to {slowest:.2g} of the surface flux. The "
        "air's resistance comes from a still-gas correlation for a sphere of the product's "
        "characteristic size: give product.characteristic_size for the real items.",
    )


def _evaporation_into_air_advisory(
    load: LoadModel, run: _Run, series: ChamberStates
) -> Advisory | None:
    """A warning when the kinetic product evaporates much before the flash point."""
    total = float(series.evaporated_mass[-1])
    flash = next((event for event in run.events if event[0] == "flash-point"), None)
    before = total if flash is None else load.water_mass - float(flash[2][WATER])
    if total <= 0.0 or before <= _INTO_AIR_SHARE * total:
        return None
    when = (
        "the chamber pressure never fell to the product's vapor pressure"
        if flash is None
        else f"the chamber pressure fell to the product's vapor pressure (at {flash[1]:.4g} s)"
    )
    return Advisory(
        "evaporation-into-air",
        f"{before:.3g} kg ({before / total:.0%} of the water evaporated) left the product by "
        f"evaporation into the chamber air before {when}. The equilibrium mode neglects that "
        "evaporation, so this kinetic run may cool the product sooner than the equilibrium "
        "mode does.",
    )


def _event_record(
    model: ChamberModel,
    load: LoadModel,
    event: tuple[str, float, FloatArray, Regime, str],
) -> SimulationEvent:
    name, time, y, regime, detail = event
    state = _states(model, load, np.array([time]), np.asarray(y)[:, None], [regime])
    return SimulationEvent(name=name, time=time, state=state, detail=detail)


def _first(run: _Run, name: str) -> float | None:
    return next((event[1] for event in run.events if event[0] == name), None)


def simulate_vacuum_chamber(case: VacuumChamberCase) -> VacuumChamberResult:
    """Simulate a vacuum chamber with its pump, condenser and product over time.

    Parameters
    ----------
    case : VacuumChamberCase
        Chamber, pump, optional condenser, product, companions, heat gain, end
        conditions and schedule (SI scalars).

    Returns
    -------
    VacuumChamberResult
        Events, time series, summary, mass and energy balance, schedule check,
        assumptions, warnings, model references and property sources.

    Raises
    ------
    InvalidInputError
        Non-finite, malformed or conflicting input.
    OutOfRangeError
        An input outside its range (the error names the field by its dotted path).
    UnsupportedStateError
        Equilibrium evaporation with a chamber that starts below the product's vapor
        pressure.
    NotConvergedError
        The ODE solver failed.

    Notes
    -----
    V dp_a/dt = Q_leak - S_eff p_a; dm_v/dt = j - S_eff m_v / V - j_c; dm/dt = -j;
    dE/dt = Q_gain - h_v j; temperature and ice from (E, m) on the equilibrium path.
    See :mod:`service.core.simulation.chamber_model`.

    References
    ----------
    Wang and Sun, Int. J. Refrig. 25 (2002); O'Hanlon, A User's Guide to Vacuum
    Technology, 3rd ed. (2003); IAPWS R6-95(2018), R10-06(2009), R14-08(2011).

    Examples
    --------
    >>> from service.core.simulation import Chamber, Product, Pump, VacuumChamberCase
    >>> result = simulate_vacuum_chamber(VacuumChamberCase(
    ...     chamber=Chamber(free_volume=0.5, initial_pressure=101325.0, temperature=293.15),
    ...     pump=Pump(nominal_speed=0.05, ultimate_pressure=10.0),
    ...     product=Product(mass=1.0, initial_temperature=293.15),
    ...     end_time=600.0, target_temperature=278.15))
    >>> result.summary.end_reason
    'target-reached'
    """
    validate_case(case)
    load = load_model(case.product, case.companions)
    chamber = case.chamber
    gas_vapor_enthalpy = float(
        fluid_properties_at(chamber.temperature, 100.0, phase="vapor").specific_enthalpy
    )
    product = case.product
    evaporation = (
        AirLimitedEvaporation(
            float(product.exposed_area or 0.0),
            float(product.evaporation_coefficient or 0.0),
            _characteristic_size(case),
            chamber.temperature,
        )
        if product.evaporation == "kinetic"
        else None
    )
    interior = (
        None
        if product.interior is None
        else InteriorConduction(
            product, load.water_mass, load.solids_coefficients, heat_capacity(case.companions)
        )
    )
    model = ChamberModel(
        volume=chamber.free_volume,
        gas_temperature=chamber.temperature,
        leak_rate=chamber.leak_rate,
        pump=PumpingSpeed(case.pump),
        condenser=None
        if case.condenser is None
        else CondenserCapture(case.condenser, chamber.temperature, gas_vapor_enthalpy),
        product=load.thermodynamics,
        evaporation=evaporation,
        heat_gain=case.heat_gain,
        interior=interior,
    )
    _check_nucleation(product, load.freezing_onset)
    model.product.supercooling = product.nucleation_temperature is not None
    model.product.supercooled = model.product.supercooling
    model.start_from(product.initial_temperature)
    initial = np.zeros(model.state_size)
    initial[AIR] = chamber.initial_pressure
    initial[VAPOR] = chamber.initial_vapor_pressure * model.vapor_per_pressure
    initial[WATER] = load.water_mass
    initial[ENERGY] = load.initial_energy
    if interior is not None:
        initial[STATE_SIZE:] = interior.initial_energies(product.initial_temperature)[:-1]
    start = model.rates(initial)
    if model.regime == "sealed" and start.total_pressure <= start.product.equilibrium_pressure:
        raise UnsupportedStateError(
            "chamber.initial_pressure",
            f"the chamber starts at {start.total_pressure:.6g} Pa, at or below the product's "
            f"vapor pressure {start.product.equilibrium_pressure:.6g} Pa: the product would "
            "boil at once; the equilibrium model needs a chamber that starts above it (use "
            "kinetic evaporation)",
            start.total_pressure,
        )
    run = _integrate(model, case, load, initial)
    checks, missed = _schedule(model, case, run)
    run.events.extend(missed)
    run.events.sort(key=lambda event: event[1])
    series = _series(model, load, run, case.series_points)
    if product.evaporation == "kinetic":
        series = replace(series, air_flux_ratio=_air_flux_ratio(case, series))
    final = np.asarray(run.segments[-1].solution(run.segments[-1].end))
    last_regime = run.segments[-1].regime
    model.regime = last_regime
    final_rates = model.rates(final)
    water0 = load.water_mass
    drift = 0.0
    if last_regime == "boiling":
        constrained = final_rates.vapor_pressure * model.vapor_per_pressure
        drift = abs(float(final[VAPOR]) - constrained) / water0
    vapor0 = float(initial[VAPOR])
    mass_residual = (
        water0 + vapor0 - float(final[WATER] + final[VAPOR] + final[PUMPED] + final[CONDENSED])
    )
    energy_residual = float(
        load.initial_energy + final[HEAT_GAINED] - final[ENERGY] - final[VAPOR_ENTHALPY]
    )
    vapor_enthalpy = float(final[VAPOR_ENTHALPY])
    balance = MassEnergyBalance(
        initial_water=water0,
        final_water=float(final[WATER]),
        initial_chamber_vapor=vapor0,
        final_chamber_vapor=float(final[VAPOR]),
        vapor_to_pump=float(final[PUMPED]),
        vapor_to_condenser=float(final[CONDENSED]),
        mass_residual=mass_residual,
        relative_mass_residual=mass_residual / water0,
        initial_energy=load.initial_energy,
        final_energy=float(final[ENERGY]),
        vapor_enthalpy=vapor_enthalpy,
        heat_gained=float(final[HEAT_GAINED]),
        energy_residual=energy_residual,
        relative_energy_residual=energy_residual / max(abs(vapor_enthalpy), 1.0),
    )
    evaporated = water0 - float(final[WATER])
    summary = SimulationSummary(
        end_reason=run.end_reason,
        end_time=run.segments[-1].end,
        flash_time=_first(run, "flash-point"),
        freezing_start_time=_first(run, "freezing-starts"),
        fully_frozen_time=_first(run, "fully-frozen"),
        target_time=_first(run, "target-reached"),
        final_temperature=final_rates.product.temperature,
        final_pressure=final_rates.total_pressure,
        evaporated_mass=evaporated,
        evaporated_fraction_of_water=evaporated / water0,
        ice_mass=final_rates.product.ice_mass,
        vapor_to_pump=float(final[PUMPED]),
        vapor_to_condenser=float(final[CONDENSED]),
        condenser_energy=float(final[CONDENSER_HEAT]),
        peak_condenser_load=float(np.max(series.condenser_load)),
        peak_vapor_mass_flow_to_pump=float(np.max(series.vapor_mass_flow_to_pump)),
        peak_evaporation_rate=float(np.max(series.evaporation_rate)),
        schedule_met=None if not checks else all(check.met is True for check in checks),
        solver_steps=run.steps,
        right_hand_side_evaluations=model.evaluations,
        final_core_temperature=None if interior is None else final_rates.core_temperature,
        final_surface_temperature=None if interior is None else final_rates.surface_temperature,
        target_applies_to=_location(case),
    )
    return VacuumChamberResult(
        events=tuple(_event_record(model, load, event) for event in run.events),
        series=series,
        summary=summary,
        balance=balance,
        schedule=tuple(checks),
        assumptions=_assumptions(case),
        warnings=_warnings(case, load, run, series, checks, drift, model.condenser),
        references=REFERENCES if interior is None else (*REFERENCES, *_INTERIOR_REFERENCES),
        property_sources=(IAPWS_95, ICE_IH, MELTING_AND_SUBLIMATION),
        property_uncertainties=tuple(path_uncertainties(series.product_temperature)),
        checks=equipment_checks(case, series, float(final[PUMPED])),
    )
