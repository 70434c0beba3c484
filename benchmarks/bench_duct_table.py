"""A 4-face duct thickness table: 30 rectangular sizes × 3 criteria in one vectorised pass.

Invented service: supply air at 13 °C, 1.2 kg/s, along 40 m of duct through a 32 °C, 70 % RH
plant room of a fictional office block; k = 0.040 W/(m·K) board; criteria condensation on
the coldest face, a 10 W/m² cap on the worst face's heat flux and at most 2 K air
temperature change over the run.  The selection of all 30 sizes (their dimensions as (n, 1)
arrays, every face of every size in each solve) is timed, best of 5 (wall and CPU), against
the same selection made size by size in a Python loop (the ratio).

    python benchmarks/bench_duct_table.py            # exit 1 above the 0.5 s target
    python benchmarks/bench_duct_table.py --no-fail
"""

from __future__ import annotations

import argparse
import sys
import time

TARGET_S = 0.5


def _sizes() -> list[str]:
    out = []
    for w in (250, 300, 400, 500, 600, 700, 800, 1000, 1200, 1500):
        for ratio in (1.0, 1.5, 2.5):
            out.append(f"{w}x{int(round(w / ratio / 50) * 50) or 50}mm")
    return out


def _problem():
    from pipeins.criteria import Requirements
    from pipeins.line import LineSpec
    from pipeins.units import parse_quantity

    spec = LineSpec(duct="600x400mm", fluid_temp_c=13.0, air_temp_c=32.0, rh_percent=70.0, length_m=40.0,
                    flow=parse_quantity("1.2 kg/s", "flow"))
    req = Requirements(max_heat_flux_w_m2=10.0, max_temp_change_k=2.0)
    return spec, req


def _table(spec, req, texts):
    from pipeins.line import LineSpec
    from pipeins.selection import select

    sizes = [LineSpec(duct=t).section_size() for t in texts]
    return select(spec, "k=0.040", req, sizes=sizes)


def _loop(spec, req, texts):
    from dataclasses import replace

    from pipeins.selection import select

    return [select(replace(spec, duct=t), "k=0.040", req) for t in texts]


def _best(fn, repeat):
    walls, cpus = [], []
    for _ in range(repeat):
        w, c = time.perf_counter(), time.process_time()
        out = fn()
        walls.append(time.perf_counter() - w)
        cpus.append(time.process_time() - c)
    return min(walls), min(cpus), out


def main(argv=None) -> int:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--repeat", type=int, default=5)
    parser.add_argument("--no-fail", action="store_true")
    args = parser.parse_args(argv)
    spec, req = _problem()
    texts = _sizes()
    _table(spec, req, texts[:2])  # warm-up: imports and tables
    wall, cpu, selection = _best(lambda: _table(spec, req, texts), args.repeat)
    keys = [c.key for c in selection.outcome.criteria if c.key != "service_limit"]
    loop_wall, _, loops = _best(lambda: _loop(spec, req, texts), 1)
    for i, one in enumerate(loops):  # the loop is the same selection
        assert abs(float(one.outcome.selected_m[0]) - float(selection.outcome.selected_m[i])) < 1e-9, texts[i]
    print(f"duct table: {len(texts)} rectangular sizes x {len(keys)} criteria ({', '.join(keys)})")
    print(f"  vectorised: {wall:.3f} s wall, {cpu:.3f} s CPU (best of {args.repeat}); target < {TARGET_S} s; "
          f"{wall / TARGET_S:.2f} of the target")
    print(f"  size-by-size loop: {loop_wall:.3f} s wall; vectorised is {loop_wall / wall:.1f}x faster")
    if wall >= TARGET_S and not args.no_fail:
        return 1
    return 0


if __name__ == "__main__":
    sys.exit(main())
