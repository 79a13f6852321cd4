"""Second-order elastic analysis of imperfect columns against closed forms.

Every column here is invented test data: a pin-ended steel member, E = 210 GPa,
I = 8e-6 m^4, A = 3e-3 m^2, extreme fibre c = 0.1 m, fy = 355 MPa.
"""

from __future__ import annotations

import math

import numpy as np
import pytest

from fea import RIGID, Column, PointLoad, Restraint, Segment
from fea.errors import CaseError, ModelError
from fea.model.imperfection import (
    AppliedMoment,
    Imperfection,
    LateralActions,
    LateralDistributedLoad,
    LateralPointLoad,
    SegmentSection,
)
from fea.solve.second_order import second_order

E, I, A, C, FY, L = 210e9, 8e-6, 3e-3, 0.1, 355e6, 4.0
W = I / C
PE = math.pi**2 * E * I / L**2  # Euler load, Timoshenko & Gere, Theory of Elastic Stability, eq. (2-3)


def pinned(P=PE, L=L, I=I, A=A) -> Column:
    return Column(segments=(Segment(L, E, I, A=A),), restraints=(Restraint(0.0, RIGID), Restraint(L, RIGID)),
                  point_loads=(PointLoad(L, P),))


def sec(A=A, W=W, fy=FY):
    return [SegmentSection(A=A, W=W, fy=fy)]


def mid_index(r):
    return int(np.argmin(np.abs(r.heights - 0.5 * r.heights[-1])))


# ----------------------------------------------------------------------------- amplification
def test_bow_amplification_pinned():
    e0 = L / 1000
    alphas = np.array([0.1, 0.3, 0.5, 0.7, 0.9])
    r = second_order(pinned(), Imperfection("half-sine", amplitude=e0), load_factors=alphas)
    m = mid_index(r)
    # Timoshenko & Gere, Theory of Elastic Stability, 2nd ed., section 1.11: a half-sine initial bow e0 on a
    # pin-ended column grows to e0 / (1 - P/P_e); the moment P e0 / (1 - P/P_e) is amplified likewise.
    ref = 1.0 / (1.0 - alphas)
    assert np.max(np.abs(r.deflection[:, m] / (e0 * ref) - 1)) < 1e-6
    assert np.max(np.abs(r.deflection_amplification / ref - 1)) < 1e-6
    assert np.max(np.abs(r.moment_amplification / ref - 1)) < 1e-6
    M_mid = np.abs(r.moment).max(axis=1)
    assert np.max(np.abs(M_mid / (alphas * PE * e0 * ref) - 1)) < 1e-6
    assert r.converged and r.discretisation_error <= 1e-6


def test_moment_convergence_rate_is_fourth_order():
    # project property (no outside source): deflections and recovered moments converge as h^4
    e0, lam = L / 1000, 0.6
    exact = lam * PE * e0 / (1 - lam)  # Timoshenko & Gere, section 1.11
    errs = []
    for level in (1, 2, 3):
        r = second_order(pinned(), Imperfection("half-sine", amplitude=e0), load_factors=[lam], min_level=level,
                         tol=0.009)
        errs.append(abs(np.abs(r.moment[0]).max() / exact - 1))
    rates = np.log2(np.array(errs[:-1]) / np.array(errs[1:]))
    assert np.all(np.abs(rates - 4.0) < 0.2), rates


# ----------------------------------------------------------------------------- first yield
@pytest.mark.parametrize("ratio", [250, 500, 1000])
@pytest.mark.parametrize("Lc", [2.0, 4.0, 7.0])
def test_first_yield_equals_perry(ratio, Lc):
    e0 = Lc / ratio
    NE = math.pi**2 * E * I / Lc**2
    col = pinned(P=1.0, L=Lc)  # unit reference load: the load factor is the axial force [N]
    r = second_order(col, Imperfection("half-sine", amplitude=e0), sections=sec())
    # Perry (1886), Robertson (1925): first yield at the smaller root of (fy - s)(s_E - s) = eta s s_E,
    # eta = e0 c / r^2 = e0 A / W, in stresses s = N / A
    eta = e0 * A / W
    sE = NE / A
    b = FY + (1 + eta) * sE
    s = (b - math.sqrt(b * b - 4 * FY * sE)) / 2
    assert r.first_yield_load_factor / (s * A) - 1 == pytest.approx(0.0, abs=1e-5)
    assert r.first_yield_height == pytest.approx(Lc / 2)


# EN 1993-1-1 Table 6.1: imperfection factors of the buckling curves
ALPHA = {"a0": 0.13, "a": 0.21, "b": 0.34, "c": 0.49, "d": 0.76}


def chi_en1993(lam_bar: float, alpha: float) -> float:
    """EN 1993-1-1 clause 6.3.1.2, equation (6.49) with Phi = 0.5 [1 + alpha (lam - 0.2) + lam^2]."""
    phi = 0.5 * (1 + alpha * (lam_bar - 0.2) + lam_bar**2)
    return min(1.0, 1.0 / (phi + math.sqrt(phi**2 - lam_bar**2)))


@pytest.mark.parametrize("curve", list(ALPHA))
@pytest.mark.parametrize("lam_bar", [0.4, 0.8, 1.2, 2.0])
def test_en1993_equivalent_bow_reproduces_chi(curve, lam_bar):
    alpha = ALPHA[curve]
    Lc = math.pi * lam_bar * math.sqrt(E * I / (A * FY))  # lambda_bar = sqrt(A fy / N_cr), EN 1993-1-1 (6.50)
    # EN 1993-1-1 clause 5.3.2(11): e0 = alpha (lambda_bar - 0.2) M_Rk / N_Rk, with the elastic moduli
    # (first-yield criterion): M_Rk / N_Rk = W_el / A
    e0 = alpha * (lam_bar - 0.2) * W / A
    col = pinned(P=A * FY, L=Lc)  # load factor = N / N_pl
    r = second_order(col, Imperfection("half-sine", amplitude=e0), sections=sec())
    chi = chi_en1993(lam_bar, alpha)
    assert r.first_yield_load_factor / chi - 1 == pytest.approx(0.0, abs=1e-5)


def test_secant_formula_equal_end_eccentricities():
    e, P = 0.02, 0.4 * PE
    # a load P at eccentricity e at the top (+P e) and the eccentric bearing at the base (-P e): single curvature
    act = LateralActions(moments=(AppliedMoment(L, P * e), AppliedMoment(0.0, -P * e)))
    r = second_order(pinned(P=P), None, act, sections=sec(), load_factors=[0.25, 0.5, 1.0])
    lam = r.load_factors
    # secant formula (Timoshenko & Gere, Theory of Elastic Stability, ch. 1, eccentric load (section number from
    # memory); any strength-of-materials text): max stress = (P/A) (1 + (e c / r^2) sec((L/2) sqrt(P / EI)))
    Pl = lam * P
    ref = Pl / A * (1 + e * C * A / I / np.cos(L / 2 * np.sqrt(Pl / (E * I))))
    assert np.max(np.abs(r.stress.max(axis=1) / ref - 1)) < 1e-5
    # the eccentricity bows the column away from the line of thrust
    assert r.deflection[-1, mid_index(r)] < 0


def test_uniform_lateral_load_midspan_moment():
    q, P = 2.0e3, 0.5 * PE
    act = LateralActions(distributed=(LateralDistributedLoad(0.0, L, q),))
    r = second_order(pinned(P=P), None, act, load_factors=[0.2, 0.6, 1.0, 1.5])
    u = L / 2 * np.sqrt(r.load_factors * P / (E * I))
    # Timoshenko & Gere, Theory of Elastic Stability, ch. 1, beam-column under uniform load (section from memory):
    # M_max = (q L^2 / 8) * 2 (sec u - 1) / u^2, u = (L/2) sqrt(P / EI)
    ref = r.load_factors * q * L**2 / 8 * 2 * (1 / np.cos(u) - 1) / u**2  # the lateral load scales too
    m = mid_index(r)
    M_mid = r.moment[:, 2 * m - 1]  # top end of the element below mid-height
    assert np.max(np.abs(M_mid / ref - 1)) < 1e-5
    assert np.max(np.abs(np.abs(r.moment).max(axis=1) / ref - 1)) < 1e-5


def test_point_lateral_load_and_permanent_axial_load():
    # a permanent axial load acts at full value at every load factor: with the whole axial load permanent and
    # only the lateral force scaled, the response is linear in the load factor (project property)
    Q = 5e3
    col = Column(segments=(Segment(L, E, I, A=A),), restraints=(Restraint(0.0, RIGID), Restraint(L, RIGID)),
                 point_loads=(PointLoad(L, 0.5 * PE, permanent=True),))
    act = LateralActions(point=(LateralPointLoad(L / 2, Q),))
    r = second_order(col, None, act, load_factors=[1.0, 2.0])
    assert r.moment[1].max() == pytest.approx(2 * r.moment[0].max(), rel=1e-12)
    # midspan point load on a beam-column: M = (Q L / 4) tan(u) / u, u = (L/2) sqrt(P/EI)
    # (Timoshenko & Gere, Theory of Elastic Stability, ch. 1, section number from memory)
    u = L / 2 * math.sqrt(0.5 * PE / (E * I))
    assert r.moment[0].max() / (Q * L / 4 * math.tan(u) / u) - 1 == pytest.approx(0.0, abs=1e-5)


# ----------------------------------------------------------------------------- bow shapes
def braced(n_spans=3):
    Lt = 3.0 * n_spans
    rs = [Restraint(0.0, RIGID)] + [Restraint(3.0 * k, RIGID) for k in range(1, n_spans)] + [Restraint(Lt, RIGID)]
    return Column(segments=(Segment(Lt, E, I, A=A),), restraints=tuple(rs), point_loads=(PointLoad(Lt, 1.0),))


def test_between_restraints_bow_alternates_and_uses_span_length():
    r = second_order(braced(), Imperfection("between-restraints", ratio=1000), load_factors=[0.0])
    x, w0 = r.heights, r.bow
    for k, centre in enumerate((1.5, 4.5, 7.5)):
        i = int(np.argmin(np.abs(x - centre)))
        assert w0[i] == pytest.approx((-1) ** k * 3.0 / 1000, rel=1e-12)


def test_mode_bow_is_scaled_first_mode():
    r = second_order(braced(2), Imperfection("mode", amplitude=0.004), load_factors=[0.0])
    assert np.abs(r.bow).max() == pytest.approx(0.004, rel=1e-12)
    # two equal rigidly braced spans buckle antisymmetrically (project property of the eigen solver)
    assert r.bow[np.argmin(np.abs(r.heights - 1.5))] == pytest.approx(-r.bow[np.argmin(np.abs(r.heights - 4.5))],
                                                                       rel=1e-4)


def test_offsets_bow_passes_through_the_points():
    pts = ((0.0, 0.0), (1.0, 0.002), (2.5, 0.003), (4.0, 0.0))
    r = second_order(pinned(), Imperfection("offsets", offsets=pts), load_factors=[0.0])
    for h, o in pts:
        assert r.bow[int(np.argmin(np.abs(r.heights - h)))] == pytest.approx(o, abs=1e-15)


# ----------------------------------------------------------------------------- errors
def test_negative_bow_is_refused():
    with pytest.raises(ModelError, match=r"imperfection.bow: -0.001 m is negative; expected a bow >= 0"):
        Imperfection("half-sine", amplitude=-0.001)


def test_negative_bow_in_case_file():
    from fea.pipeline import parse_case

    text = CASE_BASE + '\n[imperfection]\nbow = "-5 mm"\n'
    with pytest.raises(CaseError, match=r"imperfection.bow: '-5 mm' is negative"):
        parse_case(text)


def test_unknown_bow_shape():
    with pytest.raises(ModelError, match="is not a bow shape"):
        Imperfection("wavy", amplitude=0.001)


def test_load_factors_at_or_above_critical_are_refused():
    with pytest.raises(ModelError, match="at or above the critical load factor"):
        second_order(pinned(), Imperfection("half-sine", amplitude=0.001), load_factors=[1.2])


def test_no_yield_strength_gives_no_first_yield():
    r = second_order(pinned(), Imperfection("half-sine", amplitude=0.004), sections=sec(fy=None))
    assert r.first_yield_load_factor is None
    assert any("no yield strength" in w for w in r.warnings)


CASE_BASE = """
title = "test post (invented)"
[material]
E = "210 GPa"
fy = "355 MPa"
[[segment]]
length = "4 m"
I_major = "8e6 mm^4"
I_minor = "2e6 mm^4"
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
"""
