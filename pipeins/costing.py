"""A line's money over the year: bare against insulated, payback, the economic curve.

:func:`cost_study` solves the line bare and insulated (one vectorised solve), adds bare
fittings as equivalent lengths of bare pipe, and turns the heat flows into energy, cost
and CO2 per year with an :class:`~pipeins.annual.EnergyBasis`.  With a cost table it adds
the installed cost, the simple payback (on the heating and cooling savings together) and
the economic-thickness curve of the outer layer's material over the thicknesses the table
lists.  Heat losses and heat gains are kept apart (never netted).
"""

from __future__ import annotations

from dataclasses import dataclass, field, replace

import numpy as np

from .annual import (DUTIES, PER_UNIT, EconomicCurve, EnergyBasis, annual_figures, economic_curve, split_figures,
                     surface_area_m2)
from .economics import simple_payback_years
from .errors import InputError

__all__ = ["CostStudy", "cost_study"]


@dataclass
class CostStudy:
    """Heat flows per unit of the section's basis (``heat_basis``: W/m of a run, W/m² of a
    face, W of a vessel) and over what is priced [W] (the run and its fittings, the face's
    area, the vessel), signed (+ lost by the fluid), and the year's figures of the bare line
    and the insulated one over what is priced, heat loss and heat gain apart
    (:func:`pipeins.annual.split_figures`).  With no layer (a bare line priced alone)
    ``insulated_*`` are ``None``.

    What is priced: a run over ``length_m`` [m], a face over ``area_m2`` [m²] (1 when none is
    given, i.e. per m² of face; ``length_m`` None), a vessel whole (``length_m`` 1)."""

    spec: object
    basis: EnergyBasis
    length_m: float | None
    fittings: dict
    fitting_length_m: float
    bare_per_unit: float
    insulated_per_unit: float | None
    bare_w: float
    insulated_w: float | None
    bare: dict
    insulated: dict | None
    bare_surface: object = None
    installed_cost: float | None = None
    payback_years: float | None = None
    curve: EconomicCurve | None = None
    #: Texts and notes (:class:`pipeins.notes.Note`; the report writes them in its units).
    warnings: list = field(default_factory=list)
    #: The surface a table per m² is priced on [m² per m of run, per m² of face, per vessel]; None per metre.
    area_m2_per_unit: float | None = None
    #: The heat-flow basis of the section (``"W/m"``, ``"W/m²"``, ``"W"``).
    heat_basis: str = "W/m"
    #: A face's area priced [m²] (1 when not given: the figures are per m² of face); None for a run or vessel.
    area_m2: float | None = None
    #: Whether the face's area was given (False: priced per m² of face).
    area_given: bool = False

    @property
    def per(self) -> str:
        """The unit of the section the heat flow per unit is for: ``"m"``, ``"m²"``, ``"vessel"``."""
        return PER_UNIT[self.heat_basis]

    @property
    def whole_vessel(self) -> bool:
        """Whether the whole vessel (or sphere) is priced (its heat flow is in W)."""
        return self.heat_basis == "W"

    @property
    def bare_w_per_m(self) -> float | None:
        """Bare heat flow per metre of run [W/m] (None for a face or vessel)."""
        return self.bare_per_unit if self.heat_basis == "W/m" else None

    @property
    def insulated_w_per_m(self) -> float | None:
        """Insulated heat flow per metre of run [W/m] (None for a face, vessel or bare line)."""
        return self.insulated_per_unit if self.heat_basis == "W/m" else None

    @property
    def saving(self) -> dict | None:
        """bare − insulated, for every figure (``None`` for a bare line alone)."""
        if self.insulated is None:
            return None
        return _minus(self.bare, self.insulated)

    def annual_cost(self, figures: dict):
        """Cost per year of heating plus cooling in *figures* (``None`` without a price)."""
        parts = [figures[d]["cost"] for d in DUTIES]
        return None if any(p is None for p in parts) else float(sum(float(np.asarray(p)) for p in parts))


def _minus(a, b):
    if isinstance(a, dict):
        return {k: _minus(a[k], b[k]) for k in a}
    return None if a is None or b is None else a - b


def _scalar(fig):
    """Figures as floats (a profile's heat flows already weighted)."""
    if isinstance(fig, dict):
        return {k: _scalar(v) for k, v in fig.items()}
    return None if fig is None else float(np.asarray(fig))


def cost_study(spec, basis: EnergyBasis, fittings: dict | None = None, profile=None,
               area_m2: float | None = None) -> CostStudy:
    """The year's money of a line: bare (:func:`pipeins.bare.bare_surface`, the pipe's own
    surface) against insulated with the spec's layers; with no layer the bare line alone.

    A run is priced over its length (``spec.length_m``, 1 m when not given), a vessel whole,
    a flat face over *area_m2* [m²] (per m² of face when not given: its heat flow is per m²);
    *area_m2* for anything but a face is refused.  Bare fittings count as equivalent lengths
    of bare pipe; ``length_m = 0`` with fittings prices the fittings alone.  A heat gain is
    priced through the basis's COP (refused without one: never as heating).

    *profile*, optional: ``[(fluid_temp_c, hours), ...]`` operating conditions over the year,
    replacing the spec's fluid temperature and the basis's hours; energy is summed over them
    and the heat flows reported are their hours-weighted means."""
    from .bare import bare_surface
    from .catalog.fittings import equivalent_length_m
    from .solve import solve

    weights = None
    if profile:
        temps = np.array([float(t) for t, _ in profile])
        hours = np.array([float(h) for _, h in profile])
        if hours.sum() <= 0:
            raise InputError("--profile", "the profile needs some operating hours")
        spec = replace(spec, fluid_temp_c=temps, steam_pressure_pa=None)
        basis = replace(basis, hours_per_year=hours)
        weights = hours / hours.sum()
    fittings = {k: int(v) for k, v in (fittings or {}).items() if v}
    kind = spec.section_kind
    face = kind == "face"  # priced over its area: its heat flow is in W/m²
    if area_m2 is not None and not face:
        raise InputError("area_m2", "only a flat face ({face}) is priced by its area; a " + kind + " is priced "
                                    + ("whole" if kind in ("sphere", "vessel") else "over its run ({length_m})"))
    if area_m2 is not None and not (np.isfinite(area_m2) and area_m2 > 0):
        raise InputError("area_m2", "area of a flat face must be greater than zero")
    whole = kind in ("sphere", "vessel")  # priced for the whole vessel: its heat flow is in W
    if whole and fittings:
        raise InputError("--valves", "a vessel is priced on its heat flow alone: no fittings")
    if face and fittings:
        raise InputError("--valves", "a face is priced on its heat flow alone: no fittings")
    table = basis.cost_table
    if table is not None and kind != "pipe" and not table.per_area:
        raise InputError("--cost-table", f"{table.name} prices per metre of pipe by size; a {kind} is priced per m² "
                                         "of its surface: give a table with thickness_mm and cost_per_m2 "
                                         "(or cost_per_ft2)")
    if face:  # a face's length_m is its film length, not a quantity
        length = 1.0 if area_m2 is None else float(area_m2)
    else:
        length = 1.0 if (spec.length_m is None or whole) else float(spec.length_m)
    if length < 0:
        raise InputError("--length", "the run length must be zero or more")
    size = spec.pipe_size()
    fit_len = sum(n * float(equivalent_length_m(kind, size.outer_diameter_m)) for kind, n in fittings.items())
    if length + fit_len <= 0:
        raise InputError("--length", "nothing to price: give a run length above zero, or fittings (--valves 1)")
    pipe, layers, fluid, air, surface = spec.build_model()
    bare_face = bare_surface(pipe, surface)
    bare = solve(pipe, [], fluid, air, bare_face)
    q_bare = np.asarray(bare.heat_flow)  # W/m of a run, W/m² of a face (length: its area), W of a vessel (1)
    bare_w = q_bare * (length + fit_len)

    def mean(x):
        return float(x) if weights is None else float(np.sum(weights * x))

    run = None if face else length

    bare_fig = _scalar(split_figures(bare_w, basis, weights))
    if spec.layers:
        insulated = solve(pipe, layers, fluid, air, surface)
        q_ins = np.asarray(insulated.heat_flow)
        ins_w = q_ins * length + q_bare * fit_len
        study = CostStudy(spec, basis, run, fittings, fit_len, mean(q_bare), mean(q_ins), mean(bare_w),
                          mean(ins_w), bare_fig, _scalar(split_figures(ins_w, basis, weights)),
                          bare_face, warnings=list(insulated.warnings))
        study.result = insulated
    else:
        study = CostStudy(spec, basis, run, fittings, fit_len, mean(q_bare), None, mean(bare_w), None,
                          bare_fig, None, bare_face, warnings=list(bare.warnings))
        study.result = bare
    study.profile = profile
    study.heat_basis = bare.basis
    if face:
        study.area_m2, study.area_given = length, area_m2 is not None
    if fit_len and spec.layers:
        from .notes import note

        study.warnings.append(note("cost.bare_fittings", length_m=(fit_len, "length")))
    if table is not None and spec.layers:
        total_t = sum(float(np.max(l[1])) for l in spec.layers)  # nominal: as sold and priced
        area = None
        if table.per_area:  # per m² of the section's surface before insulating
            area = float(np.ravel(surface_area_m2(pipe, fluid, air, surface))[0])
        study.area_m2_per_unit = area
        study.installed_cost = float(np.ravel(table.installed_cost(size.label, total_t, area))[0]) * length
        saving = study.annual_cost(study.saving)
        if saving is not None:
            study.payback_years = float(simple_payback_years(study.installed_cost, saving))
        study.curve = _curve(spec, basis, size, pipe, fluid, air, surface, area)
    return study


def _curve(spec, basis, size, pipe, fluid, air, surface, area_m2_per_unit=None) -> EconomicCurve:
    """Economic curve of the outer layer's material over the table's thicknesses, per unit of
    the section (per metre of a run, per vessel)."""
    from .catalog.materials import lookup_material
    from .model import Layer
    from .solve import solve

    table = basis.cost_table
    thicknesses = table.thicknesses_m(size.label)
    fixed = [Layer(lookup_material(name), t) for name, t in spec.layers[:-1]]
    # thickness along the first axis; a profile's conditions along the last
    outer = Layer(lookup_material(spec.layers[-1][0]),
                  thicknesses if np.ndim(fluid.temp_c) == 0 else thicknesses[:, None])
    r = solve(pipe, fixed + [outer], fluid, air, surface)
    q = np.asarray(r.heat_flow)  # signed, per unit of the basis; fittings do not change with thickness
    return economic_curve(size.label, thicknesses, annual_figures(q, basis)["cost"], basis, PER_UNIT[r.basis],
                          area_m2_per_unit)
