"""The uncertain inputs of a case as sliders: which, their ranges and scales, and typed values.

One :class:`Slider` per input an engineer may doubt: every spring of every
``[[restraint]]`` table (lateral and rotation, free and rigid ones too: their
slider runs from a "free" end through a logarithmic range of stiffnesses to a
"rigid" end), every foundation modulus, every axial load (``[[load]]``,
``[[distributed_load]]``, member forces given per segment), every leaning load
and the bow of the ``[imperfection]`` table.  A slider has :data:`STEPS` + 1
positions; the server turns a position into a value (so that the exact
one-spring study can answer every position from one decomposition) and reads
typed text in the display unit or with its own unit.

Pure: the parsed case in, plain data out.
"""

from __future__ import annotations

import math
import re
from dataclasses import dataclass
from typing import Any

import numpy as np

from ..errors import CaseError
from ..model.case import Case
from ..plot.text import PlotUnits, format_number, stiffness_text, stiffness_unit
from ..study.paths import parse_key
from ..study.sweep import LOG_SPAN_ABOVE, LOG_SPAN_BELOW, reference_stiffness
from ..study.target import StudyCase
from ..units import parse

__all__ = ["Slider", "sliders_of", "STEPS", "BOW_KEY"]

#: Positions of a slider: 0 .. STEPS.
STEPS = 1000
#: The key of the bow of the [imperfection] table (not a key path of the studies: set in the document).
BOW_KEY = "imperfection.bow"
#: A finite stiffness range spans at least this factor either side of the value given.
SPAN_GIVEN = 100.0
#: Linear ranges of loads: 0 to this multiple of the value given.
LOAD_SPAN = 3.0

_NUMBER = re.compile(r"^\s*[-+]?(\d+\.?\d*|\.\d+)([eE][-+]?\d+)?\s*$")
_RATIO = re.compile(r"^\s*(?:L\s*/\s*)?(\d+\.?\d*|\.\d+)([eE][-+]?\d+)?\s*$")


@dataclass(frozen=True)
class Slider:
    """One input the page offers as a slider (values in SI; a bow ratio ``L/n`` as ``n``).

    Attributes
    ----------
    key : the case-file key path, e.g. ``"restraint[3].lateral"``, ``"load[1].axial"``, ``"imperfection.bow"``
    label, where : what it is and where it acts, in words
    group : heading it is listed under
    dimension : key of :data:`fea.units.DIMENSIONS`, or ``"ratio"`` for a bow written ``L/n``
    unit, unit_si : the display unit of its text box and the SI value of one
    scale : ``"log"`` or ``"linear"``
    lo, hi : the finite part of the range (SI)
    free_end, rigid_end : position 0 is zero ("free" for a spring) / position :data:`STEPS` is "rigid" (inf)
    initial : the value in the file (SI; 0 free, inf rigid)
    given : the value as written in the file
    spring : a restraint spring (the one-spring fast path applies)
    offset_note : what the table adds beyond the key's own value (restraining beams), or ""
    """

    key: str
    label: str
    where: str
    group: str
    dimension: str
    unit: str
    unit_si: float
    scale: str
    lo: float
    hi: float
    free_end: bool
    rigid_end: bool
    initial: float
    given: str
    spring: bool = False
    offset_note: str = ""
    #: a stiffness ("lateral", "rotational" or "modulus"): labels take the force prefix that suits the value
    stiffness: str = ""
    units: PlotUnits | None = None

    # -- positions ---------------------------------------------------------------------
    @property
    def _finite_span(self) -> tuple[int, int]:
        return (1 if self.free_end else 0), (STEPS - 1 if self.rigid_end else STEPS)

    def value_at(self, pos: int) -> float:
        """The value at slider position ``pos`` (0 .. STEPS)."""
        if isinstance(pos, bool) or not isinstance(pos, int) or not 0 <= pos <= STEPS:
            raise CaseError(self.key, f"slider position must be a whole number from 0 to {STEPS}, got {pos!r}")
        if self.free_end and pos == 0:
            return 0.0
        if self.rigid_end and pos == STEPS:
            return math.inf
        a, b = self._finite_span
        t = (pos - a) / (b - a)
        if self.scale == "log":
            return float(self.lo * (self.hi / self.lo) ** t)
        return float(self.lo + (self.hi - self.lo) * t)

    def values(self) -> np.ndarray:
        """(STEPS + 1,) the value of every position."""
        return np.array([self.value_at(p) for p in range(STEPS + 1)])

    def position(self, value: float) -> int:
        """The position nearest to ``value``."""
        if math.isinf(value):
            return STEPS
        if value <= 0 and self.free_end:
            return 0
        a, b = self._finite_span
        if self.scale == "log":
            t = math.log(max(value, self.lo * 1e-300) / self.lo) / math.log(self.hi / self.lo)
        else:
            t = (value - self.lo) / (self.hi - self.lo)
        return int(min(max(round(a + t * (b - a)), a), b))

    # -- text ---------------------------------------------------------------------------
    def parse(self, text: object) -> float:
        """A typed value: a number in the display unit, a quantity with its unit, "free" / "rigid" for a
        spring, ``L/n`` or ``n`` for a bow ratio."""
        if not isinstance(text, str) or not text.strip():
            raise CaseError(self.key, f"expected a value such as {self.text(self.initial)!r}, got {text!r}")
        t = text.strip()
        if self.spring and t.lower() in ("free", "rigid"):
            return 0.0 if t.lower() == "free" else math.inf
        if self.dimension == "ratio":
            m = _RATIO.match(t)
            if not m or not float(m.group(0).split("/")[-1]) > 0:
                raise CaseError(self.key, f"{t!r}: expected a bow ratio such as 'L/1000' (or 1000)")
            return float(m.group(0).split("/")[-1])
        value = float(t) * self.unit_si if _NUMBER.match(t) else parse(self.key, t, self.dimension)
        if not math.isfinite(value):
            raise CaseError(self.key, f"{t!r} is not a finite value")
        if value < 0 and self.group != "Loads":
            raise CaseError(self.key, f"{t!r} is negative: expected a value >= 0")
        if value == 0 and self.group == "Imperfection":
            raise CaseError(self.key, f"{t!r}: expected a bow > 0")
        return value

    def number(self, value: float) -> str:
        """The value in the display unit, for the text box (six significant figures; "free" / "rigid")."""
        if self.spring and value == 0:
            return "free"
        if math.isinf(value):
            return "rigid"
        if self.dimension == "ratio":
            return f"{value:.6g}"
        return f"{value / self.unit_si:.6g}"

    def text(self, value: float) -> str:
        """The value with its unit, as a label: ``"120 kN/m"``, ``"free"``, ``"L/1000"``."""
        if self.spring and value == 0:
            return "free"
        if math.isinf(value):
            return "rigid"
        if self.dimension == "ratio":
            return f"L/{format_number(value)}"
        if self.stiffness and self.units is not None and value > 0:
            return stiffness_text(value, self.stiffness, self.units)
        return f"{format_number(value / self.unit_si)} {self.unit}"

    def as_dict(self) -> dict[str, Any]:
        """What the page needs to draw the slider."""
        return {"key": self.key, "label": self.label, "where": self.where, "group": self.group, "unit": self.unit,
                "scale": self.scale, "steps": STEPS, "free_end": self.free_end, "rigid_end": self.rigid_end,
                "low": self.text(0.0) if self.free_end else self.text(self.lo),
                "high": self.text(math.inf) if self.rigid_end else self.text(self.hi),
                "given": self.given, "spring": self.spring,
                "offset_note": self.offset_note}


# -- the sliders of a case ---------------------------------------------------------------------------------------

def _tables(doc, name: str) -> list[dict]:
    v = doc.get(name, [])
    return [v] if isinstance(v, dict) else [t for t in v if isinstance(t, dict)]


def _decades(lo: float, hi: float, unit_si: float) -> tuple[float, float]:
    """``lo`` down and ``hi`` up to whole decades of the display unit."""
    a = 10.0 ** math.floor(math.log10(lo / unit_si) + 1e-9)
    b = 10.0 ** math.ceil(math.log10(hi / unit_si) - 1e-9)
    return a * unit_si, b * unit_si


def _where(t: dict, planes: tuple[str, ...]) -> str:
    at = t.get("at")
    axis = t.get("axis", "both")
    place = f"at {at}" if at is not None else ""
    if len(planes) > 1:
        place += f", {axis} axis" if axis != "both" else ", both axes"
    return place.strip(", ")


def _spring_sliders(study: StudyCase, units: PlotUnits) -> list[Slider]:
    out = []
    case = study.case
    planes = tuple(a for a, _ in case.planes)
    for i, t in enumerate(_tables(case.document, "restraint"), start=1):
        if not case.origins.get(f"restraint[{i}]"):
            continue  # holds nothing in the planes (twist or warping only)
        for kind in ("lateral", "rotation"):
            key = parse_key(f"restraint[{i}].{kind}")
            tg = study.targets(key)[0]
            col = case.column(tg.axis)
            plane_value = getattr(col.restraints[tg.restraint], kind)
            own = plane_value - tg.offset if math.isfinite(plane_value) else math.inf
            if math.isfinite(own) and abs(own) <= 1e-9 * max(abs(plane_value), 1.0):
                own = 0.0  # the beams alone
            ref = reference_stiffness(study, key)
            lo, hi = ref * LOG_SPAN_BELOW, ref * LOG_SPAN_ABOVE
            if 0 < own < math.inf:
                lo, hi = min(lo, own / SPAN_GIVEN), max(hi, own * SPAN_GIVEN)
            what = "lateral" if kind == "lateral" else "rotational"
            unit, unit_si = stiffness_unit(own if 0 < own < math.inf else ref, what, units)
            lo, hi = _decades(lo, hi, unit_si)
            given = t.get(kind, "free")
            note = ""
            if tg.offset:
                note = f"plus the restraining beams' {format_number(tg.offset / unit_si)} {unit}"
            out.append(Slider(key=key.text, label=f"restraint {i} {kind}", where=_where(t, planes),
                              group="Restraints", dimension=key.dimension, unit=unit, unit_si=unit_si, scale="log",
                              lo=lo, hi=hi, free_end=True, rigid_end=True, initial=own,
                              given=str(given), spring=True, offset_note=note, stiffness=what, units=units))
    return out


def _foundation_sliders(study: StudyCase, units: PlotUnits) -> list[Slider]:
    out = []
    planes = tuple(a for a, _ in study.case.planes)
    tables = _tables(study.case.document, "foundation")
    for key in study.foundation_keys():
        t = tables[int(key.parts[0][1] or 1) - 1]
        v = key.parse_value(t[key.leaf], key.text)
        # a modulus of zero (one end of a varying one): the range of the table's other modulus
        other = [key.parse_value(t[k], key.text) for k in ("modulus_bottom", "modulus_top") if k in t]
        scale = v if v > 0 else max(other + [0.0])
        if not scale > 0:
            continue
        unit, unit_si = stiffness_unit(scale, "modulus", units)
        lo, hi = _decades(scale / SPAN_GIVEN, scale * SPAN_GIVEN, unit_si)
        n = key.parts[0][1]
        what = {"modulus": "modulus", "modulus_bottom": "modulus at bottom", "modulus_top": "modulus at top"}
        span = f"{t.get('from', 'base')} to {t.get('to', 'top')}"
        axis = t.get("axis", "both")
        where = span + (f", {axis} axis" if len(planes) > 1 and axis != "both" else "")
        out.append(Slider(key=key.text, label=f"foundation {n} {what[key.leaf]}", where=where, group="Foundations",
                          dimension=key.dimension, unit=unit, unit_si=unit_si, scale="log", lo=lo, hi=hi,
                          free_end=True, rigid_end=False, initial=v, given=str(t[key.leaf]), stiffness="modulus",
                          units=units))
    return out


def _linear(key_text: str, label: str, where: str, value: float, given: str, dimension: str, unit: str,
            unit_si: float) -> Slider:
    lo, hi = sorted((0.0, LOAD_SPAN * value))
    return Slider(key=key_text, label=label, where=where, group="Loads", dimension=dimension, unit=unit,
                  unit_si=unit_si, scale="linear", lo=lo, hi=hi, free_end=False, rigid_end=False, initial=value,
                  given=given)


def _load_sliders(case: Case) -> list[Slider]:
    d = case.display
    doc = case.document
    planes = tuple(a for a, _ in case.planes)
    out = []
    for name, leaf, label, dim in (("load", "axial", "axial load", "force"),
                                   ("distributed_load", "axial", "distributed axial load", "force per length"),
                                   ("segment", "axial_force", "member force", "force"),
                                   ("leaning", "load", "leaning load", "force")):
        unit, unit_si = (d.force, d.force_si) if dim == "force" else (d.line_load, d.force_si / d.length_si)
        for i, t in enumerate(_tables(doc, name), start=1):
            if leaf not in t:
                continue
            key = parse_key(f"{name}[{i}].{leaf}")
            v = key.parse_value(t[leaf], key.text)
            if v == 0:
                continue
            if name == "segment":
                where = f"segment {i} '{t.get('name', i)}'"
            elif name == "distributed_load":
                where = f"{t.get('from', 'base')} to {t.get('to', 'top')}"
            else:
                where = f"at {t.get('at')}"
                if name == "leaning" and len(planes) > 1:
                    where += f", {t.get('axis', 'both')} axis" if t.get("axis", "both") != "both" else ", both axes"
            if t.get("permanent"):
                where += ", permanent"
            out.append(_linear(key.text, f"{label} {i}", where, v, str(t[leaf]), dim, unit, unit_si))
    return out


def _bow_slider(case: Case) -> list[Slider]:
    t = case.document.get("imperfection")
    if not isinstance(t, dict) or "bow" not in t or t.get("shape") == "offsets":
        return []
    bow = t["bow"]
    shape = t.get("shape", "half-sine")
    m = re.match(r"^\s*L\s*/\s*(.+)$", bow) if isinstance(bow, str) else None
    if m:
        n = float(m.group(1))
        return [Slider(key=BOW_KEY, label="imperfection bow", where=f"{shape}, as a fraction of the length",
                       group="Imperfection", dimension="ratio", unit="L/", unit_si=1.0, scale="log",
                       lo=min(100.0, n / 10), hi=max(10000.0, n * 10), free_end=False, rigid_end=False, initial=n,
                       given=str(bow))]
    v = parse(BOW_KEY, bow, "length")
    metric = case.display.length in ("m", "cm", "mm")
    unit, unit_si = ("mm", 1e-3) if metric else ("in", 0.0254)
    lo, hi = _decades(v / 10, v * 10, unit_si)
    return [Slider(key=BOW_KEY, label="imperfection bow", where=shape, group="Imperfection", dimension="length",
                   unit=unit, unit_si=unit_si, scale="log", lo=lo, hi=hi, free_end=False, rigid_end=False,
                   initial=v, given=str(bow))]


def sliders_of(study: StudyCase) -> tuple[Slider, ...]:
    """Every slider of the case, grouped: restraints, foundations, loads, imperfection."""
    d = study.case.display
    units = PlotUnits(d.length, d.length_si, d.force, d.force_si)
    return tuple(_spring_sliders(study, units) + _foundation_sliders(study, units) + _load_sliders(study.case)
                 + _bow_slider(study.case))
