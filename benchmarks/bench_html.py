"""Speed of the HTML report: ``pipeins schedule EXAMPLE --format html -o FILE`` on the largest
bundled example (most lines), charts included, in a fresh process (so the matplotlib import
counts), best of ``--runs``.  Target < 2 s on a 2-core machine; exits 1 on a miss unless
``--no-fail``.  Also prints the time of the same command as text, and of rendering the page
alone (in-process, after the schedule is solved), so a slip shows where it comes from.

    python benchmarks/bench_html.py [--runs 3] [--no-fail]
"""

from __future__ import annotations

import argparse
import os
import subprocess
import sys
import tempfile
import time
from pathlib import Path

TARGET_S = 2.0
ROOT = Path(__file__).resolve().parents[1]


def largest_example() -> Path:
    return max(sorted((ROOT / "examples").glob("*.toml")),
               key=lambda p: p.read_text(encoding="utf-8").count("[[lines]]"))


def run_cli(args: list[str]) -> float:
    env = {**os.environ, "PYTHONPATH": str(ROOT)}
    start = time.perf_counter()
    subprocess.run([sys.executable, "-c", "import sys; from pipeins.cli import main; main(sys.argv[1:])", *args],
                   check=True, cwd=ROOT, env=env, stdout=subprocess.DEVNULL)
    return time.perf_counter() - start


def main() -> int:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--runs", type=int, default=3)
    parser.add_argument("--no-fail", action="store_true")
    args = parser.parse_args()
    example = largest_example()
    with tempfile.TemporaryDirectory() as tmp:
        out = str(Path(tmp) / "report.html")
        html = min(run_cli(["schedule", str(example), "--format", "html", "-o", out]) for _ in range(args.runs))
        text = min(run_cli(["schedule", str(example)]) for _ in range(args.runs))
        size = Path(out).stat().st_size
    sys.path.insert(0, str(ROOT))
    from pipeins.project import load_project
    from pipeins.reports import render
    from pipeins.reports.charts import schedule_charts
    from pipeins.reports.schedule import schedule_report
    from pipeins.schedule import compute_schedule

    schedule = compute_schedule(load_project(example))
    renders = []
    for _ in range(args.runs):
        report = schedule_report(schedule, "si")
        report.charts = schedule_charts(schedule)
        start = time.perf_counter()
        render(report, "html", "si")
        renders.append(time.perf_counter() - start)
    print(f"example: {example.name}")
    print(f"schedule --format html (fresh process, charts): {html:.2f} s   target < {TARGET_S:.1f} s   "
          f"ratio {html / TARGET_S:.2f}   ({size / 1024:.0f} KiB)")
    print(f"schedule as text (fresh process):               {text:.2f} s   html/text {html / text:.2f}")
    print(f"render of the page alone (in-process, warm):     {min(renders):.3f} s")
    if html > TARGET_S and not args.no_fail:
        print("MISS: the HTML report is slower than its target")
        return 1
    return 0


if __name__ == "__main__":
    sys.exit(main())
