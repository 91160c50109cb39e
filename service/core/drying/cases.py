"""Inputs of the primary-drying calculations, in SI, with their call-level checks.

Field names in errors are the request's dotted paths (``load.fill_volume``,
``recipe[2].chamber_pressure``), so that the HTTP layer can name them as they are.
"""

from __future__ import annotations

from dataclasses import dataclass, field
from typing import Final

import numpy as np

from service.core.drying.coefficients import (
    DriedLayerResistance,
    VialHeatTransfer,
    require_at_least,
)
from service.core.drying.front import FRONT_TEMPERATURE_RANGE
from service.core.errors import InvalidInputError, OutOfRangeError
from service.core.properties.constants import TRIPLE_POINT_PRESSURE
from service.core.properties.phase import FloatArray
from service.core.properties.phase_lines import sublimation_pressure
from service.core.validation import finite_array, require_within

__all__ = [
    "CHAMBER_PRESSURE_RANGE",
    "SHELF_TEMPERATURE_RANGE",
    "DryingLoad",
    "EquipmentLimit",
    "PrimaryDryingCase",
    "Recipe",
    "validate_critical_temperature",
]

SHELF_TEMPERATURE_RANGE: Final = (FRONT_TEMPERATURE_RANGE[0], 400.0)
"""K."""
CHAMBER_PRESSURE_RANGE: Final = (0.05, TRIPLE_POINT_PRESSURE)
"""Pa (0.05 Pa is the ice's vapor pressure near 192 K)."""


def validate_critical_temperature(value: float) -> None:
    """Raise unless the collapse temperature lies in 150 K to 273.16 K."""
    require_within(
        finite_array(value, "critical_temperature"),
        "critical_temperature",
        150.0,
        273.16,
        "K",
        "a collapse temperature lies below the melting point of ice",
    )


def _positive(value: float, name: str, unit: str, reason: str) -> None:
    require_at_least(value, name, 0.0, unit, reason, exclusive_minimum=True)


@dataclass(frozen=True)
class DryingLoad:
    """The containers on the shelves and their frozen fill (SI).

    Attributes
    ----------
    container_count : int
        Vials (or trays) in the batch, >= 1.
    heat_transfer_area : float
        A_v, outer bottom area of one container that K_v refers to, m2.
    product_area : float
        A_p, cross-section of the product in one container, m2.
    fill_mass : float
        Solution filled into one container, kg.
    solution_density : float
        Density of the filled solution, kg/m3 (fill depth = fill_mass / (density A_p)).
    solids_fraction : float
        Mass fraction of solids in the solution, 0 <= x < 1; the rest is water, all of
        which is taken as ice at the start of primary drying.
    frozen_conductivity : float
        Thermal conductivity of the frozen layer, W/(m K).
    """

    container_count: int
    heat_transfer_area: float
    product_area: float
    fill_mass: float
    solution_density: float
    solids_fraction: float
    frozen_conductivity: float

    @property
    def fill_depth(self) -> float:
        """Initial frozen-layer thickness L_0 = fill volume / A_p, m."""
        return self.fill_mass / (self.solution_density * self.product_area)

    @property
    def ice_mass(self) -> float:
        """Ice in one container at the start, kg."""
        return self.fill_mass * (1.0 - self.solids_fraction)

    def validate(self) -> None:
        """Raise OutOfRangeError for a load the model cannot take (naming the field)."""
        if self.container_count < 1:
            raise OutOfRangeError(
                "load.count", float(self.container_count), 1.0, None, "1", "at least one container"
            )
        _positive(self.heat_transfer_area, "load.outer_area", "m2", "an area is positive")
        _positive(self.product_area, "load.inner_area", "m2", "an area is positive")
        _positive(self.fill_mass, "load.fill_mass", "kg", "no ice left: the fill is empty")
        _positive(self.solution_density, "load.solution_density", "kg/m3", "density > 0")
        _positive(self.frozen_conductivity, "load.frozen_layer_conductivity", "W/(m*K)", "> 0")
        require_within(
            finite_array(self.solids_fraction, "load.solids_fraction"),
            "load.solids_fraction",
            0.0,
            0.999,
            "1",
            "no ice left: the solids fraction must leave water to freeze (at most 0.999)",
        )
        require_within(
            np.asarray(self.fill_depth),
            "load.fill_volume",
            0.0,
            0.2,
            "m",
            "the fill depth (fill volume / inner area) must be below 0.2 m for a "
            "one-dimensional layer",
            exclusive_minimum=True,
        )


@dataclass(frozen=True)
class Recipe:
    """Shelf temperature and chamber pressure against time, linear between set points.

    Two set points at the same time make a step; after the last one the values hold.

    Attributes
    ----------
    times : ndarray
        s, non-decreasing, the first 0.
    shelf_temperatures : ndarray
        K.
    chamber_pressures : ndarray
        Pa.
    """

    times: FloatArray
    shelf_temperatures: FloatArray
    chamber_pressures: FloatArray

    def at(self, time: float) -> tuple[float, float]:
        """(shelf temperature K, chamber pressure Pa) at ``time`` (s); after a step, the
        value after it."""
        index = int(np.searchsorted(self.times, time, side="right")) - 1
        index = min(max(index, 0), self.times.size - 1)
        if index == self.times.size - 1:
            return float(self.shelf_temperatures[-1]), float(self.chamber_pressures[-1])
        t0, t1 = float(self.times[index]), float(self.times[index + 1])
        weight = (time - t0) / (t1 - t0)
        shelf = self.shelf_temperatures[index] + weight * (
            self.shelf_temperatures[index + 1] - self.shelf_temperatures[index]
        )
        pressure = self.chamber_pressures[index] + weight * (
            self.chamber_pressures[index + 1] - self.chamber_pressures[index]
        )
        return float(shelf), float(pressure)

    def breaks(self) -> FloatArray:
        """The distinct set-point times, s."""
        return np.unique(self.times)

    def validate(self) -> None:
        """Raise for times out of order, values out of range, or a recipe that sublimes at
        no set point (chamber pressure at or above the ice's vapor pressure at the shelf
        temperature throughout; for part of a recipe the rate is simply zero)."""
        if self.times.size < 1:
            raise InvalidInputError("recipe", "give at least one set point")
        if self.times[0] != 0.0:
            raise OutOfRangeError(
                "recipe[0].time", float(self.times[0]), 0.0, 0.0, "s", "the recipe starts at 0"
            )
        for index in range(1, self.times.size):
            if self.times[index] < self.times[index - 1]:
                raise OutOfRangeError(
                    f"recipe[{index}].time",
                    float(self.times[index]),
                    float(self.times[index - 1]),
                    None,
                    "s",
                    "set-point times must not decrease",
                )
        for index in range(self.times.size):
            require_within(
                self.shelf_temperatures[index : index + 1],
                f"recipe[{index}].shelf_temperature",
                *SHELF_TEMPERATURE_RANGE,
                "K",
                "drying model range",
            )
            require_within(
                self.chamber_pressures[index : index + 1],
                f"recipe[{index}].chamber_pressure",
                *CHAMBER_PRESSURE_RANGE,
                "Pa",
                "the chamber pressure must lie below the triple-point pressure",
            )
        limits = [
            float(sublimation_pressure(min(float(shelf), 273.16)))
            for shelf in self.shelf_temperatures
        ]
        if all(
            pressure >= limit
            for pressure, limit in zip(self.chamber_pressures, limits, strict=True)
        ):
            raise OutOfRangeError(
                "recipe[0].chamber_pressure",
                float(self.chamber_pressures[0]),
                CHAMBER_PRESSURE_RANGE[0],
                limits[0],
                "Pa",
                "at every set point the chamber pressure is at or above the ice's vapor "
                "pressure at the shelf temperature: no ice can sublime",
            )


@dataclass(frozen=True)
class EquipmentLimit:
    """The dryer's largest batch sublimation rate against chamber pressure (choked duct
    or condenser), linear between the points given.

    Attributes
    ----------
    pressures : ndarray
        Pa, increasing, at least two.
    maximum_rates : ndarray
        kg/s for the whole batch, >= 0.
    """

    pressures: FloatArray
    maximum_rates: FloatArray

    def at(self, pressure: FloatArray | float) -> FloatArray:
        """The limit at ``pressure`` (within the points' range), kg/s."""
        values = np.asarray(
            np.interp(pressure, self.pressures, self.maximum_rates), dtype=np.float64
        )
        return values

    def validate(self, pressures_used: FloatArray, field_name: str) -> None:
        """Raise unless the points are increasing and cover every pressure used."""
        if self.pressures.size < 2 or np.any(np.diff(self.pressures) <= 0.0):
            raise InvalidInputError(
                "equipment_limit",
                "give at least two chamber pressures in increasing order",
            )
        require_at_least(
            self.maximum_rates,
            "equipment_limit",
            0.0,
            "kg/s",
            "a rate limit is non-negative",
        )
        require_within(
            pressures_used,
            field_name,
            float(self.pressures[0]),
            float(self.pressures[-1]),
            "Pa",
            "the equipment limit is known only between its first and last chamber pressure "
            "(it is not extrapolated)",
        )


@dataclass(frozen=True)
class PrimaryDryingCase:
    """One primary-drying run (SI).

    Attributes
    ----------
    load, heat_transfer, resistance
        Containers, K_v(P_c) and R_p(l) constants.
    recipe
        Shelf temperature and chamber pressure against time.
    critical_temperature : float
        Collapse (or eutectic) temperature of the product, K.
    condenser_capacity : float or None
        Ice the condenser can hold, kg.
    equipment_limit : EquipmentLimit or None
        Largest batch sublimation rate against chamber pressure.
    maximum_duration : float
        The run stops here if ice is left, s.
    series_points : int
        Points of the time series, 2 to 5000.
    """

    load: DryingLoad
    heat_transfer: VialHeatTransfer
    resistance: DriedLayerResistance
    recipe: Recipe
    critical_temperature: float
    condenser_capacity: float | None = None
    equipment_limit: EquipmentLimit | None = None
    maximum_duration: float = 720.0 * 3600.0
    series_points: int = field(default=201)

    def validate(self) -> None:
        """Check every part (errors name the request field)."""
        self.load.validate()
        self.heat_transfer.validate("vial_heat_transfer")
        self.resistance.validate("dried_layer_resistance")
        self.recipe.validate()
        validate_critical_temperature(self.critical_temperature)
        if self.condenser_capacity is not None:
            _positive(self.condenser_capacity, "condenser_capacity", "kg", "capacity > 0")
        if self.equipment_limit is not None:
            self.equipment_limit.validate(self.recipe.chamber_pressures, "equipment_limit")
        _positive(self.maximum_duration, "maximum_duration", "s", "a duration is positive")
        if not 2 <= self.series_points <= 5000:
            raise OutOfRangeError(
                "series_points", float(self.series_points), 2.0, 5000.0, "1", "series length"
            )
