"""Freezing point of a solution from its water activity (service.core.balances.solution_freezing).

Sources named per case: an independent solve of the same equilibrium with iapws 1.5.5
(IAPWS95 Helmholtz function for the metastable liquid, _Ice for IAPWS R10-06 ice Ih,
_Sublimation_Pressure for IAPWS R14-08); the cryoscopic law dT = -R T**2 i m / L_f (molar R) for
dilute solutions (Atkins and de Paula, Physical Chemistry, 9th ed. (2010), Sec. 5.5, from
memory) with the latent heat of fusion at the triple point, 333.445 kJ/kg (IAPWS R10-06(2009)
Table 6 with IAPWS-95, from memory); round trips against the core's own equilibrium path.
"""

from __future__ import annotations

import math

import numpy as np
import pytest
from iapws import IAPWS95
from iapws._iapws import _Ice, _Sublimation_Pressure
from scipy.optimize import brentq

from service.core.balances import FlashFreezeCase, Solute, flash_freeze, named_solute
from service.core.balances.equilibrium_paths import freezing_solution_states
from service.core.balances.solution_freezing import (
    LOWEST_FREEZING_TEMPERATURE,
    ice_solution_equilibrium_temperature,
    lowest_log_water_activity,
    solution_freezing_point,
    solution_log_water_activity,
)
from service.core.errors import InvalidInputError, OutOfRangeError
from service.core.properties.constants import MOLAR_MASS, TRIPLE_POINT_TEMPERATURE

_GAS_CONSTANT = 0.46151805  # kJ/(kg K), IAPWS R6-95(2018) eq. (6.3), iapws units
_FLUID = IAPWS95()


def _iapws_log_activity(temperature: float) -> float:
    """ln a_w of the solution in equilibrium with ice at T, with the iapws package."""
    pressure = _Sublimation_Pressure(temperature)  # MPa; _Helmholtz gives kPa
    density = brentq(
        lambda rho: _FLUID._Helmholtz(rho, temperature)["P"] - 1e3 * pressure,
        980.0,
        1005.0,
        xtol=1e-12,
    )
    liquid = _FLUID._Helmholtz(density, temperature)
    ice = _Ice(temperature, pressure)
    liquid_gibbs = liquid["h"] - temperature * liquid["s"]
    return float((ice["g"] - liquid_gibbs) / (_GAS_CONSTANT * temperature))


@pytest.mark.parametrize("activity", [0.999, 0.99, 0.95, 0.85], ids=lambda a: f"a_w={a}")
def test_freezing_temperature_matches_an_iapws_package_solve(activity: float) -> None:
    # source: iapws 1.5.5 (IAPWS95 Helmholtz function, _Ice, _Sublimation_Pressure)
    expected = brentq(
        lambda t: _iapws_log_activity(t) - math.log(activity),
        243.15,  # the roots of these activities lie above it
        TRIPLE_POINT_TEMPERATURE - 1e-9,
        xtol=1e-10,
    )
    value = float(ice_solution_equilibrium_temperature(math.log(activity)))
    assert value == pytest.approx(expected, abs=1e-6)


def test_round_trip_through_the_equilibrium_path() -> None:
    # source: the core's freezing_solution_states gives ln a_w(T); its inverse returns T
    temperatures = np.linspace(244.0, 273.0, 30)
    log_activity = freezing_solution_states(temperatures).log_water_activity
    recovered = ice_solution_equilibrium_temperature(log_activity)
    np.testing.assert_allclose(recovered, temperatures, rtol=0.0, atol=1e-8)


def test_dilute_solution_follows_the_cryoscopic_law() -> None:
    # Atkins and de Paula (2010) Sec. 5.5 (from memory): dT = R T**2 m / L_f with the molar
    # gas constant 8.314462618 J/(mol K) (CODATA 2018, exact) and L_f = 333.445 kJ/kg
    # (IAPWS R10-06(2009) Table 6 with IAPWS-95, from memory)
    molality = 0.01  # mol/kg of water
    solute = Solute(mass_fraction=molality * 0.18 / (1 + molality * 0.18), molar_mass=0.18)
    depression = TRIPLE_POINT_TEMPERATURE - float(solution_freezing_point(solute))
    cryoscopic = 8.314462618 * TRIPLE_POINT_TEMPERATURE**2 * molality / 333.445e3
    assert depression == pytest.approx(cryoscopic, rel=2e-3)


def test_arrays_in_arrays_out_and_monotonic() -> None:
    fractions = np.array([[0.0, 0.05], [0.10, 0.30]])
    freezing = solution_freezing_point(named_solute("sucrose", fractions))
    assert freezing.shape == (2, 2)
    assert freezing.dtype == np.float64
    assert float(freezing[0, 0]) == TRIPLE_POINT_TEMPERATURE
    assert np.all(np.diff(freezing.ravel()) < 0.0)
    scalar = solution_freezing_point(named_solute("sucrose", 0.05))
    assert scalar.shape == ()
    assert float(scalar) == pytest.approx(float(freezing[0, 1]), abs=1e-9)


def test_activity_of_an_ideal_solution() -> None:
    # Raoult: a_w = n_w / (n_w + i n_s) for 35 g NaCl in 965 g water, i = 2
    water_moles = 0.965 / MOLAR_MASS
    ion_moles = 2.0 * 0.035 / 0.058443
    expected = math.log(water_moles / (water_moles + ion_moles))
    value = float(solution_log_water_activity(named_solute("sodium chloride", 0.035, "ideal")))
    assert value == pytest.approx(expected, rel=1e-12)


def test_flash_freeze_starts_freezing_at_the_shared_freezing_point() -> None:
    # the flash-freeze balance must use the same function for its freezing onset
    solute = named_solute("glucose", 0.08)
    onset = float(solution_freezing_point(solute))
    with pytest.raises(OutOfRangeError) as caught:
        flash_freeze(
            FlashFreezeCase(
                initial_temperature=onset - 1e-6, solute=solute, final_ice_temperature=260.0
            )
        )
    assert caught.value.variable == "initial_temperature"
    assert caught.value.minimum == pytest.approx(onset, abs=1e-9)


@pytest.mark.parametrize(
    ("solute", "variable"),
    [
        pytest.param(named_solute("sucrose", -0.1), "solute.mass_fraction", id="negative"),
        pytest.param(named_solute("sucrose", 1.0), "solute.mass_fraction", id="no-water"),
        pytest.param(Solute(0.1, 0.0), "solute.molar_mass", id="zero-molar-mass"),
        pytest.param(Solute(0.1, 0.1, 0.5), "solute.van_t_hoff_factor", id="factor-below-1"),
        pytest.param(Solute(0.5, 0.058443, 2.0), "water_activity", id="below-235K"),
        pytest.param(
            named_solute("sodium chloride", 0.25, "ideal"),
            "solute.mass_fraction",
            id="ideal-above-eutectic",
        ),
        pytest.param(
            named_solute("sodium chloride", 0.25), "solute.mass_fraction", id="above-eutectic"
        ),
    ],
)
def test_out_of_range_solutions_are_refused(solute: Solute, variable: str) -> None:
    with pytest.raises(OutOfRangeError) as caught:
        solution_freezing_point(solute)
    assert caught.value.variable == variable


def test_activity_above_one_and_nan_are_refused() -> None:
    with pytest.raises(OutOfRangeError) as caught:
        ice_solution_equilibrium_temperature(np.array([-0.01, 0.001]))
    assert caught.value.index == 1
    with pytest.raises(InvalidInputError):
        ice_solution_equilibrium_temperature(float("nan"))


def test_lowest_activity_freezes_at_the_lowest_temperature() -> None:
    value = float(ice_solution_equilibrium_temperature(lowest_log_water_activity()))
    assert value == pytest.approx(LOWEST_FREEZING_TEMPERATURE, abs=1e-8)


def test_ideal_sodium_chloride_freezes_only_down_to_its_eutectic_composition() -> None:
    # Below the ice-hydrohalite eutectic (w = 0.233, -21.2 degC; CRC Handbook of Chemistry
    # and Physics, concentrative properties of aqueous NaCl, from memory) the salt
    # crystallizes: an ideal-model flash-freeze of 3.5 % brine may end no colder than where
    # its unfrozen solution reaches w = 0.233. That temperature, independently: Raoult's
    # a_w = n_w / (n_w + 2 n_s) at w = 0.233, solved for ice equilibrium with iapws 1.5.5.
    water_moles = 0.767 / MOLAR_MASS
    ion_moles = 2.0 * 0.233 / 0.058443
    log_activity = math.log(water_moles / (water_moles + ion_moles))
    expected = brentq(lambda t: _iapws_log_activity(t) - log_activity, 245.0, 270.0, xtol=1e-10)
    brine = named_solute("sodium chloride", 0.035, "ideal")
    with pytest.raises(OutOfRangeError) as caught:
        flash_freeze(
            FlashFreezeCase(initial_temperature=280.0, solute=brine, final_ice_temperature=250.0)
        )
    assert caught.value.variable == "final_ice_temperature"
    assert caught.value.minimum == pytest.approx(expected, abs=1e-6)
    assert "eutectic" in caught.value.reason
    ends = flash_freeze(
        FlashFreezeCase(
            initial_temperature=280.0, solute=brine, final_ice_temperature=expected + 1e-6
        )
    )
    assert float(ends.final_temperature) == pytest.approx(expected + 1e-6, abs=1e-9)
    salt = 0.035 / 0.965 * 1.0  # kg, with the case's default 1 kg of water
    unfrozen = salt / (salt + float(ends.liquid_mass))
    assert unfrozen == pytest.approx(0.233, abs=1e-6)  # just at the eutectic composition
