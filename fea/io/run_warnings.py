"""Every warning of a whole run, as :class:`fea.notices.Notice` (a stable key, a level, a sentence).

One list feeds the summary, the JSON ``warnings`` and the report (its summary box and its closing
part), so the three always say the same.  The keys and their meanings are in :data:`fea.notices.KINDS`
and ``docs/warnings.md``.
"""

from __future__ import annotations

from typing import Any

from ..notices import WARNING, Notice
from ..results import BucklingResult, CaseResults
from ..solve.imperfect_case import FIBRE_MODEL_NOTE

__all__ = ["run_notices", "run_warnings", "fails_run", "BUCKLES_CASE", "BUCKLES_DESIGN"]

#: Keys of the run warnings on load factors below one (stable: the JSON result carries them).
BUCKLES_CASE = "buckles-under-case-loads"
BUCKLES_DESIGN = "buckles-under-design-loads"


def _plane_notices(res: CaseResults, r: BucklingResult) -> list[Notice]:
    """Load factor below one, convergence and round-off, and segments whose K is not a design value."""
    from ..model.ideal_supports import ideal_case

    out = []
    if r.load_factor < 1.0:
        out.append(Notice(BUCKLES_CASE, f"{r.axis} axis: the lowest load factor {r.load_factor:.4g} is below 1: the "
                                        "column buckles elastically under its case loads", r.axis))
    if not r.converged:
        out.append(Notice("not-converged", f"{r.axis} axis: NOT CONVERGED: {r.message}; the load factor "
                                           f"{r.load_factor:.6g} is an estimate only", r.axis))
    else:
        out.extend(Notice("roundoff-limited", f"{r.axis} axis: {w}", r.axis) for w in r.warnings)
        short = [i for i, e in enumerate(r.mode_errors) if i > 0 and not e <= r.tolerance]
        if short:
            out.append(Notice("not-converged", f"{r.axis} axis: NOT CONVERGED for mode(s) "
                                               f"{', '.join(str(i + 1) for i in short)}: estimated errors "
                                               f"{', '.join(f'{r.mode_errors[i]:.1e}' for i in short)} > "
                                               f"{r.tolerance:.0e}; those load factors are estimates only", r.axis))
    light = [s for s in r.segments if s.advice]
    if light:
        names = "; ".join(f"segment {s.index + 1} '{res.case.segments[s.index].name}' "
                          f"(K {s.effective_length_factor:.3g}, {s.note})" for s in light)
        out.append(Notice("lightly-loaded-segment",
                          f"{r.axis} axis: {names}: carried along in a buckling mode of the whole column, so K and "
                          "K L are not design values there; check each such segment against its own N_cr instead",
                          r.axis))
    column = res.case.column(r.axis)
    for s in r.segments:
        ideal = ideal_case(column, s.index)
        if ideal is not None and s.meaningful and s.effective_length_factor is not None:
            out.append(Notice("idealised-support",
                              f"{r.axis} axis, segment {s.index + 1} '{res.case.segments[s.index].name}': "
                              f"{ideal.name} supports, K {s.effective_length_factor:.3g} from this analysis "
                              f"(theoretical {ideal.theoretical:.3g}); {ideal.note}: recommended design K "
                              f"{ideal.recommended:.2f} ({ideal.source})", r.axis))
    return out


def _standard_limit(design: Any) -> tuple[float, str] | None:
    """The selected standard's own K L / r limit when it sets one below common practice's 200."""
    from ..design.standards import STANDARDS
    from ..model.plausibility import SLENDERNESS_LIMIT

    std = STANDARDS.get(getattr(design, "standard", None) or "")
    lim = getattr(std, "slenderness_limit", None)
    return lim if lim is not None and lim[0] < SLENDERNESS_LIMIT else None


def run_notices(res: CaseResults) -> list[Notice]:
    """Every warning of the run: those of level "warning" first, then the checks; within each level the input,
    each plane, the design, the imperfect column."""
    from ..model.plausibility import case_notices, result_notices

    out: list[Notice] = list(case_notices(res.case))
    for r in res.buckling:
        out.extend(_plane_notices(res, r))
    design: Any = res.extras.get("design")
    own = _standard_limit(design)
    out.extend(result_notices(res, *own) if own else result_notices(res))
    for w in getattr(design, "sway", ()):
        if w.alpha_cr < 1.0:
            out.append(Notice(BUCKLES_DESIGN, f"{w.axis} axis: alpha_cr {w.alpha_cr:.4g} is below 1: the column "
                                              "buckles elastically under the design loads (case loads x "
                                              f"{design.load_factor:g})", w.axis))
    spatial: Any = res.extras.get("spatial")
    if spatial is not None and spatial.ran and spatial.load_factor < 1.0:
        out.append(Notice(BUCKLES_CASE, f"thin-walled analysis: the lowest load factor {spatial.load_factor:.4g} "
                                        f"({spatial.kind}) is below 1: the column buckles elastically under its case "
                                        "loads", "spatial"))
    imperfect: Any = res.extras.get("imperfect") or {}
    for axis, ir in imperfect.items():
        if ir.status != "ok":
            out.append(Notice("imperfect-not-complete", f"{axis} axis, imperfect column: {ir.message}", axis))
        out.extend(Notice("imperfect-analysis", f"{axis} axis, imperfect column: {w}", axis) for w in ir.warnings
                   if not w.startswith(FIBRE_MODEL_NOTE))  # that one describes the model: no warning
    return sorted(out, key=lambda n: n.level != WARNING)  # warnings first, then checks, each in the order above


def run_warnings(res: CaseResults) -> list[dict[str, Any]]:
    """The run's warnings as JSON-ready dicts (``key``, ``level``, ``text`` and ``axis`` where one plane)."""
    return [n.as_dict() for n in run_notices(res)]


def fails_run(notices: list[Notice] | list[dict[str, Any]]) -> bool:
    """Whether any warning is of level ``"warning"`` (the result cannot be relied on: exit status 1)."""
    return any((n["level"] if isinstance(n, dict) else n.level) == WARNING for n in notices)
