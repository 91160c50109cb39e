"""Solve one case field for a cooling target on the chamber simulation.

One public function, :func:`size_vacuum_chamber`. The time to the target is monotone in
the fields of :data:`service.core.sizing.fields.SIZABLE_FIELDS`, so the values meeting
the target form one interval with one end in the bracket: the answer is that end (the
smallest value for a field where more helps, the largest where more hurts).

Method
------
1. Design curve: the simulation at eight values spread over the bracket (geometrically
   for positive fields, evenly for temperatures). It shows whether the bracket holds the
   boundary and checks the field's direction: the time to the target must not rise
   towards the favourable end (relative slack 1e-6).
2. Refinement between the two neighbouring curve points that straddle the boundary:
   regula falsi with the Illinois modification on g(x) = time to target(x) - target time
   (in ln x for positive fields), bisection while one side has not reached the target
   temperature (and for a schedule target, which gives only met / not met). Each new
   value is kept at least half a tolerance inside the interval, so a good estimate closes
   the interval on the next step.
3. The answer is the simulated value nearest the boundary that meets the target; its
   simulation is the forward simulation answered. The margin is the simulation at 90 %
   of the answer.

References
----------
Dowell, M. and Jarratt, P. (1971), A modified regula falsi method for computing the root
of an equation, BIT 11, 168-174 (the Illinois method; from memory).
"""

from __future__ import annotations

import itertools
import math
from dataclasses import dataclass, replace
from typing import Final

import numpy as np

from service.core.balances.scalars import require_scalar_within
from service.core.errors import InvalidInputError, OutOfRangeError, UnsupportedStateError
from service.core.properties.advisories import Advisory
from service.core.properties.constants import TRIPLE_POINT_TEMPERATURE
from service.core.properties.phase_lines import sublimation_pressure
from service.core.properties.saturation import saturation_pressure
from service.core.simulation.case_fields import case_field_value, with_case_field
from service.core.simulation.inputs import SIMULATION_LIMITS, VacuumChamberCase, validate_case
from service.core.simulation.load import load_model
from service.core.simulation.path_tables import ICE_TEMPERATURE_MIN
from service.core.simulation.results import VacuumChamberResult
from service.core.simulation.vacuum_chamber import simulate_vacuum_chamber
from service.core.sizing.fields import SizableField, default_bracket, sizable_field
from service.core.sizing.results import CoolingTarget, DesignPoint, SizingCase, SizingResult

__all__ = [
    "CURVE_POINTS",
    "MARGIN_FACTOR",
    "NoSolutionError",
    "NotMonotoneError",
    "size_vacuum_chamber",
]

CURVE_POINTS: Final = 8
"""Values of the first pass over the bracket (the refinement adds its own)."""
MARGIN_FACTOR: Final = 0.9
"""The margin is the simulation at this fraction of the answer."""
_MAX_SIMULATIONS: Final = 30
_HORIZON_FACTOR: Final = 2.0
"""Trials simulate to this multiple of the target time (or the case's end time, if
longer), so that values missing the target still show their time to it."""
_MONOTONE_SLACK: Final = 1.0e-6
_TOLERANCE_RANGE: Final = (1.0e-6, 0.05)


@dataclass
class NoSolutionError(UnsupportedStateError):
    """No value in the bracket meets the target; ``extra["limits"]`` names what stops it."""


@dataclass
class NotMonotoneError(UnsupportedStateError):
    """The design curve contradicts the direction the field is sized on."""


@dataclass(frozen=True)
class _Trial:
    value: float
    result: VacuumChamberResult
    case: VacuumChamberCase
    time: float | None
    meets: bool

    def point(self) -> DesignPoint:
        return DesignPoint(self.value, self.time, self.meets)


class _Trials:
    """Runs the simulation at values of one field and keeps every trial."""

    def __init__(self, base: VacuumChamberCase, item: SizableField, target: CoolingTarget | None):
        self.base = base
        self.item = item
        self.target = target
        self.done: list[_Trial] = []

    def run(self, value: float) -> _Trial:
        for trial in self.done:
            if trial.value == value:
                return trial
        case = with_case_field(self.base, self.item.field.path, value)
        try:
            result = simulate_vacuum_chamber(case)
        except OutOfRangeError as error:
            raise InvalidInputError(
                "bracket",
                f"the search reaches {self.item.field.path} = {value:.6g} "
                f"{self.item.field.unit}, where the simulation refuses the case ({error}); "
                "state a narrower bracket",
                value,
            ) from None
        summary = result.summary
        if self.target is None:
            time = summary.target_time
            meets = summary.schedule_met is True
        else:
            time = summary.target_time
            meets = time is not None and time <= self.target.time
        trial = _Trial(value, result, case, time, meets)
        self.done.append(trial)
        return trial


def _checked_target(case: VacuumChamberCase, target: CoolingTarget | None) -> None:
    if target is None:
        if not case.schedule:
            raise InvalidInputError(
                "target",
                "give a target (temperature and time), or a case with a schedule to meet",
            )
        return
    require_scalar_within(
        target.temperature,
        "target.temperature",
        ICE_TEMPERATURE_MIN,
        case.product.initial_temperature,
        "K",
        "the target lies below the product's initial temperature, above 173.15 K",
    )
    require_scalar_within(
        target.time,
        "target.time",
        0.0,
        SIMULATION_LIMITS["end_time_max"] / _HORIZON_FACTOR,
        "s",
        "time from the start of pumping, up to 15 days",
        exclusive_minimum=True,
    )


def _base_case(case: VacuumChamberCase, target: CoolingTarget | None) -> VacuumChamberCase:
    if target is None:
        return case
    return replace(
        case,
        target_temperature=target.temperature,
        end_time=max(case.end_time, _HORIZON_FACTOR * target.time),
    )


def _checked_bracket(
    sizing: SizingCase, item: SizableField, value: float | None
) -> tuple[float, float]:
    bracket = sizing.bracket or default_bracket(item, value)
    lower = require_scalar_within(bracket[0], "bracket.lower", None, None, item.field.unit, "")
    upper = require_scalar_within(
        bracket[1],
        "bracket.upper",
        lower,
        None,
        item.field.unit,
        "the upper end of the bracket lies above its lower end",
        exclusive_minimum=True,
    )
    return lower, upper


def _logarithmic(item: SizableField, bracket: tuple[float, float]) -> bool:
    return item.bracket == "scale" and bracket[0] > 0.0


def _grid(bracket: tuple[float, float], logarithmic: bool) -> list[float]:
    lower, upper = bracket
    if logarithmic:
        values = np.geomspace(lower, upper, CURVE_POINTS)
    else:
        values = np.linspace(lower, upper, CURVE_POINTS)
    points = [float(v) for v in values]
    points[0], points[-1] = lower, upper
    return points


def _check_monotone(ordered: list[_Trial], item: SizableField) -> None:
    """``ordered`` runs from the unfavourable to the favourable end."""
    path, unit = item.field.path, item.field.unit
    for before, after in itertools.pairwise(ordered):
        worse = (before.meets and not after.meets) or (
            before.time is not None
            and (
                after.time is None
                or after.time > before.time * (1.0 + _MONOTONE_SLACK) + _MONOTONE_SLACK
            )
        )
        if worse:
            raise NotMonotoneError(
                "find",
                f"the time to the target does not fall monotonically as {path} moves from "
                f"{before.value:.6g} to {after.value:.6g} {unit} ({_time_text(before)} then "
                f"{_time_text(after)}): the sizing assumes it does; narrow the bracket to a "
                "range where it is monotone",
                path,
            )


def _time_text(trial: _Trial) -> str:
    return "target not reached" if trial.time is None else f"{trial.time:.6g} s"


def _product_vapor_pressure(temperature: float) -> float:
    """Pure-water vapor pressure at ``temperature``: over liquid at or above the triple
    point, over ice below it (Pa)."""
    if temperature >= TRIPLE_POINT_TEMPERATURE:
        return float(saturation_pressure(temperature))
    return float(sublimation_pressure(temperature))


def _limits(case: VacuumChamberCase, trial: _Trial, temperature: float) -> list[str]:
    """The physical limits that stand between ``case`` and the product at ``temperature``."""
    limits: list[str] = []
    onset = load_model(case.product, case.companions).freezing_onset
    if temperature < onset and trial.result.summary.freezing_start_time is not None:
        limits.append(
            f"the product's freezing point ({onset:.5g} K): below it the product's water must "
            "freeze (its latent heat of fusion taken by evaporation) before it cools further"
        )
    needed = _product_vapor_pressure(temperature)
    condenser = trial.case.condenser
    trap = None if condenser is None else _product_vapor_pressure(condenser.surface_temperature)
    if trap is not None and condenser is not None and trap >= needed:
        limits.append(
            f"the trap temperature ({condenser.surface_temperature:.5g} K): the sublimation "
            f"pressure of its ice, {trap:.4g} Pa, is not below the product's vapor pressure at "
            f"the target, {needed:.4g} Pa, so the trap cannot take vapor there"
        )
    ultimate = trial.case.pump.ultimate_pressure
    if ultimate >= needed:
        limits.append(
            f"the pump's ultimate pressure ({ultimate:.4g} Pa): not below the product's vapor "
            f"pressure at the target, {needed:.4g} Pa, so the pump stops drawing before the "
            "product gets there"
        )
    return limits


def _no_solution(
    sizing: SizingCase, item: SizableField, bracket: tuple[float, float], best: _Trial
) -> NoSolutionError:
    path, unit = item.field.path, item.field.unit
    target = sizing.target
    if target is not None:
        wanted = f"{target.temperature:.5g} K within {target.time:.6g} s"
        temperature = target.temperature
    else:
        wanted = "the case's schedule"
        temperature = min(limit.temperature for limit in sizing.case.schedule)
    limits = _limits(sizing.case, best, temperature)
    reached = (
        f"reaches it after {best.time:.6g} s"
        if best.time is not None
        else f"ends at {best.result.summary.final_temperature:.5g} K"
    )
    if limits:
        cause = "Limited by " + "; and by ".join(limits) + "."
    else:
        cause = (
            "None of the physical limits (the product's freezing point, the trap temperature, "
            "the pump's ultimate pressure) stops it: the bracket ends too early, or another "
            "part of the equipment limits the rate; widen the bracket or size another field."
        )
    return NoSolutionError(
        "find",
        f"no value of {path} in [{bracket[0]:.6g}, {bracket[1]:.6g}] {unit} brings the "
        f"product to {wanted}: at the most favourable end ({best.value:.6g} {unit}) the "
        f"product {reached}. {cause}",
        path,
        extra={"limits": limits},
    )


def _refine(
    trials: _Trials,
    bad: _Trial,
    good: _Trial,
    tolerance: float,
    logarithmic: bool,
) -> tuple[_Trial, _Trial, bool]:
    """Shrink [bad, good] around the boundary; (bad, good, tolerance reached)."""
    forward = math.log if logarithmic else float
    backward = math.exp if logarithmic else float
    goal = None if trials.target is None else trials.target.time
    weight_bad = weight_good = 1.0
    kept: str | None = None
    while abs(good.value - bad.value) > tolerance * abs(good.value):
        if len(trials.done) >= _MAX_SIMULATIONS - 1:
            return bad, good, False
        ub, ug = forward(bad.value), forward(good.value)
        width_u = (
            abs(forward(good.value * (1.0 + tolerance)) - ug)
            if logarithmic
            else (tolerance * abs(good.value))
        )
        if goal is None or bad.time is None or good.time is None:
            un = 0.5 * (ub + ug)
        else:
            fb = (bad.time - goal) * weight_bad
            fg = (good.time - goal) * weight_good
            un = ug - fg * (ug - ub) / (fg - fb) if fg != fb else 0.5 * (ub + ug)
        sign = 1.0 if ug > ub else -1.0
        low, high = sorted((ub + 0.5 * width_u * sign, ug - 0.5 * width_u * sign))
        un = min(max(un, low), high) if low <= high else 0.5 * (ub + ug)
        trial = trials.run(backward(un))
        if trial.meets:
            good = trial
            weight_bad = 0.5 * weight_bad if kept == "bad" else 1.0
            weight_good = 1.0
            kept = "bad"
        else:
            bad = trial
            weight_good = 0.5 * weight_good if kept == "good" else 1.0
            weight_bad = 1.0
            kept = "good"
    return bad, good, True


def _assumptions(item: SizableField, target: CoolingTarget | None) -> tuple[str, ...]:
    side = "smallest" if item.direction > 0 else "largest"
    goal = (
        "the product at or below the target temperature by the target time"
        if target is not None
        else "every limit of the case's schedule met"
    )
    return (
        f"Sizing: the {side} value of {item.field.path} in the bracket with {goal}, solved on "
        "the chamber simulation (regula falsi, Illinois variant, in ln x for positive fields; "
        "bisection where a trial did not reach the target temperature).",
        f"The time to the target is taken to be monotone in {item.field.path} "
        f"({'falling' if item.direction > 0 else 'rising'} as it grows); the design curve is "
        "checked for it.",
        "Trials simulate to twice the target time (or the case's end time if longer) and stop "
        "at the target temperature.",
        f"Margin: the simulation at {MARGIN_FACTOR:g} x the answer (in SI units).",
    )


def size_vacuum_chamber(sizing: SizingCase) -> SizingResult:
    """The value of one case field at which the chamber just meets a cooling target.

    Parameters
    ----------
    sizing : SizingCase
        The case, the field to solve for (``find``), the target (temperature and time,
        or the case's schedule), an optional bracket (SI) and the relative tolerance
        (1e-6 to 0.05, default 1e-3).

    Returns
    -------
    SizingResult
        The answer (a simulated value that meets the target, within the tolerance of one
        that does not), the forward simulation at it, the design curve, the margin at
        90 % of the answer.

    Raises
    ------
    InvalidInputError
        A field that is not sizable (the target not monotone in it) or that the case
        lacks, a malformed bracket or target, a case the simulation refuses.
    OutOfRangeError
        Target, bracket or tolerance outside its range.
    NoSolutionError
        No value in the bracket meets the target; names the physical limit that stops
        it (the product's freezing point, the trap temperature, the pump's ultimate
        pressure) where one does.
    NotMonotoneError
        The design curve contradicts the field's direction.

    Notes
    -----
    With t(x) the time to the target at value x of the field and t* the target time, the
    answer x* satisfies t(x*) <= t* and t(x') > t* for a simulated x' with
    |x* - x'| <= tolerance |x*|.

    References
    ----------
    Dowell and Jarratt, BIT 11 (1971) (the Illinois method; from memory).

    Examples
    --------
    >>> from service.core.simulation import Chamber, Product, Pump, VacuumChamberCase
    >>> case = VacuumChamberCase(
    ...     chamber=Chamber(free_volume=0.5, initial_pressure=101325.0, temperature=293.15),
    ...     pump=Pump(nominal_speed=0.05, ultimate_pressure=10.0),
    ...     product=Product(mass=1.0, initial_temperature=293.15), end_time=600.0)
    >>> result = size_vacuum_chamber(SizingCase(
    ...     case, "pump.nominal_speed", CoolingTarget(temperature=278.15, time=120.0)))
    >>> result.simulation.summary.target_time <= 120.0
    True
    """
    case = sizing.case
    validate_case(case)
    require_scalar_within(
        sizing.relative_tolerance,
        "relative_tolerance",
        *_TOLERANCE_RANGE,
        "1",
        "fraction of the answer the boundary is bracketed to",
    )
    item = sizable_field(case, sizing.find)
    target = sizing.target
    _checked_target(case, target)
    bracket = _checked_bracket(sizing, item, case_field_value(case, sizing.find))
    logarithmic = _logarithmic(item, bracket)
    trials = _Trials(_base_case(case, target), item, target)
    for value in _grid(bracket, logarithmic):
        trials.run(value)
    ordered = sorted(trials.done, key=lambda trial: item.direction * trial.value)
    _check_monotone(ordered, item)
    warnings: list[Advisory] = []
    if not ordered[-1].meets:
        raise _no_solution(sizing, item, bracket, ordered[-1])
    if ordered[0].meets:
        bad = good = ordered[0]
        at_end = converged = True
        warnings.append(
            Advisory(
                "bracket-end-meets-target",
                f"The bracket's unfavourable end ({good.value:.6g} {item.field.unit}) already "
                f"meets the target: the boundary may lie beyond it; widen the bracket.",
            )
        )
    else:
        at_end = False
        split = next(index for index, trial in enumerate(ordered) if trial.meets)
        bad, good, converged = _refine(
            trials, ordered[split - 1], ordered[split], sizing.relative_tolerance, logarithmic
        )
        if not converged:
            warnings.append(
                Advisory(
                    "tolerance-not-reached",
                    f"The refinement stopped after {_MAX_SIMULATIONS} simulations before "
                    "reaching the requested tolerance.",
                )
            )
    margin_value = MARGIN_FACTOR * good.value
    margin = trials.run(margin_value)
    curve = sorted(
        {trial.value: trial.point() for trial in trials.done}.values(), key=lambda p: p.value
    )
    return SizingResult(
        field=item.field,
        direction=item.direction,
        solution=good.value,
        nearest_failing=bad.value,
        relative_width=abs(good.value - bad.value) / abs(good.value) if good.value else 0.0,
        bracket=bracket,
        simulation=good.result,
        simulated_case=good.case,
        margin_value=margin_value,
        margin=margin.point(),
        design_curve=tuple(curve),
        simulations=len(trials.done),
        at_bracket_end=at_end,
        target=target,
        relative_tolerance=sizing.relative_tolerance,
        warnings=tuple(warnings),
        assumptions=_assumptions(item, target),
    )
