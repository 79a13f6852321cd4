"""Design checks end to end: case file -> finite-element N_cr -> published column curve -> JSON / CLI.

Issue 5.  Sources are named beside every check against something outside the
project; the case data are invented for the tests.
"""

from __future__ import annotations

import json
import math
from pathlib import Path

import pytest

from fea.errors import CaseError, UnitError
from fea.pipeline import parse_case, run_case
from fea.pipeline import result_json as result_dict
from fea.pipeline import summary as summary_lines
from fea.sections import Angle
from tests.conftest import Run, run_cli

rel = pytest.approx
CASES = Path(__file__).resolve().parent.parent / "cases"

STEPPED = """
title = "stepped test column (invented)"
[material]
E = "210 GPa"
fy = "355 MPa"
fu = "490 MPa"
[[segment]]
name = "lower"
length = "5.0 m"
section = {{ shape = "i", b = "240 mm", h = "240 mm", tf = "15 mm", tw = "10 mm", r = "20 mm" }}
[[segment]]
name = "upper"
length = "3.0 m"
section = {{ shape = "i", b = "160 mm", h = "160 mm", tf = "11 mm", tw = "7.5 mm", r = "14 mm" }}
[[restraint]]
at = "base"
lateral = "rigid"
rotation = "10 MN*m/rad"
[[restraint]]
at = "top"
lateral = "rigid"
[[load]]
at = "top"
axial = "{top}"
[[load]]
at = "5.0 m"
axial = "{step}"
{design}
"""

EN_DESIGN = """
[design]
standard = "EN 1993-1-1"
curve_major = "b"
curve_minor = "c"
"""


def stepped(design: str = EN_DESIGN, top: str = "300 kN", step: str = "800 kN") -> str:
    return STEPPED.format(design=design, top=top, step=step)


def checks_by(res, kind="compression"):
    return {(c.segment, c.axis): c for c in res.extras["design"].checks if c.kind == kind}


# ---------------------------------------------------------------------------
# sections in the analysis


def test_angle_buckles_about_minor_principal_axis():
    # An unequal angle pinned at both ends about both planes: the analysis must
    # use the principal second moments, and the member buckles about the minor
    # principal axis, below both geometric-axis values.
    text = """
    [material]
    E = "200 GPa"
    [[segment]]
    length = "2.0 m"
    section = { shape = "angle", b = "150 mm", d = "90 mm", t = "10 mm", r = "12 mm" }
    [[restraint]]
    at = "base"
    lateral = "rigid"
    [[restraint]]
    at = "top"
    lateral = "rigid"
    [[load]]
    at = "top"
    axial = "100 kN"
    """
    res = run_case(parse_case(text))
    p = Angle(0.150, 0.090, 0.010, 0.012).properties()
    assert p.I_minor < min(p.I_yy, p.I_zz) and p.I_major > max(p.I_yy, p.I_zz)
    assert res.governing_axis == "minor"
    # Euler, pinned-pinned: P_cr = pi^2 E I / L^2 (Timoshenko & Gere, Theory of Elastic Stability, eq. 2-3)
    for axis, I in (("minor", p.I_minor), ("major", p.I_major)):
        P_cr = math.pi**2 * 200e9 * I / 2.0**2
        assert res.plane(axis).load_factor == rel(P_cr / 100e3, rel=1e-5)


def test_section_table_errors_name_the_key():
    base = """
    [[segment]]
    length = "2 m"
    E = "200 GPa"
    section = {section}
    [[restraint]]
    at = "base"
    lateral = "rigid"
    [[restraint]]
    at = "top"
    lateral = "rigid"
    [[load]]
    at = "top"
    axial = "1 kN"
    """
    with pytest.raises(CaseError, match=r"segment\[1\]\.section\.shape: 'hexagon' is not a known shape"):
        parse_case(base.format(section='{ shape = "hexagon", b = "1 m" }'))
    with pytest.raises(CaseError, match=r"segment\[1\]\.section\.tw: missing"):
        parse_case(base.format(section='{ shape = "i", b = "100 mm", h = "200 mm", tf = "10 mm" }'))
    with pytest.raises(CaseError, match=r"segment\[1\]\.section\.tff: unknown dimension; did you mean `tf`"):
        parse_case(base.format(section='{ shape = "i", b = "100 mm", h = "200 mm", tff = "10 mm", tw = "6 mm" }'))
    with pytest.raises(UnitError, match=r"segment\[1\]\.section\.b: 100 has no unit"):
        parse_case(base.format(section='{ shape = "rectangle", b = 100, h = "200 mm" }'))


# ---------------------------------------------------------------------------
# EN 1993-1-1 end to end


def test_stepped_column_en1993_against_hand_calculation():
    case = parse_case(stepped())
    res = run_case(case)
    d = res.extras["design"]
    ch = checks_by(res)
    fy = 355e6
    # Area of an I section with four root fillets: 2 b tf + (h - 2 tf) tw + (4 - pi) r^2
    # (rectangles plus the four fillet spandrels r^2 - pi r^2 / 4; plane geometry)
    A = {0: 2 * 0.240 * 0.015 + (0.240 - 0.030) * 0.010 + (4 - math.pi) * 0.020**2,   # 9643.4 mm^2
         1: 2 * 0.160 * 0.011 + (0.160 - 0.022) * 0.0075 + (4 - math.pi) * 0.014**2}  # 4723.3 mm^2
    assert A[0] == rel(9643.36e-6, rel=1e-5)
    N_Ed = {0: 1100e3, 1: 300e3}  # loads carried down: 300 + 800 kN below the step
    alpha = {"major": 0.34, "minor": 0.49}  # EN 1993-1-1 Table 6.1, curves b and c
    for seg in (0, 1):
        for axis in ("major", "minor"):
            c = ch[(seg, axis)]
            # N_cr is the model's: the segment's force at the lowest critical state of that plane
            N_cr = res.plane(axis).segments[seg].critical_axial_force
            assert c.N_cr == N_cr
            # EN 1993-1-1 6.3.1.2(1): lambda_bar = sqrt(A fy / N_cr)
            lam = math.sqrt(A[seg] * fy / N_cr)
            # Phi = 0.5 [1 + alpha (lambda_bar - 0.2) + lambda_bar^2]   (6.49)
            Phi = 0.5 * (1 + alpha[axis] * (lam - 0.2) + lam**2)
            # chi = 1 / (Phi + sqrt(Phi^2 - lambda_bar^2)) <= 1         (6.49)
            chi = min(1.0, 1 / (Phi + math.sqrt(Phi**2 - lam**2)))
            # N_b,Rd = chi A fy / gamma_M1, gamma_M1 = 1.0               (6.47)
            N_b = chi * A[seg] * fy / 1.0
            assert c.slenderness == rel(lam, rel=1e-9)
            assert c.reduction == rel(chi, rel=1e-9)
            assert c.resistance == rel(N_b, rel=1e-9)
            assert c.N_Ed == rel(N_Ed[seg], rel=1e-12)
            assert c.utilisation == rel(N_Ed[seg] / N_b, rel=1e-9)
            assert c.clause.startswith("EN 1993-1-1 6.3.1")
    # the same plane's load factor links the two segments' N_cr
    lf = res.plane("minor").load_factor
    assert ch[(0, "minor")].N_cr == rel(lf * 1100e3, rel=1e-12)
    assert ch[(1, "minor")].N_cr == rel(lf * 300e3, rel=1e-12)
    gov = max(ch.values(), key=lambda c: c.utilisation)
    assert d.governing is gov and d.passed == (gov.utilisation <= 1)
    # the partly fixed base lies between a pinned and a fixed base (stiffening never lowers
    # the critical load), so its fixity flows into N_cr and the design resistance
    text = stepped()
    pinned = run_case(parse_case(text.replace('rotation = "10 MN*m/rad"', "")), skip=("design",))
    fixed = run_case(parse_case(text.replace('"10 MN*m/rad"', '"rigid"')), skip=("design",))
    assert pinned.plane("minor").load_factor < lf < fixed.plane("minor").load_factor


def test_load_factor_and_segment_override():
    design = EN_DESIGN + 'load_factor = 1.5\n[[design.segment]]\nsegment = "upper"\ncurve_minor = "d"\n'
    res = run_case(parse_case(stepped(design)))
    ch = checks_by(res)
    assert ch[(0, "minor")].N_Ed == rel(1.5 * 1100e3) and ch[(1, "major")].N_Ed == rel(1.5 * 300e3)
    assert "curve d" in ch[(1, "minor")].parameter and "curve c" in ch[(0, "minor")].parameter
    assert "curve b" in ch[(1, "major")].parameter
    assert "x 1.5" in res.extras["design"].notes[0]


def test_meaningless_k_still_gets_a_resistance_from_n_cr():
    # The upper segment carries 1 % of the lower one's force: its K is flagged,
    # but its N_cr (lowest load factor x its force) still gives a resistance.
    res = run_case(parse_case(stepped(top="10 kN", step="990 kN")))
    seg = res.plane("minor").segments[1]
    assert not seg.meaningful
    c = checks_by(res)[(1, "minor")]
    assert "K not meaningful" in c.note and "N_cr" in c.note
    assert c.N_cr == rel(seg.critical_axial_force) and math.isfinite(c.resistance) and c.resistance > 0


def test_tension_segment_gross_and_net():
    # Uplift at the top puts the upper segment in tension (-60 kN); the lower one is in compression.
    design = EN_DESIGN + '[[design.segment]]\nsegment = 2\nA_net = "3800 mm^2"\n'
    res = run_case(parse_case(stepped(design, top="-60 kN", step="900 kN")))
    t = checks_by(res, "tension")[(1, "-")]
    A_up = 2 * 0.160 * 0.011 + (0.160 - 0.022) * 0.0075 + (4 - math.pi) * 0.014**2
    # EN 1993-1-1 6.2.3(2): N_pl,Rd = A fy / gamma_M0 (6.6), N_u,Rd = 0.9 A_net fu / gamma_M2 (6.7),
    # gamma_M0 = 1.0, gamma_M2 = 1.25 (recommended values, 6.1 NOTE 2B)
    N_pl = A_up * 355e6 / 1.0
    N_u = 0.9 * 3800e-6 * 490e6 / 1.25
    assert t.resistance == rel(min(N_pl, N_u), rel=1e-12) and t.governs == "net"
    assert t.N_Ed == rel(60e3) and t.utilisation == rel(60e3 / N_u)
    assert (1, "minor") not in checks_by(res)  # no compression check for a pulled segment


# ---------------------------------------------------------------------------
# other methods through the case file


def test_rankine_gordon_pinned_strut():
    # Rankine-Gordon sigma = fc / (1 + a (L/r)^2), a = 1/7500 for mild steel with
    # pinned ends (common practice).  For a pinned uniform strut the model's N_cr is
    # Euler's load, so the equivalent slenderness is the geometric L/r.
    text = """
    [material]
    E = "200 GPa"
    fy = "250 MPa"
    [[segment]]
    length = "3.0 m"
    section = { shape = "round", d = "80 mm" }
    [[restraint]]
    at = "base"
    lateral = "rigid"
    [[restraint]]
    at = "top"
    lateral = "rigid"
    [[load]]
    at = "top"
    axial = "150 kN"
    [design]
    standard = "Rankine-Gordon"
    a = "1/7500"
    crushing_stress = "320 MPa"
    """
    res = run_case(parse_case(text))
    c = checks_by(res)[(0, "major")]
    A = math.pi * 0.08**2 / 4
    r = 0.08 / 4  # radius of gyration of a solid round d/4 (plane geometry)
    L_r = 3.0 / r  # 150
    assert c.slenderness == rel(L_r, rel=1e-5)
    assert c.resistance == rel(320e6 * A / (1 + L_r**2 / 7500), rel=1e-5)


def test_working_stress_material_limit_governs_timber_demo():
    # Working-stress rule: allowable = min(sigma_allow, sigma_cr / FoS) (common practice)
    res = run_case(parse_case((CASES / "timber_post_working_stress.toml").read_text()))
    c = checks_by(res)[(0, "major")]
    A = 0.15 * 0.15
    sigma_cr = c.N_cr / A
    assert sigma_cr / 3.0 > 7e6  # buckling allowance exceeds the material's
    assert c.governs == "material" and c.resistance == rel(7e6 * A, rel=1e-12)
    assert c.utilisation == rel(120e3 / (7e6 * A), rel=1e-12)
    assert res.extras["design"].passed


def test_working_stress_buckling_governs_when_slender():
    text = (CASES / "timber_post_working_stress.toml").read_text().replace('length = "2.4 m"', 'length = "6.0 m"')
    c = checks_by(run_case(parse_case(text)))[(0, "major")]
    # pinned, Euler: N_cr = pi^2 E I / L^2 (Timoshenko & Gere eq. 2-3); allowable = N_cr / FoS
    N_cr = math.pi**2 * 11e9 * 0.15**4 / 12 / 6.0**2
    assert c.governs == "buckling" and c.resistance == rel(N_cr / 3.0, rel=1e-5)


@pytest.mark.parametrize("design, clause", [
    ('standard = "AISC 360"\nmethod = "ASD"', "AISC 360 E3"),
    ('standard = "AS 4100"\nalpha_b_major = 0\nalpha_b_minor = 0.5\nkf = 1.0', "AS 4100 6.3.3"),
    ('standard = "BS 5950-1"\ncurve_major = "b"\ncurve_minor = "c"', "BS 5950-1:2000 Annex C"),
    ('standard = "Perry-Robertson"', "Perry-Robertson"),
])
def test_every_standard_runs_and_caps_at_material(design, clause):
    res = run_case(parse_case(stepped("[design]\n" + design)))
    for c in checks_by(res).values():
        assert c.clause.startswith(clause)
        assert 0 < c.reduction <= 1
        assert c.resistance <= 355e6 * (0.0096434 if c.segment == 0 else 0.0047233) * 1.0001


def test_aisc_asd_is_nominal_over_omega():
    # AISC 360 E1: allowable strength Pn / Omega_c, Omega_c = 1.67
    res = run_case(parse_case(stepped('[design]\nstandard = "AISC 360"\nmethod = "ASD"')))
    for c in checks_by(res).values():
        assert c.resistance == rel(c.details["Pn_N"] / 1.67, rel=1e-12)


# ---------------------------------------------------------------------------
# [design] input errors


@pytest.mark.parametrize("design, message", [
    ('standard = "EN 1993"', r"design\.standard: 'EN 1993' is not a known standard; did you mean 'EN 1993-1-1'"),
    ('standard = "EN 1993-1-1"', r"design\.curve: missing: EN 1993-1-1 needs curve \(or curve_major and curve_minor\)"),
    ('standard = "EN 1993-1-1"\ncurve = "e"', r"design\.curve: 'e' is not a EN 1993-1-1 buckling curve"),
    ('standard = "EN 1993-1-1"\ncurve = "b"\ngama_M1 = 1.1', r"design\.gama_M1: unknown key; did you mean `gamma_M1`"),
    ('standard = "AS 4100"\nalpha_b = 0.25', r"design\.alpha_b: 0.25 is not an AS 4100 member section constant"),
    ('standard = "working-stress"\nfactor_of_safety = 2.5', r"material\.sigma_allow: missing"),
    ('standard = "working-stress"\nfactor_of_safety = 0.5\nsigma_allow = "5 MPa"', r"design\.factor_of_safety: 0.5 is out of range"),  # noqa: E501 - one row of a table
    ('standard = "AISC 360"\nmethod = "LSD"', r"design\.method: expected 'LRFD' or 'ASD'"),
    ('standard = "BS 5950-1"\ncurve = "b"\n[[design.segment]]\nsegment = "middle"', r"design\.segment\[1\]\.segment: 'middle' names no segment"),  # noqa: E501 - one row of a table
])
def test_design_input_errors(design, message):
    with pytest.raises(CaseError, match=message):
        parse_case(stepped("[design]\n" + design))


# ---------------------------------------------------------------------------
# JSON, summary, CLI


def test_json_design_part_and_summary():
    res = run_case(parse_case(stepped()))
    out = result_dict(res)["design"]
    assert out["standard"] == "EN 1993-1-1" and out["passed"] is True
    assert len(out["checks"]) == 4 and out["governing"]["utilisation"] == out["max_utilisation"]
    c = out["checks"][0]
    for key in ("segment", "axis", "standard", "clause", "parameter", "slenderness", "reduction_factor",
                "N_cr_N", "resistance_N", "utilisation", "k_meaningful", "note"):
        assert key in c
    assert "licensed engineer" in out["caution"]
    json.dumps(out, allow_nan=False)
    text = "\n".join(summary_lines(res))
    assert "Design check: EN 1993-1-1" in text and "PASSES" in text


def _cli(*args: str) -> Run:
    # the command in this interpreter through fea.cli.main (tests/conftest.py), in the current folder
    return run_cli(*args, cwd=Path.cwd())


def test_cli_exit_status_pass_fail_and_bad_input(tmp_path):
    ok = _cli("check", str(CASES / "design_hall_column.toml"))
    assert ok.returncode == 0, ok.stderr
    assert "PASSES" in ok.stdout
    bad = _cli("check", str(CASES / "design_overloaded_prop.toml"), "--json")
    assert bad.returncode == 1, bad.stderr
    out = json.loads(bad.stdout)
    assert out["design"]["passed"] is False and out["design"]["max_utilisation"] > 1
    f = tmp_path / "bad.toml"
    f.write_text(stepped('[design]\nstandard = "EN 1993-1-1"\ncurve_major = "b"\ncurve_minor = "z"'))
    err = _cli("check", str(f))
    assert err.returncode == 2
    assert err.stdout == ""
    lines = err.stderr.strip().splitlines()
    assert len(lines) == 1 and "design.curve_minor: 'z' is not a EN 1993-1-1 buckling curve" in lines[0]


def test_segment_forces_count_a_load_at_the_segment_top_below_it():
    # Regression: a load exactly at a segment's top acts on that segment (axial load is carried down);
    # uplift at the top of a column compressed by a larger load at the step gives the lower segment
    # compression only, the upper segment tension only.
    from fea import RIGID, Column, PointLoad, Restraint, Segment
    from fea.design.member import segment_forces

    col = Column(segments=(Segment(3.0, 210e9, 1e-5), Segment(2.0, 210e9, 1e-5)),
                 restraints=(Restraint(0.0, RIGID, RIGID), Restraint(5.0, RIGID)),
                 point_loads=(PointLoad(5.0, -60e3), PointLoad(3.0, 900e3)))
    low, up = segment_forces(col)
    assert low.compression == pytest.approx(840e3) and low.tension == 0.0
    assert up.tension == pytest.approx(60e3) and up.compression == 0.0
