"""The cylinder: a round pipe run, heat flow per metre (W/m)."""

from __future__ import annotations

import math
from dataclasses import dataclass
from typing import Any

import numpy as np

from .base import Network, Shape, shells

__all__ = ["Cylinder", "cylinder_layer_factors"]


def cylinder_layer_factors(radii) -> list:
    """ln(r2/r1)/(2π) [-] of each shell between consecutive *radii* [m] (per metre of run)."""
    return [np.log(np.asarray(r2) / np.asarray(r1)) / (2 * math.pi) for r1, r2 in zip(radii[:-1], radii[1:])]


@dataclass(frozen=True)
class Cylinder(Shape):
    """A round pipe: outside diameter and wall [m]; horizontal or vertical (with a height [m]).

    Outer film on the outer diameter; a vertical run's natural convection on its height.
    """

    outer_diameter_m: Any
    wall_m: Any
    run_orientation: str = "horizontal"
    height_m: Any = None

    kind = "cylinder"
    basis = "W/m"

    @property
    def rough_natural_c(self) -> float:
        return 1.32 if self.run_orientation == "horizontal" else 1.42

    @property
    def orientation(self) -> str:
        return self.run_orientation

    def columns(self):
        return {"od": self.outer_diameter_m, "length": np.nan if self.height_m is None else self.height_m}

    def network(self, c, thicknesses):
        r_in = c["od"] / 2 - c["wall"]
        radii = [r_in, *shells(c["od"] / 2, thicknesses)]
        factors = cylinder_layer_factors(radii)
        r_out = radii[-1]
        return Network(
            inner_film_factor=1.0 / (2 * math.pi * r_in),
            wall_factor=factors[0],
            layer_factors=factors[1:],
            outer_area=2 * math.pi * r_out,
            film_length_m=2 * r_out,
            film_height_m=c["length"] if self.run_orientation == "vertical" else None,
            outer_radius_m=r_out,
        )

    def critical_radius_m(self, conductivity_w_mk, outer_coefficient_w_m2k):
        """r_c = k/h [m] (Incropera et al., 6th ed., Eq. 3.56)."""
        return np.asarray(conductivity_w_mk) / np.asarray(outer_coefficient_w_m2k)
