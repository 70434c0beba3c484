"""The command's start-up path stays light: ``import pipeins.cli`` and a ``check`` of a water
line as text import none of CoolProp, scipy, matplotlib, openpyxl, nor the modules made lazy
for start-up (tabulate and its wcwidth, importlib.metadata for --version), checked in
``sys.modules`` of a fresh interpreter."""

from __future__ import annotations

import json
import subprocess
import sys
from pathlib import Path

ROOT = Path(__file__).resolve().parents[1]
HEAVY = ("CoolProp", "scipy", "matplotlib", "openpyxl", "tabulate", "wcwidth", "importlib.metadata")

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
    """--version still reads the installed version, Markdown still goes through tabulate."""
    code = ("import sys\nfrom pipeins.cli import main\n"
            "try:\n    main(sys.argv[1:])\nexcept SystemExit:\n    pass\n"
            "print('tabulate' in sys.modules)")
    md = subprocess.run([sys.executable, "-c", code, "check", "--pipe", "NPS 2", "--fluid-temp", "80C",
                         "--layer", "mineral wool:25mm", "--format", "markdown"], cwd=ROOT, capture_output=True,
                        text=True, check=True)
    assert md.stdout.rstrip().endswith("True") and "|" in md.stdout
    version = subprocess.run([sys.executable, "-c", "from pipeins.cli import main; main()", "--version"], cwd=ROOT,
                             capture_output=True, text=True)
    assert version.returncode == 0 and "version" in version.stdout
