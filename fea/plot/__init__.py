"""Figures of columns and their buckling modes.

The figure functions are loaded on first use, and every module of this package
imports matplotlib only inside its functions, so ``import fea``,
``import fea.plot`` and ``import fea.plot.<module>`` stay free of matplotlib.

Public API
----------
:func:`plot_modes`
    One column: a model sketch and its first buckling modes side by side.
:func:`plot_planes`
    Several bending planes of one member in one figure, governing plane named.
:func:`plot_sketch`
    The model sketch of each bending plane alone, with the key (the column as analysed).
:func:`draw_column`
    The model sketch of one column on an existing Axes.
:func:`save_figure`
    Write a figure to PNG, SVG or PDF, atomically.
:func:`format_load_factor`
    The text used for load factors in panel titles.

Modules
-------
``modes`` (the figure functions), ``column`` (the drawing of the column
model), ``symbols`` (the glyphs; their meanings are in ``docs/symbols.md``),
``key``, ``labels`` (label spreading), ``layout`` (panels on the page),
``text`` (number format, display units, label text), ``style``, ``output``
(files); charts of the optional analyses in ``imperfect``, ``design``,
``study`` and ``extras``.
"""

from __future__ import annotations

from importlib import import_module
from typing import Any

#: Public name -> module of this package that defines it.
_HOMES = {
    "plot_modes": "modes",
    "plot_planes": "modes",
    "plot_sketch": "modes",
    "draw_column": "column",
    "save_figure": "output",
    "format_load_factor": "text",
}

__all__ = list(_HOMES)


def __getattr__(name: str) -> Any:
    if name in _HOMES:
        return getattr(import_module(f".{_HOMES[name]}", __name__), name)
    raise AttributeError(f"module 'fea.plot' has no attribute {name!r}")


def __dir__() -> list[str]:
    return sorted(list(globals()) + __all__)
