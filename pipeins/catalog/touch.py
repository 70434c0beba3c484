"""Touch (burn-threshold) limits for hot surfaces by surface kind and contact time.

Read from ``tables/touch_limits.csv`` (after ISO 13732-1:2006 burn thresholds). Between the
tabulated contact times the limit is interpolated linearly in log10(contact time).
"""

from __future__ import annotations

import functools

from pipeins.errors import near_hint
from pipeins.errors import InputError
from pipeins.tables import read_table

__all__ = ["touch_limit", "DEFAULT_TOUCH_LIMIT_C", "DEFAULT_TOUCH_LIMIT_SOURCE",
           "DEFAULT_CONTACT_TIME_S", "touch_surface_kinds"]


@functools.cache
def _rows() -> dict[str, list[tuple[float, float, str]]]:
    out: dict[str, list[tuple[float, float, str]]] = {}
    for row in read_table("touch_limits"):
        out.setdefault(row["surface_kind"], []).append(
            (float(row["contact_time_s"]), float(row["limit_c"]), row["source"]))
    return {kind: sorted(rows) for kind, rows in out.items()}


def touch_surface_kinds() -> list[str]:
    """Surface kinds in the touch table (without the ``default`` row).

    Examples
    --------
    >>> touch_surface_kinds()
    ['bare_metal', 'metal_jacket', 'non_metallic']
    """
    return [kind for kind in _rows() if kind != "default"]


def touch_limit(surface_kind: str, contact_time_s):
    """Burn-threshold surface temperature for skin contact.

    The limit is interpolated linearly in ``log10(contact_time_s)`` between the tabulated
    contact times (1 s, 4 s, 10 s, 1 min, 10 min, 8 h):

    .. math:: T = T_a + (T_b - T_a)\\,\\frac{\\log t - \\log t_a}{\\log t_b - \\log t_a}

    Valid for 1 s ≤ t ≤ 8 h; ISO 13732-1:2006 burn thresholds for unprotected skin.

    Parameters
    ----------
    surface_kind : {"bare_metal", "metal_jacket", "non_metallic"}
    contact_time_s : float or array_like
        Contact time [s], 1 to 28 800.

    Returns
    -------
    limit_c : float or numpy.ndarray
        Limit [°C], an array of the shape of *contact_time_s* (a float for a scalar).
    source : str
        Source text of the table rows used.

    Raises
    ------
    InputError
        ``--surface`` for an unknown kind, ``--contact-time`` outside 1 s to 8 h.

    Examples
    --------
    >>> touch_limit("bare_metal", 60)[0]
    51.0
    >>> round(touch_limit("bare_metal", 2.0)[0], 1)
    61.5
    """
    import numpy as np

    kinds = touch_surface_kinds()
    if surface_kind not in kinds:
        raise InputError("--surface", f'unknown surface kind "{surface_kind}"; '
                                      f"{near_hint(str(surface_kind), kinds)}")
    rows = _rows()[surface_kind]
    times = np.array([r[0] for r in rows])
    limits = np.array([r[1] for r in rows])
    t = np.asarray(contact_time_s, dtype=float)
    lo, hi = times[0], times[-1]
    if t.size == 0 or not np.all(np.isfinite(t)) or np.any(t < lo) or np.any(t > hi):
        raise InputError("contact_time_s", f"contact time must be between {lo:g} s and "
                                           f"{hi:g} s ({hi / 3600:g} h)")
    result = np.interp(np.log10(t), np.log10(times), limits)
    lower = np.searchsorted(times, t.min(), side="right") - 1
    upper = np.searchsorted(times, t.max(), side="left")
    used = dict.fromkeys(r[2] for r in rows[max(lower, 0):upper + 1])
    source = "; ".join(used) + "; interpolated in log time" if np.any(~np.isin(t, times)) \
        else "; ".join(used)
    return (float(result) if result.ndim == 0 else result), source


@functools.cache
def _default() -> tuple[float, float, str]:
    return _rows()["default"][0]


#: Default touch limit [°C] when no contact time is given.
DEFAULT_TOUCH_LIMIT_C: float = _default()[1]
#: Contact time the default limit is meant for [s].
DEFAULT_CONTACT_TIME_S: float = _default()[0]
#: Source text of the default limit.
DEFAULT_TOUCH_LIMIT_SOURCE: str = _default()[2]
