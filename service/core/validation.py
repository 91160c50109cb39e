"""Call-level input checks shared by the core's public functions."""

from __future__ import annotations

import numpy as np
from numpy.typing import ArrayLike

from service.core.errors import InvalidInputError, OutOfRangeError
from service.core.properties.phase import FloatArray

__all__ = ["broadcast_pair", "finite_array", "require_within"]


def finite_array(value: ArrayLike, variable: str) -> FloatArray:
    """Convert ``value`` to a float64 array; reject NaN, infinity and non-numbers.

    Raises
    ------
    InvalidInputError
        Naming ``variable`` and the first offending element.
    """
    try:
        array = np.asarray(value, dtype=np.float64)
    except (TypeError, ValueError) as error:
        raise InvalidInputError(
            variable, "must be a number or an array of numbers", value
        ) from error
    finite = np.isfinite(array)
    if not np.all(finite):
        index = int(np.flatnonzero(~finite.ravel())[0])
        bad = float(array.ravel()[index])
        raise InvalidInputError(variable, f"must be finite; element {index} is {bad!r}", bad)
    return array


def require_within(
    array: FloatArray,
    variable: str,
    minimum: float,
    maximum: float,
    unit: str,
    reason: str,
    *,
    exclusive_minimum: bool = False,
) -> None:
    """Raise :class:`OutOfRangeError` naming the first element outside ``[minimum, maximum]``."""
    below = array <= minimum if exclusive_minimum else array < minimum
    outside = (below | (array > maximum)).ravel()
    if np.any(outside):
        index = int(np.flatnonzero(outside)[0])
        raise OutOfRangeError(
            variable=variable,
            value=float(array.ravel()[index]),
            minimum=minimum,
            maximum=maximum,
            unit=unit,
            reason=reason,
            index=index if array.ndim > 0 else None,
        )


def broadcast_pair(
    first: FloatArray, second: FloatArray, second_name: str
) -> tuple[FloatArray, FloatArray]:
    """Broadcast two inputs to one shape (copies, writeable)."""
    try:
        a, b = np.broadcast_arrays(first, second)
    except ValueError as error:
        raise InvalidInputError(
            second_name,
            f"shape {np.shape(second)} does not broadcast with shape {np.shape(first)}",
        ) from error
    return np.array(a, dtype=np.float64), np.array(b, dtype=np.float64)
