"""The cautions every report carries where the work can hurt someone.

The tool estimates; it does not certify.  These lines say so, point to the usual
references and defer to local codes and licensed practice.
"""

from __future__ import annotations

import numpy as np

__all__ = ["cautions", "cautions_for", "GENERAL", "HOT", "COLD", "FREEZE", "CODE", "METAL_JACKET",
           "HOT_CAUTION_ABOVE_C"]

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
# Fluid temperature above which the hot-surface caution is shown: common practice, near the
# ISO 13732-1 burn threshold for long contact (about 43-48 °C, from memory).
HOT_CAUTION_ABOVE_C = 45.0


def cautions(fluid_temps_c, air_temps_c, surface_kinds=(), *, touch: bool = False, freeze: bool = False,
             code: bool = False) -> list[str]:
    """The cautions for lines at *fluid_temps_c* in air at *air_temps_c* (paired, broadcast),
    with outer surfaces of *surface_kinds*; *touch*, *freeze* and *code* say which sizing
    criteria were used (a touch criterion always brings the metal-jacket note)."""
    fluid = np.asarray(fluid_temps_c, dtype=float)
    air = np.asarray(air_temps_c, dtype=float)
    found = set()
    if np.any(fluid > HOT_CAUTION_ABOVE_C):
        found.add(HOT)
        if touch or any(kind in ("metal_jacket", "bare_metal") for kind in surface_kinds):
            found.add(METAL_JACKET)
    if np.any(fluid < air):
        found.add(COLD)
    if freeze or np.any(air < 0.0):
        found.add(FREEZE)
    if code:
        found.add(CODE)
    return [c for c in (HOT, METAL_JACKET, COLD, FREEZE, CODE) if c in found] + [GENERAL]


def cautions_for(spec, result) -> list[str]:
    """The cautions that apply to a solved line."""
    return cautions(result.inputs["fluid"].temp_c, result.inputs["surroundings"].air_temp_c,
                    [result.inputs["surface"].surface_kind])
