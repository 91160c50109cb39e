"""What a calibration returns: estimates with intervals, correlation, residuals, warnings."""

from __future__ import annotations

from dataclasses import dataclass
from typing import Literal

import numpy as np

from service.core.properties.advisories import Advisory
from service.core.properties.phase import FloatArray
from service.core.simulation import VacuumChamberCase, VacuumChamberResult

__all__ = ["CalibrationResult", "ParameterEstimate", "SeriesFit"]


@dataclass(frozen=True)
class ParameterEstimate:
    """One estimated case field.

    Attributes
    ----------
    path, unit : str
        Dotted path in the case and its SI unit.
    value : float
        Estimate, SI.
    standard_uncertainty : float or None
        k=1, SI (linearized); None when the data do not determine it.
    interval_lower, interval_upper : float or None
        Confidence interval (level of :attr:`CalibrationResult.confidence`), SI; None
        when the data do not determine it.
    bound_lower, bound_upper : float
        The search bounds, SI.
    initial : float
        Where the search started, SI.
    scale : {"log", "linear"}
        Space the search and the interval work in (log for a lower bound > 0: the
        interval is then symmetric in ln value and never reaches zero).
    at_bound : bool
        The estimate sits at a bound (the interval is then not reliable).
    """

    path: str
    unit: str
    value: float
    standard_uncertainty: float | None
    interval_lower: float | None
    interval_upper: float | None
    bound_lower: float
    bound_upper: float
    initial: float
    scale: Literal["log", "linear"]
    at_bound: bool


@dataclass(frozen=True)
class SeriesFit:
    """One measured series against the fitted model.

    Attributes
    ----------
    name : str
    time, measured, fitted : ndarray
        s from the pump start; readings and model values at those times, SI.
    rows : ndarray of int
        Row of each reading in the client's log (from 0).
    rms : float
        Root mean square of fitted - measured, SI.
    relative_rms : float or None
        RMS of ln(fitted / measured) for series compared on a log scale (pressures).
    standard_uncertainty : float
        Reading uncertainty the fit weighted with (k=1): a fraction of the reading for a
        log-scale series, SI otherwise (the median where it varies along the series).
    uncertainty_basis : {"stated", "estimated"}
        Stated by the client, or estimated from the residual scatter.
    outlier_rows : tuple of int
        Rows (from 0) whose residual exceeds 4 standard uncertainties.
    """

    name: str
    time: FloatArray
    measured: FloatArray
    fitted: FloatArray
    rows: np.ndarray
    rms: float
    relative_rms: float | None
    standard_uncertainty: float
    uncertainty_basis: Literal["stated", "estimated"]
    outlier_rows: tuple[int, ...]


@dataclass(frozen=True)
class CalibrationResult:
    """Output of :func:`service.core.calibration.calibrate_vacuum_chamber`.

    Attributes
    ----------
    estimates : tuple of ParameterEstimate
    correlation : ndarray
        (p, p) correlation matrix of the estimates (in their fit scales); NaN-free:
        rows of undetermined parameters are 0 off the diagonal.
    series : tuple of SeriesFit
    fitted_case : VacuumChamberCase
        The client's case with the estimates written in.
    simulation : VacuumChamberResult
        The fitted model over the measured time span.
    confidence : float
        Level of the intervals (0.95).
    quantile : float
        Multiplier of the standard uncertainties giving the intervals.
    quantile_basis : {"normal", "student-t"}
        Normal with stated uncertainties; Student t with n - p degrees of freedom when
        any series' uncertainty is estimated from the scatter.
    points, degrees_of_freedom : int
    reduced_chi_square : float
        Weighted sum of squared residuals / degrees of freedom (about 1 when the stated
        uncertainties describe the scatter).
    loss : str
    converged : bool
    simulations : int
        Model runs the fit took.
    notes : tuple of str
        What cleaning the log did.
    warnings : tuple of Advisory
    assumptions, references : tuple of str
    """

    estimates: tuple[ParameterEstimate, ...]
    correlation: FloatArray
    series: tuple[SeriesFit, ...]
    fitted_case: VacuumChamberCase
    simulation: VacuumChamberResult
    confidence: float
    quantile: float
    quantile_basis: Literal["normal", "student-t"]
    points: int
    degrees_of_freedom: int
    reduced_chi_square: float
    loss: str
    converged: bool
    simulations: int
    notes: tuple[str, ...]
    warnings: tuple[Advisory, ...]
    assumptions: tuple[str, ...]
    references: tuple[str, ...]
