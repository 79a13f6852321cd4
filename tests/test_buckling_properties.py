"""Physical invariants of the elastic buckling solution (property-based, hypothesis)."""

from __future__ import annotations

import math

import numpy as np
import pytest
from hypothesis import HealthCheck, assume, given, settings
from hypothesis import strategies as st

from fea import FREE, RIGID, Column, PointLoad, Restraint, Segment, buckling
from fea.assemble import assemble
from fea.mesh import build_mesh
from fea.solve.eigen import roundoff_floor, solve_assembled

SETTINGS = settings(max_examples=25, deadline=None, suppress_health_check=[HealthCheck.too_slow])

springs = st.one_of(st.just(FREE), st.just(RIGID), st.floats(1e3, 1e9))
lengths = st.floats(0.5, 5.0)
inertias = st.floats(1e-6, 5e-5)


@st.composite
def columns(draw, n_max=3):
    """Random stable columns: 1-3 segments, springs at base, top and one joint, top load only."""
    n = draw(st.integers(1, n_max))
    segs = tuple(Segment(draw(lengths), 210e9, draw(inertias)) for _ in range(n))
    H = sum(s.length for s in segs)
    base = Restraint(0.0, RIGID, draw(springs))
    top = Restraint(H, draw(springs), draw(springs))
    rest = [base, top]
    if n > 1:
        rest.append(Restraint(segs[0].length, draw(springs), draw(springs)))
    col = Column(segments=segs, restraints=tuple(rest), point_loads=(PointLoad(H, 1.0),))
    return col


def lam1(col: Column) -> float:
    return buckling(col, n_modes=1).load_factor


def _stable(col: Column) -> bool:
    try:
        buckling(col, n_modes=1)
        return True
    except Exception:
        return False


@SETTINGS
@given(columns(), st.data())
def test_stiffening_a_spring_never_lowers_the_load_factor(col, data):
    # Rayleigh quotient argument: K grows by a positive semidefinite term.
    assume(_stable(col))
    i = data.draw(st.integers(0, len(col.restraints) - 1))
    kind = data.draw(st.sampled_from(["lateral", "rotation"]))
    old = getattr(col.restraints[i], kind)
    new = RIGID if old > 1e12 else old * data.draw(st.floats(1.5, 100.0)) + data.draw(st.floats(1e3, 1e7))
    stiffer = col.with_restraint(i, **{kind: new})
    assert lam1(stiffer) >= lam1(col) * (1 - 2e-6)


@SETTINGS
@given(columns(), st.floats(0.1, 10.0))
def test_load_factor_scales_with_E_when_springs_scale_too(col, f):
    # Uniform scaling of every stiffness (E and springs) scales every load factor by the same factor.
    assume(_stable(col))
    scaled = Column(
        segments=tuple(Segment(s.length, s.E * f, s.I) for s in col.segments),
        restraints=tuple(Restraint(r.at, r.lateral * f, r.rotation * f) for r in col.restraints),
        point_loads=col.point_loads,
    )
    assert lam1(scaled) == pytest.approx(f * lam1(col), rel=3e-6)


@SETTINGS
@given(st.floats(0.5, 10.0), st.floats(0.2, 5.0), inertias,
       st.sampled_from([(RIGID, FREE, RIGID, FREE), (RIGID, RIGID, FREE, FREE), (RIGID, RIGID, RIGID, RIGID)]))
def test_uniform_column_scales_with_inverse_length_squared(L, f, I, ends):
    bl, br, tl, tr = ends

    def col(length):
        return Column(segments=(Segment(length, 210e9, I),),
                      restraints=(Restraint(0.0, bl, br), Restraint(length, tl, tr)),
                      point_loads=(PointLoad(length, 1.0),))

    assert lam1(col(L * f)) == pytest.approx(lam1(col(L)) / f**2, rel=3e-6)


@SETTINGS
@given(columns())
def test_turning_end_for_end_leaves_it_unchanged(col):
    # Top load only: the axial force is the same in every segment, so the
    # reversed column (segments reversed, restraints mirrored) is the same problem.
    assume(_stable(col))
    flipped = col.reversed()
    assert lam1(flipped) == pytest.approx(lam1(col), rel=3e-6)


@SETTINGS
@given(columns())
def test_refining_the_mesh_never_raises_it(col):
    # Conforming Rayleigh-Ritz discretisation: nested meshes give upper bounds
    # that fall monotonically.
    # Exact in arithmetic; in floating point it holds to within the round-off
    # floor the solver reports (large only for near-mechanisms, where a
    # very soft spring alone holds a rigid-body motion).
    assume(_stable(col))
    lams, floors = [], []
    for level in range(4):
        asm = assemble(build_mesh(col, level))
        lam, vec, _ = solve_assembled(asm, 1)
        lams.append(lam[0])
        floors.append(roundoff_floor(asm, vec[:, 0]))
    assert all(b <= a * (1 + max(1e-10, 10 * f)) for a, b, f in zip(lams, lams[1:], floors[1:]))


def test_convergence_rate_is_fourth_order():
    # Cubic elements: the error of the lowest load factor falls as h^4
    # (upper-bound Rayleigh-Ritz with cubic Hermite shape functions).
    L, E, I = 5.0, 210e9, 1e-5
    col = Column(segments=(Segment(L, E, I),), restraints=(Restraint(0.0, RIGID), Restraint(L, RIGID)),
                 point_loads=(PointLoad(L, 1.0),))
    exact = math.pi**2 * E * I / L**2  # Euler, pinned-pinned
    hs, errs = [], []
    for level in range(0, 4):
        mesh = build_mesh(col, level)
        lam = solve_assembled(assemble(mesh), 1)[0][0]
        hs.append(L / mesh.n_el)
        errs.append((lam - exact) / exact)
    assert all(e > 0 for e in errs)
    slope = np.polyfit(np.log(hs), np.log(errs), 1)[0]
    assert slope == pytest.approx(4.0, abs=0.2)


def test_dense_and_sparse_solvers_agree():
    E = 210e9
    segs = tuple(Segment(1.0 + 0.1 * i, E, 1e-5 * (1 + 0.05 * i)) for i in range(12))
    H = sum(s.length for s in segs)
    col = Column(segments=segs, restraints=(Restraint(0, RIGID, 1e6), Restraint(H, RIGID), Restraint(5.0, 3e5)),
                 point_loads=(PointLoad(H, 1.0), PointLoad(4.0, 0.5)))
    d = buckling(col, n_modes=3, method="dense")
    s = buckling(col, n_modes=3, method="sparse")
    np.testing.assert_allclose(s.load_factors, d.load_factors, rtol=1e-9)
    np.testing.assert_allclose(np.abs(s.modes), np.abs(d.modes), atol=1e-7)
