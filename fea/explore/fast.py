"""One bending plane as one restraint spring moves: the load factor, the mode and the segments, fast.

Changing one spring ``k`` changes the stiffness matrix in one diagonal term:
``K(k) = K_ref + (k - k_ref) e e^T`` (a rigid spring removes its degree of
freedom).  The plane is meshed once, at the finer of the meshes that converge
(to the case's tolerance) at the two ends of the slider's range, and each new
stiffness is then answered on that mesh, exactly to round-off:

* the lowest load factor by :class:`fea.solve.one_spring.SpringStudy` (one
  eigen-decomposition when the slider is taken, then a secular-equation count
  for any stiffness: a whole block of slider positions in one call); a mesh
  too large for that dense decomposition (more than :data:`MAX_DOF` degrees of
  freedom) is answered by the inertia of ``K(k) - t G`` instead (Sylvester's
  law: ``lam_1 >= t`` exactly when it is positive definite), bisected with
  banded Cholesky factors and polished by the Rayleigh quotient;
* the mode as the null vector of ``K(k) - lam G``, by inverse iteration shifted
  just below the known ``lam`` (one banded Cholesky factor);
* the segments' K, N_cr, energy shares and "not meaningful" flags by the same
  packaging as every buckling result (:mod:`fea.solve.eigen`), so that they
  read exactly as ``stanchion check`` reports them.

Pure: arrays and model objects in, a :class:`~fea.results.BucklingResult` out.
"""

from __future__ import annotations

import math
from dataclasses import dataclass, field, replace

import numpy as np
import scipy.linalg as sla
from scipy.linalg.lapack import dpbtrf

from ..assemble import Assembled, assemble
from ..errors import FeaError
from ..mesh import Mesh, build_mesh
from ..model import Column
from ..results import BucklingResult
from ..solve.eigen import buckling, package_result  # the one packaging of a buckling result
from ..solve.one_spring import SpringStudy
from ..study.spring_set import spring_dof

__all__ = ["OneSpringPlane", "NotApplicable", "MAX_DOF"]

#: The inverse iteration is shifted this far (relative) below the known load factor.
SHIFT = 1e-8
#: Inverse-iteration steps (the shift is so close that they converge to round-off).
STEPS = 3
#: Largest reduced system given to the one-spring study's dense decomposition (it grows as n^3); larger
#: planes are answered by banded inertia bisection.
MAX_DOF = 600
#: Relative width of the bisection bracket before the Rayleigh-quotient polish.
BISECT_TOL = 1e-7


class NotApplicable(Exception):
    """The fast path does not apply to this spring or value (the caller re-solves instead)."""


def _band(m, bw: int) -> np.ndarray:
    """Lower band storage (bw + 1, n) of a symmetric dense or sparse matrix."""
    n = m.shape[0]
    out = np.zeros((bw + 1, n))
    for d in range(bw + 1):
        out[d, : n - d] = np.asarray(m.diagonal(-d)).ravel()
    return out


def _bandwidth(m) -> int:
    import scipy.sparse as sp

    coo = sp.coo_matrix(m)
    return int(np.max(np.abs(coo.row - coo.col), initial=0))


def _matvec(ab: np.ndarray, x: np.ndarray) -> np.ndarray:
    """``A x`` for symmetric ``A`` in lower band storage ``ab``."""
    y = ab[0] * x
    n = x.size
    for d in range(1, ab.shape[0]):
        y[d:] += ab[d, : n - d] * x[: n - d]
        y[: n - d] += ab[d, : n - d] * x[d:]
    return y


def _positive_definite(ab: np.ndarray) -> bool:
    return dpbtrf(ab, lower=1)[1] == 0


def _rayleigh_iteration(Kb: np.ndarray, Gb: np.ndarray, x: np.ndarray, steps: int = 6) -> float | None:
    """An eigenvalue of ``K phi = lam G phi`` near the Rayleigh quotient of ``x`` (cubic convergence), or None."""
    import warnings

    bw = Kb.shape[0] - 1
    xg = x @ _matvec(Gb, x)
    if not xg > 0:
        return None
    sigma = (x @ _matvec(Kb, x)) / xg
    for _ in range(steps):
        A = Kb - sigma * Gb
        full = np.zeros((2 * bw + 1, A.shape[1]))  # general band storage of the symmetric matrix
        full[bw:] = A
        for d in range(1, bw + 1):
            full[bw - d, d:] = A[d, :-d]
        try:
            with warnings.catch_warnings():
                warnings.simplefilter("ignore")  # near-singular at convergence: that is the point
                y = sla.solve_banded((bw, bw), full, _matvec(Gb, x), check_finite=False)
        except (sla.LinAlgError, ValueError):
            return sigma  # exactly singular: sigma is the eigenvalue
        if not np.all(np.isfinite(y)):
            return sigma
        x = y / np.max(np.abs(y))
        xg = x @ _matvec(Gb, x)
        if not xg > 0:
            return None
        new = (x @ _matvec(Kb, x)) / xg
        if abs(new - sigma) <= 1e-12 * abs(new):  # cubic convergence: the next step would be at round-off
            return float(new)
        sigma = new
    return float(sigma)


def _delete(m, j: int):
    keep = np.ones(m.shape[0], dtype=bool)
    keep[j] = False
    idx = np.flatnonzero(keep)
    return m[idx][:, idx] if not isinstance(m, np.ndarray) else m[np.ix_(idx, idx)]


@dataclass(frozen=True)
class OneSpringPlane:
    """A plane whose spring ``(restraint, kind)`` moves over ``[k_min, k_max]``.

    Attributes
    ----------
    study : the exact one-spring study, or None for a plane meshed finer than :data:`MAX_DOF`
    mesh, asm : the mesh and the assembled matrices at the reference stiffness ``k_ref``
    k_ref : the reference stiffness of the spring [SI]
    j : reduced index of the spring's degree of freedom in ``asm``
    Kb, Gb : ``asm.K`` and ``asm.G`` in lower band storage
    Kb_rigid, Gb_rigid : the same with the spring's degree of freedom removed (a rigid spring)
    discretisation_error : the larger estimated error of the meshes at the two ends of the range
    tol : the relative tolerance the mesh was converged to
    axis : the plane's label
    """

    study: SpringStudy | None
    mesh: Mesh
    asm: Assembled
    k_ref: float
    j: int
    Kb: np.ndarray
    Gb: np.ndarray
    Kb_rigid: np.ndarray
    Gb_rigid: np.ndarray
    discretisation_error: float
    tol: float
    axis: str
    #: the last mode of the banded path (a start for the next stiffness: sliders move by small steps)
    memo: dict = field(default_factory=dict, compare=False, repr=False)

    @classmethod
    def build(cls, column: Column, restraint: int, kind: str, k_min: float, k_max: float, tol: float,
              axis: str = "", dense: bool = True) -> "OneSpringPlane":
        """Prepare plane ``column`` for spring ``(restraint, kind)`` over ``[k_min, k_max]`` (``inf``: rigid);
        ``dense``: use the one-spring study (False for a plane whose mesh is known to be large).

        Raises :class:`NotApplicable` when another restraint at the station is rigid in the same direction
        (the spring then has no effect) or the mesh cannot be converged at the ends of the range.
        """
        study = None
        if dense:
            study = SpringStudy.build(column, restraint, kind, k_min, k_max, tol)
            level, ref_col, est = study.mesh_level, study.column, study.discretisation_error
        else:
            levels, errs = [], []
            for k_end in (k_min, k_max):
                end = column.with_restraint(restraint, **{kind: k_end})
                try:
                    res = buckling(end, n_modes=1, tol=tol)
                except FeaError:  # a mechanism or no load factor at this end: the other end decides
                    continue
                levels.append(int(round(math.log2(res.n_elements / build_mesh(end, 0).n_el))))
                errs.append(res.discretisation_error)
            if not levels:
                raise NotApplicable("the mesh could not be converged at the ends of the range")
            level, est = max(levels), max(errs)
            ref_col = column.with_restraint(restraint, **{kind: 1.0})
        if not math.isfinite(est):
            raise NotApplicable("the mesh could not be converged at the ends of the range")
        mesh = build_mesh(ref_col, level)
        asm = assemble(mesh)
        dof = spring_dof(mesh, ref_col, restraint, kind)
        j = int(np.searchsorted(asm.free, dof))
        if j >= asm.free.size or asm.free[j] != dof:
            raise NotApplicable("another restraint at this station is rigid in the same direction")
        K, G = asm.matrices[0], asm.matrices[2]
        bw = max(_bandwidth(K), _bandwidth(G), 1)
        k_ref = study.k_ref if study is not None else float(getattr(ref_col.restraints[restraint], kind))
        return cls(study=study, mesh=mesh, asm=asm, k_ref=k_ref, j=j, Kb=_band(K, bw), Gb=_band(G, bw),
                   Kb_rigid=_band(_delete(K, j), bw), Gb_rigid=_band(_delete(G, j), bw), discretisation_error=est,
                   tol=tol, axis=axis)

    # -- load factors ---------------------------------------------------------------------------------------
    def _bands(self, k: float) -> tuple[np.ndarray, np.ndarray]:
        if math.isinf(k):
            return self.Kb_rigid, self.Gb_rigid
        Kb = self.Kb.copy()
        Kb[0, self.j] += k - self.k_ref
        return Kb, self.Gb

    def load_factors(self, k: np.ndarray) -> np.ndarray:
        """Lowest load factor for every stiffness in ``k`` (``inf`` rigid); NaN where the column is a mechanism
        or has no positive load factor (the caller re-solves there, and says why)."""
        k = np.asarray(k, dtype=float)
        lam = np.full(k.shape, np.nan)
        s = self.study
        if s is not None:
            ok = 1.0 + np.minimum(k - s.k_ref, 0.0) * float(np.sum(s.w2)) > 1e-9
            if np.any(ok):
                lam[ok] = s.load_factors(k[ok])
        else:
            for i, v in enumerate(k.ravel()):
                lam.flat[i] = self._banded_load_factor(float(v))
        lam[~(np.isfinite(lam) & (lam > 0))] = np.nan
        return lam

    def _banded_load_factor(self, k: float) -> float:
        """Lowest load factor by the inertia of ``K(k) - t G`` (NaN: a mechanism, or none).

        From the last mode (a nearby stiffness), Rayleigh-quotient iteration finds an eigenvalue in a few
        banded solves; it is the lowest when ``K(k) - t G`` is positive definite just below it (Sylvester's
        law).  Otherwise, or without a start, the lowest is bisected on that test and polished.
        """
        Kb, Gb = self._bands(k)
        if not _positive_definite(Kb):
            return math.nan
        start = self.memo.get("x")
        if start is not None and start.size == Kb.shape[1]:
            lam = _rayleigh_iteration(Kb, Gb, start)
            if lam is not None and _positive_definite(Kb - lam * (1.0 - 1e-9) * Gb):
                self._remember(Kb, Gb, k, lam)
                return lam
        lam = self._bisect(Kb, Gb)
        if math.isfinite(lam):
            self._remember(Kb, Gb, k, lam)
        return lam

    def _remember(self, Kb: np.ndarray, Gb: np.ndarray, k: float, lam: float) -> None:
        try:
            self.memo.update(x=self._mode(Kb, Gb, lam), at=(k, lam))
        except NotApplicable:
            self.memo.clear()

    def _bisect(self, Kb: np.ndarray, Gb: np.ndarray) -> float:
        c = sla.cholesky_banded(Kb, lower=True, check_finite=False)
        x = np.ones(Kb.shape[1])
        hi = math.inf
        for _ in range(6):  # a few inverse iterations from ones: the Rayleigh quotient is an upper bound
            y = sla.cho_solve_banded((c, True), _matvec(Gb, x), check_finite=False)
            x = y / np.max(np.abs(y))
            xg = x @ _matvec(Gb, x)
            if xg > 0:
                hi = min(hi, (x @ _matvec(Kb, x)) / xg)
        if not math.isfinite(hi) or hi <= 0:
            return math.nan
        lo = hi
        while not _positive_definite(Kb - lo * Gb):
            lo *= 0.5
        a, b = math.log(lo), math.log(hi)
        while b - a > BISECT_TOL:
            mid = 0.5 * (a + b)
            if _positive_definite(Kb - math.exp(mid) * Gb):
                a = mid
            else:
                b = mid
        try:  # polish: the Rayleigh quotient of the mode at the bracket (second-order accurate)
            v = self._mode(Kb, Gb, math.exp(a))
        except NotApplicable:
            return math.exp(0.5 * (a + b))
        rq = (v @ _matvec(Kb, v)) / (v @ _matvec(Gb, v))
        return rq if math.exp(a) * (1 - 1e-12) <= rq <= math.exp(b) * (1 + 1e-12) else math.exp(0.5 * (a + b))

    # -- the mode and the result ----------------------------------------------------------------------------
    @staticmethod
    def _mode(Kb: np.ndarray, Gb: np.ndarray, lam: float) -> np.ndarray:
        try:
            c = sla.cholesky_banded(Kb - lam * (1.0 - SHIFT) * Gb, lower=True, check_finite=False)
        except sla.LinAlgError:
            raise NotApplicable("the shifted stiffness is not positive definite") from None
        x = np.ones(Kb.shape[1])
        for _ in range(STEPS):
            y = sla.cho_solve_banded((c, True), _matvec(Gb, x), check_finite=False)
            x = y / np.max(np.abs(y))
        return x

    def mode(self, k: float, lam: float) -> np.ndarray:
        """The mode at stiffness ``k`` and load factor ``lam``, (n,) in the reduced numbering of ``asm``."""
        x = self.memo["x"] if self.memo.get("at") == (k, lam) else self._mode(*self._bands(k), lam)
        return np.insert(x, self.j, 0.0) if math.isinf(k) else x

    def result(self, column: Column, k: float, lam: float | None = None) -> BucklingResult:
        """The plane's buckling result (lowest mode) with the spring at ``k``; ``column`` is the plane's
        column with the spring at ``k`` (it gives the segments and loads); ``lam``: the load factor at ``k``
        when already known."""
        if lam is None:
            lam = float(self.load_factors(np.array([k]))[0])
        if not (math.isfinite(lam) and lam > 0):
            raise NotApplicable("a mechanism, or no positive load factor, at this stiffness")
        vec = self.mode(k, lam)
        est, tol = self.discretisation_error, self.tol
        how = "the exact one-spring update" if self.study is not None else "banded inertia bisection"
        msg = (f"lowest load factor by {how} on {self.mesh.n_el} elements (mesh converged at both ends of the "
               f"slider's range: estimated relative error {est:.1e})")
        res = package_result(column, self.mesh, self.asm, np.array([lam]), vec[:, None], "one-spring", np.array([lam]),
                       est, tol, est <= tol, msg, self.axis)
        return replace(res, mode_errors=np.array([est]))
