"""Sections other than a pipe, at the level of a line: building vessels, and the extras
of a check (heat over a duct run, the air's temperature change, a vessel's hold time).

Numbers only; :mod:`pipeins.reports.section` words them.
"""

from __future__ import annotations

import numpy as np

from .errors import InputError

__all__ = ["section_extras", "build_vessel", "duct_heat_flow", "duct_mass_flow_kg_s", "duct_air_run",
           "DuctTempChange", "HeatFluxCap", "worst_patch_flux_w_m2", "duct_code_outcome",
           "duct_rows", "duct_table_sizes"]


def _one(x):
    return float(np.asarray(x).ravel()[0])


def parse_floor(text, units: str = "si"):
    """``air`` or ``ground:TEMP`` → :class:`~pipeins.geometry.vessel.Floor` (None for None)."""
    from .geometry.vessel import tank_floor

    if text is None:
        return None
    kind, _, temp = str(text).partition(":")
    kind = kind.strip().lower()
    if kind == "ground":
        if not temp.strip():
            raise InputError("floor", 'a floor on the ground needs the ground temperature: "ground:10C"')
        from .units import parse_quantity

        return tank_floor("ground", parse_quantity(temp.strip(), "temperature", "floor", units))
    if temp:
        raise InputError("floor", f'"{text}" is not a floor; use air or ground:TEMP (e.g. ground:10C)')
    return tank_floor(kind)


def build_vessel(spec, sheet=None, wall_m=None, units: str = "si"):
    """The sphere or cylindrical vessel of *spec* (see :mod:`pipeins.geometry.vessel`).

    The wall is carbon steel unless *sheet* names a sheet material; its thickness
    *wall_m* [m] or :data:`~pipeins.geometry.vessel.DEFAULT_WALL_M`.
    """
    from .geometry.vessel import DEFAULT_WALL_M, sphere_patches, vessel_patches
    from .model import VesselSection

    wall = DEFAULT_WALL_M if wall_m is None else wall_m
    if sheet is None:
        from .catalog.materials import lookup_wall_material

        steel = lookup_wall_material("carbon steel")
        k, material, finish = steel.conductivity_w_mk, "carbon steel", steel.bare_finish
    else:
        k, material, finish = sheet.conductivity_w_mk, f"{sheet.name}", sheet.bare_finish
    if spec.section_kind == "sphere":
        d = float(spec.sphere_diameter_m)
        specs = sphere_patches(d, wall)
        return VesselSection("sphere", d, wall, k, tuple(s.to_patch() for s in specs),
                             f"sphere {d:g} m", material, finish)
    d, length = float(spec.vessel_diameter_m), float(spec.length_m)
    floor = parse_floor(spec.floor, units)
    heads = spec.heads or "flat"
    specs = vessel_patches(d, length, spec.vessel, heads, floor, wall)
    return VesselSection("vessel", d, wall, k, tuple(s.to_patch() for s in specs),
                         f"{spec.vessel} vessel {d:g} m × {length:g} m", material, finish,
                         spec.vessel, length, heads, floor)


def section_extras(spec, result, units: str):
    """Rows (display text), SI data and warnings beyond the section's heat flow."""
    from .units import format_quantity as fq

    rows, data, warnings = [], {}, []
    q = _one(result.heat_flow)
    if spec.section_kind == "duct" and spec.length_m is not None and (spec.flow is not None
                                                                       or spec.velocity_m_s is not None):
        _duct_run_rows(spec, result, units, rows, data, warnings)
    elif spec.section_kind == "duct" and spec.length_m is not None:
        heat = q * spec.length_m
        rows.append([f"heat {'loss' if heat >= 0 else 'gain'} over {fq(spec.length_m, 'length', units)}",
                     fq(abs(heat), "power", units)])
        data["heat_flow_w"] = heat
    if spec.section_kind in ("sphere", "vessel"):
        _contents_rows(spec, result, units, rows, data, warnings)
    return rows, data, warnings


def night_extras(spec, result, units, rows, data, warnings):
    """With sun and an RH: the surface at night (no sun), where condensation is judged."""
    if spec.solar_w_m2 is None or spec.rh_percent is None or result.dew_point_c is None:
        return
    from dataclasses import replace

    from .units import format_quantity as fq

    night = replace(spec, solar_w_m2=None, absorptance=None).solve()
    ts, dew = _one(night.surface_temp_c), _one(night.dew_point_c)
    rows.append(["surface at night, without sun", fq(ts, "temperature", units)])
    data["night_surface_temp_c"] = ts
    if ts < dew:
        from .notes import note

        warnings.append(note("surface.below_dew_point.night", surface_c=(ts, "temperature"),
                             dew_point_c=(dew, "temperature")))


def _contents_rows(spec, result, units, rows, data, warnings):
    """The stored contents: volume, mass, UA, time constant, initial rate, freeze hold (water)."""
    from .geometry.vessel import vessel_volume_m3
    from .units import format_quantity as fq
    from .vessel_hold import contents_mass_kg, freeze_hold_s

    section = result.inputs["pipe"]
    inner_d = section.diameter_m - 2 * section.wall_m
    if section.kind == "sphere":
        volume = float(np.pi * inner_d**3 / 6)
    else:
        volume = float(vessel_volume_m3(inner_d, section.length_m, section.heads, section.floor))
    fluid = spec.fluid or "water"
    temp = _one(result.inputs["fluid"].temp_c)
    air = _one(result.inputs["surroundings"].air_temp_c)
    q = _one(result.heat_flow)
    try:
        mass = float(contents_mass_kg(volume, fluid, temp))
    except InputError as exc:
        from .notes import note

        warnings.append(note("vessel.contents_not_worked_out", reason=exc.message))
        return
    from .props.liquids import fluid_properties

    cp = float(fluid_properties(fluid, temp).heat_capacity_j_kgk)
    rows += [["contents volume (full)", f"{volume:.3g} m³" if units == "si" else f"{volume * 264.172:.4g} US gal"],
             ["contents mass", f"{mass:,.0f} kg" if units == "si" else f"{mass / 0.45359237:,.0f} lb"]]
    data.update(contents_volume_m3=volume, contents_mass_kg=mass)
    if abs(temp - air) > 1e-9 and q != 0.0:
        ua = q / (temp - air)
        tau = mass * cp / ua
        rate = q / (mass * cp) * 3600.0
        rows += [["overall UA", f"{ua:.4g} W/K" if units == "si" else f"{ua * 3600 / 1055.05585 / 1.8:.4g} Btu/(h·°F)"],
                 ["time constant m·cp/UA (lumped, UA fixed)", fq(tau, "time", units)],
                 ["contents temperature change at the start", fq(-rate, "temperature_difference", units, digits=3) + "/h"]]
        data.update(ua_w_k=ua, time_constant_s=tau, initial_rate_k_per_h=-rate)
        if fluid == "water" and air < 0.0 < temp:
            hold = float(freeze_hold_s(mass, ua, temp, air))
            rows.append(["hours until water starts to freeze (lumped, UA fixed)", fq(hold, "time", units)])
            data["freeze_start_h"] = hold / 3600.0
            from .notes import note

            warnings.append(note("vessel.freeze_hold_lumped"))


# -- the air along a duct run -----------------------------------------------------------

def duct_heat_flow(section, layers, fluid, surroundings, surface):
    """``q(temp_c) -> W/m``: the duct's heat flow per metre out of the air at the bulk air
    temperature *temp_c* [°C], every patch of every case in one :func:`pipeins.solve.solve`.

    The inside film stays the one of *fluid* (worked out at the entering air; over the few
    kelvin a duct run changes, the film moves by well under 1 %)."""
    from dataclasses import replace

    from .solve import solve

    def heat_flow(temp_c):
        return solve(section, layers, replace(fluid, temp_c=temp_c), surroundings, surface).heat_flow

    return heat_flow


def duct_mass_flow_kg_s(spec, section, temp_c):
    """Air mass flow [kg/s] of a duct line: from ``spec.flow`` (volume or mass), or from
    ``spec.velocity_m_s`` over the inside cross-section."""
    return _mass_flow(spec.flow, spec.velocity_m_s, section, temp_c, spec.pressure_pa)


def _mass_flow(flow, velocity_m_s, section, temp_c, pressure_pa):
    from .duct_run import air_mass_flow_kg_s

    if flow is None:
        from .physics.duct_inner import duct_area_m2

        wall = np.asarray(section.wall_m, dtype=float)
        if section.kind == "round duct":
            area = duct_area_m2(section.inner_diameter_m)
        else:
            area = duct_area_m2(np.asarray(section.width_m, float) - 2 * wall,
                                np.asarray(section.height_m, float) - 2 * wall)
        flow = np.asarray(velocity_m_s, dtype=float) * area  # m³/s
    return air_mass_flow_kg_s(flow, temp_c, pressure_pa)


def duct_air_run(spec, result, segments: int = 20, ambient_fraction=None):
    """The air along the duct run of a solved duct line (:func:`pipeins.duct_run.temperature_along_duct`)."""
    from .duct_run import AMBIENT_FRACTION, temperature_along_duct

    inputs = result.inputs
    section, fluid, surroundings = inputs["pipe"], inputs["fluid"], inputs["surroundings"]
    layers = list(inputs["layers"])
    entering = np.asarray(fluid.temp_c, dtype=float)
    mdot = duct_mass_flow_kg_s(spec, section, entering)
    try:
        return temperature_along_duct(duct_heat_flow(section, layers, fluid, surroundings, inputs["surface"]),
                                      entering, mdot, spec.length_m, surroundings.air_temp_c,
                                      radiant_temp_c=surroundings.radiant_temp_c, pressure_pa=spec.pressure_pa,
                                      segments=segments,
                                      ambient_fraction=AMBIENT_FRACTION if ambient_fraction is None
                                      else ambient_fraction), mdot
    except InputError as exc:
        if exc.name == "flow" and spec.flow is None:
            raise InputError("velocity_m_s", exc.message) from None
        raise


def _duct_run_rows(spec, result, units, rows, data, warnings):
    """Leaving-air temperature, its change and the heat over the run (gain and loss apart)."""
    from .units import format_quantity as fq

    run, mdot = duct_air_run(spec, result)
    entering = _one(result.inputs["fluid"].temp_c)
    leaving, change, heat = _one(run.leaving_temp_c), _one(run.temp_change_k), _one(run.heat_flow_w)
    rows += [["air mass flow", fq(_one(mdot), "mass_flow", units)],
             ["leaving air temperature", fq(leaving, "temperature", units)],
             ["air temperature change", fq(change, "temperature_difference", units, digits=2)],
             [f"heat {'loss' if heat >= 0 else 'gain'} over {fq(spec.length_m, 'length', units)}",
              fq(abs(heat), "power", units)]]
    data.update(mass_flow_kg_s=_one(mdot), entering_temp_c=entering, leaving_temp_c=leaving,
                temp_change_k=change, heat_flow_w=heat)
    data["heat_loss_w" if heat >= 0 else "heat_gain_w"] = abs(heat)
    warnings += list(run.notes)


# -- sizing criteria of a duct or vessel: pipeins.section_criteria (they import the sizing
# search, which a check does not load); their names still resolve here.

_IN_CRITERIA = ("duct_temp_change", "DuctTempChange", "HeatFluxCap")


def __getattr__(name):
    if name in _IN_CRITERIA:
        from . import section_criteria

        return getattr(section_criteria, name)
    raise AttributeError(f"module {__name__!r} has no attribute {name!r}")


def worst_patch_flux_w_m2(result):
    """The largest |outer heat flux| [W/m²] over the patches of *result* (the whole's own
    for a single patch)."""
    if getattr(result, "patches", None):
        return np.max(np.stack([np.abs(np.asarray(p.result.outer_heat_flux_w_m2, dtype=float))
                                for p in result.patches]), axis=0)
    return np.abs(np.asarray(result.outer_heat_flux_w_m2, dtype=float))


def duct_code_outcome(spec, req, rule_set: str, material, n_sizes: int, fluid_temp_c, air_temp_c, units="si"):
    """The code minimum of a duct as a :class:`~pipeins.sizing.CriterionOutcome` (key ``code``):
    the least thickness of *material* whose flat-layer R-value t/k meets the rule's R
    (:func:`pipeins.duct_codes.minimum_r_value`, :func:`pipeins.duct_codes.least_thickness`),
    k at the 75 °F rating mean temperature the code's R-values are stated at; the same for
    every size.  A lower bound on the pick, like a pipe code minimum.  For a wrap the
    thickness is the nominal one whose installed thickness (less the compression) meets the R."""
    from .duct_codes import LOCATIONS, load_duct_rule_sets, least_thickness, minimum_r_value
    from .sizing import CriterionOutcome

    sets = load_duct_rule_sets()
    if rule_set not in sets:
        raise InputError("code", f'"{rule_set}" is not a duct rule set; for a duct use {" or ".join(sorted(sets))}')
    if req.duct_location is None:
        raise InputError("duct_location", f"a duct code minimum needs where the duct runs: {', '.join(LOCATIONS)}")
    if req.climate_zone is None:
        raise InputError("climate_zone", "a duct code minimum needs the climate zone, e.g. 4 or 5A")
    difference = float(np.max(np.abs(np.asarray(fluid_temp_c, float) - np.asarray(air_temp_c, float))))
    rule = minimum_r_value(rule_set, req.duct_location, req.duct_service or "supply", req.climate_zone, difference,
                           units)
    if not rule.covered:
        required, message = np.full(n_sizes, np.nan), f"code minimum: not covered ({rule.reason})"
    else:
        # a wrap is sized by its nominal thickness: the one whose installed thickness gives the R
        thickness = float(least_thickness(rule.r_value_m2k_w, material,
                                          compression_percent=getattr(material, "compression_percent", 0.0)
                                          ).nominal_thickness_m)
        required, message = np.full(n_sizes, thickness), ""
    outcome = CriterionOutcome("code", "code minimum", f"duct insulation of {rule_set}: {rule.reason}",
                               required, np.ones(n_sizes, dtype=bool), [message] * n_sizes)
    outcome.source = rule.source
    outcome.r_value_m2k_w = rule.r_value_m2k_w
    return outcome


# -- a table of duct sizes ------------------------------------------------------------------

def duct_table_sizes(text: str, units: str = "si") -> list[str]:
    """The duct sizes of a ``table --ducts`` text, each as a duct size text.

    ``"300x200mm, 600x400mm"`` (a list, rectangular or round), ``round`` (every catalogue round
    diameter of the unit system, :func:`pipeins.catalog.ducts.round_duct_sizes`) or
    ``round:200..800mm`` / ``round:6..24in`` (the catalogue diameters in that range).
    """
    from .catalog.ducts import parse_duct_size, round_duct_sizes

    text = str(text).strip()
    word, _, span = text.partition(":")
    if word.strip().lower() == "round":
        if not span.strip():
            system = "in" if units == "us" else "mm"
            low, high = 0.0, float("inf")
        else:
            lo, sep, hi = span.partition("..")
            unit = hi.strip().lstrip("0123456789. ")
            if not sep or unit not in ("mm", "in"):
                raise InputError("--ducts", f'"{text}" is not a round-duct range; use e.g. round:200..800mm or '
                                          "round:6..24in")
            system = unit
            low = parse_duct_size(lo.strip() + unit, units).width_m
            high = parse_duct_size(hi.strip(), units).width_m
        scale = 1000.0 if system == "mm" else 1 / 0.0254
        picked = [d for d in round_duct_sizes(system) if low - 1e-9 <= d <= high + 1e-9]
        if not picked:
            raise InputError("--ducts", f'no catalogue round duct in "{text}"')
        return [f"{d * scale:g}{system}" for d in picked]
    items = [x.strip() for x in text.split(",") if x.strip()]
    items = [x if x[-1:].isalpha() else x + ("in" if units == "us" else "mm") for x in items]
    if not items:
        raise InputError("--ducts", 'give duct sizes, e.g. "300x200mm, 600x400mm", round or round:200..800mm')
    try:
        kinds = {parse_duct_size(x, units).kind for x in items}
    except InputError as exc:
        raise InputError("--ducts", exc.message) from None
    if len(kinds) > 1:
        raise InputError("--ducts", "one table holds round or rectangular ducts, not both")
    return items


def duct_rows(spec, texts):
    """One duct section whose dimensions are (n, 1) arrays, a row per duct size text."""
    from . import model
    from .catalog.ducts import parse_duct_size

    sizes = [parse_duct_size(t) for t in texts]
    if len({s.kind for s in sizes}) > 1:
        raise InputError("--ducts", "one table holds round or rectangular ducts, not both")
    sheet = spec._sheet()
    wall = 0.0008 if spec.wall_m is None else spec.wall_m
    common = dict(wall_conductivity_w_mk=sheet.conductivity_w_mk, wall_material=f"{sheet.name} sheet",
                  bare_finish=sheet.bare_finish)
    label = f"ducts {texts[0]} to {texts[-1]}" if len(texts) > 1 else f"duct {texts[0]}"
    column = (len(sizes), 1)
    if sizes[0].kind == "round":
        return model.RoundDuct(np.reshape([s.diameter_m for s in sizes], column), wall, label=label, **common)
    return model.RectangularDuct(np.reshape([s.width_m for s in sizes], column),
                                 np.reshape([s.height_m for s in sizes], column), wall, label=label, **common)
