"""The elastic critical buckling part: load factors of every mode and the per-segment figures of each plane."""

from __future__ import annotations

import math

from ..model.ideal_supports import IdealK, ideal_case, ideal_cases
from ..results import BucklingResult, CaseResults, SegmentBuckling
from ..units import DisplayUnits
from .blocks import hdr, yes
from .document import Em, Figure, Heading, Note, Para, Part, Q, Sub, T, Table, q, unit_label

__all__ = ["buckling_part", "plane_title", "segment_ideal"]


def plane_title(axis: str) -> str:
    """Heading of a bending plane: "Major axis", "In-plane"."""
    return f"{axis.capitalize()} axis" if axis != "in-plane" else "In-plane"


def segment_ideal(res: CaseResults, b: BucklingResult, sg: SegmentBuckling) -> IdealK | None:
    """The nearest ideal case of a segment bounded by idealised supports, when its K is a design value; else None."""
    if sg.effective_length_factor is None or not sg.meaningful:
        return None
    return ideal_case(res.case.column(b.axis), sg.index)


def _decimals(K: float | None, decimals: int = 3) -> int:
    """Significant figures that show ``K`` with ``decimals`` decimals, as the terminal summary prints it
    (:func:`fea.io.summary.summary_lines`: ``f"{K:.3f}"``)."""
    if K is None or not math.isfinite(K) or K == 0:
        return decimals
    return max(1, decimals + int(math.floor(math.log10(abs(K)))) + 1)


def _segment_row(res: CaseResults, sg: SegmentBuckling, j: int, p: str, u: DisplayUnits,
                 ideal: IdealK | None, with_ideal: bool) -> tuple:
    """One segment of the lowest mode; ``p`` is its JSON path; ``with_ideal``: the plane shows a recommended K."""
    name = res.case.segments[j].name if j < len(res.case.segments) else ""
    recommended: tuple = ()
    if with_ideal:
        recommended = ((q(ideal.recommended, f"{p}/ideal_support/K_recommended", "", 2),) if ideal else ("",),)
    if sg.advice:
        note: tuple = (T(sg.advice, f"{p}/k_advice"),)
    else:
        note = (T(sg.note, f"{p}/note"),) if sg.note else ("",)
    return ((Q(sg.index + 1, f"{p}/index", "", 6),), (T(name, f"case:segments/{j}/name"),),
            (q(sg.bottom, f"{p}/bottom_m", u.length), " – ", q(sg.top, f"{p}/top_m", u.length)),
            (q(sg.axial_force, f"{p}/axial_force_N", u.force),),
            (q(sg.critical_axial_force, f"{p}/critical_axial_force_N", u.force),),
            (q(sg.effective_length_factor, f"{p}/effective_length_factor", "", _decimals(sg.effective_length_factor)),),
            *recommended,
            (q(sg.effective_length, f"{p}/effective_length_m", u.length),),
            (q(sg.energy_share, f"{p}/energy_share", "%", 3),),
            (yes(sg.meaningful, f"{p}/k_meaningful"),),
            note)


def _ideal_note(ideals: list[tuple[int, SegmentBuckling, IdealK]], s: str) -> Para:
    """What the recommended K is, for which ideal case, its source and why it is larger than the theoretical K."""
    parts: list = [Em("K"), Sub("rec"), ": the design value recommended for the nearest ideal case of segments "
                   "bounded by supports the model takes as perfectly rigid in rotation ("]
    for n, (j, sg, ideal) in enumerate(ideals):
        p = f"{s}/segments/{j}"
        parts += ["; " if n else "", "segment ", Q(sg.index + 1, f"{p}/index", "", 6), ": ",
                  T(ideal.name, f"{p}/ideal_support/case"), ", theoretical ", Em("K"), " = ",
                  q(ideal.theoretical, f"{p}/ideal_support/K_theoretical", "", 3)]
    j0 = ideals[0][0]
    parts += ["). Source: ", T(ideal.source, f"{s}/segments/{j0}/ideal_support/source"), ". Note: ",
              T(ideal.note, f"{s}/segments/{j0}/ideal_support/note"), "."]
    return Para(tuple(parts))


def _plane(res: CaseResults, i: int, b: BucklingResult, governs: bool, u: DisplayUnits) -> list:
    s = f"json:buckling/{i}"
    modes = Table((("Mode",), ("Load factor λ",)),
                  tuple(((Q(k + 1, f"ord:{k + 1}", "", 6),), (q(v, f"{s}/load_factors/{k}"),))
                        for k, v in enumerate(b.load_factors)), numeric=(0, 1))
    cases = ideal_cases(res.case.column(b.axis))
    ideal = [None if sg.effective_length_factor is None else cases[sg.index] for sg in b.segments]
    with_ideal = any(x is not None for x in ideal)
    rows = tuple(_segment_row(res, sg, j, f"{s}/segments/{j}", u, ideal[j], with_ideal)
                 for j, sg in enumerate(b.segments))
    force = f" [{unit_label(u.force)}]"
    recommended: tuple = ((Em("K"), Sub("rec")),) if with_ideal else ()
    numeric = (2, 3, 4, 5, 6, 7, 8) if with_ideal else (2, 3, 4, 5, 6, 7)
    segments = Table((("No.",), ("Segment",), hdr("Extent", u.length), (Em("N"), force), (Em("N"), Sub("cr"), force),
                      (Em("K"),), *recommended, (Em("K L"), f" [{unit_label(u.length)}]"), ("Energy [%]",),
                      ("K meaningful",), ("Note",)), rows, numeric=numeric,
                     caption=(Em("N"), ": largest compression at load factor one; ", Em("N"), Sub("cr"),
                              ": the same at the critical state of the first mode; energy: share of the mode's "
                              "bending energy."))
    blocks: list = [Heading(3, plane_title(b.axis) + (" (governing)" if governs else "")), modes, segments]
    found = [(j, sg, x) for j, (sg, x) in enumerate(zip(b.segments, ideal)) if x is not None]
    if found:
        blocks.append(_ideal_note(found, s))
    return blocks + [Para(("Status: ", T(b.message, f"{s}/message"), "."))]


def buckling_part(res: CaseResults, u: DisplayUnits, mode_figures: list) -> Part:
    """The governing load factor, then every plane; ``mode_figures`` are (SVG, caption) pairs placed last."""
    lam = q(res.governing.load_factor, "json:governing_load_factor")
    several = len(res.buckling) > 1
    if several:
        blocks: list = [Para(("Governing plane: ", T(res.governing_axis, "json:governing_axis"),
                              " axis, lowest load factor ", Em("λ"), " = ", lam, "."))]
    else:
        blocks = [Para(("Lowest load factor ", Em("λ"), " = ", lam, "."))]
    spatial = res.extras.get("spatial")
    r = getattr(spatial, "result", None)
    if r is not None and r.converged and float(r.load_factors[0]) < res.governing.load_factor * (1 - 1e-6):
        lowest = q(float(r.load_factors[0]), "json:spatial/load_factors/0")
        blocks.append(Note(("The thin-walled analysis below finds a lower mode, ",
                            T(r.kinds[0], "json:spatial/kinds/0"), ", at ", Em("λ"), " = ", lowest,
                            ": it governs the member.",), "warning"))
    for i, b in enumerate(res.buckling):
        blocks += _plane(res, i, b, several and b.axis == res.governing_axis, u)
    for svg, caption in mode_figures:
        blocks.append(Figure(svg, caption, "modes"))
    return Part("buckling", "Elastic critical buckling", blocks)
