"""The explorer's state: the case as given, the values the sliders changed, and the results they give.

Three ways to a result, fastest first:

* **one spring** - the slider just moved is a restraint spring: each plane it
  acts in is answered by :class:`fea.explore.fast.OneSpringPlane` (the exact
  one-spring study; the load factor of every slider position is computed once,
  when the slider is taken), the other planes keep the results they had; the
  quick analyses (fixity, design) run on the new buckling results;
* **re-solve** - any other input, or a spring the fast path does not take: the
  case is rebuilt with the changed values (springs on the parsed case, other
  inputs through the case document and the case-file parser, so every check of
  a hand-written case applies) and solved by :func:`fea.pipeline.run_case`
  without the slow analyses;
* **all analyses** - when a slider comes to rest: :func:`fea.pipeline.run_case`
  with every analysis, exactly as ``stanchion check`` runs it.

The slow analyses (thin-walled, imperfect column) are left to the last; a
design check that uses the thin-walled analysis waits for it too, and the page
says so rather than show a verdict that was not checked.

Not thread-safe by itself: the server serialises the changes, and runs the
slow "all analyses" step on a snapshot (:meth:`Explorer.snapshot`) outside its
lock.
"""

from __future__ import annotations

import copy
import math
import time
from collections import OrderedDict
from dataclasses import dataclass, field
from pathlib import Path
from typing import Any, Mapping

import numpy as np

from ..errors import CaseError, FeaError
from ..io.case import parse_document
from ..io.limits import MAX_CASE_BYTES, read_limited
from ..model.case import Case
from ..pipeline import ANALYSES, CASE_TABLES, parse_case, rebuild_case, run_analyses, run_case
from ..results import BucklingResult, CaseResults
from ..study.paths import parse_key
from ..study.target import StudyCase
from .fast import MAX_DOF, NotApplicable, OneSpringPlane
from .inputs import BOW_KEY, Slider, sliders_of

__all__ = ["Explorer", "Outcome", "rebuild", "SLOW", "Overrides"]

#: Analyses left to the step "all analyses" (each takes from a tenth of a second to seconds).
SLOW = ("spatial", "imperfect")
#: Changed values: ((key, SI value), ...) sorted by key.
Overrides = tuple[tuple[str, float], ...]
#: Cached solutions kept (each is a few hundred kB at most).
CACHE = 24
#: Slider positions whose load factors the one-spring study computes in one call.
BLOCK = 50


#: A case document (plain data) -> the parsed case, with every table of the pipeline.
rebuild = rebuild_case


@dataclass
class Outcome:
    """What one change gave: the results (or the error that stopped them) and how they were reached.

    ``path`` is "one spring", "re-solve" or "all analyses"; ``pending`` names the analyses not yet run for these
    values (they follow when the slider comes to rest); ``seconds`` is the server's computing time.
    """

    results: CaseResults | None
    error: str | None
    path: str
    pending: tuple[str, ...]
    seconds: float
    overrides: Overrides = ()
    rev: int = 0


@dataclass
class _FastSlider:
    """The fast path of one spring slider, for fixed values of every other input.

    ``grid[axis]`` holds the load factor of every slider position, filled a block of :data:`BLOCK` positions at
    a time as the slider reaches them (NaN: a mechanism or no load factor there: re-solved, which says why).
    """

    planes: dict[str, OneSpringPlane]
    stiffness: dict[str, np.ndarray]  # axis -> the plane's spring at every position [SI]
    values: np.ndarray  # the slider's value at every position [SI]
    grid: dict[str, np.ndarray] = field(default_factory=dict)
    done: dict[str, np.ndarray] = field(default_factory=dict)  # axis -> which positions are in ``grid``

    def load_factor(self, axis: str, pos: int) -> float:
        if axis not in self.done:
            self.done[axis] = np.zeros(self.values.shape, dtype=bool)
        done = self.done[axis]
        if not done[pos]:
            plane = self.planes[axis]
            # the study answers a block of positions at the cost of one; the banded path one at a time
            sl = slice(pos // BLOCK * BLOCK, (pos // BLOCK + 1) * BLOCK) if plane.study is not None else \
                slice(pos, pos + 1)
            self.grid[axis][sl] = plane.load_factors(self.stiffness[axis][sl])
            done[sl] = True
        return float(self.grid[axis][pos])


class Explorer:
    """A case and the values the sliders changed.

    Parameters
    ----------
    text : the case file's text
    source : its path (shown on the page and in the results)
    """

    def __init__(self, text: str, source: str = "") -> None:
        self.text = text
        self.source = source
        self.case = parse_case(text, source=source)
        self.study = StudyCase(self.case, rebuild)
        self.sliders: tuple[Slider, ...] = sliders_of(self.study)
        self.by_key: dict[str, Slider] = {s.key: s for s in self.sliders}
        self.values: dict[str, float] = {s.key: s.initial for s in self.sliders}
        self.positions: dict[str, int] = {s.key: s.position(s.initial) for s in self.sliders}
        self.rev = 0
        self._solved: OrderedDict[tuple[Overrides, bool], CaseResults | FeaError] = OrderedDict()
        self._cases: OrderedDict[Overrides, Case | FeaError] = OrderedDict()
        self._fast: OrderedDict[tuple[str, Overrides], _FastSlider | None] = OrderedDict()
        self.uses_spatial = False
        first = self.full(())
        if first.results is None:
            raise CaseError("", first.error or "the case gives no results")
        #: the results of the case as given, with every analysis
        self.initial: CaseResults = first.results
        #: the design check uses the thin-walled analysis: it waits for it
        self.uses_spatial = "spatial" in first.results.extras

    @classmethod
    def from_file(cls, path: str | Path) -> "Explorer":
        """The explorer of the case file at ``path`` (read once; the page never names another file)."""
        raw = read_limited(Path(path), MAX_CASE_BYTES, "", "case file")
        parse_case(raw, source=str(path))  # a file that is not a case (size, encoding, TOML): its own message
        return cls(raw.decode("utf-8").removeprefix("\ufeff"), str(path))

    # -- the values -------------------------------------------------------------------------------------------
    def overrides(self, without: str | None = None) -> Overrides:
        """The changed values, sorted by key (``without``: leave that key out)."""
        return tuple(sorted((k, v) for k, v in self.values.items()
                            if k != without and not _same(v, self.by_key[k].initial)))

    def slider(self, key: object) -> Slider:
        if not isinstance(key, str) or key not in self.by_key:
            raise CaseError("key", f"{key!r} is not a slider of this case")
        return self.by_key[key]

    def set_position(self, key: str, pos: int) -> None:
        s = self.slider(key)
        self._set(key, s.value_at(pos), pos)

    def set_text(self, key: str, text: object) -> None:
        s = self.slider(key)
        v = s.parse(text)
        self._set(key, v, s.position(v))

    def set_value(self, key: str, value: float) -> None:
        """Set ``key`` to an SI value (0 free, inf rigid for a spring)."""
        s = self.slider(key)
        self._set(key, float(value), s.position(float(value)))

    def _set(self, key: str, value: float, pos: int) -> None:
        self.values[key] = value
        self.positions[key] = pos
        self.rev += 1

    def reset(self) -> None:
        """Every input back to the file's value."""
        for s in self.sliders:
            self.values[s.key] = s.initial
            self.positions[s.key] = s.position(s.initial)
        self.rev += 1

    def snapshot(self) -> tuple[Overrides, int]:
        return self.overrides(), self.rev

    # -- cases ------------------------------------------------------------------------------------------------
    def case_for(self, overrides: Overrides) -> Case:
        """The case with ``overrides`` applied (cached); raises the case file's error for a bad combination."""
        return _memo(self._cases, overrides, lambda: self._build(overrides))

    def _build(self, overrides: Overrides) -> Case:
        springs = [(parse_key(k), v) for k, v in overrides if k != BOW_KEY and parse_key(k).is_stiffness]
        plain = [(k, v) for k, v in overrides if k == BOW_KEY or not parse_key(k).is_stiffness]
        case = self.case
        if plain:
            doc = copy.deepcopy(dict(self.case.document))
            for k, v in plain:
                if k == BOW_KEY:
                    s = self.by_key[k]
                    doc["imperfection"]["bow"] = f"L/{v!r}" if s.dimension == "ratio" else f"{v!r} m"
                else:
                    parse_key(k).set(doc, v)
            case = parse_document(doc, source=self.source, tables=CASE_TABLES)
        if springs:
            case = StudyCase(case, rebuild).with_springs(tuple(k for k, _ in springs), tuple(v for _, v in springs))
        return case

    # -- results ----------------------------------------------------------------------------------------------
    def _solve(self, overrides: Overrides, slow: bool) -> CaseResults:
        if not slow and (overrides, True) in self._solved:
            slow = True  # a full result holds everything a quick one does
        skip = () if slow else SLOW + (("design",) if self.uses_spatial else ())
        return _memo(self._solved, (overrides, slow), lambda: run_case(self.case_for(overrides), skip=skip))

    def full(self, overrides: Overrides | None = None, rev: int | None = None) -> Outcome:
        """Every analysis, as ``stanchion check`` runs it (the step when a slider comes to rest)."""
        ov = self.overrides() if overrides is None else overrides
        t0 = time.perf_counter()
        try:
            res: CaseResults | None = self._solve(ov, slow=True)
            err = None
        except FeaError as exc:
            res, err = None, str(exc)
        return Outcome(res, err, "all analyses", (), time.perf_counter() - t0, ov, self.rev if rev is None else rev)

    def full_started(self) -> tuple[Overrides, int, Outcome | Case]:
        """The first half of :meth:`full` for a server that runs the slow part outside its lock: the present
        values, their revision, and either the finished outcome (cached, or the case's error) or the case to
        run (:func:`fea.pipeline.run_case`, then :meth:`full_finished`)."""
        ov, rev = self.snapshot()
        hit = _cached(self._solved, (ov, True))
        if hit is not None:
            return ov, rev, self.full(ov, rev)
        try:
            return ov, rev, self.case_for(ov)
        except FeaError as exc:
            return ov, rev, Outcome(None, str(exc), "all analyses", (), 0.0, ov, rev)

    def full_finished(self, ov: Overrides, rev: int, res: CaseResults | FeaError, seconds: float) -> Outcome:
        """Keep the result of the slow part and return its outcome."""
        _store(self._solved, (ov, True), res)
        if isinstance(res, FeaError):
            return Outcome(None, str(res), "all analyses", (), seconds, ov, rev)
        return Outcome(res, None, "all analyses", (), seconds, ov, rev)

    def preview(self, key: str | None = None) -> Outcome:
        """The results after slider ``key`` moved: the one-spring path when it applies, else a re-solve."""
        t0 = time.perf_counter()
        ov = self.overrides()
        pending = SLOW + (("design",) if self.uses_spatial else ())
        done = self.initial if not ov else _cached(self._solved, (ov, True))
        if done is not None and not isinstance(done, FeaError):
            return Outcome(done, None, "all analyses", (), time.perf_counter() - t0, ov, self.rev)
        path = "re-solve"
        res = None
        try:
            if key is not None and self.slider(key).spring:
                res = self._one_spring(key)
                if res is not None:
                    path = "one spring"
            if res is None:
                res = self._solve(ov, slow=False)
            err = None
        except FeaError as exc:
            res, err = None, str(exc)
        pending = tuple(a.name for a in ANALYSES if a.name in pending and a.name in self.initial.extras)
        return Outcome(res, err, path, pending, time.perf_counter() - t0, ov, self.rev)

    def prepare(self, key: str) -> None:
        """Build the fast path of spring slider ``key`` for the present values of the other inputs."""
        if self.slider(key).spring:
            self._fast_slider(key)

    # -- the one-spring path -----------------------------------------------------------------------------------
    def _fast_slider(self, key: str) -> _FastSlider | None:
        others = self.overrides(without=key)
        ck = (key, others)
        if ck in self._fast:
            self._fast.move_to_end(ck)
            return self._fast[ck]
        fs = None
        try:
            fs = self._build_fast(key, others)
        except (NotApplicable, FeaError):
            fs = None
        _store(self._fast, ck, fs)
        return fs

    def _build_fast(self, key: str, others: Overrides) -> _FastSlider | None:
        s = self.by_key[key]
        base = self._solve(others, slow=False)
        study = StudyCase(base.case, rebuild)
        values = s.values()
        planes, stiff, grid = {}, {}, {}
        for tg in study.targets(parse_key(key)):
            col = base.case.column(tg.axis)
            k = np.array([tg.stiffness(v) for v in values])
            k_min = float(min(k.min(), tg.stiffness(s.initial)))
            dense = 2 * base.plane(tg.axis).n_elements + 2 <= MAX_DOF
            planes[tg.axis] = OneSpringPlane.build(col, tg.restraint, tg.kind, k_min, math.inf, base.case.tolerance,
                                                   tg.axis, dense=dense)
            stiff[tg.axis] = k
            grid[tg.axis] = np.full(k.shape, np.nan)
        return _FastSlider(planes, stiff, values, grid)

    def _one_spring(self, key: str) -> CaseResults | None:
        """The results by the one-spring path, or None when it does not apply to this value."""
        fs = self._fast_slider(key)
        if fs is None:
            return None
        others = self.overrides(without=key)
        try:
            base = self._solve(others, slow=False)
        except FeaError:
            return None
        value = self.values[key]
        case = self.case_for(self.overrides())  # raises the case file's own error (a restraint holding nothing)
        study = StudyCase(base.case, rebuild)
        pos = self.positions[key]
        on_grid = _same(fs.values[pos], value)
        results: list[BucklingResult] = []
        for r in base.buckling:
            plane = fs.planes.get(r.axis)
            if plane is None:
                results.append(r)
                continue
            tg = next(t for t in study.targets(parse_key(key)) if t.axis == r.axis)
            k = tg.stiffness(value)
            lam = fs.load_factor(r.axis, pos) if on_grid else float(plane.load_factors(np.array([k]))[0])
            if not math.isfinite(lam):
                return None
            try:
                results.append(plane.result(case.column(r.axis), k, lam))
            except NotApplicable:
                return None
        return run_analyses(case, tuple(results), skip=SLOW + (("design",) if self.uses_spatial else ()))


def _same(a: float, b: float) -> bool:
    return a == b or (math.isfinite(a) and math.isfinite(b) and abs(a - b) <= 1e-12 * max(abs(a), abs(b)))


def _memo(cache: OrderedDict, key, make) -> Any:
    """``cache[key]``, or ``make()`` stored there; an input error is stored and raised again like a result."""
    hit = _cached(cache, key)
    if hit is None:
        try:
            hit = make()
        except FeaError as exc:
            hit = exc
        _store(cache, key, hit)
    if isinstance(hit, FeaError):
        raise hit
    return hit


def _cached(cache: OrderedDict, key) -> Any:
    if key in cache:
        cache.move_to_end(key)
        return cache[key]
    return None


def _store(cache: OrderedDict, key, value: Any) -> None:
    cache[key] = value
    cache.move_to_end(key)
    while len(cache) > CACHE:
        cache.popitem(last=False)


def values_in_display(ex: Explorer) -> Mapping[str, dict[str, Any]]:
    """Every slider's present value: position, text-box number, label text, changed or not."""
    out = {}
    for s in ex.sliders:
        v = ex.values[s.key]
        out[s.key] = {"pos": ex.positions[s.key], "number": s.number(v), "text": s.text(v),
                      "changed": not _same(v, s.initial)}
    return out
