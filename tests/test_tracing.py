"""Heat tracing: the design heat loss with its safety factor, the tracer-output comparison,
and the tracer-output sizing criterion.

Checks against sources outside the code: the design heat loss against a hand series
calculation of the resistance network (cylindrical conduction, ln(r2/r1)/(2πk), in series
with a fixed outer coefficient) times (1 + SF); the least thickness at which a tracer output
suffices, verified by re-solving the line there.
"""

from __future__ import annotations

import json
import math

import numpy as np
import pytest

from pipeins.cli import main
from pipeins.line import LineSpec
from pipeins.tracing import (DEFAULT_SAFETY_FACTOR_PERCENT, TracerOutput, design_heat_loss)


def _run(capsys, *args):
    with pytest.raises(SystemExit) as exc:
        main(list(args))
    out, err = capsys.readouterr()
    return exc.value.code, out, err


def _ok(capsys, *args):
    try:
        main(list(args))
        code = 0
    except SystemExit as exc:
        code = exc.code or 0
    out, err = capsys.readouterr()
    assert code == 0, err
    return out


OD, WALL, T, H = 0.0603, 0.0039, 0.040, 10.0


def _hand_loss(maintain, ambient, k_wall, k_ins=0.040, h=H):
    """Series resistances per metre, by hand (cylindrical shells and a fixed outer film)."""
    ri, ro, r2 = OD / 2 - WALL, OD / 2, OD / 2 + T
    resistance = (math.log(ro / ri) / (2 * math.pi * k_wall) + math.log(r2 / ro) / (2 * math.pi * k_ins)
                  + 1 / (h * 2 * math.pi * r2))
    return (maintain - ambient) / resistance


def test_design_heat_loss_against_hand_series_calculation_with_safety_factor():
    # hand calculation: q = ΔT / ΣR (conduction through cylinders, fixed outer coefficient), times 1 + SF
    spec = LineSpec(outer_diameter_m=OD, wall_m=WALL, layers=(("k=0.040", T),), fluid_temp_c=60.0,
                    air_temp_c=10.0, outer_h_w_m2k=H, inner_h_w_m2k=500.0, flow=None)
    design = design_heat_loss(spec, 5.0, 25.0, min_ambient_c=-20.0)
    k_wall = float(spec.build_pipe().wall_conductivity_w_mk)
    hand = _hand_loss(5.0, -20.0, k_wall)
    assert design.heat_loss_w_per_m == pytest.approx(hand, rel=1e-8)
    assert design.design_heat_loss_w_per_m == pytest.approx(hand * 1.25, rel=1e-8)
    assert design.safety_factor_percent == 25.0
    # the default safety factor is 20 % (common practice after IEEE 515 / IEC/IEEE 60079-30-2, from memory)
    default = design_heat_loss(spec, 5.0, min_ambient_c=-20.0)
    assert DEFAULT_SAFETY_FACTOR_PERCENT == 20.0
    assert default.design_heat_loss_w_per_m == pytest.approx(hand * 1.20, rel=1e-8)


def test_tracer_margin_is_output_less_design_loss():
    spec = LineSpec(outer_diameter_m=OD, wall_m=WALL, layers=(("k=0.040", T),), fluid_temp_c=5.0,
                    air_temp_c=-20.0, outer_h_w_m2k=H, length_m=50.0)
    d = design_heat_loss(spec, 5.0, 20.0, tracer_output_w_per_m=10.0, fittings_heat_loss_w=30.0)
    assert d.margin_w_per_m == pytest.approx(10.0 - d.design_heat_loss_w_per_m, rel=1e-12)
    assert d.sufficient is (d.margin_w_per_m >= 0)
    assert d.fittings_allowance_w == pytest.approx(36.0)
    assert d.design_heat_loss_w == pytest.approx(50 * d.design_heat_loss_w_per_m + 36.0)
    low = design_heat_loss(spec, 5.0, 20.0, tracer_output_w_per_m=1.0)
    assert low.sufficient is False and low.margin_percent < 0


def test_check_json_contract(capsys):
    out = _ok(capsys, "check", "--pipe", "NPS 2", "--fluid-temp", "40C", "--ambient-temp", "5C", "--wind", "3m/s",
              "--layer", "mineral wool:40mm", "--maintain-temp", "5C", "--min-ambient", "-20C",
              "--safety-factor", "20 %", "--tracer-output", "15W/m", "--format", "json")
    data = json.loads(out)
    tracing = data["tracing"]
    assert tracing["safety_factor_percent"] == 20.0
    assert tracing["maintain_temp_c"] == 5.0 and tracing["min_ambient_c"] == -20.0 and tracing["wind_m_s"] == 3.0
    assert tracing["design_heat_loss_w_per_m"] == pytest.approx(1.2 * tracing["heat_loss_w_per_m"], rel=1e-8)
    # solved at the maintain temperature and the minimum ambient, not the line's own conditions
    again = design_heat_loss(LineSpec(pipe="NPS 2", fluid_temp_c=5.0, air_temp_c=-20.0, wind_m_s=3.0,
                                      layers=(("mineral wool", 0.040),)), 5.0, 20.0)
    assert tracing["heat_loss_w_per_m"] == pytest.approx(again.heat_loss_w_per_m, rel=1e-8)
    assert tracing["margin_w_per_m"] == pytest.approx(15.0 - tracing["design_heat_loss_w_per_m"])
    text = _ok(capsys, "check", "--pipe", "NPS 2", "--fluid-temp", "40C", "--ambient-temp", "5C",
               "--layer", "mineral wool:40mm", "--maintain-temp", "50F", "--units", "us")
    assert "Heat tracing" in text and "Btu/(h·ft)" in text and "IEEE 515" in text


def test_size_tracer_criterion_verified_by_re_solving(capsys):
    args = ("--pipe", "NPS 2", "--fluid-temp", "5C", "--ambient-temp", "-20C", "--wind", "5m/s",
            "--material", "mineral wool", "--tracer-output", "10W/m", "--safety-factor", "25")
    data = json.loads(_ok(capsys, "size", *args, "--format", "json"))
    need_mm = data["required_thickness_mm"]["tracer"]
    assert data["governing"] == "tracer" and need_mm > 0
    criterion = TracerOutput(10.0, 25.0)
    for thickness, passes in ((need_mm / 1000, True), (need_mm / 1000 - 0.0001, False)):
        spec = LineSpec(pipe="NPS 2", fluid_temp_c=5.0, air_temp_c=-20.0, wind_m_s=5.0,
                        layers=(("mineral wool", thickness),))
        design = design_heat_loss(spec, 5.0, 25.0)
        assert bool(design.design_heat_loss_w_per_m <= 10.0) is passes
        assert bool(criterion.margin(None, spec.solve(), thickness) >= 0) is passes
    # at the commercial pick the output suffices too
    spec = LineSpec(pipe="NPS 2", fluid_temp_c=5.0, air_temp_c=-20.0, wind_m_s=5.0,
                    layers=(("mineral wool", data["selected_thickness_mm"] / 1000),))
    assert design_heat_loss(spec, 5.0, 25.0, tracer_output_w_per_m=10.0).sufficient
    table = json.loads(_ok(capsys, "table", *args[2:], "--sizes", "NPS 1..NPS 3", "--format", "json"))
    assert "tracer" in json.dumps(table)


@pytest.mark.parametrize("extra, message", [
    (("--maintain-temp", "5C", "--tracer-output", "0W/m"), "--tracer-output"),
    (("--maintain-temp", "5C", "--tracer-output", "-3"), "--tracer-output"),
    (("--maintain-temp", "-30C"), "--maintain-temp: the maintain temperature -30 °C must be above"),
    (("--maintain-temp", "5C", "--safety-factor", "150"), "--safety-factor: the safety factor must be"),
    (("--safety-factor", "20"), "--safety-factor: is a heat-tracing input: give --maintain-temp too"),
    (("--tracer-output", "10W/m"), "--tracer-output: is a heat-tracing input"),
])
def test_bad_tracing_input_is_one_line_exit_2_nothing_written(capsys, tmp_path, extra, message):
    target = tmp_path / "out.json"
    code, out, err = _run(capsys, "check", "--pipe", "NPS 2", "--fluid-temp", "5C", "--ambient-temp", "-20C",
                          "--layer", "mineral wool:40mm", *extra, "--format", "json", "-o", str(target))
    assert code == 2 and out == ""
    assert err.count("\n") == 1 and err.startswith("Error: ") and message in err, err
    assert not target.exists()


@pytest.mark.parametrize("extra, message", [
    (("--tracer-output", "0"), "Error: --tracer-output"),
    (("--tracer-output", "10W/m", "--fluid-temp", "-30C"), "--tracer-output: a tracer makes up a heat loss"),
])
def test_bad_tracer_criterion(capsys, extra, message):
    code, out, err = _run(capsys, "size", "--pipe", "NPS 2", "--fluid-temp", "5C", "--ambient-temp", "-20C",
                          "--material", "mineral wool", *extra)
    assert code == 2 and out == "" and message in err and err.count("\n") == 1, err


# -- freeze protection: the traced alternative beyond a practical thickness ---------------------

def test_freeze_hold_beyond_practical_thickness_offers_tracing_with_hand_design_loss(capsys):
    # hand: q = (5 − (−12)) / (ln(ro/ri)/(2π kw) + ln((ro+0.1)/ro)/(2π·0.030) + 1/(25·2π(ro+0.1))) × 1.20
    from pipeins.freezing import FREEZE_MAINTAIN_TEMP_C, PRACTICAL_FREEZE_THICKNESS_M

    assert PRACTICAL_FREEZE_THICKNESS_M == 0.100 and FREEZE_MAINTAIN_TEMP_C == 5.0  # common practice
    data = json.loads(_ok(capsys, "size", "--pipe", "NPS 1", "--fluid-temp", "10C", "--ambient-temp", "-12C",
                          "--outer-h", "25", "--material", "k=0.030", "--hold-time", "8h", "--no-touch-check",
                          "--format", "json"))
    freeze = next(c for c in data["criteria"] if c["key"] == "freeze")
    assert freeze["required_mm"] > 100
    (alt,) = data["traced_alternative"]
    assert alt["code"] == "freeze_traced_alternative" and alt["thickness_m"] == 0.1
    assert alt["required_m"] == pytest.approx(freeze["required_mm"] / 1000, abs=1e-4)
    od, wall = 0.0334, 0.00338  # NPS 1 schedule 40, ASME B36.10M
    k_wall = float(LineSpec(pipe="NPS 1", fluid_temp_c=5.0).build_pipe().wall_conductivity_w_mk)
    ro, ri, r2 = od / 2, od / 2 - wall, od / 2 + 0.1
    resistance = (math.log(ro / ri) / (2 * math.pi * k_wall) + math.log(r2 / ro) / (2 * math.pi * 0.030)
                  + 1 / (25.0 * 2 * math.pi * r2))
    assert alt["design_heat_loss_w_per_m"] == pytest.approx(17.0 / resistance * 1.20, rel=1e-6)
    assert any("heat tracing is the usual alternative" in w for w in data["warnings"])


def test_no_traced_alternative_within_the_practical_thickness(capsys):
    data = json.loads(_ok(capsys, "size", "--pipe", "NPS 2", "--fluid-temp", "10C", "--ambient-temp", "-5C",
                          "--material", "mineral wool", "--hold-time", "2h", "--no-touch-check", "--format", "json"))
    assert next(c for c in data["criteria"] if c["key"] == "freeze")["required_mm"] < 100
    assert "traced_alternative" not in data


def test_traced_alternative_and_freeze_sentences_follow_units_us(capsys):
    out = _ok(capsys, "size", "--pipe", "NPS 1", "--fluid-temp", "50F", "--ambient-temp", "10F", "--outer-h", "4",
              "--material", "k=0.2", "--hold-time", "8h", "--no-touch-check", "--units", "us", "--format", "json")
    data = json.loads(out)
    assert next(c for c in data["criteria"] if c["key"] == "freeze")["requirement"] == \
        "still water holds 8.0 h before it reaches 32 °F"
    text = next(w for w in data["warnings"] if "heat tracing" in w)
    assert "3.94 in" in text and "41.0 °F" in text and "Btu/(h·ft)" in text
    assert " mm" not in text and "°C" not in text and "W/m" not in text


def test_freeze_and_run_criterion_sentences_in_us_units():
    from pipeins.freezing import FreezeHold
    from pipeins.runs import TempChange

    crit = FreezeHold(3600.0)
    crit.units = "us"
    assert crit.miss(-0.5, 0.0508) == ("freeze protection cannot be met: with 2.00 in still water reaches 32 °F "
                                       "after 0.5 h, 0.5 h short of the 1.0 h hold time")
    run = TempChange(max_change_k=2.0, fluid_name="water", flow=1.0, length_m=30.48)
    run.units = "us"
    text = run.miss(-1.0, 0.0508)
    assert text.startswith("temperature change cannot be met: with 2.00 in the fluid still changes by 5.4 °F over "
                           "100.0 ft")
    assert " K" not in text and " mm" not in text
    assert "°F" in run.state_text(0.5) and " K" not in run.state_text(0.5)


@pytest.mark.parametrize("command, args, line", [
    ("check", ("--layer", "mineral wool:1in", "--maintain-temp", "40F", "--min-ambient", "50F"),
     "Error: --maintain-temp: the maintain temperature 40.0 °F must be above the minimum design ambient "
     "(--min-ambient) 50.0 °F (no tracer is needed otherwise)"),
    ("check", ("--layer", "mineral wool:1in", "--maintain-temp", "40F", "--tracer-output", "-3"),
     "Error: --tracer-output: the tracer output must be greater than zero (got -3.0 Btu/(h·ft))"),
    ("size", ("--material", "mineral wool", "--tracer-output", "3", "--no-touch-check", "--ambient-temp", "50F"),
     "Error: --tracer-output: a tracer makes up a heat loss: the fluid (the maintain temperature, 40.0 °F) must be "
     "above the air (50.0 °F)"),
])
def test_tracing_messages_follow_units_us(capsys, command, args, line):
    base = ("--pipe", "NPS 2", "--fluid-temp", "40F", "--units", "us")
    if "--ambient-temp" not in args:
        base += ("--ambient-temp", "0F")
    code, out, err = _run(capsys, command, *base, *args)
    assert code == 2 and out == "" and err.strip() == line
