"""Cost study: bare against insulated, payback, economic curve, and the cost command."""

from pathlib import Path

import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from pipeins.annual import EnergyBasis, price_from_text
from pipeins.costing import cost_study
from pipeins.economics import CostTable, EnergyPrice
from pipeins.errors import InputError
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
        assert float(s.saving["heating"][key] + s.insulated["heating"][key]) == pytest.approx(
            float(s.bare["heating"][key]), rel=1e-12)
    assert s.saving["heat_loss_w"] + s.insulated["heat_loss_w"] == pytest.approx(s.bare["heat_loss_w"], rel=1e-12)
    assert s.bare["heat_gain_w"] == s.insulated["heat_gain_w"] == 0.0  # a hot line gains nothing
    assert s.bare_w - s.insulated_w == pytest.approx((s.bare_w_per_m - s.insulated_w_per_m) * 120.0, rel=1e-12)


def test_annual_energy_is_heat_flow_times_hours_over_efficiency():
    # Definition: purchased energy = |q| · hours / η (hand arithmetic).
    s = cost_study(SPEC, _basis())
    assert s.insulated["heating"]["energy_j"] == pytest.approx(s.insulated_w * 5000 * 3600 / 0.88, rel=1e-12)
    assert s.insulated["heating"]["cost"] == pytest.approx(s.insulated_w * 5000 / 1000 / 0.88 * 0.09, rel=1e-9)


def test_payback_is_installed_cost_over_saving():
    s = cost_study(SPEC, _basis())
    assert s.installed_cost == pytest.approx(44.85 * 120.0)  # demo table: NPS 4 at 50 mm, invented price
    assert s.payback_years == pytest.approx(s.installed_cost / s.saving["heating"]["cost"])


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
    assert data["saving"]["heat_loss_w"] == pytest.approx(data["bare"]["heat_loss_w"] - data["insulated"]["heat_loss_w"])
    assert data["bare"]["heat_loss_w"] == pytest.approx(data["bare"]["heat_flow_w"])  # a hot line: all loss
    assert data["saving"]["cost"] == pytest.approx(data["bare"]["cost"] - data["insulated"]["cost"])
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
    assert both.insulated["heating"]["energy_j"] == pytest.approx(
        sum(p.insulated["heating"]["energy_j"] for p in parts), rel=1e-9)
    assert both.bare_w == pytest.approx((3000 * parts[0].bare_w + 2500 * parts[1].bare_w) / 5500, rel=1e-9)
    assert both.curve is None


def test_chiller_cop_divides_the_energy_of_a_heat_gain():
    # Definition: E = |Q|·h/COP for a heat gain (hand arithmetic); without a COP it is refused,
    # never priced as heating.
    cold = LineSpec(pipe="NPS 4", fluid_temp_c=6.0, air_temp_c=30.0, length_m=50.0,
                    layers=(("elastomeric foam", 0.025),))
    price = EnergyPrice(0.15, "kWh", "EUR")
    with_cop = cost_study(cold, EnergyBasis(hours_per_year=4000.0, price=price, cop=4.0))
    assert with_cop.insulated["cooling"]["energy_j"] == pytest.approx(
        abs(with_cop.insulated_w) * 4000 * 3600 / 4.0, rel=1e-9)
    assert with_cop.insulated["heat_loss_w"] == 0.0 and with_cop.insulated["heating"]["energy_j"] == 0.0
    with pytest.raises(InputError) as exc:
        cost_study(cold, EnergyBasis(hours_per_year=4000.0, price=price))
    assert exc.value.name == "--cop"


def test_chilled_line_without_cop_is_refused(run):
    code, out, err = run("cost", "--pipe", "NPS 4", "--fluid-temp", "6C", "--ambient-temp", "30C",
                         "--layer", "elastomeric foam:25mm", "--energy-price", "0.15/kWh")
    assert code == 2 and out == ""
    assert err.strip() == ("Error: --cop: the line gains heat (fluid below the air): give the chiller COP to "
                           "price the heat gain as cooling")


def test_cost_of_a_bare_line(run):
    # no --layer: the bare line alone, its own surface (bare copper for a copper tube)
    import json

    code, out, err = run("cost", "--pipe", "copper L 2", "--fluid-temp", "60C", "--length", "10m",
                         "--energy-price", "0.10/kWh", "--hours", "1000h", "--format", "json")
    assert code == 0, err
    data = json.loads(out)
    assert data["insulated"] is None and data["saving"] is None
    assert data["bare"]["emittance"] == 0.65 and data["bare"]["surface"] == "bare copper pipe"
    # hand arithmetic: cost = Q·h/η·price
    assert data["bare"]["heating"]["cost"] == pytest.approx(data["bare"]["heat_flow_w"] * 1000 / 1000 * 0.10)


def test_cost_of_one_bare_valve(run):
    # --length 0 --valves 1: the valve alone, as its equivalent length of bare pipe
    import json

    from pipeins.catalog.fittings import equivalent_length_m
    from pipeins.catalog.pipes import lookup_pipe

    code, out, err = run("cost", "--pipe", "NPS 4", "--fluid-temp", "160C", "--length", "0", "--valves", "1",
                         "--energy-price", "0.09/kWh", "--format", "json")
    assert code == 0, err
    data = json.loads(out)
    eq = float(equivalent_length_m("valve", lookup_pipe("NPS 4").outer_diameter_m))
    assert data["fitting_equivalent_length_m"] == pytest.approx(eq)
    assert data["bare"]["heat_flow_w"] == pytest.approx(data["bare"]["heat_flow_w_per_m"] * eq)
    code, out, err = run("cost", "--pipe", "NPS 4", "--fluid-temp", "160C", "--length", "0",
                         "--energy-price", "0.09/kWh")
    assert code == 2
    assert err.strip() == "Error: --length: nothing to price: give a run length above zero, or fittings (--valves 1)"
