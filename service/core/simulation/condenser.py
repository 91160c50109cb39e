"""Vapor capture by a condenser (cold trap) in the chamber.

Model
-----
The condenser takes in chamber vapor through a conductance C (its pumping speed for
water vapor, m3/s) and returns what its ice gives off, at the sublimation pressure of
its surface:

    j_c = C (p_v - p_sub(T_c)) / (R T_g),  when p_v > p_sub(T_c), else 0,

capped, when a refrigeration capacity P_ref is given, at P_ref / (h_v(T_g) - h_ice(T_c)),
the rate at which the refrigeration removes the heat of taking chamber vapor at T_g to
ice at T_c. The condenser load is j_c (h_v(T_g) - h_ice(T_c)). The captured ice never
sublimes back (the chamber vapor pressure stays above the condenser's).

An ideal cold surface of area A (every molecule striking it sticks) has the
conductance A sqrt(R T_g / (2 pi)), the impingement rate of kinetic theory; real
condensers are limited by the gas flow to the surface and take less.

References
----------
Sublimation pressure IAPWS R14-08(2011); ice enthalpy IAPWS R10-06(2009); vapor
enthalpy IAPWS R6-95(2018). Impingement rate p / sqrt(2 pi m k T): Hertz-Knudsen
relation, e.g. Eames, I. W., Marr, N. J. and Sabir, H. (1997), "The evaporation
coefficient of water: a review", Int. J. Heat Mass Transfer 40(12), 2963-2973 (from
memory).
"""

from __future__ import annotations

import numpy as np

from service.core.balances.equilibrium_paths import ice_vapor_states
from service.core.properties.constants import SPECIFIC_GAS_CONSTANT
from service.core.simulation.inputs import Condenser

__all__ = ["CondenserCapture"]


class CondenserCapture:
    """Capture rate and load of one condenser at one chamber gas temperature.

    Parameters
    ----------
    condenser : Condenser
        Validated description.
    gas_temperature : float
        Chamber gas temperature T_g, K.
    gas_vapor_enthalpy : float
        Specific enthalpy of the chamber vapor at T_g, J/kg.
    """

    def __init__(
        self, condenser: Condenser, gas_temperature: float, gas_vapor_enthalpy: float
    ) -> None:
        surface = ice_vapor_states(np.array([condenser.surface_temperature]))
        self.surface_pressure = float(surface.pressure[0])
        self.ice_enthalpy = float(surface.condensed.specific_enthalpy[0])
        self.heat_per_mass = gas_vapor_enthalpy - self.ice_enthalpy
        self._mass_per_pressure = condenser.vapor_conductance / (
            SPECIFIC_GAS_CONSTANT * gas_temperature
        )
        self._rate_cap = (
            None
            if condenser.refrigeration_capacity is None
            else condenser.refrigeration_capacity / self.heat_per_mass
        )

    def rate(self, vapor_pressure: float) -> float:
        """Mass flow of vapor captured, kg/s, at chamber vapor pressure ``vapor_pressure``."""
        excess = vapor_pressure - self.surface_pressure
        if excess <= 0.0:
            return 0.0
        rate = self._mass_per_pressure * excess
        if self._rate_cap is not None and rate > self._rate_cap:
            return self._rate_cap
        return rate
