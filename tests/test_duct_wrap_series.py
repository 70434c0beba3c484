"""Duct wrap and duct board: their own thickness series (chosen by default on a duct) and the
wrap's compression as installed, applied in every solve and in sizing.

Outside references: the trade's duct-wrap thicknesses 1, 1.5, 2, 3 in (25, 38, 50, 75 mm)
and the 25 % installed compression duct wrap is rated at (common practice, from memory);
the plane-layer resistance R = t/k (ASTM C680, any heat-transfer text) for the rated R of
an installed wrap.
"""

from __future__ import annotations

import json
from dataclasses import replace

import numpy as np
import pytest

from pipeins.catalog.materials import lookup_material
from pipeins.catalog.series import default_series, thickness_series_m
from pipeins.criteria import Requirements
from pipeins.line import LineSpec
from pipeins.model import Layer
from pipeins.selection import select
from pipeins.solve import solve

INCH = 0.0254
SUPPLY = dict(duct="600x400mm", fluid_temp_c=13.0, air_temp_c=30.0, rh_percent=70.0)


def test_duct_series_are_the_trade_thicknesses():
    # duct wrap and board: 1, 1.5, 2, 3 in; 25, 38, 50, 75 mm (common practice, from memory)
    assert thickness_series_m("in_duct") == tuple(round(x * INCH, 9) for x in (1, 1.5, 2, 3))
    assert thickness_series_m("mm_duct") == (0.025, 0.038, 0.05, 0.075)


@pytest.mark.parametrize("material, units, expected", [
    ("mineral wool", "si", "mm_duct"), ("k=0.040", "us", "in_duct"), ("glass wool duct wrap", "us", "in_duct"),
    ("calcium silicate", "si", "mm_duct"),
    ("flexible elastomeric foam", "si", "mm_elastomeric")])  # sheet keeps its own series on a duct
def test_duct_takes_the_duct_series_by_default(material, units, expected):
    spec = LineSpec(**SUPPLY)
    sel = select(spec, material, Requirements(), units=units)
    assert sel.series_name == expected
    assert float(sel.outcome.selected_m[0]) in thickness_series_m(expected)


def test_pipe_keeps_its_series():
    sel = select(LineSpec(pipe="DN50", fluid_temp_c=6.0, air_temp_c=30.0, rh_percent=70.0), "mineral wool",
                 Requirements())
    assert sel.series_name == "mm_pipe_section"
    assert default_series("pipe_section", "si") == "mm_pipe_section"


def test_a_given_series_wins_on_a_duct():
    sel = select(LineSpec(**SUPPLY), "mineral wool", Requirements(), series="mm_pipe_section")
    assert sel.series_name == "mm_pipe_section"


def test_list_series_shows_the_duct_series(run):
    code, out, err = run("list", "series")
    assert code == 0, err
    assert "mm_duct" in out and "in_duct" in out and "25, 38, 50, 75 mm" in out


# ------------------------------------------------------------------------- wrap compression
def _uncompressed(material):
    """The same material with no compression: its layer is solved at the thickness given."""
    return replace(material, compression_percent=0.0)


def test_wrap_flag_and_installed_thickness():
    wrap = lookup_material("fiberglass duct wrap")  # trade word finds the catalogue's wrap
    board = lookup_material("glass wool duct board")
    assert wrap.is_wrap and wrap.compression_percent == 25.0  # common practice, from memory
    from pipeins.catalog.ducts import WRAP_COMPRESSION_PERCENT, installed_wrap

    assert wrap.compression_percent == WRAP_COMPRESSION_PERCENT  # one allowance, catalogue and library
    assert float(Layer(wrap, 0.05).installed_thickness_m) == pytest.approx(
        float(installed_wrap(0.05).installed_thickness_m), rel=1e-12)
    assert not board.is_wrap and not lookup_material("mineral wool").is_wrap
    # 2 in nominal -> 1.5 in installed (the trade's rating of a 2 in wrap, common practice)
    assert float(Layer(wrap, 2 * INCH).installed_thickness_m) == pytest.approx(1.5 * INCH, rel=1e-12)
    assert Layer(board, 0.05).installed_thickness_m == 0.05


def test_wrap_is_solved_at_its_installed_thickness():
    # the same duct with the wrap given at 50 mm nominal equals an uncompressed layer of 37.5 mm
    spec = LineSpec(**SUPPLY, layers=(("glass wool duct wrap", 0.050),))
    section, layers, fluid, air, surface = spec.build_model()
    wrap = layers[0].material
    got = solve(section, layers, fluid, air, surface)
    ref = solve(section, [Layer(_uncompressed(wrap), 0.0375)], fluid, air, surface)
    assert float(got.heat_flow) == pytest.approx(float(ref.heat_flow), rel=1e-12)
    assert float(got.surface_temp_c) == pytest.approx(float(ref.surface_temp_c), rel=1e-12)
    # the plane layer: an installed R = t_installed / k (ASTM C680), 1.5 in of k = 0.040 is R 0.95
    k24 = dict(wrap.points)[24.0]
    assert 0.0381 / k24 == pytest.approx(0.9525, rel=1e-3)


@pytest.mark.parametrize("units", ["si", "us"])
def test_sizing_picks_the_nominal_wrap_whose_installed_thickness_meets(units):
    spec = LineSpec(**SUPPLY)
    sel = select(spec, "glass wool duct wrap", Requirements(), units=units)
    out = sel.outcome
    cond = next(c for c in out.criteria if c.key == "condensation")
    nominal = float(out.selected_m[0])
    assert nominal in thickness_series_m(sel.series_name)  # what is sold
    section, _, fluid, air, surface = spec.build_model(insulated=True)
    wrap = _uncompressed(sel.material)

    def surface_at(installed_m):
        r = solve(section, [Layer(wrap, installed_m)], fluid, air, surface)
        return float(r.surface_temp_c), float(r.dew_point_c)

    # re-solved at the installed thickness of the pick: condensation control holds (1 K margin)
    ts, dew = surface_at(0.75 * nominal)
    assert ts >= dew + 1.0 - 1e-6
    # the least nominal thickness sits on the limit at its installed thickness ...
    least = float(cond.required_m[0])
    ts, dew = surface_at(0.75 * least)
    assert ts == pytest.approx(dew + 1.0, abs=0.02)
    # ... and the next thinner nominal of the series fails when installed
    thinner = [t for t in thickness_series_m(sel.series_name) if t < nominal]
    if thinner:
        ts, dew = surface_at(0.75 * thinner[-1])
        assert ts < dew + 1.0
    # solved at the nominal thickness instead, a thinner nominal would have passed
    ts_nominal, dew = surface_at(least)
    assert ts_nominal > dew + 1.0 + 0.05


def test_size_report_shows_nominal_and_installed(run):
    args = ("size", "--duct", "600x400mm", "--fluid-temp", "13C", "--ambient-temp", "30C", "--rh", "70",
            "--material", "glass wool duct wrap")
    code, out, err = run(*args)
    assert code == 0, err
    assert "selected, nominal [mm]" in out and "installed [mm]" in out
    assert "25 mm nominal, 18.75 mm installed (25 % compression)" in out
    code, out, err = run(*args, "--format", "json")
    data = json.loads(out)
    assert data["selected_thickness_mm"] == 25.0 and data["installed_thickness_mm"] == 18.75
    assert data["compression_percent"] == 25.0
    layer = data["result"]["line"]["layers"][0]
    assert layer["thickness_m"] == pytest.approx(0.025) and layer["installed_thickness_m"] == pytest.approx(0.01875)


def test_check_with_a_wrap_layer_us(run):
    code, out, err = run("check", "--duct", "24x16in", "--fluid-temp", "55F", "--ambient-temp", "86F",
                         "--layer", "glass wool duct wrap:2in", "--units", "us")
    assert code == 0, err
    assert "2.00 in nominal, 1.50 in installed (25 % compression)" in out


def test_duct_code_minimum_with_a_wrap_orders_the_nominal():
    # R-6 at 75 °F (IECC 2018 C403.11.1, from memory) with the wrap's k: installed t = R·k,
    # ordered nominal t / 0.75; the pick's installed thickness meets R = t/k (ASTM C680 plane layer)
    from pipeins.duct_codes import r_value_si
    from pipeins.physics.conduction import conductivity_of

    spec = LineSpec(duct="600x400mm", fluid_temp_c=13.0, air_temp_c=30.0)
    req = Requirements(duct_location="unconditioned", climate_zone="5A")
    sel = select(spec, "glass wool duct wrap", req, code="iecc-2018-c403", units="us")
    code = next(c for c in sel.outcome.criteria if c.key == "code")
    from pipeins.duct_codes import RATING_MEAN_TEMP_C

    k = float(conductivity_of(sel.material).conductivity(RATING_MEAN_TEMP_C))
    r_needed = code.r_value_m2k_w if hasattr(code, "r_value_m2k_w") else r_value_si(6.0)
    assert float(code.required_m[0]) * 0.75 / k == pytest.approx(r_needed, rel=1e-9)
    assert float(sel.outcome.selected_m[0]) * 0.75 / k >= r_needed
