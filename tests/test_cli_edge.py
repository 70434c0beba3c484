"""The input rules at the edge, through the command line: percent, efficiency, steam pressure,
conductivity in US units, finite numbers and physical ranges, clean streams.

Each rule is asserted with its exact ``Error:`` line (project convention: one line, the input
as the user wrote it, what is allowed, exit 2, nothing on stdout).
"""

from __future__ import annotations

import json
import os
import subprocess
import sys
from pathlib import Path

import pint
import pytest

from pipeins.project import ProjectError, parse_project

ROOT = Path(__file__).resolve().parents[1]
ureg = pint.UnitRegistry()

CHECK = ["check", "--pipe", "DN50", "--fluid-temp", "6C", "--ambient-temp", "28C",
         "--layer", "flexible elastomeric foam:19mm"]
HOT = ["check", "--pipe", "NPS 4", "--fluid-temp", "180C", "--layer", "mineral wool:50mm"]
COST = ["cost", "--pipe", "NPS 4", "--fluid-temp", "82C", "--layer", "mineral wool:50mm",
        "--energy-price", "0.09/kWh"]
SIZE = ["size", "--pipe", "NPS 4", "--fluid-temp", "180C", "--material", "mineral wool",
        "--no-touch-check"]


def json_of(run, *args):
    code, out, err = run(*args, "--format", "json")
    assert code == 0, err
    return json.loads(out)


def error_line(run, *args):
    code, out, err = run(*args)
    assert code == 2 and out == ""
    lines = err.splitlines()
    assert len(lines) == 1, err
    return lines[0]


# --------------------------------------------------------------------------------------
# Percent: RH and rates
# --------------------------------------------------------------------------------------
@pytest.mark.parametrize("text", ["80", "80 %", "80%", "80 percent"])
def test_rh_is_percent_in_every_spelling(run, text):
    # the four spellings agree exactly, and give the dew point of 28 °C air at 80 % RH that
    # psychrolib computes (ASHRAE Handbook Fundamentals 2017 ch. 1 equations)
    import psychrolib

    psychrolib.SetUnitSystem(psychrolib.SI)
    data = json_of(run, *CHECK, "--rh", text)
    assert data["dew_point_c"] == json_of(run, *CHECK, "--rh", "80")["dew_point_c"]
    assert data["dew_point_c"] == pytest.approx(psychrolib.GetTDewPointFromRelHum(28.0, 0.80), abs=0.05)


@pytest.mark.parametrize("args, line", [
    pytest.param(CHECK + ["--rh", "0.8"],
                 "Error: --rh: 0.8 is read as percent; did you mean 80 %? (write 0.8 % if you mean it)",
                 id="rh-fraction"),
    pytest.param(CHECK + ["--rh", "1"],
                 "Error: --rh: 1 is read as percent; did you mean 100 %? (write 1 % if you mean it)",
                 id="rh-one"),
    pytest.param(COST + ["--discount-rate", "0.05"],
                 "Error: --discount-rate: 0.05 is read as percent; did you mean 5 %? "
                 "(write 0.05 % if you mean it)", id="discount-fraction"),
    pytest.param(COST + ["--escalation", "0.025"],
                 "Error: --escalation: 0.025 is read as percent; did you mean 2.5 %? "
                 "(write 0.025 % if you mean it)", id="escalation-fraction"),
    pytest.param(COST + ["--maintenance", "0.5"],
                 "Error: --maintenance: 0.5 is read as percent; did you mean 50 %? "
                 "(write 0.5 % if you mean it)", id="maintenance-fraction"),
    pytest.param(SIZE + ["--min-reduction", "0.9"],
                 "Error: --min-reduction: 0.9 is read as percent; did you mean 90 %? "
                 "(write 0.9 % if you mean it)", id="min-reduction-fraction"),
    pytest.param(CHECK + ["--rh", "eighty"],
                 'Error: --rh: cannot read "eighty" as a percentage; use e.g. 50, 50% or 12.5%',
                 id="rh-words"),
])
def test_percent_rule_error_lines(run, args, line):
    assert error_line(run, *args) == line


def test_percent_with_sign_is_taken_as_written(run):
    # 0.5 % written with its sign is half a percent, not refused (project rule).
    table = ["--cost-table", str(ROOT / "examples" / "costs_demo.csv")]
    half = json_of(run, *COST, *table, "--discount-rate", "0.5 %")
    five = json_of(run, *COST, *table, "--discount-rate", "5 %")
    assert half != five


def test_rates_read_as_percent(run):
    # 5 and 5 % are the same discount rate (project rule).
    a = json_of(run, *COST, "--discount-rate", "5", "--escalation", "2", "--cost-table",
                str(ROOT / "examples" / "costs_demo.csv"))
    b = json_of(run, *COST, "--discount-rate", "5 %", "--escalation", "2%", "--cost-table",
                str(ROOT / "examples" / "costs_demo.csv"))
    assert a == b


# --------------------------------------------------------------------------------------
# Efficiency: 88 %, 88 and 0.88 are the same
# --------------------------------------------------------------------------------------
def test_efficiency_spellings_agree(run):
    results = [json_of(run, *COST, "--efficiency", text) for text in ("88%", "88 %", "88", "0.88")]
    assert all(r == results[0] for r in results)
    plain = json_of(run, *COST)
    # energy bought = heat lost / efficiency (definition)
    assert results[0]["bare"]["heating"]["energy_j"] == pytest.approx(
        plain["bare"]["heating"]["energy_j"] / 0.88, rel=1e-9)


@pytest.mark.parametrize("text", ["120%", "0", "-5%", "1e-320", "0.5 %"])
def test_efficiency_out_of_range(run, text):
    assert error_line(run, *COST, "--efficiency", text) == (
        f'Error: --efficiency: "{text}" is out of range; an efficiency is from 1 % to 100 % '
        "(88 %, 88 and 0.88 all mean 88 %)")


# --------------------------------------------------------------------------------------
# Steam pressure: gauge or absolute, always said
# --------------------------------------------------------------------------------------
@pytest.mark.parametrize("args, line", [
    pytest.param(["10"], 'Error: --steam-pressure: "10" needs a unit that says gauge or absolute; '
                         "write e.g. 10 barg (gauge) or 10 bara (absolute)", id="bare"),
    pytest.param(["10 bar"], 'Error: --steam-pressure: "10 bar" does not say gauge or absolute; '
                             "write e.g. 10 barg (gauge) or 10 bara (absolute)", id="bar"),
    pytest.param(["150psi"], 'Error: --steam-pressure: "150psi" does not say gauge or absolute; '
                             "write e.g. 150 psig (gauge) or 150 psia (absolute)", id="psi"),
    pytest.param(["1 MPa"], 'Error: --steam-pressure: "1 MPa" does not say gauge or absolute; '
                            "write e.g. 1 MPag (gauge) or 1 MPaa (absolute)", id="MPa"),
    pytest.param(["700 kPa"], 'Error: --steam-pressure: "700 kPa" does not say gauge or absolute; '
                              "write e.g. 700 kPag (gauge) or 700 kPaa (absolute)", id="kPa"),
])
def test_steam_pressure_needs_gauge_or_absolute(run, args, line):
    base = ["check", "--pipe", "NPS 4", "--layer", "mineral wool:50mm", "--steam-pressure"]
    assert error_line(run, *base, *args) == line


@pytest.mark.parametrize("gauge, absolute", [
    ("10 barg", "11.01325 bara"), ("10 bar(g)", "11.01325 bar(a)"), ("10 bar gauge", "11.01325 bar abs"),
    ("1 MPa(g)", "1.101325 MPa(a)"), ("1000 kPag", "1101.325 kPaa"),
])
def test_steam_pressure_spellings(run, gauge, absolute):
    # gauge = absolute - one standard atmosphere, 101 325 Pa (definition, ISO 80000-4)
    base = ["check", "--pipe", "NPS 4", "--layer", "mineral wool:50mm", "--steam-pressure"]
    a = json_of(run, *base, gauge)
    b = json_of(run, *base, absolute)
    assert a["line"]["fluid_temp_c"] == pytest.approx(b["line"]["fluid_temp_c"], abs=1e-9)


def test_psig_against_pint(run):
    base = ["check", "--pipe", "NPS 4", "--layer", "mineral wool:50mm", "--steam-pressure"]
    kpa_abs = (ureg.Quantity(150, "psi") + ureg.Quantity(1, "atm")).to("kPa").magnitude  # pint
    a = json_of(run, *base, "150 psig")
    b = json_of(run, *base, f"{kpa_abs!r} kPaa")
    assert a["line"]["fluid_temp_c"] == pytest.approx(b["line"]["fluid_temp_c"], abs=1e-9)


# --------------------------------------------------------------------------------------
# US units: k= and every bare number
# --------------------------------------------------------------------------------------
K_US = 0.25  # Btu·in/(h·ft²·°F)
K_SI = ureg.Quantity(K_US, "Btu_it*inch/(hour*ft**2*delta_degF)").to("W/(m*K)").magnitude  # pint


@pytest.mark.parametrize("layer", [
    "k=0.25:2in", "k=0.25Btu·in/(h·ft²·°F):2in", "k=0.25 Btu-in/hr-ft2-F:2in",
    f"k={K_SI!r}W/mK:2in", f"k={K_SI!r} W/(m·K):2in",
])
def test_k_in_us_units_against_pint(run, layer):
    us = json_of(run, *HOT[:-2], "--layer", layer, "--units", "us")
    si = json_of(run, *HOT[:-2], "--layer", f"k={K_SI!r}:2in")
    # JSON is SI whatever --units says; k to six significant digits
    assert us["heat_flow_w_per_m"] == pytest.approx(si["heat_flow_w_per_m"], rel=1e-5)


def test_bare_k_in_si_is_w_per_mk(run):
    a = json_of(run, *HOT[:-2], "--layer", "k=0.04:50mm")
    b = json_of(run, *HOT[:-2], "--layer", "k=0.04W/mK:50mm")
    assert a["heat_flow_w_per_m"] == b["heat_flow_w_per_m"]


def test_bare_outer_h_follows_the_unit_system(run):
    h_si = ureg.Quantity(2.0, "Btu_it/(hour*ft**2*delta_degF)").to("W/(m**2*K)").magnitude  # pint
    us = json_of(run, *HOT, "--outer-h", "2", "--units", "us")
    si = json_of(run, *HOT, "--outer-h", f"{h_si!r}")
    assert us["heat_flow_w_per_m"] == pytest.approx(si["heat_flow_w_per_m"], rel=1e-9)


def test_material_k_in_us_units_for_size(run):
    us = json_of(run, *SIZE[:5], "--material", "k=0.25", "--max-heat-flow", "30", "--no-touch-check",
                 "--units", "us")
    si = json_of(run, *SIZE[:5], "--material", f"k={K_SI!r}", "--max-heat-flow",
                 f"{ureg.Quantity(30, 'Btu_it/hour/ft').to('W/m').magnitude!r}", "--no-touch-check")
    assert [c["required_mm"] for c in us["criteria"]] == [c["required_mm"] for c in si["criteria"]]


def test_bad_k_names_the_input(run):
    assert error_line(run, *HOT[:-2], "--layer", "k=0.25 parsecs:2in") == (
        'Error: --layer: cannot read "0.25 parsecs" as a thermal conductivity; '
        "use e.g. 0.04W/mK or 0.28Btu*in/(h*ft2*F)")


# --------------------------------------------------------------------------------------
# The project file follows the same rules
# --------------------------------------------------------------------------------------
PROJECT = """
[project]
name = "Edge rules (invented site)"
units = "{units}"
[energy]
efficiency = {efficiency}
[conditions.room]
air = "20 C"
rh = {rh}
[services.hot]
{service}
material = "{material}"
[[lines]]
service = "hot"
size = "NPS 2"
length = "10 m"
condition = "room"
"""


def project(units="si", efficiency="0.9", rh="60", service='temperature = "80 C"', material="mineral wool"):
    return parse_project(PROJECT.format(units=units, efficiency=efficiency, rh=rh, service=service,
                                        material=material), "edge.toml")


def project_problems(**kw):
    with pytest.raises(ProjectError) as info:
        project(**kw)
    return info.value.problems


def test_project_rh_fraction_refused():
    assert project_problems(rh="0.7") == [
        'edge.toml: line 9 (condition "room"): rh: 0.7 is read as percent; did you mean 70 %? '
        "(write 0.7 % if you mean it)"]


def test_project_percent_spellings():
    assert project(rh='"70 %"').conditions["room"].rh_percent == 70.0
    assert project(rh="70").conditions["room"].rh_percent == 70.0


@pytest.mark.parametrize("text", ["0.88", "88", '"88 %"', '"88%"'])
def test_project_efficiency_spellings(text):
    assert project(efficiency=text).energy.efficiency == pytest.approx(0.88, rel=1e-12)


def test_project_steam_pressure_needs_gauge_or_absolute():
    assert project_problems(service='steam_pressure = "10 bar"') == [
        'edge.toml: line 11 (service "hot"): steam_pressure: "10 bar" does not say gauge or absolute; '
        "write e.g. 10 barg (gauge) or 10 bara (absolute)"]
    assert project(service='steam_pressure = "10 barg"').services["hot"].steam_pressure_pa == 1_101_325.0


def test_project_k_in_us_units():
    material = project(units="us", material="k=0.25").services["hot"].material
    assert float(material.split("=")[1]) == pytest.approx(K_SI, rel=1e-5)  # pint, six digits kept


# --------------------------------------------------------------------------------------
# US spellings and trade words reach the catalogues; inch display
# --------------------------------------------------------------------------------------
def test_us_spellings_on_the_command_line(run):
    a = json_of(run, *HOT[:-2], "--layer", "fiberglass:2in", "--finish", "aluminum, oxidized")
    b = json_of(run, *HOT[:-2], "--layer", "glass wool:2in", "--finish", "aluminium, weathered")
    assert a == b


def test_inch_outside_diameter_in_check_text(run):
    code, out, err = run("check", "--pipe", "NPS 2", "--fluid-temp", "300F", "--layer", "k=0.25:1in",
                         "--units", "us")
    assert code == 0, err
    assert "2.375" in out and "2.374" not in out
# --------------------------------------------------------------------------------------
# Clean streams
# --------------------------------------------------------------------------------------
def test_console_that_cannot_encode_unicode():
    # a Windows console code page: the box rules and some unit signs do not exist in cp1252
    env = {**os.environ, "PYTHONIOENCODING": "cp1252", "PYTHONPATH": str(ROOT)}
    done = subprocess.run([sys.executable, "-c", "from pipeins.cli import main; main()", *HOT],
                          capture_output=True, env=env,
                          cwd=ROOT, timeout=120)
    assert done.returncode == 0, done.stderr.decode("cp1252", "replace")
    done.stdout.decode("cp1252")


def test_ascii_flag_gives_plain_ascii(run):
    for fmt in ("text", "markdown", "csv", "json"):
        code, out, err = run(*HOT, "--units", "us", "--ascii", "--format", fmt)
        assert code == 0, err
        out.encode("ascii")  # nothing outside ASCII
    code, out, _ = run(*HOT, "--ascii")
    assert "degC" in out and "W/(m2*K)" in out or "W/m" in out
    code, plain, _ = run(*HOT, "--ascii", "--format", "json")
    code, fancy, _ = run(*HOT, "--format", "json")
    assert json.loads(plain) == json.loads(fancy)


def test_ascii_keeps_tables_aligned(run):
    code, out, _ = run(*HOT, "--ascii")
    lines = out.splitlines()
    rule = next(i for i, line in enumerate(lines) if set(line.replace(" ", "")) == {"-"} and "  " in line)
    # the header above the dashes and the rule have the same width
    assert len(lines[rule - 1].rstrip()) <= len(lines[rule])


@pytest.mark.parametrize("value", ["NPZ\n4", "NPS\x1b[31m4", "NPZ\r4", "NPS\x00 4", "NPZ\u20284"])
def test_control_characters_escaped_in_error_lines(run, value):
    code, out, err = run("check", "--pipe", value, "--fluid-temp", "80C")
    assert code == 2 and out == ""
    assert len(err.splitlines()) == 1 and err.startswith("Error: --pipe: ")
    assert "\x1b" not in err and "\r" not in err and "\x00" not in err and "\u2028" not in err


def test_click_errors_are_one_line(run):
    assert error_line(run, "check", "--pipe", "NPS 4", "--bogus", "1") == (
        "Error: No such option '--bogus'. (see pipeins check --help)")
    assert error_line(run, "check", "--pipe", "NPS 4", "--orientation", "sideways").startswith(
        "Error: Invalid value for '--orientation'")


@pytest.mark.parametrize("args, line", [
    pytest.param(COST + ["--cop", "1e-320"], "Error: --cop: the COP must be from 0.1 to 100", id="tiny COP"),
    pytest.param(SIZE + ["--max-heat-flow", "1e-320"],
                 'Error: --max-heat-flow: "1e-320" is out of range; a heat flow per length is zero or at least '
                 "0.001 W/m in size", id="tiny heat-flow cap"),
    pytest.param(HOT + ["--outer-h", "1e9"],
                 "Error: --outer-h: outer coefficient must be from 0.1 to 10000 W/(m²·K)", id="outer-h 1e9"),
    pytest.param(HOT + ["--inner-h", "1e-320"],
                 "Error: --inner-h: inner film coefficient must be from 1 to 100000 W/(m²·K)", id="inner-h tiny"),
])
def test_physical_ranges_stated(run, args, line):
    assert error_line(run, *args) == line


def test_nul_in_a_path_is_one_error_line(run):
    line = error_line(run, *COST, "--cost-table", "a\x00b")
    assert line == ("Error: Invalid value for '--cost-table': a file name cannot hold a NUL character "
                    "(see pipeins cost --help)")


def test_rh_with_its_percent_sign_is_taken_as_written(run):
    """Issue 8 §6: with the % sign a value is taken as written (0.5 % is 0.5 %), on the CLI as
    through the library; dew point against psychrolib (ASHRAE Handbook psychrometrics)."""
    import json

    import psychrolib

    psychrolib.SetUnitSystem(psychrolib.SI)
    code, out, err = run("check", "--pipe", "DN80", "--fluid-temp", "6C", "--ambient-temp", "30C",
                         "--rh", "0.5 %", "--layer", "k=0.035:19mm", "--format", "json")
    assert (code, err) == (0, "")
    expected = psychrolib.GetTDewPointFromRelHum(30.0, 0.005)
    assert json.loads(out)["dew_point_c"] == pytest.approx(expected, abs=0.05)
