"""Mode-shape figures, and the model sketch alone.

Every figure is built on :class:`matplotlib.figure.Figure` directly (no
pyplot, no GUI).  The functions here only read :class:`~fea.model.Column` and
:class:`~fea.results.BucklingResult` objects; they never recompute physics.
The column is drawn by :mod:`fea.plot.column` in the symbols of
:mod:`fea.plot.symbols` (meanings in ``docs/symbols.md``); a key at the foot of
each figure names the symbols that appear in it.

matplotlib is imported inside the functions, so importing this module is light.
"""

from __future__ import annotations

from typing import TYPE_CHECKING, Sequence

import numpy as np

from ..errors import ModelError
from ..model import Column
from ..results import BucklingResult
from .text import format_load_factor

if TYPE_CHECKING:
    from matplotlib.axes import Axes
    from matplotlib.figure import Figure

__all__ = ["plot_modes", "plot_planes", "plot_sketch"]


def _check_pair(column: Column, result: BucklingResult, where: str = "plot") -> None:
    if not isinstance(column, Column):
        raise ModelError(where, f"expected a Column, got {type(column).__name__}")
    if not isinstance(result, BucklingResult):
        raise ModelError(where, f"expected a BucklingResult, got {type(result).__name__}")
    h = np.asarray(result.heights, dtype=float)
    H = column.height
    if h.size < 2 or abs(h[0]) > 1e-6 * H or abs(h[-1] - H) > 1e-6 * H:
        raise ModelError(where, f"the result does not belong to this column (its heights run from "
                                f"{h[0]:g} to {h[-1]:g} m, the column is {H:g} m high)")


def _n_drawn(result: BucklingResult, n_modes: int) -> int:
    if not isinstance(n_modes, int) or isinstance(n_modes, bool) or n_modes < 1:
        raise ModelError("plot", f"number of modes to draw must be a whole number >= 1, got {n_modes!r}")
    return min(n_modes, int(np.asarray(result.modes).shape[0]))


def _default_title(column: Column, result: BucklingResult) -> str:
    parts = ["Buckling modes"]
    if column.title:
        parts.append(column.title)
    if result.axis:
        parts.append(f"bending plane: {result.axis}")
    return " — ".join(parts)


def _into_axes(column: Column, result: BucklingResult, ax_list: Sequence[Axes], units, title: str | None) -> Figure:
    """The model sketch into ``ax_list[0]`` and one mode into each further axes."""
    from .column import draw_model_panel, model_extent
    from .layout import draw_mode_panel
    from .style import FS_SUPTITLE

    axes = list(ax_list)
    n_avail = int(np.asarray(result.modes).shape[0])
    if len(axes) < 2 or len(axes) - 1 > n_avail:
        raise ModelError("plot", f"ax_list needs one axes for the model and one per mode (2 to {n_avail + 1}), "
                                 f"got {len(axes)}")
    fig = axes[0].figure
    if any(ax.figure is not fig for ax in axes):
        raise ModelError("plot", "all axes in ax_list must belong to one figure")
    y_max = column.height
    draw_model_panel(axes[0], column, units, y_max, model_extent(column, units), height_label=True)
    w_in = axes[1].get_position().width * fig.get_figwidth()
    for k, ax in enumerate(axes[1:]):
        draw_mode_panel(ax, column, result, k, units, y_max, narrow=w_in < 1.3)
    if title is not None:
        fig.suptitle(title, fontsize=FS_SUPTITLE)
    return fig


def plot_modes(column: Column, result: BucklingResult, ax_list: Sequence[Axes] | None = None, n_modes: int = 3,
               length_unit: tuple[str, float] = ("m", 1.0), force_unit: tuple[str, float] = ("kN", 1e3),
               title: str | None = None) -> Figure:
    """Draw a column and its first buckling modes side by side.

    The first panel is a sketch of the model (segment band, joints, stations,
    restraints, foundations and loads with their values); each further panel
    shows one mode shape against height, titled with its load factor
    ("mode 1, λ = 12.39").  All panels share the height axis.  A key at the
    foot explains the symbols used (see ``docs/symbols.md``).

    Parameters
    ----------
    column : Column
        The analysed column.
    result : BucklingResult
        Its buckling result (from :func:`fea.buckling`).
    ax_list : sequence of Axes, optional
        Axes of one existing figure to draw into: the first receives the model
        sketch, each further one a mode (so ``len(ax_list) - 1`` modes are
        drawn and ``n_modes`` is ignored).  No key is drawn in this case.
        Position the axes first: the sketch is laid out from their size, and
        its labels need the model axes to be about 2 to 3 inches wide.
        When omitted a new figure, sized for an A4 page, is made.
    n_modes : int
        Number of modes to draw (at most the number in ``result``).
    length_unit, force_unit : (str, float)
        Display unit as (label, value of one unit in SI), e.g. ``("mm", 1e-3)``
        or ``("kN", 1e3)``.
    title : str, optional
        Figure title; by default "Buckling modes" with the column title and
        the bending plane.

    Returns
    -------
    matplotlib.figure.Figure
        Panels are labelled (``Axes.get_label()``) "model", "mode 1", ... and
        "key".

    Raises
    ------
    ModelError
        Result not of this column, bad units or number of modes, wrong axes.
    """
    from .column import model_extent
    from .layout import Group, panel_figure
    from .text import PlotUnits

    _check_pair(column, result)
    units = PlotUnits.make(length_unit, force_unit)
    if ax_list is not None:
        return _into_axes(column, result, ax_list, units, title)
    n = _n_drawn(result, n_modes)
    group = Group(result.axis, column, result, n, model_extent(column, units))
    return panel_figure([group], units, title if title is not None else _default_title(column, result), None, None)


def plot_planes(planes: Sequence[tuple[str, Column, BucklingResult]], n_modes: int = 3, **kw) -> Figure:
    """Draw the buckling modes of several bending planes side by side.

    Parameters
    ----------
    planes : sequence of (str, Column, BucklingResult)
        ``(axis_label, column, result)`` per bending plane, e.g.
        ``[("major", col_y, res_y), ("minor", col_z, res_z)]``.
    n_modes : int
        Modes drawn per plane.
    **kw
        ``length_unit``, ``force_unit`` and ``title`` as for :func:`plot_modes`.

    Returns
    -------
    matplotlib.figure.Figure
        One group (model sketch and mode panels) per plane, headed with its
        axis label; the governing plane (lowest first load factor) is headed in
        bold, marked "governs" and named in the figure title.

    Raises
    ------
    ModelError
        No planes, a malformed entry, unknown keywords or a result not of its column.
    """
    from .column import model_extent
    from .layout import Group, panel_figure
    from .text import PlotUnits

    unknown = set(kw) - {"length_unit", "force_unit", "title"}
    if unknown:
        raise ModelError("plot", f"unknown keyword(s) {sorted(unknown)}; expected length_unit, force_unit or title")
    planes = list(planes)
    if not planes:
        raise ModelError("plot", "no bending planes to draw")
    units = PlotUnits.make(kw.get("length_unit", ("m", 1.0)), kw.get("force_unit", ("kN", 1e3)))
    groups = []
    for i, entry in enumerate(planes):
        if not (isinstance(entry, (tuple, list)) and len(entry) == 3 and isinstance(entry[0], str)):
            raise ModelError("plot", f"plane {i}: expected (axis_label, column, result), got {entry!r:.80}")
        label, column, result = entry
        _check_pair(column, result, f"plane {label!r}")
        groups.append(Group(label, column, result, _n_drawn(result, n_modes), model_extent(column, units)))
    lams = [float(g.result.load_factors[0]) for g in groups]
    gov = int(np.argmin(lams))
    # a plane buckling under its case loads is marked on its heading (and on the title of the figure)
    below = " — λ < 1: BUCKLES UNDER THE CASE LOADS"
    headings = [plane_heading(g.label) + (" (governs)" if i == gov and len(groups) > 1 else "")
                + (below if lams[i] < 1.0 else "") for i, g in enumerate(groups)]
    base = kw.get("title") or "Buckling modes by bending plane"
    lam_text = f"λ = {format_load_factor(lams[gov])}"
    suptitle = (f"{base} — governing: {plane_heading(groups[gov].label)}, {lam_text}" if len(groups) > 1
                else f"{base} — {lam_text}") + (below if lams[gov] < 1.0 else "")
    return panel_figure(groups, units, suptitle, headings, gov)


def plane_heading(label: str) -> str:
    """Heading of a bending plane in a figure: ``"major axis"``; ``"in plane"`` for a single plane."""
    return "in plane" if label in ("", "in-plane") else f"{label} axis"


def plot_sketch(planes: Sequence[tuple[str, Column]], length_unit: tuple[str, float] = ("m", 1.0),
                force_unit: tuple[str, float] = ("kN", 1e3), title: str | None = None) -> Figure:
    """Draw the model sketch of each bending plane side by side, with the key: the column as analysed.

    The same drawing as the model panels of :func:`plot_modes` (one symbol
    set, one number format), without mode panels; the report shows it.

    Parameters
    ----------
    planes : sequence of (str, Column)
        ``(axis_label, column)`` per bending plane, e.g. ``[("major", col_y), ("minor", col_z)]``.
    length_unit, force_unit : (str, float)
        Display unit as (label, value of one unit in SI).
    title : str, optional
        Figure title (none by default).

    Returns
    -------
    matplotlib.figure.Figure
        One model panel (labelled "model") per plane, headed with its plane, and the key ("key").

    Raises
    ------
    ModelError
        No planes, a malformed entry or bad units.
    """
    from .column import model_extent
    from .layout import Group, panel_figure
    from .text import PlotUnits

    units = PlotUnits.make(length_unit, force_unit)
    planes = list(planes)
    if not planes:
        raise ModelError("plot", "no bending planes to draw")
    groups = []
    for i, entry in enumerate(planes):
        if not (isinstance(entry, (tuple, list)) and len(entry) == 2 and isinstance(entry[0], str)
                and isinstance(entry[1], Column)):
            raise ModelError("plot", f"plane {i}: expected (axis_label, column), got {entry!r:.80}")
        groups.append(Group(entry[0], entry[1], None, 0, model_extent(entry[1], units)))
    headings = [plane_heading(g.label) for g in groups]
    return panel_figure(groups, units, title, headings, None)
