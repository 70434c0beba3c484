"""What every along-the-line model needs of a pipe problem: its case shape, and whether it is a run.

Shared by :mod:`pipeins.runs` (the march along a run) and :mod:`pipeins.freezing` (still
water cooling), which do not import each other.
"""

from __future__ import annotations

import numpy as np

from .errors import InputError

__all__ = ["case_shape", "is_run", "require_pipe"]


def case_shape(pipe, layers, surroundings, surface, *more) -> tuple[int, ...]:
    """Broadcast shape of every numeric input of a pipe problem."""
    values = [pipe.outer_diameter_m, pipe.wall_m, pipe.wall_conductivity_w_mk,
              surroundings.air_temp_c, surroundings.surroundings_temp_c,
              surroundings.wind_speed_m_s, surroundings.relative_humidity_percent,
              surroundings.pressure_pa, surroundings.height_m, surface.emittance,
              surface.fixed_coefficient_w_m2k, *more]
    values += [layer.thickness_m for layer in layers]
    return np.broadcast_shapes(*(np.shape(v) for v in values if v is not None))


def is_run(pipe, surroundings) -> bool:
    """Whether *pipe* is a run whose heat flow is per metre (its shape's basis is W/m)."""
    return pipe.shape(surroundings).basis == "W/m"


def require_pipe(pipe, surroundings):
    """Refuse a section that is not a run (a flat face, a vessel)."""
    if not is_run(pipe, surroundings):
        raise InputError("--pipe", "a run needs a round pipe, not a flat face")
