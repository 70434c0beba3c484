"""Saturated steam: saturation temperature, saturation pressure and latent heat.

Values come from the shipped table ``tables/steam_saturation.csv`` (CoolProp ``Water``,
IAPWS-95, Wagner and Pruss 2002), 1 kPa to 20 MPa absolute (0.01 to 200 bar), 100
points per decade uniform in ln p, written by ``python -m pipeins.props.generate``.
Between the points a cubic Hermite curve in ln p is used, with slopes from second-order
finite differences; against IAPWS-95 itself it errs by less than 0.001 K in temperature
and 0.02 % in latent heat (the worst case is close to 200 bar, where the latent heat
falls steeply towards the critical point).

All pressures are ABSOLUTE, in pascals.  Converting a gauge reading (add the local
atmospheric pressure) is the caller's business.
"""

from __future__ import annotations

import functools

import numpy as np

from pipeins.errors import InputError

__all__ = [
    "PRESSURE_RANGE_PA",
    "saturation_temp_c",
    "saturation_pressure_pa",
    "latent_heat_j_kg",
    "saturation_temp_range_c",
]

#: absolute pressures covered by the shipped table [Pa]
PRESSURE_RANGE_PA = (1.0e3, 2.0e7)


@functools.cache
def _table() -> dict[str, np.ndarray]:
    from pipeins.props._shipped import numeric_columns

    cols = numeric_columns("steam_saturation")
    ln_p = np.log(cols["pressure_pa"])
    temp_c = cols["saturation_temp_c"]
    latent = cols["latent_heat_j_kg"]
    return {
        "ln_p": ln_p,
        "temp_c": temp_c,
        "latent": latent,
        "dtemp_dlnp": np.gradient(temp_c, ln_p, edge_order=2),
        "dlatent_dlnp": np.gradient(latent, ln_p, edge_order=2),
        "dlnp_dtemp": np.gradient(ln_p, temp_c, edge_order=2),
    }


def _hermite(x, xp, yp, slope):
    """Cubic Hermite interpolation of (xp, yp) with the given node slopes (xp ascending)."""
    i = np.clip(np.searchsorted(xp, x) - 1, 0, xp.size - 2)
    h = xp[i + 1] - xp[i]
    t = (x - xp[i]) / h
    return (
        (1 + 2 * t) * (1 - t) ** 2 * yp[i]
        + t * (1 - t) ** 2 * h * slope[i]
        + t * t * (3 - 2 * t) * yp[i + 1]
        + t * t * (t - 1) * h * slope[i + 1]
    )


def _check_pressure(pressure_pa) -> np.ndarray:
    p = np.asarray(pressure_pa, dtype=float)
    low, high = PRESSURE_RANGE_PA
    bad = ~((p >= low * (1 - 1e-12)) & (p <= high * (1 + 1e-12)))
    if np.any(bad):
        value = p[bad].flat[0] if p.ndim else float(p)
        raise InputError(
            "--steam-pressure",
            f"{value:g} Pa is outside 1000 Pa to 20 MPa absolute (0.01 to 200 bar absolute)",
        )
    return p


def saturation_temp_range_c() -> tuple[float, float]:
    """Saturation temperatures [°C] at the two ends of the table (1 kPa and 20 MPa).

    >>> [round(t, 2) for t in saturation_temp_range_c()]
    [6.97, 365.75]
    """
    tab = _table()
    return float(tab["temp_c"][0]), float(tab["temp_c"][-1])


def saturation_temp_c(pressure_pa) -> np.ndarray:
    """Saturation temperature of water [°C] at the absolute pressure *pressure_pa* [Pa].

    Interpolates IAPWS-95 saturation states (see the module docstring) cubically in
    ln p.  Valid from 1 kPa to 20 MPa absolute; outside that range an
    :class:`~pipeins.errors.InputError` is raised for ``--steam-pressure``.

    Parameters
    ----------
    pressure_pa : float or array_like
        Absolute pressure [Pa].

    Returns
    -------
    numpy.ndarray
        Saturation temperature [°C], the shape of *pressure_pa*.

    References
    ----------
    Wagner, W. and Pruss, A. (2002), J. Phys. Chem. Ref. Data 31(2), 387-535 (IAPWS-95),
    as evaluated by CoolProp.

    Examples
    --------
    >>> saturation_temp_c([101_325.0, 1.0e6]).round(2)
    array([ 99.97, 179.88])
    """
    p = _check_pressure(pressure_pa)
    tab = _table()
    return np.asarray(_hermite(np.log(p), tab["ln_p"], tab["temp_c"], tab["dtemp_dlnp"]))


def saturation_pressure_pa(temp_c) -> np.ndarray:
    """Absolute saturation pressure of water [Pa] at *temp_c* [°C] (inverse of the above).

    Interpolates ln p cubically in temperature over the same table; valid between the
    saturation temperatures at 1 kPa and 20 MPa (6.97 to 365.75 °C).  Outside that
    range an :class:`~pipeins.errors.InputError` is raised for ``--steam-temp``.

    Parameters
    ----------
    temp_c : float or array_like
        Saturation temperature [°C].

    Returns
    -------
    numpy.ndarray
        Absolute pressure [Pa].

    References
    ----------
    Wagner, W. and Pruss, A. (2002), J. Phys. Chem. Ref. Data 31(2), 387-535 (IAPWS-95),
    as evaluated by CoolProp.

    Examples
    --------
    >>> round(float(saturation_pressure_pa(100.0)), -1)
    101420.0
    """
    t = np.asarray(temp_c, dtype=float)
    low, high = saturation_temp_range_c()
    bad = ~((t >= low - 1e-9) & (t <= high + 1e-9))
    if np.any(bad):
        value = t[bad].flat[0] if t.ndim else float(t)
        raise InputError(
            "--steam-temp",
            f"{value:g} °C is outside {low:.2f} to {high:.2f} °C "
            "(saturation at 0.01 to 200 bar absolute)",
        )
    tab = _table()
    return np.asarray(np.exp(_hermite(t, tab["temp_c"], tab["ln_p"], tab["dlnp_dtemp"])))


def latent_heat_j_kg(pressure_pa) -> np.ndarray:
    """Latent heat of vaporisation h_g - h_f [J/kg] at the absolute pressure [Pa].

    Interpolates IAPWS-95 saturated-vapour minus saturated-liquid enthalpy cubically
    in ln p; valid from 1 kPa to 20 MPa absolute (``--steam-pressure`` error outside).

    Parameters
    ----------
    pressure_pa : float or array_like
        Absolute pressure [Pa].

    Returns
    -------
    numpy.ndarray
        Latent heat [J/kg].

    References
    ----------
    Wagner, W. and Pruss, A. (2002), J. Phys. Chem. Ref. Data 31(2), 387-535 (IAPWS-95),
    as evaluated by CoolProp.

    Examples
    --------
    >>> round(float(latent_heat_j_kg(1.0e6)) / 1e3, 1)
    2014.6
    """
    p = _check_pressure(pressure_pa)
    tab = _table()
    return np.asarray(_hermite(np.log(p), tab["ln_p"], tab["latent"], tab["dlatent_dlnp"]))
