"""``pipeins size``: the least thickness that meets each criterion, for one line."""

from __future__ import annotations

import click

from .options import emit, line_options, output_options, plot_option, spec_from_options
from .energy_options import basis_from_options, code_options, energy_options
from .sizing_options import parse_series, requirements_from_options, sizing_options


@click.command()
@line_options
@sizing_options
@code_options
@energy_options
@output_options
@plot_option
def size(fmt, units, output, material, series, code, code_table, **opts):
    """The least insulation thickness that meets each criterion, for one line.

    The layer given by --material is the outermost; any --layer options are fixed inner
    layers. Touch safety applies to lines hotter than the touch limit, condensation
    control to lines colder than the air (with --rh), and a heat-flow cap, a
    temperature change along the run or a freeze hold time when asked for. Prints, per
    criterion, the least thickness (to 0.01 mm) and the commercial pick from the series,
    the governing criterion, and the full check at the selected thickness.

    \b
    Example:
      pipeins size --pipe "NPS 6" --steam-pressure 10barg --ambient-temp 20C \\
          --material "mineral wool" --finish "aluminium, dull or aged" --max-heat-flow 90W/m
      pipeins size --pipe DN80 --fluid-temp 6C --ambient-temp 30C --rh 80 \\
          --material "flexible elastomeric foam" --format json
    """
    from ..errors import InputError
    from ..line import LineSpec
    from ..reports.charts import size_charts
    from ..reports.check import check_report
    from ..reports.sizing import CRITERION_OPTIONS, size_report
    from ..runs import run_extras
    from ..selection import select
    from ..units import material_in_si

    from ..inputs import Problems, collect

    items: list = []  # every problem of the command line at once
    spec = spec_from_options(opts, units, items)
    req = requirements_from_options(opts, units, items)
    basis = collect(items, "price", basis_from_options, opts, units)
    if items:
        raise Problems(items)
    economic = basis if basis is not None and basis.cost_table is not None else None
    material = material_in_si(material, units, "--material")
    selection = select(spec, material, req, parse_series(series, units), units, code=code, economic=economic,
                       code_paths=code_table)
    out = selection.outcome
    if not out.feasible[0]:
        failed = [c for c in out.criteria if not c.feasible[0]]
        option = CRITERION_OPTIONS.get(failed[0].key if failed else "", "--series")
        message = failed[0].messages[0] if failed else out.messages[0][0]
        raise InputError(option, message)
    at = LineSpec(**{**spec.__dict__, "layers": spec.layers + selection.added_layers(0),
                     "touch_limit_c": selection.problem.touch_limit_c or spec.touch_limit_c})
    result = at.solve()
    if at.section_kind != "pipe":
        from ..reports.section import section_report
        from ..sections import section_extras

        rows, data, warnings = section_extras(at, result, units)
        check = section_report(at, result, units, rows, data, warnings)
        check.title = "Check at the selected thickness"
    else:
        rows, data, warnings = run_extras(at, result, units)
        check = check_report(at, result, units, rows, data, warnings,
                             title="Check at the selected thickness")
    report = size_report(selection, check, units)
    report.charts = size_charts(selection, result)
    emit(report, fmt, units, output)
