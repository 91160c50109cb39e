"""Saturated-water steam-table entries at round temperatures (handbook check).

Source: Y. A. Cengel and M. A. Boles, "Thermodynamics: An Engineering Approach",
8th ed., McGraw-Hill (2015), Table A-4 "Saturated water - Temperature table"
(computed by its authors from IAPWS-95). The values below are FROM MEMORY, not
read from the book; the table prints 4-5 significant digits (kPa, kJ/kg). The
tolerance is therefore two units in the last printed digit: one for the table's
rounding and one for the uncertainty of recall.
"""

from __future__ import annotations

import pytest

from service.core.properties.saturation import saturation_by_temperature

# (temperature degC, quantity, value as printed, unit of the last printed digit)
HANDBOOK = [  # Cengel & Boles, 8th ed. (2015), Table A-4, from memory
    pytest.param(0.01, "pressure_kpa", 0.6117, 1e-4, id="0.01C-p"),
    pytest.param(0.01, "latent_kj", 2500.9, 0.1, id="0.01C-hfg"),
    pytest.param(0.01, "vapor_enthalpy_kj", 2500.9, 0.1, id="0.01C-hg"),
    pytest.param(25.0, "pressure_kpa", 3.1698, 1e-4, id="25C-p"),
    pytest.param(25.0, "liquid_enthalpy_kj", 104.83, 0.01, id="25C-hf"),
    pytest.param(25.0, "latent_kj", 2441.7, 0.1, id="25C-hfg"),
    pytest.param(50.0, "pressure_kpa", 12.352, 1e-3, id="50C-p"),
    pytest.param(50.0, "vapor_enthalpy_kj", 2591.3, 0.1, id="50C-hg"),
    pytest.param(100.0, "pressure_kpa", 101.42, 0.01, id="100C-p"),
    pytest.param(100.0, "liquid_enthalpy_kj", 419.17, 0.01, id="100C-hf"),
    pytest.param(100.0, "latent_kj", 2256.4, 0.1, id="100C-hfg"),
    pytest.param(100.0, "vapor_enthalpy_kj", 2675.6, 0.1, id="100C-hg"),
    pytest.param(100.0, "liquid_entropy_kj", 1.3072, 1e-4, id="100C-sf"),
    pytest.param(200.0, "pressure_kpa", 1554.9, 0.1, id="200C-p"),
    pytest.param(200.0, "vapor_enthalpy_kj", 2792.0, 0.1, id="200C-hg"),
    pytest.param(300.0, "pressure_kpa", 8587.9, 0.1, id="300C-p"),
    pytest.param(300.0, "vapor_enthalpy_kj", 2749.6, 0.1, id="300C-hg"),
]


@pytest.mark.parametrize(("celsius", "quantity", "printed", "last_digit"), HANDBOOK)
def test_handbook_saturation_entry(
    celsius: float, quantity: str, printed: float, last_digit: float
) -> None:
    states = saturation_by_temperature(celsius + 273.15)
    computed = {
        "pressure_kpa": float(states.pressure) / 1e3,
        "liquid_enthalpy_kj": float(states.liquid.specific_enthalpy) / 1e3,
        "vapor_enthalpy_kj": float(states.vapor.specific_enthalpy) / 1e3,
        "latent_kj": float(states.latent_heat_of_vaporization) / 1e3,
        "liquid_entropy_kj": float(states.liquid.specific_entropy) / 1e3,
    }[quantity]
    assert computed == pytest.approx(printed, abs=2.0 * last_digit)
