"""Select the insulation thickness of a line, or of every size of a service.

Glue between a :class:`~pipeins.line.LineSpec`, the sizing requirements and the search:
builds the (vectorised) sizing problem, the criteria and the series, runs
:func:`pipeins.sizing.size`, and returns everything a report needs.

>>> from pipeins.line import LineSpec
>>> from pipeins.criteria import Requirements
>>> spec = LineSpec(pipe="NPS 4", fluid_temp_c=180.0, air_temp_c=25.0)
>>> sel = select(spec, "mineral wool", Requirements())
>>> sel.outcome.governing[0], float(sel.outcome.selected_m[0])
('surface_temp', 0.02)
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
           code: str | None = None, economic=None, code_paths=()) -> Selection:
    """Size the outer layer of *material_name* over the line's fixed layers.

    *code* names a rule set of :mod:`pipeins.codes` whose minimum thickness joins the
    criteria; *economic* (an :class:`pipeins.annual.EnergyBasis` with a cost table) adds the
    economic thickness.  Both act as lower bounds on the commercial pick.
    """
    from .catalog.materials import lookup_material
    from .criteria import build_criteria

    material = lookup_material(material_name, option="--material")
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
    size_list = sizes or [spec.pipe_size()]
    extra, curves = [], None
    if code is not None:
        extra.append(code_outcome(size_list, material, code, float(np.max(fluid.temp_c)), code_paths))
    if economic is not None:
        from .annual import economic_outcome

        econ, curves = economic_outcome(problem, size_list, economic)
        extra.append(econ)
    if not criteria and not extra:
        from .criteria import no_criterion_message

        raise InputError("touch_limit_c", no_criterion_message(notes, spec.rh_percent is not None))
    outcome = size(problem, criteria, series_m, extra_required=extra)
    notes = notes + [n for n in outcome.not_applicable if n not in notes]
    selection = Selection(spec, size_list, material, name, problem, outcome.active, outcome, notes)
    selection.economic_curves = curves
    return selection


def nominal_keys(size) -> dict:
    """The size keys a code rule set may ask for: nominal inches, DN, inner diameter."""
    from fractions import Fraction

    out = {"inner_diameter_m": size.inner_diameter_m}
    if size.kind in ("steel", "copper"):
        whole, _, frac = size.nominal.partition("-")
        value = Fraction(whole) + (Fraction(frac) if frac else 0)
        out["nominal_size_in"] = float(value)
        dn = {v: k for k, v in DN_TO_NPS.items()}.get(float(value))
        if dn:
            out["dn"] = dn
    elif size.kind == "metric":
        out["dn"] = float(size.nominal)
        if float(size.nominal) in DN_TO_NPS:
            out["nominal_size_in"] = DN_TO_NPS[float(size.nominal)]
    return out


# Usual DN ↔ NPS correspondence (ISO 6708 nominal sizes against ASME B36.10M; common practice).
DN_TO_NPS = {10.0: 0.375, 15.0: 0.5, 20.0: 0.75, 25.0: 1.0, 32.0: 1.25, 40.0: 1.5, 50.0: 2.0, 65.0: 2.5,
             80.0: 3.0, 90.0: 3.5, 100.0: 4.0, 125.0: 5.0, 150.0: 6.0, 200.0: 8.0, 250.0: 10.0, 300.0: 12.0,
             350.0: 14.0, 400.0: 16.0, 450.0: 18.0, 500.0: 20.0, 550.0: 22.0, 600.0: 24.0}


def code_outcome(sizes, material, rule_set: str, service_temp_c: float, extra_paths=()):
    """The code minimum per size as a :class:`~pipeins.sizing.CriterionOutcome` (key ``code``);
    sizes or services the rule does not cover get no requirement and say so."""
    from .codes import load_rule_sets, required_thickness
    from .physics.conduction import conductivity_of
    from .sizing import CriterionOutcome

    k = conductivity_of(material)
    required, messages, sources = [], [], []
    for s in sizes:
        req = required_thickness(rule_set, service_temp_c, s.outer_diameter_m,
                                 lambda t: float(k.conductivity(t)), extra_paths=extra_paths, **nominal_keys(s))
        required.append(req.thickness_m if req.covered else np.nan)
        messages.append("" if req.covered else f"code minimum: not covered ({req.reason})")
        sources.append(req.rule_row_source)
    name = load_rule_sets(extra_paths)[rule_set].name if rule_set in load_rule_sets(extra_paths) else rule_set
    outcome = CriterionOutcome("code", "code minimum", f"minimum thickness of {name}",
                               np.array(required, dtype=float), np.ones(len(sizes), dtype=bool), messages)
    outcome.source = next((s for s in sources if s), "")
    return outcome
