"""The property sources that results cite: one record per IAPWS release.

Every HTTP response names the formulation behind its numbers by one of the
constants below; nothing else in the code base spells out a release title or
edition. The designation follows IAPWS usage: ``R6-95(2018)`` is release R6,
adopted in 1995, in the revision or editorial edition of 2018; ``year`` is that
edition year.
"""

from __future__ import annotations

from dataclasses import dataclass
from typing import Final

from service.core.errors import InvalidInputError

__all__ = [
    "ALL_SOURCES",
    "IAPWS_95",
    "IAPWS_IF97",
    "ICE_IH",
    "LOW_TEMPERATURE_VAPOR",
    "MELTING_AND_SUBLIMATION",
    "SATURATION_AUXILIARY",
    "PropertySource",
    "source_for",
]


@dataclass(frozen=True)
class PropertySource:
    """One published formulation that property values are computed from.

    Attributes
    ----------
    formulation : str
        Short name used in the code and in API responses (e.g. ``"IAPWS-95"``).
    release : str
        IAPWS designation with edition year (e.g. ``"IAPWS R6-95(2018)"``).
    year : int
        Year of the edition cited (the year in parentheses of ``release``).
    title : str
        Full title of the release.
    scope : str
        What tripoint uses it for, in one sentence.
    source_id : str
        Stable id by which compact answers cite it and ``GET /v1/sources`` resolves it
        (lower case, digits, ``-`` and ``.``).
    """

    formulation: str
    release: str
    year: int
    title: str
    scope: str
    source_id: str

    def citation(self) -> str:
        """One-line citation, e.g. for logs and response metadata."""
        return f"{self.release}, {self.title}"


IAPWS_95: Final = PropertySource(
    formulation="IAPWS-95",
    release="IAPWS R6-95(2018)",
    year=2018,
    title=(
        "Revised Release on the IAPWS Formulation 1995 for the Thermodynamic "
        "Properties of Ordinary Water Substance for General and Scientific Use"
    ),
    scope=(
        "Liquid water and water vapor (Helmholtz free energy), saturation states by "
        "the phase-equilibrium condition; reference formulation of tripoint."
    ),
    source_id="iapws-95",
)

IAPWS_IF97: Final = PropertySource(
    formulation="IAPWS-IF97",
    release="IAPWS R7-97(2012)",
    year=2012,
    title=(
        "Revised Release on the IAPWS Industrial Formulation 1997 for the "
        "Thermodynamic Properties of Water and Steam"
    ),
    scope=(
        "Fast explicit liquid (region 1), vapor (region 2) and saturation-line "
        "(region 4) properties, 273.15 K to 1073.15 K, up to 100 MPa."
    ),
    source_id="iapws-if97",
)

ICE_IH: Final = PropertySource(
    formulation="IAPWS-06 ice Ih",
    release="IAPWS R10-06(2009)",
    year=2009,
    title="Revised Release on the Equation of State 2006 for H2O Ice Ih",
    scope="Properties of ice Ih (Gibbs free energy), 0 K to 273.16 K, up to 210 MPa.",
    source_id="iapws-06-ice-ih",
)

MELTING_AND_SUBLIMATION: Final = PropertySource(
    formulation="IAPWS-08 melting and sublimation pressure",
    release="IAPWS R14-08(2011)",
    year=2011,
    title=(
        "Revised Release on the Pressure along the Melting and Sublimation Curves "
        "of Ordinary Water Substance"
    ),
    scope="Sublimation pressure of ice Ih (50 K to 273.16 K) and melting pressure of ice Ih.",
    source_id="iapws-08-melting-sublimation",
)

SATURATION_AUXILIARY: Final = PropertySource(
    formulation="IAPWS auxiliary saturation equations",
    release="IAPWS SR1-86(1992)",
    year=1992,
    title=("Revised Supplementary Release on Saturation Properties of Ordinary Water Substance"),
    scope=(
        "Simple correlations of saturation pressure and saturated densities, used only "
        "as starting values for the IAPWS-95 phase-equilibrium solve."
    ),
    source_id="iapws-sr1-86-saturation",
)

LOW_TEMPERATURE_VAPOR: Final = PropertySource(
    formulation="IAPWS-95 low-temperature vapor extension",
    release="IAPWS Guideline (2012)",
    year=2012,
    title=("Guideline on a Low-Temperature Extension of the IAPWS-95 Formulation for Water Vapor"),
    scope=(
        "Correction to the IAPWS-95 ideal-gas part for vapor from 50 K to 130 K (sublimation "
        "states of cold ice)."
    ),
    source_id="iapws-95-low-temperature-vapor",
)

ALL_SOURCES: Final[tuple[PropertySource, ...]] = (
    IAPWS_95,
    IAPWS_IF97,
    ICE_IH,
    MELTING_AND_SUBLIMATION,
    SATURATION_AUXILIARY,
    LOW_TEMPERATURE_VAPOR,
)
"""Every source tripoint cites, in the order above."""

_BY_FORMULATION: Final[dict[str, PropertySource]] = {
    source.formulation: source for source in ALL_SOURCES
}


def source_for(formulation: str) -> PropertySource:
    """Return the source record of a formulation by its short name.

    Parameters
    ----------
    formulation : str
        One of the ``formulation`` names in :data:`ALL_SOURCES`
        (e.g. ``"IAPWS-95"``, ``"IAPWS-IF97"``).

    Returns
    -------
    PropertySource

    Raises
    ------
    InvalidInputError
        If no source has that name; the detail lists the known names.

    Examples
    --------
    >>> source_for("IAPWS-IF97").release
    'IAPWS R7-97(2012)'
    """
    try:
        return _BY_FORMULATION[formulation]
    except KeyError:
        known = ", ".join(sorted(_BY_FORMULATION))
        raise InvalidInputError(
            "formulation", f"unknown formulation {formulation!r}; known: {known}", formulation
        ) from None
