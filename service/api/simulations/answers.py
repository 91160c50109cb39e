"""Core simulation result -> response dictionary in the client's unit set."""

from __future__ import annotations

from collections.abc import Sequence
from typing import Any, Final

from service.api.http.envelope import envelope
from service.api.http.quantities import quantity_output, scalar_output
from service.api.http.units import Dimension, UnitSet, convert_from_si, output_unit
from service.core.properties.advisories import Advisory
from service.core.simulation import (
    ChamberStates,
    EquipmentChecks,
    SimulationSummary,
    VacuumChamberCase,
    VacuumChamberResult,
)
from service.core.simulation.case_fields import CASE_FIELDS, case_field_value

__all__ = [
    "FIELD_DIMENSIONS",
    "SIMULATION_HEADLINE",
    "STATE_DIMENSIONS",
    "SWEEP_HEADLINE",
    "simulation_answer",
    "sweep_answer",
]

FIELD_DIMENSIONS: Final[dict[str, Dimension]] = {
    "m3": Dimension.VOLUME,
    "Pa": Dimension.PRESSURE,
    "K": Dimension.TEMPERATURE,
    "Pa*m3/s": Dimension.LEAK_RATE,
    "m3/s": Dimension.VOLUME_FLOW,
    "1": Dimension.DIMENSIONLESS,
    "kg": Dimension.MASS,
    "W": Dimension.POWER,
    "J/(kg*K)": Dimension.SPECIFIC_ENTROPY,
    "m2": Dimension.AREA,
    "m": Dimension.LENGTH,
    "W/K": Dimension.THERMAL_CONDUCTANCE,
    "W/(m2*K)": Dimension.HEAT_TRANSFER_COEFFICIENT,
    "s": Dimension.TIME,
    "kg/s": Dimension.MASS_FLOW,
    "W/(m*K)": Dimension.THERMAL_CONDUCTIVITY,
    "kg/m3": Dimension.DENSITY,
}
"""SI unit of a case field (:data:`CASE_FIELDS`) -> its dimension."""

STATE_DIMENSIONS: Final[tuple[tuple[str, Dimension], ...]] = (
    ("time", Dimension.TIME),
    ("total_pressure", Dimension.PRESSURE),
    ("air_pressure", Dimension.PRESSURE),
    ("vapor_pressure", Dimension.PRESSURE),
    ("product_temperature", Dimension.TEMPERATURE),
    ("product_vapor_pressure", Dimension.PRESSURE),
    ("evaporated_mass", Dimension.MASS),
    ("ice_fraction", Dimension.DIMENSIONLESS),
    ("evaporation_rate", Dimension.MASS_FLOW),
    ("pump_volume_flow", Dimension.VOLUME_FLOW),
    ("vapor_mass_flow_to_pump", Dimension.MASS_FLOW),
    ("vapor_volume_flow_to_pump", Dimension.VOLUME_FLOW),
    ("vapor_mass_flow_to_condenser", Dimension.MASS_FLOW),
    ("vapor_volume_flow_to_condenser", Dimension.VOLUME_FLOW),
    ("condenser_load", Dimension.POWER),
    ("condenser_ice", Dimension.MASS),
    ("heat_gain_rate", Dimension.POWER),
)
"""Fields of :class:`ChamberStates` with their dimensions, in response order."""

_SUMMARY: Final[tuple[tuple[str, Dimension], ...]] = (
    ("end_time", Dimension.TIME),
    ("flash_time", Dimension.TIME),
    ("freezing_start_time", Dimension.TIME),
    ("fully_frozen_time", Dimension.TIME),
    ("target_time", Dimension.TIME),
    ("final_temperature", Dimension.TEMPERATURE),
    ("final_core_temperature", Dimension.TEMPERATURE),
    ("final_surface_temperature", Dimension.TEMPERATURE),
    ("final_pressure", Dimension.PRESSURE),
    ("evaporated_mass", Dimension.MASS),
    ("evaporated_fraction_of_water", Dimension.DIMENSIONLESS),
    ("ice_mass", Dimension.MASS),
    ("vapor_to_pump", Dimension.MASS),
    ("vapor_to_condenser", Dimension.MASS),
    ("condenser_energy", Dimension.ENERGY),
    ("peak_condenser_load", Dimension.POWER),
    ("peak_vapor_mass_flow_to_pump", Dimension.MASS_FLOW),
    ("peak_evaporation_rate", Dimension.MASS_FLOW),
)

_BALANCE: Final[tuple[tuple[str, Dimension], ...]] = (
    ("initial_water", Dimension.MASS),
    ("final_water", Dimension.MASS),
    ("initial_chamber_vapor", Dimension.MASS),
    ("final_chamber_vapor", Dimension.MASS),
    ("vapor_to_pump", Dimension.MASS),
    ("vapor_to_condenser", Dimension.MASS),
    ("mass_residual", Dimension.MASS),
    ("relative_mass_residual", Dimension.DIMENSIONLESS),
    ("initial_energy", Dimension.ENERGY),
    ("final_energy", Dimension.ENERGY),
    ("vapor_enthalpy", Dimension.ENERGY),
    ("heat_gained", Dimension.ENERGY),
    ("energy_residual", Dimension.ENERGY),
    ("relative_energy_residual", Dimension.DIMENSIONLESS),
)


_CHECKS: Final[tuple[tuple[str, Dimension], ...]] = (
    ("peak_pump_inlet_volume_flow", Dimension.VOLUME_FLOW),
    ("peak_pump_inlet_pressure", Dimension.PRESSURE),
    ("end_pump_inlet_volume_flow", Dimension.VOLUME_FLOW),
    ("end_pump_inlet_pressure", Dimension.PRESSURE),
    ("pump_vapor_mass", Dimension.MASS),
    ("peak_pump_vapor_mass_flow", Dimension.MASS_FLOW),
    ("pump_water_vapor_tolerance", Dimension.MASS_FLOW),
    ("time_above_water_vapor_tolerance", Dimension.TIME),
    ("peak_trap_load", Dimension.POWER),
    ("peak_trap_load_time", Dimension.TIME),
    ("trap_refrigeration_capacity", Dimension.POWER),
    ("trap_ice", Dimension.MASS),
    ("trap_ice_capacity", Dimension.MASS),
    ("trap_ice_capacity_used", Dimension.DIMENSIONLESS),
    ("trap_limited_time", Dimension.TIME),
)
"""Fields of :class:`EquipmentChecks` with their dimensions, in response order."""


def _checks(checks: EquipmentChecks | None, unit_set: UnitSet) -> dict[str, Any] | None:
    if checks is None:
        return None
    answer: dict[str, Any] = {
        name: scalar_output(getattr(checks, name), dimension, unit_set)
        for name, dimension in _CHECKS
    }
    tolerance = checks.pump_water_vapor_tolerance
    answer["water_vapor_tolerance_exceeded"] = (
        None if tolerance is None else checks.peak_pump_vapor_mass_flow > tolerance
    )
    capacity = checks.trap_ice_capacity_used
    answer["trap_ice_capacity_exceeded"] = None if capacity is None else capacity > 1.0
    return answer


def _summary(summary: SimulationSummary, unit_set: UnitSet) -> dict[str, Any]:
    return {
        "end_reason": summary.end_reason,
        **{
            name: scalar_output(getattr(summary, name), dimension, unit_set)
            for name, dimension in _SUMMARY
        },
        "schedule_met": summary.schedule_met,
        "solver_steps": summary.solver_steps,
        "right_hand_side_evaluations": summary.right_hand_side_evaluations,
        "target_applies_to": summary.target_applies_to,
    }


def _column(
    items: list[Any], dimension: Dimension | None, unit_set: UnitSet
) -> dict[str, Any] | list[Any]:
    """Per-case items (``{"value", "unit"}`` or None; or plain values) as one column."""
    if dimension is None:
        return items
    return {
        "values": [None if item is None else item["value"] for item in items],
        "unit": output_unit(dimension, unit_set),
    }


def _columns(
    rows: list[dict[str, Any]], dimensions: dict[str, Dimension], unit_set: UnitSet
) -> dict[str, Any]:
    return {
        name: _column([row[name] for row in rows], dimensions.get(name), unit_set)
        for name in rows[0]
    }


def _sweep_inputs(
    cases: Sequence[VacuumChamberCase], swept: tuple[str, ...], unit_set: UnitSet
) -> dict[str, Any]:
    inputs: dict[str, Any] = {}
    for path in swept:
        known = CASE_FIELDS.get(path)
        if known is None:
            continue
        dimension = FIELD_DIMENSIONS[known.unit]
        values = [case_field_value(case, path) for case in cases]
        inputs[path] = {
            "values": [
                None if value is None else convert_from_si(value, dimension, unit_set)
                for value in values
            ],
            "unit": output_unit(dimension, unit_set),
        }
    return inputs


def _merged_advisories(results: Sequence[VacuumChamberResult]) -> list[Advisory]:
    """Each distinct warning once, with the indices of the cases it applies to."""
    found: dict[tuple[str, str], list[int]] = {}
    for index, result in enumerate(results):
        for advisory in result.warnings:
            found.setdefault((advisory.code, advisory.message), []).append(index)
    return [Advisory(code, message, tuple(indices)) for (code, message), indices in found.items()]


def sweep_answer(
    results: Sequence[VacuumChamberResult],
    cases: Sequence[VacuumChamberCase],
    swept: tuple[str, ...],
    unit_set: UnitSet,
    extra_assumptions: tuple[str, ...] = (),
) -> dict[str, Any]:
    """The response body of a sweep (see ``VacuumChamberSweepPublic``): every result as
    ``values`` in case order."""
    summaries = [_summary(result.summary, unit_set) for result in results]
    checks = [_checks(result.checks, unit_set) or {} for result in results]
    assumptions = dict.fromkeys(item for result in results for item in result.assumptions)
    first = results[0]
    return {
        "cases": len(results),
        "swept": list(swept),
        "inputs": _sweep_inputs(cases, swept, unit_set),
        "summary": _columns(summaries, dict(_SUMMARY), unit_set),
        "checks": _columns(checks, dict(_CHECKS), unit_set),
        "model_references": list(first.references),
        **envelope(
            unit_set=unit_set,
            assumptions=(*assumptions, *extra_assumptions),
            sources=first.property_sources,
            uncertainties=first.property_uncertainties,
            advisories=_merged_advisories(results),
        ),
    }


_OPTIONAL_STATES: Final[tuple[tuple[str, Dimension], ...]] = (
    ("core_temperature", Dimension.TEMPERATURE),
    ("surface_temperature", Dimension.TEMPERATURE),
    ("air_flux_ratio", Dimension.DIMENSIONLESS),
)
"""Fields of :class:`ChamberStates` that only some runs have (the interior model's
temperatures; the air's flux ratio of a kinetic run's series), omitted where None."""


def _states(states: ChamberStates, unit_set: UnitSet, *, as_array: bool) -> dict[str, Any]:
    answer: dict[str, Any] = {
        name: quantity_output(getattr(states, name), dimension, unit_set, as_array=as_array)
        for name, dimension in STATE_DIMENSIONS
    }
    for name, dimension in _OPTIONAL_STATES:
        values = getattr(states, name)
        if values is not None:
            answer[name] = quantity_output(values, dimension, unit_set, as_array=as_array)
    return answer


def simulation_answer(
    result: VacuumChamberResult, unit_set: UnitSet, extra_assumptions: tuple[str, ...] = ()
) -> dict[str, Any]:
    """The response body of one simulation (see ``VacuumChamberSimulationPublic``)."""
    balance = result.balance
    return {
        "summary": _summary(result.summary, unit_set),
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
        "schedule": [
            {
                "time": scalar_output(check.time, Dimension.TIME, unit_set),
                "temperature_limit": scalar_output(
                    check.temperature_limit, Dimension.TEMPERATURE, unit_set
                ),
                "product_temperature": scalar_output(
                    check.product_temperature, Dimension.TEMPERATURE, unit_set
                ),
                "met": check.met,
                "applies_to": check.applies_to,
            }
            for check in result.schedule
        ],
        "balance": {
            name: scalar_output(getattr(balance, name), dimension, unit_set)
            for name, dimension in _BALANCE
        },
        "checks": _checks(result.checks, unit_set),
        "model_references": list(result.references),
        **envelope(
            unit_set=unit_set,
            assumptions=(*result.assumptions, *extra_assumptions),
            sources=result.property_sources,
            uncertainties=result.property_uncertainties,
            advisories=result.warnings,
        ),
    }


SIMULATION_HEADLINE: Final = {
    "end_reason": "summary.end_reason",
    "time_to_target": "summary.target_time",
    "final_temperature": "summary.final_temperature",
    "evaporated_mass": "summary.evaporated_mass",
    "end_time": "summary.end_time",
}
"""What a listing of stored calculations shows of a simulation answer (name: path)."""

SWEEP_HEADLINE: Final = {
    "cases": "cases",
    "time_to_target": "summary.target_time",
    "final_temperature": "summary.final_temperature",
}
"""What a listing shows of a sweep: its size and, for up to 20 cases, each case's times
to target and final temperatures."""
