"""Insulation materials (conductivity against mean temperature) and pipe wall materials.

Insulation materials come from ``tables/insulation_materials.csv`` (one row per material and
mean temperature); wall materials from ``tables/wall_materials.csv``. Names are matched
case-insensitively, with spaces, underscores and hyphens treated alike, against the key
(``glass_wool`` = ``"glass wool"``) or the full name (``"glass wool pipe section"``).
A layer may also be given as a constant conductivity, ``"k=0.040"`` [W/(m·K)].
"""

from __future__ import annotations

import functools
import math
import re
from dataclasses import dataclass

from pipeins.errors import InputError, near_hint
from pipeins.tables import read_table

__all__ = [
    "InsulationMaterial",
    "WallMaterial",
    "lookup_material",
    "lookup_wall_material",
    "default_wall_material",
    "list_materials",
    "MAX_CONSTANT_CONDUCTIVITY_W_MK",
]

#: Largest conductivity accepted for a ``k=`` layer [W/(m·K)]; above it the "insulation"
#: is no insulation and the input is almost certainly a unit mistake.
MAX_CONSTANT_CONDUCTIVITY_W_MK = 5.0


@dataclass(frozen=True)
class InsulationMaterial:
    """An insulation material.

    Attributes
    ----------
    key : str
        Catalogue key, e.g. ``"mineral_wool"``, or ``"k=0.040"`` for a constant-k layer.
    name : str
        Readable name.
    family : str
        Product family; selects the thickness series (``pipe_section``, ``elastomeric``,
        ``block``, ``blanket``, ``aerogel``, or ``generic`` for a ``k=`` layer).
    points : tuple of (float, float)
        ``(mean_temp_c, conductivity_w_mk)`` pairs, sorted by temperature [°C, W/(m·K)].
    min_temp_c, max_temp_c : float
        Service temperature limits [°C].
    density_kg_m3 : float
        Density [kg/m³] (nan for a ``k=`` layer).
    source : str
        Where the numbers come from.
    compression_percent : float
        The thickness a blanket wrap loses as installed [%] (duct wrap: 25 %, common
        practice); 0 for everything else.  A layer of a wrap is given and sold by its
        nominal thickness and solved at its installed one (:attr:`installed_fraction`).
    """

    key: str
    name: str
    family: str
    points: tuple[tuple[float, float], ...]
    min_temp_c: float
    max_temp_c: float
    density_kg_m3: float
    source: str
    compression_percent: float = 0.0

    @property
    def is_wrap(self) -> bool:
        """Whether the material is a wrap compressed as installed (catalogue flag)."""
        return self.compression_percent > 0

    @property
    def installed_fraction(self) -> float:
        """Installed thickness over nominal thickness: 1 − compression/100 (1 for all but a wrap)."""
        return 1.0 - self.compression_percent / 100.0

    def installed_thickness_m(self, nominal_thickness_m):
        """Installed thickness [m] of a layer sold as *nominal_thickness_m* [m]."""
        if not self.is_wrap:
            return nominal_thickness_m
        import numpy as np

        return np.asarray(nominal_thickness_m, dtype=float) * self.installed_fraction

    def nominal_thickness_m(self, installed_thickness_m):
        """Nominal thickness [m] of a layer installed as *installed_thickness_m* [m] (to 0.1 µm)."""
        if not self.is_wrap:
            return installed_thickness_m
        import numpy as np

        return np.round(np.asarray(installed_thickness_m, dtype=float) / self.installed_fraction, 7)


@dataclass(frozen=True)
class WallMaterial:
    """A pipe wall material near room temperature.

    Attributes
    ----------
    key, name : str
    conductivity_w_mk : float
        Thermal conductivity [W/(m·K)].
    density_kg_m3 : float
        Density [kg/m³].
    heat_capacity_j_kgk : float
        Specific heat capacity [J/(kg·K)].
    source : str
    bare_finish : str
        Key of the finish (``tables/finishes.csv``) whose emittance the bare pipe of this
        material has as installed (see :mod:`pipeins.bare`).
    surface_kind : str
        Touch-limit kind of the bare pipe (``bare_metal`` or ``non_metallic``).
    """

    key: str
    name: str
    conductivity_w_mk: float
    density_kg_m3: float
    heat_capacity_j_kgk: float
    source: str
    bare_finish: str = "steel_oxidised"
    surface_kind: str = "bare_metal"


def _norm(text: str) -> str:
    from .aliases import canonical_words  # US spellings and trade words (aluminum, fiberglass)

    return canonical_words(text)


@functools.cache
def _insulation() -> dict[str, InsulationMaterial]:
    grouped: dict[str, list[dict]] = {}
    for row in read_table("insulation_materials"):
        grouped.setdefault(row["key"], []).append(row)
    out = {}
    for key, rows in grouped.items():
        first = rows[0]
        points = tuple(sorted((float(r["mean_temp_c"]), float(r["conductivity_w_mk"])) for r in rows))
        sources = list(dict.fromkeys(r["source"] for r in rows))
        out[key] = InsulationMaterial(
            key=key,
            name=first["name"],
            family=first["family"],
            points=points,
            min_temp_c=float(first["min_temp_c"]),
            max_temp_c=float(first["max_temp_c"]),
            density_kg_m3=float(first["density_kg_m3"]),
            source="; ".join(sources),
            compression_percent=float(first.get("compression_percent") or 0.0),
        )
    return out


@functools.cache
def _walls() -> dict[str, WallMaterial]:
    return {
        row["key"]: WallMaterial(
            key=row["key"],
            name=row["name"],
            conductivity_w_mk=float(row["conductivity_w_mk"]),
            density_kg_m3=float(row["density_kg_m3"]),
            heat_capacity_j_kgk=float(row["heat_capacity_j_kgk"]),
            source=row["source"],
            bare_finish=row["bare_finish"],
            surface_kind=row["surface_kind"],
        )
        for row in read_table("wall_materials")
    }


def _match(spec: str, catalogue: dict) -> object | None:
    """By key or name; else by the leading words of one name only ("flexible elastomeric
    foam" finds "flexible elastomeric foam tube")."""
    wanted = _norm(spec)
    for key, item in catalogue.items():
        if wanted in (_norm(key), _norm(item.name)):
            return item
    leading = [item for item in catalogue.values() if _norm(item.name).startswith(wanted + " ")]
    return leading[0] if len(leading) == 1 else None


def _constant_k(spec: str, option: str = "layers") -> InsulationMaterial:
    text = spec.split("=", 1)[1].strip()
    allowed = (f"conductivity in W/(m·K) above 0 and at most {MAX_CONSTANT_CONDUCTIVITY_W_MK:g}, "
               'e.g. "k=0.040"')
    try:
        value = float(text)
    except ValueError:
        raise InputError(option, f'"{spec.strip()}": give a {allowed}') from None
    if not math.isfinite(value) or value <= 0.0 or value > MAX_CONSTANT_CONDUCTIVITY_W_MK:
        raise InputError(option, f'"{spec.strip()}": give a {allowed}')
    return InsulationMaterial(
        key=f"k={text}",
        name=f"constant conductivity {value:g} W/(m·K)",
        family="generic",
        points=((24.0, value),),
        min_temp_c=-273.15,
        max_temp_c=1000.0,
        density_kg_m3=math.nan,
        source="user input",
    )


def lookup_material(spec: str, option: str = "layers") -> InsulationMaterial:
    """The insulation material named by *spec*, or a constant-conductivity layer.

    Parameters
    ----------
    spec : str or InsulationMaterial
        A catalogue key or name (``"mineral wool"``, ``"glass_wool"``,
        ``"Cellular-Glass"``, ``"calcium silicate pipe section"``), or ``"k=<value>"``
        with the conductivity in W/(m·K) (0 < k ≤ 5).

    Returns
    -------
    InsulationMaterial

    Raises
    ------
    InputError
        *option* (default ``--layer``) for an unknown name or a bad ``k=`` value.

    Examples
    --------
    >>> m = lookup_material("Glass-Wool")
    >>> m.key, m.family, m.points[0]
    ('glass_wool', 'pipe_section', (10.0, 0.032))
    >>> lookup_material("k=0.040").points
    ((24.0, 0.04),)
    """
    if isinstance(spec, InsulationMaterial):  # already looked up (e.g. a scaled copy, pipeins.sweep)
        return spec
    if _HOOK is not None:  # a user's materials file or design factors (pipeins.user_materials)
        return _HOOK(str(spec), option)
    return _lookup(spec, option)


#: Set by :func:`pipeins.user_materials.materials_in_use` while a user's materials are in use.
_HOOK = None


def _lookup(spec, option: str = "layers") -> InsulationMaterial:
    spec = str(spec)
    if re.match(r"\s*k\s*=", spec, re.I):
        return _constant_k(spec, option)
    found = _match(spec, _insulation())
    if found is None:
        names = [_norm(key) for key in _insulation()]
        raise InputError(option, f'unknown material "{spec.strip()}"; '
                                    f"{near_hint(_norm(spec), names)}")
    return found


def lookup_wall_material(name: str) -> WallMaterial:
    """The pipe wall material named *name* (key or name, case-insensitive).

    Raises
    ------
    InputError
        ``--pipe-material`` for an unknown name.

    Examples
    --------
    >>> lookup_wall_material("Stainless Steel").conductivity_w_mk
    14.9
    >>> lookup_wall_material("pp-r").key
    'pp_r'
    """
    found = _match(name, _walls())
    if found is None:
        names = [item.name for item in _walls().values()]
        raise InputError("pipe_material", f'unknown pipe material "{str(name).strip()}"; '
                                            f"{near_hint(_norm(name), names)}")
    return found


_DEFAULT_WALL = {"steel": "carbon_steel", "copper": "copper", "metric": "carbon_steel",
                 "custom": "carbon_steel"}


def default_wall_material(pipe_kind: str) -> WallMaterial:
    """The wall material assumed for a pipe catalogue.

    ``steel``, ``metric`` and ``custom`` → carbon steel; ``copper`` → copper.

    Examples
    --------
    >>> default_wall_material("copper").name
    'copper'
    """
    if pipe_kind not in _DEFAULT_WALL:
        raise InputError("pipe", f'unknown pipe kind "{pipe_kind}"; kinds: '
                                   f"{', '.join(_DEFAULT_WALL)}")
    return _walls()[_DEFAULT_WALL[pipe_kind]]


def list_materials(kind: str = "insulation") -> list[dict]:
    """Rows for a material listing.

    Parameters
    ----------
    kind : {"insulation", "wall"}

    Returns
    -------
    list of dict
        Insulation: ``key, name, family, min_temp_c, max_temp_c, density_kg_m3,
        conductivity_w_mk`` (text ``"0.035 at 10 °C … 0.102 at 400 °C"``), ``source``.
        Wall: ``key, name, conductivity_w_mk, density_kg_m3, heat_capacity_j_kgk, source``.

    Examples
    --------
    >>> [row["key"] for row in list_materials("wall")][:2]
    ['carbon_steel', 'stainless_steel']
    """
    if kind == "wall":
        return [{"key": w.key, "name": w.name, "conductivity_w_mk": w.conductivity_w_mk,
                 "density_kg_m3": w.density_kg_m3, "heat_capacity_j_kgk": w.heat_capacity_j_kgk,
                 "source": w.source} for w in _walls().values()]
    if kind != "insulation":
        raise InputError("--kind", f'unknown material list "{kind}"; lists: insulation, wall')
    rows = []
    for m in _insulation().values():
        (t0, k0), (t1, k1) = m.points[0], m.points[-1]
        rows.append({"key": m.key, "name": m.name, "family": m.family,
                     "min_temp_c": m.min_temp_c, "max_temp_c": m.max_temp_c,
                     "density_kg_m3": m.density_kg_m3,
                     "conductivity_w_mk": f"{k0:g} at {t0:g} °C … {k1:g} at {t1:g} °C",
                     "source": m.source})
    return rows
