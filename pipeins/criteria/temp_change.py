"""The fluid temperature change along a run at most a limit: a pipe's liquid marched along
the run (:class:`pipeins.runs.TempChange`), a duct's air by the exponential law
(:class:`pipeins.section_criteria.DuctTempChange`)."""

from __future__ import annotations

from ..errors import InputError

__all__ = ["decide"]


def decide(line):
    spec, req = line.spec, line.req
    if req.max_temp_change_k is None:
        return None
    if req.max_temp_change_k <= 0:
        raise InputError("max_temp_change_k", "the temperature change limit must be greater than zero")
    if line.kind == "duct":
        from ..section_criteria import duct_temp_change

        return duct_temp_change(spec, req.max_temp_change_k)
    if spec.flow is None or spec.length_m is None or not spec.fluid:
        raise InputError("max_temp_change_k", "needs the fluid, its flow and length_m")
    from ..runs import TempChange

    return TempChange(req.max_temp_change_k, spec.fluid, flow=spec.flow, length_m=spec.length_m)
