"""Speed of a restraint sweep: 10,000 load-factor evaluations of a three-segment demo case.

Run:  python benchmarks/bench_study.py

Prints, side by side in one run:
  * the sweep through the study API (`fea.study.sweep`, spring path: one
    eigen-decomposition, rank-one secular count per value) of the base
    rotational stiffness of cases/study_three_segment.toml (invented demo),
    10,000 values from free to rigid at the case's default tolerance 1e-6,
    timed end to end (range set-up, mesh convergence, evaluation, K);
  * the baseline: re-solving each point from scratch with dense LAPACK
    (assemble at the same mesh level, scipy.linalg.eigh of the whole
    generalised problem), timed on 300 of the points and scaled to 10,000;
  * the ratio, and the largest relative difference between the two.
Targets (issue 6): ratio >= 20 and sweep < 10 s on the 2-core machine.
"""

from __future__ import annotations

import sys
import time
from pathlib import Path

import numpy as np
import scipy.linalg as sla

ROOT = Path(__file__).resolve().parents[1]
sys.path.insert(0, str(ROOT))

from fea.assemble import assemble  # noqa: E402
from fea.cli.study_common import study_from_text  # noqa: E402
from fea.mesh import build_mesh  # noqa: E402
from fea.study.paths import parse_key  # noqa: E402
from fea.study.sweep import make_range, sweep  # noqa: E402

N_POINTS = 10_000
N_BASELINE = 300


def baseline_point(column, level: int) -> float:
    """From scratch: mesh, assemble, dense generalised eigh of the whole spectrum."""
    asm = assemble(build_mesh(column, level))
    mu = sla.eigh(asm.G, asm.K, eigvals_only=True)
    return float(1.0 / mu[mu > 0].max())


def main() -> None:
    text = (ROOT / "cases/study_three_segment.toml").read_text()
    study = study_from_text(text)
    key = parse_key("restraint[1].rotation")
    t0 = time.perf_counter()
    r = make_range(study, key, 0.0, np.inf, N_POINTS, "log")
    res = sweep(study, [r], jobs=1)
    t_sweep = time.perf_counter() - t0
    lam = res.governing

    col = study.case.column("in-plane")
    # the mesh level the spring path converged on (largest at the two ends of the range)
    from fea.study.spring_set import converged_level

    level = max(converged_level(col.with_restraint(0, rotation=v), res.tolerance) for v in (0.0, np.inf))
    sample = np.linspace(0, N_POINTS - 1, N_BASELINE).astype(int)
    t0 = time.perf_counter()
    base = np.array([baseline_point(col.with_restraint(0, rotation=float(r.values[i])), level) for i in sample])
    t_base = (time.perf_counter() - t0) * N_POINTS / N_BASELINE
    dev = float(np.max(np.abs(base / lam[sample] - 1)))
    print(f"sweep of {key.text}, free to rigid, {N_POINTS} values, tolerance {res.tolerance:.0e} "
          f"({res.method} path, mesh level {level})")
    print(f"  {'study sweep':<44} {t_sweep:9.3f} s")
    print(f"  {'re-solve each point, dense LAPACK (scaled)':<44} {t_base:9.3f} s   "
          f"(timed on {N_BASELINE} points)")
    print(f"  speed-up {t_base / t_sweep:.1f}x (target >= 20x); sweep under 10 s: {t_sweep < 10}")
    print(f"  largest relative difference between the two: {dev:.1e}")


if __name__ == "__main__":
    main()
