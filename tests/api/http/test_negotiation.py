"""Accept-header negotiation shared by CSV answers and simulation plots (RFC 9110, 12.5.1)."""

from __future__ import annotations

import pytest

from service.api.http.csv_io import prefers_csv
from service.api.http.negotiation import accept_qualities
from service.api.simulations.plots import plot_format_for


def test_qualities_take_the_highest_per_media_range() -> None:
    qualities = accept_qualities("text/csv;q=0.4, TEXT/CSV;q=0.9, application/json;q=bad")
    assert qualities == {"text/csv": 0.9, "application/json": 0.0}


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
        ("*/*", None),
    ],
)
def test_plot_only_when_preferred_to_json(accept: str, plot: str | None) -> None:
    assert plot_format_for(accept) == plot
