"""Buried lines in a project file and the schedule (pipeins.schedule_buried).

Checks against sources outside the code: the schedule's buried heat flow against a hand series
calculation R_wall + R_insulation + R_soil, the soil's resistance from
``ht.conduction.S_isothermal_pipe_to_plane`` (the shape factor 2πL/acosh(2z/D) of an isothermal
cylinder under an isothermal plane, Incropera et al., Fundamentals of Heat and Mass Transfer,
(6th ed.), Table 4.1, case 2, from memory); a pair of pipes in one trench against the same hand resistances with the
mutual resistance of a line source and its image in the ground surface,
ln(sqrt(1 + (2z/E)²))/(2π k) (Wallentén 1991, from memory), solved as a 2×2 system by numpy.
Consistency: a buried line in a project gives the very heat flow ``check --buried`` gives for the
same inputs (the same model through the other front end).
"""

from __future__ import annotations

import csv
import json
import math

import numpy as np
import pytest

import ht.conduction as ht_conduction

HEAD = """\
[project]
name = "Fernwood Common heat loop (invented)"
units = "si"

[conditions.site]
air = "-5 C"
wind = "3 m/s"
"""

SERVICE = """
[services.flow]
temperature = "90 C"
material = "{material}"
{extra}
"""

LINE = """
[[lines]]
tag = "{tag}"
service = "flow"
size = "{size}"
length = "{length}"
condition = "site"
{extra}
"""


def _project(tmp_path, service_extra, lines, material="polyisocyanurate foam", name="loop.toml"):
    text = HEAD + SERVICE.format(material=material, extra=service_extra)
    for tag, size, length, extra in lines:
        text += LINE.format(tag=tag, size=size, length=length, extra=extra)
    path = tmp_path / name
    path.write_text(text, encoding="utf-8")
    return path


def _schedule(run, path, *extra):
    code, out, err = run("schedule", str(path), "--format", "json", *extra)
    assert code == 0, err
    return json.loads(out)


BURIED = 'buried = "0.8 m"\nsoil = "moist sand"\nground_temp = "8 C"\n'


# -- the same line through check --buried and the project file ------------------------------
def test_buried_line_equals_check_buried(run, tmp_path):
    path = _project(tmp_path, BURIED + 'criteria = ["heat_flow"]\nmax_heat_flow = "40 W/m"',
                    [("B-1", "DN100", "120 m", 'thickness = "60 mm"')])
    line = _schedule(run, path)["lines"][0]
    code, out, err = run("check", "--pipe", "DN100", "--fluid-temp", "90C", "--layer", "polyisocyanurate foam:60mm",
                         "--buried", "0.8m", "--soil", "moist sand", "--ground-temp", "8C", "--ambient-temp", "-5C",
                         "--format", "json")
    assert code == 0, err
    check = json.loads(out)
    assert line["heat_flow_w_per_m"] == check["heat_flow_w_per_m"]
    assert line["surface_temp_c"] == check["surface_temp_c"]
    assert line["burial_depth_m"] == 0.8 and line["pair"] is None
    assert line["heat_flow_w"] == pytest.approx(check["heat_flow_w_per_m"] * 120.0, rel=1e-9)


def test_side_by_side_pair_equals_check_twin(run, tmp_path):
    path = _project(tmp_path, BURIED + 'twin_spacing = "0.6 m"\nreturn_temp = "50 C"\ncriteria = ["heat_flow"]\n'
                                       'max_heat_flow = "40 W/m"',
                    [("P-1", "DN150", "80 m", 'thickness = "100 mm"')])
    data = _schedule(run, path)
    supply, back = data["lines"]
    code, out, err = run("check", "--pipe", "DN150", "--fluid-temp", "90C", "--layer", "polyisocyanurate foam:100mm",
                         "--buried", "0.8m", "--soil", "moist sand", "--ground-temp", "8C", "--twin-spacing", "0.6m",
                         "--return-temp", "50C", "--format", "json")
    assert code == 0, err
    twin = json.loads(out)["twin"]
    # check takes each pipe's own resistance from its reported (9-decimal) heat flow: 1e-9 apart
    assert supply["heat_flow_w_per_m"] == pytest.approx(twin["supply_heat_flow_w_per_m"], rel=1e-9)
    assert back["heat_flow_w_per_m"] == pytest.approx(twin["return_heat_flow_w_per_m"], rel=1e-9)
    assert (back["tag"], back["pair"], supply["pair"]) == ("P-1 return", "P-1", "P-1 return")


def test_twin_casing_equals_check_twin_casing(run, tmp_path):
    extra = (BURIED.replace("0.8 m", "0.9 m") + 'twin_casing = "315 mm"\ntwin_spacing = "150 mm"\n'
             'return_temp = "45 C"\ncasing_insulation = "polyisocyanurate foam"')
    path = _project(tmp_path, extra, [("C-1", "DN65", "200 m", "")], material="mineral wool")
    data = _schedule(run, path)
    supply, back = data["lines"]
    code, out, err = run("check", "--pipe", "DN65", "--fluid-temp", "90C", "--buried", "0.9m", "--soil",
                         "moist sand", "--ground-temp", "8C", "--twin-casing", "315mm", "--twin-spacing", "150mm",
                         "--return-temp", "45C", "--casing-insulation", "polyisocyanurate foam", "--format", "json")
    assert code == 0, err
    twin = json.loads(out)["twin_casing"]
    assert supply["heat_flow_w_per_m"] == pytest.approx(twin["supply_heat_flow_w_per_m"], rel=1e-9)
    assert back["heat_flow_w_per_m"] == pytest.approx(twin["return_heat_flow_w_per_m"], rel=1e-9)
    # the casing fixes the build-up: the reference thickness of the supply centred in it
    assert supply["thickness_m"] == pytest.approx((0.315 - 0.0761) / 2, abs=1e-9)
    # no criteria listed: the defaults leave out what does not apply in the soil, and say nothing
    assert data["warnings"] == []
    # listed: each criterion that does not apply is said
    path.write_text(path.read_text().replace('material = "mineral wool"',
                                             'material = "mineral wool"\ncriteria = ["touch", "condensation"]'))
    texts = " ".join(_schedule(run, path)["warnings"])
    assert "touch safety: not applicable to a buried line" in texts
    assert "condensation control: not applicable to a buried line" in texts


# -- against a hand series calculation -----------------------------------------------------
K_INS, DEPTH, K_SOIL, GROUND, FLUID = 0.030, 1.1, 1.3, 6.0, 85.0


def _hand_resistances(od, wall, thickness, k_wall):
    """R_wall + R_insulation of one pipe [m·K/W] (cylindrical shells, no inner film) and the
    soil's, 1/(S k) with S from ht.conduction.S_isothermal_pipe_to_plane."""
    ri, ro = od / 2 - wall, od / 2
    r_own = math.log(ro / ri) / (2 * math.pi * k_wall) + math.log((ro + thickness) / ro) / (2 * math.pi * K_INS)
    s = ht_conduction.S_isothermal_pipe_to_plane(od + 2 * thickness, DEPTH, 1.0)
    return r_own, 1.0 / (s * K_SOIL)


def _pipe(size):
    from pipeins.catalog.pipes import lookup_pipe
    from pipeins.line import LineSpec

    pipe = LineSpec(pipe=size, fluid_temp_c=FLUID).build_pipe()
    return lookup_pipe(size).outer_diameter_m, float(np.ravel(pipe.wall_m)[0]), float(pipe.wall_conductivity_w_mk)


HAND = (f'buried = "{DEPTH} m"\nsoil_k = {K_SOIL}\nground_temp = "{GROUND} C"\n')


def test_heat_flow_against_hand_series_calculation(run, tmp_path):
    path = _project(tmp_path, HAND.replace("85", "") + 'criteria = ["heat_flow"]\nmax_heat_flow = "60 W/m"',
                    [("H-1", "DN80", "50 m", 'thickness = "50 mm"'), ("H-2", "DN200", "30 m", 'thickness = "80 mm"')],
                    material=f"k={K_INS}")
    text = path.read_text().replace('temperature = "90 C"', f'temperature = "{FLUID} C"')
    path.write_text(text)
    lines = _schedule(run, path)["lines"]
    for line, size, t in zip(lines, ("DN80", "DN200"), (0.05, 0.08)):
        od, wall, k_wall = _pipe(size)
        r_own, r_soil = _hand_resistances(od, wall, t, k_wall)
        assert line["heat_flow_w_per_m"] == pytest.approx((FLUID - GROUND) / (r_own + r_soil), rel=1e-8)
        # the casing surface: the ground plus the heat flow through the soil
        assert line["surface_temp_c"] == pytest.approx(GROUND + line["heat_flow_w_per_m"] * r_soil, rel=1e-8)


def test_sized_for_a_heat_flow_cap_in_the_soil(run, tmp_path):
    # the least series thickness whose buried heat flow (hand series calculation) is within the cap
    cap = 18.0
    path = _project(tmp_path, HAND + f'criteria = ["heat_flow"]\nmax_heat_flow = "{cap} W/m"\nseries = "mm_pipe_section"',
                    [("S-1", "DN100", "100 m", "")], material=f"k={K_INS}")
    path.write_text(path.read_text().replace('temperature = "90 C"', f'temperature = "{FLUID} C"'))
    line = _schedule(run, path)["lines"][0]
    from pipeins.catalog.series import thickness_series_m

    series = thickness_series_m("mm_pipe_section")
    od, wall, k_wall = _pipe("DN100")
    q = [(FLUID - GROUND) / sum(_hand_resistances(od, wall, t, k_wall)) for t in series]
    least = next(t for t, qq in zip(series, q) if qq <= cap)
    assert line["thickness_m"] == pytest.approx(least)
    assert line["heat_flow_w_per_m"] <= cap


def test_pair_apart_against_hand_mutual_resistance_and_totals(run, tmp_path):
    # a chilled-water pair: supply colder than the ground (gains heat), return warmer (loses it)
    spacing, ret = 0.5, 14.0
    extra = (f'buried = "{DEPTH} m"\nsoil_k = {K_SOIL}\nground_temp = "12 C"\ntwin_spacing = "{spacing} m"\n'
             f'return_temp = "{ret} C"\ncriteria = ["heat_flow"]\nmax_heat_flow = "30 W/m"')
    path = _project(tmp_path, extra, [("CH-1", "DN150", "200 m", 'thickness = "40 mm"')], material=f"k={K_INS}")
    path.write_text(path.read_text().replace('temperature = "90 C"', 'temperature = "6 C"'))
    data = _schedule(run, path)
    supply, back = data["lines"]
    od, wall, k_wall = _pipe("DN150")
    r_own, r_soil = _hand_resistances(od, wall, 0.04, k_wall)
    r_m = math.log(math.sqrt(1 + (2 * DEPTH / spacing) ** 2)) / (2 * math.pi * K_SOIL)
    m = np.array([[r_own + r_soil, r_m], [r_m, r_own + r_soil]])
    q1, q2 = np.linalg.solve(m, np.array([6.0 - 12.0, ret - 12.0]))
    assert supply["heat_flow_w_per_m"] == pytest.approx(q1, rel=1e-8)
    assert back["heat_flow_w_per_m"] == pytest.approx(q2, rel=1e-8)
    # each casing surface beside the other pipe (the same hand 2×2 system): T_fluid − q_pair·R_own,
    # equivalently the ground + q_own·R_s + q_other·R_m
    assert supply["surface_temp_c"] == pytest.approx(6.0 - q1 * r_own, rel=1e-8)
    assert supply["surface_temp_c"] == pytest.approx(12.0 + q1 * r_soil + q2 * r_m, rel=1e-8)
    assert back["surface_temp_c"] == pytest.approx(ret - q2 * r_own, rel=1e-8)
    items = {i["tag"]: i for i in data["buried"]["items"]}
    assert items["CH-1 return"]["casing_temp_c"] == pytest.approx(12.0 + q2 * r_soil + q1 * r_m, rel=1e-8)
    # the supply gains heat and the return loses it: the pair's directions differ, said once
    notes = [n for n in data["notes"] if n["code"] == "buried.pair_directions_differ"] if "notes" in data else [
        w for w in data["warnings"] if "lie on either side of the ground" in w]
    assert len(notes) == 1
    assert supply["heat_gain_w"] > 0 and supply["heat_loss_w"] == 0
    assert back["heat_loss_w"] > 0 and back["heat_gain_w"] == 0
    totals = data["totals"]
    assert totals["heat_loss_w"]["insulated"] == pytest.approx(back["heat_flow_w"], rel=1e-9)   # lines: 9 decimals
    assert totals["heat_gain_w"]["insulated"] == pytest.approx(-supply["heat_flow_w"], rel=1e-9)
    items = {i["tag"]: i for i in data["buried"]["items"]}
    assert items["CH-1"]["role"] == "supply" and items["CH-1 return"]["role"] == "return"
    assert items["CH-1"]["arrangement"] == "side by side"


def test_totals_add_up_and_basis_states_the_soil(run, tmp_path):
    path = _project(tmp_path, BURIED + 'twin_spacing = "0.6 m"\nreturn_temp = "50 C"\ncriteria = ["heat_flow"]\n'
                                       'max_heat_flow = "25 W/m"',
                    [("A", "DN100", "100 m", ""), ("B", "DN150", "60 m", 'soil = "dry clay"')])
    data = _schedule(run, path)
    lines = data["lines"]
    assert [l["tag"] for l in lines] == ["A", "A return", "B", "B return"]
    assert data["totals"]["heat_loss_w"]["insulated"] == pytest.approx(sum(l["heat_loss_w"] for l in lines), rel=1e-9)
    assert data["totals"]["heat_loss_w"]["bare"] == pytest.approx(sum(l["bare_heat_loss_w"] for l in lines), rel=1e-9)
    basis = data["buried"]["basis"]
    assert basis["flow"]["soil_name"] == "sand, moist" and basis["flow"]["soil_k_w_mk"] == 1.5
    assert "from memory" in basis["flow"]["soil_source"]
    assert basis["flow (dry clay)"]["soil_k_w_mk"] == 0.6 and basis["flow"]["ground_temp_c"] == 8.0


def test_every_format_carries_the_buried_tables(run, tmp_path):
    path = _project(tmp_path, BURIED + 'twin_spacing = "0.6 m"\nreturn_temp = "50 C"\ncriteria = ["heat_flow"]\n'
                                       'max_heat_flow = "25 W/m"', [("A", "DN100", "100 m", "")])
    code, out, err = run("schedule", str(path))
    assert code == 0, err
    assert "Buried lines" in out and "Buried lines: basis" in out and "buried at" in out and "A return" in out
    code, out, err = run("schedule", str(path), "--format", "markdown")
    assert code == 0 and "Buried lines" in out and "sand, moist" in out
    code, out, err = run("schedule", str(path), "--format", "csv", "--output", str(tmp_path / "csv"))
    assert code == 0, err
    with open(tmp_path / "csv" / "buried.csv", encoding="utf-8") as f:
        rows = [r for r in csv.reader(f) if r and not r[0].startswith("#")]
    assert [r[0] for r in rows[1:]] == ["A", "A return"]
    assert (tmp_path / "csv" / "buried_basis.csv").is_file()
    code, out, err = run("schedule", str(path), "--format", "html", "--output", str(tmp_path / "s.html"))
    assert code == 0 and "Buried lines: basis" in (tmp_path / "s.html").read_text(encoding="utf-8")
    code, out, err = run("schedule", str(path), "--format", "xlsx", "--output", str(tmp_path / "s.xlsx"))
    assert code == 0, err
    import openpyxl

    book = openpyxl.load_workbook(tmp_path / "s.xlsx", read_only=True)
    # a title's colon is no sheet character (Excel): left out with its space, not doubled
    assert {"Buried lines", "Buried lines basis"} <= set(book.sheetnames), book.sheetnames


def test_a_line_list_takes_the_buried_keys(run, tmp_path):
    (tmp_path / "list.csv").write_text("tag,service,size,length,condition,buried,soil,ground_temp,thickness\n"
                                       "L-1,flow,DN100,120 m,site,0.8 m,moist sand,8 C,60 mm\n", encoding="utf-8")
    text = (HEAD.replace('units = "si"', 'units = "si"\nlines_file = "list.csv"')
            + SERVICE.format(material="polyisocyanurate foam", extra='criteria = ["heat_flow"]\nmax_heat_flow = "40 W/m"'))
    (tmp_path / "p.toml").write_text(text, encoding="utf-8")
    listed = _schedule(run, tmp_path / "p.toml")["lines"][0]
    path = _project(tmp_path, BURIED + 'criteria = ["heat_flow"]\nmax_heat_flow = "40 W/m"',
                    [("B-1", "DN100", "120 m", 'thickness = "60 mm"')], name="typed.toml")
    typed = _schedule(run, path)["lines"][0]
    assert listed["heat_flow_w_per_m"] == typed["heat_flow_w_per_m"] and listed["burial_depth_m"] == 0.8
    (tmp_path / "list.csv").write_text("tag,service,size,length,condition,buried,soil,ground_temp\n"
                                       "L-1,flow,DN100,120 m,site,0.8 m,moon dust,8 C\n", encoding="utf-8")
    code, out, err = run("schedule", str(tmp_path / "p.toml"))
    assert code == 2 and err.startswith('Error: list.csv: row 2, column "soil": unknown soil "moon dust"')


# -- bad input: one line, FILE:LINE:KEY, exit 2 --------------------------------------------
BASE = 'criteria = ["heat_flow"]\nmax_heat_flow = "30 W/m"\n'


@pytest.mark.parametrize("service, line, expected", [
    (BASE + 'buried = "0.05 m"\nsoil = "moist sand"\nground_temp = "8 C"', "",
     'Error: loop.toml: line 21 (lines entry 1 "X"): size: the burial depth 0.05 m (to the pipe centre) must be more '
     'than the pipe radius 57.1 mm of DN100'),
    (BASE + 'buried = "0.3 m"\nsoil = "moist sand"\nground_temp = "8 C"', 'thickness = "250 mm"',
     'Error: loop.toml: line 21 (lines entry 1 "X"): size: the burial depth 0.30 m (to the pipe centre) must be more '
     'than the casing radius (pipe and given thickness) 307.1 mm of DN100'),
    (BASE + 'buried = "0.8 m"\nsoil_k = "9 W/mK"\nground_temp = "8 C"', "",
     'Error: loop.toml: line 15 (service "flow"): soil_k: the soil conductivity must be from 0.1 to 5 W/(m·K)'),
    (BASE + 'buried = "0.8 m"\nsoil_k = "0.05"\nground_temp = "8 C"', "",
     'Error: loop.toml: line 15 (service "flow"): soil_k: the soil conductivity must be from 0.1 to 5 W/(m·K)'),
    (BASE + 'buried = "0.8 m"\nsoil = "moon dust"\nground_temp = "8 C"', "",
     'Error: loop.toml: line 15 (service "flow"): soil: unknown soil "moon dust"; known: dry sand, moist sand, '
     'saturated sand, dry clay, moist clay, saturated clay, loam, gravel, rock'),
    (BASE + 'buried = "0.8 m"\nsoil = "moist sand"\nground_temp = "8 C"\nreturn_temp = "50 C"', "",
     'Error: loop.toml: line 17 (service "flow"): return_temp: two buried pipes need both twin_spacing (between the '
     'centres) and return_temp'),
    (BASE + 'soil = "moist sand"', "",
     'Error: loop.toml: line 14 (service "flow"): soil: is a buried-line input: give buried (the depth of the pipe '
     'centre) too'),
    (BASE + 'buried = "0.8 m"\nsoil = "moist sand"', "",
     'Error: loop.toml: line 14 (service "flow"): buried: a buried line needs the ground surface temperature: give '
     'ground_temp'),
    (BASE + 'buried = "0.8 m"\nground_temp = "8 C"', "",
     'Error: loop.toml: line 14 (service "flow"): buried: a buried line needs the soil: give soil (a type) or soil_k'),
    (BASE, 'buried = "0.8 m"\nsoil = "moist sand"\nsoil_k = 1\nground_temp = "8 C"',
     'Error: loop.toml: line 24 (lines entry 1 "X"): soil_k: give soil or soil_k, not both'),
    (BASE + 'buried = "0.8 m"\nsoil = "moist sand"\nground_temp = "8 C"\ntwin_spacing = "0.15 m"\n'
            'return_temp = "50 C"', "",
     'Error: loop.toml: line 9 (service "flow"): twin_spacing: line "X": the two pipes\' centres must be more than a '
     'casing diameter apart (194.3 mm at the scheduled thickness)'),
    (BASE + 'buried = "0.8 m"\nsoil = "moist sand"\nground_temp = "8 C"\ntwin_casing = "200 mm"\n'
            'twin_spacing = "100 mm"\nreturn_temp = "40 C"', "",
     'Error: loop.toml: line 24 (lines entry 1 "X"): size: DN100 (outside diameter 114.3 mm): the centres must be '
     'more than a pipe diameter apart (114.3 mm) in the casing'),
    (BASE + 'buried = "0.1 m"\nsoil = "moist sand"\nground_temp = "8 C"\ntwin_casing = "300 mm"\n'
            'twin_spacing = "150 mm"\nreturn_temp = "40 C"', "",
     'Error: loop.toml: line 14 (service "flow"): buried: the burial depth 0.1 m (to the casing centre) must be more '
     'than the casing radius 0.15 m'),
    (BASE + 'casing_insulation = "mineral wool"', "",
     'Error: loop.toml: line 14 (service "flow"): casing_insulation: is a buried-line input: give buried (the depth '
     'of the pipe centre) too'),
    (BASE + BURIED, "valves = 2",
     'Error: loop.toml: line 25 (lines entry 1 "X"): valves: fittings are solved in air: a buried line\'s fittings '
     '(in a chamber) are not modelled; leave them out of a buried line'),
    (BURIED, "",
     'Error: loop.toml: line 9 (service "flow"): criteria: a buried line is sized for heat_flow, heat_flux, '
     'temp_change, economic, code (touch and condensation do not apply to a buried line): list one in criteria, or '
     'give its lines a thickness'),
    (BASE + BURIED + 'maintain_temp = "40 C"', "",
     'Error: loop.toml: line 17 (service "flow"): maintain_temp: heat tracing is worked out for a line in air; a '
     "buried line's tracer is not modelled"),
])
def test_bad_buried_input_is_one_line(run, tmp_path, service, line, expected):
    path = _project(tmp_path, service, [("X", "DN100", "10 m", line)])
    code, out, err = run("schedule", str(path))
    assert (code, out) == (2, "")
    assert err.strip().splitlines() == [expected]


def test_depth_within_the_scheduled_casing_is_refused(run, tmp_path):
    # the sizing picks a build-up whose casing reaches the ground surface: refused, not solved
    path = _project(tmp_path, 'criteria = ["heat_flow"]\nmax_heat_flow = "11 W/m"\nburied = "0.2 m"\n'
                              'soil = "moist sand"\nground_temp = "8 C"', [("X", "DN100", "10 m", "")])
    code, out, err = run("schedule", str(path))
    assert code == 2 and out == ""
    [line] = err.strip().splitlines()
    assert line.startswith('Error: loop.toml: line 9 (service "flow"): buried: line "X": the burial depth 0.20 m')


# -- a pair's return: its own warnings and doubtful temperatures ----------------------------
def test_return_pipe_warnings_are_reported(run, tmp_path):
    # polyisocyanurate foam's usable limit 120 °C (tables/materials.csv) under a 190 °C return
    path = _project(tmp_path, BURIED + 'twin_spacing = "0.6 m"\nreturn_temp = "190 C"\ncriteria = ["heat_flow"]\n'
                                       'max_heat_flow = "60 W/m"',
                    [("P-1", "DN150", "80 m", 'thickness = "100 mm"')])
    texts = _schedule(run, path)["warnings"]
    assert any(t.startswith('line "P-1 return": ') and "reaches 190.0 °C, above its usable limit of 120 °C" in t
               for t in texts), texts
    # the return hotter than the supply of a line losing heat to the ground
    assert any("the return (190.0 °C) is hotter than the supply (90.0 °C) with the ground at 8.0 °C" in t
               for t in texts), texts


def test_no_cop_said_once_per_service(run, tmp_path):
    # both pipes of a chilled pair gain heat (6 and 10 °C under ground at 12 °C), no COP given
    extra = (f'buried = "{DEPTH} m"\nsoil_k = {K_SOIL}\nground_temp = "12 C"\ntwin_spacing = "0.5 m"\n'
             'return_temp = "10 C"\ncriteria = ["heat_flow"]\nmax_heat_flow = "30 W/m"\nprice = "0.1/kWh"')
    path = _project(tmp_path, extra, [("CH-1", "DN150", "200 m", 'thickness = "40 mm"')], material=f"k={K_INS}")
    path.write_text(path.read_text().replace('temperature = "90 C"', 'temperature = "6 C"'))
    texts = [t for t in _schedule(run, path)["warnings"] if "no chiller COP" in t]
    assert len(texts) == 1 and '"CH-1"' in texts[0] and '"CH-1 return"' in texts[0], texts


def test_the_example_runs_without_warnings(run):
    from pathlib import Path

    example = Path(__file__).resolve().parent.parent / "examples" / "quarry_hill_district_loop.toml"
    code, out, err = run("schedule", str(example))
    assert code == 0, err
    assert "Warnings" not in out
    assert "in the soil, emittance" not in out   # no radiation in the soil


def test_us_project_shows_no_si_in_buried_output(run, tmp_path):
    # 1 m·K/W = 1.7307 h·ft·°F/Btu (pint: m*K/W to hour*ft*delta_degF/Btu_it); the cap's W/m in Btu/(h·ft)
    # a return hotter than its supply, so the pair's return is above the cap its supply is sized for
    path = _project(tmp_path, BURIED + 'twin_spacing = "0.6 m"\nreturn_temp = "110 C"\ncriteria = ["heat_flow"]\n'
                                       'max_heat_flow = "20 W/m"', [("P-1", "DN150", "80 m", "")])
    path.write_text(path.read_text().replace('units = "si"', 'units = "us"'))
    code, out, err = run("schedule", str(path))
    assert code == 0, err
    assert "m·K/W" not in out and " W/m" not in out, out
    assert "soil resistance [h·ft·°F/Btu]" in out
    data = _schedule(run, path)
    item = next(i for i in data["buried"]["items"] if i["tag"] == "P-1")
    import pint

    ureg = pint.UnitRegistry()
    shown = ureg.Quantity(item["soil_resistance_mk_w"], "m*K/W").to("hour*ft*delta_degF/Btu_it").magnitude
    assert f"{shown:.4f}" in out
    capped = [n for n in data["notes"] if n["code"] == "buried.pair_above_cap"]
    assert capped and "Btu/(h·ft)" in capped[0]["text"]


@pytest.mark.parametrize("extra", [
    ["--layer", "polyisocyanurate foam:100mm", "--twin-spacing", "0.6m", "--return-temp", "50C"],
    ["--twin-casing", "315mm", "--twin-spacing", "150mm", "--return-temp", "45C", "--casing-insulation",
     "polyisocyanurate foam"]])
def test_check_buried_in_us_units_shows_no_si_resistance(run, extra):
    # the soil and mutual resistances in h·ft·°F/Btu (1 m·K/W = 1.7307 h·ft·°F/Btu, pint)
    code, out, err = run("check", "--pipe", "DN65", "--fluid-temp", "90C", "--buried", "0.9m", "--soil", "moist sand",
                         "--ground-temp", "8C", "--units", "us", *extra)
    assert code == 0, err
    assert "m·K/W" not in out and "h·ft·°F/Btu" in out


def test_buried_errors_in_us_units(run, tmp_path):
    # a US project's refusal in its own units: 0.05 m = 0.16 ft, DN100's radius 57.15 mm = 2.250 in (exact inch)
    path = _project(tmp_path, BASE + 'buried = "0.05 m"\nsoil = "moist sand"\nground_temp = "8 C"', [("X", "DN100", "10 m", "")])
    path.write_text(path.read_text().replace('units = "si"', 'units = "us"'))
    code, out, err = run("schedule", str(path))
    assert (code, out) == (2, "")
    assert "the burial depth 0.16 ft (to the pipe centre) must be more than the pipe radius 2.250 in of DN100" in err, err
