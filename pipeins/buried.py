"""Buried pipes: a single insulated pipe in soil, the soil as an outer resistance to the
ground surface temperature.

An isothermal cylinder of diameter D whose centre lies at depth z below an isothermal
ground surface (a semi-infinite medium of conductivity k_s) conducts, per metre,

    q = S · k_s · (T_casing − T_ground),   S = 2π / acosh(2z/D)    [per metre]

(the conduction shape factor of a cylinder parallel to a plane surface: Incropera et al.,
Fundamentals of Heat and Mass Transfer, (6th ed.), Table 4.1, case 2, from memory; the same as
``ht.conduction.S_isothermal_pipe_to_plane``).  The soil is thus a resistance
R_s = acosh(2z/D) / (2π k_s) [m·K/W] in series with the pipe wall and the insulation.  It
is solved by the ordinary solver as a fixed outer coefficient h = 1 / (R_s · π D) to the
ground temperature (no air film, no radiation), so every layer keeps its k(T).

Two pipes side by side (a supply and a return in one trench, centres a distance E apart
at the same depth z) influence each other: the heat one sheds warms the soil round the
other.  With each pipe's own resistance R_i (film, wall, insulation) and the soil's R_s as
above, the mutual resistance of the pair is, by superposing a line source with its image
in the ground surface (the zero-order multipole of Wallentén, 1991, from memory; the form
EN 13941 uses for single pipes in one trench),

    R_m = ln( sqrt(1 + (2z/E)²) ) / (2π k_s)

and the two heat flows follow from (q1, q2) = M⁻¹ (T1 − Tg, T2 − Tg) with
M = [[R_i1 + R_s, R_m], [R_m, R_i2 + R_s]]: :func:`twin_heat_flows`.  Pipes in one shared
casing (a twin pre-insulated pipe) are :mod:`pipeins.twin_casing` (the multipole method).
"""

from __future__ import annotations

import functools
import math
from dataclasses import dataclass, replace

import numpy as np

from .errors import InputError, closest_names
from .tables import read_table

__all__ = ["twin_heat_flows", "mutual_resistance_mk_w", "Soil", "lookup_soil", "list_soils", "shape_factor_per_m", "soil_resistance_mk_w",
           "BuriedLine", "buried_spec", "solve_buried", "SOIL_K_RANGE_W_MK",
           "soil_coefficient_w_m2k", "ground_spec", "check_buried"]

#: The soil conductivities taken as physical [W/(m·K)]: dry sand to saturated rock.
SOIL_K_RANGE_W_MK = (0.1, 5.0)


@dataclass(frozen=True)
class Soil:
    """A soil type of ``tables/soils.csv``: conductivity used and the source's range [W/(m·K)]."""

    key: str
    name: str
    conductivity_w_mk: float
    conductivity_low_w_mk: float
    conductivity_high_w_mk: float
    source: str


@functools.cache
def _soils() -> dict[str, Soil]:
    return {r["key"]: Soil(r["key"], r["name"], float(r["conductivity_w_mk"]), float(r["conductivity_low_w_mk"]),
                           float(r["conductivity_high_w_mk"]), r["source"]) for r in read_table("soils")}


def list_soils() -> list[Soil]:
    """Every soil type of the table."""
    return list(_soils().values())


def _norm(text: str) -> str:
    return " ".join(text.lower().replace("_", " ").replace("-", " ").replace(",", " ").split())


def lookup_soil(name: str) -> Soil:
    """The soil type named *name* (its key or name, case and punctuation ignored).

    >>> lookup_soil("moist sand").conductivity_w_mk
    1.5
    """
    wanted = _norm(name)
    for soil in _soils().values():
        if wanted in (_norm(soil.key), _norm(soil.name)):
            return soil
    names = [s.key.replace("_", " ") for s in _soils().values()]
    raise InputError("soil", f'unknown soil "{name}"; {closest_names(name, names)}')


def check_soil_k(k_w_mk: float) -> float:
    low, high = SOIL_K_RANGE_W_MK
    if not (np.isfinite(k_w_mk) and low <= k_w_mk <= high):
        raise InputError("soil_k_w_mk", f"the soil conductivity must be from {low:g} to {high:g} W/(m·K) "
                                        f"(got {k_w_mk:g})")
    return float(k_w_mk)


def shape_factor_per_m(depth_m, outer_diameter_m):
    """Conduction shape factor per metre of a cylinder at centre depth *depth_m* below an
    isothermal plane: 2π / acosh(2z/D) [–, per metre of pipe].

    >>> round(float(shape_factor_per_m(1.0, 0.2)), 4)
    2.0991
    """
    z, d = np.asarray(depth_m, dtype=float), np.asarray(outer_diameter_m, dtype=float)
    if np.any(z <= d / 2):
        raise InputError("depth_m", "the burial depth (to the pipe centre) must be more than the casing radius")
    return 2 * math.pi / np.arccosh(2 * z / d)


def soil_resistance_mk_w(depth_m, outer_diameter_m, soil_k_w_mk):
    """Resistance of the soil per metre of pipe, acosh(2z/D) / (2π k_s) [m·K/W]."""
    return 1.0 / (shape_factor_per_m(depth_m, outer_diameter_m) * soil_k_w_mk)


#: Where a trial build-up of a sizing search reaches the ground surface (casing radius at or
#: above the depth), the soil is taken as this thin: 2z/D held at 1 + CLAMP (a huge but finite
#: coefficient, so the search stays bracketed); a selected build-up there is refused.
CLAMP = 1e-9


def soil_coefficient_w_m2k(depth_m, outer_diameter_m, soil_k_w_mk, clamp: bool = False):
    """The soil as a fixed outer coefficient on the outer surface of diameter D [W/(m²·K)]:
    1 / (R_s · π D) with R_s = acosh(2z/D) / (2π k_s) (arrays broadcast).  With *clamp*, a
    build-up that reaches the ground surface (D/2 ≥ z, a trial of a sizing search) is taken
    at 2z/D = 1 + :data:`CLAMP` instead of refused.

    >>> round(float(soil_coefficient_w_m2k(1.0, 0.2, 1.5)), 4)
    5.0113
    """
    z, d = np.asarray(depth_m, dtype=float), np.asarray(outer_diameter_m, dtype=float)
    if clamp:
        z = np.maximum(z, 0.5 * d * (1.0 + CLAMP))
    s = shape_factor_per_m(z, d)
    r = 1.0 / (s * soil_k_w_mk)
    return 1.0 / (r * math.pi * d)


@dataclass(frozen=True)
class BuriedLine:
    """A buried line solved (SI): the inputs, the soil's part and the solved result."""

    depth_m: float
    soil_name: str
    soil_k_w_mk: float
    soil_source: str
    ground_temp_c: float
    casing_diameter_m: float
    shape_factor_per_m: float
    soil_resistance_mk_w: float
    soil_coefficient_w_m2k: float
    heat_flow_w_per_m: float
    casing_temp_c: float
    result: object = None

    def to_dict(self) -> dict:
        return {k: v for k, v in self.__dict__.items() if k != "result"}


def buried_spec(spec, depth_m: float, soil_k_w_mk: float, ground_temp_c: float):
    """*spec* (a :class:`~pipeins.line.LineSpec`) buried: its outer surface (the outermost
    layer, or the pipe when bare) loses heat to the ground temperature through the soil
    only, as a fixed outer coefficient 1/(R_s·π·D).  Returns (spec, D, S, R_s, h)."""
    check_soil_k(soil_k_w_mk)
    if spec.outer_h_w_m2k is not None:
        raise InputError("outer_h_w_m2k", "a buried line loses heat through the soil: leave out the fixed "
                                          "outer coefficient")
    if not (np.isfinite(depth_m) and depth_m > 0):
        raise InputError("depth_m", f"the burial depth must be greater than zero (got {depth_m:g} m)")
    pipe = spec.build_pipe()
    if np.ndim(pipe.outer_diameter_m) or any(np.ndim(t) for _, t in spec.layers):
        raise InputError("depth_m", "a buried line is solved for one pipe size and one build-up")
    diameter = float(pipe.outer_diameter_m) + 2 * sum(float(t) for _, t in spec.layers)
    if not depth_m > diameter / 2:
        raise InputError("depth_m", f"the burial depth {depth_m:g} m (to the pipe centre) must be more than the "
                                    f"casing radius {diameter / 2:g} m")
    s = float(shape_factor_per_m(depth_m, diameter))
    r = 1.0 / (s * soil_k_w_mk)
    h = float(soil_coefficient_w_m2k(depth_m, diameter, soil_k_w_mk))
    return replace(ground_spec(spec, ground_temp_c), outer_h_w_m2k=h), diameter, s, r, h


def ground_spec(spec, ground_temp_c: float):
    """*spec* in the ground: the ground surface temperature for the air, no wind, humidity,
    sun, radiant surroundings or finish (the soil's coefficient is set apart, per build-up)."""
    return replace(spec, air_temp_c=float(ground_temp_c), surroundings_temp_c=None, wind_m_s=0.0, rh_percent=None,
                   orientation="horizontal", height_m=None, finish=None, emittance=None, outer_h_w_m2k=None,
                   solar_w_m2=None, absorptance=None)


#: The criteria a buried line is sized for (a project service's names): touch and condensation
#: on the outer surface do not apply to a line in the soil; freeze holds and tracers are sized
#: for lines in air (pipeins.schedule_buried says so in a note).
SIZED_FOR = ("heat_flow", "heat_flux", "temp_change", "economic", "code")

#: The buried-line inputs (parameter names of :data:`pipeins.inputs.PARAMS`) besides the depth.
BURIED_INPUTS = ("soil", "soil_k_w_mk", "ground_temp_c", "twin_spacing_m", "return_temp_c", "casing_diameter_m",
                 "casing_insulation")


def check_buried(given: dict) -> list[tuple[str, str]]:
    """The rules between the buried-line inputs *given* (parameter → value, absent when not
    given): a list of (parameter, message), empty when all is well.  The soil type is looked
    up; the geometry against the pipe is checked where the line is built."""
    out = []
    has = lambda n: given.get(n) is not None  # noqa: E731
    if not has("depth_m"):
        for name in BURIED_INPUTS:
            if has(name):
                out.append((name, "is a buried-line input: give {depth_m} (the depth of the pipe centre) too"))
        return out
    if has("soil") and has("soil_k_w_mk"):
        out.append(("soil_k_w_mk", "give {soil} or {soil_k_w_mk}, not both"))
    elif not (has("soil") or has("soil_k_w_mk")):
        out.append(("depth_m", "a buried line needs the soil: give {soil} (a type) or {soil_k_w_mk}"))
    if has("soil"):
        try:
            lookup_soil(given["soil"])
        except InputError as exc:
            out.append(("soil", exc.message))
    if not has("ground_temp_c"):
        out.append(("depth_m", "a buried line needs the ground surface temperature: give {ground_temp_c}"))
    if has("twin_spacing_m") != has("return_temp_c"):
        missing = "return_temp_c" if has("twin_spacing_m") else "twin_spacing_m"
        other = "twin_spacing_m" if missing == "return_temp_c" else "return_temp_c"
        out.append((other, "two buried pipes need both {twin_spacing_m} (between the centres) and {return_temp_c}"))
    if has("casing_insulation") and not has("casing_diameter_m"):
        out.append(("casing_insulation", "is the insulation of a twin casing: give {casing_diameter_m} too"))
    if has("casing_diameter_m"):
        if not (has("twin_spacing_m") and has("return_temp_c")):
            out.append(("casing_diameter_m", "pipes in one casing need {twin_spacing_m} (between the centres) and "
                                             "{return_temp_c}"))
        if not given["depth_m"] > given["casing_diameter_m"] / 2:
            out.append(("depth_m", f"the burial depth {given['depth_m']:g} m (to the casing centre) must be more "
                                   f"than the casing radius {given['casing_diameter_m'] / 2:g} m"))
    return out


def solve_buried(spec, depth_m: float, ground_temp_c: float, soil_k_w_mk: float | None = None,
                 soil: str | None = None) -> BuriedLine:
    """Solve *spec* buried at centre depth *depth_m* [m] in a soil of conductivity
    *soil_k_w_mk* [W/(m·K)] or the soil type *soil* (``tables/soils.csv``), under a ground
    surface at *ground_temp_c* [°C]."""
    if (soil_k_w_mk is None) == (soil is None):
        raise InputError("soil_k_w_mk", "give the soil conductivity or a soil type, one of them")
    if soil is not None:
        found = lookup_soil(soil)
        k, name, source = found.conductivity_w_mk, found.name, found.source
    else:
        k, name, source = float(soil_k_w_mk), "given", "given"
    buried, diameter, s, r, h = buried_spec(spec, float(depth_m), k, float(ground_temp_c))
    result = buried.solve()
    return BuriedLine(float(depth_m), name, k, source, float(ground_temp_c), diameter, s, r, h,
                      float(np.ravel(result.heat_flow_w_per_m)[0]), float(np.ravel(result.surface_temp_c)[0]), result)


def mutual_resistance_mk_w(depth_m, spacing_m, soil_k_w_mk):
    """Mutual soil resistance of two pipes at centre depth z, centres E apart [m·K/W]:
    ln(sqrt(1 + (2z/E)²)) / (2π k_s) (a line source and its image in the ground surface)."""
    z, e = np.asarray(depth_m, dtype=float), np.asarray(spacing_m, dtype=float)
    return np.log(np.sqrt(1.0 + (2.0 * z / e) ** 2)) / (2 * math.pi * np.asarray(soil_k_w_mk, dtype=float))


def twin_heat_flows(r_own_mk_w, soil_r_mk_w, mutual_r_mk_w, delta_t_k):
    """Heat flows [W/m] of two pipes in one trench from their own and the soil's resistances.

    Parameters
    ----------
    r_own_mk_w : pair of float
        Each pipe's film, wall and insulation resistance [m·K/W].
    soil_r_mk_w : float
        The soil resistance of one pipe alone, acosh(2z/D)/(2π k_s) [m·K/W].
    mutual_r_mk_w : float
        :func:`mutual_resistance_mk_w` [m·K/W].
    delta_t_k : pair of float
        Each fluid's temperature above the ground surface [K].

    Returns
    -------
    tuple of float
        (q1, q2) [W/m], positive out of each fluid.

    >>> q1, q2 = twin_heat_flows((2.0, 2.0), 0.3, 0.1, (50.0, 50.0))
    >>> round(q1, 4) == round(50.0 / 2.4, 4)
    True
    """
    a, b = (float(r) + float(soil_r_mk_w) for r in r_own_mk_w)
    m = float(mutual_r_mk_w)
    det = a * b - m * m
    t1, t2 = (float(t) for t in delta_t_k)
    return (b * t1 - m * t2) / det, (a * t2 - m * t1) / det
