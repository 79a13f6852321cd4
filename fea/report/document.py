"""The report as a small document tree, rendered to HTML or Markdown.

Every number in a report is a :class:`Q`: a display value that remembers
where it came from (``src``) and the unit it is shown in, so that the HTML
carries ``data-src`` / ``data-u`` attributes a test can check against the JSON
result and the case.  Text taken from results or the case (notes, messages,
hashes, version) is a :class:`T` with its source too.  Plain ``str`` pieces
are the report's own prose and carry no numbers.

Sources
-------
``json:a/b/0/c``
    the path of the value in the JSON result of the run (:func:`fea.pipeline.result_json`),
    keys and list indices joined by ``/``; the report reads the value from the result
    object the JSON is written from.
``case:planes/0/1/restraints/2/lateral``
    an attribute path into the :class:`~fea.model.case.Case` (inputs as read).
``run:warnings/0``
    a warning raised while the case was run.
``report:date``
    the date printed on the record when it is not the case's ``[record] date``
    (the ``--date`` option, or the day the report was written).
``report:project`` (``job``, ``prepared_by``, ``checked_by``, ``revision``)
    an identification field given to the report (the command's options); a field
    of the case's ``[record]`` table is ``case:extras/record/project``.
``file:case``
    the text of the case file, verbatim (its SHA-256 is the one in the
    identification rows), printed in the appendix.
``name:M1``
    a published name or symbol that contains digits, printed as it is (the hash
    algorithm, the subscripts of the partial factors of EN 1993-1-1 6.1).
``const:AISC 360 E3``
    a constant of a published formula (0.658, 0.877, 2.25 here), shown where the
    formula is written out; the part after ``const:`` names the formula.
"""

from __future__ import annotations

import math
from dataclasses import dataclass, field
from typing import Union

from ..units import to_display

__all__ = ["Q", "T", "Em", "Sub", "Sup", "Inline", "Heading", "Para", "Table", "Figure", "Bullets", "Note",
           "CalcLine", "Calc", "Pre", "Part", "fmt_number", "convert", "unit_label", "q"]

_SUP = str.maketrans("0123456789-", "⁰¹²³⁴⁵⁶⁷⁸⁹⁻")
MINUS = "\u2212"


THIN = "\u2009"


def _group(s: str) -> str:
    """Thin-space thousands grouping of the integer part when it has five or more digits."""
    whole, dot, frac = s.partition(".")
    if len(whole) < 5:
        return s
    head = len(whole) % 3 or 3
    groups = [whole[:head]] + [whole[i:i + 3] for i in range(head, len(whole), 3)]
    return THIN.join(groups) + dot + frac


def fmt_number(x: float | None, sig: int = 4) -> str:
    """``x`` with ``sig`` significant figures; ``m × 10ⁿ`` outside 0.001 to 10⁶; a minus sign, not a hyphen;
    thin-space thousands grouping from 10 000; whole numbers (``int``) exactly."""
    if x is None or (isinstance(x, float) and not math.isfinite(x)):
        return "—"
    if isinstance(x, int) and not isinstance(x, bool):
        return _group(str(abs(x))) if x >= 0 else MINUS + _group(str(abs(x)))
    x = float(x)
    if x == 0:
        return "0"
    a = abs(x)
    if 1e-3 <= a < 1e6:
        digits = max(0, sig - 1 - int(math.floor(math.log10(a))))
        s = f"{a:.{digits}f}"
        if float(s) >= 1e6:  # rounding carried it over
            return fmt_number(math.copysign(float(s), x), sig)
        s = _group(s)
    else:
        mant, exp = f"{a:.{sig - 1}e}".split("e")
        s = f"{mant} × 10{str(int(exp)).translate(_SUP)}"
    return (MINUS + s) if x < 0 else s


def convert(value_si: float, unit: str) -> float:
    """SI value -> display unit (a pint unit string, ``"%"`` for a fraction, ``""`` for none)."""
    if unit == "":
        return value_si
    if unit == "%":
        return 100.0 * value_si
    return to_display(value_si, unit)


def unit_label(unit: str) -> str:
    """Typographic label of a pint unit string: ``kN*m/rad`` -> ``kN·m/rad``, ``cm^4`` -> ``cm⁴``."""
    return unit.replace("*", "·").replace("^2", "²").replace("^3", "³").replace("^4", "⁴")


@dataclass(frozen=True)
class Q:
    """A number shown in the report.

    Attributes
    ----------
    value : the value in the display unit
    src : where the SI value comes from (see the module notes)
    unit : pint unit string of ``value`` ("" dimensionless, "%" percent)
    sig : significant figures shown
    """

    value: float | None
    src: str
    unit: str = ""
    sig: int = 4

    @property
    def text(self) -> str:
        return fmt_number(self.value, self.sig)


def q(value_si: float | None, src: str, unit: str = "", sig: int = 4) -> Q:
    """A :class:`Q` from an SI value (``None`` shows as a dash)."""
    return Q(None if value_si is None else convert(float(value_si), unit), src, unit, sig)


@dataclass(frozen=True)
class T:
    """Text taken from a result or the case, shown verbatim, with its source."""

    text: str
    src: str


@dataclass(frozen=True)
class Em:
    """Emphasised (italic) prose: symbols such as N_cr or λ."""

    text: str


@dataclass(frozen=True)
class Sub:
    """A subscript in prose: the "cr" of N_cr (a :class:`T` when it holds digits, e.g. the "M1" of γ_M1)."""

    text: Union[str, "T"]


@dataclass(frozen=True)
class Sup:
    """A superscript: the parts of an exponent, e.g. of 0.658^(Fy/Fe)."""

    parts: tuple


Inline = Union[str, Q, T, Em, Sub, Sup]


@dataclass(frozen=True)
class Heading:
    """A heading; its text is the report's own (``str``) or a JSON key (:class:`T`)."""

    level: int
    text: Union[str, "T"]


@dataclass(frozen=True)
class Para:
    parts: tuple


@dataclass(frozen=True)
class Table:
    """A table; ``numeric`` marks columns set right-aligned with tabular figures; ``strong`` lists the
    indices of rows set in bold (the governing case)."""

    header: tuple
    rows: tuple
    caption: tuple = ()
    numeric: tuple = ()
    strong: tuple = ()


@dataclass(frozen=True)
class Figure:
    """An inline SVG figure; ``name`` is the file stem used beside a Markdown report."""

    svg: str
    caption: tuple
    name: str


@dataclass(frozen=True)
class Bullets:
    items: tuple


@dataclass(frozen=True)
class Note:
    """A boxed note (``kind``: "caution", "warning" or "check"; see :data:`NOTE_LABELS`)."""

    parts: tuple
    kind: str = "caution"


#: The label each kind of note opens with (a warning's level is its kind: see fea/notices.py).
NOTE_LABELS = {"caution": "Caution.", "warning": "Warning.", "check": "Check."}


@dataclass(frozen=True)
class CalcLine:
    """One line of a written-out calculation: ``lhs`` = ``rhs`` (formula, numbers, result), then a remark.

    ``key`` sets the line in bold (the verdict of a check)."""

    lhs: tuple
    rhs: tuple
    remark: tuple = ()
    key: bool = False


@dataclass(frozen=True)
class Calc:
    """A written-out calculation under its own numbered heading, as on a calculation sheet.

    ``highlight`` marks the governing check (a rule beside the block and a label)."""

    title: tuple
    lines: tuple
    notes: tuple = ()
    highlight: bool = False


@dataclass(frozen=True)
class Pre:
    """Preformatted text shown verbatim, line for line, in a monospaced face (the case file in the appendix)."""

    text: T


@dataclass(frozen=True)
class Part:
    """A top-level part of the report; parts start on a new printed page."""

    key: str
    title: str
    blocks: list = field(default_factory=list)
