"""Case-file input of the imperfect-column analysis, and running it for a case.

Registers two optional top-level tables with :data:`fea.io.case.EXTRA_SECTIONS`:

``[imperfection]``
    ``bow`` (a length such as ``"5 mm"`` or a ratio ``"L/1000"``), ``shape``
    (``"half-sine"``, ``"half-sine-per-segment"``, ``"between-restraints"``,
    ``"mode"``, ``"offsets"``), ``offsets`` (``[["1.0 m", "3 mm"], ...]`` for
    ``shape = "offsets"``), ``axis`` (``"major"``, ``"minor"``, ``"both"``),
    ``residual_stress`` (peak compression at the flange tips of I sections as a
    fraction of fy, default 0), ``hardening`` (E_t/E, default 0), ``analysis``
    (``"second-order"``, ``"nonlinear"``, ``"both"``), ``steps`` (largest number
    of arc-length steps, default 200), ``tolerance`` (relative residual of the
    nonlinear path, default 1e-8), ``fibres`` (strips across the section, default
    40), ``elements`` (least number of elements of the nonlinear model, default
    16), ``method`` (path following: ``"arc-length"`` (default), ``"load"``
    (stops below a limit point, no ultimate load) or ``"displacement"`` (control
    of the lateral displacement at the largest bow)), ``W`` / ``W_major`` / ``W_minor`` (elastic section moduli for segments
    without a section shape), ``note``.
``[lateral]``
    arrays of tables ``[[lateral.point]]`` (``at``, ``force``),
    ``[[lateral.distributed]]`` (``from``, ``to``, ``per_length``, optional
    ``per_length_top``) and ``[[lateral.moment]]`` (``at``, ``moment``), each
    with optional ``axis`` (default both), ``permanent`` (default false) and
    ``note``.

and reads from every ``[[load]]``: ``eccentricity`` (a length, in every plane
analysed), ``eccentricity_major`` / ``eccentricity_minor`` (one plane each, they
override ``eccentricity``) and ``lateral`` (a lateral force at the load's
station, in every plane).  Signs: see :mod:`fea.model.imperfection`.
"""

from __future__ import annotations

import math
import re
from dataclasses import dataclass, field, replace
from typing import TYPE_CHECKING, Any

from ..errors import CaseError, ModelError
from ..model.imperfection import (ANALYSES, BOW_SHAPES, AppliedMoment, Imperfection, LateralActions, LateralDistributedLoad,
                            LateralPointLoad, SegmentSection)
from ..units import parse
from . import case as _case

if TYPE_CHECKING:  # the solvers are imported only when a case declares an imperfection
    from ..solve.imperfect import ImperfectResult

__all__ = ["ImperfectionSpec", "LateralSpec", "parse_imperfection", "parse_lateral", "shape_from_table",
           "declares_imperfect", "run_imperfect", "imperfect_analysis", "plane_inputs"]

IMPERFECTION_KEYS = {"bow", "shape", "offsets", "axis", "residual_stress", "hardening", "analysis", "steps",
                     "tolerance", "fibres", "elements", "method", "W", "W_major", "W_minor", "note"}
METHODS = ("arc-length", "load", "displacement")
DEFAULT_STEPS = 200
DEFAULT_PATH_TOL = 1e-8
DEFAULT_FIBRES = 40
DEFAULT_ELEMENTS = 16
_RATIO = re.compile(r"^\s*L\s*/\s*([0-9]*\.?[0-9]+(?:[eE][+-]?[0-9]+)?)\s*$")


@dataclass(frozen=True)
class LateralSpec:
    """Lateral actions of a case per plane label ("major", "minor" or "" for every plane)."""

    point: tuple[tuple[str, LateralPointLoad], ...] = ()
    distributed: tuple[tuple[str, LateralDistributedLoad], ...] = ()
    moments: tuple[tuple[str, AppliedMoment], ...] = ()

    def for_axis(self, axis: str) -> LateralActions:
        def pick(items):
            return tuple(a for ax, a in items if ax in ("", axis))

        return LateralActions(point=pick(self.point), distributed=pick(self.distributed), moments=pick(self.moments))

    def merged(self, other: "LateralSpec") -> "LateralSpec":
        return LateralSpec(self.point + other.point, self.distributed + other.distributed,
                           self.moments + other.moments)

    @property
    def empty(self) -> bool:
        return not (self.point or self.distributed or self.moments)


@dataclass(frozen=True)
class ImperfectionSpec:
    """What ``[imperfection]`` says, in SI."""

    imperfection: Imperfection
    axis: str = "both"
    residual_stress: float = 0.0
    hardening: float = 0.0
    analysis: str = "both"
    analysis_given: bool = False
    steps: int = DEFAULT_STEPS
    tolerance: float = DEFAULT_PATH_TOL
    fibres: int = DEFAULT_FIBRES
    elements: int = DEFAULT_ELEMENTS
    method: str = "arc-length"
    W: dict = field(default_factory=dict)
    loads: LateralSpec = field(default_factory=LateralSpec)


# ---------------------------------------------------------------------------
# helpers


def _height(doc: dict) -> float:
    segs = doc.get("segment", [])
    if isinstance(segs, dict):
        segs = [segs]
    return math.fsum(parse(f"segment[{i + 1}].length", s["length"], "length") for i, s in enumerate(segs))


def _station(value: Any, path: str, H: float) -> float:
    if isinstance(value, str) and value.strip().lower() == "base":
        return 0.0
    if isinstance(value, str) and value.strip().lower() == "top":
        return H
    x = parse(path, value, "length")
    if x < -1e-9 * H or x > H * (1 + 1e-9):
        raise CaseError(path, f"height {value!r} is outside the column (0 to {H:g} m from the base)")
    return min(max(x, 0.0), H)


def _axis(value: Any, path: str) -> str:
    if value is None or value == "both":
        return ""
    if value not in _case.AXES:
        raise CaseError(path, f"expected 'major', 'minor' or 'both', got {value!r}")
    return value


def _number(value: Any, path: str, lo: float, hi: float, what: str, integer: bool = False) -> float:
    ok = isinstance(value, (int, float)) and not isinstance(value, bool) and (not integer or isinstance(value, int))
    if not ok or not (lo <= value <= hi):
        raise CaseError(path, f"expected {what} from {lo:g} to {hi:g}, got {value!r}")
    return value


def _bool(value: Any, path: str) -> bool:
    if not isinstance(value, bool):
        raise CaseError(path, f"expected true or false, got {value!r}")
    return value


def _wrap(fn, *args, **kw):
    """Call a model constructor, turning its ModelError into a CaseError with the same text."""
    try:
        return fn(*args, **kw)
    except CaseError:
        raise
    except ModelError as exc:
        raise CaseError(exc.field, exc.message) from None


def _load_actions(doc: dict, H: float) -> LateralSpec:
    """Eccentricity moments and lateral forces carried by the [[load]] tables."""
    loads = doc.get("load", [])
    if isinstance(loads, dict):
        loads = [loads]
    moments, points = [], []
    for i, t in enumerate(loads):
        p = f"load[{i + 1}]"
        if not isinstance(t, dict):
            continue
        at = _station(t.get("at", "top"), f"{p}.at", H)
        perm = bool(t.get("permanent", False))
        P = parse(f"{p}.axial", t["axial"], "force") if "axial" in t else 0.0
        ecc = {"": None, "major": None, "minor": None}
        for key, ax in (("eccentricity", ""), ("eccentricity_major", "major"), ("eccentricity_minor", "minor")):
            if key in t:
                ecc[ax] = parse(f"{p}.{key}", t[key], "length")
        if ecc["major"] is None and ecc["minor"] is None:
            if ecc[""] is not None:
                moments.append(("", AppliedMoment(at, P * ecc[""], perm)))
        else:
            # a plane-specific value replaces the shared one in its plane
            for ax in ("major", "minor"):
                e = ecc[ax] if ecc[ax] is not None else ecc[""]
                if e is not None:
                    moments.append((ax, AppliedMoment(at, P * e, perm)))
        if "lateral" in t:
            points.append(("", LateralPointLoad(at, parse(f"{p}.lateral", t["lateral"], "force"), perm)))
    return LateralSpec(point=tuple(points), moments=tuple(moments))


# ---------------------------------------------------------------------------
# parsers registered with the case reader


def parse_imperfection(table: dict, doc: dict) -> ImperfectionSpec:
    """Parse ``[imperfection]`` (and the eccentricities and lateral forces of the [[load]] tables)."""
    _case._check_keys(table, "imperfection", IMPERFECTION_KEYS)
    H = _height(doc)
    shape = table.get("shape", "half-sine")
    if shape not in BOW_SHAPES:
        raise CaseError("imperfection.shape", f"expected one of {', '.join(BOW_SHAPES)}, got {shape!r}")
    if shape == "offsets":
        if "bow" in table:
            raise CaseError("imperfection.bow", "is not used with shape = 'offsets': the offsets give the bow")
        raw = table.get("offsets")
        if not isinstance(raw, list) or len(raw) < 2:
            raise CaseError("imperfection.offsets", "expected at least two [height, offset] pairs such as "
                                                    "[[\"1.0 m\", \"3 mm\"], [\"2.0 m\", \"4 mm\"]]")
        pts = []
        for j, pair in enumerate(raw):
            pj = f"imperfection.offsets[{j + 1}]"
            if not isinstance(pair, list) or len(pair) != 2:
                raise CaseError(pj, f"expected a [height, offset] pair, got {pair!r}")
            pts.append((_station(pair[0], pj, H), parse(pj, pair[1], "length")))
        imp = _wrap(Imperfection, shape="offsets", offsets=tuple(pts))
    else:
        if "offsets" in table:
            raise CaseError("imperfection.offsets", f"only used with shape = 'offsets', not {shape!r}")
        if "bow" not in table:
            raise CaseError("imperfection.bow", "missing: give a length such as '5 mm' or a ratio such as 'L/1000'")
        bow = table["bow"]
        m = _RATIO.match(bow) if isinstance(bow, str) else None
        if m:
            ratio = float(m.group(1))
            if ratio <= 0:
                raise CaseError("imperfection.bow", f"{bow!r}: the ratio must be positive, e.g. 'L/1000'")
            imp = _wrap(Imperfection, shape=shape, ratio=ratio)
        else:
            if isinstance(bow, str) and bow.strip().startswith("-"):
                raise CaseError("imperfection.bow", f"{bow!r} is negative: expected a bow >= 0 such as '5 mm' or "
                                                    "'L/1000' (it points towards +w; use shape = 'offsets' for "
                                                    "another direction)")
            imp = _wrap(Imperfection, shape=shape, amplitude=parse("imperfection.bow", bow, "length"))
    axis = table.get("axis", "both")
    if axis not in ("both", *_case.AXES):
        raise CaseError("imperfection.axis", f"expected 'major', 'minor' or 'both', got {axis!r}")
    rs = _number(table.get("residual_stress", 0.0), "imperfection.residual_stress", 0.0, 0.99,
                 "a fraction of fy")
    hard = _number(table.get("hardening", 0.0), "imperfection.hardening", 0.0, 0.5, "a modulus ratio E_t/E")
    analysis = table.get("analysis", "both")
    if analysis not in ANALYSES:
        raise CaseError("imperfection.analysis", f"expected one of {', '.join(ANALYSES)}, got {analysis!r}")
    steps = int(_number(table.get("steps", DEFAULT_STEPS), "imperfection.steps", 10, 5000, "a whole number",
                        integer=True))
    tol = float(_number(table.get("tolerance", DEFAULT_PATH_TOL), "imperfection.tolerance", 1e-12, 1e-4,
                        "a relative tolerance"))
    fibres = int(_number(table.get("fibres", DEFAULT_FIBRES), "imperfection.fibres", 4, 400, "a whole number",
                         integer=True))
    elements = int(_number(table.get("elements", DEFAULT_ELEMENTS), "imperfection.elements", 4, 400,
                           "a whole number", integer=True))
    method = table.get("method", "arc-length")
    if method not in METHODS:
        raise CaseError("imperfection.method", f"expected one of {', '.join(METHODS)}, got {method!r}")
    W = {}
    for key, ax in (("W", "in-plane"), ("W_major", "major"), ("W_minor", "minor")):
        if key in table:
            v = parse(f"imperfection.{key}", table[key], "section modulus")
            if not v > 0:
                raise CaseError(f"imperfection.{key}", f"{table[key]!r} must be positive")
            W[ax] = v
    return ImperfectionSpec(imperfection=imp, axis=axis, residual_stress=float(rs), hardening=float(hard),
                            analysis=analysis, analysis_given="analysis" in table, steps=steps, tolerance=tol,
                            fibres=fibres, elements=elements, method=method, W=W,
                            loads=_load_actions(doc, H))


def parse_lateral(table: dict, doc: dict) -> LateralSpec:
    """Parse ``[lateral]`` with ``[[lateral.point]]``, ``[[lateral.distributed]]``, ``[[lateral.moment]]``."""
    _case._check_keys(table, "lateral", {"point", "distributed", "moment", "note"})
    H = _height(doc)
    out_p, out_d, out_m = [], [], []

    def rows(key):
        v = table.get(key, [])
        if isinstance(v, dict):
            v = [v]
        if not isinstance(v, list) or not all(isinstance(t, dict) for t in v):
            raise CaseError(f"lateral.{key}", f"expected [[lateral.{key}]] tables, got {v!r}")
        return v

    for i, t in enumerate(rows("point")):
        p = f"lateral.point[{i + 1}]"
        _case._check_keys(t, p, {"at", "force", "axis", "permanent", "note"})
        for k in ("at", "force"):
            if k not in t:
                raise CaseError(f"{p}.{k}", "missing: a lateral point load needs `at` and `force`")
        out_p.append((_axis(t.get("axis"), f"{p}.axis"),
                      _wrap(LateralPointLoad, _station(t["at"], f"{p}.at", H), parse(f"{p}.force", t["force"], "force"),
                            _bool(t.get("permanent", False), f"{p}.permanent"))))
    for i, t in enumerate(rows("distributed")):
        p = f"lateral.distributed[{i + 1}]"
        _case._check_keys(t, p, {"from", "to", "per_length", "per_length_top", "axis", "permanent", "note"})
        if "per_length" not in t:
            raise CaseError(f"{p}.per_length", "missing: give a lateral load per height such as '1.2 kN/m'")
        a = _station(t.get("from", "base"), f"{p}.from", H)
        b = _station(t.get("to", "top"), f"{p}.to", H)
        if not b > a:
            raise CaseError(f"{p}.to", f"must be above `from` ({a:g} m)")
        qb = parse(f"{p}.per_length", t["per_length"], "force per length")
        qt = parse(f"{p}.per_length_top", t["per_length_top"], "force per length") if "per_length_top" in t else None
        out_d.append((_axis(t.get("axis"), f"{p}.axis"),
                      _wrap(LateralDistributedLoad, a, b, qb, qt, _bool(t.get("permanent", False), f"{p}.permanent"))))
    for i, t in enumerate(rows("moment")):
        p = f"lateral.moment[{i + 1}]"
        _case._check_keys(t, p, {"at", "moment", "axis", "permanent", "note"})
        for k in ("at", "moment"):
            if k not in t:
                raise CaseError(f"{p}.{k}", "missing: an applied moment needs `at` and `moment`")
        out_m.append((_axis(t.get("axis"), f"{p}.axis"),
                      _wrap(AppliedMoment, _station(t["at"], f"{p}.at", H), parse(f"{p}.moment", t["moment"], "moment"),
                            _bool(t.get("permanent", False), f"{p}.permanent"))))
    return LateralSpec(tuple(out_p), tuple(out_d), tuple(out_m)).merged(_load_actions(doc, H))




# ---------------------------------------------------------------------------
# sections


def shape_from_table(table: dict, path: str):
    """A shape of :mod:`fea.sections` from a segment's ``section`` table (the format of the section hook)."""
    from .design_input import build_shape

    if "shape" not in table:
        raise CaseError(f"{path}.shape", "missing: give a shape such as 'i', 'rhs', 'chs', 'angle'")
    dims = {k: parse(f"{path}.{k}", v, "length") for k, v in table.items() if k != "shape"}
    return build_shape(table["shape"], dims, path)


# ---------------------------------------------------------------------------
# running a case


def declares_imperfect(case) -> bool:
    """True when the case has an ``[imperfection]`` or a ``[lateral]`` table."""
    return "imperfection" in case.extras or "lateral" in case.extras


def _spec(case) -> ImperfectionSpec:
    spec = case.extras.get("imperfection")
    lat = case.extras.get("lateral")
    if spec is None:
        # lateral actions on a straight column
        spec = ImperfectionSpec(imperfection=Imperfection("half-sine", amplitude=0.0), analysis="second-order",
                                loads=lat if lat is not None else LateralSpec())
    elif lat is not None:
        spec = replace(spec, loads=lat)  # lat already includes the [[load]] actions
    return spec


def plane_inputs(case, axis: str, spec: ImperfectionSpec | None = None):
    """(column, imperfection, sections, actions, analysis, notes) of one plane of ``case``."""
    spec = spec or _spec(case)
    col = case.column(axis)
    ax = "major" if axis == "in-plane" else axis
    need_nl = spec.analysis in ("nonlinear", "both")
    notes = []
    sections = []
    missing_shape = missing_fy = None
    for i, info in enumerate(case.segments):
        p = f"segment[{i + 1}]"
        shape = shape_from_table(info.section, f"{p}.section") if info.section is not None else None
        fy = info.fy
        if fy is None and missing_fy is None:
            missing_fy = p
        if shape is not None:
            s = _wrap(SegmentSection.from_shape, shape, ax, fy, n_fibres=spec.fibres,
                      residual_stress=spec.residual_stress if shape.__class__.__name__ == "ISection" else 0.0,
                      hardening=spec.hardening)
            if spec.residual_stress and shape.__class__.__name__ != "ISection":
                notes.append(f"{p}: residual_stress applies to I sections only; none used for this "
                             f"{shape.__class__.__name__}")
            if info.A is not None and abs(info.A - s.A) > 1e-6 * s.A:
                s = replace(s, A=info.A)
            if axis in spec.W:
                s = replace(s, W=spec.W[axis])
        else:
            if missing_shape is None:
                missing_shape = p
            A = info.A
            if A is None:
                raise CaseError(f"{p}.A", "missing: the imperfect-column analysis needs the area (A or a section)")
            W = spec.W.get(axis)
            s = _wrap(SegmentSection, A=A, W=W, fy=fy)
        sections.append(s)
    analysis = spec.analysis
    if need_nl and (missing_shape or missing_fy):
        why = (f"{missing_shape}.section: the nonlinear analysis needs each section by its dimensions"
               if missing_shape else
               f"{missing_fy}.fy: missing: the nonlinear (yield) analysis needs the yield strength fy "
               "(in [material] or the segment)")
        if spec.analysis_given:
            field_, msg = why.split(": ", 1)
            raise CaseError(field_, msg + "; or set [imperfection] analysis = 'second-order'")
        analysis = "second-order"
        notes.append(f"nonlinear analysis skipped ({why})")
    if all(s.W is None for s in sections):
        notes.append("no section modulus: stresses and first yield not computed (give a section or "
                     f"[imperfection] W_{ax})")
    elif any(s.W is None for s in sections):
        i = next(k for k, s in enumerate(sections) if s.W is None)
        raise CaseError(f"segment[{i + 1}].section", "missing: give the section (or [imperfection] W_...) for every "
                                                     "segment, so stresses can be checked everywhere")
    if analysis in ("nonlinear", "both"):
        rs = (f"residual stress {spec.residual_stress:g} fy at the flange tips of I sections (linear flange "
              "pattern)" if spec.residual_stress else "no residual stress")
        notes.append(f"fibre model: {spec.fibres} strips, {rs}, hardening E_t/E = {spec.hardening:g}")
    has_W = all(s.W is not None for s in sections)
    return col, spec.imperfection, tuple(sections) if (has_W or analysis != "second-order") else None, \
        spec.loads.for_axis(axis), analysis, notes


def run_imperfect(case, buckling_results=None) -> dict[str, "ImperfectResult"]:
    """Run the imperfect-column analyses ``case`` declares; ``{axis: ImperfectResult}`` (empty if none).

    ``buckling_results`` (optional, one BucklingResult per plane) are reused for the critical loads.
    """
    if not declares_imperfect(case):
        return {}
    from ..solve.imperfect import analyse_imperfect

    spec = _spec(case)
    out = {}
    for axis, _ in case.planes:
        if spec.axis != "both" and axis not in (spec.axis, "in-plane"):
            continue
        col, imp, sections, actions, analysis, notes = plane_inputs(case, axis, spec)
        opts = dict(max_steps=spec.steps, tolerance=spec.tolerance, min_elements=spec.elements, method=spec.method)
        try:
            known = next((b for b in (buckling_results or ()) if b.axis == axis), None)
            res = analyse_imperfect(col, imp, sections, actions, analysis=analysis, axis=axis, tol=case.tolerance,
                                    path_options=opts, critical=known)
        except CaseError:
            raise
        except ModelError as exc:
            raise CaseError(exc.field, exc.message) from None
        if notes:
            res = replace(res, warnings=tuple(notes) + res.warnings)
        out[axis] = res
    return out


def imperfect_analysis(case, buckling_results=None) -> dict[str, "ImperfectResult"] | None:
    """Adapter for :data:`fea.pipeline.ANALYSES`: the results, or None when the case declares nothing."""
    return run_imperfect(case, buckling_results) or None


def register() -> None:
    """Add the case tables, the ``"imperfect"`` analysis, its JSON part and summary lines to the registries.

    Called on import; the module is listed in :data:`fea.extensions.MODULES` to take part in ``stanchion check``.
    """
    from .. import pipeline as runner
    from . import export, summary
    from .design_input import register as _sections  # noqa: F401  (installs the section hook)
    from .imperfect_output import imperfect_json, imperfect_summary  # numpy only

    _case.EXTRA_SECTIONS["imperfection"] = parse_imperfection
    _case.EXTRA_SECTIONS["lateral"] = parse_lateral
    _case._LOAD_EXTRA.update({"eccentricity_major", "eccentricity_minor"})
    runner.ANALYSES["imperfect"] = imperfect_analysis
    export.JSON_SECTIONS["imperfect"] = imperfect_json
    summary.SUMMARY_SECTIONS["imperfect"] = imperfect_summary


register()
