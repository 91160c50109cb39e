"""Property-based fuzzing of every POST route's fields: no input gives a 5xx.

Each example takes a request example of ``openapi_examples/`` (valid by construction) and
replaces one field, at any depth, by a hostile value: random unicode text (long or short),
huge and tiny numbers, integers beyond 64 bits, booleans, null, nested objects and lists,
quantity objects with odd units. Every answer must be a 200 with finite numbers only, or a
4xx ``application/problem+json`` naming a field; never a 5xx. A calculation record is
stored for each 200 of a recording route and for nothing else (no orphan records).
Raw bodies (lone UTF-16 surrogates, NUL characters, deep nesting) are sent as bytes.
"""

from __future__ import annotations

import copy
import json
import math
from collections.abc import Iterator
from typing import Any

import pytest
from fastapi.testclient import TestClient
from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st

from service.api.app import create_app
from service.api.http.examples import default_examples_folder
from service.settings import Settings

_ROUTES = {
    "post_saturation": "/v1/properties/saturation",
    "post_sublimation": "/v1/properties/sublimation",
    "post_melting": "/v1/properties/melting",
    "post_state": "/v1/properties/state",
    "post_flash_freeze": "/v1/balances/flash-freeze",
    "post_evaporative_cooling": "/v1/balances/evaporative-cooling",
    "post_vacuum_chamber_simulation": "/v1/simulations/vacuum-chamber",
}
_RECORDING = ("/v1/balances/", "/v1/simulations/")


def _examples() -> dict[str, dict[str, Any]]:
    found: dict[str, dict[str, Any]] = {}
    for path in sorted(default_examples_folder().glob("*.json")):
        document = json.loads(path.read_text())
        route = _ROUTES.get(document["operation_id"])
        if route is not None and document["expected_status"] == 200 and route not in found:
            found[route] = document["request"]
    return found


EXAMPLES = _examples()


def _leaf_paths(node: Any, prefix: tuple[Any, ...] = ()) -> list[tuple[Any, ...]]:
    paths = [prefix] if prefix else []
    if isinstance(node, dict):
        for key, child in node.items():
            paths += _leaf_paths(child, (*prefix, key))
    elif isinstance(node, list):
        for position, child in enumerate(node[:3]):
            paths += _leaf_paths(child, (*prefix, position))
    return paths


_numbers = st.one_of(
    st.floats(allow_nan=False, allow_infinity=False),
    st.sampled_from([1e308, -1e308, 5e-324, -5e-324, 0.0, -0.0, 1e-300, 1e300]),
    st.integers(min_value=-(2**70), max_value=2**70),
)
_units = st.sampled_from(
    ["degC", "K", "kPa", "mTorr", "kg", "%", "", " ", "1e999", "m/" * 40, "K#x", "Pa**999"]
)
_text = st.one_of(
    st.text(max_size=40),
    st.text(min_size=100, max_size=3000),
    st.builds(lambda n, u: f"{n} {u}", _numbers, _units),
)
_hostile = st.recursive(
    st.one_of(st.none(), st.booleans(), _numbers, _text),
    lambda inner: st.one_of(
        st.lists(inner, max_size=4),
        st.dictionaries(st.text(max_size=8), inner, max_size=3),
        st.fixed_dictionaries({"value": inner, "unit": _units}),
        st.fixed_dictionaries({"values": st.lists(inner, max_size=4), "unit": _units}),
    ),
    max_leaves=6,
)


def _replaced(body: dict[str, Any], path: tuple[Any, ...], value: Any) -> dict[str, Any]:
    spoiled = copy.deepcopy(body)
    node: Any = spoiled
    for part in path[:-1]:
        node = node[part]
    node[path[-1]] = value
    return spoiled


def _strict_json(text: str) -> Any:
    def refuse(constant: str) -> None:
        raise AssertionError(f"non-finite JSON token {constant}")

    return json.loads(text, parse_constant=refuse)


def _finite_numbers(node: Any) -> bool:
    if isinstance(node, float):
        return math.isfinite(node)
    if isinstance(node, dict):
        return all(_finite_numbers(child) for child in node.values())
    if isinstance(node, list):
        return all(_finite_numbers(child) for child in node)
    return True


class _Tally:
    stored_answers = 0


@pytest.fixture(scope="module")
def client(tmp_path_factory: pytest.TempPathFactory) -> Iterator[TestClient]:
    database = tmp_path_factory.mktemp("fuzz") / "records.db"
    settings_ = Settings(database_url=f"sqlite:///{database}", max_request_seconds=10)
    app = create_app(settings_)
    with TestClient(app, raise_server_exceptions=False) as test_client:
        yield test_client


def _check(client: TestClient, route: str, response: Any) -> None:
    assert response.status_code < 500, response.text[:500]
    if response.status_code == 200:
        answer = _strict_json(response.text)
        assert _finite_numbers(answer)
        if route.startswith(_RECORDING):
            _Tally.stored_answers += 1
        return
    assert response.headers["content-type"].startswith("application/problem+json")
    problem = _strict_json(response.text)
    assert problem["status"] == response.status_code
    assert problem["errors"], problem
    assert len(response.content) < 20_000  # a hostile input is not echoed whole


def _fuzz(route: str, examples: int) -> Any:
    body = EXAMPLES[route]
    paths = _leaf_paths(body)

    @settings(
        max_examples=examples,
        deadline=None,
        derandomize=True,
        suppress_health_check=[HealthCheck.function_scoped_fixture, HealthCheck.too_slow],
    )
    @given(path=st.sampled_from(paths), value=_hostile)
    def run(client: TestClient, path: tuple[Any, ...], value: Any) -> None:
        response = client.post(route, json=_replaced(body, path, value))
        _check(client, route, response)

    return run


@pytest.mark.slow
@pytest.mark.parametrize("route", sorted(EXAMPLES), ids=lambda route: route.rsplit("/", 1)[-1])
def test_no_field_value_gives_a_server_error(client: TestClient, route: str) -> None:
    examples = 25 if "simulations" in route else 80
    with _ignore_numpy_warnings():
        _fuzz(route, examples)(client)


class _ignore_numpy_warnings:  # noqa: N801 - a context manager used like a function
    """Overflow warnings numpy raises on absurd inputs are not failures here (the answer
    is checked instead)."""

    def __enter__(self) -> None:
        import warnings

        self._catcher = warnings.catch_warnings()
        self._catcher.__enter__()
        warnings.simplefilter("ignore", RuntimeWarning)

    def __exit__(self, *exc: object) -> None:
        self._catcher.__exit__(*exc)  # type: ignore[arg-type]


@pytest.mark.parametrize(
    "raw",
    [
        b'{"temperature": "\\ud800 K"}',
        b'{"temperature": "300\\u0000 K"}',
        b'{"temperature": ' + b"[" * 5000 + b"]" * 5000 + b"}",
        b'{"temperature": 1e999}',
        b'{"temperature": "' + b"9" * 5000 + b' K"}',
        b"\xff\xfe not json",
    ],
    ids=["lone-surrogate", "nul", "deep-nesting", "overflow-literal", "long-number", "bytes"],
)
def test_raw_bodies_give_no_server_error(client: TestClient, raw: bytes) -> None:
    for route in ("/v1/properties/saturation", "/v1/balances/flash-freeze"):
        response = client.post(route, content=raw, headers={"content-type": "application/json"})
        _check(client, route, response)


def test_no_record_is_left_behind_by_a_failed_answer(client: TestClient) -> None:
    # Runs after the fuzzing above (module order): every stored record is one 200 answer.
    listing = client.get("/v1/calculations", params={"limit": 1000}).json()
    stored = len(listing["items"])
    assert stored == _Tally.stored_answers
