"""Member checks with axial compression and bending: the public names, and what each standard covers.

Pure kernels (SI floats, no I/O): a :class:`BeamColumnInput` in, a
:class:`BendingCheck` out, with its utilisation per equation, every
intermediate number and its written-out formula steps in order (so that the
report prints and re-evaluates what was computed).  docs/bending.md describes
the routes, the formulas and the limits.

* EN 1993-1-1:2005: :func:`en1993_member` (6.3.3, (6.61) and (6.62), Annex B or
  Annex A), :func:`en1993_cross_section` (6.2.1(7), 6.2.9.1: the second-order
  route), :func:`en1993_ltb` (6.3.2), :func:`en1993_cm` (Table B.3), :func:`en1993_lt_curve` (Tables 6.4,
  6.5).
* AISC 360-16: :func:`aisc360_member` (H1.1 with E3, F2, F6, F7),
  :func:`aisc360_b1` and :func:`aisc360_cm` (Appendix 8).
* :data:`BENDING_COVERED`: for every standard a case may name, whether its
  check with bending is implemented, and why not where it is not.
"""

from __future__ import annotations

from types import MappingProxyType
from typing import Mapping, NamedTuple

from .bending_aisc import B1Result, aisc360_b1, aisc360_cm, aisc360_member
from .bending_en import en1993_cm, en1993_cross_section, en1993_lt_curve, en1993_ltb, en1993_member
from .bending_record import DIAGRAMS, SHAPES, BeamColumnInput, BendingCheck, MomentDiagram, formula_constants
from .standards import STANDARDS

__all__ = ["EQUATIONS", "BENDING_COVERED", "BendingCoverage", "DIAGRAMS", "SHAPES", "MomentDiagram", "BeamColumnInput",
           "BendingCheck", "B1Result", "en1993_member", "en1993_cross_section", "en1993_ltb", "en1993_cm",
           "en1993_lt_curve", "aisc360_member", "aisc360_b1", "aisc360_cm", "bending_formula_constants"]


class BendingCoverage(NamedTuple):
    """Whether a standard's member check with bending is implemented, and the reason (what it covers, or why the
    standard checks compression only here)."""

    covered: bool
    reason: str


_COVERED: dict[str, BendingCoverage] = {
    "EN 1993-1-1": BendingCoverage(True, (
        "6.3.3 (6.61)/(6.62) with Annex B (default) or Annex A, chi_LT by 6.3.2 from M_cr; the cross-section "
        "check 6.2.1(7)/6.2.9.1 for the second-order route; doubly symmetric members, classes 1 to 3; Annex A, "
        "Annex B and 6.3.2.3 from memory")),
    "AISC 360": BendingCoverage(True, (
        "H1.1 (H1-1a/H1-1b) with P_c by E3 and M_c by F2 (M_cr of the analysis, equivalent-length route), F6, F7; "
        "B1 of Appendix 8; compact doubly symmetric I and RHS sections; from memory")),
    "AS 4100": BendingCoverage(False, (
        "compression only: the combined-actions clauses (8.3 section capacity, 8.4.2.2 in-plane and 8.4.4.1 "
        "out-of-plane member capacity, with the member moment capacity of 5.6) cannot be stated with confidence "
        "from memory; a member with bending is not verified by this standard here")),
    "BS 5950-1": BendingCoverage(False, (
        "compression only: the simplified method of 4.8.3.3.1 needs m factors (Table 26), m_LT (Table 18) and the "
        "buckling resistance moment M_b of 4.3.6 (Annex B), which cannot be stated with confidence from memory; a "
        "member with bending is not verified by this standard here")),
    "Perry-Robertson": BendingCoverage(False, (
        "compression only: a column formula without a member check for bending")),
    "Rankine-Gordon": BendingCoverage(False, (
        "compression only: a column formula without a member check for bending")),
    "working-stress": BendingCoverage(False, (
        "compression only: an allowable axial stress without a member check for bending")),
}

BENDING_COVERED: Mapping[str, BendingCoverage] = MappingProxyType(
    {name: _COVERED.get(name, BendingCoverage(False, "compression only: no check with bending is implemented"))
     for name in STANDARDS})
"""For each standard of :data:`fea.design.standards.STANDARDS`: ``(covered, reason)``.  A member with
bending checked by a standard that is not covered must be reported "not verified", not "passes"."""


#: The equation each utilisation of the checks gives, by the name of its number (for the written-out record).
EQUATIONS: Mapping[str, str] = MappingProxyType({
    "u_6_61": "(6.61)", "u_6_62": "(6.62)", "u_6_2": "6.2.1(7)", "n": "(6.9)", "u_6_31_y": "(6.31) y",
    "u_6_31_z": "(6.31) z", "u_6_41": "(6.41)", "u_6_54": "(6.54)", "Pr_over_Pc": "Chapter E",
    "u_H1_1a": "(H1-1a)", "u_H1_1b": "(H1-1b)"})


def bending_formula_constants() -> dict[str, frozenset[str]]:
    """The numbers the written-out formulas of the checks with bending print, by published formula
    (``Step.ref``): for the report's test that every printed constant is a published one."""
    from .bending_aisc import STEPS as AISC
    from .bending_en import STEPS as EN

    out: dict[str, set[str]] = {}
    for part in (formula_constants(EN), formula_constants(AISC)):
        for ref, consts in part.items():
            out.setdefault(ref, set()).update(consts)
    return {k: frozenset(v) for k, v in out.items()}
