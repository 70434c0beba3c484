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
from collections.abc import Sequence
from dataclasses import dataclass, field
from typing import Any

from ..errors import InputError

__all__ = ["Column", "Table", "Report", "render", "to_ascii", "table_csv", "tables_csv", "csv_comments", "FORMATS",
           "BINARY_FORMATS"]

FORMATS = ("text", "json", "csv", "markdown", "html", "xlsx")
#: Formats that are bytes, not text (written to a file only).
BINARY_FORMATS = ("xlsx",)


@dataclass(frozen=True)
class Column:
    """A column: its heading, the quantity kind of its values (see :mod:`pipeins.units`;
    ``None`` for text or for plain numbers) and the decimal places shown (default: the
    kind's).

    A column of plain numbers already in their display unit (money, kW, t, years) has no
    kind, ``digits`` set and its ``unit`` (a currency, ``kW``): the unit goes in the
    heading, the cell holds the number alone.  ``grouped`` puts thousands separators in
    text output (never in CSV).  In CSV a missing value is an empty cell."""

    heading: str
    kind: str | None = None
    digits: int | None = None
    unit: str | None = None
    grouped: bool = False

    def label(self, units: str) -> str:
        if self.kind is None:
            return f"{self.heading} [{self.unit}]" if self.unit else self.heading
        from ..units import unit_label

        return f"{self.heading} [{unit_label(self.kind, units)}]"

    @property
    def numeric(self) -> bool:
        """Whether the column holds numbers (a kind, or plain numbers with digits)."""
        return self.kind is not None or self.digits is not None

    def cell(self, value, units: str, csv: bool = False) -> str:
        if value is None or (isinstance(value, float) and math.isnan(value)):
            return "" if csv else "–"
        if self.kind is None:
            if self.digits is None or isinstance(value, str):
                return str(value)
            x = float(value)
            if not math.isfinite(x):
                return "" if csv else "never"
            text = f"{x:{',' if self.grouped and not csv else ''}.{self.digits}f}"
            return text[1:] if text.startswith("-") and float(text.replace(",", "")) == 0.0 else text
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
    csv_table: int | str = 0  # which table CSV output carries; "all": every table, in blocks (tables_csv)
    #: The structured notes (:class:`pipeins.notes.Note`) behind some of :attr:`warnings`; JSON
    #: lists every warning as a note object (:func:`pipeins.reports.notes.report_notes`).
    notes: list = field(default_factory=list)
    # Drawn by the HTML report and --plot only (pipeins.reports.charts.Chart; data computed lazily).
    charts: list = field(default_factory=list)
    # Title block of the HTML and XLSX reports: keys of pipeins.reports.html.TITLE_BLOCK_KEYS.
    title_block: dict = field(default_factory=dict)


def _column_cells(column: Column, values: list, units: str, csv: bool) -> list[str]:
    """``[column.cell(v, units, csv) for v in values]``, with the quantities of a kind
    formatted in one :func:`~pipeins.units.format_quantity` call over the column (the
    same text: it formats an array value by value exactly as it formats each alone)."""
    if column.kind is None or len(values) < 8:
        return [column.cell(v, units, csv) for v in values]
    shown = [i for i, v in enumerate(values)
             if not (v is None or (isinstance(v, float) and math.isnan(v)))]
    if not all(isinstance(values[i], (int, float)) for i in shown):
        return [column.cell(v, units, csv) for v in values]
    from ..units import format_quantity, unit_label

    out = ["" if csv else "–"] * len(values)
    label = unit_label(column.kind, units)
    texts = format_quantity([float(values[i]) for i in shown], column.kind, units, column.digits) if shown else []
    for i, text in zip(shown, texts):
        out[i] = text[: -len(label)].strip() if text.endswith(label) else text
    return out


def _cells(table: Table, units: str, csv: bool = False) -> tuple[list[str], list[list[str]]]:
    heads = [c.label(units) for c in table.columns]
    if not table.rows or any(len(row) != len(table.columns) for row in table.rows):
        return heads, [[c.cell(v, units, csv) for c, v in zip(table.columns, row)] for row in table.rows]
    columns = [_column_cells(c, list(values), units, csv) for c, values in zip(table.columns, zip(*table.rows))]
    return heads, [list(row) for row in zip(*columns)]


#: Characters one column wide in a terminal (and to ``wcwidth``, which tabulate measures
#: with): printable ASCII, Latin-1 letters and signs, Greek, and the punctuation, arrows,
#: sub/superscripts and maths signs reports use (tests/test_report_text.py checks each).
_NARROW = frozenset(
    [chr(c) for c in range(0x20, 0x7F)] + [chr(c) for c in range(0xA1, 0x100) if c != 0xAD]
    + [chr(c) for c in range(0x391, 0x3CA) if c != 0x3A2]
    + list("‐‑‒–—―‘’‚“”„†‡•…‰′″‹›⁄€₀₁₂₃₄₅₆₇₈₉⁰ⁱ⁴⁵⁶⁷⁸⁹⁺⁻℃℉Ω←↑→↓↔≈≠≤≥−∓∙√∞∆∑⋅×÷")
)


def _widths(heads: list[str], rows: list[list[str]]):
    """(stripped columns, widths) of a table in the simple case tabulate's formats agree on
    (every column left aligned, as wide as its widest cell and at least its heading plus
    two); None out of it (no rows, a line break, a character not in :data:`_NARROW`)."""
    if not rows or not heads or any(len(row) != len(heads) for row in rows):
        return None
    columns = [[c.strip() for c in column] for column in zip(*rows)]
    text = "".join(heads) + "".join("".join(column) for column in columns)
    if not (text.isascii() and text.isprintable()) and not set(text) <= _NARROW:
        return None
    return columns, [max(len(h) + 2, max(map(len, column))) for h, column in zip(heads, columns)]


def _plain_table(heads: list[str], rows: list[list[str]]) -> list[str] | None:
    """The table as ``tabulate(rows, heads, tablefmt="simple", disable_numparse=True)``
    writes it, character for character, without importing tabulate: every column left
    aligned, cells stripped, as wide as its widest cell and at least its heading plus two,
    columns two spaces apart, a rule of dashes under the headings, trailing spaces cut.
    Returns its lines (without line ends); None when a cell is out of that simple case (no
    rows, a line break, a character not in :data:`_NARROW`): the caller uses tabulate then."""
    found = _widths(heads, rows)
    if found is None:
        return None
    columns, widths = found
    lines = ["  ".join(h.ljust(w) for h, w in zip(heads, widths)).rstrip(),
             "  ".join("-" * w for w in widths).rstrip()]
    lines += ["  ".join([c.ljust(w) for c, w in zip(row, widths)]).rstrip() for row in zip(*columns)]
    return lines


def _pipe_table(heads: list[str], rows: list[list[str]]) -> list[str] | None:
    """The table as ``tabulate(rows, heads, tablefmt="pipe", disable_numparse=True)`` writes
    it (Markdown), character for character, in the simple case of :func:`_plain_table`:
    ``| cell |`` with the cells padded to the column's width, a ``|:---|`` rule (left
    aligned) under the headings.  None out of that case: the caller uses tabulate then."""
    found = _widths(heads, rows)
    if found is None:
        return None
    columns, widths = found
    lines = ["| " + " | ".join(h.ljust(w) for h, w in zip(heads, widths)) + " |",
             "|" + "|".join(":" + "-" * (w + 1) for w in widths) + "|"]
    lines += ["| " + " | ".join([c.ljust(w) for c, w in zip(row, widths)]) + " |" for row in zip(*columns)]
    return lines


# Plain-ASCII spellings for a console that cannot show Unicode (and for --ascii).
_ASCII = {
    "═": "=", "─": "-", "•": "*", "°": "deg", "²": "2", "³": "3", "·": "*", "⋅": "*", "–": "-",
    "—": "--", "…": "...", "≤": "<=", "≥": ">=", "−": "-", "×": "x", "µ": "u", "±": "+/-", "’": "'",
    "‘": "'", "“": '"', "”": '"', "→": "->", "←": "<-", "≈": "~", "₂": "2", "Δ": "d", "ε": "e",
    "℃": "degC", "℉": "degF", "€": "EUR", "£": "GBP", "¥": "JPY", "\u00a0": " ", "\u202f": " ",
}


def to_ascii(text: str) -> str:
    """*text* in plain ASCII: rules and bullets as ``=``, ``-``, ``*``, unit signs spelt out
    (``°C`` → ``degC``, ``m²`` → ``m2``), accents dropped, anything else ``?``.

    >>> to_ascii("60 °C · W/(m²·K) – ≤ 5 %")
    '60 degC * W/(m2*K) - <= 5 %'
    """
    import unicodedata

    out = []
    for ch in str(text):
        if ord(ch) < 128:
            out.append(ch)
        elif ch in _ASCII:
            out.append(_ASCII[ch])
        else:
            plain = unicodedata.normalize("NFKD", ch).encode("ascii", "ignore").decode()
            out.append(plain or "?")
    return "".join(out)


def _text(report: Report, units: str, markdown: bool, ascii: bool = False) -> str:
    from ..bulk import paused_gc

    with paused_gc():
        return _text_of(report, units, markdown, ascii)


def _text_of(report: Report, units: str, markdown: bool, ascii: bool) -> str:
    a = to_ascii if ascii else str
    double, single, bullet = ("=", "-", "*") if ascii else ("═", "─", "•")
    out = io.StringIO()
    title = a(report.title)
    if markdown:
        out.write(f"# {title}\n")
    else:
        out.write(f"{title}\n{double * len(title)}\n")
    for table in report.tables:
        heads, rows = _cells(table, units)
        if ascii:
            heads, rows = [a(h) for h in heads], [[a(c) for c in row] for row in rows]
        name = a(table.title)
        if markdown:
            out.write(f"\n## {name}\n\n")
            piped = _pipe_table(heads, rows)
            if piped is None:
                from tabulate import tabulate

                out.write(tabulate(rows, heads, tablefmt="pipe", disable_numparse=True))
            else:
                out.write("\n".join(piped))
        else:
            out.write(f"\n{name}\n{single * len(name)}\n")
            plain = _plain_table(heads, rows)
            if plain is None:
                from tabulate import tabulate

                out.write(tabulate(rows, heads, tablefmt="simple", disable_numparse=True))
            else:
                out.write("\n".join(plain))
        out.write("\n")
        if table.note:
            out.write(f"{a(table.note)}\n")
    for heading, lines in (("Warnings", report.warnings), ("Cautions", report.cautions),
                           ("Basis", report.footer)):
        if lines:
            out.write(f"\n## {heading}\n\n" if markdown else f"\n{heading}\n{single * len(heading)}\n")
            for line in lines:
                out.write(f"- {a(line)}\n" if markdown else f"  {bullet} {a(line)}\n")
    return out.getvalue()


def csv_comments(report: Report, table: Table | None = None) -> list[str]:
    """The ``# `` comment lines a CSV file starts with: the report and table titles, the
    table's note, the basis, warnings and cautions (spreadsheet and CSV readers given
    ``comment="#"`` skip them; pipeins' own readers do).  None for a plain listing (no
    basis, warnings or cautions)."""
    if not (report.footer or report.warnings or report.cautions):
        return []
    lines = [report.title]
    if table is not None:
        lines.append(f"table: {table.title}")
        if table.note:
            lines.append(f"note: {table.note}")
    lines += [f"basis: {x}" for x in report.footer]
    lines += [f"warning: {x}" for x in report.warnings]
    lines += [f"caution: {x}" for x in report.cautions]
    return ["# " + " ".join(str(x).split()) for x in lines]


def table_csv(report: Report, table: Table, units: str, ascii: bool = False) -> str:
    """One table as CSV text: comment lines (:func:`csv_comments`), the header with units
    and currency, then rows of plain numbers (no separators, no units; empty when not
    applicable).  With *ascii* every character is plain ASCII (:func:`to_ascii`)."""
    heads, rows = _cells(table, units, csv=True)
    comments = csv_comments(_settled(report, units), table)
    if ascii:
        heads, rows = [to_ascii(h) for h in heads], [[to_ascii(c) for c in row] for row in rows]
        comments = [to_ascii(c) for c in comments]
    out = io.StringIO()
    for line in comments:
        out.write(line + "\n")
    writer = csv.writer(out, lineterminator="\n")
    writer.writerow(heads)
    writer.writerows(rows)
    return out.getvalue()


def tables_csv(report: Report, units: str, ascii: bool = False) -> str:
    """Every table of *report* as CSV blocks: the report's comment lines once (title, basis,
    warnings, cautions: :func:`csv_comments`), then per table a ``# table: TITLE`` line (and
    its ``# note: …``), its header with units and its rows, a blank line between blocks.  Each
    block is what :func:`table_csv` writes for that table (the schedule's one file per table),
    so a reader splits on the ``# table:`` lines."""
    out = io.StringIO()
    head = csv_comments(_settled(report, units)) or ["# " + " ".join(str(report.title).split())]
    for line in head:
        out.write((to_ascii(line) if ascii else line) + "\n")
    for table in report.tables:
        heads, rows = _cells(table, units, csv=True)
        lines = ["# table: " + " ".join(table.title.split())]
        if table.note:
            lines.append("# note: " + " ".join(table.note.split()))
        if ascii:
            heads, rows = [to_ascii(h) for h in heads], [[to_ascii(c) for c in row] for row in rows]
            lines = [to_ascii(x) for x in lines]
        out.write("\n")
        for line in lines:
            out.write(line + "\n")
        writer = csv.writer(out, lineterminator="\n")
        writer.writerow(heads)
        writer.writerows(rows)
    return out.getvalue()


def _csv(report: Report, units: str, ascii: bool = False) -> str:
    if report.csv_table == "all":
        return tables_csv(report, units, ascii)
    return table_csv(report, report.tables[report.csv_table], units, ascii)


def _settled(report: Report, units: str) -> Report:
    """*report* with its warnings and cautions written: a structured note
    (:class:`pipeins.notes.Note`) among them becomes its sentence in *units*
    (:mod:`pipeins.reports.notes`) and joins :attr:`Report.notes`."""
    from ..notes import Note

    items = list(report.warnings) + list(report.cautions)
    if not any(isinstance(x, Note) for x in items):
        return report
    from dataclasses import replace

    from .notes import notes_of, render as write_note

    def written(lines):
        return [write_note(x, units) if isinstance(x, Note) else x for x in lines]

    return replace(report, warnings=written(report.warnings), cautions=written(report.cautions),
                   notes=notes_of(list(report.notes) + list(report.warnings)))


#: A list longer than this is written one item per line (see :func:`json_text`).
_LONG_LIST = 50


def json_text(obj, ascii: bool = False, default=None) -> str:
    """*obj* as JSON, indented by two spaces, with each item of a long list (a schedule's
    lines) on one line of its own.

    ``json.dumps`` with an indent runs Python's own encoder, which takes a 100,000-line
    schedule's JSON some ten seconds and a gigabyte; a long list's items are written
    here by the compiled encoder, one per line (``", "`` and ``": "`` between them), and the
    pieces joined once, so the document stays readable and parses to the same values."""
    return "".join(_json_pieces(obj, ascii, default, 0))


def _is_list(obj) -> bool:
    return isinstance(obj, list) or (isinstance(obj, Sequence) and not isinstance(obj, (str, bytes, bytearray)))


def _json_pieces(obj, ascii, default, level, encoder=None):
    if encoder is None:  # one compiled encoder for every item of a long list
        encoder = json.JSONEncoder(ensure_ascii=ascii, allow_nan=False, default=default,
                                   separators=(", ", ": ")).encode
    pad, inner = "  " * level, "  " * (level + 1)
    if _is_list(obj) and len(obj) > _LONG_LIST:
        yield "[\n"
        last = len(obj) - 1
        for i, x in enumerate(obj):
            yield inner + encoder(x) + (",\n" if i < last else "\n")
        yield pad + "]"
    elif isinstance(obj, dict) and obj and any(isinstance(v, dict) or _is_list(v) for v in obj.values()):
        yield "{\n"
        last = len(obj) - 1
        for i, (k, v) in enumerate(obj.items()):
            yield inner + encoder(k if isinstance(k, str) else str(k)) + ": "
            yield from _json_pieces(v, ascii, default, level + 1, encoder)
            yield ",\n" if i < last else "\n"
        yield pad + "}"
    else:
        if _is_list(obj) and not isinstance(obj, (list, tuple)):
            obj = list(obj)
        text = json.dumps(obj, indent=2, ensure_ascii=ascii, allow_nan=False, default=default)
        yield text.replace("\n", "\n" + pad) if level else text


def json_pieces(report: Report, units: str = "si", ascii: bool = False):
    """The report's JSON document (SI, whatever *units*) in pieces, in order: joined, they
    are ``render(report, "json")``.  The command line writes a long schedule's pieces as
    they are (:func:`pipeins.cli.options.emit`) rather than join them into one string."""
    report = _settled(report, units)
    from .notes import render as write_note, report_notes

    payload = dict(report.data)
    payload.setdefault("warnings", report.warnings)
    payload.setdefault("cautions", report.cautions)
    payload.setdefault("notes", report_notes(report, units))

    def written(obj):  # a note anywhere in the payload becomes its sentence
        from ..notes import Note

        if isinstance(obj, Note):
            return write_note(obj, units)
        raise TypeError(f"{type(obj).__name__} is not JSON serialisable")

    yield from _json_pieces(payload, ascii, written, 0)
    yield "\n"


def render(report: Report, fmt: str = "text", units: str = "si", ascii: bool = False) -> str | bytes:
    """The report as text, Markdown, CSV (its main table), JSON (SI, whatever *units*),
    HTML (text) or XLSX (bytes).  With *ascii* the text is plain ASCII: rules, bullets and
    unit signs spelt out (:func:`to_ascii`), JSON strings escaped (``\\u00b0``), HTML
    characters as references."""
    if fmt == "json":
        return "".join(json_pieces(report, units, ascii))
    report = _settled(report, units)
    if fmt == "csv":
        return _csv(report, units, ascii)
    if fmt in ("text", "markdown"):
        return _text(report, units, markdown=fmt == "markdown", ascii=ascii)
    if fmt == "html":
        from .html import render_html

        page = render_html(report, units)
        return page.encode("ascii", "xmlcharrefreplace").decode("ascii") if ascii else page
    if fmt == "xlsx":
        from .xlsx import render_xlsx

        return render_xlsx(report, units)
    raise InputError("--format", f'unknown format "{fmt}"; use {", ".join(FORMATS)}')
