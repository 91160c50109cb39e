"""Water activity of aqueous solutions of named solutes: Pitzer, Norrish, or ideal (Raoult).

Each named solute has a non-ideal model from the literature and the ideal (Raoult) model
kept as a named alternative. A model gives ln a_w(w, T) of a solution of solute mass fraction
w (kg of solute per kg of solution) at temperature T:

- ``"pitzer"`` (sodium chloride): the ion-interaction osmotic coefficient of a 1:1
  electrolyte (Pitzer 1973),

      phi = 1 - A_phi sqrt(m) / (1 + b sqrt(m)) + m (beta0 + beta1 exp(-alpha sqrt(m)))
            + m**2 C_phi,
      ln a_w = -nu m M_w phi,    nu = 2, b = 1.2 kg**0.5/mol**0.5, alpha = 2,

  m the molality, mol/kg; beta0, beta1, C_phi at 25 degC with their first temperature
  derivatives, A_phi interpolated between its 0 degC and 25 degC values;
- ``"norrish"`` (sugars, polyols): a_w = x_w exp(-K x_s**2) with x the mole fractions and
  K the solute's constant, taken as independent of temperature (Norrish 1966);
- ``"melinder"`` (ethanol): the activity that holds ice on Melinder's (2010) fitted
  freezing line, independent of temperature (:mod:`service.core.solutions.ethanol`);
- ``"ideal"``: a_w = x_w counting i particles per formula unit (Raoult's law), the model
  the balances used before; kept so that answers can be compared.

References
----------
Pitzer, K. S. and Mayorga, G. (1973), J. Phys. Chem. 77, 2300-2308 (NaCl at 25 degC);
Silvester, L. F. and Pitzer, K. S. (1977), J. Phys. Chem. 81, 1822-1828 (temperature
derivatives); Pitzer, K. S. (ed.) (1991), *Activity Coefficients in Electrolyte Solutions*,
2nd ed., CRC Press, ch. 3 (A_phi). Norrish, R. S. (1966), J. Food Technol. 1, 25-39;
Chirife, J., Ferro Fontan, C. and Benmergui, E. A. (1980), J. Food Technol. 15, 59-70 (the
K constants). Melinder, A. (2010), *Properties of Secondary Working Fluids for Indirect
Systems*, 2nd ed., IIR (ethanol's freezing line). All Pitzer and Norrish values FROM MEMORY
(the papers were not read while writing this module); the models are held to handbook
freezing points in ``tests/reference/test_aqueous_freezing_points.py`` and
``tests/reference/test_ethanol_freezing_points.py``.
"""

from __future__ import annotations

from dataclasses import dataclass
from typing import Final, Literal

import numpy as np
from numpy.typing import ArrayLike

from service.core.errors import InvalidInputError
from service.core.properties.constants import MOLAR_MASS
from service.core.properties.phase import FloatArray
from service.core.solutions.ethanol import (
    ETHANOL_MAXIMUM_MASS_FRACTION,
    ETHANOL_SOURCE_TEXT,
    ethanol_log_water_activity,
)

__all__ = [
    "NAMED_SOLUTION_MODELS",
    "ActivityModelName",
    "PitzerParameters",
    "SolutionModel",
    "solution_model",
]

ActivityModelName = Literal["non-ideal", "ideal"]

_REFERENCE_TEMPERATURE: Final = 298.15
"""K, the temperature of the Pitzer parameters."""

_A_PHI_0C: Final = 0.3770
"""Debye-Hueckel osmotic coefficient A_phi at 0 degC, kg**0.5/mol**0.5 (Pitzer 1991, from
memory)."""

_A_PHI_25C: Final = 0.3915
"""A_phi at 25 degC, kg**0.5/mol**0.5 (Pitzer 1991, from memory)."""

_BISECTIONS: Final = 60

_PITZER_B: Final = 1.2
_PITZER_ALPHA: Final = 2.0


@dataclass(frozen=True)
class PitzerParameters:
    """Ion-interaction parameters of a 1:1 electrolyte at 25 degC and their T-slopes.

    Attributes
    ----------
    beta0, beta1 : float
        kg/mol.
    c_phi : float
        kg2/mol2.
    beta0_slope, beta1_slope, c_phi_slope : float
        Their temperature derivatives at 25 degC, per K.
    """

    beta0: float
    beta1: float
    c_phi: float
    beta0_slope: float
    beta1_slope: float
    c_phi_slope: float


@dataclass(frozen=True)
class SolutionModel:
    """Water-activity model of one named solute in water.

    Attributes
    ----------
    name : str
        The solute, e.g. ``"sodium chloride"``.
    model : {"pitzer", "norrish", "seawater", "melinder", "ideal"}
        The activity model.
    molar_mass : float
        kg/mol.
    van_t_hoff_factor : float
        Particles per formula unit: used by the ideal model (and nu of the Pitzer model).
    specific_heat : float
        J/(kg K), the dissolved solute's sensible heat (heat of dilution neglected).
    maximum_mass_fraction : float
        Highest solute mass fraction the model is taken to (its valid range; for sodium
        chloride the eutectic composition).
    source : str
        The model and its parameters' sources, as stated in answers.
    norrish_constant : float
        K of the Norrish equation (``model == "norrish"``).
    pitzer : PitzerParameters or None
        The Pitzer parameters (``model == "pitzer"``).
    eutectic : bool
        Whether ``maximum_mass_fraction`` is a eutectic (a phase limit: below it the solute
        crystallizes, whatever the activity model) rather than the model's fitted range.
    """

    name: str
    model: Literal["pitzer", "norrish", "seawater", "melinder", "ideal"]
    molar_mass: float
    van_t_hoff_factor: float
    specific_heat: float
    maximum_mass_fraction: float
    source: str
    norrish_constant: float = 0.0
    pitzer: PitzerParameters | None = None
    eutectic: bool = False

    def molality(self, mass_fraction: FloatArray) -> FloatArray:
        """mol of solute per kg of water, from w = m_s / (m_s + m_w) < 1."""
        return np.asarray(mass_fraction / ((1.0 - mass_fraction) * self.molar_mass))

    def log_water_activity(self, mass_fraction: ArrayLike, temperature: ArrayLike) -> FloatArray:
        """ln a_w of the solution, dimensionless (inputs validated by the caller).

        Parameters
        ----------
        mass_fraction : array_like
            w, 0 <= w < 1.
        temperature : array_like
            K (the Pitzer model's temperature dependence; the others ignore it).

        Returns
        -------
        ndarray
            ln a_w <= 0, of the broadcast shape.
        """
        w = np.asarray(mass_fraction, dtype=np.float64)
        t = np.asarray(temperature, dtype=np.float64)
        molality = self.molality(w)
        if self.model == "pitzer" and self.pitzer is not None:
            return _pitzer_log_activity(self.pitzer, molality, t)
        if self.model == "seawater":
            # w is the absolute salinity; R13-08's own validation names the variable.
            from service.core.solutions.seawater import seawater_log_water_activity

            return seawater_log_water_activity(w, t)
        if self.model == "melinder":
            return np.asarray(ethanol_log_water_activity(w) + 0.0 * t, dtype=np.float64)
        water_moles = 1.0 / MOLAR_MASS
        if self.model == "norrish":
            solute_fraction = molality / (molality + water_moles)
            log_activity = np.log1p(-solute_fraction) - self.norrish_constant * solute_fraction**2
            return np.asarray(log_activity + 0.0 * t, dtype=np.float64)
        particles = self.van_t_hoff_factor * molality
        return np.asarray(-np.log1p(particles / water_moles) + 0.0 * t, dtype=np.float64)

    def mass_fraction_at_log_activity(
        self, log_activity: ArrayLike, temperature: ArrayLike
    ) -> FloatArray:
        """The mass fraction w whose ln a_w(w, T) is ``log_activity`` (< 0), dimensionless.

        Bisection over 0 <= w <= 0.999 (seawater: to 0.12, ethanol: to 0.5; ln a_w falls as
        w rises in every model here), to the resolution of a float (60 halvings).
        """
        target = np.asarray(log_activity, dtype=np.float64)
        t = np.broadcast_to(np.asarray(temperature, dtype=np.float64), target.shape)
        low = np.zeros(target.shape)
        # Seawater's Gibbs function and ethanol's freezing line hold only to their ranges.
        bounded = self.model in ("seawater", "melinder")
        top = self.maximum_mass_fraction if bounded else 0.999
        high = np.full(target.shape, top)
        for _ in range(_BISECTIONS):
            middle = 0.5 * (low + high)
            above = self.log_water_activity(middle, t) > target
            low = np.where(above, middle, low)
            high = np.where(above, high, middle)
        return np.asarray(0.5 * (low + high), dtype=np.float64)


def _pitzer_log_activity(
    parameters: PitzerParameters, molality: FloatArray, temperature: FloatArray
) -> FloatArray:
    offset = temperature - _REFERENCE_TEMPERATURE
    a_phi = _A_PHI_25C + (_A_PHI_25C - _A_PHI_0C) / 25.0 * offset
    beta0 = parameters.beta0 + parameters.beta0_slope * offset
    beta1 = parameters.beta1 + parameters.beta1_slope * offset
    c_phi = parameters.c_phi + parameters.c_phi_slope * offset
    root = np.sqrt(molality)
    osmotic = (
        1.0
        - a_phi * root / (1.0 + _PITZER_B * root)
        + molality * (beta0 + beta1 * np.exp(-_PITZER_ALPHA * root))
        + molality**2 * c_phi
    )
    return np.asarray(-2.0 * molality * MOLAR_MASS * osmotic, dtype=np.float64)


_NORRISH_SOURCE: Final = (
    "Norrish equation a_w = x_w exp(-K x_s^2) (Norrish 1966, J. Food Technol. 1:25-39), "
    "K = {k} (Chirife, Ferro Fontan and Benmergui 1980, J. Food Technol. 15:59-70; from "
    "memory), K taken as independent of temperature; valid to w = {w}"
)

_PITZER_NACL: Final = PitzerParameters(
    beta0=0.0765,
    beta1=0.2664,
    c_phi=0.00127,
    beta0_slope=7.159e-4,
    beta1_slope=7.005e-4,
    c_phi_slope=-1.054e-5,
)


def _norrish(
    name: str, molar_mass: float, k: float, specific_heat: float, maximum: float
) -> SolutionModel:
    return SolutionModel(
        name=name,
        model="norrish",
        molar_mass=molar_mass,
        van_t_hoff_factor=1.0,
        specific_heat=specific_heat,
        maximum_mass_fraction=maximum,
        source=_NORRISH_SOURCE.format(k=k, w=maximum),
        norrish_constant=k,
    )


NAMED_SOLUTION_MODELS: Final[dict[str, SolutionModel]] = {
    "sodium chloride": SolutionModel(
        name="sodium chloride",
        model="pitzer",
        molar_mass=0.058443,
        van_t_hoff_factor=2.0,
        specific_heat=864.0,
        maximum_mass_fraction=0.233,
        source=(
            "Pitzer ion-interaction model for NaCl(aq): beta0 = 0.0765, beta1 = 0.2664, "
            "C_phi = 0.00127 at 25 degC (Pitzer and Mayorga 1973, J. Phys. Chem. 77:2300), "
            "temperature slopes 7.159e-4, 7.005e-4, -1.054e-5 1/K (Silvester and Pitzer "
            "1977, J. Phys. Chem. 81:1822), A_phi 0.3770 at 0 degC and 0.3915 at 25 degC "
            "(Pitzer 1991); parameters from memory; valid to the ice-hydrohalite eutectic, "
            "w = 0.233"
        ),
        pitzer=_PITZER_NACL,
        eutectic=True,
    ),
    # Specific heats of the solutes near 25 degC, J/(kg K), from memory (CRC Handbook of
    # Chemistry and Physics): crystalline sugars and salt, liquid glycerol and propylene
    # glycol.
    "sucrose": _norrish("sucrose", 0.342297, 6.47, 1244.0, 0.5),
    "glucose": _norrish("glucose", 0.180156, 2.25, 1219.0, 0.3),
    "fructose": _norrish("fructose", 0.180156, 2.25, 1265.0, 0.3),
    "glycerol": _norrish("glycerol", 0.092094, 1.16, 2430.0, 0.4),
    "propylene glycol": _norrish("propylene glycol", 0.076095, 4.0, 2500.0, 0.3),
    # Liquid ethanol near 25 degC, 2440 J/(kg K) (CRC Handbook of Chemistry and Physics;
    # from memory).
    "ethanol": SolutionModel(
        name="ethanol",
        model="melinder",
        molar_mass=0.046069,
        van_t_hoff_factor=1.0,
        specific_heat=2440.0,
        maximum_mass_fraction=ETHANOL_MAXIMUM_MASS_FRACTION,
        source=ETHANOL_SOURCE_TEXT,
    ),
    "seawater": SolutionModel(
        name="seawater",
        model="seawater",
        # Mean molar mass of sea salt of the Reference Composition, 31.4038218 g/mol
        # (Millero et al. 2008, Deep-Sea Res. I 55:50-72; from memory): the ideal model's
        # particle mass, one particle per "mole" of sea salt.
        molar_mass=0.0314038218,
        van_t_hoff_factor=1.0,
        specific_heat=0.0,
        maximum_mass_fraction=0.12,
        source=(
            "Seawater by the IAPWS R13-08 (2008) saline Gibbs function (TEOS-10) with "
            "IAPWS-95 water: water activity at the absolute salinity w (kg/kg), 0 to 0.12; "
            "in the balances without heat of mixing and with no heat capacity of its own "
            "for the sea salt (the brine's specific heat comes out about 1 % above "
            "R13-08's at 35 g/kg)"
        ),
    ),
}
"""The non-ideal model of each named solute, with its range and source."""


def solution_model(name: str, model: ActivityModelName = "non-ideal") -> SolutionModel:
    """The activity model of a named solute.

    Parameters
    ----------
    name : str
        A key of :data:`NAMED_SOLUTION_MODELS`.
    model : {"non-ideal", "ideal"}
        The solute's published model, or the ideal (Raoult) solution with the solute's
        van 't Hoff factor (2 for sodium chloride, 1 for the others).

    Returns
    -------
    SolutionModel

    Raises
    ------
    InvalidInputError
        ``solute.name`` for an unknown solute, ``solute.model`` for an unknown model.
    """
    entry = NAMED_SOLUTION_MODELS.get(name)
    if entry is None:
        known = ", ".join(sorted(NAMED_SOLUTION_MODELS))
        raise InvalidInputError("solute.name", f"unknown solute {name!r}; known: {known}", name)
    if model == "non-ideal":
        return entry
    if model != "ideal":
        raise InvalidInputError("solute.model", "must be 'non-ideal' or 'ideal'", model)
    return SolutionModel(
        name=entry.name,
        model="ideal",
        molar_mass=entry.molar_mass,
        van_t_hoff_factor=entry.van_t_hoff_factor,
        specific_heat=entry.specific_heat,
        maximum_mass_fraction=entry.maximum_mass_fraction,
        eutectic=entry.eutectic,
        source=(
            f"Ideal (Raoult) solution, van 't Hoff factor {entry.van_t_hoff_factor:g} "
            "(Atkins and de Paula, Physical Chemistry, 9th ed., 2010, Sec. 5.3; from memory); "
            f"no activity coefficient; range as the non-ideal model, w <= "
            f"{entry.maximum_mass_fraction}"
        ),
    )
