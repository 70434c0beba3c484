"""Mutated project files never break ``pipeins schedule`` (issue 9 §7).

The bundled example projects are mutated by hypothesis — keys dropped, duplicated into other
tables or renamed, values retyped or replaced by junk (empty text, nan, inf, 1e999, integers
beyond 64 bits, control characters, wrong units), deep nesting, bytes that are not UTF-8 — and
each result is run through the command line in-process.  Whatever the file, the command

- exits 0 or 2, never with a traceback;
- on 2 prints nothing on standard output and only one-line ``Error: …`` lines (one per problem);
- on 0 with ``--format json`` prints valid JSON holding no NaN or infinity.

Bounded and deterministic (``derandomize``): a few dozen files, about 20–30 s on a quiet machine.
"""

from __future__ import annotations

import contextlib
import copy
import io
import json
import math
import pathlib
import re
import shutil
import tomllib

import pytest
from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st

from pipeins.cli import main

EXAMPLES = pathlib.Path(__file__).resolve().parents[1] / "examples"
PROJECTS = sorted(EXAMPLES.glob("*.toml"))
BASES = {p.name: tomllib.loads(p.read_text(encoding="utf-8")) for p in PROJECTS}

JUNK = ["", " ", "nan", "inf", "-inf", "NaN C", "1e999 m", "1e999", "-1e999 C", "1e-320 m", "-300 C",
        "10 bar", "10 barg", "0", "-1", "0.5", "80 %", "5 parsecs", "a\nb", "\x00", "\x1b[31m", "💥", "k=0",
        "k=-1", "NPS 7", "DN0", 0, -1, 1, 2**63, 2**63 - 1, -2**63, 1e308, -1e308, 5e-324,
        math.nan, math.inf, -math.inf, True, False, [], {}, [1, "a"], {"a": 1}, ["touch", 3]]
KEY_TYPOS = ["temprature", "rh ", "size2", "", "material\x00", "lines", "condition.x", "🙂"]


# --------------------------------------------------------------------------- a small TOML writer
def _key(k: str) -> str:
    return k if re.fullmatch(r"[A-Za-z0-9_-]+", k) else json.dumps(k)


def _value(v) -> str:
    if isinstance(v, bool):
        return "true" if v else "false"
    if isinstance(v, int):
        return str(v)
    if isinstance(v, float):
        if math.isnan(v):
            return "nan"
        if math.isinf(v):
            return "inf" if v > 0 else "-inf"
        return repr(v)
    if isinstance(v, str):
        return json.dumps(v)  # JSON string escapes are TOML basic-string escapes
    if isinstance(v, list):
        return "[" + ", ".join(_value(x) for x in v) + "]"
    if isinstance(v, dict):
        return "{" + ", ".join(f"{_key(k)} = {_value(x)}" for k, x in v.items()) + "}"
    if hasattr(v, "isoformat"):
        return v.isoformat()
    raise TypeError(type(v))


def dump(data: dict) -> str:
    out = [f"{_key(k)} = {_value(v)}" for k, v in data.items()
           if not isinstance(v, dict) and not (isinstance(v, list) and v and all(isinstance(x, dict) for x in v))]
    for top, v in data.items():
        if isinstance(v, dict):
            plain = {k: x for k, x in v.items() if not isinstance(x, dict)}
            out.append(f"\n[{_key(top)}]")
            out += [f"{_key(k)} = {_value(x)}" for k, x in plain.items()]
            for name, table in v.items():
                if isinstance(table, dict):
                    out.append(f"\n[{_key(top)}.{_key(name)}]")
                    out += [f"{_key(k)} = {_value(x)}" for k, x in table.items()]
        elif isinstance(v, list) and v and all(isinstance(x, dict) for x in v):
            for table in v:
                out.append(f"\n[[{_key(top)}]]")
                out += [f"{_key(k)} = {_value(x)}" for k, x in table.items()]
    return "\n".join(out) + "\n"


def test_the_writer_round_trips_every_example():
    for name, data in BASES.items():
        assert tomllib.loads(dump(data)) == data, name


# --------------------------------------------------------------------------- mutations
def _tables(data: dict) -> list[dict]:
    """Every table of a project: the top ones, each named condition/service, each line."""
    out = []
    for v in data.values():
        if isinstance(v, dict):
            out.append(v)
            out += [x for x in v.values() if isinstance(x, dict)]
        elif isinstance(v, list):
            out += [x for x in v if isinstance(x, dict)]
    return out


def _nested(depth: int):
    value = "x"
    for i in range(depth):
        value = {"k": value} if i % 2 else [value]
    return value


@st.composite
def mutated(draw):
    name = draw(st.sampled_from(sorted(BASES)))
    data = json.loads(json.dumps(BASES[name], default=str))  # a deep copy (dates become text)
    for _ in range(draw(st.integers(1, 3))):
        tables = [t for t in _tables(data)]
        table = draw(st.sampled_from(tables))
        keys = sorted(table)
        op = draw(st.sampled_from(["drop", "duplicate", "retype", "junk", "nest", "rename", "add"]))
        if not keys and op != "add":
            op = "add"
        key = draw(st.sampled_from(keys)) if keys else "air"
        if op == "drop":
            table.pop(key, None)
        elif op == "duplicate":
            other = draw(st.sampled_from(tables))
            other[key] = copy.deepcopy(table[key])  # a copy: never a table inside itself
        elif op == "retype":
            v = table[key]
            table[key] = (str(v) if not isinstance(v, str) else
                          draw(st.sampled_from([1, 1.5, [v], {"v": v}, True])))
        elif op == "junk":
            table[key] = draw(st.sampled_from(JUNK))
        elif op == "nest":
            table[key] = _nested(draw(st.integers(1, 60)))
        elif op == "rename":
            table[draw(st.sampled_from(KEY_TYPOS)) or "x"] = table.pop(key)
        else:
            table[draw(st.sampled_from(["rh", "height", "orientation", "thickness", "maintenance", "material",
                                        "flanges", "tag"]))] = draw(st.sampled_from(JUNK))
    text = dump(data).encode("utf-8")
    if draw(st.booleans()) and draw(st.booleans()):  # a quarter of the files: bytes that are not UTF-8
        at = draw(st.integers(0, len(text)))
        text = text[:at] + draw(st.sampled_from([b"\xff", b"\xc3", b"\x80\x80", b"\xed\xa0\x80"])) + text[at:]
    return name, text


def _run(argv):
    out, err = io.StringIO(), io.StringIO()
    with contextlib.redirect_stdout(out), contextlib.redirect_stderr(err):
        try:
            main(argv)
            code = 0
        except SystemExit as exc:
            code = exc.code or 0
    return code, out.getvalue(), err.getvalue()


def _no_constants(name):
    raise AssertionError(f"JSON holds {name}")


@pytest.fixture(scope="module")
def folder(tmp_path_factory):
    path = tmp_path_factory.mktemp("fuzz")
    for csv in EXAMPLES.glob("*.csv"):
        shutil.copy(csv, path / csv.name)
    return path


@settings(max_examples=40, deadline=None, derandomize=True, database=None,
          suppress_health_check=[HealthCheck.too_slow, HealthCheck.data_too_large])
@given(case=mutated(), fmt=st.sampled_from(["json", "json", "text"]))
def test_mutated_project_files_exit_cleanly(folder, case, fmt):
    name, text = case
    path = folder / name
    path.write_bytes(text)
    code, out, err = _run(["schedule", str(path), "--format", fmt])
    assert code in (0, 2), (code, err)
    assert "Traceback" not in out + err
    assert "Warning" not in err  # no numpy RuntimeWarning reaches the user
    if code == 2:
        assert out == ""
        lines = err.splitlines()
        assert lines and all(line.startswith("Error: ") for line in lines), err
        assert len(lines) == len(set(lines)), "a problem is reported twice"
    else:
        if fmt == "json":
            json.loads(out, parse_constant=_no_constants)
        else:
            assert not re.search(r"\b(nan|inf)\b", out, re.I), out
