"""Line lists (CSV, XLSX) as the lines of a project: the same schedule as [[lines]] tables;
every error path with its exact line."""

import csv
import importlib.util
import json
import pathlib
import shutil

import pytest

ROOT = pathlib.Path(__file__).resolve().parents[1]
EXAMPLE = ROOT / "examples" / "kestrel_bay_brewery.toml"
LIST = ROOT / "examples" / "line-list-kestrel-bay.csv"


def _xlsx_tool():
    spec = importlib.util.spec_from_file_location("line_list_xlsx", ROOT / "examples" / "line_list_xlsx.py")
    module = importlib.util.module_from_spec(spec)
    spec.loader.exec_module(module)
    return module


def _schedule_json(run, path):
    code, out, err = run("schedule", str(path), "--format", "json")
    assert code == 0, err
    return json.loads(out)


def _as_toml_lines(csv_path) -> str:
    """The rows of the example list written as [[lines]] tables, by the example's column map."""
    names = {"Line No.": "tag", "Service": "service", "Pipe size": "size", "Length": "length", "Area": "condition",
             "Valves": "valves", "Flanges": "flanges"}
    out = []
    with open(csv_path, newline="", encoding="utf-8") as fh:
        for row in csv.DictReader(fh):
            out.append("[[lines]]")
            for header, key in names.items():
                value = row[header].strip()
                if value:
                    out.append(f"{key} = {value}" if key in ("valves", "flanges", "length") else f'{key} = "{value}"')
            out.append("")
    return "\n".join(out)


def _without_list(text: str) -> str:
    text = text.replace('lines_file = "line-list-kestrel-bay.csv"\n', "")
    start = text.index("[lines_columns]")
    end = text.index("[energy]")
    return text[:start] + text[end:]


def test_csv_and_xlsx_lists_give_the_schedule_of_the_same_lines_in_toml(run, tmp_path):
    pytest.importorskip("openpyxl")
    shutil.copy(LIST, tmp_path / LIST.name)
    from_csv = tmp_path / "from_csv.toml"
    from_csv.write_text(EXAMPLE.read_text(encoding="utf-8"), encoding="utf-8")
    book = _xlsx_tool().csv_to_xlsx(LIST, tmp_path / "line-list.xlsx", sheet="Lines")
    from_xlsx = tmp_path / "from_xlsx.toml"
    from_xlsx.write_text(EXAMPLE.read_text(encoding="utf-8").replace(
        'lines_file = "line-list-kestrel-bay.csv"', 'lines_file = "line-list.xlsx"\nlines_sheet = "Lines"'),
        encoding="utf-8")
    typed = tmp_path / "typed.toml"
    typed.write_text(_without_list(EXAMPLE.read_text(encoding="utf-8")) + "\n" + _as_toml_lines(LIST),
                     encoding="utf-8")
    expected = _schedule_json(run, typed)
    assert len(expected["lines"]) == 15
    assert _schedule_json(run, from_csv) == expected
    assert _schedule_json(run, from_xlsx) == expected
    assert book.exists()


def test_the_bundled_example_runs(run):
    data = _schedule_json(run, EXAMPLE)
    assert [line["tag"] for line in data["lines"]][:3] == ["HW-101", "HW-102", "HW-103"]


# --------------------------------------------------------------------------- errors
HEAD = """\
[project]
name = "Test site (invented)"
lines_file = "{name}"
{extra}
[conditions.room]
air = "20 C"
rh = 60

[services.hot]
temperature = "80 C"
material = "mineral wool"
{columns}
"""


def _errors(run, tmp_path, text, name="l.csv", extra="", columns="", data=None):
    if data is not None:
        (tmp_path / name).write_bytes(data)
    elif text is not None:
        (tmp_path / name).write_text(text, encoding="utf-8")
    project = tmp_path / "p.toml"
    project.write_text(HEAD.format(name=name, extra=extra, columns=columns), encoding="utf-8")
    out_file = tmp_path / "out.json"
    code, out, err = run("schedule", str(project), "--format", "json", "-o", str(out_file))
    assert (code, out) == (2, "")
    assert not out_file.exists()
    return err.strip().splitlines()


GOOD = "tag,service,size,length,condition\nA1,hot,NPS 2,10,room\n"


@pytest.mark.parametrize("text, columns, lines", [
    ("tag,service,size,length,condition,Insulation\nA1,hot,NPS 2,10,room,x\n", "",
     ['Error: l.csv: row 1, column "Insulation": unknown column; did you mean "casing_insulation" or "orientation"? '
      '(rename it, map it in [lines_columns], or leave it out with [lines_columns] ignore = ["Insulation"])']),
    ("tag,service,size,length\nA1,hot,NPS 2,10\n", "",
     ['Error: l.csv: row 1: no "condition" column; the header row has "tag", "service", "size", "length" '
      '(name a column "condition" or map one in [lines_columns])']),
    (GOOD, '[lines_columns]\ntag = "Line No."\n',
     ['Error: l.csv: row 1, column "tag": [lines_columns] takes tag from column "Line No."; rename one of them '
      'or leave this one out with [lines_columns] ignore = ["tag"]',
      'Error: l.csv: row 1: no column "Line No." (the [lines_columns] entry for tag); the header row has "tag", '
      '"service", "size", "length", "condition"']),
    ("tag,service,size,Size,length,condition\nA1,hot,NPS 2,NPS 3,10,room\n", "",
     ['Error: l.csv: row 1, column "Size": a second column for size (column "size" is the first)']),
    ("tag,service,size,length,condition,\nA1,hot,NPS 2,10,room,\nA2,hot,NPS 2,10,room,oops\n", "",
     ["Error: l.csv: row 1: column 6 has no header, yet row 3 has a value in it; name it or empty it"]),
    ("tag,service,size,length,condition\nA1,hot,NPS 2,50 m,room\nA2,hot,NPS 2,150 ft,room\nA3,hot,NPS 2,15 ft,room\n",
     "", ['Error: l.csv: column "length": mixed units: "m" (row 2) and "ft" (row 3 and 1 more); write the whole '
          "column in one unit"]),
    ("tag,service,size,length,condition\nA1,hot,NPS 2,50,room\nA2,hot,NPS 2,150 m,room\n", "",
     ['Error: l.csv: column "length": mixed units: no unit (row 2) and "m" (row 3); write the whole column in '
      "one unit"]),
    ("tag,service,size,length,condition\n\n", "", ["Error: l.csv: no lines below the header row (row 1)"]),
    ("", "", ["Error: l.csv: empty; the first row names the columns (service, size, length, condition, …)"]),
    (GOOD, '[lines_columns]\nsise = "Pipe size"\nignore = "Remarks"\n',
     ['Error: p.toml: line 13 (lines_columns): sise: unknown line key "sise"; did you mean "size" or "soil"?',
      'Error: p.toml: line 14 (lines_columns): ignore: ignore must be a list of column headers, e.g. ["Remarks"]']),
])
def test_list_problems(run, tmp_path, text, columns, lines):
    assert _errors(run, tmp_path, text, columns=columns) == lines


def test_row_problems_name_the_row_and_the_column_all_at_once(run, tmp_path):
    text = ("Line No.,Service,Pipe size,Length,Area,Valves,Remarks\n"
            "A1,hot,NPS 2-1/4,10,room,1,x\n"
            "A2,hott,NPS 2,38,room,2,\n"
            "A1,hot,NPS 2,2,,1,\n"
            "A4,hot,NPS 2,-5,room,x,\n")
    columns = '[lines_columns]\ntag = "Line No."\nsize = "Pipe size"\ncondition = "Area"\nignore = ["Remarks"]\n'
    lines = _errors(run, tmp_path, text, columns=columns)
    assert lines[0].startswith('Error: l.csv: row 2, column "Pipe size": unknown pipe size "NPS 2-1/4"')
    assert sorted(lines[1:]) == [  # (the reader's order of keys within a row varies between runs)
        'Error: l.csv: row 3, column "Service": unknown service "hott"; did you mean "hot"?',
        'Error: l.csv: row 4, column "Area": empty; every line needs its condition',
        'Error: l.csv: row 4, column "Line No.": tag "A1" is already used by row 2',
        'Error: l.csv: row 5, column "Length": run length must be greater than zero',
        'Error: l.csv: row 5, column "Valves": must be a whole number, 0 or more',
    ]


def test_xlsx_row_problems_name_the_sheet(run, tmp_path):
    pytest.importorskip("openpyxl")
    rows = [["tag", "service", "size", "length", "condition"], ["A1", "hot", "NPS 2", 10, "room"],
            [None] * 5, ["A2", "hot", "NPS 2 1/4", 12.5, "room"]]
    _xlsx_tool().write_xlsx(rows, tmp_path / "l.xlsx", sheet="Lines")
    lines = _errors(run, tmp_path, None, name="l.xlsx", extra='lines_sheet = "Lines"')
    assert len(lines) == 1
    assert lines[0].startswith('Error: l.xlsx: sheet "Lines" row 4, column "size": unknown pipe size "NPS 2 1/4"')


def test_xlsx_unknown_sheet_and_unreadable_workbook(run, tmp_path):
    pytest.importorskip("openpyxl")
    _xlsx_tool().write_xlsx([["tag"]], tmp_path / "l.xlsx", sheet="Sheet1")
    assert _errors(run, tmp_path, None, name="l.xlsx", extra='lines_sheet = "Lines"') == [
        'Error: l.xlsx: no sheet "Lines"; known: Sheet1']
    assert _errors(run, tmp_path, None, name="l.xlsx", data=b"not a workbook") == [
        "Error: l.xlsx: not a readable XLSX workbook (File is not a zip file); save it again as .xlsx or as CSV"]


@pytest.mark.parametrize("name, data, line", [
    ("l.xls", b"x", "Error: l.xls: a line list is a .csv or .xlsx file; save it as .xlsx or CSV"),
    ("l.txt", b"x", "Error: l.txt: a line list is a .csv or .xlsx file"),
    ("l.csv", b"tag\xff\n", "Error: l.csv: not UTF-8 text (byte 0xff at offset 3); save it as UTF-8"),
])
def test_unreadable_files(run, tmp_path, name, data, line):
    assert _errors(run, tmp_path, None, name=name, data=data) == [line]


def test_missing_file_and_a_sheet_for_a_csv(run, tmp_path):
    project = tmp_path / "p.toml"
    project.write_text(HEAD.format(name="nowhere.csv", extra="", columns=""), encoding="utf-8")
    code, _, err = run("schedule", str(project))
    assert code == 2
    assert err.strip() == 'Error: p.toml: line 3 (project): lines_file: file "nowhere.csv" not found next to p.toml'
    assert _errors(run, tmp_path, GOOD, extra='lines_sheet = "Lines"') == [
        "Error: p.toml: line 4 (project): lines_sheet: a sheet applies to an XLSX line list only"]


def test_a_column_map_without_a_list(run, tmp_path):
    project = tmp_path / "p.toml"
    project.write_text(HEAD.format(name="x", extra="", columns='[lines_columns]\ntag = "No."\n')
                       .replace('lines_file = "x"\n', "") + '[[lines]]\nservice = "hot"\nsize = "NPS 2"\n'
                       'length = "10 m"\ncondition = "room"\n', encoding="utf-8")
    code, _, err = run("schedule", str(project))
    assert code == 2
    assert err.strip() == ("Error: p.toml: [lines_columns] maps the columns of a line list; add lines_file to "
                           "[project]")


def test_toml_lines_and_a_list_together(run, tmp_path):
    (tmp_path / "l.csv").write_text(GOOD, encoding="utf-8")
    project = tmp_path / "p.toml"
    project.write_text(HEAD.format(name="l.csv", extra="", columns="") + '[[lines]]\ntag = "T1"\nservice = "hot"\n'
                       'size = "NPS 3"\nlength = "5 m"\ncondition = "room"\n', encoding="utf-8")
    data = _schedule_json(run, project)
    assert [line["tag"] for line in data["lines"]] == ["T1", "A1"]


def test_reader_is_a_pure_function(tmp_path):
    from pipeins.linelist import read_line_list

    path = tmp_path / "list.csv"
    path.write_text("Line No.,Service,Size,Length,Condition,Notes\nA1,hot,NPS 2,10 m,room,\n", encoding="utf-8")
    (row,) = read_line_list(path, {"tag", "service", "size", "length", "condition"}, {"tag": "Line No.",
                            "ignore": ["Notes"]}, name="list.csv")
    assert row.values == {"tag": "A1", "service": "hot", "size": "NPS 2", "length": "10 m", "condition": "room"}
    assert row.where("size") == 'list.csv: row 2, column "Size"'


def test_a_csv_list_does_not_import_the_spreadsheet_library(tmp_path):
    """openpyxl is imported for an XLSX list only (speed: heavy imports only when used)."""
    import subprocess
    import sys

    (tmp_path / "l.csv").write_text(GOOD, encoding="utf-8")
    (tmp_path / "p.toml").write_text(HEAD.format(name="l.csv", extra="", columns=""), encoding="utf-8")
    code = ("import sys; from pipeins.project import load_project; from pipeins.schedule import compute_schedule; "
            f"compute_schedule(load_project({str(tmp_path / 'p.toml')!r})); print('openpyxl' in sys.modules)")
    out = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True, cwd=ROOT, check=True)
    assert out.stdout.strip() == "False"


def test_spellings_of_one_unit_are_one_unit(run, tmp_path):
    text = ('tag,service,size,length,condition\nA1,hot,NPS 2,50 ft,room\nA2,hot,NPS 2,"20 feet",room\n'
            "A3,hot,NPS 2,15ft,room\n")
    (tmp_path / "l.csv").write_text(text, encoding="utf-8")
    (tmp_path / "p.toml").write_text(HEAD.format(name="l.csv", extra="", columns=""), encoding="utf-8")
    data = _schedule_json(run, tmp_path / "p.toml")
    assert [line["length_m"] for line in data["lines"]] == pytest.approx([15.24, 6.096, 4.572])
