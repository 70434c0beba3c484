"""Cost study: bare against insulated, payback, economic curve, and the cost command."""

from pathlib import Path

import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from pipeins.annual import EnergyBasis, price_from_text
from pipeins.costing import cost_study
from pipeins.economics import CostTable, EnergyPrice
from pipeins.line import LineSpec

DEMO = Path(__file__).resolve().parents[1] / "examples" / "costs_demo.csv"  # invented demo prices
SPEC = LineSpec(pipe="NPS 4", fluid_temp_c=82.0, air_temp_c=15.0, length_m=120.0, layers=(("mineral wool", 0.05),))


def _basis(price=0.09, **kw):
    return EnergyBasis(hours_per_year=5000.0, price=EnergyPrice(price, "kWh", "EUR"), efficiency=0.88,
                       cost_table=CostTable.from_csv(DEMO), **kw)


@settings(max_examples=20, deadline=None)
@given(hours=st.floats(100.0, 8760.0), price=st.floats(0.01, 0.5), valves=st.integers(0, 6))
def test_saving_plus_insulated_equals_bare(hours, price, valves):
    # Invariant (issue acceptance): saving plus insulated loss equals bare loss, for energy and cost.
    basis = EnergyBasis(hours_per_year=hours, price=EnergyPrice(price, "kWh", "EUR"), efficiency=0.9)
    s = cost_study(SPEC, basis, {"valve": valves})
    for key in ("energy_j", "cost"):
        assert float(s.saving[key] + s.insulated[key]) == pytest.approx(float(s.bare[key]), rel=1e-12)
    assert s.bare_w - s.insulated_w == pytest.approx((s.bare_w_per_m - s.insulated_w_per_m) * 120.0, rel=1e-12)


def test_annual_energy_is_heat_flow_times_hours_over_efficiency():
    # Definition: purchased energy = |q| · hours / η (hand arithmetic).
    s = cost_study(SPEC, _basis())
    assert float(s.insulated["energy_j"]) == pytest.approx(s.insulated_w * 5000 * 3600 / 0.88, rel=1e-12)
    assert float(s.insulated["cost"]) == pytest.approx(s.insulated_w * 5000 / 1000 / 0.88 * 0.09, rel=1e-9)


def test_payback_is_installed_cost_over_saving():
    s = cost_study(SPEC, _basis())
    assert s.installed_cost == pytest.approx(44.85 * 120.0)  # demo table: NPS 4 at 50 mm, invented price
    assert s.payback_years == pytest.approx(s.installed_cost / float(s.saving["cost"]))


@settings(max_examples=15, deadline=None)
@given(a=st.floats(0.01, 0.6), b=st.floats(0.01, 0.6))
def test_economic_thickness_never_falls_when_the_price_rises(a, b):
    # Invariant (issue acceptance): a dearer energy never makes the economic thickness thinner.
    lo, hi = sorted((a, b))
    t_lo = cost_study(SPEC, _basis(lo)).curve
    t_hi = cost_study(SPEC, _basis(hi)).curve
    assert t_hi.thickness_m[t_hi.best_index] >= t_lo.thickness_m[t_lo.best_index]


def test_price_text_in_other_units():
    # 1 therm = 100 000 Btu_IT = 29.3071 kWh (pint checks the factor in test_units.py).
    p = price_from_text("1.05/therm")
    assert p.price_per_unit == pytest.approx(1.05 / 29.3071107, rel=1e-6)


def test_cost_command_end_to_end(run):
    code, out, err = run(*["cost", "--pipe", "NPS 4", "--fluid-temp", "82C", "--ambient-temp", "15C",
                          "--length", "120m", "--layer", "mineral wool:50mm", "--hours", "5000h",
                          "--energy-price", "0.09/kWh", "--efficiency", "0.88", "--cost-table", str(DEMO),
                          "--format", "json"])
    assert code == 0, err
    import json

    data = json.loads(out)
    assert data["saving"]["heat_flow_w"] == pytest.approx(data["bare"]["heat_flow_w"] - data["insulated"]["heat_flow_w"])
    assert data["economic_curve"]["economic_thickness_m"] in data["economic_curve"]["thickness_m"]


@pytest.mark.parametrize("args, line", [
    (["--hours", "9000h"], "Error: --hours: operating hours must be above 0 and at most 8784 h"),
    (["--efficiency", "120%"], None),
    (["--discount-rate", "-100%"], None),
])
def test_cost_bad_input(run, args, line):
    base = ["cost", "--pipe", "NPS 4", "--fluid-temp", "82C", "--layer", "mineral wool:50mm",
            "--energy-price", "0.09/kWh"]
    code, out, err = run(*(base + args))
    assert code == 2 and out == "" and "Traceback" not in err
    assert err.startswith("Error: --" + args[0][2:])
    if line:
        assert err.strip() == line


def test_profile_energy_is_the_sum_of_its_conditions():
    # Definition: E = Σ |Q_j|·h_j / η over the operating conditions (hand arithmetic; two single studies).
    basis = EnergyBasis(hours_per_year=1.0, price=EnergyPrice(0.09, "kWh", "EUR"), efficiency=0.88)
    both = cost_study(SPEC, basis, profile=[(82.0, 3000.0), (70.0, 2500.0)])
    parts = [cost_study(LineSpec(**{**SPEC.__dict__, "fluid_temp_c": t}), EnergyBasis(
        hours_per_year=h, price=EnergyPrice(0.09, "kWh", "EUR"), efficiency=0.88)) for t, h in ((82.0, 3000.0), (70.0, 2500.0))]
    assert float(both.insulated["energy_j"]) == pytest.approx(sum(float(p.insulated["energy_j"]) for p in parts), rel=1e-9)
    assert both.bare_w == pytest.approx((3000 * parts[0].bare_w + 2500 * parts[1].bare_w) / 5500, rel=1e-9)
    assert both.curve is None


def test_chiller_cop_divides_the_energy_of_a_heat_gain():
    # Definition: E = |Q|·h/COP for a heat gain (hand arithmetic); without a COP a warning says so.
    cold = LineSpec(pipe="NPS 4", fluid_temp_c=6.0, air_temp_c=30.0, length_m=50.0,
                    layers=(("elastomeric foam", 0.025),))
    price = EnergyPrice(0.15, "kWh", "EUR")
    with_cop = cost_study(cold, EnergyBasis(hours_per_year=4000.0, price=price, cop=4.0))
    no_cop = cost_study(cold, EnergyBasis(hours_per_year=4000.0, price=price))
    assert float(with_cop.insulated["energy_j"]) == pytest.approx(abs(with_cop.insulated_w) * 4000 * 3600 / 4.0, rel=1e-9)
    assert any("give --cop" in w for w in no_cop.warnings)
    assert not any("give --cop" in w for w in with_cop.warnings)
