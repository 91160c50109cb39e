"""Calibration: fit case fields of the chamber model to a measured run.

Public API: :func:`calibrate_vacuum_chamber` with a :class:`MeasuredRun` (of
:class:`MeasuredSeries`) and :class:`EstimatedParameter` bounds ->
:class:`CalibrationResult`; :func:`clean_measured_run` for the log checks alone.
"""

from service.core.calibration.fit import (
    CALIBRATION_LIMITS,
    LOSSES,
    NOT_ESTIMABLE,
    REFERENCES,
    EstimatedParameter,
    Loss,
    calibrate_vacuum_chamber,
)
from service.core.calibration.measured_run import (
    MEASURABLE_SERIES,
    RELATIVE_SERIES,
    CleanedRun,
    CleanedSeries,
    MeasuredRun,
    MeasuredSeries,
    clean_measured_run,
    series_quantity,
)
from service.core.calibration.results import CalibrationResult, ParameterEstimate, SeriesFit

__all__ = [
    "CALIBRATION_LIMITS",
    "LOSSES",
    "MEASURABLE_SERIES",
    "NOT_ESTIMABLE",
    "REFERENCES",
    "RELATIVE_SERIES",
    "CalibrationResult",
    "CleanedRun",
    "CleanedSeries",
    "EstimatedParameter",
    "Loss",
    "MeasuredRun",
    "MeasuredSeries",
    "ParameterEstimate",
    "SeriesFit",
    "calibrate_vacuum_chamber",
    "clean_measured_run",
    "series_quantity",
]
