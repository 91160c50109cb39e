"""The formulations' own uncertainty statements, as a lookup table.

Each :class:`StatedUncertainty` is one statement of the relative uncertainty of
one quantity over a temperature range, with its coverage, its text, the release and
section it comes from (``section``) and how the value got here (``basis``):

- ``"release text"``: read from the release;
- ``"from memory"``: recalled from the release or its companion article, NOT read
  from the text while writing this table. These values await verification against
  the release before they are quoted as IAPWS statements;
- ``"derived"``: computed by tripoint from other entries and from deviations
  measured in tests/core/test_if97_vs_reference.py; the statement says how.

Verification state (checked 2026-12-03 with the project's search tool, corpora of
stored web pages, documentation and public repositories, and checked again the same day
for the release texts of R6-95(2018), R7-97(2012), R10-06(2009), R14-08(2011) and the
supercooled-water guideline G12-15): the uncertainty sections of IAPWS R6-95(2018),
R10-06(2009) and R14-08(2011), and of their companion articles, are not stored there
(only cover pages, abstracts truncated before their uncertainty sentences, and the
releases' web pages are), so every IAPWS-95, R10-06 and R14-08 entry is still
``"from memory"`` and says in its statement which document could not be read; ``GET
/v1/sources`` lists those documents (``missing_documents``). :func:`statement_defects`
enforces this: an entry may claim ``"release text"`` only with a section, table or figure
citation, and a ``"from memory"`` entry must name its missing document. Every IAPWS-IF97
entry is ``"derived"``. Where the NIST Chemistry WebBook's notes on the IAPWS-95 equation of
state (a secondary source, not the release) give a figure for the same quantity, the
entry says whether it agrees. Relative uncertainties are fractions (0.00025 means
0.025 %). IAPWS states its uncertainty estimates as expanded uncertainties with
coverage factor k = 2 (about 95 % confidence) as far as recalled; ``coverage`` repeats
what each entry assumes.
"""

from __future__ import annotations

import functools
import re
from dataclasses import dataclass, field
from typing import Final, Literal

import numpy as np
from numpy.typing import ArrayLike, NDArray

from service.core.errors import InvalidInputError, OutOfRangeError
from service.core.properties.phase import FloatArray
from service.core.properties.sources import IAPWS_95, IAPWS_IF97, ICE_IH, MELTING_AND_SUBLIMATION
from service.core.validation import (
    beyond_maximum,
    beyond_minimum,
    broadcast_pair,
    finite_array,
)

__all__ = [
    "STATEMENTS",
    "Basis",
    "StatedUncertainty",
    "UncertaintyLookup",
    "covered_quantities",
    "missing_document",
    "stated_uncertainty",
    "statement_at",
    "statement_defects",
]

Basis = Literal["release text", "from memory", "derived"]

_K2_FROM_MEMORY: Final = (
    "k = 2 (expanded, about 95 %) assumed from the IAPWS convention as recalled; the "
    "release's own wording of the coverage was not read (release text not found)"
)
_K2_DERIVED: Final = (
    "k = 2 (expanded, about 95 %) assumed, as for the entries it is derived from; a "
    "tripoint derivation, not a release statement"
)
_COVERAGE_FACTOR: Final = 2.0
_NOT_FOUND: Final = "Release text not found:"
_CITATION: Final = re.compile(r"\b(section|sec\.|table|figure|fig\.)\s*\d", re.IGNORECASE)
_AMBIENT_PRESSURE_LIMIT: Final = 1.0e6  # Pa; "ambient pressure" statements are not used above


@dataclass(frozen=True)
class StatedUncertainty:
    """One stated relative uncertainty of one quantity over a temperature range.

    Attributes
    ----------
    formulation : str
        Short name of the formulation (``PropertySource.formulation``).
    quantity : str
        Full-word quantity name, e.g. ``"saturation_pressure"``.
    minimum_temperature, maximum_temperature : float
        Temperature range the statement covers, K (inclusive).
    relative : float
        Relative uncertainty as a fraction (not percent).
    coverage : str
        Coverage of the uncertainty (k = 2 expanded unless stated otherwise).
    statement : str
        The statement, quoted or paraphrased, with any qualification.
    section : str
        Release and section the statement comes from.
    basis : {"release text", "from memory", "derived"}
        How the value got into this table (see module docstring).
    maximum_pressure : float or None
        Highest pressure the statement covers, Pa; ``None`` if not limited.
    statement_id : str
        Stable id by which compact answers cite it (``GET /v1/sources`` resolves it).
    coverage_factor : float
        Coverage factor of ``relative`` as a number (2 for the expanded k = 2 values).
    """

    formulation: str
    quantity: str
    minimum_temperature: float
    maximum_temperature: float
    relative: float
    coverage: str
    statement: str
    section: str
    basis: Basis
    maximum_pressure: float | None = None
    statement_id: str = field(kw_only=True)
    coverage_factor: float = field(default=_COVERAGE_FACTOR, kw_only=True)


@dataclass(frozen=True)
class UncertaintyLookup:
    """Result of :func:`stated_uncertainty` for an array of states.

    Attributes
    ----------
    relative_uncertainty : ndarray
        Relative uncertainty (fraction) per state, float64, shape of the input.
    statement_index : ndarray
        Index into ``statements`` of the statement applied to each state.
    statements : tuple of StatedUncertainty
        The statements that apply to at least one state, in table order.
    """

    relative_uncertainty: FloatArray
    statement_index: NDArray[np.intp]
    statements: tuple[StatedUncertainty, ...]


_IAPWS95_SECTION: Final = (
    "IAPWS R6-95(2018), uncertainty estimates (section number not verified); "
    "W. Wagner and A. Pruss, J. Phys. Chem. Ref. Data 31, 387 (2002)"
)
_ICE_SECTION: Final = (
    "IAPWS R10-06(2009), uncertainty estimates (section number not verified); "
    "R. Feistel and W. Wagner, J. Phys. Chem. Ref. Data 35, 1021 (2006)"
)
_CURVES_SECTION: Final = (
    "IAPWS R14-08(2011), uncertainty estimates (section number not verified); "
    "W. Wagner, T. Riethmann, R. Feistel and A. H. Harvey, J. Phys. Chem. Ref. Data 40, "
    "043103 (2011)"
)
_IF97_SECTION: Final = (
    "derived by tripoint from IAPWS R6-95(2018) entries and measured IF97 - IAPWS-95 "
    "deviations (tests/core/test_if97_vs_reference.py); IAPWS R7-97(2012) uncertainty "
    "statements not read"
)
_R6_95_NOT_FOUND: Final = (
    f"{_NOT_FOUND} the uncertainty section of IAPWS R6-95(2018) and that of Wagner and "
    "Pruss (2002) could not be read (only their cover pages are stored)."
)
_R10_06_NOT_FOUND: Final = (
    f"{_NOT_FOUND} the uncertainty statements of IAPWS R10-06(2009) and of Feistel and "
    "Wagner (2006) could not be read (only the release's web page is stored)."
)
_R14_08_NOT_FOUND: Final = (
    f"{_NOT_FOUND} the uncertainty statements of IAPWS R14-08(2011) and of Wagner et al. "
    "(2011) could not be read (only the release's cover page and the article's abstract "
    "are stored; the abstract says only that the new equations have significantly less "
    "uncertainty than the 1993 ones)."
)
# Read (2026-12-03) as quoted, with its WebBook citation, in the public repository
# hydraulic-institute/edb, source/02_fluid-properties-II/01_water-properties.md.
_WEBBOOK: Final = (
    "Secondary source, not the release: the NIST Chemistry WebBook's notes on this "
    "equation of state (SRD 69; Lemmon, McLinden and Friend)"
)
_IAPWS95_DERIVED_SECTION: Final = (
    "derived by tripoint from the IAPWS-95 entries above (IAPWS R6-95(2018); W. Wagner and "
    "A. Pruss, J. Phys. Chem. Ref. Data 31, 387 (2002))"
)

STATEMENTS: Final[tuple[StatedUncertainty, ...]] = (
    # ----------------------------------------------------------------- IAPWS-95
    StatedUncertainty(
        IAPWS_95.formulation,
        "saturation_pressure",
        273.16,
        647.096,
        0.00025,
        _K2_FROM_MEMORY,
        "Vapor pressure from IAPWS-95 (phase-equilibrium condition): relative "
        "uncertainty 0.025 % from the triple point to the critical point, as recalled. "
        f"{_R6_95_NOT_FOUND} {_WEBBOOK} also state 0.025 % in vapor pressure.",
        _IAPWS95_SECTION,
        "from memory",
        statement_id="iapws-95.saturation-pressure",
    ),
    StatedUncertainty(
        IAPWS_95.formulation,
        "saturated_liquid_density",
        273.16,
        373.15,
        0.000001,
        _K2_FROM_MEMORY,
        "Liquid density near ambient pressure: relative uncertainty 0.0001 %, as "
        "recalled; applied by tripoint to saturated liquid up to 373.15 K, where "
        f"p_sat <= 0.1 MPa. {_R6_95_NOT_FOUND} {_WEBBOOK} state 0.0025 % in "
        "saturated liquid density, larger than the value used here.",
        _IAPWS95_SECTION,
        "from memory",
        statement_id="iapws-95.saturated-liquid-density.273-373-k",
    ),
    StatedUncertainty(
        IAPWS_95.formulation,
        "saturated_liquid_density",
        373.15,
        623.15,
        0.0002,
        _K2_FROM_MEMORY,
        "Liquid density in the main liquid region: relative uncertainty 0.001 % to "
        f"0.02 %, as recalled; the upper value is used. {_R6_95_NOT_FOUND} "
        f"{_WEBBOOK} state 0.0025 % in saturated liquid density, rising toward the "
        "critical point.",
        _IAPWS95_SECTION,
        "from memory",
        statement_id="iapws-95.saturated-liquid-density.373-623-k",
    ),
    StatedUncertainty(
        IAPWS_95.formulation,
        "saturated_vapor_density",
        273.16,
        623.15,
        0.0005,
        _K2_FROM_MEMORY,
        "Vapor density in the gas region: relative uncertainty 0.03 % to 0.05 %, as "
        f"recalled; the upper value is used for saturated vapor. {_R6_95_NOT_FOUND} "
        f"{_WEBBOOK} state 0.1 % in saturated vapor density, larger than the value "
        "used here.",
        _IAPWS95_SECTION,
        "from memory",
        statement_id="iapws-95.saturated-vapor-density",
    ),
    StatedUncertainty(
        IAPWS_95.formulation,
        "liquid_density",
        273.15,
        373.124,
        0.000001,
        _K2_FROM_MEMORY,
        "Liquid density at ambient pressure: relative uncertainty at most 0.0001 %, as "
        f"recalled. Used only up to 1 MPa. {_R6_95_NOT_FOUND} {_WEBBOOK} also state "
        "0.0001 % for the liquid at 1 atm.",
        _IAPWS95_SECTION,
        "from memory",
        _AMBIENT_PRESSURE_LIMIT,
        statement_id="iapws-95.liquid-density",
    ),
    StatedUncertainty(
        IAPWS_95.formulation,
        "liquid_isobaric_heat_capacity",
        273.15,
        623.15,
        0.001,
        _K2_FROM_MEMORY,
        "Isobaric heat capacity in the main liquid region: relative uncertainty "
        f"0.1 %, as recalled. {_R6_95_NOT_FOUND} {_WEBBOOK} also state 0.1 % in the "
        "liquid, rising in the critical region and at high pressures.",
        _IAPWS95_SECTION,
        "from memory",
        statement_id="iapws-95.liquid-isobaric-heat-capacity",
    ),
    StatedUncertainty(
        IAPWS_95.formulation,
        "enthalpy_of_vaporization",
        273.16,
        623.15,
        0.00056,
        _K2_DERIVED,
        "No direct statement used. Clapeyron equation, h'' - h' = T (v'' - v') dp_s/dT: "
        "the p_s (0.025 %) and saturated vapor density (0.05 %) entries, both from "
        "memory, added in quadrature, taking the relative uncertainty of dp_s/dT equal "
        "to that of p_s (an approximation).",
        _IAPWS95_DERIVED_SECTION,
        "derived",
        statement_id="iapws-95.enthalpy-of-vaporization",
    ),
    StatedUncertainty(
        IAPWS_95.formulation,
        "vapor_enthalpy",
        273.16,
        623.15,
        0.00056,
        _K2_DERIVED,
        "No direct statement used. h'' = h' + (h'' - h') with the reference state at "
        "the triple-point liquid; the enthalpy of vaporization entry is applied to h'' "
        "(conservative while h' >= 0, i.e. from the triple point up).",
        _IAPWS95_DERIVED_SECTION,
        "derived",
        statement_id="iapws-95.vapor-enthalpy",
    ),
    # ----------------------------------------------------------------- IAPWS-IF97
    StatedUncertainty(
        IAPWS_IF97.formulation,
        "saturation_pressure",
        273.16,
        623.15,
        0.00043,
        _K2_DERIVED,
        "IAPWS-95 p_s entry (0.025 %, from memory) plus the largest measured "
        "|Eq. 30 - IAPWS-95| deviation, 0.0176 %, added linearly.",
        _IF97_SECTION,
        "derived",
        statement_id="iapws-if97.saturation-pressure",
    ),
    StatedUncertainty(
        IAPWS_IF97.formulation,
        "saturated_liquid_density",
        273.16,
        373.15,
        0.000017,
        _K2_DERIVED,
        "IAPWS-95 entry (0.0001 %, from memory) plus the largest measured region 1 - "
        "IAPWS-95 deviation at saturation up to 373.15 K, 0.0016 %, added linearly.",
        _IF97_SECTION,
        "derived",
        statement_id="iapws-if97.saturated-liquid-density.273-373-k",
    ),
    StatedUncertainty(
        IAPWS_IF97.formulation,
        "saturated_liquid_density",
        373.15,
        623.15,
        0.00024,
        _K2_DERIVED,
        "IAPWS-95 entry (0.02 %, from memory) plus the largest measured region 1 - "
        "IAPWS-95 deviation at saturation, 0.0031 %, added linearly.",
        _IF97_SECTION,
        "derived",
        statement_id="iapws-if97.saturated-liquid-density.373-623-k",
    ),
    StatedUncertainty(
        IAPWS_IF97.formulation,
        "saturated_vapor_density",
        273.16,
        623.15,
        0.00092,
        _K2_DERIVED,
        "IAPWS-95 entry (0.05 %, from memory) plus the largest measured region 2 - "
        "IAPWS-95 deviation at saturation, 0.042 %, added linearly.",
        _IF97_SECTION,
        "derived",
        statement_id="iapws-if97.saturated-vapor-density",
    ),
    StatedUncertainty(
        IAPWS_IF97.formulation,
        "liquid_density",
        273.15,
        373.124,
        0.000017,
        _K2_DERIVED,
        "IAPWS-95 ambient-pressure entry (0.0001 %, from memory) plus the largest "
        "measured region 1 - IAPWS-95 density deviation at 0.1 MPa and 1 MPa up to "
        "373.12 K, 0.0016 %, added linearly. Used only up to 1 MPa.",
        _IF97_SECTION,
        "derived",
        _AMBIENT_PRESSURE_LIMIT,
        statement_id="iapws-if97.liquid-density",
    ),
    StatedUncertainty(
        IAPWS_IF97.formulation,
        "liquid_isobaric_heat_capacity",
        273.16,
        623.15,
        0.0025,
        _K2_DERIVED,
        "IAPWS-95 entry (0.1 %, from memory) plus the largest measured region 1 - "
        "IAPWS-95 deviation along the saturation line, 0.15 %, added linearly.",
        _IF97_SECTION,
        "derived",
        statement_id="iapws-if97.liquid-isobaric-heat-capacity",
    ),
    StatedUncertainty(
        IAPWS_IF97.formulation,
        "enthalpy_of_vaporization",
        273.16,
        623.15,
        0.0009,
        _K2_DERIVED,
        "IAPWS-95 entry (0.056 %, derived from from-memory entries) plus the largest "
        "measured IF97 - IAPWS-95 deviation of h'' - h', 0.034 %, added linearly.",
        _IF97_SECTION,
        "derived",
        statement_id="iapws-if97.enthalpy-of-vaporization",
    ),
    # ----------------------------------------------------------------- R10-06 ice Ih
    StatedUncertainty(
        ICE_IH.formulation,
        "ice_density",
        0.0,
        273.16,
        0.0002,
        _K2_FROM_MEMORY,
        "Density of ice Ih at normal pressure: relative uncertainty about 0.02 %, "
        f"recalled with low confidence. {_R10_06_NOT_FOUND}",
        _ICE_SECTION,
        "from memory",
        statement_id="iapws-06-ice-ih.ice-density",
    ),
    StatedUncertainty(
        ICE_IH.formulation,
        "ice_isobaric_heat_capacity",
        0.0,
        273.16,
        0.02,
        _K2_FROM_MEMORY,
        "Isobaric heat capacity of ice Ih: relative uncertainty about 2 %, recalled "
        f"with low confidence. {_R10_06_NOT_FOUND}",
        _ICE_SECTION,
        "from memory",
        statement_id="iapws-06-ice-ih.ice-isobaric-heat-capacity",
    ),
    StatedUncertainty(
        ICE_IH.formulation,
        "ice_enthalpy",
        0.0,
        273.16,
        0.001,
        _K2_FROM_MEMORY,
        "Enthalpy of ice Ih relative to the IAPWS reference state, dominated by the "
        "enthalpy of melting at the triple point: relative uncertainty about 0.1 %, "
        f"recalled with low confidence. {_R10_06_NOT_FOUND}",
        _ICE_SECTION,
        "from memory",
        statement_id="iapws-06-ice-ih.ice-enthalpy",
    ),
    StatedUncertainty(
        ICE_IH.formulation,
        "enthalpy_of_sublimation",
        0.0,
        273.16,
        0.001,
        _K2_FROM_MEMORY,
        "Enthalpy of sublimation from R10-06 with IAPWS-95: relative uncertainty about "
        f"0.1 %, recalled with low confidence. {_R10_06_NOT_FOUND}",
        _ICE_SECTION,
        "from memory",
        statement_id="iapws-06-ice-ih.enthalpy-of-sublimation",
    ),
    # ----------------------------------------------------------------- R14-08 curves
    StatedUncertainty(
        MELTING_AND_SUBLIMATION.formulation,
        "sublimation_pressure",
        190.0,
        273.16,
        0.005,
        _K2_FROM_MEMORY,
        "Sublimation pressure of ice Ih, 190 K to the triple point: relative "
        "uncertainty at most about 0.5 %, smaller near the triple point, recalled with "
        f"low confidence. {_R14_08_NOT_FOUND}",
        _CURVES_SECTION,
        "from memory",
        statement_id="iapws-08-melting-sublimation.sublimation-pressure.190-273-k",
    ),
    StatedUncertainty(
        MELTING_AND_SUBLIMATION.formulation,
        "sublimation_pressure",
        50.0,
        190.0,
        0.05,
        _K2_FROM_MEMORY,
        "Sublimation pressure of ice Ih below 190 K: uncertainty grows to several "
        f"percent; 5 % is used, recalled with low confidence. {_R14_08_NOT_FOUND}",
        _CURVES_SECTION,
        "from memory",
        statement_id="iapws-08-melting-sublimation.sublimation-pressure.50-190-k",
    ),
    StatedUncertainty(
        MELTING_AND_SUBLIMATION.formulation,
        "melting_pressure",
        251.165,
        273.16,
        0.01,
        _K2_FROM_MEMORY,
        "Melting pressure of ice Ih: relative uncertainty about 1 % of the pressure "
        "(smaller in absolute terms near the triple point), recalled with low "
        f"confidence. {_R14_08_NOT_FOUND}",
        _CURVES_SECTION,
        "from memory",
        statement_id="iapws-08-melting-sublimation.melting-pressure",
    ),
)
"""Every uncertainty statement tripoint knows, in lookup order."""


def statement_defects(entry: StatedUncertainty) -> tuple[str, ...]:
    """What keeps one table entry from being quotable as its ``basis`` claims.

    Parameters
    ----------
    entry : StatedUncertainty
        One entry of :data:`STATEMENTS` (or a candidate for it).

    Returns
    -------
    tuple of str
        One sentence per defect; empty when the entry is well formed:

        - ``"release text"``: ``section`` cites a section, table or figure by number
          (``Section 6``, ``Table 3``, ``Fig. 2``...), says nothing is unverified, and
          neither text says the value was recalled or that the release was not found;
        - ``"from memory"``: ``statement`` says which document could not be read
          (``"Release text not found:"`` followed by the release);
        - ``"derived"``: ``section`` says it was derived and by whom.

    Examples
    --------
    >>> [statement_defects(entry) for entry in STATEMENTS if statement_defects(entry)]
    []
    """
    defects: list[str] = []
    if entry.basis == "release text":
        if not _CITATION.search(entry.section):
            defects.append("a release-text entry must cite a section, table or figure by number")
        if "not verified" in entry.section:
            defects.append("a release-text entry cannot have an unverified section")
        for text in (entry.statement, entry.coverage):
            lowered = text.lower()
            if "recalled" in lowered or _NOT_FOUND.lower().rstrip(":") in lowered:
                defects.append("a release-text entry cannot say it was recalled or not found")
                break
    elif entry.basis == "from memory":
        at = entry.statement.find(_NOT_FOUND)
        if at < 0 or "IAPWS R" not in entry.statement[at:]:
            defects.append(
                f"a from-memory entry must say {_NOT_FOUND!r} and name the missing release"
            )
    elif not entry.section.startswith("derived"):
        defects.append("a derived entry's section must say how it was derived")
    return tuple(defects)


def missing_document(entry: StatedUncertainty) -> str | None:
    """Which document a ``"from memory"`` entry could not be read from (its statement's
    sentence after ``"Release text not found:"``); ``None`` for other entries.

    Examples
    --------
    >>> missing_document(STATEMENTS[0]).startswith("the uncertainty section of IAPWS R6-95")
    True
    """
    if entry.basis != "from memory":
        return None
    at = entry.statement.find(_NOT_FOUND)
    if at < 0:
        return None
    rest = entry.statement[at + len(_NOT_FOUND) :].strip()
    end = rest.find(").")
    return rest if end < 0 else rest[: end + 1]


def covered_quantities() -> tuple[tuple[str, str], ...]:
    """Return the (formulation, quantity) pairs that have at least one statement.

    Examples
    --------
    >>> ("IAPWS-95", "saturation_pressure") in covered_quantities()
    True
    """
    pairs: dict[tuple[str, str], None] = {}
    for entry in STATEMENTS:
        pairs[(entry.formulation, entry.quantity)] = None
    return tuple(pairs)


def stated_uncertainty(
    formulation: str,
    quantity: str,
    temperature: ArrayLike,
    pressure: ArrayLike | None = None,
) -> UncertaintyLookup:
    """Look up the stated relative uncertainty of a quantity at given temperatures.

    Parameters
    ----------
    formulation : str
        ``PropertySource.formulation`` of the formulation, e.g. ``"IAPWS-95"``.
    quantity : str
        Quantity name; see :func:`covered_quantities`.
    temperature : array_like
        Temperature, K, within the ranges of the statements for that quantity.
    pressure : array_like, optional
        Pressure, Pa, broadcast against ``temperature``; checked only against
        statements limited in pressure (e.g. liquid density at ambient pressure).

    Returns
    -------
    UncertaintyLookup
        Relative uncertainty (fraction) per state and the statements applied. Where
        two statements meet at a boundary temperature, the first in table order
        (the lower range) applies.

    Raises
    ------
    InvalidInputError
        Unknown formulation or quantity, or a non-finite temperature or pressure.
    OutOfRangeError
        A temperature no statement covers, or a pressure above a statement's limit.

    Notes
    -----
    The values are the formulations' own statements (or tripoint's derivations
    from them); check ``basis`` of each statement before quoting one as IAPWS's.

    References
    ----------
    IAPWS R6-95(2018); IAPWS R7-97(2012); IAPWS R10-06(2009); IAPWS R14-08(2011).

    Examples
    --------
    >>> lookup = stated_uncertainty("IAPWS-95", "saturation_pressure", [300.0, 400.0])
    >>> lookup.relative_uncertainty.tolist()
    [0.00025, 0.00025]
    """
    table = _table_for(formulation, quantity)
    entries = table.entries
    t = finite_array(temperature, "temperature")
    p = None if pressure is None else finite_array(pressure, "pressure")
    if p is not None:
        t, p = broadcast_pair(t, p, "pressure")

    # First statement, in table order, whose range holds each temperature.
    flat = t.reshape(-1, 1)
    inside = ~beyond_minimum(flat, table.minimum_temperature, exclusive=False) & ~beyond_maximum(
        flat, table.maximum_temperature
    )
    covered = inside.any(axis=1)
    index = np.argmax(inside, axis=1).reshape(t.shape)
    if not covered.all():
        first = int(np.flatnonzero(~covered)[0])
        raise OutOfRangeError(
            "temperature",
            float(t.reshape(-1)[first]),
            float(table.minimum_temperature.min()),
            float(table.maximum_temperature.max()),
            "K",
            f"no stated uncertainty of {formulation} {quantity.replace('_', ' ')} covers this "
            "temperature",
            first,
        )
    if p is not None:
        limits = table.maximum_pressure
        over = np.flatnonzero(p > limits[index])
        if over.size:
            first = int(over[0])
            raise OutOfRangeError(
                "pressure",
                float(p.reshape(-1)[first]),
                None,
                float(limits[index.reshape(-1)[first]]),
                "Pa",
                f"the stated uncertainty of {formulation} {quantity.replace('_', ' ')} "
                "applies at ambient pressure only",
                first,
            )

    used = np.flatnonzero(np.bincount(index.reshape(-1), minlength=len(entries)))
    remap = np.full(len(entries), -1, dtype=np.intp)
    remap[used] = np.arange(used.size, dtype=np.intp)
    return UncertaintyLookup(
        relative_uncertainty=np.asarray(table.relative[index], dtype=np.float64),
        statement_index=np.asarray(remap[index], dtype=np.intp),
        statements=tuple(entries[int(k)] for k in used),
    )


def statement_at(
    formulation: str, quantity: str, temperature: float, pressure: float | None = None
) -> StatedUncertainty:
    """The statement that applies to one state.

    What :func:`stated_uncertainty` applies to a single state (the first statement
    in table order whose range holds it), found without arrays.

    Parameters
    ----------
    formulation, quantity : str
        As :func:`stated_uncertainty`.
    temperature : float
        Temperature, K.
    pressure : float, optional
        Pressure, Pa, as in :func:`stated_uncertainty`.

    Returns
    -------
    StatedUncertainty

    Raises
    ------
    InvalidInputError, OutOfRangeError
        As :func:`stated_uncertainty` (no statement covers the temperature, or it is
        not finite).

    Examples
    --------
    >>> statement_at("IAPWS-95", "saturation_pressure", 300.0).relative
    0.00025
    """
    for entry in _table_for(formulation, quantity).entries:
        if entry.minimum_temperature <= temperature <= entry.maximum_temperature:
            limit = entry.maximum_pressure
            if limit is None or (pressure is not None and pressure <= limit):
                return entry
            break
    # Not covered, NaN, or a pressure to check: the array lookup decides, or raises.
    return stated_uncertainty(formulation, quantity, temperature, pressure).statements[0]


@dataclass(frozen=True)
class _QuantityTable:
    """The statements of one (formulation, quantity), with their ranges as arrays."""

    entries: tuple[StatedUncertainty, ...]
    minimum_temperature: FloatArray
    maximum_temperature: FloatArray
    maximum_pressure: FloatArray
    relative: FloatArray


@functools.cache
def _table_for(formulation: str, quantity: str) -> _QuantityTable:
    """Statements of ``quantity`` in ``formulation``, built once per pair (raises if none)."""
    entries = tuple(e for e in STATEMENTS if e.formulation == formulation)
    if not entries:
        known = sorted({e.formulation for e in STATEMENTS})
        raise InvalidInputError(
            "formulation", f"no uncertainty statements for {formulation!r}; known: {known}"
        )
    entries = tuple(e for e in entries if e.quantity == quantity)
    if not entries:
        known = sorted({q for f, q in covered_quantities() if f == formulation})
        raise InvalidInputError(
            "quantity",
            f"no uncertainty statement of {formulation} for {quantity!r}; known: {known}",
        )
    return _QuantityTable(
        entries=entries,
        minimum_temperature=np.array([e.minimum_temperature for e in entries]),
        maximum_temperature=np.array([e.maximum_temperature for e in entries]),
        maximum_pressure=np.array(
            [np.inf if e.maximum_pressure is None else e.maximum_pressure for e in entries]
        ),
        relative=np.array([e.relative for e in entries], dtype=np.float64),
    )
