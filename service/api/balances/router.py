"""Balances: flash-to-freeze and evaporative (vacuum) cooling.

Each handler reads the request to a core case (:mod:`service.api.balances.requests`),
solves the balance, propagates the inputs' stated uncertainties when there are any,
shapes the answer (:mod:`service.api.balances.answers`) and stores its calculation record.
"""

from __future__ import annotations

from collections.abc import Callable
from typing import Any, TypeVar

from fastapi import APIRouter, Request

from service.api.balances.answers import (
    EVAPORATIVE_COOLING_HEADLINE,
    EVAPORATIVE_COOLING_UNCERTAIN_OUTPUTS,
    FLASH_FREEZE_HEADLINE,
    FLASH_FREEZE_UNCERTAIN_OUTPUTS,
    evaporation_stage,
    evaporative_cooling_answer,
    flash_freeze_answer,
)
from service.api.balances.requests import (
    BalanceInputs,
    read_evaporative_cooling,
    read_flash_freeze,
)
from service.api.balances.schemas import (
    EvaporativeCoolingCreate,
    EvaporativeCoolingPublic,
    FlashFreezeCreate,
    FlashFreezePublic,
)
from service.api.http.limits import TimeLimitedRoute, check_batch_size
from service.api.http.problems import FieldError, ProblemError, problem_responses
from service.api.http.recording import headline, record_calculation
from service.api.http.responses import FastJSONResponse
from service.api.http.units import Dimension
from service.core.balances import (
    InputUncertainty,
    evaporative_cooling,
    flash_freeze,
    propagate_input_uncertainty,
    property_uncertainty_of_evaporation,
)
from service.core.errors import UnsupportedStateError
from service.settings import Settings

router = APIRouter(prefix="/v1/balances", tags=["balances"], route_class=TimeLimitedRoute)

FLASH_FREEZE_PATH = "/v1/balances/flash-freeze"
_ERRORS = problem_responses(413, 422)

CaseT = TypeVar("CaseT")


def _check_cases(request: Request, cases: int) -> None:
    settings: Settings = request.app.state.settings
    check_batch_size(
        cases, settings.max_sweep_cases, noun="cases", setting="TRIPOINT_MAX_SWEEP_CASES"
    )


def _propagate(
    solve: Callable[[CaseT], Any],
    inputs: BalanceInputs[CaseT],
    outputs: tuple[tuple[str, Dimension], ...],
) -> InputUncertainty | None:
    if not inputs.standard_uncertainties:
        return None
    return propagate_input_uncertainty(
        solve, inputs.case, inputs.standard_uncertainties, tuple(name for name, _ in outputs)
    )


def _below_freezing_problem(error: UnsupportedStateError) -> ProblemError:
    """The final temperature is below the product's freezing point: point to flash-freeze."""
    index = error.extra.get("index")
    freezing = error.extra.get("freezing_point")
    value = error.value if isinstance(error.value, float) else None
    return ProblemError(
        422,
        "unsupported-state",
        "State outside what tripoint models",
        f"{error}. Cooling into freezing is the flash-freeze balance: POST {FLASH_FREEZE_PATH}.",
        [
            FieldError(
                field="final_temperature",
                message=f"below the product's freezing point; use POST {FLASH_FREEZE_PATH}",
                value=value,
                unit="K",
                minimum=freezing if isinstance(freezing, float) else None,
                index=index if isinstance(index, int) else None,
            )
        ],
    )


@router.post(
    "/flash-freeze",
    operation_id="post_flash_freeze",
    response_model=FlashFreezePublic,
    responses=_ERRORS,
    summary="Flash-to-freeze balance: water evaporating under vacuum until frozen",
)
def post_flash_freeze(request: Request, body: FlashFreezeCreate) -> Any:
    """Evaporated mass, ice formed, final state, stages, trajectory and condenser load of
    water (or a watery load) cooled and frozen by its own evaporation, integrated with
    IAPWS properties, beside the mean-vapor-enthalpy hand method."""
    inputs = read_flash_freeze(body)
    _check_cases(request, inputs.points)
    result = flash_freeze(inputs.case)
    answer = flash_freeze_answer(
        result,
        inputs,
        body.output_units,
        _propagate(flash_freeze, inputs, FLASH_FREEZE_UNCERTAIN_OUTPUTS),
        property_uncertainty_of_evaporation(result.stages),
    )
    return FastJSONResponse(
        record_calculation(
            request,
            "balances.flash_freeze",
            body,
            answer,
            headline(answer, FLASH_FREEZE_HEADLINE),
        )
    )


@router.post(
    "/evaporative-cooling",
    operation_id="post_evaporative_cooling",
    response_model=EvaporativeCoolingPublic,
    responses=_ERRORS,
    summary="Evaporative (vacuum) cooling of a moist product",
)
def post_evaporative_cooling(request: Request, body: EvaporativeCoolingCreate) -> Any:
    """Water evaporated, pre-wetting water, start-of-flashing and set-point pressures, heat
    removed, condenser load, vapor volume and mean flows of a product cooled under vacuum
    by its own evaporation (above its freezing point)."""
    inputs = read_evaporative_cooling(body)
    _check_cases(request, inputs.points)
    try:
        result = evaporative_cooling(inputs.case)
    except UnsupportedStateError as error:
        if error.variable == "final_temperature":
            raise _below_freezing_problem(error) from None
        raise
    answer = evaporative_cooling_answer(
        result,
        inputs,
        body.output_units,
        _propagate(evaporative_cooling, inputs, EVAPORATIVE_COOLING_UNCERTAIN_OUTPUTS),
        property_uncertainty_of_evaporation(
            (evaporation_stage(result, inputs.case),),
            lumped_specific_heat=body.specific_heat is not None,
        ),
    )
    return FastJSONResponse(
        record_calculation(
            request,
            "balances.evaporative_cooling",
            body,
            answer,
            headline(answer, EVAPORATIVE_COOLING_HEADLINE),
        )
    )
