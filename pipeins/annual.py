"""Over the year: energy, cost and CO2 of a line, bare against insulated, and the
economic thickness.

:class:`EnergyBasis` gathers the money side (operating hours, the heat source's
efficiency or the chiller's COP, the energy price and emission factor, the discount rate,
life and escalation, and the installed-cost table).  The heat flows come from the solver;
the finance from :mod:`pipeins.economics`.
"""

from __future__ import annotations

from dataclasses import dataclass, field

import numpy as np

from .economics import (CostTable, EmissionFactor, EnergyPrice, annual_co2_kg, annual_cost, annual_energy_j,
                        economic_thickness)
from .errors import InputError

__all__ = ["EnergyBasis", "annual_figures", "split_figures", "DUTIES", "economic_outcome", "EconomicCurve",
           "surface_area_m2", "PER_UNIT"]

#: The two duties a line can have, reported apart and never netted: heat losses are made up
#: by the heat source (heating), heat gains removed by the chiller (cooling).
DUTIES = ("heating", "cooling")


@dataclass(frozen=True)
class EnergyBasis:
    """The money side of a line.  ``efficiency`` applies to heat losses (boiler, heat
    exchanger; 0 < η ≤ 1); ``cop`` to heat gains on chilled lines (> 0)."""

    hours_per_year: float = 8760.0
    price: EnergyPrice | None = None
    efficiency: float = 1.0
    cop: float | None = None
    emission: EmissionFactor | None = None
    discount_rate: float = 0.05
    years: float = 20.0
    escalation: float = 0.0
    maintenance_fraction: float = 0.0
    cost_table: CostTable | None = None

    def purchased_energy_j(self, heat_flow_w):
        """Energy bought per year [J] for a heat flow [W]: a loss (> 0) through the heat
        source's efficiency, a gain (< 0) through the chiller's COP.

        A heat gain is never priced as heating: with no COP it raises ``InputError("--cop")``.
        """
        q = np.asarray(heat_flow_w, dtype=float)
        gains = q < 0
        if np.any(gains) and self.cop is None:
            raise InputError("--cop", "the line gains heat (fluid below the air): give the chiller COP to price "
                                      "the heat gain as cooling")
        losses = annual_energy_j(np.where(gains, 0.0, q), self.hours_per_year, efficiency=self.efficiency)
        if not np.any(gains):
            return losses
        return losses + annual_energy_j(np.where(gains, q, 0.0), self.hours_per_year, cop=self.cop)


def annual_figures(heat_flow_w, basis: EnergyBasis) -> dict:
    """Energy [J], cost [currency] and CO2 [kg] per year of a heat flow [W] (losses through
    the efficiency, gains through the COP; see :meth:`EnergyBasis.purchased_energy_j`)."""
    energy = basis.purchased_energy_j(heat_flow_w)
    out = {"energy_j": energy, "cost": None, "co2_kg": None}
    if basis.price is not None:
        out["cost"] = annual_cost(energy, basis.price)
    if basis.emission is not None:
        out["co2_kg"] = annual_co2_kg(energy, basis.emission)
    return out


def split_figures(heat_flow_w, basis: EnergyBasis, weights=None) -> dict:
    """Heat loss and heat gain apart, each with its energy, cost and CO2 per year.

    Parameters
    ----------
    heat_flow_w : float or array_like
        Signed heat flow [W] (+ lost by the fluid); with a profile the last axis runs over
        the operating conditions (see :func:`pipeins.economics.annual_energy_j`).
    basis : EnergyBasis
        Losses are priced through the efficiency, gains through the COP (a gain with no
        COP raises ``InputError("--cop")``).
    weights : array_like, optional
        Hours weights of the profile's conditions (sum 1) for the mean heat flows.

    Returns
    -------
    dict
        ``heat_loss_w`` and ``heat_gain_w`` (both ≥ 0, hours-weighted means over a profile)
        and ``heating`` / ``cooling``: ``{"energy_j", "cost", "co2_kg"}`` (cost and CO2
        ``None`` without a price or factor).
    """
    q = np.asarray(heat_flow_w, dtype=float)
    loss, gain = np.where(q > 0, q, 0.0), np.where(q < 0, -q, 0.0)

    def mean(x):
        return x if weights is None else np.sum(np.asarray(weights) * x, axis=-1)

    heating = annual_figures(loss, basis)
    if np.any(gain > 0):
        cooling = annual_figures(-gain, basis)
    else:
        zero = annual_energy_j(gain, basis.hours_per_year)
        cooling = {"energy_j": zero, "cost": None if basis.price is None else 0.0 * zero,
                   "co2_kg": None if basis.emission is None else 0.0 * zero}
    return {"heat_loss_w": mean(loss), "heat_gain_w": mean(gain), "heating": heating, "cooling": cooling}


#: What one unit of a section is, by its heat-flow basis: the money of the economic
#: thickness is per metre of a run, per m² of a face, per vessel.
PER_UNIT = {"W/m": "m", "W/m²": "m²", "W": "vessel"}


@dataclass
class EconomicCurve:
    """The cost curve of one size: every candidate thickness (nominal, as sold) with its
    installed cost, present value of energy (and maintenance) and total, per unit of the
    section (``per``: ``"m"`` of a pipe or duct run, ``"m²"`` of a face, ``"vessel"``).

    ``area_m2_per_unit`` is the surface priced with a table per m² (the section's own surface
    before insulating, per unit), None with a table per metre of pipe."""

    size: str
    thickness_m: np.ndarray
    installed: np.ndarray
    energy_pv: np.ndarray
    total: np.ndarray
    best_index: int
    #: Notes (:class:`pipeins.notes.Note`) of the economic search, e.g. ``economic.at_thickest``.
    warnings: list = field(default_factory=list)
    per: str = "m"
    area_m2_per_unit: float | None = None


def economic_curve(size_label: str, thicknesses_m, annual_energy_cost, basis: EnergyBasis, per: str = "m",
                   area_m2_per_unit=None) -> EconomicCurve:
    """The cost curve of one size over the cost table's thicknesses, given the yearly energy
    cost per unit of the section (*per*) at each thickness; with a table per m², the installed
    cost is the table's times *area_m2_per_unit*."""
    installed = np.asarray(basis.cost_table.installed_cost(size_label, thicknesses_m, area_m2_per_unit))
    res = economic_thickness(thicknesses_m, installed, annual_energy_cost, basis.discount_rate, basis.years,
                             basis.escalation, basis.maintenance_fraction)
    return EconomicCurve(size_label, np.asarray(thicknesses_m), installed,
                         np.asarray(res.energy_pv_per_m + res.maintenance_pv_per_m),
                         np.asarray(res.total_per_m), int(res.best_index), list(res.warnings), per,
                         None if area_m2_per_unit is None else float(area_m2_per_unit))


def surface_area_m2(section, fluid, surroundings, surface):
    """The insulated surface of a section before insulating, per unit of its basis [m² per m
    of run, per m² of face (1), per vessel], one value per size: the outer area of the bare
    section's patches that take insulation (a tank floor left bare on its foundation does not).

    What a cost table per m² is priced on (duct wrap, board and vessel insulation are sold and
    installed by the area covered).  One bare solve of every patch, as the solver sees it.
    """
    from .solve import solve

    bare = solve(section, [], fluid, surroundings, surface)
    patches = bare.inputs.get("patches") or ()
    if not bare.patches:  # a single-patch section whose result is the patch's own: a pipe
        if hasattr(section, "outer_diameter_m"):
            return np.pi * np.asarray(section.outer_diameter_m, dtype=float)
        return np.asarray(bare.heat_flow, dtype=float) * 0.0 + 1.0
    return sum(np.asarray(p.area_m2, dtype=float) for p, spec in zip(bare.patches, patches) if spec.insulated)


def economic_outcome(problem, sizes, basis: EnergyBasis):
    """The economic thickness per size (ISO 12241 / VDI 2055 approach: least installed cost
    plus present value of the energy cost), over the thicknesses the cost table lists.

    Per unit of the section's own heat-flow basis: per metre of a pipe or duct run, per m² of
    a face, per vessel.  A pipe may be priced per metre by size; a duct, face or vessel needs a
    table per m² of surface (:attr:`~pipeins.economics.CostTable.per_area`), its installed cost
    the table's times the section's surface (:func:`surface_area_m2`).  The thicknesses are the
    nominal ones (a wrap is solved at its installed thickness).

    Returns a :class:`~pipeins.sizing.CriterionOutcome` (key ``economic``) and the curves.
    """
    from .sizing import CriterionOutcome

    table = basis.cost_table
    if table is None:
        raise InputError("--cost-table", "the economic thickness needs a cost table (CSV of installed cost per metre, "
                                         "or per m² of surface)")
    if basis.price is None:
        raise InputError("--energy-price", "the economic thickness needs the energy price, e.g. 0.09/kWh")
    section = problem.pipe
    kind = getattr(section, "kind", "pipe")
    if kind != "pipe" and not table.per_area:
        raise InputError("--cost-table", f"{table.name} prices per metre of pipe by size; a {kind} is priced per m² of "
                                         "its surface: give a table with thickness_mm and cost_per_m2 (or cost_per_ft2)")
    lists = [table.thicknesses_m(s.label) for s in sizes]
    width = max(len(t) for t in lists)
    grid = np.full((len(sizes), width), np.nan)
    for i, t in enumerate(lists):
        grid[i, : len(t)] = t
    solved = problem.solve(np.where(np.isfinite(grid), grid, grid[:, :1]))
    q = np.broadcast_to(np.asarray(solved.heat_flow, dtype=float), grid.shape)  # signed: gains through the COP
    per = PER_UNIT[getattr(solved, "basis", "W/m")]
    annual = annual_figures(q, basis)["cost"]
    area = None
    if table.per_area:
        area = np.ravel(np.broadcast_to(surface_area_m2(section, problem.fluid, problem.surroundings,
                                                        problem.surface), (len(sizes), 1)))
    curves = [economic_curve(size.label, lists[i], annual[i, : len(lists[i])], basis, per,
                             None if area is None else area[i])
              for i, size in enumerate(sizes)]
    required = np.array([c.thickness_m[c.best_index] for c in curves])
    messages = [""] * len(sizes)
    description = (f"least installed cost + energy over {basis.years:g} years at {100 * basis.discount_rate:g} %"
                   + (f", energy price rising {100 * basis.escalation:g} %/year" if basis.escalation else "")
                   + {"m": "", "m²": ", per unit area of face", "vessel": ", for the whole vessel"}[per])
    outcome = CriterionOutcome("economic", "economic thickness", description, required,
                               np.ones(len(sizes), dtype=bool), messages)
    return outcome, curves

def price_from_text(text: str, currency: str = "", option: str = "--energy-price") -> EnergyPrice:
    """An :class:`EnergyPrice` from text such as ``"0.09/kWh"`` or ``"1.05 per therm"``."""
    from .units import parse_money_per_energy

    return EnergyPrice(parse_money_per_energy(text, option) * 3.6e6, "kWh", currency)


def emission_from_text(text: str, option: str = "--co2-factor") -> EmissionFactor:
    """An :class:`EmissionFactor` from text such as ``"0.20/kWh"`` (kg CO2 per unit)."""
    from .units import parse_money_per_energy

    return EmissionFactor(parse_money_per_energy(text, option) * 3.6e6, "kWh")
