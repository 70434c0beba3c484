"""Outer surface finishes (jackets, bare surfaces): emittance and surface kind.

Read from ``tables/finishes.csv``. ``surface_kind`` is one of ``bare_metal``,
``metal_jacket`` or ``non_metallic`` and selects the touch limit (see
:mod:`pipeins.catalog.touch`).
"""

from __future__ import annotations

import functools
import re
from dataclasses import dataclass

from pipeins.errors import near_hint
from pipeins.errors import InputError
from pipeins.tables import read_table

__all__ = ["Finish", "lookup_finish", "list_finishes", "SURFACE_KINDS"]

#: Surface kinds known to the touch-limit table.
SURFACE_KINDS = ("bare_metal", "metal_jacket", "non_metallic")


@dataclass(frozen=True)
class Finish:
    """An outer surface.

    Attributes
    ----------
    key : str
        Catalogue key, e.g. ``"aluminium_oxidised"``.
    name : str
        Readable name.
    emittance : float
        Total hemispherical emittance [-], 0 < emittance ≤ 1.
    surface_kind : str
        ``bare_metal``, ``metal_jacket`` or ``non_metallic``.
    source : str
    """

    key: str
    name: str
    emittance: float
    surface_kind: str
    source: str


def _norm(text: str) -> str:
    return re.sub(r"[\s_\-,]+", " ", str(text).strip().lower()).strip()


@functools.cache
def _finishes() -> dict[str, Finish]:
    return {
        row["key"]: Finish(row["key"], row["name"], float(row["emittance"]),
                           row["surface_kind"], row["source"])
        for row in read_table("finishes")
    }


def lookup_finish(name: str) -> Finish:
    """The finish named *name*: key or name, case-insensitive, spaces/underscores/hyphens alike.

    Raises
    ------
    InputError
        ``--finish`` for an unknown name.

    Examples
    --------
    >>> f = lookup_finish("aluminium oxidised")
    >>> f.emittance, f.surface_kind
    (0.12, 'metal_jacket')
    >>> lookup_finish("PVC-jacket").key
    'pvc_jacket'
    """
    wanted = _norm(name)
    for key, finish in _finishes().items():
        if wanted in (_norm(key), _norm(finish.name)):
            return finish
    keys = [_norm(key) for key in _finishes()]
    raise InputError("--finish", f'unknown finish "{str(name).strip()}"; {near_hint(wanted, keys)}')


def list_finishes() -> list[dict]:
    """Rows ``key, name, emittance, surface_kind, source`` for a finish listing.

    Examples
    --------
    >>> list_finishes()[0]["key"]
    'aluminium_new'
    """
    return [{"key": f.key, "name": f.name, "emittance": f.emittance,
             "surface_kind": f.surface_kind, "source": f.source} for f in _finishes().values()]
