"""Helpers shared by test folders: the PostgreSQL test target, loopback ports.

Importable from every test folder: the root ``conftest.py`` puts ``tests/`` on the path.
"""

from __future__ import annotations

import os
import socket
import uuid
from collections.abc import Iterator
from contextlib import contextmanager

import pytest

__all__ = ["POSTGRES_URL", "free_port", "postgres_schema"]

POSTGRES_URL = os.environ.get(
    "TRIPOINT_TEST_POSTGRES_URL", "postgresql+psycopg://postgres@127.0.0.1:5432/test"
)
"""The machine's PostgreSQL (trust auth, database ``test``) unless the variable says otherwise."""


def free_port() -> int:
    """A TCP port on 127.0.0.1 that was free a moment ago."""
    with socket.socket() as probe:
        probe.bind(("127.0.0.1", 0))
        port: int = probe.getsockname()[1]
        return port


@contextmanager
def postgres_schema(prefix: str = "tripoint_test") -> Iterator[str]:
    """A fresh schema in the test database, dropped afterwards.

    Under ``CI=true`` an unreachable server fails the test; elsewhere it skips.
    """
    import psycopg

    plain_url = POSTGRES_URL.replace("postgresql+psycopg://", "postgresql://")
    try:
        connection = psycopg.connect(plain_url, autocommit=True, connect_timeout=5)
    except psycopg.OperationalError as error:
        message = f"PostgreSQL at {POSTGRES_URL} is not reachable: {error}"
        if os.environ.get("CI") == "true":
            pytest.fail(message)
        pytest.skip(message)
    schema = f"{prefix}_{uuid.uuid4().hex[:12]}"
    with connection:
        connection.execute(f'CREATE SCHEMA "{schema}"')
        try:
            yield schema
        finally:
            connection.execute(f'DROP SCHEMA "{schema}" CASCADE')
