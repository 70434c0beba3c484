"""The vectorised solver for the resistance network of an insulated pipe or flat face.

Heat flow q is per metre of pipe (W/m) or per m² of flat face (W/m²), positive when it
leaves the fluid.  For a trial surface temperature Ts the outer side takes
q_out(Ts) = A·[h_c(Ts)·(Ts − Ta) + h_r(Ts)·(Ts − Tr)], which rises with Ts.  Marching
outward from the fluid with that q, through the inner film, the pipe wall and every
layer (each layer's temperature drop satisfies the Kirchhoff integral of k(T) exactly),
gives the surface temperature back, and the marched value falls as q rises.  So
G(Ts) = Ts − march(q_out(Ts)) rises with Ts, with slope at least 1, and changes sign
between the lowest and the highest of the fluid, air and radiant temperatures: a bracket
that always holds the root.  Inside it a vectorised secant step, replaced by bisection
when it would leave the bracket or when the last two steps together failed to halve it
(so the first step is a bisection), converges
to a relative tolerance of 1e-9 on q in about a dozen iterations; the count is bounded
and reported, and a case that does not converge raises :class:`SolverError`.
"""
from __future__ import annotations

import math
from typing import Sequence

import numpy as np

from .model import FlatWall, Layer, Pipe, Surface, Surroundings, Fluid
from .physics import conduction, outer, radiation
from .results import Result

__all__ = ["solve", "SolverError"]

RELATIVE_TOLERANCE = 1e-9
MAX_ITERATIONS = 200


class SolverError(RuntimeError):
    """The heat-flow iteration did not meet its tolerance (a bug, never bad input)."""


def solve(pipe: Pipe | FlatWall, layers: Sequence[Layer], fluid: Fluid, surroundings: Surroundings,
          surface: Surface = Surface(), *, touch_limit_c=None,
          rtol: float = RELATIVE_TOLERANCE, max_iterations: int = MAX_ITERATIONS) -> Result:
    """Heat flow and temperatures of an insulated pipe (or flat face), for arrays of cases.

    Every numeric input broadcasts against every other; the result's arrays have the
    broadcast shape.  See the module docstring for the method.  *touch_limit_c*, optional, is a
    surface-temperature limit the result compares against (``over_touch_limit``).

    >>> from pipeins.catalog.materials import lookup_material
    >>> r = solve(Pipe(0.0603, 0.0039), [Layer(lookup_material("k=0.040"), 0.040)],
    ...           Fluid(80.0), Surroundings(20.0))
    >>> round(float(r.heat_flow_w_per_m), 1), round(float(r.surface_temp_c), 1)
    (16.5, 24.6)
    """
    flat = isinstance(pipe, FlatWall)
    radiant_c = surroundings.radiant_temp_c
    fixed_h = surface.fixed_coefficient_w_m2k
    raw = {
        "fluid": fluid.temp_c,
        "hi": np.nan if fluid.film_coefficient_w_m2k is None else fluid.film_coefficient_w_m2k,
        "wall": pipe.wall_m,
        "kw": pipe.wall_conductivity_w_mk,
        "air": surroundings.air_temp_c,
        "rad": radiant_c if fixed_h is None else surroundings.air_temp_c,
        "wind": surroundings.wind_speed_m_s,
        "p": surroundings.pressure_pa,
        "eps": surface.emittance,
        "hfix": np.nan if fixed_h is None else fixed_h,
        "od": np.nan if flat else pipe.outer_diameter_m,
        "length": pipe.length_m if flat else (surroundings.height_m if surroundings.height_m is not None else np.nan),
    }
    for j, layer in enumerate(layers):
        raw[f"t{j}"] = layer.thickness_m
    arrays = {k: np.asarray(v, dtype=float) for k, v in raw.items()}
    shape = np.broadcast_shapes(*(a.shape for a in arrays.values()))
    c = {k: np.broadcast_to(a, shape).ravel() for k, a in arrays.items()}
    n = c["fluid"].size

    fits = [conduction.conductivity_of(layer.material) for layer in layers]
    has_film = np.isfinite(c["hi"])

    # Geometry: per-layer conduction factors S (q = ΔΘ / S) and the outer area per unit.
    if flat:
        film_r = np.where(has_film, 1.0 / np.where(has_film, c["hi"], 1.0), 0.0)
        wall_s = c["wall"]
        layer_s = [c[f"t{j}"] for j in range(len(layers))]
        area = np.ones(n)
        char_len = c["length"]
        radii = None
    else:
        r_in = c["od"] / 2 - c["wall"]
        radii = [r_in, c["od"] / 2]
        for j in range(len(layers)):
            radii.append(radii[-1] + c[f"t{j}"])
        film_r = np.where(has_film, 1.0 / (np.where(has_film, c["hi"], 1.0) * 2 * math.pi * r_in), 0.0)
        wall_s = conduction.cylinder_shape_m(radii[0], radii[1])
        layer_s = [conduction.cylinder_shape_m(radii[j + 1], radii[j + 2]) for j in range(len(layers))]
        area = 2 * math.pi * radii[-1]
        char_len = 2 * radii[-1]

    if flat:
        geometry, orientation, height = "flat", pipe.face, c["length"]
    else:
        geometry, orientation = "cylinder", surroundings.orientation
        height = c["length"] if orientation == "vertical" else None

    def march(q):
        temps = [c["fluid"] - q * film_r]
        temps.append(temps[-1] - q * wall_s / c["kw"])
        for fit, s in zip(fits, layer_s):
            temps.append(fit.temperature(fit.potential(temps[-1]) - q * s))
        return temps

    def outer_side(ts):
        if fixed_h is not None:
            h_c, h_r = c["hfix"], np.zeros(n)
        else:
            h_c = outer.outer_convection_coefficient(ts, c["air"], char_len, c["wind"], orientation,
                                                     height, c["p"], geometry)
            h_r = radiation.radiation_coefficient_w_m2k(ts, c["rad"], c["eps"])
        q = area * (h_c * (ts - c["air"]) + h_r * (ts - c["rad"]))
        return q, h_c, h_r

    t_min = np.minimum(np.minimum(c["fluid"], c["air"]), c["rad"])
    t_max = np.maximum(np.maximum(c["fluid"], c["air"]), c["rad"])
    q, ts, iterations = _bracketed_root(lambda t: outer_side(t)[0], lambda q: march(q)[-1],
                                        t_min, t_max, rtol, max_iterations)
    temps = march(q)
    ts = temps[-1]
    q_out, h_c, h_r = outer_side(np.clip(ts, t_min, t_max))
    if fixed_h is not None:
        h_r = np.zeros(n)
    if not np.all(np.isfinite(q)) or not np.all(np.isfinite(ts)):
        raise SolverError("heat flow is not finite: report this case as a bug")

    def shaped(x):
        return np.asarray(x).reshape(shape)

    warnings = _warnings(layers, fits, temps, layer_s, h_c + h_r, radii, flat)
    dew_point = None
    if surroundings.relative_humidity_percent is not None:
        from .props.humid import dew_point_c

        dew_point = shaped(np.broadcast_to(dew_point_c(surroundings.air_temp_c,
                                                       surroundings.relative_humidity_percent,
                                                       surroundings.pressure_pa), shape))
    return Result(
        heat_flow_w_per_m=shaped(q),
        outer_heat_flux_w_m2=shaped(q / area),
        surface_temp_c=shaped(ts),
        interface_temps_c=np.stack([shaped(t) for t in temps]),
        h_conv_w_m2k=shaped(h_c),
        h_rad_w_m2k=shaped(h_r),
        outer_diameter_m=None if flat else shaped(2 * radii[-1]),
        residual_w_per_m=float(np.max(np.abs(q - q_out))) if n else 0.0,
        iterations=iterations,
        dew_point_c=dew_point,
        touch_limit_c=touch_limit_c,
        geometry="flat" if flat else "cylinder",
        warnings=warnings,
        inputs={"pipe": pipe, "layers": tuple(layers), "fluid": fluid,
                "surroundings": surroundings, "surface": surface},
    )


def _bracketed_root(q_out, march_surface, t_min, t_max, rtol, max_iterations):
    """Surface temperature Ts in [t_min, t_max] with G(Ts) = Ts − march(q_out(Ts)) = 0.

    G rises with Ts (q_out rises with Ts; the marched surface falls with q), and
    G(t_min) <= 0 <= G(t_max), so [t_min, t_max] brackets the root.  Each step is a
    secant step through the last two iterates, replaced by bisection when it would leave
    the bracket or when the last two steps together failed to halve it (a safeguarded secant
    method, cf. Brent, *Algorithms for Minimization without Derivatives*, 1973, ch. 4).
    Since G' >= 1 the root lies within |G(x)| of any x; the iteration stops when that
    bound, carried into the heat flow, or the bracket on the heat flow itself is below
    *rtol* relative.  Returns (q, Ts, iterations).
    """
    a, b = t_min.copy(), t_max.copy()
    qa, qb = q_out(a), q_out(b)
    ga, gb = a - march_surface(qa), b - march_surface(qb)
    x0, g0, x1, g1 = a, ga, b, gb
    x, qx = 0.5 * (a + b), 0.5 * (qa + qb)
    done = np.abs(qb - qa) <= rtol * np.maximum(np.abs(qa), np.abs(qb)) + 1e-12
    history = [b - a] * 3
    iterations = 0
    while not np.all(done):
        if iterations >= max_iterations:
            raise SolverError(f"heat flow not converged in {max_iterations} iterations "
                              f"({np.count_nonzero(~done)} of {done.size} cases)")
        iterations += 1
        with np.errstate(divide="ignore", invalid="ignore"):
            x_new = x1 - g1 * (x1 - x0) / (g1 - g0)
        bisect = (b - a > 0.5 * history[0]) | ~np.isfinite(x_new) | (x_new <= a) | (x_new >= b)
        x_new = np.where(bisect, 0.5 * (a + b), x_new)
        q_new = q_out(x_new)
        g_new = x_new - march_surface(q_new)
        x, qx = np.where(done, x, x_new), np.where(done, qx, q_new)
        right, left = g_new > 0, g_new < 0
        b, gb, qb = np.where(right, x_new, b), np.where(right, g_new, gb), np.where(right, q_new, qb)
        a, ga, qa = np.where(left, x_new, a), np.where(left, g_new, ga), np.where(left, q_new, qa)
        x0, g0, x1, g1 = x1, g1, x_new, g_new
        history = history[1:] + [b - a]
        # G' >= 1, so the root lies within |g_new| of x_new, and q within about
        # q_out' * |g_new| of q_new (q_out' estimated, with a factor 2, by the bracket's
        # secant slope).
        with np.errstate(divide="ignore", invalid="ignore"):
            slope = np.where(b > a, (qb - qa) / (b - a), 0.0)
        tol = rtol * np.abs(q_new) + 1e-12
        done = (done | (2 * slope * np.abs(g_new) <= tol)
                | (np.abs(qb - qa) <= rtol * np.maximum(np.abs(qa), np.abs(qb)) + 1e-12))
    return qx, x, iterations


def _span(values) -> str:
    lo, hi = float(np.min(values)), float(np.max(values))
    return f"{lo:.1f} °C" if abs(hi - lo) < 0.05 else f"{lo:.1f} to {hi:.1f} °C"


def _warnings(layers, fits, temps, layer_s, h_total, radii, flat) -> list[str]:
    """Warnings that travel with the result: service limits, critical radius."""
    out = []
    for j, layer in enumerate(layers):
        mat = layer.material
        hot = np.maximum(temps[j + 1], temps[j + 2])
        cold = np.minimum(temps[j + 1], temps[j + 2])
        over = hot > mat.max_temp_c
        under = cold < mat.min_temp_c
        name = f"layer {j + 1} ({mat.name})"
        if np.any(over):
            out.append(f"{name}: reaches {_span(hot[over])}, above its usable limit of "
                       f"{mat.max_temp_c:g} °C; choose a material rated for it or add an inner layer")
        if np.any(under):
            out.append(f"{name}: falls to {_span(cold[under])}, below its usable limit of "
                       f"{mat.min_temp_c:g} °C")
    if layers and not flat:
        outer_fit, outer_layer = fits[-1], layers[-1]
        k_mean = outer_fit.conductivity(0.5 * (temps[-1] + temps[-2]))
        r_c = conduction.critical_radius_m(k_mean, h_total)
        below = radii[-1] < r_c
        if np.any(below):
            out.append(f"outer radius below the critical radius ({1000 * float(np.max(r_c[below])):.1f} mm) "
                       f"for {outer_layer.material.name}: more of it raises the heat flow at first")
    return out
