"""Coefficients of the IAPWS-95 formulation for fluid water.

Sources
-------
- IAPWS R6-95(2018), "Revised Release on the IAPWS Formulation 1995 for the
  Thermodynamic Properties of Ordinary Water Substance for General and Scientific
  Use": Table 1 (coefficients of the ideal-gas part, eq. 5) and Table 2
  (coefficients and exponents of the residual part, eq. 6). Term numbers ``i``
  in the comments are the release's.
- IAPWS, "Guideline on a Low-Temperature Extension of the IAPWS-95 Formulation
  for Water Vapor" (2012), eq. (2): the single constant
  :data:`LOW_TEMPERATURE_EXTENSION_COEFFICIENT` and the 130 K limit.
- IAPWS SR1-86(1992), "Revised Supplementary Release on Saturation Properties of
  Ordinary Water Substance", eqs. (1), (2) and (3) (W. Wagner and A. Pruss,
  J. Phys. Chem. Ref. Data 22, 783 (1993)): the ``AUXILIARY_*`` coefficients,
  used only to start the exact phase-equilibrium solve.

The numbers are data, copied digit for digit; nothing here is computed.
"""

from __future__ import annotations

from typing import Final

import numpy as np
from numpy.typing import NDArray

__all__ = [
    "AUXILIARY_LIQUID_DENSITY_COEFFICIENTS",
    "AUXILIARY_LIQUID_DENSITY_EXPONENTS",
    "AUXILIARY_PRESSURE_COEFFICIENTS",
    "AUXILIARY_PRESSURE_EXPONENTS",
    "AUXILIARY_VAPOR_DENSITY_COEFFICIENTS",
    "AUXILIARY_VAPOR_DENSITY_EXPONENTS",
    "GAUSSIAN_ALPHA",
    "GAUSSIAN_BETA",
    "GAUSSIAN_D",
    "GAUSSIAN_EPSILON",
    "GAUSSIAN_GAMMA",
    "GAUSSIAN_N",
    "GAUSSIAN_T",
    "IDEAL_EXPONENTIAL_COEFFICIENTS",
    "IDEAL_EXPONENTIAL_RATES",
    "IDEAL_LOG_TAU_COEFFICIENT",
    "IDEAL_N1",
    "IDEAL_N2",
    "LOW_TEMPERATURE_EXTENSION_COEFFICIENT",
    "LOW_TEMPERATURE_EXTENSION_LIMIT",
    "NONANALYTIC_A",
    "NONANALYTIC_B",
    "NONANALYTIC_BETA",
    "NONANALYTIC_CAPITAL_A",
    "NONANALYTIC_CAPITAL_B",
    "NONANALYTIC_CAPITAL_C",
    "NONANALYTIC_CAPITAL_D",
    "NONANALYTIC_N",
    "POLYNOMIAL_C",
    "POLYNOMIAL_D",
    "POLYNOMIAL_N",
    "POLYNOMIAL_T",
]

# --- Table 1: ideal-gas part -------------------------------------------------
# phi0 = ln(delta) + n1 + n2 tau + n3 ln(tau) + sum_{i=4..8} n_i ln(1 - exp(-gamma_i tau))
IDEAL_N1: Final = -0.83204464837497e1
IDEAL_N2: Final = 0.66832105275932e1
IDEAL_LOG_TAU_COEFFICIENT: Final = 0.300632e1
"""n3 of Table 1."""
IDEAL_EXPONENTIAL_COEFFICIENTS: Final[NDArray[np.float64]] = np.array(
    [0.12436e-1, 0.97315, 0.12795e1, 0.96956, 0.24873]
)
"""n4 ... n8 of Table 1."""
IDEAL_EXPONENTIAL_RATES: Final[NDArray[np.float64]] = np.array(
    [0.128728967e1, 0.353734222e1, 0.774073708e1, 0.924437796e1, 0.275075105e2]
)
"""gamma4 ... gamma8 of Table 1."""

# --- Table 2: residual part, terms i = 1..51 ----------------------------------
# n_i delta^d_i tau^t_i                     (i = 1..7, c_i = 0)
# n_i delta^d_i tau^t_i exp(-delta^c_i)     (i = 8..51)
# fmt: off
_POLYNOMIAL_TERMS: Final = (
    # (n_i, c_i, d_i, t_i)
    (   0.12533547935523e-1, 0,  1,  -0.5),  # 1
    (    0.78957634722828e1, 0,  1, 0.875),  # 2
    (   -0.87803203303561e1, 0,  1,     1),  # 3
    (      0.31802509345418, 0,  2,   0.5),  # 4
    (     -0.26145533859358, 0,  2,  0.75),  # 5
    (  -0.78199751687981e-2, 0,  3, 0.375),  # 6
    (   0.88089493102134e-2, 0,  4,     1),  # 7
    (     -0.66856572307965, 1,  1,     4),  # 8
    (      0.20433810950965, 1,  1,     6),  # 9
    (  -0.66212605039687e-4, 1,  1,    12),  # 10
    (     -0.19232721156002, 1,  2,     1),  # 11
    (     -0.25709043003438, 1,  2,     5),  # 12
    (      0.16074868486251, 1,  3,     4),  # 13
    (  -0.40092828925807e-1, 1,  4,     2),  # 14
    (   0.39343422603254e-6, 1,  4,    13),  # 15
    (  -0.75941377088144e-5, 1,  5,     9),  # 16
    (   0.56250979351888e-3, 1,  7,     3),  # 17
    (  -0.15608652257135e-4, 1,  9,     4),  # 18
    (   0.11537996422951e-8, 1, 10,    11),  # 19
    (   0.36582165144204e-6, 1, 11,     4),  # 20
    ( -0.13251180074668e-11, 1, 13,    13),  # 21
    (  -0.62639586912454e-9, 1, 15,     1),  # 22
    (     -0.10793600908932, 2,  1,     7),  # 23
    (   0.17611491008752e-1, 2,  2,     1),  # 24
    (      0.22132295167546, 2,  2,     9),  # 25
    (     -0.40247669763528, 2,  2,    10),  # 26
    (      0.58083399985759, 2,  3,    10),  # 27
    (   0.49969146990806e-2, 2,  4,     3),  # 28
    (  -0.31358700712549e-1, 2,  4,     7),  # 29
    (     -0.74315929710341, 2,  4,    10),  # 30
    (       0.47807329915480, 2,  5,    10),  # 31
    (   0.20527940895948e-1, 2,  6,     6),  # 32
    (     -0.13636435110343, 2,  6,    10),  # 33
    (   0.14180634400617e-1, 2,  7,    10),  # 34
    (   0.83326504880713e-2, 2,  9,     1),  # 35
    (  -0.29052336009585e-1, 2,  9,     2),  # 36
    (   0.38615085574206e-1, 2,  9,     3),  # 37
    (  -0.20393486513704e-1, 2,  9,     4),  # 38
    (  -0.16554050063734e-2, 2,  9,     8),  # 39
    (   0.19955571979541e-2, 2, 10,     6),  # 40
    (   0.15870308324157e-3, 2, 10,     9),  # 41
    (   -0.16388568342530e-4, 2, 12,     8),  # 42
    (   0.43613615723811e-1, 3,  3,    16),  # 43
    (   0.34994005463765e-1, 3,  4,    22),  # 44
    (  -0.76788197844621e-1, 3,  4,    23),  # 45
    (   0.22446277332006e-1, 3,  5,    23),  # 46
    (  -0.62689710414685e-4, 4, 14,    10),  # 47
    (  -0.55711118565645e-9, 6,  3,    50),  # 48
    (     -0.19905718354408, 6,  6,    44),  # 49
    (      0.31777497330738, 6,  6,    46),  # 50
    (     -0.11841182425981, 6,  6,    50),  # 51
)
# fmt: on
_POLYNOMIAL_TABLE: Final = np.array(_POLYNOMIAL_TERMS, dtype=np.float64)
POLYNOMIAL_N: Final[NDArray[np.float64]] = np.ascontiguousarray(_POLYNOMIAL_TABLE[:, 0])
POLYNOMIAL_C: Final[NDArray[np.float64]] = np.ascontiguousarray(_POLYNOMIAL_TABLE[:, 1])
POLYNOMIAL_D: Final[NDArray[np.float64]] = np.ascontiguousarray(_POLYNOMIAL_TABLE[:, 2])
POLYNOMIAL_T: Final[NDArray[np.float64]] = np.ascontiguousarray(_POLYNOMIAL_TABLE[:, 3])

# --- Table 2: Gaussian terms i = 52..54 ----------------------------------------
# n_i delta^d_i tau^t_i exp(-alpha_i (delta - eps_i)^2 - beta_i (tau - gamma_i)^2)
GAUSSIAN_N: Final[NDArray[np.float64]] = np.array(
    [-0.31306260323435e2, 0.31546140237781e2, -0.25213154341695e4]
)
GAUSSIAN_D: Final[NDArray[np.float64]] = np.array([3.0, 3.0, 3.0])
GAUSSIAN_T: Final[NDArray[np.float64]] = np.array([0.0, 1.0, 4.0])
GAUSSIAN_ALPHA: Final[NDArray[np.float64]] = np.array([20.0, 20.0, 20.0])
GAUSSIAN_BETA: Final[NDArray[np.float64]] = np.array([150.0, 150.0, 250.0])
GAUSSIAN_GAMMA: Final[NDArray[np.float64]] = np.array([1.21, 1.21, 1.25])
GAUSSIAN_EPSILON: Final[NDArray[np.float64]] = np.array([1.0, 1.0, 1.0])

# --- Table 2: non-analytic terms i = 55..56 -------------------------------------
# n_i Delta^b_i delta psi, Delta = theta^2 + B_i ((delta - 1)^2)^a_i,
# theta = (1 - tau) + A_i ((delta - 1)^2)^(1/(2 beta_i)),
# psi = exp(-C_i (delta - 1)^2 - D_i (tau - 1)^2)
NONANALYTIC_N: Final[NDArray[np.float64]] = np.array([-0.14874640856724, 0.31806110878444])
NONANALYTIC_A: Final[NDArray[np.float64]] = np.array([3.5, 3.5])
NONANALYTIC_B: Final[NDArray[np.float64]] = np.array([0.85, 0.95])
NONANALYTIC_CAPITAL_B: Final[NDArray[np.float64]] = np.array([0.2, 0.2])
NONANALYTIC_CAPITAL_C: Final[NDArray[np.float64]] = np.array([28.0, 32.0])
NONANALYTIC_CAPITAL_D: Final[NDArray[np.float64]] = np.array([700.0, 800.0])
NONANALYTIC_CAPITAL_A: Final[NDArray[np.float64]] = np.array([0.32, 0.32])
NONANALYTIC_BETA: Final[NDArray[np.float64]] = np.array([0.3, 0.3])

# --- Low-temperature extension of the ideal-gas part (Guideline, 2012) ---------
LOW_TEMPERATURE_EXTENSION_COEFFICIENT: Final = 0.278296458178592
"""E of the Guideline's eq. (2), dimensionless."""
LOW_TEMPERATURE_EXTENSION_LIMIT: Final = 130.0
"""K; below this temperature the Guideline's correction is added to phi0."""

# --- Auxiliary saturation equations (IAPWS SR1-86(1992)) -----------------------
# Used only as start values of the exact phase-equilibrium solve.
# ln(p_sigma / p_c) = (T_c / T) sum_i a_i theta^e_i,          theta = 1 - T / T_c
# rho' / rho_c = 1 + sum_i b_i theta^f_i
# ln(rho'' / rho_c) = sum_i c_i theta^g_i
AUXILIARY_PRESSURE_COEFFICIENTS: Final[NDArray[np.float64]] = np.array(
    [-7.85951783, 1.84408259, -11.7866497, 22.6807411, -15.9618719, 1.80122502]
)
AUXILIARY_PRESSURE_EXPONENTS: Final[NDArray[np.float64]] = np.array([1.0, 1.5, 3.0, 3.5, 4.0, 7.5])
AUXILIARY_LIQUID_DENSITY_COEFFICIENTS: Final[NDArray[np.float64]] = np.array(
    [1.99274064, 1.09965342, -0.510839303, -1.75493479, -45.5170352, -6.74694450e5]
)
AUXILIARY_LIQUID_DENSITY_EXPONENTS: Final[NDArray[np.float64]] = np.array(
    [1.0 / 3.0, 2.0 / 3.0, 5.0 / 3.0, 16.0 / 3.0, 43.0 / 3.0, 110.0 / 3.0]
)
AUXILIARY_VAPOR_DENSITY_COEFFICIENTS: Final[NDArray[np.float64]] = np.array(
    [-2.03150240, -2.68302940, -5.38626492, -17.2991605, -44.7586581, -63.9201063]
)
AUXILIARY_VAPOR_DENSITY_EXPONENTS: Final[NDArray[np.float64]] = np.array(
    [2.0 / 6.0, 4.0 / 6.0, 8.0 / 6.0, 18.0 / 6.0, 37.0 / 6.0, 71.0 / 6.0]
)
