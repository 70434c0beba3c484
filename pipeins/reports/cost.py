"""Report of a cost study: bare against insulated, payback, the economic curve."""

from __future__ import annotations

import math

import numpy as np

from . import Column, Report, Table
from .cautions import cautions_for

__all__ = ["cost_report"]


def _money(x):
    return None if x is None or not math.isfinite(x) else round(float(x), 2)


def cost_report(study, units: str = "si") -> Report:
    from ..units import format_quantity as fq

    cur = study.basis.price.currency if study.basis.price is not None else ""
    per = f"{cur}/" if cur else "per "
    money = f"cost per year [{cur}]" if cur else "cost per year"
    cols = [Column("case"), Column("heat flow", "heat_flow_per_length"), Column("over the run", "power"),
            Column("energy per year", "energy"), Column(money, None), Column("CO2 per year [kg]", None)]
    sav = study.saving

    def row(name, q_m, q, fig):
        return [name, q_m, q, fig["energy_j"], _fmt(fig["cost"]), _fmt(fig["co2_kg"], 0)]

    rows = [row("bare", study.bare_w_per_m, study.bare_w, study.bare),
            row("insulated", study.insulated_w_per_m, study.insulated_w, study.insulated),
            row("saving", study.bare_w_per_m - study.insulated_w_per_m, study.bare_w - study.insulated_w, sav)]
    tables = [Table(f"Bare against insulated over {fq(study.length_m, 'length', units)}"
                    + (f" with {study.fitting_length_m:.1f} m of bare fittings" if study.fitting_length_m else ""),
                    cols, rows)]
    data = {
        "length_m": study.length_m,
        "fittings": study.fittings,
        "fitting_equivalent_length_m": study.fitting_length_m,
        "bare": {"heat_flow_w_per_m": study.bare_w_per_m, "heat_flow_w": study.bare_w, **_si(study.bare)},
        "insulated": {"heat_flow_w_per_m": study.insulated_w_per_m, "heat_flow_w": study.insulated_w,
                      **_si(study.insulated)},
        "saving": {"heat_flow_w": study.bare_w - study.insulated_w, **_si(sav)},
        "currency": cur,
        "installed_cost": _money(study.installed_cost),
        "simple_payback_years": _money(study.payback_years),
    }
    if study.installed_cost is not None:
        tables.append(Table("Investment", [Column("installed cost"), Column("saving per year"),
                                           Column("simple payback [years]")],
                            [[_fmt(study.installed_cost), _fmt(sav["cost"]), _fmt(study.payback_years, 1)]]))
    curve = study.curve
    if curve is not None:
        ccols = [Column("thickness", "thickness"), Column(f"installed [{cur}/m]"),
                 Column(f"energy, present value [{cur}/m]"), Column(f"total [{cur}/m]"), Column("least total")]
        crow = [[t, _fmt(i), _fmt(e), _fmt(tot), "← economic thickness" if j == curve.best_index else ""]
                for j, (t, i, e, tot) in enumerate(zip(curve.thickness_m, curve.installed_per_m,
                                                       curve.energy_pv_per_m, curve.total_per_m))]
        b = study.basis
        tables.append(Table(f"Economic thickness over {b.years:g} years at {100 * b.discount_rate:g} %"
                            + (f", price rising {100 * b.escalation:g} %/year" if b.escalation else ""),
                            ccols, crow, note="the flat bottom of the curve: thicknesses near the least "
                                              "total cost about the same over the life"))
        data["economic_curve"] = {
            "thickness_m": [float(t) for t in curve.thickness_m],
            "installed_per_m": [float(x) for x in curve.installed_per_m],
            "energy_pv_per_m": [float(x) for x in curve.energy_pv_per_m],
            "total_per_m": [float(x) for x in curve.total_per_m],
            "economic_thickness_m": float(curve.thickness_m[curve.best_index]),
        }
    warnings = list(study.warnings) + (list(curve.warnings) if curve is not None else [])
    basis = study.basis
    hours = np.asarray(basis.hours_per_year, dtype=float)
    profile = getattr(study, "profile", None)
    if profile:
        footer_hours = "profile " + ", ".join(
            f"{fq(t, 'temperature', units)} for {h:g} h" for t, h in profile) + " (heat flows shown are hours-weighted means)"
    else:
        footer_hours = f"{float(hours):g} h per year"
    footer = [footer_hours + "; "
              + (f"heat source efficiency {basis.efficiency:g}" if basis.cop is None else
                 f"efficiency {basis.efficiency:g}, chiller COP {basis.cop:g}")
              + (f"; energy {basis.price.price_per_unit:g} {per}{basis.price.unit}" if basis.price else ""),
              "energy, price and emission inputs are the user's; demo values in examples/ are invented"]
    cautions = cautions_for(study.spec, study.result)
    data.update({"warnings": warnings, "cautions": cautions})
    size = study.spec.pipe_size().label
    return Report(f"Energy and cost: {size}", tables, data, warnings, cautions, footer)


def _fmt(x, digits=2):
    if x is None:
        return "–"
    try:
        import numpy as np

        x = float(np.asarray(x))
    except TypeError:
        return str(x)
    if not math.isfinite(x):
        return "never"
    return f"{x:,.{digits}f}"


def _si(fig: dict) -> dict:
    import numpy as np

    return {"energy_j": float(np.asarray(fig["energy_j"])),
            "cost": None if fig["cost"] is None else float(np.asarray(fig["cost"])),
            "co2_kg": None if fig["co2_kg"] is None else float(np.asarray(fig["co2_kg"]))}
