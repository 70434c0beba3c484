"""Shared fixtures."""

import pytest
from hypothesis import settings

# Property tests draw the same examples on every run, so that a green main stays green in CI;
# no example database (a failure saved by one run must not change the next); widen a search with HYPOTHESIS_PROFILE=explore.
settings.register_profile("pipeins", derandomize=True, deadline=None, database=None)
settings.register_profile("explore", derandomize=False, deadline=None, max_examples=1000)
settings.load_profile(__import__("os").environ.get("HYPOTHESIS_PROFILE", "pipeins"))

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
