"""Call-level input checks shared by the core's public functions."""

from __future__ import annotations

import numpy as np
from numpy.typing import ArrayLike, NDArray

from service.core.errors import InvalidInputError, OutOfRangeError
from service.core.properties.phase import FloatArray

BoolArray = NDArray[np.bool_]

__all__ = [
    "BOUND_TOLERANCE",
    "BoolArray",
    "beyond_maximum",
    "beyond_minimum",
    "broadcast_pair",
    "finite_array",
    "require_within",
]


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


BOUND_TOLERANCE = 1.0e-12
"""Relative slack at a closed bound: a value that equals a documented bound in the unit
the caller used (-30 degC, -22 degF) lands within a few rounding steps of the bound in SI
(-30 degC is 243.14999999999998 K) and is accepted as on it."""


def beyond_minimum(
    value: FloatArray | float, minimum: FloatArray | float, exclusive: bool
) -> BoolArray:
    """Where ``value`` lies below ``minimum`` (at or below it when ``exclusive``), with
    :data:`BOUND_TOLERANCE` slack at a closed bound."""
    if exclusive:
        return np.asarray(value <= minimum)
    return np.asarray(value < minimum - BOUND_TOLERANCE * np.abs(minimum))


def beyond_maximum(value: FloatArray | float, maximum: FloatArray | float) -> BoolArray:
    """Where ``value`` lies above ``maximum``, with :data:`BOUND_TOLERANCE` slack."""
    return np.asarray(value > maximum + BOUND_TOLERANCE * np.abs(maximum))


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
    """Raise :class:`OutOfRangeError` naming the first element outside ``[minimum, maximum]``.

    A value within :data:`BOUND_TOLERANCE` (relative) of a closed bound is on it: it is
    accepted, and the formulations behind these ranges are smooth there.
    """
    outside = beyond_minimum(array, minimum, exclusive_minimum) | beyond_maximum(array, maximum)
    outside = outside.ravel()
    if np.any(outside):
        index = int(np.flatnonzero(outside)[0])
        raise OutOfRangeError(
            variable=variable,
            value=float(array.ravel()[index]),
            minimum=minimum,
            maximum=maximum,
            unit=unit,
            reason=reason,
            index=index if array.size > 1 else None,
            exclusive_minimum=exclusive_minimum,
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
