"""Speed of the vectorised solver: 10,000 insulated-pipe cases in one ``solve`` call.

Cases: 10 steel sizes (NPS 1/2 … NPS 12, schedule 40) × 25 mineral-wool thicknesses
(20 … 140 mm) × 40 fluid temperatures (40 … 430 °C), air at 20 °C, painted jacket; once in
still air and once in a 3 m/s wind.  Each variant is solved once to warm up, then timed
(best of ``--repeat`` runs; wall clock, and the process's CPU time beside it, which a busy
shared machine inflates less).

For comparison the same physics is solved the way a reader would code it: one case at a
time, ``scipy.optimize.brentq`` on the surface temperature, each residual evaluation
calling the same library functions on scalars (outer film, radiation, k(T) integral).
That loop runs on an evenly spread subset of ``--scalar-cases`` cases in the same run;
the ratio of cases per second (both in CPU time, which other load on a shared machine
disturbs less than the wall clock) is what holds across machines.  The scalar answers are
also compared with the vectorised ones.

Prints, per variant: cases/s, the target (issue 11: 1,000,000 cases/s), the ratio to the
scalar loop, solver iterations; exits 1 when a variant is below the target
(``--no-fail`` only reports).

    python benchmarks/bench_solve.py [--repeat 7] [--target 1000000] [--scalar-cases 200] [--no-fail]
"""

from __future__ import annotations

import argparse
import math
import sys
import time

import numpy as np

TARGET_CASES_PER_S = 1_000_000
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


def scalar_case(od, wall, k_wall, thickness, fit, fluid_c, air_c, wind, emittance):
    """One case the plain way: brentq on G(Ts) = Ts − march(q_out(Ts)), scalars throughout."""
    from scipy.optimize import brentq

    from pipeins.physics import outer, radiation

    r0, r1 = od / 2 - wall, od / 2
    r2 = r1 + thickness

    def q_out(ts):
        h_c = float(outer.outer_convection_coefficient(ts, air_c, 2 * r2, wind))
        h_r = float(radiation.radiation_coefficient_w_m2k(ts, air_c, emittance))
        return 2 * math.pi * r2 * (h_c * (ts - air_c) + h_r * (ts - air_c))

    def residual(ts):
        q = q_out(ts)
        t1 = fluid_c - q * math.log(r1 / r0) / (2 * math.pi * k_wall)
        t2 = float(fit.temperature(fit.potential(t1) - q * math.log(r2 / r1) / (2 * math.pi)))
        return ts - t2

    lo, hi = min(fluid_c, air_c), max(fluid_c, air_c)
    ts = brentq(residual, lo, hi, xtol=1e-12, rtol=4 * np.finfo(float).eps)
    return q_out(ts)


def time_variant(name: str, wind_m_s: float, repeat: int, scalar_cases: int):
    from pipeins.physics.conduction import conductivity_of
    from pipeins.solve import solve

    args = build_cases(wind_m_s)
    result = solve(*args)  # warm-up: first call pays for imports and table loading
    n = int(np.size(result.heat_flow_w_per_m))
    best = best_cpu = float("inf")
    for _ in range(repeat):
        start, start_cpu = time.perf_counter(), time.process_time()
        result = solve(*args)
        best = min(best, time.perf_counter() - start)
        best_cpu = min(best_cpu, time.process_time() - start_cpu)

    # The scalar loop over an evenly spread subset of the same cases.
    pipe, layers, fluid, surroundings, surface = args
    shape = result.shape
    od = np.broadcast_to(pipe.outer_diameter_m, shape).ravel()
    wall = np.broadcast_to(pipe.wall_m, shape).ravel()
    thickness = np.broadcast_to(layers[0].thickness_m, shape).ravel()
    fluid_c = np.broadcast_to(fluid.temp_c, shape).ravel()
    fit = conductivity_of(layers[0].material)
    picks = np.linspace(0, n - 1, scalar_cases).astype(int)
    start = time.process_time()
    q_scalar = np.array([scalar_case(od[i], wall[i], 60.5, thickness[i], fit, fluid_c[i], 20.0, wind_m_s, 0.9)
                         for i in picks])
    scalar_cpu_s = (time.process_time() - start) / scalar_cases
    q_vector = result.heat_flow_w_per_m.ravel()[picks]
    return {"variant": name, "cases": n, "seconds": best, "cpu_seconds": best_cpu, "cases_per_s": n / best,
            "cpu_cases_per_s": n / best_cpu, "iterations": result.iterations,
            "scalar_cases_per_s": 1.0 / scalar_cpu_s, "ratio": scalar_cpu_s * n / best_cpu,
            "agreement": float(np.max(np.abs(q_scalar / q_vector - 1)))}


def main(argv=None) -> int:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--repeat", type=int, default=7, help="timed runs per variant (best is kept)")
    parser.add_argument("--target", type=float, default=TARGET_CASES_PER_S, help="cases per second")
    parser.add_argument("--scalar-cases", type=int, default=200, help="cases in the scalar scipy loop")
    parser.add_argument("--no-fail", action="store_true", help="report only; exit 0 on a miss")
    opts = parser.parse_args(argv)

    rows = [time_variant("still air", 0.0, opts.repeat, opts.scalar_cases),
            time_variant("wind 3 m/s", 3.0, opts.repeat, opts.scalar_cases)]
    print(f"pipeins.solve.solve, one call of 10,000 cases per variant, best of {opts.repeat}; "
          f"target >= {opts.target:,.0f} cases/s")
    print(f"scalar loop: scipy.optimize.brentq per case on the same physics, {opts.scalar_cases} cases; "
          "ratio of CPU cases/s")
    print(f"{'variant':<12} {'time [ms]':>10} {'cases/s':>12} {'cpu [ms]':>9} {'cpu cases/s':>12} "
          f"{'target':>10} {'scalar cpu c/s':>15} {'ratio':>7} {'iterations':>11} {'max |dq|/q':>11}  verdict")
    missed = False
    for r in rows:
        ok = r["cases_per_s"] >= opts.target
        missed |= not ok
        print(f"{r['variant']:<12} {r['seconds'] * 1e3:>10.2f} {r['cases_per_s']:>12,.0f} "
              f"{r['cpu_seconds'] * 1e3:>9.2f} {r['cpu_cases_per_s']:>12,.0f} {opts.target:>10,.0f} "
              f"{r['scalar_cases_per_s']:>15,.0f} {r['ratio']:>6,.0f}x {r['iterations']:>11} "
              f"{r['agreement']:>11.1e}  {'ok' if ok else 'MISSED'}")
    return 1 if missed and not opts.no_fail else 0


if __name__ == "__main__":
    sys.exit(main())
