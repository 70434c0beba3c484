"""The heat-flow cap: |heat flow| at most a cap per metre of run, and/or at least a reduction
against the bare line (any section: the reduction is a ratio in the section's own basis)."""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np

from ..errors import InputError
from .base import Criterion, _in, _q

__all__ = ["HeatFlowCap", "decide"]

#: A result's heat-flow basis and the quantity kind it is written as.
_BASIS_KINDS = {"W/m": ("heat_flow_per_length", "W/m"), "W/m²": ("heat_flux", "W/m²"), "W": ("power", "W")}


@dataclass
class HeatFlowCap(Criterion):
    """|heat flow| at or below ``max_w_per_m``, and/or at least ``min_reduction`` (0–1)
    below the heat flow of the line without the sized layer."""

    max_w_per_m: float | None = None
    min_reduction: float | None = None
    key = "heat_flow"
    label = "heat-flow cap"

    def __post_init__(self):
        if self.max_w_per_m is None and self.min_reduction is None:
            raise InputError("--max-heat-flow", "give a heat-flow cap or a minimum reduction")
        if self.max_w_per_m is not None and self.max_w_per_m <= 0:
            raise InputError("--max-heat-flow", "the heat-flow cap must be greater than zero")
        if self.min_reduction is not None and not 0 < self.min_reduction < 1:
            raise InputError("--min-reduction", "the reduction must be above 0 % and below 100 %")

    def cap(self, problem):
        caps = []
        if self.max_w_per_m is not None:
            caps.append(np.full((problem.n_sizes, 1), self.max_w_per_m))
        if self.min_reduction is not None:
            bare = np.abs(problem.bare().heat_flow)
            caps.append((1 - self.min_reduction) * np.broadcast_to(bare, (problem.n_sizes, 1)))
        return np.minimum.reduce(caps)

    def margin(self, problem, result, thickness_m):
        if self.max_w_per_m is not None and result.basis != "W/m":
            raise InputError("--max-heat-flow", f"the cap is per metre of run; a {result.kind}'s heat flow is in "
                             f"{result.basis}: give --min-reduction instead")
        cap = self.cap(problem)
        return (cap - np.abs(result.heat_flow)) / cap  # relative margin

    def describe(self, units="si"):
        parts = []
        if self.max_w_per_m is not None:
            parts.append(f"|heat flow| at most {_q(self.max_w_per_m, 'heat_flow_per_length', units)}")
        if self.min_reduction is not None:
            parts.append(f"at least {100 * self.min_reduction:g} % below the bare line")
        return " and ".join(parts)

    def state(self, problem, result, index):
        q = abs(float(np.ravel(result.heat_flow)[index]))
        cap = float(np.ravel(np.broadcast_to(self.cap(problem), result.shape))[index])
        u = self.units
        # the section's own basis: W/m of a run, W/m² of a face, W of a vessel
        kind, unit = _BASIS_KINDS.get(getattr(result, "basis", "W/m"), _BASIS_KINDS["W/m"])
        return (f"|heat flow| {_in(u, q, kind, f'{q:.1f} {unit}')}, {100 * (cap - q) / cap:.0f} % "
                f"under the cap of {_in(u, cap, kind, f'{cap:.1f} {unit}')}")

    def miss(self, margin, thickness_m):
        return (f"heat-flow cap cannot be met: with "
                f"{_in(self.units, thickness_m, 'thickness', f'{thickness_m * 1000:.0f} mm')} the heat flow is still "
                f"{-100 * margin:.1f} % above the cap")


def decide(line):
    req = line.req
    if req.max_heat_flow_w_per_m is None and req.min_reduction is None:
        return None
    return HeatFlowCap(req.max_heat_flow_w_per_m, req.min_reduction)
