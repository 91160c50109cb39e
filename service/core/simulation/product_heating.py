"""Heat into the product from the chamber: a fixed power, a conductance, wall radiation and
shelf contact.

    Q(T) = P + UA (T_sur - T) + sigma eps A_r (T_wall**4 - T**4) + h_c A_c (T_shelf - T)

with the product at one temperature T. Radiation is the exchange of a small grey body with
a large enclosure (the walls see the product's radiating area A_r with the product's
effective emissivity eps); contact is a heat-transfer coefficient over the area touching a
shelf or tray. In a freeze dryer or a small vacuum chamber these, not the air, bring most of
the heat once the pressure is low.

References
----------
Stefan-Boltzmann constant sigma = 5.670374419e-8 W/(m2 K4) (CODATA 2018, exact in SI).
Exchange of a small grey body with a large isothermal enclosure, q = eps sigma A
(T_s**4 - T**4): Incropera, F. P. et al., Fundamentals of Heat and Mass Transfer, 6th ed.,
Wiley (2007), eq. 1.7 (from memory).
"""

from __future__ import annotations

from typing import Final

from service.core.simulation.inputs import HeatGainRate

__all__ = ["STEFAN_BOLTZMANN_CONSTANT", "ProductHeating"]

STEFAN_BOLTZMANN_CONSTANT: Final = 5.670374419e-8
"""W/(m2 K4), CODATA 2018 (exact)."""


class ProductHeating:
    """Q(T) of one validated heat gain, in plain floats (called in the ODE's inner loop).

    Parameters
    ----------
    heat_gain : HeatGainRate or None
        None: no heat (adiabatic product).
    chamber_temperature : float
        K; the surroundings, walls and shelf default to it.
    """

    def __init__(self, heat_gain: HeatGainRate | None, chamber_temperature: float) -> None:
        gain = heat_gain or HeatGainRate()
        self._power = gain.power
        self._conductance = gain.conductance
        self._surroundings = _or(gain.surroundings_temperature, chamber_temperature)
        self._radiation = STEFAN_BOLTZMANN_CONSTANT * gain.emissivity * gain.radiating_area
        self._wall = _or(gain.wall_temperature, chamber_temperature)
        self._contact = gain.contact_coefficient * gain.contact_area
        self._shelf = _or(gain.shelf_temperature, chamber_temperature)

    def rate(self, temperature: float) -> float:
        """Heat flow into the product, W, at product temperature ``temperature`` (K)."""
        return (
            self._power
            + self._conductance * (self._surroundings - temperature)
            + self._radiation * (self._wall**4 - temperature**4)
            + self._contact * (self._shelf - temperature)
        )

    def parts(self, temperature: float) -> dict[str, float]:
        """The four terms of :meth:`rate`, W, by name (for reports)."""
        return {
            "power": self._power,
            "conductance": self._conductance * (self._surroundings - temperature),
            "radiation": self._radiation * (self._wall**4 - temperature**4),
            "contact": self._contact * (self._shelf - temperature),
        }


def _or(value: float | None, default: float) -> float:
    return default if value is None else value
