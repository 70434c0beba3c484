"""Regenerate the shipped property tables from CoolProp.

Run ``python -m pipeins.props.generate`` (optionally ``--out-dir DIR``) to rewrite

* ``tables/air_properties.csv`` – dry air at 101 325 Pa, -100 to 1000 °C every 2 K;
* ``tables/water_properties.csv`` – saturated liquid water, 0 to 200 °C every 0.5 K;
* ``tables/steam_saturation.csv`` – saturated steam, 1 kPa to 20 MPa absolute,
  100 points per decade of pressure;
* ``tables/water_vapour_saturation.csv`` – saturation vapour pressure of water over
  ice (below the triple point, 0.01 °C) and over liquid water, -100 to 200 °C every 1 K
  plus the triple point;
* ``tables/fluid_<solution>.csv`` – glycols and brines at their shipped mass
  percentages, and ``tables/fluid_oil_<code>.csv`` – two heat-transfer oils, each on a
  uniform grid of at most 0.5 K over CoolProp's range (the set and why:
  :mod:`pipeins.props.fluid_tables`).

Importing CoolProp takes seconds, so the runtime modules read these CSV files instead;
CoolProp is only imported here and for fluids that are not shipped.  Each row carries a
``source`` column naming CoolProp's version and the equation of state it evaluates;
the file header records the command, CoolProp version and date.  The row builders
(``air_rows`` …) are public so the test-suite can regenerate the values in memory and
compare them with the shipped files.

This module never prints; ``main`` returns the written paths.
"""

from __future__ import annotations

import argparse
import datetime as _dt
from pathlib import Path

import numpy as np

__all__ = [
    "TABLE_BUILDERS",
    "air_rows",
    "water_rows",
    "steam_rows",
    "vapour_rows",
    "solution_rows",
    "oil_rows",
    "coolprop_version",
    "format_table",
    "write_tables",
    "main",
]

_CELSIUS_TO_KELVIN = 273.15
_TRIPLE_POINT_K = 273.16
_DIGITS = "{:.12g}"


def coolprop_version() -> str:
    """The installed CoolProp version string, e.g. ``'8.0.0'``."""
    import CoolProp

    return CoolProp.__version__


def _props_si():
    from CoolProp.CoolProp import PropsSI

    return PropsSI


def air_rows() -> list[dict]:
    """Dry air (CoolProp pseudo-pure ``Air``) at 101 325 Pa, -100 to 1000 °C every 2 K."""
    props_si = _props_si()
    temp_c = np.arange(-100.0, 1000.0 + 1.0, 2.0)
    temp_k = temp_c + _CELSIUS_TO_KELVIN
    pressure_pa = np.full_like(temp_k, 101_325.0)
    cols = {
        name: np.asarray(props_si(key, "T", temp_k, "P", pressure_pa, "Air"), float)
        for name, key in (
            ("density_kg_m3", "D"),
            ("viscosity_pa_s", "V"),
            ("conductivity_w_mk", "L"),
            ("heat_capacity_j_kgk", "CPMASS"),
        )
    }
    source = (
        f"CoolProp {coolprop_version()} PropsSI, Air (Lemmon et al. 2000 EOS; "
        "Lemmon and Jacobsen 2004 viscosity and conductivity)"
    )
    return [
        {"temp_c": temp_c[i], "pressure_pa": pressure_pa[i], **{k: v[i] for k, v in cols.items()},
         "source": source}
        for i in range(temp_c.size)
    ]


def water_rows() -> list[dict]:
    """Saturated liquid water (CoolProp ``Water``, Q = 0), 0 to 200 °C every 0.5 K.

    The 0 °C row lies 0.01 K below the triple point, on IAPWS-95's metastable
    extension of the liquid, which CoolProp evaluates.
    """
    props_si = _props_si()
    temp_c = np.arange(0.0, 200.0 + 0.25, 0.5)
    temp_k = temp_c + _CELSIUS_TO_KELVIN
    quality = np.zeros_like(temp_k)
    cols = {
        name: np.asarray(props_si(key, "T", temp_k, "Q", quality, "Water"), float)
        for name, key in (
            ("pressure_pa", "P"),
            ("density_kg_m3", "D"),
            ("viscosity_pa_s", "V"),
            ("conductivity_w_mk", "L"),
            ("heat_capacity_j_kgk", "CPMASS"),
        )
    }
    source = (
        f"CoolProp {coolprop_version()} PropsSI, Water saturated liquid (IAPWS-95; "
        "IAPWS 2008 viscosity; IAPWS 2011 conductivity)"
    )
    return [
        {"temp_c": temp_c[i], **{k: v[i] for k, v in cols.items()}, "source": source}
        for i in range(temp_c.size)
    ]


def steam_rows() -> list[dict]:
    """Saturated steam, 1 kPa to 20 MPa absolute, 100 points per decade (uniform in ln p)."""
    props_si = _props_si()
    ln_p = np.linspace(np.log(1.0e3), np.log(2.0e7), 431)
    pressure_pa = np.exp(ln_p)
    pressure_pa[0], pressure_pa[-1] = 1.0e3, 2.0e7
    liquid = np.zeros_like(pressure_pa)
    temp_k = np.asarray(props_si("T", "P", pressure_pa, "Q", liquid, "Water"), float)
    h_liquid = np.asarray(props_si("H", "P", pressure_pa, "Q", liquid, "Water"), float)
    h_vapour = np.asarray(props_si("H", "P", pressure_pa, "Q", liquid + 1.0, "Water"), float)
    source = f"CoolProp {coolprop_version()} PropsSI, Water saturation (IAPWS-95)"
    return [
        {
            "pressure_pa": pressure_pa[i],
            "saturation_temp_c": temp_k[i] - _CELSIUS_TO_KELVIN,
            "latent_heat_j_kg": h_vapour[i] - h_liquid[i],
            "source": source,
        }
        for i in range(pressure_pa.size)
    ]


def vapour_rows() -> list[dict]:
    """Saturation vapour pressure of water, -100 to 200 °C every 1 K plus 0.01 °C.

    Below the triple point (273.16 K): over ice, CoolProp's humid-air ``p_ws``
    (``HAProps_Aux``), which is the IAPWS 2011 sublimation-pressure equation (Wagner,
    Riethmann, Feistel and Harvey 2011).  From the triple point up: over liquid water,
    CoolProp ``PropsSI('P', 'T', T, 'Q', 0, 'Water')`` (IAPWS-95).
    """
    from CoolProp.CoolProp import HAProps_Aux

    props_si = _props_si()
    version = coolprop_version()
    temp_c = np.sort(np.append(np.arange(-100.0, 200.0 + 0.5, 1.0), 0.01))
    temp_k = temp_c + _CELSIUS_TO_KELVIN
    rows = []
    liquid = temp_k >= _TRIPLE_POINT_K - 1e-9
    p_liquid = np.asarray(
        props_si("P", "T", temp_k[liquid], "Q", np.zeros(liquid.sum()), "Water"), float
    )
    # HAProps_Aux takes scalars only; this loop runs once, when the table is generated.
    p_ice = [HAProps_Aux("p_ws", float(t), 101_325.0, 0.0)[0] for t in temp_k[~liquid]]
    pressure = np.empty_like(temp_k)
    pressure[liquid] = p_liquid
    pressure[~liquid] = p_ice
    for i in range(temp_c.size):
        if liquid[i]:
            phase, source = "liquid", f"CoolProp {version} PropsSI, Water saturation (IAPWS-95)"
        else:
            phase = "ice"
            source = f"CoolProp {version} HAProps_Aux p_ws, ice sublimation (IAPWS 2011)"
        rows.append({"temp_c": temp_c[i], "vapour_pressure_pa": pressure[i],
                     "phase": phase, "source": source})
    return rows


_INCOMP_KEYS = (
    ("density_kg_m3", "D"),
    ("viscosity_pa_s", "V"),
    ("conductivity_w_mk", "L"),
    ("heat_capacity_j_kgk", "CPMASS"),
)


#: Pressure at which ``INCOMP::`` fluids are evaluated [Pa]: CoolProp's incompressible
#: fits do not depend on pressure, but refuse states below a fit's vapour pressure (the
#: synthetic oil boils at about 257 °C at 1 atm and runs pressurised above it).
INCOMP_PRESSURE_PA = 1.0e7

#: Significant digits of the fluid tables (the fits themselves hold 3 to 4).
FLUID_DIGITS = 9


def incompressible_columns(coolprop_name: str, temp_k) -> dict[str, np.ndarray]:
    """Density, viscosity, conductivity and heat capacity of an ``INCOMP::`` fluid at
    *temp_k* [K] (at :data:`INCOMP_PRESSURE_PA`)."""
    props_si = _props_si()
    temp_k = np.asarray(temp_k, float)
    pressure = np.full_like(temp_k, INCOMP_PRESSURE_PA)
    return {
        name: np.asarray(props_si(key, "T", temp_k, "P", pressure, coolprop_name), float)
        for name, key in _INCOMP_KEYS
    }


def _rounded(value: float) -> float:
    return float(f"{value:.{FLUID_DIGITS}g}")


def solution_rows(label: str) -> list[dict]:
    """Every shipped mass percentage of the solution *label* (a key of
    :data:`pipeins.props.fluid_tables.SOLUTIONS`), freezing point to CoolProp's upper limit."""
    from pipeins.props.fluid_tables import SOLUTIONS, grid_k

    props_si = _props_si()
    family = SOLUTIONS[label]
    version = coolprop_version()
    rows = []
    for percent in family.shipped_percents:
        name = f"INCOMP::{family.code}[{percent / 100.0:g}]"
        temp_k = grid_k(props_si("T_freeze", name), props_si("Tmax", name))
        cols = incompressible_columns(name, temp_k)
        source = f"CoolProp {version} {name} ({family.source})"
        rows.extend(
            {"mass_percent": percent, "temp_c": _rounded(temp_k[i] - _CELSIUS_TO_KELVIN),
             **{k: _rounded(v[i]) for k, v in cols.items()}, "source": source}
            for i in range(temp_k.size)
        )
    return rows


def oil_rows(name: str) -> list[dict]:
    """The heat-transfer oil *name* (a key of :data:`pipeins.props.fluid_tables.OILS`)
    from CoolProp's lower to its upper limit."""
    from pipeins.props.fluid_tables import grid_k

    props_si = _props_si()
    temp_k = grid_k(props_si("Tmin", name), props_si("Tmax", name))
    cols = incompressible_columns(name, temp_k)
    source = f"CoolProp {coolprop_version()} {name} (incompressible fit)"
    return [
        {"temp_c": _rounded(temp_k[i] - _CELSIUS_TO_KELVIN),
         **{k: _rounded(v[i]) for k, v in cols.items()}, "source": source}
        for i in range(temp_k.size)
    ]


def _fluid_builders() -> dict:
    import functools

    from pipeins.props.fluid_tables import OILS, SOLUTIONS, table_name

    builders = {}
    for label, family in SOLUTIONS.items():
        percents = ", ".join(f"{p:g}" for p in family.shipped_percents)
        builders[table_name(label)] = (
            functools.partial(solution_rows, label),
            f"Aqueous {label} at {percents} % by mass, freezing point to CoolProp's upper "
            "limit, uniform grid of at most 0.5 K per mass percentage.",
        )
    for name, description in OILS.items():
        builders[table_name(name)] = (
            functools.partial(oil_rows, name),
            f"{name}, {description}, CoolProp's range on a uniform grid of at most 0.5 K.",
        )
    return builders


#: table name -> (row builder, description comment)
TABLE_BUILDERS = {
    "air_properties": (
        air_rows,
        "Dry air at 101325 Pa; runtime scales density with pressure (ideal gas).",
    ),
    "water_properties": (
        water_rows,
        "Saturated liquid water (pressure_pa = saturation pressure).",
    ),
    "steam_saturation": (
        steam_rows,
        "Saturated steam; pressures absolute, grid uniform in ln(p), 100 points per decade.",
    ),
    "water_vapour_saturation": (
        vapour_rows,
        "Saturation vapour pressure of water over ice below 0.01 C, over liquid from 0.01 C.",
    ),
    **_fluid_builders(),
}


def format_table(rows: list[dict], comment: str, date: str | None = None) -> str:
    """CSV text of *rows* (floats with 12 significant digits) under two ``#`` header lines."""
    date = date or _dt.date.today().isoformat()
    columns = list(rows[0])
    lines = [
        f"# generated by python -m pipeins.props.generate, CoolProp {coolprop_version()}, {date}",
        f"# {comment}",
        ",".join(columns),
    ]
    for row in rows:
        cells = []
        for column in columns:
            value = row[column]
            if isinstance(value, str):
                cells.append(f'"{value}"' if "," in value else value)
            else:
                cells.append(_DIGITS.format(float(value)))
        lines.append(",".join(cells))
    return "\n".join(lines) + "\n"


def _default_out_dir() -> Path:
    return Path(__file__).resolve().parents[2] / "tables"


def write_tables(out_dir=None, names=None) -> list[Path]:
    """Write the tables *names* (default: all) into *out_dir* (default: ``tables/``)."""
    out_dir = Path(out_dir) if out_dir is not None else _default_out_dir()
    out_dir.mkdir(parents=True, exist_ok=True)
    written = []
    for name in names or TABLE_BUILDERS:
        builder, comment = TABLE_BUILDERS[name]
        path = out_dir / f"{name}.csv"
        path.write_text(format_table(builder(), comment), encoding="utf-8")
        written.append(path)
    return written


def main(argv=None) -> list[Path]:
    """Command-line entry point: ``python -m pipeins.props.generate [--out-dir DIR]``."""
    parser = argparse.ArgumentParser(description="Regenerate the shipped property tables.")
    parser.add_argument("--out-dir", default=None, help="folder to write (default: tables/)")
    parser.add_argument("names", nargs="*", help="tables to write (default: all of "
                        + ", ".join(TABLE_BUILDERS) + ")")
    args = parser.parse_args(argv)
    unknown = [name for name in args.names if name not in TABLE_BUILDERS]
    if unknown:
        parser.error(f"unknown table {unknown[0]!r}; choose from {', '.join(TABLE_BUILDERS)}")
    return write_tables(args.out_dir, args.names or None)


if __name__ == "__main__":
    main()
