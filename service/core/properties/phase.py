"""Property containers shared by every formulation in the core.

All arrays are SI: kelvin, pascal, kg/m3, J/kg, J/(kg K). Energies use one
reference state for liquid, vapor and ice: the IAPWS convention that the
specific internal energy and specific entropy of saturated liquid at the triple
point are zero (IAPWS R6-95(2018), Sec. 2; IAPWS R10-06(2009) is built to match).
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np
from numpy.typing import NDArray

FloatArray = NDArray[np.float64]

__all__ = ["FloatArray", "PhasePoint", "PhaseProperties"]


@dataclass(frozen=True)
class PhaseProperties:
    """Thermodynamic properties of one phase at a set of states.

    Attributes
    ----------
    temperature : ndarray
        Temperature, K.
    pressure : ndarray
        Pressure, Pa.
    density : ndarray
        Mass density, kg/m3.
    specific_enthalpy : ndarray
        J/kg, IAPWS reference state.
    specific_internal_energy : ndarray
        J/kg, IAPWS reference state.
    specific_entropy : ndarray
        J/(kg K), IAPWS reference state.
    specific_isobaric_heat_capacity : ndarray
        J/(kg K).
    """

    temperature: FloatArray
    pressure: FloatArray
    density: FloatArray
    specific_enthalpy: FloatArray
    specific_internal_energy: FloatArray
    specific_entropy: FloatArray
    specific_isobaric_heat_capacity: FloatArray

    def take(self, index: NDArray[np.intp] | NDArray[np.bool_] | slice) -> PhaseProperties:
        """Return the subset of states selected by ``index``."""
        return PhaseProperties(
            temperature=self.temperature[index],
            pressure=self.pressure[index],
            density=self.density[index],
            specific_enthalpy=self.specific_enthalpy[index],
            specific_internal_energy=self.specific_internal_energy[index],
            specific_entropy=self.specific_entropy[index],
            specific_isobaric_heat_capacity=self.specific_isobaric_heat_capacity[index],
        )


@dataclass(frozen=True)
class PhasePoint:
    """The properties of :class:`PhaseProperties` at one state, as Python floats (SI).

    One-state answers are built from these: a float costs nothing to read, where every
    numpy operation on a one-element array costs about a microsecond.
    """

    temperature: float
    pressure: float
    density: float
    specific_enthalpy: float
    specific_internal_energy: float
    specific_entropy: float
    specific_isobaric_heat_capacity: float

    @classmethod
    def first_of(cls, properties: PhaseProperties) -> PhasePoint:
        """The first state of ``properties``."""
        return cls(
            temperature=float(properties.temperature.flat[0]),
            pressure=float(properties.pressure.flat[0]),
            density=float(properties.density.flat[0]),
            specific_enthalpy=float(properties.specific_enthalpy.flat[0]),
            specific_internal_energy=float(properties.specific_internal_energy.flat[0]),
            specific_entropy=float(properties.specific_entropy.flat[0]),
            specific_isobaric_heat_capacity=float(
                properties.specific_isobaric_heat_capacity.flat[0]
            ),
        )
