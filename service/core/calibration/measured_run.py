"""A measured run of a vacuum chamber (a logger trace), checked and cleaned for a fit.

A logger writes rows: a time and one reading per channel. Real logs arrive out of order,
with rows written twice, gaps, a clock that started before the pump, and a few wild
readings. :func:`clean_measured_run` takes care of the first four and refuses what it
cannot repair with an error naming the row and the column; wild readings are left to the
fit (robust loss) and flagged after it.
"""

from __future__ import annotations

from dataclasses import dataclass
from typing import Final

import numpy as np

from service.core.errors import InvalidInputError, OutOfRangeError
from service.core.properties.phase import FloatArray

__all__ = [
    "MEASURABLE_SERIES",
    "RELATIVE_SERIES",
    "CleanedRun",
    "CleanedSeries",
    "MeasuredRun",
    "MeasuredSeries",
    "clean_measured_run",
    "series_quantity",
]

MEASURABLE_SERIES: Final[dict[str, str]] = {
    "total_pressure": "Pa",
    "air_pressure": "Pa",
    "vapor_pressure": "Pa",
    "product_temperature": "K",
    "core_temperature": "K",
    "surface_temperature": "K",
    "evaporated_mass": "kg",
    "condenser_ice": "kg",
    "condenser_load": "W",
    "pump_volume_flow": "m3/s",
}
"""Series of the simulation a measured run may hold, with their SI units."""

RELATIVE_SERIES: Final = frozenset({"total_pressure", "air_pressure", "vapor_pressure"})
"""Series compared on a log scale (relative residuals): pressures span decades, and
vacuum gauges state their uncertainty as a fraction of the reading."""

_GAP_FACTOR: Final = 5.0
"""A gap is an interval longer than this many times the median interval."""


@dataclass(frozen=True)
class MeasuredSeries:
    """One logged channel, named as the simulation names its series.

    Attributes
    ----------
    name : str
        A key of :data:`MEASURABLE_SERIES` (``"total_pressure"``, ``"product_temperature"``),
        optionally with a label after a dot for a second probe of the same quantity
        (``"product_temperature.core"``): each probe is compared with the model's series.
    time : ndarray
        s on the logger clock, one per value (any order).
    values : ndarray
        SI (Pa, K, kg, W, m3/s).
    absolute_uncertainty : float or None
        Standard uncertainty (k=1) of each reading, SI; None when not stated.
    relative_uncertainty : float or None
        Standard uncertainty as a fraction of the reading; None when not stated.
    rows : ndarray of int or None
        Row of each value in the client's log (from 0); None means 0, 1, 2...
    """

    name: str
    time: FloatArray
    values: FloatArray
    absolute_uncertainty: float | None = None
    relative_uncertainty: float | None = None
    rows: np.ndarray | None = None


@dataclass(frozen=True)
class MeasuredRun:
    """A logged run: its channels and when, on the logger clock, the pump started.

    Attributes
    ----------
    series : tuple of MeasuredSeries
    pump_start : float
        s on the logger clock at which pumping starts (the simulation's time zero).
        Rows before it are trimmed.
    """

    series: tuple[MeasuredSeries, ...]
    pump_start: float = 0.0


@dataclass(frozen=True)
class CleanedSeries:
    """One channel ready for the fit: times from the pump start, sorted, SI.

    ``rows`` keeps each reading's row in the client's log, so later reports (outliers)
    name the row the client knows.
    """

    name: str
    time: FloatArray
    values: FloatArray
    rows: np.ndarray
    absolute_uncertainty: float | None
    relative_uncertainty: float | None

    @property
    def quantity(self) -> str:
        """The model series it is compared with (the name without its probe label)."""
        return series_quantity(self.name)

    @property
    def relative(self) -> bool:
        """Whether the fit compares this series on a log scale."""
        return self.quantity in RELATIVE_SERIES

    @property
    def stated_uncertainty(self) -> bool:
        """Whether the client stated this series' uncertainty."""
        return self.absolute_uncertainty is not None or self.relative_uncertainty is not None


@dataclass(frozen=True)
class CleanedRun:
    """The run as the fit uses it, and what cleaning did (one sentence each)."""

    series: tuple[CleanedSeries, ...]
    notes: tuple[str, ...]

    @property
    def end_time(self) -> float:
        """s from the pump start to the last reading."""
        return max(float(item.time[-1]) for item in self.series)

    @property
    def points(self) -> int:
        """Readings over all series."""
        return sum(int(item.time.size) for item in self.series)


def series_quantity(name: str) -> str:
    """The simulation series a measured series name refers to (before any ``.label``)."""
    return name.partition(".")[0]


def _check_uncertainty(value: float | None, field: str) -> None:
    if value is None:
        return
    if not np.isfinite(value) or value <= 0.0:
        raise InvalidInputError(field, "a stated uncertainty must be a finite number > 0", value)


def _first_bad(mask: np.ndarray) -> int:
    return int(np.flatnonzero(mask)[0])


def _clean_one(item: MeasuredSeries, pump_start: float, notes: list[str]) -> CleanedSeries:
    field = f"measured.{item.name}"
    quantity = series_quantity(item.name)
    if quantity not in MEASURABLE_SERIES:
        known = ", ".join(MEASURABLE_SERIES)
        raise InvalidInputError(
            field,
            f"not a series the fit can compare; known: {known} (a probe label may follow a "
            "dot: product_temperature.core)",
        )
    time = np.asarray(item.time, dtype=np.float64).ravel()
    values = np.asarray(item.values, dtype=np.float64).ravel()
    rows = np.arange(values.size) if item.rows is None else np.asarray(item.rows, dtype=np.int64)
    if values.size != time.size or rows.size != values.size:
        raise InvalidInputError(
            field, f"has {values.size} values; measured.time has {time.size}", values.size
        )
    if not np.isfinite(time).all():
        row = int(rows[_first_bad(~np.isfinite(time))])
        raise InvalidInputError("measured.time", f"row {row + 1}: the time is not finite", row)
    if not np.isfinite(values).all():
        row = int(rows[_first_bad(~np.isfinite(values))])
        raise InvalidInputError(field, f"row {row + 1}: the value is not finite", row)
    _check_uncertainty(item.absolute_uncertainty, f"{field}.uncertainty")
    _check_uncertainty(item.relative_uncertainty, f"{field}.relative_uncertainty")
    unit = MEASURABLE_SERIES[quantity]
    negative = values <= 0.0 if quantity in RELATIVE_SERIES or unit == "K" else values < 0.0
    if negative.any():
        first = _first_bad(negative)
        raise OutOfRangeError(
            field,
            float(values[first]),
            0.0,
            None,
            unit,
            f"row {int(rows[first]) + 1}: an absolute pressure or temperature is > 0, a mass "
            "or flow >= 0",
            index=int(rows[first]),
        )
    time = time - pump_start
    before = time < 0.0
    if before.any():
        notes.append(
            f"{item.name}: {int(before.sum())} reading(s) logged before the pump started "
            "(pump_start) were left out."
        )
        keep = ~before
        time, values, rows = time[keep], values[keep], rows[keep]
    if time.size == 0:
        raise InvalidInputError(
            field, "every reading lies before the pump start; check pump_start", pump_start
        )
    order = np.argsort(time, kind="stable")
    if (np.diff(time) < 0.0).any():
        first_row = int(rows[_first_bad(np.diff(time) < 0.0) + 1])
        notes.append(
            f"{item.name}: readings were not in time order (first at row {first_row + 1}); "
            "they were sorted."
        )
    time, values, rows = time[order], values[order], rows[order]
    repeated = np.zeros(time.size, dtype=bool)
    repeated[1:] = (np.diff(time) == 0.0) & (np.diff(values) == 0.0)
    if repeated.any():
        notes.append(
            f"{item.name}: {int(repeated.sum())} row(s) repeating an earlier row (same time, "
            f"same value; first at row {int(rows[_first_bad(repeated)]) + 1}) were left out."
        )
        time, values, rows = time[~repeated], values[~repeated], rows[~repeated]
    same_time = np.diff(time) == 0.0
    if same_time.any():
        notes.append(
            f"{item.name}: {int(same_time.sum())} reading(s) share a time with another "
            "reading but differ from it; both are kept as separate readings."
        )
    intervals = np.diff(time)
    intervals = intervals[intervals > 0.0]
    if intervals.size >= 2:
        median = float(np.median(intervals))
        gaps = int((intervals > _GAP_FACTOR * median).sum())
        if gaps:
            notes.append(
                f"{item.name}: {gaps} gap(s) longer than {_GAP_FACTOR:g} times the median "
                f"interval ({median:.4g} s); the fit compares only the readings there are."
            )
    return CleanedSeries(
        name=item.name,
        time=time,
        values=values,
        rows=rows,
        absolute_uncertainty=item.absolute_uncertainty,
        relative_uncertainty=item.relative_uncertainty,
    )


def clean_measured_run(run: MeasuredRun) -> CleanedRun:
    """Check a measured run and bring it to the fit's form.

    Parameters
    ----------
    run : MeasuredRun
        Logged channels (SI) and the pump start on the logger clock (s).

    Returns
    -------
    CleanedRun
        Per series: times from the pump start (s), sorted; readings before the pump start
        left out; rows repeating an earlier row (same time and value) left out. Readings
        at one time with different values are kept. Notes say what was done.

    Raises
    ------
    InvalidInputError
        No series, a series named twice or unknown, lengths that differ from the time
        column, a non-finite time or value (naming the row, counted from 1), a bad stated
        uncertainty, or no reading after the pump start.
    OutOfRangeError
        A pressure or temperature <= 0, or a mass or flow < 0 (``index`` = the row, from 0).
    """
    if not run.series:
        raise InvalidInputError("measured", "needs at least one measured series besides time")
    if not np.isfinite(run.pump_start):
        raise InvalidInputError("pump_start", "must be finite", run.pump_start)
    names = [item.name for item in run.series]
    for name in names:
        if names.count(name) > 1:
            raise InvalidInputError(f"measured.{name}", "is given twice")
    notes: list[str] = []
    series = tuple(_clean_one(item, run.pump_start, notes) for item in run.series)
    if run.pump_start != 0.0:
        notes.append(
            f"Logger times shifted by {-run.pump_start:g} s so that the pump starts at time 0."
        )
    return CleanedRun(series=series, notes=tuple(notes))
