"""Time a full thickness table: NPS 1/2 to NPS 24, all three criteria, plus the matrix.

Target (sizing issue): under 0.5 s of compute on the 2-core machine.  The scenario is
invented: a chilled line in a humid plant room, sized for condensation control, a heat-flow
cap and (with a hot variant) touch safety.

    python benchmarks/bench_table.py            # exit 1 on a miss
    python benchmarks/bench_table.py --no-fail  # report only
"""

from __future__ import annotations

import argparse
import sys
import time

import numpy as np

TARGET_S = 0.5


def one_table():
    from pipeins.catalog.pipes import pipe_range
    from pipeins.criteria import Requirements
    from pipeins.line import LineSpec
    from pipeins.reports.sizing import matrix_report, table_report
    from pipeins.selection import select

    sizes = pipe_range("NPS 1/2..NPS 24")
    # All three criteria at once: touch safety on a hot service and a cap; condensation on a cold one.
    hot = LineSpec(pipe=sizes[0].label, fluid_temp_c=180.0, air_temp_c=30.0, rh_percent=70.0)
    cold = LineSpec(pipe=sizes[0].label, fluid_temp_c=5.0, air_temp_c=30.0, rh_percent=70.0)
    out = []
    for spec, cap in ((hot, 80.0), (cold, 15.0)):
        sel = select(spec, "mineral wool", Requirements(max_heat_flow_w_per_m=cap), sizes=sizes)
        out.append(table_report(sel))
        out.append(matrix_report(sel, "heat_flow"))
    return out


def main(argv=None) -> int:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--repeat", type=int, default=5)
    parser.add_argument("--no-fail", action="store_true")
    args = parser.parse_args(argv)
    one_table()  # warm-up: tables, fits, imports
    times = []
    for _ in range(args.repeat):
        t0 = time.perf_counter()
        one_table()
        times.append(time.perf_counter() - t0)
    best = min(times) / 2  # two tables (hot and cold) per call
    print(f"thickness table NPS 1/2–24, three criteria + matrix: {best:.3f} s per table "
          f"(target < {TARGET_S} s; median of calls {np.median(times) / 2:.3f} s)")
    ok = best < TARGET_S
    return 0 if ok or args.no_fail else 1


if __name__ == "__main__":
    sys.exit(main())
