"""The layout change moves modules only: /openapi.json stays byte-identical.

The saved copies were taken from the service before the move; this test and the copies are
deleted with the commit that moves the modules.
"""

from __future__ import annotations

from pathlib import Path

import pytest
from fastapi.testclient import TestClient
from pydantic import SecretStr

from service.api.app import create_app
from service.settings import Settings

_SAVED = Path(__file__).parent / "snapshots"


def _served(tmp_path: Path, keys: list[SecretStr]) -> bytes:
    settings = Settings(database_url=f"sqlite:///{tmp_path / 'r.sqlite3'}", api_keys=keys)
    with TestClient(create_app(settings)) as client:
        return client.get("/openapi.json").content


@pytest.mark.parametrize(
    ("name", "keys"),
    [("openapi_open.json", []), ("openapi_keys.json", [SecretStr("k" * 32)])],
    ids=["keys-off", "keys-on"],
)
def test_openapi_document_is_byte_identical(
    tmp_path: Path, name: str, keys: list[SecretStr]
) -> None:
    assert _served(tmp_path, keys) == (_SAVED / name).read_bytes()
