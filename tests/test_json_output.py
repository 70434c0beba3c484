"""JSON documents written piece by piece: the same values as ``json.dumps``, a long list's
items one per line, and the command line's file and standard output the same document as
:func:`pipeins.reports.render` (the reference is the standard library's ``json`` module)."""

from __future__ import annotations

import json
import math
from pathlib import Path

import pytest

from pipeins.fileio import write_bytes_output
from pipeins.reports import json_text

EXAMPLES = Path(__file__).resolve().parents[1] / "examples"

DOCS = [
    {},
    [],
    "text",
    1.5,
    None,
    {"a": 1, "b": [1, 2, {"c": 1e-9}], "d": {"e": [], "f": {}}, "t": (1, 2), "°": "°C"},
    {"lines": [{"tag": f"L{i}", "q": i / 7, "unit": "W/m²", "dash": "–"} for i in range(120)], "n": 120},
    [{"x": i} for i in range(51)],
    {"nested": {"deep": {"list": list(range(200))}}},
]


@pytest.mark.parametrize("doc", DOCS)
def test_same_values_as_the_standard_encoder(doc):
    text = json_text(doc)
    assert json.loads(text) == json.loads(json.dumps(doc, indent=2))


@pytest.mark.parametrize("doc", [d for d in DOCS if "lines" not in str(d)[:9] and "nested" not in str(d)
                                 and not (isinstance(d, list) and len(d) > 50)])
def test_a_short_document_is_as_json_dumps_writes_it(doc):
    """No list longer than 50 items: byte for byte ``json.dumps(doc, indent=2)``."""
    assert json_text(doc) == json.dumps(doc, indent=2, ensure_ascii=False)


def test_a_long_list_has_one_item_per_line():
    doc = {"lines": [{"tag": f"L{i}", "q": 1.25} for i in range(60)]}
    rows = json_text(doc).splitlines()
    assert rows[0] == "{" and rows[1] == '  "lines": ['
    assert rows[2] == '    {"tag": "L0", "q": 1.25},'
    assert rows[61] == '    {"tag": "L59", "q": 1.25}'
    assert len(rows) == 64


def test_not_a_number_is_refused_as_before():
    with pytest.raises(ValueError):
        json_text({"lines": [{"q": math.nan}] * 60})


def test_ascii_escapes_every_piece():
    text = json_text({"lines": [{"u": "°C"}] * 60, "dash": "–"}, ascii=True)
    assert text.isascii() and "\\u00b0C" in text


def test_pieces_written_to_a_file_and_to_standard_output(tmp_path, capsysbinary):
    pieces = [f"piece {i} – ".encode() for i in range(100_000)]
    target = tmp_path / "out.json"
    write_bytes_output(target, pieces)
    assert target.read_bytes() == b"".join(pieces)
    write_bytes_output("-", pieces[:3])
    assert capsysbinary.readouterr().out == b"".join(pieces[:3])


@pytest.mark.parametrize("example", ["hospital_steam.toml", "larkspur_mews_offices.toml"])
def test_the_schedule_json_from_the_command_line_is_the_rendered_document(run, tmp_path, example):
    from pipeins.project import load_project
    from pipeins.reports import render
    from pipeins.reports.schedule import schedule_report
    from pipeins.schedule import compute_schedule

    path = EXAMPLES / example
    expected = render(schedule_report(compute_schedule(load_project(path))), "json")
    target = tmp_path / "schedule.json"
    code, out, err = run("schedule", str(path), "--format", "json", "-o", str(target))
    assert code == 0, err
    assert target.read_text(encoding="utf-8") == expected
    code, out, err = run("schedule", str(path), "--format", "json")
    assert code == 0 and out == expected
    data = json.loads(expected)
    assert len(data["lines"]) > 0 and data["lines"][0]["tag"]


def test_line_entries_behave_as_a_list():
    from pipeins.project import load_project
    from pipeins.reports.schedule import schedule_report
    from pipeins.schedule import compute_schedule

    schedule = compute_schedule(load_project(EXAMPLES / "hospital_steam.toml"))
    entries = schedule_report(schedule).data["lines"]
    as_list = list(entries)
    assert len(entries) == len(schedule.lines) == len(as_list)
    assert entries == as_list and entries[0] == as_list[0] and entries[-2:] == as_list[-2:]
    assert entries[0]["tag"] == schedule.lines[0].tag


def test_a_numpy_float_in_a_line_entry_is_rounded_and_cleaned():
    import numpy as np

    from pipeins.reports.schedule import _clean

    assert _clean(np.float64(1.23456789012345)) == 1.23456789 and type(_clean(np.float64(2.0))) is float
    assert _clean(np.float64("nan")) is None and _clean(float("inf")) is None
    assert _clean(3) == 3 and _clean("a") == "a" and _clean(True) is True
