"""JSON bodies read by orjson (service/api/http/strict_query.py, read_json_body) answer as
FastAPI's own reading with the standard library's ``json`` does: the same values for good
bodies, the same problem for bodies orjson and ``json`` read differently or refuse.

Each body is sent twice to the same application, once as it runs and once with the orjson
reading switched off; the answers may differ only in ``meta.time``.
"""

from __future__ import annotations

import json
import re

import orjson
import pytest
from fastapi.testclient import TestClient

from service.api.http import strict_query

_TIME = re.compile(rb"\d{4}-\d\d-\d\dT\d\d:\d\d:\d\d\.\d{3}Z")
_SATURATION = "/v1/properties/saturation"
_JSON = {"content-type": "application/json", "accept-encoding": "identity"}

_BODIES: list[tuple[str, bytes]] = [
    ("batch", b'{"temperature": {"values": [280.0, 300.5], "unit": "K"}}'),
    ("units", b'{"temperature": "25 degC", "output_units": "engineering"}'),
    ("duplicate-key-last-wins", b'{"temperature": 300, "temperature": 310}'),
    ("nan-literal", b'{"temperature": NaN}'),
    ("infinity-literal", b'{"temperature": Infinity}'),
    ("overflowing-float", b'{"temperature": 1e400}'),
    # Beyond 64 bits: json reads an int, orjson would read a float.
    ("huge-integer", b'{"temperature": 123456789012345678901234567890}'),
    (
        "huge-integer-echoed",
        b'{"temperature": 300, "output_units": 123456789012345678901234567890}',
    ),
    ("lone-surrogate", b'{"temperature": "\\ud800"}'),
    ("utf-16", '{"temperature": 300}'.encode("utf-16")),
    ("trailing-comma", b'{"temperature": 300,}'),
    ("truncated", b'{"temperature": '),
    ("not-an-object", b"[300]"),
]
BODIES = [pytest.param(body, id=name) for name, body in _BODIES]


def _answer(client: TestClient, body: bytes) -> tuple[int, bytes]:
    answer = client.post(
        _SATURATION, content=body, headers={**_JSON, "x-request-id": "json-body-case"}
    )
    return answer.status_code, _TIME.sub(b"<time>", answer.content)


@pytest.mark.parametrize("body", BODIES)
def test_orjson_reading_answers_as_the_standard_reading(
    client: TestClient, monkeypatch: pytest.MonkeyPatch, body: bytes
) -> None:
    fast = _answer(client, body)

    async def standard_only(request: object) -> None:
        return None

    monkeypatch.setattr(strict_query, "read_json_body", standard_only)
    standard = _answer(client, body)
    assert fast == standard


def test_the_bodies_cover_good_and_refused_input(client: TestClient) -> None:
    """Not vacuous: good bodies answer 200, malformed ones 400, bad values 422."""
    statuses = {_answer(client, body)[0] for _, body in _BODIES}
    assert {200, 400, 422} <= statuses


def test_orjson_and_json_read_the_batch_alike() -> None:
    """The premise (orjson's documented float parsing, correctly rounded as json's)."""
    body = json.dumps({"values": [280.0 + index / 7 for index in range(1000)]}).encode()
    assert orjson.loads(body) == json.loads(body)
