"""Calculation reports: one self-contained HTML page, or Markdown, from the results of a run.

The report reads the result objects of a run (:class:`~fea.results.CaseResults`:
the buckling of every plane and the optional analyses' results) and the parsed
case; it never recomputes physics.  Every number on the page carries its source
(``data-src``: the path of the same value in the JSON result, or in the case)
and its display unit (``data-u``), see :mod:`fea.report.document`.

Layout
------
:mod:`~fea.report.front` (title, identification, brief), :mod:`~fea.report.inputs`,
:mod:`~fea.report.method`, :mod:`~fea.report.buckling`, the optional analyses
(:mod:`~fea.report.imperfect`, :mod:`~fea.report.design` with
:mod:`~fea.report.design_calc`), :mod:`~fea.report.closing`; :mod:`~fea.report.parts`
puts them in order; :mod:`~fea.report.blocks` holds the shared cells and tables;
:mod:`~fea.report.html` and :mod:`~fea.report.markdown` render the document tree.

Public API
----------
:func:`build_report`
    HTML text: inline SVG figures, inline styles, no scripts, nothing fetched,
    a print stylesheet for A4 and US letter.
:func:`build_markdown`
    The same content as Markdown.
:func:`report_figures`
    The default figures (column sketch, mode shapes) as SVG text.
:class:`OptionalPart`
    The part of an optional analysis (title, blocks, figures); :data:`fea.pipeline.ANALYSES` lists them.
"""

from __future__ import annotations

from typing import Any, Iterable, Mapping

from ..results import CaseResults
from .document import Para, Part, Pre, T
from .front import brief_blocks, caution, identification_rows, record_fields, report_date, running_head, title_of
from .parts import OptionalPart, report_parts

__all__ = ["build_report", "build_markdown", "report_figures", "OptionalPart"]

_MODES_CAPTION = ("Buckling modes of each bending plane beside a model sketch; modes scaled to a largest lateral "
                  "displacement of one.",)


def report_figures(res: CaseResults, json_dict: dict | None = None) -> dict[str, str]:
    """The default figures as inline SVG text: ``"sketch"`` (the column as analysed) and ``"modes"``
    (mode shapes of every plane, when :func:`fea.plot.plot_planes` is available).  ``json_dict`` is not
    used (kept for callers that pass the JSON result)."""
    from .sketch import column_sketch
    from .svg import figure_svg

    case = res.case
    d = case.display
    out = {"sketch": column_sketch(case, d)}
    try:
        from ..plot import plot_planes
    except ImportError:  # pragma: no cover - the plotting package is part of the tool
        return out
    planes = [(r.axis, case.column(r.axis), r) for r in res.buckling]
    fig = plot_planes(planes, n_modes=min(3, max(len(r.load_factors) for r in res.buckling)),
                      length_unit=(d.length, d.length_si), force_unit=(d.force, d.force_si), title=case.title)
    out["modes"] = figure_svg(fig, "modes-")
    return out


def _appendix(res: CaseResults, case_text: str) -> Part:
    """The case file itself, verbatim, as the last part of the record."""
    import hashlib

    if hashlib.sha256(case_text.encode("utf-8")).hexdigest() != res.case.sha256 and \
            hashlib.sha256(("\ufeff" + case_text).encode("utf-8")).hexdigest() != res.case.sha256:
        raise ValueError("`case_text` is not the text of this case (its SHA-256 differs from the case's)")
    return Part("appendix-case", "Appendix: the case file", [
        Para(("The case file as it was read, line for line; its SHA-256 hash is the one given at the head of the "
              "record.",)),
        Pre(T(case_text, "file:case"))])


def _prepare(res: CaseResults, json_dict: dict | None, figures: dict | None, warnings: Iterable[str],
             date: str | None, optional: Mapping[str, OptionalPart], record: Mapping[str, str] | None = None,
             case_text: str | None = None) -> tuple[T, list, list, T, list[Part], str]:
    if json_dict is not None and json_dict.get("case_sha256") != res.case.sha256:
        raise ValueError("`json_dict` is not the result of this case (its case_sha256 differs)")
    from .svg import figure_svg

    figs: dict[str, Any] = report_figures(res) if figures is None else dict(figures)
    figs = {k: (v if isinstance(v, str) else figure_svg(v, f"{k}-")) for k, v in figs.items()}
    all_warnings = list(dict.fromkeys(warnings))  # raised by libraries during the run; the keyed ones come from res
    mode_figs = [(figs["modes"], _MODES_CAPTION)] if "modes" in figs else []
    parts = report_parts(res, res.case.display, figs.get("sketch"), mode_figs, all_warnings, optional,
                         figures=figures is None or bool(figs))
    ident = identification_rows(res, report_date(res, date), record_fields(res, record))
    brief = brief_blocks(res, parts)
    if case_text is not None:
        parts.append(_appendix(res, case_text))
    return title_of(res), ident, brief, caution(), parts, running_head(res)


def build_report(res: CaseResults, json_dict: dict | None = None, figures: dict | None = None, *,
                 parts: Mapping[str, OptionalPart], warnings: Iterable[str] = (), date: str | None = None,
                 record: Mapping[str, str] | None = None, case_text: str | None = None) -> str:
    """The calculation record of a run as one self-contained HTML page.

    Parameters
    ----------
    res : the results of the run; every value shown is read from them (and from ``res.case``)
    json_dict : optional: the JSON result of the same run, only checked to belong to this case (the sources
        printed in the report are paths into it)
    figures : name -> SVG text or matplotlib Figure; ``"sketch"`` and ``"modes"`` are placed in the
        report.  None draws the defaults (:func:`report_figures`); ``{}`` gives a report without figures.
    warnings : warnings raised while the case was run (shown verbatim)
    parts : the report part of each optional analysis, by name, in report order (``fea.pipeline.REPORT_PARTS``)
    date : the date printed on the record (ISO); when None, the case's ``[record] date``, else today
    record : identification fields (``project``, ``job``, ``prepared_by``, ``checked_by``, ``revision``) that
        override the case's ``[record]`` table (the command's options)
    case_text : the text of the case file, printed verbatim in an appendix (its SHA-256 must be the case's);
        None leaves the appendix out

    Returns
    -------
    str
        HTML text.

    Raises
    ------
    ValueError
        ``json_dict`` or ``case_text`` belongs to another case file, the run holds an analysis the report has
        no part for, or ``record`` names an unknown field.
    """
    from .html import render_html

    title, ident, brief, caution_text, blocks, running = _prepare(res, json_dict, figures, warnings, date, parts,
                                                                  record, case_text)
    return render_html(title, ident, brief, caution_text, blocks, running)


def build_markdown(res: CaseResults, json_dict: dict | None = None, figures: dict | None = None, *,
                   parts: Mapping[str, OptionalPart], warnings: Iterable[str] = (), date: str | None = None,
                   figure_files: dict[str, str] | None = None, record: Mapping[str, str] | None = None,
                   case_text: str | None = None) -> str:
    """The same record as Markdown; ``figure_files`` maps figure names (``"sketch"``, ``"modes"``, ...)
    to the relative paths of image files written beside it (figures without a file are named only); the other
    parameters are those of :func:`build_report`."""
    from .markdown import render_markdown

    title, ident, brief, caution_text, blocks, _ = _prepare(res, json_dict, figures, warnings, date, parts,
                                                            record, case_text)
    return render_markdown(title, ident, brief, caution_text, blocks, figure_files)
