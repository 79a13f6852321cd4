"""The case file's ``[design]`` table -> :class:`~fea.design.check.DesignSpec` (keys in ``docs/design.md``)."""

from __future__ import annotations

import difflib
import math
import re
from typing import Any

from ..design.bending_result import BOWS, INTERACTIONS, LT_CURVES, LTB_ROUTES, BendingOptions
from ..design.check import ANGLE_LOADS, PARAMETERS, PER_AXIS, DesignSpec
from ..design.curves import AS4100_ALPHA_B, BS5950_ROBERTSON, EN1993_IMPERFECTION
from ..errors import CaseError, ModelError
from ..quantity import NUMBER_PATTERN
from ..units import parse
from ..util.checks import as_number, check_keys

__all__ = ["parse_design"]



def _number(value: Any, path: str, low: float = 0.0, high: float = math.inf, low_open: bool = True) -> float:
    return float(as_number(value, path, low, high, low_open=low_open))


_RATIO = re.compile(rf"^\s*({NUMBER_PATTERN})\s*/\s*({NUMBER_PATTERN})\s*$")


def _rankine_a(value: Any, path: str) -> float:
    """Rankine's constant: a number, or a ratio of two plain numbers such as ``"1/7500"`` (nothing else)."""
    if isinstance(value, str):
        m = _RATIO.match(value)
        if m is None or float(m.group(2)) == 0.0:
            raise CaseError(path, f"{value[:40]!r} is not a number such as 1.33e-4 or a ratio such as '1/7500'")
        return _number(float(m.group(1)) / float(m.group(2)), path)
    return _number(value, path)


def _param(standard: str, name: str, value: Any, path: str) -> Any:
    base = name.removesuffix("_major").removesuffix("_minor") if name.endswith(("_major", "_minor")) else name
    if base == "curve":
        allowed = sorted(EN1993_IMPERFECTION) if standard == "EN 1993-1-1" else sorted(BS5950_ROBERTSON)
        if value not in allowed:
            what = "buckling curve" if standard == "EN 1993-1-1" else "strut curve"
            raise CaseError(path, f"{value!r} is not a {standard} {what}; expected one of {', '.join(allowed)}")
        return value
    if base == "alpha_b":
        v = _number(value, path, low=-1.0, low_open=False, high=1.0)
        if v not in AS4100_ALPHA_B:
            raise CaseError(path, f"{value!r} is not an AS 4100 member section constant; "
                                  "expected -1, -0.5, 0, 0.5 or 1")
        return v
    if base == "method":
        if not isinstance(value, str) or value.upper() not in ("LRFD", "ASD"):
            raise CaseError(path, f"expected 'LRFD' or 'ASD', got {value!r}")
        return value.upper()
    if base in ("gamma_M0", "gamma_M1", "gamma_M2"):
        return _number(value, path, low=0.0, high=10.0)
    if base in ("kf", "phi"):
        return _number(value, path, high=1.0)
    if base == "coefficient":
        return _number(value, path, low=0.0, low_open=False, high=1.0)
    if base == "factor_of_safety":
        return _number(value, path, low=1.0, low_open=False, high=100.0)
    if base == "a":
        return _rankine_a(value, path)
    if base in ("crushing_stress", "sigma_allow"):
        v = parse(path, value, "stress")
        if not v > 0:
            raise CaseError(path, f"{value!r} must be positive")
        return v
    if base == "A_net":
        v = parse(path, value, "area")
        if not v > 0:
            raise CaseError(path, f"{value!r} must be positive")
        return v
    raise CaseError(path, "unknown key")  # pragma: no cover - keys are checked first


def _allowed_keys(standard: str) -> set[str]:
    keys = set(PARAMETERS[standard]) | {"A_net"}
    for k in PER_AXIS & set(PARAMETERS[standard]):
        keys |= {f"{k}_major", f"{k}_minor"}
    return keys


#: The keys of the member checks with bending, by standard: case-wide keys, and keys a [[design.segment]]
#: table may also give (docs/design.md "Members with bending").
BENDING_KEYS: dict[str, tuple[tuple[str, ...], tuple[str, ...]]] = {
    "EN 1993-1-1": (("interaction", "ltb", "bow", "curve_LT", "section_class"), ("curve_LT", "section_class")),
    "AISC 360": (("section_class",), ("section_class",)),
}
_CHOICES = {"interaction": (INTERACTIONS, "EN 1993-1-1 interaction factors: Annex B or Annex A"),
            "ltb": (LTB_ROUTES, "EN 1993-1-1 6.3.2.2 (general) or 6.3.2.3 (rolled)"),
            "bow": (BOWS, "the member imperfection of the second-order route: Table 5.1 or 5.3.2(11)"),
            "curve_LT": (LT_CURVES, "a lateral-torsional buckling curve of EN 1993-1-1 Table 6.3")}


def _bending_value(name: str, value: Any, path: str) -> Any:
    """One key of the member checks with bending, checked."""
    if name == "section_class":
        if isinstance(value, bool) or not isinstance(value, int) or value not in (1, 2, 3):
            raise CaseError(path, f"{value!r}: expected 1, 2 or 3 (a class 4 section is not covered: local "
                                  "buckling)")
        return value
    allowed, what = _CHOICES[name]
    if isinstance(value, str) and name == "interaction":
        value = value.upper()
    if value not in allowed:
        raise CaseError(path, f"{value!r}: expected one of {', '.join(repr(a) for a in allowed)} ({what})")
    return value


def _segment_index(ref: Any, path: str, doc: dict) -> int:
    segs = doc.get("segment", [])
    segs = [segs] if isinstance(segs, dict) else segs if isinstance(segs, list) else []
    names = [s.get("name", f"segment {i + 1}") if isinstance(s, dict) else "" for i, s in enumerate(segs)]
    if isinstance(ref, int) and not isinstance(ref, bool):
        if not 1 <= ref <= len(names):
            raise CaseError(path, f"{ref} is not a segment number: expected 1 to {len(names)}")
        return ref - 1
    if isinstance(ref, str) and ref in names:
        return names.index(ref)
    raise CaseError(path, f"{ref!r} names no segment; expected a number from 1 or one of {names}")


def parse_design(table: dict, doc: dict) -> DesignSpec:
    """The ``[design]`` table -> :class:`DesignSpec` (its parser in :data:`fea.pipeline.ANALYSES`)."""
    if "standard" not in table:
        raise CaseError("design.standard", f"missing: expected one of {', '.join(repr(s) for s in PARAMETERS)}")
    standard = table["standard"]
    if standard not in PARAMETERS:
        close = difflib.get_close_matches(str(standard), list(PARAMETERS), n=1, cutoff=0.4)
        hint = f"; did you mean {close[0]!r}?" if close else ""
        raise CaseError("design.standard", f"{standard!r} is not a known standard{hint}; expected one of "
                                           f"{', '.join(repr(s) for s in PARAMETERS)}")
    allowed = _allowed_keys(standard)
    bend_keys, bend_segment = BENDING_KEYS.get(standard, ((), ()))
    check_keys(table, "design", allowed | {"standard", "load_factor", "segment", "angle_load"} | set(bend_keys))
    bending = {k: _bending_value(k, table[k], f"design.{k}") for k in bend_keys if k in table}
    bend_overrides: dict[int, dict[str, Any]] = {}
    params: dict[str, Any] = {k: v for k, v in PARAMETERS[standard].items() if v is not None}
    for k, v in table.items():
        if k in allowed:
            params[k] = _param(standard, k, v, f"design.{k}")
    load_factor = _number(table.get("load_factor", 1.0), "design.load_factor", high=100.0)
    angle_load = table.get("angle_load", "")
    if "angle_load" in table and angle_load not in ANGLE_LOADS:
        raise CaseError("design.angle_load", f"{angle_load!r}: expected one of "
                                             f"{', '.join(repr(a) for a in ANGLE_LOADS)} (how the load reaches a "
                                             "single angle)")
    overrides: dict[int, dict[str, Any]] = {}
    seg_tables = table.get("segment", [])
    if isinstance(seg_tables, dict):
        seg_tables = [seg_tables]
    if not isinstance(seg_tables, list):
        raise CaseError("design.segment", "expected [[design.segment]] tables")
    for j, t in enumerate(seg_tables):
        p = f"design.segment[{j + 1}]"
        if not isinstance(t, dict):
            raise CaseError(p, f"expected a table, got {t!r}")
        check_keys(t, p, allowed | {"segment"} | set(bend_segment))
        if "segment" not in t:
            raise CaseError(f"{p}.segment", "missing: give the segment's number (from 1) or its name")
        idx = _segment_index(t["segment"], f"{p}.segment", doc)
        overrides[idx] = {k: _param(standard, k, v, f"{p}.{k}") for k, v in t.items()
                          if k != "segment" and k not in bend_segment}
        own = {k: _bending_value(k, t[k], f"{p}.{k}") for k in bend_segment if k in t}
        if own:
            bend_overrides[idx] = own
    # required parameters, common or in every override
    for name, default in PARAMETERS[standard].items():
        if default is not None or name in ("crushing_stress", "sigma_allow"):
            continue
        per_axis = name in PER_AXIS
        have = name in params or (per_axis and f"{name}_major" in params and f"{name}_minor" in params)
        if not have:
            hint = f" (or {name}_major and {name}_minor)" if per_axis else ""
            raise CaseError(f"design.{name}", f"missing: {standard} needs {name}{hint}")
    if standard == "working-stress" and "sigma_allow" not in params:
        mat = doc.get("material", {})
        if not (isinstance(mat, dict) and "sigma_allow" in mat):
            raise CaseError("material.sigma_allow", "missing: the working-stress check needs the material's "
                                                    "allowable compressive stress, e.g. sigma_allow = '7.5 MPa'")
    try:
        return DesignSpec(standard=standard, parameters=params, overrides=overrides, load_factor=load_factor,
                          angle_load=angle_load, bending=BendingOptions(**bending, segments=bend_overrides))
    except ModelError as exc:  # pragma: no cover - checked above
        raise CaseError(exc.field, exc.message) from None


