"""Time of very many-segment columns, and their accuracy against the Euler load.

Run:  python benchmarks/bench_extreme.py [n ...]     (default: 100 1000 10000)

A pinned-pinned column of ``n`` equal segments (12 m high, one steel section,
an axial load at the top) is solved at the default tolerance; its exact
critical load is the Euler load ``pi^2 EI / H^2``.  Every segment boundary is a
station, so the level-0 mesh has ``n`` elements and the solver takes the banded
Cholesky + ARPACK path.  Prints the best-of-three wall time of each size, its ratio to the
100-segment time, and the relative error of the load factor.
"""

from __future__ import annotations

import math
import sys
import time
from pathlib import Path

sys.path.insert(0, str(Path(__file__).resolve().parents[1]))

from fea import RIGID, Column, PointLoad, Restraint, Segment, buckling  # noqa: E402

E, I, H = 210e9, 8.36e-5, 12.0


def many_segments(n: int) -> Column:
    """A pinned column of ``n`` equal segments with a unit axial load at the top."""
    seg = Segment(H / n, E, I)
    h = seg.length * n
    return Column(segments=(seg,) * n, restraints=(Restraint(0.0, RIGID), Restraint(h, RIGID)),
                  point_loads=(PointLoad(h, 1.0),))


def main(sizes: list[int]) -> None:
    buckling(many_segments(10), n_modes=1)  # warm-up: imports and first calls are not timed
    base = None
    print(f"{'segments':>9} {'time [s]':>9} {'ratio':>8} {'elements':>9} {'solver':>7} {'rel. error':>11}")
    for n in sizes:
        col = many_segments(n)
        dt = math.inf
        for _ in range(3):  # best of three: the machine may be shared
            t0 = time.perf_counter()
            res = buckling(col, n_modes=1)
            dt = min(dt, time.perf_counter() - t0)
        if base is None:
            base = dt  # the first size (100 by default) is the reference of the ratio
        exact = math.pi**2 * E * I / col.height**2
        err = res.load_factor / exact - 1.0
        print(f"{n:9d} {dt:9.2f} {dt / base:8.1f} {res.n_elements:9d} {res.solver:>7} {err:11.2e}")


if __name__ == "__main__":
    main([int(a) for a in sys.argv[1:]] or [100, 1000, 10000])
