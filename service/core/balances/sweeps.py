"""Array sweeps: a case whose numeric fields are arrays becomes many scalar cases.

Every numeric field of a case dataclass (including those of nested dataclasses,
such as a companion's mass or a solute's mass fraction) may be an array. All of
them are broadcast to one shape; the balance is solved for each element and the
results are stacked back into arrays of that shape, in the same order.
"""

from __future__ import annotations

import dataclasses
from typing import Any, TypeVar

import numpy as np

from service.core.errors import InvalidInputError

__all__ = ["expand_case", "field_value", "replace_field"]

CaseT = TypeVar("CaseT")


def _numeric_leaves(value: Any, path: str, leaves: dict[str, Any]) -> None:
    if dataclasses.is_dataclass(value) and not isinstance(value, type):
        for field in dataclasses.fields(value):
            _numeric_leaves(getattr(value, field.name), f"{path}.{field.name}".lstrip("."), leaves)
    elif isinstance(value, tuple):
        for position, item in enumerate(value):
            _numeric_leaves(item, f"{path}[{position}]", leaves)
    elif isinstance(value, (bool, str)) or value is None:
        return
    elif isinstance(value, (int, float, np.ndarray, np.generic, list)):
        leaves[path] = value


def _rebuild(value: Any, path: str, scalars: dict[str, float]) -> Any:
    if dataclasses.is_dataclass(value) and not isinstance(value, type):
        changes = {
            field.name: _rebuild(
                getattr(value, field.name), f"{path}.{field.name}".lstrip("."), scalars
            )
            for field in dataclasses.fields(value)
        }
        return dataclasses.replace(value, **changes)
    if isinstance(value, tuple):
        return tuple(_rebuild(item, f"{path}[{i}]", scalars) for i, item in enumerate(value))
    if path in scalars:
        return scalars[path]
    return value


def expand_case(
    case: CaseT, integer_fields: frozenset[str] = frozenset()
) -> tuple[tuple[int, ...], list[CaseT]]:
    """Broadcast a case's numeric fields; return the sweep shape and the scalar cases.

    Parameters
    ----------
    case : dataclass instance
        The case; numeric fields may be scalars or arrays.
    integer_fields : frozenset of str
        Field paths that are settings, not swept (e.g. ``"trajectory_points"``).

    Raises
    ------
    InvalidInputError
        If the fields' shapes do not broadcast, or a field is not numeric.
    """
    leaves: dict[str, Any] = {}
    _numeric_leaves(case, "", leaves)
    arrays: dict[str, np.ndarray] = {}
    for path, value in leaves.items():
        if path in integer_fields:
            continue
        try:
            arrays[path] = np.asarray(value, dtype=np.float64)
        except (TypeError, ValueError) as error:
            raise InvalidInputError(
                path, "must be a number or an array of numbers", value
            ) from error
    try:
        shape = np.broadcast_shapes(*(a.shape for a in arrays.values())) if arrays else ()
    except ValueError as error:
        shapes = {path: a.shape for path, a in arrays.items()}
        raise InvalidInputError("case", f"array fields do not broadcast: {shapes}") from error
    broadcast = {path: np.broadcast_to(a, shape).ravel() for path, a in arrays.items()}
    count = int(np.prod(shape)) if shape else 1
    cases = [
        _rebuild(case, "", {path: float(a[i]) for path, a in broadcast.items()})
        for i in range(count)
    ]
    return tuple(int(n) for n in shape), cases


def replace_field(case: CaseT, path: str, value: Any) -> CaseT:
    """A copy of ``case`` with the field at ``path`` (e.g. ``"companions[0].mass"``) replaced."""
    leaves: dict[str, Any] = {}
    _numeric_leaves(case, "", leaves)
    if path not in leaves:
        raise InvalidInputError(path, "is not a numeric field of the case")
    rebuilt: CaseT = _rebuild(case, "", {path: value})
    return rebuilt


def field_value(case: Any, path: str) -> np.ndarray:
    """The numeric field at ``path`` as a float array."""
    leaves: dict[str, Any] = {}
    _numeric_leaves(case, "", leaves)
    if path not in leaves:
        raise InvalidInputError(path, "is not a numeric field of the case")
    return np.asarray(leaves[path], dtype=np.float64)
