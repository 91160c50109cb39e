"""Calibrations: fit the chamber model's fields to a measured run.

The handler reads the request to core inputs, calls the calibration, stores the
calculation record and answers JSON (default) or a plot of measured against fitted
series (``Accept: image/svg+xml`` or ``image/png``).
"""

from __future__ import annotations

from typing import Any

from fastapi import APIRouter, Request
from starlette.responses import Response

from service.api.calibrations.answers import calibration_answer, calibration_headline
from service.api.calibrations.plots import plot_calibration
from service.api.calibrations.requests import read_calibration
from service.api.calibrations.schemas import (
    VacuumChamberCalibrationCreate,
    VacuumChamberCalibrationPublic,
)
from service.api.http.limits import TimeLimitedRoute
from service.api.http.problems import problem_responses
from service.api.http.recording import record_calculation
from service.api.http.responses import FastJSONResponse
from service.api.simulations.plots import PLOT_MEDIA_TYPES, plot_format_for
from service.core.calibration import calibrate_vacuum_chamber

router = APIRouter(prefix="/v1/calibrations", tags=["calibrations"], route_class=TimeLimitedRoute)

_RESPONSES: dict[int | str, dict[str, Any]] = {
    200: {
        "description": "The calibration: JSON by default; a plot of each measured series "
        "against the fitted model (`image/svg+xml`, `image/png`) by `Accept`. A plot's "
        "`X-Calculation-ID` header names its stored record.",
        "content": {
            "image/svg+xml": {"schema": {"type": "string"}},
            "image/png": {"schema": {"type": "string", "format": "binary"}},
        },
    },
    **problem_responses(400, 413, 422, 503),
}


@router.post(
    "/vacuum-chamber",
    operation_id="post_vacuum_chamber_calibration",
    response_model=VacuumChamberCalibrationPublic,
    responses=_RESPONSES,
    summary="Fit the vacuum-chamber model to a measured run, with confidence intervals",
)
def post_vacuum_chamber_calibration(request: Request, body: VacuumChamberCalibrationCreate) -> Any:
    """Estimate case fields (leak rate, pump speed scale, heat gain, product mass or
    specific heat, evaporation coefficient or area, condenser conductance) from a logged
    run by weighted least squares of the chamber model. Answers the estimates with
    confidence intervals, their correlation, the residual RMS per series, warnings for
    fields the data cannot determine and the fitted case, ready to send to the
    simulation route."""
    inputs = read_calibration(body)
    result = calibrate_vacuum_chamber(
        inputs.case,
        inputs.run,
        inputs.parameters,
        loss=body.loss,
        confidence=body.confidence,
    )
    answer = calibration_answer(result, body, inputs.notes)
    answer = record_calculation(
        request, "calibrations.vacuum_chamber", body, answer, calibration_headline(answer)
    )
    kind = plot_format_for(request.headers.get("accept"))
    if kind is not None:
        return Response(
            plot_calibration(result, body.case.output_units, kind),
            media_type=PLOT_MEDIA_TYPES[kind],
            headers={"X-Calculation-ID": answer["meta"]["calculation_id"]},
        )
    return FastJSONResponse(answer)
