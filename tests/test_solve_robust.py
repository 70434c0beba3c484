"""The solver always answers: near-ambient cases, the no-flow case, absurd coefficients.

Hand checks use the series-resistance sum of cylindrical shells, R = Σ ln(r₂/r₁)/(2πk)
(Incropera et al., *Fundamentals of Heat and Mass Transfer*, 6th ed., Eq. 3.28 and §3.3.1),
and the cross-flow film of ``ht.conv_external.Nu_cylinder_Churchill_Bernstein``.
"""

import math
import warnings

import numpy as np
import pytest

from pipeins.catalog.materials import lookup_material
from pipeins.errors import InputError
from pipeins.model import Fluid, Layer, Pipe, Surface, Surroundings
from pipeins.physics.conduction import conductivity_of
from pipeins.runs import temperature_along_run
from pipeins.solve import NO_FLOW_SPAN_K, solve

CALSIL = lookup_material("calcium silicate")
NPS36 = Pipe(0.914, 0.0191)  # NPS 36, 0.750 in wall (ASME B36.10M)
K040 = lookup_material("k=0.040")


def test_near_ambient_large_pipe_in_strong_wind_answers_on_the_command_line(run):
    # The reproduction of issue 9: this used to end in a SolverError traceback.
    code, out, err = run("check", "--pipe", "NPS 36", "--fluid-temp", "40.0001C", "--ambient-temp", "40C",
                         "--layer", "calcium silicate:178mm", "--wind", "18m/s")
    assert code == 0, err
    assert "Error" not in out + err


@pytest.mark.parametrize("delta_k", [1e-3, 1e-4, 1e-6, -1e-6])
def test_near_ambient_heat_flow_is_the_linear_limit(delta_k):
    # Near ΔT = 0 the network is linear: q = ΔT / (R_layer + 1/(A·(h_c + h_r))), with k of the
    # layer at 40 °C, h_r = 4εσT³ (Incropera Eq. 1.9 at Ts = Tsur) and h_c from Churchill and
    # Bernstein (ht), air properties at 40 °C from the shipped CoolProp table (tests/test_props.py).
    # Natural convection adds Nu_N = 0.36 in cube to Nu_F ~ 1500: below 1e-8, neglected.
    from ht.conv_external import Nu_cylinder_Churchill_Bernstein

    from pipeins.props.air import air_properties

    air = air_properties(40.0)
    d = 0.914 + 2 * 0.178
    re = 18.0 * d / float(air.kinematic_viscosity_m2_s)
    h_c = Nu_cylinder_Churchill_Bernstein(re, float(air.prandtl)) * float(air.conductivity_w_mk) / d
    h_r = 4 * 0.9 * 5.670374419e-8 * 313.15**3
    k = float(conductivity_of(CALSIL).conductivity(40.0))
    r_total = (math.log(0.457 / (0.457 - 0.0191)) / (2 * math.pi * 50.0) + math.log(0.635 / 0.457) / (2 * math.pi * k)
               + 1 / (math.pi * d * (h_c + h_r)))
    r = solve(NPS36, [Layer(CALSIL, 0.178)], Fluid(40.0 + delta_k), Surroundings(40.0, wind_speed_m_s=18.0))
    assert float(r.heat_flow) == pytest.approx(delta_k / r_total, rel=2e-3)
    assert np.all(np.isfinite(r.interface_temps_c))


def test_no_flow_case_is_exact():
    r = solve(NPS36, [Layer(CALSIL, 0.178)], Fluid(np.array([40.0, 40.0 + 0.5 * NO_FLOW_SPAN_K])),
              Surroundings(40.0, wind_speed_m_s=18.0))
    assert np.all(r.heat_flow == 0.0)
    assert np.all(r.interface_temps_c == r.inputs["fluid"].temp_c)
    assert r.residual_w_per_m == 0.0


def test_a_long_run_relaxing_to_ambient_answers():
    # Issue 9: water at 60 °C, 0.5 kg/s over 50 km in air at 40 °C used to hit the near-ambient
    # SolverError as the fluid approached the air.  Energy: ṁ·c_p·(T_in − T_out) = heat lost, with
    # c_p of water about 4180 J/(kg·K) at 40 to 60 °C (IAPWS-95 via iapws, within 0.3 %).
    from iapws import IAPWS95

    run = temperature_along_run(NPS36, [Layer(CALSIL, 0.178)], "water", 60.0, 0.5, 50_000.0,
                                Surroundings(40.0, wind_speed_m_s=18.0))
    assert float(run.outlet_temp_c) == pytest.approx(40.0, abs=1e-3)
    cp = IAPWS95(T=323.15, P=0.101325).cp * 1000.0
    assert float(run.heat_flow_w) == pytest.approx(0.5 * cp * 20.0, rel=3e-3)


def test_long_run_on_the_command_line(run):
    code, out, err = run("check", "--pipe", "NPS 36", "--fluid-temp", "60C", "--ambient-temp", "40C",
                         "--layer", "calcium silicate:178mm", "--wind", "18m/s", "--fluid", "water",
                         "--flow", "0.5kg/s", "--length", "50km")
    assert code == 0, err
    assert "outlet temperature" in out


def _hand_q(pipe, layers, delta_t, inner_h=None, outer_h=None):
    r0 = pipe.outer_diameter_m / 2 - pipe.wall_m
    radii = [r0, pipe.outer_diameter_m / 2]
    total = math.log(radii[1] / radii[0]) / (2 * math.pi * pipe.wall_conductivity_w_mk)
    for k, t in layers:
        radii.append(radii[-1] + t)
        total += math.log(radii[-1] / radii[-2]) / (2 * math.pi * k)
    if inner_h is not None:
        total += 1 / (inner_h * 2 * math.pi * r0)
    if outer_h is not None:
        total += 1 / (outer_h * 2 * math.pi * radii[-1])
    return delta_t / total


@pytest.mark.parametrize("outer_h", [1e9, 1e300])
def test_huge_outer_coefficient_puts_the_surface_at_the_air(outer_h):
    pipe = Pipe(0.0603, 0.0039)
    r = solve(pipe, [Layer(K040, 0.04)], Fluid(60.0), Surroundings(20.0), Surface(fixed_coefficient_w_m2k=outer_h))
    assert float(r.heat_flow) == pytest.approx(_hand_q(pipe, [(0.040, 0.04)], 40.0, outer_h=outer_h),
                                                       rel=1e-9)
    assert float(r.surface_temp_c) == pytest.approx(20.0, abs=1e-6)


def test_tiny_inner_coefficient_carries_almost_no_heat():
    pipe = Pipe(0.0603, 0.0039)
    r = solve(pipe, [Layer(K040, 0.04)], Fluid(60.0, 1e-300), Surroundings(20.0))
    want = _hand_q(pipe, [(0.040, 0.04)], 40.0, inner_h=1e-300)
    assert float(r.heat_flow) == pytest.approx(want, rel=1e-6)
    assert float(r.surface_temp_c) == pytest.approx(20.0, abs=1e-9)
    with pytest.raises(InputError, match="--inner-h"):
        solve(pipe, [Layer(K040, 0.04)], Fluid(60.0, 1e-320), Surroundings(20.0))


def test_kilometre_layer_and_beyond():
    pipe = Pipe(0.0603, 0.0039)
    r = solve(pipe, [Layer(K040, 1000.0)], Fluid(60.0), Surroundings(20.0))
    assert float(r.heat_flow) == pytest.approx(_hand_q(pipe, [(0.040, 1000.0)], 40.0), rel=1e-4)
    with pytest.raises(InputError, match="--layer"):
        solve(pipe, [Layer(K040, 1e300)], Fluid(60.0), Surroundings(20.0))


@pytest.mark.parametrize("surroundings", [
    Surroundings(20.0, orientation="vertical", height_m=1e300),
    Surroundings(20.0, pressure_pa=1e300),
])
def test_outer_film_overflow_is_a_clean_error(surroundings):
    with pytest.raises(InputError, match="outer film"):
        solve(Pipe(0.0603, 0.0039), [Layer(K040, 0.04)], Fluid(60.0), surroundings)


@pytest.mark.parametrize("surroundings,surface", [
    (Surroundings(20.0, wind_speed_m_s=1e300), Surface()),
    (Surroundings(20.0, orientation="vertical", height_m=1e-300), Surface()),
    (Surroundings(20.0, pressure_pa=1e-300), Surface(1e-300)),
    (Surroundings(-273.0), Surface(0.03)),
])
def test_extreme_but_computable_inputs_answer_without_warnings(surroundings, surface):
    with warnings.catch_warnings():
        warnings.simplefilter("error")
        r = solve(Pipe(0.0603, 0.0039), [Layer(lookup_material("mineral wool"), 0.04)], Fluid(600.0),
                  surroundings, surface)
    assert np.all(np.isfinite(r.interface_temps_c)) and np.isfinite(float(r.heat_flow))
    assert float(r.heat_flow) > 0
    assert r.iterations < 200


@pytest.mark.parametrize("wind", [0.0, 3.0])
def test_benchmark_grid_converges_in_a_few_evaluations(wind):
    # Not a timing: the iteration count of benchmarks/bench_solve.py's 10,000 cases, which sets
    # its speed (issue 11 §2).  Three evaluations of the outer film for most cases, a fourth for
    # some in still air; the old secant solver took 12 to 13.
    import sys
    from pathlib import Path

    sys.path.insert(0, str(Path(__file__).parents[1] / "benchmarks"))
    try:
        from bench_solve import build_cases
    finally:
        sys.path.pop(0)
    r = solve(*build_cases(wind))
    assert r.iterations <= 4
    assert np.all(np.isfinite(r.heat_flow))


def test_flat_top_face_at_the_mcadams_switch_answers():
    # McAdams' hot-top-face correlation changes form at Ra = 1e7 (0.54·Ra^1/4 below, 0.15·Ra^1/3
    # above: 30.4 against 32.3, a 6.4 % jump; McAdams, Heat Transmission, 3rd ed., 1954, as given
    # by Incropera et al., 6th ed., Eqs. 9.30-9.31).  q_out then jumps as Ts crosses it and G has
    # a sign change but no root; the old solver raised SolverError here.  The bracket closes on
    # the jump: the answer is finite and within the jump of either side's outer film.
    from pipeins.model import FlatWall
    from pipeins.physics import outer, radiation

    length = 0.14345751455925987
    r = solve(FlatWall(0.001, 50.0, length, "top"),
              [Layer(lookup_material("cellular glass"), 0.02133351875601975), Layer(K040, 0.12470283618319924)],
              Fluid(216.9283156494094), Surroundings(-23.35128536870348, surroundings_temp_c=3.988984181183433),
              Surface(0.7300339102588238))
    q, ts = float(r.heat_flow), float(r.surface_temp_c)
    assert np.isfinite(q) and q > 0
    flows = r.layer_heat_flows_w_per_m()
    assert np.allclose(flows, q, rtol=1e-9)
    h_c = outer.outer_convection_coefficient(ts, -23.35128536870348, length, 0.0, "top", length, 101325.0, "flat")
    h_r = radiation.radiation_coefficient_w_m2k(ts, 3.988984181183433, 0.7300339102588238)
    q_out = float(h_c * (ts + 23.35128536870348) + h_r * (ts - 3.988984181183433))
    assert abs(q_out - q) <= 0.07 * q
