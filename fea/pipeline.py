"""Run the analyses a case asks for and collect their results (no I/O)."""

from __future__ import annotations

from dataclasses import dataclass, field

from .model.case import Case
from .results import BucklingResult, CaseResults
from .solve.eigen import buckling

__all__ = ["CaseResults", "run_case"]


#: Optional analyses run after buckling: name -> f(case, buckling results) -> result or None.
ANALYSES: dict = {}


def run_case(case: Case, n_modes: int | None = None, skip: tuple[str, ...] = ()) -> CaseResults:
    """Buckling of every plane of ``case``, then any optional analysis it declares."""
    modes = n_modes or case.n_modes
    results = tuple(buckling(col, n_modes=modes, tol=case.tolerance, axis=axis) for axis, col in case.planes)
    gov = min(results, key=lambda r: r.load_factor).axis
    extras = {}
    for name, fn in ANALYSES.items():
        if name in skip:
            continue
        out = fn(case, results)
        if out is not None:
            extras[name] = out
    return CaseResults(case=case, buckling=results, governing_axis=gov, extras=extras)
