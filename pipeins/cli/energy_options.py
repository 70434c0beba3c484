"""Options for the money side: hours, prices, efficiency, CO2, discounting, cost table."""

from __future__ import annotations

import click

from .options import Path

__all__ = ["energy_options", "basis_from_options", "code_options"]

ENERGY_OPTIONS = [
    click.option("--hours", help="Operating hours per year (default 8760), e.g. 6000h."),
    click.option("--energy-price", help="Price of the energy bought, e.g. 0.09/kWh, 1.05/therm, 12/GJ."),
    click.option("--currency", default="", help="Currency shown with costs, e.g. EUR, USD."),
    click.option("--efficiency", help="Heat source efficiency for heat losses: 88%, 88 or 0.88 (default 100%)."),
    click.option("--cop", help="Chiller coefficient of performance for heat gains (chilled lines)."),
    click.option("--co2-factor", help="CO2 per unit of energy bought, kg, e.g. 0.20/kWh."),
    click.option("--discount-rate", help="Discount rate per year (default 5%)."),
    click.option("--years", help="Evaluation life in years (default 20)."),
    click.option("--escalation", help="Energy price rise per year (default 0%)."),
    click.option("--maintenance", help="Annual maintenance as a share of installed cost (default 0%)."),
    click.option("--cost-table", type=Path(dir_okay=False),
                 help="CSV of installed insulation cost per metre by size and thickness (size, thickness_mm, "
                      "cost_per_m, currency), or per m² of a duct's or vessel's surface (thickness_mm, "
                      "cost_per_m2)."),
]

CODE_OPTIONS = [
    click.option("--code", help='Code-minimum rule set, e.g. "ashrae-90.1-2019" (see `pipeins list rules`).'),
    click.option("--code-table", multiple=True, type=Path(dir_okay=False),
                 help="Extra rule-set CSV of the same shape as the shipped ones (repeatable)."),
]


def _decorate(options, func):
    for option in reversed(options):
        func = option(func)
    return func


def energy_options(func):
    return _decorate(ENERGY_OPTIONS, func)


def code_options(func):
    return _decorate(CODE_OPTIONS, func)


def basis_from_options(opts: dict, units: str, need_price: bool = False):
    """An :class:`pipeins.annual.EnergyBasis` from the energy options (None when no
    energy option was given and none is needed)."""
    from ..annual import EnergyBasis, price_from_text
    from ..economics import CostTable
    from ..errors import InputError

    given = any(opts.get(k) for k in ("hours", "energy_price", "efficiency", "cop", "co2_factor",
                                      "discount_rate", "years", "escalation", "maintenance", "cost_table"))
    if not given and not need_price:
        return None

    from ..inputs import parse_value  # the project file's reader too: both accept the same values

    def percent(name, param):
        text = opts.get(name)
        return None if text is None else parse_value(param, text, units)

    kw = {}
    if opts.get("hours"):
        kw["hours_per_year"] = parse_value("hours_per_year", opts["hours"], units) / 3600.0
    if opts.get("energy_price"):
        kw["price"] = price_from_text(opts["energy_price"], opts.get("currency") or "")
    elif need_price:
        raise InputError("--energy-price", "the energy price is missing; use e.g. 0.09/kWh")
    if opts.get("efficiency"):
        kw["efficiency"] = parse_value("efficiency", opts["efficiency"], units)
    if opts.get("cop"):
        kw["cop"] = parse_value("cop", opts["cop"], units)
    if opts.get("co2_factor"):
        kw["emission"] = parse_value("emission", opts["co2_factor"], units)
    for name, key in (("discount_rate", "discount_rate"), ("escalation", "escalation"),
                      ("maintenance", "maintenance_fraction")):
        value = percent(name, key)
        if value is not None:
            kw[key] = value
    if opts.get("years"):
        kw["years"] = parse_value("years", opts["years"], units)
    if opts.get("cost_table"):
        kw["cost_table"] = CostTable.from_csv(opts["cost_table"])
    basis = EnergyBasis(**kw)
    # validate the ranges once, with the economics module's messages
    from ..economics import annual_energy_j, present_worth_factor

    annual_energy_j(1.0, basis.hours_per_year, efficiency=basis.efficiency)
    if basis.cop is not None:
        annual_energy_j(-1.0, basis.hours_per_year, cop=basis.cop)
    present_worth_factor(basis.discount_rate, basis.years, basis.escalation)
    return basis
