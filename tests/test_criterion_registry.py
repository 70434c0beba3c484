"""The sizing criteria as registered records (pipeins.criteria.registry).

Walks every record: its options exist on ``size`` and ``table``, its project-file name and keys
are accepted by the project reader, its key appears in the JSON of ``size`` and ``table`` where
it applies and its label in the text report, and a criterion asked for on a section it does not
apply to is a one-line error.  A toy criterion registered by a fixture (tests only, not shipped)
shows that a new criterion is one module plus one registry entry: ``build_criteria`` and
``select`` pick it up, and an independent solve at its least thickness sits on its limit.

The expectations are this tool's own contract (no outside source applies), except the toy's
check at its limit, which is the ordinary energy balance of the solved line.
"""

from __future__ import annotations

import json
from dataclasses import dataclass, fields
from pathlib import Path

import click
import numpy as np
import pytest

from pipeins.criteria import Requirements, build_criteria, registry
from pipeins.criteria.base import Criterion
from pipeins.criteria.registry import CriterionRecord, records

EXAMPLES = Path(__file__).resolve().parents[1] / "examples"


def _command(name):
    from pipeins.cli import cli

    return cli.get_command(None, name)


def _long_flags(command):
    out = set()
    for param in command.params:
        if isinstance(param, click.Option):
            out |= {f for f in param.opts + param.secondary_opts if f.startswith("--")}
    return out


# -- the records themselves ------------------------------------------------------------------
def test_keys_and_names_are_unique():
    keys = [r.key for r in records()]
    names = [r.name for r in records() if r.name]
    assert len(keys) == len(set(keys)) and len(names) == len(set(names))


def test_every_record_either_is_built_or_gives_a_thickness_or_is_always_on():
    for r in records():
        assert (r.decide is not None) + (r.required is not None) + r.always == 1, r.key
        assert set(r.kinds) <= set(registry.SECTION_KINDS), r.key
        assert set(r.asks) <= set(r.inputs), r.key
        if r.decide is not None or r.required is not None:
            assert callable(registry.resolve(r.decide or r.required)), r.key


def test_every_requirement_field_is_read_by_a_criterion():
    from pipeins.inputs import REQUIREMENT_PARAMS

    read = set().union(*(r.fields for r in records()))
    own = {f.name for f in fields(Requirements)}
    assert read == own
    assert set(REQUIREMENT_PARAMS) == own


@pytest.mark.parametrize("command", ["size", "table"])
def test_every_option_of_a_criterion_is_on_size_and_table(command):
    flags = _long_flags(_command(command))
    for r in records():
        assert r.options, r.key
        missing = [o for o in r.options if o not in flags]
        assert missing == [], f"{r.key}: {missing} not on {command}"


def test_every_sizing_option_belongs_to_a_criterion():
    from pipeins.cli.sizing_options import SIZING_OPTIONS

    @click.command()
    def probe(**kw):
        pass

    for option in SIZING_OPTIONS:
        probe = option(probe)
    claimed = set().union(*(r.options for r in records())) | {"--series"}
    assert _long_flags(probe) - {"--help"} <= claimed


def test_the_error_options_of_unmet_criteria_follow_the_records():
    # the option an unmet criterion's error names is its record's first, an option of size and table
    from pipeins.reports.sizing import ALL_KEYS

    flags = set(_long_flags(_command("size"))) & set(_long_flags(_command("table")))
    for r in records():
        assert r.options and registry.error_option(r.key) == r.options[0] in flags, r.key
    assert registry.error_option("no such criterion") == "--series" == registry.error_option("")
    assert set(ALL_KEYS) <= {r.key for r in records()}


# -- the project file ------------------------------------------------------------------------
def test_criterion_words_are_the_registered_ones():
    from pipeins.cli.condition_options import CRITERIA_WORDS
    from pipeins.inputs import CLI_ONLY
    from pipeins.project import CRITERIA, KEYS

    assert CRITERIA == registry.project_names()
    assert CRITERIA_WORDS == registry.names()
    assert set(CRITERIA) <= set(CRITERIA_WORDS)
    all_keys = set().union(*KEYS.values())
    for r in records():
        assert (r.name is None) == r.always, r.key
        if not r.project and not r.always:  # command line only: each option says why
            assert all(o in CLI_ONLY for o in r.options), r.key
        else:
            assert set(r.file_keys) <= all_keys, r.key


PROJECT = """\
[project]
name = "Registry test (invented)"
units = "si"

[conditions.room]
air = "{air}"
rh = 60

[services.line]
fluid = "water"
temperature = "{temp}"
material = "mineral wool"
criteria = ["{name}"]
{keys}

[[lines]]
service = "line"
size = "NPS 2"
length = "10 m"
condition = "room"
"""

#: What each project criterion needs in its service (a test fails when a criterion is added
#: to the registry without its line here).
PROJECT_KEYS = {
    "code": ('code = "ashrae-90.1-2019"', "80 C", "20 C"),
    "touch": ("", "80 C", "20 C"),
    "condensation": ("", "6 C", "25 C"),
    "heat_flow": ('max_heat_flow = "20 W/m"', "80 C", "20 C"),
    "heat_flux": ('max_heat_flux = "30 W/m2"', "80 C", "20 C"),
    "temp_change": ('max_temp_change = "2 K"\nflow = "1 kg/s"', "80 C", "20 C"),
    "freeze": ('hold_time = "8 h"', "10 C", "-10 C"),
    "tracer": ('maintain_temp = "5 C"\nmin_ambient = "-20 C"\ntracer_output = "15 W/m"', "10 C", "-5 C"),
    "economic": (f'cost_table = "{(EXAMPLES / "costs_demo.csv").as_posix()}"\nprice = "0.09/kWh"', "80 C", "20 C"),
}


def _project(name, keys, temp, air):
    return PROJECT.format(name=name, keys=keys, temp=temp, air=air)


PROJECT_RECORDS = [r for r in records() if r.name in registry.project_names()]


@pytest.mark.parametrize("record", PROJECT_RECORDS, ids=lambda r: r.key)
def test_project_reader_accepts_each_criterion_with_its_keys(record):
    from pipeins.project import parse_project

    keys, temp, air = PROJECT_KEYS[record.name]
    project = parse_project(_project(record.name, keys, temp, air), "registry.toml")
    assert project.services["line"].criteria == (record.name,)


def _asked_in_services(record):
    from pipeins.inputs import BY_NAME

    return any("services" in BY_NAME[a].tables for a in record.asks)


@pytest.mark.parametrize("record", [r for r in PROJECT_RECORDS if _asked_in_services(r)], ids=lambda r: r.key)
def test_project_reader_asks_for_the_keys_of_each_criterion(record):
    from pipeins.inputs import BY_NAME
    from pipeins.project import ProjectError, parse_project

    _, temp, air = PROJECT_KEYS[record.name]
    with pytest.raises(ProjectError) as exc:
        parse_project(_project(record.name, "", temp, air), "registry.toml")
    text = str(exc.value)
    assert f'criterion "{record.name}" needs the key' in text
    for name in record.asks:
        assert f'"{BY_NAME[name].key}"' in text


def test_only_the_listed_criteria_are_asked_for():
    from pipeins.project import parse_project

    keys = 'max_heat_flow = "20 W/m"\nmax_heat_flux = "30 W/m2"\nhold_time = "8 h"'
    req = parse_project(_project("touch", keys, "80 C", "20 C"), "registry.toml").services["line"].requirements
    assert req.touch and (req.max_heat_flow_w_per_m, req.max_heat_flux_w_m2, req.hold_time_s) == (None, None, None)
    req = parse_project(_project("heat_flow", keys, "80 C", "20 C"), "registry.toml").services["line"].requirements
    assert not req.touch and req.max_heat_flow_w_per_m == pytest.approx(20.0) and req.hold_time_s is None


def test_a_service_without_a_list_takes_the_default_criteria():
    from pipeins.project import parse_project

    text = _project("touch", "", "80 C", "20 C").replace('criteria = ["touch"]\n', "")
    project = parse_project(text, "registry.toml")
    assert project.services["line"].criteria == tuple(r.name for r in records() if r.default)


# -- size and table, every record ------------------------------------------------------------
HOT = ["--fluid-temp", "180C", "--ambient-temp", "25C", "--material", "mineral wool"]
#: A line on which each criterion applies (``size`` arguments after the section).
WHERE = {
    "code": (["--pipe", "NPS 3"], ["--fluid-temp", "120C", "--ambient-temp", "20C", "--material", "mineral wool",
                                   "--code", "ashrae-90.1-2019"]),
    "surface_temp": (["--pipe", "NPS 4"], HOT),
    "condensation": (["--pipe", "DN80"], ["--fluid-temp", "6C", "--ambient-temp", "30C", "--rh", "80",
                                          "--material", "flexible elastomeric foam"]),
    "heat_flow": (["--pipe", "NPS 4"], HOT + ["--max-heat-flow", "120W/m"]),
    "heat_flux": (["--duct", "600x400mm"], ["--fluid-temp", "40C", "--ambient-temp", "20C", "--material",
                                            "glass wool", "--max-heat-flux", "15W/m2"]),
    "temp_change": (["--pipe", "DN50"], ["--fluid-temp", "60C", "--ambient-temp", "10C", "--fluid", "water",
                                         "--flow", "2 m3/h", "--length", "200m", "--max-temp-change", "1K",
                                         "--material", "mineral wool"]),
    "freeze": (["--pipe", "DN50"], ["--fluid-temp", "10C", "--ambient-temp", "-15C", "--hold-time", "2h",
                                    "--no-touch-check", "--material", "mineral wool"]),
    "tracer": (["--pipe", "DN50"], ["--fluid-temp", "5C", "--ambient-temp", "-20C", "--tracer-output", "15W/m",
                                    "--material", "mineral wool"]),
    "economic": (["--pipe", "NPS 3"], ["--fluid-temp", "120C", "--ambient-temp", "20C", "--material", "mineral wool",
                                       "--cost-table", str(EXAMPLES / "costs_demo.csv"),
                                       "--energy-price", "0.09/kWh"]),
    "service_limit": (["--pipe", "NPS 4"], ["--fluid-temp", "100C", "--ambient-temp", "20C", "--material",
                                            "polyisocyanurate foam"]),
}


def test_every_record_has_a_line_where_it_applies():
    assert set(WHERE) == {r.key for r in records()}


@pytest.mark.parametrize("record", records(), ids=lambda r: r.key)
def test_key_in_size_json_and_label_in_text(run, record):
    section, rest = WHERE[record.key]
    code, out, err = run("size", *section, *rest, "--format", "json")
    assert code == 0, err
    data = json.loads(out)
    assert record.key in [c["key"] for c in data["criteria"]]
    code, out, err = run("size", *section, *rest, "--units", "us")
    assert code == 0, err
    assert record.label in out


@pytest.mark.parametrize("record", records(), ids=lambda r: r.key)
def test_key_in_table_json(run, record):
    section, rest = WHERE[record.key]
    flag, size = section
    sizes = ["--ducts", size] if flag == "--duct" else ["--sizes", f"{size}..{size}"]
    code, out, err = run("table", *sizes, *rest, "--format", "json")
    assert code == 0, err
    assert record.key in json.loads(out)["criteria"]


@pytest.mark.parametrize("args, expected", [
    (["--sphere", "2.5m", "--fluid-temp", "30C", "--ambient-temp", "-10C", "--hold-time", "4h", "--no-touch-check"],
     "Error: --hold-time: freeze protection (hold time) applies to pipes, not to a sphere"),
    (["--vessel", "vertical", "--diameter", "3m", "--length", "5m", "--fluid-temp", "30C", "--ambient-temp", "-20C",
      "--tracer-output", "20W/m"], "Error: --tracer-output: tracer output applies to pipes and ducts, not to a vessel"),
    (["--vessel", "vertical", "--diameter", "3m", "--length", "5m", "--fluid-temp", "150C", "--ambient-temp", "20C",
      "--code", "ashrae-90.1-2019"], "Error: --code: code minimum applies to pipes and ducts, not to a vessel"),
    (["--face", "vertical", "--height", "2m", "--fluid-temp", "10C", "--ambient-temp", "-10C", "--hold-time", "4h"],
     "Error: --hold-time: freeze protection (hold time) applies to pipes, not to a face"),
], ids=["freeze-sphere", "tracer-vessel", "code-vessel", "freeze-face"])
def test_a_criterion_on_a_section_it_does_not_apply_to_is_one_line(run, args, expected):
    code, out, err = run("size", *args, "--material", "mineral wool")
    assert (code, out, err.strip()) == (2, "", expected)


# -- a toy criterion, registered by a fixture ------------------------------------------------
@dataclass(frozen=True)
class ToyRequirements(Requirements):
    """The requirements with the toy's own field."""

    max_surface_rise_k: float | None = None


@dataclass
class SurfaceRise(Criterion):
    """Toy: the outer surface at most ``max_rise_k`` [K] above the air."""

    max_rise_k: float
    key = "surface_rise"
    label = "surface rise"

    def margin(self, problem, result, thickness_m):
        return self.max_rise_k - (result.surface_temp_c - np.asarray(problem.surroundings.air_temp_c, float))

    def describe(self, units="si"):
        return f"surface at most {self.max_rise_k:g} K above the air"

    def miss(self, margin, thickness_m):
        return f"surface rise cannot be met: {-margin:.1f} K over"


def decide_surface_rise(line):
    if line.req.max_surface_rise_k is None:
        return None
    return SurfaceRise(line.req.max_surface_rise_k)


@pytest.fixture
def toy(monkeypatch):
    monkeypatch.setattr(registry, "RECORDS", list(registry.RECORDS))
    return registry.register(CriterionRecord("surface_rise", "surface rise", ("max_surface_rise_k",),
                                             asks=("max_surface_rise_k",), kinds=("pipe",),
                                             decide=decide_surface_rise))


def test_toy_criterion_is_built_where_asked(toy):
    from pipeins.line import LineSpec

    spec = LineSpec(pipe="NPS 4", fluid_temp_c=180.0, air_temp_c=25.0)
    criteria, notes = build_criteria(spec, ToyRequirements(max_surface_rise_k=10.0), np.array([180.0]),
                                     np.array([25.0]), "non_metallic")
    assert [c.key for c in criteria] == ["surface_temp", "surface_rise"] and notes == []
    criteria, _ = build_criteria(spec, ToyRequirements(), np.array([180.0]), np.array([25.0]), "non_metallic")
    assert [c.key for c in criteria] == ["surface_temp"]
    assert registry.by_key("surface_rise") is toy
    assert "surface_rise" not in [r.key for r in registry.RECORDS[:-2]] and registry.RECORDS[-1].always


def test_toy_criterion_sizes_and_sits_on_its_limit(toy):
    from pipeins.line import LineSpec
    from pipeins.selection import select

    spec = LineSpec(pipe="NPS 4", fluid_temp_c=180.0, air_temp_c=25.0)
    sel = select(spec, "mineral wool", ToyRequirements(max_surface_rise_k=10.0))
    rec = next(c for c in sel.outcome.criteria if c.key == "surface_rise")
    least = float(rec.required_m[0])
    assert sel.outcome.governing[0] == "surface_rise"
    # an independent solve at the least thickness sits on the limit; 0.5 mm less fails
    at = LineSpec(pipe="NPS 4", fluid_temp_c=180.0, air_temp_c=25.0, layers=(("mineral wool", least),)).solve()
    less = LineSpec(pipe="NPS 4", fluid_temp_c=180.0, air_temp_c=25.0,
                    layers=(("mineral wool", least - 0.0005),)).solve()
    assert float(np.ravel(at.surface_temp_c)[0]) - 25.0 == pytest.approx(10.0, abs=0.02)
    assert float(np.ravel(less.surface_temp_c)[0]) - 25.0 > 10.0


def test_toy_criterion_refused_on_a_duct(toy):
    from pipeins.errors import InputError
    from pipeins.line import LineSpec

    spec = LineSpec(duct="600x400mm", fluid_temp_c=40.0, air_temp_c=20.0)
    with pytest.raises(InputError, match="surface rise applies to pipes, not to a duct"):
        build_criteria(spec, ToyRequirements(max_surface_rise_k=10.0), np.array([40.0]), np.array([20.0]),
                       "non_metallic")
