"""Core simulation result -> response dictionary in the client's unit set."""

from __future__ import annotations

from typing import Any, Final

from service.api.http.envelope import envelope
from service.api.http.quantities import quantity_output, scalar_output
from service.api.http.units import Dimension, UnitSet
from service.core.simulation import ChamberStates, EquipmentChecks, VacuumChamberResult

__all__ = ["STATE_DIMENSIONS", "simulation_answer"]

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
    ("final_pressure", Dimension.PRESSURE),
    ("evaporated_mass", Dimension.MASS),
    ("evaporated_fraction", Dimension.DIMENSIONLESS),
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


def _states(states: ChamberStates, unit_set: UnitSet, *, as_array: bool) -> dict[str, Any]:
    return {
        name: quantity_output(getattr(states, name), dimension, unit_set, as_array=as_array)
        for name, dimension in STATE_DIMENSIONS
    }


def simulation_answer(
    result: VacuumChamberResult, unit_set: UnitSet, extra_assumptions: tuple[str, ...] = ()
) -> dict[str, Any]:
    """The response body of one simulation (see ``VacuumChamberSimulationPublic``)."""
    summary = result.summary
    balance = result.balance
    return {
        "summary": {
            "end_reason": summary.end_reason,
            **{
                name: scalar_output(getattr(summary, name), dimension, unit_set)
                for name, dimension in _SUMMARY
            },
            "schedule_met": summary.schedule_met,
            "solver_steps": summary.solver_steps,
            "right_hand_side_evaluations": summary.right_hand_side_evaluations,
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
