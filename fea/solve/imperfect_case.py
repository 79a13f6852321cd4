"""Running the imperfect-column analysis a parsed case declares, plane by plane.

The case file's ``[imperfection]`` and ``[lateral]`` tables (parsed by
:mod:`fea.io.imperfect_input` into :class:`~fea.model.imperfection.ImperfectionSpec`
and :class:`~fea.model.imperfection.LateralSpec`, kept in ``case.extras``) and the
segments' sections become, for each bending plane, the inputs of
:func:`fea.solve.imperfect.analyse_imperfect`.  The results are written out by
:mod:`fea.io.imperfect_output`.
"""

from __future__ import annotations

from dataclasses import replace
from typing import TYPE_CHECKING

from ..errors import CaseError, ModelError
from ..model.imperfection import Imperfection, ImperfectionSpec, LateralSpec, SegmentSection
from ..sections import ISection

if TYPE_CHECKING:
    from ..model.case import Case, SegmentInfo
    from .imperfect import ImperfectResult

__all__ = ["FIBRE_MODEL_NOTE", "W_KEYS", "declares_imperfect",
           "imperfection_spec", "plane_inputs", "run_imperfect", "as_case_error"]

#: The ``[imperfection]`` key of the elastic section modulus of each plane (one-plane cases: ``W``).
W_KEYS = {"in-plane": "W", "major": "W_major", "minor": "W_minor"}

#: How the note describing the fibre model starts: a description of the model, not a warning.
FIBRE_MODEL_NOTE = "fibre model"


def declares_imperfect(case: Case) -> bool:
    """True when the case has an ``[imperfection]`` or a ``[lateral]`` table."""
    return "imperfection" in case.extras or "lateral" in case.extras


def imperfection_spec(case: Case) -> ImperfectionSpec:
    """The case's ``[imperfection]`` with the lateral actions of ``[lateral]`` and the [[load]] tables.

    Without ``[imperfection]``: a straight column with the lateral actions, second order only.
    """
    spec = case.extras.get("imperfection")
    lat = case.extras.get("lateral")
    if spec is None:
        spec = ImperfectionSpec(imperfection=Imperfection("half-sine", amplitude=0.0), analysis="second-order",
                                loads=lat if lat is not None else LateralSpec())
    elif lat is not None:
        spec = replace(spec, loads=lat)  # lat already includes the [[load]] actions
    return spec


def as_case_error(fn, *args, **kw):
    """``fn(*args, **kw)``, turning a ModelError into a CaseError with the same text (case-file input at fault)."""
    try:
        return fn(*args, **kw)
    except CaseError:
        raise
    except ModelError as exc:
        raise CaseError(exc.field, exc.message) from None


def _section_of(info: SegmentInfo, shape, axis: str, path: str, spec: ImperfectionSpec,
                notes: list[str]) -> SegmentSection:
    """What the stress and fibre analyses need of one segment in plane ``axis``."""
    ax = "major" if axis == "in-plane" else axis
    if shape is None:
        if info.A is None:
            raise CaseError(f"{path}.A", "missing: the imperfect-column analysis needs the area (A or a section)")
        return as_case_error(SegmentSection, A=info.A, W=spec.W.get(axis), fy=info.fy)
    is_i = isinstance(shape, ISection)
    s = as_case_error(SegmentSection.from_shape, shape, ax, info.fy, n_fibres=spec.fibres,
                      residual_stress=spec.residual_stress if is_i else 0.0, hardening=spec.hardening)
    if spec.residual_stress and not is_i:
        notes.append(f"{path}: residual_stress applies to I sections only; none used for this "
                     f"{shape.__class__.__name__}")
    if info.A is not None and abs(info.A - s.A) > 1e-6 * s.A:
        s = replace(s, A=info.A)
    if axis in spec.W:
        s = replace(s, W=spec.W[axis])
    return s


def _analysis_kind(spec: ImperfectionSpec, missing_shape: str | None, missing_fy: str | None,
                   notes: list[str]) -> str:
    """The analysis to run: the nonlinear one falls back to second order without sections by dimensions or fy."""
    if spec.analysis not in ("nonlinear", "both") or not (missing_shape or missing_fy):
        return spec.analysis
    why = (f"{missing_shape}.section: the nonlinear analysis needs each section by its dimensions"
           if missing_shape else
           f"{missing_fy}.fy: missing: the nonlinear (yield) analysis needs the yield strength fy "
           "(in [material] or the segment)")
    if spec.analysis_given:
        field_, msg = why.split(": ", 1)
        raise CaseError(field_, msg + "; or set [imperfection] analysis = 'second-order'")
    notes.append(f"nonlinear analysis skipped ({why})")
    return "second-order"


def plane_inputs(case: Case, axis: str, spec: ImperfectionSpec | None = None):
    """(column, imperfection, sections, actions, analysis, notes) of one plane of ``case``.

    A segment's section comes from the shape the case file gave (``SegmentInfo.shape``,
    built once when the case was parsed), else from its area and ``[imperfection] W``.
    """
    spec = spec or imperfection_spec(case)
    notes: list[str] = []
    sections = []
    missing_shape = missing_fy = None
    for i, info in enumerate(case.segments):
        p = f"segment[{i + 1}]"
        shape = info.shape
        if info.fy is None and missing_fy is None:
            missing_fy = p
        if shape is None and missing_shape is None:
            missing_shape = p
        sections.append(_section_of(info, shape, axis, p, spec, notes))
    analysis = _analysis_kind(spec, missing_shape, missing_fy, notes)
    w_key = W_KEYS[axis]
    if all(s.W is None for s in sections):
        notes.append("no section modulus: stresses and first yield not computed (give a section or "
                     f"[imperfection] {w_key})")
    elif any(s.W is None for s in sections):
        i = next(k for k, s in enumerate(sections) if s.W is None)
        raise CaseError(f"segment[{i + 1}].section", f"missing: give the section (or [imperfection] {w_key}) for "
                                                     "every segment, so stresses can be checked everywhere")
    if analysis in ("nonlinear", "both"):
        rs = (f"residual stress {spec.residual_stress:g} fy at the flange tips of I sections (linear flange "
              "pattern)" if spec.residual_stress else "no residual stress")
        notes.append(f"{FIBRE_MODEL_NOTE}: {spec.fibres} strips, {rs}, hardening E_t/E = {spec.hardening:g}")
    has_W = all(s.W is not None for s in sections)
    return case.column(axis), spec.imperfection, tuple(sections) if (has_W or analysis != "second-order") else None, \
        spec.loads.for_axis(axis), analysis, notes


#: Most segments of a case with an imperfect-column analysis (its solvers use dense matrices).
MAX_IMPERFECT_SEGMENTS = 200


def run_imperfect(case: Case, buckling_results=None) -> dict[str, ImperfectResult] | None:
    """Run the imperfect-column analyses ``case`` declares: ``{axis: ImperfectResult}``, or None if it declares none.

    ``buckling_results`` (optional, one BucklingResult per plane) are reused for
    the critical loads.
    """
    if not declares_imperfect(case):
        return None
    if len(case.segments) > MAX_IMPERFECT_SEGMENTS:
        # the second-order and nonlinear solvers work on dense matrices: refuse at once what they cannot hold
        raise CaseError("imperfection", f"the imperfect-column analysis takes at most {MAX_IMPERFECT_SEGMENTS} "
                                        f"segments; this case has {len(case.segments)}")
    from .imperfect import analyse_imperfect

    spec = imperfection_spec(case)
    out = {}
    for axis, _ in case.planes:
        if spec.axis != "both" and axis not in (spec.axis, "in-plane"):
            continue
        col, imp, sections, actions, analysis, notes = plane_inputs(case, axis, spec)
        opts = dict(max_steps=spec.steps, tolerance=spec.tolerance, min_elements=spec.elements, method=spec.method)
        known = next((b for b in (buckling_results or ()) if b.axis == axis), None)
        res = as_case_error(analyse_imperfect, col, imp, sections, actions, analysis=analysis, axis=axis,
                    tol=case.tolerance, path_options=opts, critical=known)
        if notes:
            res = replace(res, warnings=tuple(notes) + res.warnings)
        out[axis] = res
    return out
