"""Case-level studies: the kernels applied to the planes and [[restraint]] tables of a case.

Pure: a :class:`~fea.study.target.StudyCase` in, frozen result objects out.
"""

from __future__ import annotations

from dataclasses import dataclass

from ..errors import CaseError
from .bounds import PlaneBounds, plane_bounds
from .brace import BraceForce, BraceResult, brace_force, brace_stiffness
from .paths import parse_key
from .sensitivity import SpringSensitivity, column_sensitivities
from .spring_set import is_foundation_kind
from .target import StudyCase

__all__ = ["CaseSensitivity", "case_sensitivities", "CaseBounds", "case_bounds", "CaseBrace", "case_brace"]


@dataclass(frozen=True)
class CaseSensitivity:
    """Sensitivities of every plane; ``tables[i]`` is the [[restraint]] (or [[foundation]], by the entry's
    ``source``) number of ``entries[i]``."""

    entries: tuple[SpringSensitivity, ...]
    tables: tuple[int, ...]
    load_factors: dict
    governing_axis: str

    def ranking(self) -> list[tuple[int, SpringSensitivity]]:
        """Finite springs of the governing plane, most influential first (by normalised sensitivity)."""
        rows = [(t, e) for t, e in zip(self.tables, self.entries)
                if e.axis == self.governing_axis and e.normalised is not None]
        return sorted(rows, key=lambda te: -te[1].normalised)


def case_sensitivities(study: StudyCase, check: bool = True) -> CaseSensitivity:
    entries, tables, lams = [], [], {}
    moduli = study.foundation_keys()
    for axis, col in study.case.planes:
        kinds: dict = {}
        for key in moduli:  # the moduli the case file gives, as the plane's foundation indices
            for tg in study.targets(key):
                if tg.axis == axis:
                    kinds.setdefault(tg.restraint, []).append(tg.kind)
        rows = column_sensitivities(col, axis=axis, tol=study.case.tolerance, check=check, foundations=kinds)
        for e in rows:
            entries.append(e)
            tables.append(study.table_number(axis, e.restraint, e.source))
            lams[axis] = e.load_factor
    if not entries:
        raise CaseError("restraint", "the case has no springs")
    gov = min(lams, key=lams.get)
    return CaseSensitivity(tuple(entries), tuple(tables), lams, gov)


@dataclass(frozen=True)
class CaseBounds:
    """Bounds of every plane the uncertain springs act in, and the governing bounds."""

    keys: tuple[str, ...]
    low: tuple[float, ...]
    high: tuple[float, ...]
    planes: tuple[PlaneBounds, ...]
    fixed: dict  # axis -> load factor of planes no uncertain spring acts in

    @property
    def load_factor_min(self) -> float:
        return min([p.load_factor_min for p in self.planes] + list(self.fixed.values()))

    @property
    def load_factor_max(self) -> float:
        return min([p.load_factor_max for p in self.planes] + list(self.fixed.values()))


def case_bounds(study: StudyCase, ranges) -> CaseBounds:
    """``ranges``: ((key text, low, high), ...) with SI values."""
    from ..solve.eigen import buckling

    keys, lows, highs = [], [], []
    per_axis: dict = {a: ([], [], []) for a in study.axes}
    for text, lo, hi in ranges:
        key = parse_key(text)
        if not key.is_stiffness:
            study.targets(key)  # raises: names what can be bounded
        keys.append(key.text)
        lows.append(lo)
        highs.append(hi)
        for tg in study.targets(key):
            s, lo_, hi_ = per_axis[tg.axis]
            s.append((tg.restraint, tg.kind))
            lo_.append(tg.stiffness(lo))
            hi_.append(tg.stiffness(hi))
    if not keys:
        raise CaseError("bounds", "no uncertain spring given")
    planes, fixed = [], {}
    for axis, col in study.case.planes:
        s, lo_, hi_ = per_axis[axis]
        if s:
            planes.append(plane_bounds(col, s, lo_, hi_, axis=axis, tol=study.case.tolerance))
        else:
            fixed[axis] = buckling(col, n_modes=1, tol=study.case.tolerance).load_factor
    return CaseBounds(tuple(keys), tuple(lows), tuple(highs), tuple(planes), fixed)


@dataclass(frozen=True)
class CaseBrace:
    """Brace study of some [[restraint]] tables in one plane."""

    tables: tuple[int, ...]
    result: BraceResult
    force: BraceForce | None
    force_note: str


def case_brace(study: StudyCase, tables, kind: str = "lateral", axis: str | None = None, fraction: float = 0.95,
               eps: float = 1e-6, bow: float = 500.0) -> CaseBrace:
    """Brace study of the [[restraint]] tables ``tables`` (``kind`` "lateral" or "rotation"), or of the
    [[foundation]] tables ``tables`` when ``kind`` is a foundation modulus ("modulus", "modulus_bottom",
    "modulus_top")."""
    tables = tuple(int(t) for t in tables)
    table = "foundation" if is_foundation_kind(kind) else "restraint"
    axes = study.axes
    if axis is None:
        cands = set()
        for t in tables:
            cands |= {tg.axis for tg in study.targets(parse_key(f"{table}[{t}].{kind}"))}
        if len(cands) > 1:
            raise CaseError("axis", f"the restraints act in planes {', '.join(sorted(cands))}: name one (--axis)")
        axis = cands.pop() if cands else axes[0]
    if axis not in axes:
        raise CaseError("axis", f"the case has no {axis!r} plane; it has {', '.join(axes)}")
    idx = []
    for t in tables:
        tgs = [tg for tg in study.targets(parse_key(f"{table}[{t}].{kind}")) if tg.axis == axis]
        if not tgs:
            raise CaseError(f"{table}[{t}]", f"does not act in the {axis} plane")
        idx.append(tgs[0].restraint)
    col = study.case.column(axis)
    res = brace_stiffness(col, idx, kind=kind, fraction=fraction, eps=eps, tol=study.case.tolerance, axis=axis)
    force, note = None, ""
    if kind == "lateral":
        try:
            force = brace_force(col, res, bow_ratio=bow, tol=study.case.tolerance)
        except Exception as exc:  # the imperfect-column analysis could not give a force: say why
            note = f"brace force not available: {exc}"
    else:
        note = "brace force is given for lateral braces only"
    if table == "foundation":
        note = "brace force and the bracing rules are for lateral braces: not given for a foundation modulus"
    return CaseBrace(tables, res, force, note)
