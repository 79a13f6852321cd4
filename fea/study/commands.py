"""The ``sweep``, ``brace``, ``sensitivity`` and ``bounds`` subcommands, their JSON and CSV.

Registers, on import: ``fea.io.case.EXTRA_SECTIONS["study"]`` (the [study]
table) and ``fea.cli.COMMANDS`` entries.  JSON and CSV are in SI units with the
unit in every header; the layout is documented in ``docs/studies.md``.
"""

from __future__ import annotations

import argparse
import io
import math
import sys
import time
from pathlib import Path

import numpy as np

from .. import __version__
from ..cautions import CAUTION
from ..errors import CaseError, FeaError
from .paths import parse_key
from .spec import StudySpec, parse_study

__all__ = ["sweep_dict", "sweep_csv", "brace_dict", "sensitivity_dict", "bounds_dict"]


# ---------------------------------------------------------------------------
# JSON / CSV (SI)


def _num(x) -> float | None:
    x = float(x)
    return x if math.isfinite(x) else None


def _nested(a: np.ndarray):
    if a.ndim == 0:
        return _num(a)
    return [_nested(v) for v in a]


def _header(study, name: str) -> dict:
    case = study.case
    return {"units": "SI", "tool": {"name": "stanchion", "version": __version__}, "study": name,
            "caution": CAUTION, "title": case.title, "case_file": case.source, "case_sha256": case.sha256}


def sweep_dict(study, res) -> dict:
    out = _header(study, "sweep")
    out.update({
        "method": res.method, "tolerance": res.tolerance,
        "parameters": [{"key": r.key.text, "unit": r.key.si_unit, "scale": r.scale,
                        "values": [_num(v) if not math.isinf(v) else None for v in r.values],
                        "rigid_at": [i for i, v in enumerate(r.values) if math.isinf(v)]} for r in res.ranges],
        "axes": list(res.axes),
        "segments": [s + 1 for s in res.segments],
        "load_factor": {"governing": _nested(res.governing),
                        **{a: _nested(res.load_factors[a]) for a in res.axes}},
        "governing_axis": np.asarray(res.axes, dtype=object)[res.governing_axis].tolist(),
        "K": {a: {f"segment {s + 1}": _nested(res.K[a][..., j]) for j, s in enumerate(res.segments)}
              for a in res.axes},
        "notes": [{"point": int(i), "message": m} for i, m in res.notes],
    })
    return out


def sweep_csv(res) -> str:
    buf = io.StringIO()
    head = [f"{r.key.text} [{r.key.si_unit}]" for r in res.ranges] + ["load_factor [-]", "governing_axis"]
    for a in res.axes:
        head.append(f"load_factor_{a} [-]")
    for a in res.axes:
        head += [f"K_{a}_segment{s + 1} [-]" for s in res.segments]
    buf.write(",".join(head) + "\n")
    grids = np.meshgrid(*[r.values for r in res.ranges], indexing="ij")
    for idx in np.ndindex(*res.shape):
        row = [repr(float(g[idx])) for g in grids]
        row += [repr(float(res.governing[idx])), res.axes[int(res.governing_axis[idx])]]
        row += [repr(float(res.load_factors[a][idx])) for a in res.axes]
        for a in res.axes:
            row += [repr(float(v)) for v in res.K[a][idx]]
        buf.write(",".join(row) + "\n")
    return buf.getvalue()


def brace_dict(study, cb) -> dict:
    r = cb.result
    out = _header(study, "brace")
    out.update({
        "axis": r.axis, "restraints": list(cb.tables), "kind": r.kind, "stations_m": list(r.stations),
        "stiffness_unit": "N/m" if r.kind == "lateral" else "N*m/rad",
        "given_stiffness": [_num(v) for v in r.given_stiffness],
        "load_factor_given": _num(r.load_factor_given), "load_factor_rigid": _num(r.load_factor_rigid),
        "load_factor_free": _num(r.load_factor_free),
        "eps": r.eps, "threshold_stiffness": None if r.threshold is None else _num(r.threshold),
        "fraction": r.fraction, "fraction_stiffness": None if r.fraction_stiffness is None
        else _num(r.fraction_stiffness),
        "mesh_level": r.level,
        "winter": {"source": "Winter (1960), ideal stiffness of n equally spaced braces",
                   "n_braces": len(r.restraints), "coefficient": r.winter_coefficient,
                   "axial_force_N": r.axial_force_rigid, "spacing_m": r.spacing,
                   "equally_spaced": r.equally_spaced, "ideal_stiffness": _num(r.winter_stiffness)},
        "aisc_360_appendix_6": {"source": "AISC 360-16 Appendix 6.2, point (nodal) column bracing, from memory",
                                "phi": 0.75, "required_axial_force_N": r.axial_force_design,
                                "stiffness_N_per_m": _num(r.aisc_stiffness),
                                "strength_N": _num(r.aisc_strength),
                                "stiffness_at_rigid_brace_critical_load_N_per_m": _num(r.aisc_stiffness_at_rigid)},
        "brace_force": None if cb.force is None else {
            "stiffness": cb.force.stiffness, "basis": cb.force.basis, "bow": f"height/{cb.force.bow_ratio:g}",
            "forces_N": [_num(f) for f in cb.force.forces], "force_over_axial": [_num(f) for f in cb.force.ratios],
            "critical_load_factor": _num(cb.force.critical_load_factor)},
        "brace_force_note": cb.force_note,
        "curve": {"stiffness": [float(v) for v in r.curve_k], "load_factor": [_num(v) for v in r.curve_load_factor]},
    })
    return out


def sensitivity_dict(study, cs) -> dict:
    out = _header(study, "sensitivity")
    out.update({
        "load_factors": {a: _num(v) for a, v in cs.load_factors.items()},
        "governing_axis": cs.governing_axis,
        "springs": [{"restraint": t, "axis": e.axis, "kind": e.kind, "at_m": e.at,
                     "stiffness": _num(e.stiffness), "unit": "N/m" if e.kind == "lateral" else "N*m/rad",
                     "rigid": e.rigid, "load_factor": _num(e.load_factor),
                     "derivative": None if e.derivative is None else _num(e.derivative),
                     "normalised": None if e.normalised is None else _num(e.normalised),
                     "finite_difference": None if e.fd_derivative is None else _num(e.fd_derivative),
                     "relative_difference": None if e.fd_relative_difference is None
                     else _num(e.fd_relative_difference), "note": e.note}
                    for t, e in zip(cs.tables, cs.entries)],
        "ranking": [{"restraint": t, "axis": e.axis, "kind": e.kind, "normalised": e.normalised}
                    for t, e in cs.ranking()],
    })
    return out


def bounds_dict(study, cb) -> dict:
    out = _header(study, "bounds")
    out.update({
        "springs": [{"key": k, "low": _num(lo) if math.isfinite(lo) else None,
                     "high": _num(hi) if math.isfinite(hi) else None} for k, lo, hi in zip(cb.keys, cb.low, cb.high)],
        "statement": "the lowest load factor never decreases as a spring stiffens, so the corners of the box "
                     "bound it (every corner is evaluated)",
        "load_factor_min": _num(cb.load_factor_min), "load_factor_max": _num(cb.load_factor_max),
        "planes": [{"axis": p.axis, "load_factor_min": _num(p.load_factor_min),
                    "load_factor_max": _num(p.load_factor_max),
                    "K_min": [_num(v) for v in p.K_min], "K_max": [_num(v) for v in p.K_max],
                    "corners": [{"stiffness": [_num(v) if math.isfinite(v) else None for v in c],
                                 "load_factor": _num(lam)} for c, lam in zip(p.corners, p.corner_load_factors)],
                    "mesh_level": p.level} for p in cb.planes],
        "unaffected_planes": {a: _num(v) for a, v in cb.fixed.items()},
    })
    return out


# ---------------------------------------------------------------------------
# text


def _display_unit(si_unit: str, d) -> tuple[str, float]:
    """The case's display unit for a quantity given in ``si_unit``, and the SI value of one such unit."""
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


def _stiff(v: float, kind: str, d) -> str:
    from ..io.summary import fmt

    if v is None:
        return "not reached"
    if math.isinf(v):
        return "rigid"
    if v == 0:
        return "free"
    if kind == "lateral":
        return f"{fmt(v / d.force_si * d.length_si)} {d.force}/{d.length}"
    return f"{fmt(v / (d.force_si * d.length_si))} {d.force}*{d.length}/rad"


class _Progress:
    """A one-line progress bar on standard error, drawn only when it is a terminal."""

    def __init__(self, label: str) -> None:
        self.label = label
        self.on = sys.stderr.isatty()
        self.t0 = time.perf_counter()

    def __call__(self, done: int, total: int) -> None:
        if not self.on or total <= 0:
            return
        w = 30
        f = done / total
        sys.stderr.write(f"\r{self.label} [{'#' * int(w * f):<{w}}] {done}/{total} "
                         f"{time.perf_counter() - self.t0:5.1f} s")
        if done >= total:
            sys.stderr.write("\n")
        sys.stderr.flush()


def _load(args) -> tuple:
    from .target import StudyCase

    p = Path(args.case)
    try:
        text = p.read_text(encoding="utf-8")
    except FileNotFoundError:
        raise CaseError("", f"case file {str(p)!r} does not exist") from None
    except (OSError, UnicodeDecodeError) as exc:
        raise CaseError("", f"cannot read case file {str(p)!r}: {exc}") from None
    study = StudyCase.from_text(text, source=str(p))
    spec = study.case.extras.get("study") or StudySpec()
    return study, spec


def _jobs(args, spec) -> int:
    from .sweep import default_jobs

    j = args.jobs if getattr(args, "jobs", None) else (spec.jobs or default_jobs())
    if j < 1:
        raise FeaError(f"--jobs: expected a whole number >= 1, got {j}")
    return j


def _write(args, study, data: dict, csv: str | None = None) -> None:
    import json

    from ..io.export import write_text_atomic

    if getattr(args, "json", None) and args.json != "-":
        write_text_atomic(args.json, json.dumps(data, indent=1, allow_nan=False) + "\n")
    if csv is not None and getattr(args, "csv", None):
        write_text_atomic(args.csv, csv)


def _check_plot(args) -> None:
    for f in getattr(args, "plot", None) or []:
        if Path(f).suffix.lower() not in (".png", ".svg", ".pdf"):
            raise FeaError(f"--plot: {f!r} has no known extension: expected .png, .svg or .pdf")


def _add_common(p: argparse.ArgumentParser, csv: bool = False, plot: bool = False) -> None:
    p.add_argument("case", help="case file (TOML); may declare a [study] table (docs/studies.md)")
    p.add_argument("--json", nargs="?", const="-", metavar="FILE",
                   help="write the JSON result (SI) to FILE, or to standard output instead of the summary")
    if csv:
        p.add_argument("--csv", metavar="FILE", help="write the table (SI, units in the header) to FILE")
    if plot:
        p.add_argument("--plot", metavar="FILE", action="append", default=[],
                       help="draw the chart to FILE (.png, .svg or .pdf); may be repeated")


# -- sweep ---------------------------------------------------------------------


def _sweep_args(p: argparse.ArgumentParser) -> None:
    _add_common(p, csv=True, plot=True)
    p.add_argument("--param", nargs=3, action="append", metavar=("KEY", "FROM", "TO"), default=[],
                   help="sweep KEY (e.g. restraint[1].rotation, segment[2].length) from FROM to TO, quantities "
                        "with units ('free' / 'rigid' for a spring); once or twice. Default: the case's "
                        "[study.sweep]")
    p.add_argument("--points", type=int, action="append", metavar="N",
                   help="number of values (once, or once per --param; default 21)")
    p.add_argument("--scale", choices=("linear", "log"), action="append",
                   help="spacing (once, or once per --param; default linear)")
    p.add_argument("--segments", metavar="LIST", help="segments whose K to report, e.g. '1,3' (default all)")
    p.add_argument("--method", choices=("auto", "spring", "re-solve"), default=None,
                   help="auto: spring path when every parameter is a restraint spring (default)")
    p.add_argument("--jobs", type=int, metavar="N", help="worker processes (default: the case's, else every CPU)")


def _per_param(values, i: int, default):
    if not values:
        return default
    return values[0] if len(values) == 1 else (values[i] if i < len(values) else default)


def _run_sweep(args) -> int:
    from ..io.summary import fmt
    from .spec import ParameterSpec
    from .sweep import make_range, sweep

    study, spec = _load(args)
    _check_plot(args)
    if args.param:
        if len(args.param) > 2:
            raise FeaError("--param: sweep one or two parameters")
        for name, vals in (("--points", args.points), ("--scale", args.scale)):
            if vals and len(vals) not in (1, len(args.param)):
                raise FeaError(f"{name}: give it once or once per --param")
        params = []
        for i, (k, a, b) in enumerate(args.param):
            key = parse_key(k)
            params.append(ParameterSpec(key.text, key.parse_value(a, f"{key.text} (from)"),
                                        key.parse_value(b, f"{key.text} (to)"),
                                        _per_param(args.points, i, 21), _per_param(args.scale, i, "linear")))
        segments, method = None, "auto"
    elif spec.sweep is not None:
        params, segments, method = list(spec.sweep.parameters), spec.sweep.segments, spec.sweep.method
    else:
        raise FeaError("nothing to sweep: give --param KEY FROM TO or a [study.sweep] table in the case")
    if args.segments:
        try:
            segments = tuple(int(s) - 1 for s in args.segments.split(","))
        except ValueError:
            raise FeaError(f"--segments: expected numbers such as '1,3', got {args.segments!r}") from None
    method = args.method or method
    ranges = [make_range(study, parse_key(p.key), p.start, p.stop, p.points, p.scale) for p in params]
    res = sweep(study, ranges, segments=segments, method=method, jobs=_jobs(args, spec),
                progress=_Progress("sweep"))
    data = sweep_dict(study, res)
    figs = []
    if args.plot:
        from ..plot.study import plot_sweep

        figs.append(plot_sweep(res, title=study.case.title, display=study.case.display))
    _write(args, study, data, sweep_csv(res))
    for f in args.plot:
        from ..plot import save_figure

        save_figure(figs[0], f)
    if args.json == "-":
        import json

        print(json.dumps(data, indent=1, allow_nan=False))
        return 0
    print(study.case.title or "(untitled case)")
    print(f"sweep of {' and '.join(r.key.text for r in ranges)}: {res.governing.size} points, {res.method} path, "
          f"tolerance {res.tolerance:.0e}")
    if len(ranges) == 1:
        r = ranges[0]
        unit, scale = _display_unit(r.key.si_unit, study.case.display)
        print(f"  {r.key.text + ' [' + unit + ']':>28} {'load factor':>12} {'axis':>8} "
              + " ".join(f"{'K seg ' + str(s + 1):>9}" for s in res.segments))
        Kg = res.K_governing()
        step = max(1, r.values.size // 15)
        shown = sorted(set(list(range(0, r.values.size, step)) + [r.values.size - 1]))
        for i in shown:
            v = r.values[i]
            vt = "free" if r.key.is_spring and v == 0 else "rigid" if math.isinf(v) else fmt(v / scale)
            print(f"  {vt:>28} {fmt(res.governing[i]):>12} {res.axes[res.governing_axis[i]]:>8} "
                  + " ".join(f"{'-' if math.isnan(k) else f'{k:.4f}':>9}" for k in Kg[i]))
        if len(shown) < r.values.size:
            print(f"  ({len(shown)} of {r.values.size} rows shown; all in --csv / --json)")
    else:
        g = res.governing
        print(f"  load factor from {fmt(np.nanmin(g))} to {fmt(np.nanmax(g))} over the "
              f"{g.shape[0]} x {g.shape[1]} grid (all values in --csv / --json)")
    if res.notes:
        print(f"  {len(res.notes)} point(s) could not be analysed; first: {res.notes[0][1]}")
    for f in args.plot:
        print(f"  chart written to {f}")
    print(CAUTION)
    return 0


# -- brace ---------------------------------------------------------------------


def _brace_args(p: argparse.ArgumentParser) -> None:
    _add_common(p, plot=True)
    p.add_argument("--restraint", type=int, action="append", metavar="N",
                   help="[[restraint]] number of a brace (repeat for braces varied together). "
                        "Default: the case's [study.brace]")
    p.add_argument("--kind", choices=("lateral", "rotation"), help="spring of the brace (default lateral)")
    p.add_argument("--axis", help="bending plane (major / minor) when the braces act in both")
    p.add_argument("--fraction", type=float, help="target fraction of the rigid-brace load factor (default 0.95)")
    p.add_argument("--eps", type=float, help="relative shortfall accepted as reaching it (default 1e-6)")
    p.add_argument("--bow", type=float, metavar="RATIO",
                   help="initial bow height/RATIO for the brace force (default 500)")


def _run_brace(args) -> int:
    from ..io.summary import fmt
    from .run import case_brace

    study, spec = _load(args)
    _check_plot(args)
    b = spec.brace
    tables = tuple(args.restraint) if args.restraint else (b.restraints if b else None)
    if not tables:
        raise FeaError("no brace named: give --restraint N or a [study.brace] table in the case")
    kind = args.kind or (b.kind if b else "lateral")
    cb = case_brace(study, tables, kind=kind, axis=args.axis or (b.axis if b else None),
                    fraction=args.fraction if args.fraction is not None else (b.fraction if b else 0.95),
                    eps=args.eps if args.eps is not None else (b.eps if b else 1e-6),
                    bow=args.bow if args.bow is not None else (b.bow if b else 500.0))
    data = brace_dict(study, cb)
    figs = []
    if args.plot:
        from ..plot.study import plot_brace

        figs.append(plot_brace(cb.result, title=study.case.title, display=study.case.display))
    _write(args, study, data)
    for f in args.plot:
        from ..plot import save_figure

        save_figure(figs[0], f)
    if args.json == "-":
        import json

        print(json.dumps(data, indent=1, allow_nan=False))
        return 0
    r, d = cb.result, study.case.display
    print(study.case.title or "(untitled case)")
    print(f"brace study, {r.axis} plane, {r.kind} restraint(s) {', '.join(map(str, cb.tables))} at "
          f"{', '.join(fmt(d.L(s)) for s in r.stations)} {d.length}, varied together")
    print(f"  load factor: braces as given {fmt(r.load_factor_given)}, rigid {fmt(r.load_factor_rigid)}, "
          f"removed {fmt(r.load_factor_free) if r.load_factor_free > 0 else '0 (mechanism)'}")
    print(f"  threshold stiffness (load factor within {r.eps:.0e} of rigid): {_stiff(r.threshold, r.kind, d)}")
    print(f"  stiffness for {100 * r.fraction:g}% of the rigid-brace load factor: "
          f"{_stiff(r.fraction_stiffness, r.kind, d)}")
    if r.kind == "lateral":
        even = "equally spaced" if r.equally_spaced else "NOT equally spaced: Winter's rule is indicative only"
        print(f"  Winter (1960), {len(r.restraints)} brace(s), {even}: {r.winter_coefficient:.3f} P/Lb with "
              f"P = {fmt(d.F(r.axial_force_rigid))} {d.force}, Lb = {fmt(d.L(r.spacing))} {d.length}: "
              f"{_stiff(r.winter_stiffness, 'lateral', d)}")
        print(f"  AISC 360-16 App. 6.2 point bracing (from memory), P_r = {fmt(d.F(r.axial_force_design))} "
              f"{d.force}: stiffness 8 P_r/(0.75 Lb) = {_stiff(r.aisc_stiffness, 'lateral', d)}, "
              f"strength 0.01 P_r = {fmt(d.F(r.aisc_strength))} {d.force}")
    if cb.force is not None:
        fs = ", ".join(f"{fmt(d.F(f))} {d.force} ({100 * q:.2f}% of P)" for f, q in zip(cb.force.forces,
                                                                                        cb.force.ratios))
        print(f"  brace force at load factor 1, bow H/{cb.force.bow_ratio:g}, stiffness "
              f"{_stiff(cb.force.stiffness, 'lateral', d)} ({cb.force.basis}): {fs}")
    elif cb.force_note:
        print(f"  {cb.force_note}")
    for f in args.plot:
        print(f"  chart written to {f}")
    print(CAUTION)
    return 0


# -- sensitivity -----------------------------------------------------------------


def _sens_args(p: argparse.ArgumentParser) -> None:
    _add_common(p)
    p.add_argument("--no-check", action="store_true", help="skip the finite-difference check")


def _run_sensitivity(args) -> int:
    from ..io.summary import fmt
    from .run import case_sensitivities

    study, _spec = _load(args)
    cs = case_sensitivities(study, check=not args.no_check)
    data = sensitivity_dict(study, cs)
    _write(args, study, data)
    if args.json == "-":
        import json

        print(json.dumps(data, indent=1, allow_nan=False))
        return 0
    d = study.case.display
    print(study.case.title or "(untitled case)")
    print("sensitivity of the lowest load factor to each spring (from the mode shape; "
          "normalised = (k / load factor) d(load factor)/dk)")
    print(f"  {'restraint':>9} {'axis':>8} {'kind':>8} {'at':>8} {'stiffness':>22} {'normalised':>11} "
          f"{'FD check':>9}")
    for t, e in zip(cs.tables, cs.entries):
        if e.rigid:
            print(f"  {t:>9} {e.axis:>8} {e.kind:>8} {fmt(d.L(e.at)):>8} {'rigid':>22} {'(rigid)':>11}")
            continue
        chk = "-" if e.fd_relative_difference is None else f"{e.fd_relative_difference:.0e}"
        print(f"  {t:>9} {e.axis:>8} {e.kind:>8} {fmt(d.L(e.at)):>8} {_stiff(e.stiffness, e.kind, d):>22} "
              f"{e.normalised:11.4f} {chk:>9}{'  ' + e.note if e.note else ''}")
    rank = cs.ranking()
    if rank:
        t, e = rank[0]
        print(f"which restraint matters most ({cs.governing_axis} plane governs, load factor "
              f"{fmt(cs.load_factors[cs.governing_axis])}): restraint {t} {e.kind} at {fmt(d.L(e.at))} {d.length}: "
              f"1% stiffer raises the load factor by {e.normalised:.3f}%")
    print(CAUTION)
    return 0


# -- bounds ----------------------------------------------------------------------


def _bounds_args(p: argparse.ArgumentParser) -> None:
    _add_common(p)
    p.add_argument("--spring", nargs=3, action="append", metavar=("KEY", "LOW", "HIGH"), default=[],
                   help="an uncertain spring and its range, e.g. restraint[1].rotation '2 MN*m/rad' "
                        "'10 MN*m/rad'; repeat for more. Default: the case's [[study.bounds.spring]]")


def _run_bounds(args) -> int:
    from ..io.summary import fmt
    from .run import case_bounds

    study, spec = _load(args)
    if args.spring:
        ranges = []
        for k, lo, hi in args.spring:
            key = parse_key(k)
            a, b = key.parse_value(lo, f"{key.text} (low)"), key.parse_value(hi, f"{key.text} (high)")
            if not a <= b:
                raise FeaError(f"--spring {key.text}: low must not exceed high")
            ranges.append((key.text, a, b))
    elif spec.bounds:
        ranges = [(b.key, b.low, b.high) for b in spec.bounds]
    else:
        raise FeaError("no uncertain spring: give --spring KEY LOW HIGH or [[study.bounds.spring]] in the case")
    cb = case_bounds(study, ranges)
    data = bounds_dict(study, cb)
    _write(args, study, data)
    if args.json == "-":
        import json

        print(json.dumps(data, indent=1, allow_nan=False))
        return 0
    d = study.case.display
    print(study.case.title or "(untitled case)")
    for k, lo, hi in zip(cb.keys, cb.low, cb.high):
        kind = parse_key(k).kind
        print(f"  {k}: {_stiff(lo, kind, d)} to {_stiff(hi, kind, d)}")
    print("the load factor never decreases as a spring stiffens, so the corners of the box bound it "
          "(all corners evaluated)")
    for p in cb.planes:
        print(f"  {p.axis or 'plane'}: load factor {fmt(p.load_factor_min)} to {fmt(p.load_factor_max)} "
              f"({p.corners.shape[0]} corners)")
        for i, s in enumerate(study.case.segments):
            lo, hi = p.K_min[i], p.K_max[i]
            if not math.isnan(lo):
                print(f"    segment {i + 1} {s.name}: K {lo:.3f} to {'inf' if math.isinf(hi) else f'{hi:.3f}'}")
    for a, v in cb.fixed.items():
        print(f"  {a}: load factor {fmt(v)} (no uncertain spring acts in this plane)")
    print(f"governing load factor from {fmt(cb.load_factor_min)} to {fmt(cb.load_factor_max)}")
    print(CAUTION)
    return 0


# ---------------------------------------------------------------------------
# registration


def _register() -> None:
    from .. import cli
    from ..io import case

    case.EXTRA_SECTIONS["study"] = parse_study
    cli.COMMANDS["sweep"] = ("sweep one or two inputs of a case: load factor and K as a table and chart",
                             _sweep_args, _run_sweep)
    cli.COMMANDS["brace"] = ("stiffness a brace needs to act as a point of no sway, beside Winter's rule",
                             _brace_args, _run_brace)
    cli.COMMANDS["sensitivity"] = ("which restraint matters most: d(load factor)/d(stiffness) of every spring",
                                   _sens_args, _run_sensitivity)
    cli.COMMANDS["bounds"] = ("lowest and highest load factor and K over ranges of uncertain springs",
                              _bounds_args, _run_bounds)


_register()
