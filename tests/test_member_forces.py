"""Member forces given per segment (``axial_force`` on a [[segment]]) are the same column as their joint loads.

A compression ``N_i`` in segment ``i`` (base upward) equals the point loads ``N_i - N_(i+1)`` at the top of
each segment, since all axial load is carried down to the base (the model's own convention, not an outside
reference): the tests compare both ways of writing a case to 1e-9.
"""

from __future__ import annotations

import math
import re
from dataclasses import replace
from pathlib import Path

import numpy as np
import pytest
from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st

from fea import Column, ModelError, PointLoad, Segment
from fea.model.column import member_force_loads
from fea.pipeline import load_case, parse_case, run_case

ROOT = Path(__file__).resolve().parents[1]
CHORD = ROOT / "cases" / "truss_chord_panels.toml"
#: the demo chord's panel forces, base (left end) first [kN] (invented demo data)
CHORD_FORCES = (180.0, 260.0, 310.0, 310.0, 260.0, 180.0)
RTOL = 1e-9


def _joint_load_text(forces_kN, joints_m, permanent: bool = False) -> str:
    """[[load]] tables of the joint loads N_i - N_(i+1) at the top of each segment (zero ones left out)."""
    out = []
    for i, N in enumerate(forces_kN):
        P = N - (forces_kN[i + 1] if i + 1 < len(forces_kN) else 0.0)
        if P != 0:
            out.append(f'[[load]]\nat = "{joints_m[i + 1]!r} m"\naxial = "{P!r} kN"\n'
                       + ("permanent = true\n" if permanent else ""))
    return "\n".join(out)


def _without_member_forces(text: str) -> str:
    return re.sub(r'^axial_force(_permanent)? = .*\n', "", text, flags=re.MULTILINE)


def _same_modes(a: np.ndarray, b: np.ndarray) -> None:
    """Mode shapes equal to 1e-9 of their largest ordinate, up to the sign (an antisymmetric mode of a
    symmetric member has two equal extremes, so either may be the positive one)."""
    for u, v in zip(a, b):
        err = min(np.max(np.abs(u - v)), np.max(np.abs(u + v)))
        assert err <= RTOL * np.max(np.abs(v))


def _same_column(case_a, case_b) -> None:
    """The two cases hold the same columns, the marker of the joint loads aside (exactly, not to a tolerance)."""
    for (ax_a, a), (ax_b, b) in zip(case_a.planes, case_b.planes, strict=True):
        assert ax_a == ax_b

        def plain(col):
            return sorted(((p.permanent, p.at, p.P) for p in col.point_loads if p.P != 0))

        assert plain(a) == plain(b)
        assert replace(a, point_loads=()) == replace(b, point_loads=())


def _assert_same_results(res_a, res_b) -> None:
    _same_column(res_a.case, res_b.case)
    for ra, rb in zip(res_a.buckling, res_b.buckling, strict=True):
        assert ra.axis == rb.axis
        np.testing.assert_allclose(ra.load_factors, rb.load_factors, rtol=RTOL, atol=0)
        np.testing.assert_array_equal(ra.heights, rb.heights)
        _same_modes(ra.modes, rb.modes)
        for sa, sb in zip(ra.segments, rb.segments, strict=True):
            assert sa.axial_force == pytest.approx(sb.axial_force, rel=RTOL, abs=1e-6)
            assert sa.critical_axial_force == pytest.approx(sb.critical_axial_force, rel=RTOL, abs=1e-6)
            if sb.effective_length_factor is None:
                assert sa.effective_length_factor is None
            else:
                assert sa.effective_length_factor == pytest.approx(sb.effective_length_factor, rel=RTOL)


# -- the demo chord ---------------------------------------------------------------------------------------------

def test_chord_member_forces_equal_negative_joint_loads():
    text = CHORD.read_text(encoding="utf-8")
    by_segment = parse_case(text)
    joints = by_segment.column("major").joints  # 2.2 m panels, summed from the left end
    loads = parse_case(_without_member_forces(text) + "\n" + _joint_load_text(CHORD_FORCES, joints))
    # the loads version really has negative (upward) joint loads near the left end
    assert min(p.P for p in loads.column("major").point_loads) == pytest.approx(-80e3)
    _assert_same_results(run_case(by_segment), run_case(loads))


def test_chord_axial_force_is_the_given_force_of_each_segment():
    case = load_case(CHORD)
    for _, col in case.planes:
        assert col.member_forces_given
        mids = [0.5 * (a + b) for a, b in col.segment_bounds()]
        np.testing.assert_allclose(col.axial_force(np.array(mids)), np.array(CHORD_FORCES) * 1e3, rtol=1e-12)
        # exactly at a joint the force of the segment above (the diagram steps at the joint)
        np.testing.assert_allclose(col.axial_force(np.array(col.joints[:-1])), np.array(CHORD_FORCES) * 1e3,
                                   rtol=1e-12)
        assert all(p.member_forces for p in col.point_loads)
    res = run_case(case)
    for r in res.buckling:
        assert [s.axial_force for s in r.segments] == pytest.approx([N * 1e3 for N in CHORD_FORCES], rel=1e-12)


def test_origins_name_the_joint_loads_of_each_segment():
    case = load_case(CHORD)
    objs = case.model_objects("segment[2]")
    assert [type(o).__name__ for _, o in objs] == ["Segment", "Segment"] + ["PointLoad"] * 4
    heights = sorted({o.at for _, o in objs if isinstance(o, PointLoad)})
    assert heights == pytest.approx([2.2, 4.4])
    # panels 3 and 4 carry the same force: no load at their common joint, so panel 3 names only its bottom one
    assert sorted({o.at for _, o in case.model_objects("segment[3]") if isinstance(o, PointLoad)}) == \
        pytest.approx([4.4])


def test_uniform_force_per_segment_equals_a_top_load():
    text = CHORD.read_text(encoding="utf-8")
    uniform = re.sub(r'^axial_force = .*$', 'axial_force = "250 kN"', text, flags=re.MULTILINE)
    case = parse_case(uniform)
    col = case.column("minor")
    assert col.point_loads == (PointLoad(col.joints[-1], 250e3, member_forces=True),)
    top = parse_case(_without_member_forces(text) + '\n[[load]]\nat = "top"\naxial = "250 kN"\n')
    _assert_same_results(run_case(case), run_case(top))


# -- the conversion -------------------------------------------------------------------------------------------

def test_member_force_loads_telescope():
    joints = (0.0, 1.0, 3.0, 4.5)
    loads = member_force_loads(joints, (100.0, 150.0, 40.0))
    assert [(p.at, p.P) for p in loads] == [(1.0, -50.0), (3.0, 110.0), (4.5, 40.0)]
    assert all(p.member_forces and not p.permanent for p in loads)
    assert all(p.permanent for p in member_force_loads(joints, (1.0, 2.0, 3.0), permanent=True))
    assert member_force_loads(joints, (0.0, 0.0, 0.0)) == ()


def test_member_force_loads_needs_one_force_per_segment():
    with pytest.raises(ValueError, match="one force per segment"):
        member_force_loads((0.0, 1.0, 2.0), (1.0,))


def test_tension_segment_and_zero_force():
    col = Column(segments=(Segment(2.0, 210e9, 1e-6), Segment(2.0, 210e9, 1e-6)),
                 point_loads=member_force_loads((0.0, 2.0, 4.0), (-30e3, 50e3)))
    np.testing.assert_allclose(col.axial_force(np.array([1.0, 3.0])), [-30e3, 50e3])


@settings(max_examples=50, deadline=None)
@given(loads=st.lists(st.tuples(st.sampled_from([0.0, 1.0, 2.5, 4.0, 4.0, 3.3]),
                                st.integers(-10**6, 10**6).map(lambda n: 0.37 * n), st.booleans()), max_size=12),
       permanent=st.sampled_from([None, True, False]))
def test_axial_force_is_the_sum_of_the_loads_above(loads, permanent):
    # the force at x sums the point loads above x (heights within the station tolerance of x do not count yet)
    col = Column(segments=(Segment(2.5, 210e9, 1e-6), Segment(1.5, 210e9, 1e-6)),
                 point_loads=tuple(PointLoad(at, P, perm) for at, P, perm in loads))
    x = np.array([0.0, 1.0, 1.0 - 1e-6, 1.0 + 1e-6, 2.0, 2.5, 3.3, 3.9999, 4.0])
    tol = 1e-9 * 4.0
    want = [math.fsum(P for at, P, perm in loads if xi < at - tol and permanent in (None, perm)) for xi in x]
    scale = math.fsum(abs(P) for _, P, _ in loads)
    np.testing.assert_allclose(col.axial_force(x, permanent), want, rtol=0, atol=1e-12 * scale + 1e-300)


# -- permanent member forces and leaning loads ------------------------------------------------------------------

#: Invented test column.  The coarse tolerance keeps its mesh small enough for the dense eigensolver, whose mode
#: shapes are reproducible to the last bit; the sparse solver's random start vector alone makes them differ by up
#: to about 5e-9 between two runs of one column (measured), which is not what these tests are about.
_ONE_PLANE = """title = "Member-force test column (invented)"
[analysis]
tolerance = 1e-4
[material]
E = "210 GPa"
[[segment]]
length = "3.0 m"
I = "20e6 mm^4"
{s1}
[[segment]]
length = "2.5 m"
I = "12e6 mm^4"
{s2}
[[segment]]
length = "2.0 m"
I = "8e6 mm^4"
{s3}
[[restraint]]
at = "base"
lateral = "rigid"
rotation = "1 MN*m/rad"
[[restraint]]
at = "top"
lateral = "rigid"
"""


def _one_plane(*segment_lines: str, extra: str = "") -> str:
    return _ONE_PLANE.format(s1=segment_lines[0], s2=segment_lines[1], s3=segment_lines[2]) + extra


def test_permanent_member_forces_equal_permanent_joint_loads():
    var, perm = (300.0, 200.0, 100.0), (150.0, 90.0, 60.0)
    seg = [f'axial_force = "{v} kN"\naxial_force_permanent = "{p} kN"' for v, p in zip(var, perm)]
    by_segment = parse_case(_one_plane(*seg))
    joints = (0.0, 3.0, 5.5, 7.5)
    loads = parse_case(_one_plane("", "", "", extra=_joint_load_text(var, joints)
                                  + _joint_load_text(perm, joints, permanent=True)))
    col = by_segment.column("in-plane")
    mids = np.array([1.5, 4.25, 6.5])
    np.testing.assert_allclose(col.axial_force(mids, permanent=True), np.array(perm) * 1e3, rtol=1e-12)
    np.testing.assert_allclose(col.axial_force(mids, permanent=False), np.array(var) * 1e3, rtol=1e-12)
    res_a, res_b = run_case(by_segment), run_case(loads)
    _assert_same_results(res_a, res_b)
    r = res_a.buckling[0]
    # critical force = permanent + load factor x variable
    for s, v, p in zip(r.segments, var, perm):
        assert s.critical_axial_force == pytest.approx(1e3 * (p + r.load_factor * v), rel=1e-12)


def test_only_permanent_where_a_segment_has_no_variable_force():
    case = parse_case(_one_plane('axial_force = "300 kN"', 'axial_force = "0 kN"\naxial_force_permanent = "50 kN"',
                                 'axial_force = "0 kN"'))
    col = case.column("in-plane")
    np.testing.assert_allclose(col.axial_force(np.array([1.5, 4.25, 6.5])), [300e3, 50e3, 0.0], atol=1e-9)


def test_leaning_load_with_member_forces():
    lean = '[[leaning]]\nat = "top"\nload = "120 kN"\nheight = "7.5 m"\n'
    forces = (400.0, 250.0, 250.0)
    by_segment = parse_case(_one_plane(*(f'axial_force = "{N} kN"' for N in forces), extra=lean))
    loads = parse_case(_one_plane("", "", "", extra=lean + _joint_load_text(forces, (0.0, 3.0, 5.5, 7.5))))
    _assert_same_results(run_case(by_segment), run_case(loads))


def test_lateral_force_on_a_load_is_kept_with_member_forces():
    extra = '[[load]]\nat = "4.0 m"\nlateral = "2 kN"\n'
    case = parse_case(_one_plane(*(f'axial_force = "{N} kN"' for N in (300, 200, 100)), extra=extra))
    col = case.column("in-plane")
    assert col.point_loads[0] == PointLoad(4.0, 0.0)
    assert case.model_objects("load[1]") == (("in-plane", PointLoad(4.0, 0.0)),)
    assert "lateral" in case.extras


# -- mixing and bad values: one line naming the field -------------------------------------------------------------

_F = ('axial_force = "300 kN"', 'axial_force = "200 kN"', 'axial_force = "100 kN"')


@pytest.mark.parametrize("text, field, words", [
    (_one_plane(*_F, extra='[[load]]\nat = "top"\naxial = "10 kN"\n'), "load[1].axial",
     "not allowed with member forces given per segment (segment[1].axial_force)"),
    (_one_plane(*_F, extra='[[distributed_load]]\naxial = "1 kN/m"\n'), "distributed_load[1]",
     "include this load in each segment's axial_force"),
    (_one_plane(*_F, extra='[[load]]\nat = "top"\neccentricity = "20 mm"\n'), "load[1].eccentricity",
     "[[lateral.moment]]"),
    (_one_plane(_F[0], "", _F[2]), "segment[2].axial_force", "every segment needs its own"),
    (_one_plane("", 'axial_force_permanent = "5 kN"', ""), "segment[1].axial_force",
     "segment[2].axial_force_permanent gives the axial force per segment"),
    (_one_plane(*('axial_force = "0 kN"',) * 3), "segment[1].axial_force", "nothing to check"),
    (_one_plane(_F[0], 'axial_force = "200 kN/m"', _F[2]), "segment[2].axial_force", "force"),
    (_one_plane(_F[0], _F[1], 'axial_force = "1e40 kN"'), "segment[3].axial_force", "range"),
    (_one_plane(_F[0], _F[1], 'axial_forces = "1 kN"'), "segment[3].axial_forces", "did you mean"),
])
def test_mixing_and_bad_values_are_one_line_errors(text, field, words):
    with pytest.raises(ModelError) as info:  # CaseError, or UnitError for a wrong dimension
        parse_case(text)
    assert info.value.field == field
    msg = str(info.value)
    assert "\n" not in msg and words in msg


def test_loads_alone_still_work_and_negative_loads_stay_legal():
    case = parse_case(_one_plane("", "", "", extra='[[load]]\nat = "top"\naxial = "100 kN"\n'
                                                  '[[load]]\nat = "3.0 m"\naxial = "-40 kN"\n'))
    col = case.column("in-plane")
    assert not col.member_forces_given
    np.testing.assert_allclose(col.axial_force(np.array([1.0, 4.0])), [60e3, 100e3])


# -- property: any compressions per segment give the result of their joint loads --------------------------------

@settings(max_examples=20, deadline=None, suppress_health_check=[HealthCheck.too_slow])
@given(forces=st.lists(st.integers(5, 900), min_size=3, max_size=3),
       perm=st.lists(st.integers(0, 300), min_size=3, max_size=3))
def test_random_member_forces_equal_their_joint_loads(forces, perm):
    seg = [f'axial_force = "{v} kN"\naxial_force_permanent = "{p} kN"' for v, p in zip(forces, perm)]
    joints = (0.0, 3.0, 5.5, 7.5)
    by_segment = parse_case(_one_plane(*seg))
    loads = parse_case(_one_plane("", "", "", extra=_joint_load_text([float(v) for v in forces], joints)
                                  + _joint_load_text([float(p) for p in perm], joints, permanent=True)))
    _assert_same_results(run_case(by_segment), run_case(loads))
