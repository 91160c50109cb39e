"""Process simulations: the vacuum chamber over time.

The handler reads the request to a core case, calls the simulation, stores the
calculation record and answers JSON (default), CSV (``Accept: text/csv``, the series;
done by the CSV middleware) or a plot (``Accept: image/svg+xml`` or ``image/png``).
"""

from __future__ import annotations

from typing import Any

from fastapi import APIRouter, Request
from starlette.responses import Response

from service.api.http.csv_io import CSV_MEDIA_TYPE
from service.api.http.limits import TimeLimitedRoute
from service.api.http.negotiation import JSON_MEDIA_TYPE, choose_media_type, not_acceptable
from service.api.http.problems import problem_responses
from service.api.http.recording import headline, record_calculation
from service.api.http.responses import FastJSONResponse
from service.api.simulations.answers import (
    SIMULATION_HEADLINE,
    SWEEP_HEADLINE,
    simulation_answer,
    sweep_answer,
)
from service.api.simulations.plots import PLOT_MEDIA_TYPES, plot_format_for, plot_simulation
from service.api.simulations.requests import read_vacuum_chamber_sweep
from service.api.simulations.schemas import (
    VacuumChamberSimulationCreate,
    VacuumChamberSimulationPublic,
    VacuumChamberSweepPublic,
)
from service.core.simulation.sweeps import simulate_vacuum_chambers
from service.settings import Settings

router = APIRouter(prefix="/v1/simulations", tags=["simulations"], route_class=TimeLimitedRoute)

_RESPONSES: dict[int | str, dict[str, Any]] = {
    200: {
        "description": "The simulation: JSON by default; `text/csv` (the series, one row per "
        "time; for a sweep, one row per case) or a plot of pressure and temperature against "
        "time with the events marked (`image/svg+xml`, `image/png`) by `Accept`. A plot's "
        "`X-Calculation-ID` header names its stored record.",
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
    response_model=VacuumChamberSimulationPublic | VacuumChamberSweepPublic,
    responses=_RESPONSES,
    summary="Vacuum chamber with pump, condenser and product, simulated over time",
)
def post_vacuum_chamber_simulation(request: Request, body: VacuumChamberSimulationCreate) -> Any:
    """Pump-down, flash point, cooling, freezing and sublimation of a product in a vacuum
    chamber: chamber air and vapor balances with pump and condenser, product energy balance
    on IAPWS properties, integrated over time with event detection. Answers events with
    their states, a time series, a summary, the mass and energy balance and the schedule
    check. Any scalar input may be an array (`{"values": [...], "unit"}`): a sweep, computed
    in parallel, answered as the summary and checks of every case as `values` in order
    (JSON or CSV; a sweep has no plot)."""
    settings: Settings = request.app.state.settings
    cases, notes, swept = read_vacuum_chamber_sweep(body, settings.max_simulation_sweep_cases)
    accept = request.headers.get("accept")
    if swept and choose_media_type(accept, (JSON_MEDIA_TYPE,)) is None:
        raise not_acceptable(accept, (JSON_MEDIA_TYPE, CSV_MEDIA_TYPE))  # a sweep has no plot
    results = simulate_vacuum_chambers(cases, settings.simulation_workers)
    if swept:
        sweep = sweep_answer(results, cases, swept, body.output_units, notes)
        record_calculation(
            request,
            "simulations.vacuum_chamber_sweep",
            body,
            sweep,
            headline(sweep, SWEEP_HEADLINE),
        )
        return FastJSONResponse(sweep)
    result = results[0]
    answer = simulation_answer(result, body.output_units, notes)
    record_calculation(
        request,
        "simulations.vacuum_chamber",
        body,
        answer,
        headline(answer, SIMULATION_HEADLINE),
    )
    kind = plot_format_for(accept)
    if kind is not None:
        return Response(
            plot_simulation(result, body.output_units, kind, answer["meta"]["calculation_id"]),
            media_type=PLOT_MEDIA_TYPES[kind],
            headers={"X-Calculation-ID": answer["meta"]["calculation_id"]},
        )
    return FastJSONResponse(answer)
