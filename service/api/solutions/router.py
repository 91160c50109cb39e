"""POST and GET /v1/properties/ice-fraction: ice and unfrozen phase of a solution or seawater.

Both handlers are synchronous (worker threads, held to the time limit): a point costs a few
Newton solves of IAPWS-95 and the ice Gibbs function, milliseconds rather than microseconds.
"""

from __future__ import annotations

from typing import Any, cast

from fastapi import APIRouter, Request

from service.api.http.limits import TimeLimitedRoute
from service.api.http.problems import problem_responses
from service.api.http.query import query_parameters, read_query
from service.api.http.responses import FastJSONResponse
from service.api.http.units import UnitSet
from service.api.solutions.answers import ice_fraction_answer
from service.api.solutions.requests import IceFractionInputs, read_ice_fraction
from service.api.solutions.schemas import (
    COMPOSITION_FIELDS,
    IceFractionCreate,
    IceFractionPublic,
    IceFractionQuery,
)
from service.core.solutions.aqueous import ActivityModelName
from service.core.solutions.lookups import ice_fraction_lookup

router = APIRouter(prefix="/v1/properties", tags=["properties"], route_class=TimeLimitedRoute)


def _answer(inputs: IceFractionInputs, unit_set: UnitSet) -> dict[str, Any]:
    result = ice_fraction_lookup(
        inputs.temperature if inputs.is_array else inputs.temperature[0],
        solute_name=inputs.solute_name,
        mass_fraction=inputs.mass_fraction,
        model=cast(ActivityModelName, inputs.model),
        absolute_salinity=inputs.absolute_salinity,
        pressure=inputs.pressure,
        composition=inputs.composition,
        freezing_point=inputs.freezing_point,
    )
    return ice_fraction_answer(result, unit_set, as_array=inputs.is_array)


@router.post(
    "/ice-fraction",
    operation_id="post_ice_fraction",
    response_model=IceFractionPublic,
    responses=problem_responses(413, 422, 503),
    summary="Ice fraction of a freezing solution, seawater or food, batch",
)
def post_ice_fraction(request: Request, body: IceFractionCreate) -> Any:
    """Freezing point, ice per kg of mixture, unfrozen water and its concentration, enthalpy
    and vapor pressure at each temperature, for a named solute (non-ideal model by default),
    seawater (IAPWS R13-08) or a food by its composition and initial freezing point."""
    inputs = read_ice_fraction(
        request,
        temperature=body.temperature,
        pressure=body.pressure,
        solute_name=None if body.solute is None else body.solute.name,
        mass_fraction=None if body.solute is None else body.solute.mass_fraction,
        model="non-ideal" if body.solute is None else body.solute.model,
        absolute_salinity=None if body.seawater is None else body.seawater.absolute_salinity,
        composition=(
            None
            if body.composition is None
            else {name: getattr(body.composition, name) for name in COMPOSITION_FIELDS}
        ),
        freezing_point=body.freezing_point,
        dissolved_solutes=None if body.composition is None else body.composition.dissolved_solutes,
    )
    return FastJSONResponse(_answer(inputs, body.output_units))


@router.get(
    "/ice-fraction",
    operation_id="get_ice_fraction",
    response_model=IceFractionPublic,
    responses=problem_responses(422, 503),
    summary="Ice fraction of a freezing solution or seawater at one temperature",
    openapi_extra=query_parameters(IceFractionQuery),
)
def get_ice_fraction(request: Request) -> Any:
    """As the POST, for one state given in the query string."""
    query = read_query(request, IceFractionQuery)
    inputs = read_ice_fraction(
        request,
        temperature=query.temperature,
        pressure=query.pressure,
        solute_name=query.solute,
        mass_fraction=query.mass_fraction,
        model=query.model,
        absolute_salinity=query.absolute_salinity,
        salinity_field="absolute_salinity",
    )
    return FastJSONResponse(_answer(inputs, query.output_units))
