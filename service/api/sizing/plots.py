"""Plot of a sizing's design curve: time to target against the unknown.

Drawn with matplotlib's object interface, as the simulation plots are (a ``Figure`` per
call, imported on first use); the format is chosen by the simulations' negotiation.
"""

from __future__ import annotations

import io

from service.api.simulations.plots import PlotFormat
from service.api.sizing.requests import FieldUnit
from service.core.sizing import SizingResult

__all__ = ["plot_design_curve"]


def plot_design_curve(result: SizingResult, unit: FieldUnit, kind: PlotFormat) -> bytes:
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
    buffer = io.BytesIO()
    metadata = {"Date": None} if kind == "svg" else None
    figure.savefig(buffer, format=kind, metadata=metadata, dpi=100)
    return buffer.getvalue()
