"""A state at given temperature and pressure: its stable (or requested) phase and properties.

Phase map (all pressures absolute), with p_sat, p_sub, p_melt from the core:

- T > T_c: ``supercritical`` if p > p_c, else ``vapor``;
- T_t <= T <= T_c: ``vapor`` if p < p_sat(T), else ``liquid``;
- T < T_t: ``vapor`` if p < p_sub(T); ``liquid`` if T >= 251.165 K and p > p_melt(T);
  otherwise ``ice`` (ice Ih).

Pressures are limited to 100 MPa, below the ice Ih / ice III boundary (about 209.9 MPa),
so ice Ih is the only solid phase that can occur.
"""

from __future__ import annotations

from dataclasses import dataclass
from typing import Final, Literal

import numpy as np
from numpy.typing import ArrayLike, NDArray

from service.core.errors import UnsupportedStateError
from service.core.properties import sources
from service.core.properties.advisories import Advisory, advise_where, near_critical_point
from service.core.properties.constants import (
    CRITICAL_PRESSURE,
    CRITICAL_TEMPERATURE,
    TRIPLE_POINT_PRESSURE,
    TRIPLE_POINT_TEMPERATURE,
)
from service.core.properties.helmholtz import MAXIMUM_TEMPERATURE as IAPWS95_MAXIMUM_TEMPERATURE
from service.core.properties.helmholtz import MINIMUM_TEMPERATURE_LIQUID, fluid_properties_at
from service.core.properties.ice import ice_properties
from service.core.properties.ice_coefficients import (
    MELTING_MINIMUM_TEMPERATURE,
    SUBLIMATION_MINIMUM_TEMPERATURE,
)
from service.core.properties.if97 import (
    IF97_REGION1_MAXIMUM_TEMPERATURE,
    if97_b23_pressure,
    if97_liquid_properties,
    if97_vapor_properties,
)
from service.core.properties.phase import FloatArray, PhaseProperties
from service.core.properties.phase_lines import melting_pressure, sublimation_pressure
from service.core.properties.saturation import Formulation, saturation_pressure
from service.core.validation import (
    beyond_maximum,
    beyond_minimum,
    broadcast_pair,
    finite_array,
    require_within,
)

__all__ = [
    "MAXIMUM_PRESSURE",
    "MAXIMUM_TEMPERATURE",
    "MINIMUM_TEMPERATURE",
    "PointStates",
    "state_at",
]

Phase = Literal["liquid", "vapor", "ice"]

MINIMUM_TEMPERATURE: Final = SUBLIMATION_MINIMUM_TEMPERATURE
"""K (50 K). Lowest temperature served: the low end of the R14-08 sublimation curve."""
MAXIMUM_TEMPERATURE: Final = IAPWS95_MAXIMUM_TEMPERATURE
"""K (1273 K). Upper validity limit of IAPWS-95 (R6-95(2018), range of validity;
section number not verified)."""
MAXIMUM_PRESSURE: Final = 100.0e6
"""Pa. Kept below the ice Ih / ice III boundary so ice Ih is the only solid."""
SUPERCOOLED_LIQUID_MINIMUM_TEMPERATURE: Final = MINIMUM_TEMPERATURE_LIQUID
"""K (235 K). Metastable liquid is served down to about the homogeneous nucleation temperature
at ambient pressure, where IAPWS-95 is documented to extrapolate reasonably (R6-95(2018), on
extrapolation; section number not verified)."""
LOWEST_MELTING_TEMPERATURE: Final = MELTING_MINIMUM_TEMPERATURE
"""K (251.165 K). Ice Ih - ice III - liquid triple point, lower end of the ice Ih melting
curve (R14-08)."""

_CODES: Final = np.array(["liquid", "vapor", "ice", "supercritical"], dtype=object)
_LIQUID, _VAPOR, _ICE, _SUPERCRITICAL = 0, 1, 2, 3
_FLUID_BRANCHES: Final[tuple[tuple[int, Literal["liquid", "vapor"]], ...]] = (
    (_LIQUID, "liquid"),
    (_VAPOR, "vapor"),
    (_SUPERCRITICAL, "liquid"),
)


@dataclass(frozen=True)
class PointStates:
    """States at (temperature, pressure).

    Attributes
    ----------
    phase : ndarray of str
        ``liquid``, ``vapor``, ``ice`` or ``supercritical`` per element.
    properties : PhaseProperties
        Properties of that phase at each state (SI).
    metastable : ndarray of bool
        True where the requested phase is not the stable one.
    advisories : list of Advisory
    sources : tuple of PropertySource
        Formulations used.
    """

    phase: NDArray[np.object_]
    properties: PhaseProperties
    metastable: NDArray[np.bool_]
    advisories: list[Advisory]
    sources: tuple[sources.PropertySource, ...]


def _stable_phase(temperature: FloatArray, pressure: FloatArray) -> NDArray[np.int8]:
    code = np.full(temperature.shape, _LIQUID, dtype=np.int8)
    above = temperature > CRITICAL_TEMPERATURE
    code[above & (pressure > CRITICAL_PRESSURE)] = _SUPERCRITICAL
    code[above & (pressure <= CRITICAL_PRESSURE)] = _VAPOR
    fluid = (temperature >= TRIPLE_POINT_TEMPERATURE) & ~above
    if fluid.any():
        boiling = saturation_pressure(temperature[fluid])
        code[np.flatnonzero(fluid)[pressure[fluid] < boiling]] = _VAPOR
    cold = temperature < TRIPLE_POINT_TEMPERATURE
    if cold.any():
        cold_index = np.flatnonzero(cold)
        code[cold_index] = _ICE
        frost = sublimation_pressure(temperature[cold])
        code[cold_index[pressure[cold] < frost]] = _VAPOR
        meltable = cold & (temperature >= LOWEST_MELTING_TEMPERATURE)
        if meltable.any():
            melt_index = np.flatnonzero(meltable)
            melting = melting_pressure(temperature[meltable])
            code[melt_index[pressure[meltable] > melting]] = _LIQUID
    return code


def _requested_codes(
    stable: NDArray[np.int8], temperature: FloatArray, pressure: FloatArray, phase: Phase | None
) -> NDArray[np.int8]:
    if phase is None:
        return stable
    wanted = {"liquid": _LIQUID, "vapor": _VAPOR, "ice": _ICE}[phase]
    code = np.full(stable.shape, wanted, dtype=np.int8)
    supercritical = stable == _SUPERCRITICAL
    if supercritical.any():
        index = int(np.flatnonzero(supercritical.ravel())[0])
        raise UnsupportedStateError(
            "phase",
            f"element {index} is supercritical (T > {CRITICAL_TEMPERATURE} K, "
            f"p > {CRITICAL_PRESSURE:.6g} Pa): there is no distinct {phase} phase; omit `phase`",
            phase,
        )
    if phase == "ice":
        # At the triple point (R14-08: 273.16 K, 611.657 Pa) ice coexists with liquid and
        # vapor; at 273.16 K it melts above that pressure (the melting curve falls).
        at_triple_point = ~beyond_maximum(temperature, TRIPLE_POINT_TEMPERATURE) & ~beyond_maximum(
            pressure, TRIPLE_POINT_PRESSURE
        )
        not_ice = ((stable == _LIQUID) & ~at_triple_point) | beyond_maximum(
            temperature, TRIPLE_POINT_TEMPERATURE
        )
        if not_ice.any():
            index = int(np.flatnonzero(not_ice.ravel())[0])
            raise UnsupportedStateError(
                "phase",
                f"element {index}: ice Ih above its melting curve (superheated ice) is not "
                "modelled; omit `phase` for the stable phase",
                phase,
            )
    if phase == "liquid":
        too_cold = temperature < SUPERCOOLED_LIQUID_MINIMUM_TEMPERATURE
        if too_cold.any():
            index = int(np.flatnonzero(too_cold.ravel())[0])
            raise UnsupportedStateError(
                "phase",
                f"element {index}: supercooled liquid is served down to "
                f"{SUPERCOOLED_LIQUID_MINIMUM_TEMPERATURE} K only (about the homogeneous "
                f"nucleation temperature); got {float(temperature.ravel()[index]):.6g} K",
                phase,
            )
    return code


def _fluid(
    temperature: FloatArray,
    pressure: FloatArray,
    branch: Literal["liquid", "vapor"],
    formulation: Formulation,
) -> PhaseProperties:
    if formulation == "IAPWS-IF97":
        if branch == "vapor":
            return if97_vapor_properties(temperature, pressure)
        # The dense branch above 623.15 K and up to the B23 boundary is IF97's region 2
        # (e.g. the region-2 check point 700 K, 30 MPa of R7-97(2012) Table 15).
        hot = temperature > IF97_REGION1_MAXIMUM_TEMPERATURE
        region2 = np.zeros(temperature.shape, dtype=bool)
        if hot.any():
            region2[hot] = pressure[hot] <= if97_b23_pressure(temperature[hot])
        if not region2.any():
            return if97_liquid_properties(temperature, pressure)
        parts = [
            (
                np.flatnonzero(region2),
                if97_vapor_properties(temperature[region2], pressure[region2]),
            )
        ]
        if (~region2).any():
            rest = ~region2
            parts.append(
                (np.flatnonzero(rest), if97_liquid_properties(temperature[rest], pressure[rest]))
            )
        return _assemble(parts, temperature.size)
    return fluid_properties_at(temperature, pressure, phase=branch)


def _assemble(parts: list[tuple[NDArray[np.intp], PhaseProperties]], size: int) -> PhaseProperties:
    names = (
        "temperature",
        "pressure",
        "density",
        "specific_enthalpy",
        "specific_internal_energy",
        "specific_entropy",
        "specific_isobaric_heat_capacity",
    )
    columns = {name: np.empty(size, dtype=np.float64) for name in names}
    for index, properties in parts:
        for name in names:
            columns[name][index] = np.ravel(getattr(properties, name))
    return PhaseProperties(**columns)


def state_at(
    temperature: ArrayLike,
    pressure: ArrayLike,
    *,
    phase: Phase | None = None,
    formulation: Formulation = "IAPWS-95",
) -> PointStates:
    """Phase and properties of water substance at given temperature and pressure.

    Parameters
    ----------
    temperature : array_like
        K, 50 K to 1273 K.
    pressure : array_like
        Pa (absolute), above 0 and up to 100 MPa. Broadcast against ``temperature``.
    phase : {"liquid", "vapor", "ice"}, optional
        Ask for a phase where it is metastable (supercooled liquid down to 235 K,
        supersaturated vapor, ice below its sublimation pressure). Omit for the stable phase.
    formulation : {"IAPWS-95", "IAPWS-IF97"}
        Fluid formulation; ice always uses IAPWS R10-06. IF97 covers regions 1 and 2 only.

    Returns
    -------
    PointStates
        Flattened to 1-D in C order.

    Raises
    ------
    InvalidInputError, OutOfRangeError, UnsupportedStateError, NotConvergedError

    References
    ----------
    IAPWS R6-95(2018); IAPWS R7-97(2012); IAPWS R10-06(2009); IAPWS R14-08(2011).

    Examples
    --------
    >>> result = state_at(293.15, 101325.0)
    >>> str(result.phase[0]), round(float(result.properties.density[0]), 2)
    ('liquid', 998.21)
    """
    t, p = broadcast_pair(
        finite_array(temperature, "temperature"), finite_array(pressure, "pressure"), "pressure"
    )
    t, p = t.ravel(), p.ravel()
    reason = "tripoint serves states from 50 K to 1273 K and up to 100 MPa"
    require_within(t, "temperature", MINIMUM_TEMPERATURE, MAXIMUM_TEMPERATURE, "K", reason)
    require_within(p, "pressure", 0.0, MAXIMUM_PRESSURE, "Pa", reason, exclusive_minimum=True)
    batch = np.ndim(temperature) > 0 or np.ndim(pressure) > 0
    stable = _stable_phase(t, p)
    code = _requested_codes(stable, t, p, phase)
    parts: list[tuple[NDArray[np.intp], PhaseProperties]] = []
    used: list[sources.PropertySource] = []
    # Supercritical states are solved on the dense (liquid) branch of the fluid.
    for value, branch in _FLUID_BRANCHES:
        index = np.flatnonzero(code == value)
        if index.size:
            parts.append((index, _fluid(t[index], p[index], branch, formulation)))
            used.append(sources.source_for(formulation))
    ice_index = np.flatnonzero(code == _ICE)
    if ice_index.size:
        parts.append((ice_index, ice_properties(t[ice_index], p[ice_index])))
        used.append(sources.ICE_IH)
    metastable = code != stable
    labels = _CODES[code]
    advisories = advise_where(
        metastable,
        "metastable",
        f"The requested {phase} phase is metastable here (the stable phase differs); "
        "such states exist only until nucleation.",
        batch=batch,
    )
    advisories += advise_where(
        near_critical_point(t, p),
        "near-critical-point",
        "Within 1 K and 1 % of the critical point: heat capacity and compressibility change "
        "steeply and the formulation's uncertainty is larger.",
        batch=batch,
    )
    fluid = (code == _LIQUID) | (code == _VAPOR)
    advisories += advise_where(
        fluid & beyond_minimum(t, TRIPLE_POINT_TEMPERATURE, exclusive=False),
        "extrapolated",
        "Liquid or vapor below 273.16 K: IAPWS-95 is fitted to data at and above the "
        "melting and sublimation lines, so here it is extrapolated (into supercooled liquid "
        "or vapor over ice); its stated uncertainty does not cover these states, and the "
        "values carry more doubt the further below 273.16 K they lie.",
        batch=batch,
    )
    unique_sources = tuple(dict.fromkeys(used))
    return PointStates(
        phase=labels,
        properties=_assemble(parts, t.size),
        metastable=metastable,
        advisories=advisories,
        sources=unique_sources,
    )
