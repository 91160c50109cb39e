"""Core sizing result -> response dictionary."""

from __future__ import annotations

from typing import Any, Final

from service.api.http.envelope import envelope
from service.api.http.quantities import scalar_output
from service.api.http.units import Dimension, UnitSet
from service.api.simulations.answers import simulation_answer
from service.api.sizing.requests import FieldUnit
from service.core.sizing import MARGIN_FACTOR, DesignPoint, SizingResult

__all__ = ["SIZING_HEADLINE", "sizing_answer"]

_SIMULATION_PARTS = (
    "summary",
    "events",
    "series",
    "schedule",
    "balance",
    "checks",
    "model_references",
)


def _time(value: float | None, unit_set: UnitSet) -> dict[str, Any] | None:
    return scalar_output(value, Dimension.TIME, unit_set)


def _point(point: DesignPoint, unit: FieldUnit, unit_set: UnitSet) -> dict[str, Any]:
    return {
        "value": unit.output(point.value),
        "time_to_target": _time(point.time_to_target, unit_set),
        "meets_target": point.meets_target,
    }


def sizing_answer(
    result: SizingResult,
    unit: FieldUnit,
    unit_set: UnitSet,
    extra_assumptions: tuple[str, ...] = (),
) -> dict[str, Any]:
    """The response body of one sizing (see ``VacuumChamberSizingPublic``)."""
    simulation = simulation_answer(result.simulation, unit_set)
    forward = result.simulation
    return {
        "find": result.field.path,
        "meaning": result.field.meaning,
        "direction": "smallest" if result.direction > 0 else "largest",
        "solution": unit.output(result.solution),
        "time_to_target": _time(forward.summary.target_time, unit_set),
        "tolerance": {
            "requested": result.relative_tolerance,
            "reached": result.relative_width,
            "nearest_failing": unit.output(result.nearest_failing),
        },
        "bracket": [unit.output(result.bracket[0]), unit.output(result.bracket[1])],
        "at_bracket_end": result.at_bracket_end,
        "margin": {"factor": MARGIN_FACTOR, **_point(result.margin, unit, unit_set)},
        "design_curve": [_point(point, unit, unit_set) for point in result.design_curve],
        "simulations": result.simulations,
        "simulation": {name: simulation[name] for name in _SIMULATION_PARTS},
        **envelope(
            unit_set=unit_set,
            assumptions=(*result.assumptions, *forward.assumptions, *extra_assumptions),
            sources=forward.property_sources,
            uncertainties=forward.property_uncertainties,
            advisories=(*result.warnings, *forward.warnings),
        ),
    }


SIZING_HEADLINE: Final = {
    "find": "find",
    "solution": "solution",
    "time_to_target": "time_to_target",
    "at_bracket_end": "at_bracket_end",
}
"""What a listing of stored calculations shows of a sizing answer (name: path)."""
