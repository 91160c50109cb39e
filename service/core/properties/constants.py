"""Fixed points and constants of ordinary water substance.

Sources
-------
- IAPWS R6-95(2018), "Revised Release on the IAPWS Formulation 1995 for the
  Thermodynamic Properties of Ordinary Water Substance for General and
  Scientific Use", Sec. 2 and Sec. 6.3: critical point, specific gas constant,
  triple-point temperature.
- IAPWS R14-08(2011), "Revised Release on the Pressure along the Melting and
  Sublimation Curves of Ordinary Water Substance", Sec. 2: triple-point pressure.
- IAPWS R7-97(2012), "Revised Release on the IAPWS Industrial Formulation 1997",
  Sec. 4: specific gas constant used by IAPWS-IF97.
"""

from __future__ import annotations

from typing import Final

__all__ = [
    "CRITICAL_DENSITY",
    "CRITICAL_PRESSURE",
    "CRITICAL_TEMPERATURE",
    "MOLAR_MASS",
    "SPECIFIC_GAS_CONSTANT",
    "SPECIFIC_GAS_CONSTANT_IF97",
    "TRIPLE_POINT_PRESSURE",
    "TRIPLE_POINT_TEMPERATURE",
]

CRITICAL_TEMPERATURE: Final = 647.096
"""K, IAPWS R6-95(2018) eq. (1)."""

CRITICAL_DENSITY: Final = 322.0
"""kg/m3, IAPWS R6-95(2018) eq. (2)."""

CRITICAL_PRESSURE: Final = 22.064e6
"""Pa, IAPWS R6-95(2018) eq. (3)."""

TRIPLE_POINT_TEMPERATURE: Final = 273.16
"""K, by definition of the kelvin before 2019; IAPWS R6-95(2018) eq. (4)."""

TRIPLE_POINT_PRESSURE: Final = 611.657
"""Pa, IAPWS R14-08(2011) eq. (2)."""

SPECIFIC_GAS_CONSTANT: Final = 461.51805
"""J/(kg K), IAPWS R6-95(2018) eq. (6.3)."""

SPECIFIC_GAS_CONSTANT_IF97: Final = 461.526
"""J/(kg K), IAPWS R7-97(2012) eq. (1)."""

MOLAR_MASS: Final = 0.018015268
"""kg/mol, IAPWS R6-95(2018) Sec. 2 (value used with the gas constant above)."""
