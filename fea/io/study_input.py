"""Reading the optional ``[study]`` table of a case file.

::

    [study]
    jobs = 2                          # worker processes (default: every CPU)

    [study.sweep]
    segments = [1, 2]                 # segments whose K to report (default all)
    method = "auto"                   # "auto", "spring" or "re-solve"
    [[study.sweep.parameter]]         # one or two
    key = "restraint[1].rotation"
    from = "free"                     # a quantity, or free / rigid for a spring
    to = "rigid"
    points = 41
    scale = "log"                     # "linear" (default) or "log"

    [study.brace]
    restraints = [2, 3]               # [[restraint]] numbers varied together
    kind = "lateral"                  # or "rotation"
    axis = "minor"                    # plane (two-plane cases)
    fraction = 0.95                   # target fraction of the rigid-brace load factor
    eps = 1e-6                        # shortfall accepted as reaching it
    bow = 500                         # half-sine bow height / 500 for the brace force

    [[study.bounds.spring]]           # one per uncertain spring
    key = "restraint[1].rotation"
    low = "2 MN*m/rad"
    high = "10 MN*m/rad"

Parsed into a frozen :class:`~fea.study.spec.StudySpec` (SI values);
:data:`fea.pipeline.CASE_TABLES` lists :func:`parse_study` as the parser of ``[study]``.
"""

from __future__ import annotations

import math

from ..errors import CaseError
from ..study.paths import parse_key
from ..study.spec import BoundSpec, BraceSpec, ParameterSpec, StudySpec, SweepSpec
from .limits import MAX_SWEEP_POINTS, check_sweep_points

__all__ = ["parse_study", "parse_sweep"]


def _keys(table: dict, path: str, allowed: set[str]) -> None:
    for k in table:
        if k not in allowed:
            raise CaseError(f"{path}.{k}", f"unknown key; expected one of {', '.join(sorted(allowed))}")


def _int(v, path: str, lo: int, hi: int) -> int:
    if isinstance(v, bool) or not isinstance(v, int) or not lo <= v <= hi:
        raise CaseError(path, f"expected a whole number from {lo} to {hi}, got {v!r}")
    return v


def _number(v, path: str, lo: float, hi: float) -> float:
    if isinstance(v, bool) or not isinstance(v, (int, float)) or not (lo < v <= hi):
        raise CaseError(path, f"expected a number above {lo:g} and at most {hi:g}, got {v!r}")
    return float(v)


def _list_of_tables(v, path: str) -> list[dict]:
    if isinstance(v, dict):
        v = [v]
    if not isinstance(v, list) or not all(isinstance(t, dict) for t in v):
        raise CaseError(path, f"expected [[{path}]] tables")
    return v


def parse_sweep(t: dict, path: str = "study.sweep") -> SweepSpec:
    _keys(t, path, {"parameter", "segments", "method"})
    params = []
    tables = _list_of_tables(t.get("parameter", []), f"{path}.parameter")
    if not 1 <= len(tables) <= 2:
        raise CaseError(f"{path}.parameter", f"give one or two [[{path}.parameter]] tables, got {len(tables)}")
    for i, p in enumerate(tables, start=1):
        pp = f"{path}.parameter[{i}]"
        _keys(p, pp, {"key", "from", "to", "points", "scale"})
        for need in ("key", "from", "to"):
            if need not in p:
                raise CaseError(f"{pp}.{need}", "missing")
        key = parse_key(p["key"])
        start = key.parse_value(p["from"], f"{pp}.from")
        stop = key.parse_value(p["to"], f"{pp}.to")
        scale = p.get("scale", "linear")
        if scale not in ("linear", "log"):
            raise CaseError(f"{pp}.scale", f"expected 'linear' or 'log', got {scale!r}")
        points = _int(p.get("points", 21), f"{pp}.points", 2, MAX_SWEEP_POINTS)
        params.append(ParameterSpec(key.text, start, stop, points, scale))
    check_sweep_points((p.points for p in params), f"{path}.parameter")
    segs = t.get("segments")
    if segs is not None:
        if not isinstance(segs, list) or not segs:
            raise CaseError(f"{path}.segments", f"expected a list of segment numbers such as [1, 2], got {segs!r}")
        segs = tuple(_int(s, f"{path}.segments", 1, 10_000) - 1 for s in segs)
    method = t.get("method", "auto")
    if method not in ("auto", "spring", "re-solve"):
        raise CaseError(f"{path}.method", f"expected 'auto', 'spring' or 're-solve', got {method!r}")
    return SweepSpec(tuple(params), segs, method)


def parse_study(table: dict, doc: dict | None = None) -> StudySpec:
    """Validate a ``[study]`` table (the case document ``doc`` is not needed)."""
    _keys(table, "study", {"jobs", "sweep", "brace", "bounds", "sensitivity"})
    jobs = _int(table["jobs"], "study.jobs", 1, 1024) if "jobs" in table else None
    sweep = None
    if "sweep" in table:
        if not isinstance(table["sweep"], dict):
            raise CaseError("study.sweep", "expected a [study.sweep] table")
        sweep = parse_sweep(table["sweep"])
    brace = _brace(table["brace"]) if "brace" in table else None
    bounds = _bounds(table["bounds"]) if "bounds" in table else ()
    sens = "sensitivity" in table
    if sens and table["sensitivity"] not in ({},) and not isinstance(table["sensitivity"], (dict, bool)):
        raise CaseError("study.sensitivity", "expected a [study.sensitivity] table or true")
    return StudySpec(jobs=jobs, sweep=sweep, brace=brace, bounds=bounds, sensitivity=bool(sens))


def _brace(b) -> BraceSpec:
    """The ``[study.brace]`` table."""
    if not isinstance(b, dict):
        raise CaseError("study.brace", "expected a [study.brace] table")
    _keys(b, "study.brace", {"restraints", "kind", "axis", "fraction", "eps", "bow"})
    rs = b.get("restraints")
    if isinstance(rs, int) and not isinstance(rs, bool):
        rs = [rs]
    if not isinstance(rs, list) or not rs:
        raise CaseError("study.brace.restraints", "expected [[restraint]] numbers such as [2, 3]")
    kind = b.get("kind", "lateral")
    if kind not in ("lateral", "rotation"):
        raise CaseError("study.brace.kind", f"expected 'lateral' or 'rotation', got {kind!r}")
    axis = b.get("axis")
    if axis is not None and axis not in ("major", "minor", "in-plane"):
        raise CaseError("study.brace.axis", f"expected 'major' or 'minor', got {axis!r}")
    return BraceSpec(tuple(_int(r, "study.brace.restraints", 1, 10_000) for r in rs), kind, axis,
                     _number(b.get("fraction", 0.95), "study.brace.fraction", 0.0, 1.0),
                     _number(b.get("eps", 1e-6), "study.brace.eps", 0.0, 0.01),
                     _number(b.get("bow", 500), "study.brace.bow", 1.0, math.inf))


def _bounds(bt) -> tuple[BoundSpec, ...]:
    """The ``[[study.bounds.spring]]`` tables."""
    if not isinstance(bt, dict):
        raise CaseError("study.bounds", "expected [[study.bounds.spring]] tables")
    _keys(bt, "study.bounds", {"spring"})
    bounds = []
    for i, s in enumerate(_list_of_tables(bt.get("spring", []), "study.bounds.spring"), start=1):
        sp = f"study.bounds.spring[{i}]"
        _keys(s, sp, {"key", "low", "high"})
        for need in ("key", "low", "high"):
            if need not in s:
                raise CaseError(f"{sp}.{need}", "missing")
        key = parse_key(s["key"])
        if not key.is_stiffness:
            raise CaseError(f"{sp}.key", f"{key.text!r} is not a restraint spring or a foundation modulus")
        lo, hi = key.parse_value(s["low"], f"{sp}.low"), key.parse_value(s["high"], f"{sp}.high")
        if not lo <= hi:
            raise CaseError(f"{sp}.high", "must not be below low")
        bounds.append(BoundSpec(key.text, lo, hi))
    return tuple(bounds)
