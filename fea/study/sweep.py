"""Sweeps of one or two case inputs: load factor and effective-length factors over a range or grid.

Two ways to a point:

* **spring path** - every swept input is a restraint spring or a foundation
  modulus.  One restraint spring:
  :class:`fea.solve.one_spring.SpringStudy` gives every value from one
  eigen-decomposition per plane.  Otherwise :class:`SpringModel` holds one
  assembled mesh per plane and each grid point costs a few banded Cholesky
  factorisations (inertia bisection); rows of the grid go to the process pool.
* **re-solve path** - any other input (a length, a load, an I, E...): a copy
  of the case document is changed at the key path and rebuilt into a checked
  case by the rebuild function the command layer passes (springs are set on
  the parsed case), and solved from scratch by :func:`fea.solve.eigen.buckling`
  at the case's tolerance.  Points go to the process pool in chunks.

Both give, for each bending plane, the lowest load factor and the K of chosen
segments; the governing load factor is the lowest over the planes.  A point
where the column is a mechanism (or its permanent loads alone buckle it) has
load factor 0 and K NaN; a point that cannot be analysed has NaN and a note.

Parallel runs use :class:`concurrent.futures.ProcessPoolExecutor`; each point
is computed by the same function whichever process runs it, so parallel and
serial sweeps give identical numbers.  Pure apart from the worker processes:
no files, no printing (progress is reported through a callback).
"""

from __future__ import annotations

import math
import os
from collections.abc import Mapping
from concurrent.futures import ProcessPoolExecutor, as_completed
from dataclasses import dataclass

import numpy as np

from ..errors import CaseError, FeaError, ModelError
from ..solve.eigen import buckling
from ..solve.one_spring import SpringStudy
from .paths import KeyPath, parse_key
from .spring_set import SpringModel, converged_level, effective_length_factors, is_foundation_kind, with_stiffness
from .target import Rebuild, StudyCase, rebuilt

__all__ = ["ParameterRange", "SweepResult", "make_range", "sweep", "reference_stiffness", "SCALES",
           "LOG_SPAN_BELOW", "LOG_SPAN_ABOVE"]

SCALES = ("linear", "log")
#: A "free" end of a logarithmic spring range starts at this fraction of the reference stiffness.
LOG_SPAN_BELOW = 1e-2
#: A "rigid" end of a logarithmic spring range ends at this multiple of the reference stiffness.
LOG_SPAN_ABOVE = 1e4


@dataclass(frozen=True)
class ParameterRange:
    """Values of one swept input (SI).

    Attributes
    ----------
    key : the key path
    values : (n,) values in sweep order; a spring range may start at 0 (free)
        and end at inf (rigid)
    scale : "linear" or "log" (spacing of the finite values)
    """

    key: KeyPath
    values: np.ndarray
    scale: str

    @property
    def finite(self) -> np.ndarray:
        """Mask of the values that can be drawn on a logarithmic axis (not free, not rigid)."""
        v = self.values
        return np.isfinite(v) & ((v > 0) if self.scale == "log" else np.ones(v.shape, bool))


def reference_stiffness(study: StudyCase, key: KeyPath) -> float:
    """A natural scale for a spring: E I / H (rotation) or E I / H^3 (lateral).

    ``E I`` is that of the segment at the restraint's station and ``H`` the
    column height.  Used only to place the finite part of a free-to-rigid range.
    """
    tg = study.targets(key)[0]
    col = study.case.column(tg.axis)
    at = col.restraints[tg.restraint].at
    seg = col.segments[-1]
    for s, (a, b) in zip(col.segments, col.segment_bounds()):
        if a - 1e-9 <= at <= b + 1e-9:
            seg = s
            break
    H = col.height
    return seg.E * seg.I_ref / (H if key.kind == "rotation" else H**3)


def make_range(study: StudyCase, key: KeyPath, start: float, stop: float, points: int,
               scale: str = "linear") -> ParameterRange:
    """Values from ``start`` to ``stop`` (SI; 0 / inf for a free / rigid spring end).

    A logarithmic spring range with a free end starts its finite values at
    ``LOG_SPAN_BELOW`` times :func:`reference_stiffness` (or 1e-4 of the other end,
    if lower) and one with a rigid end ends them at ``LOG_SPAN_ABOVE`` times it
    (or 1e4 times the other end, if higher); the free and rigid values
    themselves are the first and last points.
    """
    if scale not in SCALES:
        raise CaseError(f"{key.text}.scale", f"expected 'linear' or 'log', got {scale!r}")
    if isinstance(points, bool) or not isinstance(points, int) or not 2 <= points <= 100_000:
        raise CaseError(f"{key.text}.points", f"expected a whole number from 2 to 100000, got {points!r}")
    for v, name in ((start, "from"), (stop, "to")):
        if math.isnan(v) or (math.isinf(v) and not key.is_spring):
            raise CaseError(f"{key.text}.{name}", f"{v!r} is not a finite value")
    if start == stop:
        raise CaseError(key.text, "the range is empty: 'from' equals 'to'")
    lo_end, hi_end = [], []
    a, b = start, stop
    if scale == "linear":
        if math.isinf(a) or math.isinf(b):
            raise CaseError(f"{key.text}.scale", "a range with a rigid end needs scale = 'log'")
        return ParameterRange(key, np.linspace(a, b, points), scale)
    ref = reference_stiffness(study, key) if key.is_spring else None
    if key.is_spring and min(a, b) == 0.0:
        other = max(a, b)
        lo_end = [0.0]
        first = min(LOG_SPAN_BELOW * ref, other * 1e-4) if math.isfinite(other) else LOG_SPAN_BELOW * ref
    elif min(a, b) <= 0.0:
        raise CaseError(f"{key.text}.from", "a logarithmic range needs positive values")
    else:
        first = min(a, b)
    if key.is_spring and math.isinf(max(a, b)):
        hi_end = [math.inf]
        last = max(LOG_SPAN_ABOVE * ref, first * 1e4)
    else:
        last = max(a, b)
    n_mid = points - len(lo_end) - len(hi_end)
    if n_mid < 2:
        raise CaseError(f"{key.text}.points", f"{points} points leave fewer than 2 finite values")
    v = np.concatenate([lo_end, np.logspace(math.log10(first), math.log10(last), n_mid), hi_end])
    if a > b:
        v = v[::-1]
    return ParameterRange(key, v, scale)


@dataclass(frozen=True)
class SweepResult:
    """A one- or two-parameter sweep.

    Attributes
    ----------
    ranges : (ParameterRange,) or (ParameterRange, ParameterRange)
    axes : bending planes of the case
    segments : chosen segments (0-based)
    load_factors : axis -> array of shape (n1,) or (n1, n2) [-]
    K : axis -> array of shape (n1, n_chosen) or (n1, n2, n_chosen) [-]
    governing : lowest load factor over the planes, shape (n1,) or (n1, n2)
    governing_axis : index into ``axes`` of the governing plane, same shape
    method : "spring" or "re-solve"
    tolerance : mesh tolerance used
    notes : ((flat point index, message), ...) for points that could not be analysed
    studied_axis : the plane whose K the summary and charts show: the one plane
        the swept inputs act in, else the plane that governs at most points (it
        stays the same over the whole range even where the other plane governs)
    """

    ranges: tuple[ParameterRange, ...]
    axes: tuple[str, ...]
    segments: tuple[int, ...]
    load_factors: dict
    K: dict
    governing: np.ndarray
    governing_axis: np.ndarray
    method: str
    tolerance: float
    notes: tuple[tuple[int, str], ...] = ()
    studied_axis: str = ""

    @property
    def shape(self) -> tuple[int, ...]:
        return tuple(r.values.size for r in self.ranges)

    def K_governing(self) -> np.ndarray:
        """K of the chosen segments in the governing plane of each point, shape (..., n_chosen)."""
        stack = np.stack([self.K[a] for a in self.axes])  # (n_axes, ..., n_chosen)
        idx = self.governing_axis[None, ..., None]
        return np.take_along_axis(stack, np.broadcast_to(idx, (1,) + stack.shape[1:]), axis=0)[0]

    def K_studied(self) -> np.ndarray:
        """K of the chosen segments in the studied plane at every point, shape (..., n_chosen)."""
        return self.K[self.studied_axis or self.axes[0]]

    def other_governs(self) -> np.ndarray:
        """Mask of the points where a plane other than the studied one governs."""
        i = self.axes.index(self.studied_axis or self.axes[0])
        return (self.governing_axis != i) & ~np.isnan(self.governing)


# ---------------------------------------------------------------------------
# running tasks serially or in a process pool, results in order


def _run_tasks(fn, tasks: list, jobs: int, progress=None, weights: list[int] | None = None) -> list:
    weights = weights or [1] * len(tasks)
    total = sum(weights)
    done = 0
    out: list = [None] * len(tasks)
    if progress:
        progress(0, total)
    if jobs <= 1 or len(tasks) <= 1:
        for i, t in enumerate(tasks):
            out[i] = fn(*t)
            done += weights[i]
            if progress:
                progress(done, total)
        return out
    ex = ProcessPoolExecutor(max_workers=jobs, initializer=_worker_start, initargs=(os.getpid(),))
    try:
        futures = {ex.submit(fn, *t): i for i, t in enumerate(tasks)}
        for f in as_completed(futures):
            i = futures[f]
            out[i] = f.result()
            done += weights[i]
            if progress:
                progress(done, total)
    except BaseException:
        _stop_pool(ex)  # an error, Ctrl-C or SIGTERM: no pending point runs on, no worker stays behind
        raise
    ex.shutdown()
    return out


def _stop_pool(ex: ProcessPoolExecutor) -> None:
    """Cancel the pending tasks of ``ex`` and end its workers at once."""
    procs = list((getattr(ex, "_processes", None) or {}).values())
    ex.shutdown(wait=False, cancel_futures=True)
    for p in procs:
        try:
            p.terminate()
        except (OSError, ValueError, AttributeError):  # already gone
            pass
    for p in procs:
        try:
            p.join(2.0)
            if p.is_alive():
                p.kill()
                p.join(1.0)
        except (OSError, ValueError, AttributeError, AssertionError):
            pass


#: How often (seconds) a worker looks whether the process that started it is still alive.
_PARENT_POLL = 0.25


def _end_worker() -> None:
    """End this worker process at once (its parent is gone: nobody waits for its results)."""
    import signal

    os.kill(os.getpid(), signal.SIGKILL)


def _worker_start(parent: int) -> None:
    """Initializer of a sweep worker: leave Ctrl-C to the parent, and end when the parent dies.

    On Linux the kernel sends the worker SIGKILL when its parent ends (prctl
    PR_SET_PDEATHSIG); elsewhere, and as a second line, a daemon thread polls the
    parent's process id.
    """
    import signal
    import sys
    import threading
    import time

    signal.signal(signal.SIGINT, signal.SIG_IGN)
    if sys.platform.startswith("linux"):
        try:
            import ctypes

            libc = ctypes.CDLL(None, use_errno=True)
            libc.prctl(1, int(signal.SIGKILL), 0, 0, 0)  # 1 = PR_SET_PDEATHSIG
        except (OSError, AttributeError):  # pragma: no cover - no usable libc
            pass
    first = os.getppid()
    if first != parent:  # started through a server process, or the parent died before prctl took effect
        try:
            os.kill(parent, 0)
        except ProcessLookupError:
            _end_worker()
        except OSError:
            pass

    def watch() -> None:
        while os.getppid() == first:
            time.sleep(_PARENT_POLL)
        _end_worker()

    threading.Thread(target=watch, name="stanchion-parent-watch", daemon=True).start()


def _chunks(n: int, jobs: int, per_job: int = 8) -> list[tuple[int, int]]:
    size = max(1, math.ceil(n / max(1, jobs * per_job)))
    return [(a, min(n, a + size)) for a in range(0, n, size)]


def default_jobs() -> int:
    """Worker processes to use: the CPUs this process may run on."""
    try:
        return max(1, len(os.sched_getaffinity(0)))
    except AttributeError:  # pragma: no cover - not on Linux
        return max(1, os.cpu_count() or 1)


# ---------------------------------------------------------------------------
# re-solve path


def _resolve_points(rebuild: Rebuild, doc: dict, key_texts: tuple[str, ...], points: list[tuple[float, ...]],
                    segments: tuple[int, ...], tol: float | None):
    """Worker: rebuild and solve the case at each point; returns (lam (n_pts, n_axes), K, notes).

    ``rebuild`` (document -> case) and the plain document ``doc`` are what a
    worker process receives.  When only springs change, the case is built
    here once and the springs are set on it; otherwise each point is rebuilt.
    """
    keys = tuple(parse_key(t) for t in key_texts)
    base = StudyCase(rebuild(doc), rebuild) if all(k.is_stiffness for k in keys) else None
    rows_lam, rows_K, notes = [], [], []
    for p, values in enumerate(points):
        try:
            case = base.with_springs(keys, values) if base else rebuilt(rebuild, doc, keys, values)
            lam, Ks = [], []
            for axis, col in case.planes:
                try:
                    res = buckling(col, n_modes=1, tol=tol or case.tolerance, axis=axis)
                    lam.append(res.load_factor)
                    Ks.append([res.segments[i].effective_length_factor or math.nan for i in segments])
                except ModelError as exc:
                    if exc.field == "restraints" or "permanent loads alone" in exc.message:
                        lam.append(0.0)
                        Ks.append([math.nan] * len(segments))
                    else:
                        raise
            rows_lam.append(lam)
            rows_K.append(Ks)
        except FeaError as exc:
            rows_lam.append(None)
            rows_K.append(None)
            notes.append((p, str(exc)))
    return rows_lam, rows_K, notes


def _sweep_resolve(study: StudyCase, ranges, segments, tol, jobs, progress):
    grids = np.meshgrid(*[r.values for r in ranges], indexing="ij")
    flat = list(zip(*[g.ravel() for g in grids]))
    flat = [tuple(float(v) for v in p) for p in flat]
    keys = tuple(r.key.text for r in ranges)
    n_ax = len(study.axes)
    chunks = _chunks(len(flat), jobs)
    if study.rebuild is None:
        raise CaseError("method", "the re-solve path needs the case's rebuild function")
    doc = _plain(study.case.document)
    tasks = [(study.rebuild, doc, keys, flat[a:b], segments, tol) for a, b in chunks]
    parts = _run_tasks(_resolve_points, tasks, jobs, progress, [b - a for a, b in chunks])
    lam = np.full((len(flat), n_ax), np.nan)
    K = np.full((len(flat), n_ax, len(segments)), np.nan)
    notes = []
    for (a, _b), (rl, rk, nt) in zip(chunks, parts):
        for j, (l_, k_) in enumerate(zip(rl, rk)):
            if l_ is not None:
                lam[a + j] = l_
                K[a + j] = k_
        notes += [(a + p, m) for p, m in nt]
    return lam, K, tuple(notes)


def _plain(doc) -> dict:
    """The case document as plain dicts and lists (read-only views are not picklable)."""
    if isinstance(doc, Mapping):
        return {k: _plain(v) for k, v in doc.items()}
    if isinstance(doc, list):
        return [_plain(v) for v in doc]
    return doc


# ---------------------------------------------------------------------------
# spring path


def _spring_rows(column, springs, level: int, grid: np.ndarray) -> np.ndarray:
    """Worker: load factors at rows of spring values ``grid`` (n, m) on one mesh."""
    model = SpringModel.build(column, springs, level)
    return np.array([model.load_factor(row) for row in grid])


def _plane_spring_targets(study: StudyCase, ranges, axis: str):
    """(param index, SpringTarget) of the swept springs that act in plane ``axis``."""
    out = []
    for p, r in enumerate(ranges):
        for tg in study.targets(r.key):
            if tg.axis == axis:
                out.append((p, tg))
    return out


def _one_spring(column, tg, values: np.ndarray, tol: float) -> np.ndarray:
    k = np.array([tg.stiffness(v) for v in values])
    k_min = float(np.min(k))
    k_max = float(np.max(k))
    study = SpringStudy.build(column, tg.restraint, tg.kind, k_min, k_max, tol)
    ok = 1.0 + np.minimum(k - study.k_ref, 0.0) * float(np.sum(study.w2)) > 1e-9
    lam = np.zeros(k.shape)
    if np.any(ok):
        lam[ok] = study.load_factors(k[ok])
    return lam


def _sweep_springs(study: StudyCase, ranges, segments, tol, jobs, progress):
    shape = tuple(r.values.size for r in ranges)
    n_ax = len(study.axes)
    lam = np.full(shape + (n_ax,), np.nan)
    pending = []  # (axis index, column, springs, level, grid rows)
    for ia, (axis, col) in enumerate(study.case.planes):
        acting = _plane_spring_targets(study, ranges, axis)
        params = sorted({p for p, _ in acting})
        if not params:
            lam[..., ia] = buckling(col, n_modes=1, tol=tol).load_factor
        elif len(acting) == 1 and not is_foundation_kind(acting[0][1].kind):
            p, tg = acting[0]
            vals = _one_spring(col, tg, ranges[p].values, tol)
            if len(ranges) == 1:
                lam[:, ia] = vals
            elif p == 0:
                lam[:, :, ia] = vals[:, None]
            else:
                lam[:, :, ia] = vals[None, :]
        else:
            springs = tuple((tg.restraint, tg.kind) for _, tg in acting)
            levels = []
            corner_vals = [(ranges[p].values.min(), ranges[p].values.max()) for p, _ in acting]
            for ends in zip(*corner_vals):
                c = col
                for (p, tg), v in zip(acting, ends):
                    c = with_stiffness(c, tg.restraint, tg.kind, tg.stiffness(v))
                try:
                    levels.append(converged_level(c, tol))
                except FeaError:
                    continue
            level = max(levels) if levels else 3
            grids = np.meshgrid(*[r.values for r in ranges], indexing="ij")
            pts = np.stack([np.vectorize(tg.stiffness)(grids[p]) for p, tg in acting], axis=-1)
            pending.append((ia, col, springs, level, pts))
    if pending:
        tasks, where = [], []
        for ia, col, springs, level, pts in pending:
            flat = pts.reshape(-1, pts.shape[-1])
            for a, b in _chunks(flat.shape[0], jobs):
                tasks.append((col, springs, level, flat[a:b]))
                where.append((ia, a, b))
        parts = _run_tasks(_spring_rows, tasks, jobs, progress, [b - a for _, a, b in where])
        flats = {ia: np.full(int(np.prod(shape)), np.nan) for ia, *_ in pending}
        for (ia, a, b), vals in zip(where, parts):
            flats[ia][a:b] = vals
        for ia, f in flats.items():
            lam[..., ia] = f.reshape(shape)
    K = np.full(shape + (n_ax, len(segments)), np.nan)
    for ia, (axis, col) in enumerate(study.case.planes):
        K[..., ia, :] = effective_length_factors(col, lam[..., ia])[..., list(segments)]
    return lam.reshape(-1, n_ax), K.reshape(-1, n_ax, len(segments)), ()


def sweep(study: StudyCase, ranges, segments=None, method: str = "auto", jobs: int = 1, progress=None,
          tol: float | None = None) -> SweepResult:
    """Sweep one or two inputs of a case.

    Parameters
    ----------
    study : the case (and its rebuild function, for the re-solve path)
    ranges : one or two :class:`ParameterRange`
    segments : segment indices (0-based) whose K to report; default all
    method : "auto" (spring path when every input is a restraint spring or a foundation modulus),
        "spring" or "re-solve"
    jobs : worker processes (1: serial, in this process)
    progress : optional callback ``progress(done, total)``
    tol : mesh tolerance (default: the case's)
    """
    ranges = tuple(ranges)
    if not 1 <= len(ranges) <= 2:
        raise CaseError("parameter", f"sweep one or two parameters, not {len(ranges)}")
    if len(ranges) == 2 and ranges[0].key.text == ranges[1].key.text:
        raise CaseError("parameter", "the two swept parameters are the same")
    n_seg = len(study.case.segments)
    segments = tuple(range(n_seg)) if segments is None else tuple(int(s) for s in segments)
    for s in segments:
        if not 0 <= s < n_seg:
            raise CaseError("segments", f"segment {s + 1} does not exist (the case has {n_seg})")
    tol = float(tol or study.case.tolerance)
    all_springs = all(r.key.is_stiffness for r in ranges)
    if method not in ("auto", "spring", "re-solve"):
        raise CaseError("method", f"expected 'auto', 'spring' or 're-solve', got {method!r}")
    if method == "spring" and not all_springs:
        raise CaseError("method", "the spring path needs every swept input to be a restraint spring or a "
                                  "foundation modulus")
    use_springs = all_springs and method != "re-solve"
    for r in ranges:  # the key must exist in the case file (or be a spring of an existing restraint)
        if r.key.is_stiffness:
            study.targets(r.key)
        else:
            r.key.get(study.case.document)
    jobs = max(1, int(jobs))
    if use_springs:
        lam, K, notes = _sweep_springs(study, ranges, segments, tol, jobs, progress)
    else:
        lam, K, notes = _sweep_resolve(study, ranges, segments, tol, jobs, progress)
    shape = tuple(r.values.size for r in ranges)
    axes = study.axes
    with np.errstate(invalid="ignore"):
        filled = np.where(np.isnan(lam), np.inf, lam)
        gov_idx = np.argmin(filled, axis=1)
        gov = np.take_along_axis(lam, gov_idx[:, None], axis=1)[:, 0]
    acting = {tg.axis for r in ranges if r.key.is_stiffness for tg in study.targets(r.key)}
    if len(acting) == 1:
        studied = acting.pop()
    else:
        counts = np.bincount(gov_idx[~np.isnan(gov)], minlength=len(axes))
        studied = axes[int(np.argmax(counts))]
    return SweepResult(
        studied_axis=studied, ranges=ranges, axes=axes, segments=segments,
        load_factors={a: lam[:, i].reshape(shape) for i, a in enumerate(axes)},
        K={a: K[:, i, :].reshape(shape + (len(segments),)) for i, a in enumerate(axes)},
        governing=gov.reshape(shape), governing_axis=gov_idx.reshape(shape),
        method="spring" if use_springs else "re-solve", tolerance=tol, notes=notes)
