"""Reports: tables of SI values that know their units, rendered in one place.

A :class:`Report` is a title, some :class:`Table` s, warnings and cautions, and the
JSON payload (always SI).  :func:`render` turns it into text, Markdown, CSV, JSON, a
self-contained HTML page (:mod:`pipeins.reports.html`) or an XLSX workbook
(:mod:`pipeins.reports.xlsx`, bytes) in the chosen unit system; every command prints
through it, so an unknown format is refused in one place.
"""

from __future__ import annotations

import csv
import io
import json
import math
from dataclasses import dataclass, field
from typing import Any

from ..errors import InputError

__all__ = ["Column", "Table", "Report", "render", "FORMATS", "BINARY_FORMATS"]

FORMATS = ("text", "json", "csv", "markdown", "html", "xlsx")
#: Formats that are bytes, not text (written to a file only).
BINARY_FORMATS = ("xlsx",)


@dataclass(frozen=True)
class Column:
    """A column: its heading, the quantity kind of its values (see :mod:`pipeins.units`;
    ``None`` for text) and the decimal places shown (default: the kind's)."""

    heading: str
    kind: str | None = None
    digits: int | None = None

    def label(self, units: str) -> str:
        if self.kind is None:
            return self.heading
        from ..units import unit_label

        return f"{self.heading} [{unit_label(self.kind, units)}]"

    def cell(self, value, units: str) -> str:
        if value is None or (isinstance(value, float) and math.isnan(value)):
            return "–"
        if self.kind is None:
            return str(value)
        from ..units import format_quantity, unit_label

        text = format_quantity(float(value), self.kind, units, self.digits)
        label = unit_label(self.kind, units)
        return text[: -len(label)].strip() if text.endswith(label) else text


@dataclass
class Table:
    title: str
    columns: list[Column]
    rows: list[list[Any]]
    note: str = ""


@dataclass
class Report:
    title: str
    tables: list[Table]
    data: dict
    warnings: list[str] = field(default_factory=list)
    cautions: list[str] = field(default_factory=list)
    footer: list[str] = field(default_factory=list)
    csv_table: int = 0  # which table CSV output carries
    # Drawn by the HTML report and --plot only (pipeins.reports.charts.Chart; data computed lazily).
    charts: list = field(default_factory=list)
    # Title block of the HTML and XLSX reports: keys of pipeins.reports.html.TITLE_BLOCK_KEYS.
    title_block: dict = field(default_factory=dict)


def _cells(table: Table, units: str) -> tuple[list[str], list[list[str]]]:
    heads = [c.label(units) for c in table.columns]
    rows = [[c.cell(v, units) for c, v in zip(table.columns, row)] for row in table.rows]
    return heads, rows


def _text(report: Report, units: str, markdown: bool) -> str:
    from tabulate import tabulate

    out = io.StringIO()
    if markdown:
        out.write(f"# {report.title}\n")
    else:
        out.write(f"{report.title}\n{'═' * len(report.title)}\n")
    for table in report.tables:
        heads, rows = _cells(table, units)
        if markdown:
            out.write(f"\n## {table.title}\n\n")
            out.write(tabulate(rows, heads, tablefmt="pipe", disable_numparse=True))
        else:
            out.write(f"\n{table.title}\n{'─' * len(table.title)}\n")
            out.write(tabulate(rows, heads, tablefmt="simple", disable_numparse=True))
        out.write("\n")
        if table.note:
            out.write(f"{table.note}\n")
    for heading, lines in (("Warnings", report.warnings), ("Cautions", report.cautions),
                           ("Basis", report.footer)):
        if lines:
            out.write(f"\n## {heading}\n\n" if markdown else f"\n{heading}\n{'─' * len(heading)}\n")
            for line in lines:
                out.write(f"- {line}\n" if markdown else f"  • {line}\n")
    return out.getvalue()


def _csv(report: Report, units: str) -> str:
    table = report.tables[report.csv_table]
    heads, rows = _cells(table, units)
    out = io.StringIO()
    writer = csv.writer(out, lineterminator="\n")
    writer.writerow(heads)
    writer.writerows(rows)
    return out.getvalue()


def render(report: Report, fmt: str = "text", units: str = "si") -> str | bytes:
    """The report as text, Markdown, CSV (its main table), JSON (SI, whatever *units*),
    HTML (text) or XLSX (bytes)."""
    if fmt == "json":
        payload = dict(report.data)
        payload.setdefault("warnings", report.warnings)
        payload.setdefault("cautions", report.cautions)
        return json.dumps(payload, indent=2, ensure_ascii=False, allow_nan=False) + "\n"
    if fmt == "csv":
        return _csv(report, units)
    if fmt in ("text", "markdown"):
        return _text(report, units, markdown=fmt == "markdown")
    if fmt == "html":
        from .html import render_html

        return render_html(report, units)
    if fmt == "xlsx":
        from .xlsx import render_xlsx

        return render_xlsx(report, units)
    raise InputError("--format", f'unknown format "{fmt}"; use {", ".join(FORMATS)}')
