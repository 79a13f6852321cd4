"""Case-file input of the imperfect-column analysis: the tables -> spec objects of :mod:`fea.model.imperfection`.

Parses two optional top-level tables (listed in :data:`fea.pipeline.ANALYSES`):

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
    of the lateral displacement at the largest bow)), ``W`` (one-plane case:
    segments given by ``I``) or ``W_major`` / ``W_minor`` (two planes) (elastic
    section moduli for segments without a section shape; a key of the other
    kind is an error), ``note``.
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

The analysis itself runs in :mod:`fea.solve.imperfect_case`; its outputs are
written by :mod:`fea.io.imperfect_output`.
"""

from __future__ import annotations

import math
import re
from typing import Any

from ..errors import CaseError
from ..model.imperfection import (
    BOW_SHAPES,
    DEFAULT_ELEMENTS,
    DEFAULT_FIBRES,
    DEFAULT_PATH_TOL,
    DEFAULT_STEPS,
    IMPERFECT_ANALYSIS_KINDS,
    PATH_METHODS,
    AppliedMoment,
    Imperfection,
    ImperfectionSpec,
    LateralDistributedLoad,
    LateralPointLoad,
    LateralSpec,
)
from ..solve.imperfect_case import as_case_error
from ..units import parse
from .limits import MAX_LOADS, MAX_OFFSETS, check_count
from .tables import AXES, Stations, as_bool, check_keys

__all__ = ["parse_imperfection", "parse_lateral"]

IMPERFECTION_KEYS = {"bow", "shape", "offsets", "axis", "residual_stress", "hardening", "analysis", "steps",
                     "tolerance", "fibres", "elements", "method", "W", "W_major", "W_minor", "note"}
_RATIO = re.compile(r"^\s*L\s*/\s*([0-9]*\.?[0-9]+(?:[eE][+-]?[0-9]+)?)\s*$")


# ---------------------------------------------------------------------------
# helpers


def _height(doc: dict) -> float:
    segs = doc.get("segment", [])
    if isinstance(segs, dict):
        segs = [segs]
    return math.fsum(parse(f"segment[{i + 1}].length", s["length"], "length") for i, s in enumerate(segs))


def _axis(value: Any, path: str) -> str:
    if value is None or value == "both":
        return ""
    if value not in AXES:
        raise CaseError(path, f"expected 'major', 'minor' or 'both', got {value!r}")
    return value


def _number(value: Any, path: str, lo: float, hi: float, what: str, integer: bool = False) -> float:
    ok = isinstance(value, (int, float)) and not isinstance(value, bool) and (not integer or isinstance(value, int))
    if not ok or not (lo <= value <= hi):
        raise CaseError(path, f"expected {what} from {lo:g} to {hi:g}, got {value!r}")
    return value


def _load_actions(doc: dict, station: Stations) -> LateralSpec:
    """Eccentricity moments and lateral forces carried by the [[load]] tables."""
    loads = doc.get("load", [])
    if isinstance(loads, dict):
        loads = [loads]
    moments, points = [], []
    for i, t in enumerate(loads):
        p = f"load[{i + 1}]"
        if not isinstance(t, dict):
            continue
        at = station(t.get("at", "top"), f"{p}.at")
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
# [imperfection]


def _offsets_bow(table: dict, station: Stations) -> Imperfection:
    if "bow" in table:
        raise CaseError("imperfection.bow", "is not used with shape = 'offsets': the offsets give the bow")
    raw = table.get("offsets")
    if not isinstance(raw, list) or len(raw) < 2:
        raise CaseError("imperfection.offsets", "expected at least two [height, offset] pairs such as "
                                                "[[\"1.0 m\", \"3 mm\"], [\"2.0 m\", \"4 mm\"]]")
    check_count(len(raw), MAX_OFFSETS, "imperfection.offsets", "offsets")
    pts = []
    for j, pair in enumerate(raw):
        pj = f"imperfection.offsets[{j + 1}]"
        if not isinstance(pair, list) or len(pair) != 2:
            raise CaseError(pj, f"expected a [height, offset] pair, got {pair!r}")
        pts.append((station(pair[0], pj), parse(pj, pair[1], "length")))
    return as_case_error(Imperfection, shape="offsets", offsets=tuple(pts))


def _bow(table: dict, station: Stations) -> Imperfection:
    """The bow of ``[imperfection]``: measured offsets, a ratio ``"L/1000"`` or a length."""
    shape = table.get("shape", "half-sine")
    if shape not in BOW_SHAPES:
        raise CaseError("imperfection.shape", f"expected one of {', '.join(BOW_SHAPES)}, got {shape!r}")
    if shape == "offsets":
        return _offsets_bow(table, station)
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
        return as_case_error(Imperfection, shape=shape, ratio=ratio)
    if isinstance(bow, str) and bow.strip().startswith("-"):
        raise CaseError("imperfection.bow", f"{bow!r} is negative: expected a bow >= 0 such as '5 mm' or "
                                            "'L/1000' (it points towards +w; use shape = 'offsets' for "
                                            "another direction)")
    return as_case_error(Imperfection, shape=shape, amplitude=parse("imperfection.bow", bow, "length"))


def _choice(table: dict, key: str, default: str, choices: tuple[str, ...]) -> str:
    value = table.get(key, default)
    if value not in choices:
        raise CaseError(f"imperfection.{key}", f"expected one of {', '.join(choices)}, got {value!r}")
    return value


def _one_plane(doc: dict) -> bool:
    """True when the segments give a single ``I`` (a one-plane case, as :mod:`fea.io.case` decides)."""
    segs = doc.get("segment", [])
    first = segs[0] if isinstance(segs, list) and segs else segs
    return isinstance(first, dict) and "I" in first


def _section_moduli(table: dict, doc: dict) -> dict[str, float]:
    """``W`` (one-plane case) or ``W_major`` / ``W_minor`` (two planes), keyed by the plane they apply to."""
    one_plane = _one_plane(doc)
    for key in ("W_major", "W_minor") if one_plane else ("W",):
        if key in table:
            want = ("the segments give a single I (one-plane case): give W" if one_plane else
                    "the segments give I_major and I_minor (or a section): give W_major and W_minor, one per plane")
            raise CaseError(f"imperfection.{key}", f"{table[key]!r} given, but {want}")
    W = {}
    for key, ax in (("W", "in-plane"), ("W_major", "major"), ("W_minor", "minor")):
        if key in table:
            v = parse(f"imperfection.{key}", table[key], "section modulus")
            if not v > 0:
                raise CaseError(f"imperfection.{key}", f"{table[key]!r} must be positive")
            W[ax] = v
    return W


def parse_imperfection(table: dict, doc: dict) -> ImperfectionSpec:
    """Parse ``[imperfection]`` (and the eccentricities and lateral forces of the [[load]] tables)."""
    check_keys(table, "imperfection", IMPERFECTION_KEYS)
    station = Stations(_height(doc))
    imp = _bow(table, station)
    axis = table.get("axis", "both")
    if axis not in ("both", *AXES):
        raise CaseError("imperfection.axis", f"expected 'major', 'minor' or 'both', got {axis!r}")
    rs = _number(table.get("residual_stress", 0.0), "imperfection.residual_stress", 0.0, 0.99,
                 "a fraction of fy")
    hard = _number(table.get("hardening", 0.0), "imperfection.hardening", 0.0, 0.5, "a modulus ratio E_t/E")
    analysis = _choice(table, "analysis", "both", IMPERFECT_ANALYSIS_KINDS)
    steps = int(_number(table.get("steps", DEFAULT_STEPS), "imperfection.steps", 10, 5000, "a whole number",
                        integer=True))
    tol = float(_number(table.get("tolerance", DEFAULT_PATH_TOL), "imperfection.tolerance", 1e-12, 1e-4,
                        "a relative tolerance"))
    fibres = int(_number(table.get("fibres", DEFAULT_FIBRES), "imperfection.fibres", 4, 400, "a whole number",
                         integer=True))
    elements = int(_number(table.get("elements", DEFAULT_ELEMENTS), "imperfection.elements", 4, 400,
                           "a whole number", integer=True))
    method = _choice(table, "method", "arc-length", PATH_METHODS)
    return ImperfectionSpec(imperfection=imp, axis=axis, residual_stress=float(rs), hardening=float(hard),
                            analysis=analysis, analysis_given="analysis" in table, steps=steps, tolerance=tol,
                            fibres=fibres, elements=elements, method=method, W=_section_moduli(table, doc),
                            loads=_load_actions(doc, station))


# ---------------------------------------------------------------------------
# [lateral]

#: Concentrated lateral actions of [lateral]: key -> (value key, its dimension, model type, what it is).
_CONCENTRATED = {"point": ("force", "force", LateralPointLoad, "a lateral point load"),
                 "moment": ("moment", "moment", AppliedMoment, "an applied moment")}


def _rows(table: dict, key: str) -> list[dict]:
    v = table.get(key, [])
    if isinstance(v, dict):
        v = [v]
    if isinstance(v, list):
        check_count(len(v), MAX_LOADS, f"lateral.{key}", f"[[lateral.{key}]] tables")
    if not isinstance(v, list) or not all(isinstance(t, dict) for t in v):
        raise CaseError(f"lateral.{key}", f"expected [[lateral.{key}]] tables, got {v!r}")
    return v


def _concentrated(table: dict, key: str, station: Stations) -> tuple:
    """``[[lateral.point]]`` or ``[[lateral.moment]]`` rows -> (plane label, action) pairs."""
    value_key, dimension, cls, what = _CONCENTRATED[key]
    out = []
    for i, t in enumerate(_rows(table, key)):
        p = f"lateral.{key}[{i + 1}]"
        check_keys(t, p, {"at", value_key, "axis", "permanent", "note"})
        for k in ("at", value_key):
            if k not in t:
                raise CaseError(f"{p}.{k}", f"missing: {what} needs `at` and `{value_key}`")
        out.append((_axis(t.get("axis"), f"{p}.axis"),
                    as_case_error(cls, station(t["at"], f"{p}.at"), parse(f"{p}.{value_key}", t[value_key], dimension),
                          as_bool(t.get("permanent", False), f"{p}.permanent"))))
    return tuple(out)


def _distributed(table: dict, station: Stations) -> tuple:
    out = []
    for i, t in enumerate(_rows(table, "distributed")):
        p = f"lateral.distributed[{i + 1}]"
        check_keys(t, p, {"from", "to", "per_length", "per_length_top", "axis", "permanent", "note"})
        if "per_length" not in t:
            raise CaseError(f"{p}.per_length", "missing: give a lateral load per height such as '1.2 kN/m'")
        a = station(t.get("from", "base"), f"{p}.from")
        b = station(t.get("to", "top"), f"{p}.to")
        if not b > a:
            raise CaseError(f"{p}.to", f"must be above `from` ({a:g} m)")
        qb = parse(f"{p}.per_length", t["per_length"], "force per length")
        qt = parse(f"{p}.per_length_top", t["per_length_top"], "force per length") if "per_length_top" in t else None
        perm = as_bool(t.get("permanent", False), f"{p}.permanent")
        out.append((_axis(t.get("axis"), f"{p}.axis"), as_case_error(LateralDistributedLoad, a, b, qb, qt, perm)))
    return tuple(out)


def parse_lateral(table: dict, doc: dict) -> LateralSpec:
    """Parse ``[lateral]`` with ``[[lateral.point]]``, ``[[lateral.distributed]]``, ``[[lateral.moment]]``."""
    check_keys(table, "lateral", {"point", "distributed", "moment", "note"})
    station = Stations(_height(doc))
    point = _concentrated(table, "point", station)
    distributed = _distributed(table, station)
    moments = _concentrated(table, "moment", station)
    return LateralSpec(point, distributed, moments).merged(_load_actions(doc, station))

