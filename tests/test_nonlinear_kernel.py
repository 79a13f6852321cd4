"""Tests of the geometrically and materially nonlinear beam-column kernel.

Model conventions used throughout: a column stands on the y axis from (0, 0) to
(0, L); x is lateral.  Pin-ended: u_x, u_y fixed at the base, u_x at the top; the
compressive reference load acts downwards at the top node.
"""

from __future__ import annotations

import numpy as np
import pytest
from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st
from scipy.special import ellipk

from fea.errors import ModelError
from fea.solve.corotational import assemble, make_model
from fea.solve.fibre import fibre_stress, make_elastic_section, make_fibre_section
from fea.solve.pathfollow import trace_path

E_STEEL = 210e9  # EN 1993-1-1 clause 3.2.6(1)
FY_S355 = 355e6  # EN 1993-1-1 Table 3.1, S355, t <= 40 mm


# ----------------------------------------------------------------------------- helpers
def column(n_el, L, bow=0.0):
    """Nodes and connectivity of a column on the y axis with a half-sine bow in x."""
    y = np.linspace(0.0, L, n_el + 1)
    xy0 = np.c_[bow * np.sin(np.pi * y / L), y]
    conn = np.c_[np.arange(n_el), np.arange(1, n_el + 1)]
    return xy0, conn


def pinned(n_el):
    return [0, 1, 3 * n_el]


def top_load(n_el, P):
    F = np.zeros(3 * (n_el + 1))
    F[3 * n_el + 1] = -P
    return F


def i_section_minor(h, b, tf, tw, fy, n_strips=15, rs=0.3):
    """Minor-axis fibres of an invented rolled-I-like section with residual stresses.

    Flanges: ``n_strips`` strips each across the width; web: 2 strips across its
    thickness (it lies on the minor axis).  Residual stress (tension positive):
    linear over each flange from ``-rs fy`` (compression) at the tips to ``s_t`` at
    the flange centre, web uniform ``s_t``; ``s_t`` is solved so that the discrete
    fibre pattern has zero net force (symmetry gives zero moment).
    """
    yf = (np.arange(n_strips) + 0.5) / n_strips * b - b / 2
    af = np.full(n_strips, b * tf / n_strips)
    yw = np.array([-tw / 4, tw / 4])
    aw = np.full(2, (h - 2 * tf) * tw / 2)
    shape = 1.0 - np.abs(yf) / (b / 2)
    s_t = 2 * np.sum(af * rs * fy * (1 - shape)) / (2 * np.sum(af * shape) + aw.sum())
    sf = -rs * fy + (s_t + rs * fy) * shape
    return np.r_[yf, yf, yw], np.r_[af, af, aw], np.r_[sf, sf, np.full(2, s_t)]


def chi_en1993(lam_bar, alpha):
    """Reduction factor, EN 1993-1-1 clause 6.3.1.2, equations (6.49) and phi below it."""
    phi = 0.5 * (1 + alpha * (lam_bar - 0.2) + lam_bar ** 2)
    return min(1.0, 1.0 / (phi + np.sqrt(phi ** 2 - lam_bar ** 2)))


# Invented section: h = 320 mm, b = 160 mm, tf = 11 mm, tw = 7.5 mm; h/b = 2.0 > 1.2 and
# tf <= 40 mm, so EN 1993-1-1 Table 6.2 (rolled I sections) assigns buckling curve b
# (imperfection factor alpha = 0.34, Table 6.1) for the minor axis z-z.
SEC_H, SEC_B, SEC_TF, SEC_TW = 0.320, 0.160, 0.011, 0.0075
ALPHA_CURVE_B = 0.34  # EN 1993-1-1 Table 6.1, curve b


def gmnia_column(lam_bar, n_el=16, **kw):
    y, A, sr = i_section_minor(SEC_H, SEC_B, SEC_TF, SEC_TW, FY_S355)
    Atot = A.sum()
    Iz = np.sum(A * y * y)  # of the fibre model, so lambda_bar matches the model
    # lambda_bar = sqrt(A fy / N_cr), N_cr = pi^2 E I / L^2  =>  L = pi lambda_bar sqrt(E I / (A fy))
    L = np.pi * lam_bar * np.sqrt(E_STEEL * Iz / (Atot * FY_S355))
    xy0, conn = column(n_el, L, bow=L / 1000)
    sec = make_fibre_section(y, A, E_STEEL, FY_S355, n_el, sigma_r=sr)
    opts = dict(fixed=pinned(n_el), initial_step=0.1)
    opts.update(kw)
    return trace_path(xy0, conn, sec, top_load(n_el, Atot * FY_S355), **opts)


# ----------------------------------------------------------------------------- elastica
@pytest.mark.parametrize("perturbation", ["bow", "lateral_force"])
def test_elastica_post_buckling(perturbation):
    n_el, L, EI, EA = 20, 1.0, 1.0, 1e7  # EA / P_cr ~ 1e6: practically inextensible
    Pcr = np.pi ** 2 * EI / L ** 2
    if perturbation == "bow":
        xy0, conn = column(n_el, L, bow=1e-6 * L)
        F = top_load(n_el, Pcr)
    else:
        xy0, conn = column(n_el, L)
        F = top_load(n_el, Pcr)
        F[3 * (n_el // 2)] = 1e-6 * Pcr  # tiny lateral force at mid-height, scaled with the load
    r = trace_path(xy0, conn, make_elastic_section(EA, EI, n_el), F, fixed=pinned(n_el), initial_step=0.1,
                   displacement_limit=(2, np.radians(80.0)), max_steps=300)
    assert r.success and r.status == "displacement_limit", r.message
    alpha = np.abs(r.displacements[:, 2])  # end slope at the base
    assert alpha.max() >= np.radians(80.0)
    sel = alpha >= np.radians(5.0)
    assert sel.sum() >= 20
    p = np.sin(alpha[sel] / 2)
    # Timoshenko & Gere, Theory of Elastic Stability, section 2.7: P / P_cr = (2 K(p) / pi)^2,
    # p = sin(alpha / 2); scipy's ellipk takes the parameter m = p^2.
    ratio_ref = (2 * ellipk(p ** 2) / np.pi) ** 2
    err = np.abs(r.load_factors[sel] / ratio_ref - 1)
    assert err.max() < 1e-3, f"max relative error {err.max():.2e}"
    # mid-height deflection of the elastica f = 2 p / k with k = 2 K / L, i.e. f / L = p / K
    # (Timoshenko & Gere, section 2.7, from memory)
    f_mid = np.abs(r.displacements[sel, 3 * (n_el // 2)] + xy0[n_el // 2, 0])
    f_ref = p / ellipk(p ** 2) * L
    assert np.max(np.abs(f_mid - f_ref) / f_ref) < 2e-3
    assert r.max_residual <= 1e-8


# ----------------------------------------------------------------------------- squash load
def test_short_column_reaches_squash_load():
    n_el, b, d = 8, 0.1, 0.1  # solid 100 x 100 mm square, 20 fibres
    y = (np.arange(20) + 0.5) / 20 * b - b / 2
    A = np.full(20, b * d / 20)
    Atot = A.sum()
    I = np.sum(A * y * y)
    L = np.pi * 0.1 * np.sqrt(E_STEEL * I / (Atot * FY_S355))  # relative slenderness 0.1
    xy0, conn = column(n_el, L, bow=L / 1000)
    sec = make_fibre_section(y, A, E_STEEL, FY_S355, n_el)
    r = trace_path(xy0, conn, sec, top_load(n_el, Atot * FY_S355), fixed=pinned(n_el), initial_step=0.1)
    assert r.success, r.message
    # squash load N_pl = A fy (definition of the plastic resistance in compression, EN 1993-1-1 eq. (6.10))
    assert r.limit_load_factor == pytest.approx(1.0, rel=0.01)
    assert r.limit_load_factor <= 1.0 + 1e-9
    assert r.first_yield_load_factor < r.limit_load_factor
    assert r.yield_fraction[r.limit_index].max() > 0.0


# ----------------------------------------------------------------------------- GMNIA vs EN 1993-1-1
@pytest.mark.parametrize("lam_bar", [0.5, 1.0, 1.5], ids=lambda v: f"lambda_bar={v}")
def test_ultimate_load_against_en1993_curve_b(lam_bar):
    r = gmnia_column(lam_bar)
    assert r.success and r.status == "drop_after_peak", r.message
    # EN 1993-1-1 clause 6.3.1.2 with the curve of Table 6.2 (rolled I, h/b > 1.2, tf <= 40 mm, z-z: curve b)
    chi = chi_en1993(lam_bar, ALPHA_CURVE_B)
    ratio = r.limit_load_factor / chi
    print(f"lambda_bar={lam_bar}: N_u/(A fy) = {r.limit_load_factor:.4f}, chi_b = {chi:.4f}, ratio = {ratio:.4f}")
    assert abs(ratio - 1) < 0.10, (f"lambda_bar={lam_bar}: N_u/(A fy)={r.limit_load_factor:.4f}, chi={chi:.4f}, "
                                   f"ratio={ratio:.4f}")
    assert r.limit_accuracy <= 1e-4
    assert r.first_yield_load_factor is not None and r.first_yield_load_factor < r.limit_load_factor
    lo, hi = r.first_yield_bracket
    assert lo <= r.first_yield_load_factor <= hi
    assert np.all(r.residual_norms <= 1e-8)


def test_mesh_and_step_refinement_of_the_limit_load():
    lims = [gmnia_column(1.0, n_el=n).limit_load_factor for n in (8, 16, 32)]
    d1, d2 = abs(lims[1] - lims[0]), abs(lims[2] - lims[1])
    assert d2 < 0.5 * d1, f"limit loads {lims}"
    assert d2 / lims[2] < 1e-3, f"limit loads {lims}"  # 16 -> 32 elements changes < 0.1 %
    fine = gmnia_column(1.0, n_el=16, initial_step=0.02, max_step=0.05, limit_tol=1e-5)
    assert fine.limit_load_factor == pytest.approx(lims[1], rel=2e-4)


def test_displacement_control_finds_the_same_limit_load():
    a = gmnia_column(1.0, n_el=8)
    b = gmnia_column(1.0, n_el=8, method="displacement", control_dof=3 * 4)
    assert b.success, b.message
    assert b.limit_load_factor == pytest.approx(a.limit_load_factor, rel=2e-4)


# ----------------------------------------------------------------------------- first yield
def test_first_yield_of_a_bowed_elastic_plastic_column():
    n_el, b, d = 16, 0.1, 0.1
    y = (np.arange(40) + 0.5) / 40 * b - b / 2
    A = np.full(40, b * d / 40)
    Atot, I = A.sum(), np.sum(A * y * y)
    W = I / y.max()  # elastic modulus to the outermost fibre centre
    L = 3.0
    e0 = L / 300
    xy0, conn = column(n_el, L, bow=e0)
    sec = make_fibre_section(y, A, E_STEEL, FY_S355, n_el)
    r = trace_path(xy0, conn, sec, top_load(n_el, Atot * FY_S355), fixed=pinned(n_el), initial_step=0.02,
                   max_step=0.002)
    assert r.first_yield_load_factor is not None
    Ncr = np.pi ** 2 * E_STEEL * I / L ** 2
    # first yield of an initially bowed pin-ended column: N/A + N e0 / (1 - N/N_cr) / W = fy, with the
    # amplification 1/(1 - N/N_cr) of a half-sine bow (Timoshenko & Gere, Theory of Elastic Stability,
    # chapter 1, from memory)
    from scipy.optimize import brentq
    Ny = brentq(lambda N: N / Atot + N * e0 / (1 - N / Ncr) / W - FY_S355, 1.0, min(Ncr, Atot * FY_S355) * 0.999999)
    assert r.first_yield_load_factor == pytest.approx(Ny / (Atot * FY_S355), rel=0.01)
    e, ip, f = r.first_yield_location
    assert e in (n_el // 2 - 1, n_el // 2)  # next to mid-height
    assert abs(y[f]) == pytest.approx(y.max())  # an outermost fibre


# ----------------------------------------------------------------------------- honest failures
def test_perfect_column_under_load_control_reports_bifurcation():
    n_el, L, EI, EA = 16, 3.0, 2e6, 4e9
    xy0, conn = column(n_el, L)
    Pcr = np.pi ** 2 * EI / L ** 2  # Euler load (Timoshenko & Gere, chapter 2, from memory)
    r = trace_path(xy0, conn, make_elastic_section(EA, EI, n_el), top_load(n_el, Pcr), fixed=pinned(n_el),
                   method="load", initial_step=0.07, lambda_max=3.0)
    # The straight configuration stays an equilibrium beyond P_cr; load control would follow it.  The
    # kernel sees the tangent turn indefinite while the load still rises and stops instead.
    assert not r.success
    assert r.status == "bifurcation"
    assert r.limit_load_factor is None
    assert r.bifurcation_load_factor == pytest.approx(1.0, rel=0.01)
    assert r.load_factors.max() < 1.0
    assert np.all(r.negative_eigenvalues == 0)


def test_perfect_column_under_arc_length_reports_bifurcation():
    n_el, L, EI, EA = 16, 3.0, 2e6, 4e9
    xy0, conn = column(n_el, L)
    Pcr = np.pi ** 2 * EI / L ** 2
    r = trace_path(xy0, conn, make_elastic_section(EA, EI, n_el), top_load(n_el, Pcr), fixed=pinned(n_el),
                   initial_step=0.07, lambda_max=3.0)
    assert r.status == "bifurcation" and r.limit_load_factor is None and not r.success
    assert r.bifurcation_load_factor == pytest.approx(1.0, rel=0.01)


def test_imperfect_column_under_load_control_stops_at_the_limit():
    r = gmnia_column(1.0, n_el=8, method="load", initial_step=0.05)
    assert r.status == "load_control_limit" and not r.success
    assert r.limit_load_factor is None
    ref = gmnia_column(1.0, n_el=8).limit_load_factor
    # the load-controlled path has a different step history, so its plastic states differ slightly
    # (about 1e-5 relative here); it must approach the arc-length limit from below within that
    assert r.load_factors[-1] <= ref * (1 + 1e-4)
    assert r.load_factors[-1] > 0.999 * ref


# ----------------------------------------------------------------------------- springs and constant loads
def test_lateral_spring_and_lambda_spring_on_a_cantilever():
    n_el, L, EI, EA = 8, 2.0, 1e6, 1e12
    xy0, conn = column(n_el, L)
    n_dof = 3 * (n_el + 1)
    tip = 3 * n_el
    k_c = 3 * EI / L ** 3  # cantilever tip stiffness (standard beam deflection formula, from memory)
    k_s, k_l = 0.5 * k_c, 0.25 * k_c
    Ks = np.zeros((n_dof, n_dof))
    Ks[tip, tip] = k_s
    Ksl = np.zeros((n_dof, n_dof))
    Ksl[tip, tip] = -k_l
    H = 1e-6 * k_c * L  # tiny lateral load: small displacements
    F = np.zeros(n_dof)
    F[tip] = H
    r = trace_path(xy0, conn, make_elastic_section(EA, EI, n_el), F, fixed=[0, 1, 2], K_spring=Ks,
                   K_spring_lambda=Ksl, method="load", initial_step=0.5, lambda_max=2.0)
    assert r.success, r.message
    lam = r.load_factors[1:]
    expected = lam * H / (k_c + k_s - lam * k_l)
    np.testing.assert_allclose(r.displacements[1:, tip], expected, rtol=1e-5)


def test_constant_load_stage_matches_the_proportional_state():
    n_el, L, EI, EA = 10, 3.0, 2e6, 4e9
    xy0, conn = column(n_el, L, bow=L / 500)
    Pcr = np.pi ** 2 * EI / L ** 2
    sec = make_elastic_section(EA, EI, n_el)
    F_lat = np.zeros(3 * (n_el + 1))
    F_lat[3 * (n_el // 2)] = 0.01 * Pcr
    a = trace_path(xy0, conn, sec, F_lat, fixed=pinned(n_el), F_const=top_load(n_el, 0.5 * Pcr),
                   method="load", initial_step=0.5, lambda_max=1.0)
    b = trace_path(xy0, conn, sec, top_load(n_el, 0.5 * Pcr), fixed=pinned(n_el), method="load",
                   initial_step=0.25, lambda_max=1.0)
    assert a.success and b.success
    assert a.load_factors[0] == 0.0
    np.testing.assert_allclose(a.displacements[0], b.displacements[-1], rtol=1e-7, atol=1e-14)
    # the lateral load then adds to the bending: mid-height deflection grows with lambda
    mid = a.displacements[:, 3 * (n_el // 2)]
    assert np.all(np.diff(mid) > 0)


# ----------------------------------------------------------------------------- kernel consistency
@pytest.mark.parametrize("kind", ["elastic", "fibre_hardening", "fibre_perfectly_plastic"])
def test_tangent_matches_finite_differences(kind):
    rng = np.random.default_rng(3)
    n_el = 4
    xy0 = np.c_[0.01 * rng.standard_normal(n_el + 1), np.linspace(0, 2, n_el + 1)]
    conn = np.c_[np.arange(n_el), np.arange(1, n_el + 1)]
    y = np.linspace(-0.1, 0.1, 9)
    A = np.full(9, 1e-3)
    if kind == "elastic":
        sec = make_elastic_section(2e8, 3e5, n_el)
    else:
        sec = make_fibre_section(y, A, 2e11, 3.55e8, n_el, E_t=2e9 if kind == "fibre_hardening" else 0.0)
    m = make_model(xy0, conn, sec)
    state = m.initial_state()
    u = rng.standard_normal(m.n_dof) * np.tile([5e-4, 5e-4, 5e-3], n_el + 1)
    a = assemble(m, u, state)
    if kind != "elastic":
        assert 0 < a.yielding.mean() < 1  # the check covers elastic and yielding fibres
    h = 1e-7
    K_fd = np.empty_like(a.K)
    for j in range(m.n_dof):
        du = np.zeros(m.n_dof)
        du[j] = h
        K_fd[:, j] = (assemble(m, u + du, state, tangent=False).f_int
                      - assemble(m, u - du, state, tangent=False).f_int) / (2 * h)
    assert np.abs(K_fd - a.K).max() < 1e-6 * np.abs(a.K).max()
    np.testing.assert_allclose(a.K, a.K.T, atol=1e-12 * np.abs(a.K).max())


def test_return_mapping_bilinear_law():
    E, fy, Et = 200e9, 300e6, 2e9
    H = E * Et / (E - Et)
    eps = np.linspace(-0.01, 0.01, 41)
    sig, tan, *_ = fibre_stress(eps, 0.0, 0.0, E, fy, H, 0.0)
    # monotonic loading from the virgin state: the bilinear law itself
    ey = fy / E
    expected = np.where(np.abs(eps) <= ey, E * eps, np.sign(eps) * (fy + Et * (np.abs(eps) - ey)))
    np.testing.assert_allclose(sig, expected, rtol=1e-12, atol=1e-3)
    np.testing.assert_allclose(tan, np.where(np.abs(eps) <= ey, E, Et), rtol=1e-12)
    # unloading from eps = 0.01 is elastic with modulus E, re-yielding after a stress range 2 fy (kinematic)
    s1, _, ep, bk, _ = fibre_stress(0.01, 0.0, 0.0, E, fy, H, 0.0)
    s2, t2, *_ = fibre_stress(0.01 - 1e-3, ep, bk, E, fy, H, 0.0)
    assert s2 == pytest.approx(s1 - E * 1e-3) and t2 == E
    s3, t3, *_ = fibre_stress(0.01 - 2 * fy / E - 1e-4, ep, bk, E, fy, H, 0.0)
    assert t3 == pytest.approx(Et) and s3 == pytest.approx(s1 - 2 * fy - Et * 1e-4, rel=1e-9)


def test_fibre_section_that_never_yields_equals_the_elastic_section():
    n_el, L = 10, 4.0
    y = np.linspace(-0.05, 0.05, 11)
    A = np.full(11, 2e-4)
    xy0, conn = column(n_el, L, bow=L / 300)
    fib = make_fibre_section(y, A, E_STEEL, 1e15, n_el)
    ela = make_elastic_section(E_STEEL * A.sum(), E_STEEL * np.sum(A * y * y), n_el)
    P = np.pi ** 2 * E_STEEL * np.sum(A * y * y) / L ** 2
    kw = dict(fixed=pinned(n_el), initial_step=0.1, displacement_limit=(3 * (n_el // 2), 0.4))
    rf = trace_path(xy0, conn, fib, top_load(n_el, P), **kw)
    re = trace_path(xy0, conn, ela, top_load(n_el, P), **kw)
    assert rf.success and re.success
    np.testing.assert_allclose(rf.load_factors, re.load_factors, rtol=1e-9)
    np.testing.assert_allclose(rf.displacements, re.displacements, rtol=1e-7, atol=1e-12)
    assert rf.first_yield_load_factor is None
    assert not np.any(rf.yield_fraction)


# ----------------------------------------------------------------------------- bad input
def _good():
    n_el = 4
    xy0, conn = column(n_el, 2.0, bow=0.002)
    return dict(xy0=xy0, conn=conn, section=make_elastic_section(1e9, 1e6, n_el), F_ref=top_load(n_el, 1e5),
                fixed=pinned(n_el))


@pytest.mark.parametrize("change, field", [
    (dict(xy0=np.zeros((5, 3))), "xy0"),
    (dict(xy0=np.full((5, 2), np.nan)), "xy0"),
    (dict(conn=np.array([[0, 1], [1, 1], [2, 3], [3, 4]])), "conn[1]"),
    (dict(conn=np.array([[0, 1], [1, 2], [2, 3], [3, 9]])), "conn"),
    (dict(xy0=np.c_[np.zeros(5), [0, 1, 1, 2, 3]]), "conn[1]"),
    (dict(section=make_elastic_section(1e9, 1e6, 3)), "section"),
    (dict(F_ref=np.zeros(7)), "F_ref"),
    (dict(F_ref=np.zeros(15)), "F_ref"),
    (dict(fixed=[0, 1, 99]), "fixed"),
    (dict(fixed=[1, 12]), "fixed"),  # mechanism: rigid rotation about the top is free
    (dict(method="newton"), "method"),
    (dict(method="displacement", control_dof=0), "control_dof"),
    (dict(K_spring=np.triu(np.ones((15, 15)))), "K_spring"),
    (dict(K_spring_lambda=np.ones((3, 3))), "K_spring_lambda"),
    (dict(initial_step=-0.1), "initial_step"),
    (dict(max_iter=0), "max_iter"),
    (dict(drop_fraction=1.5), "drop_fraction"),
    (dict(n_ip=5), "n_ip"),
    (dict(displacement_limit=(99, 0.1)), "displacement_limit"),
])
def test_bad_input_raises_model_error(change, field):
    kw = _good()
    kw.update(change)
    args = [kw.pop(k) for k in ("xy0", "conn", "section", "F_ref")]
    with pytest.raises(ModelError) as exc:
        trace_path(*args, **kw)
    assert exc.value.field == field
    assert "\n" not in str(exc.value) and "expected" in str(exc.value)


@pytest.mark.parametrize("kwargs, field", [
    (dict(E=-1.0), "E[0]"),
    (dict(E_t=300e9), "E_t[0]"),
    (dict(area=np.array([1e-3, 0.0, 1e-3])), "area"),
    (dict(sigma_r=np.array([-100e6, 100e6, -100e6])), "sigma_r"),  # net force
    (dict(sigma_r=np.array([-100e6, 0.0, 100e6])), "sigma_r"),  # net moment
    (dict(sigma_r=np.array([-400e6, 800e6, -400e6])), "sigma_r"),  # beyond fy
    (dict(y=np.zeros((2, 3))), "y"),
])
def test_bad_fibre_section_raises_model_error(kwargs, field):
    args = dict(y=np.array([-0.1, 0.0, 0.1]), area=np.full(3, 1e-3), E=200e9, fy=355e6, n_el=4)
    args.update(kwargs)
    with pytest.raises(ModelError) as exc:
        make_fibre_section(args.pop("y"), args.pop("area"), args.pop("E"), args.pop("fy"), args.pop("n_el"), **args)
    assert exc.value.field == field


def test_bad_elastic_section_raises_model_error():
    with pytest.raises(ModelError, match="EI"):
        make_elastic_section(1e9, [1.0, -1.0], 2)
    with pytest.raises(ModelError, match="EA"):
        make_elastic_section(np.ones(3), 1.0, 2)


# ----------------------------------------------------------------------------- properties
@settings(max_examples=15, deadline=None, suppress_health_check=[HealthCheck.too_slow])
@given(phi=st.floats(-np.pi, np.pi), tx=st.floats(-50, 50), ty=st.floats(-50, 50),
       ratio=st.floats(0.05, 0.8), lateral=st.floats(-0.05, 0.05))
def test_elastic_response_independent_of_rigid_placement(phi, tx, ty, ratio, lateral):
    """A cantilever moved and turned as a whole in the plane gives the same (rotated) response."""
    n_el, L, EI, EA = 6, 2.0, 1e6, 1e9
    Pcr_cant = np.pi ** 2 * EI / (4 * L ** 2)
    xy0, conn = column(n_el, L, bow=L / 400)
    sec = make_elastic_section(EA, EI, n_el)
    F = np.zeros(3 * (n_el + 1))
    F[3 * n_el + 1] = -ratio * Pcr_cant
    F[3 * n_el] = lateral * Pcr_cant
    Rm = np.array([[np.cos(phi), -np.sin(phi)], [np.sin(phi), np.cos(phi)]])
    xy_r = xy0 @ Rm.T + np.array([tx, ty])
    F_r = F.reshape(-1, 3).copy()
    F_r[:, :2] = F_r[:, :2] @ Rm.T
    kw = dict(fixed=[0, 1, 2], method="load", initial_step=0.25, lambda_max=1.0)
    a = trace_path(xy0, conn, sec, F, **kw)
    b = trace_path(xy_r, conn, sec, F_r.ravel(), **kw)
    assert a.success and b.success
    np.testing.assert_allclose(a.load_factors, b.load_factors, rtol=1e-12)
    ua = a.displacements.reshape(len(a.load_factors), -1, 3)
    ub = b.displacements.reshape(len(b.load_factors), -1, 3)
    scale = np.abs(ua).max()
    np.testing.assert_allclose(ub[..., :2], ua[..., :2] @ Rm.T, atol=1e-7 * scale)
    np.testing.assert_allclose(ub[..., 2], ua[..., 2], atol=1e-7 * scale)
    np.testing.assert_allclose(b.bending_moment, a.bending_moment, atol=1e-6 * np.abs(a.bending_moment).max())


@settings(max_examples=12, deadline=None, suppress_health_check=[HealthCheck.too_slow])
@given(bow=st.floats(1e-4, 1e-2), k_rel=st.floats(0.0, 2.0), n_el=st.integers(4, 12))
def test_equilibrium_at_every_converged_point(bow, k_rel, n_el):
    """Recomputed residual of every stored point of an arc-length path is at the tolerance."""
    L, EI, EA = 3.0, 2e6, 4e9
    xy0, conn = column(n_el, L, bow=bow * L)
    Pcr = np.pi ** 2 * EI / L ** 2
    n_dof = 3 * (n_el + 1)
    Ks = np.zeros((n_dof, n_dof))
    Ks[3 * (n_el // 2), 3 * (n_el // 2)] = k_rel * Pcr / L  # lateral spring at mid-height
    sec = make_elastic_section(EA, EI, n_el)
    F = top_load(n_el, Pcr)
    fixed = pinned(n_el)
    r = trace_path(xy0, conn, sec, F, fixed=fixed, K_spring=Ks, initial_step=0.1, max_steps=40,
                   displacement_limit=(2, 0.5))
    assert r.success, r.message
    m = make_model(xy0, conn, sec)
    free = np.setdiff1d(np.arange(n_dof), fixed)
    for lam, u, res in zip(r.load_factors, r.displacements, r.residual_norms):
        a = assemble(m, u, None, tangent=False)
        fint = a.f_int + Ks @ u
        R = (lam * F - fint)[free]
        ref = max(np.linalg.norm(lam * F[free]), np.linalg.norm(fint), 1e-3 * np.linalg.norm(F[free]))
        assert np.linalg.norm(R) / ref <= 1e-8
        assert res <= 1e-8
        assert np.all(u[fixed] == 0.0)
