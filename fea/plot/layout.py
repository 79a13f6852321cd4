"""Page layout of the column figures: per bending plane a model panel and its mode panels, then the key.

:func:`panel_figure` serves both the mode figures (groups with modes) and the
report's sketch (groups without modes).  Sizes are in inches (see
:mod:`fea.plot.style`), fixed so that the symbols keep their size.
"""

from __future__ import annotations

from dataclasses import dataclass
from typing import TYPE_CHECKING

from ..model import Column
from ..results import BucklingResult
from . import style
from .column import (
    draw_band,
    draw_foundations,
    draw_model_panel,
    draw_restraints,
    draw_stations,
    foundation_right,
    set_height_axis,
)
from .forces import draw_force_panel, needs_force_diagram
from .key import draw_key, key_rows, symbols_used
from .shape import mode_curve, shear_parameters
from .style import BAND_MAX
from .text import PlotUnits, format_load_factor

if TYPE_CHECKING:
    from matplotlib.axes import Axes
    from matplotlib.figure import Figure

__all__ = ["Group", "panel_figure", "draw_mode_panel"]


@dataclass
class Group:
    """One bending plane of a figure: its column, its result and how many modes to draw (0: none)."""

    label: str
    column: Column
    result: BucklingResult | None
    n: int
    extent: tuple[float, float]

    @property
    def forces(self) -> bool:
        """Whether the axial-force diagram is drawn beside the model (:func:`fea.plot.forces.needs_force_diagram`)."""
        return needs_force_diagram(self.column)


def _mode_title(k: int, lam: float, narrow: bool) -> str:
    sep = "\n" if narrow else ", "
    return f"mode {k}{sep}λ = {format_load_factor(lam)}"


def draw_mode_panel(ax: Axes, column: Column, result: BucklingResult, k: int, units: PlotUnits, y_max: float,
                    narrow: bool) -> None:
    """Mode ``k`` (from 0) against height, over a light copy of the column and its restraints."""
    ax.set_xlim(-style.MODE_XLIM, style.MODE_XLIM)
    set_height_axis(ax, column, y_max, units, False)
    for s in column.stations():
        ax.axhline(s, color=style.GRID_GREY, lw=0.5, ls=(0, (1, 2)), zorder=0)
    ax.set_xticks([-1.0, 0.0, 1.0])
    ax.set_xticklabels(["−1", "0", "1"], fontsize=style.FS_TICK)
    ax.tick_params(axis="both", length=2.5, width=0.6)
    for sp in ax.spines.values():
        sp.set_linewidth(0.6)
        sp.set_color("0.4")
    draw_foundations(ax, column, (-(BAND_MAX + 7.0), foundation_right() + 3.0), color="0.45", hatch_color="0.65")
    draw_band(ax, column, edge=False)
    draw_stations(ax, column, tick=2.5)
    draw_restraints(ax, column, None, scale=0.8)
    # the element's own shape functions between the nodes: higher modes are smooth curves, not polylines
    y, w = mode_curve(result.heights, result.modes[k], result.rotations[k],
                      shear_parameters(column, result.heights))
    ax.plot(w, y, color=style.INK, lw=1.6, zorder=9, solid_joinstyle="round", gid="mode")
    ax.set_title(_mode_title(k + 1, float(result.load_factors[k]), narrow), fontsize=style.FS_TITLE)
    ax.set_label(f"mode {k + 1}")


def _heading(fig: Figure, text: str, bold: bool, left_in: float, right_in: float, rule: bool, top_in: float) -> None:
    fig_w, fig_h = fig.get_figwidth(), fig.get_figheight()
    xc = 0.5 * (left_in + right_in) / fig_w
    yc = (fig_h - top_in - 0.5 * style.TOP_HEADING) / fig_h
    fig.text(xc, yc, text, ha="center", va="center", fontsize=style.FS_HEAD, fontweight="bold" if bold else "normal")
    if rule:  # a rule under the heading spanning the group
        from matplotlib.lines import Line2D

        y_rule = yc - 0.11 / fig_h
        fig.add_artist(Line2D([(left_in + 0.05) / fig_w, (right_in - 0.05) / fig_w], [y_rule, y_rule],
                              color="0.3", lw=0.6))


def panel_figure(groups: list[Group], units: PlotUnits, suptitle: str | None, headings: list[str] | None,
                 governing: int | None) -> Figure:
    """Lay out model and mode panels of each group side by side, then the key."""
    from matplotlib.figure import Figure

    model_w = [(g.extent[0] + g.extent[1]) / 72.0 for g in groups]
    forces = [g.forces for g in groups]
    force_w = [style.FORCE_WIDTH + style.FORCE_GAP if f else 0.0 for f in forces]
    n_modes_total = sum(g.n for g in groups)
    with_modes = sum(1 for g in groups if g.n)
    fixed = (style.LEFT_MARGIN + style.RIGHT_MARGIN + sum(model_w) + sum(force_w) + with_modes * style.MODEL_GAP
             + sum(max(g.n - 1, 0) * style.MODE_GAP for g in groups) + (len(groups) - 1) * style.GROUP_GAP)
    mode_w = style.MODE_WIDTH
    if n_modes_total and fixed + n_modes_total * mode_w > style.MAX_WIDTH:
        mode_w = max(style.MODE_WIDTH_MIN, (style.MAX_WIDTH - fixed) / n_modes_total)
    fig_w = fixed + n_modes_total * mode_w
    # a sketch alone is widened to SKETCH_MIN_WIDTH (panels centred), so that its key keeps to a few rows
    shift = 0.0 if n_modes_total else max(0.0, style.SKETCH_MIN_WIDTH - fig_w) / 2
    fig_w += 2 * shift
    used: set[str] = set()
    for g, f in zip(groups, forces):
        used |= symbols_used(g.column, modes=g.n > 0, forces=f)
    rows = key_rows(used, (fig_w - style.LEFT_MARGIN - style.RIGHT_MARGIN) * 72.0)
    top_title = style.TOP_SUPTITLE if suptitle else 0.0
    top = top_title + (style.TOP_TITLES if n_modes_total else style.TOP_BARE) + (style.TOP_HEADING if headings else 0.0)
    bottom_axis = style.BOTTOM_AXIS if n_modes_total else style.BOTTOM_BARE
    bottom = bottom_axis + style.KEY_PAD + len(rows) * style.KEY_ROW + 0.08
    fig_h = top + style.AX_HEIGHT + bottom
    fig = Figure(figsize=(fig_w, fig_h))
    narrow = mode_w < 1.3
    y_max = max(g.column.height for g in groups)
    x = style.LEFT_MARGIN + shift
    b = bottom / fig_h
    hh = style.AX_HEIGHT / fig_h
    mode_axes_all = []
    for gi, g in enumerate(groups):
        group_left = x
        axm = fig.add_axes((x / fig_w, b, model_w[gi] / fig_w, hh))
        x += model_w[gi]
        axf = None
        if forces[gi]:
            x += style.FORCE_GAP
            axf = fig.add_axes((x / fig_w, b, style.FORCE_WIDTH / fig_w, hh), sharey=axm)
            x += style.FORCE_WIDTH
        x += style.MODEL_GAP if g.n else 0.0
        mode_axes = []
        for k in range(g.n):
            ax = fig.add_axes((x / fig_w, b, mode_w / fig_w, hh), sharey=axm)
            mode_axes.append(ax)
            x += mode_w + (style.MODE_GAP if k < g.n - 1 else 0.0)
        draw_model_panel(axm, g.column, units, y_max, g.extent, height_label=(gi == 0),
                         title="model" if n_modes_total else None)
        if axf is not None:
            draw_force_panel(axf, g.column, units, y_max, title=bool(n_modes_total))
        for k, ax in enumerate(mode_axes):
            draw_mode_panel(ax, g.column, g.result, k, units, y_max, narrow)
        mode_axes_all += mode_axes
        if headings:
            _heading(fig, headings[gi], gi == governing, group_left, x, len(groups) > 1, top_title)
        x += style.GROUP_GAP
    if mode_axes_all:  # one amplitude label under the mode panels
        first = mode_axes_all[0].get_position()
        last = mode_axes_all[-1].get_position()
        fig.text(0.5 * (first.x0 + last.x1), (bottom - style.BOTTOM_AXIS + 0.06) / fig_h, "relative displacement",
                 ha="center", va="bottom", fontsize=style.FS)
    if suptitle:
        fig.suptitle(suptitle, fontsize=style.FS_SUPTITLE, y=1.0 - 0.08 / fig_h, va="top")
    draw_key(fig, style.LEFT_MARGIN, 0.08, fig_w - style.LEFT_MARGIN - style.RIGHT_MARGIN, rows)
    return fig
