"""Sizing: the pump, cold trap or set point that meets a cooling target.

The handler reads the request to a core sizing case, solves it, stores the calculation
record and answers JSON (default) or the design-curve plot (``Accept: image/svg+xml`` or
``image/png``, negotiated as the simulation plots are).
"""

from __future__ import annotations

from typing import Any

from fastapi import APIRouter, Request
from starlette.responses import Response

from service.api.http.limits import TimeLimitedRoute
from service.api.http.problems import problem_responses
from service.api.http.recording import headline, record_calculation
from service.api.http.responses import FastJSONResponse
from service.api.simulations.plots import PLOT_MEDIA_TYPES, plot_format_for
from service.api.sizing.answers import SIZING_HEADLINE, sizing_answer
from service.api.sizing.plots import plot_design_curve
from service.api.sizing.requests import case_errors_in_request, read_sizing
from service.api.sizing.schemas import VacuumChamberSizingCreate, VacuumChamberSizingPublic
from service.core.sizing import size_vacuum_chamber

router = APIRouter(prefix="/v1/sizing", tags=["sizing"], route_class=TimeLimitedRoute)

_RESPONSES: dict[int | str, dict[str, Any]] = {
    200: {
        "description": "The sizing: JSON by default; the design curve (time to target against "
        "the unknown) as a plot for `Accept: image/svg+xml` or `image/png`. A plot's "
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
    operation_id="post_vacuum_chamber_sizing",
    response_model=VacuumChamberSizingPublic,
    responses=_RESPONSES,
    summary="The value of one chamber field (pump speed, trap capacity...) that meets a target",
)
def post_vacuum_chamber_sizing(request: Request, body: VacuumChamberSizingCreate) -> Any:
    """Solve one field of a vacuum-chamber simulation for a cooling target (the product at
    a temperature within a time, or the case's schedule): the smallest pump speed, trap
    capacity or conductance (the largest ultimate pressure, trap temperature, volume...)
    that meets it, bracketed and solved on the simulation to a stated tolerance, with the
    design curve, the forward simulation at the answer and the margin at 90 % of it. A 422
    names the physical limit when no value in the bracket meets the target."""
    sizing, unit, notes = read_sizing(body)
    with case_errors_in_request():
        result = size_vacuum_chamber(sizing)
    answer = sizing_answer(result, unit, body.case.output_units, notes)
    record_calculation(
        request, "sizing.vacuum_chamber", body, answer, headline(answer, SIZING_HEADLINE)
    )
    kind = plot_format_for(request.headers.get("accept"))
    if kind is not None:
        return Response(
            plot_design_curve(result, unit, kind),
            media_type=PLOT_MEDIA_TYPES[kind],
            headers={"X-Calculation-ID": answer["meta"]["calculation_id"]},
        )
    return FastJSONResponse(answer)
