"""``schedule --units`` writes the criteria's and code rule sets' sentences in the units shown,
whatever the project file's own units (the reference: the conversion 60 °C = 140 °F, NIST SP 811)."""

from __future__ import annotations

import json
from pathlib import Path

EXAMPLE = Path(__file__).resolve().parents[1] / "examples" / "hospital_steam.toml"   # an SI project


def _basis(out: str) -> list[str]:
    return [l for l in out.split("\nBasis\n", 1)[1].splitlines() if "touch safety" in l]


def test_an_si_project_shown_in_us_units_says_its_criteria_in_us_units(run):
    code, out, err = run("schedule", str(EXAMPLE), "--units", "us")
    assert code == 0, err
    lines = _basis(out)
    assert lines and all("140.0 °F" in l and "°C" not in l and "W/m" not in l for l in lines)
    code, out, err = run("schedule", str(EXAMPLE))
    assert code == 0 and all("60.0 °C" in l for l in _basis(out))


def test_the_json_criteria_follow_the_units_shown(run):
    code, out, err = run("schedule", str(EXAMPLE), "--units", "us", "--format", "json")
    assert code == 0, err
    text = json.dumps(json.loads(out)["criteria"], ensure_ascii=False)
    assert "°F" in text and "°C" not in text
