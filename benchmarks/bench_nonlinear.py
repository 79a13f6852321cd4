"""Timing of the co-rotational fibre kernel on a typical imperfect column.

A pin-ended column of 20 elements with a 40-fibre I-like section (minor axis),
S355, residual stresses and an L/1000 bow is traced for 100 arc-length steps
(through the limit point and well down the descending branch).  Prints the wall
time, the number of steps and Newton iterations.

Run: ``python3 benchmarks/bench_nonlinear.py``
"""

from __future__ import annotations

import time

import numpy as np

from fea.solve.fibre import make_fibre_section
from fea.solve.pathfollow import trace_path


def i_section_fibres(h, b, tf, tw, fy, n_strips):
    """Minor-axis fibres of an I section: two flanges of ``n_strips`` strips, web of 2."""
    yf = (np.arange(n_strips) + 0.5) / n_strips * b - b / 2
    af = np.full(n_strips, b * tf / n_strips)
    yw = np.array([-tw / 4, tw / 4])
    aw = np.full(2, (h - 2 * tf) * tw / 2)
    shape = 1.0 - np.abs(yf) / (b / 2)
    # flange: -0.3 fy at the tips rising linearly to s_t at the centre; web uniform s_t
    c1 = 2 * np.sum(af * shape)
    c0 = 2 * np.sum(af * (-0.3 * fy + 0.3 * fy * shape))
    s_t = -c0 / (c1 + aw.sum())
    sf = -0.3 * fy + (s_t + 0.3 * fy) * shape
    return (np.r_[yf, yf, yw], np.r_[af, af, aw], np.r_[sf, sf, np.full(2, s_t)])


def main(n_el: int = 20, n_steps: int = 100, repeats: int = 3) -> None:
    E, fy = 210e9, 355e6
    y, area, sr = i_section_fibres(0.32, 0.16, 0.011, 0.0075, fy, 19)
    A = area.sum()
    Iz = np.sum(area * y * y)
    L = np.pi * np.sqrt(E * Iz / (A * fy)) * 1.0  # relative slenderness 1.0
    yy = np.linspace(0.0, L, n_el + 1)
    xy0 = np.c_[L / 1000 * np.sin(np.pi * yy / L), yy]
    conn = np.c_[np.arange(n_el), np.arange(1, n_el + 1)]
    sec = make_fibre_section(y, area, E, fy, n_el, sigma_r=sr)
    F = np.zeros(3 * (n_el + 1))
    F[3 * n_el + 1] = -A * fy
    best = np.inf
    for _ in range(repeats):
        t0 = time.perf_counter()
        r = trace_path(xy0, conn, sec, F, fixed=[0, 1, 3 * n_el], initial_step=0.05, max_steps=n_steps,
                       drop_fraction=None, max_step=0.01 * L)
        best = min(best, time.perf_counter() - t0)
    print(f"co-rotational fibre path: {n_el} elements x {r.ip_positions.size} Gauss points x {y.size} fibres, "
          f"{n_el * 3 + 3} DOFs")
    print(f"status {r.status}; {len(r.load_factors) - 1} path steps, n_steps {r.n_steps} (incl. limit refinement), "
          f"n_iter {r.n_iter}, bisections {r.n_bisections}")
    print(f"limit load factor N_u/(A fy) = {r.limit_load_factor:.5f}, final lambda {r.load_factors[-1]:.4f}, "
          f"max relative residual {r.max_residual:.2e}")
    print(f"best wall time of {repeats}: {best:.3f} s  ({1e3 * best / max(r.n_iter, 1):.2f} ms per iteration)")


if __name__ == "__main__":
    main()
