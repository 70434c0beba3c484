"""Which cautions apply, where the work can hurt someone: structured notes (severity "caution").

The sentences are the report layer's (:data:`pipeins.reports.notes.TEMPLATES`, codes
``caution.*``); :func:`pipeins.reports.cautions.cautions` writes them.
"""

from __future__ import annotations

import numpy as np

from .notes import Note, note

__all__ = ["caution_notes", "HOT_CAUTION_ABOVE_C", "CAUTION_CODES"]

# Fluid temperature above which the hot-surface caution is shown: common practice, near the
# ISO 13732-1 burn threshold for long contact (about 43-48 °C, from memory).
HOT_CAUTION_ABOVE_C = 45.0

#: Every caution code, in the order reports list them (the general one always last).
CAUTION_CODES = ("caution.hot", "caution.metal_jacket", "caution.cold", "caution.freeze", "caution.code",
                 "caution.general")


def caution_notes(fluid_temps_c, air_temps_c, surface_kinds=(), *, touch: bool = False, freeze: bool = False,
                  code: bool = False) -> list[Note]:
    """The cautions for lines at *fluid_temps_c* in air at *air_temps_c* (paired, broadcast),
    with outer surfaces of *surface_kinds*; *touch*, *freeze* and *code* say which sizing
    criteria were used (a touch criterion always brings the metal-jacket note)."""
    fluid = np.asarray(fluid_temps_c, dtype=float)
    air = np.asarray(air_temps_c, dtype=float)
    found = {"caution.general"}
    if np.any(fluid > HOT_CAUTION_ABOVE_C):
        found.add("caution.hot")
        if touch or any(kind in ("metal_jacket", "bare_metal") for kind in surface_kinds):
            found.add("caution.metal_jacket")
    if np.any(fluid < air):
        found.add("caution.cold")
    if freeze or np.any(air < 0.0):
        found.add("caution.freeze")
    if code:
        found.add("caution.code")
    return [note(c, "caution") for c in CAUTION_CODES if c in found]
