"""The economic thickness: least installed cost plus the present worth of the energy, per size
(:func:`pipeins.annual.economic_outcome`).  A lower bound on the pick; computed again over an
added inner layer (``per_build_up``)."""

from __future__ import annotations

__all__ = ["required"]


def required(ctx):
    """The economic thickness of the selection *ctx* (a :class:`pipeins.criteria.registry.Selecting`)
    as a :class:`~pipeins.sizing.CriterionOutcome` (key ``economic``), or None without an energy
    basis with a cost table; its cost curves go to ``ctx.extras["economic_curves"]``."""
    if ctx.economic is None:
        return None
    from ..annual import economic_outcome

    outcome, curves = economic_outcome(ctx.problem, ctx.sizes, ctx.economic)
    if ctx.extras is not None:
        ctx.extras["economic_curves"] = curves
    return outcome
