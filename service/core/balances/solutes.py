"""Dissolved solute: ideal (Raoult) solution with an effective molar mass.

The water activity of a solution of ``m_w`` kg water and ``m_s`` kg solute is
its water mole fraction, counting each dissolved formula unit as ``i`` particles
(van 't Hoff factor):

    a_w = n_w / (n_w + i n_s),   n_w = m_w / M_w,   n_s = m_s / M_s.

With ice present the activity is fixed by temperature (see
:mod:`service.core.balances.equilibrium_paths`), so the unfrozen water is

    m_w,liquid(T) = m_s (M_w / M_s) i a_w(T) / (1 - a_w(T)),

and the solution freezes progressively, its ice fraction rising as the solute
concentrates. For foods, M_s is the "effective molar mass" of the soluble solids
fitted to the measured initial freezing point (Heldman's approach).

The solution is ideal: no heat of mixing, water in solution has the properties of
pure liquid water, the solute adds only its sensible heat m_s c_s dT. The model
is reliable for dilute solutions (a_w above about 0.9); the balances warn beyond.

References
----------
Raoult's law and the ideal-solution chemical potential: Atkins, P. and de Paula,
J., *Physical Chemistry*, 9th ed., Oxford (2010), Secs. 5.3-5.5 (from memory).
Heldman, D. R. (1974), "Predicting the relationship between unfrozen water
fraction and temperature during food freezing using freezing point depression",
Transactions of the ASAE 17(1), 63-66 (from memory).
Molar masses from the IUPAC standard atomic weights (CIAAW 2021).
"""

from __future__ import annotations

from dataclasses import dataclass, replace
from typing import Final, Literal

import numpy as np
from numpy.typing import ArrayLike

from service.core.errors import InvalidInputError
from service.core.properties.constants import MOLAR_MASS
from service.core.solutions.aqueous import NAMED_SOLUTION_MODELS, SolutionModel, solution_model

__all__ = [
    "NAMED_SOLUTES",
    "SOLUTE_MODEL_REFERENCE",
    "DissolvedSolids",
    "Solute",
    "liquid_water_mass_at_activity",
    "named_dissolved_solids",
    "named_solute",
    "water_activity",
]

SOLUTE_MODEL_REFERENCE: Final = (
    "Ideal (Raoult) solution with an effective molar mass and van 't Hoff factor "
    "(Heldman 1974, Trans. ASAE 17(1):63-66); ice-solution equilibrium from IAPWS-95 and "
    "R10-06 Gibbs energies"
)


@dataclass(frozen=True)
class Solute:
    """A dissolved solute in the load's water.

    Attributes
    ----------
    mass_fraction : array_like
        Solute mass / (water + solute mass) of the initial load; the flash-freeze balance
        takes 0 <= w <= 0.5 (0: no solute).
    molar_mass : array_like
        Effective molar mass, kg/mol, > 0 (the balances take at least 0.001).
    van_t_hoff_factor : array_like
        Particles per dissolved formula unit, >= 1 (1 for sugars, about 2 for NaCl).
    specific_heat : array_like
        J/(kg K), >= 0, constant; the solute's sensible-heat contribution.
    name : str
        Label for reports.
    activity_model : SolutionModel or None
        A published non-ideal water-activity model
        (:mod:`service.core.solutions.aqueous`); None for the ideal (Raoult) solution of
        ``molar_mass`` and ``van_t_hoff_factor``. Named solutes carry theirs by default.
    """

    mass_fraction: ArrayLike
    molar_mass: ArrayLike
    van_t_hoff_factor: ArrayLike = 1.0
    specific_heat: ArrayLike = 1250.0
    name: str = "solute"
    activity_model: SolutionModel | None = None


NAMED_SOLUTES: Final[dict[str, Solute]] = {
    # Molar masses, van 't Hoff factors (ideal model), specific heats and the non-ideal
    # model of each named solute, from service.core.solutions.aqueous (sources there).
    name: Solute(0.0, model.molar_mass, model.van_t_hoff_factor, model.specific_heat, name, model)
    for name, model in NAMED_SOLUTION_MODELS.items()
}
"""Named solutes, each with its published non-ideal water-activity model (Pitzer for sodium
chloride, Norrish for sugars and polyols); ``replace(..., activity_model=None)`` gives the
ideal (Raoult) solution with the van 't Hoff factor."""


def named_solute(
    name: str, mass_fraction: ArrayLike, model: Literal["non-ideal", "ideal"] = "non-ideal"
) -> Solute:
    """A solute from :data:`NAMED_SOLUTES` at the given mass fraction.

    Parameters
    ----------
    name : str
        A key of :data:`NAMED_SOLUTES`.
    mass_fraction : array_like
        Solute mass / solution mass.
    model : {"non-ideal", "ideal"}
        The solute's published activity model (default), taken to its range, or the
        ideal (Raoult) solution with the solute's van 't Hoff factor, taken to the
        solute's eutectic where it has one (sodium chloride: w = 0.233).

    Raises
    ------
    InvalidInputError
        If the name is unknown.
    """
    try:
        entry = NAMED_SOLUTES[name]
    except KeyError as error:
        known = ", ".join(sorted(NAMED_SOLUTES))
        raise InvalidInputError(
            "solute", f"unknown solute {name!r}; known: {known}", name
        ) from error
    chosen: SolutionModel | None = solution_model(name, model)
    if model == "ideal" and not NAMED_SOLUTION_MODELS[name].eutectic:
        chosen = None  # the plain ideal solution, not held to the non-ideal model's fit range
    # The ideal model of a solute with a eutectic keeps that limit (sodium chloride: below
    # w = 0.233 hydrohalite crystallizes, whatever the activity model).
    return replace(entry, mass_fraction=mass_fraction, activity_model=chosen)


@dataclass(frozen=True)
class DissolvedSolids:
    """Solids dissolved in a product's water (sugars, salts, acids), as one effective solute.

    Unlike :class:`Solute`, the mass fraction is per kilogram of PRODUCT: these solids are
    part of a food's non-water components (sugars in its carbohydrate, salts in its ash)
    and add no mass or heat capacity of their own; they only lower the activity, and so
    the freezing point, of the product's water.

    Attributes
    ----------
    mass_fraction : array_like
        kg of dissolved solids per kg of product, >= 0; with the product's water mass
        fraction x_w, x_w + mass_fraction <= 1.
    molar_mass : array_like
        Effective molar mass, kg/mol, >= 0.001.
    van_t_hoff_factor : array_like
        Particles per dissolved formula unit, 1 to 10.
    name : str
        Label for reports.
    activity_model : SolutionModel or None
        The named solute's non-ideal water-activity model, or None (ideal solution).
    """

    mass_fraction: ArrayLike
    molar_mass: ArrayLike
    van_t_hoff_factor: ArrayLike = 1.0
    name: str = "dissolved solids"
    activity_model: SolutionModel | None = None

    def in_solution(self, water_fraction: ArrayLike) -> Solute:
        """The same solids as a :class:`Solute` of the product's water.

        Parameters
        ----------
        water_fraction : array_like
            The product's water mass fraction x_w, > 0.

        Returns
        -------
        Solute
            Mass fraction per kg of solution, w = x_s / (x_w + x_s); the specific heat
            is left at its default (unused: the solids' heat capacity belongs to the
            product's composition).
        """
        solids = np.asarray(self.mass_fraction, dtype=np.float64)
        water = np.asarray(water_fraction, dtype=np.float64)
        return Solute(
            mass_fraction=solids / (water + solids),
            molar_mass=self.molar_mass,
            van_t_hoff_factor=self.van_t_hoff_factor,
            name=self.name,
            activity_model=self.activity_model,
        )


def named_dissolved_solids(name: str, mass_fraction: ArrayLike) -> DissolvedSolids:
    """Dissolved solids of a solute of :data:`NAMED_SOLUTES`, per kg of product.

    Raises
    ------
    InvalidInputError
        ``dissolved_solids.name``, if the name is unknown.
    """
    entry = NAMED_SOLUTES.get(name)
    if entry is None:
        known = ", ".join(sorted(NAMED_SOLUTES))
        raise InvalidInputError(
            "dissolved_solids.name", f"unknown solute {name!r}; known: {known}", name
        )
    return DissolvedSolids(
        mass_fraction=mass_fraction,
        molar_mass=entry.molar_mass,
        van_t_hoff_factor=entry.van_t_hoff_factor,
        name=name,
        activity_model=entry.activity_model,
    )


def water_activity(
    water_mass: ArrayLike, solute_mass: float, molar_mass: float, van_t_hoff_factor: float
) -> np.ndarray:
    """Raoult water activity a_w = n_w / (n_w + i n_s), dimensionless."""
    water_moles = np.asarray(water_mass, dtype=np.float64) / MOLAR_MASS
    solute_particles = van_t_hoff_factor * solute_mass / molar_mass
    return np.asarray(water_moles / (water_moles + solute_particles), dtype=np.float64)


def liquid_water_mass_at_activity(
    log_activity: ArrayLike, solute_mass: float, molar_mass: float, van_t_hoff_factor: float
) -> np.ndarray:
    """Water mass, kg, of the solution whose activity is exp(log_activity) < 1."""
    log_a = np.asarray(log_activity, dtype=np.float64)
    ratio = np.exp(log_a) / -np.expm1(log_a)
    return np.asarray(
        solute_mass * van_t_hoff_factor * MOLAR_MASS / molar_mass * ratio, dtype=np.float64
    )
