"""The product's thermodynamic state from its energy and water mass.

The simulation integrates two extensive product variables, its water mass m (liquid
plus ice) and its energy E, and recovers temperature, ice mass and equilibrium vapor
pressure from them through the equilibrium path. Freezing then needs no switching of
equations: on the pure-water plateau E falls at constant temperature while the ice
fraction rises.

Equations
---------
With tau = T - 273.16 K and the sensible heat S(tau) of the non-water part (solids and
companions, a cubic polynomial in tau, zero at the triple point):

- liquid, no ice:          E = m h_l(T) + S(tau)
- pure water, plateau:     E = m ((1 - x) h_l(T_t) + x h_ice(T_t)),  T = T_t
- pure ice:                E = m h_ice(T) + S(tau)
- solution with ice:       E = m h_ice(T) + m_l(T) (h_l(T) - h_ice(T)) + S(tau)

where m_l(T) = K a_w(T) / (1 - a_w(T)) is the unfrozen water of a solution in
equilibrium with ice (:mod:`service.core.balances.solutes`, K = i m_s M_w / M_s) and ice
is present when m_l(T) < m. The equilibrium vapor pressure over the product is
a_w p_l(T) (Raoult's law with ideal vapor; a_w = m / (m + K) without ice, a_w(T) with
ice), p_sub(T) for pure ice and 611.657 Pa on the plateau.

Enthalpies h are per kilogram on the equilibrium path (the condensed phases at their
equilibrium vapor pressure); the pressure work V dp of the condensed phases (of order
1 J per kilogram of water over a process) is neglected.

References
----------
IAPWS R6-95(2018), R10-06(2009), R14-08(2011) through the path tables; ideal solution:
Atkins, P. and de Paula, J., *Physical Chemistry*, 9th ed., Oxford (2010), Sec. 5.3-5.5
(from memory).
"""

from __future__ import annotations

import math
from collections.abc import Callable
from typing import Final, NamedTuple

from service.core.errors import NotConvergedError
from service.core.properties.constants import TRIPLE_POINT_PRESSURE, TRIPLE_POINT_TEMPERATURE
from service.core.simulation.path_tables import (
    ICE_TEMPERATURE_MIN,
    LIQUID_TEMPERATURE_MAX,
    LIQUID_TEMPERATURE_MIN,
    path_tables,
)
from service.core.simulation.solution_tables import SolutionActivity

__all__ = ["ProductState", "ProductThermodynamics"]

_EXTRAPOLATION: Final = 20.0
"""K beyond the tables a trial step of the ODE solver may reach (the simulation stops
at the tables' ends through events)."""

_TEMPERATURE_TOLERANCE: Final = 1e-9
"""K, last Newton step at which the product temperature is taken as converged."""
_ITERATIONS: Final = 60


class ProductState(NamedTuple):
    """Product state recovered from (E, m); all SI, scalars.

    Attributes
    ----------
    temperature : float
        K.
    ice_mass : float
        kg.
    equilibrium_pressure : float
        Vapor pressure over the product, Pa.
    vapor_enthalpy : float
        Specific enthalpy of vapor leaving the product, J/kg.
    pressure_by_energy, pressure_by_mass : float
        Partial derivatives of the equilibrium pressure with respect to E (Pa/J) and m
        (Pa/kg).
    liquid_margin : float
        Energy above the freezing onset at the current water mass (J); > 0 while no
        ice is present (pure water), or m_l(T) - m (kg, solution).
    frozen_margin : float
        Pure water: E - m h_ice(T_t), J (> 0 until fully frozen); solution: +1.
    """

    temperature: float
    ice_mass: float
    equilibrium_pressure: float
    vapor_enthalpy: float
    pressure_by_energy: float
    pressure_by_mass: float
    liquid_margin: float
    frozen_margin: float


class ProductThermodynamics:
    """Energy function of one product and its inverse.

    Parameters
    ----------
    sensible_coefficients : tuple of float
        (c1, c2, c3): S(tau) = c1 tau + c2 tau**2 + c3 tau**3, J, with tau in K.
    solute_constant : float or None
        K = i m_s M_w / M_s, kg; None for pure water.
    """

    def __init__(
        self,
        sensible_coefficients: tuple[float, float, float],
        solute_constant: float | None,
        solution: SolutionActivity | None = None,
    ) -> None:
        self._c1, self._c2, self._c3 = sensible_coefficients
        self._solute = solute_constant
        self._activity = solution
        tables = path_tables()
        self._liquid = tables.liquid
        self._ice = tables.ice
        self._solution = tables.solution
        liquid_t = self._liquid.values(TRIPLE_POINT_TEMPERATURE)
        ice_t = self._ice.values(TRIPLE_POINT_TEMPERATURE)
        self._h_liquid_t = liquid_t[0]
        self._h_ice_t = ice_t[0]
        self._h_vapor_t = 0.5 * (liquid_t[2] + ice_t[2])
        self._last: tuple[float, float, float, float, float] | None = None
        self.supercooled = False
        """While True the water stays liquid below its freezing point (no ice nucleated):
        the energy maps onto the metastable liquid branch. The simulation sets it until
        the nucleation temperature is reached; clearing it is the recalescence (the same
        energy maps onto the freezing path)."""
        self.supercooling = False
        """Whether the product supercools at all (a nucleation temperature was given)."""
        self.nucleation_time: float | None = None
        """s, when ice nucleated (None: not yet, or no supercooling)."""

    def supercooled_at(self, time: float) -> bool:
        """Whether the product was still supercooled at ``time`` (s) of the run."""
        return self.supercooling and (self.nucleation_time is None or time < self.nucleation_time)

    @property
    def has_solute(self) -> bool:
        """Whether the water holds a solute (progressive freezing)."""
        return self._solute is not None or self._activity is not None

    @property
    def lowest_temperature(self) -> float:
        """K: the coldest state the product's model takes (its solute model's end)."""
        if self._activity is not None:
            return self._activity.lowest_temperature
        return LIQUID_TEMPERATURE_MIN if self._solute is not None else ICE_TEMPERATURE_MIN

    def water_activity(self, evaporated: float, ice_fraction: float, water_mass: float) -> float:
        """a_w of the unfrozen water (1 for pure water; m_l / (m_l + K) for the ideal solution).

        ``evaporated`` and ``water_mass`` in kg, ``ice_fraction`` per initial water mass.
        """
        unfrozen = water_mass - evaporated - ice_fraction * water_mass
        return self._liquid_activity(unfrozen)[0]

    def _liquid_activity(self, m: float) -> tuple[float, float]:
        """(a_w, da_w/dm) of the product's water without ice, ``m`` kg of it: 1 for pure
        water, Raoult's m / (m + K) for the ideal solution, else the solute's tables."""
        if self._activity is not None:
            log_a, dlog_a_dm = self._activity.liquid_log_activity(m)
            a = math.exp(log_a)
            return a, a * dlog_a_dm
        k = self._solute
        if k is None:
            return 1.0, 0.0
        return m / (m + k), k / ((m + k) * (m + k))

    def _unfrozen_water(self, t: float, log_a: float, dlog_a: float) -> tuple[float, float]:
        """(m_l, dm_l/dT): water left liquid beside ice at ``t`` < 273.16 K, where ice
        equilibrium has ln a_w = ``log_a`` (slope ``dlog_a``)."""
        if self._activity is not None:
            return self._activity.unfrozen_water(t)
        k = self._solute
        assert k is not None
        denominator = math.expm1(-log_a)
        return k / denominator, k * math.exp(-log_a) * dlog_a / (denominator * denominator)

    def sensible(self, temperature: float) -> tuple[float, float]:
        """S(tau) and dS/dT of the non-water part, J and J/K."""
        tau = temperature - TRIPLE_POINT_TEMPERATURE
        value = tau * (self._c1 + tau * (self._c2 + tau * self._c3))
        slope = self._c1 + tau * (2.0 * self._c2 + 3.0 * tau * self._c3)
        return value, slope

    def triple_point_energies(self, water_mass: float) -> tuple[float, float]:
        """(all liquid, all ice) energies of pure water at the triple point, J."""
        return water_mass * self._h_liquid_t, water_mass * self._h_ice_t

    # -- energy as a function of temperature ------------------------------------------

    def _pure_liquid(self, t: float, m: float) -> tuple[float, float, float, float, float, float]:
        (h_l, log_p, h_v), (dh_l, dlog_p, _) = self._liquid.values_and_slopes(t)
        s, ds = self.sensible(t)
        p = math.exp(log_p)
        return m * h_l + s, m * dh_l + ds, h_l, p, p * dlog_p, h_v

    def _pure_ice(self, t: float, m: float) -> tuple[float, float, float, float, float, float]:
        (h_i, log_p, h_v), (dh_i, dlog_p, _) = self._ice.values_and_slopes(t)
        s, ds = self.sensible(t)
        p = math.exp(log_p)
        return m * h_i + s, m * dh_i + ds, h_i, p, p * dlog_p, h_v

    def _solution_state(
        self, t: float, m: float
    ) -> tuple[float, float, float, float, float, float, float, float]:
        """(E, dE/dT, dE/dm, p, dp/dT, dp/dm, h_v, unfrozen water capacity - m)."""
        (h_l, log_p, h_v), (dh_l, dlog_p, _) = self._liquid.values_and_slopes(t)
        s, ds = self.sensible(t)
        p_l = math.exp(log_p)
        capacity = math.inf
        dcapacity = 0.0
        log_a = 0.0
        dlog_a = 0.0
        if t < TRIPLE_POINT_TEMPERATURE:
            (log_a,), (dlog_a,) = self._solution.values_and_slopes(t)
            capacity, dcapacity = self._unfrozen_water(t, log_a, dlog_a)
        if capacity >= m:
            activity, by_mass = self._liquid_activity(m)
            p = activity * p_l
            return (
                m * h_l + s,
                m * dh_l + ds,
                h_l,
                p,
                p * dlog_p,
                p_l * by_mass,
                h_v,
                min(capacity - m, m),
            )
        (h_i, _, _), (dh_i, _, _) = self._ice.values_and_slopes(t)
        latent = h_l - h_i
        p = math.exp(log_a) * p_l
        return (
            m * h_i + capacity * latent + s,
            m * dh_i + dcapacity * latent + capacity * (dh_l - dh_i) + ds,
            h_i,
            p,
            p * (dlog_a + dlog_p),
            0.0,
            h_v,
            capacity - m,
        )

    # -- inverse ----------------------------------------------------------------------

    def state(self, energy: float, water_mass: float, guess: float) -> ProductState:
        """Temperature, ice and vapor pressure of the product with energy E and water m.

        Parameters
        ----------
        energy : float
            E, J (IAPWS reference state; S(0) = 0 at the triple point).
        water_mass : float
            m, kg, > 0.
        guess : float
            Starting temperature for Newton's method, K (e.g. the previous one).
        """
        m = water_mass
        if self._last is not None:
            # predictor: first-order change of T with (E, m) from the last state
            last_energy, last_mass, last_t, slope, by_mass = self._last
            guess = last_t + (energy - last_energy - by_mass * (m - last_mass)) / slope
        if self.supercooled:
            return self._supercooled_inverse(energy, m, guess)
        if self.has_solute:
            return self._solution_inverse(energy, m, guess)
        liquid_t, ice_t = self.triple_point_energies(m)
        if energy >= liquid_t:
            t, values = self._newton(
                self._pure_liquid,
                energy,
                m,
                guess,
                TRIPLE_POINT_TEMPERATURE,
                LIQUID_TEMPERATURE_MAX + _EXTRAPOLATION,
            )
            _, slope, by_mass, p, dp, h_v = values
            return ProductState(
                t, 0.0, p, h_v, dp / slope, -dp * by_mass / slope, energy - liquid_t, 1.0
            )
        if energy <= ice_t:
            t, values = self._newton(
                self._pure_ice,
                energy,
                m,
                guess,
                ICE_TEMPERATURE_MIN - _EXTRAPOLATION,
                TRIPLE_POINT_TEMPERATURE,
            )
            _, slope, by_mass, p, dp, h_v = values
            return ProductState(
                t, m, p, h_v, dp / slope, -dp * by_mass / slope, energy - liquid_t, energy - ice_t
            )
        ice = (liquid_t - energy) / (self._h_liquid_t - self._h_ice_t)
        self._last = None
        return ProductState(
            TRIPLE_POINT_TEMPERATURE,
            ice,
            TRIPLE_POINT_PRESSURE,
            self._h_vapor_t,
            0.0,
            0.0,
            energy - liquid_t,
            energy - ice_t,
        )

    def _newton(
        self,
        function: Callable[[float, float], tuple[float, ...]],
        energy: float,
        m: float,
        guess: float,
        lower: float,
        upper: float,
    ) -> tuple[float, tuple[float, ...]]:
        """Safeguarded Newton on E(T) = energy within [lower, upper] (E increasing)."""
        t = min(max(guess, lower), upper)
        step = math.inf
        for _ in range(_ITERATIONS):
            values = function(t, m)
            residual = values[0] - energy
            if residual > 0.0:
                upper = t
            else:
                lower = t
            step = residual / values[1]
            following = t - step
            if abs(step) < _TEMPERATURE_TOLERANCE:
                # Newton's error after this step is of order step**2: converged; the
                # values at t differ from those at t - step by a relative 1e-10 at most.
                self._last = (energy, m, following, values[1], values[2])
                return following, values
            if not lower <= following <= upper:
                following = 0.5 * (lower + upper)
            if upper - lower < _TEMPERATURE_TOLERANCE:
                # E lies beyond the extrapolated path (a trial step of the ODE solver far
                # outside the model's range): answer at the bracket's end, where the range
                # events stop the simulation.
                self._last = None
                return following, values
            t = following
        raise NotConvergedError(
            "product temperature from its energy (safeguarded Newton)", _ITERATIONS, abs(step)
        )

    def _supercooled_liquid(
        self, t: float, m: float
    ) -> tuple[float, float, float, float, float, float, float]:
        """(E, dE/dT, dE/dm, p, dp/dT, dp/dm, h_v) of the liquid, ice or not (Raoult with a
        solute)."""
        e, de_dt, h_l, p_l, dp_l, h_v = self._pure_liquid(t, m)
        activity, by_mass = self._liquid_activity(m)
        return e, de_dt, h_l, activity * p_l, activity * dp_l, p_l * by_mass, h_v

    def _supercooled_inverse(self, energy: float, m: float, guess: float) -> ProductState:
        t, values = self._newton(
            self._supercooled_liquid,
            energy,
            m,
            guess,
            LIQUID_TEMPERATURE_MIN - _EXTRAPOLATION,
            LIQUID_TEMPERATURE_MAX + _EXTRAPOLATION,
        )
        _, slope, by_mass, p, dp_dt, dp_dm, h_v = values
        # No ice: both margins stay positive (the nucleation event ends this branch).
        return ProductState(
            t, 0.0, p, h_v, dp_dt / slope, dp_dm - dp_dt * by_mass / slope, 1.0, 1.0
        )

    def _solution_inverse(self, energy: float, m: float, guess: float) -> ProductState:
        t, values = self._newton(
            self._solution_state,
            energy,
            m,
            guess,
            LIQUID_TEMPERATURE_MIN - _EXTRAPOLATION,
            LIQUID_TEMPERATURE_MAX + _EXTRAPOLATION,
        )
        _, slope, by_mass, p, dp_dt, dp_dm, h_v, margin = values
        ice = max(0.0, -margin)
        return ProductState(
            t,
            ice,
            p,
            h_v,
            dp_dt / slope,
            dp_dm - dp_dt * by_mass / slope,
            margin,
            1.0,
        )
