"""What a vacuum-chamber simulation returns: events, time series, summary, balances."""

from __future__ import annotations

from dataclasses import dataclass

from service.core.properties.advisories import Advisory
from service.core.properties.lookups import ReportedUncertainty
from service.core.properties.phase import FloatArray
from service.core.properties.sources import PropertySource

__all__ = [
    "ChamberStates",
    "EquipmentChecks",
    "MassEnergyBalance",
    "ScheduleCheck",
    "SimulationEvent",
    "SimulationSummary",
    "VacuumChamberResult",
]


@dataclass(frozen=True)
class ChamberStates:
    """Chamber and product at a sequence of times (arrays of one length, SI).

    Attributes
    ----------
    time : ndarray
        s from the start of pumping.
    total_pressure, air_pressure, vapor_pressure : ndarray
        Chamber pressures, Pa.
    product_temperature : ndarray
        K.
    product_vapor_pressure : ndarray
        Equilibrium vapor pressure over the product, Pa.
    evaporated_mass : ndarray
        Water the product has lost, kg.
    ice_fraction : ndarray
        Ice mass / initial water mass.
    evaporation_rate : ndarray
        kg/s leaving the product (negative: condensing onto it).
    pump_volume_flow : ndarray
        Effective pumping speed S_eff(p), m3/s.
    vapor_mass_flow_to_pump, vapor_mass_flow_to_condenser : ndarray
        kg/s.
    vapor_volume_flow_to_pump, vapor_volume_flow_to_condenser : ndarray
        The vapor's share of the volume flow at the chamber's total pressure and
        temperature, m3/s (mass flow R T_g / p).
    condenser_load : ndarray
        W.
    condenser_ice : ndarray
        kg of ice on the condenser.
    heat_gain_rate : ndarray
        W into the product.
    core_temperature, surface_temperature : ndarray or None
        K at the product's centre and at its surface (interior model); None for the
        lumped product, whose one temperature is ``product_temperature``. With the
        interior model ``product_temperature`` is the volume mean.
    air_flux_ratio : ndarray or None
        Kinetic evaporation only: the flux with the air's resistance over the surface
        flux alone (below 0.5: the diffusion of vapor through the air governs); None in
        the equilibrium mode.
    """

    time: FloatArray
    total_pressure: FloatArray
    air_pressure: FloatArray
    vapor_pressure: FloatArray
    product_temperature: FloatArray
    product_vapor_pressure: FloatArray
    evaporated_mass: FloatArray
    ice_fraction: FloatArray
    evaporation_rate: FloatArray
    pump_volume_flow: FloatArray
    vapor_mass_flow_to_pump: FloatArray
    vapor_volume_flow_to_pump: FloatArray
    vapor_mass_flow_to_condenser: FloatArray
    vapor_volume_flow_to_condenser: FloatArray
    condenser_load: FloatArray
    condenser_ice: FloatArray
    heat_gain_rate: FloatArray
    core_temperature: FloatArray | None = None
    surface_temperature: FloatArray | None = None
    air_flux_ratio: FloatArray | None = None


@dataclass(frozen=True)
class SimulationEvent:
    """Something that happened, when, and the state then.

    Attributes
    ----------
    name : str
        One of ``flash-point``, ``boiling-stops``, ``freezing-starts``, ``fully-frozen``,
        ``target-reached``, ``end-time``, ``condenser-capacity-exceeded``,
        ``schedule-limit-missed``, ``model-range-left``, ``water-exhausted``.
    time : float
        s.
    state : ChamberStates
        The state at ``time`` (one element).
    detail : str
        One sentence.
    """

    name: str
    time: float
    state: ChamberStates
    detail: str


@dataclass(frozen=True)
class ScheduleCheck:
    """One schedule limit and how the product met it.

    Attributes
    ----------
    time, temperature_limit : float
        s, K.
    product_temperature : float or None
        K at ``time`` where the limit applies (``applies_to``); None when the
        simulation ended before.
    met : bool or None
        None when not evaluated (the simulation ended before ``time``).
    applies_to : {"core", "mean", "surface"}
        Where the temperature is read: the one product temperature of the lumped
        model is reported as ``"mean"``.
    """

    time: float
    temperature_limit: float
    product_temperature: float | None
    met: bool | None
    applies_to: str = "mean"


@dataclass(frozen=True)
class MassEnergyBalance:
    """Closure of the water mass and the product energy over the simulation.

    Mass: initial water + initial chamber vapor = final water + final chamber vapor +
    vapor to pump + vapor to condenser. Energy: E_initial + heat gained =
    E_final + enthalpy carried by the vapor leaving the product.
    """

    initial_water: float
    final_water: float
    initial_chamber_vapor: float
    final_chamber_vapor: float
    vapor_to_pump: float
    vapor_to_condenser: float
    mass_residual: float
    relative_mass_residual: float
    initial_energy: float
    final_energy: float
    vapor_enthalpy: float
    heat_gained: float
    energy_residual: float
    relative_energy_residual: float


@dataclass(frozen=True)
class SimulationSummary:
    """Headline numbers (SI; times in s, None where the event did not happen).

    ``final_temperature`` is the product's (its volume mean with the interior model);
    ``final_core_temperature`` and ``final_surface_temperature`` are None for the lumped
    product; ``target_applies_to`` says where the target and schedule were read.
    """

    end_reason: str
    end_time: float
    flash_time: float | None
    freezing_start_time: float | None
    fully_frozen_time: float | None
    target_time: float | None
    final_temperature: float
    final_pressure: float
    evaporated_mass: float
    evaporated_fraction_of_water: float
    ice_mass: float
    vapor_to_pump: float
    vapor_to_condenser: float
    condenser_energy: float
    peak_condenser_load: float
    peak_vapor_mass_flow_to_pump: float
    peak_evaporation_rate: float
    schedule_met: bool | None
    solver_steps: int
    right_hand_side_evaluations: int
    final_core_temperature: float | None = None
    final_surface_temperature: float | None = None
    target_applies_to: str = "mean"


@dataclass(frozen=True)
class EquipmentChecks:
    """What the pump and the trap must handle, from the simulated run (SI).

    Rates are read on the series points (they include every event), so peaks and times
    are resolved to the series spacing.

    Attributes
    ----------
    peak_pump_inlet_volume_flow : float
        m3/s, largest effective pumping speed S_eff(p): the gas volume flow (air and vapor)
        entering the pump at the chamber pressure and temperature.
    peak_pump_inlet_pressure : float
        Pa, chamber pressure at that point.
    end_pump_inlet_volume_flow, end_pump_inlet_pressure : float
        m3/s and Pa at the end of the run.
    pump_vapor_mass : float
        kg of water vapor the pump itself takes (not captured by the trap).
    peak_pump_vapor_mass_flow : float
        kg/s, largest vapor mass flow into the pump.
    pump_water_vapor_tolerance : float or None
        kg/s, as stated for the pump.
    time_above_water_vapor_tolerance : float or None
        s during which the vapor mass flow into the pump exceeds that tolerance.
    peak_trap_load : float or None
        W, largest heat the trap removes (None without a trap).
    peak_trap_load_time : float or None
        s.
    trap_refrigeration_capacity : float or None
        W, as stated.
    trap_ice : float or None
        kg of ice on the trap at the end.
    trap_ice_capacity : float or None
        kg, as stated.
    trap_ice_capacity_used : float or None
        trap_ice / trap_ice_capacity (above 1: exceeded).
    trap_limited_time : float or None
        s during which the trap's capture ran at its refrigeration capacity, so that the
        trap rather than the pump limited the vapor removal (0 without a stated capacity;
        None without a trap).
    """

    peak_pump_inlet_volume_flow: float
    peak_pump_inlet_pressure: float
    end_pump_inlet_volume_flow: float
    end_pump_inlet_pressure: float
    pump_vapor_mass: float
    peak_pump_vapor_mass_flow: float
    pump_water_vapor_tolerance: float | None
    time_above_water_vapor_tolerance: float | None
    peak_trap_load: float | None
    peak_trap_load_time: float | None
    trap_refrigeration_capacity: float | None
    trap_ice: float | None
    trap_ice_capacity: float | None
    trap_ice_capacity_used: float | None
    trap_limited_time: float | None


@dataclass(frozen=True)
class VacuumChamberResult:
    """Output of :func:`service.core.simulation.simulate_vacuum_chamber`."""

    events: tuple[SimulationEvent, ...]
    series: ChamberStates
    summary: SimulationSummary
    balance: MassEnergyBalance
    schedule: tuple[ScheduleCheck, ...]
    assumptions: tuple[str, ...]
    warnings: tuple[Advisory, ...]
    references: tuple[str, ...]
    property_sources: tuple[PropertySource, ...]
    property_uncertainties: tuple[ReportedUncertainty, ...] = ()
    checks: EquipmentChecks | None = None
