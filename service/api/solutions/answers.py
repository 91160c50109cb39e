"""The ice-fraction lookup's result -> the answer dictionary (units, envelope)."""

from __future__ import annotations

from typing import Any

import numpy as np

from service.api.http.envelope import envelope
from service.api.http.quantities import quantity_output, scalar_output
from service.api.http.units import Dimension, UnitSet
from service.core.properties.lookups import Lookup
from service.core.solutions.lookups import IceFractionStates

__all__ = ["ice_fraction_answer"]


def _limit(states: IceFractionStates, unit_set: UnitSet, output: Any) -> dict[str, Any] | None:
    limit = states.freeze_concentration
    if limit is None:
        return None
    data = limit.data
    return {
        "glass_transition_of_unfrozen_phase": output(
            limit.glass_transition_of_unfrozen_phase, Dimension.TEMPERATURE
        ),
        "maximally_freeze_concentrated": {
            "glass_transition": scalar_output(
                data.glass_transition_of_freeze_concentrate, Dimension.TEMPERATURE, unit_set
            ),
            "ice_melting_onset": scalar_output(
                data.ice_melting_onset, Dimension.TEMPERATURE, unit_set
            ),
            "concentration": scalar_output(
                data.freeze_concentrate_mass_fraction, Dimension.DIMENSIONLESS, unit_set
            ),
        },
        "source": limit.source,
    }


def ice_fraction_answer(
    result: Lookup[IceFractionStates], unit_set: UnitSet, *, as_array: bool
) -> dict[str, Any]:
    """Quantities in the requested unit set, one value or a batch, with the envelope."""
    states = result.states

    def output(values: Any, dimension: Dimension) -> dict[str, Any]:
        flat = np.atleast_1d(np.asarray(values, dtype=np.float64)).ravel()
        return quantity_output(flat, dimension, unit_set, as_array=as_array)

    return {
        "mixture": states.mixture,
        "model": states.model,
        "temperature": output(states.temperature, Dimension.TEMPERATURE),
        "pressure": output(states.pressure, Dimension.PRESSURE),
        "freezing_point": output(states.freezing_point, Dimension.TEMPERATURE),
        "freezing_point_basis": states.freezing_point_basis,
        "ice_fraction": output(states.ice_mass_fraction, Dimension.DIMENSIONLESS),
        "unfrozen_water": output(states.unfrozen_water_fraction, Dimension.DIMENSIONLESS),
        "unfrozen_concentration": (
            None
            if states.unfrozen_concentration is None
            else output(states.unfrozen_concentration, Dimension.DIMENSIONLESS)
        ),
        "specific_enthalpy": output(states.specific_enthalpy, Dimension.SPECIFIC_ENERGY),
        "vapor_pressure": output(states.vapor_pressure, Dimension.PRESSURE),
        "water_activity": output(states.water_activity, Dimension.DIMENSIONLESS),
        "apparent_specific_heat": (
            None
            if states.apparent_specific_heat is None
            else output(states.apparent_specific_heat, Dimension.SPECIFIC_ENTROPY)
        ),
        "freeze_concentration_limit": _limit(states, unit_set, output),
        **envelope(
            unit_set=unit_set,
            assumptions=result.assumptions,
            sources=result.sources,
            uncertainties=result.uncertainties,
            advisories=result.advisories,
        ),
    }
