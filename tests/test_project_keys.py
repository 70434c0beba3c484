"""The project-file key reference (docs/project-file.md) lists every key the reader knows."""

import pathlib
import re

import pytest

from pipeins.project import KEYS

DOC = pathlib.Path(__file__).resolve().parents[1] / "docs" / "project-file.md"
HEADINGS = {"project": "### [project]", "energy": "### [energy]", "conditions": "### [conditions.NAME]",
            "services": "### [services.NAME]", "lines": "### [[lines]]", "faces": "### [[faces]]",
            "vessels": "### [[vessels]]", "report": "### [report]"}


def _section(table: str) -> str:
    text = DOC.read_text(encoding="utf-8")
    start = text.index(HEADINGS[table])
    rest = text[start + len(HEADINGS[table]):]
    end = re.search(r"^##+ ", rest, re.M)
    return rest[: end.start()] if end else rest


@pytest.mark.parametrize("table", sorted(KEYS))
def test_every_key_of_the_reader_is_in_the_reference(table):
    section = _section(table)
    missing = sorted(k for k in KEYS[table] if f"`{k}`" not in section)
    assert missing == [], f"docs/project-file.md, {HEADINGS[table]}: add {missing}"


@pytest.mark.parametrize("table", sorted(set(KEYS) - {"report"}))
def test_the_reference_lists_no_key_the_reader_does_not_know(table):
    listed = set(re.findall(r"^\| `([a-z_]+)` \|", _section(table), re.M))
    assert listed - KEYS[table] == set()


def test_schedule_help_points_at_the_reference(run):
    code, out, _ = run("schedule", "--help")
    assert code == 0
    assert "docs/project-file.md" in out
