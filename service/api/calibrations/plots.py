"""Plot of a calibration: each measured series against the fitted model over time.

Drawn with matplotlib's object interface (a ``Figure`` per call), as the simulation's
plots are; the image format is negotiated by ``service.api.simulations.plots``.
"""

from __future__ import annotations

import io

import numpy as np

from service.api.calibrations.requests import series_dimension
from service.api.http.units import Dimension, UnitSet, convert_from_si, output_unit
from service.api.simulations.plots import PlotFormat
from service.core.calibration import CalibrationResult, series_quantity

__all__ = ["plot_calibration"]


def plot_calibration(result: CalibrationResult, unit_set: UnitSet, kind: PlotFormat) -> bytes:
    """One panel per measured quantity: readings as dots, the fitted model as a line.

    Pressures are drawn on a log axis. Outlier rows (more than 4 standard uncertainties
    from the fit) are circled.
    """
    from matplotlib.figure import Figure

    quantities = list(dict.fromkeys(series_quantity(fit.name) for fit in result.series))
    figure = Figure(figsize=(8.0, 2.0 + 2.5 * len(quantities)), layout="constrained")
    axes = figure.subplots(len(quantities), 1, sharex=True, squeeze=False)[:, 0]
    model = result.simulation.series
    minutes = model.time / 60.0
    for axis, quantity in zip(axes, quantities, strict=True):
        dimension = series_dimension(quantity, quantity)
        unit = output_unit(dimension, unit_set)
        fitted = convert_from_si(np.asarray(getattr(model, quantity)), dimension, unit_set)
        axis.plot(minutes, fitted, color="black", label="fitted model")
        for fit in result.series:
            if series_quantity(fit.name) != quantity:
                continue
            measured = convert_from_si(fit.measured, dimension, unit_set)
            axis.plot(fit.time / 60.0, measured, ".", ms=3, label=f"measured {fit.name}")
            outliers = np.isin(fit.rows, fit.outlier_rows)
            if outliers.any():
                axis.plot(
                    fit.time[outliers] / 60.0,
                    measured[outliers],
                    "o",
                    mfc="none",
                    color="tab:red",
                    label="outlier",
                )
        if dimension is Dimension.PRESSURE:
            axis.set_yscale("log")
        axis.set_ylabel(f"{quantity.replace('_', ' ')} [{unit}]")
        axis.grid(True, which="both", alpha=0.3)
        axis.legend(loc="upper right", fontsize="small")
    axes[-1].set_xlabel("time from pump start [min]")
    figure.suptitle("Calibration: measured run against the fitted model")
    buffer = io.BytesIO()
    metadata = {"Date": None} if kind == "svg" else None
    figure.savefig(buffer, format=kind, metadata=metadata, dpi=100)
    return buffer.getvalue()
