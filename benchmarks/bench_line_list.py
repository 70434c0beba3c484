"""Speed of a 5,000-line XLSX line list to a schedule workbook.

Writes an invented line list (5,000 rows over 6 services and 3 locations, headers that
need a column map) as an XLSX workbook and its project file into a temporary folder, then
times ``pipeins schedule PROJECT --format xlsx -o OUT.xlsx`` as a subprocess (start-up,
reading the workbook, solving, writing the workbook), best of ``--runs``, and the parts
in-process (reading the project with its list; the schedule; the workbook).  Target < 10 s
on a 2-core machine; exits 1 on a miss unless ``--no-fail``.

    python benchmarks/bench_line_list.py [--runs 1] [--lines 5000] [--no-fail]
"""

from __future__ import annotations

import argparse
import importlib.util
import os
import random
import subprocess
import sys
import tempfile
import time
from pathlib import Path

TARGET_S = 10.0
ROOT = Path(__file__).resolve().parents[1]
sys.path.insert(0, str(ROOT))  # time this checkout's pipeins, in-process and in the subprocess

PROJECT = """\
# INVENTED BENCHMARK: the fictional Saltmarsh Business Park, lines from a line list.
[project]
name = "Saltmarsh Business Park (invented)"
currency = "EUR"
lines_file = "line-list.xlsx"
lines_sheet = "Line list"

[lines_columns]
tag = "Line No."
size = "Pipe size"
condition = "Area"
ignore = ["P&ID", "Remarks"]

[energy]
price = "0.08/kWh"
co2 = "0.2 kg/kWh"
efficiency = "90 %"
cop = 3.5
hours = "6000 h"

[conditions.plant]
air = "28 C"
rh = 60

[conditions.riser]
air = "22 C"
rh = 50

[conditions.roof]
air = "-8 C"
rh = 85
wind = "5 m/s"

[services.lthw]
temperature = "80 C"
material = "mineral wool"
finish = "aluminium, dull or aged"
criteria = ["touch", "heat_flow"]
max_heat_flow = "35 W/m"

[services.dhw]
temperature = "60 C"
material = "elastomeric foam"
criteria = ["heat_flow"]
max_heat_flow = "20 W/m"

[services.chw]
temperature = "6 C"
material = "elastomeric foam"
finish = "PVC jacket"
criteria = ["condensation"]

[services.steam]
steam_pressure = "7 barg"
material = "mineral wool"
finish = "stainless steel, bright"
criteria = ["touch", "heat_flow"]
max_heat_flow = "90 W/m"

[services.condensate]
temperature = "95 C"
material = "mineral wool"
criteria = ["touch"]

[services.hot_process]
temperature = "140 C"
material = "cellular glass"
finish = "painted steel, any colour"
criteria = ["touch", "heat_flow"]
max_heat_flow = "60 W/m"
"""
SERVICES = ("lthw", "dhw", "chw", "steam", "condensate", "hot_process")
SIZES = ("NPS 1/2", "NPS 3/4", "NPS 1", "NPS 1-1/2", "NPS 2", "NPS 3", "NPS 4", "NPS 6", "NPS 8", "NPS 10")


def _tool():
    spec = importlib.util.spec_from_file_location("line_list_xlsx", ROOT / "examples" / "line_list_xlsx.py")
    module = importlib.util.module_from_spec(spec)
    spec.loader.exec_module(module)
    return module


def write_inputs(folder: Path, n_lines: int) -> Path:
    rng = random.Random(11)
    rows = [["Line No.", "P&ID", "Service", "Pipe size", "Length", "Area", "Valves", "Flanges", "Remarks"]]
    for i in range(1, n_lines + 1):
        service = SERVICES[i % len(SERVICES)]
        area = "roof" if service in ("lthw", "steam") and rng.random() < 0.2 else rng.choice(["plant", "riser"])
        rows.append([f"L-{i:05d}", f"PID-{rng.randint(1, 80):03d}", service, rng.choice(SIZES),
                     rng.randint(3, 150), area, rng.randint(0, 4), rng.randint(0, 2), ""])
    _tool().write_xlsx(rows, folder / "line-list.xlsx", sheet="Line list")
    path = folder / "park.toml"
    path.write_text(PROJECT, encoding="utf-8")
    return path


def in_process(path: Path, out: Path) -> dict:
    from pipeins.project import load_project
    from pipeins.reports import render
    from pipeins.reports.schedule import schedule_report
    from pipeins.schedule import compute_schedule

    t0 = time.perf_counter()
    project = load_project(path)
    t1 = time.perf_counter()
    schedule = compute_schedule(project)
    t2 = time.perf_counter()
    data = render(schedule_report(schedule), "xlsx")
    t3 = time.perf_counter()
    out.write_bytes(data)
    return {"read project and list": t1 - t0, "schedule": t2 - t1, "workbook": t3 - t2,
            "lines": len(project.lines)}


def main(argv=None) -> int:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--runs", type=int, default=1)
    parser.add_argument("--lines", type=int, default=5000)
    parser.add_argument("--no-fail", action="store_true")
    args = parser.parse_args(argv)
    with tempfile.TemporaryDirectory() as tmp:
        folder = Path(tmp)
        t = time.perf_counter()
        project = write_inputs(folder, args.lines)
        print(f"wrote a {args.lines}-line XLSX line list in {time.perf_counter() - t:.2f} s")
        parts = in_process(project, folder / "in-process.xlsx")
        print(f"in-process ({parts.pop('lines')} lines): "
              + ", ".join(f"{k} {v:.2f} s" for k, v in parts.items()))
        env = dict(os.environ, PYTHONPATH=str(ROOT) + os.pathsep + os.environ.get("PYTHONPATH", ""))
        best = float("inf")
        for _ in range(max(1, args.runs)):
            out = folder / "schedule.xlsx"
            t = time.perf_counter()
            done = subprocess.run([sys.executable, "-c", "from pipeins.cli import main; main()", "schedule",
                                   str(project), "--format", "xlsx", "-o", str(out)], env=env,
                                  capture_output=True, text=True)
            elapsed = time.perf_counter() - t
            if done.returncode != 0:
                print(done.stderr.strip())
                return 1
            best = min(best, elapsed)
        ok = best < TARGET_S
        print(f"pipeins schedule, {args.lines}-line XLSX list -> schedule workbook ({out.stat().st_size / 1e3:.0f} kB): "
              f"{best:.2f} s (target < {TARGET_S:g} s, {best / TARGET_S:.2f} of it) {'ok' if ok else 'MISS'}")
    return 0 if ok or args.no_fail else 1


if __name__ == "__main__":
    sys.exit(main())
