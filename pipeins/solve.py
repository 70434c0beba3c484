"""The vectorised solver for the resistance network of an insulated pipe or flat face.

Heat flow q is per metre of pipe (W/m) or per m² of flat face (W/m²), positive when it
leaves the fluid.  For a trial surface temperature Ts the outer side takes
q_out(Ts) = A·[h_c(Ts)·(Ts − Ta) + h_r(Ts)·(Ts − Tr)], which rises with Ts.  Marching
outward from the fluid with that q, through the inner film, the pipe wall and every
layer (each layer's temperature drop satisfies the Kirchhoff integral of k(T) exactly),
gives the surface temperature back, and the marched value falls as q rises.  So
G(Ts) = Ts − march(q_out(Ts)) rises with Ts, with slope at least 1, and changes sign
between the lowest and the highest of the fluid, air and radiant temperatures: a bracket
that always holds the root.

Inside it, a safeguarded Newton iteration (:func:`_newton_in_bracket`) starts from a
linearised first guess and uses the derivative G' = 1 − march'(q)·q_out'(Ts): march'(q)
and the radiation part of q_out' are analytic, the convection part
d[h_c·(Ts − Ta)]/dTs takes h_c at the iterate and its slope from the last two iterates
(a power-law estimate on the first step).  A step that leaves the bracket, or two steps
that together fail to halve |G|, are replaced by bisection, so every case converges.
Only the cases not yet converged are carried into the next iteration.

A case stops when the heat-flow error left after its step is estimated below ``rtol``
relative (from the superlinear convergence of the iterates and from the error of the
estimated q_out'), or when the surface temperature is known to within what floating
point can resolve (16 ulps of the largest temperature magnitude): since G' ≥ 1 the root
lies within |G|/G' of the iterate.  The second test is what ends cases with a tiny heat
flow or a large A·h·R (G' = 1 + A·h·R), where q cannot be resolved relatively from the
outer side; their q is then taken from the conduction side at that surface temperature.
Each converged case takes its last Newton step without another evaluation.  Fluid, air
and radiant temperatures within :data:`NO_FLOW_SPAN_K` of each other are the no-flow
case, answered exactly (q = 0, every temperature the fluid's).  The iteration count is
bounded and reported; a case that still does not converge raises :class:`SolverError`
(a bug, never bad input).  Resistances or an outer film that overflow floating point
are an :class:`~pipeins.errors.InputError`.
"""
from __future__ import annotations

import math
from typing import Sequence

import numpy as np

from .errors import InputError
from .geometry import shape_of
from .model import FlatWall, Layer, Pipe, Surface, Surroundings, Fluid
from .physics import conduction, outer, radiation
from .results import Result, section_result

__all__ = ["solve", "SolverError", "RELATIVE_TOLERANCE", "MAX_ITERATIONS", "NO_FLOW_SPAN_K"]

#: Relative tolerance on the heat flow of each case.
RELATIVE_TOLERANCE = 1e-10
#: Bound on the iterations of one call (every case converges in far fewer; see _newton_in_bracket).
MAX_ITERATIONS = 200
#: Largest outer surface per unit (circumference per metre, or face) the outer film can compute with [m].
MAX_OUTER_SIZE_M = 1e6
#: Fluid, air and radiant temperatures closer than this [K] are the exact no-flow case.
NO_FLOW_SPAN_K = 1e-9
# Surface-temperature resolution, in units of the largest temperature magnitude [°C] + 1 K.
_RESOLUTION_ULPS = 16 * np.finfo(float).eps
# Safety factor on the superlinear estimate of the error left after a step.
_AFTER_SAFETY = 4.0
# Fraction of h_c taken as d[h_c]/dTs·(Ts − Ta) on the first step (laminar natural
# convection, Nu ∝ Ra^(1/4)); later steps use the secant slope of h_c.
_FIRST_CONVECTION_EXPONENT = 0.25


class SolverError(RuntimeError):
    """The heat-flow iteration did not meet its tolerance (a bug, never bad input)."""


def solve(pipe: Pipe | FlatWall, layers: Sequence[Layer], fluid: Fluid, surroundings: Surroundings,
          surface: Surface = Surface(), *, touch_limit_c=None,
          rtol: float = RELATIVE_TOLERANCE, max_iterations: int = MAX_ITERATIONS) -> Result:
    """Heat flow and temperatures of an insulated pipe (or flat face), for arrays of cases.

    Every numeric input broadcasts against every other; the result's arrays have the
    broadcast shape.  See the module docstring for the method.  *touch_limit_c*, optional, is a
    surface-temperature limit the result compares against (``over_touch_limit``).
    ``residual`` of the result is the largest |q − q_out(Ts)| at the reported
    surface temperature, by the linearisation q_out'·|G|.

    >>> from pipeins.catalog.materials import lookup_material
    >>> r = solve(Pipe(0.0603, 0.0039), [Layer(lookup_material("k=0.040"), 0.040)],
    ...           Fluid(80.0), Surroundings(20.0))
    >>> round(float(r.heat_flow_w_per_m), 1), round(float(r.surface_temp_c), 1)
    (16.5, 24.6)
    """
    with np.errstate(all="ignore"):  # every result is checked finite below; no warning leaks
        return _solve(pipe, layers, fluid, surroundings, surface, touch_limit_c, rtol, max_iterations)


def _solve(pipe, layers, fluid, surroundings, surface, touch_limit_c, rtol, max_iterations):
    patches = patches_of(pipe, surroundings)
    radiant_c = surroundings.radiant_temp_c
    fixed_h = surface.fixed_coefficient_w_m2k
    sun = _absorbed_sun(surroundings, surface)
    common = {
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
    }
    raws = []
    for patch in patches:
        raw = {**common, **patch.shape.columns(), "sun": sun * patch.sun_factor}
        if patch.boundary is not None:
            raw.update(air=patch.boundary.temp_c, rad=patch.boundary.temp_c, hfix=patch.boundary.coefficient_w_m2k,
                       wind=0.0, sun=0.0)
        for j, layer in enumerate(layers):
            raw[f"t{j}"] = layer.installed_thickness_m if patch.insulated else 0.0
        raws.append({k: np.asarray(v, dtype=float) for k, v in raw.items()})
    shape_of_cases = np.broadcast_shapes(*(a.shape for raw in raws for a in raw.values()))
    flat = [{k: np.broadcast_to(a, shape_of_cases).ravel() for k, a in raw.items()} for raw in raws]
    m = flat[0]["fluid"].size  # cases per patch
    fits = [conduction.conductivity_of(layer.material) for layer in layers]

    # Geometry (each patch's shape protocol): per-layer conduction factors S (q = ΔΘ / S),
    # the outer area per unit and the outer film's lengths; the patches stacked on one case axis.
    keys, parts, nets = [], [], []
    for patch, c in zip(patches, flat):
        shape = patch.shape
        fixed = patch.boundary is not None or fixed_h is not None
        key = (shape.correlation_key, fixed)
        if key not in keys:
            keys.append(key)
        net = shape.network(c, [c[f"t{j}"] for j in range(len(layers))])
        nets.append(net)
        has_film = np.isfinite(c["hi"])
        film_r = np.where(has_film, net.inner_film_factor / np.where(has_film, c["hi"], 1.0), 0.0)
        wall_r = net.wall_factor / c["kw"]
        area = np.broadcast_to(net.outer_area, (m,))
        _check_network(film_r, wall_r, net.layer_factors, area, layers)
        natural_len = net.film_length_m if net.film_height_m is None else net.film_height_m
        part = {"fluid": c["fluid"], "air": c["air"], "rad": c["rad"], "wind": c["wind"], "p": c["p"],
                "eps": c["eps"], "hfix": c["hfix"], "sun": c["sun"], "area": area,
                "len": np.broadcast_to(net.film_length_m, (m,)),
                "height": np.broadcast_to(natural_len, (m,)),
                "c_nat": np.full(m, shape.rough_natural_c),
                "h_f": np.broadcast_to(shape.rough_forced_h_w_m2k(c["wind"], net.film_length_m), (m,)),
                "key": np.full(m, keys.index(key)),
                "film_r": np.broadcast_to(film_r, (m,)), "wall_r": np.broadcast_to(wall_r, (m,))}
        for j, s_j in enumerate(net.layer_factors):
            part[f"s{j}"] = np.broadcast_to(s_j, (m,))
        parts.append(part)
    cases = parts[0] if len(parts) == 1 else {k: np.concatenate([p[k] for p in parts]) for k in parts[0]}
    network = _Network(fits, cases["film_r"], cases["wall_r"], [cases[f"s{j}"] for j in range(len(layers))])
    cases.update(network.columns)
    outer_side = _OuterSide(keys, cases)
    cases.update(outer_side.columns(cases))

    q, x, h_c, h_r, q_slope, iterations = _newton_in_bracket(cases, network, outer_side, rtol, max_iterations)
    no_flow = _no_flow(cases)
    q = np.where(no_flow, 0.0, q)
    temps = network.temperatures(q, cases["fluid"])
    ts = temps[-1]
    if not (np.all(np.isfinite(q)) and np.all(np.isfinite(ts)) and np.all(np.isfinite(h_c + h_r))):
        raise SolverError("heat flow is not finite: report this case as a bug")
    residual = np.where(no_flow, 0.0, q_slope * np.abs(x - ts))

    def shaped(x, p=0):
        return np.asarray(x)[p * m:(p + 1) * m].reshape(shape_of_cases)

    dew_point = None
    if surroundings.relative_humidity_percent is not None:
        from .props.humid import dew_point_c

        dew_point = np.asarray(np.broadcast_to(dew_point_c(surroundings.air_temp_c,
                                                       surroundings.relative_humidity_percent,
                                                       surroundings.pressure_pa), shape_of_cases))
    inputs = {"pipe": pipe, "layers": tuple(layers), "fluid": fluid, "surroundings": surroundings, "surface": surface}
    kind = getattr(pipe, "kind", patches[0].shape.kind)
    basis = getattr(pipe, "basis", patches[0].shape.basis)
    results = []
    for p, (patch, net) in enumerate(zip(patches, nets)):
        sl = slice(p * m, (p + 1) * m)
        patch_temps = [t[sl] for t in temps]
        warnings = _warnings(layers if patch.insulated else [], fits, patch_temps, (h_c + h_r)[sl],
                             net.outer_radius_m, patch.shape)
        round_shape = net.outer_radius_m is not None
        patch_surface = surface
        if patch.boundary is not None:
            patch_surface = Surface(surface.emittance, surface.name, surface.surface_kind,
                                    fixed_coefficient_w_m2k=patch.boundary.coefficient_w_m2k)
        results.append(Result(
            heat_flow=shaped(q, p),
            outer_heat_flux_w_m2=shaped(q[sl] / cases["area"][sl]),
            surface_temp_c=shaped(ts, p),
            interface_temps_c=np.stack([shaped(t, p) for t in temps]),
            h_conv_w_m2k=shaped(h_c, p),
            h_rad_w_m2k=shaped(h_r, p),
            outer_diameter_m=shaped(2 * np.broadcast_to(net.outer_radius_m, (m,))) if round_shape else None,
            residual=float(np.max(residual[sl])) if m else 0.0,
            iterations=iterations,
            dew_point_c=dew_point,
            touch_limit_c=touch_limit_c,
            geometry=patch.shape.kind,
            warnings=warnings,
            inputs={**inputs, "layers": tuple(layers) if patch.insulated else tuple(_bare_layers(layers)),
                    "surface": patch_surface, "shape": patch.shape},
            basis=patch.shape.basis if len(patches) > 1 else basis,
        ))
    if len(patches) == 1 and not hasattr(pipe, "kind"):
        return results[0]
    areas = [shaped(cases["area"], p) for p in range(len(patches))]
    return section_result(pipe, patches, results, inputs, kind, basis, touch_limit_c, dew_point, areas)


def patches_of(section, surroundings) -> list:
    """The surface patches of *section* in *surroundings* (a single shape is one patch)."""
    if hasattr(section, "patches"):
        return list(section.patches(surroundings))
    from .geometry.section import single_patch

    shape = shape_of(section, surroundings)
    # sun on the projected area: D per πD of a cylinder, πr² per 4πr² of a sphere, a face normal to it
    sun_factor = {"cylinder": 1.0 / math.pi, "sphere": 0.25}.get(shape.kind, 1.0)
    return single_patch("surface", shape, sun_factor)


def _absorbed_sun(surroundings, surface):
    """Solar flux absorbed per m² of a surface normal to the sun [W/m²]: absorptance × irradiance."""
    irradiance = getattr(surroundings, "solar_irradiance_w_m2", None)
    if irradiance is None:
        return 0.0
    absorptance = getattr(surface, "solar_absorptance", None)
    if absorptance is None:
        raise InputError("--absorptance", "solar irradiance needs the surface's solar absorptance (0 to 1)")
    return np.asarray(absorptance, dtype=float) * np.asarray(irradiance, dtype=float)


def _bare_layers(layers):
    """The layers at zero thickness: a patch left bare inside an insulated section."""
    from .model import BareLayer

    return [BareLayer(layer.material) for layer in layers]


def _check_network(film_r, wall_r, layer_s, area, layers):
    """Refuse resistances that floating point cannot carry (a film coefficient near 0,
    a wall conductivity near 0, a layer so thick its factor overflows)."""
    if not np.all(np.isfinite(film_r)):
        raise InputError("--inner-h", "inner film coefficient too small to compute with")
    if not np.all(np.isfinite(wall_r)):
        raise InputError("--pipe-material", "wall conductivity too small to compute with")
    for layer, s in zip(layers, layer_s):
        if not np.all(np.isfinite(s)):
            raise InputError("--layer", f"thickness of {layer.material.name} cannot be computed with")
    if not np.all(np.isfinite(area) & (area <= MAX_OUTER_SIZE_M)):
        raise InputError("--layer", f"total thickness too large to compute with (outer size above {MAX_OUTER_SIZE_M:g} m)")


def _no_flow(c):
    t_min = np.minimum(np.minimum(c["fluid"], c["air"]), c["rad"])
    t_max = np.maximum(np.maximum(c["fluid"], c["air"]), c["rad"])
    return (t_max - t_min < NO_FLOW_SPAN_K) & (c["sun"] == 0.0)


class _Network:
    """The conduction side: inner film, wall and layers, as steps of a march from the fluid.

    Constant resistances (film, wall, constant-k layers) that follow each other are
    merged for the iteration, which needs only the surface temperature and its
    derivative; :meth:`temperatures` marches every interface for the result.  Per-case
    arrays live in :attr:`columns` (a flat case axis, so that the solver can take any
    subset of cases).
    """

    def __init__(self, fits, film_r, wall_r, layer_s):
        self.fits = fits
        self.columns = {"film_r": film_r, "wall_r": wall_r}
        for j, s in enumerate(layer_s):
            self.columns[f"s{j}"] = s
        # Iteration plan: a resistance before the first k(T) layer, then per k(T) layer
        # its factor and the merged constant resistance after it.
        self.varying = [j for j, fit in enumerate(fits) if not fit.is_constant]
        run = film_r + wall_r
        after = []
        for j, (fit, s) in enumerate(zip(fits, layer_s)):
            if fit.is_constant:
                run = run + s / fit.coefficients[0]
            else:
                after.append(run)
                run = np.zeros_like(film_r)
        after.append(run)
        self.columns["r_pre"] = after[0]
        for i, r in enumerate(after[1:]):
            self.columns[f"r_post{i}"] = r

    def surface(self, cases, q):
        """Marched surface temperature [°C] and its derivative d Ts/d q [K per W/m] (≤ 0)."""
        t = cases["fluid"] - q * cases["r_pre"]
        dt = -cases["r_pre"]
        for i, j in enumerate(self.varying):
            fit, s = self.fits[j], cases[f"s{j}"]
            theta, k_in = fit.potential_and_conductivity(t)
            t, k_out = fit.temperature_and_conductivity(theta - q * s)
            r_post = cases[f"r_post{i}"]
            dt = (k_in * dt - s) / k_out - r_post
            t = t - q * r_post
        return t, dt

    def temperatures(self, q, fluid):
        """Every interface temperature [°C]: bore, pipe outside, each layer's outer face."""
        c = self.columns
        temps = [fluid - q * c["film_r"]]
        temps.append(temps[-1] - q * c["wall_r"])
        for j, fit in enumerate(self.fits):
            temps.append(fit.temperature(fit.potential(temps[-1]) - q * c[f"s{j}"]))
        return temps


class _OuterSide:
    """The outer side: q_out(Ts) with its film coefficients, and dq_out/dTs.

    *keys* lists the distinct ((shape, orientation), fixed) pairs of the patches; the
    case column ``key`` indexes it, so patches of different shapes and facings share one
    iteration and each case takes its own correlation.  A fixed outer coefficient (the
    user's, or a patch's stated boundary) replaces convection and radiation.  Absorbed
    sun (column ``sun``, W per m² of outer surface) is taken off the outgoing flow.

    Radiation is evaluated here with the formula of
    :func:`pipeins.physics.radiation.radiation_coefficient_w_m2k` (same operations, so the
    same values), without re-checking its inputs on every iteration.
    """

    def __init__(self, keys, cases):
        self.keys = keys
        self.fixed = all(fixed for _, fixed in keys)
        self.some_fixed = any(fixed for _, fixed in keys) and not self.fixed
        self.sunny = bool(np.any(cases["sun"] != 0.0))

    def columns(self, c):
        """Per-case constants of the outer side (added to the solver's case arrays)."""
        rad_k = c["rad"] - radiation.ABSOLUTE_ZERO_C
        eps_sigma = c["eps"] * radiation.STEFAN_BOLTZMANN
        cols = {"rad_k": rad_k, "rad_k2": rad_k**2, "eps_sigma": eps_sigma, "eps_sigma4": 4.0 * eps_sigma}
        if self.some_fixed:
            cols["fixed"] = np.isin(c["key"], [i for i, (_, fixed) in enumerate(self.keys) if fixed])
        return cols

    def _convection(self, cases, ts):
        air = cases["air"]
        films = [(i, key) for i, (key, fixed) in enumerate(self.keys) if not fixed]
        if len(films) == 1 and len(self.keys) == 1:
            (geometry, orientation), = [key for _, key in films]
            return self._film(ts, air, cases, geometry, orientation)
        h_c = cases["hfix"].copy()
        for i, (geometry, orientation) in films:
            at = cases["key"] == i
            if np.any(at):
                sub = {k: cases[k][at] for k in ("len", "wind", "height", "p")}
                h_c[at] = self._film(ts[at], air[at], sub, geometry, orientation)
        return h_c

    @staticmethod
    def _film(ts, air, cases, geometry, orientation):
        height = cases["height"] if orientation == "vertical" else None
        h_c = outer.outer_convection_coefficient(ts, air, cases["len"], cases["wind"], orientation, height,
                                                 cases["p"], geometry)
        if not np.all(np.isfinite(h_c)):
            raise InputError("outer film", "the convection coefficient overflows for these inputs (a height, "
                             "size, wind speed or air pressure far beyond any real line)")
        return h_c

    def __call__(self, cases, ts):
        """(q_out, h_c, h_r, dq_out/dTs without the convection-slope term)."""
        air, rad, area = cases["air"], cases["rad"], cases["area"]
        if self.fixed:
            h_c = cases["hfix"]
            h_r = np.zeros_like(h_c)
            q = area * (h_c * (ts - air) + h_r * (ts - rad))
            if self.sunny:
                q = q - area * cases["sun"]
            return q, h_c, h_r, area * h_c
        h_c = self._convection(cases, ts)
        ts_k = ts - radiation.ABSOLUTE_ZERO_C
        ts_k2 = ts_k**2
        h_r = cases["eps_sigma"] * (ts_k + cases["rad_k"]) * (ts_k2 + cases["rad_k2"])
        slope_r = cases["eps_sigma4"] * (ts_k2 * ts_k)
        if self.some_fixed:
            h_r = np.where(cases["fixed"], 0.0, h_r)
            slope_r = np.where(cases["fixed"], 0.0, slope_r)
        q = area * (h_c * (ts - air) + h_r * (ts - rad))
        if self.sunny:
            q = q - area * cases["sun"]
        return q, h_c, h_r, area * (h_c + slope_r)

    def upper_rise(self, cases):
        """How far absorbed sun can lift the surface above the highest of fluid, air and
        radiant temperatures [K]: q_out ≥ A·(h_lin·(Ts − T_r) − sun) with h_lin = 4εσT_r³
        (εσ(Ts⁴ − T_r⁴) ≥ 4εσT_r³(Ts − T_r)) or the fixed coefficient, so the root lies below."""
        if not self.sunny:
            return 0.0
        linear = cases["eps_sigma4"] * cases["rad_k"] ** 3
        if self.fixed:
            linear = cases["hfix"]
        elif self.some_fixed:
            linear = np.where(cases["fixed"], cases["hfix"], linear)
        return np.where(cases["sun"] > 0.0, cases["sun"] / linear, 0.0)

    def first_guess(self, cases, network):
        """Linearised surface temperature and the first step's (Ts − Ta)·dh_c/dTs.

        The conduction side is a fixed resistance (k at the mean of the fluid and the
        surface), the outer side a fixed film: radiation exact at the guess, convection
        from the shape's simplified air correlations h_N = C·(ΔT/L)^(1/4) (C = 1.32 on a
        horizontal cylinder, 1.42 otherwise) and h_F (4.1·V^0.618/D^0.382 across a cylinder,
        3.84·(V/L)^0.5 along a face), combined as (h_F³ + h_N³)^(1/3) (common practice for
        air near room temperature, from memory; only a starting point: the iteration uses
        the real correlations).  Two fixed-point passes from h_c = 4 W/(m²·K).
        """
        fluid, air, rad, area = cases["fluid"], cases["air"], cases["rad"], cases["area"]
        if self.fixed:
            h_c = cases["hfix"]
        else:
            h_c = np.full(fluid.shape, 4.0)
            natural_len = cases["height"]
            c_nat = cases["c_nat"]
            h_f = cases["h_f"]
            h_f3 = h_f**3
        x = 0.5 * (fluid + air)
        r_fixed = cases["film_r"] + cases["wall_r"]
        for j, fit in enumerate(network.fits):
            if fit.is_constant:
                r_fixed = r_fixed + cases[f"s{j}"] / fit.coefficients[0]
        for _ in range(2):
            r_in = r_fixed
            mean = 0.5 * (fluid + x)
            for j in network.varying:
                r_in = r_in + cases[f"s{j}"] / network.fits[j].conductivity(mean)
            if self.fixed:
                h_r = 0.0
            else:
                x_k = x - radiation.ABSOLUTE_ZERO_C
                h_r = cases["eps_sigma"] * (x_k + cases["rad_k"]) * (x_k**2 + cases["rad_k2"])
                if self.some_fixed:
                    h_r = np.where(cases["fixed"], 0.0, h_r)
            h = h_c + h_r
            ambient = (h_c * air + h_r * rad) / h
            if self.sunny:
                ambient = ambient + cases["sun"] / h
            r_out = 1.0 / (area * h)
            x = ambient + (fluid - ambient) * (r_out / (r_in + r_out))
            if not self.fixed:
                h_n = c_nat * np.sqrt(np.sqrt(np.abs(x - air) / natural_len))
                h_n3 = h_n**3
                h_c = np.cbrt(h_f3 + h_n3)
                if self.some_fixed:
                    h_c = np.where(cases["fixed"], cases["hfix"], h_c)
        if self.fixed:
            return x, np.zeros(fluid.shape)
        exponent = _FIRST_CONVECTION_EXPONENT * h_n3 / np.where(h_c > 0, h_f3 + h_n3, 1.0)
        if self.some_fixed:
            exponent = np.where(cases["fixed"], 0.0, exponent)
        return x, exponent


def _newton_in_bracket(cases, network, outer_side, rtol, max_iterations):
    """Surface temperature Ts in [t_min, t_max] with G(Ts) = Ts − march(q_out(Ts)) = 0.

    G rises with Ts (q_out rises with Ts; the marched surface falls with q), and
    G(t_min) <= 0 <= G(t_max), so [t_min, t_max] brackets the root; every evaluated
    iterate narrows it by the sign of G.  Each step is Newton's, x − G/G', from a
    linearised first guess; it is replaced by bisection when it would leave the bracket
    or is not finite, or when |G| has not halved over the last two steps (a safeguarded
    Newton method, cf. Brent, *Algorithms for Minimization without Derivatives*, 1973,
    ch. 4).  So each case either halves |G| (and |x − root| ≤ |G|) or halves its bracket
    at least every other step, and reaches the stop test (module docstring) within about
    2·(52 + 52) steps at worst; most cases take 3 to 5.

    Returns (q, Ts, h_c, h_r, dq_out/dTs, iterations), each case at its last evaluated
    iterate.
    """
    n = cases["fluid"].size
    fluid, air, rad = cases["fluid"], cases["air"], cases["rad"]
    t_min = np.minimum(np.minimum(fluid, air), rad)
    t_max = np.maximum(np.maximum(fluid, air), rad) + outer_side.upper_rise(cases)
    out = {k: np.zeros(n) for k in ("q", "x", "h_c", "h_r", "slope")}
    if n == 0:
        return out["q"], out["x"], out["h_c"], out["h_r"], out["slope"], 0

    guess, first_exponent = outer_side.first_guess(cases, network)
    guess = np.clip(guess, t_min, t_max)
    scale = np.maximum(np.abs(t_min), np.abs(t_max)) + 1.0
    # Iteration state of the cases still carried (idx maps them into the full arrays);
    # "live" marks those not yet converged.  Converged cases are dropped from the arrays
    # only once they are half of them, since gathering costs about as much as computing.
    state = {
        "a": t_min, "b": t_max, "res": _RESOLUTION_ULPS * scale, "secant_dx": 1e-7 * scale,
        "x": np.where(np.isfinite(guess), guess, 0.5 * (t_min + t_max)),
        "x_prev": np.zeros(n), "hc_prev": np.zeros(n), "conv": np.zeros(n),
        "g_old": np.full(n, np.inf), "g_last": np.full(n, np.inf), "size_prev": np.ones(n),
        "size_prev2": np.ones(n),
        "live": np.ones(n, dtype=bool),
    }
    idx, work = np.arange(n), cases
    iterations = 0
    while True:
        if iterations >= max_iterations:
            raise SolverError(f"heat flow not converged in {max_iterations} iterations "
                              f"({np.count_nonzero(state['live'])} of {n} cases)")
        iterations += 1
        st = state
        x, a, b, res = st["x"], st["a"], st["b"], st["res"]
        q, h_c, h_r, q_slope = outer_side(work, x)
        ts, dts_dq = network.surface(work, q)
        g = x - ts
        # A march that overflows (a heat flow far too large for the resistances) gives NaN:
        # its sign is that of q, since G rises with Ts and q with it.
        g = np.where(np.isnan(g), np.copysign(np.inf, q), g)
        conv = st["conv"]
        if not outer_side.fixed:
            # Convection part of q_out': (Ts − Ta)·dh_c/dTs, by the secant of h_c over the
            # last two iterates (the previous value where they are too close).
            if iterations == 1:
                conv = first_exponent * h_c
            else:
                dx = x - st["x_prev"]
                conv = np.where(np.abs(dx) > st["secant_dx"], (x - work["air"]) * (h_c - st["hc_prev"]) / dx, conv)
                conv = np.maximum(conv, -0.5 * h_c)
            q_slope = q_slope + work["area"] * conv
        g_slope = 1.0 - dts_dq * q_slope  # >= 1
        step = g / g_slope  # the Newton step is −step; the root lies within |step| of x
        size = np.abs(step)
        a = np.where(g < 0, x, a)
        b = np.where(g > 0, x, b)
        x_new = x - step
        inside = (x_new > a) & (x_new < b)
        # Error left after the step.  Superlinear (secant-like) convergence has
        # e₊ ≈ C·e·e₋, and C ≈ e/(e₋·e₋₋) gives e₊ ≈ e²/e₋₋; kept within a factor of
        # _AFTER_SAFETY of that, and never above |step| times the last contraction ratio.
        if iterations == 1:
            after = size
        else:
            after = size * np.minimum(1.0, size / st["size_prev"])
            if iterations > 2:
                after = np.minimum(after, _AFTER_SAFETY * size * (size / st["size_prev2"]))
        # Heat-flow error after the step: from the error left in Ts, and from the error of
        # the estimated q_out' (taken as its last change, all of it on the first step),
        # which moves the joint solution by δ(q_out')·|step|/G' (counted twice, for safety).
        if outer_side.fixed:
            q_err = q_slope * after
        else:
            slope_err = work["area"] * (conv if iterations == 1 else np.abs(conv - st["conv"]))
            q_err = np.maximum(q_slope * after, 2.0 * slope_err * size / g_slope)
        on_q = inside & (q_err <= rtol * np.abs(q))
        done = (on_q | (inside & (after <= res)) | (size <= res) | (b - a <= res)) & st["live"]
        if np.any(done):
            # Each converged case takes its last step without another evaluation: Ts moves
            # by −step and q by −q_out'·step (the joint linearisation of both sides).
            at = idx[done]
            d_step = step[done]
            take = np.isfinite(d_step) & (size[done] <= np.maximum((b - a)[done], res[done]))
            out["q"][at] = np.where(take, q[done] - q_slope[done] * d_step, q[done])
            out["x"][at] = np.where(take, np.clip(x_new[done], a[done], b[done]), x[done])
            polish = ~on_q[done]
            if np.any(polish):
                _heat_flow_at_surface(cases, network, at[polish], out, rtol)
            for name, value in (("h_c", h_c), ("h_r", h_r), ("slope", q_slope)):
                out[name][at] = value[done]
        live = st["live"] & ~done
        remaining = np.count_nonzero(live)
        if remaining == 0:
            break
        newton = inside & (np.abs(g) <= 0.5 * st["g_old"])
        state = {"a": a, "b": b, "res": res, "secant_dx": st["secant_dx"],
                 "x": np.where(newton, x_new, 0.5 * (a + b)), "x_prev": x, "hc_prev": h_c, "conv": conv,
                 "g_old": st["g_last"], "g_last": np.abs(g), "size_prev": size,
                 "size_prev2": st["size_prev"], "live": live}
        if remaining <= live.size // 2:
            idx = idx[live]
            work = {k: v[idx] for k, v in cases.items()}
            state = {k: v[live] for k, v in state.items()}
    return out["q"], out["x"], out["h_c"], out["h_r"], out["slope"], iterations


def _heat_flow_at_surface(cases, network, at, out, rtol, max_steps=50):
    """Heat flow of the cases *at* from the conduction side, their surface temperature fixed.

    For cases stopped on the surface temperature (resolved to floating point, but with q
    not yet to *rtol*, as when A·h·R is huge or the flow is tiny), q is the root of
    march(q) = Ts: Newton steps on the march alone (decreasing in q, derivative exact),
    no outer-film evaluation.  A step that is not finite keeps the previous q.
    """
    sub = {k: v[at] for k, v in cases.items()}
    x, q = out["x"][at], out["q"][at]
    for _ in range(max_steps):
        ts, dts_dq = network.surface(sub, q)
        dq = (x - ts) / dts_dq
        q_new = np.where(np.isfinite(dq), q + dq, q)
        settled = ~(np.abs(q_new - q) > rtol * np.abs(q_new))
        q = q_new
        if np.all(settled):
            break
    out["q"][at] = q


def _limit_note(code, layer_index, material, temps, limit_c):
    """A layer's service-limit note: one temperature, or the span of the cases' temperatures."""
    from .notes import note

    lo, hi = float(np.min(temps)), float(np.max(temps))
    common = dict(layer=str(layer_index), material=material.name, limit_c=(limit_c, "temperature"))
    if abs(hi - lo) < 0.05:
        return note(code, **common, temp_c=(lo, "temperature"))
    return note(code + ".span", **common, low_c=(lo, "temperature"), high_c=(hi, "temperature"))


def _warnings(layers, fits, temps, h_total, outer_radius, shape) -> list:
    """Notes that travel with the result (:class:`pipeins.notes.Note`): a layer beyond its
    material's service range (``layer.above_service_limit``, ``layer.below_service_limit``,
    ``….span`` over several cases), the outer radius below the critical radius
    (``layer.below_critical_radius``)."""
    out = []
    for j, layer in enumerate(layers):
        mat = layer.material
        hot = np.maximum(temps[j + 1], temps[j + 2])
        cold = np.minimum(temps[j + 1], temps[j + 2])
        over = hot > mat.max_temp_c
        under = cold < mat.min_temp_c
        if np.any(over):
            out.append(_limit_note("layer.above_service_limit", j + 1, mat, hot[over], mat.max_temp_c))
        if np.any(under):
            out.append(_limit_note("layer.below_service_limit", j + 1, mat, cold[under], mat.min_temp_c))
    if layers and outer_radius is not None:
        outer_fit, outer_layer = fits[-1], layers[-1]
        k_mean = outer_fit.conductivity(0.5 * (temps[-1] + temps[-2]))
        r_c = shape.critical_radius_m(k_mean, h_total)
        below = outer_radius < r_c
        if np.any(below):
            from .notes import note

            out.append(note("layer.below_critical_radius", radius_m=(float(np.max(r_c[below])), "diameter"),
                            material=outer_layer.material.name))
    return out
