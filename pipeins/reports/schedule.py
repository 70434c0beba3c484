"""Report of a project's insulation schedule: the schedule, the lines, the totals, the basis.

Tables, in this order (also the CSV files of a ``--format csv`` folder, see
:func:`csv_files`): the insulation schedule per service, location and size band
(``schedule.csv``); the per-line results (``lines.csv``); the totals bare, insulated and
saving, heat losses and heat gains apart and the money of each duty apart
(``totals.csv``); the investment over one set of lines when the project has a cost table
(``investment.csv``); and the basis: each service's fluid, temperature, energy basis and
code rule set (``services.csv``) and each location's air (``locations.csv``).

Every saving printed is bare − insulated of the two numbers printed beside it (rounded
first, then subtracted), so the rows subtract.  JSON carries the same in SI, unrounded,
with ``saving = bare − insulated`` of its own numbers.
"""

from __future__ import annotations

from collections.abc import Sequence
from functools import lru_cache

from . import Column, Report, Table
from .cost import per_energy_text
from .sizing import layers_text

__all__ = ["schedule_report", "csv_files", "CSV_NAMES"]

#: File name of each table when the report is written as CSV files into a folder.
CSV_NAMES = {"Insulation schedule": "schedule.csv", "Lines": "lines.csv", "Faces": "faces.csv",
             "Vessels": "vessels.csv", "Totals": "totals.csv", "Investment": "investment.csv",
             "Services": "services.csv", "Locations": "locations.csv"}


def csv_files(report) -> list[tuple[str, Table]]:
    """``(file name, table)`` of every table of a schedule report, in order."""
    from .schedule_buried import CSV_NAMES as BURIED
    from .schedule_fittings import CSV_NAMES as FITTINGS

    return [({**CSV_NAMES, **FITTINGS, **BURIED}[t.title], t) for t in report.tables]


def _governing(key, condition=None):
    from ..schedule import GOVERNING_LABELS

    text = GOVERNING_LABELS.get(key, "–") if key else "–"
    return f"{text} ({condition})" if key and condition else text


def _triple(figure, scale, digits):
    """(bare, insulated, saving) of a :class:`~pipeins.schedule.Figure` in display units,
    rounded to *digits*; the saving is the difference of the rounded numbers."""
    if figure.bare is None or figure.insulated is None:
        return None, None, None
    b, i = round(scale(figure.bare), digits), round(scale(figure.insulated), digits)
    return b, i, round(b - i, digits)


def _totals_table(schedule, units, cur):
    from ..units import to_display, unit_label

    t = schedule.totals
    lines = schedule.lines
    duties = [d for d, attr in (("heating", "bare_heat_loss_w"), ("cooling", "bare_heat_gain_w"))
              if any(getattr(l, attr) > 0 for l in lines)] or ["heating"]
    if units == "si":
        power, p_digits, p_unit = (lambda w: w / 1000.0), 2, "kW"
    else:
        power, p_digits, p_unit = (lambda w: to_display(w, "power", units)), 0, unit_label("power", units)
    e_digits = 0 if units == "si" else 1
    energy = (lambda j: to_display(j, "energy", units))
    e_unit = unit_label("energy", units)
    columns, cols = [], [Column("case")]
    for duty in duties:
        flow = t.heat_loss_w if duty == "heating" else t.heat_gain_w
        word = "heat loss" if duty == "heating" else "heat gain"
        cols.append(Column(word, unit=p_unit, digits=p_digits, grouped=True))
        columns.append(_triple(flow, power, p_digits))
        money = t.heating if duty == "heating" else t.cooling
        cols.append(Column(f"{duty} energy per year", unit=e_unit, digits=e_digits, grouped=True))
        columns.append(_triple(money["energy_j"], energy, e_digits))
        if money["cost"].bare is not None:
            cols.append(Column(f"{duty} cost per year", unit=cur or None, digits=0, grouped=True))
            columns.append(_triple(money["cost"], float, 0))
        if money["co2_kg"].bare is not None:
            cols.append(Column(f"{duty} CO2 per year", unit="t", digits=1, grouped=True))
            columns.append(_triple(money["co2_kg"], lambda kg: kg / 1000.0, 1))
    rows = [[name] + [c[j] for c in columns] for j, name in enumerate(("bare", "insulated", "saving"))]
    note = ("Heat losses (made up by the heat source: heating) and heat gains (removed by the chiller: "
            "cooling) are kept apart, never netted; saving = bare − insulated as printed.")
    if t.unpriced_lines:
        note += f" Energy, cost and CO2 leave out {len(t.unpriced_lines)} line(s) whose heat gain has no COP."
    return Table("Totals", cols, rows, note=note)


def _investment_table(schedule, cur):
    t = schedule.totals
    n, total = len(t.payback_lines), len(schedule.lines)
    payback = t.payback_years
    rows = [[f"{n} of {total}", t.installed_cost, t.cost_saving, payback]]
    return Table("Investment", [Column("lines covered"), Column("installed cost", unit=cur or None, digits=0, grouped=True),
                                Column("cost saving per year", unit=cur or None, digits=0, grouped=True),
                                Column("simple payback", unit="years", digits=1)], rows,
                 note="Installed cost, cost saving and payback cover the same lines"
                      + ("." if not t.lines_left_out else "; left out: " + ", ".join(t.lines_left_out) + "."))


def _energy_text(e, cur, units):
    """The energy basis of a service as words."""
    parts = [f"{e.hours_per_year:g} h/year", f"efficiency {e.efficiency:g}"]
    parts.append(f"COP {e.cop:g}" if e.cop is not None else "no COP")
    if e.price is not None:
        parts.append(f"price {per_energy_text(e.price.price_per_j, units, cur)}")
    if e.co2 is not None:
        parts.append(f"CO2 {per_energy_text(e.co2.kg_per_j, units, 'kg')}")
    parts.append(f"{100 * e.discount_rate:g} % over {e.years:g} years"
                 + (f", price rising {100 * e.escalation:g} %/year" if e.escalation else ""))
    return "; ".join(parts)


def _rule_set(project, name):
    from ..codes import load_rule_sets

    try:
        return load_rule_sets(project.code_paths)[name]
    except Exception:  # the schedule already ran with it; a listing problem must not hide the report
        return None


def _code_text(project, name, full: bool = False):
    """The rule set's name (its edition in the name) and table; with *full* its sources too."""
    if name is None:
        return None
    rule_set = _rule_set(project, name)
    if rule_set is None:
        return name
    if not full:
        return f"{name} ({rule_set.origin})"
    sources = "; ".join(dict.fromkeys(r.source for r in rule_set.rows))
    return f"{name} ({rule_set.origin}): {sources}"


def _basis_tables(schedule, units, cur):
    project = schedule.project
    used = {(l.service, l.condition) for l in schedule.lines}
    s_rows = []
    for name, s in project.services.items():
        if not any(sn == name for sn, _ in used):
            continue
        fluid = "steam (saturated)" if s.steam_pressure_pa is not None else (s.fluid or "water (no inner film)")
        s_rows.append([name, fluid, s.fluid_temp_c, s.steam_pressure_pa, s.material, s.finish or "–",
                       ", ".join(s.criteria), _code_text(project, s.code) if "code" in s.criteria else None,
                       _energy_text(s.energy, cur, units)])
    services = Table("Services", [
        Column("service"), Column("fluid"), Column("temperature", "temperature"),
        Column("steam pressure (absolute)", "pressure"), Column("material"), Column("finish"),
        Column("criteria"), Column("code rule set"), Column("energy basis")], s_rows,
        note="Heat losses are priced through the efficiency, heat gains through the COP; a gain with no "
             "COP is left unpriced, never priced as heating.")
    l_rows = []
    sets = getattr(project, "condition_sets", {})   # a line's several conditions: each of them
    shown = {m for _, cn in used for m in sets.get(cn, (cn,))}
    for name, c in project.conditions.items():
        if name not in shown:
            continue
        l_rows.append([name, c.air_temp_c, c.rh_percent, c.wind_m_s,
                       c.air_temp_c if c.surroundings_temp_c is None else c.surroundings_temp_c, c.pressure_pa])
    locations = Table("Locations", [
        Column("location"), Column("air", "temperature"), Column("relative humidity", "percent"),
        Column("wind", "speed"), Column("surroundings (radiant)", "temperature"),
        Column("air pressure (absolute)", "pressure")], l_rows,
        note="The surroundings are the mean radiant temperature (the air temperature when not given).")
    return services, locations


def _basis_data(schedule):
    project = schedule.project
    services = {}
    for name, s in project.services.items():
        e = s.energy
        services[name] = {
            "fluid": "steam" if s.steam_pressure_pa is not None else s.fluid,
            "fluid_temp_c": s.fluid_temp_c, "steam_pressure_pa": s.steam_pressure_pa,
            "material": s.material, "finish": s.finish, "criteria": list(s.criteria),
            "code": s.code if "code" in s.criteria else None,
            "code_basis": _code_text(project, s.code, full=True) if "code" in s.criteria else None,
            "energy": {"hours_per_year": e.hours_per_year, "efficiency": e.efficiency, "cop": e.cop,
                       "price_per_unit": None if e.price is None else e.price.price_per_unit,
                       "price_unit": None if e.price is None else e.price.unit,
                       "co2_kg_per_unit": None if e.co2 is None else e.co2.kg_co2_per_unit,
                       "co2_unit": None if e.co2 is None else e.co2.unit,
                       "discount_rate": e.discount_rate, "years": e.years, "escalation": e.escalation},
        }
    locations = {name: {"air_temp_c": c.air_temp_c, "rh_percent": c.rh_percent, "wind_m_s": c.wind_m_s,
                        "surroundings_temp_c": c.air_temp_c if c.surroundings_temp_c is None else c.surroundings_temp_c,
                        "pressure_pa": c.pressure_pa}
                 for name, c in project.conditions.items()}
    return {"services": services, "locations": locations}


def _clean(v, _float=float, _round=round):
    """A float (a numpy one too) rounded to 1e-9 (None for NaN or an infinity); anything else
    as it is."""
    if v.__class__ is _float or isinstance(v, _float):
        return _round(float(v), 9) if v - v == 0.0 else None
    return v


#: LineResult fields a pipe's JSON entry leaves out (its entry is as it always was).
SECTION_KEYS = frozenset({"kind", "basis", "area_m2", "count", "heat_flow_w_per_m2", "bare_heat_flow_w_per_m2",
                          "heat_flow_w_each", "bare_heat_flow_w_each", "governing_surface", "burial_depth_m", "pair"})
#: Fields that a section's entry carries only where they apply.
_BY_BASIS = frozenset({"area_m2", "count", "heat_flow_w_per_m2", "bare_heat_flow_w_per_m2", "heat_flow_w_each",
                       "bare_heat_flow_w_each", "governing_surface"})


def _line_data(lines) -> "LineEntries":
    """The JSON entry of every line (:class:`LineEntries`)."""
    return LineEntries(lines)


class LineEntries(Sequence):
    """The JSON entries of a schedule's lines, each built when it is read: its fields (floats
    rounded to 1e-9, never NaN or inf) and its heat loss and gain apart.

    A sequence rather than a list so that a 100,000-line schedule's JSON is written entry by
    entry (:func:`pipeins.reports.json_text`) without holding every entry at once; it
    indexes, iterates and compares equal to the list of its entries."""

    __slots__ = ("_lines",)

    def __init__(self, lines):
        self._lines = lines

    def __len__(self) -> int:
        return len(self._lines)

    def __getitem__(self, i):
        if isinstance(i, slice):
            return [_entry(l) for l in self._lines[i]]
        return _entry(self._lines[i])

    def __iter__(self):
        return map(_entry, self._lines)

    def __eq__(self, other):
        return list(self) == (list(other) if isinstance(other, Sequence) else other)

    __hash__ = None

    def __repr__(self) -> str:
        return f"LineEntries({len(self)} lines)"


@lru_cache(maxsize=1)
def _getters():
    from dataclasses import fields
    from operator import attrgetter

    from ..schedule import LineResult

    names = tuple(f.name for f in fields(LineResult))
    pipe_names = tuple(n for n in names if n not in SECTION_KEYS)
    return names, pipe_names, attrgetter(*names), attrgetter(*pipe_names)


def _entry(l) -> dict:
    names, pipe_names, get, get_pipe = _getters()
    if l.kind == "pipe":  # a pipe's entry as it always was
        entry = dict(zip(pipe_names, map(_clean, get_pipe(l))))
        if l.burial_depth_m is not None:   # a buried pipe: its depth, and its pair's other pipe
            entry.update(burial_depth_m=l.burial_depth_m, pair=l.pair)
    else:  # a section's: the keys of its basis (no per-metre figure on a face or vessel)
        entry = {k: v for k, v in zip(names, map(_clean, get(l))) if v is not None or k not in _BY_BASIS}
        if l.basis != "W/m":
            for key in ("length_m", "fittings_length_m", "heat_flow_w_per_m", "bare_heat_flow_w_per_m"):
                entry.pop(key, None)
    entry.update(heat_loss_w=l.heat_loss_w, bare_heat_loss_w=l.bare_heat_loss_w, heat_gain_w=l.heat_gain_w,
                 bare_heat_gain_w=l.bare_heat_gain_w)
    return entry


def _part(line) -> str:
    return line.governing_surface or "–"


_SECTION_NOTE = ("Heat flow positive = lost by the contents, negative = gained; the line's heat flow is the heat "
                 "flow per unit times the quantity. The surface is the governing part's (the hottest exposed "
                 "part of a section losing heat, the coldest of one gaining it); the bare line is the bare "
                 "wall or sheet.")


def _section_tables(schedule) -> list:
    """The faces (per m², by area) and the vessels (per vessel, by count), where there are any."""
    faces = [l for l in schedule.lines if l.basis == "W/m²"]
    vessels = [l for l in schedule.lines if l.basis == "W"]
    out = []
    if faces:
        out.append(Table("Faces", [
            Column("face"), Column("service"), Column("section"), Column("location"), Column("area", "area"),
            Column("thickness", "thickness"), Column("heat flow", "heat_flux"), Column("heat flow, face", "power"),
            Column("bare heat flow, face", "power"), Column("surface", "temperature"),
            Column("above dew point", "temperature_difference")],
            [[l.tag, l.service, l.size, l.condition, l.area_m2, l.thickness_m, l.heat_flow_w_per_m2, l.heat_flow_w,
              l.bare_heat_flow_w, l.surface_temp_c, l.dew_point_margin_k] for l in faces],
            note=_SECTION_NOTE + " A face's heat flow is per unit area of the face."))
    if vessels:
        out.append(Table("Vessels", [
            Column("vessel"), Column("service"), Column("section"), Column("location"), Column("count"),
            Column("thickness", "thickness"), Column("heat flow, each", "power"), Column("heat flow, line", "power"),
            Column("bare heat flow, line", "power"), Column("surface", "temperature"),
            Column("governing part"), Column("above dew point", "temperature_difference")],
            [[l.tag, l.service, l.size, l.condition, l.count, l.thickness_m, l.heat_flow_w_each, l.heat_flow_w,
              l.bare_heat_flow_w, l.surface_temp_c, _part(l), l.dew_point_margin_k] for l in vessels],
            note=_SECTION_NOTE + " A vessel's heat flow is per vessel, shell and heads (or roof and floor) "
                                 "together; the line's is that times the count."))
    return out


def schedule_report(schedule, units: str = "si", line_data: bool = True) -> Report:
    """The :class:`~pipeins.reports.Report` of a :class:`pipeins.schedule.Schedule`.

    With ``line_data=False`` the JSON payload leaves out the per-line entries
    (``data["lines"]`` is None): what the text, Markdown, CSV, HTML and XLSX outputs do
    not use, and the bulk of the memory of a long line list."""
    from ..bulk import paused_gc

    with paused_gc():
        return _schedule_report(schedule, units, line_data)


def _schedule_report(schedule, units: str, line_data: bool) -> Report:
    project = schedule.project
    cur = project.currency
    sched = Table("Insulation schedule", [
        Column("service"), Column("location"), Column("sizes"), Column("material"), Column("finish"),
        Column("thickness", "thickness"), Column("layers"), Column("governing requirement")],
        [[r.service, r.condition, r.size_band, r.material, r.finish, r.thickness_m, layers_text(r.layers_m, units),
          _governing(r.governing, r.governing_condition)] for r in schedule.rows])

    runs = [l for l in schedule.lines if l.basis == "W/m"]
    ducts = any(l.kind == "duct" for l in runs)
    buried = any(l.burial_depth_m is not None for l in runs)
    lines = Table("Lines", [
        Column("line"), Column("service"), Column("size"), Column("location"), Column("length", "length"),
        Column("thickness", "thickness"), Column("heat flow", "heat_flow_per_length"),
        Column("bare fittings", "length"), Column("heat flow, line", "power"),
        Column("bare heat flow, line", "power"), Column("surface", "temperature"),
        Column("above dew point", "temperature_difference"), Column("outlet", "temperature")]
        + ([Column("governing face")] if ducts else []) + ([Column("buried at", "length")] if buried else []),
        [[l.tag, l.service, l.size, l.condition, l.length_m, l.thickness_m, l.heat_flow_w_per_m,
          l.fittings_length_m or None, l.heat_flow_w, l.bare_heat_flow_w, l.surface_temp_c, l.dew_point_margin_k,
          l.outlet_temp_c] + ([_part(l)] if ducts else []) + ([l.burial_depth_m] if buried else []) for l in runs],
        note="Heat flow positive = lost by the fluid, negative = gained. Bare fittings are counted as "
             "that length of bare pipe; the bare line is the pipe's own surface with no insulation."
             + (" A duct's heat flow is per unit length of run over all its faces, its surface the governing face's "
                "(the coldest of a duct gaining heat, the hottest of one losing it); a duct's bare line is its "
                "bare sheet." if ducts else "")
             + (" A buried line (buried at: the depth of its centre) loses heat through the soil to the ground "
                "surface, its surface the casing's, its bare line the bare pipe in the soil; a twin pair's return "
                "is a line of its own (see Buried lines)." if buried else ""))

    tables = [sched] + ([lines] if runs or not schedule.lines else []) + _section_tables(schedule)
    tables += [_totals_table(schedule, units, cur)]
    t = schedule.totals
    if t.payback_lines or t.lines_left_out:
        tables.append(_investment_table(schedule, cur))
    from .schedule_fittings import fittings_data, fittings_tables, tracing_data, tracing_tables

    tables += fittings_tables(getattr(schedule, "fittings", None), units)   # fittings as objects, apart from the pipe
    tables += tracing_tables(getattr(schedule, "tracing", None), units)     # traced lines' design heat loss
    from .schedule_buried import buried_data, buried_tables

    tables += buried_tables(getattr(schedule, "buried", None), units)       # buried lines, twin pairs apart
    tables += list(_basis_tables(schedule, units, cur))

    footer = [f"units: {units}; currency: {cur or '–'}"]
    from .notes import notes_of, render_all

    warnings = render_all(schedule.warnings, units)
    cautions = render_all(schedule.cautions, units)
    bare = sorted({l.bare_surface if getattr(l, "burial_depth_m", None) is not None   # no radiation in the soil
                   else f"{l.bare_surface}, emittance {l.bare_emittance:.2f}" for l in schedule.lines})
    footer.append("bare line: " + "; ".join(bare) + " (no insulation, bare fittings as bare pipe)")
    codes = dict.fromkeys(s.code for s in project.services.values() if s.code and "code" in s.criteria)
    footer += [f"code rule set {_code_text(project, name, full=True)}" for name in codes]
    for service, texts in schedule.criteria_used.items():
        footer.append(f"{service}: " + "; ".join(texts))
    data = {
        "project": project.name,
        "units": project.units,
        "currency": cur,
        "schedule": [{"service": r.service, "condition": r.condition, "sizes": list(r.sizes),
                      "material": r.material, "finish": r.finish, "thickness_mm": round(r.thickness_m * 1000, 2),
                      "layers_mm": [round(x * 1000, 2) for x in r.layers_m], "governing": r.governing,
                      **({"governing_condition": r.governing_condition} if r.governing_condition else {})}
                     for r in schedule.rows],
        "lines": _line_data(schedule.lines) if line_data else None,
        "totals": {
            "heat_loss_w": t.heat_loss_w.to_dict(),
            "heat_gain_w": t.heat_gain_w.to_dict(),
            "heating": {k: f.to_dict() for k, f in t.heating.items()},
            "cooling": {k: f.to_dict() for k, f in t.cooling.items()},
            "unpriced_lines": list(t.unpriced_lines),
        },
        "investment": None if not (t.payback_lines or t.lines_left_out) else {
            "lines": list(t.payback_lines), "left_out": list(t.lines_left_out),
            "installed_cost": _clean(t.installed_cost), "cost_saving_per_year": _clean(t.cost_saving),
            "simple_payback_years": _clean(t.payback_years)},
        "fittings": fittings_data(getattr(schedule, "fittings", None)),
        "tracing": tracing_data(getattr(schedule, "tracing", None)),
        **({"buried": buried_data(schedule.buried)} if getattr(schedule, "buried", None) else {}),
        "basis": _basis_data(schedule),
        "criteria": schedule.criteria_used,
        "warnings": warnings,
        "cautions": cautions,
    }
    return Report(f"Insulation schedule: {project.name}", tables, data,
                  warnings, cautions, footer, notes=notes_of(schedule.warnings))
