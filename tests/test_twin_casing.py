"""Twin pipes in one casing (issue 13 §3, pipeins.twin_casing): the multipole casing factors
against exact and published forms, the limits, and the command line.

Sources named beside each check:
- two cylinders in one infinite medium: ``ht.conduction.S_isothermal_pipe_to_isothermal_pipe``
  (the exact shape factor 2π/acosh((4W² − D1² − D2²)/(2 D1 D2)));
- the first-order multipole borehole resistance of Bennet, Claesson & Hellström (1987) in the
  form Javed & Spitler (2016) give it (from memory), for the symmetric problem;
- Wallentén's (1991) first-order closed forms for twin pipes (from memory);
- two pipes in one homogeneous trench: line sources and their images (method of images).
"""

import json
import math

import ht.conduction as ht_conduction
import pytest

from pipeins.buried import mutual_resistance_mk_w, twin_heat_flows
from pipeins.twin_casing import casing_factors, first_order_factors


@pytest.mark.parametrize("rp, half", [(0.03015, 0.04015), (0.03, 0.07), (0.0169, 0.025), (0.05715, 0.0715)])
def test_one_conductivity_is_two_cylinders_in_one_medium(rp, half):
    # λ_i = λ_g: the casing is not there; the antisymmetric problem is two isothermal cylinders at
    # ±T_a in an infinite medium, q = k·S·2T_a = 2π k T_a / h_a, so h_a = π / S (per metre).
    s = ht_conduction.S_isothermal_pipe_to_isothermal_pipe(2 * rp, 2 * rp, 2 * half, 1.0)
    _, ha = casing_factors(rp, half, 0.121 if half < 0.06 else 0.2, 1.0, 1.0)
    assert ha == pytest.approx(math.pi / s, rel=1e-8)


def _javed_spitler_rb(rp, xc, rb, kb, k, beta=0.0):
    """First-order multipole borehole resistance (Bennet, Claesson & Hellström 1987; the form of
    Javed & Spitler 2016, from memory): two pipes at ±xc in a borehole of radius rb, grout kb,
    ground k, pipe resistance β = 2π kb R_p; R_b from the fluid to the borehole wall's mean."""
    sigma = (kb - k) / (kb + k)
    p = rp ** 2 / (4 * xc ** 2)
    c4 = rb ** 4 - xc ** 4
    return (1 / (4 * math.pi * kb)) * (
        beta + math.log(rb / rp) + math.log(rb / (2 * xc)) + sigma * math.log(rb ** 4 / c4)
        - p * (1 - 4 * sigma * xc ** 4 / c4) ** 2
        / ((1 + beta) / (1 - beta) + p * (1 + 16 * sigma * rb ** 4 * xc ** 4 / c4 ** 2)))


@pytest.mark.parametrize("rp, half, rc, ki, kg", [(0.03015, 0.06, 0.121, 0.027, 1.5), (0.02, 0.1, 0.2, 0.03, 0.09),
                                                  (0.03, 0.07, 0.15, 0.027, 1.0)])
def test_symmetric_factor_against_the_first_order_borehole_form(rp, half, rc, ki, kg):
    # symmetric: both pipes at T, 2q to the casing's mean temperature: T = q·h_s/(2π λ_i) = 2q·R_b,
    # so h_s = 4π λ_i R_b; the closed form is the same expression (exact), the multipole solution
    # within the first order's accuracy (a fraction of a per cent at these spacings)
    rb = _javed_spitler_rb(rp, half, rc, ki, kg)
    hs1, _ = first_order_factors(rp, half, rc, ki, kg)
    assert hs1 == pytest.approx(4 * math.pi * ki * rb, rel=1e-12)
    hs, _ = casing_factors(rp, half, rc, ki, kg)
    assert hs == pytest.approx(hs1, rel=4e-3)


def test_closed_forms_approach_the_multipole_solution_as_the_pipes_shrink():
    # Wallentén's first-order forms (from memory): their error falls fast as r_p/(2D) -> 0
    rc, half, ki, kg = 0.2, 0.09, 0.027, 1.5
    errors = []
    for rp in (0.06, 0.04, 0.02, 0.01):
        hs, ha = casing_factors(rp, half, rc, ki, kg)
        hs1, ha1 = first_order_factors(rp, half, rc, ki, kg)
        errors.append((abs(hs1 / hs - 1), abs(ha1 / ha - 1)))
    for (s0, a0), (s1, a1) in zip(errors, errors[1:]):
        assert s1 < s0 and a1 < a0
    assert errors[-1][0] < 1e-4 and errors[-1][1] < 1e-4


def test_one_medium_twin_casing_is_two_pipes_in_one_trench():
    # λ_i = λ_g = k and small pipes: the casing model and the two-pipes-in-one-trench model (line
    # sources and their images in the ground surface, pipeins.buried) describe the same two cylinders
    # in one semi-infinite medium.  The casing model takes the ground surface through the net flow
    # only, so the two agree to about (E/2H)² (E the spacing, H the depth), better with depth.
    k, rp, rc, t1, t2 = 1.2, 0.01, 0.4, 60.0, 30.0
    for depth in (2.0, 5.0, 20.0):
        for half in (0.15, 0.3):
            hs, ha = casing_factors(rp, half, rc, k, k)
            r_g = math.acosh(depth / rc) / (2 * math.pi * k)
            qs = ((t1 + t2) / 2) / (hs / (2 * math.pi * k) + 2 * r_g)
            qa = ((t1 - t2) / 2) / (ha / (2 * math.pi * k))
            r_own = math.acosh(depth / rp) / (2 * math.pi * k)   # one buried cylinder (Incropera & DeWitt, 6th ed., Table 4.1, case 2, from memory)
            q1, q2 = twin_heat_flows((0.0, 0.0), r_own, float(mutual_resistance_mk_w(depth, 2 * half, k)), (t1, t2))
            tol = 2 * (2 * half / (2 * depth)) ** 2 + 5e-4
            assert qs == pytest.approx((q1 + q2) / 2, rel=tol)
            assert qa == pytest.approx((q1 - q2) / 2, rel=tol)


BASE = ("check", "--pipe", "DN50", "--fluid-temp", "80C", "--buried", "0.8m", "--soil", "moist sand",
        "--ground-temp", "8C", "--twin-casing", "250mm", "--casing-insulation", "polyisocyanurate foam",
        "--twin-spacing", "80mm", "--return-temp", "45C")


def test_cli_twin_casing_both_flows_apart(run):
    code, out, err = run(*BASE, "--format", "json")
    assert code == 0, err
    data = json.loads(out)
    twin = data["twin_casing"]
    q1, q2 = twin["supply_heat_flow_w_per_m"], twin["return_heat_flow_w_per_m"]
    assert q1 > q2 > 0 and twin["heat_loss_w_per_m"] == pytest.approx(q1 + q2, rel=1e-12)
    assert twin["heat_gain_w_per_m"] == 0.0
    # hand series calculation from the reported factors and resistances
    ki, rg, rp = twin["insulation_k_w_mk"], twin["soil_resistance_mk_w"], twin["pipe_resistance_mk_w"]
    ts, ta = (80.0 + 45.0) / 2 - 8.0, (80.0 - 45.0) / 2
    qs = ts / (twin["h_symmetric"] / (2 * math.pi * ki) + 2 * rg + rp)
    qa = ta / (twin["h_antisymmetric"] / (2 * math.pi * ki) + rp)
    assert (q1, q2) == pytest.approx((qs + qa, qs - qa), rel=1e-12)
    # the soil resistance of the casing under the ground surface (Incropera & DeWitt, 6th ed., Table 4.1, case 2, from memory; ht)
    s = ht_conduction.S_isothermal_pipe_to_plane(0.25, 0.8, 1.0)
    assert rg == pytest.approx(1 / (s * 1.5), rel=1e-9)
    # the return cooler than the ground would gain heat: reported as a gain, never netted
    code, out, err = run(*BASE[:-1], "5C", "--format", "json")
    twin = json.loads(out)["twin_casing"]
    assert twin["return_heat_flow_w_per_m"] < 0
    assert twin["heat_gain_w_per_m"] == pytest.approx(-twin["return_heat_flow_w_per_m"], rel=1e-12)
    assert twin["heat_loss_w_per_m"] == pytest.approx(twin["supply_heat_flow_w_per_m"], rel=1e-12)


def test_cli_twin_casing_equal_temperatures_share_the_loss(run):
    code, out, err = run(*BASE[:-1], "80C", "--format", "json")
    twin = json.loads(out)["twin_casing"]
    assert twin["supply_heat_flow_w_per_m"] == pytest.approx(twin["return_heat_flow_w_per_m"], rel=1e-12)
    assert twin["antisymmetric_heat_flow_w_per_m"] == 0.0


def test_cli_twin_casing_text_and_us(run):
    code, out, err = run(*BASE)
    assert code == 0 and "Twin pipes in one casing" in out and "heat lost by the pair" in out
    code, out, err = run(*BASE, "--units", "us")
    assert code == 0 and "Btu/(h·ft)" in out


@pytest.mark.parametrize("extra, error", [
    (("--twin-spacing", "60mm"), "Error: --twin-spacing: the centres must be more than a pipe diameter apart "
                                 "(60.3 mm) in the casing"),
    (("--twin-spacing", "190mm"), "Error: --twin-spacing: the pipes must fit inside the casing: half the spacing "
                                  "plus the pipe radius (125.2 mm) is not less than the casing radius (125.0 mm)"),
    (("--layer", "mineral wool:50mm"), "Error: --layer: pipes in one casing take the casing's insulation "
                                       "(--casing-insulation); leave out --layer"),
    (("--casing-insulation", "moon dust"), None),
])
def test_cli_twin_casing_bad_input(run, extra, error):
    args = list(BASE)
    if extra[0] in args:
        i = args.index(extra[0])
        args[i + 1] = extra[1]
    else:
        args += list(extra)
    code, out, err = run(*args)
    assert code == 2 and out == ""
    if error is None:
        assert err.startswith('Error: --casing-insulation: unknown material "moon dust"')
    else:
        assert err.strip() == error


def test_cli_twin_casing_needs_its_insulation(run):
    args = [a for a in BASE if a not in ("--casing-insulation", "polyisocyanurate foam")]
    code, out, err = run(*args)
    assert code == 2 and err.strip() == ('Error: --casing-insulation: a twin casing needs its insulation, e.g. '
                                         '--casing-insulation "polyisocyanurate foam"')
