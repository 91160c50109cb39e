"""Content negotiation: read an ``Accept`` header once, for every alternative format."""

from __future__ import annotations

__all__ = ["JSON_ALTERNATIVES", "accept_qualities", "json_quality"]

JSON_ALTERNATIVES = ("application/json", "application/*", "*/*")
"""Media ranges under which JSON (the default answer) is acceptable."""


def accept_qualities(accept: str | None) -> dict[str, float]:
    """Map each media range named in ``accept`` to its highest quality (``q``, default 1).

    An unreadable ``q`` counts as 0 (not acceptable). Media ranges are lower-cased.
    """
    qualities: dict[str, float] = {}
    if not accept:
        return qualities
    for entry in accept.split(","):
        media, *parameters = (part.strip() for part in entry.split(";"))
        quality = 1.0
        for parameter in parameters:
            name, _, value = parameter.partition("=")
            if name.strip() == "q":
                try:
                    quality = float(value)
                except ValueError:
                    quality = 0.0
        media = media.lower()
        qualities[media] = max(qualities.get(media, 0.0), quality)
    return qualities


def json_quality(qualities: dict[str, float]) -> float:
    """The quality at which the client accepts the default JSON answer."""
    return max((qualities.get(media, 0.0) for media in JSON_ALTERNATIVES), default=0.0)
