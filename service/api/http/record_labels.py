"""The client's own names for a stored calculation: an optional label and tags.

Every request whose answer is recorded (balances, simulations, design spaces, calibrations,
sizing) extends :class:`RecordLabels`. The record keeps them, a listing shows them and
filters on them (``GET /v1/calculations?label=...&tag=...``). They change nothing in the
calculation.
"""

from __future__ import annotations

from typing import Annotated, Any, Final

from pydantic import BaseModel, Field, StringConstraints, field_validator

from service.api.http.models import ApiModel
from service.records.tables import LABEL_LENGTH, TAG_LENGTH

__all__ = [
    "LABEL_PATTERN",
    "MAX_TAGS",
    "TAG_PATTERN",
    "Label",
    "RecordLabels",
    "Tag",
    "labels_of",
]

MAX_TAGS: Final = 10
"""Most tags one request may carry."""

LABEL_PATTERN: Final = r"^[^\x00-\x1f\x7f]+$"
"""Any text without control characters (no line breaks or tabs)."""

TAG_PATTERN: Final = r"^[A-Za-z0-9][A-Za-z0-9._:-]*$"
"""ASCII letters, digits and ``. _ : -``, starting with a letter or digit: safe in a
query string, a file name and a LIMS field alike."""

Label = Annotated[
    str, StringConstraints(min_length=1, max_length=LABEL_LENGTH, pattern=LABEL_PATTERN)
]
Tag = Annotated[str, StringConstraints(min_length=1, max_length=TAG_LENGTH, pattern=TAG_PATTERN)]


class RecordLabels(ApiModel):
    """Optional names the stored record of this calculation carries."""

    label: Label | None = Field(
        None,
        description=f"Your own name for the stored record of this calculation (1 to "
        f"{LABEL_LENGTH} characters, no control characters), e.g. a batch or run number. "
        "Shown in `GET /v1/calculations` and filtered on exactly by its `label=`; changes "
        "nothing in the calculation.",
    )
    tags: list[Tag] = Field(
        default_factory=list,
        max_length=MAX_TAGS,
        json_schema_extra={"uniqueItems": True},
        description=f"Up to {MAX_TAGS} distinct tags of the stored record, each 1 to "
        f"{TAG_LENGTH} characters of ASCII letters, digits and `. _ : -`, starting with a "
        "letter or digit; case counts. `GET /v1/calculations?tag=a&tag=b` lists the records "
        "carrying every tag given. Changes nothing in the calculation.",
    )

    @field_validator("tags")
    @classmethod
    def _distinct(cls, tags: list[str]) -> list[str]:
        repeated = sorted({tag for tag in tags if tags.count(tag) > 1})
        if repeated:
            raise ValueError(f"tags must be distinct; repeated: {', '.join(repeated)}")
        return tags


def labels_of(body: BaseModel | Any) -> tuple[str | None, tuple[str, ...]]:
    """The label and tags a request gives its record.

    A request that nests a whole simulation request as ``case`` (sizing, calibration) may
    name the record at the top level or in the case: the top-level label wins, and the
    tags of both are kept (top level first, without repeats).
    """
    label: str | None = None
    tags: list[str] = []
    for part in (body, getattr(body, "case", None)):
        if isinstance(part, RecordLabels):
            label = label if label is not None else part.label
            tags += [tag for tag in part.tags if tag not in tags]
    return label, tuple(tags)
