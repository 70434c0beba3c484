"""``pipeins check`` through its command line: error lines, output formats, the JSON contract
and two published worked examples solved from the command line.

Every case runs :func:`pipeins.cli.main` in-process (it turns bad input into ``Error: …``
and exit status 2), so the tests check exactly what a user sees, without subprocesses.
"""

from __future__ import annotations

import csv
import importlib
import importlib.util
import io
import json
import math

import pytest

from pipeins.cli import COMMANDS




BASE = ("check", "--pipe", "DN50", "--fluid-temp", "80C", "--ambient-temp", "20C")
INSULATED = BASE + ("--layer", "mineral wool:30mm")


# ----------------------------------------------------------------------------- bad input
# Every bad input gives exactly one line "Error: <option>: <what is allowed>" on stderr,
# nothing on stdout, and exit status 2 (the contract of pipeins.cli.main).
BAD_INPUT = [
    pytest.param(BASE + ("--layer", "mineral wool:-5mm"),
                 'Error: --layer: thickness of "mineral wool" must be greater than zero',
                 id="negative-thickness"),
    pytest.param(BASE + ("--layer", "mineral wool:0mm"),
                 'Error: --layer: thickness of "mineral wool" must be greater than zero',
                 id="zero-thickness"),
    pytest.param(BASE + ("--layer", "minral wool:50mm"),
                 'Error: --layer: unknown material "minral wool"; did you mean "mineral wool"?',
                 id="unknown-material"),
    pytest.param(BASE + ("--layer", "mineral wool"),
                 'Error: --layer: "mineral wool" needs MATERIAL:THICKNESS, e.g. "mineral wool:50mm" '
                 'or "k=0.040:2in"',
                 id="layer-without-thickness"),
    pytest.param(INSULATED + ("--finish", "pvc jackt"),
                 'Error: --finish: unknown finish "pvc jackt"; did you mean "pvc jacket"?',
                 id="unknown-finish"),
    pytest.param(("check", "--pipe", "NPS 7", "--fluid-temp", "80C"),
                 'Error: --pipe: unknown pipe size "NPS 7"; did you mean "NPS 6" or "NPS 8"?',
                 id="unknown-pipe-size"),
    pytest.param(("check", "--pipe", "NPS 2", "--schedule", "45", "--fluid-temp", "80C"),
                 "Error: --schedule: NPS 2 has no schedule 45; available: 5S, 10S, 10, 30, 40, 40S, "
                 "STD, 80, 80S, XS, 160, XXS",
                 id="unknown-schedule"),
    pytest.param(INSULATED + ("--emittance", "1.5"),
                 "Error: --emittance: emittance must be above 0 and at most 1", id="emittance-1.5"),
    pytest.param(INSULATED + ("--emittance", "0"),
                 "Error: --emittance: emittance must be above 0 and at most 1", id="emittance-0"),
    pytest.param(INSULATED + ("--rh", "120"),
                 "Error: --rh: relative humidity must be above 0 and at most 100 %", id="rh-120"),
    pytest.param(INSULATED + ("--rh", "0"),
                 "Error: --rh: relative humidity must be above 0 and at most 100 %", id="rh-0"),
    pytest.param(("check", "--pipe", "DN50", "--fluid", "water", "--fluid-temp", "-5C",
                  "--layer", "mineral wool:30mm"),
                 "Error: --fluid-temp: -5 °C is below the freezing point of water (0.0 °C)",
                 id="water-below-freezing"),
    pytest.param(("check", "--pipe", "DN50", "--fluid-temp", "5 parsecs"),
                 'Error: --fluid-temp: cannot read "5 parsecs" as a temperature; use e.g. 150C, 300F '
                 "or 423K",
                 id="unreadable-temperature"),
    pytest.param(BASE + ("--layer", "mineral wool:5 parsecs"),
                 'Error: --layer: cannot read "5 parsecs" as a thickness; use e.g. 50mm, 2in or 0.05m',
                 id="unreadable-thickness"),
    pytest.param(("check", "--pipe", "DN50", "--layer", "mineral wool:30mm"),
                 "Error: --fluid-temp: the fluid temperature is missing (or give --steam-pressure)",
                 id="missing-fluid-temperature"),
    pytest.param(("check", "--od", "60mm", "--fluid-temp", "80C"),
                 "Error: --pipe: give a pipe size (NPS 2, DN50, copper L 1-1/8) or both --od and --wall",
                 id="od-without-wall"),
    pytest.param(INSULATED + ("--air-pressure", "95kPa", "--altitude", "1000m"),
                 "Error: --altitude: give --air-pressure or --altitude, not both",
                 id="pressure-and-altitude"),
    pytest.param(INSULATED + ("--format", "xml"),
                 'Error: --format: unknown format "xml"; use text, json, csv, markdown, html, xlsx',
                 id="unknown-format"),
]


@pytest.mark.parametrize("args, line", BAD_INPUT)
def test_bad_input_gives_one_exact_error_line(run, args, line):
    code, out, err = run(*args)
    assert code == 2
    assert out == ""
    assert err.splitlines() == [line]


@pytest.mark.parametrize("args, line", BAD_INPUT[:4] + BAD_INPUT[-1:])
def test_no_output_file_on_bad_input(run, tmp_path, args, line):
    target = tmp_path / "result.json"
    code, _, err = run(*args, "--output", str(target))
    assert code == 2 and err.splitlines() == [line]
    assert not target.exists()
    assert list(tmp_path.iterdir()) == []  # no temporary file left behind either


# ----------------------------------------------------------------------------- warnings
HOT_FOAM = ("check", "--pipe", "NPS 4", "--fluid-temp", "180C", "--ambient-temp", "25C",
            "--layer", "elastomeric foam:25mm", "--layer", "mineral wool:50mm")
FOAM_WARNING = ("layer 1 (flexible elastomeric foam tube): reaches 180.0 °C, above its usable "
                "limit of 105 °C")


def test_layer_outside_usable_range_is_a_warning_in_text(run):
    code, out, err = run(*HOT_FOAM)
    assert code == 0 and err == ""
    assert "Warnings" in out
    assert FOAM_WARNING in out


def test_layer_outside_usable_range_is_a_warning_in_json(run):
    code, out, _ = run(*HOT_FOAM, "--format", "json")
    assert code == 0
    warnings = json.loads(out)["warnings"]
    assert any(w.startswith(FOAM_WARNING) for w in warnings)
    assert all(isinstance(w, str) for w in warnings)


def test_bare_pipe_without_finish_runs(run):
    # a bare line without --finish or --emittance takes the oxidised-steel surface
    code, out, _ = run("check", "--pipe", "NPS 4", "--fluid-temp", "180C", "--format", "json")
    assert code == 0
    data = json.loads(out)
    assert data["line"]["layers"] == []
    assert data["line"]["emittance"] == pytest.approx(0.80)  # tables/finishes.csv, bare steel, oxidised


# ----------------------------------------------------------------------------- JSON contract
def _json(run, *args):
    code, out, err = run(*args, "--format", "json")
    assert code == 0, err
    return json.loads(out)


def test_json_contract(run):
    data = _json(run, *INSULATED, "--layer", "k=0.040:20mm")
    for key in ("heat_flow_w_per_m", "surface_temp_c", "h_conv_w_m2k", "h_rad_w_m2k"):
        assert isinstance(data[key], float) and math.isfinite(data[key]), key
    temps = data["interface_temps_c"]
    # bore, pipe outside, after each of the two layers
    assert isinstance(temps, list) and len(temps) == 2 + 2
    assert temps[-1] == pytest.approx(data["surface_temp_c"], abs=1e-9)
    assert temps == sorted(temps, reverse=True)  # heat flows outward, temperatures fall
    assert data["dew_point_c"] is None  # no --rh
    assert isinstance(data["warnings"], list)
    assert all(isinstance(w, str) for w in data["warnings"])
    assert data["heat_flow_w_per_m"] > 0


def test_json_dew_point_with_rh(run):
    data = _json(run, "check", "--pipe", "DN50", "--fluid-temp", "6C", "--ambient-temp", "28C",
                 "--rh", "75", "--layer", "elastomeric foam:19mm")
    import psychrolib

    psychrolib.SetUnitSystem(psychrolib.SI)
    expected = psychrolib.GetTDewPointFromRelHum(28.0, 0.75)
    assert isinstance(data["dew_point_c"], float)
    assert data["dew_point_c"] == pytest.approx(expected, abs=0.05)  # psychrolib (ASHRAE Handbook Fundamentals 2017 ch. 1)
    assert data["heat_flow_w_per_m"] < 0  # chilled line gains heat


def test_json_is_si_whatever_units(run):
    args = ("check", "--pipe", "NPS 2", "--fluid-temp", "150C", "--ambient-temp", "20C",
            "--layer", "mineral wool:40mm", "--wind", "3m/s", "--rh", "60", "--length", "50m")
    si = _json(run, *args, "--units", "si")
    us = _json(run, *args, "--units", "us")
    assert si == us


def test_text_output_follows_units(run):
    _, si, _ = run(*INSULATED, "--units", "si")
    _, us, _ = run(*INSULATED, "--units", "us")
    assert "heat flow [W/m]" in si and "°C" in si
    assert "heat flow [Btu/(h·ft)]" in us and "°F" in us


# ----------------------------------------------------------------------------- formats
def test_csv_is_header_and_one_row(run):
    code, out, _ = run(*INSULATED, "--format", "csv")
    assert code == 0
    assert out.startswith("# Heat flow check")  # basis and cautions as comment lines first
    rows = list(csv.reader(io.StringIO("".join(x for x in out.splitlines(True) if not x.startswith("#")))))
    assert len(rows) == 2
    assert rows[0][0] == "heat flow [W/m]"
    assert len(rows[0]) == len(rows[1])
    assert float(rows[1][0]) > 0


def test_markdown_has_pipe_tables(run):
    code, out, _ = run(*INSULATED, "--format", "markdown")
    assert code == 0
    assert out.startswith("# ")
    table_lines = [ln for ln in out.splitlines() if ln.startswith("|")]
    assert len(table_lines) >= 6
    assert any(set(ln) <= set("|:- ") for ln in table_lines)  # a header separator row


def test_output_file_is_written_whole(run, tmp_path):
    target = tmp_path / "check.json"
    code, out, _ = run(*INSULATED, "--format", "json", "--output", str(target))
    assert code == 0 and out == ""
    _, printed, _ = run(*INSULATED, "--format", "json")
    assert target.read_text(encoding="utf-8") == printed
    assert [p.name for p in tmp_path.iterdir()] == ["check.json"]


# ----------------------------------------------------------------------------- published checks
def test_bare_steam_pipe_in_a_room(run):
    # Incropera, DeWitt, Bergman & Lavine, Fundamentals of Heat and Mass Transfer, 6th ed.,
    # Example 9.3 (from memory): horizontal pipe, D = 0.1 m, surface 165 °C, room air and walls
    # 23 °C, emittance 0.85, still air: h = 7.29 W/(m²·K), q' = 766 W/m (convection 325 +
    # radiation 441).  The example fixes the surface temperature; here a 1 mm copper wall with the
    # bore at 165 °C puts the surface within 0.1 K of it.
    data = _json(run, "check", "--od", "100mm", "--wall", "1mm", "--pipe-material", "copper",
                 "--fluid-temp", "165C", "--ambient-temp", "23C", "--emittance", "0.85")
    assert data["surface_temp_c"] == pytest.approx(165.0, abs=0.1)
    assert data["heat_flow_w_per_m"] == pytest.approx(766.0, rel=0.02)  # Incropera 6th ed. Ex. 9.3 (from memory)
    assert data["h_conv_w_m2k"] == pytest.approx(7.29, rel=0.03)  # Incropera 6th ed. Ex. 9.3 (from memory)


def test_insulated_steam_pipe_fixed_coefficients(run):
    # Cengel & Ghajar, Heat and Mass Transfer, ch. 3 example "heat loss through an insulated steam
    # pipe" (from memory): steam 320 °C, D1 = 5 cm, D2 = 5.5 cm, wall k = 80 W/(m·K), 3 cm of
    # insulation k = 0.05, h_inside 60, combined h_outside 18 W/(m²·K), surroundings 5 °C:
    # Q/L = 121 W/m.  The catalogue has no k = 80 wall; the default carbon steel (k = 60.5) is
    # used instead.  The wall resistance is ln(55/50)/(2π k) = 1.9e-4 (k = 80) or 2.5e-4 (k = 60.5)
    # K·m/W against a total of 2.61 K·m/W, so the choice moves Q/L by 0.002 % – far below the
    # 3 digits the example prints.
    data = _json(run, "check", "--od", "55mm", "--wall", "2.5mm", "--inner-h", "60",
                 "--layer", "k=0.05:30mm", "--outer-h", "18", "--fluid-temp", "320C",
                 "--ambient-temp", "5C")
    assert data["heat_flow_w_per_m"] == pytest.approx(121.0, rel=0.015)  # Cengel & Ghajar ch. 3 (from memory)
    bore, pipe_outside = data["interface_temps_c"][:2]
    assert bore - pipe_outside == pytest.approx(0.02, abs=0.02)  # Cengel & Ghajar: ~0.02 °C across the wall
    assert data["h_rad_w_m2k"] == 0.0  # a fixed combined coefficient replaces radiation


# ----------------------------------------------------------------------------- help
def _existing_commands():
    return [name for name, (module, _, _) in COMMANDS.items() if importlib.util.find_spec(module)]


def test_top_level_help_lists_commands(run):
    code, out, err = run("--help")
    assert code == 0 and err == ""
    assert "Commands:" in out
    for name in _existing_commands():
        assert f"  {name} " in out


@pytest.mark.parametrize("name", list(COMMANDS))
def test_every_command_help_has_an_example(run, name):
    assert name in _existing_commands()  # every command the group names exists
    code, out, err = run(name, "--help")
    assert code == 0 and err == ""
    assert "Example:" in out
    # the Example block keeps its line breaks (click's \b marker)
    example = out.split("Example:", 1)[1].splitlines()
    assert example[1].strip().startswith("pipeins ")


def test_unwritable_output_path_is_an_input_error(run, tmp_path):
    code, out, err = run(*BASE, "--layer", "mineral wool:40mm", "--output", str(tmp_path / "missing" / "x.txt"))
    assert code == 2 and out == ""
    assert err.startswith("Error: --output: cannot write ")


def test_fluid_temperature_above_the_property_tables_is_refused(run):
    code, _, err = run("check", "--pipe", "DN50", "--fluid-temp", "1200C", "--layer", "mineral wool:40mm")
    assert code == 2
    assert err.strip() == ("Error: --fluid-temp: temperature must be above absolute zero (-273.15 °C) "
                           "and at most 1000 °C")


def test_cold_line_without_humidity_says_condensation_was_not_checked(run):
    code, out, _ = run("check", "--pipe", "DN50", "--fluid-temp", "6C", "--ambient-temp", "28C",
                       "--layer", "elastomeric foam:19mm", "--format", "json")
    assert code == 0
    assert "condensation not checked: the line is colder than the air; give --rh" in json.loads(out)["warnings"]


@pytest.mark.parametrize("extra, line", [
    (("--outer-h", "10", "--wind", "3m/s"),
     "Error: --outer-h: a fixed outer coefficient replaces convection and radiation; drop --wind"),
    (("--height", "3m"), "Error: --height: the height applies to a vertical run; add --orientation vertical"),
])
def test_options_that_would_be_ignored_are_refused(run, extra, line):
    code, out, err = run(*BASE, "--layer", "mineral wool:40mm", *extra)
    assert code == 2 and out == "" and err.strip() == line
