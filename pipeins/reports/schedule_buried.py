"""The schedule's buried lines (pipeins.schedule_buried): each buried pipe in the soil, a twin
pair's supply and return apart, and the buried basis of each service (depth, soil and its
conductivity with the source, ground surface temperature, the pair)."""

from __future__ import annotations

from . import Column, Table

__all__ = ["buried_tables", "buried_data", "CSV_NAMES"]

#: The CSV file of each table in a ``--format csv`` folder.
CSV_NAMES = {"Buried lines": "buried.csv", "Buried lines: basis": "buried_basis.csv"}


def _pair(item) -> str:
    if item.pair is None:
        return "–"
    return f"{item.role}, {item.arrangement} with {item.pair}"


def buried_tables(buried, units: str) -> list[Table]:
    """The "Buried lines" and "Buried lines: basis" tables (none without buried lines)."""
    if buried is None or not buried.items:
        return []
    from ..schedule_buried import BASIS_NOTE

    rows = [[i.tag, i.service, i.size, _pair(i), i.depth_m, i.casing_diameter_m, i.fluid_temp_c, i.thickness_m,
             i.soil_resistance_mk_w, i.alone_heat_flow_w_per_m, i.heat_flow_w_per_m, i.heat_flow_w,
             i.bare_heat_flow_w_per_m, i.casing_temp_c] for i in buried.items]
    items = Table("Buried lines", [
        Column("line"), Column("service"), Column("size"), Column("pair"), Column("depth", "length"),
        Column("casing outside diameter", "diameter"), Column("fluid", "temperature"), Column("thickness", "thickness"),
        Column("soil resistance", "thermal_resistance_per_length"), Column("heat flow alone", "heat_flow_per_length"),
        Column("heat flow", "heat_flow_per_length"), Column("heat flow, line", "power"),
        Column("bare heat flow", "heat_flow_per_length"), Column("casing surface", "temperature")], rows,
        note="Heat flow positive = lost by the fluid, negative = gained; a pair's two pipes apart, never netted "
             "(each is a line of the Lines table and of the totals). Heat flow alone: the pipe by itself in the soil "
             "(a casing's supply: centred alone in the casing); heat flow: beside the other pipe of its pair. The "
             "bare line is the bare pipe in the soil (two pipes side by side: the pair bare, as far apart; pipes in "
             "one casing: each bare pipe alone).")
    basis_rows = []
    for service, b in buried.basis.items():
        soil = b["soil_name"] if b["soil_name"] != "given" else "given conductivity"
        pair = "alone"
        if b["arrangement"] == "side by side":
            pair = "a return beside it"
        elif b["arrangement"] == "one casing":
            pair = f"supply and return in one casing of {b['casing_insulation']}"
        basis_rows.append([service, b["depth_m"], soil, b["soil_k_w_mk"], b["soil_source"], b["ground_temp_c"], pair,
                           b["spacing_m"], b["return_temp_c"], b["casing_diameter_m"]])
    basis = Table("Buried lines: basis", [
        Column("service"), Column("depth to the pipe centre", "length"), Column("soil"),
        Column("soil conductivity", "conductivity"), Column("conductivity source"),
        Column("ground surface", "temperature"), Column("pipes"), Column("centres apart", "length"),
        Column("return", "temperature"), Column("casing outside diameter", "diameter")], basis_rows, note=BASIS_NOTE)
    return [items, basis]


def buried_data(buried) -> dict | None:
    """The JSON of the buried lines (SI), or None when there are none."""
    if buried is None or not buried.items:
        return None
    from ..schedule_buried import BASIS_NOTE

    return {"items": [i.to_dict() for i in buried.items], "basis": buried.basis, "method": BASIS_NOTE}
