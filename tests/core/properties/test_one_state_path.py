"""The one-state path (Python floats) against the array path it stands in for.

A single temperature is answered without arrays: the Chebyshev tables are summed on
Python floats, the uncertainty statement is found by a loop, the advisories by
comparisons. The claim is that the answer is the same, bit for bit, as the array path's
for a one-element array; these tests hold it to exact equality (no tolerance), over
random temperatures and the range ends. The array path itself is checked against the
exact IAPWS-95 solution and the iapws package in test_saturation_fast_path.py.
"""

from __future__ import annotations

import numpy as np
import pytest

from service.core.errors import InvalidInputError, OutOfRangeError
from service.core.properties.constants import CRITICAL_TEMPERATURE, TRIPLE_POINT_TEMPERATURE
from service.core.properties.lookups import saturation_lookup, saturation_point_lookup
from service.core.properties.saturation import (
    CRITICAL_FALLBACK_BAND,
    Formulation,
    SaturationPoint,
    _tables,
    saturation_by_temperature,
    saturation_point_by_temperature,
)
from service.core.properties.uncertainty import STATEMENTS, stated_uncertainty, statement_at

_RANDOM = np.random.default_rng(20261202)
_TABLE_LIMIT = CRITICAL_TEMPERATURE - CRITICAL_FALLBACK_BAND
_EDGES = [
    TRIPLE_POINT_TEMPERATURE,
    TRIPLE_POINT_TEMPERATURE + 1e-12,
    273.15 + 0.01,  # round-off of a Celsius conversion: 273.15999999999997
    _TABLE_LIMIT,
    _TABLE_LIMIT + 1e-9,  # first state of the exact critical band
    CRITICAL_TEMPERATURE - 0.9,  # near-critical advisory
    CRITICAL_TEMPERATURE,  # cp diverges
]
TEMPERATURES = [*_RANDOM.uniform(TRIPLE_POINT_TEMPERATURE, CRITICAL_TEMPERATURE, 400), *_EDGES]


def test_table_one_point_sum_equals_the_vectorized_sum() -> None:
    tables = _tables()
    points = _RANDOM.uniform(TRIPLE_POINT_TEMPERATURE, _TABLE_LIMIT, 2000)
    for table in (tables.properties, tables.log_pressure):
        values = table(points)
        slopes = table.derivative(points)
        one_by_one = np.array([table.at_point(float(t)) for t in points]).T
        one_element = np.array([table(np.array([t]))[:, 0] for t in points]).T
        one_element_slopes = np.array([table.derivative(np.array([t]))[:, 0] for t in points]).T
        assert np.array_equal(one_by_one, values)
        assert np.array_equal(one_element, values)
        assert np.array_equal(one_element_slopes, slopes)


@pytest.mark.parametrize("bad", [float("nan"), float("inf"), float("-inf")])
def test_table_one_point_of_a_non_finite_value_is_nan_not_an_exception(bad: float) -> None:
    # Callers validate first; a table asked anyway answers NaN rather than raising from
    # floor() (the array path's result for a non-finite point is not defined).
    with np.errstate(invalid="ignore"):
        values = _tables().properties(np.array([bad]))
    assert values.shape == (9, 1)
    assert np.isnan(values).all()


@pytest.mark.parametrize("formulation", ["IAPWS-95", "IAPWS-IF97"])
def test_one_state_equals_the_array_path(formulation: Formulation) -> None:
    upper = CRITICAL_TEMPERATURE if formulation == "IAPWS-95" else 623.15
    for temperature in TEMPERATURES:
        if temperature > upper:
            continue
        point = saturation_point_by_temperature(float(temperature), formulation=formulation)
        states = saturation_by_temperature(np.array([temperature]), formulation=formulation)
        assert point == SaturationPoint.first_of(states), temperature


@pytest.mark.parametrize("bad", [273.0, 700.0, float("nan"), float("inf")])
def test_one_state_refuses_what_the_array_path_refuses(bad: float) -> None:
    # One value reaches the core as a one-element array from the HTTP layer; its errors
    # name no element (there is only one), and the one-state path must say the same.
    with pytest.raises((OutOfRangeError, InvalidInputError)) as array_error:
        saturation_by_temperature(np.array([bad]))
    with pytest.raises(type(array_error.value)) as point_error:
        saturation_point_by_temperature(bad)
    assert str(point_error.value) == str(array_error.value)
    if isinstance(array_error.value, OutOfRangeError):
        assert isinstance(point_error.value, OutOfRangeError)
        assert point_error.value.index is array_error.value.index is None


def test_one_state_lookup_states_the_same_as_the_array_lookup() -> None:
    for temperature in TEMPERATURES:
        point = saturation_point_lookup(temperature=float(temperature))
        array = saturation_lookup(temperature=np.array([temperature]))
        assert point.states == SaturationPoint.first_of(array.states)
        assert point.uncertainties == array.uncertainties
        assert point.advisories == array.advisories
        assert point.sources == array.sources
        assert point.assumptions == array.assumptions
    codes = {
        advisory.code
        for temperature in _EDGES
        for advisory in saturation_point_lookup(temperature=temperature).advisories
    }
    assert codes == {"near-critical-point", "diverges"}


def test_statement_at_one_state_is_the_array_lookups_statement() -> None:
    pairs = sorted({(entry.formulation, entry.quantity) for entry in STATEMENTS})
    for formulation, quantity in pairs:
        entries = [e for e in STATEMENTS if (e.formulation, e.quantity) == (formulation, quantity)]
        ends = [t for e in entries for t in (e.minimum_temperature, e.maximum_temperature)]
        low, high = min(ends), max(ends)
        temperatures = [*ends, *_RANDOM.uniform(low, high, 50)]
        for temperature in temperatures:
            for pressure in (None, 1.0e5, 5.0e6):
                try:
                    expected = stated_uncertainty(formulation, quantity, temperature, pressure)
                except OutOfRangeError as error:
                    with pytest.raises(OutOfRangeError) as raised:
                        statement_at(formulation, quantity, temperature, pressure)
                    assert str(raised.value) == str(error)
                    continue
                found = statement_at(formulation, quantity, temperature, pressure)
                assert found == expected.statements[0], (formulation, quantity, temperature)
