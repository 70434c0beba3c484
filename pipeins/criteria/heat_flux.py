"""The heat-flux cap: the outer heat flux of the worst part at most a cap per m² of surface
(:class:`pipeins.section_criteria.HeatFluxCap`)."""

from __future__ import annotations

__all__ = ["decide"]


def decide(line):
    if line.req.max_heat_flux_w_m2 is None:
        return None
    from ..section_criteria import HeatFluxCap

    return HeatFluxCap(line.req.max_heat_flux_w_m2)
