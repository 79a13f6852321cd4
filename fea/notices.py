"""Warnings of a run, each with a stable key of our own, a sentence and a level.

Every warning Stanchion raises about a case is a :class:`Notice`.  The keys are
listed once, in :data:`KINDS`, with what each means; the JSON result carries
them under ``warnings`` (``key``, ``level``, ``text`` and, where one plane is
concerned, ``axis``), the summary prints them, the report lists them in its
summary box and in its closing part.  ``docs/warnings.md`` describes each
key; a test keeps that page and this table in step.

Levels
------
``"warning"``
    The result cannot be relied on as it stands (the column buckles under
    its own loads, the mesh did not reach its tolerance).  The command exits
    with status 1.
``"check"``
    Something an engineer should look at before using the result (an input
    that looks like a slip, an idealised support, a K that is not a design
    value).  The exit status is unchanged.
"""

from __future__ import annotations

from dataclasses import dataclass
from typing import Any

__all__ = ["Notice", "KINDS", "LEVELS", "WARNING", "CHECK", "notice"]

WARNING = "warning"
CHECK = "check"
LEVELS = (WARNING, CHECK)

#: key -> (level, what the warning means).  Keys are stable: the JSON result carries them.
KINDS: dict[str, tuple[str, str]] = {
    # results that cannot be relied on
    "buckles-under-case-loads": (WARNING, "a plane's lowest elastic load factor is below 1: the column buckles "
                                          "under the loads of the case file"),
    "buckles-under-design-loads": (WARNING, "alpha_cr of a plane is below 1: the column buckles under the "
                                            "design loads"),
    "not-converged": (WARNING, "the lowest load factor of a plane did not reach the requested tolerance; the "
                               "sentence names the cause and the estimate"),
    "roundoff-limited": (CHECK, "the accuracy of a load factor is limited by round-off (a near-mechanism, a "
                                "large stiffness contrast or a very short interval); the estimate is given"),
    # plausibility of the input
    "modulus-implausible": (CHECK, "Young's modulus outside the plausible range of the stated material, or below "
                                   "100 times the yield strength (a unit slip?)"),
    "yield-strength-implausible": (CHECK, "a yield strength above 2 GPa, or below 10 MPa (a unit slip?)"),
    "slenderness-over-limit": (CHECK, "a compression segment's slenderness K L / r exceeds 200 (common practice, "
                                      "AISC 360 user note) or the selected standard's own limit"),
    "load-factor-very-high": (CHECK, "a lowest load factor above 10,000: the loads are probably in the wrong unit"),
    "stations-very-close": (CHECK, "two stations closer than 1 mm or 1e-4 of the column height: probably one "
                                   "height typed for another"),
    # idealisations and readings of the results
    "idealised-support": (CHECK, "a restraint is perfectly rigid in rotation: the theoretical K is shown beside "
                                 "the design value recommended for the nearest ideal case"),
    "lightly-loaded-segment": (CHECK, "a segment's K is large only because it carries little of the load or of the "
                                      "buckling energy; check it against its own N_cr instead"),
    "imperfect-not-complete": (WARNING, "the imperfect-column analysis of a plane did not complete (its path or "
                                        "its mesh did not reach the tolerance); the sentence names the cause"),
    "imperfect-analysis": (CHECK, "a remark of the imperfect-column analysis (an input it ignores, no limit "
                                  "point reached, no first yield computed)"),
}


@dataclass(frozen=True)
class Notice:
    """One warning: ``key`` from :data:`KINDS`, a plain sentence, and the plane concerned ("" for the case)."""

    key: str
    text: str
    axis: str = ""

    def __post_init__(self) -> None:
        if self.key not in KINDS:
            raise ValueError(f"unknown warning key {self.key!r}")

    @property
    def level(self) -> str:
        return KINDS[self.key][0]

    def as_dict(self) -> dict[str, Any]:
        out: dict[str, Any] = {"key": self.key, "level": self.level, "text": self.text}
        if self.axis:
            out["axis"] = self.axis
        return out


def notice(key: str, text: str, axis: str = "") -> Notice:
    """A :class:`Notice` (checked against :data:`KINDS`)."""
    return Notice(key, text, axis)
