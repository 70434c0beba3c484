"""The result of a solve: arrays in SI, the inputs that produced them, and warnings."""

from __future__ import annotations

from dataclasses import dataclass, field
from typing import Any

import numpy as np

__all__ = ["Result", "PatchResult", "section_result", "film_warnings", "HEAT_FLOW_KEYS"]

#: JSON key of the heat flow by the shape's basis (its unit).
HEAT_FLOW_KEYS = {"W/m": "heat_flow_w_per_m", "W/m²": "heat_flow_w_per_m2", "W": "heat_flow_w"}


def _plain(x):
    """numpy → JSON-ready Python (scalars stay scalars, arrays become nested lists)."""
    if x is None:
        return None
    arr = np.asarray(x)
    if arr.dtype == bool:
        return arr.tolist()
    return np.round(arr.astype(float), 9).tolist()


@dataclass
class Result:
    """Heat flow and temperatures of solved cases; every array has the cases' shape.

    The heat flow is positive when heat leaves the fluid, in the unit ``basis`` names:
    ``"W/m"`` per metre of pipe or duct run, ``"W/m²"`` per m² of a flat face, ``"W"`` for
    a vessel.  The field :attr:`heat_flow` holds it in that unit; the accessors named for
    a unit (:attr:`heat_flow_w_per_m`, :attr:`heat_flow_w_per_m2`, :attr:`heat_flow_w`)
    refuse another basis, so no name holds a value in a unit it does not say.  ``interface_temps_c`` stacks, along its first
    axis: the bore (inner wall face), the pipe's outside, then the outer face of each
    layer; the last equals ``surface_temp_c``.
    """

    #: Heat flow in the unit :attr:`basis` names (W/m, W/m² or W), positive out of the fluid.
    heat_flow: np.ndarray
    outer_heat_flux_w_m2: np.ndarray
    surface_temp_c: np.ndarray
    interface_temps_c: np.ndarray
    h_conv_w_m2k: np.ndarray
    h_rad_w_m2k: np.ndarray
    outer_diameter_m: np.ndarray | None
    #: Largest |q − q_out(Ts)| left at the reported surface temperature, in the unit of :attr:`basis`.
    residual: float
    iterations: int
    dew_point_c: np.ndarray | None
    touch_limit_c: float | None
    geometry: str
    #: What the solve and the films say of the result: structured notes (:class:`pipeins.notes.Note`;
    #: the reports write them in their units), each once.
    warnings: list = field(default_factory=list)
    inputs: dict[str, Any] = field(default_factory=dict, repr=False)
    #: Unit of the heat flow q: "W/m" (pipe run), "W/m²" (flat face) or "W" (sphere).
    basis: str = "W/m"
    #: Per-patch results of a section with patches (a duct's faces, a vessel's parts), or None.
    patches: list | None = None
    #: What the section is ("pipe", "round duct", "rectangular duct", "face", "sphere", "vessel").
    kind: str = "pipe"

    def __post_init__(self):
        # The films' validity notes travel with every result, once each.
        self.warnings = list(dict.fromkeys(list(self.warnings) + film_warnings(self)))

    @property
    def heat_flow_w_per_m(self) -> np.ndarray:
        """Heat flow per metre of a pipe or duct run [W/m] (an error for another basis)."""
        return self._in_basis("W/m")

    @property
    def residual_w_per_m(self) -> float:
        """:attr:`residual` of a pipe or duct run [W/m] (an error for another basis)."""
        if self.basis != "W/m":
            raise AttributeError(f"this result's residual is in {self.basis}: read .residual")
        return self.residual

    @property
    def heat_flow_w(self) -> np.ndarray:
        """Heat flow of a whole vessel or sphere [W] (an error for another basis)."""
        return self._in_basis("W")

    @property
    def heat_flow_w_per_m2(self) -> np.ndarray:
        """Heat flow per m² of a flat face [W/m²]."""
        return self._in_basis("W/m²")

    def _in_basis(self, basis: str) -> np.ndarray:
        if self.basis != basis:
            raise AttributeError(f"this result's heat flow is in {self.basis}, not {basis}: read .heat_flow "
                                 f"and .basis, or the accessor named for {self.basis}")
        return self.heat_flow

    @property
    def shape(self) -> tuple[int, ...]:
        return np.shape(self.heat_flow)

    @property
    def surface_below_dew_point(self) -> np.ndarray | None:
        if self.dew_point_c is None:
            return None
        return self.surface_temp_c < self.dew_point_c

    @property
    def over_touch_limit(self) -> np.ndarray | None:
        if self.touch_limit_c is None:
            return None
        return self.surface_temp_c > self.touch_limit_c

    def layer_heat_flows_w_per_m(self) -> np.ndarray:
        """Heat flow through the wall and every layer, recomputed from the interface
        temperatures (an energy-balance check: each equals ``heat_flow_w_per_m``)."""
        from .physics import conduction

        if self.patches is not None:
            return sum(np.asarray(p.weight) * p.result.layer_heat_flows_w_per_m() for p in self.patches)
        pipe, layers = self.inputs["pipe"], self.inputs["layers"]
        temps = self.interface_temps_c
        net = _network_of(self.inputs)
        factors = [net.wall_factor, *net.layer_factors]
        flows = [(temps[0] - temps[1]) * np.asarray(pipe.wall_conductivity_w_mk) / factors[0]]
        for j, layer in enumerate(layers):
            fit = conduction.conductivity_of(layer.material)
            flows.append((fit.potential(temps[j + 1]) - fit.potential(temps[j + 2])) / factors[j + 1])
        return np.stack([np.broadcast_to(f, self.shape) for f in flows])

    def to_dict(self) -> dict[str, Any]:
        """JSON-ready dict in SI (scalars for a single case, nested lists for arrays)."""
        interfaces = np.moveaxis(self.interface_temps_c, 0, -1)
        return {
            HEAT_FLOW_KEYS[self.basis]: _plain(self.heat_flow),
            "heat_flux_w_m2": _plain(self.outer_heat_flux_w_m2),
            "surface_temp_c": _plain(self.surface_temp_c),
            "interface_temps_c": _plain(interfaces),
            "h_conv_w_m2k": _plain(self.h_conv_w_m2k),
            "h_rad_w_m2k": _plain(self.h_rad_w_m2k),
            "outer_diameter_m": _plain(self.outer_diameter_m),
            "dew_point_c": _plain(self.dew_point_c),
            "surface_below_dew_point": _plain(self.surface_below_dew_point),
            "touch_limit_c": self.touch_limit_c,
            "over_touch_limit": _plain(self.over_touch_limit),
            "iterations": self.iterations,
            "residual" + HEAT_FLOW_KEYS[self.basis][len("heat_flow"):]: self.residual,
            # texts as they are, structured notes as their objects (the reports write their sentences)
            "warnings": [w if isinstance(w, str) else w.to_dict() for w in self.warnings],
            **({} if self.patches is None else {"kind": self.kind, "patches": [p.to_dict(self.basis)
                                                                                for p in self.patches]}),
        }


@dataclass
class PatchResult:
    """One patch of a solved section: its name, its share and its own result.

    ``weight`` turns the patch's heat flow (in ``result.basis``) into the section's basis;
    ``area_m2`` is its outer area per section unit [m² per m, per m² or per item];
    ``exposed`` is False for a patch against a stated boundary (a tank floor), which
    never governs touch or condensation.
    """

    name: str
    weight: Any
    area_m2: Any
    result: Result
    exposed: bool = True
    note: str = ""

    @property
    def heat_flow(self):
        """The patch's heat flow in the section's basis."""
        return np.asarray(self.weight) * self.result.heat_flow

    def to_dict(self, basis: str) -> dict[str, Any]:
        area_key = "area_m2" if basis == "W" else "area_m2_per_unit"
        out = {"name": self.name, area_key: _plain(self.area_m2),
               "surface_temp_c": _plain(self.result.surface_temp_c),
               HEAT_FLOW_KEYS[basis]: _plain(self.heat_flow),
               "heat_flux_w_m2": _plain(self.result.outer_heat_flux_w_m2),
               "h_conv_w_m2k": _plain(self.result.h_conv_w_m2k),
               "h_rad_w_m2k": _plain(self.result.h_rad_w_m2k)}
        if not self.exposed:
            out["boundary"] = self.note
        return out


def section_result(section, patches, results, inputs, kind, basis, touch_limit_c, dew_point, outer_areas) -> Result:
    """The whole of a section from its solved patches.

    Heat flow: the weighted sum of the patches.  Surface temperature: that of the patch
    that governs, the hottest exposed patch of a section losing heat and the coldest of
    one gaining it (its interface temperatures come with it).  Film coefficients: the
    area-weighted means of the exposed patches.  *outer_areas* is each patch's outer area per
    patch unit, as the solver computed it.
    """
    total_t = sum(np.asarray(layer.installed_thickness_m, dtype=float) for layer in inputs["layers"]) \
        if inputs["layers"] else 0.0
    shape = results[0].shape
    parts = []
    for patch, res, area in zip(patches, results, outer_areas):
        weight = np.broadcast_to(np.asarray(patch.weight_for(total_t), dtype=float), shape)
        parts.append(PatchResult(patch.name, weight, weight * area, res,
                                 patch.boundary is None, patch.boundary.note if patch.boundary else ""))
    q = sum(p.heat_flow for p in parts)
    exposed = [p for p in parts if p.exposed] or parts
    ts = np.stack([p.result.surface_temp_c for p in exposed])
    pick = np.where(q >= 0, np.argmax(ts, axis=0), np.argmin(ts, axis=0))
    surface = np.take_along_axis(ts, pick[None], axis=0)[0]
    interfaces = np.stack([p.result.interface_temps_c for p in exposed])  # (P, I, *shape)
    governing = np.take_along_axis(interfaces, pick[None, None], axis=0)[0]
    areas = np.stack([p.area_m2 for p in exposed])
    total_exposed = np.sum(areas, axis=0)

    def mean(name):
        return np.sum(areas * np.stack([getattr(p.result, name) for p in exposed]), axis=0) / total_exposed

    area_all = np.sum(np.stack([p.area_m2 for p in parts]), axis=0)
    warnings = list(dict.fromkeys(w for p in parts for w in p.result.warnings))
    return Result(
        heat_flow=q, outer_heat_flux_w_m2=q / area_all, surface_temp_c=surface,
        interface_temps_c=governing, h_conv_w_m2k=mean("h_conv_w_m2k"), h_rad_w_m2k=mean("h_rad_w_m2k"),
        outer_diameter_m=parts[0].result.outer_diameter_m if len(parts) == 1 else None,
        residual=max(p.result.residual for p in parts),
        iterations=results[0].iterations, dew_point_c=dew_point, touch_limit_c=touch_limit_c,
        geometry=kind, warnings=warnings, inputs={**inputs, "patches": tuple(patches)}, basis=basis,
        patches=parts, kind=kind)


def film_warnings(result: "Result") -> list:
    """Validity warnings of the film correlations behind a solved result.

    The outer film's (natural, forced and mixed convection, the vertical-cylinder curvature
    correction; :func:`pipeins.physics.outer.outer_convection_warnings`) at the converged
    surface temperatures, and the inner film's notes carried by the fluid
    (``Fluid.film_notes``, see :func:`pipeins.physics.inner.inner_film_warnings`).  None
    for a fixed outer coefficient, which stands in for the outer correlations.
    """
    inputs = result.inputs
    if not inputs:
        return []
    if "patches" in inputs:  # a section: each patch carries its own film notes
        return []
    out = list(getattr(inputs["fluid"], "film_notes", ()) or ())
    surface, surroundings, pipe = inputs["surface"], inputs["surroundings"], inputs["pipe"]
    if surface.fixed_coefficient_w_m2k is not None or np.size(result.surface_temp_c) == 0:
        return out
    from .physics.outer import outer_convection_warnings

    shape = inputs.get("shape") or pipe.shape(surroundings)
    net = _network_of(inputs)
    geometry, orientation = shape.correlation_key
    out += outer_convection_warnings(result.surface_temp_c, surroundings.air_temp_c, net.film_length_m,
                                     surroundings.wind_speed_m_s, orientation, net.film_height_m,
                                     surroundings.pressure_pa, geometry)
    return out


def _network_of(inputs):
    """The shape's network factors of the solved section, on its own (unbroadcast) arrays."""
    pipe, layers = inputs["pipe"], inputs["layers"]
    shape = inputs.get("shape") or pipe.shape(inputs["surroundings"])
    columns = {k: np.asarray(v, dtype=float) for k, v in shape.columns().items()}
    columns["wall"] = np.asarray(pipe.wall_m, dtype=float)
    return shape.network(columns, [np.asarray(layer.installed_thickness_m, dtype=float) for layer in layers])
