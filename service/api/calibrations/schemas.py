"""Request/response pair of the vacuum-chamber calibration.

The request holds the case (a simulation request, as sent to
`POST /v1/simulations/vacuum-chamber`), the measured run (JSON arrays under `measured`,
or the log as CSV text under `measured_csv`) and the case fields to estimate with their
bounds.
"""

from __future__ import annotations

from typing import Annotated, Any, Literal

from pydantic import ConfigDict, Field, Strict

from service.api.http.alternatives import exactly_one_of, refused_shapes
from service.api.http.models import (
    ApiModel,
    Envelope,
    FiniteFloat,
    QuantityInput,
    QuantityOutput,
)
from service.api.http.record_labels import RecordLabels
from service.api.simulations.schemas import VacuumChamberSimulationCreate
from service.core.calibration import NOT_ESTIMABLE
from service.core.calibration.measured_run import MEASURABLE_SERIES
from service.core.simulation.case_fields import CASE_FIELDS

__all__ = [
    "CorrelationOut",
    "EstimateInput",
    "EstimateOut",
    "FitOut",
    "MeasuredSeriesInput",
    "SeriesFitOut",
    "VacuumChamberCalibrationCreate",
    "VacuumChamberCalibrationPublic",
]

_PositiveFloat = Annotated[float, Strict(), Field(allow_inf_nan=False, gt=0)]
_MAX_READINGS = 20000


class MeasuredSeriesInput(ApiModel):
    """One logged channel: its readings in one unit, with their uncertainty if known."""

    values: list[FiniteFloat] = Field(
        min_length=1, max_length=_MAX_READINGS, description="Readings, in `unit`, one per time."
    )
    unit: str | None = Field(
        None,
        description="Unit of the readings (`mbar`, `degC`, `kg`, `min` for time); omitted "
        "means the series' SI unit.",
    )
    uncertainty: _PositiveFloat | None = Field(
        None,
        description="Standard uncertainty (k=1) of each reading, in `unit` (a temperature "
        "difference for temperatures). Not for `time`.",
    )
    relative_uncertainty: _PositiveFloat | None = Field(
        None,
        description="Standard uncertainty as a fraction of the reading (0.02 for 2 % of "
        "reading, as vacuum gauges state it). Combined in quadrature with `uncertainty`. "
        "Omit both to weight by the residual scatter.",
    )


class EstimateInput(ApiModel):
    """A case field to estimate, by its dotted path, with search bounds."""

    parameter: str = Field(
        description="Dotted path in the case: `chamber.leak_rate`, `pump.speed_scale` (a "
        "factor on the pump's whole speed, curve included), `pump.nominal_speed`, "
        "`heat_gain.power`, `heat_gain.conductance`, `product.mass`, "
        "`product.solids_specific_heat`, `product.exposed_area`, "
        "`product.evaporation_coefficient`, `condenser.vapor_conductance`...",
        max_length=100,
        title="CaseFieldPath",
        json_schema_extra={"enum": [path for path in CASE_FIELDS if path not in NOT_ESTIMABLE]},
    )
    lower: QuantityInput = Field(
        description="Lowest value searched, in the field's default unit or with a unit "
        '(`"0.01 mbar*L/s"`).'
    )
    upper: QuantityInput = Field(
        description="Highest value searched, above `lower`; the field's default unit or a "
        "unit given."
    )
    initial: QuantityInput | None = Field(
        None,
        description="Start of the search, in the field's default unit or with a unit; "
        "omitted: the case's own value when within the bounds, else their middle.",
    )


class VacuumChamberCalibrationCreate(RecordLabels):
    """A chamber case, a measured run of it and the fields to estimate."""

    model_config = ConfigDict(
        json_schema_extra=refused_shapes(
            exactly_one_of("measured", "measured_csv"),
            # stated CSV uncertainties (a non-empty object) need the CSV run
            [
                {
                    "required": ["csv_uncertainty"],
                    "properties": {
                        "csv_uncertainty": {"type": "object", "minProperties": 1},
                        "measured_csv": {"type": "null"},
                    },
                }
            ],
        )
    )

    case: VacuumChamberSimulationCreate = Field(
        description="The chamber case as for the simulation route; its `output_units` set "
        "the answer's units. Its end time, target and schedule are not used by the fit "
        "(the model runs to the last reading)."
    )
    measured: dict[str, MeasuredSeriesInput] | None = Field(
        None,
        max_length=12,
        json_schema_extra={
            "propertyNames": {
                "pattern": "^(?:" + "|".join(["time", *MEASURABLE_SERIES]) + r")(?:\.[\s\S]*)?$"
            }
        },
        description="The measured run as arrays of equal length: `time` (from the logger's "
        "clock) and series named as the simulation names them: `total_pressure`, "
        "`product_temperature`, optionally `evaporated_mass`, `condenser_ice`, "
        "`air_pressure`, `vapor_pressure`, `condenser_load`, `pump_volume_flow`. A second "
        "probe of the same quantity takes a label after a dot "
        "(`product_temperature.core`). Give `measured` or `measured_csv`.",
    )
    measured_csv: str | None = Field(
        None,
        max_length=4_000_000,
        description="The measured run as CSV text instead of `measured`: a header row "
        "`time [s],total_pressure [mbar],product_temperature [degC]` (series names as in "
        "`measured`, each unit in brackets), then one row per time, comma-separated. An "
        "empty cell is a reading that is missing at that time.",
    )
    csv_uncertainty: dict[str, dict[str, _PositiveFloat]] = Field(
        default_factory=dict,
        max_length=12,
        description="With `measured_csv`: stated reading uncertainties per series name, as "
        '`{"total_pressure": {"relative": 0.02}, "product_temperature": {"absolute": 0.1}}` '
        "(absolute in the CSV column's unit).",
    )
    pump_start: QuantityInput = Field(
        0.0,
        description="Logger time at which the pump starts (the model's time zero). Default "
        'unit s (`"2 min"`); readings before it are left out.',
    )
    estimate: list[EstimateInput] = Field(
        min_length=1, max_length=8, description="The case fields to estimate (1 to 8)."
    )
    loss: Literal["linear", "soft_l1", "huber", "cauchy"] = Field(
        "linear",
        description="`linear`: weighted least squares. `soft_l1`, `huber`, `cauchy`: "
        "robust losses that weigh large residuals (outliers) less.",
    )
    confidence: float = Field(
        0.95, ge=0.5, le=0.999, description="Level of the confidence intervals."
    )


class IntervalOut(ApiModel):
    """A confidence interval."""

    lower: QuantityOutput = Field(description="Lower end.")
    upper: QuantityOutput = Field(description="Upper end.")


class EstimateOut(ApiModel):
    """One estimated field."""

    parameter: str = Field(
        description="Path of the estimated case field, e.g. `pump.nominal_speed`."
    )
    meaning: str = Field(description="What the field is, in words.")
    value: QuantityOutput = Field(
        description="The estimate, in the unit the case gave the field in (SI otherwise)."
    )
    standard_uncertainty: QuantityOutput | None = Field(
        description="k=1, linearized; null when the data do not determine the field."
    )
    interval: IntervalOut | None = Field(
        description="Confidence interval at `fit.confidence`; null when not determined."
    )
    bounds: IntervalOut = Field(description="The search bounds.")
    initial: QuantityOutput = Field(description="Where the search started.")
    scale: Literal["log", "linear"] = Field(
        description="`log`: searched and its interval formed in ln value (positive lower "
        "bound); `linear`: between the bounds."
    )
    at_bound: bool = Field(
        description="True when the estimate sits at a bound: its interval is then not reliable."
    )


class CorrelationOut(ApiModel):
    """Correlation matrix of the estimates, rows and columns in `parameters` order."""

    parameters: list[str] = Field(
        description="Paths of the estimated fields, the order of the matrix rows and columns."
    )
    matrix: list[list[float]] = Field(
        description="Correlation coefficients (unit 1, -1 to 1); rows of undetermined fields are "
        "0 off the diagonal."
    )


class SeriesFitOut(ApiModel):
    """One measured series against the fitted model."""

    name: str = Field(description="The measured series, as named in the log.")
    points: int = Field(description="Readings in the series after cleaning.")
    rms: QuantityOutput = Field(description="Root mean square of fitted - measured.")
    relative_rms: float | None = Field(
        description="RMS of ln(fitted/measured) for pressures (about the relative misfit)."
    )
    standard_uncertainty: QuantityOutput = Field(
        description="Reading uncertainty the fit weighted with (a fraction, unit 1, for pressures)."
    )
    uncertainty_basis: Literal["stated", "estimated"] = Field(
        description="`stated` by the client, or `estimated` from the residual scatter."
    )
    outlier_rows: list[int] = Field(
        description="Rows of the log (from 0, as sent) more than 4 standard uncertainties "
        "from the fit."
    )
    time: QuantityOutput = Field(description="Times from the pump start.")
    measured: QuantityOutput = Field(description="The readings, at `time`.")
    fitted: QuantityOutput = Field(description="The fitted model's values at `time`.")


class FitOut(ApiModel):
    """How the fit went."""

    points: int = Field(description="Readings the fit used.")
    degrees_of_freedom: int = Field(description="Readings minus estimated fields.")
    confidence: float = Field(description="Level of the confidence intervals (unit 1).")
    quantile: float = Field(description="Multiplier of the standard uncertainties.")
    quantile_basis: Literal["normal", "student-t"] = Field(
        description="`normal` when every series' reading uncertainty was stated, `student-t` "
        "(with `degrees_of_freedom`) when one was estimated from the scatter."
    )
    reduced_chi_square: float = Field(
        description="Sum of squared weighted residuals over the degrees of freedom (about 1 for a"
        " model that fits within the stated reading uncertainties)."
    )
    loss: str = Field(description="The loss the fit minimized, as asked.")
    converged: bool = Field(description="Whether the least-squares search met its tolerance.")
    simulations: int = Field(description="Model runs the fit took.")
    log_notes: list[str] = Field(description="What cleaning the log did.")


class VacuumChamberCalibrationPublic(Envelope):
    """Estimates with intervals, their correlation, residuals and the fitted case."""

    estimates: list[EstimateOut] = Field(description="One per field asked for, in the order asked.")
    correlation: CorrelationOut = Field(description="Correlation of the estimates.")
    series: list[SeriesFitOut] = Field(description="Each measured series against the fitted model.")
    fit: FitOut = Field(description="How the fit went: points, degrees of freedom, convergence.")
    fitted_case: dict[str, Any] = Field(
        description="The case with the estimates written in at their paths (SI units), "
        "ready to send to `POST /v1/simulations/vacuum-chamber`."
    )
    model_references: list[str] = Field(
        description="Published sources of the chamber model's equations."
    )
