"""Advisories: what a caller should know about a result (metastable, near critical...).

The core returns them beside its numbers; the HTTP layer lists them as warnings.
"""

from __future__ import annotations

from dataclasses import dataclass
from typing import Final

import numpy as np
from numpy.typing import NDArray

from service.core.properties.constants import CRITICAL_PRESSURE, CRITICAL_TEMPERATURE
from service.core.properties.phase import FloatArray

__all__ = ["Advisory", "advise_where", "near_critical_point"]

NEAR_CRITICAL_TEMPERATURE_BAND: Final = 1.0
"""K. Within this of the critical temperature, property derivatives (cp, compressibility)
grow without bound and IAPWS-95 uncertainties are larger (IAPWS R6-95(2018), uncertainty
estimates; section number not verified)."""

NEAR_CRITICAL_PRESSURE_BAND: Final = 0.01
"""Relative. Together with the temperature band, marks the near-critical region."""


@dataclass(frozen=True)
class Advisory:
    """A warning about some (or all) elements of a result.

    Attributes
    ----------
    code : str
        Stable identifier, e.g. ``"metastable"``, ``"near-critical-point"``, ``"extrapolated"``.
    message : str
        One or two sentences for a person.
    indices : tuple of int or None
        Flat batch positions concerned; ``None`` means every element.
    """

    code: str
    message: str
    indices: tuple[int, ...] | None = None


def advise_where(
    mask: NDArray[np.bool_], code: str, message: str, *, batch: bool
) -> list[Advisory]:
    """Return one advisory for the elements where ``mask`` holds (none if nowhere)."""
    flat = np.asarray(mask).ravel()
    if not flat.any():
        return []
    indices = tuple(int(i) for i in np.flatnonzero(flat)) if batch and not flat.all() else None
    return [Advisory(code=code, message=message, indices=indices)]


def near_critical_point(
    temperature: FloatArray, pressure: FloatArray | None = None
) -> NDArray[np.bool_]:
    """Mask of states within the near-critical band (temperature, and pressure if given)."""
    close = np.abs(temperature - CRITICAL_TEMPERATURE) <= NEAR_CRITICAL_TEMPERATURE_BAND
    if pressure is not None:
        close &= np.abs(pressure / CRITICAL_PRESSURE - 1.0) <= NEAR_CRITICAL_PRESSURE_BAND
    return np.asarray(close, dtype=np.bool_)
