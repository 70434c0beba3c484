"""``pipeins cost``: annual energy, cost and CO2; bare against insulated; economic thickness."""

from __future__ import annotations

import click

from .energy_options import basis_from_options, energy_options
from .field_options import fitting_options
from .options import emit, line_options, output_options, plot_option, spec_from_options


@click.command()
@line_options
@click.option("--valves", default=0, type=click.IntRange(min=0, max=1_000_000), help="Bare valves on the run (count).")
@click.option("--flanges", default=0, type=click.IntRange(min=0, max=1_000_000), help="Bare flange pairs on the run (count).")
@click.option("--strainers", default=0, type=click.IntRange(min=0, max=1_000_000), help="Bare strainers on the run (count).")
@click.option("--area", help="Area of a flat face (--face) to price, e.g. 12m2 or 130ft2 (bare numbers in m² or "
                              "ft² by --units); without it a face is priced per m².")
@click.option("--profile", help='Operating profile instead of --fluid-temp/--hours: "TEMP:HOURS,…", '
                                 'e.g. "82C:3000h,70C:2500h,55C:1500h".')
@fitting_options
@energy_options
@output_options
@plot_option
def cost(fmt, units, output, valves, flanges, strainers, area, profile, valve, flange, cover, **opts):
    """Annual energy, cost and CO2 of a line: bare against insulated, and the economic thickness.

    The line is solved bare (the pipe's own surface, no insulation) and with its --layer
    build-up; the difference over the run (--length, default 1 m; a vessel whole; a flat
    face over --area, default per m² of face) and the operating hours
    gives the energy saved, its cost and CO2, and with --cost-table the installed cost and
    simple payback.  Heat losses (heating, through --efficiency) and heat gains (cooling,
    through --cop, which a chilled line needs) are kept apart.  With no --layer the bare
    line alone is priced; --length 0 with --valves 1 prices a single bare fitting. With --cost-table the
    cost curve of the outer layer's material over the thicknesses the table lists is
    printed too (installed cost, present value of energy over --years at
    --discount-rate, and total), so the flat bottom of the curve is visible. Bare valves,
    flanges and strainers count as equivalent lengths of bare pipe. Fittings given as objects
    (--valve KIND:SIZE[:CLASS], --flange SIZE[:CLASS], with --cover MATERIAL:THICKNESS) are
    solved with their own film, as in check, and priced bare against covered apart from the pipe.

    \b
    Example:
      pipeins cost --pipe "NPS 4" --fluid-temp 82C --ambient-temp 15C --length 120m \\
          --layer "mineral wool:50mm" --hours 5000h --energy-price 0.09/kWh --efficiency 0.88 \\
          --co2-factor 0.20/kWh --cost-table examples/costs_demo.csv --currency EUR
    """
    from ..costing import cost_study
    from ..reports.charts import cost_charts
    from ..reports.cost import cost_report

    from ..errors import InputError
    from ..units import parse_quantity

    conditions = None
    if profile:
        if opts.get("fluid_temp") or opts.get("steam_pressure") or opts.get("hours"):
            raise InputError("--profile", "a profile replaces --fluid-temp, --steam-pressure and --hours")
        conditions = []
        for item in profile.split(","):
            temp, sep, hours = item.partition(":")
            if not sep:
                raise InputError("--profile", f'"{item.strip()}" needs TEMP:HOURS, e.g. 82C:3000h')
            conditions.append((parse_quantity(temp, "temperature", "--profile", units),
                               parse_quantity(hours, "time", "--profile", units) / 3600.0))
        opts = {**opts, "fluid_temp": f"{conditions[0][0]}C"}
    fittings_alone = bool(opts.get("length")) and parse_quantity(opts["length"], "length", "--length", units) == 0
    if fittings_alone:  # --length 0: the bare fittings priced alone
        opts = {**opts, "length": None}
    spec = spec_from_options(opts, units)
    if fittings_alone:
        from dataclasses import replace

        spec = replace(spec, length_m=0.0)
    basis = basis_from_options(opts, units, need_price=True)
    if fittings_alone and (valve or flange) and not (valves or flanges or strainers):
        report = _fittings_alone(spec, basis, conditions, dict(valve=valve, flange=flange, cover=cover), units)
        emit(report, fmt, units, output)
        return
    area_m2 = None
    if area:
        from ..inputs import parse_value

        area_m2 = parse_value("area_m2", area, units)
    study = cost_study(spec, basis, {"valve": valves, "flange": flanges, "strainer": strainers}, conditions,
                       area_m2)
    report = cost_report(study, units)
    if valve or flange or cover:
        _add_fittings(report, spec, basis, conditions, dict(valve=valve, flange=flange, cover=cover), units)
    report.charts = cost_charts(study)
    emit(report, fmt, units, output)


def _fittings_alone(spec, basis, conditions, field, units):
    """``--length 0`` with fittings as objects only: the fittings priced bare against covered."""
    from ..reports import Report
    from ..reports.cautions import cautions

    air = spec.build_surroundings().air_temp_c
    temps = [t for t, _ in conditions] if conditions else spec.fluid_temperature_c()
    report = Report("Fittings alone: bare against covered", [], {}, [],
                    cautions(temps, air, ["bare_metal"]), [])
    _add_fittings(report, spec, basis, conditions, field, units)
    report.csv_table = 1
    return report


def _add_fittings(report, spec, basis, conditions, field, units):
    """The fittings given as objects, bare against covered over the year (JSON ``fittings``,
    ``fittings_year``)."""
    from dataclasses import replace

    import numpy as np

    from ..annual import split_figures
    from ..fittings import solve_fittings
    from ..reports.field import fittings_cost_table, fittings_table
    from .field_options import parse_fittings

    fittings, cover = parse_fittings(field, units)
    weights = None
    if conditions:
        hours = np.array([h for _, h in conditions])
        spec = replace(spec, fluid_temp_c=np.array([t for t, _ in conditions]), steam_pressure_pa=None)
        basis = replace(basis, hours_per_year=hours)
        weights = hours / hours.sum()
    fits = solve_fittings(spec, fittings, cover, weights)

    def year(w):
        if w is None:
            return None
        fig = split_figures(np.sum(w, axis=0), basis, weights)
        return {k: ({d: (None if v is None else float(np.asarray(v))) for d, v in x.items()} if isinstance(x, dict)
                    else float(np.asarray(x))) for k, x in fig.items()}

    bare, covered = year(fits.bare_heat_flow_w), year(fits.covered_heat_flow_w)
    currency = basis.price.currency if basis.price is not None else ""
    report.tables += [fittings_table(fits, units), fittings_cost_table(fits, bare, covered, units, currency)]
    data = fits.to_dict()
    report.data["fittings"] = data["fittings"]
    report.data["fittings_totals"] = data["totals"]
    report.data["fittings_year"] = {"bare": bare, "covered": covered}
    for text in fits.warnings:
        if text not in report.warnings:
            report.warnings.append(text)
    report.data["warnings"] = report.warnings
