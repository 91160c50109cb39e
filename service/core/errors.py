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
        Unit of ``value``, ``minimum`` and ``maximum``.
    reason : str
        One sentence naming the formulation or model whose range this is.
    """

    variable: str
    value: float
    minimum: float | None
    maximum: float | None
    unit: str
    reason: str = ""
    index: int | None = None

    def __post_init__(self) -> None:
        super().__init__(str(self))

    def __str__(self) -> str:
        low = "-inf" if self.minimum is None else f"{self.minimum:.10g}"
        high = "+inf" if self.maximum is None else f"{self.maximum:.10g}"
        where = "" if self.index is None else f" (element {self.index})"
        text = (
            f"{self.variable} = {self.value:.10g} {self.unit}{where} is outside "
            f"the valid range [{low}, {high}] {self.unit}"
        )
        return f"{text}: {self.reason}" if self.reason else text


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
