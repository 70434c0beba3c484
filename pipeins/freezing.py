"""How long still water in an insulated pipe takes to reach 0 °C, and to freeze partly.

Model (quasi-steady lumped capacitance): the water and the pipe wall share one
temperature T and cool as

    C'(T) · dT/dt = −q'(T),   C'(T) = m'_water(T) · c_water(T) + m'_wall · c_wall

per metre of pipe, where q'(T) [W/m] is the steady heat flow of :func:`pipeins.solve.solve`
with the bore at T (no inner film: natural convection inside still water is neglected,
which overstates the heat flow and so errs on the safe side).  The time to cool from the
start temperature to 0 °C is

    t_0 = ∫_0^{T_start} C'(T) / q'(T) dT

Once at 0 °C the water stays there while it freezes; a fraction f of it freezes after a
further

    t_f = m'_water(0 °C) · f · L_f / q'(0 °C)

with L_f the latent heat of fusion.  The ice layer's own thermal resistance is neglected
(it would slow the loss): conservative.

Neglected, too: the heat stored in the insulation itself.  For NPS 1 schedule 40 steel
with 25 mm of mineral wool (100 kg/m³, 840 J/(kg·K), from memory) C' is about
2.35 kJ/(K·m) for the water and 1.09 kJ/(K·m) for the wall, while the insulation holds
0.39 kJ/(K·m), of which only about half takes part (its mean temperature falls by about
half the water's): some 5 % of C', left out on the safe side (shorter times).

The pipe stays full (it is connected to the system), so the water per metre is
ρ(T) · π d_i² / 4 at each temperature.  Water properties come from
:func:`pipeins.props.liquids.fluid_properties`; the wall's density and heat capacity from
its :class:`~pipeins.catalog.materials.WallMaterial`.
"""

from __future__ import annotations

import math
from dataclasses import dataclass

import numpy as np

from .errors import InputError
from .model import Fluid, Layer
from .run_cases import case_shape, require_pipe
from .sizing import Criterion, _in

__all__ = ["FreezeResult", "freeze_times", "FreezeHold", "TracedAlternative", "traced_alternatives",
           "PRACTICAL_FREEZE_THICKNESS_M", "FREEZE_MAINTAIN_TEMP_C"]

#: Thickness above which insulation alone is taken as an impractical freeze protection [m]:
#: common practice (pipe sections and covers beyond about 100 mm are rare, heavy and costly on
#: small lines; heat tracing is then the usual answer).
PRACTICAL_FREEZE_THICKNESS_M = 0.100
#: Maintain temperature of freeze-protection tracing [°C]: common practice (5 °C / 40 °F), from memory.
FREEZE_MAINTAIN_TEMP_C = 5.0


@dataclass
class FreezeResult:
    """Times [s] for still water to cool to 0 °C and to reach the ice fraction.

    ``inf`` where the water never gets there (the air, or what the pipe sees, is not
    below 0 °C: the heat flow at 0 °C is not positive).
    """

    time_to_zero_s: np.ndarray
    time_to_ice_fraction_s: np.ndarray
    heat_flow_at_zero_w_per_m: np.ndarray
    heat_capacity_j_mk_at_zero: np.ndarray
    ice_fraction: np.ndarray


def freeze_times(pipe, layers, surroundings, surface, start_temp_c, wall_material=None,
                 ice_fraction=0.0, points=40, fluid_name="water") -> FreezeResult:
    """Hours of hold: time for still water to reach 0 °C and then the ice fraction.

    The integral t_0 = ∫_0^{T_start} C'(T)/q'(T) dT (see the module docstring) is taken
    by Gauss–Legendre quadrature with *points* nodes in s = ln(T − T_low), where T_low is
    the lower of the air and radiant temperatures: dT = (T − T_low) ds turns the
    integrand into C'(T)(T − T_low)/q'(T), which is the constant C'R' for a linear
    network, so the quadrature stays accurate even when q'(0 °C) is small.  All nodes of
    all cases are solved in ONE call to :func:`pipeins.solve.solve` (a leading axis of
    temperatures).

    Parameters
    ----------
    pipe, layers, surroundings, surface
        As for :func:`pipeins.solve.solve` (a round pipe; arrays broadcast).
    start_temp_c : float or array_like
        Water temperature when the flow stops [°C], above 0.
    wall_material : WallMaterial, optional
        Pipe wall material for its heat capacity; default: ``lookup_wall_material(
        pipe.wall_material)`` (carbon steel for the default pipe).
    ice_fraction : float or array_like
        Fraction of the water frozen, 0 (first ice) to 1 (frozen solid).
    points : int
        Quadrature nodes (at least 2).
    fluid_name : str
        Must be water.

    Returns
    -------
    FreezeResult
        Times [s] of the broadcast case shape; ``inf`` where the water never freezes.

    Raises
    ------
    InputError
        ``--fluid`` not water; ``--fluid-temp`` not above 0 °C; ``--ice-fraction``
        outside 0 to 1.

    References
    ----------
    Lumped capacitance: Incropera, DeWitt et al., *Fundamentals of Heat and Mass
    Transfer*, 6th ed. (2007), §5.1–5.3 (Eq. 5.6, from memory); here with q'(T) from the full network.

    Examples
    --------
    >>> from pipeins.catalog.materials import lookup_material
    >>> from pipeins.model import Pipe, Layer, Surroundings, Surface
    >>> r = freeze_times(Pipe(0.0334, 0.00338), [Layer(lookup_material("k=0.04"), 0.025)],
    ...                  Surroundings(-15.0, wind_speed_m_s=3.0), Surface(), 10.0, ice_fraction=0.25)
    >>> round(float(r.time_to_zero_s) / 3600, 2), round(float(r.time_to_ice_fraction_s) / 3600, 2)
    (1.84, 5.1)
    """
    from .catalog.materials import lookup_wall_material
    from .props.liquids import LATENT_HEAT_FUSION_J_KG, fluid_properties, normalise_fluid
    from .solve import solve

    if normalise_fluid(fluid_name) != "water":
        raise InputError("--fluid", f'the freezing model is for water only; "{fluid_name}" is not water')
    require_pipe(pipe, surroundings)
    start = np.asarray(start_temp_c, dtype=float)
    if np.any(~np.isfinite(start) | (start <= 0)):
        raise InputError("--fluid-temp", "the water must start above 0 °C for a freezing time")
    fraction = np.asarray(ice_fraction, dtype=float)
    if np.any(~np.isfinite(fraction) | (fraction < 0) | (fraction > 1)):
        raise InputError("--ice-fraction", "the ice fraction must be from 0 (first ice) to 1 (frozen solid)")
    if int(points) < 2:
        raise InputError("--points", "the quadrature needs at least 2 points")
    wall = wall_material if wall_material is not None else lookup_wall_material(pipe.wall_material)

    shape = case_shape(pipe, layers, surroundings, surface, start, fraction)
    start = np.broadcast_to(start, shape)
    t_low = np.broadcast_to(np.minimum(np.asarray(surroundings.air_temp_c, float),
                                       np.asarray(surroundings.radiant_temp_c, float)), shape)
    freezes = t_low < 0
    low = np.where(freezes, t_low, -1.0)  # placeholder where the water never freezes
    s0, s1 = np.log(0.0 - low), np.log(start - low)
    x, w = np.polynomial.legendre.leggauss(int(points))
    x = x.reshape((-1,) + (1,) * len(shape))
    w = w.reshape(x.shape)
    s = 0.5 * (s0 + s1) + 0.5 * (s1 - s0) * x
    node_temps = low + np.exp(s)                                   # (points, *shape)
    temps = np.concatenate([np.zeros((1,) + shape), node_temps])   # 0 °C first
    q = solve(pipe, layers, Fluid(temps), surroundings, surface).heat_flow_w_per_m

    od = np.asarray(pipe.outer_diameter_m, dtype=float)
    di = np.asarray(pipe.inner_diameter_m, dtype=float)
    bore_m2 = math.pi * di ** 2 / 4
    wall_j_mk = wall.density_kg_m3 * wall.heat_capacity_j_kgk * math.pi * (od ** 2 - di ** 2) / 4
    props = fluid_properties("water", np.clip(temps, 0.0, None))
    capacity = props.density_kg_m3 * bore_m2 * props.heat_capacity_j_kgk + wall_j_mk

    q0, c0 = q[0], capacity[0]
    cools = freezes & (q0 > 0)
    with np.errstate(divide="ignore", invalid="ignore"):
        integrand = capacity[1:] * (node_temps - low) / np.where(cools, q[1:], 1.0)
        to_zero = 0.5 * (s1 - s0) * np.sum(w * integrand, axis=0)
        latent = props.density_kg_m3[0] * bore_m2 * fraction * LATENT_HEAT_FUSION_J_KG / np.where(cools, q0, 1.0)
    to_zero = np.where(cools, to_zero, np.inf)
    latent = np.broadcast_to(np.where(cools, latent, np.inf), shape)
    return FreezeResult(
        time_to_zero_s=to_zero,
        time_to_ice_fraction_s=to_zero + latent,
        heat_flow_at_zero_w_per_m=np.asarray(q0),
        heat_capacity_j_mk_at_zero=np.broadcast_to(c0, shape).copy(),
        ice_fraction=np.broadcast_to(fraction, shape).copy(),
    )


def _hours(seconds: float) -> str:
    return f"{seconds / 3600:.1f} h"


@dataclass
class FreezeHold(Criterion):
    """Still water holds at least ``hold_time_s`` [s] before reaching ``ice_fraction``
    (0 = before the first ice).

    The margin is (t − hold) / hold, relative, with t from :func:`freeze_times`
    (start temperature = the problem's fluid temperature; wall material from the pipe).
    """

    hold_time_s: float
    ice_fraction: float = 0.0
    key = "freeze"
    own_solve = True  # its margin solves the line itself (march / quadrature), not from the shared result
    label = "freeze protection (hold time)"

    def __post_init__(self):
        if not self.hold_time_s > 0:
            raise InputError("--hold-time", "the hold time must be greater than zero")
        if not 0 <= self.ice_fraction <= 1:
            raise InputError("--ice-fraction", "the ice fraction must be from 0 (first ice) to 1 (frozen solid)")

    def _what(self, units: str | None = None) -> str:
        from .units import format_quantity

        zero = format_quantity(0.0, "temperature", units or self.units, 0)
        return f"reaches {zero}" if self.ice_fraction == 0 else f"is {100 * self.ice_fraction:g} % ice"

    def margin(self, problem, result, thickness_m):
        t = np.asarray(thickness_m, dtype=float)
        t = np.broadcast_to(t, np.broadcast_shapes(t.shape, (problem.n_sizes, 1)))
        layers = list(problem.fixed_layers) + [Layer(problem.material, np.where(t <= 0, 1e-9, t))]
        times = freeze_times(problem.pipe, layers, problem.surroundings, problem.surface,
                             problem.fluid.temp_c, ice_fraction=self.ice_fraction,
                             fluid_name=problem.fluid.name or "water")
        return (times.time_to_ice_fraction_s - self.hold_time_s) / self.hold_time_s

    def describe(self, units="si"):
        return f"still water holds {_hours(self.hold_time_s)} before it {self._what(units)}"

    def state_text(self, margin):
        return f"holds {_hours(self.hold_time_s * (1 + margin))} before it {self._what()}"

    def miss(self, margin, thickness_m):
        reached = self.hold_time_s * (1 + margin)
        thick = _in(self.units, thickness_m, "thickness", f"{thickness_m * 1000:.0f} mm")
        return (f"freeze protection cannot be met: with {thick} still water "
                f"{self._what()} after {_hours(reached)}, {_hours(self.hold_time_s - reached)} short of "
                f"the {_hours(self.hold_time_s)} hold time")


@dataclass(frozen=True)
class TracedAlternative:
    """Heat tracing offered where the freeze hold needs an impractical thickness (SI).

    ``code`` names the note; ``required_m`` is the thickness the hold time needs (inf where no
    thickness holds it), above ``practical_limit_m``.  The design heat loss is that of
    :func:`pipeins.tracing.design_heat_loss` for the line insulated with ``thickness_m`` of
    ``material`` (the practical limit) held at ``maintain_temp_c`` against its own air.
    """

    size: str
    required_m: float
    practical_limit_m: float
    material: str
    thickness_m: float
    maintain_temp_c: float
    min_ambient_c: float
    safety_factor_percent: float
    design_heat_loss_w_per_m: float
    code: str = "freeze_traced_alternative"

    def to_dict(self) -> dict:
        out = dict(self.__dict__)
        out["required_m"] = None if not np.isfinite(self.required_m) else self.required_m
        return out


def traced_alternatives(selection, practical_limit_m: float = PRACTICAL_FREEZE_THICKNESS_M,
                        maintain_temp_c: float = FREEZE_MAINTAIN_TEMP_C) -> list[TracedAlternative]:
    """The traced alternative for every size of a :class:`pipeins.selection.Selection` whose
    freeze hold needs more than *practical_limit_m* [m] (empty without a freeze criterion)."""
    from dataclasses import replace

    from .tracing import DEFAULT_SAFETY_FACTOR_PERCENT, design_heat_loss

    freeze = next((c for c in selection.outcome.criteria if c.key == "freeze"), None)
    if freeze is None:
        return []
    spec, material = selection.spec, selection.material
    out = []
    for i, size in enumerate(selection.sizes):
        required = float(np.ravel(freeze.required_m)[i])
        if not required > practical_limit_m:
            continue
        if size.kind in ("steel", "copper", "metric"):
            where = dict(pipe=size.label, schedule=size.schedule if size.kind == "steel" else None,
                         outer_diameter_m=None, wall_m=None)
        else:
            where = dict(pipe=None, schedule=None, outer_diameter_m=size.outer_diameter_m, wall_m=size.wall_m)
        line = replace(spec, **where, layers=tuple(spec.layers) + ((material.key, practical_limit_m),),
                       length_m=None)
        air = float(np.max(line.air_temp_c))
        if not maintain_temp_c > air:
            continue
        design = design_heat_loss(line, maintain_temp_c, DEFAULT_SAFETY_FACTOR_PERCENT)
        out.append(TracedAlternative(size.label, required, practical_limit_m, material.name, practical_limit_m,
                                     maintain_temp_c, design.min_ambient_c, design.safety_factor_percent,
                                     design.design_heat_loss_w_per_m))
    return out
