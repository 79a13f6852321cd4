"""Extreme but valid columns, and values beyond double precision (issue 11, item 7).

Every "Why" example of the issue's item 7 has a test here: short segments beside long ones,
neighbouring segments of very different stiffness, springs far stiffer than the member, values
outside what double precision can compute with, and a many-segment column solved on the banded
path.  Exact answers come from the characteristic equation of a stepped column derived below, or
from the Euler load.
"""

from __future__ import annotations

import math
import warnings

import pytest
from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st
from scipy.optimize import brentq

from fea import FREE, RIGID, Column, PointLoad, Restraint, Segment, buckling
from fea.assemble import Assembled
from fea.errors import ModelError
from fea.model.column import MAX_MAGNITUDE, MIN_MAGNITUDE
from fea.solve.solvable import rigid_body_mechanism

E = 210e9
I0 = 1e-5


@pytest.fixture(autouse=True)
def _numpy_warnings_are_errors():
    """No numpy warning may reach the user: every test here fails on one."""
    with warnings.catch_warnings():
        warnings.simplefilter("error", RuntimeWarning)
        yield


def pinned(segments: tuple[Segment, ...], P: float = 1.0) -> Column:
    H = math.fsum(s.length for s in segments)
    return Column(segments=segments, restraints=(Restraint(0.0, RIGID), Restraint(H, RIGID)),
                  point_loads=(PointLoad(H, P),))


def stepped_exact(EI1: float, a: float, EI2: float, b: float) -> float:
    """Lowest critical load of a pinned-pinned two-segment column loaded at the top.

    With no lateral reactions the bending moment is ``P w`` throughout, so ``EI_i w'' + P w = 0`` in
    each part: ``w_1 = A sin(k_1 x)`` from the base, ``w_2 = B sin(k_2 (H - x))`` from the top,
    ``k_i = sqrt(P / EI_i)``.  Continuity of ``w`` and ``w'`` at the step gives
    ``sin(k_1 a) cos(k_2 b) / k_1 + cos(k_1 a) sin(k_2 b) / k_2 = 0`` (free of poles), whose lowest
    root is found by a geometric scan up to the Euler load of the weaker part at the shorter length,
    then bisection.
    """
    def g(P: float) -> float:
        k1, k2 = math.sqrt(P / EI1), math.sqrt(P / EI2)
        return math.sin(k1 * a) * math.cos(k2 * b) / k1 + math.cos(k1 * a) * math.sin(k2 * b) / k2

    top = math.pi**2 * min(EI1, EI2) / min(a, b) ** 2
    n = 4000
    prev_P = top * 1e-16
    prev = g(prev_P)
    for i in range(1, n + 1):
        P = top * 10.0 ** (-16.0 * (1.0 - i / n))  # geometric scan: the lowest root may be far below ``top``
        cur = g(P)
        if (cur > 0) != (prev > 0):
            return brentq(g, prev_P, P, xtol=1e-300, rtol=1e-15)
        prev_P, prev = P, cur
    raise AssertionError("no root found")  # pragma: no cover


# -- neighbouring segments of very different stiffness -------------------------------------------------

@pytest.mark.parametrize("ratio", [1e2, 1e4, 1e6, 1e8])
def test_lower_half_far_more_flexible_matches_exact(ratio):
    col = pinned((Segment(2.0, E / ratio, I0), Segment(2.0, E, I0)))
    res = buckling(col, n_modes=1)
    exact = stepped_exact(E / ratio * I0, 2.0, E * I0, 2.0)
    assert res.load_factor == pytest.approx(exact, rel=1e-6)
    # not misreported as a near-mechanism held by soft restraints
    assert not any("very soft" in w for w in res.warnings)


def test_upper_part_acting_as_rigid_matches_the_limit_case():
    # upper part 1e8 times stiffer: the limit is a pinned column of length a whose top is tied to a rigid bar
    # of length b pinned at the top, tan(k a) / k = -b
    a = b = 2.0
    EI1 = E * I0 / 1e8
    y = brentq(lambda y: math.tan(y) + y * b / a, math.pi / 2 + 1e-9, math.pi - 1e-9, xtol=1e-15)
    limit = EI1 * (y / a) ** 2
    res = buckling(pinned((Segment(a, E / 1e8, I0), Segment(b, E, I0))), n_modes=1)
    assert res.load_factor == pytest.approx(limit, rel=2e-6)  # the part is 1e8, not infinitely, stiffer


@pytest.mark.parametrize("ratio", [1e2, 1e8])
def test_upper_half_far_more_flexible_matches_exact(ratio):
    col = pinned((Segment(1.5, E, I0), Segment(2.5, E / ratio, I0)))
    exact = stepped_exact(E * I0, 1.5, E / ratio * I0, 2.5)
    assert buckling(col, n_modes=1).load_factor == pytest.approx(exact, rel=1e-6)


# -- short segments beside long ones -----------------------------------------------------------------------

@pytest.mark.parametrize("short, long", [(0.001, 100.0), (0.0001, 4.0), (4.0, 0.0001)])
def test_short_segment_beside_long_one_is_solved(short, long):
    col = pinned((Segment(short, E, I0), Segment(long, E, I0)))
    euler = math.pi**2 * E * I0 / col.height**2
    res = buckling(col, n_modes=1)
    assert res.load_factor == pytest.approx(euler, rel=1e-6)
    assert not res.warnings


def test_short_stiff_segment_beside_long_flexible_one_matches_exact():
    col = pinned((Segment(0.001, E * 1e3, I0), Segment(100.0, E, I0)))
    exact = stepped_exact(E * 1e3 * I0, 0.001, E * I0, 100.0)
    assert buckling(col, n_modes=1).load_factor == pytest.approx(exact, rel=1e-6)


def test_true_mechanism_with_extreme_segments_is_named():
    segs = (Segment(0.001, E, I0), Segment(100.0, E, I0))
    col = Column(segments=segs, restraints=(Restraint(0.0, RIGID),), point_loads=(PointLoad(100.001, 1.0),))
    with pytest.raises(ModelError, match="rotate as a rigid body about the lateral restraint at 0 m"):
        buckling(col)


# -- springs far stiffer than the member behave as rigid ------------------------------------------------

@pytest.mark.parametrize("ratio", [1e8, 1e12, 1e14, 1e16, 1e18])
def test_stiff_rotational_spring_is_rigid(ratio):
    L = 4.0
    rigid = Column(segments=(Segment(L, E, I0),), restraints=(Restraint(0.0, RIGID, RIGID), Restraint(L, RIGID)),
                   point_loads=(PointLoad(L, 1.0),))
    spring = rigid.with_restraint(0, rotation=ratio * E * I0 / L)
    assert buckling(spring, n_modes=1).load_factor == pytest.approx(buckling(rigid, n_modes=1).load_factor,
                                                                    rel=max(1e-6, 30 / ratio))


@pytest.mark.parametrize("ratio", [1e8, 1e12, 1e14, 1e16, 1e18])
def test_stiff_lateral_spring_is_rigid(ratio):
    L = 4.0
    rigid = Column(segments=(Segment(L, E, I0),), restraints=(Restraint(0.0, RIGID), Restraint(L, RIGID)),
                   point_loads=(PointLoad(L, 1.0),))
    spring = rigid.with_restraint(1, lateral=ratio * E * I0 / L**3)
    assert buckling(spring, n_modes=1).load_factor == pytest.approx(buckling(rigid, n_modes=1).load_factor,
                                                                    rel=max(1e-6, 30 / ratio))


def test_mechanism_test_is_exact_for_stiff_springs():
    col = Column(segments=(Segment(4.0, E, I0),), restraints=(Restraint(0.0, 1e30, 1e30),),
                 point_loads=(PointLoad(4.0, 1.0),))
    assert rigid_body_mechanism(col) is None  # a cantilever on springs: restrained however stiff
    assert buckling(col, n_modes=1).load_factor == pytest.approx(math.pi**2 * E * I0 / 64.0, rel=1e-6)


@pytest.mark.parametrize("restraints, match", [
    ((Restraint(0.0, FREE, RIGID),), "slide sideways"),
    ((Restraint(0.0, RIGID),), "rotate as a rigid body about the lateral restraint at 0 m"),
    ((Restraint(2.0, 1e20),), "rotate as a rigid body about the lateral restraint at 2 m"),
    ((Restraint(0.0, FREE, 1e5), Restraint(4.0, FREE, 1e20)), "slide sideways"),
    ((), "move as a rigid body"),
])
def test_rigid_body_mechanisms_are_named(restraints, match):
    col = Column(segments=(Segment(4.0, E, I0),), restraints=restraints, point_loads=(PointLoad(4.0, 1.0),))
    assert match in (rigid_body_mechanism(col) or "")


# -- values outside what double precision can compute with ------------------------------------------------

@pytest.mark.parametrize("kw, field", [
    (dict(length=1e308), "length"),
    (dict(S=5e-324), "S"),  # denormal
    (dict(S=1e-300), "S"),
    (dict(E=1e200), "E"),
    (dict(I=1e-40), "I"),
    (dict(A=1e35), "A"),
])
def test_magnitudes_beyond_double_precision_are_refused(kw, field):
    args = dict(length=4.0, E=E, I=I0) | kw
    with pytest.raises(ModelError, match=rf"{field}: .* outside the range the analysis can compute with"):
        Segment(**args)


def test_load_and_spring_magnitudes_are_bounded():
    with pytest.raises(ModelError, match="outside the range"):
        PointLoad(4.0, 1e-320)
    with pytest.raises(ModelError, match="outside the range"):
        Restraint(0.0, 1e100)
    Restraint(0.0, RIGID, 1e59)  # stiff springs are accepted up to the stated bound


def test_segment_too_short_for_the_column_is_refused():
    with pytest.raises(ModelError, match="too short to resolve"):
        Column(segments=(Segment(1e-9, E, I0), Segment(100.0, E, I0)))


def test_bounds_are_stated():
    assert (MIN_MAGNITUDE, MAX_MAGNITUDE) == (1e-30, 1e30)


def test_tiny_shear_stiffness_is_refused_with_its_reason():
    col = pinned((Segment(4.0, E, I0, S=1e-30),))
    with pytest.raises(ModelError, match="shear stiffness is too small"):
        buckling(col)


@pytest.mark.parametrize("L, EI_scale, P", [(1e-3, 1e-20, 1e-30), (1e4, 1e15, 1e25), (4.0, 1.0, 1e30)])
def test_extreme_but_valid_magnitudes_solve_without_warnings(L, EI_scale, P):
    col = pinned((Segment(L, E * EI_scale, I0),), P=P)
    exact = math.pi**2 * E * EI_scale * I0 / L**2 / P
    assert buckling(col, n_modes=1).load_factor == pytest.approx(exact, rel=1e-6)


# -- many segments: banded path, no dense copy ---------------------------------------------------------------

def test_two_thousand_segments_solve_banded_without_dense_copies(monkeypatch):
    n, H = 2000, 12.0
    seg = Segment(H / n, E, 8.36e-5)
    col = pinned((seg,) * n)

    def no_dense(self):
        raise AssertionError("a dense copy of a large matrix was made")

    for name in ("K", "K0", "G"):
        monkeypatch.setattr(Assembled, name, property(no_dense))
    res = buckling(col, n_modes=1)  # its time is measured by benchmarks/bench_extreme.py, not asserted
    assert res.solver == "sparse"
    assert res.load_factor == pytest.approx(math.pi**2 * E * 8.36e-5 / col.height**2, rel=1e-6)
    assert not res.warnings
    # segment energy shares follow sin^2 (no round-off noise from the element matrices' cancellation)
    assert res.energy_shares[0, n // 2] == pytest.approx(2.0 / n, rel=1e-3)


# -- invariance of the effective-length factor under scaling -----------------------------------------------

SETTINGS = settings(max_examples=12, deadline=None, suppress_health_check=[HealthCheck.too_slow])


def _k_factors(col: Column) -> list[float]:
    return [s.effective_length_factor for s in buckling(col, n_modes=1).segments]


def _two_segment(f_len: float, f_stiff: float) -> Column:
    segs = (Segment(3.0 * f_len, 2.0 * E * f_stiff, I0), Segment(1.0 * f_len, E * f_stiff, I0))
    H = 4.0 * f_len
    return Column(segments=segs, restraints=(Restraint(0.0, RIGID, 5e6 * f_stiff / f_len), Restraint(H, RIGID)),
                  point_loads=(PointLoad(H, 1.0), PointLoad(3.0 * f_len, 0.5)))


@SETTINGS
@given(st.floats(-8.0, 8.0))
def test_scaling_all_lengths_leaves_k_unchanged(log_f):
    # the rotational spring keeps k L / EI: the scaled column is geometrically similar
    f = 10.0**log_f
    base, scaled = _k_factors(_two_segment(1.0, 1.0)), _k_factors(_two_segment(f, 1.0))
    assert scaled == pytest.approx(base, rel=1e-6)


@SETTINGS
@given(st.floats(-12.0, 12.0))
def test_scaling_all_stiffnesses_leaves_k_unchanged(log_f):
    f = 10.0**log_f
    base, scaled = _k_factors(_two_segment(1.0, 1.0)), _k_factors(_two_segment(1.0, f))
    assert scaled == pytest.approx(base, rel=1e-6)
