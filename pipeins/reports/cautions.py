"""The cautions every report carries where the work can hurt someone.

The tool estimates; it does not certify.  These lines say so, point to the usual
references and defer to local codes and licensed practice.  Which apply is the library's
(:func:`pipeins.cautions.caution_notes`); the sentences are :data:`pipeins.reports.notes.TEMPLATES`'.
"""

from __future__ import annotations

__all__ = ["cautions", "cautions_for", "GENERAL", "HOT", "COLD", "FREEZE", "CODE", "METAL_JACKET",
           "HOT_CAUTION_ABOVE_C"]

from ..cautions import HOT_CAUTION_ABOVE_C, caution_notes
from .notes import TEMPLATES, render

#: The caution sentences (their templates live in :data:`pipeins.reports.notes.TEMPLATES`).
GENERAL = TEMPLATES["caution.general"]
HOT = TEMPLATES["caution.hot"]
METAL_JACKET = TEMPLATES["caution.metal_jacket"]
COLD = TEMPLATES["caution.cold"]
FREEZE = TEMPLATES["caution.freeze"]
CODE = TEMPLATES["caution.code"]


def cautions(fluid_temps_c, air_temps_c, surface_kinds=(), *, touch: bool = False, freeze: bool = False,
             code: bool = False) -> list[str]:
    """The cautions for lines at *fluid_temps_c* in air at *air_temps_c* (paired, broadcast),
    with outer surfaces of *surface_kinds*; *touch*, *freeze* and *code* say which sizing
    criteria were used (a touch criterion always brings the metal-jacket note)."""
    return [render(n) for n in caution_notes(fluid_temps_c, air_temps_c, surface_kinds, touch=touch,
                                             freeze=freeze, code=code)]


def cautions_for(spec, result) -> list[str]:
    """The cautions that apply to a solved line."""
    return cautions(result.inputs["fluid"].temp_c, result.inputs["surroundings"].air_temp_c,
                    [result.inputs["surface"].surface_kind])
