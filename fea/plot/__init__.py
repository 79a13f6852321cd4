"""Figures of columns and their buckling modes.

The figure functions live in :mod:`fea.plot.figures`, which imports
matplotlib.  They are loaded on first use, so ``import fea`` and
``import fea.plot`` stay free of matplotlib.

Public API
----------
:func:`plot_modes`
    One column: a model sketch and its first buckling modes side by side.
:func:`plot_planes`
    Several bending planes of one member in one figure, governing plane named.
:func:`save_figure`
    Write a figure to PNG, SVG or PDF, atomically.
:func:`format_load_factor`
    The text used for load factors in panel titles.
"""

from __future__ import annotations

from typing import Any

__all__ = ["plot_modes", "plot_planes", "save_figure", "format_load_factor"]


def __getattr__(name: str) -> Any:
    if name in __all__:
        from . import figures

        return getattr(figures, name)
    raise AttributeError(f"module 'fea.plot' has no attribute {name!r}")


def __dir__() -> list[str]:
    return sorted(list(globals()) + __all__)
