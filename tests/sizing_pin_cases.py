"""Cases of the sizing regression pin (tests/test_sizing_pinned.py): thickness tables of a few
invented services, every criterion's least thickness and the selected commercial thickness.

Regenerate tests/data/sizing_pinned.json only on purpose (a deliberate change of results):
    PYTHONPATH=$PWD python tests/sizing_pin_cases.py
"""

from __future__ import annotations

import json
from pathlib import Path

import numpy as np

PIN_FILE = Path(__file__).resolve().parent / "data" / "sizing_pinned.json"
SIZES = "NPS 1/2..NPS 12"


def cases():
    from pipeins.criteria import Requirements
    from pipeins.line import LineSpec
    from pipeins.units import Flow

    hours = 3600.0
    return {
        # heating water plant room: touch safety and a heat-flow cap
        "hot": (LineSpec(fluid_temp_c=180.0, air_temp_c=25.0), "mineral wool",
                Requirements(max_heat_flow_w_per_m=80.0)),
        # chilled water in a humid corridor: condensation control and a cap
        "chilled": (LineSpec(fluid_temp_c=5.0, air_temp_c=30.0, rh_percent=70.0), "flexible elastomeric foam",
                    Requirements(max_heat_flow_w_per_m=15.0)),
        # 10 barg saturated steam, touch safety only
        "steam": (LineSpec(steam_pressure_pa=11.01325e5, air_temp_c=20.0), "calcium silicate", Requirements()),
        # a 300 m water run that may cool by at most 1 K
        "temp_change": (LineSpec(fluid_temp_c=60.0, air_temp_c=5.0, fluid="water", flow=Flow(2.0, "mass"), length_m=300.0),
                        "k=0.04", Requirements(touch=False, max_temp_change_k=1.0)),
        # an outdoor water line that must hold 8 h before first ice in -15 °C wind
        "freeze": (LineSpec(fluid_temp_c=10.0, air_temp_c=-15.0, wind_m_s=3.0, fluid="water"), "k=0.04",
                   Requirements(touch=False, hold_time_s=8 * hours)),
    }


def compute():
    from pipeins.catalog.pipes import pipe_range
    from pipeins.selection import select

    sizes = pipe_range(SIZES)
    out = {}
    for name, (spec, material, req) in cases().items():
        sel = select(spec, material, req, sizes=sizes)
        o = sel.outcome
        out[name] = {
            "sizes": [s.label for s in sizes],
            "selected_mm": [None if not np.isfinite(x) else float(x) * 1000 for x in o.selected_m],
            "least_mm": {c.key: [None if not np.isfinite(x) else float(x) * 1000 for x in c.required_m]
                         for c in o.criteria if c.key != "service_limit"},
            "governing": list(o.governing),
        }
    return out


if __name__ == "__main__":
    PIN_FILE.write_text(json.dumps(compute(), indent=1) + "\n", encoding="utf-8")
    print(f"wrote {PIN_FILE}")
