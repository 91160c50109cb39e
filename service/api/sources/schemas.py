"""Request/response models of /v1/sources: the statements answers cite by id."""

from __future__ import annotations

from typing import Literal

from pydantic import Field

from service.api.http.models import ApiModel

__all__ = ["SourcesPublic", "SourcesQuery", "StatementPublic"]


class SourcesQuery(ApiModel):
    """Query string of GET /v1/sources."""

    version: str | None = Field(
        None,
        max_length=64,
        description="Service version whose statements are asked (as in an answer's "
        "`meta.statements`); omitted means this service's. Another version is a 404: each "
        "service version serves its own document.",
    )


class StatementPublic(ApiModel):
    """One statement an answer can cite by `id`."""

    id: str = Field(description="Stable id, as answers cite it.")
    kind: Literal["reference-state", "property-source", "uncertainty"] = Field(
        description="What the statement is: the reference state, a property source (a "
        "release or published model) or an uncertainty statement."
    )
    text: str = Field(
        description="The full statement (for a property source: its title and what tripoint "
        "uses it for)."
    )
    release: str = Field(description="The release, article or document it rests on.")
    section: str = Field(description="Where in that document, or how it was derived.")
    basis: str = Field(
        description="How it got here: `publication` (a property source), `release text`, "
        "`from memory` (recalled, awaiting verification against the release), `derived` "
        "(computed by tripoint), `comparison` (tripoint's tests against outside references), "
        "`convention` (the reference state) or `not stated`."
    )
    missing_document: str | None = Field(
        None,
        description="For a `from memory` statement: which document could not be read to verify it.",
    )
    quantity: str | None = Field(
        None, description="Quantity an uncertainty statement is about (full-word name)."
    )
    relative: float | None = Field(
        None, description="Relative uncertainty, as a fraction (0.00025 = 0.025 %)."
    )
    coverage: str | None = Field(None, description="How the uncertainty is stated, in words.")
    coverage_factor: float | None = Field(
        None, description="Coverage factor of `relative` (2: expanded, about 95 %)."
    )
    formulation: str | None = Field(
        None, description="Short name of the formulation it belongs to."
    )
    minimum_temperature: float | None = Field(
        None, description="Lowest temperature an uncertainty statement covers, K."
    )
    maximum_temperature: float | None = Field(
        None, description="Highest temperature an uncertainty statement covers, K."
    )
    maximum_pressure: float | None = Field(
        None, description="Highest pressure it covers, Pa (null: not limited)."
    )
    year: int | None = Field(None, description="Edition year of a property source.")


class SourcesPublic(ApiModel):
    """Every statement this service version's answers cite, with their full texts."""

    service_version: str = Field(description="The service version this document belongs to.")
    content_hash: str = Field(
        description="SHA-256 (hex) of the statements' canonical JSON: changes with any id, "
        "text or number (the `ETag` is made from it)."
    )
    missing_documents: list[str] = Field(
        description="Documents whose uncertainty texts could not be read; the statements "
        "resting on them are marked `from memory`."
    )
    statements: list[StatementPublic] = Field(
        description="Reference state, then property sources, then uncertainty statements."
    )
