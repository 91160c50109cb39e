"""Request/response pair of the vacuum-chamber sizing.

The request wraps a whole chamber-simulation request (`case`), names one of its scalar
fields by dotted path (`find`) and states the target. The answer gives the value of that
field as `{"value", "unit"}` in the unit the case gave it in (SI otherwise).
"""

from __future__ import annotations

from typing import Literal

from pydantic import ConfigDict, Field

from service.api.http.alternatives import refused_shapes
from service.api.http.models import ApiModel, Envelope, QuantityInput, QuantityOutput
from service.api.http.record_labels import RecordLabels
from service.api.simulations.schemas import (
    ChamberStatesOut,
    EquipmentChecksOut,
    MassEnergyBalanceOut,
    ScheduleCheckOut,
    SimulationEventOut,
    SimulationSummaryOut,
    VacuumChamberSimulationCreate,
)
from service.core.sizing import SIZABLE_FIELDS

__all__ = [
    "CoolingTargetInput",
    "DesignPointOut",
    "ForwardSimulationOut",
    "MarginOut",
    "SizingBracketInput",
    "SizingToleranceOut",
    "VacuumChamberSizingCreate",
    "VacuumChamberSizingPublic",
]

_ONE_VALUE = (
    'A single value: a number in the default unit, a string with a unit (`"25 degC"`) or '
    '`{"value", "unit"}`.'
)


class CoolingTargetInput(ApiModel):
    """The product at or below `temperature` within `time` from the start of pumping."""

    temperature: QuantityInput = Field(
        description=f"Default unit K; below the product's initial temperature. {_ONE_VALUE}"
    )
    time: QuantityInput = Field(
        description=f'Default unit s (`"5 min"`); > 0, up to 15 days. {_ONE_VALUE}'
    )


class SizingBracketInput(ApiModel):
    """The range searched, in the field's unit (default: its SI unit)."""

    lower: QuantityInput = Field(description=_ONE_VALUE)
    upper: QuantityInput = Field(description=f"Above `lower`. {_ONE_VALUE}")


class VacuumChamberSizingCreate(RecordLabels):
    """Solve one field of a chamber simulation for a cooling target."""

    model_config = ConfigDict(
        json_schema_extra=refused_shapes(
            # `"schedule"` needs a case with a schedule (an absent one is empty)
            [
                {
                    "required": ["target"],
                    "properties": {
                        "target": {"const": "schedule"},
                        "case": {"properties": {"schedule": {"maxItems": 0}}},
                    },
                }
            ]
        )
    )

    case: VacuumChamberSimulationCreate = Field(
        description="A request of `/v1/simulations/vacuum-chamber`; `find` is varied in it."
    )
    find: str = Field(
        max_length=100,
        description="Dotted path of the field to solve for: `pump.nominal_speed`, "
        "`pump.speed_scale` (a factor on the whole pump speed, curve included), "
        "`pump.ultimate_pressure`, `condenser.vapor_conductance`, "
        "`condenser.refrigeration_capacity`, `condenser.surface_temperature`, "
        "`chamber.free_volume`, `chamber.leak_rate`, `product.mass` or `heat_gain.power` "
        "(fields in which the time to the target is monotone; others are refused).",
        title="SizableFieldPath",
        json_schema_extra={"enum": list(SIZABLE_FIELDS)},
    )
    target: CoolingTargetInput | Literal["schedule"] = Field(
        description='Temperature and time, or `"schedule"`: every limit of the case\'s '
        "`schedule` met."
    )
    bracket: SizingBracketInput | None = Field(
        None,
        description="Values searched. Default: 1/100 to 100 times the case's value; the "
        "whole condenser range (-100 degC to 0.01 degC) for the condenser temperature.",
    )
    relative_tolerance: float = Field(
        1.0e-3,
        ge=1.0e-6,
        le=0.05,
        description="The answer is within this fraction of itself of a value that misses "
        "the target.",
    )


class DesignPointOut(ApiModel):
    """One simulated value of the unknown."""

    value: QuantityOutput = Field(description="In the unit of `solution`.")
    time_to_target: QuantityOutput | None = Field(
        description="Null when the product does not reach the target temperature in the "
        "simulated time (twice the target time, or the case's end time if longer)."
    )
    meets_target: bool = Field(
        description="Whether the product reaches the target temperature by the target time at "
        "this value."
    )


class MarginOut(ApiModel):
    """What 90 % of the answer gives."""

    factor: float = Field(description="0.9.")
    value: QuantityOutput = Field(description="90 % of the answer, in the unit of `solution`.")
    time_to_target: QuantityOutput | None = Field(
        description="Time to the target temperature at that value (SI: s); null when not reached."
    )
    meets_target: bool = Field(description="Whether the target is still met at that value.")


class SizingToleranceOut(ApiModel):
    """How closely the boundary is bracketed."""

    requested: float = Field(description="Relative tolerance asked for (unit 1).")
    reached: float = Field(
        description="|solution - nearest_failing| / |solution| (unit 1); 0 when the "
        "bracket's own end meets the target."
    )
    nearest_failing: QuantityOutput = Field(
        description="The simulated value next to the answer that misses the target."
    )


class ForwardSimulationOut(ApiModel):
    """The chamber simulation at the answer (as `/v1/simulations/vacuum-chamber` answers it)."""

    summary: SimulationSummaryOut = Field(description="Headline numbers of the run.")
    events: list[SimulationEventOut] = Field(
        description="What happened during the run, in time order."
    )
    series: ChamberStatesOut = Field(description="The chamber and product over time.")
    schedule: list[ScheduleCheckOut] = Field(
        description="Each schedule limit and whether it was met; empty without a schedule."
    )
    balance: MassEnergyBalanceOut = Field(
        description="Water mass and product energy books, with their residuals."
    )
    checks: EquipmentChecksOut = Field(description="Equipment checks of the run.")
    model_references: list[str] = Field(description="Published basis of the model.")


class VacuumChamberSizingPublic(Envelope):
    """The value that meets the target, how it was found, and the simulation at it."""

    find: str = Field(description="Dotted path of the field solved for, as asked.")
    meaning: str = Field(description="What the field is.")
    direction: Literal["smallest", "largest"] = Field(
        description="`smallest` for a field where more helps (pump speed), `largest` where "
        "more hurts (ultimate pressure, free volume)."
    )
    solution: QuantityOutput = Field(
        description="The answer, in the unit the case gave the field in (SI otherwise)."
    )
    time_to_target: QuantityOutput | None = Field(description="At the answer.")
    tolerance: SizingToleranceOut = Field(
        description="The tolerance asked for and the one reached."
    )
    bracket: list[QuantityOutput] = Field(description="Lower and upper value searched.")
    at_bracket_end: bool = Field(
        description="The bracket's unfavourable end already meets the target: the boundary "
        "may lie beyond it."
    )
    margin: MarginOut = Field(description="The target checked at 90 % of the answer.")
    design_curve: list[DesignPointOut] = Field(
        description="Time to target against the unknown at every simulated value."
    )
    simulations: int = Field(description="Forward simulations run.")
    simulation: ForwardSimulationOut = Field(description="The chamber simulation at the answer.")
