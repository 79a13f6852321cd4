"""Numbers, display units and label text of the column figures.

One number format for every figure that draws the column (mode figures, the
report's sketch): :func:`format_number`.  Text is measured with matplotlib's
font machinery, imported only when a width is asked for.
"""

from __future__ import annotations

import math
from dataclasses import dataclass

from ..errors import ModelError
from ..model import Column, Restraint

__all__ = ["format_number", "format_load_factor", "text_width", "text_height", "PlotUnits", "stiffness_unit",
           "stiffness_text", "inertia_texts", "found_text", "load_text", "dist_text", "lean_text", "spring_text"]

_SUPERSCRIPT = str.maketrans("-0123456789", "⁻⁰¹²³⁴⁵⁶⁷⁸⁹")


def format_number(value: float, digits: int = 4) -> str:
    """A number with ``digits`` significant figures, plain for 1e-3..1e6, else ``a·10ⁿ``.

    Trailing zeros are dropped and a minus sign (not a hyphen) is used:
    ``format_number(2.0e6) == "2·10⁶"``, ``format_number(-0.5) == "−0.5"``.
    """
    v = float(value)
    if v == 0.0 or not math.isfinite(v):
        return "0" if v == 0.0 else str(v)
    a = abs(v)
    if 1e-3 <= a < 1e6:
        decimals = max(0, digits - 1 - int(math.floor(math.log10(a))))
        text = f"{v:.{decimals}f}"
        if "." in text:
            text = text.rstrip("0").rstrip(".")
        return text.replace("-", "−")
    mant, exp = f"{v:.{digits - 1}e}".split("e")
    mant = mant.rstrip("0").rstrip(".")
    return f"{mant}·10{str(int(exp)).translate(_SUPERSCRIPT)}".replace("-", "−", 1)


def format_load_factor(value: float) -> str:
    """The text used for a load factor in panel titles (4 significant figures).

    Parameters
    ----------
    value : float
        Load factor.

    Returns
    -------
    str
        E.g. ``"12.39"``, ``"0.8513"``, ``"2.1·10⁶"``.
    """
    return format_number(value, 4)


def text_width(text: str, size: float) -> float:
    """Width of ``text`` at ``size`` pt in the default font, widest line [pt]."""
    from matplotlib.textpath import TextPath

    widths = []
    for line in text.split("\n"):
        try:
            widths.append(TextPath((0.0, 0.0), line, size=size).get_extents().width if line.strip() else 0.0)
        except Exception:  # pragma: no cover - font trouble: fall back to an estimate
            widths.append(len(line) * 0.6 * size)
    return max(widths) * 1.04 + 1.0


def text_height(text: str, size: float) -> float:
    """Height of ``text`` at ``size`` pt, all its lines [pt]."""
    return (text.count("\n") + 1) * 1.22 * size


@dataclass(frozen=True)
class PlotUnits:
    """Display units of a figure: label and SI value of one unit, for lengths and forces."""

    length: str
    length_si: float
    force: str
    force_si: float

    @classmethod
    def make(cls, length_unit, force_unit) -> "PlotUnits":
        """From ``(label, SI value of one unit)`` pairs, e.g. ``("mm", 1e-3)`` and ``("kN", 1e3)``."""
        for name, u in (("length_unit", length_unit), ("force_unit", force_unit)):
            ok = (isinstance(u, (tuple, list)) and len(u) == 2 and isinstance(u[0], str)
                  and isinstance(u[1], (int, float)) and math.isfinite(u[1]) and u[1] > 0)
            if not ok:
                raise ModelError("plot", f"{name} must be (label, SI value of one unit), e.g. ('kN', 1e3); got {u!r}")
        return cls(length_unit[0], float(length_unit[1]), force_unit[0], float(force_unit[1]))

    def _text(self, value_si: float, unit_si: float, unit: str) -> str:
        return f"{format_number(value_si / unit_si)} {unit}"

    def L(self, x: float) -> str:
        """A length with its unit."""
        return self._text(x, self.length_si, self.length)

    def F(self, p: float) -> str:
        """A force with its unit."""
        return self._text(p, self.force_si, self.force)

    def q(self, v: float) -> str:
        """A force per length (a line load) with its unit."""
        return self._text(v, self.force_si / self.length_si, f"{self.force}/{self.length}")

    def k_lat(self, v: float) -> str:
        """A lateral spring stiffness in engineering units (``"50 MN/m"``), see :func:`stiffness_text`."""
        return stiffness_text(v, "lateral", self)

    def k_rot(self, v: float) -> str:
        """A rotational spring stiffness in engineering units (``"180 MN*m/rad"``)."""
        return stiffness_text(v, "rotational", self)

    def k_found(self, v: float) -> str:
        """A foundation modulus (force per length per length of column) in engineering units (``"9 MN/m²"``)."""
        return stiffness_text(v, "modulus", self)


#: Metric force units and the prefixed units a stiffness may be written in, with their SI values [N].
_METRIC_FORCES = ("N", "kN", "MN")
_PREFIXED_FORCES = (("N", 1.0), ("kN", 1e3), ("MN", 1e6), ("GN", 1e9))
#: Stiffness kinds: power of the length in the unit (force * length^p), and its form.
_STIFFNESS_KINDS = {"lateral": (-1, "{F}/{L}"), "rotational": (1, "{F}*{L}/rad"), "modulus": (-2, "{F}/{L}²")}


def stiffness_unit(value_si: float, kind: str, units: PlotUnits) -> tuple[str, float]:
    """The unit a stiffness of about ``value_si`` is written in: (label, SI value of one unit).

    Springs and foundation moduli span many orders of magnitude, so their force unit takes the
    prefix (N, kN, MN, GN) that puts the number between 1 and 1000 in the display length unit:
    180e6 N*m/rad with lengths in m is ``("MN*m/rad", 1e6)``.  A non-metric display force (lbf,
    kip, tf) is kept as it is.

    Parameters
    ----------
    value_si : stiffness [N/m, N*m/rad or N/m^2]
    kind : ``"lateral"`` (N/m), ``"rotational"`` (N*m/rad) or ``"modulus"`` (N/m^2, a foundation)
    units : the figure's display units
    """
    power, form = _STIFFNESS_KINDS[kind]
    length_si = units.length_si**power
    force, force_si = units.force, units.force_si
    if units.force in _METRIC_FORCES:
        a = abs(float(value_si)) / length_si   # in N * (display length)^power
        force, force_si = _PREFIXED_FORCES[0]
        for name, f in _PREFIXED_FORCES:
            if a >= f * (1.0 - 5e-5):   # 999.97 kN would print as 1000 kN: write 1 MN
                force, force_si = name, f
    return form.format(F=force, L=units.length), force_si * length_si


def stiffness_text(value_si: float, kind: str, units: PlotUnits) -> str:
    """A stiffness with its unit in engineering form: ``stiffness_text(180e6, "rotational", kN_m) ==
    "180 MN*m/rad"`` (see :func:`stiffness_unit`)."""
    label, si = stiffness_unit(value_si, kind, units)
    return f"{format_number(value_si / si)} {label}"


def inertia_texts(column: Column) -> list[tuple[float, str]]:
    """(mid-height, "I/Imax = ...") per segment, or nothing when I is the same throughout."""
    ends = [(float(seg.inertia_at(0.0)), float(seg.inertia_at(seg.length))) for seg in column.segments]
    i_max = max(max(e) for e in ends)
    if all(abs(a - i_max) <= 1e-9 * i_max and abs(b - i_max) <= 1e-9 * i_max for a, b in ends):
        return []
    out = []
    for (lo, hi), (a, b) in zip(column.segment_bounds(), ends):
        ra, rb = format_number(a / i_max, 2), format_number(b / i_max, 2)
        out.append((0.5 * (lo + hi), f"I/Imax {ra}" if ra == rb else f"I/Imax {ra}→{rb}"))
    return out


def found_text(f, units: PlotUnits) -> str:
    """Label of a foundation: its modulus (bottom→top when it varies)."""
    if f.k_top is None or f.k_top == f.k_bottom:
        k = units.k_found(f.k_bottom)
    else:   # one unit for both ends, chosen by the larger
        label, si = stiffness_unit(max(abs(f.k_bottom), abs(f.k_top_value)), "modulus", units)
        k = f"{format_number(f.k_bottom / si)}→{format_number(f.k_top_value / si)} {label}"
    return f"foundation\n{k}"


def load_text(p, units: PlotUnits) -> str:
    """Label of a point load: its value with its sign (a negative load acts upward, as its arrow shows)."""
    return units.F(p.P) + (" perm." if p.permanent else "")


def dist_text(d, units: PlotUnits) -> str:
    """Label of a distributed load."""
    return f"q = {units.q(d.q)}" + (" perm." if d.permanent else "")


def lean_text(lean, units: PlotUnits) -> str:
    """Label of a leaning load: the load and the height of the leaning columns."""
    return f"leaning {units.F(lean.P)}" + (" perm." if lean.permanent else "") + f"\nh = {units.L(lean.height)}"


def spring_text(r: Restraint, units: PlotUnits) -> str:
    """Label of the springs of a restraint (rigid parts need none: their symbol says it)."""
    texts = []
    if 0 < r.lateral < math.inf:
        texts.append(units.k_lat(r.lateral))
    if 0 < r.rotation < math.inf:
        texts.append(units.k_rot(r.rotation))
    return "\n".join(texts)
