"""Restraint-study results -> JSON dicts and CSV text (SI) and the lines of their terminal summaries.

JSON and CSV are in SI units with the unit in every header; the layout is
documented in ``docs/studies.md``.  The summaries are in the case's display
units.  Nothing here prints or writes files: the commands do.
"""

from __future__ import annotations

import io
import math
from collections.abc import Mapping

import numpy as np

from ..cautions import CAUTION
from ..notices import Notice
from ..study.paths import parse_key
from ..util.checks import one_line
from ..util.numbers import finite_list
from ..util.numbers import finite_or_none as _num
from .summary import fmt

__all__ = ["sweep_dict", "sweep_csv", "brace_dict", "sensitivity_dict", "bounds_dict", "sweep_lines",
           "brace_lines", "sensitivity_lines", "bounds_lines", "display_unit", "stiffness_text", "engineering_unit",
           "key_unit",
           "case_notices", "below_one", "BELOW_ONE_KEY", "BELOW_ONE_MARK", "BELOW_ONE_LEGEND",
           "sweep_below_one", "brace_below_one", "bounds_below_one"]

#: Key of the run warning when the case as given buckles under its case loads (see fea/notices.py).
BELOW_ONE_KEY = "buckles-under-case-loads"
#: Trailing mark of a table row whose lowest load factor is below 1.
BELOW_ONE_MARK = "  < 1"
#: Trailing mark of a sweep row where a plane other than the studied one governs.
OTHER_MARK = "  *"
#: The legend of the mark, printed once under a table that shows it.
BELOW_ONE_LEGEND = "  < 1: lowest load factor below 1: the column buckles under the case loads at that point"

#: Lowest load factor of each plane of the case as given (None: the plane could not be solved).
CaseLoadFactors = Mapping[str, "float | None"]


# ---------------------------------------------------------------------------
# load factors below one


def below_one(lam) -> np.ndarray:
    """Mask of load factors below 1 (a mechanism's 0 counts; NaN, a point not analysed, does not)."""
    a = np.asarray(lam, dtype=float)
    with np.errstate(invalid="ignore"):
        return np.less(a, 1.0, where=~np.isnan(a), out=np.zeros(a.shape, bool))


def case_notices(load_factors: CaseLoadFactors | None) -> list[Notice]:
    """A warning for every plane of the case as given whose lowest load factor is below 1."""
    out = []
    for axis, lam in (load_factors or {}).items():
        if lam is None or not lam < 1.0:
            continue
        what = ("is a mechanism under its case loads (load factor 0)" if lam == 0 else
                f"has its lowest load factor {lam:.4g} below 1")
        out.append(Notice(BELOW_ONE_KEY, f"{axis} axis: the case as given {what}: the column buckles "
                                         "elastically under its case loads", axis))
    return out


def _case_part(load_factors: CaseLoadFactors | None) -> dict:
    """The JSON of the case as given: its load factors and run warnings."""
    if load_factors is None:
        return {}
    return {"case_load_factors": {a: _num(v) if v is not None else None for a, v in load_factors.items()},
            "warnings": [n.as_dict() for n in case_notices(load_factors)]}


def _warning_lines(load_factors: CaseLoadFactors | None) -> list[str]:
    return [f"WARNING: {n.text}" for n in case_notices(load_factors)]


def _runs(mask: np.ndarray) -> list[tuple[int, int]]:
    """(first, last) index of every run of True in a 1-D mask."""
    out, start = [], None
    for i, m in enumerate(mask.tolist() + [False]):
        if m and start is None:
            start = i
        elif not m and start is not None:
            out.append((start, i - 1))
            start = None
    return out


def _crossing(x: np.ndarray, lam: np.ndarray, i: int, j: int, log: bool) -> float | None:
    """Where the load factor passes 1 between points ``i`` and ``j``, by linear interpolation (in log x on a
    logarithmic range); None when the ends cannot be interpolated (free, rigid or not analysed)."""
    a, b, la, lb = float(x[i]), float(x[j]), float(lam[i]), float(lam[j])
    if not (math.isfinite(a) and math.isfinite(b) and math.isfinite(la) and math.isfinite(lb)) or la == lb:
        return None
    if log:
        if a <= 0 or b <= 0:
            return None
        a, b = math.log10(a), math.log10(b)
    t = min(1.0, max(0.0, (1.0 - la) / (lb - la)))
    v = a + t * (b - a)
    return 10.0**v if log else v


def _ranges_below_one(x: np.ndarray, lam: np.ndarray, log: bool, text) -> list[str]:
    """Each stretch of a 1-D range where the load factor is below 1, as "from A to B" (``text``: value -> str,
    ends interpolated between the points on either side are marked "about")."""
    mask = below_one(lam)
    n = x.size
    out = []
    for i, j in _runs(mask):
        if i == 0 and j == n - 1:
            out.append("over the whole range")
            continue
        ends = []
        for inner, outer, edge in ((i, i - 1, i == 0), (j, j + 1, j == n - 1)):
            if edge:
                ends.append((float(x[inner]), text(float(x[inner]))))
                continue
            c = _crossing(x, lam, inner, outer, log)
            ends.append((float(x[inner]), text(float(x[inner]))) if c is None else (c, "about " + text(c)))
        (va, ta), (vb, tb) = sorted(ends, key=lambda e: e[0])
        out.append(f"at {ta}" if i == j and ta == tb else f"from {ta} to {tb}")
    return out


def sweep_below_one(study, res) -> list[str]:
    """Sentences naming the stretches (one parameter) or the part of the grid (two) below load factor 1."""
    d = study.case.display
    g = res.governing
    mask = below_one(g)
    if not mask.any():
        return []
    if len(res.ranges) == 1:
        r = res.ranges[0]
        unit, scale = display_unit(r.key.si_unit, d)

        def text(v: float) -> str:
            if r.key.is_spring and (v == 0 or math.isinf(v)):
                return "free" if v == 0 else "rigid"
            return f"{fmt(v / scale)} {unit}"

        return [f"load factor below 1 for {r.key.text} {s}"
                for s in _ranges_below_one(r.values, g, r.scale == "log", text)]
    parts = []
    idx = np.nonzero(mask)
    for axis, r in enumerate(res.ranges):
        unit, scale = display_unit(r.key.si_unit, d)
        vals = r.values[np.unique(idx[axis])]
        lo, hi = np.min(vals), np.max(vals)

        def one(v: float) -> str:
            if r.key.is_spring and (v == 0 or math.isinf(v)):
                return "free" if v == 0 else "rigid"
            return fmt(v / scale)

        parts.append(f"{r.key.text} {one(lo)} to {one(hi)} {unit}" if lo != hi else f"{r.key.text} {one(lo)} {unit}")
    return [f"load factor below 1 at {int(mask.sum())} of {mask.size} grid points, within {' and '.join(parts)}"]


def brace_below_one(study, cb) -> list[str]:
    """Sentences on the brace study's load factors below 1 (braces as given, removed, rigid; the curve)."""
    r, d = cb.result, study.case.display
    if r.load_factor_rigid < 1.0:
        return [f"load factor below 1 even with rigid braces ({fmt(r.load_factor_rigid)}): no brace stiffness "
                "keeps the column from buckling under the case loads"]
    lam = np.asarray(r.curve_load_factor, dtype=float)
    k = np.asarray(r.curve_k, dtype=float)
    low = below_one(lam)
    out = []
    if low.any():
        # the load factor never decreases as the braces stiffen: the stretch below 1 is the soft end
        j = int(np.nonzero(low)[0][-1])
        c = _crossing(k, lam, j, j + 1, True) if j + 1 < k.size else None
        where = (f"below about {stiffness_text(c, r.kind, d)}" if c is not None else
                 f"up to {stiffness_text(float(k[j]), r.kind, d)} (the stiffest drawn)" if j + 1 == k.size else
                 f"up to {stiffness_text(float(k[j]), r.kind, d)}")
        out.append(f"load factor below 1 for brace stiffness {where}")
    if r.load_factor_free < 1.0 and not below_one(lam).any():
        out.append(f"load factor below 1 with the braces removed ({fmt(r.load_factor_free)})")
    return out


def bounds_below_one(study, cb) -> list[str]:
    """Sentences naming the planes whose box of spring ranges reaches below load factor 1."""
    out = []
    for p in cb.planes:
        m = below_one(p.corner_load_factors)
        if m.any():
            out.append(f"load factor below 1 in the {p.axis or 'in-plane'} plane at {int(m.sum())} of {m.size} "
                       f"corners of the box (lowest {fmt(p.load_factor_min)}, every spring at its low end)")
    for a, v in cb.fixed.items():
        if v < 1.0:
            out.append(f"load factor below 1 in the {a} plane ({fmt(v)}), which no uncertain spring acts in")
    return out


# ---------------------------------------------------------------------------
# JSON / CSV (SI)


def _header(study, name: str, version: str) -> dict:
    case = study.case
    return {"units": "SI", "tool": {"name": "stanchion", "version": version}, "study": name,
            "caution": CAUTION, "title": case.title, "case_file": case.source, "case_sha256": case.sha256}


def sweep_dict(study, res, version: str, case_load_factors: CaseLoadFactors | None = None) -> dict:
    """The JSON of a sweep (``version``: the tool's version for the header; ``case_load_factors``: the lowest
    load factor of each plane of the case as given, for its run warnings)."""
    out = _header(study, "sweep", version)
    out.update(_case_part(case_load_factors))
    out.update({
        "method": res.method, "tolerance": res.tolerance,
        "parameters": [{"key": r.key.text, "unit": r.key.si_unit, "scale": r.scale,
                        "values": finite_list(r.values),
                        "rigid_at": [i for i, v in enumerate(r.values) if math.isinf(v)]} for r in res.ranges],
        "axes": list(res.axes),
        "segments": [s + 1 for s in res.segments],
        "load_factor": {"governing": finite_list(res.governing),
                        **{a: finite_list(res.load_factors[a]) for a in res.axes}},
        "governing_axis": np.asarray(res.axes, dtype=object)[res.governing_axis].tolist(),
        "studied_axis": res.studied_axis,
        "below_one": below_one(res.governing).tolist(),
        "below_one_ranges": sweep_below_one(study, res),
        "K": {a: {f"segment {s + 1}": finite_list(res.K[a][..., j]) for j, s in enumerate(res.segments)}
              for a in res.axes},
        "notes": [{"point": int(i), "message": m} for i, m in res.notes],
    })
    return out


def sweep_csv(res) -> str:
    """The CSV table of a sweep: one row per point (SI, units in the header)."""
    buf = io.StringIO()
    head = [f"{r.key.text} [{r.key.si_unit}]" for r in res.ranges] + ["load_factor [-]", "governing_axis",
                                                                      "below_one"]
    for a in res.axes:
        head.append(f"load_factor_{a} [-]")
    for a in res.axes:
        head += [f"K_{a}_segment{s + 1} [-]" for s in res.segments]
    buf.write(",".join(head) + "\n")
    grids = np.meshgrid(*[r.values for r in res.ranges], indexing="ij")
    low = below_one(res.governing)
    for idx in np.ndindex(*res.shape):
        row = [repr(float(g[idx])) for g in grids]
        row += [repr(float(res.governing[idx])), res.axes[int(res.governing_axis[idx])],
                "true" if low[idx] else "false"]
        row += [repr(float(res.load_factors[a][idx])) for a in res.axes]
        for a in res.axes:
            row += [repr(float(v)) for v in res.K[a][idx]]
        buf.write(",".join(row) + "\n")
    return buf.getvalue()


def brace_dict(study, cb, version: str, case_load_factors: CaseLoadFactors | None = None) -> dict:
    """The JSON of a brace study."""
    r = cb.result
    out = _header(study, "brace", version)
    out.update(_case_part(case_load_factors))
    out.update({
        "axis": r.axis, ("restraints" if r.kind in ("lateral", "rotation") else "foundations"): list(cb.tables),
        "kind": r.kind, "stations_m": list(r.stations),
        "stiffness_unit": _kind_si_unit(r.kind),
        "given_stiffness": [_num(v) for v in r.given_stiffness],
        "load_factor_given": _num(r.load_factor_given), "load_factor_rigid": _num(r.load_factor_rigid),
        "load_factor_free": _num(r.load_factor_free),
        "eps": r.eps, "threshold_stiffness": _num(r.threshold_reached), "threshold_kind": r.threshold_kind,
        "braced_lengths_m": [list(ab) for ab in r.braced_lengths],
        "required_axial_force_height_m": r.axial_force_height,
        "fraction": r.fraction, "fraction_stiffness": _num(r.fraction_stiffness),
        "mesh_level": r.level,
        "winter": {"source": WINTER_SOURCE + " of n equally spaced braces",
                   "n_braces": len(r.restraints), "coefficient": r.winter_coefficient,
                   "axial_force_N": r.axial_force_rigid, "spacing_m": r.spacing,
                   "equally_spaced": r.equally_spaced, "ideal_stiffness": _num(r.winter_stiffness)},
        "aisc_360_appendix_6": {"source": AISC_SOURCE,
                                "phi": 0.75, "required_axial_force_N": r.axial_force_design,
                                "stiffness_N_per_m": _num(r.aisc_stiffness),
                                "strength_N": _num(r.aisc_strength),
                                "stiffness_at_rigid_brace_critical_load_N_per_m": _num(r.aisc_stiffness_at_rigid)},
        "brace_force": None if cb.force is None else {
            "stiffness": cb.force.stiffness, "basis": cb.force.basis, "bow": f"height/{cb.force.bow_ratio:g}",
            "forces_N": [_num(f) for f in cb.force.forces], "force_over_axial": [_num(f) for f in cb.force.ratios],
            "critical_load_factor": _num(cb.force.critical_load_factor)},
        "brace_force_note": cb.force_note,
        "curve": {"stiffness": [float(v) for v in r.curve_k], "load_factor": [_num(v) for v in r.curve_load_factor],
                  "below_one": below_one(r.curve_load_factor).tolist()},
        "below_one": {"given": bool(r.load_factor_given < 1.0), "rigid": bool(r.load_factor_rigid < 1.0),
                      "free": bool(r.load_factor_free < 1.0)},
        "below_one_ranges": brace_below_one(study, cb),
    })
    return out


def sensitivity_dict(study, cs, version: str, case_load_factors: CaseLoadFactors | None = None) -> dict:
    """The JSON of the spring sensitivities."""
    out = _header(study, "sensitivity", version)
    out.update(_case_part(case_load_factors))
    out.update({
        "load_factors": {a: _num(v) for a, v in cs.load_factors.items()},
        "governing_axis": cs.governing_axis,
        "springs": [{e.source: t, "axis": e.axis, "kind": e.kind, "at_m": e.at,
                     "stiffness": _num(e.stiffness), "unit": _kind_si_unit(e.kind),
                     "rigid": e.rigid, "load_factor": _num(e.load_factor), "below_one": bool(e.load_factor < 1.0),
                     "derivative": _num(e.derivative), "normalised": _num(e.normalised),
                     "finite_difference": _num(e.fd_derivative),
                     "relative_difference": _num(e.fd_relative_difference), "note": e.note}
                    for t, e in zip(cs.tables, cs.entries)],
        "ranking": [{e.source: t, "axis": e.axis, "kind": e.kind, "normalised": e.normalised}
                    for t, e in cs.ranking()],
    })
    return out


def bounds_dict(study, cb, version: str, case_load_factors: CaseLoadFactors | None = None) -> dict:
    """The JSON of the fixity bounds."""
    out = _header(study, "bounds", version)
    out.update(_case_part(case_load_factors))
    out.update({
        "springs": [{"key": k, "low": _num(lo), "high": _num(hi)} for k, lo, hi in zip(cb.keys, cb.low, cb.high)],
        "statement": "the lowest load factor never decreases as a spring stiffens, so the corners of the box "
                     "bound it (every corner is evaluated)",
        "load_factor_min": _num(cb.load_factor_min), "load_factor_max": _num(cb.load_factor_max),
        "planes": [{"axis": p.axis, "load_factor_min": _num(p.load_factor_min),
                    "load_factor_max": _num(p.load_factor_max),
                    "K_min": [_num(v) for v in p.K_min], "K_max": [_num(v) for v in p.K_max],
                    "below_one": bool(p.load_factor_min < 1.0),
                    "corners": [{"stiffness": [_num(v) for v in c], "load_factor": _num(lam),
                                 "below_one": bool(lam < 1.0)}
                                for c, lam in zip(p.corners, p.corner_load_factors)],
                    "mesh_level": p.level} for p in cb.planes],
        "unaffected_planes": {a: _num(v) for a, v in cb.fixed.items()},
        "below_one": bool(cb.load_factor_min < 1.0),
        "below_one_ranges": bounds_below_one(study, cb),
    })
    return out


# ---------------------------------------------------------------------------
# display units


def display_unit(si_unit: str, d) -> tuple[str, float]:
    """The display unit of ``d`` for a quantity given in ``si_unit``, and the SI value of one such unit."""
    L, F = d.length, d.force
    table = {
        "m": (L, d.length_si),
        "N": (F, d.force_si),
        "N/m": (f"{F}/{L}", d.force_si / d.length_si),
        "N*m/rad": (f"{F}*{L}/rad", d.force_si * d.length_si),
        "N/m^2": (f"{F}/{L}^2", d.force_si / d.length_si**2),
        "Pa": (d.stress, d.stress_si),
        "m^2": (f"{L}^2", d.length_si**2),
        "m^4": (f"{L}^4", d.length_si**4),
    }
    return table.get(si_unit, (si_unit, 1.0))


#: Metric forces a stiffness may be scaled to, so that its number stays below 1000 (180 MN*m/rad, not
#: 180000 kN*m/rad); imperial display forces are kept as they are.
_METRIC_FORCES = (("N", 1.0), ("kN", 1e3), ("MN", 1e6), ("GN", 1e9))
#: SI units of the quantities whose display force is scaled with their size.
_SCALED = ("N/m", "N*m/rad", "N/m^2")


def engineering_unit(si_unit: str, d, magnitude: float) -> tuple[str, float]:
    """The display unit of ``d`` for a stiffness (``si_unit`` N/m, N*m/rad or N/m^2) of about ``magnitude``
    [SI], with its force stepped up from the display force (kN -> MN -> GN) until the number is below 1000;
    and the SI value of one such unit.  Other quantities: :func:`display_unit`."""
    unit, scale = display_unit(si_unit, d)
    names = [n for n, _ in _METRIC_FORCES]
    if si_unit not in _SCALED or d.force not in names or not (math.isfinite(magnitude) and magnitude > 0):
        return unit, scale
    i = names.index(d.force)
    while i + 1 < len(names) and abs(magnitude) / scale >= 1000.0:
        scale *= _METRIC_FORCES[i + 1][1] / _METRIC_FORCES[i][1]
        i += 1
    return names[i] + unit[len(d.force):], scale


def key_unit(key, values, d) -> tuple[str, float]:
    """(unit label, SI value of one unit) for the values of a study key in display units ``d``: stiffnesses in
    engineering units sized to the geometric middle of the finite, nonzero values."""
    v = np.asarray(values, dtype=float)
    fin = np.abs(v[np.isfinite(v) & (v != 0)])
    mag = float(np.sqrt(np.min(fin) * np.max(fin))) if fin.size else math.nan
    return engineering_unit(key.si_unit, d, mag)


def _kind_si_unit(kind: str) -> str:
    return {"lateral": "N/m", "rotation": "N*m/rad"}.get(kind, "N/m^2")


def stiffness_text(v: float | None, kind: str, d) -> str:
    """A spring stiffness (``kind`` lateral, rotation, or a foundation modulus) in display units ``d``, in
    engineering units (180 MN*m/rad): "rigid", "free", "not reached" (None) or a number and unit."""
    if v is None:
        return "not reached"
    if math.isinf(v):
        return "rigid"
    if v == 0:
        return "free"
    unit, scale = engineering_unit(_kind_si_unit(kind), d, v)
    return f"{fmt(v / scale)} {unit}"


# ---------------------------------------------------------------------------
# terminal summaries (display units); ``charts``: the chart files written


def _title(study) -> str:
    return one_line(study.case.title) or "(untitled case)"


def _ending(charts=()) -> list[str]:
    """The chart files written, then the caution."""
    return [f"  chart written to {f}" for f in charts] + [CAUTION]


def sweep_lines(study, res, charts=(), case_load_factors: CaseLoadFactors | None = None) -> list[str]:
    """The summary of a sweep: a table of a one-parameter sweep, the range of a two-parameter one; the case's
    warnings first, and the stretches of the range below load factor 1 after the table."""
    ranges = res.ranges
    out = [_title(study), *_warning_lines(case_load_factors),
           f"sweep of {' and '.join(r.key.text for r in ranges)}: {res.governing.size} points, {res.method} path, "
           f"tolerance {res.tolerance:.0e}"]
    if len(ranges) == 1:
        out += _sweep_table(study, res)
    else:
        g = res.governing
        out.append(f"  load factor from {fmt(np.nanmin(g))} to {fmt(np.nanmax(g))} over the "
                   f"{g.shape[0]} x {g.shape[1]} grid (all values in --csv / --json)")
    out += [f"  {t}" for t in sweep_below_one(study, res)]
    if res.notes:
        out.append(f"  {len(res.notes)} point(s) could not be analysed; first: {res.notes[0][1]}")
    return out + _ending(charts)


def _sweep_table(study, res) -> list[str]:
    """At most about 16 rows of a one-parameter sweep (always the last).

    K is that of the studied plane on every row (:attr:`SweepResult.studied_axis`), whichever plane governs;
    the governing plane has its own column and a row where another plane governs is marked.
    """
    r = res.ranges[0]
    unit, scale = key_unit(r.key, r.values, study.case.display)
    plane = res.studied_axis or res.axes[0]
    two = len(res.axes) > 1
    out = []
    if two:
        out.append(f"  K: {plane} plane at every point; 'governs': the plane of the lowest load factor")
    out.append(f"  {r.key.text + ' [' + unit + ']':>28} {'load factor':>12} {'governs':>8} "
               + " ".join(f"{'K seg ' + str(s + 1):>9}" for s in res.segments))
    Kp = res.K_studied()
    other = res.other_governs()
    step = max(1, r.values.size // 15)
    shown = sorted(set(list(range(0, r.values.size, step)) + [r.values.size - 1]))
    low = below_one(res.governing)
    for i in shown:
        v = r.values[i]
        vt = "free" if r.key.is_spring and v == 0 else "rigid" if math.isinf(v) else fmt(v / scale)
        out.append(f"  {vt:>28} {fmt(res.governing[i]):>12} {res.axes[res.governing_axis[i]]:>8} "
                   + " ".join(f"{'-' if math.isnan(k) else f'{k:.4f}':>9}" for k in Kp[i])
                   + (OTHER_MARK if two and other[i] else "") + (BELOW_ONE_MARK if low[i] else ""))
    if len(shown) < r.values.size:
        out.append(f"  ({len(shown)} of {r.values.size} rows shown; all in --csv / --json)")
    if two and other[shown].any():
        out.append(f"{OTHER_MARK}: the other plane governs at that point; K stays the {plane} plane's")
    if low[shown].any():
        out.append(BELOW_ONE_LEGEND)
    return out


def brace_lines(study, cb, charts=(), case_load_factors: CaseLoadFactors | None = None) -> list[str]:
    """The summary of a brace study."""
    r, d = cb.result, study.case.display

    def lf(v: float) -> str:
        return fmt(v) + (" (< 1)" if v < 1.0 else "")

    out = [_title(study), *_warning_lines(case_load_factors),
           (f"brace study, {r.axis} plane, {r.kind} restraint(s) {', '.join(map(str, cb.tables))} at "
            f"{', '.join(fmt(d.L(s)) for s in r.stations)} {d.length}, varied together"
            if r.kind in ("lateral", "rotation") else
            f"foundation study, {r.axis} plane, {r.kind} of foundation(s) {', '.join(map(str, cb.tables))} "
            f"(rigid: the foundations' ranges held), varied together"),
           f"  load factor: braces as given {lf(r.load_factor_given)}, rigid {lf(r.load_factor_rigid)}, "
           f"removed {lf(r.load_factor_free) if r.load_factor_free > 0 else '0 (mechanism)'}",
           f"  stiffness for {100 * r.fraction:g}% of the rigid-brace load factor: "
           f"{stiffness_text(r.fraction_stiffness, r.kind, d)}",
           f"  {_threshold_text(r, d)}"]
    if r.kind == "lateral":
        even = "equally spaced" if r.equally_spaced else "NOT equally spaced: Winter's rule is indicative only"
        lengths = ", ".join(f"{fmt(d.L(a))} to {fmt(d.L(b))}" for a, b in r.braced_lengths)
        out.append(f"  P_r = {fmt(d.F(r.axial_force_design))} {d.force}: the largest compression at load factor 1 "
                   f"in the braced lengths next to the brace(s) ({lengths} {d.length}), at "
                   f"{fmt(d.L(r.axial_force_height))} {d.length}")
        out.append(f"  {WINTER_SOURCE}, {len(r.restraints)} brace(s), {even}: {r.winter_coefficient:.3f} P/Lb "
                   f"with P = {fmt(d.F(r.axial_force_rigid))} {d.force} (the same lengths at the rigid-brace critical "
                   f"load), Lb = {fmt(d.L(r.spacing))} {d.length}: {stiffness_text(r.winter_stiffness, 'lateral', d)}")
        out.append(f"  {AISC_SOURCE}: stiffness 8 P_r/(0.75 Lb) = {stiffness_text(r.aisc_stiffness, 'lateral', d)}, "
                   f"strength 0.01 P_r = {fmt(d.F(r.aisc_strength))} {d.force}")
    if cb.force is not None:
        fs = ", ".join(f"{fmt(d.F(f))} {d.force} ({100 * q:.2f}% of P)" for f, q in zip(cb.force.forces,
                                                                                        cb.force.ratios))
        out.append(f"  brace force at load factor 1, bow H/{cb.force.bow_ratio:g}, stiffness "
                   f"{stiffness_text(cb.force.stiffness, 'lateral', d)} ({cb.force.basis}): {fs}")
    elif cb.force_note:
        out.append(f"  {cb.force_note}")
    out += [f"  {t}" for t in brace_below_one(study, cb)]
    return out + _ending(charts)


#: The published sources of the bracing rules beside the brace study.
WINTER_SOURCE = "Winter, G. (1960), \"Lateral bracing of columns and beams\", Trans. ASCE 125, ideal stiffness"
AISC_SOURCE = "AISC 360-16 Appendix 6, 6.2 point bracing of columns (from memory)"


def _threshold_text(r, d) -> str:
    """The threshold stiffness where it is a result (a corner of the curve), else why there is none."""
    if r.threshold_kind == "corner":
        return (f"threshold stiffness {stiffness_text(r.threshold, r.kind, d)}: the load factor reaches its "
                "rigid-brace value there (the mode switches to one with a node at the brace)")
    if r.threshold_kind == "not needed":
        return "threshold stiffness: none needed (the load factor reaches its rigid-brace value without braces)"
    if r.threshold_kind == "not reached":
        return "threshold stiffness: not reached by any finite stiffness"
    return ("no threshold stiffness: the load factor approaches its rigid-brace value only as the stiffness "
            f"grows without bound; a stiffness within {r.eps:.0e} of it would be set by that tolerance alone")


def sensitivity_lines(study, cs, case_load_factors: CaseLoadFactors | None = None) -> list[str]:
    """The summary of the spring sensitivities, ending with the restraint that matters most."""
    d = study.case.display
    out = [_title(study), *_warning_lines(case_load_factors),
           "sensitivity of the lowest load factor to each spring and foundation modulus (from the mode shape; "
           "normalised = (k / load factor) d(load factor)/dk)",
           f"  {'support':>12} {'axis':>8} {'kind':>14} {'at':>8} {'stiffness':>22} {'normalised':>11} "
           f"{'FD check':>9}"]
    marked = False
    for t, e in zip(cs.tables, cs.entries):
        name = f"{e.source} {t}"
        mark = BELOW_ONE_MARK if e.load_factor < 1.0 else ""
        marked = marked or bool(mark)
        if e.rigid:
            out.append(f"  {name:>12} {e.axis:>8} {e.kind:>14} {fmt(d.L(e.at)):>8} {'rigid':>22} {'(rigid)':>11}{mark}")
            continue
        chk = "-" if e.fd_relative_difference is None else f"{e.fd_relative_difference:.0e}"
        out.append(f"  {name:>12} {e.axis:>8} {e.kind:>14} {fmt(d.L(e.at)):>8} "
                   f"{stiffness_text(e.stiffness, e.kind, d):>22} "
                   f"{e.normalised:11.4f} {chk:>9}{'  ' + e.note if e.note else ''}{mark}")
    if marked:
        out.append("  < 1: the plane's lowest load factor is below 1: the column buckles under the case loads")
    rank = cs.ranking()
    if rank:
        t, e = rank[0]
        lam = cs.load_factors[cs.governing_axis]
        out.append(f"which restraint matters most ({cs.governing_axis} plane governs, load factor "
                   f"{fmt(lam)}{' < 1' if lam < 1.0 else ''}): {e.source} {t} {e.kind} at {fmt(d.L(e.at))} "
                   f"{d.length}: 1% stiffer raises the load factor by {e.normalised:.3f}%")
    return out + _ending()


def bounds_lines(study, cb, case_load_factors: CaseLoadFactors | None = None) -> list[str]:
    """The summary of the fixity bounds."""
    d = study.case.display
    out = [_title(study), *_warning_lines(case_load_factors)]
    for k, lo, hi in zip(cb.keys, cb.low, cb.high):
        kind = parse_key(k).kind
        out.append(f"  {k}: {stiffness_text(lo, kind, d)} to {stiffness_text(hi, kind, d)}")
    out.append("the load factor never decreases as a spring stiffens, so the corners of the box bound it "
               "(all corners evaluated)")
    for p in cb.planes:
        out.append(f"  {p.axis or 'plane'}: load factor {fmt(p.load_factor_min)} to {fmt(p.load_factor_max)} "
                   f"({p.corners.shape[0]} corners){BELOW_ONE_MARK if p.load_factor_min < 1.0 else ''}")
        for i, s in enumerate(study.case.segments):
            lo, hi = p.K_min[i], p.K_max[i]
            if not math.isnan(lo):
                out.append(f"    segment {i + 1} {s.name}: K {lo:.3f} to "
                           f"{'inf' if math.isinf(hi) else f'{hi:.3f}'}")
    for a, v in cb.fixed.items():
        out.append(f"  {a}: load factor {fmt(v)} (no uncertain spring acts in this plane)"
                   f"{BELOW_ONE_MARK if v < 1.0 else ''}")
    out.append(f"governing load factor from {fmt(cb.load_factor_min)} to {fmt(cb.load_factor_max)}")
    below = bounds_below_one(study, cb)
    if below:
        out.append("  < 1: part of the box is below load factor 1: the column buckles under the case loads there")
        out += [f"  {t}" for t in below]
    return out + _ending()
