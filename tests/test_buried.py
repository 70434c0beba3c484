"""Buried pipes: the soil's shape factor and the heat flow of a buried insulated line.

Checks against sources outside the code: the shape factor of an isothermal cylinder under
an isothermal plane against ``ht.conduction.S_isothermal_pipe_to_plane`` (the closed form
2πL/acosh(2z/D) of Incropera et al., Fundamentals of Heat and Mass Transfer, (6th ed.), Table 4.1,
case 2, from memory); the heat flow against a hand series calculation (cylindrical shells and the soil
resistance in series).
"""

from __future__ import annotations

import json
import math

import pytest

import ht.conduction as ht_conduction

from pipeins.buried import list_soils, lookup_soil, shape_factor_per_m, soil_resistance_mk_w, solve_buried
from pipeins.cli import main
from pipeins.errors import InputError
from pipeins.line import LineSpec


@pytest.mark.parametrize("depth, diameter", [(0.6, 0.1), (1.0, 0.2), (0.3, 0.5), (2.5, 0.9), (0.101, 0.2)])
def test_shape_factor_against_ht(depth, diameter):
    # ht.conduction.S_isothermal_pipe_to_plane(D, Z, L): shape factor of a pipe under a plane (ht library)
    assert float(shape_factor_per_m(depth, diameter)) == pytest.approx(
        ht_conduction.S_isothermal_pipe_to_plane(diameter, depth, 1.0), rel=1e-12)


OD, WALL = 0.1143, 0.0036


def test_heat_flow_against_hand_series_calculation():
    # hand: q = (Tf − Tg) / (R_wall + R_insulation + R_casing + R_soil), no inner film
    spec = LineSpec(outer_diameter_m=OD, wall_m=WALL, fluid_temp_c=90.0,
                    layers=(("k=0.027", 0.040), ("k=0.43", 0.005)))
    b = solve_buried(spec, 0.8, 8.0, soil_k_w_mk=1.2)
    k_wall = float(spec.build_pipe().wall_conductivity_w_mk)
    r0, r1, r2, r3 = OD / 2 - WALL, OD / 2, OD / 2 + 0.040, OD / 2 + 0.045
    d = 2 * r3
    r_soil = math.acosh(2 * 0.8 / d) / (2 * math.pi * 1.2)
    total = (math.log(r1 / r0) / (2 * math.pi * k_wall) + math.log(r2 / r1) / (2 * math.pi * 0.027)
             + math.log(r3 / r2) / (2 * math.pi * 0.43) + r_soil)
    q = (90.0 - 8.0) / total
    assert b.heat_flow_w_per_m == pytest.approx(q, rel=1e-8)
    assert b.soil_resistance_mk_w == pytest.approx(r_soil, rel=1e-12)
    assert b.casing_temp_c == pytest.approx(8.0 + q * r_soil, rel=1e-8)
    assert b.casing_diameter_m == pytest.approx(d)


def test_soil_table_has_sources_and_ranges():
    soils = list_soils()
    assert len(soils) >= 6
    for s in soils:
        assert s.source and s.conductivity_low_w_mk <= s.conductivity_w_mk <= s.conductivity_high_w_mk
        assert 0.1 <= s.conductivity_low_w_mk and s.conductivity_high_w_mk <= 5.0
    assert lookup_soil("Moist-Sand").key == "moist_sand"
    with pytest.raises(InputError, match='unknown soil "mud"'):
        lookup_soil("mud")


def test_wetter_soil_loses_more():
    spec = LineSpec(pipe="DN100", fluid_temp_c=90.0, layers=(("k=0.027", 0.040),))
    dry = solve_buried(spec, 0.8, 8.0, soil="dry sand").heat_flow_w_per_m
    wet = solve_buried(spec, 0.8, 8.0, soil="saturated sand").heat_flow_w_per_m
    assert wet > dry > 0
    assert soil_resistance_mk_w(0.8, 0.2, 1.0) > soil_resistance_mk_w(0.8, 0.2, 2.0)


def _run(capsys, *args):
    code = 0
    try:
        main(list(args))
    except SystemExit as exc:
        code = exc.code or 0
    out, err = capsys.readouterr()
    return code, out, err


BASE = ("check", "--pipe", "DN100", "--fluid-temp", "90C", "--layer", "k=0.027:40mm")


def test_check_json_contract(capsys):
    code, out, err = _run(capsys, *BASE, "--buried", "0.8m", "--soil", "moist sand", "--ground-temp", "8C",
                          "--length", "100m", "--format", "json")
    assert code == 0, err
    data = json.loads(out)
    buried = data["buried"]
    spec = LineSpec(pipe="DN100", fluid_temp_c=90.0, layers=(("k=0.027", 0.040),))
    b = solve_buried(spec, 0.8, 8.0, soil="moist sand")
    assert buried["heat_flow_w_per_m"] == pytest.approx(b.heat_flow_w_per_m, rel=1e-8)
    assert data["heat_flow_w_per_m"] == pytest.approx(b.heat_flow_w_per_m, rel=1e-8)
    assert buried["soil_k_w_mk"] == 1.5 and buried["depth_m"] == 0.8 and buried["ground_temp_c"] == 8.0
    assert data["heat_flow_w"] == pytest.approx(100 * b.heat_flow_w_per_m, rel=1e-9)
    code, text, err = _run(capsys, *BASE, "--buried", "3ft", "--soil-k", "1.2", "--ground-temp", "45F",
                           "--units", "us")
    assert code == 0, err
    assert "Buried line" in text and "Btu/(h·ft)" in text and "acosh" in text


@pytest.mark.parametrize("extra, message", [
    (("--buried", "0.05m", "--soil-k", "1.2", "--ground-temp", "8C"), "Error: --buried: the burial depth 0.05 m"),
    (("--buried", "0.8m", "--soil-k", "9", "--ground-temp", "8C"), "Error: --soil-k: the soil conductivity must "
                                                                  "be from 0.1 to 5"),
    (("--buried", "0.8m", "--soil-k", "0.05", "--ground-temp", "8C"), "Error: --soil-k"),
    (("--buried", "0.8m", "--soil", "mud", "--ground-temp", "8C"), 'Error: --soil: unknown soil "mud"'),
    (("--buried", "0.8m", "--ground-temp", "8C"), "Error: --soil-k: a buried line needs the soil"),
    (("--buried", "0.8m", "--soil-k", "1", "--soil", "loam", "--ground-temp", "8C"), "Error: --soil-k"),
    (("--buried", "0.8m", "--soil-k", "1"), "Error: --ground-temp"),
    (("--soil-k", "1"), "Error: --soil-k: is a buried-line input: give --buried DEPTH too"),
    (("--buried", "0.8m", "--soil-k", "1", "--ground-temp", "8C", "--outer-h", "10"), "Error: --outer-h"),
])
def test_bad_buried_input(capsys, tmp_path, extra, message):
    target = tmp_path / "out.txt"
    code, out, err = _run(capsys, *BASE, *extra, "-o", str(target))
    assert code == 2 and out == "" and err.startswith(message) and err.count("\n") == 1, err
    assert not target.exists()
