"""JSON responses serialized with orjson, numpy arrays included, never NaN."""

from __future__ import annotations

from typing import Any

import numpy as np
import orjson
from starlette.responses import JSONResponse

__all__ = ["FastJSONResponse", "NonFiniteResultError"]

_OPTIONS = orjson.OPT_SERIALIZE_NUMPY | orjson.OPT_NON_STR_KEYS


class NonFiniteResultError(RuntimeError):
    """A result contained NaN or infinity: a defect, never sent to a client as a number."""


def _check_finite(content: Any) -> None:
    stack = [content]
    while stack:
        item = stack.pop()
        if isinstance(item, dict):
            stack.extend(item.values())
        elif isinstance(item, list | tuple):
            if item and isinstance(item[0], float | None):
                numbers = np.fromiter(
                    (number for number in item if number is not None), dtype=np.float64
                )
                if not np.isfinite(numbers).all():
                    raise NonFiniteResultError("non-finite number in a response")
            else:
                stack.extend(item)
        elif isinstance(item, np.ndarray):
            if item.dtype.kind == "f" and not np.isfinite(item).all():
                raise NonFiniteResultError("non-finite number in a response")
        elif isinstance(item, float) and not np.isfinite(item):
            raise NonFiniteResultError("non-finite number in a response")


class FastJSONResponse(JSONResponse):
    """``application/json`` rendered by orjson; refuses NaN and infinity.

    Subclassing :class:`JSONResponse` lets FastAPI document the route's
    ``response_model`` as the 200 schema while the route returns this directly.
    """

    media_type = "application/json"

    def render(self, content: Any) -> bytes:
        _check_finite(content)
        return orjson.dumps(content, option=_OPTIONS)
