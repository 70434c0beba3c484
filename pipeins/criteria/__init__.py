"""From what the engineer asks for to the criterion objects the sizing search uses.

:class:`Requirements` holds the sizing options in SI.  Every criterion is one record of the
registry (:mod:`pipeins.criteria.registry`) and one module of this package that builds it
(``decide``) or gives its thickness (``required``).  :func:`build_criteria` walks the records:

* touch safety on every line whose fluid is hotter than the touch limit (default 60 °C,
  common practice after ASTM C1055; or a burn threshold from ``tables/touch_limits.csv``
  for a contact time and the kind of outer surface); ``touch=False`` turns it off;
* condensation control on lines colder than the air, when the relative humidity is given;
* a heat-flow cap or a minimum reduction against the bare line, a heat-flux cap, when given;
* the temperature change along a run, the freeze hold time and a tracer's output, when given.

The code minimum and the economic thickness (records with ``required``) join in
:func:`pipeins.selection.select`.
"""

from __future__ import annotations

from dataclasses import dataclass

from .registry import Line, records

__all__ = ["Requirements", "build_criteria", "touch_limit_for", "no_criterion_message",
           "CONDENSATION_NOT_APPLICABLE", "FREEZE_NOT_APPLICABLE", "freeze_not_applicable",
           "DEFAULT_DEW_MARGIN_K"]

DEFAULT_DEW_MARGIN_K = 1.0  # common practice (no standard value): surface at least 1 K above dew point


@dataclass(frozen=True)
class Requirements:
    """Sizing options, SI.  ``None`` means not asked for."""

    touch: bool = True
    touch_limit_c: float | None = None
    contact_time_s: float | None = None
    dew_margin_k: float = DEFAULT_DEW_MARGIN_K
    max_heat_flow_w_per_m: float | None = None
    #: Cap on the worst part's outer heat flux [W/m²] (:class:`pipeins.section_criteria.HeatFluxCap`).
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


_LAZY = {"touch_limit_for": "touch", "CONDENSATION_NOT_APPLICABLE": "condensation",
         "FREEZE_NOT_APPLICABLE": "freeze", "freeze_not_applicable": "freeze"}


def __getattr__(name):  # the criterion modules import numpy: only on first use
    if name in _LAZY:
        import importlib

        return getattr(importlib.import_module(f"{__name__}.{_LAZY[name]}"), name)
    raise AttributeError(f"module {__name__!r} has no attribute {name!r}")


def build_criteria(spec, req: Requirements, fluid_temp_c, air_temp_c, surface_kind: str, units: str = "si"):
    """The criteria that apply, and notes on criteria that were asked for but do not apply.

    Walks the registered criteria that the search sizes for, in order: each one asked for on
    a section kind it does not apply to is refused (one line); each one's ``decide`` gives the
    criterion, a note saying why it does not apply, or nothing.  Condensation control is
    built whenever the relative humidity is given and some surface between the fluid, air
    and radiant temperatures could sit below the dew point plus the margin (a line colder
    than the air, or one under a cold sky, whose insulation cools below the air); the search
    drops it, with :data:`CONDENSATION_NOT_APPLICABLE`, when no thickness from bare to the
    thickest fails it.  The freeze hold applies only where the air or the surroundings are
    below 0 °C.
    """
    from .registry import resolve

    line = Line(spec, req, fluid_temp_c, air_temp_c, surface_kind, units)
    criteria, notes = [], []
    for record in records():
        if record.decide is None:
            continue
        if record.asked(req, spec):
            record.check_kind(line.kind)
        got = resolve(record.decide)(line)
        if got is None:
            continue
        if isinstance(got, str):
            notes.append(got)
        else:
            criteria.append(got)
    return criteria, notes


def no_criterion_message(notes, rh_given: bool) -> str:
    """The error text when no criterion is left to size for: why, and what could be asked
    (parameter names, which each front end words as its flag or key)."""
    asks = ["touch_limit_c"] + ([] if rh_given else ["rh_percent (condensation)"]) + [
        "max_heat_flow_w_per_m", "min_reduction"]
    reasons = "; ".join(notes)
    text = "no sizing criterion applies to this line" + (f" ({reasons})" if reasons else "")
    return f"{text}; give one of {', '.join(asks)} or a code minimum"
