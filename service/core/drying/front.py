"""The quasi-steady heat and mass balance at the sublimation front of one container.

Heat flows from the shelf through the container bottom and the frozen layer to the ice
front, where it sublimes ice; the vapor leaves through the dried layer into the chamber.
In the quasi-steady state the heat arriving equals the enthalpy of sublimation carried
away, which fixes the front temperature.

References
----------
.. [1] M. J. Pikal, M. L. Roy, S. Shah, "Mass and heat transfer in vial freeze-drying
   of pharmaceuticals: role of the vial", J. Pharm. Sci. 73(9), 1224-1237 (1984).
.. [2] M. J. Pikal, "Use of laboratory data in freeze drying process design: heat and
   mass transfer coefficients and the computer simulation of freeze drying", J. Parenter.
   Sci. Technol. 39(3), 115-139 (1985).
.. [3] IAPWS R14-08(2011) eq. (6) (sublimation pressure); IAPWS R10-06(2009) (ice Ih);
   IAPWS R6-95(2018) (vapor).
"""

from __future__ import annotations

import functools
from dataclasses import dataclass
from typing import Final

import numpy as np
from numpy.typing import ArrayLike, NDArray

from service.core.drying.coefficients import DriedLayerResistance, VialHeatTransfer
from service.core.errors import NotConvergedError
from service.core.properties.chebyshev import PiecewiseChebyshev, fit_piecewise_chebyshev
from service.core.properties.constants import (
    SPECIFIC_GAS_CONSTANT,
    TRIPLE_POINT_PRESSURE,
    TRIPLE_POINT_TEMPERATURE,
)
from service.core.properties.phase import FloatArray
from service.core.properties.phase_lines import sublimation_pressure, sublimation_temperature
from service.core.properties.sublimation import sublimation_by_temperature
from service.core.validation import finite_array, require_within

__all__ = [
    "FRONT_TEMPERATURE_RANGE",
    "STATUS_FRONT_AT_TRIPLE_POINT",
    "STATUS_NO_DRIVING_FORCE",
    "STATUS_SUBLIMATING",
    "SublimationFront",
    "latent_heat_of_sublimation",
    "solve_sublimation_front",
]

FRONT_TEMPERATURE_RANGE: Final = (190.0, TRIPLE_POINT_TEMPERATURE)
"""K. The ice temperatures the model covers (the latent-heat table's range)."""

STATUS_SUBLIMATING: Final = 0
"""The balance has its root below the triple point: the ice sublimes."""
STATUS_NO_DRIVING_FORCE: Final = 1
"""The chamber pressure is at or above the ice's vapor pressure at the shelf temperature:
no sublimation (rate and heat flow zero, product at the shelf temperature)."""
STATUS_FRONT_AT_TRIPLE_POINT: Final = 2
"""The front would have to be warmer than the triple point: the ice would melt, which
this model does not describe (values at the triple point are returned, flagged)."""

_TABLE_SEGMENTS: Final = 6
_TABLE_DEGREE: Final = 14
_MAXIMUM_ITERATIONS: Final = 80
_STEP_TOLERANCE: Final = 1.0e-11  # K


@functools.cache
def _latent_heat_table() -> PiecewiseChebyshev:
    """h_vapor - h_ice on the sublimation curve (R10-06 with IAPWS-95), tabulated once."""

    def exact(temperature: FloatArray) -> FloatArray:
        return sublimation_by_temperature(temperature).latent_heat_of_sublimation

    low, high = FRONT_TEMPERATURE_RANGE
    return fit_piecewise_chebyshev(
        exact, low - 2.0, high, segment_count=_TABLE_SEGMENTS, degree=_TABLE_DEGREE
    )


def latent_heat_of_sublimation(temperature: ArrayLike) -> FloatArray:
    """Enthalpy of sublimation of ice Ih on its sublimation curve, J/kg.

    A piecewise Chebyshev table of
    :func:`service.core.properties.sublimation.sublimation_by_temperature`'s
    ``latent_heat_of_sublimation`` (IAPWS R10-06(2009) ice, IAPWS-95 vapor at the R14-08
    pressure), built on first use; it agrees with the exact value to about 1e-14 relative.

    Parameters
    ----------
    temperature : array_like
        K, within :data:`FRONT_TEMPERATURE_RANGE`.
    """
    array = finite_array(temperature, "front_temperature")
    require_within(
        array,
        "front_temperature",
        *FRONT_TEMPERATURE_RANGE,
        "K",
        "the drying model's latent-heat table covers 190 K to the triple point",
    )
    values: FloatArray = _latent_heat_table()(array)[0]
    return values


@dataclass(frozen=True)
class SublimationFront:
    """The quasi-steady state of one container (arrays of the broadcast input shape).

    Attributes
    ----------
    front_temperature : ndarray
        Ice temperature at the sublimation front, K.
    bottom_temperature : ndarray
        Product temperature at the container bottom, K.
    heat_flow : ndarray
        Heat from the shelf into one container, W.
    sublimation_rate : ndarray
        Ice sublimed per container, kg/s.
    latent_heat : ndarray
        Enthalpy of sublimation at the front temperature, J/kg.
    ice_vapor_pressure : ndarray
        Sublimation pressure of the ice at the front, Pa.
    heat_transfer_coefficient : ndarray
        K_v at the chamber pressure, W/(m2 K).
    dried_layer_resistance : ndarray
        R_p at the dried-layer thickness, m2 Pa s/kg.
    status : ndarray of int8
        :data:`STATUS_SUBLIMATING`, :data:`STATUS_NO_DRIVING_FORCE` or
        :data:`STATUS_FRONT_AT_TRIPLE_POINT` per element.
    iterations : int
        Newton iterations of the solve.
    """

    front_temperature: FloatArray
    bottom_temperature: FloatArray
    heat_flow: FloatArray
    sublimation_rate: FloatArray
    latent_heat: FloatArray
    ice_vapor_pressure: FloatArray
    heat_transfer_coefficient: FloatArray
    dried_layer_resistance: FloatArray
    status: NDArray[np.int8]
    iterations: int


def solve_sublimation_front(
    shelf_temperature: ArrayLike,
    chamber_pressure: ArrayLike,
    dried_thickness: ArrayLike,
    frozen_thickness: ArrayLike,
    *,
    heat_transfer: VialHeatTransfer,
    resistance: DriedLayerResistance,
    heat_transfer_area: float,
    product_area: float,
    frozen_conductivity: float,
) -> SublimationFront:
    """Solve the quasi-steady heat and mass balance of one container, vectorized.

    Parameters
    ----------
    shelf_temperature : array_like
        K, 190 K to 400 K.
    chamber_pressure : array_like
        Pa, from p_sub(190 K) (about 0.032 Pa) to 611.657 Pa.
    dried_thickness, frozen_thickness : array_like
        Thickness of the dried and of the frozen layer, m, >= 0.
    heat_transfer, resistance
        K_v(P_c) and R_p(l) constants.
    heat_transfer_area : float
        A_v, the container's outer bottom area that K_v refers to, m2.
    product_area : float
        A_p, the product's cross-section (inner area), m2.
    frozen_conductivity : float
        Thermal conductivity of the frozen layer, W/(m K).

    Returns
    -------
    SublimationFront

    Raises
    ------
    OutOfRangeError
        For an input out of range (first offending element named).
    NotConvergedError
        Should the safeguarded Newton iteration not converge (not observed).

    Notes
    -----
    With ``G = 1 / (1 / (A_v K_v) + L_frozen / (A_p k))`` the heat flow is
    ``Q = A_v K_v (T_shelf - T_bottom) = G (T_shelf - T_front)`` [1]_, the sublimation rate
    ``m = A_p (p_sub(T_front) - P_c) / R_p(l)`` [2]_ and the front temperature the root of
    ``G (T_shelf - T) = dh_sub(T) A_p (p_sub(T) - P_c) / R_p`` between the chamber's
    frost point ``T_sub(P_c)`` and ``min(T_shelf, 273.16 K)`` (the right side rises, the
    left falls: one root). Newton's method with a Clausius-Clapeyron slope, kept inside the
    bracket by bisection, to 1e-11 K. p_sub is IAPWS R14-08 eq. (6); dh_sub the IAPWS
    R10-06 / IAPWS-95 enthalpy difference [3]_.

    Examples
    --------
    >>> from service.core.drying.coefficients import DriedLayerResistance, VialHeatTransfer
    >>> front = solve_sublimation_front(
    ...     258.15, 10.0, 0.002, 0.008,
    ...     heat_transfer=VialHeatTransfer(11.5, 0.28, 0.0035),
    ...     resistance=DriedLayerResistance(6.7e4, 7.7e7, 0.0),
    ...     heat_transfer_area=3.8e-4, product_area=3.1e-4, frozen_conductivity=2.4)
    >>> bool(front.front_temperature < 258.15)
    True
    """
    names = ("shelf_temperature", "chamber_pressure", "dried_thickness", "frozen_thickness")
    arrays = [
        finite_array(value, name)
        for value, name in zip(
            (shelf_temperature, chamber_pressure, dried_thickness, frozen_thickness),
            names,
            strict=True,
        )
    ]
    shelf, pressure, dried, frozen = np.broadcast_arrays(*arrays)
    require_within(shelf, "shelf_temperature", 190.0, 400.0, "K", "drying model range")
    low_pressure = float(sublimation_pressure(FRONT_TEMPERATURE_RANGE[0]))
    require_within(
        pressure,
        "chamber_pressure",
        low_pressure,
        TRIPLE_POINT_PRESSURE,
        "Pa",
        "the chamber pressure must lie on the ice's sublimation curve between 190 K and the "
        "triple point",
    )
    for array, name in ((dried, "dried_thickness"), (frozen, "frozen_thickness")):
        require_within(array, name, 0.0, 10.0, "m", "layer thicknesses are non-negative")

    kv = heat_transfer.at_pressure(pressure)
    rp = resistance.at_thickness(dried)
    conductance = 1.0 / (
        1.0 / (heat_transfer_area * kv) + frozen / (product_area * frozen_conductivity)
    )
    mass_conductance = product_area / rp  # kg/(s Pa)
    frost_point = sublimation_temperature(pressure)
    status = np.where(shelf <= frost_point, STATUS_NO_DRIVING_FORCE, STATUS_SUBLIMATING).astype(
        np.int8
    )
    lower = np.array(frost_point, dtype=np.float64)
    upper = np.minimum(shelf, TRIPLE_POINT_TEMPERATURE)

    def balance(temperature: FloatArray) -> tuple[FloatArray, FloatArray, FloatArray]:
        vapor_pressure = sublimation_pressure(temperature)
        latent = _latent_heat_table()(temperature)[0]
        residual = conductance * (shelf - temperature) - latent * mass_conductance * (
            vapor_pressure - pressure
        )
        return residual, vapor_pressure, latent

    active = status == STATUS_SUBLIMATING
    at_triple = balance(np.where(active, upper, lower))[0]
    melting = active & (shelf > TRIPLE_POINT_TEMPERATURE) & (at_triple > 0.0)
    status[melting] = STATUS_FRONT_AT_TRIPLE_POINT
    active &= ~melting
    upper = np.where(active | melting, upper, lower)
    temperature = np.where(active, 0.5 * (lower + upper), upper)
    step = np.zeros_like(temperature)
    iterations = 0
    for iterations in range(1, _MAXIMUM_ITERATIONS + 1):  # noqa: B007 - reported
        residual, vapor_pressure, latent = balance(temperature)
        lower = np.where(active & (residual > 0.0), temperature, lower)
        upper = np.where(active & (residual <= 0.0), temperature, upper)
        slope = -conductance - latent * mass_conductance * vapor_pressure * latent / (
            SPECIFIC_GAS_CONSTANT * temperature**2
        )
        proposal = temperature - residual / slope
        inside = (proposal > lower) & (proposal < upper)
        proposal = np.where(inside, proposal, 0.5 * (lower + upper))
        step = np.where(active, proposal - temperature, 0.0)
        temperature = temperature + step
        if np.all(np.abs(step) <= _STEP_TOLERANCE):
            break
    else:
        raise NotConvergedError(
            "sublimation front balance", _MAXIMUM_ITERATIONS, float(np.max(np.abs(step)))
        )
    if np.any(temperature < FRONT_TEMPERATURE_RANGE[0]):
        require_within(
            temperature,
            "front_temperature",
            *FRONT_TEMPERATURE_RANGE,
            "K",
            "the ice front would be colder than the drying model's range",
        )
    none = status == STATUS_NO_DRIVING_FORCE
    front = np.where(none, shelf, temperature)
    vapor_pressure = sublimation_pressure(front)
    latent = _latent_heat_table()(front)[0]
    heat = np.where(none, 0.0, conductance * (shelf - front))
    rate = np.where(none, 0.0, mass_conductance * (vapor_pressure - pressure))
    bottom = shelf - heat / (heat_transfer_area * kv)
    return SublimationFront(
        front_temperature=np.asarray(front, dtype=np.float64),
        bottom_temperature=np.asarray(bottom, dtype=np.float64),
        heat_flow=np.asarray(heat, dtype=np.float64),
        sublimation_rate=np.asarray(rate, dtype=np.float64),
        latent_heat=np.asarray(latent, dtype=np.float64),
        ice_vapor_pressure=np.asarray(vapor_pressure, dtype=np.float64),
        heat_transfer_coefficient=kv,
        dried_layer_resistance=rp,
        status=status,
        iterations=iterations,
    )
