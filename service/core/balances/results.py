"""Result records shared by the balances.

Every numeric field is a float64 array of the sweep shape (0-d for a single
case); trajectory fields add one trailing axis of points.
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np
from numpy.typing import NDArray

from service.core.properties.phase import FloatArray

__all__ = ["EnergyBalance", "MethodComparison", "StageResult", "Trajectory"]


@dataclass(frozen=True)
class StageResult:
    """One stage of a balance.

    Attributes
    ----------
    name : str
        ``"cooling"``, ``"supercooled cooling"``, ``"recalescence"``, ``"freezing"`` or
        ``"ice cooling"``.
    start_temperature, end_temperature : ndarray
        K.
    start_pressure, end_pressure : ndarray
        Equilibrium vapor pressure at the stage's ends, Pa.
    evaporated_mass : ndarray
        Vapor removed during the stage, kg.
    vapor_enthalpy : ndarray
        Enthalpy the removed vapor carries, integral of h_vapor dm, J (IAPWS reference:
        u = s = 0 for saturated liquid at the triple point).
    heat_removed : ndarray
        Latent heat the vapor takes from the load, integral of (h_vapor - h_condensed) dm,
        J, where the condensed phase is the liquid (cooling, freezing) or ice (ice
        cooling). Reference-independent.
    vapor_volume : ndarray
        Volume the removed vapor occupies at the stage's equilibrium states, integral of
        dm / rho_vapor(T, p), m3 (pump sizing).
    ice_formed : ndarray
        kg of ice formed during the stage.
    heat_gained : ndarray
        Heat gained during the stage, J.
    """

    name: str
    start_temperature: FloatArray
    end_temperature: FloatArray
    start_pressure: FloatArray
    end_pressure: FloatArray
    evaporated_mass: FloatArray
    vapor_enthalpy: FloatArray
    heat_removed: FloatArray
    vapor_volume: FloatArray
    ice_formed: FloatArray
    heat_gained: FloatArray


@dataclass(frozen=True)
class Trajectory:
    """The path of the load, from the integrated solution.

    Attributes
    ----------
    temperature : ndarray
        K.
    pressure : ndarray
        Equilibrium vapor pressure, Pa.
    evaporated_fraction_of_water : ndarray
        Mass evaporated so far / initial water mass.
    ice_fraction : ndarray
        Ice mass / initial water mass.
    liquid_fraction : ndarray
        Liquid water mass / initial water mass.
    stage : ndarray of int
        Index into the result's ``stages`` of the stage each point belongs to.
    """

    temperature: FloatArray
    pressure: FloatArray
    evaporated_fraction_of_water: FloatArray
    ice_fraction: FloatArray
    liquid_fraction: FloatArray
    stage: NDArray[np.int64]


@dataclass(frozen=True)
class EnergyBalance:
    """Energy books of the condensed contents (water, ice, solute, companions).

    initial_energy + heat_gained = final_energy + vapor_enthalpy + boundary_work + residual

    Attributes
    ----------
    initial_energy, final_energy : ndarray
        Internal energy of the condensed contents, J (IAPWS reference for water and ice;
        companions and solute counted as c (T - 273.16 K)).
    vapor_enthalpy : ndarray
        Enthalpy carried off by the vapor, J.
    heat_gained : ndarray
        J.
    boundary_work : ndarray
        Work of the condensed contents against the vapor pressure, integral of p dV, J
        (expansion on freezing, shrinkage by evaporation); of order 0.1 J per kg.
    residual : ndarray
        What is left, J; the integration error.
    relative_residual : ndarray
        residual / vapor_enthalpy.
    """

    initial_energy: FloatArray
    final_energy: FloatArray
    vapor_enthalpy: FloatArray
    heat_gained: FloatArray
    boundary_work: FloatArray
    residual: FloatArray
    relative_residual: FloatArray


@dataclass(frozen=True)
class MethodComparison:
    """The integrated answer and the hand (mean vapor enthalpy) answer side by side.

    Attributes
    ----------
    integrated_evaporated_mass, mean_vapor_enthalpy_evaporated_mass : ndarray
        kg.
    integrated_ice_mass, mean_vapor_enthalpy_ice_mass : ndarray
        kg.
    evaporated_mass_difference : ndarray
        Hand minus integrated, kg.
    relative_difference : ndarray
        (hand - integrated) / integrated evaporated mass.
    """

    integrated_evaporated_mass: FloatArray
    mean_vapor_enthalpy_evaporated_mass: FloatArray
    integrated_ice_mass: FloatArray
    mean_vapor_enthalpy_ice_mass: FloatArray
    evaporated_mass_difference: FloatArray
    relative_difference: FloatArray
