"""Coefficients of the IAPWS formulations for ice Ih and its phase boundaries.

Sources
-------
- IAPWS R10-06(2009), "Revised Release on the Equation of State 2006 for H2O
  Ice Ih", Table 1 (special constants: triple point and normal pressure) and
  Table 2 (coefficients of the Gibbs function, eq. (1)). The value of ``g00``
  is the 2009 revision, adjusted for consistency with IAPWS-95; ``s0`` is the
  IAPWS-95-consistent residual entropy (not the absolute one).
- IAPWS R14-08(2011), "Revised Release on the Pressure along the Melting and
  Sublimation Curves of Ordinary Water Substance", Table 1 (melting pressure of
  ice Ih, eq. (1)) and Table 2 (sublimation pressure of ice Ih, eq. (6)), with
  their ranges of validity.

Units are SI (K, Pa, J/kg, J/(kg K)) unless stated. Complex coefficients of
R10-06 are given as Python ``complex`` literals built from the release's real
and imaginary parts.
"""

from __future__ import annotations

from typing import Final

__all__ = [
    "ICE_GIBBS_CONSTANT_COEFFICIENTS",
    "ICE_MAXIMUM_PRESSURE",
    "ICE_MAXIMUM_TEMPERATURE",
    "ICE_NORMAL_PRESSURE",
    "ICE_R1",
    "ICE_R2_COEFFICIENTS",
    "ICE_REDUCING_PRESSURE",
    "ICE_REDUCING_TEMPERATURE",
    "ICE_RESIDUAL_ENTROPY",
    "ICE_T1",
    "ICE_T2",
    "MELTING_COEFFICIENTS",
    "MELTING_EXPONENTS",
    "MELTING_MAXIMUM_PRESSURE",
    "MELTING_MINIMUM_TEMPERATURE",
    "PHASE_LINE_REDUCING_PRESSURE",
    "PHASE_LINE_REDUCING_TEMPERATURE",
    "SUBLIMATION_COEFFICIENTS",
    "SUBLIMATION_EXPONENTS",
    "SUBLIMATION_MINIMUM_TEMPERATURE",
]

# --- IAPWS R10-06(2009), Table 1 ------------------------------------------------
ICE_REDUCING_TEMPERATURE: Final = 273.16
"""T_t, K: triple-point temperature, reducing temperature of eq. (1)."""

ICE_REDUCING_PRESSURE: Final = 611.657
"""p_t, Pa: triple-point pressure, reducing pressure of eq. (1)."""

ICE_NORMAL_PRESSURE: Final = 101325.0
"""p_0, Pa: normal pressure, expansion point of g_0(p) and r_2(p)."""

# --- IAPWS R10-06(2009), Table 2 ------------------------------------------------
ICE_GIBBS_CONSTANT_COEFFICIENTS: Final = (
    -0.632020233335886e6,
    0.655022213658955,
    -0.189369929326131e-7,
    0.339746123271053e-14,
    -0.556464869058991e-21,
)
"""g00 .. g04, J/kg: g_0(p) = sum_k g0k (pi - pi_0)**k."""

ICE_RESIDUAL_ENTROPY: Final = -0.332733756492168e4
"""s0, J/(kg K): the IAPWS-95-consistent value ("s0 (IAPWS-95)")."""

ICE_T1: Final = complex(0.368017112855051e-1, 0.510878114959572e-1)
"""t1, dimensionless."""

ICE_R1: Final = complex(0.447050716285388e2, 0.656876847463481e2)
"""r1, J/(kg K)."""

ICE_T2: Final = complex(0.337315741065416, 0.335449415919309)
"""t2, dimensionless."""

ICE_R2_COEFFICIENTS: Final = (
    complex(-0.725974574329220e2, -0.781008427112870e2),
    complex(-0.557107698030123e-4, 0.464578634580806e-4),
    complex(0.234801409215913e-10, -0.285651142904972e-10),
)
"""r20, r21, r22, J/(kg K): r_2(p) = sum_k r2k (pi - pi_0)**k."""

ICE_MAXIMUM_TEMPERATURE: Final = 273.16
"""K, upper temperature bound of the stable ice Ih region (R10-06 range of validity)."""

ICE_MAXIMUM_PRESSURE: Final = 210.0e6
"""Pa, upper pressure bound of the R10-06 range of validity."""

# --- IAPWS R14-08(2011), Sec. 2 and Tables 1-2 --------------------------------------
PHASE_LINE_REDUCING_TEMPERATURE: Final = 273.16
"""T_t, K: reducing temperature of eqs. (1) and (6)."""

PHASE_LINE_REDUCING_PRESSURE: Final = 611.657
"""p_t, Pa: reducing pressure of eqs. (1) and (6)."""

MELTING_COEFFICIENTS: Final = (0.119539337e7, 0.808183159e5, 0.333826860e4)
"""a1 .. a3 of eq. (1), melting pressure of ice Ih (Table 1)."""

MELTING_EXPONENTS: Final = (0.300000e1, 0.257500e2, 0.103750e3)
"""b1 .. b3 of eq. (1), melting pressure of ice Ih (Table 1)."""

MELTING_MINIMUM_TEMPERATURE: Final = 251.165
"""K, ice Ih - ice III - liquid triple point: lower end of eq. (1)."""

MELTING_MAXIMUM_PRESSURE: Final = 208.566e6
"""Pa, pressure of the ice Ih - ice III - liquid triple point."""

SUBLIMATION_COEFFICIENTS: Final = (-0.212144006e2, 0.273203819e2, -0.610598130e1)
"""a1 .. a3 of eq. (6), sublimation pressure of ice Ih (Table 2)."""

SUBLIMATION_EXPONENTS: Final = (0.333333333e-2, 0.120666667e1, 0.170333333e1)
"""b1 .. b3 of eq. (6), sublimation pressure of ice Ih (Table 2)."""

SUBLIMATION_MINIMUM_TEMPERATURE: Final = 50.0
"""K, lower end of the range of eq. (6)."""
