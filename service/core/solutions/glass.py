"""Freeze-concentration limit: glass transition of a sugar's freeze-concentrate.

As a sugar solution freezes, its unfrozen phase concentrates until, at the maximally
freeze-concentrated point (T_g', C_g'), it is viscous enough to stop ice growth and turns
to a glass on further cooling. Below T_g' the ice fraction no longer follows the equilibrium
freezing curve; above it the freeze-concentrate is a viscous liquid, and a freeze-dried
product dried above about T_g' (its collapse temperature lies a few kelvin above) loses its
structure.

The glass transition of a water-solute mixture of solute mass fraction w follows the
Gordon-Taylor equation

    T_g(w) = (w T_g,s + k (1 - w) T_g,w) / (w + k (1 - w)),

with T_g,w = 138 K (-135 degC) for amorphous water, T_g,s the anhydrous solute's glass
transition and k the solute's constant.

References
----------
Gordon, M. and Taylor, J. S. (1952), J. Appl. Chem. 2, 493-500 (the equation). Roos, Y.
(1993), "Melting and glass transitions of low molecular weight carbohydrates",
Carbohydrate Research 238, 39-48 (T_g,s and k). Roos, Y. and Karel, M. (1991), "Amorphous
state and delayed ice formation in sucrose solutions", Int. J. Food Sci. Technol. 26,
553-566 (T_g', C_g' of sucrose). All values FROM MEMORY, not read while writing this module.
"""

from __future__ import annotations

from dataclasses import dataclass
from typing import Final

import numpy as np
from numpy.typing import ArrayLike

from service.core.properties.phase import FloatArray

__all__ = [
    "FREEZE_CONCENTRATION_DATA",
    "GLASS_SOURCE",
    "WATER_GLASS_TRANSITION",
    "FreezeConcentration",
    "gordon_taylor_glass_transition",
]

WATER_GLASS_TRANSITION: Final = 138.15
"""K, glass transition of amorphous water (-135 degC), as Roos (1993) uses it (from memory)."""

GLASS_SOURCE: Final = (
    "Gordon-Taylor glass transition (Gordon and Taylor 1952) with T_g and k of the solute "
    "from Roos (1993, Carbohydr. Res. 238:39) and the maximally freeze-concentrated point "
    "from Roos and Karel (1991, Int. J. Food Sci. Technol. 26:553); values from memory"
)


@dataclass(frozen=True)
class FreezeConcentration:
    """A solute's glass-transition constants and its maximally freeze-concentrated point.

    Attributes
    ----------
    solute_glass_transition : float
        T_g,s of the anhydrous solute, K.
    gordon_taylor_constant : float
        k, dimensionless.
    glass_transition_of_freeze_concentrate : float
        T_g', K.
    freeze_concentrate_mass_fraction : float
        C_g', solute mass fraction of the maximally freeze-concentrated phase.
    ice_melting_onset : float
        T_m', K: onset of ice melting in the maximally freeze-concentrated solution; above
        it the freeze-concentrate is a viscous liquid and a freeze-dried cake can collapse.
    """

    solute_glass_transition: float
    gordon_taylor_constant: float
    glass_transition_of_freeze_concentrate: float
    freeze_concentrate_mass_fraction: float
    ice_melting_onset: float


FREEZE_CONCENTRATION_DATA: Final[dict[str, FreezeConcentration]] = {
    "sucrose": FreezeConcentration(335.15, 4.7, 227.15, 0.80, 239.15),
}
"""Sucrose: T_g,s 62 degC, k 4.7 (Roos 1993); T_g' -46 degC at C_g' 0.80 and the onset of ice
melting T_m' -34 degC (Roos and Karel 1991), all from memory. (Another convention quotes
T_g' -32 degC at 0.64 for the same transition region.) Glucose and fructose: not listed, no
values recalled with confidence."""


def gordon_taylor_glass_transition(
    data: FreezeConcentration, solute_mass_fraction: ArrayLike
) -> FloatArray:
    """Glass transition temperature of a water-solute mixture, K (Gordon-Taylor).

    Parameters
    ----------
    data : FreezeConcentration
        The solute's constants.
    solute_mass_fraction : array_like
        w, 0 to 1 (0: amorphous water, 138.15 K; 1: the anhydrous solute).

    Returns
    -------
    ndarray
        T_g, K.

    Examples
    --------
    >>> round(float(gordon_taylor_glass_transition(FREEZE_CONCENTRATION_DATA["sucrose"], 1.0)), 2)
    335.15
    """
    w = np.asarray(solute_mass_fraction, dtype=np.float64)
    k = data.gordon_taylor_constant
    return np.asarray(
        (w * data.solute_glass_transition + k * (1.0 - w) * WATER_GLASS_TRANSITION)
        / (w + k * (1.0 - w)),
        dtype=np.float64,
    )
