"""Report of a project's insulation schedule: the schedule, the lines, the totals.

Tables (in this order, also the CSV files ``schedule.csv``, ``lines.csv``,
``totals.csv``): the insulation schedule per service, location and size band; the
per-line results; the totals bare against insulated (plus installed cost and payback
when the project has a cost table).  JSON carries the same in SI.
"""

from __future__ import annotations

from . import Column, Report, Table
from .sizing import layers_text

__all__ = ["schedule_report", "CSV_NAMES"]

#: File name of each table when the report is written as CSV files into a folder.
CSV_NAMES = ("schedule.csv", "lines.csv", "totals.csv")


def _money(value, currency: str):
    return None if value is None else f"{value:,.0f} {currency}".strip()


def _kw(value_w, units):
    from ..units import format_quantity

    if units == "si":
        return f"{value_w / 1000:.2f}"
    return format_quantity(value_w, "power", units).rsplit(" ", 1)[0]


def _governing(key):
    from ..schedule import GOVERNING_LABELS

    return GOVERNING_LABELS.get(key, "–") if key else "–"


def schedule_report(schedule, units: str = "si") -> Report:
    """The :class:`~pipeins.reports.Report` of a :class:`pipeins.schedule.Schedule`."""
    from ..units import unit_label

    project = schedule.project
    cur = project.currency
    sched = Table("Insulation schedule", [
        Column("service"), Column("location"), Column("sizes"), Column("material"), Column("finish"),
        Column("thickness", "thickness"), Column("layers"), Column("governing requirement")],
        [[r.service, r.condition, r.size_band, r.material, r.finish, r.thickness_m, layers_text(r.layers_m, units),
          _governing(r.governing)] for r in schedule.rows])

    lines = Table("Lines", [
        Column("line"), Column("size"), Column("length", "length"), Column("thickness", "thickness"),
        Column("heat flow", "heat_flow_per_length"), Column("bare fittings", "length"),
        Column("heat flow, line", "power"), Column("surface", "temperature"),
        Column("above dew point", "temperature_difference"), Column("outlet", "temperature")],
        [[l.tag, l.size, l.length_m, l.thickness_m, l.heat_flow_w_per_m, l.fittings_length_m or None,
          l.heat_flow_w, l.surface_temp_c, l.dew_point_margin_k, l.outlet_temp_c] for l in schedule.lines],
        note="Heat flow positive = lost by the fluid, negative = gained. Bare fittings are counted as "
             "that length of bare pipe.")

    t = schedule.totals
    power_head = "heat flow [kW]" if units == "si" else f"heat flow [{unit_label('power', units)}]"
    energy = Column("energy per year", "energy")

    def row(name, q, e, cost, co2):
        return [name, _kw(q, units), e, _money(cost, cur), None if co2 is None else f"{co2 / 1000:,.1f}"]

    totals_rows = [row("insulated", t.heat_flow_w, t.energy_j, t.cost, t.co2_kg),
                   row("bare", t.bare_heat_flow_w, t.bare_energy_j, t.bare_cost, t.bare_co2_kg),
                   row("saving", t.heat_saving_w, t.bare_energy_j - t.energy_j,
                       None if t.cost is None else t.bare_cost - t.cost,
                       None if t.co2_kg is None else t.bare_co2_kg - t.co2_kg)]
    if t.installed_cost is not None:
        payback = "never" if t.payback_years is None or t.payback_years == float("inf") else f"{t.payback_years:.1f} years"
        totals_rows.append(["installed cost", None, None, _money(t.installed_cost, cur), None])
        totals_rows.append(["simple payback", None, None, payback, None])
    totals = Table("Totals", [Column("case"), Column(power_head), energy, Column("cost per year"),
                              Column("CO2 per year [t]")], totals_rows,
                   note="Heat flow: net (losses positive, gains negative); the saving counts both as "
                        "magnitudes.")

    footer = [f"units: {units}; currency: {cur or '–'}"]
    for service, texts in schedule.criteria_used.items():
        footer.append(f"{service}: " + "; ".join(texts))
    data = {
        "project": project.name,
        "units": project.units,
        "currency": cur,
        "schedule": [{"service": r.service, "condition": r.condition, "sizes": list(r.sizes),
                      "material": r.material, "finish": r.finish, "thickness_mm": round(r.thickness_m * 1000, 2),
                      "layers_mm": [round(x * 1000, 2) for x in r.layers_m], "governing": r.governing}
                     for r in schedule.rows],
        "lines": [{k: (round(v, 9) if isinstance(v, float) else v) for k, v in l.__dict__.items()}
                  for l in schedule.lines],
        "totals": {k: (None if v is None or v == float("inf") else round(v, 9) if isinstance(v, float) else v)
                   for k, v in t.__dict__.items()},
        "criteria": schedule.criteria_used,
        "warnings": schedule.warnings,
        "cautions": schedule.cautions,
    }
    return Report(f"Insulation schedule: {project.name}", [sched, lines, totals], data,
                  list(schedule.warnings), list(schedule.cautions), footer)
