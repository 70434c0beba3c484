"""The tracer output: a heat tracer's output per metre at least the design heat loss
(:class:`pipeins.tracing.TracerOutput`)."""

from __future__ import annotations

__all__ = ["decide"]


def decide(line):
    if line.req.tracer_output_w_per_m is None:
        return None
    from ..tracing import tracer_criterion

    return tracer_criterion(line.req, line.fluid_cold, line.air_warm, line.units)
