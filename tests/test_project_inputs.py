"""One input model: the command line, the project file and the API describe a line the same way.

- every option of check, size, table and cost has its project-file key (or a stated reason);
- the same line given through the three front ends gives identical results;
- the two front ends accept and refuse the same values, with the same words;
- every problem is reported at once and blamed on the input that caused it.

The expectations are this tool's own contract (no outside source applies).
"""

from __future__ import annotations

import json

import click
import pytest

from pipeins import LineSpec
from pipeins.inputs import BY_NAME, CLI_ONLY, FILE_ONLY, PARAMS
from pipeins.project import KEYS, ProjectError, parse_project


def _command(name):
    from pipeins.cli import cli

    return cli.get_command(None, name)


def _long_flags(command):
    for param in command.params:
        if isinstance(param, click.Option):
            flags = [f for f in param.opts + param.secondary_opts if f.startswith("--")]
            if flags and flags[0] != "--help":
                yield flags[0]


@pytest.mark.parametrize("command", ["check", "size", "table", "cost"])
def test_every_cli_option_has_a_project_key_or_a_reason(command):
    by_flag = {p.flag: p for p in PARAMS if p.flag}
    all_keys = set().union(*KEYS.values())
    missing = []
    for flag in _long_flags(_command(command)):
        if flag in CLI_ONLY:
            continue
        param = by_flag.get(flag)
        if param is None or param.key is None or param.key not in all_keys:
            missing.append(flag)
    assert missing == [], f"{command}: options without a project-file key: {missing}"


def test_every_project_key_has_a_cli_option_or_a_reason():
    keyed = {p.key for p in PARAMS if p.key and p.flag}
    missing = []
    for table, keys in KEYS.items():
        if table == "report":  # the title block of the HTML and XLSX reports of a project
            continue
        missing += [f"{table}.{k}" for k in keys if k not in keyed and k not in FILE_ONLY]
    assert missing == []


def test_the_reasons_name_real_options():
    flags = set()
    for command in ("check", "size", "table", "cost"):
        flags |= set(_long_flags(_command(command)))
    assert set(CLI_ONLY) <= flags


# -- the same line, three ways ---------------------------------------------------------------
PROJECT = """\
[project]
name = "Riser test (invented)"
units = "{units}"

[conditions.shaft]
air = "{air}"
rh = 60
wind = "2 m/s"
surroundings = "{surroundings}"
altitude = "1500 m"

[services.hot]
fluid = "water"
temperature = "{fluid}"
material = "mineral wool"
finish = "PVC jacket"
criteria = ["touch"]

[[lines]]
tag = "R-1"
service = "hot"
size = "NPS 4"
length = "{length}"
condition = "shaft"
orientation = "vertical"
height = "{height}"
thickness = "{thickness}"
"""
SI = dict(units="si", air="15 C", surroundings="10 C", fluid="80 C", length="30 m", height="12 m",
          thickness="50 mm")
US = dict(units="us", air="59 F", surroundings="50 F", fluid="176 F", length="30 m", height="12 m",
          thickness="50 mm")
CLI_SI = ["--pipe", "NPS 4", "--fluid", "water", "--fluid-temp", "80C", "--ambient-temp", "15C", "--rh", "60",
          "--wind", "2m/s", "--surroundings-temp", "10C", "--altitude", "1500m", "--orientation", "vertical",
          "--height", "12m", "--layer", "mineral wool:50mm", "--finish", "PVC jacket", "--length", "30m"]
CLI_US = ["--units", "us", "--pipe", "NPS 4", "--fluid", "water", "--fluid-temp", "176", "--ambient-temp", "59",
          "--rh", "60", "--wind", "2m/s", "--surroundings-temp", "50", "--altitude", "1500m", "--orientation",
          "vertical", "--height", "12m", "--layer", "mineral wool:50mm", "--finish", "PVC jacket", "--length", "30m"]


def _schedule_line(run, tmp_path, values):
    path = tmp_path / "riser.toml"
    path.write_text(PROJECT.format(**values), encoding="utf-8")
    code, out, err = run("schedule", str(path), "--format", "json")
    assert code == 0, err
    [line] = json.loads(out)["lines"]
    return line


def _api():
    from pipeins.model import pressure_at_altitude_pa

    return LineSpec(pipe="NPS 4", fluid="water", fluid_temp_c=80.0, air_temp_c=15.0, rh_percent=60.0, wind_m_s=2.0,
                    surroundings_temp_c=10.0, pressure_pa=float(pressure_at_altitude_pa(1500.0)),
                    orientation="vertical", height_m=12.0, layers=(("mineral wool", 0.05),),
                    finish="PVC jacket", length_m=30.0).solve()


@pytest.mark.parametrize("values, argv", [(SI, CLI_SI), (US, CLI_US)], ids=["si", "us"])
def test_same_line_through_cli_project_file_and_api(run, tmp_path, values, argv):
    code, out, err = run("check", *argv, "--format", "json")
    assert code == 0, err
    cli = json.loads(out)
    line = _schedule_line(run, tmp_path, values)
    api = _api()
    # °F -> °C conversions round in the last bits; SI inputs give the very same numbers
    rel = 0 if values is SI else 1e-12
    assert line["thickness_m"] == 0.05
    assert cli["heat_flow_w_per_m"] == pytest.approx(float(api.heat_flow_w_per_m), rel=rel, abs=1e-9)
    assert line["heat_flow_w_per_m"] == pytest.approx(float(api.heat_flow_w_per_m), rel=rel, abs=1e-9)
    assert cli["surface_temp_c"] == pytest.approx(float(api.surface_temp_c), rel=rel, abs=1e-9)
    assert line["surface_temp_c"] == pytest.approx(float(api.surface_temp_c), rel=rel, abs=1e-9)


def test_orientation_and_height_change_the_line(run, tmp_path):
    vertical = _schedule_line(run, tmp_path, SI)
    horizontal = PROJECT.format(**SI).replace('orientation = "vertical"\nheight = "12 m"\n', "")
    path = tmp_path / "flat.toml"
    path.write_text(horizontal, encoding="utf-8")
    code, out, err = run("schedule", str(path), "--format", "json")
    assert code == 0, err
    assert json.loads(out)["lines"][0]["heat_flow_w_per_m"] != vertical["heat_flow_w_per_m"]


def test_line_overrides_make_a_service_and_location_of_their_own():
    text = PROJECT.format(**SI).replace('thickness = "50 mm"', 'thickness = "50 mm"\nmaterial = "cellular glass"')
    project = parse_project(text, "riser.toml")
    line = project.lines[0]
    assert line.service == "hot (50 mm, cellular glass)" or line.service == "hot (cellular glass, 50 mm)"
    service = project.services[line.service]
    assert service.material == "cellular glass" and service.series == (0.05,)
    assert project.conditions[line.condition].orientation == "vertical"
    assert project.conditions[line.condition].height_m == 12.0


# -- the same values accepted and refused ---------------------------------------------------
ENERGY_PROJECT = """\
[project]
name = "Energy test (invented)"

[energy]
price = "0.09/kWh"
{key} = {value}

[conditions.room]
air = "15 C"

[services.hot]
temperature = "82 C"
material = "mineral wool"
criteria = ["touch"]

[[lines]]
service = "hot"
size = "NPS 4"
length = "120 m"
condition = "room"
"""
COST = ["cost", "--pipe", "NPS 4", "--fluid-temp", "82C", "--ambient-temp", "15C", "--length", "120m",
        "--layer", "mineral wool:50mm", "--energy-price", "0.09/kWh"]


@pytest.mark.parametrize("flag, key, text", [
    ("--co2-factor", "co2", "0.20 kg/kWh"),
    ("--co2-factor", "co2", "0.20/kWh"),
    ("--co2-factor", "co2", "0.20 kg/parsec"),
    ("--years", "life", "15 years"),
    ("--years", "life", "15"),
    ("--years", "life", "0 years"),
    ("--years", "life", "fifteen"),
    ("--discount-rate", "discount_rate", "-99.5 %"),
    ("--discount-rate", "discount_rate", "-100 %"),
    ("--discount-rate", "discount_rate", "5 %"),
    ("--escalation", "escalation", "2 %"),
    ("--maintenance", "maintenance", "2 %"),
    ("--maintenance", "maintenance", "150 %"),
    ("--efficiency", "efficiency", "88 %"),
    ("--efficiency", "efficiency", "0.88"),
    ("--efficiency", "efficiency", "120 %"),
    ("--hours", "hours", "6000 h"),
    ("--hours", "hours", "9000 h"),
    ("--cop", "cop", "3"),
    ("--cop", "cop", "0"),
])
def test_cli_and_project_file_agree_on_energy_values(run, tmp_path, flag, key, text):
    code, _, cli_err = run(*COST, flag, text)
    path = tmp_path / "energy.toml"
    path.write_text(ENERGY_PROJECT.format(key=key, value=json.dumps(text)), encoding="utf-8")
    try:
        parse_project(path.read_text(encoding="utf-8"), "energy.toml")
        file_problems = []
    except ProjectError as exc:
        file_problems = exc.problems
    assert (code == 0) == (file_problems == []), (cli_err, file_problems)
    if code:
        [cli_line] = cli_err.splitlines()
        [file_line] = file_problems
        cli_message = cli_line.split(": ", 2)[2]
        file_message = file_line.split(f"(energy): {key}: ", 1)[1]
        assert cli_message == file_message.replace(key, flag) or cli_message == file_message


def test_maintenance_reaches_the_energy_basis():
    text = ENERGY_PROJECT.format(key="maintenance", value='"2 %"')
    project = parse_project(text, "energy.toml")
    assert project.services["hot"].energy.maintenance == pytest.approx(0.02)


# -- every error at once, blamed on its input --------------------------------------------------
GOOD = """\
[project]
name = "Tags (invented)"

[conditions.room]
air = "20 C"

[services.hot]
temperature = "80 C"
material = "mineral wool"
criteria = ["touch"]

[[lines]]
tag = "HW-1"
service = "hot"
size = "NPS 2"
length = "10 m"
condition = "room"

[[lines]]
tag = "HW-1"
service = "hot"
size = "NPS 7"
length = "-5 m"
condition = "room"
"""


def test_duplicate_tag_reported_with_the_other_errors_of_its_line():
    with pytest.raises(ProjectError) as exc:
        parse_project(GOOD, "tags.toml")
    assert exc.value.problems == [
        'tags.toml: line 20 (lines entry 2 "HW-1"): tag: tag "HW-1" is already used by lines entry 1',
        'tags.toml: line 23 (lines entry 2 "HW-1"): length: run length must be greater than zero',
        'tags.toml: line 22 (lines entry 2 "HW-1"): size: unknown pipe size "NPS 7"; did you mean "NPS 6" or '
        '"NPS 8"?',
    ]


def test_cli_reports_every_problem_at_once(run):
    code, out, err = run("size", "--pipe", "NPS 2", "--fluid-temp", "80C", "--rh", "120", "--wind", "-3",
                         "--material", "mineral wool", "--max-heat-flow", "-3W/m", "--years", "0")
    assert code == 2 and out == ""
    assert err.splitlines() == [
        "Error: --rh: relative humidity must be above 0 and at most 100 %",
        "Error: --wind: wind speed must be from 0 to 100 m/s",
        "Error: --max-heat-flow: the heat-flow cap must be greater than zero",
        "Error: --years: the evaluation life must be above 0 and at most 200 years",
    ]


def test_contact_time_error_blamed_on_contact_time(run):
    code, out, err = run("size", "--pipe", "NPS 2", "--fluid-temp", "80C", "--ambient-temp", "50C",
                         "--contact-time", "8h", "--material", "mineral wool")
    assert code == 2 and out == ""
    assert err == "Error: --contact-time: the touch limit 43 °C must be above the air temperature 50 °C\n"


def test_touch_limit_error_blamed_on_touch_limit(run):
    code, out, err = run("size", "--pipe", "NPS 2", "--fluid-temp", "80C", "--ambient-temp", "50C",
                         "--touch-limit", "45C", "--material", "mineral wool")
    assert code == 2
    assert err == "Error: --touch-limit: the touch limit 45 °C must be above the air temperature 50 °C\n"


@pytest.mark.parametrize("argv, line", [
    (["--altitude", "20000m"], "Error: --altitude: altitude must be from -500 to 11000 m"),
    (["--altitude", "100m", "--air-pressure", "95kPa"], "Error: --altitude: give --air-pressure or --altitude, "
                                                        "not both"),
    (["--height", "5m"], "Error: --height: the height applies to a vertical run; add --orientation vertical"),
    (["--orientation", "vertical"], "Error: --height: a vertical run needs its height"),
])
def test_derived_and_related_values_name_their_input_on_the_cli(run, argv, line):
    code, out, err = run("check", "--pipe", "NPS 2", "--fluid-temp", "80C", *argv)
    assert (code, out) == (2, "")
    assert err.splitlines() == [line]


@pytest.mark.parametrize("extra, line", [
    ('altitude = "20000 m"', 'cond.toml: line 6 (condition "room"): altitude: altitude must be from -500 to 11000 m'),
    ('altitude = "100 m"\nair_pressure = "95 kPa"',
     'cond.toml: line 6 (condition "room"): altitude: give air_pressure or altitude, not both'),
    ('height = "5 m"', 'cond.toml: line 6 (condition "room"): height: the height applies to a vertical run; '
                       'add orientation vertical'),
    ('outer_h = "10 W/m2K"\nwind = "3 m/s"',
     'cond.toml: line 6 (condition "room"): outer_h: a fixed outer coefficient replaces convection and '
     'radiation; drop wind'),
])
def test_derived_and_related_values_name_their_key_in_the_file(extra, line):
    text = GOOD.replace('air = "20 C"', 'air = "20 C"\n' + extra).split("[[lines]]")[0] + \
        '[[lines]]\nservice = "hot"\nsize = "NPS 2"\nlength = "10 m"\ncondition = "room"\n'
    with pytest.raises(ProjectError) as exc:
        parse_project(text, "cond.toml")
    assert exc.value.problems == [line]


def test_library_errors_reach_the_file_in_its_words():
    text = GOOD.replace('criteria = ["touch"]', 'criteria = ["touch"]\ntouch_limit = "61 C"\ncontact_time = "5 s"')
    with pytest.raises(ProjectError) as exc:
        parse_project(text, "tags.toml")
    assert exc.value.problems[0] == ('tags.toml: line 12 (service "hot"): contact_time: give touch_limit or '
                                     'contact_time, not both')


def test_parameter_words_are_known():
    for p in PARAMS:
        assert BY_NAME[p.name] is p
        assert p.flag is None or p.flag.startswith("--")


def test_schedule_time_errors_use_the_file_words(run, tmp_path):
    text = GOOD.split("[[lines]]")[0].replace('criteria = ["touch"]', 'criteria = ["condensation"]') + \
        '[[lines]]\nservice = "hot"\nsize = "NPS 2"\nlength = "10 m"\ncondition = "room"\n'
    path = tmp_path / "words.toml"
    path.write_text(text, encoding="utf-8")
    code, out, err = run("schedule", str(path))
    assert (code, out) == (2, "")
    [line] = err.splitlines()
    assert line.startswith('Error: words.toml: line 7 (service "hot"): room: no sizing criterion applies')
    assert "touch_limit_c" not in line and "--" not in line and "{" not in line
    assert "touch_limit" in line


def test_a_given_thickness_is_used_as_given_or_refused(run, tmp_path):
    text = PROJECT.format(**SI).replace('criteria = ["touch"]', 'criteria = ["heat_flow"]\nmax_heat_flow = "20 W/m"')
    path = tmp_path / "thin.toml"
    path.write_text(text.replace('thickness = "50 mm"', 'thickness = "25 mm"'), encoding="utf-8")
    code, out, err = run("schedule", str(path))
    assert (code, out) == (2, "")
    [line] = err.splitlines()
    assert line == ("Error: thin.toml: line 20 (lines entry 1 \"R-1\"): thickness: NPS 4 in shaft (vertical, "
                    "12 m): the given thickness 25 mm does not meet the criteria")
    path.write_text(text.replace('thickness = "50 mm"', 'thickness = "100 mm"'), encoding="utf-8")
    code, out, err = run("schedule", str(path), "--format", "json")
    assert code == 0, err
    data = json.loads(out)
    assert data["lines"][0]["thickness_m"] == 0.1
    assert [row["layers_mm"] for row in data["schedule"]] == [[100.0]]


def test_ranges_are_stated_in_the_chosen_unit_system(run):
    # 100 m/s = 223.7 mph; 11 000 m = 36 089 ft (international foot, 0.3048 m)
    code, out, err = run("check", "--units", "us", "--pipe", "NPS 3", "--fluid-temp", "180", "--wind", "300mph",
                         "--altitude", "40000ft")
    assert (code, out) == (2, "")
    assert err.splitlines() == ["Error: --wind: wind speed must be from 0 to 223.7 mph",
                                "Error: --altitude: altitude must be from -1640 to 36089 ft"]
