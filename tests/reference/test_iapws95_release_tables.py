"""IAPWS R6-95(2018) computer-program verification values, Tables 6, 7 and 8.

Source: IAPWS R6-95(2018), "Revised Release on the IAPWS Formulation 1995 for the
Thermodynamic Properties of Ordinary Water Substance for General and Scientific Use":

- Table 6: ideal-gas part phi0 and residual part phir of the dimensionless Helmholtz
  energy and their derivatives at T = 500 K, rho = 838.025 kg/m3;
- Table 7: pressure, isochoric heat capacity, speed of sound and entropy at selected
  (T, rho) in the single-phase region;
- Table 8: saturation pressure, coexisting densities, enthalpies and entropies at
  275 K, 450 K and 625 K (Maxwell criterion).

The release prints 9 significant digits in MPa, kJ/kg, kJ/(kg K) and m/s; values are
converted to SI here. Tolerance: relative 5e-9, half a unit in the ninth digit of the
smallest mantissa (0.1...); zero entries are compared with an absolute 1e-12.
"""

from __future__ import annotations

import numpy as np
import pytest

from service.core.properties.constants import CRITICAL_DENSITY, CRITICAL_TEMPERATURE
from service.core.properties.helmholtz import (
    fluid_derivatives,
    fluid_properties,
    ideal_gas_part,
    residual_part,
    solve_saturation,
)
from service.core.properties.saturation import saturation_by_temperature

RELATIVE_TOLERANCE = 5e-9  # nine significant digits, IAPWS R6-95(2018) Tables 6-8

# --- Table 6 ---------------------------------------------------------------------------
TABLE_6_DELTA = 838.025 / CRITICAL_DENSITY
TABLE_6_TAU = CRITICAL_TEMPERATURE / 500.0

TABLE_6 = [  # IAPWS R6-95(2018) Table 6, T = 500 K, rho = 838.025 kg/m3
    pytest.param("ideal", "phi", 0.204797733e1, id="phi0"),
    pytest.param("ideal", "phi_delta", 0.384236747, id="phi0_delta"),
    pytest.param("ideal", "phi_deltadelta", -0.147637878, id="phi0_deltadelta"),
    pytest.param("ideal", "phi_tau", 0.904611106e1, id="phi0_tau"),
    pytest.param("ideal", "phi_tautau", -0.193249185e1, id="phi0_tautau"),
    pytest.param("ideal", "phi_deltatau", 0.0, id="phi0_deltatau"),
    pytest.param("residual", "phi", -0.342693206e1, id="phir"),
    pytest.param("residual", "phi_delta", -0.364366650, id="phir_delta"),
    pytest.param("residual", "phi_deltadelta", 0.856063701, id="phir_deltadelta"),
    pytest.param("residual", "phi_tau", -0.581403435e1, id="phir_tau"),
    pytest.param("residual", "phi_tautau", -0.223440737e1, id="phir_tautau"),
    pytest.param("residual", "phi_deltatau", -0.112176915e1, id="phir_deltatau"),
]


@pytest.mark.parametrize(("part", "name", "expected"), TABLE_6)
def test_table_6_helmholtz_parts(part: str, name: str, expected: float) -> None:
    function = ideal_gas_part if part == "ideal" else residual_part
    value = float(getattr(function(TABLE_6_DELTA, TABLE_6_TAU), name))
    assert value == pytest.approx(expected, rel=RELATIVE_TOLERANCE, abs=1e-12)


# --- Table 7 ---------------------------------------------------------------------------
# (T K, rho kg/m3, p MPa, cv kJ/(kg K), w m/s, s kJ/(kg K))
TABLE_7 = [  # IAPWS R6-95(2018) Table 7
    pytest.param(
        300.0, 0.9965560e3, 0.992418352e-1, 0.413018112e1, 0.150151914e4, 0.393062643, id="300K-996"
    ),
    pytest.param(
        300.0, 0.1005308e4, 0.200022515e2, 0.406798347e1, 0.153492501e4, 0.387405401, id="300K-1005"
    ),
    pytest.param(
        300.0, 0.1188202e4, 0.700004704e3, 0.346135580e1, 0.244357992e4, 0.132609616, id="300K-1188"
    ),
    pytest.param(
        500.0,
        0.4350000,
        0.999679423e-1,
        0.150817541e1,
        0.548314253e3,
        0.794488271e1,
        id="500K-0.435",
    ),
    pytest.param(
        500.0,
        0.4532000e1,
        0.999938125,
        0.166991025e1,
        0.535739001e3,
        0.682502725e1,
        id="500K-4.532",
    ),
    pytest.param(
        500.0,
        0.8380250e3,
        0.100003858e2,
        0.322106219e1,
        0.127128441e4,
        0.256690919e1,
        id="500K-838",
    ),
    pytest.param(
        500.0,
        0.1084564e4,
        0.700000405e3,
        0.307437693e1,
        0.241200877e4,
        0.203237509e1,
        id="500K-1085",
    ),
    pytest.param(
        647.0,
        0.3580000e3,
        0.220384756e2,
        0.618315728e1,
        0.252145078e3,
        0.432092307e1,
        id="647K-358",
    ),
    pytest.param(
        900.0, 0.2410000, 0.100062559, 0.175890657e1, 0.724027147e3, 0.916653194e1, id="900K-0.241"
    ),
    pytest.param(
        900.0,
        0.5261500e2,
        0.200000690e2,
        0.193510526e1,
        0.698445674e3,
        0.659070225e1,
        id="900K-52.6",
    ),
    pytest.param(
        900.0,
        0.8707690e3,
        0.700000006e3,
        0.266422350e1,
        0.201933608e4,
        0.417223802e1,
        id="900K-871",
    ),
]


@pytest.mark.parametrize(
    ("temperature", "density", "pressure_mpa", "cv_kj", "speed", "entropy_kj"), TABLE_7
)
def test_table_7_single_phase(
    temperature: float,
    density: float,
    pressure_mpa: float,
    cv_kj: float,
    speed: float,
    entropy_kj: float,
) -> None:
    state = fluid_properties(density, temperature)
    derivatives = fluid_derivatives(density, temperature)
    assert float(state.pressure) == pytest.approx(pressure_mpa * 1e6, rel=RELATIVE_TOLERANCE)
    assert float(derivatives.specific_isochoric_heat_capacity) == pytest.approx(
        cv_kj * 1e3, rel=RELATIVE_TOLERANCE
    )
    assert float(derivatives.speed_of_sound) == pytest.approx(speed, rel=RELATIVE_TOLERANCE)
    assert float(state.specific_entropy) == pytest.approx(entropy_kj * 1e3, rel=RELATIVE_TOLERANCE)


# --- Table 8 ---------------------------------------------------------------------------
# (T K, p MPa, rho' kg/m3, rho'' kg/m3, h' kJ/kg, h'' kJ/kg, s' kJ/(kg K), s'' kJ/(kg K))
TABLE_8 = [  # IAPWS R6-95(2018) Table 8
    pytest.param(
        275.0,
        0.698451167e-3,
        0.999887406e3,
        0.550664919e-2,
        0.775972202e1,
        0.250428995e4,
        0.283094670e-1,
        0.910660121e1,
        id="275K",
    ),
    pytest.param(
        450.0,
        0.932203564,
        0.890341250e3,
        0.481200360e1,
        0.749161585e3,
        0.277441078e4,
        0.210865845e1,
        0.660921221e1,
        id="450K",
    ),
    pytest.param(
        625.0,
        0.169082693e2,
        0.567090385e3,
        0.118290280e3,
        0.168626976e4,
        0.255071625e4,
        0.380194683e1,
        0.518506121e1,
        id="625K",
    ),
]

TABLE_8_FIELDS = ("temperature", "p", "rho_l", "rho_v", "h_l", "h_v", "s_l", "s_v")


def _table_8_expected(row: tuple[float, ...]) -> dict[str, float]:
    values = dict(zip(TABLE_8_FIELDS, row, strict=True))
    return {
        "p": values["p"] * 1e6,
        "rho_l": values["rho_l"],
        "rho_v": values["rho_v"],
        "h_l": values["h_l"] * 1e3,
        "h_v": values["h_v"] * 1e3,
        "s_l": values["s_l"] * 1e3,
        "s_v": values["s_v"] * 1e3,
    }


@pytest.mark.parametrize(TABLE_8_FIELDS, TABLE_8)
def test_table_8_exact_phase_equilibrium(
    temperature: float,
    p: float,
    rho_l: float,
    rho_v: float,
    h_l: float,
    h_v: float,
    s_l: float,
    s_v: float,
) -> None:
    expected = _table_8_expected((temperature, p, rho_l, rho_v, h_l, h_v, s_l, s_v))
    solution = solve_saturation(temperature)
    assert bool(solution.converged)
    liquid = fluid_properties(solution.liquid_density, temperature)
    vapor = fluid_properties(solution.vapor_density, temperature)
    computed = {
        "p": float(solution.pressure),
        "rho_l": float(solution.liquid_density),
        "rho_v": float(solution.vapor_density),
        "h_l": float(liquid.specific_enthalpy),
        "h_v": float(vapor.specific_enthalpy),
        "s_l": float(liquid.specific_entropy),
        "s_v": float(vapor.specific_entropy),
    }
    for key, value in expected.items():
        assert computed[key] == pytest.approx(value, rel=RELATIVE_TOLERANCE), key


@pytest.mark.parametrize(TABLE_8_FIELDS, TABLE_8)
def test_table_8_fast_path(
    temperature: float,
    p: float,
    rho_l: float,
    rho_v: float,
    h_l: float,
    h_v: float,
    s_l: float,
    s_v: float,
) -> None:
    expected = _table_8_expected((temperature, p, rho_l, rho_v, h_l, h_v, s_l, s_v))
    states = saturation_by_temperature(np.array([temperature]))
    computed = {
        "p": float(states.pressure[0]),
        "rho_l": float(states.liquid.density[0]),
        "rho_v": float(states.vapor.density[0]),
        "h_l": float(states.liquid.specific_enthalpy[0]),
        "h_v": float(states.vapor.specific_enthalpy[0]),
        "s_l": float(states.liquid.specific_entropy[0]),
        "s_v": float(states.vapor.specific_entropy[0]),
    }
    for key, value in expected.items():
        assert computed[key] == pytest.approx(value, rel=RELATIVE_TOLERANCE), key
