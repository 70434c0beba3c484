"""The schedule's field sections: fittings listed as objects (pipeins.schedule_fittings), each
bare and covered with their own totals apart from the pipe, and the traced lines' design heat
loss (pipeins.schedule_tracing)."""

from __future__ import annotations

from . import Column, Table

__all__ = ["fittings_tables", "fittings_data", "tracing_tables", "tracing_data", "CSV_NAMES"]

#: The CSV file of each table in a ``--format csv`` folder.
CSV_NAMES = {"Fittings": "fittings.csv", "Fittings totals": "fittings_totals.csv", "Heat tracing": "tracing.csv"}

NOTE = ("Each fitting solved as a short horizontal cylinder of its flange outside diameter and bare area, at the "
        "line's fluid temperature and location (in the manner of ASTM C1129); the cover is one layer of the given "
        "material and thickness over it, at the service's design conductivity where it has design factors (ageing, "
        "moisture, joints: a removable cover ages and gets wet in service as the pipe insulation does; the cover's "
        "name then says the factor). Heat flow positive = lost by the fluid, negative = gained. These fittings "
        "are not in the lines' heat flows; counted fittings (valves = 2) still are, as bare pipe.")


def fittings_tables(fittings, units: str) -> list[Table]:
    """The "Fittings" and "Fittings totals" tables of a
    :class:`pipeins.schedule_fittings.FittingsSchedule` (none when no line lists fittings)."""
    if fittings is None or not fittings.items:
        return []
    rows = [[f.tag, f.service, f.condition, f.label, f.area_m2, f.heat_flow_w, f.surface_temp_c, f.cover or "none",
             f.covered_heat_flow_w, f.covered_surface_temp_c, f.saving_w] for f in fittings.items]
    table = Table("Fittings", [
        Column("line"), Column("service"), Column("location"), Column("fitting"), Column("bare area", "area"),
        Column("bare heat flow", "power"), Column("bare surface", "temperature"), Column("cover"),
        Column("covered heat flow", "power"), Column("cover surface", "temperature"), Column("saving", "power")],
        rows, note=NOTE)
    t = fittings.totals
    totals = Table("Fittings totals", [Column("quantity"), Column("bare", "power"), Column("as installed", "power"),
                                       Column("saving", "power")],
                   [["heat loss", t.bare_heat_loss_w, t.installed_heat_loss_w, t.saving_heat_loss_w],
                    ["heat gain", t.bare_heat_gain_w, t.installed_heat_gain_w, t.saving_heat_gain_w]],
                   note=f"{t.count} fittings, {t.covered_count} of them covered; as installed = covered where a "
                        "cover is given, bare where not; losses and gains apart, never netted")
    return [table, totals]


def fittings_data(fittings) -> dict | None:
    """The JSON of the fittings section (SI), or None when no line lists fittings."""
    if fittings is None or not fittings.items:
        return None
    return {"items": [f.to_dict() for f in fittings.items], "totals": fittings.totals.to_dict(), "method": NOTE}


TRACING_NOTE = ("Each traced line solved with the fluid still at the maintain temperature, the air and radiant "
                "surroundings at the minimum design ambient, the location's wind, at its scheduled insulation; the "
                "design heat loss is that loss × (1 + safety factor) (default 20 %, common practice after IEEE 515 / "
                "IEC/IEEE 60079-30-2, from memory). Valves and flanges add their own loss: size the tracer with the "
                "maker's allowances. Follow the tracer maker's rules and the local electrical code.")


def tracing_tables(tracing, units: str) -> list[Table]:
    """The "Heat tracing" table of a :class:`pipeins.schedule_tracing.TracingSchedule`."""
    if tracing is None or not tracing.items:
        return []
    rows = [[i.tag, i.service, i.condition, i.maintain_temp_c, i.min_ambient_c, i.thickness_m, i.heat_loss_w_per_m,
             i.safety_factor_percent, i.design_heat_loss_w_per_m, i.design_heat_loss_w, i.tracer_output_w_per_m,
             i.margin_percent] for i in tracing.items]
    return [Table("Heat tracing", [
        Column("line"), Column("service"), Column("location"), Column("maintain", "temperature"),
        Column("min. ambient", "temperature"), Column("thickness", "thickness"),
        Column("heat loss", "heat_flow_per_length"), Column("safety factor", "percent", 0),
        Column("design loss", "heat_flow_per_length"), Column("design loss, line", "power"),
        Column("tracer output", "heat_flow_per_length"), Column("margin", "percent", 0)], rows, note=TRACING_NOTE)]


def tracing_data(tracing) -> dict | None:
    if tracing is None or not tracing.items:
        return None
    return {"items": [i.to_dict() for i in tracing.items], "total_design_heat_loss_w": tracing.total_design_heat_loss_w,
            "method": TRACING_NOTE}
