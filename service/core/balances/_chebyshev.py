"""Chebyshev-Lobatto collocation on one temperature interval.

A stage of a balance is integrated on N + 1 Chebyshev-Lobatto nodes of its
temperature interval. Property values at the nodes define polynomial
interpolants; differentiating and integrating those interpolants exactly gives
spectral accuracy (error falling faster than any power of 1/N for the analytic
property functions of IAPWS-95, R10-06 and R14-08), so the balances close to
round-off with a few dozen nodes.

Method: Trefethen, L. N., *Spectral Methods in MATLAB*, SIAM (2000), ch. 6
(differentiation) and ch. 12 (Clenshaw-Curtis quadrature); here the matrices are
built once per node count from numpy's Chebyshev series routines.

Not :mod:`service.core.properties.chebyshev`: that module fits piecewise tables on
first-kind points (no node at the interval ends) and evaluates them elsewhere; a
stage needs nodes at both ends (its start and end states) and acts on values at
the nodes with differentiation and cumulative-integration matrices, which the
table code has no use for.
"""

from __future__ import annotations

from dataclasses import dataclass
from functools import cache

import numpy as np
from numpy.polynomial import chebyshev

from service.core.properties.phase import FloatArray

__all__ = ["ChebyshevInterval", "reference_matrices"]


@dataclass(frozen=True)
class _ReferenceMatrices:
    """Matrices on [-1, 1] for nodes x_j = -cos(pi j / N), ascending."""

    nodes: FloatArray
    values_to_coefficients: FloatArray
    differentiation: FloatArray
    cumulative_integration: FloatArray


@cache
def reference_matrices(degree: int) -> _ReferenceMatrices:
    """Collocation matrices of the given polynomial degree (``degree + 1`` nodes).

    ``differentiation @ f`` gives the derivative of the interpolant at the nodes;
    ``cumulative_integration @ f`` gives its integral from -1 to each node.
    """
    nodes = -np.cos(np.pi * np.arange(degree + 1) / degree)
    vandermonde = chebyshev.chebvander(nodes, degree)
    to_coefficients = np.linalg.inv(vandermonde)
    identity = np.eye(degree + 1)
    derivative_coefficients = chebyshev.chebder(identity, axis=0)
    differentiation = chebyshev.chebvander(nodes, degree - 1) @ derivative_coefficients
    integral_coefficients = chebyshev.chebint(identity, lbnd=-1.0, axis=0)
    integration = chebyshev.chebvander(nodes, degree + 1) @ integral_coefficients
    return _ReferenceMatrices(
        nodes=nodes,
        values_to_coefficients=np.asarray(to_coefficients, dtype=np.float64),
        differentiation=np.asarray(differentiation @ to_coefficients, dtype=np.float64),
        cumulative_integration=np.asarray(integration @ to_coefficients, dtype=np.float64),
    )


@dataclass(frozen=True)
class ChebyshevInterval:
    """Chebyshev-Lobatto nodes on [lower, upper] with their calculus.

    Attributes
    ----------
    lower, upper : float
        Interval ends, K (``lower < upper``).
    degree : int
        Polynomial degree N; there are N + 1 nodes, the first at ``lower`` and
        the last at ``upper``.
    """

    lower: float
    upper: float
    degree: int

    @property
    def _matrices(self) -> _ReferenceMatrices:
        return reference_matrices(self.degree)

    @property
    def half_width(self) -> float:
        return 0.5 * (self.upper - self.lower)

    @property
    def nodes(self) -> FloatArray:
        """Node temperatures, ascending, K."""
        mid = 0.5 * (self.upper + self.lower)
        nodes = mid + self.half_width * self._matrices.nodes
        nodes[0] = self.lower
        nodes[-1] = self.upper
        return nodes

    def derivative(self, values: FloatArray) -> FloatArray:
        """Derivative of the interpolant of ``values`` at the nodes (last axis)."""
        return np.asarray(values @ self._matrices.differentiation.T / self.half_width)

    def integral_from_lower(self, values: FloatArray) -> FloatArray:
        """Integral of the interpolant from ``lower`` to each node (last axis)."""
        return np.asarray(values @ self._matrices.cumulative_integration.T * self.half_width)

    def integral(self, values: FloatArray) -> FloatArray:
        """Integral of the interpolant over the whole interval (last axis reduced)."""
        weights = self._matrices.cumulative_integration[-1]
        return np.asarray(values @ weights * self.half_width)

    def interpolate(self, values: FloatArray, temperature: FloatArray) -> FloatArray:
        """Evaluate the interpolant of ``values`` at temperatures inside the interval."""
        x = (temperature - 0.5 * (self.upper + self.lower)) / self.half_width
        coefficients = self._matrices.values_to_coefficients @ values
        return np.asarray(chebyshev.chebval(x, coefficients), dtype=np.float64)
