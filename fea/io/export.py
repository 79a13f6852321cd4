"""Results -> the JSON contract (SI units).  Documented in cases/README.md."""

from __future__ import annotations

from typing import Any, Callable, Mapping

from ..cautions import CAUTION, LIMITATIONS
from ..model.column import Column
from ..model.ideal_supports import ideal_case
from ..results import BucklingResult, CaseResults, SegmentBuckling
from ..util.numbers import finite_or_none as _num
from ..version import version
from .run_warnings import run_warnings

__all__ = ["result_dict", "buckling_dict"]


def _ideal(column: Column | None, s: SegmentBuckling) -> dict[str, Any] | None:
    """The nearest ideal support case of a segment bounded by perfectly rigid restraints, or None."""
    if column is None or s.effective_length_factor is None or not s.meaningful:
        return None
    ideal = ideal_case(column, s.index)
    return None if ideal is None else ideal.as_dict()


def buckling_dict(r: BucklingResult, column: Column | None = None) -> dict[str, Any]:
    """One bending plane: load factors, per-segment figures and mode shapes (SI); ``column`` (the plane's model)
    adds the design K recommended for segments between idealised supports."""
    return {
        "axis": r.axis,
        "load_factors": [float(v) for v in r.load_factors],
        "converged": r.converged,
        "discretisation_error": float(r.discretisation_error),
        "mode_errors": [_num(float(e)) for e in r.mode_errors],
        "roundoff_error": float(r.roundoff_error),
        "warnings": list(r.warnings),
        "tolerance": r.tolerance,
        "n_elements": r.n_elements,
        "solver": r.solver,
        "message": r.message,
        "segments": [
            {
                "index": s.index + 1,
                "bottom_m": s.bottom,
                "top_m": s.top,
                "length_m": s.length,
                "axial_force_N": s.axial_force,
                "critical_axial_force_N": s.critical_axial_force,
                "effective_length_factor": _num(s.effective_length_factor),
                "effective_length_m": _num(s.effective_length),
                "I_ref_m4": s.I_ref,
                "energy_share": s.energy_share,
                "k_meaningful": s.meaningful,
                "note": s.note,
                "k_advice": s.advice,
                "ideal_support": _ideal(column, s),
            }
            for s in r.segments
        ],
        "modes": {
            "heights_m": [float(v) for v in r.heights],
            "shapes": [[float(v) for v in m] for m in r.modes],
        },
    }


def result_dict(res: CaseResults, parts: Mapping[str, Callable[[Any], Any]]) -> dict[str, Any]:
    """The whole JSON result of a case run; ``parts`` turns each optional analysis's result into its part."""
    case = res.case
    out: dict[str, Any] = {
        "units": "SI",
        "tool": {"name": "stanchion", "version": version()},
        "title": case.title,
        "case_file": case.source,
        "case_sha256": case.sha256,
        "height_m": case.height,
        "governing_axis": res.governing_axis,
        "governing_load_factor": res.governing.load_factor,
        "buckling": [buckling_dict(r, case.column(r.axis)) for r in res.buckling],
    }
    for name, value in res.extras.items():
        if name in parts:
            out[name] = parts[name](value)
    out["warnings"] = run_warnings(res)
    out["cautions"] = [CAUTION, *LIMITATIONS]
    return out
