"""The schedule's progress bar: on standard error only when it is a terminal, never with
--quiet, never in piped output, and the report itself unchanged."""

from __future__ import annotations

import io
import subprocess
import sys
from pathlib import Path

import pytest

import pipeins.cli.schedule as schedule_cli
from pipeins.cli import main
from pipeins.cli.schedule import ProgressBar, progress_bar

ROOT = Path(__file__).resolve().parents[1]
EXAMPLE = str(ROOT / "examples" / "hospital_steam.toml")


class FakeTerminal(io.StringIO):
    def isatty(self) -> bool:
        return True


class Pipe(io.StringIO):
    def isatty(self) -> bool:
        return False


def _run(monkeypatch, capsys, stderr, *extra) -> str:
    monkeypatch.setattr(schedule_cli, "PROGRESS_DELAY_S", 0.0)  # draw from the start: the example is quick
    capsys.readouterr()
    monkeypatch.setattr(sys, "stderr", stderr)
    try:
        main(["schedule", EXAMPLE, *extra])
    except SystemExit as stop:  # main() ends with exit status 0
        assert stop.code in (0, None)
    monkeypatch.setattr(sys, "stderr", sys.__stderr__)
    return capsys.readouterr().out


def test_a_terminal_gets_a_bar_that_is_wiped_and_the_report_is_unchanged(monkeypatch, capsys):
    quiet_out = _run(monkeypatch, capsys, FakeTerminal(), "--quiet")
    terminal = FakeTerminal()
    out = _run(monkeypatch, capsys, terminal)
    drawn = terminal.getvalue()
    assert "\r" in drawn and "%" in drawn and "#" in drawn
    assert "reading lines" in drawn or "sizing" in drawn
    assert drawn.endswith("\r") and drawn.rsplit("\r", 2)[-2].strip() == ""  # wiped: blanks, back to column 0
    assert out == quiet_out and out.startswith("Insulation schedule")


def test_quiet_and_piped_stderr_get_nothing(monkeypatch, capsys):
    quiet = FakeTerminal()
    _run(monkeypatch, capsys, quiet, "--quiet")
    assert quiet.getvalue() == ""
    piped = Pipe()
    _run(monkeypatch, capsys, piped)
    assert piped.getvalue() == ""


def test_piped_stderr_of_the_process_is_empty():
    done = subprocess.run([sys.executable, "-c", "from pipeins.cli import main; main()", "schedule", EXAMPLE],
                          cwd=ROOT, capture_output=True, text=True, check=True)
    assert done.stderr == "" and done.stdout.startswith("Insulation schedule")


def test_progress_bar_only_on_a_terminal(monkeypatch):
    monkeypatch.setattr(sys, "stderr", FakeTerminal())
    assert isinstance(progress_bar(False), ProgressBar)
    assert progress_bar(True) is None
    monkeypatch.setattr(sys, "stderr", Pipe())
    assert progress_bar(False) is None


def test_bar_draws_in_place_and_waits_for_a_long_run():
    stream = FakeTerminal()
    bar = ProgressBar(stream, delay_s=0.0)
    bar("solving lines", 50, 100)
    bar("solving lines", 100, 100)
    assert stream.getvalue().count("\r") == 2
    assert "[" + "#" * 30 + "] 100 %" in stream.getvalue()
    bar.close()
    assert stream.getvalue().endswith(" " * len("solving lines  [" + "#" * 30 + "] 100 %") + "\r")
    late = FakeTerminal()
    slow = ProgressBar(late, delay_s=60.0)
    slow("sizing", 1, 2)
    slow.close()
    assert late.getvalue() == ""  # a short run never shows a bar


@pytest.mark.parametrize("done,total,filled", [(0, 10, 0), (5, 10, 15), (10, 10, 30), (3, 0, 30)])
def test_bar_fill(done, total, filled):
    stream = FakeTerminal()
    ProgressBar(stream, delay_s=0.0)("sizing", done, total)
    assert stream.getvalue().count("#") == filled
