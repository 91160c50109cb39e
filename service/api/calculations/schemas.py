"""Responses of the calculation-record routes."""

from __future__ import annotations

from datetime import datetime
from typing import Any

from pydantic import Field

from service.api.http.models import ApiModel

__all__ = [
    "CalculationListPublic",
    "CalculationPublic",
    "CalculationSummaryPublic",
    "FormulationVersion",
]


class FormulationVersion(ApiModel):
    """A property formulation a calculation used."""

    formulation: str | None = Field(description="Name, e.g. `IAPWS-95`.")
    release: str | None = Field(description="The release it follows, with its year.")


class CalculationSummaryPublic(ApiModel):
    """What a listing shows of one calculation."""

    calculation_id: str = Field(description="`meta.calculation_id` of the answer.")
    kind: str = Field(description="What was calculated, e.g. `balances.vacuum_cooling`.")
    created_at: datetime = Field(description="UTC time of the calculation, ISO 8601.")
    service_version: str = Field(description="tripoint version that calculated it.")
    key_id: str | None = Field(
        description="Digest naming the API key used (never the key); null when keys were off."
    )


class CalculationPublic(CalculationSummaryPublic):
    """A stored calculation: inputs as sent, the answer, and the model versions."""

    formulations: list[FormulationVersion] = Field(description="Property formulations used.")
    inputs: dict[str, Any] = Field(description="The request body as the client sent it.")
    result: dict[str, Any] = Field(description="The answer as it was returned.")


class CalculationListPublic(ApiModel):
    """One page of calculations, newest first."""

    items: list[CalculationSummaryPublic] = Field(
        description="The calculations on this page, newest first."
    )
    next_cursor: str | None = Field(
        description="Pass as `cursor` for the next page; null on the last page."
    )
