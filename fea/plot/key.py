"""The key at the foot of a column figure: the symbols that appear in it, each with a short name.

The full meaning of each symbol is written in ``docs/symbols.md``.
"""

from __future__ import annotations

import math
from typing import TYPE_CHECKING

from ..model import Column
from . import symbols as sym
from .column import ground_level, merged_restraints, point_load_groups
from .style import AXIS_GREY, BAND_EDGE, BAND_FILL, BAND_MAX, FS_TICK, INK, KEY_ENTRY_GAP, KEY_ROW, KEY_SYMBOL_W
from .text import inertia_texts, text_width

if TYPE_CHECKING:
    from matplotlib.axes import Axes
    from matplotlib.figure import Figure

__all__ = ["KEY_ENTRIES", "symbols_used", "key_rows", "draw_key"]

#: Every key entry in the order of the key: (symbol name, short text).  Every symbol and every
#: abbreviation a figure shows is explained here (λ, I/Imax, perm., q, h, N); in full in docs/symbols.md.
KEY_ENTRIES = (
    ("mode", "mode shape at load factor λ"),
    ("axis", "undeformed axis"),
    ("band", "band width ∝ √I"),
    ("inertia", "I of the segment / largest I"),
    ("joint", "joint / end"),
    ("station", "station"),
    ("rigid_lateral", "rigid lateral support"),
    ("lateral_spring", "lateral spring"),
    ("rigid_rotation", "rigid rotational restraint"),
    ("rotational_spring", "rotational spring"),
    ("foundation", "foundation, width ∝ modulus"),
    ("ground", "ground line"),
    ("load_variable", "variable load, × load factor"),
    ("load_permanent", "permanent load (perm.)"),
    ("load_up", "negative load, acting upward"),
    ("distributed", "distributed load q"),
    ("leaning", "leaning load, h: leaning columns' height"),
    ("forces", "axial force N at λ = 1"),
)

#: Entries whose symbol is a sample of the text they explain.
_TEXT_SYMBOLS = {"inertia": "I/Imax"}


def symbols_used(column: Column, modes: bool = True, forces: bool = False) -> set[str]:
    """Names of the symbols a drawing of ``column`` shows (``"mode"`` only when ``modes``, ``"forces"``
    only when the axial-force diagram is drawn)."""
    used = {"axis", "band", "joint"} | ({"mode"} if modes else set()) | ({"forces"} if forces else set())
    if len(column.stations()) > len(column.joints):
        used.add("station")
    if inertia_texts(column):
        used.add("inertia")
    for r in merged_restraints(column):
        if math.isinf(r.lateral):
            used.add("rigid_lateral")
        elif r.lateral > 0:
            used.add("lateral_spring")
        if math.isinf(r.rotation):
            used.add("rigid_rotation")
        elif r.rotation > 0:
            used.add("rotational_spring")
    if column.foundations:
        used.add("foundation")
    if ground_level(column) is not None:
        used.add("ground")
    for _at, loads in point_load_groups(column):
        for p in loads:
            used.add("load_permanent" if p.permanent else "load_variable")
            if p.P < 0:
                used.add("load_up")
    for d in column.distributed_loads:
        if d.q != 0:
            used.add("distributed")
    for lean in column.leaning_loads:
        if lean.P != 0:
            used.add("leaning")
    return used


def key_rows(used: set[str], width_pt: float) -> list[list[tuple[str, str, float]]]:
    """The entries of ``used`` in rows that fit ``width_pt``: (name, text, width) each."""
    rows: list[list[tuple[str, str, float]]] = [[]]
    x = 0.0
    for key, text in KEY_ENTRIES:
        if key not in used:
            continue
        w = _symbol_width(key) + text_width(text, FS_TICK) + KEY_ENTRY_GAP
        if rows[-1] and x + w > width_pt:
            rows.append([])
            x = 0.0
        rows[-1].append((key, text, w))
        x += w
    return rows


def _symbol_width(key: str) -> float:
    """Room for the symbol of ``key`` [pt]: a text sample may be wider than a glyph."""
    sample = _TEXT_SYMBOLS.get(key)
    return max(KEY_SYMBOL_W, text_width(sample, FS_TICK) + 4.0) if sample else KEY_SYMBOL_W


def _draw_key_symbol(ax: Axes, key: str, x: float, y: float) -> None:
    """Draw the key symbol of ``key`` centred at data (x, y) of the key axes (data units = points)."""
    from matplotlib.patches import Polygon

    c = x + KEY_SYMBOL_W / 2 - 2.0
    tr = sym.pt(ax, c, y)
    if key in _TEXT_SYMBOLS:
        ax.text(x, y, _TEXT_SYMBOLS[key], fontsize=FS_TICK, va="center", ha="left", style="italic", color="0.25")
    elif key == "mode":
        sym.line(ax, tr, [-10, 10], [0, 0], lw=1.6)
    elif key == "axis":
        sym.line(ax, tr, [-10, 10], [0, 0], color=AXIS_GREY, lw=0.7)
    elif key == "band":
        ax.add_patch(Polygon([(-10, -BAND_MAX), (10, -BAND_MAX * 0.5), (10, BAND_MAX * 0.5), (-10, BAND_MAX)],
                             closed=True, transform=tr, facecolor=BAND_FILL, edgecolor=BAND_EDGE, lw=0.5))
        sym.line(ax, tr, [-10, 10], [0, 0], color=AXIS_GREY, lw=0.7)
    elif key == "joint":
        sym.line(ax, tr, [0, 0], [-8, 8], color=AXIS_GREY, lw=0.7)
        sym.line(ax, tr, [-8, 8], [0, 0], lw=1.3)
    elif key == "station":
        sym.line(ax, tr, [0, 0], [-8, 8], color=AXIS_GREY, lw=0.7)
        ax.plot([c], [y], ls="none", marker="o", ms=2.8, color=INK)
    elif key == "rigid_lateral":
        sym.line(ax, tr, [5, 5], [-8, 8], color=AXIS_GREY, lw=0.7)
        sym.triangle(ax, c, y, tip=4.2)
    elif key == "lateral_spring":
        sym.line(ax, tr, [9, 9], [-8, 8], color=AXIS_GREY, lw=0.7)
        sym.zigzag(ax, c, y, tip=9.0, scale=0.75)
    elif key == "rigid_rotation":
        sym.line(ax, tr, [0, 0], [-8, 8], color=AXIS_GREY, lw=0.7)
        sym.square(ax, c, y)
    elif key == "rotational_spring":
        sym.line(ax, tr, [0, 0], [-8, 8], color=AXIS_GREY, lw=0.7)
        sym.coil(ax, c, y)
    elif key == "foundation":   # a trapezoid: the modulus grows downward
        ax.add_patch(Polygon([(-5.5, -7), (5.5, -7), (0.5, 7), (-5.5, 7)], closed=True, transform=tr,
                             facecolor="white", edgecolor=INK, hatch="////", lw=0.0))
        sym.line(ax, tr, [-5.5, -5.5], [-7, 7], lw=0.9)
        sym.line(ax, tr, [5.5, 0.5], [-7, 7], lw=0.5)
    elif key == "ground":
        sym.ground(ax, y, c - 10.0, c + 10.0)
    elif key in ("load_variable", "load_permanent"):
        sym.load_arrow(ax, c, y - 8.0, length=16.0, hollow=key == "load_permanent")
    elif key == "load_up":
        sym.load_arrow(ax, c, y - 8.0, length=-16.0)
    elif key == "forces":
        ax.add_patch(Polygon([(-7, -8), (3, -8), (3, -1), (7, -1), (7, 8), (-7, 8)], closed=True, transform=tr,
                             facecolor=BAND_FILL, edgecolor="none"))
        sym.line(ax, tr, [3, 3, 7, 7], [-8, -1, -1, 8], lw=1.0)
        sym.line(ax, tr, [-7, -7], [-8, 8], color=AXIS_GREY, lw=0.7)
    elif key == "distributed":
        for dx in (-6.0, 0.0, 6.0):
            sym.small_arrow(ax, c, y - 4.0, dx=dx, length=8.0)
    elif key == "leaning":
        sym.line(ax, tr, [-9, -9], [-8, 8], color=AXIS_GREY, lw=0.7)
        sym.side_arrow(ax, c, y, tip=-8.5, length=20.0)


def draw_key(fig: Figure, left_in: float, bottom_in: float, width_in: float, rows) -> None:
    """The key as its own axes (labelled "key") at the given place on ``fig`` [in]."""
    W, Hh = fig.get_figwidth(), fig.get_figheight()
    height_in = len(rows) * KEY_ROW
    ax = fig.add_axes((left_in / W, bottom_in / Hh, width_in / W, height_in / Hh))
    ax.set_axis_off()
    ax.set_label("key")
    ax.set_xlim(0, width_in * 72.0)
    ax.set_ylim(0, height_in * 72.0)
    for r, row in enumerate(rows):
        y = (len(rows) - r - 0.5) * KEY_ROW * 72.0
        x = 0.0
        for key, text, w in row:
            _draw_key_symbol(ax, key, x, y)
            ax.text(x + _symbol_width(key) + 2.0, y, text, fontsize=FS_TICK, va="center", ha="left")
            x += w
