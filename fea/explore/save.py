"""Saving the explored values as a new case file, with the original's comments and layout.

The original text is parsed by tomlkit, which keeps comments, blank lines and
the order of keys; only the changed values are replaced (each keeps its own
comment, with a note of the value it replaces) and a key the file did not give
is added to its table.  The new text must parse as a case before anything is
written.

Where it may be written: only a *name* comes from the page, never a path.  The
file goes into the folder of the case given on the command line; the name is
one plain file name (letters, digits, ``._-``, no folder part, not hidden),
``.toml`` is added when missing, and a name that would leave the folder
(``..``, a separator, an absolute path, a link) is refused.  An existing file
is replaced only when the page says so, and the case file that was opened only
when it is asked twice: the first request returns a one-time confirmation that
the second must carry.

Files: this module writes the one file, atomically (:func:`fea.util.files.write_atomic`).
"""

from __future__ import annotations

import math
import os
import re
import secrets
import time
from pathlib import Path
from typing import Any

from ..errors import CaseError
from ..pipeline import parse_case
from ..study.paths import parse_key
from ..util.files import write_atomic
from .inputs import BOW_KEY
from .state import Explorer

__all__ = ["saved_text", "save_target", "Saver", "NAME_RE"]

#: A save name: a plain file name, not hidden, at most 100 characters.
NAME_RE = re.compile(r"^[A-Za-z0-9][A-Za-z0-9._-]{0,99}$")
#: Seconds a confirmation to overwrite the opened case file stays valid.
CONFIRM_SECONDS = 120.0


def _unit(ex: Explorer, dimension: str) -> tuple[str, float]:
    d = ex.case.display
    return {"translational stiffness": (d.lateral, d.force_si / d.length_si),
            "rotational stiffness": (d.rotational, d.force_si * d.length_si),
            "foundation modulus": (d.modulus, d.force_si / d.length_si**2),
            "force": (d.force, d.force_si),
            "force per length": (d.line_load, d.force_si / d.length_si)}[dimension]


def _quantity(ex: Explorer, key: str, value: float) -> str:
    """The value as the case file writes it: a quantity in the display units, "free" / "rigid", "L/n"."""
    s = ex.by_key[key]
    if s.spring and value == 0:
        return "free"
    if math.isinf(value):
        return "rigid"
    if key == BOW_KEY:
        return f"L/{value:.10g}" if s.dimension == "ratio" else f"{value / s.unit_si:.10g} {s.unit}"
    unit, si = _unit(ex, parse_key(key).dimension)
    return f"{value / si:.12g} {unit}"


def _table(doc, key: str):
    """The tomlkit table a key path's value lives in."""
    if key == BOW_KEY:
        return doc["imperfection"], "bow"
    kp = parse_key(key)
    (name, idx), leaf = kp.parts[0], kp.leaf
    node = doc[name]
    if idx is not None:
        node = node[idx - 1] if isinstance(node, list) else node  # an array of tables, or a single [table]
    return node, leaf


def saved_text(ex: Explorer, note_source: str = "") -> str:
    """The case file's text with the explorer's changed values, comments and layout kept."""
    import tomlkit

    changed = ex.overrides()
    doc = tomlkit.parse(ex.text)
    for key, value in changed:
        table, leaf = _table(doc, key)
        old = table.get(leaf)
        text = _quantity(ex, key, value)
        was = f'was {old}' if old is not None else "not given before"
        if old is not None:
            item = table.item(leaf)
            comment = item.trivia.comment.strip()
            table[leaf] = text
            new = table.item(leaf)
            new.trivia.indent = item.trivia.indent
            new.trivia.comment_ws = item.trivia.comment_ws or "  "
            new.trivia.comment = (f"{comment} " if comment else "# ") + f"[explore: {was}]"
            new.trivia.trail = item.trivia.trail
        else:
            table[leaf] = text
            table.item(leaf).comment(f"[explore: {was}]")
    out = tomlkit.dumps(doc)
    if changed:
        names = ", ".join(k for k, _ in changed)
        head = f"# Saved by `stanchion explore` from {note_source or 'the case file'}; changed: {names}.\n"
        out = head + out
    return out


def save_target(case_path: str | Path, name: object) -> Path:
    """The file a save name stands for, in the folder of ``case_path``; raises CaseError for any name that is not
    one plain file name there."""
    if not isinstance(name, str) or not name.strip():
        raise CaseError("name", "give a file name such as 'column-stiffer-base.toml'")
    name = name.strip()
    if "/" in name or "\\" in name or "\x00" in name or os.path.isabs(name) or ".." in name:
        raise CaseError("name", f"{name!r}: only a file name is accepted, not a path (no folders, no '..')")
    if not NAME_RE.match(name):
        raise CaseError("name", f"{name!r}: use letters, digits, '.', '_' and '-' only, starting with a letter or "
                                "digit (at most 100 characters)")
    if not name.lower().endswith(".toml"):
        name += ".toml"
    folder = Path(case_path).resolve().parent
    target = folder / name
    if target.is_symlink() or (target.exists() and not target.is_file()):
        raise CaseError("name", f"{name!r} exists and is not a plain file: choose another name")
    if target.resolve().parent != folder:
        raise CaseError("name", f"{name!r} would leave the case's folder")
    return target


class Saver:
    """Saves for one explorer session: the overwrite rules and the one-time confirmations."""

    def __init__(self, ex: Explorer) -> None:
        self.ex = ex
        self._confirm: tuple[str, float, Path] | None = None

    def save(self, name: object, overwrite: bool = False, confirm: object = None) -> dict[str, Any]:
        """Save under ``name``; returns what the page reports (``saved``, ``file``, ``message``, and
        ``confirm`` when overwriting the opened case file needs a second request)."""
        if not self.ex.source:
            raise CaseError("name", "the case was not read from a file: there is no folder to save in")
        target = save_target(self.ex.source, name)
        original = Path(self.ex.source).resolve()
        text = saved_text(self.ex, note_source=original.name)
        parse_case(text, source=str(target))  # the new file must read as a case before it is written
        if target.exists():
            if target.resolve() == original:
                pending = self._confirm
                ok = (isinstance(confirm, str) and pending is not None and secrets.compare_digest(confirm, pending[0])
                      and time.monotonic() - pending[1] <= CONFIRM_SECONDS and pending[2] == target)
                if not ok:
                    token = secrets.token_urlsafe(16)
                    self._confirm = (token, time.monotonic(), target)
                    return {"saved": False, "confirm": token, "file": target.name,
                            "message": f"{target.name} is the case file you opened: press Save again to overwrite "
                                       "it, or choose another name"}
                self._confirm = None
            elif not overwrite:
                return {"saved": False, "exists": True, "file": target.name,
                        "message": f"{target.name} exists: tick 'replace' to overwrite it, or choose another name"}
        write_atomic(target, text)
        n = len(self.ex.overrides())
        return {"saved": True, "file": target.name,
                "message": f"saved {target.name} in the case's folder ({n} value{'s' if n != 1 else ''} changed)"}
