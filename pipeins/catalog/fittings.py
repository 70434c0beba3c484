"""Bare fittings (valves, flanges, strainers): their outer area, and as an equivalent length of bare pipe.

Two catalogues.  ``tables/fitting_areas.csv`` holds fittings as objects: valves (gate, globe,
ball, butterfly, check), strainers and flanged joints by size (DN or NPS) and pressure class
(PN16/PN40, class 150/300), each with its flange and face-to-face dimensions and its bare
outer area by :func:`bare_area_m2` (:func:`lookup_fitting`; solved with their own film by
:mod:`pipeins.fittings`).  ``tables/fitting_lengths.csv`` keeps the older shortcut the
schedule and ``cost --valves N`` use: for each kind, bands of pipe outside diameter, each
with the length of bare pipe of that size that loses the same heat as one uninsulated
fitting (:func:`equivalent_length_m`).
"""

from __future__ import annotations

import functools
from dataclasses import dataclass

from pipeins.errors import near_hint
from pipeins.errors import InputError
from pipeins.tables import read_table

__all__ = ["equivalent_length_m", "fitting_kinds", "Fitting", "lookup_fitting", "list_fittings",
           "bare_area_m2", "FITTING_KINDS", "VALVE_KINDS", "CLASSES", "TOP_WORKS_FACTOR"]


@functools.cache
def _bands() -> dict[str, tuple[tuple[float, ...], tuple[float, ...], str]]:
    grouped: dict[str, list[tuple[float, float, str]]] = {}
    for row in read_table("fitting_lengths"):
        grouped.setdefault(row["fitting"], []).append(
            (float(row["max_outer_diameter_mm"]) / 1000.0, float(row["equivalent_length_m"]),
             row["source"]))
    out = {}
    for kind, rows in grouped.items():
        rows.sort()
        out[kind] = (tuple(r[0] for r in rows), tuple(r[1] for r in rows),
                     "; ".join(dict.fromkeys(r[2] for r in rows)))
    return out


def fitting_kinds() -> list[str]:
    """Fitting kinds in the table.

    Examples
    --------
    >>> fitting_kinds()
    ['valve', 'flange', 'strainer']
    """
    return list(_bands())


def equivalent_length_m(fitting: str, outer_diameter_m):
    """Length of bare pipe [m] that loses as much heat as one bare *fitting*.

    Step lookup: the band is the first whose upper outside diameter is at least
    *outer_diameter_m*; no interpolation between bands. Rounded figures of common
    practice (see the table's source column).

    Parameters
    ----------
    fitting : {"valve", "flange", "strainer"}
    outer_diameter_m : float or array_like
        Pipe outside diameter [m], above 0 and within the largest band.

    Returns
    -------
    numpy.ndarray
        Equivalent length [m], shape of *outer_diameter_m* (0-d for a scalar).

    Raises
    ------
    InputError
        ``--fitting`` for an unknown kind, ``--outer-diameter`` outside the table.

    Examples
    --------
    >>> float(equivalent_length_m("valve", 0.1143))
    1.5
    >>> equivalent_length_m("flange", [0.0603, 0.3239]).tolist()
    [0.4, 0.9]
    """
    import numpy as np

    bands = _bands()
    if fitting not in bands:
        raise InputError("--fitting", f'unknown fitting "{fitting}"; '
                                      f"{near_hint(str(fitting), list(bands))}")
    upper_m, length_m, _ = bands[fitting]
    d = np.asarray(outer_diameter_m, dtype=float)
    if not np.all(np.isfinite(d)) or np.any(d <= 0.0) or np.any(d > upper_m[-1]):
        raise InputError("--outer-diameter", f"outside diameter must be above 0 and at most "
                                             f"{upper_m[-1] * 1000:g} mm for fitting lengths")
    index = np.searchsorted(np.asarray(upper_m), d, side="left")
    return np.asarray(length_m)[index]


# --------------------------------------------------------------------------- fittings as objects
#: Fitting kinds of ``tables/fitting_areas.csv``: the valves, then strainers and flanged joints.
VALVE_KINDS = ("gate", "globe", "ball", "butterfly", "check")
FITTING_KINDS = VALVE_KINDS + ("strainer", "flange")
#: Height of a fitting's top works (bonnet and yoke, cover, stem neck, screen leg) as a multiple
#: of its flange outside diameter: rough proportions of the pipeins fitting model (from memory).
TOP_WORKS_FACTOR = {"gate": 1.0, "globe": 0.8, "ball": 0.3, "butterfly": 0.3, "check": 0.3, "strainer": 0.8}
#: Pressure classes by system: ASME (NPS sizes) and EN (DN sizes); the first is the default.
CLASSES = {"asme": ("class 150", "class 300"), "en": ("PN16", "PN40")}


def bare_area_m2(kind: str, pipe_od_m: float, flange_od_m: float, flange_thickness_m: float,
                 face_to_face_m: float | None = None) -> float:
    """Bare outer area of one fitting [m²] by the pipeins fitting model.

    A flanged joint is two flanges bolted face to face: both back faces (annuli from the
    pipe to the flange outside diameter D) and both rims, A_j = 2·π/4·(D² − d²) + π·D·2b.
    A flanged valve or strainer is its two end joints (each its own end flange and the
    mating pipe flange), a body between them, a cylinder of the mean diameter
    D_b = (D + d)/2 over the face-to-face length less its two flanges (F − 2b), and its top
    works, a cylinder of D_b and height f·D with its top (f from :data:`TOP_WORKS_FACTOR`).
    A wafer butterfly valve sits between two pipe flanges held F apart: their backs and
    rims, the flange faces outside the wafer, the wafer rim π·D_b·F and its neck.  Bolts,
    hubs and handwheels are left out.

    Parameters
    ----------
    kind : str
        One of :data:`FITTING_KINDS`.
    pipe_od_m, flange_od_m, flange_thickness_m : float
        Pipe outside diameter d, flange outside diameter D and flange thickness b [m].
    face_to_face_m : float, optional
        Face-to-face length F of a valve or strainer [m] (none for a flanged joint).

    Examples
    --------
    >>> round(bare_area_m2("flange", 0.0603, 0.1524, 0.01905), 4)   # NPS 2 class 150 joint
    0.049
    """
    import math

    d, big, b = pipe_od_m, flange_od_m, flange_thickness_m
    backs = 2 * math.pi / 4 * (big**2 - d**2)
    joint = backs + math.pi * big * 2 * b
    if kind == "flange":
        return joint
    body = 0.5 * (big + d)
    top = math.pi * body * TOP_WORKS_FACTOR[kind] * big + math.pi / 4 * body**2
    if kind == "butterfly":
        return joint + 2 * math.pi / 4 * (big**2 - body**2) + math.pi * body * face_to_face_m + top
    return 2 * joint + math.pi * body * (face_to_face_m - 2 * b) + top


@dataclass(frozen=True)
class Fitting:
    """One catalogue fitting (SI).

    Attributes
    ----------
    kind : str
        One of :data:`FITTING_KINDS`.
    size : str
        Its size as the catalogue names it (``"NPS 2"``, ``"DN50"``).
    pressure_class : str
        ``"class 150"``, ``"class 300"``, ``"PN16"`` or ``"PN40"``.
    pipe_od_m, flange_od_m, flange_thickness_m, face_to_face_m : float
        Pipe and flange outside diameters, flange thickness, face-to-face length [m]
        (``face_to_face_m`` None for a flanged joint).
    area_m2 : float
        Bare outer area [m²].
    source : str
        Where the dimensions come from.
    """

    kind: str
    size: str
    pressure_class: str
    pipe_od_m: float
    flange_od_m: float
    flange_thickness_m: float
    face_to_face_m: float | None
    area_m2: float
    source: str

    @property
    def label(self) -> str:
        """``"gate valve NPS 2 class 150"``, ``"flanged joint DN50 PN16"``."""
        what = {"flange": "flanged joint", "strainer": "strainer"}.get(self.kind, f"{self.kind} valve")
        return f"{what} {self.size} {self.pressure_class}"


@functools.cache
def _fittings() -> dict[tuple[str, str, str], Fitting]:
    out = {}
    for row in read_table("fitting_areas"):
        ftf = row["face_to_face_mm"]
        fit = Fitting(row["kind"], row["size"], row["pressure_class"], float(row["pipe_od_mm"]) / 1000,
                      float(row["flange_od_mm"]) / 1000, float(row["flange_thickness_mm"]) / 1000,
                      float(ftf) / 1000 if ftf else None, float(row["area_m2"]), row["source"])
        out[(fit.kind, fit.size, fit.pressure_class)] = fit
        if row["nps"] and row["size"].startswith("DN"):
            out.setdefault((fit.kind, f"NPS {row['nps']}", fit.pressure_class), fit)
        if row["dn"] and row["size"].startswith("NPS"):
            out.setdefault((fit.kind, f"DN{row['dn']}", fit.pressure_class), fit)
    return out


def _pressure_class(text: str, option: str) -> str:
    """``"PN16"``, ``"class 150"`` from what the user wrote (``pn 16``, ``150``, ``CL150``, ``#300``)."""
    import re

    t = str(text).strip().lower().replace(" ", "")
    m = re.fullmatch(r"pn(\d+)", t)
    if m:
        return f"PN{int(m.group(1))}"
    m = re.fullmatch(r"(?:class|cl|#)?(\d+)(?:#|lb)?", t)
    if m:
        return f"class {int(m.group(1))}"
    raise InputError(option, f'unknown pressure class "{str(text).strip()}"; known: '
                             f"{', '.join(CLASSES['asme'] + CLASSES['en'])}")


def lookup_fitting(kind: str, size: str, pressure_class: str | None = None, option: str = "--valve") -> Fitting:
    """The catalogue fitting *kind* of *size* and *pressure_class*.

    Parameters
    ----------
    kind : str
        One of :data:`FITTING_KINDS` (case-insensitive).
    size : str
        ``"NPS 2"``, ``"DN50"`` (read as pipe sizes are, :func:`pipeins.catalog.pipes.lookup_pipe`).
    pressure_class : str, optional
        ``"PN16"``, ``"PN40"``, ``"150"``/``"class 150"``, ``"300"``; default class 150 for an
        NPS size, PN16 for a DN size.  A DN size of an ASME class takes the NPS row of that
        nominal size (DN50 class 150 = NPS 2 class 150), and the other way round.
    option : str
        The input named in errors.

    Raises
    ------
    InputError
        *option* for an unknown kind, size or class, naming what is allowed.

    Examples
    --------
    >>> f = lookup_fitting("gate", "NPS 2")
    >>> f.label, round(f.face_to_face_m * 1000, 1), round(f.area_m2, 4)
    ('gate valve NPS 2 class 150', 177.8, 0.2044)
    >>> lookup_fitting("flange", "dn 50", "pn40").label
    'flanged joint DN50 PN40'
    """
    from .pipes import lookup_pipe

    k = str(kind).strip().lower()
    if k not in FITTING_KINDS:
        raise InputError(option, f'unknown fitting kind "{str(kind).strip()}"; known: {", ".join(FITTING_KINDS)}')
    try:
        label = lookup_pipe(str(size)).label
    except InputError:
        label = str(size).strip()
    if pressure_class is None or not str(pressure_class).strip():
        cls = CLASSES["en" if label.startswith("DN") else "asme"][0]
    else:
        cls = _pressure_class(pressure_class, option)
    known = _fittings()
    classes = sorted({c for (kk, _, c) in known if kk == k}, key=lambda c: (c.startswith("class"), c))
    if cls not in classes:
        raise InputError(option, f'no pressure class "{cls}" for {k}; known: {", ".join(classes)}')
    fit = known.get((k, label, cls))
    if fit is None:
        sizes = [s for (kk, s, c) in known if kk == k and c == cls and s.startswith(label[:2])]
        raise InputError(option, f'no {k} of size "{str(size).strip()}" in {cls} in the catalogue '
                                 f"(tables/fitting_areas.csv); sizes: {', '.join(sizes)}")
    return fit


def list_fittings() -> list[Fitting]:
    """Every catalogue fitting, in table order (each row once)."""
    return list(dict.fromkeys(_fittings().values()))
