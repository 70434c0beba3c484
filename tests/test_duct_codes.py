"""Duct insulation code minimum (pipeins.duct_codes): IECC 2018 C403.11.1, values from memory."""

import pytest

from pipeins import duct_codes
from pipeins.catalog.materials import lookup_material
from pipeins.errors import InputError
from pipeins.physics.conduction import conductivity_of

IECC = "iecc-2018-c403"


@pytest.mark.parametrize("location, service, zone, r_ip", [
    # IECC 2018 C403.11.1 (from memory): R-6 unconditioned; outdoors and within the envelope
    # R-8 in zones 1-4, R-12 in zones 5-8 (each band edge); none in conditioned space
    ("unconditioned", "supply", 1, 6), ("unconditioned", "return", 8, 6),
    ("outdoors", "supply", 1, 8), ("outdoors", "supply", 4, 8), ("outdoors", "supply", 5, 12),
    ("outdoors", "return", 8, 12), ("envelope", "supply", "4A", 8), ("envelope", "return", "5B", 12),
    ("conditioned", "supply", 6, 0), ("exterior", "supply", "zone 7", 12), ("attic", "supply", "CZ 2", 6),
], ids=lambda v: str(v))
def test_iecc_2018_duct_r_values(location, service, zone, r_ip):
    req = duct_codes.minimum_r_value(IECC, location, service, zone)
    assert req.covered and not req.exempt
    assert req.r_value_as_written == r_ip and req.r_unit == "h·ft²·°F/Btu"
    assert req.r_value_m2k_w == pytest.approx(r_ip * 0.1761102, rel=1e-6)
    assert "IECC 2018 C403.11.1" in req.source and "from memory" in req.source


def test_r_unit_against_pint():
    # pint: 1 h·ft²·°F/Btu (International Table Btu) in m²·K/W
    import pint

    ureg = pint.UnitRegistry()
    factor = (1 * ureg.hour * ureg.foot**2 * ureg.delta_degF / ureg.Btu_it).to(ureg.m**2 * ureg.K / ureg.W).magnitude
    assert float(duct_codes.r_value_si(1.0)) == pytest.approx(factor, rel=1e-9)


def test_exemption_at_15_f_difference():
    # C403.11.1 exception (from memory): design temperature difference at most 15 °F needs no insulation
    at_limit = duct_codes.minimum_r_value(IECC, "outdoors", "supply", 5, temp_difference_k=15 * 5 / 9)
    assert at_limit.exempt and at_limit.r_value_m2k_w == 0.0
    above = duct_codes.minimum_r_value(IECC, "outdoors", "supply", 5, temp_difference_k=8.4)
    assert not above.exempt and above.r_value_as_written == 12
    assert duct_codes.minimum_r_value(IECC, "outdoors", "supply", 5, temp_difference_k=-5.0).exempt


def test_zone_not_covered_is_said_not_guessed():
    req = duct_codes.minimum_r_value(IECC, "outdoors", "supply", 0)
    assert not req.covered and req.r_value_m2k_w is None
    assert req.reason == "iecc-2018-c403: no supply row for outdoors ducts covers climate zone 0"


@pytest.mark.parametrize("args, name, text", [
    (("iecc-2017-c403", "outdoors", "supply", 4), "--code", 'unknown duct rule set "iecc-2017-c403"; did you mean "iecc-2018-c403"?'),
    ((IECC, "roof space", "supply", 4), "location", 'unknown location "roof space"'),
    ((IECC, "outdoors", "exhaust", 4), "service", 'unknown service "exhaust"'),
    ((IECC, "outdoors", "supply", "9A"), "climate_zone", 'cannot read "9A" as a climate zone'),
    ((IECC, "outdoors", "supply", "warm"), "climate_zone", 'cannot read "warm" as a climate zone'),
])
def test_bad_code_input(args, name, text):
    with pytest.raises(InputError) as exc:
        duct_codes.minimum_r_value(*args)
    assert exc.value.name == name and exc.value.message.startswith(text)


def test_rows_do_not_overlap_and_every_location_is_answered():
    rows = duct_codes.load_duct_rule_sets()[IECC]
    for location in duct_codes.LOCATIONS:
        for service in duct_codes.SERVICES:
            for zone in range(1, 9):
                assert duct_codes.minimum_r_value(IECC, location, service, zone).covered
    assert all(r.source for r in rows)
    assert len(duct_codes.list_duct_rules()) == len(rows)


def test_least_thickness_meets_the_r_value_at_the_mean_temperature():
    # R = t / k(T_mean) of a flat layer (ASTM C680; any heat-transfer text)
    r = duct_codes.minimum_r_value(IECC, "outdoors", "supply", 6).r_value_m2k_w
    material = lookup_material("glass wool")
    for mean_c in (duct_codes.RATING_MEAN_TEMP_C, 10.0, 40.0):
        result = duct_codes.least_thickness(r, material, mean_c)
        k = float(conductivity_of(material).conductivity(mean_c))
        assert float(result.installed_thickness_m) / k == pytest.approx(r, rel=1e-12)
        assert float(result.nominal_thickness_m) == float(result.installed_thickness_m)
    assert duct_codes.RATING_MEAN_TEMP_C == pytest.approx(23.8889, abs=1e-4)  # 75 °F


def test_least_thickness_with_wrap_compression():
    # R-8 with k = 0.040: 56.4 mm installed; at 25 % compression (common practice) 75.2 mm nominal
    result = duct_codes.least_thickness(duct_codes.r_value_si(8.0), "k=0.040", compression_percent=25)
    assert float(result.installed_thickness_m) == pytest.approx(8 * 0.1761102 * 0.040, rel=1e-6)
    assert float(result.nominal_thickness_m) == pytest.approx(float(result.installed_thickness_m) / 0.75)
    with pytest.raises(InputError):
        duct_codes.least_thickness(-1.0, "k=0.040")
    with pytest.raises(InputError):
        duct_codes.least_thickness(1.0, "k=0.040", compression_percent=100)


def test_exempt_reason_in_us_units(run):
    # IECC 2018 C403.11.1 (from memory): exempt at a design difference of 15 °F or less; 2 K = 3.6 °F
    code, out, err = run("size", "--duct", "600x400mm", "--fluid-temp", "22C", "--ambient-temp", "20C", "--material",
                         "glass wool duct wrap", "--code", IECC, "--duct-location", "unconditioned", "--duct-service",
                         "supply", "--climate-zone", "4", "--units", "us")
    assert code == 0, err
    assert "exempt: the design temperature difference 3.6 °F is at most 15 °F" in out
    si = duct_codes.minimum_r_value(IECC, "unconditioned", "supply", 4, 2.0).reason
    assert si.endswith("exempt: the design temperature difference 2 K is at most 8.33 K")
