"""Elastic critical loads against closed-form and characteristic-equation solutions.

Every reference is named beside its check.  Tolerance: relative error 1e-6 at
the default mesh tolerance (issue 2), unless said otherwise.
"""

from __future__ import annotations

import math

import numpy as np
import pytest
from scipy.optimize import brentq
from scipy.special import jv

from fea import FREE, RIGID, Column, DistributedLoad, Foundation, LeaningLoad, PointLoad, Restraint, Segment, buckling

from .conftest import E_STEEL, I_DEMO, L_DEMO, euler_load, one_segment

RTOL = 1e-6
PE = euler_load(E_STEEL, I_DEMO, L_DEMO)


# -- The four Euler cases: K = 1, 2, 0.6992, 0.5 (Euler; Timoshenko & Gere,
#    Theory of Elastic Stability, 2nd ed., 1961, sections 2.1-2.2).
#    Fixed-pinned: K = pi / 4.4934..., the first positive root of tan x = x
#    (Timoshenko & Gere, section 2.2), solved here rather than rounded.
FIXED_PINNED_K = math.pi / brentq(lambda x: math.tan(x) - x, 4.0, 4.6)


@pytest.mark.parametrize(
    "base, top, K",
    [
        ((RIGID, FREE), (RIGID, FREE), 1.0),          # pinned-pinned
        ((RIGID, RIGID), (FREE, FREE), 2.0),          # cantilever
        ((RIGID, RIGID), (RIGID, FREE), FIXED_PINNED_K),  # fixed-pinned, K = 0.6992
        ((RIGID, RIGID), (RIGID, RIGID), 0.5),        # fixed-fixed
    ],
    ids=["pinned-pinned", "cantilever", "fixed-pinned", "fixed-fixed"],
)
def test_euler_cases(base, top, K):
    res = buckling(one_segment(base=base, top=top))
    assert res.load_factor == pytest.approx(PE / K**2, rel=RTOL)
    assert res.segments[0].effective_length_factor == pytest.approx(K, rel=RTOL)
    assert res.converged and res.discretisation_error <= 1e-6
    assert abs(FIXED_PINNED_K - 0.6992) < 1e-4  # the rounded textbook value


def test_euler_higher_modes_pinned():
    # Pinned-pinned modes: n^2 P_e (Timoshenko & Gere, section 2.1).  The mesh
    # tolerance governs the lowest load factor only; higher modes converge at
    # the same rate but from further away, hence the looser check on them.
    res = buckling(one_segment(), n_modes=3)
    assert res.load_factors[0] == pytest.approx(PE, rel=RTOL)
    np.testing.assert_allclose(res.load_factors, PE * np.array([1, 4, 9]), rtol=1e-4)


# -- Rotational springs at both ends: characteristic equations of the alignment
#    chart in the commentary on AISC 360 Appendix 7 (C-A-7-1 braced, C-A-7-2 sway),
#    with G = (EI/L)_column / (k/2) for a braced column (restraining beams bent
#    in single curvature, 2EI/L) and G = (EI/L)_column / (k/6) for a sway
#    column (beams in double curvature, 6EI/L).
def _braced_K(GA, GB):
    def f(K):
        a = math.pi / K
        return GA * GB / 4 * a**2 + (GA + GB) / 2 * (1 - a / math.tan(a)) + 2 * math.tan(a / 2) / a - 1

    return brentq(f, 0.5 + 1e-9, 1.0 - 1e-9)


def _sway_K(GA, GB):
    def f(K):
        a = math.pi / K
        return (GA * GB * a**2 - 36) / (6 * (GA + GB)) - a / math.tan(a)

    return brentq(f, 1.0 + 1e-9, 20.0)


G_PAIRS = [(0.5, 0.5), (1.0, 3.0), (2.0, 10.0), (0.2, 5.0)]


@pytest.mark.parametrize("GA, GB", G_PAIRS)
def test_alignment_chart_braced(GA, GB):
    EI_L = E_STEEL * I_DEMO / L_DEMO
    col = one_segment(base=(RIGID, 2 * EI_L / GA), top=(RIGID, 2 * EI_L / GB))
    res = buckling(col)
    assert res.segments[0].effective_length_factor == pytest.approx(_braced_K(GA, GB), rel=RTOL)


@pytest.mark.parametrize("GA, GB", G_PAIRS)
def test_alignment_chart_sway(GA, GB):
    EI_L = E_STEEL * I_DEMO / L_DEMO
    col = one_segment(base=(RIGID, 6 * EI_L / GA), top=(FREE, 6 * EI_L / GB))
    res = buckling(col)
    assert res.segments[0].effective_length_factor == pytest.approx(_sway_K(GA, GB), rel=RTOL)


# -- Two-part stepped cantilever, load at the top: tan(k1 l1) tan(k2 l2) = k1/k2,
#    k_i = sqrt(P / E I_i), upper part 1, lower part 2 (Timoshenko & Gere,
#    section 2.8, bar of two different cross sections).
@pytest.mark.parametrize("I_low, I_up, l_low, l_up", [(2e-5, 5e-6, 3.0, 2.0), (1.2e-5, 8e-6, 1.5, 4.5)])
def test_stepped_cantilever(I_low, I_up, l_low, l_up):
    E = E_STEEL
    H = l_low + l_up
    col = Column(
        segments=(Segment(l_low, E, I_low), Segment(l_up, E, I_up)),
        restraints=(Restraint(0.0, RIGID, RIGID),),
        point_loads=(PointLoad(H, 1.0),),
    )

    def f(P):
        k1, k2 = math.sqrt(P / (E * I_up)), math.sqrt(P / (E * I_low))
        return math.tan(k1 * l_up) * math.tan(k2 * l_low) - k1 / k2

    lo = 1e-3 * euler_load(E, I_up, 2 * H)
    hi = euler_load(E, I_up, 2 * l_up) * 0.999999  # below the first pole of tan(k1 l1)
    # the lowest root lies below both poles; bracket it by scanning
    grid = np.linspace(lo, hi, 2000)
    vals = [f(p) for p in grid]
    i = next(j for j in range(len(grid) - 1) if vals[j] < 0 <= vals[j + 1])
    P_exact = brentq(f, grid[i], grid[i + 1], xtol=1e-14, rtol=1e-14)
    assert buckling(col).load_factor == pytest.approx(P_exact, rel=RTOL)


# -- Greenhill: cantilever under its own weight q per unit length,
#    (qL)_cr = (9/4) j^2 EI / L^2 with j the first zero of J_{-1/3}
#    (Greenhill, 1881; Timoshenko & Gere, section 2.10): about 7.837 EI / L^2.
def test_greenhill_self_weight():
    E, I, L = E_STEEL, I_DEMO, 6.0
    j = brentq(lambda x: jv(-1.0 / 3.0, x), 1.5, 2.2)
    qL_exact = 2.25 * j**2 * E * I / L**2
    assert qL_exact * L**2 / (E * I) == pytest.approx(7.837, abs=5e-4)
    col = Column(
        segments=(Segment(L, E, I),),
        restraints=(Restraint(0.0, RIGID, RIGID),),
        distributed_loads=(DistributedLoad(0.0, L, 1.0 / L),),  # total weight 1 N
    )
    assert buckling(col).load_factor == pytest.approx(qL_exact, rel=RTOL)


# -- Pinned column on a Winkler foundation of modulus c:
#    P_cr = min_m (m^2 pi^2 EI / L^2 + c L^2 / (m^2 pi^2)) (Timoshenko & Gere, section 2.10? beam on
#    elastic foundation, Hetenyi; the formula itself is derived from the sine series).
@pytest.mark.parametrize("beta", [0.5, 3.0, 20.0, 150.0])
def test_elastic_foundation(beta):
    E, I, L = E_STEEL, I_DEMO, L_DEMO
    c = beta * math.pi**4 * E * I / L**4
    P_exact = min(m**2 * math.pi**2 * E * I / L**2 + c * L**2 / (m**2 * math.pi**2) for m in range(1, 40))
    col = Column(
        segments=(Segment(L, E, I),),
        restraints=(Restraint(0.0, RIGID), Restraint(L, RIGID)),
        point_loads=(PointLoad(L, 1.0),),
        foundations=(Foundation(0.0, L, c),),
    )
    assert buckling(col).load_factor == pytest.approx(P_exact, rel=RTOL)


# -- Shear flexibility: Engesser, P_cr = P_e / (1 + P_e / S)
#    (Engesser, 1891; Timoshenko & Gere, section 2.16).
@pytest.mark.parametrize("ratio", [0.05, 0.5, 2.0])
def test_engesser_shear(ratio):
    S = PE / ratio
    res = buckling(one_segment(S=S))
    assert res.load_factor == pytest.approx(PE / (1 + PE / S), rel=RTOL)


# -- Fixed-base cantilever stabilising a leaning load Q (leaning columns of
#    height h) at its top, own load P at the top (Yura, 1971, leaning-column
#    concept).  Derived here: with a top lateral spring k_s = -Q/h the
#    deflected shape satisfies EI y'' = P (delta - y) - k_s delta (L - x);
#    y(0) = y'(0) = 0, y(L) = delta give tan(kL) = kL - kP / k_s, k = sqrt(P/EI),
#    i.e. tan(kL) = kL (1 + P h / (Q L)).
@pytest.mark.parametrize("Q_over_P, h", [(0.5, 4.0), (2.0, 3.0), (5.0, 6.0)])
def test_leaning_cantilever(Q_over_P, h):
    E, I, L = E_STEEL, I_DEMO, L_DEMO
    col = Column(
        segments=(Segment(L, E, I),),
        restraints=(Restraint(0.0, RIGID, RIGID),),
        point_loads=(PointLoad(L, 1.0),),
        leaning_loads=(LeaningLoad(L, Q_over_P, h),),
    )
    c = 1 + h / (Q_over_P * L)
    x = brentq(lambda x: math.tan(x) - c * x, 1e-6, math.pi / 2 - 1e-12)
    P_exact = x**2 * E * I / L**2
    assert buckling(col).load_factor == pytest.approx(P_exact, rel=RTOL)


# -- Pinned column with a lateral spring beta at mid-height.  Derived here for
#    the symmetric mode: with midspan spring force F = beta delta,
#    EI y'' + P y = F x / 2 on 0 <= x <= L/2, y(0) = 0, y'(L/2) = 0 give
#    beta (L/2 - tan(u)/k) = 2 P, u = kL/2.  The antisymmetric mode (two half
#    waves) is unaffected: 4 P_e.  They meet at u = pi: beta = 16 pi^2 EI / L^3,
#    which equals Winter's ideal stiffness 2P/L_b for one brace with P the
#    load of the segment between braces, pi^2 EI / L_b^2, L_b = L/2 (Winter, 1960).
def _midbrace(beta):
    return Column(
        segments=(Segment(L_DEMO, E_STEEL, I_DEMO),),
        restraints=(Restraint(0.0, RIGID), Restraint(L_DEMO, RIGID), Restraint(L_DEMO / 2, beta)),
        point_loads=(PointLoad(L_DEMO, 1.0),),
    )


@pytest.mark.parametrize("frac", [0.05, 0.3, 0.7, 0.95])
def test_midheight_spring_symmetric_mode(frac):
    E, I, L = E_STEEL, I_DEMO, L_DEMO
    beta_T = 16 * math.pi**2 * E * I / L**3
    beta = frac * beta_T

    def f(P):
        k = math.sqrt(P / (E * I))
        return beta * (L / 2 - math.tan(k * L / 2) / k) - 2 * P

    P_exact = brentq(f, PE * (1 + 1e-9), 4 * PE * (1 - 1e-12))
    assert buckling(_midbrace(beta)).load_factor == pytest.approx(P_exact, rel=RTOL)


def test_midheight_spring_threshold():
    E, I, L = E_STEEL, I_DEMO, L_DEMO
    beta_T = 16 * math.pi**2 * E * I / L**3
    P_braced = euler_load(E, I, L / 2)  # = 4 P_e
    winter = 2 * P_braced / (L / 2)  # Winter (1960): ideal stiffness 2P/L_b for one brace
    assert winter == pytest.approx(beta_T, rel=1e-12)
    below = buckling(_midbrace(0.98 * beta_T)).load_factor
    at_or_above = buckling(_midbrace(1.02 * beta_T)).load_factor
    assert below < P_braced * (1 - 1e-4)
    assert at_or_above == pytest.approx(P_braced, rel=RTOL)
    assert buckling(_midbrace(RIGID)).load_factor == pytest.approx(P_braced, rel=RTOL)
