"""IAPWS R7-97(2012) computer-program verification values, Tables 5, 15, 35 and 36.

Source: IAPWS R7-97(2012), "Revised Release on the IAPWS Industrial Formulation 1997
for the Thermodynamic Properties of Water and Steam":

- Table 5: region 1 (Eq. 7) at (300 K, 3 MPa), (300 K, 80 MPa), (500 K, 3 MPa);
- Table 15: region 2 (Eq. 15) at (300 K, 0.0035 MPa), (700 K, 0.0035 MPa), (700 K, 30 MPa);
- Table 35: saturation pressure (Eq. 30) at 300 K, 500 K, 600 K;
- Table 36: saturation temperature (Eq. 31) at 0.1 MPa, 1 MPa, 10 MPa.

The release prints 9 significant digits in MPa, kJ/kg, kJ/(kg K), m3/kg and m/s; the
values below are converted to SI. The tolerance is a relative 5e-9 (half a unit in
the ninth digit of the smallest mantissa, 0.1...).
"""

from __future__ import annotations

import numpy as np
import pytest

from service.core.properties.if97 import (
    if97_liquid_properties,
    if97_liquid_speed_of_sound,
    if97_saturation_pressure,
    if97_saturation_temperature,
    if97_vapor_properties,
    if97_vapor_speed_of_sound,
)

RELATIVE_TOLERANCE = 5e-9  # nine significant digits, IAPWS R7-97(2012) Tables 5, 15, 35, 36

# (temperature K, pressure Pa, v m3/kg, h J/kg, u J/kg, s J/(kg K), cp J/(kg K), w m/s)
TABLE_5 = [  # IAPWS R7-97(2012) Table 5
    pytest.param(
        300.0,
        3.0e6,
        0.100215168e-2,
        0.115331273e6,
        0.112324818e6,
        0.392294792e3,
        0.417301218e4,
        0.150773921e4,
        id="table5-300K-3MPa",
    ),
    pytest.param(
        300.0,
        80.0e6,
        0.971180894e-3,
        0.184142828e6,
        0.106448356e6,
        0.368563852e3,
        0.401008987e4,
        0.163469054e4,
        id="table5-300K-80MPa",
    ),
    pytest.param(
        500.0,
        3.0e6,
        0.120241800e-2,
        0.975542239e6,
        0.971934985e6,
        0.258041912e4,
        0.465580682e4,
        0.124071337e4,
        id="table5-500K-3MPa",
    ),
]

TABLE_15 = [  # IAPWS R7-97(2012) Table 15
    pytest.param(
        300.0,
        0.0035e6,
        0.394913866e2,
        0.254991145e7,
        0.241169160e7,
        0.852238967e4,
        0.191300162e4,
        0.427920172e3,
        id="table15-300K-0.0035MPa",
    ),
    pytest.param(
        700.0,
        0.0035e6,
        0.923015898e2,
        0.333568375e7,
        0.301262819e7,
        0.101749996e5,
        0.208141274e4,
        0.644289068e3,
        id="table15-700K-0.0035MPa",
    ),
    pytest.param(
        700.0,
        30.0e6,
        0.542946619e-2,
        0.263149474e7,
        0.246861076e7,
        0.517540298e4,
        0.103505092e5,
        0.480386523e3,
        id="table15-700K-30MPa",
    ),
]

TABLE_35 = [  # IAPWS R7-97(2012) Table 35: (T K, p_sat Pa)
    pytest.param(300.0, 0.353658941e-2 * 1e6, id="table35-300K"),
    pytest.param(500.0, 0.263889776e1 * 1e6, id="table35-500K"),
    pytest.param(600.0, 0.123443146e2 * 1e6, id="table35-600K"),
]

TABLE_36 = [  # IAPWS R7-97(2012) Table 36: (p Pa, T_sat K)
    pytest.param(0.1e6, 0.372755919e3, id="table36-0.1MPa"),
    pytest.param(1.0e6, 0.453035632e3, id="table36-1MPa"),
    pytest.param(10.0e6, 0.584149488e3, id="table36-10MPa"),
]


def _assert_close(name: str, actual: object, expected: float) -> None:
    value = float(np.asarray(actual))
    assert value == pytest.approx(expected, rel=RELATIVE_TOLERANCE, abs=0.0), name


@pytest.mark.parametrize(
    ("temperature", "pressure", "volume", "enthalpy", "energy", "entropy", "cp", "sound"),
    TABLE_5,
)
def test_region1_matches_table_5(
    temperature: float,
    pressure: float,
    volume: float,
    enthalpy: float,
    energy: float,
    entropy: float,
    cp: float,
    sound: float,
) -> None:
    state = if97_liquid_properties(temperature, pressure)
    _assert_close("specific volume", 1.0 / state.density, volume)
    _assert_close("specific enthalpy", state.specific_enthalpy, enthalpy)
    _assert_close("specific internal energy", state.specific_internal_energy, energy)
    _assert_close("specific entropy", state.specific_entropy, entropy)
    _assert_close("isobaric heat capacity", state.specific_isobaric_heat_capacity, cp)
    _assert_close("speed of sound", if97_liquid_speed_of_sound(temperature, pressure), sound)


@pytest.mark.parametrize(
    ("temperature", "pressure", "volume", "enthalpy", "energy", "entropy", "cp", "sound"),
    TABLE_15,
)
def test_region2_matches_table_15(
    temperature: float,
    pressure: float,
    volume: float,
    enthalpy: float,
    energy: float,
    entropy: float,
    cp: float,
    sound: float,
) -> None:
    state = if97_vapor_properties(temperature, pressure)
    _assert_close("specific volume", 1.0 / state.density, volume)
    _assert_close("specific enthalpy", state.specific_enthalpy, enthalpy)
    _assert_close("specific internal energy", state.specific_internal_energy, energy)
    _assert_close("specific entropy", state.specific_entropy, entropy)
    _assert_close("isobaric heat capacity", state.specific_isobaric_heat_capacity, cp)
    _assert_close("speed of sound", if97_vapor_speed_of_sound(temperature, pressure), sound)


@pytest.mark.parametrize(("temperature", "pressure"), TABLE_35)
def test_saturation_pressure_matches_table_35(temperature: float, pressure: float) -> None:
    _assert_close("saturation pressure", if97_saturation_pressure(temperature), pressure)


@pytest.mark.parametrize(("pressure", "temperature"), TABLE_36)
def test_saturation_temperature_matches_table_36(pressure: float, temperature: float) -> None:
    _assert_close("saturation temperature", if97_saturation_temperature(pressure), temperature)
