"""Select the insulation thickness of a line, or of every size of a service.

Glue between a :class:`~pipeins.line.LineSpec`, the sizing requirements and the search:
builds the (vectorised) sizing problem, the criteria and the series, runs
:func:`pipeins.sizing.size`, and returns everything a report needs.

>>> from pipeins.line import LineSpec
>>> from pipeins.criteria import Requirements
>>> spec = LineSpec(pipe="NPS 4", fluid_temp_c=180.0, air_temp_c=25.0)
>>> sel = select(spec, "mineral wool", Requirements())
>>> sel.outcome.governing[0], float(sel.outcome.selected_m[0])
('surface_temp', 0.02)
"""

from __future__ import annotations

from dataclasses import dataclass, field, replace

import numpy as np

from .criteria.code import DN_TO_NPS, code_outcome, nominal_keys  # noqa: F401  (where they were)
from .criteria.registry import Selecting
from .errors import InputError
from .sizing import SizingOutcome, SizingProblem, size

__all__ = ["Selection", "select", "series_for"]


@dataclass
class Selection:
    spec: object
    sizes: list
    material: object
    series_name: str
    problem: SizingProblem
    criteria: list
    outcome: SizingOutcome
    notes: list[str] = field(default_factory=list)
    #: (material, thickness per size [m]) of an inner layer added so that the sized material
    #: stays inside its service range (0 where a size needs none), or None.
    inner_layer: tuple | None = None

    def added_layers(self, index: int = 0) -> tuple[tuple[str, float], ...]:
        """The layers the selection adds over the line's own, inner to outer, for size *index*:
        ``((material name, thickness [m]), ...)`` (the sized layer at its selected total; none
        where the pick is the bare line)."""
        out = []
        if self.inner_layer is not None and self.inner_layer[1][index] > 0:
            out.append((self.inner_layer[0].key, float(self.inner_layer[1][index])))
        thickness = float(self.outcome.selected_m[index])
        return tuple(out) + (((self.material.key, thickness),) if thickness > 0 else ())

    def interface_temp_c(self, index: int = 0) -> float:
        """Temperature [°C] at the sized layer's inner face (the interface over the layers
        under it) at the selected build-up of size *index*."""
        temps = self.outcome.result.interface_temps_c[len(self.problem.fixed_layers) + 1]
        return float(np.ravel(np.broadcast_to(temps, self.outcome.result.shape))[index])


def series_for(material, series: str | tuple | None, units: str = "si",
               section_kind: str = "pipe") -> tuple[str, tuple[float, ...]]:
    """(name, thicknesses in m) of the series to pick from: a name, an explicit tuple of
    thicknesses [m], or the material family's default series in the unit system (on a duct,
    the duct series: :func:`pipeins.catalog.series.default_series`)."""
    from .catalog.series import default_series, thickness_series_m

    if series is None:
        family = material.family if material.family != "generic" else "pipe_section"
        name = default_series(family, units, section_kind)
        return name, thickness_series_m(name)
    if isinstance(series, str):
        return series, thickness_series_m(series)
    values = tuple(sorted(float(x) for x in series))
    if not values or any(v <= 0 for v in values):
        raise InputError("--series", "the thickness series needs at least one thickness above zero")
    return "given list", values


def select(spec, material_name: str, req, series=None, units: str = "si", sizes=None,
           code: str | None = None, economic=None, code_paths=(), inner_material: str | None = None,
           add_inner_layer: bool = True, soil: tuple | None = None) -> Selection:
    """Size the outer layer of *material_name* over the line's fixed layers.

    *code* names a rule set of :mod:`pipeins.codes` whose minimum thickness joins the
    criteria; *economic* (an :class:`pipeins.annual.EnergyBasis` with a cost table) adds the
    economic thickness.  Both act as lower bounds on the commercial pick.

    Every layer must stay inside its material's service range (always on, see
    :class:`pipeins.sizing.ServiceLimits`).  Where the sized material cannot, an inner layer
    of *inner_material* (default: the first of :data:`INNER_LAYER_CHOICES` rated for the
    fluid temperature) is added under it, per size, and the outcome says so (with
    ``add_inner_layer=False``, or where nothing helps, the size is infeasible with a message
    naming the materials rated for the line).

    *soil*, for a buried line (*spec* in the ground, :func:`pipeins.buried.ground_spec`): (depth of
    the pipe centre [m], soil conductivity [W/(m·K)]); every trial build-up is solved with the
    soil's coefficient at its own outer diameter (:attr:`pipeins.sizing.SizingProblem.soil`).
    """
    from .catalog.materials import lookup_material
    from .criteria import build_criteria

    material = lookup_material(material_name, option="--material")
    name, series_m = series_for(material, series, units, spec.section_kind)
    pipe, fixed, fluid, surroundings, surface = spec.build_model(sizes, insulated=True)
    n = 1 if sizes is None else len(sizes)
    if sizes is None and hasattr(pipe, "kind"):  # a duct, face or vessel: its scalars broadcast
        if fluid.film_coefficient_w_m2k is not None:
            fluid = replace(fluid, film_coefficient_w_m2k=np.reshape(fluid.film_coefficient_w_m2k, (1, 1)))
    elif sizes is None:  # one size: give it the (n, 1) shape of a table row
        pipe = replace(pipe, outer_diameter_m=np.reshape(pipe.outer_diameter_m, (1, 1)),
                       wall_m=np.reshape(pipe.wall_m, (1, 1)))
        if fluid.film_coefficient_w_m2k is not None:
            fluid = replace(fluid, film_coefficient_w_m2k=np.reshape(fluid.film_coefficient_w_m2k, (1, 1)))
    criteria, notes = build_criteria(spec, req, fluid.temp_c, surroundings.air_temp_c, surface.surface_kind,
                                     units)
    for criterion in criteria:  # the unit system of their sentences
        criterion.units = units
    limit = next((c.limit_c for c in criteria if c.key == "surface_temp"), spec.touch_limit_c)
    problem = SizingProblem(pipe, fixed, material, fluid, surroundings, surface, limit, n, soil=soil)
    size_list = sizes or [spec.pipe_size()]
    ctx = Selecting(spec, req, problem, material, size_list, code, tuple(code_paths), economic, {}, units)
    extra = _required_outcomes(ctx)
    if not criteria and not extra:
        from .criteria import no_criterion_message

        raise InputError("touch_limit_c", no_criterion_message(notes, spec.rh_percent is not None))
    outcome = size(problem, criteria, series_m, extra_required=extra)
    notes = notes + [n for n in outcome.not_applicable if n not in notes]
    problem, outcome, inner = _within_service_limits(problem, outcome, criteria, series_m, extra, units, ctx,
                                                     inner_material, notes, add_inner_layer)
    selection = Selection(spec, size_list, material, name, problem, outcome.active, outcome, notes, inner)
    selection.economic_curves = ctx.extras.get("economic_curves")
    return selection


def _required_outcomes(ctx, only_per_build_up: bool = False) -> list:
    """The outcomes of the registered criteria whose thickness comes from elsewhere (code
    minimum, economic thickness) that the selection *ctx* asks for, in registry order; with
    *only_per_build_up*, only those that depend on the build-up under the sized layer."""
    from .criteria.registry import records, resolve

    out = []
    for record in records():
        if record.required is None or (only_per_build_up and not record.per_build_up):
            continue
        if record.asked(ctx.given(), ctx.req):
            record.check_kind(ctx.kind)
        outcome = resolve(record.required)(ctx)
        if outcome is not None:
            out.append(outcome)
    return out


#: Inner layers tried, in order, when the sized material cannot serve at the fluid temperature
#: (common practice: a mineral-fibre or rigid high-temperature section under a foam, cellular glass
#: under a foam on cryogenic lines).
INNER_LAYER_CHOICES = ("mineral wool", "calcium silicate", "cellular glass", "expanded perlite")


def materials_rated_for(low_c: float, high_c: float) -> list:
    """Catalogue insulation materials whose service range covers *low_c* to *high_c* [°C]."""
    from .catalog.materials import list_materials, lookup_material

    return [lookup_material(m["key"]) for m in list_materials()
            if m["min_temp_c"] <= low_c and m["max_temp_c"] >= high_c]


def _service_failures(problem, outcome):
    """Per size: (index of the first layer beyond its limits or -1, hot-face failure?) at the
    selected build-up."""
    from .sizing import layer_face_margins

    n = problem.n_sizes
    first = np.full(n, -1)
    hot_side = np.zeros(n, dtype=bool)
    for j, (_, hot, cold) in enumerate(layer_face_margins(outcome.result)):
        hot = np.ravel(np.broadcast_to(hot, outcome.result.shape))
        cold = np.ravel(np.broadcast_to(cold, outcome.result.shape))
        bad = (first < 0) & ((hot < 0) | (cold < 0))
        hot_side = np.where(bad, hot < 0, hot_side)
        first = np.where(bad, j, first)
    return first, hot_side


def _within_service_limits(problem, outcome, criteria, series_m, extra, units, ctx, inner_material, notes,
                           add_inner_layer=True):
    """Meet the service limits of every layer (always on): where the sized material runs beyond
    its range at the selected build-up, add an inner layer of a material that can serve, the
    least thickness of its series that brings the sized layer's face inside its range (sized
    again over it), per size.  Returns (problem, outcome, inner layer or None); the
    outcome gains the ``service_limit`` criterion.  Outcomes that depend on the build-up
    (``per_build_up`` in the registry) are computed again over the inner layer."""
    from .catalog.materials import lookup_material
    from .model import Layer
    from .sizing import CriterionOutcome, ServiceLimits, size
    from .units import format_quantity as fq

    n, material = problem.n_sizes, problem.material
    sized_index = len(problem.fixed_layers)
    first, _ = _service_failures(problem, outcome)
    fluid = np.asarray(problem.fluid.temp_c, dtype=float)
    low, high = float(np.min(fluid)), float(np.max(fluid))
    inner, inner_m = None, np.zeros(n)
    if add_inner_layer and np.any(first == sized_index):
        if inner_material is not None:
            candidates = [lookup_material(inner_material, option="inner_material")]
        else:
            candidates = [lookup_material(name) for name in INNER_LAYER_CHOICES]
        candidates = [m for m in candidates if m.min_temp_c <= low and m.max_temp_c >= high and m.key != material.key]
        if candidates:
            inner = candidates[0]
            _, inner_series = series_for(inner, None, units)
            base = list(problem.fixed_layers)
            need = first == sized_index
            for t in inner_series:
                inner_m = np.where(need, t, inner_m)
                thick = np.where(inner_m > 0, inner_m, 1e-9)[:, None]
                trial = replace(problem, fixed_layers=base + [Layer(inner, thick)], context={})
                # the outcomes that depend on the build-up, again over the inner layer
                again = _required_outcomes(replace(ctx, problem=trial), only_per_build_up=True)
                keys = {e.key for e in again}
                trial_extra = [e for e in extra if e.key not in keys] + again
                problem, outcome = trial, size(trial, criteria, series_m, extra_required=trial_extra)
                first, _ = _service_failures(problem, outcome)
                need = first == sized_index + 1
                if not need.any():
                    break
            sized_index += 1
    # the always-on criterion, judged on the selected build-up
    service = ServiceLimits()
    service.units = units
    margin = np.ravel(np.broadcast_to(service.margin(problem, outcome.result, None), outcome.result.shape))
    ok = margin >= 0
    messages = []
    materials = [layer.material for layer in problem.fixed_layers] + [material]
    for i in range(n):
        if ok[i]:
            messages.append("")
            continue
        j = int(first[i]) if first[i] >= 0 else sized_index
        rated = [m.name for m in materials_rated_for(low, high)]
        state = service.state(problem, outcome.result, i)
        text = f"service temperature cannot be met: {state}"
        if j == sized_index and inner is not None:
            text += f", even over {fq(inner_m[i], 'thickness', units)} of {inner.name} inside"
        elif j != sized_index:
            text += "; that layer is given, not sized"
        text += (f"; rated for {fq(low, 'temperature', units)}"
                 + (f" to {fq(high, 'temperature', units)}" if high != low else "") + ": "
                 + (", ".join(rated) if rated else "no catalogue material"))
        messages.append(text)
    # no thickness of the sized layer: the inner layer's is reported with the selection
    record = CriterionOutcome(service.key, service.label, service.describe(units), np.full(n, np.nan), ok, messages)
    outcome.criteria.append(record)
    outcome.active = list(outcome.active) + [service]
    outcome.feasible = outcome.feasible & ok
    for i in range(n):
        if messages[i] and messages[i] not in outcome.messages[i]:
            outcome.messages[i].append(messages[i])
    if inner is not None and np.any(inner_m > 0):
        used = inner_m[inner_m > 0]
        from .notes import note

        common = dict(material=material.name, inner=inner.name, low_c=(material.min_temp_c, "temperature"),
                      high_c=(material.max_temp_c, "temperature"))
        thin, thick = float(np.min(used)), float(np.max(used))
        notes.append(note("selection.inner_layer", **common, thickness_m=(thin, "thickness")) if thin == thick else
                     note("selection.inner_layer.span", **common, thinnest_m=(thin, "thickness"),
                          thickest_m=(thick, "thickness")))
    return problem, outcome, (inner, inner_m) if inner is not None and np.any(inner_m > 0) else None
