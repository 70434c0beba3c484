"""Energy cost, emissions, payback and economic insulation thickness from given heat flows.

Nothing here solves heat transfer: the functions take heat flows [W or W/m] that the thermal
solver produced and turn them into purchased energy, money and CO₂, then pick the thickness
with the lowest life-cycle cost.  Rates are fractions per year (0.08 means 8 %), years are
years, money is in whatever currency the inputs are in (never converted).

Method of the economic thickness: after VDI 2055 Part 1 (from memory: the section on the
economic insulation thickness).  The life-cycle cost per metre of each candidate thickness is
the installed cost plus the present value of the yearly energy cost (and, optionally, of a
yearly maintenance cost taken as a fraction of the installed cost); the economic thickness is
the candidate with the smallest total.  VDI 2055-1 states the same balance per year, multiplying
the installed cost by the annuity (capital recovery) factor, which is 1/(P/A); dividing every
total by the same P/A does not change which candidate is cheapest.
"""

from __future__ import annotations

from dataclasses import dataclass, field
from pathlib import Path

import numpy as np

from pipeins.errors import InputError, closest_names
from pipeins.tables import csv_rows

__all__ = [
    "HOURS_PER_LEAP_YEAR",
    "present_worth_factor",
    "annual_energy_j",
    "EnergyPrice",
    "EmissionFactor",
    "annual_cost",
    "annual_co2_kg",
    "CostTable",
    "ANY_SIZE",
    "simple_payback_years",
    "EconomicResult",
    "economic_thickness",
]

HOURS_PER_LEAP_YEAR = 8784.0
_SECONDS_PER_HOUR = 3600.0


def _first_bad(values: np.ndarray, ok: np.ndarray) -> float:
    return float(np.broadcast_to(values, ok.shape)[~ok].flat[0])


def _check_rate(value, name: str, what: str) -> np.ndarray:
    arr = np.asarray(value, dtype=float)
    ok = np.isfinite(arr) & (arr > -1.0)
    if not np.all(ok):
        raise InputError(
            name, f"{_first_bad(arr, ok):g} is not allowed; the {what} must be above -100 % per year "
            "(a fraction: 0.08 means 8 %)")
    return arr


def present_worth_factor(rate, years, escalation=0.0):
    r"""Present worth of a yearly series of 1, paid at the end of each year (P/A).

    The payment of year *k* is :math:`(1+g)^{k-1}` (escalating geometrically at *g*), discounted
    at *i*:

    .. math::

        \frac{P}{A} = \sum_{k=1}^{n} \frac{(1+g)^{k-1}}{(1+i)^{k}}
                    = \frac{1 - \left(\frac{1+g}{1+i}\right)^{n}}{i - g},
        \qquad \frac{P}{A} = \frac{n}{1+i} \ \text{when}\ i = g.

    With *g* = 0 it is the ordinary uniform-series present-worth factor
    :math:`[(1+i)^n - 1] / [i (1+i)^n]`.  Evaluated as
    ``expm1(n·log1p(d)) / ((1+i)·d)`` with d = (g − i)/(1 + i), accurate as *g* approaches *i*.
    Reference: any engineering-economy text's geometric-gradient series present worth, e.g.
    Newnan, Eschenbach and Lavelle, *Engineering Economic Analysis* (from memory).
    Valid for rate and escalation above −100 % and years ≥ 0 (years need not be whole).

    Parameters
    ----------
    rate : float or array_like
        Discount rate *i* [fraction per year], > −1.
    years : float or array_like
        Number of years *n*, ≥ 0.
    escalation : float or array_like, optional
        Yearly price escalation *g* [fraction per year], > −1.  Default 0.

    Returns
    -------
    numpy.ndarray
        P/A [years].

    Raises
    ------
    InputError
        ``--discount-rate``, ``--escalation`` or ``--years`` out of range.

    Examples
    --------
    >>> round(float(present_worth_factor(0.08, 10)), 4)
    6.7101
    >>> float(present_worth_factor(0.05, 10, escalation=0.05))  # 10 / 1.05
    9.523809523809524
    """
    i = _check_rate(rate, "--discount-rate", "discount rate")
    g = _check_rate(escalation, "--escalation", "escalation")
    n = np.asarray(years, dtype=float)
    ok = np.isfinite(n) & (n >= 0)
    if not np.all(ok):
        raise InputError("--years", f"{_first_bad(n, ok):g} is not allowed; the number of years must be 0 or more")
    i, g, n = np.broadcast_arrays(i, g, n)
    d = (g - i) / (1.0 + i)
    same = d == 0.0
    safe_d = np.where(same, 1.0, d)
    series = np.expm1(n * np.log1p(safe_d)) / ((1.0 + i) * safe_d)
    return np.where(same, n / (1.0 + i), series)


def annual_energy_j(heat_flow_w, hours_per_year, efficiency=1.0, cop=None):
    r"""Purchased energy per year to make up a heat loss (heating) or remove a heat gain (cooling).

    .. math:: E = \sum_j \frac{|\dot Q_j|\, h_j \cdot 3600}{\eta}
              \quad\text{or}\quad E = \sum_j \frac{|\dot Q_j|\, h_j \cdot 3600}{\mathrm{COP}}

    The sign of the heat flow is ignored: a loss and a gain both cost energy.  Give *hours* as a
    scalar for one operating condition, or as an array for a profile of conditions (the
    heat flow's last axis then runs over the conditions, and the result is summed over it),
    e.g. ``heat_flow_w`` of shape (n_thickness, n_conditions) with ``hours`` of shape
    (n_conditions,) gives one energy per thickness.

    Parameters
    ----------
    heat_flow_w : float or array_like
        Heat flow [W] (or [W/m] for energy per metre [J/m]).
    hours_per_year : float or array_like
        Operating hours per year [h]; each ≥ 0, a profile's total ≤ 8784 h (a leap year).
    efficiency : float or array_like, optional
        Heating plant efficiency, in (0, 1].  Default 1.
    cop : float or array_like, optional
        Coefficient of performance of the cooling plant, > 0.  Give either this or an
        efficiency, not both.

    Returns
    -------
    numpy.ndarray
        Purchased energy per year [J] (or [J/m]).

    Raises
    ------
    InputError
        ``--hours``, ``--efficiency``, ``--cop`` out of range, or ``heat_flow_w`` not finite.

    Examples
    --------
    50 W/m for 8000 h through a boiler of efficiency 0.8, in kWh per metre:

    >>> float(annual_energy_j(50.0, 8000.0, efficiency=0.8)) / 3.6e6
    500.0
    >>> float(annual_energy_j([40.0, 60.0], [4000.0, 2000.0])) / 3.6e6  # a two-condition profile
    280.0
    """
    q = np.abs(np.asarray(heat_flow_w, dtype=float))
    if not np.all(np.isfinite(q)):
        raise InputError("heat_flow_w", "heat flow must be a finite number of W (or W/m)")
    hours = np.asarray(hours_per_year, dtype=float)
    totals = hours.sum(axis=-1) if hours.ndim else hours
    for values in (hours, totals):
        ok = np.isfinite(values) & (values >= 0) & (values <= HOURS_PER_LEAP_YEAR)
        if not np.all(ok):
            raise InputError(
                "--hours", f"{_first_bad(values, ok):g} h is not allowed; operating hours must be "
                "between 0 and 8784 h per year")
    if cop is not None:
        if not np.all(np.asarray(efficiency, dtype=float) == 1.0):
            raise InputError("--cop", "give a COP (cooling) or an efficiency (heating), not both")
        divisor = np.asarray(cop, dtype=float)
        ok = np.isfinite(divisor) & (divisor > 0)
        if not np.all(ok):
            raise InputError("--cop", f"{_first_bad(divisor, ok):g} is not allowed; the COP must be greater than 0")
    else:
        divisor = np.asarray(efficiency, dtype=float)
        ok = np.isfinite(divisor) & (divisor > 0) & (divisor <= 1)
        if not np.all(ok):
            raise InputError(
                "--efficiency", f"{_first_bad(divisor, ok):g} is not allowed; the efficiency must be above 0 "
                "and at most 1 (a fraction: 0.85 means 85 %)")
    energy = q * hours * _SECONDS_PER_HOUR / divisor
    return energy.sum(axis=-1) if hours.ndim else energy


def _joules_per_unit(unit: str, option: str) -> float:
    from pipeins.units import energy_unit_joules

    try:
        return energy_unit_joules(unit)
    except InputError as exc:
        raise InputError(option, exc.message) from None


@dataclass(frozen=True)
class EnergyPrice:
    """Price of purchased energy: *price_per_unit* money per *unit* (kWh, MWh, MJ, GJ, therm, MMBtu …).

    Joules per unit come from :func:`pipeins.units.energy_unit_joules` (International Table Btu).

    >>> price = EnergyPrice(1.05, "therm", "USD")
    >>> round(price.price_per_j * 1e9, 4)  # USD per GJ
    9.9521
    """

    price_per_unit: float
    unit: str
    currency: str = ""

    def __post_init__(self):
        price = float(self.price_per_unit)
        if not (np.isfinite(price) and price >= 0):
            raise InputError("--energy-price", f"{price:g} is not allowed; the energy price must be 0 or more per {self.unit}")
        _joules_per_unit(self.unit, "--energy-price")

    @property
    def price_per_j(self) -> float:
        """Money per joule [currency/J]."""
        return float(self.price_per_unit) / _joules_per_unit(self.unit, "--energy-price")


@dataclass(frozen=True)
class EmissionFactor:
    """CO₂ emitted per unit of purchased energy: *kg_co2_per_unit* kg per *unit*.

    >>> round(EmissionFactor(0.2, "kWh").kg_per_j * 3.6e9, 6)  # kg per MWh
    200.0
    """

    kg_co2_per_unit: float
    unit: str

    def __post_init__(self):
        factor = float(self.kg_co2_per_unit)
        if not (np.isfinite(factor) and factor >= 0):
            raise InputError("--co2-factor", f"{factor:g} is not allowed; the emission factor must be 0 or more kg per {self.unit}")
        _joules_per_unit(self.unit, "--co2-factor")

    @property
    def kg_per_j(self) -> float:
        """kg CO₂ per joule [kg/J]."""
        return float(self.kg_co2_per_unit) / _joules_per_unit(self.unit, "--co2-factor")


def annual_cost(energy_j, price: EnergyPrice):
    """Yearly energy cost [currency] (or [currency/m]) of *energy_j* [J] (or [J/m]) at *price*.

    >>> float(annual_cost(3.6e9, EnergyPrice(0.10, "kWh", "EUR")))  # 1000 kWh
    100.0
    """
    units = np.asarray(energy_j, dtype=float) / _joules_per_unit(price.unit, "--energy-price")
    return units * float(price.price_per_unit)


def annual_co2_kg(energy_j, factor: EmissionFactor):
    """Yearly CO₂ [kg] (or [kg/m]) of *energy_j* [J] (or [J/m]) at emission *factor*.

    >>> float(annual_co2_kg(3.6e9, EmissionFactor(0.2, "kWh")))  # 1000 kWh
    200.0
    """
    units = np.asarray(energy_j, dtype=float) / _joules_per_unit(factor.unit, "--co2-factor")
    return units * float(factor.kg_co2_per_unit)


def _size_key(label: str) -> str:
    return "".join(str(label).split()).lower()


#: Square metres per square foot (exact: 0.3048² m²).
_M2_PER_FT2 = 0.09290304
#: The cost columns a table may have: per metre of pipe by size, or per area of surface.
_COST_COLUMNS = {"cost_per_m": ("per m", 1.0), "cost_per_m2": ("per m²", 1.0), "cost_per_ft2": ("per m²", 1 / _M2_PER_FT2)}
_THICKNESS_COLUMNS = {"thickness_mm": 1.0, "thickness_in": 25.4}
#: The key of the rows of an area table that serve every size (no size, or a blank one).
ANY_SIZE = ""


@dataclass(frozen=True, eq=False)
class CostTable:
    """Installed insulation cost by thickness, read from a user CSV: per metre of pipe by
    pipe size, or per square metre (or square foot) of the insulated surface.

    The CSV has a thickness column (``thickness_mm`` or ``thickness_in``) and one cost column:

    * ``cost_per_m`` with a ``size`` column (a label such as ``NPS 3`` or ``DN80``, matched
      ignoring case and spaces, so ``DN 80`` finds ``DN80``): installed cost per metre of pipe;
    * ``cost_per_m2`` or ``cost_per_ft2``: installed cost per unit area of the section's own
      surface before insulating (the sheet of a duct, the shell and heads of a vessel, a face;
      the trade prices duct wrap and board, and vessel insulation, by the area covered).  A
      ``size`` column is optional: rows without a size serve every size.

    Optionally ``currency`` (one currency for the whole file) and ``source``; lines starting
    with ``#`` are comments.  Costs are looked up, never interpolated: a missing size or
    thickness is an error.

    >>> demo = Path(__file__).resolve().parents[1] / "examples" / "costs_demo.csv"
    >>> table = CostTable.from_csv(demo)
    >>> table.currency, float(table.cost_per_m("nps  4", 0.050)), table.basis
    ('EUR', 44.85, 'per m')
    >>> ducts = CostTable.from_csv(demo.parent / "costs_duct_demo.csv")
    >>> ducts.basis, float(ducts.cost_per_m2("any duct", 0.050))
    ('per m²', 31.8)
    """

    name: str
    currency: str
    _costs: dict = field(repr=False)  # size key -> {thickness_mm rounded to 1e-3: cost}
    _labels: dict = field(repr=False)  # size key -> label as written
    #: ``"per m"`` (per metre of pipe, by size) or ``"per m²"`` (per m² of the section's surface).
    basis: str = "per m"

    @classmethod
    def from_csv(cls, path) -> "CostTable":
        """Read a cost table; problems raise InputError("--cost-table", "<file> row N: …")."""
        path = Path(path)
        name = path.name
        from .fileio import read_text_input

        text = read_text_input(path, "--cost-table")
        reader = csv_rows(text)
        fields = tuple(reader.fieldnames or ())
        cost_cols = [c for c in _COST_COLUMNS if c in fields]
        thick_cols = [c for c in _THICKNESS_COLUMNS if c in fields]
        if len(cost_cols) != 1 or len(thick_cols) != 1:
            raise InputError("--cost-table", f"{name} needs a thickness column (thickness_mm or thickness_in) and one "
                                             "cost column: cost_per_m (per metre of pipe, with size), cost_per_m2 or "
                                             "cost_per_ft2 (per area of surface); it has "
                                             f"{', '.join(fields) if fields else 'no columns'}")
        cost_col, thick_col = cost_cols[0], thick_cols[0]
        basis, to_si = _COST_COLUMNS[cost_col]
        if basis == "per m" and "size" not in fields:
            raise InputError("--cost-table", f"{name} needs the columns size, thickness_mm, cost_per_m; missing size")
        costs: dict[str, dict[float, float]] = {}
        labels: dict[str, str] = {}
        currencies = set()
        for number, row in enumerate(reader, start=1):
            where = f"{name} row {number}"
            label = " ".join((row.get("size") or "").split())
            if not label and basis == "per m":
                raise InputError("--cost-table", f"{where}: size is blank")
            values = []
            for column in (thick_col, cost_col):
                text_value = (row[column] or "").strip()
                try:
                    value = float(text_value)
                except ValueError:
                    raise InputError("--cost-table", f'{where}: {column} "{text_value}" is not a number') from None
                if not (np.isfinite(value) and value >= 0):
                    raise InputError("--cost-table", f'{where}: {column} "{text_value}" must be a number ≥ 0')
                values.append(value)
            thickness_mm = round(values[0] * _THICKNESS_COLUMNS[thick_col], 3)
            key = _size_key(label) if label else ANY_SIZE
            if thickness_mm in costs.get(key, {}):
                raise InputError("--cost-table", f"{where}: a second row for {label or 'every size'} at "
                                                 f"{thickness_mm:g} mm")
            costs.setdefault(key, {})[thickness_mm] = values[1] * to_si
            labels.setdefault(key, label or "every size")
            currencies.add((row.get("currency") or "").strip())
        if not costs:
            raise InputError("--cost-table", f"{name} has no rows")
        if len(currencies) > 1:
            raise InputError("--cost-table", f"{name} mixes currencies {', '.join(sorted(currencies))}; use one")
        return cls(name, currencies.pop(), costs, labels, basis)

    @property
    def per_area(self) -> bool:
        """Whether the costs are per m² of surface (not per metre of pipe)."""
        return self.basis == "per m²"

    @property
    def sizes(self) -> tuple[str, ...]:
        """Size labels in file order."""
        return tuple(self._labels.values())

    def _row(self, size_label: str) -> dict[float, float]:
        key = _size_key(size_label)
        if key in self._costs:
            return self._costs[key]
        if ANY_SIZE in self._costs:
            return self._costs[ANY_SIZE]
        raise InputError("--cost-table", f"{self.name} has no row for {size_label}; {closest_names(str(size_label), self.sizes)}")

    def _label(self, size_label: str) -> str:
        key = _size_key(size_label)
        return self._labels[key if key in self._costs else ANY_SIZE]

    def thicknesses_m(self, size_label: str) -> np.ndarray:
        """Thicknesses [m] listed for *size_label*, ascending."""
        return np.array(sorted(self._row(size_label))) * 1e-3

    def _cost(self, size_label: str, thickness_m):
        row = self._row(size_label)
        mm = np.round(np.asarray(thickness_m, dtype=float) * 1000.0, 3)
        out = np.empty(mm.shape)
        for index, value in np.ndenumerate(mm):
            if float(value) not in row:
                listed = ", ".join(f"{t:g}" for t in sorted(row))
                raise InputError(
                    "--cost-table", f"{self.name} has no row for {self._label(size_label)} at "
                    f"{float(value):g} mm; it lists {listed} mm")
            out[index] = row[float(value)]
        return out

    def cost_per_m(self, size_label: str, thickness_m):
        """Installed cost [currency/m] of *thickness_m* [m] (scalar or array) on *size_label*
        (a table per metre of pipe)."""
        if self.per_area:
            raise InputError("--cost-table", f"{self.name} prices per m² of surface, not per metre of pipe; "
                                             "give a table with size, thickness_mm, cost_per_m")
        return self._cost(size_label, thickness_m)

    def cost_per_m2(self, size_label: str, thickness_m):
        """Installed cost [currency/m²] of *thickness_m* [m] per m² of surface (a table per area)."""
        if not self.per_area:
            raise InputError("--cost-table", f"{self.name} prices per metre of pipe by size; a duct, face or vessel "
                                             "is priced per m² of its surface: give a table with thickness_mm and "
                                             "cost_per_m2 (or cost_per_ft2)")
        return self._cost(size_label, thickness_m)

    def installed_cost(self, size_label: str, thickness_m, area_m2_per_unit=None):
        """Installed cost of *thickness_m* [m] per unit of the section: per metre of pipe from
        a table per metre; *area_m2_per_unit* [m² per m of run, per m² of face, per vessel]
        times the cost per m² from a table per area."""
        if not self.per_area:
            return self.cost_per_m(size_label, thickness_m)
        if area_m2_per_unit is None:
            raise InputError("--cost-table", f"{self.name} prices per m² of surface: the surface area is needed")
        return self.cost_per_m2(size_label, thickness_m) * np.asarray(area_m2_per_unit, dtype=float)


def simple_payback_years(installed_cost, annual_saving):
    """Installed cost divided by the yearly saving [years]; ``inf`` when the saving is ≤ 0.

    >>> simple_payback_years([1200.0, 1200.0], [400.0, 0.0]).tolist()
    [3.0, inf]
    """
    cost = np.asarray(installed_cost, dtype=float)
    saving = np.asarray(annual_saving, dtype=float)
    if not np.all(np.isfinite(cost) & (cost >= 0)):
        raise InputError("installed_cost", "installed cost must be a finite number ≥ 0")
    if not np.all(np.isfinite(saving)):
        raise InputError("annual_saving", "annual saving must be a finite number")
    cost, saving = np.broadcast_arrays(cost, saving)
    return np.divide(cost, saving, out=np.full(cost.shape, np.inf), where=saving > 0)


@dataclass(frozen=True)
class EconomicResult:
    """Life-cycle cost curve over candidate thicknesses (last axis) and the cheapest one.

    Money per metre of pipe, present value over the evaluation period.  ``warnings`` holds
    structured notes (:class:`pipeins.notes.Note`: ``economic.at_thickest`` and
    ``economic.at_thinnest`` when the cheapest candidate is the thickest or thinnest one
    given; :mod:`pipeins.reports.notes` writes them).
    """

    thickness_m: np.ndarray
    installed_cost_per_m: np.ndarray
    energy_pv_per_m: np.ndarray
    maintenance_pv_per_m: np.ndarray
    total_per_m: np.ndarray
    best_index: np.ndarray
    present_worth_factor: np.ndarray
    warnings: tuple = ()

    @property
    def best_thickness_m(self) -> np.ndarray:
        """The economic thickness [m]."""
        return self.thickness_m[self.best_index]

    @property
    def best_total_per_m(self) -> np.ndarray:
        """Life-cycle cost at the economic thickness [currency/m]."""
        return np.take_along_axis(self.total_per_m, np.expand_dims(self.best_index, -1), axis=-1)[..., 0]


def economic_thickness(
    thicknesses_m,
    installed_cost_per_m,
    annual_energy_cost_per_m,
    rate,
    years,
    escalation=0.0,
    maintenance_fraction=0.0,
) -> EconomicResult:
    r"""Candidate thickness with the lowest life-cycle cost per metre.

    .. math::

        C(t) = I(t) + E(t)\,\frac{P}{A}(i, n, g) + m\,I(t)\,\frac{P}{A}(i, n, 0)

    with *I* the installed cost, *E* the first-year energy cost (escalating at *g*), *m* the
    optional yearly maintenance cost as a fraction of the installed cost (VDI 2055-1 counts
    maintenance as a yearly percentage of the investment; it is not escalated here) and P/A
    from :func:`present_worth_factor`.  Method after VDI 2055 Part 1, economic insulation
    thickness (from memory); see the module docstring.  The candidates are the thicknesses one
    can buy: nothing is interpolated, so the answer is exactly one of them.

    Parameters
    ----------
    thicknesses_m : array_like
        Candidate thicknesses [m], 1-D, ascending, ≥ 0.
    installed_cost_per_m : array_like
        Installed cost of each candidate [currency/m]; broadcasts against the thicknesses
        (leading axes allowed, e.g. one row per pipe size).
    annual_energy_cost_per_m : array_like
        First-year energy cost with each candidate [currency/(m·year)], same broadcasting.
    rate, years, escalation : float
        Discount rate, evaluation period and energy-price escalation, see
        :func:`present_worth_factor`.
    maintenance_fraction : float, optional
        Yearly maintenance cost as a fraction of the installed cost, ≥ 0.  Default 0.

    Returns
    -------
    EconomicResult
        Its ``warnings`` note a minimum at the first or last candidate (the true optimum may
        lie outside the range given).

    Examples
    --------
    >>> t = [0.025, 0.050, 0.075, 0.100]
    >>> result = economic_thickness(t, [20.0, 30.0, 40.0, 50.0], [8.0, 4.0, 2.7, 2.0], 0.08, 10)
    >>> float(result.best_thickness_m), [round(x, 2) for x in result.total_per_m.tolist()]
    (0.05, [73.68, 56.84, 58.12, 63.42])
    """
    t = np.asarray(thicknesses_m, dtype=float)
    if t.ndim != 1 or t.size == 0 or not np.all(np.isfinite(t) & (t >= 0)) or np.any(np.diff(t) <= 0):
        raise InputError("thicknesses_m", "candidate thicknesses must be a 1-D list of distinct values ≥ 0 m in ascending order")
    installed = np.asarray(installed_cost_per_m, dtype=float)
    energy = np.asarray(annual_energy_cost_per_m, dtype=float)
    for name, values in (("installed_cost_per_m", installed), ("annual_energy_cost_per_m", energy)):
        if not np.all(np.isfinite(values) & (values >= 0)):
            raise InputError(name, "costs must be finite numbers ≥ 0")
    m = float(maintenance_fraction)
    if not (np.isfinite(m) and m >= 0):
        raise InputError("--maintenance", f"{m:g} is not allowed; the maintenance fraction must be 0 or more per year")
    try:
        installed, energy, _ = np.broadcast_arrays(installed, energy, t)
    except ValueError:
        raise InputError("installed_cost_per_m", "costs must broadcast against the candidate thicknesses (last axis)") from None
    pwf_energy = present_worth_factor(rate, years, escalation)
    pwf_plain = present_worth_factor(rate, years, 0.0)
    energy_pv = energy * pwf_energy
    maintenance_pv = m * installed * pwf_plain
    total = installed + energy_pv + maintenance_pv
    best = np.argmin(total, axis=-1)
    warnings = []
    if t.size > 1:
        from .notes import note

        if np.any(best == t.size - 1):
            warnings.append(note("economic.at_thickest", thickness_m=(float(t[-1]), "thickness")))
        if np.any(best == 0) and t[0] > 0:
            warnings.append(note("economic.at_thinnest", thickness_m=(float(t[0]), "thickness")))
    return EconomicResult(
        thickness_m=t,
        installed_cost_per_m=installed.copy(),
        energy_pv_per_m=energy_pv,
        maintenance_pv_per_m=maintenance_pv,
        total_per_m=total,
        best_index=best,
        present_worth_factor=pwf_energy,
        warnings=tuple(warnings),
    )
