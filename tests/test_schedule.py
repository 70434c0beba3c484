"""The project schedule on the three invented example projects: it completes, its totals are
the sums of its lines (invariant), and every output format is written whole.

Sources: the totals are sums by construction (invariant, no outside source); unit conversion
of the energy total is checked with ``pint``; the yearly energy of a line is checked against
the definition E = |Q|·h·3600/η (ISO 12241:2022 clause on annual heat loss, from memory; the
same relation as ``pipeins.economics.annual_energy_j``).
"""

from __future__ import annotations

import json
import math
from pathlib import Path

import pint
import pytest

from pipeins.cli import main
from pipeins.project import load_project
from pipeins.schedule import compute_schedule

EXAMPLES = Path(__file__).resolve().parents[1] / "examples"
NAMES = ["hospital_steam.toml", "district_heating_plant.toml", "food_factory_chilled.toml"]


@pytest.fixture(scope="module", params=NAMES)
def solved(request):
    project = load_project(EXAMPLES / request.param)
    return compute_schedule(project)


def _close(a, b):
    return math.isclose(a, b, rel_tol=1e-12, abs_tol=1e-9)


def test_totals_equal_sum_of_lines(solved):  # invariant
    t, lines = solved.totals, solved.lines
    assert _close(t.heat_flow_w, sum(l.heat_flow_w for l in lines))
    assert _close(t.bare_heat_flow_w, sum(l.bare_heat_flow_w for l in lines))
    assert _close(t.energy_j, sum(l.energy_j for l in lines))
    assert _close(t.bare_energy_j, sum(l.bare_energy_j for l in lines))
    assert _close(t.cost, sum(l.cost for l in lines))
    assert _close(t.co2_kg, sum(l.co2_kg for l in lines))
    if t.installed_cost is not None:
        assert _close(t.installed_cost, sum(l.installed_cost for l in lines if l.installed_cost is not None))


def test_every_line_saves_and_is_in_the_schedule(solved):  # invariant
    bands = {(r.service, r.condition, s): r.thickness_m for r in solved.rows for s in r.sizes}
    for line in solved.lines:
        assert abs(line.heat_flow_w) < abs(line.bare_heat_flow_w)
        assert bands[(line.service, line.condition, line.size)] == line.thickness_m


def test_line_energy_follows_the_definition(solved):
    # E = |Q| h 3600 / eta (heat loss) or / COP (heat gain): ISO 12241 annual heat loss (from memory)
    project = solved.project
    for line in solved.lines:
        energy = project.services[line.service].energy
        cold = line.heat_flow_w < 0
        divisor = energy.cop if cold and energy.cop else energy.efficiency
        expected = abs(line.heat_flow_w) * energy.hours_per_year * 3600.0 / divisor
        assert math.isclose(line.energy_j, expected, rel_tol=1e-12)


def test_energy_total_in_kwh_matches_pint(solved, capsys):
    ureg = pint.UnitRegistry()
    kwh = (solved.totals.energy_j * ureg.joule).to(ureg.kilowatt_hour).magnitude  # pint
    from pipeins.units import to_display

    assert math.isclose(to_display(solved.totals.energy_j, "energy", "si"), kwh, rel_tol=1e-12)


def test_all_criteria_and_both_rule_sets_are_exercised():
    seen, codes, kinds = set(), set(), set()
    for name in NAMES:
        project = load_project(EXAMPLES / name)
        for service in project.services.values():
            seen.update(service.criteria)
            codes.add(service.code)
        kinds.update(l.size.kind for l in project.lines)
    assert seen == {"code", "touch", "condensation", "heat_flow", "temp_change", "freeze", "economic"}
    assert {"ashrae-90.1-2019", "de-geg-annex-8"} <= codes
    assert kinds == {"steel", "copper", "metric"}


# -- the command ---------------------------------------------------------------------------------
@pytest.fixture
def run(capsys):
    def _run(*args):
        with pytest.raises(SystemExit) as exc:
            main(list(args))
        captured = capsys.readouterr()
        assert "Traceback" not in captured.out + captured.err
        return exc.value.code or 0, captured.out, captured.err

    return _run


def test_cli_json_is_one_document(run):
    code, out, err = run("schedule", str(EXAMPLES / "district_heating_plant.toml"), "--format", "json")
    assert code == 0, err
    data = json.loads(out)
    assert {"schedule", "lines", "totals", "warnings", "cautions"} <= set(data)
    assert math.isclose(data["totals"]["heat_flow_w"], sum(l["heat_flow_w"] for l in data["lines"]), rel_tol=1e-9)


def test_cli_text_and_markdown(run):
    code, out, _ = run("schedule", str(EXAMPLES / "district_heating_plant.toml"))
    assert code == 0 and "Insulation schedule" in out and "DN100 – DN200" in out
    code, out, _ = run("schedule", str(EXAMPLES / "district_heating_plant.toml"), "--format", "markdown")
    assert code == 0 and out.startswith("# Insulation schedule")


def test_cli_csv_writes_one_file_per_table(run, tmp_path):
    folder = tmp_path / "csv"
    code, out, err = run("schedule", str(EXAMPLES / "district_heating_plant.toml"), "--format", "csv",
                         "--output", str(folder))
    assert code == 0, err
    assert sorted(p.name for p in folder.iterdir()) == ["lines.csv", "schedule.csv", "totals.csv"]
    assert (folder / "lines.csv").read_text(encoding="utf-8").count("\n") == 11  # heading + 10 lines
    assert not [p for p in tmp_path.iterdir() if p.name.startswith(".pipeins-")]
