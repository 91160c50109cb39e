"""Primary drying: a run over a recipe, and the design space of shelf temperature x
chamber pressure.

Each handler reads the request to a core case, calls one core function, stores the
calculation record and answers JSON (default), CSV (``Accept: text/csv``: the run's series
or the design space's cells, one row each; done by the CSV middleware) or a plot
(``Accept: image/svg+xml`` or ``image/png``).
"""

from __future__ import annotations

from collections.abc import Callable
from typing import Any

from fastapi import APIRouter, Request
from starlette.responses import Response

from service.api.drying.answers import (
    DESIGN_SPACE_HEADLINE,
    PRIMARY_DRYING_HEADLINE,
    design_space_answer,
    primary_drying_answer,
)
from service.api.drying.plots import plot_design_space, plot_primary_drying
from service.api.drying.requests import read_design_space, read_primary_drying
from service.api.drying.schemas import (
    PrimaryDryingDesignSpaceCreate,
    PrimaryDryingDesignSpacePublic,
    PrimaryDryingSimulationCreate,
    PrimaryDryingSimulationPublic,
)
from service.api.http.limits import TimeLimitedRoute
from service.api.http.problems import problem_responses
from service.api.http.recording import headline, record_calculation
from service.api.http.responses import FastJSONResponse
from service.api.simulations.plots import PLOT_MEDIA_TYPES, PlotFormat, plot_format_for
from service.core.drying import primary_drying_design_space, simulate_primary_drying

router = APIRouter(tags=["drying"], route_class=TimeLimitedRoute)


def _responses(what: str) -> dict[int | str, dict[str, Any]]:
    return {
        200: {
            "description": f"JSON by default; `text/csv` ({what}) or a plot (`image/svg+xml`, "
            "`image/png`) by `Accept`. A plot's `X-Calculation-ID` header names its stored "
            "record.",
            "content": {
                "image/svg+xml": {"schema": {"type": "string"}},
                "image/png": {"schema": {"type": "string", "format": "binary"}},
            },
        },
        **problem_responses(413, 422),
    }


def _answer(request: Request, answer: dict[str, Any], plot: Callable[[PlotFormat], bytes]) -> Any:
    kind = plot_format_for(request.headers.get("accept"))
    if kind is not None:
        return Response(
            plot(kind),
            media_type=PLOT_MEDIA_TYPES[kind],
            headers={"X-Calculation-ID": answer["meta"]["calculation_id"]},
        )
    return FastJSONResponse(answer)


@router.post(
    "/v1/simulations/primary-drying",
    operation_id="post_primary_drying_simulation",
    response_model=PrimaryDryingSimulationPublic,
    responses=_responses("the series, one row per time"),
    summary="Primary drying of vials or trays over a shelf and pressure recipe",
)
def post_primary_drying_simulation(request: Request, body: PrimaryDryingSimulationCreate) -> Any:
    """The quasi-steady heat and mass balance of a container in primary drying (vial heat
    transfer K_v(P_c), dried-layer resistance R_p(l), IAPWS ice vapor pressure and enthalpy
    of sublimation), integrated over the recipe: product temperatures at the ice front and
    the bottom, sublimation rates, heat flow, condenser load, events and the drying time."""
    case = read_primary_drying(body)
    result = simulate_primary_drying(case)
    answer = primary_drying_answer(result, body.output_units)
    record_calculation(
        request,
        "simulations.primary_drying",
        body,
        answer,
        headline(answer, PRIMARY_DRYING_HEADLINE),
    )
    return _answer(
        request, answer, lambda kind: plot_primary_drying(result, body.output_units, kind)
    )


@router.post(
    "/v1/design-spaces/primary-drying",
    operation_id="post_primary_drying_design_space",
    response_model=PrimaryDryingDesignSpacePublic,
    responses=_responses("the cells, one row per setting"),
    summary="Primary-drying design space: shelf temperature x chamber pressure",
)
def post_primary_drying_design_space(request: Request, body: PrimaryDryingDesignSpaceCreate) -> Any:
    """Product temperature, sublimation rate and drying time over a grid of settings, the
    region that keeps the ice front below the critical temperature within the equipment
    limit, and the fastest setting in it."""
    case = read_design_space(body)
    result = primary_drying_design_space(case)
    answer = design_space_answer(result, body.output_units)
    record_calculation(
        request,
        "design_spaces.primary_drying",
        body,
        answer,
        headline(answer, DESIGN_SPACE_HEADLINE),
    )
    return _answer(request, answer, lambda kind: plot_design_space(result, body.output_units, kind))
