"""Evaporation limited by vapor diffusion through the chamber air, in series with the surface.

Model
-----
Two resistances in series carry the vapor from the product surface (temperature T_s,
equilibrium vapor pressure p_eq) to the well-mixed chamber gas (total pressure p, air
partial pressure p_a, vapor partial pressure p_v = p - p_a, temperature T_g). At the
interface between them the vapor has the partial pressure p_i, which the series solve finds:

1. the surface: the Hertz-Knudsen-Langmuir flux
   j = G_k (p_eq - p_i), G_k = alpha A / sqrt(2 pi R T_s)
   (:class:`service.core.simulation.evaporation.KineticEvaporation`);
2. the gas: vapor diffusing through air that does not move (Stefan flow), in the
   log-mean form that holds at any vapor fraction,

       j = A k_c (p / (R T_f)) ln(p_a / (p - p_i)),

   k_c = Sh D / L the mass-transfer coefficient, D the vapor-air diffusivity at the film
   temperature T_f = (T_s + T_g)/2 and the total pressure p
   (:func:`service.core.simulation.air_transport.vapor_air_diffusivity`), L the product's
   characteristic size and Sh the Sherwood number of a sphere of diameter L in still
   gas, by the heat and mass transfer analogy from Churchill's natural-convection
   correlation:

       Sh = 2 + 0.589 Ra^(1/4) / [1 + (0.469/Sc)^(9/16)]^(4/9),
       Ra = g |rho_s - rho_g| L^3 / (rho_f nu D),   Sc = nu / D,

   with the gas densities of the air-vapor mixture at the surface (T_s, vapor at
   min(p_eq, p)) and in the chamber, their mean rho_f and nu = mu_air(T_f) / rho_f.

Since D p does not depend on pressure and Ra falls as p^2, the conductance of the gas
grows without bound as the air is pumped out (as 1 / p_a once Sh is 2): the flux tends
to the Hertz-Knudsen-Langmuir flux near pure vapor and is limited by the air near
atmospheric pressure. The log-mean form also covers a surface whose vapor pressure is
above the chamber pressure (p_eq > p: the product boils and pushes the air away): the
interface then sits just below p, and the flux is the surface flux against the total
pressure. A negative j is condensation onto the product.

Series solve: with u = p - p_i (the air partial pressure at the interface, 0 < u < p)
and s = ln u, the two fluxes are equal where

    h(s) = C (ln p_a - s) - G_k (p_eq - p + e^s) = 0,   C = A k_c p / (R T_f).

h is strictly decreasing and concave, h(-inf) = +inf and h(ln p) < 0, so the root is
unique and Newton's method from s = ln p converges to it monotonically.

Valid range: Churchill's correlation is stated for Ra <= 1e11 and Pr >= 0.7; here it is
used with Sc (0.6 for water vapor in air), a slight extrapolation. The film temperature
of the simulation (243 K to 373 K) is within the diffusivity's range. The still-gas
Sherwood number ignores any forced flow in the chamber (the pump's suction, fans): the
air limit it gives is an upper bound on the air's resistance.

References
----------
- Churchill, S. W. (1983), free convection around immersed bodies, in Heat Exchanger
  Design Handbook, Hemisphere, sec. 2.5.7; as given in Incropera, F. P., DeWitt, D. P.,
  Bergman, T. L. and Lavine, A. S., *Fundamentals of Heat and Mass Transfer*, 6th ed.,
  Wiley (2007), eq. (9.35), and its heat and mass transfer analogy, sec. 6.7 (from memory;
  the correlation's constants checked against a secondary web source).
- Stefan flow (evaporation through a stagnant gas, log-mean form): Bird, R. B., Stewart,
  W. E. and Lightfoot, E. N., *Transport Phenomena*, 2nd ed., Wiley (2002), sec. 18.2
  (from memory).
"""

from __future__ import annotations

import math
from typing import Final, NamedTuple

from service.core.errors import NotConvergedError
from service.core.properties.constants import MOLAR_MASS, SPECIFIC_GAS_CONSTANT
from service.core.simulation.air_transport import (
    AIR_MOLAR_MASS,
    MOLAR_GAS_CONSTANT,
    air_viscosity,
    vapor_air_diffusivity,
)
from service.core.simulation.evaporation import KineticEvaporation

__all__ = [
    "DEFAULT_CHARACTERISTIC_SIZE",
    "GRAVITY",
    "AirLimitedEvaporation",
    "SeriesFlux",
    "sphere_sherwood_number",
]

DEFAULT_CHARACTERISTIC_SIZE: Final = 0.1
"""m: diameter of one item taken when the case gives none (a lettuce head, a loaf, a tray
of produce of that size; common practice, no source)."""

GRAVITY: Final = 9.80665
"""m/s2, standard acceleration of gravity (CGPM 1901)."""

_MAX_ITERATIONS: Final = 200
_STEP_TOLERANCE: Final = 1e-14


def sphere_sherwood_number(rayleigh: float, schmidt: float) -> float:
    """Sherwood number of a sphere in still gas: natural convection plus diffusion.

    Parameters
    ----------
    rayleigh : float
        Mass-transfer Rayleigh number on the diameter, >= 0 (stated up to 1e11).
    schmidt : float
        Schmidt number nu / D, > 0 (stated from 0.7; used down to 0.5).

    Notes
    -----
    Sh = 2 + 0.589 Ra^(1/4) / [1 + (0.469/Sc)^(9/16)]^(4/9) (Churchill 1983, the mass
    transfer form of Incropera et al. 6th ed. eq. 9.35, from memory). Sh = 2 at Ra = 0
    is the exact steady diffusion from a sphere into an unbounded still medium.

    Examples
    --------
    >>> sphere_sherwood_number(0.0, 0.6)
    2.0
    """
    denominator = (1.0 + (0.469 / schmidt) ** (9.0 / 16.0)) ** (4.0 / 9.0)
    return float(2.0 + 0.589 * rayleigh**0.25 / denominator)


class SeriesFlux(NamedTuple):
    """The series solve at one state (SI).

    Attributes
    ----------
    rate : float
        Net evaporation, kg/s (negative: condensation).
    interface_pressure : float
        Vapor partial pressure p_i between the surface and the gas, Pa.
    kinetic_rate : float
        The Hertz-Knudsen-Langmuir flux alone, G_k (p_eq - p_v), kg/s.
    sherwood : float
        Sherwood number.
    iterations : int
        Newton iterations of the series solve.
    """

    rate: float
    interface_pressure: float
    kinetic_rate: float
    sherwood: float
    iterations: int


class AirLimitedEvaporation:
    """Evaporation from the product through the chamber air, kg/s.

    Parameters
    ----------
    area : float
        Exposed area A, m2, > 0.
    coefficient : float
        Evaporation coefficient alpha, (0, 1].
    characteristic_size : float
        Diameter L of one item as an equivalent sphere, m, > 0.
    gas_temperature : float
        Chamber gas temperature T_g, K.

    Examples
    --------
    >>> flux = AirLimitedEvaporation(1.0, 1.0, 0.1, 293.15)
    >>> near_atmosphere = flux.rate(293.15, 2339.0, 0.0, 101325.0)
    >>> near_vacuum = flux.rate(293.15, 2339.0, 0.0, 1.0)
    >>> near_atmosphere < 1e-3 < near_vacuum
    True
    """

    def __init__(
        self, area: float, coefficient: float, characteristic_size: float, gas_temperature: float
    ) -> None:
        self.area = area
        self.characteristic_size = characteristic_size
        self.gas_temperature = gas_temperature
        self.surface = KineticEvaporation(area, coefficient)

    def gas_conductance(
        self,
        surface_temperature: float,
        equilibrium_pressure: float,
        vapor_pressure: float,
        air_pressure: float,
    ) -> tuple[float, float]:
        """C = A k_c p / (R T_f), kg/s, and the Sherwood number.

        Parameters are the surface temperature (K), its equilibrium vapor pressure (Pa),
        and the chamber's vapor and air partial pressures (Pa, air > 0).
        """
        total = air_pressure + vapor_pressure
        film = 0.5 * (surface_temperature + self.gas_temperature)
        diffusivity = vapor_air_diffusivity(film, total)
        surface_vapor = min(equilibrium_pressure, total)
        surface_density = (
            (total - surface_vapor) * AIR_MOLAR_MASS + surface_vapor * MOLAR_MASS
        ) / (MOLAR_GAS_CONSTANT * surface_temperature)
        gas_density = (air_pressure * AIR_MOLAR_MASS + vapor_pressure * MOLAR_MASS) / (
            MOLAR_GAS_CONSTANT * self.gas_temperature
        )
        mean_density = 0.5 * (surface_density + gas_density)
        viscosity = air_viscosity(film)
        kinematic = viscosity / mean_density
        size = self.characteristic_size
        rayleigh = (
            GRAVITY
            * abs(surface_density - gas_density)
            * size**3
            / (mean_density * kinematic * diffusivity)
        )
        sherwood = sphere_sherwood_number(rayleigh, kinematic / diffusivity)
        coefficient = sherwood * diffusivity / size
        conductance = self.area * coefficient * total / (SPECIFIC_GAS_CONSTANT * film)
        return conductance, sherwood

    def solve(
        self,
        surface_temperature: float,
        equilibrium_pressure: float,
        vapor_pressure: float,
        air_pressure: float,
    ) -> SeriesFlux:
        """The flux of both resistances in series at one state.

        Parameters
        ----------
        surface_temperature : float
            T_s, K.
        equilibrium_pressure : float
            p_eq(T_s), Pa, > 0.
        vapor_pressure, air_pressure : float
            Partial pressures in the chamber, Pa; air >= 0 (0: the surface flux alone).

        Raises
        ------
        NotConvergedError
            The series solve did not converge (not expected: see the module notes).
        """
        kinetic = self.surface.conductance(surface_temperature)
        kinetic_rate = kinetic * (equilibrium_pressure - vapor_pressure)
        total = air_pressure + vapor_pressure
        if air_pressure <= 0.0 or vapor_pressure < 0.0:
            # no air (or an integrator's undershoot below zero): the surface alone
            return SeriesFlux(kinetic_rate, vapor_pressure, kinetic_rate, math.inf, 0)
        gas, sherwood = self.gas_conductance(
            surface_temperature, equilibrium_pressure, vapor_pressure, air_pressure
        )
        log_air = math.log(air_pressure)
        offset = equilibrium_pressure - total
        s = math.log(total)
        iterations = 0
        while iterations < _MAX_ITERATIONS:
            iterations += 1
            u = math.exp(s)
            residual = gas * (log_air - s) - kinetic * (offset + u)
            step = residual / (gas + kinetic * u)
            s += step
            if abs(step) <= _STEP_TOLERANCE * max(1.0, abs(s)) or step >= 0.0:
                break
        else:
            raise NotConvergedError(
                "air-limited evaporation: series solve of surface and gas resistances",
                _MAX_ITERATIONS,
                abs(step),
            )
        rate = gas * (log_air - s)
        return SeriesFlux(rate, total - math.exp(s), kinetic_rate, sherwood, iterations)

    def rate(
        self,
        surface_temperature: float,
        equilibrium_pressure: float,
        vapor_pressure: float,
        air_pressure: float,
    ) -> float:
        """Net evaporation, kg/s (see :meth:`solve`)."""
        return self.solve(
            surface_temperature, equilibrium_pressure, vapor_pressure, air_pressure
        ).rate
