"""Call-level checks of scalar case fields, shared by the balances and the simulation.

:mod:`service.core.validation` checks whole arrays and names the offending element by
its position in that array, with closed bounds on both sides. Here one scalar case is
checked at a time (one element of a balance sweep, or a simulation input): the error
names the sweep element (``index``) rather than an array position, and bounds may be
open-ended (``None``, reported as such in :class:`OutOfRangeError`).
"""

from __future__ import annotations

import math

import numpy as np
from numpy.typing import ArrayLike

from service.core.errors import InvalidInputError, OutOfRangeError
from service.core.properties.constants import TRIPLE_POINT_TEMPERATURE
from service.core.validation import beyond_maximum, beyond_minimum

__all__ = [
    "checked_trap_temperature",
    "finite_scalar",
    "optional_finite_scalar",
    "require_scalar_within",
]


def finite_scalar(value: ArrayLike, name: str) -> float:
    """``value`` as a float; :class:`InvalidInputError` naming ``name`` if NaN or infinite."""
    number = float(np.asarray(value))
    if not math.isfinite(number):
        raise InvalidInputError(name, f"must be finite, got {number!r}", number)
    return number


def optional_finite_scalar(value: ArrayLike | None, name: str) -> float | None:
    """:func:`finite_scalar`, passing ``None`` (a field left out) through."""
    return None if value is None else finite_scalar(value, name)


def require_scalar_within(
    value: ArrayLike,
    name: str,
    minimum: float | None,
    maximum: float | None,
    unit: str,
    reason: str,
    index: int | None = None,
    *,
    exclusive_minimum: bool = False,
) -> float:
    """Check a finite scalar against ``[minimum, maximum]`` (``None``: open end); return it.

    Raises
    ------
    InvalidInputError
        NaN or infinite ``value``.
    OutOfRangeError
        ``value`` below ``minimum`` (at or below it with ``exclusive_minimum``) or above
        ``maximum``; ``index`` names the sweep element (``None`` for a single case).
        A value within :data:`service.core.validation.BOUND_TOLERANCE` of a closed bound
        is on it, and the bound is returned.
    """
    number = finite_scalar(value, name)
    low = minimum is not None and bool(beyond_minimum(number, minimum, exclusive_minimum))
    if low or (maximum is not None and bool(beyond_maximum(number, maximum))):
        raise OutOfRangeError(
            name, number, minimum, maximum, unit, reason, index, exclusive_minimum
        )
    # On a bound within rounding (see BOUND_TOLERANCE): the bound itself.
    if minimum is not None and number < minimum:
        return minimum
    if maximum is not None and number > maximum:
        return maximum
    return number


def checked_trap_temperature(
    value: ArrayLike | None, minimum: float, index: int | None = None
) -> float | None:
    """A balance's optional cold-trap temperature, K: from ``minimum`` to the triple point,
    where the trap collects the vapor as ice; ``None`` when left out."""
    trap = optional_finite_scalar(value, "trap_temperature")
    if trap is None:
        return None
    return require_scalar_within(
        trap,
        "trap_temperature",
        minimum,
        TRIPLE_POINT_TEMPERATURE,
        "K",
        "the trap collects the vapor as ice",
        index,
    )
