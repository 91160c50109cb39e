"""Shared fixtures."""

from __future__ import annotations

from collections.abc import Iterator

import pytest
from fastapi.testclient import TestClient

from service.api.app import create_app
from service.settings import Settings


@pytest.fixture(scope="session")
def settings(tmp_path_factory: pytest.TempPathFactory) -> Settings:
    """Settings for tests: small limits so the 413 paths are cheap to reach; records in a
    temporary SQLite file."""
    records = tmp_path_factory.mktemp("records") / "records.sqlite3"
    return Settings(
        max_batch_points=20_000,
        max_body_bytes=2 * 1024 * 1024,
        database_url=f"sqlite:///{records}",
    )


@pytest.fixture(scope="session")
def client(settings: Settings) -> Iterator[TestClient]:
    """An in-process client of the whole application."""
    with TestClient(create_app(settings)) as test_client:
        yield test_client
