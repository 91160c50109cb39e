"""Liquid-vapor saturation of water: the fast, vectorized public path.

For IAPWS-95 the saturation properties come from piecewise Chebyshev tables
(:mod:`service.core.properties.chebyshev`) fitted to the exact phase-equilibrium solution
of :func:`service.core.properties.helmholtz.solve_saturation`, the idea of the IAPWS
spline-based table look-up method (IAPWS G13-15). The tables are built lazily,
once per process (``functools.cache``), from about 1,000 exact solutions; this
takes well under a second (about 0.04 s), so no generated coefficients are
shipped and nothing can drift out of date with the equation of state.

Within :data:`CRITICAL_FALLBACK_BAND` of the critical temperature (and for
pressures above the saturation pressure at its lower edge), where saturation
properties steepen towards the critical singularity, every element is computed
by the exact solver instead.

Accuracy of the tables against the exact IAPWS-95 solution (measured over
20,001 points from the triple to the critical point,
tests/core/test_saturation_fast_path.py): pressure 3e-13, densities 6e-12,
vapor enthalpy, internal energy and entropy 2e-12, latent heat 2e-11, isobaric
heat capacities 1.5e-10 (all relative); the liquid values that pass through zero
at the triple point to 1.5e-6 J/kg (h', u') and 2.3e-9 J/(kg K) (s') absolute
(1e-11 relative above 280 K); round trip temperature -> pressure -> temperature
1.2e-11 K. Tables: 96 segments of degree 10 in x = ln(T_c - T) (properties) and
32 segments of degree 10 in ln(p / (p_c - p)) (inverse), built in about 0.04 s.

For IAPWS-IF97 the explicit region-4 saturation equations and the region-1 and
region-2 equations of :mod:`service.core.properties.if97` are used, from 273.15 K to
623.15 K (region 3, closer to the critical point, is not supported here).
"""

from __future__ import annotations

import functools
from dataclasses import dataclass, replace
from typing import Any, Final, Literal, TypeVar

import numpy as np
from numpy.typing import ArrayLike

from service.core.errors import InvalidInputError, NotConvergedError
from service.core.properties.chebyshev import PiecewiseChebyshev, fit_piecewise_chebyshev
from service.core.properties.constants import (
    CRITICAL_PRESSURE,
    CRITICAL_TEMPERATURE,
    TRIPLE_POINT_TEMPERATURE,
)
from service.core.properties.helmholtz import fluid_properties, solve_saturation
from service.core.properties.if97 import (
    IF97_MINIMUM_TEMPERATURE,
    IF97_SATURATION_MINIMUM_PRESSURE,
    if97_liquid_properties,
    if97_saturation_pressure,
    if97_saturation_temperature,
    if97_vapor_properties,
)
from service.core.properties.if97 import (
    IF97_REGION1_MAXIMUM_TEMPERATURE as IF97_MAXIMUM_TEMPERATURE,
)
from service.core.properties.phase import FloatArray, PhasePoint, PhaseProperties
from service.core.validation import finite_array, require_within

__all__ = [
    "CRITICAL_FALLBACK_BAND",
    "Formulation",
    "SaturationPoint",
    "SaturationStates",
    "saturation_by_pressure",
    "saturation_by_temperature",
    "saturation_point_by_temperature",
    "saturation_pressure",
    "saturation_temperature",
]

Formulation = Literal["IAPWS-95", "IAPWS-IF97"]

CRITICAL_FALLBACK_BAND: Final = 0.5
"""K; for T > T_c - 0.5 K the exact IAPWS-95 solver replaces the tables."""

_IF97_MAXIMUM_PRESSURE: Final = float(if97_saturation_pressure(IF97_MAXIMUM_TEMPERATURE))
"""Pa, IF97 saturation pressure at 623.15 K, where regions 1/2 meet region 3."""
_IF97_REGION3_REASON: Final = (
    "IAPWS-IF97 saturation above 623.15 K needs region 3, which is not "
    "supported here; use formulation='IAPWS-95'"
)
_IF97_LOW_REASON: Final = "the IAPWS-IF97 saturation line starts at 273.15 K"

_TABLE_SEGMENTS: Final = 96
_TABLE_DEGREE: Final = 10
_INVERSE_SEGMENTS: Final = 32
_INVERSE_DEGREE: Final = 10
_TEMPERATURE_ROUNDOFF: Final = 1e-9
"""K; inputs this close outside the temperature range are taken as the limit."""
_PRESSURE_ROUNDOFF: Final = 1e-12
"""Relative; inputs this close outside the pressure range are taken as the limit."""
_EXACT_TOLERANCE_K: Final = 1e-11
_EXACT_MAX_ITERATIONS: Final = 30


@dataclass(frozen=True)
class SaturationStates:
    """Coexisting liquid and vapor at a set of saturation states.

    Attributes
    ----------
    temperature : ndarray
        Saturation temperature, K.
    pressure : ndarray
        Saturation pressure, Pa.
    liquid : PhaseProperties
        Saturated liquid.
    vapor : PhaseProperties
        Saturated vapor.
    latent_heat_of_vaporization : ndarray
        h_vapor - h_liquid, J/kg; zero at the critical point.
    """

    temperature: FloatArray
    pressure: FloatArray
    liquid: PhaseProperties
    vapor: PhaseProperties
    latent_heat_of_vaporization: FloatArray


@dataclass(frozen=True)
class SaturationPoint:
    """Coexisting liquid and vapor at one saturation state, as Python floats (SI).

    The fields of :class:`SaturationStates`, for one state.
    """

    temperature: float
    pressure: float
    liquid: PhasePoint
    vapor: PhasePoint
    latent_heat_of_vaporization: float

    @classmethod
    def first_of(cls, states: SaturationStates) -> SaturationPoint:
        """The first state of ``states``."""
        return cls(
            temperature=float(states.temperature.flat[0]),
            pressure=float(states.pressure.flat[0]),
            liquid=PhasePoint.first_of(states.liquid),
            vapor=PhasePoint.first_of(states.vapor),
            latent_heat_of_vaporization=float(states.latent_heat_of_vaporization.flat[0]),
        )


# ---------------------------------------------------------------------------------------
# IAPWS-95 tables
# ---------------------------------------------------------------------------------------


def _to_fitted(temperature: FloatArray) -> FloatArray:
    """x = ln(T_c - T): power laws in T_c - T become smooth exponentials in x."""
    result: FloatArray = np.log(CRITICAL_TEMPERATURE - temperature)
    return result


def _from_fitted(x: FloatArray) -> FloatArray:
    result: FloatArray = CRITICAL_TEMPERATURE - np.exp(x)
    return result


_TABLE_TEMPERATURE_LIMIT: Final = CRITICAL_TEMPERATURE - CRITICAL_FALLBACK_BAND


def _exact_columns(temperature: FloatArray) -> FloatArray:
    """Exact saturation properties as rows: ln p, rho', ln rho'', h', h'', s', s'', cp', cp''."""
    liquid, vapor = _exact_phases(temperature)
    return np.stack(
        [
            np.log(liquid.pressure),
            liquid.density,
            np.log(vapor.density),
            liquid.specific_enthalpy,
            vapor.specific_enthalpy,
            liquid.specific_entropy,
            vapor.specific_entropy,
            liquid.specific_isobaric_heat_capacity,
            vapor.specific_isobaric_heat_capacity,
        ]
    )


def _exact_phases(temperature: FloatArray) -> tuple[PhaseProperties, PhaseProperties]:
    """Exact IAPWS-95 saturated liquid and vapor at 1-D temperatures."""
    solution = solve_saturation(temperature)
    if not np.all(solution.converged):
        raise NotConvergedError(
            solver="IAPWS-95 saturation (phase equilibrium)",
            iterations=int(solution.iterations.max()),
            residual=float("nan"),
            count=int(np.count_nonzero(~solution.converged)),
        )
    liquid = fluid_properties(solution.liquid_density, temperature)
    vapor = fluid_properties(solution.vapor_density, temperature)
    # Both phases at the one equilibrium pressure (the vapor-side value).
    # h = u + p / rho with the equilibrium pressure: the liquid's own p(rho', T)
    # carries round-off of ~1e-4 Pa near the triple point.
    liquid, vapor = (
        replace(
            phase,
            pressure=solution.pressure,
            specific_enthalpy=phase.specific_internal_energy + solution.pressure / phase.density,
        )
        for phase in (liquid, vapor)
    )
    return liquid, vapor


@dataclass(frozen=True)
class _Tables:
    properties: PiecewiseChebyshev
    """Rows of :func:`_exact_columns` as functions of x = ln(T_c - T)."""
    log_pressure: PiecewiseChebyshev
    """ln p alone (with derivative) as a function of x."""
    temperature: PiecewiseChebyshev
    """x = ln(T_c - T) as a function of the pressure (fitted in ln(p / (p_c - p)))."""
    minimum_pressure: float
    """IAPWS-95 saturation pressure at 273.16 K, Pa."""
    maximum_table_pressure: float
    """Saturation pressure at the lower edge of the critical fallback band, Pa."""


@functools.cache
def _tables() -> _Tables:
    """Build the IAPWS-95 saturation tables (once per process)."""
    lower = float(np.log(CRITICAL_FALLBACK_BAND))
    upper = float(np.log(CRITICAL_TEMPERATURE - TRIPLE_POINT_TEMPERATURE))
    properties = fit_piecewise_chebyshev(
        _exact_columns,
        lower,
        upper,
        segment_count=_TABLE_SEGMENTS,
        degree=_TABLE_DEGREE,
        transform=_to_fitted,
        inverse_transform=_from_fitted,
    )
    log_pressure = PiecewiseChebyshev(
        lower=properties.lower,
        upper=properties.upper,
        coefficients=np.ascontiguousarray(properties.coefficients[:, :1, :]),
        derivative_coefficients=np.ascontiguousarray(properties.derivative_coefficients[:, :1, :]),
        transform=_to_fitted,
    )
    limits = np.exp(log_pressure(np.array([TRIPLE_POINT_TEMPERATURE, _TABLE_TEMPERATURE_LIMIT]))[0])
    # Inverse: x = ln(T_c - T) as a function of y = ln(p / (p_c - p)), which is
    # ln p at low pressure and -ln(p_c - p) near the critical point, so x(y) is
    # smooth at both ends. Nodes: coarse interpolation, then Newton on the ln p
    # table, so that the inverse is consistent with the forward table.
    grid = np.linspace(lower, upper, 4001)
    grid_log_p = log_pressure(_from_fitted(grid))[0]
    order = np.argsort(grid_log_p)

    def fitted_of_pressure(pressure: FloatArray) -> FloatArray:
        log_p = np.log(pressure)
        x = np.interp(log_p, grid_log_p[order], grid[order])
        for _ in range(4):
            x = x - _log_pressure_residual(log_pressure, x, log_p)
        return x

    temperature = fit_piecewise_chebyshev(
        fitted_of_pressure,
        float(_pressure_to_fitted(limits[:1])[0]),
        float(_pressure_to_fitted(limits[1:])[0]),
        segment_count=_INVERSE_SEGMENTS,
        degree=_INVERSE_DEGREE,
        transform=_pressure_to_fitted,
        inverse_transform=_pressure_from_fitted,
    )
    return _Tables(
        properties=properties,
        log_pressure=log_pressure,
        temperature=temperature,
        minimum_pressure=float(limits[0]),
        maximum_table_pressure=float(limits[1]),
    )


def _pressure_to_fitted(pressure: FloatArray) -> FloatArray:
    """y = ln(p / (p_c - p)), for p < p_c."""
    result: FloatArray = np.log(pressure) - np.log(CRITICAL_PRESSURE - pressure)
    return result


def _pressure_from_fitted(y: FloatArray) -> FloatArray:
    result: FloatArray = CRITICAL_PRESSURE / (1.0 + np.exp(-y))
    return result


def _log_pressure_residual(
    table: PiecewiseChebyshev, x: FloatArray, log_p: FloatArray
) -> FloatArray:
    """Newton step in x for ln p_table(x) = log_p."""
    t = _from_fitted(x)
    value = table(t)[0]
    slope = table.derivative(t)[0]
    step: FloatArray = (value - log_p) / slope
    return step


_PhaseT = TypeVar("_PhaseT", PhaseProperties, PhasePoint)


def _phases_from_columns(
    make: type[_PhaseT],
    temperature: Any,
    pressure: Any,
    columns: Any,
    vapor_density: Any,
) -> tuple[_PhaseT, _PhaseT]:
    """Saturated liquid and vapor from the table's rows (see :func:`_exact_columns`), for
    arrays (``PhaseProperties``) or one state's floats (``PhasePoint``) alike."""
    liquid_density = columns[1]
    liquid = make(
        temperature=temperature,
        pressure=pressure,
        density=liquid_density,
        specific_enthalpy=columns[3],
        specific_internal_energy=columns[3] - pressure / liquid_density,
        specific_entropy=columns[5],
        specific_isobaric_heat_capacity=columns[7],
    )
    vapor = make(
        temperature=temperature,
        pressure=pressure,
        density=vapor_density,
        specific_enthalpy=columns[4],
        specific_internal_energy=columns[4] - pressure / vapor_density,
        specific_entropy=columns[6],
        specific_isobaric_heat_capacity=columns[8],
    )
    return liquid, vapor


def _states_from_columns(temperature: FloatArray, columns: FloatArray) -> SaturationStates:
    # exp(ln p_c) may round one unit above p_c; the critical pressure is the maximum.
    pressure = np.minimum(np.exp(columns[0]), CRITICAL_PRESSURE)
    liquid, vapor = _phases_from_columns(
        PhaseProperties, temperature, pressure, columns, np.exp(columns[2])
    )
    return SaturationStates(
        temperature=temperature,
        pressure=pressure,
        liquid=liquid,
        vapor=vapor,
        latent_heat_of_vaporization=columns[4] - columns[3],
    )


def _point_from_columns(temperature: float, columns: list[float]) -> SaturationPoint:
    """:func:`_states_from_columns` for one state, on floats (numpy's exp, as there)."""
    pressure = min(float(np.exp(columns[0])), CRITICAL_PRESSURE)
    liquid, vapor = _phases_from_columns(
        PhasePoint, temperature, pressure, columns, float(np.exp(columns[2]))
    )
    return SaturationPoint(
        temperature=temperature,
        pressure=pressure,
        liquid=liquid,
        vapor=vapor,
        latent_heat_of_vaporization=columns[4] - columns[3],
    )


def _iapws95_states(temperature: FloatArray) -> SaturationStates:
    """States at 1-D temperatures: tables, and the exact solver near T_c."""
    tables = _tables()
    near_critical = temperature > _TABLE_TEMPERATURE_LIMIT
    if not np.any(near_critical):
        return _states_from_columns(temperature, tables.properties(temperature))
    states = _states_from_columns(
        temperature, tables.properties(np.minimum(temperature, _TABLE_TEMPERATURE_LIMIT))
    )
    # Values within 1e-9 K above T_c were accepted as T_c by the range check.
    liquid, vapor = _exact_phases(np.minimum(temperature[near_critical], CRITICAL_TEMPERATURE))
    states.pressure[near_critical] = liquid.pressure  # shared by both phases
    for name in (
        "density",
        "specific_enthalpy",
        "specific_internal_energy",
        "specific_entropy",
        "specific_isobaric_heat_capacity",
    ):
        getattr(states.liquid, name)[near_critical] = getattr(liquid, name)
        getattr(states.vapor, name)[near_critical] = getattr(vapor, name)
    states.latent_heat_of_vaporization[near_critical] = (
        vapor.specific_enthalpy - liquid.specific_enthalpy
    )
    return states


def _iapws95_temperature(pressure: FloatArray) -> FloatArray:
    """Saturation temperature at 1-D pressures (table + one Newton polish, or exact)."""
    tables = _tables()
    log_p = np.log(pressure)
    near_critical = pressure > tables.maximum_table_pressure
    x = tables.temperature(np.minimum(pressure, tables.maximum_table_pressure))[0]
    x = x - _log_pressure_residual(tables.log_pressure, x, log_p)
    temperature = _from_fitted(x)
    if np.any(near_critical):
        temperature[near_critical] = _exact_temperature(pressure[near_critical])
    return temperature


def _exact_temperature(pressure: FloatArray) -> FloatArray:
    """Exact IAPWS-95 saturation temperature by Newton with the Clapeyron slope.

    For pressures above the table range (the last 0.5 K below T_c); the
    critical pressure maps to T_c exactly.
    """
    tables = _tables()
    temperature = np.full(pressure.shape, CRITICAL_TEMPERATURE)
    active = np.flatnonzero(pressure < CRITICAL_PRESSURE)
    # Start on the chord between the table edge and the critical point.
    fraction = (CRITICAL_PRESSURE - pressure[active]) / (
        CRITICAL_PRESSURE - tables.maximum_table_pressure
    )
    temperature[active] = CRITICAL_TEMPERATURE - CRITICAL_FALLBACK_BAND * fraction
    previous = np.full(pressure.shape, np.inf)
    iterations = 0
    for iterations in range(1, _EXACT_MAX_ITERATIONS + 1):  # noqa: B007
        if active.size == 0:
            break
        t = temperature[active]
        liquid, vapor = _exact_phases(t)
        slope = (vapor.specific_enthalpy - liquid.specific_enthalpy) / (
            t * (1.0 / vapor.density - 1.0 / liquid.density)
        )
        new = t - (liquid.pressure - pressure[active]) / slope
        # Keep the iterate below T_c: halve the distance instead of crossing it.
        new = np.where(new < CRITICAL_TEMPERATURE, new, 0.5 * (t + CRITICAL_TEMPERATURE))
        temperature[active] = new
        change = np.abs(new - t)
        # Near T_c the exact pressure carries round-off of ~1e-13 relative, i.e.
        # ~1e-10 K in temperature: a step that no longer halves below 1e-8 K is noise.
        stalled = (change <= 1e-8) & (change >= 0.5 * previous[active])
        previous[active] = change
        done = (change <= _EXACT_TOLERANCE_K) | stalled
        active = active[~done]
    if active.size:
        raise NotConvergedError(
            solver="IAPWS-95 saturation temperature near the critical point",
            iterations=iterations,
            residual=float(np.max(previous[active])),
            count=int(active.size),
        )
    return temperature


# ---------------------------------------------------------------------------------------
# Validation and formulation dispatch
# ---------------------------------------------------------------------------------------


def _check_formulation(formulation: str) -> None:
    if formulation not in ("IAPWS-95", "IAPWS-IF97"):
        raise InvalidInputError("formulation", "must be 'IAPWS-95' or 'IAPWS-IF97'", formulation)


def _snap_to_limits(
    values: FloatArray, minimum: float, maximum: float, tolerance: float, relative: bool = False
) -> FloatArray:
    """Move values within ``tolerance`` outside [minimum, maximum] onto the limit.

    Unit conversions leave round-off at the range ends (0.01 degC + 273.15 is
    273.15999999999997 K); such values are taken as the limit itself. Anything
    farther outside is left for the range check to reject.
    """
    low = tolerance * minimum if relative else tolerance
    high = tolerance * maximum if relative else tolerance
    snapped = np.where((values < minimum) & (values >= minimum - low), minimum, values)
    result: FloatArray = np.where(
        (snapped > maximum) & (snapped <= maximum + high), maximum, snapped
    )
    return result


def _validated_temperature(temperature: ArrayLike, formulation: str) -> FloatArray:
    _check_formulation(formulation)
    temp = finite_array(temperature, "temperature")
    if formulation == "IAPWS-95":
        temp = _snap_to_limits(
            temp, TRIPLE_POINT_TEMPERATURE, CRITICAL_TEMPERATURE, _TEMPERATURE_ROUNDOFF
        )
        require_within(
            temp,
            "temperature",
            TRIPLE_POINT_TEMPERATURE,
            CRITICAL_TEMPERATURE,
            "K",
            "IAPWS-95 liquid-vapor saturation runs from the triple point to the critical point",
        )
    else:
        temp = _snap_to_limits(
            temp, IF97_MINIMUM_TEMPERATURE, IF97_MAXIMUM_TEMPERATURE, _TEMPERATURE_ROUNDOFF
        )
        _check_if97_temperature(temp)
    return temp


def _check_if97_temperature(temp: FloatArray) -> None:
    reason = _IF97_REGION3_REASON if np.any(temp > IF97_MAXIMUM_TEMPERATURE) else _IF97_LOW_REASON
    require_within(
        temp, "temperature", IF97_MINIMUM_TEMPERATURE, IF97_MAXIMUM_TEMPERATURE, "K", reason
    )


def _validated_pressure(pressure: ArrayLike, formulation: str) -> FloatArray:
    _check_formulation(formulation)
    pres = finite_array(pressure, "pressure")
    if formulation == "IAPWS-95":
        minimum = _tables().minimum_pressure
        pres = _snap_to_limits(pres, minimum, CRITICAL_PRESSURE, _PRESSURE_ROUNDOFF, relative=True)
        require_within(
            pres,
            "pressure",
            minimum,
            CRITICAL_PRESSURE,
            "Pa",
            "IAPWS-95 liquid-vapor saturation runs from its triple-point pressure "
            "(611.6548 Pa at 273.16 K) to the critical pressure",
        )
    else:
        low, high = IF97_SATURATION_MINIMUM_PRESSURE, _IF97_MAXIMUM_PRESSURE
        pres = _snap_to_limits(pres, low, high, _PRESSURE_ROUNDOFF, relative=True)
        reason = _IF97_REGION3_REASON if np.any(pres > high) else _IF97_LOW_REASON
        require_within(pres, "pressure", low, high, "Pa", reason)
    return pres


def _reshape_states(states: SaturationStates, shape: tuple[int, ...]) -> SaturationStates:
    def phase(properties: PhaseProperties) -> PhaseProperties:
        return PhaseProperties(
            temperature=properties.temperature.reshape(shape),
            pressure=properties.pressure.reshape(shape),
            density=properties.density.reshape(shape),
            specific_enthalpy=properties.specific_enthalpy.reshape(shape),
            specific_internal_energy=properties.specific_internal_energy.reshape(shape),
            specific_entropy=properties.specific_entropy.reshape(shape),
            specific_isobaric_heat_capacity=properties.specific_isobaric_heat_capacity.reshape(
                shape
            ),
        )

    return SaturationStates(
        temperature=states.temperature.reshape(shape),
        pressure=states.pressure.reshape(shape),
        liquid=phase(states.liquid),
        vapor=phase(states.vapor),
        latent_heat_of_vaporization=states.latent_heat_of_vaporization.reshape(shape),
    )


def _if97_states(temperature: FloatArray, pressure: FloatArray) -> SaturationStates:
    liquid = if97_liquid_properties(temperature, pressure)
    vapor = if97_vapor_properties(temperature, pressure)
    return SaturationStates(
        temperature=temperature,
        pressure=pressure,
        liquid=liquid,
        vapor=vapor,
        latent_heat_of_vaporization=np.asarray(
            vapor.specific_enthalpy - liquid.specific_enthalpy, dtype=np.float64
        ),
    )


# ---------------------------------------------------------------------------------------
# Public functions
# ---------------------------------------------------------------------------------------


def saturation_by_temperature(
    temperature: ArrayLike, *, formulation: Formulation = "IAPWS-95"
) -> SaturationStates:
    """Saturated liquid and vapor of water at given temperatures.

    Parameters
    ----------
    temperature : array_like
        Saturation temperature, K. IAPWS-95: 273.16 K (triple point) to
        647.096 K (critical point) inclusive. IAPWS-IF97: 273.15 K to 623.15 K.
        Values within 1e-9 K outside the range (round-off of unit conversions,
        e.g. 0.01 + 273.15) are taken as the range limit.
    formulation : {"IAPWS-95", "IAPWS-IF97"}
        Equation of state. Default IAPWS-95 (scientific formulation).

    Returns
    -------
    SaturationStates
        Arrays of the input shape (0-d in, 0-d out). At exactly the critical
        point both phases are the critical state, the latent heat is zero and
        the isobaric heat capacities are ``+inf`` (they diverge there).

    Raises
    ------
    InvalidInputError
        NaN, inf or non-numeric temperature, or an unknown formulation.
    OutOfRangeError
        A temperature outside the range above (``variable="temperature"``,
        ``unit="K"``, first offending element).
    NotConvergedError
        The exact solver (used within 0.5 K of the critical point) failed.

    Notes
    -----
    IAPWS-95: phase equilibrium p(rho', T) = p(rho'', T), g(rho', T) = g(rho'', T)
    (Maxwell criterion, R6-95 Table 8), tabulated as piecewise Chebyshev series
    in x = ln(T_c - T) (see the module docstring for the accuracy); exact solve
    for T > T_c - 0.5 K. Internal energies follow as u = h - p / rho and the
    latent heat as h'' - h'.
    IAPWS-IF97: p_s(T) from the region-4 equation, liquid from region 1 and
    vapor from region 2 at (T, p_s).

    References
    ----------
    IAPWS R6-95(2018); IAPWS G13-15 (SBTL, table method); IAPWS R7-97(2012)
    (IF97).

    Examples
    --------
    >>> states = saturation_by_temperature(373.15)
    >>> round(float(states.pressure), 1)
    101418.0
    >>> round(float(states.latent_heat_of_vaporization) / 1e3, 1)
    2256.4
    """
    temp = _validated_temperature(temperature, formulation)
    shape = temp.shape
    flat = temp.ravel()
    if formulation == "IAPWS-IF97":
        return _reshape_states(_if97_states(flat, if97_saturation_pressure(flat)), shape)
    return _reshape_states(_iapws95_states(flat), shape)


def saturation_point_by_temperature(
    temperature: float, *, formulation: Formulation = "IAPWS-95"
) -> SaturationPoint:
    """Saturated liquid and vapor at one temperature, as floats.

    The same states as :func:`saturation_by_temperature`, equal to them bit for
    bit, for callers that answer one state: inside the IAPWS-95 table range the
    table is summed on Python floats, which takes a few microseconds where the
    array path takes tens; every other case (IAPWS-IF97, the critical band,
    round-off at the range ends, invalid input) goes through
    :func:`saturation_by_temperature` and its checks.

    Parameters
    ----------
    temperature : float
        Saturation temperature, K; range as :func:`saturation_by_temperature`.
    formulation : {"IAPWS-95", "IAPWS-IF97"}

    Returns
    -------
    SaturationPoint

    Raises
    ------
    InvalidInputError, OutOfRangeError, NotConvergedError
        As :func:`saturation_by_temperature` for a one-element array (an
        out-of-range error names no element: ``index=None``).

    References
    ----------
    IAPWS R6-95(2018); IAPWS G13-15 (SBTL, table method); IAPWS R7-97(2012).

    Examples
    --------
    >>> round(saturation_point_by_temperature(373.15).pressure, 1)
    101418.0
    """
    if (
        formulation == "IAPWS-95"
        and type(temperature) is float
        and TRIPLE_POINT_TEMPERATURE <= temperature <= _TABLE_TEMPERATURE_LIMIT
    ):
        return _point_from_columns(temperature, _tables().properties.at_point(temperature))
    # As a one-element array: errors are those of a batch of one.
    states = saturation_by_temperature(np.atleast_1d(temperature), formulation=formulation)
    return SaturationPoint.first_of(states)


def saturation_by_pressure(
    pressure: ArrayLike, *, formulation: Formulation = "IAPWS-95"
) -> SaturationStates:
    """Saturated liquid and vapor of water at given pressures.

    Parameters
    ----------
    pressure : array_like
        Saturation pressure, Pa. IAPWS-95: from its saturation pressure at the
        triple-point temperature, 611.6548 Pa (R14-08 gives 611.657 Pa for the
        triple point; both are accepted), to the critical pressure 22.064 MPa
        inclusive. IAPWS-IF97: p_s(273.15 K) = 611.213 Pa to
        p_s(623.15 K) = 16.529 MPa. Values within 1e-12 relative outside the
        range are taken as the range limit.
    formulation : {"IAPWS-95", "IAPWS-IF97"}
        Equation of state. Default IAPWS-95.

    Returns
    -------
    SaturationStates
        Arrays of the input shape; ``pressure`` is the input pressure.

    Raises
    ------
    InvalidInputError
        NaN, inf or non-numeric pressure, or an unknown formulation.
    OutOfRangeError
        A pressure outside the range above (``variable="pressure"``,
        ``unit="Pa"``, first offending element).
    NotConvergedError
        The exact solver (used near the critical point) failed.

    Notes
    -----
    IAPWS-95: T_s from a Chebyshev table of T(ln p), polished by one Newton step
    on the ln p(T) table so that ``saturation_by_pressure(
    saturation_by_temperature(T).pressure).temperature`` returns T to about
    1e-11 K; then the properties at T_s as in :func:`saturation_by_temperature`.
    Within 0.5 K of T_c the temperature is solved exactly (Newton with the
    Clapeyron slope dp/dT = (h'' - h') / (T (v'' - v'))).
    IAPWS-IF97: T_s from the region-4 backward equation.

    References
    ----------
    IAPWS R6-95(2018); IAPWS G13-15; IAPWS R7-97(2012).

    Examples
    --------
    >>> round(float(saturation_by_pressure(101325.0).temperature), 4)
    373.1243
    """
    pres = _validated_pressure(pressure, formulation)
    shape = pres.shape
    flat = pres.ravel()
    if formulation == "IAPWS-IF97":
        # The IF97 region-4 equations are exact inverses of each other; clipping
        # only removes round-off (~1e-13 K) at the ends of the range.
        temperature = np.clip(
            if97_saturation_temperature(flat),
            IF97_MINIMUM_TEMPERATURE,
            IF97_MAXIMUM_TEMPERATURE,
        )
        return _reshape_states(_if97_states(temperature, flat), shape)
    temperature = _iapws95_temperature(flat)
    states = _iapws95_states(temperature)
    # The states are at the requested pressure; the table agrees to ~1e-13.
    liquid = replace(states.liquid, pressure=flat)
    vapor = replace(states.vapor, pressure=flat)
    return _reshape_states(
        SaturationStates(
            temperature=temperature,
            pressure=flat,
            liquid=liquid,
            vapor=vapor,
            latent_heat_of_vaporization=states.latent_heat_of_vaporization,
        ),
        shape,
    )


def saturation_pressure(
    temperature: ArrayLike, *, formulation: Formulation = "IAPWS-95"
) -> FloatArray:
    """Saturation (vapor) pressure of water, Pa, at given temperatures.

    Parameters
    ----------
    temperature : array_like
        K; same range as :func:`saturation_by_temperature`.
    formulation : {"IAPWS-95", "IAPWS-IF97"}

    Returns
    -------
    ndarray
        Pa, shape of ``temperature``.

    Raises
    ------
    InvalidInputError, OutOfRangeError
        As :func:`saturation_by_temperature`.

    Notes
    -----
    The pressure row of the IAPWS-95 saturation table (exact within 0.5 K of
    T_c), or the IF97 region-4 equation.

    References
    ----------
    IAPWS R6-95(2018); IAPWS R7-97(2012), eq. (30).

    Examples
    --------
    >>> round(float(saturation_pressure(450.0)) / 1e6, 9)
    0.932203564
    """
    temp = _validated_temperature(temperature, formulation)
    flat = temp.ravel()
    if formulation == "IAPWS-IF97":
        return if97_saturation_pressure(flat).reshape(temp.shape)
    tables = _tables()
    near_critical = flat > _TABLE_TEMPERATURE_LIMIT
    log_p = tables.log_pressure(np.minimum(flat, _TABLE_TEMPERATURE_LIMIT))[0]
    if np.any(near_critical):
        log_p[near_critical] = _exact_columns(flat[near_critical])[0]
    pressure: FloatArray = np.minimum(np.exp(log_p), CRITICAL_PRESSURE)
    return pressure.reshape(temp.shape)


def saturation_temperature(
    pressure: ArrayLike, *, formulation: Formulation = "IAPWS-95"
) -> FloatArray:
    """Saturation (boiling) temperature of water, K, at given pressures.

    Parameters
    ----------
    pressure : array_like
        Pa; same range as :func:`saturation_by_pressure`.
    formulation : {"IAPWS-95", "IAPWS-IF97"}

    Returns
    -------
    ndarray
        K, shape of ``pressure``.

    Raises
    ------
    InvalidInputError, OutOfRangeError
        As :func:`saturation_by_pressure`.

    Notes
    -----
    As the temperature step of :func:`saturation_by_pressure`.

    References
    ----------
    IAPWS R6-95(2018); IAPWS R7-97(2012), eq. (31).

    Examples
    --------
    >>> round(float(saturation_temperature(1.0e6)), 3)
    453.028
    """
    pres = _validated_pressure(pressure, formulation)
    flat = pres.ravel()
    if formulation == "IAPWS-IF97":
        return if97_saturation_temperature(flat).reshape(pres.shape)
    return _iapws95_temperature(flat).reshape(pres.shape)
