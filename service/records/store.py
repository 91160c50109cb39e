"""Store, read, list and prune calculation records through SQLAlchemy 2.

SQLite (a file, zero setup) by default; PostgreSQL when the URL points at one, so that
several replicas share one store. Every public method is synchronous and thread-safe:
call it from a worker thread, not from an event loop.
"""

from __future__ import annotations

import base64
import binascii
import contextlib
import threading
import time
from collections.abc import Callable, Sequence
from dataclasses import dataclass
from datetime import UTC, datetime
from pathlib import Path
from typing import Any, Final

import orjson
from sqlalchemy import (
    Connection,
    Engine,
    and_,
    create_engine,
    delete,
    event,
    exists,
    insert,
    inspect,
    or_,
    select,
    text,
)
from sqlalchemy.engine import make_url
from sqlalchemy.exc import SQLAlchemyError
from sqlalchemy.schema import CreateColumn
from sqlalchemy.sql.elements import ColumnElement

from service.records.tables import (
    SCHEMA_VERSION,
    calculation_tags,
    calculations,
    metadata,
    schema_version,
)

__all__ = [
    "CalculationRecord",
    "InvalidCursorError",
    "RecordPage",
    "RecordStore",
    "RecordSummary",
    "SchemaVersionError",
    "StoreUnavailableError",
]

JsonObject = dict[str, Any]

_POSTGRESQL_SCHEMA_LOCK = 7_311_502_170
"""Advisory-lock number held while one replica creates or migrates the tables."""


def _schema_of(connection: Connection) -> str | None:
    """The schema the store's tables are kept in (None: the default search path)."""
    translate = connection.get_execution_options().get("schema_translate_map") or {}
    schema: str | None = translate.get(None)
    return schema


def _add_labels_and_headline(connection: Connection) -> None:
    """Version 2: the ``label``, ``tags`` and ``headline`` columns (null in older records)
    and the label index. The tag table is new, so ``create_all`` has made it already.

    Each part is added only where missing: SQLite runs DDL outside the transaction, so a
    start stopped half-way leaves some of them in place for the next start to complete.
    """
    schema = _schema_of(connection)
    preparer = connection.dialect.identifier_preparer
    table = preparer.quote(calculations.name)
    if schema:
        table = f"{preparer.quote_schema(schema)}.{table}"
    present = {
        column["name"] for column in inspect(connection).get_columns(calculations.name, schema)
    }
    for column in (calculations.c.label, calculations.c.tags, calculations.c.headline):
        if column.name not in present:
            definition = CreateColumn(column).compile(dialect=connection.dialect)
            connection.execute(text(f"ALTER TABLE {table} ADD COLUMN {definition}"))
    for index in calculations.indexes:
        if index.name == "ix_tripoint_calculations_label_created_at":
            index.create(connection, checkfirst=True)


_MIGRATIONS: dict[int, Callable[[Connection], None]] = {2: _add_labels_and_headline}
"""Step ``n`` takes a database from version ``n - 1`` to ``n``."""

_SUMMARY_COLUMNS = (
    calculations.c.calculation_id,
    calculations.c.kind,
    calculations.c.created_at,
    calculations.c.service_version,
    calculations.c.key_id,
    calculations.c.label,
    calculations.c.tags,
    calculations.c.headline,
)


class StoreUnavailableError(RuntimeError):
    """The record store could not be reached or refused the operation."""


class SchemaVersionError(StoreUnavailableError):
    """The database holds tables of a newer schema than this code knows."""


class InvalidCursorError(ValueError):
    """A pagination cursor that this store did not hand out."""


@dataclass(frozen=True)
class RecordSummary:
    """What a listing shows of one record."""

    calculation_id: str
    kind: str
    created_at: datetime
    service_version: str
    key_id: str | None
    label: str | None = None
    tags: tuple[str, ...] = ()
    headline: JsonObject | None = None


@dataclass(frozen=True)
class CalculationRecord:
    """One calculation: inputs as sent, the result, model versions, time and key id.

    ``formulations`` lists the property formulations used, each as
    ``{"formulation": ..., "release": ...}``. ``key_id`` is a digest of the API key (never the
    key), or None when keys are off. ``label`` and ``tags`` are the client's own names for
    the record (checked by the HTTP layer; tags are kept in their order, without repeats);
    ``headline`` a few key numbers of the result that a listing shows. Records written
    before schema version 2 have none of these three.
    """

    calculation_id: str
    kind: str
    created_at: datetime
    inputs: JsonObject
    result: JsonObject
    service_version: str
    formulations: list[JsonObject]
    key_id: str | None
    label: str | None = None
    tags: tuple[str, ...] = ()
    headline: JsonObject | None = None

    def summary(self) -> RecordSummary:
        """The listing view of this record."""
        return RecordSummary(
            self.calculation_id,
            self.kind,
            self.created_at,
            self.service_version,
            self.key_id,
            self.label,
            self.tags,
            self.headline,
        )


@dataclass(frozen=True)
class RecordPage:
    """One page of a listing, newest first; ``next_cursor`` is None on the last page."""

    items: list[RecordSummary]
    next_cursor: str | None


def _tags_of(value: Any) -> tuple[str, ...]:
    """The tags column as read: a list, or null in a record written before version 2."""
    return tuple(str(tag) for tag in value) if isinstance(value, list) else ()


def _json_text(value: Any) -> str:
    return orjson.dumps(value, option=orjson.OPT_SERIALIZE_NUMPY).decode()


def _encode_cursor(created_at: datetime, calculation_id: str) -> str:
    raw = f"{created_at.astimezone(UTC).isoformat()}|{calculation_id}".encode()
    return base64.urlsafe_b64encode(raw).decode().rstrip("=")


def _decode_cursor(cursor: str) -> tuple[datetime, str]:
    try:
        raw = base64.urlsafe_b64decode(cursor + "=" * (-len(cursor) % 4)).decode()
        moment, separator, calculation_id = raw.partition("|")
        created_at = datetime.fromisoformat(moment)
    except (binascii.Error, UnicodeDecodeError, ValueError):
        raise InvalidCursorError("the cursor is not one this service handed out") from None
    if not separator or not calculation_id or created_at.tzinfo is None:
        raise InvalidCursorError("the cursor is not one this service handed out")
    return created_at, calculation_id


_SQLITE_BUSY_SECONDS: Final = 15.0
"""How long an SQLite write waits for its turn: in this process's queue, then for the file."""


class _WriteQueue:
    """One writer at a time, each waiting at most ``seconds`` for its turn.

    A writer that does not get its turn in time fails like a busy database, with
    :class:`StoreUnavailableError`, instead of waiting behind every writer before it.
    """

    def __init__(self, seconds: float) -> None:
        self._lock = threading.Lock()
        self._seconds = seconds

    def __enter__(self) -> None:
        if not self._lock.acquire(timeout=self._seconds):
            raise StoreUnavailableError(
                f"record store busy: no turn to write within {self._seconds:g} s"
            )

    def __exit__(self, *_: object) -> None:
        self._lock.release()


class RecordStore:
    """Calculation records in an SQL database.

    Parameters
    ----------
    url
        ``sqlite:///path/to/file.sqlite3`` or ``postgresql://user@host:5432/database``
        (``postgresql://`` is read as ``postgresql+psycopg://``).
    schema
        Database schema the tables live in (PostgreSQL only); None uses the default search
        path. Tests use it to keep each run apart.
    """

    def __init__(self, url: str, *, schema: str | None = None) -> None:
        parsed = make_url(url)
        if parsed.drivername == "postgresql":
            parsed = parsed.set(drivername="postgresql+psycopg")
        self.backend = parsed.get_backend_name()
        self.display_url = parsed.render_as_string(hide_password=True)
        options: dict[str, Any] = {"json_serializer": _json_text}
        if self.backend == "sqlite":
            if parsed.database:
                Path(parsed.database).expanduser().parent.mkdir(parents=True, exist_ok=True)
            options["connect_args"] = {"timeout": _SQLITE_BUSY_SECONDS}
        else:
            # A server restarts and drops pooled connections; a local file does not (a
            # ping per checkout cost 6 % of a balance request on SQLite, profiled).
            options["pool_pre_ping"] = True
            options["connect_args"] = {"connect_timeout": 5}
        engine = create_engine(parsed, **options)
        if self.backend == "sqlite":
            event.listen(engine, "connect", _sqlite_pragmas)
        self._base_engine = engine
        self._engine: Engine = (
            engine.execution_options(schema_translate_map={None: schema}) if schema else engine
        )
        self._schema_lock = threading.Lock()
        self._schema_ready = False
        # SQLite takes one writer at a time. Writers of this process queue on a lock of
        # their own: left to SQLite's busy handler, which sleeps in growing steps, 16
        # concurrent balance requests waited up to a second for their insert (p99 1.2 s,
        # profiled with py-spy under wrk). Other processes (--workers N) still meet the
        # busy timeout. PostgreSQL writes concurrently.
        self._writes: contextlib.AbstractContextManager[Any] = (
            _WriteQueue(_SQLITE_BUSY_SECONDS)
            if self.backend == "sqlite"
            else contextlib.nullcontext()
        )

    # -- schema -----------------------------------------------------------------------

    def ensure_schema(self) -> None:
        """Create the tables if missing and bring them to :data:`SCHEMA_VERSION`.

        Idempotent and safe when several processes start at once (PostgreSQL: an advisory
        lock; SQLite: a retry when another process won the race).

        Raises
        ------
        SchemaVersionError
            The database is at a newer schema version than this code.
        StoreUnavailableError
            The database cannot be reached.
        """
        if self._schema_ready:
            return
        with self._schema_lock:
            if self._schema_ready:
                return
            # Two processes starting together on one SQLite file can both find a table
            # missing; the loser's CREATE fails and its retry finds the table.
            for attempt in range(3):
                try:
                    self._create_or_migrate()
                    break
                except SQLAlchemyError as error:
                    if attempt == 2:
                        raise StoreUnavailableError(_describe(error)) from None
                    time.sleep(0.2)
            self._schema_ready = True

    def _create_or_migrate(self) -> None:
        with self._engine.begin() as connection:
            if self.backend == "postgresql":
                connection.execute(
                    text("SELECT pg_advisory_xact_lock(:lock)"), {"lock": _POSTGRESQL_SCHEMA_LOCK}
                )
            metadata.create_all(connection, checkfirst=True)
            found = connection.execute(select(schema_version.c.version)).scalars().all()
            version = max(found) if found else 0
            if version > SCHEMA_VERSION:
                raise SchemaVersionError(
                    f"the record tables are at schema version {version}, newer than this "
                    f"service's {SCHEMA_VERSION}; upgrade the service"
                )
            # Tables that create_all has just made (version 0) are at SCHEMA_VERSION already.
            first = SCHEMA_VERSION + 1 if version == 0 else version + 1
            for step in range(first, SCHEMA_VERSION + 1):
                migrate = _MIGRATIONS.get(step)
                if migrate is not None:
                    migrate(connection)
            if version != SCHEMA_VERSION:
                connection.execute(delete(schema_version))
                connection.execute(insert(schema_version).values(version=SCHEMA_VERSION))

    def schema_version(self) -> int:
        """The schema version the database is at (0 when no tables exist yet)."""
        try:
            with self._engine.connect() as connection:
                found = connection.execute(select(schema_version.c.version)).scalars().all()
        except SQLAlchemyError:
            return 0
        return max(found) if found else 0

    # -- operations ---------------------------------------------------------------------

    def ping(self) -> None:
        """Check that the database answers and the tables are in place.

        Raises
        ------
        StoreUnavailableError
            When it does not.
        """
        self.ensure_schema()
        try:
            with self._engine.connect() as connection:
                connection.execute(select(calculations.c.calculation_id).limit(1)).all()
        except SQLAlchemyError as error:
            raise StoreUnavailableError(_describe(error)) from None

    def add(self, record: CalculationRecord) -> None:
        """Store one record.

        Raises
        ------
        StoreUnavailableError
            The write failed; nothing was stored.
        """
        self.ensure_schema()
        row = {
            "calculation_id": record.calculation_id,
            "kind": record.kind,
            "created_at": record.created_at,
            "inputs": record.inputs,
            "result": record.result,
            "service_version": record.service_version,
            "formulations": record.formulations,
            "key_id": record.key_id,
            "label": record.label,
            "tags": list(dict.fromkeys(record.tags)),
            "headline": record.headline,
        }
        tags = [
            {"calculation_id": record.calculation_id, "tag": tag}
            for tag in dict.fromkeys(record.tags)
        ]
        try:
            with self._writes, self._engine.begin() as connection:
                connection.execute(insert(calculations).values(**row))
                if tags:
                    connection.execute(insert(calculation_tags), tags)
        except SQLAlchemyError as error:
            raise StoreUnavailableError(_describe(error)) from None

    def get(self, calculation_id: str) -> CalculationRecord | None:
        """The record with this id, or None."""
        self.ensure_schema()
        try:
            with self._engine.connect() as connection:
                row = (
                    connection.execute(
                        select(calculations).where(calculations.c.calculation_id == calculation_id)
                    )
                    .mappings()
                    .first()
                )
        except SQLAlchemyError as error:
            raise StoreUnavailableError(_describe(error)) from None
        if row is None:
            return None
        return CalculationRecord(
            calculation_id=row["calculation_id"],
            kind=row["kind"],
            created_at=row["created_at"],
            inputs=row["inputs"],
            result=row["result"],
            service_version=row["service_version"],
            formulations=row["formulations"],
            key_id=row["key_id"],
            label=row["label"],
            tags=_tags_of(row["tags"]),
            headline=row["headline"],
        )

    def list_records(
        self,
        *,
        kind: str | None = None,
        key_id: str | None = None,
        label: str | None = None,
        tags: Sequence[str] = (),
        since: datetime | None = None,
        until: datetime | None = None,
        limit: int = 100,
        cursor: str | None = None,
    ) -> RecordPage:
        """Records newest first, filtered, one page at a time.

        Parameters
        ----------
        kind, key_id, label
            Keep only records of this kind / made with this key id / with this label
            (exactly).
        tags
            Keep only records carrying every one of these tags.
        since, until
            Keep records created at or after ``since`` and before ``until`` (aware datetimes).
        limit
            Page size, at least 1.
        cursor
            ``next_cursor`` of the previous page; None for the first page. Keyset
            pagination: records written meanwhile never shift a page.

        Raises
        ------
        InvalidCursorError
            The cursor is not one this store handed out.
        """
        if limit < 1:
            raise ValueError("limit must be at least 1")
        conditions: list[ColumnElement[bool]] = []
        if kind is not None:
            conditions.append(calculations.c.kind == kind)
        if key_id is not None:
            conditions.append(calculations.c.key_id == key_id)
        if label is not None:
            conditions.append(calculations.c.label == label)
        for tag in dict.fromkeys(tags):
            conditions.append(
                exists().where(
                    calculation_tags.c.calculation_id == calculations.c.calculation_id,
                    calculation_tags.c.tag == tag,
                )
            )
        if since is not None:
            conditions.append(calculations.c.created_at >= since)
        if until is not None:
            conditions.append(calculations.c.created_at < until)
        if cursor is not None:
            created_at, calculation_id = _decode_cursor(cursor)
            conditions.append(
                or_(
                    calculations.c.created_at < created_at,
                    and_(
                        calculations.c.created_at == created_at,
                        calculations.c.calculation_id < calculation_id,
                    ),
                )
            )
        query = (
            select(*_SUMMARY_COLUMNS)
            .where(*conditions)
            .order_by(calculations.c.created_at.desc(), calculations.c.calculation_id.desc())
            .limit(limit + 1)
        )
        self.ensure_schema()
        try:
            with self._engine.connect() as connection:
                rows = connection.execute(query).mappings().all()
        except SQLAlchemyError as error:
            raise StoreUnavailableError(_describe(error)) from None
        items = [
            RecordSummary(
                row["calculation_id"],
                row["kind"],
                row["created_at"],
                row["service_version"],
                row["key_id"],
                row["label"],
                _tags_of(row["tags"]),
                row["headline"],
            )
            for row in rows[:limit]
        ]
        next_cursor = None
        if len(rows) > limit:
            last = items[-1]
            next_cursor = _encode_cursor(last.created_at, last.calculation_id)
        return RecordPage(items=items, next_cursor=next_cursor)

    def prune(self, older_than: datetime) -> int:
        """Delete records created before ``older_than``; return how many went."""
        self.ensure_schema()
        try:
            with self._writes, self._engine.begin() as connection:
                expired = select(calculations.c.calculation_id).where(
                    calculations.c.created_at < older_than
                )
                connection.execute(
                    delete(calculation_tags).where(calculation_tags.c.calculation_id.in_(expired))
                )
                result = connection.execute(
                    delete(calculations).where(calculations.c.created_at < older_than)
                )
        except SQLAlchemyError as error:
            raise StoreUnavailableError(_describe(error)) from None
        return int(result.rowcount)

    def drop_tables(self) -> None:
        """Remove the record tables (tests and tear-down only)."""
        with self._engine.begin() as connection:
            metadata.drop_all(connection)
        self._schema_ready = False

    def close(self) -> None:
        """Close every pooled connection."""
        self._base_engine.dispose()


def _sqlite_pragmas(connection: Any, _record: Any) -> None:
    """WAL lets readers go on while one process writes (several workers on one host)."""
    cursor = connection.cursor()
    cursor.execute("PRAGMA journal_mode=WAL")
    cursor.execute("PRAGMA synchronous=NORMAL")
    cursor.close()


def _describe(error: SQLAlchemyError) -> str:
    """A one-line reason, without the SQL statement or its parameters."""
    original = getattr(error, "orig", None)
    reason = str(original) if original is not None else str(error)
    return f"{type(error).__name__}: {reason.strip().splitlines()[0] if reason.strip() else ''}"
