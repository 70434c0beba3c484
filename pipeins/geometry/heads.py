"""Vessel heads: flat, 2:1 ellipsoidal, hemispherical and torispherical (10 % knuckle).

A head closes a cylindrical shell of diameter D [m]; here D is the diameter of the surface
the head is measured on (the vessel's outside diameter for insulation, its inside
diameter for the contents).  Every dished head is a convex surface of revolution that
meets the shell tangentially, so its unit normals sweep a hemisphere (∫K dA = 2π).  The
surface parallel to it at a distance s (the outer face of insulation s thick, or the bore
at s = −wall) then has, by Steiner's formula for parallel surfaces (exact; do Carmo,
*Differential Geometry of Curves and Surfaces* (1976), §3-5, from memory),

    A(s) = A₀ + 2 M s + 2π s²

with A₀ the head's area and M = ∫H dA its integrated mean curvature (H = (k₁ + k₂)/2).
Writing ρ = M/(2π) and δ² = ρ² − A₀/(2π), A(s) = 2π[(ρ + s)² − δ²].

**Conduction through an insulated dished head** (the approximation): the isotherms are
taken as the parallel surfaces, so each layer between s₁ and s₂ is a one-dimensional
resistance R = F/k with

    F = ∫ ds / A(s) = t / (2π(u₁u₂ − δ²)) · artanh(x)/x,   u = ρ + s,
    x = δ t / (u₁u₂ − δ²),   t = s₂ − s₁   [1/m].

It is exact for a hemisphere (δ = 0: F = (1/u₁ − 1/u₂)/(2π), half a sphere) and, like the
geometric-mean-area rule of spherical shells, near t/√(A₁A₂) for the others; it neglects
the heat the shell's insulation exchanges with the head's across the tangent line.

**Flat heads** are plane layers (:class:`~pipeins.geometry.plane.Plane`) weighted by the
outer face's area π(D/2 + T)² at a total thickness T: the shell's insulation is taken to
run on over the head's edge, and counting the corner ring on the outer area overstates the
loss a little (on the safe side for heat loss; common practice).

**Outer film** (the correlation key the head's patch uses): a flat head is a horizontal
plate facing up (``"top"``) or down (``"bottom"``) on a vertical vessel, with the
length area/perimeter = D/4, and a vertical plate of height D on a horizontal vessel; a
dished or hemispherical head takes the sphere's correlations on its outer diameter
D + 2T in either orientation.

Shapes (dimensionless on D; from memory, checked against ``fluids.geometry`` in the tests):

- ``"2:1"`` ellipsoidal: half an oblate spheroid of semi-axes D/2 and D/4; depth D/4;
  area ≈ 1.084 D² (exact: πa² + πc²/(2e)·ln((1+e)/(1−e)), e² = 1 − c²/a²); volume π D³/24.
- ``"hemispherical"``: depth D/2, area π D²/2, volume π D³/12.
- ``"torispherical"``: crown radius 1.0 D, knuckle radius 0.1 D (the 10 % knuckle form of
  DIN 28011, from memory); depth ≈ 0.194 D.
- ``"flat"``: depth 0, area π D²/4, volume 0.
"""

from __future__ import annotations

import functools
import math
from dataclasses import dataclass
from typing import Any

import numpy as np

from ..errors import InputError
from .base import Network, Shape

__all__ = ["HEADS", "normalise_head", "head_depth_m", "head_area_m2", "head_volume_m3",
           "head_curvature", "head_layer_factors", "DishedHead", "TORI_CROWN_RATIO",
           "TORI_KNUCKLE_RATIO"]

#: Head shapes by key.
HEADS = ("flat", "2:1", "hemispherical", "torispherical")
#: Torispherical crown (dish) radius / D and knuckle radius / D (DIN 28011 form, from memory).
TORI_CROWN_RATIO, TORI_KNUCKLE_RATIO = 1.0, 0.1

_ALIASES = {
    "flat": "flat", "plate": "flat",
    "2:1": "2:1", "2:1 ellipsoidal": "2:1", "ellipsoidal": "2:1", "elliptical": "2:1",
    "hemispherical": "hemispherical", "hemisphere": "hemispherical", "hemi": "hemispherical",
    "torispherical": "torispherical", "dished": "torispherical",
}


def normalise_head(name: str) -> str:
    """The head key of *name* (``"2:1"``, ``"ellipsoidal"``, ``"hemi"`` …).

    Raises
    ------
    InputError
        ``--heads``: an unknown head shape, naming the ones allowed.

    Examples
    --------
    >>> normalise_head("Ellipsoidal")
    '2:1'
    """
    key = _ALIASES.get(str(name).strip().lower())
    if key is None:
        raise InputError("--heads", f'unknown head shape "{name}"; use flat, 2:1, hemispherical or torispherical')
    return key


def _tori_angles():
    """(crown ratio, knuckle ratio, ρ₀/D, α): α is the crown's half-angle [rad]."""
    fd, fk = TORI_CROWN_RATIO, TORI_KNUCKLE_RATIO
    rho0 = 0.5 - fk
    return fd, fk, rho0, math.asin(rho0 / (fd - fk))


def head_depth_m(kind: str, diameter_m):
    """Depth of a head from its tangent line to its crown [m] for a diameter [m].

    Examples
    --------
    >>> float(head_depth_m("2:1", 2.0))
    0.5
    """
    kind = normalise_head(kind)
    d = np.asarray(diameter_m, dtype=float)
    if kind == "flat":
        return 0.0 * d
    if kind == "2:1":
        return d / 4
    if kind == "hemispherical":
        return d / 2
    fd, fk, _, alpha = _tori_angles()
    return d * (fd - (fd - fk) * math.cos(alpha))


@functools.cache
def head_curvature(kind: str) -> tuple[float, float]:
    """(A₀/D², M/D): area and integrated mean curvature of a dished head on D = 1.

    The 2:1 head by 64-point Gauss–Legendre quadrature in the normal's angle φ (principal
    radii R₁ = a²c²/w³, R₂ = a²/w, w = √(a² sin²φ + c² cos²φ);
    A₀ = 2π∫R₁R₂ sinφ dφ, M = π∫(R₁ + R₂) sinφ dφ); the others in closed form.
    """
    kind = normalise_head(kind)
    if kind == "flat":
        raise ValueError("a flat head is a plane; it has no curvature integrals")
    if kind == "hemispherical":
        return math.pi / 2, math.pi
    if kind == "2:1":
        a, c = 0.5, 0.25
        x, w = np.polynomial.legendre.leggauss(64)
        phi = (x + 1) * math.pi / 4
        w = w * math.pi / 4
        root = np.sqrt(a**2 * np.sin(phi) ** 2 + c**2 * np.cos(phi) ** 2)
        r1, r2 = a**2 * c**2 / root**3, a**2 / root
        return (float(2 * math.pi * np.sum(w * r1 * r2 * np.sin(phi))),
                float(math.pi * np.sum(w * (r1 + r2) * np.sin(phi))))
    fd, fk, rho0, alpha = _tori_angles()
    crown_a = 2 * math.pi * fd**2 * (1 - math.cos(alpha))
    crown_m = 2 * math.pi * fd * (1 - math.cos(alpha))
    knuckle_a = 2 * math.pi * fk * (rho0 * (math.pi / 2 - alpha) + fk * math.cos(alpha))
    knuckle_m = math.pi * (2 * fk * math.cos(alpha) + rho0 * (math.pi / 2 - alpha))
    return crown_a + knuckle_a, crown_m + knuckle_m


def head_area_m2(kind: str, diameter_m, offset_m=0.0):
    """Area of a head's surface [m²], or of the surface parallel to it *offset_m* outside.

    Parameters
    ----------
    kind : str
        Head shape (:data:`HEADS`).
    diameter_m : array_like
        Diameter of the surface the head is measured on [m].
    offset_m : array_like
        Distance of the parallel surface [m]: the total insulation thickness for the
        outer face, −wall for the bore.  A flat head's outer face is π(D/2 + offset)²
        (the shell's insulation running on over the edge; see the module docstring).

    Examples
    --------
    >>> round(float(head_area_m2("hemispherical", 2.0, 0.1)), 6) == round(2 * math.pi * 1.1**2, 6)
    True
    """
    kind = normalise_head(kind)
    d = np.asarray(diameter_m, dtype=float)
    s = np.asarray(offset_m, dtype=float)
    if kind == "flat":
        return math.pi * (d / 2 + s) ** 2
    a0, m = head_curvature(kind)
    return a0 * d**2 + 2 * m * d * s + 2 * math.pi * s**2


def head_volume_m3(kind: str, inner_diameter_m):
    """Volume a head holds beyond its tangent line [m³], for its inside diameter [m].

    2:1: π D³/24; hemispherical: π D³/12; torispherical: crown cap plus knuckle ring
    (volumes of revolution in closed form); flat: 0.

    Examples
    --------
    >>> round(float(head_volume_m3("2:1", 2.0)), 6) == round(math.pi * 8 / 24, 6)
    True
    """
    kind = normalise_head(kind)
    d = np.asarray(inner_diameter_m, dtype=float)
    if kind == "flat":
        return 0.0 * d
    if kind == "2:1":
        return math.pi * d**3 / 24
    if kind == "hemispherical":
        return math.pi * d**3 / 12
    fd, fk, rho0, alpha = _tori_angles()
    h1 = fd * (1 - math.cos(alpha))                     # crown cap height / D
    cap = math.pi * h1**2 * (3 * fd - h1) / 3
    big_w = fk * math.cos(alpha)                        # knuckle height / D
    root_int = 0.5 * (big_w * fk * math.sin(alpha) + fk**2 * (math.pi / 2 - alpha))
    ring = math.pi * (rho0**2 * big_w + 2 * rho0 * root_int + fk**2 * big_w - big_w**3 / 3)
    return (cap + ring) * d**3


def head_layer_factors(kind: str, diameter_m, offsets) -> list:
    """Conduction factors F = ∫ds/A(s) [1/m] between consecutive parallel surfaces.

    Parameters
    ----------
    kind : str
        A dished head (2:1, hemispherical, torispherical).
    diameter_m : array_like
        Diameter of the reference surface (offset 0) [m].
    offsets : sequence of array_like
        Offsets of the layer boundaries, inside out [m] (−wall, 0, T₁, T₁ + T₂ …).

    Returns
    -------
    list of ndarray
        One factor per layer; R = F/k [K/W] per head (see the module docstring).

    Examples
    --------
    >>> f = head_layer_factors("hemispherical", 2.0, [0.0, 0.1])[0]
    >>> round(float(f), 12) == round((1 / 1.0 - 1 / 1.1) / (2 * math.pi), 12)
    True
    """
    a0, m = head_curvature(normalise_head(kind))
    d = np.asarray(diameter_m, dtype=float)
    rho = m * d / (2 * math.pi)
    delta2 = rho**2 - a0 * d**2 / (2 * math.pi)
    delta2 = np.where(np.abs(delta2) < 1e-12 * rho**2, 0.0, delta2)
    out = []
    for s1, s2 in zip(offsets[:-1], offsets[1:]):
        u1, u2 = rho + np.asarray(s1, dtype=float), rho + np.asarray(s2, dtype=float)
        t = u2 - u1
        den = u1 * u2 - delta2
        x2 = delta2 * (t / den) ** 2               # x² (negative when δ² < 0)
        x = np.sqrt(np.abs(x2))
        small = x < 1e-4
        xs = np.where(small, 1.0, x)
        ratio = np.where(small, 1 + x2 / 3,
                         np.where(x2 >= 0, np.arctanh(np.minimum(xs, 1 - 1e-16)) / xs, np.arctan(xs) / xs))
        out.append(t / (2 * math.pi * den) * ratio)
    return out


@dataclass(frozen=True)
class DishedHead(Shape):
    """One dished head (2:1 or torispherical; hemispherical too): heat flow per head [W].

    Parameters
    ----------
    head : str
        Head shape (not ``"flat"``: a flat head is a :class:`~pipeins.geometry.plane.Plane`).
    outer_diameter_m : array_like
        Outside diameter of the vessel, the surface the insulation sits on [m].
    facing : str
        Orientation part of the correlation key (the sphere's ``"any"``).

    Notes
    -----
    Inner film on the bore A(−wall), wall and layers by :func:`head_layer_factors`, outer
    area A(T) at the total thickness T, outer film on the diameter D + 2T with the
    sphere's correlations.  The critical radius of a head (2k/h, as a sphere) is far
    below any vessel's.
    """

    head: str
    outer_diameter_m: Any
    facing: str = "any"

    kind = "sphere"
    basis = "W"
    rough_natural_c = 1.32

    def __post_init__(self):
        if normalise_head(self.head) == "flat":
            raise InputError("--heads", "a flat head is a plane face, not a dished head")

    @property
    def orientation(self) -> str:
        return self.facing

    def columns(self):
        return {"od": self.outer_diameter_m, "length": np.nan}

    def network(self, c, thicknesses):
        d = c["od"]
        offsets = [-c["wall"], np.zeros_like(d)]
        for t in thicknesses:
            offsets.append(offsets[-1] + t)
        factors = head_layer_factors(self.head, d, offsets)
        total = offsets[-1]
        return Network(
            inner_film_factor=1.0 / head_area_m2(self.head, d, -c["wall"]),
            wall_factor=factors[0],
            layer_factors=factors[1:],
            outer_area=head_area_m2(self.head, d, total),
            film_length_m=d + 2 * total,
            film_height_m=None,
            outer_radius_m=d / 2 + total,
        )

    def critical_radius_m(self, conductivity_w_mk, outer_coefficient_w_m2k):
        """r_c = 2k/h [m], as for a sphere (Incropera et al., 6th ed., §3.4.2, from memory)."""
        return 2 * np.asarray(conductivity_w_mk) / np.asarray(outer_coefficient_w_m2k)
