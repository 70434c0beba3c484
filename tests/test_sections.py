"""Sections of several patches (a rectangular duct's faces), flat faces, and sun (issue 10, 13 §4).

Checks against closed forms: a plane layer R = t/k (ASTM C680; any heat-transfer text),
the rectangular-duct formula of ISO 12241:2008 §4.2.3 with mean perimeters (from memory),
and a hand energy balance for absorbed sun with fixed coefficients.
"""

from __future__ import annotations

import json

import numpy as np
import pytest
from hypothesis import given, settings, strategies as st

from pipeins.catalog.materials import lookup_material
from pipeins.geometry.section import Patch
from pipeins.geometry.strip import Strip
from pipeins.model import FlatWall, Fluid, Layer, RectangularDuct, Surface, Surroundings
from pipeins.solve import solve


class _OneStrip:
    """A section of one strip of a duct, solved alone (for the sum-of-faces check)."""

    kind, basis = "strip", "W/m"

    def __init__(self, duct, patch):
        self.wall_m, self.wall_conductivity_w_mk = duct.wall_m, duct.wall_conductivity_w_mk
        self.label, self.wall_material, self._patch = "one face", duct.wall_material, patch

    def patches(self, surroundings):
        return [self._patch]


def _layers(t, k="k=0.040"):
    return [Layer(lookup_material(k), t)]


@pytest.mark.parametrize("rh, fluid, wind", [(60.0, 13.0, 0.0), (None, 45.0, 0.0), (None, 8.0, 4.0)])
def test_duct_equals_the_sum_of_its_faces_solved_alone(rh, fluid, wind):
    # The four faces in one solve against each face solved as its own section (same films).
    duct = RectangularDuct(0.8, 0.5)
    air = Surroundings(28.0, wind_speed_m_s=wind, relative_humidity_percent=rh)
    layers = _layers(np.array([0.013, 0.025, 0.05]))
    whole = solve(duct, layers, Fluid(fluid), air)
    parts = [solve(_OneStrip(duct, p), layers, Fluid(fluid), air) for p in duct.patches(air)]
    total = sum(np.asarray(p.heat_flow) for p in parts)  # each alone carries its count (two sides)
    np.testing.assert_allclose(whole.heat_flow, total, rtol=1e-9)
    for got, alone in zip(whole.patches, parts):
        np.testing.assert_allclose(got.result.surface_temp_c, alone.surface_temp_c, rtol=0, atol=1e-9)


def test_square_duct_matches_iso_12241_mean_perimeter_formula():
    # ISO 12241:2008 §4.2.3 (from memory): for a rectangular duct,
    # q' = ΔT / (1/(h_i·P_i) + 2d/(λ·(P_i + P_e)) + 1/(h_e·P_e)),  P_e = P_i + 8d.
    # With one coefficient on every face of a square duct the per-face sum is exact.
    side, d, k, h_i, h_e = 0.5, 0.04, 0.035, 25.0, 8.0
    duct = RectangularDuct(side, side, wall_m=1e-9, wall_conductivity_w_mk=1e6)
    r = solve(duct, _layers(d, f"k={k}"), Fluid(60.0, h_i), Surroundings(20.0),
              Surface(0.9, fixed_coefficient_w_m2k=h_e))
    p_i = 4 * side
    p_e = p_i + 8 * d
    want = 40.0 / (1 / (h_i * p_i) + 2 * d / (k * (p_i + p_e)) + 1 / (h_e * p_e))
    assert float(r.heat_flow) == pytest.approx(want, rel=1e-6)


def test_flat_face_plane_layer_closed_form():
    # Plane layer R = t/k in series with the sheet and a fixed outer coefficient (ASTM C680,
    # flat system; any heat-transfer text).
    t, k, tw, kw, h = 0.06, 0.045, 0.003, 45.0, 9.0
    r = solve(FlatWall(tw, kw, 2.0, "vertical"), _layers(t, f"k={k}"), Fluid(150.0), Surroundings(15.0),
              Surface(0.9, fixed_coefficient_w_m2k=h))
    want = 135.0 / (tw / kw + t / k + 1 / h)
    assert r.basis == "W/m²" and float(r.heat_flow_w_per_m2) == pytest.approx(want, rel=1e-9)
    assert float(r.surface_temp_c) == pytest.approx(15.0 + want / h, rel=1e-9)


def test_sun_with_fixed_coefficients_against_a_hand_energy_balance():
    # (Tf − Ts)/R + α·G = h·(Ts − Ta)  →  Ts = (Tf/R + α·G + h·Ta)/(1/R + h)  (hand balance).
    t, k, h, alpha, g = 0.05, 0.04, 10.0, 0.6, 800.0
    face = FlatWall(1e-9, 1e6, 1.0, "top")
    air = Surroundings(30.0, solar_irradiance_w_m2=g)
    r = solve(face, _layers(t, f"k={k}"), Fluid(5.0), air,
              Surface(0.9, fixed_coefficient_w_m2k=h, solar_absorptance=alpha))
    big_r = t / k
    ts = (5.0 / big_r + alpha * g + h * 30.0) / (1 / big_r + h)
    assert float(r.surface_temp_c) == pytest.approx(ts, rel=1e-9)
    assert float(r.heat_flow) == pytest.approx((5.0 - ts) / big_r, rel=1e-9)


def test_zero_sun_reproduces_the_no_sun_result():
    duct = RectangularDuct(0.6, 0.4)
    layers = _layers(np.array([0.025, 0.05]))
    plain = solve(duct, layers, Fluid(12.0), Surroundings(32.0), Surface(0.9))
    dark = solve(duct, layers, Fluid(12.0), Surroundings(32.0, solar_irradiance_w_m2=0.0),
                 Surface(0.9, solar_absorptance=0.9))
    np.testing.assert_array_equal(plain.heat_flow, dark.heat_flow)
    np.testing.assert_array_equal(plain.surface_temp_c, dark.surface_temp_c)


def test_sun_raises_a_chilled_duct_top_and_its_gain():
    duct = RectangularDuct(0.6, 0.4)
    layers = _layers(0.025)
    shade = solve(duct, layers, Fluid(12.0), Surroundings(32.0), Surface(0.9, solar_absorptance=0.6))
    sun = solve(duct, layers, Fluid(12.0), Surroundings(32.0, solar_irradiance_w_m2=800.0),
                Surface(0.9, solar_absorptance=0.6))
    top_shade, top_sun = shade.patches[0].result, sun.patches[0].result
    assert float(top_sun.surface_temp_c) > float(top_shade.surface_temp_c) + 5.0
    assert float(sun.heat_flow) < float(shade.heat_flow)  # more gain (more negative)
    # sides and bottom see no sun (overhead on a horizontal run) and share no wall with the top: unchanged
    assert float(sun.patches[2].result.surface_temp_c) == pytest.approx(float(shade.patches[2].result.surface_temp_c))


@settings(max_examples=60, deadline=None)
@given(w=st.floats(0.15, 2.0), ratio=st.floats(0.2, 1.0), fluid=st.floats(-10.0, 120.0), air=st.floats(-10.0, 40.0),
       t=st.floats(0.005, 0.15), wind=st.sampled_from([0.0, 2.0, 8.0]))
def test_section_invariants(w, ratio, fluid, air, t, wind):
    # Invariants: the whole is the sum of its patches; the governing surface is the coldest
    # exposed patch of a cold section and the hottest of a hot one; more insulation never
    # raises the heat flux of any patch (a plane has no critical radius).
    duct = RectangularDuct(w, max(w * ratio, w / 8.0))
    thick = np.array([t, t * 1.5])
    r = solve(duct, _layers(thick), Fluid(fluid), Surroundings(air, wind_speed_m_s=wind))
    total = sum(np.asarray(p.heat_flow) for p in r.patches)
    np.testing.assert_allclose(r.heat_flow, total, rtol=1e-12, atol=1e-12)
    temps = np.stack([p.result.surface_temp_c for p in r.patches])
    want = np.where(r.heat_flow >= 0, temps.max(axis=0), temps.min(axis=0))
    np.testing.assert_array_equal(r.surface_temp_c, want)
    for p in r.patches:
        flux = np.abs(np.asarray(p.result.outer_heat_flux_w_m2))
        assert flux[1] <= flux[0] * (1 + 1e-12) + 1e-12


def test_cli_duct_json_contract(run):
    code, out, err = run("check", "--duct", "600x400mm", "--fluid-temp", "13C", "--ambient-temp", "30C",
                         "--rh", "60", "--layer", "k=0.040:25mm", "--format", "json")
    assert code == 0, err
    d = json.loads(out)
    assert d["kind"] == "rectangular duct" and "heat_flow_w_per_m" in d
    assert [p["name"] for p in d["patches"]] == ["top", "sides", "bottom"]
    for p in d["patches"]:
        assert {"name", "area_m2_per_unit", "surface_temp_c", "heat_flow_w_per_m", "h_conv_w_m2k",
                "h_rad_w_m2k"} <= set(p)
    assert sum(p["heat_flow_w_per_m"] for p in d["patches"]) == pytest.approx(d["heat_flow_w_per_m"], abs=1e-6)
    assert d["surface_temp_c"] == min(p["surface_temp_c"] for p in d["patches"])  # cold: the coldest governs


def test_cli_face_json_and_us_text(run):
    code, out, _ = run("check", "--face", "vertical", "--height", "3m", "--fluid-temp", "180C",
                       "--layer", "mineral wool:80mm", "--format", "json")
    assert code == 0
    d = json.loads(out)
    assert "heat_flow_w_per_m2" in d and "heat_flow_w_per_m" not in d
    code, out, _ = run("check", "--face", "up", "--length", "4ft", "--fluid-temp", "350F", "--ambient-temp", "70F",
                       "--layer", "mineral wool:3in", "--units", "us")
    assert code == 0 and "Btu/(h·ft²)" in out and "horizontal, facing up" in out


@pytest.mark.parametrize("args, word", [
    (("--duct", "0x400mm"), "--duct"),
    (("--duct", "1000x100mm"), "--duct"),
    (("--face", "up", "--length", "2m", "--height", "2m"), "--height"),
    (("--face", "vertical"), "--height"),
    (("--duct", "600x400mm", "--pipe", "DN50"), "--duct"),
    (("--duct", "600x400mm", "--solar", "1500W/m2"), "--solar"),
])
def test_cli_bad_section_input_is_one_line(run, args, word):
    code, out, err = run("check", *args, "--fluid-temp", "40C", "--layer", "k=0.040:25mm")
    assert code == 2 and out == ""
    lines = [l for l in err.splitlines() if l.startswith("Error:")]
    assert lines and word in lines[0], err


def test_cli_vessel_parts_add_up_and_floor_is_stated(run):
    code, out, err = run("check", "--vessel", "vertical", "--diameter", "3m", "--length", "5m", "--floor", "ground:8C",
                         "--fluid-temp", "60C", "--ambient-temp", "10C", "--layer", "mineral wool:75mm",
                         "--format", "json")
    assert code == 0, err
    d = json.loads(out)
    assert d["kind"] == "vessel" and "heat_flow_w" in d
    assert [p["name"] for p in d["patches"]] == ["shell", "roof", "floor"]
    assert all("area_m2" in p for p in d["patches"])
    assert sum(p["heat_flow_w"] for p in d["patches"]) == pytest.approx(d["heat_flow_w"], abs=1e-6)
    floor = d["patches"][2]
    assert "ground at 8 °C" in floor["boundary"]
    # the floor (against the ground) never governs: the hottest exposed part does
    assert d["surface_temp_c"] == max(p["surface_temp_c"] for p in d["patches"][:2])
    # lumped contents: UA = Q/(T − Ta), time constant m·cp/UA (hand check of the shown numbers)
    assert d["ua_w_k"] == pytest.approx(d["heat_flow_w"] / 50.0, rel=1e-12)
    assert d["time_constant_s"] * d["ua_w_k"] == pytest.approx(d["contents_mass_kg"] * 4185.0, rel=0.01)


@pytest.mark.parametrize("args, word", [
    (("--vessel", "horizontal", "--diameter", "3m", "--length", "5m", "--floor", "air"), "--floor"),
    (("--vessel", "vertical", "--diameter", "3m"), "--length"),
    (("--vessel", "vertical", "--length", "3m"), "--diameter"),
    (("--heads", "2:1",), "--heads"),
    (("--vessel", "vertical", "--diameter", "3m", "--length", "4m", "--floor", "ground"), "--floor"),
    (("--vessel", "vertical", "--diameter", "3m", "--length", "4m", "--floor", "mud"), "--floor"),
])
def test_cli_bad_vessel_input_is_one_line(run, args, word):
    code, out, err = run("check", *args, "--fluid-temp", "40C", "--layer", "k=0.040:25mm")
    assert code == 2 and out == ""
    lines = [l for l in err.splitlines() if l.startswith("Error:")]
    assert lines and word in lines[0], err


def _least_mm(out, key):
    d = json.loads(out)
    crit = next(c for c in d["criteria"] if c["key"] == key)
    return crit


def test_size_duct_condensation_on_the_coldest_face_and_judged_at_night(run):
    base = ("size", "--duct", "600x400mm", "--fluid-temp", "13C", "--ambient-temp", "30C", "--rh", "80",
            "--material", "k=0.040", "--format", "json")
    code, shade, err = run(*base)
    assert code == 0, err
    code, sunny, err = run(*base, "--solar", "800W/m2", "--absorptance", "0.6")
    assert code == 0, err
    assert json.loads(shade)["criteria"] == json.loads(sunny)["criteria"]  # the sun does not cure it at night
    d = json.loads(shade)
    assert any(c["key"] == "condensation" for c in d["criteria"])


def test_size_duct_meets_condensation_on_every_face_by_resolving():
    # The least thickness the search finds keeps the coldest face 1 K above the dew point
    # (re-solved directly: surface − dew ≥ margin at the pick, < margin 0.5 mm thinner).
    from pipeins.criteria import Requirements
    from pipeins.line import LineSpec
    from pipeins.selection import select

    spec = LineSpec(duct="600x400mm", fluid_temp_c=13.0, air_temp_c=30.0, rh_percent=80.0)
    sel = select(spec, "k=0.040", Requirements(touch=False), None)
    least = next(c for c in sel.outcome.criteria if c.key == "condensation").required_m
    t = float(np.ravel(least)[0])
    duct = spec.build_section()
    at = solve(duct, _layers(np.array([t, t - 0.0005])), Fluid(13.0), Surroundings(30.0, relative_humidity_percent=80.0))
    coldest = np.min(np.stack([p.result.surface_temp_c for p in at.patches]), axis=0)
    assert coldest[0] - float(at.dew_point_c[0]) >= 1.0 - 1e-3
    assert coldest[1] - float(at.dew_point_c[1]) < 1.0


def test_sun_on_a_pipe_is_absorbed_on_its_projected_area():
    # A bare-ish pipe with a fixed coefficient: absorbed α·G·D per metre, spread over πD
    # (hand balance: (Tf − Ts)/R' + α·G·D = h·πD·(Ts − Ta), R' = ln(r2/r1)/(2πk)).
    import math

    from pipeins.model import Pipe

    d, t, k, h, alpha, g = 0.1, 0.03, 0.04, 10.0, 0.5, 900.0
    r = solve(Pipe(d, 0.004, 50.0), _layers(t, f"k={k}"), Fluid(6.0), Surroundings(30.0, solar_irradiance_w_m2=g),
              Surface(0.9, fixed_coefficient_w_m2k=h, solar_absorptance=alpha))
    d_o = d + 2 * t
    r_ins = math.log(d_o / d) / (2 * math.pi * k) + math.log(d / (d - 0.008)) / (2 * math.pi * 50.0)
    ts = (6.0 / r_ins + alpha * g * d_o + h * math.pi * d_o * 30.0) / (1 / r_ins + h * math.pi * d_o)
    assert float(r.surface_temp_c) == pytest.approx(ts, rel=1e-9)


def test_cost_of_a_vessel_prices_its_whole_heat_flow(run):
    # energy per year = W × 8760 h (the hours given); bare and insulated kept apart
    code, out, err = run("cost", "--vessel", "vertical", "--diameter", "3m", "--length", "5m", "--fluid-temp", "80C",
                         "--ambient-temp", "10C", "--layer", "mineral wool:75mm", "--energy-price", "0.08/kWh",
                         "--format", "json")
    assert code == 0, err
    d = json.loads(out)
    bare, ins = d["bare"], d["insulated"]
    assert "heat_flow_w_per_m" not in bare and bare["heat_flow_w"] > ins["heat_flow_w"] > 0
    code, chk, _ = run("check", "--vessel", "vertical", "--diameter", "3m", "--length", "5m", "--fluid-temp", "80C",
                       "--ambient-temp", "10C", "--layer", "mineral wool:75mm", "--format", "json")
    assert ins["heat_flow_w"] == pytest.approx(json.loads(chk)["heat_flow_w"], rel=1e-9)
    assert ins["heating"]["energy_j"] == pytest.approx(ins["heat_flow_w"] * 8760 * 3600, rel=1e-9)


def test_check_with_sun_reports_the_night_surface_and_its_sweating(run):
    args = ("check", "--pipe", "DN50", "--fluid-temp", "5C", "--ambient-temp", "30C", "--rh", "80",
            "--layer", "k=0.035:9mm", "--finish", "pvc jacket")
    code, plain, _ = run(*args, "--format", "json")
    code2, sunny, _ = run(*args, "--solar", "900W/m2", "--format", "json")
    assert code == code2 == 0
    plain, sunny = json.loads(plain), json.loads(sunny)
    assert sunny["surface_temp_c"] > plain["surface_temp_c"]        # by day the sun warms the jacket
    assert sunny["night_surface_temp_c"] == pytest.approx(plain["surface_temp_c"], abs=1e-9)  # at night: no sun
    assert any("at night" in w and "sweat" in w for w in sunny["warnings"])


@pytest.mark.parametrize("args, word", [
    (("--duct", "24x16", "--units", "us"), "--duct"),     # a bare duct size: the unit must be written
    (("--duct", "600x400"), "--duct"),
])
def test_bare_duct_size_is_refused(run, args, word):
    code, out, err = run("check", *args, "--fluid-temp", "40C", "--layer", "k=0.040:25mm")
    assert code == 2 and out == "" and err.startswith(f"Error: {word}")


def test_vessel_sizes_and_floor_temperature_follow_the_unit_system(run):
    # --units us: bare diameter and length in feet, the ground temperature in °F (pint-free hand conversion)
    code, out, err = run("check", "--vessel", "vertical", "--diameter", "10", "--length", "16", "--floor", "ground:40",
                         "--fluid-temp", "100F", "--ambient-temp", "70F", "--layer", "mineral wool:2in",
                         "--units", "us", "--format", "json")
    assert code == 0, err
    d = json.loads(out)
    floor = next(p for p in d["patches"] if p["name"] == "floor")
    assert "4.4" in floor["boundary"]  # 40 °F = 4.44 °C
    code, out, _ = run("check", "--vessel", "vertical", "--diameter", "3.048m", "--length", "4.8768m",
                       "--floor", "ground:4.444444444444445C", "--fluid-temp", "100F", "--ambient-temp", "70F",
                       "--layer", "mineral wool:2in", "--format", "json")
    assert json.loads(out)["heat_flow_w"] == pytest.approx(d["heat_flow_w"], rel=1e-9)


def test_sun_does_not_reach_a_face_looking_down(run):
    base = ("check", "--face", "down", "--length", "2m", "--fluid-temp", "40C", "--layer", "k=0.040:25mm",
            "--format", "json")
    code, a, _ = run(*base)
    code, b, _ = run(*base, "--solar", "800", "--absorptance", "0.5")
    assert json.loads(a)["surface_temp_c"] == json.loads(b)["surface_temp_c"]


def test_json_names_follow_the_basis(run):
    # a sphere's heat flow and residual are in W, and it keeps its outer diameter (50 mm on a 2 m sphere)
    code, out, _ = run("check", "--sphere", "2m", "--fluid-temp", "80C", "--layer", "mineral wool:50mm",
                       "--format", "json")
    d = json.loads(out)
    assert code == 0 and "heat_flow_w" in d and "residual_w" in d
    assert "heat_flow_w_per_m" not in d and "residual_w_per_m" not in d
    assert d["outer_diameter_m"] == pytest.approx(2.1, rel=1e-12)
