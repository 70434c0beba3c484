"""Properties of air, water, steam and other fluids (tabulated once, interpolated)."""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np

__all__ = ["TransportProperties"]


@dataclass(frozen=True)
class TransportProperties:
    """Density, viscosity, conductivity, heat capacity and Prandtl number; every field an
    array of the input's shape."""

    density_kg_m3: np.ndarray
    viscosity_pa_s: np.ndarray
    conductivity_w_mk: np.ndarray
    heat_capacity_j_kgk: np.ndarray
    prandtl: np.ndarray

    @property
    def kinematic_viscosity_m2_s(self) -> np.ndarray:
        return self.viscosity_pa_s / self.density_kg_m3

    @property
    def diffusivity_m2_s(self) -> np.ndarray:
        return self.conductivity_w_mk / (self.density_kg_m3 * self.heat_capacity_j_kgk)
