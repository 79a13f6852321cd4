"""The strict quantity grammar (fea.quantity, wired into fea.units.parse): property tests.

Well-formed quantity texts are generated at random and must convert to the number a person
reads, computed here independently from a small table of unit factors; the same texts with a
comma, space, apostrophe, underscore or operator put inside the number, or with a second
number, must be refused with a :class:`~fea.errors.UnitError`, never misread.
"""

from __future__ import annotations

import math
import time

import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from fea.errors import UnitError
from fea.quantity import MAX_TEXT, GrammarError, split_quantity
from fea.units import parse

#: SI value of one unit, by kind (length, force, stress), independent of the registry.
LENGTHS = {"m": 1.0, "mm": 1e-3, "cm": 1e-2, "in": 0.0254, "ft": 0.3048}
FORCES = {"N": 1.0, "kN": 1e3, "MN": 1e6, "lbf": 4.4482216152605, "kip": 4448.2216152605, "tf": 9806.65}
STRESSES = {"Pa": 1.0, "kPa": 1e3, "MPa": 1e6, "GPa": 1e9, "psi": 4.4482216152605 / 0.0254**2,
            "ksi": 4448.2216152605 / 0.0254**2}
ANGLES = {"rad": 1.0}
KINDS = {"L": LENGTHS, "F": FORCES, "S": STRESSES, "rad": ANGLES}

#: (dimension, unit factors as (kind, power)); the power is negative below the line.
TEMPLATES = [
    ("length", (("L", 1),)),
    ("area", (("L", 2),)),
    ("section modulus", (("L", 3),)),
    ("second moment of area", (("L", 4),)),
    ("force", (("F", 1),)),
    ("force per length", (("F", 1), ("L", -1))),
    ("moment", (("F", 1), ("L", 1))),
    ("rotational stiffness", (("F", 1), ("L", 1), ("rad", -1))),
    ("rotational stiffness", (("F", 1), ("L", 1))),
    ("foundation modulus", (("F", 1), ("L", -2))),
    ("foundation modulus", (("F", 1), ("L", -1), ("L", -1))),
    ("stress", (("S", 1),)),
    ("stress", (("F", 1), ("L", -2))),
]


@st.composite
def numbers(draw) -> str:
    """A number as an engineer writes it: sign, digits, a decimal part, an exponent."""
    sign = draw(st.sampled_from(["", "", "+", "-"]))
    whole = draw(st.from_regex(r"[0-9]{1,6}", fullmatch=True))
    frac = draw(st.one_of(st.just(""), st.from_regex(r"\.[0-9]{1,6}", fullmatch=True)))
    if not frac and draw(st.booleans()):
        frac = "."  # "5." is a number as well
    exp = draw(st.one_of(st.just(""), st.from_regex(r"[eE][+-]?[0-9]{1,2}", fullmatch=True)))
    return sign + whole + frac + exp


def _op(draw, symbol: str) -> str:
    return draw(st.sampled_from(["", " "])) + symbol + draw(st.sampled_from(["", " "]))


@st.composite
def quantities(draw) -> tuple[str, str, str, float]:
    """(text, number part, dimension, expected SI value) of a well-formed quantity."""
    dimension, factors = draw(st.sampled_from(TEMPLATES))
    number = draw(numbers())
    value = float(number)  # the number as read
    above, below = [], []
    for kind, power in factors:
        name = draw(st.sampled_from(sorted(KINDS[kind])))
        value *= KINDS[kind][name] ** power
        written = name if abs(power) == 1 else f"{name}^{abs(power)}"
        (above if power > 0 else below).append(written)
    unit = above[0]
    for w in above[1:]:
        unit += _op(draw, draw(st.sampled_from(["*", "·"])))
        unit += w
    for w in below:
        unit += _op(draw, "/") + w
    text = number + draw(st.sampled_from([" ", "", "  "])) + unit
    return text, number, dimension, value


@settings(max_examples=300, deadline=None)
@given(quantities())
def test_well_formed_quantity_reads_as_a_person_reads_it(q):
    text, _, dimension, expected = q
    got = parse("key", text, dimension)
    assert math.isclose(got, expected, rel_tol=1e-12, abs_tol=0.0), (text, got, expected)


INSERTS = [",", " ", "'", "’", "_", "*", "**", "/", "^", " * ", "(", ")"]


@settings(max_examples=300, deadline=None)
@given(quantities(), st.sampled_from(INSERTS), st.data())
def test_separator_or_operator_inside_the_number_is_refused(q, insert, data):
    text, number, dimension, _ = q
    if len(number) < 2:
        number, text = number + "0", number + "0" + text[len(number):]
    at = data.draw(st.integers(1, len(number) - 1))
    bad = text[:at] + insert + text[at:]
    with pytest.raises(UnitError):
        parse("key", bad, dimension)


@settings(max_examples=200, deadline=None)
@given(quantities(), st.sampled_from(["{n} {t}", "{n}*{t}", "{t} {n}", "{t}{n}", "{t} * {n}"]),
       numbers())
def test_two_numbers_are_refused(q, pattern, extra):
    text, _, dimension, _ = q
    bad = pattern.format(n=extra, t=text)
    with pytest.raises(UnitError):
        parse("key", bad, dimension)


@settings(max_examples=300, deadline=None)
@given(st.text(alphabet="0123456789.,eE+-*/^ mkN'_()·", max_size=30))
def test_any_text_is_read_or_refused_cleanly(text):
    try:
        value = parse("key", text, "length")
    except UnitError as exc:
        assert "\n" not in str(exc) and str(exc).startswith("key: ")
    else:
        assert math.isfinite(value)


@pytest.mark.parametrize("text, expected", [
    ("4.5 m", 4.5), ("450 mm", 0.45), ("-2.5e3 mm", -2.5), (".5 m", 0.5), ("5. m", 5.0), ("+1E1 cm", 0.1),
    ("12 ft", 12 * 0.3048), ("0 m", 0.0),
])
def test_examples(text, expected):
    assert math.isclose(parse("k", text, "length"), expected, rel_tol=1e-15)


@pytest.mark.parametrize("text, hint", [
    ("4,5 m", "decimal point"), ("1,200 mm", "thousands separators"), ("4 500 mm", "spaces"),
    ("1'200 mm", "separators"), ("1_200 mm", "separators"), ("3 6 m", "two numbers"),
    ("4.5.6 m", "one decimal point"), ("4 m 5", "number after its unit"), ("9**9**9 m", "no arithmetic"),
    ("10**400 m", "no arithmetic"), ("2 m**2", "'^'"), ("2 m^9", "power"), ("2 kN/m*rad", "after '/'"),
    ("1e999 m", "too large"), ("4 m5", "number"), ("m", "start with a number"), ("5", "no unit"),
    ("(2) m", "start with a number"),
])
def test_refusals_say_how_to_write_it(text, hint):
    with pytest.raises(GrammarError, match=None) as info:
        split_quantity(text)
    assert hint in str(info.value), str(info.value)


def test_unknown_units_get_did_you_mean():
    for text, hint in (("450 KN", "did you mean kN?"), ("205 gpa", "did you mean GPa?"),
                       ("12 kNm", "did you mean kN*m?"), ("3 mn", "did you mean")):
        with pytest.raises(UnitError) as info:
            parse("load", text, "force" if "N" in text else "length")
        assert hint in str(info.value), str(info.value)


def test_long_and_hostile_texts_return_at_once():
    for text in ("9**9**9**9 m", "1" * 10_000 + " m", "(" * 5000 + "1 m", "1 " + "m*" * 5000 + "m"):
        start = time.perf_counter()
        with pytest.raises(UnitError):
            parse("k", text, "length")
        assert time.perf_counter() - start < 1.0
    with pytest.raises(GrammarError, match="characters long"):
        split_quantity("1" * (MAX_TEXT + 1) + " m")
