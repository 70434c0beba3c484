"""Several design conditions on one line (pipeins.design_conditions and its project-file hooks).

The case: an invented chilled-water line on a roof, sized for a humid summer afternoon and a
winter night.  Summer's dew point governs condensation, winter's cold the freeze hold; the
line takes the larger requirement, and each criterion is re-solved under its governing
condition at the chosen thickness to show it is met.
"""

import numpy as np
import psychrolib
import pytest

from pipeins.design_conditions import criteria_under, select_over_conditions
from pipeins.project import parse_project
from pipeins.schedule import _spec, compute_schedule

ROOF = """
[project]
name = "Invented roof plant"
[conditions.summer]
air = "32 C"
rh = 80
wind = "1 m/s"
[conditions.winter]
air = "-18 C"
wind = "6 m/s"
[services.chilled]
fluid = "water"
temperature = "7 C"
material = "polyisocyanurate foam"
finish = "aluminium weathered"
criteria = ["condensation", "freeze"]
hold_time = "{hold}"
[[lines]]
tag = "R-1"
service = "chilled"
size = "NPS 4"
length = "60 m"
conditions = ["summer", "winter"]
"""


def _project(hold="4 h", text=ROOF):
    return parse_project(text.format(hold=hold), "roof.toml")


def _combined(project, cname="summer + winter"):
    service = project.services["chilled"]
    size = project.lines[0].size
    conds = [project.conditions[n] for n in project.condition_sets[cname]]
    return select_over_conditions(lambda c, with_rh: _spec(service, c, None, with_rh=with_rh), conds,
                                  service.criteria, service.material, service.requirements, service.series,
                                  project.units, sizes=[size])


def test_default_rule_puts_each_criterion_under_its_condition():
    project = _project()
    assert criteria_under(project.conditions["summer"], ("condensation", "freeze")) == ("condensation",)
    assert criteria_under(project.conditions["winter"], ("condensation", "freeze")) == ("freeze",)
    assert project.condition_sets == {"summer + winter": ("summer", "winter")}
    assert project.lines[0].condition == "summer + winter"


@pytest.mark.parametrize("hold, governs", [("1 h", ("condensation", "summer")), ("12 h", ("freeze", "winter"))])
def test_governing_condition_is_the_one_with_the_largest_requirement(hold, governs):
    project = _project(hold)
    sel = _combined(project)
    # each condition governs a different criterion
    assert sel.required_under["condensation"] == ["summer"]
    assert sel.required_under["freeze"] == ["winter"]
    cond_m, freeze_m = sel.required_m["condensation"][0], sel.required_m["freeze"][0]
    key, cname = governs
    assert (sel.outcome.governing[0], sel.governing_condition[0]) == governs
    assert sel.required_m[key][0] == max(cond_m, freeze_m)
    # the pick is the thickest of the per-condition picks, and at least every requirement
    picks = [float(s.outcome.selected_m[0]) for s in sel.selections.values()]
    assert float(sel.outcome.selected_m[0]) == max(picks)
    assert float(sel.outcome.selected_m[0]) >= max(cond_m, freeze_m) - 1e-12
    # the schedule says the same, in every format's row
    schedule = compute_schedule(project)
    row = schedule.rows[0]
    assert (row.governing, row.governing_condition) == governs
    assert row.thickness_m == pytest.approx(float(sel.outcome.selected_m[0]), abs=1e-12)


@pytest.mark.parametrize("hold", ["1 h", "12 h"])
def test_each_criterion_is_met_under_its_governing_condition(hold):
    from pipeins.catalog.materials import lookup_material
    from pipeins.freezing import freeze_times
    from pipeins.model import Layer
    from pipeins.solve import solve

    project = _project(hold)
    schedule = compute_schedule(project)
    t = schedule.rows[0].thickness_m
    service, size = project.services["chilled"], project.lines[0].size
    layers = [Layer(lookup_material(service.material), np.array([[t]]))]
    # summer: the surface stays above the dew point plus the margin.  Dew point from psychrolib
    # (ASHRAE Handbook - Fundamentals psychrometric equations), not from pipeins.
    summer = project.conditions["summer"]
    pipe, _, fluid, surroundings, surface = _spec(service, summer).build_model([size], insulated=True)
    ts = float(np.ravel(solve(pipe, layers, fluid, surroundings, surface).surface_temp_c)[0])
    psychrolib.SetUnitSystem(psychrolib.SI)
    dew = psychrolib.GetTDewPointFromRelHum(summer.air_temp_c, summer.rh_percent / 100.0)
    assert ts >= dew + service.requirements.dew_margin_k - 0.05
    # winter: still water holds the hold time before it reaches 0 °C
    winter = project.conditions["winter"]
    pipe, _, fluid, surroundings, surface = _spec(service, winter).build_model([size], insulated=True)
    hold_s = float(np.ravel(freeze_times(pipe, layers, surroundings, surface, service.temp_c).time_to_zero_s)[0])
    assert hold_s >= service.requirements.hold_time_s * (1 - 1e-6)
    # cross-check of the hold by hand: lumped water + steel cooling through a constant resistance
    # (Newton's law of cooling, t = C'R' ln((T0 - Ta)/(0 - Ta)); common practice), within 15 %
    r_per_m = (service.temp_c - winter.air_temp_c) / float(np.ravel(
        solve(pipe, layers, fluid, surroundings, surface).heat_flow_w_per_m)[0])
    di, do = size.inner_diameter_m, size.outer_diameter_m
    c_per_m = 1000.0 * np.pi * di ** 2 / 4 * 4200.0 + 7850.0 * np.pi * (do ** 2 - di ** 2) / 4 * 480.0
    by_hand = c_per_m * r_per_m * np.log((service.temp_c - winter.air_temp_c) / (0 - winter.air_temp_c))
    assert hold_s == pytest.approx(by_hand, rel=0.15)


def test_one_condition_reproduces_the_single_condition_selection():
    from pipeins.selection import select

    project = _project("4 h", ROOF.replace('conditions = ["summer", "winter"]', 'condition = "summer"'))
    service, size, cond = project.services["chilled"], project.lines[0].size, project.conditions["summer"]
    alone = select(_spec(service, cond, None, with_rh=True), service.material, service.requirements,
                   service.series, "si", sizes=[size], add_inner_layer=False)
    combined = select_over_conditions(lambda c, with_rh: _spec(service, c, None, with_rh=with_rh), [cond],
                                      service.criteria, service.material, service.requirements, service.series,
                                      "si", sizes=[size])
    assert np.array_equal(combined.outcome.selected_m, alone.outcome.selected_m)
    assert combined.outcome.governing == alone.outcome.governing
    assert [c.description for c in combined.outcome.criteria] == [c.description for c in alone.outcome.criteria]


def test_a_list_of_one_condition_schedules_as_today():
    one = compute_schedule(_project("4 h", ROOF.replace('conditions = ["summer", "winter"]', 'condition = "summer"')))
    listed = compute_schedule(_project("4 h", ROOF.replace('["summer", "winter"]', '["summer"]')))
    assert [(r.condition, r.thickness_m, r.governing, r.governing_condition) for r in listed.rows] == \
        [(r.condition, r.thickness_m, r.governing, r.governing_condition) for r in one.rows]
    assert listed.lines[0].heat_flow_w == one.lines[0].heat_flow_w
    assert listed.rows[0].governing_condition is None


def test_conditions_on_the_service_and_criteria_here():
    text = ROOF.replace('conditions = ["summer", "winter"]\n', "").replace(
        'hold_time = "{hold}"', 'hold_time = "{hold}"\nconditions = ["summer", "winter"]').replace(
        'wind = "1 m/s"', 'wind = "1 m/s"\ncriteria_here = ["condensation"]')
    project = _project("4 h", text)
    assert project.lines[0].condition == "summer + winter"
    assert project.conditions["summer"].criteria_here == ("condensation",)


def _error(run, tmp_path, text):
    path = tmp_path / "roof.toml"
    path.write_text(text.format(hold="4 h"), encoding="utf-8")
    code, out, err = run("schedule", str(path))
    return code, (out + err).strip()


def test_a_condition_no_criterion_uses_is_refused(run, tmp_path):
    text = ROOF.replace('criteria = ["condensation", "freeze"]', 'criteria = ["condensation"]')
    code, text = _error(run, tmp_path, text)
    assert code == 2
    assert text.splitlines() == [
        'Error: roof.toml: line 23 (lines entry 1 "R-1"): conditions: condition "winter" is used by no criterion '
        'of service "chilled" (condensation): it takes condensation only with an rh and freezing only with air '
        'below 0 °C; drop it or give it criteria_here']
    assert not (tmp_path / "out").exists()


@pytest.mark.parametrize("old, new, words", [
    ('["summer", "winter"]', '["summer", "wintr"]', 'unknown condition "wintr"; did you mean "winter"?'),
    ('["summer", "winter"]', '"summer"', "conditions must be a list"),
    ('wind = "1 m/s"', 'wind = "1 m/s"\ncriteria_here = ["dew"]', 'criteria_here: unknown criterion "dew"'),
    ('wind = "1 m/s"', 'wind = "1 m/s"\nsolar = "1500 W/m2"', "solar:"),
])
def test_bad_input_one_line(run, tmp_path, old, new, words):
    code, text = _error(run, tmp_path, ROOF.replace(old, new))
    assert code == 2
    assert len(text.splitlines()) == 1 and text.startswith("Error: roof.toml: line ")
    assert words in text


def test_sun_in_a_condition():
    """Zero sun reproduces the no-sun schedule; sun on a chilled line's jacket warms its surface
    and raises its heat gain (an energy balance: absorbed sun adds to the gain)."""
    plain = _project("4 h", ROOF.replace('conditions = ["summer", "winter"]', 'condition = "summer"'))
    zero = _project("4 h", ROOF.replace('conditions = ["summer", "winter"]', 'condition = "summer"').replace(
        'wind = "1 m/s"', 'wind = "1 m/s"\nsolar = "0 W/m2"'))
    sunny = _project("4 h", ROOF.replace('conditions = ["summer", "winter"]', 'condition = "summer"').replace(
        'wind = "1 m/s"', 'wind = "1 m/s"\nsolar = "800 W/m2"\nabsorptance = 0.5'))
    assert sunny.conditions["summer"].solar_w_m2 == 800.0 and sunny.conditions["summer"].absorptance == 0.5
    a, b, c = (compute_schedule(p).lines[0] for p in (plain, zero, sunny))
    assert b.heat_flow_w == pytest.approx(a.heat_flow_w, rel=1e-12)
    assert b.surface_temp_c == pytest.approx(a.surface_temp_c, rel=1e-12)
    assert c.thickness_m == a.thickness_m
    assert c.surface_temp_c > a.surface_temp_c and c.heat_flow_w < a.heat_flow_w  # more heat gained
