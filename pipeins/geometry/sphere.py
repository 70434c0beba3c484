"""The sphere: a spherical vessel (ASTM C680's spherical system), heat flow per sphere (W).

Per **whole** sphere of outside diameter D [m] with wall w [m] and insulation layers of
thickness t_j [m] (radii r_0 = D/2 − w, r_1 = D/2, r_j+1 = r_j + t_j):

- inner film factor 1/(4π r_0²) [1/m²], so that R_film = factor / h_i [K/W];
- wall and layer factors (1/r_j − 1/r_j+1)/(4π) [1/m], so that ΔΘ = q·factor for the
  Kirchhoff potential Θ = ∫k dT, and R = factor / k [K/W] for a constant k
  (Incropera, DeWitt et al., *Fundamentals of Heat and Mass Transfer*, 6th ed. (2007),
  Eq. 3.36, from memory);
- outer area 4π r_o² [m² per sphere]; the outer film's length is the outer diameter 2 r_o;
- critical radius r_c = 2k/h [m] (same text, §3.4.2, from memory).

**Part of a sphere (a hemispherical head).**  The shape's factors and area are always those
of the whole sphere.  A patch that is a fraction f of it (f = 1/2 for a hemispherical
head) carries f in its **weight**: the section's heat flow is f·q and its outer area
f·4π r_o².  The heat flux, the temperatures and the film coefficients do not depend on f
(the radial conduction of a spherical segment with adiabatic cut faces is that of the
whole sphere).
"""

from __future__ import annotations

import math
from dataclasses import dataclass
from typing import Any

import numpy as np

from .base import Network, Shape, shells

__all__ = ["Sphere", "sphere_layer_factors"]


def sphere_layer_factors(radii) -> list:
    """(1/r1 − 1/r2)/(4π) [1/m] of each shell between consecutive *radii* [m] (per sphere).

    Parameters
    ----------
    radii : sequence of array_like
        Radii of the shell boundaries, inside out [m].

    Returns
    -------
    list of ndarray
        One factor per shell [1/m]; R = factor / k [K/W] for a constant conductivity k.

    Examples
    --------
    >>> f = sphere_layer_factors([1.0, 2.0])[0]
    >>> round(float(f * 4 * math.pi), 12)
    0.5
    """
    return [(1.0 / np.asarray(r1, dtype=float) - 1.0 / np.asarray(r2, dtype=float)) / (4 * math.pi)
            for r1, r2 in zip(radii[:-1], radii[1:])]


@dataclass(frozen=True)
class Sphere(Shape):
    """A whole sphere: outside diameter and wall [m]; heat flow per sphere [W].

    Parameters
    ----------
    outer_diameter_m : array_like
        Outside diameter of the metal shell [m].
    wall_m : array_like
        Wall thickness [m] (the solver reads it from its ``"wall"`` column).
    facing : str
        Orientation part of the correlation key (``"any"``: a sphere has none).

    Notes
    -----
    The factors and area are those of the whole sphere; a fraction of a sphere (a
    hemispherical head) is a patch whose weight is the fraction (see the module
    docstring).
    """

    outer_diameter_m: Any
    wall_m: Any = None
    facing: str = "any"

    kind = "sphere"
    basis = "W"
    # The first guess's simplified natural film h = C·(ΔT/D)^¼: C = 1.32 as on a
    # horizontal cylinder (common practice, from memory; only a starting point).
    rough_natural_c = 1.32

    @property
    def orientation(self) -> str:
        return self.facing

    def columns(self):
        return {"od": self.outer_diameter_m, "length": np.nan}

    def network(self, c, thicknesses):
        r_in = c["od"] / 2 - c["wall"]
        radii = [r_in, *shells(c["od"] / 2, thicknesses)]
        factors = sphere_layer_factors(radii)
        r_out = radii[-1]
        return Network(
            inner_film_factor=1.0 / (4 * math.pi * r_in**2),
            wall_factor=factors[0],
            layer_factors=factors[1:],
            outer_area=4 * math.pi * r_out**2,
            film_length_m=2 * r_out,
            film_height_m=None,
            outer_radius_m=r_out,
        )

    def critical_radius_m(self, conductivity_w_mk, outer_coefficient_w_m2k):
        """r_c = 2k/h [m] (Incropera et al., 6th ed., §3.4.2, from memory)."""
        return 2 * np.asarray(conductivity_w_mk) / np.asarray(outer_coefficient_w_m2k)
