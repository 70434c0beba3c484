"""A project's insulation schedule: thickness per service, location and size, and what it saves.

:func:`compute_schedule` takes a :class:`pipeins.project.Project` and

1. per service and location (condition), sizes every distinct pipe size in ONE call of
   :func:`pipeins.selection.select` (vectorised over sizes) with the service's criteria:
   touch safety, condensation control, a heat-flow cap, the temperature change along a
   run (then per run length), a freeze hold time, a code minimum, the economic thickness;
   the schedule thickness of a size is the thickest any of its lines needs;
2. solves every line at its schedule thickness and bare (both vectorised over the
   lines of a service and location), adds the bare fittings as equivalent lengths of bare
   pipe (:func:`pipeins.catalog.fittings.equivalent_length_m`), and the outlet
   temperature where the service gives a flow (:func:`pipeins.runs.temperature_along_run`);
3. prices the year (:func:`pipeins.annual.annual_figures`) and the installed cost (the
   project's cost table, when given).

The line heat flow is the heat flow per metre at the service temperature times the
length, plus the bare fittings: the project totals are sums of the lines.

Any requirement that cannot be met, or any input the library refuses, raises one
:class:`pipeins.project.ProjectError` naming the service or line in the project file.
"""

from __future__ import annotations

from dataclasses import dataclass, field

import numpy as np

from .errors import InputError
from .inputs import file_word, in_words
from .project import Project, ProjectError

__all__ = ["ScheduleRow", "LineResult", "Totals", "Schedule", "compute_schedule", "GOVERNING_LABELS"]

#: Report wording of each governing requirement key.
GOVERNING_LABELS = {
    "surface_temp": "touch safety",
    "condensation": "condensation control",
    "heat_flow": "heat-flow cap",
    "temp_change": "temperature change",
    "freeze": "freeze protection",
    "economic": "lifetime cost (economic thickness)",
    "code": "energy-code minimum",
}


@dataclass
class ScheduleRow:
    """A band of consecutive sizes of one service and location with one build-up."""

    service: str
    condition: str
    sizes: list[str]
    material: str
    finish: str
    thickness_m: float
    layers_m: tuple[float, ...]
    governing: str | None

    @property
    def size_band(self) -> str:
        return self.sizes[0] if len(self.sizes) == 1 else f"{self.sizes[0]} – {self.sizes[-1]}"


@dataclass
class LineResult:
    """One line solved at its schedule thickness (SI; heat flows positive = loss)."""

    tag: str
    service: str
    size: str
    condition: str
    length_m: float
    thickness_m: float
    heat_flow_w_per_m: float
    bare_heat_flow_w_per_m: float
    fittings_length_m: float
    heat_flow_w: float
    bare_heat_flow_w: float
    surface_temp_c: float
    dew_point_margin_k: float | None
    outlet_temp_c: float | None
    energy_j: float
    bare_energy_j: float
    cost: float | None
    bare_cost: float | None
    co2_kg: float | None
    bare_co2_kg: float | None
    installed_cost: float | None


@dataclass
class Totals:
    heat_flow_w: float
    bare_heat_flow_w: float
    energy_j: float
    bare_energy_j: float
    cost: float | None
    bare_cost: float | None
    co2_kg: float | None
    bare_co2_kg: float | None
    installed_cost: float | None
    payback_years: float | None
    heat_saving_w: float = 0.0   # sum over lines of |bare| − |insulated|


@dataclass
class Schedule:
    project: Project
    rows: list[ScheduleRow]
    lines: list[LineResult]
    totals: Totals
    warnings: list[str] = field(default_factory=list)
    cautions: list[str] = field(default_factory=list)
    criteria_used: dict = field(default_factory=dict)   # service -> criterion descriptions


def _size_order(size) -> tuple:
    return ({"steel": 0, "copper": 1, "metric": 2}.get(size.kind, 3), size.outer_diameter_m)


def _spec(service, condition, length_m=None, with_rh=True):
    from .line import LineSpec

    kw = dict(fluid_temp_c=service.temp_c, steam_pressure_pa=service.steam_pressure_pa,
              fluid=service.fluid, flow=service.flow if service.fluid else None,
              air_temp_c=condition.air_temp_c, surroundings_temp_c=condition.surroundings_temp_c,
              rh_percent=condition.rh_percent if with_rh else None, wind_m_s=condition.wind_m_s,
              pressure_pa=condition.pressure_pa, finish=service.finish, length_m=length_m)
    if service.requirements.touch_limit_c is not None:
        kw["touch_limit_c"] = service.requirements.touch_limit_c
    kw.update(condition.spec_kw)   # orientation, height, fixed outer coefficient
    kw.update(service.spec_kw)     # emittance, pipe material, velocity, inner film
    return LineSpec(**kw)


def _basis(service, cold: bool, with_cost: bool):
    from .annual import EnergyBasis

    e = service.energy
    return EnergyBasis(hours_per_year=e.hours_per_year, price=e.price,
                       efficiency=1.0 if cold and e.cop else e.efficiency,
                       cop=e.cop if cold else None, emission=e.co2, discount_rate=e.discount_rate,
                       years=e.years, escalation=e.escalation, maintenance_fraction=e.maintenance,
                       cost_table=service.cost_table if with_cost else None)


def compute_schedule(project: Project) -> Schedule:
    """The insulation schedule, per-line results and totals of *project* (see the module
    docstring).  Raises :class:`~pipeins.project.ProjectError` when a requirement cannot
    be met or an input is refused."""
    problems: list[str] = []
    warnings: list[str] = []
    groups: dict[tuple, list] = {}
    for line in project.lines:
        groups.setdefault((line.service, line.condition), []).append(line)

    chosen: dict[tuple, tuple] = {}   # (service, condition, size label) -> (thickness, split, governing)
    criteria_used: dict[str, list[str]] = {}
    for (sname, cname), lines in groups.items():
        service, condition = project.services[sname], project.conditions[cname]
        where = project.where(service.file_line, f'service "{sname}"')
        by_length = {}
        for line in lines:
            key = line.length_m if "temp_change" in service.criteria else None
            by_length.setdefault(key, []).append(line)
        for length, members in by_length.items():
            sizes = sorted({l.size.label: l.size for l in members}.values(), key=_size_order)
            try:
                sel = _select(project, service, condition, sizes, length)
            except InputError as exc:
                problems.append(f"{where}: {condition.name}: {in_words(exc.message, file_word)}")
                continue
            out = sel.outcome
            criteria_used.setdefault(sname, [])
            for c in out.criteria:
                text = f"{GOVERNING_LABELS.get(c.key, c.label)}: {c.description}"
                if text not in criteria_used[sname]:
                    criteria_used[sname].append(text)
            warnings += [f'service "{sname}": {n}' for n in sel.notes]
            for i, size in enumerate(sizes):
                if not out.feasible[i]:
                    msg = "; ".join(out.messages[i]) or "no thickness of the series meets every criterion"
                    problems.append(f"{where}: {size.label} in {condition.name}: {msg}")
                    continue
                key = (sname, cname, size.label)
                pick = (float(out.selected_m[i]), tuple(out.layer_split_m[i]), out.governing[i])
                if key not in chosen or pick[0] > chosen[key][0]:
                    chosen[key] = pick
            warnings += [f'service "{sname}" in {cname}: {w}' for w in dict.fromkeys(out.result.warnings)]
    if problems:
        raise ProjectError(list(dict.fromkeys(problems)))

    results: list[LineResult] = []
    for (sname, cname), lines in groups.items():
        try:
            results += _solve_lines(project, project.services[sname], project.conditions[cname], lines, chosen,
                                    warnings)
        except InputError as exc:
            service = project.services[sname]
            entry = f'service "{sname}"'
            problems.append(f"{project.where(service.file_line, entry)}: {cname}: {in_words(exc.message, file_word)}")
    if problems:
        raise ProjectError(problems)
    order = {line.tag: i for i, line in enumerate(project.lines)}
    results.sort(key=lambda r: order[r.tag])

    rows = _bands(project, chosen, groups)
    totals = _totals(results)
    if any(r.installed_cost is None for r in results) and totals.installed_cost is not None:
        warnings.append("installed cost left out for lines whose size or thickness the cost table does not list")
    cautions = _cautions(project, groups)
    return Schedule(project, rows, results, totals, list(dict.fromkeys(warnings)), cautions, criteria_used)


def _select(project, service, condition, sizes, length):
    from .selection import select

    cold = service.fluid_temp_c < condition.air_temp_c
    spec = _spec(service, condition, length, with_rh="condensation" in service.criteria)
    economic = _basis(service, cold, True) if "economic" in service.criteria else None
    return select(spec, service.material, service.requirements, service.series, project.units, sizes=sizes,
                  code=service.code, economic=economic, code_paths=project.code_paths, add_inner_layer=False)


def _solve_lines(project, service, condition, lines, chosen, warnings) -> list[LineResult]:
    from .annual import annual_figures
    from .catalog.fittings import equivalent_length_m
    from .catalog.materials import lookup_material
    from .model import Layer, Surface
    from .catalog.finishes import lookup_finish
    from .solve import solve

    n = len(lines)
    spec = _spec(service, condition)
    pipe, _, fluid, surroundings, surface = spec.build_model([l.size for l in lines], insulated=True)
    thickness = np.array([chosen[(l.service, l.condition, l.size.label)][0] for l in lines])[:, None]
    layers = [Layer(lookup_material(service.material), thickness)]
    result = solve(pipe, layers, fluid, surroundings, surface)
    bare_surface = Surface.from_finish(lookup_finish(
        "copper_oxidised" if lines[0].size.kind == "copper" else "bare_steel_oxidised"))
    bare = solve(pipe, [], fluid, surroundings, bare_surface)
    q = np.ravel(result.heat_flow_w_per_m)
    q_bare = np.ravel(bare.heat_flow_w_per_m)
    ts = np.ravel(result.surface_temp_c)
    od = np.array([l.size.outer_diameter_m for l in lines])
    fit_len = np.zeros(n)
    for kind in ("valve", "flange", "strainer"):
        counts = np.array([l.fittings.get(kind, 0) for l in lines], dtype=float)
        if counts.any():
            fit_len += counts * equivalent_length_m(kind, od)
    length = np.array([l.length_m for l in lines])
    heat = q * length + q_bare * fit_len
    heat_bare = q_bare * (length + fit_len)
    warnings += [f'service "{service.name}" in {condition.name}: {w}' for w in dict.fromkeys(result.warnings)]

    dew_margin = [None] * n
    if condition.rh_percent is not None and service.fluid_temp_c < condition.air_temp_c:
        from .props.humid import dew_point_c

        dew = float(dew_point_c(float(condition.air_temp_c), float(condition.rh_percent), float(condition.pressure_pa)))
        dew_margin = list(ts - dew)

    outlet = [None] * n
    if service.flow is not None and service.fluid and service.steam_pressure_pa is None:
        from .runs import mass_flow_kg_s, temperature_along_run

        mdot = mass_flow_kg_s(service.flow, service.fluid, service.temp_c)
        run = temperature_along_run(pipe, layers, service.fluid, service.temp_c, mdot, length[:, None],
                                    surroundings, surface, fluid.film_coefficient_w_m2k)
        outlet = list(np.ravel(run.outlet_temp_c))
        warnings += [f'service "{service.name}": {w}' for w in run.warnings]

    cold = service.fluid_temp_c < condition.air_temp_c
    basis = _basis(service, cold, False)
    ins, raw = annual_figures(heat, basis), annual_figures(heat_bare, basis)
    installed = [None] * n
    table = service.cost_table or project.cost_table
    if table is not None:
        for i, l in enumerate(lines):
            try:
                installed[i] = float(table.cost_per_m(l.size.label, thickness[i, 0])) * l.length_m
            except InputError:
                installed[i] = None

    def at(values, i):
        return None if values is None else float(np.ravel(values)[i])

    out = []
    for i, l in enumerate(lines):
        out.append(LineResult(
            l.tag, l.service, l.size.label, l.condition, l.length_m, float(thickness[i, 0]), float(q[i]),
            float(q_bare[i]), float(fit_len[i]), float(heat[i]), float(heat_bare[i]), float(ts[i]),
            None if dew_margin[i] is None else float(dew_margin[i]),
            None if outlet[i] is None else float(outlet[i]),
            at(ins["energy_j"], i), at(raw["energy_j"], i), at(ins["cost"], i), at(raw["cost"], i),
            at(ins["co2_kg"], i), at(raw["co2_kg"], i), installed[i]))
    return out


def _sum(values):
    values = [v for v in values]
    if all(v is None for v in values):
        return None
    return float(sum(v for v in values if v is not None))


def _totals(results: list[LineResult]) -> Totals:
    from .economics import simple_payback_years

    t = Totals(
        heat_flow_w=float(sum(r.heat_flow_w for r in results)),
        bare_heat_flow_w=float(sum(r.bare_heat_flow_w for r in results)),
        energy_j=float(sum(r.energy_j for r in results)),
        bare_energy_j=float(sum(r.bare_energy_j for r in results)),
        cost=_sum(r.cost for r in results), bare_cost=_sum(r.bare_cost for r in results),
        co2_kg=_sum(r.co2_kg for r in results), bare_co2_kg=_sum(r.bare_co2_kg for r in results),
        installed_cost=_sum(r.installed_cost for r in results), payback_years=None,
        heat_saving_w=float(sum(abs(r.bare_heat_flow_w) - abs(r.heat_flow_w) for r in results)))
    if t.installed_cost is not None and t.cost is not None:
        priced = [r for r in results if r.installed_cost is not None and r.cost is not None]
        saving = sum(r.bare_cost - r.cost for r in priced)
        t.payback_years = float(simple_payback_years(sum(r.installed_cost for r in priced), saving))
    return t


def _bands(project, chosen, groups) -> list[ScheduleRow]:
    from .catalog.materials import lookup_material

    rows = []
    for (sname, cname), lines in groups.items():
        service = project.services[sname]
        sizes = sorted({l.size.label: l.size for l in lines}.values(), key=_size_order)
        material = lookup_material(service.material).name
        finish = service.finish or "–"
        for size in sizes:
            thickness, split, governing = chosen[(sname, cname, size.label)]
            last = rows[-1] if rows else None
            if (last is not None and last.service == sname and last.condition == cname
                    and last.thickness_m == thickness and last.layers_m == split and last.governing == governing):
                last.sizes.append(size.label)
            else:
                rows.append(ScheduleRow(sname, cname, [size.label], material, finish, thickness, split, governing))
    return rows


def _cautions(project, groups) -> list[str]:
    from .catalog.finishes import lookup_finish
    from .reports.cautions import cautions

    services = [project.services[s] for s, _ in groups]
    return cautions([s.fluid_temp_c for s in services], [project.conditions[c].air_temp_c for _, c in groups],
                    [lookup_finish(s.finish).surface_kind for s in services if s.finish],
                    freeze=any("freeze" in s.criteria for s in services),
                    code=any(s.code is not None for s in services))
