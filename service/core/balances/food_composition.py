"""Food composition and component specific heats (Choi and Okos, 1986).

The specific heat of a food's non-water components is the mass-weighted sum of
the component polynomials c_i(t) = A + B t + C t**2, t in degC, kJ/(kg K):

=============  =======  ============  ============
component      A        B             C
=============  =======  ============  ============
protein        2.0082   1.2089e-3     -1.3129e-6
fat            1.9842   1.4733e-3     -4.8008e-6
carbohydrate   1.5488   1.9625e-3     -5.9399e-6
fiber          1.8459   1.8306e-3     -4.6509e-6
ash            1.0926   1.8896e-3     -3.6817e-6
=============  =======  ============  ============

Water is not taken from this table: the evaporating water is liquid water with
IAPWS-95 properties, so that its enthalpy and its vapor's share one reference.

Source
------
Choi, Y. and Okos, M. R. (1986), "Effects of temperature and composition on the
thermal properties of foods", in Le Maguer, M. and Jelen, P. (eds.), *Food
Engineering and Process Applications*, Vol. 1, Elsevier, pp. 93-101; as
reproduced in ASHRAE Handbook - Refrigeration (2006), ch. 9, Table 1.

The protein, fat and carbohydrate rows were compared with the quotation in
S. Sahin and S. G. Sumnu, *Physical Properties of Foods*, Springer (2006),
ch. "Thermal properties" (in J/(kg degC)): protein and carbohydrate agree; for fat
that quotation gives B = 1.4373e-3 where the ASHRAE table, as recalled, gives
1.4733e-3 (a 0.03 % difference in c_fat at 10 degC). The fiber and ash rows are
FROM MEMORY, not read from a source while writing this table.
"""

from __future__ import annotations

from dataclasses import dataclass
from typing import Final

import numpy as np
from numpy.typing import ArrayLike

from service.core.errors import InvalidInputError
from service.core.properties.phase import FloatArray

__all__ = [
    "CHOI_OKOS_REFERENCE",
    "Composition",
    "solids_sensible_enthalpy",
    "solids_specific_heat",
]

CHOI_OKOS_REFERENCE: Final = (
    "Choi, Y. and Okos, M.R. (1986), Effects of temperature and composition on the thermal "
    "properties of foods, Food Engineering and Process Applications Vol. 1, pp. 93-101 "
    "(protein, fat, carbohydrate rows checked against a secondary quotation; fiber and ash "
    "from memory)"
)

_CELSIUS_OFFSET: Final = 273.15

_COEFFICIENTS: Final[dict[str, tuple[float, float, float]]] = {
    "protein": (2.0082e3, 1.2089, -1.3129e-3),
    "fat": (1.9842e3, 1.4733, -4.8008e-3),
    "carbohydrate": (1.5488e3, 1.9625, -5.9399e-3),
    "fiber": (1.8459e3, 1.8306, -4.6509e-3),
    "ash": (1.0926e3, 1.8896, -3.6817e-3),
}
"""J/(kg K) with t in degC (the kJ table above times 1000)."""

_COMPOSITION_SUM_TOLERANCE: Final = 0.02


@dataclass(frozen=True)
class Composition:
    """Mass fractions of a food (proximate analysis), each in [0, 1].

    Carbohydrate excludes fiber. The fractions should sum to 1; a sum within
    0.02 of 1 is rescaled to 1 (with a warning from the balance).

    ``dissolved_solutes`` names solutes dissolved in the food's water, as (name, kg per kg
    of food) pairs that are part of the fractions above (sugars of the carbohydrate, salt
    of the ash); default none. They serve the initial freezing point estimate
    (:mod:`service.core.solutions.food_freezing_point`) and add no mass of their own.
    """

    water: ArrayLike
    protein: ArrayLike = 0.0
    fat: ArrayLike = 0.0
    carbohydrate: ArrayLike = 0.0
    fiber: ArrayLike = 0.0
    ash: ArrayLike = 0.0
    dissolved_solutes: tuple[tuple[str, float], ...] = ()

    def fractions(self) -> dict[str, float]:
        """Scalar fractions by name, validated and rescaled to sum to 1."""
        raw = {
            "water": self.water,
            "protein": self.protein,
            "fat": self.fat,
            "carbohydrate": self.carbohydrate,
            "fiber": self.fiber,
            "ash": self.ash,
        }
        values = {name: float(np.asarray(value)) for name, value in raw.items()}
        for name, value in values.items():
            if not np.isfinite(value) or not 0.0 <= value <= 1.0:
                raise InvalidInputError(
                    f"composition.{name}",
                    f"must be a mass fraction in [0, 1], got {value!r}",
                    value,
                )
        total = sum(values.values())
        if abs(total - 1.0) > _COMPOSITION_SUM_TOLERANCE:
            raise InvalidInputError(
                "composition", f"mass fractions sum to {total:.6g}, not 1 (tolerance 0.02)", total
            )
        if values["water"] <= 0.0:
            raise InvalidInputError("composition.water", "must be > 0 for evaporative cooling", 0.0)
        return {name: value / total for name, value in values.items()}


def solids_specific_heat(fractions: dict[str, float], temperature: FloatArray) -> FloatArray:
    """Specific heat of the non-water part per kg of product, J/(kg K), Choi and Okos (1986).

    Parameters
    ----------
    fractions : dict
        Mass fractions from :meth:`Composition.fractions`.
    temperature : ndarray
        K; the polynomials were fitted from -40 to 150 degC.

    Returns
    -------
    ndarray
        sum_i x_i c_i(t), J/(kg K) per kg of product (water excluded).
    """
    t = np.asarray(temperature, dtype=np.float64) - _CELSIUS_OFFSET
    total = np.zeros_like(t)
    for name, (a, b, c) in _COEFFICIENTS.items():
        total = total + fractions[name] * (a + b * t + c * t * t)
    return np.asarray(total, dtype=np.float64)


def solids_sensible_enthalpy(
    fractions: dict[str, float], temperature: FloatArray, reference: float
) -> FloatArray:
    """Sensible enthalpy of the non-water part from ``reference`` to ``temperature``, J/kg of
    product: the exact integral of :func:`solids_specific_heat` (Choi and Okos, 1986).

    Parameters
    ----------
    fractions : dict
        Mass fractions from :meth:`Composition.fractions`.
    temperature : ndarray
        K; the polynomials were fitted from -40 to 150 degC.
    reference : float
        K, where the enthalpy is zero.

    Returns
    -------
    ndarray
        sum_i x_i integral c_i dt, J/kg per kg of product (water excluded).
    """
    t = np.asarray(temperature, dtype=np.float64) - _CELSIUS_OFFSET
    t0 = reference - _CELSIUS_OFFSET
    total = np.zeros_like(t)
    for name, (a, b, c) in _COEFFICIENTS.items():
        total = total + fractions[name] * (
            a * (t - t0) + b / 2.0 * (t**2 - t0**2) + c / 3.0 * (t**3 - t0**3)
        )
    return np.asarray(total, dtype=np.float64)
