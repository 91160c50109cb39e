"""Plots of a simulation: chamber pressures and product temperature against time.

Drawn with matplotlib's object interface (a ``Figure`` per call, no pyplot state), so it
is safe in worker threads and needs no display. matplotlib is imported on first use.
"""

from __future__ import annotations

import io
from collections.abc import Sequence
from typing import Any, Final, Literal

import numpy as np

from service.api.http.negotiation import choose_media_type
from service.api.http.units import Dimension, UnitSet, convert_from_si, output_unit
from service.core.simulation import VacuumChamberResult

__all__ = [
    "PLOT_MEDIA_TYPES",
    "PlotFormat",
    "display_unit",
    "figure_bytes",
    "mark_events",
    "plot_format_for",
    "plot_simulation",
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


def plot_simulation(
    result: VacuumChamberResult,
    unit_set: UnitSet,
    kind: PlotFormat,
    calculation_id: str | None = None,
) -> bytes:
    """Pressure (log scale) and product temperature against time, events marked with their
    times, the schedule's limits drawn as markers (filled when met, open when missed).

    Parameters
    ----------
    result
        A simulation result.
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


def _shade_limits(axis: Any, time: np.ndarray, result: VacuumChamberResult) -> None:
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
    # svg.fonttype "none": text stays text (searchable, selectable), not glyph paths.
    with matplotlib.rc_context({"svg.fonttype": "none"}):
        figure.savefig(buffer, format=kind, metadata=metadata, dpi=100)
    return buffer.getvalue()
