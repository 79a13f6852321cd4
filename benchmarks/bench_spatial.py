"""Accuracy and speed of the thin-walled (Vlasov) buckling kernel, measured side by side in one run.

Run:  python benchmarks/bench_spatial.py

Prints
  (a) error of the lateral-torsional critical moment of a simply supported I beam under uniform moment against
      the closed form (Timoshenko & Gere, Theory of Elastic Stability, 2nd ed., section 6.2, from memory) versus
      elements, with the observed order of convergence (about 4 expected);
  (b) wall time of the spatial analysis of a 10-segment column against the flexural plane analysis of the same
      column (fea.solve.eigen.buckling), best of five rounds that run the two in turn, and their ratio (target:
      spatial under 50 ms).  One BLAS thread, as the command runs, unless OPENBLAS_NUM_THREADS is set.
The section constants and the column are invented for the benchmark.
"""

from __future__ import annotations

import math
import os
import sys
import time
from pathlib import Path

# one BLAS thread, as the command runs (fea.cli.one_blas_thread), unless the caller set a count
for _name in ("OPENBLAS_NUM_THREADS", "OMP_NUM_THREADS", "MKL_NUM_THREADS"):
    os.environ.setdefault(_name, "1")

import numpy as np  # noqa: E402

sys.path.insert(0, str(Path(__file__).resolve().parents[1]))

from fea import RIGID, Column, PointLoad, Restraint, Segment, buckling  # noqa: E402
from fea.solve.spatial import (  # noqa: E402
    AxialLoad,
    SpatialColumn,
    SpatialRestraint,
    SpatialSegment,
    load_factors_on,
    spatial_buckling,
)

E, G = 210e9, 81e9
A, IY, IZ, J, IW = 8.3e-3, 2.3e-4, 2.0e-5, 4.5e-7, 7.4e-7  # an invented I section


def best_of(fns, repeat=5) -> list[float]:
    """Best wall time of each function, the functions run in turn in every round (the same machine load for each)."""
    best = [math.inf] * len(fns)
    for _ in range(repeat):
        for i, fn in enumerate(fns):
            t = time.perf_counter()
            fn()
            best[i] = min(best[i], time.perf_counter() - t)
    return best


def part_a() -> None:
    L = 6.0
    seg = SpatialSegment(L, E, G, A, IY, IZ, J, IW, M1=1.0, M2=1.0)
    fork = dict(u=RIGID, v=RIGID, twist=RIGID)
    col = SpatialColumn((seg,), (SpatialRestraint(0.0, **fork), SpatialRestraint(L, **fork)))
    exact = math.pi / L * math.sqrt(E * IZ * G * J * (1 + math.pi**2 * E * IW / (L**2 * G * J)))
    print("(a) uniform-moment lateral-torsional buckling, error of M_cr vs elements (exact: Timoshenko & Gere 6.2)")
    print(f"  {'elements':>8} {'M_cr [N m]':>16} {'rel. error':>11} {'order':>6}")
    prev = None
    for k in range(0, 6):
        n = 2**k
        m = float(load_factors_on(col, np.linspace(0.0, L, n + 1), 1)[0])
        err = abs(m - exact) / exact
        order = f"{math.log2(prev / err):6.2f}" if prev else ""
        print(f"  {n:8d} {m:16.6f} {err:11.2e} {order}")
        prev = err


def part_b() -> None:
    lengths = [1.0 + 0.1 * i for i in range(10)]
    H = sum(lengths)
    stations = np.cumsum([0.0] + lengths)
    plane = Column(segments=tuple(Segment(x, E, IZ) for x in lengths),
                   restraints=(Restraint(0.0, RIGID), Restraint(float(stations[5]), 5e5), Restraint(H, RIGID)),
                   point_loads=(PointLoad(H, 1.0),))
    fork = dict(u=RIGID, v=RIGID, twist=RIGID)
    spatial = SpatialColumn(tuple(SpatialSegment(x, E, G, A, IY, IZ, J, IW) for x in lengths),
                            (SpatialRestraint(0.0, **fork), SpatialRestraint(float(stations[5]), u=5e5),
                             SpatialRestraint(H, **fork)), loads=(AxialLoad(H, 1.0),))
    spatial_buckling(spatial, n_modes=1)  # warm-up (imports)
    buckling(plane, n_modes=1)
    t_s, t_p = best_of([lambda: spatial_buckling(spatial, n_modes=1), lambda: buckling(plane, n_modes=1)])
    rs, rp = spatial_buckling(spatial, n_modes=1), buckling(plane, n_modes=1)
    print("(b) 10-segment column, default tolerance, lowest mode (best of five)")
    print(f"  spatial: {1e3 * t_s:8.2f} ms  ({rs.n_elements} elements, {rs.kinds[0]}, lam = {rs.load_factors[0]:.6e})")
    print(f"  plane:   {1e3 * t_p:8.2f} ms  ({rp.n_elements} elements, lam = {rp.load_factors[0]:.6e})")
    print(f"  ratio spatial / plane: {t_s / t_p:.1f}   (target: spatial under 50 ms)")


if __name__ == "__main__":
    part_a()
    part_b()
