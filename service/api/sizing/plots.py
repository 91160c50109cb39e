"""Plot of a sizing's design curve: time to target against the unknown.

Drawn with matplotlib's object interface, as the simulation plots are (a ``Figure`` per
call, imported on first use); the format is chosen by the simulations' negotiation.
"""

from __future__ import annotations

from collections.abc import Mapping, Sequence
from dataclasses import dataclass
from typing import Any, Protocol

from service.api.http.units import Dimension, number_to_si
from service.api.simulations.plots import PlotFormat, figure_bytes, stored_number
from service.api.sizing.requests import FieldUnit, read_sizing
from service.api.sizing.schemas import VacuumChamberSizingCreate
from service.core.sizing import SizingResult

__all__ = ["plot_design_curve", "plot_stored_design_curve"]


class _Point(Protocol):
    @property
    def value(self) -> float: ...
    @property
    def time_to_target(self) -> float | None: ...


class _Target(Protocol):
    @property
    def time(self) -> float: ...


class _Field(Protocol):
    @property
    def path(self) -> str: ...


class DesignCurveTrace(Protocol):
    """What the design-curve plot draws (SI): a :class:`SizingResult`, or a stored answer
    read back (:func:`plot_stored_design_curve`)."""

    @property
    def design_curve(self) -> Sequence[_Point]: ...
    @property
    def target(self) -> _Target | None: ...
    @property
    def solution(self) -> float: ...
    @property
    def field(self) -> _Field: ...


@dataclass(frozen=True)
class _StoredPoint:
    value: float
    time_to_target: float | None


@dataclass(frozen=True)
class _StoredTarget:
    time: float


@dataclass(frozen=True)
class _StoredField:
    path: str


@dataclass(frozen=True)
class _StoredSizing:
    design_curve: tuple[_StoredPoint, ...]
    target: _StoredTarget | None
    solution: float
    field: _StoredField


def plot_stored_design_curve(
    inputs: Mapping[str, Any], answer: Mapping[str, Any], kind: PlotFormat
) -> bytes:
    """The plot of :func:`plot_design_curve` drawn again from a stored sizing: the design
    curve and solution of the answer, the target time and the field's unit of the request.

    Raises
    ------
    KeyError, ValueError, pydantic.ValidationError
        The record lacks a member the plot needs (a record of another shape).
    """
    sizing, unit, _ = read_sizing(VacuumChamberSizingCreate.model_validate(inputs))

    def si(quantity: Mapping[str, Any]) -> float:
        return number_to_si(
            float(quantity["value"]), quantity["unit"], unit.dimension, field="result"
        )

    points = tuple(
        _StoredPoint(
            si(point["value"]),
            None
            if point["time_to_target"] is None
            else stored_number(point["time_to_target"], Dimension.TIME),
        )
        for point in answer["design_curve"]
    )
    stored = _StoredSizing(
        design_curve=points,
        target=None if sizing.target is None else _StoredTarget(sizing.target.time),
        solution=si(answer["solution"]),
        field=_StoredField(str(answer["find"])),
    )
    return plot_design_curve(stored, unit, kind)


def plot_design_curve(
    result: DesignCurveTrace | SizingResult, unit: FieldUnit, kind: PlotFormat
) -> bytes:
    """Time to target (min) against the field's value, target time and answer marked.

    Parameters
    ----------
    result
        A sizing result.
    unit
        Unit of the field's axis.
    kind
        ``"svg"`` or ``"png"``.
    """
    from matplotlib.figure import Figure

    points = result.design_curve
    figure = Figure(figsize=(8.0, 5.0), layout="constrained")
    axis = figure.subplots()
    reached = [point for point in points if point.time_to_target is not None]
    axis.plot(
        [unit.from_si(point.value) for point in reached],
        [float(point.time_to_target or 0.0) / 60.0 for point in reached],
        marker="o",
        color="tab:blue",
        label="time to target",
    )
    missed = [point for point in points if point.time_to_target is None]
    if missed:
        axis.plot(
            [unit.from_si(point.value) for point in missed],
            [0.0] * len(missed),
            ls="none",
            marker="x",
            color="tab:red",
            label="target not reached",
        )
    if result.target is not None:
        axis.axhline(result.target.time / 60.0, color="grey", ls="--", lw=0.8, label="target time")
    axis.axvline(unit.from_si(result.solution), color="tab:green", lw=1.0, label="answer")
    positive = all(point.value > 0.0 for point in points)
    if positive and max(p.value for p in points) > 10.0 * min(p.value for p in points):
        axis.set_xscale("log")
    axis.set_xlabel(f"{result.field.path} [{unit.label}]")
    axis.set_ylabel("time to target [min]")
    axis.grid(True, which="both", alpha=0.3)
    axis.legend(loc="upper right", fontsize="small")
    figure.suptitle("Sizing: design curve")
    return figure_bytes(figure, kind)  # as every plot: no date, fixed SVG ids, text as text
