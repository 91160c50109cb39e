"""Request/response pairs of the primary-drying run and design space.

Every numeric input is a number in its default unit, a string with a unit (`"-25 degC"`,
`"100 mTorr"`, `"1.4 cm2*Torr*h/g"`) or `{"value", "unit"}`; the design space's axes also
take `{"values", "unit"}`, a list, or `{"minimum", "maximum", "count"}`. Results come as
`{"value"|"values", "unit"}` in the unit set of `output_units`.
"""

from __future__ import annotations

from typing import Literal

from pydantic import ConfigDict, Field

from service.api.http.alternatives import exactly_one_of, refused_shapes, requires
from service.api.http.models import ApiModel, Envelope, QuantityInput, QuantityOutput
from service.api.http.record_labels import RecordLabels
from service.api.http.units import UnitSet

__all__ = [
    "DesignSpaceCellsOut",
    "DesignSpaceFastestOut",
    "DriedLayerResistanceInput",
    "DryingEventOut",
    "DryingLoadInput",
    "DryingStatesOut",
    "DryingSummaryOut",
    "EquipmentLimitPointInput",
    "GridAxisInput",
    "GridOut",
    "IceBalanceOut",
    "PrimaryDryingDesignSpaceCreate",
    "PrimaryDryingDesignSpacePublic",
    "PrimaryDryingSimulationCreate",
    "PrimaryDryingSimulationPublic",
    "RecipePointInput",
    "VialHeatTransferInput",
]

_ONE = (
    'A single value: a number in the default unit, a string with a unit (`"-25 degC"`) or '
    '`{"value", "unit"}`.'
)
_OUTPUT_UNITS = (
    "Unit set of the results: `SI` (K, Pa, kg, W, s, kg/s, m), `engineering` (degC, kPa, kg, "
    "kW, s, kg/h, mm) or `US` (degF, psi, lb, Btu/h, s, lb/h, in); transfer coefficients "
    "always in SI."
)


def _one(text: str) -> str:
    return f"{text} {_ONE}"


# -- inputs ----------------------------------------------------------------------------------


class DryingLoadInput(ApiModel):
    """The containers on the shelves and their frozen fill."""

    model_config = ConfigDict(
        json_schema_extra=refused_shapes(
            exactly_one_of("fill_volume", "fill_mass"),
            requires("", "inner_area", when={"container": {"const": "vial"}}),
        )
    )

    container: Literal["vial", "tray"] = Field(
        "vial", description="`vial` or `tray` (a tray: give its bottom area as `outer_area`)."
    )
    count: int = Field(ge=1, le=1_000_000, description="Containers in the batch.")
    outer_area: QuantityInput = Field(
        description=_one(
            "Outer bottom area of one container, the area the vial heat-transfer coefficient "
            'refers to (A_v). Default unit m2 (`"3.8 cm2"`); > 0.'
        )
    )
    inner_area: QuantityInput | None = Field(
        None,
        description=_one(
            "Cross-section of the product in one container (A_p). Default unit m2; > 0. "
            "Required for vials; for a tray it defaults to `outer_area`."
        ),
    )
    fill_volume: QuantityInput | None = Field(
        None,
        description=_one('Solution filled per container. Default unit m3 (`"3 mL"`); > 0.'),
    )
    fill_mass: QuantityInput | None = Field(
        None,
        description=_one(
            "Solution filled per container, instead of `fill_volume`. Default unit kg; > 0."
        ),
    )
    solution_density: QuantityInput = Field(
        1000.0,
        description=_one(
            "Density of the filled solution, which turns volume into mass (fill depth = fill "
            "volume / inner area). Default unit kg/m3; > 0. Default 1000 kg/m3 (common "
            "practice, no source: dilute aqueous solution)."
        ),
    )
    solids_fraction: QuantityInput = Field(
        description=_one(
            "Mass fraction of solids in the solution; the rest is water, all taken as ice. "
            "Unit 1; 0 to 0.999."
        )
    )
    frozen_layer_conductivity: QuantityInput = Field(
        2.4,
        description=_one(
            "Thermal conductivity of the frozen layer. Default unit W/(m*K); > 0. Default 2.4 "
            "W/(m*K): ice Ih near 250 K (from memory, G. A. Slack, Phys. Rev. B 22, 3065 (1980))."
        ),
    )


class VialHeatTransferInput(ApiModel):
    """K_v(P_c) = contact + gas_conduction P_c / (1 + gas_conduction_saturation P_c)
    (M. J. Pikal, M. L. Roy, S. Shah, J. Pharm. Sci. 73(9), 1224-1237 (1984)), per unit of
    outer bottom area, as measured for the container in the dryer (e.g. by gravimetric
    sublimation tests with pure ice)."""

    contact: QuantityInput = Field(
        description=_one(
            "K_C: contact conduction and radiation. Default unit W/(m2*K) "
            '(`"2.75e-4 cal/(s*cm2*K)"`); >= 0.'
        )
    )
    gas_conduction: QuantityInput = Field(
        description=_one(
            "K_P: gas conduction per unit pressure at low pressure. Default unit W/(m2*K*Pa) "
            '(`"8.9e-4 cal/(s*cm2*K*Torr)"`); >= 0.'
        )
    )
    gas_conduction_saturation: QuantityInput = Field(
        description=_one(
            'K_D: levelling-off of gas conduction. Default unit 1/Pa (`"0.46 1/Torr"`); >= 0.'
        )
    )


class DriedLayerResistanceInput(ApiModel):
    """R_p(l) = at_zero_thickness + thickness_coefficient l / (1 + thickness_saturation l),
    with l the dried-layer thickness (M. J. Pikal, J. Parenter. Sci. Technol. 39(3), 115-139
    (1985)), per unit of product area, as measured for the formulation."""

    at_zero_thickness: QuantityInput = Field(
        description=_one('R_0. Default unit m2*Pa*s/kg (`"1.4 cm2*Torr*h/g"`); > 0.')
    )
    thickness_coefficient: QuantityInput = Field(
        description=_one('A_1. Default unit m*Pa*s/kg (`"16 cm*Torr*h/g"`); >= 0.')
    )
    thickness_saturation: QuantityInput = Field(
        0.0, description=_one('A_2. Default unit 1/m (`"0.5 1/cm"`); >= 0.')
    )


class RecipePointInput(ApiModel):
    """One set point; linear between set points, two at one time make a step."""

    time: QuantityInput = Field(
        description=_one('From the start of primary drying. Default unit s (`"2 h"`); >= 0.')
    )
    shelf_temperature: QuantityInput = Field(
        description=_one("Shelf (heat-transfer fluid) temperature. Default unit K; 190 to 400 K.")
    )
    chamber_pressure: QuantityInput = Field(
        description=_one(
            'Chamber pressure (absolute). Default unit Pa (`"100 mTorr"`); 0.05 Pa to '
            "611.657 Pa, and below the ice's vapor pressure at the shelf temperature."
        )
    )


class EquipmentLimitPointInput(ApiModel):
    """One point of the dryer's capability curve (choked duct or condenser)."""

    chamber_pressure: QuantityInput = Field(description=_one("Default unit Pa; > 0."))
    maximum_sublimation_rate: QuantityInput = Field(
        description=_one('Largest batch sublimation rate there. Default unit kg/s (`"kg/h"`).')
    )


class _DryingInputs(RecordLabels):
    load: DryingLoadInput = Field(description="The containers and their frozen fill.")
    vial_heat_transfer: VialHeatTransferInput = Field(
        description="The three constants of K_v(P_c), measured for the container and dryer."
    )
    dried_layer_resistance: DriedLayerResistanceInput = Field(
        description="The three constants of R_p(l), measured for the formulation."
    )
    critical_temperature: QuantityInput = Field(
        description=_one(
            "Collapse (or eutectic) temperature of the product, the highest the ice front may "
            "reach. Default unit K; 150 K to 273.16 K."
        )
    )
    equipment_limit: list[EquipmentLimitPointInput] | None = Field(
        None,
        min_length=2,
        max_length=100,
        description="The dryer's largest batch sublimation rate against chamber pressure "
        "(pressures increasing), linear between points, not extrapolated: it must cover every "
        "chamber pressure used.",
    )
    output_units: UnitSet = Field(UnitSet.SI, description=_OUTPUT_UNITS)


class PrimaryDryingSimulationCreate(_DryingInputs):
    """A primary-drying run over a recipe of shelf temperature and chamber pressure."""

    recipe: list[RecipePointInput] = Field(
        min_length=1, max_length=200, description="Set points, the first at time 0."
    )
    condenser_capacity: QuantityInput | None = Field(
        None, description=_one("Ice the condenser can hold. Default unit kg; > 0.")
    )
    maximum_duration: QuantityInput = Field(
        2_592_000.0,
        description=_one("The run stops here if ice is left. Default unit s; default 720 h."),
    )
    series_points: int = Field(
        201, ge=2, le=5000, description="Points of the time series (plus events and set points)."
    )


class GridAxisInput(ApiModel):
    """Evenly spaced values from `minimum` to `maximum`."""

    minimum: QuantityInput = Field(description=_one("First value."))
    maximum: QuantityInput = Field(description=_one("Last value, above `minimum`."))
    count: int = Field(ge=2, le=100, description="Number of values.")


class PrimaryDryingDesignSpaceCreate(_DryingInputs):
    """A grid of shelf temperature x chamber pressure for one load."""

    shelf_temperatures: QuantityInput | GridAxisInput = Field(
        description='Shelf temperatures, increasing: `{"values": [...], "unit": "degC"}`, '
        'a list (K) or `{"minimum", "maximum", "count"}`; 1 to 100 values, 190 to 400 K.'
    )
    chamber_pressures: QuantityInput | GridAxisInput = Field(
        description="Chamber pressures, increasing, as `shelf_temperatures` (default unit Pa); "
        "1 to 100 values, 0.05 Pa to 611.657 Pa."
    )
    dried_layer_thickness: QuantityInput | None = Field(
        None,
        description=_one(
            "Evaluate at this dried-layer thickness; omitted: over the whole run at constant "
            "settings (drying time; the highest front temperature, reached at the end). "
            'Default unit m (`"2 mm"`); 0 to below the fill depth.'
        ),
    )


# -- outputs ---------------------------------------------------------------------------------


class DryingStatesOut(ApiModel):
    """The batch over time (`values`) or at an event (`value`); per container unless batch."""

    time: QuantityOutput = Field(description="Time from the start of primary drying (SI: s).")
    shelf_temperature: QuantityOutput = Field(
        description="Shelf temperature, from the recipe (SI: K)."
    )
    chamber_pressure: QuantityOutput = Field(
        description="Chamber pressure, from the recipe (SI: Pa)."
    )
    front_temperature: QuantityOutput = Field(description="Ice at the sublimation front.")
    bottom_temperature: QuantityOutput = Field(description="Product at the container bottom.")
    dried_layer_thickness: QuantityOutput = Field(
        description="Thickness of the dried layer above the front (SI: m)."
    )
    frozen_layer_thickness: QuantityOutput = Field(
        description="Thickness of the frozen layer below the front (SI: m)."
    )
    ice_mass: QuantityOutput = Field(description="Ice left per container.")
    sublimation_rate: QuantityOutput = Field(description="Per container.")
    batch_sublimation_rate: QuantityOutput = Field(
        description="The batch: the vapor load on the condenser."
    )
    heat_flow: QuantityOutput = Field(description="From the shelf into one container.")
    batch_heat_flow: QuantityOutput = Field(
        description="Heat flow from the shelves into the whole batch (SI: W)."
    )
    heat_transfer_coefficient: QuantityOutput = Field(description="K_v at the chamber pressure.")
    dried_layer_resistance: QuantityOutput = Field(description="R_p at the dried thickness.")
    latent_heat: QuantityOutput = Field(description="Enthalpy of sublimation at the front.")
    ice_vapor_pressure: QuantityOutput = Field(description="At the front temperature (R14-08).")
    condenser_ice: QuantityOutput = Field(description="Ice collected on the condenser.")


class DryingEventOut(ApiModel):
    """Something that happened, when, and the batch then."""

    name: str = Field(
        description="`primary-drying-ends`, `maximum-duration-reached`, "
        "`critical-temperature-exceeded`, `back-below-critical-temperature`, "
        "`equipment-limit-exceeded`, `back-within-equipment-limit`, "
        "`condenser-capacity-reached` or `front-reaches-triple-point`."
    )
    time: QuantityOutput = Field(
        description="When it happened, from the start of primary drying (SI: s)."
    )
    detail: str = Field(description="What happened, in words.")
    state: DryingStatesOut = Field(description="The batch at that moment.")


class DryingSummaryOut(ApiModel):
    """Headline numbers."""

    end_reason: str = Field(description="`dry` or `maximum-duration`.")
    drying_time: QuantityOutput | None = Field(description="Null when ice is left.")
    end_time: QuantityOutput = Field(description="When the run ended (SI: s).")
    maximum_front_temperature: QuantityOutput = Field(
        description="Highest ice temperature at the front over the run (SI: K)."
    )
    maximum_bottom_temperature: QuantityOutput = Field(
        description="Highest product temperature at the container bottom over the run (SI: K)."
    )
    critical_temperature_first_exceeded: QuantityOutput | None = Field(
        description="When the front first rose above the critical temperature (SI: s); null if "
        "never."
    )
    time_above_critical_temperature: QuantityOutput = Field(
        description="On a 4001-point grid of the run."
    )
    peak_batch_sublimation_rate: QuantityOutput = Field(
        description="Highest sublimation rate of the batch over the run (SI: kg/s)."
    )
    equipment_limit_first_exceeded: QuantityOutput | None = Field(
        description="When the batch rate first exceeded the dryer's limit (SI: s); null if never "
        "or without a limit."
    )
    condenser_capacity_reached: QuantityOutput | None = Field(
        description="When the condenser's ice capacity was reached (SI: s); null if never or "
        "without a capacity."
    )
    solver_steps: int = Field(description="Steps the time integration took.")


class IceBalanceOut(ApiModel):
    """Initial ice = remaining + sublimed, the sublimed ice integrated from the rate."""

    initial_ice: QuantityOutput = Field(description="Ice in the batch at the start (SI: kg).")
    remaining_ice: QuantityOutput = Field(description="Ice left at the end (SI: kg).")
    sublimed_ice: QuantityOutput = Field(
        description="Ice sublimed, integrated from the sublimation rate (SI: kg)."
    )
    residual: QuantityOutput = Field(
        description="initial_ice - remaining_ice - sublimed_ice: the integration error (SI: kg)."
    )
    relative_residual: QuantityOutput = Field(description="residual / initial_ice (unit 1).")


class PrimaryDryingSimulationPublic(Envelope):
    """Summary, events, time series and ice balance of one run."""

    summary: DryingSummaryOut = Field(description="Headline numbers of the run.")
    events: list[DryingEventOut] = Field(description="What happened during the run, in time order.")
    series: DryingStatesOut = Field(description="The batch over time.")
    equipment_rate_limit: QuantityOutput | None = Field(
        description="The dryer's limit along the series; null without one."
    )
    ice_balance: IceBalanceOut = Field(description="Ice books of the run, with their residual.")
    model_references: list[str] = Field(description="Published basis of the model.")


class GridOut(ApiModel):
    """Rows by shelf temperature, columns by chamber pressure; null where not sublimating."""

    values: list[list[float | None]] = Field(
        description="Rows by shelf temperature, columns by chamber pressure; null where not "
        "sublimating."
    )
    unit: str = Field(description="Unit of the values.")


class DesignSpaceFastestOut(ApiModel):
    """The safe setting with the shortest drying time (at a stated thickness: the highest
    sublimation rate)."""

    shelf_temperature: QuantityOutput = Field(
        description="Shelf temperature of the setting (SI: K)."
    )
    chamber_pressure: QuantityOutput = Field(
        description="Chamber pressure of the setting (SI: Pa)."
    )
    front_temperature: QuantityOutput = Field(
        description="Ice temperature at the sublimation front (SI: K)."
    )
    batch_sublimation_rate: QuantityOutput = Field(
        description="Sublimation rate of the whole batch (SI: kg/s)."
    )
    drying_time: QuantityOutput | None = Field(
        description="Primary drying time (SI: s); null when the grid is at a stated thickness."
    )
    shelf_index: int = Field(description="Row of the setting in the grid (from 0).")
    pressure_index: int = Field(description="Column of the setting in the grid (from 0).")


class DesignSpaceCellsOut(ApiModel):
    """The grid as one row per setting (what the CSV answer holds)."""

    shelf_temperature: QuantityOutput = Field(description="Shelf temperature of each cell (SI: K).")
    chamber_pressure: QuantityOutput = Field(description="Chamber pressure of each cell (SI: Pa).")
    front_temperature: QuantityOutput = Field(
        description="Ice temperature at the sublimation front of each cell (SI: K)."
    )
    bottom_temperature: QuantityOutput = Field(
        description="Product temperature at the container bottom of each cell (SI: K)."
    )
    batch_sublimation_rate: QuantityOutput = Field(
        description="Sublimation rate of the whole batch in each cell (SI: kg/s)."
    )
    drying_time: QuantityOutput | None = Field(
        description="Primary drying time of each cell (SI: s); null when the grid is at a stated "
        "thickness."
    )
    status: list[str] = Field(
        description="`sublimating`, `no-sublimation` or `front-melts`, per cell."
    )
    safe: list[bool] = Field(description="Whether each cell is in the safe region.")


class PrimaryDryingDesignSpacePublic(Envelope):
    """The grid, the safe region and the fastest setting in it."""

    shelf_temperatures: QuantityOutput = Field(
        description="Shelf temperatures of the grid rows (SI: K)."
    )
    chamber_pressures: QuantityOutput = Field(
        description="Chamber pressures of the grid columns (SI: Pa)."
    )
    dried_layer_thickness: QuantityOutput | None = Field(description="Null: over the whole run.")
    critical_temperature: QuantityOutput = Field(
        description="The product's critical (collapse) temperature, as given (SI: K)."
    )
    front_temperature: GridOut = Field(
        description="At the stated thickness, or the highest over the run."
    )
    bottom_temperature: GridOut = Field(
        description="Product temperature at the container bottom (SI: K)."
    )
    sublimation_rate: GridOut = Field(description="Per container (over the run: the highest).")
    batch_sublimation_rate: GridOut = Field(
        description="Sublimation rate of the whole batch (SI: kg/s; over the run: the highest)."
    )
    drying_time: GridOut | None = Field(description="Over the whole run only.")
    equipment_rate_limit: QuantityOutput | None = Field(
        description="The dryer's limit at each chamber pressure; null without one."
    )
    status: list[list[str]] = Field(
        description="`sublimating`, `no-sublimation` (chamber pressure at or above the ice's "
        "vapor pressure at the shelf temperature) or `front-melts`."
    )
    safe: list[list[bool]] = Field(
        description="Sublimating, ice front below the critical temperature, batch rate "
        "within the equipment limit."
    )
    fastest: DesignSpaceFastestOut | None = Field(description="Null when no setting is safe.")
    cells: DesignSpaceCellsOut = Field(description="The same grid, one row per setting.")
    model_references: list[str] = Field(description="Published basis of the model.")
