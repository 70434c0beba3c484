"""Dimensionless correlations checked against the reference library ``ht`` (and ``fluids``).

Every correlation is compared with its counterpart in ht, called directly (not through
ht's dispatchers), over its validity range within 0.5 %.
"""

import numpy as np
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

import fluids.friction
from ht import conv_external, conv_free_immersed, conv_internal
from ht.conv_supercritical import Nu_Krasnoshchekov

from pipeins.errors import InputError
from pipeins.physics import convection as cv

PRANDTLS = [0.7, 1.0, 5.0, 50.0]
REL = 5e-3  # 0.5 %: the correlations are the same equations, so agreement is far tighter


def grid(low_exp, high_exp, n=25):
    return np.logspace(low_exp, high_exp, n)


# --------------------------------------------------------------------------- natural


@pytest.mark.parametrize("prandtl", PRANDTLS)
def test_horizontal_cylinder_matches_ht(prandtl):
    rayleigh = grid(-5, 12)
    ours = cv.nusselt_horizontal_cylinder_churchill_chu(rayleigh, prandtl)
    ref = [conv_free_immersed.Nu_horizontal_cylinder_Churchill_Chu(prandtl, ra / prandtl) for ra in rayleigh]
    assert ours == pytest.approx(ref, rel=REL)  # ht.conv_free_immersed.Nu_horizontal_cylinder_Churchill_Chu


def test_horizontal_cylinder_incropera_example_9_2_value():
    # ht docstring: Incropera 6th ed. Example 9.2 inputs (Pr 0.69, Gr 2.63e9) give 139.13
    nusselt = cv.nusselt_horizontal_cylinder_churchill_chu(0.69 * 2.63e9, 0.69)
    assert float(nusselt) == pytest.approx(139.13, rel=1e-4)  # ht docs, Incropera 6th ed. Ex. 9.2


@pytest.mark.parametrize("prandtl", PRANDTLS)
def test_vertical_plate_matches_ht(prandtl):
    rayleigh = grid(-1, 12)
    ours = cv.nusselt_vertical_plate_churchill_chu(rayleigh, prandtl)
    ref = [conv_free_immersed.Nu_vertical_plate_Churchill(prandtl, ra / prandtl) for ra in rayleigh]
    assert ours == pytest.approx(ref, rel=REL)  # ht.conv_free_immersed.Nu_vertical_plate_Churchill


@pytest.mark.parametrize("prandtl", [0.7, 1.0, 5.0])
@pytest.mark.parametrize("height_over_diameter", [5.0, 20.0, 60.0])
def test_slender_vertical_cylinder_matches_ht(prandtl, height_over_diameter):
    height_m = 2.0
    diameter_m = height_m / height_over_diameter
    rayleigh = grid(4, 9, 15)
    thin = cv.vertical_cylinder_is_thin(rayleigh, prandtl, height_m, diameter_m)
    ours = cv.nusselt_vertical_cylinder_popiel_churchill(rayleigh, prandtl, height_m, diameter_m)
    for ra, is_thin, nu in zip(rayleigh, thin, ours):
        gr = ra / prandtl
        if is_thin:  # ht.conv_free_immersed.Nu_vertical_cylinder_Popiel_Churchill
            ref = conv_free_immersed.Nu_vertical_cylinder_Popiel_Churchill(prandtl, gr, height_m, diameter_m)
        else:  # thick cylinder = plate: ht.conv_free_immersed.Nu_vertical_plate_Churchill
            ref = conv_free_immersed.Nu_vertical_plate_Churchill(prandtl, gr)
        assert nu == pytest.approx(ref, rel=REL)


@pytest.mark.parametrize("height_over_diameter", [0.5, 5.0, 60.0])
def test_vertical_cylinder_correction_everywhere_matches_ht(height_over_diameter):
    rayleigh = grid(4, 12, 20)
    ours = cv.nusselt_vertical_cylinder_popiel_churchill(rayleigh, 0.71, 1.0, 1.0 / height_over_diameter, plate_when_thick=False)
    ref = [conv_free_immersed.Nu_vertical_cylinder_Popiel_Churchill(0.71, ra / 0.71, 1.0, 1.0 / height_over_diameter) for ra in rayleigh]
    assert ours == pytest.approx(ref, rel=REL)  # ht.conv_free_immersed.Nu_vertical_cylinder_Popiel_Churchill


def test_thin_cylinder_criterion():
    # D/L >= 35 / Gr_L^(1/4) -> plate (Incropera 6th ed. Eq. 9.33, Sparrow & Gregg 1956)
    gr = 1.0e8  # Gr^(1/4) = 100 -> boundary at D/L = 0.35
    assert not bool(cv.vertical_cylinder_is_thin(gr * 0.7, 0.7, 1.0, 0.36))
    assert bool(cv.vertical_cylinder_is_thin(gr * 0.7, 0.7, 1.0, 0.34))


def test_vertical_cylinder_finite_at_zero_rayleigh():
    nu = cv.nusselt_vertical_cylinder_popiel_churchill(0.0, 0.71, 3.0, 0.05)
    assert np.isfinite(nu) and nu > 0.825**2  # plate limit times a finite correction


@pytest.mark.parametrize("prandtl", [0.7, 5.0])
def test_horizontal_plate_up_matches_ht(prandtl):
    rayleigh = grid(4, 11)
    ours = cv.nusselt_horizontal_plate_up_mcadams(rayleigh)
    ref = [conv_free_immersed.Nu_horizontal_plate_McAdams(prandtl, ra / prandtl, buoyancy=True) for ra in rayleigh]
    assert ours == pytest.approx(ref, rel=REL)  # ht.conv_free_immersed.Nu_horizontal_plate_McAdams(buoyancy=True)


@pytest.mark.parametrize("prandtl", [0.7, 5.0])
def test_horizontal_plate_down_matches_ht(prandtl):
    rayleigh = grid(5, 10)
    ours = cv.nusselt_horizontal_plate_down_mcadams(rayleigh)
    ref = [conv_free_immersed.Nu_horizontal_plate_McAdams(prandtl, ra / prandtl, buoyancy=False) for ra in rayleigh]
    assert ours == pytest.approx(ref, rel=REL)  # ht.conv_free_immersed.Nu_horizontal_plate_McAdams(buoyancy=False)


def test_horizontal_plate_enhanced_exceeds_reduced():
    rayleigh = grid(4, 11)
    assert np.all(cv.nusselt_horizontal_plate_up_mcadams(rayleigh) > cv.nusselt_horizontal_plate_down_mcadams(rayleigh))


# --------------------------------------------------------------------------- forced


@pytest.mark.parametrize("prandtl", PRANDTLS)
def test_cylinder_crossflow_matches_ht(prandtl):
    reynolds = grid(np.log10(0.2 / prandtl), 7)
    ours = cv.nusselt_cylinder_crossflow_churchill_bernstein(reynolds, prandtl)
    ref = [conv_external.Nu_cylinder_Churchill_Bernstein(re, prandtl) for re in reynolds]
    assert ours == pytest.approx(ref, rel=REL)  # ht.conv_external.Nu_cylinder_Churchill_Bernstein


def test_cylinder_crossflow_incropera_example_7_3_value():
    nusselt = cv.nusselt_cylinder_crossflow_churchill_bernstein(6071.0, 0.7)
    assert float(nusselt) == pytest.approx(40.637, rel=1e-4)  # ht docs, Incropera 6th ed. Ex. 7.3


@pytest.mark.parametrize("prandtl", [0.7, 1.0, 5.0])
def test_flat_plate_laminar_matches_ht(prandtl):
    reynolds = grid(2, np.log10(5e5))
    ours = cv.nusselt_flat_plate_pohlhausen_colburn(reynolds, prandtl)
    ref = [conv_external.Nu_horizontal_plate_laminar_Baehr(re, prandtl) for re in reynolds]
    assert ours == pytest.approx(ref, rel=REL)  # ht.conv_external.Nu_horizontal_plate_laminar_Baehr (0.6 < Pr < 10)


@pytest.mark.parametrize("prandtl", [0.7, 5.0, 50.0])
def test_flat_plate_mixed_matches_incropera_eq_7_38(prandtl):
    reynolds = grid(6, 8)
    ours = cv.nusselt_flat_plate_pohlhausen_colburn(reynolds, prandtl)
    printed = (0.037 * reynolds**0.8 - 871.0) * prandtl ** (1 / 3)
    assert ours == pytest.approx(printed, rel=1e-3)  # Incropera 6th ed. Eq. 7.38 (A printed as 871)


def test_flat_plate_continuous_at_transition():
    re_c = cv.REYNOLDS_PLATE_TRANSITION
    below, above = cv.nusselt_flat_plate_pohlhausen_colburn([re_c, re_c * (1 + 1e-9)], 0.7)
    assert above == pytest.approx(below, rel=1e-6)


# --------------------------------------------------------------------------- mixed


def test_mixed_rule_values():
    # Churchill (1977) AIChE J. 23:10, Nu^n = Nu_F^n + Nu_N^n (Incropera 6th ed. Eq. 9.64)
    assert float(cv.nusselt_mixed_churchill(3.0, 4.0)) == pytest.approx(91.0 ** (1 / 3), rel=1e-12)
    assert float(cv.nusselt_mixed_churchill(3.0, 4.0, exponent=1)) == pytest.approx(7.0)
    assert float(cv.nusselt_mixed_churchill(3.0, 4.0, exponent=2)) == pytest.approx(5.0)


@settings(max_examples=60, deadline=None)
@given(st.floats(0.0, 1e5), st.floats(0.0, 1e5))
def test_mixed_not_below_either_part(forced, natural):
    mixed = float(cv.nusselt_mixed_churchill(forced, natural))
    assert mixed >= max(forced, natural) * (1 - 1e-12)  # physical fact: adding wind never lowers h
    assert mixed <= (forced + natural) * (1 + 1e-12)


# --------------------------------------------------------------------------- internal


def test_filonenko_friction_factor_as_inside_ht():
    # ht.conv_supercritical.Nu_Krasnoshchekov(Re, Pr=1) = (f/8) Re / 1.07 with Filonenko f,
    # so 8 * 1.07 * Nu / Re recovers ht's friction factor exactly
    reynolds = grid(np.log10(3000), np.log10(5e6))
    ours = cv.friction_factor_smooth_filonenko(reynolds)
    ref = [8 * 1.07 * Nu_Krasnoshchekov(re, 1.0) / re for re in reynolds]
    assert ours == pytest.approx(ref, rel=1e-9)  # ht.conv_supercritical.Nu_Krasnoshchekov


def test_filonenko_close_to_colebrook_smooth():
    reynolds = grid(4, np.log10(5e6))
    ref = [fluids.friction.Colebrook(re, 0.0) for re in reynolds]
    assert cv.friction_factor_smooth_filonenko(reynolds) == pytest.approx(ref, rel=0.02)  # fluids.friction.Colebrook, eD=0


@pytest.mark.parametrize("prandtl", [0.5, 0.7, 7.0, 100.0, 2000.0])
def test_gnielinski_matches_ht(prandtl):
    reynolds = grid(np.log10(3000), np.log10(5e6))
    ours = cv.nusselt_pipe_gnielinski(reynolds, prandtl)
    friction = [8 * 1.07 * Nu_Krasnoshchekov(re, 1.0) / re for re in reynolds]  # Filonenko f from ht (see above)
    ref = [conv_internal.turbulent_Gnielinski(re, prandtl, fd) for re, fd in zip(reynolds, friction)]
    assert ours == pytest.approx(ref, rel=REL)  # ht.conv_internal.turbulent_Gnielinski


def test_laminar_constants_match_ht():
    assert float(cv.nusselt_pipe_laminar(1000.0, 7.0)) == pytest.approx(
        conv_internal.laminar_Q_const(), rel=1e-12
    )  # ht.conv_internal.laminar_Q_const (48/11)
    assert float(cv.nusselt_pipe_laminar(1000.0, 7.0, wall="constant_temperature")) == pytest.approx(
        conv_internal.laminar_T_const(), rel=1e-12
    )  # ht.conv_internal.laminar_T_const (3.66)


def test_laminar_unknown_wall_condition():
    with pytest.raises(InputError, match='unknown wall condition "adiabatic"'):
        cv.nusselt_pipe_laminar(100.0, 1.0, wall="adiabatic")


@pytest.mark.parametrize("prandtl", [0.7, 7.0, 100.0])
def test_internal_piecewise_and_transition(prandtl):
    # Gnielinski (2013) Int. J. Heat Mass Transfer 63:134, Eq. 12: linear in gamma between
    # Nu_lam(2300) and Nu_turb(1e4)
    nu_lam = conv_internal.laminar_Q_const()
    f_1e4 = 8 * 1.07 * Nu_Krasnoshchekov(1e4, 1.0) / 1e4
    nu_turb = conv_internal.turbulent_Gnielinski(1e4, prandtl, f_1e4)
    reynolds = np.array([100.0, 2300.0, 4000.0, 6150.0, 1e4])
    gamma = np.clip((reynolds - 2300) / (1e4 - 2300), 0, 1)
    expected = (1 - gamma) * nu_lam + gamma * nu_turb
    assert cv.nusselt_pipe_internal(reynolds, prandtl) == pytest.approx(expected, rel=REL)
    high = grid(4, np.log10(5e6), 10)
    assert cv.nusselt_pipe_internal(high, prandtl) == pytest.approx(cv.nusselt_pipe_gnielinski(high, prandtl), rel=1e-12)


def test_internal_monotonic_and_continuous():
    reynolds = np.linspace(10.0, 3e4, 3000)
    nu = cv.nusselt_pipe_internal(reynolds, 0.7)
    assert np.all(np.diff(nu) >= 0)
    assert np.max(np.abs(np.diff(nu))) < 0.05  # no jump at 2300 or 1e4


# --------------------------------------------------------------------------- arrays and inputs


def test_broadcasting():
    rayleigh = np.logspace(3, 9, 4).reshape(4, 1)
    prandtl = np.array([0.7, 1.0, 7.0])
    assert cv.nusselt_horizontal_cylinder_churchill_chu(rayleigh, prandtl).shape == (4, 3)
    assert cv.nusselt_pipe_internal(rayleigh, prandtl).shape == (4, 3)
    assert cv.nusselt_pipe_laminar(rayleigh, prandtl).shape == (4, 3)


@pytest.mark.parametrize(
    "call, name",
    [
        (lambda: cv.nusselt_horizontal_cylinder_churchill_chu(-1.0, 0.7), "rayleigh"),
        (lambda: cv.nusselt_vertical_plate_churchill_chu(1e6, 0.0), "prandtl"),
        (lambda: cv.nusselt_cylinder_crossflow_churchill_bernstein([1.0, -2.0], 0.7), "reynolds"),
        (lambda: cv.nusselt_vertical_cylinder_popiel_churchill(1e6, 0.7, 0.0, 0.1), "height_m"),
        (lambda: cv.nusselt_mixed_churchill(1.0, 1.0, exponent=0.5), "exponent"),
        (lambda: cv.nusselt_pipe_gnielinski(500.0, 0.7), "reynolds"),
    ],
)
def test_impossible_inputs_raise(call, name):
    with pytest.raises(InputError) as info:
        call()
    assert info.value.name == name
