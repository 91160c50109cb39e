"""JSON responses serialized with orjson, numpy arrays included, never NaN."""

from __future__ import annotations

import math
from typing import Any

import numpy as np
import orjson
from starlette.responses import JSONResponse

__all__ = ["FastJSONResponse", "NonFiniteResultError", "check_finite"]

_OPTIONS = orjson.OPT_SERIALIZE_NUMPY | orjson.OPT_NON_STR_KEYS


class NonFiniteResultError(RuntimeError):
    """A result contained NaN or infinity: a defect, never sent to a client as a number."""


_SHORT_LIST = 32
"""Lists up to this length are walked item by item; longer ones are checked as arrays."""


def _refuse() -> None:
    raise NonFiniteResultError("non-finite number in a response")


def check_finite(content: Any) -> None:
    """Raise :class:`NonFiniteResultError` if ``content`` holds NaN or infinity anywhere.

    The walk tests exact types first (the common case of an answer built from dicts,
    lists, strings and floats), then falls back to ``isinstance`` for subclasses. A dict's
    own numbers and texts are tested where they stand, without a trip through the stack
    (most of an answer is ``{"value": x, "unit": "..."}``), and a float ``x`` is finite
    exactly when ``x - x == 0.0`` (NaN and infinity give NaN), with no call.
    """
    stack = [content]
    push = stack.append
    while stack:
        item = stack.pop()
        kind = type(item)
        if kind is dict:
            for value in item.values():
                value_kind = type(value)
                if value_kind is float:
                    if value - value != 0.0:
                        _refuse()
                elif not (value_kind is str or value is None or value_kind is int):
                    push(value)
            continue
        if kind is str or kind is int or kind is bool or item is None:
            continue
        if kind is float:
            if not math.isfinite(item):
                _refuse()
        elif kind is list or kind is tuple:
            _check_sequence(item, stack)
        elif kind is orjson.Fragment:
            continue  # JSON rendered already (the envelope's texts), embedded as it is
        elif isinstance(item, np.ndarray):
            if item.dtype.kind in "fc" and not np.isfinite(item).all():
                _refuse()
        elif isinstance(item, float | np.floating):
            if not math.isfinite(item):
                _refuse()
        elif isinstance(item, dict):
            stack.extend(item.values())
        elif isinstance(item, list | tuple):
            _check_sequence(item, stack)


def _check_sequence(items: list[Any] | tuple[Any, ...], stack: list[Any]) -> None:
    if len(items) > _SHORT_LIST and isinstance(items[0], float | None):
        numbers = [number for number in items if isinstance(number, float)]
        if len(numbers) + items.count(None) == len(items):
            if not np.isfinite(np.array(numbers, dtype=np.float64)).all():
                _refuse()
            return
    stack.extend(items)


class FastJSONResponse(JSONResponse):
    """``application/json`` rendered by orjson; refuses NaN and infinity.

    Subclassing :class:`JSONResponse` lets FastAPI document the route's
    ``response_model`` as the 200 schema while the route returns this directly.
    """

    media_type = "application/json"

    def render(self, content: Any) -> bytes:
        check_finite(content)
        return orjson.dumps(content, option=_OPTIONS)
