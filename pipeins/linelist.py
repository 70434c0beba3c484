"""Line lists: the lines of a project read from a CSV or XLSX file instead of typed as TOML.

A project file names the list in ``[project]``::

    [project]
    name = "Harbour Road chilled water"
    lines_file = "line-list.xlsx"     # relative to the project file; .csv or .xlsx
    lines_sheet = "Lines"             # XLSX only; default the first sheet

    [lines_columns]                   # only where a header differs from the line key
    tag = "Line No."
    size = "Pipe size"
    ignore = ["P&ID", "Remarks"]      # columns to leave out

The first non-empty row is the header.  Each header is a ``[[lines]]`` key (compared
without case, spaces and hyphens read as underscores: ``Pipe Material`` is
``pipe_material``) or the header a ``[lines_columns]`` entry names; every other column is
refused unless listed in ``ignore``.  Each later row that is not empty becomes one
``[[lines]]`` entry with the row's non-empty cells as its values (text as written; XLSX
numbers as numbers written in the project's unit system), read by the project reader
exactly as a TOML entry is.

A column whose cells carry more than one unit (``50 mm`` in one row and ``2 in`` in
another, or a bare number beside one with a unit) is refused: such a list is usually
pasted together from two sources, and reading every cell as written would hide it.
Spellings of one unit (``2 in`` and ``2"``) are one unit.

Every problem names the file, the sheet (XLSX), the row and the column as the user sees
them: ``line-list.xlsx: sheet "Lines" row 14, column "size": unknown pipe size …``.

:func:`read_line_list` is the pure reader (file → rows); :func:`add_line_list` is the hook
the project reader calls.
"""

from __future__ import annotations

import re
from dataclasses import dataclass, field
from pathlib import Path

from .errors import InputError

__all__ = ["Row", "LineListError", "read_line_list", "add_line_list", "IGNORE_KEY", "FORMATS"]

#: The ``[lines_columns]`` key that lists columns to leave out.
IGNORE_KEY = "ignore"
#: File endings read, and how.
FORMATS = {".csv": "csv", ".xlsx": "xlsx", ".xlsm": "xlsx"}
_NUMBER_RE = re.compile(r"^\s*[-+]?(\d+\.?\d*|\.\d+)([eE][-+]?\d+)?")


@dataclass(frozen=True)
class Row:
    """One line of the list: ``values`` (line key → cell text, empty cells left out), its
    ``row`` number as a spreadsheet shows it, and where it is (``place``, ``columns``: line
    key → header as written)."""

    values: dict
    row: int
    place: str
    columns: dict = field(default_factory=dict)

    def where(self, key: str | None = None) -> str:
        """``line-list.csv: row 14, column "size"`` (no column without *key*)."""
        header = self.columns.get(key) if key else None
        return self.place + (f', column "{header}"' if header else "")


class LineListError(InputError):
    """Every problem of a line list at once (``problems``, one line each)."""

    def __init__(self, problems: list[str]):
        self.problems = list(dict.fromkeys(problems))
        super().__init__("", "\n".join(self.problems))


def _norm(header: str) -> str:
    return re.sub(r"[\s\-]+", "_", str(header).strip().lower())


def _cell_text(value) -> str:
    """A cell as text: numbers without a trailing ``.0``, dates in ISO form, text stripped."""
    if value is None:
        return ""
    if isinstance(value, bool):
        return "true" if value else "false"
    if isinstance(value, int):
        return str(value)
    if isinstance(value, float):
        return str(int(value)) if value.is_integer() and abs(value) < 1e15 else format(value, ".15g")
    if hasattr(value, "isoformat"):
        return value.isoformat()
    return str(value).strip()


def _csv_rows(path, shown: str):
    import csv
    import io

    from .fileio import read_text_input

    try:
        text = read_text_input(path, "lines_file")
    except InputError as exc:  # "<path>: why" -> "<name>: why"
        raise LineListError([f"{shown}: {exc.message.split(': ', 1)[-1]}"]) from None
    try:
        return [(i, [c.strip() for c in cells]) for i, cells in enumerate(csv.reader(io.StringIO(text)), start=1)]
    except csv.Error as exc:
        raise LineListError([f"{shown}: not a readable CSV file ({exc})"]) from None


def _xlsx_rows(path, shown: str, sheet: str | None):
    from .fileio import input_path_problem

    problem = input_path_problem(path)
    if problem:
        raise LineListError([f"{shown}: {problem}"])
    try:
        import openpyxl
    except ImportError:
        raise LineListError([f'{shown}: reading an XLSX line list needs openpyxl, which is not installed; '
                             'pip install "pipeins[report]" (or save the list as CSV)']) from None
    try:
        book = openpyxl.load_workbook(path, read_only=True, data_only=True)
    except Exception as exc:  # a zip that is no workbook, a damaged file: one line, never a traceback
        reason = str(exc).strip().splitlines()[0] if str(exc).strip() else type(exc).__name__
        raise LineListError([f"{shown}: not a readable XLSX workbook ({reason[:120]}); save it again as "
                             ".xlsx or as CSV"]) from None
    try:
        names = book.sheetnames
        if sheet is None:
            name = names[0]
        elif sheet in names:
            name = sheet
        else:
            from .errors import near_hint

            raise LineListError([f'{shown}: no sheet "{sheet}"; {near_hint(sheet, names)}'])
        ws = book[name]
        start = ws.min_row or 1
        rows = [(i, [_cell_text(v) for v in values])
                for i, values in enumerate(ws.iter_rows(values_only=True), start=start)]
    except LineListError:
        raise
    except Exception as exc:
        raise LineListError([f"{shown}: not a readable XLSX workbook ({type(exc).__name__}: {exc})"[:200]]) from None
    finally:
        book.close()
    return rows, f'{shown}: sheet "{name}" '


def _unit_of(text: str) -> str | None:
    """The unit written after the number of a cell (``""`` for a bare number), or None when
    the cell does not start with a number."""
    m = _NUMBER_RE.match(text)
    if not m:
        return None
    return re.sub(r"\s+", "", text[m.end():]).lower()


def _same_unit(unit: str, kinds, key: str, seen: dict) -> str:
    """The first spelling seen of the unit *unit* is (by its size in SI), else *unit*."""
    kind = kinds.get(key) if isinstance(kinds, dict) else None
    if not unit or kind is None:
        return unit
    from .units import parse_quantity

    def size(u):
        try:
            return parse_quantity("1" + u, kind)
        except InputError:
            return None

    mine = size(unit)
    if mine is None:
        return unit
    for other in dict.fromkeys(seen.values()):
        theirs = size(other) if other else None
        if theirs is not None and abs(theirs - mine) <= 1e-12 * abs(mine):
            return other
    return unit


def read_line_list(path, keys, columns: dict | None = None, sheet: str | None = None,
                   name: str | None = None, quantity_keys=()) -> list[Row]:
    """The rows of the line list at *path*.

    Parameters
    ----------
    path : str or os.PathLike
        A ``.csv`` (UTF-8, read by :func:`pipeins.fileio.read_text_input`) or ``.xlsx`` file.
    keys : collection of str
        The line keys a column may fill (the project's ``[[lines]]`` keys).
    columns : dict, optional
        Line key → header in the file, where they differ; ``ignore``: headers to leave out.
    sheet : str, optional
        The XLSX sheet (default the first).
    name : str, optional
        The file as named in messages (default: *path* as given).
    quantity_keys : collection of str, or dict of key -> quantity kind
        Keys whose cells carry units: a column of one of them must use one unit throughout
        (with their kinds, spellings of one unit count as one: ``2 in`` and ``2"``).

    Returns
    -------
    list of Row

    Raises
    ------
    LineListError
        Every problem at once: unreadable file or workbook, unknown sheet, missing header,
        unknown, missing or repeated columns, mixed units in a column, no lines.
    """
    shown = name or str(path)
    columns = dict(columns or {})
    ignore = {str(h).strip().lower() for h in columns.pop(IGNORE_KEY, [])}
    kind = FORMATS.get(Path(str(path)).suffix.lower())
    if kind is None:
        hint = "; save it as .xlsx or CSV" if Path(str(path)).suffix.lower() == ".xls" else ""
        raise LineListError([f"{shown}: a line list is a .csv or .xlsx file{hint}"])
    if kind == "csv":
        rows, place = _csv_rows(path, shown), f"{shown}: "
    else:
        rows, place = _xlsx_rows(path, shown, sheet)
    rows = [(i, cells) for i, cells in rows if any(cells)]
    if not rows:
        raise LineListError([f"{shown}: empty; the first row names the columns (service, size, length, "
                             "condition, …)"])
    header_row, headers = rows[0]
    where = lambda row, header=None: f"{place}row {row}" + (f', column "{header}"' if header else "")  # noqa: E731
    problems = []
    mapped = {str(h).strip().lower(): key for key, h in columns.items()}
    by_norm = {_norm(k): k for k in keys}
    key_of: dict[int, str] = {}
    first_col: dict[str, str] = {}
    for j, header in enumerate(headers):
        if not header:
            if any(j < len(cells) and cells[j] for _, cells in rows[1:]):
                used = next(r for r, cells in rows[1:] if j < len(cells) and cells[j])
                problems.append(f"{where(header_row)}: column {j + 1} has no header, yet row {used} has a "
                                "value in it; name it or empty it")
            continue
        if header.lower() in ignore:
            continue
        key = mapped.get(header.lower()) or (by_norm.get(_norm(header)) if header.lower() not in mapped else None)
        if key is not None and key in columns and columns[key].strip().lower() != header.lower():
            problems.append(f'{where(header_row, header)}: [lines_columns] takes {key} from column '
                            f'"{columns[key]}"; rename one of them or leave this one out with '
                            f'[lines_columns] ignore = ["{header}"]')
            continue
        if key is None:
            from .errors import near_hint

            hint = near_hint(_norm(header), sorted(keys))
            problems.append(f'{where(header_row, header)}: unknown column; {hint} (rename it, map it in '
                            f'[lines_columns], or leave it out with [lines_columns] ignore = ["{header}"])')
            continue
        if key in first_col:
            problems.append(f'{where(header_row, header)}: a second column for {key} (column "{first_col[key]}" '
                            "is the first)")
            continue
        first_col[key] = header
        key_of[j] = key
    for key, header in columns.items():
        if key not in first_col:
            listed = ", ".join(f'"{h}"' for h in headers if h)
            problems.append(f'{where(header_row)}: no column "{header}" (the [lines_columns] entry for {key}); '
                            f"the header row has {listed}")
    needed = ["service", "size", "length", "condition"]
    if any(k in first_col for k in ("od", "wall", "duct", "face", "vessel", "sphere")):
        needed.remove("size")  # a pipe by its dimensions, or a duct, face or vessel
    if any(k in first_col for k in ("face", "vessel", "sphere")):
        needed.remove("length")  # a face has its area, a vessel its count (the rows say what they need)
    if "conditions" in first_col:
        needed.remove("condition")  # several design conditions per row, "summer; winter" (the rows say)
    for key in needed:
        if key not in first_col and key not in columns:
            listed = ", ".join(f'"{h}"' for h in headers if h)
            problems.append(f'{where(header_row)}: no "{key}" column; the header row has {listed} (name a '
                            f'column "{key}" or map one in [lines_columns])')
    out = []
    for i, cells in rows[1:]:
        values = {key_of[j]: c for j, c in enumerate(cells) if j in key_of and c}
        if values:
            out.append(Row(values, i, f"{place}row {i}", first_col))
    if not out and not problems:
        problems.append(f"{shown}: no lines below the header row (row {header_row})")
    for key in quantity_keys:
        if key not in first_col:
            continue
        units: dict[str, list[int]] = {}
        same: dict = {}  # spelling -> the unit it is (2 in and 2" are one unit)
        for r in out:
            if key in r.values:
                unit = _unit_of(r.values[key])
                if unit is not None:
                    if unit not in same:  # once per spelling, not per row
                        same[unit] = _same_unit(unit, quantity_keys, key, same)
                    unit = same[unit]
                    units.setdefault(unit, []).append(r.row)
        if len(units) > 1:
            def said(unit, rows_):
                what = f'"{unit}"' if unit else "no unit"
                more = f" and {len(rows_) - 1} more" if len(rows_) > 1 else ""
                return f"{what} (row {rows_[0]}{more})"

            parts = " and ".join(said(u, rs) for u, rs in units.items())
            problems.append(f'{shown}: column "{first_col[key]}": mixed units: {parts}; write the whole column '
                            "in one unit")
    if problems:
        raise LineListError(problems)
    return out


def row_keys() -> set:
    """The keys a line-list column may fill: those of ``[[lines]]`` (pipes and ducts),
    ``[[faces]]`` and ``[[vessels]]``; a row with a ``face`` (or ``area``) cell is read as a
    face, one with a ``vessel`` or ``sphere`` cell as a vessel, any other as a run."""
    from .project import KEYS

    return set(KEYS["lines"]) | set(KEYS["faces"]) | set(KEYS["vessels"])


def add_line_list(reader, head: dict, columns_table, raw_lines: list) -> list:
    """The project reader's hook: the ``[[lines]]`` entries of *raw_lines* followed by the
    rows of ``[project] lines_file``; each row's problems are placed at its file, sheet, row
    and column (``reader.places``).  Problems of the list itself go to ``reader.problems``."""
    from .inputs import PARAMS
    from .units import KINDS

    path_key, entry = ("project",), "project"
    sheet = reader.text_value(head, "lines_sheet", path_key, entry)
    columns = {}
    if columns_table is not None:
        if not isinstance(columns_table, dict):
            reader.problems.append(f"{reader.file_name}: lines_columns must be a table [lines_columns]")
        else:
            for key, value in columns_table.items():
                place = (("lines_columns",), "lines_columns", str(key))
                if key == IGNORE_KEY:
                    if not isinstance(value, list) or not all(isinstance(v, str) and v.strip() for v in value):
                        reader.problem(*place, 'ignore must be a list of column headers, e.g. ["Remarks"]')
                    else:
                        columns[key] = value
                elif key not in row_keys():
                    from .errors import closest_names

                    from .project import KEYS

                    reader.problem(*place, f'unknown line key "{key}"; '
                                           f'{closest_names(str(key), sorted(KEYS["lines"]))}')
                elif not isinstance(value, str) or not value.strip():
                    reader.problem(*place, f'give the header of the column in the list, e.g. {key} = "…"')
                else:
                    columns[key] = value.strip()
    full = reader.path_value(head, "lines_file", path_key, entry)
    if full is None:
        return raw_lines
    if sheet is not None and FORMATS.get(full.suffix.lower()) != "xlsx":
        reader.problem(path_key, entry, "lines_sheet", "a sheet applies to an XLSX line list only")
    quantity = {p.key: p.kind for p in PARAMS if p.key and set(p.tables) & {"lines", "faces", "vessels"}
                and p.kind in KINDS}
    name = str(head["lines_file"]).strip()
    try:
        rows = read_line_list(full, row_keys(), columns, sheet, name, quantity)
    except InputError as exc:
        reader.problems.extend(getattr(exc, "problems", None) or [f"{name}: {exc.message}"])
        return raw_lines
    first = len(raw_lines) + 1
    by_index = {first + k: row for k, row in enumerate(rows)}

    def placed(row):
        def where(key, message):
            message = re.sub(r"lines entry (\d+)", lambda m: f"row {by_index[int(m.group(1))].row}"
                             if int(m.group(1)) in by_index else m.group(0), message)
            m = re.fullmatch(r'the key "(\w+)" is missing', message)
            if m:  # an empty cell of a column every line needs
                return f"{row.where(m.group(1))}: empty; every line needs its {m.group(1)}"
            return f"{row.where(key)}: {message}"
        return where

    for index, row in by_index.items():
        reader.places[("lines", index)] = placed(row)
    return list(raw_lines) + [dict(row.values) for row in rows]
