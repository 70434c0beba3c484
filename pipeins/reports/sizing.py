"""Reports of a sizing: one line (``size``) and the thickness table per size (``table``)."""

from __future__ import annotations


import numpy as np

from . import Column, Report, Table
from .cautions import cautions

__all__ = ["size_report", "table_report", "matrix_report", "layers_text"]

ALL_KEYS = ("surface_temp", "condensation", "heat_flow", "heat_flux", "temp_change", "freeze", "economic", "code",
            "service_limit")


def traced_alternative(report, selection, units):
    from .field import add_traced_alternative  # freeze hold beyond a practical thickness: tracing offered

    return add_traced_alternative(report, selection, units)


def _mm(x):
    return None if x is None or not np.isfinite(x) else round(float(x) * 1000, 2)


def layers_text(split, units: str) -> str:
    from ..units import format_quantity

    if not split:
        return "–"
    if len(split) == 1:
        return format_quantity(split[0], "thickness", units)
    return " + ".join(format_quantity(t, "thickness", units) for t in split) + " (two layers)"


def required_mm(selection, index: int) -> dict:
    """Every criterion key → continuous least thickness in mm, null when not active."""
    out = {key: None for key in ALL_KEYS[:3]}
    for c in selection.outcome.criteria:
        out[c.key] = _mm(c.required_m[index])
    return out


def _cautions(selection) -> list[str]:
    p, keys = selection.problem, {c.key for c in selection.outcome.criteria}
    return cautions(p.fluid.temp_c, p.surroundings.air_temp_c, [p.surface.surface_kind],
                    touch="surface_temp" in keys, freeze="freeze" in keys, code="code" in keys)


def _criteria_rows(selection, index: int, units: str):

    out = selection.outcome
    rows = []
    by_key = {crit.key: crit for crit in selection.criteria}
    for c in out.criteria:
        crit = by_key.get(c.key)
        state = ""
        if crit is not None and hasattr(crit, "state"):
            state = crit.state(selection.problem, out.result, index)
        elif c.messages[index]:
            state = c.messages[index]
        elif np.isfinite(c.required_m[index]):
            state = "met" + (f" ({c.source})" if c.source else "")
        rows.append([c.label, c.description, c.required_m[index],
                     c.commercial_m[index] if c.commercial_m is not None else None,
                     state or c.messages[index]])
    return rows


def _inner_layer(selection, index: int):
    """The inner layer the selection added for size *index* (JSON-ready, SI), or None."""
    inner = selection.inner_layer
    if inner is None or not inner[1][index] > 0:
        return None
    return {"material": inner[0].name, "thickness_mm": _mm(inner[1][index]),
            "interface_temp_c": round(selection.interface_temp_c(index), 3)}


def size_report(selection, check, units: str = "si") -> Report:
    """*check* is the check report of the line at the selected thickness."""
    out = selection.outcome
    crit = Table("Criteria", [Column("criterion"), Column("requirement"),
                              Column("least thickness", "thickness", 2), Column("commercial", "thickness"),
                              Column("at the selected thickness")],
                 _criteria_rows(selection, 0, units))
    gov = out.governing[0]
    gov_label = next((c.label for c in out.criteria if c.key == gov), "–")
    wrap = getattr(selection.material, "is_wrap", False)
    pick = Table("Selection", [Column("material"), Column("series"),
                               Column("selected, nominal" if wrap else "selected", "thickness")]
                 + ([Column("installed", "thickness", 2)] if wrap else [])
                 + [Column("layers"), Column("governing")],
                 [[selection.material.name, selection.series_name, out.selected_m[0]]
                  + ([selection.material.installed_thickness_m(out.selected_m[0])] if wrap else [])
                  + [layers_text(out.layer_split_m[0], units), gov_label]],
                 note=(f"a wrap is sold by its nominal thickness and installed "
                       f"{selection.material.compression_percent:g} % thinner (compression, common practice); "
                       "every criterion is judged at the installed thickness" if wrap else ""))
    if wrap:
        crit.note = "thicknesses nominal (as sold); each criterion is met at the installed thickness"
    tables = [crit, pick]
    from ..units import format_quantity

    inner = _inner_layer(selection, 0)
    if inner is not None:
        tables.append(Table("Inner layer (added: the sized material cannot serve at the fluid temperature)", [
            Column("material"), Column("thickness", "thickness"), Column("interface", "temperature"),
            Column("service range of the sized material")],
            [[inner["material"], inner["thickness_mm"] / 1000, inner["interface_temp_c"],
              f"{format_quantity(selection.material.min_temp_c, 'temperature', units)} to "
              f"{format_quantity(selection.material.max_temp_c, 'temperature', units)}"]]))
    tables += check.tables
    touch = next((c for c in selection.criteria if c.key == "surface_temp"), None)
    footer = []
    if touch is not None:
        footer.append(f"touch limit {touch.limit_c:g} °C: {touch.source}")
    footer.append(f"least thickness found to 0.01 mm; commercial pick from {selection.series_name}")
    if wrap:
        footer.append(f"wrap compression {selection.material.compression_percent:g} % as installed (common "
                      "practice: duct wrap is rated at 25 % compression); thicknesses are nominal, the installed "
                      "thickness is nominal × (1 − compression)")
    data = {
        "required_thickness_mm": required_mm(selection, 0),
        "selected_thickness_mm": _mm(out.selected_m[0]),
        "layers_mm": [_mm(t) for t in out.layer_split_m[0]],
        "governing": gov,
        "feasible": bool(out.feasible[0]),
        "material": selection.material.name,
        "series": selection.series_name,
        "criteria": [{"key": c.key, "requirement": c.description, "required_mm": _mm(c.required_m[0]),
                      "commercial_mm": _mm(c.commercial_m[0]) if c.commercial_m is not None else None}
                     for c in out.criteria],
        "inner_layer": inner,
        "result": check.data,
    }
    if wrap:  # the nominal thickness is the one selected (and sold); the installed one is solved
        data["installed_thickness_mm"] = _mm(selection.material.installed_thickness_m(out.selected_m[0]))
        data["compression_percent"] = selection.material.compression_percent
    from .notes import notes_of, render_all

    items = list(dict.fromkeys(list(selection.notes) + list(out.messages[0])))
    warnings = list(dict.fromkeys(render_all(items, units) + list(check.warnings)))
    notes = notes_of(items + list(check.notes))
    data["warnings"] = warnings
    cautions = _cautions(selection)
    data["cautions"] = cautions
    title = f"Insulation sizing: {selection.sizes[0].label}, {selection.material.name}"
    return traced_alternative(Report(title, tables, data, warnings, cautions, footer, csv_table=0, notes=notes),
                              selection, units)


def conditions_footer(selection, units: str) -> list[str]:
    from ..units import format_quantity as fq

    p = selection.problem
    air = p.surroundings
    fluid = float(np.max(p.fluid.temp_c))
    lines = [f"fluid {fq(fluid, 'temperature', units)}; air {fq(float(np.max(air.air_temp_c)), 'temperature', units)}"
             + (f", RH {float(np.max(air.relative_humidity_percent)):.0f} %" if air.relative_humidity_percent is not None else "")
             + (f", wind {fq(float(np.max(air.wind_speed_m_s)), 'speed', units)}" if float(np.max(air.wind_speed_m_s)) else ", still air")
             + f", radiant {fq(float(np.max(air.radiant_temp_c)), 'temperature', units)}",
             f"material {selection.material.name} ({selection.material.source}); series {selection.series_name}"
             + (f"; a wrap: thicknesses nominal, solved at {100 - selection.material.compression_percent:g} % of them "
                f"as installed ({selection.material.compression_percent:g} % compression, common practice)"
                if getattr(selection.material, "is_wrap", False) else ""),
             f"outer surface {p.surface.name}, emittance {float(np.max(p.surface.emittance)):.2f}"]
    if p.fixed_layers:
        lines.append("fixed inner layers: " + "; ".join(
            f"{l.material.name} {fq(float(np.max(l.thickness_m)), 'thickness', units)}" for l in p.fixed_layers))
    for c in selection.criteria:
        lines.append(f"{c.label}: {c.describe(units)}")
    return lines


def table_report(selection, units: str = "si") -> Report:
    out = selection.outcome
    keys = [c.key for c in out.criteria]
    kind = selection.sizes[0].kind if selection.sizes else ""
    od_title = {"rectangular duct": "perimeter/π", "round duct": "duct diameter"}.get(kind, "OD")
    columns = [Column("size"), Column(od_title, "diameter")]
    shown = [c for c in out.criteria if c.key != "service_limit"]  # a thickness per criterion
    has_inner = selection.inner_layer is not None
    columns += [Column(c.label, "thickness", 1) for c in shown]
    if has_inner:
        columns += [Column(f"inner layer ({selection.inner_layer[0].name})", "thickness"),
                    Column("interface", "temperature")]
    columns += [Column("selected", "thickness"), Column("layers"), Column("governing"),
                Column("heat flow", "heat_flow_per_length"), Column("surface", "temperature")]
    rows, json_rows = [], []
    q = np.ravel(out.result.heat_flow_w_per_m)
    ts = np.ravel(out.result.surface_temp_c)
    labels = {c.key: c.label for c in out.criteria}
    for i, size in enumerate(selection.sizes):
        feasible = bool(out.feasible[i])
        row = [size.label, size.outer_diameter_m] + [c.required_m[i] for c in shown]
        inner = _inner_layer(selection, i)
        if has_inner:
            row += [inner["thickness_mm"] / 1000 if inner else None, inner["interface_temp_c"] if inner else None]
        row += [out.selected_m[i], layers_text(out.layer_split_m[i], units) if feasible else "cannot be met",
                labels.get(out.governing[i], "–"), q[i] if feasible else None, ts[i] if feasible else None]
        rows.append(row)
        json_rows.append({
            "size": size.label, "od_mm": round(size.outer_diameter_m * 1000, 3),
            "required_thickness_mm": required_mm(selection, i),
            "selected_thickness_mm": _mm(out.selected_m[i]),
            "layers_mm": [_mm(t) for t in out.layer_split_m[i]],
            "governing": out.governing[i], "feasible": feasible,
            "heat_flow_w_per_m": float(q[i]) if feasible else None,
            "surface_temp_c": float(ts[i]) if feasible else None,
            "inner_layer": inner,
            "messages": out.messages[i],
        })
    from .notes import notes_of, render_all, with_subject

    items = list(selection.notes)
    for i, size in enumerate(selection.sizes):
        items += [with_subject(m, size.label) for m in out.messages[i]]
    items = list(dict.fromkeys(items + list(out.result.warnings)))
    warnings = render_all(items, units)
    cautions = _cautions(selection)
    footer = conditions_footer(selection, units)
    title = f"Thickness table: {selection.material.name}, {selection.sizes[0].label} to {selection.sizes[-1].label}"
    data = {"rows": json_rows, "criteria": keys, "material": selection.material.name,
            "series": selection.series_name, "conditions": footer, "warnings": warnings, "cautions": cautions}
    return traced_alternative(Report(title, [Table("Thickness per size", columns, rows)], data, warnings, cautions,
                                     footer, notes=notes_of(items)), selection, units)


def matrix_report(selection, quantity: str, units: str = "si") -> Report:
    """Heat flow per metre (or surface temperature) of every size at every series thickness."""
    series = np.array(selection.outcome.series_m)
    result = selection.problem.solve(np.broadcast_to(series, (len(selection.sizes), series.size)))
    values = result.heat_flow_w_per_m if quantity == "heat_flow" else result.surface_temp_c
    kind = "heat_flow_per_length" if quantity == "heat_flow" else "temperature"
    from ..units import format_quantity

    columns = [Column("size"), Column("OD", "diameter")] + [
        Column(format_quantity(t, "thickness", units), kind) for t in series]
    rows = [[s.label, s.outer_diameter_m] + list(values[i]) for i, s in enumerate(selection.sizes)]
    what = "heat flow per metre" if quantity == "heat_flow" else "surface temperature"
    data = {"quantity": quantity, "thickness_mm": [_mm(t) for t in series],
            "rows": [{"size": s.label, "od_mm": round(s.outer_diameter_m * 1000, 3),
                      ("heat_flow_w_per_m" if quantity == "heat_flow" else "surface_temp_c"):
                          [float(v) for v in values[i]]} for i, s in enumerate(selection.sizes)]}
    footer = conditions_footer(selection, units)
    cautions = _cautions(selection)
    warnings = list(dict.fromkeys(result.warnings))
    # Cells that fail an active criterion (touch limit, dew point plus margin, heat-flow cap).
    for crit in selection.criteria:
        failing = np.asarray(crit.margin(selection.problem, result, series)) < 0
        for i, s in enumerate(selection.sizes):
            if failing[i].any():
                thin = ", ".join(format_quantity(t, "thickness", units) for t in series[failing[i]])
                warnings.append(f"{s.label}: fails {crit.label} at {thin}")
    data.update({"conditions": footer, "cautions": cautions, "warnings": warnings})
    return Report(f"{what.capitalize()} by size and thickness: {selection.material.name}",
                  [Table(f"{what} at each thickness", columns, rows)], data, warnings, cautions, footer)
