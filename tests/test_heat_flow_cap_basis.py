"""The heat-flow cap states a section's heat flow in the section's own basis (W/m of a run,
W/m² of a face, W of a vessel): a number never carries a unit it is not in.  Internal
consistency, no outside source: the stated figure is the solved heat flow re-read from JSON."""

import re

import pytest

VESSEL = ["--vessel", "vertical", "--diameter", "2m", "--length", "3m", "--heads", "2:1",
          "--fluid-temp", "80C", "--ambient-temp", "10C", "--material", "mineral wool", "--min-reduction", "90"]
FACE = ["--face", "vertical", "--height", "3m", "--fluid-temp", "80C", "--ambient-temp", "10C",
        "--material", "mineral wool", "--min-reduction", "90"]
STATED = re.compile(r"\|heat flow\| ([0-9.]+) (\S+), \d+ % under the cap of ([0-9.]+) (\S+)")


@pytest.mark.parametrize("args, unit", [(VESSEL, "W"), (FACE, "W/m²")])
def test_cap_states_the_sections_basis(run, args, unit):
    code, text, err = run("size", *args)
    assert code == 0, err
    stated = STATED.search(text)
    assert stated, text
    assert stated.group(2) == unit and stated.group(4) == unit


def test_pipe_cap_still_per_metre(run):
    code, text, err = run("size", "--pipe", "DN50", "--fluid-temp", "80C", "--ambient-temp", "10C",
                          "--material", "mineral wool", "--max-heat-flow", "30W/m")
    assert code == 0, err
    stated = STATED.search(text)
    assert stated and stated.group(2) == "W/m" and float(stated.group(3)) == 30.0
