"""Plots of primary drying: a run against time, and the design space with labelled
contours. matplotlib's object interface (a ``Figure`` per call), imported on first use;
the format is chosen by :func:`service.api.simulations.plots.plot_format_for`."""

from __future__ import annotations

from collections.abc import Mapping, Sequence
from dataclasses import dataclass
from typing import Any, Final, Protocol

import numpy as np

from service.api.drying.requests import read_primary_drying
from service.api.drying.schemas import PrimaryDryingSimulationCreate
from service.api.http.units import Dimension, UnitSet, convert_from_si, output_unit
from service.api.simulations.plots import (
    PlotFormat,
    display_unit,
    figure_bytes,
    mark_events,
    stored_number,
    stored_values,
)
from service.core.drying import DesignSpaceResult, PrimaryDryingResult

__all__ = [
    "plot_design_space",
    "plot_primary_drying",
    "plot_stored_design_space",
    "plot_stored_primary_drying",
]

_EVENT_LABELS: Final = {
    "primary-drying-ends": "dry",
    "maximum-duration-reached": "time up",
    "critical-temperature-exceeded": "above critical",
    "back-below-critical-temperature": "below critical",
    "equipment-limit-exceeded": "over equipment limit",
    "back-within-equipment-limit": "within limit",
    "condenser-capacity-reached": "condenser full",
    "front-reaches-triple-point": "melting",
}
_HOUR: Final = 3600.0


class _RunSeries(Protocol):
    @property
    def time(self) -> np.ndarray: ...
    @property
    def shelf_temperature(self) -> np.ndarray: ...
    @property
    def front_temperature(self) -> np.ndarray: ...
    @property
    def bottom_temperature(self) -> np.ndarray: ...
    @property
    def batch_sublimation_rate(self) -> np.ndarray: ...


class _Event(Protocol):
    @property
    def name(self) -> str: ...
    @property
    def time(self) -> float: ...


class DryingRunTrace(Protocol):
    """What the run plot draws (SI): a :class:`PrimaryDryingResult`, or a stored answer
    read back (:func:`plot_stored_primary_drying`)."""

    @property
    def series(self) -> _RunSeries: ...
    @property
    def events(self) -> Sequence[_Event]: ...
    @property
    def critical_temperature(self) -> float: ...
    @property
    def equipment_rate_limit(self) -> np.ndarray | None: ...


@dataclass(frozen=True)
class _StoredRunSeries:
    time: np.ndarray
    shelf_temperature: np.ndarray
    front_temperature: np.ndarray
    bottom_temperature: np.ndarray
    batch_sublimation_rate: np.ndarray


@dataclass(frozen=True)
class _StoredEvent:
    name: str
    time: float


@dataclass(frozen=True)
class _StoredRun:
    series: _StoredRunSeries
    events: tuple[_StoredEvent, ...]
    critical_temperature: float
    equipment_rate_limit: np.ndarray | None


def plot_stored_primary_drying(
    inputs: Mapping[str, Any], answer: Mapping[str, Any], kind: PlotFormat
) -> bytes:
    """The plot of :func:`plot_primary_drying` drawn again from a stored run: the series,
    events and equipment limit of the answer, the critical temperature of the request.

    Raises
    ------
    KeyError, ValueError, pydantic.ValidationError
        The record lacks a member the plot needs (a record of another shape).
    """
    case = read_primary_drying(PrimaryDryingSimulationCreate.model_validate(inputs))
    series = answer["series"]
    temperature, rate = Dimension.TEMPERATURE, Dimension.MASS_FLOW
    limit = answer.get("equipment_rate_limit")
    stored = _StoredRun(
        series=_StoredRunSeries(
            time=stored_values(series["time"], Dimension.TIME),
            shelf_temperature=stored_values(series["shelf_temperature"], temperature),
            front_temperature=stored_values(series["front_temperature"], temperature),
            bottom_temperature=stored_values(series["bottom_temperature"], temperature),
            batch_sublimation_rate=stored_values(series["batch_sublimation_rate"], rate),
        ),
        events=tuple(
            _StoredEvent(str(event["name"]), stored_number(event["time"], Dimension.TIME))
            for event in answer["events"]
        ),
        critical_temperature=case.critical_temperature,
        equipment_rate_limit=None if limit is None else stored_values(limit, rate),
    )
    return plot_primary_drying(stored, UnitSet(answer["meta"]["output_units"]), kind)


def plot_primary_drying(
    result: DryingRunTrace | PrimaryDryingResult, unit_set: UnitSet, kind: PlotFormat
) -> bytes:
    """Temperatures (shelf, ice front, vial bottom, critical) and the batch sublimation rate
    (with the equipment limit) against time in hours, events marked."""
    from matplotlib.figure import Figure

    series = result.series
    hours = series.time / _HOUR
    temperature_unit = display_unit(output_unit(Dimension.TEMPERATURE, unit_set))
    rate_unit = output_unit(Dimension.MASS_FLOW, unit_set)

    def temperature(values: np.ndarray) -> np.ndarray:
        return np.asarray(convert_from_si(values, Dimension.TEMPERATURE, unit_set))

    figure = Figure(figsize=(8.0, 6.0), layout="constrained")
    upper, lower = figure.subplots(2, 1, sharex=True)
    upper.plot(hours, temperature(series.shelf_temperature), color="black", label="shelf")
    upper.plot(hours, temperature(series.front_temperature), color="tab:blue", label="ice front")
    upper.plot(
        hours, temperature(series.bottom_temperature), color="tab:cyan", ls="--", label="bottom"
    )
    upper.axhline(
        float(temperature(np.array(result.critical_temperature))),
        color="tab:red",
        ls=":",
        label="critical",
    )
    upper.set_ylabel(f"temperature [{temperature_unit}]")
    upper.legend(loc="lower right", fontsize="small")
    upper.grid(True, alpha=0.3)
    lower.plot(
        hours,
        convert_from_si(series.batch_sublimation_rate, Dimension.MASS_FLOW, unit_set),
        color="tab:orange",
        label="batch sublimation rate",
    )
    if result.equipment_rate_limit is not None:
        lower.plot(
            hours,
            convert_from_si(result.equipment_rate_limit, Dimension.MASS_FLOW, unit_set),
            color="tab:red",
            ls=":",
            label="equipment limit",
        )
    lower.set_ylabel(f"sublimation rate [{rate_unit}]")
    lower.set_xlabel("time [h]")
    lower.legend(loc="upper right", fontsize="small")
    lower.grid(True, alpha=0.3)
    marks = [
        (event.time / _HOUR, _EVENT_LABELS[event.name])
        for event in result.events
        if event.name in _EVENT_LABELS
    ]
    mark_events((upper, lower), upper, marks)
    figure.suptitle("Primary drying")
    return figure_bytes(figure, kind)


def _hour_levels(hours: np.ndarray) -> list[float]:
    """Round drying times from the shortest to ten times it (longer ones crowd the plot)."""
    shortest = float(np.nanmin(hours))
    nice = [1, 2, 3, 4, 5, 6, 8, 10, 12, 15, 20, 25, 30, 40, 50, 60, 80, 100, 150, 200]
    levels = [float(h) for h in nice if shortest < h < 10.0 * shortest]
    levels += [float(h) for h in (300, 500, 1000) if shortest < h < 10.0 * shortest]
    return levels or [shortest * 1.5]


class DesignSpaceTrace(Protocol):
    """What the design-space plot draws (SI): a :class:`DesignSpaceResult`, or a stored
    answer read back (:func:`plot_stored_design_space`)."""

    @property
    def chamber_pressures(self) -> np.ndarray: ...
    @property
    def shelf_temperatures(self) -> np.ndarray: ...
    @property
    def front_temperature(self) -> np.ndarray: ...
    @property
    def critical_temperature(self) -> float: ...
    @property
    def safe(self) -> np.ndarray: ...
    @property
    def drying_time(self) -> np.ndarray | None: ...
    @property
    def batch_sublimation_rate(self) -> np.ndarray: ...
    @property
    def equipment_rate_limit(self) -> np.ndarray | None: ...
    @property
    def fastest(self) -> tuple[int, int] | None: ...


@dataclass(frozen=True)
class _StoredDesignSpace:
    chamber_pressures: np.ndarray
    shelf_temperatures: np.ndarray
    front_temperature: np.ndarray
    critical_temperature: float
    safe: np.ndarray
    drying_time: np.ndarray | None
    batch_sublimation_rate: np.ndarray
    equipment_rate_limit: np.ndarray | None
    fastest: tuple[int, int] | None


def _stored_grid(quantity: Any, dimension: Dimension, shape: tuple[int, int]) -> np.ndarray:
    """A stored grid (``values`` nested shelf x pressure, null where nothing sublimes)."""
    if not isinstance(quantity, Mapping):
        raise ValueError("the stored answer lacks a grid the plot needs")
    flat = np.ravel(np.array(quantity["values"], dtype=object))
    return stored_values({"values": list(flat), "unit": quantity["unit"]}, dimension).reshape(shape)


def plot_stored_design_space(
    _inputs: Mapping[str, Any], answer: Mapping[str, Any], kind: PlotFormat
) -> bytes:
    """The plot of :func:`plot_design_space` drawn again from a stored design space.

    Raises
    ------
    KeyError, ValueError
        The answer lacks a member the plot needs (a record of another shape).
    """
    shelves = stored_values(answer["shelf_temperatures"], Dimension.TEMPERATURE)
    pressures = stored_values(answer["chamber_pressures"], Dimension.PRESSURE)
    shape = (shelves.size, pressures.size)
    drying_time = answer.get("drying_time")
    limit = answer.get("equipment_rate_limit")
    fastest = answer.get("fastest")
    stored = _StoredDesignSpace(
        chamber_pressures=pressures,
        shelf_temperatures=shelves,
        front_temperature=_stored_grid(answer["front_temperature"], Dimension.TEMPERATURE, shape),
        critical_temperature=stored_number(answer["critical_temperature"], Dimension.TEMPERATURE),
        safe=np.array(answer["safe"], dtype=bool).reshape(shape),
        drying_time=None
        if drying_time is None
        else _stored_grid(drying_time, Dimension.TIME, shape),
        batch_sublimation_rate=_stored_grid(
            answer["batch_sublimation_rate"], Dimension.MASS_FLOW, shape
        ),
        equipment_rate_limit=None if limit is None else stored_values(limit, Dimension.MASS_FLOW),
        fastest=None
        if fastest is None
        else (int(fastest["shelf_index"]), int(fastest["pressure_index"])),
    )
    return plot_design_space(stored, UnitSet(answer["meta"]["output_units"]), kind)


def plot_design_space(
    result: DesignSpaceTrace | DesignSpaceResult, unit_set: UnitSet, kind: PlotFormat
) -> bytes:
    """Chamber pressure x shelf temperature: labelled contours of the ice-front temperature
    and of the drying time (or the batch sublimation rate at a stated thickness), the
    critical-temperature line, the equipment-limit line, the safe region shaded and the
    fastest setting marked."""
    from matplotlib.figure import Figure

    pressure_unit = output_unit(Dimension.PRESSURE, unit_set)
    temperature_unit = display_unit(output_unit(Dimension.TEMPERATURE, unit_set))
    x = np.asarray(convert_from_si(result.chamber_pressures, Dimension.PRESSURE, unit_set))
    y = np.asarray(convert_from_si(result.shelf_temperatures, Dimension.TEMPERATURE, unit_set))
    front = np.asarray(convert_from_si(result.front_temperature, Dimension.TEMPERATURE, unit_set))
    critical = float(convert_from_si(result.critical_temperature, Dimension.TEMPERATURE, unit_set))
    figure = Figure(figsize=(8.0, 6.0), layout="constrained")
    axis = figure.subplots()
    if x.size > 1 and y.size > 1:
        axis.contourf(x, y, result.safe.astype(float), levels=[0.5, 1.5], colors=["#d9f2d9"])
        lines = axis.contour(x, y, front, colors="tab:blue", linewidths=0.8, linestyles="solid")
        axis.clabel(lines, fmt=f"%.0f {temperature_unit}", fontsize="x-small")
        if np.nanmin(front) < critical < np.nanmax(front):
            edge = axis.contour(
                x, y, front, levels=[critical], colors="tab:red", linewidths=2.0, linestyles="solid"
            )
            axis.clabel(edge, fmt=f"critical %.1f {temperature_unit}", fontsize="small")
        if result.drying_time is not None:
            hours = result.drying_time / _HOUR
            timed = axis.contour(
                x,
                y,
                hours,
                levels=_hour_levels(hours),
                colors="dimgrey",
                linestyles="--",
                linewidths=0.8,
            )
            axis.clabel(timed, fmt="%.0f h", fontsize="x-small")
        else:
            rate_unit = output_unit(Dimension.MASS_FLOW, unit_set)
            rate = np.asarray(
                convert_from_si(result.batch_sublimation_rate, Dimension.MASS_FLOW, unit_set)
            )
            rated = axis.contour(x, y, rate, colors="dimgrey", linestyles="--", linewidths=0.8)
            axis.clabel(rated, fmt=f"%.3g {rate_unit}", fontsize="x-small")
        if result.equipment_rate_limit is not None:
            margin = result.batch_sublimation_rate - result.equipment_rate_limit[None, :]
            if np.nanmin(margin) < 0.0 < np.nanmax(margin):
                limit = axis.contour(
                    x, y, margin, levels=[0.0], colors="tab:purple", linewidths=1.5
                )
                axis.clabel(limit, fmt="equipment limit", fontsize="small")
    if result.fastest is not None:
        i, j = result.fastest
        axis.plot(x[j], y[i], marker="*", markersize=14, color="gold", mec="black", ls="")
        axis.annotate("fastest safe", (x[j], y[i]), textcoords="offset points", xytext=(6, 6))
    axis.set_xlabel(f"chamber pressure [{pressure_unit}]")
    axis.set_ylabel(f"shelf temperature [{temperature_unit}]")
    axis.grid(True, alpha=0.3)
    title = "Primary drying design space (shaded: safe)"
    figure.suptitle(title)
    return figure_bytes(figure, kind)
