"""Responses of the calculation-record routes.

A stored record is typed by its ``kind``: :data:`CalculationPublic` is a union
discriminated on ``kind`` whose members carry the request model of the route that made
the record as ``inputs`` and its answer model as ``result``.
"""

from __future__ import annotations

from datetime import datetime
from enum import StrEnum
from typing import Annotated, Literal

from pydantic import Field

from service.api.balances.schemas import (
    EvaporativeCoolingCreate,
    EvaporativeCoolingPublic,
    FlashFreezeCreate,
    FlashFreezePublic,
)
from service.api.calibrations.schemas import (
    VacuumChamberCalibrationCreate,
    VacuumChamberCalibrationPublic,
)
from service.api.drying.schemas import (
    PrimaryDryingDesignSpaceCreate,
    PrimaryDryingDesignSpacePublic,
    PrimaryDryingSimulationCreate,
    PrimaryDryingSimulationPublic,
)
from service.api.http.models import ApiModel
from service.api.http.record_labels import Label, Tag
from service.api.simulations.schemas import (
    VacuumChamberSimulationCreate,
    VacuumChamberSimulationPublic,
    VacuumChamberSweepPublic,
)
from service.api.sizing.schemas import VacuumChamberSizingCreate, VacuumChamberSizingPublic

__all__ = [
    "KIND_DESCRIPTION",
    "STORED_MODELS",
    "CalculationListPublic",
    "CalculationPublic",
    "CalculationSummaryPublic",
    "FormulationVersion",
    "HeadlineQuantity",
    "RecordKind",
]


class RecordKind(StrEnum):
    """What a stored calculation is: the route that made it, stable and dotted."""

    FLASH_FREEZE = "balances.flash_freeze"
    EVAPORATIVE_COOLING = "balances.evaporative_cooling"
    VACUUM_CHAMBER = "simulations.vacuum_chamber"
    VACUUM_CHAMBER_SWEEP = "simulations.vacuum_chamber_sweep"
    PRIMARY_DRYING = "simulations.primary_drying"
    PRIMARY_DRYING_DESIGN_SPACE = "design_spaces.primary_drying"
    VACUUM_CHAMBER_CALIBRATION = "calibrations.vacuum_chamber"
    VACUUM_CHAMBER_SIZING = "sizing.vacuum_chamber"


_KIND_ROUTES = (
    "`balances.flash_freeze` (POST /v1/balances/flash-freeze), `balances.evaporative_cooling` "
    "(POST /v1/balances/evaporative-cooling), `simulations.vacuum_chamber` and "
    "`simulations.vacuum_chamber_sweep` (POST /v1/simulations/vacuum-chamber, one case or a "
    "sweep), `simulations.primary_drying` (POST /v1/simulations/primary-drying), "
    "`design_spaces.primary_drying` (POST /v1/design-spaces/primary-drying), "
    "`calibrations.vacuum_chamber` (POST /v1/calibrations/vacuum-chamber), "
    "`sizing.vacuum_chamber` (POST /v1/sizing/vacuum-chamber)"
)
KIND_DESCRIPTION = f"What was calculated, named by the route that stored it: {_KIND_ROUTES}."


class FormulationVersion(ApiModel):
    """A property formulation a calculation used."""

    formulation: str | None = Field(description="Name, e.g. `IAPWS-95`.")
    release: str | None = Field(description="The release it follows, with its year.")


class HeadlineQuantity(ApiModel):
    """A key number of a stored answer, in the answer's units."""

    value: float | None = Field(None, description="The number, for a single case.")
    values: list[float | None] | None = Field(
        None, description="The numbers of a batch or sweep (at most 20; longer ones are left out)."
    )
    unit: str = Field(description="Unit of the number(s), as in the answer.")


HeadlineValue = HeadlineQuantity | bool | int | float | str | None


class CalculationSummaryPublic(ApiModel):
    """What a listing shows of one calculation."""

    calculation_id: str = Field(description="`meta.calculation_id` of the answer.")
    kind: RecordKind = Field(description=KIND_DESCRIPTION)
    created_at: datetime = Field(description="UTC time of the calculation, ISO 8601.")
    service_version: str = Field(description="tripoint version that calculated it.")
    key_id: str | None = Field(
        description="Digest naming the API key used (never the key); null when keys were off."
    )
    label: Label | None = Field(
        None, description="The request's `label`; null when it gave none (or predates labels)."
    )
    tags: list[Tag] = Field(
        default_factory=list, description="The request's `tags`, in the order given."
    )
    headline: dict[str, HeadlineValue] = Field(
        default_factory=dict,
        description="A few key numbers of the answer, picked per kind, e.g. for "
        "`balances.flash_freeze` `final_temperature`, `ice_mass`, `evaporated_mass` and "
        "`final_pressure`; for `simulations.vacuum_chamber` `end_reason`, `time_to_target`, "
        "`final_temperature`, `evaporated_mass` and `end_time`. Quantities in the answer's "
        "units; a member the answer did not have is left out; empty for records stored "
        "before headlines were kept.",
    )


class _StoredCalculation(CalculationSummaryPublic):
    formulations: list[FormulationVersion] = Field(description="Property formulations used.")


_INPUTS = "The request body as the client sent it (the fields it set)."
_RESULT = "The answer as it was returned."


class StoredFlashFreeze(_StoredCalculation):
    """A stored flash-freeze balance."""

    kind: Literal[RecordKind.FLASH_FREEZE] = Field(description=KIND_DESCRIPTION)
    inputs: FlashFreezeCreate = Field(description=_INPUTS)
    result: FlashFreezePublic = Field(description=_RESULT)


class StoredEvaporativeCooling(_StoredCalculation):
    """A stored evaporative-cooling balance."""

    kind: Literal[RecordKind.EVAPORATIVE_COOLING] = Field(description=KIND_DESCRIPTION)
    inputs: EvaporativeCoolingCreate = Field(description=_INPUTS)
    result: EvaporativeCoolingPublic = Field(description=_RESULT)


class StoredVacuumChamberSimulation(_StoredCalculation):
    """A stored vacuum-chamber simulation of one case."""

    kind: Literal[RecordKind.VACUUM_CHAMBER] = Field(description=KIND_DESCRIPTION)
    inputs: VacuumChamberSimulationCreate = Field(description=_INPUTS)
    result: VacuumChamberSimulationPublic = Field(description=_RESULT)


class StoredVacuumChamberSweep(_StoredCalculation):
    """A stored vacuum-chamber sweep."""

    kind: Literal[RecordKind.VACUUM_CHAMBER_SWEEP] = Field(description=KIND_DESCRIPTION)
    inputs: VacuumChamberSimulationCreate = Field(description=_INPUTS)
    result: VacuumChamberSweepPublic = Field(description=_RESULT)


class StoredPrimaryDrying(_StoredCalculation):
    """A stored primary-drying run."""

    kind: Literal[RecordKind.PRIMARY_DRYING] = Field(description=KIND_DESCRIPTION)
    inputs: PrimaryDryingSimulationCreate = Field(description=_INPUTS)
    result: PrimaryDryingSimulationPublic = Field(description=_RESULT)


class StoredPrimaryDryingDesignSpace(_StoredCalculation):
    """A stored primary-drying design space."""

    kind: Literal[RecordKind.PRIMARY_DRYING_DESIGN_SPACE] = Field(description=KIND_DESCRIPTION)
    inputs: PrimaryDryingDesignSpaceCreate = Field(description=_INPUTS)
    result: PrimaryDryingDesignSpacePublic = Field(description=_RESULT)


class StoredVacuumChamberCalibration(_StoredCalculation):
    """A stored calibration of the vacuum-chamber model."""

    kind: Literal[RecordKind.VACUUM_CHAMBER_CALIBRATION] = Field(description=KIND_DESCRIPTION)
    inputs: VacuumChamberCalibrationCreate = Field(description=_INPUTS)
    result: VacuumChamberCalibrationPublic = Field(description=_RESULT)


class StoredVacuumChamberSizing(_StoredCalculation):
    """A stored vacuum-chamber sizing."""

    kind: Literal[RecordKind.VACUUM_CHAMBER_SIZING] = Field(description=KIND_DESCRIPTION)
    inputs: VacuumChamberSizingCreate = Field(description=_INPUTS)
    result: VacuumChamberSizingPublic = Field(description=_RESULT)


CalculationPublic = Annotated[
    StoredFlashFreeze
    | StoredEvaporativeCooling
    | StoredVacuumChamberSimulation
    | StoredVacuumChamberSweep
    | StoredPrimaryDrying
    | StoredPrimaryDryingDesignSpace
    | StoredVacuumChamberCalibration
    | StoredVacuumChamberSizing,
    Field(discriminator="kind"),
]
"""A stored calculation: inputs as sent, the answer, and the model versions, typed by
``kind``."""

STORED_MODELS: dict[RecordKind, type[_StoredCalculation]] = {
    RecordKind.FLASH_FREEZE: StoredFlashFreeze,
    RecordKind.EVAPORATIVE_COOLING: StoredEvaporativeCooling,
    RecordKind.VACUUM_CHAMBER: StoredVacuumChamberSimulation,
    RecordKind.VACUUM_CHAMBER_SWEEP: StoredVacuumChamberSweep,
    RecordKind.PRIMARY_DRYING: StoredPrimaryDrying,
    RecordKind.PRIMARY_DRYING_DESIGN_SPACE: StoredPrimaryDryingDesignSpace,
    RecordKind.VACUUM_CHAMBER_CALIBRATION: StoredVacuumChamberCalibration,
    RecordKind.VACUUM_CHAMBER_SIZING: StoredVacuumChamberSizing,
}
"""The typed record of each kind (tests validate stored records against them)."""


class CalculationListPublic(ApiModel):
    """One page of calculations, newest first."""

    items: list[CalculationSummaryPublic] = Field(description="The records of this page.")
    next_cursor: str | None = Field(
        description="Pass as `cursor` for the next page; null on the last page (the "
        '`Link: <...>; rel="next"` header of the answer holds the whole next-page address).'
    )
