"""Members the axial checks do not cover never "pass": single angles whose load path is not stated, and columns
that carry bending.  Every case here is invented (demo data)."""

from __future__ import annotations

import pytest

from fea.pipeline import parse_case, run_case
from tests.conftest import run_cli

ANGLE = """
title = "Single angle strut (invented demo)"
[material]
E = "200 GPa"
fy = "275 MPa"
[[segment]]
name = "diagonal"
length = "2.0 m"
section = {{ shape = "angle", b = "90 mm", d = "90 mm", t = "8 mm", r = "10 mm" }}
[[restraint]]
at = "base"
lateral = "rigid"
[[restraint]]
at = "top"
lateral = "rigid"
[[load]]
at = "top"
axial = "60 kN"
{load}
[design]
standard = "EN 1993-1-1"
curve = "b"
{angle}
"""


def design(text: str):
    return run_case(parse_case(text)).extras["design"]


def test_angle_without_its_load_path_is_not_verified():
    d = design(ANGLE.format(load="", angle=""))
    assert d.passed  # every axial check passes ...
    assert d.verdict == "not verified"  # ... but the load path of the angle is not stated
    assert any("single angle" in u and "angle_load" in u for u in d.unchecked)


def test_angle_through_one_leg_is_not_verified():
    d = design(ANGLE.format(load="", angle='angle_load = "one leg"'))
    assert d.verdict == "not verified"
    assert any("through one leg" in u and "BB.1.2" in u for u in d.unchecked)


def test_concentric_angle_passes_with_the_route_stated():
    d = design(ANGLE.format(load="", angle='angle_load = "concentric"'))
    assert d.verdict == "passes"
    assert any("loaded at its centroid" in n for n in d.notes)


def test_bad_angle_load_is_one_line(tmp_path):
    path = tmp_path / "bad.toml"
    path.write_text(ANGLE.format(load="", angle='angle_load = "both legs"'))
    r = run_cli("check", str(path))
    assert r.returncode == 2
    assert r.stderr.count("\n") == 1 and "design.angle_load" in r.stderr and "'both legs'" in r.stderr


@pytest.mark.parametrize("load, words", [
    ('eccentricity = "40 mm"', "moments from eccentric loads"),
    ('lateral = "1 kN"', "lateral point loads"),
])
def test_bending_is_never_passed_on_the_axial_check(load, words):
    d = design(ANGLE.format(load=load, angle='angle_load = "concentric"'))
    assert d.passed
    assert d.verdict == "not verified"
    assert any(words in u and "bending" in u for u in d.unchecked)


def test_zero_eccentricity_is_no_bending():
    d = design(ANGLE.format(load='eccentricity = "0 mm"', angle='angle_load = "concentric"'))
    assert d.verdict == "passes"


RHS = """
title = "Square hollow strut (invented demo)"
[material]
E = "210 GPa"
fy = "355 MPa"
[[segment]]
length = "2.0 m"
section = {{ shape = "rectangular_hollow", b = "300 mm", h = "300 mm", t = "{t}" }}
[[restraint]]
at = "base"
lateral = "rigid"
[[restraint]]
at = "top"
lateral = "rigid"
[[load]]
at = "top"
axial = "100 kN"
[design]
{design}
"""


@pytest.mark.parametrize("table, words", [
    ('standard = "EN 1993-1-1"\ncurve = "a"', "EN 1993-1-1 Table 5.2"),
    ('standard = "AISC 360"', "AISC 360 Table B4.1"),
    ('standard = "AS 4100"\nalpha_b = -0.5', "not AS 4100's own limits"),
])
def test_slender_walls_are_not_verified_on_the_gross_section(table, words):
    # a 300 x 3 mm square tube in S355: c/t = (300 - 9)/3 = 97 against the EN class 3 limit 42 epsilon = 34.2
    # (EN 1993-1-1 Table 5.2, internal part in compression, from memory) and the AISC slender limit
    # 1.40 sqrt(E/Fy) = 34.0 (AISC 360 Table B4.1a, from memory)
    d = design(RHS.format(t="3 mm", design=table))
    assert d.passed and d.verdict == "not verified"
    assert any("slender in compression" in u and words in u for u in d.unchecked)


def test_stocky_walls_pass():
    # 300 x 12.5 mm: c/t = (300 - 37.5)/12.5 = 21 < 33 epsilon = 26.9 (EN Table 5.2 class 1, from memory)
    d = design(RHS.format(t="12.5 mm", design='standard = "EN 1993-1-1"\ncurve = "a"'))
    assert d.verdict == "passes"
    assert not d.unchecked
