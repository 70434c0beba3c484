"""The geometry protocol: what the solver needs from a shape, and nothing more.

A shape turns the section's dimensions and the layer thicknesses into the conduction
network's factors and the outer film's inputs, per case (numpy arrays broadcast over the
cases):

- the **inner-film factor** F_i = 1/A_i (A_i the bore area per unit), so that the inner
  film's resistance is F_i / h_i;
- the **wall and layer factors** F, so that ΔΘ = q·F for the Kirchhoff potential
  Θ(T) = ∫k dT of each layer (for a constant k, R = F/k): cylinder ln(r2/r1)/(2π) [-],
  plane t [m], sphere (1/r1 − 1/r2)/(4π) [1/m];
- the **outer area** A_o per unit [m² per unit], so that q = A_o·q″;
- the **film lengths**: the characteristic length of the outer correlations and the
  height of a vertical surface [m];
- the **correlation key** (shape, orientation), which selects the outer correlations in
  :mod:`pipeins.physics.outer`;
- the **basis**: the unit its heat flow q is reported in (``"W/m"`` for a pipe run,
  ``"W/m²"`` for a face, ``"W"`` for a sphere).

A new shape is one module in :mod:`pipeins.geometry` (a :class:`Shape` subclass), its
entry in :data:`pipeins.geometry.SHAPES`, its outer correlations, and a model class whose
``shape(surroundings)`` returns it; the solver does not change.
"""

from __future__ import annotations

import math
from dataclasses import dataclass
from typing import Any, ClassVar, Sequence

import numpy as np

__all__ = ["Shape", "Network", "BASES"]

#: Heat-flow units a shape can report in.
BASES = ("W/m", "W/m²", "W")


@dataclass(frozen=True)
class Network:
    """Per-case geometry of one solve, from :meth:`Shape.network` (arrays broadcast together).

    Attributes
    ----------
    inner_film_factor : ndarray
        1 / bore area per unit [1/m² per unit]; inner film resistance = factor / h_i.
    wall_factor : ndarray
        Conduction factor of the wall (see the module docstring for its unit).
    layer_factors : list of ndarray
        Conduction factor of each insulation layer, inside out.
    outer_area : ndarray
        Outer surface area per unit [m² per m, per m² or per sphere].
    film_length_m : ndarray
        Characteristic length of the outer film [m] (diameter; face length).
    film_height_m : ndarray or None
        Height of a vertical surface for natural convection [m], or None.
    outer_radius_m : ndarray or None
        Outer radius of a round shape [m] (None for a plane).
    """

    inner_film_factor: Any
    wall_factor: Any
    layer_factors: list
    outer_area: Any
    film_length_m: Any
    film_height_m: Any
    outer_radius_m: Any


class Shape:
    """Base of every shape; subclasses set :attr:`kind`, :attr:`basis` and the methods."""

    #: Correlation-key shape name used by :mod:`pipeins.physics.outer`.
    kind: ClassVar[str] = ""
    #: Unit the heat flow is reported in (one of :data:`BASES`).
    basis: ClassVar[str] = ""
    #: Natural-convection constant C of the first guess's simplified film h = C·(ΔT/L)^¼
    #: (common practice for air near room temperature, from memory; only a starting point).
    rough_natural_c: ClassVar[float] = 1.42

    def columns(self) -> dict[str, Any]:
        """The shape's numeric inputs by name (the solver broadcasts them with the rest)."""
        raise NotImplementedError

    @property
    def orientation(self) -> str:
        """Orientation part of the correlation key."""
        raise NotImplementedError

    @property
    def correlation_key(self) -> tuple[str, str]:
        """(shape, orientation) that selects the outer correlations."""
        return self.kind, self.orientation

    def network(self, c: dict[str, Any], thicknesses: Sequence[Any]) -> Network:
        """The per-case factors from the broadcast *c* (keys of :meth:`columns`, plus
        ``"wall"``) and the layer thicknesses [m]."""
        raise NotImplementedError

    def rough_forced_h_w_m2k(self, wind_m_s, length_m):
        """Forced-convection film of the first guess [W/(m²·K)] (a starting point only)."""
        # Simplified cross flow over a cylinder in air, h = 4.1·V^0.618/D^0.382
        # (common practice, from memory).
        return 4.1 * wind_m_s**0.618 / length_m**0.382

    def critical_radius_m(self, conductivity_w_mk, outer_coefficient_w_m2k):
        """Radius below which more insulation raises the heat flow [m], or None (plane)."""
        return None


def shells(inner_radius_m, thicknesses: Sequence[Any]) -> list:
    """Radii [m] of nested shells: the inner radius, then each thickness added in turn."""
    radii = [inner_radius_m]
    for t in thicknesses:
        radii.append(radii[-1] + t)
    return radii


TWO_PI = 2 * math.pi
FOUR_PI = 4 * math.pi
