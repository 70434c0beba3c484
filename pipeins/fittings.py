"""Bare and covered fittings on a line: heat flow, surface temperature, and the saving of a cover.

Method (in the manner of ASTM C1129, estimating the savings of insulating bare valves and
flanges): each fitting of :mod:`pipeins.catalog.fittings` is solved with its own outer film
as a *short horizontal cylinder of the same area*: a cylinder of the fitting's flange outside
diameter D, of length L = A/(π·D) so that its side is the fitting's bare area A (the ends
are not counted), its body at the line's fluid temperature through the pipe's wall thickness
and material, with no inner film (the fitting's metal is taken at the fluid temperature: the
larger loss).  The outer film is the one every line has (natural convection from the
horizontal-cylinder correlation at that diameter, or forced convection in wind, in parallel
with radiation) and the bare surface is :func:`pipeins.bare.bare_surface`, the same bare as
everywhere.  The heat flow of the fitting is the cylinder's heat flow per metre times L [W].

An insulated removable cover of a material and thickness is the same cylinder with one
layer of that thickness over it (its outer face the line's own finish, or a painted or
plastic jacket); the saving is bare − covered.  Every fitting of a line is solved in one
:func:`pipeins.solve.solve` call bare and one covered (arrays over the fittings, and over a
profile's fluid temperatures).
"""

from __future__ import annotations

import math
from dataclasses import dataclass, field, replace

import numpy as np

from .errors import InputError

__all__ = ["METHOD", "CoverSaving", "FittingOnLine", "FittingsResult", "solve_fittings"]

METHOD = ("each fitting solved as a short horizontal cylinder of its flange outside diameter and of its bare "
          "area (in the manner of ASTM C1129), at the line's fluid temperature through the pipe wall, with the "
          "line's air, wind and radiant surroundings; the cover is one layer of the given material and "
          "thickness over that cylinder")


class CoverSaving:
    """``saving_w`` of a solved fitting: bare − covered heat flow [W] (None without a cover).
    Mixed into every record with ``heat_flow_w`` and ``covered_heat_flow_w``."""

    __slots__ = ()

    @property
    def saving_w(self) -> float | None:
        """bare − covered heat flow [W] (None without a cover)."""
        return None if self.covered_heat_flow_w is None else self.heat_flow_w - self.covered_heat_flow_w


@dataclass(frozen=True)
class FittingOnLine(CoverSaving):
    """One fitting solved on a line (SI; heat flow + out of the fluid).

    Attributes
    ----------
    fitting : pipeins.catalog.fittings.Fitting
        The catalogue fitting (kind, size, class, dimensions, area, source).
    equivalent_length_m : float
        Length of the short cylinder, A/(π·D) [m].
    heat_flow_w, surface_temp_c, h_conv_w_m2k, h_rad_w_m2k : float
        Bare: heat flow [W], surface temperature [°C], outer film coefficients [W/(m²·K)].
    covered_heat_flow_w, covered_surface_temp_c : float or None
        With a cover: heat flow [W] and the cover's surface temperature [°C].
    """

    fitting: object
    equivalent_length_m: float
    heat_flow_w: float
    surface_temp_c: float
    h_conv_w_m2k: float
    h_rad_w_m2k: float
    covered_heat_flow_w: float | None = None
    covered_surface_temp_c: float | None = None

    def to_dict(self) -> dict:
        f = self.fitting
        return {"kind": f.kind, "size": f.size, "pressure_class": f.pressure_class, "label": f.label,
                "area_m2": f.area_m2, "flange_od_m": f.flange_od_m, "face_to_face_m": f.face_to_face_m,
                "equivalent_length_m": self.equivalent_length_m, "heat_flow_w": self.heat_flow_w,
                "surface_temp_c": self.surface_temp_c, "h_conv_w_m2k": self.h_conv_w_m2k,
                "h_rad_w_m2k": self.h_rad_w_m2k, "covered_heat_flow_w": self.covered_heat_flow_w,
                "covered_surface_temp_c": self.covered_surface_temp_c, "saving_w": self.saving_w,
                "source": f.source}


@dataclass
class FittingsResult:
    """The fittings of a line, bare and (with a cover) covered.

    ``bare_heat_flow_w`` and ``covered_heat_flow_w`` hold the per-fitting heat flows with the
    shape (fittings,) + the fluid temperature's shape (a profile's conditions last) [W];
    ``items`` the per-fitting summaries at the first (or only) condition, or hours-weighted
    over a profile when the caller passes ``weights``.
    """

    items: list[FittingOnLine]
    bare_heat_flow_w: np.ndarray
    covered_heat_flow_w: np.ndarray | None
    cover_material: str | None = None
    cover_thickness_m: float | None = None
    cover_surface: str | None = None
    bare_surface: str = ""
    method: str = METHOD
    warnings: list[str] = field(default_factory=list)

    @property
    def total_bare_w(self) -> float:
        """Sum of the bare heat flows [W] (all fittings share the line's fluid: one sign)."""
        return float(sum(i.heat_flow_w for i in self.items))

    @property
    def total_covered_w(self) -> float | None:
        """Sum of the covered heat flows [W] (None without a cover)."""
        if self.covered_heat_flow_w is None:
            return None
        return float(sum(i.covered_heat_flow_w for i in self.items))

    def to_dict(self) -> dict:
        """``fittings`` (the list) and ``totals`` (SI)."""
        covered = self.total_covered_w
        return {"fittings": [i.to_dict() for i in self.items],
                "totals": {"bare_heat_flow_w": self.total_bare_w, "covered_heat_flow_w": covered,
                           "saving_w": None if covered is None else self.total_bare_w - covered,
                           "cover_material": self.cover_material, "cover_thickness_m": self.cover_thickness_m,
                           "cover_surface": self.cover_surface, "bare_surface": self.bare_surface,
                           "method": self.method}}


def solve_fittings(spec, fittings, cover: tuple[str, float] | None = None, weights=None) -> FittingsResult:
    """Solve *fittings* on the line *spec* bare and, with *cover*, covered.

    Parameters
    ----------
    spec : pipeins.line.LineSpec
        The line: its pipe (wall thickness and material), fluid temperature (a scalar, or a 1-D
        array of a profile's conditions), air, wind and finish.  One pipe size.
    fittings : sequence of pipeins.catalog.fittings.Fitting
        The fittings (:func:`pipeins.catalog.fittings.lookup_fitting`), at least one.
    cover : (str, float), optional
        The removable cover: material (catalogue name or ``"k=0.040"``) and thickness [m].
    weights : array_like, optional
        Hours weights of a profile's conditions (sum 1): the summaries are their weighted means.

    Returns
    -------
    FittingsResult

    Examples
    --------
    >>> from pipeins.line import LineSpec
    >>> from pipeins.catalog.fittings import lookup_fitting
    >>> spec = LineSpec(pipe="NPS 2", layers=(("mineral wool", 0.04),), fluid_temp_c=150.0, air_temp_c=20.0)
    >>> r = solve_fittings(spec, [lookup_fitting("gate", "NPS 2")], ("mineral wool", 0.05))
    >>> bare, covered = r.items[0].heat_flow_w, r.items[0].covered_heat_flow_w
    >>> 300 < bare < 500 and 0 < covered < 0.1 * bare
    True
    """
    from .bare import bare_surface
    from .catalog.materials import lookup_material
    from .model import Fluid, Layer, Pipe
    from .solve import solve

    fittings = list(fittings)
    if not fittings:
        raise InputError("fittings", "give at least one fitting")
    if len(spec.pipe_sizes()) != 1:
        raise InputError("fittings", "fittings are solved on one pipe size at a time")
    pipe, _, fluid, air, surface = spec.build_model()
    temp = np.asarray(fluid.temp_c, dtype=float)
    if temp.ndim > 1:
        raise InputError("fittings", "fittings take one fluid temperature or a 1-D profile of them")
    diameter = np.array([f.flange_od_m for f in fittings])
    area = np.array([f.area_m2 for f in fittings])
    length = area / (math.pi * diameter)
    wall = float(np.ravel(pipe.wall_m)[0])
    cyl = Pipe(diameter[:, None] if temp.ndim else diameter, wall, pipe.wall_conductivity_w_mk,
               "fittings", pipe.wall_material)
    still = Fluid(temp, None, fluid.name)
    horizontal = replace(air, orientation="horizontal", height_m=None)
    bare_face = bare_surface(pipe, surface)
    bare = solve(cyl, [], still, horizontal, bare_face)
    scale = length[:, None] if temp.ndim else length
    q_bare = np.asarray(bare.heat_flow_w_per_m) * scale
    warnings = list(bare.warnings)

    covered = q_cov = None
    if cover is not None:
        material, thickness = cover
        face = spec.build_surface(insulated=True)
        covered = solve(cyl, [Layer(lookup_material(material), float(thickness))], still, horizontal, face)
        q_cov = np.asarray(covered.heat_flow_w_per_m) * scale
        warnings += [w for w in covered.warnings if w not in warnings]

    def summary(x):
        x = np.asarray(x, dtype=float)
        if x.ndim == 1 and temp.ndim == 0:
            return x
        return x @ np.asarray(weights, dtype=float) if weights is not None else x[:, 0]

    qb, ts = summary(q_bare), summary(bare.surface_temp_c)
    hc, hr = summary(bare.h_conv_w_m2k), summary(bare.h_rad_w_m2k)
    qc = None if q_cov is None else summary(q_cov)
    tc = None if covered is None else summary(covered.surface_temp_c)
    items = [FittingOnLine(f, float(length[j]), float(qb[j]), float(ts[j]), float(hc[j]), float(hr[j]),
                           None if qc is None else float(qc[j]), None if tc is None else float(tc[j]))
             for j, f in enumerate(fittings)]
    out = FittingsResult(items, q_bare, q_cov, bare_surface=bare_face.name, warnings=warnings)
    if cover is not None:
        out.cover_material = lookup_material(cover[0]).name
        out.cover_thickness_m = float(cover[1])
        out.cover_surface = face.name
    return out
