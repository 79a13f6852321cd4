"""A parsed case as the restraint studies see it: which plane restraint a [[restraint]] table became.

A ``[[restraint]]`` table of a two-plane case becomes one
:class:`~fea.model.Restraint` in each bending plane it applies to
(:attr:`fea.model.case.Case.origins` records where).  Studies address springs
by the table's number (``restraint[2].lateral``) and change them on the parsed
case itself; any other input (a length, an E, a load) is changed in a copy of
the case's document and rebuilt by the function the command layer passes
(the case-file parser), so studies never see TOML text.

Pure: no files.
"""

from __future__ import annotations

import math
from dataclasses import dataclass, replace
from typing import Callable, Mapping

from ..errors import CaseError, FeaError
from ..model.case import Case
from ..model.ideal_supports import is_nominal, nominal_rotation_at
from .paths import KeyPath, parse_key, with_values

__all__ = ["StudyCase", "SpringTarget", "Rebuild", "rebuilt"]

#: A case document (plain data) -> the parsed case; picklable for the worker processes of a sweep.
Rebuild = Callable[[dict], Case]


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
    """A parsed case and the function that rebuilds it from a changed document.

    ``rebuild`` is needed only to change inputs other than restraint springs
    (the re-solve path of a sweep); it must be picklable (a module-level
    function) when points go to worker processes.
    """

    case: Case
    rebuild: Rebuild | None = None

    @property
    def axes(self) -> tuple[str, ...]:
        return tuple(a for a, _ in self.case.planes)

    def restraint_tables(self) -> list[dict]:
        v = self.case.document.get("restraint", [])
        return [v] if isinstance(v, dict) else list(v)

    def targets(self, key: KeyPath) -> tuple[SpringTarget, ...]:
        """The plane springs a spring key drives (one per plane the table applies to)."""
        number = key.restraint_number  # None unless a spring key
        if number is None:
            raise CaseError(key.text, "is not a restraint spring (restraint[i].lateral or restraint[i].rotation)")
        tables = self.restraint_tables()
        if number > len(tables):
            raise CaseError(key.text, f"the case file has {len(tables)} [[restraint]] table(s), not {number}")
        out = []
        for ref in self.case.origins[f"restraint[{number}]"]:
            r = self.case.column(ref.axis).restraints[ref.index]
            offset = 0.0
            if key.kind == "rotation" and math.isfinite(r.rotation):
                raw = tables[number - 1].get("rotation", "free")
                if is_nominal(raw):  # "nominally-fixed" / "nominally-pinned": the stiffness its rule gives
                    own = nominal_rotation_at(raw, self.case.column(ref.axis).segments, r.at)
                else:
                    own = key.parse_value(raw, key.text)
                offset = r.rotation - own if math.isfinite(own) else 0.0
            out.append(SpringTarget(axis=ref.axis, restraint=ref.index, kind=key.kind, offset=offset))
        return tuple(out)

    def table_number(self, axis: str, restraint: int) -> int:
        """The [[restraint]] number (1-based) that became restraint ``restraint`` of plane ``axis``."""
        for table, refs in self.case.origins.items():
            if table.startswith("restraint[") and any(r.axis == axis and r.index == restraint for r in refs):
                return int(table[len("restraint["):-1])
        raise KeyError((axis, restraint))

    def spring_keys(self) -> tuple[KeyPath, ...]:
        """Every spring the case file gives (lateral and rotation of each restraint, if not free)."""
        out = []
        for i in range(1, len(self.restraint_tables()) + 1):
            for kind in ("lateral", "rotation"):
                key = parse_key(f"restraint[{i}].{kind}")
                tg = self.targets(key)
                col = self.case.column(tg[0].axis)
                if getattr(col.restraints[tg[0].restraint], kind) != 0.0:
                    out.append(key)
        return tuple(out)

    def with_springs(self, keys: tuple[KeyPath, ...], values: tuple[float, ...]) -> Case:
        """The case with each spring key at its SI value: restraints replaced in every plane it drives."""
        columns = dict(self.case.planes)
        for key, value in zip(keys, values):
            for tg in self.targets(key):
                col = columns[tg.axis].with_restraint(tg.restraint, **{key.kind: tg.stiffness(value)})
                r = col.restraints[tg.restraint]
                if r.lateral == 0 and r.rotation == 0:  # as the case-file parser says of such a table
                    raise CaseError(f"restraint[{key.restraint_number}]",
                                    "restrains nothing: give lateral and/or rotation")
                columns[tg.axis] = col
        return replace(self.case, planes=tuple((a, columns[a]) for a, _ in self.case.planes))

    def with_values(self, keys: tuple[KeyPath, ...], values: tuple[float, ...]) -> Case:
        """The case with each key at its SI value (springs on the parsed case; others by :func:`rebuilt`)."""
        if all(k.is_spring for k in keys):
            return self.with_springs(keys, values)
        if self.rebuild is None:
            raise FeaError("changing an input other than a restraint spring needs the case's rebuild function")
        return rebuilt(self.rebuild, self.case.document, keys, values)


def rebuilt(rebuild: Rebuild, document: Mapping, keys: tuple[KeyPath, ...], values: tuple[float, ...]) -> Case:
    """The case of ``document`` with each key at its SI value.

    Inputs other than springs are set in a copy of the document, which
    ``rebuild`` parses (every check of the case file applies); springs are
    then set on the rebuilt case by :meth:`StudyCase.with_springs`.
    """
    plain = [(k, v) for k, v in zip(keys, values) if not k.is_spring]
    springs = [(k, v) for k, v in zip(keys, values) if k.is_spring]
    case = rebuild(with_values(document, tuple(k for k, _ in plain), tuple(v for _, v in plain)))
    if not springs:
        return case
    return StudyCase(case, rebuild).with_springs(tuple(k for k, _ in springs), tuple(v for _, v in springs))
