"""Command-line fuzzing: every command with realistic and hostile option values.

Drawn command lines for check, size, table, cost, list and schedule (on the bundled
examples) mix values a user would type (units, trade spellings) with hostile ones (junk,
nan, inf, huge and tiny numbers, negative values, control characters, other scripts).
Whatever the input, pipeins must:

* exit 0 or 2, never with a traceback or a Python warning (NumPy's RuntimeWarning included);
* on 2, print nothing on stdout and only ``Error: …`` lines, one problem per line;
* on 0 with ``--format json``, print valid JSON (no NaN or Infinity);
* never show "nan" or "inf" in any output, unless the user typed it and it is echoed back.

Bounded and deterministic (``derandomize=True``): about half a minute on one core.  The
in-process ``run`` fixture of ``tests/conftest.py`` keeps each call in milliseconds.
"""

from __future__ import annotations

import json
import re
import warnings
from pathlib import Path

import pytest
from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st

ROOT = Path(__file__).resolve().parents[1]
EXAMPLES = sorted(str(p) for p in (ROOT / "examples").glob("*.toml"))
COST_TABLE = str(ROOT / "examples" / "costs_demo.csv")

# --------------------------------------------------------------------------------------
# Values: realistic ones per option, hostile ones for any option
# --------------------------------------------------------------------------------------
HOSTILE = [
    "", " ", "nan", "NaN", "inf", "-inf", "Infinity", "1e999", "-1e999", "1e308", "1e-320", "-1",
    "0", "-0", "1" + "0" * 200, "9" * 30, "0x10", "1,5", "1.2.3", "--", "-", ":", "=", "%", "k=",
    "k=nan", "k=1e999", "k=-1", "\x00", "a\nb", "\x1b[31m", "\r", "\t", "é", "温度", "😀", "\u202e",
    "1e999m", "nan mm", "inf C", "-300C", "1e6C", "50 parsecs", "5 mpa", "1/0in", "3/0", "1--2in",
    "100%", "1000%", "-100%", "0.5", "0.5 %", "80", "1 1/2", "2^99999in", "m" * 100,
]

REALISTIC = {
    "--pipe": ["NPS 2", "NPS 1/2", "NPS 36", "DN50", "DN15", "copper L 1-1/8", "NPS 3/4"],
    "--schedule": ["40", "80", "10S", "XS", "STD", "160"],
    "--od": ["60.3mm", "2.375in", "1.2m", "10mm"],
    "--wall": ["3.91mm", "0.154in", "1mm"],
    "--pipe-material": ["carbon steel", "stainless steel", "copper", "aluminum"],
    "--fluid-temp": ["80C", "180F", "6C", "-40C", "450C", "650C", "-196C", "20.000001C", "373.15K"],
    "--steam-pressure": ["10barg", "150psig", "1 MPa(a)", "3 bar(g)", "10 bar", "150psi", "10"],
    "--fluid": ["water", "30% ethylene glycol", "air", "steam"],
    "--velocity": ["1.5m/s", "5ft/s", "0.01m/s", "30m/s"],
    "--flow": ["5m3/h", "2L/s", "1.2kg/s", "20gpm", "5000lb/h", "1e-9kg/s", "1e5kg/s"],
    "--inner-h": ["1000", "50W/m2K", "1e5", "1"],
    "--ambient-temp": ["20C", "-40C", "50C", "95F"],
    "--surroundings-temp": ["-20C", "30C", "-270C"],
    "--rh": ["80", "80%", "50 %", "100", "0.8", "0.5 %", "120"],
    "--wind": ["3m/s", "7mph", "20m/s", "0", "100km/h"],
    "--orientation": ["horizontal", "vertical"],
    "--height": ["6m", "30m", "1000m", "20ft"],
    "--air-pressure": ["95kPa", "101.325kPa", "14.7psia", "1 bar"],
    "--altitude": ["1500m", "4000m", "5000ft", "-400m"],
    "--layer": ["mineral wool:50mm", "k=0.040:2in", "fiberglass:1in", "calcium silicate:178mm",
                "flexible elastomeric foam:19mm", "k=0.25 Btu-in/hr-ft2-F:1in", "mineral wool:1000m",
                "cellular glass:0mm", "glass wool:-5mm", "unobtainium:50mm", "mineral wool"],
    "--finish": ["aluminium, dull or aged", "aluminum, oxidized", "PVC jacket", "ASJ",
                 "stainless steel, bright", "copper, oxidised", "gold leaf"],
    "--emittance": ["0.9", "0.05", "1", "0", "1.5", "-0.1"],
    "--outer-h": ["10", "1e9", "0.1", "5 Btu/h/ft2/F"],
    "--touch-limit": ["60C", "140F", "1e999C", "20C"],
    "--length": ["120m", "50km", "1000ft", "0m"],
    "--material": ["mineral wool", "k=0.040", "fiberglass", "flexible elastomeric foam", "calcium silicate",
                   "k=0.25", "polyiso"],
    "--series": ["25,40,50,80mm", "1,1.5,2in", "mm_pipe_section", "0mm", "5,3"],
    "--contact-time": ["1s", "10s", "8h", "1e9h"],
    "--dew-margin": ["1K", "2F", "-1K"],
    "--max-heat-flow": ["30W/m", "25 Btu/h/ft", "1e-9W/m", "1e9W/m"],
    "--min-reduction": ["90%", "90", "0.9", "99.99%", "100%"],
    "--max-temp-change": ["2K", "5F", "0.001K"],
    "--hold-time": ["8h", "30min", "1e6h"],
    "--ice-fraction": ["25%", "0", "50"],
    "--code": ["ashrae-90.1-2019", "no-such-code"],
    "--hours": ["6000h", "8760", "9000h", "1e999h"],
    "--energy-price": ["0.09/kWh", "1.05/therm", "12/GJ", "$0.10 per kWh", "1e308/kWh", "abc"],
    "--currency": ["EUR", "USD", "€"],
    "--efficiency": ["88%", "88", "0.88", "120%", "0"],
    "--cop": ["3.5", "0", "1e9", "nan"],
    "--co2-factor": ["0.20/kWh", "0.2 kg/kWh", "1e308/kWh"],
    "--discount-rate": ["5%", "5", "0.05", "-99%"],
    "--years": ["20", "15", "0", "1e300"],
    "--escalation": ["2%", "2.5", "1e6", "900"],
    "--maintenance": ["1%", "2", "0.01"],
    "--cost-table": [COST_TABLE],
    "--valves": ["1", "0", "-1", "1" + "0" * 200],
    "--flanges": ["2", "1" + "0" * 200, "x"],
    "--strainers": ["1", "1000001"],
    "--profile": ["82C:3000h,70C:2500h", "82C", "nanC:1h", "82C:1e999h"],
    "--sizes": ["NPS 1/2..NPS 2", "DN15..DN50", "NPS 1, NPS 2", "NPS 4..NPS 1", "copper L 1/2..1"],
    "--matrix": ["heat-flow", "surface-temp", "bogus"],
    "--units": ["si", "us"],
    "--format": ["text", "json", "csv", "markdown", "yaml"],
    "--kind": ["steel", "copper", "metric", "insulation", "wall"],
    "--family": ["pipe_section", "block", "elastomeric"],
    "--match": ["wool", "NPS 2", "ashrae", "\x00", ".*"],
}
LINE = ["--pipe", "--schedule", "--od", "--wall", "--pipe-material", "--fluid-temp", "--steam-pressure",
        "--fluid", "--velocity", "--flow", "--inner-h", "--ambient-temp", "--surroundings-temp", "--rh",
        "--wind", "--orientation", "--height", "--air-pressure", "--altitude", "--layer", "--finish",
        "--emittance", "--outer-h", "--touch-limit", "--length"]
SIZING = ["--material", "--series", "--contact-time", "--dew-margin", "--max-heat-flow", "--min-reduction",
          "--max-temp-change", "--hold-time", "--ice-fraction", "--code"]
ENERGY = ["--hours", "--energy-price", "--currency", "--efficiency", "--cop", "--co2-factor", "--discount-rate",
          "--years", "--escalation", "--maintenance", "--cost-table"]
OUTPUT = ["--units", "--format"]
FLAGS = {"check": ["--ascii"], "size": ["--ascii", "--no-touch-check"], "table": ["--ascii", "--no-touch-check"],
         "cost": ["--ascii"], "list": ["--ascii"], "schedule": ["--ascii"]}

# Each command: a valid base command line, and the options drawn on top of it.
COMMANDS = {
    "check": (["check", "--pipe", "NPS 2", "--fluid-temp", "80C", "--layer", "mineral wool:50mm"],
              LINE + OUTPUT),
    "size": (["size", "--pipe", "NPS 4", "--fluid-temp", "180C", "--material", "mineral wool"],
             LINE + SIZING + ENERGY + OUTPUT),
    "table": (["table", "--sizes", "NPS 1/2..NPS 2", "--fluid-temp", "82C", "--material", "mineral wool"],
              ["--sizes", "--matrix"] + [o for o in LINE if o not in ("--pipe", "--od", "--wall")]
              + SIZING + ENERGY + OUTPUT),
    "cost": (["cost", "--pipe", "NPS 4", "--fluid-temp", "82C", "--layer", "mineral wool:50mm",
              "--energy-price", "0.09/kWh"],
             LINE + ENERGY + ["--valves", "--flanges", "--strainers", "--profile"] + OUTPUT),
}

_NAN_INF = re.compile(r"(?<![A-Za-z])(nan|inf|infinity)(?![A-Za-z])", re.I)


def value_for(option: str):
    """Mostly what a user would type (so that most lines get past the first check), else
    a hostile value or random text."""
    realistic = st.sampled_from(REALISTIC.get(option, ["1"]))
    return st.integers(0, 9).flatmap(
        lambda i: realistic if i < 7 else (st.sampled_from(HOSTILE) if i < 9 else st.text(max_size=8)))


@st.composite
def option_command(draw, command: str):
    base, options = COMMANDS[command]
    args = list(base)
    for option in draw(st.lists(st.sampled_from(options), min_size=1, max_size=4)):
        args += [option, draw(value_for(option))]
    args += draw(st.lists(st.sampled_from(FLAGS[command]), max_size=1))
    return args


@st.composite
def list_command(draw):
    args = ["list", draw(st.sampled_from(["pipes", "materials", "finishes", "series", "rules", "nothing"]))]
    for option in draw(st.lists(st.sampled_from(["--kind", "--schedule", "--family", "--match", "--units",
                                                 "--format"]), max_size=3)):
        args += [option, draw(value_for(option))]
    return args + draw(st.lists(st.just("--ascii"), max_size=1))


@st.composite
def schedule_command(draw):
    args = ["schedule", draw(st.sampled_from(EXAMPLES))]
    for option in draw(st.lists(st.sampled_from(["--units", "--format"]), max_size=2)):
        args += [option, draw(value_for(option))]
    return args + draw(st.lists(st.just("--ascii"), max_size=1))


def check_run(run, args):
    with warnings.catch_warnings(record=True) as caught:
        warnings.simplefilter("always")
        code, out, err = run(*args)
    shown = [f"{w.category.__name__}: {w.message}" for w in caught
             if issubclass(w.category, (RuntimeWarning, UserWarning, DeprecationWarning))
             and "pipeins" in str(w.filename)]
    assert not shown, (args, shown)
    assert code in (0, 2), (args, code, err)
    assert "Traceback" not in out + err
    typed = " ".join(args)
    if code == 2:
        assert out == "", (args, out)
        lines = err.splitlines()
        assert lines and all(line.startswith("Error: ") for line in lines), (args, err)
        assert all("\x1b" not in line and "\r" not in line for line in lines), (args, err)
    else:
        if "--format" in args and args[args.index("--format") + 1] == "json":
            def refuse(constant):
                raise AssertionError(f"{constant} in JSON output of {args}")

            json.loads(out, parse_constant=refuse)
    for match in _NAN_INF.finditer(out + err):
        assert re.search(match.group(0), typed, re.I), (args, match.group(0), (out + err)[:2000])


FUZZ = settings(max_examples=60, deadline=None, derandomize=True, database=None,
                suppress_health_check=[HealthCheck.function_scoped_fixture, HealthCheck.too_slow,
                                       HealthCheck.data_too_large, HealthCheck.filter_too_much])


@pytest.mark.parametrize("command", ["check", "cost"])
@FUZZ
@given(data=st.data())
def test_fuzz_line_commands(run, command, data):
    check_run(run, data.draw(option_command(command)))


@pytest.mark.parametrize("command", ["size", "table"])
@settings(FUZZ, max_examples=30)
@given(data=st.data())
def test_fuzz_sizing_commands(run, command, data):
    check_run(run, data.draw(option_command(command)))


@settings(FUZZ, max_examples=25)
@given(args=list_command())
def test_fuzz_list(run, args):
    check_run(run, args)


@settings(FUZZ, max_examples=6)
@given(args=schedule_command())
def test_fuzz_schedule(run, args):
    check_run(run, args)


BASE = ["check", "--pipe", "NPS 2", "--fluid-temp", "80C"]
PRICED = ["cost", "--pipe", "NPS 4", "--fluid-temp", "82C", "--energy-price", "0.1/kWh"]


@pytest.mark.parametrize("args, flag", [
    pytest.param(BASE + ["--length", "1e999m", "--format", "json"], "--length", id="infinite length"),
    pytest.param(BASE + ["--touch-limit", "1e999C"], "--touch-limit", id="inf touch limit"),
    pytest.param(["cost", "--pipe", "NPS 4", "--fluid-temp", "82C", "--energy-price", "1e308/kWh"],
                 "--energy-price", id="price 1e308"),
    pytest.param(PRICED + ["--flanges", "1" + "0" * 200], "Invalid value for '--flanges'", id="200-digit flanges"),
    pytest.param(BASE + ["--orientation", "vertical", "--height", "1e300m"], "--height", id="huge height"),
    pytest.param(BASE + ["--fluid", "water", "--flow", "1e300kg/s", "--length", "10m"], "--flow", id="huge flow"),
    pytest.param(PRICED + ["--escalation", "1e6"], "--escalation", id="huge escalation"),
    pytest.param(BASE + ["--outer-h", "1e9"], "--outer-h", id="outer-h 1e9"),
    pytest.param(BASE + ["--inner-h", "1e-320"], "--inner-h", id="inner-h tiny"),
    pytest.param(BASE + ["--layer", "mineral wool:1000m"], "--layer", id="1000 m layer"),
])
def test_reproductions_are_one_error_line(run, args, flag):
    # issue reproductions: each is refused with one line naming the input, no warning printed
    check_run(run, args)
    code, out, err = run(*args)
    assert code == 2 and len(err.splitlines()) == 1
    assert err.startswith(f"Error: {flag}"), err


def test_list_rules_shows_no_inf(run):
    code, out, err = run("list", "rules")
    assert code == 0 and not _NAN_INF.search(out)
    assert "above 350 °F" in out
