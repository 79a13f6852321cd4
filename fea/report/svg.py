"""matplotlib figures -> SVG text fit to sit inline in an HTML page."""

from __future__ import annotations

import io
import itertools
import re

__all__ = ["figure_svg", "scope_ids"]

_COUNTER = itertools.count(1)


def scope_ids(svg: str, prefix: str) -> str:
    """Prefix every ``id`` and every reference to it, so several SVGs can share one page."""
    ids = set(re.findall(r'\bid="([^"]+)"', svg))
    if not ids:
        return svg

    def sub_ref(m: re.Match) -> str:
        name = m.group(2)
        return f"{m.group(1)}#{prefix}{name}" if name in ids else m.group(0)

    svg = re.sub(r'\bid="([^"]+)"', lambda m: f'id="{prefix}{m.group(1)}"', svg)
    return re.sub(r'((?:href="|url\())#([^")]+)', sub_ref, svg)


def figure_svg(fig, prefix: str | None = None) -> str:
    """An inline ``<svg>`` element of ``fig``: text drawn as paths (no fonts needed), no metadata, no
    XML prologue, ids made unique on the page, width set by the page."""
    from matplotlib import rc_context

    buf = io.StringIO()
    with rc_context({"svg.fonttype": "path", "svg.hashsalt": "stanchion-report"}):
        fig.savefig(buf, format="svg", metadata={"Date": None, "Creator": None, "Format": None, "Type": None})
    svg = buf.getvalue()
    svg = svg[svg.index("<svg"):]
    svg = re.sub(r"<metadata>.*?</metadata>\s*", "", svg, flags=re.S)
    svg = re.sub(r"<!--.*?-->\s*", "", svg, flags=re.S)
    m = re.match(r'<svg([^>]*?)\swidth="([\d.]+)pt"\s+height="([\d.]+)pt"', svg)
    if m:
        w = float(m.group(2))
        svg = svg.replace(m.group(0), f'<svg{m.group(1)} class="plot" style="max-width:{w:.0f}pt"', 1)
    return scope_ids(svg, prefix or f"f{next(_COUNTER)}-")
