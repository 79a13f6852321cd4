"""Labels beside the column drawing, spread so that none overlap, with leaders where moved."""

from __future__ import annotations

from dataclasses import dataclass
from typing import TYPE_CHECKING

from .style import FS, INK, LABEL_GAP, LEADER_GREY
from .symbols import axes_height_pt, line, pt, pt_to_y
from .text import text_height

if TYPE_CHECKING:
    from matplotlib.axes import Axes

__all__ = ["Label", "spread", "draw_labels"]


@dataclass
class Label:
    """A label and the symbol end it belongs to (heights in points from the axes bottom)."""

    y: float            # desired centre height [pt from the axes bottom]
    text: str
    anchor_x: float     # end of the symbol the label belongs to [pt from the axis]
    anchor_y: float     # height of that end [pt]
    size: float = FS
    style: str = "normal"

    @property
    def height(self) -> float:
        return text_height(self.text, self.size)


def spread(labels: list[Label], lo: float, hi: float) -> list[float]:
    """Label centres moved as little as possible so that none overlap, kept within [lo, hi].

    Overlapping labels are merged into blocks centred on the mean of their wishes
    (repeated until no blocks overlap), then the blocks are pushed inside the bounds.
    """
    if not labels:
        return []
    order = sorted(range(len(labels)), key=lambda i: labels[i].y)
    hs = [labels[i].height + LABEL_GAP for i in order]
    wish = [labels[i].y for i in order]
    blocks = [[k] for k in range(len(order))]   # members (indices into order)

    def place(block):
        total = sum(hs[k] for k in block)
        centre = sum(wish[k] * hs[k] for k in block) / total
        return centre - total / 2, total

    changed = True
    while changed:
        changed = False
        for j in range(len(blocks) - 1):
            b0, t0 = place(blocks[j])
            b1, _ = place(blocks[j + 1])
            if b0 + t0 > b1:
                blocks[j] = blocks[j] + blocks.pop(j + 1)
                changed = True
                break
    starts = []
    for b in blocks:
        start, total = place(b)
        starts.append([start, total])
    # push inside the bounds, bottom-up then top-down
    prev_end = lo
    for s in starts:
        s[0] = max(s[0], prev_end)
        prev_end = s[0] + s[1]
    nxt = hi
    for s in reversed(starts):
        if s[0] + s[1] > nxt:
            s[0] = nxt - s[1]
        nxt = s[0]
    centres = [0.0] * len(labels)
    for b, (start, _t) in zip(blocks, starts):
        y = start
        for k in b:
            centres[order[k]] = y + hs[k] / 2
            y += hs[k]
    return centres


def draw_labels(ax: Axes, labels: list[Label], x_text: float, side: str) -> None:
    """Write labels at ``x_text`` pt, spread vertically, with leaders where moved."""
    if not labels:
        return
    h = axes_height_pt(ax)
    centres = spread(labels, -4.0, h + 6.0)
    ha = "left" if side == "right" else "right"
    for lab, yc in zip(labels, centres):
        tr = pt(ax, 0.0, pt_to_y(ax, 0.0))
        ax.text(x_text, yc, lab.text, transform=tr, ha=ha, va="center", fontsize=lab.size,
                style=lab.style, color="0.25" if lab.style == "italic" else INK, clip_on=False, zorder=9,
                linespacing=1.1)
        if abs(yc - lab.anchor_y) > 1.5:
            gap = 2.0 if side == "right" else -2.0
            line(ax, tr, [lab.anchor_x, x_text - gap], [lab.anchor_y, yc], color=LEADER_GREY, lw=0.5, zorder=5)
