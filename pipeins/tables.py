"""Read the reference tables (CSV with a ``source`` column) that ship with the package.

In a wheel the tables sit in ``pipeins/tables``; in a source checkout (editable install)
they are the repository's top-level ``tables/`` folder.  Everything reads them through
:func:`read_table`, which caches each file once per process.
"""

from __future__ import annotations

import csv
import functools
import io
from importlib import resources
from pathlib import Path

__all__ = ["read_table", "table_path", "table_names", "csv_rows"]


def _tables_dir():
    packaged = resources.files("pipeins").joinpath("tables")
    if packaged.is_dir():
        return packaged
    checkout = Path(__file__).resolve().parent.parent
    if (checkout / "pyproject.toml").is_file() and (checkout / "tables").is_dir():
        return checkout / "tables"
    raise FileNotFoundError("pipeins: reference tables not found; reinstall the package")


def table_path(name: str):
    """The traversable path of ``tables/<name>.csv``."""
    return _tables_dir().joinpath(f"{name}.csv")


def table_names() -> list[str]:
    """Names (without ``.csv``) of every shipped table."""
    return sorted(p.name[:-4] for p in _tables_dir().iterdir() if p.name.endswith(".csv"))


@functools.cache
def read_table(name: str) -> tuple[dict[str, str], ...]:
    """Rows of ``tables/<name>.csv`` as dicts of strings (lines starting with ``#`` skipped).

    >>> rows = read_table("finishes")
    >>> all(row["source"] for row in rows)
    True
    """
    return tuple(csv_rows(table_path(name).read_text(encoding="utf-8")).__iter__())


def csv_rows(text: str) -> csv.DictReader:
    """A DictReader over CSV *text*, skipping blank lines and ``#`` comment lines (the
    format of the shipped tables and of user CSVs: cost tables, rule sets)."""
    lines = [ln for ln in io.StringIO(text) if ln.strip() and not ln.lstrip().startswith("#")]
    return csv.DictReader(lines)
