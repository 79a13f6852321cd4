"""Model validation, error messages and result bookkeeping of the buckling solver."""

from __future__ import annotations

import math

import numpy as np
import pytest

from fea import (
    FREE,
    RIGID,
    Column,
    DistributedLoad,
    Foundation,
    LeaningLoad,
    ModelError,
    PointLoad,
    Restraint,
    Segment,
    SolverError,
    buckling,
)

from .conftest import E_STEEL, I_DEMO, L_DEMO, euler_load, one_segment

PE = euler_load(E_STEEL, I_DEMO, L_DEMO)


@pytest.mark.parametrize("kwargs, field", [
    (dict(length=0.0, E=1e9, I=1e-6), "length"),
    (dict(length=-1.0, E=1e9, I=1e-6), "length"),
    (dict(length=math.inf, E=1e9, I=1e-6), "length"),
    (dict(length=1.0, E=0.0, I=1e-6), "E"),
    (dict(length=1.0, E=1e9, I=math.nan), "I"),
    (dict(length=1.0, E=1e9, I=1e-6, I_top=-1e-6), "I_top"),
    (dict(length=1.0, E=1e9, I=1e-6, S=0.0), "S"),
])
def test_bad_segment_values_are_refused(kwargs, field):
    with pytest.raises(ModelError) as info:
        Segment(**kwargs)
    assert info.value.field == field
    assert "positive" in str(info.value)


def test_negative_spring_refused():
    with pytest.raises(ModelError, match="rotation"):
        Restraint(0.0, RIGID, -5.0)


def test_station_outside_column():
    with pytest.raises(ModelError, match=r"restraint\[1\]\.at: height 5 m is outside the column \(0 to 4 m\)"):
        Column(segments=(Segment(4.0, E_STEEL, I_DEMO),), restraints=(Restraint(0.0, RIGID), Restraint(5.0, RIGID)))


def test_mechanism_no_lateral_restraint():
    col = one_segment(base=(FREE, RIGID), top=(FREE, FREE))
    with pytest.raises(ModelError, match="no lateral restraint: the column can slide sideways"):
        buckling(col)


def test_mechanism_rotation_about_one_support():
    col = one_segment(base=(RIGID, FREE), top=(FREE, FREE))
    with pytest.raises(ModelError, match="rotate as a rigid body about the lateral restraint at 0 m"):
        buckling(col)


def test_no_compression_anywhere():
    col = one_segment(P=-1000.0)
    with pytest.raises(ModelError, match="no compression anywhere"):
        buckling(col)


def test_permanent_load_alone_exceeds_critical():
    col = Column(segments=(Segment(L_DEMO, E_STEEL, I_DEMO),),
                 restraints=(Restraint(0, RIGID), Restraint(L_DEMO, RIGID)),
                 point_loads=(PointLoad(L_DEMO, 1.2 * PE, permanent=True), PointLoad(L_DEMO, 1.0)))
    with pytest.raises(ModelError, match="permanent loads alone exceed the elastic critical load"):
        buckling(col)


def test_only_permanent_loads():
    col = Column(segments=(Segment(L_DEMO, E_STEEL, I_DEMO),),
                 restraints=(Restraint(0, RIGID), Restraint(L_DEMO, RIGID)),
                 point_loads=(PointLoad(L_DEMO, 0.5 * PE, permanent=True),))
    with pytest.raises(ModelError, match="no variable load"):
        buckling(col)


def test_no_positive_load_factor():
    # A variable tension at the top with a permanent compression: the variable
    # part only relieves the column, so no positive load factor exists.
    col = Column(segments=(Segment(L_DEMO, E_STEEL, I_DEMO),),
                 restraints=(Restraint(0, RIGID), Restraint(L_DEMO, RIGID)),
                 point_loads=(PointLoad(L_DEMO, 0.3 * PE, permanent=True), PointLoad(L_DEMO, -1.0)))
    with pytest.raises((SolverError, ModelError), match="no (positive load factor|compression)"):
        buckling(col)


def test_load_factor_multiplies_variable_loads_only():
    # Pinned column: P_perm + lam P_var = P_e (Euler) -> lam = (P_e - P_perm) / P_var
    col = Column(segments=(Segment(L_DEMO, E_STEEL, I_DEMO),),
                 restraints=(Restraint(0, RIGID), Restraint(L_DEMO, RIGID)),
                 point_loads=(PointLoad(L_DEMO, 0.4 * PE, permanent=True), PointLoad(L_DEMO, 1000.0)))
    res = buckling(col)
    assert res.load_factor == pytest.approx((PE - 0.4 * PE) / 1000.0, rel=1e-6)
    seg = res.segments[0]
    assert seg.critical_axial_force == pytest.approx(PE, rel=1e-6)
    assert seg.axial_force == pytest.approx(0.4 * PE + 1000.0)
    assert seg.effective_length_factor == pytest.approx(1.0, rel=1e-6)


def test_mode_normalisation_and_sign():
    res = buckling(one_segment(), n_modes=2)
    for w in res.modes:
        assert np.max(np.abs(w)) == pytest.approx(1.0)
        # the sign: the lowest node whose magnitude is within round-off (1e-9) of the largest is +1, so that an
        # antisymmetric mode (two equal extremes) gets the same sign on every run
        a = np.abs(w)
        assert w[np.argmax(a >= (1 - 1e-9) * a.max())] == pytest.approx(1.0)
    # first mode of a pinned column: a half sine
    x = res.heights
    np.testing.assert_allclose(res.modes[0], np.sin(np.pi * x / L_DEMO), atol=1e-6)


def test_axial_force_carried_to_base_and_K_per_segment():
    # Two segments, load at the step and at the top: the lower segment carries both.
    E, I = E_STEEL, I_DEMO
    col = Column(segments=(Segment(3.0, E, 2 * I), Segment(3.0, E, I)),
                 restraints=(Restraint(0.0, RIGID, RIGID), Restraint(6.0, RIGID)),
                 point_loads=(PointLoad(6.0, 100e3), PointLoad(3.0, 50e3)))
    res = buckling(col)
    lower, upper = res.segments
    assert lower.axial_force == pytest.approx(150e3)
    assert upper.axial_force == pytest.approx(100e3)
    lam = res.load_factor
    for s in (lower, upper):
        assert s.critical_axial_force == pytest.approx(lam * s.axial_force)
        # K is defined by N_cr = pi^2 E I / (K L)^2
        assert euler_load(s.E, s.I_ref, s.effective_length_factor * s.length) == pytest.approx(s.critical_axial_force)
    assert sum(s.energy_share for s in res.segments) == pytest.approx(1.0)


def test_K_flagged_when_segment_barely_takes_part():
    # A stiff lower segment under a slender flagpole top: the lower segment
    # stores almost no bending energy in the mode, so its K is not an answer.
    col = Column(segments=(Segment(3.0, E_STEEL, 1e-3), Segment(3.0, E_STEEL, 1e-6)),
                 restraints=(Restraint(0.0, RIGID, RIGID),),
                 point_loads=(PointLoad(6.0, 1.0),))
    res = buckling(col)
    low, up = res.segments
    assert up.meaningful and not low.meaningful
    assert "little part" in low.note
    assert low.effective_length_factor > 5


def test_K_flagged_when_not_in_compression():
    col = Column(segments=(Segment(3.0, E_STEEL, I_DEMO), Segment(1.0, E_STEEL, I_DEMO)),
                 restraints=(Restraint(0.0, RIGID, RIGID), Restraint(3.0, RIGID)),
                 point_loads=(PointLoad(3.0, 1.0),))
    res = buckling(col)
    assert res.segments[1].effective_length_factor is None
    assert res.segments[1].note == "not in compression"


def test_tapered_segment_matches_fine_stepped_model():
    # Internal consistency: a linearly tapered segment against 64 prismatic
    # steps with the mid-step I (the stepped model converges at O(h^2)).
    E, L, I0, I1 = E_STEEL, 5.0, 2e-5, 5e-6
    tap = Column(segments=(Segment(L, E, I0, I_top=I1, taper_exponent=3.0),),
                 restraints=(Restraint(0.0, RIGID, RIGID),), point_loads=(PointLoad(L, 1.0),))
    n = 64
    ref = tap.segments[0]
    steps = tuple(Segment(L / n, E, float(ref.inertia_at((i + 0.5) * L / n))) for i in range(n))
    stepped = Column(segments=steps, restraints=(Restraint(0.0, RIGID, RIGID),), point_loads=(PointLoad(L, 1.0),))
    assert buckling(tap).load_factor == pytest.approx(buckling(stepped).load_factor, rel=2e-4)
    assert buckling(tap).segments[0].I_ref == I0


def test_foundation_and_distributed_load_over_part_of_height():
    # Pile: foundation over the lower 6 m; self weight over the full height.
    col = Column(segments=(Segment(10.0, E_STEEL, 5e-5),),
                 restraints=(Restraint(0.0, FREE, FREE),),
                 point_loads=(PointLoad(10.0, 1.0),),
                 distributed_loads=(DistributedLoad(0.0, 10.0, 0.01, permanent=True),),
                 foundations=(Foundation(0.0, 6.0, 5e6, 0.0),))
    res = buckling(col)
    assert res.converged
    # bounded by the cantilever fixed at 6 m below and the free-standing 10 m cantilever
    assert euler_load(E_STEEL, 5e-5, 20.0) < res.load_factor < euler_load(E_STEEL, 5e-5, 8.0)


def test_leaning_load_lowers_capacity():
    plain = one_segment(base=(RIGID, RIGID), top=(FREE, FREE))
    leaning = Column(segments=plain.segments, restraints=plain.restraints, point_loads=plain.point_loads,
                     leaning_loads=(LeaningLoad(L_DEMO, 1.0, 4.0),))
    assert buckling(leaning).load_factor < buckling(plain).load_factor


def test_result_reports_convergence():
    res = buckling(one_segment(), tol=1e-8)
    assert res.converged and res.discretisation_error <= 1e-8
    assert "converged" in res.message
    assert res.refinement_levels.size >= 2


@pytest.mark.parametrize("kw, match", [(dict(n_modes=0), "modes"), (dict(tol=0.0), "tolerance"),
                                       (dict(method="magic"), "method")])
def test_bad_options(kw, match):
    with pytest.raises(ModelError, match=match):
        buckling(one_segment(), **kw)


def test_near_mechanism_is_flagged_as_roundoff_limited():
    # A pinned base and a top held only by a rotational spring six orders of
    # magnitude softer than the member: P_cr -> k / L (rigid-body rotation
    # restrained by the spring alone), and the answer is limited by round-off.
    L, k = 1.0, 10.0
    col = Column(segments=(Segment(L, E_STEEL, 3.53e-5),), restraints=(Restraint(0.0, RIGID), Restraint(L, 0.0, k)),
                 point_loads=(PointLoad(L, 1.0),))
    res = buckling(col)
    assert res.load_factor == pytest.approx(k / L, rel=1e-4)
    assert res.roundoff_error > 1e-7
    assert any("round-off" in w for w in res.warnings)
