"""Balance requests -> core cases: every quantity to SI, sweeps broadcast, uncertainties kept.

Each numeric input is read with :func:`service.api.http.quantities.read_quantity` under the
path the core knows it by (``initial_temperature``, ``companions[0].mass``,
``solute.mass_fraction``...), so that core errors, sweep indices and uncertainty
contributions all name the field as the client sent it. When any input is an array
(a sweep), every numeric field is broadcast to the sweep length; arrays must have equal
lengths (a one-element array or a single value repeats).
"""

from __future__ import annotations

from collections.abc import Iterable
from dataclasses import dataclass, field, replace
from typing import Any, Generic, TypeVar

import numpy as np
from numpy.typing import ArrayLike

from service.api.balances.schemas import (
    CompanionInput,
    CompositionInput,
    DissolvedSolidsInput,
    EvaporativeCoolingCreate,
    FlashFreezeCreate,
    HeatGainInput,
    SoluteInput,
)
from service.api.http.quantities import ParsedQuantity, read_quantity, require_exactly_one
from service.api.http.units import Dimension
from service.core.balances import (
    MATERIAL_SPECIFIC_HEATS,
    NAMED_SOLUTES,
    Companion,
    Composition,
    DissolvedSolids,
    EvaporativeCoolingCase,
    FlashFreezeCase,
    HeatGain,
    Solute,
    named_solute,
)
from service.core.errors import InvalidInputError

__all__ = [
    "BalanceInputs",
    "check_companion",
    "material_assumptions",
    "read_evaporative_cooling",
    "read_flash_freeze",
]

CaseT = TypeVar("CaseT")


@dataclass(frozen=True)
class BalanceInputs(Generic[CaseT]):
    """A balance case in SI, with what the answer needs to know about how it was sent.

    Attributes
    ----------
    case
        The core case; numeric fields are floats, or arrays of length ``points`` for a sweep.
    points
        Number of cases (1 unless swept).
    is_sweep
        Whether any input was sent as an array (results then come as ``values``).
    standard_uncertainties
        Field path -> standard uncertainty in SI (scalar, or of length ``points``).
    uncertainty_dimensions
        Field path -> dimension of that uncertainty (temperatures as differences).
    assumptions
        Statements the HTTP layer adds (sources of the named materials used).
    """

    case: CaseT
    points: int
    is_sweep: bool
    standard_uncertainties: dict[str, ArrayLike]
    uncertainty_dimensions: dict[str, Dimension]
    assumptions: tuple[str, ...]


@dataclass
class _Reader:
    """Reads quantities, then hands them out broadcast to the sweep length."""

    parsed: dict[str, ParsedQuantity] = field(default_factory=dict)
    dimensions: dict[str, Dimension] = field(default_factory=dict)
    _points: int | None = None

    def read(self, raw: Any, path: str, dimension: Dimension) -> str:
        """Read ``raw`` under ``path``; return the path, a handle for :meth:`value`."""
        assert self._points is None, "all inputs are read before any value is taken"
        self.parsed[path] = read_quantity(raw, field=path, dimension=dimension)
        self.dimensions[path] = dimension
        return path

    def optional(self, raw: Any, path: str, dimension: Dimension) -> str | None:
        """As :meth:`read`; None for an omitted input."""
        return None if raw is None else self.read(raw, path, dimension)

    @property
    def is_sweep(self) -> bool:
        return any(item.is_array for item in self.parsed.values())

    @property
    def points(self) -> int:
        if self._points is None:
            self._points = self._sweep_length()
        return self._points

    def _sweep_length(self) -> int:
        longest_path, longest = "", 1
        for path, item in self.parsed.items():
            if item.size == 1:
                continue
            if longest > 1 and item.size != longest:
                raise InvalidInputError(
                    path,
                    f"has {item.size} values but {longest_path} has {longest}; sweep arrays "
                    "must have equal lengths (or one value)",
                )
            longest_path, longest = path, item.size
        return longest

    def _shaped(self, array: np.ndarray) -> float | np.ndarray:
        if not self.is_sweep:
            return float(array.reshape(-1)[0])
        return np.array(np.broadcast_to(array, (self.points,)), dtype=np.float64)

    def value(self, path: str) -> Any:
        """The SI value: a float, or an array of the sweep length."""
        return self._shaped(self.parsed[path].si)

    def maybe(self, path: str | None) -> Any:
        """As :meth:`value`; None for an omitted input."""
        return None if path is None else self.value(path)

    def uncertainties(self) -> tuple[dict[str, ArrayLike], dict[str, Dimension]]:
        """Standard uncertainties in SI by path, and their dimensions."""
        values: dict[str, ArrayLike] = {}
        dimensions: dict[str, Dimension] = {}
        for path, item in self.parsed.items():
            if item.standard_uncertainty is None:
                continue
            values[path] = self._shaped(item.standard_uncertainty)
            dimension = self.dimensions[path]
            dimensions[path] = (
                Dimension.TEMPERATURE_DIFFERENCE
                if dimension is Dimension.TEMPERATURE
                else dimension
            )
        return values, dimensions

    def finish(self, case: CaseT, assumptions: tuple[str, ...]) -> BalanceInputs[CaseT]:
        values, dimensions = self.uncertainties()
        return BalanceInputs(
            case=case,
            points=self.points,
            is_sweep=self.is_sweep,
            standard_uncertainties=values,
            uncertainty_dimensions=dimensions,
            assumptions=assumptions,
        )


@dataclass(frozen=True)
class _CompanionPaths:
    mass: str
    specific_heat: str | None
    material: str | None
    name: str


def check_companion(item: CompanionInput, prefix: str) -> None:
    """Refuse a companion with both or neither of specific heat and material, or a material
    not in :data:`MATERIAL_SPECIFIC_HEATS`.

    Raises
    ------
    InvalidInputError
        Naming the offending fields under ``prefix`` (e.g. ``companions[0].``).
    """
    require_exactly_one(
        ("specific_heat", item.specific_heat), ("material", item.material), prefix=prefix
    )
    if item.material is not None and item.material not in MATERIAL_SPECIFIC_HEATS:
        known = ", ".join(sorted(MATERIAL_SPECIFIC_HEATS))
        raise InvalidInputError(
            f"{prefix}material",
            f"unknown material {item.material!r}; known: {known}",
            item.material,
        )


def material_assumptions(materials: Iterable[str | None]) -> tuple[str, ...]:
    """The assumption stating each companion material's specific heat and source, once."""
    return tuple(
        f"Companion material {name!r}: specific heat "
        f"{MATERIAL_SPECIFIC_HEATS[name].specific_heat:g} J/(kg K), "
        f"{MATERIAL_SPECIFIC_HEATS[name].source}."
        for name in dict.fromkeys(materials)
        if name is not None
    )


def _read_companions(reader: _Reader, companions: list[CompanionInput]) -> list[_CompanionPaths]:
    paths = []
    for position, item in enumerate(companions):
        prefix = f"companions[{position}]"
        check_companion(item, f"{prefix}.")
        paths.append(
            _CompanionPaths(
                mass=reader.read(item.mass, f"{prefix}.mass", Dimension.MASS),
                specific_heat=reader.optional(
                    item.specific_heat, f"{prefix}.specific_heat", Dimension.SPECIFIC_ENTROPY
                ),
                material=item.material,
                name=item.name or item.material or f"companion {position}",
            )
        )
    return paths


def _companions(reader: _Reader, paths: list[_CompanionPaths]) -> tuple[Companion, ...]:
    companions = []
    for item in paths:
        if item.material is not None:
            specific_heat: Any = MATERIAL_SPECIFIC_HEATS[item.material].specific_heat
        else:
            specific_heat = reader.value(str(item.specific_heat))
        companions.append(
            Companion(mass=reader.value(item.mass), specific_heat=specific_heat, name=item.name)
        )
    return tuple(companions)


def _read_heat_gain(reader: _Reader, gain: HeatGainInput | None) -> tuple[str | None, ...] | None:
    if gain is None:
        return None
    as_energy = gain.energy is not None and gain.power is None and gain.duration is None
    as_power = gain.energy is None and gain.power is not None and gain.duration is not None
    if not (as_energy or as_power):
        raise InvalidInputError("heat_gain", "give either energy, or both power and duration")
    return (
        reader.optional(gain.energy, "heat_gain.energy", Dimension.ENERGY),
        reader.optional(gain.power, "heat_gain.power", Dimension.POWER),
        reader.optional(gain.duration, "heat_gain.duration", Dimension.TIME),
    )


def _heat_gain(reader: _Reader, paths: tuple[str | None, ...] | None) -> HeatGain | None:
    if paths is None:
        return None
    energy, power, duration = (reader.maybe(path) for path in paths)
    return HeatGain(energy=energy, power=power, duration=duration)


def _read_solute(reader: _Reader, solute: SoluteInput | None) -> dict[str, str | None] | None:
    if solute is None:
        return None
    if solute.name is not None:
        if solute.name not in NAMED_SOLUTES:
            known = ", ".join(sorted(NAMED_SOLUTES))
            raise InvalidInputError(
                "solute.name", f"unknown solute {solute.name!r}; known: {known}", solute.name
            )
        if solute.molar_mass is not None or solute.van_t_hoff_factor is not None:
            raise InvalidInputError(
                "solute.name",
                "a named solute brings its molar mass and van 't Hoff factor; omit them",
            )
    elif solute.molar_mass is None:
        raise InvalidInputError(
            "solute.molar_mass", "give a named solute (solute.name) or its molar mass"
        )
    return {
        "mass_fraction": reader.read(
            solute.mass_fraction, "solute.mass_fraction", Dimension.DIMENSIONLESS
        ),
        "molar_mass": reader.optional(solute.molar_mass, "solute.molar_mass", Dimension.MOLAR_MASS),
        "van_t_hoff_factor": reader.optional(
            solute.van_t_hoff_factor, "solute.van_t_hoff_factor", Dimension.DIMENSIONLESS
        ),
        "specific_heat": reader.optional(
            solute.specific_heat, "solute.specific_heat", Dimension.SPECIFIC_ENTROPY
        ),
    }


def _solute(
    reader: _Reader, solute: SoluteInput | None, paths: dict[str, str | None] | None
) -> Solute | None:
    if solute is None or paths is None:
        return None
    fraction = reader.value(str(paths["mass_fraction"]))
    specific_heat = reader.maybe(paths["specific_heat"])
    if solute.name is not None:
        named = named_solute(solute.name, fraction, solute.model)
        return named if specific_heat is None else replace(named, specific_heat=specific_heat)
    options = {
        name: reader.value(path)
        for name in ("van_t_hoff_factor", "specific_heat")
        if (path := paths[name]) is not None
    }
    return Solute(
        mass_fraction=fraction, molar_mass=reader.value(str(paths["molar_mass"])), **options
    )


def _read_dissolved_solids(
    reader: _Reader, solids: DissolvedSolidsInput | None
) -> dict[str, str | None] | None:
    if solids is None:
        return None
    if solids.name is not None:
        if solids.name not in NAMED_SOLUTES:
            known = ", ".join(sorted(NAMED_SOLUTES))
            raise InvalidInputError(
                "dissolved_solids.name",
                f"unknown solute {solids.name!r}; known: {known}",
                solids.name,
            )
        if solids.molar_mass is not None or solids.van_t_hoff_factor is not None:
            raise InvalidInputError(
                "dissolved_solids.name",
                "a named solute brings its molar mass and van 't Hoff factor; omit them",
            )
    elif solids.molar_mass is None:
        raise InvalidInputError(
            "dissolved_solids.molar_mass",
            "give a named solute (dissolved_solids.name) or its molar mass",
        )
    return {
        "mass_fraction": reader.read(
            solids.mass_fraction, "dissolved_solids.mass_fraction", Dimension.DIMENSIONLESS
        ),
        "molar_mass": reader.optional(
            solids.molar_mass, "dissolved_solids.molar_mass", Dimension.MOLAR_MASS
        ),
        "van_t_hoff_factor": reader.optional(
            solids.van_t_hoff_factor, "dissolved_solids.van_t_hoff_factor", Dimension.DIMENSIONLESS
        ),
    }


def _dissolved_solids(
    reader: _Reader, solids: DissolvedSolidsInput | None, paths: dict[str, str | None] | None
) -> DissolvedSolids | None:
    if solids is None or paths is None:
        return None
    fraction = reader.value(str(paths["mass_fraction"]))
    if solids.name is not None:
        named = NAMED_SOLUTES[solids.name]
        return DissolvedSolids(
            mass_fraction=fraction,
            molar_mass=named.molar_mass,
            van_t_hoff_factor=named.van_t_hoff_factor,
            name=solids.name,
            activity_model=named.activity_model,
        )
    factor = paths["van_t_hoff_factor"]
    return DissolvedSolids(
        mass_fraction=fraction,
        molar_mass=reader.value(str(paths["molar_mass"])),
        van_t_hoff_factor=1.0 if factor is None else reader.value(factor),
    )


def read_flash_freeze(body: FlashFreezeCreate) -> BalanceInputs[FlashFreezeCase]:
    """The flash-freeze request as a core case.

    Raises
    ------
    InvalidInputError
        Unreadable quantity, unequal sweep lengths, conflicting or unknown options.
    """
    reader = _Reader()
    initial = reader.read(body.initial_temperature, "initial_temperature", Dimension.TEMPERATURE)
    water = reader.read(body.water_mass, "water_mass", Dimension.MASS)
    final = reader.optional(
        body.final_ice_temperature, "final_ice_temperature", Dimension.TEMPERATURE
    )
    nucleation = reader.optional(
        body.nucleation_temperature, "nucleation_temperature", Dimension.TEMPERATURE
    )
    trap = reader.optional(body.trap_temperature, "trap_temperature", Dimension.TEMPERATURE)
    companions = _read_companions(reader, body.companions)
    gain = _read_heat_gain(reader, body.heat_gain)
    solute = _read_solute(reader, body.solute)
    food_paths = _read_composition(reader, body.composition)
    if body.composition is not None:
        if body.solute is not None:
            raise InvalidInputError("solute", "give a solute or a composition, not both")
        if "water_mass" in body.model_fields_set:
            raise InvalidInputError(
                "water_mass",
                "not taken with a composition: give the food's product_mass (its water is "
                "in the composition)",
            )
    product = reader.optional(body.product_mass, "product_mass", Dimension.MASS)
    onset = reader.optional(body.freezing_point, "freezing_point", Dimension.TEMPERATURE)
    case = FlashFreezeCase(
        initial_temperature=reader.value(initial),
        water_mass=reader.value(water),
        final_ice_temperature=reader.maybe(final),
        method=body.method,
        companions=_companions(reader, companions),
        heat_gain=_heat_gain(reader, gain),
        solute=_solute(reader, body.solute, solute),
        nucleation_temperature=reader.maybe(nucleation),
        trap_temperature=reader.maybe(trap),
        trajectory_points=body.trajectory_points,
        composition=_composition(reader, food_paths),
        product_mass=reader.maybe(product),
        freezing_point=reader.maybe(onset),
    )
    return reader.finish(case, material_assumptions(item.material for item in companions))


_COMPONENTS = ("water", "protein", "fat", "carbohydrate", "fiber", "ash")


def _read_composition(
    reader: _Reader, composition: CompositionInput | None
) -> tuple[dict[str, str], dict[str, str]] | None:
    """The reader paths of a composition's components and of its dissolved solutes."""
    if composition is None:
        return None
    components = {
        name: reader.read(
            getattr(composition, name), f"composition.{name}", Dimension.DIMENSIONLESS
        )
        for name in _COMPONENTS
    }
    solutes = {
        name: reader.read(raw, f"composition.dissolved_solutes.{name}", Dimension.DIMENSIONLESS)
        for name, raw in (composition.dissolved_solutes or {}).items()
    }
    return components, solutes


def _composition(
    reader: _Reader, paths: tuple[dict[str, str], dict[str, str]] | None
) -> Composition | None:
    """The composition of the current case."""
    if paths is None:
        return None
    components, solutes = paths
    return Composition(
        **{name: reader.value(path) for name, path in components.items()},
        dissolved_solutes=tuple((name, reader.value(path)) for name, path in solutes.items()),
    )


def read_evaporative_cooling(
    body: EvaporativeCoolingCreate,
) -> BalanceInputs[EvaporativeCoolingCase]:
    """The evaporative-cooling request as a core case.

    Raises
    ------
    InvalidInputError
        Unreadable quantity, unequal sweep lengths, both or neither of ``specific_heat``
        and ``composition``, conflicting or unknown options.
    """
    require_exactly_one(("specific_heat", body.specific_heat), ("composition", body.composition))
    reader = _Reader()
    mass = reader.read(body.product_mass, "product_mass", Dimension.MASS)
    initial = reader.read(body.initial_temperature, "initial_temperature", Dimension.TEMPERATURE)
    final = reader.read(body.final_temperature, "final_temperature", Dimension.TEMPERATURE)
    specific_heat = reader.optional(body.specific_heat, "specific_heat", Dimension.SPECIFIC_ENTROPY)
    food_paths = _read_composition(reader, body.composition)
    freezing = reader.optional(body.freezing_point, "freezing_point", Dimension.TEMPERATURE)
    trap = reader.optional(body.trap_temperature, "trap_temperature", Dimension.TEMPERATURE)
    time = reader.optional(body.cooling_time, "cooling_time", Dimension.TIME)
    companions = _read_companions(reader, body.companions)
    gain = _read_heat_gain(reader, body.heat_gain)
    solids = _read_dissolved_solids(reader, body.dissolved_solids)
    case = EvaporativeCoolingCase(
        product_mass=reader.value(mass),
        initial_temperature=reader.value(initial),
        final_temperature=reader.value(final),
        specific_heat=reader.maybe(specific_heat),
        composition=_composition(reader, food_paths),
        companions=_companions(reader, companions),
        heat_gain=_heat_gain(reader, gain),
        freezing_point=reader.maybe(freezing),
        trap_temperature=reader.maybe(trap),
        cooling_time=reader.maybe(time),
        dissolved_solids=_dissolved_solids(reader, body.dissolved_solids, solids),
    )
    return reader.finish(case, material_assumptions(item.material for item in companions))
