"""Request/response pair of the vacuum-chamber simulation.

Every numeric input is a single value: a number in its default unit, a string with a unit
(`"250 m3/h"`, `"0.05 mbar*L/s"`, `"-40 degC"`) or `{"value", "unit"}`. Results come as
`{"value"|"values", "unit"}` in the unit set of `output_units`; the time series as
`values` arrays of equal length.
"""

from __future__ import annotations

from typing import Any, Literal

from pydantic import Field

from service.api.balances.schemas import CompanionInput, CompositionInput, SoluteInput
from service.api.http.models import ApiModel, Envelope, QuantityInput, QuantityOutput
from service.api.http.record_labels import RecordLabels
from service.api.http.units import UnitSet

__all__ = [
    "ChamberInput",
    "ChamberStatesOut",
    "CondenserInput",
    "EquipmentChecksOut",
    "HeatGainRateInput",
    "MassEnergyBalanceOut",
    "ProductInput",
    "ProductInteriorInput",
    "PumpInput",
    "ScheduleCheckOut",
    "ScheduleLimitInput",
    "SimulationEventOut",
    "SimulationSummaryOut",
    "SpeedPointInput",
    "VacuumChamberSimulationCreate",
    "VacuumChamberSimulationPublic",
    "VacuumChamberSweepPublic",
]

_ONE_VALUE = (
    'A single value: a number in the default unit, a string with a unit (`"20 degC"`) or '
    '`{"value", "unit"}`.'
)
_OUTPUT_UNITS = (
    "Unit set of the results: `SI` (K, Pa, kg, J, W, s, kg/s, m3/s), `engineering` (degC, "
    "kPa, kg, kJ, kW, s, kg/h, m3/h) or `US` (degF, psi absolute, lb, Btu, Btu/h, s, lb/h, "
    "ft3/min)."
)


def _described(text: str) -> str:
    return f"{text} {_ONE_VALUE}"


# -- inputs ----------------------------------------------------------------------------------


class ChamberInput(ApiModel):
    """The chamber: its free gas volume, the air in it at the start, its leak."""

    free_volume: QuantityInput = Field(
        description=_described(
            "Gas volume (chamber minus load). Default unit m3; 1e-6 to 1e4 (1 mL to 10,000 m3)."
        )
    )
    initial_pressure: QuantityInput = Field(
        101325.0,
        description=_described(
            "Air pressure at the start (absolute). Default unit Pa; > 0, at most 2 bar."
        ),
    )
    temperature: QuantityInput = Field(
        293.15,
        description=_described(
            "Temperature of the chamber gas and walls and of the air leaking in. Default "
            "unit K; 243.15 K to 373.15 K."
        ),
    )
    leak_rate: QuantityInput = Field(
        0.0,
        description=_described(
            'Air leak throughput. Default unit Pa*m3/s; `"0.5 mbar*L/s"` works '
            "(1 mbar*L/s = 0.1 Pa*m3/s); >= 0."
        ),
    )
    initial_vapor_pressure: QuantityInput = Field(
        0.0,
        description=_described("Water vapor partial pressure at the start. Default unit Pa; >= 0."),
    )


class SpeedPointInput(ApiModel):
    """One point of the pump's speed curve."""

    pressure: QuantityInput = Field(description=_described("Inlet pressure. Default unit Pa; > 0."))
    speed: QuantityInput = Field(
        description=_described('Volume flow at that pressure. Default unit m3/s (`"m3/h"`); >= 0.')
    )


class PumpInput(ApiModel):
    """The vacuum pump: effective speed S_eff(p) = S(p) (1 - p_ult/p)."""

    nominal_speed: QuantityInput = Field(
        description=_described('Nominal volume flow. Default unit m3/s (`"250 m3/h"`); > 0.')
    )
    ultimate_pressure: QuantityInput = Field(
        0.0,
        description=_described(
            "Ultimate pressure: the effective speed falls to zero there. Default unit Pa; "
            ">= 0, below the initial pressure. Give 0 with a measured speed curve that "
            "already falls off."
        ),
    )
    speed_curve: list[SpeedPointInput] | None = Field(
        None,
        min_length=2,
        max_length=100,
        description="Speed against pressure (pressures increasing), interpolated linearly in "
        "ln p and held constant beyond its ends; replaces `nominal_speed` where given.",
    )
    water_vapor_tolerance: QuantityInput | None = Field(
        None,
        description=_described(
            'Water-vapor tolerance the maker states for the pump. Default unit kg/s (`"2 kg/h"`); '
            "> 0. Checked against the vapor the pump takes (`checks`), not modelled. Omit for "
            "no check."
        ),
    )


class CondenserInput(ApiModel):
    """A condenser (cold trap) in the chamber."""

    surface_temperature: QuantityInput = Field(
        description=_described("Surface temperature. Default unit K; 173.15 K to 273.16 K.")
    )
    vapor_conductance: QuantityInput = Field(
        description=_described(
            "Volume flow of chamber vapor it takes in (its pumping speed for vapor). Default "
            "unit m3/s; > 0. An ideal cold surface of area A takes A sqrt(R T / (2 pi)), "
            "about 147 m3/s per m2 at 20 degC."
        )
    )
    ice_capacity: QuantityInput | None = Field(
        None, description=_described("Ice it holds. Default unit kg; > 0. Omit for no limit.")
    )
    refrigeration_capacity: QuantityInput | None = Field(
        None,
        description=_described("Refrigeration capacity. Default unit W; > 0. Omit for no limit."),
    )


class ProductInteriorInput(ApiModel):
    """Heat conduction inside the product: the load as identical items of one shape, each
    with a centre (core) and a surface, on radial nodes (finite volumes)."""

    geometry: Literal["slab", "cylinder", "sphere"] = Field(
        description="`slab` (heat and vapor leave by both faces), `cylinder` (long, by its "
        "side) or `sphere`."
    )
    half_thickness_or_radius: QuantityInput = Field(
        description=_described(
            "Half the thickness of a slab, or the radius of a cylinder or sphere (not the "
            'diameter that `characteristic_size` takes). Default unit m (`"5 cm"`); 1 mm '
            "to 1 m."
        )
    )
    thermal_conductivity: QuantityInput | None = Field(
        None,
        description=_described(
            "Of the product as a whole. Default unit W/(m*K); 0.01 to 10. Omitted: from "
            "`product.composition` by the Choi and Okos (1986) parallel model at the initial "
            "temperature (non-porous; give it for bread, produce and other porous products)."
        ),
    )
    density: QuantityInput | None = Field(
        None,
        description=_described(
            "Of the product as a whole, pores included. Default unit kg/m3; 20 to 3000. "
            "Omitted: from `product.composition` by Choi and Okos (non-porous)."
        ),
    )
    nodes: int = Field(
        20, ge=5, le=100, description="Radial nodes from the centre to the surface (unit 1)."
    )
    target_applies_to: Literal["core", "mean", "surface"] = Field(
        "core",
        description="Where `target_temperature` and the schedule are read: the centre "
        "(`core`, the default, as food-safety cooling limits are read), the volume mean or "
        "the surface.",
    )
    pore_venting_time: QuantityInput | None = Field(
        None,
        description=_described(
            "Porous products (bread, produce): inside the product, water boils where its "
            "vapor pressure exceeds the chamber pressure, and the vapor leaves through the "
            "pores with this time constant (a stated model without published values: fit it "
            'to a logged core temperature). Default unit s (`"10 s"`); 0.01 s to 1e5 s. '
            "Omitted: no evaporation inside the product (non-porous)."
        ),
    )


class ProductInput(ApiModel):
    """The load: its water and non-water part, and how it evaporates."""

    mass: QuantityInput = Field(description=_described("Initial mass. Default unit kg; > 0."))
    initial_temperature: QuantityInput = Field(
        description=_described(
            "Initial temperature. Default unit K; from the freezing onset to 373.15 K."
        )
    )
    water_fraction: QuantityInput = Field(
        1.0,
        description=_described(
            "Mass fraction of water (without `composition`). Default unit 1; above 0, at most 1."
        ),
    )
    solids_specific_heat: QuantityInput = Field(
        0.0,
        description=_described(
            "Specific heat of the non-water part (without `composition`). Default unit "
            "J/(kg*K); 0 to 10000."
        ),
    )
    composition: CompositionInput | None = Field(
        None,
        description="Proximate composition instead of `water_fraction` and "
        "`solids_specific_heat` (single values only).",
    )
    solute: SoluteInput | None = Field(
        None,
        description="Dissolved solute (single values only): part of the non-water mass; its "
        "heat is in the solids' specific heat, so `specific_heat` is not taken here.",
    )
    evaporation: Literal["equilibrium", "kinetic"] = Field(
        "equilibrium",
        description="`equilibrium`: the product boils once the chamber reaches its vapor "
        "pressure and holds the chamber there (no evaporation into the air before). "
        "`kinetic`: the Hertz-Knudsen-Langmuir surface flux alpha A (p_eq - p_i) / "
        "sqrt(2 pi R T) in series with vapor diffusion through the chamber air (Stefan flow, "
        "Fuller-Schettler-Giddings diffusivity, natural-convection Sherwood number of a "
        "sphere of `characteristic_size`); needs `exposed_area` and "
        "`evaporation_coefficient`.",
    )
    exposed_area: QuantityInput | None = Field(
        None, description=_described("Evaporating area (kinetic). Default unit m2; > 0.")
    )
    evaporation_coefficient: QuantityInput | None = Field(
        None, description=_described("Evaporation coefficient alpha (kinetic), 0 < alpha <= 1.")
    )
    characteristic_size: QuantityInput | None = Field(
        None,
        description=_described(
            "Diameter of one item (a lettuce head, a loaf), taken as a sphere for the air's "
            'resistance to vapor diffusion (kinetic). Default unit m (`"15 cm"` works); '
            "1 mm to 3 m; omitted means 0.1 m."
        ),
    )
    nucleation_temperature: QuantityInput | None = Field(
        None,
        description=_described(
            "Supercooling: the water stays liquid below its freezing point until this "
            "temperature, then ice nucleates and the product recalesces to its freezing line "
            "at once. Default unit K; from -30 degC to below the freezing point; omitted "
            "means ice forms at the freezing point."
        ),
    )
    interior: ProductInteriorInput | None = Field(
        None,
        description="Conduction inside the product, for surface, mean and core temperatures "
        "(unfrozen products without a solute or supercooling; evaporation inside pores "
        "optional). Omitted: one uniform product temperature.",
    )


class HeatGainRateInput(ApiModel):
    """Heat flowing into the product: power + conductance (surroundings - product) + wall
    radiation (sigma eps A_r (T_wall^4 - T^4)) + shelf contact (h_c A_c (T_shelf - T))."""

    power: QuantityInput = Field(
        0.0, description=_described("Constant heat flow (negative cools). Default unit W.")
    )
    conductance: QuantityInput = Field(
        0.0, description=_described("UA to the surroundings. Default unit W/K; >= 0.")
    )
    surroundings_temperature: QuantityInput | None = Field(
        None,
        description=_described("Default unit K; omitted means the chamber temperature."),
    )
    radiating_area: QuantityInput = Field(
        0.0,
        description=_described(
            "Product surface exchanging radiation with the chamber walls (a small body in a "
            "large enclosure). Default unit m2; >= 0; 0 means no wall radiation."
        ),
    )
    emissivity: QuantityInput = Field(
        0.9,
        description=_described(
            "Effective emissivity of that exchange, above 0 and at most 1 (default 0.9; wet "
            "foods and ice are about 0.9-0.97)."
        ),
    )
    wall_temperature: QuantityInput | None = Field(
        None,
        description=_described("Default unit K; omitted means the chamber temperature."),
    )
    contact_coefficient: QuantityInput = Field(
        0.0,
        description=_described(
            "Heat-transfer coefficient to a shelf or tray the product touches. Default unit "
            "W/(m2*K); >= 0."
        ),
    )
    contact_area: QuantityInput = Field(
        0.0, description=_described("Product area touching the shelf. Default unit m2; >= 0.")
    )
    shelf_temperature: QuantityInput | None = Field(
        None,
        description=_described("Default unit K; omitted means the chamber temperature."),
    )


class ScheduleLimitInput(ApiModel):
    """The product at or below `temperature` by `time`."""

    time: QuantityInput = Field(
        description=_described('Time from the start of pumping. Default unit s (`"30 min"`).')
    )
    temperature: QuantityInput = Field(description=_described("Limit. Default unit K."))


class VacuumChamberSimulationCreate(RecordLabels):
    """A vacuum chamber with pump, optional condenser and a product, simulated over time."""

    chamber: ChamberInput = Field(
        description="The chamber: free volume, initial air pressure and temperature, air leak."
    )
    pump: PumpInput = Field(
        description="The vacuum pump: nominal volume flow, optional speed curve, ultimate pressure."
    )
    product: ProductInput = Field(
        description="The load: mass, initial temperature, specific heat or composition, solute, "
        "evaporation model."
    )
    condenser: CondenserInput | None = Field(None, description="Omit for none.")
    companions: list[CompanionInput] = Field(
        default_factory=list,
        max_length=20,
        description="Masses at the product temperature (racks, trays; single values only).",
    )
    heat_gain: HeatGainRateInput | None = Field(
        None, description="Heat gained by the product; adiabatic if omitted."
    )
    end_time: QuantityInput = Field(
        description=_described('Simulated time at most. Default unit s (`"2 h"`); up to 30 days.')
    )
    target_temperature: QuantityInput | None = Field(
        None,
        description=_described(
            "Stop when the product reaches it. Default unit K; below the initial temperature, "
            "at least 173.15 K."
        ),
    )
    schedule: list[ScheduleLimitInput] = Field(
        default_factory=list, max_length=100, description="Cooling schedule to check."
    )
    series_points: int = Field(
        200, ge=10, le=5000, description="Points of the time series (plus one per event)."
    )
    output_units: UnitSet = Field(UnitSet.SI, description=_OUTPUT_UNITS)


# -- outputs ---------------------------------------------------------------------------------


class ChamberStatesOut(ApiModel):
    """Chamber and product states: `values` along the series, `value` at an event."""

    time: QuantityOutput = Field(description="From the start of pumping (SI: s).")
    total_pressure: QuantityOutput = Field(description="Chamber pressure (SI: Pa).")
    air_pressure: QuantityOutput = Field(description="Air partial pressure (SI: Pa).")
    vapor_pressure: QuantityOutput = Field(description="Vapor partial pressure (SI: Pa).")
    product_temperature: QuantityOutput = Field(
        description="The product's one temperature, or its volume mean with "
        "`product.interior` (SI: K)."
    )
    product_vapor_pressure: QuantityOutput = Field(
        description="Equilibrium vapor pressure over the product (SI: Pa)."
    )
    evaporated_mass: QuantityOutput = Field(description="Water the product lost (SI: kg).")
    ice_fraction: QuantityOutput = Field(description="Ice mass / initial water mass (unit 1).")
    evaporation_rate: QuantityOutput = Field(
        description="Vapor leaving the product, negative when condensing onto it (SI: kg/s)."
    )
    pump_volume_flow: QuantityOutput = Field(
        description="Effective pumping speed S_eff(p) (SI: m3/s)."
    )
    vapor_mass_flow_to_pump: QuantityOutput = Field(description="(SI: kg/s).")
    vapor_volume_flow_to_pump: QuantityOutput = Field(
        description="The vapor's share of the volume flow at chamber pressure (SI: m3/s)."
    )
    vapor_mass_flow_to_condenser: QuantityOutput = Field(description="(SI: kg/s).")
    vapor_volume_flow_to_condenser: QuantityOutput = Field(
        description="Captured vapor as volume at chamber pressure (SI: m3/s)."
    )
    condenser_load: QuantityOutput = Field(description="Heat the condenser removes (SI: W).")
    condenser_ice: QuantityOutput = Field(description="Ice on the condenser (SI: kg).")
    heat_gain_rate: QuantityOutput = Field(description="Heat into the product (SI: W).")
    core_temperature: QuantityOutput | None = Field(
        None,
        description="At the centre of the product's items, with `product.interior`; omitted "
        "without (SI: K).",
    )
    surface_temperature: QuantityOutput | None = Field(
        None,
        description="At the surface of the product's items, with `product.interior`; omitted "
        "without (SI: K).",
    )
    air_flux_ratio: QuantityOutput | None = Field(
        None,
        description="Kinetic evaporation only: the evaporation flux with the air's resistance "
        "over the surface (kinetic) flux alone; below 0.5 the diffusion of vapor through the "
        "air governs. Omitted in the equilibrium mode and in event states (dimensionless).",
    )


class SimulationEventOut(ApiModel):
    """Something that happened, when, and the state then."""

    name: str = Field(
        description="`flash-point`, `boiling-stops`, `boiling-resumes`, `freezing-starts`, "
        "`fully-frozen`, `target-reached`, `end-time`, `condenser-capacity-exceeded`, "
        "`schedule-limit-missed`, `model-range-left` or `water-exhausted`."
    )
    time: QuantityOutput = Field(description="(SI: s).")
    detail: str = Field(description="What happened, in words.")
    state: ChamberStatesOut = Field(description="The chamber and product at that moment.")


class ScheduleCheckOut(ApiModel):
    """One schedule limit and whether the product met it."""

    time: QuantityOutput = Field(description="Time of the limit, from the pump start (SI: s).")
    temperature_limit: QuantityOutput = Field(
        description="Highest product temperature the schedule allows at `time` (SI: K)."
    )
    product_temperature: QuantityOutput | None = Field(
        description="At `time`, where `applies_to` says; null when the simulation ended "
        "before (not evaluated)."
    )
    met: bool | None = Field(description="Null when not evaluated.")
    applies_to: Literal["core", "mean", "surface"] = Field(
        "mean",
        description="Where the temperature is read: `product.interior.target_applies_to`, "
        "or `mean` for the one temperature of the uniform product.",
    )


class SimulationSummaryOut(ApiModel):
    """Headline numbers."""

    end_reason: str = Field(
        description="`end-time`, `target-reached`, `model-range-left` or `water-exhausted`."
    )
    end_time: QuantityOutput = Field(
        description="When the simulation ended, from the pump start (SI: s)."
    )
    flash_time: QuantityOutput | None = Field(description="Null when not reached.")
    freezing_start_time: QuantityOutput | None = Field(
        description="When freezing started (SI: s); null when not reached."
    )
    fully_frozen_time: QuantityOutput | None = Field(
        description="When the product was fully frozen (SI: s); null when not reached."
    )
    target_time: QuantityOutput | None = Field(
        description="When the cooling target was reached (SI: s); null without a target or when "
        "not reached."
    )
    final_temperature: QuantityOutput = Field(
        description="The product's one temperature at the end, or its volume mean with "
        "`product.interior` (SI: K)."
    )
    final_pressure: QuantityOutput = Field(description="Chamber pressure at the end (SI: Pa).")
    evaporated_mass: QuantityOutput = Field(
        description="Water evaporated from the product (SI: kg)."
    )
    evaporated_fraction_of_water: QuantityOutput = Field(
        description="Of the initial water (unit 1)."
    )
    ice_mass: QuantityOutput = Field(description="Ice in the product at the end (SI: kg).")
    vapor_to_pump: QuantityOutput = Field(description="Water vapor taken by the pump (SI: kg).")
    vapor_to_condenser: QuantityOutput = Field(
        description="Water vapor captured by the condenser (SI: kg)."
    )
    condenser_energy: QuantityOutput = Field(
        description="Heat the condenser removed over the run (SI: J)."
    )
    peak_condenser_load: QuantityOutput = Field(description="Over the series points.")
    peak_vapor_mass_flow_to_pump: QuantityOutput = Field(description="Over the series points.")
    peak_evaporation_rate: QuantityOutput = Field(description="Over the series points.")
    schedule_met: bool | None = Field(description="Null without a schedule.")
    solver_steps: int = Field(description="Steps the time integration took.")
    right_hand_side_evaluations: int = Field(
        description="Evaluations of the model's rate equations."
    )
    final_core_temperature: QuantityOutput | None = Field(
        None, description="At the centre, with `product.interior`; null without (SI: K)."
    )
    final_surface_temperature: QuantityOutput | None = Field(
        None, description="At the surface, with `product.interior`; null without (SI: K)."
    )
    target_applies_to: Literal["core", "mean", "surface"] = Field(
        "mean",
        description="Where the target and schedule were read (`mean` for the uniform "
        "product's one temperature).",
    )


class MassEnergyBalanceOut(ApiModel):
    """Closure of water mass and product energy (the integration's bookkeeping)."""

    initial_water: QuantityOutput = Field(
        description="Water (liquid and ice) in the product at the start (SI: kg)."
    )
    final_water: QuantityOutput = Field(
        description="Water (liquid and ice) in the product at the end (SI: kg)."
    )
    initial_chamber_vapor: QuantityOutput = Field(
        description="Water vapor in the chamber at the start (SI: kg)."
    )
    final_chamber_vapor: QuantityOutput = Field(
        description="Water vapor in the chamber at the end (SI: kg)."
    )
    vapor_to_pump: QuantityOutput = Field(description="Water vapor taken by the pump (SI: kg).")
    vapor_to_condenser: QuantityOutput = Field(
        description="Water vapor captured by the condenser (SI: kg)."
    )
    mass_residual: QuantityOutput = Field(
        description="initial_water + initial_chamber_vapor - final_water - final_chamber_vapor - "
        "vapor_to_pump - vapor_to_condenser: the integration error (SI: kg)."
    )
    relative_mass_residual: QuantityOutput = Field(
        description="mass_residual / initial_water (unit 1)."
    )
    initial_energy: QuantityOutput = Field(
        description="Energy of the product at the start, IAPWS reference (SI: J)."
    )
    final_energy: QuantityOutput = Field(
        description="Energy of the product at the end, same reference (SI: J)."
    )
    vapor_enthalpy: QuantityOutput = Field(
        description="Enthalpy carried by the vapor leaving the product."
    )
    heat_gained: QuantityOutput = Field(
        description="Heat gained by the product from the surroundings (SI: J)."
    )
    energy_residual: QuantityOutput = Field(
        description="initial_energy + heat_gained - final_energy - vapor_enthalpy: the "
        "integration error (SI: J)."
    )
    relative_energy_residual: QuantityOutput = Field(
        description="energy_residual / vapor_enthalpy (unit 1)."
    )


class EquipmentChecksOut(ApiModel):
    """What the pump and the trap must handle, read on the series points."""

    peak_pump_inlet_volume_flow: QuantityOutput = Field(
        description="Largest gas volume flow (air and vapor) into the pump, S_eff(p), at the "
        "chamber pressure and temperature (SI: m3/s; engineering: m3/h)."
    )
    peak_pump_inlet_pressure: QuantityOutput = Field(description="Chamber pressure then.")
    end_pump_inlet_volume_flow: QuantityOutput = Field(
        description="The same at the end of the run."
    )
    end_pump_inlet_pressure: QuantityOutput = Field(
        description="Chamber pressure at the end of the run (SI: Pa)."
    )
    pump_vapor_mass: QuantityOutput = Field(
        description="Water vapor the pump itself takes, not captured by the trap (SI: kg)."
    )
    peak_pump_vapor_mass_flow: QuantityOutput = Field(description="(SI: kg/s).")
    pump_water_vapor_tolerance: QuantityOutput | None = Field(
        description="As stated in `pump.water_vapor_tolerance`; null without."
    )
    time_above_water_vapor_tolerance: QuantityOutput | None = Field(
        description="Time the vapor mass flow into the pump exceeds that tolerance (SI: s)."
    )
    water_vapor_tolerance_exceeded: bool | None = Field(
        description="Whether the vapor mass flow into the pump exceeded "
        "`pump.water_vapor_tolerance`; null without one."
    )
    peak_trap_load: QuantityOutput | None = Field(
        description="Largest refrigeration load of the trap (SI: W); null without a trap."
    )
    peak_trap_load_time: QuantityOutput | None = Field(
        description="When the trap's load peaked (SI: s); null without a trap."
    )
    trap_refrigeration_capacity: QuantityOutput | None = Field(description="As stated.")
    trap_ice: QuantityOutput | None = Field(description="Ice collected on the trap (SI: kg).")
    trap_ice_capacity: QuantityOutput | None = Field(description="As stated.")
    trap_ice_capacity_used: QuantityOutput | None = Field(
        description="trap_ice / trap_ice_capacity (unit 1)."
    )
    trap_ice_capacity_exceeded: bool | None = Field(
        description="Whether the ice on the trap exceeded its stated capacity; null without one."
    )
    trap_limited_time: QuantityOutput | None = Field(
        description="Time the trap's capture ran at its refrigeration capacity, so that the "
        "trap, not the pump, limited the vapor removal (SI: s); 0 without a stated capacity, "
        "null without a trap."
    )


class VacuumChamberSimulationPublic(Envelope):
    """Events, time series, summary and balances of one simulation."""

    summary: SimulationSummaryOut = Field(description="Headline numbers of the run.")
    events: list[SimulationEventOut] = Field(
        description="What happened during the run, in time order."
    )
    series: ChamberStatesOut = Field(description="The chamber and product over time.")
    schedule: list[ScheduleCheckOut] = Field(
        description="Each schedule limit and whether it was met; empty without a schedule."
    )
    balance: MassEnergyBalanceOut = Field(
        description="Water mass and product energy books, with their residuals."
    )
    checks: EquipmentChecksOut = Field(description="Equipment checks of the run.")
    model_references: list[str] = Field(description="Published basis of the model.")


class VacuumChamberSweepPublic(Envelope):
    """A sweep: the summary and checks of every case as `values`, in the order of the
    request's arrays."""

    cases: int = Field(description="Number of cases.")
    swept: list[str] = Field(description="Dotted paths of the inputs given as arrays.")
    inputs: dict[str, QuantityOutput] = Field(
        description="The swept case fields, per case (those with a scalar path)."
    )
    summary: dict[str, QuantityOutput | list[Any]] = Field(
        description="Each summary field as `{values, unit}` (null where the event did not "
        "happen), or a list for `end_reason`, `schedule_met`, `solver_steps`, "
        "`right_hand_side_evaluations`."
    )
    checks: dict[str, QuantityOutput | list[Any]] = Field(
        description="Each equipment check as `{values, unit}`, or a list of true/false/null."
    )
    model_references: list[str] = Field(description="Published basis of the model.")
