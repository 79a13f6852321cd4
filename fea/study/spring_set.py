"""Load factors of a column whose chosen springs vary together, on one fixed mesh.

:class:`SpringModel` assembles the column once, without the chosen springs,
and adds them to the diagonal of the stiffness for each evaluation, so a load
factor costs one dense generalised eigen-solution of the lowest mode.  It is
the common engine of the brace-stiffness search, the sensitivity check and
the fixity bounds; a single spring over thousands of values goes through
:class:`fea.solve.one_spring.SpringStudy` instead.

A "spring" here is any stiffness the stiffness matrix depends on linearly:
a restraint's lateral or rotational spring (``(restraint index, "lateral")``,
``(restraint index, "rotation")``) or a foundation modulus (``(foundation
index, "modulus")``, ``"modulus_bottom"``, ``"modulus_top"``).  Each adds
``k D`` to the stiffness: ``D = e_d e_d^T`` for a spring at degree of freedom
``d``; for a foundation, the consistent Winkler matrix of a unit modulus that
is uniform (``modulus``) or falls linearly from 1 at the bottom (``1 - t``) or
rises to 1 at the top (``t``) of the foundation's range.  A rigid spring
(``inf``) removes its degree of freedom; a rigid foundation removes every
degree of freedom of the nodes it covers (``w = 0`` along the range).

Also here: the effective-length factors that follow from a load factor alone
(:func:`effective_length_factors`), without the mode.

Pure: SI floats and arrays, no I/O.
"""

from __future__ import annotations

import math
from dataclasses import dataclass, replace

import numpy as np
import scipy.linalg as sla
from scipy.linalg.lapack import dpbtrf

from ..assemble import assemble
from ..elements import GAUSS_XI, foundation_stiffness
from ..errors import ModelError
from ..formulas import effective_length_factor
from ..mesh import build_mesh
from ..model import Column
from ..solve.eigen import DEFAULT_TOL, buckling

__all__ = ["SpringModel", "converged_level", "effective_length_factors", "axial_force_parts", "spring_dof",
           "FOUNDATION_KINDS", "stiffness_of", "with_stiffness", "is_foundation_kind"]

KIND_DOF = {"lateral": 0, "rotation": 1}
#: Foundation moduli that can vary: the uniform modulus, or either end of a linearly varying one.
FOUNDATION_KINDS = ("modulus", "modulus_bottom", "modulus_top")


def is_foundation_kind(kind: str) -> bool:
    return kind in FOUNDATION_KINDS


def stiffness_of(column: Column, index: int, kind: str) -> float:
    """The column's value of spring ``(index, kind)`` [SI] (a foundation's ``modulus``: its bottom value)."""
    if kind in KIND_DOF:
        return float(getattr(column.restraints[index], kind))
    f = column.foundations[index]
    return float(f.k_top_value if kind == "modulus_top" else f.k_bottom)


def with_stiffness(column: Column, index: int, kind: str, value: float) -> Column:
    """A copy of ``column`` with spring ``(index, kind)`` at ``value`` [SI].

    A foundation whose modulus becomes zero over its whole range is removed
    (it adds nothing); a rigid (infinite) foundation modulus cannot be built
    as a column (only :class:`SpringModel` handles it) and raises ModelError.
    """
    if kind in KIND_DOF:
        return column.with_restraint(index, **{kind: value})
    if kind not in FOUNDATION_KINDS:
        raise ModelError("kind", f"expected lateral, rotation or {', '.join(FOUNDATION_KINDS)}, got {kind!r}")
    if not 0 <= index < len(column.foundations):
        raise ModelError("foundation", f"index {index} is out of range (0..{len(column.foundations) - 1})")
    if math.isinf(value):
        raise ModelError(f"foundation[{index + 1}].{kind}", "a rigid foundation is a limit of the spring model only")
    f = column.foundations[index]
    kb, kt = f.k_bottom, f.k_top_value
    if kind == "modulus":
        kb = kt = value
    elif kind == "modulus_bottom":
        kb = value
    else:
        kt = value
    fs = list(column.foundations)
    if kb == 0 and kt == 0:
        del fs[index]
    else:
        fs[index] = replace(f, k_bottom=kb, k_top=kt)
    return replace(column, foundations=tuple(fs))


def _foundation_weights(mesh, f, kind: str) -> np.ndarray:
    """(n_el, n_gauss) unit modulus of ``kind`` of foundation ``f`` at the Gauss points of ``mesh``."""
    tol = 1e-9 * float(mesh.x[-1] - mesh.x[0])
    x0, x1 = mesh.x[:-1], mesh.x[1:]
    mid = 0.5 * (x0 + x1)
    inside = (mid > f.bottom - tol) & (mid < f.top + tol)
    xg = x0[:, None] + (x1 - x0)[:, None] * GAUSS_XI[None, :]
    t = (xg - f.bottom) / (f.top - f.bottom)
    w = np.ones_like(xg) if kind == "modulus" else (1.0 - t if kind == "modulus_bottom" else t)
    return np.where(inside[:, None], w, 0.0)


def converged_level(column: Column, tol: float = DEFAULT_TOL) -> int:
    """Mesh refinement level at which :func:`buckling` meets ``tol`` for ``column``."""
    res = buckling(column, n_modes=1, tol=tol)
    return int(round(math.log2(res.n_elements / build_mesh(column, 0).n_el)))


def spring_dof(mesh, column: Column, restraint: int, kind: str) -> int:
    """Full-numbering degree of freedom of restraint ``restraint``'s ``kind`` spring."""
    if kind not in KIND_DOF:
        raise ModelError("kind", f"expected 'lateral' or 'rotation', got {kind!r}")
    at = column.restraints[restraint].at
    node = int(np.argmin(np.abs(mesh.x - at)))
    return 2 * node + KIND_DOF[kind]


def axial_force_parts(column: Column) -> tuple[np.ndarray, np.ndarray]:
    """Permanent and variable (load factor 1) compression just above each segment's bottom [N]."""
    tolx = 1e-9 * column.height
    xs = np.array([a + tolx for a, _b in column.segment_bounds()])
    return column.axial_force(xs, permanent=True), column.axial_force(xs, permanent=False)


def effective_length_factors(column: Column, load_factor) -> np.ndarray:
    """K of every segment at ``load_factor`` (NaN where not in compression), as :func:`buckling` defines it.

    ``K = (pi / L) sqrt(E I_ref / N_cr)`` with ``N_cr = N_perm + lam N_var`` taken
    just above the segment's bottom (the largest compression in the segment).
    ``load_factor`` may be an array; the result has one more axis (segments).
    A load factor of 0 or NaN gives NaN.
    """
    lam = np.asarray(load_factor, dtype=float)
    Np, Nv = axial_force_parts(column)
    L = np.array([s.length for s in column.segments])
    EI = np.array([s.E * s.I_ref for s in column.segments])
    Ncr = Np + lam[..., None] * Nv
    good = (lam[..., None] > 0) & np.isfinite(lam[..., None]) & (Ncr > 0)
    with np.errstate(invalid="ignore", divide="ignore"):
        K = effective_length_factor(L, EI, np.where(good, Ncr, np.nan))
    return np.where(good, K, np.nan)


@dataclass(frozen=True)
class SpringModel:
    """One mesh of ``column`` with ``springs`` free to take any stiffness.

    Attributes
    ----------
    column : the column (the chosen springs' own values are ignored)
    springs : ((index, kind), ...) the springs that vary: a restraint index with
        "lateral" / "rotation", or a foundation index with a kind of
        :data:`FOUNDATION_KINDS`
    level : mesh refinement level
    K : (n, n) stiffness without the chosen springs (reduced numbering) [SI]
    G : (n, n) geometric stiffness of the variable loads [SI]
    dofs : (m,) reduced index of each chosen restraint spring's degree of freedom (-1 for a foundation)
    heights : (n_nodes,) node heights [m]
    free : (n,) full-numbering index of each reduced degree of freedom
    parts : (m,) ``dK/dk`` of each chosen spring, (n, n) each [SI / SI]
    """

    column: Column
    springs: tuple[tuple[int, str], ...]
    level: int
    K: np.ndarray
    G: np.ndarray
    dofs: tuple[int, ...]
    heights: np.ndarray
    free: np.ndarray
    parts: tuple[np.ndarray, ...] = ()

    @classmethod
    def build(cls, column: Column, springs, level: int) -> "SpringModel":
        springs = tuple((int(r), str(k)) for r, k in springs)
        base = column
        for r, kind in springs:
            if kind in FOUNDATION_KINDS:
                if not 0 <= r < len(column.foundations):
                    raise ModelError("foundation", f"index {r} is out of range (0..{len(column.foundations) - 1})")
                continue
            if not 0 <= r < len(column.restraints):
                raise ModelError("restraint", f"index {r} is out of range (0..{len(column.restraints) - 1})")
            if kind not in KIND_DOF:
                raise ModelError("kind", f"expected 'lateral', 'rotation' or a foundation modulus, got {kind!r}")
            base = base.with_restraint(r, **{kind: 0.0})
        mesh = build_mesh(base, level)  # the foundations' ends stay stations even when their moduli vary
        units = {}
        for r, kind in springs:
            if kind in FOUNDATION_KINDS:
                units[(r, kind)] = _foundation_weights(mesh, column.foundations[r], kind)
        if units:  # take the varying foundation moduli out of the assembled stiffness
            k_found = mesh.k_found.copy()
            for (r, kind), w in units.items():
                k_found -= stiffness_of(column, r, kind) * w
            mesh = replace(mesh, k_found=np.where(np.abs(k_found) <= 1e-12 * np.abs(mesh.k_found), 0.0, k_found))
        asm = assemble(mesh, sparse=False)
        dofs, parts = [], []
        for r, kind in springs:
            if kind in FOUNDATION_KINDS:
                full = _scatter_dense(foundation_stiffness(mesh.L, units[(r, kind)], mesh.phi), mesh.n_dof)
                parts.append(full[np.ix_(asm.free, asm.free)])
                dofs.append(-1)
                continue
            full_dof = spring_dof(mesh, base, r, kind)
            j = int(np.searchsorted(asm.free, full_dof))
            if j >= asm.free.size or asm.free[j] != full_dof:
                raise ModelError(f"restraint[{r + 1}].{kind}", "another restraint at the same station is rigid "
                                                               "in the same direction: this spring has no effect")
            dofs.append(j)
            e = np.zeros((asm.free.size, asm.free.size))
            e[j, j] = 1.0
            parts.append(e)
        return cls(column=column, springs=springs, level=level, K=np.array(asm.K), G=np.array(asm.G),
                   dofs=tuple(dofs), heights=mesh.x.copy(), free=asm.free.copy(), parts=tuple(parts))

    def _check(self, k) -> np.ndarray:
        k = np.asarray(k, dtype=float).reshape(-1)
        if k.size != len(self.dofs):
            raise ModelError("stiffness", f"expected {len(self.dofs)} values, got {k.size}")
        if np.any(np.isnan(k)) or np.any(k < 0):
            raise ModelError("stiffness", f"values must be >= 0 (inf for rigid), got {k.tolist()}")
        return k

    def _keep(self, rigid) -> np.ndarray:
        """Mask of the degrees of freedom left when the springs flagged ``rigid`` are rigid."""
        keep = np.ones(self.K.shape[0], dtype=bool)
        for d, D, r in zip(self.dofs, self.parts, rigid):
            if r:
                if d >= 0:
                    keep[d] = False
                else:  # a rigid foundation holds every degree of freedom it acts on
                    keep[np.diagonal(D) > 0] = False
        return keep

    def _matrices(self, k) -> tuple[np.ndarray, np.ndarray, np.ndarray]:
        k = self._check(k)
        K = self.K.copy()
        for D, v in zip(self.parts, k):
            if math.isfinite(v) and v != 0:
                K += v * D
        keep = self._keep(np.isinf(k))
        return K[np.ix_(keep, keep)], self.G[np.ix_(keep, keep)], keep

    def _bands(self, rigid: tuple[bool, ...]):
        """Lower band storage of K, G and each finite spring's part with the rigid springs' dofs removed."""
        cache = self.__dict__.setdefault("_band_cache", {})
        if rigid not in cache:
            keep = self._keep(rigid)
            mats = [self.K[np.ix_(keep, keep)], self.G[np.ix_(keep, keep)]]
            mats += [D[np.ix_(keep, keep)] for D, r in zip(self.parts, rigid) if not r]
            n = mats[0].shape[0]
            nz = np.nonzero(np.any([m != 0 for m in mats], axis=0)) if n else (np.zeros(0, int),) * 2
            bw = int(np.max(np.abs(nz[0] - nz[1]), initial=0))
            bands = []
            for m in mats:
                b = np.zeros((bw + 1, n))
                for d in range(bw + 1):
                    b[d, : n - d] = np.diagonal(m, -d)
                bands.append(b)
            cache[rigid] = (bands[0], bands[1], bands[2:])
        return cache[rigid]

    def _banded_K(self, k) -> tuple[np.ndarray, np.ndarray]:
        k = self._check(k)
        rigid = tuple(bool(np.isinf(v)) for v in k)
        Kb, Gb, parts = self._bands(rigid)
        Kb = Kb.copy()
        for Db, v in zip(parts, k[~np.isinf(k)]):
            if v != 0:
                Kb += v * Db
        return Kb, Gb

    def derivative(self, j: int, phi: np.ndarray) -> float:
        """``phi^T (dK/dk_j) phi`` for a mode ``phi`` in this model's reduced numbering."""
        return float(phi @ self.parts[j] @ phi)

    def exceeds(self, k, t: float) -> bool:
        """Whether the lowest load factor with the springs at ``k`` is at least ``t`` (> 0).

        Sylvester's law of inertia: ``lam_1 >= t`` exactly when ``K - t G`` is
        positive definite (``K`` positive definite), decided by one banded
        Cholesky factorisation.
        """
        Kb, Gb = self._banded_K(k)
        return _positive_definite(Kb - t * Gb)

    def load_factor(self, k) -> float:
        """Lowest positive load factor with the chosen springs at ``k`` (m values, ``inf`` rigid).

        Found by bisection on the inertia of ``K - t G`` (banded Cholesky
        factorisations) to 1e-9 relative, started from the Rayleigh quotient
        of a few inverse iterations (an upper bound), then polished by shifted
        inverse iteration and the Rayleigh quotient (smooth in ``k``, as finite
        differences need).  0.0 when the
        column is a mechanism or its permanent loads alone exceed the critical
        load (no positive load factor is stable); ``inf`` when the variable
        loads cause no buckling.
        """
        Kb, Gb = self._banded_K(k)
        n = Kb.shape[1]
        if n == 0 or not _positive_definite(Kb):
            return 0.0
        bw = Kb.shape[0] - 1
        cb = sla.cholesky_banded(Kb, lower=True, check_finite=False)
        x = np.ones(n)
        hi = math.inf
        for _ in range(6):
            y = sla.cho_solve_banded((cb, True), _band_matvec(Gb, x, bw), check_finite=False)
            nrm = np.max(np.abs(y))
            if not nrm > 0:
                return math.inf
            x = y / nrm
            xg = x @ _band_matvec(Gb, x, bw)
            if xg > 0:
                hi = min(hi, (x @ _band_matvec(Kb, x, bw)) / xg)
        if not math.isfinite(hi):
            K, G, _ = self._matrices(k)  # no positive direction found by iteration: decide densely
            mu = sla.eigh(G, K, subset_by_index=[n - 1, n - 1], eigvals_only=True, check_finite=False)[0]
            return 1.0 / mu if mu > 0 else math.inf
        lo = hi
        while not _positive_definite(Kb - lo * Gb):
            lo *= 0.5
        a, b = math.log(lo), math.log(hi)
        while b - a > 1e-9:
            mid = 0.5 * (a + b)
            if _positive_definite(Kb - math.exp(mid) * Gb):
                a = mid
            else:
                b = mid
        # polish: inverse iteration shifted to the lower bracket, then the Rayleigh quotient
        sigma = math.exp(a) * (1.0 - 1e-7)
        try:
            cs = sla.cholesky_banded(Kb - sigma * Gb, lower=True, check_finite=False)
        except sla.LinAlgError:  # round-off at the bracket: keep the bisection's answer
            return math.exp(0.5 * (a + b))
        for _ in range(4):
            y = sla.cho_solve_banded((cs, True), _band_matvec(Gb, x, bw), check_finite=False)
            x = y / np.max(np.abs(y))
        xg = x @ _band_matvec(Gb, x, bw)
        rq = (x @ _band_matvec(Kb, x, bw)) / xg if xg > 0 else math.nan
        lo_b, hi_b = math.exp(a), math.exp(b)
        return rq if lo_b * (1 - 1e-12) <= rq <= hi_b * (1 + 1e-12) else math.exp(0.5 * (a + b))

    def load_factor_dense(self, k) -> float:
        """:meth:`load_factor` by dense LAPACK (slower; smoother in ``k`` for finite differences)."""
        lam, _, _ = self.modes(k, n_modes=1)
        return float(lam[0])

    def modes(self, k, n_modes: int = 2) -> tuple[np.ndarray, np.ndarray, np.ndarray]:
        """Lowest load factors (ascending) and mode vectors in the reduced numbering of this model.

        Returns
        -------
        lam : (m,) load factors
        phi : (n, m) modes, zero at the degrees of freedom made rigid by ``k``
        G : (n, n) the geometric stiffness of this model
        """
        K, G, keep = self._matrices(k)
        n = K.shape[0]
        m = min(n_modes, n)
        try:
            mu, vec = sla.eigh(G, K, subset_by_index=[n - m, n - 1], check_finite=False)
        except (sla.LinAlgError, ValueError):
            raise ModelError("restraints", "the column is a mechanism or its permanent loads alone buckle it") \
                from None
        mu, vec = mu[::-1], vec[:, ::-1]
        phi = np.zeros((self.K.shape[0], m))
        phi[keep] = vec
        with np.errstate(divide="ignore"):
            lam = np.where(mu > 0, 1.0 / mu, np.inf)
        return lam, phi, self.G


def _scatter_dense(ke: np.ndarray, n: int) -> np.ndarray:
    """Element matrices (n_el, 4, 4) of a chain of elements added into a dense (n, n) matrix."""
    out = np.zeros((n, n))
    for e in range(ke.shape[0]):
        out[2 * e:2 * e + 4, 2 * e:2 * e + 4] += ke[e]
    return out


def _positive_definite(ab: np.ndarray) -> bool:
    """Whether the symmetric matrix in lower band storage ``ab`` is positive definite (Cholesky succeeds)."""
    _, info = dpbtrf(ab, lower=1)
    return info == 0


def _band_matvec(ab: np.ndarray, x: np.ndarray, bw: int) -> np.ndarray:
    """``A x`` for symmetric ``A`` in lower band storage."""
    y = ab[0] * x
    n = x.size
    for d in range(1, bw + 1):
        y[d:] += ab[d, : n - d] * x[: n - d]
        y[: n - d] += ab[d, : n - d] * x[d:]
    return y
