"""The thin-walled (spatial) analysis of a case: parsing of its keys, the pipeline entry, its outputs.

Every case here is invented (demo data).
"""

from __future__ import annotations

import math
from pathlib import Path

import pytest

from fea.errors import CaseError, UnitError
from fea.io.case import spatial_inputs
from fea.pipeline import parse_case, result_json, run_case, summary
from fea.solve.spatial_case import DEFAULT_NU, spatial_column

E = 210e9

#: The tee strut of issue 14: 150 x 150 x 8/6 tee (no fillets), 2.5 m, pinned with fork ends (invented case).
TEE = """
title = "Tee strut (invented demo)"
[material]
E = "210 GPa"
fy = "355 MPa"
{material}
[[segment]]
name = "strut"
length = "2.5 m"
section = {{ shape = "tee", b = "150 mm", h = "150 mm", tf = "8 mm", tw = "6 mm", r = "0 mm" }}
[[restraint]]
at = "base"
lateral = "rigid"
[[restraint]]
at = "top"
lateral = "rigid"
{restraint}
[[load]]
at = "top"
axial = "200 kN"
{design}
"""

EN_DESIGN = '[design]\nstandard = "EN 1993-1-1"\ncurve = "c"'

#: A doubly symmetric I column, pinned with fork ends (invented case).
I_COLUMN = """
title = "I column (invented demo)"
[material]
E = "210 GPa"
[[segment]]
length = "4 m"
section = { shape = "i_section", b = "150 mm", h = "300 mm", tf = "10.7 mm", tw = "7.1 mm", r = "15 mm" }
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


def _tee(material: str = "", restraint: str = "", design: str = "") -> str:
    return TEE.format(material=material, restraint=restraint, design=design)


def _hand_flexural_torsional(case) -> float:
    """Lowest root of (N - N_u)(N - N_T) i0^2 - N^2 z0^2 = 0 (Timoshenko & Gere, Theory of Elastic Stability,
    2nd ed., ch. 5, section symmetric about one axis, pinned and fork ends; from memory), from the section's own
    constants (shape.torsion() and properties(): not the issue's table values)."""
    info = case.segments[0]
    tc, pr = info.shape.torsion(), info.properties
    L, G = 2.5, E / (2 * (1 + DEFAULT_NU))
    assert tc.y0 == pytest.approx(0.0, abs=1e-12) and tc.z0 > 0  # symmetric about the minor axis: u couples
    N_u = math.pi**2 * E * pr["I_minor"] / L**2
    N_T = (G * tc.J + math.pi**2 * E * tc.I_w / L**2) / tc.i0**2
    a = 1 - tc.z0**2 / tc.i0**2
    b = -(N_u + N_T)
    c = N_u * N_T
    return (-b - math.sqrt(b * b - 4 * a * c)) / (2 * a)


def test_tee_strut_flexural_torsional_load_against_the_hand_quadratic():
    case = parse_case(_tee())
    res = run_case(case)
    sp = res.extras["spatial"]
    N_hand = _hand_flexural_torsional(case)
    # Timoshenko & Gere ch. 5 (from memory); the issue quotes about 489 kN for its section (its own table values)
    assert sp.load_factor * 200e3 == pytest.approx(N_hand, rel=0.02)
    assert 470e3 < N_hand < 500e3
    assert sp.kind == "flexural-torsional" and sp.governs
    data = result_json(res)["spatial"]
    assert data["covered"] and data["converged"] and data["governs"]
    assert data["segments"][0]["N_cr_N"] == pytest.approx(sp.load_factor * 200e3, rel=1e-9)
    assert len(data["estimated_errors"]) == len(data["load_factors"]) == len(data["kinds"])
    lines = summary(res)
    assert any(line.strip().startswith("flexural-torsional buckling governs: load factor") and "in plane" in line
               for line in lines)


def test_doubly_symmetric_i_column_equals_the_minor_axis_planar_load_factor():
    res = run_case(parse_case(I_COLUMN))
    sp = res.extras["spatial"]
    minor = next(r for r in res.buckling if r.axis == "minor")
    # doubly symmetric, fork ends: flexural and torsional modes uncouple (Timoshenko & Gere ch. 5, from memory)
    assert sp.load_factor == pytest.approx(minor.load_factor, rel=1e-6)
    assert sp.kind == "flexural (minor axis)" and not sp.governs


def test_twist_warping_offset_and_shear_modulus_reach_the_spatial_column():
    restraint = ('[[restraint]]\nat = "1.25 m"\naxis = "minor"\nlateral = "rigid"\noffset = "-150 mm"\n'
                 '[[restraint]]\nat = "base"\ntwist = "50 kN*m/rad"\nwarping = "fixed"')
    case = parse_case(_tee(material='G = "80 GPa"', restraint=restraint))
    inputs = spatial_inputs(case)
    assert inputs.G == 80e9
    tors = {t.table: t for t in inputs.restraints}
    assert tors["restraint[3]"].offset == pytest.approx(-0.15) and tors["restraint[3]"].axes == ("minor",)
    assert tors["restraint[4]"].twist == pytest.approx(50e3) and tors["restraint[4]"].warping
    col = spatial_column(case, inputs)
    assert all(s.G == 80e9 for s in col.segments)
    (o,) = col.offset_restraints
    assert (o.ey, o.ez, o.reference, math.isinf(o.u), o.v) == (0.0, -0.15, "centroid", True, 0.0)
    # the base gives its own twist: no default fork there; the top keeps its default fork (twist rigid)
    base = [r for r in col.restraints if r.at == 0.0]
    assert not any(math.isinf(r.twist) for r in base) and any(r.twist == 50e3 and r.warping for r in base)
    assert any(r.at == 2.5 and math.isinf(r.twist) for r in col.restraints)
    # the planar analysis ignores these keys
    plain = run_case(parse_case(_tee(restraint='[[restraint]]\nat = "1.25 m"\naxis = "minor"\nlateral = "rigid"')),
                     skip=("spatial",))
    keyed = run_case(case, skip=("spatial",))
    assert [r.load_factor for r in plain.buckling] == [r.load_factor for r in keyed.buckling]


def test_nu_gives_the_shear_modulus():
    case = parse_case(_tee(material="nu = 0.25"))
    col = spatial_column(case, spatial_inputs(case))
    assert col.segments[0].G == pytest.approx(E / 2.5)  # G = E / (2 (1 + nu)), common practice for steel


@pytest.mark.parametrize("material, restraint, field", [
    ('G = "80 GPa"\nnu = 0.3', "", "material.nu"),
    ("nu = 0.6", "", "material.nu"),
    ('G = "-1 GPa"', "", "material.G"),
    ("", '[[restraint]]\nat = "1 m"\ntwist = "springy"', "restraint[3].twist"),
    ("", '[[restraint]]\nat = "1 m"\ntwist = "rigid"\nwarping = "held"', "restraint[3].warping"),
    ("", '[[restraint]]\nat = "1 m"\nlateral = "rigid"\noffset = "150 mm"', "restraint[3].offset"),
    ("", '[[restraint]]\nat = "1 m"\naxis = "minor"\noffset = "150 mm"\nrotation = "1 kN*m/rad"',
     "restraint[3].offset"),
    ("", '[[restraint]]\nat = "1 m"\naxis = "minor"\nlateral = "rigid"\noffset = "150 kN"', "restraint[3].offset"),
])
def test_bad_spatial_keys_give_one_line_errors(material, restraint, field):
    with pytest.raises((CaseError, UnitError)) as err:
        parse_case(_tee(material=material, restraint=restraint))
    assert err.value.field == field
    assert "\n" not in str(err.value)


def test_a_twist_only_restraint_is_read_by_the_spatial_analysis_alone():
    case = parse_case(_tee(restraint='[[restraint]]\nat = "1.25 m"\ntwist = "rigid"'))
    assert case.origins["restraint[3]"] == ()
    assert all(len(col.restraints) == 2 for _, col in case.planes)
    plain = run_case(parse_case(_tee()))
    held = run_case(case)
    assert held.extras["spatial"].load_factor > plain.extras["spatial"].load_factor


def test_cases_the_spatial_analysis_does_not_cover_get_a_note():
    text = _tee() + '[[distributed_load]]\naxial = "1 kN/m"\n'
    res = run_case(parse_case(text))
    sp = res.extras["spatial"]
    assert not sp.ran and sp.note.startswith("not covered: distributed axial loads")
    data = result_json(res)["spatial"]
    assert data["covered"] is False and data["load_factors"] == []
    assert any("not covered" in line for line in summary(res))


def test_no_spatial_part_without_sections_or_with_one_plane():
    no_section = I_COLUMN.replace('section = { shape = "i_section", b = "150 mm", h = "300 mm", tf = "10.7 mm", '
                                  'tw = "7.1 mm", r = "15 mm" }', 'I_major = "8e7 mm^4"\nI_minor = "6e6 mm^4"')
    assert "spatial" not in run_case(parse_case(no_section)).extras


def test_spatial_load_factor_below_one_is_a_run_warning():
    from fea.io.run_warnings import run_notices

    res = run_case(parse_case(_tee().replace('axial = "200 kN"', 'axial = "600 kN"')))
    notes = [n for n in run_notices(res) if n.key == "buckles-under-case-loads"]
    assert [n.axis for n in notes] == ["spatial"]


def test_design_of_a_tee_checks_its_flexural_torsional_critical_force():
    res = run_case(parse_case(_tee(design=EN_DESIGN)))
    sp, design = res.extras["spatial"], res.extras["design"]
    (tors,) = [c for c in design.checks if c.axis == "torsional"]
    planar = [c for c in design.checks if c.axis in ("major", "minor")]
    # the flexural-torsional N_cr of the thin-walled analysis, below both planar ones, is the one checked
    assert tors.N_cr == pytest.approx(sp.load_factor * 200e3, rel=1e-9)
    assert tors.N_cr < min(c.N_cr for c in planar)
    # EN 1993-1-1 6.3.1.4 (from memory): lambda_T = sqrt(A fy / N_cr,TF), curve of the z-z axis (here c for both)
    A = res.case.segments[0].A
    assert tors.slenderness == pytest.approx(math.sqrt(A * 355e6 / tors.N_cr), rel=1e-12)
    assert tors.clause.startswith("EN 1993-1-1 6.3.1.4") and "6.3.1.4" in tors.note
    assert design.governing is tors and tors.utilisation > max(c.utilisation for c in planar)
    assert design.unchecked == () and design.verdict in ("passes", "fails")
    data = result_json(res)["design"]
    assert any(c["axis"] == "torsional" for c in data["checks"])


def test_design_of_a_tee_by_aisc_uses_e4_with_the_analysis_force():
    design = run_case(parse_case(_tee(design='[design]\nstandard = "AISC 360"'))).extras["design"]
    (tors,) = [c for c in design.checks if c.axis == "torsional"]
    # AISC 360 E4 (from memory): Fe = N_cr / A from the analysis, then the Fcr formula of E3
    assert tors.clause.startswith("AISC 360 E4") and tors.details["Fe_Pa"] == pytest.approx(
        tors.N_cr / parse_case(_tee()).segments[0].A, rel=1e-12)
    assert design.unchecked == ()


def test_a_tee_stays_unchecked_where_the_spatial_analysis_does_not_run():
    text = _tee(design=EN_DESIGN) + '[[distributed_load]]\naxial = "1 kN/m"\n'
    design = run_case(parse_case(text)).extras["design"]
    assert not any(c.axis == "torsional" for c in design.checks)
    assert len(design.unchecked) == 1 and design.verdict != "passes"


def test_report_of_the_tee_shows_the_spatial_section_with_every_number_sourced():
    from fea.pipeline import REPORT_PARTS
    from fea.report import build_report
    from tests.test_report import DATE, check_numbers, parse_page

    case = parse_case(_tee(design=EN_DESIGN))
    res = run_case(case)
    data = result_json(res)
    html = build_report(res, data, {}, parts=REPORT_PARTS, date=DATE)
    assert check_numbers(html, case, data) > 0
    page = parse_page(html)
    assert "Thin-walled buckling" in [t for h, t in page.headings if h == "h3"]


# -- the two demo cases of issue 14 (invented scenarios) -----------------------------------------------------

def _demo(name: str):
    from pathlib import Path

    from fea.pipeline import load_case, run_case

    return run_case(load_case(str(Path(__file__).resolve().parents[1] / "cases" / name)))


def test_demo_tee_chord_is_governed_by_flexural_torsional_buckling():
    """EN 1993-1-1 6.3.1.4: the tee's design check uses the flexural-torsional critical force."""
    res = _demo("tee_chord_strut.toml")
    d = res.extras["design"]
    assert d.governing.axis == "torsional" and not d.unchecked
    assert d.governing.N_cr < min(c.N_cr for c in d.checks if c.axis in ("major", "minor"))


def test_demo_girt_column_checks_buckling_about_the_girt_line():
    """Girts on the outer flange: the I column twists about the girt line (restrained-axis buckling) far below
    its planar minor-axis load, and the design check takes that mode (EN 1993-1-1 6.3.1.4)."""
    res = _demo("girt_wall_column.toml")
    d = res.extras["design"]
    tors = [c for c in d.checks if c.axis == "torsional"]
    minor = [c for c in d.checks if c.axis == "minor"]
    assert len(tors) == 1 and tors[0].N_cr < 0.5 * minor[0].N_cr
    assert d.governing is tors[0] and tors[0].utilisation > 2 * minor[0].utilisation


def test_spatial_mode_figure_draws_both_displacements_and_the_twist(tmp_path):
    """`--plot` writes the thin-walled modes: three panels (u, v, twist), one curve per mode in each."""
    from fea.cli import main

    out = tmp_path / "chord.png"
    assert main(["check", str(Path(__file__).resolve().parents[1] / "cases" / "tee_chord_strut.toml"),
                 "--plot", str(out)]) == 0
    assert (tmp_path / "chord-spatial.png").stat().st_size > 0
    from fea.pipeline import load_case, run_case
    from fea.plot.spatial import plot_spatial_modes

    res = run_case(load_case(str(Path(__file__).resolve().parents[1] / "cases" / "tee_chord_strut.toml")))
    fig = plot_spatial_modes(res.extras["spatial"])
    assert [ax.get_title() for ax in fig.axes] == ["u: lateral, along the major axis",
                                                   "v: lateral, along the minor axis", "twist x i_0"]
    assert all(len(ax.lines) == 3 + 1 for ax in fig.axes)  # three modes and the axis line


def test_offset_restraint_without_the_thin_walled_analysis_is_not_verified():
    """Girts on the outer flange, but a distributed axial load the thin-walled analysis does not cover: the
    restrained-axis mode is unchecked, so the member is not verified (never "passes" on what was not checked)."""
    from fea.pipeline import parse_case, run_case

    text = (Path(__file__).resolve().parents[1] / "cases" / "girt_wall_column.toml").read_text(encoding="utf-8")
    text += '\n[[distributed_load]]\nfrom = "base"\nto = "top"\naxial = "0.5 kN/m"\n'
    res = run_case(parse_case(text))
    d = res.extras["design"]
    assert d.passed and d.verdict == "not verified"
    assert any("restraint[3]" in u and "restrained-axis" in u for u in d.unchecked)
    assert not any(c.axis == "torsional" for c in d.checks)
