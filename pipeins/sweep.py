"""Sweep one input of a line over a range: how sensitive the heat flow and the pick are.

:func:`sweep` takes one line (a :class:`~pipeins.line.LineSpec` of one case), the name of
one input and its values, and returns, at every value, the heat flow and surface
temperature of the line's own build-up (its ``layers``; bare when it has none) and, when a
material to size is given, the least thickness each active criterion needs, the commercial
pick and the governing criterion (:func:`pipeins.selection.select`).

Inputs that may be swept (:data:`VARIABLES`): ``wind_m_s``, ``emittance``, ``air_temp_c``,
``surroundings_temp_c``, ``rh_percent``, ``fluid_temp_c`` (LineSpec fields) and
``conductivity_factor``: a factor on the conductivity of every insulation layer, fixed and
sized alike (an allowance for ageing, moisture or workmanship; 1 is the catalogue value).

A LineSpec field is swept in ONE vectorised solve and ONE selection over all values (the
values are laid along the size axis of the selection, every row the same pipe).  The
conductivity factor changes the material, and a layer is one material over all cases of a
solve, so it takes one solve (and one selection) per value; property lookups stay in the
shipped tables either way.

A criterion that applies somewhere in the sweep is shown at every value; where the line
meets it bare its least thickness is 0.

>>> from pipeins.line import LineSpec
>>> from pipeins.criteria import Requirements
>>> spec = LineSpec(pipe="NPS 4", fluid_temp_c=180.0, air_temp_c=25.0,
...                 layers=(("mineral wool", 0.05),))
>>> s = sweep(spec, "wind_m_s", [0.0, 5.0, 10.0])
>>> bool(s.heat_flow_w_per_m[0] < s.heat_flow_w_per_m[1] < s.heat_flow_w_per_m[2])
True
"""

from __future__ import annotations

from dataclasses import dataclass, field, replace

import numpy as np

from .errors import InputError

__all__ = ["VARIABLES", "LIMITS", "SweepResult", "sweep", "scaled_material"]

#: The inputs :func:`sweep` varies.
VARIABLES = ("wind_m_s", "emittance", "air_temp_c", "surroundings_temp_c", "rh_percent", "fluid_temp_c",
             "conductivity_factor")

#: Physical limits of each swept input, SI: (low, high, low excluded?).  Temperatures end
#: where the shipped air table ends (:data:`pipeins.model.MAX_TEMP_C`).
LIMITS = {
    "wind_m_s": (0.0, 100.0, False),
    "emittance": (0.0, 1.0, True),
    "air_temp_c": (-273.15, 1000.0, True),
    "surroundings_temp_c": (-273.15, 1000.0, True),
    "rh_percent": (0.0, 100.0, True),
    "fluid_temp_c": (-273.15, 1000.0, True),
    "conductivity_factor": (0.0, 10.0, True),
}


@dataclass
class SweepResult:
    """The sweep, one entry per value (arrays of shape (n,), SI).

    ``heat_flow_w_per_m`` and ``surface_temp_c`` are those of the line's own build-up.
    With a material: ``criteria`` lists (key, label, description) of every criterion that
    took part somewhere; ``required_m[key]`` its least thickness per value (nan where it
    cannot be met, 0 where the line meets it bare, nan and ``criterion_feasible[key]`` True
    where it sets no thickness, e.g. the service-temperature check); ``selected_m``, ``governing`` (None
    where every criterion is met bare and the pick is the series' least),
    ``feasible``, ``selected_heat_flow_w_per_m`` and ``selected_surface_temp_c`` the pick and
    the line at the pick; ``messages[i]`` the messages of value *i*.  ``notes`` are the
    selection's notes, ``warnings`` the solver's warnings (each once).
    """

    variable: str
    values: np.ndarray
    spec: object
    heat_flow_w_per_m: np.ndarray
    surface_temp_c: np.ndarray
    material: object = None
    series_name: str = ""
    criteria: list = field(default_factory=list)
    required_m: dict = field(default_factory=dict)
    commercial_m: dict = field(default_factory=dict)
    criterion_feasible: dict = field(default_factory=dict)
    selected_m: np.ndarray | None = None
    governing: list = field(default_factory=list)
    feasible: np.ndarray | None = None
    selected_heat_flow_w_per_m: np.ndarray | None = None
    selected_surface_temp_c: np.ndarray | None = None
    messages: list = field(default_factory=list)
    notes: list = field(default_factory=list)
    warnings: list = field(default_factory=list)
    selections: list = field(default_factory=list)  # the Selection(s) behind the numbers
    touch_limit_c: float | None = None

    @property
    def n(self) -> int:
        return int(self.values.size)


def scaled_material(material, factor: float):
    """*material* (an :class:`~pipeins.catalog.materials.InsulationMaterial`) with every
    conductivity point multiplied by *factor* (name and limits kept)."""
    if factor == 1.0:
        return material
    points = tuple((t, k * factor) for t, k in material.points)
    return replace(material, key=f"{material.key}*{factor:g}", points=points)


def _scaled_spec(spec, factor: float):
    """A LineSpec whose layers are built with every conductivity times *factor*."""
    from .line import LineSpec

    @dataclass(frozen=True, eq=False)
    class _Scaled(LineSpec):
        def build_layers(self):
            from .catalog.materials import lookup_material
            from .model import Layer

            return [Layer(scaled_material(lookup_material(name), factor), t) for name, t in self.layers]

    return _Scaled(**spec.__dict__)


def _check_values(variable: str, values) -> np.ndarray:
    if variable not in VARIABLES:
        raise InputError("variable", f'cannot sweep "{variable}"; sweep one of {", ".join(VARIABLES)}')
    arr = np.asarray(values, dtype=float).ravel()
    if arr.size < 2 or not np.all(np.isfinite(arr)):
        raise InputError("values", "give at least two finite values")
    low, high, open_low = LIMITS[variable]
    bad = (arr <= low if open_low else arr < low) | (arr > high)
    if np.any(bad):
        bound = "above" if open_low else "at least"
        raise InputError("values", f"{variable} must be {bound} {low:g} and at most {high:g} "
                                   f"(got {float(arr[np.argmax(bad)]):g})")
    return arr


def sweep(spec, variable: str, values, material: str | None = None, requirements=None, series=None,
          units: str = "si") -> SweepResult:
    """Sweep *variable* of the line *spec* over *values* (SI, see :data:`VARIABLES`).

    Parameters
    ----------
    spec : LineSpec
        One line (no array inputs); its ``layers`` are the build-up whose heat flow is shown.
    variable : str
        The input varied (:data:`VARIABLES`).
    values : array_like
        Its values, SI (m/s, °C, %, – for emittance and the conductivity factor).
    material : str, optional
        The material to size over the fixed layers (as :func:`pipeins.selection.select`).
    requirements : Requirements, optional
        The sizing requirements (default: touch safety and condensation where they apply).
    series : str or tuple, optional
        The thickness series to pick from (:func:`pipeins.selection.series_for`).
    units : {"si", "us"}
        Chooses the default series.

    Returns
    -------
    SweepResult
    """
    from .line import LineSpec

    values = _check_values(variable, values)
    if spec.shape() != ():
        raise InputError("spec", "sweep one line: the line's inputs must be single values, not arrays")
    n = values.size
    if variable == "conductivity_factor":
        specs = [_scaled_spec(spec, float(f)) for f in values]
        results = [s.solve() for s in specs]
        q = np.array([float(r.heat_flow_w_per_m) for r in results])
        ts = np.array([float(r.surface_temp_c) for r in results])
        warnings = [w for r in results for w in r.warnings]
    else:
        if variable == "fluid_temp_c" and spec.steam_pressure_pa is not None:
            raise InputError("steam_pressure_pa", "saturated steam is at its saturation temperature; give "
                                                  "fluid_temp_c instead of steam_pressure_pa to sweep it")
        if variable in ("wind_m_s", "emittance", "surroundings_temp_c") and spec.outer_h_w_m2k is not None:
            raise InputError("outer_h_w_m2k", f"a fixed outer coefficient replaces convection and radiation; "
                                              f"drop outer_h_w_m2k to sweep {variable}")
        result = LineSpec(**{**spec.__dict__, variable: values}).solve()
        q = np.broadcast_to(result.heat_flow_w_per_m, (n,)).astype(float)
        ts = np.broadcast_to(result.surface_temp_c, (n,)).astype(float)
        warnings = list(result.warnings)
    out = SweepResult(variable, values, spec, q, ts)
    if material is not None:
        _size(out, spec, variable, values, material, requirements, series, units)
        warnings += [w for s in out.selections for w in s.outcome.result.warnings]
    out.warnings = list(dict.fromkeys(warnings))
    return out


def _size(out: SweepResult, spec, variable, values, material, requirements, series, units) -> None:
    from .catalog.materials import lookup_material
    from .criteria import Requirements
    from .line import LineSpec
    from .selection import select

    req = requirements or Requirements()
    n = values.size
    size = spec.pipe_size()
    if variable == "conductivity_factor":
        base = lookup_material(material, option="--material")
        selections = [select(_scaled_spec(spec, float(f)), scaled_material(base, float(f)), req, series, units)
                      for f in values]
        rows = [(s, 0) for s in selections]
    else:
        column = LineSpec(**{**spec.__dict__, variable: values[:, None]})
        selection = select(column, material, req, series, units, sizes=[size] * n)
        selections = [selection]
        rows = [(selection, i) for i in range(n)]
    out.selections = selections
    first = selections[0]
    out.material, out.series_name = first.material, first.series_name
    seen = {}
    for s in selections:
        for c in s.outcome.criteria:
            seen.setdefault(c.key, (c.key, c.label, c.description))
    out.criteria = list(seen.values())
    out.required_m = {k: np.zeros(n) for k in seen}
    out.commercial_m = {k: np.zeros(n) for k in seen}
    out.criterion_feasible = {k: np.ones(n, dtype=bool) for k in seen}
    out.selected_m = np.empty(n)
    out.feasible = np.empty(n, dtype=bool)
    out.selected_heat_flow_w_per_m = np.empty(n)
    out.selected_surface_temp_c = np.empty(n)
    out.governing, out.messages = [], []
    for i, (s, j) in enumerate(rows):
        o = s.outcome
        for c in o.criteria:
            out.required_m[c.key][i] = c.required_m[j]
            out.criterion_feasible[c.key][i] = bool(c.feasible[j])
            out.commercial_m[c.key][i] = c.commercial_m[j] if c.commercial_m is not None else np.nan
        out.selected_m[i] = o.selected_m[j]
        out.feasible[i] = bool(o.feasible[j])
        gov = o.governing[j]  # a criterion met bare governs nothing
        gov_required = next((c.required_m[j] for c in o.criteria if c.key == gov), np.nan)
        out.governing.append(None if gov is None or gov_required == 0 else gov)
        out.messages.append(list(o.messages[j]))
        out.selected_heat_flow_w_per_m[i] = float(np.ravel(o.result.heat_flow_w_per_m)[j])
        out.selected_surface_temp_c[i] = float(np.ravel(o.result.surface_temp_c)[j])
    out.notes = list(dict.fromkeys(n_ for s in selections for n_ in s.notes))
    touch = next((c for s in selections for c in s.criteria if c.key == "surface_temp"), None)
    out.touch_limit_c = getattr(touch, "limit_c", None)
