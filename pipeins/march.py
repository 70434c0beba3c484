"""The Runge–Kutta march of a fluid's temperature along a run, shared by pipes
(:mod:`pipeins.runs`) and ducts (:mod:`pipeins.duct_run`).

dT/dx = −q'(T) / (ṁ·c_p(T)): each step is classical RK4, the temperature clipped to
[floor, ceiling] (the fluid cannot pass its surroundings), and the heat given up is
integrated with the same weights.  The step is at most :data:`STEP_FRACTION` of the
relaxation length ṁ·c_p / (dq'/dT) at the inlet, with at most :data:`MAX_STEPS` steps.
"""

from __future__ import annotations

import math

import numpy as np

__all__ = ["MAX_STEPS", "STEP_FRACTION", "substeps", "march"]

#: Upper bound on the Runge–Kutta steps of one run (all segments together).
MAX_STEPS = 2000
#: Largest step, as a fraction of the local relaxation length ṁ·c_p / (dq'/dT): 0.5 keeps
#: the RK4 error per step below 3e-4 of the fluid-to-ambient difference.
STEP_FRACTION = 0.5


def substeps(relaxation_lengths: float, segments: int) -> int:
    """RK4 steps per segment for a run *relaxation_lengths* long (in ṁ·c_p/G)."""
    sub = max(1, math.ceil(relaxation_lengths / (STEP_FRACTION * segments)))
    return min(sub, max(1, MAX_STEPS // segments))


def march(slope, t_in, length_m, segments: int, sub: int, floor, ceiling, shape):
    """March *slope* (T → (dT/dx, q')) over *length_m* [m] in *segments* × *sub* steps.

    Returns (temperatures at the segment ends, from the inlet; q' at the start of each
    segment; the outlet temperature; the heat given up over the run [W]).
    """
    h = length_m / (segments * sub)
    temps, flows = [t_in], []
    temp, total = t_in, np.zeros(shape)
    for _ in range(segments):
        for j in range(sub):
            k1, q1 = slope(temp)
            if j == 0:
                flows.append(q1)
            k2, q2 = slope(np.clip(temp + 0.5 * h * k1, floor, ceiling))
            k3, q3 = slope(np.clip(temp + 0.5 * h * k2, floor, ceiling))
            k4, q4 = slope(np.clip(temp + h * k3, floor, ceiling))
            temp = np.clip(temp + h / 6 * (k1 + 2 * k2 + 2 * k3 + k4), floor, ceiling)
            total = total + h / 6 * (q1 + 2 * q2 + 2 * q3 + q4)
        temps.append(temp)
    return temps, flows, temp, total
