"""Column -> finite-element mesh: node heights and per-element properties.

Pure: takes a :class:`~fea.model.Column`, returns a :class:`Mesh` of arrays in
SI units.  A node is placed at every station (joints, restraints, load points,
ends of foundations and distributed loads).  Each interval between stations is
divided into equal elements; refinement level ``r`` doubles every interval's
element count ``r`` times, so successive meshes are nested (which is what makes
the lowest load factor fall monotonically under refinement).
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np

from .elements import GAUSS_W, GAUSS_XI
from .model import STATION_TOL, Column

__all__ = ["Mesh", "build_mesh", "BASE_DIVISIONS", "interval_shifts", "segment_min_ei"]

#: Elements over the whole height at refinement level 0 (at least one per interval).
BASE_DIVISIONS = 4

#: An interval shorter than ``2**-GRADE_FREE`` of a level-0 element, in buckling-wavelength terms
#: (length scaled by ``sqrt(EI_min / EI)``), starts refining only at a later level (see
#: :func:`interval_shifts`).  Ordinary columns are far from it, so their meshes are the plain nested ones.
GRADE_FREE = 6


@dataclass(frozen=True)
class Mesh:
    """Arrays describing one discretisation of a column (SI units).

    Attributes
    ----------
    x : (n_nodes,) node heights [m]
    station_nodes : dict height -> node index for every station
    L : (n_el,) element lengths [m]
    seg : (n_el,) segment index of each element
    x_gauss : (n_el, 4) heights of the Gauss points [m]
    EI : (n_el, 4) flexural rigidity at the Gauss points [N m^2]
    phi : (n_el,) shear parameter 12 EI / (S L^2) [-]
    N_var, N_perm : (n_el, 4) axial compression at the Gauss points from the
        variable loads (at load factor 1) and the permanent loads [N]
    k_found : (n_el, 4) foundation modulus at the Gauss points [N/m^2]
    k_lat, k_rot : (n_nodes,) nodal springs [N/m], [N m/rad]; ``inf`` = rigid
    lean_var, lean_perm : (n_nodes,) destabilising lateral stiffness of leaning
        loads, P / h, variable (per unit load factor) and permanent [N/m]
    level : refinement level
    """

    x: np.ndarray
    station_nodes: dict
    L: np.ndarray
    seg: np.ndarray
    x_gauss: np.ndarray
    EI: np.ndarray
    phi: np.ndarray
    N_var: np.ndarray
    N_perm: np.ndarray
    k_found: np.ndarray
    k_lat: np.ndarray
    k_rot: np.ndarray
    lean_var: np.ndarray
    lean_perm: np.ndarray
    level: int

    @property
    def n_nodes(self) -> int:
        return self.x.size

    @property
    def n_el(self) -> int:
        return self.L.size

    @property
    def n_dof(self) -> int:
        return 2 * self.x.size


def build_mesh(column: Column, level: int = 0) -> Mesh:
    """Discretise ``column`` at refinement ``level`` (>= 0)."""
    H = column.height
    stations = np.array(column.stations())
    joints = np.array(column.joints)
    tol = STATION_TOL * H

    a_, b_ = stations[:-1], stations[1:]
    n0 = np.maximum(1, np.ceil((b_ - a_) / H * BASE_DIVISIONS - 1e-9)).astype(np.int64)
    counts = n0 * 2 ** np.maximum(0, level - interval_shifts(column, stations))
    # node heights: the stations, then every interval divided into its equal elements (vectorised)
    first = np.repeat(np.cumsum(counts) - counts, counts)
    k = np.arange(1, int(counts.sum()) + 1) - first
    iv = np.repeat(np.arange(counts.size), counts)
    x = np.concatenate([[stations[0]], a_[iv] + (b_[iv] - a_[iv]) * k / counts[iv]])
    x[-1] = H
    n_nodes = x.size
    station_nodes = {float(s): int(np.argmin(np.abs(x - s))) for s in stations}

    x0, x1 = x[:-1], x[1:]
    L = x1 - x0
    mid = 0.5 * (x0 + x1)
    seg = np.searchsorted(joints, mid, side="right") - 1
    seg = np.clip(seg, 0, len(column.segments) - 1)
    xg = x0[:, None] + L[:, None] * GAUSS_XI[None, :]

    EI = np.empty_like(xg)
    phi = np.zeros_like(L)
    cuts = np.searchsorted(seg, np.arange(len(column.segments) + 1))  # elements ascend, so seg is sorted
    for i, s in enumerate(column.segments):
        m = slice(cuts[i], cuts[i + 1])
        if cuts[i] == cuts[i + 1]:
            continue
        EI[m] = s.E * s.inertia_at(xg[m] - joints[i])
        if s.S is not None:
            EI_mean = EI[m] @ GAUSS_W
            phi[m] = 12.0 * EI_mean / (s.S * L[m] ** 2)

    N_var = column.axial_force(xg, permanent=False)
    N_perm = column.axial_force(xg, permanent=True)

    k_found = np.zeros_like(xg)
    for f in column.foundations:
        inside = (mid > f.bottom - tol) & (mid < f.top + tol)
        k_found[inside] += f.modulus_at(xg[inside])

    k_lat = np.zeros(n_nodes)
    k_rot = np.zeros(n_nodes)
    for r in column.restraints:
        node = _node_at(x, r.at, tol)
        k_lat[node] += r.lateral
        k_rot[node] += r.rotation

    lean_var = np.zeros(n_nodes)
    lean_perm = np.zeros(n_nodes)
    for lean in column.leaning_loads:
        node = _node_at(x, lean.at, tol)
        target = lean_perm if lean.permanent else lean_var
        target[node] += lean.P / lean.height

    return Mesh(x=x, station_nodes=station_nodes, L=L, seg=seg, x_gauss=xg, EI=EI, phi=phi, N_var=N_var,
                N_perm=N_perm, k_found=k_found, k_lat=k_lat, k_rot=k_rot, lean_var=lean_var,
                lean_perm=lean_perm, level=level)


def segment_min_ei(column: Column) -> np.ndarray:
    """Smallest flexural rigidity of each segment (the smaller end of a tapered one) [N m^2]."""
    return np.array([s.E * min(s.I, s.I if s.I_top is None else s.I_top) for s in column.segments])


def interval_shifts(column: Column, stations: np.ndarray) -> np.ndarray:
    """Levels by which each station interval's refinement is delayed (0 for ordinary columns).

    The discretisation error of a cubic element grows with ``(L_e k)^4``, ``k = sqrt(N / EI)``:
    an interval that is very short, or very much stiffer than the most flexible segment, is
    already resolved by one element long after the rest needs refining, while refining it only
    adds round-off (nearly rigid elements with huge stiffness terms).  Its element count
    doubles only from level ``shift`` on, which keeps the meshes nested.
    """
    H = column.height
    joints = np.array(column.joints)
    a, b = stations[:-1], stations[1:]
    seg = np.clip(np.searchsorted(joints, 0.5 * (a + b), side="right") - 1, 0, len(column.segments) - 1)
    ei = segment_min_ei(column)
    rho = (b - a) / H * BASE_DIVISIONS * np.sqrt(ei.min() / ei[seg])
    with np.errstate(divide="ignore"):
        return np.maximum(0, np.floor(-np.log2(rho)) - GRADE_FREE).astype(np.int64)


def _node_at(x: np.ndarray, at: float, tol: float) -> int:
    node = int(np.argmin(np.abs(x - at)))
    if abs(x[node] - at) > max(tol, 1e-12):  # pragma: no cover - stations are always nodes
        raise AssertionError(f"station {at} is not a node")
    return node

