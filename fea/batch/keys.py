"""Key paths into a case document: read or replace any value of a case file by the path an engineer reads.

A key path names tables and keys from the top of the file, separated by dots, an array of tables by its
number counted from 1: ``segment[2].length``, ``restraint[1].rotation``, ``load[3].axial``,
``material.fy``, ``imperfection.bow``, ``lateral.distributed[1].per_length``, ``design.standard``,
``segment[1].section``.  The document is the plain data of a parsed case file
(:attr:`fea.model.case.Case.document`); :func:`set_value` changes a copy the caller made with :func:`plain`,
and the caller re-parses it, so every value passes the same checks as a hand-written case file.

Pure: plain data and strings in and out, no files.
"""

from __future__ import annotations

import re
from collections.abc import Mapping
from dataclasses import dataclass
from typing import Any

from ..errors import CaseError

__all__ = ["DocKey", "parse_doc_key", "get_value", "set_value", "has_table", "plain", "MAX_KEY_LENGTH"]

#: Longest key path accepted (characters).
MAX_KEY_LENGTH = 200

_PART = re.compile(r"^([A-Za-z_][A-Za-z0-9_]*)(?:\[(\d{1,6})\])?$")


@dataclass(frozen=True)
class DocKey:
    """One key path: ``parts`` are (name, number or None), numbers counted from 1."""

    text: str
    parts: tuple[tuple[str, int | None], ...]

    @property
    def leaf(self) -> str:
        return self.parts[-1][0]

    @property
    def table_path(self) -> str:
        """The path of the table holding the key (``"load[2]"`` of ``"load[2].axial"``; ``""`` at the top)."""
        return ".".join(_part_text(p) for p in self.parts[:-1])

    @property
    def names(self) -> tuple[str, ...]:
        """The names along the path without numbers: ``("lateral", "point", "force")``."""
        return tuple(n for n, _ in self.parts)


def _part_text(part: tuple[str, int | None]) -> str:
    name, idx = part
    return name if idx is None else f"{name}[{idx}]"


def parse_doc_key(text: Any, where: str) -> DocKey:
    """Read a key path; a malformed one is a :class:`CaseError` naming ``where`` (the field that holds it)."""
    if not isinstance(text, str) or not text.strip():
        raise CaseError(where, f"expected a key path such as 'segment[1].length', got {text!r}")
    if len(text) > MAX_KEY_LENGTH or not text.isprintable():
        raise CaseError(where, f"{text[:40]!r}... is not a key path: at most {MAX_KEY_LENGTH} printable characters")
    parts = []
    for raw in text.strip().split("."):
        m = _PART.match(raw.strip())
        if not m:
            raise CaseError(where, f"{text!r}: cannot read {raw!r}; a key path reads like 'segment[2].length' "
                                   "(tables counted from 1)")
        idx = int(m.group(2)) if m.group(2) is not None else None
        if idx is not None and idx < 1:
            raise CaseError(where, f"{text!r}: arrays of tables are counted from 1")
        parts.append((m.group(1), idx))
    return DocKey(text=".".join(_part_text(p) for p in parts), parts=tuple(parts))


def plain(obj: Any) -> Any:
    """A deep copy of a document as plain dicts and lists (read-only mappings become dicts)."""
    if isinstance(obj, Mapping):
        return {str(k): plain(v) for k, v in obj.items()}
    if isinstance(obj, (list, tuple)):
        return [plain(v) for v in obj]
    return obj


def _item(node: Any, name: str, idx: int, key: DocKey) -> dict:
    items = [node] if isinstance(node, dict) else node
    if not isinstance(items, list):
        raise CaseError(key.text, f"[{name}] is not an array of tables: write '{name}' without a number")
    if idx > len(items):
        raise CaseError(key.text, f"the case file has {len(items)} [[{name}]] table(s), not {idx}")
    out = items[idx - 1]
    if not isinstance(out, dict):
        raise CaseError(key.text, f"{name}[{idx}] is not a table")
    return out


def _parent(doc: dict, key: DocKey, create: bool) -> dict:
    """The table holding the last part of ``key``; plain tables on the way are made when ``create``."""
    node: Any = doc
    for name, idx in key.parts[:-1]:
        if not isinstance(node, dict):
            raise CaseError(key.text, "does not lead to a table")
        if name not in node:
            if idx is not None or not create:
                raise CaseError(key.text, f"the case file has no [{name}] table" if idx is None else
                                          f"the case file has no [[{name}]] tables")
            node[name] = {}
        node = node[name]
        if idx is not None:
            node = _item(node, name, idx, key)
        elif isinstance(node, list):
            raise CaseError(key.text, f"[[{name}]] is an array of tables: say which, e.g. '{name}[1]'")
        elif not isinstance(node, dict):
            raise CaseError(key.text, f"{name!r} is a value, not a table")
    return node


def get_value(doc: Mapping, key: DocKey) -> Any:
    """The value at ``key`` as written in the document; a missing one is a :class:`CaseError` naming it."""
    table = _parent(doc, key, create=False)  # type: ignore[arg-type]
    name, idx = key.parts[-1]
    if name not in table:
        raise CaseError(key.text, "is not given in the case file")
    return _item(table[name], name, idx, key) if idx is not None else table[name]


def has_table(doc: Mapping, key: DocKey) -> bool:
    """Whether the table that would hold ``key`` exists (the key itself may be absent)."""
    try:
        _parent(doc, key, create=False)  # type: ignore[arg-type]
    except CaseError:
        return False
    return True


def set_value(doc: dict, key: DocKey, value: Any) -> None:
    """Put ``value`` at ``key`` in ``doc`` (in place): a key is added or replaced, a table (a value that is a
    table) replaced whole; missing plain tables on the way are made (``design.standard`` in a case without
    ``[design]``), missing numbered tables are an error."""
    table = _parent(doc, key, create=True)
    name, idx = key.parts[-1]
    if idx is None:
        table[name] = value
        return
    if name not in table:
        raise CaseError(key.text, f"the case file has no [[{name}]] tables")
    items = table[name]
    if isinstance(items, dict):
        items = table[name] = [items]
    _item(items, name, idx, key)
    if not isinstance(value, dict):
        raise CaseError(key.text, f"a whole [[{name}]] table is replaced by a table, not {value!r}")
    items[idx - 1] = value
