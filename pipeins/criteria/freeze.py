"""Freeze protection: still water holds a time before it reaches 0 °C (or an ice fraction)
(:class:`pipeins.freezing.FreezeHold`); applies only where the air or the surroundings are
below 0 °C."""

from __future__ import annotations

from ..errors import InputError

__all__ = ["decide", "under", "FREEZE_NOT_APPLICABLE", "freeze_not_applicable"]

#: What the criterion says where it does not apply (exact text; reports print it as given).
FREEZE_NOT_APPLICABLE = ("freeze hold does not apply: fluid above 0 °C in air and surroundings at or above "
                         "0 °C, so still water does not freeze")


def freeze_not_applicable(units: str = "si") -> str:
    """:data:`FREEZE_NOT_APPLICABLE` in the unit system *units*."""
    if units == "si":
        return FREEZE_NOT_APPLICABLE
    from ..units import format_quantity

    zero = format_quantity(0.0, "temperature", units)
    return (f"freeze hold does not apply: fluid above {zero} in air and surroundings at or above {zero}, "
            "so still water does not freeze")


def decide(line):
    req = line.req
    if req.hold_time_s is None:
        return None
    if req.hold_time_s <= 0:
        raise InputError("hold_time_s", "the hold time must be greater than zero")
    if line.coldest_outside >= 0.0 and line.fluid_cold >= 0.0:
        return freeze_not_applicable(line.units)
    from ..freezing import FreezeHold

    return FreezeHold(req.hold_time_s, req.ice_fraction)


def under(condition) -> bool:
    """Checked under a design condition whose air is below freezing
    (:data:`pipeins.design_conditions.FREEZE_AIR_C`)."""
    from ..design_conditions import FREEZE_AIR_C

    return condition.air_temp_c < FREEZE_AIR_C
