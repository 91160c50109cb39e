"""Reading a CSV answer as a client would: the ``#`` statement lines, then the table."""

from __future__ import annotations

import csv
import io
import json
import re
from dataclasses import dataclass
from typing import Any

_STATEMENT = re.compile(r"^# (?P<name>[A-Za-z_][A-Za-z0-9_.]*): (?P<value>.*)$")


@dataclass(frozen=True)
class CsvAnswer:
    """The statements stated once (``name`` -> JSON value) and the rows below the header."""

    statements: dict[str, Any]
    header: list[str]
    rows: list[dict[str, str]]


def read_csv_answer(text: str) -> CsvAnswer:
    """Split a CSV answer into its ``#`` statements and its table (stdlib csv only)."""
    statements: dict[str, Any] = {}
    lines = text.splitlines(keepends=True)
    start = 0
    while start < len(lines) and lines[start].startswith("#"):
        match = _STATEMENT.match(lines[start].rstrip("\r\n"))
        if match is not None:
            statements[match.group("name")] = json.loads(match.group("value"))
        start += 1
    table = "".join(lines[start:])
    header = next(csv.reader(io.StringIO(table)), [])
    rows = list(csv.DictReader(io.StringIO(table)))
    return CsvAnswer(statements=statements, header=header, rows=rows)
