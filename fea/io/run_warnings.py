"""Warnings of a whole run, each with a stable key of our own and a sentence (JSON ``warnings``, summary, report)."""

from __future__ import annotations

from typing import Any

from ..results import CaseResults

__all__ = ["run_warnings", "BUCKLES_CASE", "BUCKLES_DESIGN"]

#: Keys of the run warnings (stable: the JSON result carries them).
BUCKLES_CASE = "buckles-under-case-loads"
BUCKLES_DESIGN = "buckles-under-design-loads"


def run_warnings(res: CaseResults) -> list[dict[str, str]]:
    """Planes whose lowest load factor is below 1 (case loads) or whose alpha_cr is below 1 (design loads)."""
    out = []
    for r in res.buckling:
        if r.load_factor < 1.0:
            out.append({"key": BUCKLES_CASE, "axis": r.axis,
                        "text": f"{r.axis} axis: the lowest load factor {r.load_factor:.4g} is below 1: the column "
                                "buckles elastically under its case loads"})
    design: Any = res.extras.get("design")
    for w in getattr(design, "sway", ()):
        if w.alpha_cr < 1.0:
            out.append({"key": BUCKLES_DESIGN, "axis": w.axis,
                        "text": f"{w.axis} axis: alpha_cr {w.alpha_cr:.4g} is below 1: the column buckles "
                                f"elastically under the design loads (case loads x {design.load_factor:g})"})
    return out
