"""Outer surfaces (jackets, coatings, bare pipe): emittance, family, condition, surface kind.

Read from ``tables/finishes.csv``.  Each finish belongs to a surface family (non-metallic
jackets and coatings; aluminium; stainless steel; galvanised and painted steel; bare pipe)
and has a condition (bright or new, dull or aged, weathered or oxidised, or any age).  It
carries the emittance range its source gives and the value used.  ``surface_kind`` is one
of ``bare_metal``, ``metal_jacket`` or ``non_metallic`` and selects the touch limit (see
:mod:`pipeins.catalog.touch`).  Any other emittance is given with ``--emittance``.
"""

from __future__ import annotations

import functools
from dataclasses import dataclass

from pipeins.errors import near_hint
from pipeins.errors import InputError
from pipeins.tables import read_table

__all__ = ["Finish", "lookup_finish", "list_finishes", "SURFACE_KINDS", "FAMILIES"]

#: Surface kinds known to the touch-limit table.
SURFACE_KINDS = ("bare_metal", "metal_jacket", "non_metallic")
#: Surface families, in catalogue order.
FAMILIES = ("non-metallic jackets and coatings", "aluminium", "stainless steel",
            "galvanised and painted steel", "bare pipe")


@dataclass(frozen=True)
class Finish:
    """An outer surface.

    Attributes
    ----------
    key : str
        Catalogue key, e.g. ``"aluminium_dull"``.
    name : str
        Readable name, e.g. ``"aluminium, dull or aged"``.
    emittance : float
        Total hemispherical emittance used [-], 0 < emittance ≤ 1.
    surface_kind : str
        ``bare_metal``, ``metal_jacket`` or ``non_metallic``.
    source : str
        Where the emittance comes from.
    family : str
        Surface family (one of :data:`FAMILIES`).
    condition : str
        ``bright or new``, ``dull or aged``, ``weathered or oxidised`` or ``any age``.
    emittance_range : tuple of float
        (low, high) emittance the source gives [-].
    aliases : tuple of str
        Other spellings accepted by :func:`lookup_finish`.
    solar_absorptance : float or None
        Fraction of solar irradiance absorbed [-] (with ``absorptance_source``).
    """

    key: str
    name: str
    emittance: float
    surface_kind: str
    source: str
    family: str = ""
    condition: str = ""
    emittance_range: tuple[float, float] = (0.0, 1.0)
    aliases: tuple[str, ...] = ()
    #: Solar absorptance [-] (0 to 1) and where it comes from.
    solar_absorptance: float | None = None
    absorptance_source: str = ""


def _norm(text: str) -> str:
    from .aliases import canonical_words  # US spellings and trade words (oxidized, ASJ)

    return canonical_words(text)


@functools.cache
def _finishes() -> dict[str, Finish]:
    out = {}
    for row in read_table("finishes"):
        aliases = tuple(a.strip() for a in row["aliases"].split(";") if a.strip())
        out[row["key"]] = Finish(row["key"], row["name"], float(row["emittance"]), row["surface_kind"],
                                 row["source"], row["family"], row["condition"],
                                 (float(row["emittance_low"]), float(row["emittance_high"])), aliases,
                                 float(row["solar_absorptance"]), row["absorptance_source"])
    return out


@functools.cache
def _names() -> dict[str, str]:
    """Normalised key, name and alias -> key."""
    names = {}
    for key, finish in _finishes().items():
        for text in (key, finish.name, *finish.aliases):
            names.setdefault(_norm(text), key)
    return names


def lookup_finish(name: str) -> Finish:
    """The finish named *name*: key, name or alias, case-insensitive, with spaces,
    underscores, commas and hyphens alike.

    Raises
    ------
    InputError
        ``--finish`` for an unknown name, with the closest names.

    Examples
    --------
    >>> f = lookup_finish("aluminium, dull or aged")
    >>> f.emittance, f.surface_kind, f.family, f.emittance_range
    (0.11, 'metal_jacket', 'aluminium', (0.09, 0.13))
    >>> lookup_finish("PVC-jacket").key
    'pvc_jacket'
    >>> lookup_finish("Aluminum, oxidized").name
    'aluminium, weathered'
    """
    wanted = _norm(name)
    key = _names().get(wanted)
    if key is not None:
        return _finishes()[key]
    names = [_norm(f.name) for f in _finishes().values()]
    raise InputError("finish", f'unknown finish "{str(name).strip()}"; {near_hint(wanted, names)}')


def list_finishes() -> list[dict]:
    """Rows ``key, name, family, condition, emittance_low, emittance_high, emittance,
    surface_kind, aliases, source`` for a finish listing, grouped by family.

    Examples
    --------
    >>> rows = list_finishes()
    >>> rows[0]["family"], rows[-1]["family"]
    ('non-metallic jackets and coatings', 'bare pipe')
    """
    rows = [{"key": f.key, "name": f.name, "family": f.family, "condition": f.condition,
             "emittance_low": f.emittance_range[0], "emittance_high": f.emittance_range[1],
             "emittance": f.emittance, "surface_kind": f.surface_kind, "aliases": list(f.aliases),
             "source": f.source} for f in _finishes().values()]
    return sorted(rows, key=lambda r: FAMILIES.index(r["family"]))
