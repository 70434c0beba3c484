"""Select the insulation thickness of a line, or of every size of a service.

Glue between a :class:`~pipeins.line.LineSpec`, the sizing requirements and the search:
builds the (vectorised) sizing problem, the criteria and the series, runs
:func:`pipeins.sizing.size`, and returns everything a report needs.

>>> from pipeins.line import LineSpec
>>> from pipeins.criteria import Requirements
>>> spec = LineSpec(pipe="NPS 4", fluid_temp_c=180.0, air_temp_c=25.0)
>>> sel = select(spec, "mineral wool", Requirements())
>>> sel.outcome.governing[0], float(sel.outcome.selected_m[0])
('surface_temp', 0.03)
"""

from __future__ import annotations

from dataclasses import dataclass, field, replace

import numpy as np

from .errors import InputError
from .sizing import SizingOutcome, SizingProblem, size

__all__ = ["Selection", "select", "series_for"]


@dataclass
class Selection:
    spec: object
    sizes: list
    material: object
    series_name: str
    problem: SizingProblem
    criteria: list
    outcome: SizingOutcome
    notes: list[str] = field(default_factory=list)


def series_for(material, series: str | tuple | None, units: str = "si") -> tuple[str, tuple[float, ...]]:
    """(name, thicknesses in m) of the series to pick from: a name, an explicit tuple of
    thicknesses [m], or the material family's default series in the unit system."""
    from .catalog.series import default_series, thickness_series_m

    if series is None:
        family = material.family if material.family != "generic" else "pipe_section"
        name = default_series(family, units)
        return name, thickness_series_m(name)
    if isinstance(series, str):
        return series, thickness_series_m(series)
    values = tuple(sorted(float(x) for x in series))
    if not values or any(v <= 0 for v in values):
        raise InputError("--series", "the thickness series needs at least one thickness above zero")
    return "given list", values


def select(spec, material_name: str, req, series=None, units: str = "si", sizes=None,
           extra_required=()) -> Selection:
    """Size the outer layer of *material_name* over the line's fixed layers."""
    from .catalog.materials import lookup_material
    from .criteria import build_criteria

    material = lookup_material(material_name)
    name, series_m = series_for(material, series, units)
    pipe, fixed, fluid, surroundings, surface = spec.build_model(sizes, insulated=True)
    n = 1 if sizes is None else len(sizes)
    if sizes is None:  # one size: give it the (n, 1) shape of a table row
        pipe = replace(pipe, outer_diameter_m=np.reshape(pipe.outer_diameter_m, (1, 1)),
                       wall_m=np.reshape(pipe.wall_m, (1, 1)))
        if fluid.film_coefficient_w_m2k is not None:
            fluid = replace(fluid, film_coefficient_w_m2k=np.reshape(fluid.film_coefficient_w_m2k, (1, 1)))
    criteria, notes = build_criteria(spec, req, fluid.temp_c, surroundings.air_temp_c, surface.surface_kind)
    limit = next((c.limit_c for c in criteria if c.key == "surface_temp"), spec.touch_limit_c)
    problem = SizingProblem(pipe, fixed, material, fluid, surroundings, surface, limit, n)
    outcome = size(problem, criteria, series_m, extra_required=extra_required)
    return Selection(spec, sizes or [spec.pipe_size()], material, name, problem, criteria, outcome, notes)
