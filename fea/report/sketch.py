"""The report's sketch of the column as analysed: the same drawing as the mode figures.

One model panel per bending plane, side by side, with the key: drawn by
:func:`fea.plot.plot_sketch` (the symbols of ``docs/symbols.md`` and the number
format of the mode figures) and written as inline SVG by
:func:`fea.report.svg.figure_svg`.  Its text is drawn as outlines, as in the
mode figure, so its numbers carry no ``data-src``; every one of them is in the
input tables of the same part, which do.
"""

from __future__ import annotations

from typing import TYPE_CHECKING

from ..model.case import Case
from ..units import DisplayUnits

if TYPE_CHECKING:
    from ..units import DisplayUnits as Units

__all__ = ["column_sketch"]


def column_sketch(case: Case, u: Units) -> str:
    """The sketch as an ``<svg>`` element (one panel per bending plane and a key), in the units ``u``."""
    from ..plot.modes import plot_sketch
    from .svg import figure_svg

    d = DisplayUnits.from_names(u.length, u.force)
    fig = plot_sketch(case.planes, length_unit=(d.length, d.length_si), force_unit=(d.force, d.force_si))
    svg = figure_svg(fig, "sketch-")
    return svg.replace("<svg", '<svg role="img" aria-label="column sketch"', 1)
