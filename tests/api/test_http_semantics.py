"""HTTP semantics every route keeps: Vary on negotiated answers, 406, HEAD, 405 with Allow,
CORS exposed headers (RFC 9110; the Fetch standard's CORS protocol)."""

from __future__ import annotations

from pathlib import Path
from typing import Any

import pytest
from fastapi.testclient import TestClient
from operations_support import running_client

from service.api.app import EXPOSED_HEADERS

SATURATION = "/v1/properties/saturation"
LOOKUP = f"{SATURATION}?temperature=300"
FLASH = "/v1/balances/flash-freeze"
CHAMBER = "/v1/simulations/vacuum-chamber"
BAKERY_CHAMBER: dict[str, Any] = {
    # A bakery's vacuum cooler: one tray of rolls at room temperature, pumped down.
    "chamber": {
        "free_volume": "400 L",
        "initial_pressure": "1013.25 mbar",
        "temperature": "22 degC",
    },
    "pump": {"nominal_speed": "150 m3/h", "ultimate_pressure": "10 Pa"},
    "product": {"mass": "0.8 kg", "initial_temperature": "22 degC"},
    "end_time": "10 min",
    "series_points": 20,
}


def _vary(response: Any) -> set[str]:
    return {part.strip().lower() for part in response.headers.get("vary", "").split(",")}


# -- Vary: Accept (RFC 9110 §12.5.5) ---------------------------------------------------


@pytest.mark.parametrize(
    ("method", "path", "headers"),
    [
        pytest.param("GET", LOOKUP, {}, id="lookup-json"),
        pytest.param("GET", LOOKUP, {"accept": "text/csv"}, id="lookup-csv"),
        pytest.param("GET", f"{SATURATION}?temperature=9999", {}, id="lookup-422"),
        pytest.param("GET", "/v1/properties/constants", {}, id="constants"),
        pytest.param("POST", FLASH, {}, id="balance-422"),
        pytest.param("PUT", SATURATION, {}, id="lookup-405"),
        pytest.param("GET", LOOKUP, {"accept": "image/gif"}, id="lookup-406"),
    ],
)
def test_negotiated_paths_vary_on_accept(
    client: TestClient, method: str, path: str, headers: dict[str, str]
) -> None:
    # RFC 9110 §12.5.5: an answer chosen by Accept says so in Vary, errors included, so a
    # cache never hands a CSV or a plot to a JSON client.
    response = client.request(method, path, headers=headers)
    assert "accept" in _vary(response), response.status_code


@pytest.mark.parametrize("path", ["/health", "/v1/calculations", "/openapi.json"])
def test_single_type_paths_do_not_vary_on_accept(client: TestClient, path: str) -> None:
    assert "accept" not in _vary(client.get(path))


# -- Accept and 406 (RFC 9110 §12.5.1, §15.5.7) ---------------------------------------


def test_json_refused_and_a_wildcard_gets_the_other_type(client: TestClient) -> None:
    # §12.5.1: q=0 means "not acceptable"; */*;q=0.1 still accepts CSV.
    response = client.get(LOOKUP, headers={"accept": "application/json;q=0, */*;q=0.1"})
    assert response.status_code == 200
    assert response.headers["content-type"].startswith("text/csv")


def test_nothing_acceptable_is_406_naming_the_types(client: TestClient) -> None:
    response = client.get(LOOKUP, headers={"accept": "image/gif"})
    assert response.status_code == 406
    assert response.headers["content-type"] == "application/problem+json"
    problem = response.json()
    assert problem["status"] == 406
    assert problem["errors"][0]["field"] == "Accept"
    assert problem["errors"][0]["value"] == "image/gif"
    assert "application/json" in problem["detail"] and "text/csv" in problem["detail"]


def test_plot_route_406_lists_its_plots(client: TestClient) -> None:
    response = client.post(CHAMBER, json=BAKERY_CHAMBER, headers={"accept": "image/gif"})
    assert response.status_code == 406
    for media in ("application/json", "text/csv", "image/svg+xml", "image/png"):
        assert media in response.json()["detail"]


def test_type_wildcard_selects_a_plot(client: TestClient) -> None:
    # §12.5.1: "image/*" matches every image subtype; JSON refused outright.
    response = client.post(
        CHAMBER, json=BAKERY_CHAMBER, headers={"accept": "application/json;q=0, image/*"}
    )
    assert response.status_code == 200, response.text
    assert response.headers["content-type"].startswith("image/")
    assert "accept" in _vary(response)
    assert response.headers["x-calculation-id"]


def test_a_sweep_has_no_plot_and_says_406(client: TestClient) -> None:
    sweep = {**BAKERY_CHAMBER, "product": {**BAKERY_CHAMBER["product"]}}
    sweep["product"]["mass"] = {"values": [0.8, 1.0], "unit": "kg"}
    response = client.post(CHAMBER, json=sweep, headers={"accept": "image/png"})
    assert response.status_code == 406
    assert response.json()["errors"][0]["field"] == "Accept"


def test_single_type_paths_ignore_accept(client: TestClient) -> None:
    # §12.5.1 lets a server disregard Accept; a route with one media type does.
    assert client.get("/health", headers={"accept": "image/gif"}).status_code == 200


# -- HEAD (RFC 9110 §9.3.2) -------------------------------------------------------------


@pytest.mark.parametrize(
    "path", [LOOKUP, "/v1/properties/constants", "/health", "/ready", "/v1/calculations"]
)
def test_head_answers_the_get_headers_without_a_body(client: TestClient, path: str) -> None:
    identity = {"accept-encoding": "identity"}  # uncoded: lengths comparable byte for byte
    got = client.get(path, headers=identity)
    head = client.head(path, headers=identity)
    assert head.status_code == got.status_code
    assert head.content == b""
    assert head.headers["content-type"] == got.headers["content-type"]
    assert head.headers["content-length"] == got.headers["content-length"]


def test_head_of_a_missing_record_is_404_without_body(client: TestClient) -> None:
    head = client.head("/v1/calculations/no-such-id")
    assert head.status_code == 404
    assert head.content == b""


# -- 405 and Allow (RFC 9110 §15.5.6, §10.2.1) ----------------------------------------


@pytest.mark.parametrize(
    ("method", "path", "allow"),
    [
        pytest.param("PUT", SATURATION, "GET, HEAD, POST", id="lookup-get-and-post"),
        pytest.param("DELETE", "/v1/properties/ice-fraction", "GET, HEAD, POST", id="ice"),
        pytest.param("POST", "/health", "GET, HEAD", id="health"),
        pytest.param("GET", FLASH, "POST", id="balance-post-only"),
        pytest.param("HEAD", FLASH, "POST", id="head-on-post-only"),
        pytest.param("POST", "/v1/calculations/some-id", "GET, HEAD", id="record"),
    ],
)
def test_405_allow_lists_every_method_of_the_path(
    client: TestClient, method: str, path: str, allow: str
) -> None:
    response = client.request(method, path)
    assert response.status_code == 405
    assert response.headers["allow"] == allow
    if method != "HEAD":
        problem = response.json()
        assert response.headers["content-type"] == "application/problem+json"
        assert problem["status"] == 405
        assert problem["errors"][0] == {**problem["errors"][0], "field": "method", "value": method}


def test_allowed_methods_really_answer(client: TestClient) -> None:
    # What Allow lists for the lookup path works: GET and POST both answer 200.
    assert client.get(LOOKUP).status_code == 200
    assert client.post(SATURATION, json={"temperature": 300}).status_code == 200


# -- CORS (Fetch standard, Access-Control-Expose-Headers) -------------------------------


def test_cors_exposes_the_calculation_and_request_ids(tmp_path: Path) -> None:
    origin = {"Origin": "https://lims.example.org"}
    with running_client(tmp_path, cors_origins="https://lims.example.org") as opened:
        answer = opened.get(LOOKUP, headers=origin)
    exposed = {
        part.strip().lower() for part in answer.headers["access-control-expose-headers"].split(",")
    }
    assert {"x-calculation-id", "x-request-id", "etag"} <= exposed
    assert {name.lower() for name in EXPOSED_HEADERS} == exposed
    # One Vary field lists both: the answer depends on Origin (CORS) and on Accept.
    assert {"origin", "accept"} <= _vary(answer)


# -- Request media type: 415 and 400 (RFC 9110 §15.5.16, §15.5.1) -----------------------


@pytest.mark.parametrize(
    ("path", "headers", "taken"),
    [
        pytest.param(SATURATION, {"content-type": "text/plain"}, "application/json, text/csv"),
        pytest.param(SATURATION, {"content-type": "application/xml"}, "application/json, text/csv"),
        pytest.param(SATURATION, {}, "application/json, text/csv", id="no-content-type"),
        pytest.param(FLASH, {"content-type": "application/x-www-form-urlencoded"}, "text/csv"),
        pytest.param(
            "/v1/calibrations/vacuum-chamber",
            {"content-type": "text/csv"},
            "application/json",
            id="csv-to-a-json-only-route",
        ),
    ],
)
def test_wrong_body_media_type_is_415(
    client: TestClient, path: str, headers: dict[str, str], taken: str
) -> None:
    # §15.5.16: the content is in a format the target resource does not support.
    response = client.post(path, content=b'{"temperature": 300}', headers=headers)
    assert response.status_code == 415, response.text
    assert response.headers["content-type"] == "application/problem+json"
    problem = response.json()
    assert problem["errors"][0]["field"] == "Content-Type"
    assert problem["errors"][0]["value"] == headers.get("content-type")
    assert taken in problem["detail"]


def test_csv_and_json_bodies_still_taken(client: TestClient) -> None:
    csv = client.post(
        SATURATION,
        content=b"temperature[degC]\n20\n",
        headers={"content-type": "text/csv", "accept": "text/csv"},
    )
    assert csv.status_code == 200, csv.text
    typed = client.post(
        SATURATION,
        content=b'{"temperature": 300}',
        headers={"content-type": "application/json; charset=utf-8"},
    )
    assert typed.status_code == 200, typed.text


@pytest.mark.parametrize("body", [b"{bad", b'{"temperature": 300', b"\xff\xfe"], ids=repr)
def test_malformed_json_is_400(client: TestClient, body: bytes) -> None:
    # §15.5.1 400: a request the server cannot read at all, as opposed to 422 (§15.5.21)
    # for well-formed content that fails the schema.
    response = client.post(SATURATION, content=body, headers={"content-type": "application/json"})
    assert response.status_code == 400, response.text
    problem = response.json()
    assert problem["type"] == "urn:tripoint:problem:malformed-json"
    assert problem["errors"][0]["field"] == "body"


def test_well_formed_json_off_schema_stays_422(client: TestClient) -> None:
    response = client.post(SATURATION, json={"temperature": "hot"})
    assert response.status_code == 422


def test_body_problems_and_406_are_documented(client: TestClient) -> None:
    paths = client.get("/openapi.json").json()["paths"]
    post = paths[SATURATION]["post"]["responses"]
    assert {"400", "415", "406"} <= set(post)
    assert "406" in paths[CHAMBER]["post"]["responses"]
    assert "415" not in paths["/health"]["get"]["responses"]
    assert "406" not in paths["/v1/calculations"]["get"]["responses"]


def _documented_paths(client: TestClient) -> dict[str, set[str]]:
    paths = client.get("/openapi.json").json()["paths"]
    return {
        path.replace("{calculation_id}", "no-such-record"): {method.upper() for method in ops}
        for path, ops in paths.items()
    }


def test_every_documented_get_answers_head(client: TestClient) -> None:
    # RFC 9110 §9.3.2: a server SHOULD answer HEAD wherever it answers GET.
    checked = 0
    for path, methods in _documented_paths(client).items():
        if "GET" not in methods:
            continue
        got = client.get(path, headers={"accept-encoding": "identity"})
        head = client.head(path, headers={"accept-encoding": "identity"})
        assert head.status_code == got.status_code, path
        assert head.content == b"", path
        checked += 1
    assert checked >= 10


def test_every_documented_path_allows_what_it_documents(client: TestClient) -> None:
    # RFC 9110 §10.2.1 / §15.5.6: Allow lists the methods the target resource supports.
    for path, methods in _documented_paths(client).items():
        response = client.request("PATCH", path)
        assert response.status_code == 405, path
        expected = methods | ({"HEAD"} if "GET" in methods else set())
        assert set(response.headers["allow"].split(", ")) == expected, path
