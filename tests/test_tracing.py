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
