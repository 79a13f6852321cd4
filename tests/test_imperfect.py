"""Nonlinear (co-rotational, fibre) analysis of imperfect columns through the Column model, and the case files.

Sections and columns are invented test data unless a source is named.
"""

from __future__ import annotations

import json
import math
from dataclasses import replace
from pathlib import Path

import numpy as np
import pytest
from scipy.special import ellipk

import fea.solve.imperfect_case as imp_case
from fea import RIGID, Column, PointLoad, Restraint, Segment
from fea.errors import CaseError, ModelError, UnitError
from fea.io.imperfect_output import imperfect_json, imperfect_summary
from fea.model.imperfection import Imperfection, SegmentSection
from fea.pipeline import load_case, parse_case
from fea.sections import ISection, Rectangle
from fea.solve.imperfect import analyse_imperfect, nonlinear_path, perry_first_yield

E_STEEL = 210e9  # EN 1993-1-1 clause 3.2.6(1)
FY = 355e6  # EN 1993-1-1 Table 3.1, S355, t <= 40 mm
CASES = Path(__file__).resolve().parents[1] / "cases"

# Invented rolled-I-like section: h = 320 mm, b = 160 mm, tf = 11 mm, tw = 7.5 mm, r = 15 mm.  h/b = 2.0 > 1.2
# and tf <= 40 mm, so EN 1993-1-1 Table 6.2 (rolled I sections) assigns buckling curve b to the minor axis z-z
# (imperfection factor alpha = 0.34, EN 1993-1-1 Table 6.1).
I_SHAPE = ISection(b=0.160, h=0.320, tf=0.011, tw=0.0075, r=0.015)
ALPHA_B = 0.34


def chi_en1993(lam_bar: float, alpha: float) -> float:
    """EN 1993-1-1 clause 6.3.1.2, equation (6.49) with Phi = 0.5 [1 + alpha (lam - 0.2) + lam^2]."""
    phi = 0.5 * (1 + alpha * (lam_bar - 0.2) + lam_bar**2)
    return min(1.0, 1.0 / (phi + math.sqrt(phi**2 - lam_bar**2)))


def pinned(L, I, P, A=None) -> Column:
    return Column(segments=(Segment(L, E_STEEL, I, A=A),), restraints=(Restraint(0.0, RIGID), Restraint(L, RIGID)),
                  point_loads=(PointLoad(L, P),))


def fibre_column(section: SegmentSection, lam_bar: float) -> Column:
    """Pin-ended column of relative slenderness ``lam_bar`` for the fibre model's own A and I, loaded by A fy."""
    I = float(np.sum(section.fibre_area * section.fibre_y**2))
    # lambda_bar = sqrt(A fy / N_cr), N_cr = pi^2 E I / L^2 (EN 1993-1-1 eq. (6.50))
    L = math.pi * lam_bar * math.sqrt(E_STEEL * I / (section.A * FY))
    return pinned(L, I, section.A * FY, A=section.A)


# ----------------------------------------------------------------------------- elastica
def test_elastica_through_the_column_model():
    L, EI = 1.0, 1.0
    col = Column(segments=(Segment(L, 1.0, EI, A=1e7),), restraints=(Restraint(0.0, RIGID), Restraint(L, RIGID)),
                 point_loads=(PointLoad(L, math.pi**2 * EI / L**2),))  # EA / P_cr ~ 1e6: practically inextensible
    p = nonlinear_path(col, Imperfection("half-sine", amplitude=1e-6 * L), [SegmentSection(A=1e7)], min_elements=20,
                       rotation_limit=math.radians(65), max_steps=300, drop_fraction=None, initial_step=0.1)
    assert p.success and p.status == "displacement_limit", p.message
    alpha = np.abs(p.rotation[:, 0])  # end slope at the base
    assert alpha.max() >= math.radians(60)
    sel = alpha >= math.radians(5)
    # Timoshenko & Gere, Theory of Elastic Stability, section 2.7: P / P_cr = (2 K(p) / pi)^2, p = sin(alpha/2);
    # scipy's ellipk takes the parameter m = p^2
    ref = (2 * ellipk(np.sin(alpha[sel] / 2) ** 2) / math.pi) ** 2
    err = np.abs(p.load_factors[sel] / ref - 1)
    assert err.max() < 1e-3, err.max()


# ----------------------------------------------------------------------------- squash load
def test_short_column_reaches_squash_load():
    sec = SegmentSection.from_shape(Rectangle(b=0.1, h=0.1), "minor", FY, n_fibres=20)
    col = fibre_column(sec, 0.1)
    p = nonlinear_path(col, Imperfection("half-sine", ratio=1000), [sec], min_elements=8)
    assert p.success, p.message
    # squash load N_pl = A fy (EN 1993-1-1 eq. (6.10)); the reference load is A fy, so the factor tends to 1
    assert p.limit_load_factor == pytest.approx(1.0, rel=0.01)
    assert p.limit_load_factor <= 1.0 + 1e-9
    assert p.first_yield_load_factor < p.limit_load_factor


# ----------------------------------------------------------------------------- ultimate load vs EN 1993-1-1
@pytest.mark.parametrize("lam_bar", [0.5, 1.0, 1.5], ids=lambda v: f"lambda_bar={v}")
def test_ultimate_load_of_rolled_i_minor_axis_against_curve_b(lam_bar):
    sec = SegmentSection.from_shape(I_SHAPE, "minor", FY, n_fibres=20, residual_stress=0.3)
    col = fibre_column(sec, lam_bar)
    res = analyse_imperfect(col, Imperfection("half-sine", ratio=1000), [sec], analysis="nonlinear", axis="minor")
    assert res.success, res.message
    # EN 1993-1-1 clause 6.3.1.2 with the curve Table 6.2 assigns (rolled I, h/b > 1.2, tf <= 40 mm, z-z: b)
    chi = chi_en1993(lam_bar, ALPHA_B)
    ratio = res.limit_load_factor / chi
    print(f"lambda_bar={lam_bar}: N_u/(A fy) = {res.limit_load_factor:.4f}, chi_b = {chi:.4f}, ratio = {ratio:.4f}")
    assert abs(ratio - 1) < 0.10
    # residual stresses make the first fibre yield earlier than the elastic first yield of a clean section
    assert res.fibre_first_yield_load_factor < res.limit_load_factor


# ----------------------------------------------------------------------------- refinement
@pytest.fixture(scope="module")
def gmnia_case():
    sec = SegmentSection.from_shape(I_SHAPE, "minor", FY, n_fibres=20, residual_stress=0.3)
    return fibre_column(sec, 1.0), sec


def test_limit_load_converges_under_mesh_refinement(gmnia_case):
    col, sec = gmnia_case
    lims = [nonlinear_path(col, Imperfection("half-sine", ratio=1000), [sec], min_elements=n).limit_load_factor
            for n in (8, 16, 32)]
    d1, d2 = abs(lims[1] - lims[0]), abs(lims[2] - lims[1])
    print(f"limit load factors with 8, 16, 32 elements: {lims}")
    # stated tolerance: 16 elements are within 1e-3 (relative) of 32, and the change shrinks with refinement
    assert d2 / lims[2] < 1e-3
    assert d2 < 0.5 * d1


def test_limit_load_converges_under_step_refinement(gmnia_case):
    col, sec = gmnia_case
    lims = [nonlinear_path(col, Imperfection("half-sine", ratio=1000), [sec], max_step=h,
                           initial_step=0.02).limit_load_factor for h in (0.004, 0.002, 0.001)]
    print(f"limit load factors with max arc-length steps 0.004, 0.002, 0.001: {lims}")
    # stated tolerance: the peak does not depend on the step length by more than 1e-4 (relative)
    assert (max(lims) - min(lims)) / lims[-1] < 1e-4


def test_fibre_first_yield_agrees_with_the_elastic_first_yield():
    # project consistency: without residual stresses the first fibre yield of the nonlinear path lies within the
    # path's step of the second-order elastic first yield (small rotations, same bow).  W is taken from the fibres
    # (I_fibres / outermost fibre centroid) so both analyses see the same section.
    sec = SegmentSection.from_shape(I_SHAPE, "minor", FY, n_fibres=20)
    sec = replace(sec, W=float(np.sum(sec.fibre_area * sec.fibre_y**2) / np.abs(sec.fibre_y).max()))
    col = fibre_column(sec, 1.0)
    res = analyse_imperfect(col, Imperfection("half-sine", ratio=1000), [sec], analysis="both",
                            path_options=dict(max_step=0.002, initial_step=0.02))
    lo, hi = res.nonlinear.first_yield_bracket
    assert lo <= res.first_yield_load_factor * (1 + 5e-3) and res.first_yield_load_factor <= hi * (1 + 5e-3)
    assert res.fibre_first_yield_load_factor == pytest.approx(res.first_yield_load_factor, rel=5e-3)
    # Perry's closed form (Perry 1886; Robertson 1925) with the FE critical force gives the same first yield
    row = res.comparison[0]
    assert row.perry_load_factor == pytest.approx(res.first_yield_load_factor, rel=1e-5)


def test_perry_closed_form_root():
    # Perry (1886): the returned force satisfies (N_pl - N)(N_E - N) = eta N N_E and lies below both loads
    N = perry_first_yield(1.0e6, 2.0e6, 0.3)
    assert (1.0e6 - N) * (2.0e6 - N) == pytest.approx(0.3 * N * 2.0e6, rel=1e-12)
    assert N < 1.0e6


# ----------------------------------------------------------------------------- errors
def test_straight_column_cannot_pass_the_bifurcation():
    sec = SegmentSection.from_shape(I_SHAPE, "minor", FY, n_fibres=10)
    col = fibre_column(sec, 1.0)
    with pytest.raises(ModelError, match="cannot pass it without an imperfection"):
        nonlinear_path(col, Imperfection("half-sine", amplitude=0.0), [sec])
    with pytest.raises(ModelError, match="perfectly straight"):
        nonlinear_path(col, None, [sec])


def test_missing_yield_strength_for_the_fibre_analysis():
    sec = SegmentSection.from_shape(I_SHAPE, "minor", None, n_fibres=10)
    col = fibre_column(SegmentSection.from_shape(I_SHAPE, "minor", FY, n_fibres=10), 1.0)
    with pytest.raises(ModelError, match=r"segment\[1\].fy: missing: the nonlinear fibre analysis needs the yield"):
        nonlinear_path(col, Imperfection("half-sine", ratio=1000), [sec])


CASE = """
title = "test post (invented)"
[material]
E = "210 GPa"
{fy}
[[segment]]
length = "4 m"
section = {{ shape = "i_section", b = "160 mm", h = "320 mm", tf = "11 mm", tw = "7.5 mm", r = "15 mm" }}
[[restraint]]
at = "base"
lateral = "rigid"
[[restraint]]
at = "top"
lateral = "rigid"
[[load]]
at = "top"
axial = "300 kN"
{load_extra}
{extra}
"""


def case_text(fy='fy = "355 MPa"', load_extra="", extra=""):
    return CASE.format(fy=fy, load_extra=load_extra, extra=extra)


def test_missing_fy_in_a_case_with_nonlinear_analysis():
    text = case_text(fy="", extra='[imperfection]\nbow = "L/1000"\nanalysis = "nonlinear"\n')
    with pytest.raises(CaseError, match=r"segment\[1\].fy: missing: the nonlinear \(yield\) analysis needs"):
        imp_case.run_imperfect(parse_case(text))


def test_case_keys_are_checked():
    with pytest.raises(CaseError, match="imperfection.shap"):
        parse_case(case_text(extra='[imperfection]\nbow = "L/1000"\nshap = "mode"\n'))
    with pytest.raises(CaseError, match="imperfection.bow: missing"):
        parse_case(case_text(extra='[imperfection]\nshape = "mode"\n'))
    with pytest.raises(UnitError, match=r"lateral.distributed\[1\].per_length: '2 kN' is not a force per length"):
        parse_case(case_text(extra='[lateral]\n[[lateral.distributed]]\nper_length = "2 kN"\n'))


def test_eccentricity_and_lateral_keys_become_actions():
    text = case_text(load_extra='eccentricity = "20 mm"\neccentricity_minor = "5 mm"',
                     extra='[imperfection]\nbow = "L/500"\nanalysis = "second-order"\n'
                           '[lateral]\n[[lateral.distributed]]\nper_length = "1.5 kN/m"\naxis = "major"\n')
    case = parse_case(text)
    major = imp_case.plane_inputs(case, "major")[3]
    minor = imp_case.plane_inputs(case, "minor")[3]
    assert [m.moment for m in major.moments] == pytest.approx([300e3 * 0.020])
    assert [m.moment for m in minor.moments] == pytest.approx([300e3 * 0.005])
    assert len(major.distributed) == 1 and not minor.distributed
    assert case.extras["imperfection"].imperfection.ratio == 500


# ----------------------------------------------------------------------------- demo case through the API
@pytest.fixture(scope="module")
def demo():
    case = load_case(CASES / "crooked_post.toml")
    return case, imp_case.run_imperfect(case)


def test_demo_case_runs_both_axes(demo):
    case, results = demo
    assert set(results) == {"major", "minor"}
    for axis, r in results.items():
        assert r.success, r.message
        assert r.second_order.converged
        # the ultimate load lies below the elastic critical load, and the first fibre yields before it
        assert r.fibre_first_yield_load_factor < r.limit_load_factor < r.critical_load_factor
        assert r.nonlinear.first_yield_height is not None
        assert np.all(np.isfinite(r.nonlinear.yield_extent[r.nonlinear.limit_index]))


def test_demo_case_outputs(demo, tmp_path):
    case, results = demo
    js = imperfect_json(results)
    text = json.dumps(js, allow_nan=False)
    back = json.loads(text)
    assert [p["axis"] for p in back] == ["major", "minor"]
    for p, r in zip(back, results.values()):
        assert p["limit_load_factor"] == r.limit_load_factor
        assert p["first_yield_load_factor"] == r.first_yield_load_factor
        assert len(p["path"]["load_factors"]) == len(p["path"]["control_deflection_m"])
        assert p["comparison"][0]["perry_load_factor"] is not None
    lines = imperfect_summary(results, case.display)
    assert any("ultimate load factor" in line for line in lines)
    assert any("Perry-Robertson first yield" in line for line in lines)
    from fea.plot.imperfect import plot_comparison, plot_diagrams, plot_path

    for r in results.values():
        for fig in (plot_path(r), plot_diagrams(r, fy=FY), plot_comparison(r)):
            out = tmp_path / "f.png"
            fig.savefig(out)
            assert out.stat().st_size > 5000


def test_lateral_only_case_runs_second_order_on_a_straight_column():
    text = case_text(extra='[lateral]\n[[lateral.distributed]]\nper_length = "1.5 kN/m"\naxis = "major"\n')
    res = imp_case.run_imperfect(parse_case(text))
    r = res["major"]
    assert r.analysis == "second-order" and r.bow_amplitude == 0.0
    assert r.second_order.moment_amplification[r.second_order.at(1.0)] > 1.0
