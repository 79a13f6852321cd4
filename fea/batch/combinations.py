"""Load combinations of a schedule: named load groups scaled by each combination's factors.

A schedule's ``[groups]`` table names groups of the case's load values, each member a table (``"load[2]"``:
every load value of that table) or one key (``"segment[1].axial_force_permanent"``); a ``[[combination]]``
gives a factor per group.  A combination is the sum of its factored groups: a group it does not name has
factor 0 in it.  So that no load is left out by mistake, every load value of the case must be in exactly one
group.  The load values are the keys of :data:`LOAD_VALUES`; their ``permanent`` flags are kept (a
permanent load is held at its factored value while the analysis scales the variable ones).

Pure: documents (plain data) in and out; values are read and written as quantity strings.
"""

from __future__ import annotations

from dataclasses import dataclass
from typing import Any, Mapping

from ..errors import CaseError
from ..units import DIMENSIONS, parse
from .keys import DocKey, parse_doc_key

__all__ = ["Combination", "LOAD_VALUES", "load_values", "combine", "check_group_member", "AS_GIVEN"]

#: Table (names without numbers) -> its load values and their quantities.
LOAD_VALUES: dict[tuple[str, ...], dict[str, str]] = {
    ("load",): {"axial": "force", "lateral": "force"},
    ("distributed_load",): {"axial": "force per length"},
    ("leaning",): {"load": "force"},
    ("segment",): {"axial_force": "force", "axial_force_permanent": "force"},
    ("lateral", "point"): {"force": "force"},
    ("lateral", "distributed"): {"per_length": "force per length", "per_length_top": "force per length"},
    ("lateral", "moment"): {"moment": "moment"},
}


@dataclass(frozen=True)
class Combination:
    """A load combination: its name and a factor per load group (groups it does not name: 0)."""

    name: str
    factors: Mapping[str, float]
    note: str = ""


#: The case's loads as given (no combination).
AS_GIVEN = Combination(name="", factors={})


def _tables(doc: Mapping, names: tuple[str, ...]) -> list[tuple[str, dict]]:
    """(path, table) of every table ``names`` in the document, numbered from 1."""
    node: Any = doc
    prefix = ""
    for name in names[:-1]:
        node = node.get(name) if isinstance(node, Mapping) else None
        if not isinstance(node, Mapping):
            return []
        prefix += f"{name}."
    items = node.get(names[-1], []) if isinstance(node, Mapping) else []
    items = [items] if isinstance(items, Mapping) else items
    if not isinstance(items, list):
        return []
    return [(f"{prefix}{names[-1]}[{i + 1}]", t) for i, t in enumerate(items) if isinstance(t, dict)]


def load_values(doc: Mapping) -> list[tuple[str, str, str]]:
    """(table path, key, quantity) of every load value the document gives, in file order by kind."""
    out = []
    for names, keys in LOAD_VALUES.items():
        for path, table in _tables(doc, names):
            out += [(path, k, dim) for k, dim in keys.items() if k in table]
    return out


def check_group_member(text: str, where: str) -> DocKey:
    """A group member: a numbered load table (``"load[2]"``) or one load value of it (``"load[2].axial"``)."""
    key = parse_doc_key(text, where)
    tables = {names: keys for names, keys in LOAD_VALUES.items()}
    names = key.names
    if names in tables and key.parts[-1][1] is not None:
        return key
    if names[:-1] in tables and key.parts[-2][1] is not None and key.parts[-1][1] is None \
            and names[-1] in tables[names[:-1]]:
        return key
    kinds = ", ".join(".".join(n) + "[i]" for n in LOAD_VALUES)
    raise CaseError(where, f"{key.text!r} is not a load table or load value: expected one of {kinds}, or one "
                           "value such as 'load[1].axial'")


def _scaled(value: Any, factor: float, dim: str, where: str) -> Any:
    if factor == 1.0:
        return value
    si = parse(where, value, dim)
    return f"{si * factor!r} {DIMENSIONS[dim][1]}"


def combine(doc: dict, combination: Combination, groups: Mapping[str, tuple[DocKey, ...]]) -> dict:
    """The document with every load value scaled by its group's factor in ``combination`` (in place; the
    caller passes a copy).  A load value in no group, or a group member the case does not have, is a
    :class:`CaseError` naming it."""
    if not combination.factors and not combination.name:
        return doc
    owner: dict[tuple[str, str], str] = {}
    present = load_values(doc)
    given = {(p, k) for p, k, _ in present}
    keys_of: dict[str, list[str]] = {}
    for path, key, _ in present:
        keys_of.setdefault(path, []).append(key)
    for group, members in groups.items():
        for m in members:
            if m.parts[-1][1] is not None:  # a whole table
                if m.text not in keys_of:
                    raise CaseError(f"groups.{group}", f"{m.text!r}: the case has no such load table")
                values = [(m.text, k) for k in keys_of[m.text]]
            else:
                if (m.table_path, m.leaf) not in given:
                    raise CaseError(f"groups.{group}", f"{m.text!r}: the case gives no such load value")
                values = [(m.table_path, m.leaf)]
            for v in values:
                if owner.get(v, group) != group:
                    raise CaseError(f"groups.{group}", f"{v[0]}.{v[1]} is also in group {owner[v]!r}: a load "
                                                       "value belongs to one group")
                owner[v] = group
    for path, key, dim in present:
        found = owner.get((path, key))
        if found is None:
            raise CaseError(f"{path}.{key}", "is in no load group: put every load value of the case in one group "
                                             "of [groups], so that no load is left out of a combination")
        table = _table_at(doc, path)
        table[key] = _scaled(table[key], float(combination.factors.get(found, 0.0)), dim, f"{path}.{key}")
    return doc


def _table_at(doc: dict, path: str) -> dict:
    key = parse_doc_key(path + ".x", path)
    node: Any = doc
    for name, idx in key.parts[:-1]:
        node = node[name]
        if idx is not None:
            node = ([node] if isinstance(node, dict) else node)[idx - 1]
    return node
