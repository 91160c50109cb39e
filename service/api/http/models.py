"""Shared base model, quantity shapes and the response envelope."""

from __future__ import annotations

from typing import Annotated

from pydantic import BaseModel, ConfigDict, Field, Strict, WithJsonSchema

from service.api.http.units import MAX_QUANTITY_TEXT_LENGTH, QUANTITY_TEXT_PATTERN, UnitSet

__all__ = [
    "ApiModel",
    "Envelope",
    "FiniteFloat",
    "Meta",
    "QuantityInput",
    "QuantityOutput",
    "QuantityText",
    "QuantityValue",
    "QuantityValues",
    "SourceOut",
    "UncertaintyOut",
    "WarningOut",
]

# Strict: a JSON number only. Lax mode would read true/false as 1.0/0.0 and "300" as 300.0,
# which the documented schema (type number) does not allow. Integers are numbers.
FiniteFloat = Annotated[float, Strict(), Field(allow_inf_nan=False)]
NonNegativeFloat = Annotated[float, Strict(), Field(allow_inf_nan=False, ge=0)]


class ApiModel(BaseModel):
    """Base of every request and response model: unknown fields are refused."""

    model_config = ConfigDict(extra="forbid", populate_by_name=True)


class QuantityValue(ApiModel):
    """A single value with its unit, optionally with a standard uncertainty."""

    value: FiniteFloat = Field(description="The number, in `unit`.")
    unit: str | None = Field(
        None,
        description="Unit, e.g. `degC`, `kPa` (at most 64 characters); omitted means the "
        "field's default unit.",
    )
    uncertainty: NonNegativeFloat | None = Field(
        None,
        description="Standard uncertainty (k=1) of `value`, in `unit` "
        "(for temperatures a temperature difference).",
    )


class QuantityValues(ApiModel):
    """An array of values sharing one unit (a batch or a sweep)."""

    values: list[FiniteFloat] = Field(min_length=1, description="The numbers, in `unit`.")
    unit: str | None = Field(
        None,
        description="Unit (at most 64 characters); omitted means the field's default unit.",
    )
    uncertainty: NonNegativeFloat | None = Field(
        None, description="Standard uncertainty (k=1) of every value, in `unit`."
    )


QuantityText = Annotated[
    str,
    WithJsonSchema(
        {
            "type": "string",
            "pattern": QUANTITY_TEXT_PATTERN,
            "maxLength": MAX_QUANTITY_TEXT_LENGTH,
        }
    ),
]
"""A quantity as text, `"25 degC"`: the pattern is documented, the parser
(``http.units.parse_quantity_text``) does the refusing, with its own messages."""

QuantityInput = FiniteFloat | QuantityText | QuantityValue | QuantityValues | list[FiniteFloat]
"""A number in the default unit, `"25 degC"` (an ASCII number and one unit, at most 96
characters; refused with a 422 naming the field before any parsing), `{"value", "unit"}`,
`{"values", "unit"}`, or a list."""


class QuantityOutput(ApiModel):
    """A result: `value` for a single case, `values` for a batch, always with `unit`."""

    value: float | None = Field(
        None,
        description="Result for a single case (`null` only where the quantity diverges, "
        "e.g. isobaric heat capacity at the critical point; a warning says so).",
    )
    values: list[float | None] | None = Field(
        None, description="Results, in input order, for a batch (`null` as for `value`)."
    )
    unit: str = Field(description="Unit of the number(s).")


class SourceOut(ApiModel):
    """A property formulation the answer used."""

    formulation: str
    release: str
    year: int
    title: str
    scope: str


class UncertaintyOut(ApiModel):
    """A formulation's own stated uncertainty for one quantity."""

    quantity: str = Field(description="Which result it applies to.")
    relative: float | None = Field(None, description="Relative uncertainty (fraction).")
    absolute: QuantityOutput | None = Field(None, description="Absolute uncertainty.")
    coverage: str = Field(description="How the uncertainty is stated (e.g. expanded, k=2).")
    statement: str = Field(description="The statement it rests on.")
    source: str = Field(description="Release and section.")
    basis: str = Field(
        description="How the figure was obtained: `release text`, `from memory` (recalled, "
        "awaiting verification against the release) or `derived` (computed by tripoint)."
    )


class WarningOut(ApiModel):
    """Something the caller should know about the result."""

    code: str = Field(description="Stable code, e.g. `metastable`, `near-critical-point`.")
    message: str = Field(description="What the caller should know, in words.")
    indices: list[int] | None = Field(None, description="Batch positions concerned, if not all.")


class Meta(ApiModel):
    """Where and when the answer was made."""

    service_version: str
    calculation_id: str | None = Field(
        None,
        description="Id of the stored record of this answer (`GET /v1/calculations/{id}`); "
        "null for answers that are not stored (property lookups).",
        json_schema_extra={"format": "uuid"},
    )
    request_id: str | None = Field(
        None, description="The request's id, as in the `X-Request-ID` header."
    )
    time: str = Field(
        description="UTC time of the calculation, ISO 8601.",
        json_schema_extra={"format": "date-time"},
    )
    output_units: UnitSet


class Envelope(ApiModel):
    """Carried by every calculation response."""

    reference_state: str = Field(description="Zero of energy and entropy for all phases.")
    assumptions: list[str]
    property_sources: list[SourceOut]
    uncertainty: list[UncertaintyOut]
    warnings: list[WarningOut]
    meta: Meta
