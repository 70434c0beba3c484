"""``pipeins list``: every catalogue lists, the filters work, JSON parses and every row
names its source.  Values are checked against the standards the tables transcribe."""

from __future__ import annotations

import csv
import io
import json

import pytest

from pipeins.cli import main
from pipeins.cli.listing import CATALOGUES, catalogue_report


@pytest.fixture
def run(capsys):
    """``run(*args) -> (exit status, stdout, stderr)`` of ``pipeins list <args>``."""

    def _run(*args):
        with pytest.raises(SystemExit) as exc:
            main(["list", *args])
        captured = capsys.readouterr()
        assert "Traceback" not in captured.out + captured.err
        return exc.value.code or 0, captured.out, captured.err

    return _run


def _rows(run, *args):
    code, out, err = run(*args, "--format", "json")
    assert code == 0, err
    data = json.loads(out)
    assert data["count"] == len(data["rows"])
    return data["rows"]


@pytest.mark.parametrize("catalogue", CATALOGUES)
def test_every_catalogue_lists_with_sources(run, catalogue):
    code, out, err = run(catalogue)
    assert code == 0 and err == ""
    assert "source" in out
    rows = _rows(run, catalogue)
    assert len(rows) >= 5
    assert all(isinstance(r["source"], str) and r["source"].strip() for r in rows)


@pytest.mark.parametrize("catalogue", CATALOGUES)
@pytest.mark.parametrize("fmt", ["csv", "markdown"])
def test_every_catalogue_in_csv_and_markdown(run, catalogue, fmt):
    code, out, _ = run(catalogue, "--format", fmt)
    assert code == 0
    if fmt == "csv":
        rows = list(csv.reader(io.StringIO(out)))
        assert rows[0][-1] == "source"
        assert len(rows) == 1 + len(_rows(run, catalogue))
        assert all(row[-1] for row in rows[1:])
    else:
        assert "| source" in out


def test_unknown_catalogue_error_line(run):
    code, out, err = run("pipez")
    assert code == 2 and out == ""
    assert err.splitlines() == [
        'Error: CATALOGUE: unknown catalogue "pipez"; use pipes, materials, finishes, series or rules']


@pytest.mark.parametrize("args, line", [
    pytest.param(("pipes", "--kind", "plastic"),
                 'Error: --kind: unknown pipe kind "plastic"; use steel, copper or metric', id="pipe-kind"),
    pytest.param(("materials", "--kind", "jacket"),
                 'Error: --kind: unknown material kind "jacket"; use insulation or wall', id="material-kind"),
    pytest.param(("finishes", "--schedule", "40"),
                 "Error: --schedule: does not apply to finishes; it filters pipes", id="schedule-off-pipes"),
    pytest.param(("rules", "--family", "block"),
                 "Error: --family: does not apply to rules; it filters materials and series",
                 id="family-off-materials"),
    pytest.param(("materials", "--family", "pipe sektion"),
                 'Error: --family: unknown family "pipe sektion"; did you mean "pipe_section"?',
                 id="unknown-family"),
    pytest.param(("pipes", "--kind", "steel", "--schedule", "41"),
                 'Error: --schedule: no schedule or tube type "41" in this list; use 5S, 10S, 10, 20, '
                 "30, 40, 40S, STD, 60, 80, 80S, XS, 100, 120, 140, 160, XXS",
                 id="unknown-schedule"),
    pytest.param(("series", "--format", "xml"),
                 'Error: --format: unknown format "xml"; use text, json, csv, markdown, html, xlsx', id="format"),
])
def test_bad_filters(run, args, line):
    code, out, err = run(*args)
    assert code == 2 and out == ""
    assert err.splitlines() == [line]


# ----------------------------------------------------------------------------- pipes
def test_pipes_filter_kind_schedule_match(run):
    rows = _rows(run, "pipes", "--kind", "steel", "--schedule", "sch 40", "--match", "NPS 2")
    labels = [r["label"] for r in rows]
    assert "NPS 2" in labels and "NPS 2-1/2" in labels
    assert all(r["kind"] == "steel" and r["schedule"] == "40" for r in rows)
    nps2 = rows[labels.index("NPS 2")]
    assert nps2["outer_diameter_m"] == pytest.approx(0.0603)  # ASME B36.10M Table 1: 60.3 mm
    assert nps2["wall_m"] == pytest.approx(0.00391)  # ASME B36.10M Table 1: 3.91 mm


def test_pipes_kinds_partition_the_catalogue(run):
    every = _rows(run, "pipes")
    parts = [_rows(run, "pipes", "--kind", k) for k in ("steel", "copper", "metric")]
    assert sum(len(p) for p in parts) == len(every)
    assert {r["kind"] for r in parts[1]} == {"copper"}


def test_copper_type_in_us_units(run):
    code, out, _ = run("pipes", "--kind", "copper", "--schedule", "L", "--match", "3/4", "--units", "us")
    assert code == 0
    line = next(ln for ln in out.splitlines() if ln.startswith("copper L 3/4"))
    # ASTM B88 Table 1 (from memory): 3/4 type L, OD 0.875 in, wall 0.045 in
    assert "0.875" in line and "0.045" in line and "0.785" in line
    assert "outside diameter [in]" in out


def test_metric_in_si_shows_the_standard_values(run):
    code, out, _ = run("pipes", "--kind", "metric", "--match", "DN100", "--format", "csv")
    rows = list(csv.DictReader(io.StringIO(out)))
    dn100 = next(r for r in rows if r["size"] == "DN100")
    assert dn100["outside diameter [mm]"] == "114.3"  # EN 10220 series 1: DN100 = 114.3 mm


def test_json_is_si_whatever_units(run):
    assert _rows(run, "pipes", "--kind", "copper", "--units", "us") == _rows(run, "pipes", "--kind", "copper")
    assert _rows(run, "materials", "--units", "us") == _rows(run, "materials")


def test_no_match_is_an_empty_list_not_an_error(run):
    code, out, _ = run("finishes", "--match", "unobtainium")
    assert code == 0 and "No rows match" in out
    assert _rows(run, "finishes", "--match", "unobtainium") == []


# ----------------------------------------------------------------------------- materials
def test_insulation_materials_and_family(run):
    rows = _rows(run, "materials", "--family", "elastomeric")
    assert rows and {r["family"] for r in rows} == {"elastomeric"}
    wool = _rows(run, "materials", "--match", "mineral_wool")
    assert {r["key"] for r in wool} == {"mineral_wool", "mineral_wool_mattress"}
    points = wool[0]["conductivity_w_mk"]
    assert all(set(p) == {"mean_temp_c", "conductivity_w_mk"} for p in points)
    temps = [p["mean_temp_c"] for p in points]
    assert temps == sorted(temps)


def test_insulation_text_in_us_units(run):
    code, out, _ = run("materials", "--match", "mineral wool pipe", "--units", "us")
    assert code == 0
    assert "Btu·in/(h·ft²·°F)" in out and "°F" in out
    # 0.035 W/(m·K) = 0.243 Btu·in/(h·ft²·°F) at 10 °C = 50 °F (pint conversion, see below)
    assert "0.243 @ 50 °F" in out


def test_conductivity_conversion_matches_pint():
    import pint

    ureg = pint.UnitRegistry()
    k = (0.035 * ureg("W/(m*K)")).to("Btu*inch/(hour*foot**2*delta_degF)").magnitude
    assert f"{k:.3g}" == "0.243"  # pint: the figure the us listing shows for 0.035 W/(m·K)


def test_wall_materials(run):
    rows = _rows(run, "materials", "--kind", "wall")
    by_key = {r["key"]: r for r in rows}
    # Incropera & DeWitt Table A.1 (from memory): AISI 304 at 300 K, k = 14.9 W/(m·K)
    assert by_key["stainless_steel"]["conductivity_w_mk"] == pytest.approx(14.9)
    code, out, err = run("materials", "--kind", "wall", "--family", "block")
    assert code == 2
    assert err.startswith("Error: --family: does not apply to wall materials")


# ----------------------------------------------------------------------------- others
def test_finishes(run):
    rows = _rows(run, "finishes", "--match", "aluminium")
    assert rows and all("aluminium" in r["key"] for r in rows)
    assert all(0 < r["emittance"] <= 1 for r in _rows(run, "finishes"))


def test_series_family_and_thicknesses(run):
    rows = _rows(run, "series", "--family", "elastomeric")
    assert {r["series"] for r in rows} == {"mm_elastomeric", "in_elastomeric"}
    mm = next(r for r in rows if r["series"] == "mm_elastomeric")
    assert mm["thicknesses_m"][:3] == pytest.approx([0.009, 0.013, 0.019])  # common practice
    code, out, _ = run("series", "--family", "elastomeric")
    assert "9, 13, 19, 25" in out


def test_rules_match(run):
    rows = _rows(run, "rules", "--match", "ashrae")
    assert rows and {r["rule_set"] for r in rows} == {"ashrae-90.1-2019"}
    assert {r["service"] for r in _rows(run, "rules", "--match", "cooling")} == {"cooling"}


def test_help_has_example(run):
    code, out, _ = run("--help")
    assert code == 0
    example = out.split("Example:", 1)[1].splitlines()
    assert example[1].strip().startswith("pipeins list ")


def test_catalogue_report_api():
    report = catalogue_report("finishes", units="us")
    assert report.data["catalogue"] == "finishes"
    assert report.tables[0].columns[-1].heading == "source"
