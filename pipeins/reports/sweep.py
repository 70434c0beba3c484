"""Report of ``pipeins sweep``: the heat flow and the thickness each criterion needs, per value.

One table (a row per swept value), the warnings and cautions, the basis lines, the JSON
payload (SI) and two charts (:mod:`pipeins.reports.charts` kinds ``sweep`` and
``sweep_heat_flow``, registered here): the heat flow against the swept input, and the
least thickness of each criterion with the selected one.
"""

from __future__ import annotations

import numpy as np

from . import Column, Report, Table
from .cautions import cautions

__all__ = ["sweep_report", "sweep_data", "sweep_charts", "VARIABLE_WORDS"]

#: Each swept input: (words, quantity kind of its values or None for a plain number, name on
#: the command line).
VARIABLE_WORDS = {
    "wind_m_s": ("wind speed", "speed", "wind"),
    "emittance": ("emittance", None, "emittance"),
    "air_temp_c": ("air temperature", "temperature", "ambient-temp"),
    "surroundings_temp_c": ("radiant temperature", "temperature", "surroundings-temp"),
    "rh_percent": ("relative humidity", "percent", "rh"),
    "fluid_temp_c": ("fluid temperature", "temperature", "fluid-temp"),
    "conductivity_factor": ("conductivity factor", None, "k-factor"),
}


def _mm(x):
    return None if x is None or not np.isfinite(x) else round(float(x) * 1000, 2)


def _num(x):
    return None if x is None or not np.isfinite(x) else float(x)


def _plain(value: float) -> float:
    return float(f"{value:.6g}")


def _shown(value, kind, units) -> str:
    if kind is None:
        return f"{value:g}"
    from ..units import format_quantity

    return format_quantity(float(value), kind, units)


def sweep_data(result) -> dict:
    """The numbers behind the sweep's charts (SI): ``variable``, ``label``, ``kind``,
    ``values``, ``heat_flow_w_per_m`` of the build-up, and with a material
    ``selected_heat_flow_w_per_m``, ``required`` (per criterion ``key``, ``label``,
    ``thickness_m`` with None where it cannot be met) and ``selected_m``."""
    words, kind, _ = VARIABLE_WORDS[result.variable]
    data = {"variable": result.variable, "label": words, "kind": kind,
            "values": [float(v) for v in result.values],
            "heat_flow_w_per_m": [float(v) for v in result.heat_flow_w_per_m],
            "selected_heat_flow_w_per_m": None, "required": [], "selected_m": None}
    if result.selected_m is not None:
        data["selected_heat_flow_w_per_m"] = [_num(v) for v in np.where(result.feasible,
                                                                       result.selected_heat_flow_w_per_m, np.nan)]
        data["required"] = [{"key": key, "label": label, "thickness_m": [_num(v) for v in result.required_m[key]]}
                            for key, label, _ in result.criteria]
        data["selected_m"] = [_num(v) for v in result.selected_m]
    return data


def sweep_charts(result) -> list:
    """The charts of a sweep: heat flow, and (with a material) the thickness per criterion."""
    from .charts import Chart

    words = VARIABLE_WORDS[result.variable][0]
    kind = "sweep" if result.selected_m is not None else "sweep_heat_flow"
    title = (f"Heat flow and thickness against {words}" if kind == "sweep" else f"Heat flow against {words}")
    return [Chart(kind, title, lambda: sweep_data(result))]


def _draw(axes, d, units, thickness_panel=True):
    from .charts import _disp, _lab, _style, _INK, _ACCENT, _GREY, _STYLES, _MARKERS

    x = np.asarray(d["values"], dtype=float) if d["kind"] is None else _disp(d["values"], d["kind"], units)
    xlabel = d["label"] + (f" [{_lab(d['kind'], units)}]" if d["kind"] else "")
    ax_q = axes[0]
    q = _disp(d["heat_flow_w_per_m"], "heat_flow_per_length", units)
    ax_q.plot(x, q, color=_INK, lw=1.8, marker="o", ms=3, label="heat flow of the given build-up")
    if d["selected_heat_flow_w_per_m"] is not None:
        sel = np.array([np.nan if v is None else v for v in d["selected_heat_flow_w_per_m"]], dtype=float)
        ax_q.plot(x, _disp(sel, "heat_flow_per_length", units), color=_ACCENT, lw=1.4, ls="--", marker="s",
                  ms=3, label="heat flow at the selected thickness")
    ax_q.set_ylabel(f"heat flow [{_lab('heat_flow_per_length', units)}] (+ out of the fluid)", fontsize=9)
    ax_q.legend(fontsize=7, frameon=False)
    _style(ax_q)
    if not thickness_panel:
        ax_q.set_xlabel(xlabel, fontsize=9)
        return
    ax_t = axes[1]
    for j, req in enumerate(d["required"]):
        t = np.array([np.nan if v is None else v for v in req["thickness_m"]], dtype=float)
        ax_t.plot(x, _disp(t, "thickness", units), color=_GREY if j % 2 else _ACCENT, lw=1.2,
                  ls=_STYLES[j % len(_STYLES)], marker=_MARKERS[(j + 1) % len(_MARKERS)], ms=3,
                  label=f"least for {req['label']}")
    sel = np.array([np.nan if v is None else v for v in d["selected_m"]], dtype=float)
    ax_t.step(x, _disp(sel, "thickness", units), where="mid", color=_INK, lw=2.0, label="selected")
    ax_t.set_ylabel(f"thickness [{_lab('thickness', units)}]", fontsize=9)
    ax_t.set_xlabel(xlabel, fontsize=9)
    ax_t.legend(fontsize=7, frameon=False)
    _style(ax_t)


def _register():
    from .charts import register

    register("sweep", _draw, panels=2)
    register("sweep_heat_flow", lambda axes, d, units: _draw(axes, d, units, thickness_panel=False), panels=1)


_register()


def _flow_columns(q: np.ndarray) -> list[tuple[str, float]]:
    """Heat losses and gains apart: a loss column where any value loses heat, a gain column
    where any gains it (sign of the column: + loss, − gain)."""
    out = []
    if np.any(q > 0):
        out.append(("heat loss", 1.0))
    if np.any(q < 0):
        out.append(("heat gain", -1.0))
    return out or [("heat loss", 1.0)]


def _flow_cells(value: float, columns) -> list:
    return [value * sign if value * sign > 0 or (value == 0 and sign > 0) else None for _, sign in columns]


def sweep_report(result, units: str = "si", range_text: str = "") -> Report:
    """The report of a :class:`pipeins.sweep.SweepResult`; *range_text* is the range as
    the user wrote it."""
    from ..units import format_quantity as fq

    words, kind, name = VARIABLE_WORDS[result.variable]
    spec = result.spec
    sized = result.selected_m is not None
    q_cols = _flow_columns(result.heat_flow_w_per_m)
    columns = [Column(words, kind)] + [Column(f"{h} of the build-up", "heat_flow_per_length") for h, _ in q_cols]
    columns.append(Column("surface of the build-up", "temperature"))
    sel_cols = []
    # table columns: the criteria that ask for a thickness somewhere (JSON keeps every one)
    shown = [(k, label, d) for k, label, d in result.criteria
             if np.any(np.isfinite(result.required_m[k])) or not np.all(result.criterion_feasible.get(k, True))]
    if sized:
        columns += [Column(f"least for {label}", "thickness", 1) for _, label, _ in shown]
        columns += [Column("selected", "thickness"), Column("governing")]
        sel_cols = _flow_columns(np.where(result.feasible, result.selected_heat_flow_w_per_m, 0.0))
        columns += [Column(f"{h} at the selection", "heat_flow_per_length") for h, _ in sel_cols]
    labels = {key: label for key, label, _ in result.criteria}
    rows, json_rows = [], []
    for i, v in enumerate(result.values):
        value = _plain(v)
        q, ts = float(result.heat_flow_w_per_m[i]), float(result.surface_temp_c[i])
        row = [value] + _flow_cells(q, q_cols) + [ts]
        entry = {"value": value, "heat_flow_w_per_m": q, "surface_temp_c": ts}
        if sized:
            ok = bool(result.feasible[i])
            row += [result.required_m[key][i] for key, _, _ in shown]
            row += [result.selected_m[i] if ok else None,
                    labels.get(result.governing[i], "none (met bare)") if ok else "cannot be met"]
            qs = float(result.selected_heat_flow_w_per_m[i])
            row += _flow_cells(qs, sel_cols) if ok else [None] * len(sel_cols)
            entry.update({
                "required_thickness_mm": {key: _mm(result.required_m[key][i]) for key, _, _ in result.criteria},
                "selected_thickness_mm": _mm(result.selected_m[i]) if ok else None,
                "governing": result.governing[i] if ok else None,
                "feasible": ok,
                "selected_heat_flow_w_per_m": qs if ok else None,
                "selected_surface_temp_c": float(result.selected_surface_temp_c[i]) if ok else None,
                "messages": result.messages[i],
            })
        rows.append(row)
        json_rows.append(entry)
    warnings = list(result.notes)
    for i, msgs in enumerate(result.messages):
        warnings += [f"{words} {_shown(result.values[i], kind, units)}: {m}" for m in msgs]
    warnings = list(dict.fromkeys(warnings + list(result.warnings)))
    fluid = spec.fluid_temperature_c() if result.variable != "fluid_temp_c" else result.values
    air = spec.air_temp_c if result.variable != "air_temp_c" else result.values
    keys = {key for key, _, _ in result.criteria}
    kinds = [spec.build_surface().surface_kind]
    lines_cautions = cautions(fluid, air, kinds, touch="surface_temp" in keys, freeze="freeze" in keys)
    layers = "; ".join(f"{m} {fq(t, 'thickness', units)}" for m, t in spec.layers) or "none (bare line)"
    first, last = result.values[0], result.values[-1]
    footer = [f"{words} from {_shown(first, kind, units)} to {_shown(last, kind, units)}, {result.n} values "
              f"evenly spaced" + (f" (--vary {range_text})" if range_text else ""),
              f"build-up: {layers}; heat flow + out of the fluid"]
    if result.variable == "conductivity_factor":
        footer.append("the conductivity factor multiplies the catalogue conductivity of every insulation "
                      "layer, the sized one included (1 = catalogue value)")
    if sized:
        footer.append(f"sized: {result.material.name} over the build-up; least thickness found to 0.01 mm; "
                      f"commercial pick from {result.series_name}; 0 where the line meets a criterion "
                      "without it")
        for s in result.selections[:1]:
            for c in s.criteria:
                footer.append(f"{c.label}: {c.describe(units)}")
    pipe = spec.pipe_size().label
    title = f"Sweep of the {words}: {pipe}" + (f", {result.material.name}" if sized else "")
    data = {"variable": result.variable, "name": name, "points": result.n,
            "values": [_plain(v) for v in result.values], "pipe": pipe,
            "layers": [{"material": m, "thickness_mm": _mm(t)} for m, t in spec.layers],
            "rows": json_rows, "conditions": footer, "warnings": warnings, "cautions": lines_cautions}
    if sized:
        data.update({"material": result.material.name, "series": result.series_name,
                     "criteria": [{"key": k, "label": label, "requirement": d} for k, label, d in result.criteria]})
    table = Table(f"Sweep of the {words}", columns, rows)
    report = Report(title, [table], data, warnings, lines_cautions, footer)
    report.charts = sweep_charts(result)
    return report
