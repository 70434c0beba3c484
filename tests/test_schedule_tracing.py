"""Heat tracing in the project schedule (pipeins.schedule_tracing): each traced line's design heat
loss, as ``check --maintain-temp`` gives it for one line.

The case: an invented fire-water main in the yard of a fictional cold store.  Sources: the design
loss against ``check`` on the same line (the command line's path, pipeins.tracing); the safety
factor by hand, design = loss × (1 + sf) (common practice after IEEE 515 / IEC/IEEE 60079-30-2,
from memory); the line's total = design per metre × length.
"""

import json

import pytest

from pipeins.project import ProjectError, parse_project
from pipeins.schedule import compute_schedule

PROJECT = """\
[project]
name = "Invented cold store yard"
[conditions.yard]
air = "-5 C"
wind = "4 m/s"
[services.fire_water]
temperature = "10 C"
material = "mineral wool"
criteria = ["freeze"]
hold_time = "2 h"
{tracing}
[[lines]]
tag = "FW-1"
service = "fire_water"
size = "DN80"
length = "50 m"
condition = "yard"
thickness = "40 mm"
"""
TRACING = 'maintain_temp = "5 C"\nmin_ambient = "-20 C"\nsafety_factor = 25\ntracer_output = "{output}"'


def _schedule(tracing):
    return compute_schedule(parse_project(PROJECT.replace("{tracing}", tracing), "yard.toml"))


def test_design_loss_matches_check_and_the_hand_factor(run):
    sched = _schedule(TRACING.replace("{output}", "15 W/m"))
    item = sched.tracing.items[0]
    code, out, err = run("check", "--pipe", "DN80", "--fluid-temp", "10C", "--ambient-temp", "-5C", "--wind", "4m/s",
                         "--layer", "mineral wool:40mm", "--maintain-temp", "5C", "--min-ambient", "-20C",
                         "--safety-factor", "25", "--tracer-output", "15W/m", "--format", "json")
    assert code == 0, err
    theirs = json.loads(out)["tracing"]
    assert item.heat_loss_w_per_m == pytest.approx(theirs["heat_loss_w_per_m"], rel=1e-9)
    assert item.design_heat_loss_w_per_m == pytest.approx(theirs["design_heat_loss_w_per_m"], rel=1e-9)
    assert item.design_heat_loss_w_per_m == pytest.approx(item.heat_loss_w_per_m * 1.25, rel=1e-12)   # by hand
    assert item.design_heat_loss_w == pytest.approx(item.design_heat_loss_w_per_m * 50.0, rel=1e-12)
    assert item.sufficient is True and item.margin_percent == pytest.approx(
        100 * (15.0 - item.design_heat_loss_w_per_m) / item.design_heat_loss_w_per_m, rel=1e-12)


def test_a_short_tracer_is_warned_and_reported_in_json(run, tmp_path):
    sched = _schedule(TRACING.replace("{output}", "5 W/m"))
    assert sched.tracing.items[0].sufficient is False
    assert any(w.startswith('line "FW-1": the tracer output 5.0 W/m is below the design heat loss') for w in sched.warnings)
    path = tmp_path / "yard.toml"
    path.write_text(PROJECT.replace("{tracing}", TRACING.replace("{output}", "5 W/m")), encoding="utf-8")
    code, out, err = run("schedule", str(path), "--format", "json")
    assert code == 0, err
    assert json.loads(out)["tracing"]["items"][0]["sufficient"] is False
    code, out, err = run("schedule", str(path))
    assert "Heat tracing" in out


@pytest.mark.parametrize("tracing, message", [
    ('tracer_output = "15 W/m"', 'yard.toml: line 11 (service "fire_water"): tracer_output: is a heat-tracing input: '
                                 'give maintain_temp too'),
    ('maintain_temp = "-30 C"', "must be above the minimum design ambient"),
    ('maintain_temp = "5 C"\nsafety_factor = 150', "safety factor on the heat loss a tracer makes up must be from 0 to 100 %"),
])
def test_bad_tracing_inputs(tracing, message):
    with pytest.raises(ProjectError) as exc:
        _schedule(tracing)
    assert any(message in p and p.startswith("yard.toml: line ") for p in exc.value.problems), exc.value.problems
