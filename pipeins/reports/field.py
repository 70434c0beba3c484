"""Report sections of the field conditions on a checked line: heat tracing, buried lines,
fittings (bare and covered, apart from the pipe) and user materials.  Each returns a :class:`Table` of
(item, value) rows in the chosen unit system."""

from __future__ import annotations

import numpy as np

from . import Column, Table

__all__ = ["tracing_table", "buried_table", "materials_table", "fittings_table", "add_fittings",
           "fittings_cost_table", "add_traced_alternative", "traced_alternative_text"]


def _rows_table(title: str, rows, note: str = "") -> Table:
    return Table(title, [Column("item"), Column("value")], [list(r) for r in rows], note=note)


def tracing_table(design, units: str) -> Table:
    """The heat-tracing section of a :class:`pipeins.tracing.TracingDesign`."""
    from ..units import format_quantity as fq

    wind = "still air" if design.wind_m_s == 0 else fq(design.wind_m_s, "speed", units)
    rows = [
        ["maintain temperature", fq(design.maintain_temp_c, "temperature", units)],
        ["minimum design ambient", fq(design.min_ambient_c, "temperature", units)],
        ["design wind", wind],
        ["heat loss at these conditions", fq(design.heat_loss_w_per_m, "heat_flow_per_length", units)],
        ["surface at the maintain temperature", fq(design.surface_temp_c, "temperature", units)],
        ["safety factor", f"{design.safety_factor_percent:g} %"],
        ["design heat loss", fq(design.design_heat_loss_w_per_m, "heat_flow_per_length", units)],
    ]
    if design.fittings_allowance_w is not None:
        rows.append(["fittings allowance (with the safety factor)", fq(design.fittings_allowance_w, "power", units)])
    if design.design_heat_loss_w is not None:
        rows.append([f"design heat loss over {fq(design.length_m, 'length', units)}",
                     fq(design.design_heat_loss_w, "power", units)])
    if design.tracer_output_w_per_m is not None:
        rows += [["tracer output", fq(design.tracer_output_w_per_m, "heat_flow_per_length", units)],
                 ["margin", f"{fq(design.margin_w_per_m, 'heat_flow_per_length', units)} "
                            f"({design.margin_percent:+.0f} % of the design loss): "
                            + ("sufficient" if design.sufficient else "NOT sufficient")]]
    note = (f"safety factor: {design.safety_factor_source}. The fluid is taken still at the maintain "
            "temperature (no inner film). Select and install the tracer to its maker's rules and the "
            "electrical codes that apply; this is not a tracer design.")
    return _rows_table("Heat tracing", rows, note)


def buried_table(data: dict, units: str) -> Table:
    """The buried-line section (the dict of ``check``'s JSON key ``buried``)."""
    from ..units import format_quantity as fq

    soil = data["soil_name"]
    rows = [
        ["depth to the pipe centre", fq(data["depth_m"], "length", units)],
        ["casing outside diameter", fq(data["casing_diameter_m"], "diameter", units)],
        ["soil", f"{soil}, k = {fq(data['soil_k_w_mk'], 'conductivity', units)}"
                 + ("" if soil == "given" else f" ({data['soil_source']})")],
        ["ground surface temperature", fq(data["ground_temp_c"], "temperature", units)],
        ["shape factor per metre, 2π/acosh(2z/D)", f"{data['shape_factor_per_m']:.4f}"],
        ["soil resistance", fq(data["soil_resistance_mk_w"], "thermal_resistance_per_length", units)],
        ["heat flow", fq(data["heat_flow_w_per_m"], "heat_flow_per_length", units)],
        ["casing surface temperature", fq(data["casing_temp_c"], "temperature", units)],
    ]
    note = ("The soil is a resistance acosh(2z/D)/(2π·k) in series with the insulation, to an isothermal ground "
            "surface (cylinder in a semi-infinite medium, Incropera & DeWitt, 6th ed., Table 4.1, case 2, from memory); "
            "the Results above hold it "
            "as a fixed outer coefficient to the ground temperature (no air film, no radiation). Neighbouring lines are "
            "not modelled unless given (--twin-spacing, --twin-casing). Soil conductivity varies with moisture: use a "
            "site survey where the heat flow matters.")
    return _rows_table("Buried line", rows, note)


def materials_table(report, info: dict, units: str):
    """The insulation-conductivity section: per layer of the solved line, its mean
    temperature and the declared and design conductivity there; and its JSON dict."""
    from ..physics.conduction import conductivity_of
    from ..user_materials import DESIGN_FACTOR_BASIS
    from ..units import format_quantity as fq

    factors = info["factors"]
    factor = 1.0 if factors is None else factors.factor
    temps = report.data["interface_temps_c"]
    layers = report.data["line"]["layers"]
    from ..catalog import materials as catalogue

    rows, out = [], []
    for j, layer in enumerate(layers):
        mean = 0.5 * (float(temps[j + 1]) + float(temps[j + 2]))
        name = layer["material"].removesuffix(" (design)")
        declared = design_k = None
        if not name.startswith("constant conductivity"):
            # looked up as solved (the design material); the declared value is that over the factor
            design_k = float(conductivity_of(catalogue.lookup_material(name)).conductivity(mean))
            declared = design_k / factor
        rows.append([f"layer {j + 1}: {name}", fq(mean, "temperature", units),
                     "–" if declared is None else fq(declared, "conductivity", units),
                     "–" if design_k is None else fq(design_k, "conductivity", units)])
        out.append({"material": name, "mean_temp_c": mean, "declared_conductivity_w_mk": declared,
                    "design_conductivity_w_mk": design_k})
    data = {"file": info["file"], "materials": info["names"], "layers": out,
            "design_factors": None if factors is None else factors.to_dict()}
    note = (DESIGN_FACTOR_BASIS + (f"; factor used {factor:.4g}" if factors is not None else
                                   "; no design factors given: design = declared"))
    if info["file"]:
        note = f"materials from {info['file']} are found before the catalogue's. " + note
    table = Table("Insulation conductivity, declared and design", [Column("layer"), Column("mean temperature"),
                                                                   Column("declared k"), Column("design k")],
                  rows, note=note)
    return table, data


#: Area shown per unit system: (label, m² of one display unit).
_AREA = {"si": ("m²", 1.0), "us": ("ft²", 0.3048**2)}


def fittings_table(fits, units: str, pipe_note: str = "") -> Table:
    """The fittings of a line (a :class:`pipeins.fittings.FittingsResult`): each bare and,
    with a cover, covered and the saving; a total row.  Apart from the pipe's results."""
    label, per = _AREA[units]
    covered = fits.covered_heat_flow_w is not None
    gain = fits.total_bare_w < 0
    word = "heat gain" if gain else "heat loss"
    sign = -1.0 if gain else 1.0
    cols = [Column("fitting"), Column("bare area", digits=3 if units == "si" else 2, unit=label),
            Column(f"bare {word}", "power"), Column("bare surface", "temperature")]
    if covered:
        cols += [Column(f"covered {word}", "power"), Column("cover surface", "temperature"),
                 Column("saving", "power"), Column("saving", digits=0, unit="%")]
    rows = []
    for item in fits.items:
        f = item.fitting
        row = [f.label, f.area_m2 / per, sign * item.heat_flow_w, item.surface_temp_c]
        if covered:
            saving = item.saving_w
            row += [sign * item.covered_heat_flow_w, item.covered_surface_temp_c, sign * saving,
                    100.0 * saving / item.heat_flow_w if item.heat_flow_w else None]
        rows.append(row)
    if len(fits.items) > 1:
        total = ["total", sum(i.fitting.area_m2 for i in fits.items) / per, sign * fits.total_bare_w, None]
        if covered:
            saving = fits.total_bare_w - fits.total_covered_w
            total += [sign * fits.total_covered_w, None, sign * saving,
                      100.0 * saving / fits.total_bare_w if fits.total_bare_w else None]
        rows.append(total)
    note = f"Method: {fits.method}. Bare surface: {fits.bare_surface}."
    if covered:
        from ..units import format_quantity as fq

        note += (f" Cover: {fits.cover_material}, {fq(fits.cover_thickness_m, 'thickness', units)}, "
                 f"outer face {fits.cover_surface}; saving = bare − covered.")
    note += (" Areas from tables/fitting_areas.csv (dimensions from memory: check the maker's drawing). "
             "The fittings are not in the pipe's heat flow above." + (f" {pipe_note}" if pipe_note else ""))
    return Table("Fittings, bare and covered" if covered else "Fittings, bare", cols, rows, note=note)


def add_fittings(report, spec, fits, units: str) -> None:
    """Add the fittings table, the JSON keys ``fittings`` (list) and ``fittings_totals``, and
    the touch warnings of hot bare fittings to a check *report*; its CSV carries the fittings."""
    from ..units import format_quantity as fq

    q = report.data.get("heat_flow_w_per_m")
    pipe_note = "" if q is None else (f"Pipe: {fq(float(q), 'heat_flow_per_length', units)}, surface "
                                      f"{fq(float(report.data['surface_temp_c']), 'temperature', units)}.")
    report.tables.append(fittings_table(fits, units, pipe_note))
    report.csv_table = len(report.tables) - 1
    data = fits.to_dict()
    report.data["fittings"] = data["fittings"]
    report.data["fittings_totals"] = data["totals"]
    limit = spec.touch_limit_c
    if limit is not None and np.ndim(limit) == 0:
        for item in fits.items:
            for what, t in (("bare", item.surface_temp_c), ("covered", item.covered_surface_temp_c)):
                if t is not None and t > float(limit):
                    text = (f"{what} {item.fitting.label}: surface {fq(t, 'temperature', units)} is above the touch "
                            f"limit of {fq(float(limit), 'temperature', units)}: guard or cover it")
                    if text not in report.warnings:
                        report.warnings.append(text)
    for text in fits.warnings:
        if text not in report.warnings:
            report.warnings.append(text)
    report.data["warnings"] = report.warnings


def fittings_cost_table(fits, bare_fig: dict, covered_fig: dict | None, units: str, currency: str = "") -> Table:
    """Energy and cost per year of the fittings bare and covered (figures of
    :func:`pipeins.annual.split_figures`), heat loss and heat gain apart."""
    from ..units import to_display, unit_label

    rows = []
    for duty, key in (("heating", "heat_loss_w"), ("cooling", "heat_gain_w")):
        figs = [("bare", bare_fig)] + ([("covered", covered_fig)] if covered_fig is not None else [])
        if not any(float(f[key]) > 0 for _, f in figs):
            continue
        values = []
        for what, f in figs:
            d = f[duty]
            values.append([f"{what} ({'heat loss' if duty == 'heating' else 'heat gain'})", float(f[key]),
                           float(to_display(d["energy_j"], "energy", units)),
                           None if d["cost"] is None else round(float(d["cost"]), 2)])
        if len(values) == 2:
            b, c = values
            values.append(["saving", b[1] - c[1], b[2] - c[2], None if b[3] is None else round(b[3] - c[3], 2)])
        rows += values
    cols = [Column("fittings"), Column("heat flow", "power"),
            Column("energy per year", digits=0 if units == "si" else 2, unit=unit_label("energy", units),
                   grouped=True),
            Column("cost per year", digits=2, unit=currency or None, grouped=True)]
    return Table("Fittings over the year", cols, rows,
                 note="Fittings solved as objects (check --valve/--flange): " + fits.method + ".")


def traced_alternative_text(alt, units: str) -> str:
    """The sentence offering heat tracing (a :class:`pipeins.freezing.TracedAlternative`)."""
    from ..units import format_quantity as fq

    need = ("no thickness holds it" if not np.isfinite(alt.required_m) else
            f"it needs {fq(alt.required_m, 'thickness', units)}")
    return (f"{alt.size}: the freeze hold is impractical by insulation alone ({need}, more than the "
            f"practical {fq(alt.practical_limit_m, 'thickness', units)}, common practice); heat tracing is "
            f"the usual alternative: with {fq(alt.thickness_m, 'thickness', units)} of {alt.material}, a tracer "
            f"holding {fq(alt.maintain_temp_c, 'temperature', units)} at "
            f"{fq(alt.min_ambient_c, 'temperature', units)} must make up "
            f"{fq(alt.design_heat_loss_w_per_m, 'heat_flow_per_length', units)} (design heat loss with a "
            f"{alt.safety_factor_percent:g} % safety factor; check --maintain-temp and --tracer-output)")


def add_traced_alternative(report, selection, units: str):
    """*report* with the traced alternative of every size whose freeze hold needs more than the
    practical thickness: a warning line each and the JSON list ``traced_alternative``."""
    from ..freezing import traced_alternatives

    alts = traced_alternatives(selection)
    if alts:
        report.data["traced_alternative"] = [a.to_dict() for a in alts]
        for alt in alts:
            text = traced_alternative_text(alt, units)
            if text not in report.warnings:
                report.warnings.append(text)
        report.data["warnings"] = report.warnings
    return report


def twin_table(twin: dict, units: str) -> Table:
    """Two pipes in one trench: each heat flow with the other's influence, and alone."""
    from ..units import format_quantity as fq

    rows = [["supply (this line)", twin["alone_heat_flow_w_per_m"][0], twin["supply_heat_flow_w_per_m"]],
            [f"return at {fq(twin['return_temp_c'], 'temperature', units)}", twin["alone_heat_flow_w_per_m"][1],
             twin["return_heat_flow_w_per_m"]]]
    note = (f"centres {fq(twin['spacing_m'], 'length', units, digits=2)} apart; mutual soil resistance "
            f"{fq(twin['mutual_resistance_mk_w'], 'thermal_resistance_per_length', units)}; {twin['method']}; heat flow positive out of the fluid")
    return Table("Two pipes in one trench", [Column("pipe"), Column("alone", "heat_flow_per_length"),
                                             Column("beside the other", "heat_flow_per_length")], rows, note=note)
