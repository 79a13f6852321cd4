"""Imperfect columns as an engineer meets them: section-modulus keys per plane, the headline first yield and its
model, plain words for how the analysis ended, and what the docs say about deflections and fibres.

Cases are invented test data; the crooked-post case is the project's demo (cases/crooked_post.toml).
"""

from __future__ import annotations

import json
import re
from pathlib import Path

import numpy as np
import pytest

import fea.solve.imperfect_case as imp_case
from fea.errors import CaseError
from fea.io.imperfect_output import STATUS_WORDS, imperfect_json, imperfect_summary, status_words
from fea.model.imperfection import Imperfection, SegmentSection
from fea.pipeline import load_case, parse_case
from fea.sections import ISection, Rectangle
from fea.solve.imperfect import ELASTIC_MODEL, FIBRE_WITH_RS, analyse_imperfect

ROOT = Path(__file__).resolve().parents[1]
STATUSES = tuple(STATUS_WORDS)
FY = 355e6  # S355, EN 1993-1-1 Table 3.1 (t <= 40 mm)

ONE_PLANE = """
title = "one-plane post (invented)"
[material]
E = "210 GPa"
fy = "355 MPa"
[[segment]]
length = "3 m"
I = "8.0e6 mm^4"
A = "3000 mm^2"
[[restraint]]
at = "base"
lateral = "rigid"
[[restraint]]
at = "top"
lateral = "rigid"
[[load]]
at = "top"
axial = "100 kN"
[imperfection]
bow = "L/500"
analysis = "second-order"
{w}
"""

TWO_PLANE = ONE_PLANE.replace('I = "8.0e6 mm^4"', 'I_major = "8.0e6 mm^4"\nI_minor = "2.0e6 mm^4"')


# ----------------------------------------------------------------------------- W keys consistent with the planes
def test_one_plane_case_uses_W():
    res = imp_case.run_imperfect(parse_case(ONE_PLANE.format(w='W = "100e3 mm^3"')))
    r = res["in-plane"]
    assert r.second_order_first_yield_load_factor is not None and r.first_yield_load_factor is not None
    assert not any("no section modulus" in w for w in r.warnings)


@pytest.mark.parametrize("key", ["W_major", "W_minor"])
def test_one_plane_case_refuses_a_plane_key_in_one_line(key):
    with pytest.raises(CaseError) as err:
        parse_case(ONE_PLANE.format(w=f'{key} = "100e3 mm^3"'))
    text = str(err.value)
    assert "\n" not in text and text.startswith(f"imperfection.{key}") and "give W" in text


def test_two_plane_case_refuses_W_and_takes_the_plane_keys():
    with pytest.raises(CaseError, match=r"^imperfection\.W: .*give W_major and W_minor"):
        parse_case(TWO_PLANE.format(w='W = "100e3 mm^3"'))
    res = imp_case.run_imperfect(parse_case(TWO_PLANE.format(w='W_major = "100e3 mm^3"\nW_minor = "40e3 mm^3"')))
    assert all(r.first_yield_load_factor is not None for r in res.values())


def test_hint_names_the_key_of_the_plane():
    r = imp_case.run_imperfect(parse_case(ONE_PLANE.format(w="")))["in-plane"]
    assert any(w.endswith("[imperfection] W)") for w in r.warnings), r.warnings
    res = imp_case.run_imperfect(parse_case(TWO_PLANE.format(w='W_major = "100e3 mm^3"')))
    assert any(w.endswith("[imperfection] W_minor)") for w in res["minor"].warnings)
    assert res["major"].first_yield_load_factor is not None


# ----------------------------------------------------------------------------- the headline first yield
@pytest.fixture(scope="module")
def demo():
    case = load_case(ROOT / "cases" / "crooked_post.toml")
    return case, imp_case.run_imperfect(case)


def test_headline_is_the_fibre_first_yield_with_residual_stress(demo):
    case, results = demo
    for r in results.values():
        assert r.residual_stress
        assert r.first_yield_source == FIBRE_WITH_RS
        assert r.first_yield_load_factor == r.fibre_first_yield_load_factor
        # project consistency: the headline first yield does not exceed the ultimate load of the same model
        assert r.first_yield_load_factor < r.limit_load_factor
    # the demo's major axis: the elastic first yield (no residual stress) lies above the ultimate load ...
    major = results["major"]
    assert major.second_order_first_yield_load_factor > major.limit_load_factor
    # ... and every output that shows it says why
    assert "no residual stress" in major.first_yield_remark
    js = imperfect_json(results)
    assert js[0]["first_yield_source"] == FIBRE_WITH_RS and "no residual stress" in js[0]["first_yield_remark"]
    assert js[0]["first_yield_load_factor"] == major.fibre_first_yield_load_factor
    lines = imperfect_summary(results, case.display)
    head = [ln for ln in lines if ln.startswith("  first yield (")]
    assert len(head) == 2 and all(FIBRE_WITH_RS in ln and "ultimate load factor" in ln for ln in head)
    assert any(ln.startswith("  note: the elastic second-order first yield") for ln in lines)
    assert any(f"first yield ({ELASTIC_MODEL})" in ln for ln in lines)


def test_no_first_yield_shown_above_the_ultimate_without_a_reason(demo):
    case, results = demo
    for r in results.values():
        shown = [r.first_yield_load_factor, r.second_order_first_yield_load_factor,
                 *(c.perry_load_factor for c in r.comparison)]
        if any(v is not None and v > r.limit_load_factor for v in shown):
            assert "because" in r.first_yield_remark


def test_without_residual_stress_the_elastic_first_yield_is_the_headline():
    # invented rectangle column, no residual stress: the exact elastic root is the headline
    sec = SegmentSection.from_shape(Rectangle(b=0.1, h=0.1), "major", FY, n_fibres=10)
    from fea import RIGID, Column, PointLoad, Restraint, Segment

    col = Column(segments=(Segment(3.0, 210e9, 0.1**4 / 12, A=0.01),),
                 restraints=(Restraint(0.0, RIGID), Restraint(3.0, RIGID)), point_loads=(PointLoad(3.0, 1e6),))
    r = analyse_imperfect(col, Imperfection("half-sine", ratio=500), [sec], analysis="both")
    assert not r.residual_stress
    assert r.first_yield_source == ELASTIC_MODEL
    assert r.first_yield_load_factor == r.second_order_first_yield_load_factor


# ----------------------------------------------------------------------------- plain words, not identifiers
def test_every_status_has_words():
    for st in STATUSES:
        assert "_" not in STATUS_WORDS[st]
    assert status_words("something_new") == "something new"


def test_no_status_identifier_in_summary_json_messages_or_report(demo):
    case, results = demo
    ids = [s for s in STATUSES if "_" in s]
    text = "\n".join(imperfect_summary(results, case.display))
    messages = []
    for p in imperfect_json(results):
        messages += [p["message"], p["status_text"], p["path"]["message"], p["path"]["status_text"]]
    from fea.report.imperfect import imperfect_blocks

    report = json.dumps([repr(b) for b in imperfect_blocks(results, case.display)])
    for where in (text, "\n".join(messages), report):
        for s in ids:
            assert s not in where
        assert "lambda" not in where and "max_steps" not in where
    assert "How the analysis ended" in report


def test_failed_path_messages_are_plain():
    # invented: load control cannot pass the peak, so the path ends "not complete" in plain words
    sec = SegmentSection.from_shape(ISection(b=0.16, h=0.32, tf=0.011, tw=0.0075, r=0.015), "minor", FY,
                                    n_fibres=10)
    from fea import RIGID, Column, PointLoad, Restraint, Segment

    I = float(np.sum(sec.fibre_area * sec.fibre_y**2))
    col = Column(segments=(Segment(3.0, 210e9, I, A=sec.A),),
                 restraints=(Restraint(0.0, RIGID), Restraint(3.0, RIGID)), point_loads=(PointLoad(3.0, sec.A * FY),))
    r = analyse_imperfect(col, Imperfection("half-sine", ratio=1000), [sec], analysis="nonlinear",
                          path_options=dict(method="load"))
    assert r.status == "load_control_limit" and not r.success
    assert "load_control_limit" not in r.message and "lambda" not in r.message
    assert "load control cannot pass" in r.message


# ----------------------------------------------------------------------------- fibres and the docs
@pytest.mark.parametrize("n", [4, 10, 40])
def test_fibre_stiffness_of_a_rectangle_is_I_times_one_minus_one_over_n_squared(n):
    # parallel-axis theorem: n point fibres at the strip centroids lose each strip's own b t^3 / 12
    sec = SegmentSection.from_shape(Rectangle(b=0.1, h=0.2), "major", FY, n_fibres=n)
    I = 0.1 * 0.2**3 / 12
    assert np.sum(sec.fibre_area * sec.fibre_y**2) / I == pytest.approx(1 - 1 / n**2, rel=1e-12)


def test_fibre_stiffness_of_an_i_section_is_within_the_documented_bound():
    shape = ISection(b=0.15, h=0.3, tf=0.0107, tw=0.0071, r=0.015)
    p = shape.properties()
    for axis, I, r, d in (("major", p.I_major, p.r_major, 0.3), ("minor", p.I_minor, p.r_minor, 0.15)):
        for n in (10, 40):
            sec = SegmentSection.from_shape(shape, axis, FY, n_fibres=n)
            loss = 1 - np.sum(sec.fibre_area * sec.fibre_y**2) / I
            assert 0 < loss <= (d / n) ** 2 / (12 * r**2)


def test_docs_state_deflection_and_fibre_effect():
    doc = (ROOT / "docs" / "imperfect.md").read_text(encoding="utf-8")
    flat = " ".join(doc.split())
    assert re.search(r"deflection_m`.{0,120}bow included", flat)
    assert "I (1 - 1/n^2)" in doc.replace("EI (1 - 1/n^2)", "I (1 - 1/n^2)")
    for key in ("first_yield_source", "first_yield_remark", "status_text", "W_minor"):
        assert f"`{key}`" in doc or key in doc
