"""Plots of a simulation: chamber pressures and product temperature against time.

Drawn with matplotlib's object interface (a ``Figure`` per call, no pyplot state), so it
is safe in worker threads and needs no display. matplotlib is imported on first use.
"""

from __future__ import annotations

import io
from collections.abc import Mapping, Sequence
from dataclasses import dataclass
from typing import Any, Final, Literal, Protocol

import numpy as np

from service.api.http.negotiation import choose_media_type
from service.api.http.units import (
    Dimension,
    UnitSet,
    convert_from_si,
    convert_to_si,
    output_unit,
)
from service.core.simulation import VacuumChamberResult

__all__ = [
    "PLOT_MEDIA_TYPES",
    "PlotFormat",
    "display_unit",
    "figure_bytes",
    "mark_events",
    "plot_format_for",
    "plot_simulation",
    "plot_stored_simulation",
    "stored_number",
    "stored_values",
]

PlotFormat = Literal["svg", "png"]

PLOT_MEDIA_TYPES: Final[dict[PlotFormat, str]] = {"svg": "image/svg+xml", "png": "image/png"}

_EVENT_LABELS: Final = {
    "flash-point": "flash",
    "boiling-stops": "boiling stops",
    "boiling-resumes": "boiling resumes",
    "freezing-starts": "freezing",
    "fully-frozen": "frozen",
    "target-reached": "target",
    "condenser-capacity-exceeded": "condenser full",
    "schedule-limit-missed": "schedule missed",
    "model-range-left": "range left",
    "water-exhausted": "water exhausted",
}


_PLOT_CHOICES: Final = ("application/json", *PLOT_MEDIA_TYPES.values())


def plot_format_for(accept: str | None) -> PlotFormat | None:
    """The image format ``accept`` chooses over JSON, if any (RFC 9110 §12.5.1, read by
    :func:`service.api.http.negotiation.choose_media_type`); None for JSON."""
    chosen = choose_media_type(accept, _PLOT_CHOICES)
    for kind, media_type in PLOT_MEDIA_TYPES.items():
        if chosen == media_type:
            return kind
    return None


def _time_axis(seconds: np.ndarray) -> tuple[np.ndarray, str]:
    end = float(seconds[-1]) if seconds.size else 0.0
    if end > 7200.0:
        return seconds / 3600.0, "h"
    if end > 300.0:
        return seconds / 60.0, "min"
    return seconds, "s"


_DISPLAY_UNITS: Final = {"degC": "°C", "degF": "°F"}
"""Unit labels as a reader expects them on an axis (the API's spellings stay ASCII)."""


def display_unit(unit: str) -> str:
    """An output unit as an axis label shows it (``degC`` -> ``°C``)."""
    return _DISPLAY_UNITS.get(unit, unit)


def _clock(seconds: float) -> str:
    """A time of the run as a label: s below 5 min, else min, else h above 2 h."""
    if seconds >= 7200.0:
        return f"{seconds / 3600.0:.3g} h"
    if seconds >= 300.0:
        return f"{seconds / 60.0:.3g} min"
    return f"{seconds:.3g} s"


class _Series(Protocol):
    @property
    def time(self) -> np.ndarray: ...
    @property
    def total_pressure(self) -> np.ndarray: ...
    @property
    def air_pressure(self) -> np.ndarray: ...
    @property
    def vapor_pressure(self) -> np.ndarray: ...
    @property
    def product_vapor_pressure(self) -> np.ndarray: ...
    @property
    def product_temperature(self) -> np.ndarray: ...
    @property
    def core_temperature(self) -> np.ndarray | None: ...
    @property
    def surface_temperature(self) -> np.ndarray | None: ...
    @property
    def condenser_load(self) -> np.ndarray: ...
    @property
    def air_flux_ratio(self) -> np.ndarray | None: ...


class _Event(Protocol):
    @property
    def name(self) -> str: ...
    @property
    def time(self) -> float: ...


class _Check(Protocol):
    @property
    def time(self) -> float: ...
    @property
    def temperature_limit(self) -> float: ...
    @property
    def met(self) -> bool: ...
    @property
    def applies_to(self) -> str: ...


class _Checks(Protocol):
    @property
    def trap_refrigeration_capacity(self) -> float | None: ...


class _Summary(Protocol):
    @property
    def end_reason(self) -> str: ...
    @property
    def end_time(self) -> float: ...
    @property
    def final_temperature(self) -> float: ...
    @property
    def evaporated_mass(self) -> float: ...
    @property
    def final_core_temperature(self) -> float | None: ...


class SimulationTrace(Protocol):
    """What the simulation plot draws (SI): a :class:`VacuumChamberResult`, or a stored
    answer read back (:func:`plot_stored_simulation`)."""

    @property
    def series(self) -> _Series: ...
    @property
    def events(self) -> Sequence[_Event]: ...
    @property
    def schedule(self) -> Sequence[_Check]: ...
    @property
    def summary(self) -> _Summary: ...
    @property
    def checks(self) -> _Checks | None: ...


def stored_values(quantity: Any, dimension: Dimension) -> np.ndarray:
    """The SI numbers of a stored ``{"values"|"value", "unit"}`` (null as NaN)."""
    if not isinstance(quantity, Mapping):
        raise ValueError("the stored answer lacks a quantity the plot needs")
    raw = quantity.get("values", [quantity.get("value")])
    numbers = np.array([np.nan if item is None else item for item in raw], dtype=np.float64)
    return convert_to_si(numbers, quantity.get("unit"), dimension, field="result")


def stored_number(quantity: Any, dimension: Dimension) -> float:
    """The SI number of a stored ``{"value", "unit"}`` (null as NaN)."""
    return float(stored_values(quantity, dimension)[0])


def _stored_optional(quantity: Any, dimension: Dimension) -> np.ndarray | None:
    """:func:`stored_values` of a member the answer omits where the run has none."""
    return None if quantity is None else stored_values(quantity, dimension)


def _stored_optional_number(quantity: Any, dimension: Dimension) -> float | None:
    """:func:`stored_number` of a member that may be absent or null."""
    if quantity is None or (isinstance(quantity, Mapping) and quantity.get("value") is None):
        return None
    return stored_number(quantity, dimension)


@dataclass(frozen=True)
class _StoredSeries:
    time: np.ndarray
    total_pressure: np.ndarray
    air_pressure: np.ndarray
    vapor_pressure: np.ndarray
    product_vapor_pressure: np.ndarray
    product_temperature: np.ndarray
    condenser_load: np.ndarray
    core_temperature: np.ndarray | None
    surface_temperature: np.ndarray | None
    air_flux_ratio: np.ndarray | None


@dataclass(frozen=True)
class _StoredEvent:
    name: str
    time: float


@dataclass(frozen=True)
class _StoredCheck:
    time: float
    temperature_limit: float
    met: bool
    applies_to: str


@dataclass(frozen=True)
class _StoredChecks:
    trap_refrigeration_capacity: float | None


@dataclass(frozen=True)
class _StoredSummary:
    end_reason: str
    end_time: float
    final_temperature: float
    evaporated_mass: float
    final_core_temperature: float | None


@dataclass(frozen=True)
class _StoredSimulation:
    series: _StoredSeries
    events: tuple[_StoredEvent, ...]
    schedule: tuple[_StoredCheck, ...]
    summary: _StoredSummary
    checks: _StoredChecks | None


def _stored_simulation(answer: Mapping[str, Any]) -> _StoredSimulation:
    series = answer["series"]
    pressure, temperature, time = Dimension.PRESSURE, Dimension.TEMPERATURE, Dimension.TIME
    summary = answer["summary"]
    return _StoredSimulation(
        series=_StoredSeries(
            time=stored_values(series["time"], time),
            total_pressure=stored_values(series["total_pressure"], pressure),
            air_pressure=stored_values(series["air_pressure"], pressure),
            vapor_pressure=stored_values(series["vapor_pressure"], pressure),
            product_vapor_pressure=stored_values(series["product_vapor_pressure"], pressure),
            product_temperature=stored_values(series["product_temperature"], temperature),
            condenser_load=stored_values(series["condenser_load"], Dimension.POWER),
            core_temperature=_stored_optional(series.get("core_temperature"), temperature),
            surface_temperature=_stored_optional(series.get("surface_temperature"), temperature),
            air_flux_ratio=_stored_optional(series.get("air_flux_ratio"), Dimension.DIMENSIONLESS),
        ),
        events=tuple(
            _StoredEvent(str(event["name"]), stored_number(event["time"], time))
            for event in answer["events"]
        ),
        schedule=tuple(
            _StoredCheck(
                stored_number(check["time"], time),
                stored_number(check["temperature_limit"], temperature),
                bool(check["met"]),
                str(check.get("applies_to", "")),
            )
            for check in answer["schedule"]
        ),
        summary=_StoredSummary(
            end_reason=str(summary["end_reason"]),
            end_time=stored_number(summary["end_time"], time),
            final_temperature=stored_number(summary["final_temperature"], temperature),
            evaporated_mass=stored_number(summary["evaporated_mass"], Dimension.MASS),
            final_core_temperature=_stored_optional_number(
                summary.get("final_core_temperature"), temperature
            ),
        ),
        checks=None
        if answer.get("checks") is None
        else _StoredChecks(
            _stored_optional_number(
                answer["checks"].get("trap_refrigeration_capacity"), Dimension.POWER
            )
        ),
    )


def plot_stored_simulation(answer: Mapping[str, Any], kind: PlotFormat) -> bytes:
    """The plot of :func:`plot_simulation` drawn again from a stored simulation answer (in
    the answer's ``meta.output_units``, its calculation id in the title).

    Raises
    ------
    KeyError, ValueError
        The answer lacks a member the plot needs (a record of another shape).
    """
    meta = answer["meta"]
    return plot_simulation(
        _stored_simulation(answer),
        UnitSet(meta["output_units"]),
        kind,
        meta.get("calculation_id"),
    )


def plot_simulation(
    result: SimulationTrace | VacuumChamberResult,
    unit_set: UnitSet,
    kind: PlotFormat,
    calculation_id: str | None = None,
) -> bytes:
    """Pressure (log scale) and product temperature against time, events marked with their
    times, the schedule's limits drawn as markers (filled when met, open when missed).

    Parameters
    ----------
    result
        A simulation result (or a stored answer read back in SI).
    unit_set
        Units of the pressure and temperature axes.
    kind
        ``"svg"`` or ``"png"``.
    calculation_id
        The stored record's id, named in the title.

    Returns
    -------
    bytes
        The image.
    """
    from matplotlib.figure import Figure

    series = result.series
    time, time_unit = _time_axis(series.time)
    pressure_unit = output_unit(Dimension.PRESSURE, unit_set)
    temperature_unit = output_unit(Dimension.TEMPERATURE, unit_set)

    def pressure(values: np.ndarray) -> np.ndarray:
        converted = convert_from_si(values, Dimension.PRESSURE, unit_set)
        # a log axis cannot show zero: leave such points out
        return np.where(values > 0.0, converted, np.nan)

    figure = Figure(figsize=(8.0, 6.0), layout="constrained")
    upper, lower = figure.subplots(2, 1, sharex=True)
    upper.plot(time, pressure(series.total_pressure), label="chamber (total)", color="black")
    upper.plot(time, pressure(series.air_pressure), label="air", color="tab:blue", ls="--")
    upper.plot(time, pressure(series.vapor_pressure), label="vapor", color="tab:orange", ls="--")
    upper.plot(
        time,
        pressure(series.product_vapor_pressure),
        label="product vapor pressure",
        color="tab:red",
        ls=":",
    )
    _shade_limits(upper, time, result)
    upper.set_yscale("log")
    upper.set_ylabel(f"pressure [{pressure_unit}]")
    upper.legend(loc="upper right", fontsize="small")
    upper.grid(True, which="both", alpha=0.3)
    interior = series.core_temperature is not None and series.surface_temperature is not None
    lower.plot(
        time,
        convert_from_si(series.product_temperature, Dimension.TEMPERATURE, unit_set),
        color="tab:green",
        label="product (volume mean)" if interior else "product",
    )
    if series.core_temperature is not None and series.surface_temperature is not None:
        lower.plot(
            time,
            convert_from_si(series.core_temperature, Dimension.TEMPERATURE, unit_set),
            color="tab:brown",
            lw=2.0,
            label="core",
        )
        lower.plot(
            time,
            convert_from_si(series.surface_temperature, Dimension.TEMPERATURE, unit_set),
            color="tab:olive",
            ls="--",
            label="surface",
        )
    for check in result.schedule:
        at = check.time / (float(series.time[-1] / time[-1]) if time.size and time[-1] else 1.0)
        limit = convert_from_si(
            np.array([check.temperature_limit]), Dimension.TEMPERATURE, unit_set
        )
        lower.plot(
            [at],
            limit,
            marker="v",
            ms=7,
            color="tab:purple",
            fillstyle="full" if check.met else "none",
            ls="none",
        )
    if result.schedule:
        applies = result.schedule[0].applies_to if interior else ""
        lower.plot(
            [],
            [],
            marker="v",
            color="tab:purple",
            ls="none",
            label=f"schedule limit ({applies})" if applies else "schedule limit",
        )
    if result.schedule or interior:
        lower.legend(loc="upper right", fontsize="small")
    lower.set_ylabel(f"product temperature [{display_unit(temperature_unit)}]")
    lower.set_xlabel(f"time [{time_unit}]")
    lower.grid(True, alpha=0.3)
    scale = float(series.time[-1] / time[-1]) if time.size and time[-1] > 0 else 1.0
    marks = [
        (event.time / scale, f"{_EVENT_LABELS[event.name]} {_clock(event.time)}")
        for event in result.events
        if event.name in _EVENT_LABELS
    ]
    mark_events((upper, lower), upper, marks)
    summary = result.summary
    final = float(
        convert_from_si(np.array([summary.final_temperature]), Dimension.TEMPERATURE, unit_set)[0]
    )
    degrees = display_unit(temperature_unit)
    where = f"product at {final:.4g} {degrees}"
    if summary.final_core_temperature is not None:
        core = float(
            convert_from_si(
                np.array([summary.final_core_temperature]), Dimension.TEMPERATURE, unit_set
            )[0]
        )
        where = f"core at {core:.4g} {degrees}, mean {final:.4g} {degrees}"
    title = (
        f"Vacuum chamber simulation: {summary.end_reason.replace('-', ' ')} after "
        f"{_clock(summary.end_time)}, {where}, "
        f"{summary.evaporated_mass:.3g} kg evaporated"
    )
    if calculation_id:
        title += f"\ncalculation {calculation_id}"
    figure.suptitle(title, fontsize="medium")
    return figure_bytes(figure, kind)


_TRAP_LIMIT_BAND: Final = 1e-9
"""Relative: the trap governs where its load is within this of its refrigeration capacity."""


def _shade_limits(
    axis: Any, time: np.ndarray, result: SimulationTrace | VacuumChamberResult
) -> None:
    """Shade the times when the trap's refrigeration capacity or the diffusion of vapor
    through the air (kinetic evaporation) governs, with a legend entry each."""
    series = result.series
    transform = axis.get_xaxis_transform()
    capacity = None if result.checks is None else result.checks.trap_refrigeration_capacity
    if capacity is not None:
        trap = series.condenser_load >= capacity * (1.0 - _TRAP_LIMIT_BAND)
        if trap.any():
            axis.fill_between(
                time,
                0.0,
                1.0,
                where=trap,
                transform=transform,
                color="tab:cyan",
                alpha=0.15,
                lw=0.0,
                label="trap at its refrigeration capacity",
            )
    ratio = series.air_flux_ratio
    if ratio is not None:
        air = ratio < 0.5
        if air.any():
            axis.fill_between(
                time,
                0.0,
                1.0,
                where=air,
                transform=transform,
                color="tab:brown",
                alpha=0.12,
                lw=0.0,
                label="evaporation limited by the air",
            )


def mark_events(axes: Sequence[Any], labelled: Any, marks: Sequence[tuple[float, str]]) -> None:
    """A vertical line on every one of ``axes`` at each mark's time (in the axis' time
    unit), its label written upright above the top of the axis ``labelled`` (outside the
    data, so it hides no curve)."""
    for at, label in marks:
        for axis in axes:
            axis.axvline(at, color="grey", lw=0.8, ls="-.")
        labelled.annotate(
            label,
            xy=(at, 1.01),
            xycoords=("data", "axes fraction"),
            rotation=90,
            va="bottom",
            ha="center",
            fontsize="x-small",
            color="dimgrey",
            annotation_clip=False,  # a label near an edge is drawn, not dropped
        )


def figure_bytes(figure: Any, kind: PlotFormat) -> bytes:
    """The figure as SVG (no date, so the same answer gives the same bytes) or PNG."""
    import matplotlib

    buffer = io.BytesIO()
    metadata = {"Date": None} if kind == "svg" else None
    # svg.fonttype "none": text stays text (searchable, selectable), not glyph paths; a
    # fixed svg.hashsalt makes the element ids (otherwise random) the same on every call.
    with matplotlib.rc_context({"svg.fonttype": "none", "svg.hashsalt": "tripoint"}):
        figure.savefig(buffer, format=kind, metadata=metadata, dpi=100)
    return buffer.getvalue()
