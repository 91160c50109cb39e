"""Freeze-concentration limit: the Gordon-Taylor glass transition against its published
constants (Roos 1993; Roos and Karel 1991; values from memory)."""

from __future__ import annotations

import pytest

from service.core.balances import FlashFreezeCase, flash_freeze, named_solute
from service.core.solutions.glass import (
    FREEZE_CONCENTRATION_DATA,
    WATER_GLASS_TRANSITION,
    gordon_taylor_glass_transition,
)
from service.core.solutions.lookups import ice_fraction_lookup

SUCROSE = FREEZE_CONCENTRATION_DATA["sucrose"]


def test_end_points_are_water_and_the_anhydrous_sugar() -> None:
    assert float(gordon_taylor_glass_transition(SUCROSE, 0.0)) == WATER_GLASS_TRANSITION
    assert float(gordon_taylor_glass_transition(SUCROSE, 1.0)) == pytest.approx(335.15)


def test_gordon_taylor_at_the_freeze_concentrate_matches_its_published_glass_transition() -> None:
    # Roos (1993) k = 4.7 and T_g,s = 62 degC put T_g(C_g' = 0.80) at -44.4 degC; Roos and
    # Karel (1991) measured T_g' = -46 degC: the two published sets agree within 2 K.
    value = float(gordon_taylor_glass_transition(SUCROSE, SUCROSE.freeze_concentrate_mass_fraction))
    assert value == pytest.approx(SUCROSE.glass_transition_of_freeze_concentrate, abs=2.0)


def test_glass_transition_rises_with_concentration() -> None:
    values = gordon_taylor_glass_transition(SUCROSE, [0.2, 0.5, 0.8])
    assert values[0] < values[1] < values[2]


def test_ice_fraction_of_sucrose_reports_the_limit_and_warns() -> None:
    result = ice_fraction_lookup(268.15, solute_name="sucrose", mass_fraction=0.2)
    limit = result.states.freeze_concentration
    assert limit is not None
    assert float(limit.glass_transition_of_unfrozen_phase) < 268.15
    assert "above-freeze-concentration-limit" in [a.code for a in result.advisories]
    salt = ice_fraction_lookup(268.15, solute_name="sodium chloride", mass_fraction=0.05)
    assert salt.states.freeze_concentration is None


def test_flash_freeze_of_sucrose_warns_where_it_ends_above_the_limit() -> None:
    warm = flash_freeze(
        FlashFreezeCase(
            initial_temperature=290.0,
            solute=named_solute("sucrose", 0.1),
            final_ice_temperature=268.15,
        )
    )
    assert "above-freeze-concentration-limit" in [a.code for a in warm.warnings]
    cold = flash_freeze(
        FlashFreezeCase(
            initial_temperature=290.0,
            solute=named_solute("sucrose", 0.1, "ideal"),
            final_ice_temperature=236.15,
        )
    )
    assert "above-freeze-concentration-limit" not in [a.code for a in cold.warnings]
