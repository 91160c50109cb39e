"""Request/response pairs of the balances: flash-to-freeze and evaporative (vacuum) cooling.

Sweeps. Any numeric input may be an array (`{"values": [...], "unit": ...}` or a list);
arrays must have equal lengths (a single value repeats). Results then come back as
`values` in input order: top-level results, every stage field, the comparison, the
energy balance and the uncertainties. `trajectory` is always a list with one entry per
case (a single case gives a list of one).
"""

from __future__ import annotations

from typing import Literal

from pydantic import ConfigDict, Field

from service.api.http.alternatives import exactly_one_of, refused_shapes
from service.api.http.models import ApiModel, Envelope, QuantityInput, QuantityOutput
from service.api.http.record_labels import RecordLabels
from service.api.http.units import UnitSet
from service.core.balances import FreezingPointBasis

__all__ = [
    "CompanionInput",
    "CompositionInput",
    "DissolvedSolidsInput",
    "EvaporativeComparisonOut",
    "EvaporativeCoolingCreate",
    "EvaporativeCoolingPublic",
    "EvaporativeEnergyBalanceOut",
    "EvaporativeUncertaintyOut",
    "FlashFreezeComparisonOut",
    "FlashFreezeCreate",
    "FlashFreezeEnergyBalanceOut",
    "FlashFreezePublic",
    "FlashFreezeUncertaintyOut",
    "FreezingPointBasis",
    "HeatGainInput",
    "Method",
    "SoluteInput",
    "StageOut",
    "TrajectoryOut",
    "UncertainInputOut",
]

Method = Literal["integrated", "mean-vapor-enthalpy"]

_ANY_SHAPE = (
    'A number in the default unit, a string with a unit (`"60 degC"`), `{"value", "unit", '
    '"uncertainty"}` (standard uncertainty, propagated to the results), or `{"values": [...], '
    '"unit"}` / a list to sweep.'
)
_OUTPUT_UNITS = (
    "Unit set of the results: `SI` (K, Pa, kg, J, m3, kg/s, m3/s), `engineering` (degC, kPa, "
    "kg, kJ, m3, kg/h, m3/h) or `US` (degF, psi absolute, lb, Btu, ft3, lb/h, ft3/min)."
)
_MAX_COMPANIONS = 20


def _described(text: str) -> str:
    return f"{text} {_ANY_SHAPE}"


# -- inputs shared by both balances ------------------------------------------------------


class CompanionInput(ApiModel):
    """A mass that cools with the load without evaporating (vessel, tray, rack, inert
    solids): give `specific_heat` or a named `material`, not both."""

    model_config = ConfigDict(
        json_schema_extra=refused_shapes(exactly_one_of("specific_heat", "material"))
    )

    mass: QuantityInput = Field(description=_described("Mass. Default unit kg; >= 0."))
    specific_heat: QuantityInput | None = Field(
        None,
        description=_described(
            "Specific heat, constant over the process. Default unit J/(kg*K); 0 to 100000."
        ),
    )
    material: str | None = Field(
        None,
        description="A named material instead of `specific_heat`: `stainless steel`, "
        "`aluminium`, `copper`, `glass (borosilicate)` or `HDPE` (near-room-temperature "
        "specific heats; their sources are in the assumptions).",
    )
    name: str | None = Field(None, max_length=80, description="Label, e.g. `tray`.")


class HeatGainInput(ApiModel):
    """Heat the load gains from its surroundings: `energy`, or `power` and `duration`."""

    energy: QuantityInput | None = Field(
        None, description=_described("Total heat gained. Default unit J; >= 0.")
    )
    power: QuantityInput | None = Field(
        None, description=_described("Constant heat flow in, with `duration`. Default unit W.")
    )
    duration: QuantityInput | None = Field(
        None, description=_described("Time the `power` flows. Default unit s.")
    )


# -- flash-freeze --------------------------------------------------------------------------


class SoluteInput(ApiModel):
    """A dissolved solute: `mass_fraction` with a named solute (`name`, its published
    non-ideal water-activity model by default), or with its `molar_mass` (and optionally
    `van_t_hoff_factor`, `specific_heat`: an ideal Raoult solution). The solution freezes
    progressively (a_w p_liquid(T) = p_ice(T))."""

    mass_fraction: QuantityInput = Field(
        description=_described(
            "Solute mass / (water + solute mass) of the initial load. Default unit 1 "
            '(a fraction; `"10 %"` works); above 0, at most 0.5.'
        )
    )
    name: str | None = Field(
        None,
        description="A named solute: `sodium chloride` (Pitzer model, to the eutectic "
        "w = 0.233), `sucrose` (Norrish, to 0.5), `glucose`, `fructose` (Norrish, to 0.3), "
        "`glycerol` (Norrish, to 0.4), `propylene glycol` (Norrish, to 0.3), `ethanol` "
        "(Melinder's freezing line, to 0.5; its own vapor not counted) or `seawater` "
        "(IAPWS R13-08 water activity; `mass_fraction` is the absolute salinity, to 0.12, "
        'e.g. `"35 g/kg"`): molar mass, specific heat and activity model from the table. '
        "Omit to give `molar_mass`.",
    )
    model: Literal["non-ideal", "ideal"] = Field(
        "non-ideal",
        description="With `name`: `non-ideal` (the solute's published activity model, "
        "default) or `ideal` (Raoult's law with its van 't Hoff factor, 2 for sodium "
        "chloride).",
    )
    molar_mass: QuantityInput | None = Field(
        None,
        description=_described(
            "Effective molar mass of the solute (required without `name`). Default unit "
            'kg/mol (`"342.3 g/mol"` works); >= 0.001 kg/mol.'
        ),
    )
    van_t_hoff_factor: QuantityInput | None = Field(
        None,
        description=_described(
            "Particles per dissolved formula unit (without `name`; default 1). Default "
            "unit 1; 1 to 10."
        ),
    )
    specific_heat: QuantityInput | None = Field(
        None,
        description=_described(
            "Solute specific heat (default: the named solute's, else 1250 J/(kg*K)). "
            "Default unit J/(kg*K); 0 to 100000."
        ),
    )


class FlashFreezeCreate(RecordLabels):
    """Water (or a watery load) at an initial temperature in a chamber whose vapor is
    removed as it forms: it cools by its own evaporation, freezes, and, with
    `final_ice_temperature`, the ice keeps cooling by sublimation."""

    initial_temperature: QuantityInput = Field(
        description=_described(
            "Initial temperature of the load. Default unit K; from its freezing onset "
            "(273.16 K for pure water) to 373.15 K."
        )
    )
    water_mass: QuantityInput = Field(
        1.0,
        description=_described(
            "Initial liquid water mass (a solute comes on top). Default unit kg; > 0; default 1 kg."
        ),
    )
    final_ice_temperature: QuantityInput | None = Field(
        None,
        description=_described(
            "Pure water: after all is frozen, the ice cools by sublimation down to this "
            "(173.15 K to 273.16 K). With a solute: end temperature of the progressive "
            "freezing (required; 235 K, or the end of a named solute's model range, to "
            "below the freezing onset). Default unit K."
        ),
    )
    method: Method = Field(
        "integrated",
        description="Headline answer: `integrated` (the first law integrated with properties "
        "along the path) or `mean-vapor-enthalpy` (the hand method: one vapor enthalpy per "
        "stage at its mean temperature). Both are always in `comparison`.",
    )
    companions: list[CompanionInput] = Field(
        default_factory=list,
        max_length=_MAX_COMPANIONS,
        description="Masses that cool with the water (vessel, tray, inert solids).",
    )
    heat_gain: HeatGainInput | None = Field(
        None, description="Heat gained from the surroundings; adiabatic if omitted."
    )
    solute: SoluteInput | None = Field(None, description="Dissolved solute, if any.")
    nucleation_temperature: QuantityInput | None = Field(
        None,
        description=_described(
            "Supercooling: the liquid cools to this temperature before ice nucleates, then "
            "an ice fraction forms at once. Default unit K; 235 K to below the freezing "
            "onset."
        ),
    )
    trap_temperature: QuantityInput | None = Field(
        None,
        description=_described(
            "Condenser / cold-trap temperature, for its load. Default unit K; 173.15 K to 273.16 K."
        ),
    )
    trajectory_points: int = Field(
        64,
        ge=50,
        le=2000,
        description="Points in the trajectory (plus one per recalescence), 50 to 2000.",
    )
    composition: CompositionInput | None = Field(
        None,
        description="A food by its proximate composition instead of water and a solute, by "
        "the ice-fraction lookup's food model (Schwartzberg: water less 0.4 kg per kg of "
        "protein evaporates and freezes as an ideal solution of one effective solute sized "
        "by the initial freezing point; the bound water stays liquid; the other components "
        "take the Choi and Okos specific heats). Needs `product_mass` and "
        "`final_ice_temperature`; `water_mass` and `solute` are not taken. The result's "
        "masses are of the freezable water.",
    )
    product_mass: QuantityInput | None = Field(
        None,
        description=_described("With `composition`: mass of the food. Default unit kg; > 0."),
    )
    freezing_point: QuantityInput | None = Field(
        None,
        description=_described(
            "With `composition`: the food's initial freezing point at 101325 Pa (measured, "
            "or from a handbook table). Default unit K; 253.15 K to 273.16 K. Omitted: "
            "estimated from `composition.dissolved_solutes`, else from the composition "
            "alone (Pham 1996), with a warning."
        ),
    )
    output_units: UnitSet = Field(UnitSet.SI, description=_OUTPUT_UNITS)


class StageOut(ApiModel):
    """One stage of the path, with its temperature and pressure span."""

    name: str = Field(
        description="`cooling`, `supercooled cooling`, `recalescence`, `freezing` or `ice cooling`."
    )
    start_temperature: QuantityOutput = Field(
        description="Temperature at the start of the stage (SI: K)."
    )
    end_temperature: QuantityOutput = Field(
        description="Temperature at the end of the stage (SI: K)."
    )
    start_pressure: QuantityOutput = Field(
        description="Equilibrium vapor pressure at the stage's start (SI: Pa)."
    )
    end_pressure: QuantityOutput = Field(
        description="Equilibrium vapor pressure at the stage's end (SI: Pa)."
    )
    evaporated_mass: QuantityOutput = Field(description="Vapor removed in the stage (SI: kg).")
    heat_removed: QuantityOutput = Field(
        description="Heat the vapor carries off from the load, integral of "
        "(h_vapor - h_condensed) dm (SI: J)."
    )
    vapor_enthalpy: QuantityOutput = Field(
        description="Enthalpy of the removed vapor, integral of h_vapor dm, IAPWS reference "
        "(SI: J)."
    )
    vapor_volume: QuantityOutput = Field(
        description="Volume the removed vapor occupies at the stage's equilibrium states, "
        "integral of dm / rho_vapor (SI: m3; pump sizing)."
    )
    ice_formed: QuantityOutput = Field(description="Ice formed in the stage (SI: kg).")
    heat_gained: QuantityOutput = Field(description="Heat gained in the stage (SI: J).")


class TrajectoryOut(ApiModel):
    """The path of one case (integrated method), point by point."""

    temperature: QuantityOutput = Field(
        description="Temperature of the load at each point (SI: K)."
    )
    pressure: QuantityOutput = Field(description="Equilibrium vapor pressure (SI: Pa).")
    evaporated_fraction_of_water: QuantityOutput = Field(
        description="Mass evaporated so far / initial water mass (unit 1)."
    )
    ice_fraction: QuantityOutput = Field(description="Ice mass / initial water mass (unit 1).")
    liquid_fraction: QuantityOutput = Field(
        description="Liquid water mass / initial water mass (unit 1)."
    )
    stage: list[int] = Field(description="Index into `stages` of each point's stage.")


class EvaporativeComparisonOut(ApiModel):
    """The integrated and hand (mean vapor enthalpy) answers side by side."""

    integrated_evaporated_mass: QuantityOutput = Field(
        description="Evaporated mass of the balance integrated along the path (SI: kg)."
    )
    mean_vapor_enthalpy_evaporated_mass: QuantityOutput = Field(
        description="Evaporated mass of the hand method: heat over one mean latent heat (SI: kg)."
    )
    evaporated_mass_difference: QuantityOutput = Field(
        description="Hand minus integrated evaporated mass."
    )
    relative_difference: QuantityOutput = Field(
        description="(hand - integrated) / integrated evaporated mass (unit 1)."
    )


class FlashFreezeComparisonOut(EvaporativeComparisonOut):
    """The integrated and hand (mean vapor enthalpy) answers side by side, ice included."""

    integrated_ice_mass: QuantityOutput = Field(
        description="Ice at the end, integrated method (SI: kg)."
    )
    mean_vapor_enthalpy_ice_mass: QuantityOutput = Field(
        description="Ice at the end, hand method (SI: kg)."
    )


class FlashFreezeEnergyBalanceOut(ApiModel):
    """Energy books of the condensed contents (integrated method): initial_energy +
    heat_gained = final_energy + vapor_enthalpy + boundary_work + residual."""

    initial_energy: QuantityOutput = Field(
        description="Internal energy of water, ice, solute and companions at the start "
        "(IAPWS reference; companions and solute as c (T - 273.16 K))."
    )
    final_energy: QuantityOutput = Field(
        description="Internal energy of the condensed contents at the end, same reference as "
        "`initial_energy` (SI: J)."
    )
    vapor_enthalpy: QuantityOutput = Field(
        description="Enthalpy carried off by the removed vapor, integral of h_vapor dm (SI: J)."
    )
    heat_gained: QuantityOutput = Field(description="Heat gained from the surroundings (SI: J).")
    boundary_work: QuantityOutput = Field(description="Integral of p dV against the vapor.")
    residual: QuantityOutput = Field(description="What is left: the integration error.")
    relative_residual: QuantityOutput = Field(description="residual / vapor_enthalpy (unit 1).")


class UncertainInputOut(ApiModel):
    """An input given with a standard uncertainty, and what it adds to the evaporated mass."""

    field: str = Field(description="Input path, e.g. `initial_temperature`, `companions[0].mass`.")
    standard_uncertainty: QuantityOutput = Field(
        description="As given, in the output unit set (temperatures as differences)."
    )
    evaporated_mass_contribution: QuantityOutput = Field(
        description="|sensitivity| x standard uncertainty of the evaporated mass from this input."
    )


class FlashFreezeUncertaintyOut(ApiModel):
    """Standard uncertainty (k = 1) of the main results propagated from the inputs'."""

    method: str = Field(description="How the input uncertainties were propagated.")
    inputs: list[UncertainInputOut] = Field(
        description="Each input given with an uncertainty, and what it contributes."
    )
    evaporated_mass: QuantityOutput = Field(
        description="Standard uncertainty of the evaporated mass (SI: kg)."
    )
    evaporated_fraction_of_water: QuantityOutput = Field(
        description="Standard uncertainty of the evaporated fraction of the water (unit 1)."
    )
    ice_mass: QuantityOutput = Field(description="Standard uncertainty of the ice mass (SI: kg).")
    final_temperature: QuantityOutput = Field(description="A temperature difference.")


class FlashFreezePublic(Envelope):
    """Flash-to-freeze balance. `uncertainty` (envelope) lists the formulations' own
    statements used and the evaporated mass's standard uncertainty derived from them;
    `input_uncertainty` is what the inputs' stated uncertainties add."""

    method: Method = Field(description="The headline method of the top-level results.")
    evaporated_mass: QuantityOutput = Field(description="Vapor removed in all (SI: kg).")
    evaporated_fraction_of_water: QuantityOutput = Field(
        description="evaporated_mass / initial water mass (unit 1)."
    )
    ice_mass: QuantityOutput = Field(description="Ice at the end (SI: kg).")
    liquid_mass: QuantityOutput = Field(
        description="Liquid water left at the end: unfrozen water of a solution, 0 for pure "
        "water (SI: kg)."
    )
    final_temperature: QuantityOutput = Field(
        description="Temperature of the load at the end (SI: K)."
    )
    final_pressure: QuantityOutput = Field(
        description="Equilibrium vapor pressure at the end (SI: Pa)."
    )
    vapor_volume: QuantityOutput = Field(description="Sum of the stages' vapor volumes (SI: m3).")
    heat_gained: QuantityOutput = Field(description="(SI: J).")
    trap_temperature: QuantityOutput | None = Field(None, description="As given; null without.")
    condenser_load: QuantityOutput | None = Field(
        None,
        description="Heat the trap removes to take all the vapor, as it leaves the load, to ice "
        "at the trap temperature (SI: J); null without `trap_temperature`.",
    )
    stages: list[StageOut] = Field(description="In order, of the headline method.")
    trajectory: list[TrajectoryOut] = Field(
        description="One per case in input order (a single case: a list of one); integrated method."
    )
    comparison: FlashFreezeComparisonOut = Field(
        description="The integrated and the hand answer side by side, ice included."
    )
    energy_balance: FlashFreezeEnergyBalanceOut = Field(
        description="The energy books of the condensed contents, with their residual."
    )
    input_uncertainty: FlashFreezeUncertaintyOut | None = Field(
        None, description="Null when no input carries an `uncertainty`."
    )


# -- evaporative cooling -------------------------------------------------------------------


class CompositionInput(ApiModel):
    """Proximate composition, mass fractions summing to 1 (within 0.02, then rescaled with a
    warning). Non-water components take the Choi and Okos (1986) specific heats."""

    water: QuantityInput = Field(description=_described("Water mass fraction, 0 to 1 (unit 1)."))
    protein: QuantityInput = Field(0.0, description=_described("Protein, 0 to 1 (unit 1)."))
    fat: QuantityInput = Field(0.0, description=_described("Fat, 0 to 1 (unit 1)."))
    carbohydrate: QuantityInput = Field(
        0.0, description=_described("Carbohydrate without fiber, 0 to 1 (unit 1).")
    )
    fiber: QuantityInput = Field(0.0, description=_described("Fiber, 0 to 1 (unit 1)."))
    ash: QuantityInput = Field(0.0, description=_described("Ash, 0 to 1 (unit 1)."))
    dissolved_solutes: dict[str, QuantityInput] | None = Field(
        None,
        max_length=4,
        description=(
            "Solutes dissolved in the food's water, kg per kg of FOOD (part of the fractions "
            "above, adding no mass: `sucrose`, `glucose`, `fructose` of the `carbohydrate`, "
            '`sodium chloride` of the `ash`), e.g. `{"fructose": 0.059, "glucose": 0.024}`. '
            "Default none. Without a given `freezing_point`, the food's initial freezing "
            "point is estimated from them (Ross's rule over each solute's published model, "
            "in the water not bound by protein); with none named, from the composition alone "
            '(Pham 1996). Values in unit 1 (`"0.5 %"` works); single values.'
        ),
    )


class DissolvedSolidsInput(ApiModel):
    """Solids dissolved in the product's water (sugars, salts, acids) as one effective
    solute, to estimate its initial freezing point: `mass_fraction` with a named solute
    (`name`), or with its `molar_mass` (and optionally `van_t_hoff_factor`). Unlike the
    flash-freeze `solute`, `mass_fraction` is per kg of PRODUCT; the solids are part of the
    composition's non-water fractions (sugars in carbohydrate, salts in ash) and add no mass
    or heat capacity. Needs `composition` (its water fraction is the water they are
    dissolved in)."""

    mass_fraction: QuantityInput = Field(
        description=_described(
            "Dissolved solids per kg of product (not per kg of solution). Default unit 1 (a "
            'fraction; `"5 %"` works); >= 0, and water fraction + this <= 1; at most what '
            "puts the estimated freezing point at 235 K."
        )
    )
    name: str | None = Field(
        None,
        description="A named solute: `sucrose`, `glucose` or `sodium chloride` (molar mass "
        "and van 't Hoff factor from the table; fructose, with glucose's molar mass, can be "
        "given as `glucose`). Omit to give `molar_mass`.",
    )
    molar_mass: QuantityInput | None = Field(
        None,
        description=_described(
            "Effective molar mass of the dissolved solids (required without `name`). Default "
            'unit kg/mol (`"180 g/mol"` works); >= 0.001 kg/mol.'
        ),
    )
    van_t_hoff_factor: QuantityInput | None = Field(
        None,
        description=_described(
            "Particles per dissolved formula unit (without `name`; default 1). Default "
            "unit 1; 1 to 10."
        ),
    )


class EvaporativeCoolingCreate(RecordLabels):
    """A moist product cooled under vacuum from one temperature to another by its own
    evaporation. Give `specific_heat` or `composition`, not both."""

    model_config = ConfigDict(
        json_schema_extra=refused_shapes(exactly_one_of("specific_heat", "composition"))
    )

    product_mass: QuantityInput = Field(
        description=_described("Initial product mass. Default unit kg; > 0.")
    )
    initial_temperature: QuantityInput = Field(
        description=_described(
            "Initial product temperature. Default unit K; from the freezing point to 373.15 K."
        )
    )
    final_temperature: QuantityInput = Field(
        description=_described(
            "Target temperature. Default unit K; below the initial temperature and at or "
            "above the product's freezing point (below it: use /v1/balances/flash-freeze)."
        )
    )
    specific_heat: QuantityInput | None = Field(
        None,
        description=_described(
            "Lumped product specific heat, per kg of current product mass. Default unit "
            "J/(kg*K); above 0, at most 10000."
        ),
    )
    composition: CompositionInput | None = Field(
        None, description="Composition instead of `specific_heat`."
    )
    companions: list[CompanionInput] = Field(
        default_factory=list,
        max_length=_MAX_COMPANIONS,
        description="Masses that cool with the product (racks, crates, trays).",
    )
    heat_gain: HeatGainInput | None = Field(
        None, description="Heat gained from the surroundings; adiabatic if omitted."
    )
    freezing_point: QuantityInput | None = Field(
        None,
        description=_described(
            "Product's initial freezing point. Default unit K; 235 K to 273.16 K. If "
            "omitted, it is estimated from `dissolved_solids` (with `composition`) or from "
            "`composition.dissolved_solutes`; with neither, pure water's 273.16 K is used, "
            "with a warning (the composition alone is not used for this range check)."
        ),
    )
    dissolved_solids: DissolvedSolidsInput | None = Field(
        None,
        description="Solids dissolved in the product's water, to estimate its initial "
        "freezing point when `freezing_point` is omitted (ideal solution, ice-solution "
        "equilibrium from the IAPWS Gibbs energies). Needs `composition`.",
    )
    trap_temperature: QuantityInput | None = Field(
        None,
        description=_described(
            "Condenser / cold-trap temperature, for its load. Default unit K; 173.15 K to 273.16 K."
        ),
    )
    cooling_time: QuantityInput | None = Field(
        None,
        description=_described(
            "Duration of the cooling, for the mean vapor mass and volume flows. Default "
            "unit s; > 0."
        ),
    )
    output_units: UnitSet = Field(UnitSet.SI, description=_OUTPUT_UNITS)


class EvaporativeEnergyBalanceOut(ApiModel):
    """sensible_heat_released + heat_gained = heat_removed + residual."""

    sensible_heat_released: QuantityOutput = Field(
        description="Sensible heat given up by product and companions."
    )
    heat_gained: QuantityOutput = Field(
        description="Heat gained from the surroundings during the cooling (SI: J)."
    )
    heat_removed: QuantityOutput = Field(description="Latent heat carried off by the vapor.")
    vapor_enthalpy: QuantityOutput = Field(
        description="Enthalpy of the removed vapor, integral of h_vapor dm, IAPWS reference."
    )
    residual: QuantityOutput = Field(description="The integration error.")
    relative_residual: QuantityOutput = Field(description="residual / heat_removed (unit 1).")


class EvaporativeUncertaintyOut(ApiModel):
    """Standard uncertainty (k = 1) of the main results propagated from the inputs'."""

    method: str = Field(description="How the input uncertainties were propagated.")
    inputs: list[UncertainInputOut] = Field(
        description="Each input given with an uncertainty, and what it contributes."
    )
    evaporated_mass: QuantityOutput = Field(
        description="Standard uncertainty of the evaporated mass (SI: kg)."
    )
    evaporated_fraction_of_product: QuantityOutput = Field(
        description="Standard uncertainty of the evaporated fraction of the product (unit 1)."
    )
    heat_removed: QuantityOutput = Field(
        description="Standard uncertainty of the heat removed (SI: J)."
    )
    final_pressure: QuantityOutput = Field(
        description="Standard uncertainty of the final pressure (SI: Pa)."
    )


class EvaporativeCoolingPublic(Envelope):
    """Evaporative (vacuum) cooling balance."""

    evaporated_mass: QuantityOutput = Field(description="Water evaporated (SI: kg).")
    evaporated_fraction_of_product: QuantityOutput = Field(
        description="evaporated_mass / initial product mass (unit 1)."
    )
    prewetting_water_mass: QuantityOutput = Field(
        description="Water to add beforehand so the product ends at its initial mass (SI: kg)."
    )
    start_pressure: QuantityOutput = Field(
        description="Saturation pressure at the initial temperature: flashing starts when the "
        "chamber reaches it (SI: Pa)."
    )
    final_pressure: QuantityOutput = Field(
        description="Saturation pressure at the final temperature: the set point (SI: Pa)."
    )
    heat_removed: QuantityOutput = Field(
        description="Heat carried off by the vapor, integral of (h_vapor - h_liquid) dm (SI: J)."
    )
    vapor_volume: QuantityOutput = Field(
        description="Volume of the removed vapor at its saturation states (SI: m3)."
    )
    freezing_point: QuantityOutput = Field(
        description="The freezing point the final temperature was checked against."
    )
    freezing_point_basis: FreezingPointBasis = Field(
        description="Where `freezing_point` came from: `given`, `estimated from dissolved "
        "solids`, `estimated from composition solutes` (`composition.dissolved_solutes`; "
        "each method in the assumptions) or `pure water (no data)` (273.16 K, with a "
        "warning)."
    )
    trap_temperature: QuantityOutput | None = Field(None, description="As given; null without.")
    condenser_load: QuantityOutput | None = Field(
        None,
        description="Heat the trap removes to take the vapor to ice at the trap temperature "
        "(SI: J); null without `trap_temperature`.",
    )
    cooling_time: QuantityOutput | None = Field(None, description="As given; null without.")
    mean_vapor_mass_flow: QuantityOutput | None = Field(
        None,
        description="evaporated_mass / cooling_time (SI: kg/s); null without `cooling_time`.",
    )
    mean_vapor_volume_flow: QuantityOutput | None = Field(
        None,
        description="vapor_volume / cooling_time (SI: m3/s); null without `cooling_time`.",
    )
    final_vapor_volume_flow: QuantityOutput | None = Field(
        None,
        description="mean_vapor_mass_flow as saturated vapor at the final pressure and "
        "temperature (SI: m3/s): the volume flow the vapor takes at the end, which the pump "
        "and trap must handle there; null without `cooling_time`.",
    )
    comparison: EvaporativeComparisonOut = Field(
        description="The integrated and the hand answer side by side."
    )
    energy_balance: EvaporativeEnergyBalanceOut = Field(
        description="The energy books of the balance, with their residual."
    )
    input_uncertainty: EvaporativeUncertaintyOut | None = Field(
        None, description="Null when no input carries an `uncertainty`."
    )
