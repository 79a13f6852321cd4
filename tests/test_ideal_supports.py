"""Idealised supports (issue 12, item 3): the recommended K beside the theoretical one, and nominal fixities.

All columns here are invented demo data.
"""

from __future__ import annotations

import math

import pytest

from fea.errors import CaseError
from fea.model import RIGID, Column, Foundation, LeaningLoad, Restraint, Segment
from fea.model.ideal_supports import (
    IDEAL_NOTE,
    IDEAL_SOURCE,
    ideal_case,
    nominal_rotation_at,
    nominal_rotation_stiffness,
)
from fea.pipeline import REPORT_PARTS, parse_case, result_json, run_case
from fea.report import build_markdown, build_report

E = 210e9
I_MAJOR, I_MINOR = 2e-5, 1e-5
H = 4.0

#: Theoretical K of the Euler cases (Timoshenko & Gere, Theory of Elastic Stability, 2nd ed., 1961,
#: sections 2.1-2.2, from memory); fixed-pinned: pi / x with x = 4.4934, the first positive root of tan x = x.
FIXED_PINNED_K = math.pi / 4.493409457909064


def _case(base: str, top: str = "", extra: str = "") -> str:
    """A one-segment demo column of two planes, 4 m, 100 kN at the top (invented data)."""
    return f"""
title = "Idealised-support demo (invented)"
[material]
E = "210 GPa"
[[segment]]
name = "post"
length = "4 m"
I_major = "2e-5 m^4"
I_minor = "1e-5 m^4"
[[restraint]]
at = "base"
{base}
{top}
[[load]]
at = "top"
axial = "100 kN"
{extra}
"""


FIXED = 'lateral = "rigid"\nrotation = "rigid"'
TOP_PINNED = '[[restraint]]\nat = "top"\nlateral = "rigid"'
TOP_FIXED = '[[restraint]]\nat = "top"\nlateral = "rigid"\nrotation = "rigid"'


# -- the nearest ideal case -------------------------------------------------------------------------------

@pytest.mark.parametrize("top, name, K, recommended", [
    # recommended design values: AISC 360 Commentary, Appendix 7, Table C-A-7.1 (from memory)
    (TOP_FIXED, "fixed-fixed", 0.5, 0.65),
    (TOP_PINNED, "fixed-pinned", FIXED_PINNED_K, 0.80),
    ("", "fixed-free (cantilever)", 2.0, 2.1),
    ('[[restraint]]\nat = "top"\nrotation = "rigid"', "fixed-sliding (rotation fixed, sway free)", 1.0, 1.2),
], ids=["fixed-fixed", "fixed-pinned", "cantilever", "fixed-sliding"])
def test_rigid_supports_give_the_ideal_case_with_the_recommended_k(top, name, K, recommended):
    res = run_case(parse_case(_case(FIXED, top)))
    for b in res.buckling:
        ideal = ideal_case(res.case.column(b.axis), 0)
        assert ideal is not None
        assert ideal.name == name
        assert ideal.theoretical == pytest.approx(K, rel=1e-12)
        # the analysis K equals the theoretical K of the ideal case (Timoshenko & Gere, sections 2.1-2.2)
        assert b.segments[0].effective_length_factor == pytest.approx(ideal.theoretical, rel=1e-5)
        assert ideal.recommended == recommended
        assert ideal.source == IDEAL_SOURCE and "Table C-A-7.1" in ideal.source and "from memory" in ideal.source
        assert ideal.note == IDEAL_NOTE
        assert ideal.as_dict()["K_recommended"] == recommended


def test_pinned_sliding_is_an_ideal_case_and_pinned_pinned_is_not():
    # AISC 360 Commentary, Table C-A-7.1 (from memory): pinned / rotation fixed, sway free: 2.0 -> 2.0
    col = Column((Segment(H, E, I_MINOR),), (Restraint(0.0, RIGID, 0.0), Restraint(H, 0.0, RIGID)))
    ideal = ideal_case(col, 0)
    assert ideal is not None and ideal.name == "pinned-sliding"
    assert (ideal.theoretical, ideal.recommended) == (2.0, 2.0)
    # pinned-pinned (1.0 -> 1.0) has no support rigid in rotation: not an idealised fixity
    assert ideal_case(Column((Segment(H, E, I_MINOR),), (Restraint(0.0, RIGID), Restraint(H, RIGID))), 0) is None


def test_the_ideal_case_reads_the_same_turned_end_for_end():
    col = Column((Segment(H, E, I_MINOR),), (Restraint(0.0, RIGID, 0.0), Restraint(H, RIGID, RIGID)))
    ideal = ideal_case(col, 0)
    assert ideal is not None and ideal.name == "fixed-pinned"


@pytest.mark.parametrize("column", [
    # a spring at the base
    Column((Segment(H, E, I_MINOR),), (Restraint(0.0, RIGID, 5e6), Restraint(H, RIGID))),
    # a lateral spring at the top
    Column((Segment(H, E, I_MINOR),), (Restraint(0.0, RIGID, RIGID), Restraint(H, 1e5))),
    # a brace inside the segment
    Column((Segment(H, E, I_MINOR),), (Restraint(0.0, RIGID, RIGID), Restraint(H / 2, RIGID), Restraint(H, RIGID))),
    # a foundation over it
    Column((Segment(H, E, I_MINOR),), (Restraint(0.0, RIGID, RIGID), Restraint(H, RIGID)),
           foundations=(Foundation(0.0, 1.0, 1e6),)),
    # a leaning load tied in at the top
    Column((Segment(H, E, I_MINOR),), (Restraint(0.0, RIGID, RIGID), Restraint(H, RIGID)),
           leaning_loads=(LeaningLoad(H, 1e5, 3.0),)),
], ids=["rotational spring", "lateral spring", "brace inside", "foundation", "leaning load"])
def test_springs_and_other_restraints_give_no_ideal_case(column):
    assert ideal_case(column, 0) is None


def test_a_spring_support_of_a_case_gives_none():
    res = run_case(parse_case(_case('lateral = "rigid"\nrotation = "5 MN*m/rad"', TOP_PINNED)))
    assert all(ideal_case(res.case.column(b.axis), 0) is None for b in res.buckling)


def test_segments_are_ideal_only_between_supports():
    seg = Segment(H / 2, E, I_MINOR)
    # a joint with no restraint: each segment is held by its neighbour, not by a support
    loose = Column((seg, seg), (Restraint(0.0, RIGID, RIGID), Restraint(H, RIGID)))
    assert ideal_case(loose, 0) is None and ideal_case(loose, 1) is None
    # a joint held only laterally: its rotation is restrained by the neighbour
    pinned = Column((seg, seg), (Restraint(0.0, RIGID, RIGID), Restraint(H / 2, RIGID), Restraint(H, RIGID)))
    assert ideal_case(pinned, 0) is None and ideal_case(pinned, 1) is None
    # a joint fixed in translation and rotation cuts the segments apart
    fixed = Column((seg, seg), (Restraint(0.0, RIGID, RIGID), Restraint(H / 2, RIGID, RIGID), Restraint(H, RIGID)))
    one, two = ideal_case(fixed, 0), ideal_case(fixed, 1)
    assert one is not None and one.name == "fixed-fixed"
    assert two is not None and two.name == "fixed-pinned"


# -- nominal fixities -------------------------------------------------------------------------------------

def test_nominal_rule_is_4_and_0_4_times_the_column_stiffness():
    # BS 5950-1:2000 clause 5.1.3 practice for column bases (from memory): 4 E I / L and 10 % of it
    assert nominal_rotation_stiffness("nominally-fixed", E, I_MINOR, H) == pytest.approx(4 * E * I_MINOR / H)
    assert nominal_rotation_stiffness("Nominally-Pinned ", E, I_MINOR, H) == pytest.approx(0.4 * E * I_MINOR / H)


@pytest.mark.parametrize("word, c", [("nominally-fixed", 4.0), ("nominally-pinned", 0.4)])
def test_nominal_words_give_the_stated_stiffness_in_each_plane(word, c):
    # BS 5950-1:2000 clause 5.1.3 practice (from memory): c E I / L, E I of the plane, L the column height
    case = parse_case(_case(f'lateral = "rigid"\nrotation = "{word}"', TOP_PINNED))
    assert case.column("major").restraints[0].rotation == pytest.approx(c * E * I_MAJOR / H, rel=1e-12)
    assert case.column("minor").restraints[0].rotation == pytest.approx(c * E * I_MINOR / H, rel=1e-12)
    assert [r.index for r in case.origins["restraint[1]"]] == [0, 0]
    assert [r.index for r in case.origins["restraint[2]"]] == [1, 1]


def test_nominal_fixities_give_k_between_the_pinned_and_fixed_values():
    # base held laterally, top pinned: K from 0.699 (fixed base) to 1.0 (pinned base)
    # (Timoshenko & Gere, sections 2.1-2.2, from memory); a stiffer base never raises K
    ks = {}
    for word in ("nominally-fixed", "nominally-pinned"):
        res = run_case(parse_case(_case(f'lateral = "rigid"\nrotation = "{word}"', TOP_PINNED)))
        ks[word] = res.buckling[0].segments[0].effective_length_factor
        # a finite stiffness: not an idealised support
        assert all(ideal_case(res.case.column(b.axis), 0) is None for b in res.buckling)
    assert FIXED_PINNED_K < ks["nominally-fixed"] < ks["nominally-pinned"] < 1.0


def test_nominal_fixity_at_the_top_uses_the_top_segment():
    text = _case(FIXED, '[[restraint]]\nat = "top"\nlateral = "rigid"\nrotation = "nominally-pinned"').replace(
        '[[restraint]]\nat = "base"', '[[segment]]\nlength = "2 m"\nI_major = "4e-5 m^4"\nI_minor = "3e-5 m^4"\n'
                                       '[[restraint]]\nat = "base"')
    case = parse_case(text)
    top = case.column("minor").restraints[1]
    assert top.rotation == pytest.approx(0.4 * E * 3e-5 / 6.0, rel=1e-12)  # I of the top segment, L = 6 m
    assert nominal_rotation_at("nominally-pinned", case.column("minor").segments, 6.0) == top.rotation


def test_nominal_fixity_adds_to_restraining_beams():
    beam = '[[restraint.beam]]\nI = "1e-5 m^4"\nspan = "5 m"\nfar_end = "pinned"'
    case = parse_case(_case(f'lateral = "rigid"\nrotation = "nominally-pinned"\n{beam}', TOP_PINNED))
    assert case.column("minor").restraints[0].rotation == pytest.approx(0.4 * E * I_MINOR / H + 3 * E * 1e-5 / 5)


def test_nominal_fixity_part_way_up_is_an_error_naming_the_field():
    text = _case(FIXED, '[[restraint]]\nat = "2 m"\nlateral = "rigid"\nrotation = "nominally-fixed"')
    with pytest.raises(CaseError) as err:
        parse_case(text)
    assert err.value.field == "restraint[2].rotation"
    assert "base or the top" in str(err.value) and "\n" not in str(err.value)


def test_a_misspelt_nominal_word_is_an_error_naming_the_field():
    with pytest.raises(CaseError) as err:
        parse_case(_case('lateral = "rigid"\nrotation = "nominaly-fixed"', TOP_PINNED))
    assert err.value.field == "restraint[1].rotation"
    assert "'nominally-fixed' or 'nominally-pinned'" in str(err.value)


# -- the report -------------------------------------------------------------------------------------------

def test_report_shows_the_recommended_k_with_its_source():
    res = run_case(parse_case(_case(FIXED, TOP_PINNED)))
    data = result_json(res)
    md = build_markdown(res, data, figures={}, parts=REPORT_PARTS, date="2026-12-01")
    assert "*K*<sub>rec</sub>" in md
    assert "| 0.699 | 0.80 |" in md  # theoretical K (analysis) beside the recommended one (AISC 360 C-A-7.1)
    assert "Table C-A-7.1" in md and IDEAL_NOTE in md and "fixed-pinned" in md
    html = build_report(res, data, figures={}, parts=REPORT_PARTS, date="2026-12-01")
    assert 'data-src="json:buckling/0/segments/0/ideal_support/K_recommended"' in html


def test_report_has_no_recommended_k_without_idealised_supports():
    res = run_case(parse_case(_case('lateral = "rigid"\nrotation = "nominally-fixed"', TOP_PINNED)))
    md = build_markdown(res, result_json(res), figures={}, parts=REPORT_PARTS, date="2026-12-01")
    assert "<sub>rec</sub>" not in md and "Table C-A-7.1" not in md


def test_report_gives_the_advice_for_a_segment_whose_k_is_not_a_design_value():
    text = _case(FIXED, TOP_PINNED).replace(
        '[[restraint]]\nat = "base"', '[[segment]]\nname = "stub"\nlength = "1 m"\nI_major = "2e-5 m^4"\n'
                                       'I_minor = "1e-5 m^4"\n[[restraint]]\nat = "base"')
    text = text.replace('at = "top"\naxial = "100 kN"', 'at = "top"\naxial = "1 kN"\n[[load]]\nat = "4 m"\n'
                                                          'axial = "100 kN"')
    res = run_case(parse_case(text))
    top = res.buckling[0].segments[1]
    assert top.advice and not top.meaningful
    data = result_json(res)
    md = build_markdown(res, data, figures={}, parts=REPORT_PARTS, date="2026-12-01")
    assert f"| no | {top.advice} |" in md.replace("\\_", "_")  # the note column gives the advice
    html = build_report(res, data, figures={}, parts=REPORT_PARTS, date="2026-12-01")
    assert 'data-src="json:buckling/0/segments/1/k_advice"' in html
