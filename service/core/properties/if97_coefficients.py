"""Coefficients of the IAPWS-IF97 equations for regions 1, 2 and 4 and the B23 boundary.

Source
------
IAPWS R7-97(2012), "Revised Release on the IAPWS Industrial Formulation 1997 for
the Thermodynamic Properties of Water and Steam" (Lucerne 2007, editorial revision
2012):

- Table 1: coefficients n1..n5 of the B23 boundary equations (Eqs. 5 and 6).
- Table 2: terms (I_i, J_i, n_i), i = 1..34, of the region 1 Gibbs free energy (Eq. 7).
- Table 10: terms (J0_i, n0_i), i = 1..9, of the ideal-gas part of region 2 (Eq. 16).
- Table 11: terms (I_i, J_i, n_i), i = 1..43, of the residual part of region 2 (Eq. 17).
- Table 34: coefficients n1..n10 of the saturation-pressure equation (Eqs. 30 and 31).
- Sec. 5.1, 6.1, 8.1 and Eq. 5: the reducing temperatures and pressures below.

The numbers are written as the release prints them (14 significant digits); they
were checked against the release's computer-program verification values (Tables 5,
15, 35 and 36) in tests/reference/test_if97_release_tables.py.
"""

from __future__ import annotations

from typing import Final

__all__ = [
    "B23_COEFFICIENTS",
    "REGION1_REDUCING_PRESSURE",
    "REGION1_REDUCING_TEMPERATURE",
    "REGION1_TERMS",
    "REGION2_IDEAL_TERMS",
    "REGION2_REDUCING_PRESSURE",
    "REGION2_REDUCING_TEMPERATURE",
    "REGION2_RESIDUAL_TERMS",
    "SATURATION_COEFFICIENTS",
]

REGION1_REDUCING_PRESSURE: Final = 16.53e6
"""p* of region 1, Pa (Eq. 7)."""

REGION1_REDUCING_TEMPERATURE: Final = 1386.0
"""T* of region 1, K (Eq. 7)."""

REGION2_REDUCING_PRESSURE: Final = 1.0e6
"""p* of region 2, Pa (Eq. 15)."""

REGION2_REDUCING_TEMPERATURE: Final = 540.0
"""T* of region 2, K (Eq. 15)."""

B23_COEFFICIENTS: Final[tuple[float, ...]] = (
    0.34805185628969e3,  # n1
    -0.11671859879975e1,  # n2
    0.10192970039326e-2,  # n3
    0.57254459862746e3,  # n4
    0.13918839778870e2,  # n5
)
"""Table 1: n1..n5 of the B23 equations, reduced with p* = 1 MPa and T* = 1 K."""

REGION1_TERMS: Final[tuple[tuple[int, int, float], ...]] = (
    (0, -2, 0.14632971213167),  # 1
    (0, -1, -0.84548187169114),  # 2
    (0, 0, -0.37563603672040e1),  # 3
    (0, 1, 0.33855169168385e1),  # 4
    (0, 2, -0.95791963387872),  # 5
    (0, 3, 0.15772038513228),  # 6
    (0, 4, -0.16616417199501e-1),  # 7
    (0, 5, 0.81214629983568e-3),  # 8
    (1, -9, 0.28319080123804e-3),  # 9
    (1, -7, -0.60706301565874e-3),  # 10
    (1, -1, -0.18990068218419e-1),  # 11
    (1, 0, -0.32529748770505e-1),  # 12
    (1, 1, -0.21841717175414e-1),  # 13
    (1, 3, -0.52838357969930e-4),  # 14
    (2, -3, -0.47184321073267e-3),  # 15
    (2, 0, -0.30001780793026e-3),  # 16
    (2, 1, 0.47661393906987e-4),  # 17
    (2, 3, -0.44141845330846e-5),  # 18
    (2, 17, -0.72694996297594e-15),  # 19
    (3, -4, -0.31679644845054e-4),  # 20
    (3, 0, -0.28270797985312e-5),  # 21
    (3, 6, -0.85205128120103e-9),  # 22
    (4, -5, -0.22425281908000e-5),  # 23
    (4, -2, -0.65171222895601e-6),  # 24
    (4, 10, -0.14341729937924e-12),  # 25
    (5, -8, -0.40516996860117e-6),  # 26
    (8, -11, -0.12734301741641e-8),  # 27
    (8, -6, -0.17424871230634e-9),  # 28
    (21, -29, -0.68762131295531e-18),  # 29
    (23, -31, 0.14478307828521e-19),  # 30
    (29, -38, 0.26335781662795e-22),  # 31
    (30, -39, -0.11947622640071e-22),  # 32
    (31, -40, 0.18228094581404e-23),  # 33
    (32, -41, -0.93537087292458e-25),  # 34
)
"""Table 2: (I_i, J_i, n_i) of the dimensionless Gibbs free energy of region 1."""

REGION2_IDEAL_TERMS: Final[tuple[tuple[int, float], ...]] = (
    (0, -0.96927686500217e1),  # 1
    (1, 0.10086655968018e2),  # 2
    (-5, -0.56087911283020e-2),  # 3
    (-4, 0.71452738081455e-1),  # 4
    (-3, -0.40710498223928),  # 5
    (-2, 0.14240819171444e1),  # 6
    (-1, -0.43839511319450e1),  # 7
    (2, -0.28408632460772),  # 8
    (3, 0.21268463753307e-1),  # 9
)
"""Table 10: (J0_i, n0_i) of the ideal-gas part of region 2."""

REGION2_RESIDUAL_TERMS: Final[tuple[tuple[int, int, float], ...]] = (
    (1, 0, -0.17731742473213e-2),  # 1
    (1, 1, -0.17834862292358e-1),  # 2
    (1, 2, -0.45996013696365e-1),  # 3
    (1, 3, -0.57581259083432e-1),  # 4
    (1, 6, -0.50325278727930e-1),  # 5
    (2, 1, -0.33032641670203e-4),  # 6
    (2, 2, -0.18948987516315e-3),  # 7
    (2, 4, -0.39392777243355e-2),  # 8
    (2, 7, -0.43797295650573e-1),  # 9
    (2, 36, -0.26674547914087e-4),  # 10
    (3, 0, 0.20481737692309e-7),  # 11
    (3, 1, 0.43870667284435e-6),  # 12
    (3, 3, -0.32277677238570e-4),  # 13
    (3, 6, -0.15033924542148e-2),  # 14
    (3, 35, -0.40668253562649e-1),  # 15
    (4, 1, -0.78847309559367e-9),  # 16
    (4, 2, 0.12790717852285e-7),  # 17
    (4, 3, 0.48225372718507e-6),  # 18
    (5, 7, 0.22922076337661e-5),  # 19
    (6, 3, -0.16714766451061e-10),  # 20
    (6, 16, -0.21171472321355e-2),  # 21
    (6, 35, -0.23895741934104e2),  # 22
    (7, 0, -0.59059564324270e-17),  # 23
    (7, 11, -0.12621808899101e-5),  # 24
    (7, 25, -0.38946842435739e-1),  # 25
    (8, 8, 0.11256211360459e-10),  # 26
    (8, 36, -0.82311340897998e1),  # 27
    (9, 13, 0.19809712802088e-7),  # 28
    (10, 4, 0.10406965210174e-18),  # 29
    (10, 10, -0.10234747095929e-12),  # 30
    (10, 14, -0.10018179379511e-8),  # 31
    (16, 29, -0.80882908646985e-10),  # 32
    (16, 50, 0.10693031879409),  # 33
    (18, 57, -0.33662250574171),  # 34
    (20, 20, 0.89185845355421e-24),  # 35
    (20, 35, 0.30629316876232e-12),  # 36
    (20, 48, -0.42002467698208e-5),  # 37
    (21, 21, -0.59056029685639e-25),  # 38
    (22, 53, 0.37826947613457e-5),  # 39
    (23, 39, -0.12768608934681e-14),  # 40
    (24, 26, 0.73087610595061e-28),  # 41
    (24, 40, 0.55414715350778e-16),  # 42
    (24, 58, -0.94369707241210e-6),  # 43
)
"""Table 11: (I_i, J_i, n_i) of the residual part of region 2."""

SATURATION_COEFFICIENTS: Final[tuple[float, ...]] = (
    0.11670521452767e4,  # n1
    -0.72421316703206e6,  # n2
    -0.17073846940092e2,  # n3
    0.12020824702470e5,  # n4
    -0.32325550322333e7,  # n5
    0.14915108613530e2,  # n6
    -0.48232657361591e4,  # n7
    0.40511340542057e6,  # n8
    -0.23855557567849,  # n9
    0.65017534844798e3,  # n10
)
"""Table 34: n1..n10 of the saturation equations, reduced with p* = 1 MPa and T* = 1 K."""
