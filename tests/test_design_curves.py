"""Column curves of the published design methods.

The published tables (EN 1993-1-1 Figure 6.4, AS 4100 Table 6.3.3(3),
BS 5950-1 Table 24, the AISC Manual tables) were not at hand.  Only the few
EN 1993-1-1 values recalled with confidence are used (labelled "from
memory"); everything else is checked through the defining equation of each
method, written independently of the closed-form root the code evaluates:
each curve is the smaller root of a Perry equation, so substituting the
result back must satisfy it.
"""

from __future__ import annotations

import math

import pytest
from hypothesis import example, given, settings
from hypothesis import strategies as st

from fea.design import (
    AS4100_ALPHA_B,
    BS5950_ROBERTSON,
    EN1993_IMPERFECTION,
    aisc360_e3,
    as4100_compression,
    bs5950_compression,
    en1993_buckling,
    en1993_chi,
    en1993_tension,
    equivalent_slenderness,
    perry_robertson,
    rankine_gordon,
    working_stress,
)
from fea.errors import ModelError

rel = pytest.approx
CURVES = ["a0", "a", "b", "c", "d"]


# --------------------------------------------------------------------------
# EN 1993-1-1 6.3.1.2
# --------------------------------------------------------------------------


def test_en1993_imperfection_factors():
    # EN 1993-1-1 Table 6.1
    assert EN1993_IMPERFECTION == {"a0": 0.13, "a": 0.21, "b": 0.34, "c": 0.49, "d": 0.76}


@pytest.mark.parametrize(
    "curve, chi",
    # EN 1993-1-1 Figure 6.4 / the reduction-factor tables derived from
    # Eq. (6.49), at lambda_bar = 1.0; values from memory (4 digits)
    [("a", 0.6656), ("b", 0.5970), ("c", 0.5399), ("d", 0.4671)],
)
def test_en1993_chi_at_unit_slenderness(curve, chi):
    assert en1993_chi(1.0, curve).chi == rel(chi, abs=6e-5)


def test_en1993_hand_calculation_curve_b():
    # EN 1993-1-1 6.3.1.2 Eq. (6.49) by hand: lambda_bar = 1.0, alpha = 0.34:
    # Phi = 0.5 (1 + 0.34 * 0.8 + 1) = 1.136
    # chi = 1 / (1.136 + sqrt(1.136^2 - 1)) = 1 / (1.136 + 0.538976) = 0.597023
    r = en1993_chi(1.0, "b")
    assert r.phi == rel(1.136, rel=1e-12)
    assert r.chi == rel(0.597023, abs=1e-6)
    assert r.alpha == 0.34 and r.clause.startswith("EN 1993-1-1 6.3.1.2")


@pytest.mark.parametrize("curve", CURVES)
def test_en1993_plateau(curve):
    # EN 1993-1-1 6.3.1.2: chi = 1 up to lambda_bar = 0.2
    assert en1993_chi(0.0, curve).chi == 1.0
    assert en1993_chi(0.1, curve).chi == 1.0
    assert en1993_chi(0.2, curve).chi == rel(1.0, abs=1e-15)
    assert en1993_chi(0.2 + 1e-6, curve).chi < 1.0


@settings(max_examples=200, deadline=None)
@given(lam=st.floats(0.2001, 5.0), curve=st.sampled_from(CURVES))
def test_en1993_perry_equation(lam, curve):
    # Eq. (6.49) is the smaller root of the Perry equation
    # (1 - chi)(1 - chi lambda_bar^2) = alpha (lambda_bar - 0.2) chi
    r = en1993_chi(lam, curve)
    lhs = (1 - r.chi) * (1 - r.chi * lam**2)
    assert lhs == rel(r.alpha * (lam - 0.2) * r.chi, rel=1e-9, abs=1e-13)
    assert r.chi * lam**2 < 1.0  # below the Euler curve


@settings(max_examples=200, deadline=None)
@given(lam=st.floats(0.0, 6.0), dl=st.floats(1e-4, 2.0))
def test_en1993_chi_bounds_order_monotone(lam, dl):
    chis = [en1993_chi(lam, c).chi for c in CURVES]
    assert all(0.0 < x <= 1.0 for x in chis)
    assert all(x >= y for x, y in zip(chis, chis[1:]))  # a0 >= a >= b >= c >= d
    for c in CURVES:
        assert en1993_chi(lam + dl, c).chi <= en1993_chi(lam, c).chi
        if lam + dl > 0.2:
            assert en1993_chi(lam + dl, c).chi < en1993_chi(max(lam, 0.2), c).chi


def test_en1993_buckling_resistance():
    A, fy, E, L, I = 5.38e-3, 355e6, 210e9, 4.0, 6.04e-6
    N_cr = math.pi**2 * E * I / L**2
    r = en1993_buckling(A, fy, N_cr, "b", gamma_M1=1.1)
    lam = math.sqrt(A * fy / N_cr)  # EN 1993-1-1 6.3.1.2 (6.50)
    assert r.lambda_bar == rel(lam, rel=1e-14)
    assert r.chi == en1993_chi(lam, "b").chi
    assert r.N_b_Rd == rel(r.chi * A * fy / 1.1, rel=1e-14)  # (6.47)
    assert r.force == r.N_b_Rd and r.stress == rel(r.chi * fy / 1.1, rel=1e-14)
    assert r.N_b_Rd < A * fy


@pytest.mark.parametrize(
    "call, field",
    [
        (lambda: en1993_chi(1.0, "e"), "curve"),
        (lambda: en1993_chi(-0.1, "b"), "lambda_bar"),
        (lambda: en1993_chi(float("nan"), "b"), "lambda_bar"),
        (lambda: en1993_buckling(0.0, 355e6, 1e6, "b"), "A"),
        (lambda: en1993_buckling(1e-3, 355e6, -1.0, "b"), "N_cr"),
    ],
)
def test_en1993_validation(call, field):
    with pytest.raises(ModelError) as e:
        call()
    assert e.value.field == field


# --------------------------------------------------------------------------
# AISC 360-16 / 360-22 E3
# --------------------------------------------------------------------------


def test_aisc_inelastic_branch():
    # AISC 360 E3 (E3-2): Fcr = 0.658^(Fy/Fe) Fy; at Fy/Fe = 1 -> 0.658 Fy
    r = aisc360_e3(1e-3, 345e6, Fe=345e6)
    assert r.clause.endswith("(E3-2)")
    assert r.Fcr == rel(0.658 * 345e6, rel=1e-14)
    assert r.Pn == rel(0.658 * 345e6 * 1e-3, rel=1e-14)
    assert r.phi_Pn == rel(0.90 * r.Pn, rel=1e-14)  # LRFD phi_c = 0.90
    assert r.Pn_over_omega == rel(r.Pn / 1.67, rel=1e-14)  # ASD Omega_c = 1.67


def test_aisc_elastic_branch():
    # AISC 360 E3 (E3-3): Fcr = 0.877 Fe when Fy/Fe > 2.25
    r = aisc360_e3(1e-3, 345e6, Fe=345e6 / 4)
    assert r.clause.endswith("(E3-3)")
    assert r.Fcr == rel(0.877 * 345e6 / 4, rel=1e-14)


def test_aisc_branch_junction_is_nearly_continuous():
    # At Fy/Fe = 2.25: 0.658^2.25 = 0.38995 (E3-2) and 0.877/2.25 = 0.38978
    # (E3-3).  The branches do not meet exactly: the elastic one starts about
    # 0.04 % lower.  Both sides are checked, and the step is that small one.
    Fy = 345e6
    below = aisc360_e3(1.0, Fy, Fe=Fy / 2.25)
    above = aisc360_e3(1.0, Fy, Fe=Fy / 2.25 * (1 - 1e-12))
    assert below.clause.endswith("(E3-2)") and above.clause.endswith("(E3-3)")
    step = (below.Fcr - above.Fcr) / below.Fcr
    assert step == rel(1 - (0.877 / 2.25) / 0.658**2.25, rel=1e-6)
    assert 0.0 < step < 1e-3


def test_aisc_routes_agree():
    Ag, Fy, E, lr = 8e-3, 345e6, 200e9, 90.0
    Fe = math.pi**2 * E / lr**2  # (E3-4)
    a = aisc360_e3(Ag, Fy, E=E, Lc_r=lr)
    b = aisc360_e3(Ag, Fy, Fe=Fe, E=E)
    c = aisc360_e3(Ag, Fy, N_cr=Fe * Ag)
    assert a.Pn == rel(b.Pn, rel=1e-13) and a.Pn == rel(c.Pn, rel=1e-13)
    assert a.slenderness == rel(lr, rel=1e-13)
    with pytest.raises(ModelError):
        aisc360_e3(Ag, Fy, Fe=Fe, N_cr=Fe * Ag)
    with pytest.raises(ModelError) as e:
        aisc360_e3(Ag, Fy, Lc_r=lr)
    assert e.value.field == "E"


@settings(max_examples=100, deadline=None)
@given(ratio=st.floats(1e-3, 50.0))
def test_aisc_never_above_yield_and_decreasing(ratio):
    Fy = 345e6
    r = aisc360_e3(1.0, Fy, Fe=Fy / ratio)
    assert 0.0 < r.Fcr <= Fy
    assert aisc360_e3(1.0, Fy, Fe=Fy / (ratio * 1.01)).Fcr < r.Fcr


# --------------------------------------------------------------------------
# AS 4100 6.3.3
# --------------------------------------------------------------------------


@settings(max_examples=200, deadline=None)
@given(le_r=st.floats(0.0, 300.0), alpha_b=st.sampled_from(AS4100_ALPHA_B), fy=st.floats(200e6, 450e6))
def test_as4100_perry_equation(le_r, alpha_b, fy):
    # AS 4100 6.3.3: alpha_c is the smaller root of
    # (1 - alpha_c)(1 - (lambda/90)^2 alpha_c) = eta alpha_c
    r = as4100_compression(1e-3, fy, alpha_b, le_r=le_r)
    assert r.lambda_n == rel(le_r * math.sqrt(fy / 1e6 / 250), rel=1e-12)
    assert r.alpha_a == rel(2100 * (r.lambda_n - 13.5) / (r.lambda_n**2 - 15.3 * r.lambda_n + 2050), rel=1e-12)
    assert r.lambda_ == rel(r.lambda_n + r.alpha_a * alpha_b, rel=1e-12, abs=1e-12)
    assert 0.0 < r.alpha_c <= 1.0
    if r.lambda_ > 13.5:
        x = (r.lambda_ / 90) ** 2
        lhs = (1 - r.alpha_c) * (1 - x * r.alpha_c)
        assert lhs == rel(r.eta * r.alpha_c, rel=1e-8, abs=1e-12)
    else:
        assert r.alpha_c == 1.0 and r.eta == 0.0
    assert r.Nc == rel(r.alpha_c * r.Ns, rel=1e-14)
    assert r.phi_Nc == rel(0.9 * r.Nc, rel=1e-14)


@settings(max_examples=100, deadline=None)
@given(le_r=st.floats(14.0, 300.0))
def test_as4100_section_constant_order(le_r):
    # larger alpha_b (more residual stress) -> lower capacity (lambda_n > 13.5)
    caps = [as4100_compression(1e-3, 250e6, ab, le_r=le_r).alpha_c for ab in AS4100_ALPHA_B]
    assert all(x >= y for x, y in zip(caps, caps[1:]))


def test_as4100_from_critical_load():
    A, fy, E = 6e-3, 300e6, 200e9
    le_r = 80.0
    N_cr = math.pi**2 * E * A / le_r**2
    r = as4100_compression(A, fy, 0.0, N_cr=N_cr, E=E, kf=0.9, An=5.5e-3)
    assert r.le_r == rel(le_r, rel=1e-13)
    assert r.lambda_n == rel(le_r * math.sqrt(0.9) * math.sqrt(300 / 250), rel=1e-13)
    assert r.Ns == rel(0.9 * 5.5e-3 * fy, rel=1e-14)  # Ns = kf An fy (6.2.1)
    assert equivalent_slenderness(A, N_cr, E) == rel(le_r, rel=1e-13)


@pytest.mark.parametrize(
    "kwargs, field",
    [
        (dict(alpha_b=0.25, le_r=50), "alpha_b"),
        (dict(alpha_b=0.0, le_r=50, kf=1.2), "kf"),
        (dict(alpha_b=0.0), "le_r"),
        (dict(alpha_b=0.0, le_r=50, N_cr=1e6), "le_r"),
    ],
)
def test_as4100_validation(kwargs, field):
    with pytest.raises(ModelError) as e:
        as4100_compression(1e-3, 300e6, **kwargs)
    assert e.value.field == field


# --------------------------------------------------------------------------
# BS 5950-1:2000 Annex C
# --------------------------------------------------------------------------


def test_bs5950_robertson_constants():
    # BS 5950-1:2000 Annex C.2
    assert BS5950_ROBERTSON == {"a": 2.0, "b": 3.5, "c": 5.5, "d": 8.0}


@pytest.mark.parametrize("curve", "abcd")
def test_bs5950_plateau_and_limiting_slenderness(curve):
    py, E = 275e6, 205e9
    lam0 = 0.2 * math.sqrt(math.pi**2 * E / py)  # Annex C.2
    assert bs5950_compression(py, curve, slenderness=0.0).pc == py
    r = bs5950_compression(py, curve, slenderness=0.99 * lam0)
    assert r.lambda0 == rel(lam0, rel=1e-14) and r.eta == 0.0 and r.pc == rel(py, rel=1e-14)
    assert bs5950_compression(py, curve, slenderness=1.01 * lam0).pc < py


@settings(max_examples=200, deadline=None)
@given(lam=st.floats(1.0, 350.0), py=st.floats(235e6, 460e6))
def test_bs5950_perry_equation_and_order(lam, py):
    # Annex C.1: pc is the smaller root of (py - pc)(pE - pc) = eta pE pc
    prev = math.inf
    for curve in "abcd":
        r = bs5950_compression(py, curve, slenderness=lam)
        lhs = (py - r.pc) * (r.pE - r.pc)
        assert lhs == rel(r.eta * r.pE * r.pc, rel=1e-8, abs=1e-12 * py * r.pE)
        assert 0.0 < r.pc <= min(py, r.pE) * (1 + 1e-14)
        assert r.pc <= prev  # a >= b >= c >= d
        prev = r.pc


def test_bs5950_hand_calculation():
    # Annex C by hand for py = 275 N/mm^2, strut curve c, lambda = 100, E = 205 kN/mm^2:
    # pE = pi^2 * 205000 / 100^2 = 202.3269; lambda0 = 0.2 sqrt(pi^2 * 205000 / 275) = 17.1550
    # eta = 5.5 (100 - 17.1550) / 1000 = 0.455648; phi = (275 + 1.455648 * 202.3269) / 2 = 284.7583
    # pc = phi - sqrt(phi^2 - pE py) = 125.24 N/mm^2
    r = bs5950_compression(275e6, "c", slenderness=100.0)
    assert r.pE == rel(202.3269e6, rel=1e-6)
    assert r.lambda0 == rel(17.1550, rel=1e-5)
    assert r.eta == rel(0.455648, rel=1e-5)
    assert r.phi == rel(284.7583e6, rel=1e-6)
    assert r.pc == rel(125.24e6, rel=1e-4)


def test_bs5950_from_critical_load():
    A, E = 4e-3, 205e9
    N_cr = math.pi**2 * E * A / 120.0**2
    r = bs5950_compression(355e6, "b", N_cr=N_cr, A=A)
    assert r.slenderness == rel(120.0, rel=1e-13)
    assert r.force == rel(r.pc * A, rel=1e-14)
    with pytest.raises(ModelError) as e:
        bs5950_compression(355e6, "b", N_cr=N_cr)
    assert e.value.field == "A"
    with pytest.raises(ModelError) as e:
        bs5950_compression(355e6, "a0", slenderness=50)
    assert e.value.field == "curve"


# --------------------------------------------------------------------------
# Classical Perry-Robertson, Rankine-Gordon, working stress, tension
# --------------------------------------------------------------------------


@settings(max_examples=100, deadline=None)
@given(lam=st.floats(1.0, 300.0), c=st.floats(0.0, 0.01))
@example(lam=89.0, c=0.0)  # the root once came out 1e-14 above the Euler stress (rounding), found by hypothesis
def test_perry_robertson_root(lam, c):
    fy, E = 250e6, 200e9
    r = perry_robertson(fy, E, lam, coefficient=c)
    se = math.pi**2 * E / lam**2
    assert r.sigma_e == rel(se, rel=1e-14) and r.eta == rel(c * lam, rel=1e-14)
    # smaller root of (fy - s)(se - s) = eta s se
    assert (fy - r.stress) * (se - r.stress) == rel(r.eta * r.stress * se, rel=1e-7, abs=1e-12 * fy * se)
    assert r.stress <= min(fy, se) * (1 + 1e-14)


def test_perry_robertson_default_and_limits():
    # Robertson's eta = 0.003 L/r is the default
    assert perry_robertson(250e6, 200e9, 100.0).eta == rel(0.3, rel=1e-14)
    # without imperfection the strut reaches min(fy, Euler)
    assert perry_robertson(250e6, 200e9, 200.0, 0.0).stress == rel(math.pi**2 * 200e9 / 200**2, rel=1e-12)
    assert perry_robertson(250e6, 200e9, 50.0, 0.0).stress == rel(250e6, rel=1e-12)
    assert perry_robertson(250e6, 200e9, 0.0).stress == 250e6


def test_rankine_gordon():
    # 1/7500 for mild steel with pinned ends: common practice
    r = rankine_gordon(320e6, 100.0, a=1 / 7500)
    assert r.stress == rel(320e6 / (1 + 10000 / 7500), rel=1e-14)  # = 3/7 fc
    assert r.reduction == rel(3 / 7, rel=1e-14)
    assert rankine_gordon(320e6, 0.0, a=1 / 7500).stress == 320e6
    with pytest.raises(ModelError) as e:
        rankine_gordon(320e6, 100.0, a=0.0)
    assert e.value.field == "a"


def test_working_stress_rule():
    # allowable = min(sigma_allow, sigma_cr / FoS)  (common practice)
    A = 1e-3
    slender = working_stress(A, N_cr=200e3, sigma_allow=150e6, factor_of_safety=2.0)
    assert slender.sigma_cr == rel(200e6) and slender.stress == rel(100e6)
    assert slender.governs == "buckling" and slender.force == rel(100e3)
    stocky = working_stress(A, N_cr=2000e3, sigma_allow=150e6, factor_of_safety=2.0)
    assert stocky.stress == 150e6 and stocky.governs == "material" and stocky.reduction == 1.0
    with pytest.raises(ModelError) as e:
        working_stress(A, N_cr=2000e3, sigma_allow=150e6, factor_of_safety=0.5)
    assert e.value.field == "factor_of_safety"


def test_en1993_tension():
    # EN 1993-1-1 6.2.3(2): N_pl,Rd = A fy / gamma_M0 (6.6); N_u,Rd = 0.9 A_net fu / gamma_M2 (6.7)
    gross = en1993_tension(2e-3, 355e6)
    assert gross.N_t_Rd == rel(2e-3 * 355e6, rel=1e-14) and gross.governs == "gross"
    net = en1993_tension(2e-3, 355e6, A_net=1.6e-3, fu=490e6)
    assert net.N_u_Rd == rel(0.9 * 1.6e-3 * 490e6 / 1.25, rel=1e-14)
    assert net.N_t_Rd == min(net.N_pl_Rd, net.N_u_Rd) and net.governs == "net"
    with pytest.raises(ModelError) as e:
        en1993_tension(2e-3, 355e6, A_net=2.5e-3, fu=490e6)
    assert e.value.field == "A_net"
    with pytest.raises(ModelError):
        en1993_tension(2e-3, 355e6, A_net=1.6e-3)
