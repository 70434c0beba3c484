"""Regression pin (not an external reference): the sizing search's results on thickness
tables of five invented services (hot, chilled, steam, temperature change, freeze), generated
once with the per-criterion search in place before the search was vectorised across criteria
(tests/sizing_pin_cases.py wrote tests/data/sizing_pinned.json).  The least thickness of
every criterion and the selected commercial thickness must stay within 1e-6 mm; the physics
behind them is checked against outside sources in test_sizing.py and test_solve*.py."""

import json
import math

import pytest

from sizing_pin_cases import PIN_FILE, compute

PINNED = json.loads(PIN_FILE.read_text(encoding="utf-8"))


@pytest.fixture(scope="module")
def now():
    return compute()


def _same(a, b):
    assert len(a) == len(b)
    for x, y in zip(a, b):
        assert (x is None) == (y is None), (x, y)
        if x is not None:
            assert math.isclose(x, y, rel_tol=0, abs_tol=1e-6), (x, y)


@pytest.mark.parametrize("service", sorted(PINNED))
def test_table_unchanged(now, service):
    pin, got = PINNED[service], now[service]
    assert got["sizes"] == pin["sizes"]
    _same(got["selected_mm"], pin["selected_mm"])
    assert sorted(got["least_mm"]) == sorted(pin["least_mm"])
    for key in pin["least_mm"]:
        _same(got["least_mm"][key], pin["least_mm"][key])
    assert got["governing"] == pin["governing"]
