"""Tests of pipeins.codes: ASHRAE 90.1 and German-annex rule sets, band edges, the k adjustment.

Table values are from memory (ASHRAE 90.1-2019 Tables 6.8.3-1/6.8.3-2; GEG 2020 Anlage 8);
unit conversions are checked with pint, cylinder resistances with ht.
"""

import math

import numpy as np
import pint
import pytest
from ht.conduction import R_cylinder

from pipeins.codes import Interval, adjusted_thickness_m, list_rules, load_rule_sets, required_thickness
from pipeins.errors import InputError

UREG = pint.UnitRegistry()
ASHRAE = "ashrae-90.1-2019"
GEG = "de-geg-annex-8"
HEATING = "ASHRAE 90.1-2019 Table 6.8.3-1 (from memory)"
COOLING = "ASHRAE 90.1-2019 Table 6.8.3-2 (from memory)"


def f_to_c(temp_f):
    return UREG.Quantity(temp_f, "degF").to("degC").magnitude  # pint


def btu_in_to_w_mk(value):
    return UREG.Quantity(value, "Btu_it*inch/(hour*foot**2*delta_degF)").to("W/(m*K)").magnitude  # pint


def inches(value_m):
    return UREG.Quantity(value_m, "m").to("inch").magnitude  # pint


# Mid-range conductivity of each ASHRAE row, keyed by its mean rating temperature [°F]
# (ASHRAE 90.1-2019 Tables 6.8.3-1/-2, from memory): lets a lookup land inside the k range.
MID_K_BY_MEAN_F = {250: 0.33, 200: 0.305, 150: 0.285, 125: 0.27, 100: 0.25, 75: 0.24, 50: 0.23}


def k_inside_range(mean_temp_c):
    mean_f = UREG.Quantity(mean_temp_c, "degC").to("degF").magnitude  # pint
    return btu_in_to_w_mk(MID_K_BY_MEAN_F[round(mean_f)])


def lookup_in(temp_f, nps_in):
    req = required_thickness(ASHRAE, f_to_c(temp_f), 0.1143, k_inside_range, nominal_size_in=nps_in)
    return None if req.thickness_m is None else round(inches(req.thickness_m), 6)


def raises(name, message, func, *args, **kwargs):
    with pytest.raises(InputError) as info:
        func(*args, **kwargs)
    assert info.value.name == name
    assert info.value.message == message


# ------------------------------------------------------------------ the footnote formula


def test_adjusted_thickness_nps4_example():
    # ASHRAE 90.1-2019 footnote to Table 6.8.3-1 (from memory): NPS 4, r = 2.25 in, t = 2.0 in,
    # K = 0.23, k = 0.29:  2.25 * ((1 + 2/2.25) ** (0.23/0.29) - 1) = 1.476 in
    by_hand = 2.25 * ((1 + 2.0 / 2.25) ** (0.23 / 0.29) - 1)
    assert by_hand == pytest.approx(1.476, abs=5e-4)
    assert float(adjusted_thickness_m(2.0, 2.25, 0.23, 0.29)) == pytest.approx(1.476, abs=5e-4)
    # the same in metres (formula is unit-free)
    assert float(adjusted_thickness_m(2.0 * 0.0254, 2.25 * 0.0254, 0.23, 0.29)) == pytest.approx(by_hand * 0.0254, rel=1e-12)


def test_adjusted_thickness_equal_cylinder_resistance_ht():
    # ht.conduction.R_cylinder: ln(Do/Di) / (2 π k L); the adjusted layer must match the table layer
    outer_diameter = np.array([0.0334, 0.1143, 0.3239])
    t_table, k_table, k_mat = 0.05, 0.035, np.array([0.030, 0.040, 0.050])
    adjusted = adjusted_thickness_m(t_table, outer_diameter / 2, k_mat[:, None], k_table)
    for i, k in enumerate(k_mat):
        for j, d in enumerate(outer_diameter):
            r_table = R_cylinder(d, d + 2 * t_table, k_table, 1.0)
            r_adjusted = R_cylinder(d, d + 2 * adjusted[i, j], k, 1.0)
            assert r_adjusted == pytest.approx(r_table, rel=1e-12)
    np.testing.assert_allclose(adjusted_thickness_m(0.05, 0.05, 0.035, 0.035), 0.05, rtol=1e-15)


def test_adjusted_thickness_errors():
    raises("pipe_outer_radius_m", "pipe outer radius must be a finite number > 0 m", adjusted_thickness_m, 0.05, 0.0, 0.04, 0.04)
    raises("--conductivity", "material conductivity must be a finite number > 0", adjusted_thickness_m, 0.05, 0.05, -1, 0.04)
    raises("table_thickness_m", "table thickness must be a finite number ≥ 0 m", adjusted_thickness_m, -0.05, 0.05, 0.04, 0.04)


def test_nps4_example_through_the_rule_set():
    # ASHRAE 90.1-2019 Table 6.8.3-1 row 141–200 °F, NPS 4 to <8: 2.0 in for k 0.25–0.29 (from memory);
    # K = 0.23 is below the range, so the footnote formula applies: 1.476 in
    req = required_thickness(ASHRAE, f_to_c(180.0), 4.5 * 0.0254, btu_in_to_w_mk(0.23), nominal_size_in=4)
    assert req.covered
    assert inches(req.thickness_m) == pytest.approx(1.476, abs=5e-4)
    assert inches(req.table_thickness_m) == pytest.approx(2.0, abs=1e-12)
    assert "outside the range" in req.reason
    assert req.rule_row_source.startswith("from memory ASHRAE 90.1-2019 Table 6.8.3-1")


def test_conductivity_at_range_edges_uses_table_value():
    # inside the closed range 0.25–0.29 (edges included): table thickness (Table 6.8.3-1, from memory)
    for k in (0.25, 0.29):
        req = required_thickness(ASHRAE, f_to_c(180.0), 0.1143, btu_in_to_w_mk(k), nominal_size_in=4)
        assert inches(req.thickness_m) == pytest.approx(2.0, abs=1e-9)
    above = required_thickness(ASHRAE, f_to_c(180.0), 0.1143, btu_in_to_w_mk(0.30), nominal_size_in=4)
    expected = 2.25 * ((1 + 2.0 / 2.25) ** (0.30 / 0.29) - 1)  # footnote formula with r = 114.3 mm / 2
    assert inches(above.thickness_m) == pytest.approx(expected, rel=1e-9)


def test_callable_conductivity_is_asked_at_the_mean_rating_temperature():
    asked = []

    def k_of_t(mean_temp_c):
        asked.append(mean_temp_c)
        return btu_in_to_w_mk(0.27)

    required_thickness(ASHRAE, f_to_c(180.0), 0.1143, k_of_t, nominal_size_in=4)
    assert asked == [pytest.approx(f_to_c(125.0), abs=1e-9)]  # Table 6.8.3-1 row 141–200 °F: mean 125 °F (from memory)


# ------------------------------------------------------------------ band edges


@pytest.mark.parametrize(
    "temp_f, nps_in, expected_in",
    [
        pytest.param(104.5, 4, None, id=f"{HEATING} below 105F not covered"),
        pytest.param(105.0, 4, 1.5, id=f"{HEATING} 105F edge in 105-140"),
        pytest.param(140.0, 4, 1.5, id=f"{HEATING} 140F edge in 105-140"),
        pytest.param(140.5, 4, 2.0, id=f"{HEATING} above 140F in 141-200"),
        pytest.param(200.0, 4, 2.0, id=f"{HEATING} 200F edge in 141-200"),
        pytest.param(200.5, 4, 3.0, id=f"{HEATING} above 200F in 201-250"),
        pytest.param(250.0, 4, 3.0, id=f"{HEATING} 250F edge in 201-250"),
        pytest.param(250.5, 4, 4.5, id=f"{HEATING} above 250F in 251-350"),
        pytest.param(350.0, 4, 4.5, id=f"{HEATING} 350F edge in 251-350"),
        pytest.param(350.5, 4, 5.0, id=f"{HEATING} above 350F in >350"),
        pytest.param(700.0, 4, 5.0, id=f"{HEATING} 700F in >350"),
        pytest.param(60.5, 1, None, id=f"{COOLING} above 60F not covered"),
        pytest.param(60.0, 1, 0.5, id=f"{COOLING} 60F edge in 40-60"),
        pytest.param(40.0, 1, 0.5, id=f"{COOLING} 40F edge in 40-60"),
        pytest.param(39.5, 1, 1.0, id=f"{COOLING} below 40F in <40"),
        pytest.param(-20.0, 1, 1.0, id=f"{COOLING} -20F in <40"),
    ],
)
def test_ashrae_temperature_band_edges(temp_f, nps_in, expected_in):
    assert lookup_in(temp_f, nps_in) == expected_in


@pytest.mark.parametrize(
    "temp_f, nps_in, expected_in",
    [
        pytest.param(300.0, 0.75, 3.0, id=f"{HEATING} 251-350 NPS 3/4 in <1"),
        pytest.param(300.0, 1.0, 4.0, id=f"{HEATING} 251-350 NPS 1 edge in 1 to <1-1/2"),
        pytest.param(300.0, 1.25, 4.0, id=f"{HEATING} 251-350 NPS 1-1/4 in 1 to <1-1/2"),
        pytest.param(300.0, 1.5, 4.5, id=f"{HEATING} 251-350 NPS 1-1/2 edge in 1-1/2 to <4"),
        pytest.param(225.0, 3.5, 2.5, id=f"{HEATING} 201-250 NPS 3-1/2 in 1-1/2 to <4"),
        pytest.param(225.0, 4.0, 3.0, id=f"{HEATING} 201-250 NPS 4 edge in 4 to <8"),
        pytest.param(35.0, 0.75, 0.5, id=f"{COOLING} <40 NPS 3/4 in <1"),
        pytest.param(35.0, 1.0, 1.0, id=f"{COOLING} <40 NPS 1 edge in 1 to <1-1/2"),
        pytest.param(35.0, 6.0, 1.0, id=f"{COOLING} <40 NPS 6 in 4 to <8"),
        pytest.param(35.0, 8.0, 1.5, id=f"{COOLING} <40 NPS 8 edge in >=8"),
        pytest.param(35.0, 24.0, 1.5, id=f"{COOLING} <40 NPS 24 in >=8"),
    ],
)
def test_ashrae_size_band_edges(temp_f, nps_in, expected_in):
    assert lookup_in(temp_f, nps_in) == expected_in


def test_ashrae_full_table_values():
    # every cell, ASHRAE 90.1-2019 Tables 6.8.3-1 and 6.8.3-2 (from memory); inner temperatures only
    table = {
        400.0: [4.5, 5.0, 5.0, 5.0, 5.0],
        300.0: [3.0, 4.0, 4.5, 4.5, 4.5],
        225.0: [2.5, 2.5, 2.5, 3.0, 3.0],
        170.0: [1.5, 1.5, 2.0, 2.0, 2.0],
        120.0: [1.0, 1.0, 1.5, 1.5, 1.5],
        50.0: [0.5, 0.5, 1.0, 1.0, 1.0],
        30.0: [0.5, 1.0, 1.0, 1.0, 1.5],
    }
    for temp_f, row in table.items():
        assert [lookup_in(temp_f, nps) for nps in (0.5, 1.25, 2.0, 6.0, 10.0)] == row, temp_f


def test_outside_every_range_reason():
    req = required_thickness(ASHRAE, 30.0, 0.1143, 0.04, nominal_size_in=4)
    assert (req.thickness_m, req.covered, req.rule_row_source) == (None, False, "")
    assert req.reason == (
        "ashrae-90.1-2019: 30 °C lies outside the heating ranges (≥ 40.56 °C / 105 °F) "
        "and cooling ranges (≤ 15.56 °C / 60 °F)"
    )


# ------------------------------------------------------------------ the German-annex rule set


@pytest.mark.parametrize(
    "inner_mm, expected_mm",
    [
        pytest.param(16.0, 20.0, id="GEG 2020 Anlage 8 row 1 (from memory)"),
        pytest.param(22.0, 20.0, id="GEG 2020 Anlage 8 row 1 edge 22 mm (from memory)"),
        pytest.param(22.5, 30.0, id="GEG 2020 Anlage 8 row 2 above 22 mm (from memory)"),
        pytest.param(35.0, 30.0, id="GEG 2020 Anlage 8 row 2 edge 35 mm (from memory)"),
        pytest.param(35.5, 35.5, id="GEG 2020 Anlage 8 row 3 equal to inner diameter (from memory)"),
        pytest.param(100.0, 100.0, id="GEG 2020 Anlage 8 row 3 edge 100 mm (from memory)"),
        pytest.param(102.3, 100.0, id="GEG 2020 Anlage 8 row 4 over 100 mm (from memory)"),
    ],
)
def test_geg_inner_diameter_bands(inner_mm, expected_mm):
    req = required_thickness(GEG, 60.0, inner_mm / 1000 + 0.006, 0.035, inner_diameter_m=inner_mm / 1000)
    assert req.covered
    assert req.thickness_m * 1000 == pytest.approx(expected_mm, abs=1e-9)


def test_geg_other_conductivity_keeps_the_reference_resistance():
    # equivalent thickness: same cylinder resistance as 30 mm at 0.035 W/(m·K) (ht.conduction.R_cylinder)
    outer = 0.0337
    req = required_thickness(GEG, 60.0, outer, 0.040, inner_diameter_m=0.0285)
    assert R_cylinder(outer, outer + 2 * req.thickness_m, 0.040, 1.0) == pytest.approx(
        R_cylinder(outer, outer + 0.060, 0.035, 1.0), rel=1e-12)


def test_geg_temperature_edges_and_cooling_row():
    # the temperature ranges are a pipeins assumption (common practice), see the table's comments
    assert not required_thickness(GEG, 25.0, 0.0337, 0.035, inner_diameter_m=0.0285).covered
    assert required_thickness(GEG, 25.5, 0.0337, 0.035, inner_diameter_m=0.0285).covered
    cold = required_thickness(GEG, 20.0, 0.0337, 0.035, inner_diameter_m=0.0285)
    assert cold.thickness_m == pytest.approx(0.006, abs=1e-12)  # GEG 2020 Anlage 8 cold distribution 6 mm (from memory)
    gap = required_thickness(GEG, 22.0, 0.0337, 0.035, inner_diameter_m=0.0285)
    assert gap.reason == "de-geg-annex-8: 22 °C lies outside the heating ranges (> 25 °C) and cooling ranges (≤ 20 °C)"


# ------------------------------------------------------------------ loading, listing, errors


def test_shipped_rule_sets_and_listing():
    sets = load_rule_sets()
    assert sorted(sets) == [ASHRAE, GEG]
    assert len(sets[ASHRAE].rows) == 35 and len(sets[GEG].rows) == 5  # 7 temperature rows × 5 sizes; 4 + 1
    rows = list_rules()
    assert len(rows) == 40
    assert all(row["source"] for row in rows)
    assert all("from memory" in row["source"] for row in rows)


def test_required_thickness_errors():
    raises("--code", 'unknown rule set "ashrae"; did you mean "ashrae-90.1-2019"?', required_thickness, "ashrae", 80.0, 0.1, 0.04)
    raises(
        "--pipe", 'rule set "de-geg-annex-8" bands pipes by inner diameter; give inner_diameter_m',
        required_thickness, GEG, 80.0, 0.1, 0.04,
    )
    raises(
        "--pipe", 'rule set "ashrae-90.1-2019" bands pipes by nominal pipe size; give nominal_size_in',
        required_thickness, ASHRAE, 80.0, 0.1, 0.04, dn=100,
    )
    raises(
        "--conductivity", "material conductivity must be a finite number > 0 W/(m·K)",
        required_thickness, ASHRAE, 80.0, 0.1, 0.0, nominal_size_in=4,
    )
    raises("--fluid-temp", "fluid temperature must be a finite number in °C", required_thickness, ASHRAE, math.nan, 0.1, 0.04)
    raises("--pipe", "pipe outer diameter must be a finite number > 0 m", required_thickness, ASHRAE, 80.0, 0.0, 0.04)


USER_TABLE = """# a user rule set (invented for the test)
rule_set,service,fluid_temp_range_c,conductivity_min_w_mk,conductivity_max_w_mk,mean_rating_temp_c,dn_range,thickness_mm,source
site-rule,heating,(30..90],0.030,0.040,40,[0..50),40,invented test rule
site-rule,heating,(30..90],0.030,0.040,40,[50..inf),60,invented test rule
"""


def test_user_rule_set(tmp_path):
    path = tmp_path / "site.csv"
    path.write_text(USER_TABLE, encoding="utf-8")
    assert "site-rule" in load_rule_sets([path])
    req = required_thickness("site-rule", 60.0, 0.0603, 0.035, dn=50, extra_paths=[path])
    assert req.thickness_m == pytest.approx(0.060)  # the invented rule's value
    assert req.rule_row_source == "invented test rule (site.csv row 2)"
    outside = required_thickness("site-rule", 95.0, 0.0603, 0.035, dn=50, extra_paths=[path])
    assert outside.reason == "site-rule: 95 °C lies outside the heating ranges (30 °C to 90 °C)"


@pytest.mark.parametrize(
    "replace, message",
    [
        ("[50..inf)", "user.csv row 2 overlaps row 1 in temperature and size", ),
        ("[50..inf", 'user.csv row 2: dn_range range "[50..inf" is not of the form [a..b], (a..b], [a..inf) or (-inf..b)'),
        ("[50..inf]", 'user.csv row 2: dn_range range "[50..inf]" must use an open bracket at inf'),
    ],
)
def test_user_rule_set_errors(tmp_path, replace, message):
    text = USER_TABLE.replace("[0..50)", "[0..60)") if "overlaps" in message else USER_TABLE.replace("[50..inf)", replace)
    path = tmp_path / "user.csv"
    path.write_text(text, encoding="utf-8")
    raises("--code-table", message, load_rule_sets, [path])


def test_user_rule_set_may_not_reuse_a_shipped_name(tmp_path):
    path = tmp_path / "copy.csv"
    path.write_text(USER_TABLE.replace("site-rule", ASHRAE), encoding="utf-8")
    raises("--code-table", 'copy.csv defines rule set "ashrae-90.1-2019", which code_ashrae_90_1.csv already defines', load_rule_sets, [path])


def test_interval_edges():
    band = Interval.parse("[1..1.5)")
    assert band.contains(1.0) and band.contains(1.4999) and not band.contains(1.5) and not band.contains(0.99)
    assert band.contains(1.0 - 1e-12)  # rounding to 1e-9 puts a float-noise edge on the edge
    assert Interval.parse("(140..200]").overlaps(Interval.parse("[200..250]"))
    assert not Interval.parse("(140..200]").overlaps(Interval.parse("(200..250]"))
    assert str(Interval.parse("(-inf..40)")) == "(-inf..40)"


def test_reasons_speak_the_reports_units(run):
    # the service temperature and the thicknesses of a reason in the line's units; the row as the table
    # writes it (°F for ASHRAE). 26.67 °C = 80 °F, 50.8 mm = 2 in (converted with pint).
    assert UREG.Quantity(80, UREG.degF).to(UREG.degC).magnitude == pytest.approx(26.6667, abs=1e-4)
    us = required_thickness(ASHRAE, 26.6667, 0.1143, 0.040, nominal_size_in=4, units="us").reason
    assert us == "ashrae-90.1-2019: 80 °F lies outside the heating ranges (≥ 105 °F) and cooling ranges (≤ 60 °F)"
    adjusted = required_thickness(ASHRAE, 80.0, 0.1143, 0.050, nominal_size_in=4, units="us")
    inches = UREG.Quantity(adjusted.thickness_m, UREG.m).to(UREG.inch).magnitude
    assert adjusted.reason.endswith(f"to {inches:.2f}".rstrip("0").rstrip(".") + " in")
    assert "table 2 in for k" in adjusted.reason and "mm" not in adjusted.reason
    code, out, err = run("size", "--pipe", "NPS 2", "--fluid-temp", "80F", "--ambient-temp", "70F", "--material",
                         "mineral wool", "--code", ASHRAE, "--max-heat-flow", "10", "--units", "us")
    assert code == 0, err
    assert "not covered (ashrae-90.1-2019: 80 °F lies outside the heating ranges (≥ 105 °F)" in out
    assert "°C" not in out.split("Warnings")[1]
