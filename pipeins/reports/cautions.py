"""The cautions every report carries where the work can hurt someone.

The tool estimates; it does not certify.  These lines say so, point to the usual
references and defer to local codes and licensed practice.
"""

from __future__ import annotations

import numpy as np

__all__ = ["cautions_for", "GENERAL", "HOT", "COLD", "FREEZE", "CODE", "METAL_JACKET", "TOUCH_DEFAULT_SOURCE"]

GENERAL = ("Results are engineering estimates for the stated steady conditions; real surfaces vary with "
           "wind, sun, finish ageing, wet or damaged insulation and workmanship. Local codes, the owner's "
           "rules and licensed practice govern.")
HOT = ("Hot surface: burn risk depends on surface temperature, material and contact time (ISO 13732-1, "
       "ASTM C1055). Guard, label or insulate surfaces people can touch; check bare flanges, valves and "
       "supports, which run at the fluid temperature.")
METAL_JACKET = ("A metal jacket's low emittance makes its surface run hotter than a painted or plastic one "
                "at the same thickness, and bare metal burns faster at the same temperature.")
COLD = ("Cold line: a continuous, sealed vapour retarder is needed regardless of thickness; without it "
        "moisture migrates into the insulation, condenses and ruins it.")
FREEZE = ("Insulation only delays freezing; it never prevents it. Water that stands long enough in a cold "
          "space will freeze unless the pipe is heat-traced or kept flowing.")
CODE = ("Code minimum thicknesses are from the edition named and may be from memory: the edition adopted "
        "locally and its amendments govern; confirm with the authority having jurisdiction.")
TOUCH_DEFAULT_SOURCE = "common practice, after ASTM C1055 guidance for short contact with metal surfaces"


def cautions_for(spec, result) -> list[str]:
    """The cautions that apply to a solved line."""
    fluid = float(np.max(result.inputs["fluid"].temp_c))
    fluid_min = float(np.min(result.inputs["fluid"].temp_c))
    air = float(np.min(result.inputs["surroundings"].air_temp_c))
    out = []
    if fluid > 45.0:
        out.append(HOT)
        if result.inputs["surface"].surface_kind in ("metal_jacket", "bare_metal"):
            out.append(METAL_JACKET)
    if fluid_min < air:
        out.append(COLD)
    if air < 0.0:
        out.append(FREEZE)
    out.append(GENERAL)
    return out
