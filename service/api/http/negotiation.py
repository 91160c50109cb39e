"""Content negotiation: one reading of the ``Accept`` header (RFC 9110 §12.5.1) for every
route that answers in more than one media type.

- Each media range carries a quality ``q`` (default 1; §12.4.2 grammar, three decimals at
  most). ``q=0`` means "not acceptable"; an unreadable ``q`` counts as 0, so a malformed
  range never selects anything.
- A media type takes the quality of the *most specific* range that matches it: an exact
  ``type/subtype`` before ``type/*`` before ``*/*``, whatever the order in the header.
- Among the types a route can answer, the highest quality wins; ties go to the one matched
  by the more specific range, then to the one the client listed first, then to the route's
  own order (its default first). Nothing above 0: :func:`choose_media_type` answers None and
  the route answers 406 (:func:`not_acceptable`).
- No ``Accept`` header (or an empty one) accepts anything: the route's default.
"""

from __future__ import annotations

import functools
import re
from collections.abc import Sequence
from dataclasses import dataclass

from service.api.http.problems import FieldError, ProblemError

__all__ = [
    "CHOSEN_MEDIA_TYPE",
    "JSON_MEDIA_TYPE",
    "MediaRange",
    "choose_media_type",
    "not_acceptable",
    "parse_accept",
]

JSON_MEDIA_TYPE = "application/json"
"""Every negotiated route's default answer."""

CHOSEN_MEDIA_TYPE = "chosen_media_type"
"""Key in the request state (``scope["state"]``) of the media type negotiated for the
request, among every type its route answers in (set by :mod:`semantics`)."""

_QVALUE = re.compile(r"^(?:0(?:\.\d{0,3})?|1(?:\.0{0,3})?)$")
"""RFC 9110 §12.4.2: qvalue = ( "0" [ "." 0*3DIGIT ] ) / ( "1" [ "." 0*3("0") ] )."""


@dataclass(frozen=True, slots=True)
class MediaRange:
    """One entry of an ``Accept`` header."""

    type: str
    subtype: str
    quality: float
    position: int
    """Where the entry stands in the header, from 0."""

    @property
    def specificity(self) -> int:
        """2 for ``type/subtype``, 1 for ``type/*``, 0 for ``*/*``."""
        if self.type == "*":
            return 0
        return 1 if self.subtype == "*" else 2

    def matches(self, media_type: str) -> bool:
        """Whether this range covers ``media_type`` (lower-case ``type/subtype``)."""
        kind, _, subtype = media_type.partition("/")
        if self.type == "*":
            return True
        return self.type == kind and self.subtype in ("*", subtype)


def _quality(parameters: list[str]) -> float:
    for parameter in parameters:
        name, _, value = parameter.partition("=")
        if name.strip().lower() == "q":
            text = value.strip()
            return float(text) if _QVALUE.match(text) else 0.0
    return 1.0


@functools.lru_cache(maxsize=256)
def parse_accept(accept: str) -> tuple[MediaRange, ...]:
    """The media ranges of an ``Accept`` header value, in the header's order.

    Entries that are not ``type/subtype`` are left out; types are lower-cased (media types
    are case-insensitive, RFC 9110 §8.3.1). Parsed headers are cached: clients repeat them.
    """
    ranges: list[MediaRange] = []
    for position, entry in enumerate(accept.split(",")):
        media, *parameters = (part.strip() for part in entry.split(";"))
        kind, slash, subtype = media.lower().partition("/")
        if not slash or not kind or not subtype or (kind == "*" and subtype != "*"):
            continue
        ranges.append(MediaRange(kind, subtype, _quality(parameters), position))
    return tuple(ranges)


def _rank(media_type: str, ranges: tuple[MediaRange, ...]) -> tuple[float, int, int]:
    """(quality, specificity, -position) of the most specific range matching ``media_type``."""
    best: MediaRange | None = None
    for candidate in ranges:
        if candidate.matches(media_type) and (
            best is None
            or candidate.specificity > best.specificity
            or (candidate.specificity == best.specificity and candidate.quality > best.quality)
        ):
            best = candidate
    if best is None:
        return (0.0, 0, 0)
    return (best.quality, best.specificity, -best.position)


def choose_media_type(accept: str | None, available: Sequence[str]) -> str | None:
    """The media type to answer in, of ``available`` (the route's default first).

    None when the client accepts none of them (answer 406). No header: the default.
    Choices are cached per header and media types: clients repeat their headers.
    """
    return _choose(accept, tuple(available))


@functools.lru_cache(maxsize=512)
def _choose(accept: str | None, available: tuple[str, ...]) -> str | None:
    if not available:
        return None
    if accept is None or not accept.strip():
        return available[0]
    ranges = parse_accept(accept)
    if not ranges:
        return available[0]  # nothing readable: as if there were no header
    best: tuple[float, int, int] = (0.0, 0, 0)
    chosen: str | None = None
    for media_type in available:
        rank = _rank(media_type, ranges)
        if rank[0] > 0 and (chosen is None or rank > best):
            best, chosen = rank, media_type
    return chosen


def not_acceptable(accept: str | None, available: Sequence[str]) -> ProblemError:
    """The 406 problem (RFC 9110 §15.5.7) naming the media types the route can answer."""
    listed = ", ".join(available)
    return ProblemError(
        406,
        "not-acceptable",
        "No acceptable media type",
        f"This route answers in {listed}; the Accept header accepts none of them.",
        [
            FieldError(
                field="Accept",
                message=f"accepts none of: {listed}",
                value=accept,
            )
        ],
    )
