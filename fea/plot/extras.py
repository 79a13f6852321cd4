"""Figures of the optional analyses, for ``stanchion check --plot``.

:func:`extra_figures` turns the optional results of a case run into named
figures: the load-deflection path, moment/stress diagrams and the comparison
chart of every plane with an imperfect-column analysis, and the utilisation
chart of a design check.  The command writes each next to the mode-shape
figure as ``<stem>-<name><ext>``.
"""

from __future__ import annotations

from matplotlib.figure import Figure

__all__ = ["extra_figures"]


def extra_figures(extras: dict, length_unit=("m", 1.0), force_unit=("kN", 1e3), stress_unit=("MPa", 1e6),
                  fy: float | None = None) -> dict[str, Figure]:
    """Named figures of the optional analyses in ``extras`` (a CaseResults.extras mapping)."""
    out: dict[str, Figure] = {}
    imperfect = extras.get("imperfect") or {}
    if imperfect:
        from .imperfect import plot_comparison, plot_diagrams, plot_path

        mm = ("mm", 1e-3) if length_unit[1] >= 1e-3 else length_unit
        for axis, r in imperfect.items():
            tag = axis or "plane"
            out[f"path-{tag}"] = plot_path(r, length_unit=mm)
            out[f"diagrams-{tag}"] = plot_diagrams(r, length_unit=length_unit, force_unit=force_unit,
                                                   stress_unit=stress_unit, fy=fy)
            out[f"comparison-{tag}"] = plot_comparison(r)
    design = extras.get("design")
    if design is not None:
        from .design import plot_utilisation

        out["utilisation"] = plot_utilisation(design).figure
    return out
