"""Speed of the vectorised solver: 10,000 insulated-pipe cases in one ``solve`` call.

Cases: 10 steel sizes (NPS 1/2 … NPS 12, schedule 40) × 25 mineral-wool thicknesses
(20 … 140 mm) × 40 fluid temperatures (40 … 430 °C), air at 20 °C, painted jacket; once in
still air and once in a 3 m/s wind.  Each variant is solved once to warm up, then timed
(best of ``--repeat`` runs).  Prints cases per second and solver iterations; exits 1 when a
variant is below the target (``--no-fail`` only reports).

    python benchmarks/bench_solve.py [--repeat 5] [--target 50000] [--no-fail]
"""

from __future__ import annotations

import argparse
import sys
import time

import numpy as np

TARGET_CASES_PER_S = 50_000
SIZES = ("NPS 1/2", "NPS 3/4", "NPS 1", "NPS 1-1/2", "NPS 2", "NPS 3", "NPS 4", "NPS 6", "NPS 8", "NPS 12")


def build_cases(wind_m_s: float):
    """The solver inputs for 10 × 25 × 40 = 10,000 cases (arrays broadcast to that shape)."""
    from pipeins.catalog.materials import lookup_material
    from pipeins.catalog.pipes import lookup_pipe
    from pipeins.model import Fluid, Layer, Pipe, Surface, Surroundings

    sizes = [lookup_pipe(s) for s in SIZES]
    od = np.array([s.outer_diameter_m for s in sizes]).reshape(-1, 1, 1)
    wall = np.array([s.wall_m for s in sizes]).reshape(-1, 1, 1)
    thickness = np.linspace(0.020, 0.140, 25).reshape(1, -1, 1)
    fluid_temp = np.linspace(40.0, 430.0, 40).reshape(1, 1, -1)
    pipe = Pipe(od, wall, 60.5, "NPS 1/2 to NPS 12", "carbon steel")
    layers = [Layer(lookup_material("mineral wool"), thickness)]
    return pipe, layers, Fluid(fluid_temp), Surroundings(20.0, wind_speed_m_s=wind_m_s), Surface(0.9)


def time_variant(name: str, wind_m_s: float, repeat: int):
    from pipeins.solve import solve

    args = build_cases(wind_m_s)
    result = solve(*args)  # warm-up: first call pays for imports and table loading
    n = int(np.size(result.heat_flow_w_per_m))
    best = float("inf")
    for _ in range(repeat):
        start = time.perf_counter()
        result = solve(*args)
        best = min(best, time.perf_counter() - start)
    return {"variant": name, "cases": n, "seconds": best, "cases_per_s": n / best,
            "iterations": result.iterations, "residual_w_per_m": result.residual_w_per_m}


def main(argv=None) -> int:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--repeat", type=int, default=5, help="timed runs per variant (best is kept)")
    parser.add_argument("--target", type=float, default=TARGET_CASES_PER_S, help="cases per second")
    parser.add_argument("--no-fail", action="store_true", help="report only; exit 0 on a miss")
    opts = parser.parse_args(argv)

    rows = [time_variant("still air", 0.0, opts.repeat), time_variant("wind 3 m/s", 3.0, opts.repeat)]
    print(f"pipeins.solve.solve, one call per variant, best of {opts.repeat} "
          f"(target >= {opts.target:,.0f} cases/s)")
    print(f"{'variant':<12} {'cases':>7} {'time [ms]':>10} {'cases/s':>12} {'iterations':>11} "
          f"{'residual [W/m]':>15}  verdict")
    missed = False
    for r in rows:
        ok = r["cases_per_s"] >= opts.target
        missed |= not ok
        print(f"{r['variant']:<12} {r['cases']:>7,} {r['seconds'] * 1e3:>10.1f} {r['cases_per_s']:>12,.0f} "
              f"{r['iterations']:>11} {r['residual_w_per_m']:>15.2e}  {'ok' if ok else 'MISSED'}")
    return 1 if missed and not opts.no_fail else 0


if __name__ == "__main__":
    sys.exit(main())
