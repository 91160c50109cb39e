"""CSV for LIMS: ``text/csv`` request bodies in, ``text/csv`` answers out, for any route.

Requests. The header names the fields, with the unit in brackets: ``temperature[degC]``,
``pressure[kPa]``; a dotted name (``food.water_fraction``) nests. One case per row. A
route is adapted in one of two ways (:class:`CsvRoute`):

- *batch* (``one_call_per_row=False``): the route takes arrays, so one JSON body is made
  in which every unit column becomes ``{"values": [...], "unit": ...}``, a unitless
  numeric column ``{"values": [...]}`` (the field's default unit), and a text column
  (``output_units``, ``formulation``) must hold one value for every row;
- *per row* (``one_call_per_row=True``): the route takes single values, so it is called
  once per row with ``{"value": x, "unit": ...}`` per unit column, numbers and text as
  they are, and empty cells left out.

Rows are numbered one way everywhere: data rows from 1, as a spreadsheet shows the rows
below the header (a problem's ``index`` and its "CSV row N" text). A failing row stops the
request with that row's problem document, unless the query asks ``row_errors=include``:
then every good row is answered and each bad row carries ``error.status``,
``error.field`` and ``error.detail`` columns instead (a batch route is then run once per
row). ``output_units`` in the query sets the unit set of the whole CSV request without a
per-row column. These two are the only query parameters a CSV body adds.

Answers. With ``Accept: text/csv`` the JSON answer is flattened: a quantity becomes a
column named ``path[unit]`` (``liquid.density[kg/m3]``); a batch array gives one row per
element and single values repeat on every row; ``warnings`` lists on each row the warnings
that apply to it. Lists of objects (stages, sources) keep one column per field with the
items joined by `` | ``; an array that is not the batch (a trajectory) is joined by ``; ``
in one cell. Problems stay ``application/problem+json``. A per-row CSV request asked for
JSON gets a JSON array of the answers.

Statements once. The envelope members that are the same on every row (reference state,
assumptions, property sources, uncertainty, and each ``meta`` member) are not repeated
per row: they open the answer as ``# name: JSON value`` lines, after one explaining
``#`` line, before the header (pandas reads the table with ``read_csv(comment="#")``;
the stdlib ``csv`` reader after skipping lines that start with ``#``). A member that
differs between rows (the calculation id of each row of a per-row route) stays a column,
and so does ``warnings``. A CSV answer can be sent back as a request body as it is: the
``#`` lines before the header are skipped.
"""

from __future__ import annotations

import asyncio
import csv
import io
import math
import re
from collections.abc import Sequence
from dataclasses import dataclass, field
from typing import Any
from urllib.parse import parse_qsl, urlencode

import anyio.to_thread
import orjson
from starlette.types import ASGIApp, Message, Receive, Scope, Send

from service.api.http.limits import TimeLimitExceededError, run_within_limit
from service.api.http.members import MISSING, member_at
from service.api.http.negotiation import CHOSEN_MEDIA_TYPE, choose_media_type
from service.api.http.problem_asgi import send_problem
from service.api.http.problems import PROBLEM_MEDIA_TYPE, FieldError, problem_answer
from service.api.http.request_head import request_head
from service.core.deadline import set_deadline

__all__ = [
    "CSV_MEDIA_TYPE",
    "CSV_RESPONSE_TYPE",
    "CsvAdapter",
    "CsvError",
    "CsvRoute",
    "CsvTable",
    "answer_csv",
    "document_csv",
    "flatten_answers",
    "parse_csv",
    "prefers_csv",
    "render_csv",
    "split_statements",
]

CSV_MEDIA_TYPE = "text/csv"
CSV_RESPONSE_TYPE = "text/csv; charset=utf-8; header=present"
"""Content type of every CSV answer."""
_CSV_RESPONSE_TYPE = CSV_RESPONSE_TYPE
_HEADER = re.compile(
    r"^(?P<path>[A-Za-z_][A-Za-z0-9_]*(?:\.[A-Za-z_][A-Za-z0-9_]*)*)\s*(?:\[(?P<unit>[^\]]*)\])?$"
)
_NUMBER = re.compile(r"^[-+]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][-+]?\d+)?$")
_INTEGER = re.compile(r"^[-+]?\d+$")
_JOINED_LISTS = frozenset({"assumptions"})
_UNIT_SETS = ("SI", "engineering", "US")
_ROW_ERRORS = ("stop", "include")
_ELEMENT = re.compile(r"\(element (\d+)\)")
_ENVELOPE_ORDER = (
    "warnings",
    "meta",
    "property_sources",
    "uncertainty",
    "assumptions",
    "reference_state",
)
"""Envelope fields go after the results, in this order."""
_JOIN = " | "
"""Between the items of a list (stages, sources, warnings) in one cell."""
_ARRAY_JOIN = "; "
"""Between the numbers of an array that is not spread over rows (a trajectory)."""


@dataclass(frozen=True)
class CsvRoute:
    """Routes under ``prefix`` speak CSV; ``one_call_per_row`` when they take single values."""

    prefix: str
    one_call_per_row: bool = False
    answer_part: str | None = None
    """With ``Accept: text/csv``, flatten only this member of each JSON answer (e.g. a
    simulation's ``series``, one row per time step) instead of the whole answer."""

    def matches(self, path: str) -> bool:
        """Whether ``path`` is one of these routes."""
        return path.startswith(self.prefix)


class CsvError(ValueError):
    """A CSV body that cannot be turned into a request (400 malformed, 422 unreadable)."""

    def __init__(
        self,
        status: int,
        detail: str,
        *,
        column: str = "body",
        row: int | None = None,
        value: str | None = None,
    ) -> None:
        super().__init__(detail)
        self.status = status
        self.detail = detail
        self.column = column
        self.row = row
        self.value = value


@dataclass(frozen=True)
class _Column:
    name: str
    path: tuple[str, ...]
    unit: str | None
    has_unit: bool
    cells: list[str]


@dataclass(frozen=True)
class CsvTable:
    """A parsed CSV body: its columns and number of rows."""

    columns: list[_Column]
    rows: int

    def batch_body(self) -> dict[str, Any]:
        """One JSON body with every column as a batch (see the module docstring)."""
        body: dict[str, Any] = {}
        for column in self.columns:
            filled = [cell for cell in column.cells if cell != ""]
            if not filled:
                continue
            numeric = all(_NUMBER.match(cell) for cell in filled)
            if column.has_unit or numeric:
                if len(filled) != self.rows:
                    row = next(i for i, cell in enumerate(column.cells) if cell == "")
                    raise CsvError(
                        422,
                        f"column {column.name!r} has no value in row {row + 1}",
                        column=column.name,
                        row=row,
                    )
                values = [_number(cell, column.name, row) for row, cell in enumerate(column.cells)]
                quantity: dict[str, Any] = {"values": values}
                if column.unit:
                    quantity["unit"] = column.unit
                _put(body, column, quantity)
                continue
            distinct = set(column.cells)
            if len(distinct) != 1:
                raise CsvError(
                    422,
                    f"column {column.name!r} holds text that differs between rows; in this "
                    "request it must hold one value for every row",
                    column=column.name,
                )
            _put(body, column, column.cells[0])
        return body

    def single_row(self, row: int) -> CsvTable:
        """The table of one data row (0-based)."""
        columns = [
            _Column(column.name, column.path, column.unit, column.has_unit, [column.cells[row]])
            for column in self.columns
        ]
        return CsvTable(columns=columns, rows=1)

    def row_bodies(self) -> list[dict[str, Any]]:
        """One JSON body per row, single values (see the module docstring)."""
        bodies: list[dict[str, Any]] = []
        for row in range(self.rows):
            body: dict[str, Any] = {}
            for column in self.columns:
                cell = column.cells[row]
                if cell == "":
                    continue
                if column.has_unit:
                    quantity: dict[str, Any] = {"value": _number(cell, column.name, row)}
                    if column.unit:
                        quantity["unit"] = column.unit
                    _put(body, column, quantity)
                elif _INTEGER.match(cell):
                    _put(body, column, int(cell))
                elif _NUMBER.match(cell):
                    _put(body, column, _number(cell, column.name, row))
                else:
                    _put(body, column, cell)
            bodies.append(body)
        return bodies


def _number(cell: str, column: str, row: int) -> float:
    if not _NUMBER.match(cell):
        raise CsvError(
            422,
            f"column {column!r}, row {row + 1}: {cell!r} is not a number",
            column=column,
            row=row,
            value=cell,
        )
    value = float(cell)
    if not math.isfinite(value):
        raise CsvError(
            422,
            f"column {column!r}, row {row + 1}: {cell!r} is too large",
            column=column,
            row=row,
            value=cell,
        )
    return value


def _put(body: dict[str, Any], column: _Column, value: Any) -> None:
    node = body
    for part in column.path[:-1]:
        child = node.setdefault(part, {})
        if not isinstance(child, dict):
            raise CsvError(400, f"column {column.name!r} nests under a column that holds a value")
        node = child
    if column.path[-1] in node:
        raise CsvError(400, f"column {column.name!r} clashes with another column")
    node[column.path[-1]] = value


def _without_leading_statements(text: str) -> str:
    """``text`` less the ``#`` lines before its header (a CSV answer's statements)."""
    while text.startswith("#"):
        end = text.find("\n")
        text = "" if end < 0 else text[end + 1 :]
    return text


def parse_csv(data: bytes) -> CsvTable:
    """Read a CSV body: UTF-8 (a byte-order mark is fine), comma-separated, header first;
    ``#`` lines before the header (those of a CSV answer) are skipped.

    Raises
    ------
    CsvError
        400 for a malformed table (encoding, header, ragged rows), 422 for no rows.
    """
    try:
        text = data.decode("utf-8-sig")
    except UnicodeDecodeError:
        raise CsvError(400, "the CSV body is not UTF-8 text") from None
    text = _without_leading_statements(text)
    try:
        lines = [line for line in csv.reader(io.StringIO(text, newline="")) if any(line)]
    except csv.Error as error:
        raise CsvError(400, f"the CSV body cannot be read: {error}") from None
    if not lines:
        raise CsvError(400, "the CSV body is empty: it needs a header row and one row per case")
    header, rows = lines[0], lines[1:]
    parsed: list[tuple[str, tuple[str, ...], str | None, bool]] = []
    for name in (cell.strip() for cell in header):
        match = _HEADER.match(name)
        if match is None:
            raise CsvError(
                400,
                f"header {name!r} is not a field name with an optional [unit], "
                "e.g. temperature[degC]",
                column=name,
            )
        unit = match.group("unit")
        parsed.append(
            (
                name,
                tuple(match.group("path").split(".")),
                (unit.strip() or None) if unit is not None else None,
                unit is not None,
            )
        )
    paths = [path for _, path, _, _ in parsed]
    if len(set(paths)) != len(paths):
        raise CsvError(400, "the header names a field twice")
    if not rows:
        raise CsvError(422, "the CSV body has a header but no rows")
    for number, row in enumerate(rows, start=1):
        if len(row) != len(header):
            raise CsvError(
                400,
                f"row {number} has {len(row)} cells; the header has {len(header)}",
                row=number - 1,
            )
    columns = [
        _Column(name, path, unit, has_unit, [row[index].strip() for row in rows])
        for index, (name, path, unit, has_unit) in enumerate(parsed)
    ]
    return CsvTable(columns=columns, rows=len(rows))


# -- answers -> CSV ----------------------------------------------------------------------


def _cell(value: Any) -> str:
    if value is None:
        return ""
    if isinstance(value, bool):
        return "true" if value else "false"
    if isinstance(value, float):
        return repr(value)
    if isinstance(value, int | str):
        return str(value)
    return orjson.dumps(value).decode()


def _is_quantity(node: dict[str, Any]) -> bool:
    return (
        "unit" in node
        and ("value" in node or "values" in node)
        and set(node) <= {"value", "values", "unit", "uncertainty"}
    )


@dataclass
class _Flat:
    """Columns of one answer: a per-row list or one value for every row."""

    rows: int
    columns: dict[str, list[str] | str] = field(default_factory=dict)

    def add(self, name: str, value: list[Any] | Any) -> None:
        if isinstance(value, list):
            if len(value) == self.rows and self.rows > 1:
                self.columns[name] = [_cell(item) for item in value]
            else:
                self.columns[name] = _ARRAY_JOIN.join(_cell(item) for item in value)
        else:
            self.columns[name] = _cell(value)


def _rows_of(node: Any) -> int:
    """Number of rows an answer spans: the length of its batch arrays (1 if none)."""
    longest = 1
    stack = [node]
    while stack:
        item = stack.pop()
        if isinstance(item, dict):
            values = item.get("values")
            if _is_quantity(item) and isinstance(values, list):
                longest = max(longest, len(values))
            else:
                stack.extend(item.values())
    return longest


def _warnings_by_row(warnings: list[Any], rows: int) -> list[str]:
    cells = []
    for row in range(rows):
        applying = [
            f"{warning.get('code')}: {warning.get('message')}"
            for warning in warnings
            if isinstance(warning, dict)
            and (warning.get("indices") is None or row in warning.get("indices", []))
        ]
        cells.append(_JOIN.join(applying))
    return cells


def _walk(node: Any, path: str, flat: _Flat) -> None:
    if isinstance(node, dict):
        if _is_quantity(node):
            name = f"{path}[{node['unit']}]"
            values = node.get("values")
            flat.add(name, values if isinstance(values, list) else node.get("value"))
            return
        for key, child in node.items():
            _walk(child, f"{path}.{key}" if path else str(key), flat)
    elif isinstance(node, list):
        if path == "warnings":
            cells = _warnings_by_row(node, flat.rows)
            flat.add(path, cells if flat.rows > 1 else cells[0])
        elif node and all(isinstance(item, dict) for item in node):
            # Each item flattened on its own (quantities keep their [unit] columns), then
            # the items' cells joined: stages.end_temperature[degC] = "0.01 | -10.0".
            parts = []
            for item in node:
                part = _Flat(rows=1)
                _walk(item, path, part)
                parts.append(part)
            names = list(dict.fromkeys(name for part in parts for name in part.columns))
            for name in names:
                flat.columns[name] = _JOIN.join(str(part.columns.get(name, "")) for part in parts)
        elif path in _JOINED_LISTS:
            flat.columns[path] = _JOIN.join(_cell(item) for item in node)
        else:
            flat.add(path, node)
    else:
        flat.add(path, node)


def flatten_answers(answers: Sequence[dict[str, Any]]) -> tuple[list[str], list[list[str]]]:
    """Header and rows for JSON answers: each answer gives its batch rows (or one row).

    Columns appear in the order the answers first name them; a column an answer lacks is
    empty on its rows.
    """
    flats = []
    for answer in answers:
        flat = _Flat(rows=_rows_of(answer))
        results = {key: value for key, value in answer.items() if key not in _ENVELOPE_ORDER}
        envelope = {key: answer[key] for key in _ENVELOPE_ORDER if key in answer}
        _walk(results, "", flat)
        _walk(envelope, "", flat)
        flats.append(flat)
    header = list(dict.fromkeys(name for flat in flats for name in flat.columns))
    # A failed row's error columns (row_errors=include) go last, whichever row came first.
    header = [name for name in header if not name.startswith("error.")] + [
        name for name in header if name.startswith("error.")
    ]
    rows: list[list[str]] = []
    for flat in flats:
        for row in range(flat.rows):
            line = []
            for name in header:
                value = flat.columns.get(name, "")
                line.append(value[row] if isinstance(value, list) else value)
            rows.append(line)
    return header, rows


_PER_ROW = frozenset({"warnings"})
"""Envelope members that always stay columns: they say which rows they concern."""
_PREAMBLE_INTRO = (
    "# tripoint CSV answer. Lines starting with # state, once, what holds for every row "
    "(name: JSON value); the table follows."
)


def split_statements(
    answers: Sequence[dict[str, Any]],
) -> tuple[list[tuple[str, Any]], list[dict[str, Any]]]:
    """Take out of the answers the envelope members that are the same in all of them.

    The reference state, assumptions, property sources, uncertainty and each ``meta``
    member are stated once (returned as ``(name, value)`` pairs, ``meta.x`` for a meta
    member) when every answered row has the same value; a member that differs between
    answers (a per-row route's calculation ids) stays in them, to become a column.
    ``warnings`` always stays (each row gets the warnings that apply to it); rows that
    failed (``row_errors=include``) carry no envelope and do not count.
    """
    answered = [answer for answer in answers if "error" not in answer]
    if not answered:
        return [], list(answers)
    candidates: list[tuple[str, ...]] = []
    for key in _ENVELOPE_ORDER:
        if key in _PER_ROW or key not in answered[0]:
            continue
        if key == "meta" and isinstance(answered[0][key], dict):
            candidates += [("meta", name) for name in answered[0]["meta"]]
        else:
            candidates.append((key,))
    stated: list[tuple[str, Any]] = []
    for path in candidates:
        values = [member_at(answer, path) for answer in answered]
        first = orjson.dumps(values[0])
        if values[0] is MISSING or any(orjson.dumps(item) != first for item in values[1:]):
            continue
        stated.append((".".join(path), values[0]))
    taken = {name for name, _ in stated}
    remaining = []
    for answer in answers:
        kept = {key: value for key, value in answer.items() if key not in taken}
        if isinstance(kept.get("meta"), dict):
            kept["meta"] = {
                name: value for name, value in kept["meta"].items() if f"meta.{name}" not in taken
            }
            if not kept["meta"]:
                del kept["meta"]
        remaining.append(kept)
    return stated, remaining


def _table_bytes(answers: list[dict[str, Any]]) -> bytes:
    stated, remaining = split_statements(answers)
    return render_csv(*flatten_answers(remaining), statements=stated)


def answer_csv(answer: dict[str, Any], part: str | None = None) -> bytes:
    """One JSON answer as the CSV its route answers for ``Accept: text/csv`` (only its
    ``part`` member when the route's :attr:`CsvRoute.answer_part` names one)."""
    return _table_bytes([answer if part is None else _part_of(answer, part)])


def render_csv(
    header: Sequence[str],
    rows: Sequence[Sequence[str]],
    statements: Sequence[tuple[str, Any]] = (),
) -> bytes:
    """RFC 4180 text: CRLF line ends, quotes where needed, UTF-8.

    ``statements`` (from :func:`split_statements`) go first, one ``# name: JSON`` line
    each after an explaining line, so that a reader skipping ``#`` lines (pandas
    ``read_csv(comment="#")``) sees the table alone.
    """
    buffer = io.StringIO()
    if statements:
        buffer.write(_PREAMBLE_INTRO + "\r\n")
        for name, value in statements:
            buffer.write(f"# {name}: {orjson.dumps(value).decode()}\r\n")
    writer = csv.writer(buffer, lineterminator="\r\n")
    writer.writerow(header)
    writer.writerows(rows)
    return buffer.getvalue().encode()


def prefers_csv(
    accept: str | None, available: Sequence[str] = ("application/json", CSV_MEDIA_TYPE)
) -> bool:
    """Whether ``text/csv`` is the media type chosen for ``accept`` among ``available``
    (the route's media types, JSON first; :func:`negotiation.choose_media_type`)."""
    return choose_media_type(accept, available) == CSV_MEDIA_TYPE


# -- the middleware ----------------------------------------------------------------------


@dataclass
class _Conversion:
    """One CSV request in progress.

    ``messages`` collects the answer, sent only once the conversion ended within the time
    limit; ``abandoned`` tells a conversion overtaken by the limit to start no more route
    calls; ``current`` is the scope of the route call running (its route names the
    request in metrics and logs).
    """

    messages: list[Message] = field(default_factory=list)
    abandoned: bool = False
    current: Scope | None = None
    wants_csv: bool = False
    query_string: bytes | None = None
    """The query the route sees: the request's, less the CSV options (None: unchanged)."""

    async def send(self, message: Message) -> None:
        self.messages.append(message)


@dataclass
class _Captured:
    status: int = 500
    headers: list[tuple[bytes, bytes]] = field(default_factory=list)
    body: bytearray = field(default_factory=bytearray)

    @property
    def media_type(self) -> str:
        for name, value in self.headers:
            if name.lower() == b"content-type":
                return value.decode("latin-1").split(";")[0].strip().lower()
        return ""


def _with_headers(
    headers: list[tuple[bytes, bytes]], content_type: str, length: int
) -> list[tuple[bytes, bytes]]:
    kept = [(n, v) for n, v in headers if n.lower() not in (b"content-type", b"content-length")]
    return [
        *kept,
        (b"content-type", content_type.encode()),
        (b"content-length", str(length).encode()),
    ]


class CsvAdapter:
    """ASGI middleware turning CSV bodies into JSON requests and JSON answers into CSV.

    A CSV request is held to the computation time limit as a whole, however many route
    calls its rows make (503 at the limit, as one route call would answer).

    Parameters
    ----------
    routes
        Which paths speak CSV, and how.
    max_rows
        Most rows one CSV body may hold (413 above; setting TRIPOINT_MAX_CSV_ROWS).
    seconds
        Computation time allowed per request (setting TRIPOINT_MAX_REQUEST_SECONDS).
    pending
        Where computations abandoned at the limit are kept for shutdown to wait for.
    """

    def __init__(
        self,
        app: ASGIApp,
        routes: Sequence[CsvRoute],
        max_rows: int,
        seconds: float,
        pending: set[asyncio.Task[Any]],
    ) -> None:
        self.app = app
        self.routes = tuple(routes)
        self.max_rows = max_rows
        self.seconds = seconds
        self.pending = pending

    def _route(self, path: str) -> CsvRoute | None:
        return next((route for route in self.routes if route.matches(path)), None)

    async def __call__(self, scope: Scope, receive: Receive, send: Send) -> None:
        route = self._route(scope.get("path", "")) if scope["type"] == "http" else None
        if route is None:
            await self.app(scope, receive, send)
            return
        head = request_head(scope)
        content_type = (head.content_type or "").split(";")[0].strip().lower()
        sends_csv = scope.get("method") == "POST" and content_type == CSV_MEDIA_TYPE
        chosen = scope.get("state", {}).get(CHOSEN_MEDIA_TYPE)
        # The media type the negotiation chose among all the route answers in (plots
        # included); without it (the adapter alone), between JSON and CSV.
        wants_csv = chosen == CSV_MEDIA_TYPE if chosen is not None else prefers_csv(head.accept)
        if not sends_csv and not wants_csv:
            await self.app(scope, receive, send)
            return
        conversion = _Conversion(wants_csv=wants_csv)
        set_deadline(self.seconds)  # every route call of this request shares one deadline
        try:
            await run_within_limit(
                self._convert(scope, receive, conversion, route, sends_csv, wants_csv),
                seconds=self.seconds,
                pending=self.pending,
                path=scope["path"],
            )
        except TimeLimitExceededError as late:
            conversion.abandoned = True
            if conversion.current is not None:
                _copy_route(conversion.current, scope)
            await send_problem(
                scope,
                send,
                status=late.status,
                slug=late.slug,
                title=late.title,
                detail=late.detail,
                headers=late.headers,
            )
            return
        for message in conversion.messages:
            await send(message)

    async def _convert(
        self,
        scope: Scope,
        receive: Receive,
        conversion: _Conversion,
        route: CsvRoute,
        sends_csv: bool,
        wants_csv: bool,
    ) -> None:
        """Run the route for the CSV body (once, or once per row); collect the answer."""
        send = conversion.send
        if not sends_csv:
            captured = await self._call(scope, receive, None, conversion)
            await self._answer(send, [captured], route, wants_csv=True)
            return
        text = await _read_body(receive)
        if text is None or conversion.abandoned:
            return  # the client left, or the limit passed, before the body was all in
        try:
            options = _CsvOptions.read(scope)
            conversion.query_string = options.remaining
            # Reading and writing a table is CPU work: in a worker thread, off the event loop.
            table = await anyio.to_thread.run_sync(parse_csv, text)
            if table.rows > self.max_rows:
                await send_problem(
                    scope,
                    send,
                    status=413,
                    slug="too-many-points",
                    title="Batch too large",
                    detail=f"The CSV body has {table.rows} rows; the limit is {self.max_rows} "
                    "(setting TRIPOINT_MAX_CSV_ROWS).",
                    errors=[
                        FieldError(
                            field="body",
                            message="too many rows",
                            value=table.rows,
                            maximum=self.max_rows,
                        )
                    ],
                )
                return
            bodies = table.row_bodies() if route.one_call_per_row else [table.batch_body()]
            bodies = [options.applied(body) for body in bodies]
        except CsvError as error:
            await send_problem(
                scope,
                send,
                status=error.status,
                slug="malformed-csv" if error.status == 400 else "invalid-csv",
                title="Malformed CSV body" if error.status == 400 else "Unreadable CSV value",
                detail=error.detail,
                errors=[
                    FieldError(
                        field=error.column,
                        message=error.detail,
                        value=error.value,
                        index=None if error.row is None else error.row + 1,
                    )
                ],
            )
            return
        results: list[_Captured] = []
        for row, body in enumerate(bodies):
            if conversion.abandoned:
                return  # answered 503 already: compute (and store) no more rows
            captured = await self._call(scope, receive, orjson.dumps(body), conversion)
            if captured.status != 200:
                if not route.one_call_per_row and options.include_errors and captured.status == 422:
                    # One bad row fails a batch: answer the rows one by one instead.
                    await self._rows_one_by_one(scope, receive, conversion, table, options)
                    return
                _mark_row(captured, row if route.one_call_per_row else None)
                if not options.include_errors or captured.status >= 500:
                    await self._forward(send, captured)
                    return
            results.append(captured)
        await self._answer(
            send, results, route, wants_csv=wants_csv, as_list=route.one_call_per_row
        )

    async def _rows_one_by_one(
        self,
        scope: Scope,
        receive: Receive,
        conversion: _Conversion,
        table: CsvTable,
        options: _CsvOptions,
    ) -> None:
        """A batch route called once per row, each bad row answered by its problem."""
        route = self._route(scope["path"])
        assert route is not None
        results = []
        for row in range(table.rows):
            if conversion.abandoned:
                return
            body = options.applied(table.single_row(row).batch_body())
            captured = await self._call(scope, receive, orjson.dumps(body), conversion)
            if captured.status != 200:
                _mark_row(captured, row)
                if captured.status >= 500:
                    await self._forward(conversion.send, captured)
                    return
            results.append(captured)
        await self._answer(
            conversion.send, results, route, wants_csv=conversion.wants_csv, as_list=True
        )

    async def _call(
        self, scope: Scope, receive: Receive, body: bytes | None, conversion: _Conversion
    ) -> _Captured:
        """Run the route with ``body`` as its JSON body (None: the original body)."""
        inner = dict(scope)
        if conversion.query_string is not None:
            inner["query_string"] = conversion.query_string
        conversion.current = inner
        replaced = (b"accept",) if body is None else (b"accept", b"content-type", b"content-length")
        headers = [
            (name, value) for name, value in scope.get("headers", []) if name not in replaced
        ]
        headers.append((b"accept", b"application/json"))
        if body is not None:
            headers += [
                (b"content-type", b"application/json"),
                (b"content-length", str(len(body)).encode()),
            ]
        inner["headers"] = headers
        delivered = False

        async def inner_receive() -> Message:
            nonlocal delivered
            if body is None or delivered:
                return await receive()
            delivered = True
            return {"type": "http.request", "body": body, "more_body": False}

        captured = _Captured()

        async def capture(message: Message) -> None:
            if message["type"] == "http.response.start":
                captured.status = int(message["status"])
                captured.headers = list(message.get("headers", []))
            elif message["type"] == "http.response.body":
                captured.body += message.get("body", b"")

        await self.app(inner, inner_receive, capture)
        _copy_route(inner, scope)
        return captured

    async def _forward(self, send: Send, captured: _Captured) -> None:
        body = bytes(captured.body)
        headers = [(n, v) for n, v in captured.headers if n.lower() != b"content-length"] + [
            (b"content-length", str(len(body)).encode())
        ]
        await send({"type": "http.response.start", "status": captured.status, "headers": headers})
        await send({"type": "http.response.body", "body": body})

    async def _answer(
        self,
        send: Send,
        results: list[_Captured],
        route: CsvRoute,
        *,
        wants_csv: bool,
        as_list: bool = False,
    ) -> None:
        first = results[0]
        good = [item for item in results if item.status == 200]
        if (not as_list and first.status != 200) or any(
            item.media_type != "application/json" for item in good
        ):
            await self._forward(send, first)
            return
        answers = [
            orjson.loads(bytes(item.body)) if item.status == 200 else _row_error(item)
            for item in results
        ]
        if wants_csv:
            if route.answer_part is not None:
                answers = [
                    answer if "error" in answer else _part_of(answer, route.answer_part)
                    for answer in answers
                ]
            body = await anyio.to_thread.run_sync(_table_bytes, answers)
            content_type = _CSV_RESPONSE_TYPE
        elif as_list:
            body = orjson.dumps(
                [
                    answer if item.status == 200 else orjson.loads(bytes(item.body))
                    for answer, item in zip(answers, results, strict=True)
                ]
            )
            content_type = "application/json"
        else:
            await self._forward(send, first)
            return
        headers = _with_headers((good or results)[0].headers, content_type, len(body))
        await send({"type": "http.response.start", "status": 200, "headers": headers})
        await send({"type": "http.response.body", "body": body})


def _row_error(captured: _Captured) -> dict[str, Any]:
    """A failed row as the columns ``error.status``, ``error.field``, ``error.detail``."""
    try:
        problem = orjson.loads(bytes(captured.body))
    except orjson.JSONDecodeError:
        problem = {}
    errors = problem.get("errors") or [{}]
    fields = ", ".join(str(item.get("field", "")) for item in errors if isinstance(item, dict))
    return {
        "error": {
            "status": captured.status,
            "field": fields,
            "detail": str(problem.get("detail", "")),
        }
    }


@dataclass(frozen=True)
class _CsvOptions:
    """What the query of a CSV request asks for the whole request."""

    output_units: str | None
    include_errors: bool
    remaining: bytes

    @classmethod
    def read(cls, scope: Scope) -> _CsvOptions:
        """Read ``output_units`` and ``row_errors``; the rest is the route's.

        Raises
        ------
        CsvError
            422 for a value outside the choices.
        """
        pairs = parse_qsl(bytes(scope.get("query_string", b"")).decode("latin-1"))
        mine = {name: value for name, value in pairs if name in ("output_units", "row_errors")}
        units = mine.get("output_units")
        if units is not None and units not in _UNIT_SETS:
            raise CsvError(
                422,
                f"output_units must be one of {', '.join(_UNIT_SETS)}",
                column="output_units",
                value=units,
            )
        row_errors = mine.get("row_errors", "stop")
        if row_errors not in _ROW_ERRORS:
            raise CsvError(
                422,
                "row_errors must be 'stop' (one bad row fails the request) or 'include' (each "
                "bad row answered with its error, the good rows computed)",
                column="row_errors",
                value=row_errors,
            )
        rest = [(name, value) for name, value in pairs if name not in mine]
        return cls(units, row_errors == "include", urlencode(rest).encode("latin-1"))

    def applied(self, body: dict[str, Any]) -> dict[str, Any]:
        """``body`` with the request's ``output_units`` (a column saying otherwise: 422)."""
        if self.output_units is None:
            return body
        given = body.get("output_units")
        if given is not None and given != self.output_units:
            raise CsvError(
                422,
                f"the output_units column says {given!r} but the query says "
                f"{self.output_units!r}; give one of them",
                column="output_units",
                value=str(given),
            )
        return {**body, "output_units": self.output_units}


def _part_of(answer: dict[str, Any], part: str) -> dict[str, Any]:
    """The ``part`` member of an answer, led by the answer's calculation id; the whole
    answer when it has no such member (a sweep answers its cases as ``values``)."""
    if part not in answer:
        return answer
    calculation_id = answer.get("meta", {}).get("calculation_id")
    selected = answer.get(part)
    body = selected if isinstance(selected, dict) else {part: selected}
    return {"calculation_id": calculation_id, **body}


def _copy_route(inner: Scope, scope: Scope) -> None:
    """Give the request's scope the route the inner call matched (for metrics and logs)."""
    for key in ("route", "endpoint", "path_params"):
        if key in inner:
            scope[key] = inner[key]


async def _read_body(receive: Receive) -> bytes | None:
    """The whole request body; None when the client disconnects before it is all in."""
    chunks = bytearray()
    while True:
        message = await receive()
        if message["type"] == "http.disconnect":
            return None
        chunks += message.get("body", b"")
        if not message.get("more_body", False):
            return bytes(chunks)


def _mark_row(captured: _Captured, row: int | None) -> None:
    """Say in a problem document which CSV row (data rows from 1) it concerns.

    ``row`` is the 0-based row of a per-row call; ``None`` for a batch call, whose
    errors name the batch element (0-based), which is the row before it.
    """
    if captured.media_type != PROBLEM_MEDIA_TYPE:
        return
    try:
        problem = orjson.loads(bytes(captured.body))
    except orjson.JSONDecodeError:
        return

    def as_rows(text: str) -> str:
        return _ELEMENT.sub(lambda match: f"(CSV row {int(match.group(1)) + 1})", text)

    detail = as_rows(str(problem.get("detail", "")))
    problem["detail"] = detail if row is None else f"CSV row {row + 1}: {detail}"
    for error in problem.get("errors") or []:
        if not isinstance(error, dict):
            continue
        if isinstance(error.get("message"), str):
            error["message"] = as_rows(error["message"])
        if row is not None:
            error["index"] = row + 1
        elif isinstance(error.get("index"), int):
            error["index"] += 1
    captured.body = bytearray(orjson.dumps(problem))


def document_csv(schema: dict[str, Any], routes: Sequence[CsvRoute]) -> None:
    """Declare ``text/csv`` request bodies and answers on the CSV routes."""
    for path, operations in schema.get("paths", {}).items():
        route = next((item for item in routes if item.matches(path)), None)
        if route is None:
            continue
        for method, operation in operations.items():
            request_body = operation.get("requestBody")
            if method == "post" and request_body is not None:
                request_body.setdefault("content", {})[CSV_MEDIA_TYPE] = {
                    "schema": {
                        "type": "string",
                        "description": (
                            "One case per row; header = field names with the unit in brackets, "
                            "e.g. `temperature[degC]`; dotted names nest."
                            + (
                                " The route is called once per row."
                                if route.one_call_per_row
                                else " Columns become batches."
                            )
                        ),
                    }
                }
                operation.setdefault("responses", {}).setdefault(
                    "400", problem_answer("Malformed CSV body (encoding, header, ragged rows).")
                )
            answer = operation.get("responses", {}).get("200")
            if answer is not None:
                answer.setdefault("content", {})[CSV_MEDIA_TYPE] = {
                    "schema": {
                        "type": "string",
                        "description": "Sent for `Accept: text/csv`: columns `path[unit]`, "
                        "one row per case.",
                    }
                }
