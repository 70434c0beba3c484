"""Fittings as objects (pipeins.fittings, pipeins.catalog.fittings): bare valves and flanges
solved with their own film, insulated removable covers, the CLI contract and bad input.

Checks against sources outside the code: a bare valve's heat loss against its area times the
film of a short horizontal cylinder solved by hand (ht's Churchill & Chu horizontal-cylinder
correlation with CoolProp air at the film temperature, radiation by the Stefan-Boltzmann law
with the same emittance; successive substitution, no pipeins solver); a covered fitting
against a hand series calculation (cylindrical conduction ln(r2/r1)/(2πk) with a fixed outer
coefficient); the saving of a cover is bare minus covered.
"""

from __future__ import annotations

import json
import math

import numpy as np
import pytest

from pipeins.catalog.fittings import (FITTING_KINDS, bare_area_m2, equivalent_length_m, list_fittings,
                                      lookup_fitting)
from pipeins.catalog.materials import lookup_wall_material
from pipeins.cli import main
from pipeins.errors import InputError
from pipeins.fittings import solve_fittings
from pipeins.line import LineSpec

SIGMA = 5.670374419e-8  # W/(m2 K4), CODATA 2018


def _run(capsys, *args):
    try:
        main(list(args))
        code = 0
    except SystemExit as exc:
        code = exc.code or 0
    out, err = capsys.readouterr()
    return code, out, err


def _h_conv(ts_c, ta_c, d_m):
    """ht Nu_horizontal_cylinder_Churchill_Chu with CoolProp air at the film temperature."""
    import fluids.core
    from CoolProp.CoolProp import PropsSI
    from ht import conv_free_immersed

    film_k = 0.5 * (ts_c + ta_c) + 273.15
    rho, mu, k, cp = (PropsSI(key, "T", film_k, "P", 101325.0, "Air") for key in ("D", "V", "L", "CPMASS"))
    gr = fluids.core.Grashof(d_m, 1.0 / film_k, ts_c, ta_c, rho=rho, mu=mu)
    pr = fluids.core.Prandtl(Cp=cp, k=k, mu=mu)
    return conv_free_immersed.Nu_horizontal_cylinder_Churchill_Chu(pr, gr) * k / d_m


def _hand_bare_fitting_w(area_m2, d_m, wall_m, k_wall, fluid_c, air_c, emittance):
    """Heat loss [W] of a bare fitting: area × film of a short cylinder of diameter d, the film
    from ht and Stefan-Boltzmann, the body at the fluid temperature through the wall."""
    r_o, r_i = d_m / 2, d_m / 2 - wall_m
    r_wall_per_m2 = r_o * math.log(r_o / r_i) / k_wall  # wall resistance per unit outer area
    ts = fluid_c - 1.0
    for _ in range(200):
        h_c = _h_conv(ts, air_c, d_m)
        h_r = emittance * SIGMA * ((ts + 273.15) ** 4 - (air_c + 273.15) ** 4) / (ts - air_c)
        flux = (fluid_c - air_c) / (r_wall_per_m2 + 1.0 / (h_c + h_r))
        new = air_c + flux / (h_c + h_r)
        if abs(new - ts) < 1e-9:
            break
        ts = 0.5 * (ts + new)
    return area_m2 * flux, ts


@pytest.mark.parametrize("kind, size, fluid_c", [("gate", "NPS 4", 180.0), ("globe", "DN50", 120.0)])
def test_bare_valve_against_area_times_short_cylinder_film_by_hand(kind, size, fluid_c):
    # hand: ht.conv_free_immersed.Nu_horizontal_cylinder_Churchill_Chu + CoolProp air + radiation, same emittance
    spec = LineSpec(pipe=size, layers=(("mineral wool", 0.05),), fluid_temp_c=fluid_c, air_temp_c=20.0)
    fit = lookup_fitting(kind, size)
    r = solve_fittings(spec, [fit])
    pipe = spec.build_pipe()
    k_wall = float(pipe.wall_conductivity_w_mk)
    assert k_wall == lookup_wall_material("carbon steel").conductivity_w_mk
    hand_w, hand_ts = _hand_bare_fitting_w(fit.area_m2, fit.flange_od_m, float(pipe.wall_m), k_wall,
                                           fluid_c, 20.0, 0.80)  # bare oxidised steel, tables/finishes.csv
    assert r.items[0].heat_flow_w == pytest.approx(hand_w, rel=0.01)
    assert r.items[0].surface_temp_c == pytest.approx(hand_ts, abs=0.05)
    assert r.items[0].equivalent_length_m == pytest.approx(fit.area_m2 / (math.pi * fit.flange_od_m))


def test_cover_against_hand_series_and_saving_is_bare_minus_covered():
    # hand: q' = ΔT / (ln(ro/ri)/(2π kw) + ln((ro+t)/ro)/(2π k) + 1/(h·2π(ro+t))), Q = q'·A/(πD)
    h, k, t = 10.0, 0.040, 0.05
    spec = LineSpec(pipe="DN100", fluid_temp_c=150.0, air_temp_c=10.0, outer_h_w_m2k=h)
    fits = [lookup_fitting("gate", "DN100", "PN16"), lookup_fitting("flange", "DN100", "PN40")]
    r = solve_fittings(spec, fits, ("k=0.040", t))
    pipe = spec.build_pipe()
    for item, fit in zip(r.items, fits):
        ro = fit.flange_od_m / 2
        ri = ro - float(pipe.wall_m)
        rw = math.log(ro / ri) / (2 * math.pi * float(pipe.wall_conductivity_w_mk))
        bare = 140.0 / (rw + 1 / (h * 2 * math.pi * ro)) * fit.area_m2 / (math.pi * fit.flange_od_m)
        covered = 140.0 / (rw + math.log((ro + t) / ro) / (2 * math.pi * k) + 1 / (h * 2 * math.pi * (ro + t))) \
            * fit.area_m2 / (math.pi * fit.flange_od_m)
        assert item.heat_flow_w == pytest.approx(bare, rel=1e-8)
        assert item.covered_heat_flow_w == pytest.approx(covered, rel=1e-8)
        assert item.saving_w == pytest.approx(item.heat_flow_w - item.covered_heat_flow_w, rel=1e-12)
    totals = r.to_dict()["totals"]
    assert totals["saving_w"] == pytest.approx(totals["bare_heat_flow_w"] - totals["covered_heat_flow_w"])


def test_one_solver_call_bare_and_one_covered(monkeypatch):
    import importlib

    module = importlib.import_module("pipeins.solve")
    calls = []
    real = module.solve
    monkeypatch.setattr(module, "solve", lambda *a, **k: calls.append(np.shape(a[0].outer_diameter_m))
                        or real(*a, **k))
    spec = LineSpec(pipe="NPS 2", fluid_temp_c=120.0, air_temp_c=20.0)
    fits = [lookup_fitting(kind, "NPS 2") for kind in FITTING_KINDS]
    solve_fittings(spec, fits, ("mineral wool", 0.04))
    assert calls == [(len(fits),), (len(fits),)]


def test_chilled_line_fittings_gain_heat():
    spec = LineSpec(pipe="DN80", fluid_temp_c=5.0, air_temp_c=30.0)
    r = solve_fittings(spec, [lookup_fitting("ball", "DN80")], ("elastomeric foam", 0.025))
    item = r.items[0]
    assert item.heat_flow_w < item.covered_heat_flow_w < 0  # heat gains, the cover reduces them
    assert 5.0 < item.surface_temp_c < 30.0


def test_catalogue_areas_follow_the_model_and_have_sources():
    rows = list_fittings()
    assert {f.kind for f in rows} == set(FITTING_KINDS)
    for f in rows:
        assert f.source and "from memory" in f.source
        assert f.area_m2 == pytest.approx(bare_area_m2(f.kind, f.pipe_od_m, f.flange_od_m, f.flange_thickness_m,
                                                       f.face_to_face_m), abs=6e-5)
        assert f.flange_od_m > f.pipe_od_m and (f.face_to_face_m is None) == (f.kind == "flange")
    # a joint by hand: NPS 4 class 150 flanges, O = 9.00 in, tf = 0.94 in (ASME B16.5, from memory)
    f = lookup_fitting("flange", "NPS 4", "150")
    d, big, b = 0.1143, 9.00 * 0.0254, 0.94 * 0.0254
    assert f.area_m2 == pytest.approx(2 * math.pi / 4 * (big**2 - d**2) + math.pi * big * 2 * b, abs=6e-5)
    assert lookup_fitting("gate", "NPS 4", "class 150").face_to_face_m == pytest.approx(0.2286)  # B16.10, 9.00 in


def test_size_naming_and_default_classes():
    assert lookup_fitting("gate", "DN50").pressure_class == "PN16"
    assert lookup_fitting("gate", "NPS 2").pressure_class == "class 150"
    assert lookup_fitting("gate", "DN50", "150") is lookup_fitting("gate", "NPS 2", "CL150")
    assert lookup_fitting("check", "nps 3", "#300").pressure_class == "class 300"


def test_equivalent_length_table_agrees_with_the_objects_for_valves():
    # the two catalogues (both from memory) agree within a factor of two for bare valves
    for size in ("NPS 1", "NPS 2", "NPS 4", "NPS 8", "NPS 12"):
        spec = LineSpec(pipe=size, fluid_temp_c=150.0, air_temp_c=20.0)
        per_m = float(spec.solve().heat_flow_w_per_m)
        valve = solve_fittings(spec, [lookup_fitting("gate", size)]).items[0].heat_flow_w
        table = float(equivalent_length_m("valve", spec.pipe_size().outer_diameter_m))
        assert 0.5 < (valve / per_m) / table < 2.0


@pytest.mark.parametrize("kind, size, cls, message", [
    ("plug", "DN50", None, 'unknown fitting kind "plug"'),
    ("gate", "DN50", "PN25", 'no pressure class "PN25" for gate; known: PN16, PN40, class 150, class 300'),
    ("gate", "DN32", None, 'no gate of size "DN32" in PN16'),
    ("gate", "DN50", "heavy", 'unknown pressure class "heavy"'),
])
def test_lookup_bad_input(kind, size, cls, message):
    with pytest.raises(InputError) as exc:
        lookup_fitting(kind, size, cls)
    assert exc.value.name == "--valve" and message in exc.value.message


ARGS = ("--pipe", "NPS 2", "--fluid-temp", "150C", "--ambient-temp", "20C", "--layer", "mineral wool:40mm")


def test_check_json_contract(capsys):
    code, out, err = _run(capsys, "check", *ARGS, "--valve", "gate:NPS 2", "--valve", "globe:DN50:PN40",
                          "--flange", "NPS 2:300", "--cover", "mineral wool:50mm", "--format", "json")
    assert code == 0, err
    data = json.loads(out)
    assert [f["kind"] for f in data["fittings"]] == ["gate", "globe", "flange"]
    for f in data["fittings"]:
        assert {"heat_flow_w", "surface_temp_c", "covered_heat_flow_w"} <= set(f)
        assert f["heat_flow_w"] > f["covered_heat_flow_w"] > 0
        assert f["saving_w"] == pytest.approx(f["heat_flow_w"] - f["covered_heat_flow_w"])
    assert data["fittings"][2]["pressure_class"] == "class 300"
    # the pipe's own results do not include the fittings
    alone = json.loads(_run(capsys, "check", *ARGS, "--format", "json")[1])
    assert data["heat_flow_w_per_m"] == alone["heat_flow_w_per_m"]
    bare = json.loads(_run(capsys, "check", *ARGS, "--flange", "DN50", "--format", "json")[1])
    assert bare["fittings"][0]["covered_heat_flow_w"] is None


def test_check_text_us_and_csv(capsys):
    code, out, _ = _run(capsys, "check", *ARGS, "--valve", "gate:NPS 2", "--cover", "mineral wool:50mm",
                        "--units", "us")
    assert code == 0
    assert "Fittings, bare and covered" in out and "bare heat loss [Btu/h]" in out and "bare area [ft²]" in out
    code, out, _ = _run(capsys, "check", *ARGS, "--valve", "gate:NPS 2", "--format", "csv")
    assert code == 0
    header = [line for line in out.splitlines() if not line.startswith("#")][0]
    assert header == "fitting,bare area [m²],bare heat loss [W],bare surface [°C]"
    code, out, _ = _run(capsys, "check", *ARGS, "--valve", "gate:NPS 2", "--format", "markdown")
    assert "## Fittings, bare" in out


def test_cost_prices_bare_against_covered(capsys):
    code, out, err = _run(capsys, "cost", *ARGS, "--length", "50m", "--hours", "5000h", "--energy-price",
                          "0.09/kWh", "--valve", "gate:NPS 2", "--cover", "mineral wool:50mm", "--format", "json")
    assert code == 0, err
    data = json.loads(out)
    fit = data["fittings"][0]
    year = data["fittings_year"]
    # energy per year = heat flow × hours (efficiency 1)
    assert year["bare"]["heating"]["energy_j"] == pytest.approx(fit["heat_flow_w"] * 5000 * 3600, rel=1e-9)
    assert year["covered"]["heating"]["energy_j"] == pytest.approx(fit["covered_heat_flow_w"] * 5000 * 3600,
                                                                   rel=1e-9)
    assert year["bare"]["heating"]["cost"] == pytest.approx(fit["heat_flow_w"] * 5000 / 1000 * 0.09, rel=1e-9)


def test_tracing_takes_the_fittings_allowance(capsys):
    code, out, err = _run(capsys, "check", "--pipe", "DN50", "--fluid-temp", "5C", "--ambient-temp", "-20C",
                          "--layer", "mineral wool:40mm", "--maintain-temp", "5C", "--flange", "DN50",
                          "--format", "json")
    assert code == 0, err
    data = json.loads(out)
    bare_w = data["fittings"][0]["heat_flow_w"]  # the line's fluid is the maintain temperature here
    assert data["tracing"]["fittings_allowance_w"] == pytest.approx(bare_w * 1.2, rel=1e-9)


@pytest.mark.parametrize("args, line", [
    (("--valve", "plug:DN50"), 'Error: --valve: unknown fitting kind "plug"; known: gate, globe, ball, '
                               "butterfly, check, strainer"),
    (("--valve", "gate:DN50:PN25"), 'Error: --valve: no pressure class "PN25" for gate; known: PN16, PN40, '
                                    "class 150, class 300"),
    (("--flange", "NPS 5"), 'Error: --flange: no flange of size "NPS 5" in class 150 in the catalogue '
                            "(tables/fitting_areas.csv); sizes: NPS 1/2, NPS 3/4, NPS 1, NPS 1-1/2, NPS 2, NPS 3, "
                            "NPS 4, NPS 6, NPS 8, NPS 10, NPS 12"),
    (("--valve", "gate"), 'Error: --valve: "gate" needs KIND:SIZE[:CLASS], e.g. gate:DN50 or globe:"NPS 2":300'),
    (("--cover", "mineral wool:50mm"), "Error: --cover: covers the fittings: give --valve or --flange too"),
])
def test_bad_input_one_line_exit_2(capsys, args, line):
    code, out, err = _run(capsys, "check", *ARGS, *args)
    assert code == 2 and out == ""
    assert err.strip() == line


def test_cost_prices_fittings_alone_with_length_zero(capsys):
    code, out, err = _run(capsys, "cost", "--pipe", "DN80", "--fluid-temp", "160C", "--ambient-temp", "15C",
                          "--length", "0", "--valve", "globe:DN80:PN40", "--cover", "mineral wool:50mm",
                          "--energy-price", "0.1/kWh", "--hours", "4000h", "--format", "json")
    assert code == 0, err
    data = json.loads(out)
    fit, year = data["fittings"][0], data["fittings_year"]
    saving_j = year["bare"]["heating"]["energy_j"] - year["covered"]["heating"]["energy_j"]
    assert saving_j == pytest.approx(fit["saving_w"] * 4000 * 3600, rel=1e-9)  # (bare − covered) × hours
