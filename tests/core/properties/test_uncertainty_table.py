"""The uncertainty lookup table: coverage, boundaries, errors, and how each entry is sourced.

The values themselves are the formulations' statements as entered in
service/core/properties/uncertainty.py (each entry names its release, section and basis);
these tests check the table's behavior and the honesty of its bases, not the values. The
entries still "from memory" are pinned below, so the count cannot grow silently.
"""

from __future__ import annotations

import dataclasses

import numpy as np
import pytest

from service.core.errors import InvalidInputError, OutOfRangeError
from service.core.properties.sources import ALL_SOURCES, IAPWS_95, IAPWS_IF97
from service.core.properties.uncertainty import (
    STATEMENTS,
    StatedUncertainty,
    covered_quantities,
    stated_uncertainty,
    statement_defects,
)

# Entries whose release text could not be read (2026-12-03; see the module docstring).
# Remove a row only when its entry has been read from the release and its basis set to
# "release text" with a section, table or figure citation; never add one.
STILL_FROM_MEMORY = {
    ("IAPWS-95", "saturation_pressure", 273.16, 647.096),
    ("IAPWS-95", "saturated_liquid_density", 273.16, 373.15),
    ("IAPWS-95", "saturated_liquid_density", 373.15, 623.15),
    ("IAPWS-95", "saturated_vapor_density", 273.16, 623.15),
    ("IAPWS-95", "liquid_density", 273.15, 373.124),
    ("IAPWS-95", "liquid_isobaric_heat_capacity", 273.15, 623.15),
    ("IAPWS-06 ice Ih", "ice_density", 0.0, 273.16),
    ("IAPWS-06 ice Ih", "ice_isobaric_heat_capacity", 0.0, 273.16),
    ("IAPWS-06 ice Ih", "ice_enthalpy", 0.0, 273.16),
    ("IAPWS-06 ice Ih", "enthalpy_of_sublimation", 0.0, 273.16),
    ("IAPWS-08 melting and sublimation pressure", "sublimation_pressure", 190.0, 273.16),
    ("IAPWS-08 melting and sublimation pressure", "sublimation_pressure", 50.0, 190.0),
    ("IAPWS-08 melting and sublimation pressure", "melting_pressure", 251.165, 273.16),
}
MISSING_RELEASE = {
    "IAPWS-95": "IAPWS R6-95(2018)",
    "IAPWS-06 ice Ih": "IAPWS R10-06(2009)",
    "IAPWS-08 melting and sublimation pressure": "IAPWS R14-08(2011)",
}

REQUIRED = [
    ("IAPWS-95", "saturation_pressure"),
    ("IAPWS-95", "saturated_liquid_density"),
    ("IAPWS-95", "saturated_vapor_density"),
    ("IAPWS-95", "liquid_density"),
    ("IAPWS-95", "liquid_isobaric_heat_capacity"),
    ("IAPWS-95", "enthalpy_of_vaporization"),
    ("IAPWS-95", "vapor_enthalpy"),
    ("IAPWS-IF97", "saturation_pressure"),
    ("IAPWS-06 ice Ih", "ice_density"),
    ("IAPWS-06 ice Ih", "ice_isobaric_heat_capacity"),
    ("IAPWS-06 ice Ih", "ice_enthalpy"),
    ("IAPWS-06 ice Ih", "enthalpy_of_sublimation"),
    ("IAPWS-08 melting and sublimation pressure", "sublimation_pressure"),
    ("IAPWS-08 melting and sublimation pressure", "melting_pressure"),
]


@pytest.mark.parametrize(
    ("formulation", "quantity"), REQUIRED, ids=[f"{f}-{q}" for f, q in REQUIRED]
)
def test_required_quantities_are_covered(formulation: str, quantity: str) -> None:
    assert (formulation, quantity) in covered_quantities()


@pytest.mark.parametrize(
    ("formulation", "quantity"),
    covered_quantities(),
    ids=[f"{f}-{q}" for f, q in covered_quantities()],
)
def test_every_covered_quantity_returns_positive_values(formulation: str, quantity: str) -> None:
    entries = [e for e in STATEMENTS if e.formulation == formulation and e.quantity == quantity]
    low = min(e.minimum_temperature for e in entries)
    high = max(e.maximum_temperature for e in entries)
    temperatures = np.linspace(low, high, 11)
    lookup = stated_uncertainty(formulation, quantity, temperatures)
    assert lookup.relative_uncertainty.shape == temperatures.shape
    assert np.all(lookup.relative_uncertainty > 0.0)
    assert np.all(lookup.relative_uncertainty < 0.1)
    for index in np.unique(lookup.statement_index):
        assert 0 <= index < len(lookup.statements)
    for statement in lookup.statements:
        assert statement.statement and statement.section and statement.coverage
        assert statement.basis in ("release text", "from memory", "derived")


def test_every_statement_names_a_known_formulation() -> None:
    known = {source.formulation for source in ALL_SOURCES}
    assert {entry.formulation for entry in STATEMENTS} <= known


def test_region_boundary_uses_lower_range_and_switches_above() -> None:
    lookup = stated_uncertainty(
        IAPWS_95.formulation, "saturated_liquid_density", [300.0, 373.15, 373.16, 500.0]
    )
    low, high = lookup.statements
    assert low.maximum_temperature == 373.15 and high.minimum_temperature == 373.15
    np.testing.assert_array_equal(lookup.statement_index, [0, 0, 1, 1])
    np.testing.assert_array_equal(
        lookup.relative_uncertainty, [low.relative, low.relative, high.relative, high.relative]
    )


def test_zero_dimensional_input_gives_zero_dimensional_output() -> None:
    lookup = stated_uncertainty(IAPWS_IF97.formulation, "saturation_pressure", 400.0)
    assert lookup.relative_uncertainty.shape == ()
    assert isinstance(lookup.statements[0], StatedUncertainty)


def test_temperature_outside_every_statement_raises() -> None:
    with pytest.raises(OutOfRangeError) as caught:
        stated_uncertainty(IAPWS_95.formulation, "saturation_pressure", [300.0, 700.0])
    assert caught.value.variable == "temperature"
    assert caught.value.index == 1
    assert caught.value.maximum == 647.096


def test_ambient_pressure_statement_refuses_high_pressure() -> None:
    stated_uncertainty(IAPWS_95.formulation, "liquid_density", 300.0, 101325.0)
    with pytest.raises(OutOfRangeError) as caught:
        stated_uncertainty(IAPWS_95.formulation, "liquid_density", [300.0, 310.0], [1e5, 50e6])
    assert caught.value.variable == "pressure"
    assert caught.value.index == 1


def test_unknown_quantity_raises_invalid_input() -> None:
    with pytest.raises(InvalidInputError) as caught:
        stated_uncertainty(IAPWS_95.formulation, "viscosity", 300.0)
    assert caught.value.variable == "quantity"


def test_unknown_formulation_raises_invalid_input() -> None:
    with pytest.raises(InvalidInputError) as caught:
        stated_uncertainty("IFC-67", "saturation_pressure", 300.0)
    assert caught.value.variable == "formulation"


def test_non_finite_temperature_raises_invalid_input() -> None:
    with pytest.raises(InvalidInputError):
        stated_uncertainty(IAPWS_95.formulation, "saturation_pressure", [300.0, np.nan])


def _key(entry: StatedUncertainty) -> tuple[str, str, float, float]:
    return (entry.formulation, entry.quantity, entry.minimum_temperature, entry.maximum_temperature)


def test_the_from_memory_entries_are_exactly_the_pinned_ones() -> None:
    from_memory = {_key(e) for e in STATEMENTS if e.basis == "from memory"}
    assert from_memory == STILL_FROM_MEMORY


@pytest.mark.parametrize("entry", STATEMENTS, ids=lambda e: f"{e.formulation}-{e.quantity}")
def test_every_entry_is_sourced_as_its_basis_claims(entry: StatedUncertainty) -> None:
    assert statement_defects(entry) == ()


@pytest.mark.parametrize(
    "entry",
    [e for e in STATEMENTS if e.basis == "from memory"],
    ids=lambda e: f"{e.formulation}-{e.quantity}-{e.minimum_temperature}",
)
def test_every_from_memory_entry_names_the_release_that_could_not_be_read(
    entry: StatedUncertainty,
) -> None:
    release = MISSING_RELEASE[entry.formulation]
    assert "Release text not found: the uncertainty" in entry.statement
    assert release in entry.statement.split("Release text not found:")[1]
    assert entry.section.startswith(release)
    assert "not read" in entry.coverage


def test_derived_entries_rest_on_entries_of_the_table() -> None:
    derived = [e for e in STATEMENTS if e.basis == "derived"]
    assert len(derived) == 9
    for entry in derived:
        assert entry.section.startswith("derived by tripoint")
        assert "not a release statement" in entry.coverage


_GOOD_RELEASE_TEXT = StatedUncertainty(
    "IAPWS-95",
    "saturation_pressure",
    273.16,
    647.096,
    0.00025,
    "k = 2 as the release states it",
    "Vapor pressure: 0.025 %.",
    "IAPWS R6-95(2018), Section 6",
    "release text",
    statement_id="iapws-95.saturation-pressure",
)


def test_a_cited_release_text_entry_has_no_defects() -> None:
    assert statement_defects(_GOOD_RELEASE_TEXT) == ()
    for section in ("IAPWS R10-06(2009), Table 3", "IAPWS R6-95(2018), Fig. 2"):
        assert statement_defects(dataclasses.replace(_GOOD_RELEASE_TEXT, section=section)) == ()


@pytest.mark.parametrize(
    ("changes", "defect"),
    [
        ({"section": "IAPWS R6-95(2018), uncertainty estimates"}, "cite a section"),
        ({"section": "IAPWS R6-95(2018), Section 6 (section number not verified)"}, "unverified"),
        ({"statement": "Vapor pressure: 0.025 %, as recalled."}, "recalled"),
        ({"coverage": "k = 2 assumed, coverage recalled"}, "recalled"),
        ({"basis": "from memory"}, "missing release"),
        ({"basis": "from memory", "statement": "Release text not found: somewhere."}, "missing"),
        ({"basis": "derived"}, "derived"),
    ],
    ids=[
        "release-text-without-citation",
        "release-text-unverified-section",
        "release-text-recalled-statement",
        "release-text-recalled-coverage",
        "from-memory-without-missing-document",
        "from-memory-without-release-name",
        "derived-without-derivation",
    ],
)
def test_mis_sourced_entries_are_caught(changes: dict[str, str], defect: str) -> None:
    defects = statement_defects(dataclasses.replace(_GOOD_RELEASE_TEXT, **changes))  # type: ignore[arg-type]
    assert len(defects) == 1
    assert defect in defects[0]
