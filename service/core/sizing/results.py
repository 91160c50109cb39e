"""What a sizing is asked and what it answers."""

from __future__ import annotations

from dataclasses import dataclass

from service.core.properties.advisories import Advisory
from service.core.simulation.case_fields import CaseField
from service.core.simulation.inputs import VacuumChamberCase
from service.core.simulation.results import VacuumChamberResult

__all__ = ["CoolingTarget", "DesignPoint", "SizingCase", "SizingResult"]


@dataclass(frozen=True)
class CoolingTarget:
    """The product at or below ``temperature`` (K) by ``time`` (s) from the start of pumping."""

    temperature: float
    time: float


@dataclass(frozen=True)
class SizingCase:
    """Input of :func:`service.core.sizing.size_vacuum_chamber`.

    Attributes
    ----------
    case : VacuumChamberCase
        The chamber simulation; the field ``find`` is replaced in each trial.
    find : str
        Dotted path of the field to solve for (a key of
        :data:`service.core.sizing.fields.SIZABLE_FIELDS`).
    target : CoolingTarget or None
        None: the case's own schedule must be met (every limit).
    bracket : (float, float) or None
        Lower and upper value searched, SI; None: the field's default bracket.
    relative_tolerance : float
        The answer is bracketed to within this fraction of itself, 1e-6 to 0.05.
    """

    case: VacuumChamberCase
    find: str
    target: CoolingTarget | None = None
    bracket: tuple[float, float] | None = None
    relative_tolerance: float = 1.0e-3


@dataclass(frozen=True)
class DesignPoint:
    """One simulated value of the unknown.

    Attributes
    ----------
    value : float
        The field's value, SI.
    time_to_target : float or None
        s until the product reached the target temperature; None when it did not within
        the simulated time (or, for a schedule target, without a target temperature).
    meets_target : bool
    """

    value: float
    time_to_target: float | None
    meets_target: bool


@dataclass(frozen=True)
class SizingResult:
    """Output of :func:`service.core.sizing.size_vacuum_chamber`.

    Attributes
    ----------
    field : CaseField
        The field solved for.
    direction : int
        +1: the answer is the smallest value meeting the target; -1: the largest.
    solution : float
        The answer, SI: a simulated value that meets the target.
    nearest_failing : float
        The simulated value on the other side of the boundary that does not meet it
        (equal to ``solution`` when the bracket's own end meets it).
    relative_width : float
        |solution - nearest_failing| / |solution|: the tolerance reached.
    bracket : (float, float)
        The bracket searched, SI.
    simulation : VacuumChamberResult
        The forward simulation at the solution.
    simulated_case : VacuumChamberCase
        The case of that simulation (the field set to the solution, the target
        temperature and end time the sizing used).
    margin_value : float
        90 % of the solution, SI.
    margin : DesignPoint
        What the margin value gives.
    design_curve : tuple of DesignPoint
        Every simulated value, in increasing order.
    simulations : int
        Forward simulations run.
    at_bracket_end : bool
        The bracket's end on the unfavourable side already meets the target: the boundary
        may lie beyond it.
    target : CoolingTarget or None
        The target solved for (None: the case's schedule).
    relative_tolerance : float
        The tolerance asked for.
    warnings : tuple of Advisory
    assumptions : tuple of str
    """

    field: CaseField
    direction: int
    solution: float
    nearest_failing: float
    relative_width: float
    bracket: tuple[float, float]
    simulation: VacuumChamberResult
    simulated_case: VacuumChamberCase
    margin_value: float
    margin: DesignPoint
    design_curve: tuple[DesignPoint, ...]
    simulations: int
    at_bracket_end: bool
    target: CoolingTarget | None
    relative_tolerance: float
    warnings: tuple[Advisory, ...]
    assumptions: tuple[str, ...]
