"""Reading values of case-file tables: quantities with units, springs, planes and heights (SI).

Shared by every parser of a case-file table; each error names the key path.
"""

from __future__ import annotations

from typing import Any

from ..errors import CaseError
from ..model import FREE, RIGID
from ..units import parse
from ..util.checks import as_bool, as_number, as_str, as_table, as_tables, check_keys

__all__ = ["AXES", "PIN_WORDS", "positive", "spring", "axes", "Stations", "check_keys", "as_bool", "as_str",
           "as_number", "as_table", "as_tables"]

AXES = ("major", "minor")


def positive(path: str, value: Any, dimension: str) -> float:
    """A strictly positive quantity of ``dimension`` (a string with its unit) in SI."""
    v = parse(path, value, dimension)
    if not v > 0:
        raise CaseError(path, f"{value!r} must be positive")
    return v


#: Words for a pinned support: a pin holds the lateral movement and leaves the rotation free.
PIN_WORDS = ("pinned", "pin", "hinged", "hinge")


def _pin_word(path: str, value: Any, dimension: str) -> None:
    """Refuse 'pinned' for one spring, saying which word of a spring it means there."""
    if not (isinstance(value, str) and value.strip().lower() in PIN_WORDS):
        return
    if dimension == "rotational stiffness" or path.endswith(".rotation"):
        raise CaseError(path, f"{value!r} is not a rotational stiffness: a pin leaves the rotation free, "
                              "so write 'free' (or a stiffness such as '2.5 MN*m/rad')")
    if dimension == "translational stiffness" or path.endswith(".lateral"):
        raise CaseError(path, f"{value!r} is not a lateral stiffness: a pin holds the lateral movement, "
                              "so write 'rigid' (or a stiffness such as '400 kN/m')")


def spring(path: str, value: Any, dimension: str) -> float:
    """A spring stiffness >= 0, or ``"rigid"``/``"fixed"`` (infinite), ``"free"``/``"none"`` (zero).

    The words of a pinned support (:data:`PIN_WORDS`) are refused with the word to write instead:
    ``'free'`` for a rotation, ``'rigid'`` for a lateral stiffness.
    """
    if isinstance(value, str) and value.strip().lower() in ("rigid", "fixed"):
        return RIGID
    if isinstance(value, str) and value.strip().lower() in ("free", "none"):
        return FREE
    _pin_word(path, value, dimension)
    v = parse(path, value, dimension)
    if v < 0:
        raise CaseError(path, f"{value!r} must be >= 0 (or 'free' / 'rigid')")
    return v


def axes(value: Any, path: str, planes: tuple[str, ...]) -> tuple[str, ...]:
    """The planes an ``axis`` key names (``"both"`` or missing: every plane)."""
    if value is None or value == "both":
        return planes
    if not isinstance(value, str) or value not in AXES:
        raise CaseError(path, f"expected 'major', 'minor' or 'both', got {value!r}")
    if planes == ("in-plane",):
        raise CaseError(path, f"{value!r} given, but the segments give a single I (one-plane study): "
                              "give I_major and I_minor, or leave the axis out")
    return (value,)


class Stations:
    """Heights on a column of height ``H``: ``"base"``, ``"top"`` or a length from the base [m]."""

    def __init__(self, H: float):
        self.H = H

    def __call__(self, value: Any, path: str) -> float:
        if isinstance(value, str) and value.strip().lower() == "base":
            return 0.0
        if isinstance(value, str) and value.strip().lower() == "top":
            return self.H
        x = parse(path, value, "length") if not (isinstance(value, str) and value.strip() in ("0", "0.0")) else 0.0
        tol = 1e-9 * self.H
        if x < -tol or x > self.H + tol:
            raise CaseError(path, f"height {value!r} is outside the column (0 to {self.H:g} m from the base)")
        return min(max(x, 0.0), self.H)
