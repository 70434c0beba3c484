"""The plane: a flat face (duct side, tank wall), heat flow per m² (W/m²)."""

from __future__ import annotations

from dataclasses import dataclass
from typing import Any

import numpy as np

from .base import Network, Shape

__all__ = ["Plane", "plane_layer_factors"]


def plane_layer_factors(thicknesses) -> list:
    """The thickness t [m] of each layer (R = t/k per m²)."""
    return [np.asarray(t, dtype=float) for t in thicknesses]


@dataclass(frozen=True)
class Plane(Shape):
    """A flat face: ``face`` is ``"vertical"``, ``"top"`` (facing up) or ``"bottom"``
    (facing down); ``length_m`` its film length (height of a vertical face, area/perimeter
    of a horizontal one, and the flow length along it in wind)."""

    length_m: Any
    face: str = "vertical"

    kind = "flat"
    basis = "W/m²"

    @property
    def orientation(self) -> str:
        return self.face

    def columns(self):
        return {"od": np.nan, "length": self.length_m}

    def network(self, c, thicknesses):
        factors = plane_layer_factors(thicknesses)
        return Network(
            inner_film_factor=np.ones_like(c["wall"]),
            wall_factor=c["wall"],
            layer_factors=factors,
            outer_area=np.ones_like(c["wall"]),
            film_length_m=c["length"],
            film_height_m=c["length"],
            outer_radius_m=None,
        )

    def rough_forced_h_w_m2k(self, wind_m_s, length_m):
        # Simplified laminar flow along a plate in air, h = 3.84·(V/L)^0.5 (from memory).
        return 3.84 * np.sqrt(wind_m_s / length_m)
