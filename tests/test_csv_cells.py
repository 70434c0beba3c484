"""CSV for spreadsheets (issue 8 §10): every command's CSV parses with ``csv``; every column
whose header carries a unit or currency holds plain numbers (``float()`` reads each cell;
empty where not applicable); the basis and cautions travel as ``# `` comment lines."""

from __future__ import annotations

import csv
import io
from pathlib import Path

import pytest

EXAMPLES = Path(__file__).resolve().parents[1] / "examples"
HOT = ["--pipe", "NPS 4", "--fluid-temp", "150C", "--ambient-temp", "25C"]
COMMANDS = {
    "check": ["check", *HOT, "--layer", "mineral wool:50mm"],
    "check-bare": ["check", "--pipe", "copper L 1", "--fluid-temp", "6C", "--ambient-temp", "30C", "--rh", "70"],
    "size": ["size", *HOT, "--material", "mineral wool"],
    "table": ["table", "--sizes", "NPS 1..NPS 4", *HOT[2:], "--material", "mineral wool"],
    "table-matrix": ["table", "--sizes", "NPS 1..NPS 3", *HOT[2:], "--material", "mineral wool", "--matrix",
                     "heat-flow"],
    "cost": ["cost", *HOT, "--length", "100m", "--layer", "mineral wool:50mm", "--energy-price", "0.09/kWh",
             "--co2-factor", "0.2/kWh", "--currency", "EUR", "--cost-table", str(EXAMPLES / "costs_demo.csv")],
    "cost-bare": ["cost", *HOT, "--energy-price", "0.09/kWh"],
    "list-pipes": ["list", "pipes"],
    "list-rules": ["list", "rules"],
    "list-materials": ["list", "materials"],
    "list-finishes": ["list", "finishes"],
}


def check_csv(text: str, where: str):
    body = [x for x in text.splitlines(True) if not x.startswith("#")]
    rows = list(csv.reader(io.StringIO("".join(body))))
    assert rows, where
    header = rows[0]
    for row in rows[1:]:
        assert len(row) == len(header), where
        for head, cell in zip(header, row):
            # "k [unit] @ mean temperature" lists k@T pairs: a text column by design
            if "[" in head and "@" not in head and cell != "":
                try:
                    float(cell)
                except ValueError:
                    pytest.fail(f"{where}: column {head!r} holds {cell!r}, not a plain number")
    return header, rows[1:]


@pytest.mark.parametrize("units", ["si", "us"])
@pytest.mark.parametrize("name", list(COMMANDS))
def test_command_csv_cells_are_plain_numbers(run, name, units):
    code, out, err = run(*COMMANDS[name], "--format", "csv", "--units", units)
    assert code == 0, err
    check_csv(out, name)
    if name in ("check", "size", "cost", "table"):
        assert out.startswith("# ") and "# caution: " in out  # basis and cautions exported


@pytest.mark.parametrize("units", ["si", "us"])
@pytest.mark.parametrize("project", sorted(p.name for p in EXAMPLES.glob("*.toml")))
def test_schedule_csv_files_are_plain_numbers(run, tmp_path, project, units):
    folder = tmp_path / "out"
    code, _, err = run("schedule", str(EXAMPLES / project), "--format", "csv", "--units", units,
                       "--output", str(folder))
    assert code == 0, err
    for path in sorted(folder.iterdir()):
        text = path.read_text(encoding="utf-8")
        check_csv(text, f"{project}/{path.name}")
        assert text.startswith("# Insulation schedule") and "# basis: " in text
    header, _ = check_csv((folder / "totals.csv").read_text(encoding="utf-8"), "totals")
    import tomllib

    currency = tomllib.loads((EXAMPLES / project).read_text(encoding="utf-8"))["project"].get("currency")
    if currency:
        assert any(f"[{currency}]" in h for h in header)  # the currency in the header, not in the cells
