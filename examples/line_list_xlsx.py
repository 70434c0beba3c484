"""Write a CSV line list as an XLSX workbook (one sheet, numbers as numbers).

    python examples/line_list_xlsx.py examples/line-list-kestrel-bay.csv [OUT.xlsx] [--sheet Lines]

The workbook is what a designer's spreadsheet would hold: the header row, then one row per
line; cells that are plain numbers are written as numbers.  It is made on demand (by the
tests and benchmarks/bench_line_list.py too) rather than committed, to keep binaries out
of the repository.  Needs openpyxl.
"""

from __future__ import annotations

import csv
import re
import sys
from pathlib import Path

_NUMBER = re.compile(r"^[-+]?(\d+\.?\d*|\.\d+)([eE][-+]?\d+)?$")


def cell(text: str):
    """A CSV cell as a workbook value: an int or float for a plain number, else the text."""
    text = text.strip()
    if not _NUMBER.match(text):
        return text or None
    number = float(text)
    return int(number) if number.is_integer() and "." not in text and "e" not in text.lower() else number


def write_xlsx(rows, path, sheet: str = "Lines") -> None:
    """Write *rows* (lists of cells, the header first) to the workbook *path*."""
    import openpyxl

    book = openpyxl.Workbook(write_only=True)
    ws = book.create_sheet(sheet)
    for row in rows:
        ws.append([cell(str(c)) if isinstance(c, str) else c for c in row])
    book.save(path)


def csv_to_xlsx(csv_path, xlsx_path=None, sheet: str = "Lines") -> Path:
    """The CSV line list *csv_path* as an XLSX next to it (or at *xlsx_path*)."""
    csv_path = Path(csv_path)
    out = Path(xlsx_path) if xlsx_path else csv_path.with_suffix(".xlsx")
    with open(csv_path, newline="", encoding="utf-8") as fh:
        write_xlsx(list(csv.reader(fh)), out, sheet)
    return out


if __name__ == "__main__":
    args = sys.argv[1:]
    sheet = "Lines"
    if "--sheet" in args:
        i = args.index("--sheet")
        sheet = args[i + 1]
        del args[i:i + 2]
    if not args:
        sys.exit(__doc__)
    print(csv_to_xlsx(args[0], args[1] if len(args) > 1 else None, sheet))
