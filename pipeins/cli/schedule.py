"""``pipeins schedule``: the insulation schedule of a whole project file."""

from __future__ import annotations

import os
import shutil
import tempfile

import click


def write_csv_folder(report, units: str, folder: str) -> None:
    """Write each table of *report* as its own CSV file into *folder*: all of them, or none
    (written into a temporary folder beside it, then moved into place)."""
    import csv

    from ..errors import InputError
    from ..reports import _cells
    from ..reports.schedule import CSV_NAMES

    target = os.path.abspath(folder)
    if os.path.exists(target) and not os.path.isdir(target):
        raise InputError("--output", f'"{folder}" is a file; give a folder for the CSV files')
    parent = os.path.dirname(target) or "."
    if not os.path.isdir(parent):
        raise InputError("--output", f'the folder "{parent}" does not exist')
    tmp = tempfile.mkdtemp(dir=parent, prefix=".pipeins-")
    try:
        for name, table in zip(CSV_NAMES, report.tables):
            heads, rows = _cells(table, units)
            with open(os.path.join(tmp, name), "w", encoding="utf-8", newline="") as fh:
                writer = csv.writer(fh, lineterminator="\n")
                writer.writerow(heads)
                writer.writerows(rows)
        if not os.path.exists(target):
            os.replace(tmp, target)
            tmp = None
        else:
            for name in CSV_NAMES[: len(report.tables)]:
                os.replace(os.path.join(tmp, name), os.path.join(target, name))
    finally:
        if tmp is not None and os.path.isdir(tmp):
            shutil.rmtree(tmp, ignore_errors=True)


@click.command()
@click.argument("project_file", metavar="PROJECT.toml", type=click.Path(dir_okay=False))
@click.option("--format", "fmt", default="text", show_default=True,
              help="Output format: text, markdown, json (one document) or csv (one file per table, needs --output).")
@click.option("--units", type=click.Choice(["si", "us"]), default=None,
              help="Units shown (default: the project's unit system).")
@click.option("--output", "-o", type=click.Path(),
              help="Write to this file (text, markdown, json) or into this folder (csv); whole or not at all.")
def schedule(project_file, fmt, units, output):
    """The insulation schedule of a whole project file.

    Reads the project (services, locations, lines), sizes every size of every service
    for the criteria it lists (energy-code minimum, touch safety, condensation,
    heat-flow cap, temperature change, freezing, lifetime cost) and prints the schedule
    per service and size band, the heat flow of every line (bare fittings counted as
    bare pipe), and the totals bare against insulated: heat, energy, cost, CO2, installed
    cost and payback.  Every problem in the file is reported at once, with its line.

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
    report = schedule_report(result, shown)
    if fmt == "csv":
        write_csv_folder(report, shown, output)
        return
    emit(report, fmt, shown, output)
