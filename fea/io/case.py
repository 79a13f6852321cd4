"""Case files: TOML with units -> validated :class:`~fea.model.case.Case` holding one column per bending plane.

The format is documented in ``cases/README.md``.  Every dimensional value is a
string with its unit; bare numbers where a dimension is expected, unknown keys
(with a "did you mean"), wrong types and impossible values are errors that
name the key path, e.g. ``segment[2].I_major`` (arrays of tables are counted
from 1, as an engineer reads the file).

This module reads the tables of the column itself.  The tables of the optional
analyses (``[design]``, ``[imperfection]``, ``[study]``, ...) are read by the
parsers the caller passes as ``tables``; :mod:`fea.pipeline` passes those of
its list of analyses.
"""

from __future__ import annotations

import hashlib
import math
import re
import tomllib
from dataclasses import dataclass
from pathlib import Path
from types import MappingProxyType
from typing import Any, Callable, Mapping

from ..errors import CaseError, ModelError
from ..model import Column, DistributedLoad, Foundation, LeaningLoad, PointLoad, Restraint, Segment
from ..model.case import Case, LoadInfo, SegmentInfo, TableRef
from ..model.column import member_force_loads
from ..model.ideal_supports import NOMINAL_FIXITIES, is_nominal, nominal_rotation_at
from ..solve.spatial_case import DEFAULT_NU, RestraintTorsion, SpatialInputs
from ..units import DisplayUnits, parse
from ..util.checks import as_text
from .limits import MAX_CASE_BYTES, MAX_MODES, check_counts, read_limited
from .section_input import parse_section
from .tables import AXES, Stations, as_bool, as_str, as_table, as_tables, axes, check_keys, positive, spring

__all__ = ["load_case", "parse_case", "parse_document", "spatial_inputs", "AXES", "TOP_KEYS", "LOAD_KEYS",
           "TableParser"]

DEFAULT_MODES = 3
DEFAULT_TOLERANCE = 1e-6

#: A parser of an optional top-level table: (table, whole document) -> parsed object kept in ``Case.extras``.
TableParser = Callable[[dict, dict], Any]

#: Far-end conditions of a restraining beam -> stiffness coefficient c in c E I / L.
BEAM_FAR_END = {
    "pinned": 3.0,             # far end pinned
    "fixed": 4.0,              # far end fixed
    "double-curvature": 6.0,   # antisymmetric bending (sway frames): equal end rotations, opposite sense
    "single-curvature": 2.0,   # symmetric bending (braced frames): equal and opposite end rotations
}

TOP_KEYS = {"title", "units", "material", "analysis", "segment", "restraint", "load", "distributed_load",
            "foundation", "leaning"}
#: Keys of a [[load]]; eccentricities and the lateral force are read by the imperfect-column analysis.
LOAD_KEYS = {"at", "axial", "permanent", "eccentricity", "eccentricity_major", "eccentricity_minor", "lateral",
             "note"}
#: [[load]] keys that imply a second-order analysis of the loaded column.
LOAD_ACTION_KEYS = {"eccentricity", "eccentricity_major", "eccentricity_minor", "lateral"}
#: Keys of a [[restraint]]; twist, warping and offset are read only by the thin-walled (spatial) analysis.
RESTRAINT_KEYS = {"at", "axis", "lateral", "rotation", "beam", "note", "twist", "warping", "offset"}
SEGMENT_KEYS = {"length", "E", "fy", "I", "I_major", "I_minor", "I_top", "I_major_top", "I_minor_top",
                "taper_exponent", "A", "S", "S_major", "S_minor", "name", "section", "axial_force",
                "axial_force_permanent"}
#: [[segment]] keys that give the member's axial force per segment instead of [[load]] tables.
MEMBER_FORCE_KEYS = ("axial_force", "axial_force_permanent")

_NO_TABLES: Mapping[str, TableParser] = MappingProxyType({})


def load_case(path: str | Path, tables: Mapping[str, TableParser] = _NO_TABLES) -> Case:
    """Read and validate a case file (``tables``: parsers of the optional tables it may hold)."""
    p = Path(path)
    data = read_limited(p, MAX_CASE_BYTES, "", "case file")
    return parse_case(data, source=str(p), tables=tables)


#: tomllib messages that quote a key of the file; only the message kind and position are kept.
_KEY_MESSAGE = re.compile(r"^(Cannot declare|Cannot mutate immutable namespace|Cannot redefine namespace|"
                          r"Duplicate inline table key) .*? (\(at [^()]*\))$")


def _toml_message(exc: tomllib.TOMLDecodeError) -> str:
    """tomllib's message without any key or text of the file (one character at most, escaped)."""
    msg = str(exc).splitlines()[0] if str(exc) else "invalid TOML"
    return _KEY_MESSAGE.sub(r"\1 a key twice \2" if "declare" in msg else r"\1 \2", msg)


def parse_case(data: bytes | str, source: str = "", tables: Mapping[str, TableParser] = _NO_TABLES) -> Case:
    """Parse case-file text (TOML) into a :class:`Case`; a UTF-8 byte-order mark at the start is skipped."""
    raw = data.encode("utf-8") if isinstance(data, str) else data
    if len(raw) > MAX_CASE_BYTES:
        raise CaseError("", f"the case file is larger than the limit of {MAX_CASE_BYTES:,} bytes")
    try:
        text = raw.decode("utf-8")
    except UnicodeDecodeError:
        raise CaseError("", "the case file is not UTF-8 text") from None
    text = text.removeprefix("\ufeff")
    if "\x00" in text:
        raise CaseError("", "the case file is not a text file")
    try:
        doc = tomllib.loads(text)
    except tomllib.TOMLDecodeError as exc:
        raise CaseError("", f"TOML syntax error: {_toml_message(exc)}") from None
    except RecursionError:
        raise CaseError("", "TOML syntax error: arrays or tables nested too deeply") from None
    return parse_document(doc, source=source, sha256=hashlib.sha256(raw).hexdigest(), tables=tables)


def parse_document(doc: dict, source: str = "", sha256: str = "",
                   tables: Mapping[str, TableParser] = _NO_TABLES) -> Case:
    """A parsed TOML document (plain data) -> :class:`Case`; studies rebuild changed cases through this."""
    if not doc:
        raise CaseError("", "the case file is empty: it needs at least one [[segment]] and a [[restraint]] or "
                            "[[foundation]]")
    check_keys(doc, "", TOP_KEYS | set(tables))
    check_counts(doc)
    title = as_text(doc.get("title", ""), "title")
    display = _display_units(doc)
    n_modes, tol = _analysis_options(doc)
    E, fy, mat = _material(doc)
    parsed = _segments(doc, E, fy)
    planes: tuple[str, ...] = ("in-plane",) if "I" in parsed[0].props else AXES
    station = Stations(parsed[-1].top)
    origins: dict[str, tuple[TableRef, ...]] = {}
    rest = _restraints(doc, station, planes, E, origins, parsed)
    point, dist = _loads(doc, station, parsed)
    found = _foundations(doc, station, planes, origins)
    lean = _leaning(doc, station, planes, origins)
    columns = []
    for ax in planes:
        try:
            col = Column(segments=_plane_segments(parsed, ax), restraints=tuple(rest[ax]), point_loads=tuple(point),
                         distributed_loads=tuple(dist), foundations=tuple(found[ax]),
                         leaning_loads=tuple(lean[ax]), title=title)
        except CaseError:
            raise
        except ModelError as exc:  # pragma: no cover - the case checks come first
            raise CaseError(exc.field, exc.message) from None
        columns.append((ax, col))
    if len(columns) == 2 and _same_within_rounding(columns[0][1], columns[1][1]):
        # equal properties about both axes (a tube, a round, a square: I_major and I_minor may differ in the last
        # digits) and the same supports, loads and foundations: one column for both planes, solved once
        columns[1] = (columns[1][0], columns[0][1])
    joint_loads = _member_force_refs(point, parsed)
    for i in range(len(parsed)):
        origins[f"segment[{i + 1}]"] = tuple(TableRef(ax, "segments", i) for ax in planes) + tuple(
            TableRef(ax, "point_loads", k) for k in joint_loads[i] for ax in planes)
    for i in range(len(point)):
        origins[f"load[{i + 1}]"] = tuple(TableRef(ax, "point_loads", i) for ax in planes)
    for i in range(len(dist)):
        origins[f"distributed_load[{i + 1}]"] = tuple(TableRef(ax, "distributed_loads", i) for ax in planes)
    return Case(title=title, planes=tuple(columns), segments=tuple(s.info() for s in parsed),
                E=E if E is not None else parsed[0].E, fy=fy, n_modes=int(n_modes), tolerance=float(tol),
                display=display, source=source, sha256=sha256, extras=_extra_tables(doc, tables), material=mat,
                origins=MappingProxyType(origins), document=MappingProxyType(doc), loads=_load_infos(doc))


# ---------------------------------------------------------------------------
# the tables of the column


def _display_units(doc: dict) -> DisplayUnits:
    units = as_table(doc.get("units", {}), "units")
    check_keys(units, "units", {"length", "force"})
    return DisplayUnits.from_names(as_str(units.get("length", "m"), "units.length"),
                                   as_str(units.get("force", "kN"), "units.force"))


def _analysis_options(doc: dict) -> tuple[int, float]:
    analysis = as_table(doc.get("analysis", {}), "analysis")
    check_keys(analysis, "analysis", {"modes", "tolerance"})
    n_modes = analysis.get("modes", DEFAULT_MODES)
    if isinstance(n_modes, bool) or not isinstance(n_modes, int) or not 1 <= n_modes <= MAX_MODES:
        raise CaseError("analysis.modes", f"expected a whole number from 1 to {MAX_MODES}, got {n_modes!r}")
    tol = analysis.get("tolerance", DEFAULT_TOLERANCE)
    if isinstance(tol, bool) or not isinstance(tol, (int, float)) or not 1e-12 <= tol <= 1e-2:
        raise CaseError("analysis.tolerance", f"expected a relative tolerance from 1e-12 to 1e-2, got {tol!r}")
    return n_modes, tol


def _material(doc: dict) -> tuple[float | None, float | None, dict]:
    material = as_table(doc.get("material", {}), "material")
    check_keys(material, "material", {"E", "fy", "fu", "name", "sigma_allow", "G", "nu"})
    _shear_modulus(material)
    E = positive("material.E", material["E"], "stress") if "E" in material else None
    fy = positive("material.fy", material["fy"], "stress") if "fy" in material else None
    mat: dict[str, Any] = {"name": as_str(material.get("name", ""), "material.name")}
    if "fu" in material:
        mat["fu"] = positive("material.fu", material["fu"], "stress")
    if "sigma_allow" in material:
        mat["sigma_allow"] = positive("material.sigma_allow", material["sigma_allow"], "stress")
    return E, fy, mat


@dataclass
class _SegmentInput:
    """One [[segment]] table read (SI)."""

    length: float
    E: float
    fy: float | None
    props: dict
    A: float | None
    taper: float
    S: dict
    name: str
    bottom: float
    section: dict | None
    shape: Any
    section_props: dict | None

    @property
    def top(self) -> float:
        return self.bottom + self.length

    def info(self) -> SegmentInfo:
        pr = self.props
        return SegmentInfo(name=self.name, bottom=self.bottom, top=self.top, A=self.A, fy=self.fy,
                           I_major=pr.get("I_major", pr.get("I")), I_minor=pr.get("I_minor", pr.get("I")),
                           section=self.section, shape=self.shape,
                           properties=None if self.section_props is None else MappingProxyType(self.section_props))


def _segments(doc: dict, E: float | None, fy: float | None) -> list[_SegmentInput]:
    seg_tables = as_tables(doc, "segment")
    if not seg_tables:
        raise CaseError("segment", "no [[segment]] given: a column needs at least one segment")
    parsed: list[_SegmentInput] = []
    single = multi = False
    z = 0.0
    for i, t in enumerate(seg_tables):
        s = _segment(t, f"segment[{i + 1}]", i, z, E, fy)
        single |= "I" in s.props
        multi |= "I_major" in s.props
        parsed.append(s)
        z += s.length
    if single and multi:
        raise CaseError("segment", "some segments give I and others I_major/I_minor: use one style throughout")
    return parsed


def _segment(t: dict, p: str, i: int, z: float, E: float | None, fy: float | None) -> _SegmentInput:
    check_keys(t, p, SEGMENT_KEYS)
    if "length" not in t:
        raise CaseError(f"{p}.length", "missing: every segment needs a length such as '3.0 m'")
    length = positive(f"{p}.length", t["length"], "length")
    Es = positive(f"{p}.E", t["E"], "stress") if "E" in t else E
    if Es is None:
        raise CaseError(f"{p}.E", "missing: give E here or in [material]")
    fys = positive(f"{p}.fy", t["fy"], "stress") if "fy" in t else fy
    props: dict[str, float | None] = {}
    section = shape = section_props = None
    if "section" in t:
        section = as_table(t["section"], f"{p}.section")
        shape, section_props = parse_section(section, f"{p}.section")
        props = dict(section_props)
    for k in ("I", "I_major", "I_minor", "I_top", "I_major_top", "I_minor_top"):
        if k in t:
            props[k] = positive(f"{p}.{k}", t[k], "second moment of area")
    A = positive(f"{p}.A", t["A"], "area") if "A" in t else props.get("A")
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
    taper_n = t.get("taper_exponent", 1.0)
    if isinstance(taper_n, bool) or not isinstance(taper_n, (int, float)) or not 0.5 <= taper_n <= 8:
        raise CaseError(f"{p}.taper_exponent", f"expected a number from 0.5 to 8, got {taper_n!r}")
    S = {k: positive(f"{p}.{k}", t[k], "force") for k in ("S", "S_major", "S_minor") if k in t}
    name = as_str(t.get("name", f"segment {i + 1}"), f"{p}.name")
    return _SegmentInput(length=length, E=Es, fy=fys, props=props, A=A, taper=float(taper_n), S=S, name=name,
                         bottom=z, section=section, shape=shape, section_props=section_props)


def _plane_segments(parsed: list[_SegmentInput], axis: str) -> tuple[Segment, ...]:
    key = "I" if axis == "in-plane" else f"I_{axis}"
    out = []
    for i, s in enumerate(parsed):
        pr = s.props
        S_val = s.S.get("S" if axis == "in-plane" else f"S_{axis}", s.S.get("S"))
        try:
            out.append(Segment(length=s.length, E=s.E, I=pr[key], I_top=pr.get(f"{key}_top"),
                               taper_exponent=s.taper, A=s.A, S=S_val, name=s.name))
        except ModelError as exc:
            raise CaseError(f"segment[{i + 1}].{exc.field}", exc.message) from None
    return tuple(out)


def _same_within_rounding(a: Any, b: Any, rtol: float = 1e-12) -> bool:
    """Whether two model objects are equal, their numbers to a relative ``rtol`` (rounding of the section
    properties of a symmetric section about its two axes)."""
    from dataclasses import fields, is_dataclass

    if is_dataclass(a) and not isinstance(a, type):
        return type(a) is type(b) and all(_same_within_rounding(getattr(a, f.name), getattr(b, f.name), rtol)
                                          for f in fields(a))
    if isinstance(a, tuple):
        return isinstance(b, tuple) and len(a) == len(b) and all(_same_within_rounding(x, y, rtol)
                                                                 for x, y in zip(a, b))
    if isinstance(a, float) and isinstance(b, float):
        return a == b or math.isclose(a, b, rel_tol=rtol, abs_tol=0.0)
    return bool(a == b)


def _restraints(doc: dict, station: Stations, planes: tuple[str, ...], E: float | None, origins: dict,
                parsed: list[_SegmentInput]) -> dict[str, list[Restraint]]:
    rest: dict[str, list[Restraint]] = {a: [] for a in planes}
    for i, t in enumerate(as_tables(doc, "restraint")):
        p = f"restraint[{i + 1}]"
        check_keys(t, p, RESTRAINT_KEYS)
        if "at" not in t:
            raise CaseError(f"{p}.at", "missing: give 'base', 'top' or a height such as '2.1 m'")
        at = station(t["at"], f"{p}.at")
        ax = axes(t.get("axis"), f"{p}.axis", planes)
        lateral = spring(f"{p}.lateral", t.get("lateral", "free"), "translational stiffness")
        torsion = _restraint_torsion(t, p, at, ax, lateral)
        raw_rotation = t.get("rotation", "free")
        nominal = is_nominal(raw_rotation)
        if isinstance(raw_rotation, str) and "nominal" in raw_rotation.lower() and not nominal:
            raise CaseError(f"{p}.rotation", f"expected {' or '.join(map(repr, NOMINAL_FIXITIES))}, a rotational "
                                             f"stiffness, 'free' or 'rigid', got {raw_rotation!r}")
        rotation = 0.0 if nominal else spring(f"{p}.rotation", raw_rotation, "rotational stiffness")
        beams = t.get("beam", [])
        if isinstance(beams, dict):
            beams = [beams]
        if not isinstance(beams, list):
            raise CaseError(f"{p}.beam", "expected [[restraint.beam]] tables")
        for j, b in enumerate(beams):
            rotation += _beam_stiffness(as_table(b, f"{p}.beam[{j + 1}]"), f"{p}.beam[{j + 1}]", E)
        by_plane = {a: rotation for a in ax}
        if nominal:
            by_plane = {a: rotation + _nominal_rotation(raw_rotation, f"{p}.rotation", at, station.H,
                                                        parsed, a) for a in ax}
        elif lateral == 0 and rotation == 0:
            if torsion.twist is not None or torsion.warping:
                origins[p] = ()  # holds only the twist or the warping: read by the spatial analysis alone
                continue
            raise CaseError(p, "restrains nothing: give lateral and/or rotation")
        origins[p] = tuple(TableRef(a, "restraints", len(rest[a])) for a in ax)
        for a in ax:
            rest[a].append(Restraint(at, lateral, by_plane[a]))
    if not any(rest.values()) and not as_tables(doc, "foundation"):
        # a foundation alone can hold the column (a pile in soil): the solver's exact mechanism test decides
        raise CaseError("restraint", "no [[restraint]] and no [[foundation]] given: the column is unsupported; "
                                     "give a [[restraint]], or a [[foundation]] for a column held by the ground")
    return rest


def _restraint_torsion(t: dict, p: str, at: float, ax: tuple[str, ...], lateral: float) -> RestraintTorsion:
    """The twist, warping and offset keys of a [[restraint]] (SI); the planar analysis ignores them."""
    twist = spring(f"{p}.twist", t["twist"], "rotational stiffness") if "twist" in t else None
    raw = t.get("warping", "free")
    if not isinstance(raw, str) or raw.strip().lower() not in ("fixed", "free"):
        raise CaseError(f"{p}.warping", f"expected 'fixed' (warping prevented) or 'free', got {raw!r}")
    offset = None
    if "offset" in t:
        offset = parse(f"{p}.offset", t["offset"], "length")
        if len(ax) != 1:
            raise CaseError(f"{p}.offset", "needs axis = 'major' or 'minor': the offset is measured along the "
                                           "other principal axis from the restrained plane's")
        if lateral == 0:
            raise CaseError(f"{p}.offset", "given, but the restraint holds no lateral movement: give lateral")
    return RestraintTorsion(table=p, at=at, axes=ax, twist=twist, warping=raw.strip().lower() == "fixed",
                            offset=offset)


def _shear_modulus(material: dict) -> tuple[float | None, float]:
    """[material] G (shear modulus [Pa]) or nu (Poisson's ratio, default :data:`DEFAULT_NU`): not both."""
    if "G" in material and "nu" in material:
        raise CaseError("material.nu", "give either G or nu, not both (G = E / (2 (1 + nu)))")
    G = positive("material.G", material["G"], "stress") if "G" in material else None
    nu = material.get("nu", DEFAULT_NU)
    if isinstance(nu, bool) or not isinstance(nu, (int, float)) or not 0.0 <= nu < 0.5:
        raise CaseError("material.nu", f"expected Poisson's ratio, a number from 0 to below 0.5, got {nu!r}")
    return G, float(nu)


def spatial_inputs(case: Case) -> SpatialInputs:
    """What the thin-walled (spatial) analysis reads from the case document beyond the planar columns: the shear
    modulus or Poisson's ratio, and the twist, warping and offset of every [[restraint]] (SI)."""
    doc = dict(case.document)
    G, nu = _shear_modulus(as_table(doc.get("material", {}), "material"))
    planes = tuple(a for a, _ in case.planes)
    station = Stations(case.height)
    out = []
    for i, t in enumerate(as_tables(doc, "restraint")):
        p = f"restraint[{i + 1}]"
        ax = axes(t.get("axis"), f"{p}.axis", planes)
        lateral = spring(f"{p}.lateral", t.get("lateral", "free"), "translational stiffness")
        out.append(_restraint_torsion(t, p, station(t["at"], f"{p}.at"), ax, lateral))
    return SpatialInputs(G=G, nu=nu, restraints=tuple(out))


def _nominal_rotation(word: str, path: str, at: float, H: float, parsed: list[_SegmentInput], axis: str) -> float:
    """The rotational stiffness of a nominal fixity (``"nominally-fixed"``, ``"nominally-pinned"``) in ``axis``.

    The rule and its source: :func:`fea.model.ideal_supports.nominal_rotation_stiffness`.
    """
    if 1e-9 * H < at < H * (1 - 1e-9):
        raise CaseError(path, f"{word!r} is a column-end condition: allowed only at the base or the top, not at "
                              f"{at:g} m (give a rotational stiffness there)")
    try:
        return nominal_rotation_at(word, _plane_segments(parsed, axis), at)
    except ModelError as exc:  # pragma: no cover - the segments are checked when parsed
        raise CaseError(path, exc.message) from None


def _load_infos(doc: dict) -> tuple[LoadInfo, ...]:
    """The eccentricities and lateral force of every [[load]] (SI), kept on the case for the record of the inputs."""
    return tuple(LoadInfo(**{k: parse(f"load[{i + 1}].{k}", t[k], "force" if k == "lateral" else "length")
                             for k in sorted(LOAD_ACTION_KEYS) if k in t})
                 for i, t in enumerate(as_tables(doc, "load")))


def _loads(doc: dict, station: Stations,
           parsed: list[_SegmentInput]) -> tuple[list[PointLoad], list[DistributedLoad]]:
    """The axial loads: [[load]] and [[distributed_load]] tables, or the member forces given per segment.

    Member forces (``axial_force`` on every [[segment]]) replace the axial loads of the case: with them a
    [[load]] may give only a lateral force, and no [[distributed_load]] is allowed.  They become the
    equivalent joint loads (:func:`fea.model.column.member_force_loads`), listed after the [[load]] tables.
    """
    member, given = _member_forces(doc, parsed)
    point: list[PointLoad] = []
    for i, t in enumerate(as_tables(doc, "load")):
        p = f"load[{i + 1}]"
        check_keys(t, p, LOAD_KEYS)
        if "at" not in t:
            raise CaseError(f"{p}.at", "missing: give 'top' or a height such as '3.0 m'")
        at = station(t["at"], f"{p}.at")
        if given:
            _no_axial_load(t, p, given)
        P = parse(f"{p}.axial", t["axial"], "force") if "axial" in t else 0.0
        point.append(PointLoad(at, P, as_bool(t.get("permanent", False), f"{p}.permanent")))
    dist: list[DistributedLoad] = []
    for i, t in enumerate(as_tables(doc, "distributed_load")):
        p = f"distributed_load[{i + 1}]"
        if given:
            raise CaseError(p, f"not allowed with member forces given per segment ({given}): include this load "
                               "in each segment's axial_force (its largest compression in the segment)")
        check_keys(t, p, {"from", "to", "axial", "permanent", "note"})
        a, b = _range(t, p, station)
        if "axial" not in t:
            raise CaseError(f"{p}.axial", "missing: give a load per height such as '0.6 kN/m'")
        q = parse(f"{p}.axial", t["axial"], "force per length")
        dist.append(DistributedLoad(a, b, q, as_bool(t.get("permanent", False), f"{p}.permanent")))
    if not point and not dist and not member:
        raise CaseError("load", "no [[load]] or [[distributed_load]] given: nothing to check")
    return point + member, dist


def _member_forces(doc: dict, parsed: list[_SegmentInput]) -> tuple[list[PointLoad], str]:
    """``axial_force`` / ``axial_force_permanent`` of the [[segment]] tables -> their equivalent joint loads.

    Returns the loads and the key path of the first force given ("" when the case gives none).  Once one
    segment gives a force, every segment must give ``axial_force`` ('0 kN' where it has none), so that no
    segment is left out by mistake; ``axial_force_permanent`` is optional (default zero).
    """
    tables = as_tables(doc, "segment")
    given = next((f"segment[{i + 1}].{k}" for i, t in enumerate(tables) for k in MEMBER_FORCE_KEYS if k in t), "")
    if not given:
        return [], ""
    forces: dict[str, list[float]] = {k: [] for k in MEMBER_FORCE_KEYS}
    for i, t in enumerate(tables):
        p = f"segment[{i + 1}]"
        if "axial_force" not in t:
            raise CaseError(f"{p}.axial_force", f"missing: {given} gives the axial force per segment, so every "
                                                "segment needs its own (write '0 kN' where there is none)")
        for k in MEMBER_FORCE_KEYS:
            N = parse(f"{p}.{k}", t[k], "force") if k in t else 0.0
            try:
                PointLoad(0.0, N)  # the range check of an axial force
            except ModelError as exc:
                raise CaseError(f"{p}.{k}", exc.message) from None
            forces[k].append(N)
    joints = (0.0, *(s.top for s in parsed))
    loads = member_force_loads(joints, tuple(forces["axial_force"])) + member_force_loads(
        joints, tuple(forces["axial_force_permanent"]), permanent=True)
    if not loads:
        raise CaseError(given, "every segment's axial force is zero: nothing to check")
    return list(loads), given


def _no_axial_load(t: dict, p: str, given: str) -> None:
    """Refuse the keys of a [[load]] that need its own axial force when member forces are given per segment."""
    if "axial" in t:
        raise CaseError(f"{p}.axial", f"not allowed with member forces given per segment ({given}): give every "
                                      "segment's force as its axial_force, or use [[load]] tables and no axial_force")
    for k in sorted(LOAD_ACTION_KEYS - {"lateral"}):
        if k in t:
            raise CaseError(f"{p}.{k}", f"acts through the load's own axial force, which member forces given per "
                                        f"segment ({given}) leave out: give the moment as a [[lateral.moment]]")


def _member_force_refs(point: list[PointLoad], parsed: list[_SegmentInput]) -> list[list[int]]:
    """Per segment, the indices of the joint loads its given forces went into: those at its two ends."""
    at_height: dict[float, list[int]] = {}
    for k, ld in enumerate(point):
        if ld.member_forces:
            at_height.setdefault(ld.at, []).append(k)
    return [at_height.get(s.bottom, []) + at_height.get(s.top, []) if at_height else [] for s in parsed]


def _range(t: dict, p: str, station: Stations) -> tuple[float, float]:
    a = station(t.get("from", "base"), f"{p}.from")
    b = station(t.get("to", "top"), f"{p}.to")
    if not b > a:
        raise CaseError(f"{p}.to", f"must be above `from` ({a:g} m)")
    return a, b


def _foundations(doc: dict, station: Stations, planes: tuple[str, ...], origins: dict) -> dict[str, list[Foundation]]:
    found: dict[str, list[Foundation]] = {a: [] for a in planes}
    for i, t in enumerate(as_tables(doc, "foundation")):
        p = f"foundation[{i + 1}]"
        check_keys(t, p, {"from", "to", "modulus", "modulus_bottom", "modulus_top", "axis", "note"})
        a, b = _range(t, p, station)
        if "modulus" in t:
            kb = kt = positive(f"{p}.modulus", t["modulus"], "foundation modulus")
        elif "modulus_bottom" in t or "modulus_top" in t:
            kb = spring(f"{p}.modulus_bottom", t.get("modulus_bottom", "0 N/m^2"), "foundation modulus")
            kt = spring(f"{p}.modulus_top", t.get("modulus_top", "0 N/m^2"), "foundation modulus")
            if kb == kt == 0 or math.isinf(kb) or math.isinf(kt):
                raise CaseError(p, "modulus must be finite and not zero at both ends")
        else:
            raise CaseError(f"{p}.modulus", "missing: give modulus, or modulus_bottom and modulus_top")
        ax = axes(t.get("axis"), f"{p}.axis", planes)
        origins[p] = tuple(TableRef(x, "foundations", len(found[x])) for x in ax)
        for x in ax:
            found[x].append(Foundation(a, b, kb, kt))
    return found


def _leaning(doc: dict, station: Stations, planes: tuple[str, ...], origins: dict) -> dict[str, list[LeaningLoad]]:
    lean: dict[str, list[LeaningLoad]] = {a: [] for a in planes}
    for i, t in enumerate(as_tables(doc, "leaning")):
        p = f"leaning[{i + 1}]"
        check_keys(t, p, {"at", "load", "height", "permanent", "axis", "note"})
        for k in ("at", "load", "height"):
            if k not in t:
                raise CaseError(f"{p}.{k}", "missing")
        at = station(t["at"], f"{p}.at")
        P = parse(f"{p}.load", t["load"], "force")
        if P < 0:
            raise CaseError(f"{p}.load", f"{t['load']!r} must be >= 0 (gravity load on the leaning columns)")
        h = positive(f"{p}.height", t["height"], "length")
        ax = axes(t.get("axis"), f"{p}.axis", planes)
        origins[p] = tuple(TableRef(x, "leaning_loads", len(lean[x])) for x in ax)
        for x in ax:
            lean[x].append(LeaningLoad(at, P, h, as_bool(t.get("permanent", False), f"{p}.permanent")))
    return lean


def _extra_tables(doc: dict, tables: Mapping[str, TableParser]) -> dict:
    """The optional tables, parsed by their own parsers, in the order the parsers are listed."""
    extras = {}
    for name, parser in tables.items():
        if name in doc:
            extras[name] = parser(as_table(doc[name], name), doc)
    # An eccentricity or lateral force on a [[load]] is read by the imperfect-column analysis.  Without an
    # [imperfection] or [lateral] table it still must not be ignored: it implies an empty [lateral] table
    # (the second-order analysis of the straight column with those actions).
    load_actions = [(i, k) for i, t in enumerate(as_tables(doc, "load")) for k in t if k in LOAD_ACTION_KEYS]
    if load_actions and "imperfection" not in extras and "lateral" not in extras:
        if "lateral" not in tables:
            i, k = load_actions[0]
            raise CaseError(f"load[{i + 1}].{k}", "is read only by the imperfect-column analysis, "
                                                 "which this installation does not have")
        extras["lateral"] = tables["lateral"]({}, doc)
    return extras


def _beam_stiffness(t: dict, path: str, E_default: float | None) -> float:
    """Rotational stiffness c E I / L of a restraining beam (c from :data:`BEAM_FAR_END`)."""
    check_keys(t, path, {"E", "I", "span", "far_end", "note"})
    E = positive(f"{path}.E", t["E"], "stress") if "E" in t else E_default
    if E is None:
        raise CaseError(f"{path}.E", "missing: give E here or in [material]")
    if "I" not in t or "span" not in t or "far_end" not in t:
        missing = next(k for k in ("I", "span", "far_end") if k not in t)
        raise CaseError(f"{path}.{missing}", "missing: a restraining beam needs I, span and far_end")
    I = positive(f"{path}.I", t["I"], "second moment of area")
    span = positive(f"{path}.span", t["span"], "length")
    far = t["far_end"]
    if far not in BEAM_FAR_END:
        raise CaseError(f"{path}.far_end", f"expected one of {', '.join(BEAM_FAR_END)}, got {far!r}")
    return BEAM_FAR_END[far] * E * I / span
