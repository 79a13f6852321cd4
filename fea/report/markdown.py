"""The report document -> Markdown (pipe tables), for pasting into other documents."""

from __future__ import annotations

import re

from .document import NOTE_LABELS, Bullets, Calc, Em, Figure, Heading, Note, Para, Part, Pre, Q, Sub, Sup, T, Table

__all__ = ["render_markdown"]

#: Characters with a meaning in Markdown (or in the HTML a Markdown reader passes through), written so
#: that they show as themselves: a backslash first of all, emphasis, code, tables, links, images, headings,
#: block quotes, lists, entities and tags.
_SPECIAL = str.maketrans({"\\": "\\\\", "|": "\\|", "*": "\\*", "_": "\\_", "`": "\\`", "[": "\\[",
                          "]": "\\]", "!": "\\!", "#": "\\#", "~": "\\~", "<": "&lt;", ">": "&gt;",
                          "&": "&amp;", "\n": " ", "\r": " "})


def _esc(text: str) -> str:
    """``text`` escaped for Markdown inline text (every text from the case passes here)."""
    return text.translate(_SPECIAL)


def inline(parts) -> str:
    out = []
    for p in parts:
        if isinstance(p, (Q, T)):
            out.append(_esc(p.text))
        elif isinstance(p, Em):
            out.append(f"*{_esc(p.text)}*" if p.text.strip() else _esc(p.text))
        elif isinstance(p, Sub):
            out.append(f"<sub>{inline((p.text,))}</sub>")
        elif isinstance(p, Sup):
            out.append(f"<sup>{inline(p.parts)}</sup>")
        else:
            out.append(_esc(str(p)))
    return "".join(out).replace("\n", " ")


def _block(b, figure_files: dict[str, str], counter: list[int], numbers: list[int]) -> str:
    if isinstance(b, Heading):
        numbers[1] += 1
        return f"### {numbers[0]}.{numbers[1]} {inline((b.text,))}" if b.level == 3 else \
            f"#### {inline((b.text,))}"
    if isinstance(b, Para):
        return inline(b.parts)
    if isinstance(b, Bullets):
        return "\n".join(f"- {inline(i)}" for i in b.items)
    if isinstance(b, Note):
        label = NOTE_LABELS.get(b.kind, "Warning.")
        return f"> **{label}** {inline(b.parts)}"
    if isinstance(b, Figure):
        counter[0] += 1
        cap = f"*Figure {counter[0]}.* {inline(b.caption)}"
        if b.name in figure_files:
            return f"![Figure {counter[0]}]({figure_files[b.name]})\n\n{cap}"
        return f"{cap} (drawn in the HTML report)"
    if isinstance(b, Pre):
        return _fenced(b.text.text)
    if isinstance(b, Calc):
        numbers[1] += 1
        head = f"### {numbers[0]}.{numbers[1]} {inline(b.title)}" + (" (governing)" if b.highlight else "")
        lines = []
        for ln in b.lines:
            text = f"{inline(ln.lhs)} = {inline(ln.rhs)}"
            text = f"**{text}**" if ln.key else text
            lines.append(text + (f" {inline(ln.remark)}" if ln.remark else ""))
        out = head + "\n\n" + "  \n".join(lines)
        for n in b.notes:
            out += "\n\n" + inline(n)
        return out
    if isinstance(b, Table):
        num = set(b.numeric)
        strong = set(b.strong)
        head = "| " + " | ".join(inline(h) for h in b.header) + " |"
        rule = "| " + " | ".join("---:" if i in num else "---" for i in range(len(b.header))) + " |"
        rows = ["| " + " | ".join((f"**{inline(c)}**" if r in strong and inline(c).strip() else inline(c)) or " "
                                  for c in row) + " |" for r, row in enumerate(b.rows)]
        text = "\n".join([head, rule, *rows])
        if b.caption:
            text += f"\n\n{inline(b.caption)}"
        return text
    raise TypeError(f"unknown report block {type(b).__name__}")


def _fenced(text: str) -> str:
    """``text`` as a fenced code block whose fence is longer than any run of backticks in it, so that no line
    of the text can close it (CommonMark 4.5); the text is shown as it is."""
    longest = max((len(m) for m in re.findall(r"`+", text)), default=0)
    fence = "`" * max(3, longest + 1)
    return f"{fence}text\n{text.rstrip(chr(10))}\n{fence}"


def render_markdown(title: T, ident: list[tuple], brief: list, caution: T, parts: list[Part],
                    figure_files: dict[str, str] | None = None) -> str:
    """Markdown of the report; figures are linked from ``figure_files`` (name -> relative path) when given."""
    files = figure_files or {}
    out = [f"# {inline((title,))}", "", "*Calculation record, compression member*", ""]
    out += ["| | |", "| --- | --- |"] + [f"| {inline(k)} | {inline(v)} |" for k, v in ident] + [""]
    counter = [0]
    for b in brief:
        out += [_block(b, files, counter, [0, 0]), ""]
    out += [f"> **Caution.** {inline((caution,))}", ""]
    n = 0
    for p in parts:
        appendix = p.key.startswith("appendix")
        n += not appendix
        numbers = [n, 0]
        out += [f"## {_esc(p.title)}" if appendix else f"## {n} {_esc(p.title)}", ""]
        for b in p.blocks:
            out += [_block(b, files, counter, numbers), ""]
    out.append("*End of calculation record.*")
    return "\n".join(out) + "\n"
