"""The ice-fraction lookup's result -> the answer dictionary (units, envelope)."""

from __future__ import annotations

from typing import Any

import numpy as np

from service.api.http.envelope import envelope
from service.api.http.quantities import quantity_output
from service.api.http.units import Dimension, UnitSet
from service.core.properties.lookups import Lookup
from service.core.solutions.lookups import IceFractionStates

__all__ = ["ice_fraction_answer"]


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
        "ice_fraction": output(states.ice_mass_fraction, Dimension.DIMENSIONLESS),
        "unfrozen_water": output(states.unfrozen_water_fraction, Dimension.DIMENSIONLESS),
        "unfrozen_concentration": output(states.unfrozen_concentration, Dimension.DIMENSIONLESS),
        "specific_enthalpy": output(states.specific_enthalpy, Dimension.SPECIFIC_ENERGY),
        "vapor_pressure": output(states.vapor_pressure, Dimension.PRESSURE),
        "water_activity": output(states.water_activity, Dimension.DIMENSIONLESS),
        **envelope(
            unit_set=unit_set,
            assumptions=result.assumptions,
            sources=result.sources,
            uncertainties=result.uncertainties,
            advisories=result.advisories,
        ),
    }
