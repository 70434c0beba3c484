"""The HTML report: parses, holds everything itself, has every section, and shows the
numbers of the JSON output (same Report, other format)."""

from __future__ import annotations

import json
import re
from html.parser import HTMLParser
from pathlib import Path

import pytest

from pipeins.project import load_project, parse_project
from pipeins.reports import render
from pipeins.reports.schedule import schedule_report
from pipeins.schedule import compute_schedule
from pipeins.units import _DEFAULT_DIGITS, to_display

EXAMPLES = sorted(Path(__file__).resolve().parent.parent.joinpath("examples").glob("*.toml"))
VOID = {"meta", "br", "hr", "img", "input", "link", "col", "wbr", "source", "area", "base"}


class Page(HTMLParser):
    """Collects what the tests look at: structure errors, h2 titles, ids, links and tables."""

    def __init__(self):
        super().__init__(convert_charrefs=True)
        self.stack, self.errors, self.h2, self.ids, self.hrefs, self.srcs = [], [], [], set(), [], []
        self.tables, self._cell, self._row, self._h2, self.svgs = [], None, None, None, []

    def handle_starttag(self, tag, attrs):
        attrs = dict(attrs)
        if "id" in attrs:
            if attrs["id"] in self.ids:
                self.errors.append(f"duplicate id {attrs['id']}")
            self.ids.add(attrs["id"])
        if "href" in attrs and tag == "a":
            self.hrefs.append(attrs["href"])
        if "src" in attrs:
            self.srcs.append(attrs["src"])
        if tag == "svg":
            self.svgs.append(attrs)
        if tag in VOID:
            return
        self.stack.append(tag)
        if tag == "table" and "data" in (attrs.get("class") or ""):
            self.tables.append({"heads": [], "rows": [], "title": self.h2[-1] if self.h2 else ""})
        elif tag == "tr" and self.tables and "table" in self.stack:
            self._row = []
        elif tag in ("td", "th") and self._row is not None:
            self._cell = ""
        elif tag == "h2":
            self._h2 = ""

    def handle_startendtag(self, tag, attrs):
        self.handle_starttag(tag, attrs)
        if tag not in VOID:
            self.handle_endtag(tag)

    def handle_endtag(self, tag):
        if tag in VOID:
            return
        if not self.stack or self.stack[-1] != tag:
            self.errors.append(f"</{tag}> closes {self.stack[-1] if self.stack else 'nothing'}")
            if tag in self.stack:
                while self.stack.pop() != tag:
                    pass
            return
        self.stack.pop()
        if tag in ("td", "th") and self._cell is not None and self._row is not None:
            self._row.append(self._cell.strip())
            self._cell = None
        elif tag == "tr" and self._row is not None:
            target = self.tables[-1]
            if not target["heads"]:
                target["heads"] = self._row
            else:
                target["rows"].append(self._row)
            self._row = None
        elif tag == "h2" and self._h2 is not None:
            self.h2.append(self._h2.strip())
            self._h2 = None

    def handle_data(self, data):
        if self._cell is not None:
            self._cell += data
        if self._h2 is not None:
            self._h2 += data


def parse(text: str) -> Page:
    page = Page()
    page.feed(text)
    page.close()
    return page


@pytest.fixture(scope="module", params=EXAMPLES, ids=[p.stem for p in EXAMPLES])
def example(request):
    report = schedule_report(compute_schedule(load_project(request.param)), "si")
    return report, render(report, "html", "si"), json.loads(render(report, "json", "si"))


def test_examples_exist():
    assert len(EXAMPLES) >= 3


def test_page_parses_and_is_well_formed(example):
    _, text, _ = example
    assert text.startswith("<!DOCTYPE html>")
    page = parse(text)
    assert page.errors == []
    assert page.stack == []
    assert '<meta charset="utf-8">' in text


def test_no_external_references(example):
    """One file: no URL, no protocol-relative link, no src= at all, no script, no @import."""
    _, text, _ = example
    low = text.lower()
    for needle in ("http", "//", "src=", "<script", "@import", "url(http", "<link"):
        assert needle not in low, needle
    page = parse(text)
    assert page.srcs == []
    assert all(h.startswith("#") for h in page.hrefs)
    # every link of the contents points at a section of the page
    assert {h[1:] for h in page.hrefs} <= page.ids


def test_every_section(example):
    report, text, _ = example
    page = parse(text)
    titles = page.h2
    assert titles[0] == "Contents"
    for needed in ["Basis of design"] + [t.title for t in report.tables] + ["Warnings", "Cautions"]:
        assert needed in titles, needed
    # the schedule, line results and totals are all there
    assert {"Insulation schedule", "Lines", "Totals"} <= set(titles)
    assert 'class="title-block"' in text
    for caution in report.cautions:
        assert _plain(caution) in _plain(text)
    for warning in report.warnings:
        assert _plain(warning) in _plain(text)
    for line in report.footer:
        assert _plain(line) in _plain(text)


def _plain(text: str) -> str:
    import html

    return re.sub(r"\s+", " ", html.unescape(re.sub(r"<[^>]+>", " ", text)))


def test_units_in_every_quantity_header(example):
    report, text, _ = example
    page = parse(text)
    for table, parsed in zip(report.tables, page.tables):
        assert parsed["heads"] == [c.label("si") for c in table.columns]
        for column, head in zip(table.columns, parsed["heads"]):
            if column.kind is not None:
                assert re.search(r"\[[^\]]+\]$", head), head


# heading (unit stripped) -> JSON key of each per-row record, for the tables of a schedule
JSON_KEYS = {
    "Insulation schedule": ("schedule", {"thickness": ("thickness_mm", 0.001)}),
    "Lines": ("lines", {"length": ("length_m", 1), "thickness": ("thickness_m", 1),
                        "heat flow": ("heat_flow_w_per_m", 1), "bare fittings": ("fittings_length_m", 1),
                        "heat flow, line": ("heat_flow_w", 1), "surface": ("surface_temp_c", 1),
                        "above dew point": ("dew_point_margin_k", 1), "outlet": ("outlet_temp_c", 1)}),
    "Faces": ("lines", {"area": ("area_m2", 1), "thickness": ("thickness_m", 1),
                        "heat flow": ("heat_flow_w_per_m2", 1), "heat flow, face": ("heat_flow_w", 1),
                        "surface": ("surface_temp_c", 1), "above dew point": ("dew_point_margin_k", 1)}),
    "Vessels": ("lines", {"thickness": ("thickness_m", 1), "heat flow, each": ("heat_flow_w_each", 1),
                          "heat flow, line": ("heat_flow_w", 1), "surface": ("surface_temp_c", 1)}),
}
#: The JSON lines each table of the schedule lists, by their basis (a pipe's entry has none).
TABLE_BASES = {"Lines": ("W/m",), "Faces": ("W/m²",), "Vessels": ("W",)}


def _number(text: str) -> float | None:
    text = text.replace(",", "").replace("−", "-").strip()
    try:
        return float(text)
    except ValueError:
        return None


@pytest.mark.parametrize("units", ["si", "us"])
def test_schedule_numbers_equal_json(example, units):
    """Every number of the schedule and lines tables is the JSON value (SI) shown in the
    column's unit, to the digits shown."""
    report, _, data = example
    page = parse(render(report, "html", units))
    compared = 0
    for table, parsed in zip(report.tables, page.tables):
        if table.title not in JSON_KEYS:
            continue
        key, columns = JSON_KEYS[table.title]
        records = data[key]
        if table.title in TABLE_BASES:
            records = [r for r in records if r.get("basis", "W/m") in TABLE_BASES[table.title]]
        assert len(parsed["rows"]) == len(records)
        for j, column in enumerate(table.columns):
            if column.kind is None or column.heading not in columns:
                continue
            json_key, to_si = columns[column.heading]
            digits = column.digits if column.digits is not None else _DEFAULT_DIGITS[(column.kind, units)]
            for row, record in zip(parsed["rows"], records):
                value = record[json_key]
                shown = _number(row[j])
                if value is None or (json_key == "fittings_length_m" and value == 0):
                    assert row[j] == "–"
                    continue
                expected = to_display(value * to_si, column.kind, units)
                assert shown is not None, row[j]
                assert abs(shown - expected) <= 0.5 * 10 ** -digits + 1e-9, (column.heading, shown, expected)
                compared += 1
    assert compared >= 10


def test_title_block_from_report_table():
    text = '''
[project]
name = "Quay <Works> & Sons"
[report]
project = "Harbour Road pump house (invented)"
number = "HR-0042"
client = "Fictional Water Board"
revision = "B"
date = 2026-12-01
prepared_by = "A. Engineer"
checked_by = "B. Checker"
[conditions.room]
air = "20 C"
[services.hot]
temperature = "80 C"
material = "mineral wool"
criteria = ["touch"]
[[lines]]
service = "hot"
size = "NPS 2"
length = "10 m"
condition = "room"
'''
    project = parse_project(text, "demo.toml")
    assert project.report == {"project": "Harbour Road pump house (invented)", "number": "HR-0042",
                              "client": "Fictional Water Board", "revision": "B", "date": "2026-12-01",
                              "prepared_by": "A. Engineer", "checked_by": "B. Checker"}
    report = schedule_report(compute_schedule(project), "si")
    report.title_block = {"project": project.name, **project.report}
    page = render(report, "html", "si")
    header = page[page.index('<header class="title-block">'):page.index("</header>")]
    for label, value in [("Project", "Harbour Road pump house (invented)"), ("Project number", "HR-0042"),
                         ("Client", "Fictional Water Board"), ("Revision", "B"), ("Date", "2026-12-01"),
                         ("Prepared by", "A. Engineer"), ("Checked by", "B. Checker")]:
        assert f'<th scope="row">{label}</th><td>{value}</td>' in header
    # the project name is escaped, never markup
    assert "Quay &lt;Works&gt; &amp; Sons" in page and "<Works>" not in page


def test_unknown_report_key_is_an_error():
    text = '[project]\nname = "x"\n[report]\nchecker = "B"\n'
    with pytest.raises(Exception) as exc:
        parse_project(text, "demo.toml")
    assert 'demo.toml: line 4 (report): checker: unknown key "checker"' in str(exc.value)


def test_every_text_is_escaped():
    from pipeins.reports import Column, Report, Table

    evil = '<script>alert("x")</script> & <img src=x>'
    report = Report(evil, [Table(evil, [Column(evil), Column("t", "temperature")], [[evil, 20.0]], note=evil)],
                    {}, warnings=[evil], cautions=[evil], footer=[evil])
    report.title_block = {"client": evil}
    text = render(report, "html", "si")
    assert "<script" not in text and "<img" not in text
    assert text.count("&lt;script&gt;") >= 7
    page = parse(text)
    assert page.errors == [] and page.srcs == []


def test_print_stylesheet():
    from pipeins.reports.html import _CSS

    for needle in ("@page", "@media print", "counter(page)", "counter(pages)", "table-header-group",
                   "break-inside: avoid"):
        assert needle in _CSS, needle


def test_cli_check_html(run, tmp_path):
    out = tmp_path / "check.html"
    code, stdout, err = run("check", "--pipe", "NPS 4", "--fluid-temp", "180C", "--ambient-temp", "25C",
                            "--layer", "mineral wool:50mm", "--format", "html", "-o", str(out))
    assert (code, stdout, err) == (0, "", "")
    text = out.read_text(encoding="utf-8")
    page = parse(text)
    assert page.errors == []
    assert "Charts" in page.h2 and len(page.svgs) == 1
    code, stdout, _ = run("check", "--pipe", "NPS 4", "--fluid-temp", "180C", "--ambient-temp", "25C",
                          "--layer", "mineral wool:50mm", "--format", "json")
    data = json.loads(stdout)
    results = next(t for t in page.tables if t["title"] == "Results")
    assert float(results["rows"][0][0]) == pytest.approx(data["heat_flow_w_per_m"], abs=0.05)
    assert float(results["rows"][0][2]) == pytest.approx(data["surface_temp_c"], abs=0.05)


@pytest.mark.parametrize("command", [
    ["size", "--pipe", "DN80", "--fluid-temp", "6C", "--ambient-temp", "30C", "--rh", "80",
     "--material", "flexible elastomeric foam"],
    ["table", "--sizes", "NPS 1/2..NPS 4", "--fluid-temp", "82C", "--ambient-temp", "20C",
     "--material", "mineral wool", "--max-heat-flow", "25W/m"],
    ["cost", "--pipe", "NPS 4", "--fluid-temp", "82C", "--ambient-temp", "15C", "--length", "120m",
     "--layer", "mineral wool:50mm", "--hours", "5000h", "--energy-price", "0.09/kWh",
     "--cost-table", "examples/costs_demo.csv"],
    ["list", "materials"],
], ids=["size", "table", "cost", "list"])
def test_every_reporting_command_writes_html(run, tmp_path, command, monkeypatch):
    monkeypatch.chdir(Path(__file__).resolve().parent.parent)
    out = tmp_path / "r.html"
    code, stdout, err = run(*command, "--format", "html", "-o", str(out))
    assert (code, err) == (0, "")
    page = parse(out.read_text(encoding="utf-8"))
    assert page.errors == [] and page.srcs == []
    assert "Contents" in page.h2 and "Cautions" in page.h2
    assert ("Charts" in page.h2) == (command[0] != "list")
