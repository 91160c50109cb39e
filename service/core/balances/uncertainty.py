"""Uncertainty of the balances' main outputs.

Two contributions, reported separately:

1. Input uncertainty. Each input given with a standard uncertainty u_i is
   propagated by linear sensitivity (GUM, JCGM 100:2008, Sec. 5.1.2, law of
   propagation of uncertainty for uncorrelated inputs):
   u_y = sqrt(sum_i (c_i u_i)**2), with the sensitivity c_i from a central finite
   difference with step u_i (one-sided where a step would leave the valid range).
   Both perturbed cases of an input are solved together as a two-element sweep.

2. Property formulations' own uncertainty, from their stated relative
   uncertainties (:func:`service.core.properties.uncertainty.stated_uncertainty`, which states
   expanded k = 2 values; halved here to standard uncertainties). Each stage's
   evaporated mass scales, to first order, as (heat to remove) / (latent heat):
   liquid cooling with liquid heat capacity / enthalpy of vaporization, freezing
   with enthalpy of fusion (from ice enthalpy) / enthalpy of sublimation, ice cooling
   with ice heat capacity / enthalpy of sublimation. A quantity's contribution is
   summed over stages (fully correlated), contributions of different quantities
   combine in quadrature. Stages no statement covers (supercooled liquid) are
   listed in ``not_covered``. The statements' ``basis`` says whether a value was
   read from a release or recalled.
"""

from __future__ import annotations

from collections.abc import Callable, Mapping
from dataclasses import dataclass
from typing import Any, Final, TypeVar

import numpy as np
from numpy.typing import ArrayLike

from service.core.balances.sweeps import field_value, replace_field
from service.core.errors import InvalidInputError, OutOfRangeError, TripointError
from service.core.properties.lookups import ReportedUncertainty
from service.core.properties.phase import FloatArray
from service.core.properties.uncertainty import StatedUncertainty, stated_uncertainty

__all__ = [
    "EVAPORATED_MASS_UNCERTAINTY",
    "INPUT_METHOD",
    "InputUncertainty",
    "PropertyUncertainty",
    "propagate_input_uncertainty",
    "property_uncertainty_of_evaporation",
]

INPUT_METHOD: Final = (
    "linear sensitivity (GUM law of propagation, uncorrelated inputs); sensitivities by "
    "central finite differences with step equal to each input's standard uncertainty, "
    "one-sided at a range limit"
)

_COVERAGE_FACTOR: Final = 2.0
"""IAPWS statements are expanded uncertainties with k = 2."""

CaseT = TypeVar("CaseT")

EVAPORATED_MASS_UNCERTAINTY: Final = ReportedUncertainty(
    quantity="evaporated_mass",
    relative=None,
    coverage="standard (k = 1): the k = 2 statements above halved",
    statement=(
        "Standard uncertainty of the evaporated mass from the property formulations' own "
        "uncertainties: each stage's evaporated mass scales as (heat to remove) / (latent "
        "heat); contributions of one quantity add over stages, different quantities "
        "combine in quadrature. Input uncertainties are in `input_uncertainty`."
    ),
    source=(
        "derived by tripoint from the statements listed (service/core/balances/uncertainty.py)"
    ),
    basis="derived",
    statement_id="balances.evaporated-mass",
    coverage_factor=1.0,
)
"""What a balance answer states beside its evaporated mass's property uncertainty (the
absolute value is the answer's; stages no statement covers are named in the answer)."""


@dataclass(frozen=True)
class InputUncertainty:
    """Propagated standard uncertainty of outputs from inputs' standard uncertainties.

    Attributes
    ----------
    method : str
    standard_uncertainty : dict of str to ndarray
        Per output, in the output's unit; arrays of the sweep shape.
    sensitivity : dict of str to dict of str to ndarray
        [output][input] -> d output / d input.
    contribution : dict of str to dict of str to ndarray
        [output][input] -> |c_i| u_i.
    """

    method: str
    standard_uncertainty: dict[str, FloatArray]
    sensitivity: dict[str, dict[str, FloatArray]]
    contribution: dict[str, dict[str, FloatArray]]


@dataclass(frozen=True)
class PropertyUncertainty:
    """Standard uncertainty of the evaporated mass from the property formulations.

    Attributes
    ----------
    evaporated_mass : ndarray
        kg, standard (k = 1).
    contribution : dict of str to ndarray
        Per stated quantity, kg.
    statements : tuple of StatedUncertainty
        The statements used (with their basis).
    not_covered : tuple of str
        Stages without a statement (their property contribution is missing).
    """

    evaporated_mass: FloatArray
    contribution: dict[str, FloatArray]
    statements: tuple[StatedUncertainty, ...]
    not_covered: tuple[str, ...]


def propagate_input_uncertainty(
    solve: Callable[[CaseT], Any],
    case: CaseT,
    standard_uncertainties: Mapping[str, ArrayLike],
    outputs: tuple[str, ...],
) -> InputUncertainty:
    """Propagate inputs' standard uncertainties to a balance's outputs.

    Parameters
    ----------
    solve : callable
        The balance, e.g. :func:`flash_freeze`.
    case : dataclass
        Its case (may be a sweep).
    standard_uncertainties : mapping
        Field path (e.g. ``"initial_temperature"``, ``"companions[0].mass"``) to its
        standard uncertainty in the field's unit, >= 0 (scalar or sweep-shaped).
    outputs : tuple of str
        Result attributes to propagate to (e.g. ``("evaporated_mass",)``).

    Returns
    -------
    InputUncertainty

    Raises
    ------
    InvalidInputError
        Unknown field path, or a negative or non-finite uncertainty.

    Notes
    -----
    u_y = sqrt(sum_i (c_i u_i)**2), c_i = (y(x_i + u_i) - y(x_i - u_i)) / (2 u_i).
    """
    base = solve(case)
    sensitivity: dict[str, dict[str, FloatArray]] = {name: {} for name in outputs}
    contribution: dict[str, dict[str, FloatArray]] = {name: {} for name in outputs}
    total = {
        name: np.zeros_like(np.asarray(getattr(base, name), dtype=np.float64)) for name in outputs
    }
    for path, raw in standard_uncertainties.items():
        value = field_value(case, path)
        step = np.asarray(raw, dtype=np.float64)
        if not np.all(np.isfinite(step)) or np.any(step < 0.0):
            raise InvalidInputError(path, "standard uncertainty must be finite and >= 0", raw)
        if not np.any(step > 0.0):
            continue
        value, step = np.broadcast_arrays(value, step)
        safe_step = np.where(step > 0.0, step, 1.0)
        pair = np.stack([value + step, value - step])
        try:
            perturbed = solve(replace_field(case, path, pair))
            span = 2.0 * safe_step
            upper = {name: np.asarray(getattr(perturbed, name))[0] for name in outputs}
            lower = {name: np.asarray(getattr(perturbed, name))[1] for name in outputs}
        except TripointError:
            try:
                high = solve(replace_field(case, path, value + step))
                upper = {name: np.asarray(getattr(high, name)) for name in outputs}
                lower = {name: np.asarray(getattr(base, name)) for name in outputs}
            except TripointError:
                low = solve(replace_field(case, path, value - step))
                upper = {name: np.asarray(getattr(base, name)) for name in outputs}
                lower = {name: np.asarray(getattr(low, name)) for name in outputs}
            span = safe_step
        for name in outputs:
            slope = np.asarray((upper[name] - lower[name]) / span, dtype=np.float64)
            slope = np.where(step > 0.0, slope, 0.0)
            part = np.abs(slope) * step
            sensitivity[name][path] = slope
            contribution[name][path] = part
            total[name] = total[name] + part**2
    return InputUncertainty(
        method=INPUT_METHOD,
        standard_uncertainty={name: np.sqrt(value) for name, value in total.items()},
        sensitivity=sensitivity,
        contribution=contribution,
    )


_STAGE_QUANTITIES: Final[dict[str, tuple[tuple[str, str, float], ...]]] = {
    # stage name -> (formulation, quantity, exponent of the evaporated mass in it)
    "cooling": (
        ("IAPWS-95", "liquid_isobaric_heat_capacity", 1.0),
        ("IAPWS-95", "enthalpy_of_vaporization", -1.0),
    ),
    "freezing": (
        ("IAPWS-06 ice Ih", "ice_enthalpy", 1.0),
        ("IAPWS-06 ice Ih", "enthalpy_of_sublimation", -1.0),
    ),
    "ice cooling": (
        ("IAPWS-06 ice Ih", "ice_isobaric_heat_capacity", 1.0),
        ("IAPWS-06 ice Ih", "enthalpy_of_sublimation", -1.0),
    ),
}

_ICE_ENTHALPY_TO_FUSION: Final = 1.0
"""Relative uncertainty of the enthalpy of fusion taken equal to that stated for the ice
enthalpy (h_fusion = h_liquid - h_ice with |h_ice| ~ h_fusion near 273 K)."""


def property_uncertainty_of_evaporation(
    stages: tuple[Any, ...], *, lumped_specific_heat: bool = False
) -> PropertyUncertainty:
    """Standard uncertainty of the evaporated mass from the property formulations.

    Parameters
    ----------
    stages : tuple of StageResult
        From a balance result (fields ``name``, ``evaporated_mass``, start and end
        temperatures).
    lumped_specific_heat : bool
        True when the load's heat capacity is a user input (evaporative cooling with a
        lumped specific heat): the liquid heat capacity statement is then not used.

    Returns
    -------
    PropertyUncertainty
    """
    contributions: dict[str, FloatArray] = {}
    used: dict[tuple[str, str, float], StatedUncertainty] = {}
    missing: list[str] = []
    for stage in stages:
        quantities = _STAGE_QUANTITIES.get(stage.name)
        if quantities is None:
            if np.any(np.asarray(stage.evaporated_mass) > 0.0):
                missing.append(stage.name)
            continue
        mean = 0.5 * (np.asarray(stage.start_temperature) + np.asarray(stage.end_temperature))
        for formulation, quantity, exponent in quantities:
            if lumped_specific_heat and quantity == "liquid_isobaric_heat_capacity":
                continue
            try:
                lookup = stated_uncertainty(formulation, quantity, mean)
            except OutOfRangeError:
                missing.append(f"{stage.name} ({quantity})")
                continue
            for statement in lookup.statements:
                used[(statement.formulation, statement.quantity, statement.minimum_temperature)] = (
                    statement
                )
            relative = lookup.relative_uncertainty / _COVERAGE_FACTOR
            if quantity == "ice_enthalpy":
                relative = relative * _ICE_ENTHALPY_TO_FUSION
            part = np.abs(exponent) * relative * np.asarray(stage.evaporated_mass)
            contributions[quantity] = contributions.get(quantity, np.zeros_like(part)) + part
    if not contributions:
        zero = np.zeros_like(np.asarray(stages[0].evaporated_mass, dtype=np.float64))
        return PropertyUncertainty(zero, {}, (), tuple(missing))
    total = np.sqrt(sum(part**2 for part in contributions.values()))
    return PropertyUncertainty(
        evaporated_mass=np.asarray(total, dtype=np.float64),
        contribution=contributions,
        statements=tuple(used.values()),
        not_covered=tuple(dict.fromkeys(missing)),
    )
