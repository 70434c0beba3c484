"""Heat tracing of a project's lines: the design heat loss a tracer must make up, per line.

A service with ``maintain_temp`` (and optionally ``min_ambient``, ``safety_factor``,
``tracer_output``, the keys of ``check --maintain-temp …``) has its lines solved as
:func:`pipeins.tracing.design_heat_loss` solves one: the fluid still at the maintain
temperature, the air (and radiant surroundings) at the minimum design ambient (default the
location's air), the location's wind, at each line's scheduled insulation; the design heat loss
is that loss times (1 + safety factor) (default 20 %, common practice after IEEE 515 /
IEC/IEEE 60079-30-2, from memory), per metre and over the line's length, compared with the
tracer's output where given.  One solver call per service and location.
"""

from __future__ import annotations

from dataclasses import dataclass, field

import numpy as np

from .notes import with_subject

__all__ = ["TracedLine", "TracingSchedule", "schedule_tracing"]


@dataclass(frozen=True, slots=True)
class TracedLine:
    """One traced line (SI)."""

    tag: str
    service: str
    condition: str
    maintain_temp_c: float
    min_ambient_c: float
    wind_m_s: float
    thickness_m: float
    length_m: float
    heat_loss_w_per_m: float
    safety_factor_percent: float
    design_heat_loss_w_per_m: float
    design_heat_loss_w: float
    surface_temp_c: float
    tracer_output_w_per_m: float | None = None

    @property
    def margin_percent(self) -> float | None:
        """(output − design loss) / design loss × 100 [%] (None without a tracer output)."""
        t = self.tracer_output_w_per_m
        return None if t is None else 100.0 * (t - self.design_heat_loss_w_per_m) / self.design_heat_loss_w_per_m

    @property
    def sufficient(self) -> bool | None:
        t = self.tracer_output_w_per_m
        return None if t is None else bool(t >= self.design_heat_loss_w_per_m)

    def to_dict(self) -> dict:
        out = {k: getattr(self, k) for k in self.__slots__}
        out.update(margin_percent=self.margin_percent, sufficient=self.sufficient)
        return out


@dataclass
class TracingSchedule:
    items: list = field(default_factory=list)
    warnings: list = field(default_factory=list)
    problems: list = field(default_factory=list)

    @property
    def total_design_heat_loss_w(self) -> float:
        return float(sum(i.design_heat_loss_w for i in self.items))


def schedule_tracing(project, results) -> TracingSchedule:
    """The traced lines of *results* (:class:`pipeins.schedule.LineResult`, pipe runs) whose
    service gives ``maintain_temp``."""
    from .catalog.materials import lookup_material
    from .errors import InputError
    from .model import Layer
    from .schedule import _spec
    from .solve import solve
    from .tracing import DEFAULT_SAFETY_FACTOR_PERCENT, tracing_spec
    from .units import format_quantity as fq

    out = TracingSchedule()
    by_tag = {l.tag: l for l in project.lines}
    groups: dict[tuple, list] = {}
    for r in results:
        service = project.services.get(r.service)
        line = by_tag.get(r.tag)
        if service is None or not getattr(service, "tracing", None) or line is None or line.kind != "pipe":
            continue
        groups.setdefault((r.service, r.condition), []).append((r, line))
    for (sname, cname), members in groups.items():
        service, condition = project.services[sname], project.conditions[cname]
        t = dict(service.tracing)
        maintain = float(t["maintain_temp_c"])
        sf = float(t.get("safety_factor_percent", DEFAULT_SAFETY_FACTOR_PERCENT))
        spec = tracing_spec(_spec(service, condition), maintain, t.get("min_ambient_c"))
        air = float(np.max(spec.air_temp_c))
        where = project.where(service.file_line, f'service "{sname}"', "maintain_temp")
        if not maintain > air:
            out.problems.append(f"{where}: in {cname}: the maintain temperature {fq(maintain, 'temperature', project.units)} "
                                f"must be above the minimum design ambient {fq(air, 'temperature', project.units)} "
                                "(no tracer is needed otherwise)")
            continue
        try:
            pipe, _, fluid, surroundings, surface = spec.build_model([l.size for _, l in members], insulated=True)
        except InputError as exc:
            out.problems.append(f"{where}: in {cname}: {exc.message}")
            continue
        thickness = np.array([r.thickness_m for r, _ in members])[:, None]
        result = solve(pipe, [Layer(lookup_material(service.material), thickness)], fluid, surroundings, surface)
        q = np.ravel(result.heat_flow_w_per_m)
        ts = np.ravel(result.surface_temp_c)
        out.warnings += [with_subject(w, f'heat tracing of service "{sname}" in {cname}')
                         for w in dict.fromkeys(result.warnings)]
        output = t.get("tracer_output_w_per_m")
        wind = float(np.ravel(spec.wind_m_s)[0]) if spec.wind_m_s is not None else 0.0
        for k, (r, _) in enumerate(members):
            design = float(q[k]) * (1 + sf / 100.0)
            item = TracedLine(r.tag, sname, cname, maintain, air, wind, r.thickness_m, r.length_m, float(q[k]), sf,
                              design, design * r.length_m, float(ts[k]), output)
            out.items.append(item)
            if item.sufficient is False:
                out.warnings.append(f'line "{r.tag}": the tracer output {fq(output, "heat_flow_per_length", project.units)} '
                                    f"is below the design heat loss "
                                    f"{fq(design, 'heat_flow_per_length', project.units)}: the line will not hold "
                                    f"{fq(maintain, 'temperature', project.units)} at the minimum design ambient")
    order = {l.tag: i for i, l in enumerate(project.lines)}
    out.items.sort(key=lambda x: order.get(x.tag, 0))
    out.warnings = list(dict.fromkeys(out.warnings))
    return out
