"""Charts: the numbers behind each chart are the solved values; the files are valid SVG/PNG;
commands that draw nothing never import matplotlib or openpyxl."""

from __future__ import annotations

import json
import subprocess
import sys
import xml.etree.ElementTree as ET
from pathlib import Path

import numpy as np
import pytest

from pipeins.line import LineSpec
from pipeins.units import Flow
from pipeins.reports import charts

ROOT = Path(__file__).resolve().parent.parent
HOT = ["--pipe", "NPS 4", "--fluid-temp", "180C", "--ambient-temp", "25C"]


def test_profile_data_is_the_solve():
    spec = LineSpec(pipe="NPS 2", fluid_temp_c=150.0, air_temp_c=20.0,
                    layers=(("mineral wool", 0.040), ("k=0.05", 0.02)))
    result = spec.solve()
    d = charts.profile_data(result)
    assert d["temp_c"] == pytest.approx([float(t) for t in np.ravel(result.interface_temps_c)], rel=1e-12)
    assert d["temp_c"][-1] == pytest.approx(float(result.surface_temp_c), rel=1e-12)
    # diameters: bore, pipe OD, then +2 x each layer (NPS 2: OD 60.3 mm, from the ASME B36.10 table)
    assert d["diameter_m"][1] == pytest.approx(0.0603, abs=1e-4)
    assert np.diff(d["diameter_m"])[1:] == pytest.approx([0.08, 0.04])
    assert len(d["bands"]) == 3 and d["air_temp_c"] == 20.0


def test_along_run_data_matches_check(run):
    args = ["check", "--pipe", "NPS 4", "--fluid-temp", "60C", "--ambient-temp", "5C", "--layer",
            "mineral wool:50mm", "--length", "100m", "--flow", "0.5kg/s", "--fluid", "water"]
    code, out, _ = run(*args, "--format", "json")
    data = json.loads(out)
    spec = LineSpec(pipe="NPS 4", fluid_temp_c=60.0, air_temp_c=5.0, layers=(("mineral wool", 0.05),),
                    length_m=100.0, flow=Flow(0.5, "mass"), fluid="water")
    result = spec.solve()
    d = charts.along_run_data(spec, result)
    assert d["outlet_temp_c"] == pytest.approx(data["outlet_temp_c"], abs=1e-9)
    assert d["position_m"][0] == 0.0 and d["position_m"][-1] == pytest.approx(100.0)
    assert d["fluid_temp_c"][0] == 60.0 and d["fluid_temp_c"][-1] == d["outlet_temp_c"]
    temps = np.array(d["fluid_temp_c"])
    assert np.all(np.diff(temps) < 0) and np.all(temps > 5.0)
    # energy balance, independent of the march: m·cp·ΔT ≈ ∫q' dx (trapezoid over the nodes);
    # water cp at about 59.5 °C is 4.184 kJ/(kg·K) (IAPWS-IF97 via iapws)
    from iapws import IAPWS97

    cp = IAPWS97(T=273.15 + 59.5, P=0.101325).cp * 1000
    heat = np.trapz(d["heat_flow_w_per_m"], d["position_m"]) if hasattr(np, "trapz") else \
        np.trapezoid(d["heat_flow_w_per_m"], d["position_m"])
    assert 0.5 * cp * (60.0 - d["outlet_temp_c"]) == pytest.approx(heat, rel=2e-3)


def _selection(*, rh=None, fluid=180.0, air=25.0, cap=None, material="mineral wool", pipe="NPS 4"):
    from pipeins.cli.sizing_options import requirements_from_options
    from pipeins.selection import select

    spec = LineSpec(pipe=pipe, fluid_temp_c=fluid, air_temp_c=air, rh_percent=rh)
    opts = {"max_heat_flow": cap} if cap else {}
    return select(spec, material, requirements_from_options(opts, "si"), None, "si")


def test_thickness_sweep_data_is_the_solve():
    sel = _selection(cap="60W/m")
    d = charts.thickness_sweep_data(sel)
    t = np.array(d["thickness_m"])
    assert t[0] == 0.0 and np.all(np.diff(t) > 0)
    # an independent solve of the line at the selected thickness gives the chart's point
    at = LineSpec(pipe="NPS 4", fluid_temp_c=180.0, air_temp_c=25.0,
                  layers=(("mineral wool", d["selected_m"]),)).solve()
    i = int(np.flatnonzero(t == d["selected_m"])[0])
    assert d["heat_flow_w_per_m"][i] == pytest.approx(float(at.heat_flow_w_per_m), rel=1e-7)
    assert d["surface_temp_c"][i] == pytest.approx(float(at.surface_temp_c), rel=1e-7)
    # each criterion sits on its limit at its least thickness
    limits = {lim["key"]: lim for lim in d["limits"]}
    assert set(limits) == {"surface_temp", "heat_flow"}
    assert limits["surface_temp"]["value"] == sel.criteria[0].limit_c
    assert limits["heat_flow"]["value"] == pytest.approx(60.0)
    for req in d["required"]:
        j = int(np.flatnonzero(t == req["thickness_m"])[0])
        if req["key"] == "surface_temp":
            assert d["surface_temp_c"][j] == pytest.approx(limits["surface_temp"]["value"], abs=0.05)
        if req["key"] == "heat_flow":
            assert d["heat_flow_w_per_m"][j] == pytest.approx(60.0, rel=2e-3)
    # heat flow falls and the surface cools with thickness (past the critical radius)
    assert np.all(np.diff(d["heat_flow_w_per_m"]) < 0)
    assert d["selected_m"] == pytest.approx(float(sel.outcome.selected_m[0]))


def test_thickness_sweep_cold_line_dew_limit():
    sel = _selection(rh=80.0, fluid=6.0, air=30.0, material="flexible elastomeric foam", pipe="NPS 3")
    d = charts.thickness_sweep_data(sel)
    lim = next(lim for lim in d["limits"] if lim["key"] == "condensation")
    from psychrolib import GetTDewPointFromRelHum, SetUnitSystem, SI

    SetUnitSystem(SI)
    dew = GetTDewPointFromRelHum(30.0, 0.80)  # psychrolib (ASHRAE Handbook Fundamentals formulas)
    margin = next(c for c in sel.criteria if c.key == "condensation").margin_k
    assert lim["value"] == pytest.approx(dew + margin, abs=0.05)
    assert d["heat_flow_w_per_m"][0] < 0  # a heat gain stays negative
    req = next(r for r in d["required"] if r["key"] == "condensation")
    j = d["thickness_m"].index(req["thickness_m"])
    assert d["surface_temp_c"][j] == pytest.approx(lim["value"], abs=0.02)


def test_table_data_equals_json(run):
    args = ["table", "--sizes", "NPS 1/2..NPS 6", "--fluid-temp", "82C", "--ambient-temp", "20C",
            "--material", "mineral wool", "--max-heat-flow", "25W/m"]
    code, out, _ = run(*args, "--format", "json")
    rows = json.loads(out)["rows"]
    from pipeins.catalog.pipes import pipe_range
    from pipeins.cli.sizing_options import requirements_from_options
    from pipeins.selection import select

    sizes = pipe_range("NPS 1/2..NPS 6", None)
    spec = LineSpec(pipe=sizes[0].label, fluid_temp_c=82.0, air_temp_c=20.0)
    sel = select(spec, "mineral wool", requirements_from_options({"max_heat_flow": "25W/m"}, "si"), None, "si",
                 sizes=sizes)
    d = charts.table_thickness_data(sel)
    assert [r["size"] for r in d["rows"]] == [r["size"] for r in rows]
    for mine, theirs in zip(d["rows"], rows):
        assert mine["selected_m"] * 1000 == pytest.approx(theirs["selected_thickness_mm"], abs=0.005)
        assert mine["governing"] == theirs["governing"]


def test_economic_curve_data_equals_json(run, monkeypatch):
    monkeypatch.chdir(ROOT)
    args = ["cost", "--pipe", "NPS 4", "--fluid-temp", "82C", "--ambient-temp", "15C", "--length", "120m",
            "--layer", "mineral wool:50mm", "--hours", "5000h", "--energy-price", "0.09/kWh",
            "--cost-table", "examples/costs_demo.csv"]
    code, out, _ = run(*args, "--format", "json")
    curve = json.loads(out)["economic_curve"]
    from pipeins.cli.energy_options import basis_from_options
    from pipeins.costing import cost_study

    spec = LineSpec(pipe="NPS 4", fluid_temp_c=82.0, air_temp_c=15.0, length_m=120.0,
                    layers=(("mineral wool", 0.05),))
    basis = basis_from_options({"hours": "5000h", "energy_price": "0.09/kWh",
                                "cost_table": "examples/costs_demo.csv"}, "si", need_price=True)
    d = charts.economic_curve_data(cost_study(spec, basis, {}))
    for key, json_key in (("thickness_m", "thickness_m"), ("installed", "installed_per_m"),
                          ("energy_pv", "energy_pv_per_m"), ("total", "total_per_m")):
        assert d[key] == pytest.approx(curve[json_key], rel=1e-12)
    assert d["per"] == curve["per"] == "m"
    assert d["economic_thickness_m"] == curve["economic_thickness_m"]
    assert min(d["total"]) == d["total"][d["thickness_m"].index(d["economic_thickness_m"])]
    assert np.allclose(np.add(d["installed"], d["energy_pv"]), d["total"])


PLOTS = [
    ["check", *HOT, "--layer", "mineral wool:50mm", "--length", "80m", "--flow", "3m3/h", "--fluid", "water"],
    ["size", *HOT, "--material", "mineral wool", "--max-heat-flow", "90W/m"],
    ["table", "--sizes", "NPS 1..NPS 4", "--fluid-temp", "82C", "--material", "mineral wool"],
    ["table", "--sizes", "NPS 1..NPS 4", "--fluid-temp", "82C", "--material", "mineral wool", "--matrix", "heat-flow"],
    ["cost", *HOT, "--layer", "mineral wool:50mm", "--length", "50m", "--energy-price", "0.09/kWh"],
    ["cost", *HOT, "--layer", "mineral wool:50mm", "--length", "50m", "--energy-price", "0.09/kWh",
     "--cost-table", "examples/costs_demo.csv"],
]


@pytest.mark.parametrize("args", PLOTS, ids=["check", "size", "table", "matrix", "cost", "cost-curve"])
def test_plot_files(run, tmp_path, monkeypatch, args):
    monkeypatch.chdir(ROOT)
    svg, png = tmp_path / "c.svg", tmp_path / "c.png"
    code, out, err = run(*args, "--plot", str(svg), "--format", "json")
    assert (code, err) == (0, "")
    json.loads(out)
    root = ET.parse(svg).getroot()
    assert root.tag == "{http://www.w3.org/2000/svg}svg"
    assert float(root.get("width").rstrip("pt")) > 0 and float(root.get("height").rstrip("pt")) > 0
    assert len(root.findall(".//{http://www.w3.org/2000/svg}path")) > 20
    code, out, err = run(*args, "--plot", str(png))
    assert (code, err) == (0, "")
    data = png.read_bytes()
    assert data[:8] == b"\x89PNG\r\n\x1a\n" and len(data) > 5000


def test_plot_bad_file_name(run, tmp_path):
    target = tmp_path / "c.pdf"
    code, out, err = run("check", *HOT, "--plot", str(target))
    assert (code, out) == (2, "")
    assert err == f'Error: --plot: "{target}": give a file name ending in .svg or .png\n'
    assert not target.exists()


def test_inline_svg_is_clean_xml():
    spec = LineSpec(pipe="NPS 2", fluid_temp_c=150.0, air_temp_c=20.0, layers=(("mineral wool", 0.040),))
    chart = charts.check_charts(spec, spec.solve())[0]
    text = charts.chart_svg(chart, "si", id_prefix="q1-")
    assert text.startswith("<svg") and "http" not in text and "//" not in text
    root = ET.fromstring(text)  # no namespace prefixes left: parses as plain XML
    ids = [e.get("id") for e in root.iter() if e.get("id")]
    assert ids and all(i.startswith("q1-") for i in ids)
    refs = [e.get("href") for e in root.iter() if e.get("href")]
    assert all(r[1:] in ids for r in refs)


def test_chart_data_is_lazy():
    calls = []
    chart = charts.Chart("bare_insulated", "t", lambda: calls.append(1) or {"bare": 1, "insulated": 0})
    assert calls == []
    assert chart.data == chart.data and calls == [1]


_PROBE = """
import sys
from pipeins.cli import main
try:
    main(sys.argv[1:])
except SystemExit as exc:
    assert exc.code in (0, None), exc.code
print(" ".join(m for m in ("matplotlib", "openpyxl") if m in sys.modules), file=sys.stderr)
"""


@pytest.mark.parametrize("args, expected", [
    (["check", *HOT, "--layer", "mineral wool:50mm"], ""),
    (["size", *HOT, "--material", "mineral wool", "--format", "json"], ""),
    (["table", "--sizes", "NPS 1..NPS 2", "--fluid-temp", "82C", "--material", "mineral wool", "--format", "csv"], ""),
    (["cost", *HOT, "--layer", "mineral wool:50mm", "--energy-price", "0.09/kWh", "--format", "markdown"], ""),
    (["schedule", "examples/food_factory_chilled.toml"], ""),
    (["check", *HOT, "--layer", "mineral wool:50mm", "--format", "html"], "matplotlib"),
], ids=["check", "size", "table", "cost", "schedule", "html-imports-matplotlib"])
def test_heavy_imports_only_when_drawing(args, expected):
    proc = subprocess.run([sys.executable, "-c", _PROBE, *args], cwd=ROOT, capture_output=True, text=True,
                          timeout=120)
    assert proc.returncode == 0, proc.stderr
    assert proc.stderr.strip().splitlines()[-1:] == ([expected] if expected else [])


def test_schedule_data_equals_json():
    from pipeins.project import load_project
    from pipeins.reports import render
    from pipeins.reports.schedule import schedule_report
    from pipeins.schedule import compute_schedule

    schedule = compute_schedule(load_project(ROOT / "examples" / "district_heating_plant.toml"))
    rows = json.loads(render(schedule_report(schedule, "si"), "json"))["schedule"]
    d = charts.schedule_thickness_data(schedule)
    assert len(d["rows"]) == len(rows) > 0
    for mine, theirs in zip(d["rows"], rows):
        assert mine["thickness_m"] * 1000 == pytest.approx(theirs["thickness_mm"], abs=0.005)
        assert mine["governing"] == theirs["governing"]
        assert mine["label"].startswith(f"{theirs['service']} · {theirs['condition']} · ")
    svg = charts.chart_svg(charts.schedule_charts(schedule)[0])
    ET.fromstring(svg)
