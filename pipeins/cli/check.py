"""``pipeins check``: heat flow and temperatures of one line."""

from __future__ import annotations

import click

from .condition_options import condition_option
from .field_options import add_field_sections, field_line, field_options, pop_field_options
from .options import emit, line_options, output_options, plot_option, spec_from_options, wants_charts


@click.command()
@line_options
@field_options
@condition_option
@output_options
@plot_option
def check(fmt, units, output, **opts):
    """Heat flow and temperatures of one insulated (or bare) line.

    Solves the resistance network from the fluid outward: inner film, pipe wall, each
    layer with its conductivity varying with temperature, and the outer surface losing
    heat by convection and radiation. Prints the heat flow per metre, the surface and
    interface temperatures, the outer film coefficients, the dew point (with --rh) and
    warnings. JSON output is SI whatever --units says.

    With --condition (repeatable) the line is solved under each design condition as well:
    the check is under the first, and a Design conditions table gives the heat loss or
    gain, the surface, the dew point and the margin above it under every one.

    \b
    Example:
      pipeins check --pipe "NPS 4" --fluid-temp 180C --ambient-temp 25C \\
          --layer "mineral wool:50mm" --finish "aluminium, dull or aged"
      pipeins check --pipe DN50 --fluid-temp 6C --ambient-temp 28C --rh 75 \\
          --layer "flexible elastomeric foam:19mm" --format json
      pipeins check --pipe DN80 --fluid-temp 7C --layer "flexible elastomeric foam:25mm" \\
          --condition "summer: ambient-temp=32C, rh=75" --condition "night: ambient-temp=24C, rh=90"
    """
    from ..reports.check import check_report
    from ..reports.extras import run_extras

    conditions = opts.pop("condition", ())
    field = pop_field_options(opts, units)
    under = _under_conditions(conditions, opts, field, units) if conditions else None
    spec = field_line(under[0][1] if under else spec_from_options(opts, units), field, units)
    result = spec.solve()
    if spec.section_kind != "pipe":
        from ..reports.section import section_report
        from ..sections import night_extras, section_extras

        rows, data, warnings = section_extras(spec, result, units)
        night_extras(spec, result, units, rows, data, warnings)
        report = section_report(spec, result, units, rows, data, warnings)
        add_field_sections(report, spec, field, units)
        _add_conditions(report, under, result, units)
        emit(report, fmt, units, output)
        return
    from ..sections import night_extras

    rows, data, warnings = run_extras(spec, result, units)
    night_extras(spec, result, units, rows, data, warnings)
    report = check_report(spec, result, units, rows, data, warnings)
    if wants_charts(fmt):  # the chart data is built only for the HTML page and --plot
        from ..reports.charts import check_charts

        report.charts = check_charts(spec, result)
    add_field_sections(report, spec, field, units)
    _add_conditions(report, under, result, units)
    emit(report, fmt, units, output)


def _under_conditions(texts, opts: dict, field: dict, units: str):
    """``[(condition, spec), …]`` of the ``--condition`` texts: the line under each (the
    line's own options shared where a condition does not set them)."""
    from ..errors import InputError
    from ..inputs import Problems
    from .condition_options import conditions_from_options, parse_conditions

    parsed = parse_conditions(texts)
    for name, _settings, here in parsed:
        if here is not None:
            raise InputError("--condition", f'"{name}": criteria= chooses what a condition is sized for (size, '
                                            "table); check solves the line under every condition: drop it")
    if field.get("buried") is not None:
        raise InputError("--condition", "design conditions are conditions of the air; a buried line is in the soil "
                                        "(--ground-temp): drop --condition")
    items: list = []
    under = conditions_from_options(parsed, opts, units, items)
    if items:
        raise Problems(items)
    return under


def _add_conditions(report, under, result, units: str) -> None:
    """The line under each design condition (the first's solve is *result*) in *report*."""
    if not under:
        return
    from ..reports.conditions import add_check_conditions

    solved = [(c, s, result if k == 0 else s.solve()) for k, (c, s) in enumerate(under)]
    add_check_conditions(report, solved, units)
