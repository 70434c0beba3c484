"""The report as one spreadsheet workbook (``--format xlsx``; openpyxl, imported only here).

One sheet per report table (for a schedule: the schedule, the lines, the totals), then
``basis`` (title block and basis lines), ``warnings`` and ``cautions``.  Values with a
quantity kind are written as numbers in the display unit named in the header
(``thickness [mm]``); text cells that hold a plain number are written as numbers too;
"–" (not applicable) becomes an empty cell.  The header row is bold and frozen and the
columns are sized to their contents.
"""

from __future__ import annotations

import io
import math
import re

__all__ = ["render_xlsx", "sheet_names", "cell_value"]

_NUMBER = re.compile(r"^[−+-]?(\d{1,3}(,\d{3})+|\d+)?(\.\d+)?$")
_BAD_SHEET_CHARS = re.compile(r"[\[\]:*?/\\]")


def cell_value(column, value, units: str):
    """The value written to the sheet: a float in display units, text, or None (empty)."""
    if value is None or (isinstance(value, float) and not math.isfinite(value)):
        return None
    if column.kind is not None:
        from ..units import to_display

        try:
            return float(to_display(float(value), column.kind, units))
        except (TypeError, ValueError):
            return str(value)
    if isinstance(value, bool):
        return str(value)
    if isinstance(value, (int, float)):
        return float(value) if math.isfinite(value) else None
    text = str(value).strip()
    if text in ("", "–", "-"):
        return None
    if _NUMBER.match(text) and any(ch.isdigit() for ch in text):
        return float(text.replace(",", "").replace("−", "-"))
    return text


def sheet_names(report) -> list[str]:
    """Names of the workbook's sheets, in order (unique, at most 31 characters)."""
    names, seen = [], set()
    for title in [t.title for t in report.tables] + ["basis", "warnings", "cautions"]:
        name = " ".join(_BAD_SHEET_CHARS.sub(" ", title).split())[:31].strip() or "sheet"   # "a: b" -> "a b"
        base, k = name, 2
        while name.lower() in seen:
            suffix = f" ({k})"
            name, k = base[: 31 - len(suffix)] + suffix, k + 1
        seen.add(name.lower())
        names.append(name)
    return names


def _number_format(column, units: str) -> str:
    if column.kind is None:
        return "General"
    from ..units import _DEFAULT_DIGITS

    digits = column.digits if column.digits is not None else _DEFAULT_DIGITS.get((column.kind, units), 2)
    return "0" if digits <= 0 else "0." + "0" * digits


def _write(ws, heads, rows, formats=None, after=()):
    """One sheet of a write-only workbook: bold wrapped headings, the rows (floats in their
    number format), each column as wide as its widest text (8 to 70 characters), the
    heading row frozen.  Widths and panes are set before the rows, as a streamed sheet
    needs."""
    from openpyxl.cell import WriteOnlyCell
    from openpyxl.styles import Alignment, Font
    from openpyxl.utils import get_column_letter

    widths = [len(str(h)) for h in heads]
    for row in rows:
        for c, value in enumerate(row):
            text = f"{value:.2f}" if isinstance(value, float) else str(value or "")
            if len(text) > widths[c]:
                widths[c] = len(text)
    for c, width in enumerate(widths, start=1):
        ws.column_dimensions[get_column_letter(c)].width = min(70, max(8, width + 2))
    ws.freeze_panes = "A2"
    bold, wrap = Font(bold=True), Alignment(wrap_text=True, vertical="bottom")
    head_cells = []
    for h in heads:
        cell = WriteOnlyCell(ws, value=h)
        cell.font, cell.alignment = bold, wrap
        head_cells.append(cell)
    ws.append(head_cells)
    for row in rows:
        if formats:
            row = [_formatted(ws, value, formats[c]) if isinstance(value, float) else value
                   for c, value in enumerate(row)]
        ws.append(row)
    for row in after:  # below the table (its note), out of the width count
        ws.append(row)


def _formatted(ws, value: float, number_format: str):
    from openpyxl.cell import WriteOnlyCell

    cell = WriteOnlyCell(ws, value=value)
    cell.number_format = number_format
    return cell


def render_xlsx(report, units: str = "si") -> bytes:
    """The workbook of *report* as the bytes of an ``.xlsx`` file."""
    from .charts import _need

    _need("openpyxl", "--format")
    from openpyxl import Workbook

    from .html import TITLE_BLOCK_KEYS

    wb = Workbook(write_only=True)  # streamed: a 100,000-line schedule's sheets are not held as cell objects
    names = sheet_names(report)
    for name, table in zip(names, report.tables):
        ws = wb.create_sheet(name)
        heads = [c.label(units) for c in table.columns]
        rows = [[cell_value(c, v, units) for c, v in zip(table.columns, row)] for row in table.rows]
        note = [[], [table.note]] if table.note else []
        _write(ws, heads, rows, [_number_format(c, units) for c in table.columns], note)
    block = dict(getattr(report, "title_block", None) or {})
    basis_rows = [["report", report.title]]
    basis_rows += [[label, str(block[key])] for key, label in TITLE_BLOCK_KEYS.items() if block.get(key)]
    basis_rows.append(["units", units])
    basis_rows += [["basis", line] for line in report.footer]
    _write(wb.create_sheet(names[-3]), ["item", "text"], basis_rows)
    _write(wb.create_sheet(names[-2]), ["warning"], [[w] for w in report.warnings])
    _write(wb.create_sheet(names[-1]), ["caution"], [[c] for c in report.cautions])
    out = io.BytesIO()
    wb.save(out)
    return out.getvalue()
