"""Sections other than a pipe, at the level of a line: building vessels, and the extras
of a check (heat over a duct run, the air's temperature change, a vessel's hold time).

Numbers only; :mod:`pipeins.reports.section` words them.
"""

from __future__ import annotations

import numpy as np

from .errors import InputError

__all__ = ["section_extras", "build_vessel"]


def _one(x):
    return float(np.asarray(x).ravel()[0])


def build_vessel(spec, sheet, wall_m):
    """The sphere or cylindrical vessel of *spec* (see :mod:`pipeins.geometry.vessel`)."""
    raise InputError("vessel", "spheres and vessels are not available yet")


def section_extras(spec, result, units: str):
    """Rows (display text), SI data and warnings beyond the section's heat flow."""
    from .units import format_quantity as fq

    rows, data, warnings = [], {}, []
    q = _one(result.heat_flow)
    if spec.section_kind == "duct" and spec.length_m is not None:
        heat = q * spec.length_m
        rows.append([f"heat {'loss' if heat >= 0 else 'gain'} over {fq(spec.length_m, 'length', units)}",
                     fq(abs(heat), "power", units)])
        data["heat_flow_w"] = heat
    return rows, data, warnings
