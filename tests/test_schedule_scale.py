"""What makes long line lists fast must not change what is reported: a value read once is
refused again at every line that repeats it, each at its own place; the nesting check
still names the right line."""

from __future__ import annotations

import pytest

from pipeins import fileio
from pipeins.project import ProjectError, parse_project

HEAD = '''[project]
name = "Repeat test (invented)"
[conditions.room]
air = "20 C"
[services.hot]
temperature = "80 C"
material = "mineral wool"
'''


def _line(size: str, length: str) -> str:
    return f'[[lines]]\nservice = "hot"\nsize = "{size}"\nlength = "{length}"\ncondition = "room"\n'


def test_a_repeated_bad_value_is_refused_at_each_line():
    text = HEAD + _line("NPS 2", "-5 m") + _line("NPS 2", "10 m") + _line("NPS 2", "-5 m") + _line("NPS 9/7", "3 m") \
        + _line("NPS 9/7", "3 m")
    with pytest.raises(ProjectError) as info:
        parse_project(text, "repeat.toml")
    problems = info.value.problems
    lengths = [p for p in problems if ": length: " in p]
    sizes = [p for p in problems if ": size: " in p]
    assert [p.split(" (")[0] for p in lengths] == ["repeat.toml: line 11", "repeat.toml: line 21"]
    assert "lines entry 1" in lengths[0] and "lines entry 3" in lengths[1]
    assert lengths[0].split(": length: ")[1] == lengths[1].split(": length: ")[1]
    assert [p.split(" (")[0] for p in sizes] == ["repeat.toml: line 25", "repeat.toml: line 30"]


def test_repeated_good_values_give_equal_lines():
    text = HEAD + _line("NPS 2", "10 m") * 3
    lines = parse_project(text, "ok.toml").lines
    assert [l.length_m for l in lines] == [10.0] * 3
    assert lines[0].size == lines[2].size and [l.file_line for l in lines] == [8, 13, 18]


def test_depth_problem_line_counts_newlines_inside_strings():
    text = 'a = """\none\ntwo\n"""\nb = \'x\'\n# [[[[\nc = ' + "[" * 40 + "]" * 40 + "\n"
    assert fileio.toml_depth_problem(text) == 7
