"""Every statement an answer can cite, by its stable id: the registry behind ``/v1/sources``.

A compact answer names its reference state, property sources and uncertainty statements
by id; this module gathers, once, every one of them the service can cite, with its full
text, the release and section it rests on and how it got here (``basis``):

- the reference state (:mod:`service.core.properties.reference_state`);
- the property sources: the IAPWS releases (:mod:`service.core.properties.sources`) and
  the solution models (:data:`service.core.solutions.lookups.SOLUTION_SOURCES`);
- the uncertainty statements: the formulations' table
  (:data:`service.core.properties.uncertainty.STATEMENTS`), the solution models'
  comparisons, the balances' evaporated-mass derivation and the "not stated" entry.

Nothing here knows HTTP; the registry's ``content_hash`` changes whenever any text,
number or id changes, so a cache or an auditor can tell two versions apart.
"""

from __future__ import annotations

import functools
import hashlib
import json
from dataclasses import asdict, dataclass
from typing import Final, Literal

from service.core.balances.uncertainty import EVAPORATED_MASS_UNCERTAINTY
from service.core.properties.lookups import NOT_STATED, ReportedUncertainty
from service.core.properties.reference_state import REFERENCE_STATE, REFERENCE_STATE_ID
from service.core.properties.sources import ALL_SOURCES, PropertySource, source_for
from service.core.properties.uncertainty import (
    STATEMENTS,
    StatedUncertainty,
    missing_document,
)
from service.core.solutions.lookups import SOLUTION_SOURCES, SOLUTION_UNCERTAINTIES

__all__ = [
    "CitableStatement",
    "StatementKind",
    "citable_statements",
    "content_hash",
    "missing_documents",
    "source_by_id",
    "statement_by_id",
]

StatementKind = Literal["reference-state", "property-source", "uncertainty"]

_REFERENCE_RELEASE: Final = "IAPWS R6-95(2018); IAPWS R10-06(2009)"


@dataclass(frozen=True)
class CitableStatement:
    """One statement an answer can cite by ``statement_id``.

    Attributes
    ----------
    statement_id : str
        Stable id (lower case, digits, ``-`` and ``.``).
    kind : {"reference-state", "property-source", "uncertainty"}
    text : str
        The full statement (for a property source: its title and what tripoint uses it for).
    release : str
        The release, article or other document it rests on ("" for tripoint's own
        derivations and comparisons without one).
    section : str
        Where in that document, or how it was derived or compared.
    basis : str
        ``"publication"`` (a property source: the document itself), ``"release text"``,
        ``"from memory"`` (recalled, awaiting verification),
        ``"derived"`` (computed by tripoint), ``"comparison"`` (tripoint's tests against
        outside references) or ``"convention"`` (the reference state, fixed by the
        releases).
    missing_document : str or None
        For a ``"from memory"`` statement: which document could not be read.
    quantity : str or None
        Quantity an uncertainty statement is about (full-word name).
    relative : float or None
        Relative uncertainty, fraction (``None``: not relative, or none stated).
    coverage : str or None
        How the uncertainty is stated, in words.
    coverage_factor : float or None
        Coverage factor of ``relative`` (``None``: not stated).
    formulation : str or None
        Short name of the formulation it belongs to.
    minimum_temperature, maximum_temperature : float or None
        K, the temperatures an uncertainty statement covers (inclusive).
    maximum_pressure : float or None
        Pa, the highest pressure it covers (``None``: not limited).
    year : int or None
        Edition year of a property source.
    """

    statement_id: str
    kind: StatementKind
    text: str
    release: str
    section: str
    basis: str
    missing_document: str | None = None
    quantity: str | None = None
    relative: float | None = None
    coverage: str | None = None
    coverage_factor: float | None = None
    formulation: str | None = None
    minimum_temperature: float | None = None
    maximum_temperature: float | None = None
    maximum_pressure: float | None = None
    year: int | None = None


def _reference_state() -> CitableStatement:
    return CitableStatement(
        statement_id=REFERENCE_STATE_ID,
        kind="reference-state",
        text=REFERENCE_STATE,
        release=_REFERENCE_RELEASE,
        section="the releases' reference states (u = 0 and s = 0 of the triple-point liquid)",
        basis="convention",
    )


def _source(source: PropertySource) -> CitableStatement:
    return CitableStatement(
        statement_id=source.source_id,
        kind="property-source",
        text=f"{source.title}. Used for: {source.scope}",
        release=source.release,
        section="whole document",
        basis="publication",
        formulation=source.formulation,
        year=source.year,
    )


def _table_statement(entry: StatedUncertainty) -> CitableStatement:
    return CitableStatement(
        statement_id=entry.statement_id,
        kind="uncertainty",
        text=entry.statement,
        release=source_for(entry.formulation).release,
        section=entry.section,
        basis=entry.basis,
        missing_document=missing_document(entry),
        quantity=entry.quantity,
        relative=entry.relative,
        coverage=entry.coverage,
        coverage_factor=entry.coverage_factor,
        formulation=entry.formulation,
        minimum_temperature=entry.minimum_temperature,
        maximum_temperature=entry.maximum_temperature,
        maximum_pressure=entry.maximum_pressure,
    )


def _fixed_statement(entry: ReportedUncertainty) -> CitableStatement:
    return CitableStatement(
        statement_id=entry.statement_id,
        kind="uncertainty",
        text=entry.statement,
        release=entry.source,
        section=entry.source,
        basis=entry.basis or "not stated",
        quantity=entry.quantity or None,
        relative=entry.relative,
        coverage=entry.coverage,
        coverage_factor=entry.coverage_factor,
    )


@functools.cache
def citable_statements() -> tuple[CitableStatement, ...]:
    """Every statement the service can cite, reference state first, then sources, then
    uncertainty statements (each id once).

    Raises
    ------
    ValueError
        If two statements share an id (a programming error, caught by the tests).

    Examples
    --------
    >>> statement_by_id("iapws-95").release
    'IAPWS R6-95(2018)'
    """
    entries = (
        _reference_state(),
        *(_source(source) for source in (*ALL_SOURCES, *SOLUTION_SOURCES)),
        *(_table_statement(entry) for entry in STATEMENTS),
        *(
            _fixed_statement(entry)
            for entry in (*SOLUTION_UNCERTAINTIES, EVAPORATED_MASS_UNCERTAINTY, NOT_STATED)
        ),
    )
    ids = [entry.statement_id for entry in entries]
    duplicated = sorted({item for item in ids if ids.count(item) > 1})
    if duplicated:
        raise ValueError(f"statement ids used twice: {duplicated}")
    return entries


@functools.cache
def _by_id() -> dict[str, CitableStatement]:
    return {entry.statement_id: entry for entry in citable_statements()}


def statement_by_id(statement_id: str) -> CitableStatement | None:
    """The statement with this id, or ``None`` if the service cites none by it."""
    return _by_id().get(statement_id)


@functools.cache
def _sources_by_id() -> dict[str, PropertySource]:
    return {source.source_id: source for source in (*ALL_SOURCES, *SOLUTION_SOURCES)}


def source_by_id(source_id: str) -> PropertySource | None:
    """The property source with this id, or ``None``."""
    return _sources_by_id().get(source_id)


def missing_documents() -> tuple[str, ...]:
    """The documents whose text could not be read, as the from-memory statements say."""
    return tuple(
        dict.fromkeys(
            entry.missing_document for entry in citable_statements() if entry.missing_document
        )
    )


@functools.cache
def content_hash() -> str:
    """SHA-256 (hex) of the registry's canonical JSON: changes with any id, text or number."""
    canonical = json.dumps(
        [asdict(entry) for entry in citable_statements()],
        sort_keys=True,
        separators=(",", ":"),
        ensure_ascii=True,
    )
    return hashlib.sha256(canonical.encode()).hexdigest()
