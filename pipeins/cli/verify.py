"""``pipeins verify``: run the published checks shipped with pipeins and show each result."""

from __future__ import annotations

import sys

import click

from .options import emit, output_options

__all__ = ["verify"]


def _emit_json_list(items, output):
    import json

    from ..fileio import write_text_output

    text = json.dumps(items, indent=2, allow_nan=False) + "\n"
    if output is None or output == "-":
        click.echo(text, nl=False)
    else:
        write_text_output(output, text, "--output")


@click.command()
@click.option("--match", metavar="TEXT", help="Run only the checks whose id or source contains TEXT.")
@output_options
def verify(match, fmt, units, output):
    """Run the published checks shipped with pipeins and compare.

    Each check is a worked example (textbook, standard, a library's documentation) or a
    value from a reference library (iapws, psychrolib, ht, CoolProp, with the version
    named) at a stated state. Prints the source, the published value, pipeins' value,
    the deviation and pass or fail against the check's tolerance; the test-suite runs
    the same checks. Exit status 1 when a check fails. Values are SI whatever --units
    says.

    \b
    Example:
      pipeins verify
      pipeins verify --match incropera
      pipeins verify --format json -o verification.json   # a list of checks
    """
    from ..errors import InputError
    from ..verification import CHECKS, run_checks
    from ..reports.verify import verification_report

    checks = CHECKS
    if match is not None:
        wanted = match.strip().lower()
        checks = [c for c in CHECKS if wanted in c.id.lower() or wanted in c.source.lower()]
        if not checks:
            raise InputError("--match", f'no check id or source contains "{match.strip()}"')
    outcomes = run_checks(checks)
    if fmt == "json":  # the contract: a bare list of checks, each with source, expected, actual, tolerance, passed
        _emit_json_list([o.to_dict() for o in outcomes], output)
    else:
        emit(verification_report(outcomes), fmt, units, output)
    if not all(o.passed for o in outcomes):
        sys.exit(1)  # after the report is out: a failed check is a result, not bad input
