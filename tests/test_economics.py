"""Tests of pipeins.economics against compound-interest tables, pint, and brute-force definitions."""

from pathlib import Path

import numpy as np
import pint
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from pipeins.economics import (
    CostTable,
    EmissionFactor,
    EnergyPrice,
    annual_co2_kg,
    annual_cost,
    annual_energy_j,
    economic_thickness,
    present_worth_factor,
    simple_payback_years,
)
from pipeins.errors import InputError
from pipeins.reports.notes import render

UREG = pint.UnitRegistry()
DEMO_COSTS = Path(__file__).resolve().parents[1] / "examples" / "costs_demo.csv"


def series_sum(rate, years, escalation=0.0):
    """P/A straight from its definition: sum over k of (1+g)^(k-1) / (1+i)^k."""
    return sum((1 + escalation) ** (k - 1) / (1 + rate) ** k for k in range(1, years + 1))


def raises(name, message, func, *args, **kwargs):
    with pytest.raises(InputError) as info:
        func(*args, **kwargs)
    assert info.value.name == name
    assert info.value.message == message


# ------------------------------------------------------------------ present worth factor


@pytest.mark.parametrize(
    "rate, years, expected",
    [
        pytest.param(0.08, 10, 6.7101, id="compound-interest table P/A i=8% n=10 (engineering-economy text, from memory)"),
        pytest.param(0.05, 20, 12.4622, id="compound-interest table P/A i=5% n=20 (engineering-economy text, from memory)"),
    ],
)
def test_present_worth_factor_matches_interest_tables(rate, years, expected):
    assert float(present_worth_factor(rate, years)) == pytest.approx(expected, abs=5e-5)  # tables print 4 decimals


@settings(max_examples=60, deadline=None)
@given(
    rate=st.floats(-0.5, 0.4),
    escalation=st.floats(-0.5, 0.4),
    years=st.integers(0, 60),
)
def test_present_worth_factor_equals_series_sum(rate, escalation, years):
    # definition of the geometric-gradient series (any engineering-economy text)
    expected = series_sum(rate, years, escalation)
    assert float(present_worth_factor(rate, years, escalation)) == pytest.approx(expected, rel=1e-9, abs=1e-12)


@pytest.mark.parametrize("rate", [0.0, 0.03, 0.08, 0.15])
def test_escalation_equal_to_rate_is_n_over_one_plus_i(rate):
    # i == g limit of the series sum: every term is 1/(1+i)  (series definition)
    assert float(present_worth_factor(rate, 25, rate)) == pytest.approx(25 / (1 + rate), rel=1e-15)
    assert float(present_worth_factor(rate, 25, rate)) == pytest.approx(series_sum(rate, 25, rate), rel=1e-12)
    # continuous through the limit (series definition)
    assert float(present_worth_factor(rate, 25, rate + 1e-10)) == pytest.approx(25 / (1 + rate), rel=1e-8)


@pytest.mark.parametrize("rate, years", [(0.08, 10), (0.05, 20), (0.12, 7), (0.01, 40)])
def test_zero_escalation_is_the_plain_factor(rate, years):
    # uniform-series present worth [(1+i)^n - 1] / [i (1+i)^n]  (engineering-economy text, from memory)
    plain = ((1 + rate) ** years - 1) / (rate * (1 + rate) ** years)
    assert float(present_worth_factor(rate, years, 0.0)) == pytest.approx(plain, rel=1e-12)
    assert float(present_worth_factor(rate, years)) == pytest.approx(series_sum(rate, years), rel=1e-12)


def test_present_worth_factor_broadcasts():
    out = present_worth_factor(np.array([[0.05], [0.08]]), np.array([10, 20, 30]))
    assert out.shape == (2, 3)
    assert out[1, 0] == pytest.approx(series_sum(0.08, 10), rel=1e-12)  # series definition


def test_present_worth_factor_errors():
    message = "{} is not allowed; the {} must be above -100 % per year (a fraction: 0.08 means 8 %)"
    raises("--discount-rate", message.format(-1, "discount rate"), present_worth_factor, -1.0, 10)
    raises("--discount-rate", message.format(-1.5, "discount rate"), present_worth_factor, [0.05, -1.5], 10)
    raises("--escalation", message.format(-2, "escalation"), present_worth_factor, 0.05, 10, -2.0)
    raises("--years", "-2 is not allowed; the number of years must be 0 or more", present_worth_factor, 0.05, -2)


# ------------------------------------------------------------------ energy, price, CO2


def test_annual_energy_heating_against_pint():
    expected = (UREG.Quantity(50.0, "W") * UREG.Quantity(8000.0, "hour") / 0.8).to("J").magnitude  # pint
    assert float(annual_energy_j(50.0, 8000.0, efficiency=0.8)) == pytest.approx(expected, rel=1e-12)


def test_annual_energy_cooling_uses_cop_and_magnitude():
    expected = (UREG.Quantity(30.0, "W") * UREG.Quantity(2000.0, "hour") / 3.0).to("J").magnitude  # pint
    assert float(annual_energy_j(-30.0, 2000.0, cop=3.0)) == pytest.approx(expected, rel=1e-12)


def test_annual_energy_profile_sums_over_last_axis():
    heat = np.array([[40.0, 60.0], [20.0, 30.0]])  # two thicknesses × two conditions
    hours = np.array([4000.0, 2000.0])
    out = annual_energy_j(heat, hours, efficiency=0.9)
    expected = [
        (UREG.Quantity(40 * 4000 + 60 * 2000, "W*hour") / 0.9).to("J").magnitude,  # pint
        (UREG.Quantity(20 * 4000 + 30 * 2000, "W*hour") / 0.9).to("J").magnitude,  # pint
    ]
    assert out.shape == (2,)
    np.testing.assert_allclose(out, expected, rtol=1e-12)


def test_annual_energy_errors():
    hours_message = "{} h is not allowed; operating hours must be between 0 and 8784 h per year"
    raises("--hours", hours_message.format(9000), annual_energy_j, 10.0, 9000.0)
    raises("--hours", hours_message.format(-1), annual_energy_j, 10.0, -1.0)
    raises("--hours", hours_message.format(9000), annual_energy_j, [10.0, 20.0], [5000.0, 4000.0])
    annual_energy_j(10.0, 8784.0)  # a leap year is allowed
    efficiency_message = "{} is not allowed; the efficiency must be above 0 and at most 1 (a fraction: 0.85 means 85 %)"
    raises("--efficiency", efficiency_message.format(0), annual_energy_j, 10.0, 100.0, efficiency=0.0)
    raises("--efficiency", efficiency_message.format(1.2), annual_energy_j, 10.0, 100.0, efficiency=1.2)
    raises("--cop", "0 is not allowed; the COP must be greater than 0", annual_energy_j, 10.0, 100.0, cop=0.0)
    raises(
        "--cop", "give a COP (cooling) or an efficiency (heating), not both",
        annual_energy_j, 10.0, 100.0, efficiency=0.9, cop=3.0,
    )
    raises("heat_flow_w", "heat flow must be a finite number of W (or W/m)", annual_energy_j, np.nan, 100.0)


@pytest.mark.parametrize(
    "unit, amount, pint_unit",
    [
        pytest.param("kWh", 1.0, "kWh", id="pint kWh"),
        pytest.param("MWh", 1.0, "MWh", id="pint MWh"),
        pytest.param("MJ", 1.0, "MJ", id="pint MJ"),
        pytest.param("GJ", 1.0, "GJ", id="pint GJ"),
        pytest.param("therm", 1e5, "Btu_it", id="pint 1e5 international-table Btu"),
        pytest.param("MMBtu", 1e6, "Btu_it", id="pint 1e6 international-table Btu"),
    ],
)
def test_energy_price_per_joule_against_pint(unit, amount, pint_unit):
    joules = UREG.Quantity(amount, pint_unit).to("J").magnitude  # pint
    price = EnergyPrice(7.5, unit, "EUR")
    assert price.price_per_j == pytest.approx(7.5 / joules, rel=1e-12)
    assert float(annual_cost(3 * joules, price)) == pytest.approx(22.5, rel=1e-12)


def test_annual_cost_and_co2_simple_cases():
    energy = UREG.Quantity(1000.0, "kWh").to("J").magnitude  # pint
    assert float(annual_cost(energy, EnergyPrice(0.10, "kWh", "EUR"))) == pytest.approx(100.0, rel=1e-12)
    assert float(annual_co2_kg(energy, EmissionFactor(0.2, "kWh"))) == pytest.approx(200.0, rel=1e-12)
    one_gj = UREG.Quantity(1.0, "GJ").to("J").magnitude
    mmbtu = UREG.Quantity(1e6, "Btu_it").to("J").magnitude  # pint
    assert float(annual_cost(one_gj, EnergyPrice(8.0, "MMBtu", "USD"))) == pytest.approx(8.0 * one_gj / mmbtu, rel=1e-12)
    np.testing.assert_allclose(annual_cost([energy, 2 * energy], EnergyPrice(0.1, "kWh")), [100.0, 200.0], rtol=1e-12)


def test_price_and_factor_errors():
    raises("--energy-price", "-1 is not allowed; the energy price must be 0 or more per kWh", EnergyPrice, -1.0, "kWh")
    raises(
        "--energy-price", 'unknown energy unit "kwhr"; did you mean "kWh" or "Wh" or "MWh"?',
        EnergyPrice, 0.1, "kwhr",
    )
    raises("--co2-factor", "-0.2 is not allowed; the emission factor must be 0 or more kg per kWh", EmissionFactor, -0.2, "kWh")


# ------------------------------------------------------------------ cost table


def test_demo_cost_table_is_marked_invented():
    first = DEMO_COSTS.read_text(encoding="utf-8").splitlines()[0]
    assert first.startswith("# invented demo prices for the fictional") and first.endswith("not market data")


def test_demo_cost_table_lookups():
    table = CostTable.from_csv(DEMO_COSTS)
    assert table.currency == "EUR"
    # values as written in examples/costs_demo.csv (invented demo data)
    assert float(table.cost_per_m("NPS 4", 0.050)) == 44.85
    np.testing.assert_array_equal(table.cost_per_m("nps   4", [0.025, 0.1]), [35.00, 69.35])
    np.testing.assert_allclose(table.thicknesses_m("NPS 4"), [0.025, 0.04, 0.05, 0.065, 0.08, 0.1, 0.125, 0.13, 0.15])
    assert table.sizes[0] == "NPS 1/2"


def test_cost_table_missing_rows():
    table = CostTable.from_csv(DEMO_COSTS)
    raises(
        "--cost-table", "costs_demo.csv has no row for NPS 3 at 45 mm; it lists 25, 40, 50, 65, 80, 100, 125, 130, 150 mm",
        table.cost_per_m, "NPS 3", 0.045,
    )
    raises(
        "--cost-table", 'costs_demo.csv has no row for NPS 7; did you mean "NPS 8" or "NPS 6" or "NPS 4"?',
        table.cost_per_m, "NPS 7", 0.05,
    )


@pytest.mark.parametrize(
    "text, message",
    [
        (
            "size,thickness_mm\nNPS 1,25\n",
            "bad.csv needs a thickness column (thickness_mm or thickness_in) and one cost column: cost_per_m "
            "(per metre of pipe, with size), cost_per_m2 or cost_per_ft2 (per area of surface); it has size, thickness_mm",
        ),
        ("size,thickness_mm,cost_per_m\nNPS 1,25,cheap\n", 'bad.csv row 1: cost_per_m "cheap" is not a number'),
        ("size,thickness_mm,cost_per_m\nNPS 1,-25,3\n", 'bad.csv row 1: thickness_mm "-25" must be a number ≥ 0'),
        ("size,thickness_mm,cost_per_m\nNPS 1,25,3\nNPS 1,25.0,4\n", "bad.csv row 2: a second row for NPS 1 at 25 mm"),
        (
            "size,thickness_mm,cost_per_m,currency\nNPS 1,25,3,EUR\nNPS 1,40,4,USD\n",
            "bad.csv mixes currencies EUR, USD; use one",
        ),
        ("# only a comment\nsize,thickness_mm,cost_per_m\n", "bad.csv has no rows"),
    ],
)
def test_cost_table_file_errors(tmp_path, text, message):
    path = tmp_path / "bad.csv"
    path.write_text(text, encoding="utf-8")
    raises("--cost-table", message, CostTable.from_csv, path)


# ------------------------------------------------------------------ payback


def test_simple_payback():
    out = simple_payback_years([1200.0, 1200.0, 1200.0], [400.0, 0.0, -50.0])  # cost / saving (definition)
    assert out.tolist() == [3.0, np.inf, np.inf]
    raises("installed_cost", "installed cost must be a finite number ≥ 0", simple_payback_years, -1.0, 10.0)


# ------------------------------------------------------------------ economic thickness


def brute_force_best(thickness, installed, energy, rate, years, escalation=0.0):
    """Index of the cheapest candidate, by plain loops and the series-sum P/A (definition)."""
    pwf = series_sum(rate, years, escalation)
    totals = [installed[j] + energy[j] * pwf for j in range(len(thickness))]
    return min(range(len(totals)), key=lambda j: totals[j]), totals


@settings(max_examples=60, deadline=None)
@given(
    fixed=st.floats(5.0, 50.0),
    slope=st.floats(50.0, 2000.0),  # currency per m of pipe per m of thickness
    energy_coeff=st.floats(0.01, 5.0),  # annual energy cost = coeff / t
    rate=st.floats(0.0, 0.15),
    years=st.integers(1, 30),
    escalation=st.floats(0.0, 0.1),
)
def test_economic_thickness_matches_brute_force(fixed, slope, energy_coeff, rate, years, escalation):
    t = np.arange(1, 21) * 0.01
    installed = fixed + slope * t
    energy = energy_coeff / t
    result = economic_thickness(t, installed, energy, rate, years, escalation)
    best, totals = brute_force_best(t, installed, energy, rate, years, escalation)  # brute force (definition)
    np.testing.assert_allclose(result.total_per_m, totals, rtol=1e-10)
    assert totals[int(result.best_index)] == pytest.approx(totals[best], rel=1e-12)
    assert float(result.best_thickness_m) == t[int(result.best_index)]


@settings(max_examples=60, deadline=None)
@given(
    slope=st.floats(50.0, 2000.0),
    energy_coeff=st.floats(0.01, 5.0),
    price_factor=st.floats(1.0, 20.0),
    rate=st.floats(0.0, 0.15),
    years=st.integers(1, 30),
)
def test_higher_energy_price_never_gives_thinner(slope, energy_coeff, price_factor, rate, years):
    # monotone comparative statics of argmin(I(t) + λ E(t)) with E falling in t (definition)
    t = np.arange(1, 21) * 0.01
    installed = 10.0 + slope * t
    energy = energy_coeff / t
    low = economic_thickness(t, installed, energy, rate, years)
    high = economic_thickness(t, installed, energy * price_factor, rate, years)
    if float(high.best_thickness_m) < float(low.best_thickness_m):
        # only a floating-point tie may reverse the order
        totals = high.total_per_m
        assert totals[int(low.best_index)] == pytest.approx(totals[int(high.best_index)], rel=1e-12)


def test_economic_thickness_curve_and_maintenance():
    t = [0.025, 0.050, 0.075, 0.100]
    installed = np.array([20.0, 30.0, 40.0, 50.0])
    energy = np.array([8.0, 4.0, 2.7, 2.0])
    result = economic_thickness(t, installed, energy, 0.08, 10, maintenance_fraction=0.02)
    pwf = series_sum(0.08, 10)  # series definition
    np.testing.assert_allclose(result.energy_pv_per_m, energy * pwf, rtol=1e-12)
    np.testing.assert_allclose(result.maintenance_pv_per_m, 0.02 * installed * pwf, rtol=1e-12)
    np.testing.assert_allclose(result.total_per_m, installed * (1 + 0.02 * pwf) + energy * pwf, rtol=1e-12)
    assert float(result.best_thickness_m) == 0.05
    assert result.warnings == ()


def test_economic_thickness_per_size_rows_and_edge_warning():
    t = np.array([0.025, 0.05, 0.075])
    installed = np.array([[10.0, 20.0, 30.0], [10.0, 11.0, 12.0]])
    energy = np.array([[1.0, 0.5, 0.3], [30.0, 15.0, 10.0]])
    result = economic_thickness(t, installed, energy, 0.05, 15)
    expected = [brute_force_best(t, installed[k], energy[k], 0.05, 15)[0] for k in range(2)]  # brute force
    assert result.best_index.tolist() == expected == [0, 2]
    np.testing.assert_allclose(result.best_thickness_m, [0.025, 0.075])
    assert result.best_total_per_m.shape == (2,)
    assert [w.code for w in result.warnings] == ["economic.at_thickest", "economic.at_thinnest"]
    assert [render(w, "si") for w in result.warnings] == [
        "the cheapest candidate is the thickest given (75 mm); the optimum may be thicker",
        "the cheapest candidate is the thinnest given (25 mm); the optimum may be thinner",
    ]
    # in inches in a US report (NIST SP 811: 1 in = 25.4 mm exactly)
    assert render(result.warnings[0], "us") == ("the cheapest candidate is the thickest given "
                                                f"({0.075 / 0.0254:.2f} in); the optimum may be thicker")


def test_economic_thickness_errors():
    raises(
        "thicknesses_m", "candidate thicknesses must be a 1-D list of distinct values ≥ 0 m in ascending order",
        economic_thickness, [0.05, 0.025], [1.0, 2.0], [1.0, 1.0], 0.05, 10,
    )
    raises(
        "--maintenance", "-0.1 is not allowed; the maintenance fraction must be 0 or more per year",
        economic_thickness, [0.025, 0.05], [1.0, 2.0], [1.0, 1.0], 0.05, 10, 0.0, -0.1,
    )
    raises(
        "installed_cost_per_m", "costs must broadcast against the candidate thicknesses (last axis)",
        economic_thickness, [0.025, 0.05], [1.0, 2.0, 3.0], [1.0, 1.0], 0.05, 10,
    )


def test_cost_table_size_labels_ignore_case_and_spaces(tmp_path):
    path = tmp_path / "metric.csv"
    path.write_text("size,thickness_mm,cost_per_m,currency\nDN50,40,21.5,EUR\n", encoding="utf-8")
    table = CostTable.from_csv(path)  # invented test data
    assert float(table.cost_per_m("dn 50", 0.04)) == 21.5
