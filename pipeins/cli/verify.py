"""``pipeins verify``: run the published checks shipped with pipeins and show each result."""

from __future__ import annotations

import sys

import click

from .options import emit, output_options

__all__ = ["verify", "verification_report"]


def _value(value: float) -> str:
    return f"{value:.7g}" if abs(value) >= 1e6 else f"{value:.6g}"


def _deviation(outcome) -> str:
    check = outcome.check
    if check.relative:
        return f"{outcome.deviation * 100:+.3g} %"
    return f"{outcome.deviation:+.3g} {check.unit}"


def _tolerance(check) -> str:
    return f"± {check.tolerance * 100:g} %" if check.relative else f"± {check.tolerance:g} {check.unit}"


def verification_report(outcomes):
    """The :class:`pipeins.reports.Report` of *outcomes* (:func:`pipeins.verification.run_checks`)."""
    from .. import __version__
    from ..reports import Column, Report, Table

    from ..verification import REFERENCES

    columns = [Column(h) for h in ("check", "source", "quantity", "unit", "published", "pipeins",
                                   "deviation", "tolerance", "result")]
    rows = [
        [o.check.id, o.check.source, o.check.quantity, o.check.unit, _value(o.check.expected),
         _value(o.actual), _deviation(o), _tolerance(o.check), "pass" if o.passed else "FAIL"]
        for o in outcomes
    ]
    failed = [o.check.id for o in outcomes if not o.passed]
    verdict = (f"all {len(outcomes)} checks pass" if not failed
               else f"{len(failed)} of {len(outcomes)} checks fail: {', '.join(failed)}")
    table = Table("Published checks", columns, rows,
                  note=f"{verdict}. Deviation = (pipeins − published) / published for a relative "
                       "tolerance, pipeins − published for an absolute one; values in SI.")
    data = {
        "pipeins_version": __version__,
        "checks": [o.to_dict() for o in outcomes],
        "passed": len(outcomes) - len(failed),
        "failed": len(failed),
    }
    footer = [f"{short}: {full}." for short, full in REFERENCES.items()] + [
        "Worked examples marked 'from memory' were recalled rather than read again from the book; "
        "reference-library values were computed with the library version named and are recomputed "
        "live by the test-suite.",
        "Passing these checks shows that the method reproduces these published values; it does not "
        "replace checking a design against the local codes, the owner's rules and licensed practice.",
    ]
    return Report(f"Verification of pipeins {__version__}", [table], data, footer=footer)


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
      pipeins verify --format json -o verification.json
    """
    from ..errors import InputError
    from ..verification import CHECKS, run_checks

    checks = CHECKS
    if match is not None:
        wanted = match.strip().lower()
        checks = [c for c in CHECKS if wanted in c.id.lower() or wanted in c.source.lower()]
        if not checks:
            raise InputError("--match", f'no check id or source contains "{match.strip()}"')
    outcomes = run_checks(checks)
    emit(verification_report(outcomes), fmt, units, output)
    if not all(o.passed for o in outcomes):
        sys.exit(1)  # after the report is out: a failed check is a result, not bad input
