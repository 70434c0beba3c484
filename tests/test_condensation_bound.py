"""Condensation control met on an interval of thickness: a 15 °C line in 10 °C air at 80 %
under a -20 °C sky (an invented cold-store yard).  Bare, the surface sits near 15 °C, well
above the dew point (6.7 °C; psychrolib's GetTDewPointFromRelHum below); insulated, radiation
to the cold sky pulls the surface below the air and, past a few millimetres, below the dew
point.  So the criterion is an upper bound: met from bare up to X, and the selection must not
pick more than X.

X is checked against independent solves of the line (:class:`pipeins.line.LineSpec`, one
layer, no sizing code) and a root found by scipy's brentq on them."""

import json

import numpy as np
import psychrolib
import pytest
from scipy.optimize import brentq

from pipeins.criteria import Requirements
from pipeins.line import LineSpec
from pipeins.selection import select

ARGS = ("--pipe", "NPS 4", "--fluid-temp", "15C", "--ambient-temp", "10C", "--surroundings-temp", "-20C",
        "--rh", "80", "--material", "k=0.04")
SPEC = LineSpec(pipe="NPS 4", fluid_temp_c=15.0, air_temp_c=10.0, surroundings_temp_c=-20.0, rh_percent=80.0)
SKY = ("surroundings colder than the air cool an insulated surface by radiation below the air temperature")


def surface_over_dew_k(thickness_m):
    """Surface less (dew point + 1 K) of the line with *thickness_m* of k=0.04 (0: bare)."""
    layers = (("k=0.04", thickness_m),) if thickness_m > 0 else ()
    r = LineSpec(**{**SPEC.__dict__, "layers": layers}).solve()
    return float(r.surface_temp_c) - (float(r.dew_point_c) + 1.0)


@pytest.fixture(scope="module")
def selection():
    return select(SPEC, "k=0.04", Requirements())


def test_dew_point_against_psychrolib():
    psychrolib.SetUnitSystem(psychrolib.SI)
    ref = psychrolib.GetTDewPointFromRelHum(10.0, 0.80)
    assert float(SPEC.solve().dew_point_c) == pytest.approx(ref, abs=0.05)


def test_upper_bound_against_independent_solves(selection):
    cond = next(c for c in selection.outcome.criteria if c.key == "condensation")
    assert cond.required_m[0] == 0.0 and cond.feasible[0]
    most = float(cond.most_m[0])
    delta = 2e-5  # twice the search tolerance (0.01 mm)
    assert surface_over_dew_k(0.0) > 0          # bare: met
    assert surface_over_dew_k(most - delta) > 0  # just under X: met
    assert surface_over_dew_k(most + delta) < 0  # just over X: sweats
    root = brentq(surface_over_dew_k, 1e-4, 0.05, xtol=1e-8)
    assert most == pytest.approx(root, abs=1e-5)
    assert 0.0025 < most < 0.0030


def test_condensation_alone_needs_no_insulation(run, selection):
    assert selection.outcome.selected_m[0] == 0.0
    assert selection.outcome.feasible[0]
    assert selection.added_layers(0) == ()
    code, out, err = run("size", *ARGS, "--format", "json")
    assert code == 0, err
    data = json.loads(out)
    assert data["selected_thickness_mm"] == 0.0
    assert data["governing"] == "condensation"
    assert data["result"]["surface_temp_c"] == pytest.approx(SPEC.solve().surface_temp_c, abs=1e-6)
    assert ("no insulation is needed for condensation control: the bare surface stays above the dew point "
            "plus 1 K; more than 2.7 mm would make the surface sweat under this sky (" + SKY + "): if the "
            "line is insulated for another reason, give it a low-emittance jacket or a cover") in data["warnings"]


def test_pick_stays_under_the_bound(run):
    # a 45 W/m cap needs 1.42 mm here; the series 1, 2, 10 mm offers 2 mm under the 2.7 mm bound
    code, out, err = run("size", *ARGS, "--max-heat-flow", "45W/m", "--series", "1mm,2mm,10mm", "--format", "json")
    assert code == 0, err
    data = json.loads(out)
    assert data["selected_thickness_mm"] == 2.0
    assert surface_over_dew_k(0.002) > 0
    assert ("condensation control holds from bare up to 2.7 mm only: more would make the surface sweat under "
            "this sky (" + SKY + "); a low-emittance jacket or a cover over the line allows more") in data["warnings"]


def test_conflict_says_by_how_much(run):
    code, out, err = run("size", *ARGS, "--max-heat-flow", "20W/m")
    assert code == 2 and out == ""
    sel = select(SPEC, "k=0.04", Requirements(max_heat_flow_w_per_m=20.0))
    cap = next(c for c in sel.outcome.criteria if c.key == "heat_flow")
    need = float(cap.required_m[0])
    cond = next(c for c in sel.outcome.criteria if c.key == "condensation")
    more = round((need - float(cond.most_m[0])) * 1e4) / 10
    assert err == (f"Error: --rh: condensation control allows at most 2.7 mm under this sky but heat-flow cap "
                   f"needs {round(need * 1e4) / 10:.1f} mm, {more:.1f} mm more than allowed: a thicker layer would "
                   f"make the surface sweat ({SKY}); a low-emittance jacket or a cover over the line may let both "
                   "be met\n")
    assert need > 0.003  # the cap truly needs more than the bound allows (independent check below)
    r = LineSpec(**{**SPEC.__dict__, "layers": (("k=0.04", 0.0027),)}).solve()
    assert abs(float(r.heat_flow_w_per_m)) > 20.0


def test_no_series_thickness_inside_the_interval(run):
    code, out, err = run("size", *ARGS, "--max-heat-flow", "45W/m", "--series", "1mm,10mm")
    assert code == 2
    assert err == ("Error: --rh: condensation control allows at most 2.7 mm under this sky and heat-flow cap "
                   "needs at least 1.4 mm, but no thickness of the series lies between them: give a series with "
                   f"one there, or a low-emittance jacket or a cover over the line ({SKY})\n")


def test_table_every_size_bounded(run):
    code, out, err = run("table", "--sizes", "NPS 1/2..NPS 6", *ARGS[2:], "--format", "json")
    assert code == 0, err
    data = json.loads(out)
    rows = data["rows"] if "rows" in data else data["sizes"]
    assert len(rows) == 12
    assert all(r["selected_thickness_mm"] == 0.0 for r in rows)
