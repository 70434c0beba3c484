"""Along a run: fluid temperature change, total heat flow and steam condensate.

A liquid flowing at mass flow ṁ [kg/s] through a pipe loses q'(T) [W/m] at the local
bulk temperature T, so along the run (x from the inlet)

    dT/dx = −q'(T) / (ṁ · c_p(T))

The heat flow q'(T) comes from a full :func:`pipeins.solve.solve` at the local fluid
temperature (all cases at once) and c_p from :func:`pipeins.props.liquids.fluid_properties`.
:func:`temperature_along_run` integrates this with the classical fourth-order
Runge–Kutta method; heat conducted along the pipe axis is neglected against the heat
carried by the flow.

Condensing steam stays at its saturation temperature; :func:`condensate_kg_per_h` turns
the heat flow into the running load of condensate.
"""

from __future__ import annotations

from dataclasses import dataclass, field

import numpy as np

from .errors import InputError
from .march import MAX_STEPS, march, substeps
from .model import Fluid, Layer, Surface
from .notes import Note, note
from .run_cases import case_shape, require_pipe
from .sizing import Criterion

__all__ = ["RunResult", "temperature_along_run", "mass_flow_kg_s", "condensate_kg_per_h",
           "TempChange", "MAX_STEPS"]


@dataclass
class RunResult:
    """The fluid along a run.

    Attributes
    ----------
    positions_m : numpy.ndarray
        Distance from the inlet of each node [m], shape (segments + 1,) (with an array
        ``length_m``: (segments + 1, *length shape)).
    fluid_temps_c : numpy.ndarray
        Bulk fluid temperature at each node [°C], shape (segments + 1, *case shape).
    outlet_temp_c : numpy.ndarray
        Fluid temperature at the outlet [°C], case shape.
    heat_flow_w : numpy.ndarray
        Heat leaving the fluid over the whole run [W] (positive = loss), the integral of
        q' along the run.
    heat_flow_w_per_m : numpy.ndarray
        q' at each node [W/m], shape (segments + 1, *case shape).
    mass_flow_kg_s : numpy.ndarray
        Mass flow [kg/s], case shape.
    steps : int
        Runge–Kutta steps taken (at least one per segment).
    notes : list of Note
        E.g. ``run.freezes``: the fluid reaching its freezing point along the run
        (:mod:`pipeins.notes`; :mod:`pipeins.reports.notes` writes the sentence).
    """

    positions_m: np.ndarray
    fluid_temps_c: np.ndarray
    outlet_temp_c: np.ndarray
    heat_flow_w: np.ndarray
    heat_flow_w_per_m: np.ndarray
    mass_flow_kg_s: np.ndarray
    steps: int = 0
    notes: list[Note] = field(default_factory=list)


def mass_flow_kg_s(flow, fluid_name: str, temp_c):
    """Mass flow [kg/s] of a :class:`pipeins.units.Flow` (or a number in kg/s).

    A volume flow V̇ [m³/s] becomes ṁ = ρ(T)·V̇ with the density of *fluid_name* at
    *temp_c* [°C] (:func:`pipeins.props.liquids.fluid_properties`).

    Raises
    ------
    InputError
        ``--flow`` when the flow is not greater than zero.

    Examples
    --------
    >>> from pipeins.units import Flow
    >>> round(float(mass_flow_kg_s(Flow(0.001, "volume"), "water", 80.0)), 5)
    0.97177
    """
    basis = getattr(flow, "basis", "mass")
    value = np.asarray(getattr(flow, "value_si", flow), dtype=float)
    if np.any(~np.isfinite(value) | (value <= 0)):
        raise InputError("--flow", "flow must be greater than zero")
    if basis == "mass":
        return np.broadcast_to(value, np.broadcast_shapes(value.shape, np.shape(temp_c))).copy()
    from .props.liquids import fluid_properties

    return value * fluid_properties(fluid_name, temp_c).density_kg_m3


def condensate_kg_per_h(heat_flow_w, steam_pressure_pa):
    """Running load of condensate [kg/h] from the heat lost by saturated steam.

    ṁ_c = Q / h_fg(p) · 3600, with h_fg the latent heat of vaporisation at the absolute
    pressure (:func:`pipeins.props.steam.latent_heat_j_kg`).  This is the running load
    of a line at its working temperature (the start-up load of warming the metal is
    not included).  A heat flow per metre [W/m] gives kg/(h·m); a total heat flow [W]
    gives kg/h.  A negative heat flow (heat gained) gives a negative value: nothing
    condenses.

    Examples
    --------
    >>> round(float(condensate_kg_per_h(100.0, 1.0e6)), 4)
    0.1787
    """
    from .props.steam import latent_heat_j_kg

    return np.asarray(heat_flow_w, dtype=float) / latent_heat_j_kg(steam_pressure_pa) * 3600.0


def temperature_along_run(pipe, layers, fluid_name, inlet_temp_c, mass_flow_kg_s, length_m,
                          surroundings, surface=Surface(), inner_h_w_m2k=None, segments=20) -> RunResult:
    """Fluid temperature and heat flow along a run of insulated pipe.

    Integrates dT/dx = −q'(T) / (ṁ·c_p(T)) from the inlet with the classical RK4 method
    (Kutta 1901; e.g. Press et al., *Numerical Recipes*, 3rd ed., §17.1, Eq. 17.1.3, from memory):
    each stage is one vectorised :func:`pipeins.solve.solve` of every case at its local
    fluid temperature.  Each of the *segments* is split into equal sub-steps no longer
    than half the relaxation length ṁ·c_p/(dq'/dT) (dq'/dT estimated at the inlet), so
    the march stays accurate and stable on long runs with a small flow; the fluid
    temperature is kept between its inlet value and the air/radiant temperatures it
    tends to.  The total heat flow is ∫q' dx with the same RK4 stage weights (Simpson's
    rule on every step), independent of c_p, so ṁ·∫c_p dT = ∫q' dx is an energy check.

    Parameters
    ----------
    pipe, layers, surroundings, surface
        As for :func:`pipeins.solve.solve` (a round pipe).
    fluid_name : str
        A liquid :func:`pipeins.props.liquids.normalise_fluid` knows (for c_p).
    inlet_temp_c : float or array_like
        Fluid temperature at the inlet [°C].
    mass_flow_kg_s : float or array_like
        Mass flow [kg/s], greater than zero.
    length_m : float or array_like
        Length of the run [m], greater than zero.
    inner_h_w_m2k : float or array_like, optional
        Inner film coefficient [W/(m²·K)]; None = bore at the fluid temperature.
    segments : int
        Number of equal segments reported (nodes = segments + 1).

    Returns
    -------
    RunResult
        Arrays broadcast over every input.  ``notes`` says (``run.freezes``) when the fluid cools to its
        freezing point (the march then holds the properties at the freezing point; the
        result is not valid beyond that).

    Raises
    ------
    InputError
        ``--flow`` or ``--length`` not greater than zero; ``--segments`` below 1.

    Examples
    --------
    >>> from pipeins.catalog.materials import lookup_material
    >>> from pipeins.model import Pipe, Layer, Surroundings, Surface
    >>> run = temperature_along_run(Pipe(0.0603, 0.0039), [Layer(lookup_material("k=0.04"), 0.04)],
    ...                             "water", 60.0, 0.5, 200.0, Surroundings(10.0), Surface(),
    ...                             segments=10)
    >>> round(float(run.outlet_temp_c), 2), round(float(run.heat_flow_w))
    (58.71, 2697)
    """
    from .props.liquids import fluid_properties, fluid_temp_range_c
    from .solve import solve

    require_pipe(pipe, surroundings)
    mdot = np.asarray(mass_flow_kg_s, dtype=float)
    if np.any(~np.isfinite(mdot) | (mdot <= 0)):
        raise InputError("--flow", "flow must be greater than zero")
    length = np.asarray(length_m, dtype=float)
    if np.any(~np.isfinite(length) | (length <= 0)):
        raise InputError("--length", "run length must be greater than zero")
    segments = int(segments)
    if segments < 1:
        raise InputError("--segments", "the run needs at least one segment")
    t_in = np.asarray(inlet_temp_c, dtype=float)
    shape = case_shape(pipe, layers, surroundings, surface, t_in, mdot, length, inner_h_w_m2k)
    t_in = np.broadcast_to(t_in, shape).astype(float)
    mdot, length = np.broadcast_to(mdot, shape), np.broadcast_to(length, shape)

    low_c, high_c = fluid_temp_range_c(fluid_name)
    air, rad = np.asarray(surroundings.air_temp_c, float), np.asarray(surroundings.radiant_temp_c, float)
    floor = np.minimum(t_in, np.minimum(air, rad))
    ceiling = np.maximum(t_in, np.maximum(air, rad))

    def heat_flow(temp_c):
        return solve(pipe, layers, Fluid(temp_c, inner_h_w_m2k), surroundings, surface).heat_flow_w_per_m

    def slope(temp_c):
        q = heat_flow(temp_c)
        cp = fluid_properties(fluid_name, np.clip(temp_c, low_c, high_c)).heat_capacity_j_kgk
        return -q / (mdot * cp), q

    # Sub-steps: the relaxation length ṁ c_p / G with the conductance G = dq'/dT at the inlet.
    probe = heat_flow(np.stack([t_in, t_in + 1.0]))
    conductance = np.abs(probe[1] - probe[0])
    cp_in = fluid_properties(fluid_name, np.clip(t_in, low_c, high_c)).heat_capacity_j_kgk
    relax = float(np.max(conductance * length / (mdot * cp_in)))  # run length in relaxation lengths
    sub = substeps(relax, segments)
    temps, flows, temp, total = march(slope, t_in, length, segments, sub, floor, ceiling, shape)
    flows.append(heat_flow(temp))
    fluid_temps = np.stack(temps)
    notes = []
    if np.any(fluid_temps < low_c):
        notes.append(note("run.freezes", freeze_c=(low_c, "temperature")))
    fractions = np.linspace(0.0, 1.0, segments + 1).reshape((-1,) + (1,) * np.ndim(length_m))
    return RunResult(
        positions_m=fractions * np.asarray(length_m, dtype=float),
        fluid_temps_c=fluid_temps,
        outlet_temp_c=temp,
        heat_flow_w=total,
        heat_flow_w_per_m=np.stack(flows),
        mass_flow_kg_s=np.array(mdot),
        steps=segments * sub,
        notes=notes,
    )


@dataclass
class TempChange(Criterion):
    """Fluid temperature change along the run at most ``max_change_k`` [K].

    ``flow`` is a mass flow [kg/s] or a :class:`pipeins.units.Flow` (a volume flow is
    converted with the density at the inlet temperature); ``length_m`` is the run [m].
    The margin is ``max_change_k − |T_in − T_out|`` [K] from
    :func:`temperature_along_run` with the problem's fluid temperature as inlet and its
    film coefficient as inner film.
    """

    max_change_k: float
    fluid_name: str
    flow: object
    length_m: float
    segments: int = 4  # RK4: four segments hold the outlet to ~1e-4 K on a sizing run
    key = "temp_change"
    own_solve = True  # its margin solves the line itself (march / quadrature), not from the shared result
    label = "temperature change along the run"

    def __post_init__(self):
        if not self.max_change_k > 0:
            raise InputError("--max-temp-change", "the temperature change limit must be greater than zero")
        if not self.length_m > 0:
            raise InputError("--length", "run length must be greater than zero")

    def margin(self, problem, result, thickness_m):
        t = np.asarray(thickness_m, dtype=float)
        t = np.broadcast_to(t, np.broadcast_shapes(t.shape, (problem.n_sizes, 1)))
        layers = list(problem.fixed_layers) + [Layer(problem.material, np.where(t <= 0, 1e-9, t))]
        inlet = problem.fluid.temp_c
        mdot = mass_flow_kg_s(self.flow, self.fluid_name, inlet)
        run = temperature_along_run(problem.pipe, layers, self.fluid_name, inlet, mdot, self.length_m,
                                    problem.surroundings, problem.surface_for(layers),
                                    problem.fluid.film_coefficient_w_m2k, self.segments)
        return self.max_change_k - np.abs(np.asarray(inlet, dtype=float) - run.outlet_temp_c)

    def describe(self, units="si"):
        from .units import format_quantity as fq

        return (f"fluid changes by at most {fq(self.max_change_k, 'temperature_difference', units)} "
                f"over {fq(self.length_m, 'length', units)}")

    def state_text(self, margin):
        from .sizing import _in

        u, change, dk = self.units, self.max_change_k - margin, "temperature_difference"
        return (f"changes by {_in(u, change, dk, f'{change:.2f} K')} over "
                f"{_in(u, self.length_m, 'length', f'{self.length_m:g} m')} "
                f"(limit {_in(u, self.max_change_k, dk, f'{self.max_change_k:g} K')})")

    def miss(self, margin, thickness_m):
        from .sizing import _in

        u, change, dk = self.units, self.max_change_k - margin, "temperature_difference"
        return (f"temperature change cannot be met: with "
                f"{_in(u, thickness_m, 'thickness', f'{thickness_m * 1000:.0f} mm')} the fluid still "
                f"changes by {_in(u, change, dk, f'{change:.1f} K')} over "
                f"{_in(u, self.length_m, 'length', f'{self.length_m:g} m')}, "
                f"{_in(u, -margin, dk, f'{-margin:.1f} K')} more than the "
                f"{_in(u, self.max_change_k, dk, f'{self.max_change_k:g} K')} limit")
