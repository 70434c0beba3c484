"""A line's money over the year: bare against insulated, payback, the economic curve.

:func:`cost_study` solves the line bare and insulated (one vectorised solve), adds bare
fittings as equivalent lengths of bare pipe, and turns the heat flows into energy, cost
and CO2 per year with an :class:`~pipeins.annual.EnergyBasis`.  With a cost table it adds
the installed cost, the simple payback and the economic-thickness curve of the outer
layer's material over the thicknesses the table lists.
"""

from __future__ import annotations

from dataclasses import dataclass, field, replace

import numpy as np

from .annual import EconomicCurve, EnergyBasis, annual_figures, economic_curve
from .economics import simple_payback_years
from .errors import InputError

__all__ = ["CostStudy", "cost_study"]


@dataclass
class CostStudy:
    """Per-metre and per-run heat flows [W/m, W], and annual figures (SI: J, kg)."""

    spec: object
    basis: EnergyBasis
    length_m: float
    fittings: dict
    fitting_length_m: float
    bare_w_per_m: float
    insulated_w_per_m: float
    bare_w: float
    insulated_w: float
    bare: dict
    insulated: dict
    installed_cost: float | None = None
    payback_years: float | None = None
    curve: EconomicCurve | None = None
    warnings: list[str] = field(default_factory=list)

    @property
    def saving(self) -> dict:
        return {k: (None if self.bare[k] is None else self.bare[k] - self.insulated[k]) for k in self.bare}


def cost_study(spec, basis: EnergyBasis, fittings: dict | None = None, profile=None) -> CostStudy:
    """*profile*, optional: ``[(fluid_temp_c, hours), ...]`` operating conditions over the year,
    replacing the spec's fluid temperature and the basis's hours; energy is summed over them
    and the heat flows reported are their hours-weighted means."""
    from .catalog.fittings import equivalent_length_m
    from .solve import solve

    weights = None
    if profile:
        temps = np.array([float(t) for t, _ in profile])
        hours = np.array([float(h) for _, h in profile])
        if hours.sum() <= 0:
            raise InputError("--profile", "the profile needs some operating hours")
        spec = replace(spec, fluid_temp_c=temps, steam_pressure_pa=None)
        basis = replace(basis, hours_per_year=hours)
        weights = hours / hours.sum()
    if not spec.layers:
        raise InputError("--layer", "a cost study compares the bare line with its insulation: give --layer")
    fittings = {k: int(v) for k, v in (fittings or {}).items() if v}
    length = spec.length_m or 1.0
    size = spec.pipe_size()
    pipe, layers, fluid, air, surface = spec.build_model()
    bare_spec = replace(spec, layers=(), finish=None, emittance=None)
    bare_surface = bare_spec.build_surface()
    bare = solve(pipe, [], fluid, air, bare_surface)
    insulated = solve(pipe, layers, fluid, air, surface)
    q_bare, q_ins = np.asarray(bare.heat_flow_w_per_m), np.asarray(insulated.heat_flow_w_per_m)
    fit_len = sum(n * float(equivalent_length_m(kind, size.outer_diameter_m)) for kind, n in fittings.items())
    bare_w = q_bare * (length + fit_len)
    ins_w = q_ins * length + q_bare * fit_len

    def mean(x):
        return float(x) if weights is None else float(np.sum(weights * x))

    study = CostStudy(spec, basis, length, fittings, fit_len, mean(q_bare), mean(q_ins), mean(bare_w),
                      mean(ins_w), annual_figures(bare_w, basis), annual_figures(ins_w, basis),
                      warnings=list(insulated.warnings) + basis.gain_warning(q_ins))
    study.profile = profile
    study.result = insulated
    if fit_len:
        study.warnings.append(f"bare fittings count as {fit_len:.1f} m of bare pipe; insulating them "
                              "(removable covers) saves most of their share")
    table = basis.cost_table
    if table is not None:
        total_t = sum(float(np.max(l[1])) for l in spec.layers)
        study.installed_cost = float(table.cost_per_m(size.label, total_t)) * length
        saving = study.saving["cost"]
        if saving is not None:
            study.payback_years = float(simple_payback_years(study.installed_cost, saving))
        study.curve = _curve(spec, basis, size, pipe, fluid, air, surface, length, fit_len, q_bare)
    return study


def _curve(spec, basis, size, pipe, fluid, air, surface, length, fit_len, q_bare) -> EconomicCurve:
    """Economic curve of the outer layer's material over the table's thicknesses."""
    from .catalog.materials import lookup_material
    from .model import Layer
    from .solve import solve

    table = basis.cost_table
    thicknesses = table.thicknesses_m(size.label)
    fixed = [Layer(lookup_material(name), t) for name, t in spec.layers[:-1]]
    # thickness along the first axis; a profile's conditions along the last
    outer = Layer(lookup_material(spec.layers[-1][0]),
                  thicknesses if np.ndim(fluid.temp_c) == 0 else thicknesses[:, None])
    r = solve(pipe, fixed + [outer], fluid, air, surface)
    q = np.asarray(r.heat_flow_w_per_m)  # signed, per metre; fittings do not change with thickness
    return economic_curve(size.label, thicknesses, annual_figures(q, basis)["cost"], basis)
