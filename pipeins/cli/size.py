"""``pipeins size``: the least thickness that meets each criterion, for one line."""

from __future__ import annotations

import click

from .options import emit, line_options, output_options, plot_option, spec_from_options
from .energy_options import basis_from_options, code_options, energy_options
from .sizing_options import parse_series, requirements_from_options, sizing_options
from .condition_options import condition_option


@click.command()
@line_options
@condition_option
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

    With two or more --condition options, each criterion is checked under the conditions
    it belongs to (condensation where the condition gives an RH, freeze protection where
    its air is below 0 °C, the others everywhere, or the condition's own criteria=...),
    the thickest pick governs, and the report names the governing condition and
    criterion; the check is under the governing condition.

    \b
    Example:
      pipeins size --pipe "NPS 6" --steam-pressure 10barg --ambient-temp 20C \\
          --material "mineral wool" --finish "aluminium, dull or aged" --max-heat-flow 90W/m
      pipeins size --pipe DN80 --fluid-temp 6C --ambient-temp 30C --rh 80 \\
          --material "flexible elastomeric foam" --format json
      pipeins size --pipe DN100 --fluid-temp 5C --material "flexible elastomeric foam" \\
          --condition "summer: ambient-temp=32C, rh=80" \\
          --condition "winter: ambient-temp=-15C, wind=8m/s" --hold-time 6h
    """
    from ..errors import InputError
    from ..reports.charts import size_charts
    from ..criteria.registry import error_option
    from ..reports.sizing import size_report
    from ..selection import select
    from ..units import material_in_si

    from ..inputs import Problems, collect

    from .condition_options import parse_conditions

    conditions = parse_conditions(opts.pop("condition", ()))
    items: list = []  # every problem of the command line at once
    spec = spec_from_options(opts, units, items)
    req = requirements_from_options(opts, units, items)
    basis = collect(items, "price", basis_from_options, opts, units)
    under = _conditions(conditions, opts, units, items) if conditions else None
    if items:
        raise Problems(items)
    economic = basis if basis is not None and basis.cost_table is not None else None
    material = material_in_si(material, units, "--material")
    if under is not None:
        return _size_over_conditions(under, material, req, parse_series(series, units), units, code, economic,
                                     code_table, fmt, output)
    selection = select(spec, material, req, parse_series(series, units), units, code=code, economic=economic,
                       code_paths=code_table)
    out = selection.outcome
    if not out.feasible[0]:
        failed = [c for c in out.criteria if not c.feasible[0]]
        option = error_option(failed[0].key if failed else "")
        message = failed[0].messages[0] if failed else out.messages[0][0]
        raise InputError(option, message)
    result, check = _check_at(spec, selection, units)
    report = size_report(selection, check, units)
    report.charts = size_charts(selection, result)
    emit(report, fmt, units, output)


def _check_at(spec, selection, units):
    """The line (or section) *spec* re-solved with the layers *selection* added, and its check
    report titled as the check at the selected thickness."""
    from ..line import LineSpec

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
        from ..reports.check import check_report
        from ..reports.extras import run_extras

        rows, data, warnings = run_extras(at, result, units)
        check = check_report(at, result, units, rows, data, warnings, title="Check at the selected thickness")
    return result, check


def _conditions(parsed, opts, units, items):
    """The conditions of ``--condition`` as (condition, spec) pairs, or None when some are bad."""
    from .condition_options import conditions_from_options

    start = len(items)
    out = conditions_from_options(parsed, opts, units, items)
    return out if len(items) == start else None


def _size_over_conditions(under, material, req, series, units, code, economic, code_table, fmt, output):
    """``size`` with ``--condition``: :func:`pipeins.design_conditions.select_over_conditions`
    over the given conditions, the report built from the governing condition's selection."""
    from ..errors import InputError
    from ..reports.charts import size_charts
    from ..reports.conditions import add_size_conditions
    from ..criteria.registry import error_option
    from ..reports.sizing import size_report
    from .condition_options import select_under_conditions

    conds = [c for c, _ in under]
    combined, selection = select_under_conditions(under, material, req, series, units, code, economic, code_table)
    out = combined.outcome
    if not out.feasible[0]:
        for name, sel in combined.selections.items():
            failed = [c for c in sel.outcome.criteria if not c.feasible[0]]
            if failed or not sel.outcome.feasible[0]:
                option = error_option(failed[0].key if failed else "")
                message = failed[0].messages[0] if failed else sel.outcome.messages[0][0]
                raise InputError(option, f'under "{name}": {message}')
    spec = next(s for c, s in under if c.name == combined.governing_condition[0])
    result, check = _check_at(spec, selection, units)
    report = size_report(selection, check, units)
    add_size_conditions(report, combined, conds, units)
    report.charts = size_charts(selection, result)
    emit(report, fmt, units, output)
