"""The tracer output as a schedule sizing criterion (``criteria = ["tracer"]`` on a traced service).

The case: an invented condensate return in the yard of a fictional timber mill.  The schedule sizes
the line so that the tracer's output covers the design heat loss at the maintain temperature and
the minimum design ambient with the safety factor; checked against ``size --tracer-output`` on the
same line (the command line's path, pipeins.criteria.tracer) and against an independent solve of
the design loss at the selected thickness and at the series thickness below it (design = loss ×
(1 + sf), common practice after IEEE 515 / IEC/IEEE 60079-30-2, from memory).
"""

import json

import pytest

PROJECT = """\
[project]
name = "Alderbrook timber mill yard (invented)"
[conditions.yard]
air = "2 C"
wind = "4 m/s"
[services.condensate]
temperature = "40 C"
material = "mineral wool"
criteria = {criteria}
maintain_temp = "5 C"
min_ambient = "-20 C"
safety_factor = 25
tracer_output = "{output}"
{extra}
[[lines]]
tag = "CR-1"
service = "condensate"
size = "DN50"
length = "60 m"
condition = "yard"
"""


def _schedule(run, tmp_path, criteria='["tracer"]', output="12 W/m", extra=""):
    path = tmp_path / "mill.toml"
    path.write_text(PROJECT.format(criteria=criteria, output=output, extra=extra), encoding="utf-8")
    code, out, err = run("schedule", str(path), "--format", "json")
    assert code == 0, err
    return json.loads(out)


def _size(run, *extra):
    code, out, err = run("size", "--pipe", "DN50", "--fluid-temp", "5C", "--ambient-temp", "-20C", "--wind", "4m/s",
                         "--material", "mineral wool", "--tracer-output", "12W/m", "--safety-factor", "25",
                         "--format", "json", *extra)
    assert code == 0, err
    return json.loads(out)


def test_schedule_sizes_for_the_tracer_as_size_does(run, tmp_path):
    data = _schedule(run, tmp_path)
    [row] = data["schedule"]
    sized = _size(run)
    assert row["thickness_mm"] == pytest.approx(sized["selected_thickness_mm"], abs=1e-9)
    assert row["governing"] == "tracer" and row["governing_condition"] == "heat tracing"
    # the traced line at the scheduled thickness: the tracer suffices
    [item] = data["tracing"]["items"]
    assert item["sufficient"] is True and item["design_heat_loss_w_per_m"] <= 12.0


def test_the_thickness_is_the_least_of_the_series_that_suffices(run, tmp_path):
    from pipeins.catalog.series import thickness_series_m
    from pipeins.line import LineSpec

    data = _schedule(run, tmp_path)
    chosen = data["schedule"][0]["thickness_mm"] / 1000
    series = [t for t in thickness_series_m(_size(run)["series"]) if t <= chosen + 1e-12]

    def design(t):   # an independent solve at the maintain temperature and the minimum ambient, × 1.25
        spec = LineSpec(pipe="DN50", fluid_temp_c=5.0, air_temp_c=-20.0, wind_m_s=4.0,
                        layers=(("mineral wool", t),))
        return float(spec.solve().heat_flow_w_per_m) * 1.25

    assert design(series[-1]) <= 12.0
    assert design(series[-2]) > 12.0


def test_tracer_and_a_heat_flow_cap_the_larger_governs(run, tmp_path):
    tracer_only = _schedule(run, tmp_path)["schedule"][0]["thickness_mm"]
    both = _schedule(run, tmp_path, criteria='["tracer", "heat_flow"]', extra='max_heat_flow = "4 W/m"')
    [row] = both["schedule"]
    assert row["thickness_mm"] > tracer_only and row["governing"] == "heat_flow"
    assert row["governing_condition"] == "yard"


def test_a_tracer_output_not_listed_is_compared_not_sized(run, tmp_path):
    data = _schedule(run, tmp_path, criteria='["heat_flow"]', output="1 W/m", extra='max_heat_flow = "30 W/m"')
    assert data["schedule"][0]["governing"] == "heat_flow"
    assert data["tracing"]["items"][0]["sufficient"] is False


@pytest.mark.parametrize("drop, expected", [
    (('maintain_temp = "5 C"\n', 'min_ambient = "-20 C"\n', "safety_factor = 25\n", 'tracer_output = "12 W/m"\n'),
     ['Error: mill.toml: line 9 (service "condensate"): criteria: criterion "tracer" needs the key "tracer_output"',
      'Error: mill.toml: line 9 (service "condensate"): criteria: criterion "tracer" needs the key "maintain_temp" (the '
      'temperature the tracer holds; the tracer output is sized for there, at min_ambient)']),
    (('maintain_temp = "5 C"\n',),
     ['Error: mill.toml: line 10 (service "condensate"): min_ambient: is a heat-tracing input: give maintain_temp too']),
])
def test_the_tracer_criterion_needs_its_keys(run, tmp_path, drop, expected):
    text = PROJECT.format(criteria='["tracer"]', output="12 W/m", extra="")
    for line in drop:
        text = text.replace(line, "")
    path = tmp_path / "mill.toml"
    path.write_text(text, encoding="utf-8")
    code, out, err = run("schedule", str(path))
    assert (code, out) == (2, "")
    assert err.strip().splitlines() == expected


@pytest.mark.parametrize("criteria", ['["tracer", "touch"]', '["tracer", "condensation"]'])
def test_a_criterion_that_does_not_apply_beside_the_tracer_is_a_note(run, tmp_path, criteria):
    """At 40 °C no surface can exceed the touch limit, and the yard gives no RH: neither criterion
    applies there; the tracer still sizes the line, as with the tracer alone, and the report
    says why the other sized nothing."""
    tracer_only = _schedule(run, tmp_path)["schedule"][0]
    data = _schedule(run, tmp_path, criteria=criteria)
    row = data["schedule"][0]
    assert row["governing"] == "tracer" and row["thickness_mm"] == tracer_only["thickness_mm"]
    assert any("nothing is sized under it" in w for w in data["warnings"])
