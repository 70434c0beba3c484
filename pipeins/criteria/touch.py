"""Touch safety: the outer surface at or below a touch limit, on lines hotter than it.

The limit is given (``touch_limit_c``), a burn threshold from ``tables/touch_limits.csv`` for
a contact time and the kind of outer surface (``contact_time_s``), or 60 °C (common practice
after ASTM C1055); ``touch=False`` turns the criterion off.
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np

from ..errors import InputError
from .base import Criterion, _in, _q

__all__ = ["TouchSafety", "touch_limit_for", "decide"]


@dataclass
class TouchSafety(Criterion):
    """Outer surface at or below ``limit_c``; ``source`` says where the limit comes from."""

    limit_c: float
    source: str = ""
    key = "surface_temp"
    label = "touch safety"

    def margin(self, problem, result, thickness_m):
        return self.limit_c - result.surface_temp_c

    def describe(self, units="si"):
        text = f"surface at or below {_q(self.limit_c, 'temperature', units)}"
        return f"{text} ({self.source})" if self.source else text

    def state(self, problem, result, index):
        ts, u, lim = float(np.ravel(result.surface_temp_c)[index]), self.units, self.limit_c
        return (f"surface {_in(u, ts, 'temperature', f'{ts:.1f} °C')}, "
                f"{_in(u, lim - ts, 'temperature_difference', f'{lim - ts:.1f} K')} below the "
                f"{_in(u, lim, 'temperature', f'{lim:g} °C')} limit")

    def miss(self, margin, thickness_m):
        u, lim = self.units, self.limit_c
        return (f"touch safety cannot be met: with {_in(u, thickness_m, 'thickness', f'{thickness_m * 1000:.0f} mm')}"
                f" the surface is still {_in(u, -margin, 'temperature_difference', f'{-margin:.1f} K')} above the "
                f"{_in(u, lim, 'temperature', f'{lim:g} °C')} limit")


def touch_limit_for(req, surface_kind: str) -> tuple[float, str]:
    """The touch limit [°C] and where it comes from."""
    if req.touch_limit_c is not None:
        if req.contact_time_s is not None:
            raise InputError("contact_time_s", "give touch_limit_c or contact_time_s, not both")
        return req.touch_limit_c, "given"
    if req.contact_time_s is not None:
        from ..catalog.touch import touch_limit

        limit, source = touch_limit(surface_kind, req.contact_time_s)
        return float(limit), f"{surface_kind.replace('_', ' ')} surface, {req.contact_time_s:g} s contact: {source}"
    from ..catalog.touch import DEFAULT_TOUCH_LIMIT_C, DEFAULT_TOUCH_LIMIT_SOURCE

    return DEFAULT_TOUCH_LIMIT_C, DEFAULT_TOUCH_LIMIT_SOURCE


def decide(line):
    """:class:`TouchSafety` on a line whose fluid is hotter than the limit; a note where a limit
    was given but no surface can exceed it."""
    req = line.req
    limit, source = touch_limit_for(req, line.surface_kind)
    if not req.touch:
        return None
    if limit <= line.air_warm:
        # blame the input the limit came from: a burn threshold of the contact time, or the limit
        name = "contact_time_s" if req.touch_limit_c is None and req.contact_time_s is not None else "touch_limit_c"
        raise InputError(name, f"the touch limit {limit:g} °C must be above the air "
                               f"temperature {line.air_warm:g} °C")
    if line.fluid_hot > limit:
        return TouchSafety(limit, source)
    if req.touch_limit_c is not None or req.contact_time_s is not None:
        units = line.units
        hot, lim = ((f"{line.fluid_hot:g} °C", f"{limit:g} °C") if units == "si" else
                    (_q(line.fluid_hot, "temperature", units), _q(limit, "temperature", units)))
        return (f"touch safety does not apply: the fluid ({hot}) is not above the {lim} limit, "
                "so no surface can exceed it")
    return None
