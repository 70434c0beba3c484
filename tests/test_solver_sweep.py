"""Solver sweep (issue 9 §7): over the whole service range the solver answers, never NaN,
and its answer balances energy through every part of the network.

Range: fluid −196 to 650 °C, air −40 to 50 °C (radiant the same or its own −40 to 50 °C),
outside diameters 10 mm to 1.2 m, 0 to 3 layers of any catalogue material or a constant k,
wind 0 to 20 m/s, emittance 0.03 to 0.95, altitude 0 to 4,000 m, horizontal or vertical,
inner film on or off, and fluids within 1e-6 K of the air (exactly equal included).

Energy balance: the heat flow of the result must equal, to 1e-6 relative,
  * the inner film's h_i·A_i·(T_fluid − T_bore),
  * the wall's and each layer's, recomputed from the interface temperatures by the
    Kirchhoff integral (``Result.layer_heat_flows_w_per_m``),
  * the outer side's A·[h_c(Ts)·(Ts − Ta) + h_r(Ts)·(Ts − Tr)], with h_c and h_r evaluated
    afresh at the reported surface temperature.
Absolute floor, for flows near zero: what a temperature difference of 1e-10 K carries
across that part (1e-10 K / R for a resistance R; A·(h_c + h_r)·1e-10 K outside) —
interface temperatures up to 650 °C are only resolved to about 1e-13 K in floating point
and the k(T) inversion to about 3e-11 K.

The hypothesis part is derandomised (the same examples on every run); a seeded numpy
sweep adds 40,000 cases in four vectorised calls.
"""

from __future__ import annotations

import math

import numpy as np
from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st

from pipeins.catalog.materials import lookup_material
from pipeins.model import Fluid, Layer, Pipe, Surface, Surroundings, pressure_at_altitude_pa
from pipeins.physics import outer, radiation
from pipeins.solve import NO_FLOW_SPAN_K, solve

RTOL = 1e-6
FLOOR_K = 1e-10
MATERIALS = ("mineral wool", "glass wool", "calcium silicate", "cellular glass", "elastomeric foam",
             "polyisocyanurate foam", "phenolic foam", "polyethylene foam", "expanded perlite",
             "aerogel blanket", "mineral wool mattress", "k=0.040", "k=0.25")


def _check_balance(r, pipe, layers, fluid, surroundings, surface):
    q = np.asarray(r.heat_flow, dtype=float)
    temps = np.asarray(r.interface_temps_c, dtype=float)
    assert np.all(np.isfinite(q)) and np.all(np.isfinite(temps))
    assert np.all(np.isfinite(r.h_conv_w_m2k)) and np.all(np.isfinite(r.h_rad_w_m2k))

    od = np.asarray(pipe.outer_diameter_m, float)
    r_in = od / 2 - np.asarray(pipe.wall_m, float)
    radii = [r_in, od / 2]
    for layer in layers:
        radii.append(radii[-1] + np.asarray(layer.thickness_m, float))
    resistances = [np.log(radii[j + 1] / radii[j]) / (2 * math.pi) for j in range(len(radii) - 1)]

    def close(got, want, floor):
        assert np.all(np.abs(got - want) <= RTOL * np.abs(want) + floor), (
            f"max mismatch {np.max(np.abs(got - want)):.3e} W/m for q up to {np.max(np.abs(want)):.3e}")

    # Inner film (the bore sits at the fluid temperature without one).
    t_fluid = np.asarray(fluid.temp_c, float)
    if fluid.film_coefficient_w_m2k is None:
        assert np.all(temps[0] == t_fluid)
    else:
        conductance = np.asarray(fluid.film_coefficient_w_m2k, float) * 2 * math.pi * r_in
        close((t_fluid - temps[0]) * conductance, q, FLOOR_K * conductance)

    # Wall and layers, from the interface temperatures (Kirchhoff integral of each k(T)).
    flows = r.layer_heat_flows_w_per_m()
    k_wall = np.asarray(pipe.wall_conductivity_w_mk, float)
    close(flows[0], q, FLOOR_K * k_wall / resistances[0])
    for j, layer in enumerate(layers):
        k_max = max(p[1] for p in layer.material.points) * 3.0  # k(T) stays below 3× its largest point
        close(flows[j + 1], q, FLOOR_K * k_max / resistances[j + 1])

    # Outer side at the reported surface temperature.
    ts = np.asarray(r.surface_temp_c, float)
    air = np.asarray(surroundings.air_temp_c, float)
    rad = np.asarray(surroundings.radiant_temp_c, float)
    height = surroundings.height_m if surroundings.orientation == "vertical" else None
    h_c = outer.outer_convection_coefficient(ts, air, 2 * radii[-1], surroundings.wind_speed_m_s,
                                             surroundings.orientation, height, surroundings.pressure_pa)
    h_r = radiation.radiation_coefficient_w_m2k(ts, rad, surface.emittance)
    area = 2 * math.pi * radii[-1]
    q_out = area * (h_c * (ts - air) + h_r * (ts - rad))
    # Temperatures within NO_FLOW_SPAN_K of each other are the exact no-flow case (q = 0), so
    # the outer side may carry what that span drives across the film.
    close(q_out, q, (FLOOR_K + NO_FLOW_SPAN_K) * area * (h_c + h_r))


temperature_near = st.one_of(st.just(0.0), st.floats(-1e-6, 1e-6))


@st.composite
def cases(draw):
    air = draw(st.floats(-40.0, 50.0))
    if draw(st.integers(0, 3)) == 0:
        fluid = air + draw(temperature_near)
    else:
        fluid = draw(st.floats(-196.0, 650.0))
    radiant = draw(st.one_of(st.none(), st.floats(-40.0, 50.0)))
    od = draw(st.floats(0.010, 1.2))
    wall = od * draw(st.floats(0.02, 0.2))
    n_layers = draw(st.integers(0, 3))
    layers = [Layer(lookup_material(draw(st.sampled_from(MATERIALS))), draw(st.floats(0.005, 0.25)))
              for _ in range(n_layers)]
    vertical = draw(st.booleans())
    surroundings = Surroundings(
        air, surroundings_temp_c=radiant, wind_speed_m_s=draw(st.one_of(st.just(0.0), st.floats(0.0, 20.0))),
        pressure_pa=float(pressure_at_altitude_pa(draw(st.floats(0.0, 4000.0)))),
        orientation="vertical" if vertical else "horizontal",
        height_m=draw(st.floats(0.3, 40.0)) if vertical else None)
    inner_h = draw(st.one_of(st.none(), st.floats(10.0, 20_000.0)))
    return (Pipe(od, wall, draw(st.sampled_from((16.0, 50.0, 380.0)))), layers, Fluid(fluid, inner_h),
            surroundings, Surface(draw(st.floats(0.03, 0.95))))


@settings(max_examples=700, deadline=None, derandomize=True, suppress_health_check=[HealthCheck.too_slow])
@given(cases())
def test_every_case_answers_and_balances(args):
    r = solve(*args)
    _check_balance(r, *args)


def test_seeded_vectorised_sweep_balances():
    rng = np.random.default_rng(20261202)
    n = 10_000
    for config in ((), ("mineral wool",), ("calcium silicate", "glass wool"),
                   ("cellular glass", "elastomeric foam", "k=0.040")):
        air = rng.uniform(-40.0, 50.0, n)
        fluid = np.where(rng.random(n) < 0.2, air + rng.uniform(-1e-6, 1e-6, n), rng.uniform(-196.0, 650.0, n))
        od = np.exp(rng.uniform(math.log(0.010), math.log(1.2), n))
        layers = [Layer(lookup_material(m), rng.uniform(0.005, 0.25, n)) for m in config]
        args = (Pipe(od, od * rng.uniform(0.02, 0.2, n)), layers,
                Fluid(fluid, np.where(rng.random(n) < 0.5, rng.uniform(10.0, 20_000.0, n), 1e9)),
                Surroundings(air, surroundings_temp_c=rng.uniform(-40.0, 50.0, n),
                             wind_speed_m_s=np.where(rng.random(n) < 0.3, 0.0, rng.uniform(0.0, 20.0, n)),
                             pressure_pa=pressure_at_altitude_pa(rng.uniform(0.0, 4000.0, n))),
                Surface(rng.uniform(0.03, 0.95, n)))
        r = solve(*args)
        assert r.iterations < 50
        _check_balance(r, *args)


def test_seeded_flat_faces_answer_and_balance():
    # Duct faces: a vertical side face balances like a pipe.  Top and bottom faces use McAdams'
    # horizontal-plate forms, whose enhanced case changes form at Ra = 1e7 without matching (a
    # 6.4 % jump in h_c; see tests/test_solve_robust.py): there the outer side is checked to 7 % of
    # its convective part, the conduction side exactly as elsewhere.
    from pipeins.model import FlatWall

    rng = np.random.default_rng(20261203)
    n = 5000
    for face in ("vertical", "top", "bottom"):
        for config in ((), ("mineral wool",), ("cellular glass", "k=0.040")):
            air = rng.uniform(-40.0, 50.0, n)
            fluid = np.where(rng.random(n) < 0.2, air + rng.uniform(-1e-6, 1e-6, n), rng.uniform(-196.0, 650.0, n))
            length = rng.uniform(0.05, 5.0, n)
            rad = rng.uniform(-40.0, 50.0, n)
            wind = np.where(rng.random(n) < 0.5, 0.0, rng.uniform(0.0, 20.0, n))
            eps = rng.uniform(0.03, 0.95, n)
            layers = [Layer(lookup_material(m), rng.uniform(0.005, 0.25, n)) for m in config]
            r = solve(FlatWall(0.001, 50.0, length, face), layers, Fluid(fluid),
                      Surroundings(air, surroundings_temp_c=rad, wind_speed_m_s=wind), Surface(eps))
            q, ts = r.heat_flow, r.surface_temp_c
            assert np.all(np.isfinite(q)) and np.all(np.isfinite(r.interface_temps_c))
            assert r.iterations < 60
            for j, flow in enumerate(r.layer_heat_flows_w_per_m()):
                s = 0.001 / 50.0 if j == 0 else layers[j - 1].thickness_m
                k = 50.0 if j == 0 else max(p[1] for p in layers[j - 1].material.points) * 3.0
                assert np.all(np.abs(flow - q) <= RTOL * np.abs(q) + FLOOR_K * k / s)
            h_c = outer.outer_convection_coefficient(ts, air, length, wind, face, length, 101325.0, "flat")
            h_r = radiation.radiation_coefficient_w_m2k(ts, rad, eps)
            q_out = h_c * (ts - air) + h_r * (ts - rad)
            jump = 0.0 if face == "vertical" else 0.07 * np.abs(h_c * (ts - air))  # the jump is in h_c only
            allowed = RTOL * np.abs(q) + jump + FLOOR_K * (h_c + h_r)
            assert np.all(np.abs(q_out - q) <= allowed)
