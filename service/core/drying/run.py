"""Primary drying of a batch over a recipe: the quasi-steady front balance integrated in
time, with its events and the ice balance."""

from __future__ import annotations

import itertools
from dataclasses import dataclass
from typing import Any, Final

import numpy as np
from scipy.integrate import solve_ivp
from scipy.optimize import brentq

from service.core.deadline import check_deadline
from service.core.drying.cases import PrimaryDryingCase
from service.core.drying.front import (
    STATUS_FRONT_AT_TRIPLE_POINT,
    SublimationFront,
    solve_sublimation_front,
)
from service.core.drying.references import ASSUMPTIONS, REFERENCES
from service.core.properties.advisories import Advisory
from service.core.properties.lookups import ReportedUncertainty, path_uncertainties
from service.core.properties.phase import FloatArray
from service.core.properties.phase_lines import sublimation_temperature
from service.core.properties.sources import (
    IAPWS_95,
    ICE_IH,
    MELTING_AND_SUBLIMATION,
    PropertySource,
)

__all__ = [
    "DryingEvent",
    "DryingStates",
    "IceBalance",
    "PrimaryDryingResult",
    "PrimaryDryingSummary",
    "simulate_primary_drying",
]

_RELATIVE_TOLERANCE: Final = 1.0e-11
_DETECTION_POINTS: Final = 4001
_QUADRATURE_NODES: Final = 64


@dataclass(frozen=True)
class DryingStates:
    """The batch at a set of times (SI arrays; "per container" unless named batch)."""

    time: FloatArray
    shelf_temperature: FloatArray
    chamber_pressure: FloatArray
    front_temperature: FloatArray
    bottom_temperature: FloatArray
    dried_layer_thickness: FloatArray
    frozen_layer_thickness: FloatArray
    ice_mass: FloatArray
    sublimation_rate: FloatArray
    batch_sublimation_rate: FloatArray
    heat_flow: FloatArray
    batch_heat_flow: FloatArray
    heat_transfer_coefficient: FloatArray
    dried_layer_resistance: FloatArray
    latent_heat: FloatArray
    ice_vapor_pressure: FloatArray
    condenser_ice: FloatArray


@dataclass(frozen=True)
class DryingEvent:
    """Something that happened at one time, with the batch's state then."""

    name: str
    time: float
    detail: str
    state: DryingStates


@dataclass(frozen=True)
class IceBalance:
    """Ice of the batch: initial = remaining + sublimed, the sublimed mass integrated from
    the sublimation rate (64-point Gauss-Legendre per recipe segment) independently of the
    ice mass the time integration carries."""

    initial_ice: float
    remaining_ice: float
    sublimed_ice: float
    residual: float
    relative_residual: float


@dataclass(frozen=True)
class PrimaryDryingSummary:
    """Headline numbers (SI; None where the event did not happen)."""

    end_reason: str
    end_time: float
    drying_time: float | None
    maximum_front_temperature: float
    maximum_bottom_temperature: float
    critical_temperature_first_exceeded: float | None
    time_above_critical_temperature: float
    peak_batch_sublimation_rate: float
    equipment_limit_first_exceeded: float | None
    condenser_capacity_reached: float | None
    solver_steps: int


@dataclass(frozen=True)
class PrimaryDryingResult:
    """Output of :func:`simulate_primary_drying`."""

    series: DryingStates
    events: tuple[DryingEvent, ...]
    summary: PrimaryDryingSummary
    balance: IceBalance
    equipment_rate_limit: FloatArray | None
    critical_temperature: float
    assumptions: tuple[str, ...]
    references: tuple[str, ...]
    warnings: tuple[Advisory, ...]
    property_sources: tuple[PropertySource, ...]
    property_uncertainties: tuple[ReportedUncertainty, ...]


class _Run:
    """The case with its geometry, and the front solved at (time, ice mass)."""

    def __init__(self, case: PrimaryDryingCase) -> None:
        self.case = case
        self.ice0 = case.load.ice_mass
        self.depth = case.load.fill_depth

    def settings(self, times: FloatArray) -> tuple[FloatArray, FloatArray]:
        pairs = [self.case.recipe.at(float(t)) for t in times]
        return np.array([p[0] for p in pairs]), np.array([p[1] for p in pairs])

    def front(self, times: FloatArray, ice: FloatArray) -> tuple[SublimationFront, FloatArray]:
        load = self.case.load
        remaining = np.clip(ice / self.ice0, 0.0, 1.0)  # the integrator may overshoot 0
        frozen = self.depth * remaining
        shelf, pressure = self.settings(times)
        solved = solve_sublimation_front(
            shelf,
            pressure,
            self.depth - frozen,
            frozen,
            heat_transfer=self.case.heat_transfer,
            resistance=self.case.resistance,
            heat_transfer_area=load.heat_transfer_area,
            product_area=load.product_area,
            frozen_conductivity=load.frozen_conductivity,
        )
        return solved, frozen

    def states(self, times: FloatArray, ice: FloatArray) -> tuple[DryingStates, FloatArray]:
        solved, frozen = self.front(times, ice)
        shelf, pressure = self.settings(times)
        count = self.case.load.container_count
        states = DryingStates(
            time=times,
            shelf_temperature=shelf,
            chamber_pressure=pressure,
            front_temperature=solved.front_temperature,
            bottom_temperature=solved.bottom_temperature,
            dried_layer_thickness=self.depth - frozen,
            frozen_layer_thickness=frozen,
            ice_mass=np.maximum(ice, 0.0),
            sublimation_rate=solved.sublimation_rate,
            batch_sublimation_rate=count * solved.sublimation_rate,
            heat_flow=solved.heat_flow,
            batch_heat_flow=count * solved.heat_flow,
            heat_transfer_coefficient=solved.heat_transfer_coefficient,
            dried_layer_resistance=solved.dried_layer_resistance,
            latent_heat=solved.latent_heat,
            ice_vapor_pressure=solved.ice_vapor_pressure,
            condenser_ice=count * (self.ice0 - np.maximum(ice, 0.0)),
        )
        return states, solved.status.astype(np.float64)


class _Solution:
    """Piecewise dense output of the ice mass over the run."""

    def __init__(self) -> None:
        self.pieces: list[tuple[float, float, Any]] = []

    def ice(self, times: FloatArray) -> FloatArray:
        values = np.empty_like(times)
        for index, time in enumerate(times):
            for start, end, dense in self.pieces:
                if time <= end or (start, end, dense) == self.pieces[-1]:
                    values[index] = float(dense(min(max(time, start), end))[0])
                    break
        return values


def _onsets(run: _Run, starts: list[float]) -> list[float]:
    """Times inside recipe segments where sublimation starts or stops (the shelf crosses
    the chamber's frost point), so that no integration piece holds that kink."""
    recipe = run.case.recipe
    ends = [*starts[1:], run.case.maximum_duration]

    def margin(time: float) -> float:
        shelf, pressure = recipe.at(time)
        return shelf - float(sublimation_temperature(pressure))

    found: list[float] = []
    for start, end in zip(starts, ends, strict=True):
        if end <= start or (start >= float(recipe.times[-1])):
            continue
        samples = np.linspace(start, end, 65)
        values = np.array([margin(float(t)) for t in samples])
        for index in np.flatnonzero(np.sign(values[1:]) != np.sign(values[:-1])):
            low, high = float(samples[index]), float(samples[index + 1])
            if margin(low) * margin(high) < 0.0:
                found.append(float(brentq(margin, low, high, xtol=1e-9, rtol=1e-14)))
    return found


def _integrate(run: _Run) -> tuple[_Solution, float, bool, int]:
    """Integrate dm/dt = -sublimation rate until the ice is gone or the time is up."""
    case = run.case
    breaks = [float(t) for t in case.recipe.breaks() if 0.0 < t < case.maximum_duration]
    edges = sorted({0.0, *breaks, *_onsets(run, [0.0, *breaks]), case.maximum_duration})
    solution = _Solution()
    ice = run.ice0
    steps = 0

    def rate(time: float, state: FloatArray) -> FloatArray:
        check_deadline()  # a caller's time limit stops the integration here
        solved, _ = run.front(np.array([time]), state)
        return -solved.sublimation_rate

    def exhausted(time: float, state: FloatArray) -> float:
        return float(state[0])

    exhausted.terminal = True  # type: ignore[attr-defined]
    exhausted.direction = -1.0  # type: ignore[attr-defined]
    for start, end in itertools.pairwise(edges):
        if end <= start:
            continue
        result = solve_ivp(
            rate,
            (start, end),
            np.array([ice]),
            method="RK45",
            rtol=_RELATIVE_TOLERANCE,
            atol=_RELATIVE_TOLERANCE * run.ice0,
            dense_output=True,
            events=exhausted,
        )
        steps += int(result.t.size - 1)
        finish = float(result.t[-1])
        solution.pieces.append((start, finish, result.sol))
        ice = float(result.y[0, -1])
        if result.status == 1:
            return solution, finish, True, steps
    return solution, case.maximum_duration, False, steps


def _crossings(values: FloatArray) -> list[tuple[int, int]]:
    """(index before, +1 rising / -1 falling) where ``values`` changes sign."""
    positive = values > 0.0
    changes = np.flatnonzero(positive[1:] != positive[:-1])
    return [(int(i), 1 if positive[i + 1] else -1) for i in changes]


def _refine(function: Any, low: float, high: float) -> float:
    if function(low) == 0.0 or low == high:
        return low
    return float(brentq(function, low, high, xtol=1.0e-6, rtol=1.0e-12))


def simulate_primary_drying(case: PrimaryDryingCase) -> PrimaryDryingResult:
    """Primary drying of a batch of vials (or trays) over a shelf and pressure recipe.

    Parameters
    ----------
    case : PrimaryDryingCase
        Load, K_v and R_p constants, recipe, limits (SI).

    Returns
    -------
    PrimaryDryingResult
        Time series, events, summary (drying time), ice balance, assumptions, references,
        property sources and their stated uncertainties.

    Raises
    ------
    OutOfRangeError, InvalidInputError
        For an input outside the model's range, naming the request field.

    Notes
    -----
    The ice mass per container m obeys ``dm/dt = -A_p (p_sub(T_f) - P_c) / R_p(l)`` with
    ``l = L_0 (1 - m / m_0)`` and ``T_f`` from the quasi-steady balance of
    :func:`service.core.drying.front.solve_sublimation_front` at the recipe's shelf
    temperature and chamber pressure. Integrated by RK45 (rtol 1e-11) piece by piece between
    set points, ending when the ice is gone (the drying time) or at the maximum duration.
    Events are found on a 4001-point grid and refined by Brent's method to 1e-6 s.

    References
    ----------
    M. J. Pikal, J. Parenter. Sci. Technol. 39(3), 115-139 (1985); M. J. Pikal, M. L. Roy,
    S. Shah, J. Pharm. Sci. 73(9), 1224-1237 (1984).
    """
    case.validate()
    run = _Run(case)
    solution, end_time, dry, steps = _integrate(run)
    grid = np.unique(np.concatenate([np.linspace(0.0, end_time, _DETECTION_POINTS)]))
    detection, status = run.states(grid, solution.ice(grid))

    def at(time: float) -> DryingStates:
        return run.states(np.array([time]), solution.ice(np.array([time])))[0]

    def scalar(name: str) -> Any:
        def value(time: float) -> float:
            return float(getattr(at(time), name)[0])

        return value

    events: list[DryingEvent] = []
    warnings: list[Advisory] = []
    limit_series = (
        None
        if case.equipment_limit is None
        else case.equipment_limit.at(detection.chamber_pressure)
    )

    def add_crossings(difference: FloatArray, function: Any, up: str, down: str, text: str) -> None:
        if difference[0] > 0.0:
            events.append(DryingEvent(up, 0.0, f"{text} at the start", at(0.0)))
        for index, direction in _crossings(difference):
            time = _refine(function, float(grid[index]), float(grid[index + 1]))
            name = up if direction > 0 else down
            events.append(
                DryingEvent(name, time, text if direction > 0 else "back within", at(time))
            )

    critical = case.critical_temperature
    add_crossings(
        detection.front_temperature - critical,
        lambda t: scalar("front_temperature")(t) - critical,
        "critical-temperature-exceeded",
        "back-below-critical-temperature",
        f"ice-front temperature above the critical temperature {critical:.2f} K",
    )
    if case.equipment_limit is not None and limit_series is not None:
        limit = case.equipment_limit
        add_crossings(
            detection.batch_sublimation_rate - limit_series,
            lambda t: (
                scalar("batch_sublimation_rate")(t) - float(limit.at(scalar("chamber_pressure")(t)))
            ),
            "equipment-limit-exceeded",
            "back-within-equipment-limit",
            "batch sublimation rate above the dryer's limit at this chamber pressure",
        )
    if case.condenser_capacity is not None:
        capacity = case.condenser_capacity
        over = detection.condenser_ice - capacity
        if np.any(over > 0.0):
            index = int(np.flatnonzero(over > 0.0)[0])
            time = _refine(
                lambda t: scalar("condenser_ice")(t) - capacity,
                float(grid[max(index - 1, 0)]),
                float(grid[index]),
            )
            events.append(
                DryingEvent(
                    "condenser-capacity-reached",
                    time,
                    f"condenser holds its capacity of {capacity:.6g} kg of ice",
                    at(time),
                )
            )
    melted = status == STATUS_FRONT_AT_TRIPLE_POINT
    if np.any(melted):
        index = int(np.flatnonzero(melted)[0])
        time = float(grid[index])
        events.append(
            DryingEvent(
                "front-reaches-triple-point",
                time,
                "the ice front would be warmer than 273.16 K: the ice melts, outside the model",
                at(time),
            )
        )
        warnings.append(
            Advisory(
                code="model-range-left",
                message="The ice front reaches the triple point: the ice would melt; values "
                "after this time are those at 273.16 K and not physical.",
                indices=None,
            )
        )
    if dry:
        events.append(DryingEvent("primary-drying-ends", end_time, "no ice left", at(end_time)))
    else:
        events.append(
            DryingEvent(
                "maximum-duration-reached", end_time, "ice is left at the end", at(end_time)
            )
        )
    events.sort(key=lambda event: event.time)

    series_times = np.unique(
        np.concatenate(
            [
                np.linspace(0.0, end_time, case.series_points),
                [event.time for event in events],
                [t for t in case.recipe.breaks() if t <= end_time],
            ]
        )
    )
    series, _ = run.states(series_times, solution.ice(series_times))
    balance = _ice_balance(run, solution, end_time)
    above = detection.front_temperature > critical
    first = [e.time for e in events if e.name == "critical-temperature-exceeded"]
    limit_first = [e.time for e in events if e.name == "equipment-limit-exceeded"]
    condenser = [e.time for e in events if e.name == "condenser-capacity-reached"]
    step = end_time / (_DETECTION_POINTS - 1)
    summary = PrimaryDryingSummary(
        end_reason="dry" if dry else "maximum-duration",
        end_time=end_time,
        drying_time=end_time if dry else None,
        maximum_front_temperature=float(np.max(detection.front_temperature)),
        maximum_bottom_temperature=float(np.max(detection.bottom_temperature)),
        critical_temperature_first_exceeded=first[0] if first else None,
        time_above_critical_temperature=float(np.count_nonzero(above) * step),
        peak_batch_sublimation_rate=float(np.max(detection.batch_sublimation_rate)),
        equipment_limit_first_exceeded=limit_first[0] if limit_first else None,
        condenser_capacity_reached=condenser[0] if condenser else None,
        solver_steps=steps,
    )
    return PrimaryDryingResult(
        series=series,
        events=tuple(events),
        summary=summary,
        balance=balance,
        equipment_rate_limit=None
        if case.equipment_limit is None
        else case.equipment_limit.at(series.chamber_pressure),
        critical_temperature=critical,
        assumptions=ASSUMPTIONS,
        references=REFERENCES,
        warnings=tuple(warnings),
        property_sources=(MELTING_AND_SUBLIMATION, ICE_IH, IAPWS_95),
        property_uncertainties=tuple(path_uncertainties(series.front_temperature)),
    )


def _ice_balance(run: _Run, solution: _Solution, end_time: float) -> IceBalance:
    nodes, weights = np.polynomial.legendre.leggauss(_QUADRATURE_NODES)
    sublimed = 0.0
    for start, end, _ in solution.pieces:
        if end <= start:
            continue
        times = 0.5 * (end - start) * nodes + 0.5 * (end + start)
        solved, _ = run.front(times, solution.ice(times))
        sublimed += 0.5 * (end - start) * float(np.dot(weights, solved.sublimation_rate))
    count = run.case.load.container_count
    initial = count * run.ice0
    remaining = count * max(float(solution.ice(np.array([end_time]))[0]), 0.0)
    residual = initial - remaining - count * sublimed
    return IceBalance(
        initial_ice=initial,
        remaining_ice=remaining,
        sublimed_ice=count * sublimed,
        residual=residual,
        relative_residual=residual / initial,
    )
