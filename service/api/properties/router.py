"""Property lookups: saturation, sublimation, melting, state, constants.

Each lookup answers GET (query parameters, one point) and POST (JSON body, any input
may be a batch). Handlers read inputs to SI, call one core function and shape the answer.

The GET handlers are ``async``: a query string holds one point, computed in well under
10 ms (tens of microseconds for saturation, on the core's one-state path), so it runs on
the event loop; handing it to a worker thread cost more than the computation (profiled:
the hop and the thread switch under the GIL doubled the lookup's time). They read their
query string with one model each (:mod:`service.api.http.query`). The POST handlers take
batches of up to ``TRIPOINT_MAX_BATCH_POINTS`` and stay synchronous, in worker threads,
so that a long batch neither blocks other requests nor escapes the computation time
limit (:class:`~service.api.http.limits.TimeLimitedRoute`).
"""

from __future__ import annotations

import functools
from collections.abc import Callable
from typing import Any

from fastapi import APIRouter, Request

from service.api.http.envelope import envelope
from service.api.http.limits import TimeLimitedRoute, check_batch_size
from service.api.http.problems import problem_responses
from service.api.http.quantities import (
    ParsedQuantity,
    quantity_output,
    read_quantity,
    require_exactly_one,
    scalar_output,
)
from service.api.http.query import query_parameters, read_query
from service.api.http.responses import FastJSONResponse
from service.api.http.units import Dimension, UnitSet
from service.api.properties.answers import phase_output
from service.api.properties.schemas import (
    ConstantsPublic,
    ConstantsQuery,
    Formulation,
    MeltingCreate,
    MeltingPublic,
    MeltingQuery,
    RequestedPhase,
    SaturationCreate,
    SaturationPublic,
    SaturationQuery,
    StateCreate,
    StatePublic,
    StateQuery,
    SublimationCreate,
    SublimationPublic,
    SublimationQuery,
)
from service.core.errors import InvalidInputError
from service.core.properties import lookups
from service.settings import Settings

_VAPORIZATION = "latent_heat_of_vaporization"
_SUBLIMATION = "latent_heat_of_sublimation"
_FUSION = "latent_heat_of_fusion"

router = APIRouter(prefix="/v1/properties", tags=["properties"], route_class=TimeLimitedRoute)

_ERRORS = problem_responses(413, 422)


def _check_points(request: Request, *parsed: ParsedQuantity) -> None:
    settings: Settings = request.app.state.settings
    check_batch_size(
        max(item.size for item in parsed),
        settings.max_batch_points,
        noun="points",
        setting="TRIPOINT_MAX_BATCH_POINTS",
    )


def _one_of(
    request: Request, temperature: Any, pressure: Any
) -> tuple[ParsedQuantity | None, ParsedQuantity | None]:
    require_exactly_one(("temperature", temperature), ("pressure", pressure))
    if temperature is not None:
        parsed = read_quantity(temperature, field="temperature", dimension=Dimension.TEMPERATURE)
        _check_points(request, parsed)
        return parsed, None
    parsed = read_quantity(pressure, field="pressure", dimension=Dimension.PRESSURE)
    _check_points(request, parsed)
    return None, parsed


def _line_answer(
    result: lookups.LineLookup,
    unit_set: UnitSet,
    as_array: bool,
    phases: tuple[str, str],
    latent_name: str,
) -> dict[str, Any]:
    states = result.states
    return {
        "temperature": quantity_output(
            states.temperature, Dimension.TEMPERATURE, unit_set, as_array=as_array
        ),
        "pressure": quantity_output(
            states.pressure, Dimension.PRESSURE, unit_set, as_array=as_array
        ),
        phases[0]: phase_output(getattr(states, phases[0]), unit_set, as_array=as_array),
        phases[1]: phase_output(getattr(states, phases[1]), unit_set, as_array=as_array),
        latent_name: quantity_output(
            getattr(states, latent_name), Dimension.SPECIFIC_ENERGY, unit_set, as_array=as_array
        ),
        **envelope(
            unit_set=unit_set,
            assumptions=result.assumptions,
            sources=result.sources,
            uncertainties=result.uncertainties,
            advisories=result.advisories,
        ),
    }


def _line(
    request: Request,
    temperature: Any,
    pressure: Any,
    unit_set: UnitSet,
    lookup: Callable[..., lookups.LineLookup],
    phases: tuple[str, str],
    latent_name: str,
    point_lookup: Callable[..., lookups.LineLookup] | None = None,
) -> dict[str, Any]:
    """Read exactly one of temperature or pressure, run a phase-line lookup, shape it.

    ``point_lookup``, where a line has one, answers a single temperature (not sent as
    an array) with the same numbers as ``lookup``, without arrays.
    """
    t, p = _one_of(request, temperature, pressure)
    if point_lookup is not None and t is not None and not t.is_array:
        single = point_lookup(temperature=float(t.si[0]))
        return _line_answer(single, unit_set, False, phases, latent_name)
    result = lookup(temperature=None if t is None else t.si, pressure=None if p is None else p.si)
    as_array = (t or p).is_array  # type: ignore[union-attr]
    return _line_answer(result, unit_set, as_array, phases, latent_name)


def _saturation(
    request: Request, temperature: Any, pressure: Any, formulation: Formulation, unit_set: UnitSet
) -> dict[str, Any]:
    lookup = functools.partial(lookups.saturation_lookup, formulation=formulation)
    point_lookup = functools.partial(lookups.saturation_point_lookup, formulation=formulation)
    phases = ("liquid", "vapor")
    return _line(
        request, temperature, pressure, unit_set, lookup, phases, _VAPORIZATION, point_lookup
    )


def _sublimation(
    request: Request, temperature: Any, pressure: Any, unit_set: UnitSet
) -> dict[str, Any]:
    lookup = lookups.sublimation_lookup
    return _line(request, temperature, pressure, unit_set, lookup, ("ice", "vapor"), _SUBLIMATION)


def _melting(
    request: Request, temperature: Any, pressure: Any, unit_set: UnitSet
) -> dict[str, Any]:
    lookup = lookups.melting_lookup
    return _line(request, temperature, pressure, unit_set, lookup, ("ice", "liquid"), _FUSION)


def _state(
    request: Request,
    temperature: Any,
    pressure: Any,
    phase: RequestedPhase | None,
    formulation: Formulation,
    unit_set: UnitSet,
) -> dict[str, Any]:
    t = read_quantity(temperature, field="temperature", dimension=Dimension.TEMPERATURE)
    p = read_quantity(pressure, field="pressure", dimension=Dimension.PRESSURE)
    _check_points(request, t, p)
    if t.size != p.size and 1 not in (t.size, p.size):
        raise InvalidInputError(
            "pressure",
            f"has {p.size} values but temperature has {t.size}; give equal lengths or one value",
        )
    result = lookups.state_lookup(
        temperature=t.si, pressure=p.si, phase=phase, formulation=formulation
    )
    as_array = t.is_array or p.is_array
    states = result.states
    properties = states.properties
    return {
        "temperature": quantity_output(
            properties.temperature, Dimension.TEMPERATURE, unit_set, as_array=as_array
        ),
        "pressure": quantity_output(
            properties.pressure, Dimension.PRESSURE, unit_set, as_array=as_array
        ),
        "phase": list(states.phase) if as_array else str(states.phase[0]),
        "properties": phase_output(properties, unit_set, as_array=as_array),
        **envelope(
            unit_set=unit_set,
            assumptions=result.assumptions,
            sources=result.sources,
            uncertainties=result.uncertainties,
            advisories=result.advisories,
        ),
    }


@router.get(
    "/saturation",
    operation_id="get_saturation",
    response_model=SaturationPublic,
    responses=_ERRORS,
    summary="Liquid-vapor saturation at a temperature or a pressure",
    openapi_extra=query_parameters(SaturationQuery),
)
async def get_saturation(request: Request) -> Any:
    """Saturated liquid and vapor (triple point to critical point): pressure or temperature,
    density, enthalpy, internal energy, entropy, isobaric heat capacity, latent heat."""
    query = read_query(request, SaturationQuery)
    return FastJSONResponse(
        _saturation(
            request, query.temperature, query.pressure, query.formulation, query.output_units
        )
    )


@router.post(
    "/saturation",
    operation_id="post_saturation",
    response_model=SaturationPublic,
    responses=_ERRORS,
    summary="Liquid-vapor saturation, batch",
)
def post_saturation(request: Request, body: SaturationCreate) -> Any:
    """As the GET, with any input as a batch (`{"values": [...], "unit": ...}` or a list)."""
    return FastJSONResponse(
        _saturation(request, body.temperature, body.pressure, body.formulation, body.output_units)
    )


@router.get(
    "/sublimation",
    operation_id="get_sublimation",
    response_model=SublimationPublic,
    responses=_ERRORS,
    summary="Ice Ih-vapor sublimation at a temperature or a pressure",
    openapi_extra=query_parameters(SublimationQuery),
)
async def get_sublimation(request: Request) -> Any:
    """Ice Ih and vapor in equilibrium (50 K to 273.16 K): pressure, ice and vapor properties,
    latent heat of sublimation."""
    query = read_query(request, SublimationQuery)
    return FastJSONResponse(
        _sublimation(request, query.temperature, query.pressure, query.output_units)
    )


@router.post(
    "/sublimation",
    operation_id="post_sublimation",
    response_model=SublimationPublic,
    responses=_ERRORS,
    summary="Ice Ih-vapor sublimation, batch",
)
def post_sublimation(request: Request, body: SublimationCreate) -> Any:
    """As the GET, with any input as a batch."""
    return FastJSONResponse(
        _sublimation(request, body.temperature, body.pressure, body.output_units)
    )


@router.get(
    "/melting",
    operation_id="get_melting",
    response_model=MeltingPublic,
    responses=_ERRORS,
    summary="Ice Ih-liquid melting at a temperature or a pressure",
    openapi_extra=query_parameters(MeltingQuery),
)
async def get_melting(request: Request) -> Any:
    """Ice Ih and liquid in equilibrium (251.165 K to 273.16 K): pressure, ice and liquid
    properties, latent heat of fusion."""
    query = read_query(request, MeltingQuery)
    return FastJSONResponse(
        _melting(request, query.temperature, query.pressure, query.output_units)
    )


@router.post(
    "/melting",
    operation_id="post_melting",
    response_model=MeltingPublic,
    responses=_ERRORS,
    summary="Ice Ih-liquid melting, batch",
)
def post_melting(request: Request, body: MeltingCreate) -> Any:
    """As the GET, with any input as a batch."""
    return FastJSONResponse(_melting(request, body.temperature, body.pressure, body.output_units))


@router.get(
    "/state",
    operation_id="get_state",
    response_model=StatePublic,
    responses=_ERRORS,
    summary="Phase and properties at a temperature and pressure",
    openapi_extra=query_parameters(StateQuery),
)
async def get_state(request: Request) -> Any:
    """Stable phase (liquid, vapor, ice Ih, supercritical) and its properties; or a requested
    metastable phase, with a warning."""
    query = read_query(request, StateQuery)
    return FastJSONResponse(
        _state(
            request,
            query.temperature,
            query.pressure,
            query.phase,
            query.formulation,
            query.output_units,
        )
    )


@router.post(
    "/state",
    operation_id="post_state",
    response_model=StatePublic,
    responses=_ERRORS,
    summary="Phase and properties, batch",
)
def post_state(request: Request, body: StateCreate) -> Any:
    """As the GET, with temperature and/or pressure as batches (equal lengths, or one value)."""
    return FastJSONResponse(
        _state(
            request,
            body.temperature,
            body.pressure,
            body.phase,
            body.formulation,
            body.output_units,
        )
    )


@router.get(
    "/constants",
    operation_id="get_constants",
    response_model=ConstantsPublic,
    responses=problem_responses(422),
    summary="Triple point, critical point and constants",
    openapi_extra=query_parameters(ConstantsQuery),
)
async def get_constants(request: Request) -> Any:
    """Fixed points of water substance and the latent heats at the triple point."""
    output_units = read_query(request, ConstantsQuery).output_units
    result = lookups.constants_lookup()
    values = result.states

    def scalar(value: float, dimension: Dimension) -> dict[str, Any] | None:
        return scalar_output(value, dimension, output_units)

    content = {
        "triple_point": {
            "temperature": scalar(values.triple_point_temperature, Dimension.TEMPERATURE),
            "pressure": scalar(values.triple_point_pressure, Dimension.PRESSURE),
            "density": None,
        },
        "critical_point": {
            "temperature": scalar(values.critical_temperature, Dimension.TEMPERATURE),
            "pressure": scalar(values.critical_pressure, Dimension.PRESSURE),
            "density": scalar(values.critical_density, Dimension.DENSITY),
        },
        "specific_gas_constant": scalar(values.specific_gas_constant, Dimension.SPECIFIC_ENTROPY),
        "molar_mass": {"value": values.molar_mass, "unit": "kg/mol"},
        "latent_heat_of_vaporization_at_triple_point": scalar(
            values.latent_heat_of_vaporization, Dimension.SPECIFIC_ENERGY
        ),
        "latent_heat_of_sublimation_at_triple_point": scalar(
            values.latent_heat_of_sublimation, Dimension.SPECIFIC_ENERGY
        ),
        "latent_heat_of_fusion_at_triple_point": scalar(
            values.latent_heat_of_fusion, Dimension.SPECIFIC_ENERGY
        ),
        **envelope(
            unit_set=output_units,
            assumptions=result.assumptions,
            sources=result.sources,
            uncertainties=result.uncertainties,
            advisories=result.advisories,
        ),
    }
    return FastJSONResponse(content)
