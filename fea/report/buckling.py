"""The elastic critical buckling part: load factors of every mode and the per-segment figures of each plane."""

from __future__ import annotations

from ..results import BucklingResult, CaseResults, SegmentBuckling
from ..units import DisplayUnits
from .blocks import hdr, yes
from .document import Em, Figure, Heading, Para, Part, Q, Sub, T, Table, q, unit_label

__all__ = ["buckling_part", "plane_title"]


def plane_title(axis: str) -> str:
    """Heading of a bending plane: "Major axis", "In-plane"."""
    return f"{axis.capitalize()} axis" if axis != "in-plane" else "In-plane"


def _segment_row(res: CaseResults, sg: SegmentBuckling, j: int, p: str, u: DisplayUnits) -> tuple:
    """One segment of the lowest mode; ``p`` is its JSON path."""
    name = res.case.segments[j].name if j < len(res.case.segments) else ""
    return ((Q(sg.index + 1, f"{p}/index", "", 6),), (T(name, f"case:segments/{j}/name"),),
            (q(sg.bottom, f"{p}/bottom_m", u.length), " – ", q(sg.top, f"{p}/top_m", u.length)),
            (q(sg.axial_force, f"{p}/axial_force_N", u.force),),
            (q(sg.critical_axial_force, f"{p}/critical_axial_force_N", u.force),),
            (q(sg.effective_length_factor, f"{p}/effective_length_factor", "", 3),),
            (q(sg.effective_length, f"{p}/effective_length_m", u.length),),
            (q(sg.energy_share, f"{p}/energy_share", "%", 3),),
            (yes(sg.meaningful, f"{p}/k_meaningful"),),
            (T(sg.note, f"{p}/note"),) if sg.note else ("",))


def _plane(res: CaseResults, i: int, b: BucklingResult, governs: bool, u: DisplayUnits) -> list:
    s = f"json:buckling/{i}"
    modes = Table((("Mode",), ("Load factor λ",)),
                  tuple(((Q(k + 1, f"ord:{k + 1}", "", 6),), (q(v, f"{s}/load_factors/{k}"),))
                        for k, v in enumerate(b.load_factors)), numeric=(0, 1))
    rows = tuple(_segment_row(res, sg, j, f"{s}/segments/{j}", u) for j, sg in enumerate(b.segments))
    force = f" [{unit_label(u.force)}]"
    segments = Table((("No.",), ("Segment",), hdr("Extent", u.length), (Em("N"), force), (Em("N"), Sub("cr"), force),
                      (Em("K"),), (Em("K L"), f" [{unit_label(u.length)}]"), ("Energy [%]",), ("K meaningful",),
                      ("Note",)), rows, numeric=(2, 3, 4, 5, 6, 7),
                     caption=(Em("N"), ": largest compression at load factor one; ", Em("N"), Sub("cr"),
                              ": the same at the critical state of the first mode; energy: share of the mode's "
                              "bending energy."))
    return [Heading(3, plane_title(b.axis) + (" (governing)" if governs else "")), modes, segments,
            Para(("Status: ", T(b.message, f"{s}/message"), "."))]


def buckling_part(res: CaseResults, u: DisplayUnits, mode_figures: list) -> Part:
    """The governing load factor, then every plane; ``mode_figures`` are (SVG, caption) pairs placed last."""
    lam = q(res.governing.load_factor, "json:governing_load_factor")
    several = len(res.buckling) > 1
    if several:
        blocks: list = [Para(("Governing plane: ", T(res.governing_axis, "json:governing_axis"),
                              " axis, lowest load factor ", Em("λ"), " = ", lam, "."))]
    else:
        blocks = [Para(("Lowest load factor ", Em("λ"), " = ", lam, "."))]
    for i, b in enumerate(res.buckling):
        blocks += _plane(res, i, b, several and b.axis == res.governing_axis, u)
    for svg, caption in mode_figures:
        blocks.append(Figure(svg, caption, "modes"))
    return Part("buckling", "Elastic critical buckling", blocks)
