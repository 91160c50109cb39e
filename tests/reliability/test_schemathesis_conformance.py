"""Property-based HTTP fuzzing with schemathesis against the app's own /openapi.json.

Every operation the OpenAPI document lists (discovered, not listed here) gets generated
requests, valid and invalid; each answer must not be a 5xx, must use a status code and a
content type the document declares, must match the declared response schema, and a
request that breaks the schema must be refused. The run is bounded (``max_examples`` per
operation; ``TRIPOINT_SCHEMATHESIS_EXAMPLES`` raises it for a deeper local run) and
deterministic (``derandomize``).

Phases: the documented examples are each sent, and their answers checked, by
tests/api/test_openapi_examples.py, so schemathesis' example phase is off. Its coverage
phase (boundary and near-valid variants of every field, not bounded by ``max_examples``)
runs on the lookups and operations routes; on the balance and simulation routes, where
each valid case is a full calculation (seconds for some solute cases), only the bounded
fuzzing phase runs.
"""

from __future__ import annotations

import os
import shutil
import tempfile
from collections.abc import Iterator
from pathlib import Path
from typing import Any

import pytest
import schemathesis
from hypothesis import HealthCheck, settings
from schemathesis.checks import not_a_server_error
from schemathesis.specs.openapi.checks import (
    content_type_conformance,
    negative_data_rejection,
    response_headers_conformance,
    response_schema_conformance,
    status_code_conformance,
)

from service.api.app import create_app
from service.settings import Settings

MAX_EXAMPLES = int(os.environ.get("TRIPOINT_SCHEMATHESIS_EXAMPLES", "25"))
CHECKS = [
    not_a_server_error,
    status_code_conformance,
    content_type_conformance,
    response_headers_conformance,
    response_schema_conformance,
    negative_data_rejection,
]
_HEAVY = r"^/v1/(balances|simulations)/"

_RECORDS = Path(tempfile.mkdtemp(prefix="tripoint-schemathesis-"))
APP = create_app(
    Settings(
        max_batch_points=50,
        max_body_bytes=256 * 1024,
        max_request_seconds=20,
        database_url=f"sqlite:///{_RECORDS / 'records.sqlite3'}",
    )
)


def _load() -> schemathesis.BaseSchema:
    # Loaded at collection: schemathesis makes one test per operation it finds. (Its lazy
    # fixture loader does not run under pytest 9.)
    loaded = schemathesis.openapi.from_asgi("/openapi.json", APP)
    loaded.config.phases.examples.enabled = False
    return loaded


light_schema = _load().exclude(path_regex=_HEAVY)
heavy_schema = _load().include(path_regex=_HEAVY)
heavy_schema.config.phases.coverage.enabled = False

_BOUNDED = settings(
    max_examples=MAX_EXAMPLES,
    derandomize=True,
    database=None,
    deadline=None,
    suppress_health_check=list(HealthCheck),
)


@pytest.fixture(scope="module", autouse=True)
def _remove_records() -> Iterator[None]:
    yield
    shutil.rmtree(_RECORDS, ignore_errors=True)


@light_schema.parametrize()
@_BOUNDED
def test_lookups_and_operations_answer_as_documented(case: schemathesis.Case[Any]) -> None:
    case.call_and_validate(checks=CHECKS)


@heavy_schema.parametrize()
@_BOUNDED
def test_balances_and_simulations_answer_as_documented(case: schemathesis.Case[Any]) -> None:
    case.call_and_validate(checks=CHECKS)
