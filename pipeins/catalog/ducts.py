"""Ducts: size text, round-duct nominal diameters, sheet-metal walls and gauges.

* :func:`parse_duct_size` reads what a user writes for a duct — ``600x400mm``,
  ``600 x 400 mm``, ``24x16in``, ``450mm``, ``18in`` — into a :class:`DuctSize`
  (round or rectangular, sides in metres).
* :func:`round_duct_sizes` lists the commonly made round-duct diameters of
  ``tables/duct_round_sizes.csv`` (our own list; common practice, from memory).
* :func:`installed_wrap` gives the installed thickness and R-value of a blanket duct wrap
  from its nominal thickness (25 % compression, common practice; the user may say otherwise).
* :func:`lookup_sheet` gives a sheet-metal wall material of ``tables/duct_sheet.csv``
  (galvanised steel, aluminium, stainless steel) and :func:`gauge_thickness_m` the
  nominal thickness of a galvanised sheet gauge (from memory).

Aspect ratio
------------
A rectangular duct is solved as four faces (top, two sides, bottom), each with its own
outer film and its width (the corners by the mean-width rule of the strip shape,
:mod:`pipeins.geometry.strip`); the laminar inner film uses the fully developed
rectangular-duct values of Shah and London, which the usual tables give from a square to
1:8 (Incropera et al., 6th ed., Table 8.1).  :data:`MAX_ASPECT_RATIO` = 8 (long side at
most eight times the short side) is therefore the limit of the duct model; duct
construction practice rarely goes beyond 1:4 (common practice).  A flatter section is
refused with that reason: model it as flat faces instead.
"""

from __future__ import annotations

import functools
import math
import re
from dataclasses import dataclass

from pipeins.errors import InputError, near_hint
from pipeins.tables import read_table

__all__ = ["DuctSize", "SheetMaterial", "MAX_ASPECT_RATIO", "parse_duct_size", "round_duct_sizes",
           "lookup_sheet", "gauge_thickness_m", "list_gauges", "DEFAULT_SHEET",
           "WRAP_COMPRESSION_PERCENT", "WrapThickness", "installed_wrap", "nominal_wrap_thickness_m"]

#: Largest long-side / short-side ratio of a rectangular duct the per-face model takes
#: (see the module notes: the laminar inner-film values are tabulated to 1:8).
MAX_ASPECT_RATIO = 8.0
#: Sheet material assumed when none is given.
DEFAULT_SHEET = "galvanised_steel"
_INCH_M = 0.0254
_OPTION = "--duct"
_EXAMPLES = "600x400mm, 24x16in, 450mm or 18in"
_CROSS_RE = re.compile(r"\s*[x×X*]\s*")


@dataclass(frozen=True)
class DuctSize:
    """A duct cross-section.

    Attributes
    ----------
    kind : {"round", "rectangular"}
    width_m : float
        Width [m] (the horizontal side of a rectangular duct, first in ``600x400mm``);
        the diameter of a round duct.
    height_m : float
        Height [m] (the vertical side, second in ``600x400mm``); the diameter of a
        round duct.
    text : str
        What the user wrote.
    """

    kind: str
    width_m: float
    height_m: float
    text: str = ""

    @property
    def diameter_m(self) -> float:
        """Diameter of a round duct [m] (nan for a rectangular one)."""
        return self.width_m if self.kind == "round" else math.nan

    @property
    def aspect_ratio(self) -> float:
        """Long side / short side [-] (1 for a round duct)."""
        return max(self.width_m, self.height_m) / min(self.width_m, self.height_m)

    @property
    def area_m2(self) -> float:
        """Inside cross-section area [m²]."""
        if self.kind == "round":
            return math.pi * self.width_m**2 / 4.0
        return self.width_m * self.height_m

    @property
    def perimeter_m(self) -> float:
        """Inside perimeter [m]."""
        if self.kind == "round":
            return math.pi * self.width_m
        return 2.0 * (self.width_m + self.height_m)

    @property
    def hydraulic_diameter_m(self) -> float:
        """Hydraulic diameter D_h = 4A/P [m] (the diameter of a round duct)."""
        return 4.0 * self.area_m2 / self.perimeter_m


def _side(text: str, unit: str, units: str, shown: str) -> float:
    """One side [m]: *text* a number, *unit* the unit written after it or after the last side."""
    from pipeins.units import parse_quantity

    try:
        value = parse_quantity(text + unit, "diameter", _OPTION, units, what="a duct side")
    except InputError as exc:
        if "not a finite" in exc.message:
            raise InputError(_OPTION, f'"{shown}": every duct side must be a finite number; use e.g. {_EXAMPLES}') from None
        if "cannot read" not in exc.message:
            raise
        raise InputError(_OPTION, f'"{shown}": unknown length unit "{unit}"; write the sides in mm, cm, m, '
                                  f"in or ft, e.g. {_EXAMPLES}") from None
    if not value > 0:
        raise InputError(_OPTION, f'"{shown}": every duct side must be greater than zero; use e.g. {_EXAMPLES}')
    return value


_PART_RE = re.compile(r"^\s*([-+]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][-+]?\d+)?)\s*([A-Za-z\"']*)\s*$")


def parse_duct_size(text, units: str = "si") -> DuctSize:
    """Read a duct size: ``WIDTHxHEIGHT[unit]`` (rectangular) or ``DIAMETER[unit]`` (round).

    Parameters
    ----------
    text : str
        E.g. ``"600x400mm"``, ``"600 x 400 mm"``, ``"24x16in"``, ``"0.6x0.4m"``,
        ``"600mm x 400mm"``, ``"450mm"``, ``"18in"``.  ``x``, ``X``, ``×`` or ``*`` separate
        the width (first) from the height.  A unit written once, after the last number,
        applies to both sides; a bare number is read in the unit system's diameter unit
        (mm for ``si``, inches for ``us``), as every bare size in pipeins.
    units : {"si", "us"}
        Unit system of bare numbers.

    Returns
    -------
    DuctSize
        Sides in metres.

    Raises
    ------
    InputError
        ``--duct``: empty or unreadable text, an unknown unit, a side zero or negative,
        more than two sides, or a rectangular section flatter than 1:8
        (:data:`MAX_ASPECT_RATIO`, the limit of the per-face model).

    Examples
    --------
    >>> parse_duct_size("600x400mm")
    DuctSize(kind='rectangular', width_m=0.6, height_m=0.4, text='600x400mm')
    >>> size = parse_duct_size("24x16in")
    >>> round(size.width_m, 4), round(size.height_m, 4), round(size.hydraulic_diameter_m, 4)
    (0.6096, 0.4064, 0.4877)
    >>> parse_duct_size("450 mm").kind, parse_duct_size("18in").diameter_m
    ('round', 0.4572)
    >>> parse_duct_size("900x100mm")
    Traceback (most recent call last):
    ...
    pipeins.errors.InputError: --duct: "900x100mm" has sides 9:1; the per-face duct model takes at most 1:8 (its laminar inner-film values are tabulated to 1:8; ducts are rarely made flatter than 1:4); model it as flat faces
    """
    shown = "" if text is None else str(text).strip()
    if not shown:
        raise InputError(_OPTION, f"the duct size is missing; use e.g. {_EXAMPLES}")
    from pipeins.errors import one_line

    shown_safe = one_line(shown if len(shown) <= 60 else shown[:59] + "…")
    parts = _CROSS_RE.split(shown)
    if len(parts) > 2:
        raise InputError(_OPTION, f'"{shown_safe}" has more than two sides; use e.g. {_EXAMPLES}')
    matches = [_PART_RE.match(p) for p in parts]
    if any(m is None for m in matches):
        raise InputError(_OPTION, f'cannot read "{shown_safe}" as a duct size; use e.g. {_EXAMPLES}')
    last_unit = matches[-1].group(2)
    sides = []
    for m in matches:
        unit = m.group(2) or last_unit
        sides.append(_side(m.group(1), unit, units, shown_safe))
    if len(sides) == 1:
        return DuctSize("round", sides[0], sides[0], shown)
    width, height = sides
    size = DuctSize("rectangular", width, height, shown)
    if size.aspect_ratio > MAX_ASPECT_RATIO * (1 + 1e-12):
        ratio = f"{size.aspect_ratio:.3g}"
        raise InputError(_OPTION, f'"{shown_safe}" has sides {ratio}:1; the per-face duct model takes at most '
                                  f"1:{MAX_ASPECT_RATIO:g} (its laminar inner-film values are tabulated to 1:{MAX_ASPECT_RATIO:g}; "
                                  f"ducts are rarely made flatter than 1:4); model it as flat faces")
    return size


@functools.cache
def _round_sizes() -> dict[str, tuple[float, ...]]:
    out: dict[str, list[float]] = {"mm": [], "in": []}
    for row in read_table("duct_round_sizes"):
        out[row["system"]].append(float(row["diameter"]))
    return {k: tuple(sorted(v)) for k, v in out.items()}


def round_duct_sizes(system: str = "mm") -> tuple[float, ...]:
    """Commonly made round-duct nominal diameters [m], smallest first.

    Parameters
    ----------
    system : {"mm", "in", "si", "us"}
        The metric list (``mm``/``si``) or the inch list (``in``/``us``).

    Returns
    -------
    tuple of float
        Diameters in metres (common practice, from memory; see ``tables/duct_round_sizes.csv``).

    Examples
    --------
    >>> [round(d * 1000) for d in round_duct_sizes("mm")[:4]]
    [80, 100, 125, 150]
    >>> round(round_duct_sizes("in")[0] / 0.0254, 6)
    3.0
    """
    key = {"mm": "mm", "si": "mm", "in": "in", "us": "in"}.get(str(system).strip().lower())
    if key is None:
        raise InputError("system", f'unknown duct size list "{system}"; use "mm" or "in"')
    factor = 1e-3 if key == "mm" else _INCH_M
    return tuple(round(d * factor, 12) for d in _round_sizes()[key])


@dataclass(frozen=True)
class SheetMaterial:
    """A duct sheet-metal wall material.

    Attributes
    ----------
    key, name : str
    conductivity_w_mk : float
        Thermal conductivity [W/(m·K)].
    density_kg_m3 : float
        Density [kg/m³].
    heat_capacity_j_kgk : float
        Specific heat capacity [J/(kg·K)].
    bare_finish : str
        Key of ``tables/finishes.csv`` giving the bare duct's emittance as installed.
    surface_kind : str
        Touch-limit kind of the bare duct.
    source : str
    """

    key: str
    name: str
    conductivity_w_mk: float
    density_kg_m3: float
    heat_capacity_j_kgk: float
    bare_finish: str
    surface_kind: str
    source: str


@functools.cache
def _sheets() -> dict[str, SheetMaterial]:
    return {
        row["key"]: SheetMaterial(row["key"], row["name"], float(row["conductivity_w_mk"]),
                                  float(row["density_kg_m3"]), float(row["heat_capacity_j_kgk"]),
                                  row["bare_finish"], row["surface_kind"], row["source"])
        for row in read_table("duct_sheet") if row["kind"] == "material"
    }


@functools.cache
def _gauges() -> dict[int, float]:
    return {int(row["key"]): float(row["thickness_in"]) * _INCH_M
            for row in read_table("duct_sheet") if row["kind"] == "gauge"}


def lookup_sheet(name: str = DEFAULT_SHEET) -> SheetMaterial:
    """The duct sheet material named *name* (key or name; US spellings accepted).

    Raises
    ------
    InputError
        ``duct_material`` for an unknown name, with the closest names.

    Examples
    --------
    >>> lookup_sheet("galvanized steel").conductivity_w_mk
    50.0
    >>> lookup_sheet("Aluminum").key
    'aluminium'
    """
    from .aliases import canonical_words

    wanted = canonical_words(str(name).strip().replace("_", " "))
    for key, item in _sheets().items():
        if wanted in (canonical_words(key.replace("_", " ")), canonical_words(item.name)):
            return item
    names = [item.name for item in _sheets().values()]
    raise InputError("duct_material", f'unknown duct sheet material "{str(name).strip()}"; {near_hint(wanted, names)}')


def gauge_thickness_m(gauge, material: str = DEFAULT_SHEET) -> float:
    """Nominal sheet thickness [m] of a galvanised sheet gauge number.

    Parameters
    ----------
    gauge : int or str
        Gauge number, 10 to 30 (even numbers), e.g. ``24`` or ``"24 ga"``.
    material : str
        The sheet material; gauge numbers are listed for galvanised steel only (aluminium
        and stainless sheet use other gauge tables: give their thickness instead).

    Returns
    -------
    float
        Thickness [m] (from memory; ``tables/duct_sheet.csv``).

    Raises
    ------
    InputError
        ``duct_gauge`` for a gauge not listed or a material other than galvanised steel.

    Examples
    --------
    >>> round(gauge_thickness_m(24) * 1000, 3)
    0.701
    >>> round(gauge_thickness_m("26 ga") / 0.0254, 4)
    0.0217
    """
    if lookup_sheet(material).key != "galvanised_steel":
        raise InputError("duct_gauge", "gauge numbers are listed for galvanised steel only; "
                                       "give the sheet thickness instead (e.g. 0.8mm)")
    text = str(gauge).strip().lower()
    for suffix in ("gauge", "gage", "ga", "g"):
        if text.endswith(suffix):
            text = text[: -len(suffix)].strip()
            break
    known = _gauges()
    listed = ", ".join(str(g) for g in sorted(known))
    try:
        number = float(text)
    except ValueError:
        raise InputError("duct_gauge", f'cannot read "{str(gauge).strip()}" as a gauge number; listed: {listed}') from None
    if not number.is_integer() or int(number) not in known:
        raise InputError("duct_gauge", f'gauge "{str(gauge).strip()}" is not listed; listed: {listed}')
    return known[int(number)]


def list_gauges() -> tuple[tuple[int, float], ...]:
    """Every listed galvanised gauge as (gauge number, thickness [m]), thinnest first.

    >>> list_gauges()[0][0]
    30
    """
    return tuple(sorted(_gauges().items(), key=lambda item: item[1]))


# --------------------------------------------------------------------------- duct wrap

#: Compression assumed for a blanket duct wrap as installed [%]: the trade rates duct wrap at
#: its thickness compressed by 25 % (at the corners and overall, by the banding and the sag
#: of the blanket), and labels the installed R-value at that compression (common practice).
WRAP_COMPRESSION_PERCENT = 25.0


@dataclass(frozen=True)
class WrapThickness:
    """A blanket duct wrap, nominal and as installed.

    Attributes
    ----------
    nominal_thickness_m, installed_thickness_m : numpy.ndarray
        Thickness as sold and as installed [m].
    compression_percent : float
        The compression allowed for [%].
    nominal_r_m2k_w, installed_r_m2k_w : numpy.ndarray or None
        Thermal resistance of a flat layer of each thickness, t/k [m²·K/W]; None when no
        conductivity was given.
    """

    nominal_thickness_m: object
    installed_thickness_m: object
    compression_percent: float
    nominal_r_m2k_w: object = None
    installed_r_m2k_w: object = None


def installed_wrap(nominal_thickness_m, conductivity_w_mk=None,
                   compression_percent: float = WRAP_COMPRESSION_PERCENT) -> WrapThickness:
    """Installed thickness and R-value of a blanket duct wrap, from its nominal thickness.

    t_installed = t_nominal · (1 − c/100); R = t/k for a flat layer, both beside each other.
    The conductivity is held at the uncompressed value: compressing a light glass-fibre
    blanket lowers its k a little, so the installed R given here is on the low (safe) side.
    Boards and rigid liners are not compressed (pass ``compression_percent=0``).

    Parameters
    ----------
    nominal_thickness_m : float or array_like
        Thickness as sold [m], greater than 0.
    conductivity_w_mk : float or array_like, optional
        Conductivity of the blanket at the mean temperature [W/(m·K)], for the R-values.
    compression_percent : float
        Compression allowed for [%], 0 to below 100; default
        :data:`WRAP_COMPRESSION_PERCENT` = 25 % (common practice).

    Returns
    -------
    WrapThickness

    Raises
    ------
    InputError
        ``wrap_compression_percent`` outside 0 to below 100 %; ``thickness_m`` or
        ``conductivity_w_mk`` not greater than 0.

    Examples
    --------
    A 2 in (50.8 mm) wrap with k = 0.040 W/(m·K): 38.1 mm installed, R 1.27 → 0.952 m²·K/W.

    >>> wrap = installed_wrap(0.0508, 0.040)
    >>> round(float(wrap.installed_thickness_m) * 1000, 1), round(float(wrap.nominal_r_m2k_w), 2), round(float(wrap.installed_r_m2k_w), 3)
    (38.1, 1.27, 0.952)
    """
    import numpy as np

    percent = float(compression_percent)
    if not (math.isfinite(percent) and 0.0 <= percent < 100.0):
        raise InputError("wrap_compression_percent",
                         f"{percent:g} % is outside 0 to below 100 %; the trade commonly allows "
                         f"{WRAP_COMPRESSION_PERCENT:g} % for blanket wrap, 0 for board")
    nominal = np.asarray(nominal_thickness_m, dtype=float)
    if not np.all(np.isfinite(nominal) & (nominal > 0)):
        raise InputError("thickness_m", "the wrap thickness must be greater than zero")
    installed = nominal * (1.0 - percent / 100.0)
    if conductivity_w_mk is None:
        return WrapThickness(nominal, installed, percent)
    k = np.asarray(conductivity_w_mk, dtype=float)
    if not np.all(np.isfinite(k) & (k > 0)):
        raise InputError("conductivity_w_mk", "the wrap conductivity must be greater than zero")
    return WrapThickness(nominal, installed, percent, nominal / k, installed / k)


def nominal_wrap_thickness_m(installed_thickness_m, compression_percent: float = WRAP_COMPRESSION_PERCENT):
    """Nominal wrap thickness [m] that gives *installed_thickness_m* [m] after compression [%].

    The inverse of :func:`installed_wrap`: t_nominal = t_installed / (1 − c/100).

    >>> round(float(nominal_wrap_thickness_m(0.0381)) * 1000, 1)
    50.8
    """
    import numpy as np

    installed_wrap(1.0, compression_percent=compression_percent)  # checks the percentage
    return np.asarray(installed_thickness_m, dtype=float) / (1.0 - float(compression_percent) / 100.0)
