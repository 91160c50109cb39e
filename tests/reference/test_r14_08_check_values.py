"""IAPWS R14-08(2011) Table 3: check values for the melting and sublimation pressure.

Source: IAPWS R14-08(2011), "Revised Release on the Pressure along the Melting
and Sublimation Curves of Ordinary Water Substance", Table 3 ("Sample points for
computer-program verification"). Only the ice Ih rows are used; the ice III, V,
VI and VII melting curves are outside tripoint's scope. The release prints the
pressures in MPa to six significant digits, so each tolerance is half a unit of
the last printed digit.
"""

from __future__ import annotations

import pytest

from service.core.properties.phase_lines import melting_pressure, sublimation_pressure

SOURCE = "IAPWS R14-08(2011) Table 3"


@pytest.mark.parametrize(
    ("temperature", "expected_pressure", "absolute_tolerance"),
    [pytest.param(260.0, 138.268e6, 0.0005e6, id="ice-Ih-260K")],
)
def test_r14_08_table_3_melting_pressure_ice_ih(
    temperature: float, expected_pressure: float, absolute_tolerance: float
) -> None:
    """IAPWS R14-08(2011) Table 3, melting pressure of ice Ih, eq. (1)."""
    computed = float(melting_pressure(temperature))
    assert computed == pytest.approx(expected_pressure, abs=absolute_tolerance), SOURCE


@pytest.mark.parametrize(
    ("temperature", "expected_pressure", "absolute_tolerance"),
    [pytest.param(230.0, 8.94735, 0.000005, id="sublimation-230K")],
)
def test_r14_08_table_3_sublimation_pressure(
    temperature: float, expected_pressure: float, absolute_tolerance: float
) -> None:
    """IAPWS R14-08(2011) Table 3, sublimation pressure, eq. (6) (8.94735e-6 MPa)."""
    computed = float(sublimation_pressure(temperature))
    assert computed == pytest.approx(expected_pressure, abs=absolute_tolerance), SOURCE
