"""The ice-fraction lookup: ice, unfrozen phase, enthalpy and vapor pressure of a freezing
solution or of seawater, with the sources, ranges and assumptions an answer states.

What ``POST/GET /v1/properties/ice-fraction`` calls; it knows nothing of HTTP.
"""

from __future__ import annotations

from dataclasses import dataclass
from typing import Final

import numpy as np
from numpy.typing import ArrayLike

from service.core.balances.equilibrium_paths import liquid_vapor_states
from service.core.balances.food_composition import Composition
from service.core.errors import InvalidInputError
from service.core.properties import sources
from service.core.properties.advisories import Advisory, advise_where
from service.core.properties.lookups import Lookup, ReportedUncertainty
from service.core.properties.phase import FloatArray
from service.core.properties.phase_lines import sublimation_pressure
from service.core.properties.sources import PropertySource
from service.core.solutions.aqueous import ActivityModelName, SolutionModel, solution_model
from service.core.solutions.ethanol import ETHANOL_CAUTION
from service.core.solutions.food_freezing_point import (
    FreezingPointBasis,
    dissolved_fractions,
    estimate_food_freezing_point,
)
from service.core.solutions.foods import FOOD_MODEL_REFERENCE, food_freezing
from service.core.solutions.freezing import solution_freezing
from service.core.solutions.glass import (
    FREEZE_CONCENTRATION_DATA,
    GLASS_SOURCE,
    FreezeConcentration,
    gordon_taylor_glass_transition,
)
from service.core.solutions.seawater import SEAWATER_MODEL_REFERENCE, seawater_freezing
from service.core.validation import finite_array

__all__ = [
    "FOOD_SOURCE",
    "SEAWATER_SOURCE",
    "SOLUTION_SOURCES",
    "SOLUTION_UNCERTAINTIES",
    "FreezeConcentrationLimit",
    "IceFractionStates",
    "ice_fraction_lookup",
    "solution_source",
]

SEAWATER_SOURCE: Final = PropertySource(
    formulation="IAPWS-08 seawater",
    release="IAPWS R13-08",
    year=2008,
    title="Release on the IAPWS Formulation 2008 for the Thermodynamic Properties of Seawater",
    scope=(
        "Saline part of the Gibbs function of seawater (TEOS-10), 0-120 g/kg: freezing "
        "temperature, brine salinity, water activity and enthalpy of seawater."
    ),
    source_id="iapws-08-seawater",
)

_PITZER_SOURCE: Final = PropertySource(
    formulation="Pitzer ion interaction (NaCl)",
    release="Pitzer and Mayorga (1973); Silvester and Pitzer (1977)",
    year=1977,
    title=(
        "Thermodynamics of electrolytes II (J. Phys. Chem. 77, 2300) and Thermodynamics of "
        "electrolytes 8: high-temperature properties of NaCl(aq) (J. Phys. Chem. 81, 1822)"
    ),
    scope="Water activity of aqueous sodium chloride to the ice-hydrohalite eutectic.",
    source_id="pitzer-sodium-chloride",
)

_NORRISH_SOURCE: Final = PropertySource(
    formulation="Norrish equation",
    release="Norrish (1966); Chirife, Ferro Fontan and Benmergui (1980)",
    year=1980,
    title=(
        "An equation for the activity coefficients and equilibrium relative humidities of "
        "water in confectionery syrups (J. Food Technol. 1, 25) and the K constants of "
        "sugars and polyols (J. Food Technol. 15, 59)"
    ),
    scope="Water activity of aqueous sugars and polyols.",
    source_id="norrish-sugars-polyols",
)

_MELINDER_SOURCE: Final = PropertySource(
    formulation="Melinder ethyl alcohol freezing line",
    release="Melinder (2010)",
    year=2010,
    title=(
        "Properties of Secondary Working Fluids for Indirect Systems, 2nd ed. (International "
        "Institute of Refrigeration): ethyl alcohol, freezing point; water activity from it "
        "after Ferro Fontan and Chirife (1981, J. Food Technol. 16, 21)"
    ),
    scope=(
        "Freezing point and water activity of aqueous ethanol to w = 0.5 (activity taken "
        "independent of temperature)."
    ),
    source_id="melinder-ethanol-freezing",
)

_IDEAL_SOURCE: Final = PropertySource(
    formulation="Ideal (Raoult) solution",
    release="Raoult's law",
    year=1887,
    title="Ideal-solution water activity a_w = x_w with a van 't Hoff factor",
    scope="Water activity of a solution without activity coefficients (comparison model).",
    source_id="ideal-solution",
)

FOOD_SOURCE: Final = PropertySource(
    formulation="Schwartzberg food freezing model",
    release="Schwartzberg (1976)",
    year=1976,
    title="Effective heat capacities for the freezing and thawing of food (J. Food Sci. 41, 152)",
    scope=(
        "Ice fraction of a food from its water, bound water (0.4 kg per kg of protein) and "
        "initial freezing point, one ideal effective solute (as in ASHRAE Handbook - "
        "Refrigeration (2010), ch. 19; from memory)."
    ),
    source_id="schwartzberg-food-freezing",
)

FOOD_ICE_FRACTION_UNCERTAINTY: Final = ReportedUncertainty(
    quantity="ice_fraction",
    relative=None,
    coverage="as compared",
    statement=(
        "As good as the initial freezing point given: 0.1 K in it moves the ice "
        "fraction at -10 degC by about 1 % of the freezable water. The exact "
        "IAPWS ice equilibrium agrees with Schwartzberg's closed form within "
        "1.2 % to -30 degC (tests); no comparison with measured foods was made."
    ),
    source="tests/core/solutions/test_foods.py",
    basis="comparison",
    statement_id="schwartzberg-food-freezing.ice-fraction",
    coverage_factor=None,
)
SEAWATER_FREEZING_POINT_UNCERTAINTY: Final = ReportedUncertainty(
    quantity="freezing_point",
    relative=None,
    coverage="as compared",
    statement=(
        "Agrees with TEOS-10's gsw library (IAPWS-09 water) within 0.1 mK from 0 "
        "to 120 g/kg; the release's own uncertainty of freezing temperatures is "
        "a few mK (R13-08, from memory)."
    ),
    source="IAPWS R13-08; gsw 3.6 comparison in the tests",
    basis="comparison",
    statement_id="iapws-08-seawater.freezing-point",
    coverage_factor=None,
)
SOLUTE_FREEZING_POINT_UNCERTAINTY: Final = ReportedUncertainty(
    quantity="freezing_point",
    relative=None,
    coverage="as compared",
    statement=(
        "Compared with handbook freezing-point tables (CRC Handbook, "
        "Concentrative properties of aqueous solutions; ASHRAE Fundamentals, "
        "secondary coolants; values from memory): sodium chloride within 0.05 K "
        "to 5 %, 0.15 K to 15 %, 0.6 K at the eutectic; sucrose 0.2 K to 50 %; "
        "glucose and fructose 0.05 K to 10 %, 0.5 K at 30 %; glycerol 0.05 K "
        "at 10 %, 1.3 K at 40 %; propylene glycol 0.4-0.8 K to 30 %."
    ),
    source="tests/reference/test_aqueous_freezing_points.py",
    basis="comparison",
    statement_id="solutions.named-solute-freezing-point",
    coverage_factor=None,
)
ETHANOL_FREEZING_POINT_UNCERTAINTY: Final = ReportedUncertainty(
    quantity="freezing_point",
    relative=None,
    coverage="as compared",
    statement=(
        "Ethanol (Melinder's line): within 0.85 K of the Engineering ToolBox table (whole "
        "degC) and 0.45 K of the CRC Handbook rows (Concentrative properties of aqueous "
        "solutions; from memory) to 40 %; 3.5 % shallower than the cryoscopic law at 1 %."
    ),
    source="tests/reference/test_ethanol_freezing_points.py",
    basis="comparison",
    statement_id="melinder-ethanol.freezing-point",
    coverage_factor=None,
)
FOOD_FREEZING_POINT_ESTIMATE_UNCERTAINTY: Final = ReportedUncertainty(
    quantity="freezing_point",
    relative=None,
    coverage="as compared",
    statement=(
        "Estimated from the composition: against the ASHRAE Handbook - Refrigeration "
        "(2006) ch. 9 Table 3 (from memory), fruits within 0.45 K with their sugars named "
        "(vegetables 0.5 K, carrots 1.0 K), 0.65 K by Pham's equation; lean beef and cod "
        "1.0-1.5 K too warm by Pham's equation."
    ),
    source="tests/reference/test_food_freezing_points.py",
    basis="comparison",
    statement_id="food-composition.freezing-point-estimate",
    coverage_factor=None,
)
IDEAL_FREEZING_POINT_UNCERTAINTY: Final = ReportedUncertainty(
    quantity="freezing_point",
    relative=None,
    coverage="as compared",
    statement=(
        "The ideal solution has no activity coefficient: for sodium chloride "
        "its onset is about 0.18 K too deep at 3.5 %, and the error grows with "
        "concentration."
    ),
    source="tests/reference/test_aqueous_freezing_points.py",
    basis="comparison",
    statement_id="ideal-solution.freezing-point",
    coverage_factor=None,
)
SOLUTION_SOURCES: Final[tuple[PropertySource, ...]] = (
    SEAWATER_SOURCE,
    _PITZER_SOURCE,
    _NORRISH_SOURCE,
    _MELINDER_SOURCE,
    _IDEAL_SOURCE,
    FOOD_SOURCE,
)
"""Every source the solution models cite, for the registry of citable statements."""
SOLUTION_UNCERTAINTIES: Final[tuple[ReportedUncertainty, ...]] = (
    FOOD_ICE_FRACTION_UNCERTAINTY,
    SEAWATER_FREEZING_POINT_UNCERTAINTY,
    SOLUTE_FREEZING_POINT_UNCERTAINTY,
    ETHANOL_FREEZING_POINT_UNCERTAINTY,
    FOOD_FREEZING_POINT_ESTIMATE_UNCERTAINTY,
    IDEAL_FREEZING_POINT_UNCERTAINTY,
)
"""The uncertainty statements the ice-fraction lookup can cite."""

_FOOD_ASSUMPTIONS: Final = (
    "Food: bound water (0.4 kg per kg of protein) never freezes and counts as liquid water "
    "in the enthalpy; the dissolved solids act as one ideal effective solute sized by the "
    "initial freezing point (given, or estimated as stated), so the unfrozen food's water "
    "activity, and the vapor pressure over it, is that solute's: the ice's at the freezing "
    "point, nearer 1 above it; the non-water components take the Choi and Okos (1986) "
    "specific heats from 273.16 K, with no heat of solution; one uniform temperature.",
)

_ASSUMPTIONS: Final = (
    "Ice and unfrozen phase in equilibrium at each temperature (no supercooling, no "
    "glass): the ice is pure ice Ih and all solute stays in the unfrozen phase.",
    "Pressure is the total pressure on the mixture; the vapor pressure is that of the ice "
    "where ice is present, else of the unfrozen liquid.",
    "Water and ice energies on the one reference state of the answer; a dissolved solute's "
    "sensible heat counted from 273.16 K, heat of dilution neglected.",
)
_SEAWATER_ASSUMPTIONS: Final = (
    "Air-free seawater of reference composition; absolute salinity is kg of sea salt per kg "
    "of seawater. The salt's enthalpy is referred to standard seawater (35.16504 g/kg) at "
    "273.15 K and 101325 Pa as IAPWS R13-08 fixes it.",
)


def solution_source(model: SolutionModel) -> PropertySource:
    """The published model behind a solute's water activity."""
    return {
        "pitzer": _PITZER_SOURCE,
        "norrish": _NORRISH_SOURCE,
        "seawater": SEAWATER_SOURCE,
        "melinder": _MELINDER_SOURCE,
    }.get(model.model, _IDEAL_SOURCE)


@dataclass(frozen=True)
class FreezeConcentrationLimit:
    """The freeze-concentration limit reported beside the ice fraction of a sugar.

    Attributes
    ----------
    glass_transition_of_unfrozen_phase : ndarray
        K, Gordon-Taylor T_g of the unfrozen solution at each temperature.
    data : FreezeConcentration
        T_g', C_g' and T_m' of the solute.
    source : str
        Where the constants come from.
    """

    glass_transition_of_unfrozen_phase: FloatArray
    data: FreezeConcentration
    source: str


@dataclass(frozen=True)
class IceFractionStates:
    """What the ice-fraction lookup answers (SI arrays of the temperature's shape).

    Attributes
    ----------
    temperature, pressure : ndarray
        K, Pa.
    freezing_point : ndarray
        K, the initial freezing point.
    ice_mass_fraction : ndarray
        kg of ice per kg of mixture.
    unfrozen_water_fraction : ndarray
        kg of liquid water per kg of mixture.
    unfrozen_concentration : ndarray or None
        Solute (or salt) mass fraction of the unfrozen phase; None for a food (its
        effective solute has no stated mass).
    specific_enthalpy : ndarray
        J/kg of mixture.
    vapor_pressure : ndarray
        Pa, water vapor over the mixture.
    water_activity : ndarray
        a_w of the unfrozen phase.
    mixture : str
        ``"seawater"`` or the solute's name.
    model : str
        The activity model's description (its source and range).
    freeze_concentration : FreezeConcentrationLimit or None
        For a sugar with published constants.
    apparent_specific_heat : ndarray or None
        J/(kg K), dh/dT of a food at constant pressure; None for solutions and seawater.
    freezing_point_basis : str or None
        A food's: ``"given"`` or how it was estimated from the composition
        (:mod:`service.core.solutions.food_freezing_point`); None otherwise.
    """

    temperature: FloatArray
    pressure: FloatArray
    freezing_point: FloatArray
    ice_mass_fraction: FloatArray
    unfrozen_water_fraction: FloatArray
    unfrozen_concentration: FloatArray | None
    specific_enthalpy: FloatArray
    vapor_pressure: FloatArray
    water_activity: FloatArray
    mixture: str
    model: str
    freeze_concentration: FreezeConcentrationLimit | None = None
    apparent_specific_heat: FloatArray | None = None
    freezing_point_basis: FreezingPointBasis | None = None


def _vapor_pressure(
    temperature: FloatArray, ice: FloatArray, log_activity: FloatArray
) -> FloatArray:
    flat_t = temperature.ravel()
    frozen = ice.ravel() > 0.0
    result = np.empty_like(flat_t)
    if np.any(frozen):
        result[frozen] = sublimation_pressure(flat_t[frozen])
    if np.any(~frozen):
        states = liquid_vapor_states(flat_t[~frozen], log_activity.ravel()[~frozen])
        result[~frozen] = states.pressure
    return result.reshape(temperature.shape)


def ice_fraction_lookup(
    temperature: ArrayLike,
    *,
    solute_name: str | None = None,
    mass_fraction: ArrayLike | None = None,
    model: ActivityModelName = "non-ideal",
    absolute_salinity: ArrayLike | None = None,
    pressure: ArrayLike = 101325.0,
    composition: Composition | None = None,
    freezing_point: ArrayLike | None = None,
) -> Lookup[IceFractionStates]:
    """Ice fraction and unfrozen phase of a solution or of seawater at given temperatures.

    Parameters
    ----------
    temperature : array_like
        K. Solutions: 235 K to 373.15 K, and where ice forms not below the model's lowest
        temperature (the freezing point at its highest mass fraction); seawater: from the
        freezing point of 120 g/kg brine (about 266.2 K) to 353 K.
    solute_name, mass_fraction, model
        A named solute, its mass fraction of the whole (0 to the model's maximum), and
        ``"non-ideal"`` (its published model, the default) or ``"ideal"``.
    absolute_salinity : array_like
        Seawater instead of a solute: kg/kg, 0 < S_A <= 0.12.
    pressure : array_like
        Pa, total pressure on the mixture (default 101325 Pa). Every input broadcasts
        with the temperature.
    composition, freezing_point
        A food instead: its proximate composition and initial freezing point (K, 253.15 K
        to 273.16 K) (:func:`service.core.solutions.foods.food_freezing`); without the
        freezing point it is estimated from the composition
        (:func:`service.core.solutions.food_freezing_point.estimate_food_freezing_point`).

    Returns
    -------
    Lookup[IceFractionStates]

    Raises
    ------
    InvalidInputError
        Not exactly one of a solute, seawater and a composition; a bad composition or
        dissolved-solute list; an unknown solute or model; NaN input.
    OutOfRangeError
        An input outside its range (the variable named).
    """
    t = finite_array(temperature, "temperature")
    given = [solute_name is not None, absolute_salinity is not None, composition is not None]
    if sum(given) != 1:
        raise InvalidInputError("solute", "give exactly one of solute, seawater and composition")
    advisories: list[Advisory] = []
    uncertainties: list[ReportedUncertainty]
    limit: FreezeConcentrationLimit | None = None
    concentration: FloatArray | None
    apparent: FloatArray | None = None
    basis: FreezingPointBasis | None = None
    if composition is not None:
        if freezing_point is None:
            estimate = estimate_food_freezing_point(composition)
            freezing_point = estimate.temperature
            basis = estimate.basis
            food_statements: tuple[str, ...] = (estimate.statement,)
            advisories.append(
                Advisory(
                    code="estimated-freezing-point",
                    message=(
                        f"The food's initial freezing point, {estimate.temperature - 273.15:.2f} "
                        f"degC, is estimated from its composition ({estimate.basis}); a "
                        "measured value is better where the ice fraction near it matters."
                    ),
                )
            )
        else:
            dissolved_fractions(composition)  # validated even when not needed
            basis, food_statements = "given", ()
        food = food_freezing(composition, freezing_point, t, pressure)
        ice, water = food.ice_mass_fraction, food.unfrozen_water_fraction
        concentration, log_activity = None, food.log_water_activity
        onset, enthalpy, p = food.freezing_temperature, food.specific_enthalpy, food.pressure
        apparent = food.apparent_specific_heat
        mixture, description = "food", FOOD_MODEL_REFERENCE
        used: tuple[PropertySource, ...] = (
            FOOD_SOURCE,
            sources.IAPWS_95,
            sources.ICE_IH,
            sources.MELTING_AND_SUBLIMATION,
        )
        assumptions: tuple[str, ...] = (*_ASSUMPTIONS, *_FOOD_ASSUMPTIONS, *food_statements)
        uncertainties = [FOOD_ICE_FRACTION_UNCERTAINTY]
        if basis != "given":
            uncertainties.append(FOOD_FREEZING_POINT_ESTIMATE_UNCERTAINTY)
    elif absolute_salinity is not None:
        sea = seawater_freezing(absolute_salinity, t, pressure)
        ice, water = (
            sea.ice_mass_fraction,
            (1.0 - sea.ice_mass_fraction) * (1.0 - sea.brine_salinity),
        )
        concentration, log_activity = sea.brine_salinity, sea.log_water_activity
        onset, enthalpy, p = sea.freezing_temperature, sea.specific_enthalpy, sea.pressure
        mixture, description = "seawater", SEAWATER_MODEL_REFERENCE
        used = (
            SEAWATER_SOURCE,
            sources.IAPWS_95,
            sources.ICE_IH,
            sources.MELTING_AND_SUBLIMATION,
        )
        assumptions = (*_ASSUMPTIONS, *_SEAWATER_ASSUMPTIONS)
        uncertainties = [SEAWATER_FREEZING_POINT_UNCERTAINTY]
    else:
        assert solute_name is not None
        if solute_name == "seawater":
            raise InvalidInputError(
                "solute.name",
                "for seawater give `seawater` with its `absolute_salinity`: the lookup then "
                "uses the whole IAPWS R13-08 Gibbs function (the named solute `seawater` is "
                "its water activity only, for the balances)",
                solute_name,
            )
        chosen = solution_model(solute_name, model)
        fraction = 0.0 if mass_fraction is None else mass_fraction
        result = solution_freezing(chosen, fraction, t, pressure)
        ice, water = result.ice_mass_fraction, result.unfrozen_water_fraction
        concentration, log_activity = result.unfrozen_mass_fraction, result.log_water_activity
        onset, enthalpy, p = result.freezing_temperature, result.specific_enthalpy, result.pressure
        mixture, description = chosen.name, chosen.source
        used = (solution_source(chosen), sources.IAPWS_95, sources.ICE_IH)
        used = (*used, sources.MELTING_AND_SUBLIMATION)
        assumptions = _ASSUMPTIONS
        if chosen.name == "ethanol":
            assumptions = (*_ASSUMPTIONS, ETHANOL_CAUTION)
        uncertainties = [
            ETHANOL_FREEZING_POINT_UNCERTAINTY
            if chosen.name == "ethanol"
            else SOLUTE_FREEZING_POINT_UNCERTAINTY
            if chosen.model != "ideal"
            else IDEAL_FREEZING_POINT_UNCERTAINTY
        ]
        glass = FREEZE_CONCENTRATION_DATA.get(chosen.name)
        if glass is not None:
            limit = FreezeConcentrationLimit(
                glass_transition_of_unfrozen_phase=gordon_taylor_glass_transition(
                    glass, concentration
                ),
                data=glass,
                source=GLASS_SOURCE,
            )
            advisories += advise_where(
                np.asarray(onset * 0.0 + t > glass.ice_melting_onset),
                "above-freeze-concentration-limit",
                f"Above the {chosen.name} freeze-concentrate's ice-melting onset "
                f"T_m' = {glass.ice_melting_onset - 273.15:.0f} degC (glass transition "
                f"T_g' = {glass.glass_transition_of_freeze_concentrate - 273.15:.0f} degC at "
                f"{glass.freeze_concentrate_mass_fraction:.0%}): the unfrozen phase is a "
                "viscous liquid, not a glass. A freeze-drying freezing step that ends here "
                "leaves the product liable to collapse; follow the product's validated cycle.",
                batch=t.ndim > 0,
            )
        advisories += advise_where(
            np.asarray(concentration > 0.9 * chosen.maximum_mass_fraction),
            "near-model-limit",
            f"The unfrozen solution is within 10 % of the end of the {chosen.model} model's "
            f"range (w = {chosen.maximum_mass_fraction}).",
            batch=t.ndim > 0,
        )
    vapor = _vapor_pressure(np.asarray(onset * 0.0 + t), ice, log_activity)
    states = IceFractionStates(
        temperature=np.asarray(onset * 0.0 + t, dtype=np.float64),
        pressure=np.asarray(p, dtype=np.float64),
        freezing_point=onset,
        ice_mass_fraction=np.asarray(ice, dtype=np.float64),
        unfrozen_water_fraction=np.asarray(water, dtype=np.float64),
        unfrozen_concentration=(
            None if concentration is None else np.asarray(concentration, dtype=np.float64)
        ),
        specific_enthalpy=enthalpy,
        vapor_pressure=vapor,
        water_activity=np.asarray(np.exp(log_activity), dtype=np.float64),
        mixture=mixture,
        model=description,
        freeze_concentration=limit,
        apparent_specific_heat=apparent,
        freezing_point_basis=basis,
    )
    return Lookup(
        states=states,
        sources=used,
        uncertainties=uncertainties,
        advisories=advisories,
        assumptions=list(assumptions),
    )
