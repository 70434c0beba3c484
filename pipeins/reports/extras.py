"""The "Along the run and over time" rows of a line, from :func:`pipeins.line_extras.line_extras`."""

from __future__ import annotations

__all__ = ["run_extras", "extras_rows"]


def extras_rows(extras, units: str) -> list[list[str]]:
    """The rows (item, value) of a :class:`pipeins.line_extras.LineExtras` in the unit system *units*."""
    from ..units import format_quantity as fq, to_display, unit_label

    rows = []
    length = extras.length_m
    if length is not None:
        if extras.mass_flow_kg_s is not None:
            rows += [["mass flow", fq(extras.mass_flow_kg_s, "mass_flow", units)],
                     ["outlet temperature", fq(extras.outlet_temp_c, "temperature", units)],
                     ["temperature change", fq(extras.temp_change_k, "temperature_difference", units, digits=2)]]
        rows.append([f"heat flow over {fq(length, 'length', units)}", fq(extras.heat_flow_w, "power", units)])
    if extras.condensate_kg_per_h_per_m is not None:
        per_m_kg_s = extras.condensate_kg_per_h_per_m / 3600.0
        per_length = per_m_kg_s / to_display(1.0, "length", units)
        rows.append(["condensate (running load)",
                     f"{to_display(per_length, 'mass_flow', units):.3f} {unit_label('mass_flow', units)} "
                     f"per {unit_label('length', units)}"])
        if length is not None:
            rows.append([f"condensate over {fq(length, 'length', units)}",
                         fq(per_m_kg_s * length, "mass_flow", units, digits=2)])
    if extras.freeze_start_s is not None:
        rows.append([f"still water reaches {fq(0.0, 'temperature', units, 0)} after",
                     fq(extras.freeze_start_s, "time", units, digits=1)])
    return rows


def run_extras(spec, result, units):
    """Rows, SI data and warnings about the run and over time, for ``pipeins check`` and ``size``.

    The figures and notes come from :func:`pipeins.line_extras.line_extras`; the rows are
    written here in the unit system *units*.  The warnings are the structured notes
    (:class:`pipeins.notes.Note`): the report builders write them
    (:func:`pipeins.reports.notes.render_all`).
    """
    from ..line_extras import line_extras

    extras = line_extras(spec, result)
    return extras_rows(extras, units), extras.data(), list(extras.notes)
