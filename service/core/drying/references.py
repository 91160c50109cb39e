"""What the primary-drying answers state about their models: references and assumptions."""

from __future__ import annotations

from typing import Final

__all__ = ["ASSUMPTIONS", "REFERENCES"]

REFERENCES: Final = (
    "Container heat transfer Q = A_v K_v(P_c) (T_shelf - T_bottom) with "
    "K_v = K_C + K_P P_c / (1 + K_D P_c): M. J. Pikal, M. L. Roy, S. Shah, 'Mass and heat "
    "transfer in vial freeze-drying of pharmaceuticals: role of the vial', J. Pharm. Sci. "
    "73(9), 1224-1237 (1984).",
    "Dried-layer resistance R_p(l) = R_0 + A_1 l / (1 + A_2 l), sublimation rate "
    "A_p (p_ice(T_front) - P_c) / R_p, and the quasi-steady heat and mass balance of the "
    "vial: M. J. Pikal, 'Use of laboratory data in freeze drying process design: heat and "
    "mass transfer coefficients and the computer simulation of freeze drying', J. Parenter. "
    "Sci. Technol. 39(3), 115-139 (1985).",
    "Choice of shelf temperature and chamber pressure against the collapse temperature and "
    "the dryer's capacity: X. Tang, M. J. Pikal, 'Design of freeze-drying processes for "
    "pharmaceuticals: practical advice', Pharm. Res. 21(2), 191-200 (2004).",
    "Design space of primary drying as the region of shelf temperature and chamber "
    "pressure keeping the product below its limit: S. A. Giordano, A. A. Barresi, "
    "D. Fissore, 'On the use of mathematical models to build the design space for the "
    "primary drying phase of a pharmaceutical lyophilization process', J. Pharm. Sci. "
    "100(1), 311-324 (2011).",
    "Ice vapor pressure IAPWS R14-08(2011) eq. (6); enthalpy of sublimation h_vapor - h_ice "
    "from IAPWS R10-06(2009) ice and IAPWS-95 vapor at the front temperature (tabulated "
    "once per process to about 1e-14 relative).",
)

ASSUMPTIONS: Final = (
    "Quasi-steady state: the heat reaching the ice front is used only to sublime ice (no "
    "sensible heat of the frozen layer, which follows the shelf instantly).",
    "One-dimensional: a flat ice front recedes from the top of the frozen layer downwards; "
    "heat enters only through the container bottom (K_v lumps contact, gas conduction and "
    "radiation, as measured for the container and dryer), none through the side walls.",
    "All the water of the fill is ice at the start of primary drying (unfrozen water and "
    "secondary drying are not modelled); the fill depth is the fill volume over the inner "
    "area; the frozen layer conducts with one thermal conductivity.",
    "The chamber pressure is the total pressure over the dried layer and equals the vapor "
    "pressure at its top; every container in the batch behaves alike (no edge vials).",
    "The collapse check uses the ice-front temperature, the product temperature next to "
    "the dried layer; the bottom temperature (what a thermocouple reads) is reported too.",
    "While the chamber pressure is at or above the ice's vapor pressure at the shelf "
    "temperature (e.g. at the start of a shelf ramp) nothing sublimes and the product sits "
    "at the shelf temperature (no condensation onto the product is modelled).",
    "K_v and R_p are the client's measured constants; the answer is as good as they are.",
)
