"""Property lookups with everything an answer must state beside its numbers.

Each function here is what one HTTP lookup calls: it computes the states and
gathers the formulations used, their stated uncertainties for the quantities
returned, advisories and modelling assumptions. It knows nothing of HTTP.
"""

from __future__ import annotations

import functools
import math
from dataclasses import dataclass, field
from typing import Final, Generic, Literal, TypeVar

import numpy as np

from service.core.errors import InvalidInputError, OutOfRangeError
from service.core.properties import constants, sources
from service.core.properties.advisories import (
    NEAR_CRITICAL_TEMPERATURE_BAND,
    Advisory,
    advise_where,
    near_critical_point,
)
from service.core.properties.melting import (
    MeltingStates,
    melting_by_pressure,
    melting_by_temperature,
)
from service.core.properties.phase import FloatArray
from service.core.properties.saturation import (
    Formulation,
    SaturationPoint,
    SaturationStates,
    saturation_by_pressure,
    saturation_by_temperature,
    saturation_point_by_temperature,
)
from service.core.properties.state import PointStates, state_at
from service.core.properties.sublimation import (
    SublimationStates,
    sublimation_by_pressure,
    sublimation_by_temperature,
)
from service.core.properties.uncertainty import StatedUncertainty, stated_uncertainty, statement_at

__all__ = [
    "NOT_STATED",
    "ConstantValues",
    "Lookup",
    "ReportedUncertainty",
    "constants_lookup",
    "melting_lookup",
    "path_uncertainties",
    "saturation_lookup",
    "saturation_point_lookup",
    "state_lookup",
    "sublimation_lookup",
]

StatesT = TypeVar("StatesT")

LOW_TEMPERATURE_VAPOR_LIMIT: Final = 130.0
"""K. Below this the vapor's ideal-gas part carries the correction of the IAPWS
Guideline on a low-temperature extension of IAPWS-95 (2012), valid down to 50 K."""

_PURE_WATER: Final = "Pure water substance (no dissolved air or solutes)."
_ABSOLUTE: Final = "All pressures are absolute."
_FLAT: Final = "Phases in equilibrium across a flat interface (no curvature or surface effects)."


@dataclass(frozen=True)
class ReportedUncertainty:
    """A formulation's stated uncertainty for one returned quantity over a request.

    ``relative`` is the largest stated relative uncertainty over the request's states,
    or ``None`` where no statement covers them. ``statement_id`` names the statement in
    the registry of citable statements (:mod:`service.core.statements`), which holds
    its full text; ``statement`` may add to that text what only this answer knows.
    ``coverage_factor`` is the coverage factor of ``relative`` (``None``: not stated).
    """

    quantity: str
    relative: float | None
    coverage: str
    statement: str
    source: str
    basis: str
    statement_id: str = field(kw_only=True)
    coverage_factor: float | None = field(kw_only=True)


NOT_STATED: Final = ReportedUncertainty(
    quantity="",
    relative=None,
    coverage="not stated",
    statement=(
        "No uncertainty statement of the formulation covers every state asked (the "
        "answer's full detail names the first state outside the statements' ranges); no "
        "uncertainty is reported for this quantity."
    ),
    source="",
    basis="",
    statement_id="uncertainty-not-stated",
    coverage_factor=None,
)
"""What an answer cites where no statement covers its states (its template)."""


@dataclass(frozen=True)
class Lookup(Generic[StatesT]):
    """States plus what the answer must state beside them."""

    states: StatesT
    sources: tuple[sources.PropertySource, ...]
    uncertainties: list[ReportedUncertainty]
    advisories: list[Advisory]
    assumptions: list[str]


@dataclass(frozen=True)
class ConstantValues:
    """Fixed points (SI) and the latent heats at the triple point (J/kg)."""

    triple_point_temperature: float
    triple_point_pressure: float
    critical_temperature: float
    critical_pressure: float
    critical_density: float
    specific_gas_constant: float
    molar_mass: float
    latent_heat_of_vaporization: float
    latent_heat_of_sublimation: float
    latent_heat_of_fusion: float


LineLookup = (
    Lookup[SaturationStates]
    | Lookup[SaturationPoint]
    | Lookup[SublimationStates]
    | Lookup[MeltingStates]
)


def _report(
    formulation: str,
    quantity: str,
    temperature: FloatArray,
    pressure: FloatArray | None = None,
    *,
    label: str | None = None,
) -> ReportedUncertainty:
    name = label or quantity
    try:
        lookup = stated_uncertainty(formulation, quantity, temperature, pressure)
    except OutOfRangeError as error:
        return _not_stated(name, formulation, error)
    worst = lookup.statements[
        int(lookup.statement_index.ravel()[np.argmax(lookup.relative_uncertainty)])
    ]
    return _reported(name, worst)


def _report_point(
    formulation: str, quantity: str, temperature: float, *, label: str
) -> ReportedUncertainty:
    """:func:`_report` for one state."""
    try:
        statement = statement_at(formulation, quantity, temperature)
    except OutOfRangeError as error:
        return _not_stated(label, formulation, error)
    return _reported(label, statement)


def _reported(name: str, statement: StatedUncertainty) -> ReportedUncertainty:
    return ReportedUncertainty(
        quantity=name,
        relative=statement.relative,
        coverage=statement.coverage,
        statement=statement.statement,
        source=statement.section,
        basis=statement.basis,
        statement_id=statement.statement_id,
        coverage_factor=statement.coverage_factor,
    )


def _not_stated(name: str, formulation: str, error: OutOfRangeError) -> ReportedUncertainty:
    return ReportedUncertainty(
        quantity=name,
        relative=None,
        coverage="not stated",
        statement=f"No uncertainty statement of {formulation} covers every state asked: {error}",
        source="",
        basis="",
        statement_id=NOT_STATED.statement_id,
        coverage_factor=None,
    )


def path_uncertainties(product_temperature: FloatArray) -> list[ReportedUncertainty]:
    """Stated uncertainties of the phase-change properties along a process path.

    For the liquid part of the path (at or above the triple point): saturation
    pressure and enthalpy of vaporization (IAPWS-95); for the part below it: sublimation
    pressure (R14-08) and enthalpy of sublimation (R10-06). Each is the largest stated
    value over the temperatures visited.

    Parameters
    ----------
    product_temperature : ndarray
        Temperatures the product passes through, K.
    """
    t = np.asarray(product_temperature, dtype=np.float64).ravel()
    reported: list[ReportedUncertainty] = []
    warm = t[t >= constants.TRIPLE_POINT_TEMPERATURE]
    if warm.size:
        reported += [
            _report("IAPWS-95", "saturation_pressure", warm, label="vapor pressure (liquid)"),
            _report(
                "IAPWS-95", "enthalpy_of_vaporization", warm, label="latent heat of vaporization"
            ),
        ]
    cold = t[t < constants.TRIPLE_POINT_TEMPERATURE]
    if cold.size:
        line = sources.MELTING_AND_SUBLIMATION.formulation
        ice = sources.ICE_IH.formulation
        reported += [
            _report(line, "sublimation_pressure", cold, label="vapor pressure (ice)"),
            _report(ice, "enthalpy_of_sublimation", cold, label="latent heat of sublimation"),
        ]
    return reported


def _given(pressure: FloatArray | None) -> FloatArray:
    if pressure is None:
        raise InvalidInputError(
            "temperature, pressure", "give exactly one of temperature or pressure"
        )
    return pressure


def _batch(*arrays: FloatArray | None) -> bool:
    return any(array is not None and np.ndim(array) > 0 and np.size(array) > 1 for array in arrays)


_SATURATION_REPORTS: Final = (
    # quantity in the uncertainty table, field of the answer it is reported for
    ("saturation_pressure", "pressure"),
    ("saturated_liquid_density", "liquid.density"),
    ("saturated_vapor_density", "vapor.density"),
    ("enthalpy_of_vaporization", "latent_heat_of_vaporization"),
)
_DIVERGES: Final = (
    "At the critical point the isobaric heat capacity is infinite; it is reported as null."
)
_NEAR_CRITICAL: Final = (
    "Within 1 K of the critical point: liquid and vapor properties converge, heat "
    "capacities grow without bound and uncertainties are larger."
)


def saturation_lookup(
    *,
    temperature: FloatArray | None = None,
    pressure: FloatArray | None = None,
    formulation: Formulation = "IAPWS-95",
) -> Lookup[SaturationStates]:
    """Saturation states by temperature (K) or pressure (Pa), with sources and uncertainty."""
    if temperature is not None:
        states = saturation_by_temperature(temperature, formulation=formulation)
    else:
        states = saturation_by_pressure(_given(pressure), formulation=formulation)
    t = states.temperature
    batch = _batch(temperature, pressure)
    uncertainties = [
        _report(formulation, quantity, t, label=label) for quantity, label in _SATURATION_REPORTS
    ]
    advisories = advise_where(
        np.isposinf(states.liquid.specific_isobaric_heat_capacity)
        | np.isposinf(states.vapor.specific_isobaric_heat_capacity),
        "diverges",
        _DIVERGES,
        batch=batch,
    )
    advisories += advise_where(
        near_critical_point(t), "near-critical-point", _NEAR_CRITICAL, batch=batch
    )
    return Lookup(
        states=states,
        sources=(sources.source_for(formulation),),
        uncertainties=uncertainties,
        advisories=advisories,
        assumptions=[_PURE_WATER, _FLAT, _ABSOLUTE],
    )


def saturation_point_lookup(
    *, temperature: float, formulation: Formulation = "IAPWS-95"
) -> Lookup[SaturationPoint]:
    """:func:`saturation_lookup` for one temperature (K), on floats.

    The same states, uncertainties, advisories and sources as ``saturation_lookup``
    for a one-element temperature, built without arrays (see
    :func:`service.core.properties.saturation.saturation_point_by_temperature`).
    """
    point = saturation_point_by_temperature(temperature, formulation=formulation)
    t = point.temperature
    uncertainties = [
        _report_point(formulation, quantity, t, label=label)
        for quantity, label in _SATURATION_REPORTS
    ]
    advisories = []
    if math.isinf(point.liquid.specific_isobaric_heat_capacity) or math.isinf(
        point.vapor.specific_isobaric_heat_capacity
    ):
        advisories.append(Advisory(code="diverges", message=_DIVERGES))
    if abs(t - constants.CRITICAL_TEMPERATURE) <= NEAR_CRITICAL_TEMPERATURE_BAND:
        advisories.append(Advisory(code="near-critical-point", message=_NEAR_CRITICAL))
    return Lookup(
        states=point,
        sources=(sources.source_for(formulation),),
        uncertainties=uncertainties,
        advisories=advisories,
        assumptions=[_PURE_WATER, _FLAT, _ABSOLUTE],
    )


def sublimation_lookup(
    *, temperature: FloatArray | None = None, pressure: FloatArray | None = None
) -> Lookup[SublimationStates]:
    """Ice Ih-vapor equilibrium by temperature (K) or pressure (Pa)."""
    if temperature is not None:
        states = sublimation_by_temperature(temperature)
    else:
        states = sublimation_by_pressure(_given(pressure))
    t = states.temperature
    line = sources.MELTING_AND_SUBLIMATION.formulation
    ice = sources.ICE_IH.formulation
    uncertainties = [
        _report(line, "sublimation_pressure", t, label="pressure"),
        _report(ice, "ice_density", t, label="ice.density"),
        _report(ice, "ice_enthalpy", t, label="ice.specific_enthalpy"),
        _report(ice, "enthalpy_of_sublimation", t, label="latent_heat_of_sublimation"),
    ]
    cold = t < LOW_TEMPERATURE_VAPOR_LIMIT
    advisories = advise_where(
        cold,
        "low-temperature-extension",
        f"Below {LOW_TEMPERATURE_VAPOR_LIMIT:g} K the vapor's ideal-gas part follows the IAPWS "
        "low-temperature extension of IAPWS-95 (Guideline, 2012), and the sublimation pressure "
        "is far less certain than near the triple point.",
        batch=_batch(temperature, pressure),
    )
    used: tuple[sources.PropertySource, ...] = (
        sources.MELTING_AND_SUBLIMATION,
        sources.ICE_IH,
        sources.IAPWS_95,
    )
    if cold.any():
        used += (sources.LOW_TEMPERATURE_VAPOR,)
    return Lookup(
        states=states,
        sources=used,
        uncertainties=uncertainties,
        advisories=advisories,
        assumptions=[_PURE_WATER, _FLAT, _ABSOLUTE, "Ice is hexagonal ice Ih."],
    )


def melting_lookup(
    *, temperature: FloatArray | None = None, pressure: FloatArray | None = None
) -> Lookup[MeltingStates]:
    """Ice Ih-liquid equilibrium by temperature (K) or pressure (Pa)."""
    if temperature is not None:
        states = melting_by_temperature(temperature)
    else:
        states = melting_by_pressure(_given(pressure))
    t = states.temperature
    line = sources.MELTING_AND_SUBLIMATION.formulation
    ice = sources.ICE_IH.formulation
    uncertainties = [
        _report(line, "melting_pressure", t, label="pressure"),
        _report(ice, "ice_density", t, label="ice.density"),
        _report(ice, "ice_enthalpy", t, label="ice.specific_enthalpy"),
    ]
    return Lookup(
        states=states,
        sources=(sources.MELTING_AND_SUBLIMATION, sources.ICE_IH, sources.IAPWS_95),
        uncertainties=uncertainties,
        advisories=[],
        assumptions=[_PURE_WATER, _FLAT, _ABSOLUTE, "Ice is hexagonal ice Ih."],
    )


def state_lookup(
    *,
    temperature: FloatArray,
    pressure: FloatArray,
    phase: Literal["liquid", "vapor", "ice"] | None = None,
    formulation: Formulation = "IAPWS-95",
) -> Lookup[PointStates]:
    """Phase and properties at (temperature K, pressure Pa); see :func:`state_at`."""
    states = state_at(temperature, pressure, phase=phase, formulation=formulation)
    properties = states.properties
    uncertainties: list[ReportedUncertainty] = []
    liquid = states.phase == "liquid"
    if liquid.any():
        uncertainties.append(
            _report(
                formulation,
                "liquid_density",
                properties.temperature[liquid],
                properties.pressure[liquid],
                label="properties.density (liquid)",
            )
        )
    ice = states.phase == "ice"
    if ice.any():
        uncertainties.append(
            _report(
                sources.ICE_IH.formulation,
                "ice_density",
                properties.temperature[ice],
                label="properties.density (ice)",
            )
        )
    return Lookup(
        states=states,
        sources=states.sources,
        uncertainties=uncertainties,
        advisories=states.advisories,
        assumptions=[_PURE_WATER, _ABSOLUTE, "Single phase at the given temperature and pressure."],
    )


def constants_lookup() -> Lookup[ConstantValues]:
    """Fixed points and latent heats at the triple point (from the core's formulations)."""
    return Lookup(
        states=_constant_values(),
        sources=(
            sources.IAPWS_95,
            sources.ICE_IH,
            sources.MELTING_AND_SUBLIMATION,
        ),
        uncertainties=[],
        advisories=[],
        assumptions=[_PURE_WATER],
    )


@functools.cache
def _constant_values() -> ConstantValues:
    """The values of :func:`constants_lookup`, computed once per process."""
    triple = np.array([constants.TRIPLE_POINT_TEMPERATURE])
    vaporization = saturation_by_temperature(triple).latent_heat_of_vaporization
    sublimation = sublimation_by_temperature(triple).latent_heat_of_sublimation
    fusion = melting_by_temperature(triple).latent_heat_of_fusion
    return ConstantValues(
        triple_point_temperature=constants.TRIPLE_POINT_TEMPERATURE,
        triple_point_pressure=constants.TRIPLE_POINT_PRESSURE,
        critical_temperature=constants.CRITICAL_TEMPERATURE,
        critical_pressure=constants.CRITICAL_PRESSURE,
        critical_density=constants.CRITICAL_DENSITY,
        specific_gas_constant=constants.SPECIFIC_GAS_CONSTANT,
        molar_mass=constants.MOLAR_MASS,
        latent_heat_of_vaporization=float(vaporization[0]),
        latent_heat_of_sublimation=float(sublimation[0]),
        latent_heat_of_fusion=float(fusion[0]),
    )
