"""Pipe catalogues (tables/pipes_*.csv, pipeins.catalog.pipes) against outside sources."""

from fractions import Fraction

import pint
import pytest
from fluids.piping import nearest_pipe, o_CTS_D2241, NPS_CTS_D2241
from hypothesis import given, settings, strategies as st

from pipeins.catalog.pipes import PipeSize, custom_pipe, list_pipes, lookup_pipe, pipe_range
from pipeins.errors import InputError
from pipeins.tables import read_table

ureg = pint.UnitRegistry()


def _nps_value(text):
    whole, _, frac = text.partition("-")
    if "/" in whole:
        return float(Fraction(whole))
    return float(Fraction(whole) + (Fraction(frac) if frac else 0))


# ---------------------------------------------------------------- steel vs fluids (ASME B36.10M/19M)
def test_steel_matches_fluids_b36_tables():
    """Every NPS × schedule both carry: OD and wall vs fluids.piping (ASME B36.10M-2004 / B36.19M-2004)."""
    compared, skipped = 0, 0
    for row in read_table("pipes_steel"):
        nps = _nps_value(row["nps"])
        try:
            f_nps, _, f_do, f_t = nearest_pipe(NPS=nps, schedule=row["schedule"])
        except ValueError:
            skipped += 1
            continue
        assert f_nps == pytest.approx(nps)
        assert float(row["outer_diameter_mm"]) == pytest.approx(f_do * 1000, abs=0.01), row  # fluids.piping B36
        assert float(row["wall_mm"]) == pytest.approx(f_t * 1000, abs=0.01), row  # fluids.piping B36
        compared += 1
    assert compared > 300  # 348 rows; fluids carries all of them
    assert skipped == 0


def test_steel_table_is_complete_against_fluids():
    """Every fluids pair up to NPS 36 in our schedules is in the table (fluids.piping schedule tables)."""
    from fluids.piping import schedule_lookup

    ours = {(_nps_value(r["nps"]), r["schedule"]) for r in read_table("pipes_steel")}
    schedules = {r["schedule"] for r in read_table("pipes_steel")}
    missing = [(n, s) for s in schedules for n in schedule_lookup[s][0]
               if n <= 36 and (n, s) not in ours]
    assert missing == []


@pytest.mark.parametrize(
    "label, schedule, od_in, wall_in, od_tol_mm",
    [
        pytest.param("NPS 2", "40", 2.375, 0.154, 0.06, id="ASME B36.10M inch table, NPS 2 sch 40 (from memory)"),
        pytest.param("NPS 4", "80", 4.500, 0.337, 0.06, id="ASME B36.10M inch table, NPS 4 sch 80 (from memory)"),
        pytest.param("NPS 6", "STD", 6.625, 0.280, 0.06, id="ASME B36.10M inch table, NPS 6 STD (from memory)"),
        pytest.param("NPS 12", "XS", 12.75, 0.500, 0.06, id="ASME B36.10M inch table, NPS 12 XS (from memory)"),
        pytest.param("NPS 24", "10", 24.00, 0.250, 0.5, id="ASME B36.10M inch table, NPS 24 sch 10 (from memory)"),
        pytest.param("NPS 1", "10S", 1.315, 0.109, 0.06, id="ASME B36.19M inch table, NPS 1 sch 10S (from memory)"),
    ],
)
def test_steel_inch_dimensions(label, schedule, od_in, wall_in, od_tol_mm):
    pipe = lookup_pipe(label, schedule)
    od_m = (od_in * ureg.inch).to("m").magnitude  # pint conversion
    wall_m = (wall_in * ureg.inch).to("m").magnitude
    # B36.10M prints the SI OD to 0.1 mm (to 1 mm from NPS 18 up)
    assert pipe.outer_diameter_m == pytest.approx(od_m, abs=od_tol_mm * 1e-3)
    assert pipe.wall_m == pytest.approx(wall_m, abs=0.006e-3)  # SI table printed to 0.01 mm


# ---------------------------------------------------------------- copper (ASTM B88)
@pytest.mark.parametrize("nps, od_mm", list(zip(NPS_CTS_D2241, o_CTS_D2241)))
def test_copper_od_matches_fluids_copper_tube_sizes(nps, od_mm):
    """ASTM D2241 copper-tube-size ODs in fluids.piping equal the ASTM B88 ODs (nominal + 1/8 in)."""
    nominal = {0.5: "1/2", 0.75: "3/4", 1.0: "1", 1.25: "1-1/4", 1.5: "1-1/2", 2.0: "2"}[nps]
    for tube_type in "KLM":
        pipe = lookup_pipe(f"copper {tube_type} {nominal}")
        assert pipe.outer_diameter_m * 1000 == pytest.approx(od_mm, abs=1e-6)  # fluids CTS table


def test_copper_od_rule_every_row():
    """ASTM B88: outside diameter = nominal size + 1/8 in for every type (common knowledge of the standard)."""
    for row in read_table("pipes_copper"):
        assert float(row["outer_diameter_in"]) == pytest.approx(_nps_value(row["nominal"]) + 0.125)


@pytest.mark.parametrize(
    "label, wall_in",
    [
        pytest.param("copper K 1", 0.065, id="ASTM B88 type K 1 in (from memory)"),
        pytest.param("copper L 1/2", 0.040, id="ASTM B88 type L 1/2 in (from memory)"),
        pytest.param("copper L 2", 0.070, id="ASTM B88 type L 2 in (from memory)"),
        pytest.param("copper M 3/4", 0.032, id="ASTM B88 type M 3/4 in (from memory)"),
    ],
)
def test_copper_walls(label, wall_in):
    assert lookup_pipe(label).wall_m == pytest.approx((wall_in * ureg.inch).to("m").magnitude)


def test_copper_wall_order_k_l_m():
    """ASTM B88: type K is the heaviest wall, then L, then M (definition of the types)."""
    for nominal in ["3/8", "1/2", "3/4", "1", "1-1/2", "2", "3", "4", "6"]:
        k, l, m = (lookup_pipe(f"copper {t} {nominal}").wall_m for t in "KLM")
        assert k > l > m


# ---------------------------------------------------------------- metric (EN 10220 / ISO 4200)
@pytest.mark.parametrize(
    "dn, nps",
    [
        pytest.param(15, 0.5, id="EN 10220 series 1 = ASME B36.10M OD, DN15 (fluids.piping)"),
        pytest.param(40, 1.5, id="EN 10220 series 1 = ASME B36.10M OD, DN40 (fluids.piping)"),
        pytest.param(50, 2.0, id="EN 10220 series 1 = ASME B36.10M OD, DN50 (fluids.piping)"),
        pytest.param(80, 3.0, id="EN 10220 series 1 = ASME B36.10M OD, DN80 (fluids.piping)"),
        pytest.param(100, 4.0, id="EN 10220 series 1 = ASME B36.10M OD, DN100 (fluids.piping)"),
        pytest.param(150, 6.0, id="EN 10220 series 1 = ASME B36.10M OD, DN150 (fluids.piping)"),
        pytest.param(200, 8.0, id="EN 10220 series 1 = ASME B36.10M OD, DN200 (fluids.piping)"),
        pytest.param(400, 16.0, id="EN 10220 series 1 = ASME B36.10M OD, DN400 (fluids.piping)"),
    ],
)
def test_metric_od_where_series_coincide(dn, nps):
    _, _, do, _ = nearest_pipe(NPS=nps, schedule="40S" if nps < 14 else "10S")
    assert lookup_pipe(f"DN{dn}").outer_diameter_m == pytest.approx(do, abs=0.06e-3)


@pytest.mark.parametrize(
    "dn, od_mm",
    [
        pytest.param(20, 26.9, id="EN 10220 series 1 DN20 (from memory)"),
        pytest.param(25, 33.7, id="EN 10220 series 1 DN25 (from memory)"),
        pytest.param(65, 76.1, id="EN 10220 series 1 DN65 (from memory)"),
        pytest.param(125, 139.7, id="EN 10220 series 1 DN125 (from memory)"),
    ],
)
def test_metric_od_series_1(dn, od_mm):
    assert lookup_pipe(f"DN {dn}").outer_diameter_m == pytest.approx(od_mm / 1000, abs=0.05e-3)


# ---------------------------------------------------------------- table hygiene
@pytest.mark.parametrize("table", ["pipes_steel", "pipes_copper", "pipes_metric"])
def test_pipe_tables_parse(table):
    for row in read_table(table):
        assert row["source"].strip()
        od = float(row.get("outer_diameter_mm") or row.get("outer_diameter_in"))
        wall = float(row.get("wall_mm") or row.get("wall_in"))
        assert 0 < wall < od / 2


def test_list_pipes_rows():
    rows = list_pipes()
    assert len(rows) == len(read_table("pipes_steel")) + len(read_table("pipes_copper")) + len(
        read_table("pipes_metric"))
    assert {r["kind"] for r in rows} == {"steel", "copper", "metric"}
    assert all(r["source"] for r in rows)


# ---------------------------------------------------------------- lookups
@pytest.mark.parametrize(
    "text, label, nominal",
    [
        ("NPS 2", "NPS 2", "2"),
        ("nps 1-1/2", "NPS 1-1/2", "1-1/2"),
        ("NPS 1 1/2", "NPS 1-1/2", "1-1/2"),
        ("NPS 1.5", "NPS 1-1/2", "1-1/2"),
        ("NPS 3/4", "NPS 3/4", "3/4"),
        ("DN50", "DN50", "50"),
        ("dn 50", "DN50", "50"),
        ("copper K 3/4", "copper K 3/4", "3/4"),
        ("Copper type l 1-1/4", "copper L 1-1/4", "1-1/4"),
        ("copper L 1-1/8", "copper L 1", "1"),  # named by OD: 1-1/8 in OD is nominal 1
        ("copper L 3/4 OD", "copper L 5/8", "5/8"),
    ],
)
def test_lookup_forms(text, label, nominal):
    pipe = lookup_pipe(text)
    assert (pipe.label, pipe.nominal) == (label, nominal)
    assert isinstance(pipe, PipeSize)


def test_lookup_schedules():
    assert lookup_pipe("NPS 2").schedule == "40"  # default
    assert lookup_pipe("NPS 2", "std").wall_m == lookup_pipe("NPS 2", "40").wall_m
    assert lookup_pipe("NPS 2", "XS").wall_m == lookup_pipe("NPS 2", "sch 80").wall_m
    assert lookup_pipe("NPS 12", "40S").wall_m == pytest.approx(9.53e-3)  # ASME B36.19M 12 in 40S
    assert lookup_pipe("NPS 12", "40").wall_m == pytest.approx(10.31e-3)  # ASME B36.10M 12 in sch 40
    assert lookup_pipe("NPS 30").schedule == "STD"  # no schedule 40 at NPS 30
    pipe = lookup_pipe("NPS 2")
    assert pipe.inner_diameter_m == pytest.approx(0.0603 - 2 * 0.00391)


@pytest.mark.parametrize(
    "args, name, message",
    [
        (("NPS 7",), "pipe", 'unknown pipe size "NPS 7"; did you mean "NPS 6" or "NPS 8"?'),
        (("NPS 40",), "pipe", 'unknown pipe size "NPS 40"; did you mean "NPS 36"?'),
        (("DN 55",), "pipe", 'unknown pipe size "DN 55"; did you mean "DN50" or "DN65"?'),
        (("copper M 1/4",), "pipe", 'unknown pipe size "copper M 1/4"; did you mean "copper M 3/8"?'),
        (("copper X 1",), "pipe", 'unknown copper tube type "X" in "copper X 1"; types: K, L, M'),
        (("NPS 2", "60"), "schedule",
         "NPS 2 has no schedule 60; available: 5S, 10S, 10, 30, 40, 40S, STD, 80, 80S, XS, 160, XXS"),
        (("NPS 30", "40"), "schedule", "NPS 30 has no schedule 40; available: 5S, 10S, 10, 20, 30, STD, XS"),
        (("DN50", "40"), "schedule",
         'DN50 takes no schedule (schedules apply to NPS steel pipe; copper tube gives its type in the '
         'size, e.g. "copper L 3/4")'),
    ],
)
def test_lookup_errors(args, name, message):
    with pytest.raises(InputError) as info:
        lookup_pipe(*args)
    assert (info.value.name, info.value.message) == (name, message)


@pytest.mark.parametrize(
    "od, wall, name, message",
    [
        (0.06, 0.03, "wall_m", "0.03 m: the wall must be above 0 and below half the outside diameter (0.03 m)"),
        (0.06, 0.0, "wall_m", "0 m: the wall must be above 0 and below half the outside diameter (0.03 m)"),
        (-0.06, 0.001, "outer_diameter_m", "-0.06 m: the outside diameter must be above 0"),
    ],
)
def test_custom_pipe_errors(od, wall, name, message):
    with pytest.raises(InputError) as info:
        custom_pipe(od, wall)
    assert (info.value.name, info.value.message) == (name, message)


@settings(max_examples=60, deadline=None)
@given(od=st.floats(1e-3, 3.0), fraction=st.floats(0.001, 0.499))
def test_custom_pipe_valid(od, fraction):
    pipe = custom_pipe(od, od * fraction)
    assert pipe.kind == "custom" and pipe.schedule is None
    assert 0 < pipe.inner_diameter_m < pipe.outer_diameter_m


@settings(max_examples=80, deadline=None)
@given(row=st.sampled_from(read_table("pipes_steel")))
def test_every_steel_row_round_trips(row):
    pipe = lookup_pipe(f"NPS {row['nps']}", row["schedule"])
    assert pipe.outer_diameter_m == pytest.approx(float(row["outer_diameter_mm"]) / 1000)
    assert pipe.wall_m == pytest.approx(float(row["wall_mm"]) / 1000)


# ---------------------------------------------------------------- ranges
def test_range_nps():
    labels = [p.label for p in pipe_range("NPS 1/2..NPS 12")]
    assert labels == ["NPS 1/2", "NPS 3/4", "NPS 1", "NPS 1-1/4", "NPS 1-1/2", "NPS 2", "NPS 2-1/2",
                      "NPS 3", "NPS 3-1/2", "NPS 4", "NPS 5", "NPS 6", "NPS 8", "NPS 10", "NPS 12"]
    assert all(p.schedule == "40" for p in pipe_range("NPS 1/2..NPS 12"))
    assert {p.schedule for p in pipe_range("NPS 1/2..NPS 12", "80")} == {"80"}


def test_range_dn():
    labels = [p.label for p in pipe_range("DN15..DN300")]
    assert labels == ["DN15", "DN20", "DN25", "DN32", "DN40", "DN50", "DN65", "DN80", "DN100",
                      "DN125", "DN150", "DN200", "DN250", "DN300"]
    assert [p.label for p in pipe_range("DN15..300")] == labels


def test_range_copper():
    labels = [p.label for p in pipe_range("copper L 1/2..4")]
    assert labels == ["copper L 1/2", "copper L 5/8", "copper L 3/4", "copper L 1", "copper L 1-1/4",
                      "copper L 1-1/2", "copper L 2", "copper L 2-1/2", "copper L 3",
                      "copper L 3-1/2", "copper L 4"]


def test_comma_list():
    assert [p.label for p in pipe_range("NPS 1, NPS 2 ,NPS 4")] == ["NPS 1", "NPS 2", "NPS 4"]
    assert len(pipe_range("NPS 1/2..NPS 1, NPS 4")) == 4


@pytest.mark.parametrize(
    "text, message",
    [
        ("NPS 1, NPS 2, DN50", '"NPS 1, NPS 2, DN50" mixes catalogues (steel and metric); give one catalogue per run'),
        ("NPS 1..DN50", 'range "NPS 1..DN50" mixes catalogues (steel and metric); give one catalogue per run'),
        ("copper L 1..copper K 2",
         'range "copper L 1..copper K 2" mixes catalogues (copper type L and copper type K); give one catalogue per run'),
        ("NPS 12..NPS 1/2", 'range "NPS 12..NPS 1/2" runs backwards; write the smaller size first'),
        ("", 'no pipe sizes given; write e.g. "NPS 1/2..NPS 12" or "DN25, DN50, DN80"'),
        ("NPS 1..", 'range "NPS 1.." needs a size on both sides of ".."'),
        ("NPS 1,,NPS 2", 'empty item in the size list "NPS 1,,NPS 2"'),
        ("NPS 1..NPS 7", 'unknown pipe size "NPS 7"; did you mean "NPS 6" or "NPS 8"?'),
    ],
)
def test_range_errors(text, message):
    with pytest.raises(InputError) as info:
        pipe_range(text)
    assert (info.value.name, info.value.message) == ("--sizes", message)
