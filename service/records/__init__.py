"""Calculation records: what was asked, what was answered, by which model version and key.

A framework-free package (SQLAlchemy 2 and the standard library): the HTTP layer hands it
plain JSON-ready dictionaries. SQLite by default, PostgreSQL for several replicas.
"""

from service.records.store import (
    CalculationRecord,
    InvalidCursorError,
    RecordPage,
    RecordStore,
    RecordSummary,
    SchemaVersionError,
    StoreUnavailableError,
)
from service.records.tables import SCHEMA_VERSION

__all__ = [
    "SCHEMA_VERSION",
    "CalculationRecord",
    "InvalidCursorError",
    "RecordPage",
    "RecordStore",
    "RecordSummary",
    "SchemaVersionError",
    "StoreUnavailableError",
]
