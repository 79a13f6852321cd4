"""What the page shows, as plain data: the results of one change in the case's display units.

Numbers are written with four significant figures (:func:`fea.io.summary.fmt`,
the terminal summary's format), so that the page, ``stanchion check`` and the
JSON result read the same.  The warnings are the run's own
(:func:`fea.io.run_warnings.run_notices`), the verdict is the design check's
(:func:`fea.io.design_output.verdict_line`), and every page carries the
caution (:data:`fea.cautions.CAUTION`).

Pure: result objects in, JSON-ready data out.
"""

from __future__ import annotations

import os
from typing import Any

from ..cautions import CAUTION, LIMITATIONS
from ..io.design_output import DESIGN_CAUTION, verdict_line
from ..io.run_warnings import run_notices
from ..io.summary import fmt
from ..pipeline import ANALYSES
from ..plot.text import PlotUnits
from .state import Explorer, Outcome, values_in_display
from .svg import figure_svg

__all__ = ["page_state", "outcome_view", "TITLES"]

#: Headings of the other analyses' summaries.
TITLES = {"fixity": "Depth of fixity", "spatial": "Thin-walled buckling", "imperfect": "Imperfect column"}


def _units(ex: Explorer) -> PlotUnits:
    d = ex.case.display
    return PlotUnits(d.length, d.length_si, d.force, d.force_si)


def _plane(r, case) -> dict[str, Any]:
    d = case.display
    segs = []
    for s, info in zip(r.segments, case.segments):
        K = s.effective_length_factor
        segs.append({
            "index": s.index + 1, "name": info.name,
            "N": fmt(d.F(s.axial_force)), "N_cr": fmt(d.F(s.critical_axial_force)),
            "K": "-" if K is None else fmt(K),
            "KL": "-" if s.effective_length is None else fmt(d.L(s.effective_length)),
            "energy": f"{100 * s.energy_share:.1f}%", "meaningful": bool(s.meaningful), "note": s.note,
            "advice": s.advice,
        })
    return {"axis": r.axis, "load_factor": fmt(r.load_factor), "load_factors": [fmt(v) for v in r.load_factors],
            "converged": bool(r.converged), "message": r.message, "elements": int(r.n_elements), "segments": segs}


def _design(res) -> dict[str, Any] | None:
    r = res.extras.get("design")
    if r is None:
        return None
    g = r.governing
    where = "in tension" if g.kind == "tension" else \
        "in flexural-torsional buckling" if g.axis == "torsional" else f"about the {g.axis} axis"
    return {
        "standard": r.standard,
        "load_factor": f"{r.load_factor:g}",
        "utilisation": f"{g.utilisation:.3f}",
        "governing": f"segment {g.segment + 1} ({g.name}) {where}",
        "verdict": r.verdict,
        "verdict_line": verdict_line(r),
        "checks": [{"segment": c.segment + 1, "name": c.name, "axis": "tension" if c.kind == "tension" else c.axis,
                    "utilisation": f"{c.utilisation:.3f}", "passed": bool(c.passed), "clause": c.clause,
                    "note": c.note} for c in r.checks],
        "sway": [{"axis": w.axis, "alpha_cr": fmt(w.alpha_cr), "classification": w.classification,
                  "enough": bool(w.axial_check_enough), "reason": w.reason, "source": w.source} for w in r.sway],
        "unchecked": list(r.unchecked),
        "caution": DESIGN_CAUTION,
    }


def outcome_view(ex: Explorer, out: Outcome) -> dict[str, Any]:
    """The page's data for one outcome: figure, load factors, segments, design, warnings, other analyses."""
    res = out.results
    data: dict[str, Any] = {"rev": out.rev, "path": out.path, "server_ms": round(1e3 * out.seconds, 3),
                            "pending": list(out.pending), "error": out.error}
    case = res.case if res is not None else None
    if res is None or case is None:
        data["figure"] = figure_svg(ex.case.planes, {}, _units(ex))
        return data
    data["figure"] = figure_svg(case.planes, {r.axis: r for r in res.buckling}, _units(ex), res.governing_axis)
    data["planes"] = [_plane(r, case) for r in res.buckling]
    data["governing"] = {"axis": res.governing_axis, "load_factor": fmt(res.governing.load_factor)}
    data["has_design"] = "design" in case.extras
    data["design"] = _design(res)
    data["warnings"] = [{"level": n.level, "key": n.key, "text": n.text} for n in run_notices(res)]
    data["others"] = [{"name": a.name, "title": TITLES.get(a.name, a.name), "lines": a.summary(res.extras[a.name],
                                                                                              case.display)}
                      for a in ANALYSES if a.name != "design" and a.name in res.extras]
    return data


def page_state(ex: Explorer, out: Outcome) -> dict[str, Any]:
    """Everything the page needs when it loads: the case, its sliders, their values and the results."""
    d = ex.case.display
    return {
        "case": {"title": ex.case.title, "file": os.path.basename(ex.source) if ex.source else "(text)",
                 "length": d.length, "force": d.force, "planes": [a for a, _ in ex.case.planes]},
        "sliders": [s.as_dict() for s in ex.sliders],
        "values": values_in_display(ex),
        "result": outcome_view(ex, out),
        "cautions": [CAUTION, *LIMITATIONS],
    }
