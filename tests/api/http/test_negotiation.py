"""Accept-header negotiation shared by CSV answers and plots (RFC 9110 §12.5.1 Accept,
§12.4.2 quality values)."""

from __future__ import annotations

import pytest

from service.api.http.csv_io import prefers_csv
from service.api.http.negotiation import choose_media_type, parse_accept
from service.api.simulations.plots import plot_format_for

JSON = "application/json"
CSV = "text/csv"
SVG = "image/svg+xml"
PNG = "image/png"
ALL = (JSON, CSV, SVG, PNG)


def test_ranges_keep_order_quality_and_lower_case() -> None:
    ranges = parse_accept("TEXT/CSV;q=0.4, application/json;q=bad, image/*, nonsense")
    assert [(r.type, r.subtype, r.quality, r.position) for r in ranges] == [
        ("text", "csv", 0.4, 0),
        ("application", "json", 0.0, 1),  # §12.4.2: "bad" is no qvalue, so not acceptable
        ("image", "*", 1.0, 2),
    ]


@pytest.mark.parametrize(
    ("q", "quality"),
    [("1", 1.0), ("1.000", 1.0), ("0.5", 0.5), ("0.001", 0.001), ("0", 0.0), ("1.5", 0.0)],
    ids=["one", "one-three-decimals", "half", "smallest", "zero", "above-one-invalid"],
)
def test_qvalue_grammar(q: str, quality: float) -> None:
    # RFC 9110 §12.4.2: qvalue = ("0" ["." 0*3DIGIT]) / ("1" ["." 0*3("0")]).
    assert parse_accept(f"text/csv;q={q}")[0].quality == quality


@pytest.mark.parametrize(
    ("accept", "chosen"),
    [
        pytest.param(None, JSON, id="no-header-default"),
        pytest.param("", JSON, id="empty-header-default"),
        pytest.param("*/*", JSON, id="anything-default"),
        pytest.param("text/csv", CSV, id="exact"),
        # The case: JSON refused, anything else at 0.1 (RFC 9110 §12.5.1 q=0).
        pytest.param("application/json;q=0, */*;q=0.1", CSV, id="json-refused-wildcard"),
        pytest.param("image/*", SVG, id="type-wildcard-server-order"),
        pytest.param("image/*;q=0.5, image/png", PNG, id="exact-beats-type-wildcard"),
        # §12.5.1: the most specific range decides a type's quality, not the order.
        pytest.param("*/*;q=0.9, application/json;q=0.2", CSV, id="specific-range-lowers-json"),
        pytest.param("image/png;q=0.9, image/svg+xml;q=0.8", PNG, id="higher-quality"),
        pytest.param("text/csv, application/json", CSV, id="tie-first-listed"),
        pytest.param("application/json, text/csv", JSON, id="tie-first-listed-json"),
        pytest.param("image/gif", None, id="nothing-acceptable"),
        pytest.param("*/*;q=0", None, id="everything-refused"),
        pytest.param("text/*;q=0, */*;q=0.3", JSON, id="type-refused-others-not"),
        pytest.param("garbage", JSON, id="unreadable-as-absent"),
        pytest.param(
            "text/html,application/xhtml+xml,application/xml;q=0.9,*/*;q=0.8",
            JSON,
            id="browser-navigation-gets-json",
        ),
    ],
)
def test_choose_media_type(accept: str | None, chosen: str | None) -> None:
    assert choose_media_type(accept, ALL) == chosen


def test_q_zero_refuses_even_under_a_wildcard() -> None:
    # RFC 9110 §12.5.1: "*/*" accepts, but "application/json;q=0" refuses JSON itself.
    assert choose_media_type("application/json;q=0, */*", (JSON,)) is None


@pytest.mark.parametrize(
    ("accept", "csv"),
    [
        ("text/csv", True),
        ("application/json", False),
        ("text/csv;q=0.5, application/json", False),
        ("text/csv, */*;q=0.1", True),
        ("*/*, text/csv;q=0.5", False),
        (None, False),
    ],
)
def test_csv_only_when_preferred_to_json(accept: str | None, csv: bool) -> None:
    assert prefers_csv(accept) is csv


@pytest.mark.parametrize(
    ("accept", "plot"),
    [
        ("image/svg+xml", "svg"),
        ("image/png;q=0.9, image/svg+xml;q=0.8", "png"),
        ("application/json, image/png;q=0.5", None),
        ("application/json;q=0, image/*;q=0.2", "svg"),
        ("*/*", None),
    ],
)
def test_plot_only_when_preferred_to_json(accept: str, plot: str | None) -> None:
    assert plot_format_for(accept) == plot
