"""The front of the report: title, identification rows, the brief table of load factors, the caution."""

from __future__ import annotations

from typing import Any

from ..cautions import CAUTION
from ..results import CaseResults
from ..version import version
from .document import Note, Para, Part, T, Table, q

__all__ = ["title_of", "identification_rows", "brief_blocks", "caution", "running_head"]

#: The parts every report has; the brief lists the others.
STANDARD_PARTS = ("inputs", "method", "buckling", "closing")


def title_of(res: CaseResults) -> T:
    return T(res.case.title or "(untitled case)", "json:title")


def identification_rows(res: CaseResults, date: str) -> list[tuple]:
    """The identification rows printed under the title."""
    case = res.case
    d = case.display
    return [
        (("Case file",), (T(case.source, "json:case_file"),) if case.source else ("(given as text)",)),
        (("Hash of the case file, ", T("SHA-256", "name:SHA-256")), (T(case.sha256, "json:case_sha256"),)),
        (("Program",), (T("stanchion", "json:tool/name"), " version ", T(version(), "json:tool/version"))),
        (("Date of this report",), (T(date, "report:date"),)),
        (("Display units",), (f"lengths in {d.length}, forces in {d.force}, stresses in {d.stress}",)),
    ]


def brief_blocks(res: CaseResults, parts: list[Part]) -> list:
    """The lowest load factor of every plane, and the optional parts this record contains."""
    rows = []
    for i, b in enumerate(res.buckling):
        rows.append(((T(b.axis, f"json:buckling/{i}/axis"),), (q(b.load_factor, f"json:buckling/{i}/load_factors/0"),),
                     ("governs" if b.axis == res.governing_axis else "",)))
    brief: list = [Table((("Plane",), ("Lowest load factor λ",), ("",)), tuple(rows), numeric=(1,),
                         caption=("Elastic critical load factors; the part on buckling gives the effective-length "
                                  "factors.",))]
    from ..io.run_warnings import run_warnings

    for i, w in enumerate(run_warnings(res)):  # boxed in the summary, by level (see fea/notices.py)
        brief.append(Note(("(", T(w["key"], f"json:warnings/{i}/key"), ") ", T(w["text"], f"json:warnings/{i}/text"),
                           "" if w["text"].endswith(("?", ".")) else "."), w["level"]))
    design: Any = res.extras.get("design")
    if design is not None and design.sway:
        brief.append(Para(("Design check (", T(design.standard, "json:design/standard"), "): verdict ",
                           T(design.verdict, "json:design/verdict"), ". ", _MISSING.get(design.verdict, ""))))
        brief.extend(Para(("Sway sensitivity, ", T(w.axis, f"json:design/sway/{i}/axis"), " axis: α_cr ",
                           q(w.alpha_cr, f"json:design/sway/{i}/alpha_cr", "", 3), ", ",
                           T(w.classification, f"json:design/sway/{i}/classification"), "."))
                     for i, w in enumerate(design.sway))
    extra = [p.title.lower() for p in parts if p.key not in STANDARD_PARTS]
    if extra:
        brief.append(Para(("This record also contains: " + ", ".join(extra) + ".",)))
    return brief


#: What a verdict other than "passes" lacks, in plain words (no numbers: the brief traces every number).
_MISSING = {"not verified": "Missing: a second-order analysis with imperfections, or the member check with bending "
                            "(not yet offered); the axial checks alone do not verify this member.",
            "fails": "See the design part and the warnings."}


def caution() -> T:
    """The caution of the tool, shown under the identification rows."""
    return T(CAUTION, "json:cautions/0")


def running_head(res: CaseResults) -> str:
    """The running head of every printed page."""
    return f"{title_of(res).text} · case sha256 {res.case.sha256[:12]}"
