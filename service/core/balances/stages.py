"""Stage integrators shared by the balances (integrated and hand methods).

A stage is a stretch of the path with one set of phases. On it the condensed
contents obey the first law for an open system whose boundary moves with the
condensed phases, the vapor leaving at the interface with its equilibrium
enthalpy:

    dH = (h_vapor - kappa) dm + V dp,    H = sum of m_i h_i + C (T - T_t),

where m is the water (liquid + ice) mass, V the volume of the condensed water,
p the equilibrium vapor pressure, C the heat capacity of companions and solute
(constant) and of a food's solids and bound water (with temperature), and kappa the
heat gained per kilogram evaporated (see :mod:`service.core.balances.heat_gain`).
With one condensed phase this is the linear equation

    dm/dT = a(T) m + b(T),   a = (dh_c/dT - v_c dp/dT) / (h_v - kappa - h_c),
                             b = C / (h_v - kappa - h_c),

(along the path, dh_c/dT - v_c dp/dT = T ds_c/dT, the heat capacity along the
equilibrium line). Its solution m = exp(A) (m_start + integral of b exp(-A)),
A = integral of a, is evaluated by Chebyshev-Lobatto collocation (spectral
accuracy), as are the enthalpy, volume and heat integrals.

The hand method replaces h_vapor by one value at the stage's mean temperature
and neglects V dp, so that a stage has the closed form
m_v = (H_start - H_end at fixed mass) / (h_v,mean - kappa - h_c,end).
"""

from __future__ import annotations

from collections.abc import Callable
from dataclasses import dataclass, field
from typing import Final

import numpy as np

from service.core.balances._chebyshev import ChebyshevInterval
from service.core.balances.equilibrium_paths import FreezingSolutionStates, LiquidVaporStates
from service.core.errors import UnsupportedStateError
from service.core.properties.constants import TRIPLE_POINT_TEMPERATURE
from service.core.properties.phase import FloatArray, PhaseProperties

__all__ = [
    "DEGREE",
    "ZERO_LENGTH",
    "StageNumbers",
    "freezing_at_fixed_temperature",
    "freezing_solution_stage",
    "hand_freezing_solution_stage",
    "hand_single_phase_stage",
    "interval_of",
    "merge_pieces",
    "single_phase_stage",
    "solve_linear_mass",
]

DEGREE: Final = 24
"""Chebyshev degree per stage (25 nodes); closes the balances to ~1e-13 relative."""

ZERO_LENGTH: Final = 1e-9
"""K. A stage shorter than this is empty."""

Sampler = Callable[[int], tuple[FloatArray, FloatArray, FloatArray, FloatArray]]
"""Given a count, returns (temperature, pressure, water mass, ice mass) along the stage."""

PointSampler = Callable[[FloatArray], tuple[FloatArray, FloatArray, FloatArray]]
"""Given temperatures inside the stage, returns (pressure, water mass, ice mass)."""


@dataclass
class StageNumbers:
    """Scalar outcome of one stage (one case)."""

    name: str
    start_temperature: float
    end_temperature: float
    start_pressure: float
    end_pressure: float
    start_mass: float
    end_mass: float
    start_ice: float
    end_ice: float
    start_enthalpy: float
    end_enthalpy: float
    vapor_enthalpy: float = 0.0
    heat_removed: float = 0.0
    vapor_volume: float = 0.0
    volume_pressure_integral: float = 0.0
    heat_gained: float = 0.0
    start_volume: float = 0.0
    end_volume: float = 0.0
    node_mass: FloatArray | None = field(default=None, repr=False)
    sampler: Sampler | None = field(default=None, repr=False)
    sample_at: PointSampler | None = field(default=None, repr=False)

    @property
    def evaporated_mass(self) -> float:
        return self.start_mass - self.end_mass

    @property
    def ice_formed(self) -> float:
        return self.end_ice - self.start_ice


def interval_of(lower: float, upper: float) -> ChebyshevInterval:
    """The collocation interval of a stage."""
    return ChebyshevInterval(lower, upper, DEGREE)


@dataclass(frozen=True)
class InertHeat:
    """What cools with the water without evaporating or freezing, with a heat capacity that
    depends on temperature: a constant part (companions, a solute) plus, for a food, its
    solids and bound water.

    Attributes
    ----------
    constant : float
        J/K.
    varying_capacity : callable
        J/K at an array of temperatures (K).
    varying_enthalpy : callable
        J at an array of temperatures, zero at 273.16 K; its temperature derivative is
        ``varying_capacity``.
    """

    constant: float
    varying_capacity: Callable[[FloatArray], FloatArray]
    varying_enthalpy: Callable[[FloatArray], FloatArray]


HeatCapacity = float | InertHeat
"""J/K of what cools with the water: a constant, or an :class:`InertHeat`."""


def heat_capacity_at(heat_capacity: HeatCapacity, temperature: FloatArray) -> FloatArray:
    """J/K at the given temperatures."""
    if isinstance(heat_capacity, InertHeat):
        return np.asarray(
            heat_capacity.constant + heat_capacity.varying_capacity(temperature),
            dtype=np.float64,
        )
    return np.full(np.shape(temperature), heat_capacity)


def sensible_heat(heat_capacity: HeatCapacity, temperature: float) -> float:
    """J, the enthalpy of what cools with the water, zero at 273.16 K."""
    if isinstance(heat_capacity, InertHeat):
        varying = float(heat_capacity.varying_enthalpy(np.array([temperature]))[0])
        return heat_capacity.constant * (temperature - TRIPLE_POINT_TEMPERATURE) + varying
    return heat_capacity * (temperature - TRIPLE_POINT_TEMPERATURE)


_sensible = sensible_heat


def _positive_denominator(values: FloatArray, name: str) -> None:
    if np.any(values <= 0.0):
        raise UnsupportedStateError(
            "heat_gain",
            f"during {name}, the heat gained per kilogram evaporated reaches the latent heat: "
            "the load cannot cool by evaporation",
        )


def _check_water_left(mass: FloatArray, name: str) -> None:
    if np.any(mass <= 0.0):
        raise UnsupportedStateError(
            "water_mass",
            f"all the water evaporates during {name} before the end temperature is reached "
            "(companion masses or heat gain too large for the water present)",
        )


def solve_linear_mass(
    interval: ChebyshevInterval, a: FloatArray, b: FloatArray, start_mass: float
) -> FloatArray:
    """Solve m' = a m + b on the nodes with m(upper) = start_mass.

    m = exp(A) (start_mass + integral from upper of b exp(-A)), A = integral from upper of a.
    """
    exponent = interval.integral_from_lower(a)
    exponent = exponent - exponent[-1]
    source = interval.integral_from_lower(b * np.exp(-exponent))
    source = source - source[-1]
    return np.asarray(np.exp(exponent) * (start_mass + source), dtype=np.float64)


def single_phase_stage(
    name: str,
    interval: ChebyshevInterval,
    states: LiquidVaporStates,
    start_mass: float,
    heat_capacity: HeatCapacity,
    kappa: float,
    start_ice: float = 0.0,
) -> StageNumbers:
    """Integrated stage with one condensed phase (liquid cooling or ice cooling).

    ``states`` are at ``interval.nodes``; the stage runs from ``upper`` down to
    ``lower``; ``start_ice`` is 0 for liquid and equal to ``start_mass`` for ice.
    """
    condensed = states.condensed
    h_c = condensed.specific_enthalpy
    v_c = 1.0 / condensed.density
    h_v = states.vapor.specific_enthalpy
    pressure = states.pressure
    slope_p = interval.derivative(pressure)
    denominator = h_v - kappa - h_c
    _positive_denominator(denominator, name)
    a = (interval.derivative(h_c) - v_c * slope_p) / denominator
    b = heat_capacity_at(heat_capacity, interval.nodes) / denominator
    mass = solve_linear_mass(interval, a, b, start_mass)
    _check_water_left(mass, name)
    rate = a * mass + b
    is_ice = start_ice > 0.0
    vapor_enthalpy = float(interval.integral(h_v * rate))
    evaporated = start_mass - float(mass[0])
    numbers = StageNumbers(
        name=name,
        start_temperature=interval.upper,
        end_temperature=interval.lower,
        start_pressure=float(pressure[-1]),
        end_pressure=float(pressure[0]),
        start_mass=start_mass,
        end_mass=float(mass[0]),
        start_ice=start_ice,
        end_ice=float(mass[0]) if is_ice else 0.0,
        start_enthalpy=start_mass * float(h_c[-1]) + _sensible(heat_capacity, interval.upper),
        end_enthalpy=float(mass[0] * h_c[0]) + _sensible(heat_capacity, interval.lower),
        vapor_enthalpy=vapor_enthalpy,
        heat_removed=float(interval.integral((h_v - h_c) * rate)),
        vapor_volume=float(interval.integral(rate / states.vapor.density)),
        volume_pressure_integral=-float(interval.integral(mass * v_c * slope_p)),
        heat_gained=kappa * evaporated,
        start_volume=start_mass * float(v_c[-1]),
        end_volume=float(mass[0] * v_c[0]),
        node_mass=mass,
    )

    def sample(count: int) -> tuple[FloatArray, FloatArray, FloatArray, FloatArray]:
        temperature = np.linspace(interval.upper, interval.lower, count)
        water = interval.interpolate(mass, temperature)
        return (
            temperature,
            interval.interpolate(pressure, temperature),
            water,
            water if is_ice else np.zeros(count),
        )

    numbers.sampler = sample
    return numbers


def hand_single_phase_stage(
    name: str,
    upper: LiquidVaporStates,
    lower: LiquidVaporStates,
    mean: LiquidVaporStates,
    start_mass: float,
    heat_capacity: HeatCapacity,
    kappa: float,
    start_ice: float = 0.0,
) -> StageNumbers:
    """Hand-method stage: one vapor enthalpy at the mean temperature; states are 1-element."""
    h_start = float(upper.condensed.specific_enthalpy[0])
    h_end = float(lower.condensed.specific_enthalpy[0])
    h_vapor = float(mean.vapor.specific_enthalpy[0])
    t_start = float(upper.temperature[0])
    t_end = float(lower.temperature[0])
    released = start_mass * (h_start - h_end) + (
        _sensible(heat_capacity, t_start) - _sensible(heat_capacity, t_end)
        if isinstance(heat_capacity, InertHeat)
        else heat_capacity * (t_start - t_end)
    )
    denominator = h_vapor - kappa - h_end
    _positive_denominator(np.array([denominator]), name)
    evaporated = released / denominator
    end_mass = start_mass - evaporated
    _check_water_left(np.array([end_mass]), name)
    is_ice = start_ice > 0.0
    return StageNumbers(
        name=name,
        start_temperature=t_start,
        end_temperature=t_end,
        start_pressure=float(upper.pressure[0]),
        end_pressure=float(lower.pressure[0]),
        start_mass=start_mass,
        end_mass=end_mass,
        start_ice=start_ice,
        end_ice=end_mass if is_ice else 0.0,
        start_enthalpy=start_mass * h_start + _sensible(heat_capacity, t_start),
        end_enthalpy=end_mass * h_end + _sensible(heat_capacity, t_end),
        vapor_enthalpy=evaporated * h_vapor,
        heat_removed=evaporated * (h_vapor - float(mean.condensed.specific_enthalpy[0])),
        vapor_volume=evaporated / float(mean.vapor.density[0]),
        heat_gained=kappa * evaporated,
    )


def freezing_at_fixed_temperature(
    liquid: PhaseProperties,
    ice: PhaseProperties,
    vapor: PhaseProperties,
    pressure: float,
    liquid_mass: float,
    ice_mass: float,
    kappa: float,
) -> StageNumbers:
    """Pure water freezing at the triple point (exact; phases given as 1-element arrays).

    Constant T and p: m_l h_l = m_v (h_v - kappa) + (m_l - m_v) h_ice, so
    m_v = m_l (h_l - h_ice) / (h_v - kappa - h_ice).
    """
    h_l = float(liquid.specific_enthalpy.ravel()[0])
    h_i = float(ice.specific_enthalpy.ravel()[0])
    h_v = float(vapor.specific_enthalpy.ravel()[0])
    denominator = h_v - kappa - h_i
    _positive_denominator(np.array([denominator]), "freezing")
    evaporated = liquid_mass * (h_l - h_i) / denominator
    start_mass = liquid_mass + ice_mass
    end_mass = start_mass - evaporated
    temperature = float(liquid.temperature.ravel()[0])
    numbers = StageNumbers(
        name="freezing",
        start_temperature=temperature,
        end_temperature=temperature,
        start_pressure=pressure,
        end_pressure=pressure,
        start_mass=start_mass,
        end_mass=end_mass,
        start_ice=ice_mass,
        end_ice=end_mass,
        start_enthalpy=liquid_mass * h_l + ice_mass * h_i,
        end_enthalpy=end_mass * h_i,
        vapor_enthalpy=evaporated * h_v,
        heat_removed=evaporated * (h_v - h_l),
        vapor_volume=evaporated / float(vapor.density.ravel()[0]),
        heat_gained=kappa * evaporated,
        start_volume=liquid_mass / float(liquid.density.ravel()[0])
        + ice_mass / float(ice.density.ravel()[0]),
        end_volume=end_mass / float(ice.density.ravel()[0]),
    )

    def sample(count: int) -> tuple[FloatArray, FloatArray, FloatArray, FloatArray]:
        progress = np.linspace(0.0, 1.0, count)
        return (
            np.full(count, temperature),
            np.full(count, pressure),
            start_mass - progress * evaporated,
            ice_mass + progress * (end_mass - ice_mass),
        )

    numbers.sampler = sample
    return numbers


def freezing_solution_stage(
    interval: ChebyshevInterval,
    states: FreezingSolutionStates,
    liquid_water: FloatArray,
    start_mass: float,
    heat_capacity: HeatCapacity,
    kappa: float,
) -> StageNumbers:
    """Progressive freezing of a solution from ``upper`` down to ``lower``.

    ``liquid_water`` is the equilibrium unfrozen water mass at the nodes, kg.
    """
    h_l = states.liquid.specific_enthalpy
    h_i = states.ice.specific_enthalpy
    h_v = states.vapor.specific_enthalpy
    v_l = 1.0 / states.liquid.density
    v_i = 1.0 / states.ice.density
    pressure = states.pressure
    slope_p = interval.derivative(pressure)
    liquid_along = interval.derivative(h_l) - v_l * slope_p
    ice_along = interval.derivative(h_i) - v_i * slope_p
    denominator = h_v - kappa - h_i
    _positive_denominator(denominator, "freezing")
    a = ice_along / denominator
    b = (
        interval.derivative(liquid_water) * (h_l - h_i)
        + liquid_water * (liquid_along - ice_along)
        + heat_capacity_at(heat_capacity, interval.nodes)
    ) / denominator
    mass = solve_linear_mass(interval, a, b, start_mass)
    _check_water_left(mass, "freezing")
    rate = a * mass + b
    ice = mass - liquid_water
    volume = liquid_water * v_l + ice * v_i
    evaporated = start_mass - float(mass[0])

    def enthalpy(node: int) -> float:
        return float(liquid_water[node] * h_l[node] + ice[node] * h_i[node])

    numbers = StageNumbers(
        name="freezing",
        start_temperature=interval.upper,
        end_temperature=interval.lower,
        start_pressure=float(pressure[-1]),
        end_pressure=float(pressure[0]),
        start_mass=start_mass,
        end_mass=float(mass[0]),
        start_ice=float(ice[-1]),
        end_ice=float(ice[0]),
        start_enthalpy=enthalpy(-1) + _sensible(heat_capacity, interval.upper),
        end_enthalpy=enthalpy(0) + _sensible(heat_capacity, interval.lower),
        vapor_enthalpy=float(interval.integral(h_v * rate)),
        heat_removed=float(interval.integral((h_v - h_l) * rate)),
        vapor_volume=float(interval.integral(rate / states.vapor.density)),
        volume_pressure_integral=-float(interval.integral(volume * slope_p)),
        heat_gained=kappa * evaporated,
        start_volume=float(volume[-1]),
        end_volume=float(volume[0]),
        node_mass=mass,
    )

    def sample_at(temperature: FloatArray) -> tuple[FloatArray, FloatArray, FloatArray]:
        water = interval.interpolate(mass, temperature)
        return (
            interval.interpolate(pressure, temperature),
            water,
            water - interval.interpolate(liquid_water, temperature),
        )

    def sample(count: int) -> tuple[FloatArray, FloatArray, FloatArray, FloatArray]:
        temperature = np.linspace(interval.upper, interval.lower, count)
        return (temperature, *sample_at(temperature))

    numbers.sampler = sample
    numbers.sample_at = sample_at
    return numbers


def merge_pieces(pieces: list[StageNumbers]) -> StageNumbers:
    """One stage from consecutive pieces (ordered from high to low temperature)."""
    first, last = pieces[0], pieces[-1]
    merged = StageNumbers(
        name=first.name,
        start_temperature=first.start_temperature,
        end_temperature=last.end_temperature,
        start_pressure=first.start_pressure,
        end_pressure=last.end_pressure,
        start_mass=first.start_mass,
        end_mass=last.end_mass,
        start_ice=first.start_ice,
        end_ice=last.end_ice,
        start_enthalpy=first.start_enthalpy,
        end_enthalpy=last.end_enthalpy,
        vapor_enthalpy=sum(p.vapor_enthalpy for p in pieces),
        heat_removed=sum(p.heat_removed for p in pieces),
        vapor_volume=sum(p.vapor_volume for p in pieces),
        volume_pressure_integral=sum(p.volume_pressure_integral for p in pieces),
        heat_gained=sum(p.heat_gained for p in pieces),
        start_volume=first.start_volume,
        end_volume=last.end_volume,
    )

    def sample(count: int) -> tuple[FloatArray, FloatArray, FloatArray, FloatArray]:
        temperature = np.linspace(first.start_temperature, last.end_temperature, count)
        pressure = np.empty(count)
        water = np.empty(count)
        ice = np.empty(count)
        for piece in pieces:
            assert piece.sample_at is not None
            inside = (temperature <= piece.start_temperature) & (
                temperature >= piece.end_temperature
            )
            pressure[inside], water[inside], ice[inside] = piece.sample_at(temperature[inside])
        return temperature, pressure, water, ice

    merged.sampler = sample
    return merged


def hand_freezing_solution_stage(
    start: FreezingSolutionStates,
    end: FreezingSolutionStates,
    mean: FreezingSolutionStates,
    start_liquid_water: float,
    end_liquid_water: float,
    start_mass: float,
    heat_capacity: HeatCapacity,
    kappa: float,
) -> StageNumbers:
    """Hand method for progressive freezing; states are 1-element.

    H_start + kappa m_v = H_end(m_start - m_v) + m_v h_v,mean, with the end's unfrozen
    water fixed by its temperature: solved for m_v in closed form.
    """
    h_l_start = float(start.liquid.specific_enthalpy[0])
    h_i_start = float(start.ice.specific_enthalpy[0])
    h_l_end = float(end.liquid.specific_enthalpy[0])
    h_i_end = float(end.ice.specific_enthalpy[0])
    h_vapor = float(mean.vapor.specific_enthalpy[0])
    t_start = float(start.temperature[0])
    t_end = float(end.temperature[0])
    start_enthalpy = (
        start_liquid_water * h_l_start
        + (start_mass - start_liquid_water) * h_i_start
        + _sensible(heat_capacity, t_start)
    )
    fixed_end = end_liquid_water * (h_l_end - h_i_end) + _sensible(heat_capacity, t_end)
    denominator = h_vapor - kappa - h_i_end
    _positive_denominator(np.array([denominator]), "freezing")
    evaporated = (start_enthalpy - fixed_end - start_mass * h_i_end) / denominator
    end_mass = start_mass - evaporated
    _check_water_left(np.array([end_mass - end_liquid_water]), "freezing")
    return StageNumbers(
        name="freezing",
        start_temperature=t_start,
        end_temperature=t_end,
        start_pressure=float(start.pressure[0]),
        end_pressure=float(end.pressure[0]),
        start_mass=start_mass,
        end_mass=end_mass,
        start_ice=start_mass - start_liquid_water,
        end_ice=end_mass - end_liquid_water,
        start_enthalpy=start_enthalpy,
        end_enthalpy=fixed_end + end_mass * h_i_end,
        vapor_enthalpy=evaporated * h_vapor,
        heat_removed=evaporated * (h_vapor - float(mean.liquid.specific_enthalpy[0])),
        vapor_volume=evaporated / float(mean.vapor.density[0]),
        heat_gained=kappa * evaporated,
    )
