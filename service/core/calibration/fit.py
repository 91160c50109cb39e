"""Fit case fields of the chamber model to a measured run: weighted least squares.

One public function, :func:`calibrate_vacuum_chamber`. The model
(:func:`service.core.simulation.simulate_vacuum_chamber`) is run over the measured time
span and interpolated at the measured times; the residuals, weighted by the reading
uncertainties, are minimized by :func:`scipy.optimize.least_squares` (trust-region
reflective, within the parameters' bounds). Confidence intervals come from the Jacobian
at the solution (linearized covariance).
"""

from __future__ import annotations

import math
from dataclasses import dataclass, replace
from typing import Final, Literal, get_args

import numpy as np
from scipy.optimize import least_squares
from scipy.stats import norm, t

from service.core.calibration.measured_run import (
    CleanedRun,
    CleanedSeries,
    MeasuredRun,
    clean_measured_run,
)
from service.core.calibration.results import CalibrationResult, ParameterEstimate, SeriesFit
from service.core.errors import InvalidInputError, TripointError
from service.core.properties.advisories import Advisory
from service.core.properties.phase import FloatArray
from service.core.simulation import (
    REFERENCES as SIMULATION_REFERENCES,
)
from service.core.simulation import (
    VacuumChamberCase,
    VacuumChamberResult,
    simulate_vacuum_chamber,
)
from service.core.simulation.case_fields import CASE_FIELDS, case_field_value, with_case_field
from service.core.simulation.inputs import validate_case

__all__ = [
    "CALIBRATION_LIMITS",
    "LOSSES",
    "REFERENCES",
    "EstimatedParameter",
    "Loss",
    "calibrate_vacuum_chamber",
]

Loss = Literal["linear", "soft_l1", "huber", "cauchy"]
LOSSES: Final = get_args(Loss)

CALIBRATION_LIMITS: Final = {
    "parameters_max": 8,
    "series_points_min": 200,
    "series_points_max": 5000,
    "evaluations_max": 60,
}
"""At most 8 estimated fields; the model series has 200 to 5000 points (3 per distinct
measured time); at most 60 model runs per pass besides the Jacobians."""

NOT_ESTIMABLE: Final = frozenset({"end_time", "target_temperature"})
"""Case fields that end a simulation rather than describe the plant."""

REFERENCES: Final = (
    "Trust-region reflective least squares: Branch, M. A., Coleman, T. F. and Li, Y. "
    "(1999), SIAM J. Sci. Comput. 21(1), 1-23, as implemented by "
    "scipy.optimize.least_squares.",
    "Linearized confidence intervals and correlation of nonlinear least-squares estimates: "
    "Bates, D. M. and Watts, D. G. (1988), Nonlinear Regression Analysis and Its "
    "Applications, Wiley, ch. 2 (from memory).",
    "Standard uncertainty and coverage: JCGM 100:2008 (GUM), sections 4 and 6.",
    *SIMULATION_REFERENCES,
)

_OUTLIER_SIGMAS: Final = 4.0
_CORRELATION_WARNING: Final = 0.95
_SINGULAR: Final = 1e-8
"""Singular values of the weighted Jacobian below this fraction of the largest are
treated as zero (a direction the data do not determine)."""
_DIFF_STEP: Final = 1e-4
_TOLERANCE: Final = 1e-6
"""Relative change of the search variables and of the cost at which the fit stops; far
below the width of any useful interval."""
_PROVISIONAL_RELATIVE: Final = 0.02
_PROVISIONAL_FRACTION: Final = 0.01
_PRESSURE_FLOOR: Final = 1e-6
"""Pa: model pressures are floored here before taking ln (a zero vapor pressure)."""


@dataclass(frozen=True)
class EstimatedParameter:
    """A case field to estimate, with its search bounds (SI).

    Attributes
    ----------
    path : str
        A key of :data:`service.core.simulation.case_fields.CASE_FIELDS`, e.g.
        ``"chamber.leak_rate"``, ``"pump.speed_scale"``, ``"heat_gain.power"``.
    lower, upper : float
        Bounds, SI, ``lower < upper``; both inside the field's valid range.
    initial : float or None
        Start of the search, SI; None: the case's own value when within the bounds,
        else the middle of the bounds (geometric for a positive lower bound).
    """

    path: str
    lower: float
    upper: float
    initial: float | None = None


@dataclass(frozen=True)
class _Scale:
    """One parameter's map between its SI value and the search variable u."""

    path: str
    lower: float
    upper: float
    log: bool

    def to_search(self, value: float) -> float:
        if self.log:
            return math.log(value)
        return (value - self.lower) / (self.upper - self.lower)

    def from_search(self, u: float) -> float:
        if self.log:
            return math.exp(u)
        return self.lower + u * (self.upper - self.lower)

    @property
    def search_bounds(self) -> tuple[float, float]:
        return self.to_search(self.lower), self.to_search(self.upper)


def _scales(case: VacuumChamberCase, parameters: tuple[EstimatedParameter, ...]) -> list[_Scale]:
    if not parameters:
        raise InvalidInputError("estimate", "name at least one case field to estimate")
    most = CALIBRATION_LIMITS["parameters_max"]
    if len(parameters) > most:
        raise InvalidInputError("estimate", f"at most {most} fields at once", len(parameters))
    scales: list[_Scale] = []
    for index, item in enumerate(parameters):
        field = f"estimate[{index}]"
        if item.path not in CASE_FIELDS or item.path in NOT_ESTIMABLE:
            known = ", ".join(path for path in CASE_FIELDS if path not in NOT_ESTIMABLE)
            raise InvalidInputError(
                f"{field}.parameter", f"not an estimable case field; known: {known}", item.path
            )
        if any(other.path == item.path for other in parameters[:index]):
            raise InvalidInputError(f"{field}.parameter", "is named twice", item.path)
        for name, bound in (("lower", item.lower), ("upper", item.upper)):
            if not math.isfinite(bound):
                raise InvalidInputError(f"{field}.{name}", "must be finite", bound)
        if not item.lower < item.upper:
            raise InvalidInputError(
                f"{field}.upper", f"must exceed lower ({item.lower:.6g})", item.upper
            )
        if item.initial is not None and not item.lower <= item.initial <= item.upper:
            raise InvalidInputError(f"{field}.initial", "must lie within the bounds", item.initial)
        if case_field_value(case, item.path) is None and item.path.startswith("condenser."):
            raise InvalidInputError(f"{field}.parameter", "the case has no such field set")
        scales.append(_Scale(item.path, item.lower, item.upper, log=item.lower > 0.0))
    return scales


def _initial(case: VacuumChamberCase, item: EstimatedParameter, scale: _Scale) -> float:
    if item.initial is not None:
        return item.initial
    own = case_field_value(case, item.path)
    if own is not None and item.lower <= own <= item.upper:
        return own
    return math.sqrt(item.lower * item.upper) if scale.log else 0.5 * (item.lower + item.upper)


def _with_values(
    case: VacuumChamberCase, scales: list[_Scale], values: FloatArray
) -> VacuumChamberCase:
    for scale, value in zip(scales, values, strict=True):
        case = with_case_field(case, scale.path, float(value))
    return case


def _check_bounds(case: VacuumChamberCase, scales: list[_Scale], start: FloatArray) -> None:
    """Each bound, with the other fields at their start, must make a valid case."""
    for index, scale in enumerate(scales):
        for name, bound in (("lower", scale.lower), ("upper", scale.upper)):
            values = start.copy()
            values[index] = bound
            try:
                validate_case(_with_values(case, scales, values))
            except TripointError as error:
                raise InvalidInputError(
                    f"estimate[{index}].{name}",
                    f"{scale.path} = {bound:.6g} {CASE_FIELDS[scale.path].unit} makes an "
                    f"invalid case ({error})",
                    bound,
                ) from None


def _fit_case(case: VacuumChamberCase, run: CleanedRun) -> VacuumChamberCase:
    end = run.end_time
    if end <= 0.0:
        raise InvalidInputError(
            "measured.time", "the readings span no time after the pump start", end
        )
    distinct = np.unique(np.concatenate([item.time for item in run.series])).size
    limits = CALIBRATION_LIMITS
    points = int(min(limits["series_points_max"], max(limits["series_points_min"], 3 * distinct)))
    return replace(case, end_time=end, target_temperature=None, schedule=(), series_points=points)


def _model_at(result: VacuumChamberResult, item: CleanedSeries) -> FloatArray:
    """Model values of one series at its measured times (held beyond the model's end)."""
    times = result.series.time
    found = getattr(result.series, item.quantity)
    if found is None:
        raise InvalidInputError(
            f"measured.{item.name}",
            f"the model has no {item.quantity} without product.interior in the case",
            item.name,
        )
    values = np.asarray(found, dtype=np.float64)
    if item.relative:
        logs = np.log(np.maximum(values, _PRESSURE_FLOOR))
        return np.exp(np.interp(item.time, times, logs))
    return np.interp(item.time, times, values)


def _compared(item: CleanedSeries, values: FloatArray) -> FloatArray:
    return np.log(np.maximum(values, _PRESSURE_FLOOR)) if item.relative else values


def _stated_sigma(item: CleanedSeries) -> FloatArray:
    """Stated reading uncertainty in the compared scale (relative for log series)."""
    absolute = item.absolute_uncertainty or 0.0
    relative = item.relative_uncertainty or 0.0
    if item.relative:
        return np.sqrt(relative**2 + (absolute / item.values) ** 2)
    return np.sqrt(absolute**2 + (relative * item.values) ** 2)


def _provisional_sigma(item: CleanedSeries) -> float:
    if item.relative:
        return _PROVISIONAL_RELATIVE
    spread = float(np.ptp(item.values))
    return max(_PROVISIONAL_FRACTION * spread, 1e-9 * max(float(np.max(np.abs(item.values))), 1.0))


class _Objective:
    """Weighted residuals of the model at search variables u, with a cache of runs."""

    def __init__(self, case: VacuumChamberCase, run: CleanedRun, scales: list[_Scale]) -> None:
        self.case = case
        self.run = run
        self.scales = scales
        self.sigmas: list[FloatArray] = []
        self.upper = np.array([scale.search_bounds[1] for scale in scales])
        self.simulations = 0
        self._last: tuple[bytes, list[FloatArray]] | None = None

    def values(self, u: FloatArray) -> FloatArray:
        return np.array(
            [scale.from_search(float(x)) for scale, x in zip(self.scales, u, strict=True)]
        )

    def simulate(self, u: FloatArray) -> VacuumChamberResult:
        values = self.values(u)
        self.simulations += 1
        try:
            return simulate_vacuum_chamber(_with_values(self.case, self.scales, values))
        except TripointError as error:
            at = ", ".join(
                f"{scale.path} = {value:.6g}"
                for scale, value in zip(self.scales, values, strict=True)
            )
            raise InvalidInputError(
                "estimate",
                f"the model fails at {at} ({error}); narrow the bounds or check the case",
            ) from None

    def model(self, u: FloatArray) -> list[FloatArray]:
        key = np.asarray(u, dtype=np.float64).tobytes()
        if self._last is not None and self._last[0] == key:
            return self._last[1]
        result = self.simulate(u)
        modelled = [_model_at(result, item) for item in self.run.series]
        self._last = (key, modelled)
        return modelled

    def raw(self, u: FloatArray) -> list[FloatArray]:
        """Residuals in the compared scale (ln for pressures), unweighted, per series."""
        return [
            _compared(item, model) - _compared(item, item.values)
            for item, model in zip(self.run.series, self.model(u), strict=True)
        ]

    def jacobian(self, u: FloatArray, *_: object) -> FloatArray:
        """Forward differences of the weighted residuals, a fixed step in u.

        The step is absolute (1e-4 in ln value, or of the bound width), taken backwards
        where a forward step would leave the bounds.
        """
        base = self(u)
        columns = np.empty((base.size, u.size))
        for index in range(u.size):
            step = _DIFF_STEP if u[index] + _DIFF_STEP <= self.upper[index] else -_DIFF_STEP
            moved = np.array(u, dtype=np.float64)
            moved[index] += step
            columns[:, index] = (self(moved) - base) / step
        return columns

    def __call__(self, u: FloatArray) -> FloatArray:
        return np.concatenate([r / s for r, s in zip(self.raw(u), self.sigmas, strict=True)])


def _scatter(residual: FloatArray, share: float, loss: Loss) -> float:
    """Reading uncertainty estimated from a series' residuals (its share of n - p)."""
    if loss != "linear":
        centre = float(np.median(residual))
        mad = 1.4826 * float(np.median(np.abs(residual - centre)))
        if mad > 0.0:
            return mad
    dof = max(residual.size - share, 1.0)
    return math.sqrt(float(np.sum(residual**2)) / dof)


def _solve(
    objective: _Objective, u0: FloatArray, bounds: tuple[FloatArray, FloatArray], loss: Loss
) -> object:
    return least_squares(
        objective,
        u0,
        bounds=bounds,
        method="trf",
        loss=loss,
        jac=objective.jacobian,
        x_scale=1.0,
        xtol=_TOLERANCE,
        ftol=_TOLERANCE,
        max_nfev=CALIBRATION_LIMITS["evaluations_max"],
    )


def _covariance(jacobian: FloatArray) -> tuple[FloatArray, np.ndarray]:
    """Linearized covariance of u (pseudo-inverse of J^T J) and which u it determines."""
    _, singular, rows = np.linalg.svd(jacobian, full_matrices=False)
    keep = (
        singular > _SINGULAR * singular[0]
        if singular.size and singular[0] > 0
        else (np.zeros(singular.size, dtype=bool))
    )
    kept = rows[keep]
    covariance = (kept.T / singular[keep] ** 2) @ kept
    dropped = rows[~keep]
    determined = (
        np.sum(dropped**2, axis=0) < 1e-2 if dropped.size else np.ones(rows.shape[1], dtype=bool)
    )
    return covariance, determined


def _estimates(
    scales: list[_Scale],
    u: FloatArray,
    start: FloatArray,
    covariance: FloatArray,
    determined: np.ndarray,
    quantile: float,
    active: np.ndarray,
) -> tuple[ParameterEstimate, ...]:
    items = []
    for index, scale in enumerate(scales):
        value = scale.from_search(float(u[index]))
        spread = math.sqrt(max(float(covariance[index, index]), 0.0))
        standard: float | None = None
        low: float | None = None
        high: float | None = None
        if determined[index]:
            if scale.log:
                standard = value * spread
                low = value * math.exp(-quantile * spread)
                high = value * math.exp(quantile * spread)
            else:
                standard = spread * (scale.upper - scale.lower)
                low, high = value - quantile * standard, value + quantile * standard
        items.append(
            ParameterEstimate(
                path=scale.path,
                unit=CASE_FIELDS[scale.path].unit,
                value=value,
                standard_uncertainty=standard,
                interval_lower=low,
                interval_upper=high,
                bound_lower=scale.lower,
                bound_upper=scale.upper,
                initial=float(start[index]),
                scale="log" if scale.log else "linear",
                at_bound=bool(active[index]),
            )
        )
    return tuple(items)


def _correlation(covariance: FloatArray, determined: np.ndarray) -> FloatArray:
    spread = np.sqrt(np.clip(np.diag(covariance), 0.0, None))
    size = spread.size
    correlation = np.eye(size)
    for i in range(size):
        for j in range(size):
            if i != j and determined[i] and determined[j] and spread[i] > 0 and spread[j] > 0:
                correlation[i, j] = covariance[i, j] / (spread[i] * spread[j])
    return np.clip(correlation, -1.0, 1.0)


def _parameter_warnings(
    estimates: tuple[ParameterEstimate, ...], correlation: FloatArray
) -> list[Advisory]:
    items: list[Advisory] = []
    for estimate in estimates:
        if estimate.interval_lower is None or estimate.interval_upper is None:
            items.append(
                Advisory(
                    "not-identifiable",
                    f"{estimate.path}: the measured series do not determine it (the fit is "
                    "insensitive to it, or only to a combination with other fields); fix it "
                    "or measure what it changes.",
                )
            )
            continue
        width = estimate.interval_upper - estimate.interval_lower
        if width > estimate.bound_upper - estimate.bound_lower:
            items.append(
                Advisory(
                    "interval-exceeds-bounds",
                    f"{estimate.path}: its confidence interval is wider than its search "
                    "bounds; the data barely constrain it.",
                )
            )
        elif width > abs(estimate.value):
            items.append(
                Advisory(
                    "interval-exceeds-value",
                    f"{estimate.path}: its confidence interval is wider than the estimate "
                    "itself; the data constrain it poorly.",
                )
            )
        if estimate.at_bound:
            items.append(
                Advisory(
                    "at-bound",
                    f"{estimate.path}: the estimate sits at a search bound; widen the bound "
                    "if the physics allows. Its interval assumes the bound is not active.",
                )
            )
    size = len(estimates)
    for i in range(size):
        for j in range(i + 1, size):
            if abs(float(correlation[i, j])) > _CORRELATION_WARNING:
                items.append(
                    Advisory(
                        "strongly-correlated",
                        f"{estimates[i].path} and {estimates[j].path} are correlated "
                        f"({float(correlation[i, j]):+.3f}): the data determine a combination "
                        "of them better than either one.",
                    )
                )
    return items


def _assumptions(loss: Loss, any_estimated: bool) -> tuple[str, ...]:
    items = [
        "Weighted least squares of the chamber model to the readings "
        "(scipy.optimize.least_squares, trust-region reflective, within the bounds); the "
        "model runs over the measured span and is interpolated at the measured times "
        "(pressures linearly in ln p).",
        "Pressures are compared as ln p (relative residuals); other series as differences.",
        "Fields with a positive lower bound are searched, and their intervals formed, in "
        "ln value; others linearly between their bounds.",
        "Confidence intervals are linearized (Jacobian at the estimate by finite "
        "differences): readings independent, the model structurally right, the estimate "
        "away from its bounds.",
        "The case's target temperature and schedule are not used by the fit; the model "
        "runs to the last reading.",
    ]
    if any_estimated:
        items.append(
            "Series without a stated uncertainty are weighted by their residual scatter "
            "(estimated after a first pass); intervals then use Student's t with n - p "
            "degrees of freedom, and model error counts as scatter."
        )
    else:
        items.append(
            "Every series is weighted by its stated reading uncertainty; intervals use the "
            "normal quantile (uncertainties taken as known)."
        )
    if loss != "linear":
        items.append(
            f"Robust loss {loss!r} (scipy.optimize.least_squares, f_scale 1 standard "
            "uncertainty): large residuals weigh less, so a few outliers pull the fit less; "
            "scatter estimated by the median absolute deviation."
        )
    return tuple(items)


def calibrate_vacuum_chamber(
    case: VacuumChamberCase,
    measured: MeasuredRun,
    parameters: tuple[EstimatedParameter, ...],
    *,
    loss: Loss = "linear",
    confidence: float = 0.95,
) -> CalibrationResult:
    """Estimate case fields from a measured run, with confidence intervals.

    Parameters
    ----------
    case : VacuumChamberCase
        The chamber, pump, product... as known; the estimated fields start from it.
    measured : MeasuredRun
        Logged series (SI), named as the simulation's series, and the pump start on the
        logger clock (s).
    parameters : tuple of EstimatedParameter
        1 to 8 case fields by dotted path, each with bounds (SI).
    loss : {"linear", "soft_l1", "huber", "cauchy"}
        ``linear`` is ordinary weighted least squares; the others are robust to outliers.
    confidence : float
        Level of the intervals, 0.5 to 0.999.

    Returns
    -------
    CalibrationResult
        Estimates with intervals, correlation matrix, residual RMS per series, outlier
        rows, warnings for fields the data cannot determine, the fitted case and the
        fitted simulation.

    Raises
    ------
    InvalidInputError
        A bad log (see :func:`clean_measured_run`), unknown or repeated fields, bounds
        that are not ordered or make an invalid case, fewer readings than fields, or a
        model that fails within the bounds.
    OutOfRangeError
        A reading out of its physical range (the row as ``index``).

    Notes
    -----
    Minimizes sum_i rho(r_i^2) with r_i = (g(y_model(t_i)) - g(y_i)) / sigma_i, g = ln for
    pressures and identity otherwise, rho the loss. With J the weighted Jacobian in the
    search variables u at the solution, cov(u) = (J^T J)^-1 (pseudo-inverse; directions
    with singular values below 1e-8 of the largest are undetermined). The interval is
    u +- q sqrt(cov_jj), mapped back (exp for log-scaled fields); q is the normal quantile
    with stated uncertainties, Student's t with n - p degrees of freedom otherwise.

    References
    ----------
    Branch, Coleman and Li, SIAM J. Sci. Comput. 21 (1999); Bates and Watts, Nonlinear
    Regression Analysis and Its Applications (1988); JCGM 100:2008.
    """
    if loss not in LOSSES:
        raise InvalidInputError("loss", f"must be one of {', '.join(LOSSES)}", loss)
    if not (0.5 <= confidence <= 0.999):
        raise InvalidInputError("confidence", "must lie from 0.5 to 0.999", confidence)
    validate_case(case)
    run = clean_measured_run(measured)
    scales = _scales(case, parameters)
    start = np.array(
        [_initial(case, item, scale) for item, scale in zip(parameters, scales, strict=True)]
    )
    _check_bounds(case, scales, start)
    points = run.points
    count = len(scales)
    if points <= count:
        raise InvalidInputError(
            "measured", f"needs more readings ({points}) than estimated fields ({count})", points
        )
    fit_case = _fit_case(case, run)
    try:
        validate_case(fit_case)
    except TripointError as error:
        raise InvalidInputError(
            "measured.time",
            f"the readings span {run.end_time:.6g} s after the pump start, which the model "
            f"cannot run ({error})",
            run.end_time,
        ) from None
    objective = _Objective(fit_case, run, scales)
    bounds = (
        np.array([scale.search_bounds[0] for scale in scales]),
        np.array([scale.search_bounds[1] for scale in scales]),
    )
    u0 = np.array([scale.to_search(float(x)) for scale, x in zip(scales, start, strict=True)])
    stated = [item.stated_uncertainty for item in run.series]
    objective.sigmas = [
        _stated_sigma(item) if given else np.full(item.values.size, _provisional_sigma(item))
        for item, given in zip(run.series, stated, strict=True)
    ]
    solution = _solve(objective, u0, bounds, loss)
    if not all(stated):
        raw = objective.raw(solution.x)  # type: ignore[attr-defined]
        objective.sigmas = [
            sigma
            if given
            else np.full(
                residual.size,
                max(
                    _scatter(residual, count * residual.size / points, loss),
                    1e-12 * float(sigma[0]),
                ),
            )
            for sigma, residual, given in zip(objective.sigmas, raw, stated, strict=True)
        ]
        solution = _solve(objective, solution.x, bounds, loss)  # type: ignore[attr-defined]
    u = np.asarray(solution.x, dtype=np.float64)  # type: ignore[attr-defined]
    jacobian = np.asarray(solution.jac, dtype=np.float64)  # type: ignore[attr-defined]
    covariance, determined = _covariance(jacobian)
    dof = points - count
    level = 0.5 + 0.5 * confidence
    basis: Literal["normal", "student-t"] = "normal" if all(stated) else "student-t"
    quantile = float(norm.ppf(level)) if basis == "normal" else float(t.ppf(level, dof))
    span = bounds[1] - bounds[0]
    active = (u - bounds[0] <= 1e-6 * span) | (bounds[1] - u <= 1e-6 * span)
    estimates = _estimates(scales, u, start, covariance, determined, quantile, active)
    correlation = _correlation(covariance, determined)
    weighted = objective(u)
    chi_square = float(np.sum(weighted**2)) / max(dof, 1)
    simulation = objective.simulate(u)
    fits: list[SeriesFit] = []
    warnings = _parameter_warnings(estimates, correlation)
    offset = 0
    for item, sigma, given in zip(run.series, objective.sigmas, stated, strict=True):
        modelled = _model_at(simulation, item)
        normalized = weighted[offset : offset + item.values.size]
        offset += item.values.size
        outliers = tuple(int(row) for row in item.rows[np.abs(normalized) > _OUTLIER_SIGMAS])
        difference = modelled - item.values
        ratio = np.log(np.maximum(modelled, _PRESSURE_FLOOR) / item.values)
        fits.append(
            SeriesFit(
                name=item.name,
                time=item.time,
                measured=item.values,
                fitted=modelled,
                rows=item.rows,
                rms=float(np.sqrt(np.mean(difference**2))),
                relative_rms=float(np.sqrt(np.mean(ratio**2))) if item.relative else None,
                standard_uncertainty=float(np.median(sigma)),
                uncertainty_basis="stated" if given else "estimated",
                outlier_rows=outliers,
            )
        )
        if outliers:
            shown = ", ".join(str(row + 1) for row in outliers[:10])
            warnings.append(
                Advisory(
                    "outliers",
                    f"{item.name}: {len(outliers)} reading(s) lie more than "
                    f"{_OUTLIER_SIGMAS:g} standard uncertainties from the fit (rows {shown}"
                    f"{'...' if len(outliers) > 10 else ''}); check them, or use a robust "
                    "loss.",
                )
            )
    if all(stated) and dof >= 10 and chi_square > 2.0:
        warnings.append(
            Advisory(
                "scatter-exceeds-stated",
                f"The residuals are {math.sqrt(chi_square):.3g} times the stated "
                "uncertainties (reduced chi-square "
                f"{chi_square:.3g}): the stated uncertainties are too small or the model "
                "misses part of the run; the intervals are too narrow.",
            )
        )
    converged = int(solution.status) > 0  # type: ignore[attr-defined]
    if not converged:
        warnings.append(
            Advisory(
                "not-converged",
                "The fit stopped at its evaluation limit before converging; the estimates "
                "and intervals are provisional (start closer or narrow the bounds).",
            )
        )
    if simulation.summary.end_time < run.end_time * (1.0 - 1e-9):
        warnings.append(
            Advisory(
                "model-ended-early",
                f"The fitted model ends ({simulation.summary.end_reason}) before the last "
                "reading; later readings are compared with its last state.",
            )
        )
    warnings.extend(simulation.warnings)
    values = np.array([estimate.value for estimate in estimates])
    return CalibrationResult(
        estimates=estimates,
        correlation=correlation,
        series=tuple(fits),
        fitted_case=_with_values(case, scales, values),
        simulation=simulation,
        confidence=confidence,
        quantile=quantile,
        quantile_basis=basis,
        points=points,
        degrees_of_freedom=dof,
        reduced_chi_square=chi_square,
        loss=loss,
        converged=converged,
        simulations=objective.simulations,
        notes=run.notes,
        warnings=tuple(warnings),
        assumptions=(*_assumptions(loss, not all(stated)), *simulation.assumptions),
        references=REFERENCES,
    )
