"""Plausibility of a case: inputs that parse and solve but look like a slip (pure functions, SI in).

:func:`case_notices` looks at the parsed case before solving (Young's modulus against the stated
material and against the yield strength, the yield strength itself, stations a hair apart);
:func:`result_notices` looks at the results (slenderness K L / r of the compression segments, a
lowest load factor so high that the loads are probably in the wrong unit).  Each finding is a
:class:`~fea.notices.Notice` of level "check": one plain sentence naming the input, in MPa / GPa,
mm, m and kN.

Nothing here is an error: the values an analysis cannot be meant with at all (E <= 0, fy <= 0, a
negative spring, a height off the column) are refused when the case is read.  These checks only flag
what a person should look at.

The limits
----------
* Young's modulus of the stated material: the ranges of :data:`MATERIALS` (common practice; the typical
  values are from memory of EN 1993-1-1 3.2.6, EN 1999-1-1 3.2.5, EN 338 Table 1, EN 1992-1-1 Table 3.1).
  A material the name does not identify gets the wide range :data:`ANY_MATERIAL`.
* E below ``100 fy`` (:data:`MIN_E_OVER_FY`): a yield strain above 1 %, beyond any structural metal
  (structural steel about 0.17 %, high-strength wire about 0.9 %; common practice).
* fy above 2 GPa (:data:`MAX_FY`), or below 10 MPa for a metal or an unknown material (:data:`MIN_FY_METAL`).
* K L / r above 200 (:data:`SLENDERNESS_LIMIT`): the AISC 360 user note to E2 (from memory) and common
  practice for members in compression.
* A lowest load factor above 10,000 (:data:`MAX_LOAD_FACTOR`): loads in N meant as kN give factors 1,000
  times too high.
* Two stations closer than 1 mm or 1e-4 of the column height (:func:`station_gap`): one height typed for
  another.
"""

from __future__ import annotations

import math
import re
from dataclasses import dataclass
from typing import TYPE_CHECKING, Any, Mapping

from ..notices import Notice
from .column import STATION_TOL

if TYPE_CHECKING:
    from ..results import CaseResults
    from .case import Case

__all__ = ["Material", "MATERIALS", "ANY_MATERIAL", "MIN_E_OVER_FY", "MAX_FY", "MIN_FY_METAL", "MIN_FY_OTHER",
           "SLENDERNESS_LIMIT", "MAX_LOAD_FACTOR", "STATION_GAP", "STATION_GAP_SHARE", "MAX_STATION_NOTICES",
           "material_of", "station_gap", "case_notices", "result_notices", "modulus_notices", "yield_notices",
           "station_notices", "slenderness_notices", "load_factor_notices"]

GPa = 1e9
MPa = 1e6


@dataclass(frozen=True)
class Material:
    """A material family: the plausible range of E [Pa] and the typical values as a person says them."""

    name: str
    E_low: float
    E_high: float
    typical: str
    metal: bool


#: Material families, in the order their names are looked for (common practice; typical values from memory).
MATERIALS: tuple[Material, ...] = (
    # EN 1992-1-1 Table 3.1: Ecm from 27 GPa (C12/15) to 44 GPa (C90/105); lightweight concrete lower
    Material("concrete", 10 * GPa, 55 * GPa, "about 27-44 GPa", metal=False),
    # EN 338 Table 1: E0,mean from 7 GPa (C14) to 20 GPa (D70); E0,05 down to about 4.7 GPa; glulam 8-14 GPa
    Material("timber", 3 * GPa, 25 * GPa, "about 7-20 GPa", metal=False),
    # EN 1999-1-1 3.2.5: E = 70 GPa
    Material("aluminium", 60 * GPa, 80 * GPa, "about 70 GPa", metal=True),
    # EN 1993-1-1 3.2.6: E = 210 GPa; AISC 360: 200 GPa (29,000 ksi); stainless steels about 190-200 GPa
    Material("steel", 170 * GPa, 230 * GPa, "about 200-210 GPa", metal=True),
    # cast and ductile irons about 100-170 GPa, wrought iron about 190 GPa
    Material("iron", 70 * GPa, 220 * GPa, "about 100-200 GPa", metal=True),
    # titanium alloys about 105-120 GPa
    Material("titanium", 90 * GPa, 130 * GPa, "about 105-120 GPa", metal=True),
)

#: A material the name does not identify: from soft plastics (about 1 GPa) to diamond (about 1,100 GPa).
ANY_MATERIAL = Material("", 1 * GPa, 1200 * GPa, "steel: about 200-210 GPa", metal=True)

#: Words (whole words, lower case) naming each family, looked for before the grade codes.
_WORDS: dict[str, tuple[str, ...]] = {
    "concrete": ("concrete", "reinforced concrete", "precast"),
    "timber": ("timber", "wood", "wooden", "softwood", "hardwood", "glulam", "lvl", "clt", "spruce", "pine", "fir",
               "larch", "oak", "douglas", "lumber"),
    "aluminium": ("aluminium", "aluminum", "alu"),
    "steel": ("steel", "stainless", "steelwork"),
    "iron": ("iron",),
    "titanium": ("titanium",),
}

#: Grade codes: S355 / A992 / Q355 / SS400 steel, C30/37 concrete, C24 / D30 / GL24h timber, 6082 aluminium.
_GRADES: tuple[tuple[str, re.Pattern[str]], ...] = (
    ("concrete", re.compile(r"\bl?c\d{2,3}/\d{2,3}\b")),
    ("steel", re.compile(r"\b(s\d{3}[a-z0-9]*|a(36|500|572|588|992|1085)|q\d{3}[a-z]?|ss\d{3}|sm\d{3}[a-z]?|"
                         r"grade ?(43|50|55)[a-z]?)\b")),
    ("timber", re.compile(r"\b(c\d{2}|d\d{2}|gl\d{2}[a-z]?|t\d{2})\b")),
    ("aluminium", re.compile(r"\b(en ?aw|[1-7]\d{3}-t\d+|6061|6063|6082|6005a?|5083|7020|7075|2024)\b")),
)

#: E below this multiple of fy is a yield strain above 1 %: no structural material (common practice).
MIN_E_OVER_FY = 100.0
#: A yield strength above this is beyond structural materials (the strongest wire is about 1.9 GPa).
MAX_FY = 2 * GPa
#: A metal's (or an unidentified material's) yield strength below this is a unit slip.
MIN_FY_METAL = 10 * MPa
#: The same for timber and concrete (their strengths start at a few MPa).
MIN_FY_OTHER = 1 * MPa

#: K L / r above this: AISC 360 user note to E2 (from memory); common practice for compression members.
SLENDERNESS_LIMIT = 200.0
#: A lowest load factor above this suggests loads in the wrong unit (N for kN gives factors 1,000 too high).
MAX_LOAD_FACTOR = 10_000.0

#: Two stations closer than this [m] ...
STATION_GAP = 1e-3
#: ... or than this share of the column height are probably one height typed for another.
STATION_GAP_SHARE = 1e-4
#: At most this many close pairs are named one by one; the rest are counted in one more notice.
MAX_STATION_NOTICES = 10
#: The absolute gap never exceeds this share of the height (a small test piece may have stations 1 mm apart).
_STATION_GAP_CAP = 1e-2


# ---------------------------------------------------------------------------
# formatting: readable units, no SI exponents


def _num(x: float, digits: int = 4) -> str:
    """``x`` with ``digits`` significant figures, without an exponent between 1e-4 and 1e9."""
    if x == 0 or not math.isfinite(x):
        return f"{x:g}"
    if 1e-4 <= abs(x) < 1e9:
        d = max(digits - 1 - math.floor(math.log10(abs(x))), 0)
        text = f"{round(x, d):.{d}f}"
        return text.rstrip("0").rstrip(".") if "." in text else text
    return f"{x:.{digits}g}"


def _stress(v: float) -> str:
    """A modulus: GPa from 1 GPa up, else MPa."""
    return f"{_num(v / GPa)} GPa" if abs(v) >= GPa else f"{_num(v / MPa)} MPa"


def _strength(v: float) -> str:
    """A strength: always MPa, as strengths are written."""
    return f"{_num(v / MPa)} MPa"


def _height(x: float) -> str:
    return f"{_num(x, 7)} m"


def _gap(d: float) -> str:
    return f"{_num(d * 1e3, 3)} mm"


def _force(P: float) -> str:
    return f"{_num(P / 1e3)} kN" if abs(P) >= 1e3 else f"{_num(P)} N"


# ---------------------------------------------------------------------------
# the material


def material_of(name: str) -> Material:
    """The family a material name states ("S355 steel", "C24 timber", "aluminium 6082", "C30/37"), else
    :data:`ANY_MATERIAL`."""
    text = " ".join(re.split(r"[\s,;()_\-]+", name.lower()))
    by_name = {m.name: m for m in MATERIALS}
    words = set(text.split())
    for family, names in _WORDS.items():
        if any((" " in w and w in text) or w in words for w in names):
            return by_name[family]
    raw = name.lower()
    for family, pattern in _GRADES:
        if pattern.search(raw):
            return by_name[family]
    return ANY_MATERIAL


def _doc_tables(doc: Mapping[str, Any], key: str) -> list[Mapping[str, Any]]:
    value = doc.get(key, [])
    if isinstance(value, Mapping):
        return [value]
    return [t for t in value if isinstance(t, Mapping)] if isinstance(value, list) else []


class _Segments:
    """The ``[[segment]]`` tables of the case document, read once."""

    def __init__(self, doc: Mapping[str, Any]) -> None:
        self.tables = _doc_tables(doc, "segment")

    def label(self, i: int) -> str:
        """``segment[2] ('upper')`` (the name only when the file gives one); ``i`` counts from 0."""
        name = self.tables[i].get("name") if i < len(self.tables) else None
        return f"segment[{i + 1}] ({name!r})" if isinstance(name, str) and name else f"segment[{i + 1}]"

    def gives(self, i: int, key: str) -> bool:
        """Whether segment ``i`` (from 0) gives ``key`` itself (else it comes from [material])."""
        return i < len(self.tables) and key in self.tables[i]


def _slip_hint(E: float, mat: Material) -> str:
    """"did you mean ...?" when the same number with the next unit up or down is plausible."""
    for factor, unit in ((1e3, "GPa"), (1e-3, "MPa")):
        if mat.E_low <= E * factor <= mat.E_high:
            shown = _num(E / MPa) if unit == "GPa" else _num(E / GPa)
            return f"; did you mean {shown} {unit}?"
    return ""


def _modulus_text(who: str, E: float, fy: float | None, mat: Material) -> str | None:
    family = mat.name or "any structural material"
    typical = f"{mat.name}: {mat.typical}" if mat.name else mat.typical
    hint = _slip_hint(E, mat)
    if fy is not None and E < MIN_E_OVER_FY * fy:
        return (f"{who}: E = {_stress(E)} is below 100 x fy ({_strength(fy)}): a unit slip? "
                f"({typical}{hint})")
    if not mat.E_low <= E <= mat.E_high:
        side = "below" if E < mat.E_low else "above"
        return (f"{who}: E = {_stress(E)} is {side} the plausible range of {family} "
                f"({_stress(mat.E_low)} to {_stress(mat.E_high)}): a unit slip? ({typical}{hint})")
    return None


def modulus_notices(case: Case) -> list[Notice]:
    """Young's modulus of every segment (and of restraining beams that give their own) against the stated
    material's range and against ``100 fy``; one notice per input that gives the value."""
    mat = material_of(str(case.material.get("name", "")))
    doc = case.document
    segs = _Segments(doc)
    col = case.planes[0][1]
    out: list[Notice] = []
    seen: set[str] = set()
    for i, (seg, info) in enumerate(zip(col.segments, case.segments)):
        own = segs.gives(i, "E") or segs.gives(i, "fy")
        who = segs.label(i) if own else "[material]"
        text = _modulus_text(who, seg.E, info.fy, mat)
        if text is not None and text not in seen:
            seen.add(text)
            out.append(Notice("modulus-implausible", text))
    for k, t in enumerate(_doc_tables(doc, "restraint")):
        beams = t.get("beam", [])
        for j, b in enumerate([beams] if isinstance(beams, Mapping) else beams if isinstance(beams, list) else []):
            if isinstance(b, Mapping) and "E" in b:
                E = _parse_stress(b["E"])
                text = None if E is None else _modulus_text(f"restraint[{k + 1}].beam[{j + 1}]", E, None, mat)
                if text is not None:
                    out.append(Notice("modulus-implausible", text))
    return out


def _parse_stress(value: Any) -> float | None:
    from ..units import parse

    try:
        return parse("E", value, "stress")
    except ValueError:  # pragma: no cover - the case was read with the same value
        return None


def yield_notices(case: Case) -> list[Notice]:
    """Yield strengths above 2 GPa, or below 10 MPa for a metal (1 MPa for timber and concrete)."""
    mat = material_of(str(case.material.get("name", "")))
    low = MIN_FY_METAL if mat.metal else MIN_FY_OTHER
    segs = _Segments(case.document)
    out: list[Notice] = []
    seen: set[str] = set()
    for i, info in enumerate(case.segments):
        fy = info.fy
        if fy is None:
            continue
        who = segs.label(i) if segs.gives(i, "fy") else "[material]"
        if fy > MAX_FY:
            tenth = fy / 10  # one zero too many, as in 3550 MPa for 355 MPa
            hint = f"; did you mean {_strength(tenth)}?" if 100 * MPa <= tenth <= MAX_FY else ""
            text = (f"{who}: fy = {_strength(fy)} is above {_strength(MAX_FY)}, beyond structural materials: "
                    f"a unit slip? (steel: about 235-460 MPa{hint})")
        elif fy < low:
            what = f"for {mat.name}" if mat.name else "for a metal"
            text = (f"{who}: fy = {_strength(fy)} is below {_strength(low)}, implausibly low {what}: a unit slip? "
                    f"(steel: about 235-460 MPa)")
        else:
            continue
        if text not in seen:
            seen.add(text)
            out.append(Notice("yield-strength-implausible", text))
    return out


# ---------------------------------------------------------------------------
# stations


def station_gap(height: float) -> float:
    """Stations closer than this [m] on a column of ``height`` [m] are flagged: 1 mm or 1e-4 of the height,
    whichever is larger (the 1 mm never more than 1 % of the height)."""
    return max(STATION_GAP_SHARE * height, min(STATION_GAP, _STATION_GAP_CAP * height))


@dataclass(frozen=True)
class _Station:
    x: float
    label: str        # how the sentence names it: "restraint[3].at", "the joint of segment[1] and segment[2]"
    what: str         # what is there, for the other side: "segment joint", "restraint[3].at"
    joint: bool       # a joint of the segments, or an end given as the word "base" / "top"


def _stations(case: Case) -> list[_Station]:
    """Every height an input puts on the column, with the input that puts it there (document order)."""
    segs = _Segments(case.document)
    out: list[_Station] = []
    H = case.height
    out.append(_Station(0.0, "the base", "base", True))
    for i, info in enumerate(case.segments[:-1]):
        out.append(_Station(info.top, f"the joint of {segs.label(i)} and {segs.label(i + 1)}", "segment joint", True))
    out.append(_Station(H, "the top", "top", True))
    fields = {"restraints": (("at", "at"),), "point_loads": (("at", "at"),), "leaning_loads": (("at", "at"),),
              "distributed_loads": (("bottom", "from"), ("top", "to")),
              "foundations": (("bottom", "from"), ("top", "to"))}
    for table, refs in case.origins.items():
        if not refs or refs[0].kind not in fields:
            continue
        obj = getattr(case.column(refs[0].axis), refs[0].kind)[refs[0].index]
        raw = _input_table(case.document, table)
        for attr, key in fields[refs[0].kind]:
            label = f"{table}.{key}"
            # "base" or "top" (written, or a range's default) is the end itself, not a height typed
            word = key in ("from", "to") and key not in raw or _is_end_word(raw.get(key))
            out.append(_Station(float(getattr(obj, attr)), label, label, word))
    return out


def _input_table(doc: Mapping[str, Any], table: str) -> Mapping[str, Any]:
    """The input table ``"restraint[2]"`` of the document (empty when it cannot be found)."""
    m = re.fullmatch(r"([a-z_]+)\[(\d+)\]", table)
    if m is None:
        return {}
    tables = _doc_tables(doc, m.group(1))
    i = int(m.group(2)) - 1
    return tables[i] if 0 <= i < len(tables) else {}


def _is_end_word(value: Any) -> bool:
    return isinstance(value, str) and value.strip().lower() in ("base", "top")


def _roundness(x: float) -> float:
    """The largest step of 10 (10 m down to 1 um) ``x`` [m] is a whole multiple of: 2 m -> 1, 1.999 m -> 1e-3."""
    for k in range(1, -7, -1):
        step = 10.0 ** k
        if abs(x / step - round(x / step)) < 1e-6:
            return step
    return 0.0


def _rank(group: list[_Station]) -> tuple[float, bool]:
    """Which of two close heights was meant: the rounder one; on a tie the one at a joint or an end word."""
    return _roundness(group[0].x), any(s.joint for s in group)


def station_notices(case: Case) -> list[Notice]:
    """Pairs of distinct stations at most :func:`station_gap` apart, each with a "did you mean" the rounder height.

    Two joints of the segments are not a pair: a short segment is typed as its length.
    """
    H = case.height
    gap = station_gap(H)
    same = STATION_TOL * H
    stations = sorted(_stations(case), key=lambda s: s.x)
    groups: list[list[_Station]] = []
    for s in stations:
        if groups and s.x - groups[-1][0].x <= same:
            groups[-1].append(s)
        else:
            groups.append([s])
    out: list[Notice] = []
    for lo, hi in zip(groups, groups[1:]):
        d = hi[0].x - lo[0].x
        if d > gap * (1 + 1e-9):  # 1.999 m beside 2 m is 1 mm apart, give or take round-off
            continue
        if all(s.joint for s in lo + hi):  # a short segment: its length is typed as such, not one height for another
            continue
        meant, slip = (lo, hi) if _rank(lo) >= _rank(hi) else (hi, lo)
        slipped = next((s for s in slip if not s.joint), next((s for s in slip if s.label.startswith("the ")), slip[0]))
        other = next((s for s in meant if s.joint), meant[0])
        x_slip, x_meant = slipped.x, other.x
        if slipped.joint:
            head = f"{slipped.label} is at {_height(x_slip)}"
        else:
            head = f"{slipped.label} = {_height(x_slip)} is"
        text = (f"{head}{',' if slipped.joint else ''} {_gap(d)} from the station at {_height(x_meant)} "
                f"({other.what}): did you mean {_height(x_meant)}?")
        out.append(Notice("stations-very-close", text))
    if len(out) > MAX_STATION_NOTICES:
        more = len(out) - MAX_STATION_NOTICES
        out = out[:MAX_STATION_NOTICES] + [Notice("stations-very-close", f"{more} more pairs of stations are within "
                                                  f"{_gap(gap)} of each other (the first {MAX_STATION_NOTICES} above)")]
    return out


def case_notices(case: Case) -> list[Notice]:
    """Plausibility of a parsed case before solving: E, fy and the stations (level "check", in input order)."""
    return modulus_notices(case) + yield_notices(case) + station_notices(case)


# ---------------------------------------------------------------------------
# after solving


def _radius(I: float, A: float) -> float:
    return math.sqrt(I / A)


#: What the default limit is.
SLENDERNESS_SOURCE = "the usual limit for members in compression (AISC 360 E2 user note, from memory; common practice)"


def slenderness_notices(res: CaseResults, limit: float = SLENDERNESS_LIMIT,
                        source: str = SLENDERNESS_SOURCE) -> list[Notice]:
    """K L / r above ``limit`` for each segment in compression whose K is meaningful and whose area is known.

    r = sqrt(I / A) of the plane, with the I the K was computed with (the larger end value of a taper).  A plane
    whose lowest load factor is below 1 is left out: it buckles under the case loads, which its own warning
    ("buckles-under-case-loads") already says more strongly.
    """
    case = res.case
    segs = _Segments(case.document)
    out: list[Notice] = []
    for plane in res.buckling:
        if not plane.load_factor >= 1.0:
            continue
        col = case.column(plane.axis)
        for sb in plane.segments:
            K = sb.effective_length_factor
            if K is None or not sb.meaningful or not sb.critical_axial_force > 0 or not math.isfinite(K):
                continue
            A = col.segments[sb.index].A
            if A is None and sb.index < len(case.segments):
                A = case.segments[sb.index].A
            if A is None or not A > 0:
                continue
            r = _radius(sb.I_ref, A)
            ratio = K * sb.length / r
            if ratio > limit:
                where = f", {plane.axis} plane" if plane.axis and plane.axis != "in-plane" else ""
                text = (f"{segs.label(sb.index)}{where}: K L / r = {_num(ratio, 3)} (K = {_num(K, 3)}, "
                        f"L = {_height(sb.length)}, r = {_num(r * 1e3, 3)} mm) is above {_num(limit)}, {source}")
                out.append(Notice("slenderness-over-limit", text, plane.axis))
    return out


def load_factor_notices(res: CaseResults) -> list[Notice]:
    """One notice when the case's lowest load factor is above :data:`MAX_LOAD_FACTOR`."""
    gov = res.governing
    lf = gov.load_factor
    if not (math.isfinite(lf) and lf > MAX_LOAD_FACTOR):
        return []
    col = res.case.column(gov.axis)
    loads = [abs(p.P) for p in col.point_loads] + [abs(d.q) * (d.top - d.bottom) for d in col.distributed_loads]
    total = max(float(col.axial_force(0.0)), max(loads, default=0.0))
    where = f" ({gov.axis} plane)" if gov.axis and gov.axis != "in-plane" else ""
    text = (f"the lowest load factor{where} is {_num(lf, 3)}, above {_num(MAX_LOAD_FACTOR)}, with an axial force of "
            f"{_force(total)} at the base: are the loads in the wrong unit (N for kN)?")
    return [Notice("load-factor-very-high", text, gov.axis)]


def result_notices(res: CaseResults, slenderness_limit: float = SLENDERNESS_LIMIT,
                   slenderness_source: str = SLENDERNESS_SOURCE) -> list[Notice]:
    """Plausibility of the results: K L / r of the compression segments, a very high lowest load factor."""
    return slenderness_notices(res, slenderness_limit, slenderness_source) + load_factor_notices(res)
