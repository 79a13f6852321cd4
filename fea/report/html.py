"""The report document -> one self-contained HTML page (inline SVG, inline styles, no scripts)."""

from __future__ import annotations

import html

from .document import NOTE_LABELS, Bullets, Calc, Em, Figure, Heading, Note, Para, Part, Pre, Q, Sub, Sup, T, Table

__all__ = ["render_html", "CSP"]

#: Content security policy of the page: nothing may be fetched; inline styles and data images only.
CSP = "default-src 'none'; style-src 'unsafe-inline'; img-src data:"

CSS = """
:root { color-scheme: light; }
html { background: #fff; color: #111; }
body { font: 10.5pt/1.42 "Charter", "Georgia", "Liberation Serif", "DejaVu Serif", serif;
       max-width: 182mm; margin: 0 auto; padding: 14mm 12mm 18mm; counter-reset: part figure; }
header.record { border-top: 2.4pt solid #111; border-bottom: 0.8pt solid #111; padding: 6pt 0 8pt;
                margin-bottom: 12pt; }
.kind { font: 600 8.5pt/1.2 "Liberation Sans", "Helvetica", "Arial", sans-serif; letter-spacing: 0.12em;
        text-transform: uppercase; margin: 0 0 4pt; color: #333; }
h1 { font-size: 17pt; line-height: 1.2; font-weight: 700; margin: 0 0 8pt; }
h2 { font-size: 13pt; font-weight: 700; margin: 0 0 8pt; padding-bottom: 2pt; border-bottom: 1pt solid #111;
     counter-increment: part; counter-reset: sub; break-after: avoid; }
h2::before { content: counter(part) "\\2003"; }
h3 { font-size: 11pt; font-weight: 700; margin: 14pt 0 4pt; counter-increment: sub; break-after: avoid; }
h3::before { content: counter(part) "." counter(sub) "\\2003"; }
h4 { font-size: 10.5pt; font-style: italic; font-weight: 400; margin: 10pt 0 3pt; break-after: avoid; }
p { margin: 3pt 0 6pt; hyphens: auto; }
section.part { margin-top: 22pt; }
table { border-collapse: collapse; margin: 4pt 0 10pt; font-size: 9.5pt; line-height: 1.3;
        border-top: 1pt solid #111; border-bottom: 1pt solid #111; break-inside: avoid; }
table.ident { border: none; font-size: 9.5pt; margin: 0; }
table.ident th { font-weight: 400; color: #333; padding: 1pt 14pt 1pt 0; border: none; }
table.ident td { padding: 1pt 0; font-variant-numeric: tabular-nums; word-break: break-all; }
thead th { border-bottom: 0.6pt solid #111; font-weight: 700; vertical-align: bottom; }
th, td { padding: 2.5pt 7pt; text-align: left; vertical-align: top; }
th:first-child, td:first-child { padding-left: 0; }
th:last-child, td:last-child { padding-right: 0; }
td.n, th.n { text-align: right; font-variant-numeric: tabular-nums lining-nums; white-space: nowrap; }
thead th.n { white-space: normal; }
tbody tr + tr td { border-top: 0.3pt solid #bbb; }
div.table { margin: 4pt 0 10pt; break-inside: avoid; }
div.table table { margin: 0; }
td { white-space: nowrap; }
td:last-child, td.w { white-space: normal; }
td.w { min-width: 45mm; }
p.tnote { font-size: 8.5pt; color: #333; margin: 3pt 0 0; max-width: 150mm; }
figure { margin: 8pt 0 12pt; break-inside: avoid; page-break-inside: avoid; counter-increment: figure; }
figure svg { display: block; width: 100%; height: auto; max-height: 215mm; margin: 0 auto; }
figcaption { font-size: 8.5pt; color: #333; margin-top: 3pt; }
figcaption::before { content: "Figure " counter(figure) ". "; font-weight: 700; }
ul { margin: 3pt 0 8pt; padding-left: 16pt; }
li { margin: 2pt 0; }
.note { border: 0.8pt solid #111; border-left-width: 3pt; padding: 5pt 8pt; margin: 8pt 0; break-inside: avoid; }
.note.warning { border-style: dashed; border-left-style: solid; }
.note.check { border-style: dotted; border-left-style: solid; border-left-width: 1.5pt; }
.note .label { font-weight: 700; }
.brief { margin: 10pt 0 0; }
.brief table { margin-bottom: 4pt; }
nav.contents { font-size: 9.5pt; margin: 8pt 0 0; columns: 2; column-gap: 12mm; }
nav.contents ol { margin: 2pt 0; padding-left: 16pt; }
.t.mono, code { font-family: "DejaVu Sans Mono", "Liberation Mono", monospace; font-size: 8.5pt; }
tr.strong td { font-weight: 700; }
sub, sup { font-size: 72%; line-height: 0; }
div.calc { margin: 12pt 0 10pt; break-inside: avoid; page-break-inside: avoid; }
div.calc h3 { margin: 0 0 3pt; }
div.calc.gov { border-left: 2.4pt solid #111; padding: 2pt 0 3pt 8pt; }
div.calc .tag { font: 600 7.5pt/1 "Liberation Sans", "Helvetica", "Arial", sans-serif; letter-spacing: 0.1em;
                text-transform: uppercase; border: 0.8pt solid #111; padding: 1.5pt 3pt 1pt; margin-left: 6pt;
                vertical-align: 1.5pt; }
table.calc { border: none; margin: 0; font-size: 10pt; line-height: 1.45; }
table.calc td { padding: 1pt 0; border: none; white-space: normal; font-variant-numeric: lining-nums; }
table.calc tbody tr + tr td { border-top: none; }
table.calc td.lhs { text-align: right; white-space: nowrap; padding-right: 0; min-width: 13mm; }
table.calc td.eq { padding: 1pt 5pt; }
table.calc tr.key td { font-weight: 700; }
table.calc .rem { font-size: 8.5pt; color: #333; font-style: italic; font-weight: 400; }
p.cnote { font-size: 8.5pt; color: #333; margin: 2pt 0 0; }
pre.verbatim { font: 8pt/1.35 "DejaVu Sans Mono", "Liberation Mono", monospace; white-space: pre-wrap;
               overflow-wrap: anywhere; border-top: 0.6pt solid #111; border-bottom: 0.6pt solid #111;
               padding: 4pt 0; margin: 4pt 0 8pt; }
section.appendix h2 { counter-increment: none; }
section.appendix h2::before { content: none; }
section.appendix h3::before { content: none; }
footer.end { margin-top: 18pt; border-top: 0.8pt solid #111; padding-top: 4pt; font-size: 8.5pt; color: #333; }
@page { margin: 18mm 15mm 17mm 15mm;
        @bottom-right { content: "page " counter(page) " of " counter(pages);
                        font: 8pt "Liberation Sans", "Helvetica", "Arial", sans-serif; color: #333; } }
@media print {
  body { max-width: none; margin: 0; padding: 0; font-size: 10pt; }
  section.part { margin-top: 0; break-before: page; page-break-before: always; }
  section.part.first { break-before: auto; page-break-before: auto; margin-top: 14pt; }
  tr, li { break-inside: avoid; }
  a { color: inherit; text-decoration: none; }
}
"""


def _css_string(text: str) -> str:
    """``text`` as a quoted CSS string that is safe inside ``<style>``: every character other than a letter,
    a digit, a space or plain punctuation is written as a hexadecimal escape, so neither a quote, a
    backslash, a line break nor ``</style>`` can end the string or the style sheet."""
    def esc(c: str) -> str:
        if c.isalnum() and c.isascii() or c in " .,:;-_()#·/'&+=!?%":
            return c
        if c in "\n\r\f":
            return " "
        return f"\\{ord(c):06x}"
    return '"' + "".join(esc(c) for c in text) + '"'


def _attr(text: str) -> str:
    """``text`` escaped for an HTML attribute value in double quotes."""
    return html.escape(str(text), quote=True)


def inline(parts) -> str:
    """Inline parts as HTML; every text is escaped here, whatever its origin."""
    out = []
    for p in parts:
        if isinstance(p, Q):
            out.append(f'<span class="q" data-src="{html.escape(p.src)}" data-u="{html.escape(p.unit)}">'
                       f"{html.escape(p.text)}</span>")
        elif isinstance(p, T):
            cls = "t mono" if p.src in ("json:case_sha256",) else "t"
            out.append(f'<span class="{cls}" data-src="{html.escape(p.src)}">{html.escape(p.text)}</span>')
        elif isinstance(p, Em):
            out.append(f"<i>{html.escape(p.text)}</i>")
        elif isinstance(p, Sub):
            out.append(f"<sub>{inline((p.text,))}</sub>")
        elif isinstance(p, Sup):
            out.append(f"<sup>{inline(p.parts)}</sup>")
        else:
            out.append(html.escape(str(p)))
    return "".join(out)


def _numeric(cell) -> bool:
    """A cell set as a number: quantities and punctuation, no text from results."""
    return not any(isinstance(p, T) and p.text not in ("rigid", "free", "yes", "no") for p in cell)


def _cls(numeric_column: bool, cell) -> str:
    if numeric_column and _numeric(cell):
        return " class=n"
    if sum(len(getattr(p, "text", p)) for p in cell if isinstance(p, (str, T))) > 28:
        return " class=w"  # long text from a result: wraps
    return ""


def _heading_text(h: Heading) -> str:
    return inline((h.text,))


def _block(b) -> str:
    if isinstance(b, Heading):
        return f"<h{b.level}>{_heading_text(b)}</h{b.level}>"
    if isinstance(b, Para):
        return f"<p>{inline(b.parts)}</p>"
    if isinstance(b, Bullets):
        return "<ul>" + "".join(f"<li>{inline(i)}</li>" for i in b.items) + "</ul>"
    if isinstance(b, Note):
        label = NOTE_LABELS.get(b.kind, "Warning.")
        return f'<div class="note {_attr(b.kind)}"><span class="label">{label}</span> {inline(b.parts)}</div>'
    if isinstance(b, Figure):
        return f"<figure>{b.svg}<figcaption>{inline(b.caption)}</figcaption></figure>"
    if isinstance(b, Table):
        num = set(b.numeric)
        head = "".join(f'<th{" class=n" if i in num else ""}>{inline(h)}</th>' for i, h in enumerate(b.header))
        strong = set(b.strong)
        body = "".join(("<tr class=strong>" if r in strong else "<tr>")
                       + "".join(f"<td{_cls(i in num, c)}>{inline(c)}</td>" for i, c in enumerate(row))
                       + "</tr>" for r, row in enumerate(b.rows))
        note = f'<p class="tnote">{inline(b.caption)}</p>' if b.caption else ""
        return f'<div class="table"><table><thead><tr>{head}</tr></thead><tbody>{body}</tbody></table>{note}</div>'
    if isinstance(b, Pre):
        return f'<pre class="verbatim">{inline((b.text,))}</pre>'
    if isinstance(b, Calc):
        cls = "calc gov" if b.highlight else "calc"
        tag = ' <span class="tag">governing</span>' if b.highlight else ""
        lines = "".join(
            f'<tr{" class=key" if ln.key else ""}><td class=lhs>{inline(ln.lhs)}</td><td class=eq>=</td>'
            f'<td class=rhs>{inline(ln.rhs)}'
            + (f' <span class="rem">{inline(ln.remark)}</span>' if ln.remark else "") + "</td></tr>"
            for ln in b.lines)
        notes = "".join(f'<p class="cnote">{inline(n)}</p>' for n in b.notes)
        return (f'<div class="{cls}"><h3>{inline(b.title)}{tag}</h3><table class="calc"><tbody>{lines}'
                f"</tbody></table>{notes}</div>")
    raise TypeError(f"unknown report block {type(b).__name__}")


def render_html(title: T, ident: list[tuple], brief: list, caution: T, parts: list[Part], running: str) -> str:
    """The whole page.

    Parameters
    ----------
    title : the case title
    ident : (label, value) rows identifying the record (file, hash, program, date, units)
    brief : blocks of the summary under the title
    caution : the caution every result carries
    parts : the numbered parts; each starts a new printed page
    running : text of the printed page footer (case title and short hash)
    """
    ident_rows = "".join(f"<tr><th>{inline(k)}</th><td>{inline(v)}</td></tr>" for k, v in ident)
    toc = "".join(f'<li><a href="#{_attr(p.key)}">{html.escape(p.title)}</a></li>' for p in parts)
    sections = []
    for n, p in enumerate(parts):
        cls = "part first" if n == 0 else "part appendix" if p.key.startswith("appendix") else "part"
        body = "\n".join(_block(b) for b in p.blocks)
        sections.append(f'<section class="{cls}" id="{_attr(p.key)}">\n<h2>{html.escape(p.title)}</h2>\n'
                        f'{body}\n</section>')
    return f"""<!DOCTYPE html>
<html lang="en">
<head>
<meta charset="utf-8">
<meta http-equiv="Content-Security-Policy" content="{CSP}">
<meta name="viewport" content="width=device-width, initial-scale=1">
<title>{html.escape(title.text)} — calculation record</title>
<style>{CSS}@page {{ @bottom-left {{ content: {_css_string(running)};
        font: 8pt "Liberation Sans", "Helvetica", "Arial", sans-serif; color: #333; }} }}
</style>
</head>
<body>
<header class="record">
<p class="kind">Calculation record · compression member</p>
<h1>{inline((title,))}</h1>
<table class="ident"><tbody>{ident_rows}</tbody></table>
</header>
<div class="brief">
{"".join(_block(b) for b in brief)}
</div>
<div class="note caution"><span class="label">Caution.</span> {inline((caution,))}</div>
<nav class="contents"><ol>{toc}</ol></nav>
{chr(10).join(sections)}
<footer class="end">End of calculation record.</footer>
</body>
</html>
"""
