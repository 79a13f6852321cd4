"""Calculation reports: one self-contained HTML page, or Markdown, from the results of a run.

The report consumes the :class:`~fea.pipeline.CaseResults` of a run and the JSON
result dict of the same run (:func:`fea.io.export.result_dict`); it never
recomputes physics.  Every number on the page carries its source
(``data-src``) and display unit (``data-u``), see :mod:`fea.report.document`.

Public API
----------
:func:`build_report`
    HTML text: inline SVG figures, inline styles, no scripts, nothing fetched,
    a print stylesheet for A4 and US letter.
:func:`build_markdown`
    The same content as Markdown.
:func:`report_figures`
    The default figures (column sketch, mode shapes) as SVG text.
:data:`PART_FIGURES`
    Figures for optional result parts, registered by the modules that own them.
"""

from __future__ import annotations

import datetime
from typing import Any, Iterable

from ..results import CaseResults
from .content import PART_FIGURES, Units, header_rows, report_parts
from .document import Para, Part, T, Table, q

__all__ = ["build_report", "build_markdown", "report_figures", "PART_FIGURES"]


def report_figures(res: CaseResults, json_dict: dict | None = None) -> dict[str, str]:
    """The default figures as inline SVG text: ``"sketch"`` (the column as analysed) and ``"modes"``
    (mode shapes of every plane, when :func:`fea.plot.plot_planes` is available)."""
    from .sketch import column_sketch
    from .svg import figure_svg

    case = res.case
    d = case.display
    out = {"sketch": column_sketch(case, Units.from_display(d))}
    try:
        from ..plot import plot_planes
    except ImportError:  # pragma: no cover - the plotting package is part of the tool
        return out
    planes = [(r.axis, case.column(r.axis), r) for r in res.buckling]
    fig = plot_planes(planes, n_modes=min(3, max(len(r.load_factors) for r in res.buckling)),
                      length_unit=(d.length, d.length_si), force_unit=(d.force, d.force_si), title=case.title)
    out["modes"] = figure_svg(fig, "modes-")
    return out


def _prepare(res: CaseResults, json_dict: dict | None, figures: dict | None, warnings: Iterable[str],
             date: str | None) -> tuple[T, list, list, T, list[Part], str]:
    from ..io.export import result_dict

    data = json_dict if json_dict is not None else result_dict(res)
    if data.get("case_sha256") != res.case.sha256:
        raise ValueError("`json_dict` is not the result of this case (its case_sha256 differs)")
    figs: dict[str, Any] = report_figures(res, data) if figures is None else dict(figures)
    from .svg import figure_svg

    figs = {k: (v if isinstance(v, str) else figure_svg(v, f"{k}-")) for k, v in figs.items()}
    u = Units.from_display(res.case.display)
    all_warnings = [*warnings]
    for r in res.buckling:
        all_warnings.extend(w for w in r.warnings if w not in all_warnings)
    mode_figs = []
    if "modes" in figs:
        mode_figs.append((figs["modes"], ("Buckling modes of each bending plane beside a model sketch; modes "
                                          "scaled to a largest lateral displacement of one.",)))
    parts = report_parts(res, data, u, figs.get("sketch"), mode_figs, all_warnings, figures=figures is None or bool(figs))
    date = date or datetime.date.today().isoformat()
    title = T(data.get("title") or "(untitled case)", "json:title")
    ident = header_rows(data, res.case, date)
    rows = []
    for i, b in enumerate(data["buckling"]):
        gov = b["axis"] == data["governing_axis"]
        rows.append(((T(b["axis"], f"json:buckling/{i}/axis"),), (q(b["load_factors"][0],
                     f"json:buckling/{i}/load_factors/0"),), ("governs" if gov else "",)))
    brief: list = [Table((("Plane",), ("Lowest load factor λ",), ("",)), tuple(rows), numeric=(1,),
                         caption=("Elastic critical load factors; the part on buckling gives the effective-length "
                                  "factors.",))]
    extra = [p.title.lower() for p in parts if p.key not in ("inputs", "method", "buckling", "closing")]
    if extra:
        brief.append(Para(("This record also contains: " + ", ".join(extra) + ".",)))
    caution = T(data["cautions"][0], "json:cautions/0")
    running = f"{title.text} · case sha256 {data['case_sha256'][:12]}"
    return title, ident, brief, caution, parts, running


def build_report(res: CaseResults, json_dict: dict | None = None, figures: dict | None = None, *,
                 warnings: Iterable[str] = (), date: str | None = None) -> str:
    """The calculation record of a run as one self-contained HTML page.

    Parameters
    ----------
    res : the results of the run
    json_dict : the JSON result dict of the same run (made from ``res`` when None)
    figures : name -> SVG text or matplotlib Figure; ``"sketch"`` and ``"modes"`` are placed in the
        report.  None draws the defaults (:func:`report_figures`); ``{}`` gives a report without figures.
    warnings : warnings raised while the case was run (shown verbatim)
    date : the date printed on the record (ISO; today when None)

    Returns
    -------
    str
        HTML text.

    Raises
    ------
    ValueError
        ``json_dict`` belongs to another case file.
    """
    from .html import render_html

    title, ident, brief, caution, parts, running = _prepare(res, json_dict, figures, warnings, date)
    return render_html(title, ident, brief, caution, parts, running)


def build_markdown(res: CaseResults, json_dict: dict | None = None, figures: dict | None = None, *,
                   warnings: Iterable[str] = (), date: str | None = None,
                   figure_files: dict[str, str] | None = None) -> str:
    """The same record as Markdown; ``figure_files`` maps figure names (``"sketch"``, ``"modes"``, ...)
    to the relative paths of image files written beside it (figures without a file are named only)."""
    from .markdown import render_markdown

    title, ident, brief, caution, parts, _ = _prepare(res, json_dict, figures, warnings, date)
    return render_markdown(title, ident, brief, caution, parts, figure_files)
