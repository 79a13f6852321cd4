"""Outputs of the batch and reliability commands: the tables (CSV, JSON, SI) and the summary lines.

Batch table, one row per job (row and combination), CSV columns and JSON keys::

    mark, combination, outcome, exit_status, governing_axis, lowest_load_factor, verdict, utilisation,
    warnings (keys, ";"-separated in CSV), error, K_<axis>_<segment> (CSV; JSON: "K": {axis: [K per segment]}),
    case

``outcome`` is ``passes`` (design check passed), ``buckling only`` (no [design]: buckling analysed, nothing
verified), ``fails``, ``not verified``, ``warning`` (a run warning of level "warning", e.g. a plane buckles
under its loads) or ``error`` (the row could not run: ``error`` holds the one-line message);
``exit_status`` is what ``stanchion check`` gives that case (0, 1, 2 bad input, 3 internal error).

Reliability: the samples (index, each variable's value in SI with its unit in the CSV header, the strength
as a load factor, the governing plane, the reason when there is no strength) and the statistics; layout of
the JSON in :func:`reliability_json`.

Pure: data in, text and dicts out.
"""

from __future__ import annotations

import csv
import io
import math
from typing import Any, Iterable, Sequence

from ..cautions import CAUTION
from ..util.numbers import finite_or_none as _num
from .reliability_input import STRENGTHS
from .statistics import FRACTILE_METHOD, PF_METHOD

__all__ = ["batch_csv", "batch_json", "batch_lines", "k_columns", "counts", "reliability_json",
           "reliability_csv", "reliability_lines", "ATTENTION"]

#: Outcomes listed row by row in the summary (the others are only counted).
ATTENTION = ("fails", "not verified", "warning", "error")
_ORDER = ("passes", "buckling only", "fails", "not verified", "warning", "error")


def k_columns(rows: Iterable[dict]) -> list[tuple[str, int]]:
    """(axis, segment index from 0) of every K column of the table, axes in order of first appearance."""
    width: dict[str, int] = {}
    for r in rows:
        for axis, ks in (r.get("K") or {}).items():
            width[axis] = max(width.get(axis, 0), len(ks))
    return [(a, i) for a, n in width.items() for i in range(n)]


def _g(x: Any) -> str:
    if x is None:
        return ""
    if isinstance(x, float):
        return repr(x) if math.isfinite(x) else ""
    return str(x)


def batch_csv(rows: Sequence[dict]) -> str:
    cols = k_columns(rows)
    out = io.StringIO()
    w = csv.writer(out, lineterminator="\n")
    w.writerow(["mark", "combination", "outcome", "exit_status", "governing_axis", "lowest_load_factor", "verdict",
                "utilisation", "warnings", "error"] + [f"K_{a}_{i + 1}" for a, i in cols] + ["case"])
    for r in rows:
        ks = r.get("K") or {}
        w.writerow([r["mark"], r["combination"], r["outcome"], r["exit_status"], _g(r["governing_axis"]),
                    _g(r["lowest_load_factor"]), _g(r["verdict"]), _g(r["utilisation"]), ";".join(r["warnings"]),
                    _g(r["error"])]
                   + [_g(ks[a][i]) if a in ks and i < len(ks[a]) else "" for a, i in cols] + [r.get("case", "")])
    return out.getvalue()


def counts(rows: Iterable[dict]) -> dict[str, int]:
    out = {k: 0 for k in _ORDER}
    for r in rows:
        out[r["outcome"]] = out.get(r["outcome"], 0) + 1
    return out


def batch_json(meta: dict, rows: Sequence[dict]) -> dict:
    """The batch table as JSON: ``meta`` (tool, schedule, title, execution, ...) and every row (SI)."""
    return {**meta, "counts": counts(rows), "rows": [dict(r) for r in rows], "cautions": [CAUTION]}


def _f(x: Any, fmt: str = ".4g") -> str:
    return "-" if x is None or (isinstance(x, float) and not math.isfinite(x)) else format(x, fmt)


def batch_lines(meta: dict, rows: Sequence[dict], wrote: Sequence[str] = ()) -> list[str]:
    """The terminal summary: counts, then every row that needs attention."""
    c = counts(rows)
    title = meta.get("title") or meta.get("schedule", "")
    lines = [f"Batch: {title}", f"  {len(rows)} run(s) from {meta.get('n_rows', '?')} row(s) and "
                                f"{meta.get('n_combinations', 0) or 'no'} combination(s); "
                                f"ran {meta.get('ran', len(rows))}, reused {meta.get('reused', 0)} "
                                f"({meta.get('execution', '')})"]
    lines.append("  " + ", ".join(f"{n} {k}" for k, n in c.items() if n))
    bad = [r for r in rows if r["outcome"] in ATTENTION]
    if bad:
        lines.append("")
        lines.append(f"  {'mark':<14} {'combination':<14} {'outcome':<13} {'plane':<8} {'lambda':>8} {'util.':>7}  "
                     "note")
        for r in bad:
            note = r["error"] or ", ".join(r["warnings"])
            lines.append(f"  {r['mark'][:14]:<14} {r['combination'][:14]:<14} {r['outcome']:<13} "
                         f"{(r['governing_axis'] or '-'):<8} {_f(r['lowest_load_factor']):>8} "
                         f"{_f(r['utilisation'], '.3f'):>7}  {note}")
    if wrote:
        lines.append("")
        lines.append("Wrote " + ", ".join(wrote))
    lines.append("")
    lines.append(CAUTION)
    return lines


# -- reliability ------------------------------------------------------------------------------------


def _variable_json(v) -> dict:
    d = v.distribution
    return {"key": v.key, "distribution": d.kind, "parameters_si": d.parameters(), "mean_si": d.mean,
            "sd_si": d.sd, "si_unit": v.si_unit, "unit_given": v.unit, "note": v.note}


def reliability_json(res, meta: dict) -> dict:
    """The JSON result of a reliability run (SI)::

        {..meta (tool, title, case_file, case_sha256, execution)..,
         "reliability": {"strength", "strength_meaning", "samples", "seed", "seeding", "copula",
                         "variables": [{"key", "distribution", "parameters_si", "mean_si", "sd_si", "si_unit",
                                        "unit_given", "note"}],
                         "correlation": [[...]] or null, "variable_axial_load_N",
                         "statistics": {"n", "n_without_strength", "mean", "sd", "cov", "mean_standard_error",
                                        "min", "max",
                                        "fractile": {"p", "value", "rank", "confidence", "lower", "lower_rank",
                                                     "upper", "upper_rank", "method"}} or null,
                         "design_load": {"given", "load_factor", "force_N"} or null,
                         "failure": {"failures", "n", "pf", "pf_standard_error", "pf_cov", "confidence",
                                     "pf_lower", "pf_upper", "beta", "beta_standard_error", "beta_lower",
                                     "beta_upper", "method"} or null,
                         "sample_values": [{"index", "values_si": [...], "strength", "axis", "message"}]},
         "warnings": [str], "cautions": [str]}

    Infinite values of beta (no sample failed, or all did) are written as null.
    """
    spec = res.spec
    stats = None
    if res.moments is not None:
        m, f = res.moments, res.fractile
        stats = {"n": m.n, "n_without_strength": res.n_missing, "mean": m.mean, "sd": m.sd, "cov": _num(m.cov),
                 "mean_standard_error": m.mean_se, "min": m.minimum, "max": m.maximum,
                 "fractile": {"p": f.p, "value": f.value, "rank": f.rank, "confidence": f.confidence,
                              "lower": f.lower, "lower_rank": f.lower_rank, "upper": f.upper,
                              "upper_rank": f.upper_rank, "method": FRACTILE_METHOD}}
    design = None
    if res.design_load is not None:
        design = {"given": spec.design_text, "load_factor": res.design_load, "force_N": spec.design_force}
    fail = None
    if res.failure is not None:
        p = res.failure
        fail = {"failures": p.failures, "n": p.n, "pf": p.pf, "pf_standard_error": p.se, "pf_cov": p.cov,
                "confidence": p.confidence, "pf_lower": p.lower, "pf_upper": p.upper, "beta": _num(p.beta),
                "beta_standard_error": p.beta_se, "beta_lower": _num(p.beta_lower), "beta_upper": _num(p.beta_upper),
                "method": PF_METHOD}
    from .sampling import SEEDING

    return {**meta, "reliability": {
        "strength": spec.strength, "strength_meaning": STRENGTHS[spec.strength], "samples": spec.samples,
        "seed": spec.seed, "seeding": SEEDING,
        "copula": "Gaussian (Nataf's model): the correlation matrix given is that of the standard normal "
                  "variables, not of the variables themselves",
        "variables": [_variable_json(v) for v in spec.variables],
        "correlation": [list(r) for r in spec.correlation] if spec.correlation else None,
        "variable_axial_load_N": res.variable_load,
        "statistics": stats, "design_load": design, "failure": fail,
        "sample_values": [{"index": s.index, "values_si": list(s.values), "strength": s.strength, "axis": s.axis,
                           "message": s.message} for s in res.samples]},
        "warnings": list(res.warnings), "cautions": [CAUTION]}


def reliability_csv(res) -> str:
    out = io.StringIO()
    w = csv.writer(out, lineterminator="\n")
    w.writerow(["index"] + [f"{v.key} [{v.si_unit or '-'}]" for v in res.spec.variables]
               + [f"{res.spec.strength} load factor", "governing_axis", "message"])
    for s in res.samples:
        w.writerow([s.index] + [repr(x) for x in s.values] + [_g(s.strength), s.axis or "", s.message])
    return out.getvalue()


def _in_unit(v, x: float) -> str:
    return f"{x / v.unit_si:.4g} {v.unit}".strip()


def reliability_lines(res, meta: dict, wrote: Sequence[str] = ()) -> list[str]:
    spec = res.spec
    lines = [f"Reliability: {meta.get('title', '')}",
             f"  strength: {STRENGTHS[spec.strength]}",
             f"  {spec.samples} samples, seed {spec.seed} ({meta.get('execution', '')})"]
    lines.append("  variables:")
    for v in spec.variables:
        d = v.distribution
        cov = f" (COV {d.sd / abs(d.mean):.3g})" if d.mean else ""
        lines.append(f"    {v.key:<28} {d.kind:<9} mean {_in_unit(v, d.mean)}, sd {_in_unit(v, d.sd)}{cov}")
    if spec.correlation:
        lines.append("  correlation of the standard normal variables (Gaussian copula) given")
    if res.moments is None:
        lines.append("  no sample has a strength")
    else:
        m, f = res.moments, res.fractile
        lines.append(f"  strength (load factor): mean {m.mean:.4g} (standard error {m.mean_se:.2g}), "
                     f"sd {m.sd:.3g}, COV {m.cov:.3g}, range {m.minimum:.4g} to {m.maximum:.4g}")
        ci = (f"{f.confidence:.0%} interval {_f(f.lower)} to {_f(f.upper)}" if f.lower is not None and
              f.upper is not None else "too few samples for its confidence interval")
        lines.append(f"  {f.p:g} fractile (characteristic): {f.value:.4g} ({ci}; order statistics)")
    if res.failure is not None:
        p = res.failure
        force = f" = {spec.design_text}" if spec.design_force is not None else ""
        lines.append(f"  design load: load factor {res.design_load:.4g}{force}")
        beta_se = f" +/- {p.beta_se:.2g}" if p.beta_se is not None else ""
        lines.append(f"  failures: {p.failures} of {p.n}: pf = {p.pf:.3g} (standard error {p.se:.2g}; "
                     f"{p.confidence:.0%} interval {p.lower:.3g} to {p.upper:.3g})")
        lines.append(f"  reliability index beta = {_f(p.beta, '.3f')}{beta_se} "
                     f"({p.confidence:.0%} interval {_f(p.beta_lower, '.3f')} to {_f(p.beta_upper, '.3f')})")
    for w in res.warnings:
        lines.append(f"Warning: {w}")
    if wrote:
        lines.append("Wrote " + ", ".join(wrote))
    lines.append("")
    lines.append(CAUTION)
    return lines
