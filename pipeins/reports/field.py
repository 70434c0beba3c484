"""Report sections of the field conditions on a checked line: heat tracing (and, as they
land, buried lines, fittings and user materials).  Each returns a :class:`Table` of
(item, value) rows in the chosen unit system."""

from __future__ import annotations

from . import Column, Table

__all__ = ["tracing_table"]


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
