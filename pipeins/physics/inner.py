"""The inner film: convection from the flowing fluid to the pipe or duct wall.

The fluid's properties come in as arrays (the caller tabulates them once, e.g. from
CoolProp at the bulk temperature); this module only forms Re and Pr and applies
:func:`pipeins.physics.convection.nusselt_pipe_internal` (fully developed, smooth
tube: laminar, Gnielinski transition, Gnielinski turbulent).

:func:`inner_film_coefficient` returns only the coefficient; the same arguments given
to :func:`inner_film_warnings` return the validity warnings as structured notes
(:class:`pipeins.notes.Note`, code ``film.inner.range``).
"""

from __future__ import annotations

import numpy as np

from pipeins.errors import InputError
from pipeins.physics.convection import nusselt_pipe_internal

__all__ = ["reynolds_number", "prandtl_number", "inner_film_coefficient", "inner_film_warnings",
           "inner_film_notes"]


def _positive(value, name, what):
    value = np.asarray(value, dtype=float)
    if not np.all(value > 0.0):
        raise InputError(name, f"must be greater than 0 {what}")
    return value


def reynolds_number(velocity_m_s, inner_diameter_m, density_kg_m3, viscosity_pa_s):
    r"""Reynolds number of the flow in a round tube.

    .. math::
        Re_D = \frac{\rho\,V\,D_i}{\mu}

    Parameters
    ----------
    velocity_m_s : float or array_like
        Mean fluid velocity [m/s], greater than 0.
    inner_diameter_m : float or array_like
        Inner (hydraulic) diameter [m], greater than 0.
    density_kg_m3 : float or array_like
        Fluid density [kg/m³], greater than 0.
    viscosity_pa_s : float or array_like
        Dynamic viscosity [Pa·s], greater than 0.

    Returns
    -------
    numpy.ndarray
        :math:`Re_D` [-].

    Raises
    ------
    InputError
        Any input 0 or negative (velocity reported as ``--velocity``).

    Examples
    --------
    >>> round(float(reynolds_number(1.5, 0.05, 998.0, 1.0e-3)))
    74850
    """
    velocity_m_s = _positive(velocity_m_s, "--velocity", "m/s (a stagnant fluid has no forced film)")
    inner_diameter_m = _positive(inner_diameter_m, "inner_diameter_m", "m")
    density_kg_m3 = _positive(density_kg_m3, "density_kg_m3", "kg/m³")
    viscosity_pa_s = _positive(viscosity_pa_s, "viscosity_pa_s", "Pa·s")
    return density_kg_m3 * velocity_m_s * inner_diameter_m / viscosity_pa_s


def prandtl_number(viscosity_pa_s, heat_capacity_j_kgk, conductivity_w_mk):
    r"""Prandtl number :math:`Pr = \mu c_p / k` [-].

    Parameters
    ----------
    viscosity_pa_s : float or array_like
        Dynamic viscosity [Pa·s], greater than 0.
    heat_capacity_j_kgk : float or array_like
        Isobaric heat capacity [J/(kg·K)], greater than 0.
    conductivity_w_mk : float or array_like
        Thermal conductivity [W/(m·K)], greater than 0.

    Returns
    -------
    numpy.ndarray
        Pr [-].

    Examples
    --------
    >>> round(float(prandtl_number(1.0e-3, 4182.0, 0.6)), 2)
    6.97
    """
    viscosity_pa_s = _positive(viscosity_pa_s, "viscosity_pa_s", "Pa·s")
    heat_capacity_j_kgk = _positive(heat_capacity_j_kgk, "heat_capacity_j_kgk", "J/(kg·K)")
    conductivity_w_mk = _positive(conductivity_w_mk, "conductivity_w_mk", "W/(m·K)")
    return viscosity_pa_s * heat_capacity_j_kgk / conductivity_w_mk


def inner_film_coefficient(
    velocity_m_s, inner_diameter_m, density_kg_m3, viscosity_pa_s, conductivity_w_mk, heat_capacity_j_kgk
):
    r"""Inner film coefficient of a fluid flowing in a round tube [W/(m²·K)].

    .. math::
        h_i = \frac{Nu_D(Re_D, Pr)\,k}{D_i}

    with :math:`Nu_D` from
    :func:`~pipeins.physics.convection.nusselt_pipe_internal` (fully developed
    laminar 48/11 below Re 2300, Gnielinski above 10⁴, linear in between).
    Properties at the bulk fluid temperature; no wall-property correction.

    Parameters
    ----------
    velocity_m_s : float or array_like
        Mean fluid velocity [m/s], greater than 0.
    inner_diameter_m : float or array_like
        Inner (hydraulic) diameter [m], greater than 0.
    density_kg_m3, viscosity_pa_s, conductivity_w_mk, heat_capacity_j_kgk : array_like
        Fluid density [kg/m³], dynamic viscosity [Pa·s], thermal conductivity
        [W/(m·K)] and isobaric heat capacity [J/(kg·K)], all greater than 0.

    Returns
    -------
    numpy.ndarray
        :math:`h_i` [W/(m²·K)], all inputs broadcast together.

    Raises
    ------
    InputError
        ``--velocity`` 0 or negative, or any other input 0 or negative.

    References
    ----------
    Gnielinski, V. (1976), Int. Chem. Eng. 16(2):359-368; Gnielinski, V. (2013),
    Int. J. Heat Mass Transfer 63:134-140.  Incropera et al., 6th ed. (2007), Eq. 8.62.

    Examples
    --------
    Water at about 20 °C, 1.5 m/s in a 50 mm bore:

    >>> round(float(inner_film_coefficient(1.5, 0.05, 998.0, 1.0e-3, 0.6, 4182.0)))
    5583
    """
    reynolds = reynolds_number(velocity_m_s, inner_diameter_m, density_kg_m3, viscosity_pa_s)
    prandtl = prandtl_number(viscosity_pa_s, heat_capacity_j_kgk, conductivity_w_mk)
    conductivity_w_mk = np.asarray(conductivity_w_mk, dtype=float)
    inner_diameter_m = np.asarray(inner_diameter_m, dtype=float)
    return nusselt_pipe_internal(reynolds, prandtl) * conductivity_w_mk / inner_diameter_m


def inner_film_warnings(
    velocity_m_s, inner_diameter_m, density_kg_m3, viscosity_pa_s, conductivity_w_mk, heat_capacity_j_kgk
) -> list[str]:
    """Validity warnings for :func:`inner_film_coefficient` with the same arguments.

    Returns
    -------
    list of Note
        One ``film.inner.range`` note (:class:`pipeins.notes.Note`) per kind of excursion,
        with the number of cases affected in its words; empty when every case is inside the
        validity of the correlations used.

    Examples
    --------
    >>> inner_film_warnings(1.5, 0.05, 998.0, 1.0e-3, 0.6, 4182.0)
    []
    >>> [n.word("what") for n in inner_film_warnings(0.01, 0.05, 998.0, 1.0e-3, 0.6, 4182.0)]
    ['laminar flow (Re below 2300)']
    """
    reynolds = reynolds_number(velocity_m_s, inner_diameter_m, density_kg_m3, viscosity_pa_s)
    prandtl = prandtl_number(viscosity_pa_s, heat_capacity_j_kgk, conductivity_w_mk)
    reynolds, prandtl = np.broadcast_arrays(reynolds, prandtl)
    total = reynolds.size
    from pipeins.physics.correlations import lookup

    record = lookup("pipe", "any", "internal")
    re_turbulent, re_high = record.ranges["Re"]
    pr_low, pr_high = record.ranges["Pr"]
    found = []
    checks = (
        (reynolds < 2300.0, "laminar flow (Re below 2300)", "fully developed Nu = 4.36 used, entry-length enhancement neglected"),
        ((reynolds >= 2300.0) & (reynolds < re_turbulent), f"transitional flow (Re 2300 to {re_turbulent:.0f})",
         "Gnielinski (1995) interpolation used; uncertainty is larger than in turbulent flow"),
        (reynolds > re_high, "Re above 5e6", "outside the Gnielinski (1976) range; extrapolated"),
        (prandtl < pr_low, f"Pr below {pr_low:g}",
         "outside the Gnielinski (1976) range (liquid metals need another correlation)"),
        (prandtl > pr_high, f"Pr above {pr_high:g}", "outside the Gnielinski (1976) range; extrapolated"),
    )
    from pipeins.notes import note

    for mask, what, consequence in checks:
        count = int(np.count_nonzero(mask))
        if count:
            where = f" in {count} of {total} cases" if total > 1 else ""
            found.append(note("film.inner.range", what=what, where=where, consequence=consequence))
    return found


def inner_film_notes(fluid: str, temp_c, inner_diameter_m, velocity_m_s) -> tuple:
    """:func:`inner_film_warnings` for *fluid* (a name :mod:`pipeins.props.liquids` knows) at
    *temp_c* [°C] flowing at *velocity_m_s* [m/s] in a bore of *inner_diameter_m* [m], with
    the fluid's own properties.  The caller stores them on the
    :class:`~pipeins.model.Fluid` (``film_notes``), so the result carries them.

    Examples
    --------
    >>> inner_film_notes("water", 60.0, 0.1023, 1.5)
    ()
    >>> inner_film_notes("water", 60.0, 0.1023, 0.01)[0].code
    'film.inner.range'
    """
    from pipeins.props.liquids import fluid_properties

    props = fluid_properties(fluid, temp_c)
    return tuple(inner_film_warnings(velocity_m_s, inner_diameter_m, props.density_kg_m3, props.viscosity_pa_s,
                                     props.conductivity_w_mk, props.heat_capacity_j_kgk))
