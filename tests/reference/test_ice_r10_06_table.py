"""IAPWS R10-06(2009) Table 6: check values for the ice Ih Gibbs function.

Source: IAPWS R10-06(2009), "Revised Release on the Equation of State 2006 for
H2O Ice Ih", Table 6 ("Numerical check values for the Gibbs function g and its
derivatives, and for the properties ... at (T, p) = (273.16 K, 611.657 Pa),
(273.152519 K, 101325 Pa) and (100 K, 100 MPa)"). SI units throughout.

The release prints twelve significant digits (fewer for the small Gibbs and
Helmholtz energies near the triple point); each case states its tolerance.
Quantities not returned by the core directly (Helmholtz energy, expansion and
pressure coefficients, compressibilities) are formed from the derivatives with
the relations of R10-06 Table 3.
"""

from __future__ import annotations

from typing import NamedTuple

import numpy as np
import pytest

from service.core.properties.ice import IceGibbsDerivatives, ice_gibbs_derivatives, ice_properties
from service.core.properties.phase import PhaseProperties

SOURCE = "IAPWS R10-06(2009) Table 6"
RELATIVE_TOLERANCE = 1e-9


class Row(NamedTuple):
    quantity: str
    values: tuple[float, float, float]
    absolute_tolerance: float


STATES: tuple[tuple[float, float], ...] = (
    (273.16, 611.657),
    (273.152519, 101325.0),
    (100.0, 100.0e6),
)
STATE_IDS = ("273.16K-611.657Pa", "273.152519K-101325Pa", "100K-100MPa")

# Quantity, values at the three states (SI), absolute tolerance (0 where the
# relative tolerance alone applies).
ROWS: tuple[Row, ...] = (
    Row("g", (0.611784135, 0.10134274069e3, -0.222296513088e6), 1e-9),
    Row("dg/dp", (0.109085812737e-2, 0.109084388214e-2, 0.106193389260e-2), 0.0),
    Row("dg/dT", (0.122069433940e4, 0.122076932550e4, 0.261195122589e4), 0.0),
    Row("d2g/dp2", (-0.128495941571e-12, -0.128485364928e-12, -0.941807981761e-13), 0.0),
    Row("d2g/dTdp", (0.174387964700e-6, 0.174362219972e-6, 0.274505162488e-7), 0.0),
    Row("d2g/dT2", (-0.767602985875e1, -0.767598233365e1, -0.866333195517e1), 0.0),
    Row("h", (-0.333444253966e6, -0.333354873637e6, -0.483491635676e6), 0.0),
    Row("f", (-0.55446875e-1, -0.918701567e1, -0.328489902347e6), 1e-9),
    Row("u", (-0.333444921197e6, -0.333465403393e6, -0.589685024936e6), 0.0),
    Row("s", (-0.122069433940e4, -0.122076932550e4, -0.261195122589e4), 0.0),
    Row("cp", (0.209678431622e4, 0.209671391024e4, 0.866333195517e3), 0.0),
    Row("rho", (0.916709492200e3, 0.916721463419e3, 0.941678203297e3), 0.0),
    Row("alpha", (0.159863102566e-3, 0.159841589458e-3, 0.258495528207e-4), 0.0),
    Row("beta", (0.135714764659e7, 0.135705899321e7, 0.291466166994e6), 0.0),
    Row("kappa_T", (0.117793449348e-9, 0.117785291765e-9, 0.886880048115e-10), 0.0),
    Row("kappa_S", (0.114161597779e-9, 0.114154442556e-9, 0.886060982687e-10), 0.0),
)


def _quantity(name: str, d: IceGibbsDerivatives, props: PhaseProperties) -> float:
    g_p = d.pressure_derivative
    g_tp = d.mixed_derivative
    g_pp = d.second_pressure_derivative
    g_tt = d.second_temperature_derivative
    table: dict[str, object] = {
        "g": d.gibbs_energy,
        "dg/dp": g_p,
        "dg/dT": d.temperature_derivative,
        "d2g/dp2": g_pp,
        "d2g/dTdp": g_tp,
        "d2g/dT2": g_tt,
        "h": props.specific_enthalpy,
        "f": d.gibbs_energy - d.pressure * g_p,
        "u": props.specific_internal_energy,
        "s": props.specific_entropy,
        "cp": props.specific_isobaric_heat_capacity,
        "rho": props.density,
        "alpha": g_tp / g_p,
        "beta": -g_tp / g_pp,
        "kappa_T": -g_pp / g_p,
        "kappa_S": (g_tp * g_tp - g_tt * g_pp) / (g_p * g_tt),
    }
    return float(np.asarray(table[name]))


CASES = [
    pytest.param(
        state,
        row.quantity,
        row.values[position],
        row.absolute_tolerance,
        id=f"{STATE_IDS[position]}-{row.quantity}",
    )
    for row in ROWS
    for position, state in enumerate(STATES)
]


@pytest.mark.parametrize(("state", "quantity", "expected", "absolute_tolerance"), CASES)
def test_r10_06_table_6(
    state: tuple[float, float], quantity: str, expected: float, absolute_tolerance: float
) -> None:
    """IAPWS R10-06(2009) Table 6, one quantity at one state per case."""
    temperature, pressure = state
    derivatives = ice_gibbs_derivatives(temperature, pressure)
    props = ice_properties(temperature, pressure)
    computed = _quantity(quantity, derivatives, props)
    assert computed == pytest.approx(expected, rel=RELATIVE_TOLERANCE, abs=absolute_tolerance), (
        SOURCE
    )
