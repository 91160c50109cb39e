"""The headline a record keeps: the members of the answer named by dotted paths."""

from __future__ import annotations

import numpy as np

from service.api.http.recording import HEADLINE_VALUES, headline

_ANSWER = {
    "final_temperature": {"value": -2.5, "unit": "degC", "uncertainty": 0.1},
    "summary": {
        "end_reason": "target-reached",
        "target_time": None,
        "evaporated_mass": {"values": [1.0, 2.0], "unit": "kg"},
        "long": {"values": [0.5] * (HEADLINE_VALUES + 1), "unit": "kg"},
        "steps": 41,
    },
    "stages": [{"name": "liquid"}],
}


def test_quantities_keep_their_numbers_and_unit_only() -> None:
    assert headline(_ANSWER, {"final": "final_temperature"}) == {
        "final": {"value": -2.5, "unit": "degC"}
    }


def test_nested_texts_counts_batches_and_nulls_are_kept() -> None:
    picked = headline(
        _ANSWER,
        {
            "end_reason": "summary.end_reason",
            "time_to_target": "summary.target_time",
            "evaporated": "summary.evaporated_mass",
            "steps": "summary.steps",
        },
    )
    assert picked == {
        "end_reason": "target-reached",
        "time_to_target": None,
        "evaporated": {"values": [1.0, 2.0], "unit": "kg"},
        "steps": 41,
    }


def test_missing_paths_long_batches_and_lists_are_left_out() -> None:
    picked = headline(
        _ANSWER,
        {
            "absent": "summary.nothing_here",
            "deeper": "final_temperature.value.more",
            "long": "summary.long",
            "stages": "stages",
        },
    )
    assert picked == {}


def test_a_batch_still_held_as_an_array_is_kept_as_numbers() -> None:
    answer = {"ice_mass": {"values": np.array([0.25, 0.5]), "unit": "kg"}}
    assert headline(answer, {"ice_mass": "ice_mass"}) == {
        "ice_mass": {"values": [0.25, 0.5], "unit": "kg"}
    }
