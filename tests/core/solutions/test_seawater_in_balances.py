"""Seawater as the flash-freeze balance's solute (vacuum ice-slurry making) against TEOS-10.

The balance takes seawater's water activity from the IAPWS R13-08 saline Gibbs function and
finds ice equilibrium with IAPWS-95 water and R10-06 ice at the load's own vapor pressure.
References: gsw (TEOS-10's general-purpose library, test reference only; air-free seawater,
``saturation_fraction=0``; sea pressure in dbar = absolute pressure - 101325 Pa) at that
pressure, from the sublimation pressure of IAPWS R14-08 through iapws 1.5.5.
"""

from __future__ import annotations

import gsw
import pytest
from iapws._iapws import _Sublimation_Pressure

from service.core.balances import FlashFreezeCase, flash_freeze, named_solute
from service.core.errors import OutOfRangeError

STANDARD_SALINITY = 0.03516504  # kg/kg, TEOS-10 standard seawater


def _sea_pressure_dbar(temperature: float) -> float:
    """The load's vapor pressure (ice's sublimation pressure, R14-08) as gsw's sea pressure."""
    return (float(_Sublimation_Pressure(temperature)) * 1e6 - 101325.0) / 1e4


@pytest.mark.parametrize("salinity", [0.010, STANDARD_SALINITY, 0.060])
def test_freezing_onset_matches_teos10_at_the_loads_vapor_pressure(salinity: float) -> None:
    brine = named_solute("seawater", salinity)
    with pytest.raises(OutOfRangeError) as caught:
        flash_freeze(
            FlashFreezeCase(initial_temperature=260.0, solute=brine, final_ice_temperature=259.0)
        )
    assert caught.value.variable == "initial_temperature"
    onset = caught.value.minimum
    assert onset is not None
    reference = gsw.t_freezing(salinity * 1000.0, _sea_pressure_dbar(onset), 0.0) + 273.15
    assert onset == pytest.approx(reference, abs=1e-3)  # measured 0.1 mK at 35 g/kg


def test_standard_seawater_at_minus_2_degc_gives_ice_and_teos10_brine() -> None:
    # A slurry tank: 100 kg of 12 degC standard seawater flashed to -2 degC.
    result = flash_freeze(
        FlashFreezeCase(
            initial_temperature=285.15,
            water_mass=100.0,
            solute=named_solute("seawater", STANDARD_SALINITY),
            final_ice_temperature=271.15,
        )
    )
    assert float(result.ice_mass) > 1.0  # kg of slurry ice
    salt = STANDARD_SALINITY / (1.0 - STANDARD_SALINITY) * 100.0
    brine = salt / (salt + float(result.liquid_mass))
    reference = gsw.SA_freezing_from_t(-2.0, _sea_pressure_dbar(271.15), 0.0) / 1000.0
    # The activity is taken at the onset (-1.91 degC), not at -2 degC: measured 4e-6 kg/kg.
    assert brine == pytest.approx(reference, abs=2e-5)
    assert abs(float(result.energy_balance.relative_residual)) < 1e-9
    assert "IAPWS R13-08" in [source.release for source in result.property_sources]


def test_seawater_above_the_release_range_is_refused() -> None:
    with pytest.raises(OutOfRangeError) as caught:
        flash_freeze(
            FlashFreezeCase(
                initial_temperature=285.0,
                solute=named_solute("seawater", 0.13),
                final_ice_temperature=270.0,
            )
        )
    assert caught.value.variable == "solute.mass_fraction"
    assert caught.value.maximum == pytest.approx(0.12)
