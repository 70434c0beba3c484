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


class UniformGrid:
    """Linear interpolation of several columns at once on an evenly spaced abscissa.

    The cell is found by index arithmetic, ``(x − x0) / step``, instead of the binary
    search of :func:`numpy.interp`, and every column is read through that one index: the
    same values as ``np.interp`` on each column (the same slope·(x − xᵢ) + yᵢ formula)
    at a fraction of the cost.  Abscissae outside the grid take the end values, as
    ``np.interp`` does.

    >>> grid = UniformGrid(np.array([0.0, 2.0, 4.0]), {"y": np.array([1.0, 3.0, 7.0])})
    >>> grid(np.array([-1.0, 1.0, 3.0, 9.0]))["y"].tolist()
    [1.0, 2.0, 5.0, 7.0]
    """

    def __init__(self, x: np.ndarray, columns: dict[str, np.ndarray]):
        x = np.asarray(x, dtype=float)
        step = (x[-1] - x[0]) / (len(x) - 1)
        if len(x) < 2 or not np.allclose(np.diff(x), step, rtol=1e-12, atol=0.0):
            raise ValueError("UniformGrid needs an evenly spaced, increasing abscissa")
        self.x, self.x0, self.x_last, self.per_step = x, float(x[0]), float(x[-1]), 1.0 / step
        # Where the nodes are exactly x0 + i·step (a table in whole kelvin, say), the cell's
        # start is computed instead of read.
        self.step = step if np.array_equal(self.x0 + np.arange(len(x)) * step, x) else None
        self.names = tuple(columns)
        values = np.stack([np.asarray(columns[k], dtype=float) for k in self.names], axis=1)
        slopes = np.diff(values, axis=0) / np.diff(x)[:, None]
        # One row per cell: every column's slope, then every column's value at the cell start,
        # so that one gather reads all the columns.
        self.cells = np.ascontiguousarray(np.concatenate([slopes, values[:-1]], axis=1))

    def __call__(self, x) -> dict[str, np.ndarray]:
        x = np.clip(np.asarray(x, dtype=float), self.x0, self.x_last)
        cell = np.minimum(((x - self.x0) * self.per_step).astype(np.intp), len(self.x) - 2)
        start = self.x.take(cell) if self.step is None else self.x0 + cell * self.step
        offset = (x - start)[..., None]
        block = self.cells.take(cell, axis=0)
        m = len(self.names)
        rows = block[..., :m] * offset + block[..., m:]
        return {name: rows[..., i] for i, name in enumerate(self.names)}
