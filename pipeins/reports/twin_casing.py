"""The report section of two pipes in one casing (``check --twin-casing``)."""

from __future__ import annotations

from . import Column, Table

__all__ = ["twin_casing_table"]


def twin_casing_table(data: dict, units: str) -> Table:
    """Supply and return in one casing: each pipe's fluid temperature and heat flow (apart,
    never netted), the heat the pair loses and gains, and the method in the note."""
    from ..units import format_quantity as fq

    rows = [["supply (this line)", data["supply_temp_c"], data["supply_heat_flow_w_per_m"]],
            ["return", data["return_temp_c"], data["return_heat_flow_w_per_m"]],
            ["heat lost by the pair", None, data["heat_loss_w_per_m"]]]
    if data["heat_gain_w_per_m"] > 0:
        rows.append(["heat gained by the pair", None, data["heat_gain_w_per_m"]])
    rows.append(["reference: the supply alone, centred in the casing", data["supply_temp_c"],
                 data["alone_heat_flow_w_per_m"]])
    note = (f"casing {fq(data['casing_diameter_m'], 'diameter', units)} outside, pipes "
            f"{fq(data['pipe_diameter_m'], 'diameter', units)} with centres {fq(data['spacing_m'], 'diameter', units)} "
            f"apart; {data['insulation']} at k = {fq(data['insulation_k_w_mk'], 'conductivity', units)} "
            f"(mean {fq(data['insulation_mean_temp_c'], 'temperature', units)}); soil k = "
            f"{fq(data['soil_k_w_mk'], 'conductivity', units)}, σ = {data['sigma']:.3f}; casing factors h_s = "
            f"{data['h_symmetric']:.4f}, h_a = {data['h_antisymmetric']:.4f} (first-order closed forms "
            f"{data['h_symmetric_first_order']:.4f}, {data['h_antisymmetric_first_order']:.4f}); soil "
            f"{fq(data['soil_resistance_mk_w'], 'thermal_resistance_per_length', units)}; casing mean {fq(data['casing_temp_c'], 'temperature', units)}. "
            f"Method: {data['method']}. Heat flow positive out of the fluid; the two pipes' flows are given apart. "
            "Soil conductivity varies with moisture: use a site survey where the heat flow matters.")
    return Table("Twin pipes in one casing", [Column("pipe"), Column("fluid", "temperature"),
                                              Column("heat flow", "heat_flow_per_length")], rows, note=note)
