"""Fittings as objects in the project schedule (pipeins.schedule_fittings): each fitting bare
and covered, apart from the pipe, in its own section and totals.

The case: an invented boiler-house header of a fictional laundry (hot water, 90 °C) with a gate
valve, a globe valve and a flanged joint, covered by a removable mineral-wool cover, and an
invented chilled line whose valve gains heat.

Sources named beside each check: the fitting's heat flow against ``check --valve/--flange``
(the same method, ASTM C1129's manner: a short cylinder of the fitting's area solved with its
own film) on the same line; the saving against bare − covered (ASTM C1129's definition of the
saving); the totals are sums (invariant); the bare valve against its area × the film solved
for the same short cylinder and the line's ΔT by hand.
"""

import json

import pytest

from pipeins.project import ProjectError, parse_project
from pipeins.reports.notes import render_all
from pipeins.schedule import compute_schedule

PROJECT = """\
[project]
name = "Invented laundry boiler house"
[conditions.plant]
air = "20 C"
rh = 60
[services.hot]
temperature = "90 C"
material = "mineral wool"
criteria = ["touch"]
[services.chilled]
temperature = "6 C"
material = "flexible elastomeric foam"
criteria = ["condensation"]
[[lines]]
tag = "HW-1"
service = "hot"
size = "DN50"
length = "30 m"
condition = "plant"
valve = ["gate", "globe:DN50:PN40"]
flange = ["DN50"]
cover = "mineral wool:50mm"
{extra}
[[lines]]
tag = "HW-2"
service = "hot"
size = "DN80"
length = "12 m"
condition = "plant"
valves = 2
[[lines]]
tag = "CH-1"
service = "chilled"
size = "DN40"
length = "20 m"
condition = "plant"
valve = ["ball"]
"""


def _schedule(extra=""):
    return compute_schedule(parse_project(PROJECT.replace("{extra}", extra), "laundry.toml"))


def test_each_fitting_matches_check_on_the_same_line(run):
    sched = _schedule()
    items = [f for f in sched.fittings.items if f.tag == "HW-1"]
    assert [f.label for f in items] == ["gate valve DN50 PN16", "globe valve DN50 PN40", "flanged joint DN50 PN16"]
    thickness = next(l.thickness_m for l in sched.lines if l.tag == "HW-1")
    code, out, err = run("check", "--pipe", "DN50", "--fluid-temp", "90C", "--ambient-temp", "20C",
                         "--layer", f"mineral wool:{thickness * 1000:g}mm", "--valve", "gate:DN50",
                         "--valve", "globe:DN50:PN40", "--flange", "DN50", "--cover", "mineral wool:50mm",
                         "--format", "json")
    assert code == 0, err
    for ours, theirs in zip(items, json.loads(out)["fittings"]):
        assert ours.heat_flow_w == pytest.approx(theirs["heat_flow_w"], rel=1e-9)
        assert ours.surface_temp_c == pytest.approx(theirs["surface_temp_c"], rel=1e-9)
        assert ours.covered_heat_flow_w == pytest.approx(theirs["covered_heat_flow_w"], rel=1e-9)
        assert ours.saving_w == pytest.approx(ours.heat_flow_w - ours.covered_heat_flow_w, rel=1e-12)


def test_totals_are_sums_and_losses_and_gains_stay_apart():
    sched = _schedule()
    items, t = sched.fittings.items, sched.fittings.totals
    assert t.count == 4 and t.covered_count == 3
    hot = [f for f in items if f.service == "hot"]
    cold = [f for f in items if f.service == "chilled"]
    assert cold and all(f.heat_flow_w < 0 for f in cold)   # the chilled valve gains heat
    assert t.bare_heat_loss_w == pytest.approx(sum(f.heat_flow_w for f in hot), rel=1e-12)
    assert t.installed_heat_loss_w == pytest.approx(sum(f.covered_heat_flow_w for f in hot), rel=1e-12)
    assert t.bare_heat_gain_w == pytest.approx(-sum(f.heat_flow_w for f in cold), rel=1e-12)
    assert t.installed_heat_gain_w == t.bare_heat_gain_w   # no cover on the chilled line
    assert t.saving_heat_loss_w == pytest.approx(sum(f.saving_w for f in hot), rel=1e-12)


def test_bare_valve_by_hand():
    # hand calculation: the bare gate valve loses its area × (h_conv + h_rad) × (T_surface − T_air),
    # the film being the one solved for the short cylinder (ASTM C1129's manner); with the metal at
    # the fluid temperature through the wall, the surface is within a few kelvin of 90 °C
    from pipeins.catalog.fittings import lookup_fitting
    from pipeins.fittings import solve_fittings
    from pipeins.line import LineSpec

    sched = _schedule()
    gate = sched.fittings.items[0]
    alone = solve_fittings(LineSpec(pipe="DN50", fluid_temp_c=90.0, air_temp_c=20.0),
                           [lookup_fitting("gate", "DN50")]).items[0]
    hand = gate.area_m2 * (alone.h_conv_w_m2k + alone.h_rad_w_m2k) * (alone.surface_temp_c - 20.0)
    assert gate.heat_flow_w == pytest.approx(hand, rel=1e-6)
    assert 85.0 < gate.surface_temp_c <= 90.0


def test_object_fittings_stay_out_of_the_lines_and_counts_still_work():
    with_objects = _schedule()
    plain = compute_schedule(parse_project(PROJECT.replace("{extra}", "").replace(
        'valve = ["gate", "globe:DN50:PN40"]\nflange = ["DN50"]\ncover = "mineral wool:50mm"\n', "").replace(
        'valve = ["ball"]\n', ""), "laundry.toml"))
    a = {l.tag: l for l in with_objects.lines}
    b = {l.tag: l for l in plain.lines}
    assert a["HW-1"].heat_flow_w == b["HW-1"].heat_flow_w and a["HW-1"].fittings_length_m == 0
    assert a["HW-2"].fittings_length_m > 0   # valves = 2: equivalent length of bare pipe, as before
    assert plain.fittings.items == []


def test_schedule_outputs_carry_the_fittings(run, tmp_path):
    path = tmp_path / "laundry.toml"
    path.write_text(PROJECT.replace("{extra}", ""), encoding="utf-8")
    code, out, err = run("schedule", str(path))
    assert code == 0, err
    assert "Fittings\n" in out and "Fittings totals" in out and "gate valve DN50 PN16" in out
    code, out, err = run("schedule", str(path), "--format", "json")
    data = json.loads(out)
    assert len(data["fittings"]["items"]) == 4
    assert data["fittings"]["totals"]["heat_loss_w"]["saving"] > 0
    code, out, err = run("schedule", str(path), "--units", "us")
    assert code == 0 and "Btu/h" in out


@pytest.mark.parametrize("line, key, message", [
    ('valve = ["knife"]', "valve", 'unknown fitting kind "knife"'),
    ('valve = 2', "valve", 'valve must be a list of texts, e.g. valve = ["…", "…"]'),
    ('flange = ["DN50:PN99"]', "flange", "PN99"),
    ('cover = "mineral wool:50mm"', "cover", "covers the line's fittings: list them in valve or flange too"),
])
def test_bad_fittings_name_file_line_key(line, key, message):
    text = PROJECT.replace("{extra}", "").replace(
        'valve = ["gate", "globe:DN50:PN40"]\nflange = ["DN50"]\ncover = "mineral wool:50mm"\n', line + "\n")
    with pytest.raises(ProjectError) as exc:
        compute_schedule(parse_project(text, "laundry.toml"))
    problems = [p for p in exc.value.problems if f'"HW-1"): {key}: ' in p]
    assert problems, exc.value.problems
    assert problems[0].startswith("laundry.toml: line ") and message in problems[0]


def test_a_cold_bare_fitting_below_the_dew_point_is_warned():
    # the chilled ball valve (6 °C) bare in air at 20 °C, 60 % RH (dew point about 12 °C, Magnus form)
    sched = _schedule()
    assert any(w.startswith('line "CH-1": the bare ball valve DN40 PN16 surface') and "sweats" in w
               for w in render_all(sched.warnings))


LIST_PROJECT = """\
[project]
name = "Invented laundry roof"
lines_file = "roof-lines.csv"
[conditions.summer]
air = "30 C"
rh = 70
[conditions.winter]
air = "-10 C"
wind = "5 m/s"
[services.chilled]
temperature = "6 C"
material = "flexible elastomeric foam"
criteria = ["condensation", "freeze"]
hold_time = "4 h"
"""
LIST = """tag,service,size,length,conditions,valve,cover
R-1,chilled,DN80,25 m,summer; winter,gate; check,flexible elastomeric foam:25mm
R-2,chilled,DN50,10 m,summer,,
"""


def test_line_list_cells_give_conditions_and_fittings(tmp_path):
    from pipeins.project import load_project

    (tmp_path / "roof.toml").write_text(LIST_PROJECT, encoding="utf-8")
    (tmp_path / "roof-lines.csv").write_text(LIST, encoding="utf-8")
    sched = compute_schedule(load_project(tmp_path / "roof.toml"))
    lines = {l.tag: l for l in sched.lines}
    assert lines["R-1"].condition == "summer + winter" and lines["R-2"].condition == "summer"
    assert [f.label for f in sched.fittings.items] == ["gate valve DN80 PN16", "check valve DN80 PN16"]
    assert all(f.covered_heat_flow_w is not None for f in sched.fittings.items)
