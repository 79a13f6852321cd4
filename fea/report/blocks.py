"""Cells and tables shared by the parts of the report.

A part reads its numbers from the result objects and names, for each, the path of
the same value in the JSON result (``json:imperfect/0/limit_load_factor``): the
JSON is another reader of the same objects, and the path tells the reader of the
report where to find the number.  A *field* is such a value with its JSON key,
held as the JSON holds it (non-finite numbers become None).
"""

from __future__ import annotations

import math
from typing import Any, Mapping, Sequence

import numpy as np

from ..units import DisplayUnits
from .document import Q, T, Table, q, unit_label

__all__ = ["Field", "hdr", "spring", "yes", "svg_of", "key_label", "cell", "quantity_table", "record_table"]

#: A value of a result with its key in the JSON result.
Field = tuple[str, Any]

#: SI suffixes of JSON keys, stripped from a key to make its label.
_SUFFIXES = ("_N_per_m", "_N_m", "_Nm", "_Pa", "_m4", "_m3", "_m2", "_N", "_m", "_rad")


def hdr(text: str, unit: str = "") -> tuple:
    """A column header with its unit in brackets."""
    return (text,) if not unit else (text, f" [{unit_label(unit)}]")


def spring(value: float, src: str, unit: str) -> tuple:
    """A spring stiffness: "rigid", "free" or the number."""
    if math.isinf(value):
        return (T("rigid", src),)
    if value == 0:
        return (T("free", src),)
    return (q(value, src, unit),)


def yes(value: bool, src: str) -> T:
    return T("yes" if value else "no", src)


def svg_of(fig: Any) -> str:
    """SVG text of a figure given as SVG text or as a matplotlib Figure."""
    from .svg import figure_svg

    return fig if isinstance(fig, str) else figure_svg(fig)


def key_label(key: str, path: str, labels: Mapping[str, str]) -> T:
    """The label of a JSON key: its engineering wording from ``labels``, else the key without its SI suffix."""
    if key in labels:
        return T(labels[key], f"key:{path}")
    base = next((key[: -len(s)] for s in _SUFFIXES if key.endswith(s)), key)
    text = base.replace("_", " ")
    return T(text[:1].upper() + text[1:], f"key:{path}")


def _unit_text(key: str, u: DisplayUnits) -> str:
    return unit_label(u.by_suffix(key))


def _as_json(value: Any) -> Any:
    """A value as the JSON result holds it: plain bool and int, None for a non-finite number."""
    if isinstance(value, np.generic):
        value = value.item()
    if isinstance(value, float) and not math.isfinite(value):
        return None
    return value


def _is_number(value: Any) -> bool:
    return isinstance(value, (int, float)) and not isinstance(value, bool)


def cell(key: str, value: Any, path: str, u: DisplayUnits) -> tuple:
    """The cell of a field: yes/no, a dash for None, a number in the unit of its key's suffix, or text."""
    value = _as_json(value)
    if isinstance(value, bool):
        return (yes(value, f"json:{path}"),)
    if value is None:
        return ("—",)
    if isinstance(value, int) and not u.by_suffix(key):
        return (Q(value, f"json:{path}", "", 6),)
    if isinstance(value, (int, float)):
        return (q(value, f"json:{path}", u.by_suffix(key)),)
    return (T(str(value), f"json:{path}"),)


def quantity_table(fields: Sequence[Field], path: str, u: DisplayUnits, labels: Mapping[str, str],
                   caption: tuple = ()) -> Table:
    """(quantity, value, unit) rows, one per field; ``path`` is the JSON path of the object holding them."""
    rows = tuple(((key_label(k, f"{path}/{k}", labels),), cell(k, v, f"{path}/{k}", u), (_unit_text(k, u),))
                 for k, v in fields)
    return Table((("Quantity",), ("Value",), ("Unit",)), rows, caption=caption, numeric=(1,))


def record_table(records: Sequence[Mapping[str, Any]], path: str, cols: Sequence[str], u: DisplayUnits,
                 labels: Mapping[str, str], caption: tuple = ()) -> Table:
    """A table with one row per record (``path/n`` in the JSON) and one column per key of ``cols``."""
    header = tuple((key_label(k, f"{path}/0/{k}", labels), f" [{_unit_text(k, u)}]" if _unit_text(k, u) else "")
                   for k in cols)
    rows = tuple(tuple(cell(k, r[k], f"{path}/{n}/{k}", u) for k in cols) for n, r in enumerate(records))
    numeric = tuple(i for i, k in enumerate(cols) if any(_is_number(_as_json(r[k])) for r in records))
    return Table(header, rows, caption=caption, numeric=numeric)
