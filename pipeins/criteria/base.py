"""The criterion protocol the sizing search (:func:`pipeins.sizing.size`) uses.

A criterion is a small object whose :meth:`Criterion.margin` says, for solved cases, by how
much each passes (>= 0) or fails (< 0), in its own unit.  Which criteria a line gets is
decided by the registry (:mod:`pipeins.criteria.registry`).  This module imports neither
the solver nor the search, so a module that defines a criterion stays cheap to import.
"""

from __future__ import annotations

import math

import numpy as np

__all__ = ["Criterion"]


def _q(value_si: float, kind: str, units: str) -> str:
    from ..units import format_quantity

    return format_quantity(value_si, kind, units)


def _in(units: str, value: float, kind: str, si_text: str) -> str:
    """*si_text* in SI; in other unit systems the quantity formatted for them."""
    return si_text if units == "si" else _q(value, kind, units)


def _thick(units: str, value_m: float, down: bool = False) -> str:
    """A thickness for a sentence: to 0.1 mm in SI, rounded down for an upper bound (so the
    figure said still holds)."""
    if units == "si":
        tenths = math.floor(value_m * 1e4 + 1e-6) if down else round(value_m * 1e4)
        return f"{tenths / 10:.1f} mm"
    return _q(value_m, "thickness", units)


class Criterion:
    """Base class: ``key`` (JSON), ``label`` (reports), ``unit`` of the margin.

    ``units`` (``"si"`` or ``"us"``, set by :func:`pipeins.selection.select`) is the unit system
    of the sentences :meth:`state` and :meth:`miss` write.

    A criterion whose ``not_applicable`` text is set is dropped by :func:`pipeins.sizing.size`,
    with that text as a note, when every thickness from bare to the thickest passes it.
    A criterion whose margin solves the line itself (a march along a run, a cooling time)
    sets ``own_solve = True``: the search then hands it the trial thicknesses alone.
    """

    key = ""
    label = ""
    not_applicable = ""
    units = "si"

    def margin(self, problem, result, thickness_m) -> np.ndarray:
        raise NotImplementedError

    def describe(self, units: str = "si") -> str:
        """The requirement in words, quantities in the unit system *units*."""
        return self.label

    def miss(self, margin: float, thickness_m: float) -> str:
        """A plain sentence saying by how much the criterion misses at *thickness_m*."""
        raise NotImplementedError

    def state(self, problem, result, index: int) -> str:
        """How the solved case *index* stands against the criterion (for reports)."""
        thickness = result.inputs["layers"][-1].thickness_m
        margin = float(np.ravel(self.margin(problem, result, thickness))[index])
        return self.state_text(margin)

    def state_text(self, margin: float) -> str:
        return f"margin {margin:.3g}"

    def bound_text(self, least_m: float, most_m: float, selected_m: float) -> str:
        """Where the criterion holds only up to *most_m* [m] (from *least_m*): the bound, said
        beside a feasible pick of *selected_m* [m]."""
        u = self.units
        span = (f"from bare up to {_thick(u, most_m, down=True)}" if least_m <= 0 else
                f"from {_thick(u, least_m)} up to {_thick(u, most_m, down=True)}")
        return f"{self.label} holds {span} only; more makes it fail"

    def conflict_text(self, most_m: float, need_m: float, need_label: str, series_gap: bool = False) -> str:
        """The criterion allows at most *most_m* [m] but *need_label* needs *need_m* [m] (or, with
        *series_gap*, no thickness of the series lies between them)."""
        u = self.units
        if series_gap:
            return (f"{self.label} allows at most {_thick(u, most_m, down=True)} and {need_label} needs at "
                    f"least {_thick(u, need_m)}: no thickness of the series lies between them; give a series "
                    "with a thickness there")
        return (f"{self.label} allows at most {_thick(u, most_m, down=True)} but {need_label} needs "
                f"{_thick(u, need_m)}, {_thick(u, need_m - most_m)} more than allowed")
