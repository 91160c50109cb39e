"""Balance results -> response dictionaries, in the requested unit set, with the envelope.

The shapes are those of :mod:`service.api.balances.schemas`: every number is
``{"value"|"values", "unit"}``; ``values`` (input order) when the request was a sweep.
"""

from __future__ import annotations

from collections.abc import Iterable
from dataclasses import replace
from typing import Any, Final

import numpy as np

from service.api.balances.requests import BalanceInputs
from service.api.http.envelope import envelope, uncertainty_output
from service.api.http.quantities import echo_output, quantity_output
from service.api.http.units import Dimension, UnitSet
from service.core.balances import (
    EvaporativeCoolingCase,
    EvaporativeCoolingResult,
    FlashFreezeCase,
    FlashFreezeResult,
    InputUncertainty,
    PropertyUncertainty,
    StageResult,
)
from service.core.balances.uncertainty import EVAPORATED_MASS_UNCERTAINTY
from service.core.properties.lookups import ReportedUncertainty
from service.core.properties.phase import FloatArray

__all__ = [
    "EVAPORATIVE_COOLING_HEADLINE",
    "EVAPORATIVE_COOLING_UNCERTAIN_OUTPUTS",
    "FLASH_FREEZE_HEADLINE",
    "FLASH_FREEZE_UNCERTAIN_OUTPUTS",
    "evaporation_stage",
    "evaporative_cooling_answer",
    "flash_freeze_answer",
]

FLASH_FREEZE_UNCERTAIN_OUTPUTS: Final = (
    ("evaporated_mass", Dimension.MASS),
    ("evaporated_fraction_of_water", Dimension.DIMENSIONLESS),
    ("ice_mass", Dimension.MASS),
    ("final_temperature", Dimension.TEMPERATURE_DIFFERENCE),
)
"""Flash-freeze results whose uncertainty is propagated from the inputs', and its dimension."""

EVAPORATIVE_COOLING_UNCERTAIN_OUTPUTS: Final = (
    ("evaporated_mass", Dimension.MASS),
    ("evaporated_fraction_of_product", Dimension.DIMENSIONLESS),
    ("heat_removed", Dimension.ENERGY),
    ("final_pressure", Dimension.PRESSURE),
)
"""Evaporative-cooling results whose uncertainty is propagated from the inputs'."""

_STAGE_FIELDS: Final = (
    ("start_temperature", Dimension.TEMPERATURE),
    ("end_temperature", Dimension.TEMPERATURE),
    ("start_pressure", Dimension.PRESSURE),
    ("end_pressure", Dimension.PRESSURE),
    ("evaporated_mass", Dimension.MASS),
    ("heat_removed", Dimension.ENERGY),
    ("vapor_enthalpy", Dimension.ENERGY),
    ("vapor_volume", Dimension.VOLUME),
    ("ice_formed", Dimension.MASS),
    ("heat_gained", Dimension.ENERGY),
)

_TRAJECTORY_FIELDS: Final = (
    ("temperature", Dimension.TEMPERATURE),
    ("pressure", Dimension.PRESSURE),
    ("evaporated_fraction_of_water", Dimension.DIMENSIONLESS),
    ("ice_fraction", Dimension.DIMENSIONLESS),
    ("liquid_fraction", Dimension.DIMENSIONLESS),
)


class _Shaper:
    """Quantity output in one unit set, as values for a sweep or a value for one case."""

    def __init__(self, unit_set: UnitSet, as_array: bool) -> None:
        self.unit_set = unit_set
        self.as_array = as_array

    def __call__(self, si: Any, dimension: Dimension) -> dict[str, Any]:
        array = np.asarray(si, dtype=np.float64).reshape(-1)
        return quantity_output(array, dimension, self.unit_set, as_array=self.as_array)

    def echo(self, field: str, si: Any, dimension: Dimension) -> dict[str, Any] | None:
        """An input repeated in the answer, in the unit the caller sent it in."""
        if si is None:
            return None
        array = np.asarray(si, dtype=np.float64).reshape(-1)
        return echo_output(field, array, dimension, self.unit_set, as_array=self.as_array)

    def fields(
        self, source: object, fields: Iterable[tuple[str, Dimension]]
    ) -> dict[str, dict[str, Any]]:
        return {name: self(getattr(source, name), dimension) for name, dimension in fields}


def _stage_output(stage: StageResult, shape: _Shaper) -> dict[str, Any]:
    return {"name": stage.name, **shape.fields(stage, _STAGE_FIELDS)}


def _trajectories(result: FlashFreezeResult, unit_set: UnitSet) -> list[dict[str, Any]]:
    trajectory = result.trajectory
    points = _Shaper(unit_set, as_array=True)
    cases = np.atleast_2d(trajectory.temperature).shape[0]
    answers = []
    for position in range(cases):
        answer: dict[str, Any] = {
            name: points(np.atleast_2d(getattr(trajectory, name))[position], dimension)
            for name, dimension in _TRAJECTORY_FIELDS
        }
        answer["stage"] = [int(i) for i in np.atleast_2d(trajectory.stage)[position]]
        answers.append(answer)
    return answers


def _input_uncertainty(
    propagated: InputUncertainty | None,
    inputs: BalanceInputs[Any],
    outputs: tuple[tuple[str, Dimension], ...],
    shape: _Shaper,
) -> dict[str, Any] | None:
    if propagated is None:
        return None
    contributions = propagated.contribution["evaporated_mass"]
    return {
        "method": propagated.method,
        "inputs": [
            {
                "field": path,
                "standard_uncertainty": shape(value, inputs.uncertainty_dimensions[path]),
                "evaporated_mass_contribution": shape(
                    contributions.get(path, np.zeros_like(np.asarray(value, dtype=np.float64))),
                    Dimension.MASS,
                ),
            }
            for path, value in inputs.standard_uncertainties.items()
        ],
        **{
            name: shape(propagated.standard_uncertainty[name], dimension)
            for name, dimension in outputs
        },
    }


def _property_uncertainty(properties: PropertyUncertainty, shape: _Shaper) -> list[dict[str, Any]]:
    entries = [
        uncertainty_output(
            ReportedUncertainty(
                quantity=statement.quantity,
                relative=statement.relative,
                coverage=statement.coverage,
                statement=statement.statement,
                source=statement.section,
                basis=statement.basis,
                statement_id=statement.statement_id,
                coverage_factor=statement.coverage_factor,
            )
        )
        for statement in properties.statements
    ]
    evaporated = EVAPORATED_MASS_UNCERTAINTY
    if properties.not_covered:
        missing = ", ".join(properties.not_covered)
        evaporated = replace(
            evaporated,
            statement=f"{evaporated.statement} Not covered by any statement (no contribution "
            f"counted): {missing}.",
        )
    entry = uncertainty_output(evaporated, shape(properties.evaporated_mass, Dimension.MASS))
    if properties.not_covered:
        entry["not_covered"] = list(properties.not_covered)
    entries.append(entry)
    return entries


def _envelope(
    result: FlashFreezeResult | EvaporativeCoolingResult,
    inputs: BalanceInputs[Any],
    properties: PropertyUncertainty,
    unit_set: UnitSet,
    shape: _Shaper,
) -> dict[str, Any]:
    answer = envelope(
        unit_set=unit_set,
        assumptions=(*result.assumptions, *inputs.assumptions),
        sources=result.property_sources,
        uncertainties=(),
        advisories=result.warnings,
    )
    answer["uncertainty"] = _property_uncertainty(properties, shape)
    return answer


def _optional(shape: _Shaper, si: FloatArray | None, dimension: Dimension) -> Any:
    return None if si is None else shape(si, dimension)


def flash_freeze_answer(
    result: FlashFreezeResult,
    inputs: BalanceInputs[FlashFreezeCase],
    unit_set: UnitSet,
    propagated: InputUncertainty | None,
    properties: PropertyUncertainty,
) -> dict[str, Any]:
    """The flash-freeze response (:class:`~service.api.balances.schemas.FlashFreezePublic`)."""
    shape = _Shaper(unit_set, inputs.is_sweep)
    return {
        "method": result.method,
        **shape.fields(
            result,
            (
                ("evaporated_mass", Dimension.MASS),
                ("evaporated_fraction_of_water", Dimension.DIMENSIONLESS),
                ("ice_mass", Dimension.MASS),
                ("liquid_mass", Dimension.MASS),
                ("final_temperature", Dimension.TEMPERATURE),
                ("final_pressure", Dimension.PRESSURE),
                ("vapor_volume", Dimension.VOLUME),
                ("heat_gained", Dimension.ENERGY),
            ),
        ),
        "trap_temperature": shape.echo(
            "trap_temperature", result.trap_temperature, Dimension.TEMPERATURE
        ),
        "condenser_load": _optional(shape, result.condenser_load, Dimension.ENERGY),
        "stages": [_stage_output(stage, shape) for stage in result.stages],
        "trajectory": _trajectories(result, unit_set),
        "comparison": shape.fields(
            result.comparison,
            (
                ("integrated_evaporated_mass", Dimension.MASS),
                ("mean_vapor_enthalpy_evaporated_mass", Dimension.MASS),
                ("integrated_ice_mass", Dimension.MASS),
                ("mean_vapor_enthalpy_ice_mass", Dimension.MASS),
                ("evaporated_mass_difference", Dimension.MASS),
                ("relative_difference", Dimension.DIMENSIONLESS),
            ),
        ),
        "energy_balance": shape.fields(
            result.energy_balance,
            (
                ("initial_energy", Dimension.ENERGY),
                ("final_energy", Dimension.ENERGY),
                ("vapor_enthalpy", Dimension.ENERGY),
                ("heat_gained", Dimension.ENERGY),
                ("boundary_work", Dimension.ENERGY),
                ("residual", Dimension.ENERGY),
                ("relative_residual", Dimension.DIMENSIONLESS),
            ),
        ),
        "input_uncertainty": _input_uncertainty(
            propagated, inputs, FLASH_FREEZE_UNCERTAIN_OUTPUTS, shape
        ),
        **_envelope(result, inputs, properties, unit_set, shape),
    }


def evaporation_stage(
    result: EvaporativeCoolingResult, case: EvaporativeCoolingCase
) -> StageResult:
    """The evaporative cooling as one ``cooling`` stage (for the property uncertainty)."""
    zero = np.zeros_like(result.evaporated_mass)
    return StageResult(
        name="cooling",
        start_temperature=np.asarray(case.initial_temperature, dtype=np.float64),
        end_temperature=np.asarray(case.final_temperature, dtype=np.float64),
        start_pressure=result.start_pressure,
        end_pressure=result.final_pressure,
        evaporated_mass=result.evaporated_mass,
        vapor_enthalpy=result.vapor_enthalpy,
        heat_removed=result.heat_removed,
        vapor_volume=result.vapor_volume,
        ice_formed=zero,
        heat_gained=result.heat_gained,
    )


def evaporative_cooling_answer(
    result: EvaporativeCoolingResult,
    inputs: BalanceInputs[EvaporativeCoolingCase],
    unit_set: UnitSet,
    propagated: InputUncertainty | None,
    properties: PropertyUncertainty,
) -> dict[str, Any]:
    """The evaporative-cooling response
    (:class:`~service.api.balances.schemas.EvaporativeCoolingPublic`)."""
    shape = _Shaper(unit_set, inputs.is_sweep)
    case = inputs.case
    evaporated = result.evaporated_mass
    hand = result.mean_vapor_enthalpy_evaporated_mass
    return {
        **shape.fields(
            result,
            (
                ("evaporated_mass", Dimension.MASS),
                ("evaporated_fraction_of_product", Dimension.DIMENSIONLESS),
                ("prewetting_water_mass", Dimension.MASS),
                ("start_pressure", Dimension.PRESSURE),
                ("final_pressure", Dimension.PRESSURE),
                ("heat_removed", Dimension.ENERGY),
                ("vapor_volume", Dimension.VOLUME),
                ("freezing_point", Dimension.TEMPERATURE),
            ),
        ),
        "freezing_point_basis": result.freezing_point_basis,
        "trap_temperature": shape.echo(
            "trap_temperature", case.trap_temperature, Dimension.TEMPERATURE
        ),
        "condenser_load": _optional(shape, result.condenser_load, Dimension.ENERGY),
        "cooling_time": shape.echo("cooling_time", case.cooling_time, Dimension.TIME),
        "mean_vapor_mass_flow": _optional(shape, result.mean_vapor_mass_flow, Dimension.MASS_FLOW),
        "mean_vapor_volume_flow": _optional(
            shape, result.mean_vapor_volume_flow, Dimension.VOLUME_FLOW
        ),
        "final_vapor_volume_flow": _optional(
            shape, result.final_vapor_volume_flow, Dimension.VOLUME_FLOW
        ),
        "comparison": {
            "integrated_evaporated_mass": shape(evaporated, Dimension.MASS),
            "mean_vapor_enthalpy_evaporated_mass": shape(hand, Dimension.MASS),
            "evaporated_mass_difference": shape(hand - evaporated, Dimension.MASS),
            "relative_difference": shape(result.relative_difference, Dimension.DIMENSIONLESS),
        },
        "energy_balance": {
            "sensible_heat_released": shape(result.sensible_heat_released, Dimension.ENERGY),
            "heat_gained": shape(result.heat_gained, Dimension.ENERGY),
            "heat_removed": shape(result.heat_removed, Dimension.ENERGY),
            "vapor_enthalpy": shape(result.vapor_enthalpy, Dimension.ENERGY),
            "residual": shape(result.energy_residual, Dimension.ENERGY),
            "relative_residual": shape(result.relative_energy_residual, Dimension.DIMENSIONLESS),
        },
        "input_uncertainty": _input_uncertainty(
            propagated, inputs, EVAPORATIVE_COOLING_UNCERTAIN_OUTPUTS, shape
        ),
        **_envelope(result, inputs, properties, unit_set, shape),
    }


FLASH_FREEZE_HEADLINE: Final = {
    "final_temperature": "final_temperature",
    "ice_mass": "ice_mass",
    "evaporated_mass": "evaporated_mass",
    "final_pressure": "final_pressure",
}
"""What a listing of stored calculations shows of a flash-freeze answer (name: path)."""

EVAPORATIVE_COOLING_HEADLINE: Final = {
    "evaporated_mass": "evaporated_mass",
    "heat_removed": "heat_removed",
    "start_pressure": "start_pressure",
    "final_pressure": "final_pressure",
}
"""What a listing of stored calculations shows of an evaporative-cooling answer."""
