"""Answer models of the operations routes."""

from __future__ import annotations

from service.api.http.models import ApiModel

__all__ = ["HealthPublic", "ReadyPublic"]


class HealthPublic(ApiModel):
    """The service process answers."""

    status: str
    service_version: str


class ReadyPublic(ApiModel):
    """The service can take calculations: its record store answers."""

    status: str
    service_version: str
    records_schema_version: int
