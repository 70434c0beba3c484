"""Parse a shipped property table (``tables/<name>.csv``) once into numpy columns."""

from __future__ import annotations

import functools

import numpy as np

from pipeins.tables import read_table

__all__ = ["numeric_columns"]


@functools.cache
def numeric_columns(name: str) -> dict[str, np.ndarray]:
    """Every numeric column of ``tables/<name>.csv`` as a read-only float array.

    Text columns (``source``, ``phase`` …) are skipped.  The arrays are cached per
    process, so callers must not modify them (they are flagged read-only).

    >>> cols = numeric_columns("steam_saturation")
    >>> float(cols["pressure_pa"][0])
    1000.0
    """
    rows = read_table(name)
    out: dict[str, np.ndarray] = {}
    for column in rows[0]:
        try:
            values = np.array([float(row[column]) for row in rows])
        except ValueError:
            continue
        values.flags.writeable = False
        out[column] = values
    return out
