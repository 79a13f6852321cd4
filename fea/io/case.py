"""Case files: TOML with units -> validated :class:`Case` holding one column per bending plane.

The format is documented in ``cases/README.md``.  Every dimensional value is a
string with its unit; bare numbers where a dimension is expected, unknown keys
(with a "did you mean"), wrong types and impossible values are errors that
name the key path, e.g. ``segment[2].I_major`` (arrays of tables are counted
from 1, as an engineer reads the file).
"""

from __future__ import annotations

import difflib
import hashlib
import math
import tomllib
from dataclasses import dataclass
from pathlib import Path
from typing import Any

from ..errors import CaseError, ModelError
from ..model.case import Case, SegmentInfo
from ..model import FREE, RIGID, Column, DistributedLoad, Foundation, LeaningLoad, PointLoad, Restraint, Segment
from ..units import DisplayUnits, parse

__all__ = ["Case", "SegmentInfo", "load_case", "parse_case", "AXES", "SECTION_HOOK"]

AXES = ("major", "minor")
DEFAULT_MODES = 3
DEFAULT_TOLERANCE = 1e-6

#: Far-end conditions of a restraining beam -> stiffness coefficient c in c E I / L.
BEAM_FAR_END = {
    "pinned": 3.0,             # far end pinned
    "fixed": 4.0,              # far end fixed
    "double-curvature": 6.0,   # antisymmetric bending (sway frames): equal end rotations, opposite sense
    "single-curvature": 2.0,   # symmetric bending (braced frames): equal and opposite end rotations
}

#: Optional hook, set by the sections module, that turns a ``section`` table into
#: properties: f(table, key_path) -> dict with I_major, I_minor, A (SI) and more.
SECTION_HOOK = None

TOP_KEYS = {"title", "units", "material", "analysis", "segment", "restraint", "load", "distributed_load",
            "foundation", "leaning"}
#: Top-level tables added by later analyses (imperfection, design, study, ...):
#: name -> parser(table, case_dict) -> parsed object stored in Case.extras.
EXTRA_SECTIONS: dict[str, Any] = {}


# ---------------------------------------------------------------------------
# helpers


def _check_keys(table: dict, path: str, allowed: set[str]) -> None:
    for key in table:
        if key not in allowed:
            close = difflib.get_close_matches(key, sorted(allowed), n=1, cutoff=0.6)
            hint = f"; did you mean `{close[0]}`?" if close else f"; expected one of {', '.join(sorted(allowed))}"
            where = f"{path}.{key}" if path else key
            raise CaseError(where, f"unknown key{hint}")


def _table(value: Any, path: str) -> dict:
    if not isinstance(value, dict):
        raise CaseError(path, f"expected a table, got {type(value).__name__} {value!r}")
    return value


def _tables(doc: dict, key: str) -> list[dict]:
    value = doc.get(key, [])
    if isinstance(value, dict):
        value = [value]
    if not isinstance(value, list):
        raise CaseError(key, f"expected [[{key}]] tables, got {value!r}")
    return [_table(v, f"{key}[{i + 1}]") for i, v in enumerate(value)]


def _bool(value: Any, path: str) -> bool:
    if not isinstance(value, bool):
        raise CaseError(path, f"expected true or false, got {value!r}")
    return value


def _str(value: Any, path: str) -> str:
    if not isinstance(value, str):
        raise CaseError(path, f"expected a string, got {value!r}")
    return value


def _positive(path: str, value: Any, dimension: str) -> float:
    v = parse(path, value, dimension)
    if not v > 0:
        raise CaseError(path, f"{value!r} must be positive")
    return v


def _spring(path: str, value: Any, dimension: str) -> float:
    if isinstance(value, str) and value.strip().lower() in ("rigid", "fixed"):
        return RIGID
    if isinstance(value, str) and value.strip().lower() in ("free", "none"):
        return FREE
    v = parse(path, value, dimension)
    if v < 0:
        raise CaseError(path, f"{value!r} must be >= 0 (or 'free' / 'rigid')")
    return v


def _axes(value: Any, path: str, planes: tuple[str, ...]) -> tuple[str, ...]:
    if value is None or value == "both":
        return planes
    if not isinstance(value, str) or value not in AXES:
        raise CaseError(path, f"expected 'major', 'minor' or 'both', got {value!r}")
    if planes == ("in-plane",):
        raise CaseError(path, f"{value!r} given, but the segments give a single I (one-plane study): "
                              "give I_major and I_minor, or leave the axis out")
    return (value,)


class _Stations:
    def __init__(self, H: float):
        self.H = H

    def __call__(self, value: Any, path: str) -> float:
        if isinstance(value, str) and value.strip().lower() == "base":
            return 0.0
        if isinstance(value, str) and value.strip().lower() == "top":
            return self.H
        x = parse(path, value, "length") if not (isinstance(value, str) and value.strip() in ("0", "0.0")) else 0.0
        tol = 1e-9 * self.H
        if x < -tol or x > self.H + tol:
            raise CaseError(path, f"height {value!r} is outside the column (0 to {self.H:g} m from the base)")
        return min(max(x, 0.0), self.H)


# ---------------------------------------------------------------------------


def load_case(path: str | Path) -> Case:
    """Read and validate a case file."""
    p = Path(path)
    try:
        data = p.read_bytes()
    except FileNotFoundError:
        raise CaseError("", f"case file {str(p)!r} does not exist") from None
    except IsADirectoryError:
        raise CaseError("", f"{str(p)!r} is a folder, not a case file") from None
    except OSError as exc:
        raise CaseError("", f"cannot read case file {str(p)!r}: {exc.strerror}") from None
    return parse_case(data, source=str(p))


def parse_case(data: bytes | str, source: str = "") -> Case:
    """Parse case-file text (TOML) into a :class:`Case`."""
    from ..extensions import load as _load_extensions

    _load_extensions()
    raw = data.encode("utf-8") if isinstance(data, str) else data
    try:
        text = raw.decode("utf-8")
    except UnicodeDecodeError:
        raise CaseError("", "the case file is not UTF-8 text") from None
    try:
        doc = tomllib.loads(text)
    except tomllib.TOMLDecodeError as exc:
        raise CaseError("", f"TOML syntax error: {exc}") from None
    if not doc:
        raise CaseError("", "the case file is empty: it needs at least one [[segment]] and a [[restraint]]")
    _check_keys(doc, "", TOP_KEYS | set(EXTRA_SECTIONS))
    title = _str(doc.get("title", ""), "title")

    # units ------------------------------------------------------------
    units = _table(doc.get("units", {}), "units")
    _check_keys(units, "units", {"length", "force"})
    display = DisplayUnits.from_names(_str(units.get("length", "m"), "units.length"),
                                      _str(units.get("force", "kN"), "units.force"))

    # analysis ----------------------------------------------------------
    analysis = _table(doc.get("analysis", {}), "analysis")
    _check_keys(analysis, "analysis", {"modes", "tolerance"})
    n_modes = analysis.get("modes", DEFAULT_MODES)
    if isinstance(n_modes, bool) or not isinstance(n_modes, int) or not 1 <= n_modes <= 50:
        raise CaseError("analysis.modes", f"expected a whole number from 1 to 50, got {n_modes!r}")
    tol = analysis.get("tolerance", DEFAULT_TOLERANCE)
    if isinstance(tol, bool) or not isinstance(tol, (int, float)) or not 1e-12 <= tol <= 1e-2:
        raise CaseError("analysis.tolerance", f"expected a relative tolerance from 1e-12 to 1e-2, got {tol!r}")

    # material ----------------------------------------------------------
    material = _table(doc.get("material", {}), "material")
    _check_keys(material, "material", {"E", "fy", "fu", "name", "sigma_allow"})
    E = _positive("material.E", material["E"], "stress") if "E" in material else None
    fy = _positive("material.fy", material["fy"], "stress") if "fy" in material else None
    mat = {"name": _str(material.get("name", ""), "material.name")}
    if "fu" in material:
        mat["fu"] = _positive("material.fu", material["fu"], "stress")
    if "sigma_allow" in material:
        mat["sigma_allow"] = _positive("material.sigma_allow", material["sigma_allow"], "stress")

    # segments ----------------------------------------------------------
    seg_tables = _tables(doc, "segment")
    if not seg_tables:
        raise CaseError("segment", "no [[segment]] given: a column needs at least one segment")
    seg_keys = {"length", "E", "fy", "I", "I_major", "I_minor", "I_top", "I_major_top", "I_minor_top",
                "taper_exponent", "A", "S", "S_major", "S_minor", "name", "section"}
    parsed = []
    single = multi = False
    z = 0.0
    for i, t in enumerate(seg_tables):
        p = f"segment[{i + 1}]"
        _check_keys(t, p, seg_keys)
        if "length" not in t:
            raise CaseError(f"{p}.length", "missing: every segment needs a length such as '3.0 m'")
        length = _positive(f"{p}.length", t["length"], "length")
        Es = _positive(f"{p}.E", t["E"], "stress") if "E" in t else E
        if Es is None:
            raise CaseError(f"{p}.E", "missing: give E here or in [material]")
        fys = _positive(f"{p}.fy", t["fy"], "stress") if "fy" in t else fy
        props: dict[str, float | None] = {}
        section = None
        if "section" in t:
            if SECTION_HOOK is None:
                raise CaseError(f"{p}.section", "sections by shape are not available in this version")
            section = _table(t["section"], f"{p}.section")
            props = dict(SECTION_HOOK(section, f"{p}.section"))
        for k in ("I", "I_major", "I_minor", "I_top", "I_major_top", "I_minor_top"):
            if k in t:
                props[k] = _positive(f"{p}.{k}", t[k], "second moment of area")
        A = _positive(f"{p}.A", t["A"], "area") if "A" in t else props.get("A")
        has_single = "I" in props
        has_multi = "I_major" in props or "I_minor" in props
        if has_single and has_multi:
            raise CaseError(p, "give either I (one-plane study) or I_major and I_minor, not both")
        if not has_single and not has_multi:
            raise CaseError(f"{p}.I_major", "missing: give I_major and I_minor (or I for a one-plane study)")
        if has_multi and not ("I_major" in props and "I_minor" in props):
            missing = "I_minor" if "I_major" in props else "I_major"
            raise CaseError(f"{p}.{missing}", "missing: both I_major and I_minor are needed")
        if has_multi and props["I_minor"] > props["I_major"] * (1 + 1e-9) and section is None:
            raise CaseError(f"{p}.I_minor", "is larger than I_major: the major axis has the larger I")
        single |= has_single
        multi |= has_multi
        taper_n = t.get("taper_exponent", 1.0)
        if isinstance(taper_n, bool) or not isinstance(taper_n, (int, float)) or not 0.5 <= taper_n <= 8:
            raise CaseError(f"{p}.taper_exponent", f"expected a number from 0.5 to 8, got {taper_n!r}")
        S = {}
        for k in ("S", "S_major", "S_minor"):
            if k in t:
                S[k] = _positive(f"{p}.{k}", t[k], "force")
        name = _str(t.get("name", f"segment {i + 1}"), f"{p}.name")
        parsed.append(dict(length=length, E=Es, fy=fys, props=props, A=A, taper=float(taper_n), S=S, name=name,
                           bottom=z, section=section))
        z += length
    if single and multi:
        raise CaseError("segment", "some segments give I and others I_major/I_minor: use one style throughout")
    planes: tuple[str, ...] = ("in-plane",) if single else AXES
    H = z
    station = _Stations(H)

    seg_info = tuple(
        SegmentInfo(name=s["name"], bottom=s["bottom"], top=s["bottom"] + s["length"], A=s["A"], fy=s["fy"],
                    I_major=s["props"].get("I_major", s["props"].get("I")),
                    I_minor=s["props"].get("I_minor", s["props"].get("I")), section=s["section"])
        for s in parsed)

    def segments_for(axis: str) -> tuple[Segment, ...]:
        key = "I" if axis == "in-plane" else f"I_{axis}"
        out = []
        for i, s in enumerate(parsed):
            pr = s["props"]
            S_val = s["S"].get("S" if axis == "in-plane" else f"S_{axis}", s["S"].get("S"))
            try:
                out.append(Segment(length=s["length"], E=s["E"], I=pr[key], I_top=pr.get(f"{key}_top"),
                                   taper_exponent=s["taper"], A=s["A"], S=S_val, name=s["name"]))
            except ModelError as exc:
                raise CaseError(f"segment[{i + 1}].{exc.field}", exc.message) from None
        return tuple(out)

    # restraints -----------------------------------------------------------
    rest: dict[str, list[Restraint]] = {a: [] for a in planes}
    for i, t in enumerate(_tables(doc, "restraint")):
        p = f"restraint[{i + 1}]"
        _check_keys(t, p, {"at", "axis", "lateral", "rotation", "beam", "note"})
        if "at" not in t:
            raise CaseError(f"{p}.at", "missing: give 'base', 'top' or a height such as '2.1 m'")
        at = station(t["at"], f"{p}.at")
        axes = _axes(t.get("axis"), f"{p}.axis", planes)
        lateral = _spring(f"{p}.lateral", t.get("lateral", "free"), "translational stiffness")
        rotation = _spring(f"{p}.rotation", t.get("rotation", "free"), "rotational stiffness")
        beams = t.get("beam", [])
        if isinstance(beams, dict):
            beams = [beams]
        if not isinstance(beams, list):
            raise CaseError(f"{p}.beam", "expected [[restraint.beam]] tables")
        for j, b in enumerate(beams):
            rotation += _beam_stiffness(_table(b, f"{p}.beam[{j + 1}]"), f"{p}.beam[{j + 1}]", E)
        if lateral == 0 and rotation == 0:
            raise CaseError(p, "restrains nothing: give lateral and/or rotation")
        for a in axes:
            rest[a].append(Restraint(at, lateral, rotation))
    if not any(rest.values()):
        raise CaseError("restraint", "no [[restraint]] given: the column is unsupported")

    # loads ------------------------------------------------------------------
    point: list[PointLoad] = []
    for i, t in enumerate(_tables(doc, "load")):
        p = f"load[{i + 1}]"
        _check_keys(t, p, {"at", "axial", "permanent", "eccentricity", "lateral", "note"} | _LOAD_EXTRA)
        if "at" not in t:
            raise CaseError(f"{p}.at", "missing: give 'top' or a height such as '3.0 m'")
        at = station(t["at"], f"{p}.at")
        P = parse(f"{p}.axial", t["axial"], "force") if "axial" in t else 0.0
        point.append(PointLoad(at, P, _bool(t.get("permanent", False), f"{p}.permanent")))
    dist: list[DistributedLoad] = []
    for i, t in enumerate(_tables(doc, "distributed_load")):
        p = f"distributed_load[{i + 1}]"
        _check_keys(t, p, {"from", "to", "axial", "permanent", "note"})
        a = station(t.get("from", "base"), f"{p}.from")
        b = station(t.get("to", "top"), f"{p}.to")
        if not b > a:
            raise CaseError(f"{p}.to", f"must be above `from` ({a:g} m)")
        if "axial" not in t:
            raise CaseError(f"{p}.axial", "missing: give a load per height such as '0.6 kN/m'")
        q = parse(f"{p}.axial", t["axial"], "force per length")
        dist.append(DistributedLoad(a, b, q, _bool(t.get("permanent", False), f"{p}.permanent")))
    if not point and not dist:
        raise CaseError("load", "no [[load]] or [[distributed_load]] given: nothing to check")

    found: dict[str, list[Foundation]] = {a: [] for a in planes}
    for i, t in enumerate(_tables(doc, "foundation")):
        p = f"foundation[{i + 1}]"
        _check_keys(t, p, {"from", "to", "modulus", "modulus_bottom", "modulus_top", "axis", "note"})
        a = station(t.get("from", "base"), f"{p}.from")
        b = station(t.get("to", "top"), f"{p}.to")
        if not b > a:
            raise CaseError(f"{p}.to", f"must be above `from` ({a:g} m)")
        if "modulus" in t:
            kb = kt = _positive(f"{p}.modulus", t["modulus"], "foundation modulus")
        elif "modulus_bottom" in t or "modulus_top" in t:
            kb = _spring(f"{p}.modulus_bottom", t.get("modulus_bottom", "0 N/m^2"), "foundation modulus")
            kt = _spring(f"{p}.modulus_top", t.get("modulus_top", "0 N/m^2"), "foundation modulus")
            if kb == kt == 0 or math.isinf(kb) or math.isinf(kt):
                raise CaseError(p, "modulus must be finite and not zero at both ends")
        else:
            raise CaseError(f"{p}.modulus", "missing: give modulus, or modulus_bottom and modulus_top")
        for ax in _axes(t.get("axis"), f"{p}.axis", planes):
            found[ax].append(Foundation(a, b, kb, kt))

    lean: dict[str, list[LeaningLoad]] = {a: [] for a in planes}
    for i, t in enumerate(_tables(doc, "leaning")):
        p = f"leaning[{i + 1}]"
        _check_keys(t, p, {"at", "load", "height", "permanent", "axis", "note"})
        for k in ("at", "load", "height"):
            if k not in t:
                raise CaseError(f"{p}.{k}", "missing")
        at = station(t["at"], f"{p}.at")
        P = parse(f"{p}.load", t["load"], "force")
        if P < 0:
            raise CaseError(f"{p}.load", f"{t['load']!r} must be >= 0 (gravity load on the leaning columns)")
        h = _positive(f"{p}.height", t["height"], "length")
        for ax in _axes(t.get("axis"), f"{p}.axis", planes):
            lean[ax].append(LeaningLoad(at, P, h, _bool(t.get("permanent", False), f"{p}.permanent")))

    columns = []
    for ax in planes:
        try:
            col = Column(segments=segments_for(ax), restraints=tuple(rest[ax]), point_loads=tuple(point),
                         distributed_loads=tuple(dist), foundations=tuple(found[ax]), leaning_loads=tuple(lean[ax]),
                         title=title)
        except CaseError:
            raise
        except ModelError as exc:  # pragma: no cover - the case checks come first
            raise CaseError(exc.field, exc.message) from None
        columns.append((ax, col))

    extras = {}
    for name, parser in EXTRA_SECTIONS.items():
        if name in doc:
            extras[name] = parser(_table(doc[name], name), doc)
    # An eccentricity or lateral force on a [[load]] is read by the imperfect-column analysis.  Without an
    # [imperfection] or [lateral] table it still must not be ignored: it implies an empty [lateral] table
    # (the second-order analysis of the straight column with those actions).
    load_actions = [(i, k) for i, t in enumerate(_tables(doc, "load"))
                    for k in t if k in {"eccentricity", "lateral"} | _LOAD_EXTRA]
    if load_actions and "imperfection" not in extras and "lateral" not in extras:
        if "lateral" not in EXTRA_SECTIONS:
            i, k = load_actions[0]
            raise CaseError(f"load[{i + 1}].{k}", "is read only by the imperfect-column analysis, "
                                                 "which this installation does not have")
        extras["lateral"] = EXTRA_SECTIONS["lateral"]({}, doc)

    return Case(title=title, planes=tuple(columns), segments=seg_info, E=E if E is not None else parsed[0]["E"],
                fy=fy, n_modes=int(n_modes), tolerance=float(tol), display=display, source=source,
                sha256=hashlib.sha256(raw).hexdigest(), extras=extras, material=mat)


#: Extra keys a [[load]] may carry for later analyses.
_LOAD_EXTRA: set[str] = set()


def _beam_stiffness(t: dict, path: str, E_default: float | None) -> float:
    """Rotational stiffness c E I / L of a restraining beam (c from :data:`BEAM_FAR_END`)."""
    _check_keys(t, path, {"E", "I", "span", "far_end", "note"})
    E = _positive(f"{path}.E", t["E"], "stress") if "E" in t else E_default
    if E is None:
        raise CaseError(f"{path}.E", "missing: give E here or in [material]")
    if "I" not in t or "span" not in t or "far_end" not in t:
        missing = next(k for k in ("I", "span", "far_end") if k not in t)
        raise CaseError(f"{path}.{missing}", "missing: a restraining beam needs I, span and far_end")
    I = _positive(f"{path}.I", t["I"], "second moment of area")
    span = _positive(f"{path}.span", t["span"], "length")
    far = t["far_end"]
    if far not in BEAM_FAR_END:
        raise CaseError(f"{path}.far_end", f"expected one of {', '.join(BEAM_FAR_END)}, got {far!r}")
    return BEAM_FAR_END[far] * E * I / span
