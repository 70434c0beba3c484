"""Structured notes (pipeins.notes) and their sentences (pipeins.reports.notes).

US conversions checked against the exact definitions (NIST SP 811, 2008, Appendix B: the
international foot is 0.3048 m, the inch 25.4 mm, t/°F = 1.8·t/°C + 32); the sentences
themselves are this project's own wording.
"""

from __future__ import annotations

import string

import pytest

from pipeins.notes import SEVERITIES, SI_UNITS, Note, note
from pipeins.reports.notes import TEMPLATES, note_dict, notes_json, render, render_all

#: One note per template code, with the fields its sentence cites (a new code needs one here).
EXAMPLES = {
    "run.freezes": note("run.freezes", freeze_c=(-0.3, "temperature")),
    "run.needs_fluid": note("run.needs_fluid"),
    "layer.above_service_limit": note("layer.above_service_limit", layer="1", material="flexible elastomeric foam",
                                      temp_c=(204.4, "temperature"), limit_c=(105.0, "temperature")),
    "layer.above_service_limit.span": note("layer.above_service_limit.span", layer="2", material="mineral wool",
                                           low_c=(655.2, "temperature"), high_c=(701.0, "temperature"),
                                           limit_c=(650.0, "temperature")),
    "layer.below_service_limit": note("layer.below_service_limit", layer="1", material="mineral wool",
                                      temp_c=(-60.0, "temperature"), limit_c=(-50.0, "temperature")),
    "layer.below_service_limit.span": note("layer.below_service_limit.span", layer="1", material="mineral wool",
                                           low_c=(-70.0, "temperature"), high_c=(-55.0, "temperature"),
                                           limit_c=(-50.0, "temperature")),
    "layer.below_critical_radius": note("layer.below_critical_radius", radius_m=(0.0123, "diameter"),
                                        material="k=0.3"),
    "selection.inner_layer": note("selection.inner_layer", material="flexible elastomeric foam tube",
                                  inner="mineral wool pipe section", low_c=(-50.0, "temperature"),
                                  high_c=(105.0, "temperature"), thickness_m=(0.02, "thickness")),
    "selection.inner_layer.span": note("selection.inner_layer.span", material="flexible elastomeric foam tube",
                                       inner="mineral wool pipe section", low_c=(-50.0, "temperature"),
                                       high_c=(105.0, "temperature"), thinnest_m=(0.0127, "thickness"),
                                       thickest_m=(0.0254, "thickness")),
    "film.outer.range": note("film.outer.range", what="Rayleigh number above 1e12", where=" in 1 of 2 cases",
                             consequence="beyond the Churchill & Chu (1975) horizontal-cylinder range; extrapolated"),
    "film.inner.range": note("film.inner.range", what="laminar flow (Re below 2300)", where="",
                             consequence="fully developed Nu = 4.36 used, entry-length enhancement neglected"),
    "film.duct_inner.range": note("film.duct_inner.range", what="transitional air flow (Re 2300 to 10000)",
                                  where=" in 1 of 3 cases", consequence="Gnielinski (1995) interpolation used"),
    "film.outer.air_table_range": note("film.outer.air_table_range", low_c=(-50.0, "temperature"),
                                       high_c=(400.0, "temperature"), where=" in 2 of 12 cases"),
    "cost.bare_fittings": note("cost.bare_fittings", length_m=(12.34, "length")),
    "materials.conductivity_falls": note("materials.conductivity_falls", file="our_materials.csv",
                                         material="site_foam"),
    "schedule.payback_partial": note("schedule.payback_partial", covered=(1, "number"), total=(3, "number"),
                                     lines='"CW-01 flow", "CW-02 return"'),
    "schedule.no_price": note("schedule.no_price", table="costs.csv", size="NPS 4", thickness_m=(0.05, "thickness")),
    "schedule.table_per_metre": note("schedule.table_per_metre", table="costs.csv", kind="duct", size="600x400mm"),
    "schedule.no_energy_price": note("schedule.no_energy_price", lines='"HW-1"'),
    "schedule.gain_without_cop": note("schedule.gain_without_cop", service="chw", lines='"CW-01 flow"'),
    "buried.return_beyond_supply": note("buried.return_beyond_supply", direction="hotter", supply_c=(80.0, "temperature"),
                                        return_c=(95.0, "temperature"), ground_c=(7.0, "temperature")),
    "buried.pair_directions_differ": note("buried.pair_directions_differ", supply_c=(6.0, "temperature"),
                                          return_c=(14.0, "temperature"), ground_c=(12.0, "temperature")),
    "buried.no_driving_difference": note("buried.no_driving_difference", supply_c=(7.0, "temperature"),
                                         return_c=(5.0, "temperature"), ground_c=(7.0, "temperature")),
    "buried.pair_above_cap": note("buried.pair_above_cap", role="return", heat_flow=(-39.3, "heat_flow_per_length"),
                                  cap=(22.0, "heat_flow_per_length")),
    "economic.at_thickest": note("economic.at_thickest", thickness_m=(0.075, "thickness")),
    "economic.at_thinnest": note("economic.at_thinnest", thickness_m=(0.0381, "thickness")),
    "surface.above_touch_limit": note("surface.above_touch_limit", surface_c=(71.23, "temperature"),
                                      limit_c=(60.0, "temperature")),
    "surface.below_dew_point": note("surface.below_dew_point", where="surface", surface_c=(12.0, "temperature"),
                                    dew_point_c=(15.2, "temperature")),
    "surface.below_dew_point.night": note("surface.below_dew_point.night", surface_c=(19.4, "temperature"),
                                          dew_point_c=(21.0, "temperature")),
    "vessel.freeze_hold_lumped": note("vessel.freeze_hold_lumped"),
    "vessel.contents_not_worked_out": note("vessel.contents_not_worked_out",
                                           reason='no liquid properties for "nitrogen" at 20 °C'),
    "condensation.not_checked.cold_line": note("condensation.not_checked.cold_line", what="line"),
    "condensation.not_checked.cold_surroundings": note("condensation.not_checked.cold_surroundings",
                                                       surface_c=(18.0, "temperature")),
    **{code: note(code, "caution") for code in ("caution.hot", "caution.metal_jacket", "caution.cold",
                                                "caution.freeze", "caution.code", "caution.general")},
}


def test_every_template_has_an_example_and_renders_in_si_and_us():
    assert set(EXAMPLES) == set(TEMPLATES)
    for code, example in EXAMPLES.items():
        assert example.code == code
        for units in ("si", "us"):
            text = render(example, units)
            assert text and "{" not in text and "}" not in text, (code, units, text)


def test_every_placeholder_is_a_field_of_its_example():
    for code, template in TEMPLATES.items():
        for text in (template.values() if isinstance(template, dict) else [template]):
            names = {name for _, name, _, _ in string.Formatter().parse(text) if name}
            assert names <= set(EXAMPLES[code].fields()), code


def test_note_is_frozen_hashable_and_deduplicates():
    a = note("run.freezes", freeze_c=(0.0, "temperature"))
    b = note("run.freezes", freeze_c=(0.0, "temperature"))
    assert a == b and len(dict.fromkeys([a, b])) == 1
    with pytest.raises(AttributeError):
        a.code = "x"  # type: ignore[misc]


def test_bad_severity_or_kind_is_refused():
    with pytest.raises(ValueError):
        Note("x", "alarm")
    with pytest.raises(ValueError):
        note("x", length=(1.0, "furlong"))
    assert set(SEVERITIES) == {"warning", "note", "caution"}


def test_si_template_matches_the_library_wording_and_us_converts():
    n = note("run.freezes", freeze_c=(0.0, "temperature"))
    assert render(n, "si") == ("the fluid cools to its freezing point (0.0 °C) along the run; "
                               "beyond that point the result is not valid")
    # NIST SP 811: t/°F = 1.8 t/°C + 32, so 0 °C is 32 °F
    assert f"({1.8 * 0.0 + 32:.1f} °F)" in render(n, "us")


def test_quantity_placeholders_si_format_and_us_digits():
    TEMPLATES["test.length"] = "over {length:g|} and {t:|2} and {count:.0f} cases"
    try:
        n = note("test.length", length=(120.0, "length"), t=(0.0508, "thickness"), count=(3, "number"))
        assert render(n, "si") == "over 120 m and 51 mm and 3 cases"
        feet = 120.0 / 0.3048  # NIST SP 811: 1 ft = 0.3048 m exactly
        # a thickness in inches shows one decimal more than asked (pipeins.units.format_quantity)
        assert render(n, "us") == f"over {feet:.1f} ft and {0.0508 / 0.0254:.3f} in and 3 cases"
    finally:
        del TEMPLATES["test.length"]


def test_json_object_has_si_values_units_and_text():
    n = note("run.freezes", subject="service A", freeze_c=(-0.25, "temperature"))
    d = note_dict(n, "us")
    assert d["code"] == "run.freezes" and d["severity"] == "warning" and d["subject"] == "service A"
    assert d["values"] == {"freeze_c": {"value": -0.25, "unit": "°C"}}
    assert d["text"] == render(n, "us")
    assert notes_json([n, n]) == [note_dict(n)]
    assert all(isinstance(u, str) for u in SI_UNITS.values())


def test_render_all_keeps_strings_and_order():
    n = note("run.needs_fluid")
    assert render_all(["a", n, "a", n], "si") == ["a", render(n)]


def test_unknown_code_says_where_to_add_it():
    with pytest.raises(KeyError, match="TEMPLATES"):
        render(note("no.such.code"))


def test_caution_notes_keep_the_report_order_and_sentences():
    # the cautions' selection (library) and their sentences (report layer) meet again
    from pipeins.cautions import CAUTION_CODES, caution_notes
    from pipeins.reports.cautions import GENERAL, HOT, cautions

    picked = caution_notes([180.0, 6.0], [20.0, 28.0], ["metal_jacket"], code=True)
    assert [n.code for n in picked] == ["caution.hot", "caution.metal_jacket", "caution.cold", "caution.code",
                                        "caution.general"]
    assert all(n.severity == "caution" for n in picked) and set(EXAMPLES) >= set(CAUTION_CODES)
    assert cautions([180.0], [20.0]) == [HOT, GENERAL]
    assert GENERAL.endswith("Local codes, the owner's rules and licensed practice govern.")


def test_economic_edge_thickness_in_mm_as_before_and_inches():
    # the SI sentence as pipeins.economics wrote it before the notes (f"{t * 1000:g} mm")
    for code, t in (("economic.at_thickest", 0.075), ("economic.at_thinnest", 0.0381)):
        assert f"({t * 1000:g} mm)" in render(EXAMPLES[code], "si")
    assert "(1.50 in)" in render(EXAMPLES["economic.at_thinnest"], "us")  # 38.1 mm = 1.5 in, NIST SP 811


def test_bare_fittings_length_in_metres_and_feet():
    n = EXAMPLES["cost.bare_fittings"]
    assert render(n, "si").startswith("bare fittings count as 12.3 m of bare pipe;")
    assert render(n, "us").startswith(f"bare fittings count as {12.34 / 0.3048:.1f} ft of bare pipe;")  # NIST SP 811


def test_touch_and_dew_point_sentences_in_si_keep_their_wording_and_us_says_fahrenheit():
    touch = EXAMPLES["surface.above_touch_limit"]
    assert render(touch, "si") == "surface 71.2 °C is above the touch limit of 60 °C"
    # NIST SP 811: t/°F = 1.8 t/°C + 32
    assert render(touch, "us") == f"surface {1.8 * 71.23 + 32:.1f} °F is above the touch limit of 140.0 °F"
    dew = EXAMPLES["surface.below_dew_point"]
    assert render(dew, "si") == "surface 12.0 °C is below the dew point 15.2 °C: it will sweat"
    assert "°C" not in render(dew, "us")


def test_a_span_names_its_unit_once():
    # {low!n:…} writes the number alone; 655.2 °C = 1211.4 °F and 701 °C = 1293.8 °F (NIST SP 811)
    n = EXAMPLES["layer.above_service_limit.span"]
    assert render(n, "si") == ("layer 2 (mineral wool): reaches 655.2 to 701.0 °C, above its usable limit of 650 °C; "
                               "choose a material rated for it or add an inner layer")
    assert render(n, "us").startswith("layer 2 (mineral wool): reaches 1211.4 to 1293.8 °F, above its usable limit "
                                      "of 1202 °F")
