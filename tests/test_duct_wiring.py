"""Ducts through the front door: the inside air film, the air along the run, the duct
criteria of ``size``, the duct table (issue 10 §2, §5).

References outside the project: CoolProp's dry air (density, viscosity, conductivity, c_p);
``ht.conv_internal.turbulent_Gnielinski`` (Gnielinski 1976) with Filonenko's smooth-tube
friction factor f = (1.82·log10 Re − 1.64)⁻² (from memory, as in Incropera et al., 6th ed.,
Eq. 8.21); the closed-form exponential of a run with a fixed conductance (any
heat-transfer text: T(L) = T_a + (T_0 − T_a)·exp(−UA'·L/(ṁ·c_p))); the plane-layer
resistance R = t/k (ASTM C680).
"""

from __future__ import annotations

import json
import math

import numpy as np
import pytest

from pipeins.line import LineSpec

DUCT = ("--duct", "600x400mm", "--fluid-temp", "14C", "--ambient-temp", "30C")


def _json(run, *args):
    code, out, err = run(*args, "--format", "json")
    assert code == 0, err
    return json.loads(out)


# ----------------------------------------------------------------------------- inner film
def _coolprop_air(temp_c, pressure_pa=101325.0):
    from CoolProp.CoolProp import PropsSI

    t = temp_c + 273.15
    return {k: PropsSI(k, "T", t, "P", pressure_pa, "Air") for k in ("D", "V", "L", "C")}


@pytest.mark.parametrize("duct, inside, velocity", [("600x400mm", (0.5984, 0.3984), 5.0),
                                                    ("450mm", (0.4484, None), 7.0)])
def test_inner_film_is_gnielinski_on_the_hydraulic_diameter(duct, inside, velocity):
    """Reference: ht's Gnielinski (1976) with Filonenko's friction factor, CoolProp air
    properties at 14 °C, on the inside dimensions (0.8 mm sheet)."""
    from ht.conv_internal import turbulent_Gnielinski

    spec = LineSpec(duct=duct, layers=(("k=0.040", 0.025),), fluid_temp_c=14.0, air_temp_c=30.0,
                    velocity_m_s=velocity)
    fluid = spec.build_model()[2]
    w, h = inside
    d_h = w if h is None else 2 * w * h / (w + h)
    air = _coolprop_air(14.0)
    re = air["D"] * velocity * d_h / air["V"]
    pr = air["C"] * air["V"] / air["L"]
    fd = (1.82 * math.log10(re) - 1.64) ** -2
    expected = turbulent_Gnielinski(re, pr, fd) * air["L"] / d_h
    assert fluid.name == "air"
    assert float(fluid.film_coefficient_w_m2k) == pytest.approx(expected, rel=0.01)


def test_inner_film_from_flow_equals_the_film_at_the_mean_velocity():
    """1500 cfm = 0.70792 m³/s (1 ft³ = 0.0283168 m³, NIST SP 811) over the inside area."""
    from pipeins.units import parse_quantity

    flow = LineSpec(duct="600x400mm", fluid_temp_c=14.0, air_temp_c=30.0, layers=(("k=0.040", 0.025),),
                    flow=parse_quantity("1500 cfm", "flow", units="us")).build_model()[2]
    velocity = 1500 * 0.028316846592 / 60 / (0.5984 * 0.3984)
    speed = LineSpec(duct="600x400mm", fluid_temp_c=14.0, air_temp_c=30.0, layers=(("k=0.040", 0.025),),
                     velocity_m_s=velocity).build_model()[2]
    assert float(flow.film_coefficient_w_m2k) == pytest.approx(float(speed.film_coefficient_w_m2k), rel=1e-9)


def test_a_duct_without_fluid_is_air(run):
    code, out, _ = run("check", *DUCT, "--layer", "mineral wool:25mm", "--velocity", "5m/s")
    assert code == 0 and "air at 14.0 °C; inner film 14.1" in out


@pytest.mark.parametrize("args, line", [
    (("check", *DUCT, "--fluid", "water", "--flow", "1m3/s", "--layer", "mineral wool:25mm"),
     'Error: --fluid: "water" in a duct: the inside film of a duct is worked out for air only; leave fluid out '
     '(air) or give --inner-h'),
    (("check", "--face", "vertical", "--height", "2m", "--fluid-temp", "14C", "--ambient-temp", "30C",
      "--layer", "mineral wool:25mm", "--flow", "1m3/s"),
     "Error: --flow: a face has no computed inside film; give the inside film coefficient --inner-h instead"),
    (("check", "--sphere", "2m", "--fluid-temp", "14C", "--ambient-temp", "30C",
      "--layer", "mineral wool:25mm", "--velocity", "1m/s"),
     "Error: --velocity: a sphere has no computed inside film; give the inside film coefficient --inner-h "
     "instead"),
    (("check", *DUCT, "--layer", "mineral wool:25mm", "--flow", "5cfm", "--length", "300m"),
     "Error: --flow: an air flow of 0.002902 kg/s is too small for 300 m of duct: the air comes within 1 % of "
     "the surrounding temperature after about 58.7 m; give a larger flow, a shorter run or more insulation"),
])
def test_bad_duct_flow_input_is_one_line(run, tmp_path, args, line):
    target = tmp_path / "out.json"
    code, out, err = run(*args, "--output", str(target))
    assert (code, out, err.splitlines()) == (2, "", [line])
    assert list(tmp_path.iterdir()) == []


# ----------------------------------------------------------------------------- the run
@pytest.mark.parametrize("units, length, flow", [("si", "40m", "0.6kg/s"), ("us", "131.2ft", "1.322lb/s")])
def test_leaving_air_matches_the_closed_form_exponential(run, units, length, flow):
    """A fixed outer coefficient and a constant k make q' = UA'(T − T_a) exactly linear, so
    the leaving air follows the closed form; UA' from the CLI's own heat flow at the entry,
    c_p of dry air from CoolProp at the mean air temperature."""
    d = _json(run, "check", *DUCT, "--layer", "k=0.040:25mm", "--outer-h", "8",
              "--length", length, "--flow", flow, "--units", units)
    mdot = d["mass_flow_kg_s"]
    length_m = 40.0 if units == "si" else 131.2 * 0.3048
    assert mdot == pytest.approx(0.6 if units == "si" else 1.322 * 0.45359237, rel=1e-9)
    ua = d["heat_flow_w_per_m"] / (14.0 - 30.0)
    leaving = d["leaving_temp_c"]
    cp = _coolprop_air(0.5 * (14.0 + leaving))["C"]
    expected = 30.0 + (14.0 - 30.0) * math.exp(-ua * length_m / (mdot * cp))
    assert leaving == pytest.approx(expected, abs=0.01)
    assert d["temp_change_k"] == pytest.approx(leaving - 14.0, abs=1e-12)
    # the heat over the run is the air's enthalpy rise: a gain, reported apart
    assert d["heat_gain_w"] == pytest.approx(mdot * cp * (leaving - 14.0), rel=2e-3)
    assert "heat_loss_w" not in d and d["heat_flow_w"] < 0


# ----------------------------------------------------------------------------- criteria in size
SIZE = ("size", "--duct", "600x400mm", "--fluid-temp", "13C", "--ambient-temp", "32C", "--rh", "70",
        "--material", "k=0.040", "--length", "40m", "--flow", "1500cfm")


def _required_m(d, key):
    return next(c["required_mm"] for c in d["criteria"] if c["key"] == key) / 1000.0


def _at(t, **more):
    from pipeins.units import parse_quantity

    return LineSpec(duct="600x400mm", fluid_temp_c=13.0, air_temp_c=32.0, rh_percent=70.0,
                    layers=(("k=0.040", t),), length_m=40.0, flow=parse_quantity("1500 cfm", "flow"), **more)


def _air_change(t):
    from pipeins.sections import duct_air_run

    spec = _at(t)
    run, _ = duct_air_run(spec, spec.solve())
    return abs(float(run.temp_change_k))


def test_sized_for_the_air_temperature_change_meets_it_when_re_solved(run):
    d = _json(run, *SIZE, "--max-temp-change", "1K")
    t = _required_m(d, "temp_change")
    assert _air_change(t) == pytest.approx(1.0, abs=2e-3)
    assert _air_change(0.9 * t) > 1.0


def test_heat_flux_cap_holds_on_the_worst_face_when_re_solved(run):
    from pipeins.sections import worst_patch_flux_w_m2

    d = _json(run, *SIZE, "--max-heat-flux", "8W/m2")
    t = _required_m(d, "heat_flux")
    result = _at(t).solve()
    faces = [abs(float(p.result.outer_heat_flux_w_m2)) for p in result.patches]
    assert float(worst_patch_flux_w_m2(result)) == pytest.approx(8.0, rel=2e-3) == max(faces)
    assert abs(float(result.outer_heat_flux_w_m2)) < 8.0  # the mean is below: the worst face governs


def test_heat_flow_cap_per_metre_holds_when_re_solved(run):
    d = _json(run, *SIZE, "--max-heat-flow", "15W/m")
    t = _required_m(d, "heat_flow")
    assert abs(float(_at(t).solve().heat_flow_w_per_m)) == pytest.approx(15.0, rel=2e-3)


def test_condensation_on_the_coldest_face_when_re_solved(run):
    """Dew point of air at 32 °C, 70 % by psychrolib (ASHRAE Handbook Fundamentals, ch. 1)."""
    import psychrolib

    psychrolib.SetUnitSystem(psychrolib.SI)
    dew = psychrolib.GetTDewPointFromRelHum(32.0, 0.70)
    d = _json(run, *SIZE)
    t = _required_m(d, "condensation")
    coldest = min(float(p.result.surface_temp_c) for p in _at(t).solve().patches)
    assert coldest == pytest.approx(dew + 1.0, abs=0.02)


def test_touch_on_a_hot_duct_when_re_solved(run):
    d = _json(run, "size", "--duct", "450mm", "--fluid-temp", "150C", "--ambient-temp", "20C",
              "--material", "k=0.040", "--touch-limit", "45C")
    t = _required_m(d, "surface_temp")
    spec = LineSpec(duct="450mm", fluid_temp_c=150.0, air_temp_c=20.0, layers=(("k=0.040", t),))
    assert float(spec.solve().surface_temp_c) == pytest.approx(45.0, abs=0.02)


@pytest.mark.parametrize("location, zone, r_ip", [("outdoors", "5A", 12.0), ("unconditioned", "3", 6.0),
                                                  ("outdoors", "2", 8.0)])
def test_duct_code_minimum_meets_the_rule_r_value(run, location, zone, r_ip):
    """R-values of IECC 2018 C403.11.1 (from memory); 1 h·ft²·°F/Btu = 0.1761102 m²·K/W
    (NIST SP 811); R = t/k at the 75 °F rating mean temperature (ASTM C680 plane layer)."""
    d = _json(run, *SIZE, "--code", "iecc-2018-c403", "--duct-location", location, "--climate-zone", zone)
    t = _required_m(d, "code")
    assert t / 0.040 >= r_ip * 0.1761102 * (1 - 1e-4)
    assert t / 0.040 == pytest.approx(r_ip * 0.1761102, rel=1e-3)
    assert d["selected_thickness_mm"] / 1000 >= t


@pytest.mark.parametrize("extra, line", [
    (("--code", "iecc-2018-c403", "--climate-zone", "5A"),
     "Error: --duct-location: a duct code minimum needs where the duct runs: conditioned, unconditioned, "
     "outdoors, envelope"),
    (("--code", "iecc-2018-c403", "--duct-location", "outdoors"),
     "Error: --climate-zone: a duct code minimum needs the climate zone, e.g. 4 or 5A"),
    (("--code", "iecc-2018-c403", "--duct-location", "roof", "--climate-zone", "4"),
     'Error: --duct-location: unknown duct location "roof"; use conditioned or unconditioned or outdoors or '
     'envelope'),
    (("--code", "ashrae-90.1-2019", "--duct-location", "outdoors", "--climate-zone", "4"),
     'Error: --code: "ashrae-90.1-2019" is not a duct rule set; for a duct use iecc-2018-c403'),
    (("--max-heat-flux", "-5W/m2"), None),
])
def test_bad_duct_sizing_input_is_one_line(run, tmp_path, extra, line):
    target = tmp_path / "out.json"
    code, out, err = run(*SIZE, *extra, "--output", str(target))
    assert code == 2 and out == "" and len(err.splitlines()) == 1 and err.startswith("Error: ")
    if line is not None:
        assert err.splitlines() == [line]
    else:
        assert "--max-heat-flux" in err
    assert list(tmp_path.iterdir()) == []


# ----------------------------------------------------------------------------- the duct table
TABLE = ("table", "--fluid-temp", "13C", "--ambient-temp", "32C", "--rh", "70", "--material", "k=0.040",
         "--length", "40m", "--flow", "1.2kg/s")


def test_duct_table_rows_equal_one_duct_sized_alone(run):
    """One vectorised pass over the sizes gives, row by row, what size gives for each duct."""
    d = _json(run, *TABLE, "--ducts", "300x200mm, 600x400mm, 1000x500mm", "--max-temp-change", "2K",
              "--max-heat-flux", "10W/m2")
    rows = d["rows"] if "rows" in d else d["sizes"]
    assert [r["size"] for r in rows] == ["rectangular duct 300x200mm", "rectangular duct 600x400mm",
                                         "rectangular duct 1000x500mm"]
    for text, row in zip(("300x200mm", "600x400mm", "1000x500mm"), rows):
        one = _json(run, "size", "--duct", text, *TABLE[1:], "--max-temp-change", "2K", "--max-heat-flux", "10W/m2")
        for key in ("condensation", "heat_flux", "temp_change"):
            assert row["required_thickness_mm"][key] == pytest.approx(_required_m(one, key) * 1000, abs=0.01)
        assert row["selected_thickness_mm"] == one["selected_thickness_mm"]


def test_round_duct_table_from_the_catalogue_range(run):
    from pipeins.catalog.ducts import round_duct_sizes

    d = _json(run, *TABLE, "--ducts", "round:200..800mm", "--code", "iecc-2018-c403", "--duct-location",
              "unconditioned", "--climate-zone", "4")
    rows = d["rows"] if "rows" in d else d["sizes"]
    expected = [x for x in round_duct_sizes("mm") if 0.2 - 1e-9 <= x <= 0.8 + 1e-9]
    assert len(rows) == len(expected) > 3
    for row in rows:  # R-6 (IECC 2018 C403.11.1, from memory) = 1.0567 m²·K/W at k 0.040
        assert row["required_thickness_mm"]["code"] == pytest.approx(6 * 0.1761102 * 0.040 * 1000, abs=0.01)


@pytest.mark.parametrize("args, line", [
    (("--ducts", "300x200mm, 450mm", "--max-heat-flux", "10W/m2"),
     "Error: --ducts: one table holds round or rectangular ducts, not both"),
    (("--ducts", "round:200..800", "--max-heat-flux", "10W/m2"),
     'Error: --ducts: "round:200..800" is not a round-duct range; use e.g. round:200..800mm or round:6..24in'),
    (("--ducts", "300x0mm", "--max-heat-flux", "10W/m2"),
     'Error: --ducts: "300x0mm": every duct side must be greater than zero; use e.g. 600x400mm, 24x16in, 450mm '
     'or 18in'),
    (("--ducts", "300x200mm", "--sizes", "DN50", "--max-heat-flux", "10W/m2"),
     "Error: --sizes: give the pipe sizes (--sizes) or the duct sizes (--ducts), one of them"),
])
def test_bad_duct_table_input_is_one_line(run, tmp_path, args, line):
    target = tmp_path / "t.csv"
    code, out, err = run(*TABLE, *args, "--format", "csv", "--output", str(target))
    assert (code, out, err.splitlines()) == (2, "", [line])
    assert list(tmp_path.iterdir()) == []


# ----------------------------------------------------------------------------- every format, both unit systems
FORMATS = [(u, c, f) for c in ("check", "size") for u, fmts in
           (("si", ("text", "json", "csv", "markdown", "html", "xlsx")), ("us", ("text", "json", "xlsx")))
           for f in fmts]


@pytest.mark.parametrize("units, command, fmt", FORMATS)
def test_duct_check_and_size_in_every_format(run, tmp_path, units, command, fmt):
    duct = "600x400mm" if units == "si" else "24x16in"
    args = [command, "--duct", duct, "--fluid-temp", "13C" if units == "si" else "55F",
            "--ambient-temp", "32C" if units == "si" else "90F", "--rh", "70",
            "--length", "40m" if units == "si" else "130ft", "--flow", "1.2kg/s" if units == "si" else "1500cfm",
            "--units", units, "--format", fmt]
    args += ["--layer", "mineral wool:25mm"] if command == "check" else ["--material", "mineral wool",
                                                                          "--max-temp-change",
                                                                    "1K" if units == "si" else "2F"]
    if fmt == "xlsx":
        target = tmp_path / "out.xlsx"
        code, out, err = run(*args, "--output", str(target))
        assert code == 0, err
        from openpyxl import load_workbook

        text = " ".join(str(c.value) for ws in load_workbook(target) for row in ws.iter_rows() for c in row
                        if c.value is not None)
    else:
        code, text, err = run(*args)
        assert code == 0, err
    assert "leaving" in text.lower() or (fmt == "csv" and "rectangular duct" in text)
    if fmt == "json":
        d = json.loads(text)
        check = d if command == "check" else d["result"]
        assert "heat_flow_w_per_m" in json.dumps(check) and "patches" in json.dumps(check)
    if units == "us" and fmt == "text":
        assert "°F" in text


def test_the_film_notes_travel_with_the_fluid():
    """Re on D_h = 0.479 m at 0.05 m/s is about 1600 (CoolProp air at 14 °C): laminar."""
    fluid = LineSpec(duct="600x400mm", fluid_temp_c=14.0, air_temp_c=30.0, layers=(("k=0.040", 0.025),),
                     velocity_m_s=0.05).build_model()[2]
    air = _coolprop_air(14.0)
    assert air["D"] * 0.05 * (2 * 0.5984 * 0.3984 / (0.5984 + 0.3984)) / air["V"] < 2300
    assert any(n.code == "film.duct_inner.range" and "laminar air flow" in n.word("what") for n in fluid.film_notes)


def test_duct_table_names_its_size_column(run):
    code, out, _ = run(*TABLE, "--ducts", "24x16in, 36x24in", "--units", "us")
    assert code == 0 and "perimeter/π [in]" in out and "OD" not in out.split("Cautions")[0]


def test_duct_temperature_change_without_a_length_is_one_line(run):
    code, out, err = run("size", "--duct", "450mm", "--fluid-temp", "13C", "--ambient-temp", "32C",
                         "--material", "mineral wool", "--velocity", "5m/s", "--max-temp-change", "1K")
    assert (code, out, err.splitlines()) == (2, "", [
        "Error: --max-temp-change: the air temperature change along a duct needs --length and the air flow or "
        "--velocity"])
