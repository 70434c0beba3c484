"""The reference tables ship inside the wheel and are found from an installed (non-editable) copy."""

import subprocess
import sys
import zipfile
from pathlib import Path

ROOT = Path(__file__).resolve().parents[1]


def test_wheel_carries_every_table_and_finds_them_when_installed(tmp_path):
    from hatchling.builders.wheel import WheelBuilder

    wheel = next(iter(WheelBuilder(str(ROOT)).build(directory=str(tmp_path / "dist"), versions=["standard"])))
    with zipfile.ZipFile(wheel) as zf:
        names = set(zf.namelist())
        for csv in (ROOT / "tables").glob("*.csv"):
            assert f"pipeins/tables/{csv.name}" in names
        zf.extractall(tmp_path / "site")
    # Import the unpacked wheel from a folder with no checkout around it.
    code = ("import pipeins.tables as t, pipeins; "
            "print(t.table_path('finishes')); print(len(t.read_table('pipes_steel')))")
    out = subprocess.run([sys.executable, "-c", code], cwd=tmp_path, capture_output=True, text=True,
                         env={"PYTHONPATH": str(tmp_path / "site"), "PATH": "/usr/bin:/bin"}, check=True).stdout
    path, rows = out.split()
    assert path.startswith(str(tmp_path / "site" / "pipeins" / "tables"))
    assert int(rows) > 300
