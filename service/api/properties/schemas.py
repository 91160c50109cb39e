"""Request/response pairs of the property lookups."""

from __future__ import annotations

from typing import Literal

from pydantic import ConfigDict, Field

from service.api.http.alternatives import exactly_one_of, refused_shapes
from service.api.http.models import (
    ApiModel,
    Envelope,
    QuantityInput,
    QuantityOutput,
    QuantityText,
)
from service.api.http.units import UnitSet

__all__ = [
    "ConstantsPublic",
    "ConstantsQuery",
    "Formulation",
    "MeltingCreate",
    "MeltingPublic",
    "MeltingQuery",
    "PhaseOut",
    "SaturationCreate",
    "SaturationPublic",
    "SaturationQuery",
    "StateCreate",
    "StatePublic",
    "StateQuery",
    "SublimationCreate",
    "SublimationPublic",
    "SublimationQuery",
]

Formulation = Literal["IAPWS-95", "IAPWS-IF97"]
RequestedPhase = Literal["liquid", "vapor", "ice"]

_TEMPERATURE = (
    'Temperature. Default unit K; or a string with a unit (`"25 degC"`), '
    '`{"value", "unit"}`, or `{"values": [...], "unit"}` for a batch.'
)
_PRESSURE = (
    'Absolute pressure. Default unit Pa; or a string with a unit (`"2 kPa"`, `"0.3 psi"`), '
    '`{"value", "unit"}`, or `{"values": [...], "unit"}` for a batch.'
)
_FORMULATION = (
    "`IAPWS-95` (default, scientific accuracy) or `IAPWS-IF97` (industrial formulation, "
    "regions 1, 2 and 4 only)."
)
_OUTPUT_UNITS = (
    "Unit set of the results: `SI` (K, Pa, J/kg, J/(kg*K)), `engineering` "
    "(degC, kPa, kJ/kg, kJ/(kg*K)) or `US` (degF, psi absolute, Btu/lb, Btu/(lb*degR))."
)


class _LineCreate(ApiModel):
    model_config = ConfigDict(
        json_schema_extra=refused_shapes(exactly_one_of("temperature", "pressure"))
    )

    temperature: QuantityInput | None = Field(None, description=_TEMPERATURE)
    pressure: QuantityInput | None = Field(None, description=_PRESSURE)
    output_units: UnitSet = Field(UnitSet.SI, description=_OUTPUT_UNITS)


class SaturationCreate(_LineCreate):
    """Liquid-vapor saturation: give exactly one of `temperature` or `pressure`
    (triple point 273.16 K / 611.657 Pa to critical point 647.096 K / 22.064 MPa)."""

    formulation: Formulation = Field("IAPWS-95", description=_FORMULATION)


class SublimationCreate(_LineCreate):
    """Ice Ih-vapor sublimation line: give exactly one of `temperature` (50 K to 273.16 K)
    or `pressure`."""


class MeltingCreate(_LineCreate):
    """Ice Ih-liquid melting line: give exactly one of `temperature` (251.165 K to 273.16 K)
    or `pressure` (611.657 Pa to 208.566 MPa)."""


class StateCreate(ApiModel):
    """A state at given temperature and pressure (both required; batches broadcast)."""

    temperature: QuantityInput = Field(description=_TEMPERATURE)
    pressure: QuantityInput = Field(description=_PRESSURE)
    phase: RequestedPhase | None = Field(
        None,
        description="Omit for the stable phase. `liquid` or `vapor` asks for that phase even "
        "where it is metastable (supercooled liquid, supersaturated vapor), with a warning.",
    )
    formulation: Formulation = Field("IAPWS-95", description=_FORMULATION)
    output_units: UnitSet = Field(UnitSet.SI, description=_OUTPUT_UNITS)


# ----------------------------------------------------------------- GET query strings
_TEMPERATURE_QUERY = (
    "Temperature: a number in K, or a number with a unit, e.g. `25 degC`, `77 degF`, `298.15 K`."
)
_PRESSURE_QUERY = "Absolute pressure: a number in Pa, or with a unit, e.g. `2 kPa`, `0.3 psi`."
_UNITS_QUERY = "Unit set of the results: `SI`, `engineering` or `US`."
_FORMULATION_QUERY = "`IAPWS-95` (default) or `IAPWS-IF97`."


class ConstantsQuery(ApiModel):
    """Query string of GET /v1/properties/constants."""

    output_units: UnitSet = Field(UnitSet.SI, description=_UNITS_QUERY)


class _LineQuery(ApiModel):
    temperature: QuantityText | None = Field(None, description=_TEMPERATURE_QUERY)
    pressure: QuantityText | None = Field(None, description=_PRESSURE_QUERY)
    output_units: UnitSet = Field(UnitSet.SI, description=_UNITS_QUERY)


class SublimationQuery(_LineQuery):
    """Query string of GET /v1/properties/sublimation: one of temperature or pressure."""


class MeltingQuery(_LineQuery):
    """Query string of GET /v1/properties/melting: one of temperature or pressure."""


class SaturationQuery(_LineQuery):
    """Query string of GET /v1/properties/saturation: one of temperature or pressure."""

    formulation: Formulation = Field("IAPWS-95", description=_FORMULATION_QUERY)


class StateQuery(ApiModel):
    """Query string of GET /v1/properties/state: temperature and pressure."""

    temperature: QuantityText = Field(description=_TEMPERATURE_QUERY)
    pressure: QuantityText = Field(description=_PRESSURE_QUERY)
    phase: RequestedPhase | None = Field(
        None,
        description="Omit for the stable phase; `liquid`/`vapor`/`ice` for a metastable one.",
    )
    formulation: Formulation = Field("IAPWS-95", description=_FORMULATION_QUERY)
    output_units: UnitSet = Field(UnitSet.SI, description=_UNITS_QUERY)


class PhaseOut(ApiModel):
    """Properties of one phase."""

    density: QuantityOutput = Field(description="Mass density (SI: kg/m3).")
    specific_enthalpy: QuantityOutput = Field(description="Specific enthalpy (SI: J/kg).")
    specific_internal_energy: QuantityOutput = Field(
        description="Specific internal energy (SI: J/kg)."
    )
    specific_entropy: QuantityOutput = Field(description="Specific entropy (SI: J/(kg*K)).")
    specific_isobaric_heat_capacity: QuantityOutput = Field(
        description="Specific isobaric heat capacity (SI: J/(kg*K))."
    )


class SaturationPublic(Envelope):
    """Saturated liquid and vapor in equilibrium."""

    temperature: QuantityOutput = Field(
        description="Saturation temperature, one value or a batch (SI: K)."
    )
    pressure: QuantityOutput = Field(description="Saturation pressure (SI: Pa).")
    liquid: PhaseOut = Field(description="Properties of the saturated liquid.")
    vapor: PhaseOut = Field(description="Properties of the saturated vapor.")
    latent_heat_of_vaporization: QuantityOutput = Field(
        description="Specific enthalpy of vapor minus liquid (SI: J/kg)."
    )


class SublimationPublic(Envelope):
    """Ice Ih and vapor in equilibrium."""

    temperature: QuantityOutput = Field(description="Temperature on the sublimation line (SI: K).")
    pressure: QuantityOutput = Field(description="Sublimation pressure (SI: Pa).")
    ice: PhaseOut = Field(description="Properties of ice Ih in equilibrium with the vapor.")
    vapor: PhaseOut = Field(description="Properties of the vapor in equilibrium with ice Ih.")
    latent_heat_of_sublimation: QuantityOutput = Field(
        description="Specific enthalpy of vapor minus ice (SI: J/kg)."
    )


class MeltingPublic(Envelope):
    """Ice Ih and liquid in equilibrium."""

    temperature: QuantityOutput = Field(description="Temperature on the melting line (SI: K).")
    pressure: QuantityOutput = Field(description="Melting pressure (SI: Pa).")
    ice: PhaseOut = Field(description="Properties of ice Ih in equilibrium with the liquid.")
    liquid: PhaseOut = Field(description="Properties of the liquid in equilibrium with ice Ih.")
    latent_heat_of_fusion: QuantityOutput = Field(
        description="Specific enthalpy of liquid minus ice (SI: J/kg)."
    )


class StatePublic(Envelope):
    """One phase at the given temperature and pressure."""

    temperature: QuantityOutput = Field(description="Temperature of the state, as asked (SI: K).")
    pressure: QuantityOutput = Field(
        description="Absolute pressure of the state, as asked (SI: Pa)."
    )
    phase: str | list[str] = Field(
        description="`liquid`, `vapor`, `ice` (ice Ih) or `supercritical`; a list for a batch."
    )
    properties: PhaseOut = Field(
        description="Properties of the phase at that temperature and pressure."
    )


class PointOut(ApiModel):
    """A fixed point."""

    temperature: QuantityOutput = Field(description="Temperature of the point (SI: K).")
    pressure: QuantityOutput = Field(description="Pressure of the point (SI: Pa).")
    density: QuantityOutput | None = Field(
        None,
        description="Density at the point (SI: kg/m3); null where the point has no single density"
        " (the triple point's three phases).",
    )


class ConstantsPublic(Envelope):
    """Fixed points and constants of ordinary water substance."""

    triple_point: PointOut = Field(
        description="The triple point of water (solid, liquid and vapor in equilibrium)."
    )
    critical_point: PointOut = Field(description="The liquid-vapor critical point.")
    specific_gas_constant: QuantityOutput = Field(
        description="Specific gas constant of water vapor (SI: J/(kg*K))."
    )
    molar_mass: QuantityOutput = Field(description="Molar mass of water (SI: kg/mol).")
    latent_heat_of_vaporization_at_triple_point: QuantityOutput = Field(
        description="Enthalpy of vapor minus liquid at the triple point (SI: J/kg)."
    )
    latent_heat_of_sublimation_at_triple_point: QuantityOutput = Field(
        description="Enthalpy of vapor minus ice Ih at the triple point (SI: J/kg)."
    )
    latent_heat_of_fusion_at_triple_point: QuantityOutput = Field(
        description="Enthalpy of liquid minus ice Ih at the triple point (SI: J/kg)."
    )
