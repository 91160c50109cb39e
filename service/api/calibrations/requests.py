"""Calibration request -> core inputs: the case, the measured run (JSON or CSV), bounds.

Every quantity is read with :func:`service.api.http.quantities.read_quantity` under the
path the request uses (``estimate[1].upper``, ``measured.total_pressure``), so errors name
the field as the client sent it; a CSV log's errors name the column and the row (from 1,
the first row under the header).
"""

from __future__ import annotations

import math
from dataclasses import dataclass
from typing import Any, Final

import numpy as np

from service.api.calibrations.schemas import (
    EstimateInput,
    MeasuredSeriesInput,
    VacuumChamberCalibrationCreate,
)
from service.api.http.csv_io import CsvError, parse_csv
from service.api.http.models import QuantityValues
from service.api.http.quantities import read_quantity
from service.api.http.units import Dimension
from service.api.simulations.answers import FIELD_DIMENSIONS as SI_UNIT_DIMENSIONS
from service.api.simulations.answers import STATE_DIMENSIONS
from service.api.simulations.requests import read_vacuum_chamber
from service.core.calibration import (
    MEASURABLE_SERIES,
    EstimatedParameter,
    MeasuredRun,
    MeasuredSeries,
    series_quantity,
)
from service.core.errors import InvalidInputError
from service.core.properties.phase import FloatArray
from service.core.simulation import VacuumChamberCase
from service.core.simulation.case_fields import CASE_FIELDS

__all__ = ["FIELD_DIMENSIONS", "CalibrationInputs", "read_calibration", "series_dimension"]

_BY_SI_UNIT: Final = SI_UNIT_DIMENSIONS

FIELD_DIMENSIONS: Final[dict[str, Dimension]] = {
    path: _BY_SI_UNIT[field.unit] for path, field in CASE_FIELDS.items()
}
"""Dimension of each case field, by its dotted path."""

_STATES: Final = {
    **dict(STATE_DIMENSIONS),
    "core_temperature": Dimension.TEMPERATURE,
    "surface_temperature": Dimension.TEMPERATURE,
}
_UNCERTAINTY_KEYS: Final = frozenset({"absolute", "relative"})


@dataclass(frozen=True)
class CalibrationInputs:
    """What the core takes, read from one request."""

    case: VacuumChamberCase
    notes: tuple[str, ...]
    run: MeasuredRun
    parameters: tuple[EstimatedParameter, ...]


def series_dimension(name: str, field: str) -> Dimension:
    """Dimension of a measured series: ``time`` or a simulation series (with a label)."""
    quantity = series_quantity(name)
    if quantity != "time" and quantity not in MEASURABLE_SERIES:
        known = ", ".join(["time", *MEASURABLE_SERIES])
        raise InvalidInputError(
            field,
            f"not a series the fit can compare; known: {known} (a probe label may follow a "
            "dot: product_temperature.core)",
            name,
        )
    return _STATES[quantity]


def _readings(
    values: list[float],
    unit: str | None,
    uncertainty: float | None,
    dimension: Dimension,
    field: str,
) -> tuple[FloatArray, float | None]:
    """Readings in SI and their absolute uncertainty as an SI difference."""
    parsed = read_quantity(
        QuantityValues(values=values, unit=unit, uncertainty=uncertainty),
        field=field,
        dimension=dimension,
    )
    stated = parsed.standard_uncertainty
    return parsed.si, None if stated is None else float(stated[0])


def _from_json(measured: dict[str, MeasuredSeriesInput]) -> tuple[MeasuredSeries, ...]:
    if "time" not in measured:
        raise InvalidInputError("measured.time", "the measured run needs a time series")
    clock = measured["time"]
    if clock.uncertainty is not None or clock.relative_uncertainty is not None:
        raise InvalidInputError("measured.time", "takes no uncertainty (times count as exact)")
    time, _ = _readings(clock.values, clock.unit, None, Dimension.TIME, "measured.time")
    series = []
    for name, item in measured.items():
        if name == "time":
            continue
        field = f"measured.{name}"
        dimension = series_dimension(name, field)
        if len(item.values) != time.size:
            raise InvalidInputError(
                field, f"has {len(item.values)} values; measured.time has {time.size}"
            )
        values, absolute = _readings(item.values, item.unit, item.uncertainty, dimension, field)
        series.append(
            MeasuredSeries(
                name=name,
                time=time,
                values=values,
                absolute_uncertainty=absolute,
                relative_uncertainty=item.relative_uncertainty,
            )
        )
    return tuple(series)


def _cell_number(cell: str, field: str, row: int) -> float:
    try:
        value = float(cell)
    except ValueError:
        raise InvalidInputError(field, f"row {row + 1}: {cell!r} is not a number", cell) from None
    if not math.isfinite(value):
        raise InvalidInputError(field, f"row {row + 1}: {cell!r} is not a finite number", cell)
    return value


def _from_csv(text: str, stated: dict[str, dict[str, float]]) -> tuple[MeasuredSeries, ...]:
    try:
        table = parse_csv(text.encode())
    except CsvError as error:
        where = "" if error.column == "body" else f".{error.column}"
        raise InvalidInputError(f"measured_csv{where}", error.detail, error.value) from None
    names = [".".join(column.path) for column in table.columns]
    if "time" not in names:
        raise InvalidInputError(
            "measured_csv", "the header needs a time column, e.g. 'time [s]'", names
        )
    for name, entry in stated.items():
        if name not in names or name == "time":
            raise InvalidInputError(
                f"csv_uncertainty.{name}", "names no measured column of the CSV", name
            )
        if not set(entry) <= _UNCERTAINTY_KEYS or not entry:
            raise InvalidInputError(
                f"csv_uncertainty.{name}", "takes 'absolute' and/or 'relative'", sorted(entry)
            )
    clock = table.columns[names.index("time")]
    rows = np.arange(table.rows)
    time_cells = []
    for row, cell in enumerate(clock.cells):
        if cell == "":
            raise InvalidInputError(f"measured_csv.{clock.name}", f"row {row + 1}: no time")
        time_cells.append(_cell_number(cell, f"measured_csv.{clock.name}", row))
    time, _ = _readings(time_cells, clock.unit, None, Dimension.TIME, f"measured_csv.{clock.name}")
    series = []
    for name, column in zip(names, table.columns, strict=True):
        if name == "time":
            continue
        field = f"measured_csv.{column.name}"
        dimension = series_dimension(name, field)
        present = np.array([cell != "" for cell in column.cells])
        if not present.any():
            raise InvalidInputError(field, "the column holds no readings")
        numbers = [
            _cell_number(cell, field, row) for row, cell in enumerate(column.cells) if cell != ""
        ]
        entry = stated.get(name, {})
        values, absolute = _readings(numbers, column.unit, entry.get("absolute"), dimension, field)
        series.append(
            MeasuredSeries(
                name=name,
                time=time[present],
                values=values,
                absolute_uncertainty=absolute,
                relative_uncertainty=entry.get("relative"),
                rows=rows[present],
            )
        )
    return tuple(series)


def _single(raw: Any, field: str, dimension: Dimension) -> float:
    parsed = read_quantity(raw, field=field, dimension=dimension)
    if parsed.is_array or parsed.size != 1:
        raise InvalidInputError(field, "must be a single value")
    return float(parsed.si[0])


def _parameter(index: int, item: EstimateInput) -> EstimatedParameter:
    field = f"estimate[{index}]"
    dimension = FIELD_DIMENSIONS.get(item.parameter)
    if dimension is None:
        known = ", ".join(FIELD_DIMENSIONS)
        raise InvalidInputError(
            f"{field}.parameter", f"not a scalar field of the case; known: {known}", item.parameter
        )
    return EstimatedParameter(
        path=item.parameter,
        lower=_single(item.lower, f"{field}.lower", dimension),
        upper=_single(item.upper, f"{field}.upper", dimension),
        initial=None
        if item.initial is None
        else _single(item.initial, f"{field}.initial", dimension),
    )


def read_calibration(body: VacuumChamberCalibrationCreate) -> CalibrationInputs:
    """The calibration request as core inputs.

    Raises
    ------
    InvalidInputError
        Neither or both of ``measured`` and ``measured_csv``; an unreadable series, cell
        or bound (naming the field, and the row for a CSV cell); an unknown field.
    """
    if (body.measured is None) == (body.measured_csv is None):
        given = "both" if body.measured is not None else "neither"
        raise InvalidInputError(
            "measured, measured_csv", f"give exactly one of measured or measured_csv ({given})"
        )
    if body.csv_uncertainty and body.measured_csv is None:
        raise InvalidInputError(
            "csv_uncertainty",
            "goes with measured_csv; with measured, state uncertainties in each series",
        )
    case, notes = read_vacuum_chamber(body.case)
    series = (
        _from_json(body.measured)
        if body.measured is not None
        else _from_csv(str(body.measured_csv), body.csv_uncertainty)
    )
    run = MeasuredRun(
        series=series, pump_start=_single(body.pump_start, "pump_start", Dimension.TIME)
    )
    parameters = tuple(_parameter(index, item) for index, item in enumerate(body.estimate))
    return CalibrationInputs(case=case, notes=notes, run=run, parameters=parameters)
