"""Stored answers drawn again in the media types their route answered in.

``GET /v1/calculations/{calculation_id}`` answers JSON (the record) by default, and for a
kind whose route also spoke CSV or drew a plot, that CSV or plot made again from the stored
answer: the CSV of a stored answer is the CSV its route sent (the same flattening of the
same member), a plot is the route's plot drawn from the stored numbers.
"""

from __future__ import annotations

from collections.abc import Callable, Mapping
from dataclasses import dataclass
from typing import Any, Final

from service.api.calculations.schemas import RecordKind
from service.api.drying.plots import plot_stored_design_space, plot_stored_primary_drying
from service.api.http.csv_io import CSV_MEDIA_TYPE, answer_csv
from service.api.http.negotiation import JSON_MEDIA_TYPE
from service.api.simulations.plots import PLOT_MEDIA_TYPES, PlotFormat, plot_stored_simulation
from service.api.sizing.plots import plot_stored_design_curve
from service.records import CalculationRecord

__all__ = ["Rendering", "media_types_of", "render"]

PlotOfRecord = Callable[[Mapping[str, Any], Mapping[str, Any], PlotFormat], bytes]
"""(stored inputs, stored answer, format) -> image."""


@dataclass(frozen=True)
class Rendering:
    """What a kind's route answered besides JSON."""

    csv: bool = False
    csv_part: str | None = None
    """The member of the answer its CSV flattens (``CsvRoute.answer_part`` in ``app.py``)."""
    plot: PlotOfRecord | None = None


def _simulation_plot(
    _inputs: Mapping[str, Any], answer: Mapping[str, Any], kind: PlotFormat
) -> bytes:
    return plot_stored_simulation(answer, kind)


_RENDERINGS: Final[dict[RecordKind, Rendering]] = {
    RecordKind.FLASH_FREEZE: Rendering(csv=True),
    RecordKind.EVAPORATIVE_COOLING: Rendering(csv=True),
    RecordKind.VACUUM_CHAMBER: Rendering(csv=True, csv_part="series", plot=_simulation_plot),
    # A sweep has no series: its CSV is the whole answer, one row per case; no plot.
    RecordKind.VACUUM_CHAMBER_SWEEP: Rendering(csv=True, csv_part="series"),
    RecordKind.PRIMARY_DRYING: Rendering(
        csv=True, csv_part="series", plot=plot_stored_primary_drying
    ),
    RecordKind.PRIMARY_DRYING_DESIGN_SPACE: Rendering(
        csv=True, csv_part="cells", plot=plot_stored_design_space
    ),
    # The calibration plot draws the fitted model's whole run, which its answer does not
    # hold (only the fitted values at the readings): JSON only.
    RecordKind.VACUUM_CHAMBER_CALIBRATION: Rendering(),
    RecordKind.VACUUM_CHAMBER_SIZING: Rendering(plot=plot_stored_design_curve),
}
"""Per kind, as its route: the balances, simulations and design spaces speak CSV
(``CSV_ROUTES``); the chamber simulation, the primary-drying run and design space and the
sizing draw their plots again from the stored answer (and, for the critical temperature,
target time or field unit, the stored request)."""

ALL_MEDIA_TYPES: Final = (JSON_MEDIA_TYPE, CSV_MEDIA_TYPE, *PLOT_MEDIA_TYPES.values())
"""Every media type a stored record may be answered in, JSON first."""


def _rendering(kind: str) -> Rendering:
    try:
        return _RENDERINGS[RecordKind(kind)]
    except ValueError:
        return Rendering()  # a kind this version does not know: JSON only


def media_types_of(kind: str) -> tuple[str, ...]:
    """The media types a record of ``kind`` is answered in, JSON (its default) first."""
    rendering = _rendering(kind)
    plots = tuple(PLOT_MEDIA_TYPES.values()) if rendering.plot is not None else ()
    return (JSON_MEDIA_TYPE, *((CSV_MEDIA_TYPE,) if rendering.csv else ()), *plots)


def render(record: CalculationRecord, media_type: str) -> bytes:
    """The stored answer of ``record`` as ``media_type`` (one of :func:`media_types_of`
    other than JSON).

    Raises
    ------
    KeyError, ValueError
        The stored answer lacks what the rendering needs.
    """
    rendering = _rendering(record.kind)
    if media_type == CSV_MEDIA_TYPE and rendering.csv:
        return answer_csv(record.result, rendering.csv_part)
    for kind, plot_type in PLOT_MEDIA_TYPES.items():
        if media_type == plot_type and rendering.plot is not None:
            return rendering.plot(record.inputs, record.result, kind)
    raise ValueError(f"a record of kind {record.kind} has no {media_type} rendering")
