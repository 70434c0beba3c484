"""The report of ``pipeins verify``: each published check, its result and the basis."""

from __future__ import annotations

__all__ = ["verification_report"]


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
    """The :class:`pipeins.reports.Report` of *outcomes* (:func:`pipeins.verification.run_checks`):
    one table of the checks, the JSON payload ``{"pipeins_version", "checks", "passed",
    "failed"}`` and the basis (full citations, what "from memory" means, the caution).
    Usable as an appendix by other reports."""
    from .. import __version__
    from ..verification import REFERENCES
    from . import Column, Report, Table

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
