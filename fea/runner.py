"""Run the analyses a case asks for and collect their results (no I/O)."""

from __future__ import annotations

from dataclasses import dataclass, field

from .io.case import Case
from .results import BucklingResult
from .solve.eigen import buckling

__all__ = ["CaseResults", "run_case"]


@dataclass(frozen=True)
class CaseResults:
    """Everything computed for one case.

    Attributes
    ----------
    case : the case
    buckling : tuple of BucklingResult, one per bending plane, in the case's plane order
    governing_axis : the plane with the lowest load factor
    extras : results of optional analyses (imperfect, design, ...) keyed by name
    """

    case: Case
    buckling: tuple[BucklingResult, ...]
    governing_axis: str
    extras: dict = field(default_factory=dict)

    def plane(self, axis: str) -> BucklingResult:
        for r in self.buckling:
            if r.axis == axis:
                return r
        raise KeyError(axis)

    @property
    def governing(self) -> BucklingResult:
        return self.plane(self.governing_axis)


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
