"""Field-condition options of ``check``: heat tracing (more to come: buried lines, fittings,
user materials).

:func:`field_options` adds the options; :func:`pop_field_options` takes their text out of
the command's options before the line is built; :func:`add_field_sections` solves what
they ask for and adds its sections to the check report.  Every problem is an
:class:`~pipeins.errors.InputError` naming the flag, raised before anything is written.
"""

from __future__ import annotations

import click

__all__ = ["field_options", "pop_field_options", "add_field_sections", "FIELD_FLAGS"]

FIELD_OPTIONS = [
    click.option("--maintain-temp", help="Heat tracing: the temperature the tracer must hold, e.g. 5C; "
                                         "gives the design heat loss per metre."),
    click.option("--min-ambient", help="Heat tracing: the minimum design ambient (default --ambient-temp)."),
    click.option("--safety-factor", help="Heat tracing: safety factor on the calculated heat loss, percent "
                                         "(default 20 %, common practice after IEEE 515 / IEC/IEEE 60079-30-2)."),
    click.option("--tracer-output", help="Heat tracing: the tracer's output at the maintain temperature, "
                                         "e.g. 15W/m, compared with the design heat loss."),
]
#: click destinations of the options above.
FIELD_FLAGS = ("maintain_temp", "min_ambient", "safety_factor", "tracer_output")


def field_options(func):
    for option in reversed(FIELD_OPTIONS):
        func = option(func)
    return func


def pop_field_options(opts: dict) -> dict:
    """The field options' text (None where not given), removed from *opts*."""
    return {name: opts.pop(name, None) for name in FIELD_FLAGS}


def _flag(name: str) -> str:
    return "--" + name.replace("_", "-")


def add_field_sections(report, spec, field: dict, units: str) -> None:
    """Solve what the field options ask for and add the sections (and JSON keys) to *report*."""
    from ..errors import InputError
    from ..units import parse_quantity

    def q(name, kind):
        text = field.get(name)
        return None if text is None else parse_quantity(text, kind, _flag(name), units)

    maintain = q("maintain_temp", "temperature")
    others = [n for n in ("min_ambient", "safety_factor", "tracer_output") if field.get(n) is not None]
    if maintain is None:
        if others:
            raise InputError(_flag(others[0]), "is a heat-tracing input: give --maintain-temp too")
        return
    from ..tracing import DEFAULT_SAFETY_FACTOR_PERCENT, design_heat_loss

    sf = q("safety_factor", "percent")
    output = q("tracer_output", "heat_flow_per_length")
    words = {"maintain_temp_c": "--maintain-temp", "safety_factor_percent": "--safety-factor",
             "tracer_output_w_per_m": "--tracer-output"}
    try:
        design = design_heat_loss(spec, maintain, DEFAULT_SAFETY_FACTOR_PERCENT if sf is None else sf,
                                  min_ambient_c=q("min_ambient", "temperature"), tracer_output_w_per_m=output)
    except InputError as exc:
        if exc.name in words:
            raise InputError(words[exc.name], exc.message.replace("minimum design ambient",
                                                                  "minimum design ambient (--min-ambient)")) from None
        raise
    from ..reports.field import tracing_table

    report.tables.append(tracing_table(design, units))
    report.data["tracing"] = design.to_dict()
    for text in design.warnings:
        if text not in report.warnings:
            report.warnings.append(text)
    if design.sufficient is False:
        report.warnings.append("the tracer output is below the design heat loss: the line will not hold "
                               "the maintain temperature at the minimum design ambient")
    report.data["warnings"] = report.warnings
