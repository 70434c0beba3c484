"""Cool-down and warm-up of a vessel's stored contents, and its hold time before freezing.

Model (lumped capacitance, quasi-steady): the contents, of heat capacity C = m·c_p [J/K],
share one temperature T and exchange heat with the surroundings at T_a through the
insulated vessel, whose steady heat flow is Q(T) = UA(T)·(T − T_a) [W] (UA from solved
heat flows, :func:`ua_table_from_heat_flow`):

    C · dT/dt = −UA(T) · (T − T_a)

For a fixed UA the closed form is T(t) = T_a + (T₀ − T_a)·exp(−UA·t/C), and the time to a
temperature T is t = (C/UA)·ln((T₀ − T_a)/(T − T_a)) (Incropera, DeWitt et al.,
*Fundamentals of Heat and Mass Transfer*, 6th ed. (2007), Eq. 5.6, from memory).  For a UA
that varies with T, :func:`time_to_temperature_s` integrates t = ∫ C/UA(T) ds with
s = ln|T − T_a| by Gauss–Legendre quadrature (exact for a fixed UA), and
:func:`march_temperature_c` marches the equation in time (classical Runge–Kutta).

The contents hold their mass (a closed vessel), C is taken at the mean of the start and end
temperatures, and the heat stored in the wall and the insulation is left out unless given
(``wall_capacity_j_k``): shorter times, on the safe side for a hold.

**Freezing** (water only) follows :mod:`pipeins.freezing`: sensible cooling to 0 °C, then
a fraction f of the water freezes at 0 °C in a further m·f·L_f / Q(0 °C), with L_f
:data:`pipeins.props.liquids.LATENT_HEAT_FUSION_J_KG`; the ice layer's resistance is
neglected (conservative).  Water properties come from the shipped table
(:func:`pipeins.props.liquids.fluid_properties`).
"""

from __future__ import annotations

import math
from typing import Any, Callable

import numpy as np

from .errors import InputError

__all__ = ["contents_mass_kg", "contents_heat_capacity_j_k", "ua_table_from_heat_flow",
           "temperature_after_c", "time_to_temperature_s", "march_temperature_c", "freeze_hold_s",
           "QUADRATURE_POINTS"]

#: Gauss–Legendre nodes of the time-to-temperature integral (a UA smooth in T needs few).
QUADRATURE_POINTS = 24


def contents_mass_kg(volume_m3, fluid: str = "water", temp_c=20.0):
    """Mass of the contents [kg]: volume [m³] × density at *temp_c* [°C] (shipped tables).

    Examples
    --------
    >>> round(float(contents_mass_kg(10.0, "water", 20.0)))
    9982
    """
    from .props.liquids import fluid_properties

    v = np.asarray(volume_m3, dtype=float)
    if np.any(~np.isfinite(v) | (v <= 0)):
        raise InputError("volume_m3", "the contents volume must be greater than 0 m³")
    return v * fluid_properties(fluid, temp_c).density_kg_m3


def contents_heat_capacity_j_k(mass_kg, fluid: str, temp_a_c, temp_b_c, points: int = 5):
    """m·c̄_p [J/K]: the mass times the mean heat capacity between two temperatures [°C]
    (the mean of *points* Gauss–Legendre nodes of the shipped table).

    Examples
    --------
    >>> round(float(contents_heat_capacity_j_k(1000.0, "water", 10.0, 60.0)) / 1e6, 3)
    4.183
    """
    from .props.liquids import fluid_properties

    m = np.asarray(mass_kg, dtype=float)
    if np.any(~np.isfinite(m) | (m <= 0)):
        raise InputError("mass_kg", "the contents mass must be greater than 0 kg")
    a, b = np.asarray(temp_a_c, dtype=float), np.asarray(temp_b_c, dtype=float)
    x, w = np.polynomial.legendre.leggauss(points)
    x = x.reshape((-1,) + (1,) * np.broadcast(a, b).ndim)
    w = w.reshape(x.shape)
    temps = 0.5 * (a + b) + 0.5 * (b - a) * x
    cp = fluid_properties(fluid, temps).heat_capacity_j_kgk
    return m * 0.5 * np.sum(w * cp, axis=0)


def ua_table_from_heat_flow(temps_c, heat_flow_w, ambient_temp_c):
    """(temperatures, UA) [°C, W/K] from solved heat flows Q(T) [W]: UA = Q/(T − T_a).

    Temperatures at the ambient (where UA is 0/0) are dropped.  Pass the pair as
    ``ua_w_k`` to the functions below.
    """
    t = np.asarray(temps_c, dtype=float).ravel()
    q = np.asarray(heat_flow_w, dtype=float).ravel()
    keep = np.abs(t - ambient_temp_c) > 1e-9
    order = np.argsort(t[keep])
    return t[keep][order], (q[keep] / (t[keep] - ambient_temp_c))[order]


def _ua_function(ua_w_k) -> Callable[[Any], Any]:
    """UA(T) [W/K] from a number, a callable of T [°C], or a (temperatures, UA) table."""
    if callable(ua_w_k):
        def checked(t):
            u = np.asarray(ua_w_k(t), dtype=float)
            if np.any(~np.isfinite(u) | (u <= 0)):
                raise InputError("ua_w_k", "UA must be greater than 0 W/K at every contents temperature")
            return u
        return checked
    if isinstance(ua_w_k, tuple) and len(ua_w_k) == 2:
        temps, values = (np.asarray(x, dtype=float).ravel() for x in ua_w_k)
        if temps.size < 2 or temps.size != values.size or np.any(np.diff(temps) <= 0):
            raise InputError("ua_w_k", "a UA table needs two or more rising temperatures, one UA each")
        if np.any(~np.isfinite(values) | (values <= 0)):
            raise InputError("ua_w_k", "UA must be greater than 0 W/K at every contents temperature")
        return lambda t: np.interp(t, temps, values)   # held at the end values outside
    u = np.asarray(ua_w_k, dtype=float)
    if np.any(~np.isfinite(u) | (u <= 0)):
        raise InputError("ua_w_k", "UA must be greater than 0 W/K")
    return lambda t: u + 0.0 * np.asarray(t, dtype=float)


def _capacity(capacity_j_k):
    c = np.asarray(capacity_j_k, dtype=float)
    if np.any(~np.isfinite(c) | (c <= 0)):
        raise InputError("capacity_j_k", "the heat capacity of the contents must be greater than 0 J/K")
    return c


def temperature_after_c(time_s, capacity_j_k, ua_w_k, start_temp_c, ambient_temp_c):
    """Contents temperature [°C] after *time_s* [s] for a fixed UA [W/K] (closed form).

    Examples
    --------
    >>> round(float(temperature_after_c(3600.0, 4.18e6, 100.0, 80.0, 20.0)), 3)
    75.049
    """
    c = _capacity(capacity_j_k)
    ua = np.asarray(ua_w_k, dtype=float)
    if np.any(~np.isfinite(ua) | (ua <= 0)):
        raise InputError("ua_w_k", "UA must be greater than 0 W/K")
    return ambient_temp_c + (np.asarray(start_temp_c, float) - ambient_temp_c) * np.exp(
        -ua * np.asarray(time_s, float) / c)


def _check_target(start, target, ambient, name):
    """The target must lie between the start and the ambient (the ambient is never reached)."""
    gap0, gap = np.broadcast_arrays(start - ambient, target - ambient)
    if np.any(gap0 == 0):
        raise InputError("--fluid-temp", "the contents start at the ambient temperature: they do not change")
    never = (gap * gap0 <= 0) | (np.abs(gap) > np.abs(gap0))
    if np.any(never):
        bad = float(np.broadcast_to(target, never.shape)[never].ravel()[0])
        way = "cool" if np.all(gap0 > 0) else "warm"
        raise InputError(name, f"the contents never reach {bad:g} °C: they {way} from {float(np.max(start)):g} °C "
                               f"towards the ambient {float(np.max(ambient)):g} °C and reach it only after "
                               "infinite time; give a temperature between the two")


def time_to_temperature_s(capacity_j_k, ua_w_k, start_temp_c, target_temp_c, ambient_temp_c,
                          points: int = QUADRATURE_POINTS):
    """Time [s] for the contents to cool (or warm) from the start to the target temperature.

    Parameters
    ----------
    capacity_j_k : array_like
        Heat capacity of the contents m·c_p [J/K] (plus the wall's, if wanted).
    ua_w_k : float, callable or (temperatures, UA)
        UA [W/K] fixed, as a function of the contents temperature [°C], or as a table
        interpolated linearly (held at its ends).
    start_temp_c, target_temp_c, ambient_temp_c : array_like
        Temperatures [°C]; the target lies strictly between the start and the ambient.
    points : int
        Gauss–Legendre nodes in s = ln|T − T_a|.

    Returns
    -------
    ndarray
        Time [s]; exactly (C/UA)·ln((T₀ − T_a)/(T − T_a)) for a fixed UA.

    Raises
    ------
    InputError
        ``--target-temp``: a target at or beyond the ambient (never reached) or beyond the
        start; ``ua_w_k``/``capacity_j_k`` not above 0.

    Examples
    --------
    >>> round(float(time_to_temperature_s(4.18e6, 100.0, 80.0, 50.0, 20.0)) / 3600, 3)
    8.048
    """
    c = _capacity(capacity_j_k)
    ua = _ua_function(ua_w_k)
    start, target = np.asarray(start_temp_c, float), np.asarray(target_temp_c, float)
    ambient = np.asarray(ambient_temp_c, float)
    _check_target(start, target, ambient, "--target-temp")
    sign = np.sign(start - ambient)
    s0, s1 = np.log(np.abs(target - ambient)), np.log(np.abs(start - ambient))
    x, w = np.polynomial.legendre.leggauss(int(points))
    shape = np.broadcast(c, s0, s1).shape
    x = x.reshape((-1,) + (1,) * len(shape))
    w = w.reshape(x.shape)
    s = 0.5 * (s0 + s1) + 0.5 * (s1 - s0) * x
    temps = ambient + sign * np.exp(s)
    return 0.5 * (s1 - s0) * np.sum(w * c / ua(temps), axis=0)


def march_temperature_c(times_s, capacity_j_k, ua_w_k, start_temp_c, ambient_temp_c, steps_per_interval: int = 20):
    """Contents temperature [°C] at each of *times_s* [s], marched from the start (t = 0).

    Classical fourth-order Runge–Kutta on C·dT/dt = −UA(T)(T − T_a), with
    *steps_per_interval* equal steps between consecutive times (scalar case).

    Examples
    --------
    >>> t = march_temperature_c([0.0, 3600.0], 4.18e6, 100.0, 80.0, 20.0)
    >>> round(float(t[-1]), 3)
    75.049
    """
    c = float(_capacity(capacity_j_k))
    ua = _ua_function(ua_w_k)
    times = np.asarray(times_s, dtype=float).ravel()
    if times.size == 0 or np.any(~np.isfinite(times)) or times[0] < 0 or np.any(np.diff(times) < 0):
        raise InputError("times_s", "the times must be finite, from 0 and rising")
    ta = float(ambient_temp_c)

    def rate(temp):
        return -float(ua(temp)) * (temp - ta) / c

    out, temp, now = [], float(start_temp_c), 0.0
    for target in times:
        h = (target - now) / steps_per_interval
        for _ in range(steps_per_interval if h > 0 else 0):
            k1 = rate(temp)
            k2 = rate(temp + 0.5 * h * k1)
            k3 = rate(temp + 0.5 * h * k2)
            k4 = rate(temp + h * k3)
            temp += h * (k1 + 2 * k2 + 2 * k3 + k4) / 6
        now = target
        out.append(temp)
    return np.array(out)


def freeze_hold_s(mass_kg, ua_w_k, start_temp_c, ambient_temp_c, ice_fraction=0.0, wall_capacity_j_k=0.0,
                  fluid: str = "water"):
    """Hold time [s] of still water in a vessel before it reaches 0 °C and then the ice fraction.

    Parameters
    ----------
    mass_kg : array_like
        Water in the vessel [kg] (:func:`contents_mass_kg`).
    ua_w_k : float, callable or (temperatures, UA)
        As for :func:`time_to_temperature_s`; needed from 0 °C to the start.
    start_temp_c : array_like
        Water temperature when the hold starts [°C], above 0.
    ambient_temp_c : array_like
        Air (ambient) temperature [°C].
    ice_fraction : array_like
        Fraction of the water frozen, 0 (first ice) to 1 (frozen solid).
    wall_capacity_j_k : array_like
        Heat capacity of the wall that cools with the water [J/K] (default 0: safe side).
    fluid : str
        Must be water.

    Returns
    -------
    ndarray
        Time [s]; ``inf`` where the ambient is not below 0 °C (the water never freezes).

    Raises
    ------
    InputError
        ``--fluid`` not water; ``--fluid-temp`` not above 0 °C; ``--ice-fraction`` outside 0–1.

    Examples
    --------
    >>> round(float(freeze_hold_s(10000.0, 40.0, 10.0, -20.0, ice_fraction=0.1)) / 3600, 1)
    234.3
    """
    from .props.liquids import LATENT_HEAT_FUSION_J_KG, normalise_fluid

    if normalise_fluid(fluid) != "water":
        raise InputError("--fluid", f'the freezing model is for water only; "{fluid}" is not water')
    start = np.asarray(start_temp_c, dtype=float)
    if np.any(~np.isfinite(start) | (start <= 0)):
        raise InputError("--fluid-temp", "the water must start above 0 °C for a freezing time")
    fraction = np.asarray(ice_fraction, dtype=float)
    if np.any(~np.isfinite(fraction) | (fraction < 0) | (fraction > 1)):
        raise InputError("--ice-fraction", "the ice fraction must be from 0 (first ice) to 1 (frozen solid)")
    ambient = np.asarray(ambient_temp_c, dtype=float)
    freezes = ambient < 0
    safe_ambient = np.where(freezes, ambient, -1.0)  # placeholder where the water never freezes
    capacity = contents_heat_capacity_j_k(mass_kg, "water", 0.0, start) + np.asarray(wall_capacity_j_k, float)
    ua = _ua_function(ua_w_k)
    to_zero = time_to_temperature_s(capacity, ua, start, 0.0, safe_ambient)
    q_zero = ua(0.0) * (0.0 - safe_ambient)
    latent = np.asarray(mass_kg, float) * fraction * LATENT_HEAT_FUSION_J_KG / q_zero
    return np.where(freezes, to_zero + latent, math.inf)
