"""Sizing: least thicknesses checked by independent solves, critical radius, invariants."""

import numpy as np
import psychrolib
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from pipeins.catalog.materials import lookup_material
from pipeins.catalog.pipes import pipe_range
from pipeins.criteria import Requirements
from pipeins.errors import InputError
from pipeins.line import LineSpec
from pipeins.model import Fluid, Layer, Pipe, Surface, Surroundings
from pipeins.selection import select
from pipeins.sizing import HeatFlowCap, SizingProblem, size
from pipeins.solve import solve

SERIES_MM = (20, 25, 30, 40, 50, 60, 80, 100, 120)


def _solve_at(spec, material, thickness_m, sizes=None):
    line = LineSpec(**{**spec.__dict__, "layers": spec.layers + ((material, thickness_m),)})
    pipe, layers, fluid, air, surface = line.build_model(sizes, insulated=True)
    return solve(pipe, layers, fluid, air, surface)


@pytest.mark.parametrize("sizes", ["NPS 1/2..NPS 12", "DN15..DN200", "copper L 1/2..4"])
def test_continuous_thickness_meets_each_criterion_exactly(sizes):
    # Independent solves at each continuous thickness: surface at the limit (0.05 K), surface at dew
    # point plus margin (0.05 K), heat flow at the cap (0.1 %); 0.5 mm thinner fails
    # (acceptance checks of the sizing issue; the solver itself is checked in test_solve.py).
    size_list = pipe_range(sizes)
    hot = LineSpec(pipe=size_list[0].label, fluid_temp_c=200.0, air_temp_c=25.0)
    sel = select(hot, "mineral wool", Requirements(touch_limit_c=50.0, max_heat_flow_w_per_m=60.0),
                 series=tuple(t / 1000 for t in SERIES_MM), sizes=size_list)
    touch, cap, _ = sel.outcome.criteria  # the last is the service-limit check
    r = _solve_at(hot, "mineral wool", touch.required_m[:, None], size_list)
    np.testing.assert_allclose(r.surface_temp_c[:, 0], 50.0, atol=0.05)
    thinner = _solve_at(hot, "mineral wool", touch.required_m[:, None] - 0.0005, size_list)
    assert np.all(thinner.surface_temp_c > 50.0)
    ok = np.isfinite(cap.required_m)
    r = _solve_at(hot, "mineral wool", np.where(ok, cap.required_m, 0.05)[:, None], size_list)
    np.testing.assert_allclose(np.abs(r.heat_flow_w_per_m[ok, 0]), 60.0, rtol=1e-3)
    thinner = _solve_at(hot, "mineral wool", np.where(ok, cap.required_m - 0.0005, 0.05)[:, None], size_list)
    assert np.all(np.abs(thinner.heat_flow_w_per_m[ok, 0]) > 60.0)

    cold = LineSpec(pipe=size_list[0].label, fluid_temp_c=4.0, air_temp_c=30.0, rh_percent=80.0)
    sel = select(cold, "elastomeric foam", Requirements(dew_margin_k=1.0), sizes=size_list)
    cond, _ = sel.outcome.criteria  # the last is the service-limit check
    r = _solve_at(cold, "elastomeric foam", cond.required_m[:, None], size_list)
    np.testing.assert_allclose(r.surface_temp_c[:, 0], r.dew_point_c[:, 0] + 1.0, atol=0.05)
    thinner = _solve_at(cold, "elastomeric foam", cond.required_m[:, None] - 0.0005, size_list)
    assert np.all(thinner.surface_temp_c[:, 0] < r.dew_point_c[:, 0] + 1.0)


def test_dew_point_of_the_condensation_condition_against_psychrolib():
    # psychrolib.GetTDewPointFromRelHum (ASHRAE Handbook Fundamentals 2017 ch. 1), solver tolerance tightened.
    psychrolib.SetUnitSystem(psychrolib.SI)
    psychrolib.PSYCHROLIB_TOLERANCE = 1e-7
    spec = LineSpec(pipe="NPS 2", fluid_temp_c=6.0, air_temp_c=28.0, rh_percent=75.0)
    r = _solve_at(spec, "elastomeric foam", 0.019)
    assert float(r.dew_point_c) == pytest.approx(psychrolib.GetTDewPointFromRelHum(28.0, 0.75), abs=0.05)


def test_cap_below_the_critical_radius_returns_a_thickness_past_the_peak():
    # Incropera et al., 6th ed., Example 3.5 (from memory): r_cr = k/h = 0.055/5 = 11 mm. On a 10 mm
    # tube with a fixed outer coefficient, heat flow rises with thickness up to r_cr, then falls.
    # A cap between the bare value and the peak must be met past the peak, not on the rising branch.
    pipe = Pipe(np.array([[0.010]]), np.array([[0.0005]]), 400.0)
    mat = lookup_material("k=0.055")
    surface = Surface(fixed_coefficient_w_m2k=5.0)
    bare = solve(pipe, [], Fluid(80.0), Surroundings(20.0), surface).heat_flow_w_per_m.item()
    peak = float(np.max(solve(pipe, [Layer(mat, np.linspace(1e-4, 0.02, 400))], Fluid(80.0),
                              Surroundings(20.0), surface).heat_flow_w_per_m))
    cap = 0.5 * (bare + peak)
    problem = SizingProblem(pipe, [], mat, Fluid(80.0), Surroundings(20.0), surface, None, 1)
    out = size(problem, [HeatFlowCap(max_w_per_m=cap)], [0.005, 0.01, 0.02, 0.03, 0.04])
    required = float(out.criteria[0].required_m[0])
    assert 0.005 + required > 0.011  # beyond the critical radius
    q = solve(pipe, [Layer(mat, required)], Fluid(80.0), Surroundings(20.0), surface).heat_flow_w_per_m.item()
    assert q == pytest.approx(cap, rel=1e-3)
    # and every thicker layer passes
    thicker = solve(pipe, [Layer(mat, required + np.linspace(0, 0.05, 50))], Fluid(80.0), Surroundings(20.0), surface)
    assert np.all(thicker.heat_flow_w_per_m <= cap * (1 + 1e-9))


def test_table_sizes_against_fluids():
    # Steel sizes against fluids.piping.nearest_pipe (ASME B36.10M); copper OD = nominal + 1/8 in (ASTM B88).
    from fluids.piping import nearest_pipe

    for s in pipe_range("NPS 1/2..NPS 24"):
        nps, di, do, t = nearest_pipe(NPS=float(eval(s.nominal.replace("-", "+"))), schedule=s.schedule)
        assert s.outer_diameter_m == pytest.approx(do, abs=1e-5)
    for s in pipe_range("copper L 1/2..4"):
        nominal_in = float(eval(s.nominal.replace("-", "+")))
        assert s.outer_diameter_m == pytest.approx((nominal_in + 0.125) * 0.0254, abs=1e-6)


def test_two_layers_beyond_the_thickest_single_layer():
    spec = LineSpec(pipe="NPS 12", fluid_temp_c=250.0, air_temp_c=20.0)
    sel = select(spec, "mineral wool", Requirements(max_heat_flow_w_per_m=80.0))
    split = sel.outcome.layer_split_m[0]
    assert len(split) == 2 and sum(split) == pytest.approx(float(sel.outcome.selected_m[0]))
    assert sum(split) > max(sel.outcome.series_m)


def test_impossible_criterion_says_by_how_much():
    spec = LineSpec(pipe="NPS 24", fluid_temp_c=400.0, air_temp_c=20.0)
    sel = select(spec, "mineral wool", Requirements(max_heat_flow_w_per_m=5.0, touch=False))
    cap = sel.outcome.criteria[0]
    assert not cap.feasible[0] and np.isnan(cap.required_m[0])
    assert cap.messages[0].startswith("heat-flow cap cannot be met: with 240 mm the heat flow is still")


def test_touch_limit_below_ambient_is_an_input_error():
    spec = LineSpec(pipe="NPS 2", fluid_temp_c=150.0, air_temp_c=45.0)
    with pytest.raises(InputError, match=r"touch_limit_c: the touch limit 40 °C must be above the air temperature 45 °C"):
        select(spec, "mineral wool", Requirements(touch_limit_c=40.0))


def test_empty_series_is_an_input_error():
    spec = LineSpec(pipe="NPS 2", fluid_temp_c=150.0, air_temp_c=20.0)
    with pytest.raises(InputError, match="--series: the thickness series needs at least one thickness above zero"):
        select(spec, "mineral wool", Requirements(), series=())


# --- invariants (hypothesis) ---------------------------------------------------------------

def _touch_need(limit, fluid=250.0, air=25.0):
    spec = LineSpec(pipe="NPS 3", fluid_temp_c=fluid, air_temp_c=air)
    return float(select(spec, "calcium silicate", Requirements(touch_limit_c=limit)).outcome.criteria[0].required_m[0])


def _dew_need(rh, fluid=5.0, air=30.0):
    spec = LineSpec(pipe="NPS 2", fluid_temp_c=fluid, air_temp_c=air, rh_percent=rh)
    return float(select(spec, "elastomeric foam", Requirements()).outcome.criteria[0].required_m[0])


@settings(max_examples=12, deadline=None)
@given(a=st.floats(35.0, 70.0), b=st.floats(35.0, 70.0))
def test_higher_touch_limit_never_needs_more(a, b):
    lo, hi = sorted((a, b))
    assert _touch_need(hi) <= _touch_need(lo) + 1e-5


@settings(max_examples=12, deadline=None)
@given(a=st.floats(30.0, 90.0), b=st.floats(30.0, 90.0))
def test_higher_humidity_never_needs_less(a, b):
    lo, hi = sorted((a, b))
    assert _dew_need(hi) >= _dew_need(lo) - 1e-5


@settings(max_examples=12, deadline=None)
@given(a=st.floats(-10.0, 12.0), b=st.floats(-10.0, 12.0))
def test_colder_chilled_line_never_needs_less(a, b):
    lo, hi = sorted((a, b))
    assert _dew_need(70.0, fluid=lo) >= _dew_need(70.0, fluid=hi) - 1e-5


@settings(max_examples=12, deadline=None)
@given(a=st.floats(40.0, 120.0), b=st.floats(40.0, 120.0))
def test_higher_heat_flow_cap_never_needs_more(a, b):
    # A further invariant that holds: a looser cap never needs more (past the critical radius).
    lo, hi = sorted((a, b))
    spec = LineSpec(pipe="NPS 4", fluid_temp_c=180.0, air_temp_c=20.0)

    def need(cap):
        return float(select(spec, "mineral wool", Requirements(touch=False, max_heat_flow_w_per_m=cap))
                     .outcome.criteria[0].required_m[0])
    assert need(hi) <= need(lo) + 1e-5


@settings(max_examples=10, deadline=None)
@given(a=st.floats(0.0, 40.0), b=st.floats(0.0, 40.0))
def test_hotter_air_never_needs_less_for_touch_safety(a, b):
    # A further invariant that holds: with the fluid hotter, a warmer room raises the surface.
    lo, hi = sorted((a, b))
    assert _touch_need(50.0, air=hi) >= _touch_need(50.0, air=lo) - 1e-5
