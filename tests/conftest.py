"""Shared fixtures."""

import pytest

from pipeins.cli import main


@pytest.fixture
def run(capsys):
    """``run(*args) -> (exit status, stdout, stderr)`` of ``pipeins <args>``, in-process."""

    def _run(*args):
        with pytest.raises(SystemExit) as exc:
            main(list(args))
        captured = capsys.readouterr()
        code = exc.value.code
        code = 0 if code is None else code
        assert "Traceback" not in captured.out + captured.err
        return code, captured.out, captured.err

    return _run
