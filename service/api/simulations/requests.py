"""Simulation request -> core case: every quantity a single SI value under its dotted path.

Each input is read with :func:`service.api.http.quantities.read_quantity` under the path the
request uses (``pump.nominal_speed``, ``product.solute.mass_fraction``,
``schedule[1].time``...), so core errors name the field as the client sent it.
"""

from __future__ import annotations

from dataclasses import replace
from typing import Any

from pydantic import BaseModel

from service.api.balances.requests import check_companion, material_assumptions
from service.api.balances.schemas import CompanionInput, CompositionInput, SoluteInput
from service.api.http.limits import check_batch_size
from service.api.http.models import QuantityValue, QuantityValues
from service.api.http.quantities import read_quantity
from service.api.http.units import Dimension
from service.api.simulations.schemas import (
    ProductInput,
    ProductInteriorInput,
    PumpInput,
    VacuumChamberSimulationCreate,
)
from service.core.balances import (
    MATERIAL_SPECIFIC_HEATS,
    NAMED_SOLUTES,
    Companion,
    Composition,
    Solute,
    named_solute,
)
from service.core.errors import InvalidInputError, OutOfRangeError
from service.core.simulation import (
    Chamber,
    Condenser,
    HeatGainRate,
    Product,
    ProductInterior,
    Pump,
    ScheduleLimit,
    VacuumChamberCase,
)

__all__ = ["read_vacuum_chamber", "read_vacuum_chamber_sweep"]


def _one(raw: Any, path: str, dimension: Dimension) -> float:
    """One SI value; an array is refused."""
    parsed = read_quantity(raw, field=path, dimension=dimension)
    if parsed.is_array or parsed.size != 1:
        raise InvalidInputError(path, "must be a single value (this input takes no sweep)")
    return float(parsed.si[0])


def _maybe(raw: Any, path: str, dimension: Dimension) -> float | None:
    return None if raw is None else _one(raw, path, dimension)


def _pump(pump: PumpInput) -> Pump:
    pressures: tuple[float, ...] = ()
    speeds: tuple[float, ...] = ()
    if pump.speed_curve is not None:
        pressures = tuple(
            _one(point.pressure, f"pump.speed_curve[{i}].pressure", Dimension.PRESSURE)
            for i, point in enumerate(pump.speed_curve)
        )
        speeds = tuple(
            _one(point.speed, f"pump.speed_curve[{i}].speed", Dimension.VOLUME_FLOW)
            for i, point in enumerate(pump.speed_curve)
        )
    return Pump(
        nominal_speed=_one(pump.nominal_speed, "pump.nominal_speed", Dimension.VOLUME_FLOW),
        ultimate_pressure=_one(
            pump.ultimate_pressure, "pump.ultimate_pressure", Dimension.PRESSURE
        ),
        speed_curve_pressures=pressures,
        speed_curve_speeds=speeds,
        water_vapor_tolerance=_maybe(
            pump.water_vapor_tolerance, "pump.water_vapor_tolerance", Dimension.MASS_FLOW
        ),
    )


def _composition(composition: CompositionInput | None) -> Composition | None:
    if composition is None:
        return None
    if composition.dissolved_solutes:
        raise InvalidInputError(
            "product.composition.dissolved_solutes",
            "not taken by the chamber simulation yet: give the product's `solute`, or use "
            "/v1/properties/ice-fraction for the food's freezing point",
        )
    fractions: dict[str, Any] = {
        name: _one(
            getattr(composition, name), f"product.composition.{name}", Dimension.DIMENSIONLESS
        )
        for name in ("water", "protein", "fat", "carbohydrate", "fiber", "ash")
    }
    return Composition(**fractions)


def _solute(solute: SoluteInput | None) -> Solute | None:
    if solute is None:
        return None
    prefix = "product.solute"
    if solute.specific_heat is not None:
        raise InvalidInputError(
            f"{prefix}.specific_heat",
            "not taken by the simulation: the solute is part of the non-water mass, whose heat "
            "is given by product.solids_specific_heat or product.composition",
        )
    fraction = _one(solute.mass_fraction, f"{prefix}.mass_fraction", Dimension.DIMENSIONLESS)
    if solute.name is not None:
        if solute.name not in NAMED_SOLUTES:
            known = ", ".join(sorted(NAMED_SOLUTES))
            raise InvalidInputError(
                f"{prefix}.name", f"unknown solute {solute.name!r}; known: {known}", solute.name
            )
        if solute.molar_mass is not None or solute.van_t_hoff_factor is not None:
            raise InvalidInputError(
                f"{prefix}.name",
                "a named solute brings its molar mass and van 't Hoff factor; omit them",
            )
        # the named solute's published model by default, as in the balances
        return named_solute(solute.name, fraction, solute.model)
    if solute.molar_mass is None:
        raise InvalidInputError(
            f"{prefix}.molar_mass", "give a named solute (name) or its molar mass"
        )
    factor = _maybe(
        solute.van_t_hoff_factor, f"{prefix}.van_t_hoff_factor", Dimension.DIMENSIONLESS
    )
    return Solute(
        mass_fraction=fraction,
        molar_mass=_one(solute.molar_mass, f"{prefix}.molar_mass", Dimension.MOLAR_MASS),
        van_t_hoff_factor=1.0 if factor is None else factor,
    )


def _interior(interior: ProductInteriorInput | None) -> ProductInterior | None:
    if interior is None:
        return None
    prefix = "product.interior"
    return ProductInterior(
        geometry=interior.geometry,
        half_thickness_or_radius=_one(
            interior.half_thickness_or_radius,
            f"{prefix}.half_thickness_or_radius",
            Dimension.LENGTH,
        ),
        thermal_conductivity=_maybe(
            interior.thermal_conductivity,
            f"{prefix}.thermal_conductivity",
            Dimension.THERMAL_CONDUCTIVITY,
        ),
        density=_maybe(interior.density, f"{prefix}.density", Dimension.DENSITY),
        nodes=interior.nodes,
        target_applies_to=interior.target_applies_to,
        pore_venting_time=_maybe(
            interior.pore_venting_time, f"{prefix}.pore_venting_time", Dimension.TIME
        ),
    )


def _product(product: ProductInput) -> Product:
    if product.composition is not None and (
        product.model_fields_set & {"water_fraction", "solids_specific_heat"}
    ):
        raise InvalidInputError(
            "product.composition",
            "give composition, or water_fraction and solids_specific_heat, not both",
        )
    return Product(
        mass=_one(product.mass, "product.mass", Dimension.MASS),
        initial_temperature=_one(
            product.initial_temperature, "product.initial_temperature", Dimension.TEMPERATURE
        ),
        water_fraction=_one(
            product.water_fraction, "product.water_fraction", Dimension.DIMENSIONLESS
        ),
        solids_specific_heat=_one(
            product.solids_specific_heat, "product.solids_specific_heat", Dimension.SPECIFIC_ENTROPY
        ),
        composition=_composition(product.composition),
        solute=_solute(product.solute),
        evaporation=product.evaporation,
        exposed_area=_maybe(product.exposed_area, "product.exposed_area", Dimension.AREA),
        evaporation_coefficient=_maybe(
            product.evaporation_coefficient,
            "product.evaporation_coefficient",
            Dimension.DIMENSIONLESS,
        ),
        characteristic_size=_maybe(
            product.characteristic_size, "product.characteristic_size", Dimension.LENGTH
        ),
        nucleation_temperature=_maybe(
            product.nucleation_temperature,
            "product.nucleation_temperature",
            Dimension.TEMPERATURE,
        ),
        interior=_interior(product.interior),
    )


def _companions(companions: list[CompanionInput]) -> tuple[tuple[Companion, ...], tuple[str, ...]]:
    items = []
    for position, item in enumerate(companions):
        prefix = f"companions[{position}]"
        check_companion(item, f"{prefix}.")
        if item.material is not None:
            specific_heat = MATERIAL_SPECIFIC_HEATS[item.material].specific_heat
        else:
            specific_heat = _one(
                item.specific_heat, f"{prefix}.specific_heat", Dimension.SPECIFIC_ENTROPY
            )
        items.append(
            Companion(
                mass=_one(item.mass, f"{prefix}.mass", Dimension.MASS),
                specific_heat=specific_heat,
                name=item.name or item.material or f"companion {position}",
            )
        )
    return tuple(items), material_assumptions(item.material for item in companions)


def read_vacuum_chamber(
    body: VacuumChamberSimulationCreate,
) -> tuple[VacuumChamberCase, tuple[str, ...]]:
    """The simulation request as a core case, plus assumptions the HTTP layer adds.

    Raises
    ------
    InvalidInputError
        Unreadable quantity, an array, conflicting or unknown options.
    """
    chamber = body.chamber
    condenser = body.condenser
    gain = body.heat_gain
    companions, notes = _companions(body.companions)
    case = VacuumChamberCase(
        chamber=Chamber(
            free_volume=_one(chamber.free_volume, "chamber.free_volume", Dimension.VOLUME),
            initial_pressure=_one(
                chamber.initial_pressure, "chamber.initial_pressure", Dimension.PRESSURE
            ),
            temperature=_one(chamber.temperature, "chamber.temperature", Dimension.TEMPERATURE),
            leak_rate=_one(chamber.leak_rate, "chamber.leak_rate", Dimension.LEAK_RATE),
            initial_vapor_pressure=_one(
                chamber.initial_vapor_pressure, "chamber.initial_vapor_pressure", Dimension.PRESSURE
            ),
        ),
        pump=_pump(body.pump),
        product=_product(body.product),
        end_time=_one(body.end_time, "end_time", Dimension.TIME),
        condenser=None
        if condenser is None
        else Condenser(
            surface_temperature=_one(
                condenser.surface_temperature,
                "condenser.surface_temperature",
                Dimension.TEMPERATURE,
            ),
            vapor_conductance=_one(
                condenser.vapor_conductance, "condenser.vapor_conductance", Dimension.VOLUME_FLOW
            ),
            ice_capacity=_maybe(condenser.ice_capacity, "condenser.ice_capacity", Dimension.MASS),
            refrigeration_capacity=_maybe(
                condenser.refrigeration_capacity,
                "condenser.refrigeration_capacity",
                Dimension.POWER,
            ),
        ),
        companions=companions,
        heat_gain=None
        if gain is None
        else HeatGainRate(
            power=_one(gain.power, "heat_gain.power", Dimension.POWER),
            conductance=_one(
                gain.conductance, "heat_gain.conductance", Dimension.THERMAL_CONDUCTANCE
            ),
            surroundings_temperature=_maybe(
                gain.surroundings_temperature,
                "heat_gain.surroundings_temperature",
                Dimension.TEMPERATURE,
            ),
            radiating_area=_one(gain.radiating_area, "heat_gain.radiating_area", Dimension.AREA),
            emissivity=_one(gain.emissivity, "heat_gain.emissivity", Dimension.DIMENSIONLESS),
            wall_temperature=_maybe(
                gain.wall_temperature, "heat_gain.wall_temperature", Dimension.TEMPERATURE
            ),
            contact_coefficient=_one(
                gain.contact_coefficient,
                "heat_gain.contact_coefficient",
                Dimension.HEAT_TRANSFER_COEFFICIENT,
            ),
            contact_area=_one(gain.contact_area, "heat_gain.contact_area", Dimension.AREA),
            shelf_temperature=_maybe(
                gain.shelf_temperature, "heat_gain.shelf_temperature", Dimension.TEMPERATURE
            ),
        ),
        target_temperature=_maybe(
            body.target_temperature, "target_temperature", Dimension.TEMPERATURE
        ),
        schedule=tuple(
            ScheduleLimit(
                time=_one(limit.time, f"schedule[{i}].time", Dimension.TIME),
                temperature=_one(
                    limit.temperature, f"schedule[{i}].temperature", Dimension.TEMPERATURE
                ),
            )
            for i, limit in enumerate(body.schedule)
        ),
        series_points=body.series_points,
    )
    return case, notes


def _is_plain_array(value: Any) -> bool:
    return (
        isinstance(value, list)
        and bool(value)
        and all(isinstance(item, int | float) and not isinstance(item, bool) for item in value)
    )


def _arrays(model: BaseModel, prefix: str = "") -> dict[str, int]:
    """Dotted path -> length of every quantity given as an array in ``model``."""
    found: dict[str, int] = {}
    for name in type(model).model_fields:
        value = getattr(model, name)
        path = f"{prefix}{name}"
        if isinstance(value, QuantityValues):
            found[path] = len(value.values)
        elif _is_plain_array(value):
            found[path] = len(value)
        elif isinstance(value, BaseModel):
            found.update(_arrays(value, f"{path}."))
        elif isinstance(value, list):
            for index, item in enumerate(value):
                if isinstance(item, BaseModel):
                    found.update(_arrays(item, f"{path}[{index}]."))
    return found


def _element(model: BaseModel, index: int) -> Any:
    """A copy of ``model`` with every array quantity replaced by its ``index``-th value
    (a one-value array stands for every case)."""
    update: dict[str, Any] = {}
    for name in type(model).model_fields:
        value = getattr(model, name)
        if isinstance(value, QuantityValues):
            values = value.values
            update[name] = QuantityValue(
                value=values[index if len(values) > 1 else 0], unit=value.unit
            )
        elif _is_plain_array(value):
            update[name] = float(value[index if len(value) > 1 else 0])
        elif isinstance(value, BaseModel):
            update[name] = _element(value, index)
        elif isinstance(value, list) and any(isinstance(item, BaseModel) for item in value):
            update[name] = [
                _element(item, index) if isinstance(item, BaseModel) else item for item in value
            ]
    return model.model_copy(update=update)


def read_vacuum_chamber_sweep(
    body: VacuumChamberSimulationCreate, max_cases: int
) -> tuple[list[VacuumChamberCase], tuple[str, ...], tuple[str, ...]]:
    """The request's cases: one, or one per element of its array inputs (a sweep).

    Every array must have the same length, or one value (used for every case); at most
    ``max_cases`` cases (413 above, before any case is read).

    Returns
    -------
    cases, assumptions the HTTP layer adds, swept paths (empty: no sweep)

    Raises
    ------
    InvalidInputError
        Arrays of different lengths, or any input :func:`read_vacuum_chamber` refuses (an
        out-of-range value names its case by ``index``).
    """
    arrays = _arrays(body)
    if not arrays:
        single, single_notes = read_vacuum_chamber(body)
        return [single], single_notes, ()
    count = max(arrays.values())
    check_batch_size(count, max_cases, noun="cases", setting="TRIPOINT_MAX_SIMULATION_SWEEP_CASES")
    for path, length in arrays.items():
        if length not in (1, count):
            raise InvalidInputError(
                path,
                f"a sweep's arrays must all have {count} values (or one); this one has {length}",
                length,
            )
    cases: list[VacuumChamberCase] = []
    notes: tuple[str, ...] = ()
    for index in range(count):
        try:
            case, notes = read_vacuum_chamber(_element(body, index))
        except OutOfRangeError as error:
            raise replace(error, index=index) from None
        cases.append(case)
    return cases, notes, tuple(arrays)
