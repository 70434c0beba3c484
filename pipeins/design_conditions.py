"""Several design conditions on one line: each criterion checked where it belongs, the largest
requirement governing.

A service or line of a project file may name several conditions (``conditions = ["summer",
"winter"]``).  Each criterion of the service is checked under the conditions it belongs to
(:func:`criteria_under`):

- a condition table that says ``criteria_here = [...]`` takes exactly those criteria;
- otherwise condensation belongs to a condition that gives a relative humidity (the dew point
  needs one), freeze protection to a condition whose air is below 0 °C (water does not freeze
  in warmer air), and touch safety, the heat-flow cap, the temperature change, the code minimum
  and the economic thickness to every condition (the worst of them governs, which is the safe
  side for a cap and a burn limit).

A lone condition carries every criterion of its service, as before.  :func:`select_over_conditions`
sizes the sizes once per condition with :func:`pipeins.selection.select` (vectorised over the
sizes) and combines: per criterion the largest required thickness and the condition that asks
for it, and as the pick the thickest commercial pick of the conditions (each condition's pick is
the least thickness of the series from which on every thicker one meets its criteria, so the
thickest meets them all).  The governing condition is the one whose pick that is (on a tie, the
one whose governing requirement is largest) and the governing criterion its governing criterion.
"""

from __future__ import annotations

from dataclasses import dataclass, field, replace

import numpy as np

__all__ = ["criteria_under", "ConditionsSelection", "select_over_conditions", "FREEZE_AIR_C", "CommandCondition",
           "governing_selection"]

#: Air temperature [°C] below which a condition takes the freeze criterion by default (0 °C,
#: the freezing point of water at atmospheric pressure).
FREEZE_AIR_C = 0.0


@dataclass(frozen=True)
class CommandCondition:
    """A design condition given on the command line (``--condition``): what
    :func:`criteria_under` reads of a project's :class:`pipeins.project.Condition` (name, air
    [°C], relative humidity [%] or None, wind [m/s], the criteria it takes or None) and its
    settings as written (option destination → text)."""

    name: str
    air_temp_c: float
    rh_percent: float | None = None
    wind_m_s: float = 0.0
    criteria_here: tuple | None = None
    settings: dict = field(default_factory=dict)


def criteria_under(condition, criteria) -> tuple[str, ...]:
    """The criteria of *criteria* (project-file names) checked under *condition*
    (a :class:`pipeins.project.Condition`) when a line has several conditions."""
    own = getattr(condition, "criteria_here", None)
    if own is not None:
        return tuple(c for c in criteria if c in own)
    from .criteria.registry import by_name, resolve

    out = []
    for c in criteria:  # each registered criterion says where it belongs (its ``under``)
        under = resolve(by_name(c).under)
        if under is None or under(condition):
            out.append(c)
    return tuple(out)


def why_unused(condition) -> str:
    """Why *condition* takes none of a service's criteria, in words (for an error)."""
    if getattr(condition, "criteria_here", None) is not None:
        return f"its criteria_here is {list(condition.criteria_here)}"
    return "it takes condensation only with an rh and freezing only with air below 0 °C"


def _requirements(req, under):
    """*req* with only the criteria of *under* on."""
    from .criteria.registry import requirements_for

    return requirements_for(req, under)


@dataclass
class ConditionsSelection:
    """The combined choice over several conditions, per size.

    ``outcome`` has the shape :func:`pipeins.schedule.compute_schedule` reads of a
    :class:`pipeins.sizing.SizingOutcome` (selected thickness, layers, governing criterion,
    feasibility, messages, criteria); ``governing_condition`` names the condition that governs
    each size; ``required_m[key]`` is each criterion's largest continuous requirement [m] per
    size and ``required_under[key]`` the condition asking for it; ``selections`` are the
    per-condition selections by condition name."""

    outcome: object
    governing_condition: list
    required_m: dict
    required_under: dict
    selections: dict
    notes: list = field(default_factory=list)


class _Warnings:
    def __init__(self, warnings):
        self.warnings = list(dict.fromkeys(warnings))


def select_over_conditions(spec_of, conditions, criteria, material, req, series=None, units="si", sizes=None,
                           code=None, economic=None, code_paths=(), skip_unsized=False):
    """Size *sizes* under every condition of *conditions* and combine (see the module docstring).

    Parameters
    ----------
    spec_of : callable
        ``spec_of(condition, with_rh) -> LineSpec`` of the line under a condition.
    conditions : list of pipeins.project.Condition
    criteria : tuple of str
        The service's criteria (project-file names).
    material, req, series, units, sizes, code, economic, code_paths
        As :func:`pipeins.selection.select` (*economic* and *code* apply only under the
        conditions that take them).
    skip_unsized : bool
        True: a condition under which none of its criteria applies to the line (a cold line's
        touch check in winter) is left out with a note; only when every condition is, the
        first one's error is raised.  False (the schedule): that error is raised at once.
    """
    from .errors import InputError
    from .selection import select

    selections, skipped, first_error = {}, [], None
    for cond in conditions:
        under = criteria_under(cond, criteria) if len(conditions) > 1 else tuple(criteria)
        if not under:
            continue
        spec = spec_of(cond, "condensation" in under)
        try:
            selections[cond.name] = select(spec, material, _requirements(req, under), series, units, sizes=sizes,
                                           code=code if "code" in under else None,
                                           economic=economic if "economic" in under else None,
                                           code_paths=code_paths, add_inner_layer=False)
        except InputError as exc:
            if not (skip_unsized and exc.message.startswith("no sizing criterion applies")):
                raise
            first_error = first_error or exc
            skipped.append(f"{cond.name}: {exc.message.split(';')[0]}; nothing is sized under it")
    if not selections:
        if first_error is None:
            raise InputError("conditions", "no condition takes any of the criteria")
        raise first_error
    names = list(selections)
    outs = [selections[c].outcome for c in names]
    n = len(outs[0].selected_m)
    picks = np.array([np.where(o.feasible, o.selected_m, -np.inf) for o in outs])   # (conditions, sizes)
    feasible = np.all([o.feasible for o in outs], axis=0)
    required_m, required_under = {}, {}
    for j, o in enumerate(outs):
        for c in o.criteria:
            value = np.where(np.isfinite(c.required_m), c.required_m, -np.inf)
            if c.key not in required_m:
                required_m[c.key], required_under[c.key] = value.copy(), [names[j]] * n
                continue
            larger = value > required_m[c.key]
            required_m[c.key] = np.where(larger, value, required_m[c.key])
            required_under[c.key] = [names[j] if b else w for b, w in zip(larger, required_under[c.key])]
    selected, split, governing, gov_cond, messages = np.zeros(n), [], [], [], []
    for i in range(n):
        best = float(np.max(picks[:, i]))
        tied = [j for j in range(len(outs)) if picks[j, i] >= best - 1e-12]
        if not feasible[i]:   # the condition (first listed) under which it cannot be met governs
            tied = [next(j for j, o in enumerate(outs) if not o.feasible[i])]

        def own_requirement(j):
            key = outs[j].governing[i]
            rec = next((c for c in outs[j].criteria if c.key == key), None)
            v = float(rec.required_m[i]) if rec is not None else np.nan
            return v if np.isfinite(v) else -np.inf

        g = max(tied, key=own_requirement)   # max keeps the first listed on a full tie
        selected[i] = outs[g].selected_m[i] if feasible[i] else np.nan
        split.append(tuple(outs[g].layer_split_m[i]))
        governing.append(outs[g].governing[i])
        gov_cond.append(names[g])
        msgs = []
        for j, o in enumerate(outs):
            msgs += [f"{names[j]}: {m}" if len(outs) > 1 else m for m in o.messages[i] if not o.feasible[i]]
        messages.append(msgs)
    records = []
    for j, o in enumerate(outs):
        for c in o.criteria:
            records.append(replace(c, description=f"{c.description} (in {names[j]})") if len(outs) > 1 else c)
    first = outs[0]
    outcome = replace(first, criteria=records, selected_m=selected, layer_split_m=split, governing=governing,
                      feasible=feasible, messages=messages,
                      result=_Warnings(w for o in outs for w in o.result.warnings),
                      not_applicable=list(dict.fromkeys(x for o in outs for x in o.not_applicable)),
                      active=[a for o in outs for a in o.active])
    from .notes import with_subject

    notes = list(dict.fromkeys([(with_subject(x, c) if len(outs) > 1 else x) for c in names for x in selections[c].notes]
                               + skipped))
    required_m = {k: np.where(np.isfinite(v), v, np.nan) for k, v in required_m.items()}
    return ConditionsSelection(outcome, gov_cond, required_m, required_under, selections, notes)


def governing_selection(combined: ConditionsSelection, index: int = 0):
    """The :class:`pipeins.selection.Selection` of the condition that governs size *index*
    (its pick is the combined pick, so its check is the check at the selected thickness)."""
    return combined.selections[combined.governing_condition[index]]
