"""Twin pipes in one casing: a supply and a return pipe inside one pre-insulated casing, buried.

Geometry (per metre of trench): two pipes of outer radius r_p, centres 2D apart, placed
symmetrically in a circular casing of outer radius r_c filled with insulation of conductivity
λ_i; the casing's centre at depth H under a ground surface at T_g in soil of conductivity λ_g.

**Method.**  The two fluid temperatures split into a symmetric and an antisymmetric part,
T_s = (T1 + T2)/2 − T_g and T_a = (T1 − T2)/2, and each part is a problem of its own
(the split of Wallentén, 1991, *Steady-state heat loss from insulated pipes*, Lund Institute
of Technology; from memory):

- symmetric: both pipes at T_s, each losing q_s; all 2·q_s leaves the casing into the soil;
- antisymmetric: the pipes at +T_a and −T_a; q_a flows from one pipe to the other and no net
  heat leaves the casing.

Each is solved by the **multipole method** (Bennet, Claesson & Hellström, 1987, for pipes in a
borehole; the same two-region problem: insulation inside the casing, soil outside, σ =
(λ_i − λ_g)/(λ_i + λ_g)): each pipe carries a line source and multipoles (r_p/(z − z_p))^k,
their images at r_c²/z̄_p of strength σ satisfy the casing's continuity of temperature and heat
flux exactly (the circle theorem for two conductivities), and the multipoles' strengths are
found by least squares on the pipe surfaces (isothermal), with more of them until two orders
agree to 1e-8 (:data:`ORDERS`).  This gives the dimensionless
factors h_s and h_a of the casing (q = 2π λ_i ΔT / h).  The soil outside is taken as infinite
for the casing's non-uniform part and the ground surface enters through the net flow only, as
the resistance of an isothermal cylinder under a plane, R_g = acosh(H/r_c)/(2π λ_g) (Wallentén's
approach; the neglected part is of order (r_c/2H)²).  With each pipe's own resistance R_p
(inner film and steel wall) in series:

    q_s = T_s / (h_s/(2π λ_i) + 2 R_g + R_p),     q_a = T_a / (h_a/(2π λ_i) + R_p)
    q_supply = q_s + q_a,                          q_return = q_s − q_a

both reported apart, never netted.  λ_i is the insulation's k(T) at the mean of the pipes'
and the casing's temperatures (iterated).  The thin plastic jacket is counted as insulation
(its resistance is small beside the foam's; say so in the report).

:func:`first_order_factors` holds Wallentén's first-order closed forms (from memory), shown
beside the collocated ones: they agree within about 0.3 % for h_s, while for h_a, at the
close spacings of real twin pipes, the first-order form is a few per cent high (at σ = 0 it
is ln(2D/r_p) − x²/(1 − x²), x = r_p/2D, against the exact acosh(D/r_p)).
"""

from __future__ import annotations

import math
from dataclasses import dataclass

import numpy as np

from .errors import InputError

__all__ = ["casing_factors", "first_order_factors", "TwinCasing", "solve_twin_casing", "ORDER", "check_geometry"]

#: Multipoles per pipe tried in turn, until two orders agree to :data:`TOLERANCE`.
ORDERS = (8, 12, 16, 24, 36, 48, 64)
ORDER = ORDERS[-1]
#: Relative change of the factors between two orders taken as converged.
TOLERANCE = 1e-8
#: The least clearance between the pipes, and between a pipe and the casing, as a fraction of
#: the pipe radius (closer than that the series converge too slowly to trust).
MIN_CLEARANCE = 0.1


def check_geometry(pipe_radius_m: float, half_spacing_m: float, casing_radius_m: float) -> None:
    """Refuse pipes that touch each other or the casing (InputError naming ``twin_spacing_m``)."""
    rp, d, rc = float(pipe_radius_m), float(half_spacing_m), float(casing_radius_m)
    gap = MIN_CLEARANCE * rp
    if not 2 * d - 2 * rp > gap:
        raise InputError("twin_spacing_m", f"the centres must be more than a pipe diameter apart "
                                           f"({2 * rp * 1000:.1f} mm) in the casing")
    if not rc - d - rp > gap:
        raise InputError("twin_spacing_m", f"the pipes must fit inside the casing: half the spacing plus the "
                                           f"pipe radius ({(d + rp) * 1000:.1f} mm) is not less than the casing "
                                           f"radius ({rc * 1000:.1f} mm)")


def casing_factors(pipe_radius_m, half_spacing_m, casing_radius_m, k_insulation_w_mk, k_soil_w_mk,
                   order: int | None = None) -> tuple[float, float]:
    """(h_s, h_a): the casing's symmetric and antisymmetric factors by multipole collocation
    (see the module docstring); q per pipe = 2π λ_i ΔT / h, ΔT from the pipe to the casing's
    mean temperature (symmetric) or half the pipes' difference (antisymmetric).

    >>> hs, ha = casing_factors(0.03, 0.07, 0.15, 1.0, 1.0)   # one conductivity throughout
    >>> round(ha, 4) == round(math.acosh(0.07 / 0.03), 4)    # two cylinders in an infinite medium
    True
    """
    rp, d, rc = float(pipe_radius_m), float(half_spacing_m), float(casing_radius_m)
    ki, kg = float(k_insulation_w_mk), float(k_soil_w_mk)
    check_geometry(rp, d, rc)
    if order is not None:
        return _collocate(rp, d, rc, ki, kg, int(order))
    last = None
    for n in ORDERS:   # more multipoles until two orders agree
        found = _collocate(rp, d, rc, ki, kg, n)
        if last is not None and all(abs(x - y) <= TOLERANCE * abs(y) for x, y in zip(found, last)):
            return found
        last = found
    from .solve import SolverError

    raise SolverError("the twin-casing collocation did not converge; the pipes sit too close to each other "
                      "or to the casing")


def _collocate(rp, d, rc, ki, kg, n):
    """(h_s, h_a) with *n* multipoles per pipe (collocated at 4n + 16 points on each pipe).

    Each pipe at z_p carries a line source and multipoles (r_p/(z − z_p))^k; the casing is
    satisfied exactly by their images at r_c²/z̄_p of strength σ (the circle theorem for two
    conductivities), so only the pipe surfaces are collocated.  The log terms are taken
    relative to the casing, so the casing's mean temperature is the constant (zero)."""
    sigma = (ki - kg) / (ki + kg)
    m = 4 * n + 16
    unit = np.exp(1j * np.linspace(0.0, 2 * math.pi, m, endpoint=False))
    centres = (d, -d)
    rows = []
    for zp_own in centres:
        z = zp_own + rp * unit
        cols = []
        for zp in centres:
            image = rc * rc - zp * z   # a² − z̄_p z (z_p real)
            cols.append(np.log(np.abs(z - zp) / rc) + sigma * np.log(np.abs(image) / (rc * rc)))
            for k in range(1, n + 1):
                f, g = (rp / (z - zp)) ** k, (rp * z / image) ** k
                cols.append((f + sigma * g).real)
                cols.append(-f.imag + sigma * g.imag)
        rows.append(np.array(cols).T)
    a = np.vstack(rows)
    b = np.zeros((2 * m, 2))   # the symmetric (1, 1) and the antisymmetric (1, −1) pipe temperatures
    b[:m, :] = 1.0
    b[m:, 0], b[m:, 1] = 1.0, -1.0
    sol, *_ = np.linalg.lstsq(a, b, rcond=None)
    c = -sol[0]   # q / (2π λ_i) of pipe 1 for a unit temperature, per problem
    if not (np.all(np.isfinite(c)) and np.all(c > 0)):
        from .solve import SolverError

        raise SolverError("the twin-casing multipole solution gave no finite positive heat flow")
    out = 1.0 / c
    return float(out[0]), float(out[1])


def first_order_factors(pipe_radius_m, half_spacing_m, casing_radius_m, k_insulation_w_mk, k_soil_w_mk):
    """(h_s, h_a) of the casing by the first-order multipole closed forms (Wallentén 1991, from
    memory; the symmetric one is Bennet, Claesson & Hellström's first-order borehole form)::

        h_s = ln(r_c²/(2D r_p)) + σ ln(r_c⁴/(r_c⁴ − D⁴))
              − (x − 2σ r_p D³/(r_c⁴ − D⁴))² / (1 + x² + σ (2 r_p r_c² D/(r_c⁴ − D⁴))²)
        h_a = ln(2D/r_p) + σ ln((r_c² + D²)/(r_c² − D²))
              − (x + 2σ r_p D r_c²/(r_c⁴ − D⁴))² / (1 − x² + 2σ r_p² r_c² (r_c⁴ + D⁴)/(r_c⁴ − D⁴)²)

    with x = r_p/(2D) and σ = (λ_i − λ_g)/(λ_i + λ_g)."""
    rp, d, rc = float(pipe_radius_m), float(half_spacing_m), float(casing_radius_m)
    ki, kg = float(k_insulation_w_mk), float(k_soil_w_mk)
    s, x, c4 = (ki - kg) / (ki + kg), rp / (2 * d), rc ** 4 - d ** 4
    hs = (math.log(rc ** 2 / (2 * d * rp)) + s * math.log(rc ** 4 / c4)
          - (x - 2 * s * rp * d ** 3 / c4) ** 2 / (1 + x ** 2 + s * (2 * rp * rc ** 2 * d / c4) ** 2))
    ha = (math.log(2 * d / rp) + s * math.log((rc ** 2 + d ** 2) / (rc ** 2 - d ** 2))
          - (x + 2 * s * rp * d * rc ** 2 / c4) ** 2 / (1 - x ** 2 + 2 * s * rp ** 2 * rc ** 2 * (rc ** 4 + d ** 4) / c4 ** 2))
    return hs, ha


@dataclass(frozen=True)
class TwinCasing:
    """Two pipes in one casing, solved (SI; heat flows per metre of trench, + out of the fluid)."""

    casing_diameter_m: float
    spacing_m: float
    pipe_diameter_m: float
    depth_m: float
    soil_k_w_mk: float
    ground_temp_c: float
    supply_temp_c: float
    return_temp_c: float
    insulation: str
    insulation_k_w_mk: float
    insulation_mean_temp_c: float
    sigma: float
    h_symmetric: float
    h_antisymmetric: float
    h_symmetric_first_order: float
    h_antisymmetric_first_order: float
    soil_resistance_mk_w: float
    pipe_resistance_mk_w: float
    symmetric_heat_flow_w_per_m: float
    antisymmetric_heat_flow_w_per_m: float
    supply_heat_flow_w_per_m: float
    return_heat_flow_w_per_m: float
    casing_temp_c: float
    method: str

    @property
    def heat_loss_w_per_m(self) -> float:
        """The heat the two fluids lose (the positive heat flows, added) [W/m]."""
        return sum(q for q in (self.supply_heat_flow_w_per_m, self.return_heat_flow_w_per_m) if q > 0)

    @property
    def heat_gain_w_per_m(self) -> float:
        """The heat a fluid colder than its surroundings gains (magnitudes of negative flows) [W/m]."""
        return sum(-q for q in (self.supply_heat_flow_w_per_m, self.return_heat_flow_w_per_m) if q < 0)

    def to_dict(self) -> dict:
        out = dict(self.__dict__)
        out["heat_loss_w_per_m"] = self.heat_loss_w_per_m
        out["heat_gain_w_per_m"] = self.heat_gain_w_per_m
        return out


METHOD = ("symmetric and antisymmetric parts (Wallentén 1991, from memory), each casing factor by the multipole method "
          "(Bennet, Claesson & Hellström 1987: line sources and multipoles at the pipes, their images in the casing) "
          "to convergence; the ground surface through the net flow, acosh(H/r_c)/(2π λ_soil); the jacket counted as "
          "insulation")


def solve_twin_casing(spec, casing_diameter_m: float, spacing_m: float, depth_m: float, soil_k_w_mk: float,
                      ground_temp_c: float, return_temp_c: float, insulation: str, sizes=None) -> TwinCasing:
    """Solve the supply (*spec*'s pipe and fluid) and a return at *return_temp_c* [°C] in one
    casing of outer diameter *casing_diameter_m* filled with *insulation* (a catalogue or user
    material), centres *spacing_m* apart, the casing centre at *depth_m* in soil of
    *soil_k_w_mk*, ground surface at *ground_temp_c*.  *sizes*: the pipe as a one-item list of
    catalogue sizes, where *spec* names none (a project's line)."""
    from .buried import check_soil_k
    from .catalog.materials import lookup_material
    from .physics.conduction import conductivity_of

    check_soil_k(soil_k_w_mk)
    if spec.layers:
        raise InputError("layers", "pipes in one casing take the casing's insulation; leave out the layers")
    pipe = spec.build_pipe(sizes)
    fluid = spec.build_fluid(pipe)
    od = float(np.ravel(pipe.outer_diameter_m)[0])
    wall = float(np.ravel(pipe.wall_m)[0])
    rp, rc, d = od / 2, float(casing_diameter_m) / 2, float(spacing_m) / 2
    if not (np.isfinite(rc) and rc > 0):
        raise InputError("casing_diameter_m", "the casing diameter must be greater than zero")
    check_geometry(rp, d, rc)
    if not float(depth_m) > rc:
        raise InputError("depth_m", f"the burial depth {float(depth_m):g} m (to the casing centre) must be more "
                                    f"than the casing radius {rc:g} m")
    material = lookup_material(insulation, "twin_casing")
    fit = conductivity_of(material)
    r_wall = math.log(rp / (rp - wall)) / (2 * math.pi * float(pipe.wall_conductivity_w_mk)) if wall > 0 else 0.0
    h_in = fluid.film_coefficient_w_m2k
    r_film = 0.0 if h_in is None else 1.0 / (float(np.ravel(h_in)[0]) * math.pi * (od - 2 * wall))
    r_pipe = r_wall + r_film
    t1 = float(np.ravel(fluid.temp_c)[0])
    t2, tg, kg = float(return_temp_c), float(ground_temp_c), float(soil_k_w_mk)
    r_soil = math.acosh(float(depth_m) / rc) / (2 * math.pi * kg)
    ts, ta = (t1 + t2) / 2 - tg, (t1 - t2) / 2
    mean = (t1 + t2 + 2 * tg) / 4
    for _ in range(50):   # k(T) at the mean insulation temperature: a contraction, a few passes
        ki = float(fit.conductivity(mean))
        hs, ha = casing_factors(rp, d, rc, ki, kg)
        qs = ts / (hs / (2 * math.pi * ki) + 2 * r_soil + r_pipe)
        qa = ta / (ha / (2 * math.pi * ki) + r_pipe)
        casing = tg + 2 * qs * r_soil
        pipes = (t1 + t2) / 2 - qs * r_pipe
        new = 0.5 * (pipes + casing)
        if abs(new - mean) < 1e-6:
            mean = new
            break
        mean = new
    ki = float(fit.conductivity(mean))
    hs, ha = casing_factors(rp, d, rc, ki, kg)
    qs = ts / (hs / (2 * math.pi * ki) + 2 * r_soil + r_pipe)
    qa = ta / (ha / (2 * math.pi * ki) + r_pipe)
    hs1, ha1 = first_order_factors(rp, d, rc, ki, kg)
    return TwinCasing(2 * rc, 2 * d, od, float(depth_m), kg, tg, t1, t2, material.name, ki, mean,
                      (ki - kg) / (ki + kg), hs, ha, hs1, ha1, r_soil, r_pipe, qs, qa, qs + qa, qs - qa,
                      tg + 2 * qs * r_soil, METHOD)
