"""The uncertainty lookup table: coverage, boundaries, errors.

The values themselves are the formulations' statements as entered in
service/core/uncertainty.py (each entry names its release, section and basis); these
tests check the table's behavior, not the statements.
"""

from __future__ import annotations

import numpy as np
import pytest

from service.core.errors import InvalidInputError, OutOfRangeError
from service.core.properties.sources import ALL_SOURCES, IAPWS_95, IAPWS_IF97
from service.core.properties.uncertainty import (
    STATEMENTS,
    StatedUncertainty,
    covered_quantities,
    stated_uncertainty,
)

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
