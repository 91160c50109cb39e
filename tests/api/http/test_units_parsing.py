"""Unit parsing at the edge: strings with units, offset temperatures, unit sets.

Conversion factors: NIST SP 811 (2008 edition), Appendix B.8/B.9 (psi = 6894.757 Pa,
Btu_IT/(lb*degF) = 4186.8 J/(kg*K), degF to K).
"""

from __future__ import annotations

import numpy as np
import pytest

from service.api.http.models import QuantityValue, QuantityValues
from service.api.http.quantities import read_quantity
from service.api.http.units import Dimension, UnitSet, convert_from_si, convert_to_si
from service.core.errors import InvalidInputError

CASES = [
    # (id, text, dimension, SI value, relative tolerance, source)
    ("celsius", "25 degC", Dimension.TEMPERATURE, 298.15, 1e-14),  # definition of degC
    ("fahrenheit", "77 degF", Dimension.TEMPERATURE, 298.15, 1e-14),  # NIST SP 811 B.9
    ("kelvin", "298.15 K", Dimension.TEMPERATURE, 298.15, 0.0),
    ("rankine", "536.67 degR", Dimension.TEMPERATURE, 298.15, 1e-14),  # NIST SP 811 B.9
    ("kilopascal", "2 kPa", Dimension.PRESSURE, 2000.0, 0.0),
    ("psi", "0.3 psi", Dimension.PRESSURE, 0.3 * 6894.757293168, 1e-12),  # NIST SP 811 B.8
    ("millibar", "6.11657 mbar", Dimension.PRESSURE, 611.657, 1e-14),
    ("torr", "1 torr", Dimension.PRESSURE, 101325.0 / 760.0, 1e-12),  # NIST SP 811 B.8
    ("heat-capacity", "3.9 kJ/(kg*K)", Dimension.SPECIFIC_ENTROPY, 3900.0, 1e-14),
    ("heat-capacity-degC", "3.9 kJ/(kg*degC)", Dimension.SPECIFIC_ENTROPY, 3900.0, 1e-14),
    ("heat-capacity-US", "1 Btu/(lb*degF)", Dimension.SPECIFIC_ENTROPY, 4186.8, 1e-12),
    ("enthalpy-US", "1 Btu/lb", Dimension.SPECIFIC_ENERGY, 2326.0, 1e-12),  # NIST SP 811 B.8
    ("no-unit", "300", Dimension.TEMPERATURE, 300.0, 0.0),
]


@pytest.mark.parametrize(
    ("text", "dimension", "expected", "tolerance"),
    [case[1:] for case in CASES],
    ids=[case[0] for case in CASES],
)
def test_text_with_unit_reads_to_si(
    text: str, dimension: Dimension, expected: float, tolerance: float
) -> None:
    parsed = read_quantity(text, field="x", dimension=dimension)
    assert parsed.is_array is False
    assert parsed.si[0] == pytest.approx(expected, rel=tolerance, abs=1e-12)


def test_values_object_reads_as_array_with_uncertainty_as_difference() -> None:
    parsed = read_quantity(
        QuantityValues(values=[20.0, 30.0], unit="degF", uncertainty=0.9),
        field="temperature",
        dimension=Dimension.TEMPERATURE,
    )
    assert parsed.is_array
    np.testing.assert_allclose(parsed.si, [266.483333333333, 272.038888888889], rtol=1e-12)
    assert parsed.standard_uncertainty is not None
    np.testing.assert_allclose(parsed.standard_uncertainty, [0.5, 0.5], rtol=1e-12)


def test_value_object_and_list() -> None:
    single = read_quantity(
        QuantityValue(value=2.0, unit="kPa"), field="pressure", dimension=Dimension.PRESSURE
    )
    assert single.si.tolist() == [2000.0] and not single.is_array
    listed = read_quantity([1.0, 2.0], field="pressure", dimension=Dimension.PRESSURE)
    assert listed.si.tolist() == [1.0, 2.0] and listed.is_array


@pytest.mark.parametrize(
    ("text", "dimension"),
    [
        ("25 kg", Dimension.TEMPERATURE),
        ("25 parsecs", Dimension.PRESSURE),
        ("warm", Dimension.TEMPERATURE),
        ("nan degC", Dimension.TEMPERATURE),
        ("25 degC", Dimension.PRESSURE),
        ("1 C", Dimension.TEMPERATURE),
    ],
    ids=[
        "mass-for-temperature",
        "unknown-unit",
        "not-a-number",
        "nan",
        "wrong-dimension",
        "coulomb",
    ],
)
def test_bad_text_raises_naming_the_field(text: str, dimension: Dimension) -> None:
    with pytest.raises(InvalidInputError) as caught:
        read_quantity(text, field="temperature", dimension=dimension)
    assert caught.value.variable == "temperature"


@pytest.mark.parametrize(
    ("unit_set", "dimension", "si", "expected"),
    [
        (UnitSet.ENGINEERING, Dimension.TEMPERATURE, 273.15, 0.0),
        (UnitSet.US, Dimension.TEMPERATURE, 273.15, 32.0),
        (UnitSet.ENGINEERING, Dimension.PRESSURE, 101325.0, 101.325),
        (UnitSet.US, Dimension.PRESSURE, 6894.757293168, 1.0),
        (UnitSet.US, Dimension.SPECIFIC_ENERGY, 2326.0, 1.0),
        (UnitSet.US, Dimension.SPECIFIC_ENTROPY, 4186.8, 1.0),
        (UnitSet.US, Dimension.DENSITY, 16.01846337396, 1.0),  # NIST SP 811 B.8, lb/ft3
        (UnitSet.ENGINEERING, Dimension.SPECIFIC_ENTROPY, 4186.8, 4.1868),
    ],
)
def test_output_unit_sets(
    unit_set: UnitSet, dimension: Dimension, si: float, expected: float
) -> None:
    converted = convert_from_si(np.array([si]), dimension, unit_set)
    assert converted[0] == pytest.approx(expected, rel=1e-10, abs=1e-12)


def test_round_trip_through_every_unit_set() -> None:
    si = np.array([250.0, 300.0, 600.0])
    for unit_set in UnitSet:
        from service.api.http.units import output_unit

        label = output_unit(Dimension.TEMPERATURE, unit_set)
        back = convert_to_si(
            convert_from_si(si, Dimension.TEMPERATURE, unit_set),
            label,
            Dimension.TEMPERATURE,
            field="t",
        )
        np.testing.assert_allclose(back, si, rtol=1e-14)
