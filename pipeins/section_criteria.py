"""The sizing criteria of sections other than a pipe: the air temperature change along a
duct (:class:`DuctTempChange`) and the cap on the worst part's heat flux (:class:`HeatFluxCap`).

Apart from :mod:`pipeins.sections` because they build on the sizing search
(:class:`pipeins.sizing.Criterion`, :class:`pipeins.runs.TempChange`), which a check does not
load; ``pipeins.sections.DuctTempChange`` and the others still resolve (to these).
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np

from .errors import InputError
from .model import Layer
from .runs import TempChange
from .sections import _mass_flow, duct_heat_flow, worst_patch_flux_w_m2
from .sizing import Criterion, _in

__all__ = ["duct_temp_change", "DuctTempChange", "HeatFluxCap"]


def duct_temp_change(spec, max_change_k):
    """The criterion "the duct air changes by at most *max_change_k* [K] over ``length_m``"
    (:class:`DuctTempChange`); needs ``length_m`` and the flow (or the velocity)."""
    if spec.length_m is None or (spec.flow is None and spec.velocity_m_s is None):
        raise InputError("max_temp_change_k", "the air temperature change along a duct needs length_m and the air "
                                              "flow or velocity_m_s")
    return DuctTempChange(max_change_k, "air", spec.flow, spec.length_m, velocity_m_s=spec.velocity_m_s,
                          pressure_pa=spec.pressure_pa)


@dataclass
class DuctTempChange(TempChange):
    """Duct air temperature change along the run at most ``max_change_k`` [K].

    As :class:`pipeins.runs.TempChange` for a pipe, with the duct section solved whole (every
    face, every size and every trial thickness in one solve).  Inside the search the run
    is not marched step by step but answered by the exponential law on the secant of the
    heat flow over the run's own temperature range: with q'(T_in) and q'(T₁) at a first
    estimate T₁ of the leaving air, q' ≈ a·(T − T₀) and
    T_out = T₀ + (T_in − T₀)·exp(−a·L/(ṁ·c_p)) — exact for a heat flow linear in the air
    temperature (a fixed outer coefficient and constant k, sun or a cold sky included), and
    within about 1e-3 K of the RK4 march of :func:`pipeins.duct_run.temperature_along_duct`
    for real films (tests re-march every sized thickness).  Two solves per trial instead of
    the march's eighteen keep a 30-size duct table fast.  It never refuses a run that
    reaches the surroundings (``ambient_fraction=0`` in the march's terms): a thin trial
    layer may, the sized one then does not.
    """

    velocity_m_s: object = None
    pressure_pa: object = 101_325.0
    label = "air temperature change along the duct"

    def margin(self, problem, result, thickness_m):
        from .props.air import air_properties

        t = np.asarray(thickness_m, dtype=float)
        t = np.broadcast_to(t, np.broadcast_shapes(t.shape, (problem.n_sizes, 1)))
        layers = list(problem.fixed_layers) + [Layer(problem.material, np.where(t <= 0, 1e-9, t))]
        inlet = np.asarray(problem.fluid.temp_c, dtype=float)
        mdot = _mass_flow(self.flow, self.velocity_m_s, problem.pipe, inlet, self.pressure_pa)
        q = duct_heat_flow(problem.pipe, layers, problem.fluid, problem.surroundings, problem.surface)
        ambient = np.asarray(problem.surroundings.air_temp_c, dtype=float)
        q_in = np.asarray(q(inlet), dtype=float)
        shape = q_in.shape
        inlet, mdot = np.broadcast_to(inlet, shape), np.broadcast_to(mdot, shape)
        cp = air_properties(inlet, self.pressure_pa).heat_capacity_j_kgk
        difference = np.broadcast_to(inlet - ambient, shape)
        moving = np.abs(difference) > 1e-9
        ua0 = np.where(moving, q_in / np.where(moving, difference, 1.0), 0.0)
        first = inlet - difference * -np.expm1(-np.maximum(ua0, 0.0) * self.length_m / (mdot * cp))
        q_1 = np.asarray(q(first), dtype=float)
        span = inlet - first
        ok = np.abs(span) > 1e-9
        slope = np.where(ok, (q_in - q_1) / np.where(ok, span, 1.0), 0.0)
        cp = air_properties(0.5 * (inlet + first), self.pressure_pa).heat_capacity_j_kgk
        good = ok & (slope > 0)
        safe = np.where(good, slope, 1.0)
        balance = inlet - q_in / safe  # T₀: where the secant heat flow is zero
        leaving = np.where(good, balance + (inlet - balance) * np.exp(-safe * self.length_m / (mdot * cp)),
                           inlet - q_in * self.length_m / (mdot * cp))
        return self.max_change_k - np.abs(leaving - inlet)

    def describe(self, units="si"):
        return "duct air " + super().describe(units).removeprefix("fluid ")

@dataclass
class HeatFluxCap(Criterion):
    """|outer heat flux| of the worst part at or below ``max_w_m2`` [W/m²].

    The cap applies to the part (a duct's top, sides or bottom; a vessel's shell or head)
    whose outer heat flux is largest, not to the section's mean: a cap per m² of surface
    is a statement about every square metre, and the mean would let the worst face
    exceed it.  On a duct with one build-up all round the faces differ only by their
    films, so the worst face asks a little more than the mean (safe side).
    """

    max_w_m2: float
    key = "heat_flux"
    label = "heat-flux cap"

    def __post_init__(self):
        if not self.max_w_m2 > 0:
            raise InputError("max_heat_flux_w_m2", "the heat-flux cap must be greater than zero")

    def margin(self, problem, result, thickness_m):
        return (self.max_w_m2 - worst_patch_flux_w_m2(result)) / self.max_w_m2

    def describe(self, units="si"):
        return (f"|outer heat flux| of the worst part at most "
                f"{_in(units, self.max_w_m2, 'heat_flux', f'{self.max_w_m2:g} W/m²')}")

    def state(self, problem, result, index):
        q = float(np.ravel(worst_patch_flux_w_m2(result))[index])
        u = self.units
        return (f"worst part's |heat flux| {_in(u, q, 'heat_flux', f'{q:.1f} W/m²')}, "
                f"{100 * (self.max_w_m2 - q) / self.max_w_m2:.0f} % under the cap of "
                f"{_in(u, self.max_w_m2, 'heat_flux', f'{self.max_w_m2:g} W/m²')}")

    def miss(self, margin, thickness_m):
        return (f"heat-flux cap cannot be met: with "
                f"{_in(self.units, thickness_m, 'thickness', f'{thickness_m * 1000:.0f} mm')} the worst part's "
                f"heat flux is still {-100 * margin:.1f} % above the cap")

