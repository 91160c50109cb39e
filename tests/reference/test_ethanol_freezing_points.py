"""Freezing points of aqueous ethanol (the named solute `ethanol`) against published tables.

The model is Melinder's (2010) freezing-point correlation (Properties of Secondary Working
Fluids for Indirect Systems, 2nd ed., IIR), so it is checked here against OTHER tables:

- Engineering ToolBox, "Ethanol Freeze Protected Water Solutions"
  (https://www.engineeringtoolbox.com/ethanol-water-d_989.html, read through the search
  tool): freezing points in whole degC against VOLUME percent at 20 degC. The volume
  percentages are converted to mass percent with the OIML International Alcoholometric
  Tables (OIML R 22, 1975; conversions FROM MEMORY): 10 vol% = 8.01 wt%, 20 vol% =
  16.21 wt%, 30 vol% = 24.61 wt%, 40 vol% = 33.30 wt%, 50 vol% = 42.43 wt%. Tolerance 1 K:
  the table is rounded to 1 degC, and its 10 and 20 vol% rows sit 0.7-0.8 K deeper than
  Melinder's fit.
- CRC Handbook of Chemistry and Physics (80th-90th editions), table "Concentrative
  Properties of Aqueous Solutions", ethanol column "Delta T" against mass percent; values
  FROM MEMORY (the table was not read while writing this test), tolerance 0.6 K.

The depression is taken from the melting point of ice at 101325 Pa (273.1525 K, R10-06).
"""

from __future__ import annotations

import pytest

from service.core.solutions.aqueous import solution_model
from service.core.solutions.freezing import solute_freezing_point

MELTING_POINT = 273.152519
"""K, ice Ih at 101325 Pa (IAPWS R10-06(2009) Table 6)."""

TOOLBOX_ROWS = [
    # (volume %, mass fraction, freezing point degC as tabulated, tolerance K)
    (10, 0.0801, -4.0, 1.0),
    (20, 0.1621, -9.0, 1.0),
    (30, 0.2461, -15.0, 1.0),
    (40, 0.3330, -23.0, 1.0),
    (50, 0.4243, -32.0, 1.0),
]

CRC_ROWS = [
    # (mass fraction, depression K from memory, tolerance K)
    (0.10, 4.5, 0.6),
    (0.20, 10.9, 0.6),
    (0.30, 20.5, 0.6),
    (0.40, 29.3, 0.6),
]


@pytest.mark.parametrize(
    ("volume_percent", "mass_fraction", "celsius", "tolerance"),
    TOOLBOX_ROWS,
    ids=[f"toolbox-{row[0]}vol%" for row in TOOLBOX_ROWS],
)
def test_ethanol_against_engineering_toolbox(
    volume_percent: int, mass_fraction: float, celsius: float, tolerance: float
) -> None:
    value = float(solute_freezing_point(solution_model("ethanol"), mass_fraction)) - 273.15
    assert value == pytest.approx(celsius, abs=tolerance)


@pytest.mark.parametrize(
    ("mass_fraction", "depression", "tolerance"),
    CRC_ROWS,
    ids=[f"crc-{row[0]:g}" for row in CRC_ROWS],
)
def test_ethanol_against_crc_from_memory(
    mass_fraction: float, depression: float, tolerance: float
) -> None:
    value = MELTING_POINT - float(solute_freezing_point(solution_model("ethanol"), mass_fraction))
    assert value == pytest.approx(depression, abs=tolerance)


def test_ethanol_dilute_limit_near_the_cryoscopic_law() -> None:
    # Dilute limit: Delta T -> K_f m with K_f = 1.8597 K kg/mol (water's cryoscopic constant,
    # Atkins and de Paula, Physical Chemistry, 9th ed., Table 5.2; from memory). Melinder's
    # fit is a few percent shallow there (stated in the model's docstring): 3.5 % at 1 %.
    model = solution_model("ethanol")
    molality = 0.01 / (0.99 * model.molar_mass)
    value = MELTING_POINT - float(solute_freezing_point(model, 0.01))
    assert value == pytest.approx(1.8597 * molality, rel=0.06)
    assert value < 1.8597 * molality
