"""The command's start-up path stays light: ``import pipeins.cli`` and a ``check`` of a water
line as text import none of CoolProp, scipy, matplotlib, openpyxl, nor the modules made lazy
for start-up (tabulate and its wcwidth, importlib.metadata for --version; the chart data of
pipeins.reports.charts, the fitting catalogue, numpy.polynomial, the file writer; the sizing search and the run march, which a check with
no run or steam needs not), checked in
``sys.modules`` of a fresh interpreter; ``--help`` of every command loads no numpy.
Project conventions (issue 11 and DEVELOPERS.md, "Benchmarks"); no outside source applies."""

from __future__ import annotations

import json
import subprocess
import sys
from pathlib import Path

ROOT = Path(__file__).resolve().parents[1]
HEAVY = ("CoolProp", "scipy", "matplotlib", "openpyxl", "tabulate", "wcwidth", "importlib.metadata",
         "pipeins.reports.charts", "pipeins.catalog.fittings", "numpy.polynomial", "pipeins.fileio",
         "pipeins.sizing", "pipeins.runs")

_PROBE = """
import sys, json
heavy = lambda: sorted(m for m in json.loads(sys.argv[1]) if m in sys.modules)
from pipeins.cli import main
seen = {"import pipeins.cli": heavy()}
for args in json.loads(sys.argv[2]):
    try:
        main(args)
    except SystemExit as stop:
        assert stop.code in (0, None), (args, stop.code)
    seen[" ".join(args)] = heavy()
print(json.dumps(seen))
"""


def test_start_up_and_a_text_check_on_water_stay_light():
    runs = [["check", "--pipe", "NPS 4", "--fluid-temp", "180C", "--ambient-temp", "25C",
             "--layer", "mineral wool:50mm", "--finish", "aluminium, dull or aged"],
            ["check", "--pipe", "DN50", "--fluid-temp", "60C", "--layer", "mineral wool:25mm", "--velocity", "1m/s"]]
    done = subprocess.run([sys.executable, "-c", _PROBE, json.dumps(HEAVY), json.dumps(runs)], cwd=ROOT,
                          capture_output=True, text=True, check=True)
    seen = json.loads(done.stdout.splitlines()[-1])
    assert len(seen) == len(runs) + 1
    assert all(modules == [] for modules in seen.values()), seen


def test_the_modules_made_lazy_still_load_when_asked():
    """--version still reads the installed version; Markdown of plain cells is written without
    tabulate (reports._pipe_table, its format to the character) and an unusual cell still goes
    through it."""
    code = ("import sys\nfrom pipeins.cli import main\n"
            "try:\n    main(sys.argv[1:])\nexcept SystemExit:\n    pass\n"
            "print('tabulate' in sys.modules)")
    md = subprocess.run([sys.executable, "-c", code, "check", "--pipe", "NPS 2", "--fluid-temp", "80C",
                         "--layer", "mineral wool:25mm", "--format", "markdown"], cwd=ROOT, capture_output=True,
                        text=True, check=True)
    assert md.stdout.rstrip().endswith("False") and "|:--" in md.stdout
    unusual = ("import sys\nfrom pipeins.reports import Column, Report, Table, render\n"
               "text = render(Report('t', [Table('x', [Column('a')], [['two\\nlines']])], {}), 'markdown')\n"
               "print('tabulate' in sys.modules)")
    done = subprocess.run([sys.executable, "-c", unusual], cwd=ROOT, capture_output=True, text=True, check=True)
    assert done.stdout.rstrip().endswith("True")
    version = subprocess.run([sys.executable, "-c", "from pipeins.cli import main; main()", "--version"], cwd=ROOT,
                             capture_output=True, text=True)
    assert version.returncode == 0 and "version" in version.stdout


def test_help_of_every_command_loads_no_numpy():
    code = ("import sys\nfrom pipeins.cli import COMMANDS, main\nfor name in [None, *COMMANDS]:\n"
            "    try:\n        main(([name] if name else []) + ['--help'])\n    except SystemExit:\n        pass\n"
            "    assert 'numpy' not in sys.modules, name\nprint('light')")
    done = subprocess.run([sys.executable, "-c", code], cwd=ROOT, capture_output=True, text=True)
    assert done.returncode == 0 and done.stdout.rstrip().endswith("light"), done.stderr


def test_charts_and_files_still_load_when_asked(tmp_path):
    """The HTML page and --plot still get the check's charts (their data built), -o still writes."""
    code = ("import sys\nfrom pipeins.cli import main\ntry:\n    main(sys.argv[1:])\nexcept SystemExit:\n    pass\n"
            "print('pipeins.reports.charts' in sys.modules, 'pipeins.fileio' in sys.modules)")
    args = ["check", "--pipe", "NPS 2", "--fluid-temp", "80C", "--layer", "mineral wool:25mm"]
    out = tmp_path / "check.json"
    done = subprocess.run([sys.executable, "-c", code, *args, "--format", "json", "-o", str(out)], cwd=ROOT,
                          capture_output=True, text=True, check=True)
    assert done.stdout.split()[-2:] == ["False", "True"] and json.loads(out.read_text())["heat_flow_w_per_m"] > 0
    import click

    from pipeins.cli.options import wants_charts

    assert wants_charts("html") and not wants_charts("json") and not wants_charts("xlsx")
    for plot, wanted in ((None, False), ("c.svg", True)):
        ctx = click.Context(click.Command("check"))
        ctx.params = {"plot": plot}
        with ctx:
            assert wants_charts("text") is wanted


def test_the_section_criteria_keep_their_names():
    """``pipeins.sections`` still names the duct and vessel criteria, now kept in
    ``pipeins.section_criteria`` (the sizing search stays out of a check)."""
    import pipeins.section_criteria as criteria
    import pipeins.sections as sections
    from pipeins.sections import DuctTempChange, HeatFluxCap, duct_temp_change

    assert (DuctTempChange, HeatFluxCap, duct_temp_change) == (criteria.DuctTempChange, criteria.HeatFluxCap,
                                                               criteria.duct_temp_change)
    assert all(hasattr(sections, name) for name in sections.__all__)
    code = ("import sys, pipeins.sections\nprint('pipeins.sizing' in sys.modules, 'pipeins.runs' in sys.modules)")
    done = subprocess.run([sys.executable, "-c", code], cwd=ROOT, capture_output=True, text=True, check=True)
    assert done.stdout.split() == ["False", "False"]
