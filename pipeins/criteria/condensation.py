"""Condensation control: the outer surface at least a margin above the dew point of the air.

Built whenever the relative humidity is given and some surface between the fluid, air and
radiant temperatures could sit below the dew point plus the margin (a line colder than the
air, or one under a cold sky, whose insulation cools below the air); the search drops it, with
:data:`CONDENSATION_NOT_APPLICABLE`, when no thickness from bare to the thickest fails it.
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np

from ..errors import InputError
from . import DEFAULT_DEW_MARGIN_K
from .base import Criterion, _in, _q, _thick

__all__ = ["Condensation", "CONDENSATION_NOT_APPLICABLE", "decide", "under"]

#: What the criterion says where it does not apply (exact text; reports print it as given).
CONDENSATION_NOT_APPLICABLE = "condensation control does not apply: the surface stays above the dew point bare"


def _outer_thickness(result):
    """The sized (outermost) layer's thickness of a solved result [m]."""
    return np.asarray(result.inputs["layers"][-1].thickness_m, dtype=float)


@dataclass
class Condensation(Criterion):
    """Surface at or above the ambient dew point plus ``margin_k`` (lines colder than air)."""

    margin_k: float = DEFAULT_DEW_MARGIN_K
    cold_sky: bool = False
    key = "condensation"
    label = "condensation control"
    not_applicable = CONDENSATION_NOT_APPLICABLE

    def margin(self, problem, result, thickness_m):
        if result.dew_point_c is None:
            raise InputError("--rh", "condensation control needs the relative humidity of the air")
        if problem.sunny:  # the sun does not cure condensation at night: judged without it
            result = problem.solve(thickness_m, night=True)
        return result.surface_temp_c - (result.dew_point_c + self.margin_k)

    def describe(self, units="si"):
        return f"surface at least {_q(self.margin_k, 'temperature_difference', units)} above the dew point"

    def state(self, problem, result, index):
        if problem.sunny:
            result = problem.solve(np.broadcast_to(_outer_thickness(result), result.shape), night=True)
        ts, u = float(np.ravel(result.surface_temp_c)[index]), self.units
        dew = float(np.ravel(np.broadcast_to(result.dew_point_c, result.shape))[index])
        return (f"surface {_in(u, ts, 'temperature', f'{ts:.1f} °C')}, "
                f"{_in(u, ts - dew, 'temperature_difference', f'{ts - dew:.1f} K')} above the dew point "
                f"{_in(u, dew, 'temperature', f'{dew:.1f} °C')}")

    def miss(self, margin, thickness_m):
        u, m = self.units, self.margin_k
        text = (f"condensation control cannot be met: with "
                f"{_in(u, thickness_m, 'thickness', f'{thickness_m * 1000:.0f} mm')} the surface is still "
                f"{_in(u, -margin, 'temperature_difference', f'{-margin:.2f} K')} below the dew point plus "
                f"{_in(u, m, 'temperature_difference', f'{m:g} K')}")
        if self.cold_sky:
            text += ("; surroundings colder than the air cool an insulated surface by radiation, so more "
                     "insulation does not help: a low-emittance jacket or a cover over the line may")
        return text

    _SKY = ("surroundings colder than the air cool an insulated surface by radiation below the air "
            "temperature")

    def bound_text(self, least_m, most_m, selected_m):
        u = self.units
        most = _thick(u, most_m, down=True)
        if selected_m <= 0:
            return (f"no insulation is needed for condensation control: the bare surface stays above the dew "
                    f"point plus {_in(u, self.margin_k, 'temperature_difference', f'{self.margin_k:g} K')}; "
                    f"more than {most} would make the surface sweat under this sky ({self._SKY}): if the line "
                    "is insulated for another reason, give it a low-emittance jacket or a cover")
        span = "from bare" if least_m <= 0 else f"from {_thick(u, least_m)}"
        return (f"condensation control holds {span} up to {most} only: more would make the surface sweat "
                f"under this sky ({self._SKY}); a low-emittance jacket or a cover over the line allows more")

    def conflict_text(self, most_m, need_m, need_label, series_gap=False):
        u = self.units
        most, need = _thick(u, most_m, down=True), _thick(u, need_m)
        if series_gap:
            return (f"condensation control allows at most {most} under this sky and {need_label} needs at "
                    f"least {need}, but no thickness of the series lies between them: give a series with one "
                    f"there, or a low-emittance jacket or a cover over the line ({self._SKY})")
        return (f"condensation control allows at most {most} under this sky but {need_label} needs {need}, "
                f"{_thick(u, need_m - most_m)} more than allowed: a thicker layer would make the surface sweat "
                f"({self._SKY}); a low-emittance jacket or a cover over the line may let both be met")


def decide(line):
    """:class:`Condensation` where a surface could sweat; a note where it cannot, or where the
    line is colder than the air and no relative humidity was given."""
    spec, req = line.spec, line.req
    if line.fluid_cold < line.air_warm or line.cold_sky:
        if spec.rh_percent is not None:
            if req.dew_margin_k < 0:
                raise InputError("dew_margin_k", "the dew-point margin must be zero or more")
            from ..props.humid import dew_point_c

            dew = float(np.max(dew_point_c(line.air, spec.rh_percent, spec.pressure_pa)))
            if min(line.fluid_cold, line.coldest_outside) < dew + req.dew_margin_k:
                return Condensation(req.dew_margin_k, line.cold_sky)
            return CONDENSATION_NOT_APPLICABLE
        if line.fluid_cold < line.air_cold:
            return "condensation not checked: the line is colder than the air; give --rh"
        return None
    if spec.rh_percent is not None:
        return CONDENSATION_NOT_APPLICABLE
    return None


def under(condition) -> bool:
    """Checked under a design condition that gives the relative humidity."""
    return condition.rh_percent is not None
