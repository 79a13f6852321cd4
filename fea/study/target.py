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
from .spring_set import with_stiffness

__all__ = ["StudyCase", "SpringTarget", "Rebuild", "rebuilt"]

#: A case document (plain data) -> the parsed case; picklable for the worker processes of a sweep.
Rebuild = Callable[[dict], Case]


@dataclass(frozen=True)
class SpringTarget:
    """One spring of one bending plane addressed by a case-file key.

    Attributes
    ----------
    axis : bending plane
    restraint : index of the restraint (or, for a foundation modulus, of the
        foundation) in that plane's column (0-based)
    kind : "lateral" or "rotation", or "modulus", "modulus_bottom", "modulus_top"
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

    def foundation_tables(self) -> list[dict]:
        v = self.case.document.get("foundation", [])
        return [v] if isinstance(v, dict) else list(v)

    def _foundation_targets(self, key: KeyPath) -> tuple[SpringTarget, ...]:
        number = int(key.parts[0][1] or 0)
        tables = self.foundation_tables()
        if number > len(tables):
            raise CaseError(key.text, f"the case file has {len(tables)} [[foundation]] table(s), not {number}")
        table = tables[number - 1]
        if key.kind == "modulus" and "modulus" not in table:
            raise CaseError(key.text, "this [[foundation]] gives modulus_bottom and modulus_top: study those")
        if key.kind != "modulus" and "modulus" in table:
            raise CaseError(key.text, "this [[foundation]] gives one uniform modulus: study "
                                      f"foundation[{number}].modulus")
        return tuple(SpringTarget(axis=ref.axis, restraint=ref.index, kind=key.kind)
                     for ref in self.case.origins[f"foundation[{number}]"])

    def targets(self, key: KeyPath) -> tuple[SpringTarget, ...]:
        """The plane springs a stiffness key drives (one per plane the table applies to)."""
        if key.is_foundation:
            return self._foundation_targets(key)
        number = key.restraint_number  # None unless a spring key
        if number is None:
            raise CaseError(key.text, "is not a restraint spring or a foundation modulus (restraint[i].lateral, "
                                      "restraint[i].rotation, foundation[i].modulus, foundation[i].modulus_bottom "
                                      "or foundation[i].modulus_top)")
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

    def table_number(self, axis: str, restraint: int, table: str = "restraint") -> int:
        """The [[restraint]] (or [[foundation]]) number (1-based) that became item ``restraint`` of plane ``axis``."""
        for name, refs in self.case.origins.items():
            if name.startswith(f"{table}[") and any(r.axis == axis and r.index == restraint for r in refs):
                return int(name[len(table) + 1:-1])
        raise KeyError((axis, restraint))

    def foundation_keys(self) -> tuple[KeyPath, ...]:
        """Every foundation modulus the case file gives (``modulus``, or the ends it names)."""
        out = []
        for i, t in enumerate(self.foundation_tables(), start=1):
            kinds = ("modulus",) if "modulus" in t else tuple(k for k in ("modulus_bottom", "modulus_top") if k in t)
            out += [parse_key(f"foundation[{i}].{k}") for k in kinds]
        return tuple(out)

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
        """The case with each stiffness key at its SI value: restraints (foundations) replaced in every plane it
        drives.  A foundation whose moduli all become 0 is left out of the planes (it adds nothing)."""
        columns = dict(self.case.planes)
        # a foundation left with no modulus is removed: set the later foundations first
        order = sorted(zip(keys, values), key=lambda kv: -(kv[0].table_number or 0) if kv[0].is_foundation else 0)
        for key, value in order:
            for tg in self.targets(key):
                if key.is_foundation:
                    columns[tg.axis] = with_stiffness(columns[tg.axis], tg.restraint, key.kind, value)
                    continue
                col = columns[tg.axis].with_restraint(tg.restraint, **{key.kind: tg.stiffness(value)})
                r = col.restraints[tg.restraint]
                if r.lateral == 0 and r.rotation == 0:  # as the case-file parser says of such a table
                    raise CaseError(f"restraint[{key.restraint_number}]",
                                    "restrains nothing: give lateral and/or rotation")
                columns[tg.axis] = col
        return replace(self.case, planes=tuple((a, columns[a]) for a, _ in self.case.planes))

    def with_values(self, keys: tuple[KeyPath, ...], values: tuple[float, ...]) -> Case:
        """The case with each key at its SI value (springs on the parsed case; others by :func:`rebuilt`)."""
        if all(k.is_stiffness for k in keys):
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
    plain = [(k, v) for k, v in zip(keys, values) if not k.is_stiffness]
    springs = [(k, v) for k, v in zip(keys, values) if k.is_stiffness]
    case = rebuild(with_values(document, tuple(k for k, _ in plain), tuple(v for _, v in plain)))
    if not springs:
        return case
    return StudyCase(case, rebuild).with_springs(tuple(k for k, _ in springs), tuple(v for _, v in springs))
