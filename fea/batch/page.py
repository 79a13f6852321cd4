"""The summary page of a batch: one self-contained HTML page in the look of the calculation record.

The page uses the report's style sheet and content security policy (:mod:`fea.report.html`): no scripts,
nothing fetched.  It lists the counts of outcomes, every row (mark, combination, governing plane, lowest
load factor, K of each segment, verdict, utilisation, warnings or error) with a link to the row's
calculation record when the reports were written, and the load combinations.  Every text is escaped.
"""

from __future__ import annotations

import html
import math
from typing import Any, Sequence

from ..cautions import CAUTION
from ..report.html import CSP, CSS
from .output import ATTENTION, counts

__all__ = ["summary_page"]


def _e(x: Any) -> str:
    return html.escape(str(x), quote=True)


def _n(x: Any, fmt: str = ".4g") -> str:
    if x is None or (isinstance(x, float) and not math.isfinite(x)):
        return "—"
    return format(x, fmt).replace("-", "\u2212")


def _k_text(ks: dict) -> str:
    parts = []
    for axis, values in ks.items():
        shown = " · ".join(_n(v, ".3g") for v in values)
        parts.append(f"{_e(axis)}: {shown}")
    return "<br>".join(parts) or "—"


def _table(header: Sequence[str], rows: Sequence[Sequence[str]], numeric: set[int],
           strong: set[int] | frozenset[int] = frozenset(), note: str = "") -> str:
    head = "".join(f'<th{" class=n" if i in numeric else ""}>{h}</th>' for i, h in enumerate(header))
    body = "".join(("<tr class=strong>" if r in strong else "<tr>")
                   + "".join(f'<td{" class=n" if i in numeric else ""}>{c}</td>' for i, c in enumerate(row))
                   + "</tr>" for r, row in enumerate(rows))
    tn = f'<p class="tnote">{note}</p>' if note else ""
    return f'<div class="table"><table><thead><tr>{head}</tr></thead><tbody>{body}</tbody></table>{tn}</div>'


def summary_page(meta: dict, rows: Sequence[dict], reports: dict[str, str] | None = None,
                 combinations: Sequence[Any] = (), groups: dict | None = None) -> str:
    """The page.  ``meta``: title, schedule, schedule_sha256, tool version, date, execution; ``rows``: the
    batch table's rows (with ``name``); ``reports``: row name -> relative link of its record."""
    reports = reports or {}
    title = meta.get("title") or meta.get("schedule", "batch")
    ident = [("Schedule file", meta.get("schedule", "")), ("Hash of the schedule file, SHA-256",
                                                            meta.get("schedule_sha256", "")),
             ("Program", f"stanchion {meta.get('version', '')}"), ("Date", meta.get("date", "")),
             ("Runs", f"{len(rows)} ({meta.get('n_rows', '?')} rows; "
                      f"{meta.get('n_combinations', 0) or 'no'} load combinations)"),
             ("Run on", meta.get("execution", ""))]
    ident_html = "".join(f"<tr><th>{_e(k)}</th><td>{_e(v)}</td></tr>" for k, v in ident)
    c = counts(rows)
    count_rows = [[_e(k), str(n)] for k, n in c.items() if n]
    words = ("<p>Outcome of each run: <i>passes</i>, the design check passed; <i>buckling only</i>, the case has "
             "no design check (its buckling was analysed, nothing was verified); <i>fails</i>; <i>not "
             "verified</i>, the design check could not verify every part; <i>warning</i>, a run warning of level "
             "“warning” (for example a plane buckles under its loads); <i>error</i>, the run could not be made "
             "(its message is shown). Load factors multiply the variable loads of the run; K is the "
             "effective-length factor of each segment from the base up, per bending plane.</p>")
    body_rows, strong = [], set()
    for i, r in enumerate(rows):
        link = reports.get(r.get("name", ""))
        mark = f'<a href="{_e(link)}">{_e(r["mark"])}</a>' if link else _e(r["mark"])
        note = _e(r["error"]) if r["error"] else _e(", ".join(r["warnings"])) or "—"
        body_rows.append([mark, _e(r["combination"] or "as given"), _e(r["outcome"]),
                          _e(r["governing_axis"] or "—"), _n(r["lowest_load_factor"]), _k_text(r.get("K") or {}),
                          _e(r["verdict"] or "—"), _n(r["utilisation"], ".3f"), note])
        if r["outcome"] in ATTENTION:
            strong.add(i)
    link_note = "Each mark links to its calculation record." if reports else \
        "Calculation records of the rows: run the batch with --reports."
    rows_html = _table(["Mark", "Combination", "Outcome", "Governing plane", "Lowest load factor",
                        "K per segment", "Verdict", "Utilisation", "Warnings or error"], body_rows, {4, 7}, strong,
                       "Rows that fail, are not verified, carry a warning or could not run are set in bold. "
                       + link_note)
    combo_html = ""
    if combinations:
        crow = [[_e(cmb.name), _e(", ".join(f"{f:g} {g}" for g, f in cmb.factors.items())), _e(cmb.note or "")]
                for cmb in combinations]
        grow = [[_e(g), _e(", ".join(k.text for k in keys))] for g, keys in (groups or {}).items()]
        combo_html = ('<section class="part" id="combinations"><h2>Load combinations</h2>'
                      "<p>Each combination is the sum of its load groups times their factors; a group it does not "
                      "name has factor 0. Permanent loads stay permanent (held while the load factor scales the "
                      "variable ones).</p>"
                      + _table(["Combination", "Factors", "Note"], crow, set())
                      + _table(["Group", "Load tables and values of the case"], grow, set()) + "</section>")
    return f"""<!DOCTYPE html>
<html lang="en">
<head>
<meta charset="utf-8">
<meta http-equiv="Content-Security-Policy" content="{CSP}">
<meta name="viewport" content="width=device-width, initial-scale=1">
<title>{_e(title)} — batch summary</title>
<style>{CSS}
body {{ max-width: 260mm; }}
</style>
</head>
<body>
<header class="record">
<p class="kind">Batch summary · column schedule</p>
<h1>{_e(title)}</h1>
<table class="ident"><tbody>{ident_html}</tbody></table>
</header>
<div class="note caution"><span class="label">Caution.</span> {_e(CAUTION)}</div>
<section class="part first" id="outcome"><h2>Outcome</h2>
{_table(["Outcome", "Runs"], count_rows, {1})}
{words}
</section>
<section class="part" id="rows"><h2>Runs</h2>
{rows_html}
</section>
{combo_html}
<footer class="end">End of batch summary.</footer>
</body>
</html>
"""
