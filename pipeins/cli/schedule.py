"""``pipeins schedule``: the insulation schedule of a whole project file."""

from __future__ import annotations

import click

from .options import Path, ascii_option


def write_csv_folder(report, units: str, folder: str) -> None:
    """Write each table of *report* as its own CSV file into *folder*, swapped in whole
    (see :func:`pipeins.fileio.write_folder`); each file carries the basis and cautions as
    comment lines (:func:`pipeins.reports.table_csv`)."""
    from ..fileio import write_folder
    from ..reports import table_csv
    from ..reports.schedule import csv_files

    files = {name: table_csv(report, table, units) for name, table in csv_files(report)}
    write_folder(folder, files, "--output")


@click.command()
@click.argument("project_file", metavar="PROJECT.toml", type=Path(dir_okay=False))
@click.option("--format", "fmt", default="text", show_default=True,
              help="Output format: text, markdown, json (one document), html (one self-contained page), "
                   "xlsx (one workbook, needs --output) or csv (one file per table, needs --output).")
@click.option("--units", type=click.Choice(["si", "us"]), default=None,
              help="Units shown (default: the project's unit system).")
@click.option("--output", "-o", type=Path(),
              help="Write to this file (text, markdown, json) or into this folder (csv); whole or not at all.")
@ascii_option
def schedule(project_file, fmt, units, output):
    """The insulation schedule of a whole project file.

    Reads the project (services, locations, lines), sizes every size of every service
    for the criteria it lists (energy-code minimum, touch safety, condensation,
    heat-flow cap, temperature change, freezing, lifetime cost) and prints the schedule
    per service and size band, the heat flow of every line (bare fittings counted as
    bare pipe), and the totals bare against insulated: heat, energy, cost, CO2, installed
    cost and payback.  Every problem in the file is reported at once, with its line.

    Every project-file key, with its unit and default: docs/project-file.md.

    \b
    Example:
      pipeins schedule examples/hospital_steam.toml
      pipeins schedule examples/district_heating_plant.toml --format csv --output schedule_csv
    """
    from ..errors import InputError
    from ..project import load_project
    from ..reports import FORMATS
    from ..reports.schedule import schedule_report
    from ..schedule import compute_schedule
    from .options import emit

    if fmt not in FORMATS:
        raise InputError("--format", f'unknown format "{fmt}"; use {", ".join(FORMATS)}')
    if fmt == "csv" and not output:
        raise InputError("--output", "csv writes one file per table: give --output FOLDER")
    project = load_project(project_file)  # a ProjectError carries every problem; main() prints each
    result = compute_schedule(project)
    shown = units or project.units
    report = schedule_report(result, shown, line_data=fmt == "json")
    report.title_block = {"project": project.name, **project.report}
    from ..reports.charts import schedule_charts

    report.charts = schedule_charts(result)
    if fmt == "csv":
        write_csv_folder(report, shown, output)
        return
    emit(report, fmt, shown, output)
