"""Fast lowest load factor as one spring stiffness varies.

Changing one spring ``k`` changes the stiffness matrix by a rank-one term:
``K(k) = K_ref + (k - k_ref) e e^T``.  With the generalised eigen-decomposition
of the reference pencil, ``Phi^T K_ref Phi = I`` and ``Phi^T G Phi =
diag(mu_i)``, the problem ``G phi = mu K(k) phi`` becomes a diagonal matrix plus
a rank-one update, whose eigenvalue count above any trial ``mu`` follows from
one scalar (the determinant ratio of the rank-one update, a secular
function).  The largest ``mu`` (lowest load factor ``1/mu``) is then found by
bisection on that count, for thousands of stiffness values at once, with no
further factorisation.  The answer is exact for the mesh used (to the
bisection tolerance, 1e-13 relative); the mesh itself is refined until the
lowest load factor is converged at both ends of the stiffness range.

The count rule: for ``A = D + c w w^T`` with ``D`` diagonal and
``s = 1 + c sum(w_i^2 / D_i)``, the number of positive eigenvalues of ``A``
is that of ``D`` plus one if ``c > 0`` and ``s < 0``, minus one if ``c < 0``
and ``s < 0`` (interlacing and ``det A = s det D``).  Applied to
``A = (G - mu K(k))`` in the reference coordinates, it counts the load factors
below ``1/mu``.
"""

from __future__ import annotations

import math
from dataclasses import dataclass

import numpy as np
import scipy.linalg as sla

from ..assemble import assemble
from ..errors import ModelError, SolverError
from ..mesh import build_mesh
from ..model import Column
from .eigen import DEFAULT_TOL, buckling

__all__ = ["SpringStudy"]

_BISECT_ITER = 52


@dataclass(frozen=True)
class SpringStudy:
    """Lowest load factor of a column as one restraint spring varies.

    Build with :meth:`SpringStudy.build`; evaluate with :meth:`load_factors`.

    Attributes
    ----------
    column : the column at the reference stiffness
    restraint : index of the restraint that varies
    kind : "lateral" or "rotation"
    k_ref : reference stiffness [N/m or N m/rad]
    mu : (n,) generalised eigenvalues of the reference pencil
    w2 : (n,) squared components of the spring's unit vector in the
        reference eigenbasis
    mesh_level : refinement level of the mesh used
    discretisation_error : largest estimated relative error at the two
        ends of the stiffness range
    """

    column: Column
    restraint: int
    kind: str
    k_ref: float
    mu: np.ndarray
    w2: np.ndarray
    mesh_level: int
    discretisation_error: float

    @classmethod
    def build(cls, column: Column, restraint: int, kind: str = "rotation", k_min: float = 0.0,
              k_max: float = math.inf, tol: float = DEFAULT_TOL) -> "SpringStudy":
        """Prepare a study of restraint ``restraint`` over ``[k_min, k_max]``.

        The mesh is the finer of the meshes converged (to ``tol``) at the two
        ends of the range; an end at which the column is a mechanism is
        replaced by the reference stiffness.
        """
        if kind not in ("lateral", "rotation"):
            raise ModelError("kind", f"expected 'lateral' or 'rotation', got {kind!r}")
        if not 0 <= restraint < len(column.restraints):
            raise ModelError("restraint", f"index {restraint} is out of range (0..{len(column.restraints) - 1})")
        if not (0 <= k_min <= k_max):
            raise ModelError("range", f"expected 0 <= k_min <= k_max, got {k_min!r}, {k_max!r}")
        # reference stiffness: the natural stiffness of that degree of freedom
        probe = column.with_restraint(restraint, **{kind: 1.0})
        asm0 = assemble(build_mesh(probe, 0))
        node = build_mesh(probe, 0).station_nodes
        x_at = column.restraints[restraint].at
        nd = min(node.items(), key=lambda kv: abs(kv[0] - x_at))[1]
        dof = 2 * nd + (0 if kind == "lateral" else 1)
        j = int(np.searchsorted(asm0.free, dof))
        k_ref = float(asm0.K0[j, j] - 1.0)
        if not k_ref > 0:
            k_ref = 1.0
        levels, errs = [], []
        for k_end in (k_min, k_max):
            col_end = column.with_restraint(restraint, **{kind: k_end})
            try:
                res = buckling(col_end, n_modes=1, tol=tol)
            except ModelError:
                res = buckling(column.with_restraint(restraint, **{kind: k_ref}), n_modes=1, tol=tol)
            except SolverError:  # no positive load factor at this end: use the other end's mesh
                continue
            levels.append(int(round(math.log2(res.n_elements / build_mesh(col_end, 0).n_el))))
            errs.append(res.discretisation_error)
        level = max(levels) if levels else 3
        ref_col = column.with_restraint(restraint, **{kind: k_ref})
        mesh = build_mesh(ref_col, level)
        asm = assemble(mesh)
        mu, Phi = sla.eigh(asm.G, asm.K, check_finite=False)
        j = int(np.searchsorted(asm.free, 2 * mesh.station_nodes[min(mesh.station_nodes,
                                                                          key=lambda s: abs(s - x_at))]
                                + (0 if kind == "lateral" else 1)))
        w2 = Phi[j, :] ** 2
        return cls(column=ref_col, restraint=restraint, kind=kind, k_ref=k_ref, mu=mu, w2=w2, mesh_level=level,
                   discretisation_error=max(errs) if errs else math.nan)

    def load_factors(self, k: np.ndarray, chunk: int = 4096) -> np.ndarray:
        """Lowest positive load factor for every stiffness in ``k`` (``inf`` = rigid).

        Returns ``inf`` where no positive load factor exists, and raises
        :class:`ModelError` for a stiffness that leaves a mechanism.
        """
        k = np.atleast_1d(np.asarray(k, dtype=float))
        if np.any(np.isnan(k)) or np.any(k < 0):
            raise ModelError(self.kind, "stiffness values must be >= 0 (inf for rigid)")
        out = np.empty_like(k)
        for a in range(0, k.size, chunk):
            out[a:a + chunk] = self._solve(k[a:a + chunk])
        return out

    # -- internals -------------------------------------------------------
    def _count(self, m: np.ndarray, delta: np.ndarray) -> np.ndarray:
        """Number of mu_j(k) above trial values ``m`` (n_k,) for updates ``delta`` (n_k,).

        The secular sum has a pole at every ``mu_j``; a trial value that lands
        exactly on one (as bisection toward a mode with a node at the spring
        can, where ``w_j = 0`` and the answer is ``mu_j`` itself) is moved up
        by one unit in the last place, which changes the count only for an
        eigenvalue in that gap, far below the bisection tolerance.  So every
        term ``w_j^2 / D_j`` is finite and no infinity meets a zero factor.
        """
        D = self.mu[None, :] - m[:, None]
        on_pole = np.any(D == 0.0, axis=1)
        while np.any(on_pole):
            m = np.where(on_pole, np.nextafter(m, np.inf), m)
            D = self.mu[None, :] - m[:, None]
            on_pole = np.any(D == 0.0, axis=1)
        p0 = np.count_nonzero(D > 0, axis=1)
        ssum = np.sum(self.w2[None, :] / D, axis=1)
        rigid = np.isinf(delta)
        c = -m * np.where(rigid, 0.0, delta)
        s = 1.0 + np.multiply(c, ssum, out=np.zeros_like(ssum), where=c != 0.0)
        up = (c > 0) & (s < 0)
        down = ((c < 0) & (s < 0)) | (rigid & (ssum > 0))
        return p0 + up - down

    def _solve(self, k: np.ndarray) -> np.ndarray:
        delta = k - self.k_ref
        mu = self.mu
        pos = np.sort(mu[mu > 0])[::-1]
        if pos.size == 0:
            return np.full(k.shape, np.inf)
        mu1 = pos[0]
        mu2 = pos[1] if pos.size > 1 else mu1 * 1e-9
        csum = float(np.sum(self.w2))
        hi = np.where(delta >= 0, mu1 * (1 + 1e-12), mu1 / np.maximum(1 + np.where(delta < 0, delta, 0) * csum,
                                                                      1e-300) * (1 + 1e-12))
        lo = np.where(delta >= 0, mu2 * (1 - 1e-12), mu1 * (1 - 1e-12))
        if np.any(1 + np.minimum(delta, 0) * csum <= 1e-9):
            raise ModelError(self.kind, "a stiffness in the range leaves the column a mechanism")
        has = self._count(lo, delta) >= 1
        lo = np.where(has, lo, mu1 * 1e-12)
        has = self._count(lo, delta) >= 1
        llo, lhi = np.log(lo), np.log(hi)
        for _ in range(_BISECT_ITER):
            mid = 0.5 * (llo + lhi)
            above = self._count(np.exp(mid), delta) >= 1
            llo = np.where(above, mid, llo)
            lhi = np.where(above, lhi, mid)
        mu_max = np.exp(0.5 * (llo + lhi))
        return np.where(has, 1.0 / mu_max, np.inf)
