"""Vacuum-chamber process simulation: pressure, temperature, ice and loads over time.

Public API: :func:`simulate_vacuum_chamber` with :class:`VacuumChamberCase` (built from
:class:`Chamber`, :class:`Pump`, :class:`Condenser`, :class:`Product`,
:class:`HeatGainRate`, :class:`ScheduleLimit`) -> :class:`VacuumChamberResult`.
"""

from service.core.simulation.inputs import (
    SIMULATION_LIMITS,
    Chamber,
    Condenser,
    HeatGainRate,
    Product,
    ProductInterior,
    Pump,
    ScheduleLimit,
    VacuumChamberCase,
)
from service.core.simulation.results import (
    ChamberStates,
    EquipmentChecks,
    MassEnergyBalance,
    ScheduleCheck,
    SimulationEvent,
    SimulationSummary,
    VacuumChamberResult,
)
from service.core.simulation.vacuum_chamber import REFERENCES, simulate_vacuum_chamber

__all__ = [
    "REFERENCES",
    "SIMULATION_LIMITS",
    "Chamber",
    "ChamberStates",
    "Condenser",
    "EquipmentChecks",
    "HeatGainRate",
    "MassEnergyBalance",
    "Product",
    "ProductInterior",
    "Pump",
    "ScheduleCheck",
    "ScheduleLimit",
    "SimulationEvent",
    "SimulationSummary",
    "VacuumChamberCase",
    "VacuumChamberResult",
    "simulate_vacuum_chamber",
]
