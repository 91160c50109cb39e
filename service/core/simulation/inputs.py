"""What a vacuum-chamber simulation is asked: chamber, pump, condenser, product, ends.

All fields are SI scalars (K, Pa, kg, m3, s, W). :func:`validate_case` checks every
field at call level and names the offending one by its dotted path (the same path the
HTTP request uses), e.g. ``"pump.nominal_speed"``.
"""

from __future__ import annotations

from dataclasses import dataclass
from typing import Final, Literal

from service.core.balances.companions import Companion
from service.core.balances.food_composition import Composition
from service.core.balances.scalars import finite_scalar, require_scalar_within
from service.core.balances.solutes import Solute
from service.core.errors import InvalidInputError, UnsupportedStateError
from service.core.properties.constants import TRIPLE_POINT_TEMPERATURE
from service.core.simulation.path_tables import (
    ICE_TEMPERATURE_MIN,
    LIQUID_TEMPERATURE_MAX,
    LIQUID_TEMPERATURE_MIN,
)

__all__ = [
    "SIMULATION_LIMITS",
    "Chamber",
    "Condenser",
    "EvaporationModel",
    "HeatGainRate",
    "InteriorGeometry",
    "Product",
    "ProductInterior",
    "Pump",
    "ScheduleLimit",
    "TemperatureLocation",
    "VacuumChamberCase",
    "validate_case",
]

EvaporationModel = Literal["equilibrium", "kinetic"]
InteriorGeometry = Literal["slab", "cylinder", "sphere"]
TemperatureLocation = Literal["core", "mean", "surface"]

SIMULATION_LIMITS: Final = {
    "free_volume_min": 1.0e-6,
    "free_volume_max": 1.0e4,
    "initial_pressure_max": 2.0e5,
    "chamber_temperature_min": LIQUID_TEMPERATURE_MIN,
    "chamber_temperature_max": LIQUID_TEMPERATURE_MAX,
    "condenser_temperature_min": ICE_TEMPERATURE_MIN,
    "end_time_max": 30 * 86400.0,
    "series_points_min": 10,
    "series_points_max": 5000,
    "specific_heat_max": 1.0e4,
    "characteristic_size_min": 1.0e-3,
    "characteristic_size_max": 3.0,
    "interior_size_min": 1.0e-3,
    "interior_size_max": 1.0,
    "interior_conductivity_min": 0.01,
    "interior_conductivity_max": 10.0,
    "interior_density_min": 20.0,
    "interior_density_max": 3000.0,
    "interior_nodes_min": 5,
    "interior_nodes_max": 100,
    "pore_venting_time_min": 0.01,
    "pore_venting_time_max": 1.0e5,
}
"""Validity limits of the simulation inputs (SI). Temperatures follow the balances'
ranges (supercooled or solution liquid from 243.15 K, ice from 173.15 K, the normal
boiling point at most); the end time is at most 30 days."""


@dataclass(frozen=True)
class Chamber:
    """The vacuum chamber and its gas.

    Attributes
    ----------
    free_volume : float
        Gas volume, m3 (chamber minus product and fixtures), 1e-6 to 1e4.
    initial_pressure : float
        Partial pressure of the air at the start, Pa, > 0.
    temperature : float
        Temperature of the chamber gas and walls, and of the air leaking in, K.
    leak_rate : float
        Air leak throughput, Pa m3/s (1 mbar L/s = 0.1 Pa m3/s), >= 0.
    initial_vapor_pressure : float
        Partial pressure of water vapor at the start, Pa, >= 0.
    """

    free_volume: float
    initial_pressure: float
    temperature: float
    leak_rate: float = 0.0
    initial_vapor_pressure: float = 0.0


@dataclass(frozen=True)
class Pump:
    """The vacuum pump.

    Attributes
    ----------
    nominal_speed : float
        Volume flow at the inlet, m3/s, > 0 (used where no speed curve is given).
    ultimate_pressure : float
        Pa, >= 0: the effective speed falls to zero there.
    speed_curve_pressures, speed_curve_speeds : tuple of float
        Optional speed curve: pressures (Pa, > 0, strictly increasing) and speeds
        (m3/s, >= 0), interpolated linearly in ln p and held constant beyond its ends.
    water_vapor_tolerance : float or None
        kg/s, > 0: the largest vapor mass flow the maker states the pump takes (with gas
        ballast) without condensing inside; checked, not modelled.
    """

    nominal_speed: float
    ultimate_pressure: float = 0.0
    speed_curve_pressures: tuple[float, ...] = ()
    speed_curve_speeds: tuple[float, ...] = ()
    water_vapor_tolerance: float | None = None


@dataclass(frozen=True)
class Condenser:
    """A condenser (cold trap) inside the chamber.

    Attributes
    ----------
    surface_temperature : float
        K, 173.15 K to 273.16 K.
    vapor_conductance : float
        m3/s, > 0: volume flow of chamber vapor the condenser takes in (its pumping
        speed for water vapor; an ideal cold surface of area A takes A sqrt(R T / (2 pi))).
    ice_capacity : float or None
        kg of ice it holds; exceeding it is an event and a warning.
    refrigeration_capacity : float or None
        W; caps the rate of condensation at this load.
    """

    surface_temperature: float
    vapor_conductance: float
    ice_capacity: float | None = None
    refrigeration_capacity: float | None = None


@dataclass(frozen=True)
class ProductInterior:
    """Heat conduction inside the product (:mod:`service.core.simulation.product_interior`).

    The load is taken as identical items of one shape, each conducting heat from its
    centre to its surface; the chamber sees their surfaces.

    Attributes
    ----------
    geometry : {"slab", "cylinder", "sphere"}
        Slab (heat leaves by both faces), long cylinder (by its side), sphere.
    half_thickness_or_radius : float
        m, 1e-3 to 1: half the thickness of a slab, or the radius of a cylinder or sphere
        (not the diameter that ``Product.characteristic_size`` gives the air's resistance).
    thermal_conductivity : float or None
        W/(m K), 0.01 to 10. None: from ``Product.composition`` by the Choi and Okos (1986)
        parallel model at the initial temperature
        (:mod:`service.core.simulation.product_conductivity`).
    density : float or None
        kg/m3, 20 to 3000 (with the pores of a porous product). None: from the composition
        (non-porous).
    nodes : int
        Radial nodes from the centre to the surface, 5 to 100.
    target_applies_to : {"core", "mean", "surface"}
        The temperature the target and the schedule are checked on: the centre (the
        default, as a food-safety cooling limit reads), the volume mean, or the surface.
    pore_venting_time : float or None
        s, 0.01 to 1e5: a porous product's interior boils where its vapor pressure
        exceeds the chamber's, the vapor leaving through the pores with this time
        constant (see :mod:`service.core.simulation.product_interior`). None: no
        evaporation inside the product (non-porous).
    """

    geometry: InteriorGeometry
    half_thickness_or_radius: float
    thermal_conductivity: float | None = None
    density: float | None = None
    nodes: int = 20
    target_applies_to: TemperatureLocation = "core"
    pore_venting_time: float | None = None


@dataclass(frozen=True)
class Product:
    """The load: water with its solids (and optionally a solute).

    Attributes
    ----------
    mass : float
        Initial total mass, kg, > 0.
    initial_temperature : float
        K, from the product's freezing onset to 373.15 K (the product starts unfrozen).
    water_fraction : float
        Mass fraction of water, (0, 1]; ignored with ``composition``.
    solids_specific_heat : float
        J/(kg K) of the non-water part, >= 0; ignored with ``composition``.
    composition : Composition or None
        Water, protein, fat, carbohydrate, fiber, ash fractions; the non-water part
        takes the Choi and Okos (1986) specific heats.
    solute : Solute or None
        Dissolved solute (part of the non-water mass); the water freezes progressively.
    evaporation : {"equilibrium", "kinetic"}
        Equilibrium: the product boils once the chamber pressure reaches its vapor
        pressure and keeps the chamber at it. Kinetic: Hertz-Knudsen-Langmuir flux
        over ``exposed_area`` with ``evaporation_coefficient``, in series with vapor
        diffusion through the chamber air
        (:mod:`service.core.simulation.air_limited_evaporation`).
    exposed_area : float or None
        m2, > 0 (kinetic).
    evaporation_coefficient : float or None
        (0, 1] (kinetic).
    characteristic_size : float or None
        m, 1e-3 to 3 (kinetic): diameter of one item (a head, a loaf) taken as a sphere
        for the air's resistance to vapor diffusion; None means
        :data:`~service.core.simulation.air_limited_evaporation.DEFAULT_CHARACTERISTIC_SIZE`
        (0.1 m).
    nucleation_temperature : float or None
        K: the water stays liquid (supercooled) below its freezing point until it reaches
        this temperature, then ice nucleates and the product recalesces to its freezing
        line (as in the flash-freeze balance). None: ice forms at the freezing point.
        Between 243.15 K (the supercooled-liquid tables' end) and the freezing point.
    interior : ProductInterior or None
        Heat conduction inside the product (surface, mean and core temperatures). None:
        the product has one uniform temperature (lumped).
    """

    mass: float
    initial_temperature: float
    water_fraction: float = 1.0
    solids_specific_heat: float = 0.0
    composition: Composition | None = None
    solute: Solute | None = None
    evaporation: EvaporationModel = "equilibrium"
    exposed_area: float | None = None
    evaporation_coefficient: float | None = None
    characteristic_size: float | None = None
    nucleation_temperature: float | None = None
    interior: ProductInterior | None = None


@dataclass(frozen=True)
class HeatGainRate:
    """Heat flowing into the product (:mod:`service.core.simulation.product_heating`):

    Q = P + UA (T_sur - T) + sigma eps A_r (T_wall**4 - T**4) + h_c A_c (T_shelf - T).

    Attributes
    ----------
    power : float
        W (may be negative for a cooled shelf).
    conductance : float
        W/K, >= 0.
    surroundings_temperature : float or None
        K; None means the chamber temperature.
    radiating_area : float
        m2, >= 0: product surface exchanging radiation with the chamber walls.
    emissivity : float
        Effective emissivity of that exchange, 0 < eps <= 1 (default 0.9, wet foods and
        ice about 0.9-0.97; common practice, no source).
    wall_temperature : float or None
        K; None means the chamber temperature.
    contact_coefficient : float
        W/(m2 K), >= 0: heat-transfer coefficient to a shelf or tray the product touches.
    contact_area : float
        m2, >= 0: the area in contact.
    shelf_temperature : float or None
        K; None means the chamber temperature.
    """

    power: float = 0.0
    conductance: float = 0.0
    surroundings_temperature: float | None = None
    radiating_area: float = 0.0
    emissivity: float = 0.9
    wall_temperature: float | None = None
    contact_coefficient: float = 0.0
    contact_area: float = 0.0
    shelf_temperature: float | None = None


@dataclass(frozen=True)
class ScheduleLimit:
    """A point of a cooling schedule: the product at or below ``temperature`` by ``time``."""

    time: float
    temperature: float


@dataclass(frozen=True)
class VacuumChamberCase:
    """Input of :func:`service.core.simulation.simulate_vacuum_chamber`.

    Attributes
    ----------
    chamber, pump, product
    condenser : Condenser or None
    companions : tuple of Companion
        Masses (trays, racks) at the product temperature.
    heat_gain : HeatGainRate or None
        None: adiabatic product.
    end_time : float
        s, > 0: the simulation stops here at the latest.
    target_temperature : float or None
        K: the simulation stops when the product reaches it.
    schedule : tuple of ScheduleLimit
        Cooling schedule to check.
    series_points : int
        Points of the time series (10 to 5000, plus one per event).
    """

    chamber: Chamber
    pump: Pump
    product: Product
    end_time: float
    condenser: Condenser | None = None
    companions: tuple[Companion, ...] = ()
    heat_gain: HeatGainRate | None = None
    target_temperature: float | None = None
    schedule: tuple[ScheduleLimit, ...] = ()
    series_points: int = 200


def _validate_chamber(chamber: Chamber) -> None:
    limits = SIMULATION_LIMITS
    require_scalar_within(
        chamber.free_volume,
        "chamber.free_volume",
        limits["free_volume_min"],
        limits["free_volume_max"],
        "m3",
        "from 1 mL (smaller gas volumes make the chamber balance too stiff to integrate "
        "and are not a vacuum chamber) to 10,000 m3",
    )
    require_scalar_within(
        chamber.initial_pressure,
        "chamber.initial_pressure",
        0.0,
        limits["initial_pressure_max"],
        "Pa",
        "partial pressure of the air at the start, up to 2 bar",
        exclusive_minimum=True,
    )
    require_scalar_within(
        chamber.temperature,
        "chamber.temperature",
        limits["chamber_temperature_min"],
        limits["chamber_temperature_max"],
        "K",
        "the chamber gas temperature sets the vapor enthalpy at the pump and condenser",
    )
    require_scalar_within(
        chamber.leak_rate, "chamber.leak_rate", 0.0, None, "Pa*m3/s", "must be >= 0"
    )
    require_scalar_within(
        chamber.initial_vapor_pressure,
        "chamber.initial_vapor_pressure",
        0.0,
        None,
        "Pa",
        "must be >= 0",
    )


def _validate_pump(pump: Pump, initial_pressure: float) -> None:
    require_scalar_within(
        pump.nominal_speed,
        "pump.nominal_speed",
        0.0,
        None,
        "m3/s",
        "must be > 0",
        exclusive_minimum=True,
    )
    require_scalar_within(
        pump.ultimate_pressure,
        "pump.ultimate_pressure",
        0.0,
        initial_pressure,
        "Pa",
        "the pump's ultimate pressure lies below the chamber's initial pressure",
    )
    if pump.water_vapor_tolerance is not None:
        require_scalar_within(
            pump.water_vapor_tolerance,
            "pump.water_vapor_tolerance",
            0.0,
            None,
            "kg/s",
            "must be > 0",
            exclusive_minimum=True,
        )
    pressures, speeds = pump.speed_curve_pressures, pump.speed_curve_speeds
    if len(pressures) != len(speeds):
        raise InvalidInputError(
            "pump.speed_curve", "needs as many speeds as pressures", len(speeds)
        )
    if pressures and len(pressures) < 2:
        raise InvalidInputError("pump.speed_curve", "needs at least two points", len(pressures))
    for index, (pressure, speed) in enumerate(zip(pressures, speeds, strict=True)):
        require_scalar_within(
            pressure,
            f"pump.speed_curve[{index}].pressure",
            0.0,
            None,
            "Pa",
            "must be > 0",
            exclusive_minimum=True,
        )
        require_scalar_within(
            speed, f"pump.speed_curve[{index}].speed", 0.0, None, "m3/s", "must be >= 0"
        )
        if index and pressure <= pressures[index - 1]:
            raise InvalidInputError(
                f"pump.speed_curve[{index}].pressure",
                "pressures of the speed curve must increase strictly",
                pressure,
            )


def _validate_condenser(condenser: Condenser) -> None:
    require_scalar_within(
        condenser.surface_temperature,
        "condenser.surface_temperature",
        SIMULATION_LIMITS["condenser_temperature_min"],
        TRIPLE_POINT_TEMPERATURE,
        "K",
        "the condenser collects the vapor as ice",
    )
    require_scalar_within(
        condenser.vapor_conductance,
        "condenser.vapor_conductance",
        0.0,
        None,
        "m3/s",
        "must be > 0",
        exclusive_minimum=True,
    )
    if condenser.ice_capacity is not None:
        require_scalar_within(
            condenser.ice_capacity,
            "condenser.ice_capacity",
            0.0,
            None,
            "kg",
            "must be > 0",
            exclusive_minimum=True,
        )
    if condenser.refrigeration_capacity is not None:
        require_scalar_within(
            condenser.refrigeration_capacity,
            "condenser.refrigeration_capacity",
            0.0,
            None,
            "W",
            "must be > 0",
            exclusive_minimum=True,
        )


def _validate_product(product: Product) -> None:
    require_scalar_within(
        product.mass, "product.mass", 0.0, None, "kg", "must be > 0", exclusive_minimum=True
    )
    require_scalar_within(
        product.initial_temperature,
        "product.initial_temperature",
        LIQUID_TEMPERATURE_MIN,
        LIQUID_TEMPERATURE_MAX,
        "K",
        "the product starts liquid, at most at the normal boiling point",
    )
    if product.composition is None:
        require_scalar_within(
            product.water_fraction,
            "product.water_fraction",
            0.0,
            1.0,
            "1",
            "mass fraction of water",
            exclusive_minimum=True,
        )
        require_scalar_within(
            product.solids_specific_heat,
            "product.solids_specific_heat",
            0.0,
            SIMULATION_LIMITS["specific_heat_max"],
            "J/(kg*K)",
            "specific heat of the non-water part",
        )
    if product.evaporation not in ("equilibrium", "kinetic"):
        raise InvalidInputError(
            "product.evaporation", "must be 'equilibrium' or 'kinetic'", product.evaporation
        )
    if product.evaporation == "kinetic":
        if product.exposed_area is None or product.evaporation_coefficient is None:
            raise InvalidInputError(
                "product.exposed_area",
                "kinetic evaporation needs exposed_area and evaporation_coefficient",
            )
        require_scalar_within(
            product.exposed_area,
            "product.exposed_area",
            0.0,
            None,
            "m2",
            "must be > 0",
            exclusive_minimum=True,
        )
        require_scalar_within(
            product.evaporation_coefficient,
            "product.evaporation_coefficient",
            0.0,
            1.0,
            "1",
            "fraction of the kinetic-theory flux, 0 < alpha <= 1",
            exclusive_minimum=True,
        )
    if product.characteristic_size is not None:
        require_scalar_within(
            product.characteristic_size,
            "product.characteristic_size",
            SIMULATION_LIMITS["characteristic_size_min"],
            SIMULATION_LIMITS["characteristic_size_max"],
            "m",
            "diameter of one item for the air's resistance to evaporation, 1 mm to 3 m",
        )
    if product.interior is not None:
        _validate_interior(product)


def _validate_interior(product: Product) -> None:
    """Raise for an interior model out of range or asked for what it does not model."""
    interior = product.interior
    assert interior is not None
    limits = SIMULATION_LIMITS
    if interior.geometry not in ("slab", "cylinder", "sphere"):
        raise InvalidInputError(
            "product.interior.geometry",
            "must be 'slab', 'cylinder' or 'sphere'",
            interior.geometry,
        )
    if interior.target_applies_to not in ("core", "mean", "surface"):
        raise InvalidInputError(
            "product.interior.target_applies_to",
            "must be 'core', 'mean' or 'surface'",
            interior.target_applies_to,
        )
    require_scalar_within(
        interior.half_thickness_or_radius,
        "product.interior.half_thickness_or_radius",
        limits["interior_size_min"],
        limits["interior_size_max"],
        "m",
        "half-thickness of a slab or radius of a cylinder or sphere, 1 mm to 1 m",
    )
    for name, low, high, unit in (
        (
            "thermal_conductivity",
            limits["interior_conductivity_min"],
            limits["interior_conductivity_max"],
            "W/(m*K)",
        ),
        ("density", limits["interior_density_min"], limits["interior_density_max"], "kg/m3"),
    ):
        value = getattr(interior, name)
        if value is None:
            if product.composition is None:
                raise InvalidInputError(
                    f"product.interior.{name}",
                    "give it, or product.composition to take it from the Choi and Okos "
                    "(1986) correlations",
                )
            continue
        require_scalar_within(
            value, f"product.interior.{name}", low, high, unit, "of the product as a whole"
        )
    if interior.pore_venting_time is not None:
        require_scalar_within(
            interior.pore_venting_time,
            "product.interior.pore_venting_time",
            limits["pore_venting_time_min"],
            limits["pore_venting_time_max"],
            "s",
            "time constant of the vapor leaving a porous product's pores, 0.01 s to 1e5 s",
        )
    nodes = interior.nodes
    if (
        not isinstance(nodes, int)
        or isinstance(nodes, bool)
        or not limits["interior_nodes_min"] <= nodes <= limits["interior_nodes_max"]
    ):
        raise InvalidInputError("product.interior.nodes", "must be an integer from 5 to 100", nodes)
    if product.solute is not None:
        raise UnsupportedStateError(
            "product.interior",
            "the interior model follows unfrozen products only and does not take a solute "
            "(progressive freezing inside the product is not modelled); omit "
            "product.interior or product.solute",
        )
    if product.nucleation_temperature is not None:
        raise UnsupportedStateError(
            "product.interior",
            "the interior model does not follow supercooling or freezing inside the "
            "product; omit product.interior or product.nucleation_temperature",
        )


def validate_case(case: VacuumChamberCase) -> None:
    """Check every field of ``case``; raise on the first offending one.

    Raises
    ------
    InvalidInputError
        Non-finite or malformed input, conflicting or missing fields.
    OutOfRangeError
        A field outside :data:`SIMULATION_LIMITS` or its physical range.
    """
    limits = SIMULATION_LIMITS
    _validate_chamber(case.chamber)
    _validate_pump(case.pump, case.chamber.initial_pressure + case.chamber.initial_vapor_pressure)
    if case.condenser is not None:
        _validate_condenser(case.condenser)
    _validate_product(case.product)
    for index, companion in enumerate(case.companions):
        require_scalar_within(
            companion.mass,
            f"companions[{index}].mass",
            0.0,
            None,
            "kg",
            "must be >= 0",
        )
        require_scalar_within(
            companion.specific_heat,
            f"companions[{index}].specific_heat",
            0.0,
            limits["specific_heat_max"],
            "J/(kg*K)",
            "must be >= 0",
        )
    if case.heat_gain is not None:
        _validate_heat_gain(case.heat_gain)
    require_scalar_within(
        case.end_time,
        "end_time",
        0.0,
        limits["end_time_max"],
        "s",
        "the simulated time, up to 30 days",
        exclusive_minimum=True,
    )
    if case.target_temperature is not None:
        require_scalar_within(
            case.target_temperature,
            "target_temperature",
            ICE_TEMPERATURE_MIN,
            case.product.initial_temperature,
            "K",
            "the target lies below the product's initial temperature, above 173.15 K",
        )
        if case.product.interior is not None and case.target_temperature <= (
            TRIPLE_POINT_TEMPERATURE
        ):
            raise UnsupportedStateError(
                "target_temperature",
                "with product.interior the target must lie above the freezing point "
                "(273.16 K): freezing inside the product is not modelled",
                case.target_temperature,
            )
    for index, limit in enumerate(case.schedule):
        require_scalar_within(
            limit.time,
            f"schedule[{index}].time",
            0.0,
            case.end_time,
            "s",
            "within the simulated time",
            exclusive_minimum=True,
        )
        require_scalar_within(
            limit.temperature,
            f"schedule[{index}].temperature",
            ICE_TEMPERATURE_MIN,
            LIQUID_TEMPERATURE_MAX,
            "K",
            "a product temperature limit",
        )
    points = case.series_points
    if not isinstance(points, int) or not (
        limits["series_points_min"] <= points <= limits["series_points_max"]
    ):
        raise InvalidInputError("series_points", "must be an integer from 10 to 5000", points)


def _validate_heat_gain(gain: HeatGainRate) -> None:
    """Raise OutOfRangeError for a heat-gain term out of range (naming ``heat_gain.*``)."""
    finite_scalar(gain.power, "heat_gain.power")
    for name, unit in (
        ("conductance", "W/K"),
        ("radiating_area", "m2"),
        ("contact_coefficient", "W/(m2*K)"),
        ("contact_area", "m2"),
    ):
        require_scalar_within(
            getattr(gain, name), f"heat_gain.{name}", 0.0, None, unit, "must be >= 0"
        )
    require_scalar_within(
        gain.emissivity,
        "heat_gain.emissivity",
        0.0,
        1.0,
        "1",
        "an effective emissivity, above 0 and at most 1",
        exclusive_minimum=True,
    )
    for name in ("surroundings_temperature", "wall_temperature", "shelf_temperature"):
        value = getattr(gain, name)
        if value is not None:
            require_scalar_within(
                value,
                f"heat_gain.{name}",
                150.0,
                500.0,
                "K",
                "temperature of a surface or surroundings the product exchanges heat with",
            )
