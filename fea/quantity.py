"""The strict grammar of a quantity written in a case file: a number, then a unit expression.

::

    quantity := number [spaces] unit
    number   := [+|-] (digits [. digits] | . digits) [(e|E) [+|-] digits]
    unit     := factor { [spaces] (* | ·) [spaces] factor } { [spaces] / [spaces] factor }
    factor   := name [^ [+|-] digits]        (a whole power, at most 4 in size)
    name     := a unit this tool knows (m, mm, kN, MN, Pa, MPa, GPa, rad, in, ft, kip, ...)

Nothing else: no arithmetic on numbers, no products of numbers, no ``**``, no
brackets, no implicit multiplication.  A decimal comma, a space, an apostrophe
or an underscore inside a number, two numbers in a row and text after the unit
are errors that say how to write the value.  The text is checked here before
any of it reaches the units library, so a short value can never tie the tool up.

Pure: regular expressions only; :mod:`fea.units` checks the unit names against
its registry and converts.
"""

from __future__ import annotations

import math
import re
from dataclasses import dataclass

__all__ = ["QuantityText", "split_quantity", "GrammarError", "MAX_TEXT", "MAX_POWER", "NUMBER_PATTERN"]

#: Longest quantity text accepted [characters].
MAX_TEXT = 80
#: Largest whole power of a unit factor (m^4 is the largest needed).
MAX_POWER = 4

#: A number by the grammar (a regular expression, no anchors).
NUMBER_PATTERN = r"[+-]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d+)?"
_NUMBER = re.compile(NUMBER_PATTERN)
_NAME = re.compile(r"[A-Za-zµμπ°]+")
_POWER = re.compile(r"\^([+-]?\d+)")
_SEPARATORS = re.compile(r"['’_\s]")
_OP = re.compile(r"\s*([*/·])\s*")


class GrammarError(ValueError):
    """A quantity text that breaks the grammar; the message says how to write it."""


@dataclass(frozen=True)
class QuantityText:
    """A quantity text split by the grammar.

    Attributes
    ----------
    number : the value as written, converted to float (finite)
    factors : ``(name, power)`` of every unit factor, the power negative after ``/``
    """

    number: float
    factors: tuple[tuple[str, int], ...]

    @property
    def unit(self) -> str:
        """The unit expression in a form the units library reads (``"kN*m/rad"`` -> ``"kN * m * rad ** -1"``)."""
        return " * ".join(f"{n} ** {p}" if p != 1 else n for n, p in self.factors)


def _number_hint(text: str) -> str | None:
    """A message for the usual ways of writing a number that this grammar refuses, else None."""
    s = text.strip()
    head = re.match(r"[+-]?[\d.,'’_\s]*\d", s)
    if head is None:
        return None
    digits = head.group(0)
    rest = s[head.end():]
    if "," in digits and "." in digits:
        # "4.500,5" or "4,500.5": the last mark is the decimal one, the others separate thousands
        last = max(digits.rfind(","), digits.rfind("."))
        plain = re.sub(r"[.,'’_\s]", "", digits[:last]) + "." + digits[last + 1:]
        return f"write the number with a decimal point and no thousands separators, e.g. {plain!r}"
    if "," in digits:
        if re.fullmatch(r"[+-]?\d{1,3}(,\d{3})+", digits):
            return f"write the number without thousands separators, e.g. {digits.replace(',', '')!r}"
        plain = _SEPARATORS.sub("", digits).replace(",", ".")
        return f"use a decimal point, not a comma: {plain!r}"
    if re.search(r"['’_]", digits):
        plain = re.sub(r"['’_]", "", digits)
        return f"write the number without separators, e.g. {plain!r}"
    if re.search(r"\d\s+\d", digits):
        joined = re.sub(r"\s+", "", digits)
        return ("a number may not contain spaces, and two numbers in a row are not a quantity: write one number "
                f"then its unit, e.g. {(joined + ' ' + rest.strip()).strip()!r} if {joined} is meant")
    if digits.count(".") > 1:
        return "a number has at most one decimal point"
    if rest.startswith(("*", "/", "^", "(")):
        return "write one number then its unit: no arithmetic on numbers"
    return None


def split_quantity(text: str) -> QuantityText:
    """Split ``text`` into its number and unit factors by the grammar above.

    Raises
    ------
    GrammarError
        Whatever breaks the grammar, with a message that says how to write the value.
    """
    if len(text) > MAX_TEXT:
        raise GrammarError(f"is {len(text)} characters long: a quantity is a number and a unit")
    s = text.strip()
    m = _NUMBER.match(s)
    if m is None or (m.end() < len(s) and (s[m.end()].isdigit() or s[m.end()] in ",.'’_")):
        hint = _number_hint(s)
        raise GrammarError(hint or "does not start with a number: write a number then its unit")
    number = float(m.group(0))
    if number == 0.0 and re.search(r"[1-9]", re.split(r"[eE]", m.group(0))[0]):
        raise GrammarError("is too small a number to compute with: it underflows double precision to zero")
    if not math.isfinite(number):
        raise GrammarError("is too large a number for double precision")
    if number != 0.0 and abs(number) < 1e-300:
        raise GrammarError("is too small a number to compute with (below 1e-300)")
    rest = s[m.end():]
    if not rest.strip():
        raise GrammarError("has no unit")
    hint = _number_hint(s)
    if hint is not None and not _NAME.match(rest.lstrip()):
        raise GrammarError(hint)
    factors = _unit_factors(rest.lstrip(), s)
    return QuantityText(number, factors)


def _unit_factors(u: str, whole: str) -> tuple[tuple[str, int], ...]:
    factors: list[tuple[str, int]] = []
    sign = 1
    pos = 0
    while True:
        m = _NAME.match(u, pos)
        if m is None:
            bad = u[pos:].strip()
            if bad[:1].isdigit() or bad[:1] in "+-.":
                raise GrammarError("has a number inside its unit: write one number then its unit, "
                                   "with no arithmetic (e.g. '4.5 m', '2.5 MN*m/rad')")
            raise GrammarError(f"has {bad[:12]!r} where a unit name was expected")
        name, pos = m.group(0), m.end()
        power = 1
        if u.startswith("**", pos):
            raise GrammarError("uses '**': write powers with '^' and a whole number, e.g. 'mm^4'")
        p = _POWER.match(u, pos)
        if p is not None:
            power = int(p.group(1))
            if power == 0 or abs(power) > MAX_POWER:
                raise GrammarError(f"has the power {power} on {name!r}: expected a whole power from 1 to "
                                   f"{MAX_POWER}")
            pos = p.end()
        factors.append((name, sign * power))
        if pos == len(u):
            return tuple(factors)
        op = _OP.match(u, pos)
        if op is None:
            tail = u[pos:].strip()
            if tail and (tail[0].isdigit() or tail[0] in "+-."):
                raise GrammarError("has a number after its unit: write one number then its unit")
            raise GrammarError(f"has {tail[:12]!r} after the unit: join unit names with '*' or '/', "
                               "e.g. 'kN*m/rad'")
        if len(factors) >= 6:
            raise GrammarError("has too many unit factors")
        if op.group(1) == "/":
            sign = -1
        elif sign == -1:
            # "a/b*c" reads as (a/b)*c by the rules of arithmetic but is often meant as a/(b*c): refuse it
            raise GrammarError("has '*' after '/': write every factor below the line after its own '/', "
                               "e.g. 'kN/m/rad', or put the factors above the line first, e.g. 'kN*m/rad'")
        pos = op.end()
