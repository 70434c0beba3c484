"""Sections: the surface patches that share one fluid and one build-up.

A **section** is what an engineer insulates as one item: a round pipe or round duct
(one cylinder patch), a rectangular duct (four strips: top, two sides, bottom), a flat
face (one plane), a sphere, a vessel (a shell and two heads, or a roof and a floor).
Every patch has its own :class:`~pipeins.geometry.base.Shape` (so its own conduction
factors, outer area and outer film), and a **weight** that turns the patch's heat flow,
in its shape's basis, into the section's basis: 1 for a strip of a duct run (both W/m),
the shell length [m] for a vessel shell (W/m → W), a head's share of a sphere (W → W).

The solver (:func:`pipeins.solve.solve`) solves every patch of every case in one
vectorised iteration; the section's heat flow is the weighted sum of its patches, and
the surface temperature that governs is the hottest patch of a hot section and the
coldest patch of a cold one (condensation and touch are judged there).
"""

from __future__ import annotations

from dataclasses import dataclass, field
from typing import Any, Callable

from .base import BASES, Shape

__all__ = ["Patch", "Boundary", "single_patch"]


@dataclass(frozen=True)
class Boundary:
    """An outer boundary that replaces the air for one patch (a tank floor on its foundation).

    ``temp_c`` is the temperature beyond the patch [°C] and ``coefficient_w_m2k`` the fixed
    coefficient from the patch's outer face to it [W/(m²·K)] (convection and radiation
    correlations do not apply).  ``note`` is the assumption as the reports state it.
    """

    temp_c: Any
    coefficient_w_m2k: Any
    note: str = ""


@dataclass(frozen=True)
class Patch:
    """One surface patch of a section.

    Attributes
    ----------
    name : str
        What the reports call it (``"top"``, ``"side"``, ``"shell"``, ``"upper head"`` …).
    shape : Shape
        Its geometry (conduction factors, outer area per patch unit, film key).
    weight : float or callable
        Patch basis → section basis: a number, or a function of the total insulation
        thickness [m] (an array) returning one.
    sun_factor : float
        Solar irradiance absorbed per m² of the patch's outer surface, as a fraction of
        absorptance × irradiance (projected area / outer area: 1/π on a cylinder, 1/4 on a
        sphere, 1 on a face normal to the sun, 0 on a face the sun does not reach).
    insulated : bool
        False for a patch left bare inside an insulated section (a tank floor).
    boundary : Boundary or None
        A fixed outer boundary in place of the air (None: the section's surroundings).
    count : int
        How many identical patches this entry stands for (two sides of a duct).
    """

    name: str
    shape: Shape
    weight: Any = 1.0
    sun_factor: float = 1.0
    insulated: bool = True
    boundary: Boundary | None = None
    count: int = 1

    def weight_for(self, total_thickness_m) -> Any:
        """The weight at a total insulation thickness [m] (times :attr:`count`)."""
        w = self.weight(total_thickness_m) if callable(self.weight) else self.weight
        return w * self.count if self.count != 1 else w


def single_patch(name: str, shape: Shape, sun_factor: float = 1.0) -> list[Patch]:
    """The one patch of a single-shape section (a pipe, a round duct, a face, a sphere)."""
    return [Patch(name, shape, 1.0, sun_factor)]


def check_basis(basis: str) -> str:
    if basis not in BASES:
        raise ValueError(f"unknown heat-flow basis {basis!r}; one of {BASES}")
    return basis
