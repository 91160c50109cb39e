"""Cross-field rules of a request body stated in its JSON schema.

Several requests take one of two (or three) alternative inputs, or need one field once
another is given; the request readers refuse the rest (``require_exactly_one`` and the
checks beside it). These helpers state the same rules in the model's schema so that
validators and request generators know them, as one ``not: {anyOf: [...]}``: the object
must match none of the refused shapes. A field counts as given when it is present and not
``null``, as the readers count it.

A ``not`` is used rather than ``oneOf`` because client generators read ``oneOf`` at the
level of an object as a union of object types, losing the model's properties; they ignore
``not``, which validators and schemathesis honour.
"""

from __future__ import annotations

from typing import Any

__all__ = ["exactly_one_of", "refused_shapes", "requires"]

_NULL: dict[str, Any] = {"type": "null"}
_GIVEN: dict[str, Any] = {"not": _NULL}


def _given(*names: str) -> dict[str, Any]:
    return {"required": list(names), "properties": {name: _GIVEN for name in names}}


def exactly_one_of(*names: str) -> list[dict[str, Any]]:
    """The refused shapes of "give exactly one of ``names``": none given, or two given."""
    none_given = {"properties": {name: _NULL for name in names}}
    pairs = [_given(first, second) for i, first in enumerate(names) for second in names[i + 1 :]]
    return [none_given, *pairs]


def requires(
    given: str, needed: str, *, when: dict[str, Any] | None = None
) -> list[dict[str, Any]]:
    """The refused shape of "``given`` needs ``needed``" (``needed`` absent or null).

    ``when`` adds conditions on other properties (``{"container": {"const": "vial"}}``);
    with ``given`` empty only those conditions select the shape.
    """
    shape: dict[str, Any] = _given(given) if given else {"properties": {}}
    shape["properties"] = {**shape["properties"], **(when or {}), needed: _NULL}
    return [shape]


def refused_shapes(*groups: list[dict[str, Any]]) -> dict[str, Any]:
    """``json_schema_extra`` refusing every shape in ``groups``."""
    shapes = [shape for group in groups for shape in group]
    return {"not": {"anyOf": shapes}}
