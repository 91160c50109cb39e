"""Effective pumping speed of the vacuum pump against the chamber pressure.

Model
-----
S_eff(p) = S(p) (1 - p_ult / p) for p > p_ult, and 0 at or below p_ult, where S(p) is
the nominal speed or, if given, the speed curve interpolated linearly in ln p (held
constant beyond its ends). The factor (1 - p_ult / p) is the usual description of a
pump whose net throughput vanishes at its ultimate pressure, so that the pump-down of
a leak-free chamber follows V dp/dt = -S (p - p_ult). A measured speed curve that
already falls off near the ultimate pressure should be given with ultimate pressure 0.

The pump takes the chamber gas as it is (well mixed): of its volume flow S_eff, each
component carries its partial density, so the mass flow of component i is
S_eff rho_i and its throughput S_eff p_i.

References
----------
Pump-down law V dp/dt = Q - S p and the effective speed near the ultimate pressure:
O'Hanlon, J. F., *A User's Guide to Vacuum Technology*, 3rd ed., Wiley (2003),
ch. 3 and 14 (from memory); standard vacuum-technology result.
"""

from __future__ import annotations

import bisect
import math

from service.core.simulation.inputs import Pump

__all__ = ["PumpingSpeed"]


class PumpingSpeed:
    """S_eff(p) of one pump, in plain floats (called in the ODE's inner loop).

    Parameters
    ----------
    pump : Pump
        Validated pump description.
    """

    def __init__(self, pump: Pump) -> None:
        self._nominal = pump.nominal_speed
        self._ultimate = pump.ultimate_pressure
        self._log_pressures = [math.log(p) for p in pump.speed_curve_pressures]
        self._speeds = list(pump.speed_curve_speeds)

    def base_speed(self, pressure: float) -> float:
        """S(p) before the ultimate-pressure factor, m3/s."""
        if not self._speeds:
            return self._nominal
        if pressure <= 0.0:
            return self._speeds[0]
        x = math.log(pressure)
        position = bisect.bisect_right(self._log_pressures, x)
        if position == 0:
            return self._speeds[0]
        if position == len(self._speeds):
            return self._speeds[-1]
        x0, x1 = self._log_pressures[position - 1], self._log_pressures[position]
        s0, s1 = self._speeds[position - 1], self._speeds[position]
        return s0 + (s1 - s0) * (x - x0) / (x1 - x0)

    def __call__(self, pressure: float) -> float:
        """S_eff(p), m3/s, at total pressure ``pressure`` (Pa)."""
        if pressure <= self._ultimate:
            return 0.0
        return self.base_speed(pressure) * (1.0 - self._ultimate / pressure)
