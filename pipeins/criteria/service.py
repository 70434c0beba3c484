"""The service limits of the layers: every layer's faces inside its material's service range.

Always on (``always`` in the registry), judged on the selected build-up by
:func:`pipeins.selection.select`, which meets it with an inner layer where the sized material
cannot serve."""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np

from .base import Criterion, _in

__all__ = ["ServiceLimits", "layer_face_margins"]


def layer_face_margins(result) -> list[tuple[object, np.ndarray, np.ndarray]]:
    """Per layer of a solved result: (material, hot-face margin, cold-face margin) [K].

    The hot-face margin is the material's ``max_temp_c`` less the warmer face, the cold-face
    margin the colder face less its ``min_temp_c``; both ≥ 0 where the layer serves.
    """
    temps = result.interface_temps_c
    out = []
    for j, layer in enumerate(result.inputs["layers"]):
        hot = np.maximum(temps[j + 1], temps[j + 2])
        cold = np.minimum(temps[j + 1], temps[j + 2])
        out.append((layer.material, layer.material.max_temp_c - hot, cold - layer.material.min_temp_c))
    return out


@dataclass
class ServiceLimits(Criterion):
    """Every layer's faces inside its material's service range (``min_temp_c`` to
    ``max_temp_c`` of ``tables/insulation_materials.csv``); always on.

    Unlike the other criteria it cannot be met by more of the sized layer (its hot face
    warms as it thickens), so it is checked on the selected build-up, and
    :func:`pipeins.selection.select` meets it with an inner layer of a material that can
    serve.  The margin is the least of every layer's face margins [K].
    """

    key = "service_limit"
    label = "service temperature"

    def margin(self, problem, result, thickness_m):
        margins = [np.minimum(hot, cold) for _, hot, cold in layer_face_margins(result)]
        return np.minimum.reduce(margins) if margins else np.full(result.shape, np.inf)

    def describe(self, units="si"):
        return "every layer within its material's service temperature range"

    def _tightest(self, result, index):
        best = None
        for j, (mat, hot, cold) in enumerate(layer_face_margins(result)):
            for side, m in (("hot", hot), ("cold", cold)):
                value = float(np.ravel(np.broadcast_to(m, result.shape))[index])
                if best is None or value < best[0]:
                    best = (value, j, mat, side)
        return best

    def state(self, problem, result, index):
        best = self._tightest(result, index)
        if best is None:
            return "no layer"
        value, j, mat, side = best
        limit = mat.max_temp_c if side == "hot" else mat.min_temp_c
        face = limit - value if side == "hot" else limit + value
        where = ("above" if value < 0 else "below") if side == "hot" else ("below" if value < 0 else "above")
        u = self.units
        return (f"layer {j + 1} ({mat.name}) {side} face {_in(u, face, 'temperature', f'{face:.1f} °C')}, "
                f"{_in(u, abs(value), 'temperature_difference', f'{abs(value):.1f} K')} {where} its "
                f"{_in(u, limit, 'temperature', f'{limit:g} °C')} limit")

    def miss(self, margin, thickness_m):
        return (f"service temperature cannot be met: a layer is "
                f"{_in(self.units, -margin, 'temperature_difference', f'{-margin:.1f} K')} beyond its material's limit")
