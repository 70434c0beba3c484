"""Speed of ``pipeins schedule`` on a large invented project: 2,000 lines over 10 services.

Writes the project file into a temporary folder, then times reading it, solving the
schedule and rendering the text report (in-process, best of ``--runs``).  Target < 5 s on
a 2-core machine; exits 1 on a miss unless ``--no-fail``.

    python benchmarks/bench_schedule.py [--runs 1] [--no-fail]
"""

from __future__ import annotations

import argparse
import random
import sys
import tempfile
import time
from pathlib import Path

TARGET_S = 5.0
N_LINES = 2000

SERVICES = [
    ("hhw_82", 'temperature = "82 C"\nmaterial = "mineral wool"\nfinish = "aluminium, dull or aged"\n'
               'criteria = ["code", "touch", "heat_flow"]\nmax_heat_flow = "40 W/m"'),
    ("hhw_60", 'temperature = "60 C"\nmaterial = "glass wool"\nfinish = "PVC jacket"\ncriteria = ["code"]'),
    ("dhw_60", 'temperature = "60 C"\nmaterial = "elastomeric foam"\nfinish = "elastomeric foam, unfaced"\n'
               'criteria = ["heat_flow"]\nmax_heat_flow = "25 W/m"'),
    ("dhw_return", 'temperature = "55 C"\nmaterial = "elastomeric foam"\ncriteria = ["heat_flow"]\n'
                   'min_reduction = "80%"'),
    ("chw_6", 'temperature = "6 C"\nmaterial = "elastomeric foam"\nfinish = "PVC jacket"\n'
              'criteria = ["condensation", "code"]'),
    ("chw_12", 'temperature = "12 C"\nmaterial = "polyisocyanurate foam"\nfinish = "PVC jacket"\n'
               'criteria = ["condensation"]'),
    ("steam_3", 'steam_pressure = "3 barg"\nmaterial = "mineral wool"\nfinish = "aluminium, dull or aged"\n'
                'criteria = ["touch", "code"]'),
    ("steam_10", 'steam_pressure = "10 barg"\nmaterial = "calcium silicate"\nfinish = "stainless steel, bright"\n'
                 'criteria = ["touch", "heat_flow"]\nmax_heat_flow = "100 W/m"'),
    ("condensate", 'temperature = "90 C"\nmaterial = "mineral wool"\ncriteria = ["touch", "economic"]'),
    ("process_120", 'temperature = "120 C"\nmaterial = "cellular glass"\nfinish = "painted steel, any colour"\n'
                    'criteria = ["touch", "economic", "code"]'),
]
SIZES = ["NPS 1/2", "NPS 3/4", "NPS 1", "NPS 1-1/2", "NPS 2", "NPS 3", "NPS 4", "NPS 6", "NPS 8", "NPS 10"]


def write_project(folder: Path) -> Path:
    demo = Path(__file__).resolve().parents[1] / "examples" / "costs_demo.csv"
    (folder / "costs.csv").write_text(demo.read_text(encoding="utf-8"), encoding="utf-8")
    rng = random.Random(7)
    parts = ['[project]\nname = "Benchmark campus (invented)"\ncurrency = "EUR"\ncode = "ashrae-90.1-2019"\n'
             'cost_table = "costs.csv"\n',
             '[energy]\nprice = "0.08/kWh"\nco2 = "0.2 kg/kWh"\nefficiency = 0.9\ncop = 3.5\nhours = "6000 h"\n',
             '[conditions.plant]\nair = "28 C"\nrh = 60\n', '[conditions.corridor]\nair = "22 C"\nrh = 50\n']
    parts += [f"[services.{name}]\n{body}\n" for name, body in SERVICES]
    for i in range(N_LINES):
        name = SERVICES[i % len(SERVICES)][0]
        parts.append(f'[[lines]]\nservice = "{name}"\nsize = "{rng.choice(SIZES)}"\n'
                     f'length = "{rng.randint(5, 120)} m"\ncondition = "{rng.choice(["plant", "corridor"])}"\n'
                     f"valves = {rng.randint(0, 3)}\n")
    path = folder / "campus.toml"
    path.write_text("\n".join(parts), encoding="utf-8")
    return path


def run_once(path: Path) -> float:
    from pipeins.project import load_project
    from pipeins.reports import render
    from pipeins.reports.schedule import schedule_report
    from pipeins.schedule import compute_schedule

    start = time.perf_counter()
    schedule = compute_schedule(load_project(path))
    render(schedule_report(schedule), "text")
    return time.perf_counter() - start


def main(argv=None) -> int:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--runs", type=int, default=1)
    parser.add_argument("--no-fail", action="store_true")
    args = parser.parse_args(argv)
    with tempfile.TemporaryDirectory() as folder:
        path = write_project(Path(folder))
        best = min(run_once(path) for _ in range(max(1, args.runs)))
    ok = best < TARGET_S
    print(f"schedule of {N_LINES} lines over {len(SERVICES)} services: {best:.2f} s "
          f"(target < {TARGET_S:g} s) {'ok' if ok else 'MISSED'}")
    return 0 if ok or args.no_fail else 1


if __name__ == "__main__":
    sys.exit(main())
