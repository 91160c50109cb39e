"""Request/response pair of the ice-fraction lookup (POST body, GET query, answer)."""

from __future__ import annotations

from typing import Literal

from pydantic import ConfigDict, Field

from service.api.balances.schemas import CompositionInput
from service.api.http.alternatives import exactly_one_of, refused_shapes, requires
from service.api.http.models import (
    ApiModel,
    Envelope,
    QuantityInput,
    QuantityOutput,
    QuantityText,
)
from service.api.http.units import UnitSet

__all__ = [
    "COMPOSITION_FIELDS",
    "IceFractionCreate",
    "IceFractionPublic",
    "IceFractionQuery",
    "SeawaterInput",
    "SolutionSoluteInput",
]

_NAMES = (
    "`sodium chloride` (Pitzer, to the eutectic w = 0.233), `sucrose` (Norrish, to 0.5), "
    "`glucose`, `fructose` (Norrish, to 0.3), `glycerol` (Norrish, to 0.4), "
    "`propylene glycol` (Norrish, to 0.3), `ethanol` (Melinder's freezing line, to 0.5; "
    "water vapor only, ethanol's own vapor not counted)"
)
_TEMPERATURE = (
    "Temperature: a number in K or with a unit (`-5 degC`); a batch "
    '(`{"values": [...], "unit": "degC"}` or a list) gives one answer per element. Where ice '
    "forms it must not be colder than the freezing point of the model's most concentrated "
    "solution (sodium chloride: about -20.5 degC; seawater: 120 g/kg brine, about -7 degC), "
    "nor than 235 K (the end of the supercooled-water reference)."
)
_PRESSURE = "Total pressure on the mixture: a number in Pa or with a unit; default 101325 Pa."
_MODEL = (
    "`non-ideal` (the solute's published model, default) or `ideal` (Raoult's law with the "
    "solute's van 't Hoff factor, for comparison)."
)
_SALINITY = (
    "Absolute salinity of the seawater (kg of sea salt per kg of seawater): a number in "
    'g/kg (`35.16504`), or with a unit (`"35.16504 g/kg"`, `"3.5 %"`, `"0.0352 kg/kg"`); '
    "above 0, at most 120 g/kg."
)
_UNITS = "Unit set of the results: `SI`, `engineering` or `US`."
_FREEZING_POINT = (
    "With `composition` only: the food's initial freezing point (measured, or from a handbook "
    "table of foods), a number in K or with a unit (`-1.7 degC`); 253.15 K to 273.16 K. "
    "Omitted: estimated from `composition.dissolved_solutes` if named, else from the "
    "composition alone (Pham 1996), with a warning."
)

COMPOSITION_FIELDS = ("water", "protein", "fat", "carbohydrate", "fiber", "ash")
"""The components of a food's composition, as the request names them."""


class SolutionSoluteInput(ApiModel):
    """A named solute dissolved in water."""

    name: str = Field(description=f"The solute: {_NAMES}.")
    mass_fraction: QuantityInput = Field(
        description="Solute mass per kg of the whole (water + solute). Default unit 1 (a "
        'fraction; `"3.5 %"` works); 0 to the model\'s maximum.'
    )
    model: Literal["non-ideal", "ideal"] = Field("non-ideal", description=_MODEL)


class SeawaterInput(ApiModel):
    """Air-free seawater of reference composition (IAPWS R13-08, TEOS-10)."""

    absolute_salinity: QuantityInput = Field(description=_SALINITY)


class IceFractionCreate(ApiModel):
    """Ice and unfrozen phase at given temperatures: give `temperature` and exactly one of
    `solute`, `seawater` or `composition` (a food, with its `freezing_point` or without it:
    estimated)."""

    model_config = ConfigDict(
        json_schema_extra=refused_shapes(
            exactly_one_of("solute", "seawater", "composition"),
            requires("freezing_point", "composition"),
        )
    )

    temperature: QuantityInput = Field(description=_TEMPERATURE)
    solute: SolutionSoluteInput | None = Field(None, description="A named solute in water.")
    seawater: SeawaterInput | None = Field(None, description="Seawater instead of a solute.")
    composition: CompositionInput | None = Field(
        None,
        description="A food by its proximate composition instead (Schwartzberg's model: "
        "bound water 0.4 kg per kg of protein, one ideal effective solute sized by the "
        "initial freezing point, given in `freezing_point` or estimated).",
    )
    freezing_point: QuantityInput | None = Field(None, description=_FREEZING_POINT)
    pressure: QuantityInput = Field(101325.0, description=_PRESSURE)
    output_units: UnitSet = Field(UnitSet.SI, description=_UNITS)


class IceFractionQuery(ApiModel):
    """Query string of GET /v1/properties/ice-fraction: one state; `solute` with
    `mass_fraction`, or `absolute_salinity`."""

    temperature: QuantityText = Field(description="Temperature: a number in K, or with a unit.")
    solute: str | None = Field(None, description=f"A named solute: {_NAMES}.")
    mass_fraction: QuantityText | None = Field(
        None, description="The solute's mass fraction of the whole (unit 1, or `3.5 %`)."
    )
    model: Literal["non-ideal", "ideal"] = Field("non-ideal", description=_MODEL)
    absolute_salinity: QuantityText | None = Field(None, description=_SALINITY)
    pressure: QuantityText = Field("101325", description=_PRESSURE)
    output_units: UnitSet = Field(UnitSet.SI, description=_UNITS)


class FreezeConcentratedOut(ApiModel):
    """The maximally freeze-concentrated point of the solute."""

    glass_transition: QuantityOutput = Field(description="T_g' (SI: K).")
    ice_melting_onset: QuantityOutput = Field(
        description="T_m', onset of ice melting in the freeze-concentrate (SI: K)."
    )
    concentration: QuantityOutput = Field(description="C_g', solute mass fraction.")


class FreezeConcentrationOut(ApiModel):
    """Freeze-concentration limit of a sugar, beside its ice fraction."""

    glass_transition_of_unfrozen_phase: QuantityOutput = Field(
        description="Gordon-Taylor glass transition of the unfrozen solution (SI: K)."
    )
    maximally_freeze_concentrated: FreezeConcentratedOut = Field(
        description="The maximally freeze-concentrated solution: glass transition, onset of ice "
        "melting, solute fraction."
    )
    source: str = Field(
        description="Published source of the glass-transition and freeze-concentration data."
    )


class IceFractionPublic(Envelope):
    """Ice fraction, unfrozen phase, enthalpy and vapor pressure of the mixture."""

    mixture: str = Field(description="`seawater`, `food` or the solute's name.")
    model: str = Field(description="The activity model with its source and valid range.")
    temperature: QuantityOutput = Field(description="Temperature of the mixture, as asked (SI: K).")
    pressure: QuantityOutput = Field(
        description="Total pressure on the mixture, as given or the default 101325 Pa (SI: Pa)."
    )
    freezing_point: QuantityOutput = Field(description="Initial freezing point (SI: K).")
    freezing_point_basis: str | None = Field(
        None,
        description="For a food: `given`, `dissolved solutes (Ross)` (estimated from "
        "`composition.dissolved_solutes`) or `composition (Pham 1996)` (estimated from the "
        "composition alone); the method and its agreement with handbook tables are in the "
        "assumptions. Null for solutions and seawater.",
    )
    ice_fraction: QuantityOutput = Field(description="kg of ice per kg of the whole mixture.")
    unfrozen_water: QuantityOutput = Field(
        description="kg of liquid water per kg of the whole mixture."
    )
    unfrozen_concentration: QuantityOutput | None = Field(
        description="Solute (salt) mass fraction of the unfrozen phase; null for a food."
    )
    specific_enthalpy: QuantityOutput = Field(
        description="Enthalpy per kg of mixture on the stated reference state (SI: J/kg)."
    )
    vapor_pressure: QuantityOutput = Field(
        description="Water vapor pressure over the mixture: of the ice where ice is present, "
        "else of the unfrozen solution (SI: Pa)."
    )
    water_activity: QuantityOutput = Field(description="Water activity of the unfrozen phase.")
    apparent_specific_heat: QuantityOutput | None = Field(
        None,
        description="For a food: dh/dT at constant pressure, the latent heat of the ice that "
        "forms included (SI: J/(kg K)); null for solutions and seawater.",
    )
    freeze_concentration_limit: FreezeConcentrationOut | None = Field(
        None,
        description="For a sugar with published constants (sucrose): the glass transition of "
        "the unfrozen phase and the maximally freeze-concentrated point; null otherwise.",
    )
