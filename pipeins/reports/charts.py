"""Charts of the reports: numbers first, pictures second.

Each chart is a *data function* that returns the solved numbers (SI, plain lists) and a
*draw function* that turns them into a matplotlib figure in the chosen unit system.
The data functions use numpy and the solver only; matplotlib is imported by the draw
step alone, so a command that draws nothing never loads it.  A :class:`Chart` holds a
data function and calls it on first use, so building the charts of a report costs
nothing until the HTML page or ``--plot`` asks for them.

Charts (kind: what it shows):

``buildup_profile``
    temperature at each interface through the build-up (bore, pipe, layers, surface) and
    the air, with the layers drawn as bands (``check``, and ``size`` at the selection);
``along_run``
    fluid temperature along a run (``check`` with ``--length`` and ``--flow``);
``thickness_sweep``
    heat flow and surface temperature against thickness for one line, each active
    criterion's limit, each criterion's least thickness and the selected one (``size``);
``table_thickness``
    selected thickness per size, marked by the governing criterion (``table``);
``matrix``
    the heat flow (or surface temperature) of every size against thickness (``table --matrix``);
``economic_curve``
    installed cost, energy over the life and their total against thickness (``cost``);
``bare_insulated``
    heat flow bare against insulated (``cost`` without a cost table);
``schedule_thickness``
    the thickness of every schedule row (service, location, sizes), marked by the
    governing requirement (``schedule``).
"""

from __future__ import annotations

import io
import re
import textwrap
from dataclasses import dataclass, field
from typing import Callable

import numpy as np

from ..results import HEAT_FLOW_KEYS

_BASIS_KINDS = {"W/m": "heat_flow_per_length", "W/m²": "heat_flux", "W": "power"}

__all__ = ["Chart", "profile_data", "along_run_data", "thickness_sweep_data", "table_thickness_data",
           "matrix_data", "economic_curve_data", "bare_insulated_data", "schedule_thickness_data", "check_charts", "size_charts",
           "table_charts", "cost_charts", "schedule_charts", "draw", "chart_svg", "plot_bytes", "KINDS"]


@dataclass
class Chart:
    """A chart: its kind (see the module docstring), title and data function."""

    kind: str
    title: str
    make: Callable[[], dict]
    _data: dict | None = field(default=None, repr=False)

    @property
    def data(self) -> dict:
        """The numbers behind the chart (SI), computed on first use."""
        if self._data is None:
            self._data = self.make()
        return self._data


def _f(x) -> float:
    return float(np.asarray(x, dtype=float).ravel()[0])


def _floats(x) -> list[float]:
    return [float(v) for v in np.asarray(x, dtype=float).ravel()]


# ----------------------------------------------------------------------------- data
def profile_data(result) -> dict:
    """Interfaces through the build-up of a solved line (one case).

    Returns ``names``, ``diameter_m`` and ``temp_c`` of each interface (bore, pipe outside,
    outside each layer), ``bands`` (name of the pipe wall and each layer between two
    interfaces), ``air_temp_c`` and ``radiant_temp_c``.
    """
    pipe, layers = result.inputs["pipe"], list(result.inputs["layers"])
    air = result.inputs["surroundings"]
    od = _f(pipe.outer_diameter_m)
    diameters = [od - 2 * _f(pipe.wall_m), od]
    for layer in layers:
        diameters.append(diameters[-1] + 2 * _f(layer.installed_thickness_m))
    names = ["bore", "pipe outside"] + [f"outside layer {j}" for j in range(1, len(layers) + 1)]
    return {
        "names": names,
        "diameter_m": diameters,
        "temp_c": [_f(t) for t in result.interface_temps_c],
        "bands": [f"pipe wall ({pipe.wall_material})"] + [l.material.name for l in layers],
        "air_temp_c": _f(air.air_temp_c),
        "radiant_temp_c": _f(air.radiant_temp_c),
    }


def along_run_data(spec, result, segments: int = 20) -> dict:
    """Fluid temperature along the run of ``spec`` (needs ``length_m``, ``flow`` and a liquid
    ``fluid``), solved by :func:`pipeins.runs.temperature_along_run` as ``check`` does."""
    from ..runs import mass_flow_kg_s, temperature_along_run

    inputs = result.inputs
    fluid = inputs["fluid"]
    inlet = _f(fluid.temp_c)
    mdot = _f(mass_flow_kg_s(spec.flow, spec.fluid, inlet))
    run = temperature_along_run(inputs["pipe"], list(inputs["layers"]), spec.fluid, inlet, mdot, spec.length_m,
                                inputs["surroundings"], inputs["surface"], fluid.film_coefficient_w_m2k,
                                segments=segments)
    return {
        "position_m": _floats(run.positions_m),
        "fluid_temp_c": _floats(run.fluid_temps_c),
        "heat_flow_w_per_m": _floats(run.heat_flow_w_per_m),
        "inlet_temp_c": inlet,
        "outlet_temp_c": _f(run.outlet_temp_c),
        "air_temp_c": _f(inputs["surroundings"].air_temp_c),
        "mass_flow_kg_s": mdot,
    }


def thickness_sweep_data(selection, index: int = 0, points: int = 61) -> dict:
    """Heat flow and surface temperature of one size of a selection against the sized
    layer's thickness, solved on a grid from bare to past the thickest requirement (the
    selected and every least thickness are grid points).

    Returns ``thickness_m``, ``heat_flow_w_per_m``, ``surface_temp_c``; ``limits`` (each
    active criterion's limit on the surface temperature or the heat flow: ``key``,
    ``label``, ``quantity`` ("surface_temp" or "heat_flow"), ``value``); ``required`` (each
    criterion's least thickness: ``key``, ``label``, ``thickness_m``); ``selected_m`` and
    ``governing``.
    """
    out = selection.outcome
    selected = float(out.selected_m[index])
    required = [{"key": c.key, "label": c.label, "thickness_m": float(c.required_m[index])}
                for c in out.criteria if np.isfinite(c.required_m[index])]
    top = max([selected] + [r["thickness_m"] for r in required] + [0.0])
    top = 1.6 * top if top > 0 else 0.05
    grid = np.unique(np.concatenate([np.linspace(0.0, top, points), [selected],
                                     [r["thickness_m"] for r in required]]))
    problem = selection.problem
    row = np.zeros((problem.n_sizes, grid.size))
    row[:] = grid
    result = problem.solve(row)
    q = np.asarray(result.heat_flow, dtype=float)[index]
    ts = np.asarray(result.surface_temp_c, dtype=float)[index]
    limits = []
    for crit in selection.criteria:
        if crit.key == "surface_temp" and hasattr(crit, "limit_c"):
            limits.append({"key": crit.key, "label": crit.label, "quantity": "surface_temp",
                           "value": float(crit.limit_c)})
        elif crit.key == "condensation" and result.dew_point_c is not None:
            dew = float(np.ravel(np.broadcast_to(result.dew_point_c, result.shape))[index * grid.size])
            limits.append({"key": crit.key, "label": crit.label, "quantity": "surface_temp",
                           "value": dew + float(crit.margin_k), "dew_point_c": dew, "margin_k": float(crit.margin_k)})
        elif crit.key == "heat_flow" and hasattr(crit, "cap"):
            cap = float(np.ravel(crit.cap(problem))[index])
            sign = -1.0 if q[0] < 0 else 1.0
            limits.append({"key": crit.key, "label": crit.label, "quantity": "heat_flow", "value": sign * cap})
    return {
        "size": selection.sizes[index].label,
        "material": selection.material.name,
        "thickness_m": _floats(grid),
        HEAT_FLOW_KEYS[result.basis]: _floats(q),
        "heat_flow_kind": _BASIS_KINDS[result.basis],
        "surface_temp_c": _floats(ts),
        "limits": limits,
        "required": required,
        "selected_m": selected,
        "governing": out.governing[index],
    }


def table_thickness_data(selection) -> dict:
    """Per size of a selection: ``size``, ``od_m``, ``selected_m`` (None where no
    thickness meets the criteria), ``governing`` key and label."""
    out = selection.outcome
    labels = {c.key: c.label for c in out.criteria}
    rows = []
    for i, size in enumerate(selection.sizes):
        ok = bool(out.feasible[i])
        rows.append({"size": size.label, "od_m": float(size.outer_diameter_m),
                     "selected_m": float(out.selected_m[i]) if ok else None,
                     "governing": out.governing[i] if ok else None,
                     "governing_label": labels.get(out.governing[i], "–") if ok else "cannot be met"})
    return {"material": selection.material.name, "rows": rows}


def matrix_data(report_data: dict) -> dict:
    """The matrix of ``table --matrix`` from its SI payload: ``quantity``, ``thickness_m``
    and per size the values at each thickness."""
    key = "heat_flow_w_per_m" if report_data["quantity"] == "heat_flow" else "surface_temp_c"
    return {"quantity": report_data["quantity"],
            "thickness_m": [t / 1000.0 for t in report_data["thickness_mm"]],
            "rows": [{"size": r["size"], "values": list(r[key])} for r in report_data["rows"]]}


def economic_curve_data(study) -> dict:
    """The economic curve of a cost study (per unit of the section, in the study's currency)."""
    curve = study.curve
    cur = study.basis.price.currency if study.basis.price is not None else ""
    return {"currency": cur, "thickness_m": _floats(curve.thickness_m),
            "installed": _floats(curve.installed), "energy_pv": _floats(curve.energy_pv),
            "total": _floats(curve.total), "per": curve.per,
            "economic_thickness_m": float(np.asarray(curve.thickness_m)[curve.best_index]),
            "years": float(study.basis.years)}


def schedule_thickness_data(schedule) -> dict:
    """Per row of a :class:`pipeins.schedule.Schedule`: ``label`` (service, location,
    sizes), ``thickness_m``, ``governing`` key and label."""
    from ..schedule import GOVERNING_LABELS

    return {"rows": [{"label": f"{r.service} · {r.condition} · {r.size_band}", "thickness_m": float(r.thickness_m),
                      "governing": r.governing, "governing_label": GOVERNING_LABELS.get(r.governing, "–")}
                     for r in schedule.rows]}


#: Display kind of a cost study's heat flow per unit, by its basis.
_BASIS_KINDS = {"W/m": "heat_flow_per_length", "W/m²": "heat_flux", "W": "power"}


def bare_insulated_data(study) -> dict:
    """Heat flow bare and insulated of a cost study, per unit of its basis (W/m of a run, W/m²
    of a face, W of a vessel; ``kind`` its display kind)."""
    return {"bare": _f(study.bare_per_unit), "insulated": _f(study.insulated_per_unit),
            "kind": _BASIS_KINDS[study.heat_basis]}


# ----------------------------------------------------------------------------- per command
def check_charts(spec, result) -> list[Chart]:
    """Charts of ``check``: the build-up profile, and the run when it has a length and a flow."""
    charts = [Chart("buildup_profile", "Temperature through the build-up", lambda: profile_data(result))]
    if spec.length_m is not None and spec.flow is not None and spec.fluid and spec.steam_pressure_pa is None:
        charts.append(Chart("along_run", "Fluid temperature along the run", lambda: along_run_data(spec, result)))
    return charts


def size_charts(selection, result=None) -> list[Chart]:
    """Charts of ``size``: the thickness sweep, and the build-up at the selection (*result*)."""
    charts = [Chart("thickness_sweep", f"Heat flow and surface temperature against thickness: "
                    f"{selection.sizes[0].label}, {selection.material.name}",
                    lambda: thickness_sweep_data(selection))]
    if result is not None and not hasattr(result.inputs["pipe"], "kind"):  # the profile is drawn on diameters
        charts.append(Chart("buildup_profile", "Temperature through the build-up at the selected thickness",
                            lambda: profile_data(result)))
    return charts


def table_charts(selection, report=None) -> list[Chart]:
    """Charts of ``table``: thickness per size; with a matrix report, the matrix."""
    if report is not None and "quantity" in report.data:
        what = "Heat flow" if report.data["quantity"] == "heat_flow" else "Surface temperature"
        return [Chart("matrix", f"{what} against thickness per size: {selection.material.name}",
                      lambda: matrix_data(report.data))]
    return [Chart("table_thickness", f"Selected thickness per size: {selection.material.name}",
                  lambda: table_thickness_data(selection))]


def cost_charts(study) -> list[Chart]:
    """Charts of ``cost``: the economic curve (with a cost table), else bare against insulated."""
    if study.curve is not None:
        return [Chart("economic_curve", "Economic thickness: cost over the life against thickness",
                      lambda: economic_curve_data(study))]
    return [Chart("bare_insulated", "Heat flow bare against insulated", lambda: bare_insulated_data(study))]


def schedule_charts(schedule) -> list[Chart]:
    """Charts of ``schedule``: the thickness of every schedule row."""
    return [Chart("schedule_thickness", "Schedule thickness per service, location and size band",
                  lambda: schedule_thickness_data(schedule))]


# ----------------------------------------------------------------------------- drawing
_INK, _GREY, _ACCENT = "#1b1b1b", "#8a8a8a", "#17484f"
_STYLES = ("--", ":", "-.", (0, (5, 1, 1, 1)), (0, (1, 1)), (0, (3, 1, 1, 1, 1, 1)))
_MARKERS = ("o", "s", "^", "D", "v", "P", "X")
_HATCHES = ("", "//", "..", "xx", "\\\\", "++", "oo")
PANELS = {"thickness_sweep": 2}
KINDS = ("buildup_profile", "along_run", "thickness_sweep", "table_thickness", "matrix", "economic_curve",
         "bare_insulated", "schedule_thickness")


def _disp(values, kind, units):
    from ..units import to_display

    return np.asarray(to_display(np.asarray(values, dtype=float), kind, units), dtype=float)


def _lab(kind, units):
    from ..units import unit_label

    return unit_label(kind, units)


def _style(ax):
    ax.grid(True, color="#d6d6d6", linewidth=0.6)
    for side in ("top", "right"):
        ax.spines[side].set_visible(False)
    ax.tick_params(labelsize=8)


def _draw_thickness_sweep(axes, d, units):
    t = _disp(d["thickness_m"], "thickness", units)
    ax_q, ax_t = axes
    q_kind = d.get("heat_flow_kind", "heat_flow_per_length")
    q_key = next(k for k, v in _BASIS_KINDS.items() if v == q_kind)
    ax_q.plot(t, _disp(d[HEAT_FLOW_KEYS[q_key]], q_kind, units), color=_INK, lw=1.8,
              label="heat flow")
    ax_t.plot(t, _disp(d["surface_temp_c"], "temperature", units), color=_INK, lw=1.8, label="surface temperature")
    for j, lim in enumerate(d["limits"]):
        ax = ax_t if lim["quantity"] == "surface_temp" else ax_q
        kind = "temperature" if lim["quantity"] == "surface_temp" else q_kind
        label = f"limit: {lim['label']}"
        if "margin_k" in lim:
            margin = float(_disp(lim["margin_k"], "temperature_difference", units))
            label += f" (dew point + {margin:.3g} {_lab('temperature_difference', units)})"
        ax.axhline(float(_disp(lim["value"], kind, units)), color=_ACCENT, lw=1.2, ls=_STYLES[j % len(_STYLES)],
                   label=label)
    for ax in axes:
        for j, req in enumerate(d["required"]):
            x = float(_disp(req["thickness_m"], "thickness", units))
            ax.axvline(x, color=_GREY, lw=1.0, ls=_STYLES[j % len(_STYLES)],
                       label=f"least for {req['label']}" if ax is ax_t else None)
        sel = float(_disp(d["selected_m"], "thickness", units))
        ax.axvline(sel, color=_INK, lw=2.2, ls="-", alpha=0.55,
                   label=f"selected {sel:.{0 if units == 'si' else 2}f} {_lab('thickness', units)}"
                   if ax is ax_t else None)
        _style(ax)
    ax_q.set_ylabel(f"heat flow [{_lab(q_kind, units)}]", fontsize=9)
    ax_t.set_ylabel(f"surface [{_lab('temperature', units)}]", fontsize=9)
    ax_t.set_xlabel(f"thickness of {d['material']} [{_lab('thickness', units)}]", fontsize=9)
    ax_q.legend(fontsize=7, loc="best", framealpha=0.9, edgecolor="none")
    ax_t.legend(fontsize=7, loc="best", framealpha=0.9, edgecolor="none")


def _draw_profile(axes, d, units):
    (ax,) = axes
    r = _disp(np.asarray(d["diameter_m"]) / 2, "diameter", units)
    temps = _disp(d["temp_c"], "temperature", units)
    grey = ("#e4e4e4", "#cfcfcf", "#f0f0f0", "#dadada", "#e9e9e9")
    hot = temps[0] >= temps[-1]  # names of the bands where the line is not: low for a hot line
    for j, name in enumerate(d["bands"]):
        ax.axvspan(r[j], r[j + 1], color=grey[j % len(grey)], hatch=_HATCHES[(j + 1) % len(_HATCHES)] if j else "",
                   ec="#b0b0b0", lw=0.0)
        ax.text((r[j] + r[j + 1]) / 2, 0.03 if hot else 0.97, name, transform=ax.get_xaxis_transform(),
                rotation=90, ha="center", va="bottom" if hot else "top", fontsize=7, color=_INK)
    ax.plot(r, temps, color=_INK, lw=1.5, marker="o", ms=4, label="interface temperatures (solved)")
    for x, y in zip(r, temps):
        ax.annotate(f"{y:.1f}", (x, y), textcoords="offset points", xytext=(3, 5), fontsize=7)
    span = r[-1] - r[0]
    x_air = r[-1] + 0.25 * max(span, 1e-6)
    ax.plot([r[-1], x_air], [temps[-1], float(_disp(d["air_temp_c"], "temperature", units))], color=_GREY,
            lw=1.0, ls="--", label="outer film to the air")
    ax.set_xlim(r[0] - 0.02 * max(span, 1e-6), x_air)
    ax.set_xlabel(f"radius [{_lab('diameter', units)}]", fontsize=9)
    ax.set_ylabel(f"temperature [{_lab('temperature', units)}]", fontsize=9)
    ax.legend(fontsize=7, loc="best", framealpha=0.9, edgecolor="none")
    _style(ax)


def _draw_along_run(axes, d, units):
    (ax,) = axes
    x = _disp(d["position_m"], "length", units)
    ax.plot(x, _disp(d["fluid_temp_c"], "temperature", units), color=_INK, lw=1.8, label="fluid")
    ax.annotate(f"outlet {float(_disp(d['outlet_temp_c'], 'temperature', units)):.2f}",
                (x[-1], float(_disp(d["outlet_temp_c"], "temperature", units))), textcoords="offset points",
                xytext=(-60, 8), fontsize=7)
    ax.set_xlabel(f"distance from the inlet [{_lab('length', units)}]", fontsize=9)
    ax.set_ylabel(f"fluid temperature [{_lab('temperature', units)}]", fontsize=9)
    ax.legend(fontsize=7, frameon=False)
    _style(ax)


def _draw_table_thickness(axes, d, units):
    (ax,) = axes
    rows = d["rows"]
    groups = list(dict.fromkeys(r["governing_label"] for r in rows))
    x = np.arange(len(rows))
    for j, group in enumerate(groups):
        idx = [i for i, r in enumerate(rows) if r["governing_label"] == group]
        heights = [float(_disp(rows[i]["selected_m"], "thickness", units)) if rows[i]["selected_m"] is not None
                   else 0.0 for i in idx]
        ax.bar(x[idx], heights, color=("#5f7f84", "#c9d3d4", "#9aa9ab", "#e6ebeb", "#3e5a5e")[j % 5],
               edgecolor=_INK, lw=0.6, hatch=_HATCHES[j % len(_HATCHES)], label=f"governed by {group}")
    ax.set_xticks(x)
    ax.set_xticklabels([r["size"] for r in rows], rotation=60, ha="right", fontsize=7)
    ax.set_ylabel(f"selected thickness [{_lab('thickness', units)}]", fontsize=9)
    ax.legend(fontsize=7, frameon=False, loc="upper left")
    _style(ax)


def _draw_matrix(axes, d, units):
    (ax,) = axes
    kind = "heat_flow_per_length" if d["quantity"] == "heat_flow" else "temperature"
    t = _disp(d["thickness_m"], "thickness", units)
    for j, row in enumerate(d["rows"]):
        ax.plot(t, _disp(row["values"], kind, units), color=_INK if j % 2 == 0 else _ACCENT, lw=1.0,
                ls=_STYLES[j % len(_STYLES)] if j else "-", marker=_MARKERS[j % len(_MARKERS)], ms=3,
                label=row["size"])
    ax.set_xlabel(f"thickness [{_lab('thickness', units)}]", fontsize=9)
    what = "heat flow" if d["quantity"] == "heat_flow" else "surface temperature"
    ax.set_ylabel(f"{what} [{_lab(kind, units)}]", fontsize=9)
    ax.legend(fontsize=6, frameon=False, ncol=2 if len(d["rows"]) > 8 else 1)
    _style(ax)


def _draw_economic(axes, d, units):
    (ax,) = axes
    t = _disp(d["thickness_m"], "thickness", units)
    cur = d["currency"]
    ax.plot(t, d["installed"], color=_GREY, lw=1.3, ls="--", marker="s", ms=3, label="installed cost")
    ax.plot(t, d["energy_pv"], color=_ACCENT, lw=1.3, ls=":", marker="^", ms=3,
            label=f"energy over {d['years']:g} years (present value)")
    ax.plot(t, d["total"], color=_INK, lw=2.0, marker="o", ms=3, label="total")
    best = float(_disp(d["economic_thickness_m"], "thickness", units))
    ax.axvline(best, color=_INK, lw=1.0, ls="-.", label=f"economic thickness {best:g} {_lab('thickness', units)}")
    ax.set_xlabel(f"thickness [{_lab('thickness', units)}]", fontsize=9)
    per = d.get("per", "m")
    word = {"m": "metre", "m²": "m²", "vessel": "vessel"}.get(per, per)
    ax.set_ylabel(f"cost per {word} [{cur}/{per}]" if cur else f"cost per {word}", fontsize=9)
    ax.legend(fontsize=7, frameon=False)
    _style(ax)


def _draw_bare_insulated(axes, d, units):
    (ax,) = axes
    kind = d.get("kind", "heat_flow_per_length")
    values = _disp([d["bare"], d["insulated"]], kind, units)
    bars = ax.bar(["bare", "insulated"], values, color=["#c9d3d4", "#5f7f84"], edgecolor=_INK, hatch=["//", ""])
    for bar, v in zip(bars, values):
        ax.annotate(f"{v:.1f}", (bar.get_x() + bar.get_width() / 2, v), ha="center", va="bottom", fontsize=8)
    ax.set_ylabel(f"heat flow [{_lab(kind, units)}]", fontsize=9)
    _style(ax)


def _draw_schedule(axes, d, units):
    (ax,) = axes
    rows = d["rows"]
    groups = list(dict.fromkeys(r["governing_label"] for r in rows))
    y = np.arange(len(rows))[::-1]
    for j, group in enumerate(groups):
        idx = [i for i, r in enumerate(rows) if r["governing_label"] == group]
        widths = [float(_disp(rows[i]["thickness_m"], "thickness", units)) for i in idx]
        bars = ax.barh(y[idx], widths, color=("#5f7f84", "#c9d3d4", "#9aa9ab", "#e6ebeb", "#3e5a5e")[j % 5],
                       edgecolor=_INK, lw=0.6, hatch=_HATCHES[j % len(_HATCHES)], label=f"governed by {group}")
        for bar, w in zip(bars, widths):
            ax.annotate(f"{w:.{0 if units == 'si' else 2}f}", (w, bar.get_y() + bar.get_height() / 2),
                        xytext=(3, 0), textcoords="offset points", va="center", fontsize=7)
    ax.set_yticks(y)
    ax.set_yticklabels([r["label"] for r in rows], fontsize=7)
    ax.set_xlabel(f"thickness [{_lab('thickness', units)}]", fontsize=9)
    ax.legend(fontsize=7, frameon=False, loc="upper center", bbox_to_anchor=(0.5, -0.5 / max(1, len(rows)) - 0.12),
              ncol=1)
    _style(ax)


_DRAW = {"thickness_sweep": _draw_thickness_sweep, "buildup_profile": _draw_profile, "along_run": _draw_along_run,
         "table_thickness": _draw_table_thickness, "matrix": _draw_matrix, "economic_curve": _draw_economic,
         "bare_insulated": _draw_bare_insulated, "schedule_thickness": _draw_schedule}


def _need(module: str, option: str):
    """Import *module* (matplotlib, openpyxl) or say in one line how to install it."""
    import importlib

    try:
        return importlib.import_module(module)
    except ImportError:
        from ..errors import InputError

        raise InputError(option, f'this needs {module}, which is not installed; '
                                 f'pip install "pipeins[report]"') from None


def draw(charts, units: str = "si", option: str = "--format"):
    """One matplotlib figure holding *charts* (a chart or a list), one below the other."""
    _need("matplotlib", option)
    from matplotlib.figure import Figure

    charts = [charts] if isinstance(charts, Chart) else list(charts)
    panels = [PANELS.get(c.kind, 1) for c in charts]
    heights = []  # inches per panel: a bar per schedule row needs room
    for chart, n in zip(charts, panels):
        tall = 0.32 * len(chart.data["rows"]) + 1.0 if chart.kind == "schedule_thickness" else 2.7
        heights += [max(2.0, tall)] * n
    fig = Figure(figsize=(7.2, sum(heights) + 0.5 * len(charts)), layout="constrained")
    axes = fig.subplots(sum(panels), 1, squeeze=False, gridspec_kw={"height_ratios": heights})[:, 0]
    k = 0
    for chart, n in zip(charts, panels):
        mine = list(axes[k:k + n])
        if n > 1:
            for ax in mine[:-1]:
                ax.sharex(mine[-1])
        _DRAW[chart.kind](mine, chart.data, units)
        mine[0].set_title(textwrap.fill(chart.title, 75), fontsize=10, color=_INK)
        k += n
    return fig


def _svg_text(fig) -> str:
    import matplotlib

    buf = io.StringIO()
    with matplotlib.rc_context({"svg.hashsalt": "pipeins", "svg.fonttype": "path"}):
        fig.savefig(buf, format="svg", metadata={"Date": None, "Creator": None, "Format": None, "Type": None})
    return buf.getvalue()


def chart_svg(chart: Chart, units: str = "si", id_prefix: str = "c-") -> str:
    """The chart as an ``<svg>`` element to place inline in HTML: no XML prolog, no
    namespace URLs or metadata, ids prefixed with *id_prefix* so that several charts can
    share one page."""
    text = _svg_text(draw(chart, units))
    text = text[text.index("<svg"):]
    text = re.sub(r"<metadata>.*?</metadata>", "", text, flags=re.S)
    text = re.sub(r"<!--.*?-->", "", text, flags=re.S)
    text = re.sub(r'\s+xmlns(:\w+)?="[^"]*"', "", text)
    text = text.replace("xlink:href=", "href=")
    text = re.sub(r'\bid="([^"]+)"', lambda m: f'id="{id_prefix}{m.group(1)}"', text)
    text = re.sub(r'href="#([^"]+)"', lambda m: f'href="#{id_prefix}{m.group(1)}"', text)
    text = re.sub(r"url\(#([^)]+)\)", lambda m: f"url(#{id_prefix}{m.group(1)})", text)
    return text.replace("<svg", f'<svg role="img" aria-label="{_attr(chart.title)}"', 1)


def _attr(text: str) -> str:
    from html import escape

    return escape(text, quote=True)


def plot_bytes(charts, path: str, units: str = "si") -> bytes:
    """The bytes of the ``--plot`` file: every chart of the report in one figure, SVG or
    PNG by the ending of *path*."""
    from ..errors import InputError

    if not charts:
        raise InputError("--plot", "this report draws no chart")
    fig = draw(charts, units, "--plot")
    if path.lower().endswith(".svg"):
        return _svg_text(fig).encode("utf-8")
    buf = io.BytesIO()
    fig.savefig(buf, format="png", dpi=150, metadata={"Software": None})
    return buf.getvalue()


def register(kind: str, draw_function, panels: int = 1) -> None:
    """Add a chart kind drawn outside this module: *draw_function(axes, data, units)* draws
    the chart's data on its *panels* axes (e.g. :mod:`pipeins.reports.sweep`)."""
    _DRAW[kind] = draw_function
    PANELS[kind] = panels
