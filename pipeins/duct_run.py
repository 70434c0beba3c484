"""Along a duct run: the air temperature change, the leaving-air temperature, and the limits.

Air flowing at mass flow ṁ [kg/s] along a duct loses q'(T) [W/m] at the local bulk air
temperature T (negative: a gain), so along the run (x from the entry)

    dT/dx = −q'(T) / (ṁ · c_p(T))

with c_p of dry air from the shipped air table (:func:`pipeins.props.air.air_properties`;
moisture would raise c_p by 1–2 % and shrink the change a little, so dry air is the safe
side).  :func:`temperature_along_duct` marches this exactly as :mod:`pipeins.runs` marches a
pipe run: classical RK4, every stage one vectorised call of the heat flow over all cases,
sub-steps no longer than half the relaxation length ṁ·c_p/(dq'/dT), the air held between
its entry temperature and the surroundings.  The heat flow per metre is a function the
caller gives (for a duct section: a solve of every patch at the local air temperature;
:func:`fixed_coefficient` for a fixed conductance UA' [W/(m·K)]).

For a fixed UA' and c_p the march reproduces the closed form
T(L) = T_a + (T_0 − T_a)·exp(−UA'·L/(ṁ·c_p)).

The criterion "at most ΔT over a length" is answered two ways, both exact for any q'(T)
by a quadrature in the temperature instead of a search along the run:
:func:`max_length_m` (how far the air goes before it changes by ΔT) and
:func:`required_coefficient_w_per_mk` (the largest conductance per metre that keeps the change
within ΔT over the length).

A flow too small for the length — the air comes within :data:`AMBIENT_FRACTION` (1 %) of
its entry difference to the surroundings before the end — is refused as bad input naming
the flow: the duct then delivers room-temperature air and the run is not a design.
"""

from __future__ import annotations

import math
from dataclasses import dataclass, field

import numpy as np

from .errors import InputError
from .march import MAX_STEPS, march, substeps

__all__ = ["DuctRunResult", "air_mass_flow_kg_s", "fixed_coefficient", "temperature_along_duct", "max_length_m",
           "required_coefficient_w_per_mk", "AMBIENT_FRACTION", "MAX_STEPS"]

#: A run whose leaving air keeps less than this fraction of its entry difference to the
#: surroundings has reached the surroundings: the flow is too small for the length.
AMBIENT_FRACTION = 0.01
# Gauss–Legendre nodes for the quadratures in ln|T − T_a| (smooth integrands: 16 nodes give
# machine precision for a constant conductance and about 1e-10 for k(T)-curved heat flows).
_GL_NODES, _GL_WEIGHTS = np.polynomial.legendre.leggauss(16)


@dataclass
class DuctRunResult:
    """The air along a duct run.

    Attributes
    ----------
    positions_m : numpy.ndarray
        Distance from the entry of each node [m], shape (segments + 1, *case shape).
    air_temps_c : numpy.ndarray
        Bulk air temperature at each node [°C], shape (segments + 1, *case shape).
    leaving_temp_c : numpy.ndarray
        Air temperature at the end of the run [°C], case shape.
    temp_change_k : numpy.ndarray
        Leaving − entering temperature [K] (negative when the air cools).
    heat_flow_w : numpy.ndarray
        Heat leaving the air over the run [W] (positive = loss), ∫q' dx.
    heat_flow_w_per_m : numpy.ndarray
        q' at each node [W/m], shape (segments + 1, *case shape).
    mass_flow_kg_s : numpy.ndarray
        Air mass flow [kg/s], case shape.
    steps : int
        Runge–Kutta steps taken.
    notes : list of str
    """

    positions_m: np.ndarray
    air_temps_c: np.ndarray
    leaving_temp_c: np.ndarray
    temp_change_k: np.ndarray
    heat_flow_w: np.ndarray
    heat_flow_w_per_m: np.ndarray
    mass_flow_kg_s: np.ndarray
    steps: int = 0
    notes: list[str] = field(default_factory=list)


def air_mass_flow_kg_s(flow, temp_c, pressure_pa=101_325.0):
    """Air mass flow [kg/s] from a volume or mass flow.

    Parameters
    ----------
    flow : float, array_like or pipeins.units.Flow
        A plain number is a volume flow [m³/s]; a :class:`~pipeins.units.Flow` read from text
        (``"2000 m3/h"``, ``"1200 cfm"``, ``"0.6 kg/s"``) says its own basis.
    temp_c : float or array_like
        Air temperature at which the volume flow is measured [°C] (the entering air).
    pressure_pa : float or array_like
        Absolute air pressure [Pa].

    Returns
    -------
    numpy.ndarray
        ṁ = ρ(T, p)·V̇ [kg/s], with ρ from the shipped air table (ideal gas in p).

    Raises
    ------
    InputError
        ``flow`` not greater than zero.

    Examples
    --------
    >>> from pipeins.units import parse_quantity
    >>> round(float(air_mass_flow_kg_s(parse_quantity("3600 m3/h", "flow"), 20.0)), 4)
    1.2046
    """
    from .props.air import air_properties

    basis = getattr(flow, "basis", "volume")
    value = np.asarray(getattr(flow, "value_si", flow), dtype=float)
    if not np.all(np.isfinite(value) & (value > 0)):
        raise InputError("flow", "the duct air flow must be greater than zero")
    if basis == "mass":
        return np.broadcast_to(value, np.broadcast_shapes(value.shape, np.shape(temp_c))).copy()
    return value * air_properties(temp_c, pressure_pa).density_kg_m3


def fixed_coefficient(conductance_w_per_mk, ambient_temp_c):
    """A heat flow q'(T) = UA'·(T − T_a) [W/m] for a fixed conductance per metre.

    Parameters
    ----------
    conductance_w_per_mk : float or array_like
        Overall conductance per metre of duct UA' [W/(m·K)], 0 or more.
    ambient_temp_c : float or array_like
        Surrounding temperature T_a [°C].

    Returns
    -------
    callable
        ``heat_flow_w_per_m(temp_c)`` for :func:`temperature_along_duct`.

    Examples
    --------
    >>> q = fixed_coefficient(2.0, 20.0)
    >>> float(q(30.0))
    20.0
    """
    ua = np.asarray(conductance_w_per_mk, dtype=float)
    if not np.all(np.isfinite(ua) & (ua >= 0)):
        raise InputError("conductance_w_per_mk", "the conductance per metre must be 0 or more W/(m·K)")
    ta = np.asarray(ambient_temp_c, dtype=float)
    return lambda temp_c: ua * (np.asarray(temp_c, dtype=float) - ta)


def _heat_capacity(heat_capacity_j_kgk, pressure_pa):
    if heat_capacity_j_kgk is not None:
        cp = np.asarray(heat_capacity_j_kgk, dtype=float)
        if not np.all(np.isfinite(cp) & (cp > 0)):
            raise InputError("heat_capacity_j_kgk", "the heat capacity must be greater than zero")
        return lambda temp_c: cp
    from .props.air import air_properties

    return lambda temp_c: air_properties(temp_c, pressure_pa).heat_capacity_j_kgk


def _checked(name, value, what, allow_zero=False):
    value = np.asarray(value, dtype=float)
    ok = np.isfinite(value) & ((value >= 0) if allow_zero else (value > 0))
    if not np.all(ok):
        raise InputError(name, what)
    return value


def temperature_along_duct(heat_flow_w_per_m, entering_temp_c, mass_flow_kg_s, length_m, ambient_temp_c, *,
                           radiant_temp_c=None, heat_capacity_j_kgk=None, pressure_pa=101_325.0, segments=20,
                           ambient_fraction=AMBIENT_FRACTION) -> DuctRunResult:
    """Air temperature and heat flow along a duct run.

    Integrates dT/dx = −q'(T)/(ṁ·c_p(T)) from the entry with the classical RK4 method
    (Kutta 1901; Press et al., *Numerical Recipes*, 3rd ed., §17.1, from memory), as
    :func:`pipeins.runs.temperature_along_run` does for a pipe.

    Parameters
    ----------
    heat_flow_w_per_m : callable
        ``q(temp_c) -> W/m``, the heat flow out of the air per metre of duct at the local bulk
        air temperature [°C], vectorised over the case shape (e.g. a solve of the duct
        section, or :func:`fixed_coefficient`).
    entering_temp_c : float or array_like
        Air temperature entering the run [°C].
    mass_flow_kg_s : float or array_like
        Air mass flow [kg/s] (:func:`air_mass_flow_kg_s`), greater than 0.
    length_m : float or array_like
        Length of the run [m], greater than 0.
    ambient_temp_c : float or array_like
        Temperature of the air round the duct [°C], which the duct air tends to.
    radiant_temp_c : float or array_like, optional
        Mean radiant temperature round the duct [°C] where it differs from the air's (only
        widens the band the air is held in).
    heat_capacity_j_kgk : float or array_like, optional
        A fixed c_p [J/(kg·K)]; None = dry air from the shipped table at the local temperature.
    pressure_pa : float or array_like
        Absolute air pressure [Pa] (for the table's c_p).
    segments : int
        Equal segments reported (nodes = segments + 1).
    ambient_fraction : float
        The run is refused when the leaving air keeps less than this fraction of its entry
        difference to the surroundings (default :data:`AMBIENT_FRACTION` = 1 %); 0 to never refuse.

    Returns
    -------
    DuctRunResult

    Raises
    ------
    InputError
        ``flow`` not greater than zero, or too small for the length (the air reaches the
        surroundings); ``length_m`` not greater than zero; ``segments`` below 1.

    Examples
    --------
    Supply air at 14 °C, 0.6 kg/s, through 40 m of duct in a 30 °C roof space with a
    conductance of 0.8 W/(m·K):

    >>> run = temperature_along_duct(fixed_coefficient(0.8, 30.0), 14.0, 0.6, 40.0, 30.0,
    ...                              heat_capacity_j_kgk=1006.0)
    >>> round(float(run.leaving_temp_c), 3), round(float(run.heat_flow_w))
    (14.826, -499)
    """
    mdot = _checked("flow", mass_flow_kg_s, "the duct air flow must be greater than zero")
    length = _checked("length_m", length_m, "the run length must be greater than zero")
    segments = int(segments)
    if segments < 1:
        raise InputError("segments", "the run needs at least one segment")
    t_in = np.asarray(entering_temp_c, dtype=float)
    ambient = np.asarray(ambient_temp_c, dtype=float)
    radiant = ambient if radiant_temp_c is None else np.asarray(radiant_temp_c, dtype=float)
    cp_of = _heat_capacity(heat_capacity_j_kgk, pressure_pa)
    probe0 = np.asarray(heat_flow_w_per_m(t_in), dtype=float)
    shape = np.broadcast_shapes(t_in.shape, mdot.shape, length.shape, ambient.shape, radiant.shape, probe0.shape)
    t_in = np.broadcast_to(t_in, shape).astype(float)
    mdot, length = np.broadcast_to(mdot, shape), np.broadcast_to(length, shape)
    floor = np.minimum(t_in, np.minimum(ambient, radiant))
    ceiling = np.maximum(t_in, np.maximum(ambient, radiant))

    def heat_flow(temp_c):
        return np.broadcast_to(np.asarray(heat_flow_w_per_m(temp_c), dtype=float), shape)

    def slope(temp_c):
        q = heat_flow(temp_c)
        return -q / (mdot * cp_of(temp_c)), q

    conductance = np.abs(heat_flow(t_in + 1.0) - np.broadcast_to(probe0, shape))
    relax = float(np.max(conductance * length / (mdot * cp_of(t_in))))  # run length in relaxation lengths
    sub = substeps(relax, segments)
    temps, flows, temp, total = march(slope, t_in, length, segments, sub, floor, ceiling, shape)
    flows.append(heat_flow(temp))
    _refuse_if_ambient(t_in, temp, ambient, mdot, length, float(ambient_fraction))
    fractions = np.linspace(0.0, 1.0, segments + 1).reshape((-1,) + (1,) * len(shape))
    return DuctRunResult(
        positions_m=fractions * length,
        air_temps_c=np.stack(temps),
        leaving_temp_c=temp,
        temp_change_k=temp - t_in,
        heat_flow_w=total,
        heat_flow_w_per_m=np.stack(flows),
        mass_flow_kg_s=np.array(mdot),
        steps=segments * sub,
    )


def _refuse_if_ambient(t_in, t_out, ambient, mdot, length, fraction):
    if fraction <= 0:
        return
    difference = np.broadcast_to(t_in - ambient, t_in.shape)
    moving = np.abs(difference) > 1e-9
    kept = np.where(moving, (t_out - ambient) / np.where(moving, difference, 1.0), 1.0)
    bad = kept < fraction
    if not np.any(bad):
        return
    i = np.flatnonzero(bad.ravel())[0]
    kept_i = max(float(kept.ravel()[i]), 1e-300)
    run_m = float(np.broadcast_to(length, t_in.shape).ravel()[i])
    reached_m = run_m * math.log(1.0 / fraction) / math.log(1.0 / kept_i) if kept_i < 1 else run_m
    flow = float(np.broadcast_to(mdot, t_in.shape).ravel()[i])
    where = f" (in {int(np.count_nonzero(bad))} of {bad.size} cases)" if bad.size > 1 else ""
    raise InputError("flow", f"an air flow of {flow:.4g} kg/s is too small for {run_m:.4g} m of duct{where}: the air "
                             f"comes within {fraction * 100:g} % of the surrounding temperature after about "
                             f"{reached_m:.3g} m; give a larger flow, a shorter run or more insulation")


def _log_nodes(entering, ending, ambient):
    """u-nodes and weights of ∫ over ln|T − T_a| from the ending to the entering temperature:
    T at the nodes (shape (nodes, *case)) and du·w."""
    d_in = np.abs(entering - ambient)
    d_end = np.abs(ending - ambient)
    u_in, u_end = np.log(d_in), np.log(d_end)
    half = 0.5 * (u_in - u_end)
    mid = 0.5 * (u_in + u_end)
    extra = (1,) * np.ndim(half)
    u = mid + half * _GL_NODES.reshape((-1,) + extra)
    sign = np.sign(entering - ambient)
    temps = ambient + sign * np.exp(u)
    return temps, half * _GL_WEIGHTS.reshape((-1,) + extra)


def _target(entering, max_change, ambient):
    """Ending temperature after a change of *max_change* towards the surroundings, and where
    the change can never be reached (the surroundings are nearer than that)."""
    span = np.abs(entering - ambient)
    never = max_change >= span
    ending = entering - np.sign(entering - ambient) * np.where(never, 0.5 * span, max_change)
    return ending, never


def max_length_m(heat_flow_w_per_m, entering_temp_c, mass_flow_kg_s, max_change_k, ambient_temp_c, *,
                 heat_capacity_j_kgk=None, pressure_pa=101_325.0):
    """Longest run [m] over which the air changes by at most *max_change_k*.

    L = ∫ ṁ·c_p(T)/q'(T) dT from the entering temperature to the one *max_change_k* nearer the
    surroundings, integrated in u = ln|T − T_a| (where the integrand ṁ·c_p·(T − T_a)/q' is
    smooth) by 16-point Gauss–Legendre: exact for a constant conductance, and the same
    answer as the march for any q'(T) (checked in the tests).

    Parameters
    ----------
    heat_flow_w_per_m : callable
        ``q(temp_c) -> W/m`` as for :func:`temperature_along_duct`; called once with the
        temperatures of every node, shape (16, *case shape).
    entering_temp_c : float or array_like
        Air temperature entering the run [°C].
    mass_flow_kg_s : float or array_like
        Air mass flow [kg/s], greater than 0.
    max_change_k : float or array_like
        Largest change of the air temperature allowed [K], greater than 0.
    ambient_temp_c : float or array_like
        Surrounding temperature, where q' = 0 [°C].
    heat_capacity_j_kgk : float or array_like, optional
        A fixed c_p [J/(kg·K)]; None = dry air from the shipped table.
    pressure_pa : float or array_like
        Absolute air pressure [Pa].

    Returns
    -------
    numpy.ndarray
        Length [m]; inf where the change can never reach *max_change_k* (the surroundings are
        nearer than that, or the heat flow does not draw the air towards them).

    Examples
    --------
    >>> L = max_length_m(fixed_coefficient(0.8, 30.0), 14.0, 0.6, 1.0, 30.0, heat_capacity_j_kgk=1006.0)
    >>> round(float(L), 2)
    48.69
    """
    mdot = _checked("flow", mass_flow_kg_s, "the duct air flow must be greater than zero")
    change = _checked("max_change_k", max_change_k, "the largest temperature change must be greater than zero")
    entering = np.asarray(entering_temp_c, dtype=float)
    ambient = np.asarray(ambient_temp_c, dtype=float)
    shape = np.broadcast_shapes(entering.shape, mdot.shape, change.shape, ambient.shape)
    entering, mdot, change, ambient = (np.broadcast_to(a, shape) for a in (entering, mdot, change, ambient))
    ending, never = _target(entering, change, ambient)
    never = never | (np.abs(entering - ambient) <= 1e-12)
    safe_entering = np.where(never, ambient + 1.0, entering)
    safe_ending = np.where(never, ambient + 0.5, ending)
    temps, weights = _log_nodes(safe_entering, safe_ending, ambient)
    q = np.asarray(heat_flow_w_per_m(temps), dtype=float)
    cp = np.broadcast_to(_heat_capacity(heat_capacity_j_kgk, pressure_pa)(temps), temps.shape)
    with np.errstate(divide="ignore", invalid="ignore"):
        integrand = mdot * cp * (temps - ambient) / q
    drawn = np.all(np.isfinite(integrand) & (integrand > 0), axis=0)
    length = np.sum(weights * np.where(np.isfinite(integrand), integrand, 0.0), axis=0)
    return np.where(never | ~drawn, np.inf, length)


def required_coefficient_w_per_mk(entering_temp_c, mass_flow_kg_s, length_m, max_change_k, ambient_temp_c, *,
                                  heat_capacity_j_kgk=None, pressure_pa=101_325.0):
    """Largest conductance per metre UA' [W/(m·K)] that keeps the air change within *max_change_k*.

    For a conductance uniform along the run, UA'·L = ṁ ∫ c_p(T) d(ln|T − T_a|) from the
    ending to the entering temperature; with a constant c_p this is the closed form
    UA' = ṁ·c_p/L · ln[(T_0 − T_a)/(T_end − T_a)].  The sizing search can then look for the
    least insulation whose section conductance q'/(T − T_a) is at most this value.

    Parameters
    ----------
    entering_temp_c : float or array_like
        Air temperature entering the run [°C].
    mass_flow_kg_s : float or array_like
        Air mass flow [kg/s], greater than 0.
    length_m : float or array_like
        Run length [m], greater than 0.
    max_change_k : float or array_like
        Largest change of the air temperature allowed [K], greater than 0.
    ambient_temp_c : float or array_like
        Surrounding temperature [°C].
    heat_capacity_j_kgk : float or array_like, optional
        A fixed c_p [J/(kg·K)]; None = dry air from the shipped table.
    pressure_pa : float or array_like
        Absolute air pressure [Pa].

    Returns
    -------
    numpy.ndarray
        UA' [W/(m·K)]; inf where the change cannot reach *max_change_k* at any conductance.

    Examples
    --------
    >>> round(float(required_coefficient_w_per_mk(14.0, 0.6, 40.0, 1.0, 30.0, heat_capacity_j_kgk=1006.0)), 4)
    0.9739
    """
    mdot = _checked("flow", mass_flow_kg_s, "the duct air flow must be greater than zero")
    length = _checked("length_m", length_m, "the run length must be greater than zero")
    change = _checked("max_change_k", max_change_k, "the largest temperature change must be greater than zero")
    entering = np.asarray(entering_temp_c, dtype=float)
    ambient = np.asarray(ambient_temp_c, dtype=float)
    shape = np.broadcast_shapes(entering.shape, mdot.shape, length.shape, change.shape, ambient.shape)
    entering, mdot, length, change, ambient = (np.broadcast_to(a, shape)
                                               for a in (entering, mdot, length, change, ambient))
    ending, never = _target(entering, change, ambient)
    never = never | (np.abs(entering - ambient) <= 1e-12)
    temps, weights = _log_nodes(np.where(never, ambient + 1.0, entering), np.where(never, ambient + 0.5, ending),
                                ambient)
    cp = np.broadcast_to(_heat_capacity(heat_capacity_j_kgk, pressure_pa)(temps), temps.shape)
    ua = mdot / length * np.sum(weights * cp, axis=0)
    return np.where(never, np.inf, ua)
