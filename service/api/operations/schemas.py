"""Answer models of the operations routes."""

from __future__ import annotations

from pydantic import Field

from service.api.http.models import ApiModel

__all__ = ["HealthPublic", "ReadyPublic"]


class HealthPublic(ApiModel):
    """The service process answers."""

    status: str = Field(description="`ok` when the process answers.")
    service_version: str = Field(description="Version of the running service.")


class ReadyPublic(ApiModel):
    """The service can take calculations: its record store answers."""

    status: str = Field(description="`ready` when the record store answers.")
    service_version: str = Field(description="Version of the running service.")
    records_schema_version: int = Field(description="Version of the record store's table layout.")
