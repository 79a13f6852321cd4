"""The front of the report: title, identification rows, the brief table of load factors, the caution."""

from __future__ import annotations

import datetime
from typing import Any, Mapping

from ..cautions import CAUTION
from ..results import CaseResults
from ..version import version
from .document import Note, Para, Part, T, Table, q

__all__ = ["title_of", "identification_rows", "brief_blocks", "caution", "running_head", "RECORD_LABELS",
           "record_fields", "report_date"]

#: The identification fields of a record (``[record]`` keys and the command's options) and their labels, in the
#: order they are printed.
RECORD_LABELS = {"project": "Project", "job": "Job number", "prepared_by": "Prepared by",
                 "checked_by": "Checked by", "revision": "Revision"}

#: The parts every report has; the brief lists the others.
STANDARD_PARTS = ("inputs", "method", "buckling", "closing")


def title_of(res: CaseResults) -> T:
    return T(res.case.title or "(untitled case)", "json:title")


def record_fields(res: CaseResults, given: Mapping[str, str] | None = None) -> dict[str, T]:
    """The identification fields of the record: those ``given`` (the command's options, ``report:<key>``)
    override the case's ``[record]`` table (``case:extras/record/<key>``); fields given nowhere are left out."""
    table: Any = res.case.extras.get("record")
    given = given or {}
    unknown = sorted(set(given) - set(RECORD_LABELS))
    if unknown:
        raise ValueError(f"unknown identification field {unknown[0]!r}: expected one of {', '.join(RECORD_LABELS)}")
    out = {}
    for key in RECORD_LABELS:
        if given.get(key):
            out[key] = T(given[key], f"report:{key}")
        elif table is not None and getattr(table, key, None):
            out[key] = T(getattr(table, key), f"case:extras/record/{key}")
    return out


def report_date(res: CaseResults, date: str | None) -> T:
    """The date of the record: ``date`` when given (the ``--date`` option), else the case's ``[record] date``,
    else today."""
    table: Any = res.case.extras.get("record")
    if date is None and table is not None and table.date:
        return T(table.date, "case:extras/record/date")
    return T(date or datetime.date.today().isoformat(), "report:date")


def identification_rows(res: CaseResults, date: T, record: Mapping[str, T] | None = None) -> list[tuple]:
    """The identification rows printed under the title: the record's fields (project, job number, prepared and
    checked by, revision), the date, then the case file, its hash, the program and the display units."""
    case = res.case
    d = case.display
    fields = record or {}
    return [
        *(((RECORD_LABELS[k],), (v,)) for k, v in fields.items()),
        (("Date",), (date,)),
        (("Case file",), (T(case.source, "json:case_file"),) if case.source else ("(given as text)",)),
        (("Hash of the case file, ", T("SHA-256", "name:SHA-256")), (T(case.sha256, "json:case_sha256"),)),
        (("Program",), (T("stanchion", "json:tool/name"), " version ", T(version(), "json:tool/version"))),
        (("Display units",), (f"lengths in {d.length}, forces in {d.force}, stresses in {d.stress}",)),
    ]


def brief_blocks(res: CaseResults, parts: list[Part]) -> list:
    """The lowest load factor of every plane, and the optional parts this record contains."""
    rows = []
    for i, b in enumerate(res.buckling):
        rows.append(((T(b.axis, f"json:buckling/{i}/axis"),), (q(b.load_factor, f"json:buckling/{i}/load_factors/0"),),
                     ("governs" if b.axis == res.governing_axis else "",)))
    brief: list = [Table((("Plane",), ("Lowest load factor λ",), ("Governing",)), tuple(rows), numeric=(1,),
                         caption=("Elastic critical load factors; the part on buckling gives the effective-length "
                                  "factors.",))]
    from ..io.run_warnings import run_warnings

    for i, w in enumerate(run_warnings(res)):  # boxed in the summary, by level (see fea/notices.py)
        brief.append(Note(("(", T(w["key"], f"json:warnings/{i}/key"), ") ", T(w["text"], f"json:warnings/{i}/text"),
                           "" if w["text"].endswith(("?", ".")) else "."), w["level"]))
    design: Any = res.extras.get("design")
    if design is not None and design.sway:
        brief.append(Para(("Design check (", T(design.standard, "json:design/standard"), "): verdict ",
                           T(design.verdict, "json:design/verdict"), ". ",
                           "" if design.unchecked and all(w.axial_check_enough or w.covered_by for w in design.sway)
                           else _MISSING.get(design.verdict, ""))))
        brief.extend(Para(("Not covered by the checks: ", T(u, f"json:design/unchecked/{i}"), "."))
                     for i, u in enumerate(design.unchecked))
        brief.extend(Para(("Sway sensitivity, ", T(w.axis, f"json:design/sway/{i}/axis"), " axis: α_cr ",
                           q(w.alpha_cr, f"json:design/sway/{i}/alpha_cr", "", 3), ", ",
                           T(w.classification, f"json:design/sway/{i}/classification"), "."))
                     for i, w in enumerate(design.sway))
    extra = [p.title.lower() for p in parts if p.key not in STANDARD_PARTS]
    if extra:
        brief.append(Para(("This record also contains: " + ", ".join(extra) + ".",)))
    return brief


#: What a verdict other than "passes" lacks, in plain words (no numbers: the brief traces every number).
_MISSING = {"not verified": "Missing: a second-order analysis with imperfections and the member check with its "
                            "bending moments, which could not be made for this member (see the design part); the "
                            "axial checks alone do not verify it.",
            "fails": "See the design part and the warnings."}


def caution() -> T:
    """The caution of the tool, shown under the identification rows."""
    return T(CAUTION, "json:cautions/0")


def running_head(res: CaseResults) -> str:
    """The running head of every printed page."""
    return f"{title_of(res).text} · case sha256 {res.case.sha256[:12]}"
