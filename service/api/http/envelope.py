"""The envelope every answer carries: reference state, assumptions, sources, uncertainty,
warnings and meta."""

from __future__ import annotations

import functools
import math
from collections.abc import Iterable, Sequence
from datetime import UTC, datetime
from typing import Any

import orjson

from service import __version__
from service.api.http.observability import current_request_id
from service.api.http.responses import NonFiniteResultError
from service.api.http.units import UnitSet
from service.core.properties.advisories import Advisory
from service.core.properties.lookups import ReportedUncertainty
from service.core.properties.reference_state import REFERENCE_STATE
from service.core.properties.sources import PropertySource

__all__ = ["envelope"]


def _uncertainty_output(item: ReportedUncertainty) -> dict[str, Any]:
    return {
        "quantity": item.quantity,
        "relative": item.relative,
        "absolute": None,
        "coverage": item.coverage,
        "statement": item.statement,
        "source": item.source,
        "basis": item.basis,
    }


def _source_output(source: PropertySource) -> dict[str, Any]:
    return {
        "formulation": source.formulation,
        "release": source.release,
        "year": source.year,
        "title": source.title,
        "scope": source.scope,
    }


# The texts an answer states beside its numbers repeat from one answer to the next:
# each is rendered to JSON once and embedded as is (orjson.Fragment), which spares
# every response building, checking and serializing about 3 kB of the same text.
_REPEATED_TEXTS = 512


@functools.lru_cache(maxsize=_REPEATED_TEXTS)
def _assumptions_json(assumptions: tuple[str, ...]) -> orjson.Fragment:
    return orjson.Fragment(orjson.dumps(list(assumptions)))


@functools.lru_cache(maxsize=_REPEATED_TEXTS)
def _sources_json(sources: tuple[PropertySource, ...]) -> orjson.Fragment:
    return orjson.Fragment(orjson.dumps([_source_output(source) for source in sources]))


@functools.lru_cache(maxsize=_REPEATED_TEXTS)
def _uncertainties_json(uncertainties: tuple[ReportedUncertainty, ...]) -> orjson.Fragment:
    items = [_uncertainty_output(item) for item in uncertainties]
    if any(item["relative"] is not None and not math.isfinite(item["relative"]) for item in items):
        raise NonFiniteResultError("non-finite relative uncertainty")
    return orjson.Fragment(orjson.dumps(items))


def envelope(
    *,
    unit_set: UnitSet,
    assumptions: Iterable[str],
    sources: Sequence[PropertySource],
    uncertainties: Iterable[ReportedUncertainty],
    advisories: Iterable[Advisory],
) -> dict[str, Any]:
    """The envelope every calculation response carries.

    ``assumptions``, ``property_sources`` and ``uncertainty`` are pre-rendered JSON
    (``orjson.Fragment``), which the response renderer embeds as they are.
    """
    return {
        "reference_state": REFERENCE_STATE,
        "assumptions": _assumptions_json(tuple(assumptions)),
        "property_sources": _sources_json(tuple(sources)),
        "uncertainty": _uncertainties_json(tuple(uncertainties)),
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
            # Only a stored answer has a calculation id (record_calculation gives it); every
            # answer carries its request id.
            "calculation_id": None,
            "request_id": current_request_id(),
            "time": datetime.now(UTC).isoformat(timespec="milliseconds").replace("+00:00", "Z"),
            "output_units": unit_set.value,
        },
    }
