"""Energy and mass balances of loads that cool, freeze and sublime under vacuum.

Public API:

- :func:`flash_freeze` with :class:`FlashFreezeCase` -> :class:`FlashFreezeResult`;
- :func:`evaporative_cooling` with :class:`EvaporativeCoolingCase` ->
  :class:`EvaporativeCoolingResult`;
- :func:`propagate_input_uncertainty` and :func:`property_uncertainty_of_evaporation`;
- building blocks: :class:`Companion`, :func:`companion_of`, :class:`HeatGain`,
  :class:`Solute`, :func:`named_solute`, :class:`Composition`, :class:`DissolvedSolids`,
  :func:`named_dissolved_solids`, :func:`solution_freezing_point`.
"""

from service.core.balances.companions import MATERIAL_SPECIFIC_HEATS, Companion, companion_of
from service.core.balances.evaporative_cooling import (
    EVAPORATIVE_COOLING_LIMITS,
    EvaporativeCoolingCase,
    EvaporativeCoolingResult,
    FreezingPointBasis,
    evaporative_cooling,
)
from service.core.balances.flash_freeze import (
    FLASH_FREEZE_LIMITS,
    FlashFreezeCase,
    FlashFreezeResult,
    flash_freeze,
)
from service.core.balances.food_composition import Composition
from service.core.balances.heat_gain import HeatGain
from service.core.balances.results import EnergyBalance, MethodComparison, StageResult, Trajectory
from service.core.balances.solutes import (
    NAMED_SOLUTES,
    DissolvedSolids,
    Solute,
    named_dissolved_solids,
    named_solute,
)
from service.core.balances.solution_freezing import solution_freezing_point
from service.core.balances.uncertainty import (
    InputUncertainty,
    PropertyUncertainty,
    propagate_input_uncertainty,
    property_uncertainty_of_evaporation,
)

__all__ = [
    "EVAPORATIVE_COOLING_LIMITS",
    "FLASH_FREEZE_LIMITS",
    "MATERIAL_SPECIFIC_HEATS",
    "NAMED_SOLUTES",
    "Companion",
    "Composition",
    "DissolvedSolids",
    "EnergyBalance",
    "EvaporativeCoolingCase",
    "EvaporativeCoolingResult",
    "FlashFreezeCase",
    "FlashFreezeResult",
    "FreezingPointBasis",
    "HeatGain",
    "InputUncertainty",
    "MethodComparison",
    "PropertyUncertainty",
    "Solute",
    "StageResult",
    "Trajectory",
    "companion_of",
    "evaporative_cooling",
    "flash_freeze",
    "named_dissolved_solids",
    "named_solute",
    "propagate_input_uncertainty",
    "property_uncertainty_of_evaporation",
    "solution_freezing_point",
]
