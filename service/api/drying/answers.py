"""Core primary-drying results -> response dictionaries in the client's unit set."""

from __future__ import annotations

import math
from typing import Any, Final

import numpy as np

from service.api.http.envelope import envelope
from service.api.http.quantities import quantity_output, scalar_output
from service.api.http.units import Dimension, UnitSet, convert_from_si, output_unit
from service.core.drying import (
    CELL_STATUSES,
    DesignSpaceResult,
    DryingStates,
    PrimaryDryingResult,
)
from service.core.properties.phase import FloatArray

__all__ = [
    "DESIGN_SPACE_HEADLINE",
    "PRIMARY_DRYING_HEADLINE",
    "STATE_DIMENSIONS",
    "design_space_answer",
    "primary_drying_answer",
]

STATE_DIMENSIONS: Final[tuple[tuple[str, Dimension], ...]] = (
    ("time", Dimension.TIME),
    ("shelf_temperature", Dimension.TEMPERATURE),
    ("chamber_pressure", Dimension.PRESSURE),
    ("front_temperature", Dimension.TEMPERATURE),
    ("bottom_temperature", Dimension.TEMPERATURE),
    ("dried_layer_thickness", Dimension.LENGTH),
    ("frozen_layer_thickness", Dimension.LENGTH),
    ("ice_mass", Dimension.MASS),
    ("sublimation_rate", Dimension.MASS_FLOW),
    ("batch_sublimation_rate", Dimension.MASS_FLOW),
    ("heat_flow", Dimension.POWER),
    ("batch_heat_flow", Dimension.POWER),
    ("heat_transfer_coefficient", Dimension.HEAT_TRANSFER_COEFFICIENT),
    ("dried_layer_resistance", Dimension.FLOW_RESISTANCE),
    ("latent_heat", Dimension.SPECIFIC_ENERGY),
    ("ice_vapor_pressure", Dimension.PRESSURE),
    ("condenser_ice", Dimension.MASS),
)
"""Fields of :class:`DryingStates` with their dimensions, in response order."""

_SUMMARY: Final[tuple[tuple[str, Dimension], ...]] = (
    ("drying_time", Dimension.TIME),
    ("end_time", Dimension.TIME),
    ("maximum_front_temperature", Dimension.TEMPERATURE),
    ("maximum_bottom_temperature", Dimension.TEMPERATURE),
    ("critical_temperature_first_exceeded", Dimension.TIME),
    ("time_above_critical_temperature", Dimension.TIME),
    ("peak_batch_sublimation_rate", Dimension.MASS_FLOW),
    ("equipment_limit_first_exceeded", Dimension.TIME),
    ("condenser_capacity_reached", Dimension.TIME),
)

_BALANCE: Final = ("initial_ice", "remaining_ice", "sublimed_ice", "residual")


def _states(states: DryingStates, unit_set: UnitSet, *, as_array: bool) -> dict[str, Any]:
    return {
        name: quantity_output(getattr(states, name), dimension, unit_set, as_array=as_array)
        for name, dimension in STATE_DIMENSIONS
    }


def primary_drying_answer(result: PrimaryDryingResult, unit_set: UnitSet) -> dict[str, Any]:
    """The response body of one run (see ``PrimaryDryingSimulationPublic``)."""
    summary = result.summary
    balance = result.balance
    limit = result.equipment_rate_limit
    return {
        "summary": {
            "end_reason": summary.end_reason,
            **{
                name: scalar_output(getattr(summary, name), dimension, unit_set)
                for name, dimension in _SUMMARY
            },
            "solver_steps": summary.solver_steps,
        },
        "events": [
            {
                "name": event.name,
                "time": scalar_output(event.time, Dimension.TIME, unit_set),
                "detail": event.detail,
                "state": _states(event.state, unit_set, as_array=False),
            }
            for event in result.events
        ],
        "series": _states(result.series, unit_set, as_array=True),
        "equipment_rate_limit": None
        if limit is None
        else quantity_output(limit, Dimension.MASS_FLOW, unit_set, as_array=True),
        "ice_balance": {
            **{
                name: scalar_output(getattr(balance, name), Dimension.MASS, unit_set)
                for name in _BALANCE
            },
            "relative_residual": scalar_output(
                balance.relative_residual, Dimension.DIMENSIONLESS, unit_set
            ),
        },
        "model_references": list(result.references),
        **envelope(
            unit_set=unit_set,
            assumptions=result.assumptions,
            sources=result.property_sources,
            uncertainties=result.property_uncertainties,
            advisories=result.warnings,
        ),
    }


def _nullable(values: FloatArray, dimension: Dimension, unit_set: UnitSet) -> list[Any]:
    """Converted values with NaN (a setting that does not sublime) as None, nested as given."""
    converted = convert_from_si(np.asarray(values, dtype=np.float64), dimension, unit_set)
    nested: list[Any] = converted.tolist()

    def clean(node: Any) -> Any:
        if isinstance(node, list):
            return [clean(item) for item in node]
        return None if math.isnan(node) else node

    cleaned: list[Any] = clean(nested)
    return cleaned


def _grid(values: FloatArray, dimension: Dimension, unit_set: UnitSet) -> dict[str, Any]:
    return {
        "values": _nullable(values, dimension, unit_set),
        "unit": output_unit(dimension, unit_set),
    }


def _flat(values: FloatArray, dimension: Dimension, unit_set: UnitSet) -> dict[str, Any]:
    return {
        "values": _nullable(values.ravel(), dimension, unit_set),
        "unit": output_unit(dimension, unit_set),
    }


def design_space_answer(result: DesignSpaceResult, unit_set: UnitSet) -> dict[str, Any]:
    """The response body of one design space (see ``PrimaryDryingDesignSpacePublic``)."""
    shelf_grid, pressure_grid = np.meshgrid(
        result.shelf_temperatures, result.chamber_pressures, indexing="ij"
    )
    statuses = [[CELL_STATUSES[int(code)] for code in row] for row in result.status]
    fastest = None
    if result.fastest is not None:
        i, j = result.fastest
        fastest = {
            "shelf_temperature": scalar_output(
                float(result.shelf_temperatures[i]), Dimension.TEMPERATURE, unit_set
            ),
            "chamber_pressure": scalar_output(
                float(result.chamber_pressures[j]), Dimension.PRESSURE, unit_set
            ),
            "front_temperature": scalar_output(
                float(result.front_temperature[i, j]), Dimension.TEMPERATURE, unit_set
            ),
            "batch_sublimation_rate": scalar_output(
                float(result.batch_sublimation_rate[i, j]), Dimension.MASS_FLOW, unit_set
            ),
            "drying_time": None
            if result.drying_time is None
            else scalar_output(float(result.drying_time[i, j]), Dimension.TIME, unit_set),
            "shelf_index": i,
            "pressure_index": j,
        }
    drying_time = result.drying_time
    limit = result.equipment_rate_limit
    return {
        "shelf_temperatures": quantity_output(
            result.shelf_temperatures, Dimension.TEMPERATURE, unit_set, as_array=True
        ),
        "chamber_pressures": quantity_output(
            result.chamber_pressures, Dimension.PRESSURE, unit_set, as_array=True
        ),
        "dried_layer_thickness": scalar_output(
            result.dried_layer_thickness, Dimension.LENGTH, unit_set
        ),
        "critical_temperature": scalar_output(
            result.critical_temperature, Dimension.TEMPERATURE, unit_set
        ),
        "front_temperature": _grid(result.front_temperature, Dimension.TEMPERATURE, unit_set),
        "bottom_temperature": _grid(result.bottom_temperature, Dimension.TEMPERATURE, unit_set),
        "sublimation_rate": _grid(result.sublimation_rate, Dimension.MASS_FLOW, unit_set),
        "batch_sublimation_rate": _grid(
            result.batch_sublimation_rate, Dimension.MASS_FLOW, unit_set
        ),
        "drying_time": None
        if drying_time is None
        else _grid(drying_time, Dimension.TIME, unit_set),
        "equipment_rate_limit": None
        if limit is None
        else quantity_output(limit, Dimension.MASS_FLOW, unit_set, as_array=True),
        "status": statuses,
        "safe": result.safe.tolist(),
        "fastest": fastest,
        "cells": {
            "shelf_temperature": _flat(shelf_grid, Dimension.TEMPERATURE, unit_set),
            "chamber_pressure": _flat(pressure_grid, Dimension.PRESSURE, unit_set),
            "front_temperature": _flat(result.front_temperature, Dimension.TEMPERATURE, unit_set),
            "bottom_temperature": _flat(result.bottom_temperature, Dimension.TEMPERATURE, unit_set),
            "batch_sublimation_rate": _flat(
                result.batch_sublimation_rate, Dimension.MASS_FLOW, unit_set
            ),
            "drying_time": None
            if drying_time is None
            else _flat(drying_time, Dimension.TIME, unit_set),
            "status": [name for row in statuses for name in row],
            "safe": result.safe.ravel().tolist(),
        },
        "model_references": list(result.references),
        **envelope(
            unit_set=unit_set,
            assumptions=result.assumptions,
            sources=result.property_sources,
            uncertainties=result.property_uncertainties,
            advisories=(),
        ),
    }


PRIMARY_DRYING_HEADLINE: Final = {
    "end_reason": "summary.end_reason",
    "drying_time": "summary.drying_time",
    "maximum_front_temperature": "summary.maximum_front_temperature",
    "time_above_critical_temperature": "summary.time_above_critical_temperature",
}
"""What a listing of stored calculations shows of a primary-drying run (name: path)."""

DESIGN_SPACE_HEADLINE: Final = {
    "fastest_shelf_temperature": "fastest.shelf_temperature",
    "fastest_chamber_pressure": "fastest.chamber_pressure",
    "fastest_drying_time": "fastest.drying_time",
    "critical_temperature": "critical_temperature",
}
"""What a listing shows of a design space: its fastest safe setting (left out when no
setting is safe) and the critical temperature."""
