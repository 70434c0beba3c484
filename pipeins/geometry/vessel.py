"""Cylindrical vessels, tanks and spheres as surface patches, and the floor of a tank.

A vessel of outside diameter D [m] and straight shell length L [m] (tangent line to
tangent line; the height of a vertical vessel's shell) is

- a **shell**: a :class:`~pipeins.geometry.cylinder.Cylinder` (heat flow per metre),
  weight L [m]; horizontal: a horizontal cylinder's film on its outer diameter; vertical:
  a vertical cylinder's film over the height L;
- two **heads** (:mod:`pipeins.geometry.heads`): a flat head is a
  :class:`~pipeins.geometry.plane.Plane` (per m²) weighted by its outer area; a
  hemispherical head a :class:`~pipeins.geometry.sphere.Sphere` weighted 1/2 (the whole
  sphere's factors, half its heat flow); a 2:1 or torispherical head a
  :class:`~pipeins.geometry.heads.DishedHead` (per head) weighted 1;
- or, for a vertical tank standing on a foundation, a **roof** (the top head) and a
  **floor** (:class:`Floor`): flat, left bare, either open to the air beneath or to the
  ground through its foundation.

A patch's **weight** turns its shape's heat flow into watts: a function of the total
insulation thickness T [m] (:attr:`PatchSpec.weight`); :attr:`PatchSpec.outer_area_m2`
gives its outer surface [m²].  :meth:`PatchSpec.to_patch` builds the solver's
:class:`~pipeins.geometry.section.Patch`.
"""

from __future__ import annotations

import math
from dataclasses import dataclass
from typing import Any, Callable

import numpy as np

from ..errors import InputError
from .base import Shape
from .cylinder import Cylinder
from .heads import DishedHead, head_area_m2, head_volume_m3, normalise_head
from .plane import Plane
from .sphere import Sphere

__all__ = ["PatchSpec", "Floor", "tank_floor", "vessel_patches", "sphere_patches", "vessel_volume_m3",
           "VESSEL_ORIENTATIONS", "FLOOR_KINDS", "DEFAULT_FLOOR_SOIL", "DEFAULT_WALL_M"]

#: Orientations of a cylindrical vessel's axis.
VESSEL_ORIENTATIONS = ("vertical", "horizontal")
#: What a tank floor gives onto.
FLOOR_KINDS = ("air", "ground")
#: Soil under a tank whose foundation resistance is not stated (a compacted sand pad;
#: common practice, from memory), from ``tables/soils.csv``.
DEFAULT_FLOOR_SOIL = "moist sand"
#: Wall of a vessel when none is given [m] (common practice for a mid-size carbon-steel
#: vessel; its resistance is negligible beside the insulation's).
DEFAULT_WALL_M = 0.010

# Absorbed-sun share of a patch (projected / outer area, the sun overhead; common practice):
# a cylinder 1/π, a sphere or dished head 1/4, a face up 1, a face down or a floor 0.
_SUN_CYLINDER, _SUN_SPHERE = 1 / math.pi, 0.25


@dataclass(frozen=True)
class PatchSpec:
    """One patch of a vessel or sphere, as the section needs it.

    Attributes
    ----------
    name : str
        ``"shell"``, ``"top head"``, ``"bottom head"``, ``"heads"``, ``"roof"``, ``"floor"``,
        ``"sphere"``.
    shape : Shape
        Its geometry; ``shape.correlation_key`` selects the outer film.
    weight : callable
        Total insulation thickness T [m] (array) → weight: [m] for a W/m shape (the shell
        length), [m²] for a W/m² shape (a flat head's outer area), [-] for a W shape
        (1/2 for a hemispherical head); heat flow [W] = weight × shape's heat flow.
    outer_area_m2 : callable
        T [m] → the patch's outer surface [m²] (for one patch; times :attr:`count`).
    insulated : bool
        False for a floor: it carries none of the build-up.
    boundary : Boundary or None
        The floor's fixed boundary to the ground (None: the surroundings' air).
    sun_factor : float
        Absorbed-sun share (projected / outer area; see the lead's
        :class:`~pipeins.geometry.section.Patch`).
    count : int
        Identical patches this entry stands for (the two heads of a horizontal vessel).
    """

    name: str
    shape: Shape
    weight: Callable[[Any], Any]
    outer_area_m2: Callable[[Any], Any]
    insulated: bool = True
    boundary: Any = None
    sun_factor: float = 1.0
    count: int = 1

    def to_patch(self):
        """The solver's :class:`~pipeins.geometry.section.Patch` of this spec."""
        from .section import Patch

        return Patch(self.name, self.shape, self.weight, self.sun_factor, self.insulated, self.boundary,
                     self.count)


@dataclass(frozen=True)
class Floor:
    """The floor of a vertical tank standing on a foundation; build it with :func:`tank_floor`.

    Attributes
    ----------
    kind : str
        ``"air"``: open to the air beneath (on legs or a ring), left bare; ``"ground"``:
        on a foundation, to the ground at :attr:`ground_temp_c`.
    ground_temp_c : float or None
        Temperature of the ground far below the tank [°C] (for example the site's annual
        mean), ``"ground"`` only.
    resistance_m2k_w : float or None
        Thermal resistance from the floor plate to that ground [m²·K/W], or None for the
        default (see :meth:`resistance_for`).
    soil : str
        Soil type (``tables/soils.csv``) of the default resistance.
    """

    kind: str
    ground_temp_c: Any = None
    resistance_m2k_w: Any = None
    soil: str = DEFAULT_FLOOR_SOIL

    def resistance_for(self, diameter_m):
        """Floor-to-ground resistance [m²·K/W] of a floor of *diameter_m* [m].

        The stated resistance, or else that of an isothermal disc of diameter D on a
        semi-infinite ground of conductivity k: conduction shape factor S = 2D
        (Incropera, DeWitt et al., 6th ed., Table 4.1, from memory), so per m² of floor
        R = (πD²/4)/(2Dk) = πD/(8k); steady state, the pad's own resistance neglected
        (common practice for a first estimate; the ground's seasonal swing is not
        modelled).
        """
        if self.resistance_m2k_w is not None:
            return np.asarray(self.resistance_m2k_w, dtype=float)
        from ..buried import lookup_soil

        k = lookup_soil(self.soil).conductivity_w_mk
        return math.pi * np.asarray(diameter_m, dtype=float) / (8 * k)

    def boundary(self, diameter_m):
        """The section's :class:`~pipeins.geometry.section.Boundary` for ``"ground"``, else None."""
        if self.kind != "ground":
            return None
        from .section import Boundary

        r = self.resistance_for(diameter_m)
        return Boundary(self.ground_temp_c, 1.0 / r, self.assumption(diameter_m))

    def assumption(self, diameter_m=None) -> str:
        """The assumption sentence the reports show."""
        if self.kind == "air":
            return "tank floor open to the air beneath, uninsulated (bare plate facing down)"
        if self.resistance_m2k_w is not None:
            how = f"a stated foundation resistance of {float(self.resistance_m2k_w):g} m²·K/W"
        else:
            what = "" if diameter_m is None else f" ({float(np.max(self.resistance_for(diameter_m))):.2g} m²·K/W)"
            how = (f"the spreading resistance of a disc on {self.soil}{what}, pad neglected "
                   "(common practice for an estimate)")
        return (f"tank floor uninsulated, to the ground at {float(self.ground_temp_c):g} °C through {how}; "
                "steady state")


def tank_floor(kind, ground_temp_c=None, resistance_m2k_w=None, soil: str = DEFAULT_FLOOR_SOIL) -> Floor:
    """The :class:`Floor` of a tank standing on a foundation, checked.

    Parameters
    ----------
    kind : str or None
        ``"air"`` or ``"ground"``.
    ground_temp_c : float, optional
        Ground temperature [°C]; required for ``"ground"``.
    resistance_m2k_w : float, optional
        Floor-to-ground resistance [m²·K/W] (> 0); default: see :meth:`Floor.resistance_for`.
    soil : str
        Soil of the default resistance.

    Raises
    ------
    InputError
        ``floor``: none given, or not air/ground; ``floor_ground_temp_c``: missing or not
        a finite temperature for ``"ground"``; ``floor_resistance_m2k_w``: not above 0.

    Examples
    --------
    >>> tank_floor("ground", 8.0).assumption(10.0)[:45]
    'tank floor uninsulated, to the ground at 8 °C'
    """
    if kind is None:
        raise InputError("floor", "a tank standing on a foundation needs its floor boundary: air (open "
                                  "beneath, uninsulated) or ground (with the ground temperature)")
    key = str(kind).strip().lower()
    if key not in FLOOR_KINDS:
        raise InputError("floor", f'unknown floor boundary "{kind}"; use air or ground')
    if key == "ground":
        if ground_temp_c is None:
            raise InputError("floor_ground_temp_c", "a tank floor to the ground needs the ground temperature [°C]")
        g = np.asarray(ground_temp_c, dtype=float)
        if np.any(~np.isfinite(g) | (g < -100) | (g > 100)):
            raise InputError("floor_ground_temp_c", "the ground temperature must be from -100 to 100 °C")
    if resistance_m2k_w is not None:
        r = np.asarray(resistance_m2k_w, dtype=float)
        if np.any(~np.isfinite(r) | (r <= 0)):
            raise InputError("floor_resistance_m2k_w", "the foundation resistance must be greater than 0 m²·K/W")
    if key == "ground" and resistance_m2k_w is None:
        from ..buried import lookup_soil

        lookup_soil(soil)  # an unknown soil is an InputError now, not at the solve
    return Floor(key, ground_temp_c, resistance_m2k_w, soil)


def _positive(name, value, what):
    v = np.asarray(value, dtype=float)
    if np.any(~np.isfinite(v) | (v <= 0)):
        raise InputError(name, f"the {what} must be greater than 0 m")
    return v


def _const(value):
    return lambda total_m: value + 0.0 * np.asarray(total_m, dtype=float)


def _head(kind, d, wall, place, orientation) -> PatchSpec:
    top = place == "top head"
    if kind == "flat":
        if orientation == "horizontal":
            shape = Plane(d, "vertical")            # a vertical plate of height D
        else:
            shape = Plane(d / 4, "top" if top else "bottom")   # area/perimeter of a disc
        area = lambda total_m: head_area_m2("flat", d, total_m)  # noqa: E731
        sun = 1.0 if (orientation == "vertical" and top) else (
            0.0 if orientation == "vertical" else _SUN_CYLINDER)
        return PatchSpec(place, shape, area, area, sun_factor=sun)
    if kind == "hemispherical":
        shape = Sphere(d, wall)
        return PatchSpec(place, shape, _const(0.5), lambda total_m: head_area_m2(kind, d, total_m),
                         sun_factor=_SUN_SPHERE)
    return PatchSpec(place, DishedHead(kind, d), _const(1.0), lambda total_m: head_area_m2(kind, d, total_m),
                     sun_factor=_SUN_SPHERE)


def vessel_patches(diameter_m, length_m, orientation: str, heads: str, floor: Floor | None = None,
                   wall_m=DEFAULT_WALL_M) -> list[PatchSpec]:
    """The patches of a cylindrical vessel: a shell and two heads, or a roof and a floor.

    Parameters
    ----------
    diameter_m : float
        Outside diameter of the vessel [m].
    length_m : float
        Straight shell length, tangent line to tangent line [m] (a vertical vessel's
        shell height).
    orientation : {"vertical", "horizontal"}
        Direction of the vessel's axis.
    heads : str
        ``"flat"``, ``"2:1"``, ``"hemispherical"`` or ``"torispherical"``
        (:func:`~pipeins.geometry.heads.normalise_head` spellings).
    floor : Floor, optional
        A vertical tank standing on a foundation (:func:`tank_floor`): the top head is
        then its **roof** and the bottom a flat, bare **floor** (``insulated=False``),
        open to the air beneath or with a fixed :class:`~pipeins.geometry.section.Boundary`
        to the ground.  None: the bottom is a head in the air like the top.
    wall_m : float
        Wall thickness [m] (:data:`DEFAULT_WALL_M`).

    Returns
    -------
    list of PatchSpec
        Vertical: shell, top head (or roof), bottom head (or floor); horizontal: shell and
        ``"heads"`` (count 2).

    Raises
    ------
    InputError
        ``--diameter``/``--length``/``--wall`` not above 0 (or the wall not below half the
        diameter); ``--vessel`` not vertical or horizontal; ``--heads`` unknown;
        ``floor`` on a horizontal vessel.

    Examples
    --------
    >>> [p.name for p in vessel_patches(3.0, 5.0, "vertical", "2:1")]
    ['shell', 'top head', 'bottom head']
    """
    d = float(_positive("--diameter", diameter_m, "vessel diameter"))
    length = float(_positive("--length", length_m, "shell length"))
    wall = float(_positive("--wall", wall_m, "wall thickness"))
    if wall >= d / 2:
        raise InputError("--wall", "the wall thickness must be less than half the vessel diameter")
    if orientation not in VESSEL_ORIENTATIONS:
        raise InputError("--vessel", f'unknown vessel orientation "{orientation}"; use vertical or horizontal')
    kind = normalise_head(heads)
    if floor is not None and orientation != "vertical":
        raise InputError("floor", "only a vertical tank stands on a floor; a horizontal vessel has two heads")
    if floor is not None and not isinstance(floor, Floor):
        raise InputError("floor", "give the floor boundary from tank_floor(air|ground, …)")

    shell = PatchSpec(
        "shell", Cylinder(d, wall, orientation, length if orientation == "vertical" else None),
        _const(length), lambda total_m: math.pi * (d + 2 * np.asarray(total_m, dtype=float)) * length,
        sun_factor=_SUN_CYLINDER)
    if orientation == "horizontal":
        head = _head(kind, d, wall, "heads", orientation)
        return [shell, PatchSpec(head.name, head.shape, head.weight, head.outer_area_m2,
                                 sun_factor=head.sun_factor, count=2)]
    if floor is None:
        return [shell, _head(kind, d, wall, "top head", orientation), _head(kind, d, wall, "bottom head", orientation)]
    roof = _head(kind, d, wall, "top head", orientation)
    roof = PatchSpec("roof", roof.shape, roof.weight, roof.outer_area_m2, sun_factor=roof.sun_factor)
    bare = math.pi * d**2 / 4
    floor_patch = PatchSpec("floor", Plane(d / 4, "bottom"), _const(bare), _const(bare), insulated=False,
                            boundary=floor.boundary(d), sun_factor=0.0)
    return [shell, roof, floor_patch]


def sphere_patches(diameter_m, wall_m=DEFAULT_WALL_M) -> list[PatchSpec]:
    """The one patch of a spherical vessel of outside diameter *diameter_m* [m] (weight 1).

    Examples
    --------
    >>> p = sphere_patches(2.5)[0]
    >>> p.name, p.shape.kind, p.shape.basis, float(p.weight(0.1))
    ('sphere', 'sphere', 'W', 1.0)
    """
    d = float(_positive("--sphere", diameter_m, "sphere diameter"))
    wall = float(_positive("--wall", wall_m, "wall thickness"))
    if wall >= d / 2:
        raise InputError("--wall", "the wall thickness must be less than half the sphere diameter")
    return [PatchSpec("sphere", Sphere(d, wall), _const(1.0),
                      lambda total_m: math.pi * (d + 2 * np.asarray(total_m, dtype=float)) ** 2,
                      sun_factor=_SUN_SPHERE)]


def vessel_volume_m3(inner_diameter_m, length_m, heads: str, floor: Floor | None = None):
    """Volume the vessel holds [m³]: the shell π Dᵢ² L/4 and two heads (one with a floor).

    Parameters
    ----------
    inner_diameter_m, length_m : float
        Inside diameter and straight shell length [m].
    heads : str
        Head shape.
    floor : Floor, optional
        A flat floor replaces the bottom head.

    Examples
    --------
    >>> round(float(vessel_volume_m3(2.0, 3.0, "hemispherical")), 6) == round(math.pi * 3 + 4 / 3 * math.pi, 6)
    True
    """
    di = _positive("--diameter", inner_diameter_m, "vessel inside diameter")
    length = _positive("--length", length_m, "shell length")
    n_heads = 1 if floor is not None else 2
    return math.pi * di**2 / 4 * length + n_heads * head_volume_m3(heads, di)
