"""The liquids shipped as property tables: glycols, brines and two heat-transfer oils.

Each entry is one of CoolProp's incompressible fits, tabulated by
``python -m pipeins.props.generate`` into ``tables/fluid_<name>.csv`` so that the common
heat-transfer liquids never import CoolProp (about 2 s).  Why these:

* ethylene and propylene glycol in water – the antifreezes of chilled-water, process
  cooling and solar loops; 10, 20, 25, 30, 35, 40, 50 and 60 % by mass, the contents
  engineers name (CoolProp ``INCOMP::MEG`` / ``INCOMP::MPG``, Melinder 2010 fits, valid
  0–60 %);
* calcium chloride (10–30 % every 5 %) and sodium chloride (5, 10, 15, 20, 23 %) brines –
  the classic secondary refrigerants of cold stores, ice rinks and food plants
  (``INCOMP::MCA``, ``INCOMP::MNA``, Melinder 2010; 30 % and 23 % are the fits' upper
  limits, near each salt's eutectic);
* potassium formate (10–40 %, 48 %) and potassium acetate (10–40 %, 45 %) – the
  low-viscosity, glycol-free secondary refrigerants of supermarket and food-industry
  cooling (``INCOMP::MKF``, ``INCOMP::MKA``, Melinder 2010, to the fits' upper limits);
* a hydrotreated mineral heat-transfer oil (``INCOMP::PNF``, -10 to 315 °C) and a
  synthetic aromatic heat-transfer oil (``INCOMP::TVP1``, CoolProp's fit of the
  diphenyl/diphenyl-oxide eutectic – chemistry from memory; 12 to 397 °C): the two
  families of hot-oil lines in process heating, the most insulated oil service.

Other concentrations of these families and every other CoolProp fluid are tabulated
from CoolProp on first use (see :mod:`pipeins.props.liquids`).

Each solution is tabulated from its freezing point (CoolProp ``T_freeze``) to CoolProp's
upper limit, each oil from CoolProp's lower to its upper limit, on a uniform grid of at
most 0.5 K (:func:`grid_k`: the end points are exact, the step is the range divided into
equal intervals), so a lookup may find its interval by index arithmetic.
"""

from __future__ import annotations

import csv
import functools
import math
from dataclasses import dataclass

import numpy as np

__all__ = [
    "SolutionFamily",
    "SOLUTIONS",
    "OILS",
    "GRID_STEP_K",
    "grid_k",
    "table_name",
    "shipped_table",
]

#: Largest temperature step of a property grid [K].
GRID_STEP_K = 0.5

_CELSIUS_TO_KELVIN = 273.15


@dataclass(frozen=True)
class SolutionFamily:
    """An aqueous solution CoolProp fits over a range of mass fractions.

    Attributes
    ----------
    label : str
        Name in canonical fluid names (``"30% propylene glycol"``).
    code : str
        CoolProp incompressible code (``INCOMP::<code>[x]``).
    max_percent : float
        Highest mass percentage CoolProp's fit accepts [%].
    shipped_percents : tuple of float
        Mass percentages shipped as tables [%].
    aliases : tuple of str
        Regular expressions (lower case) for the solute as users write it.
    content_word : str
        Word used in the out-of-range message ("glycol content 70 % …").
    source : str
        The fit CoolProp evaluates.
    """

    label: str
    code: str
    max_percent: float
    shipped_percents: tuple[float, ...]
    aliases: tuple[str, ...]
    content_word: str
    source: str

    @property
    def table(self) -> str:
        return table_name(self.label)


_GLYCOL_PERCENTS = (10.0, 20.0, 25.0, 30.0, 35.0, 40.0, 50.0, 60.0)

#: label -> family, in the order error messages list them.
SOLUTIONS: dict[str, SolutionFamily] = {
    family.label: family
    for family in (
        SolutionFamily("ethylene glycol", "MEG", 60.0, _GLYCOL_PERCENTS,
                       (r"(?:mono)?ethylene\s*glycol", "meg", "eg"), "glycol",
                       "Melinder 2010"),
        SolutionFamily("propylene glycol", "MPG", 60.0, _GLYCOL_PERCENTS,
                       (r"(?:mono)?propylene\s*glycol", "mpg", "pg"), "glycol",
                       "Melinder 2010"),
        SolutionFamily("calcium chloride", "MCA", 30.0, (10.0, 15.0, 20.0, 25.0, 30.0),
                       (r"calcium\s*chloride", "cacl2", "mca"), "calcium chloride",
                       "Melinder 2010"),
        SolutionFamily("sodium chloride", "MNA", 23.0, (5.0, 10.0, 15.0, 20.0, 23.0),
                       (r"sodium\s*chloride", "nacl", "mna"), "sodium chloride",
                       "Melinder 2010"),
        SolutionFamily("potassium formate", "MKF", 48.0, (10.0, 20.0, 30.0, 40.0, 48.0),
                       (r"potassium\s*formate", "mkf"), "potassium formate",
                       "Melinder 2010"),
        SolutionFamily("potassium acetate", "MKA", 45.0, (10.0, 20.0, 30.0, 40.0, 45.0),
                       (r"potassium\s*acetate", "mka"), "potassium acetate",
                       "Melinder 2010"),
    )
}

#: CoolProp name of a shipped pure incompressible liquid -> description.
OILS: dict[str, str] = {
    "INCOMP::PNF": "hydrotreated mineral heat-transfer oil",
    "INCOMP::TVP1": "synthetic aromatic heat-transfer oil (diphenyl/diphenyl-oxide eutectic)",
}


def table_name(fluid: str) -> str:
    """The ``tables/`` name holding *fluid* (a family label or an oil's CoolProp name).

    >>> table_name("propylene glycol"), table_name("INCOMP::TVP1")
    ('fluid_propylene_glycol', 'fluid_oil_tvp1')
    """
    if fluid.upper().startswith("INCOMP::"):
        return "fluid_oil_" + fluid.split("::", 1)[1].lower()
    return "fluid_" + fluid.replace(" ", "_")


def grid_k(low_k: float, top_k: float, step_k: float = GRID_STEP_K) -> np.ndarray:
    """A uniform temperature grid [K] from *low_k* to *top_k* with a step of at most *step_k*.

    >>> grid_k(270.0, 271.2)
    array([270. , 270.4, 270.8, 271.2])
    """
    intervals = max(1, math.ceil((top_k - low_k) / step_k - 1e-9))
    return np.linspace(low_k, top_k, intervals + 1)


def shipped_table(fluid: str) -> dict | None:
    """The shipped table of canonical *fluid*, or ``None`` when it is not shipped.

    Returns a dict of arrays: ``temp_c``, ``density_kg_m3``, ``ln_viscosity``,
    ``conductivity_w_mk``, ``heat_capacity_j_kgk``, and ``freezes`` (bool: the first row
    is the freezing point).  No CoolProp import.

    >>> table = shipped_table("30% propylene glycol")
    >>> round(float(table["temp_c"][0]), 2), float(table["temp_c"][-1])
    (-12.79, 100.0)
    >>> shipped_table("33% propylene glycol") is None
    True
    """
    if fluid in OILS:
        return _table_of(table_name(fluid), None)
    percent, _, label = fluid.partition("% ")
    family = SOLUTIONS.get(label)
    if family is None:
        return None
    try:
        value = float(percent)
    except ValueError:
        return None
    if value not in family.shipped_percents:
        return None
    return _table_of(family.table, value)


_COLUMNS = ("temp_c", "density_kg_m3", "viscosity_pa_s", "conductivity_w_mk",
            "heat_capacity_j_kgk")


@functools.cache
def _table_text(name: str) -> tuple[list[str], list[str]]:
    from pipeins.tables import table_path

    lines = [
        line for line in table_path(name).read_text(encoding="utf-8").splitlines()
        if line.strip() and not line.startswith("#")
    ]
    return next(csv.reader(lines[:1])), lines[1:]


@functools.cache
def _table_of(name: str, percent: float | None) -> dict:
    # Only the rows of one mass percentage are parsed (a family file holds several).
    header, lines = _table_text(name)
    if percent is not None:
        assert header[0] == "mass_percent", name
        prefix = f"{percent:g},"
        lines = [line for line in lines if line.startswith(prefix)]
    index = [header.index(column) for column in _COLUMNS]
    values = np.array([[row[i] for i in index] for row in csv.reader(lines)], dtype=float)
    cols = dict(zip(_COLUMNS, values.T))
    return {
        "temp_c": cols["temp_c"],
        "density_kg_m3": cols["density_kg_m3"],
        "ln_viscosity": np.log(cols["viscosity_pa_s"]),
        "conductivity_w_mk": cols["conductivity_w_mk"],
        "heat_capacity_j_kgk": cols["heat_capacity_j_kgk"],
        "freezes": percent is not None,
    }
