"""Heat conduction inside the product: N radial nodes, finite volumes, method of lines.

The load is n identical items of one shape (slab heated on both faces, long cylinder,
sphere) of half-thickness or radius R; their total volume is V = M / rho. Nodes sit at
r_i = i R / (N - 1), i = 0 (the centre, the core) to N - 1 (the surface), each holding the
shell between the midpoints to its neighbours (a half shell at the centre and at the
surface). With the shape index b = 0, 1, 2 (slab, cylinder, sphere) the area of the
level surface at radius r, summed over the items, is

    A(r) = V (b + 1) r**b / R**(b + 1),

node i holds the volume fraction f_i = ((r_i + dr/2)**(b+1) - (r_i - dr/2)**(b+1)) / R**(b+1)
(clipped to [0, R]) of the product, and the heat flowing from node i to node i + 1 is

    q_i = k A(r_i + dr/2) (T_i - T_(i+1)) / dr,     dr = R / (N - 1).

Each node carries its own energy E_i and water m_i; its temperature comes from (E_i, m_i)
through the same equilibrium path as the lumped product
(:class:`~service.core.simulation.product_state.ProductThermodynamics`, with the node's
share f_i of the non-water heat capacity). Water evaporates at the surface, and liquid
water moves to the surface without resistance, so the water content stays uniform:
m_i = f_i m, each node giving up f_i j of liquid water at its own enthalpy h_l(T_i) to the
surface node, where it evaporates. The balances, with j_s evaporating at the surface and
j_i in the pores of node i (below; zero for a non-porous product), j = j_s + sum j_i:

    dE_i/dt = q_(i-1) - q_i - j_i h_v(T_i) - (f_i j - j_i) h_l(T_i)        (i < N - 1)
    dE_s/dt = q_(N-2) + sum_(i<N-1) (f_i j - j_i) h_l(T_i) + Q_gain(T_s) - h_v(T_s) j_s
    dm/dt = -j

so the conduction and moisture terms cancel in the sum: the product's total energy
E = sum E_i obeys the lumped balance dE/dt = Q_gain - h_v j exactly. The simulation
integrates E and m (the totals) and the interior nodes' energies; the surface node holds
what remains. Free moisture movement is one bound (a real product dries from its surface
inward; a thin surface layer alone could not supply the several per cent of the mass that
vacuum cooling evaporates). The companions (trays, racks) take the surface temperature.

Pores (optional, ``pore_venting_time`` tau): in a porous product (bread crumb, a lettuce
head) an interior node whose vapor pressure p_i exceeds the chamber pressure p boils, and
its vapor escapes through the pores to the chamber. Its energy above the boiling point,
to first order (p_i - p) / (dp_i/dE_i), leaves as latent heat with the time constant tau:

    j_i = (p_i - p) / (dp_i/dE_i) / (tau (h_v(T_i) - h_l(T_i)))  where p_i > p, else 0.

tau lumps the pores' resistance to the vapor: small tau holds every node near the boiling
point of the chamber pressure (free venting, the uniform product's behaviour), a large one
leaves conduction to carry the heat (a closed crumb). It is a stated model with no
published value for a given product: fit it to a logged core temperature (calibration).
Below the chamber's boiling point no vapor diffuses out of the pores.

The conductivity is one constant (the caller's, or Choi and Okos at the initial
temperature); only unfrozen nodes are followed: the simulation stops when ice appears in
any node.

References
----------
Finite-volume discretisation of radial conduction (vertex-centred nodes, half control
volumes at the boundaries): Patankar, S. V., *Numerical Heat Transfer and Fluid Flow*,
Hemisphere (1980), ch. 4 (from memory). Method of lines with a stiff integrator:
Schiesser, W. E., *The Numerical Method of Lines*, Academic Press (1991) (from memory).
"""

from __future__ import annotations

from collections.abc import Sequence
from typing import Final

import numpy as np

from service.core.properties.phase import FloatArray
from service.core.simulation.inputs import InteriorGeometry, Product
from service.core.simulation.path_tables import path_tables
from service.core.simulation.product_conductivity import (
    composition_conductivity,
    composition_density,
)
from service.core.simulation.product_state import ProductState, ProductThermodynamics

__all__ = ["SHAPE_INDEX", "InteriorConduction", "InteriorGrid"]

SHAPE_INDEX: Final[dict[str, int]] = {"slab": 0, "cylinder": 1, "sphere": 2}
"""b in A(r) ~ r**b: slab 0, cylinder 1, sphere 2."""


class InteriorGrid:
    """The dimensionless radial grid of one shape (no material, no size).

    Parameters
    ----------
    geometry : {"slab", "cylinder", "sphere"}
    nodes : int
        N >= 3, from the centre (0) to the surface (N - 1).

    Attributes
    ----------
    positions : ndarray
        r_i / R, shape (N,).
    fractions : ndarray
        Volume fraction f_i of each node, shape (N,); sums to 1.
    face_factors : ndarray
        (b + 1) (r_f / R)**b / (dr / R) at the N - 1 faces between nodes: the heat flow
        from node i to i + 1 is k V / R**2 times this times (T_i - T_(i+1)).
    surface_factor : float
        b + 1: the surface area of the items is V (b + 1) / R.
    """

    def __init__(self, geometry: InteriorGeometry, nodes: int) -> None:
        shape = SHAPE_INDEX[geometry]
        step = 1.0 / (nodes - 1)
        self.positions = np.linspace(0.0, 1.0, nodes)
        bounds = np.clip(np.concatenate([[0.0], self.positions[:-1] + 0.5 * step, [1.0]]), 0, 1)
        power = shape + 1
        self.fractions = np.diff(bounds**power)
        faces = bounds[1:-1]
        self.face_factors = power * faces**shape / step
        self.surface_factor = float(power)


class InteriorConduction:
    """The interior nodes of one product: their thermodynamics and their conduction.

    Parameters
    ----------
    product : Product
        Validated, with ``product.interior`` set.
    water_mass : float
        kg of water in the product.
    solids_coefficients : tuple of float
        (c1, c2, c3) of the product's non-water sensible heat S(tau), J.
    companion_capacity : float
        J/K of the companions, which take the surface temperature.
    """

    def __init__(
        self,
        product: Product,
        water_mass: float,
        solids_coefficients: tuple[float, float, float],
        companion_capacity: float,
    ) -> None:
        interior = product.interior
        assert interior is not None
        self.grid = InteriorGrid(interior.geometry, interior.nodes)
        self.location = interior.target_applies_to
        fractions = None if product.composition is None else product.composition.fractions()
        if interior.thermal_conductivity is not None:
            self.conductivity = interior.thermal_conductivity
        else:
            assert fractions is not None
            self.conductivity = composition_conductivity(fractions, product.initial_temperature)
        if interior.density is not None:
            self.density = interior.density
        else:
            assert fractions is not None
            self.density = composition_density(fractions, product.initial_temperature)
        self.size = interior.half_thickness_or_radius
        self.venting_time = interior.pore_venting_time
        self.volume = product.mass / self.density
        self.surface_area = self.volume * self.grid.surface_factor / self.size
        scale = self.conductivity * self.volume / (self.size * self.size)
        self.conductances = scale * self.grid.face_factors
        fractions_by_node = self.grid.fractions
        self.node_water = water_mass * fractions_by_node
        self.surface_share = float(fractions_by_node[-1])
        """f_s: the surface node's share of the water (and of the evaporation)."""
        self._liquid = path_tables().liquid
        c1, c2, c3 = solids_coefficients
        self.nodes: list[ProductThermodynamics] = []
        for index, share in enumerate(fractions_by_node):
            extra = companion_capacity if index == fractions_by_node.size - 1 else 0.0
            self.nodes.append(
                ProductThermodynamics((share * c1 + extra, share * c2, share * c3), None)
            )
        self._guesses = [product.initial_temperature] * fractions_by_node.size

    @property
    def count(self) -> int:
        """N, the number of nodes."""
        return len(self.nodes)

    def initial_energies(self, temperature: float) -> FloatArray:
        """E_i of every node at a uniform ``temperature`` (K), J."""
        liquid = path_tables().liquid.values(temperature)[0]
        return np.array(
            [
                self.node_water[index] * liquid + node.sensible(temperature)[0]
                for index, node in enumerate(self.nodes)
            ]
        )

    def start_from(self, temperature: float) -> None:
        """Start every node's Newton iteration from ``temperature`` (K)."""
        self._guesses = [temperature] * self.count

    def states(
        self, total_energy: float, total_water: float, interior_energies: Sequence[float]
    ) -> list[ProductState]:
        """The N node states from the totals and the N - 1 interior energies (J, kg)."""
        found: list[ProductState] = []
        surface_energy = total_energy - float(sum(interior_energies))
        shares = self.grid.fractions
        for index, node in enumerate(self.nodes):
            last = index == self.count - 1
            energy = surface_energy if last else float(interior_energies[index])
            state = node.state(energy, float(shares[index]) * total_water, self._guesses[index])
            self._guesses[index] = state.temperature
            found.append(state)
        return found

    def heat_flows(self, temperatures: FloatArray) -> FloatArray:
        """Net conduction into each node, W (sums to zero), shape (N,)."""
        flows = self.conductances * (temperatures[:-1] - temperatures[1:])
        net = np.zeros(temperatures.size)
        net[:-1] -= flows
        net[1:] += flows
        return net

    def liquid_enthalpies(self, temperatures: FloatArray) -> FloatArray:
        """h_l(T_i) of the liquid water in each node, J/kg (IAPWS-95 path tables)."""
        return np.array([self._liquid.values(float(t))[0] for t in temperatures])

    def pore_evaporation(self, states: Sequence[ProductState], pressure: float) -> FloatArray:
        """kg/s of vapor leaving each interior node through the pores (zeros without a
        venting time), at chamber pressure ``pressure`` (Pa).

        A node boils where its vapor pressure p_i exceeds the chamber's; the energy above
        its boiling point, (p_i - p) / (dp_i/dE_i) to first order, leaves as latent heat
        over the venting time tau: j_i = (p_i - p) / (dp_i/dE_i) / (tau (h_v - h_l)).
        """
        rates = np.zeros(len(states))
        if self.venting_time is None:
            return rates
        for index, state in enumerate(states):
            excess = state.equilibrium_pressure - pressure
            if excess > 0.0 and state.pressure_by_energy > 0.0:
                liquid = float(self._liquid.values(state.temperature)[0])
                latent = state.vapor_enthalpy - liquid
                rates[index] = excess / state.pressure_by_energy / (self.venting_time * latent)
        return rates

    def mean_temperature(self, temperatures: FloatArray) -> float:
        """Volume-mean temperature sum f_i T_i, K."""
        return float(np.dot(self.grid.fractions, temperatures))

    def biot_number(self, coefficient: float) -> float:
        """h R / k for a surface heat-transfer coefficient ``coefficient`` (W/(m2 K))."""
        return coefficient * self.size / self.conductivity
