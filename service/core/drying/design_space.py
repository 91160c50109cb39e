"""The primary-drying design space: shelf temperature x chamber pressure, vectorized.

For every setting the quasi-steady front balance gives the product temperature and the
sublimation rate, at one dried-layer thickness or over the whole run (at the nodes of a
Gauss-Legendre rule in the thickness, from which the drying time follows). The safe region
keeps the ice front below the critical temperature and the batch's rate within the dryer's
limit; the fastest setting inside it is reported.

References
----------
S. A. Giordano, A. A. Barresi, D. Fissore, J. Pharm. Sci. 100(1), 311-324 (2011) (design
space of primary drying); M. J. Pikal, J. Parenter. Sci. Technol. 39(3), 115-139 (1985)
(the vial model).
"""

from __future__ import annotations

from dataclasses import dataclass
from typing import Final

import numpy as np
from numpy.typing import NDArray

from service.core.drying.cases import (
    CHAMBER_PRESSURE_RANGE,
    SHELF_TEMPERATURE_RANGE,
    DryingLoad,
    EquipmentLimit,
    validate_critical_temperature,
)
from service.core.drying.coefficients import DriedLayerResistance, VialHeatTransfer
from service.core.drying.front import (
    STATUS_FRONT_AT_TRIPLE_POINT,
    STATUS_NO_DRIVING_FORCE,
    STATUS_SUBLIMATING,
    solve_sublimation_front,
)
from service.core.drying.references import ASSUMPTIONS, REFERENCES
from service.core.errors import InvalidInputError, OutOfRangeError
from service.core.properties.lookups import ReportedUncertainty, path_uncertainties
from service.core.properties.phase import FloatArray
from service.core.properties.sources import (
    IAPWS_95,
    ICE_IH,
    MELTING_AND_SUBLIMATION,
    PropertySource,
)
from service.core.validation import finite_array, require_within

__all__ = [
    "CELL_STATUSES",
    "MAXIMUM_GRID_SIDE",
    "DesignSpaceCase",
    "DesignSpaceResult",
    "primary_drying_design_space",
]

MAXIMUM_GRID_SIDE: Final = 100
"""Largest number of shelf temperatures (and of chamber pressures) in one grid."""

CELL_STATUSES: Final = {
    STATUS_SUBLIMATING: "sublimating",
    STATUS_NO_DRIVING_FORCE: "no-sublimation",
    STATUS_FRONT_AT_TRIPLE_POINT: "front-melts",
}
"""Names of the per-setting status codes."""

_THICKNESS_NODES: Final = 24


@dataclass(frozen=True)
class DesignSpaceCase:
    """A grid of settings for one load (SI).

    Attributes
    ----------
    load, heat_transfer, resistance
        As for a run.
    shelf_temperatures : ndarray
        K, 1-D, strictly increasing.
    chamber_pressures : ndarray
        Pa, 1-D, strictly increasing.
    critical_temperature : float
        K.
    equipment_limit : EquipmentLimit or None
        Largest batch sublimation rate against chamber pressure.
    dried_layer_thickness : float or None
        m: evaluate at this thickness; None: over the whole run (drying time).
    """

    load: DryingLoad
    heat_transfer: VialHeatTransfer
    resistance: DriedLayerResistance
    shelf_temperatures: FloatArray
    chamber_pressures: FloatArray
    critical_temperature: float
    equipment_limit: EquipmentLimit | None = None
    dried_layer_thickness: float | None = None

    def validate(self) -> None:
        """Raise for an input outside the model's range (naming the request field)."""
        self.load.validate()
        self.heat_transfer.validate("vial_heat_transfer")
        self.resistance.validate("dried_layer_resistance")
        for values, name, limits, unit in (
            (self.shelf_temperatures, "shelf_temperatures", SHELF_TEMPERATURE_RANGE, "K"),
            (self.chamber_pressures, "chamber_pressures", CHAMBER_PRESSURE_RANGE, "Pa"),
        ):
            array = finite_array(values, name)
            if array.ndim != 1 or not 1 <= array.size <= MAXIMUM_GRID_SIDE:
                raise InvalidInputError(
                    name, f"give 1 to {MAXIMUM_GRID_SIDE} values ({array.size} given)"
                )
            if np.any(np.diff(array) <= 0.0):
                raise InvalidInputError(name, "values must be strictly increasing")
            require_within(array, name, *limits, unit, "drying model range")
        validate_critical_temperature(self.critical_temperature)
        if self.equipment_limit is not None:
            self.equipment_limit.validate(self.chamber_pressures, "equipment_limit")
        if self.dried_layer_thickness is not None:
            require_within(
                finite_array(self.dried_layer_thickness, "dried_layer_thickness"),
                "dried_layer_thickness",
                0.0,
                self.load.fill_depth,
                "m",
                "no ice left: the dried layer must be thinner than the fill depth "
                "(fill volume / inner area)",
            )
            if self.dried_layer_thickness >= self.load.fill_depth:
                raise OutOfRangeError(
                    "dried_layer_thickness",
                    self.dried_layer_thickness,
                    0.0,
                    self.load.fill_depth,
                    "m",
                    "no ice left: the dried layer must be thinner than the fill depth",
                )


@dataclass(frozen=True)
class DesignSpaceResult:
    """Arrays of shape (shelf temperatures, chamber pressures), SI.

    Where a cell's ``status`` is not "sublimating" its temperatures, rates and drying time
    are NaN here (the answer shows them as null).

    Attributes
    ----------
    front_temperature : ndarray
        At the stated thickness, or the highest over the run, K.
    bottom_temperature : ndarray
        Likewise at the container bottom, K.
    sublimation_rate : ndarray
        Per container, at the stated thickness or the highest over the run (the start), kg/s.
    batch_sublimation_rate : ndarray
        The whole batch, kg/s.
    drying_time : ndarray or None
        Whole-run mode only: primary drying time at constant settings, s.
    equipment_rate_limit : ndarray or None
        The dryer's limit at each chamber pressure, kg/s (1-D over pressures).
    status : ndarray of int8
        Codes of :data:`CELL_STATUSES`.
    safe : ndarray of bool
        Sublimating, front below the critical temperature, within the equipment limit.
    fastest : tuple of int or None
        (shelf index, pressure index) of the safe cell with the shortest drying time (or,
        at a stated thickness, the highest sublimation rate); None if no cell is safe.
    """

    shelf_temperatures: FloatArray
    chamber_pressures: FloatArray
    dried_layer_thickness: float | None
    front_temperature: FloatArray
    bottom_temperature: FloatArray
    sublimation_rate: FloatArray
    batch_sublimation_rate: FloatArray
    drying_time: FloatArray | None
    equipment_rate_limit: FloatArray | None
    status: NDArray[np.int8]
    safe: NDArray[np.bool_]
    fastest: tuple[int, int] | None
    critical_temperature: float
    assumptions: tuple[str, ...]
    references: tuple[str, ...]
    property_sources: tuple[PropertySource, ...]
    property_uncertainties: tuple[ReportedUncertainty, ...]


def primary_drying_design_space(case: DesignSpaceCase) -> DesignSpaceResult:
    """Product temperature, sublimation rate and drying time over a grid of settings.

    Parameters
    ----------
    case : DesignSpaceCase

    Returns
    -------
    DesignSpaceResult

    Raises
    ------
    OutOfRangeError, InvalidInputError
        For inputs outside the model's range, or a grid where no setting sublimes.

    Notes
    -----
    One vectorized call of :func:`service.core.drying.front.solve_sublimation_front` over
    (shelf temperature, chamber pressure[, thickness node]). Over the whole run, the
    thickness nodes are a 24-point Gauss-Legendre rule on [0, L_0] plus both ends; the drying
    time at constant settings is ``t = (m_0 / L_0) * integral_0^L_0 dl / m_dot(l)`` and the
    highest front temperature is taken over the nodes (it rises as the cake grows).
    """
    case.validate()
    load = case.load
    depth = load.fill_depth
    shelf = case.shelf_temperatures[:, None, None]
    pressure = case.chamber_pressures[None, :, None]
    if case.dried_layer_thickness is not None:
        dried = np.array([case.dried_layer_thickness])
        weights = None
    else:
        nodes, gauss = np.polynomial.legendre.leggauss(_THICKNESS_NODES)
        dried = np.concatenate([[0.0], 0.5 * depth * (nodes + 1.0), [depth]])
        weights = 0.5 * depth * gauss
    solved = solve_sublimation_front(
        shelf,
        pressure,
        dried[None, None, :],
        (depth - dried)[None, None, :],
        heat_transfer=case.heat_transfer,
        resistance=case.resistance,
        heat_transfer_area=load.heat_transfer_area,
        product_area=load.product_area,
        frozen_conductivity=load.frozen_conductivity,
    )
    status = np.max(solved.status, axis=2).astype(np.int8)
    sublimating = status == STATUS_SUBLIMATING
    if not np.any(sublimating):
        raise OutOfRangeError(
            "chamber_pressures",
            float(case.chamber_pressures[0]),
            None,
            None,
            "Pa",
            "no setting of the grid sublimes: every chamber pressure is at or above the "
            "ice's vapor pressure at the shelf temperature (or the ice front would melt)",
        )
    nan = np.nan
    front = np.where(sublimating, np.max(solved.front_temperature, axis=2), nan)
    bottom = np.where(sublimating, np.max(solved.bottom_temperature, axis=2), nan)
    rate = np.where(sublimating, np.max(solved.sublimation_rate, axis=2), nan)
    drying_time = None
    if weights is not None:
        inner = solved.sublimation_rate[:, :, 1:-1]
        inverse = np.where(inner > 0.0, 1.0 / np.where(inner > 0.0, inner, 1.0), 0.0)
        drying_time = np.where(sublimating, load.ice_mass / depth * (inverse @ weights), nan)
    batch = load.container_count * rate
    limit = None
    within = np.ones_like(sublimating)
    if case.equipment_limit is not None:
        limit = case.equipment_limit.at(case.chamber_pressures)
        within = np.where(sublimating, batch <= limit[None, :], False)
    safe = sublimating & within & np.where(sublimating, front < case.critical_temperature, False)
    fastest: tuple[int, int] | None = None
    if np.any(safe):
        score = drying_time if drying_time is not None else -rate
        masked = np.where(safe, score, np.inf)
        flat = int(np.argmin(masked))
        fastest = (flat // masked.shape[1], flat % masked.shape[1])
    visited = solved.front_temperature[
        np.broadcast_to(sublimating[:, :, None], solved.status.shape)
    ]
    return DesignSpaceResult(
        shelf_temperatures=case.shelf_temperatures,
        chamber_pressures=case.chamber_pressures,
        dried_layer_thickness=case.dried_layer_thickness,
        front_temperature=front,
        bottom_temperature=bottom,
        sublimation_rate=rate,
        batch_sublimation_rate=batch,
        drying_time=drying_time,
        equipment_rate_limit=limit,
        status=status,
        safe=safe,
        fastest=fastest,
        critical_temperature=case.critical_temperature,
        assumptions=ASSUMPTIONS,
        references=REFERENCES,
        property_sources=(MELTING_AND_SUBLIMATION, ICE_IH, IAPWS_95),
        property_uncertainties=tuple(path_uncertainties(visited)),
    )
