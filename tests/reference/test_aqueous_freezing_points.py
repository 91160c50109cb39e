"""Freezing points of aqueous solutions of named solutes against handbook tables.

Sources (all values FROM MEMORY: the tables were not read while writing this test):
- sodium chloride, sucrose, glucose, glycerol: CRC Handbook of Chemistry and Physics, table
  "Concentrative Properties of Aqueous Solutions: Density, Refractive Index, Freezing Point
  Depression, and Viscosity" (section 5 in the 80th-90th editions), column "Delta T", freezing
  point depression in K against mass percent of solute;
- propylene glycol: ASHRAE Handbook - Fundamentals (2009 and later), ch. 31 "Physical
  properties of secondary coolants (brines)", table of freezing points of aqueous
  propylene glycol.
- fructose: no handbook row recalled; the model (same K and molar mass as glucose) is checked
  against the glucose rows.

The depression is from the melting point of ice at 101325 Pa (273.1525 K, R10-06), as the
handbooks quote it. Tolerances: what each model meets, stated per row; the Norrish constants
are 25 degC values taken as temperature-independent, and the sodium chloride Pitzer
parameters are 25 degC values with first-order temperature slopes, so both drift as the
solution gets colder (sodium chloride: 0.02 K to 5 %, 0.1 K to 15 %, 0.6 K at the eutectic).
"""

from __future__ import annotations

import pytest

from service.core.solutions.aqueous import solution_model
from service.core.solutions.freezing import solute_freezing_point

MELTING_POINT = 273.152519
"""K, ice Ih at 101325 Pa (IAPWS R10-06(2009) Table 6)."""

ROWS = [
    # (solute, mass fraction, handbook depression K, tolerance K)
    ("sodium chloride", 0.01, 0.593, 0.02),
    ("sodium chloride", 0.02, 1.186, 0.02),
    # 3.5 %: 2.10 K interpolated between the 3 % (1.79 K) and 4 % (2.41 K) rows
    ("sodium chloride", 0.035, 2.10, 0.05),
    ("sodium chloride", 0.05, 3.05, 0.05),
    ("sodium chloride", 0.10, 6.56, 0.15),
    ("sodium chloride", 0.15, 10.89, 0.15),
    ("sodium chloride", 0.20, 16.46, 0.3),
    # eutectic: -21.1 degC at 23.3 %
    ("sodium chloride", 0.233, 21.1, 0.7),
    ("sucrose", 0.10, 0.63, 0.03),
    ("sucrose", 0.20, 1.47, 0.03),
    ("sucrose", 0.30, 2.67, 0.08),
    ("sucrose", 0.40, 4.45, 0.2),
    ("sucrose", 0.50, 7.0, 0.2),
    ("glucose", 0.05, 0.55, 0.03),
    ("glucose", 0.10, 1.14, 0.05),
    ("glucose", 0.20, 2.50, 0.25),
    ("glucose", 0.30, 4.3, 0.5),
    ("fructose", 0.10, 1.14, 0.05),
    ("glycerol", 0.10, 2.3, 0.05),
    ("glycerol", 0.20, 5.5, 0.35),
    ("glycerol", 0.30, 9.4, 0.5),
    ("glycerol", 0.40, 15.4, 1.3),
    ("propylene glycol", 0.10, 3.3, 0.4),
    ("propylene glycol", 0.20, 7.1, 0.2),
    ("propylene glycol", 0.30, 12.7, 0.8),
]


@pytest.mark.parametrize(
    ("solute", "mass_fraction", "depression", "tolerance"),
    ROWS,
    ids=[f"{row[0]}-{row[1]:g}" for row in ROWS],
)
def test_non_ideal_freezing_point(
    solute: str, mass_fraction: float, depression: float, tolerance: float
) -> None:
    model = solution_model(solute)
    value = MELTING_POINT - float(solute_freezing_point(model, mass_fraction))
    assert value == pytest.approx(depression, abs=tolerance)


def test_brine_non_ideal_beats_ideal() -> None:
    # The ideal solution (i = 2) puts 3.5 % brine's onset 0.18 K too deep; the Pitzer
    # model is within 0.05 K of the handbook (row above).
    ideal = MELTING_POINT - float(
        solute_freezing_point(solution_model("sodium chloride", "ideal"), 0.035)
    )
    pitzer = MELTING_POINT - float(solute_freezing_point(solution_model("sodium chloride"), 0.035))
    assert abs(ideal - 2.10) > 0.15
    assert abs(pitzer - 2.10) < 0.05
