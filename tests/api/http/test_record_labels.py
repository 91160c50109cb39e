"""The label and tags a request gives its record, including the requests that nest a whole
simulation request as ``case`` (sizing, calibration)."""

from __future__ import annotations

from typing import Any

import pytest
from pydantic import ValidationError

from service.api.http.examples import default_examples_folder, load_examples
from service.api.http.record_labels import labels_of
from service.api.sizing.schemas import VacuumChamberSizingCreate

_SIZING: dict[str, Any] = next(
    example.request
    for example in load_examples(default_examples_folder())
    if example.operation_id == "post_vacuum_chamber_sizing" and example.expected_status == 200
)


def _sizing(top: dict[str, Any], case: dict[str, Any]) -> VacuumChamberSizingCreate:
    return VacuumChamberSizingCreate.model_validate(
        {**_SIZING, **top, "case": {**_SIZING["case"], **case}}
    )


def test_no_label_and_no_tags_by_default() -> None:
    assert labels_of(_sizing({}, {})) == (None, ())


def test_top_level_label_wins_and_tags_of_both_are_kept_in_order() -> None:
    body = _sizing(
        {"label": "pump for line 3", "tags": ["sizing", "line-3"]},
        {"label": "bread case", "tags": ["line-3", "bread"]},
    )
    assert labels_of(body) == ("pump for line 3", ("sizing", "line-3", "bread"))


def test_the_case_names_the_record_when_the_top_level_does_not() -> None:
    assert labels_of(_sizing({}, {"label": "bread case", "tags": ["bread"]})) == (
        "bread case",
        ("bread",),
    )


def test_a_body_without_labels_gives_none() -> None:
    assert labels_of({"label": "ignored: a mapping is not a request model"}) == (None, ())


@pytest.mark.parametrize(
    "tags",
    [
        pytest.param(["ok", "ok"], id="repeated"),
        pytest.param(["Ok", "ok", "Ok"], id="repeated-among-others"),
    ],
)
def test_repeated_tags_are_refused_naming_them(tags: list[str]) -> None:
    with pytest.raises(ValidationError, match="repeated: "):
        _sizing({"tags": tags}, {})


def test_tags_differing_in_case_are_distinct() -> None:
    assert labels_of(_sizing({"tags": ["Ok", "ok"]}, {})) == (None, ("Ok", "ok"))
