"""Units at the edges: parse ``"3.6 m"`` into SI floats, format SI floats for display.

The only module that imports pint.  The registry is built from the small
definitions file ``units.txt`` beside this module (milliseconds, not the full
default registry).
"""

from __future__ import annotations

import difflib
import math
from dataclasses import dataclass
from functools import lru_cache
from pathlib import Path

from .errors import UnitError
from .quantity import GrammarError, QuantityText, split_quantity

__all__ = ["DIMENSIONS", "DISPLAY_LENGTHS", "DISPLAY_FORCES", "parse", "registry", "DisplayUnits", "to_display"]

#: Physical quantities used in case files: name -> (pint dimensionality, SI unit, example).
DIMENSIONS: dict[str, tuple[str, str, str]] = {
    "length": ("[length]", "m", "3.6 m"),
    "area": ("[length] ** 2", "m^2", "4480 mm^2"),
    "second moment of area": ("[length] ** 4", "m^4", "18.2e6 mm^4"),
    "section modulus": ("[length] ** 3", "m^3", "420e3 mm^3"),
    "stress": ("[mass] / [length] / [time] ** 2", "Pa", "205 GPa"),
    "force": ("[length] * [mass] / [time] ** 2", "N", "450 kN"),
    "force per length": ("[mass] / [time] ** 2", "N/m", "0.6 kN/m"),
    "translational stiffness": ("[mass] / [time] ** 2", "N/m", "400 kN/m"),
    "rotational stiffness": ("[length] ** 2 * [mass] / [time] ** 2", "N*m/rad", "2.5 MN*m/rad"),
    "foundation modulus": ("[mass] / [length] / [time] ** 2", "N/m^2", "4 MN/m^2"),
    "moment": ("[length] ** 2 * [mass] / [time] ** 2", "N*m", "12 kN*m"),
    "mass per length": ("[mass] / [length]", "kg/m", "61.3 kg/m"),
}


@lru_cache(maxsize=1)
def registry():
    """The shared, small pint registry."""
    import pint

    return pint.UnitRegistry(str(Path(__file__).with_name("units.txt")), autoconvert_offset_to_baseunit=False)


#: Unit names offered in "did you mean" hints (any name the registry knows is accepted).
_COMMON = ("m", "mm", "cm", "in", "ft", "N", "kN", "MN", "lbf", "kip", "tf", "Pa", "kPa", "MPa", "GPa", "psi",
           "ksi", "rad", "deg", "kg", "s")

#: Display units a ``[units]`` table or ``--units`` may name.
DISPLAY_LENGTHS = ("m", "cm", "mm", "in", "ft")
DISPLAY_FORCES = ("N", "kN", "MN", "lbf", "kip", "tf")


def _shown(value: str) -> str:
    """The value as quoted in an error: repr, cut to 40 characters."""
    return repr(value if len(value) <= 40 else value[:37] + "...")


def _unknown_unit_hint(name: str) -> str:
    """ "did you mean" for a unit name the registry does not know (wrong case, near miss, run-together)."""
    folded = [c for c in _COMMON if c.lower() == name.lower()]
    if folded:
        return f"; did you mean {folded[0]}?"
    for i in range(1, len(name)):
        if name[:i] in DISPLAY_FORCES and name[i:] in DISPLAY_LENGTHS:
            return f"; did you mean {name[:i]}*{name[i:]}?"
    close = difflib.get_close_matches(name, _COMMON, n=1, cutoff=0.6)
    return f"; did you mean {close[0]}?" if close else ""


@lru_cache(maxsize=256)
def _known(name: str) -> bool:
    """Whether the registry defines unit ``name`` (a plain identifier checked by the grammar first)."""
    try:
        registry().Unit(name)
    except Exception:
        return False
    return True


def _split(key: str, text: str, dimension: str) -> QuantityText:
    """``text`` split by the grammar, every unit name known to the registry (the raw text never reaches pint)."""
    example = DIMENSIONS[dimension][2]
    try:
        qt = split_quantity(text)
    except GrammarError as exc:
        msg = str(exc)
        sep = " " if msg.startswith(("is ", "has ", "uses ", "does ")) else ": "
        raise UnitError(key, f"{_shown(text)}{sep}{msg} (expected a {dimension} such as {example!r})") from None
    for name, _ in qt.factors:
        if not _known(name):
            raise UnitError(key, f"{_shown(text)} is not a quantity this tool understands: unknown unit "
                                 f"{name!r}{_unknown_unit_hint(name)} "
                                 f"(expected a {dimension} such as {example!r})")
    return qt


@lru_cache(maxsize=512)
def _unit_si(factors: tuple[tuple[str, int], ...]) -> tuple[float, object, bool]:
    """(SI value of one unit, dimensionality, dimensionless?) of a product of known unit factors.

    Cached: pint takes about half a millisecond per conversion, and a case repeats a few units many times.
    """
    ureg = registry()
    unit = ureg.Unit("")
    for name, power in factors:
        unit = unit * ureg.Unit(name) ** power
    one = ureg.Quantity(1.0, unit)
    return float(one.to_base_units().magnitude), one.dimensionality, bool(one.dimensionless)


@lru_cache(maxsize=32)
def _dimensionality(dims: str) -> object:
    return registry().get_dimensionality(dims)


def parse(key: str, value: object, dimension: str) -> float:
    """Parse a quantity string into an SI float after checking its dimension.

    The text must follow the grammar of :mod:`fea.quantity` (a number, then a unit
    expression); every unit name is checked against the registry before pint sees it.

    Parameters
    ----------
    key : the case-file field, named in any error (e.g. ``segment[2].I_major``)
    value : the text, e.g. ``"18.2e6 mm^4"``
    dimension : a key of :data:`DIMENSIONS`

    Raises
    ------
    UnitError
        A bare number, text that breaks the grammar, an unknown unit, the wrong dimension, or a value
        outside double precision.
    """
    dims, si, example = DIMENSIONS[dimension]
    if isinstance(value, bool) or not isinstance(value, (str, int, float)):
        raise UnitError(key, f"expected a {dimension} as a string with its unit, such as {example!r}; "
                             f"got {value!r}")
    if isinstance(value, (int, float)):
        raise UnitError(key, f"{value!r} has no unit: expected a {dimension} such as {example!r}")
    text = value.strip()
    if not text:
        raise UnitError(key, f"is empty: expected a {dimension} such as {example!r}")
    qt = _split(key, text, dimension)
    factor, dimensionality, dimensionless = _unit_si(qt.factors)
    if dimensionless and dims != "[]":
        raise UnitError(key, f"{_shown(text)} has no unit: expected a {dimension} such as {example!r}")
    if dimensionality != _dimensionality(dims):
        raise UnitError(key, f"{_shown(text)} is not a {dimension}: expected units like {si} (e.g. {example!r})")
    out = qt.number * factor
    if not math.isfinite(out):
        raise UnitError(key, f"{_shown(text)} is too large for double precision once converted to {si}")
    if out != 0.0 and abs(out) < 1e-290:
        raise UnitError(key, f"{_shown(text)} is too small to compute with once converted to {si}")
    return out


@dataclass(frozen=True)
class DisplayUnits:
    """Units used to print results: a length unit and a force unit.

    Attributes
    ----------
    length, force : unit labels, e.g. ``"m"``, ``"kN"``
    length_si, force_si : SI value of one display unit (``"mm"`` -> 1e-3)
    """

    length: str = "m"
    force: str = "kN"
    length_si: float = 1.0
    force_si: float = 1e3

    @classmethod
    def from_names(cls, length: str = "m", force: str = "kN") -> "DisplayUnits":
        """Display units by name, each from :data:`DISPLAY_LENGTHS` / :data:`DISPLAY_FORCES`."""
        for key, name, allowed in (("units.length", length, DISPLAY_LENGTHS), ("units.force", force, DISPLAY_FORCES)):
            if name not in allowed:
                folded = [a for a in allowed if a.lower() == name.strip().lower()]
                hint = f"did you mean {folded[0]}? " if folded else ""
                raise UnitError(key, f"{_shown(name)} is not a display unit: {hint}expected one of "
                                     f"{', '.join(allowed)}")
        return cls(length, force, parse("units.length", f"1 {length}", "length"),
                   parse("units.force", f"1 {force}", "force"))

    @property
    def stress(self) -> str:
        return "MPa" if self.length in ("m", "mm", "cm") else "ksi"

    @property
    def stress_si(self) -> float:
        return 1e6 if self.stress == "MPa" else 6894757.293168361

    @property
    def section(self) -> str:
        """Length unit of section properties (A, I, W): cm with metric lengths, else in."""
        return "cm" if self.length in ("m", "cm", "mm") else "in"

    @property
    def area(self) -> str:
        return f"{self.section}^2"

    @property
    def section_modulus(self) -> str:
        return f"{self.section}^3"

    @property
    def inertia(self) -> str:
        """Second moment of area."""
        return f"{self.section}^4"

    @property
    def line_load(self) -> str:
        """Force per length: distributed loads."""
        return f"{self.force}/{self.length}"

    @property
    def lateral(self) -> str:
        """Translational spring stiffness (force per length)."""
        return f"{self.force}/{self.length}"

    @property
    def rotational(self) -> str:
        """Rotational spring stiffness."""
        return f"{self.force}*{self.length}/rad"

    @property
    def modulus(self) -> str:
        """Foundation modulus (force per length per length of column)."""
        return f"{self.force}/{self.length}^2"

    @property
    def moment(self) -> str:
        return f"{self.force}*{self.length}"

    def by_suffix(self, key: str) -> str:
        """The display unit of an SI result key by its suffix (``"axial_force_N"`` -> the force unit);
        ``""`` for a key without one."""
        table = (("_N_per_m", self.line_load), ("_N_m", self.moment), ("_Nm", self.moment), ("_Pa", self.stress),
                 ("_m4", self.inertia), ("_m3", self.section_modulus), ("_m2", self.area), ("_N", self.force),
                 ("_m", self.length))
        return next((unit for suffix, unit in table if key.endswith(suffix)), "")

    def L(self, x: float) -> float:
        return x / self.length_si

    def F(self, x: float) -> float:
        return x / self.force_si


def to_display(value_si: float, unit: str) -> float:
    """Convert an SI value into ``unit`` (any unit the registry knows)."""
    ureg = registry()
    q = ureg.Quantity(1.0, unit)
    return value_si / float(q.to_base_units().magnitude)
