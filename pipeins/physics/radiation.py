"""Long-wave radiation between an outer surface and its surroundings.

Model: a small grey, diffuse surface completely enclosed by large surroundings at one
temperature (Incropera, DeWitt, Bergman & Lavine, *Fundamentals of Heat and Mass
Transfer*, 6th ed. (2007), Eq. 1.7).  The surroundings' own emittance then drops out.
Temperatures enter and leave in °C; kelvin appears only inside, in names ending
``_k``.
"""

from __future__ import annotations

import numpy as np

from pipeins.errors import InputError

__all__ = [
    "STEFAN_BOLTZMANN",
    "ABSOLUTE_ZERO_C",
    "radiation_coefficient_w_m2k",
    "radiative_flux_w_m2",
]

#: Stefan-Boltzmann constant [W/(m²·K⁴)], CODATA 2018 (exact in the 2019 SI).
STEFAN_BOLTZMANN = 5.670374419e-8
#: 0 K expressed in °C.
ABSOLUTE_ZERO_C = -273.15


def _checked(surface_temp_c, surroundings_temp_c, emittance):
    surface_temp_c = np.asarray(surface_temp_c, dtype=float)
    surroundings_temp_c = np.asarray(surroundings_temp_c, dtype=float)
    emittance = np.asarray(emittance, dtype=float)
    if not np.all((emittance > 0.0) & (emittance <= 1.0)):
        raise InputError("--emittance", "must be greater than 0 and at most 1")
    if not np.all(surface_temp_c > ABSOLUTE_ZERO_C):
        raise InputError("surface_temp_c", "must be above -273.15 °C")
    if not np.all(surroundings_temp_c > ABSOLUTE_ZERO_C):
        raise InputError("--surroundings-temp", "must be above -273.15 °C")
    return surface_temp_c - ABSOLUTE_ZERO_C, surroundings_temp_c - ABSOLUTE_ZERO_C, emittance


def radiation_coefficient_w_m2k(surface_temp_c, surroundings_temp_c, emittance):
    r"""Linearised radiation heat transfer coefficient [W/(m²·K)].

    .. math::
        h_r = \varepsilon\,\sigma\,(T_s + T_{sur})(T_s^2 + T_{sur}^2)

    so that :math:`q'' = h_r (T_s - T_{sur})` equals :func:`radiative_flux_w_m2`
    exactly, including at :math:`T_s = T_{sur}` where :math:`h_r = 4\varepsilon\sigma T^3`.

    Parameters
    ----------
    surface_temp_c : float or array_like
        Outer surface temperature [°C].
    surroundings_temp_c : float or array_like
        Mean radiant temperature of the surroundings [°C].
    emittance : float or array_like
        Total hemispherical emittance of the surface [-], in (0, 1].

    Returns
    -------
    numpy.ndarray
        :math:`h_r` [W/(m²·K)], all inputs broadcast together.

    Raises
    ------
    InputError
        Emittance outside (0, 1] or a temperature at or below absolute zero.

    References
    ----------
    Incropera et al., 6th ed. (2007), Eqs. 1.7 and 1.9.

    Examples
    --------
    >>> round(float(radiation_coefficient_w_m2k(120.0, 15.0, 0.9)), 3)
    8.261
    """
    surface_k, surroundings_k, emittance = _checked(surface_temp_c, surroundings_temp_c, emittance)
    return emittance * STEFAN_BOLTZMANN * (surface_k + surroundings_k) * (surface_k**2 + surroundings_k**2)


def radiative_flux_w_m2(surface_temp_c, surroundings_temp_c, emittance):
    r"""Net radiative heat flux leaving the surface [W/m²].

    .. math::
        q'' = \varepsilon\,\sigma\,(T_s^4 - T_{sur}^4)

    Negative when the surroundings are warmer than the surface.

    Parameters
    ----------
    surface_temp_c : float or array_like
        Outer surface temperature [°C].
    surroundings_temp_c : float or array_like
        Mean radiant temperature of the surroundings [°C].
    emittance : float or array_like
        Total hemispherical emittance of the surface [-], in (0, 1].

    Returns
    -------
    numpy.ndarray
        :math:`q''` [W/m²], all inputs broadcast together.

    Raises
    ------
    InputError
        Emittance outside (0, 1] or a temperature at or below absolute zero.

    References
    ----------
    Incropera et al., 6th ed. (2007), Eq. 1.7.

    Examples
    --------
    >>> round(float(radiative_flux_w_m2(120.0, 15.0, 0.9)), 1)
    867.4
    """
    surface_k, surroundings_k, emittance = _checked(surface_temp_c, surroundings_temp_c, emittance)
    return emittance * STEFAN_BOLTZMANN * (surface_k**4 - surroundings_k**4)
