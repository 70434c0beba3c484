"""Runs read once per shape (``pipeins.project._repeat_shape``): a project read with the
shortcut gives exactly the lines, services and problems it gives when every run is read
in full.  The reference is the full reader itself (the shortcut switched off)."""

from __future__ import annotations

import pytest

import pipeins.project as project
from pipeins.project import ProjectError, parse_project

HEAD = """\
# INVENTED: the fictional Fernhill depot, for reading tests only.
[project]
name = "Fernhill depot (invented)"

[conditions.shed]
air = "15 C"
rh = 60

[conditions.yard]
air = "5 C"
rh = 80
wind = "3 m/s"

[services.hw]
temperature = "70 C"
material = "mineral wool"
criteria = ["touch"]

[services.chw]
temperature = "6 C"
material = "elastomeric foam"
criteria = ["condensation"]
"""


def _line(**keys) -> str:
    body = "\n".join(f"{k} = {v}" for k, v in keys.items())
    return f"\n[[lines]]\n{body}\n"


def _read(text: str, shortcut: bool, monkeypatch, base_dir="."):
    with monkeypatch.context() as m:
        if not shortcut:
            m.setattr(project, "_repeat_shape", lambda kind, table: None)
        try:
            p = parse_project(text, "depot.toml", base_dir)
        except ProjectError as exc:
            return ("problems", str(exc))
        return ("project", repr((p.lines, sorted(p.services.items()), sorted(p.conditions.items()))))


CASES = {
    "repeats with their own lengths and tags": [
        dict(service='"hw"', size='"NPS 2"', length='"12 m"', condition='"shed"'),
        dict(service='"hw"', size='"NPS 2"', length='"30 m"', condition='"shed"', tag='"HW-2"'),
        dict(service='"hw"', size='"NPS 2"', length=7, condition='"shed"'),
        dict(service='"chw"', size='"DN 50"', length='"5 m"', condition='"yard"', valves=2),
        dict(service='"chw"', size='"DN 50"', length='"9 m"', condition='"yard"', valves=2),
    ],
    "a repeat with a bad length": [
        dict(service='"hw"', size='"NPS 2"', length='"12 m"', condition='"shed"'),
        dict(service='"hw"', size='"NPS 2"', length='"-4 m"', condition='"shed"'),
        dict(service='"hw"', size='"NPS 2"', length='"12 kg"', condition='"shed"'),
    ],
    "a repeated tag and a tag that is not text": [
        dict(service='"hw"', size='"NPS 2"', length='"12 m"', condition='"shed"', tag='"A"'),
        dict(service='"hw"', size='"NPS 2"', length='"13 m"', condition='"shed"', tag='"A"'),
        dict(service='"hw"', size='"NPS 2"', length='"14 m"', condition='"shed"', tag=5),
    ],
    "a faulty first run is not a shape to copy": [
        dict(service='"hw"', size='"NPS 2"', length='"-1 m"', condition='"shed"'),
        dict(service='"hw"', size='"NPS 2"', length='"3 m"', condition='"shed"'),
        dict(service='"hw"', size='"NPZ 2"', length='"3 m"', condition='"shed"'),
        dict(service='"hw"', size='"NPZ 2"', length='"4 m"', condition='"shed"'),
    ],
    "runs with their own build-up and orientation": [
        dict(service='"hw"', size='"NPS 1"', length='"2 m"', condition='"shed"', material='"glass wool"'),
        dict(service='"hw"', size='"NPS 1"', length='"6 m"', condition='"shed"', material='"glass wool"'),
        dict(service='"hw"', size='"NPS 1"', length='"3 m"', condition='"shed"', orientation='"vertical"',
             height='"3 m"'),
        dict(service='"hw"', size='"NPS 1"', length='"4 m"', condition='"shed"', orientation='"vertical"',
             height='"3 m"'),
        dict(service='"hw"', size='"NPS 1"', length='"4 m"', condition='"shed"', orientation='"vertical"'),
    ],
}


@pytest.mark.parametrize("name", CASES)
def test_the_shortcut_reads_as_the_full_reader(name, monkeypatch):
    text = HEAD + "".join(_line(**keys) for keys in CASES[name])
    full = _read(text, False, monkeypatch)
    assert _read(text, True, monkeypatch) == full
    if name.startswith("repeats"):
        assert full[0] == "project"
    elif name != "runs with their own build-up and orientation":
        assert full[0] == "problems"


def test_a_repeat_keeps_its_own_place_in_the_file(monkeypatch):
    lines = [dict(service='"hw"', size='"NPS 2"', length=f'"{n} m"', condition='"shed"') for n in (3, 4, 5)]
    p = parse_project(HEAD + "".join(_line(**k) for k in lines), "depot.toml", ".")
    assert [l.length_m for l in p.lines] == [3.0, 4.0, 5.0]
    assert [l.index for l in p.lines] == [1, 2, 3]
    assert len({l.file_line for l in p.lines}) == 3
    assert [l.tag for l in p.lines] == [f"hw NPS 2 shed #{i}" for i in (1, 2, 3)]


def test_a_line_list_reads_as_the_full_reader(tmp_path, monkeypatch):
    rows = ["service,size,length,condition,tag", "hw,NPS 2,12 m,shed,", "hw,NPS 2,14 m,shed,",
            "hw,NPS 2,-3 m,shed,", "hw,NPS 2,5 m,shed,T1", "hw,NPS 2,6 m,shed,T1"]
    (tmp_path / "list.csv").write_text("\n".join(rows) + "\n", encoding="utf-8")
    text = HEAD.replace('name = "Fernhill depot (invented)"',
                        'name = "Fernhill depot (invented)"\nlines_file = "list.csv"')

    full = _read(text, False, monkeypatch, tmp_path)
    assert _read(text, True, monkeypatch, tmp_path) == full
    assert full[0] == "problems" and "row 4" in full[1] and "row 6" in full[1]
