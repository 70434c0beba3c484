"""From what the engineer asks for to the criterion objects the sizing search uses.

:class:`Requirements` holds the sizing options in SI.  :func:`build_criteria` decides
which criteria apply to a line:

* touch safety on every line whose fluid is hotter than the touch limit (default 60 °C,
  common practice after ASTM C1055; or a burn threshold from ``tables/touch_limits.csv``
  for a contact time and the kind of outer surface); ``touch=False`` turns it off;
* condensation control on lines colder than the air, when the relative humidity is given;
* a heat-flow cap or a minimum reduction against the bare line, when given;
* the temperature change along a run and the freeze hold time, when given.
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np

from .errors import InputError
from .sizing import DEFAULT_DEW_MARGIN_K, Condensation, HeatFlowCap, TouchSafety

__all__ = ["Requirements", "build_criteria", "touch_limit_for", "no_criterion_message",
           "CONDENSATION_NOT_APPLICABLE", "FREEZE_NOT_APPLICABLE", "freeze_not_applicable"]


@dataclass(frozen=True)
class Requirements:
    """Sizing options, SI.  ``None`` means not asked for."""

    touch: bool = True
    touch_limit_c: float | None = None
    contact_time_s: float | None = None
    dew_margin_k: float = DEFAULT_DEW_MARGIN_K
    max_heat_flow_w_per_m: float | None = None
    #: Cap on the worst part's outer heat flux [W/m²] (:class:`pipeins.sections.HeatFluxCap`).
    max_heat_flux_w_m2: float | None = None
    #: A duct code minimum's location, service and climate zone (:mod:`pipeins.duct_codes`).
    duct_location: str | None = None
    duct_service: str | None = None
    climate_zone: str | None = None
    min_reduction: float | None = None
    max_temp_change_k: float | None = None
    hold_time_s: float | None = None
    ice_fraction: float = 0.0
    tracer_output_w_per_m: float | None = None
    safety_factor_percent: float | None = None


def touch_limit_for(req: Requirements, surface_kind: str) -> tuple[float, str]:
    """The touch limit [°C] and where it comes from."""
    if req.touch_limit_c is not None:
        if req.contact_time_s is not None:
            raise InputError("contact_time_s", "give touch_limit_c or contact_time_s, not both")
        return req.touch_limit_c, "given"
    if req.contact_time_s is not None:
        from .catalog.touch import touch_limit

        limit, source = touch_limit(surface_kind, req.contact_time_s)
        return float(limit), f"{surface_kind.replace('_', ' ')} surface, {req.contact_time_s:g} s contact: {source}"
    from .catalog.touch import DEFAULT_TOUCH_LIMIT_C, DEFAULT_TOUCH_LIMIT_SOURCE

    return DEFAULT_TOUCH_LIMIT_C, DEFAULT_TOUCH_LIMIT_SOURCE


#: What a criterion that does not apply says (exact texts; reports print them as given).
CONDENSATION_NOT_APPLICABLE = "condensation control does not apply: the surface stays above the dew point bare"
FREEZE_NOT_APPLICABLE = ("freeze hold does not apply: fluid above 0 °C in air and surroundings at or above "
                         "0 °C, so still water does not freeze")


def freeze_not_applicable(units: str = "si") -> str:
    """:data:`FREEZE_NOT_APPLICABLE` in the unit system *units*."""
    if units == "si":
        return FREEZE_NOT_APPLICABLE
    from .units import format_quantity

    zero = format_quantity(0.0, "temperature", units)
    return (f"freeze hold does not apply: fluid above {zero} in air and surroundings at or above {zero}, "
            "so still water does not freeze")


def build_criteria(spec, req: Requirements, fluid_temp_c, air_temp_c, surface_kind: str, units: str = "si"):
    """The criteria that apply, and notes on criteria that were asked for but do not apply.

    Condensation control is built whenever the relative humidity is given and some surface
    between the fluid, air and radiant temperatures could sit below the dew point plus the
    margin (a line colder than the air, or one under a cold sky, whose insulation cools
    below the air); the search drops it, with :data:`CONDENSATION_NOT_APPLICABLE`, when no
    thickness from bare to the thickest fails it.  The freeze hold applies only where the air
    or the surroundings are below 0 °C.
    """
    fluid_hot = float(np.max(fluid_temp_c))
    fluid_cold = float(np.min(fluid_temp_c))
    air = np.asarray(air_temp_c, dtype=float)
    radiant = np.asarray(spec.air_temp_c if spec.surroundings_temp_c is None else spec.surroundings_temp_c,
                         dtype=float)
    coldest_outside = float(min(np.min(air), np.min(radiant)))
    criteria, notes = [], []
    limit, source = touch_limit_for(req, surface_kind)
    if req.touch:
        if limit <= float(np.max(air)):
            # blame the input the limit came from: a burn threshold of the contact time, or the limit
            name = "contact_time_s" if req.touch_limit_c is None and req.contact_time_s is not None else "touch_limit_c"
            raise InputError(name, f"the touch limit {limit:g} °C must be above the air "
                                   f"temperature {float(np.max(air)):g} °C")
        if fluid_hot > limit:
            criteria.append(TouchSafety(limit, source))
        elif req.touch_limit_c is not None or req.contact_time_s is not None:
            from .units import format_quantity as fq

            hot, lim = ((f"{fluid_hot:g} °C", f"{limit:g} °C") if units == "si" else
                        (fq(fluid_hot, "temperature", units), fq(limit, "temperature", units)))
            notes.append(f"touch safety does not apply: the fluid ({hot}) is not above the {lim} limit, "
                         "so no surface can exceed it")
    cold_sky = float(np.min(radiant)) < float(np.min(air))
    if fluid_cold < float(np.max(air)) or cold_sky:
        if spec.rh_percent is not None:
            if req.dew_margin_k < 0:
                raise InputError("dew_margin_k", "the dew-point margin must be zero or more")
            from .props.humid import dew_point_c

            dew = float(np.max(dew_point_c(air, spec.rh_percent, spec.pressure_pa)))
            if min(fluid_cold, coldest_outside) < dew + req.dew_margin_k:
                criteria.append(Condensation(req.dew_margin_k, cold_sky))
            else:
                notes.append(CONDENSATION_NOT_APPLICABLE)
        elif fluid_cold < float(np.min(air)):
            notes.append("condensation not checked: the line is colder than the air; give --rh")
    elif spec.rh_percent is not None:
        notes.append(CONDENSATION_NOT_APPLICABLE)
    if req.max_heat_flow_w_per_m is not None or req.min_reduction is not None:
        criteria.append(HeatFlowCap(req.max_heat_flow_w_per_m, req.min_reduction))
    if req.max_heat_flux_w_m2 is not None:
        from .sections import HeatFluxCap

        criteria.append(HeatFluxCap(req.max_heat_flux_w_m2))
    if req.max_temp_change_k is not None:
        from .runs import TempChange

        if req.max_temp_change_k <= 0:
            raise InputError("max_temp_change_k", "the temperature change limit must be greater than zero")
        if spec.section_kind == "duct":
            from .sections import duct_temp_change

            criteria.append(duct_temp_change(spec, req.max_temp_change_k))
        elif spec.flow is None or spec.length_m is None or not spec.fluid:
            raise InputError("max_temp_change_k", "needs the fluid, its flow and length_m")
        else:
            criteria.append(TempChange(req.max_temp_change_k, spec.fluid, flow=spec.flow, length_m=spec.length_m))
    if req.hold_time_s is not None:
        from .freezing import FreezeHold

        if req.hold_time_s <= 0:
            raise InputError("hold_time_s", "the hold time must be greater than zero")
        if coldest_outside >= 0.0 and fluid_cold >= 0.0:
            notes.append(freeze_not_applicable(units))
        else:
            criteria.append(FreezeHold(req.hold_time_s, req.ice_fraction))
    if req.tracer_output_w_per_m is not None:
        from .tracing import tracer_criterion

        criteria.append(tracer_criterion(req, fluid_cold, float(np.max(air)), units))
    return criteria, notes


def no_criterion_message(notes, rh_given: bool) -> str:
    """The error text when no criterion is left to size for: why, and what could be asked
    (parameter names, which each front end words as its flag or key)."""
    asks = ["touch_limit_c"] + ([] if rh_given else ["rh_percent (condensation)"]) + [
        "max_heat_flow_w_per_m", "min_reduction"]
    reasons = "; ".join(notes)
    text = "no sizing criterion applies to this line" + (f" ({reasons})" if reasons else "")
    return f"{text}; give one of {', '.join(asks)} or a code minimum"
