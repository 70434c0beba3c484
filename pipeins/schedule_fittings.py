"""The fittings of a project's lines as objects: bare and covered, apart from the pipe.

A line of a project file may list its valves and flanged joints as objects (``valve =
["gate", "globe:DN50:PN40"]``, ``flange = ["DN50", "DN50"]``, each as ``check --valve`` and
``--flange`` take them, the size defaulting to the line's own) and give them a removable cover
(``cover = "mineral wool:50mm"``).  Each is solved by :mod:`pipeins.fittings` (a short
horizontal cylinder of the fitting's flange diameter and bare area, in the manner of ASTM
C1129) under the line's service and location: its bare heat flow and surface temperature and,
covered, its heat flow, cover surface temperature and the saving.  One solver call per service
and location bare, and one per cover material covered, over every fitting of those lines.

These fittings are reported in their own schedule section with their own totals (heat losses
and heat gains apart, bare, covered and saving); they are not in the lines' heat flows.  The
older counts ``valves = 2``, ``flanges``, ``strainers`` still add bare fittings to a line as
equivalent lengths of bare pipe, as before.
"""

from __future__ import annotations

import math
from dataclasses import dataclass, field, replace

import numpy as np

from .fittings import CoverSaving
from .notes import with_subject

__all__ = ["ScheduleFitting", "FittingsTotals", "FittingsSchedule", "schedule_fittings", "parse_line_fittings"]


@dataclass(frozen=True, slots=True)
class ScheduleFitting(CoverSaving):
    """One fitting on one line, solved (SI; heat flow + out of the fluid)."""

    tag: str
    service: str
    condition: str
    label: str
    kind: str
    size: str
    pressure_class: str
    area_m2: float
    heat_flow_w: float
    surface_temp_c: float
    cover: str | None = None
    covered_heat_flow_w: float | None = None
    covered_surface_temp_c: float | None = None

    def to_dict(self) -> dict:
        out = {k: getattr(self, k) for k in self.__slots__}
        out["saving_w"] = self.saving_w
        return out


@dataclass
class FittingsTotals:
    """Sums over the fittings [W]: heat losses and heat gains apart (both ≥ 0), bare and as
    installed (covered where a cover is given, bare where not), and the covers' saving."""

    count: int = 0
    covered_count: int = 0
    bare_heat_loss_w: float = 0.0
    bare_heat_gain_w: float = 0.0
    installed_heat_loss_w: float = 0.0
    installed_heat_gain_w: float = 0.0

    @property
    def saving_heat_loss_w(self) -> float:
        return self.bare_heat_loss_w - self.installed_heat_loss_w

    @property
    def saving_heat_gain_w(self) -> float:
        return self.bare_heat_gain_w - self.installed_heat_gain_w

    def to_dict(self) -> dict:
        return {"count": self.count, "covered_count": self.covered_count,
                "heat_loss_w": {"bare": self.bare_heat_loss_w, "installed": self.installed_heat_loss_w,
                                "saving": self.saving_heat_loss_w},
                "heat_gain_w": {"bare": self.bare_heat_gain_w, "installed": self.installed_heat_gain_w,
                                "saving": self.saving_heat_gain_w}}


@dataclass
class FittingsSchedule:
    items: list = field(default_factory=list)
    totals: FittingsTotals = field(default_factory=FittingsTotals)
    warnings: list = field(default_factory=list)


def parse_line_fittings(valves, flanges, cover, size_label: str, units: str = "si", key_of=None):
    """``(fittings, cover)`` of a project line: *valves* a list of ``KIND[:SIZE[:CLASS]]``,
    *flanges* a list of ``SIZE[:CLASS]`` (an empty size: the line's *size_label*), *cover*
    ``MATERIAL:THICKNESS`` or None.  Raises :class:`~pipeins.errors.InputError` naming the key
    (``valve``, ``flange``, ``cover``)."""
    from .catalog.fittings import VALVE_KINDS, lookup_fitting
    from .errors import InputError

    out = []
    for key, items in (("valve", valves), ("flange", flanges)):
        if items is None:
            continue
        if isinstance(items, str) or not isinstance(items, (list, tuple)):
            raise InputError(key, f'{key} must be a list, e.g. {key} = ["gate", "globe:DN50:PN40"]'
                             if key == "valve" else f'{key} must be a list, e.g. {key} = ["DN50", "DN50:PN40"]')
        for text in items:
            if not isinstance(text, str) or not text.strip():
                raise InputError(key, f"each {key} is text, e.g. \"gate:DN50\"")
            if key == "valve":
                kind, _, rest = text.partition(":")
                kind = kind.strip().lower()
                if kind == "flange":
                    raise InputError(key, "a flanged joint goes in flange = [...]")
                if kind not in VALVE_KINDS + ("strainer",):
                    raise InputError(key, f'unknown fitting kind "{kind}"; known: '
                                          f'{", ".join(VALVE_KINDS + ("strainer",))}')
            else:
                kind, rest = "flange", text
            size, _, cls = rest.partition(":")
            out.append(lookup_fitting(kind, size.strip() or size_label, cls.strip() or None, key))
    parsed_cover = None
    if cover is not None:
        if not out:
            raise InputError("cover", "covers the line's fittings: list them in valve or flange too")
        from .catalog.materials import lookup_material
        from .inputs import parse_layer

        parsed_cover = parse_layer(cover, units, "cover")
        lookup_material(parsed_cover[0], "cover")
    return tuple(out), parsed_cover


def _cover_material(service, name: str) -> str:
    """The name of a cover's material as solved: at the service's design conductivity where it has
    design factors (a removable cover ages, gets wet and has joints in service as the pipe
    insulation does: pipeins.user_materials), else as given."""
    factors = getattr(service, "design_factors", None)
    if factors is None or factors.factor == 1.0:
        return name
    from .catalog.materials import lookup_material
    from .user_materials import register_design_material

    return register_design_material(lookup_material(name), factors)


def schedule_fittings(project, lines) -> FittingsSchedule:
    """Solve the fittings listed as objects on *lines* (:class:`pipeins.project.Line`, with
    ``fitting_objects`` and ``cover``) under their service and location."""
    from .bare import bare_surface
    from .catalog.materials import lookup_material
    from .model import Fluid, Layer, Pipe
    from .schedule import _spec
    from .solve import solve
    from .units import format_quantity

    out = FittingsSchedule()
    groups: dict[tuple, list] = {}
    for line in lines:
        if getattr(line, "fitting_objects", ()):
            groups.setdefault((line.service, line.condition), []).append(line)
    for (sname, cname), members in groups.items():
        service, condition = project.services[sname], project.conditions[cname]
        spec = _spec(service, condition)
        pipe, _, fluid, air, surface = spec.build_model([l.size for l in members], insulated=True)
        walls = np.ravel(np.broadcast_to(pipe.wall_m, (len(members), 1)))
        rows = [(i, f) for i, l in enumerate(members) for f in l.fitting_objects]
        owner = np.array([i for i, _ in rows])
        diameter = np.array([f.flange_od_m for _, f in rows])
        area = np.array([f.area_m2 for _, f in rows])
        length = area / (math.pi * diameter)
        cyl = Pipe(diameter, walls[owner], pipe.wall_conductivity_w_mk, "fittings", pipe.wall_material)
        still = Fluid(np.asarray(fluid.temp_c, dtype=float).ravel()[0], None, fluid.name)
        horizontal = replace(air, orientation="horizontal", height_m=None)
        bare = solve(cyl, [], still, horizontal, bare_surface(pipe, surface))
        q_bare = np.ravel(bare.heat_flow_w_per_m) * length
        t_bare = np.ravel(bare.surface_temp_c)
        out.warnings += [with_subject(w, f'fittings of service "{sname}" in {cname}') for w in dict.fromkeys(bare.warnings)]
        q_cov = np.full(len(rows), np.nan)
        t_cov = np.full(len(rows), np.nan)
        covers = {}
        for j, (i, _) in enumerate(rows):
            c = members[i].cover
            if c is not None:
                covers.setdefault(c[0], []).append(j)
        face = spec.build_surface(insulated=True)
        for material, idx in covers.items():
            material = _cover_material(service, material)
            idx = np.array(idx)
            sub = Pipe(diameter[idx], walls[owner[idx]], pipe.wall_conductivity_w_mk, "fittings", pipe.wall_material)
            thick = np.array([members[owner[j]].cover[1] for j in idx])
            res = solve(sub, [Layer(lookup_material(material), thick)], still, horizontal, face)
            q_cov[idx] = np.ravel(res.heat_flow_w_per_m) * length[idx]
            t_cov[idx] = np.ravel(res.surface_temp_c)
            out.warnings += [with_subject(w, f'fitting covers of service "{sname}" in {cname}')
                             for w in dict.fromkeys(res.warnings)]
        if condition.rh_percent is not None:   # a bare or covered fitting colder than the dew point sweats
            from .props.humid import dew_point_c
            from .units import format_quantity as fq

            dew = float(dew_point_c(float(condition.air_temp_c), float(condition.rh_percent),
                                    float(condition.pressure_pa)))
            for j, (i, f) in enumerate(rows):
                t = t_bare[j] if members[i].cover is None else t_cov[j]
                if t < dew:
                    out.warnings.append(
                        f'line "{members[i].tag}": the {"bare" if members[i].cover is None else "covered"} {f.label} '
                        f"surface {fq(float(t), 'temperature', project.units)} is below the dew point "
                        f"{fq(dew, 'temperature', project.units)}: it sweats; give it a vapour-tight cover thick "
                        "enough to stay above the dew point")
        for j, (i, f) in enumerate(rows):
            line = members[i]
            cover = None if line.cover is None else (
                f"{lookup_material(_cover_material(service, line.cover[0])).name} "
                f"{format_quantity(line.cover[1], 'thickness', project.units)}")
            covered = None if line.cover is None else float(q_cov[j])
            out.items.append(ScheduleFitting(line.tag, sname, cname, f.label, f.kind, f.size, f.pressure_class,
                                             float(f.area_m2), float(q_bare[j]), float(t_bare[j]), cover, covered,
                                             None if line.cover is None else float(t_cov[j])))
    order = {l.tag: k for k, l in enumerate(lines)}
    out.items.sort(key=lambda x: order.get(x.tag, 0))
    t = out.totals
    for item in out.items:
        t.count += 1
        installed = item.heat_flow_w if item.covered_heat_flow_w is None else item.covered_heat_flow_w
        t.covered_count += item.covered_heat_flow_w is not None
        t.bare_heat_loss_w += max(item.heat_flow_w, 0.0)
        t.bare_heat_gain_w += max(-item.heat_flow_w, 0.0)
        t.installed_heat_loss_w += max(installed, 0.0)
        t.installed_heat_gain_w += max(-installed, 0.0)
    out.warnings = list(dict.fromkeys(out.warnings))
    return out
