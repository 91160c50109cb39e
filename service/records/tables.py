"""The record tables and their schema version.

Schema management: ``MetaData.create_all`` creates missing tables at startup, and the
one-row table ``tripoint_schema_version`` holds the version the tables are at. A later
change to the tables bumps :data:`SCHEMA_VERSION` and adds a step to
``store._MIGRATIONS`` that takes the database from the previous version; a database at a
*newer* version than the code is refused rather than written to.
"""

from __future__ import annotations

from datetime import UTC, datetime
from typing import Any

from sqlalchemy import JSON, Column, DateTime, Dialect, Index, Integer, MetaData, String, Table
from sqlalchemy.types import TypeDecorator

__all__ = [
    "LABEL_LENGTH",
    "SCHEMA_VERSION",
    "TAG_LENGTH",
    "calculation_tags",
    "calculations",
    "metadata",
    "schema_version",
]

SCHEMA_VERSION = 2
"""Version of the tables this code reads and writes.

1. The calculations table.
2. ``label``, ``tags`` and ``headline`` columns on it (null in records written at version
   1), an index on the label, and the ``tripoint_calculation_tags`` table that the tag
   filter reads.
"""

LABEL_LENGTH = 100
"""Longest label a record holds, in characters."""

TAG_LENGTH = 40
"""Longest tag a record holds, in characters."""


class UtcDateTime(TypeDecorator[datetime]):
    """A timestamp that goes in and comes out as timezone-aware UTC on every backend.

    SQLite has no time zones: values are stored as naive UTC there and made aware again
    when read.
    """

    impl = DateTime(timezone=True)
    cache_ok = True

    def process_bind_param(self, value: datetime | None, dialect: Dialect) -> datetime | None:
        if value is None:
            return None
        if value.tzinfo is None:
            raise ValueError("timestamps given to the record store must be timezone-aware")
        value = value.astimezone(UTC)
        return value.replace(tzinfo=None) if dialect.name == "sqlite" else value

    def process_result_value(self, value: Any, dialect: Dialect) -> datetime | None:
        if value is None:
            return None
        assert isinstance(value, datetime)
        return value.replace(tzinfo=UTC) if value.tzinfo is None else value.astimezone(UTC)


metadata = MetaData()

calculations = Table(
    "tripoint_calculations",
    metadata,
    Column("calculation_id", String(64), primary_key=True),
    Column("kind", String(100), nullable=False),
    Column("created_at", UtcDateTime(), nullable=False),
    # Plain JSON (not PostgreSQL JSONB) keeps the inputs' key order as sent.
    Column("inputs", JSON(none_as_null=True), nullable=False),
    Column("result", JSON(none_as_null=True), nullable=False),
    Column("service_version", String(40), nullable=False),
    Column("formulations", JSON(none_as_null=True), nullable=False),
    Column("key_id", String(32), nullable=True),
    Column("label", String(LABEL_LENGTH), nullable=True),
    Column("tags", JSON(none_as_null=True), nullable=True),
    # A few key numbers of the answer, so that a listing need not read the whole result.
    Column("headline", JSON(none_as_null=True), nullable=True),
    Index("ix_tripoint_calculations_created_at", "created_at", "calculation_id"),
    Index("ix_tripoint_calculations_kind_created_at", "kind", "created_at"),
    Index("ix_tripoint_calculations_key_id_created_at", "key_id", "created_at"),
    Index("ix_tripoint_calculations_label_created_at", "label", "created_at"),
)

calculation_tags = Table(
    "tripoint_calculation_tags",
    metadata,
    # No foreign key: SQLite enforces none without a pragma; the store deletes a record's
    # tags with the record.
    Column("calculation_id", String(64), primary_key=True),
    Column("tag", String(TAG_LENGTH), primary_key=True),
    Index("ix_tripoint_calculation_tags_tag", "tag", "calculation_id"),
)
"""One row per tag of a record: the tag filter of a listing is an indexed look-up."""

schema_version = Table(
    "tripoint_schema_version",
    metadata,
    Column("version", Integer, primary_key=True, autoincrement=False),
)
