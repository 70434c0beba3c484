"""The strip: one face of a rectangular duct run, heat flow per metre of run (W/m).

A face of inside width w carries layers that widen at the corners: with the insulation
wrapped round the duct, the outer face of a build-up of total thickness T is w + 2T wide.
Each layer conducts over the mean of its inner and outer widths, so that the four faces
together reproduce the rectangular-duct formula of ISO 12241 (2008), §4.2.3 (from
memory): R' = 2d / (λ (P_i + P_e)) per metre with P_e = P_i + 8d.  Per metre of run:

- inner film factor 1/w, wall factor t_wall/w;
- layer j between cumulative thicknesses T_j and T_j+1: (T_j+1 − T_j) / (w + T_j + T_j+1);
- outer area w + 2T [m² per m], on which the outer film and radiation act.

The outer film is that of a flat face (correlation key ``("flat", face)``) with the film
length the section gives (half the width of a horizontal face, the height of a vertical
one).
"""

from __future__ import annotations

from dataclasses import dataclass
from typing import Any

import numpy as np

from .base import Network, Shape

__all__ = ["Strip", "strip_layer_factors"]


def strip_layer_factors(width_m, thicknesses) -> list:
    """(T_j+1 − T_j)/(w + T_j + T_j+1) [-] of each layer on a face of inside width *width_m* [m]."""
    factors, inner = [], np.zeros_like(np.asarray(width_m, dtype=float))
    for t in thicknesses:
        outer = inner + t
        factors.append(np.asarray(t, dtype=float) / (width_m + inner + outer))
        inner = outer
    return factors


@dataclass(frozen=True)
class Strip(Shape):
    """One face of a rectangular duct: inside width [m], film length [m], facing, height [m].

    ``face`` is ``"top"``, ``"bottom"`` or ``"vertical"``; ``film_length_m`` is the length of
    the natural-convection film of a horizontal face (and the wind's flow length), and
    ``height_m`` the height of a vertical face.
    """

    width_m: Any
    film_length_m: Any
    face: str = "vertical"
    height_m: Any = None

    kind = "flat"
    basis = "W/m"

    @property
    def orientation(self) -> str:
        return self.face

    def columns(self):
        return {"od": np.nan, "width": self.width_m, "length": self.film_length_m,
                "height": np.nan if self.height_m is None else self.height_m}

    def network(self, c, thicknesses):
        w = c["width"]
        factors = strip_layer_factors(w, thicknesses)
        total = sum(thicknesses) if thicknesses else np.zeros_like(w)
        return Network(
            inner_film_factor=1.0 / w,
            wall_factor=c["wall"] / w,
            layer_factors=factors,
            outer_area=w + 2 * total,
            film_length_m=c["length"],
            film_height_m=c["height"] if self.face == "vertical" else None,
            outer_radius_m=None,
        )

    def rough_forced_h_w_m2k(self, wind_m_s, length_m):
        # Simplified laminar flow along a plate in air, h = 3.84·(V/L)^0.5 (from memory).
        return 3.84 * np.sqrt(wind_m_s / length_m)
