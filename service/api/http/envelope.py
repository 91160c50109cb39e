"""The envelope every answer carries: reference state, assumptions, sources, uncertainty,
warnings and meta."""

from __future__ import annotations

import functools
import math
from collections.abc import Iterable, Sequence
from datetime import UTC, datetime
from typing import Any
from urllib.parse import quote

import orjson

from service import __version__
from service.api.http.detail import Detail, current_detail
from service.api.http.observability import current_request_id
from service.api.http.responses import NonFiniteResultError
from service.api.http.units import UnitSet
from service.core.properties.advisories import Advisory
from service.core.properties.lookups import ReportedUncertainty
from service.core.properties.reference_state import REFERENCE_STATE, REFERENCE_STATE_ID
from service.core.properties.sources import PropertySource

__all__ = ["envelope", "statements_location", "uncertainty_output"]


def uncertainty_output(
    item: ReportedUncertainty,
    absolute: dict[str, Any] | None = None,
    detail: Detail | None = None,
) -> dict[str, Any]:
    """One ``uncertainty`` entry of an answer, at the request's detail.

    Compact: the quantity, the numbers (``relative``, or ``absolute`` where given, an
    output quantity in the answer's units), the coverage factor, the basis and the id of
    the statement; ``detail=full`` adds the coverage in words, the statement and the
    source texts. ``detail`` defaults to the request's.
    """
    entry: dict[str, Any] = {"quantity": item.quantity, "relative": item.relative}
    if absolute is not None:
        entry["absolute"] = absolute
    entry["coverage_factor"] = item.coverage_factor
    entry["basis"] = item.basis
    entry["statement_id"] = item.statement_id
    if (detail or current_detail()) is Detail.FULL:
        entry["coverage"] = item.coverage
        entry["statement"] = item.statement
        entry["source"] = item.source
    return entry


def _source_output(source: PropertySource, detail: Detail) -> dict[str, Any]:
    entry: dict[str, Any] = {"id": source.source_id, "release": source.release}
    if detail is Detail.FULL:
        entry["formulation"] = source.formulation
        entry["year"] = source.year
        entry["title"] = source.title
        entry["scope"] = source.scope
    return entry


# The texts an answer states beside its numbers repeat from one answer to the next:
# each is rendered to JSON once per detail and embedded as is (orjson.Fragment), which
# spares every response building, checking and serializing the same entries.
_REPEATED_TEXTS = 512


@functools.lru_cache(maxsize=_REPEATED_TEXTS)
def _assumptions_json(assumptions: tuple[str, ...]) -> orjson.Fragment:
    return orjson.Fragment(orjson.dumps(list(assumptions)))


@functools.lru_cache(maxsize=_REPEATED_TEXTS)
def _sources_json(sources: tuple[PropertySource, ...], detail: Detail) -> orjson.Fragment:
    return orjson.Fragment(orjson.dumps([_source_output(source, detail) for source in sources]))


@functools.lru_cache(maxsize=_REPEATED_TEXTS)
def _uncertainties_json(
    uncertainties: tuple[ReportedUncertainty, ...], detail: Detail
) -> orjson.Fragment:
    if any(
        item.relative is not None and not math.isfinite(item.relative) for item in uncertainties
    ):
        raise NonFiniteResultError("non-finite relative uncertainty")
    return orjson.Fragment(
        orjson.dumps([uncertainty_output(item, detail=detail) for item in uncertainties])
    )


@functools.cache
def statements_location() -> str:
    """Where every id of this service version's answers resolves (``meta.statements``)."""
    return f"/v1/sources?version={quote(__version__, safe='')}"


def envelope(
    *,
    unit_set: UnitSet,
    assumptions: Iterable[str],
    sources: Sequence[PropertySource],
    uncertainties: Iterable[ReportedUncertainty],
    advisories: Iterable[Advisory],
) -> dict[str, Any]:
    """The envelope every calculation response carries, at the request's detail
    (:mod:`service.api.http.detail`).

    ``assumptions``, ``property_sources`` and ``uncertainty`` are pre-rendered JSON
    (``orjson.Fragment``), which the response renderer embeds as they are. A compact
    answer cites the reference state, sources and uncertainty statements by id
    (``meta.statements`` says where they resolve); ``detail=full`` adds their texts.
    """
    detail = current_detail()
    return {
        "reference_state": REFERENCE_STATE if detail is Detail.FULL else REFERENCE_STATE_ID,
        "assumptions": _assumptions_json(tuple(assumptions)),
        "property_sources": _sources_json(tuple(sources), detail),
        "uncertainty": _uncertainties_json(tuple(uncertainties), detail),
        "warnings": [
            {
                "code": advisory.code,
                "message": advisory.message,
                "indices": list(advisory.indices) if advisory.indices is not None else None,
            }
            for advisory in advisories
        ],
        "meta": {
            "service_version": __version__,
            # Only a stored answer has a calculation id (record_calculation adds it); every
            # answer carries its request id.
            "request_id": current_request_id(),
            "time": datetime.now(UTC).isoformat(timespec="milliseconds").replace("+00:00", "Z"),
            "output_units": unit_set.value,
            "detail": detail.value,
            "statements": statements_location(),
        },
    }
