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
from operator import attrgetter

import numpy as np

from .errors import InputError
from .inputs import file_word, in_words
from .notes import note as make_note, with_subject
from .project import Project, ProjectError

__all__ = ["ScheduleRow", "LineResult", "Totals", "Schedule", "compute_schedule", "GOVERNING_LABELS"]

#: Report wording of each governing requirement key.
GOVERNING_LABELS = {
    "surface_temp": "touch safety",
    "condensation": "condensation control",
    "heat_flow": "heat-flow cap",
    "heat_flux": "heat-flux cap (per m² of outer surface)",
    "temp_change": "temperature change",
    "freeze": "freeze protection",
    "tracer": "tracer output",
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
    #: The design condition that governs, where the lines have several (pipeins.design_conditions).
    governing_condition: str | None = None

    @property
    def size_band(self) -> str:
        return self.sizes[0] if len(self.sizes) == 1 else f"{self.sizes[0]} – {self.sizes[-1]}"


@dataclass(slots=True)
class LineResult:
    """One line solved at its schedule thickness and bare (SI).

    ``heat_flow_w*`` are signed (+ lost by the fluid, − gained).  The money side is kept
    apart by duty: ``heating_*`` prices the heat losses (through the efficiency),
    ``cooling_*`` the heat gains (through the chiller COP); a line that gains heat with no
    COP in its service's energy basis has ``priced = False`` and ``None`` in every money
    field (never priced as heating)."""

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
    bare_surface: str
    bare_emittance: float
    priced: bool
    heating_energy_j: float | None
    bare_heating_energy_j: float | None
    heating_cost: float | None
    bare_heating_cost: float | None
    heating_co2_kg: float | None
    bare_heating_co2_kg: float | None
    cooling_energy_j: float | None
    bare_cooling_energy_j: float | None
    cooling_cost: float | None
    bare_cooling_cost: float | None
    cooling_co2_kg: float | None
    bare_cooling_co2_kg: float | None
    installed_cost: float | None
    #: Why the line has no installed cost: a :class:`pipeins.notes.Note` (``schedule.no_price``,
    #: ``schedule.table_per_metre``), "" when it has one or no table is given.
    installed_cost_note: object = ""
    #: The section: "pipe", "duct", "face", "vessel" or "sphere", and the basis of its heat
    #: flow per unit ("W/m" per metre of run, "W/m²" per m² of face, "W" per vessel).
    kind: str = "pipe"
    basis: str = "W/m"
    #: A face's area [m²]; a vessel line's count of identical vessels.
    area_m2: float | None = None
    count: int | None = None
    #: Heat flow per m² of a face [W/m²], per vessel [W], at the schedule thickness and bare
    #: (a face or vessel has None in ``heat_flow_w_per_m``).
    heat_flow_w_per_m2: float | None = None
    bare_heat_flow_w_per_m2: float | None = None
    heat_flow_w_each: float | None = None
    bare_heat_flow_w_each: float | None = None
    #: The part whose surface temperature governs (a duct's or vessel's worst face).
    governing_surface: str | None = None
    #: A buried line's depth to the pipe centre [m] (None: in air), and the other pipe of its
    #: twin pair (its tag), if any (pipeins.schedule_buried).
    burial_depth_m: float | None = None
    pair: str | None = None

    @property
    def quantity(self) -> float:
        """The amount in the line's basis: length [m], area [m²] or count."""
        return {"W/m": self.length_m, "W/m²": self.area_m2, "W": self.count}[self.basis]

    @property
    def heat_flow_per_unit(self) -> float:
        """Heat flow per unit of the line's basis (W/m, W/m² or W per vessel)."""
        return {"W/m": self.heat_flow_w_per_m, "W/m²": self.heat_flow_w_per_m2, "W": self.heat_flow_w_each}[self.basis]

    @property
    def heat_loss_w(self) -> float:
        return max(self.heat_flow_w, 0.0)

    @property
    def bare_heat_loss_w(self) -> float:
        return max(self.bare_heat_flow_w, 0.0)

    @property
    def heat_gain_w(self) -> float:
        return max(-self.heat_flow_w, 0.0)

    @property
    def bare_heat_gain_w(self) -> float:
        return max(-self.bare_heat_flow_w, 0.0)

    def cost_saving(self) -> float | None:
        """Cost per year saved by the insulation, heating and cooling (None when unpriced)."""
        parts = [(self.bare_heating_cost, self.heating_cost), (self.bare_cooling_cost, self.cooling_cost)]
        if any(b is None or i is None for b, i in parts):
            return None
        return sum(b - i for b, i in parts)


@dataclass
class Figure:
    """A total bare and insulated; ``saving`` is bare − insulated of these two numbers."""

    bare: float | None
    insulated: float | None

    @property
    def saving(self) -> float | None:
        return None if self.bare is None or self.insulated is None else self.bare - self.insulated

    def to_dict(self) -> dict:
        return {"bare": self.bare, "insulated": self.insulated, "saving": self.saving}


@dataclass
class Totals:
    """Project totals, never netted: heat losses and heat gains apart, and the money of each
    duty (heating: losses; cooling: gains) as :class:`Figure` s.  ``heating``/``cooling``
    map ``energy_j``, ``cost``, ``co2_kg`` to a Figure (over the priced lines).

    The investment covers one set of lines, ``payback_lines``: those the cost table prices
    and whose energy is priced; ``installed_cost``, ``cost_saving`` and ``payback_years``
    are all over that set."""

    heat_loss_w: Figure
    heat_gain_w: Figure
    heating: dict
    cooling: dict
    installed_cost: float | None
    cost_saving: float | None
    payback_years: float | None
    payback_lines: list[str] = field(default_factory=list)
    lines_left_out: list[str] = field(default_factory=list)
    unpriced_lines: list[str] = field(default_factory=list)


@dataclass
class Schedule:
    project: Project
    rows: list[ScheduleRow]
    lines: list[LineResult]
    totals: Totals
    #: Text, or a :class:`pipeins.notes.Note` (with its subject) that the report writes in its units.
    warnings: list = field(default_factory=list)
    #: The cautions that apply (:class:`pipeins.notes.Note`, severity "caution"; the report writes them).
    cautions: list = field(default_factory=list)
    criteria_used: dict = field(default_factory=dict)   # service -> criterion descriptions
    #: The fittings listed as objects, bare and covered (pipeins.schedule_fittings.FittingsSchedule).
    fittings: Any = None
    #: The traced lines' design heat loss (pipeins.schedule_tracing.TracingSchedule).
    tracing: Any = None
    #: The buried lines, twin pairs apart (pipeins.schedule_buried.BuriedSchedule), or None.
    buried: Any = None


def _size_order(size) -> tuple:
    return ({"steel": 0, "copper": 1, "metric": 2}.get(size.kind, 3), size.outer_diameter_m)


def _spec(service, condition, length_m=None, with_rh=True, section=None):
    """The LineSpec of a service in a location; *section* adds a duct's, face's or vessel's
    fields (a duct's fluid is its air)."""
    from .line import LineSpec

    fluid = service.fluid
    if section and "duct" in section:
        fluid = None  # the air of the duct (a service for ducts says air or nothing)
    kw = dict(fluid_temp_c=service.temp_c, steam_pressure_pa=service.steam_pressure_pa,
              fluid=fluid, flow=service.flow if service.fluid else None,
              air_temp_c=condition.air_temp_c, surroundings_temp_c=condition.surroundings_temp_c,
              rh_percent=condition.rh_percent if with_rh else None, wind_m_s=condition.wind_m_s,
              pressure_pa=condition.pressure_pa, finish=service.finish, length_m=length_m)
    if service.requirements.touch_limit_c is not None:
        kw["touch_limit_c"] = service.requirements.touch_limit_c
    kw.update(condition.spec_kw)   # orientation, height, fixed outer coefficient
    kw.update(service.spec_kw)     # emittance, pipe material, velocity, inner film, sheet
    if section:
        kw.update(section)  # a face or vessel has its own facing or axis (LineSpec.build_surroundings)
    else:
        kw.pop("sheet", None)  # a pipe's wall is its pipe material
    return LineSpec(rh_as_written=True, **kw)


def _basis(service, with_cost: bool):
    """The service's energy basis: heat losses through its efficiency, heat gains through
    its COP (a gain with no COP is never priced as heating)."""
    from .annual import EnergyBasis

    e = service.energy
    return EnergyBasis(hours_per_year=e.hours_per_year, price=e.price, efficiency=e.efficiency, cop=e.cop,
                       emission=e.co2, discount_rate=e.discount_rate, years=e.years, escalation=e.escalation,
                       maintenance_fraction=e.maintenance,
                       cost_table=service.cost_table if with_cost else None)


def compute_schedule(project: Project, progress=None) -> Schedule:
    """The schedule of *project*, its user materials (``materials_file``) found first.

    *progress*, when given, is called as ``progress(stage, done, total)`` as the sizing
    (per service and location) and the line solves (per line) advance: a front end's
    progress bar (the library never prints)."""
    from .bulk import paused_gc
    from .user_materials import materials_in_use

    with materials_in_use(getattr(project, "materials", None)), paused_gc():
        out = _compute_schedule(project, progress or (lambda stage, done, total: None))
        from .schedule_fittings import schedule_fittings   # fittings listed as objects, apart from the pipe

        out.fittings = schedule_fittings(project, project.lines)
        out.warnings += [w for w in out.fittings.warnings if w not in out.warnings]
        from .schedule_tracing import schedule_tracing   # the design heat loss of traced services' lines

        out.tracing = schedule_tracing(project, out.lines)
        if out.tracing.problems:
            raise ProjectError(out.tracing.problems)
        out.warnings += [w for w in out.tracing.warnings if w not in out.warnings]
    out.warnings[:0] = [w for w in getattr(project, "materials_warnings", ()) if w not in out.warnings]
    return out


def _compute_schedule(project: Project, progress) -> Schedule:
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
    for number, ((sname, cname), lines) in enumerate(groups.items()):
        progress("sizing", number, len(groups))
        service, condition = project.services[sname], project.conditions[cname]
        where = project.where(service.file_line, f'service "{sname}"')
        by_length = {}
        for line in lines:
            key = line.length_m if "temp_change" in service.criteria else None
            group = _sizing_group(line)
            if service.buried and service.buried_inputs.get("casing_diameter_m") is not None:
                group += (line.size.label,)   # a twin casing fixes each size's build-up: one size a call
            by_length.setdefault((group, key), []).append(line)
        for (group, length), members in by_length.items():
            sizes = sorted({l.size.label: l.size for l in members}.values(), key=_size_order)
            try:
                if service.buried:   # in the soil (pipeins.schedule_buried)
                    from .schedule_buried import select_buried

                    sel = select_buried(project, service, condition, sizes, length)
                else:
                    sel = _select(project, service, condition, sizes, length, members[0])
            except InputError as exc:
                problems.append(f"{where}: {condition.name}: {in_words(exc.message, file_word)}")
                continue
            out = sel.outcome
            criteria_used.setdefault(sname, [])
            for c in out.criteria:
                text = f"{GOVERNING_LABELS.get(c.key, c.label)}: {c.description}"
                if text not in criteria_used[sname]:
                    criteria_used[sname].append(text)
            warnings += [with_subject(n, f'service "{sname}"') for n in sel.notes if not _unasked(n, service)]
            for i, size in enumerate(sizes):
                if not out.feasible[i] and service.thickness_m is not None:
                    problems.append(_fixed_thickness_miss(project, service, size, condition, None))
                    continue
                if not out.feasible[i]:
                    msg = "; ".join(out.messages[i]) or "no thickness of the series meets every criterion"
                    problems.append(f"{where}: {size.label} in {condition.name}: {msg}")
                    continue
                key = (sname, cname, size.label)
                pick = (float(out.selected_m[i]), tuple(out.layer_split_m[i]), out.governing[i],
                        sel.governing_condition[i] if hasattr(sel, "governing_condition") else None)
                if service.thickness_m is not None and abs(pick[0] - service.thickness_m) > 1e-9:
                    problems.append(_fixed_thickness_miss(project, service, size, condition, pick))
                    continue
                if key not in chosen or pick[0] > chosen[key][0]:
                    chosen[key] = pick
            warnings += [with_subject(w, f'service "{sname}" in {cname}') for w in dict.fromkeys(out.result.warnings)]
    if problems:
        raise ProjectError(list(dict.fromkeys(problems)))

    results: list[LineResult] = []
    buried = None
    progress("sizing", len(groups), len(groups))
    for (sname, cname), lines in groups.items():
        progress("solving lines", len(results), len(project.lines))
        try:
            pipes = [l for l in lines if l.kind == "pipe"]
            if pipes and project.services[sname].buried:   # in the soil, twin pairs apart
                from .schedule_buried import BuriedSchedule, solve_buried_lines

                buried = buried or BuriedSchedule()
                results += solve_buried_lines(project, project.services[sname], project.conditions[cname], pipes,
                                              chosen, warnings, buried)
            elif pipes:
                results += _solve_lines(project, project.services[sname], project.conditions[cname], pipes, chosen,
                                        warnings)
            if len(pipes) < len(lines):
                results += _solve_sections(project, project.services[sname], project.conditions[cname],
                                           [l for l in lines if l.kind != "pipe"], chosen, warnings)
        except InputError as exc:
            service = project.services[sname]
            entry = f'service "{sname}"'
            if service.buried and exc.name in ("depth_m", "twin_spacing_m"):   # a buried line's geometry
                problems.append(f"{project.where(service.file_line, entry, file_word(exc.name))}: "
                                f"{in_words(exc.message, file_word)}")
                continue
            problems.append(f"{project.where(service.file_line, entry)}: {cname}: {in_words(exc.message, file_word)}")
    progress("solving lines", len(project.lines), len(project.lines))
    if problems:
        raise ProjectError(problems)
    order = {line.tag: i for i, line in enumerate(project.lines)}
    # a twin pair's return line follows its supply
    results.sort(key=lambda r: (order[r.tag], 0) if r.tag in order else (order[r.pair], 1))

    rows = _bands(project, chosen, groups)
    totals = _totals(results)
    if totals.lines_left_out:
        warnings += _left_out_notes(results, totals)
    cautions = _cautions(project, groups)
    if buried is not None:
        order = {r.tag: i for i, r in enumerate(results)}
        buried.items.sort(key=lambda x: order[x.tag])
    return Schedule(project, rows, results, totals, list(dict.fromkeys(warnings)), cautions, criteria_used,
                    buried=buried)


def _unasked(note, service) -> bool:
    """A note on a criterion the service does not ask for: the schedule solves without the RH
    where condensation is not among its criteria, so "condensation not checked … give the RH"
    would ask for what the file already has."""
    if "condensation" in service.criteria:
        return False
    if isinstance(note, str):
        return note.startswith("condensation not checked")
    return note.code.startswith("condensation.not_checked")


def _left_out_notes(results, totals) -> list:
    """The investment's notes: how many lines it covers and which are left out, then why, by
    line (a cost table with no price for its size and thickness, or a table per metre for a
    section) and for the lines with no energy price together (a heat gain with no COP is named
    by the service's own note)."""
    left_out = set(totals.lines_left_out)
    out = [make_note("schedule.payback_partial", covered=(len(totals.payback_lines), "number"),
                     total=(len(results), "number"), lines=_named([r.tag for r in results if r.tag in left_out]))]
    by_reason: dict = {}   # one note per reason, with the lines it holds for (a long list named in part)
    for r in results:
        if r.tag in left_out and r.installed_cost_note:
            by_reason.setdefault(r.installed_cost_note, []).append(r.tag)
    out += [with_subject(reason, _named(tags, "line")) for reason, tags in by_reason.items()]
    no_price = [r.tag for r in results if r.tag in left_out and not r.installed_cost_note and r.priced]
    if no_price:
        out.append(make_note("schedule.no_energy_price", lines=_named(no_price)))
    return out


#: Lines a warning names before it counts the rest (every tag is in the JSON ``investment``).
_NAMED_LINES = 5


def _named(tags: list, word: str = "") -> str:
    """*tags* quoted and joined, the first few of a long list and how many more; *word* before
    them (``line "A"``, ``3 lines "A", "B", "C"``)."""
    shown = ", ".join(f'"{t}"' for t in tags[:_NAMED_LINES])
    if len(tags) > _NAMED_LINES:
        shown += f" and {len(tags) - _NAMED_LINES:,} more"
    if not word:
        return shown
    return f"{word} {shown}" if len(tags) == 1 else f"{len(tags):,} {word}s {shown}"


def _fixed_thickness_miss(project, service, size, condition, pick) -> str:
    """A line's given thickness that does not meet its service's criteria, in words."""
    from .units import format_quantity

    where = project.where(service.file_line, service.entry or f'service "{service.name}"', "thickness")
    given = format_quantity(service.thickness_m, "thickness", project.units)
    if pick is None:
        return f"{where}: {size.label} in {condition.name}: the given thickness {given} does not meet the criteria"
    picks = format_quantity(pick[0], "thickness", project.units)
    return (f"{where}: {size.label} in {condition.name}: the given thickness {given} does not meet the "
            f"{GOVERNING_LABELS.get(pick[2], pick[2])}; the sizing picks {picks}")


def _sizing_group(line) -> tuple:
    """Lines sized in one call: every pipe size of a service and location; every duct size of
    one shape (round or rectangular); each face or vessel by itself (its own geometry)."""
    if line.kind == "pipe":
        return ("pipe",)
    if line.kind == "duct":
        return ("duct", line.size.kind)
    return (line.kind, line.section)


def _section_kw(line) -> dict:
    """The LineSpec fields of a line's section (none for a pipe)."""
    return dict(line.section)


def _select(project, service, condition, sizes, length, line=None):
    """Size *sizes* of one sizing group (:func:`_sizing_group`) with the service's criteria,
    by :func:`pipeins.selection.select`, as ``size`` does for the same section."""
    from .selection import select

    economic = _basis(service, True) if "economic" in service.criteria else None
    section = _section_kw(line) if line is not None else {}
    kind = getattr(line, "kind", "pipe")
    if kind not in ("pipe", "duct"):
        sizes = None  # a face or vessel: one section, its own geometry
    if "tracer" in service.criteria and service.tracing:   # sized for the tracer at the maintain temperature
        return _select_traced(project, service, condition, sizes, length, section, economic)
    if condition.name in project.condition_sets:  # several design conditions
        from .design_conditions import select_over_conditions

        return select_over_conditions(
            lambda c, with_rh: _spec(service, c, length, with_rh=with_rh, section=section),
            [project.conditions[n] for n in project.condition_sets[condition.name]], service.criteria,
            service.material, service.requirements, service.series, project.units, sizes=sizes, code=service.code,
            economic=economic, code_paths=project.code_paths)
    spec = _spec(service, condition, length, with_rh="condensation" in service.criteria, section=section)
    return select(spec, service.material, service.requirements, service.series, project.units, sizes=sizes,
                  code=service.code, economic=economic, code_paths=project.code_paths, add_inner_layer=False)


def _select_traced(project, service, condition, sizes, length, section, economic):
    """Size a traced service whose criteria list "tracer": the tracer output under its own design
    condition, "heat tracing" (the fluid still at the maintain temperature, the air at the
    minimum design ambient, the location's wind: :func:`pipeins.tracing.tracing_spec`, as
    ``size --tracer-output`` solves a line given those temperatures), every other criterion under
    the line's condition(s); the largest requirement governs
    (:func:`pipeins.design_conditions.select_over_conditions`)."""
    from dataclasses import replace

    from .design_conditions import criteria_under, select_over_conditions
    from .tracing import tracing_spec

    t = dict(service.tracing)
    members = [project.conditions[n] for n in project.condition_sets.get(condition.name, (condition.name,))]
    conditions = []
    for c in members:
        here = service.criteria if len(members) == 1 else criteria_under(c, service.criteria)
        here = tuple(x for x in here if x != "tracer")
        if here:
            conditions.append(replace(c, criteria_here=here))
    base = members[0]
    traced = replace(base, name="heat tracing", air_temp_c=t.get("min_ambient_c", base.air_temp_c), rh_percent=None,
                     surroundings_temp_c=None if "min_ambient_c" in t else base.surroundings_temp_c,
                     criteria_here=("tracer",))

    def spec_of(c, with_rh):
        if c.name != traced.name or c.criteria_here != ("tracer",):
            return _spec(service, c, length, with_rh=with_rh, section=section)
        spec = _spec(service, base, length, with_rh=False, section=section)
        return tracing_spec(spec, t["maintain_temp_c"], t.get("min_ambient_c"))

    return select_over_conditions(spec_of, conditions + [traced], service.criteria, service.material,
                                  service.requirements, service.series, project.units, sizes=sizes, code=service.code,
                                  economic=economic, code_paths=project.code_paths, skip_unsized=True)


def _solve_lines(project, service, condition, lines, chosen, warnings) -> list[LineResult]:
    from .bare import bare_surface as bare_surface_of
    from .catalog.fittings import equivalent_length_m
    from .catalog.materials import lookup_material
    from .model import Layer
    from .solve import solve

    n = len(lines)
    spec = _spec(service, condition)
    pipe, _, fluid, surroundings, surface = spec.build_model([l.size for l in lines], insulated=True)
    thickness = np.array([chosen[(l.service, l.condition, l.size.label)][0] for l in lines])[:, None]
    layers = [Layer(lookup_material(service.material), thickness)]
    result = solve(pipe, layers, fluid, surroundings, surface)
    bare_surface = bare_surface_of(pipe, surface)  # the one bare line: the pipe's own material
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
    warnings += [with_subject(w, f'service "{service.name}" in {condition.name}')
                 for w in dict.fromkeys(result.warnings)]

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
        warnings += [with_subject(n, f'service "{service.name}"') for n in run.notes]
    return _line_results(project, service, lines, thickness, q, q_bare, fit_len, heat, heat_bare, ts, dew_margin,
                         outlet, bare_surface, warnings)


def _line_results(project, service, lines, thickness, q, q_bare, fit_len, heat, heat_bare, ts, dew_margin, outlet,
                  bare_surface, warnings, **extra) -> list[LineResult]:
    """The :class:`LineResult` of every pipe line of one service from its solved columns (per
    metre, per line, the bare ones, the surface): the money of each duty, the installed cost.
    *extra*: further LineResult fields, a list per line each (a buried line's)."""
    n = len(lines)
    basis, money, gaining = _money_and_gains(service, heat, heat_bare, [l.tag for l in lines], warnings)
    installed = [None] * n
    installed_note = [""] * n
    table = service.cost_table or project.cost_table
    if table is not None:
        per_m: dict = {}   # (size, thickness) -> cost per metre, or the note why there is none
        for i, l in enumerate(lines):
            key = (l.size.label, float(thickness[i, 0]))
            if key not in per_m:
                try:
                    per_m[key] = float(table.cost_per_m(l.size.label, thickness[i, 0]))
                except InputError:
                    per_m[key] = make_note("schedule.no_price", table=table.name, size=l.size.label,
                                      thickness_m=(float(thickness[i, 0]), "thickness"))
            cost = per_m[key]
            if not isinstance(cost, float):
                installed_note[i] = cost
            else:
                installed[i] = cost * l.length_m

    # every column as a list of Python floats (the same numbers float() gives), then one row per line
    priced = [not g for g in gaining.tolist()] if basis.cop is None else [True] * n
    every = all(priced)
    figures = [money[duty][case][key] if every else [v if p else None for v, p in zip(money[duty][case][key], priced)]
               for duty in ("heating", "cooling") for key in ("energy_j", "cost", "co2_kg")
               for case in ("insulated", "bare")]
    dew = [None if d is None else float(d) for d in dew_margin]
    out_t = [None if t is None else float(t) for t in outlet]
    name, emittance = bare_surface.name, float(bare_surface.emittance)
    columns = zip(lines, thickness[:, 0].tolist(), q.tolist(), q_bare.tolist(), fit_len.tolist(), heat.tolist(),
                  heat_bare.tolist(), ts.tolist(), dew, out_t, priced, *figures, installed, installed_note)
    out = [LineResult(l.tag, l.service, l.size.label, l.condition, l.length_m, t, qi, qb, fl, h, hb, tsi, d, o,
                      name, emittance, p, *rest)
           for l, t, qi, qb, fl, h, hb, tsi, d, o, p, *rest in columns]
    for key, values in extra.items():
        for line, value in zip(out, values):
            setattr(line, key, value)
    return out


def _solve_sections(project, service, condition, lines, chosen, warnings) -> list[LineResult]:
    """Ducts, faces and vessels of one service and location, solved at their schedule
    thickness and bare: every duct of one shape in one solve (a row per duct), each face or
    vessel section once.  The line's heat flow is its heat flow per unit (W/m, W/m², W)
    times its quantity (length, area, count)."""
    from .bare import bare_surface as bare_surface_of
    from .catalog.materials import lookup_material
    from .model import Layer
    from .solve import solve

    material = lookup_material(service.material)
    table = service.cost_table or project.cost_table
    groups: dict = {}
    for line in lines:
        groups.setdefault(("duct", line.size.kind) if line.kind == "duct" else (line.kind, line.size.label),
                          []).append(line)
    solved = []   # (line, q, q_bare, surface temp, governing part, bare surface, thickness)
    for key, members in groups.items():
        spec = _spec(service, condition, section=_section_kw(members[0]))
        if key[0] == "duct":
            sizes = [l.size for l in members]
            pipe, _, fluid, surroundings, surface = spec.build_model(sizes, insulated=True)
            thickness = np.array([chosen[(l.service, l.condition, l.size.label)][0] for l in members])[:, None]
        else:
            pipe, _, fluid, surroundings, surface = spec.build_model(insulated=True)
            thickness = np.full((1, 1), chosen[(members[0].service, members[0].condition, members[0].size.label)][0])
            fluid = _column(fluid)
        layers = [Layer(material, np.where(thickness > 0, thickness, 1e-9))] if np.any(thickness > 0) else []
        result = solve(pipe, layers, fluid, surroundings, surface)
        bare_surface = bare_surface_of(pipe, surface)
        bare = solve(pipe, [], fluid, surroundings, bare_surface)
        warnings += [with_subject(w, f'service "{service.name}" in {condition.name}')
                     for w in dict.fromkeys(result.warnings)]
        q = np.ravel(np.broadcast_to(result.heat_flow, thickness.shape))
        q_bare = np.ravel(np.broadcast_to(bare.heat_flow, thickness.shape))
        ts = np.ravel(np.broadcast_to(result.surface_temp_c, thickness.shape))
        parts = _governing_parts(result, thickness.shape)
        area = [None] * len(members)   # surface before insulating per unit, what a table per m² prices
        if table is not None and table.per_area:
            from .annual import surface_area_m2

            area = np.ravel(np.broadcast_to(surface_area_m2(pipe, fluid, surroundings, surface),
                                            thickness.shape)).tolist()
        leaving = [None] * len(members)
        if key[0] == "duct" and (spec.flow is not None or spec.velocity_m_s is not None):
            leaving = _leaving_air(spec, result, members, thickness.shape, service, warnings)
        for i, line in enumerate(members):
            j = i if key[0] == "duct" else 0
            solved.append((line, float(q[j]), float(q_bare[j]), float(ts[j]), parts[j], bare_surface,
                           float(thickness[j, 0]), result.basis, leaving[i], area[j]))
    n = len(solved)
    quantity = np.array([l.quantity for l, *_ in solved])
    heat = np.array([x[1] for x in solved]) * quantity
    heat_bare = np.array([x[2] for x in solved]) * quantity
    dew_margin = [None] * n
    if condition.rh_percent is not None and service.fluid_temp_c < condition.air_temp_c:
        from .props.humid import dew_point_c

        dew = float(dew_point_c(float(condition.air_temp_c), float(condition.rh_percent), float(condition.pressure_pa)))
        dew_margin = [x[3] - dew for x in solved]
    basis, money, gaining = _money_and_gains(service, heat, heat_bare, [x[0].tag for x in solved], warnings)
    priced = [not g for g in gaining.tolist()] if basis.cop is None else [True] * n
    out = []
    for i, (line, qi, qb, tsi, part, bare_surface, t, unit, outlet, area_per_unit) in enumerate(solved):
        figures = [money[duty][case][key][i] if priced[i] else None
                   for duty in ("heating", "cooling") for key in ("energy_j", "cost", "co2_kg")
                   for case in ("insulated", "bare")]
        installed, note = None, ""
        if table is not None and not table.per_area:
            note = make_note("schedule.table_per_metre", table=table.name, kind=line.kind, size=line.size.label)
        elif table is not None:
            try:
                installed = float(np.ravel(table.installed_cost(line.size.label, t, area_per_unit))[0]) * line.quantity
            except InputError:
                note = make_note("schedule.no_price", table=table.name, size=line.size.label,
                                 thickness_m=(float(t), "thickness"))
        per = {"W/m": {}, "W/m²": {"heat_flow_w_per_m2": qi, "bare_heat_flow_w_per_m2": qb},
               "W": {"heat_flow_w_each": qi, "bare_heat_flow_w_each": qb}}[unit]
        run = unit == "W/m"
        out.append(LineResult(
            line.tag, line.service, line.size.label, line.condition, line.length_m if run else None, t,
            qi if run else None, qb if run else None, 0.0, float(heat[i]), float(heat_bare[i]), tsi,
            None if dew_margin[i] is None else float(dew_margin[i]), outlet, bare_surface.name,
            float(bare_surface.emittance), priced[i], *figures, installed, note,
            kind=line.kind, basis=unit, area_m2=line.area_m2, count=line.count, governing_surface=part, **per))
    return out


def _leaving_air(spec, result, members, shape, service, warnings) -> list:
    """The leaving-air temperature [°C] of every duct run of one solve, marched along each
    run's length at the schedule thickness (:func:`pipeins.sections.duct_air_run`, as ``check
    --length --flow`` does); the line's heat flow stays per metre at the entering air, as a
    pipe's does."""
    from dataclasses import replace

    from .sections import duct_air_run

    lengths = np.array([l.length_m for l in members], dtype=float)[:, None]
    run, _ = duct_air_run(replace(spec, length_m=lengths), result)
    warnings += [with_subject(w, f'service "{service.name}"') for w in run.notes]
    return [float(x) for x in np.ravel(np.broadcast_to(run.leaving_temp_c, shape))]


def _column(fluid):
    """A fluid whose film coefficient has the (1, 1) shape of one section's row."""
    from dataclasses import replace

    if fluid.film_coefficient_w_m2k is None:
        return fluid
    return replace(fluid, film_coefficient_w_m2k=np.reshape(fluid.film_coefficient_w_m2k, (1, 1)))


def _governing_parts(result, shape) -> list:
    """Per case, the name of the part whose surface temperature governs (None for one part)."""
    patches = getattr(result, "patches", None)
    n = int(np.prod(shape))
    if not patches or len(patches) < 2:
        return [None] * n
    ts = np.ravel(np.broadcast_to(result.surface_temp_c, shape))
    names = [None] * n
    for p in patches:
        if not p.exposed:
            continue
        temps = np.ravel(np.broadcast_to(p.result.surface_temp_c, shape))
        for i in range(n):
            if names[i] is None and temps[i] == ts[i]:
                names[i] = p.name
    return names



def _money_and_gains(service, heat, heat_bare, tags, warnings):
    """The energy basis of *service*, the money of its items' heat flows (insulated and bare, W)
    and which items gain heat; a gain with no chiller COP is left unpriced, with a warning naming
    the items (*tags*, in the items' order)."""
    basis = _basis(service, False)
    money = _line_money(heat, heat_bare, basis)
    gaining = (heat < 0) | (heat_bare < 0)
    if basis.cop is None and gaining.any():
        named = ", ".join(f'"{t}"' for t, g in zip(tags, gaining) if g)
        said = next((i for i, w in enumerate(warnings) if getattr(w, "code", None) == "schedule.gain_without_cop"
                     and dict(w.words).get("service") == service.name), None)   # a pair's pipes: once per service
        if said is None:
            warnings.append(make_note("schedule.gain_without_cop", service=service.name, lines=named))
        else:
            warnings[said] = make_note("schedule.gain_without_cop", service=service.name,
                                       lines=f'{dict(warnings[said].words)["lines"]}, {named}')
    return basis, money, gaining

def _line_money(heat, heat_bare, basis) -> dict:
    """``{duty: {"insulated"|"bare": {"energy_j"|"cost"|"co2_kg": list}}}`` per line; a line
    that gains heat with no COP gets zeros here (the caller leaves it unpriced)."""
    from .annual import split_figures

    out = {"heating": {}, "cooling": {}}
    for case, q in (("insulated", heat), ("bare", heat_bare)):
        if basis.cop is None:
            q = np.where(q < 0, 0.0, q)  # unpriced heat gains: the caller leaves these lines out
        fig = split_figures(q, basis)
        for duty in out:
            out[duty][case] = {k: [None] * len(q) if v is None else np.ravel(np.asarray(v, dtype=float)).tolist()
                               for k, v in fig[duty].items()}
    return out


def _sum(values):
    values = list(values)
    if not values or any(v is None for v in values):
        return None
    return float(sum(values))


def _totals(results: list[LineResult]) -> Totals:
    """Totals of *results*: plain sums of the lines, losses and gains apart; money over the
    priced lines; the investment over one set of lines (see :class:`Totals`)."""
    from .economics import simple_payback_years

    priced = [r for r in results if r.priced]

    def figure(attr):
        return Figure(_sum(map(attrgetter("bare_" + attr), priced)), _sum(map(attrgetter(attr), priced)))

    heat_loss = Figure(float(sum(r.bare_heat_loss_w for r in results)), float(sum(r.heat_loss_w for r in results)))
    heat_gain = Figure(float(sum(r.bare_heat_gain_w for r in results)), float(sum(r.heat_gain_w for r in results)))
    heating = {key: figure(f"heating_{key}") for key in ("energy_j", "cost", "co2_kg")}
    cooling = {key: figure(f"cooling_{key}") for key in ("energy_j", "cost", "co2_kg")}
    if not any(r.bare_heat_gain_w > 0 or r.heat_gain_w > 0 for r in priced) and len(priced) < len(results):
        cooling = {key: Figure(None, None) for key in cooling}  # no heat gain priced at all: no cooling money
    has_table = any(r.installed_cost is not None or r.installed_cost_note for r in results)
    t = Totals(heat_loss, heat_gain, heating, cooling, None, None, None,
               unpriced_lines=[r.tag for r in results if not r.priced])
    if has_table:
        is_covered = [r.installed_cost is not None and r.cost_saving() is not None for r in results]
        covered = [r for r, c in zip(results, is_covered) if c]
        t.payback_lines = [r.tag for r in covered]
        t.lines_left_out = [r.tag for r, c in zip(results, is_covered) if not c]
        if covered:
            t.installed_cost = float(sum(r.installed_cost for r in covered))
            t.cost_saving = float(sum(r.cost_saving() for r in covered))
            t.payback_years = float(simple_payback_years(t.installed_cost, t.cost_saving))
    return t


def _bands(project, chosen, groups) -> list[ScheduleRow]:
    from .catalog.materials import lookup_material

    rows = []
    for (sname, cname), lines in groups.items():
        service = project.services[sname]
        sizes = sorted({l.size.label: l.size for l in lines}.values(), key=_size_order)
        kinds = {l.size.label: l.kind for l in lines}
        material = lookup_material(service.material).name
        finish = service.finish or "–"
        last_kind = None
        for size in sizes:
            thickness, split, governing, under = chosen[(sname, cname, size.label)]
            last = rows[-1] if rows else None
            # a band runs over pipe sizes or over duct sizes of one shape; a face or vessel is a row
            band = kinds[size.label] if kinds[size.label] == "pipe" else (
                ("duct", size.kind) if kinds[size.label] == "duct" else None)
            same_band, last_kind = band is not None and band == last_kind, band
            if (last is not None and same_band and last.service == sname and last.condition == cname
                    and last.thickness_m == thickness and last.layers_m == split and last.governing == governing
                    and last.governing_condition == under):
                last.sizes.append(size.label)
            else:
                rows.append(ScheduleRow(sname, cname, [size.label], material, finish, thickness, split, governing,
                                        under))
    return rows


def _cautions(project, groups) -> list:
    from .catalog.finishes import lookup_finish
    from .cautions import caution_notes

    services = [project.services[s] for s, _ in groups]
    air = [s.buried_inputs.get("ground_temp_c", project.conditions[c].air_temp_c)   # a buried line's: the ground
           for s, (_, c) in zip(services, groups)]
    return caution_notes([s.fluid_temp_c for s in services], air,
                    [lookup_finish(s.finish).surface_kind for s in services if s.finish],
                    freeze=any("freeze" in s.criteria for s in services),
                    code=any(s.code is not None for s in services))
