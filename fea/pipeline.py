"""The analyses of a case, in one visible list, and running them.

``stanchion check`` and ``stanchion report`` run every entry of :data:`ANALYSES`
in order.  Each entry names everything of one analysis:

``tables``   the case-file tables it reads, each with its parser (table, document) -> spec;
``run``      (case, buckling results) -> its result, or None when the case does not ask for it (with
             ``uses_earlier``: a third argument, the results of the analyses before it by name);
``to_json``  result -> its part of the JSON result (SI), under the analysis's name;
``summary``  (result, display units) -> lines of the terminal summary;
``figures``  (result, display units, case) -> named figures drawn beside the mode shapes by ``--plot``;
``report``   its part of the calculation record (title, blocks, figures; :class:`fea.report.OptionalPart`).

To add an analysis,
write its parser, its engine and its outputs in their layers and add one
:class:`Analysis` here; nothing registers itself on import.
"""

from __future__ import annotations

from dataclasses import dataclass, replace
from typing import Any, Callable, Mapping

from .batch.reliability_input import parse_reliability
from .io.case import TableParser
from .io.case import load_case as _load_case
from .io.case import parse_case as _parse_case
from .io.design_input import parse_design
from .io.design_output import design_json, design_summary
from .io.export import result_dict
from .io.fixity_output import fixity_json, fixity_summary
from .io.imperfect_input import parse_imperfection, parse_lateral
from .io.imperfect_output import imperfect_json, imperfect_summary
from .io.record_input import parse_record
from .io.spatial_output import spatial_json, spatial_summary
from .io.study_input import parse_study
from .io.summary import summary_lines
from .model.case import Case
from .report.parts import DESIGN_PART, FIXITY_PART, IMPERFECT_PART, SPATIAL_PART, OptionalPart
from .results import BucklingResult, CaseResults
from .solve.eigen import buckling

__all__ = ["Analysis", "ANALYSES", "CASE_TABLES", "REPORT_PARTS", "load_case", "parse_case", "run_case", "run_analyses",
           "rebuild_case", "result_json", "summary", "identical_planes"]


@dataclass(frozen=True)
class Analysis:
    """One analysis of a case: its case-file tables, its engine and its outputs."""

    name: str
    tables: Mapping[str, TableParser]
    run: Callable[[Case, tuple[BucklingResult, ...]], Any]
    to_json: Callable[[Any], Any]
    summary: Callable[[Any, Any], list[str]]
    figures: Callable[[Any, Any, Case], dict] | None = None
    report: OptionalPart | None = None
    #: run takes a third argument: the results of the analyses before it (name -> result)
    uses_earlier: bool = False


def _run_fixity(case: Case, buckling_results: tuple[BucklingResult, ...]):
    from .solve.fixity import case_fixity

    return case_fixity(case.planes, buckling_results) or None


def _run_spatial(case: Case, buckling_results: tuple[BucklingResult, ...]):
    from .io.case import spatial_inputs
    from .solve.spatial_case import run_spatial  # the kernel loads only for a case with sections in two planes

    if len(case.planes) != 2 or any(s.shape is None for s in case.segments):
        return None
    return run_spatial(case, buckling_results, spatial_inputs(case))


def _spatial_figures(result, display, case: Case) -> dict:
    """The lowest modes of the thin-walled analysis: lateral displacements and twist along the height."""
    from .plot.spatial import plot_spatial_modes

    return {"spatial": plot_spatial_modes(result, length_unit=(display.length, display.length_si), title=case.title)}


def _run_imperfect(case: Case, buckling_results: tuple[BucklingResult, ...]):
    from .solve.imperfect_case import run_imperfect  # the solvers load only when a case declares an imperfection

    return run_imperfect(case, buckling_results) or None


def _run_design(case: Case, buckling_results: tuple[BucklingResult, ...], earlier: Mapping[str, Any]):
    from .design.member import design_of_case

    return design_of_case(case, buckling_results, spatial=earlier.get("spatial"))


def _imperfect_figures(result, display, case: Case) -> dict:
    """Load-deflection path, moment and stress diagrams, and the comparison chart of every plane."""
    from .plot.imperfect import plot_comparison, plot_diagrams, plot_path

    length = (display.length, display.length_si)
    mm = ("mm", 1e-3) if display.length_si >= 1e-3 else length
    out = {}
    for axis, r in result.items():
        tag = axis or "plane"
        out[f"path-{tag}"] = plot_path(r, length_unit=mm)
        out[f"diagrams-{tag}"] = plot_diagrams(r, length_unit=length, force_unit=(display.force, display.force_si),
                                               stress_unit=(display.stress, display.stress_si), fy=case.fy)
        out[f"comparison-{tag}"] = plot_comparison(r)
    return out


def _design_figures(result, display, case: Case) -> dict:
    """The utilisation chart of the design check, and the moment diagrams of its member checks with bending."""
    from .io.design_output import moment_unit
    from .plot.design import plot_utilisation

    out = {"utilisation": plot_utilisation(result).figure}
    if result.bending is not None and result.bending.actions:
        from .plot.moments import plot_moments

        bounds = tuple(case.planes[0][1].joints[1:-1])
        out["moments"] = plot_moments(result.bending, length_unit=(display.length, display.length_si),
                                      moment_unit=moment_unit(display), title=case.title, segment_bounds=bounds)
    return out


#: The analyses ``check`` and ``report`` run after the elastic buckling of every plane, in this order.
ANALYSES: tuple[Analysis, ...] = (
    Analysis("fixity", {}, _run_fixity, fixity_json, fixity_summary, None, FIXITY_PART),
    Analysis("spatial", {}, _run_spatial, spatial_json, spatial_summary, _spatial_figures, SPATIAL_PART),
    Analysis("imperfect", {"imperfection": parse_imperfection, "lateral": parse_lateral}, _run_imperfect,
             imperfect_json, imperfect_summary, _imperfect_figures, IMPERFECT_PART),
    Analysis("design", {"design": parse_design}, _run_design, design_json, design_summary, _design_figures,
             DESIGN_PART, uses_earlier=True),
)

#: The report part of every analysis, in report order (passed to :func:`fea.report.build_report`).
REPORT_PARTS: Mapping[str, OptionalPart] = {a.name: a.report for a in ANALYSES if a.report is not None}

#: Every optional table a case file may hold: the analyses', the restraint studies' ``[study]`` and the
#: report's identification fields ``[record]``.
CASE_TABLES: Mapping[str, TableParser] = {
    **{name: parser for a in ANALYSES for name, parser in a.tables.items()},
    "study": parse_study,
    "record": parse_record,
    "reliability": parse_reliability,  # read by `stanchion reliability`; parsed (checked) and ignored by check
}


def load_case(path) -> Case:
    """Read and validate a case file with every table of :data:`CASE_TABLES`."""
    return _load_case(path, tables=CASE_TABLES)


def parse_case(data: bytes | str, source: str = "") -> Case:
    """Parse case-file text with every table of :data:`CASE_TABLES`."""
    return _parse_case(data, source=source, tables=CASE_TABLES)


def run_case(case: Case, n_modes: int | None = None, skip: tuple[str, ...] = ()) -> CaseResults:
    """Buckling of every plane of ``case``, then every analysis of :data:`ANALYSES` it declares."""
    modes = n_modes or case.n_modes
    same = identical_planes(case)
    results: tuple[BucklingResult, ...]
    if same:
        # equal properties about both axes and the same supports and loads (a tube, a round, a square): one solve,
        # reused for the second plane, so both planes show the same numbers and the first plane governs
        first = buckling(case.planes[0][1], n_modes=modes, tol=case.tolerance, axis=same[0])
        results = (first, replace(first, axis=same[1], message=f"{first.message}; {_identical_note(same)}"))
    else:
        results = tuple(buckling(col, n_modes=modes, tol=case.tolerance, axis=axis) for axis, col in case.planes)
    return run_analyses(case, results, skip)


def run_analyses(case: Case, results: tuple[BucklingResult, ...], skip: tuple[str, ...] = ()) -> CaseResults:
    """Every analysis of :data:`ANALYSES` not named in ``skip``, in order, on given buckling ``results``
    (one per plane): what :func:`run_case` does after its buckling solutions (also used by the explorer)."""
    gov = min(results, key=lambda r: r.load_factor).axis
    extras: dict[str, Any] = {}
    for analysis in ANALYSES:
        if analysis.name in skip:
            continue
        out = analysis.run(case, results, extras) if analysis.uses_earlier else analysis.run(case, results)
        if out is not None:
            extras[analysis.name] = out
    return CaseResults(case=case, buckling=results, governing_axis=gov, extras=extras)


def rebuild_case(document: dict) -> Case:
    """A case document (plain data, e.g. a parsed case's ``document`` with changed values) -> the parsed case,
    with every table of :data:`CASE_TABLES` (module-level, so that worker processes can receive it)."""
    from .io.case import parse_document

    return parse_document(document, tables=CASE_TABLES)


def analysis(name: str) -> Analysis:
    """The entry of :data:`ANALYSES` called ``name``."""
    for a in ANALYSES:
        if a.name == name:
            return a
    raise KeyError(name)


def identical_planes(case: Case) -> tuple[str, str] | None:
    """The two planes' names when their columns are the same (equal properties about both axes, the same
    restraints, loads and foundations): they are then solved once; None otherwise."""
    if len(case.planes) != 2 or case.planes[0][1] != case.planes[1][1]:
        return None
    return case.planes[0][0], case.planes[1][0]


def _identical_note(same: tuple[str, str]) -> str:
    return f"both planes identical: analysed once ({same[1]} axis identical to {same[0]}: solved once)"


def result_json(res: CaseResults) -> dict:
    """The JSON result of a run (SI): the buckling of every plane and each analysis's part.

    ``identical_planes`` (only when the two planes are the same column): the note that they were solved once.
    """
    out = result_dict(res, {a.name: a.to_json for a in ANALYSES})
    same = identical_planes(res.case)
    if same is None:
        return out
    keys = list(out)
    at = keys.index("governing_load_factor") + 1 if "governing_load_factor" in keys else len(keys)
    items = list(out.items())
    return dict(items[:at] + [("identical_planes", {"axes": list(same), "note": _identical_note(same)})] + items[at:])


def summary(res: CaseResults, display=None) -> list[str]:
    """The lines of the terminal summary of a run, in ``display`` units (default: the case's); a note after the
    governing plane when both planes are the same column (solved once)."""
    lines = summary_lines(res, display, {a.name: a.summary for a in ANALYSES})
    same = identical_planes(res.case)
    if same is None:
        return lines
    at = next((i + 1 for i, line in enumerate(lines) if line.startswith("Governing:")), len(lines))
    return lines[:at] + [f"Note: {_identical_note(same)}; the {same[1]} axis repeats the {same[0]} axis's "
                         "results"] + lines[at:]
