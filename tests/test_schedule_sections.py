"""Ducts, flat faces and vessels in the project file and the schedule.

- Each item's total in the schedule equals ``pipeins check`` of the same section at the
  schedule's thickness times the item's quantity (run length, face area, vessel count): the
  same solver reached through another front end (the command line's JSON). An internal
  consistency check of the schedule's bookkeeping; no outside source.
- A flat face with a fixed outer coefficient against the plane-wall resistance
  R = t_wall/k_wall + t/k + 1/h per m² (ASTM C680-14, the plane system; ISO 12241:2022, plane
  walls; any heat-transfer text).
- A rectangular duct with a fixed outer coefficient against ISO 12241's rectangular-duct
  formula with mean perimeters (ISO 12241:2022, rectangular ducts, from memory): per metre,
  R' = t/(k·P_m) with P_m = (P_inner + P_outer)/2 for each layer, and 1/(h·P_outer) outside.
- Totals are sums of the items' W, losses and gains apart (invariant).
- Bad keys are refused in the file's words, each at its line; a line list's duct, face and
  vessel rows read as the same TOML items (this tool's own contract).
- The invented example project runs without warnings.
"""

from __future__ import annotations

import json
import math
from pathlib import Path

import pytest

from pipeins.project import ProjectError, parse_project
from pipeins.schedule import compute_schedule

ROOT = Path(__file__).resolve().parents[1]

HEAD = """\
[project]
name = "Section test (invented)"
units = "{units}"

[energy]
cop = 3.0

[conditions.void]
air = "26 C"
rh = 70

[conditions.plant]
air = "15 C"

[services.supply]
fluid = "air"
temperature = "13 C"
material = "glass wool"
finish = "aluminium, dull or aged"
velocity = "5 m/s"
criteria = ["condensation"]

[services.store]
temperature = "70 C"
material = "mineral wool"
finish = "aluminium, dull or aged"
criteria = ["touch"]
"""

ITEMS = """
[[lines]]
tag = "SA-1"
service = "supply"
duct = "600x400mm"
length = "20 m"
condition = "void"

[[lines]]
tag = "SA-2"
service = "supply"
duct = "450mm"
length = "12 m"
condition = "void"
sheet = "aluminium"

[[lines]]
tag = "P-1"
service = "store"
size = "DN50"
length = "30 m"
condition = "plant"

[[faces]]
tag = "HX wall"
service = "store"
face = "vertical"
area = "6 m2"
height = "1.5 m"
condition = "plant"

[[faces]]
tag = "HX top"
service = "store"
face = "up"
area = "2.5 m2"
length = "0.8 m"
condition = "plant"

[[vessels]]
tag = "T-1"
service = "store"
vessel = "vertical"
diameter = "1.2 m"
length = "2 m"
heads = "2:1"
floor = "ground:10"
count = 2
condition = "plant"

[[vessels]]
tag = "S-1"
service = "store"
sphere = "2.5 m"
condition = "plant"
"""

#: The command-line words of each item above (beside the service's and location's).
CLI = {
    "SA-1": ["--duct", "600x400mm", "--length", "20m"],
    "SA-2": ["--duct", "450mm", "--sheet", "aluminium", "--length", "12m"],
    "P-1": ["--pipe", "DN50", "--length", "30m"],
    "HX wall": ["--face", "vertical", "--height", "1.5m"],
    "HX top": ["--face", "up", "--length", "0.8m"],
    "T-1": ["--vessel", "vertical", "--diameter", "1.2m", "--length", "2m", "--heads", "2:1", "--floor", "ground:10C"],
    "S-1": ["--sphere", "2.5m"],
}
#: The command-line words of each service, and its material.
SERVICE = {"supply": (["--fluid-temp", "13C", "--velocity", "5m/s"], "glass wool"),
           "store": (["--fluid-temp", "70C"], "mineral wool")}
CONDITION = {"void": ["--ambient-temp", "26C", "--rh", "70"], "plant": ["--ambient-temp", "15C"]}


@pytest.fixture(scope="module")
def schedule():
    return compute_schedule(parse_project(HEAD.format(units="si") + ITEMS, "t.toml"))


def _check(run, line, service, condition):
    words, material = SERVICE[service]
    args = ["check", *CLI[line.tag], *words, *CONDITION[condition], "--finish", "aluminium, dull or aged",
            "--layer", f"{material}:{line.thickness_m * 1000:g}mm", "--format", "json"]
    code, out, err = run(*args)
    assert code == 0, err
    return json.loads(out)


@pytest.mark.parametrize("tag", list(CLI))
def test_each_item_equals_check_times_its_quantity(run, schedule, tag):
    line = next(l for l in schedule.lines if l.tag == tag)
    base = "supply" if tag.startswith("SA") else "store"
    data = _check(run, line, base, "void" if tag.startswith("SA") else "plant")
    if line.kind in ("pipe", "duct"):
        per_unit, quantity = data["heat_flow_w_per_m"], line.length_m
        assert line.heat_flow_w_per_m == pytest.approx(per_unit, rel=1e-9)
    elif line.kind == "face":
        per_unit, quantity = data["heat_flow_w_per_m2"], line.area_m2
        assert line.heat_flow_w_per_m2 == pytest.approx(per_unit, rel=1e-9)
    else:
        per_unit, quantity = data["heat_flow_w"], line.count
        assert line.heat_flow_w_each == pytest.approx(per_unit, rel=1e-9)
    assert line.heat_flow_w == pytest.approx(per_unit * quantity, rel=1e-9)
    assert line.surface_temp_c == pytest.approx(data["surface_temp_c"], abs=1e-7)  # the governing part's


@pytest.mark.parametrize("tag", ["SA-1", "SA-2"])
def test_duct_leaving_air_equals_check_along_the_run(run, schedule, tag):
    """The leaving air of a duct run with a velocity: the march of ``check --length --velocity``
    (the same RK4 march; its closed-form check is in tests/test_duct_wiring.py)."""
    line = next(l for l in schedule.lines if l.tag == tag)
    data = _check(run, line, "supply", "void")
    assert line.outlet_temp_c == pytest.approx(data["leaving_temp_c"], abs=1e-9)
    assert 13.0 < line.outlet_temp_c < 26.0  # warmed towards the void's air, never past it


def test_quantities_and_bases(schedule):
    by_tag = {l.tag: l for l in schedule.lines}
    assert [by_tag[t].basis for t in CLI] == ["W/m", "W/m", "W/m", "W/m²", "W/m²", "W", "W"]
    assert [by_tag[t].quantity for t in CLI] == [20.0, 12.0, 30.0, 6.0, 2.5, 2, 1]
    assert by_tag["T-1"].count == 2 and by_tag["HX wall"].area_m2 == 6.0
    # a cold duct gaining heat: its coldest face governs (the top, in still air; common practice)
    assert by_tag["SA-1"].governing_surface in ("top", "sides", "bottom")


def test_each_item_is_sized_as_size_sizes_it(run, schedule):
    """The schedule's thickness of a duct and a vessel is the one ``pipeins size`` picks."""
    for tag, service, condition in (("SA-1", "supply", "void"), ("T-1", "store", "plant")):
        line = next(l for l in schedule.lines if l.tag == tag)
        words, material = SERVICE[service]
        code, out, err = run("size", *CLI[tag], *words, *CONDITION[condition], "--finish", "aluminium, dull or aged",
                             "--material", material, "--format", "json")
        assert code == 0, err
        assert line.thickness_m * 1000 == pytest.approx(json.loads(out)["selected_thickness_mm"], abs=1e-9)


def test_totals_are_sums_of_the_items_watts(schedule):  # invariant: never netted
    t, lines = schedule.totals, schedule.lines
    assert t.heat_loss_w.insulated == pytest.approx(sum(max(l.heat_flow_w, 0.0) for l in lines), rel=1e-12)
    assert t.heat_gain_w.insulated == pytest.approx(sum(max(-l.heat_flow_w, 0.0) for l in lines), rel=1e-12)
    assert t.heat_loss_w.bare == pytest.approx(sum(max(l.bare_heat_flow_w, 0.0) for l in lines), rel=1e-12)
    assert t.heat_gain_w.bare == pytest.approx(sum(max(-l.bare_heat_flow_w, 0.0) for l in lines), rel=1e-12)
    assert t.heat_gain_w.insulated > 0 and t.heat_loss_w.insulated > 0


def test_us_units_read_the_same_items(run):
    """A US-units file (a duct in inches, a run in feet, a ground floor in °F) against check in US words."""
    us = HEAD.format(units="us") + ITEMS.replace('"600x400mm"', '"24x16in"').replace('"20 m"', '"60 ft"')
    lines = {l.tag: l for l in compute_schedule(parse_project(us, "us.toml")).lines}
    for tag, words in (("SA-1", ["--duct", "24x16in", "--length", "60ft", "--fluid-temp", "13C", "--velocity", "5m/s",
                                 "--ambient-temp", "26C", "--rh", "70"]),
                       ("T-1", ["--vessel", "vertical", "--diameter", "1.2m", "--length", "2m", "--heads", "2:1",
                                "--floor", "ground:10", "--fluid-temp", "70C", "--ambient-temp", "15C"])):
        line = lines[tag]
        material = "glass wool" if tag == "SA-1" else "mineral wool"
        code, out, err = run("check", *words, "--units", "us", "--finish", "aluminium, dull or aged",
                             "--layer", f"{material}:{line.thickness_m * 1000:g}mm", "--format", "json")
        assert code == 0, err
        data = json.loads(out)
        per_unit = data["heat_flow_w_per_m"] if tag == "SA-1" else data["heat_flow_w"]
        assert line.heat_flow_w == pytest.approx(per_unit * line.quantity, rel=1e-9)
    assert lines["SA-1"].length_m == pytest.approx(60 * 0.3048, rel=1e-12)
    assert lines["SA-1"].thickness_m * 1000 / 25.4 in (0.5, 1.0, 1.5, 2.0, 2.5, 3.0)  # the inch series


# -- hand checks with a fixed outer coefficient ---------------------------------------------
FIXED = """\
[project]
name = "Hand check (invented)"

[conditions.room]
air = "20 C"
outer_h = "8 W/(m2*K)"

[services.warm]
fluid = "air"
temperature = "{temp} C"
material = "k=0.040"
criteria = ["{criterion}"]
max_heat_flow = "1000 W/m"
"""


def test_face_against_the_plane_wall_resistance():
    """ASTM C680-14 plane system / ISO 12241:2022 plane wall: q = ΔT / (t_s/k_s + t/k + 1/h)."""
    from pipeins.catalog.ducts import lookup_sheet

    text = FIXED.format(temp=70, criterion="touch") + """
[[faces]]
tag = "F"
service = "warm"
face = "vertical"
height = "2 m"
area = "5 m2"
thickness = "50 mm"
condition = "room"
"""
    line = compute_schedule(parse_project(text, "f.toml")).lines[0]
    k_sheet = lookup_sheet("galvanised steel").conductivity_w_mk
    r = 0.002 / k_sheet + 0.050 / 0.040 + 1 / 8.0   # face wall 2 mm of sheet (pipeins' default)
    assert line.heat_flow_w_per_m2 == pytest.approx((70 - 20) / r, rel=1e-9)
    assert line.heat_flow_w == pytest.approx(5.0 * (70 - 20) / r, rel=1e-9)


def test_rectangular_duct_face_by_face_against_the_plane_resistance():
    """Each face of a rectangular duct is a plane strip in parallel with the others; per metre of
    run a face of outside sheet width w carries q' = ΔT / (t_s/(k_s·w) + t/(k·(w + t)) + 1/(h·(w + 2t))):
    the plane resistance R = t/k per m² over the layer's mean width (the insulation widening at
    the corners; ASTM C680-14 plane system, ISO 12241:2022 rectangular ducts with mean perimeters,
    from memory).  Sheet 0.8 mm galvanised steel (pipeins' default), no inner film; the four faces
    together are within 0.01 % of ISO 12241's one-resistance form ΔT / Σ(t/(k·P_m))."""
    from pipeins.catalog.ducts import lookup_sheet

    text = FIXED.format(temp=40, criterion="heat_flow") + """
[[lines]]
tag = "D"
service = "warm"
duct = "600x400mm"
length = "10 m"
thickness = "50 mm"
condition = "room"
"""
    line = compute_schedule(parse_project(text, "d.toml")).lines[0]
    k_s, ts, t, k, h, dt = lookup_sheet("galvanised steel").conductivity_w_mk, 0.0008, 0.050, 0.040, 8.0, 20.0

    def face(w):  # one face, per metre of run [W/m]
        return dt / (ts / (k_s * w) + t / (k * (w + t)) + 1 / (h * (w + 2 * t)))

    by_faces = 2 * face(0.6) + 2 * face(0.4)
    assert line.heat_flow_w_per_m == pytest.approx(by_faces, rel=1e-9)
    assert line.heat_flow_w == pytest.approx(10 * by_faces, rel=1e-9)
    p = 2 * (0.6 + 0.4)
    iso = dt / (ts / (k_s * p) + t / (k * (p + 4 * t)) + 1 / (h * (p + 8 * t)))
    assert line.heat_flow_w_per_m == pytest.approx(iso, rel=1e-4)


# -- bad input -------------------------------------------------------------------------------
BAD_BASE = """\
[project]
name = "E"
[conditions.room]
air = "20 C"
[services.hot]
temperature = "80 C"
material = "mineral wool"
[services.cold_water]
fluid = "water"
temperature = "10 C"
material = "mineral wool"
"""


@pytest.mark.parametrize("item, problems", [
    ('[[faces]]\nservice = "hot"\nface = "vertical"\nheight = "2 m"\ncondition = "room"\n',
     ['e.toml: line 12 (faces entry 1): the key "area" is missing']),
    ('[[faces]]\nservice = "hot"\nface = "sideways"\narea = "3 m2"\nheight = "2 m"\ncondition = "room"\n',
     ['e.toml: line 14 (faces entry 1): face: unknown face "sideways"; use vertical or up or down']),
    ('[[faces]]\nservice = "hot"\nface = "up"\narea = "3 m2"\nheight = "2 m"\nlength = "1 m"\ncondition = "room"\n',
     ['e.toml: line 16 (faces entry 1): height: the height applies to a vertical face; a horizontal one takes '
      'length']),
    ('[[vessels]]\nservice = "hot"\nvessel = "vertical"\ndiameter = "2 m"\nlength = "3 m"\ncount = 0\n'
     'condition = "room"\n',
     ['e.toml: line 17 (vessels entry 1): count: count must be 1 or more (leave the vessel out to count none)']),
    ('[[vessels]]\nservice = "hot"\nvessel = "vertical"\ndiameter = "2 m"\nlength = "3 m"\nheads = "conical"\n'
     'condition = "room"\n',
     ['e.toml: line 17 (vessels entry 1): heads: unknown heads "conical"; use flat or 2:1 or hemispherical']),
    ('[[vessels]]\nservice = "hot"\nvessel = "horizontal"\ndiameter = "2 m"\ncondition = "room"\n',
     ["e.toml: line 12 (vessels entry 1): a vessel needs its length (the shell's, tangent to tangent)"]),
    ('[[vessels]]\nservice = "hot"\nvessel = "vertical"\ndiameter = "2 m"\nlength = "3 m"\nheigth = "3 m"\n'
     'condition = "room"\n',
     ['e.toml: line 17 (vessels entry 1): heigth: unknown key "heigth"; did you mean "length" or "sheet"?']),
    ('[[vessels]]\nservice = "hot"\nvessel = "vertical"\ndiameter = "2 m"\nlength = "3 m"\nfloor = "ground"\n'
     'condition = "room"\n',
     ['e.toml: line 17 (vessels entry 1): floor: a floor on the ground needs the ground temperature: '
      '"ground:10C"']),
    ('[[lines]]\nservice = "hot"\nduct = "600x400mm"\nsize = "DN50"\nlength = "3 m"\ncondition = "room"\n',
     ['e.toml: line 15 (lines entry 1): size: size belongs to a pipe; a duct line gives its duct size (and '
      'sheet)']),
    ('[[lines]]\nservice = "hot"\nduct = "600x0mm"\nlength = "3 m"\ncondition = "room"\n',
     ['e.toml: line 14 (lines entry 1): duct: "600x0mm": every duct side must be greater than zero; use e.g. '
      '600x400mm, 24x16in, 450mm or 18in']),
    ('[[lines]]\nservice = "hot"\nduct = "600x400"\nlength = "3 m"\ncondition = "room"\n',
     ['e.toml: line 14 (lines entry 1): duct: "600x400" has no unit; write it with one: "600x400mm", '
      '"24x16in", "450mm"']),
    ('[[lines]]\nservice = "cold_water"\nduct = "600x400mm"\nlength = "3 m"\ncondition = "room"\n',
     ['e.toml: line 13 (lines entry 1): service: a duct carries air; service "cold_water" has water: give the '
      'duct a service with fluid = "air" (or no fluid)']),
    ('[[lines]]\nservice = "hot"\nsize = "DN50"\nsheet = "aluminium"\nlength = "3 m"\ncondition = "room"\n',
     ['e.toml: line 15 (lines entry 1): sheet: sheet belongs to a duct; give duct = "600x400mm" (or a round '
      'size)']),
    ('[[lines]]\nservice = "hot"\nduct = "450mm"\nduct_location = "attic"\nlength = "3 m"\ncondition = "room"\n',
     ['e.toml: line 15 (lines entry 1): duct_location: unknown duct location "attic"; use conditioned or '
      'unconditioned or outdoors or envelope']),
    ('[[vessels]]\nservice = "hot"\nsphere = "3 m"\nvessel = "vertical"\ndiameter = "2 m"\nlength = "3 m"\n'
     'condition = "room"\n',
     ['e.toml: line 15 (vessels entry 1): vessel: give one section: sphere or vessel, not both']),
])
def test_bad_items_are_refused_at_their_key(item, problems):
    with pytest.raises(ProjectError) as exc:
        parse_project(BAD_BASE + item, "e.toml")
    assert exc.value.problems == problems


def test_bad_service_keys():
    text = BAD_BASE.replace('material = "mineral wool"\n[services.cold_water]',
                            'material = "mineral wool"\nmax_heat_flux = "-3 W/m2"\nduct_service = "exhaust"\n'
                            'climate_zone = "9Z"\nsheet = "copper"\n[services.cold_water]')
    text += '[[lines]]\nservice = "hot"\nsize = "DN50"\nlength = "3 m"\ncondition = "room"\n'
    with pytest.raises(ProjectError) as exc:
        parse_project(text, "e.toml")
    words = "\n".join(exc.value.problems)
    for key in ("max_heat_flux", "duct_service", "climate_zone", "sheet"):
        assert f'(service "hot"): {key}: ' in words, words


@pytest.mark.parametrize("code, item, problem", [
    ("iecc-2018-c403", '[[lines]]\nservice = "air"\nsize = "DN50"\nlength = "3 m"\ncondition = "room"\n',
     'e.toml: line 15 (lines entry 1): service: service "air" has the duct rule set "iecc-2018-c403"; a pipe '
     "takes a pipe rule set (see `pipeins list rules`)"),
    ("ashrae-90.1-2019", '[[lines]]\nservice = "air"\nduct = "600x400mm"\nlength = "3 m"\ncondition = "room"\n',
     'e.toml: line 15 (lines entry 1): service: service "air" has the pipe rule set "ashrae-90.1-2019"; a duct '
     "takes a duct rule set: iecc-2018-c403"),
    ("ashrae-90.1-2019", '[[vessels]]\nservice = "air"\nsphere = "2 m"\ncondition = "room"\n',
     'e.toml: line 15 (vessels entry 1): service: service "air" asks for the code minimum "ashrae-90.1-2019"; '
     "code minimums band pipes by size and ducts by location, not faces or vessels: give this item a service "
     'without "code" in its criteria'),
])
def test_a_code_minimum_fits_the_item(code, item, problem):
    text = ('[project]\nname = "E"\n[conditions.room]\nair = "30 C"\n[services.air]\nfluid = "air"\n'
            f'temperature = "14 C"\nmaterial = "glass wool"\ncriteria = ["code"]\ncode = "{code}"\n'
            'duct_location = "outdoors"\nclimate_zone = "4"\n\n')
    with pytest.raises(ProjectError) as exc:
        parse_project(text + item, "e.toml")
    assert exc.value.problems == [problem]


def test_installed_cost_of_ducts_and_vessels_per_m2_of_their_surface():
    """A cost table per m² prices a duct by its sheet's surface per metre (2·(w + h) of a
    rectangular duct) times its length, a sphere by its surface π·D² times the count (the
    invented demo tables examples/costs_duct_demo.csv, costs_vessel_demo.csv; by hand)."""
    head = ('[project]\nname = "E"\n[energy]\nprice = "0.1/kWh"\ncop = 3\n[conditions.room]\nair = "30 C"\n'
            '[services.air]\nfluid = "air"\ntemperature = "14 C"\nmaterial = "glass wool"\n'
            'criteria = ["heat_flow"]\nmax_heat_flow = "1000 W/m"\ncost_table = "costs_duct_demo.csv"\n'
            '[services.hot]\ntemperature = "90 C"\nmaterial = "mineral wool"\ncriteria = ["touch"]\n'
            'cost_table = "costs_vessel_demo.csv"\n\n')
    items = ('[[lines]]\ntag = "D"\nservice = "air"\nduct = "600x400mm"\nlength = "12 m"\nthickness = "50 mm"\n'
             'condition = "room"\n\n[[vessels]]\ntag = "S"\nservice = "hot"\nsphere = "2 m"\ncount = 3\n'
             'thickness = "50 mm"\ncondition = "room"\n')
    sched = compute_schedule(parse_project(head + items, "e.toml", ROOT / "examples"))
    by_tag = {l.tag: l for l in sched.lines}
    assert by_tag["D"].installed_cost == pytest.approx(31.80 * 2 * (0.6 + 0.4) * 12, rel=1e-9)
    assert by_tag["S"].installed_cost == pytest.approx(62.50 * math.pi * 2.0**2 * 3, rel=1e-9)
    assert sched.totals.installed_cost == pytest.approx(by_tag["D"].installed_cost + by_tag["S"].installed_cost,
                                                        rel=1e-12)


def test_cli_error_line(run, tmp_path):
    path = tmp_path / "bad.toml"
    path.write_text(BAD_BASE + '[[faces]]\nservice = "hot"\nface = "up"\narea = "-2 m2"\nlength = "1 m"\n'
                               'condition = "room"\n', encoding="utf-8")
    code, out, err = run("schedule", str(path))
    assert code == 2 and out == ""
    assert err.strip().splitlines() == ['Error: bad.toml: line 15 (faces entry 1): area: "-2 m2" is out of range; an area is '
                                        'from 0 to 10,000,000 m²']


# -- line lists ------------------------------------------------------------------------------
def test_line_list_rows_are_the_same_items(tmp_path):
    (tmp_path / "list.csv").write_text(
        "tag,service,size,duct,face,area,height,vessel,diameter,length,heads,floor,count,condition\n"
        "P-1,store,DN50,,,,,,,30 m,,,,plant\n"
        "SA-1,supply,,600x400mm,,,,,,20 m,,,,void\n"
        "HX wall,store,,,vertical,6 m2,1.5 m,,,,,,,plant\n"
        "T-1,store,,,,,,vertical,1.2 m,2 m,2:1,ground:10,2,plant\n", encoding="utf-8")
    listed = HEAD.format(units="si").replace('units = "si"', 'units = "si"\nlines_file = "list.csv"')
    from pipeins.project import load_project

    (tmp_path / "p.toml").write_text(listed, encoding="utf-8")
    a = {l.tag: l for l in compute_schedule(load_project(tmp_path / "p.toml")).lines}
    b = {l.tag: l for l in compute_schedule(parse_project(HEAD.format(units="si") + ITEMS, "t.toml")).lines}
    assert set(a) == {"P-1", "SA-1", "HX wall", "T-1"}
    for tag, line in a.items():
        assert (line.kind, line.quantity) == (b[tag].kind, b[tag].quantity)
        assert line.heat_flow_w == pytest.approx(b[tag].heat_flow_w, rel=1e-12)


def test_line_list_row_problem_names_row_and_column(tmp_path):
    (tmp_path / "list.csv").write_text(
        "tag,service,face,area,height,condition\nHX,store,vertical,-6 m2,1.5 m,plant\n", encoding="utf-8")
    listed = HEAD.format(units="si").replace('units = "si"', 'units = "si"\nlines_file = "list.csv"')
    with pytest.raises(ProjectError) as exc:
        parse_project(listed, "p.toml", tmp_path)
    assert exc.value.problems == ['list.csv: row 2, column "area": "-6 m2" is out of range; an area is from 0 to 10,000,000 m²']


# -- reports -----------------------------------------------------------------------------------
def test_reports_list_every_item_in_its_basis(run, tmp_path):
    path = tmp_path / "p.toml"
    path.write_text(HEAD.format(units="si") + ITEMS, encoding="utf-8")
    code, out, err = run("schedule", str(path), "--format", "json")
    assert code == 0, err
    data = json.loads(out)
    by_tag = {l["tag"]: l for l in data["lines"]}
    assert by_tag["HX wall"]["basis"] == "W/m²" and "heat_flow_w_per_m" not in by_tag["HX wall"]
    assert by_tag["HX wall"]["heat_flow_w"] == pytest.approx(6.0 * by_tag["HX wall"]["heat_flow_w_per_m2"], rel=1e-8)
    assert by_tag["T-1"]["heat_flow_w"] == pytest.approx(2 * by_tag["T-1"]["heat_flow_w_each"], rel=1e-8)
    assert "kind" not in by_tag["P-1"]  # a pipe's entry as it always was
    assert by_tag["SA-1"]["kind"] == "duct" and by_tag["SA-1"]["basis"] == "W/m"
    code, out, _ = run("schedule", str(path))
    assert code == 0
    for title in ("Lines", "Faces", "Vessels", "Totals"):
        assert f"\n{title}\n" in out
    folder = tmp_path / "csv"
    code, _, err = run("schedule", str(path), "--format", "csv", "--output", str(folder))
    assert code == 0, err
    assert {"lines.csv", "faces.csv", "vessels.csv"} <= {p.name for p in folder.iterdir()}
    faces = (folder / "faces.csv").read_text(encoding="utf-8")
    assert "area [m²]" in faces and "heat flow [W/m²]" in faces


def test_example_runs_without_warnings(run):
    code, out, err = run("schedule", str(ROOT / "examples" / "larkspur_mews_offices.toml"), "--format", "json")
    assert code == 0, err
    data = json.loads(out)
    assert data["warnings"] == []
    kinds = {l.get("kind", "pipe") for l in data["lines"]}
    assert kinds == {"pipe", "duct", "face", "vessel"}
    assert math.isclose(data["totals"]["heat_loss_w"]["insulated"],
                        sum(l["heat_loss_w"] for l in data["lines"]), rel_tol=1e-12)
