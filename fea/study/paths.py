"""Case-file key paths: address, read and change one scalar input of a parsed case document.

A key path names a value the way an engineer reads the case file, arrays of
tables counted from 1: ``restraint[1].rotation``, ``segment[2].length``,
``load[1].axial``, ``segment[1].I_minor``, ``restraint[2].beam[1].span``,
``material.E``.  The document is the plain data of a parsed case
(:attr:`fea.model.case.Case.document`); :func:`with_values` returns a changed
copy, which the caller's rebuild function (the case-file parser) turns into a
new case, so every value passes the same checks as a hand-written case file.

Pure: plain data and strings in and out, no files.
"""

from __future__ import annotations

import copy
import math
import re
from collections.abc import Mapping
from dataclasses import dataclass

from ..errors import CaseError
from ..units import DIMENSIONS, parse

__all__ = ["KeyPath", "parse_key", "with_values", "format_si", "SPRING_KINDS", "FOUNDATION_MODULI"]

#: Leaf key -> physical quantity (a key of :data:`fea.units.DIMENSIONS`), per table name.
_LEAVES: dict[str, dict[str, str]] = {
    "segment": {"length": "length", "E": "stress", "fy": "stress", "A": "area", "S": "force", "S_major": "force",
                "S_minor": "force", "axial_force": "force", "axial_force_permanent": "force",
                **{k: "second moment of area"
                   for k in ("I", "I_major", "I_minor", "I_top", "I_major_top", "I_minor_top")}},
    "restraint": {"at": "length", "lateral": "translational stiffness", "rotation": "rotational stiffness"},
    "beam": {"E": "stress", "I": "second moment of area", "span": "length"},
    "load": {"at": "length", "axial": "force"},
    "distributed_load": {"from": "length", "to": "length", "axial": "force per length"},
    "foundation": {"from": "length", "to": "length", "modulus": "foundation modulus",
                   "modulus_bottom": "foundation modulus", "modulus_top": "foundation modulus"},
    "leaning": {"at": "length", "load": "force", "height": "length"},
    "material": {"E": "stress", "fy": "stress", "fu": "stress", "sigma_allow": "stress"},
}

#: Restraint keys that are springs ("free" and "rigid" allowed).
SPRING_KINDS = ("lateral", "rotation")
#: Foundation keys that are moduli (studied like springs; finite values only).
FOUNDATION_MODULI = ("modulus", "modulus_bottom", "modulus_top")

_PART = re.compile(r"^([A-Za-z_]+)(?:\[(\d+)\])?$")


@dataclass(frozen=True)
class KeyPath:
    """One scalar input of a case file.

    Attributes
    ----------
    text : the key path as written, e.g. ``"restraint[1].rotation"``
    parts : ((name, index or None), ...) with 1-based indices
    dimension : the physical quantity (key of :data:`fea.units.DIMENSIONS`)
    si_unit : the SI unit of the value, e.g. ``"N*m/rad"``
    """

    text: str
    parts: tuple[tuple[str, int | None], ...]
    dimension: str

    @property
    def si_unit(self) -> str:
        return DIMENSIONS[self.dimension][1]

    @property
    def leaf(self) -> str:
        return self.parts[-1][0]

    @property
    def kind(self) -> str:
        """The spring kind of a spring key: "lateral" or "rotation"."""
        return self.leaf

    @property
    def is_spring(self) -> bool:
        """A lateral or rotational spring of a restraint (not of a restraining beam)."""
        return len(self.parts) == 2 and self.parts[0][0] == "restraint" and self.leaf in SPRING_KINDS

    @property
    def is_foundation(self) -> bool:
        """A foundation modulus (``foundation[i].modulus``, ``modulus_bottom`` or ``modulus_top``)."""
        return len(self.parts) == 2 and self.parts[0][0] == "foundation" and self.leaf in FOUNDATION_MODULI

    @property
    def is_stiffness(self) -> bool:
        """A restraint spring or a foundation modulus: changed on the parsed case, studied like a spring."""
        return self.is_spring or self.is_foundation

    @property
    def restraint_number(self) -> int | None:
        """1-based number of the [[restraint]] table, for spring keys."""
        return self.parts[0][1] if self.is_spring else None

    @property
    def table_number(self) -> int | None:
        """1-based number of the [[restraint]] or [[foundation]] table of a stiffness key."""
        return self.parts[0][1] if self.is_stiffness else None

    @property
    def label(self) -> str:
        """A readable name for a chart axis or a table: "restraint 1 rotation stiffness"."""
        if self.is_spring:
            return f"restraint {self.parts[0][1]} {self.leaf} stiffness"
        if self.is_foundation:
            what = {"modulus": "modulus", "modulus_bottom": "modulus at bottom", "modulus_top": "modulus at top"}
            return f"foundation {self.parts[0][1]} {what[self.leaf]}"
        names = [f"{n} {i}" if i is not None else n for n, i in self.parts[:-1]]
        return " ".join(names + [self.leaf])

    def parse_value(self, value: object, where: str) -> float:
        """A value for this key in SI: a quantity string, or 'free' / 'rigid' for a spring."""
        if self.is_spring and isinstance(value, str) and value.strip().lower() in ("free", "rigid"):
            return 0.0 if value.strip().lower() == "free" else math.inf
        if self.is_spring and isinstance(value, str) and value.strip().lower() in ("pinned", "pin", "hinged", "hinge"):
            word, why = ("free", "leaves the rotation free") if self.leaf == "rotation" else \
                ("rigid", "holds the lateral movement")
            raise CaseError(where, f"{value!r} is not a stiffness: a pin {why}, so write {word!r}")
        return parse(where, value, self.dimension)

    def get(self, doc: Mapping) -> object:
        """The value as written in the document (raises CaseError if absent)."""
        table = _walk(doc, self)
        if self.leaf not in table:
            raise CaseError(self.text, "is not given in the case file")
        return table[self.leaf]

    def set(self, doc: dict, value: float) -> None:
        """Write an SI value into ``doc`` (in place) as a quantity string."""
        table = _walk(doc, self)
        table[self.leaf] = format_si(value, self.si_unit, spring=self.is_spring)


def parse_key(text: str) -> KeyPath:
    """Parse ``text`` such as ``"segment[2].I_minor"`` into a :class:`KeyPath`.

    Raises
    ------
    CaseError
        Malformed path, unknown table or key, or a key that is not a number with a unit.
    """
    if not isinstance(text, str) or not text.strip():
        raise CaseError("parameter", f"expected a key path such as 'restraint[1].rotation', got {text!r}")
    parts = []
    for raw in text.strip().split("."):
        m = _PART.match(raw.strip())
        if not m:
            raise CaseError("parameter", f"{text!r}: cannot read {raw!r}; write e.g. 'segment[2].length'")
        idx = int(m.group(2)) if m.group(2) is not None else None
        if idx is not None and idx < 1:
            raise CaseError("parameter", f"{text!r}: tables are counted from 1")
        parts.append((m.group(1), idx))
    tables = [p[0] for p in parts[:-1]]
    if not tables:
        raise CaseError("parameter", f"{text!r}: name a table and a key, e.g. 'segment[1].length'")
    owner = tables[-1]
    if owner == "beam" and tables[:1] != ["restraint"]:
        raise CaseError("parameter", f"{text!r}: a beam belongs to a restraint, e.g. 'restraint[2].beam[1].span'")
    if owner not in _LEAVES or len(tables) > (2 if owner == "beam" else 1):
        raise CaseError("parameter", f"{text!r}: unknown table {owner!r}; expected one of "
                                     f"{', '.join(k for k in _LEAVES if k != 'beam')}")
    leaf = parts[-1][0]
    if parts[-1][1] is not None:
        raise CaseError("parameter", f"{text!r}: the last part must be a key, not a table")
    if leaf not in _LEAVES[owner]:
        raise CaseError("parameter", f"{text!r}: {leaf!r} is not a numeric key of [{owner}]; expected one of "
                                     f"{', '.join(_LEAVES[owner])}")
    for name, idx in parts[:-1]:
        if name == "material" and idx is not None:
            raise CaseError("parameter", f"{text!r}: [material] is a single table, write 'material.E'")
        if name != "material" and idx is None:
            raise CaseError("parameter", f"{text!r}: say which {name}, e.g. '{name}[1]'")
    return KeyPath(text=text.strip(), parts=tuple(parts), dimension=_LEAVES[owner][leaf])


def _walk(doc: Mapping, key: KeyPath) -> dict:
    node: object = doc
    for name, idx in key.parts[:-1]:
        if not isinstance(node, Mapping) or name not in node:
            raise CaseError(key.text, f"the case file has no [{name}] table")
        node = node[name]
        if idx is not None:
            items = [node] if isinstance(node, dict) else node
            if not isinstance(items, list) or idx > len(items):
                n = len(items) if isinstance(items, list) else 0
                raise CaseError(key.text, f"the case file has {n} [[{name}]] table(s), not {idx}")
            node = items[idx - 1]
    if not isinstance(node, dict):
        raise CaseError(key.text, "does not lead to a table")
    return node


def format_si(value: float, unit: str, spring: bool = False) -> str:
    """An SI value as a case-file quantity string that parses back to the same float."""
    if spring and value == 0.0:
        return "free"
    if spring and math.isinf(value):
        return "rigid"
    return f"{float(value)!r} {unit}"


def with_values(doc: Mapping, keys: tuple[KeyPath, ...], values: tuple[float, ...]) -> dict:
    """A deep copy of the case document ``doc`` with each key set to its SI value (the [study] table left out)."""
    out = copy.deepcopy({k: v for k, v in doc.items() if k != "study"})
    for key, v in zip(keys, values):
        key.set(out, v)
    return out
