"""The units a request's fields were sent in, so that range errors answer in them.

The core checks ranges in SI and raises :class:`service.core.errors.OutOfRangeError` in
SI; the caller may have written ``"-35 degC"`` or ``"150 mTorr"``. While a request runs,
:func:`service.api.http.quantities.read_quantity` notes each field's unit here
(:func:`note_unit`), and the problem handler states the refused value and the valid range
in that unit, SI beside it (:func:`sent_unit`).

The notes live in a dictionary held by a context variable that :func:`begin_request`
sets on the event loop before the route runs: the worker thread of a synchronous route
and the time-limit task see a copy of the context holding the same dictionary, so what
they note is seen by the exception handler, which runs in the route's own context.
"""

from __future__ import annotations

from contextvars import ContextVar
from dataclasses import dataclass

from service.api.http.units import Dimension

__all__ = ["SentUnit", "begin_request", "note_unit", "sent_unit"]


@dataclass(frozen=True)
class SentUnit:
    """How one field was sent: its unit text (None: the field's default SI unit)."""

    unit: str | None
    dimension: Dimension


_NOTES: ContextVar[dict[str, SentUnit] | None] = ContextVar("tripoint_sent_units", default=None)
_MOST_NOTES = 256
"""A request with more quantity fields than this keeps the first ones only."""


def begin_request() -> None:
    """Start an empty set of notes for the request running in this context."""
    _NOTES.set({})


def note_unit(field: str, unit: str | None, dimension: Dimension) -> None:
    """Remember that ``field`` was sent in ``unit`` (outside a request: nothing)."""
    notes = _NOTES.get()
    if notes is not None and len(notes) < _MOST_NOTES:
        notes[field] = SentUnit(unit, dimension)


def sent_unit(field: str) -> SentUnit | None:
    """The unit ``field`` was sent in during this request, if it was noted."""
    notes = _NOTES.get()
    return None if notes is None else notes.get(field)
