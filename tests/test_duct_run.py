"""Air temperature along a duct run (pipeins.duct_run) against the closed-form exponential law."""

import math

import numpy as np
import pytest
from hypothesis import given, strategies as st

from pipeins import duct_run
from pipeins.errors import InputError
from pipeins.props.air import air_properties
from pipeins.units import parse_quantity

CP = 1006.0


def closed_form_c(t0, ta, ua, length, mdot, cp=CP):
    # T(L) = Ta + (T0 - Ta) exp(-UA L / (m cp)): the log-mean law of any heat-transfer text
    # (Incropera et al., 6th ed., Eq. 8.46b, constant external temperature; from memory)
    return ta + (t0 - ta) * math.exp(-ua * length / (mdot * cp))


@pytest.mark.parametrize("t0, ta, ua, length, mdot", [
    (14.0, 30.0, 0.8, 40.0, 0.6),     # cold supply air through a warm roof space (gain)
    (45.0, 5.0, 1.5, 120.0, 0.3),     # warm air through an unheated store (loss)
    (12.0, 35.0, 3.0, 60.0, 0.05),    # a small flow: about 3.6 relaxation lengths
    (50.0, -10.0, 0.2, 500.0, 2.0),   # a long outdoor run
])
def test_march_matches_the_exponential_law_within_001_k(t0, ta, ua, length, mdot):
    run = duct_run.temperature_along_duct(duct_run.fixed_coefficient(ua, ta), t0, mdot, length, ta,
                                          heat_capacity_j_kgk=CP)
    assert float(run.leaving_temp_c) == pytest.approx(closed_form_c(t0, ta, ua, length, mdot), abs=0.01)
    # the profile too, node by node
    for x, temp in zip(run.positions_m, run.air_temps_c):
        assert float(temp) == pytest.approx(closed_form_c(t0, ta, ua, float(x), mdot), abs=0.01)
    # energy: heat out of the air = m cp (T0 - TL)
    assert float(run.heat_flow_w) == pytest.approx(mdot * CP * (t0 - float(run.leaving_temp_c)), rel=1e-6)
    assert float(run.temp_change_k) == pytest.approx(float(run.leaving_temp_c) - t0)


def test_march_is_vectorised_over_cases():
    t0 = np.array([14.0, 45.0, 20.0])
    ta = np.array([30.0, 5.0, 20.0])
    ua = np.array([0.8, 1.5, 1.0])
    run = duct_run.temperature_along_duct(duct_run.fixed_coefficient(ua, ta), t0, 0.5, 50.0, ta,
                                          heat_capacity_j_kgk=CP)
    assert run.leaving_temp_c.shape == (3,)
    for i in range(3):
        assert run.leaving_temp_c[i] == pytest.approx(closed_form_c(t0[i], ta[i], ua[i], 50.0, 0.5), abs=0.01)
    assert run.leaving_temp_c[2] == 20.0  # no difference, no change


def test_table_heat_capacity_is_the_shipped_air_table():
    # with the table's cp the result lies within the cp spread of a run with cp fixed at the entry value
    run = duct_run.temperature_along_duct(duct_run.fixed_coefficient(0.8, 30.0), 14.0, 0.6, 40.0, 30.0)
    cp_entry = float(air_properties(14.0).heat_capacity_j_kgk)
    assert float(run.leaving_temp_c) == pytest.approx(closed_form_c(14.0, 30.0, 0.8, 40.0, 0.6, cp_entry), abs=0.01)


def test_mass_flow_from_volume_flow_and_cfm():
    rho = float(air_properties(14.0).density_kg_m3)
    assert float(duct_run.air_mass_flow_kg_s(parse_quantity("2000 m3/h", "flow"), 14.0)) == pytest.approx(2000 / 3600 * rho)
    # 1 cfm = 0.3048**3 / 60 m3/s (exact from the foot's definition; pint agrees)
    assert float(duct_run.air_mass_flow_kg_s(parse_quantity("1000 cfm", "flow"), 14.0)) == pytest.approx(
        1000 * 0.3048**3 / 60 * rho)
    assert float(duct_run.air_mass_flow_kg_s(parse_quantity("0.5 kg/s", "flow"), 14.0)) == 0.5
    # density scales with pressure (ideal gas)
    assert float(duct_run.air_mass_flow_kg_s(1.0, 14.0, 50_662.5)) == pytest.approx(rho / 2)


def test_flow_too_small_for_the_length_is_refused_naming_the_flow():
    # NTU = UA L / (m cp) = 3 * 60 / (0.02 * 1006) = 8.9 -> the air keeps 0.013 % of its difference
    with pytest.raises(InputError) as exc:
        duct_run.temperature_along_duct(duct_run.fixed_coefficient(3.0, 35.0), 12.0, 0.02, 60.0, 35.0,
                                        heat_capacity_j_kgk=CP)
    assert exc.value.name == "flow"
    expected_reach = math.log(100) * 0.02 * CP / 3.0  # 30.9 m: where 1 % of the difference is left
    assert exc.value.message.startswith("an air flow of 0.02 kg/s is too small for 60 m of duct: the air comes "
                                        "within 1 % of the surrounding temperature after about ")
    reached = float(exc.value.message.split("after about ")[1].split(" m;")[0])
    assert reached == pytest.approx(expected_reach, rel=0.01)
    # the same run is accepted when the caller asks for no such check
    run = duct_run.temperature_along_duct(duct_run.fixed_coefficient(3.0, 35.0), 12.0, 0.02, 60.0, 35.0,
                                          heat_capacity_j_kgk=CP, ambient_fraction=0)
    assert float(run.leaving_temp_c) == pytest.approx(closed_form_c(12.0, 35.0, 3.0, 60.0, 0.02), abs=0.01)


@pytest.mark.parametrize("kwargs, name", [
    (dict(mass_flow_kg_s=0.0), "flow"),
    (dict(length_m=-5.0), "length_m"),
    (dict(segments=0), "segments"),
])
def test_bad_run_input(kwargs, name):
    args = dict(heat_flow_w_per_m=duct_run.fixed_coefficient(1.0, 30.0), entering_temp_c=14.0, mass_flow_kg_s=0.5,
                length_m=40.0, ambient_temp_c=30.0)
    args.update(kwargs)
    with pytest.raises(InputError) as exc:
        duct_run.temperature_along_duct(**args)
    assert exc.value.name == name
    with pytest.raises(InputError):
        duct_run.fixed_coefficient(-1.0, 20.0)
    with pytest.raises(InputError):
        duct_run.air_mass_flow_kg_s(-1.0, 20.0)


@pytest.mark.parametrize("t0, ta, ua, mdot, change", [(14.0, 30.0, 0.8, 0.6, 1.0), (45.0, 5.0, 1.5, 0.3, 3.0),
                                                      (12.0, 35.0, 3.0, 0.05, 10.0)])
def test_max_length_and_required_coefficient_closed_form(t0, ta, ua, mdot, change):
    # inverted exponential law: L = -(m cp / UA) ln(1 - dT/(T0 - Ta)), UA = (m cp / L) ln(...)
    span = abs(t0 - ta)
    length = -(mdot * CP / ua) * math.log(1 - change / span)
    got = duct_run.max_length_m(duct_run.fixed_coefficient(ua, ta), t0, mdot, change, ta, heat_capacity_j_kgk=CP)
    assert float(got) == pytest.approx(length, rel=1e-9)
    needed = duct_run.required_coefficient_w_per_mk(t0, mdot, length, change, ta, heat_capacity_j_kgk=CP)
    assert float(needed) == pytest.approx(ua, rel=1e-9)
    # and the march over that length changes the air by the limit (0.01 K)
    run = duct_run.temperature_along_duct(duct_run.fixed_coefficient(ua, ta), t0, mdot, length, ta,
                                          heat_capacity_j_kgk=CP)
    assert abs(float(run.temp_change_k)) == pytest.approx(change, abs=0.01)


def test_max_length_with_a_curved_heat_flow_matches_the_march():
    # q' with radiation-like curvature: UA (T - Ta) (1 + 0.02 |T - Ta|); the quadrature in T and the
    # RK4 march are two independent integrations of the same law
    def q(temp_c):
        d = np.asarray(temp_c) - 30.0
        return 0.8 * d * (1 + 0.02 * np.abs(d))

    length = float(duct_run.max_length_m(q, 10.0, 0.4, 4.0, 30.0))
    run = duct_run.temperature_along_duct(q, 10.0, 0.4, length, 30.0, segments=40)
    assert float(run.temp_change_k) == pytest.approx(4.0, abs=0.01)


def test_limit_that_cannot_be_reached():
    # the surroundings are nearer than the allowed change: any length, any conductance passes
    assert math.isinf(float(duct_run.max_length_m(duct_run.fixed_coefficient(1.0, 20.0), 18.0, 0.5, 3.0, 20.0)))
    assert math.isinf(float(duct_run.required_coefficient_w_per_mk(18.0, 0.5, 30.0, 3.0, 20.0)))
    with pytest.raises(InputError) as exc:
        duct_run.max_length_m(duct_run.fixed_coefficient(1.0, 20.0), 10.0, 0.5, 0.0, 20.0)
    assert exc.value.name == "max_change_k"


@given(st.floats(-20, 60), st.floats(-20, 60), st.floats(0.05, 5.0), st.floats(0.05, 3.0), st.floats(1.0, 200.0))
def test_leaving_air_lies_between_entry_and_surroundings(t0, ta, ua, mdot, length):
    run = duct_run.temperature_along_duct(duct_run.fixed_coefficient(ua, ta), t0, mdot, length, ta,
                                          heat_capacity_j_kgk=CP, ambient_fraction=0, segments=5)
    low, high = min(t0, ta), max(t0, ta)
    assert low - 1e-9 <= float(run.leaving_temp_c) <= high + 1e-9
    assert float(run.leaving_temp_c) == pytest.approx(closed_form_c(t0, ta, ua, length, mdot), abs=0.01)


def test_round_duct_run_with_the_solver():
    # A round duct is one cylinder patch: 450 mm galvanised duct (24 ga), 50 mm wrap at 25 %
    # compression, supply air at 13 °C through a 32 °C plant space, inner film from the duct air.
    # The march (RK4 of full solves) and the temperature quadrature of max_length_m are two
    # independent integrations of the same q'(T); they must agree, and the energy must balance.
    from pipeins.catalog import ducts
    from pipeins.catalog.materials import lookup_material
    from pipeins.model import Fluid, Layer, Pipe, Surroundings
    from pipeins.physics.duct_inner import duct_inner_film
    from pipeins.solve import solve

    sheet = ducts.lookup_sheet("galvanised steel")
    wall = ducts.gauge_thickness_m(24)
    size = ducts.parse_duct_size("450mm")
    duct = Pipe(size.diameter_m + 2 * wall, wall, sheet.conductivity_w_mk)
    wrap = ducts.installed_wrap(0.050)
    layers = [Layer(lookup_material("k=0.040"), float(wrap.installed_thickness_m))]
    flow = parse_quantity("2500 m3/h", "flow")
    mdot = float(duct_run.air_mass_flow_kg_s(flow, 13.0))
    h_inner = float(duct_inner_film(size.diameter_m, None, 13.0, flow=flow).h_w_m2k)
    around = Surroundings(32.0)

    def q(temp_c):
        return solve(duct, layers, Fluid(temp_c, h_inner), around).heat_flow_w_per_m

    length = float(duct_run.max_length_m(q, 13.0, mdot, 0.5, 32.0))
    run = duct_run.temperature_along_duct(q, 13.0, mdot, length, 32.0)
    assert float(run.temp_change_k) == pytest.approx(0.5, abs=0.002)
    cp = float(air_properties(13.25).heat_capacity_j_kgk)
    assert float(run.heat_flow_w) == pytest.approx(-mdot * cp * 0.5, rel=2e-3)
    # by hand: R' = ln(526.4/451.4)/(2π·0.040) + 1/(≈7.5·π·0.526) + 1/(h_i·π·0.45) ≈ 0.61 + 0.08 + 0.07
    # m·K/W, so a gain of about 19 K / 0.76 = 25 W/m
    assert float(run.heat_flow_w_per_m[0]) == pytest.approx(-25.0, rel=0.1)
