"""Right-hand side of the chamber and product balances (the ODE system).

State vector y (SI):

====  ==================  =================================================
0     p_a                 air partial pressure, Pa
1     m_v                 water vapor in the chamber gas, kg
2     m                   product water (liquid + ice), kg
3     E                   product energy (see product_state), J
4     m_c                 ice on the condenser, kg
5     m_pump              vapor taken by the pump, kg (accumulated)
6     H_v                 enthalpy carried by vapor leaving the product, J (accumulated)
7     Q_c                 condenser heat, J (accumulated)
8     Q_g                 heat gained by the product, J (accumulated)
9...  E_0 ... E_(N-2)     interior nodes' energies, J (only with the interior
                          model, :mod:`service.core.simulation.product_interior`;
                          the surface node holds E minus their sum)
====  ==================  =================================================

Balances (chamber gas ideal and isothermal at T_g, volume V, well mixed):

    V dp_a/dt = Q_leak - S_eff(p) p_a                       (air, pump-down law)
    dm_v/dt   = j - S_eff(p) m_v / V - j_c                  (vapor)
    dm/dt     = -j,     dE/dt = -h_v(T) j + Q_gain          (product)

with p = p_a + p_v, p_v = m_v R T_g / V, the product evaporation j, the condenser
capture j_c (:mod:`service.core.simulation.condenser`) and the heat gain
Q_gain = P + UA (T_sur - T) + wall radiation + shelf contact
(:mod:`service.core.simulation.product_heating`).

Evaporation j:

- kinetic: Hertz-Knudsen-Langmuir surface flux in series with vapor diffusion through
  the chamber air (:mod:`service.core.simulation.air_limited_evaporation`);
- equilibrium, regime "sealed" (chamber pressure above the product's vapor pressure):
  j = 0, evaporation into the air neglected;
- equilibrium, regime "boiling" (from the flash point on): the product boils and holds
  the chamber at its vapor pressure, p_a + p_v = p_eq(E, m). Differentiating the
  constraint with m_v = k (p_eq - p_a), k = V / (R T_g), gives j in closed form:

      j = (S_eff k p_v + j_c + k dp_eq/dE Q_gain - k dp_a/dt)
          / (1 + k (dp_eq/dE h_v + dp_eq/dm)),

  valid while j >= 0 (otherwise the product stops boiling: back to "sealed").

References
----------
Chamber vapor and air balances: Wang, L. and Sun, D.-W. (2002), "Modelling vacuum
cooling process of cooked meat - part 1: analysis of vacuum cooling system",
Int. J. Refrigeration 25(7), 854-861 (from memory). Pump-down law V dp/dt = Q - S p:
standard vacuum-technology result (O'Hanlon, *A User's Guide to Vacuum Technology*,
3rd ed., Wiley (2003); from memory).
"""

from __future__ import annotations

from typing import Final, Literal, NamedTuple

import numpy as np

from service.core.properties.constants import SPECIFIC_GAS_CONSTANT
from service.core.properties.phase import FloatArray
from service.core.simulation.air_limited_evaporation import AirLimitedEvaporation
from service.core.simulation.condenser import CondenserCapture
from service.core.simulation.inputs import HeatGainRate
from service.core.simulation.product_heating import ProductHeating
from service.core.simulation.product_interior import InteriorConduction
from service.core.simulation.product_state import ProductState, ProductThermodynamics
from service.core.simulation.pump import PumpingSpeed

__all__ = ["STATE_SIZE", "ChamberModel", "Rates", "Regime"]

Regime = Literal["kinetic", "sealed", "boiling"]

STATE_SIZE: Final = 9
AIR, VAPOR, WATER, ENERGY, CONDENSED, PUMPED, VAPOR_ENTHALPY, CONDENSER_HEAT, HEAT_GAINED = range(
    STATE_SIZE
)


class Rates(NamedTuple):
    """Everything the balances need at one state (floats, SI)."""

    product: ProductState
    air_pressure: float
    vapor_pressure: float
    total_pressure: float
    pump_speed: float
    evaporation: float
    air_throughput: float
    vapor_to_pump: float
    vapor_to_condenser: float
    condenser_load: float
    heat_gain: float
    surface_temperature: float = 0.0
    """K: the surface node's (the product's, lumped)."""
    core_temperature: float = 0.0
    """K: the centre node's (the product's, lumped)."""
    node_temperatures: tuple[float, ...] = ()
    """K, centre to surface (empty: lumped)."""
    node_heat_flows: tuple[float, ...] = ()
    """W into each interior node (conduction, less the enthalpy of the water it gives up
    to the surface and of the vapor leaving its pores); empty: lumped."""
    surface_evaporation: float = 0.0
    """kg/s leaving the product's surface (``evaporation`` less the pores')."""
    vapor_enthalpy_flow: float = 0.0
    """W: enthalpy carried by all the vapor leaving the product."""


class _Inside(NamedTuple):
    """The interior nodes at one state (interior model only)."""

    product: ProductState
    states: list[ProductState]
    """The interior nodes' states (the surface node's is ``product``'s pressures)."""
    temperatures: FloatArray
    """K, all N nodes, centre to surface."""
    flows: FloatArray
    """W of conduction into each of the N nodes."""
    liquid_enthalpies: FloatArray
    """J/kg, h_l(T_i) of the interior nodes."""
    vapor_enthalpies: FloatArray
    """J/kg, h_v(T_i) of the interior nodes."""
    carried: FloatArray
    """J per kg evaporated: f_i h_l(T_i), the liquid enthalpy each interior node sends to
    the surface with its share of the water."""


class ChamberModel:
    """The ODE system of one case.

    Parameters
    ----------
    volume, gas_temperature, leak_rate : float
        m3, K, Pa m3/s.
    pump : PumpingSpeed
    condenser : CondenserCapture or None
    product : ProductThermodynamics
    evaporation : AirLimitedEvaporation or None
        The kinetic model (surface and air resistances in series); None for the
        equilibrium model.
    heat_gain : HeatGainRate or None
    interior : InteriorConduction or None
        Conduction inside the product (its nodes' energies follow the nine chamber
        states); None: one uniform product temperature.
    """

    def __init__(
        self,
        *,
        volume: float,
        gas_temperature: float,
        leak_rate: float,
        pump: PumpingSpeed,
        condenser: CondenserCapture | None,
        product: ProductThermodynamics,
        evaporation: AirLimitedEvaporation | None,
        heat_gain: HeatGainRate | None,
        interior: InteriorConduction | None = None,
    ) -> None:
        self.volume = volume
        self.gas_temperature = gas_temperature
        self.vapor_per_pressure = volume / (SPECIFIC_GAS_CONSTANT * gas_temperature)
        self.leak_rate = leak_rate
        self.pump = pump
        self.condenser = condenser
        self.product = product
        self.evaporation = evaporation
        self.regime: Regime = "kinetic" if evaporation is not None else "sealed"
        self.heating = ProductHeating(heat_gain, gas_temperature)
        self.interior = interior
        self.state_size = STATE_SIZE + (0 if interior is None else interior.count - 1)
        self._key: tuple[float, float, float, float, str, bool, tuple[float, ...]] | None = None
        self._rates: Rates | None = None
        self._guess = 300.0
        self.evaluations = 0

    def start_from(self, temperature: float) -> None:
        """Start Newton's method for the product temperature from ``temperature`` (K)."""
        self._guess = temperature
        if self.interior is not None:
            self.interior.start_from(temperature)

    def product_state(self, energy: float, water: float) -> ProductState:
        """The product's state, Newton warm-started from the last temperature."""
        state = self.product.state(energy, water, self._guess)
        self._guess = state.temperature
        return state

    def rates(self, y: FloatArray) -> Rates:
        """All rates at state ``y`` (memoized on the last state and regime)."""
        air, vapor_mass, water, energy = y[:4].tolist()
        regime = self.regime
        extras = tuple(y[STATE_SIZE:].tolist())
        key = (air, vapor_mass, water, energy, regime, self.product.supercooled, extras)
        if key == self._key and self._rates is not None:
            return self._rates
        self.evaluations += 1
        inside: _Inside | None = None
        if self.interior is None:
            product = self.product_state(energy, water)
            temperature = core = product.temperature
        else:
            inside = self._inside(energy, water, extras)
            product = inside.product
            temperature, core = inside.temperatures[-1], inside.temperatures[0]
        heat = self.heating.rate(temperature)
        k = self.vapor_per_pressure
        vapor = product.equilibrium_pressure - air if regime == "boiling" else vapor_mass / k
        total = air + vapor
        speed = self.pump(total)
        air_throughput = speed * air
        to_pump = speed * vapor * k / self.volume
        to_condenser = 0.0 if self.condenser is None else self.condenser.rate(vapor)
        # the interior's terms (all zero for the lumped product): conduction into the
        # surface node, the liquid enthalpy the nodes send it per kg evaporated, the
        # surface node's share of the water, and the pores' evaporation
        conducted = advected = pores = pore_liquid = pore_enthalpy = 0.0
        surface_share = 1.0
        pore_rates = np.zeros(0)
        if inside is not None:
            assert self.interior is not None
            conducted = float(inside.flows[-1])
            advected = float(np.sum(inside.carried))
            surface_share = self.interior.surface_share
            pore_rates = self.interior.pore_evaporation(inside.states, total)
            pores = float(np.sum(pore_rates))
            pore_liquid = float(np.dot(pore_rates, inside.liquid_enthalpies))
            pore_enthalpy = float(np.dot(pore_rates, inside.vapor_enthalpies))
        if regime == "kinetic":
            assert self.evaporation is not None
            evaporation = self.evaporation.rate(
                temperature, product.equilibrium_pressure, vapor, air
            )
        elif regime == "sealed":
            evaporation = 0.0
        else:
            air_rate = (self.leak_rate - air_throughput) / self.volume
            evaporation = (
                to_pump
                + to_condenser
                - pores
                + k
                * (
                    product.pressure_by_energy * (heat + conducted + pores * advected - pore_liquid)
                    - product.pressure_by_mass * surface_share * pores
                )
                - k * air_rate
            ) / (
                1.0
                + k
                * (
                    product.pressure_by_energy * (product.vapor_enthalpy - advected)
                    + product.pressure_by_mass * surface_share
                )
            )
        load = 0.0 if self.condenser is None else to_condenser * self.condenser.heat_per_mass
        surface_evaporation = evaporation
        evaporation += pores
        node_flows: tuple[float, ...] = ()
        if inside is not None:
            assert self.interior is not None
            shares = self.interior.grid.fractions[:-1]
            node_flows = tuple(
                (
                    inside.flows[:-1]
                    - pore_rates * inside.vapor_enthalpies
                    - (shares * evaporation - pore_rates) * inside.liquid_enthalpies
                ).tolist()
            )
        rates = Rates(
            product=product,
            air_pressure=air,
            vapor_pressure=vapor,
            total_pressure=total,
            pump_speed=speed,
            evaporation=evaporation,
            air_throughput=air_throughput,
            vapor_to_pump=to_pump,
            vapor_to_condenser=to_condenser,
            condenser_load=load,
            heat_gain=heat,
            surface_temperature=temperature,
            core_temperature=core,
            node_temperatures=() if inside is None else tuple(inside.temperatures.tolist()),
            node_heat_flows=node_flows,
            surface_evaporation=surface_evaporation,
            vapor_enthalpy_flow=surface_evaporation * product.vapor_enthalpy + pore_enthalpy,
        )
        self._key, self._rates = key, rates
        return rates

    def _inside(self, energy: float, water: float, interior_energies: tuple[float, ...]) -> _Inside:
        """The interior nodes at this state, and the product the chamber sees: its surface
        node, with the nodes' mean temperature, ice and smallest margins."""
        assert self.interior is not None
        states = self.interior.states(energy, water, interior_energies)
        temperatures = np.array([state.temperature for state in states])
        surface = states[-1]
        product = ProductState(
            temperature=self.interior.mean_temperature(temperatures),
            ice_mass=sum(state.ice_mass for state in states),
            equilibrium_pressure=surface.equilibrium_pressure,
            vapor_enthalpy=surface.vapor_enthalpy,
            pressure_by_energy=surface.pressure_by_energy,
            pressure_by_mass=surface.pressure_by_mass,
            liquid_margin=min(state.liquid_margin for state in states),
            frozen_margin=min(state.frozen_margin for state in states),
        )
        liquid = self.interior.liquid_enthalpies(temperatures[:-1])
        return _Inside(
            product=product,
            states=states[:-1],
            temperatures=temperatures,
            flows=self.interior.heat_flows(temperatures),
            liquid_enthalpies=liquid,
            vapor_enthalpies=np.array([state.vapor_enthalpy for state in states[:-1]]),
            carried=self.interior.grid.fractions[:-1] * liquid,
        )

    def derivatives(self, t: float, y: FloatArray) -> FloatArray:
        """dy/dt (the ``fun`` of :func:`scipy.integrate.solve_ivp`)."""
        r = self.rates(y)
        j = r.evaporation
        chamber = np.array(
            [
                (self.leak_rate - r.air_throughput) / self.volume,
                j - r.vapor_to_pump - r.vapor_to_condenser,
                -j,
                r.heat_gain - r.vapor_enthalpy_flow,
                r.vapor_to_condenser,
                r.vapor_to_pump,
                r.vapor_enthalpy_flow,
                r.condenser_load,
                r.heat_gain,
            ]
        )
        if self.interior is None:
            return chamber
        return np.concatenate([chamber, r.node_heat_flows])
