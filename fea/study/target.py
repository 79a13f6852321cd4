"""A parsed case together with its TOML document: where each [[restraint]] table lands.

A ``[[restraint]]`` table of a two-plane case becomes one
:class:`~fea.model.Restraint` in each bending plane it applies to.  Studies
address springs by the table's number (``restraint[2].lateral``) and need the
index of the matching restraint in each plane's column, and the rotational
stiffness its restraining beams add.

Pure: no files.
"""

from __future__ import annotations

import math
import tomllib
from dataclasses import dataclass

from ..errors import CaseError
from ..io.case import parse_case
from ..model.case import Case
from .paths import KeyPath

__all__ = ["StudyCase", "SpringTarget"]


@dataclass(frozen=True)
class SpringTarget:
    """One spring of one bending plane addressed by a case-file key.

    Attributes
    ----------
    axis : bending plane
    restraint : index of the restraint in that plane's column (0-based)
    kind : "lateral" or "rotation"
    offset : stiffness the table adds beyond the key's own value (restraining
        beams of a rotational spring) [N m/rad]
    """

    axis: str
    restraint: int
    kind: str
    offset: float = 0.0

    def stiffness(self, value: float) -> float:
        """The plane's spring when the key holds ``value`` [SI]."""
        return math.inf if math.isinf(value) else value + self.offset


@dataclass(frozen=True)
class StudyCase:
    """A case and the document it was parsed from."""

    case: Case
    doc: dict

    @classmethod
    def from_text(cls, text: str, source: str = "") -> "StudyCase":
        case = parse_case(text, source=source)
        return cls(case=case, doc=tomllib.loads(text))

    @property
    def axes(self) -> tuple[str, ...]:
        return tuple(a for a, _ in self.case.planes)

    def restraint_tables(self) -> list[dict]:
        v = self.doc.get("restraint", [])
        return [v] if isinstance(v, dict) else list(v)

    def targets(self, key: KeyPath) -> tuple[SpringTarget, ...]:
        """The plane springs a spring key drives (one per plane the table applies to)."""
        if not key.is_spring:
            raise CaseError(key.text, "is not a restraint spring (restraint[i].lateral or restraint[i].rotation)")
        tables = self.restraint_tables()
        number = key.restraint_number
        if number > len(tables):
            raise CaseError(key.text, f"the case file has {len(tables)} [[restraint]] table(s), not {number}")
        count = {a: 0 for a in self.axes}
        out = []
        for i, t in enumerate(tables, start=1):
            ax = t.get("axis", "both")
            applies = self.axes if ax == "both" else (ax,)
            for a in applies:
                if i == number:
                    col = self.case.column(a)
                    r = col.restraints[count[a]]
                    offset = 0.0
                    if key.kind == "rotation" and math.isfinite(r.rotation):
                        own = key.parse_value(t.get("rotation", "free"), key.text)
                        offset = r.rotation - own if math.isfinite(own) else 0.0
                    out.append(SpringTarget(axis=a, restraint=count[a], kind=key.kind, offset=offset))
                count[a] += 1
        return tuple(out)

    def spring_keys(self) -> tuple[KeyPath, ...]:
        """Every spring the case file gives (lateral and rotation of each restraint, if not free)."""
        from .paths import parse_key

        out = []
        for i, t in enumerate(self.restraint_tables(), start=1):
            for kind in ("lateral", "rotation"):
                key = parse_key(f"restraint[{i}].{kind}")
                tg = self.targets(key)
                col = self.case.column(tg[0].axis)
                if getattr(col.restraints[tg[0].restraint], kind) != 0.0:
                    out.append(key)
        return tuple(out)

