"""The code minimum: the least thickness a code rule set asks for, per size (a pipe rule set of
:mod:`pipeins.codes` by nominal size and service temperature, or a duct rule set of
:mod:`pipeins.duct_codes` by location, service and climate zone).  A lower bound on the pick.
"""

from __future__ import annotations

import numpy as np

__all__ = ["required", "code_outcome", "nominal_keys", "DN_TO_NPS"]


def required(ctx):
    """The code minimum of the selection *ctx* (a :class:`pipeins.criteria.registry.Selecting`)
    as a :class:`~pipeins.sizing.CriterionOutcome` (key ``code``), or None without a rule set."""
    if ctx.code is None:
        return None
    problem = ctx.problem
    if ctx.kind == "duct":
        from ..sections import duct_code_outcome

        return duct_code_outcome(ctx.spec, ctx.req, ctx.code, ctx.material, problem.n_sizes, problem.fluid.temp_c,
                                 problem.surroundings.air_temp_c, ctx.units)
    return code_outcome(ctx.sizes, ctx.material, ctx.code, float(np.max(problem.fluid.temp_c)), ctx.code_paths,
                        ctx.units)


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


def code_outcome(sizes, material, rule_set: str, service_temp_c: float, extra_paths=(), units: str = "si"):
    """The code minimum per size as a :class:`~pipeins.sizing.CriterionOutcome` (key ``code``);
    sizes or services the rule does not cover get no requirement and say so (in *units*)."""
    from ..codes import load_rule_sets, required_thickness
    from ..physics.conduction import conductivity_of
    from ..sizing import CriterionOutcome

    k = conductivity_of(material)
    required, messages, sources = [], [], []
    for s in sizes:
        req = required_thickness(rule_set, service_temp_c, s.outer_diameter_m,
                                 lambda t: float(k.conductivity(t)), extra_paths=extra_paths, units=units,
                                 **nominal_keys(s))
        required.append(req.thickness_m if req.covered else np.nan)
        messages.append("" if req.covered else f"code minimum: not covered ({req.reason})")
        sources.append(req.rule_row_source)
    name = load_rule_sets(extra_paths)[rule_set].name if rule_set in load_rule_sets(extra_paths) else rule_set
    outcome = CriterionOutcome("code", "code minimum", f"minimum thickness of {name}",
                               np.array(required, dtype=float), np.ones(len(sizes), dtype=bool), messages)
    outcome.source = next((s for s in sources if s), "")
    return outcome
