"""Transfer coefficients of primary drying: the container's heat transfer and the dried
layer's resistance to vapor flow, each in the form its source gives.

References
----------
.. [1] M. J. Pikal, M. L. Roy, S. Shah, "Mass and heat transfer in vial freeze-drying
   of pharmaceuticals: role of the vial", J. Pharm. Sci. 73(9), 1224-1237 (1984).
.. [2] M. J. Pikal, "Use of laboratory data in freeze drying process design: heat and
   mass transfer coefficients and the computer simulation of freeze drying", J. Parenter.
   Sci. Technol. 39(3), 115-139 (1985).
"""

from __future__ import annotations

from dataclasses import dataclass
from typing import Final

import numpy as np
from numpy.typing import ArrayLike

from service.core.errors import OutOfRangeError
from service.core.properties.phase import FloatArray
from service.core.validation import finite_array

__all__ = [
    "ICE_THERMAL_CONDUCTIVITY",
    "DriedLayerResistance",
    "VialHeatTransfer",
    "require_at_least",
]

ICE_THERMAL_CONDUCTIVITY: Final = 2.4
"""W/(m K): ice Ih near 250 K (from memory: about 2.4 W/(m K) at 250 K, G. A. Slack,
Phys. Rev. B 22, 3065 (1980)); the default for the frozen layer, which a solute lowers
a little."""


def require_at_least(
    value: ArrayLike,
    variable: str,
    minimum: float,
    unit: str,
    reason: str,
    *,
    exclusive_minimum: bool = False,
) -> None:
    """Raise :class:`OutOfRangeError` (open above: no maximum) for a value below
    ``minimum`` (or at it, with ``exclusive_minimum``); NaN and infinity are refused."""
    array = finite_array(value, variable)
    below = array <= minimum if exclusive_minimum else array < minimum
    if np.any(below):
        index = int(np.flatnonzero(below.ravel())[0])
        raise OutOfRangeError(
            variable=variable,
            value=float(array.ravel()[index]),
            minimum=minimum,
            maximum=None,
            unit=unit,
            reason=reason,
            index=index if array.ndim > 0 else None,
        )


@dataclass(frozen=True)
class VialHeatTransfer:
    """Container heat-transfer coefficient as a function of chamber pressure [1]_.

    ``K_v(P_c) = contact + gas_conduction * P_c / (1 + gas_conduction_saturation * P_c)``,
    per unit of the container's outer bottom area.

    Attributes
    ----------
    contact : float
        Pressure-independent part (contact conduction and radiation), W/(m2 K), >= 0.
    gas_conduction : float
        Slope of the gas-conduction part at low pressure, W/(m2 K Pa), >= 0.
    gas_conduction_saturation : float
        Pressure scale at which gas conduction levels off, 1/Pa, >= 0.
    """

    contact: float
    gas_conduction: float
    gas_conduction_saturation: float

    def at_pressure(self, chamber_pressure: ArrayLike) -> FloatArray:
        """K_v at ``chamber_pressure`` (Pa), W/(m2 K)."""
        pressure = np.asarray(chamber_pressure, dtype=np.float64)
        value = self.contact + self.gas_conduction * pressure / (
            1.0 + self.gas_conduction_saturation * pressure
        )
        return np.asarray(value, dtype=np.float64)

    def validate(self, prefix: str) -> None:
        """Raise OutOfRangeError for a negative or non-finite constant; the sum must be > 0."""
        units = {"contact": "W/(m2*K)", "gas_conduction": "W/(m2*K*Pa)"}
        for name in ("contact", "gas_conduction", "gas_conduction_saturation"):
            require_at_least(
                getattr(self, name),
                f"{prefix}.{name}",
                0.0,
                units.get(name, "1/Pa"),
                "the three constants of the vial heat-transfer coefficient are non-negative",
            )
        if self.contact <= 0.0 and self.gas_conduction <= 0.0:
            require_at_least(
                self.contact,
                f"{prefix}.contact",
                0.0,
                "W/(m2*K)",
                "the container must conduct some heat: contact or gas conduction above zero",
                exclusive_minimum=True,
            )


@dataclass(frozen=True)
class DriedLayerResistance:
    """Area-normalized resistance of the dried layer to vapor flow [2]_.

    ``R_p(l) = at_zero_thickness + thickness_coefficient * l / (1 + thickness_saturation * l)``,
    with ``l`` the dried-layer thickness; the sublimation flux per product area is
    ``(p_ice(T_front) - P_c) / R_p``.

    Attributes
    ----------
    at_zero_thickness : float
        R_0, m2 Pa s/kg (= m/s), > 0.
    thickness_coefficient : float
        A_1, m Pa s/kg (R_p gained per metre of dried layer), >= 0.
    thickness_saturation : float
        A_2, 1/m, >= 0.
    """

    at_zero_thickness: float
    thickness_coefficient: float
    thickness_saturation: float

    def at_thickness(self, dried_thickness: ArrayLike) -> FloatArray:
        """R_p at ``dried_thickness`` (m), m2 Pa s/kg."""
        length = np.asarray(dried_thickness, dtype=np.float64)
        value = self.at_zero_thickness + self.thickness_coefficient * length / (
            1.0 + self.thickness_saturation * length
        )
        return np.asarray(value, dtype=np.float64)

    def validate(self, prefix: str) -> None:
        """Raise OutOfRangeError for a constant out of range (R_0 > 0, A_1 >= 0, A_2 >= 0)."""
        require_at_least(
            self.at_zero_thickness,
            f"{prefix}.at_zero_thickness",
            0.0,
            "m2*Pa*s/kg",
            "the resistance of a dried layer of zero thickness must be positive",
            exclusive_minimum=True,
        )
        units = {"thickness_coefficient": "m*Pa*s/kg", "thickness_saturation": "1/m"}
        for name, unit in units.items():
            require_at_least(
                getattr(self, name),
                f"{prefix}.{name}",
                0.0,
                unit,
                "the dried-layer resistance may not fall with thickness",
            )
