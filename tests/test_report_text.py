"""The text and Markdown tables pipeins writes itself are the ones tabulate writes (the
reference: the ``tabulate`` package from PyPI, ``tablefmt="simple"`` and ``"pipe"``,
``disable_numparse=True``), and the
column-wise cell formatting is the cell-by-cell one."""

from __future__ import annotations

import math
import random

import pytest
from tabulate import tabulate

from pipeins.reports import _NARROW, Column, Table, _cells, _pipe_table, _plain_table

_ALPHABET = "abcXYZ019 .-–°·²µ≤≥−×€’→ΔεØé,()/%#_:"


def _word(rng: random.Random) -> str:
    pick = rng.random()
    if pick < 0.08:
        return ""
    if pick < 0.12:
        return rng.choice(["True", "False", "  padded  ", "12.50", "-0", "1e3", "nan"])
    return "".join(rng.choice(_ALPHABET) for _ in range(rng.randint(1, 14)))


@pytest.mark.parametrize("seed", range(40))
def test_plain_table_is_tabulates_simple_table(seed):
    rng = random.Random(seed)
    n_cols, n_rows = rng.randint(1, 7), rng.randint(1, 25)
    heads = [_word(rng) or "h" for _ in range(n_cols)]
    rows = [[_word(rng) for _ in range(n_cols)] for _ in range(n_rows)]
    plain = _plain_table(heads, rows)
    assert "\n".join(plain) == tabulate(rows, heads, tablefmt="simple", disable_numparse=True)


@pytest.mark.parametrize("seed", range(40))
def test_pipe_table_is_tabulates_markdown_table(seed):
    rng = random.Random(1000 + seed)
    n_cols, n_rows = rng.randint(1, 7), rng.randint(1, 25)
    heads = [_word(rng) or "h" for _ in range(n_cols)]
    rows = [[_word(rng) for _ in range(n_cols)] for _ in range(n_rows)]
    assert "\n".join(_pipe_table(heads, rows)) == tabulate(rows, heads, tablefmt="pipe", disable_numparse=True)


@pytest.mark.parametrize("cell", ["two\nlines", "tab\there", "wide 漢字", "zero\u200bwidth", "\x1b[1mbold"])
def test_pipe_table_leaves_the_unusual_to_tabulate(cell):
    assert _pipe_table(["a", "b"], [["x", cell]]) is None
    assert _pipe_table(["a"], []) is None


@pytest.mark.parametrize("cell", ["two\nlines", "tab\there", "wide 漢字", "zero\u200bwidth", "\x1b[1mbold"])
def test_plain_table_leaves_the_unusual_to_tabulate(cell):
    assert _plain_table(["a", "b"], [["x", cell]]) is None
    assert _plain_table(["a"], []) is None  # no rows


def test_every_narrow_character_is_one_column_wide_to_wcwidth():
    import tabulate as tab

    if not tab.WIDE_CHARS_MODE:  # tabulate measures len() then: one per character by definition
        assert all(len(ch) == 1 for ch in _NARROW)
        return
    import wcwidth

    wide = sorted(ch for ch in _NARROW if wcwidth.wcwidth(ch) != 1)
    assert wide == []


def test_column_wise_cells_are_the_cell_by_cell_ones():
    rng = random.Random(3)
    values = [rng.uniform(-400, 900) for _ in range(60)] + [None, math.nan, math.inf, -math.inf, 0.0, -1e-9, 3]
    rng.shuffle(values)
    cols = [Column("t", "temperature"), Column("x", "thickness", digits=1), Column("d", "diameter"),
            Column("q", "heat_flow_per_length"), Column("plain", digits=2), Column("txt")]
    table = Table("t", cols, [[v, None if v is None else abs(v) / 1e4, 0.0603 if v is None else abs(v) / 1e3,
                               v, v, f"r{i}"] for i, v in enumerate(values)])
    for units in ("si", "us"):
        for csv in (False, True):
            heads, rows = _cells(table, units, csv)
            expected = [[c.cell(v, units, csv) for c, v in zip(cols, row)] for row in table.rows]
            assert rows == expected, (units, csv)
