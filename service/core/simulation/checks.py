"""Equipment checks of a simulated run: what the pump and the cold trap must handle.

Computed from the time series of :class:`~service.core.simulation.results.ChamberStates`
(which include every event time):

- pump-inlet volume flow: S_eff(p), the volume flow of chamber gas entering the pump at
  the chamber pressure and temperature, at its peak and at the end;
- vapor the pump itself takes: the integral of the vapor mass flow into the pump (from
  the mass balance), its peak, and the time above the pump's stated water-vapor tolerance;
- trap: peak refrigeration load, ice collected against the ice capacity, and the time its
  capture ran at the refrigeration capacity (the trap, not the pump, limiting the rate).

Times above a threshold are integrated over the series with the indicator averaged on
each interval (trapezoid rule on a 0/1 function), so they are exact to one series step.
"""

from __future__ import annotations

from typing import Final

import numpy as np

from service.core.properties.phase import FloatArray
from service.core.simulation.inputs import VacuumChamberCase
from service.core.simulation.results import ChamberStates, EquipmentChecks

__all__ = ["equipment_checks"]

_AT_CAPACITY: Final = 1.0 - 1.0e-6
"""A trap load at or above this fraction of the refrigeration capacity is at capacity."""


def _time_where(times: FloatArray, flags: FloatArray) -> float:
    """s during which ``flags`` (0/1 at ``times``) holds, trapezoid rule."""
    if times.size < 2:
        return 0.0
    return float(np.sum(np.diff(times) * 0.5 * (flags[1:] + flags[:-1])))


def equipment_checks(
    case: VacuumChamberCase, series: ChamberStates, vapor_to_pump: float
) -> EquipmentChecks:
    """The checks of one run.

    Parameters
    ----------
    case : VacuumChamberCase
        The validated case (pump tolerance, trap capacities).
    series : ChamberStates
        The run's series.
    vapor_to_pump : float
        kg of vapor the pump took over the run (the integrated state).

    Returns
    -------
    EquipmentChecks
    """
    times = series.time
    speed = series.pump_volume_flow
    peak = int(np.argmax(speed))
    tolerance = case.pump.water_vapor_tolerance
    above = (
        None
        if tolerance is None
        else _time_where(times, (series.vapor_mass_flow_to_pump > tolerance).astype(float))
    )
    condenser = case.condenser
    peak_load = peak_load_time = ice = used = limited = None
    if condenser is not None:
        load_index = int(np.argmax(series.condenser_load))
        peak_load = float(series.condenser_load[load_index])
        peak_load_time = float(times[load_index])
        ice = float(series.condenser_ice[-1])
        if condenser.ice_capacity is not None:
            used = ice / condenser.ice_capacity
        capacity = condenser.refrigeration_capacity
        limited = (
            0.0
            if capacity is None
            else _time_where(
                times, (series.condenser_load >= _AT_CAPACITY * capacity).astype(float)
            )
        )
    return EquipmentChecks(
        peak_pump_inlet_volume_flow=float(speed[peak]),
        peak_pump_inlet_pressure=float(series.total_pressure[peak]),
        end_pump_inlet_volume_flow=float(speed[-1]),
        end_pump_inlet_pressure=float(series.total_pressure[-1]),
        pump_vapor_mass=vapor_to_pump,
        peak_pump_vapor_mass_flow=float(np.max(series.vapor_mass_flow_to_pump)),
        pump_water_vapor_tolerance=tolerance,
        time_above_water_vapor_tolerance=above,
        peak_trap_load=peak_load,
        peak_trap_load_time=peak_load_time,
        trap_refrigeration_capacity=None if condenser is None else condenser.refrigeration_capacity,
        trap_ice=ice,
        trap_ice_capacity=None if condenser is None else condenser.ice_capacity,
        trap_ice_capacity_used=used,
        trap_limited_time=limited,
    )
