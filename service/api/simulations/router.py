"""Process simulations: the vacuum chamber over time.

The handler reads the request to a core case, calls the simulation, stores the
calculation record and answers JSON (default), CSV (``Accept: text/csv``, the series;
done by the CSV middleware) or a plot (``Accept: image/svg+xml`` or ``image/png``).
"""

from __future__ import annotations

from typing import Any

from fastapi import APIRouter, Request
from starlette.responses import Response

from service.api.http.limits import TimeLimitedRoute
from service.api.http.problems import problem_responses
from service.api.http.recording import record_calculation
from service.api.http.responses import FastJSONResponse
from service.api.simulations.answers import simulation_answer
from service.api.simulations.plots import PLOT_MEDIA_TYPES, plot_format_for, plot_simulation
from service.api.simulations.requests import read_vacuum_chamber
from service.api.simulations.schemas import (
    VacuumChamberSimulationCreate,
    VacuumChamberSimulationPublic,
)
from service.core.simulation import simulate_vacuum_chamber

router = APIRouter(prefix="/v1/simulations", tags=["simulations"], route_class=TimeLimitedRoute)

_RESPONSES: dict[int | str, dict[str, Any]] = {
    200: {
        "description": "The simulation: JSON by default; `text/csv` (the series, one row per "
        "time) or a plot of pressure and temperature against time with the events marked "
        "(`image/svg+xml`, `image/png`) by `Accept`. A plot's `X-Calculation-ID` header names "
        "its stored record.",
        "content": {
            "image/svg+xml": {"schema": {"type": "string"}},
            "image/png": {"schema": {"type": "string", "format": "binary"}},
        },
    },
    **problem_responses(413, 422),
}


@router.post(
    "/vacuum-chamber",
    operation_id="post_vacuum_chamber_simulation",
    response_model=VacuumChamberSimulationPublic,
    responses=_RESPONSES,
    summary="Vacuum chamber with pump, condenser and product, simulated over time",
)
def post_vacuum_chamber_simulation(request: Request, body: VacuumChamberSimulationCreate) -> Any:
    """Pump-down, flash point, cooling, freezing and sublimation of a product in a vacuum
    chamber: chamber air and vapor balances with pump and condenser, product energy balance
    on IAPWS properties, integrated over time with event detection. Answers events with
    their states, a time series, a summary, the mass and energy balance and the schedule
    check."""
    case, notes = read_vacuum_chamber(body)
    result = simulate_vacuum_chamber(case)
    answer = simulation_answer(result, body.output_units, notes)
    record_calculation(request, "simulations.vacuum_chamber", body, answer)
    kind = plot_format_for(request.headers.get("accept"))
    if kind is not None:
        return Response(
            plot_simulation(result, body.output_units, kind),
            media_type=PLOT_MEDIA_TYPES[kind],
            headers={"X-Calculation-ID": answer["meta"]["calculation_id"]},
        )
    return FastJSONResponse(answer)
