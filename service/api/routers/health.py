"""Liveness."""

from __future__ import annotations

from fastapi import APIRouter

from service import __version__
from service.api.schemas.common import ApiModel

router = APIRouter(tags=["operations"])


class HealthPublic(ApiModel):
    """The service process answers."""

    status: str
    service_version: str


@router.get("/health", operation_id="get_health", response_model=HealthPublic)
async def get_health() -> HealthPublic:
    """Liveness: the process is up and answering. Never needs a key."""
    return HealthPublic(status="ok", service_version=__version__)
