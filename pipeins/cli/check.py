"""``pipeins check``: heat flow and temperatures of one line."""

from __future__ import annotations

import click

from .field_options import add_field_sections, field_line, field_options, pop_field_options
from .options import emit, line_options, output_options, plot_option, spec_from_options, wants_charts


@click.command()
@line_options
@field_options
@output_options
@plot_option
def check(fmt, units, output, **opts):
    """Heat flow and temperatures of one insulated (or bare) line.

    Solves the resistance network from the fluid outward: inner film, pipe wall, each
    layer with its conductivity varying with temperature, and the outer surface losing
    heat by convection and radiation. Prints the heat flow per metre, the surface and
    interface temperatures, the outer film coefficients, the dew point (with --rh) and
    warnings. JSON output is SI whatever --units says.

    \b
    Example:
      pipeins check --pipe "NPS 4" --fluid-temp 180C --ambient-temp 25C \\
          --layer "mineral wool:50mm" --finish "aluminium, dull or aged"
      pipeins check --pipe DN50 --fluid-temp 6C --ambient-temp 28C --rh 75 \\
          --layer "flexible elastomeric foam:19mm" --format json
    """
    from ..reports.check import check_report
    from ..reports.extras import run_extras

    field = pop_field_options(opts, units)
    spec = field_line(spec_from_options(opts, units), field, units)
    result = spec.solve()
    if spec.section_kind != "pipe":
        from ..reports.section import section_report
        from ..sections import night_extras, section_extras

        rows, data, warnings = section_extras(spec, result, units)
        night_extras(spec, result, units, rows, data, warnings)
        report = section_report(spec, result, units, rows, data, warnings)
        add_field_sections(report, spec, field, units)
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
    emit(report, fmt, units, output)
