"""``check --condition``: the line solved under each design condition.

References: a hand calculation of the series resistances of a cylindrical layer (any
heat-transfer text: R = ln(r2/r1)/(2πk) per metre, 1/(h·2πr2) for a fixed outer coefficient)
for the heat flow, ``psychrolib`` (ASHRAE Handbook - Fundamentals psychrometrics) for the dew
point, and ``check`` run under each condition alone for every figure of the table."""

from __future__ import annotations

import json
import math

import pytest

LINE = ["check", "--pipe", "DN80", "--fluid-temp", "7C", "--layer", "flexible elastomeric foam:25mm"]
SUMMER = "summer: ambient-temp=32C, rh=75"
NIGHT = "night: ambient-temp=24C, rh=90"
WINTER = "winter: ambient-temp=-10C, wind=5m/s"


def _json(run, *args):
    code, out, err = run(*args, "--format", "json")
    assert code == 0, err
    return json.loads(out)


def test_each_condition_is_the_line_checked_under_it_alone(run):
    data = _json(run, *LINE, "--condition", SUMMER, "--condition", NIGHT, "--condition", WINTER)
    rows = {c["name"]: c for c in data["design_conditions"]}
    assert list(rows) == ["summer", "night", "winter"] and data["checked_under"] == "summer"
    alone = {"summer": ["--ambient-temp", "32C", "--rh", "75"], "night": ["--ambient-temp", "24C", "--rh", "90"],
             "winter": ["--ambient-temp", "-10C", "--wind", "5m/s"]}
    for name, args in alone.items():
        one = _json(run, *LINE, *args)
        q = one["heat_flow_w_per_m"]
        assert rows[name]["heat_loss_w_per_m"] == pytest.approx(max(q, 0.0), rel=1e-9, abs=1e-12)
        assert rows[name]["heat_gain_w_per_m"] == pytest.approx(max(-q, 0.0), rel=1e-9, abs=1e-12)
        assert rows[name]["surface_temp_c"] == pytest.approx(one["surface_temp_c"], rel=1e-9)
    # the check itself is under the first condition
    assert data["heat_flow_w_per_m"] == pytest.approx(-rows["summer"]["heat_gain_w_per_m"], rel=1e-9)
    # a gain in summer, a loss in winter: apart, never netted
    assert rows["summer"]["heat_loss_w_per_m"] == 0.0 < rows["summer"]["heat_gain_w_per_m"]
    assert rows["winter"]["heat_gain_w_per_m"] == 0.0 < rows["winter"]["heat_loss_w_per_m"]


def test_the_heat_flow_under_a_fixed_coefficient_is_the_hand_series_sum(run):
    """k = 0.040 W/(m·K) over 25 mm on DN80 (OD 88.9 mm), h = 8 W/(m²·K) fixed: q = ΔT / ΣR
    (the steel wall, about 1e-4 m·K/W against 1.9, is left out: within 0.1 %)."""
    data = _json(run, "check", "--pipe", "DN80", "--fluid-temp", "7C", "--layer", "k=0.040:25mm",
                 "--condition", "a: ambient-temp=30C, outer-h=8", "--condition", "b: ambient-temp=20C, outer-h=8")
    r1, r2 = 0.0889 / 2, 0.0889 / 2 + 0.025
    resistance = math.log(r2 / r1) / (2 * math.pi * 0.040) + 1 / (8 * 2 * math.pi * r2)
    for row, air in zip(data["design_conditions"], (30.0, 20.0)):
        assert row["heat_gain_w_per_m"] == pytest.approx((air - 7.0) / resistance, rel=1e-3)


def test_the_dew_point_of_each_condition_is_psychrolibs(run):
    psychrolib = pytest.importorskip("psychrolib")
    psychrolib.SetUnitSystem(psychrolib.SI)
    data = _json(run, *LINE, "--condition", SUMMER, "--condition", NIGHT)
    for row, (t, rh) in zip(data["design_conditions"], ((32.0, 0.75), (24.0, 0.90))):
        assert row["dew_point_c"] == pytest.approx(psychrolib.GetTDewPointFromRelHum(t, rh), abs=0.05)
        assert row["above_dew_point_k"] == pytest.approx(row["surface_temp_c"] - row["dew_point_c"], abs=1e-9)


def test_a_further_condition_that_sweats_is_named_in_the_warnings(run):
    data = _json(run, *LINE, "--condition", SUMMER, "--condition", NIGHT)
    night = next(n for n in data["notes"] if n["code"] == "surface.below_dew_point")
    assert night["subject"] == "night" and night["text"].startswith("night: surface")
    code, out, err = run(*LINE, "--condition", SUMMER, "--condition", NIGHT, "--units", "us")
    assert code == 0 and "night: surface" in out and "°F" in out.split("night: surface")[1].splitlines()[0]
    assert 'Results (under "summer")' in out and "Design conditions" in out


def test_a_winter_condition_brings_the_freezing_caution(run):
    code, out, err = run(*LINE, "--condition", SUMMER, "--condition", WINTER)
    assert code == 0 and "Insulation only delays freezing" in out
    code, out, err = run(*LINE, "--condition", SUMMER)
    assert code == 0 and "Insulation only delays freezing" not in out


@pytest.mark.parametrize("fmt", ["text", "csv", "markdown", "html"])
def test_every_format_carries_the_conditions(run, fmt):
    code, out, err = run(*LINE, "--condition", SUMMER, "--condition", WINTER, "--format", fmt)
    assert code == 0, err
    assert "winter" in out


def test_the_workbook_has_the_conditions_sheet(run, tmp_path):
    openpyxl = pytest.importorskip("openpyxl")
    target = tmp_path / "check.xlsx"
    code, out, err = run(*LINE, "--condition", SUMMER, "--condition", WINTER, "--format", "xlsx", "-o", str(target))
    assert code == 0, err
    book = openpyxl.load_workbook(target)
    sheet = next(ws for ws in book.worksheets if ws.title.lower().startswith("design"))
    assert [sheet.cell(row=r, column=1).value for r in (2, 3)] == ["summer", "winter"]


@pytest.mark.parametrize("extra, words", [
    (["--condition", "summer: ambient-temp=32C, criteria=condensation"], "criteria= chooses"),
    (["--condition", "summer: ambient-temp=32C, colour=red"], 'unknown key "colour"'),
    (["--condition", "summer: ambient-temp=hot"], "summer"),
    (["--condition", SUMMER, "--condition", SUMMER], "given twice"),
    (["--condition", SUMMER, "--buried", "1m", "--soil-k", "1.2", "--ground-temp", "8C"], "buried line"),
])
def test_bad_conditions_are_one_line(run, tmp_path, extra, words):
    target = tmp_path / "out.json"
    code, out, err = run(*LINE, *extra, "-o", str(target))
    assert code == 2 and out == ""
    assert err.startswith("Error: --condition") and words in err and len(err.strip().splitlines()) == 1
    assert not target.exists()
