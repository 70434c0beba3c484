"""Along the run and over time, for one solved line: numbers and notes (SI), no text.

:func:`line_extras` gathers what ``pipeins check`` and ``pipeins size`` show beside the
heat flow of a round pipe: the heat flow over the run, the outlet temperature at a flow
(:mod:`pipeins.runs`), the steam condensate, and the hours until still water reaches 0 °C
(:mod:`pipeins.freezing`).  The report layer (:mod:`pipeins.reports.extras`) writes the
rows in the chosen unit system.
"""

from __future__ import annotations

import math
from dataclasses import dataclass, field

import numpy as np

from .notes import Note, note

__all__ = ["LineExtras", "line_extras"]


@dataclass
class LineExtras:
    """The run and freeze figures of one line, SI; None where they do not apply."""

    length_m: float | None = None
    #: Heat over the run [W] (the march's integral with a flow, q'·L without).
    heat_flow_w: float | None = None
    mass_flow_kg_s: float | None = None
    outlet_temp_c: float | None = None
    #: Outlet − inlet [K]; negative when the fluid cools.
    temp_change_k: float | None = None
    condensate_kg_per_h_per_m: float | None = None
    condensate_kg_per_h: float | None = None
    #: Seconds until still water cools to 0 °C (water in air below 0 °C only).
    freeze_start_s: float | None = None
    notes: list[Note] = field(default_factory=list)

    def data(self) -> dict:
        """The JSON fields, SI (``freeze_start_h`` in hours, as the JSON contract has it)."""
        out = {}
        if self.mass_flow_kg_s is not None:
            out.update(mass_flow_kg_s=self.mass_flow_kg_s, outlet_temp_c=self.outlet_temp_c,
                       temp_change_k=self.temp_change_k)
        if self.heat_flow_w is not None:
            out["heat_flow_w"] = self.heat_flow_w
        if self.condensate_kg_per_h_per_m is not None:
            out["condensate_kg_per_h_per_m"] = self.condensate_kg_per_h_per_m
            if self.condensate_kg_per_h is not None:
                out["condensate_kg_per_h"] = self.condensate_kg_per_h
        if self.freeze_start_s is not None:
            out["freeze_start_h"] = self.freeze_start_s / 3600.0
        return out


def _one(x) -> float:
    return float(np.asarray(x, dtype=float).ravel()[0])


def line_extras(spec, result) -> LineExtras:
    """The run and freeze figures of *spec* (a :class:`pipeins.line.LineSpec`) solved as *result*.

    * with ``spec.length_m``: the heat flow over the run; with a liquid ``spec.fluid`` and
      ``spec.flow`` as well: the outlet temperature and the temperature change
      (:func:`pipeins.runs.temperature_along_run`);
    * with ``spec.steam_pressure_pa``: the condensate per metre (and over the run);
    * for water with the air below 0 °C: the time until still water cools to 0 °C
      (:func:`pipeins.freezing.freeze_times`).
    """
    from .run_cases import is_run

    out = LineExtras()
    inputs = result.inputs
    pipe, layers, fluid = inputs["pipe"], list(inputs["layers"]), inputs["fluid"]
    surroundings, surface = inputs["surroundings"], inputs["surface"]
    q = _one(result.heat_flow_w_per_m)
    temp_c = _one(fluid.temp_c)
    length = spec.length_m
    steam = spec.steam_pressure_pa is not None

    if length is not None:
        out.length_m = length
        heat = q * length
        if spec.flow is not None and not steam:
            if not spec.fluid:
                out.notes.append(note("run.needs_fluid"))
            else:
                from .runs import mass_flow_kg_s, temperature_along_run  # only for a run with a flow

                mdot = _one(mass_flow_kg_s(spec.flow, spec.fluid, temp_c))
                run = temperature_along_run(pipe, layers, spec.fluid, temp_c, mdot, length, surroundings,
                                            surface, fluid.film_coefficient_w_m2k)
                heat = _one(run.heat_flow_w)
                out.mass_flow_kg_s, out.outlet_temp_c = mdot, _one(run.outlet_temp_c)
                out.temp_change_k = out.outlet_temp_c - temp_c
                out.notes += run.notes
        out.heat_flow_w = heat
    if steam:
        from .runs import condensate_kg_per_h

        per_m_kg_s = _one(condensate_kg_per_h(q, spec.steam_pressure_pa)) / 3600.0
        out.condensate_kg_per_h_per_m = per_m_kg_s * 3600.0
        if length is not None:
            out.condensate_kg_per_h = per_m_kg_s * 3600.0 * length
    if not steam and spec.fluid and _is_water(spec.fluid) and _one(surroundings.air_temp_c) < 0 \
            and temp_c > 0 and is_run(pipe, surroundings):
        from .freezing import freeze_times

        seconds = _one(freeze_times(pipe, layers, surroundings, surface, temp_c).time_to_zero_s)
        if math.isfinite(seconds):
            out.freeze_start_s = seconds
    return out


def _is_water(name) -> bool:
    from .props.liquids import normalise_fluid

    return normalise_fluid(name) == normalise_fluid("water")
