"""Reading a member of a nested answer by its path of keys, telling absent from null."""

from __future__ import annotations

from collections.abc import Iterable, Mapping
from typing import Any, Final

__all__ = ["MISSING", "member_at"]


class _Missing:
    """The type of :data:`MISSING`."""

    def __repr__(self) -> str:
        return "MISSING"


MISSING: Final[Any] = _Missing()
"""What :func:`member_at` returns where the path leads nowhere (a member that is null is
``None``, not this)."""


def member_at(node: Any, path: Iterable[str]) -> Any:
    """The member of ``node`` at ``path`` (keys into nested mappings, outermost first), or
    :data:`MISSING` where a key is absent or a step meets something other than a mapping."""
    for part in path:
        if not isinstance(node, Mapping) or part not in node:
            return MISSING
        node = node[part]
    return node
