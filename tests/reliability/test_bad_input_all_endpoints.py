"""Bad input across every endpoint: a 4xx problem document naming the field, never a 5xx.

Each case sends one bad request. The answer must be a 4xx with
``application/problem+json``, parse as strict JSON (no NaN or Infinity tokens), carry
``status``, ``title``, ``detail`` and ``type``, and, where the request has inputs, name the
offending field in ``errors[].field``. A test reads ``/openapi.json`` and fails when an
operation has no case here, so a new endpoint needs its bad-input rows.

The balance and simulation bodies start from the request examples in
``openapi_examples/`` (valid by construction) with one field spoiled.
"""

from __future__ import annotations

import copy
import json
from collections.abc import Iterator
from dataclasses import dataclass, field
from pathlib import Path
from typing import Any

import pytest
from fastapi.testclient import TestClient

from service.api.app import create_app
from service.api.http.examples import default_examples_folder
from service.settings import Settings

_MISSING = object()


def _example(operation_id: str) -> dict[str, Any]:
    """The request of the first example file for ``operation_id`` that answers 200."""
    for path in sorted(default_examples_folder().glob("*.json")):
        document = json.loads(path.read_text())
        if document["operation_id"] == operation_id and document["expected_status"] == 200:
            request: dict[str, Any] = document["request"]
            return request
    raise LookupError(f"no 200 example for {operation_id}")


def _spoiled(operation_id: str, dotted: str, value: Any) -> dict[str, Any]:
    """The example body of ``operation_id`` with ``dotted`` set to ``value`` (or removed)."""
    body = copy.deepcopy(_example(operation_id))
    node = body
    *parents, last = dotted.split(".")
    for part in parents:
        node = node[int(part)] if isinstance(node, list) else node[part]
    if value is _MISSING:
        del node[last]
    else:
        node[last] = value
    return body


@dataclass(frozen=True)
class Case:
    """One bad request and what the answer must name."""

    name: str
    method: str
    route: str  # path template as in /openapi.json
    status: int
    named: str | None  # a field the problem's errors must name (None: no inputs)
    path: str | None = None  # concrete path when the template has parameters
    query: dict[str, str] = field(default_factory=dict)
    body: Any = None
    raw: bytes | None = None
    content_type: str = "application/json"


_SAT = "/v1/properties/saturation"
_SUB = "/v1/properties/sublimation"
_MELT = "/v1/properties/melting"
_STATE = "/v1/properties/state"
_ICE = "/v1/properties/ice-fraction"
_FLASH = "/v1/balances/flash-freeze"
_EVAP = "/v1/balances/evaporative-cooling"
_CHAMBER = "/v1/simulations/vacuum-chamber"
_DRYING = "/v1/simulations/primary-drying"
_DESIGN = "/v1/design-spaces/primary-drying"
_CALIBRATION = "/v1/calibrations/vacuum-chamber"
_SIZING = "/v1/sizing/vacuum-chamber"
_RECORD = "/v1/calculations/{calculation_id}"
_LIST = "/v1/calculations"
_SOURCES = "/v1/sources"
_SOURCE = "/v1/sources/{statement_id}"

CASES: list[Case] = [
    # operations routes take no input: a wrong method is the bad request
    Case("health-post", "POST", "/health", 405, None),
    Case("ready-post", "POST", "/ready", 405, None),
    Case("metrics-post", "POST", "/metrics", 405, None),
    Case("unknown-route", "GET", "/v1/properties/boiling", 404, None),
    # saturation
    Case("sat-text", "GET", _SAT, 422, "temperature", query={"temperature": "warm"}),
    Case("sat-nan", "GET", _SAT, 422, "temperature", query={"temperature": "nan degC"}),
    Case("sat-unit", "GET", _SAT, 422, "temperature", query={"temperature": "300 furlong"}),
    Case("sat-negative-p", "GET", _SAT, 422, "pressure", query={"pressure": "-1 kPa"}),
    Case(
        "sat-formulation",
        "GET",
        _SAT,
        422,
        "formulation",
        query={"temperature": "300", "formulation": "x"},
    ),
    Case(
        "sat-misspelt-query",
        "GET",
        _SAT,
        422,
        "output_unit",
        query={"temperature": "300", "output_unit": "US"},
    ),
    Case("sat-body-bool", "POST", _SAT, 422, "temperature", body={"temperature": True}),
    Case(
        "sat-body-bool-in-list",
        "POST",
        _SAT,
        422,
        "temperature",
        body={"temperature": {"values": [300, False]}},
    ),
    Case(
        "sat-body-string-in-list",
        "POST",
        _SAT,
        422,
        "temperature",
        body={"temperature": {"values": [300, "310"]}},
    ),
    Case("sat-body-nan-token", "POST", _SAT, 422, "temperature", raw=b'{"temperature": NaN}'),
    Case(
        "sat-body-infinity-token",
        "POST",
        _SAT,
        422,
        "temperature",
        raw=b'{"temperature": [300, Infinity]}',
    ),
    Case("sat-body-overflow", "POST", _SAT, 422, "temperature", raw=b'{"temperature": 1e999}'),
    Case(
        "sat-body-negative-uncertainty",
        "POST",
        _SAT,
        422,
        "temperature",
        body={"temperature": {"value": 300, "uncertainty": -1}},
    ),
    Case("sat-body-not-json", "POST", _SAT, 400, "body", raw=b'{"temperature": '),
    Case(
        "sat-body-wrong-media-type",
        "POST",
        _SAT,
        415,
        "Content-Type",
        raw=b'{"temperature": 300}',
        content_type="text/plain",
    ),
    Case("sat-body-array", "POST", _SAT, 422, "body", raw=b"[300, 310]"),
    Case(
        "sat-body-unknown", "POST", _SAT, 422, "colour", body={"temperature": 300, "colour": "red"}
    ),
    Case(
        "sat-body-out-of-range",
        "POST",
        _SAT,
        422,
        "temperature",
        body={"temperature": {"values": [300, 700]}},
    ),
    Case(
        "sat-csv-header",
        "POST",
        _SAT,
        400,
        "temp erature",
        raw=b"temp erature[K]\n300\n",
        content_type="text/csv",
    ),
    Case(
        "sat-csv-cell",
        "POST",
        _SAT,
        422,
        "temperature",
        raw=b"temperature[K]\nwarm\n",
        content_type="text/csv",
    ),
    Case("sat-points", "POST", _SAT, 413, "values", body={"temperature": [300.0] * 20_001}),
    # sublimation and melting
    Case("sub-above-triple", "GET", _SUB, 422, "temperature", query={"temperature": "10 degC"}),
    Case("sub-wrong-dimension", "GET", _SUB, 422, "pressure", query={"pressure": "3 K"}),
    Case("sub-body-empty", "POST", _SUB, 422, "temperature", body={"temperature": []}),
    Case("sub-body-both", "POST", _SUB, 422, "pressure", body={"temperature": 250, "pressure": 50}),
    Case("melt-text", "GET", _MELT, 422, "pressure", query={"pressure": "lots"}),
    Case("melt-too-cold", "POST", _MELT, 422, "temperature", body={"temperature": "-40 degC"}),
    # ice fraction of solutions and seawater
    Case(
        "ice-fraction-get-salinity",
        "GET",
        _ICE,
        422,
        "absolute_salinity",
        query={"temperature": "-2 degC", "absolute_salinity": "salty"},
    ),
    Case(
        "ice-fraction-above-eutectic",
        "POST",
        _ICE,
        422,
        "solute.mass_fraction",
        body=_spoiled("post_ice_fraction", "temperature", "-10 degC")
        | {
            "solute": {"name": "sodium chloride", "mass_fraction": 0.3},
            "seawater": None,
            "composition": None,
            "freezing_point": None,
        },
    ),
    Case(
        "ice-fraction-food-solute-unknown",
        "POST",
        _ICE,
        422,
        "composition.dissolved_solutes.lactose",
        body={
            "temperature": "-5 degC",
            "composition": {
                "water": 0.9,
                "carbohydrate": 0.1,
                "dissolved_solutes": {"lactose": 0.05},
            },
        },
    ),
    # state
    Case(
        "state-phase",
        "GET",
        _STATE,
        422,
        "phase",
        query={"temperature": "300", "pressure": "1e5", "phase": "plasma"},
    ),
    Case("state-no-pressure", "GET", _STATE, 422, "pressure", query={"temperature": "300"}),
    Case(
        "state-zero-kelvin",
        "GET",
        _STATE,
        422,
        "temperature",
        query={"temperature": "-273.15 degC", "pressure": "1e5"},
    ),
    Case(
        "state-body-lengths",
        "POST",
        _STATE,
        422,
        "pressure",
        body={"temperature": [300, 310], "pressure": [1e5, 2e5, 3e5]},
    ),
    Case(
        "constants-units",
        "GET",
        "/v1/properties/constants",
        422,
        "output_units",
        query={"output_units": "metric"},
    ),
    # balances (from the documented examples, one field spoiled)
    Case(
        "flash-missing",
        "POST",
        _FLASH,
        422,
        "initial_temperature",
        body=_spoiled("post_flash_freeze", "initial_temperature", _MISSING),
    ),
    Case(
        "flash-dimension",
        "POST",
        _FLASH,
        422,
        "initial_temperature",
        body=_spoiled("post_flash_freeze", "initial_temperature", "20 kPa"),
    ),
    Case(
        "flash-negative-mass",
        "POST",
        _FLASH,
        422,
        "water_mass",
        body=_spoiled("post_flash_freeze", "water_mass", "-1 kg"),
    ),
    Case(
        "flash-bool",
        "POST",
        _FLASH,
        422,
        "water_mass",
        body=_spoiled("post_flash_freeze", "water_mass", True),
    ),
    Case(
        "flash-food-and-water-mass",
        "POST",
        _FLASH,
        422,
        "water_mass",
        body={
            "initial_temperature": "8 degC",
            "water_mass": "2 kg",
            "composition": {"water": 0.78, "protein": 0.19, "fat": 0.01, "ash": 0.02},
            "product_mass": "25 kg",
            "final_ice_temperature": "-18 degC",
        },
    ),
    Case(
        "flash-method",
        "POST",
        _FLASH,
        422,
        "method",
        body=_spoiled("post_flash_freeze", "method", "guess"),
    ),
    Case(
        "flash-csv-cell",
        "POST",
        _FLASH,
        422,
        "initial_temperature",
        raw=b"initial_temperature[degC]\nwarm\n",
        content_type="text/csv",
    ),
    Case(
        "evap-missing",
        "POST",
        _EVAP,
        422,
        "product_mass",
        body=_spoiled("post_evaporative_cooling", "product_mass", _MISSING),
    ),
    Case(
        "evap-not-cooling",
        "POST",
        _EVAP,
        422,
        "final_temperature",
        body=_spoiled(
            "post_evaporative_cooling",
            "final_temperature",
            _example("post_evaporative_cooling")["initial_temperature"],
        ),
    ),
    Case(
        "evap-dimension",
        "POST",
        _EVAP,
        422,
        "product_mass",
        body=_spoiled("post_evaporative_cooling", "product_mass", "600 K"),
    ),
    Case(
        "evap-nan-token",
        "POST",
        _EVAP,
        422,
        "product_mass",
        raw=b'{"product_mass": NaN, "initial_temperature": 300, "final_temperature": 280, '
        b'"specific_heat": 3900}',
    ),
    # simulation
    Case(
        "chamber-missing",
        "POST",
        _CHAMBER,
        422,
        "chamber",
        body=_spoiled("post_vacuum_chamber_simulation", "chamber", _MISSING),
    ),
    Case(
        "chamber-dimension",
        "POST",
        _CHAMBER,
        422,
        "free_volume",
        body=_spoiled("post_vacuum_chamber_simulation", "chamber.free_volume", "2.5 kg"),
    ),
    Case(
        "chamber-unknown",
        "POST",
        _CHAMBER,
        422,
        "colour",
        body=_spoiled("post_vacuum_chamber_simulation", "colour", "red"),
    ),
    Case(
        "chamber-bool",
        "POST",
        _CHAMBER,
        422,
        "mass",
        body=_spoiled("post_vacuum_chamber_simulation", "product.mass", False),
    ),
    # primary drying
    Case(
        "drying-no-ice",
        "POST",
        _DRYING,
        422,
        "load.solids_fraction",
        body=_spoiled("post_primary_drying_simulation", "load.solids_fraction", 1.0),
    ),
    Case(
        "drying-dimension",
        "POST",
        _DRYING,
        422,
        "recipe[0].chamber_pressure",
        body=_spoiled("post_primary_drying_simulation", "recipe.0.chamber_pressure", "3 kg"),
    ),
    Case(
        "drying-nan",
        "POST",
        _DRYING,
        422,
        "critical_temperature",
        body=_spoiled("post_primary_drying_simulation", "critical_temperature", "nan degC"),
    ),
    Case(
        "design-space-no-ice-left",
        "POST",
        _DESIGN,
        422,
        "dried_layer_thickness",
        body=_spoiled("post_primary_drying_design_space", "dried_layer_thickness", "20 mm"),
    ),
    Case(
        "design-space-unknown",
        "POST",
        _DESIGN,
        422,
        "colour",
        body=_spoiled("post_primary_drying_design_space", "colour", "red"),
    ),
    # calibration
    Case(
        "calibration-unknown-field",
        "POST",
        _CALIBRATION,
        422,
        "estimate[0].parameter",
        body=_spoiled("post_vacuum_chamber_calibration", "estimate.0.parameter", "chamber.colour"),
    ),
    Case(
        "calibration-series-unit",
        "POST",
        _CALIBRATION,
        422,
        "measured.total_pressure",
        body=_spoiled("post_vacuum_chamber_calibration", "measured.total_pressure.unit", "degC"),
    ),
    Case(
        "calibration-bound-dimension",
        "POST",
        _CALIBRATION,
        422,
        "estimate[2].upper",
        body=_spoiled("post_vacuum_chamber_calibration", "estimate.2.upper", "1 kg"),
    ),
    # sizing
    Case(
        "sizing-find-not-monotone",
        "POST",
        _SIZING,
        422,
        "find",
        body=_spoiled("post_vacuum_chamber_sizing", "find", "product.water_fraction"),
    ),
    Case(
        "sizing-target-dimension",
        "POST",
        _SIZING,
        422,
        "temperature",
        body=_spoiled("post_vacuum_chamber_sizing", "target.temperature", "25 kg"),
    ),
    Case(
        "sizing-case-missing",
        "POST",
        _SIZING,
        422,
        "case",
        body=_spoiled("post_vacuum_chamber_sizing", "case", _MISSING),
    ),
    Case(
        "sizing-case-field",
        "POST",
        _SIZING,
        422,
        "free_volume",
        body=_spoiled("post_vacuum_chamber_sizing", "case.chamber.free_volume", "6 kg"),
    ),
    # calculation records
    Case(
        "record-unknown", "GET", _RECORD, 404, "calculation_id", path="/v1/calculations/no-such-id"
    ),
    Case(
        "record-too-long",
        "GET",
        _RECORD,
        422,
        "calculation_id",
        path="/v1/calculations/" + "a" * 65,
    ),
    Case("list-limit", "GET", _LIST, 422, "limit", query={"limit": "0"}),
    Case("list-number-as-time", "GET", _LIST, 422, "until", query={"until": "0.5"}),
    Case("list-cursor", "GET", _LIST, 422, "cursor", query={"cursor": "not-a-cursor"}),
    # the statements answers cite
    Case("sources-other-version", "GET", _SOURCES, 404, "version", query={"version": "0.0.0"}),
    Case("sources-unknown-query", "GET", _SOURCES, 422, "kind", query={"kind": "uncertainty"}),
    Case(
        "source-unknown",
        "GET",
        _SOURCE,
        404,
        "statement_id",
        path="/v1/sources/no-such-statement",
    ),
    Case("source-too-long", "GET", _SOURCE, 422, "statement_id", path="/v1/sources/" + "a" * 129),
    # the detail of an answer, on a GET and a POST route
    Case("detail-get", "GET", _SAT, 422, "detail", query={"temperature": "300", "detail": "all"}),
    Case(
        "detail-post",
        "POST",
        _FLASH,
        422,
        "detail",
        query={"detail": "long"},
        body=_example("post_flash_freeze"),
    ),
    Case("list-kind-unknown", "GET", _LIST, 422, "kind", query={"kind": "flash-freeze"}),
    Case("list-tag-with-space", "GET", _LIST, 422, "tag", query={"tag": "two words"}),
    Case("list-label-too-long", "GET", _LIST, 422, "label", query={"label": "x" * 101}),
    # label and tags of a recorded request
    Case(
        "flash-tag-with-space",
        "POST",
        _FLASH,
        422,
        "tags",
        body=_spoiled("post_flash_freeze", "tags", ["two words"]),
    ),
    Case(
        "flash-label-line-break",
        "POST",
        _FLASH,
        422,
        "label",
        body=_spoiled("post_flash_freeze", "label", "run\n7"),
    ),
]


def _refuse_constant(token: str) -> None:
    raise ValueError(f"non-standard JSON token {token}")


def strict_json(raw: bytes) -> Any:
    """Parse JSON, refusing NaN, Infinity and -Infinity (which Python's parser admits)."""
    return json.loads(raw, parse_constant=_refuse_constant)


def _send(client: TestClient, case: Case) -> Any:
    path = case.path or case.route
    if case.raw is not None:
        return client.request(
            case.method,
            path,
            params=case.query,
            content=case.raw,
            headers={"content-type": case.content_type},
        )
    if case.body is not None:
        return client.request(case.method, path, params=case.query, json=case.body)
    return client.request(case.method, path, params=case.query)


@pytest.mark.parametrize("case", CASES, ids=[case.name for case in CASES])
def test_bad_input_answers_a_problem_naming_the_field(client: TestClient, case: Case) -> None:
    response = _send(client, case)
    assert response.status_code == case.status, response.text
    assert response.headers["content-type"].startswith("application/problem+json")
    problem = strict_json(response.content)
    assert problem["status"] == case.status
    assert problem["title"] and problem["detail"] and problem["type"]
    if case.named is not None:
        named = [error["field"] for error in problem["errors"]]
        assert any(case.named in name for name in named), (case.named, named)


def test_every_operation_has_a_bad_input_case(client: TestClient) -> None:
    document = strict_json(client.get("/openapi.json").content)
    operations = {
        (method.upper(), route)
        for route, methods in document["paths"].items()
        for method in methods
    }
    covered = {(case.method, case.route) for case in CASES}
    # Operations without inputs are covered by a wrong-method case on their path.
    covered |= {
        (method, case.route) for case in CASES if case.status == 405 for method in ("GET", "POST")
    }
    assert operations - covered == set()


def test_strict_parser_refuses_non_finite_tokens() -> None:
    for text in (b"NaN", b"[1, Infinity]", b'{"a": -Infinity}'):
        with pytest.raises(ValueError, match="non-standard JSON token"):
            strict_json(text)


# -- 3 million points, at the default limits ----------------------------------------------


@pytest.fixture(scope="module")
def default_limits_client(tmp_path_factory: pytest.TempPathFactory) -> Iterator[TestClient]:
    """The app with the default TRIPOINT_MAX_BODY_BYTES and TRIPOINT_MAX_BATCH_POINTS."""
    folder: Path = tmp_path_factory.mktemp("limits")
    with TestClient(create_app(Settings(database_url=f"sqlite:///{folder / 'r.sqlite3'}"))) as c:
        yield c


def test_three_million_full_precision_points_refused_before_parsing(
    default_limits_client: TestClient,
) -> None:
    # As a client sends numpy arrays (.tolist()): repr floats of about 18 characters.
    point = b"273.15000000000003,"
    body = b'{"temperature": [' + point * (3_000_000 - 1) + point[:-1] + b"]}"
    response = default_limits_client.post(
        _SAT, content=body, headers={"content-type": "application/json"}
    )
    assert response.status_code == 413
    problem = strict_json(response.content)
    # The body-size limit answers from the declared Content-Length: the body is never read.
    assert problem["type"].endswith("body-too-large")
    assert problem["errors"][0]["field"] == "body"


def test_three_million_short_points_refused_by_the_point_limit(
    default_limits_client: TestClient,
) -> None:
    # Short numbers fit under the byte limit (6 MB): the point count refuses them, after
    # parsing but before any computation (about 0.4 s here; no timing asserted).
    body = b'{"temperature": [' + b"1," * (3_000_000 - 1) + b"1]}"
    response = default_limits_client.post(
        _SAT, content=body, headers={"content-type": "application/json"}
    )
    assert response.status_code == 413
    problem = strict_json(response.content)
    assert problem["type"].endswith("too-many-points")
    assert problem["errors"][0]["value"] == 3_000_000


def test_huge_integer_is_echoed_as_text(client: TestClient) -> None:
    # Found by schemathesis: a value beyond 64 bits in a field the schema refuses was echoed
    # in the problem document, which the JSON renderer could not write (a 500).
    response = client.post(_SAT, json={"temperature": {"values": [300.0], "unit": -(2**63) - 1}})
    assert response.status_code == 422
    problem = strict_json(response.content)
    assert any(error["value"] == str(-(2**63) - 1) for error in problem["errors"])
