"""The elastic critical moment of a case's member under its own major-axis moments (the spatial analysis).

Every case here is invented (demo data).  The closed forms use the section constants the tool computes
(``shape.torsion()``, ``shape.properties()``), so they check the analysis, not the section formulas.
"""

from __future__ import annotations

import math

import pytest

from fea.pipeline import parse_case, result_json, run_case, summary
from fea.sections.shapes import ISection

E, NU = 210e9, 0.3
G = E / (2 * (1 + NU))
L = 4.0

I_COLUMN = """
title = "I column with end moments (invented demo)"
[material]
E = "210 GPa"
fy = "355 MPa"
[[segment]]
length = "4 m"
section = {{ shape = "i_section", b = "150 mm", h = "300 mm", tf = "10.7 mm", tw = "7.1 mm", r = "0 mm" }}
[[restraint]]
at = "base"
lateral = "rigid"
[[restraint]]
at = "top"
lateral = "rigid"
[[load]]
at = "top"
axial = "100 kN"
{load}
[lateral]
{lateral}
"""

SECTION = ISection(b=0.150, h=0.300, tf=0.0107, tw=0.0071, r=0.0)


def mcr_uniform() -> float:
    """Timoshenko & Gere, Theory of Elastic Stability, 2nd ed., section 6.2 (from memory): a simply supported
    doubly symmetric I beam under uniform moment, M_cr = (pi/L) sqrt(E I_z G J (1 + pi^2 E I_w / (L^2 G J)))."""
    p, t = SECTION.properties(), SECTION.torsion()
    GJ = G * t.J
    return math.pi / L * math.sqrt(E * p.I_minor * GJ * (1 + math.pi**2 * E * t.I_w / (L**2 * GJ)))


def critical(text: str):
    res = run_case(parse_case(text))
    return res, res.extras["spatial"].critical_moment


def end_moments(top: float, base: float) -> str:
    rows = []
    for at, m in (("top", top), ("base", base)):
        if m:
            rows.append(f'[[lateral.moment]]\nat = "{at}"\nmoment = "{m} kN*m"\naxis = "major"')
    return "\n".join(rows)


def uniform_case() -> tuple:
    """Applied end moments of the sense that gives a uniform diagram (which sense does is the planar model's
    sign convention; the first-order diagram says)."""
    for base in (-50, 50):
        res, m = critical(I_COLUMN.format(load="", lateral=end_moments(50, base)))
        if m is not None and m.segments[0].M_max == pytest.approx(50e3, rel=1e-9):
            so = res  # the largest moment is the applied one: a uniform diagram (reverse curvature peaks at 50 too)
            if m.load_factor * 50e3 < 1.01 * mcr_uniform():
                return so, m
    raise AssertionError("no sense of the end moments gave a uniform moment")


def test_uniform_moment_equals_closed_form():
    _, m = uniform_case()
    assert m.kind == "lateral-torsional"
    assert m.senses == "as given"  # doubly symmetric: one sense is enough
    assert m.chords == 0  # the diagram is exactly linear
    assert m.converged
    assert m.segments[0].M_cr == pytest.approx(mcr_uniform(), rel=1e-6)


def test_end_moment_at_one_end_within_salvadori_band():
    # Salvadori's moment-gradient factor for psi = 0: C_b = 1.75 (AISC ASD 1989 F1.3, from memory), an
    # approximation at or a little below the exact value (up to about 7% in single curvature, from memory).
    _, m = critical(I_COLUMN.format(load="", lateral=end_moments(50, 0)))
    assert m.segments[0].M_max == pytest.approx(50e3, rel=1e-9)
    ratio = m.segments[0].M_cr / mcr_uniform() / 1.75
    assert 1.0 <= ratio <= 1.07


def test_eccentric_load_gives_its_moment():
    # a top load of 100 kN at 80 mm: a moment of 8 kN*m at the top of a pinned column, linear to zero at the base
    _, m = critical(I_COLUMN.format(load='eccentricity_major = "80 mm"', lateral=""))
    g = m.segments[0]
    assert g.M_max == pytest.approx(8e3, rel=1e-9)
    assert g.at == pytest.approx(L)
    _, m1 = critical(I_COLUMN.format(load="", lateral=end_moments(50, 0)))
    # M_cr is a property of the diagram's shape: the same triangle at another size gives the same M_cr
    assert g.M_cr == pytest.approx(m1.segments[0].M_cr, rel=1e-6)


def test_distributed_lateral_load_followed_by_chords():
    # simply supported I beam, uniformly distributed load at the shear centre: C_1 = 1.13 (ENV 1993-1-1:1992
    # Annex F Table F.1.2, from memory; the exact value is about 1.13 for a wide range of torsion parameters).
    q = '[[lateral.distributed]]\nfrom = "base"\nto = "top"\nper_length = "10 kN/m"\naxis = "major"'
    _, m = critical(I_COLUMN.format(load="", lateral=q))
    assert m.chords > 0
    g = m.segments[0]
    assert g.M_max == pytest.approx(10e3 * L**2 / 8, rel=1e-3)  # the chords' largest value, at mid-height
    assert g.M_cr / mcr_uniform() == pytest.approx(1.13, abs=0.02)


def test_outputs_carry_it_and_a_plain_column_has_none():
    res, m = uniform_case()
    js = result_json(res)["spatial"]["critical_moment"]
    assert js["segments"][0]["M_cr_Nm"] == pytest.approx(m.segments[0].M_cr)
    assert js["kind"] == "lateral-torsional"
    text = "\n".join(summary(res))
    assert "elastic critical moment" in text and "M_cr" in text
    plain = run_case(parse_case(I_COLUMN.format(load="", lateral="")))
    assert plain.extras["spatial"].critical_moment is None
    assert "critical_moment" not in result_json(plain)["spatial"]


def test_monosymmetric_section_takes_the_lower_sense():
    text = I_COLUMN.replace('shape = "i_section", b = "150 mm", h = "300 mm", tf = "10.7 mm", tw = "7.1 mm", '
                            'r = "0 mm"', 'shape = "tee", b = "150 mm", h = "150 mm", tf = "8 mm", tw = "6 mm", '
                            'r = "0 mm"')
    res, m = critical(text.format(load="", lateral=end_moments(5, 0)))
    assert m.senses == "the lower of the two senses"
    # reversing the moments gives the same (lower) M_cr: both senses were solved
    _, m2 = critical(text.format(load="", lateral=end_moments(-5, 0)))
    assert m2.segments[0].M_cr == pytest.approx(m.segments[0].M_cr, rel=1e-6)


def test_eccentricity_counted_once_with_both_tables():
    # [imperfection] and [lateral] both present: the eccentric load's moment is taken once, as the imperfect-column
    # analysis takes it (a regression: it was counted from both tables)
    text = I_COLUMN.format(load='eccentricity_major = "80 mm"', lateral="") + '\n[imperfection]\nbow = "L/1000"\n'
    _, m = critical(text)
    assert m.segments[0].M_max == pytest.approx(8e3, rel=1e-9)
