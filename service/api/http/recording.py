"""Calculation records from the HTTP side: store each answer, or say that it was not stored.

Routers call :func:`record_calculation` with the answer they built (it must carry
``meta.calculation_id``, as :func:`service.api.http.envelope.envelope` makes it). The record
holds the inputs as sent, the answer, the service and formulation versions, the time and
the API key id. When the store fails, ``TRIPOINT_STORE_FAILURE_POLICY`` decides: ``warn``
adds a ``record-not-stored`` warning to the answer, ``fail`` answers 503. An answer is
never returned without saying that its record is missing.
"""

from __future__ import annotations

import asyncio
import logging
import uuid
from collections.abc import Mapping
from datetime import UTC, datetime, timedelta
from typing import Any, Literal

import anyio.to_thread
import orjson
from fastapi import Request
from pydantic import BaseModel

from service import __version__
from service.api.http.members import MISSING, member_at
from service.api.http.observability import Metrics
from service.api.http.problems import FieldError, ProblemError
from service.api.http.record_labels import labels_of
from service.api.http.responses import NonFiniteResultError, check_finite
from service.core.statements import source_by_id
from service.records import CalculationRecord, RecordStore, StoreUnavailableError

__all__ = [
    "HEADLINE_VALUES",
    "NOT_STORED_WARNING",
    "RecordKeeper",
    "headline",
    "record_calculation",
]

NOT_STORED_WARNING = "record-not-stored"
"""Warning code an answer carries when its calculation record could not be stored."""

HEADLINE_VALUES = 20
"""A headline quantity of a batch or sweep is kept up to this many values; a longer one
is left out of the headline (the record still holds it)."""

_RETENTION_INTERVAL_SECONDS = 3600.0
_log = logging.getLogger("tripoint.records")


def _plain_json(value: Any) -> Any:
    """Numpy arrays and tuples to plain lists: what a JSON column can hold."""
    return orjson.loads(
        orjson.dumps(value, option=orjson.OPT_SERIALIZE_NUMPY | orjson.OPT_NON_STR_KEYS)
    )


def _headline_entry(node: Any) -> tuple[bool, Any]:
    """(kept, value) of one headline candidate: a quantity, a short text, a flag, a count."""
    if isinstance(node, dict) and "unit" in node and ("value" in node or "values" in node):
        values = node.get("values")
        if values is not None:
            values = _plain_json(values)  # a batch may still be a numpy array here
        if isinstance(values, list):
            return len(values) <= HEADLINE_VALUES, {"values": values, "unit": node["unit"]}
        return True, {"value": node.get("value"), "unit": node["unit"]}
    if node is None or isinstance(node, str | bool | int | float):
        return True, node
    return False, None


def headline(answer: Mapping[str, Any], paths: Mapping[str, str]) -> dict[str, Any]:
    """The headline of an answer: for each name, the member at its dotted path.

    Quantities keep ``value``/``values`` and ``unit`` (their uncertainty stays in the
    record); texts, flags and numbers are kept as they are. A path the answer lacks, a
    member of another shape, or a batch longer than :data:`HEADLINE_VALUES` is left out.
    """
    picked: dict[str, Any] = {}
    for name, path in paths.items():
        node = member_at(answer, path.split("."))
        if node is MISSING:
            continue
        kept, value = _headline_entry(node)
        if kept:
            picked[name] = value
    return picked


def _created_at(meta: Mapping[str, Any]) -> datetime:
    stamp = meta.get("time")
    if isinstance(stamp, str):
        try:
            moment = datetime.fromisoformat(stamp)
        except ValueError:
            moment = None
        if moment is not None and moment.tzinfo is not None:
            return moment
    return datetime.now(UTC)


class RecordKeeper:
    """The records store as the HTTP layer uses it: policy, retention, metrics."""

    def __init__(
        self,
        store: RecordStore,
        *,
        policy: Literal["warn", "fail"],
        retention_days: int,
        metrics: Metrics,
    ) -> None:
        self.store = store
        self.policy = policy
        self.retention_days = retention_days
        self.metrics = metrics

    def record(
        self,
        *,
        kind: str,
        inputs: Mapping[str, Any],
        result: dict[str, Any],
        key_id: str | None,
        label: str | None = None,
        tags: tuple[str, ...] = (),
        headline: Mapping[str, Any] | None = None,
    ) -> None:
        """Store one answer; on failure warn in ``result`` or raise a 503, per the policy."""
        meta = result.get("meta")
        if not isinstance(meta, dict) or not meta.get("calculation_id"):
            raise ValueError("a recorded answer must carry meta.calculation_id")
        calculation_id = str(meta["calculation_id"])
        stored = _plain_json(result)
        sources = stored.get("property_sources") or []
        record = CalculationRecord(
            calculation_id=calculation_id,
            kind=kind,
            created_at=_created_at(meta),
            inputs=_plain_json(dict(inputs)),
            result=stored,
            service_version=str(meta.get("service_version") or __version__),
            formulations=[
                {"formulation": _formulation(source), "release": source.get("release")}
                for source in sources
                if isinstance(source, dict)
            ],
            key_id=key_id,
            label=label,
            tags=tags,
            headline=None if headline is None else _plain_json(dict(headline)),
        )
        try:
            self.store.add(record)
        except StoreUnavailableError as error:
            self.metrics.count_calculation(kind, stored=False)
            _log.error(
                "calculation record not stored",
                extra={
                    "fields": {"calculation_id": calculation_id, "kind": kind, "reason": str(error)}
                },
            )
            if self.policy == "fail":
                raise ProblemError(
                    503,
                    NOT_STORED_WARNING,
                    "Calculation record not stored",
                    f"The calculation {calculation_id} succeeded but its record could not be "
                    "stored, so no result is returned (setting TRIPOINT_STORE_FAILURE_POLICY="
                    "fail). Retry later.",
                    headers={"Retry-After": "5"},
                ) from None
            result.setdefault("warnings", []).append(
                {
                    "code": NOT_STORED_WARNING,
                    "message": (
                        f"This result was NOT stored: calculation {calculation_id} cannot be "
                        "fetched from /v1/calculations later because the record store failed."
                    ),
                    "indices": None,
                }
            )
            return
        self.metrics.count_calculation(kind, stored=True)

    def prune_expired(self) -> int:
        """Delete records older than the retention period; 0 when records are kept forever."""
        if self.retention_days == 0:
            return 0
        cutoff = datetime.now(UTC) - timedelta(days=self.retention_days)
        removed = self.store.prune(cutoff)
        if removed:
            _log.info(
                "expired calculation records removed",
                extra={"fields": {"removed": removed, "retention_days": self.retention_days}},
            )
        return removed

    async def prune_logged(self) -> None:
        """Prune once in a worker thread; a failure is logged, never raised."""
        try:
            await anyio.to_thread.run_sync(self.prune_expired)
        except StoreUnavailableError as error:
            _log.warning("retention pruning failed", extra={"fields": {"reason": str(error)}})
        except Exception:
            # A defect here must not end the pruning loop unseen: log it, try again later.
            _log.exception("retention pruning failed unexpectedly")

    async def keep_pruning(self) -> None:
        """Prune every hour until cancelled (the startup prune is done before serving)."""
        while True:
            await asyncio.sleep(_RETENTION_INTERVAL_SECONDS)
            await self.prune_logged()


def record_calculation(
    request: Request,
    kind: str,
    inputs: BaseModel | Mapping[str, Any],
    result: dict[str, Any],
    headline: Mapping[str, Any] | None = None,
) -> dict[str, Any]:
    """Store the calculation record of one answer and return the answer.

    Call it from a synchronous (``def``) route, after building the answer and before
    returning it: it writes to the database and would block an event loop.

    Parameters
    ----------
    request
        The request being answered (gives the store and the API key id).
    kind
        What was calculated, stable and dotted, e.g. ``"balances.vacuum_cooling"``; the
        listing filters on it and the metrics count by it.
    inputs
        The request body: a pydantic model (the fields the client set are stored) or a
        plain mapping.
    result
        The answer, with ``meta.calculation_id`` and ``property_sources``.
    headline
        A few key numbers of the answer (``{"value", "unit"}`` quantities or short
        texts), shown by the listing without reading the whole result; each resource's
        ``answers.py`` picks them for its kind.

    The record also keeps the request's ``label`` and ``tags``
    (:class:`service.api.http.record_labels.RecordLabels`).

    Returns
    -------
    dict
        ``result`` itself; with a ``record-not-stored`` warning added when the store
        failed and the policy is ``warn``.

    Raises
    ------
    ProblemError
        503 when the store failed and the policy is ``fail``.
    """
    keeper: RecordKeeper = request.app.state.records
    if isinstance(inputs, BaseModel):
        sent = inputs.model_dump(mode="json", exclude_unset=True, by_alias=True)
    else:
        sent = dict(inputs)
    try:
        check_finite(result)  # a record is written only for an answer that can be sent
    except NonFiniteResultError:
        raise non_finite_problem(sent) from None
    meta = result.get("meta")
    if isinstance(meta, dict) and not meta.get("calculation_id"):
        meta["calculation_id"] = str(uuid.uuid4())  # the id of the record stored now
    key_id = getattr(request.state, "api_key_id", None)
    label, tags = labels_of(inputs)
    keeper.record(
        kind=kind,
        inputs=sent,
        result=result,
        key_id=key_id,
        label=label,
        tags=tags,
        headline=headline,
    )
    return result


def _formulation(source: Mapping[str, Any]) -> Any:
    """A cited source's formulation name: given with ``detail=full``, else by its id."""
    if source.get("formulation"):
        return source["formulation"]
    known = source_by_id(str(source.get("id", "")))
    return None if known is None else known.formulation


_EXTREME = (1.0e-12, 1.0e12)
"""Magnitudes of an input number outside which it is named as the likely cause of a
result that is not finite."""


def _extreme_inputs(node: Any, path: str = "") -> list[tuple[str, object]]:
    """Dotted paths and values of input numbers far from ordinary magnitudes."""
    found: list[tuple[str, object]] = []
    if isinstance(node, dict):
        if "value" in node or "values" in node:
            numbers = node.get("values", [node.get("value")])
            numbers = numbers if isinstance(numbers, list) else [numbers]
            if any(_is_extreme(item) for item in numbers):
                found.append((path, node.get("value", node.get("values"))))
            return found
        for key, child in node.items():
            found += _extreme_inputs(child, f"{path}.{key}" if path else str(key))
    elif isinstance(node, list):
        if any(_is_extreme(item) for item in node):
            found.append((path, None))
        for position, child in enumerate(node):
            if isinstance(child, dict):
                found += _extreme_inputs(child, f"{path}[{position}]")
    elif _is_extreme(node) or (isinstance(node, str) and _text_is_extreme(node)):
        found.append((path, node))
    return found


def _is_extreme(value: object) -> bool:
    if isinstance(value, bool) or not isinstance(value, int | float):
        return False
    magnitude = abs(float(value))
    return magnitude != 0.0 and not _EXTREME[0] <= magnitude <= _EXTREME[1]


def _text_is_extreme(text: str) -> bool:
    number = text.strip().split(" ", 1)[0]
    try:
        return _is_extreme(float(number))
    except ValueError:
        return False


def non_finite_problem(sent: Mapping[str, Any]) -> ProblemError:
    """The 422 for inputs that drive a calculation to a number that is not finite."""
    suspects = _extreme_inputs(dict(sent))
    named = ", ".join(path for path, _ in suspects) or "body"
    return ProblemError(
        422,
        "result-not-finite",
        "Inputs outside what the calculation can hold",
        "The inputs drive the calculation to a number that is not finite (an overflow or "
        f"a division by almost nothing); the likely cause: {named}. Nothing was stored.",
        [
            FieldError(
                field=path,
                message="magnitude far outside ordinary values (1e-12 to 1e12 in the unit sent)",
                value=value if isinstance(value, int | float | str) else None,
            )
            for path, value in suspects
        ]
        or [FieldError(field="body", message="no single input stands out")],
    )
