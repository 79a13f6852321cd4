"""Section selection: required second moment of area, and the lightest catalogue section that passes.

No I/O.  Every candidate is a new finite-element model: the chosen segments
get the candidate's A, I_major and I_minor and every bending plane is solved
again, because with finite springs the effective length changes with the
section.  A one-plane case ("in-plane") uses the candidate's I_minor (the
least second moment), which is on the safe side.
"""

from __future__ import annotations

import math
from dataclasses import dataclass, replace
from typing import Sequence

from ..errors import CaseError, ModelError, SolverError
from ..model import Column
from ..model.case import Case
from ..solve.eigen import buckling
from .check import DesignCheck, DesignResult, DesignSpec, design_check
from .member import axis_buckling, design_of_case, member_data, segment_forces

__all__ = ["Candidate", "CandidateResult", "RequiredInertia", "SizingResult", "with_section", "check_candidate",
           "required_inertia", "size"]


@dataclass(frozen=True)
class Candidate:
    """One catalogue section (SI), as :mod:`fea.io.catalogue` reads it from a CSV file.

    Attributes
    ----------
    name : catalogue name
    shape : shape name, or "properties" when given by A and I
    A : area [m^2]
    I_major, I_minor : principal second moments of area [m^4]
    mass : mass per length [kg/m]
    row : line number in the file
    """

    name: str
    shape: str
    A: float
    I_major: float
    I_minor: float
    mass: float
    row: int = 0


@dataclass(frozen=True)
class CandidateResult:
    """A catalogue section checked in the member.

    Attributes
    ----------
    candidate : the section
    design : the design check, or None when the model could not be solved
    load_factor : lowest elastic critical load factor of the case loads over all planes [-]
    error : why the candidate could not be checked, or ""
    """

    candidate: Candidate
    design: DesignResult | None
    load_factor: float
    error: str = ""

    @property
    def max_utilisation(self) -> float:
        return math.inf if self.design is None else self.design.max_utilisation

    @property
    def governing(self) -> DesignCheck | None:
        return None if self.design is None else self.design.governing


@dataclass(frozen=True)
class RequiredInertia:
    """Second moment of area a bending plane needs, the area held at the case's value.

    The I of every chosen segment about the plane is multiplied by one factor
    ``scale`` (their ratios kept), the plane is solved again for each trial
    and the factor is found by bracketing root search (Brent) on ``log(scale)``
    within 1e-3 to 1e3.

    Attributes
    ----------
    axis : the bending plane
    basis : "design" (largest compression utilisation about the plane =
        target) or "elastic" (elastic critical load factor of the design loads
        = 1 / target)
    scale : the factor, or None when no factor in range reaches the target
    I_required : per chosen segment, scale x its present I [m^4] (empty when scale is None)
    note : explanation when scale is None or at the bracket limit
    """

    axis: str
    basis: str
    scale: float | None
    I_required: tuple[float, ...]
    note: str = ""


@dataclass(frozen=True)
class SizingResult:
    """Result of sizing a member from a catalogue.

    Attributes
    ----------
    standard : design standard of the case
    segments : indices (0-based) of the segments that take the candidate section
    target : utilisation a passing section must not exceed [-]
    candidates : every candidate, lightest first
    required : required second moments of area, per plane and basis
    required_note : why ``required`` is empty, or ""
    """

    standard: str
    segments: tuple[int, ...]
    target: float
    candidates: tuple[CandidateResult, ...]
    required: tuple[RequiredInertia, ...] = ()
    required_note: str = ""

    def passes(self, c: CandidateResult) -> bool:
        return c.design is not None and c.max_utilisation <= self.target

    @property
    def chosen(self) -> CandidateResult | None:
        """The lightest passing candidate, or None."""
        return next((c for c in self.candidates if self.passes(c)), None)

    @property
    def next_lighter(self) -> CandidateResult | None:
        """The heaviest candidate lighter than the chosen one (it fails by construction)."""
        ch = self.chosen
        if ch is None:
            return None
        lighter = [c for c in self.candidates if c.candidate.mass < ch.candidate.mass]
        return lighter[-1] if lighter else None


def _scaled(seg, factor: float):
    return replace(seg, I=seg.I * factor, I_top=None if seg.I_top is None else seg.I_top * factor)


def with_section(case: Case, segments: Sequence[int], cand: Candidate) -> tuple[list[Column], list[float | None]]:
    """Columns (one per plane) and areas with ``cand`` placed in ``segments``."""
    cols = []
    for axis, col in case.planes:
        I = cand.I_major if axis == "major" else cand.I_minor
        segs = tuple(replace(s, I=I, I_top=None, A=cand.A) if i in segments else s
                     for i, s in enumerate(col.segments))
        cols.append(replace(col, segments=segs))
    areas = [cand.A if i in segments else None for i in range(len(case.segments))]
    return cols, areas


def _solve(case: Case, cols: Sequence[Column]):
    return [buckling(c, n_modes=1, tol=case.tolerance, axis=a) for c, (a, _) in zip(cols, case.planes)]


def check_candidate(case: Case, spec: DesignSpec, segments: Sequence[int], cand: Candidate) -> CandidateResult:
    """Place ``cand`` in ``segments``, solve every plane again and run the design check."""
    cols, areas = with_section(case, segments, cand)
    try:
        res = _solve(case, cols)
    except (ModelError, SolverError) as exc:
        return CandidateResult(cand, None, math.nan, f"not solved: {exc}")
    # the same design check as `stanchion check`, with its sway classification of every plane
    design = design_of_case(case, res, spec, areas=areas, columns=cols)
    return CandidateResult(cand, design, min(r.load_factor for r in res))


def _root(fn, lo: float, hi: float) -> tuple[float | None, str]:
    a, b = fn(lo), fn(hi)
    if b > 0:
        return None, "not reached even at 1000 x the present I"
    if a <= 0:
        return math.exp(lo), "reached already at 0.001 x the present I (upper bound shown)"
    from scipy.optimize import brentq  # imported here: keeps start-up fast

    return math.exp(brentq(fn, lo, hi, xtol=1e-3)), ""


def required_inertia(case: Case, spec: DesignSpec, segments: Sequence[int], target: float = 1.0
                     ) -> tuple[RequiredInertia, ...]:
    """Required second moments of area of the chosen segments, per plane (see :class:`RequiredInertia`)."""
    members = member_data(case, spec)
    lo, hi = math.log(1e-3), math.log(1e3)
    out = []
    for axis, col in case.planes:
        forces = segment_forces(col)

        def column(s: float) -> Column:
            return replace(col, segments=tuple(_scaled(g, s) if i in segments else g
                                               for i, g in enumerate(col.segments)))

        def design_gap(ls: float) -> float:
            try:
                r = buckling(column(math.exp(ls)), n_modes=1, tol=case.tolerance, axis=axis)
            except (ModelError, SolverError):
                return math.inf
            d = design_check(spec, members, forces, [(axis, axis_buckling(r))])
            comp = [c.utilisation for c in d.checks if c.kind == "compression"]
            return (max(comp) if comp else 0.0) - target

        def elastic_gap(ls: float) -> float:
            try:
                lam = buckling(column(math.exp(ls)), n_modes=1, tol=case.tolerance, axis=axis).load_factor
            except (ModelError, SolverError):
                return math.inf
            return 1.0 / target - lam / spec.load_factor

        for basis, fn in (("design", design_gap), ("elastic", elastic_gap)):
            s, note = _root(fn, lo, hi)
            I_req = () if s is None else tuple(s * col.segments[i].I_ref for i in segments)
            if s is None and basis == "design":
                note += ": the section resistance of the present area governs"
            if s is None and basis == "elastic":
                note += ": the restraints limit the critical load"
            out.append(RequiredInertia(axis, basis, s, I_req, note))
    return tuple(out)


def size(case: Case, candidates: Sequence[Candidate], segments: Sequence[int] | None = None,
         target: float = 1.0, spec: DesignSpec | None = None, with_required: bool = True) -> SizingResult:
    """Check every candidate in the member and rank them by mass.

    Parameters
    ----------
    case : a case declaring ``[design]`` (or pass ``spec``)
    candidates : catalogue sections
    segments : 0-based indices of the segments that take the section (default: all)
    target : largest utilisation a passing section may have (0 < target <= 1.5)

    Returns
    -------
    SizingResult
    """
    spec = spec if spec is not None else case.extras.get("design")
    if spec is None:
        raise CaseError("design", "missing: sizing needs a [design] table naming the standard")
    if not (math.isfinite(target) and 0 < target <= 1.5):
        raise CaseError("--target", f"{target!r} is out of range: expected a utilisation > 0 and <= 1.5")
    n = len(case.segments)
    segs = tuple(range(n)) if not segments else tuple(sorted(set(segments)))
    if any(not 0 <= i < n for i in segs):
        raise CaseError("--segment", f"segment numbers must be 1 to {n}")
    results = sorted((check_candidate(case, spec, segs, c) for c in candidates),
                     key=lambda r: (r.candidate.mass, r.candidate.name))
    req: tuple[RequiredInertia, ...] = ()
    note = "not asked for"
    if with_required:
        try:
            req, note = required_inertia(case, spec, segs, target), ""
        except CaseError as exc:
            note = f"not computed: the case's own section is incomplete ({exc})"
    return SizingResult(spec.standard, segs, target, tuple(results), req, note)
