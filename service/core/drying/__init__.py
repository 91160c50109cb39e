"""Primary drying of frozen product in vials or trays: the quasi-steady heat and mass
balance at the ice front, a run over a shelf and pressure recipe, and the design space.

Public API: :func:`solve_sublimation_front`; :func:`simulate_primary_drying` with
:class:`PrimaryDryingCase` -> :class:`PrimaryDryingResult`;
:func:`primary_drying_design_space` with :class:`DesignSpaceCase` -> :class:`DesignSpaceResult`.
"""

from service.core.drying.cases import (
    CHAMBER_PRESSURE_RANGE,
    SHELF_TEMPERATURE_RANGE,
    DryingLoad,
    EquipmentLimit,
    PrimaryDryingCase,
    Recipe,
)
from service.core.drying.coefficients import (
    ICE_THERMAL_CONDUCTIVITY,
    DriedLayerResistance,
    VialHeatTransfer,
)
from service.core.drying.design_space import (
    CELL_STATUSES,
    MAXIMUM_GRID_SIDE,
    DesignSpaceCase,
    DesignSpaceResult,
    primary_drying_design_space,
)
from service.core.drying.front import (
    STATUS_FRONT_AT_TRIPLE_POINT,
    STATUS_NO_DRIVING_FORCE,
    STATUS_SUBLIMATING,
    SublimationFront,
    latent_heat_of_sublimation,
    solve_sublimation_front,
)
from service.core.drying.run import (
    DryingEvent,
    DryingStates,
    IceBalance,
    PrimaryDryingResult,
    PrimaryDryingSummary,
    simulate_primary_drying,
)

__all__ = [
    "CELL_STATUSES",
    "CHAMBER_PRESSURE_RANGE",
    "ICE_THERMAL_CONDUCTIVITY",
    "MAXIMUM_GRID_SIDE",
    "SHELF_TEMPERATURE_RANGE",
    "STATUS_FRONT_AT_TRIPLE_POINT",
    "STATUS_NO_DRIVING_FORCE",
    "STATUS_SUBLIMATING",
    "DesignSpaceCase",
    "DesignSpaceResult",
    "DriedLayerResistance",
    "DryingEvent",
    "DryingLoad",
    "DryingStates",
    "EquipmentLimit",
    "IceBalance",
    "PrimaryDryingCase",
    "PrimaryDryingResult",
    "PrimaryDryingSummary",
    "Recipe",
    "SublimationFront",
    "VialHeatTransfer",
    "latent_heat_of_sublimation",
    "primary_drying_design_space",
    "simulate_primary_drying",
    "solve_sublimation_front",
]
