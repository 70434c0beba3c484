"""Humid air: saturation vapour pressure, dew point and relative humidity.

The saturation vapour pressure of water comes from the shipped table
``tables/water_vapour_saturation.csv`` (written by ``python -m pipeins.props.generate``):

* at and above the triple point (0.01 °C): over liquid water, CoolProp
  ``PropsSI('P', 'T', T, 'Q', 0, 'Water')`` – IAPWS-95 (Wagner and Pruss 2002);
* below the triple point: over ice, CoolProp's humid-air ``p_ws`` (``HAProps_Aux``),
  which is the IAPWS 2011 sublimation-pressure equation (Wagner, Riethmann, Feistel
  and Harvey 2011, J. Phys. Chem. Ref. Data 40, 043103).

So below 0 °C the "dew point" returned here is the frost point, as in ASHRAE Handbook –
Fundamentals (2017) ch. 1: the temperature at which a cold surface collects frost.
The two curves meet at the triple point (611.65 Pa), so the function is continuous.

The table runs from -100 to 200 °C every 1 K (plus 0.01 °C); ln p is interpolated
linearly in temperature, which errs by less than 0.002 K in dew point, and which makes
:func:`dew_point_c` and :func:`relative_humidity_percent` exact inverses.

Enhancement factor: NOT applied.  Relative humidity here is p_w / p_ws(T) (the vapour
pressure ratio), and the dew point solves p_ws(T_d) = p_w.  The enhancement factor f
(about 1.004 at 1 atm) multiplies both sides of that equation almost equally; it changes
the dew point by less than 0.01 K between 0 and 40 °C at 1 atm, so the pressure only
enters as the bound p_w < p.
"""

from __future__ import annotations

import functools

import numpy as np

from pipeins.errors import InputError

__all__ = [
    "TEMP_RANGE_C",
    "saturation_vapour_pressure_pa",
    "dew_point_c",
    "relative_humidity_percent",
]

#: temperatures covered by the shipped vapour-pressure table [°C]
TEMP_RANGE_C = (-100.0, 200.0)


@functools.cache
def _table() -> tuple[np.ndarray, np.ndarray]:
    from pipeins.props._shipped import numeric_columns

    cols = numeric_columns("water_vapour_saturation")
    return cols["temp_c"], np.log(cols["vapour_pressure_pa"])


def _first(values, bad) -> float:
    return float(np.atleast_1d(values)[np.atleast_1d(bad)][0])


def _check_temp(temp_c, name: str) -> np.ndarray:
    t = np.asarray(temp_c, dtype=float)
    low, high = TEMP_RANGE_C
    bad = ~((t >= low) & (t <= high))
    if np.any(bad):
        raise InputError(name, f"{_first(t, bad):g} °C is outside {low:g} to {high:g} °C")
    return t


def saturation_vapour_pressure_pa(temp_c) -> np.ndarray:
    """Saturation vapour pressure of water [Pa]: over ice below 0.01 °C, over liquid above.

    Equation: ln p_ws interpolated linearly in T between IAPWS tabulated values (see
    the module docstring).  Valid from -100 to 200 °C; outside, an
    :class:`~pipeins.errors.InputError` is raised for ``air_temp_c``.

    Parameters
    ----------
    temp_c : float or array_like
        Temperature [°C].

    Returns
    -------
    numpy.ndarray
        Saturation vapour pressure [Pa].

    References
    ----------
    Wagner, W. and Pruss, A. (2002), J. Phys. Chem. Ref. Data 31(2), 387-535 (liquid);
    Wagner, W., Riethmann, T., Feistel, R. and Harvey, A. H. (2011), J. Phys. Chem. Ref.
    Data 40, 043103 (ice).  Both as evaluated by CoolProp.

    Examples
    --------
    >>> saturation_vapour_pressure_pa([-10.0, 20.0]).round(1)
    array([ 259.9, 2339.3])
    """
    t = _check_temp(temp_c, "air_temp_c")
    temps, ln_p = _table()
    return np.asarray(np.exp(np.interp(t, temps, ln_p)))


def dew_point_c(air_temp_c, rh_percent, pressure_pa=101_325.0) -> np.ndarray:
    """Dew point (frost point below 0 °C) [°C] of air at *air_temp_c* and *rh_percent*.

    Equation: p_w = (RH / 100) p_ws(T_air);  T_dew = p_ws⁻¹(p_w), with p_ws over liquid
    water above the triple point and over ice below it (no enhancement factor; see the
    module docstring).  Inputs broadcast together.

    Validity: air temperature -100 to 200 °C (``air_temp_c`` error outside); relative
    humidity above 0 and up to 100 % (``--rh`` error otherwise – perfectly dry air,
    RH 0, has no dew point); the vapour pressure must stay below *pressure_pa*.

    Parameters
    ----------
    air_temp_c : float or array_like
        Dry-bulb air temperature [°C].
    rh_percent : float or array_like
        Relative humidity [%], p_w / p_ws(T_air) × 100.
    pressure_pa : float or array_like, optional
        Total (barometric) pressure [Pa], default 101 325 Pa; only bounds p_w.

    Returns
    -------
    numpy.ndarray
        Dew point [°C]; equal to the air temperature at 100 % RH.

    References
    ----------
    ASHRAE Handbook – Fundamentals (2017), ch. 1, eq. 5, 6 and the dew-point definition;
    saturation pressures per IAPWS-95 and IAPWS 2011 (module docstring).

    Examples
    --------
    >>> round(float(dew_point_c(20.0, 50.0)), 2)
    9.27
    >>> dew_point_c([20.0, 5.0], [100.0, 20.0]).round(2)
    array([ 20.  , -14.41])
    """
    t = _check_temp(air_temp_c, "air_temp_c")
    rh = np.asarray(rh_percent, dtype=float)
    p = np.asarray(pressure_pa, dtype=float)
    t, rh, p = np.broadcast_arrays(t, rh, p)
    bad = ~((rh > 0.0) & (rh <= 100.0))
    if np.any(bad):
        value = _first(rh, bad)
        note = ": perfectly dry air (RH 0) has no dew point" if value == 0.0 else ""
        raise InputError("rh_percent", f"{value:g} is outside 0 to 100 %{note}")
    bad = ~(p > 0.0)
    if np.any(bad):
        raise InputError("pressure_pa", f"{_first(p, bad):g} Pa is not a positive absolute pressure")
    temps, ln_p = _table()
    ln_pw = np.log(rh / 100.0) + np.interp(t, temps, ln_p)
    bad = ln_pw >= np.log(p)
    if np.any(bad):
        raise InputError(
            "rh_percent",
            f"{_first(rh, bad):g} % at {_first(t, bad):g} °C means a vapour pressure above "
            f"the total pressure {_first(p, bad):g} Pa",
        )
    dew = np.interp(ln_pw, ln_p, temps)
    return np.asarray(np.where(rh == 100.0, t, np.minimum(dew, t)))


def relative_humidity_percent(air_temp_c, dew_point_c) -> np.ndarray:
    """Relative humidity [%] of air at *air_temp_c* whose dew (frost) point is *dew_point_c*.

    Equation: RH = 100 p_ws(T_dew) / p_ws(T_air), the exact inverse of
    :func:`dew_point_c` (same table, same interpolation).  Both temperatures must lie
    in -100 to 200 °C (``air_temp_c`` / ``dew_point_c`` errors) and the dew point may
    not exceed the air temperature (``dew_point_c`` error).

    Parameters
    ----------
    air_temp_c : float or array_like
        Dry-bulb air temperature [°C].
    dew_point_c : float or array_like
        Dew point [°C] (frost point below 0 °C).

    Returns
    -------
    numpy.ndarray
        Relative humidity [%], in (0, 100].

    References
    ----------
    ASHRAE Handbook – Fundamentals (2017), ch. 1, eq. 5, 6 and 24.

    Examples
    --------
    >>> relative_humidity_percent(20.0, [9.27, 20.0]).round(1)
    array([ 50., 100.])
    """
    t = _check_temp(air_temp_c, "air_temp_c")
    td = _check_temp(dew_point_c, "dew_point_c")
    t, td = np.broadcast_arrays(t, td)
    bad = td > t
    if np.any(bad):
        raise InputError(
            "dew_point_c",
            f"{_first(td, bad):g} °C is above the air temperature {_first(t, bad):g} °C",
        )
    temps, ln_p = _table()
    return np.asarray(100.0 * np.exp(np.interp(td, temps, ln_p) - np.interp(t, temps, ln_p)))
