"""Scalar checks of parsed values: each raises :class:`~fea.errors.CaseError` naming the key path."""

from __future__ import annotations

import difflib
import math
import re
import unicodedata
from typing import Any, Iterable

from ..errors import CaseError

__all__ = ["check_keys", "as_bool", "as_str", "as_text", "one_line", "as_number", "as_table", "as_tables"]


def check_keys(table: dict, path: str, allowed: Iterable[str]) -> None:
    """Every key of ``table`` is allowed; otherwise an error with a "did you mean"."""
    allowed = sorted(set(allowed))
    for key in table:
        if key not in allowed:
            close = difflib.get_close_matches(key, allowed, n=1, cutoff=0.6)
            hint = f"; did you mean `{close[0]}`?" if close else f"; expected one of {', '.join(allowed)}"
            shown = key if len(key) <= 40 and key.isprintable() else repr(key[:37]) + "..."
            where = f"{path}.{shown}" if path else shown
            raise CaseError(where, f"unknown key{hint}")


def as_bool(value: Any, path: str) -> bool:
    if not isinstance(value, bool):
        raise CaseError(path, f"expected true or false, got {value!r}")
    return value


def as_str(value: Any, path: str) -> str:
    if not isinstance(value, str):
        raise CaseError(path, f"expected a string, got {value!r}")
    return value


def as_text(value: Any, path: str) -> str:
    """A string without control or format characters other than tabs and line breaks (no escape sequences,
    bells, NULs or direction marks): text that is printed."""
    text = as_str(value, path)
    # line breaks and tabs are left to the outputs, which print each text in a form fit for its place
    bad = next((c for c in text if unicodedata.category(c) in ("Cc", "Cf") and c not in "\t\n\r"), None)
    if bad is not None:
        raise CaseError(path, f"contains the control character U+{ord(bad):04X}: write the {path} in printable "
                              "characters")
    return text


def one_line(text: str) -> str:
    """``text`` for a line of terminal output: every run of tabs and line breaks becomes one space."""
    return re.sub(r"[\t\n\r\v\f\x85\u2028\u2029]+", " ", text)


def as_number(value: Any, path: str, low: float = -math.inf, high: float = math.inf, *,
              low_open: bool = False, integer: bool = False, what: str = "a number") -> float:
    """A finite real (or whole) number within ``[low, high]`` (``(low, high]`` with ``low_open``)."""
    ok = isinstance(value, (int, float)) and not isinstance(value, bool) and (not integer or isinstance(value, int))
    if ok and math.isfinite(value) and (value > low if low_open else value >= low) and value <= high:
        return value
    if not ok or not math.isfinite(value):
        raise CaseError(path, f"expected {what}, got {value!r}")
    lo = f"{'>' if low_open else '>='} {low:g}" if low > -math.inf else ""
    hi = f"<= {high:g}" if high < math.inf else ""
    rng = " and ".join(s for s in (lo, hi) if s)
    raise CaseError(path, f"{value!r} is out of range: expected {what} {rng}")


def as_table(value: Any, path: str) -> dict:
    if not isinstance(value, dict):
        raise CaseError(path, f"expected a table, got {type(value).__name__} {value!r}")
    return value


def as_tables(doc: dict, key: str) -> list[dict]:
    """The array of tables ``[[key]]`` (a single table counts as one), numbered from 1 in errors."""
    value = doc.get(key, [])
    if isinstance(value, dict):
        value = [value]
    if not isinstance(value, list):
        raise CaseError(key, f"expected [[{key}]] tables, got {value!r}")
    return [as_table(v, f"{key}[{i + 1}]") for i, v in enumerate(value)]
