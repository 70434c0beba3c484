"""Report sections of the field conditions on a checked line: heat tracing (and, as they
land, buried lines, fittings and user materials).  Each returns a :class:`Table` of
(item, value) rows in the chosen unit system."""

from __future__ import annotations

from . import Column, Table

__all__ = ["tracing_table", "buried_table", "materials_table"]


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
        ["soil resistance", f"{data['soil_resistance_mk_w']:.4f} m·K/W"],
        ["heat flow", fq(data["heat_flow_w_per_m"], "heat_flow_per_length", units)],
        ["casing surface temperature", fq(data["casing_temp_c"], "temperature", units)],
    ]
    note = ("The soil is a resistance acosh(2z/D)/(2π·k) in series with the insulation, to an isothermal ground "
            "surface (cylinder in a semi-infinite medium, Incropera et al., Table 4.1); the Results above hold it "
            "as a fixed outer coefficient to the ground temperature (no air film, no radiation). Single pipe only: "
            "twin pipes and neighbouring lines are not modelled. Soil conductivity varies with moisture: use a "
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
