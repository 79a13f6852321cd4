"""The fast one-spring study agrees with direct solves and behaves physically."""

from __future__ import annotations

import math

import numpy as np
import pytest
from scipy.optimize import brentq

from fea import RIGID, Column, ModelError, PointLoad, Restraint, Segment, buckling
from fea.solve.one_spring import SpringStudy


def demo_column() -> Column:
    """Invented three-segment column, partially fixed base, loads at the top and the first joint."""
    E = 210e9
    return Column(
        segments=(Segment(3.0, E, 2.0e-5), Segment(2.5, E, 1.2e-5), Segment(2.0, E, 8.0e-6)),
        restraints=(Restraint(0.0, RIGID, 1e6), Restraint(5.5, RIGID), Restraint(7.5, RIGID)),
        point_loads=(PointLoad(7.5, 1.0), PointLoad(3.0, 2.0)),
    )


@pytest.mark.parametrize("kind, index", [("rotation", 0), ("lateral", 1)])
def test_study_matches_direct_solves(kind, index):
    col = demo_column()
    study = SpringStudy.build(col, index, kind, 0.0, math.inf)
    ks = np.array([0.0, 1e3, 1e5, 3e6, 1e8, 1e10, math.inf])
    lam = study.load_factors(ks)
    direct = np.array([buckling(col.with_restraint(index, **{kind: float(k)})).load_factor for k in ks])
    # both are converged to 1e-6; they use different meshes
    np.testing.assert_allclose(lam, direct, rtol=2e-6)
    assert np.all(np.diff(lam) >= -1e-9 * lam[:-1])  # never falls as the spring stiffens


def test_study_is_exact_for_its_own_mesh():
    from fea.assemble import assemble
    from fea.mesh import build_mesh
    from fea.solve.eigen import solve_assembled

    col = demo_column()
    study = SpringStudy.build(col, 0, "rotation", 1e3, 1e9)
    for k in (1e3, 4.4e5, 1e9):
        mesh = build_mesh(col.with_restraint(0, rotation=k), study.mesh_level)
        ref = solve_assembled(assemble(mesh), 1)[0][0]
        assert study.load_factors([k])[0] == pytest.approx(ref, rel=1e-10)


def test_base_spring_sweep_moves_K_from_pinned_to_fixed_pinned():
    # Uniform column, rigid lateral top: K goes from 1.0 (free base rotation) to
    # 0.6992 (rigid), Timoshenko & Gere, Theory of Elastic Stability, section 2.2.
    E, I, L = 210e9, 8e-6, 4.0
    col = Column(segments=(Segment(L, E, I),), restraints=(Restraint(0.0, RIGID, 0.0), Restraint(L, RIGID)),
                 point_loads=(PointLoad(L, 1.0),))
    study = SpringStudy.build(col, 0, "rotation", 0.0, math.inf)
    ks = np.concatenate([[0.0], np.logspace(2, 12, 200), [math.inf]])
    K = math.pi / L * np.sqrt(E * I / study.load_factors(ks))
    assert K[0] == pytest.approx(1.0, rel=1e-6)
    x = brentq(lambda x: math.tan(x) - x, 4.0, 4.6)
    assert K[-1] == pytest.approx(math.pi / x, rel=1e-6)
    assert np.all(np.diff(K) <= 1e-12)


def test_mechanism_in_range_is_reported():
    E, I, L = 210e9, 8e-6, 4.0
    # cantilever whose base rotational spring varies: free rotation leaves a mechanism
    col = Column(segments=(Segment(L, E, I),), restraints=(Restraint(0.0, RIGID, RIGID),),
                 point_loads=(PointLoad(L, 1.0),))
    study = SpringStudy.build(col, 0, "rotation", 1.0, math.inf)
    with pytest.raises(ModelError, match="mechanism"):
        study.load_factors([0.0])
