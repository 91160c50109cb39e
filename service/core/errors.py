"""Error tree of the solver core.

Every error raised by the core derives from :class:`TripointError`. Each concrete
error also subclasses the matching built-in exception and carries the fields
(variable, value, valid range) from which its message is built, so that the HTTP
layer can map it to an RFC 9457 problem document without parsing text.
"""

from __future__ import annotations

from dataclasses import dataclass, field

__all__ = [
    "InvalidInputError",
    "NotConvergedError",
    "OutOfRangeError",
    "TripointError",
    "UnsupportedStateError",
    "describe_range",
    "format_amount",
    "range_hint",
    "range_text",
    "stated_reason",
]


class TripointError(Exception):
    """Root of every error the core raises on purpose."""


@dataclass
class OutOfRangeError(TripointError, ValueError):
    """A value lies outside the range a formulation or model supports.

    Parameters
    ----------
    variable : str
        Name of the input as the caller knows it (e.g. ``"temperature"``).
    value : float
        The offending value, in ``unit``.
    minimum, maximum : float or None
        The valid range, in ``unit``; ``None`` where open-ended.
    unit : str
        Unit of ``value``, ``minimum`` and ``maximum`` (``"1"`` for a pure number).
    reason : str
        One sentence naming the formulation or model whose range this is.
    index : int or None
        Position of the offending element in an array input (None for one value).
    exclusive_minimum : bool
        Whether ``minimum`` itself is outside the range (``(0, 2e5]``).
    """

    variable: str
    value: float
    minimum: float | None
    maximum: float | None
    unit: str
    reason: str = ""
    index: int | None = None
    exclusive_minimum: bool = False

    def __post_init__(self) -> None:
        super().__init__(str(self))

    def __str__(self) -> str:
        where = "" if self.index is None else f" (element {self.index})"
        text = (
            f"{self.variable} = {format_amount(self.value, self.unit)}{where} "
            f"{describe_range(self.minimum, self.maximum, self.unit, self.exclusive_minimum)}"
        )
        reason = stated_reason(self.reason, self.minimum, self.maximum)
        text = f"{text}: {reason}" if reason else text
        hint = range_hint(self.value, self.unit)
        return f"{text}. {hint}" if hint else text


_DIMENSIONLESS = ("", "1")
"""Unit labels of a pure number: printed without a unit."""


def format_amount(value: float, unit: str, digits: int = 10) -> str:
    """``value`` with its unit for a message (no unit for a pure number)."""
    number = f"{value:.{digits}g}"
    return number if unit in _DIMENSIONLESS else f"{number} {unit}"


def range_text(
    minimum: float | None,
    maximum: float | None,
    unit: str,
    exclusive_minimum: bool = False,
    digits: int = 10,
) -> str:
    """A valid range as text: ``[a, b] K``, an open bound shown open (``(0, 2e5] Pa``), a
    one-sided range as ``>= a K`` or ``<= b K``; a pure number without a unit."""
    suffix = "" if unit in _DIMENSIONLESS else f" {unit}"
    low = None if minimum is None else f"{minimum:.{digits}g}"
    high = None if maximum is None else f"{maximum:.{digits}g}"
    if low is not None and high is not None:
        return f"{'(' if exclusive_minimum else '['}{low}, {high}]{suffix}"
    if low is not None:
        return f"{'>' if exclusive_minimum else '>='} {low}{suffix}"
    if high is not None:
        return f"<= {high}{suffix}"
    return "a range this input misses"


def describe_range(
    minimum: float | None,
    maximum: float | None,
    unit: str,
    exclusive_minimum: bool = False,
    digits: int = 10,
) -> str:
    """The verb phrase of a range message: ``is outside the valid range [a, b] K`` or,
    one-sided, ``must be >= a K``."""
    text = range_text(minimum, maximum, unit, exclusive_minimum, digits)
    if minimum is not None and maximum is not None:
        return f"is outside the valid range {text}"
    if minimum is None and maximum is None:
        return "is outside the valid range"
    return f"must be {text}"


def stated_reason(reason: str, minimum: float | None, maximum: float | None) -> str:
    """``reason``, or nothing where it only repeats a one-sided range ("must be > 0")."""
    one_sided = (minimum is None) != (maximum is None)
    if one_sided and reason.startswith(("must be", "must not")):
        return ""
    return reason


def range_hint(value: float, unit: str) -> str:
    """Advice for a refused value that suggests a common mistake (a gauge pressure)."""
    if unit == "Pa" and value < 0:
        return (
            "tripoint takes absolute pressures; a negative pressure looks like a gauge "
            "reading: add the local atmospheric pressure (101.325 kPa standard, or the "
            "local barometer reading)"
        )
    return ""


@dataclass
class InvalidInputError(TripointError, ValueError):
    """An input is malformed (not a number, NaN, wrong shape, conflicting fields)."""

    variable: str
    detail: str
    value: object = None

    def __post_init__(self) -> None:
        super().__init__(str(self))

    def __str__(self) -> str:
        return f"{self.variable}: {self.detail}"


@dataclass
class UnsupportedStateError(TripointError, ValueError):
    """A requested combination is physically possible but outside what tripoint models."""

    variable: str
    detail: str
    value: object = None
    extra: dict[str, object] = field(default_factory=dict)

    def __post_init__(self) -> None:
        super().__init__(str(self))

    def __str__(self) -> str:
        return f"{self.variable}: {self.detail}"


@dataclass
class NotConvergedError(TripointError, ArithmeticError):
    """An iterative solve failed to converge for at least one element."""

    solver: str
    iterations: int
    residual: float
    count: int = 1

    def __post_init__(self) -> None:
        super().__init__(str(self))

    def __str__(self) -> str:
        return (
            f"{self.solver} did not converge for {self.count} element(s) after "
            f"{self.iterations} iterations (largest residual {self.residual:.3g})"
        )


@dataclass
class WorkerLostError(TripointError, RuntimeError):
    """A worker process of a parallel computation ended before answering (killed, for example
    by the operating system when memory ran out); the pool is rebuilt for the next call."""

    computation: str

    def __post_init__(self) -> None:
        super().__init__(str(self))

    def __str__(self) -> str:
        return f"a worker process of the {self.computation} ended before answering"
