"""Core calibration result -> response dictionary; the fitted case as a simulation request."""

from __future__ import annotations

import copy
from typing import Any

from service.api.calibrations.requests import FIELD_DIMENSIONS, series_dimension
from service.api.calibrations.schemas import VacuumChamberCalibrationCreate
from service.api.http.envelope import envelope
from service.api.http.quantities import quantity_output, scalar_output
from service.api.http.units import Dimension, UnitSet
from service.core.calibration import CalibrationResult, ParameterEstimate, SeriesFit
from service.core.simulation import VacuumChamberCase
from service.core.simulation.case_fields import CASE_FIELDS

__all__ = ["calibration_answer", "calibration_headline", "fitted_case_body"]

_SI_UNIT_TEXT = {
    Dimension.VOLUME: "m3",
    Dimension.PRESSURE: "Pa",
    Dimension.TEMPERATURE: "K",
    Dimension.LEAK_RATE: "Pa*m3/s",
    Dimension.VOLUME_FLOW: "m3/s",
    Dimension.MASS: "kg",
    Dimension.POWER: "W",
    Dimension.SPECIFIC_ENTROPY: "J/(kg*K)",
    Dimension.AREA: "m2",
    Dimension.THERMAL_CONDUCTANCE: "W/K",
    Dimension.TIME: "s",
}


def _si_quantity(value: float, dimension: Dimension) -> Any:
    """A value as the simulation request takes it: a number (unit 1) or value + SI unit."""
    unit = _SI_UNIT_TEXT.get(dimension)
    return value if unit is None else {"value": value, "unit": unit}


def fitted_case_body(
    body: VacuumChamberCalibrationCreate, fitted: VacuumChamberCase, paths: list[str]
) -> dict[str, Any]:
    """The client's case as sent, with each estimated field written in (SI).

    ``pump.speed_scale`` is written as the scaled nominal speed and speed-curve speeds.
    """
    case = copy.deepcopy(body.case.model_dump(mode="json", exclude_unset=True))
    for path in paths:
        if path == "pump.speed_scale":
            pump = case.setdefault("pump", {})
            pump["nominal_speed"] = _si_quantity(fitted.pump.nominal_speed, Dimension.VOLUME_FLOW)
            for point, speed in zip(
                pump.get("speed_curve") or [], fitted.pump.speed_curve_speeds, strict=True
            ):
                point["speed"] = _si_quantity(speed, Dimension.VOLUME_FLOW)
            continue
        head, _, name = path.rpartition(".")
        parent = getattr(fitted, head) if head else fitted
        value = float(getattr(parent, name))
        node = case.setdefault(head, {}) if head else case
        if node is None:
            node = case[head] = {}
        node[name] = _si_quantity(value, FIELD_DIMENSIONS[path])
    return case


def _quantity(value: float | None, path: str, unit_set: UnitSet) -> Any:
    return scalar_output(value, FIELD_DIMENSIONS[path], unit_set)


def _difference(value: float | None, path: str, unit_set: UnitSet) -> Any:
    dimension = FIELD_DIMENSIONS[path]
    if dimension is Dimension.TEMPERATURE:
        dimension = Dimension.TEMPERATURE_DIFFERENCE
    return scalar_output(value, dimension, unit_set)


def _estimate(estimate: ParameterEstimate, unit_set: UnitSet) -> dict[str, Any]:
    path = estimate.path
    interval = None
    if estimate.interval_lower is not None and estimate.interval_upper is not None:
        interval = {
            "lower": _quantity(estimate.interval_lower, path, unit_set),
            "upper": _quantity(estimate.interval_upper, path, unit_set),
        }
    return {
        "parameter": path,
        "meaning": CASE_FIELDS[path].meaning,
        "value": _quantity(estimate.value, path, unit_set),
        "standard_uncertainty": _difference(estimate.standard_uncertainty, path, unit_set),
        "interval": interval,
        "bounds": {
            "lower": _quantity(estimate.bound_lower, path, unit_set),
            "upper": _quantity(estimate.bound_upper, path, unit_set),
        },
        "initial": _quantity(estimate.initial, path, unit_set),
        "scale": estimate.scale,
        "at_bound": estimate.at_bound,
    }


def _series(fit: SeriesFit, unit_set: UnitSet) -> dict[str, Any]:
    dimension = series_dimension(fit.name, f"measured.{fit.name}")
    difference = (
        Dimension.TEMPERATURE_DIFFERENCE if dimension is Dimension.TEMPERATURE else dimension
    )
    uncertainty_dimension = Dimension.DIMENSIONLESS if fit.relative_rms is not None else difference
    return {
        "name": fit.name,
        "points": int(fit.time.size),
        "rms": scalar_output(fit.rms, difference, unit_set),
        "relative_rms": fit.relative_rms,
        "standard_uncertainty": scalar_output(
            fit.standard_uncertainty, uncertainty_dimension, unit_set
        ),
        "uncertainty_basis": fit.uncertainty_basis,
        "outlier_rows": list(fit.outlier_rows),
        "time": quantity_output(fit.time, Dimension.TIME, unit_set, as_array=True),
        "measured": quantity_output(fit.measured, dimension, unit_set, as_array=True),
        "fitted": quantity_output(fit.fitted, dimension, unit_set, as_array=True),
    }


def calibration_answer(
    result: CalibrationResult,
    body: VacuumChamberCalibrationCreate,
    extra_assumptions: tuple[str, ...] = (),
) -> dict[str, Any]:
    """The response body of one calibration (see ``VacuumChamberCalibrationPublic``)."""
    unit_set = body.case.output_units
    paths = [estimate.path for estimate in result.estimates]
    simulation = result.simulation
    return {
        "estimates": [_estimate(estimate, unit_set) for estimate in result.estimates],
        "correlation": {
            "parameters": paths,
            "matrix": [[float(value) for value in row] for row in result.correlation],
        },
        "series": [_series(fit, unit_set) for fit in result.series],
        "fit": {
            "points": result.points,
            "degrees_of_freedom": result.degrees_of_freedom,
            "confidence": result.confidence,
            "quantile": result.quantile,
            "quantile_basis": result.quantile_basis,
            "reduced_chi_square": result.reduced_chi_square,
            "loss": result.loss,
            "converged": result.converged,
            "simulations": result.simulations,
            "log_notes": list(result.notes),
        },
        "fitted_case": fitted_case_body(body, result.fitted_case, paths),
        "model_references": list(result.references),
        **envelope(
            unit_set=unit_set,
            assumptions=(*result.assumptions, *extra_assumptions),
            sources=simulation.property_sources,
            uncertainties=simulation.property_uncertainties,
            advisories=result.warnings,
        ),
    }


def calibration_headline(answer: dict[str, Any]) -> dict[str, Any]:
    """What a listing of stored calculations shows of a calibration: each estimated field's
    value (by its path), whether the fit converged and its reduced chi-square."""
    picked = {
        str(item["parameter"]): {"value": item["value"]["value"], "unit": item["value"]["unit"]}
        for item in answer.get("estimates", [])
        if isinstance(item.get("value"), dict)
    }
    fit = answer.get("fit", {})
    return {
        **picked,
        "converged": fit.get("converged"),
        "reduced_chi_square": fit.get("reduced_chi_square"),
    }
