"""Start-up and single-run speed of the ``pipeins`` command, timed as subprocesses.

Times ``pipeins --help`` (target < 0.3 s), one ``pipeins check`` of an insulated line in
still air (target <= 0.15 s, issue 11) and the schedule of the glycol example project (target < 0.5 s:
glycol from the shipped tables, no CoolProp import), best of ``--runs`` runs each, wall time and the child's CPU time (user + system, from
``resource.getrusage``: a shared, loaded machine stretches the wall time), and exits 1 when
one misses its target on both
(``--no-fail`` only reports).  The floor beside them is ``python -c "import numpy"`` timed
the same way: the interpreter's and numpy's start-up, which no trimming of pipeins removes;
the ratio of each command to it is steadier across loads than the seconds.  The check's target
is judged on what pipeins adds above that floor (median wall and CPU time of the runs, check minus
floor), since the floor alone can take most of 0.15 s on a slow or loaded machine; the script
prints that figure, the target and their ratio.  The children run with their byte code cached
in a temporary ``PYTHONPYCACHEPREFIX`` (one warm-up run each), as an installed package has it,
even where ``PYTHONDONTWRITEBYTECODE`` is set.  ``--imports`` adds the five costliest top-level
imports of the check run, from ``python -X importtime``.

    python benchmarks/bench_cli.py [--runs 5] [--imports] [--no-fail]
"""

from __future__ import annotations

import argparse
import os
import resource
import shutil
import statistics
import subprocess
import sys
import tempfile
import time
from pathlib import Path

HELP_TARGET_S = 0.3
CHECK_TARGET_S = 0.15
CHECK_ARGS = ["check", "--pipe", "NPS 4", "--fluid-temp", "180C", "--ambient-temp", "25C",
              "--layer", "mineral wool:50mm", "--finish", "aluminium, dull or aged"]
SCHEDULE_TARGET_S = 0.5
SCHEDULE_ARGS = ["schedule", str(Path(__file__).resolve().parents[1] / "examples" / "food_factory_chilled.toml")]
_IN_PROCESS = "import sys; from pipeins.cli import main; main(sys.argv[1:])"


def command() -> list[str]:
    """The installed console script, else the same entry point through this interpreter."""
    script = shutil.which("pipeins")
    return [script] if script else [sys.executable, "-c", _IN_PROCESS]


_ENV = {k: v for k, v in os.environ.items() if k != "PYTHONDONTWRITEBYTECODE"}


def times(argv: list[str], runs: int) -> tuple[list[float], list[float]]:
    """Wall times and CPU times (user + system of the child) [s] of *runs* runs, after one
    warm-up run (which writes the byte code)."""
    walls, cpus = [], []
    for i in range(runs + 1):
        before = resource.getrusage(resource.RUSAGE_CHILDREN)
        start = time.perf_counter()
        done = subprocess.run(argv, stdout=subprocess.DEVNULL, stderr=subprocess.PIPE, text=True, env=_ENV)
        elapsed = time.perf_counter() - start
        after = resource.getrusage(resource.RUSAGE_CHILDREN)
        if done.returncode != 0:
            raise SystemExit(f"{' '.join(argv)} failed ({done.returncode}):\n{done.stderr}")
        if i:
            walls.append(elapsed)
            cpus.append((after.ru_utime - before.ru_utime) + (after.ru_stime - before.ru_stime))
    return walls, cpus


def best_time(argv: list[str], runs: int) -> tuple[float, float]:
    """Best wall time and best CPU time [s] of *runs* runs (see :func:`times`)."""
    walls, cpus = times(argv, runs)
    return min(walls), min(cpus)


def top_imports(args: list[str], n: int = 5) -> list[tuple[float, float, str]]:
    """(cumulative ms, self ms, module) of the *n* costliest top-level imports of one run."""
    done = subprocess.run([sys.executable, "-X", "importtime", "-c", _IN_PROCESS, *args],
                          stdout=subprocess.DEVNULL, stderr=subprocess.PIPE, text=True, env=_ENV)
    rows = []
    for line in done.stderr.splitlines():
        if not line.startswith("import time:") or "[us]" in line:
            continue
        self_us, cumulative_us, name = (part for part in line[len("import time:"):].split("|"))
        if name.startswith(" ") and not name.startswith("  "):  # top level: one space of indent
            rows.append((int(cumulative_us) / 1e3, int(self_us) / 1e3, name.strip()))
    return sorted(rows, reverse=True)[:n]


def main(argv=None) -> int:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--runs", type=int, default=5, help="runs per command (best is kept)")
    parser.add_argument("--imports", action="store_true", help="show the 5 costliest imports of check")
    parser.add_argument("--no-fail", action="store_true", help="report only; exit 0 on a miss")
    opts = parser.parse_args(argv)
    cache = tempfile.TemporaryDirectory(prefix="pipeins-bench-pyc-")
    _ENV["PYTHONPYCACHEPREFIX"] = cache.name

    base = command()
    cases = [("pipeins --help", base + ["--help"], HELP_TARGET_S),
             ("pipeins check (still air)", base + CHECK_ARGS, CHECK_TARGET_S),
             ("pipeins schedule (glycol)", base + SCHEDULE_ARGS, SCHEDULE_TARGET_S)]
    print(f"{' '.join(base)}; best of {opts.runs} runs")
    floor_walls, floor_cpus = times([sys.executable, "-c", "import numpy"], opts.runs)
    floor_wall, floor_cpu = min(floor_walls), min(floor_cpus)
    print(f"floor (python -c 'import numpy'): {floor_wall:.3f} s wall, {floor_cpu:.3f} s CPU "
          f"(medians {statistics.median(floor_walls):.3f} s, {statistics.median(floor_cpus):.3f} s)")
    print(f"{'command':<28} {'wall [s]':>9} {'CPU [s]':>8} {'target [s]':>11} {'CPU / floor':>12}  verdict")
    missed = False
    check_times = None
    for label, argv, target in cases:
        walls, cpus = times(argv, opts.runs)
        elapsed, cpu = min(walls), min(cpus)
        if argv[len(base):][:1] == ["check"]:
            check_times = walls, cpus
            continue  # judged below, on what pipeins adds above the floor
        ok = min(elapsed, cpu) <= target
        missed |= not ok
        print(f"{label:<28} {elapsed:>9.3f} {cpu:>8.3f} {'<= ' + format(target, 'g'):>11} "
              f"{cpu / floor_cpu:>11.2f}x  {'ok' if ok else 'MISSED'}")
    walls, cpus = check_times
    added_wall = statistics.median(walls) - statistics.median(floor_walls)
    added_cpu = statistics.median(cpus) - statistics.median(floor_cpus)
    ok = min(added_wall, added_cpu) <= CHECK_TARGET_S
    missed |= not ok
    print(f"\npipeins check (still air), medians of {opts.runs} runs: {statistics.median(walls):.3f} s wall, "
          f"{statistics.median(cpus):.3f} s CPU; above the floor {added_wall:.3f} s wall, {added_cpu:.3f} s CPU "
          f"against the target {CHECK_TARGET_S:g} s: {min(added_wall, added_cpu) / CHECK_TARGET_S:.2f} of it "
          f"({'ok' if ok else 'MISSED'}); the whole process {statistics.median(cpus) / statistics.median(floor_cpus):.2f}x "
          f"the floor's CPU")
    whole = statistics.median(walls)
    print(f"pipeins check as a whole process: median {whole:.3f} s wall against the target {CHECK_TARGET_S:g} s "
          + ("(ok)" if whole <= CHECK_TARGET_S else
             "(over: on a loaded machine the floor alone stretches; the verdict above is on what pipeins adds)")
          + f"; its CPU time counts numpy's BLAS threads ({statistics.median(floor_cpus):.3f} s CPU in the floor "
            f"against {statistics.median(floor_walls):.3f} s wall)")
    if opts.imports:
        print("\nCostliest top-level imports of pipeins check (python -X importtime, one run)")
        print(f"{'cumulative [ms]':>16} {'self [ms]':>10}  module")
        for cumulative, self_ms, name in top_imports(CHECK_ARGS):
            print(f"{cumulative:>16.1f} {self_ms:>10.1f}  {name}")
    return 1 if missed and not opts.no_fail else 0


if __name__ == "__main__":
    sys.exit(main())
