"""Sizing: the least thickness of the outermost layer that meets each criterion.

A criterion is a small object whose :meth:`Criterion.margin` says, for solved cases, by
how much each passes (>= 0) or fails (< 0), in its own unit.  The search is shared:

* **Continuous**: the least thickness from which on every thicker layer passes.  All
  sizes are solved together on a geometric grid of thicknesses (plus the bare pipe);
  the thickest failing grid point and the next one bracket the answer, which bisection
  narrows to 0.01 mm.  Because the grid is scanned from the thick end, a rising branch
  below the critical radius (where heat flow first grows with thickness) never passes
  for the answer.  A criterion that fails at the thickest but passes thinner is met on an
  interval: from its least thickness (0 when the bare line passes) up to a greatest
  (``CriterionOutcome.most_m``), as condensation control under a sky colder than the air,
  where radiation pulls an insulated surface below the air temperature.  The brackets of
  every criterion and size are bisected together, one solve per step.
* **Commercial**: the least thickness of a series that passes every criterion, from which
  on every thicker one passes the lower bounds, and inside every interval; beyond the
  thickest single layer of the series, two layers whose sum passes.  Where an interval
  bounds the choice, the bare line is a candidate too, and the outcome states the bound;
  where another criterion needs more than it allows, the size cannot be met and the
  message says by how much.

The sized layer is the outermost; fixed inner layers stay as given.
"""

from __future__ import annotations

from dataclasses import dataclass, field
from typing import Sequence

import numpy as np

from .criteria import DEFAULT_DEW_MARGIN_K
from .criteria.base import Criterion, _in, _q, _thick  # noqa: F401  (the criteria's text helpers, as before)
from .criteria.condensation import Condensation
from .criteria.heat_flow import HeatFlowCap
from .criteria.service import ServiceLimits, layer_face_margins  # noqa: F401
from .criteria.touch import TouchSafety
from .errors import InputError
from .model import Layer
from .solve import solve

__all__ = ["Criterion", "TouchSafety", "Condensation", "HeatFlowCap", "ServiceLimits", "SizingProblem",
           "CriterionOutcome", "SizingOutcome", "size", "DEFAULT_DEW_MARGIN_K",
           "SEARCH_TOLERANCE_M"]

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
    #: A buried line: (depth of the pipe centre [m], soil conductivity [W/(m·K)]); the surroundings
    #: are then the ground surface and the outer coefficient the soil's at each build-up's outer
    #: diameter (:func:`pipeins.buried.soil_coefficient_w_m2k`).  None: in air.
    soil: tuple | None = None

    def surface_for(self, layers):
        """The outer surface of the build-up *layers*: the problem's own, or for a buried line
        the soil as a fixed coefficient at the build-up's outer diameter (per case)."""
        if self.soil is None:
            return self.surface
        from dataclasses import replace

        from .buried import soil_coefficient_w_m2k

        total = sum((np.asarray(layer.installed_thickness_m, dtype=float) for layer in layers), np.zeros(()))
        diameter = np.asarray(self.pipe.outer_diameter_m, dtype=float) + 2.0 * total
        return replace(self.surface, fixed_coefficient_w_m2k=soil_coefficient_w_m2k(self.soil[0], diameter, self.soil[1],
                                                                                     clamp=True))

    def solve(self, thickness_m, night: bool = False):
        """Solve with the outer layer at *thickness_m* (shape (n, k) or broadcastable);
        a zero thickness means the layer is absent (sized layer only).  *night*: without
        the sun (condensation is judged at night)."""
        t = np.asarray(thickness_m, dtype=float)
        t = np.broadcast_to(t, np.broadcast_shapes(t.shape, (self.n_sizes, 1)))
        bare = t <= 0
        layers = list(self.fixed_layers) + [Layer(self.material, np.where(bare, 1e-9, t))]
        surroundings = self.surroundings.without_sun() if night else self.surroundings
        return solve(self.pipe, layers, self.fluid, surroundings, self.surface_for(layers),
                     touch_limit_c=self.touch_limit_c)

    @property
    def sunny(self) -> bool:
        return getattr(self.surroundings, "solar_irradiance_w_m2", None) is not None

    def bare(self):
        """The bare line (:func:`pipeins.bare.solve_bare`: no layers, the pipe's own
        surface), cached: shape (n, 1)."""
        if "bare" not in self.context:
            from .bare import solve_bare

            self.context["bare"] = solve_bare(self.pipe, self.fluid, self.surroundings, self.surface_for([]),
                                              touch_limit_c=self.touch_limit_c)
        return self.context["bare"]


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
    #: The greatest thickness at which the criterion still holds, where it is met only up to a
    #: thickness (a surface under a sky colder than the air); inf where thicker always passes.
    most_m: np.ndarray | None = None


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
    """Every criterion's margin at *thickness* (n, k), and the solved line.  Where the sized
    layer is the only one, a zero thickness is judged on the bare line itself (the pipe's own
    surface, :meth:`SizingProblem.bare`), as every command means by bare."""
    result = problem.solve(thickness)
    out = [np.asarray(c.margin(problem, result, thickness), dtype=float) for c in criteria]
    zero = np.broadcast_to(np.asarray(thickness) <= 0, result.shape)
    if not problem.fixed_layers and zero.any():
        bare = problem.bare()
        for j, c in enumerate(criteria):
            if not getattr(c, "own_solve", False):
                at_bare = np.broadcast_to(np.asarray(c.margin(problem, bare, np.zeros((problem.n_sizes, 1))),
                                                     dtype=float), result.shape)
                out[j] = np.where(zero, at_bare, np.broadcast_to(out[j], result.shape))
    return out, result


def _brackets(passes, grid):
    """Per row of one criterion's pass/fail on the grid: which kind of answer it has and the
    grid brackets that the bisection narrows.

    * lower bound (the thickest point passes): the least thickness from which on every
      thicker point passes; bracket = the thickest failing point and the next one;
    * interval (the thickest fails, some point passes, as under a sky colder than the air,
      where insulation cools the surface): the first run of passing points from the thin
      side, from its least thickness (0 when bare passes) up to its greatest.
    """
    n, k = passes.shape
    fails = ~passes
    any_fail = fails.any(axis=1)
    last_fail = np.where(any_fail, k - 1 - np.argmax(fails[:, ::-1], axis=1), -1)
    lower = last_fail < k - 1                       # the thick end passes
    interval = ~lower & passes.any(axis=1)
    first_pass = np.argmax(passes, axis=1)
    after = fails & (np.arange(k)[None, :] >= first_pass[:, None])
    run_end = np.argmax(after, axis=1) - 1          # last passing point of the first run
    low_todo = (lower & any_fail) | (interval & (first_pass > 0))
    low_fail_i = np.where(lower, last_fail, first_pass - 1)
    low_lo = np.where(low_todo, grid[np.clip(low_fail_i, 0, k - 1)], 0.0)
    low_hi = np.where(low_todo, grid[np.clip(low_fail_i + 1, 0, k - 1)], 0.0)
    up_lo = np.where(interval, grid[np.clip(run_end, 0, k - 1)], 0.0)       # passes
    up_hi = np.where(interval, grid[np.clip(run_end + 1, 0, k - 1)], 0.0)   # fails
    return lower, interval, low_todo, low_lo, low_hi, up_lo, up_hi


def _continuous(criteria, problem, grid, margins_on_grid):
    """Every criterion's continuous answer for every size, in one bracketed search.

    The brackets of all criteria (least thickness and, where a criterion is met only up to
    a thickness, its greatest) are bisected together to 0.01 mm: one solve of the line per
    step over all of them (criteria that march or integrate over their own thickness get
    theirs alone).  Each criterion keeps bisecting while any of its own brackets is wider
    than the tolerance, so its answers do not depend on the other criteria asked for.
    """
    n, c = problem.n_sizes, len(criteria)
    if c == 0:
        return []
    kinds = [_brackets(m >= 0, grid) for m in margins_on_grid]
    lo = np.stack([np.stack([k[3], k[5]], axis=1) for k in kinds], axis=1)   # (n, c, 2)
    hi = np.stack([np.stack([k[4], k[6]], axis=1) for k in kinds], axis=1)
    todo = np.stack([np.stack([k[2], k[1]], axis=1) for k in kinds], axis=1)
    # the edge of a lower bound fails below and passes above; the top of an interval passes
    # below and fails above
    pass_is_hi = np.zeros((n, c, 2), dtype=bool)
    pass_is_hi[:, :, 0] = True
    # bisection groups: per criterion, its lower-bound rows, and its interval rows
    lower = np.stack([k[0] for k in kinds], axis=1)                          # (n, c)
    group_new = np.broadcast_to(~lower[:, :, None], (n, c, 2))
    own = [bool(getattr(cr, "own_solve", False)) for cr in criteria]
    while True:
        wide = todo & (hi - lo > SEARCH_TOLERANCE_M)
        active_old = (wide & ~group_new).reshape(n, c * 2).any(axis=0).reshape(c, 2).any(axis=1)
        active_new = (wide & group_new).reshape(n, c * 2).any(axis=0).reshape(c, 2).any(axis=1)
        if not (active_old.any() or active_new.any()):
            break
        mid = 0.5 * (lo + hi)
        t = np.where(todo, mid, hi)                                          # (n, c, 2)
        shared = [j for j in range(c) if not own[j] and (active_old[j] or active_new[j])]
        result = problem.solve(t[:, shared].reshape(n, -1)) if shared else None
        passed = np.zeros((n, c, 2), dtype=bool)
        for j, crit in enumerate(criteria):
            if not (active_old[j] or active_new[j]):
                continue
            if own[j]:
                m = crit.margin(problem, None, t[:, j])
            else:
                pos = shared.index(j)
                flat = t[:, shared].reshape(n, -1)
                m = np.asarray(crit.margin(problem, result, flat), dtype=float)
                m = np.broadcast_to(m, flat.shape)[:, 2 * pos:2 * pos + 2]
            passed[:, j] = np.asarray(m, dtype=float) >= 0
        active = np.stack([np.where(~group_new[:, j, 0], active_old[j], active_new[j]) for j in range(c)], axis=1)
        step = todo & active[:, :, None]
        to_hi = passed == pass_is_hi        # the midpoint is on the hi side of the edge
        hi = np.where(step & to_hi, mid, hi)
        lo = np.where(step & ~to_hi, mid, lo)
    outcomes = []
    for j, crit in enumerate(criteria):
        low_kind, interval = kinds[j][0], kinds[j][1]
        feasible = low_kind | interval
        required = np.where(todo[:, j, 0], hi[:, j, 0], 0.0)
        required = np.where(feasible, required, np.nan)
        most = np.where(interval, lo[:, j, 1], np.inf)
        messages = ["" if feasible[i] else crit.miss(float(margins_on_grid[j][i, -1]), float(grid[-1]))
                    for i in range(n)]
        out = CriterionOutcome(crit.key, crit.label, crit.describe(crit.units), required, feasible, messages)
        out.most_m = most
        outcomes.append(out)
    return outcomes


def _from_here_on(passes):
    """Per row, True from the least option from which on every larger one passes."""
    return np.flip(np.logical_and.accumulate(np.flip(passes, axis=1), axis=1), axis=1)


def _first(mask, totals):
    """Per row, the least total where *mask* holds (nan if none)."""
    return np.where(mask.any(axis=1), totals[np.argmax(mask, axis=1)], np.nan)


def _bounds(outcomes, criteria, i, feasible, selected_m, option_totals):
    """Say, for size *i*, where a criterion met only up to a thickness bounds the choice: the
    bound itself on a feasible pick, or the conflict with what the other criteria need (set as
    that criterion's message, which makes the size infeasible)."""
    by_key = {c.key: c for c in criteria}
    bounded = [o for o in outcomes if o.most_m is not None and np.isfinite(o.most_m[i]) and o.feasible[i]]
    if not bounded:
        return
    tight = min(bounded, key=lambda o: o.most_m[i])
    crit, most = by_key[tight.key], float(tight.most_m[i])
    needs = [(float(o.required_m[i]), o) for o in outcomes if np.isfinite(o.required_m[i])]
    need_m, need = max(needs, key=lambda x: x[0])
    if feasible:
        tight.messages[i] = crit.bound_text(float(tight.required_m[i]), most, selected_m)
        return
    if need_m > most + SEARCH_TOLERANCE_M:
        tight.messages[i] = crit.conflict_text(most, need_m, need.label)
    else:
        tight.messages[i] = crit.conflict_text(most, need_m, need.label, series_gap=True)
    tight.feasible[i] = False


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
    outcomes = _continuous(criteria, problem, grid, margins)
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
    # Where a criterion is met only up to a thickness, thinner is better, down to the bare line.
    bounded_rows = np.zeros(n, dtype=bool)
    for o in outcomes:
        if o.most_m is not None:
            bounded_rows |= np.isfinite(o.most_m)
    if bounded_rows.any():
        options = [(0.0,)] + options
        option_totals = np.concatenate([[0.0], option_totals])
    option_margins, _ = _margins(criteria, problem, np.broadcast_to(option_totals, (n, option_totals.size)))
    passes = np.ones((n, option_totals.size), dtype=bool)
    if bounded_rows.any():
        passes[:, 0] = bounded_rows
    for outcome, m in zip(outcomes, option_margins):
        mask = _from_here_on(m >= 0)
        if outcome.most_m is not None:
            within = (m >= 0) & (option_totals[None, :] <= outcome.most_m[:, None] + SEARCH_TOLERANCE_M)
            mask = np.where(np.isfinite(outcome.most_m)[:, None], within, mask)
        outcome.commercial_m = _first(mask, option_totals)
        passes &= mask
    for extra in extra_required:  # a requirement that does not apply (nan) sets no bound
        need = np.where(np.isfinite(extra.required_m), extra.required_m, 0.0)
        ok = option_totals[None, :] >= need[:, None] - 1e-9
        extra.commercial_m = _least_passing(ok, option_totals)
        passes &= ok
    feasible = passes.any(axis=1)
    pick = np.argmax(passes, axis=1)
    selected = np.where(feasible, option_totals[pick], np.nan)
    split = [options[pick[i]] if feasible[i] else () for i in range(n)]

    governing, messages = [], []
    for i in range(n):
        req = [(o.required_m[i], o.key) for o in outcomes if np.isfinite(o.required_m[i])]
        governing.append(max(req)[1] if req and feasible[i] else None)
        _bounds(outcomes, criteria, i, feasible[i], float(selected[i]), option_totals)
        msgs = [o.messages[i] for o in outcomes if o.messages[i]]
        if not feasible[i] and not msgs:
            msgs.append(f"no thickness up to {1000 * option_totals[-1]:.0f} mm meets every criterion")
        messages.append(msgs)
        feasible[i] = feasible[i] and all(o.feasible[i] for o in outcomes)
    shown = np.where(np.isfinite(selected), selected, option_totals[-1])
    result = problem.solve(shown[:, None])
    return SizingOutcome(outcomes, tuple(series), selected, split, governing, feasible, result, messages,
                         not_applicable, list(criteria))
