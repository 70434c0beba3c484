"""Buried lines of a project: sized and solved in the soil, twin pairs with both pipes apart.

A service or line with ``buried`` (the depth of the pipe centre), ``soil`` or ``soil_k`` and
``ground_temp`` (the keys of ``check --buried …``) is a buried pipe (:mod:`pipeins.buried`): the
soil is a resistance acosh(2z/D)/(2π k_s) from the outer surface of diameter D to an isothermal
ground surface (the shape factor of a cylinder under a plane), in series with the insulation; no
air film, no radiation, no sun.  Its outer diameter changes with the thickness, so the sizing
search solves every trial build-up with the soil's coefficient at its own diameter
(:attr:`pipeins.sizing.SizingProblem.soil`), all sizes and thicknesses in one solve.

Criteria: a heat-flow cap (or a least reduction against the bare pipe in the soil), a heat-flux
cap, the temperature change along the run, the economic thickness and a code minimum are sized
for as in air; touch safety and condensation on the outer surface do not apply to a line in the
soil, nor a freeze hold time or a tracer output (sized for lines in air): a service that lists
them gets a note saying so (:data:`NOT_APPLICABLE`).

Twin pairs: ``twin_spacing`` and ``return_temp`` give a return pipe of the same size and
build-up in the same trench, centres that far apart at the same depth (the mutual resistance
of a line source and its image, :func:`pipeins.buried.mutual_resistance_mk_w`); with
``twin_casing`` (and ``casing_insulation``, default the service's material) the supply and the
return share ONE casing of that outer diameter (:func:`pipeins.twin_casing.solve_twin_casing`,
the multipole method), which fixes the insulation: such a line is checked, not sized, at the
reference build-up of the supply centred alone in the casing, as ``check`` reports it.  A pair
is sized as its supply alone in the soil; both pipes are then solved together, and the return
becomes a line of the schedule of its own (tag ``"<tag> return"``), so losses and gains stay
apart and the totals are plain sums of the lines.

Every line of one service and location is solved in one solver call (and its bare pipe in
another); the return pipes beside their supply in one more; a twin casing once per size.
"""

from __future__ import annotations

from dataclasses import dataclass, field, replace

import numpy as np

from .buried import SIZED_FOR

__all__ = ["BuriedItem", "BuriedSchedule", "NOT_APPLICABLE", "select_buried", "solve_buried_lines",
           "soil_of", "BASIS_NOTE"]

#: The criteria a buried line is not sized for, and why (the note a service listing them gets).
NOT_APPLICABLE = {
    "touch": "touch safety: not applicable to a buried line (its surface is in the soil, out of reach)",
    "condensation": "condensation control: not applicable to a buried line (its outer surface is in the soil, "
                    "not in humid air)",
    "freeze": "freeze protection (hold time): not applicable to a buried line (the hold time is worked out for a "
              "line in air; the soil's heat capacity is not modelled)",
    "tracer": "tracer output: not applicable to a buried line (a tracer is sized here for a line in air)",
}

BASIS_NOTE = ("The soil is a resistance acosh(2z/D)/(2π·k) from the outer surface (diameter D, centre at depth z) "
              "to an isothermal ground surface (cylinder in a semi-infinite medium, Incropera & DeWitt, "
              "Fundamentals of Heat and Mass Transfer, 6th ed., Table 4.1, case 2, from memory), in series with the"
              " insulation: no air film, no radiation, no sun. Two pipes side by side: the mutual resistance "
              "ln(sqrt(1 + (2z/E)²))/(2π·k) of a line source and its image (Wallentén 1991, from memory); pipes in "
              "one casing: the multipole method (line sources and multipoles at the pipes and their images in the "
              "casing, Bennet, Claesson & Hellström 1987, from memory). A pair is sized as its supply alone in the "
              "soil; both pipes' heat flows are given apart, never netted; a pair's outlet temperature (Lines "
              "table) is the pipe's alone in the soil. Soil conductivity varies with moisture: use a site survey "
              "where the heat flow matters.")


@dataclass(frozen=True, slots=True)
class BuriedItem:
    """One buried pipe of the schedule (SI; heat flows + out of the fluid)."""

    tag: str
    service: str
    condition: str
    size: str
    role: str                  # "single", "supply" or "return"
    arrangement: str           # "alone", "side by side", "one casing"
    pair: str | None           # the other pipe's tag
    depth_m: float
    soil_name: str
    soil_k_w_mk: float
    soil_source: str
    ground_temp_c: float
    fluid_temp_c: float
    thickness_m: float
    casing_diameter_m: float
    soil_resistance_mk_w: float
    length_m: float
    heat_flow_w_per_m: float
    alone_heat_flow_w_per_m: float | None   # alone in the soil (None: a return in a casing)
    bare_heat_flow_w_per_m: float
    heat_flow_w: float
    casing_temp_c: float
    spacing_m: float | None = None
    mutual_resistance_mk_w: float | None = None

    def to_dict(self) -> dict:
        out = {k: getattr(self, k) for k in self.__slots__}
        out["heat_loss_w"] = max(self.heat_flow_w, 0.0)
        out["heat_gain_w"] = max(-self.heat_flow_w, 0.0)
        return out


@dataclass
class BuriedSchedule:
    items: list = field(default_factory=list)
    #: service -> its buried basis (depth, soil, conductivity and its source, ground temperature, pair)
    basis: dict = field(default_factory=dict)


def soil_of(inputs: dict) -> tuple[str, float, str]:
    """(soil name, conductivity [W/(m·K)], source) of a buried line's inputs."""
    from .buried import lookup_soil

    if inputs.get("soil") is not None:
        soil = lookup_soil(inputs["soil"])
        return soil.name, soil.conductivity_w_mk, soil.source
    return "given", float(inputs["soil_k_w_mk"]), "given"


def _ground_spec(service, condition, length=None):
    from .buried import ground_spec
    from .schedule import _spec

    return ground_spec(_spec(service, condition, length, with_rh=False), service.buried_inputs["ground_temp_c"])


def _casing_material(service) -> str:
    return service.buried_inputs.get("casing_insulation") or service.material


def select_buried(project, service, condition, sizes, length):
    """Size *sizes* of a buried service in the soil (:func:`pipeins.selection.select` with the
    soil on the sizing problem), for the criteria that apply to a buried line; the others listed
    get their not-applicable note.  A twin casing (one size) is checked at its casing's build-up."""
    from .criteria.registry import requirements_for
    from .selection import select

    inputs = service.buried_inputs
    _, k, _ = soil_of(inputs)
    kept = tuple(c for c in service.criteria if c not in NOT_APPLICABLE)
    # said only of criteria the user listed (a line in air's defaults left out silently)
    notes = [NOT_APPLICABLE[c] for c in service.criteria if c in NOT_APPLICABLE] if service.criteria_listed else []
    req = replace(requirements_for(service.requirements, kept), touch=False)
    spec = _ground_spec(service, condition, length)
    material, series = service.material, service.series
    if inputs.get("casing_diameter_m") is not None:   # the casing fixes the build-up: checked, not sized
        material = _casing_material(service)
        series = ((inputs["casing_diameter_m"] - sizes[0].outer_diameter_m) / 2,)
    if not set(kept) & set(SIZED_FOR):
        return _unsized(series, len(sizes), notes)
    economic = None
    if "economic" in kept:
        from .schedule import _basis

        economic = _basis(service, True)
    sel = select(spec, material, req, series, project.units, sizes=sizes, code=service.code if "code" in kept else None,
                 economic=economic, code_paths=project.code_paths, add_inner_layer=False,
                 soil=(inputs["depth_m"], k))
    sel.notes[:0] = notes
    sel.notes = [n for n in sel.notes if not (isinstance(n, str) and n.startswith("condensation not checked"))]
    return sel


class _Fixed:
    """The selection of a buried line with a given thickness and no criterion that applies in
    the soil: that thickness, governed by nothing."""

    def __init__(self, series, n, notes):
        from types import SimpleNamespace

        t = float(series[0])
        self.notes = notes
        given = SimpleNamespace(key="given", label="given build-up", description=(
            "checked at its given build-up; no sizing criterion of the service applies to a buried line"))
        self.outcome = SimpleNamespace(criteria=[given], feasible=np.ones(n, dtype=bool), selected_m=np.full(n, t),
                                       layer_split_m=[(t,)] * n, governing=[None] * n, messages=[[] for _ in range(n)],
                                       result=SimpleNamespace(warnings=[]))


def _unsized(series, n, notes):
    """A buried line with no criterion that applies in the soil: its given thickness, else refused."""
    if isinstance(series, tuple) and len(series) == 1:
        return _Fixed(series, n, notes)
    from .errors import InputError

    raise InputError("criteria", f"a buried line is sized for {', '.join(SIZED_FOR)} (touch and condensation do not "
                                 "apply to a buried line)")


def _pair_flows(r1, r2, soil_r, mutual_r, dt1, dt2):
    """Heat flows [W/m] of two pipes in one trench (arrays): (q1, q2) = M⁻¹ (ΔT1, ΔT2) with
    M = [[R1 + R_s, R_m], [R_m, R2 + R_s]] (:func:`pipeins.buried.twin_heat_flows`, vectorised)."""
    a, b = r1 + soil_r, r2 + soil_r
    det = a * b - mutual_r * mutual_r
    return (b * dt1 - mutual_r * dt2) / det, (a * dt2 - mutual_r * dt1) / det


def _own_resistance(dt, q, soil_r):
    """Each pipe's own resistance (film, wall, insulation) from its solve alone: ΔT/q − R_s."""
    with np.errstate(divide="ignore", invalid="ignore"):
        return np.where(q != 0, dt / np.where(q != 0, q, 1.0) - soil_r, np.inf)


def solve_buried_lines(project, service, condition, lines, chosen, warnings, out: BuriedSchedule) -> list:
    """The :class:`~pipeins.schedule.LineResult` of the buried pipe *lines* of one service and
    location (their return pipes after them), and their :class:`BuriedItem` s in *out*."""
    from .bare import bare_surface as bare_surface_of
    from .buried import mutual_resistance_mk_w, soil_coefficient_w_m2k, soil_resistance_mk_w
    from .catalog.materials import lookup_material
    from .errors import InputError
    from .model import Fluid, Layer
    from .notes import note, with_subject
    from .schedule import _line_results
    from .solve import solve
    from .units import format_quantity as fq

    inputs = service.buried_inputs
    depth, ground = float(inputs["depth_m"]), float(inputs["ground_temp_c"])
    soil_name, k, source = soil_of(inputs)
    casing = inputs.get("casing_diameter_m")
    spacing, back_c = inputs.get("twin_spacing_m"), inputs.get("return_temp_c")
    arrangement = "alone" if spacing is None else ("one casing" if casing is not None else "side by side")
    n = len(lines)
    spec = _ground_spec(service, condition)
    pipe, _, fluid, surroundings, surface = spec.build_model([l.size for l in lines], insulated=True)
    material = lookup_material(_casing_material(service) if casing is not None else service.material)
    thickness = np.array([chosen[(l.service, l.condition, l.size.label)][0] for l in lines])[:, None]
    od = np.asarray(pipe.outer_diameter_m, dtype=float)
    diameter = od + 2.0 * thickness
    for line, d in zip(lines, np.ravel(diameter)):
        if not depth > d / 2:
            raise InputError("depth_m", f'line "{line.tag}": the burial depth {fq(depth, "length", project.units, 2)} '
                                        f"(to the pipe centre) must be more than the casing radius "
                                        f'{fq(d / 2, "diameter", project.units)} at the scheduled thickness')
        if spacing is not None and casing is None and not spacing > d:
            raise InputError("twin_spacing_m", f'line "{line.tag}": the two pipes\' centres must be more than a casing '
                                               f'diameter apart ({fq(d, "diameter", project.units)} at the scheduled '
                                               "thickness)")
    h = soil_coefficient_w_m2k(depth, diameter, k)
    layers = [Layer(material, np.where(thickness > 0, thickness, 1e-9))]
    insulated = replace(surface, fixed_coefficient_w_m2k=h)
    result = solve(pipe, layers, fluid, surroundings, insulated)
    bare_surface = bare_surface_of(pipe, replace(surface, fixed_coefficient_w_m2k=soil_coefficient_w_m2k(depth, od, k)))
    bare_surface = replace(bare_surface, name=f"{bare_surface_of(pipe).name} in the soil")
    bare = solve(pipe, [], fluid, surroundings, bare_surface)
    q_alone = np.ravel(result.heat_flow_w_per_m)
    qb_alone = np.ravel(bare.heat_flow_w_per_m)
    ts = np.ravel(result.surface_temp_c)
    warnings += [with_subject(w, f'service "{service.name}" in {condition.name}') for w in dict.fromkeys(result.warnings)]
    returns_said = (f'line "{lines[0].tag} return"' if n == 1 else
                    "lines " + ", ".join(f'"{l.tag} return"' for l in lines))
    r_soil = np.ravel(soil_resistance_mk_w(depth, diameter, k))
    r_soil_bare = np.ravel(soil_resistance_mk_w(depth, od, k))
    t1 = float(service.fluid_temp_c)
    q, qb = q_alone.copy(), qb_alone.copy()
    back = None   # the return pipes: (per metre, bare per metre, alone, surface)
    mutual = None
    if spacing is not None and casing is None:   # side by side: the return solved alone, then the pair
        ret = solve(pipe, layers, Fluid(back_c, fluid.film_coefficient_w_m2k), surroundings, insulated)
        ret_bare = solve(pipe, [], Fluid(back_c, fluid.film_coefficient_w_m2k), surroundings, bare_surface)
        q2_alone, q2b_alone = np.ravel(ret.heat_flow_w_per_m), np.ravel(ret_bare.heat_flow_w_per_m)
        mutual = float(mutual_resistance_mk_w(depth, spacing, k))
        dt1, dt2 = t1 - ground, back_c - ground
        q, q2 = _pair_flows(_own_resistance(dt1, q_alone, r_soil), _own_resistance(dt2, q2_alone, r_soil), r_soil,
                            mutual, dt1, dt2)
        qb, q2b = _pair_flows(_own_resistance(dt1, qb_alone, r_soil_bare), _own_resistance(dt2, q2b_alone, r_soil_bare),
                              r_soil_bare, mutual, dt1, dt2)
        warnings += [with_subject(w, returns_said) for w in dict.fromkeys([*ret.warnings, *ret_bare.warnings])]
        # each casing surface beside the other pipe: the ground plus its own heat flow through the
        # soil and the other's through the mutual resistance (= T_fluid - q_pair * R_own)
        ts = ground + q * r_soil + q2 * mutual
        back = (q2, q2b, q2_alone, ground + q2 * r_soil + q * mutual)
    elif casing is not None:   # one casing: the multipole solve once per size
        from .twin_casing import solve_twin_casing

        twins = {}
        q2, q2b, ts2 = np.zeros(n), np.zeros(n), np.zeros(n)
        mutual = float(mutual_resistance_mk_w(depth, spacing, k))
        for i, line in enumerate(lines):
            if line.size.label not in twins:
                try:
                    twins[line.size.label] = solve_twin_casing(spec, casing, spacing, depth, k, ground, back_c,
                                                               material.key or material.name, sizes=[line.size])
                except InputError as exc:
                    raise InputError(exc.name, f'line "{line.tag}": {exc.message}') from None
            twin = twins[line.size.label]
            q[i], q2[i], ts[i] = twin.supply_heat_flow_w_per_m, twin.return_heat_flow_w_per_m, twin.casing_temp_c
        # bare: each bare pipe alone in the soil (bare pipes that close together are no real layout)
        ret_bare = solve(pipe, [], Fluid(back_c, fluid.film_coefficient_w_m2k), surroundings, bare_surface)
        q2b = np.ravel(ret_bare.heat_flow_w_per_m)
        # the return's own warnings (its temperature in the casing's insulation): the return at the
        # supply's reference build-up in the soil
        ret = solve(pipe, layers, Fluid(back_c, fluid.film_coefficient_w_m2k), surroundings, insulated)
        warnings += [with_subject(w, returns_said) for w in dict.fromkeys([*ret.warnings, *ret_bare.warnings])]
        back = (q2, q2b, [None] * n, ts)
    if back_c is not None:
        warnings += _pair_notes(service.name, condition.name, t1, float(back_c), ground)
    cap = service.requirements.max_heat_flow_w_per_m
    lengths = np.array([l.length_m for l in lines], dtype=float)
    columns = [(lines, thickness, q, qb, ts, t1, q_alone, "supply" if back is not None else "single")]
    if back is not None:
        returns = [replace(l, tag=f"{l.tag} return") for l in lines]
        columns.append((returns, thickness, back[0], back[1], back[3], back_c, back[2], "return"))
    results = []
    for members, thick, qq, qqb, tss, temp, alone, role in columns:
        heat, heat_bare = qq * lengths, qqb * lengths
        pair = [None] * n if back is None else [f"{l.tag} return" if role == "supply" else l.tag.removesuffix(" return")
                                                for l in members]
        results += _line_results(project, service, members, thick, qq, qqb, np.zeros(n), heat, heat_bare, tss,
                                 [None] * n, _outlets(service, pipe, layers, temp, lengths, surroundings, insulated,
                                                      fluid, warnings) if role != "return" else [None] * n,
                                 bare_surface, warnings, burial_depth_m=[depth] * n, pair=pair)
        for i, line in enumerate(members):
            out.items.append(BuriedItem(
                line.tag, line.service, line.condition, line.size.label, role, arrangement, pair[i], depth, soil_name,
                k, source, ground, float(temp), float(thick[i, 0]), float(casing if casing is not None else
                                                                          np.ravel(diameter)[i]),
                float(r_soil[i]) if casing is None else float(soil_resistance_mk_w(depth, casing, k)),
                float(lengths[i]), float(qq[i]), None if alone[i] is None else float(alone[i]), float(qqb[i]), float(heat[i]), float(tss[i]),
                spacing, mutual))
            if cap is not None and role != "single" and abs(qq[i]) > cap:
                warnings.append(note("buried.pair_above_cap", subject=f'line "{line.tag}"', role=role,
                                     heat_flow=(float(qq[i]), "heat_flow_per_length"),
                                     cap=(float(cap), "heat_flow_per_length")))
    out.basis.setdefault(service.name, {
        "depth_m": depth, "soil_name": soil_name, "soil_k_w_mk": k, "soil_source": source, "ground_temp_c": ground,
        "arrangement": arrangement, "spacing_m": spacing, "return_temp_c": back_c, "casing_diameter_m": casing,
        "casing_insulation": material.name if casing is not None else None})
    return results


def _pair_notes(service_name, condition_name, supply_c, return_c, ground_c) -> list:
    """Doubtful pair temperatures: a return farther from the ground than its supply (hotter than
    the supply of a line losing heat, colder than that of one gaining it), or the two pipes on
    either side of the ground temperature (one loses heat, the other gains)."""
    from .notes import note

    said = f'service "{service_name}" in {condition_name}'
    temps = dict(supply_c=(supply_c, "temperature"), return_c=(return_c, "temperature"),
                 ground_c=(ground_c, "temperature"))
    out = []
    if (return_c - supply_c) * (supply_c - ground_c) > 0:
        out.append(note("buried.return_beyond_supply", subject=said,
                        direction="hotter" if return_c > supply_c else "colder", **temps))
    if (supply_c - ground_c) * (return_c - ground_c) < 0:
        out.append(note("buried.pair_directions_differ", subject=said, **temps))
    elif supply_c == ground_c:
        out.append(note("buried.no_driving_difference", subject=said, **temps))
    return out


def _outlets(service, pipe, layers, temp, lengths, surroundings, surface, fluid, warnings) -> list:
    """The outlet temperature of each run where the service gives a flow (the march along the
    run, in the soil), else None."""
    if service.flow is None or not service.fluid or service.steam_pressure_pa is not None:
        return [None] * len(lengths)
    from .notes import with_subject
    from .runs import mass_flow_kg_s, temperature_along_run

    mdot = mass_flow_kg_s(service.flow, service.fluid, service.temp_c)
    run = temperature_along_run(pipe, layers, service.fluid, service.temp_c, mdot, lengths[:, None], surroundings,
                                surface, fluid.film_coefficient_w_m2k)
    warnings += [with_subject(n, f'service "{service.name}"') for n in run.notes]
    return [float(x) for x in np.ravel(run.outlet_temp_c)]
