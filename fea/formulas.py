"""Closed-form column formulas, one home each: Euler's load, the effective-length factor, Perry's root.

Pure functions of SI floats (or numpy arrays, where stated); no validation
beyond what the arithmetic needs.  Callers that take user input check it first.

References
----------
.. [1] Euler, L., "Sur la force des colonnes", Mémoires de l'Académie de Berlin 13, 1759.
.. [2] Timoshenko, S. P. and Gere, J. M., *Theory of Elastic Stability*, 2nd ed.,
       McGraw-Hill, 1961, section 2.1 (Euler load) and 2.4 (effective length).
.. [3] Perry, J., "On struts", The Engineer 62, 1886; Robertson, A., "The strength of
       struts", ICE Selected Engineering Papers 28, 1925.
"""

from __future__ import annotations

import math

import numpy as np
import numpy.typing as npt

__all__ = ["euler_load", "euler_stress", "euler_slenderness", "effective_length_factor", "perry_root"]

ArrayLike = float | npt.NDArray[np.float64]


def euler_load(E: float, I: float, L: float) -> float:  # noqa: E741 - I is the second moment, as written
    """Euler's critical load of a pin-ended strut, ``N_E = pi^2 E I / L^2`` [N] ([1]_, [2]_ Eq. 2-3).

    Parameters
    ----------
    E : elastic modulus [Pa]
    I : second moment of area [m^4]
    L : (effective) length [m]
    """
    return math.pi**2 * E * I / L**2


def euler_stress(E: float, slenderness: float) -> float:
    """Euler's critical stress, ``sigma_E = pi^2 E / (L/r)^2`` [Pa] ([1]_, [2]_); ``inf`` at ``L/r = 0``.

    Parameters
    ----------
    E : elastic modulus [Pa]
    slenderness : geometric slenderness L/r [-], >= 0
    """
    return math.inf if slenderness == 0.0 else math.pi**2 * E / slenderness**2


def euler_slenderness(E: float, A: float, N_cr: float) -> float:
    """The slenderness that gives ``N_cr`` by Euler's formula, ``L/r = pi sqrt(E A / N_cr)`` [-].

    The inverse of :func:`euler_stress` with ``sigma_E = N_cr / A`` ([1]_).

    Parameters
    ----------
    E : elastic modulus [Pa]
    A : area [m^2]
    N_cr : critical force [N], > 0
    """
    return math.pi * math.sqrt(E * A / N_cr)


def effective_length_factor(L: ArrayLike, EI: ArrayLike, N_cr: ArrayLike) -> ArrayLike:
    """Effective-length factor ``K = (pi / L) sqrt(E I / N_cr)`` [-] ([2]_ section 2.4).

    The factor that makes Euler's load of a member of length ``K L`` equal the
    critical force ``N_cr`` found for it.  Works element-wise on numpy arrays
    (then NaN where ``N_cr`` is NaN); on floats it returns a float.

    Parameters
    ----------
    L : member (segment) length [m]
    EI : bending stiffness [N m^2]
    N_cr : axial force in the member at the critical state [N], > 0
    """
    if isinstance(L, float | int) and isinstance(EI, float | int) and isinstance(N_cr, float | int):
        return math.pi / L * math.sqrt(EI / N_cr)
    return np.pi / L * np.sqrt(EI / N_cr)


def perry_root(f_y: float, f_e: float, eta: float) -> float:
    """Perry's first-yield value: the smaller root ``s`` of ``(f_y - s)(f_e - s) = eta s f_e`` ([3]_).

    The mean stress (or force) at which the extreme fibre of a pin-ended strut
    with an initial half-sine bow first yields: ``f_y`` is the yield stress (or
    squash load ``A fy``), ``f_e`` the Euler stress (or critical force) and
    ``eta = e0 c / r^2`` the imperfection parameter.  Written without
    cancellation as ``s = f_y f_e / (B + sqrt(B^2 - f_y f_e))`` with
    ``B = (f_y + (1 + eta) f_e) / 2``, and never above ``min(f_y, f_e)``; ``f_e = inf`` (no slenderness)
    gives ``f_y``.

    Parameters
    ----------
    f_y : yield stress [Pa] or squash load [N], > 0
    f_e : Euler stress [Pa] or critical force [N], > 0 (in the same unit as ``f_y``)
    eta : imperfection parameter [-], >= 0
    """
    if math.isinf(f_e):
        return f_y
    B = 0.5 * (f_y + (1.0 + eta) * f_e)
    # the smaller root never exceeds min(f_y, f_e); the bound removes a last-digit excess of the rounding
    return min(f_y * f_e / (B + math.sqrt(max(B * B - f_y * f_e, 0.0))), f_y, f_e)
