"""pipeins sweep: every swept value agrees with an independent check / size run at that value;
physical trends; every format; exact error lines."""

import json

import numpy as np
import pytest

from pipeins.line import LineSpec
from pipeins.sweep import sweep

HOT = ("--pipe", "NPS 4", "--fluid-temp", "180C", "--ambient-temp", "5C")
COLD = ("--pipe", "DN50", "--fluid-temp", "6C", "--ambient-temp", "28C")


def _json(run, *args):
    code, out, err = run(*args, "--format", "json")
    assert code == 0, err
    return json.loads(out)


# --------------------------------------------------------------------------- agreement
@pytest.mark.parametrize("vary, flag, line", [
    ("wind=0..10m/s:3", "--wind", HOT + ("--layer", "mineral wool:50mm")),
    ("emittance=0.1..0.9:3", "--emittance", HOT + ("--layer", "mineral wool:50mm")),
    ("ambient-temp=-10..30C:3", "--ambient-temp", ("--pipe", "NPS 4", "--fluid-temp", "180C",
                                                   "--layer", "mineral wool:50mm")),
    ("rh=40..90%:3", "--rh", COLD + ("--layer", "flexible elastomeric foam:13mm")),
    ("fluid-temp=-20..150C:3", "--fluid-temp", ("--pipe", "DN50", "--layer", "mineral wool:30mm")),
    ("surroundings-temp=-20..40C:3", "--surroundings-temp", HOT + ("--layer", "mineral wool:50mm")),
])
def test_heat_flow_at_each_value_equals_a_single_check(run, vary, flag, line):
    """One vectorised solve over the sweep gives what an independent `pipeins check` at each
    value gives (the same solver, so to its tolerance of 1e-9 relative on q)."""
    swept = _json(run, "sweep", "--vary", vary, *line)
    unit = {"--wind": "m/s", "--emittance": "", "--rh": "%"}.get(flag, "C")
    for row in swept["rows"]:
        checked = _json(run, "check", *line, flag, f"{row['value']:g}{unit}")
        assert row["heat_flow_w_per_m"] == pytest.approx(checked["heat_flow_w_per_m"], rel=1e-7)
        assert row["surface_temp_c"] == pytest.approx(checked["surface_temp_c"], abs=1e-6)


@pytest.mark.parametrize("vary, flag, line", [
    ("wind=0..10m/s:3", "--wind", ("--pipe", "NPS 6", "--steam-pressure", "10barg", "--ambient-temp", "5C",
                                   "--finish", "aluminium, dull or aged", "--max-heat-flow", "90W/m")),
    ("rh=50..85%:3", "--rh", COLD),
    ("ambient-temp=15..35C:3", "--ambient-temp", ("--pipe", "DN50", "--fluid-temp", "6C", "--rh", "75")),
])
def test_thickness_per_criterion_equals_size_at_each_value(run, vary, flag, line):
    """The sweep lays its values along the selection's size axis; each row must size as
    `pipeins size` sizes that value alone (least thickness to the search's 0.01 mm)."""
    material = "flexible elastomeric foam" if "6C" in line else "mineral wool"
    swept = _json(run, "sweep", "--vary", vary, *line, "--material", material)
    unit = {"--wind": "m/s", "--rh": "%"}.get(flag, "C")
    for row in swept["rows"]:
        sized = _json(run, "size", *line, flag, f"{row['value']:g}{unit}", "--material", material)
        for key, mm in sized["required_thickness_mm"].items():
            if mm is not None:
                assert row["required_thickness_mm"][key] == pytest.approx(mm, abs=0.011), key
        assert row["selected_thickness_mm"] == sized["selected_thickness_mm"]
        assert row["governing"] == sized["governing"]


def test_conductivity_factor_on_a_constant_k_equals_the_scaled_constant():
    """A factor f on k = 0.040 W/(m·K) is the same line as k = 0.040·f (Fourier's law is
    linear in k): the sweep's heat flow and least thickness equal those of k=0.05."""
    spec = LineSpec(pipe="NPS 4", fluid_temp_c=180.0, air_temp_c=5.0, layers=(("k=0.040", 0.05),))
    s = sweep(spec, "conductivity_factor", [1.0, 1.25], material="k=0.040")
    plain = sweep(LineSpec(pipe="NPS 4", fluid_temp_c=180.0, air_temp_c=5.0, layers=(("k=0.05", 0.05),)),
                  "wind_m_s", [0.0, 1.0], material="k=0.05")
    assert s.heat_flow_w_per_m[1] == pytest.approx(plain.heat_flow_w_per_m[0], rel=1e-9)
    assert s.required_m["surface_temp"][1] == pytest.approx(plain.required_m["surface_temp"][0], abs=1e-5)
    assert s.heat_flow_w_per_m[0] < s.heat_flow_w_per_m[1]


# --------------------------------------------------------------------------- physical facts
def test_heat_loss_of_a_hot_line_rises_with_wind():
    """Physical fact: forced convection raises the outer film coefficient with the air speed
    (any cross-flow correlation, e.g. Churchill-Bernstein), so a hot line loses more heat in
    more wind, and its surface runs cooler."""
    spec = LineSpec(pipe="NPS 4", fluid_temp_c=180.0, air_temp_c=5.0, layers=(("mineral wool", 0.05),))
    s = sweep(spec, "wind_m_s", np.linspace(0.0, 10.0, 11))
    assert np.all(np.diff(s.heat_flow_w_per_m) > 0)
    assert np.all(np.diff(s.surface_temp_c) < 0)


def test_condensation_thickness_rises_with_humidity():
    """Physical fact: at a fixed air temperature the dew point rises with the relative
    humidity (psychrometrics), so a chilled line needs more insulation to keep its surface
    above it."""
    spec = LineSpec(pipe="DN50", fluid_temp_c=6.0, air_temp_c=28.0)
    s = sweep(spec, "rh_percent", np.linspace(50.0, 85.0, 8), material="flexible elastomeric foam")
    need = s.required_m["condensation"]
    assert np.all(np.isfinite(need)) and np.all(np.diff(need) > 0)
    assert np.all(np.diff(s.selected_m) >= 0)


def test_heat_loss_rises_with_the_conductivity_factor():
    """Physical fact: a larger conductivity conducts more heat through the same layer."""
    spec = LineSpec(pipe="NPS 4", fluid_temp_c=180.0, air_temp_c=5.0, layers=(("mineral wool", 0.05),))
    s = sweep(spec, "conductivity_factor", [1.0, 1.2, 1.4])
    assert np.all(np.diff(s.heat_flow_w_per_m) > 0)


def test_criterion_met_bare_needs_nothing_and_governs_nothing(run):
    data = _json(run, "sweep", "--vary", "ambient=-10..30:3", "--pipe", "NPS 2", "--fluid-temp", "60C",
                 "--material", "mineral wool", "--hold-time", "8h")
    first, last = data["rows"][0], data["rows"][-1]
    assert first["required_thickness_mm"]["freeze"] > 0 and first["governing"] == "freeze"
    assert last["required_thickness_mm"]["freeze"] == 0 and last["governing"] is None


# --------------------------------------------------------------------------- formats and charts
@pytest.mark.parametrize("fmt", ["text", "markdown", "csv", "json", "html"])
def test_every_text_format(run, fmt):
    code, out, err = run("sweep", "--vary", "rh=50..90:5", *COLD, "--material", "flexible elastomeric foam",
                         "--format", fmt)
    assert code == 0 and err == ""
    assert "relative humidity" in out


def test_xlsx_and_plot_files(run, tmp_path):
    pytest.importorskip("openpyxl")
    pytest.importorskip("matplotlib")
    book, plot = tmp_path / "s.xlsx", tmp_path / "s.svg"
    code, out, err = run("sweep", "--vary", "wind=0..10:3", *HOT, "--material", "mineral wool",
                         "--format", "xlsx", "-o", str(book), "--plot", str(plot))
    assert code == 0 and err == ""
    import openpyxl

    ws = openpyxl.load_workbook(book, read_only=True).worksheets[0]
    rows = list(ws.values)
    assert rows[0][0] == "wind speed [m/s]" and [r[0] for r in rows[1:]] == [0.0, 5.0, 10.0]
    assert plot.read_text(encoding="utf-8").lstrip().startswith(("<?xml", "<svg"))


def test_chart_data_are_the_swept_numbers():
    from pipeins.reports.sweep import sweep_report

    spec = LineSpec(pipe="DN50", fluid_temp_c=6.0, air_temp_c=28.0)
    s = sweep(spec, "rh_percent", [50.0, 70.0, 90.0], material="flexible elastomeric foam")
    report = sweep_report(s)
    (chart,) = report.charts
    assert chart.kind == "sweep"
    d = chart.data
    assert d["values"] == [50.0, 70.0, 90.0]
    assert d["heat_flow_w_per_m"] == [r["heat_flow_w_per_m"] for r in report.data["rows"]]
    assert [None if t is None else round(t * 1000, 2) for t in d["required"][0]["thickness_m"]] == \
        [r["required_thickness_mm"]["condensation"] for r in report.data["rows"]]


def test_without_a_material_only_the_heat_flow(run):
    data = _json(run, "sweep", "--vary", "wind=0..4:3", *HOT, "--layer", "mineral wool:50mm")
    assert "required_thickness_mm" not in data["rows"][0] and "material" not in data


def test_losses_and_gains_are_shown_apart(run):
    code, out, _ = run("sweep", "--vary", "fluid-temp=-20..150C:3", "--pipe", "DN50", "--layer",
                       "mineral wool:30mm", "--format", "csv")
    body = [x for x in out.splitlines() if not x.startswith("#")]  # basis and cautions as comment lines
    head = body[0]
    assert "heat loss of the build-up [W/m]" in head and "heat gain of the build-up [W/m]" in head
    assert body[1].split(",")[1:3] == ["", "11.3"]  # CSV: not applicable is an empty cell


# --------------------------------------------------------------------------- bad input
ALLOWED = "wind, emittance, ambient-temp, surroundings-temp, rh, fluid-temp, k-factor"


@pytest.mark.parametrize("vary, extra, line", [
    ("wind=0..10:1", (), 'Error: --vary: "wind=0..10:1": a sweep has 2 to 201 points (got 1)'),
    ("wind=0..10:500", (), 'Error: --vary: "wind=0..10:500": a sweep has 2 to 201 points (got 500)'),
    ("wind=5..5m/s:4", (), 'Error: --vary: "wind=5..5m/s:4": the range is empty (start equals stop); '
                           "give two different ends"),
    ("wind=-1..10:5", (), 'Error: --vary: "wind=-1..10:5": wind speed must be from 0 to 100 m/s'),
    ("rh=50..120:8", (), 'Error: --vary: "rh=50..120:8": relative humidity must be above 0 and at most 100 %'),
    ("emittance=0.1..1.2:5", (), 'Error: --vary: "emittance=0.1..1.2:5": emittance must be above 0 and at most 1'),
    ("fluid-temp=0..1500C:3", (), 'Error: --vary: "fluid-temp=0..1500C:3": fluid temperature must be above '
                                  "-273.15 and at most 1000 °C"),
    ("k-factor=0..2:3", (), 'Error: --vary: "k-factor=0..2:3": "0" is out of range for a conductivity factor; '
                            "give a number above 0 and at most 10"),
    ("wnd=0..10:5", (), f'Error: --vary: unknown input "wnd"; did you mean "wind"? (vary one of {ALLOWED})'),
    ("wind 0-10", (), f'Error: --vary: "wind 0-10": write NAME=START..STOP[unit]:N, e.g. wind=0..10m/s:11; '
                      f"NAME is one of {ALLOWED}"),
    ("wind=0..10:x", (), 'Error: --vary: "wind=0..10:x": the number of points "x" is not a whole number; '
                         "write NAME=START..STOP[unit]:N, e.g. wind=0..10m/s:11"),
    ("wind=0..10:3", ("--wind", "3"), "Error: --vary: wind is swept; drop --wind"),
    ("wind=0..10:3", ("--outer-h", "10"), "Error: --vary: a fixed outer coefficient replaces convection and "
                                          "radiation; drop --outer-h to sweep --wind"),
    ("fluid-temp=100..200:3", ("--steam-pressure", "10barg"),
     "Error: --vary: saturated steam is at its saturation temperature; give --fluid-temp instead of "
     "--steam-pressure to sweep it"),
])
def test_bad_ranges_are_one_line_errors(run, tmp_path, vary, extra, line):
    target = tmp_path / "out.json"
    code, out, err = run("sweep", "--vary", vary, "--pipe", "DN50", *(("--fluid-temp", "80C") if not any(
        "steam" in x for x in extra) else ()), *extra, "--layer", "mineral wool:30mm", "-o", str(target))
    assert (code, out) == (2, "")
    assert err.strip() == line
    assert not target.exists()


def test_k_factor_needs_insulation(run):
    code, _, err = run("sweep", "--vary", "k-factor=1..1.5:3", "--pipe", "DN50", "--fluid-temp", "80C")
    assert code == 2
    assert err.strip() == "Error: --vary: k-factor scales the insulation's conductivity; give --layer or --material"


def test_a_unit_on_one_end_applies_to_the_other(run):
    data = _json(run, "sweep", "--vary", "wind=0..22.36936mph:2", *HOT, "--layer", "mineral wool:50mm")
    assert data["values"] == pytest.approx([0.0, 10.0], abs=1e-3)


def test_a_criterion_that_sets_no_thickness_stays_out_of_the_table(run):
    args = ("sweep", "--vary", "wind=0..20:3", "--pipe", "NPS 2", "--fluid-temp", "150C", "--material",
            "mineral wool")
    data = _json(run, *args)
    keys = [c["key"] for c in data["criteria"]]
    code, out, _ = run(*args, "--format", "csv")
    head = next(line for line in out.splitlines() if not line.startswith("#"))
    assert "least for touch safety [mm]" in head
    for c in data["criteria"]:
        if all(r["required_thickness_mm"][c["key"]] is None for r in data["rows"]):
            assert f"least for {c['label']}" not in head
    assert "surface_temp" in keys
