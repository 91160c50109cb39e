"""Shared base model, quantity shapes and the response envelope."""

from __future__ import annotations

from typing import Annotated

from pydantic import BaseModel, ConfigDict, Field, Strict, WithJsonSchema

from service.api.http.detail import Detail
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
    """A property formulation the answer used: its id and release; with `detail=full`
    also its name, edition year, title and what tripoint uses it for."""

    id: str = Field(
        description="Stable id of the source; `GET /v1/sources/{id}` gives its full entry."
    )
    release: str = Field(description="The release or publication, with its edition.")
    formulation: str | None = Field(
        None, description="Short name of the formulation (`detail=full` only)."
    )
    year: int | None = Field(None, description="Year of the edition cited (`detail=full` only).")
    title: str | None = Field(None, description="Full title of the release (`detail=full` only).")
    scope: str | None = Field(None, description="What tripoint uses it for (`detail=full` only).")


class UncertaintyOut(ApiModel):
    """A formulation's own stated uncertainty for one quantity, with the id of the
    statement it rests on; with `detail=full` also the statement's texts."""

    quantity: str = Field(description="Which result it applies to (its path in the answer).")
    relative: float | None = Field(
        None, description="Relative uncertainty, as a fraction (0.00025 = 0.025 %)."
    )
    absolute: QuantityOutput | None = Field(
        None, description="Absolute uncertainty, in the answer's unit set (where stated)."
    )
    coverage_factor: float | None = Field(
        None,
        description="Coverage factor of the figure (2: expanded, about 95 %; 1: standard "
        "uncertainty); null where the statement gives none (comparisons).",
    )
    basis: str = Field(
        description="How the figure was obtained: `release text`, `from memory` (recalled, "
        "awaiting verification against the release), `derived` (computed by tripoint) or "
        "`comparison` (tripoint's tests against outside references); empty where no "
        "statement covers the states."
    )
    statement_id: str = Field(
        description="Id of the statement it rests on; `GET /v1/sources/{id}` gives its text, "
        "release and section."
    )
    coverage: str | None = Field(
        None, description="How the uncertainty is stated, in words (`detail=full` only)."
    )
    statement: str | None = Field(
        None,
        description="The statement it rests on, with anything only this answer knows "
        "(`detail=full` only).",
    )
    source: str | None = Field(
        None, description="Release and section, or how it was derived (`detail=full` only)."
    )
    not_covered: list[str] | None = Field(
        None,
        description="Parts of the calculation no statement covers (e.g. a supercooled stage); "
        "they add nothing to the figure.",
    )


class WarningOut(ApiModel):
    """Something the caller should know about the result."""

    code: str = Field(description="Stable code, e.g. `metastable`, `near-critical-point`.")
    message: str = Field(description="What the caller should know, in words.")
    indices: list[int] | None = Field(None, description="Batch positions concerned, if not all.")


class Meta(ApiModel):
    """Where and when the answer was made."""

    service_version: str = Field(description="Version of the service that made the answer.")
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
    output_units: UnitSet = Field(description="Unit set of the answer's quantities.")
    detail: Detail = Field(
        Detail.COMPACT,
        description="How much of its statements the answer spells out (the `detail` query "
        "parameter): `compact` cites them by id, `full` adds their texts.",
    )
    statements: str | None = Field(
        None,
        description="Where every id in this answer resolves: the versioned sources document "
        "of this service version (`/v1/sources?version=...`).",
    )


class Envelope(ApiModel):
    """Carried by every calculation response."""

    reference_state: str = Field(
        description="Zero of energy and entropy for all phases: its id "
        "(`iapws-triple-point-liquid`, resolved by `GET /v1/sources/{id}`); with "
        "`detail=full`, the full statement."
    )
    assumptions: list[str] = Field(description="The modelling assumptions of this answer.")
    property_sources: list[SourceOut] = Field(
        description="The property formulations the answer used."
    )
    uncertainty: list[UncertaintyOut] = Field(
        description="The formulations' stated uncertainties of the answer's quantities."
    )
    warnings: list[WarningOut] = Field(
        description="Things the caller should know about the result."
    )
    meta: Meta = Field(
        description="The answer's service version, request (and stored calculation) id, "
        "time, unit set and detail level."
    )
