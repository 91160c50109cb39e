"""Coefficients of the saline part of the Gibbs function of seawater.

Source
------
IAPWS R13-08, "Release on the IAPWS Formulation 2008 for the Thermodynamic Properties of
Seawater" (September 2008), eq. (4) and Table 2 (the coefficients g_ijk), Table 1 (the
reducing constants). The same saline Gibbs function is the saline part of TEOS-10
(IOC, SCOR and IAPSO, 2010, "The international thermodynamic equation of seawater - 2010",
Manual and Guides No. 56). The release text itself was not reachable from this project's
reference store; the table was transcribed from a published implementation of the release
and is held to the release's check values (Table 8a-c) in
``tests/reference/test_iapws_r13_08_table_8.py``.

Each row is (i, j, k, g_ijk) of the sum, in J/kg,

    g_S(S_A, T, p) = g_u sum_jk [ g_1jk x**2 ln x + sum_(i>=2) g_ijk x**i ] tau**j pi**k,

x = sqrt(S_A / S_u), tau = (T - T_0) / T_u, pi = (p - p_0) / p_u. The release fixes g_100,
g_110 (and g_200, g_210 through them) so that the enthalpy and entropy of standard seawater
(S_A = 35.16504 g/kg) at 273.15 K and 101325 Pa are zero.
"""

from __future__ import annotations

from typing import Final

__all__ = [
    "NORMAL_PRESSURE",
    "REDUCING_PRESSURE",
    "REDUCING_SALINITY",
    "REDUCING_TEMPERATURE",
    "SALINE_GIBBS_TERMS",
    "SEA_SALT_MOLAR_MASS",
    "STANDARD_SALINITY",
    "ZERO_CELSIUS",
]

STANDARD_SALINITY: Final = 0.03516504
"""kg/kg, S_n, the absolute salinity of standard seawater (R13-08 Table 1)."""

REDUCING_SALINITY: Final = STANDARD_SALINITY * 40.0 / 35.0
"""kg/kg, S_u = S_n 40/35 (R13-08 Table 1)."""

ZERO_CELSIUS: Final = 273.15
"""K, T_0 (R13-08 Table 1)."""

REDUCING_TEMPERATURE: Final = 40.0
"""K, T_u (R13-08 Table 1)."""

NORMAL_PRESSURE: Final = 101325.0
"""Pa, p_0 (R13-08 Table 1)."""

REDUCING_PRESSURE: Final = 1.0e8
"""Pa, p_u (R13-08 Table 1)."""

SEA_SALT_MOLAR_MASS: Final = 0.0314038218
"""kg/mol, M_S, molar mass of sea salt of reference composition (R13-08 Table 1)."""

SALINE_GIBBS_TERMS: Final[tuple[tuple[int, int, int, float], ...]] = (
    (1, 0, 0, 0.581281456626732e4),
    (2, 0, 0, 0.141627648484197e4),
    (3, 0, 0, -0.243214662381794e4),
    (4, 0, 0, 0.202580115603697e4),
    (5, 0, 0, -0.109166841042967e4),
    (6, 0, 0, 0.374601237877840e3),
    (7, 0, 0, -0.485891069025409e2),
    (1, 1, 0, 0.851226734946706e3),
    (2, 1, 0, 0.168072408311545e3),
    (3, 1, 0, -0.493407510141682e3),
    (4, 1, 0, 0.543835333000098e3),
    (5, 1, 0, -0.196028306689776e3),
    (6, 1, 0, 0.367571622995805e2),
    (2, 2, 0, 0.880031352997204e3),
    (3, 2, 0, -0.430664675978042e2),
    (4, 2, 0, -0.685572509204491e2),
    (2, 3, 0, -0.225267649263401e3),
    (3, 3, 0, -0.100227370861875e2),
    (4, 3, 0, 0.493667694856254e2),
    (2, 4, 0, 0.914260447751259e2),
    (3, 4, 0, 0.875600661808945),
    (4, 4, 0, -0.171397577419788e2),
    (2, 5, 0, -0.216603240875311e2),
    (4, 5, 0, 0.249697009569508e1),
    (2, 6, 0, 0.213016970847183e1),
    (2, 0, 1, -0.331049154044839e4),
    (3, 0, 1, 0.199459603073901e3),
    (4, 0, 1, -0.547919133532887e2),
    (5, 0, 1, 0.360284195611086e2),
    (2, 1, 1, 0.729116529735046e3),
    (3, 1, 1, -0.175292041186547e3),
    (4, 1, 1, -0.226683558512829e2),
    (2, 2, 1, -0.860764303783977e3),
    (3, 2, 1, 0.383058066002476e3),
    (2, 3, 1, 0.694244814133268e3),
    (3, 3, 1, -0.460319931801257e3),
    (2, 4, 1, -0.297728741987187e3),
    (3, 4, 1, 0.234565187611355e3),
    (2, 0, 2, 0.384794152978599e3),
    (3, 0, 2, -0.522940909281335e2),
    (4, 0, 2, -0.408193978912261e1),
    (2, 1, 2, -0.343956902961561e3),
    (3, 1, 2, 0.831923927801819e2),
    (2, 2, 2, 0.337409530269367e3),
    (3, 2, 2, -0.541917262517112e2),
    (2, 3, 2, -0.204889641964903e3),
    (2, 4, 2, 0.747261411387560e2),
    (2, 0, 3, -0.965324320107458e2),
    (3, 0, 3, 0.680444942726459e2),
    (4, 0, 3, -0.301755111971161e2),
    (2, 1, 3, 0.124687671116248e3),
    (3, 1, 3, -0.294830643494290e2),
    (2, 2, 3, -0.178314556207638e3),
    (3, 2, 3, 0.256398487389914e2),
    (2, 3, 3, 0.113561697840594e3),
    (2, 4, 3, -0.364872919001588e2),
    (2, 0, 4, 0.158408172766824e2),
    (3, 0, 4, -0.341251932441282e1),
    (2, 1, 4, -0.316569643860730e2),
    (2, 2, 4, 0.442040358308000e2),
    (2, 3, 4, -0.111282734326413e2),
    (2, 0, 5, -0.262480156590992e1),
    (2, 1, 5, 0.704658803315449e1),
    (2, 2, 5, -0.792001547211682e1),
)
"""(i, j, k, g_ijk in J/kg), R13-08 Table 2; terms not listed are zero."""
