"""Freezing of still water against the closed-form lumped-capacitance solution."""

import math

import iapws
import numpy as np
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from pipeins.catalog.materials import lookup_material, lookup_wall_material
from pipeins.errors import InputError
from pipeins.freezing import FreezeHold, freeze_times
from pipeins.model import Fluid, Layer, Pipe, Surface, Surroundings
from pipeins.sizing import SizingProblem, size

K004 = lookup_material("k=0.04")
NPS1 = Pipe(0.0334, 0.00338, 50.0)  # NPS 1 schedule 40 (ASME B36.10M dimensions), wall k 50 W/(m·K)
STEEL_RHO, STEEL_C = 7854.0, 434.0  # Incropera 6th ed., Table A.1, plain carbon steel, 300 K (from memory)
FUSION_J_KG = 333.55e3  # CRC Handbook of Chemistry and Physics, heat of fusion of ice (from memory)
ATM_MPA = 0.101325


def _resistance(pipe, thickness_m, h_out):
    r_in, r_o = pipe.outer_diameter_m / 2 - pipe.wall_m, pipe.outer_diameter_m / 2
    r_s = r_o + thickness_m
    return (math.log(r_o / r_in) / (2 * math.pi * pipe.wall_conductivity_w_mk)
            + math.log(r_s / r_o) / (2 * math.pi * 0.04) + 1 / (h_out * 2 * math.pi * r_s))


def _water(temp_c):
    w = iapws.IAPWS95(T=temp_c + 273.15, P=ATM_MPA)
    return w.rho, w.cp * 1e3


def _lumped_reference(pipe, thickness_m, h_out, start_c, air_c, fraction):
    """t = C'R' ln((T_i − T_a)/(0 − T_a)) + m' f L R'/(0 − T_a) (Incropera 6th ed. §5.3, Eq. 5.6,
    from memory), C' with water properties from IAPWS-95 (iapws) at the mean temperature."""
    di, do = pipe.inner_diameter_m, pipe.outer_diameter_m
    rho, cp = _water(0.5 * start_c)
    rho0, _ = _water(0.01)
    c_wall = STEEL_RHO * STEEL_C * math.pi * (do ** 2 - di ** 2) / 4
    c_total = rho * cp * math.pi * di ** 2 / 4 + c_wall
    r = _resistance(pipe, thickness_m, h_out)
    to_zero = c_total * r * math.log((start_c - air_c) / (0.0 - air_c))
    latent = rho0 * math.pi * di ** 2 / 4 * fraction * FUSION_J_KG * r / (0.0 - air_c)
    return to_zero, to_zero + latent


@pytest.mark.parametrize("thickness_m, h_out, start_c, air_c, fraction", [
    pytest.param(0.025, 10.0, 10.0, -10.0, 0.0, id="Incropera-6ed-Eq5.6-lumped-10C-to-0C"),
    pytest.param(0.025, 10.0, 10.0, -10.0, 0.5, id="Incropera-6ed-Eq5.6-lumped-plus-half-frozen"),
    pytest.param(0.050, 25.0, 6.0, -25.0, 1.0, id="Incropera-6ed-Eq5.6-lumped-frozen-solid"),
    pytest.param(0.013, 25.0, 4.0, -1.0, 0.25, id="Incropera-6ed-Eq5.6-lumped-air-just-below-0C"),
])
def test_freeze_times_match_lumped_closed_form(thickness_m, h_out, start_c, air_c, fraction):
    # Water c_p varies 0.6 % between 0 and 10 °C; the reference takes C' at the mean temperature,
    # which the exact integral differs from by well under 0.1 %; the check allows 0.5 %.
    r = freeze_times(NPS1, [Layer(K004, thickness_m)], Surroundings(air_c),
                     Surface(fixed_coefficient_w_m2k=h_out), start_c, ice_fraction=fraction)
    to_zero, to_fraction = _lumped_reference(NPS1, thickness_m, h_out, start_c, air_c, fraction)
    assert float(r.time_to_zero_s) == pytest.approx(to_zero, rel=5e-3)  # Incropera Eq. 5.6 (lumped)
    assert float(r.time_to_ice_fraction_s) == pytest.approx(to_fraction, rel=5e-3)  # + latent, CRC L_f


def test_default_wall_is_the_catalogue_carbon_steel():
    # Incropera 6th ed., Table A.1 (from memory): plain carbon steel 7854 kg/m³, 434 J/(kg·K)
    steel = lookup_wall_material("carbon steel")
    assert (steel.density_kg_m3, steel.heat_capacity_j_kgk) == (STEEL_RHO, STEEL_C)
    a = freeze_times(NPS1, [Layer(K004, 0.02)], Surroundings(-10.0), Surface(), 8.0)
    b = freeze_times(NPS1, [Layer(K004, 0.02)], Surroundings(-10.0), Surface(), 8.0, wall_material=steel)
    assert float(a.time_to_zero_s) == float(b.time_to_zero_s)
    copper = freeze_times(NPS1, [Layer(K004, 0.02)], Surroundings(-10.0), Surface(), 8.0,
                          wall_material=lookup_wall_material("copper"))
    assert float(copper.time_to_zero_s) != float(a.time_to_zero_s)


@pytest.mark.parametrize("air_c, radiant_c", [
    pytest.param(5.0, None, id="physical-air-above-0C"),
    pytest.param(0.0, None, id="physical-air-at-0C"),
    pytest.param(-2.0, 10.0, id="physical-warm-surroundings-keep-water-above-0C"),
])
def test_never_freezes_gives_infinite_times(air_c, radiant_c):
    # Physical (common practice): water whose surroundings hold it above 0 °C never freezes
    r = freeze_times(NPS1, [Layer(K004, 0.03)], Surroundings(air_c, radiant_c), Surface(emittance=0.9), 20.0,
                     ice_fraction=0.5)
    assert np.isinf(r.time_to_zero_s) and np.isinf(r.time_to_ice_fraction_s)


def test_vectorised_over_cases_and_equal_to_scalar_calls():
    # common practice (API contract): one call, broadcast shapes; each case equals its scalar call
    starts = np.array([5.0, 15.0, 40.0])
    thick = np.array([[0.01], [0.05]])
    air = Surroundings(-15.0, wind_speed_m_s=4.0)
    r = freeze_times(NPS1, [Layer(K004, thick)], air, Surface(), starts, ice_fraction=0.2)
    assert r.time_to_zero_s.shape == (2, 3)
    one = freeze_times(NPS1, [Layer(K004, 0.05)], air, Surface(), 15.0, ice_fraction=0.2)
    assert r.time_to_ice_fraction_s[1, 1] == pytest.approx(float(one.time_to_ice_fraction_s), rel=1e-9)
    assert np.all(np.diff(r.time_to_zero_s, axis=1) > 0)  # warmer start, longer hold


def test_quadrature_converged_with_default_points():
    # Numerical convergence (common practice): 40 nodes agree with 200 to 1e-6 even when the air
    # is just below 0 °C (integrand nearly singular at 0 °C without the log substitution).
    args = (NPS1, [Layer(K004, 0.02)], Surroundings(-0.3, wind_speed_m_s=1.0), Surface(), 60.0)
    a = float(freeze_times(*args).time_to_zero_s)
    b = float(freeze_times(*args, points=200).time_to_zero_s)
    assert a == pytest.approx(b, rel=1e-6)


def _problem(start_c=10.0, air_c=-15.0, n=1):
    return SizingProblem(pipe=Pipe(np.full((n, 1), 0.0334), 0.00338), fixed_layers=[], material=K004,
                         fluid=Fluid(start_c, None, "water"), surroundings=Surroundings(air_c),
                         surface=Surface(fixed_coefficient_w_m2k=10.0), n_sizes=n)


@settings(max_examples=15, deadline=None)
@given(hold_h=st.floats(0.5, 48.0), longer=st.floats(1.01, 4.0), thin=st.floats(0.0, 0.08),
       extra=st.floats(0.002, 0.1), fraction=st.sampled_from([0.0, 0.25, 1.0]))
def test_freeze_hold_margin_monotone(hold_h, longer, thin, extra, fraction):
    # Physical invariants: a longer hold never needs less insulation (margin falls with hold time
    # at fixed thickness) and more insulation never shortens the hold (margin rises with thickness).
    problem = _problem()
    t = np.array([[thin, thin + extra]])
    result = problem.solve(t)
    short = FreezeHold(hold_h * 3600, fraction).margin(problem, result, t)
    long = FreezeHold(hold_h * 3600 * longer, fraction).margin(problem, result, t)
    assert np.all(long < short)
    assert short[0, 1] > short[0, 0]


def test_freeze_hold_sizes_to_closed_form():
    # Incropera 6th ed. §5.3, Eq. 5.6 (from memory) solved for R', then the thickness giving it;
    # start 4 °C so water c_p varies < 0.4 % (reference C' at 2 °C; IAPWS-95 via iapws).
    from scipy.optimize import brentq

    hold = 3600.0
    problem = _problem(start_c=4.0, air_c=-15.0)
    outcome = size(problem, [FreezeHold(hold)], [0.02, 0.03, 0.04, 0.05, 0.06, 0.08, 0.1])
    need = float(outcome.criteria[0].required_m[0])
    di, do = NPS1.inner_diameter_m, NPS1.outer_diameter_m
    rho, cp = _water(2.0)
    c_total = rho * cp * math.pi * di ** 2 / 4 + STEEL_RHO * STEEL_C * math.pi * (do ** 2 - di ** 2) / 4
    target_r = hold / (c_total * math.log(19.0 / 15.0))
    expected = brentq(lambda t: _resistance(NPS1, t, 10.0) - target_r, 1e-4, 0.5)
    assert need == pytest.approx(expected, rel=5e-3)  # Incropera Eq. 5.6 (lumped capacitance)


def test_freeze_hold_texts():
    # common practice (wording contract)
    crit = FreezeHold(8 * 3600.0, 0.25)
    assert crit.key == "freeze" and crit.label == "freeze protection (hold time)"
    assert crit.describe() == "still water holds 8.0 h before it is 25 % ice"
    assert crit.miss(-0.35, 0.2) == ("freeze protection cannot be met: with 200 mm still water is 25 % ice "
                                     "after 5.2 h, 2.8 h short of the 8.0 h hold time")
    assert FreezeHold(3600.0).miss(-0.5, 0.05).startswith(
        "freeze protection cannot be met: with 50 mm still water reaches 0 °C after 0.5 h")


def test_error_messages():
    layers, air = [Layer(K004, 0.02)], Surroundings(-10.0)
    with pytest.raises(InputError) as err:
        freeze_times(NPS1, layers, air, Surface(), 10.0, fluid_name="30% ethylene glycol")
    assert str(err.value) == '--fluid: the freezing model is for water only; "30% ethylene glycol" is not water'
    with pytest.raises(InputError) as err:
        freeze_times(NPS1, layers, air, Surface(), 0.0)
    assert str(err.value) == "--fluid-temp: the water must start above 0 °C for a freezing time"
    with pytest.raises(InputError) as err:
        freeze_times(NPS1, layers, air, Surface(), 10.0, ice_fraction=1.5)
    assert str(err.value) == "--ice-fraction: the ice fraction must be from 0 (first ice) to 1 (frozen solid)"
    with pytest.raises(InputError) as err:
        FreezeHold(0.0)
    assert str(err.value) == "--hold-time: the hold time must be greater than zero"
