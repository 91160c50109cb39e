"""Evaporation from the product surface: kinetic (Hertz-Knudsen-Langmuir) flux.

Model
-----
Net mass flux from a surface at temperature T_s with equilibrium vapor pressure p_eq
into vapor of partial pressure p_v:

    j = alpha A (p_eq(T_s) - p_v) / sqrt(2 pi R T_s),

alpha the evaporation coefficient (0 < alpha <= 1), A the exposed area and R the
specific gas constant of water. The sign is kept: j < 0 is condensation onto the
product. The equilibrium alternative (the product boils and holds the chamber at its
vapor pressure) is in :mod:`service.core.simulation.chamber_model`.

References
----------
Hertz (1882), Knudsen (1915), Langmuir (1913); reviewed by Eames, I. W., Marr, N. J.
and Sabir, H. (1997), "The evaporation coefficient of water: a review", Int. J. Heat
Mass Transfer 40(12), 2963-2973 (from memory).
"""

from __future__ import annotations

import math

from service.core.properties.constants import SPECIFIC_GAS_CONSTANT

__all__ = ["KineticEvaporation"]


class KineticEvaporation:
    """j(T_s, p_eq, p_v) for one product surface.

    Parameters
    ----------
    area : float
        Exposed area A, m2.
    coefficient : float
        Evaporation coefficient alpha, dimensionless.
    """

    def __init__(self, area: float, coefficient: float) -> None:
        self._factor = coefficient * area / math.sqrt(2.0 * math.pi * SPECIFIC_GAS_CONSTANT)

    def conductance(self, surface_temperature: float) -> float:
        """alpha A / sqrt(2 pi R T_s), kg/(s Pa): the rate per pascal of driving pressure."""
        return self._factor / math.sqrt(surface_temperature)

    def rate(
        self, surface_temperature: float, equilibrium_pressure: float, vapor_pressure: float
    ) -> float:
        """Net evaporation, kg/s."""
        return (
            self._factor * (equilibrium_pressure - vapor_pressure) / math.sqrt(surface_temperature)
        )
