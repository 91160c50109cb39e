"""Primary-drying requests -> core cases, every quantity read under its dotted path."""

from __future__ import annotations

from typing import Any

import numpy as np

from service.api.drying.schemas import (
    DryingLoadInput,
    EquipmentLimitPointInput,
    GridAxisInput,
    PrimaryDryingDesignSpaceCreate,
    PrimaryDryingSimulationCreate,
    _DryingInputs,
)
from service.api.http.quantities import read_quantity, require_exactly_one
from service.api.http.units import Dimension
from service.core.drying import (
    DesignSpaceCase,
    DriedLayerResistance,
    DryingLoad,
    EquipmentLimit,
    PrimaryDryingCase,
    Recipe,
    VialHeatTransfer,
)
from service.core.errors import InvalidInputError, OutOfRangeError
from service.core.properties.phase import FloatArray

__all__ = ["read_design_space", "read_primary_drying"]


def _single(raw: Any, path: str, dimension: Dimension) -> float:
    """One SI value under ``path``; a batch is refused."""
    parsed = read_quantity(raw, field=path, dimension=dimension)
    if parsed.is_array:
        raise InvalidInputError(path, "must be a single value, not an array")
    return float(parsed.si[0])


def _positive(raw: Any, path: str, dimension: Dimension, unit: str) -> float:
    value = _single(raw, path, dimension)
    if not value > 0.0:
        raise OutOfRangeError(
            path, value, 0.0, None, unit, "must be positive (no ice left)", exclusive_minimum=True
        )
    return value


def _load(load: DryingLoadInput) -> DryingLoad:
    require_exactly_one(
        ("fill_volume", load.fill_volume), ("fill_mass", load.fill_mass), prefix="load."
    )
    outer = _single(load.outer_area, "load.outer_area", Dimension.AREA)
    if load.inner_area is None and load.container == "vial":
        raise InvalidInputError("load.inner_area", "required for vials (the product's area)")
    inner = (
        outer
        if load.inner_area is None
        else _single(load.inner_area, "load.inner_area", Dimension.AREA)
    )
    density = _single(load.solution_density, "load.solution_density", Dimension.DENSITY)
    if load.fill_volume is not None:
        volume = _positive(load.fill_volume, "load.fill_volume", Dimension.VOLUME, "m3")
        fill_mass = volume * density
    else:
        fill_mass = _positive(load.fill_mass, "load.fill_mass", Dimension.MASS, "kg")
    return DryingLoad(
        container_count=load.count,
        heat_transfer_area=outer,
        product_area=inner,
        fill_mass=fill_mass,
        solution_density=density,
        solids_fraction=_single(
            load.solids_fraction, "load.solids_fraction", Dimension.DIMENSIONLESS
        ),
        frozen_conductivity=_single(
            load.frozen_layer_conductivity,
            "load.frozen_layer_conductivity",
            Dimension.THERMAL_CONDUCTIVITY,
        ),
    )


def _equipment(points: list[EquipmentLimitPointInput] | None) -> EquipmentLimit | None:
    if points is None:
        return None
    pressures = [
        _single(p.chamber_pressure, f"equipment_limit[{i}].chamber_pressure", Dimension.PRESSURE)
        for i, p in enumerate(points)
    ]
    rates = [
        _single(
            p.maximum_sublimation_rate,
            f"equipment_limit[{i}].maximum_sublimation_rate",
            Dimension.MASS_FLOW,
        )
        for i, p in enumerate(points)
    ]
    return EquipmentLimit(np.array(pressures), np.array(rates))


def _common(body: _DryingInputs) -> dict[str, Any]:
    heat = body.vial_heat_transfer
    resistance = body.dried_layer_resistance
    prefix_heat, prefix_resistance = "vial_heat_transfer", "dried_layer_resistance"
    return {
        "load": _load(body.load),
        "heat_transfer": VialHeatTransfer(
            contact=_single(
                heat.contact, f"{prefix_heat}.contact", Dimension.HEAT_TRANSFER_COEFFICIENT
            ),
            gas_conduction=_single(
                heat.gas_conduction,
                f"{prefix_heat}.gas_conduction",
                Dimension.HEAT_TRANSFER_COEFFICIENT_PER_PRESSURE,
            ),
            gas_conduction_saturation=_single(
                heat.gas_conduction_saturation,
                f"{prefix_heat}.gas_conduction_saturation",
                Dimension.RECIPROCAL_PRESSURE,
            ),
        ),
        "resistance": DriedLayerResistance(
            at_zero_thickness=_single(
                resistance.at_zero_thickness,
                f"{prefix_resistance}.at_zero_thickness",
                Dimension.FLOW_RESISTANCE,
            ),
            thickness_coefficient=_single(
                resistance.thickness_coefficient,
                f"{prefix_resistance}.thickness_coefficient",
                Dimension.FLOW_RESISTANCE_PER_LENGTH,
            ),
            thickness_saturation=_single(
                resistance.thickness_saturation,
                f"{prefix_resistance}.thickness_saturation",
                Dimension.RECIPROCAL_LENGTH,
            ),
        ),
        "critical_temperature": _single(
            body.critical_temperature, "critical_temperature", Dimension.TEMPERATURE
        ),
        "equipment_limit": _equipment(body.equipment_limit),
    }


def read_primary_drying(body: PrimaryDryingSimulationCreate) -> PrimaryDryingCase:
    """The core case of a run (SI); errors name the request's fields."""
    points = body.recipe
    recipe = Recipe(
        times=np.array(
            [_single(p.time, f"recipe[{i}].time", Dimension.TIME) for i, p in enumerate(points)]
        ),
        shelf_temperatures=np.array(
            [
                _single(
                    p.shelf_temperature, f"recipe[{i}].shelf_temperature", Dimension.TEMPERATURE
                )
                for i, p in enumerate(points)
            ]
        ),
        chamber_pressures=np.array(
            [
                _single(p.chamber_pressure, f"recipe[{i}].chamber_pressure", Dimension.PRESSURE)
                for i, p in enumerate(points)
            ]
        ),
    )
    capacity = (
        None
        if body.condenser_capacity is None
        else _single(body.condenser_capacity, "condenser_capacity", Dimension.MASS)
    )
    return PrimaryDryingCase(
        **_common(body),
        recipe=recipe,
        condenser_capacity=capacity,
        maximum_duration=_single(body.maximum_duration, "maximum_duration", Dimension.TIME),
        series_points=body.series_points,
    )


def _axis(raw: Any, path: str, dimension: Dimension) -> FloatArray:
    if isinstance(raw, GridAxisInput):
        low = _single(raw.minimum, f"{path}.minimum", dimension)
        high = _single(raw.maximum, f"{path}.maximum", dimension)
        if not high > low:
            raise InvalidInputError(f"{path}.maximum", "must be above minimum")
        return np.linspace(low, high, raw.count)
    return read_quantity(raw, field=path, dimension=dimension).si


def read_design_space(body: PrimaryDryingDesignSpaceCreate) -> DesignSpaceCase:
    """The core case of a design space (SI); errors name the request's fields."""
    thickness = (
        None
        if body.dried_layer_thickness is None
        else _single(body.dried_layer_thickness, "dried_layer_thickness", Dimension.LENGTH)
    )
    return DesignSpaceCase(
        **_common(body),
        shelf_temperatures=_axis(
            body.shelf_temperatures, "shelf_temperatures", Dimension.TEMPERATURE
        ),
        chamber_pressures=_axis(body.chamber_pressures, "chamber_pressures", Dimension.PRESSURE),
        dried_layer_thickness=thickness,
    )
