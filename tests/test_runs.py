"""The run model against closed-form solutions, IAPWS steam tables and energy balances."""

import math

import iapws
import numpy as np
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from pipeins.catalog.materials import lookup_material
from pipeins.errors import InputError
from pipeins.line import LineSpec
from pipeins.model import Fluid, Layer, Pipe, Surface, Surroundings
from pipeins.reports.extras import run_extras
from pipeins.reports.notes import render
from pipeins.runs import RunResult, TempChange, condensate_kg_per_h, mass_flow_kg_s, temperature_along_run
from pipeins.sizing import SizingProblem, size
from pipeins.units import Flow

K004 = lookup_material("k=0.04")
PIPE = Pipe(0.0603, 0.0039, 50.0)  # NPS 2 schedule 40 dimensions, wall k 50 W/(m·K)
ATM_MPA = 0.101325


def _resistance_w(pipe, thickness_m, k, h_in, h_out):
    """R' [m·K/W] of film + wall + layer + outer film (cylindrical layers in series)."""
    r_in, r_o = pipe.outer_diameter_m / 2 - pipe.wall_m, pipe.outer_diameter_m / 2
    r_s = r_o + thickness_m
    return (1 / (h_in * 2 * math.pi * r_in) + math.log(r_o / r_in) / (2 * math.pi * pipe.wall_conductivity_w_mk)
            + math.log(r_s / r_o) / (2 * math.pi * k) + 1 / (h_out * 2 * math.pi * r_s))


def _cp_iapws95_j_kgk(temp_c):
    return iapws.IAPWS95(T=temp_c + 273.15, P=ATM_MPA).cp * 1e3


@pytest.mark.parametrize("length_m, mass_flow", [
    pytest.param(100.0, 0.05, id="Incropera-6ed-Eq8.46-40to35C"),
    pytest.param(5000.0, 0.05, id="Incropera-6ed-Eq8.46-long-run-near-ambient"),
])
def test_outlet_matches_constant_conductance_exponential(length_m, mass_flow):
    # Incropera et al., Fundamentals of Heat and Mass Transfer, 6th ed., §8.3, Eq. 8.46
    # (constant overall conductance, from memory): T_o = T_a + (T_i − T_a) exp(−L / (R' ṁ c_p)).
    # Water 40 °C -> about 35 °C: c_p varies < 0.05 % over the range; c_p from IAPWS-95 (iapws)
    # at the mean temperature.
    h_in, h_out, air = 500.0, 10.0, 0.0
    r = _resistance_w(PIPE, 0.03, 0.04, h_in, h_out)
    run = temperature_along_run(PIPE, [Layer(K004, 0.03)], "water", 40.0, mass_flow, length_m,
                                Surroundings(air), Surface(fixed_coefficient_w_m2k=h_out), inner_h_w_m2k=h_in)
    guess = air + 40.0 * math.exp(-length_m / (r * mass_flow * 4180.0))
    cp = _cp_iapws95_j_kgk(0.5 * (40.0 + guess))
    expected = air + (40.0 - air) * math.exp(-length_m / (r * mass_flow * cp))
    assert float(run.outlet_temp_c) == pytest.approx(expected, abs=0.01)  # Incropera Eq. 8.46, 0.01 K


def test_result_shapes_broadcast_over_cases():
    # common practice (API contract): nodes along axis 0, cases after it
    inlet = np.array([60.0, 80.0, 90.0])
    flows = np.array([[0.2], [0.5]])
    run = temperature_along_run(PIPE, [Layer(K004, 0.04)], "water", inlet, flows, 50.0,
                                Surroundings(5.0), Surface(), segments=4)
    assert isinstance(run, RunResult)
    assert run.positions_m.shape == (5,)
    assert run.fluid_temps_c.shape == (5, 2, 3)
    assert run.heat_flow_w_per_m.shape == (5, 2, 3)
    assert run.outlet_temp_c.shape == (2, 3)
    assert run.positions_m[-1] == 50.0
    # each case equals its own scalar run (vectorisation changes nothing)
    one = temperature_along_run(PIPE, [Layer(K004, 0.04)], "water", 80.0, 0.2, 50.0, Surroundings(5.0),
                                Surface(), segments=4)
    assert float(run.outlet_temp_c[0, 1]) == pytest.approx(float(one.outlet_temp_c), abs=1e-9)


@settings(max_examples=8, deadline=None)
@given(inlet=st.floats(20.0, 150.0), air=st.floats(-20.0, 35.0), flow=st.floats(0.02, 2.0),
       length=st.floats(5.0, 400.0))
def test_energy_balance_enthalpy_equals_heat_flow(inlet, air, flow, length):
    # Energy balance: ṁ·(h(T_in) − h(T_out)) = ∫q' dx; enthalpy of liquid water from
    # IAPWS-95 (iapws) at 0.5 MPa (liquid up to 151 °C), within 0.1 %.
    run = temperature_along_run(PIPE, [Layer(K004, 0.025)], "water", inlet, flow, length,
                                Surroundings(air, wind_speed_m_s=2.0), Surface(), segments=8)
    out = float(run.outlet_temp_c)
    if abs(inlet - out) < 0.05:
        return  # a change too small to resolve through the enthalpy table
    dh = (iapws.IAPWS95(T=inlet + 273.15, P=0.5).h - iapws.IAPWS95(T=out + 273.15, P=0.5).h) * 1e3
    assert float(run.heat_flow_w) == pytest.approx(flow * dh, rel=1e-3)  # IAPWS-95 enthalpy, 0.1 %


@settings(max_examples=8, deadline=None)
@given(thin=st.floats(0.01, 0.1), extra=st.floats(0.002, 0.1), inlet=st.floats(30.0, 120.0))
def test_more_insulation_never_larger_change(thin, extra, inlet):
    # Physical invariant beyond the critical radius (r_c = k/h ≈ 4 mm here < pipe radius)
    run = temperature_along_run(PIPE, [Layer(K004, np.array([thin, thin + extra]))], "water", inlet, 0.1,
                                300.0, Surroundings(0.0), Surface(), segments=5)
    change = np.abs(inlet - run.outlet_temp_c)
    assert change[1] <= change[0] + 1e-9


@pytest.mark.parametrize("pressure_pa", [
    pytest.param(1.0e5, id="IAPWS-IF97-1bar"),
    pytest.param(4.0e5, id="IAPWS-IF97-4bar"),
    pytest.param(1.0e6, id="IAPWS-IF97-10bar"),
    pytest.param(4.0e6, id="IAPWS-IF97-40bar"),
])
def test_condensate_uses_iapws_latent_heat(pressure_pa):
    p_mpa = pressure_pa / 1e6
    h_fg = (iapws.IAPWS97(P=p_mpa, x=1).h - iapws.IAPWS97(P=p_mpa, x=0).h) * 1e3
    expected = 1000.0 / h_fg * 3600.0
    assert float(condensate_kg_per_h(1000.0, pressure_pa)) == pytest.approx(expected, rel=1e-3)  # IAPWS-IF97


def test_condensate_per_metre_and_per_run_scale():
    # common practice: the same formula per metre (W/m -> kg/(h·m)) and per run (W -> kg/h)
    per_m = condensate_kg_per_h(np.array([50.0, 100.0]), 1.0e6)
    assert per_m[1] == pytest.approx(2 * per_m[0])
    assert float(condensate_kg_per_h(50.0 * 30, 1.0e6)) == pytest.approx(30 * per_m[0])


def test_mass_flow_from_volume_uses_density():
    # IAPWS-95 (iapws) density of water at 60 °C, 1 atm
    rho = iapws.IAPWS95(T=333.15, P=ATM_MPA).rho
    m = mass_flow_kg_s(Flow(2.0 / 3600, "volume"), "water", 60.0)
    assert float(m) == pytest.approx(rho * 2.0 / 3600, rel=1e-4)  # IAPWS-95 density, 4 digits
    assert float(mass_flow_kg_s(Flow(1.5, "mass"), "water", 60.0)) == 1.5


def test_error_messages():
    layers, air = [Layer(K004, 0.03)], Surroundings(0.0)
    with pytest.raises(InputError) as err:
        temperature_along_run(PIPE, layers, "water", 40.0, 0.0, 10.0, air)
    assert str(err.value) == "--flow: flow must be greater than zero"
    with pytest.raises(InputError) as err:
        temperature_along_run(PIPE, layers, "water", 40.0, 1.0, -5.0, air)
    assert str(err.value) == "--length: run length must be greater than zero"
    with pytest.raises(InputError) as err:
        mass_flow_kg_s(Flow(-1.0, "volume"), "water", 20.0)
    assert str(err.value) == "--flow: flow must be greater than zero"


def test_freezing_point_warning_when_fluid_cools_to_zero():
    # Physical: water at 2 °C, tiny flow, bare-ish pipe in −20 °C air reaches 0 °C
    run = temperature_along_run(PIPE, [Layer(K004, 0.005)], "water", 2.0, 0.001, 500.0,
                                Surroundings(-20.0), Surface(), segments=5)
    freezes = [n for n in run.notes if n.code == "run.freezes"]
    assert len(freezes) == 1 and freezes[0].value("freeze_c") == pytest.approx(0.0, abs=0.5)
    assert "freezing point" in render(freezes[0], "si")
    assert float(run.outlet_temp_c) >= -20.0 - 1e-9


def _problem(fluid_temp_c=70.0, air_c=0.0):
    return SizingProblem(pipe=Pipe(np.array([[0.0603]]), 0.0039), fixed_layers=[], material=K004,
                         fluid=Fluid(fluid_temp_c, None, "water"), surroundings=Surroundings(air_c),
                         surface=Surface(fixed_coefficient_w_m2k=10.0))


def test_temp_change_criterion_sizes_to_the_closed_form():
    # Incropera et al., 6th ed., §8.3, Eq. 8.46 (from memory) solved for the resistance:
    # R' = L / (ṁ c_p ln((T_i − T_a)/(T_o − T_a))), then the layer thickness that gives that R'
    # (fixed outer h 10 W/(m²·K), no inner film); c_p from IAPWS-95 (iapws) at 68.5 °C.
    from scipy.optimize import brentq

    crit = TempChange(3.0, "water", 0.2, 100.0, segments=5)
    problem = _problem()
    outcome = size(problem, [crit], [0.02, 0.03, 0.04, 0.05, 0.06, 0.08, 0.1])
    need = float(outcome.criteria[0].required_m[0])
    target = 100.0 / (0.2 * _cp_iapws95_j_kgk(68.5) * math.log(70.0 / 67.0))
    pipe = Pipe(0.0603, 0.0039)
    expected = brentq(lambda t: _resistance_w(pipe, t, 0.04, 1e12, 10.0) - target, 1e-4, 0.5)
    assert need == pytest.approx(expected, abs=5e-5)  # Incropera Eq. 8.46; search step 0.01 mm


def test_temp_change_margin_and_miss_text():
    # common practice (wording contract)
    crit = TempChange(5.0, "water", Flow(0.1 / 60, "volume"), 120.0, segments=4)
    problem = _problem()
    t = np.array([[0.0, 0.02, 0.1]])
    margin = crit.margin(problem, problem.solve(t), t)
    assert margin.shape == (1, 3)
    assert margin[0, 0] < margin[0, 1] < margin[0, 2]
    assert crit.key == "temp_change" and crit.label == "temperature change along the run"
    assert crit.miss(-2.3, 0.2) == ("temperature change cannot be met: with 200 mm the fluid still changes by "
                                    "7.3 K over 120 m, 2.3 K more than the 5 K limit")


def test_run_extras_liquid_steam_and_freeze():
    # common practice (report contract); numbers cross-checked against the library functions
    spec = LineSpec(pipe="NPS 2", layers=(("k=0.04", 0.03),), fluid_temp_c=60.0, fluid="water",
                    flow=Flow(1.0 / 3600, "volume"), air_temp_c=-10.0, length_m=80.0)
    rows, data, warnings = run_extras(spec, spec.solve(), "si")
    assert {"outlet_temp_c", "heat_flow_w", "temp_change_k", "freeze_start_h"} <= set(data)
    assert data["temp_change_k"] < 0
    assert data["heat_flow_w"] == pytest.approx(
        data["mass_flow_kg_s"] * 4184 * -data["temp_change_k"], rel=0.01)  # energy balance, c_p ≈ 4.18 kJ/(kg·K)
    assert all(len(r) == 2 for r in rows)

    steam = LineSpec(pipe="NPS 2", layers=(("k=0.04", 0.05),), steam_pressure_pa=1.0e6, air_temp_c=20.0,
                     length_m=50.0)
    result = steam.solve()
    rows, data, _ = run_extras(steam, result, "us")
    q = float(result.heat_flow_w_per_m)
    assert data["condensate_kg_per_h_per_m"] == pytest.approx(float(condensate_kg_per_h(q, 1.0e6)))
    assert data["condensate_kg_per_h"] == pytest.approx(50.0 * data["condensate_kg_per_h_per_m"])
    assert data["heat_flow_w"] == pytest.approx(50.0 * q)
    assert "freeze_start_h" not in data

    plain = LineSpec(pipe="NPS 2", layers=(("k=0.04", 0.05),), fluid_temp_c=60.0, air_temp_c=20.0)
    assert run_extras(plain, plain.solve(), "si") == ([], {}, [])
