"""Thin-walled (Vlasov) beam-column buckling (fea.solve.spatial) against closed forms.

Every section constant here is invented (demo data); where a constant is computed from a shape, the
hand formula is beside it.  Fork ends: u, v and twist held, warping free, at both ends.
"""

from __future__ import annotations

import math

import numpy as np
import pytest
from scipy.optimize import brentq

from fea import RIGID, Column, PointLoad, Restraint, Segment
from fea.assemble import assemble
from fea.errors import ModelError, SolverError
from fea.mesh import build_mesh
from fea.solve.eigen import buckling, solve_assembled
from fea.solve.spatial import (
    AxialLoad,
    OffsetRestraint,
    SpatialColumn,
    SpatialRestraint,
    SpatialSegment,
    critical_moment,
    load_factors_on,
    spatial_buckling,
)

RTOL = 1e-6
TOL = 1e-7  # the solver's own tolerance, well inside RTOL (its round-off floor is about 1e-8)
E, G = 210e9, 81e9
L = 4.0
FORK = dict(u=RIGID, v=RIGID, twist=RIGID)

# An invented doubly symmetric I section: flanges 200 x 15 mm, web 370 x 9 mm (centre lines 385 mm apart).
B, TF, HW, TW = 0.2, 0.015, 0.37, 0.009
HS = HW + TF  # distance between flange centre lines
I_A = 2 * B * TF + HW * TW
I_IY = 2 * B * TF * (HS / 2) ** 2 + TW * HW**3 / 12  # thin-walled, flange self-inertia left out
I_IZ = 2 * TF * B**3 / 12
I_J = (2 * B * TF**3 + HW * TW**3) / 3  # sum of b t^3 / 3 (thin-walled open section)
I_IW = I_IZ * HS**2 / 4  # I_z h^2 / 4 (doubly symmetric I)


def i_segment(length: float = L, **kw) -> SpatialSegment:
    return SpatialSegment(length, E, G, A=I_A, I_y=I_IY, I_z=I_IZ, J=I_J, I_w=I_IW, **kw)


def fork_column(seg: SpatialSegment, loads=(AxialLoad(L, 1.0),), **kw) -> SpatialColumn:
    return SpatialColumn((seg,), (SpatialRestraint(0.0, **FORK), SpatialRestraint(seg.length, **FORK)),
                         loads=loads, **kw)


def first_of(res, kind: str) -> float:
    return float(res.load_factors[[k == kind for k in res.kinds].index(True)])


def test_torsional_buckling_fork_ends():
    # Timoshenko & Gere, Theory of Elastic Stability, 2nd ed., section 5.3 (from memory):
    # N_T = (G J + pi^2 E I_w / L^2) / i0^2, doubly symmetric section, fork ends.
    seg = SpatialSegment(L, E, G, A=I_A, I_y=I_IY, I_z=I_IZ, J=I_J / 20, I_w=I_IW / 5)  # torsionally weak
    res = spatial_buckling(fork_column(seg), n_modes=3, tol=TOL)
    N_T = (G * seg.J + math.pi**2 * E * seg.I_w / L**2) / seg.i0**2
    assert res.kinds[0] == "torsional"
    assert res.load_factors[0] == pytest.approx(N_T, rel=RTOL)
    assert res.converged
    assert res.energy_shares[0, 2] > 1 - 1e-9
    assert res.segment_K[0, 0] == pytest.approx(1.0, rel=1e-5)  # torsional effective length = L


@pytest.mark.parametrize("axis", ["y0", "z0"])
def test_flexural_torsional_monosymmetric(axis):
    # Timoshenko & Gere section 5.3; AISC 360-16 E4 (from memory): the lower root of
    # (N - N_f)(N - N_T) i0^2 - N^2 e0^2 = 0, N_f the flexural load about the axis of symmetry,
    # e0 the shear-centre offset.  An invented channel-like section: shear centre 40 mm off the centroid.
    e0 = 0.04
    seg = SpatialSegment(L, E, G, A=4e-3, I_y=3e-5, I_z=8e-6, J=1.2e-7, I_w=3e-9, **{axis: e0})
    res = spatial_buckling(fork_column(seg), n_modes=2, tol=TOL)
    # offset along y couples twist with v (E I_y); along z with u (E I_z)
    N_f = math.pi**2 * E * (seg.I_y if axis == "y0" else seg.I_z) / L**2
    N_T = (G * seg.J + math.pi**2 * E * seg.I_w / L**2) / seg.i0**2
    i2 = seg.i0**2
    lower = brentq(lambda N: (N - N_f) * (N - N_T) * i2 - N**2 * e0**2, 0.0, min(N_f, N_T))
    got = first_of(res, "flexural-torsional")
    assert got == pytest.approx(lower, rel=RTOL)


def test_flexural_torsional_asymmetric_angle():
    # Timoshenko & Gere section 5.3 (from memory): lowest root of the cubic
    # i0^2 (N - N_y)(N - N_z)(N - N_T) - N^2 y0^2 (N - N_z) - N^2 z0^2 (N - N_y) = 0
    # (N_y, N_z flexural about the major and minor axes).  Invented unequal-angle constants (I_w ~ 0 for an angle).
    seg = SpatialSegment(2.5, E, G, A=1.5e-3, I_y=1.6e-6, I_z=0.45e-6, J=5e-9, I_w=1e-11, y0=0.012, z0=-0.021)
    res = spatial_buckling(fork_column(seg, loads=(AxialLoad(2.5, 1.0),)), n_modes=1, tol=TOL)
    Ny, Nz = (math.pi**2 * E * i / 2.5**2 for i in (seg.I_y, seg.I_z))
    N_T = (G * seg.J + math.pi**2 * E * seg.I_w / 2.5**2) / seg.i0**2

    def cubic(N):
        return seg.i0**2 * (N - Ny) * (N - Nz) * (N - N_T) - N**2 * seg.y0**2 * (N - Nz) - N**2 * seg.z0**2 * (N - Ny)

    lowest = brentq(cubic, 0.0, min(Ny, Nz, N_T))
    assert res.kinds[0] == "flexural-torsional"
    assert res.load_factors[0] == pytest.approx(lowest, rel=RTOL)


def mcr_uniform(seg: SpatialSegment, length: float) -> float:
    """Timoshenko & Gere section 6.2 (from memory): M_cr = (pi/L) sqrt(E I_z G J (1 + pi^2 E I_w / (L^2 G J)))."""
    GJ = G * seg.J
    return math.pi / length * math.sqrt(E * seg.I_z * GJ * (1 + math.pi**2 * E * seg.I_w / (length**2 * GJ)))


def test_lateral_torsional_uniform_moment():
    seg = i_segment(M1=1e5, M2=1e5)
    cm = critical_moment(fork_column(seg), tol=TOL)
    assert cm.moment == pytest.approx(mcr_uniform(seg, L), rel=RTOL)
    assert cm.result.kinds[0] == "lateral-torsional"
    # reversing the moment gives the same M_cr for a doubly symmetric section
    cm2 = critical_moment(fork_column(i_segment(M1=-1e5, M2=-1e5)), tol=TOL)
    assert cm2.moment == pytest.approx(cm.moment, rel=RTOL)


@pytest.mark.parametrize("psi", [-0.75, -0.5, -0.25, 0.0])
def test_moment_gradient_against_salvadori(psi):
    # Salvadori's moment-gradient factor C_b = 1.75 + 1.05 psi + 0.3 psi^2 <= 2.3 (AISC ASD 1989 F1.3, from
    # memory), psi = M_small / M_large, negative in single curvature.  An approximate fit that lies at or a little
    # below exact solutions (conservative) by up to about 7% in single curvature (from memory); checked to that
    # band.  In this module's signs single curvature is M1, M2 of the same sign, so M2 = -psi M1.
    seg = i_segment(M1=1e5, M2=-psi * 1e5)
    cm = critical_moment(fork_column(seg), tol=TOL)
    cb = min(1.75 + 1.05 * psi + 0.3 * psi**2, 2.3)
    assert 0.0 <= cm.moment / mcr_uniform(seg, L) / cb - 1.0 <= 0.07


def test_monosymmetric_uniform_moment():
    # Trahair, Flexural-Torsional Buckling of Structures, 1993, ch. 6 (from memory), in this module's signs
    # (beta_y < 0 when the larger flange is at +z, the flange compressed by positive M):
    # M_cr = N_z [ -beta_y/2 + sqrt(beta_y^2/4 + (G J + pi^2 E I_w / L^2) / N_z) ], N_z = pi^2 E I_z / L^2.
    beta = -0.15
    res = [critical_moment(fork_column(i_segment(beta_y=b, M1=1e5, M2=1e5)), tol=TOL).moment for b in (beta, -beta)]
    Nz = math.pi**2 * E * I_IZ / L**2
    GJe = G * I_J + math.pi**2 * E * I_IW / L**2
    for b, got in zip((beta, -beta), res):
        assert got == pytest.approx(Nz * (-b / 2 + math.sqrt(b * b / 4 + GJe / Nz)), rel=RTOL)
    assert res[0] > res[1]  # larger flange in compression: higher M_cr


def test_restrained_axis_column():
    # Timoshenko & Gere section 5.5 and Bleich, Buckling Strength of Metal Structures, 1952 (both from memory):
    # torsional buckling about a prescribed axis.  One flange held continuously at e from the shear centre gives
    # u = e phi; the energy is then 1/2 int (E I_w + E I_z e^2) phi''^2 + G J phi'^2 - N (i0^2 + e^2) phi'^2, so
    # with fork ends N_cr = (G J + pi^2 (E I_w + E I_z e^2) / L^2) / (i0^2 + e^2).
    e = HS / 2
    seg = i_segment()
    held = OffsetRestraint(0.0, 0.0, e, u=RIGID, to=L)
    res = spatial_buckling(fork_column(seg, offset_restraints=(held,)), n_modes=1, tol=TOL)
    expect = (G * I_J + math.pi**2 * (E * I_IW + E * I_IZ * e**2) / L**2) / (seg.i0**2 + e**2)
    assert res.load_factors[0] == pytest.approx(expect, rel=RTOL)
    assert np.allclose(res.u[0], e * res.phi[0], atol=1e-12)
    # the same point measured from the centroid (doubly symmetric: the same point)
    held_c = OffsetRestraint(0.0, 0.0, e, u=RIGID, to=L, reference="centroid")
    res_c = spatial_buckling(fork_column(seg, offset_restraints=(held_c,)), n_modes=1, tol=TOL)
    assert res_c.load_factors[0] == pytest.approx(res.load_factors[0], rel=1e-12)


def test_restrained_tension_flange_beam():
    # Restrained-axis lateral-torsional buckling (Trahair 1993, from memory), derived as above with
    # u = -a phi (tension flange at z = -a): M_cr = (G J + pi^2 (E I_w + E I_z a^2) / L^2) / (2 a).
    a = HS / 2
    seg = i_segment(M1=1e5, M2=1e5)
    held = OffsetRestraint(0.0, 0.0, -a, u=RIGID, to=L)
    cm = critical_moment(fork_column(seg, offset_restraints=(held,)), tol=TOL)
    assert cm.moment == pytest.approx((G * I_J + math.pi**2 * (E * I_IW + E * I_IZ * a * a) / L**2) / (2 * a),
                                      rel=RTOL)
    # the compression flange held continuously: no lateral-torsional buckling under this moment (a sign check)
    held_top = OffsetRestraint(0.0, 0.0, a, u=RIGID, to=L)
    with pytest.raises(SolverError):
        critical_moment(fork_column(seg, offset_restraints=(held_top,)), tol=TOL)


def _plane_pair(I: float, k_mid: float):
    """A three-segment pinned column with a mid spring and a rotational spring at the base, in both models."""
    lengths = (1.5, 2.0, 1.0)
    H = sum(lengths)
    plane = Column(segments=tuple(Segment(x, E, I * f) for x, f in zip(lengths, (1.0, 1.3, 0.8))),
                   restraints=(Restraint(0.0, RIGID, 4e6), Restraint(1.5, k_mid), Restraint(H, RIGID)),
                   point_loads=(PointLoad(H, 1.0), PointLoad(3.5, 0.7)))
    return plane, lengths, H


@pytest.mark.parametrize("axis", ["minor", "major"])
def test_flexural_equals_plane_solver(axis):
    # The plane solver (fea.solve.eigen) on the corresponding fea.model.Column: no torsional coupling for a doubly
    # symmetric section, so the flexural load factors must agree: to 1e-9 on the same mesh (the same cubic
    # Hermite discretisation), and each converged answer within its tolerance of the other.
    I = 2e-6 if axis == "minor" else 3e-6
    plane, lengths, H = _plane_pair(I, 2e5)
    segs = []
    for x, f in zip(lengths, (1.0, 1.3, 0.8)):
        Iu, Iv = (I * f, 1e-3) if axis == "minor" else (1e-3, I * f)
        segs.append(SpatialSegment(x, E, G, A=1e-2, I_y=Iv, I_z=Iu, J=1e-3, I_w=1e-6))
    key, rot = ("u", "rotation_u") if axis == "minor" else ("v", "rotation_v")
    col = SpatialColumn(tuple(segs),
                        (SpatialRestraint(0.0, twist=RIGID, **{key: RIGID, rot: 4e6}),
                         SpatialRestraint(1.5, **{key: 2e5}), SpatialRestraint(H, twist=RIGID, **{key: RIGID})),
                        # the other direction held continuously at the shear centre
                        (OffsetRestraint(0.0, 0.0, 0.0, **{("v" if axis == "minor" else "u"): RIGID}, to=H),),
                        (AxialLoad(H, 1.0), AxialLoad(3.5, 0.7)))
    for level in (0, 2):
        mesh = build_mesh(plane, level)
        ref = solve_assembled(assemble(mesh), 1, "dense")[0][0]
        assert load_factors_on(col, mesh.x, 1)[0] == pytest.approx(ref, rel=1e-9)
    res = spatial_buckling(col, n_modes=1, tol=1e-8)
    assert res.kinds[0] == ("flexural (minor axis)" if axis == "minor" else "flexural (major axis)")
    assert res.load_factors[0] == pytest.approx(buckling(plane, n_modes=1, tol=1e-8).load_factors[0], rel=2e-8)


def test_mesh_convergence_order():
    # Cubic Hermite elements with consistent geometric stiffness: error of order h^4 (common practice).
    seg = i_segment(M1=1e5, M2=0.0)
    res = spatial_buckling(fork_column(seg, loads=(AxialLoad(L, 2e5),)), n_modes=2, tol=1e-7)
    assert res.converged
    assert np.all(np.abs(res.orders - 4.0) < 0.3)
    assert np.all(res.discretisation_errors <= 1e-7)


def test_permanent_load_held():
    # N_perm + lam N_var = N_T (the same critical force with part of it held)
    seg = SpatialSegment(L, E, G, A=I_A, I_y=I_IY, I_z=I_IZ, J=I_J / 20, I_w=I_IW / 5)
    N_T = (G * seg.J + math.pi**2 * E * seg.I_w / L**2) / seg.i0**2
    res = spatial_buckling(fork_column(seg, loads=(AxialLoad(L, 0.4 * N_T, permanent=True), AxialLoad(L, 1.0))),
                           n_modes=1, tol=TOL)
    assert res.load_factors[0] == pytest.approx(0.6 * N_T, rel=RTOL)
    with pytest.raises(ModelError, match="permanent"):
        spatial_buckling(fork_column(seg, loads=(AxialLoad(L, 1.2 * N_T, permanent=True), AxialLoad(L, 1.0))))


def test_errors_name_the_field():
    with pytest.raises(ModelError, match="I_w"):
        SpatialSegment(L, E, G, A=I_A, I_y=I_IY, I_z=I_IZ, J=I_J, I_w=-1.0)
    with pytest.raises(ModelError, match="reference"):
        OffsetRestraint(0.0, 0.0, 0.1, u=RIGID, reference="flange")
    with pytest.raises(ModelError, match="outside"):
        SpatialColumn((i_segment(),), (SpatialRestraint(5.0, u=RIGID),))
    with pytest.raises(ModelError, match="twist"):
        spatial_buckling(SpatialColumn((i_segment(),), (SpatialRestraint(0.0, u=RIGID, v=RIGID),
                                                          SpatialRestraint(L, u=RIGID, v=RIGID)),
                                       loads=(AxialLoad(L, 1.0),)))
    with pytest.raises(ModelError, match="loads"):
        spatial_buckling(fork_column(i_segment(), loads=()))
