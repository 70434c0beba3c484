"""Published checks shipped with pipeins: worked examples and reference-library values.

Each :class:`Check` names its source, the quantity, the published (or reference) value
and the tolerance it is held to, and computes pipeins' value through the library.  The
test-suite (``tests/test_verification.py``) runs the same records, and ``pipeins
verify`` prints them, so the verification report cannot drift from the tests.

Two kinds of source:

* **worked examples and published formulas** – textbook examples, values printed in a
  library's documentation, a standard's footnote; a value recalled rather than read
  again says "from memory";
* **reference libraries** – values computed by ``iapws``, ``psychrolib``, ``ht`` (with
  CoolProp air) and CoolProp at the state given, shipped here as numbers with the
  library version named, since those libraries are test-only dependencies; the tests
  recompute each one live and compare it with the number shipped here.

Tolerances follow the digits the source prints (worked examples) or the agreement the
method promises (reference libraries).  This module never prints.
"""

from __future__ import annotations

import functools
import math
from dataclasses import dataclass
from typing import Callable

__all__ = ["Check", "Outcome", "CHECKS", "REFERENCES", "run_checks"]


@dataclass(frozen=True)
class Check:
    """One published check.

    Attributes
    ----------
    id : str
        Short stable name (``"incropera-9.3-heat-flow"``).
    source : str
        The publication, standard or library (with version) and where in it.
    quantity : str
        What is compared, with the state it is compared at.
    unit : str
        Unit of *expected* and of the computed value (SI).
    expected : float
        The published or reference value [*unit*].
    tolerance : float
        Largest deviation that passes: a fraction of *expected* when *relative*, else an
        absolute difference [*unit*].
    relative : bool
        Whether *tolerance* is relative.
    compute : callable
        ``compute() -> float``: pipeins' value [*unit*].
    kind : str
        ``"worked example"`` or ``"reference library"``.
    """

    id: str
    source: str
    quantity: str
    unit: str
    expected: float
    tolerance: float
    relative: bool
    compute: Callable[[], float]
    kind: str

    def evaluate(self) -> "Outcome":
        """Compute pipeins' value and compare it with the published one."""
        actual = float(self.compute())
        difference = actual - self.expected
        deviation = difference / self.expected if self.relative else difference
        passed = math.isfinite(actual) and abs(deviation) <= self.tolerance
        return Outcome(self, actual, deviation, passed)


@dataclass(frozen=True)
class Outcome:
    """A check's result: pipeins' value, the deviation (relative when the check's
    tolerance is) and whether it is within the tolerance."""

    check: Check
    actual: float
    deviation: float
    passed: bool

    def to_dict(self) -> dict:
        c = self.check
        return {
            "id": c.id,
            "source": c.source,
            "quantity": c.quantity,
            "kind": c.kind,
            "unit": c.unit,
            "expected": c.expected,
            "actual": self.actual,
            "deviation": self.deviation,
            "tolerance": c.tolerance,
            "tolerance_kind": "relative" if c.relative else "absolute",
            "passed": self.passed,
        }


def run_checks(checks=None) -> list[Outcome]:
    """Evaluate *checks* (default: every shipped check), in order."""
    return [check.evaluate() for check in (CHECKS if checks is None else checks)]


# ----------------------------------------------------------------------------- pipeins' side
@functools.cache
def _cengel_insulated_steam_pipe():
    from .catalog.materials import lookup_material
    from .model import Fluid, Layer, Pipe, Surface, Surroundings
    from .solve import solve

    return solve(Pipe(0.055, 0.0025, 80.0), [Layer(lookup_material("k=0.05"), 0.03)], Fluid(320.0, 60.0),
                 Surroundings(5.0), Surface(fixed_coefficient_w_m2k=18.0))


def _cengel_heat_flow():
    return float(_cengel_insulated_steam_pipe().heat_flow_w_per_m)


def _cengel_drop():
    temps = _cengel_insulated_steam_pipe().interface_temps_c
    return float(temps[1] - temps[2])


@functools.cache
def _incropera_bare_pipe():
    # a bare, very conductive wall with no inner film holds the surface at 165 °C
    from .model import Fluid, Pipe, Surface, Surroundings
    from .solve import solve

    r = solve(Pipe(0.1, 0.001, 1e6), [], Fluid(165.0), Surroundings(23.0), Surface(0.85))
    area = math.pi * 0.1
    delta = float(r.surface_temp_c) - 23.0
    return {
        "total": float(r.heat_flow_w_per_m),
        "convection": float(r.h_conv_w_m2k) * area * delta,
        "radiation": float(r.h_rad_w_m2k) * area * delta,
    }


def _incropera_h_conv():
    from .physics.outer import outer_convection_coefficient

    return float(outer_convection_coefficient(165.0, 23.0, 0.1))


def _incropera_critical_radius():
    import numpy as np

    from .catalog.materials import lookup_material
    from .model import Fluid, Layer, Pipe, Surface, Surroundings
    from .solve import solve

    thickness = np.linspace(0.0005, 0.030, 300)
    r = solve(Pipe(0.010, 0.0002, 400.0), [Layer(lookup_material("k=0.055"), thickness)], Fluid(100.0),
              Surroundings(25.0), Surface(fixed_coefficient_w_m2k=5.0))
    return float(0.005 + thickness[np.argmax(r.heat_flow_w_per_m)])


def _churchill_chu(rayleigh, prandtl):
    from .physics.convection import nusselt_horizontal_cylinder_churchill_chu

    return lambda: float(nusselt_horizontal_cylinder_churchill_chu(rayleigh, prandtl))


def _churchill_bernstein(reynolds, prandtl):
    from .physics.convection import nusselt_cylinder_crossflow_churchill_bernstein

    return lambda: float(nusselt_cylinder_crossflow_churchill_bernstein(reynolds, prandtl))


def _run_outlet():
    from .catalog.materials import lookup_material
    from .model import Layer, Pipe, Surface, Surroundings
    from .runs import temperature_along_run

    run = temperature_along_run(Pipe(0.0603, 0.0039, 50.0), [Layer(lookup_material("k=0.04"), 0.03)], "water",
                                40.0, 0.05, 100.0, Surroundings(0.0), Surface(fixed_coefficient_w_m2k=10.0),
                                inner_h_w_m2k=500.0)
    return float(run.outlet_temp_c)


def _freeze_time():
    from .catalog.materials import lookup_material
    from .freezing import freeze_times
    from .model import Layer, Pipe, Surface, Surroundings

    r = freeze_times(Pipe(0.0334, 0.00338, 50.0), [Layer(lookup_material("k=0.04"), 0.025)], Surroundings(-10.0),
                     Surface(fixed_coefficient_w_m2k=10.0), 10.0, ice_fraction=0.5)
    return float(r.time_to_ice_fraction_s)


def _pipe(label, schedule, field):
    def compute():
        from .catalog.pipes import lookup_pipe

        return float(getattr(lookup_pipe(label, schedule), field))

    return compute


def _present_worth():
    from .economics import present_worth_factor

    return float(present_worth_factor(0.05, 20.0))


def _ashrae_footnote():
    from .codes import adjusted_thickness_m

    return float(adjusted_thickness_m(2.0, 2.25, 0.23, 0.29))


def _liquid(fluid, temp_c, field):
    def compute():
        from .props.liquids import fluid_properties

        return float(getattr(fluid_properties(fluid, temp_c), field))

    return compute


def _steam(pressure_pa, what):
    def compute():
        from .props import steam

        if what == "temperature":
            return float(steam.saturation_temp_c(pressure_pa))
        return float(steam.latent_heat_j_kg(pressure_pa))

    return compute


def _fusion():
    from .props.liquids import LATENT_HEAT_FUSION_J_KG

    return LATENT_HEAT_FUSION_J_KG


def _dew_point(air_temp_c, rh_percent):
    def compute():
        from .props.humid import dew_point_c

        return float(dew_point_c(air_temp_c, rh_percent))

    return compute


def _outer_h(surface_temp_c, air_temp_c, diameter_m):
    def compute():
        from .physics.outer import outer_convection_coefficient

        return float(outer_convection_coefficient(surface_temp_c, air_temp_c, diameter_m))

    return compute


# ----------------------------------------------------------------------------- the records
#: Full citations of the short source names used below.
REFERENCES = {
    "Incropera 6th ed.": "Incropera, DeWitt, Bergman and Lavine, Fundamentals of Heat and Mass Transfer, "
                         "6th ed., Wiley 2007",
    "Çengel and Ghajar": "Çengel and Ghajar, Heat and Mass Transfer: Fundamentals and Applications, ch. 3",
    "ASHRAE 90.1-2019": "ANSI/ASHRAE/IES Standard 90.1-2019, Energy Standard for Buildings Except Low-Rise "
                        "Residential Buildings (from memory)",
}
_INCROPERA = "Incropera 6th ed."
_CENGEL = "Çengel and Ghajar, ch. 3 insulated steam-pipe example (from memory)"
_HT_DOCS = "ht 1.2.0 docs"
_EXAMPLE = "worked example"
_LIBRARY = "reference library"

CHECKS: tuple[Check, ...] = (
    Check("cengel-steam-pipe-heat-flow", _CENGEL,
          "heat flow: steam 320 °C, pipe D 5/5.5 cm, 3 cm of k 0.05, h_i 60, h_o 18, air 5 °C", "W/m", 121.0, 0.01, True, _cengel_heat_flow, _EXAMPLE),
    Check("cengel-steam-pipe-insulation-drop", _CENGEL,
          "temperature drop across the insulation, same case", "K", 284.0, 0.01, True, _cengel_drop, _EXAMPLE),
    Check("incropera-9.3-heat-flow", f"{_INCROPERA} Ex. 9.3 (from memory)",
          "heat flow: bare pipe D 0.1 m at 165 °C, still air 23 °C, emittance 0.85",
          "W/m", 765.0, 0.02, True, lambda: _incropera_bare_pipe()["total"], _EXAMPLE),
    Check("incropera-9.3-convection", f"{_INCROPERA} Ex. 9.3 (from memory)",
          "convective part of the heat flow, same case", "W/m", 324.0, 0.02, True,
          lambda: _incropera_bare_pipe()["convection"], _EXAMPLE),
    Check("incropera-9.3-radiation", f"{_INCROPERA} Ex. 9.3 (from memory)",
          "radiative part of the heat flow, same case", "W/m", 441.0, 0.02, True,
          lambda: _incropera_bare_pipe()["radiation"], _EXAMPLE),
    Check("incropera-9.3-h-conv", f"{_INCROPERA} Ex. 9.3 (from memory)",
          "natural-convection coefficient, same case", "W/(m²·K)", 7.29, 0.02, True, _incropera_h_conv, _EXAMPLE),
    Check("incropera-3.5-critical-radius", f"{_INCROPERA} Ex. 3.5",
          "critical radius: k 0.055 on a 5 mm radius tube, h 5 W/(m²·K)", "m",
          0.011, 1e-4, False, _incropera_critical_radius, _EXAMPLE),
    Check("churchill-chu-incropera-9.2", f"{_HT_DOCS}, Churchill-Chu, inputs of {_INCROPERA} Ex. 9.2",
          "Nusselt number: horizontal cylinder, Pr 0.69, Gr 2.63e9", "–", 139.13, 1e-4, True,
          _churchill_chu(0.69 * 2.63e9, 0.69), _EXAMPLE),
    Check("churchill-bernstein-incropera-7.3", f"{_HT_DOCS}, Churchill-Bernstein, inputs of {_INCROPERA} Ex. 7.3",
          "Nusselt number: cylinder in crossflow, Re 6071, Pr 0.7", "–", 40.637, 1e-4, True,
          _churchill_bernstein(6071.0, 0.7), _EXAMPLE),
    Check("ashrae-90.1-footnote-nps4", "ASHRAE 90.1-2019, note to Table 6.8.3-1 (from memory)",
          "thickness of k 0.23 equal to 2.0 in of k 0.29 on NPS 4 (r 2.25 in)", "in", 1.476, 5e-4, False,
          _ashrae_footnote, _EXAMPLE),
    Check("asme-b36.10-nps4-sch80-od", "ASME B36.10M inch table, NPS 4 schedule 80 (from memory)",
          "outside diameter, 4.500 in", "m", 0.1143, 0.06e-3, False, _pipe("NPS 4", "80", "outer_diameter_m"),
          _EXAMPLE),
    Check("asme-b36.10-nps4-sch80-wall", "ASME B36.10M inch table, NPS 4 schedule 80 (from memory)",
          "wall thickness, 0.337 in", "m", 0.337 * 0.0254, 0.006e-3, False, _pipe("NPS 4", "80", "wall_m"),
          _EXAMPLE),
    Check("present-worth-5pct-20y", "compound-interest tables, (P/A, 5 %, 20) (from memory)",
          "uniform-series present-worth factor at 5 % over 20 years", "years", 12.4622, 5e-5, False,
          _present_worth, _EXAMPLE),
    # ---- reference libraries: values computed by the library named, shipped as data
    Check("fluids-nps6-sch40-od", "fluids 1.3.1 piping.nearest_pipe(NPS=6, schedule='40') (ASME B36.10M)",
          "outside diameter of NPS 6 schedule 40", "m", 0.1683, 1e-5, False, _pipe("NPS 6", "40", "outer_diameter_m"),
          _LIBRARY),
    Check("fluids-nps6-sch40-wall", "fluids 1.3.1 piping.nearest_pipe(NPS=6, schedule='40') (ASME B36.10M)",
          "wall thickness of NPS 6 schedule 40", "m", 0.00711, 1e-5, False, _pipe("NPS 6", "40", "wall_m"),
          _LIBRARY),
    Check("iapws95-water-density-20c", "iapws 1.5.5 IAPWS95(T=293.15 K, x=0).rho (IAPWS-95)",
          "density of saturated liquid water at 20 °C", "kg/m³", 998.161801343, 2e-3, True,
          _liquid("water", 20.0, "density_kg_m3"), _LIBRARY),
    Check("iapws95-water-cp-80c", "iapws 1.5.5 IAPWS95(T=353.15 K, x=0).cp (IAPWS-95)",
          "heat capacity of saturated liquid water at 80 °C", "J/(kg·K)", 4196.87136616, 2e-3, True,
          _liquid("water", 80.0, "heat_capacity_j_kgk"), _LIBRARY),
    Check("iapws97-saturation-1bar", "iapws 1.5.5 IAPWS97(P=0.1 MPa, x=0).T (IAPWS-IF97)",
          "saturation temperature of steam at 1 bar absolute", "°C", 99.6059186113, 0.05, False,
          _steam(1e5, "temperature"), _LIBRARY),
    Check("iapws97-latent-heat-10bar", "iapws 1.5.5 IAPWS97(P=1 MPa), h(x=1) − h(x=0) (IAPWS-IF97)",
          "latent heat of steam at 10 bar absolute", "J/kg", 2014436.69335, 1e-3, True,
          _steam(1e6, "latent"), _LIBRARY),
    Check("iapws06-latent-heat-fusion", "iapws 1.5.5 IAPWS-06 ice and IAPWS-95 liquid at 273.1525 K", "latent heat of fusion of ice at 101 325 Pa",
          "J/kg", 333426.51653, 5e-4, True, _fusion, _LIBRARY),
    Check("psychrolib-dew-point-20c-50", "psychrolib 2.5.0 GetTDewPointFromRelHum (ASHRAE Fundamentals 2017)", "dew point of air at 20 °C, 50 % RH, 101 325 Pa", "°C",
          9.27239229109, 0.05, False, _dew_point(20.0, 50.0), _LIBRARY),
    Check("psychrolib-dew-point-30c-80", "psychrolib 2.5.0 GetTDewPointFromRelHum (ASHRAE Fundamentals 2017)", "dew point of air at 30 °C, 80 % RH, 101 325 Pa", "°C",
          26.1685932393, 0.05, False, _dew_point(30.0, 80.0), _LIBRARY),
    Check("ht-churchill-chu-ra1e7", "ht 1.2.0 Nu_horizontal_cylinder_Churchill_Chu",
          "Nusselt number: horizontal cylinder, Ra 1e7, Pr 0.7", "–", 28.2013814161, 5e-3, True,
          _churchill_chu(1e7, 0.7), _LIBRARY),
    Check("ht-churchill-bernstein-re1e4", "ht 1.2.0 Nu_cylinder_Churchill_Bernstein",
          "Nusselt number: cylinder in crossflow, Re 1e4, Pr 0.7", "–", 53.3277886702, 5e-3, True,
          _churchill_bernstein(1e4, 0.7), _LIBRARY),
    Check("ht-coolprop-outer-film-60c", "ht 1.2.0 Churchill-Chu, CoolProp 8.0.0 Air at the film, fluids 1.3.1",
          "natural-convection coefficient: pipe D 0.3 m at 60 °C, still air 20 °C", "W/(m²·K)",
          4.86032520566, 5e-3, True, _outer_h(60.0, 20.0, 0.3), _LIBRARY),
    Check("incropera-8.46-run-outlet", "Incropera 6th ed. Eq. 8.46 (from memory), c_p from iapws 1.5.5 IAPWS95",
          "outlet temperature: water 40 °C, 0.05 kg/s, 100 m of NPS 2 (wall k 50) under 30 mm of k 0.04, "
          "h_i 500, h_o 10, air 0 °C", "°C", 34.1475131566, 0.01, False, _run_outlet, _LIBRARY),
    Check("incropera-5.6-freeze-half", "Incropera 6th ed. Eq. 5.6 lumped (from memory), water from iapws 1.5.5 "
          "IAPWS95, steel 7854 kg/m³ and 434 J/(kg·K) (Table A.1), L_f 333.55 kJ/kg (CRC, from memory)",
          "time to half frozen: still water 10 °C in NPS 1 (wall k 50) under 25 mm of k 0.04, h_o 10, air -10 °C",
          "s", 46961.9094627, 5e-3, True, _freeze_time, _LIBRARY),
    Check("coolprop-propylene-glycol-30-density", "CoolProp 8.0.0 PropsSI INCOMP::MPG[0.3] (Melinder 2010)",
          "density of 30 % propylene glycol at -5 °C", "kg/m³", 1033.02438729, 1e-4, True,
          _liquid("30% propylene glycol", -5.0, "density_kg_m3"), _LIBRARY),
    Check("coolprop-propylene-glycol-30-viscosity", "CoolProp 8.0.0 PropsSI INCOMP::MPG[0.3] (Melinder 2010)",
          "viscosity of 30 % propylene glycol at -5 °C", "Pa·s", 0.00927192965817, 1e-4, True,
          _liquid("30% propylene glycol", -5.0, "viscosity_pa_s"), _LIBRARY),
)
