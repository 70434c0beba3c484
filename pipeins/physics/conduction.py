"""Conduction through a layer whose conductivity depends on temperature.

The conductivity of an insulation material is published at a few mean temperatures.
We fit those points with a polynomial in temperature (°C) of degree
``min(2, number of points - 1)`` by least squares, valid over the material's usable
range; outside that range the conductivity is held at its value at the nearer end.

Heat flow through a layer then follows from the Kirchhoff transform.  With the
potential :math:`\\Theta(T) = \\int_0^T k(\\tau)\\,d\\tau` [W/m], the steady heat flow
through a layer between temperatures :math:`T_1` (inner face) and :math:`T_2` (outer
face) is, exactly for any k(T),

.. math::

    q' = \\frac{2\\pi\\,[\\Theta(T_1) - \\Theta(T_2)]}{\\ln(r_2 / r_1)}
    \\quad\\text{(cylinder, W/m)}, \\qquad
    q'' = \\frac{\\Theta(T_1) - \\Theta(T_2)}{L} \\quad\\text{(flat, W/m}^2).

Reference: Carslaw and Jaeger, *Conduction of Heat in Solids*, 2nd ed. (1959), §1.7
(the Kirchhoff transformation); ASTM C680-19, §7 uses the same integral of k(T).
A constant conductivity is the one-point case, where :math:`\\Theta = kT`.
"""

from __future__ import annotations

import functools
import math
from dataclasses import dataclass

import numpy as np

__all__ = ["Conductivity", "conductivity_of", "cylinder_shape_m", "critical_radius_m", "polyfit"]


@dataclass(frozen=True)
class Conductivity:
    """k(T) = c0 + c1·T + c2·T² [W/(m·K)], T in °C, held constant outside [t_lo_c, t_hi_c].

    >>> k = Conductivity.constant(0.040)
    >>> float(k.potential(100.0) - k.potential(20.0))
    3.2
    >>> k = Conductivity.from_points([(10, 0.033), (50, 0.037), (100, 0.043)], -20, 250)
    >>> round(float(k.conductivity(50.0)), 4)
    0.037
    """

    coefficients: tuple[float, float, float]
    t_lo_c: float
    t_hi_c: float

    @classmethod
    def constant(cls, k_w_mk: float) -> "Conductivity":
        return cls((float(k_w_mk), 0.0, 0.0), -273.15, 5000.0)

    @classmethod
    def from_points(cls, points, t_lo_c: float, t_hi_c: float) -> "Conductivity":
        """Least-squares polynomial through (mean temperature °C, k W/(m·K)) points.

        The degree is ``min(2, n - 1)``; if the quadratic is not positive over the range
        the degree drops to a straight line, which keeps k(T) > 0 for catalogue data.
        """
        pts = np.asarray(points, dtype=float).reshape(-1, 2)
        if len(pts) == 1:
            return cls.constant(pts[0, 1])
        lo, hi = float(t_lo_c), float(t_hi_c)
        for degree in range(min(2, len(pts) - 1), 0, -1):
            c = polyfit(pts[:, 0], pts[:, 1], degree)
            c = tuple(float(x) for x in np.pad(c, (0, 3 - len(c))))
            fit = cls(c, lo, hi)
            if np.all(fit.conductivity(np.linspace(lo, hi, 200)) > 0):
                return fit
        raise ValueError(f"conductivity points {points} give no positive fit over {lo} to {hi} °C")

    def conductivity(self, temp_c):
        """k at *temp_c* [W/(m·K)]."""
        c0, c1, c2 = self.coefficients
        t = np.clip(temp_c, self.t_lo_c, self.t_hi_c)
        return c0 + t * (c1 + t * c2)

    def _poly_potential(self, t):
        c0, c1, c2 = self.coefficients
        return t * (c0 + t * (c1 / 2 + t * c2 / 3))

    def potential(self, temp_c):
        """Kirchhoff potential Θ(T) = ∫₀ᵀ k dτ [W/m] (k held at the range ends outside it)."""
        t = np.asarray(temp_c, dtype=float)
        inside = np.clip(t, self.t_lo_c, self.t_hi_c)
        below = np.minimum(t - self.t_lo_c, 0.0) * self._end_k[0]
        above = np.maximum(t - self.t_hi_c, 0.0) * self._end_k[1]
        return self._poly_potential(inside) + below + above

    @functools.cached_property
    def _end_k(self) -> tuple[float, float]:
        return float(self.conductivity(self.t_lo_c)), float(self.conductivity(self.t_hi_c))

    @property
    def is_constant(self) -> bool:
        """True when k does not depend on temperature (then Θ = k·T exactly)."""
        return self.coefficients[1] == 0.0 and self.coefficients[2] == 0.0

    def potential_and_conductivity(self, temp_c):
        """Θ(T) [W/m] and k(T) [W/(m·K)] together (one clip; same values as
        :meth:`potential` and :meth:`conductivity`)."""
        c0, c1, c2 = self.coefficients
        t = np.asarray(temp_c, dtype=float)
        inside = np.clip(t, self.t_lo_c, self.t_hi_c)
        k_end = np.where(t < self.t_lo_c, self._end_k[0], self._end_k[1])
        theta = inside * (c0 + inside * (c1 / 2 + inside * c2 / 3)) + (t - inside) * k_end
        return theta, c0 + inside * (c1 + inside * c2)

    #: Nodes of the uniform grid in Θ used by :meth:`temperature` for its first guess.
    INVERSE_GRID_POINTS = 16385

    @functools.cached_property
    def _inverse_grid(self) -> tuple[float, float, np.ndarray, np.ndarray]:
        """(Θ at the first node, cells per unit of Θ, T at the nodes, T step per cell):
        T(Θ) on a grid uniform in Θ over the fitted range, built once per material."""
        th_lo, th_hi = (float(x) for x in self.potential(np.array([self.t_lo_c, self.t_hi_c])))
        theta = np.linspace(th_lo, th_hi, self.INVERSE_GRID_POINTS)
        fine = np.linspace(self.t_lo_c, self.t_hi_c, 8 * self.INVERSE_GRID_POINTS)
        t = np.interp(theta, self.potential(fine), fine)
        for _ in range(3):  # Newton polish to machine precision (Θ' = k > 0)
            th, k = self.potential_and_conductivity(t)
            t = np.clip(t - (th - theta) / k, self.t_lo_c, self.t_hi_c)
        t[0], t[-1] = self.t_lo_c, self.t_hi_c
        step = (th_hi - th_lo) / (self.INVERSE_GRID_POINTS - 1)
        return th_lo, 1.0 / step, t, np.diff(t)

    def temperature(self, potential_w_per_m):
        """Inverse of :meth:`potential`: the temperature [°C] whose potential is given.

        A first guess by index arithmetic on a grid uniform in Θ (no search), then one
        Newton step on the cubic Θ(T): the guess is within about 1e-5 K (linear
        interpolation on 16384 cells), so the step lands within rounding of the root
        (Newton's error goes as |k'/2k|·e²).  Outside the fitted range Θ is linear, and the
        step from the range end is exact.

        >>> k = Conductivity.from_points([(10, 0.033), (50, 0.037), (100, 0.043)], -20, 250)
        >>> float(k.temperature(k.potential(123.4)))
        123.4
        """
        return self.temperature_and_conductivity(potential_w_per_m)[0]

    def temperature_and_conductivity(self, potential_w_per_m):
        """:meth:`temperature` [°C], and k [W/(m·K)] at the Newton step's start (within
        about 1e-5 K of it: enough for a derivative)."""
        theta = np.asarray(potential_w_per_m, dtype=float)
        if self.is_constant:
            return theta / self.coefficients[0], np.full(theta.shape, self.coefficients[0])
        th0, per_unit, nodes, steps = self._inverse_grid
        g = (theta - th0) * per_unit  # position on the grid, in cells
        cell = np.clip(g, 0.0, len(nodes) - 2.0).astype(np.intp)
        # Linear in the cell (extrapolated from the end cells outside the grid, where the
        # Newton step below is exact because Θ is linear there).
        guess = nodes[cell] + steps[cell] * (g - cell)
        th, k = self.potential_and_conductivity(guess)
        return guess - (th - theta) / k, k


def polyfit(x, y, degree: int) -> np.ndarray:
    """Least-squares polynomial coefficients, lowest power first: the arithmetic of
    ``numpy.polynomial.polynomial.polyfit(x, y, degree)`` step by step (Vandermonde matrix,
    columns scaled to unit norm, ``numpy.linalg.lstsq`` with ``rcond = len(x)·eps``), so the
    same coefficients to the last bit, without importing :mod:`numpy.polynomial` (its eight
    modules cost a few milliseconds of every command's start-up)."""
    x = np.asarray(x) + 0.0
    y = np.asarray(y) + 0.0
    v = np.empty((degree + 1,) + x.shape, dtype=x.dtype)
    v[0] = x * 0 + 1
    if degree > 0:
        v[1] = x
        for i in range(2, degree + 1):
            v[i] = v[i - 1] * x
    lhs = np.moveaxis(v, 0, -1).T
    rhs = y.T
    scl = np.sqrt(np.square(lhs).sum(1))
    scl[scl == 0] = 1
    c, _, rank, _ = np.linalg.lstsq(lhs.T / scl, rhs.T, len(x) * np.finfo(x.dtype).eps)
    c = (c.T / scl).T
    if rank != degree + 1:
        import warnings

        warnings.warn("The fit may be poorly conditioned", np.exceptions.RankWarning, stacklevel=2)
    return c


@functools.cache
def _conductivity_cached(points: tuple, t_lo_c: float, t_hi_c: float) -> Conductivity:
    return Conductivity.from_points(points, t_lo_c, t_hi_c)


def conductivity_of(material) -> Conductivity:
    """The fitted k(T) of a catalogue material (anything with ``points``, ``min_temp_c``,
    ``max_temp_c``), computed once per material."""
    return _conductivity_cached(tuple(map(tuple, material.points)), float(material.min_temp_c),
                                float(material.max_temp_c))


def cylinder_shape_m(inner_radius_m, outer_radius_m):
    """ln(r2/r1)/(2π) [-]: the per-metre conduction factor of a cylindrical shell, so that
    q' = ΔΘ / factor (for a flat layer the factor is its thickness in metres)."""
    return np.log(np.asarray(outer_radius_m) / np.asarray(inner_radius_m)) / (2 * math.pi)


def critical_radius_m(conductivity_w_mk, outer_coefficient_w_m2k):
    """Critical insulation radius r_c = k/h [m] (Incropera et al., 6th ed., Eq. 3.56).

    Below r_c, adding insulation to a cylinder raises its heat flow.

    >>> round(float(critical_radius_m(0.055, 5.0)) * 1000, 1)
    11.0
    """
    return np.asarray(conductivity_w_mk) / np.asarray(outer_coefficient_w_m2k)
