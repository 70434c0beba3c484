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
    assert _close(t.heat_loss_w.insulated, sum(max(l.heat_flow_w, 0) for l in lines))
    assert _close(t.heat_loss_w.bare, sum(max(l.bare_heat_flow_w, 0) for l in lines))
    assert _close(t.heat_gain_w.insulated, sum(max(-l.heat_flow_w, 0) for l in lines))
    assert _close(t.heat_gain_w.bare, sum(max(-l.bare_heat_flow_w, 0) for l in lines))
    for duty, money in (("heating", t.heating), ("cooling", t.cooling)):
        assert _close(money["energy_j"].insulated, sum(getattr(l, f"{duty}_energy_j") for l in lines))
        assert _close(money["cost"].bare, sum(getattr(l, f"bare_{duty}_cost") for l in lines))
        assert _close(money["co2_kg"].insulated, sum(getattr(l, f"{duty}_co2_kg") for l in lines))
    if t.installed_cost is not None:
        covered = [l for l in lines if l.tag in t.payback_lines]
        assert _close(t.installed_cost, sum(l.installed_cost for l in covered))
        assert _close(t.cost_saving, sum(l.cost_saving() for l in covered))  # one set of lines


def test_saving_is_bare_minus_insulated(solved):  # issue 8 §1: the rows subtract
    t = solved.totals
    figures = [t.heat_loss_w, t.heat_gain_w] + list(t.heating.values()) + list(t.cooling.values())
    for f in figures:
        if f.bare is not None:
            assert f.saving == f.bare - f.insulated  # exactly, on the totals themselves


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
        if line.heat_flow_w < 0:
            expected, other = abs(line.heat_flow_w) * energy.hours_per_year * 3600.0 / energy.cop, line.heating_energy_j
            got = line.cooling_energy_j
        else:
            expected = line.heat_flow_w * energy.hours_per_year * 3600.0 / energy.efficiency
            got, other = line.heating_energy_j, line.cooling_energy_j
        assert math.isclose(got, expected, rel_tol=1e-12)
        assert other == 0.0  # one duty per line: never netted


def test_examples_end_without_warning(solved):
    # the demo cost tables cover every thickness the examples select (issue 8 §3)
    assert solved.warnings == []
    if solved.totals.installed_cost is not None:
        assert solved.totals.lines_left_out == []


def test_energy_total_in_kwh_matches_pint(solved, capsys):
    ureg = pint.UnitRegistry()
    energy_j = solved.totals.heating["energy_j"].bare
    kwh = (energy_j * ureg.joule).to(ureg.kilowatt_hour).magnitude  # pint
    from pipeins.units import to_display

    assert math.isclose(to_display(energy_j, "energy", "si"), kwh, rel_tol=1e-12)


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
    assert math.isclose(data["totals"]["heat_loss_w"]["insulated"], sum(l["heat_loss_w"] for l in data["lines"]),
                        rel_tol=1e-9)


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
    assert sorted(p.name for p in folder.iterdir()) == ["investment.csv", "lines.csv", "locations.csv",
                                                        "schedule.csv", "services.csv", "totals.csv"]
    text = (folder / "lines.csv").read_text(encoding="utf-8")
    assert len([x for x in text.splitlines() if not x.startswith("#")]) == 11  # heading + 10 lines
    assert not [p for p in tmp_path.iterdir() if p.name.startswith(".pipeins-")]
