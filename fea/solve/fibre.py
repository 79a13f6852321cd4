"""Section laws of the nonlinear beam-column kernel: elastic and fibre sections.

Two section kinds are supported, both with per-element data:

* :class:`ElasticSection` -- axial rigidity ``EA`` [N] and bending rigidity ``EI``
  [N m^2], linear.
* :class:`FibreSection` -- the cross-section is a set of fibres (strips) at
  lateral positions ``y`` [m] from the section centroid, measured in the bending
  direction, with areas ``area`` [m^2] and an optional self-equilibrating residual
  stress ``sigma_r`` [Pa].  The material is uniaxial, elastic -- linear kinematic
  hardening (elastic -- perfectly plastic when ``E_t == 0``), with Young's modulus
  ``E`` [Pa], yield stress ``fy`` [Pa] and hardening (tangent) modulus ``E_t``
  [Pa].

Sign conventions (used throughout the kernel):

* stresses and strains are positive in tension;
* the generalised section strains are the axial strain at the centroid ``eps0``
  [-] and the curvature ``kappa`` [1/m]; a fibre at ``y`` has strain
  ``eps = eps0 - y * kappa``;
* the work-conjugate stress resultants are ``N = sum(sigma * A)`` [N] (tension
  positive) and ``M = -sum(sigma * A * y)`` [N m], so that the section tangent is
  ``D = [[sum(Et A), -sum(Et A y)], [-sum(Et A y), sum(Et A y^2)]]``.

The residual stress enters as an initial elastic strain ``sigma_r / E``.  The
history of every fibre (plastic strain, and back stress when hardening) lives in a
:class:`FibreState` of shape (n_el, n_ip, n_fib); :func:`section_response` never
modifies it -- it returns the trial state, which the caller commits only on a
converged step.

All functions are pure: SI floats, arrays in, arrays out.
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np

from fea.errors import ModelError

__all__ = [
    "ElasticSection",
    "FibreSection",
    "FibreState",
    "SectionResponse",
    "make_elastic_section",
    "make_fibre_section",
    "initial_state",
    "fibre_stress",
    "section_response",
    "fibre_strain",
    "yield_onset",
]

#: Relative tolerance of the self-equilibrium check of the residual stress.
RESIDUAL_EQUILIBRIUM_TOL = 1e-6


def _frozen(a: np.ndarray) -> np.ndarray:
    a = np.array(a, dtype=float)
    a.setflags(write=False)
    return a


@dataclass(frozen=True)
class ElasticSection:
    """Linear elastic sections of all elements.

    Attributes
    ----------
    EA : ndarray, shape (n_el,)
        Axial rigidity [N].
    EI : ndarray, shape (n_el,)
        Bending rigidity [N m^2].
    """

    EA: np.ndarray
    EI: np.ndarray

    @property
    def n_el(self) -> int:
        return int(self.EA.shape[0])


@dataclass(frozen=True)
class FibreSection:
    """Fibre sections of all elements (one section per element, constant along it).

    Attributes
    ----------
    y : ndarray, shape (n_el, n_fib)
        Fibre positions from the centroid in the bending direction [m].
    area : ndarray, shape (n_el, n_fib)
        Fibre areas [m^2].
    sigma_r : ndarray, shape (n_el, n_fib)
        Residual stress, tension positive, self-equilibrating [Pa].
    E, fy, E_t : ndarray, shape (n_el,)
        Young's modulus, yield stress, hardening modulus [Pa].
    """

    y: np.ndarray
    area: np.ndarray
    sigma_r: np.ndarray
    E: np.ndarray
    fy: np.ndarray
    E_t: np.ndarray

    @property
    def n_el(self) -> int:
        return int(self.y.shape[0])

    @property
    def n_fib(self) -> int:
        return int(self.y.shape[1])

    @property
    def H(self) -> np.ndarray:
        """Kinematic hardening modulus ``E E_t / (E - E_t)`` [Pa], shape (n_el,)."""
        return self.E * self.E_t / (self.E - self.E_t)


@dataclass(frozen=True)
class FibreState:
    """History variables of every fibre at every integration point.

    Attributes
    ----------
    eps_p : ndarray, shape (n_el, n_ip, n_fib)
        Plastic strain [-].
    back : ndarray, shape (n_el, n_ip, n_fib)
        Back stress of the kinematic hardening [Pa] (zero when ``E_t == 0``).
    """

    eps_p: np.ndarray
    back: np.ndarray


@dataclass(frozen=True)
class SectionResponse:
    """Stress resultants and tangent at the integration points.

    Attributes
    ----------
    N : ndarray, shape (n_el, n_ip)
        Axial force, tension positive [N].
    M : ndarray, shape (n_el, n_ip)
        Bending moment conjugate to the curvature [N m].
    D : ndarray, shape (n_el, n_ip, 2, 2)
        Section tangent d(N, M)/d(eps0, kappa) [N, N m, N m^2].
    state : FibreState or None
        Trial history (None for elastic sections).
    yielding : ndarray of bool, shape (n_el, n_ip, n_fib) or None
        Fibres on the yield surface at the trial state.
    stress : ndarray, shape (n_el, n_ip, n_fib) or None
        Fibre stresses [Pa].
    """

    N: np.ndarray
    M: np.ndarray
    D: np.ndarray
    state: FibreState | None = None
    yielding: np.ndarray | None = None
    stress: np.ndarray | None = None


def _per_element(value, n_el: int, field: str, *, positive: bool = True,
                 allow_zero: bool = False) -> np.ndarray:
    try:
        a = np.asarray(value, dtype=float)
    except (TypeError, ValueError):
        raise ModelError(field, f"got {value!r}, expected a number or an array of {n_el} numbers") from None
    if a.ndim == 0:
        a = np.full(n_el, float(a))
    if a.shape != (n_el,):
        raise ModelError(field, f"has shape {a.shape}, expected a scalar or shape ({n_el},)")
    if not np.all(np.isfinite(a)):
        raise ModelError(field, "contains non-finite values, expected finite numbers")
    if positive:
        bad = a < 0 if allow_zero else a <= 0
        if np.any(bad):
            i = int(np.argmax(bad))
            rel = ">= 0" if allow_zero else "> 0"
            raise ModelError(f"{field}[{i}]", f"is {a[i]!r}, expected {rel}")
    return a


def make_elastic_section(EA, EI, n_el: int) -> ElasticSection:
    """Build and check elastic sections for ``n_el`` elements.

    Parameters
    ----------
    EA : float or array_like, shape (n_el,)
        Axial rigidity [N], > 0.
    EI : float or array_like, shape (n_el,)
        Bending rigidity [N m^2], > 0.
    n_el : int
        Number of elements.

    Returns
    -------
    ElasticSection

    Raises
    ------
    ModelError
        On a wrong shape, non-finite or non-positive value.
    """
    n_el = int(n_el)
    return ElasticSection(EA=_frozen(_per_element(EA, n_el, "EA")),
                          EI=_frozen(_per_element(EI, n_el, "EI")))


def _fibre_array(value, n_el: int, n_fib: int | None, field: str) -> np.ndarray:
    try:
        a = np.asarray(value, dtype=float)
    except (TypeError, ValueError):
        raise ModelError(field, f"got {value!r}, expected an array of numbers") from None
    if a.ndim == 1:
        a = np.broadcast_to(a, (n_el, a.shape[0]))
    if a.ndim != 2 or a.shape[0] != n_el or a.shape[1] < 1 or (n_fib is not None and a.shape[1] != n_fib):
        want = f"(n_fib,) or ({n_el}, n_fib)" if n_fib is None else f"({n_fib},) or ({n_el}, {n_fib})"
        raise ModelError(field, f"has shape {np.shape(value)}, expected {want}")
    if not np.all(np.isfinite(a)):
        raise ModelError(field, "contains non-finite values, expected finite numbers")
    return np.array(a)


def make_fibre_section(y, area, E, fy, n_el: int, *, E_t=0.0, sigma_r=None) -> FibreSection:
    """Build and check fibre sections for ``n_el`` elements.

    Parameters
    ----------
    y : array_like, shape (n_fib,) or (n_el, n_fib)
        Fibre positions from the centroid in the bending direction [m]; a single
        section is broadcast to all elements.
    area : array_like, shape (n_fib,) or (n_el, n_fib)
        Fibre areas [m^2], > 0.
    E : float or array_like, shape (n_el,)
        Young's modulus [Pa], > 0.
    fy : float or array_like, shape (n_el,)
        Yield stress [Pa], > 0.
    n_el : int
        Number of elements.
    E_t : float or array_like, shape (n_el,), optional
        Hardening modulus [Pa], 0 <= E_t < E; 0 gives elastic -- perfectly plastic.
    sigma_r : array_like, shape (n_fib,) or (n_el, n_fib), optional
        Residual stress [Pa], tension positive, |sigma_r| <= fy, with zero net
        force and zero net moment (relative tolerance ``RESIDUAL_EQUILIBRIUM_TOL``).

    Returns
    -------
    FibreSection

    Raises
    ------
    ModelError
        On wrong shapes, non-finite or out-of-range values, or a residual stress
        that is not self-equilibrating or exceeds the yield stress.
    """
    n_el = int(n_el)
    if n_el < 1:
        raise ModelError("n_el", f"is {n_el}, expected >= 1")
    ya = _fibre_array(y, n_el, None, "y")
    n_fib = ya.shape[1]
    aa = _fibre_array(area, n_el, n_fib, "area")
    if np.any(aa <= 0):
        raise ModelError("area", f"has a value {aa.min()!r}, expected every fibre area > 0")
    Ea = _per_element(E, n_el, "E")
    fya = _per_element(fy, n_el, "fy")
    Eta = _per_element(E_t, n_el, "E_t", allow_zero=True)
    if np.any(Eta >= Ea):
        i = int(np.argmax(Eta >= Ea))
        raise ModelError(f"E_t[{i}]", f"is {Eta[i]!r}, expected below E = {Ea[i]!r}")
    if sigma_r is None:
        sr = np.zeros_like(ya)
    else:
        sr = _fibre_array(sigma_r, n_el, n_fib, "sigma_r")
        over = np.abs(sr) > fya[:, None] * (1.0 + 1e-12)
        if np.any(over):
            e, f = np.argwhere(over)[0]
            raise ModelError("sigma_r", f"fibre {f} of element {e} has {sr[e, f]!r} Pa, expected |sigma_r| <= fy = "
                                        f"{fya[e]!r} Pa")
        force = np.sum(sr * aa, axis=1)
        moment = np.sum(sr * aa * ya, axis=1)
        fscale = fya * np.sum(aa, axis=1)
        mscale = fscale * np.max(np.abs(ya), axis=1).clip(min=1e-300)
        badf = np.abs(force) > RESIDUAL_EQUILIBRIUM_TOL * fscale
        badm = np.abs(moment) > RESIDUAL_EQUILIBRIUM_TOL * mscale
        if np.any(badf | badm):
            e = int(np.argmax(badf | badm))
            raise ModelError("sigma_r", f"of element {e} has net force {force[e]:.6g} N and net moment "
                                        f"{moment[e]:.6g} N m, expected a self-equilibrating pattern (both zero "
                                        f"within {RESIDUAL_EQUILIBRIUM_TOL:g} relative)")
    return FibreSection(y=_frozen(ya), area=_frozen(aa), sigma_r=_frozen(sr), E=_frozen(Ea),
                        fy=_frozen(fya), E_t=_frozen(Eta))


def initial_state(section: FibreSection, n_ip: int) -> FibreState:
    """Virgin history: zero plastic strain and zero back stress.

    Parameters
    ----------
    section : FibreSection
    n_ip : int
        Integration points per element.

    Returns
    -------
    FibreState
        Arrays of shape (n_el, n_ip, n_fib).
    """
    shape = (section.n_el, int(n_ip), section.n_fib)
    return FibreState(eps_p=np.zeros(shape), back=np.zeros(shape))


def fibre_stress(eps, eps_p, back, E, fy, H, sigma_r):
    """Return mapping of the uniaxial elastic -- linear-kinematic-hardening law.

    All inputs broadcast against each other (typically to (n_el, n_ip, n_fib)).

    Parameters
    ----------
    eps : ndarray
        Total strain from the deformation [-] (tension positive).
    eps_p : ndarray
        Committed plastic strain [-].
    back : ndarray
        Committed back stress [Pa].
    E, fy, H : ndarray
        Young's modulus, yield stress and kinematic hardening modulus [Pa].
    sigma_r : ndarray
        Residual stress [Pa], applied as the initial elastic strain sigma_r / E.

    Returns
    -------
    sigma : ndarray
        Stress [Pa].
    Et : ndarray
        Consistent tangent modulus [Pa] (E, or E H / (E + H) while yielding).
    eps_p_new, back_new : ndarray
        Trial history [-], [Pa].
    yielding : ndarray of bool
        True where the fibre is on the yield surface (plastic flow in this step).
    """
    sig_tr = sigma_r + E * (eps - eps_p)
    xi = sig_tr - back
    f = np.abs(xi) - fy
    yielding = f > 0.0
    sgn = np.sign(xi)
    dgam = np.where(yielding, f, 0.0) / (E + H)
    sigma = sig_tr - E * dgam * sgn
    eps_p_new = eps_p + dgam * sgn
    back_new = back + H * dgam * sgn
    Et = np.where(yielding, E * H / (E + H), E)
    return sigma, Et, eps_p_new, back_new, yielding


def section_response(section, eps0: np.ndarray, kappa: np.ndarray, state: FibreState | None) -> SectionResponse:
    """Stress resultants and section tangent at all integration points.

    Parameters
    ----------
    section : ElasticSection or FibreSection
    eps0 : ndarray, shape (n_el, n_ip) or (n_el, 1)
        Axial strain at the centroid [-].
    kappa : ndarray, shape (n_el, n_ip)
        Curvature [1/m].
    state : FibreState or None
        Committed history (ignored for elastic sections).

    Returns
    -------
    SectionResponse
    """
    eps0 = np.broadcast_to(eps0, kappa.shape)
    if isinstance(section, ElasticSection):
        EA = section.EA[:, None]
        EI = section.EI[:, None]
        N = EA * eps0
        M = EI * kappa
        D = np.zeros(kappa.shape + (2, 2))
        D[..., 0, 0] = EA
        D[..., 1, 1] = EI
        return SectionResponse(N=N, M=M, D=D)
    assert state is not None, "a fibre section needs its committed history"
    y = section.y[:, None, :]
    A = section.area[:, None, :]
    E = section.E[:, None, None]
    eps = eps0[..., None] - y * kappa[..., None]
    sigma, Et, eps_p, back, yielding = fibre_stress(
        eps, state.eps_p, state.back, E, section.fy[:, None, None], section.H[:, None, None],
        section.sigma_r[:, None, :])
    sA = sigma * A
    N = sA.sum(axis=-1)
    M = -(sA * y).sum(axis=-1)
    EA_t = Et * A
    EAy = EA_t * y
    D = np.empty(kappa.shape + (2, 2))
    D[..., 0, 0] = EA_t.sum(axis=-1)
    D[..., 0, 1] = D[..., 1, 0] = -EAy.sum(axis=-1)
    D[..., 1, 1] = (EAy * y).sum(axis=-1)
    return SectionResponse(N=N, M=M, D=D, state=FibreState(eps_p=eps_p, back=back),
                           yielding=yielding, stress=sigma)


def fibre_strain(section: FibreSection, eps0: np.ndarray, kappa: np.ndarray) -> np.ndarray:
    """Fibre strains ``eps0 - y * kappa``.

    Parameters
    ----------
    section : FibreSection
    eps0, kappa : ndarray, shape (n_el, n_ip)
        Generalised strains [-, 1/m].

    Returns
    -------
    ndarray, shape (n_el, n_ip, n_fib)
        Strain [-].
    """
    return np.broadcast_to(eps0, kappa.shape)[..., None] - section.y[:, None, :] * kappa[..., None]


def yield_onset(section: FibreSection, state0: FibreState, stress0: np.ndarray, eps1: np.ndarray) -> np.ndarray:
    """Fraction of a step at which each fibre reaches the yield surface.

    The strain of every fibre is taken to vary linearly over the step, from the
    committed state (stress ``stress0``) to the end strain ``eps1``; while the fibre
    is elastic its stress is then linear too, and the crossing of
    ``|sigma - back| = fy`` is found exactly.

    Parameters
    ----------
    section : FibreSection
    state0 : FibreState
        Committed history at the start of the step.
    stress0 : ndarray, shape (n_el, n_ip, n_fib)
        Stress at the start of the step [Pa].
    eps1 : ndarray, shape (n_el, n_ip, n_fib)
        Total strain at the end of the step [-].

    Returns
    -------
    ndarray, shape (n_el, n_ip, n_fib)
        Step fraction in [0, 1] where the fibre first yields; ``inf`` for fibres
        that stay elastic (0 for fibres already on the surface and loading).
    """
    E = section.E[:, None, None]
    fy = section.fy[:, None, None]
    a = stress0 - state0.back
    tr1 = section.sigma_r[:, None, :] + E * (eps1 - state0.eps_p) - state0.back
    b = tr1 - a
    reach = np.abs(tr1) > fy
    with np.errstate(divide="ignore", invalid="ignore"):
        t = (np.sign(b) * fy - a) / b
    t = np.where(reach, np.clip(t, 0.0, 1.0), np.inf)
    return t
