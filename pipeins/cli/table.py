"""``pipeins table``: the thickness table per pipe size for one service."""

from __future__ import annotations

import click

from .options import emit, line_options, output_options, plot_option, spec_from_options
from .energy_options import basis_from_options, code_options, energy_options
from .sizing_options import parse_series, requirements_from_options, sizing_options
from .condition_options import condition_option


@click.command()
@click.option("--sizes",
              help='Size range or list: "NPS 1/2..NPS 12", DN15..DN300, "copper L 1/2..4", "NPS 1, NPS 2".')
@click.option("--ducts",
              help='Duct sizes instead of pipes: "300x200mm, 600x400mm", round (the catalogue diameters) '
                   'or round:200..800mm.')
@click.option("--matrix", type=click.Choice(["heat-flow", "surface-temp"]),
              help="Instead: this quantity for every size at every thickness of the series.")
@line_options
@condition_option
@sizing_options
@code_options
@energy_options
@output_options
@plot_option
def table(fmt, units, output, sizes, ducts, matrix, material, series, code, code_table, **opts):
    """Thickness table per pipe size for one service.

    One row per size: the outside diameter, the least thickness each active criterion
    needs, the selected commercial thickness, the governing criterion, and the heat flow
    and surface temperature at that thickness. With --matrix, the heat flow per metre (or
    the surface temperature) of every size at every thickness of the series instead, as
    handbooks print it. Every table ends with the design conditions and the cautions.
    With two or more --condition options (as on `pipeins size`), each size is sized under
    every condition and a condition column names the one that governs it.

    \b
    Example:
      pipeins table --sizes "NPS 1/2..NPS 12" --fluid-temp 82C --ambient-temp 20C \\
          --material "mineral wool" --max-heat-flow 25W/m --units us
      pipeins table --sizes DN15..DN300 --fluid-temp 7C --ambient-temp 30C --rh 75 \\
          --material "flexible elastomeric foam" --matrix surface-temp --format csv
    """
    from ..catalog.pipes import pipe_range
    from ..errors import InputError
    from ..reports.charts import table_charts
    from ..criteria.registry import error_option
    from ..reports.sizing import matrix_report, table_report
    from ..selection import select
    from ..units import material_in_si

    if opts.get("pipe") or opts.get("od") or opts.get("wall"):
        raise InputError("--sizes", "a table takes its pipes from --sizes, not --pipe/--od/--wall")
    if opts.get("duct"):
        raise InputError("--ducts", "a table takes its ducts from --ducts, not --duct")
    if (sizes is None) == (ducts is None):
        raise InputError("--sizes", "give the pipe sizes (--sizes) or the duct sizes (--ducts), one of them")
    if ducts is not None:
        from ..line import LineSpec
        from ..sections import duct_table_sizes

        texts = duct_table_sizes(ducts, units)
        size_list = [LineSpec(duct=t).section_size() for t in texts]
        opts = {**opts, "duct": texts[0]}
    else:
        size_list = pipe_range(sizes, opts.get("schedule"))
        opts = {**opts, "pipe": size_list[0].label}
    from ..inputs import Problems, collect

    from .condition_options import parse_conditions

    conditions = parse_conditions(opts.pop("condition", ()))
    if conditions and matrix:
        raise InputError("--matrix", "a matrix is of one condition; drop --condition or --matrix")
    items: list = []  # every problem of the command line at once
    spec = spec_from_options(opts, units, items)
    req = requirements_from_options(opts, units, items)
    basis = collect(items, "price", basis_from_options, opts, units)
    under = None
    if conditions:
        from .condition_options import conditions_from_options

        start = len(items)
        under = conditions_from_options(conditions, opts, units, items)
        under = under if len(items) == start else None
    if items:
        raise Problems(items)
    economic = basis if basis is not None and basis.cost_table is not None else None
    material = material_in_si(material, units, "--material")
    combined = None
    if under is not None:
        from .condition_options import select_under_conditions

        combined, selection = select_under_conditions(under, material, req, parse_series(series, units), units,
                                                      code, economic, code_table, sizes=size_list)
    else:
        selection = select(spec, material, req, parse_series(series, units), units, sizes=size_list, code=code,
                           economic=economic, code_paths=code_table)
    if matrix:
        report = matrix_report(selection, matrix.replace("-", "_"), units)
    else:
        out = selection.outcome
        if not out.feasible.any():
            failed = next((c for c in out.criteria if not c.feasible.any()), None)
            if failed is not None:
                raise InputError(error_option(failed.key),
                                 f"{failed.messages[-1]} (largest size {selection.sizes[-1].label}); no size can meet it")
        report = table_report(selection, units)
        if combined is not None:
            from ..reports.conditions import add_table_conditions

            add_table_conditions(report, combined, [c for c, _ in under], units)
    report.charts = table_charts(selection, report)
    emit(report, fmt, units, output)
