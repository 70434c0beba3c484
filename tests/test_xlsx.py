"""The XLSX workbook: read back with openpyxl and compared with the JSON output."""

from __future__ import annotations

import io
import json
import re
from pathlib import Path

import pytest

openpyxl = pytest.importorskip("openpyxl", reason="openpyxl is in the test extra: pip install -e '.[test]'")

from pipeins.project import load_project  # noqa: E402
from pipeins.reports import render  # noqa: E402
from pipeins.reports.schedule import schedule_report  # noqa: E402
from pipeins.reports.xlsx import sheet_names  # noqa: E402
from pipeins.schedule import compute_schedule  # noqa: E402
from pipeins.units import to_display  # noqa: E402

ROOT = Path(__file__).resolve().parent.parent
EXAMPLES = ["hospital_steam", "food_factory_chilled"]

# heading (unit stripped) -> (JSON key, factor to SI) of each per-row record
SCHEDULE_KEYS = {"service": ("service", None), "location": ("condition", None), "material": ("material", None),
                 "finish": ("finish", None), "thickness": ("thickness_mm", 0.001)}
LINE_KEYS = {"line": ("tag", None), "size": ("size", None), "length": ("length_m", 1),
             "thickness": ("thickness_m", 1), "heat flow": ("heat_flow_w_per_m", 1),
             "bare fittings": ("fittings_length_m", 1), "heat flow, line": ("heat_flow_w", 1),
             "surface": ("surface_temp_c", 1), "above dew point": ("dew_point_margin_k", 1),
             "outlet": ("outlet_temp_c", 1)}


@pytest.fixture(scope="module", params=EXAMPLES)
def example(request):
    report = schedule_report(compute_schedule(load_project(ROOT / "examples" / f"{request.param}.toml")), "si")
    book = openpyxl.load_workbook(io.BytesIO(render(report, "xlsx", "si")))
    return report, book, json.loads(render(report, "json", "si"))


def _rows(ws):
    rows = [list(r) for r in ws.iter_rows(values_only=True)]
    heads, body = rows[0], rows[1:]
    if [] in body or [None] * len(heads) in body:  # a note after a blank row
        body = body[: next(i for i, r in enumerate(body) if not any(v is not None for v in r))]
    return heads, body


def test_sheets(example):
    report, book, _ = example
    assert book.sheetnames == sheet_names(report)
    assert book.sheetnames[:3] == ["Insulation schedule", "Lines", "Totals"]
    assert book.sheetnames[-3:] == ["basis", "warnings", "cautions"]
    for name in book.sheetnames:
        ws = book[name]
        assert ws.freeze_panes == "A2"
        assert ws["A1"].font.bold
        assert ws.column_dimensions["A"].width >= 8


def test_headers_carry_units(example):
    report, book, _ = example
    for table in report.tables:
        heads, _ = _rows(book[table.title[:31]])
        assert list(heads) == [c.label("si") for c in table.columns]


@pytest.mark.parametrize("sheet, key, columns", [("Insulation schedule", "schedule", SCHEDULE_KEYS),
                                                 ("Lines", "lines", LINE_KEYS)])
def test_cells_equal_json(example, sheet, key, columns):
    """Every mapped cell equals the JSON value; every quantity cell is a number, not text."""
    report, book, data = example
    table = next(t for t in report.tables if t.title == sheet)
    heads, body = _rows(book[sheet])
    records = data[key]
    assert len(body) == len(records)
    compared = 0
    for j, column in enumerate(table.columns):
        if column.heading not in columns:
            continue
        json_key, to_si = columns[column.heading]
        for row, record in zip(body, records):
            value, cell = record[json_key], row[j]
            if to_si is None:
                assert cell == value
            elif value is None or (json_key == "fittings_length_m" and value == 0):
                assert cell is None
            else:
                assert isinstance(cell, (int, float)) and not isinstance(cell, bool), (column.heading, cell)
                assert cell == pytest.approx(to_display(value * to_si, column.kind, "si"), rel=1e-6, abs=1e-6)
            compared += 1
    assert compared >= 2 * len(records)


def test_schedule_text_cells_equal_json(example):
    """The text cells of the schedule sheet: the size band spans the JSON sizes, the layers
    are the JSON layers, the governing requirement is the JSON key in words."""
    from pipeins.schedule import GOVERNING_LABELS

    _, book, data = example
    heads, body = _rows(book["Insulation schedule"])
    col = {h.split(" [")[0]: i for i, h in enumerate(heads)}
    for row, record in zip(body, data["schedule"]):
        assert row[col["sizes"]].startswith(record["sizes"][0]) and row[col["sizes"]].endswith(record["sizes"][-1])
        shown = [float(x) for x in re.findall(r"([\d.]+) mm", row[col["layers"]])]
        assert shown == pytest.approx(record["layers_mm"], abs=0.5)
        assert row[col["governing requirement"]] == GOVERNING_LABELS.get(record["governing"], "–")


def test_totals_numbers_are_numbers(example):
    report, book, data = example
    heads, body = _rows(book["Totals"])
    first = {row[0]: row for row in body}
    for name in ("insulated", "bare"):
        numbers = [v for v in first[name][1:] if v is not None]
        assert numbers and all(isinstance(v, (int, float)) for v in numbers[:2])
    energy_col = next(i for i, h in enumerate(heads) if h.startswith("heating energy per year"))
    assert first["insulated"][energy_col] == pytest.approx(
        to_display(data["totals"]["heating"]["energy_j"]["insulated"], "energy", "si"), abs=0.5)  # printed to 1 kWh


def test_basis_warnings_cautions(example):
    report, book, _ = example
    basis = [r for r in book["basis"].iter_rows(values_only=True)][1:]
    assert basis[0] == ("report", report.title)
    assert [r[1] for r in basis if r[0] == "basis"] == report.footer
    assert [r[0] for r in book["cautions"].iter_rows(values_only=True)][1:] == report.cautions
    assert [r[0] for r in book["warnings"].iter_rows(values_only=True)][1:] == report.warnings


def test_xlsx_needs_output(run):
    code, out, err = run("schedule", "examples/hospital_steam.toml", "--format", "xlsx")
    assert (code, out) == (2, "")
    assert err == "Error: --format: xlsx is a binary workbook, not written to a terminal; give --output FILE.xlsx\n"
    code, out, err = run("check", "--pipe", "NPS 2", "--fluid-temp", "80C", "--format", "xlsx")
    assert (code, out) == (2, "")
    assert err.startswith("Error: --format: xlsx is a binary workbook")


def test_cli_check_workbook(run, tmp_path):
    path = tmp_path / "check.xlsx"
    code, out, err = run("check", "--pipe", "NPS 2", "--fluid-temp", "80C", "--layer", "mineral wool:40mm",
                         "--format", "xlsx", "-o", str(path))
    assert (code, out, err) == (0, "", "")
    assert path.read_bytes()[:2] == b"PK"
    book = openpyxl.load_workbook(path)
    code, out, _ = run("check", "--pipe", "NPS 2", "--fluid-temp", "80C", "--layer", "mineral wool:40mm",
                       "--format", "json")
    data = json.loads(out)
    heads, body = _rows(book["Results"])
    assert heads[0] == "heat flow [W/m]" and heads[2] == "surface [°C]"
    assert body[0][0] == pytest.approx(data["heat_flow_w_per_m"], rel=1e-9)
    assert body[0][2] == pytest.approx(data["surface_temp_c"], rel=1e-9)
    heads, body = _rows(book["Temperatures through the wall"])
    assert [r[2] for r in body] == pytest.approx(data["interface_temps_c"], rel=1e-9)
    assert all(isinstance(r[1], float) for r in body)


def test_us_units_converted(run, tmp_path):
    path = tmp_path / "t.xlsx"
    code, _, err = run("table", "--sizes", "NPS 1..NPS 3", "--fluid-temp", "180F", "--material", "mineral wool",
                       "--units", "us", "--format", "xlsx", "-o", str(path))
    assert (code, err) == (0, "")
    code, out, _ = run("table", "--sizes", "NPS 1..NPS 3", "--fluid-temp", "180F", "--material", "mineral wool",
                       "--units", "us", "--format", "json")
    data = json.loads(out)
    heads, body = _rows(openpyxl.load_workbook(path).active)
    sel = heads.index("selected [in]")
    q = heads.index("heat flow [Btu/(h·ft)]")
    for row, record in zip(body, data["rows"]):
        assert row[sel] == pytest.approx(record["selected_thickness_mm"] / 25.4, rel=1e-6)
        assert row[q] == pytest.approx(to_display(record["heat_flow_w_per_m"], "heat_flow_per_length", "us"), rel=1e-6)
