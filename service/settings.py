"""Runtime settings, read from ``TRIPOINT_``-prefixed environment variables.

Nothing is read at import time: call :func:`get_settings` (cached) or build a
:class:`Settings` yourself in tests and hand it to :func:`service.api.app.create_app`.

Lists (``TRIPOINT_API_KEYS``, ``TRIPOINT_CORS_ORIGINS``) are comma-separated. API keys are
held as :class:`pydantic.SecretStr`, so printing the settings never shows them.
"""

from __future__ import annotations

import os
import re
from functools import cache
from typing import Annotated, Literal

from pydantic import Field, SecretStr, field_validator
from pydantic_settings import BaseSettings, NoDecode, SettingsConfigDict

__all__ = ["MINIMUM_API_KEY_LENGTH", "Settings", "get_settings"]

MINIMUM_API_KEY_LENGTH = 16
"""Shorter keys are refused: they could be guessed (common practice, no source)."""

_SAFE_DATABASE_SCHEMES = ("sqlite", "sqlite+pysqlite", "postgresql", "postgresql+psycopg")
_KEY_CHARACTERS = re.compile(r"^[A-Za-z0-9._~+/=-]+$")
_ORIGIN = re.compile(r"^https?://[A-Za-z0-9.-]+(:\d{1,5})?$")


def _split_commas(value: object) -> object:
    if isinstance(value, str):
        return [part.strip() for part in value.split(",") if part.strip()]
    return value


class Settings(BaseSettings):
    """Every tunable of the service, with its default."""

    # Errors never quote the input: it may be an API key or a database password.
    model_config = SettingsConfigDict(
        env_prefix="TRIPOINT_", extra="ignore", hide_input_in_errors=True
    )

    host: str = Field("127.0.0.1", description="Interface the server binds to.")
    port: int = Field(8000, ge=1, le=65535, description="TCP port the server listens on.")
    workers: int = Field(1, ge=1, le=64, description="Worker processes (uvicorn).")
    log_level: Literal["debug", "info", "warning", "error"] = Field(
        "info", description="Log level of the service and the server."
    )
    max_batch_points: int = Field(
        1_000_000,
        ge=1,
        le=50_000_000,
        description="Largest number of points (or CSV rows) one request may ask for (413).",
    )
    max_csv_rows: int = Field(
        10_000,
        ge=1,
        le=1_000_000,
        description="Largest number of rows one CSV body may hold (413). A CSV request is "
        "read and written whole, so this bounds its memory (about 3 KB a row).",
    )
    max_concurrent_computations: int = Field(
        default_factory=lambda: os.cpu_count() or 1,
        ge=1,
        le=256,
        description="Computations (balances, simulations, batches, CSV) run at once; default "
        "the number of CPU cores. Light lookups and /health, /ready never wait for them.",
    )
    max_queued_computations: int = Field(
        32,
        ge=0,
        le=10_000,
        description="Computations that may wait for a free slot; one more is answered 503 "
        "with Retry-After at once.",
    )
    queue_wait_seconds: float = Field(
        5.0,
        ge=0,
        le=600,
        description="Longest wait for a free computation slot, in seconds (then 503 with "
        "Retry-After).",
    )
    max_sweep_cases: int = Field(
        1_000,
        ge=1,
        le=1_000_000,
        description="Largest number of cases one balance request may sweep (413). Each case "
        "is a full integration (about 0.5 ms for pure water, up to 0.1 s with a solute).",
    )
    max_simulation_sweep_cases: int = Field(
        256,
        ge=1,
        le=100_000,
        description="Largest number of cases one chamber-simulation request may sweep (413). "
        "Each case is a full simulation (about 0.1 to 0.5 s of one core).",
    )
    simulation_workers: int = Field(
        2,
        ge=1,
        le=64,
        description="Processes that compute a chamber-simulation sweep in parallel (one pool "
        "per server process, started on the first sweep); 1 computes sweeps in the request's "
        "own thread.",
    )
    max_body_bytes: int = Field(
        32 * 1024 * 1024,
        ge=1024,
        description="Largest request body accepted, in bytes (above it: 413).",
    )
    max_header_bytes: int = Field(
        32 * 1024,
        ge=4096,
        le=1024 * 1024,
        description="Largest request head (request line and header fields), in bytes (above "
        "it: 431, connection closed).",
    )
    max_request_seconds: float = Field(
        30.0,
        gt=0,
        le=3600,
        description="Computation time allowed per /v1 request, in seconds (above it: 503).",
    )
    api_keys: Annotated[list[SecretStr], NoDecode] = Field(
        default_factory=list,
        description="Accepted API keys, comma-separated; empty means keys are off.",
    )
    cors_origins: Annotated[list[str], NoDecode] = Field(
        default_factory=list,
        description="Origins allowed by CORS, comma-separated; empty means CORS is off.",
    )
    database_url: str = Field(
        "sqlite:///tripoint-records.sqlite3",
        description="Where calculation records go: an SQLite file or a PostgreSQL database.",
    )
    records_own_key_only: bool = Field(
        False,
        description="With API keys on: a key lists and reads only the records made with it "
        "(otherwise every key sees every record).",
    )
    retention_days: int = Field(
        365, ge=0, le=36_500, description="Days a calculation record is kept; 0 keeps forever."
    )
    store_failure_policy: Literal["warn", "fail"] = Field(
        "warn",
        description="When a record cannot be stored: `warn` answers with a `record-not-stored` "
        "warning, `fail` answers 503.",
    )

    @field_validator("host")
    @classmethod
    def _host_not_empty(cls, value: str) -> str:
        if not value.strip():
            raise ValueError("host must not be empty")
        return value

    @field_validator("api_keys", mode="before")
    @classmethod
    def _split_keys(cls, value: object) -> object:
        return _split_commas(value)

    @field_validator("api_keys")
    @classmethod
    def _keys_strong_enough(cls, value: list[SecretStr]) -> list[SecretStr]:
        for position, key in enumerate(value, start=1):
            secret = key.get_secret_value()
            # The messages name the key's position, never the key.
            if len(secret) < MINIMUM_API_KEY_LENGTH:
                raise ValueError(
                    f"API key #{position} is shorter than {MINIMUM_API_KEY_LENGTH} characters"
                )
            if not _KEY_CHARACTERS.match(secret):
                raise ValueError(
                    f"API key #{position} has characters outside A-Z a-z 0-9 . _ ~ + / = -"
                )
        return value

    @field_validator("cors_origins", mode="before")
    @classmethod
    def _split_origins(cls, value: object) -> object:
        return _split_commas(value)

    @field_validator("cors_origins")
    @classmethod
    def _origins_well_formed(cls, value: list[str]) -> list[str]:
        for origin in value:
            if origin != "*" and not _ORIGIN.match(origin):
                raise ValueError(
                    f"CORS origin {origin!r} must be '*' or scheme://host[:port] "
                    "(http or https, no path)"
                )
        return value

    @field_validator("database_url")
    @classmethod
    def _database_url_safe(cls, value: str) -> str:
        scheme, separator, rest = value.partition("://")
        if not separator or scheme not in _SAFE_DATABASE_SCHEMES:
            raise ValueError(
                "database_url must start with sqlite:/// or postgresql:// "
                f"(or postgresql+psycopg://); got scheme {scheme!r}"
            )
        if scheme.startswith("sqlite"):
            path = rest[1:] if rest.startswith("/") else rest
            if rest and not rest.startswith("/"):
                raise ValueError("an SQLite URL has no host: use sqlite:///relative/path")
            if not path or path.startswith(":memory:") or "mode=memory" in path:
                raise ValueError(
                    "an in-memory SQLite database would lose every record; give a file path"
                )
        elif not rest.partition("/")[0].rpartition("@")[2] and "host=" not in rest:
            raise ValueError(
                "a PostgreSQL URL needs a host (postgresql://user@host/database, or ?host=/socket)"
            )
        return value


@cache
def get_settings() -> Settings:
    """Return the process-wide settings, read once from the environment."""
    return Settings()
