"""Structured notes through the reports: every format writes them in the chosen units, and JSON
lists them beside the warnings (one object per warning, same order, same text).

US conversions against the exact definitions (NIST SP 811, 2008, Appendix B: t/°F = 1.8 t/°C + 32);
the report contract (keys, order) is this project's own.
"""

from __future__ import annotations

import json

import pytest

from pipeins.notes import note
from pipeins.reports import Report, Table, Column, render

HOT_THIN = ("check", "--pipe", "DN50", "--fluid-temp", "180C", "--ambient-temp", "25C",
            "--layer", "mineral wool:10mm")


def _f(c):
    return 1.8 * c + 32  # NIST SP 811


def _same_order(data):
    assert [n["text"] for n in data["notes"]] == data["warnings"]


def test_touch_warning_in_si_keeps_its_words_and_in_us_says_fahrenheit(run):
    code, out, _ = run(*HOT_THIN, "--format", "json")
    si = json.loads(out)
    surface = si["surface_temp_c"]
    assert code == 0 and f"surface {surface:.1f} °C is above the touch limit of 60 °C" in si["warnings"]
    _same_order(si)
    touch = next(n for n in si["notes"] if n["code"] == "surface.above_touch_limit")
    assert touch["values"]["surface_c"] == {"value": pytest.approx(surface, abs=1e-6), "unit": "°C"}
    assert touch["values"]["limit_c"] == {"value": 60.0, "unit": "°C"}

    code, out, _ = run(*HOT_THIN, "--format", "json", "--units", "us")
    us = json.loads(out)
    assert us["surface_temp_c"] == si["surface_temp_c"]  # JSON numbers stay SI
    assert f"surface {_f(surface):.1f} °F is above the touch limit of {_f(60):.1f} °F" in us["warnings"]
    _same_order(us)
    code, out, _ = run(*HOT_THIN, "--units", "us")
    assert f"surface {_f(surface):.1f} °F is above the touch limit of 140.0 °F" in out and "°C" not in out.split(
        "Warnings")[1].split("Cautions")[0]


def test_the_film_and_dew_point_warnings_are_notes_and_a_text_is_a_text_note(run):
    code, out, _ = run("check", "--pipe", "DN50", "--fluid-temp", "5C", "--ambient-temp", "28C", "--rh", "80",
                       "--layer", "mineral wool:10mm", "--fluid", "water", "--velocity", "0.01m/s", "--format", "json")
    data = json.loads(out)
    _same_order(data)
    codes = [n["code"] for n in data["notes"]]
    assert codes == ["film.inner.range", "surface.below_dew_point"]
    film = data["notes"][0]
    assert film["words"]["what"] == "laminar flow (Re below 2300)" and film["text"].startswith("inner film: laminar")
    dew = data["notes"][codes.index("surface.below_dew_point")]
    assert dew["values"]["dew_point_c"]["value"] == pytest.approx(data["dew_point_c"], abs=1e-6)
    # a warning a part still gives as text keeps its words, as a note of code "text"
    report = Report("t", [Table("t", [Column("a")], [[1]])], {}, ["a plain text", note("run.needs_fluid")])
    data = json.loads(render(report, "json"))
    assert [n["code"] for n in data["notes"]] == ["text", "run.needs_fluid"]
    assert data["notes"][0] == {"code": "text", "severity": "warning", "text": "a plain text"}


def test_freezing_along_the_run_and_the_freeze_row_in_both_unit_systems(run):
    args = ("check", "--pipe", "DN50", "--fluid-temp", "5C", "--ambient-temp", "-20C", "--fluid", "water",
            "--flow", "0.01m3/h", "--length", "2000m", "--layer", "mineral wool:10mm")
    _, out, _ = run(*args, "--format", "json")
    data = json.loads(out)
    _same_order(data)
    freezes = next(n for n in data["notes"] if n["code"] == "run.freezes")
    assert freezes["values"]["freeze_c"]["unit"] == "°C"
    assert freezes["text"] == ("the fluid cools to its freezing point (0.0 °C) along the run; "
                               "beyond that point the result is not valid")
    _, out, _ = run(*args, "--units", "us")
    assert "the fluid cools to its freezing point (32.0 °F) along the run" in out
    assert "still water reaches 32 °F after" in out
    _, out, _ = run(*args)
    assert "still water reaches 0 °C after" in out


def test_a_note_anywhere_in_a_report_is_written_at_the_boundary():
    n = note("run.freezes", freeze_c=(0.0, "temperature"))
    report = Report("t", [Table("x", [Column("a")], [["1"]])], {"warnings": [n], "deep": {"w": [n]}},
                    warnings=[n, "plain text"], cautions=[note("caution.general", "caution")])
    text = render(report, "text", "us")
    assert "freezing point (32.0 °F)" in text and "plain text" in text and "Local codes" in text
    assert "Note(" not in text
    csv_text = render(report, "csv", "si")
    assert "# warning: the fluid cools to its freezing point (0.0 °C)" in csv_text
    data = json.loads(render(report, "json", "si"))
    assert data["warnings"][0].startswith("the fluid cools") and data["deep"]["w"] == data["warnings"][:1]
    assert [x["code"] for x in data["notes"]] == ["run.freezes", "text"]
    assert report.warnings[0] is n  # the report itself is left as built


def test_schedule_json_lists_its_notes_beside_the_warnings(run):
    code, out, _ = run("schedule", "examples/district_heating_plant.toml", "--format", "json")
    assert code == 0
    data = json.loads(out)
    _same_order(data)
    assert all(isinstance(c, str) for c in data["cautions"]) and data["cautions"][-1].endswith("govern.")


def test_solver_notes_speak_the_reports_units(run):
    # a layer beyond its service range and the critical radius, said in °F and inches in US reports
    # (t/°F = 1.8 t/°C + 32, 1 in = 25.4 mm: NIST SP 811); SI keeps the library's former words
    hot = ("check", "--pipe", "NPS 2", "--fluid-temp", "400F", "--layer", "flexible elastomeric foam:1in")
    _, si, _ = run(*hot, "--format", "json")
    si = json.loads(si)
    limit = next(n for n in si["notes"] if n["code"] == "layer.above_service_limit")
    face_c, max_c = limit["values"]["temp_c"]["value"], limit["values"]["limit_c"]["value"]
    assert limit["text"] == (f"layer 1 (flexible elastomeric foam tube): reaches {face_c:.1f} °C, above its usable "
                             f"limit of {max_c:g} °C; choose a material rated for it or add an inner layer")
    _, us, _ = run(*hot, "--units", "us")
    block = us.split("Warnings")[1].split("Cautions")[0]
    assert f"reaches {_f(face_c):.1f} °F, above its usable limit of {_f(max_c):.0f} °F" in block and "°C" not in block
    small = ("check", "--pipe", "NPS 1/4", "--fluid-temp", "60C", "--layer", "k=0.3W/mK:5mm")
    _, si, _ = run(*small, "--format", "json")
    radius = next(n for n in json.loads(si)["notes"] if n["code"] == "layer.below_critical_radius")
    r_m = radius["values"]["radius_m"]["value"]
    assert radius["text"].startswith(f"outer radius below the critical radius ({1000 * r_m:.1f} mm)")
    _, us, _ = run(*small, "--units", "us")
    assert f"outer radius below the critical radius ({r_m / 0.0254:.3f} in)" in us
