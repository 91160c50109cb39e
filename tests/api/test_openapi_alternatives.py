"""The request schemas state the cross-field rules the server enforces (JSON Schema 2020-12,
Sec. 10.2.1.4 ``not`` and 10.2.1.2 ``anyOf``; validated with jsonschema-rs), and the
quantity-text pattern agrees with the parser.

Each case is a request body that the document's schema and the server must judge alike:
both accept it or both refuse it (422). Accepted bodies are the openapi_examples files,
which tests/api/test_openapi_examples.py sends; the refused ones are sent here.
"""

from __future__ import annotations

import copy
import re
from typing import Any

import jsonschema_rs
import pytest
from fastapi.testclient import TestClient
from hypothesis import given
from hypothesis import strategies as st

from service.api.http.examples import default_examples_folder, load_examples
from service.api.http.units import (
    _UNIT_TEXT,
    MAX_QUANTITY_TEXT_LENGTH,
    MAX_UNIT_LENGTH,
    QUANTITY_TEXT_PATTERN,
    parse_quantity_text,
)
from service.core.errors import InvalidInputError

_EXAMPLES = {example.name: example for example in load_examples(default_examples_folder())}


def _body(name: str, **changes: Any) -> dict[str, Any]:
    body = copy.deepcopy(_EXAMPLES[name].request)
    for dotted, value in changes.items():
        *parents, last = dotted.split("__")
        target = body
        for parent in parents:
            target = target[parent]
        if value is _DROP:
            target.pop(last)
        else:
            target[last] = value
    return body


_DROP = object()
_SUGAR = {"name": "sucrose", "mass_fraction": 0.2}
_COMPOSITION = {"water": 0.74, "protein": 0.22, "fat": 0.03, "ash": 0.01}

CASES: list[tuple[str, str, str, dict[str, Any], bool]] = [
    ("saturation-neither", "post", "/v1/properties/saturation", {}, False),
    ("saturation-temperature", "post", "/v1/properties/saturation", {"temperature": 300}, True),
    (
        "saturation-pressure-null",
        "post",
        "/v1/properties/saturation",
        {"temperature": "25 degC", "pressure": None},
        True,
    ),
    (
        "sublimation-both",
        "post",
        "/v1/properties/sublimation",
        {"temperature": 250, "pressure": 70},
        False,
    ),
    ("melting-neither", "post", "/v1/properties/melting", {"output_units": "SI"}, False),
    (
        "ice-fraction-no-mixture",
        "post",
        "/v1/properties/ice-fraction",
        {"temperature": "-5 degC"},
        False,
    ),
    (
        "ice-fraction-solute",
        "post",
        "/v1/properties/ice-fraction",
        {"temperature": "-5 degC", "solute": _SUGAR},
        True,
    ),
    (
        "ice-fraction-solute-and-composition",
        "post",
        "/v1/properties/ice-fraction",
        {"temperature": "-5 degC", "solute": _SUGAR, "composition": _COMPOSITION},
        False,
    ),
    (
        "ice-fraction-composition-without-freezing-point",
        "post",
        "/v1/properties/ice-fraction",
        _body("ice-fraction-meat-pies-blast-freezer", freezing_point=_DROP),
        True,  # accepted: the onset is estimated from the composition
    ),
    (
        "ice-fraction-freezing-point-with-a-solute",
        "post",
        "/v1/properties/ice-fraction",
        {"temperature": "-5 degC", "solute": _SUGAR, "freezing_point": "-1 degC"},
        False,
    ),
    (
        "evaporative-neither-heat-nor-composition",
        "post",
        "/v1/balances/evaporative-cooling",
        _body("evaporative-cooling-lettuce-pallet", specific_heat=_DROP),
        False,
    ),
    (
        "evaporative-both",
        "post",
        "/v1/balances/evaporative-cooling",
        _body("evaporative-cooling-lettuce-pallet", composition=_COMPOSITION),
        False,
    ),
    (
        "companion-heat-and-material",
        "post",
        "/v1/balances/flash-freeze",
        _body(
            "flash-freeze-vial-tray-pulldown",
            companions=[
                {
                    "name": "tray",
                    "mass": "1 kg",
                    "material": "stainless steel",
                    "specific_heat": "0.5 kJ/(kg*K)",
                }
            ],
        ),
        False,
    ),
    (
        "drying-fill-volume-and-mass",
        "post",
        "/v1/simulations/primary-drying",
        _body("primary-drying-vial-batch-ramp", load__fill_mass="3 g"),
        False,
    ),
    (
        "drying-vial-without-inner-area",
        "post",
        "/v1/simulations/primary-drying",
        _body("primary-drying-vial-batch-ramp", load__inner_area=_DROP),
        False,
    ),
    (
        "calibration-measured-and-csv",
        "post",
        "/v1/calibrations/vacuum-chamber",
        _body(
            "calibration-produce-cooler-logger", measured_csv="time[s],chamber_pressure[Pa]\n0,1\n"
        ),
        False,
    ),
    (
        "calibration-csv-uncertainty-without-csv",
        "post",
        "/v1/calibrations/vacuum-chamber",
        _body(
            "calibration-produce-cooler-logger",
            csv_uncertainty={"total_pressure": {"relative": 0.02}},
        ),
        False,
    ),
    (
        "calibration-field-not-estimable",
        "post",
        "/v1/calibrations/vacuum-chamber",
        _body(
            "calibration-produce-cooler-logger",
            estimate=[{"parameter": "end_time", "lower": "1 min", "upper": "2 min"}],
        ),
        False,
    ),
    (
        "sizing-schedule-target-without-schedule",
        "post",
        "/v1/sizing/vacuum-chamber",
        _body("sizing-bakery-pump-for-five-minutes", target="schedule"),
        False,
    ),
    (
        "sizing-field-not-sizable",
        "post",
        "/v1/sizing/vacuum-chamber",
        _body("sizing-bakery-pump-for-five-minutes", find="product.initial_temperature"),
        False,
    ),
]


def _validator(spec: dict[str, Any], method: str, path: str) -> Any:
    body = spec["paths"][path][method]["requestBody"]["content"]["application/json"]["schema"]
    return jsonschema_rs.Draft202012Validator({**body, "components": spec["components"]})


@pytest.mark.parametrize(
    ("method", "path", "body", "accepted"), [c[1:] for c in CASES], ids=[c[0] for c in CASES]
)
def test_schema_and_server_judge_alike(
    client: TestClient, method: str, path: str, body: dict[str, Any], accepted: bool
) -> None:
    spec = client.get("/openapi.json").json()
    assert _validator(spec, method, path).is_valid(body) is accepted
    if not accepted:  # accepted bodies are computed by the examples' own test
        response = client.request(method.upper(), path, json=body)
        assert response.status_code == 422, response.text


def test_every_success_example_is_valid_by_its_schema(client: TestClient) -> None:
    spec = client.get("/openapi.json").json()
    paths = {
        operation["operationId"]: (method, path)
        for path, methods in spec["paths"].items()
        for method, operation in methods.items()
        if "requestBody" in operation
    }
    checked = 0
    for example in _EXAMPLES.values():
        if example.refused or example.operation_id not in paths:
            continue
        method, path = paths[example.operation_id]
        errors = [
            str(error) for error in _validator(spec, method, path).iter_errors(example.request)
        ]
        assert errors == [], example.name
        checked += 1
    assert checked >= 15


_PATTERN = re.compile(QUANTITY_TEXT_PATTERN)
_TEXT = st.text(
    alphabet=st.sampled_from(list("0123456789.+-eE KkPadgCFm%°µ/*()^_\n#,")), max_size=40
)


@given(st.from_regex(_PATTERN, fullmatch=True).filter(lambda text: "\n" not in text))
def test_every_text_the_pattern_admits_reads_as_a_number_and_a_unit(text: str) -> None:
    if len(text) > MAX_QUANTITY_TEXT_LENGTH:
        return  # the schema's maxLength refuses it
    try:
        _, unit = parse_quantity_text(text, field="x")
    except InvalidInputError as error:
        # a pattern cannot say "finite": 1e999 is refused by the parser alone
        assert "finite" in str(error), text
        return
    assert unit is None or (len(unit) <= MAX_UNIT_LENGTH and _UNIT_TEXT.match(unit))


@given(_TEXT)
def test_every_text_the_parser_reads_matches_the_pattern(text: str) -> None:
    try:
        _, unit = parse_quantity_text(text, field="x")
    except InvalidInputError as error:
        admitted = _PATTERN.match(text) and "\n" not in text
        assert not admitted or "finite" in str(error), text
        return
    if unit is None or (len(unit) <= MAX_UNIT_LENGTH and _UNIT_TEXT.match(unit)):
        assert _PATTERN.match(text), text
