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

__all__ = ["EnergyBasis", "annual_figures", "split_figures", "DUTIES", "economic_outcome", "EconomicCurve"]

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


@dataclass
class EconomicCurve:
    """The cost curve of one size: every candidate thickness with its installed cost,
    present value of energy and total (per metre)."""

    size: str
    thickness_m: np.ndarray
    installed_per_m: np.ndarray
    energy_pv_per_m: np.ndarray
    total_per_m: np.ndarray
    best_index: int
    warnings: list[str] = field(default_factory=list)


def economic_curve(size_label: str, thicknesses_m, annual_energy_cost_per_m, basis: EnergyBasis) -> EconomicCurve:
    """The cost curve of one size over the cost table's thicknesses, given the yearly energy
    cost per metre at each thickness."""
    installed = np.asarray(basis.cost_table.cost_per_m(size_label, thicknesses_m))
    res = economic_thickness(thicknesses_m, installed, annual_energy_cost_per_m, basis.discount_rate, basis.years,
                             basis.escalation, basis.maintenance_fraction)
    return EconomicCurve(size_label, np.asarray(thicknesses_m), installed,
                         np.asarray(res.energy_pv_per_m + res.maintenance_pv_per_m),
                         np.asarray(res.total_per_m), int(res.best_index), list(res.warnings))


def economic_outcome(problem, sizes, basis: EnergyBasis):
    """The economic thickness per size (ISO 12241 / VDI 2055 approach: least installed cost
    plus present value of the energy cost), over the thicknesses the cost table lists.

    Returns a :class:`~pipeins.sizing.CriterionOutcome` (key ``economic``) and the curves.
    """
    from .sizing import CriterionOutcome

    if basis.cost_table is None:
        raise InputError("--cost-table", "the economic thickness needs a cost table (CSV of installed cost per metre)")
    if basis.price is None:
        raise InputError("--energy-price", "the economic thickness needs the energy price, e.g. 0.09/kWh")
    lists = [basis.cost_table.thicknesses_m(s.label) for s in sizes]
    width = max(len(t) for t in lists)
    grid = np.full((len(sizes), width), np.nan)
    for i, t in enumerate(lists):
        grid[i, : len(t)] = t
    solved = problem.solve(np.where(np.isfinite(grid), grid, grid[:, :1]))
    q = np.asarray(solved.heat_flow_w_per_m)  # signed: gains are priced through the COP
    annual = annual_figures(q, basis)["cost"]
    curves = [economic_curve(size.label, lists[i], annual[i, : len(lists[i])], basis)
              for i, size in enumerate(sizes)]
    required = np.array([c.thickness_m[c.best_index] for c in curves])
    messages = [""] * len(sizes)
    description = (f"least installed cost + energy over {basis.years:g} years at {100 * basis.discount_rate:g} %"
                   + (f", energy price rising {100 * basis.escalation:g} %/year" if basis.escalation else ""))
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
