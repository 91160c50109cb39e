"""IAPWS R13-08 Table 8: check values for the saline part of the Gibbs function of seawater.

Source: IAPWS R13-08 (2008), "Release on the IAPWS Formulation 2008 for the Thermodynamic
Properties of Seawater", Table 8 ("Numerical check values for the water part computed from
g_W, the saline part g_S and the sum g ..."), parts a, b and c at
(S_A, T, p) = (0.03516504 kg/kg, 273.15 K, 101325 Pa), (0.1 kg/kg, 353 K, 101325 Pa) and
(0.03516504 kg/kg, 273.15 K, 100 MPa). Only the saline column is checked here: the water
column depends on the pure-water formulation, which the core takes from IAPWS-95 and which
has its own check tables. The release text was not in this project's reference store: the
values were read from a published transcription of Table 8 (nine significant digits) and
agree with the core to all printed digits, which a transcription error would not.
"""

from __future__ import annotations

from typing import NamedTuple

import pytest

from service.core.solutions.seawater import saline_gibbs_derivatives

STATES = (
    (0.03516504, 273.15, 101325.0),
    (0.1, 353.0, 101325.0),
    (0.03516504, 273.15, 1.0e8),
)
STATE_IDS = ("8a-standard-seawater", "8b-100g-kg-353K", "8c-100MPa")
RELATIVE_TOLERANCE = 6e-9
"""Half a unit in the ninth significant digit the release prints, relative to a leading 1."""


class Row(NamedTuple):
    quantity: str
    values: tuple[float, float, float]


ROWS = (
    Row("gibbs_energy", (-0.101342742e3, 0.150871740e5, -0.260093051e4)),
    Row("salinity_derivative", (0.639974067e5, 0.251957276e6, -0.545861581e4)),
    Row("temperature_derivative", (-0.147643376, 0.156230907e3, 0.754045685e1)),
    Row("pressure_derivative", (-0.274957224e-4, -0.579227286e-4, -0.229123842e-4)),
    Row("salinity_pressure_derivative", (-0.759615412e-3, -0.305957802e-3, -0.640757619e-3)),
    Row("second_temperature_derivative", (0.852861151, 0.127922649e1, 0.488076974)),
    Row("temperature_pressure_derivative", (0.119286787e-6, 0.803061596e-6, 0.466284412e-7)),
    Row("second_pressure_derivative", (0.581535172e-13, 0.213086154e-12, 0.357345736e-13)),
    # chemical potential of water, saline part: g_S - S_A dg_S/dS_A
    Row("water_potential", (-0.235181411e4, -0.101085536e5, -0.240897806e4)),
)


@pytest.mark.parametrize("row", ROWS, ids=[row.quantity for row in ROWS])
@pytest.mark.parametrize("state", range(3), ids=STATE_IDS)
def test_saline_gibbs_check_values(row: Row, state: int) -> None:
    salinity, temperature, pressure = STATES[state]
    result = saline_gibbs_derivatives(salinity, temperature, pressure)
    value = float(getattr(result, row.quantity))
    assert value == pytest.approx(row.values[state], rel=RELATIVE_TOLERANCE)


@pytest.mark.parametrize("state", range(3), ids=STATE_IDS)
def test_saline_enthalpy_and_heat_capacity(state: int) -> None:
    # Table 8 rows h_S = g_S - T dg_S/dT and c_p,S = -T d2g_S/dT2, saline column.
    enthalpy = (-0.610139535e2, -0.400623363e5, -0.466060630e4)
    heat_capacity = (-0.232959023e3, -0.451566952e3, -0.133318225e3)
    salinity, temperature, pressure = STATES[state]
    result = saline_gibbs_derivatives(salinity, temperature, pressure)
    value = float(result.gibbs_energy - temperature * result.temperature_derivative)
    assert value == pytest.approx(enthalpy[state], rel=RELATIVE_TOLERANCE)
    cp = float(-temperature * result.second_temperature_derivative)
    assert cp == pytest.approx(heat_capacity[state], rel=RELATIVE_TOLERANCE)
