"""ETag, Cache-Control and 304 on the GET lookups; gzip for larger answers
(RFC 9110 §8.8.3 ETag, §13.1.2 If-None-Match, §15.4.5 304, §8.4 Content-Encoding;
RFC 9111 §5.2 Cache-Control; RFC 1952 gzip)."""

from __future__ import annotations

import gzip
from pathlib import Path
from typing import Any

import orjson
import pytest
from fastapi.testclient import TestClient
from operations_support import KEY, running_client

from service.api.http.caching import entity_tag, if_none_match_hits
from service.api.http.compression import accepts_gzip

LOOKUP = "/v1/properties/saturation?temperature=300"
IDENTITY = {"accept-encoding": "identity"}
GZIP = {"accept-encoding": "gzip"}


def test_lookup_carries_a_weak_etag_and_public_freshness(client: TestClient) -> None:
    first = client.get(LOOKUP)
    second = client.get(LOOKUP)
    tag = first.headers["etag"]
    # §8.8.3: entity-tag = [ weak ] opaque-tag; weak = "W/".
    assert tag.startswith('W/"') and tag.endswith('"')
    assert second.headers["etag"] == tag, "same query, same tag"
    # RFC 9111 §5.2.2.9 public, §5.2.2.1 max-age.
    assert first.headers["cache-control"] == "public, max-age=3600"


def test_tag_changes_with_the_query_and_the_media_type(client: TestClient) -> None:
    json_tag = client.get(LOOKUP).headers["etag"]
    other = client.get("/v1/properties/saturation?temperature=301").headers["etag"]
    csv_tag = client.get(LOOKUP, headers={"accept": "text/csv"}).headers["etag"]
    assert len({json_tag, other, csv_tag}) == 3


@pytest.mark.parametrize(
    "condition",
    [
        pytest.param("{tag}", id="same-tag"),
        pytest.param('"other", {tag}', id="in-a-list"),
        pytest.param("{strong}", id="weak-comparison-ignores-W"),
        pytest.param("*", id="any"),
    ],
)
def test_if_none_match_answers_304_without_body(client: TestClient, condition: str) -> None:
    answer = client.get(LOOKUP)
    tag = answer.headers["etag"]
    header = condition.format(tag=tag, strong=tag.removeprefix("W/"))
    again = client.get(LOOKUP, headers={"if-none-match": header})
    # §13.1.2: a GET whose If-None-Match matches is answered 304 (§15.4.5): no body, the
    # ETag, Cache-Control and Vary the 200 would have carried.
    assert again.status_code == 304
    assert again.content == b""
    assert again.headers["etag"] == tag
    assert again.headers["cache-control"] == answer.headers["cache-control"]
    assert "accept" in again.headers["vary"].lower()


def test_a_different_tag_gets_the_full_answer(client: TestClient) -> None:
    again = client.get(LOOKUP, headers={"if-none-match": 'W/"not-this-one"'})
    assert again.status_code == 200
    assert again.json()["temperature"]["value"] == 300.0


@pytest.mark.parametrize(
    ("method", "path"),
    [
        pytest.param("GET", "/v1/properties/saturation?temperature=9999", id="refused-lookup"),
        pytest.param("POST", "/v1/properties/saturation", id="post"),
        pytest.param("GET", "/health", id="health"),
        pytest.param("GET", "/v1/calculations", id="records"),
    ],
)
def test_no_validators_outside_successful_lookups(
    client: TestClient, method: str, path: str
) -> None:
    response = client.request(method, path, json={"temperature": 300})
    assert "etag" not in response.headers
    assert "cache-control" not in response.headers


def test_keyed_service_marks_lookups_private(tmp_path: Path) -> None:
    # RFC 9111 §3.5: "public" would let a shared cache answer a request without a key.
    with running_client(tmp_path, api_keys=KEY) as keyed:
        answer = keyed.get(LOOKUP, headers={"Authorization": f"Bearer {KEY}"})
        unauthorized = keyed.get(LOOKUP, headers={"if-none-match": "*"})
    assert answer.headers["cache-control"] == "private, max-age=3600"
    assert unauthorized.status_code == 401, "a 304 is never given without the key"


def test_weak_comparison_helper() -> None:
    tag = entity_tag("1.0", "/v1/properties/saturation", b"temperature=300", "application/json")
    assert if_none_match_hits(tag, tag)
    assert if_none_match_hits(tag.removeprefix("W/"), tag)
    assert not if_none_match_hits('"abc"', tag)
    assert tag != entity_tag("1.1", "/v1/properties/saturation", b"temperature=300", "x")


# -- gzip (RFC 9110 §8.4.1.3, §12.5.3 Accept-Encoding) ---------------------------------


def test_large_answer_is_gzipped_for_a_client_that_accepts_it(client: TestClient) -> None:
    plain = client.get(LOOKUP, headers=IDENTITY)
    # The transport layer of the test client would undo the coding: read the raw bytes.
    with client.stream("GET", LOOKUP, headers=GZIP) as packed:
        raw = b"".join(packed.iter_raw())
        headers = packed.headers
    assert len(plain.content) > 1024
    assert headers["content-encoding"] == "gzip"
    assert "accept-encoding" in headers["vary"].lower()
    assert int(headers["content-length"]) == len(raw) < len(plain.content)
    assert raw[:2] == b"\x1f\x8b"  # RFC 1952 §2.3.1 ID1 ID2
    decoded = gzip.decompress(raw)
    assert decoded.count(b'"temperature"') == plain.content.count(b'"temperature"')
    assert "content-encoding" not in plain.headers


def test_a_large_answer_is_compressed_off_the_event_loop_and_decodes_whole(
    client: TestClient, monkeypatch: pytest.MonkeyPatch
) -> None:
    # A 10,000-point batch (2.3 MB): compressed at the fast level in a worker thread; the
    # decoded bytes are the answer's own (its meta aside: each answer has its own id).
    import asyncio

    where: list[str] = []
    compress = gzip.compress

    def recording(data: bytes, *args: Any, **kwargs: Any) -> bytes:
        try:
            asyncio.get_running_loop()
            where.append("event loop")
        except RuntimeError:
            where.append("worker thread")
        return compress(data, *args, **kwargs)

    monkeypatch.setattr(gzip, "compress", recording)  # the module compression uses
    body = {"temperature": {"values": [280.0 + 0.009 * i for i in range(10_000)], "unit": "K"}}
    with client.stream("POST", "/v1/properties/saturation", json=body, headers=GZIP) as packed:
        raw = b"".join(packed.iter_raw())
        assert packed.headers["content-encoding"] == "gzip"
    plain = client.post("/v1/properties/saturation", json=body, headers=IDENTITY).json()
    decoded = orjson.loads(gzip.decompress(raw))
    assert where == ["worker thread"], where
    decoded.pop("meta")
    plain.pop("meta")
    assert decoded == plain


def test_small_answers_and_refusing_clients_get_identity(client: TestClient) -> None:
    with client.stream("GET", "/health", headers=GZIP) as small:
        assert "content-encoding" not in small.headers
    with client.stream("GET", LOOKUP, headers={"accept-encoding": "gzip;q=0"}) as refused:
        assert "content-encoding" not in refused.headers


def test_problem_documents_are_gzipped_and_stay_problems(client: TestClient) -> None:
    # Forty unknown fields: one error each, a problem document well above a kilobyte.
    body = {"temperature": 300, **{f"oven_setting_{n}": n for n in range(40)}}
    with client.stream("POST", "/v1/properties/saturation", json=body, headers=GZIP) as refused:
        raw = b"".join(refused.iter_raw())
        headers = refused.headers
        assert refused.status_code == 422
    assert headers["content-type"] == "application/problem+json"
    assert headers["content-encoding"] == "gzip"
    problem = gzip.decompress(raw)
    assert problem.count(b"oven_setting_") >= 40


def test_head_keeps_the_coded_headers(client: TestClient) -> None:
    with client.stream("GET", LOOKUP, headers=GZIP) as got:
        length = got.headers["content-length"]
    head = client.head(LOOKUP, headers=GZIP)
    # §9.3.2: the GET's header fields. The answer's meta (time, ids) differs per request,
    # so its compressed length may differ by a few bytes.
    assert head.headers["content-encoding"] == "gzip"
    assert abs(int(head.headers["content-length"]) - int(length)) < 32
    assert head.content == b""


def test_gzip_header_carries_no_time_stamp(client: TestClient) -> None:
    # RFC 1952 §2.3.1: MTIME = 0 means no time stamp, so an answer's coding does not
    # depend on when it was sent.
    with client.stream("GET", "/v1/properties/constants", headers=GZIP) as answer:
        first = b"".join(answer.iter_raw())
    assert first[:2] == b"\x1f\x8b"
    assert first[4:8] == b"\x00\x00\x00\x00"


@pytest.mark.parametrize(
    ("header", "accepted"),
    [
        ("gzip", True),
        ("br, gzip;q=0.5", True),
        ("gzip;q=0", False),
        ("*", True),
        ("*;q=0", False),
        ("identity", False),
        ("gzip;q=0, *", False),
        (None, False),
    ],
)
def test_accept_encoding_reading(header: str | None, accepted: bool) -> None:
    # §12.5.3: q=0 refuses a coding; "*" stands for any coding not named.
    assert accepts_gzip(header) is accepted


def test_metrics_still_scrape_gzipped(client: TestClient) -> None:
    response = client.get("/metrics", headers=GZIP)  # the client decodes
    assert response.status_code == 200
    assert "tripoint_http_requests_total" in response.text


def test_streamed_file_is_gzipped_chunk_by_chunk(client: TestClient) -> None:
    # The docs script is sent as a file, in several body messages: the streamed path.
    asset = "/docs-assets/swagger-ui-bundle.js"
    plain = client.get(asset, headers=IDENTITY)
    with client.stream("GET", asset, headers=GZIP) as packed:
        raw = b"".join(packed.iter_raw())
        headers = packed.headers
    assert headers["content-encoding"] == "gzip"
    assert "content-length" not in headers or int(headers["content-length"]) == len(raw)
    assert gzip.decompress(raw) == plain.content
    assert len(raw) < len(plain.content) / 2


def test_caching_is_documented_on_the_lookups_only(client: TestClient) -> None:
    paths = client.get("/openapi.json").json()["paths"]
    lookup = paths["/v1/properties/saturation"]["get"]
    assert {"ETag", "Cache-Control"} <= set(lookup["responses"]["200"]["headers"])
    assert "304" in lookup["responses"]
    assert "304" not in paths["/v1/properties/saturation"]["post"]["responses"]
    assert "304" not in paths["/v1/calculations"]["get"]["responses"]
