"""Accuracy and speed of the elastic buckling solver, measured side by side in one run.

Run:  python benchmarks/bench_eigen.py

Prints
  (a) error of the lowest load factor of a pinned column against the exact Euler
      load versus elements per segment, with the observed order of convergence;
  (b) wall time to solve 1-, 10- and 100-segment columns at the default tolerance;
  (c) 10,000 load-factor evaluations of a three-segment column whose base spring
      varies, against a plain baseline (assembly in a Python loop + dense
      scipy.linalg.eigh for every point, timed on a few hundred points and scaled);
  (d) dense versus sparse eigen solver time by system size (the crossover that
      sets fea.solve.eigen.DENSE_MAX_DOF);
  (e) the cost of converging every reported load factor: each demo case's planes
      solved for 3 modes (all three within the tolerance) against 1 mode (the lowest
      only), with the largest estimated error of the higher modes.
The study column is a scenario of our own invention.
"""

from __future__ import annotations

import math
import sys
import time
from pathlib import Path

import numpy as np
import scipy.linalg as sla

sys.path.insert(0, str(Path(__file__).resolve().parents[1]))

ROOT = Path(__file__).resolve().parents[1]

from fea import RIGID, Column, PointLoad, Restraint, Segment, buckling  # noqa: E402
from fea.assemble import assemble  # noqa: E402
from fea.mesh import build_mesh  # noqa: E402
from fea.solve.eigen import solve_assembled  # noqa: E402
from fea.solve.one_spring import SpringStudy  # noqa: E402

E = 210e9


def best_of(fn, repeat=5):
    best = math.inf
    for _ in range(repeat):
        t = time.perf_counter()
        fn()
        best = min(best, time.perf_counter() - t)
    return best


def part_a() -> None:
    print("(a) pinned column, error of the lowest load factor vs elements (exact: Euler pi^2 EI / L^2)")
    L, I = 5.0, 1e-5
    col = Column(segments=(Segment(L, E, I),), restraints=(Restraint(0.0, RIGID), Restraint(L, RIGID)),
                 point_loads=(PointLoad(L, 1.0),))
    exact = math.pi**2 * E * I / L**2
    hs, errs = [], []
    print(f"  {'elements':>8} {'load factor':>18} {'rel. error':>11} {'order':>6}")
    for level in range(0, 5):
        mesh = build_mesh(col, level)
        lam, _, _ = solve_assembled(assemble(mesh), 1)
        err = abs(lam[0] - exact) / exact
        order = "" if not errs else f"{math.log(errs[-1] / err) / math.log(2):6.2f}"
        hs.append(1.0 / mesh.n_el)
        errs.append(err)
        print(f"  {mesh.n_el:8d} {lam[0]:18.6f} {err:11.3e} {order:>6}")
    slope = np.polyfit(np.log(hs), np.log(errs), 1)[0]
    print(f"  observed order of convergence (least squares): {slope:.2f} (expected 4)")


def column_of(n_seg: int) -> Column:
    rng = np.random.default_rng(n_seg)
    lengths = rng.uniform(0.5, 1.5, n_seg)
    inert = rng.uniform(0.5e-5, 2e-5, n_seg)
    H = float(np.sum(lengths))
    segs = tuple(Segment(float(a), E, float(b)) for a, b in zip(lengths, inert))
    joints = np.cumsum(lengths)
    loads = tuple(PointLoad(float(x), 1.0) for x in joints[::max(1, n_seg // 5)])
    rest = [Restraint(0.0, RIGID, 5e6), Restraint(H, RIGID)]
    rest += [Restraint(float(x), 2e6) for x in joints[1:-1:3]]
    return Column(segments=segs, restraints=tuple(rest), point_loads=loads + (PointLoad(H, 1.0),))


def part_b() -> None:
    print("\n(b) time to solve at the default tolerance (1e-6), best of 5")
    for n in (1, 10, 100):
        col = column_of(n)
        res = buckling(col)
        t = best_of(lambda: buckling(col))
        print(f"  {n:4d} segments: {t * 1e3:8.2f} ms  ({res.n_elements} elements, {res.solver}, "
              f"est. error {res.discretisation_error:.1e})")


def study_column() -> Column:
    """Invented demo: three-segment column, partially fixed base, load at each joint."""
    return Column(
        segments=(Segment(3.0, E, 2.0e-5), Segment(2.5, E, 1.2e-5), Segment(2.0, E, 8.0e-6)),
        restraints=(Restraint(0.0, RIGID, 1e6), Restraint(5.5, RIGID), Restraint(7.5, RIGID)),
        point_loads=(PointLoad(7.5, 1.0), PointLoad(3.0, 2.0)),
    )


def baseline_point(col: Column, level: int) -> float:
    """Plain approach: assemble with a Python loop, dense eigh of the whole spectrum."""
    from fea.elements import elastic_stiffness, geometric_stiffness

    mesh = build_mesh(col, level)
    n = mesh.n_dof
    K = np.zeros((n, n))
    G = np.zeros((n, n))
    for e in range(mesh.n_el):
        ke = elastic_stiffness(mesh.L[e:e + 1], mesh.EI[e:e + 1], mesh.phi[e:e + 1])[0]
        ge = geometric_stiffness(mesh.L[e:e + 1], mesh.N_var[e:e + 1], mesh.phi[e:e + 1])[0]
        d = slice(2 * e, 2 * e + 4)
        K[d, d] += ke
        G[d, d] += ge
    keep = []
    for i in range(n):
        k = mesh.k_lat[i // 2] if i % 2 == 0 else mesh.k_rot[i // 2]
        if math.isinf(k):
            continue
        K[i, i] += k
        keep.append(i)
    K, G = K[np.ix_(keep, keep)], G[np.ix_(keep, keep)]
    mu = sla.eigh(G, K, eigvals_only=True)
    lam = 1.0 / mu[mu > 0]
    return float(np.min(lam))


def part_c() -> None:
    print("\n(c) 10,000 evaluations of a three-segment column, base rotational spring 1e2..1e9 N m/rad")
    col = study_column()
    ks = np.logspace(2, 9, 10_000)
    t0 = time.perf_counter()
    study = SpringStudy.build(col, 0, "rotation", float(ks[0]), float(ks[-1]))
    t_build = time.perf_counter() - t0
    t0 = time.perf_counter()
    lam = study.load_factors(ks)
    t_eval = time.perf_counter() - t0
    t_fast = t_build + t_eval
    n_base = 300
    sample = np.linspace(0, ks.size - 1, n_base).astype(int)
    t0 = time.perf_counter()
    base = [baseline_point(col.with_restraint(0, rotation=float(ks[i])), study.mesh_level) for i in sample]
    t_base = (time.perf_counter() - t0) * ks.size / n_base
    dev = np.max(np.abs(np.array(base) / lam[sample] - 1))
    print(f"  mesh level {study.mesh_level}, estimated discretisation error {study.discretisation_error:.1e}")
    print(f"  study (build {t_build * 1e3:.0f} ms + evaluate {t_eval * 1e3:.0f} ms): {t_fast:.3f} s")
    print(f"  baseline, Python-loop assembly + dense eigh per point: {t_base:.2f} s "
          f"(timed on {n_base} points, scaled to {ks.size})")
    print(f"  speed-up: {t_base / t_fast:.1f}x   largest relative difference from baseline: {dev:.1e}")


def part_d() -> None:
    print("\n(d) dense vs sparse eigen solve (3 modes) by reduced system size, best of 3")
    col = column_of(40)
    for level in range(0, 5):
        asm = assemble(build_mesh(col, level))
        n = asm.K.shape[0]
        td = best_of(lambda: solve_assembled(asm, 3, "dense"), 3)
        ts = best_of(lambda: solve_assembled(asm, 3, "sparse"), 3)
        print(f"  n = {n:5d}: dense {td * 1e3:8.2f} ms, sparse {ts * 1e3:8.2f} ms")


def part_e() -> None:
    from fea.pipeline import load_case

    print("\n(e) every reported mode converged: 3 modes against the lowest only, per demo case (best of 3)")
    total3 = total1 = 0.0
    for path in sorted((ROOT / "cases").glob("*.toml")):
        case = load_case(str(path))
        cols = [c for _, c in case.planes]
        t3 = best_of(lambda: [buckling(c, n_modes=3, tol=case.tolerance) for c in cols], 3)
        t1 = best_of(lambda: [buckling(c, n_modes=1, tol=case.tolerance) for c in cols], 3)
        worst = max(float(max(r.mode_errors)) for r in (buckling(c, n_modes=3, tol=case.tolerance) for c in cols))
        total3, total1 = total3 + t3, total1 + t1
        print(f"  {path.stem:<28} 3 modes {t3 * 1e3:7.1f} ms, lowest only {t1 * 1e3:7.1f} ms, "
              f"ratio {t3 / t1:4.2f}, largest estimate {worst:.1e}")
    print(f"  all cases: ratio {total3 / total1:.2f}")


if __name__ == "__main__":
    t0 = time.perf_counter()
    part_a()
    part_b()
    part_c()
    part_d()
    part_e()
    print(f"\ntotal benchmark time {time.perf_counter() - t0:.1f} s")
