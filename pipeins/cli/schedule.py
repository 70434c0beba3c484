"""``pipeins schedule``: the insulation schedule of a whole project file."""

from __future__ import annotations

import click

from .options import Path, ascii_option

#: A progress bar appears only once a run has taken this long [s] (short runs stay silent).
PROGRESS_DELAY_S = 0.5


class ProgressBar:
    """A one-line progress bar on *stream* (``stage [#####.....]  50 %``), redrawn in place
    with a carriage return at most ten times a second, wiped by :meth:`close`.  Plain ASCII."""

    width = 30

    def __init__(self, stream, delay_s: float | None = None):
        import time

        self.stream, self.clock = stream, time.monotonic
        self.start = self.clock()
        self.delay_s = PROGRESS_DELAY_S if delay_s is None else delay_s
        self.last, self.shown = -1.0, 0

    def __call__(self, stage: str, done: int, total: int) -> None:
        now = self.clock()
        if now - self.start < self.delay_s or (now - self.last < 0.1 and done < total):
            return
        self.last = now
        fraction = min(max(done / total, 0.0), 1.0) if total else 1.0
        filled = round(self.width * fraction)
        text = f"{stage:<14} [{'#' * filled}{'.' * (self.width - filled)}] {100 * fraction:3.0f} %"
        self.stream.write("\r" + text.ljust(self.shown))
        self.stream.flush()
        self.shown = len(text)

    def close(self) -> None:
        if self.shown:
            self.stream.write("\r" + " " * self.shown + "\r")
            self.stream.flush()
            self.shown = 0


def progress_bar(quiet: bool):
    """A :class:`ProgressBar` on standard error when it is a terminal and not *quiet*; else
    None (piped or redirected output never gets one)."""
    import sys

    stream = sys.stderr
    if quiet or stream is None or not getattr(stream, "isatty", lambda: False)():
        return None
    return ProgressBar(stream)


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
@click.option("--quiet", "-q", is_flag=True,
              help="No progress bar (one appears on standard error for a long run, only when it is a terminal).")
@ascii_option
def schedule(project_file, fmt, units, output, quiet):
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
    bar = progress_bar(quiet)
    try:
        project = load_project(project_file, bar)  # a ProjectError carries every problem; main() prints each
        if units and units != project.units:   # the criteria's and codes' sentences in the units shown
            from dataclasses import replace

            project = replace(project, units=units)
        result = compute_schedule(project, bar)
        if bar is not None:
            bar("writing report", 0, 1)
        shown = units or project.units
        report = schedule_report(result, shown, line_data=fmt == "json")
        report.title_block = {"project": project.name, **project.report}
        from ..reports.charts import schedule_charts

        report.charts = schedule_charts(result)
        if fmt == "csv":
            write_csv_folder(report, shown, output)
            return
        if bar is not None:
            bar.close()  # wiped before the report reaches the terminal
        emit(report, fmt, shown, output)
    finally:
        if bar is not None:
            bar.close()
