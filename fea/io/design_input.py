"""Case-file side of sections and design: ``section = {...}`` tables, the ``[design]`` table,
the JSON ``"design"`` part and the summary lines.  Registers itself on import
(listed in :data:`fea.extensions.MODULES`).  Keys are documented in ``docs/design.md``.
"""

from __future__ import annotations

import difflib
import math
from dataclasses import MISSING, fields
from typing import Any

from ..cautions import CAUTION
from ..design.check import PARAMETERS, PER_AXIS, DesignResult, DesignSpec
from ..design.curves import AS4100_ALPHA_B, BS5950_ROBERTSON, EN1993_IMPERFECTION
from ..errors import CaseError, ModelError
from ..sections import SHAPES
from ..units import DisplayUnits, parse

__all__ = ["SHAPE_ALIASES", "DESIGN_CAUTION", "section_properties", "parse_design", "design_json",
           "design_summary", "register"]

#: Short names accepted for ``shape`` besides the names of :data:`fea.sections.SHAPES`.
SHAPE_ALIASES = {"i": "i_section", "h": "i_section", "rhs": "rectangular_hollow", "shs": "rectangular_hollow",
                 "chs": "circular_hollow", "solid_rectangle": "rectangle", "solid_round": "round"}

DESIGN_CAUTION = ("Design resistances use the published formulas only; the governing standard, its national "
                  "annex and a licensed engineer decide. " + CAUTION)


# ---------------------------------------------------------------------------
# sections


def _shape_class(name: Any, path: str):
    if not isinstance(name, str):
        raise CaseError(f"{path}.shape", f"expected a shape name such as 'i', got {name!r}")
    key = SHAPE_ALIASES.get(name.strip().lower(), name.strip().lower())
    if key not in SHAPES:
        names = sorted(set(SHAPES) | set(SHAPE_ALIASES))
        close = difflib.get_close_matches(name, names, n=1)
        hint = f"; did you mean {close[0]!r}?" if close else f"; expected one of {', '.join(names)}"
        raise CaseError(f"{path}.shape", f"{name!r} is not a known shape{hint}")
    return key, SHAPES[key]


def build_shape(shape: Any, dims: dict[str, float], path: str):
    """A section shape from its name and dimensions in metres (``shs`` takes ``h = b``)."""
    key, cls = _shape_class(shape, path)
    allowed = [f.name for f in fields(cls)]
    dims = dict(dims)
    if str(shape).strip().lower() == "shs" and "h" not in dims and "b" in dims:
        dims["h"] = dims["b"]
    for k in dims:
        if k not in allowed:
            close = difflib.get_close_matches(k, allowed, n=1, cutoff=0.5)
            hint = f"; did you mean `{close[0]}`?" if close else f"; a {key} takes {', '.join(allowed)}"
            raise CaseError(f"{path}.{k}", f"unknown dimension{hint}")
    try:
        return cls(**dims)
    except TypeError:
        required = [f.name for f in fields(cls) if f.default is MISSING and f.default_factory is MISSING]
        missing = next((k for k in required if k not in dims), allowed[0])
        raise CaseError(f"{path}.{missing}", f"missing: a {key} needs {', '.join(required)}") from None
    except ModelError as exc:
        raise CaseError(f"{path}.{exc.field}", exc.message) from None


def section_properties(table: dict, path: str) -> dict[str, Any]:
    """The case-file section hook: ``{shape = "i", b = "150 mm", ...}`` -> properties (SI).

    Returns I_major, I_minor (principal axes), A and, for reports, r_least,
    theta [rad], J, mass-free geometric data and the shape name.
    """
    if "shape" not in table:
        raise CaseError(f"{path}.shape", "missing: give a shape such as 'i', 'rhs', 'chs', 'angle'")
    dims = {k: parse(f"{path}.{k}", v, "length") for k, v in table.items() if k != "shape"}
    shape = build_shape(table["shape"], dims, path)
    p = shape.properties()
    return {"I_major": p.I_major, "I_minor": p.I_minor, "A": p.area, "r_least": p.r_least, "theta": p.theta,
            "J": p.J, "shape": type(shape).kind}


# ---------------------------------------------------------------------------
# [design]


def _number(value: Any, path: str, low: float = 0.0, high: float = math.inf, low_open: bool = True) -> float:
    if isinstance(value, bool) or not isinstance(value, (int, float)) or not math.isfinite(value):
        raise CaseError(path, f"expected a number, got {value!r}")
    ok = (value > low if low_open else value >= low) and value <= high
    if not ok:
        rng = f"{'>' if low_open else '>='} {low:g}" + (f" and <= {high:g}" if high < math.inf else "")
        raise CaseError(path, f"{value!r} is out of range: expected a number {rng}")
    return float(value)


def _rankine_a(value: Any, path: str) -> float:
    if isinstance(value, str) and "/" in value:
        num, _, den = value.partition("/")
        try:
            a = float(num) / float(den)
        except (ValueError, ZeroDivisionError):
            raise CaseError(path, f"{value!r} is not a number such as '1/7500'") from None
        return _number(a, path)
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


def _check(table: dict, path: str, allowed: set[str]) -> None:
    for key in table:
        if key not in allowed:
            close = difflib.get_close_matches(key, sorted(allowed), n=1, cutoff=0.6)
            hint = f"; did you mean `{close[0]}`?" if close else f"; expected one of {', '.join(sorted(allowed))}"
            raise CaseError(f"{path}.{key}", f"unknown key{hint}")


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
    """The ``[design]`` table -> :class:`DesignSpec` (case-file parser registered as ``design``)."""
    if "standard" not in table:
        raise CaseError("design.standard", f"missing: expected one of {', '.join(repr(s) for s in PARAMETERS)}")
    standard = table["standard"]
    if standard not in PARAMETERS:
        close = difflib.get_close_matches(str(standard), list(PARAMETERS), n=1, cutoff=0.4)
        hint = f"; did you mean {close[0]!r}?" if close else ""
        raise CaseError("design.standard", f"{standard!r} is not a known standard{hint}; expected one of "
                                           f"{', '.join(repr(s) for s in PARAMETERS)}")
    allowed = _allowed_keys(standard)
    _check(table, "design", allowed | {"standard", "load_factor", "segment"})
    params: dict[str, Any] = {k: v for k, v in PARAMETERS[standard].items() if v is not None}
    for k, v in table.items():
        if k in allowed:
            params[k] = _param(standard, k, v, f"design.{k}")
    load_factor = _number(table.get("load_factor", 1.0), "design.load_factor", high=100.0)
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
        _check(t, p, allowed | {"segment"})
        if "segment" not in t:
            raise CaseError(f"{p}.segment", "missing: give the segment's number (from 1) or its name")
        idx = _segment_index(t["segment"], f"{p}.segment", doc)
        overrides[idx] = {k: _param(standard, k, v, f"{p}.{k}") for k, v in t.items() if k != "segment"}
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
        return DesignSpec(standard=standard, parameters=params, overrides=overrides, load_factor=load_factor)
    except ModelError as exc:  # pragma: no cover - checked above
        raise CaseError(exc.field, exc.message) from None


# ---------------------------------------------------------------------------
# output


def _num(x: float | None) -> float | None:
    if x is None:
        return None
    x = float(x)
    return x if math.isfinite(x) else None


def design_json(r: DesignResult) -> dict[str, Any]:
    """The JSON ``"design"`` part (SI; documented in docs/design.md)."""
    g = r.governing
    return {
        "standard": r.standard,
        "load_factor": r.load_factor,
        "passed": r.passed,
        "max_utilisation": g.utilisation,
        "governing": {"segment": g.segment + 1, "name": g.name, "axis": g.axis, "kind": g.kind,
                      "utilisation": g.utilisation},
        "checks": [
            {
                "segment": c.segment + 1,
                "name": c.name,
                "axis": c.axis,
                "kind": c.kind,
                "standard": c.standard,
                "clause": c.clause,
                "formula": c.formula,
                "parameter": c.parameter,
                "slenderness": _num(c.slenderness),
                "slenderness_name": c.slenderness_name,
                "reduction_factor": _num(c.reduction),
                "N_cr_N": _num(c.N_cr),
                "N_Ed_N": c.N_Ed,
                "resistance_N": c.resistance,
                "utilisation": c.utilisation,
                "passed": c.passed,
                "governs": c.governs,
                "effective_length_factor": _num(c.effective_length_factor),
                "k_meaningful": c.k_meaningful,
                "note": c.note,
                "details": {k: _num(v) for k, v in c.details.items()},
                "labels": dict(c.labels),
            }
            for c in r.checks
        ],
        "notes": list(r.notes),
        "caution": DESIGN_CAUTION,
    }


def design_summary(r: DesignResult, d: DisplayUnits) -> list[str]:
    """Summary lines of a design check, in display units."""
    from .summary import fmt

    out = [f"Design check: {r.standard}"]
    out += [f"  {n}" for n in r.notes]
    out.append(f"  {'segment':<18} {'axis':<8} {'slender.':>14} {'reduct.':>7} {'N_Ed [' + d.force + ']':>11} "
               f"{'N_cr [' + d.force + ']':>12} {'N_Rd [' + d.force + ']':>12} {'util.':>6}  clause / parameter")
    for c in r.checks:
        name = f"{c.segment + 1} {c.name}"[:18]
        sl = "-" if c.kind == "tension" else f"{c.slenderness_name} {c.slenderness:.3g}"
        Ncr = "-" if not math.isfinite(c.N_cr) else fmt(d.F(c.N_cr))
        axis = "tension" if c.kind == "tension" else c.axis
        flag = "" if c.passed else "  FAILS"
        out.append(f"  {name:<18} {axis:<8} {sl:>14} {c.reduction:7.3f} {fmt(d.F(c.N_Ed)):>11} {Ncr:>12} "
                   f"{fmt(d.F(c.resistance)):>12} {c.utilisation:6.3f}  {c.clause}; {c.parameter}"
                   f"{'; ' + c.governs + ' governs' if c.governs in ('material', 'net') else ''}{flag}")
        if c.note:
            out.append(f"  {'':<18} ({c.note})")
    g = r.governing
    where = "in tension" if g.kind == "tension" else f"about the {g.axis} axis"
    out.append(f"Governing: segment {g.segment + 1} ({g.name}) {where}, utilisation {g.utilisation:.3f}: "
               f"{'PASSES' if r.passed else 'FAILS'}")
    out.append(f"  {DESIGN_CAUTION.split(CAUTION)[0].strip()}")
    return out


def run_design(case, results):
    """Runner hook: the design check of a case that declares ``[design]``, else None."""
    from ..design.member import design_of_case

    return design_of_case(case, results)


def register() -> None:
    """Add sections, the [design] table, the design analysis, its JSON and summary to the registries."""
    from . import case as case_io
    from . import export, sizing_command, summary
    from .. import cli
    from .. import pipeline as runner

    case_io.SECTION_HOOK = section_properties
    case_io.EXTRA_SECTIONS["design"] = parse_design
    runner.ANALYSES["design"] = run_design
    export.JSON_SECTIONS["design"] = design_json
    summary.SUMMARY_SECTIONS["design"] = design_summary
    cli.COMMANDS["size"] = (sizing_command.HELP, sizing_command.add_arguments, sizing_command.run)


register()
