"""Sway sensitivity of a member: the elastic critical load factor on the design loads, classified.

Pure kernel (no I/O).  ``alpha_cr`` is the lowest elastic critical load factor
of a bending plane on the *design* loads: the plane's lowest load factor (on
the case loads) divided by the design load factor, since the design forces are
the case loads times that factor (:func:`fea.design.check.design_check`).

The axial member check of this tool uses the finite-element ``N_cr`` of a
perfect column; it does not include the second-order (P-Delta) moments of a
frame that sways under its loads.  The classification says when that check
alone is enough.

References
----------
* EN 1993-1-1 5.2.1(3): first-order analysis may be used when alpha_cr >= 10
  (elastic analysis; 15 for plastic analysis).  5.2.2(5)-(6): for
  3 <= alpha_cr < 10 the first-order sway effects may be amplified by
  ``1 / (1 - 1/alpha_cr)``; for alpha_cr < 3 a second-order analysis is required.
* AISC 360 (from memory, clause numbers to be checked against the document):
  the effective-length method (Appendix 7) is limited to a ratio of
  second-order to first-order drift of at most 1.5; the B2-type amplification
  ``1 / (1 - 1/alpha_cr)`` is taken as that ratio.
* AS 4100 (from memory): 4.4.2.3 elastic buckling load factor; moment
  amplification (4.4.2.2 / 4.4.2.3) allowed when the amplification factor
  is not above 1.4, otherwise a second-order analysis (4.4.3) is required;
  that is alpha_cr >= 3.5.  Its first-order limit is taken as alpha_cr >= 10
  (common practice).
* BS 5950-1:2000 (from memory): 2.4.2.6 (Annex via lambda_cr): lambda_cr >= 10
  non-sway; 4 <= lambda_cr < 10 amplified sway moments ``lambda_cr / (lambda_cr - 1)``;
  lambda_cr < 4 a second-order analysis is required.
* Perry-Robertson, Rankine-Gordon, working stress: no limit of their own; the
  EN 1993-1-1 limits (10 and 3) are used as common practice.
"""

from __future__ import annotations

import math
from dataclasses import dataclass

__all__ = ["SwayClass", "classify_sway", "amplification", "LIMITS"]

#: Per standard: (first-order limit, amplification limit on alpha_cr, source wording).
LIMITS: dict[str, tuple[float, float, str]] = {
    "EN 1993-1-1": (10.0, 3.0, "EN 1993-1-1 5.2.1(3) and 5.2.2(6)"),
    "AISC 360": (3.0, 3.0, "AISC 360 effective-length method, drift ratio <= 1.5 (from memory)"),
    "AS 4100": (10.0, 3.5, "AS 4100 4.4.2 amplification <= 1.4 (from memory; first-order limit 10 common "
                           "practice)"),
    "BS 5950-1": (10.0, 4.0, "BS 5950-1:2000 2.4.2.6 lambda_cr limits 10 and 4 (from memory)"),
}
_COMMON = (10.0, 3.0, "EN 1993-1-1 5.2.1(3) limits 10 and 3 (common practice for this method)")

#: Classifications, in order of severity.
FIRST_ORDER, AMPLIFIED, SECOND_ORDER, BUCKLES = ("first-order acceptable", "amplified first-order or second-order",
                                                 "second-order required", "buckles under the design loads")
EFFECTIVE_LENGTH = "effective-length method permitted"
BRACED = "braced plane: member check covers it"


@dataclass(frozen=True)
class SwayClass:
    """The sway sensitivity of one plane.

    Attributes
    ----------
    axis : the plane
    alpha_cr : lowest elastic critical load factor on the design loads [-]
    amplification : ``1 / (1 - 1/alpha_cr)`` (inf when alpha_cr <= 1) [-]
    classification : one of the four classifications of this module
    axial_check_enough : whether the axial member check alone verifies the member
    reason : plain words: why, and what is missing
    source : the rule applied
    covered_by : what covers the second-order effects the axial check leaves out ("" when nothing does): the
        member check with bending on second-order moments (:mod:`fea.design.beam_column`)
    """

    axis: str
    alpha_cr: float
    amplification: float
    classification: str
    axial_check_enough: bool
    reason: str
    source: str
    covered_by: str = ""


def amplification(alpha_cr: float) -> float:
    """Sway amplification ``1 / (1 - 1/alpha_cr)`` (EN 1993-1-1 5.2.2(5); AISC 360 B2 form); inf if alpha_cr <= 1."""
    return 1.0 / (1.0 - 1.0 / alpha_cr) if alpha_cr > 1.0 else math.inf


def classify_sway(standard: str, axis: str, alpha_cr: float, sway: bool = True) -> SwayClass:
    """Classify ``alpha_cr`` of plane ``axis`` by the limits of ``standard`` (see the module references).

    ``sway`` is False for a braced plane: both column ends held rigidly against translation and no leaning
    load.  Its lowest mode is then member buckling between lateral supports, whose second-order effects and
    imperfections the member check itself covers (EN 1993-1-1 5.2.2(3) and (7), 6.3.1: the buckling curve
    carries the member imperfection; the other methods' column formulas likewise), so only alpha_cr < 1 counts.
    """
    first, amp_limit, source = LIMITS.get(standard, _COMMON)  # AISC 360: first = 3 <=> amplification 1.5
    amp = amplification(alpha_cr)
    if alpha_cr < 1.0:
        return SwayClass(axis, alpha_cr, amp, BUCKLES, False,
                         f"alpha_cr = {alpha_cr:.3g} < 1: the column buckles elastically below the design loads",
                         source)
    if not sway:
        return SwayClass(axis, alpha_cr, amp, BRACED, True,
                         f"alpha_cr = {alpha_cr:.3g}: both ends are held against translation, so the lowest mode is "
                         "member buckling, which the member check covers", source)
    if alpha_cr >= first:
        if standard == "AISC 360":
            return SwayClass(axis, alpha_cr, amp, EFFECTIVE_LENGTH, True,
                             f"alpha_cr = {alpha_cr:.3g}: amplification {amp:.3g} <= 1.5, the effective-length "
                             "method applies", source)
        return SwayClass(axis, alpha_cr, amp, FIRST_ORDER, True,
                         f"alpha_cr = {alpha_cr:.3g} >= {first:g}: second-order effects may be neglected", source)
    missing = ("a second-order analysis with imperfections and the member check with its bending moments (made "
               "where the standard's check with bending is covered and the section is given by shape)")
    if alpha_cr >= amp_limit:
        return SwayClass(axis, alpha_cr, amp, AMPLIFIED, False,
                         f"alpha_cr = {alpha_cr:.3g} < {first:g} (amplification {amp:.3g}): second-order effects "
                         f"must be included; missing: {missing}", source)
    return SwayClass(axis, alpha_cr, amp, SECOND_ORDER, False,
                     f"alpha_cr = {alpha_cr:.3g} < {amp_limit:g} (amplification {amp:.3g}): a second-order "
                     f"analysis with imperfections is required; missing: {missing}", source)
