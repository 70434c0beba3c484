"""The project file: every error path with its exact message (file, line, entry, key), all
problems of a file reported together, and the command line's ``Error:`` lines.

The expected messages are this tool's own contract (no outside source applies); the
catalogue names they suggest come from the shipped tables.
"""

from __future__ import annotations

import pytest

from pipeins.cli import main
from pipeins.project import ProjectError, parse_project

GOOD = """\
[project]
name = "Test site (invented)"
units = "si"

[conditions.room]
air = "20 C"
rh = 60

[services.hot]
fluid = "water"
temperature = "80 C"
material = "mineral wool"
finish = "PVC jacket"
criteria = ["touch"]

[[lines]]
service = "hot"
size = "NPS 2"
length = "10 m"
condition = "room"
valves = 1
"""


def problems(text: str) -> list[str]:
    with pytest.raises(ProjectError) as exc:
        parse_project(text, "project.toml")
    assert str(exc.value) == "\n".join(exc.value.problems)
    return exc.value.problems


def test_good_file_reads():
    project = parse_project(GOOD, "project.toml")
    line = project.lines[0]
    assert line.tag == "hot NPS 2 room #1"
    assert line.fittings["valve"] == 1
    assert project.conditions["room"].rh_percent == 60.0


@pytest.mark.parametrize("old, new, expected", [
    pytest.param('material = "mineral wool"', 'material = "glas wool"',
                 'project.toml: line 12 (service "hot"): material: unknown material "glas wool"; '
                 'did you mean "glass wool"?', id="unknown-material"),
    pytest.param('finish = "PVC jacket"', 'finish = "PVC jaket"',
                 'project.toml: line 13 (service "hot"): finish: unknown finish "PVC jaket"; '
                 'did you mean "pvc jacket"?', id="unknown-finish"),
    pytest.param('size = "NPS 2"', 'size = "NPS 7"',
                 'project.toml: line 18 (lines entry 1): size: unknown pipe size "NPS 7"; '
                 'did you mean "NPS 6" or "NPS 8"?', id="unknown-size"),
    pytest.param('service = "hot"', 'service = "hott"',
                 'project.toml: line 17 (lines entry 1): service: unknown service "hott"; did you mean "hot"?',
                 id="unknown-service"),
    pytest.param('condition = "room"', 'condition = "rooom"',
                 'project.toml: line 20 (lines entry 1): condition: unknown condition "rooom"; did you mean "room"?',
                 id="unknown-condition"),
    pytest.param('rh = 60', 'humidity = 60',
                 'project.toml: line 7 (condition "room"): humidity: unknown key "humidity"; known: absorptance, air, '
                 'air_pressure, altitude, criteria_here, height, orientation, outer_h, rh, solar, surroundings, wind',
                 id="unknown-key"),
    pytest.param('valves = 1', 'valvs = 1',
                 'project.toml: line 21 (lines entry 1): valvs: unknown key "valvs"; did you mean "valves" or "valve"?',
                 id="unknown-key-did-you-mean"),
    pytest.param('length = "10 m"\n', '',
                 'project.toml: line 16 (lines entry 1): the key "length" is missing', id="missing-key"),
    pytest.param('rh = 60', 'rh = 120',
                 'project.toml: line 7 (condition "room"): rh: relative humidity must be above 0 '
                 'and at most 100 %', id="rh-over-100"),
    pytest.param('length = "10 m"', 'length = "5 parsecs"',
                 'project.toml: line 19 (lines entry 1): length: cannot read "5 parsecs" as a length; '
                 'use e.g. 30m, 100ft or 1500mm', id="bad-quantity"),
    pytest.param('valves = 1', 'valves = -1',
                 'project.toml: line 21 (lines entry 1): valves: must be a whole number, 0 or more',
                 id="negative-count"),
    pytest.param('criteria = ["touch"]', 'criteria = ["tuoch"]',
                 'project.toml: line 14 (service "hot"): criteria: unknown criterion "tuoch"; did you mean "touch"?',
                 id="unknown-criterion"),
    pytest.param('criteria = ["touch"]', 'criteria = ["heat_flow"]',
                 'project.toml: line 14 (service "hot"): criteria: criterion "heat_flow" needs the key '
                 '"max_heat_flow" or "min_reduction"', id="criterion-without-data"),
    pytest.param('temperature = "80 C"', 'temperature = "80 C"\nsteam_pressure = "3 barg"',
                 'project.toml: line 12 (service "hot"): steam_pressure: give temperature or steam_pressure, '
                 'not both', id="temperature-and-steam"),
    pytest.param('units = "si"', 'units = "metric"',
                 'project.toml: line 3 (project): units: unknown unit system "metric"; use "si" or "us"',
                 id="unknown-units"),
    pytest.param('[project]\nname = "Test site (invented)"', '[project]',
                 'project.toml: line 1 (project): the key "name" is missing', id="missing-name"),
])
def test_error_messages(old, new, expected):
    text = GOOD.replace(old, new)
    assert text != GOOD
    assert problems(text) == [expected]


def test_two_errors_reported_together():
    text = GOOD.replace('"mineral wool"', '"glas wool"').replace('"NPS 2"', '"NPS 7"')
    assert problems(text) == [
        'project.toml: line 12 (service "hot"): material: unknown material "glas wool"; did you mean "glass wool"?',
        'project.toml: line 18 (lines entry 1): size: unknown pipe size "NPS 7"; did you mean "NPS 6" or "NPS 8"?',
    ]


def test_bad_toml_syntax_names_file_and_line():
    text = GOOD.replace('air = "20 C"', 'air = 20 C')
    [message] = problems(text)
    assert message.startswith("project.toml: line 6: not valid TOML: ")


def test_unknown_top_level_table():
    [message] = problems(GOOD + "\n[energie]\nprice = \"0.1/kWh\"\n")
    assert message == 'project.toml: line 23 (file): unknown table [energie]; did you mean "energy"?'


def test_tagged_line_named_in_errors():
    text = GOOD.replace('[[lines]]\n', '[[lines]]\ntag = "HW-7"\n').replace('"NPS 2"', '"NPS 7"')
    [message] = problems(text)
    assert message.startswith('project.toml: line 19 (lines entry 1 "HW-7"): size: unknown pipe size "NPS 7"')


# -- the command line --------------------------------------------------------------------------
@pytest.fixture
def run(capsys):
    def _run(*args):
        with pytest.raises(SystemExit) as exc:
            main(list(args))
        captured = capsys.readouterr()
        assert "Traceback" not in captured.out + captured.err
        return exc.value.code or 0, captured.out, captured.err

    return _run


def test_cli_prints_every_problem_as_an_error_line(run, tmp_path):
    path = tmp_path / "project.toml"
    path.write_text(GOOD.replace('"mineral wool"', '"glas wool"').replace('"NPS 2"', '"NPS 7"'), encoding="utf-8")
    out_dir = tmp_path / "out"
    code, out, err = run("schedule", str(path), "--format", "csv", "--output", str(out_dir))
    assert code == 2 and out == ""
    assert err.splitlines() == [
        'Error: project.toml: line 12 (service "hot"): material: unknown material "glas wool"; did you mean "glass wool"?',
        'Error: project.toml: line 18 (lines entry 1): size: unknown pipe size "NPS 7"; did you mean "NPS 6" or "NPS 8"?',
    ]
    assert not out_dir.exists()  # nothing written when the project fails


def test_cli_csv_needs_output(run, tmp_path):
    path = tmp_path / "project.toml"
    path.write_text(GOOD, encoding="utf-8")
    code, out, err = run("schedule", str(path), "--format", "csv")
    assert code == 2
    assert err.strip() == "Error: --output: csv writes one file per table: give --output FOLDER"


def test_cli_infeasible_requirement_writes_nothing(run, tmp_path):
    text = GOOD.replace('criteria = ["touch"]', 'criteria = ["heat_flow"]\nmax_heat_flow = "0.5 W/m"')
    path = tmp_path / "project.toml"
    path.write_text(text, encoding="utf-8")
    out_file = tmp_path / "schedule.json"
    code, out, err = run("schedule", str(path), "--format", "json", "--output", str(out_file))
    assert code == 2
    assert err.startswith('Error: project.toml: line 9 (service "hot"): NPS 2 in room: heat-flow cap cannot be met')
    assert not out_file.exists()
