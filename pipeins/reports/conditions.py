"""Report parts of a sizing under several design conditions (``size`` and ``table`` with
``--condition``): each condition's criteria and requirements, and which condition governs.
"""

from __future__ import annotations

import numpy as np

from . import Column, Table

__all__ = ["add_size_conditions", "add_table_conditions", "governing_words"]


def _mm(x):
    return None if x is None or not np.isfinite(x) else round(float(x) * 1000, 2)


def _label(outcome, key):
    return next((c.label for c in outcome.criteria if c.key == key), key or "–")


def _condition_data(combined, conditions, index: int) -> list[dict]:
    out = []
    gov = combined.governing_condition[index]
    for cond in conditions:
        sel = combined.selections.get(cond.name)
        entry = {"name": cond.name, "air_temp_c": cond.air_temp_c, "rh_percent": cond.rh_percent,
                 "wind_m_s": cond.wind_m_s, "settings": dict(getattr(cond, "settings", {}) or {}),
                 "criteria_here": list(cond.criteria_here) if cond.criteria_here is not None else None,
                 "governs": cond.name == gov}
        if sel is None:
            entry.update(sized=False, criteria=[], selected_thickness_mm=None, governing=None,
                         required_thickness_mm={})
        else:
            o = sel.outcome
            entry.update(sized=True, criteria=[c.key for c in o.criteria],
                         selected_thickness_mm=_mm(o.selected_m[index]) if o.feasible[index] else None,
                         governing=o.governing[index], feasible=bool(o.feasible[index]),
                         required_thickness_mm={c.key: _mm(c.required_m[index]) for c in o.criteria})
        out.append(entry)
    return out


def _rows(combined, conditions, index: int) -> list[list]:
    rows = []
    gov = combined.governing_condition[index]
    for cond in conditions:
        sel = combined.selections.get(cond.name)
        rh = None if cond.rh_percent is None else float(cond.rh_percent)
        if sel is None:
            rows.append([cond.name, cond.air_temp_c, rh, cond.wind_m_s, "none applies", None, None, ""])
            continue
        o = sel.outcome
        for c in o.criteria:
            mark = "yes" if cond.name == gov and c.key == o.governing[index] else ""
            rows.append([cond.name, cond.air_temp_c, rh, cond.wind_m_s, c.label, c.required_m[index],
                         o.selected_m[index] if o.feasible[index] else None, mark])
    return rows


def _table(combined, conditions, index: int, title: str) -> Table:
    return Table(title, [Column("condition"), Column("air", "temperature"), Column("RH", "percent", 0),
                         Column("wind", "speed"), Column("criterion"), Column("least thickness", "thickness", 2),
                         Column("pick under it", "thickness"), Column("governs")],
                 _rows(combined, conditions, index),
                 note="each criterion checked under the conditions it belongs to; the thickest pick governs")


def governing_words(combined, index: int = 0) -> str:
    """``touch safety under "summer"``."""
    sel = combined.selections[combined.governing_condition[index]]
    return f'{_label(sel.outcome, combined.outcome.governing[index])} under "{combined.governing_condition[index]}"'


def add_size_conditions(report, combined, conditions, units: str) -> None:
    """Put the design conditions into the ``size`` *report* built from the governing
    condition's selection: a first table (the CSV's) of every condition and criterion, the
    governing condition beside the governing criterion, the combined requirements in JSON."""
    report.tables.insert(0, _table(combined, conditions, 0, "Design conditions"))
    report.csv_table = 0
    for table in report.tables:
        if table.title == "Selection":
            heads = [c.heading for c in table.columns]
            if "governing" in heads:
                i = heads.index("governing")
                table.columns.insert(i + 1, Column("condition"))
                for row in table.rows:
                    row.insert(i + 1, combined.governing_condition[0])
    for table in report.tables:
        if table.title.startswith("Check") or table.title in ("Line", "Results"):
            table.title = f'{table.title} (under "{combined.governing_condition[0]}")'
            break
    gov = combined.governing_condition[0]
    report.footer.insert(0, f"design conditions: {', '.join(c.name for c in conditions)}; governing: "
                            f"{governing_words(combined, 0)}; the check below is under \"{gov}\"")
    report.title += f" ({len(conditions)} design conditions)"
    data = report.data
    data["governing_condition"] = gov
    data["governing_condition_of"] = "the condition whose pick is thickest (largest requirement)"
    data["required_thickness_mm"] = {**data.get("required_thickness_mm", {}),
                                     **{k: _mm(v[0]) for k, v in combined.required_m.items()}}
    data["required_under"] = {k: v[0] for k, v in combined.required_under.items()
                              if np.isfinite(combined.required_m[k][0])}
    data["design_conditions"] = _condition_data(combined, conditions, 0)
    for note in combined.notes:
        if note not in report.warnings:
            report.warnings.append(note)
    data["warnings"] = report.warnings
    _all_cautions(report, combined)


def _all_cautions(report, combined) -> None:
    """The cautions of every condition (freezing in winter, a vapour retarder in summer …)."""
    from .sizing import _cautions

    for sel in combined.selections.values():
        for text in _cautions(sel):
            if text not in report.cautions:
                report.cautions.append(text)
    report.data["cautions"] = report.cautions


def add_table_conditions(report, combined, conditions, units: str) -> None:
    """Put the governing condition of each size into the ``table`` *report*."""
    table = report.tables[0]
    heads = [c.heading for c in table.columns]
    i = heads.index("governing")
    table.columns.insert(i + 1, Column("condition"))
    for row, cond in zip(table.rows, combined.governing_condition):
        row.insert(i + 1, cond)
    for row, cond, entry in zip(table.rows, combined.governing_condition, report.data["rows"]):
        entry["governing_condition"] = cond
    report.data["design_conditions"] = [
        {k: v for k, v in d.items() if k in ("name", "air_temp_c", "rh_percent", "wind_m_s", "settings",
                                             "criteria_here", "criteria", "sized")}
        for d in _condition_data(combined, conditions, 0)]
    report.data["required_under"] = [
        {k: v[i] for k, v in combined.required_under.items() if np.isfinite(combined.required_m[k][i])}
        for i in range(len(combined.governing_condition))]
    report.footer.insert(0, "design conditions: " + "; ".join(
        f'"{c.name}" air {_fq(c.air_temp_c, "temperature", units)}'
        + (f", RH {c.rh_percent:g} %" if c.rh_percent is not None else "")
        + (f", wind {_fq(c.wind_m_s, 'speed', units)}" if c.wind_m_s else "")
        + (f" ({', '.join(combined.selections[c.name].outcome.criteria[j].label for j in range(len(combined.selections[c.name].outcome.criteria)))})"
           if c.name in combined.selections else " (no criterion applies)")
        for c in conditions) + "; the condition column names the one that governs each size")
    for k, line in enumerate(report.footer):   # the first condition's air is not the table's
        if line.startswith("fluid ") and "; air " in line:
            report.footer[k] = line.split("; air ")[0] + "; air, RH and wind: the design conditions above"
    table.note = ("each size sized under every condition; heat flow and surface at the selected thickness under "
                  "the governing condition")
    report.data["conditions"] = report.footer
    for note in combined.notes:
        if note not in report.warnings:
            report.warnings.append(note)
    report.data["warnings"] = report.warnings
    _all_cautions(report, combined)


def _fq(value, kind, units):
    from ..units import format_quantity

    return format_quantity(float(value), kind, units)


#: Column kind of a heat flow by its basis.
_FLOW_KIND = {"W/m": "heat_flow_per_length", "W/m²": "heat_flux", "W": "power"}


def add_check_conditions(report, solved, units: str) -> None:
    """Put the line under each design condition into the ``check`` *report* (built under the
    first): a "Design conditions" table (air, RH, wind, sun; heat loss and heat gain apart,
    in the result's basis; the surface, the dew point and the margin above it), the JSON list
    ``design_conditions`` and ``checked_under``, and each further condition's sweating or
    touch warnings with the condition as their subject.

    *solved* is a list of ``(condition, spec, result)``: a
    :class:`pipeins.design_conditions.CommandCondition`, the line under it and its solve."""
    from .. import notes as nt
    from ..results import HEAT_FLOW_KEYS
    from . import Column, Table
    from .notes import notes_of, render_all

    def first(x):
        return None if x is None else float(np.asarray(x, dtype=float).ravel()[0])

    basis = solved[0][2].basis
    key = HEAT_FLOW_KEYS[basis].replace("heat_flow", "")   # "_w_per_m", "_w_per_m2", "_w"
    rows, entries, extra = [], [], []
    for k, (cond, spec, result) in enumerate(solved):
        q = first(result.heat_flow)
        surface = first(result.surface_temp_c)
        dew = first(result.dew_point_c)
        margin = None if dew is None else surface - dew
        air = result.inputs["surroundings"]
        sun = first(getattr(air, "solar_irradiance_w_m2", None))
        rows.append([cond.name, first(air.air_temp_c), None if cond.rh_percent is None else cond.rh_percent,
                     cond.wind_m_s, sun, max(q, 0.0), max(-q, 0.0), surface, dew, margin])
        entries.append({"name": cond.name, "air_temp_c": first(air.air_temp_c), "rh_percent": cond.rh_percent,
                        "wind_m_s": cond.wind_m_s, "solar_w_m2": sun, "settings": dict(cond.settings),
                        f"heat_loss{key}": max(q, 0.0), f"heat_gain{key}": max(-q, 0.0),
                        "surface_temp_c": surface, "dew_point_c": dew, "above_dew_point_k": margin,
                        "touch_limit_c": result.touch_limit_c})
        if k == 0:
            continue   # the first condition's warnings are the check's own
        if result.touch_limit_c is not None and surface > result.touch_limit_c:
            extra.append(nt.with_subject(nt.note("surface.above_touch_limit", surface_c=(surface, "temperature"),
                                                 limit_c=(result.touch_limit_c, "temperature")), cond.name))
        if dew is not None and surface < dew:
            extra.append(nt.with_subject(nt.note("surface.below_dew_point", where="surface",
                                                 surface_c=(surface, "temperature"),
                                                 dew_point_c=(dew, "temperature")), cond.name))
    flow = _FLOW_KIND[basis]
    report.tables.append(Table("Design conditions", [
        Column("condition"), Column("air", "temperature"), Column("RH [%]", digits=0), Column("wind", "speed"),
        Column("sun", "heat_flux"), Column("heat loss", flow), Column("heat gain", flow),
        Column("surface", "temperature"), Column("dew point", "temperature"),
        Column("above dew point", "temperature_difference")], rows,
        note="the line solved under each condition; heat loss and heat gain apart (one of them is zero); the "
             "surface is the governing part's; the tables above are under the first condition"))
    gov = solved[0][0].name
    for table in report.tables:
        if table.title in ("Line", "Results"):
            table.title = f'{table.title} (under "{gov}")'
    report.title += f" ({len(solved)} design conditions)"
    report.footer.insert(0, f"design conditions: {', '.join(c.name for c, _, _ in solved)}; the check is "
                            f"under \"{gov}\" and the Design conditions table gives the line under each")
    texts = render_all(extra, units)
    for text in texts:
        if text not in report.warnings:
            report.warnings.append(text)
    report.notes = list(report.notes) + notes_of(extra)
    from .cautions import cautions_for

    for _cond, spec, result in solved[1:]:   # a winter condition's freezing, a summer one's sweating …
        for text in cautions_for(spec, result):
            if text not in report.cautions:
                report.cautions.append(text)
    report.data["cautions"] = report.cautions
    report.data["design_conditions"] = entries
    report.data["checked_under"] = gov
    report.data["warnings"] = report.warnings
