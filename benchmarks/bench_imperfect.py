"""Timing of the column-level nonlinear analysis (Column -> co-rotational fibre model -> path).

An invented pin-ended rolled-I-like column (h = 320 mm, b = 160 mm, tf = 11 mm,
tw = 7.5 mm, r = 15 mm; S355) about its minor axis at relative slenderness 1.0,
with an L/1000 half-sine bow and a 0.3 fy residual-stress pattern, is mapped
through :func:`fea.solve.imperfect.nonlinear_path` with about 40
fibres (the nested mesh gives 32 elements for "at least 20"; 16 are timed too) and traced
for 100 arc-length steps (through the limit point and down
the descending branch).  Prints the wall time (best of three), with the mapping
time shown separately.

Run: ``python3 benchmarks/bench_imperfect.py``
"""

from __future__ import annotations

import math
import time

import numpy as np

from fea import RIGID, Column, PointLoad, Restraint, Segment
from fea.model.imperfection import Imperfection, SegmentSection
from fea.sections import ISection
from fea.solve.imperfect import nonlinear_path


def main(n_steps: int = 100, repeats: int = 3, min_elements: int = 20) -> None:
    E, fy = 210e9, 355e6
    t0 = time.perf_counter()
    sec = SegmentSection.from_shape(ISection(b=0.16, h=0.32, tf=0.011, tw=0.0075, r=0.015), "minor", fy,
                                    n_fibres=16, residual_stress=0.3)
    t_sec = time.perf_counter() - t0
    I = float(np.sum(sec.fibre_area * sec.fibre_y**2))
    L = math.pi * math.sqrt(E * I / (sec.A * fy))  # relative slenderness 1.0
    col = Column(segments=(Segment(L, E, I, A=sec.A),), restraints=(Restraint(0.0, RIGID), Restraint(L, RIGID)),
                 point_loads=(PointLoad(L, sec.A * fy),))
    best = math.inf
    for _ in range(repeats):
        t0 = time.perf_counter()
        p = nonlinear_path(col, Imperfection("half-sine", ratio=1000), [sec], min_elements=min_elements,
                           max_steps=n_steps, drop_fraction=None, max_step=0.01 * L, initial_step=0.05)
        best = min(best, time.perf_counter() - t0)
    print(f"column-level fibre path: {p.n_elements} elements x 3 Gauss points x {p.n_fibres} fibres "
          f"(section fibres built once in {t_sec:.3f} s)")
    print(f"status {p.status}; {len(p.load_factors) - 1} path points, n_steps {p.n_steps} (incl. limit refinement), "
          f"n_iter {p.n_iter}, bisections {p.n_bisections}")
    print(f"limit load factor N_u/(A fy) = {p.limit_load_factor:.5f}, final lambda {p.load_factors[-1]:.4f}, "
          f"max relative residual {p.max_residual:.2e}")
    print(f"best wall time of {repeats}: {best:.3f} s  ({1e3 * best / max(p.n_iter, 1):.2f} ms per iteration)")


if __name__ == "__main__":
    # the nested meshes double (4, 8, 16, 32 elements): "at least 20" gives 32; 16 is shown for comparison
    main(min_elements=20)
    print()
    main(min_elements=16)
