"""Sizing: the least thickness of the outermost layer that meets each criterion.

A criterion is a small object whose :meth:`Criterion.margin` says, for solved cases, by
how much each passes (>= 0) or fails (< 0), in its own unit.  The search is shared:

* **Continuous**: the least thickness from which on every thicker layer passes.  All
  sizes are solved together on a geometric grid of thicknesses (plus the bare pipe);
  the thickest failing grid point and the next one bracket the answer, which bisection
  narrows to 0.01 mm.  Because the grid is scanned from the thick end, a rising branch
  below the critical radius (where heat flow first grows with thickness) never passes
  for the answer.
* **Commercial**: the least thickness of a series from which on every thicker one passes
  all active criteria; beyond the thickest single layer of the series, two layers whose
  sum passes.

The sized layer is the outermost; fixed inner layers stay as given.
"""

from __future__ import annotations

from dataclasses import dataclass, field
from typing import Sequence

import numpy as np

from .errors import InputError
from .model import Layer
from .solve import solve

__all__ = ["Criterion", "TouchSafety", "Condensation", "HeatFlowCap", "ServiceLimits", "SizingProblem",
           "CriterionOutcome", "SizingOutcome", "size", "DEFAULT_DEW_MARGIN_K",
           "SEARCH_TOLERANCE_M"]

DEFAULT_DEW_MARGIN_K = 1.0  # common practice (no standard value): surface at least 1 K above dew point
SEARCH_TOLERANCE_M = 1e-5   # 0.01 mm
_GRID = np.concatenate([[0.0], np.geomspace(0.0005, 1.0, 90)])


@dataclass
class SizingProblem:
    """Everything but the outer layer's thickness; arrays carry one row per pipe size.

    ``pipe`` and ``fluid`` may hold arrays of shape (n, 1) (n sizes); thicknesses are
    laid along the last axis.
    """

    pipe: object
    fixed_layers: Sequence[Layer]
    material: object
    fluid: object
    surroundings: object
    surface: object
    touch_limit_c: float | None = None
    n_sizes: int = 1
    context: dict = field(default_factory=dict)

    def solve(self, thickness_m):
        """Solve with the outer layer at *thickness_m* (shape (n, k) or broadcastable);
        a zero thickness means the layer is absent (sized layer only)."""
        t = np.asarray(thickness_m, dtype=float)
        t = np.broadcast_to(t, np.broadcast_shapes(t.shape, (self.n_sizes, 1)))
        bare = t <= 0
        layers = list(self.fixed_layers) + [Layer(self.material, np.where(bare, 1e-9, t))]
        return solve(self.pipe, layers, self.fluid, self.surroundings, self.surface,
                     touch_limit_c=self.touch_limit_c)

    def bare(self):
        """The bare line (:func:`pipeins.bare.solve_bare`: no layers, the pipe's own
        surface), cached: shape (n, 1)."""
        if "bare" not in self.context:
            from .bare import solve_bare

            self.context["bare"] = solve_bare(self.pipe, self.fluid, self.surroundings, self.surface,
                                              touch_limit_c=self.touch_limit_c)
        return self.context["bare"]


def _q(value_si: float, kind: str, units: str) -> str:
    from .units import format_quantity

    return format_quantity(value_si, kind, units)


def _in(units: str, value: float, kind: str, si_text: str) -> str:
    """*si_text* in SI; in other unit systems the quantity formatted for them."""
    return si_text if units == "si" else _q(value, kind, units)


class Criterion:
    """Base class: ``key`` (JSON), ``label`` (reports), ``unit`` of the margin.

    ``units`` (``"si"`` or ``"us"``, set by :func:`pipeins.selection.select`) is the unit system
    of the sentences :meth:`state` and :meth:`miss` write.

    A criterion whose ``not_applicable`` text is set is dropped by :func:`size`, with that
    text as a note, when every thickness from bare to the thickest passes it.
    """

    key = ""
    label = ""
    not_applicable = ""
    units = "si"

    def margin(self, problem: SizingProblem, result, thickness_m) -> np.ndarray:
        raise NotImplementedError

    def describe(self, units: str = "si") -> str:
        """The requirement in words, quantities in the unit system *units*."""
        return self.label

    def miss(self, margin: float, thickness_m: float) -> str:
        """A plain sentence saying by how much the criterion misses at *thickness_m*."""
        raise NotImplementedError

    def state(self, problem: SizingProblem, result, index: int) -> str:
        """How the solved case *index* stands against the criterion (for reports)."""
        thickness = result.inputs["layers"][-1].thickness_m
        margin = float(np.ravel(self.margin(problem, result, thickness))[index])
        return self.state_text(margin)

    def state_text(self, margin: float) -> str:
        return f"margin {margin:.3g}"


@dataclass
class TouchSafety(Criterion):
    """Outer surface at or below ``limit_c``; ``source`` says where the limit comes from."""

    limit_c: float
    source: str = ""
    key = "surface_temp"
    label = "touch safety"

    def margin(self, problem, result, thickness_m):
        return self.limit_c - result.surface_temp_c

    def describe(self, units="si"):
        text = f"surface at or below {_q(self.limit_c, 'temperature', units)}"
        return f"{text} ({self.source})" if self.source else text

    def state(self, problem, result, index):
        ts, u, lim = float(np.ravel(result.surface_temp_c)[index]), self.units, self.limit_c
        return (f"surface {_in(u, ts, 'temperature', f'{ts:.1f} °C')}, "
                f"{_in(u, lim - ts, 'temperature_difference', f'{lim - ts:.1f} K')} below the "
                f"{_in(u, lim, 'temperature', f'{lim:g} °C')} limit")

    def miss(self, margin, thickness_m):
        u, lim = self.units, self.limit_c
        return (f"touch safety cannot be met: with {_in(u, thickness_m, 'thickness', f'{thickness_m * 1000:.0f} mm')}"
                f" the surface is still {_in(u, -margin, 'temperature_difference', f'{-margin:.1f} K')} above the "
                f"{_in(u, lim, 'temperature', f'{lim:g} °C')} limit")


@dataclass
class Condensation(Criterion):
    """Surface at or above the ambient dew point plus ``margin_k`` (lines colder than air)."""

    margin_k: float = DEFAULT_DEW_MARGIN_K
    cold_sky: bool = False
    key = "condensation"
    label = "condensation control"
    not_applicable = "condensation control does not apply: the surface stays above the dew point bare"

    def margin(self, problem, result, thickness_m):
        if result.dew_point_c is None:
            raise InputError("--rh", "condensation control needs the relative humidity of the air")
        return result.surface_temp_c - (result.dew_point_c + self.margin_k)

    def describe(self, units="si"):
        return f"surface at least {_q(self.margin_k, 'temperature_difference', units)} above the dew point"

    def state(self, problem, result, index):
        ts, u = float(np.ravel(result.surface_temp_c)[index]), self.units
        dew = float(np.ravel(np.broadcast_to(result.dew_point_c, result.shape))[index])
        return (f"surface {_in(u, ts, 'temperature', f'{ts:.1f} °C')}, "
                f"{_in(u, ts - dew, 'temperature_difference', f'{ts - dew:.1f} K')} above the dew point "
                f"{_in(u, dew, 'temperature', f'{dew:.1f} °C')}")

    def miss(self, margin, thickness_m):
        u, m = self.units, self.margin_k
        text = (f"condensation control cannot be met: with "
                f"{_in(u, thickness_m, 'thickness', f'{thickness_m * 1000:.0f} mm')} the surface is still "
                f"{_in(u, -margin, 'temperature_difference', f'{-margin:.2f} K')} below the dew point plus "
                f"{_in(u, m, 'temperature_difference', f'{m:g} K')}")
        if self.cold_sky:
            text += ("; surroundings colder than the air cool an insulated surface by radiation, so more "
                     "insulation does not help: a low-emittance jacket or a cover over the line may")
        return text


def layer_face_margins(result) -> list[tuple[object, np.ndarray, np.ndarray]]:
    """Per layer of a solved result: (material, hot-face margin, cold-face margin) [K].

    The hot-face margin is the material's ``max_temp_c`` less the warmer face, the cold-face
    margin the colder face less its ``min_temp_c``; both ≥ 0 where the layer serves.
    """
    temps = result.interface_temps_c
    out = []
    for j, layer in enumerate(result.inputs["layers"]):
        hot = np.maximum(temps[j + 1], temps[j + 2])
        cold = np.minimum(temps[j + 1], temps[j + 2])
        out.append((layer.material, layer.material.max_temp_c - hot, cold - layer.material.min_temp_c))
    return out


@dataclass
class ServiceLimits(Criterion):
    """Every layer's faces inside its material's service range (``min_temp_c`` to
    ``max_temp_c`` of ``tables/insulation_materials.csv``); always on.

    Unlike the other criteria it cannot be met by more of the sized layer (its hot face
    warms as it thickens), so it is checked on the selected build-up, and
    :func:`pipeins.selection.select` meets it with an inner layer of a material that can
    serve.  The margin is the least of every layer's face margins [K].
    """

    key = "service_limit"
    label = "service temperature"

    def margin(self, problem, result, thickness_m):
        margins = [np.minimum(hot, cold) for _, hot, cold in layer_face_margins(result)]
        return np.minimum.reduce(margins) if margins else np.full(result.shape, np.inf)

    def describe(self, units="si"):
        return "every layer within its material's service temperature range"

    def _tightest(self, result, index):
        best = None
        for j, (mat, hot, cold) in enumerate(layer_face_margins(result)):
            for side, m in (("hot", hot), ("cold", cold)):
                value = float(np.ravel(np.broadcast_to(m, result.shape))[index])
                if best is None or value < best[0]:
                    best = (value, j, mat, side)
        return best

    def state(self, problem, result, index):
        best = self._tightest(result, index)
        if best is None:
            return "no layer"
        value, j, mat, side = best
        limit = mat.max_temp_c if side == "hot" else mat.min_temp_c
        face = limit - value if side == "hot" else limit + value
        where = ("above" if value < 0 else "below") if side == "hot" else ("below" if value < 0 else "above")
        u = self.units
        return (f"layer {j + 1} ({mat.name}) {side} face {_in(u, face, 'temperature', f'{face:.1f} °C')}, "
                f"{_in(u, abs(value), 'temperature_difference', f'{abs(value):.1f} K')} {where} its "
                f"{_in(u, limit, 'temperature', f'{limit:g} °C')} limit")

    def miss(self, margin, thickness_m):
        return (f"service temperature cannot be met: a layer is "
                f"{_in(self.units, -margin, 'temperature_difference', f'{-margin:.1f} K')} beyond its material's limit")


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
            bare = np.abs(problem.bare().heat_flow_w_per_m)
            caps.append((1 - self.min_reduction) * np.broadcast_to(bare, (problem.n_sizes, 1)))
        return np.minimum.reduce(caps)

    def margin(self, problem, result, thickness_m):
        cap = self.cap(problem)
        return (cap - np.abs(result.heat_flow_w_per_m)) / cap  # relative margin

    def describe(self, units="si"):
        parts = []
        if self.max_w_per_m is not None:
            parts.append(f"|heat flow| at most {_q(self.max_w_per_m, 'heat_flow_per_length', units)}")
        if self.min_reduction is not None:
            parts.append(f"at least {100 * self.min_reduction:g} % below the bare line")
        return " and ".join(parts)

    def state(self, problem, result, index):
        q = abs(float(np.ravel(result.heat_flow_w_per_m)[index]))
        cap = float(np.ravel(np.broadcast_to(self.cap(problem), result.shape))[index])
        u = self.units
        return (f"|heat flow| {_in(u, q, 'heat_flow_per_length', f'{q:.1f} W/m')}, {100 * (cap - q) / cap:.0f} % "
                f"under the cap of {_in(u, cap, 'heat_flow_per_length', f'{cap:.1f} W/m')}")

    def miss(self, margin, thickness_m):
        return (f"heat-flow cap cannot be met: with "
                f"{_in(self.units, thickness_m, 'thickness', f'{thickness_m * 1000:.0f} mm')} the heat flow is still "
                f"{-100 * margin:.1f} % above the cap")


@dataclass
class CriterionOutcome:
    """The continuous least thickness per size for one criterion (nan where infeasible)."""

    key: str
    label: str
    description: str
    required_m: np.ndarray
    feasible: np.ndarray
    messages: list[str]
    commercial_m: np.ndarray | None = None
    source: str = ""


@dataclass
class SizingOutcome:
    """Per size: each criterion's continuous thickness, the selected commercial
    thickness (single layer or two layers), the governing criterion and the solved line
    at the selected thickness."""

    criteria: list[CriterionOutcome]
    series_m: tuple[float, ...]
    selected_m: np.ndarray
    layer_split_m: list[tuple[float, ...]]
    governing: list[str | None]
    feasible: np.ndarray
    result: object
    messages: list[list[str]]
    #: Notes of criteria dropped because no thickness fails them (see ``Criterion.not_applicable``).
    not_applicable: list[str] = field(default_factory=list)
    #: The criteria that took part in the choice.
    active: list = field(default_factory=list)

    def required_thickness_mm(self, index: int = 0) -> dict:
        out = {}
        for c in self.criteria:
            value = c.required_m[index]
            out[c.key] = None if not np.isfinite(value) else round(float(value) * 1000, 2)
        return out


def _least_passing(passes, totals):
    """Per row, the least total from which on every larger one passes (nan if none)."""
    fail = ~passes
    last = np.where(fail.any(axis=1), totals.size - 1 - np.argmax(fail[:, ::-1], axis=1), -1)
    ok = last < totals.size - 1
    return np.where(ok, totals[np.clip(last + 1, 0, totals.size - 1)], np.nan)


def _margins(criteria, problem, thickness):
    result = problem.solve(thickness)
    return [np.asarray(c.margin(problem, result, thickness), dtype=float) for c in criteria], result


def _continuous(criterion, problem, grid, margin_on_grid):
    """Least thickness from which on every thicker grid point passes, refined to 0.01 mm."""
    n = problem.n_sizes
    fails = margin_on_grid < 0
    any_fail = fails.any(axis=1)
    last_fail = np.where(any_fail, grid.size - 1 - np.argmax(fails[:, ::-1], axis=1), -1)
    feasible = last_fail < grid.size - 1
    required = np.zeros(n)
    todo = any_fail & feasible
    lo = np.where(todo, grid[np.clip(last_fail, 0, grid.size - 1)], 0.0)
    hi = np.where(todo, grid[np.clip(last_fail + 1, 0, grid.size - 1)], 0.0)
    while np.any(todo & (hi - lo > SEARCH_TOLERANCE_M)):
        mid = 0.5 * (lo + hi)
        t = np.where(todo, mid, hi)[:, None]
        margin = np.asarray(criterion.margin(problem, problem.solve(t), t), dtype=float)[:, 0]
        passed = margin >= 0
        hi = np.where(todo & passed, mid, hi)
        lo = np.where(todo & ~passed, mid, lo)
    required = np.where(todo, hi, required)
    required = np.where(feasible, required, np.nan)
    messages = ["" if feasible[i] else criterion.miss(float(margin_on_grid[i, -1]), float(grid[-1]))
                for i in range(n)]
    return CriterionOutcome(criterion.key, criterion.label, criterion.describe(criterion.units), required, feasible, messages)


def size(problem: SizingProblem, criteria: Sequence[Criterion], series_m: Sequence[float],
         max_layers: int = 2, extra_required: Sequence[CriterionOutcome] = ()) -> SizingOutcome:
    """Size the outer layer for every criterion and pick the commercial thickness.

    *extra_required* carries criteria whose thickness comes from elsewhere (a code table,
    an economic optimum): they take part in the choice of the commercial thickness as
    a lower bound.
    """
    if not criteria and not extra_required:
        raise InputError("touch_limit_c", "no sizing criterion is active; give at least one of "
                         "touch_limit_c, rh_percent (condensation), max_heat_flow_w_per_m or min_reduction")
    series = np.array(sorted(set(float(s) for s in series_m)))
    if series.size == 0 or np.any(series <= 0):
        raise InputError("--series", "the thickness series needs at least one thickness above zero")
    n = problem.n_sizes
    thickest = series[-1] * max_layers
    grid = np.unique(np.concatenate([_GRID[_GRID < thickest], [thickest]]))
    margins, _ = _margins(criteria, problem, np.broadcast_to(grid, (n, grid.size)))
    dropped = [bool(c.not_applicable) and bool(np.all(m >= 0)) for c, m in zip(criteria, margins)]
    not_applicable = [c.not_applicable for c, d in zip(criteria, dropped) if d]
    if all(dropped) and not extra_required:
        from .criteria import no_criterion_message

        raise InputError("touch_limit_c", no_criterion_message(not_applicable, rh_given=True))
    margins = [m for m, d in zip(margins, dropped) if not d]
    criteria = [c for c, d in zip(criteria, dropped) if not d]
    outcomes = [_continuous(c, problem, grid, m) for c, m in zip(criteria, margins)]
    outcomes += list(extra_required)

    # Commercial: single layers of the series, then sums of two (same material, so a
    # two-layer build-up conducts like one layer of the sum).
    if max_layers >= 2:
        # Per total, the most even pair (joints staggered in two similar layers is the usual practice).
        best = {}
        for a in series:
            for b in series[series <= a]:
                total = round(float(a + b), 9)
                if total > series[-1] and (total not in best or a - b < best[total][0] - best[total][1]):
                    best[total] = (float(a), float(b))
        options = [(float(t),) for t in series] + list(best.values())
    else:
        options = [(t,) for t in series]
    option_totals = np.array([round(sum(o), 9) for o in options])
    order = np.argsort(option_totals, kind="stable")
    options = [options[i] for i in order]
    option_totals = option_totals[order]
    option_margins, _ = _margins(criteria, problem, np.broadcast_to(option_totals, (n, option_totals.size)))
    passes = np.ones((n, option_totals.size), dtype=bool)
    for outcome, m in zip(outcomes, option_margins):
        outcome.commercial_m = _least_passing(m >= 0, option_totals)
        passes &= m >= 0
    for extra in extra_required:  # a requirement that does not apply (nan) sets no bound
        need = np.where(np.isfinite(extra.required_m), extra.required_m, 0.0)
        ok = option_totals[None, :] >= need[:, None] - 1e-9
        extra.commercial_m = _least_passing(ok, option_totals)
        passes &= ok
    # least option from which on every thicker one passes
    fail_any = ~passes
    last_fail = np.where(fail_any.any(axis=1),
                         option_totals.size - 1 - np.argmax(fail_any[:, ::-1], axis=1), -1)
    feasible = last_fail < option_totals.size - 1
    pick = np.clip(last_fail + 1, 0, option_totals.size - 1)
    selected = np.where(feasible, option_totals[pick], np.nan)
    split = [options[pick[i]] if feasible[i] else () for i in range(n)]

    governing, messages = [], []
    for i in range(n):
        req = [(o.required_m[i], o.key) for o in outcomes if np.isfinite(o.required_m[i])]
        governing.append(max(req)[1] if req and feasible[i] else None)
        msgs = [o.messages[i] for o in outcomes if o.messages[i]]
        if not feasible[i] and not msgs:
            msgs.append(f"no thickness up to {1000 * option_totals[-1]:.0f} mm meets every criterion")
        messages.append(msgs)
        feasible[i] = feasible[i] and all(o.feasible[i] for o in outcomes)
    shown = np.where(np.isfinite(selected), selected, option_totals[-1])
    result = problem.solve(shown[:, None])
    return SizingOutcome(outcomes, tuple(series), selected, split, governing, feasible, result, messages,
                         not_applicable, list(criteria))
