"""Initial freezing points of aqueous solutions against quoted values.

Sources, one per row:
- sucrose, 10 % by mass: freezing-point depression about 0.6 K; CRC Handbook of Chemistry
  and Physics, table "Concentrative properties of aqueous solutions" (from memory, not
  read while writing this test);
- sodium chloride, 3.5 % by mass: freezing point about -2.1 degC (common practice, no
  source).

The model (service.core.balances.solution_freezing) is an ideal (Raoult) solution: its
error grows with concentration and is larger for an electrolyte, whose osmotic
coefficient (about 0.93 for this brine) it ignores (van 't Hoff factor 2). The
tolerances are what an ideal-solution model can meet: 0.1 K for the dilute sugar (the
model gives a depression of 0.60 K), 0.3 K for the brine (the model gives 2.28 K, too
deep by about 0.2 K, as expected of i = 2). The depression is taken from the model's own
pure-water freezing point, 273.16 K at the sublimation pressure (the products sit under
vacuum); the quoted values are at atmospheric pressure, where pure water freezes at
273.15 K and the depressions are the same to well within the tolerances.
"""

from __future__ import annotations

import pytest

from service.core.balances import named_solute, solution_freezing_point
from service.core.properties.constants import TRIPLE_POINT_TEMPERATURE


@pytest.mark.parametrize(
    ("solute", "mass_fraction", "depression", "tolerance"),
    [
        # CRC Handbook, Concentrative properties of aqueous solutions, sucrose (from memory)
        pytest.param("sucrose", 0.10, 0.6, 0.1, id="sucrose-10-percent"),
        # common practice, no source: a 3.5 % salt brine freezes near -2.1 degC
        pytest.param("sodium chloride", 0.035, 2.1, 0.3, id="sodium-chloride-3.5-percent"),
    ],
)
def test_freezing_point_depression(
    solute: str, mass_fraction: float, depression: float, tolerance: float
) -> None:
    freezing_point = float(solution_freezing_point(named_solute(solute, mass_fraction)))
    assert TRIPLE_POINT_TEMPERATURE - freezing_point == pytest.approx(depression, abs=tolerance)
