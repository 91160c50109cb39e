"""Piecewise Chebyshev tables: fit once, evaluate many points fast.

A smooth function of one variable, possibly with several outputs, is fitted on
an interval split into equal segments, each carrying a Chebyshev series of
fixed degree. Evaluation finds the segment of every point directly (no search:
``floor((x - lower) / width)``) and sums the series with Clenshaw's recurrence,
all vectorized over points and outputs; one point is summed with the same recurrence
on Python floats, which avoids numpy's per-call cost and gives bit-identical
results. An optional monotone variable transform
(for example ``x = ln(T_c - T)``) turns functions that are steep in the
physical variable into smooth ones in the fitted variable.

This is the idea of the IAPWS spline-based table look-up method (IAPWS G13-15,
"Guideline on the Fast Calculation of Steam and Water Properties with the
Spline-Based Table Look-Up Method (SBTL)"), with Chebyshev series in place of
splines.
"""

from __future__ import annotations

import math
from collections.abc import Callable
from dataclasses import dataclass
from functools import cached_property

import numpy as np
from numpy.typing import ArrayLike, NDArray

from service.core.properties.phase import FloatArray

__all__ = ["PiecewiseChebyshev", "fit_piecewise_chebyshev"]

Transform = Callable[[FloatArray], FloatArray]
IndexArray = NDArray[np.intp]


@dataclass(frozen=True)
class PiecewiseChebyshev:
    """A vector-valued function tabulated as piecewise Chebyshev series.

    Attributes
    ----------
    lower, upper : float
        Interval of the fitted variable x covered by the table.
    coefficients : ndarray, shape (degree + 1, outputs, segments)
        Chebyshev coefficients of every output on every segment, in the local
        variable t in [-1, 1] of the segment.
    derivative_coefficients : ndarray, shape (degree, outputs, segments)
        Coefficients of d/dx (already scaled by the segment width).
    transform : callable or None
        Map from the caller's variable to x; ``None`` for the identity.
    """

    lower: float
    upper: float
    coefficients: FloatArray
    derivative_coefficients: FloatArray
    transform: Transform | None = None

    @property
    def segment_count(self) -> int:
        """Number of equal segments of [lower, upper]."""
        return int(self.coefficients.shape[2])

    @property
    def output_count(self) -> int:
        """Number of tabulated outputs."""
        return int(self.coefficients.shape[1])

    def fitted_variable(self, value: ArrayLike) -> FloatArray:
        """Return x = transform(value) as a float array."""
        array = np.asarray(value, dtype=np.float64)
        return array if self.transform is None else self.transform(array)

    def _locate(self, x: FloatArray) -> tuple[IndexArray, FloatArray]:
        """Flat indices into the (outputs, segments) planes, shape (outputs, points),
        and the local coordinate t in [-1, 1] of every point."""
        count = self.segment_count
        width = (self.upper - self.lower) / count
        position = (x.ravel() - self.lower) / width
        segment = np.clip(np.floor(position), 0, count - 1)
        local = 2.0 * (position - segment) - 1.0
        index = segment.astype(np.intp) + self._plane_offsets
        return index, local

    @property
    def _plane_offsets(self) -> IndexArray:
        offsets: IndexArray = (self.segment_count * np.arange(self.output_count))[:, None]
        return offsets

    @staticmethod
    def _clenshaw(coefficients: FloatArray, index: IndexArray, local: FloatArray) -> FloatArray:
        """Sum the series with Clenshaw's recurrence; result shape (outputs, points).

        Coefficients are laid out (degree + 1, outputs, segments): every step
        gathers one plane with a flat index and works on contiguous
        (outputs, points) buffers in place.
        """
        degree = coefficients.shape[0] - 1
        flat = coefficients.reshape(degree + 1, -1)
        if degree == 0:
            only: FloatArray = np.take(flat[0], index)
            return only
        twice = 2.0 * local
        b1 = np.take(flat[degree], index)
        b2 = np.zeros_like(b1)
        b0 = np.empty_like(b1)
        gathered = np.empty_like(b1)
        for k in range(degree - 1, 0, -1):
            np.multiply(b1, twice, out=b0)
            b0 -= b2
            np.take(flat[k], index, out=gathered, mode="clip")
            b0 += gathered
            b0, b1, b2 = b2, b0, b1
        np.multiply(b1, local, out=b0)
        b0 -= b2
        np.take(flat[0], index, out=gathered, mode="clip")
        b0 += gathered
        return b0

    @cached_property
    def _segment_series(self) -> tuple[list[list[list[float]]], list[list[list[float]]]]:
        """Per segment and output, the value and derivative series as Python floats."""
        return (
            self.coefficients.transpose(2, 1, 0).tolist(),
            self.derivative_coefficients.transpose(2, 1, 0).tolist(),
        )

    def _one_point(self, x: float, series: list[list[list[float]]]) -> list[float]:
        """Clenshaw's recurrence at one fitted x on Python floats.

        The operations and their order are those of :meth:`_locate` and
        :meth:`_clenshaw`, so the results equal the vectorized ones bit for bit. A
        non-finite x (callers validate first) gives NaN for every output.
        """
        count = self.segment_count
        width = (self.upper - self.lower) / count
        position = (x - self.lower) / width
        if not math.isfinite(position):
            return [math.nan] * len(series[0])
        segment = min(max(float(math.floor(position)), 0.0), float(count - 1))
        local = 2.0 * (position - segment) - 1.0
        twice = 2.0 * local
        results = []
        for row in series[int(segment)]:
            degree = len(row) - 1
            if degree == 0:
                results.append(row[0])
                continue
            b1 = row[degree]
            b2 = 0.0
            for k in range(degree - 1, 0, -1):
                b1, b2 = b1 * twice - b2 + row[k], b1
            results.append(b1 * local - b2 + row[0])
        return results

    def at_point(self, value: float) -> list[float]:
        """Evaluate all outputs at one point of the caller's variable, as Python floats.

        Equal bit for bit to ``self(value)``; for callers that work on one state.
        """
        x = float(self.fitted_variable(value))
        return self._one_point(x, self._segment_series[0])

    def __call__(self, value: ArrayLike) -> FloatArray:
        """Evaluate all outputs at ``value``.

        Parameters
        ----------
        value : array_like
            Points in the caller's variable (transformed by ``transform``).
            Points outside the table are extrapolated from the end segments;
            callers validate their range first.

        Returns
        -------
        ndarray, shape (outputs,) + value.shape
        """
        x = self.fitted_variable(value)
        if x.size == 1:
            one = self._one_point(float(x.reshape(-1)[0]), self._segment_series[0])
            return np.array(one).reshape((self.output_count, *x.shape))
        index, local = self._locate(x)
        result = self._clenshaw(self.coefficients, index, local)
        return result.reshape((self.output_count, *x.shape))

    def derivative(self, value: ArrayLike) -> FloatArray:
        """Evaluate d(output)/dx at ``value``, x being the fitted variable.

        With a transform, the derivative with respect to the caller's variable
        is this times dx/d(value) (chain rule), left to the caller.

        Returns
        -------
        ndarray, shape (outputs,) + value.shape
        """
        x = self.fitted_variable(value)
        if x.size == 1:
            one = self._one_point(float(x.reshape(-1)[0]), self._segment_series[1])
            return np.array(one).reshape((self.output_count, *x.shape))
        index, local = self._locate(x)
        result = self._clenshaw(self.derivative_coefficients, index, local)
        return result.reshape((self.output_count, *x.shape))


def _derivative_series(coefficients: FloatArray, half_width: float) -> FloatArray:
    """Chebyshev coefficients of the derivative along axis 0, scaled by 1/half_width."""
    degree = coefficients.shape[0] - 1
    result = np.zeros((max(degree, 1), *coefficients.shape[1:]))
    if degree == 0:
        return result
    # c'_{k-1} = c'_{k+1} + 2 k c_k, then c'_0 halved.
    following = np.zeros(coefficients.shape[1:])
    current = np.zeros(coefficients.shape[1:])
    for k in range(degree, 0, -1):
        value = following + 2.0 * k * coefficients[k]
        result[k - 1] = value
        following, current = current, value
    result[0] *= 0.5
    scaled: FloatArray = result / half_width
    return scaled


def fit_piecewise_chebyshev(
    function: Callable[[FloatArray], FloatArray],
    lower: float,
    upper: float,
    *,
    segment_count: int,
    degree: int,
    transform: Transform | None = None,
    inverse_transform: Transform | None = None,
) -> PiecewiseChebyshev:
    """Fit a vectorized function by piecewise Chebyshev interpolation.

    Parameters
    ----------
    function : callable
        Takes a 1-D float array of points in the caller's variable and returns
        an array of shape (outputs, points) (or (points,) for one output).
    lower, upper : float
        Interval in the fitted variable x (``lower < upper``).
    segment_count : int
        Number of equal segments, >= 1.
    degree : int
        Degree of the series on every segment, >= 0.
    transform, inverse_transform : callable, optional
        Monotone map from the caller's variable to x and its inverse; give both
        or neither. ``function`` is called at ``inverse_transform(x)``.

    Returns
    -------
    PiecewiseChebyshev

    Notes
    -----
    On each segment the series interpolates the function at the degree + 1
    Chebyshev points of the first kind, t_j = cos(pi (j + 1/2) / n), with
    coefficients c_k = (2 / n) sum_j f(t_j) cos(pi k (j + 1/2) / n) (c_0 halved).
    For analytic functions the error falls geometrically with the degree.

    References
    ----------
    L. N. Trefethen, Approximation Theory and Approximation Practice, SIAM
    (2013), chapters 3 and 8. IAPWS G13-15 (SBTL) for the table look-up idea.

    Examples
    --------
    >>> table = fit_piecewise_chebyshev(np.exp, 0.0, 1.0, segment_count=4, degree=12)
    >>> bool(abs(table(0.3)[0] - np.exp(0.3)) < 1e-14)
    True
    """
    if segment_count < 1 or degree < 0 or not upper > lower:
        raise ValueError("need segment_count >= 1, degree >= 0 and upper > lower")
    if (transform is None) != (inverse_transform is None):
        raise ValueError("give both transform and inverse_transform, or neither")
    count = degree + 1
    order = np.arange(count)
    angles = np.pi * (order + 0.5) / count
    nodes = np.cos(angles)
    width = (upper - lower) / segment_count
    starts = lower + width * np.arange(segment_count)
    x = (starts[:, None] + 0.5 * width * (nodes[None, :] + 1.0)).ravel()
    points = x if inverse_transform is None else inverse_transform(x)
    values = np.asarray(function(points), dtype=np.float64)
    if values.ndim == 1:
        values = values[None, :]
    outputs = values.shape[0]
    samples = values.reshape(outputs, segment_count, count)
    basis = np.cos(np.multiply.outer(order, angles)) * (2.0 / count)
    basis[0] *= 0.5
    coefficients = np.einsum("kj,osj->kos", basis, samples)
    return PiecewiseChebyshev(
        lower=float(lower),
        upper=float(upper),
        coefficients=np.ascontiguousarray(coefficients),
        derivative_coefficients=np.ascontiguousarray(_derivative_series(coefficients, 0.5 * width)),
        transform=transform,
    )
