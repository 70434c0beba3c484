"""Duct inside air film (pipeins.physics.duct_inner) against ht, fluids and the Shah & London values."""

import numpy as np
import pytest
from hypothesis import given, strategies as st

from fluids.friction import friction_factor, friction_laminar
from ht.conv_internal import Nu_laminar_rectangular_Shan_London, laminar_Q_const, turbulent_Gnielinski

from pipeins.errors import InputError
from pipeins.physics import duct_inner
from pipeins.physics.convection import friction_factor_smooth_filonenko
from pipeins.props.air import air_properties
from pipeins.reports.notes import render_all
from pipeins.units import parse_quantity

TURBULENT_RE = [1.0e4, 3.0e4, 1.0e5, 3.0e5, 1.0e6, 5.0e6]


@pytest.mark.parametrize("reynolds", TURBULENT_RE)
@pytest.mark.parametrize("prandtl", [0.7, 0.71, 0.74])
def test_turbulent_nusselt_matches_ht_gnielinski(reynolds, prandtl):
    # ht.conv_internal.turbulent_Gnielinski(Re, Pr, fd), called directly with the same smooth-tube
    # friction factor; the duct film applies it on the hydraulic diameter (round or rectangular).
    fd = float(friction_factor_smooth_filonenko(reynolds))
    expected = turbulent_Gnielinski(reynolds, prandtl, fd)
    for ratio in (None, 1.0, 0.5, 0.125):
        got = float(duct_inner.nusselt_duct_internal(reynolds, prandtl, ratio))
        assert got == pytest.approx(expected, rel=5e-3)


@pytest.mark.parametrize("reynolds", [5.0e4, 1.0e5, 3.0e5, 1.0e6, 5.0e6])
def test_friction_factor_matches_fluids_smooth_colebrook(reynolds):
    # fluids.friction.friction_factor(Re, eD=0) (Clamond's solution of Colebrook, smooth) within 0.5 %
    # over 5e4..5e6; Filonenko's fit drifts to 1.8 % low at Re 1e4 (both are fits to the smooth-tube data).
    assert float(friction_factor_smooth_filonenko(reynolds)) == pytest.approx(friction_factor(reynolds, eD=0.0), rel=5e-3)


@pytest.mark.parametrize("reynolds", [5.0e4, 1.0e5, 1.0e6])
def test_turbulent_nusselt_with_fluids_friction_factor(reynolds):
    # Gnielinski (ht) fed the fluids friction factor: the whole film within 0.5 %.
    expected = turbulent_Gnielinski(reynolds, 0.71, friction_factor(reynolds, eD=0.0))
    assert float(duct_inner.nusselt_duct_internal(reynolds, 0.71, 0.5)) == pytest.approx(expected, rel=5e-3)


@pytest.mark.parametrize("ratio", [1.0, 0.7, 0.5, 0.25, 0.125, 0.05])
def test_laminar_rectangular_matches_ht_shah_london(ratio):
    # ht.conv_internal.Nu_laminar_rectangular_Shan_London (Shah & London 1978), called directly
    expected = Nu_laminar_rectangular_Shan_London(ratio)
    assert float(duct_inner.nusselt_rectangular_duct_laminar_shah_london(ratio)) == pytest.approx(expected, rel=1e-9)
    assert float(duct_inner.nusselt_duct_internal(1000.0, 0.71, ratio)) == pytest.approx(expected, rel=1e-9)


@pytest.mark.parametrize("ratio, nusselt", [(1.0, 3.61), (1 / 1.43, 3.73), (0.5, 4.12), (1 / 3, 4.79),
                                            (0.25, 5.33), (0.125, 6.49)])
def test_laminar_rectangular_against_incropera_table_8_1(ratio, nusselt):
    # Incropera et al., Fundamentals of Heat and Mass Transfer, 6th ed., Table 8.1, Nu_D for uniform q'' (from memory); the Shah & London fit is within 1 % of the tabulated values
    assert float(duct_inner.nusselt_rectangular_duct_laminar_shah_london(ratio)) == pytest.approx(nusselt, rel=0.01)


def test_laminar_round_is_the_uniform_flux_value():
    # ht.conv_internal.laminar_Q_const(): 48/11
    assert float(duct_inner.nusselt_duct_internal(500.0, 0.71)) == pytest.approx(laminar_Q_const(), rel=1e-12)
    assert float(duct_inner.nusselt_duct_internal(500.0, 0.71, np.nan)) == pytest.approx(laminar_Q_const(), rel=1e-12)


def test_fluids_laminar_friction_is_consistent():
    # fluids.friction.friction_laminar: 64/Re; the laminar film uses no friction factor, only the
    # Reynolds limit; this keeps the two laminar descriptions on the same D_h definition.
    assert friction_laminar(1000.0) == pytest.approx(0.064)


@given(st.floats(0.05, 1.0), st.floats(0.6, 0.8))
def test_nusselt_is_continuous_and_rises_through_transition(ratio, prandtl):
    re = np.linspace(100.0, 2.0e4, 4001)
    nu = duct_inner.nusselt_duct_internal(re, prandtl, ratio)
    assert np.all(np.diff(nu) >= -1e-12)
    assert np.max(np.abs(np.diff(nu))) < 0.1  # no jump at 2300 or 1e4 (steps of 5 in Re)


def test_film_from_velocity_and_from_flow_agree():
    velocity = 4.0
    area = 0.6 * 0.4
    by_velocity = duct_inner.duct_inner_film(0.6, 0.4, 14.0, velocity_m_s=velocity)
    flow = parse_quantity(f"{velocity * area * 3600} m3/h", "flow")
    by_flow = duct_inner.duct_inner_film(0.6, 0.4, 14.0, flow=flow)
    assert float(by_flow.h_w_m2k) == pytest.approx(float(by_velocity.h_w_m2k), rel=1e-12)
    # the same flow as a mass flow (density of the shipped air table)
    rho = float(air_properties(14.0).density_kg_m3)
    by_mass = duct_inner.duct_inner_film(0.6, 0.4, 14.0, flow=parse_quantity(f"{velocity * area * rho} kg/s", "flow"))
    assert float(by_mass.h_w_m2k) == pytest.approx(float(by_velocity.h_w_m2k), rel=1e-12)
    # cfm: 1 ft³/min = 0.0283168466 m³/min (pint, from the foot's definition)
    cfm = duct_inner.air_velocity_m_s(parse_quantity("1000 cfm", "flow"), 0.45)
    assert float(cfm) == pytest.approx(1000 * 0.3048**3 / 60 / (np.pi * 0.45**2 / 4), rel=1e-12)


def test_film_by_hand():
    # h = Nu k / D_h with Re = rho V D_h / mu from the shipped air table
    film = duct_inner.duct_inner_film(0.45, None, 30.0, velocity_m_s=6.0)
    props = air_properties(30.0)
    re = float(props.density_kg_m3 * 6.0 * 0.45 / props.viscosity_pa_s)
    fd = float(friction_factor_smooth_filonenko(re))
    expected = turbulent_Gnielinski(re, float(props.prandtl), fd) * float(props.conductivity_w_mk) / 0.45
    assert float(film.reynolds) == pytest.approx(re, rel=1e-12)
    assert float(film.h_w_m2k) == pytest.approx(expected, rel=1e-9)
    assert film.notes == []


def test_film_is_vectorised_and_notes_count_cases():
    film = duct_inner.duct_inner_film(np.array([0.1, 0.6, 0.6]), np.array([0.1, 0.4, 0.4]), 20.0,
                                      velocity_m_s=np.array([0.2, 0.1, 5.0]))
    assert film.h_w_m2k.shape == (3,)
    assert render_all(film.notes) == ["duct inner film: laminar air flow (Re below 2300); fully developed Nu used, "
                          "entry-length enhancement neglected in 1 of 3 cases",
                          "duct inner film: transitional air flow (Re 2300 to 10000); Gnielinski (1995) "
                          "interpolation used in 1 of 3 cases"]


@pytest.mark.parametrize("kwargs, name", [
    (dict(velocity_m_s=0.0), "velocity_m_s"),
    (dict(flow=-1.0), "flow"),
    (dict(), "velocity_m_s"),
    (dict(velocity_m_s=1.0, flow=1.0), "velocity_m_s"),
])
def test_bad_film_input(kwargs, name):
    with pytest.raises(InputError) as exc:
        duct_inner.duct_inner_film(0.6, 0.4, 20.0, **kwargs)
    assert exc.value.name == name
    with pytest.raises(InputError):
        duct_inner.duct_inner_film(0.0, 0.4, 20.0, velocity_m_s=1.0)
