"""Design resistance of axially loaded members by published column curves.

Pure functions, SI units throughout (Pa, m^2, N).  Each returns a frozen
result dataclass carrying the clause label, the slenderness used, the
reduction factor, the resistance and the intermediate values a checker
wants to see.  Every resistance is capped at the material's own limit (the
reduction factor never exceeds 1).

Where a method is written in N/mm^2 (AS 4100 ``sqrt(fy/250)``), the
conversion is done inside the function; inputs are always Pa.
"""

from __future__ import annotations

import math
from dataclasses import dataclass

from fea.errors import ModelError

__all__ = [
    "EN1993_IMPERFECTION",
    "BS5950_ROBERTSON",
    "AS4100_ALPHA_B",
    "equivalent_slenderness",
    "EN1993Chi",
    "EN1993Buckling",
    "en1993_chi",
    "en1993_buckling",
    "AISC360Compression",
    "aisc360_e3",
    "AS4100Compression",
    "as4100_compression",
    "BS5950Compression",
    "bs5950_compression",
    "PerryRobertson",
    "perry_robertson",
    "RankineGordon",
    "rankine_gordon",
    "WorkingStress",
    "working_stress",
    "EN1993Tension",
    "en1993_tension",
]

EN1993_IMPERFECTION: dict[str, float] = {"a0": 0.13, "a": 0.21, "b": 0.34, "c": 0.49, "d": 0.76}
"""Imperfection factors alpha of EN 1993-1-1 Table 6.1, by buckling curve."""

BS5950_ROBERTSON: dict[str, float] = {"a": 2.0, "b": 3.5, "c": 5.5, "d": 8.0}
"""Robertson constants a of BS 5950-1:2000 Annex C.2, by strut curve."""

AS4100_ALPHA_B: tuple[float, ...] = (-1.0, -0.5, 0.0, 0.5, 1.0)
"""Member section constants alpha_b of AS 4100 Table 6.3.3(1)/(2)."""


# --------------------------------------------------------------------------
# validation helpers
# --------------------------------------------------------------------------


def _finite(name: str, value: float) -> float:
    try:
        x = float(value)
    except (TypeError, ValueError):
        raise ModelError(name, f"{value!r} is not a number") from None
    if not math.isfinite(x):
        raise ModelError(name, f"{value!r} is not finite; expected a finite number")
    return x


def _pos(name: str, value: float, unit: str) -> float:
    x = _finite(name, value)
    if x <= 0.0:
        raise ModelError(name, f"{x:g} {unit} is not positive; expected a value > 0")
    return x


def _nonneg(name: str, value: float, unit: str) -> float:
    x = _finite(name, value)
    if x < 0.0:
        raise ModelError(name, f"{x:g} {unit} is negative; expected a value >= 0")
    return x


def _slenderness_source(
    A: float, E: float | None, slenderness: float | None, N_cr: float | None, slenderness_name: str
) -> float:
    """Geometric slenderness L/r from exactly one of (slenderness) or (N_cr with E)."""
    if (slenderness is None) == (N_cr is None):
        raise ModelError(slenderness_name, f"give exactly one of {slenderness_name} and N_cr")
    if slenderness is not None:
        return _nonneg(slenderness_name, slenderness, "(L/r)")
    if E is None:
        raise ModelError("E", "the elastic modulus E is needed to turn N_cr into a slenderness")
    return equivalent_slenderness(A, _pos("N_cr", N_cr, "N"), E)


def equivalent_slenderness(A: float, N_cr: float, E: float) -> float:
    """Geometric slenderness that gives ``N_cr`` by Euler's formula.

    ``L/r = pi sqrt(E A / N_cr)`` (from ``N_cr / A = pi^2 E / (L/r)^2``).

    Parameters
    ----------
    A : float
        Area used with ``N_cr`` [m^2].
    N_cr : float
        Elastic critical force [N].
    E : float
        Elastic modulus [Pa].

    Returns
    -------
    float
        Equivalent slenderness L/r [-].
    """
    A = _pos("A", A, "m^2")
    N_cr = _pos("N_cr", N_cr, "N")
    E = _pos("E", E, "Pa")
    return math.pi * math.sqrt(E * A / N_cr)


# --------------------------------------------------------------------------
# EN 1993-1-1 6.3.1.2
# --------------------------------------------------------------------------


@dataclass(frozen=True, slots=True)
class EN1993Chi:
    """Reduction factor of EN 1993-1-1 6.3.1.2 (Eq. 6.49).

    Attributes
    ----------
    clause : str
    curve : str
        Buckling curve, one of a0, a, b, c, d.
    alpha : float
        Imperfection factor (Table 6.1) [-].
    lambda_bar : float
        Non-dimensional slenderness [-].
    phi : float
        Phi = 0.5 [1 + alpha (lambda_bar - 0.2) + lambda_bar^2] [-].
    chi : float
        Reduction factor, <= 1 [-].
    """

    clause: str
    curve: str
    alpha: float
    lambda_bar: float
    phi: float
    chi: float

    @property
    def slenderness(self) -> float:
        """The slenderness used (lambda_bar) [-]."""
        return self.lambda_bar

    @property
    def reduction(self) -> float:
        """The reduction factor (chi) [-]."""
        return self.chi


def en1993_chi(lambda_bar: float, curve: str) -> EN1993Chi:
    """Flexural buckling reduction factor, EN 1993-1-1 6.3.1.2(1).

    ``Phi = 0.5 [1 + alpha (lambda_bar - 0.2) + lambda_bar^2]``,
    ``chi = 1 / (Phi + sqrt(Phi^2 - lambda_bar^2))``, ``chi <= 1``.  On the
    plateau ``lambda_bar <= 0.2`` chi is 1 (the formula gives exactly 1 at
    0.2 and would exceed 1 below it).

    Parameters
    ----------
    lambda_bar : float
        Non-dimensional slenderness sqrt(A fy / N_cr) [-], >= 0.
    curve : str
        Buckling curve "a0", "a", "b", "c" or "d" (Table 6.2).

    Returns
    -------
    EN1993Chi
    """
    lam = _nonneg("lambda_bar", lambda_bar, "(-)")
    if curve not in EN1993_IMPERFECTION:
        raise ModelError("curve", f"{curve!r} is not an EN 1993-1-1 buckling curve; expected one of a0, a, b, c, d")
    alpha = EN1993_IMPERFECTION[curve]
    phi = 0.5 * (1.0 + alpha * (lam - 0.2) + lam * lam)
    if lam <= 0.2:
        chi = 1.0
    else:
        chi = min(1.0, 1.0 / (phi + math.sqrt(phi * phi - lam * lam)))
    return EN1993Chi("EN 1993-1-1 6.3.1.2 (6.49)", curve, alpha, lam, phi, chi)


@dataclass(frozen=True, slots=True)
class EN1993Buckling:
    """Design buckling resistance of EN 1993-1-1 6.3.1.1 (Eq. 6.47).

    Attributes
    ----------
    clause : str
    curve : str
    alpha, lambda_bar, phi, chi : float
        As in :class:`EN1993Chi` [-].
    N_pl : float
        A fy [N].
    N_cr : float
        Elastic critical force [N].
    gamma_M1 : float
        Partial factor [-].
    stress : float
        chi fy / gamma_M1 [Pa].
    N_b_Rd : float
        chi A fy / gamma_M1 [N].
    """

    clause: str
    curve: str
    alpha: float
    lambda_bar: float
    phi: float
    chi: float
    N_pl: float
    N_cr: float
    gamma_M1: float
    stress: float
    N_b_Rd: float

    @property
    def slenderness(self) -> float:
        """lambda_bar [-]."""
        return self.lambda_bar

    @property
    def reduction(self) -> float:
        """chi [-]."""
        return self.chi

    @property
    def force(self) -> float:
        """N_b,Rd [N]."""
        return self.N_b_Rd


def en1993_buckling(A: float, fy: float, N_cr: float, curve: str, gamma_M1: float = 1.0) -> EN1993Buckling:
    """Flexural buckling resistance N_b,Rd = chi A fy / gamma_M1 (EN 1993-1-1 6.3.1.1).

    ``lambda_bar = sqrt(A fy / N_cr)`` (6.3.1.2(1), Class 1-3 sections; for
    Class 4 pass A_eff as ``A``).

    Parameters
    ----------
    A : float
        Area [m^2].
    fy : float
        Yield strength [Pa].
    N_cr : float
        Elastic critical force for the relevant buckling mode [N].
    curve : str
        Buckling curve "a0", "a", "b", "c" or "d".
    gamma_M1 : float
        Partial factor (1.0 recommended in EN 1993-1-1 6.1 NOTE 2B) [-].

    Returns
    -------
    EN1993Buckling
    """
    A = _pos("A", A, "m^2")
    fy = _pos("fy", fy, "Pa")
    N_cr = _pos("N_cr", N_cr, "N")
    gamma_M1 = _pos("gamma_M1", gamma_M1, "(-)")
    c = en1993_chi(math.sqrt(A * fy / N_cr), curve)
    stress = c.chi * fy / gamma_M1
    return EN1993Buckling(
        "EN 1993-1-1 6.3.1.1 (6.47)", c.curve, c.alpha, c.lambda_bar, c.phi, c.chi,
        A * fy, N_cr, gamma_M1, stress, stress * A,
    )  # fmt: skip


# --------------------------------------------------------------------------
# AISC 360-16 / 360-22 E3
# --------------------------------------------------------------------------


@dataclass(frozen=True, slots=True)
class AISC360Compression:
    """Flexural buckling strength of AISC 360 (2016/2022) section E3.

    Attributes
    ----------
    clause : str
        "(E3-2)" inelastic or "(E3-3)" elastic branch.
    Fy : float
        Yield stress [Pa].
    Fe : float
        Elastic buckling stress [Pa].
    ratio : float
        Fy / Fe [-]; the inelastic branch applies when <= 2.25.
    slenderness : float
        Equivalent Lc/r = pi sqrt(E / Fe) when E is known, else NaN [-].
    reduction : float
        Fcr / Fy [-].
    Fcr : float
        Critical stress [Pa].
    Pn : float
        Nominal strength Fcr Ag [N].
    phi_c : float
        LRFD resistance factor 0.90 [-].
    phi_Pn : float
        LRFD design strength [N].
    omega_c : float
        ASD safety factor 1.67 [-].
    Pn_over_omega : float
        ASD allowable strength [N].
    """

    clause: str
    Fy: float
    Fe: float
    ratio: float
    slenderness: float
    reduction: float
    Fcr: float
    Pn: float
    phi_c: float
    phi_Pn: float
    omega_c: float
    Pn_over_omega: float

    @property
    def stress(self) -> float:
        """Fcr [Pa]."""
        return self.Fcr

    @property
    def force(self) -> float:
        """Pn [N]."""
        return self.Pn


def aisc360_e3(
    Ag: float,
    Fy: float,
    *,
    Fe: float | None = None,
    N_cr: float | None = None,
    E: float | None = None,
    Lc_r: float | None = None,
) -> AISC360Compression:
    """Nominal compressive strength Pn = Fcr Ag, AISC 360-16/-22 E3.

    ``Fy/Fe <= 2.25``: ``Fcr = 0.658^(Fy/Fe) Fy`` (E3-2); otherwise
    ``Fcr = 0.877 Fe`` (E3-3).  The two branches meet only approximately at
    ``Fy/Fe = 2.25`` (0.658^2.25 = 0.38995 vs 0.877/2.25 = 0.38978): the
    elastic branch starts about 0.04 % lower, a small downward step.

    Give the elastic buckling stress by exactly one route: ``Fe`` directly,
    ``N_cr`` (``Fe = N_cr / Ag``) or ``E`` with ``Lc_r`` (``Fe = pi^2 E /
    (Lc/r)^2``, E3-4).

    Parameters
    ----------
    Ag : float
        Gross area [m^2].
    Fy : float
        Specified minimum yield stress [Pa].
    Fe, N_cr, E, Lc_r : float, optional
        Elastic buckling stress [Pa], critical force [N], modulus [Pa],
        effective slenderness Lc/r [-].

    Returns
    -------
    AISC360Compression
    """
    Ag = _pos("Ag", Ag, "m^2")
    Fy = _pos("Fy", Fy, "Pa")
    routes = (Fe is not None) + (N_cr is not None) + (Lc_r is not None)
    if routes != 1:
        raise ModelError("Fe", "give exactly one of Fe, N_cr or Lc_r (with E)")
    if Fe is not None:
        Fe = _pos("Fe", Fe, "Pa")
    elif N_cr is not None:
        Fe = _pos("N_cr", N_cr, "N") / Ag
    else:
        if E is None:
            raise ModelError("E", "the elastic modulus E is needed with Lc_r")
        lr = _pos("Lc_r", Lc_r, "(-)")  # type: ignore[arg-type]
        Fe = math.pi**2 * _pos("E", E, "Pa") / lr**2
    slender = math.pi * math.sqrt(_pos("E", E, "Pa") / Fe) if E is not None else math.nan
    ratio = Fy / Fe
    if ratio <= 2.25:
        Fcr, clause = 0.658**ratio * Fy, "AISC 360 E3 (E3-2)"
    else:
        Fcr, clause = 0.877 * Fe, "AISC 360 E3 (E3-3)"
    Fcr = min(Fcr, Fy)
    Pn = Fcr * Ag
    return AISC360Compression(clause, Fy, Fe, ratio, slender, Fcr / Fy, Fcr, Pn, 0.90, 0.90 * Pn, 1.67, Pn / 1.67)


# --------------------------------------------------------------------------
# AS 4100 6.3.3
# --------------------------------------------------------------------------


@dataclass(frozen=True, slots=True)
class AS4100Compression:
    """Member capacity in axial compression, AS 4100 clause 6.3.3.

    Attributes
    ----------
    clause : str
    le_r : float
        Geometric slenderness le/r [-].
    lambda_n : float
        Modified slenderness (le/r) sqrt(kf) sqrt(fy/250) [-] (fy in MPa).
    alpha_a : float
        2100 (lambda_n - 13.5) / (lambda_n^2 - 15.3 lambda_n + 2050) [-].
    alpha_b : float
        Member section constant [-].
    lambda_ : float
        lambda_n + alpha_a alpha_b [-].
    eta : float
        Imperfection parameter max(0.00326 (lambda - 13.5), 0) [-].
    xi : float
        ((lambda/90)^2 + 1 + eta) / (2 (lambda/90)^2) [-].
    alpha_c : float
        Slenderness reduction factor, <= 1 [-].
    kf : float
        Form factor [-].
    Ns : float
        Nominal section capacity kf An fy [N].
    Nc : float
        Nominal member capacity alpha_c Ns, <= Ns [N].
    phi : float
        Capacity factor 0.9 [-].
    phi_Nc : float
        Design capacity [N].
    """

    clause: str
    le_r: float
    lambda_n: float
    alpha_a: float
    alpha_b: float
    lambda_: float
    eta: float
    xi: float
    alpha_c: float
    kf: float
    Ns: float
    Nc: float
    phi: float
    phi_Nc: float

    @property
    def slenderness(self) -> float:
        """lambda_n [-]."""
        return self.lambda_n

    @property
    def reduction(self) -> float:
        """alpha_c [-]."""
        return self.alpha_c

    @property
    def force(self) -> float:
        """Nc [N]."""
        return self.Nc


def as4100_compression(
    A: float,
    fy: float,
    alpha_b: float,
    *,
    le_r: float | None = None,
    N_cr: float | None = None,
    E: float = 200e9,
    kf: float = 1.0,
    An: float | None = None,
    phi: float = 0.9,
) -> AS4100Compression:
    """Nominal member capacity Nc = alpha_c Ns, AS 4100 6.3.3.

    ``lambda_n = (le/r) sqrt(kf) sqrt(fy/250)`` with fy in MPa;
    ``alpha_a = 2100 (lambda_n - 13.5) / (lambda_n^2 - 15.3 lambda_n + 2050)``;
    ``lambda = lambda_n + alpha_a alpha_b``;
    ``eta = max(0.00326 (lambda - 13.5), 0)``;
    ``xi = ((lambda/90)^2 + 1 + eta) / (2 (lambda/90)^2)``;
    ``alpha_c = xi (1 - sqrt(1 - (90 / (xi lambda))^2))``, capped at 1;
    ``Ns = kf An fy``.  For ``lambda <= 13.5`` (eta = 0) the formula is
    exactly 1, which is returned without evaluating it (it is 0/0 at
    lambda = 0).

    Parameters
    ----------
    A : float
        Gross area [m^2] (used to convert N_cr; also An by default).
    fy : float
        Yield stress [Pa].
    alpha_b : float
        Member section constant, one of -1, -0.5, 0, 0.5, 1.
    le_r : float, optional
        Geometric slenderness le/r [-].
    N_cr : float, optional
        Elastic critical force [N]; then ``le/r = pi sqrt(E / (N_cr/A))``.
    E : float
        Elastic modulus [Pa] (200 GPa in AS 4100).
    kf : float
        Form factor, 0 < kf <= 1.
    An : float, optional
        Net area [m^2]; defaults to A.
    phi : float
        Capacity factor (0.9, AS 4100 Table 3.4).

    Returns
    -------
    AS4100Compression
    """
    A = _pos("A", A, "m^2")
    fy = _pos("fy", fy, "Pa")
    alpha_b = _finite("alpha_b", alpha_b)
    if alpha_b not in AS4100_ALPHA_B:
        raise ModelError("alpha_b", f"{alpha_b:g} is not an AS 4100 section constant; expected -1, -0.5, 0, 0.5 or 1")
    kf = _pos("kf", kf, "(-)")
    if kf > 1.0:
        raise ModelError("kf", f"{kf:g} exceeds 1; expected a form factor 0 < kf <= 1")
    An = A if An is None else _pos("An", An, "m^2")
    phi = _pos("phi", phi, "(-)")
    le_r = _slenderness_source(A, E, le_r, N_cr, "le_r")
    lam_n = le_r * math.sqrt(kf) * math.sqrt(fy / 1e6 / 250.0)
    alpha_a = 2100.0 * (lam_n - 13.5) / (lam_n**2 - 15.3 * lam_n + 2050.0)
    lam = lam_n + alpha_a * alpha_b
    eta = max(0.00326 * (lam - 13.5), 0.0)
    if lam <= 13.5:
        xi = math.inf
        alpha_c = 1.0
    else:
        x = (lam / 90.0) ** 2
        xi = (x + 1.0 + eta) / (2.0 * x)
        alpha_c = min(1.0, xi * (1.0 - math.sqrt(1.0 - (90.0 / (xi * lam)) ** 2)))
    Ns = kf * An * fy
    Nc = alpha_c * Ns
    return AS4100Compression("AS 4100 6.3.3", le_r, lam_n, alpha_a, alpha_b, lam, eta, xi, alpha_c, kf, Ns, Nc, phi, phi * Nc)


# --------------------------------------------------------------------------
# BS 5950-1:2000 Annex C
# --------------------------------------------------------------------------


@dataclass(frozen=True, slots=True)
class BS5950Compression:
    """Compressive strength pc of BS 5950-1:2000 Annex C.

    Attributes
    ----------
    clause : str
    curve : str
        Strut curve a, b, c or d.
    a : float
        Robertson constant [-].
    slenderness : float
        lambda = L_E / r [-].
    py : float
        Design strength [Pa].
    pE : float
        Euler strength pi^2 E / lambda^2 [Pa] (inf at lambda = 0).
    lambda0 : float
        Limiting slenderness 0.2 sqrt(pi^2 E / py) [-].
    eta : float
        Perry factor a (lambda - lambda0) / 1000, >= 0 [-].
    phi : float
        (py + (eta + 1) pE) / 2 [Pa].
    pc : float
        Compressive strength, <= py [Pa].
    reduction : float
        pc / py [-].
    force : float
        pc A when an area was given, else NaN [N].
    """

    clause: str
    curve: str
    a: float
    slenderness: float
    py: float
    pE: float
    lambda0: float
    eta: float
    phi: float
    pc: float
    reduction: float
    force: float

    @property
    def stress(self) -> float:
        """pc [Pa]."""
        return self.pc


def bs5950_compression(
    py: float,
    curve: str,
    *,
    slenderness: float | None = None,
    N_cr: float | None = None,
    A: float | None = None,
    E: float = 205e9,
) -> BS5950Compression:
    """Perry-Robertson strut strength, BS 5950-1:2000 Annex C.1/C.2.

    ``pc = pE py / (phi + sqrt(phi^2 - pE py))``,
    ``phi = (py + (eta + 1) pE) / 2``, ``pE = pi^2 E / lambda^2``,
    ``eta = a (lambda - lambda0) / 1000 >= 0``,
    ``lambda0 = 0.2 sqrt(pi^2 E / py)``; Robertson constant a = 2.0, 3.5,
    5.5, 8.0 for strut curves a, b, c, d.

    Parameters
    ----------
    py : float
        Design strength [Pa].
    curve : str
        Strut curve "a", "b", "c" or "d" (Table 23).
    slenderness : float, optional
        lambda = L_E / r [-].
    N_cr : float, optional
        Elastic critical force [N] instead of ``slenderness``; needs ``A``.
    A : float, optional
        Area [m^2]; gives ``force = pc A``.
    E : float
        Elastic modulus [Pa] (205 GPa in BS 5950-1).

    Returns
    -------
    BS5950Compression
    """
    py = _pos("py", py, "Pa")
    E = _pos("E", E, "Pa")
    if curve not in BS5950_ROBERTSON:
        raise ModelError("curve", f"{curve!r} is not a BS 5950-1 strut curve; expected one of a, b, c, d")
    if A is not None:
        A = _pos("A", A, "m^2")
    elif N_cr is not None:
        raise ModelError("A", "the area A is needed to turn N_cr into a slenderness")
    lam = _slenderness_source(A if A is not None else 1.0, E, slenderness, N_cr, "slenderness")
    a = BS5950_ROBERTSON[curve]
    lam0 = 0.2 * math.sqrt(math.pi**2 * E / py)
    eta = max(a * (lam - lam0) / 1000.0, 0.0)
    if lam == 0.0:
        pE, phi, pc = math.inf, math.inf, py
    else:
        pE = math.pi**2 * E / lam**2
        phi = 0.5 * (py + (eta + 1.0) * pE)
        # (phi - sqrt(phi^2 - pE py)) written without cancellation
        pc = min(py, pE * py / (phi + math.sqrt(max(phi * phi - pE * py, 0.0))))
    force = pc * A if A is not None else math.nan
    return BS5950Compression("BS 5950-1:2000 Annex C", curve, a, lam, py, pE, lam0, eta, phi, pc, pc / py, force)


# --------------------------------------------------------------------------
# Classical Perry-Robertson, Rankine-Gordon, working stress
# --------------------------------------------------------------------------


@dataclass(frozen=True, slots=True)
class PerryRobertson:
    """Classical Perry-Robertson strut stress.

    Attributes
    ----------
    clause : str
    slenderness : float
        L / r [-].
    coefficient : float
        c in eta = c L/r [-].
    eta : float
        Perry imperfection factor [-].
    sigma_e : float
        Euler stress pi^2 E / (L/r)^2 [Pa].
    stress : float
        Failure stress: smaller root of (fy - s)(sigma_e - s) = eta s sigma_e [Pa].
    reduction : float
        stress / fy [-].
    """

    clause: str
    slenderness: float
    coefficient: float
    eta: float
    sigma_e: float
    stress: float
    reduction: float


def perry_robertson(fy: float, E: float, slenderness: float, coefficient: float = 0.003) -> PerryRobertson:
    """Perry-Robertson strut formula with Robertson's eta = c L/r.

    The mean stress ``s`` at first yield of a pin-ended strut with an initial
    half-sine bow satisfies ``(fy - s)(sigma_e - s) = eta s sigma_e``; its
    smaller root is ``s = B - sqrt(B^2 - fy sigma_e)``,
    ``B = (fy + (1 + eta) sigma_e) / 2``, evaluated here as
    ``fy sigma_e / (B + sqrt(B^2 - fy sigma_e))``.  ``c = 0.003`` is
    Robertson's value.

    Parameters
    ----------
    fy : float
        Yield stress [Pa].
    E : float
        Elastic modulus [Pa].
    slenderness : float
        L / r [-], >= 0.
    coefficient : float
        c in eta = c L/r [-], >= 0.

    Returns
    -------
    PerryRobertson
    """
    fy = _pos("fy", fy, "Pa")
    E = _pos("E", E, "Pa")
    lam = _nonneg("slenderness", slenderness, "(L/r)")
    c = _nonneg("coefficient", coefficient, "(-)")
    eta = c * lam
    if lam == 0.0:
        se, s = math.inf, fy
    else:
        se = math.pi**2 * E / lam**2
        B = 0.5 * (fy + (1.0 + eta) * se)
        s = min(fy, fy * se / (B + math.sqrt(max(B * B - fy * se, 0.0))))
    return PerryRobertson("Perry-Robertson (eta = c L/r)", lam, c, eta, se, s, s / fy)


@dataclass(frozen=True, slots=True)
class RankineGordon:
    """Rankine-Gordon strut stress.

    Attributes
    ----------
    clause : str
    slenderness : float
        L / r [-].
    a : float
        Rankine constant [-].
    stress : float
        fc / (1 + a (L/r)^2) [Pa].
    reduction : float
        stress / fc [-].
    """

    clause: str
    slenderness: float
    a: float
    stress: float
    reduction: float


def rankine_gordon(fc: float, slenderness: float, a: float) -> RankineGordon:
    """Rankine-Gordon formula sigma = fc / (1 + a (L/r)^2).

    Parameters
    ----------
    fc : float
        Crushing (or yield) stress [Pa].
    slenderness : float
        L / r [-], >= 0.
    a : float
        Rankine constant [-], > 0 (1/7500 for mild steel, pinned ends, is
        common practice).

    Returns
    -------
    RankineGordon
    """
    fc = _pos("fc", fc, "Pa")
    lam = _nonneg("slenderness", slenderness, "(L/r)")
    a = _pos("a", a, "(-)")
    red = 1.0 / (1.0 + a * lam * lam)
    return RankineGordon("Rankine-Gordon", lam, a, fc * red, red)


@dataclass(frozen=True, slots=True)
class WorkingStress:
    """Working-stress check of a strut.

    Attributes
    ----------
    clause : str
    sigma_cr : float
        Elastic critical stress N_cr / A [Pa].
    factor_of_safety : float
        Factor applied to sigma_cr [-].
    sigma_allow : float
        Material allowable stress [Pa].
    stress : float
        Allowable stress min(sigma_allow, sigma_cr / FoS) [Pa].
    governs : str
        "material" or "buckling".
    reduction : float
        stress / sigma_allow [-].
    force : float
        stress A [N].
    """

    clause: str
    sigma_cr: float
    factor_of_safety: float
    sigma_allow: float
    stress: float
    governs: str
    reduction: float
    force: float


def working_stress(A: float, N_cr: float, sigma_allow: float, factor_of_safety: float) -> WorkingStress:
    """Allowable axial stress by the working-stress rule.

    Rule: ``allowable = min(sigma_allow, sigma_cr / FoS)`` with
    ``sigma_cr = N_cr / A``: the elastic critical stress divided by the
    factor of safety, but never more than the material's own allowable stress
    (which governs whenever it is the smaller; ties are reported as
    "material").

    Parameters
    ----------
    A : float
        Area [m^2].
    N_cr : float
        Elastic critical force [N].
    sigma_allow : float
        Material allowable stress [Pa].
    factor_of_safety : float
        Factor of safety against elastic buckling, >= 1 [-].

    Returns
    -------
    WorkingStress
    """
    A = _pos("A", A, "m^2")
    N_cr = _pos("N_cr", N_cr, "N")
    sa = _pos("sigma_allow", sigma_allow, "Pa")
    fos = _pos("factor_of_safety", factor_of_safety, "(-)")
    if fos < 1.0:
        raise ModelError("factor_of_safety", f"{fos:g} is below 1; expected a factor of safety >= 1")
    scr = N_cr / A
    sb = scr / fos
    if sa <= sb:
        s, gov = sa, "material"
    else:
        s, gov = sb, "buckling"
    return WorkingStress("working stress: min(sigma_allow, sigma_cr / FoS)", scr, fos, sa, s, gov, s / sa, s * A)


# --------------------------------------------------------------------------
# EN 1993-1-1 6.2.3 tension
# --------------------------------------------------------------------------


@dataclass(frozen=True, slots=True)
class EN1993Tension:
    """Tension resistance of EN 1993-1-1 6.2.3(2).

    Attributes
    ----------
    clause : str
    N_pl_Rd : float
        Gross section A fy / gamma_M0 [N].
    N_u_Rd : float
        Net section 0.9 A_net fu / gamma_M2 [N]; inf when no net section was
        given.
    N_t_Rd : float
        min(N_pl_Rd, N_u_Rd) [N].
    governs : str
        "gross" or "net".
    gamma_M0, gamma_M2 : float
        Partial factors [-].
    """

    clause: str
    N_pl_Rd: float
    N_u_Rd: float
    N_t_Rd: float
    governs: str
    gamma_M0: float
    gamma_M2: float

    @property
    def force(self) -> float:
        """N_t,Rd [N]."""
        return self.N_t_Rd


def en1993_tension(
    A: float,
    fy: float,
    *,
    A_net: float | None = None,
    fu: float | None = None,
    gamma_M0: float = 1.0,
    gamma_M2: float = 1.25,
) -> EN1993Tension:
    """Design tension resistance N_t,Rd, EN 1993-1-1 6.2.3(2) a) and b).

    ``N_pl,Rd = A fy / gamma_M0`` (6.6) and, for a section with holes,
    ``N_u,Rd = 0.9 A_net fu / gamma_M2`` (6.7); ``N_t,Rd`` is the smaller.
    Other checks of 6.2.3 (category C connections, angles connected by one
    leg) are not covered.

    Parameters
    ----------
    A : float
        Gross area [m^2].
    fy : float
        Yield strength [Pa].
    A_net : float, optional
        Net area at holes [m^2], 0 < A_net <= A; needs ``fu``.
    fu : float, optional
        Ultimate tensile strength [Pa].
    gamma_M0, gamma_M2 : float
        Partial factors (recommended 1.00 and 1.25, EN 1993-1-1 6.1) [-].

    Returns
    -------
    EN1993Tension
    """
    A = _pos("A", A, "m^2")
    fy = _pos("fy", fy, "Pa")
    g0 = _pos("gamma_M0", gamma_M0, "(-)")
    g2 = _pos("gamma_M2", gamma_M2, "(-)")
    Npl = A * fy / g0
    if (A_net is None) != (fu is None):
        raise ModelError("A_net", "give both A_net and fu for the net-section check, or neither")
    if A_net is not None:
        An = _pos("A_net", A_net, "m^2")
        if An > A:
            raise ModelError("A_net", f"{An:g} m^2 exceeds the gross area {A:g} m^2")
        Nu = 0.9 * An * _pos("fu", fu, "Pa") / g2  # type: ignore[arg-type]
    else:
        Nu = math.inf
    return EN1993Tension(
        "EN 1993-1-1 6.2.3", Npl, Nu, min(Npl, Nu), "gross" if Npl <= Nu else "net", g0, g2
    )
