"""Imperfect-column results -> the ``"imperfect"`` part of the JSON result and the summary lines.

JSON (SI units), a list with one object per bending plane analysed::

    {"axis", "analysis", "status", "status_text", "success", "message", "warnings",
     "imperfection": {"shape", "largest_bow_m", "amplitude_m", "ratio", "offsets_m"},
     "critical_load_factor", "first_yield_load_factor", "first_yield_source", "first_yield_remark",
     "second_order_first_yield_load_factor", "fibre_first_yield_load_factor", "limit_load_factor",
     "comparison": [{"segment", "bottom_m", "top_m", "axial_force_N", "permanent_force_N", "variable_force_N",
                     "bow_m", "critical_force_N", "critical_load_factor", "euler_force_N", "euler_load_factor",
                     "perry_force_N", "perry_load_factor", "first_yield_force_N", "first_yield_load_factor",
                     "limit_force_N", "limit_load_factor", "note"}],
     "second_order": {"load_factors", "heights_m", "bow_m", "deflection_m", "end_heights_m", "moment_Nm",
                      "axial_force_N", "stress_Pa", "first_order_moment_Nm", "deflection_amplification",
                      "moment_amplification", "first_yield_height_m", "n_elements",
                      "discretisation_error", "tolerance", "converged", "message"} or null,
     "path": {"load_factors", "control_height_m", "control_deflection_m", "heights_m", "bow_m",
              "deflection_m", "yield_extent_m", "max_yield_fraction", "limit_load_factor", "limit_accuracy",
              "limit_index", "first_yield_load_factor", "first_yield_bracket", "first_yield_height_m",
              "first_yield_offset_m", "status", "status_text", "success", "message", "n_elements", "n_fibres",
              "n_steps",
              "n_iter", "n_bisections", "max_residual", "tolerance"} or null}

Non-finite numbers are written as null.  ``status`` fields are stable identifiers for scripts
(``status_text`` and :data:`STATUS_WORDS` give them in words); every ``message`` is plain words.
``first_yield_load_factor`` is the headline first yield, ``first_yield_source`` names its model
(with residual stress in the fibre model: the fibre model's); ``first_yield_remark`` says why a
first yield shown lies above the ultimate load ("" when none does).  ``deflection_m`` is the total
lateral position, bow included (``bow_m`` + the deflection under load).
"""

from __future__ import annotations

import math
from typing import TYPE_CHECKING, Any

import numpy as np

from ..units import DisplayUnits
from ..util.numbers import finite_list as _arr  # short names: the dicts below use them on every line
from ..util.numbers import finite_or_none as _num
from ..util.numbers import json_clean

if TYPE_CHECKING:
    from ..solve.imperfect import ImperfectResult

__all__ = ["imperfect_json", "imperfect_summary", "result_json", "STATUS_WORDS", "status_words"]

#: How an imperfect-column analysis (or its nonlinear path) ended, in engineering words, by status identifier.
STATUS_WORDS = {
    "ok": "completed",
    "drop_after_peak": "completed: the path passed the ultimate load and was followed until the load fell",
    "displacement_limit": "completed: the deflection reached the stopping limit",
    "lambda_max": "completed: the load factor reached the largest value asked for",
    "max_steps": "completed: the largest number of steps was used",
    "second_order_not_converged": "not complete: the second-order mesh did not reach the tolerance",
    "step_failed": "not complete: no equilibrium was found beyond the last point",
    "load_control_limit": "not complete: load control cannot pass the peak",
    "bifurcation": "not complete: the straight column branched off (bifurcation) without a peak",
    "constant_load_failed": "not complete: the permanent loads alone could not be carried",
}


def status_words(status: str) -> str:
    """Engineering words for a status identifier (an unknown one is returned with its underscores as spaces)."""
    return STATUS_WORDS.get(status, status.replace("_", " "))


def result_json(r: "ImperfectResult") -> dict[str, Any]:
    """One plane's result as a JSON-able dict (SI)."""
    imp = r.imperfection
    so, nl = r.second_order, r.nonlinear
    fy, src = r.reported_first_yield
    comp = []
    for c in r.comparison:
        comp.append({
            "segment": c.index + 1, "bottom_m": c.bottom, "top_m": c.top, "axial_force_N": c.axial_force,
            "permanent_force_N": c.permanent_force, "variable_force_N": c.variable_force, "bow_m": c.bow,
            "critical_force_N": _num(c.critical_force), "critical_load_factor": _num(r.critical_load_factor),
            "euler_force_N": c.euler_force, "euler_load_factor": _num(c.load_factor(c.euler_force)),
            "perry_force_N": _num(c.perry_force), "perry_load_factor": _num(c.perry_load_factor),
            "first_yield_force_N": _num(c.force(fy)), "first_yield_load_factor": _num(fy),
            "limit_force_N": _num(c.force(r.limit_load_factor)), "limit_load_factor": _num(r.limit_load_factor),
            "note": c.note,
        })
    out: dict[str, Any] = {
        "axis": r.axis, "analysis": r.analysis, "status": r.status, "status_text": status_words(r.status),
        "success": r.success, "message": r.message,
        "warnings": list(r.warnings),
        "imperfection": None if imp is None else {
            "shape": imp.shape, "largest_bow_m": r.bow_amplitude, "amplitude_m": _num(imp.amplitude),
            "ratio": _num(imp.ratio), "offsets_m": [list(p) for p in imp.offsets]},
        "critical_load_factor": _num(r.critical_load_factor),
        "first_yield_load_factor": _num(fy), "first_yield_source": src, "first_yield_remark": r.first_yield_remark,
        "second_order_first_yield_load_factor": _num(r.second_order_first_yield_load_factor),
        "fibre_first_yield_load_factor": _num(r.fibre_first_yield_load_factor),
        "limit_load_factor": _num(r.limit_load_factor),
        "comparison": comp,
        "second_order": None, "path": None,
    }
    if so is not None:
        out["second_order"] = {
            "load_factors": _arr(so.load_factors), "heights_m": _arr(so.heights), "bow_m": _arr(so.bow),
            "deflection_m": _arr(so.deflection), "end_heights_m": _arr(so.end_heights),
            "moment_Nm": _arr(so.moment), "axial_force_N": _arr(so.axial_force), "stress_Pa": _arr(so.stress),
            "first_order_moment_Nm": _arr(so.first_order_moment),
            "deflection_amplification": _arr(so.deflection_amplification),
            "moment_amplification": _arr(so.moment_amplification),
            "first_yield_height_m": _num(so.first_yield_height), "n_elements": so.n_elements,
            "discretisation_error": _num(so.discretisation_error), "tolerance": so.tolerance,
            "converged": so.converged, "message": so.message,
        }
    if nl is not None:
        out["path"] = {
            "load_factors": _arr(nl.load_factors), "control_height_m": nl.control_height,
            "control_deflection_m": _arr(nl.control_deflection), "heights_m": _arr(nl.heights),
            "bow_m": _arr(nl.bow), "deflection_m": _arr(nl.deflection), "yield_extent_m": _arr(nl.yield_extent),
            "max_yield_fraction": _arr(np.max(nl.yield_fraction, axis=1)),
            "limit_load_factor": _num(nl.limit_load_factor), "limit_accuracy": _num(nl.limit_accuracy),
            "limit_index": nl.limit_index, "first_yield_load_factor": _num(nl.first_yield_load_factor),
            "first_yield_bracket": None if nl.first_yield_bracket is None else list(nl.first_yield_bracket),
            "first_yield_height_m": _num(nl.first_yield_height), "first_yield_offset_m": _num(nl.first_yield_offset),
            "status": nl.status, "status_text": status_words(nl.status), "success": nl.success,
            "message": nl.message, "n_elements": nl.n_elements,
            "n_fibres": nl.n_fibres, "n_steps": nl.n_steps, "n_iter": nl.n_iter, "n_bisections": nl.n_bisections,
            "max_residual": _num(nl.max_residual), "tolerance": nl.tolerance,
        }
    return json_clean(out)


def imperfect_json(results: dict[str, "ImperfectResult"]) -> list[dict[str, Any]]:
    """The ``"imperfect"`` part of the JSON result: one object per plane (see module notes)."""
    return [result_json(r) for r in results.values()]


def _lf(x) -> str:
    from .summary import fmt

    return "-" if x is None or not math.isfinite(x) else fmt(x)


def _bow_text(r: "ImperfectResult", d: DisplayUnits) -> str:
    from .summary import fmt

    imp = r.imperfection
    if imp is None or imp.is_zero:
        return "straight (no bow)"
    size = f"L/{imp.ratio:g}" if imp.ratio is not None else (
        f"{fmt(d.L(imp.amplitude))} {d.length}" if imp.amplitude is not None else "measured offsets")
    return f"bow {size}, {imp.shape} (largest {fmt(d.L(r.bow_amplitude))} {d.length})"


def _model_line(r: "ImperfectResult") -> str:
    """The headline first yield with its model and the ultimate load, one line."""
    fy, src = r.reported_first_yield
    parts = [f"first yield ({src}) at load factor {_lf(fy)}" if fy is not None else "no first yield found"]
    if r.limit_load_factor is not None:
        parts.append(f"ultimate load factor {_lf(r.limit_load_factor)} ({r.fibre_model})")
    return "  " + "; ".join(parts)


def imperfect_summary(results: dict[str, "ImperfectResult"], d: DisplayUnits) -> list[str]:
    """Terminal summary lines of the imperfect-column analysis, in display units."""
    from .summary import fmt

    out = ["Imperfect column (second-order and nonlinear analysis)"]
    for r in results.values():
        out.append(f"Axis {r.axis}: {_bow_text(r, d)}; analysis {r.analysis}")
        out.append(_model_line(r))
        so, nl = r.second_order, r.nonlinear
        if so is not None:
            i1 = int(np.argmin(np.abs(so.load_factors - 1.0)))
            amp = ""
            if abs(so.load_factors[i1] - 1.0) < 1e-12:
                amp = (f"; at load factor 1: deflection x{so.deflection_amplification[i1]:.3f}, "
                       f"moment x{so.moment_amplification[i1]:.3f}, largest moment "
                       f"{fmt(d.F(d.L(np.abs(so.moment[i1]).max())))} {d.force}*{d.length}")
            fy = ("first yield at load factor " + _lf(so.first_yield_load_factor)
                  + (f" at {fmt(d.L(so.first_yield_height))} {d.length}" if so.first_yield_height is not None else "")
                  if so.first_yield_load_factor is not None else "no first yield computed or reached")
            out.append(f"  second order (elastic, no residual stress): {fy}{amp}")
            out.append(f"    mesh {so.n_elements} elements, estimated error {so.discretisation_error:.1e} "
                       f"(tolerance {so.tolerance:.0e}){'' if so.converged else '  NOT CONVERGED'}")
        if nl is not None:
            if nl.limit_load_factor is not None:
                ext = nl.yield_extent[nl.limit_index]
                spread = (f", yielding from {fmt(d.L(ext[0]))} to {fmt(d.L(ext[1]))} {d.length} at the peak"
                          if np.all(np.isfinite(ext)) else ", no yielding at the peak")
                out.append(f"  nonlinear ({r.fibre_model}): ultimate load factor {_lf(nl.limit_load_factor)} "
                           f"(peak located to {nl.limit_accuracy:.0e}){spread}")
            else:
                out.append(f"  nonlinear ({r.fibre_model}): no ultimate load found ({status_words(nl.status)})")
            if nl.first_yield_load_factor is not None:
                out.append(f"    first fibre yields at load factor {_lf(nl.first_yield_load_factor)}, "
                           f"{fmt(d.L(nl.first_yield_height))} {d.length} up, "
                           f"{fmt(d.L(nl.first_yield_offset))} {d.length} from the axis")
            out.append(f"    {nl.n_elements} elements x {nl.n_fibres} fibres, {nl.n_steps} steps, "
                       f"{nl.n_iter} iterations, residual <= {nl.max_residual:.0e}; {nl.message}")
        for c in r.comparison:
            if c.variable_force <= 0:
                continue
            out.append(f"  segment {c.index + 1} ({fmt(d.L(c.bottom), 3)}-{fmt(d.L(c.top), 3)} {d.length}), "
                       f"N = {fmt(d.F(c.axial_force))} {d.force} at load factor 1:")
            rows = _comparison_rows(r, c)
            width = max(len(name) for name, _ in rows)
            for name, lam in rows:
                N = c.force(lam)
                out.append(f"    {name:<{width}} load factor {_lf(lam):>9}   N {'-' if N is None else fmt(d.F(N)):>10} "
                           f"{d.force}")
        if r.first_yield_remark:
            out.append(f"  note: {r.first_yield_remark}")
        for w in r.warnings:
            out.append(f"  note: {w}")
        if r.status != "ok":
            out.append(f"  NOT COMPLETE ({status_words(r.status)}): {r.message}")
    return out


def _comparison_rows(r: "ImperfectResult", c) -> list[tuple[str, float | None]]:
    """(name, load factor) of the comparison of one segment: the headline first yield first, named by its model."""
    from ..solve.imperfect import ELASTIC_MODEL

    fy, src = r.reported_first_yield
    rows = [("elastic critical load (eigen)", r.critical_load_factor),
            ("Euler load of the segment", c.load_factor(c.euler_force)),
            ("Perry-Robertson first yield", c.perry_load_factor),
            (f"first yield ({src or 'none found'})", fy)]
    if r.second_order_first_yield_load_factor is not None and src != ELASTIC_MODEL:
        rows.append((f"first yield ({ELASTIC_MODEL})", r.second_order_first_yield_load_factor))
    rows.append((f"ultimate load ({r.fibre_model})", r.limit_load_factor))
    return rows
