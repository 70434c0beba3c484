"""Report of a cost study: bare against insulated, payback, the economic curve.

Heat losses and heat gains are separate columns (never netted), each with its energy, cost
and CO2 per year: heating (losses made up through the heat source's efficiency) and cooling
(gains removed through the chiller's COP).  The saving row is bare − insulated of the
numbers as printed, so the rows subtract.
"""

from __future__ import annotations

import math

import numpy as np

from . import Column, Report, Table
from .cautions import cautions_for

__all__ = ["cost_report", "per_energy_text", "face_basis_text"]

#: Energy unit prices and emission factors are shown per: kWh in SI, MMBtu (10^6 Btu, IT) in US units.
_ENERGY_UNIT = {"si": ("kWh", 3.6e6), "us": ("MMBtu", 1.05505585262e9)}


def per_energy_text(value_per_j: float, units: str, what: str = "") -> str:
    """A price or emission factor per joule as text per kWh (SI) or per MMBtu (US), e.g.
    ``per_energy_text(2.5e-8, "si", "EUR")`` → ``"0.09 EUR/kWh"``."""
    unit, joules = _ENERGY_UNIT[units]
    return f"{value_per_j * joules:.4g} {what + '/' if what else 'per '}{unit}"

#: JSON key endings of the economic curve's money by the unit priced (per metre of a run, per vessel).
_PER_KEYS = {"m": "_per_m", "m²": "_per_m2", "vessel": "_per_vessel"}
#: Money per metre of run and per m² of face are shown per foot and per ft² in US units: (unit, factor).
_US_PER = {"m": ("ft", 0.3048), "m²": ("ft²", 0.09290304)}
#: Display kind of the surface a table per m² is priced on, by the unit priced.
_AREA_KINDS = {"m": "area_per_length", "m²": "area", "vessel": "area"}


def face_basis_text(study, units: str) -> str:
    """What a face's figures are for: ``"over 12 m² of face"`` (an area given) or ``"per m² of
    face (no --area given)"`` (:attr:`pipeins.costing.CostStudy.area_given`)."""
    from ..units import format_quantity

    if study.area_given:
        return f"over {format_quantity(study.area_m2, 'area', units)} of face"
    return "per m² of face (no --area given)"


def _wrap(study) -> bool:
    """Whether the outer layer of the study's line is a wrap (its thicknesses nominal)."""
    from ..catalog.materials import lookup_material

    return bool(study.spec.layers) and lookup_material(study.spec.layers[-1][0]).is_wrap


_DUTY_WORDS = {"heating": ("heat loss", "heating"), "cooling": ("heat gain", "cooling")}


def _money(x):
    return None if x is None or not math.isfinite(x) else round(float(x), 2)


def _rounded(bare, ins, digits):
    """(bare, insulated, saving) rounded to *digits*, the saving the difference of the
    rounded values (so the printed rows subtract)."""
    if bare is None:
        return None, None, None
    b = round(float(bare), digits)
    if ins is None:
        return b, None, None
    i = round(float(ins), digits)
    return b, i, round(b - i, digits)


def _duties(study) -> list[str]:
    """Duties the line has (heating, cooling or both over a profile)."""
    figs = [study.bare] + ([study.insulated] if study.insulated is not None else [])
    out = [d for d, key in (("heating", "heat_loss_w"), ("cooling", "heat_gain_w"))
           if any(f[key] > 0 for f in figs)]
    return out or ["heating"]


def cost_report(study, units: str = "si") -> Report:
    from ..units import format_quantity as fq
    from ..units import to_display, unit_label

    basis = study.basis
    cur = basis.price.currency if basis.price is not None else ""
    duties = _duties(study)
    bare, ins = study.bare, study.insulated
    ins_get = (lambda *keys: None) if ins is None else (lambda *keys: _dig(ins, keys))

    cols, columns = [Column("case")], []
    digits_q = 0
    for duty in duties:
        word, money_word = _DUTY_WORDS[duty]
        key = "heat_loss_w" if duty == "heating" else "heat_gain_w"
        over = _rounded(to_display(bare[key], "power", units), None if ins is None else
                        to_display(ins[key], "power", units), digits_q)
        where = {"vessel": "for the vessel", "m²": "over the face" if study.area_given else "per m² of face"
                 }.get(study.per, "over the run")
        cols.append(Column(f"{word}, {where}", unit=unit_label("power", units), digits=digits_q, grouped=True))
        columns.append(over)
        e_b, e_i = bare[duty]["energy_j"], ins_get(duty, "energy_j")
        e_digits = 0 if units == "si" else 1
        cols.append(Column(f"{money_word} energy per year", unit=unit_label("energy", units), digits=e_digits,
                           grouped=True))
        columns.append(_rounded(to_display(e_b, "energy", units),
                                None if e_i is None else to_display(e_i, "energy", units), e_digits))
        if bare[duty]["cost"] is not None:
            cols.append(Column(f"{money_word} cost per year", unit=cur or None, digits=2, grouped=True))
            columns.append(_rounded(bare[duty]["cost"], ins_get(duty, "cost"), 2))
        if bare[duty]["co2_kg"] is not None:
            cols.append(Column(f"{money_word} CO2 per year", unit="kg", digits=0, grouped=True))
            columns.append(_rounded(bare[duty]["co2_kg"], ins_get(duty, "co2_kg"), 0))
    names = ["bare", "insulated", "saving"] if ins is not None else ["bare"]
    rows = [[name] + [c[j] for c in columns] for j, name in enumerate(names)]
    fittings = ", ".join(f"{n} {kind}{'s' if n > 1 else ''}" for kind, n in study.fittings.items())
    if study.length_m == 0:
        title = f"Bare fittings alone: {fittings} (as {fq(study.fitting_length_m, 'length', units)} of bare pipe)"
    else:
        title = (f"Bare against insulated over {fq(study.length_m, 'length', units)}" if ins is not None
                 else f"Bare line over {fq(study.length_m, 'length', units)}")
        if study.fitting_length_m:
            title += f" with {fittings} ({fq(study.fitting_length_m, 'length', units)} of bare pipe)"
    if study.whole_vessel:
        title = "Bare against insulated, the whole vessel" if ins is not None else "Bare vessel"
        per_m_cols = [Column("case"), Column("heat flow", "power")]
        per_m_rows = [["bare", study.bare_w]] + ([["insulated", study.insulated_w]] if ins is not None else [])
    else:
        face = study.per == "m²"
        if face:
            title = ("Bare against insulated" + (" " if study.area_given else ", ") if ins is not None
                     else "Bare, ") + face_basis_text(study, units)
        per_m_cols = [Column("case"), Column("heat flow", "heat_flux" if face else "heat_flow_per_length"),
                      Column("over the face" if face else "over the run", "power")]
        per_m_rows = [["bare", study.bare_per_unit, study.bare_w]]
        if ins is not None:
            per_m_rows.append(["insulated", study.insulated_per_unit, study.insulated_w])
        if face and not study.area_given:  # per m²: the total over 1 m² says nothing more
            per_m_cols, per_m_rows = per_m_cols[:2], [row[:2] for row in per_m_rows]
    noun = {"m²": "face", "vessel": "vessel"}.get(study.per, "line")
    note = ("Heat losses and heat gains are kept apart; saving = bare − insulated as printed." if ins is not None
            else f"The bare {noun}: the {'pipe' if noun == 'line' else noun}'s own surface, no insulation "
                 "(no --layer given).")
    tables = [Table(title, cols, rows, note=note),
              Table("Heat flow (+ lost by the fluid, − gained)", per_m_cols, per_m_rows)]

    per_key = {"m": "heat_flow_w_per_m", "m²": "heat_flow_w_per_m2"}.get(study.per)

    def block(fig, per_unit, w):
        out = {} if per_key is None else {per_key: per_unit}
        out.update({"heat_flow_w": w,
               "heat_loss_w": fig["heat_loss_w"], "heat_gain_w": fig["heat_gain_w"],
               "heating": dict(fig["heating"]), "cooling": dict(fig["cooling"]),
               "cost": study.annual_cost(fig)})
        co2 = [fig[d]["co2_kg"] for d in ("heating", "cooling")]
        out["co2_kg"] = None if any(c is None for c in co2) else float(sum(co2))
        return out

    bare_block = block(bare, study.bare_per_unit, study.bare_w)
    bare_block.update({"surface": study.bare_surface.name, "emittance": float(np.asarray(study.bare_surface.emittance))})
    data = {"length_m": study.length_m} if study.per != "m²" else {
        "area_m2": study.area_m2, "area_given": study.area_given, "priced_per": face_basis_text(study, "si")}
    data.update({
        "fittings": study.fittings,
        "fitting_equivalent_length_m": study.fitting_length_m,
        "bare": bare_block,
        "insulated": None if ins is None else block(ins, study.insulated_per_unit, study.insulated_w),
        "currency": cur,
        "installed_cost": _money(study.installed_cost),
        "simple_payback_years": _money(study.payback_years),
    })
    if ins is not None:
        sav = study.saving
        data["saving"] = {"heat_loss_w": sav["heat_loss_w"], "heat_gain_w": sav["heat_gain_w"],
                          "heating": sav["heating"], "cooling": sav["cooling"], "cost": study.annual_cost(sav)}
    else:
        data["saving"] = None
    if study.installed_cost is not None:
        saving_cost = study.annual_cost(study.saving)
        tables.append(Table("Investment", [Column("installed cost", unit=cur or None, digits=2, grouped=True),
                                           Column("cost saving per year", unit=cur or None, digits=2, grouped=True),
                                           Column("simple payback", unit="years", digits=1)],
                            [[study.installed_cost, saving_cost, study.payback_years]],
                            note=f"the payback is on the heating and cooling savings of this {noun} together"))
    curve = study.curve
    if curve is not None:
        per = curve.per  # m of a run, vessel
        # money per metre of run (per m² of face) shown per foot (per ft²) in US units (JSON stays SI)
        shown, scale = _US_PER.get(per, (per, 1.0)) if units == "us" else (per, 1.0)
        unit = f"{cur}/{shown}" if cur else f"per {shown}"
        ccols = [Column("thickness" + (", nominal" if _wrap(study) else ""), "thickness"),
                 Column("installed", unit=unit, digits=2, grouped=True),
                 Column("energy, present value", unit=unit, digits=2, grouped=True),
                 Column("total", unit=unit, digits=2, grouped=True), Column("least total")]
        crow = [[t, scale * float(i), scale * float(e), scale * float(tot),
                 "← economic thickness" if j == curve.best_index else ""]
                for j, (t, i, e, tot) in enumerate(zip(curve.thickness_m, curve.installed,
                                                       curve.energy_pv, curve.total))]
        note = "the flat bottom of the curve: thicknesses near the least total cost about the same over the life"
        if per == "m²":
            note += "; installed cost: the table's cost per unit area of face"
        elif curve.area_m2_per_unit is not None:
            note += ("; installed cost = the table's cost per unit area × the surface before insulating, "
                     f"{fq(curve.area_m2_per_unit, _AREA_KINDS[per], units)}")
        tables.append(Table(f"Economic thickness over {basis.years:g} years at {100 * basis.discount_rate:g} %"
                            + (f", price rising {100 * basis.escalation:g} %/year" if basis.escalation else ""),
                            ccols, crow, note=note))
        suffix = _PER_KEYS[per]
        data["economic_curve"] = {
            "thickness_m": [float(t) for t in curve.thickness_m],
            f"installed{suffix}": [float(x) for x in curve.installed],
            f"energy_pv{suffix}": [float(x) for x in curve.energy_pv],
            f"total{suffix}": [float(x) for x in curve.total],
            "economic_thickness_m": float(curve.thickness_m[curve.best_index]),
            "per": per,
            "cost_basis": basis.cost_table.basis,
            "area_m2_per_unit": curve.area_m2_per_unit,
        }
    warnings = list(study.warnings) + (list(curve.warnings) if curve is not None else [])
    hours = np.asarray(basis.hours_per_year, dtype=float)
    profile = getattr(study, "profile", None)
    if profile:
        footer_hours = "profile " + ", ".join(
            f"{fq(t, 'temperature', units)} for {h:g} h" for t, h in profile) + " (heat flows shown are hours-weighted means)"
    else:
        footer_hours = f"{float(hours):g} h per year"
    source = [f"heat losses through a heat source efficiency of {basis.efficiency:g}"] if "heating" in duties else []
    if "cooling" in duties:
        source.append(f"heat gains through a chiller COP of {basis.cop:g}")
    priced = [f"priced {face_basis_text(study, units)}"] if study.per == "m²" else []
    footer = priced + [footer_hours + "; " + ", ".join(source)
              + (f"; energy {per_energy_text(basis.price.price_per_j, units, cur)}" if basis.price else "")
              + (f"; CO2 {per_energy_text(basis.emission.kg_per_j, units, 'kg')}" if basis.emission else ""),
              f"bare {noun}: {study.bare_surface.name}, emittance {float(np.asarray(study.bare_surface.emittance)):.2f}, "
              "no insulation",
              "energy, price and emission inputs are the user's; demo values in examples/ are invented"]
    cautions = cautions_for(study.spec, study.result)
    data.update({"warnings": warnings, "cautions": cautions})
    size = study.spec.pipe_size().label
    return Report(f"Energy and cost: {size}", tables, data, warnings, cautions, footer)


def _dig(fig, keys):
    for k in keys:
        fig = fig[k]
    return fig
