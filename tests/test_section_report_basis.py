"""The report of a section: every table in its CSV (blocks, one per table, as the schedule's
one file per table), and its assumptions as basis lines (name, value with unit, source) in
every format.

Outside references: the outer film lengths against the correlation registry's own record of
each length (McAdams 1954 A/P of a horizontal plate, Lloyd & Moran 1974: a long strip of
width w has A/P = w/2; Churchill & Chu 1975 vertical plate on its height); the rectangular
duct's mean insulation perimeter of ISO 12241 (2008) §4.2.3, (P_i + P_e)/2 with
P_e = P_i + 8d (from memory); the disc-on-half-space floor resistance πD/(8k) (from memory).
"""

from __future__ import annotations

import csv
import io
import json
import math

import pytest

DUCT = ("check", "--duct", "600x400mm", "--fluid-temp", "13C", "--ambient-temp", "30C", "--rh", "70",
        "--layer", "glass wool duct wrap:50mm")


def _blocks(text):
    """The CSV blocks of a report: {table title: (header, rows)}, the leading comments apart."""
    out, title, body = {}, None, []

    def close():
        if title is not None:
            rows = list(csv.reader(io.StringIO("".join(x for x in body if not x.startswith("#")))))
            rows = [r for r in rows if r]
            out[title] = (rows[0], rows[1:])

    for line in text.splitlines(True):
        if line.startswith("# table: "):
            close()
            title, body = line[len("# table: "):].strip(), []
        elif title is not None:
            body.append(line)
    close()
    return out


@pytest.mark.parametrize("units", ["si", "us"])
def test_section_csv_keeps_every_table(run, units):
    code, text_out, err = run(*DUCT, "--units", units)
    assert code == 0, err
    code, out, err = run(*DUCT, "--units", units, "--format", "csv")
    assert code == 0, err
    blocks = _blocks(out)
    titles = ["Section", "Results", "Parts", "Temperatures through the build-up (governing part)",
              "Basis: assumptions"]
    assert list(blocks) == titles
    for title in titles:  # every table of the text report is a block of the CSV
        assert title in text_out
    header, rows = blocks["Parts"]
    assert [r[0] for r in rows] == ["top", "sides", "bottom"]
    for header, rows in blocks.values():  # each block parses alone; numbers plain where the header has a unit
        for row in rows:
            assert len(row) == len(header)
            for head, cell in zip(header, row):
                if "[" in head and cell:
                    float(cell)
    assert out.startswith("# Heat flow check: rectangular duct 600x400mm")
    assert "# caution: " in out.split("# table: ")[0]  # the report's comments once, before the blocks


def test_section_csv_parts_add_up(run):
    code, out, err = run(*DUCT, "--format", "csv")
    blocks = _blocks(out)
    header, rows = blocks["Parts"]
    flows = [float(r[header.index("heat flow [W/m]")]) for r in rows]
    (results_header, (whole,)) = blocks["Results"]
    assert abs(sum(flows)) == pytest.approx(float(whole[0]), abs=0.15)  # printed to 0.1 W/m


def _basis(run, *args):
    code, out, err = run(*args, "--format", "json")
    assert code == 0, err
    return {b["name"]: b for b in json.loads(out)["basis"]}


def test_duct_basis_lines_film_lengths_and_corners(run):
    basis = _basis(run, *DUCT)
    # a long strip of width w: A/P = w/2 (McAdams, length A/P); a vertical side on its height
    assert basis["outer film length, top"]["value"] == pytest.approx(0.3)
    assert basis["outer film length, bottom"]["value"] == pytest.approx(0.3)
    assert basis["outer film length, sides"]["value"] == pytest.approx(0.4)
    assert "McAdams" in basis["outer film length, top"]["source"]
    assert "Churchill & Chu" in basis["outer film length, sides"]["source"]
    # ISO 12241 mean perimeter: (P_i + P_e)/2 = 2(w + h) + 4d at the installed 37.5 mm of a 50 mm wrap
    corners = basis["corners: mean perimeter of the insulation"]
    assert corners["value"] == pytest.approx(2 * (0.6 + 0.4) + 4 * 0.0375, rel=1e-12)
    assert corners["unit"] == "m" and "ISO 12241" in corners["source"]
    assert all(set(b) == {"name", "value", "unit", "source"} for b in basis.values())


def test_sun_and_wind_basis_lines(run):
    basis = _basis(run, *DUCT, "--solar", "700W/m2", "--absorptance", "0.6", "--wind", "2m/s")
    assert basis["sun direction"]["value"].startswith("overhead on a horizontal run")
    assert basis["solar irradiance"]["value"] == pytest.approx(700.0) and basis["solar irradiance"]["unit"] == "W/m²"
    assert basis["solar absorptance"]["value"] == pytest.approx(0.6)
    assert basis["wind flow length, sides"]["value"] == pytest.approx(0.4)


def test_tank_floor_basis_lines_si_and_us(run):
    args = ("check", "--vessel", "vertical", "--diameter", "3m", "--length", "5m", "--floor", "ground:10C",
            "--fluid-temp", "60C", "--ambient-temp", "5C", "--layer", "mineral wool:80mm")
    basis = _basis(run, *args)
    assert basis["tank floor"]["value"] == "on the ground, bare"
    assert basis["ground temperature beneath the tank"]["value"] == pytest.approx(10.0)
    # πD/(8k) of a disc on a half-space of moist sand, k = 1.5 W/(m·K) (tables/soils.csv)
    assert basis["floor-to-ground resistance"]["value"] == pytest.approx(math.pi * 3.0 / (8 * 1.5), rel=1e-9)
    assert basis["outer film length, shell"]["value"] == pytest.approx(5.0)
    code, out, err = run(*args, "--units", "us")
    assert code == 0, err
    table = out.split("Basis: assumptions")[1]
    assert "50.0" in table and "°F" in table and "h·ft²·°F/Btu" in table and "16.404" in table and "ft" in table
    assert "m²·K/W" not in table and "°C" not in table  # US words, no SI left in the table


def test_basis_in_html(run):
    code, out, err = run(*DUCT, "--format", "html")
    assert code == 0, err
    assert "Basis: assumptions" in out and "corners: mean perimeter of the insulation" in out
