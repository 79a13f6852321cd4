"""Inputs beyond the stiffness model: sections, load eccentricities and lateral forces, lateral actions, the bow.

Every value is read from the parsed case (``case:`` sources, attribute paths into
:class:`~fea.model.case.Case`): the section shapes of the segments
(``SegmentInfo.shape``), the eccentricities of the loads (``Case.loads``) and the
parsed ``[lateral]`` and ``[imperfection]`` tables (``Case.extras``).
"""

from __future__ import annotations

import dataclasses
from typing import Any

from ..model.case import Case
from ..units import DisplayUnits
from .blocks import hdr
from .design_steps import _trim_sig
from .document import Em, Heading, Para, Q, Sub, T, Table, q, unit_label

__all__ = ["section_blocks", "load_action_blocks", "lateral_blocks", "imperfection_blocks", "SHAPE_WORDS",
           "DIMENSION_SYMBOLS"]

#: Each section shape in words.
SHAPE_WORDS = {"rectangle": "solid rectangle", "round": "solid round", "rectangular_hollow": "rectangular hollow",
               "circular_hollow": "circular hollow", "i_section": "I section", "channel": "channel",
               "angle": "angle", "tee": "tee"}
#: The symbol and meaning of each section dimension.
DIMENSION_SYMBOLS = {"b": (("b",), "width"), "h": (("h",), "depth"), "tf": (("t", "f"), "flange thickness"),
                     "tw": (("t", "w"), "web thickness"), "r": (("r",), "root radius"), "d": (("d",), "diameter"),
                     "t": (("t",), "wall thickness"), "d_inner": (("d", "i"), "inner diameter"),
                     "r_out": (("r", "o"), "outer corner radius")}
#: The planes of a lateral action ("" acts in every plane analysed).
PLANE_WORDS = {"": "every plane", "major": "major", "minor": "minor", "in-plane": "in-plane"}


def _symbol(name: str) -> tuple:
    sym = DIMENSION_SYMBOLS.get(name, ((name,), name))[0]
    return (Em(sym[0]), Sub(sym[1])) if len(sym) > 1 else (Em(sym[0]),)


def _dimension_unit(u: DisplayUnits) -> str:
    return "mm" if u.section == "cm" else "in"


def section_blocks(case: Case, u: DisplayUnits) -> list:
    """The sections of the segments given by shape: their dimensions and the properties derived from them."""
    rows = []
    unit = _dimension_unit(u)
    for i, info in enumerate(case.segments):
        shape = info.shape
        if shape is None:
            continue
        base = f"case:segments/{i}"
        dims: list = []
        for f in dataclasses.fields(shape):
            value = getattr(shape, f.name)
            if value is None or not isinstance(value, (int, float)) or (f.name.startswith("r") and value == 0):
                continue
            shown = q(value, f"{base}/shape/{f.name}", unit)
            dims += ["; " if dims else "", *_symbol(f.name), " = ",
                     q(value, shown.src, unit, _trim_sig(shown.value or 0.0, 4))]
        kind = getattr(type(shape), "kind", "")
        rows.append(((Q(i + 1, f"ord:{i + 1}", "", 6),), (T(info.name, f"{base}/name"),),
                     (SHAPE_WORDS.get(kind, kind.replace("_", " ")),), tuple(dims),
                     (q(info.A, f"{base}/A", u.area),) if info.A is not None else ("—",),
                     (q(info.I_major, f"{base}/I_major", u.inertia),) if info.I_major is not None else ("—",),
                     (q(info.I_minor, f"{base}/I_minor", u.inertia),) if info.I_minor is not None else ("—",),
                     _least_radius(info, base, unit)))
    if not rows:
        return []
    used = sorted({f.name for info in case.segments if info.shape is not None
                   for f in dataclasses.fields(info.shape) if f.name in DIMENSION_SYMBOLS})
    key: list = []
    for name in used:
        key += ["; " if key else "", *_symbol(name), ": ", DIMENSION_SYMBOLS[name][1]]
    return [Heading(3, "Sections"),
            Table((("No.",), ("Segment",), ("Shape",), (f"Dimensions [{unit_label(unit)}]",), hdr("A", u.area),
                   hdr("I major", u.inertia), hdr("I minor", u.inertia), hdr("r least", unit)), tuple(rows),
                  numeric=(4, 5, 6, 7),
                  caption=("Dimensions as given; area, second moments of area about the principal axes and the "
                           "least radius of gyration computed from them. ", *key, "."))]


def _least_radius(info, base: str, unit: str) -> tuple:
    """The least radius of gyration of a section given by shape, or a dash."""
    r = (info.properties or {}).get("r_least")
    return (q(float(r), f"{base}/properties/r_least", unit),) if r is not None else ("—",)


_LOAD_ACTION_WORDS = {"eccentricity": "Eccentricity, every plane", "eccentricity_major": "Eccentricity, major axis",
                      "eccentricity_minor": "Eccentricity, minor axis", "lateral": "Lateral force"}


def load_action_blocks(case: Case, u: DisplayUnits) -> list:
    """The eccentricities and lateral forces given on the [[load]] tables."""
    col0 = case.planes[0][1]
    keys = [k for k in ("eccentricity", "eccentricity_major", "eccentricity_minor", "lateral")
            if any(getattr(info, k) is not None for info in case.loads)]
    rows = []
    for i, info in enumerate(case.loads):
        if all(getattr(info, f.name) is None for f in dataclasses.fields(info)) or i >= len(col0.point_loads):
            continue
        ld, b = col0.point_loads[i], f"case:loads/{i}"
        cells: list[tuple] = [(Q(i + 1, f"ord:{i + 1}", "", 6),),
                              (q(ld.at, f"case:planes/0/1/point_loads/{i}/at", u.length),),
                              (q(ld.P, f"case:planes/0/1/point_loads/{i}/P", u.force),)]
        for key in keys:
            value, unit = getattr(info, key), u.force if key == "lateral" else u.length
            cells.append((q(value, f"{b}/{key}", unit),) if value is not None else ("—",))
        rows.append(tuple(cells))
    if not rows:
        return []
    return [Heading(3, "Eccentricities and lateral forces of the loads"),
            Table((("Load",), hdr("At", u.length), hdr("P", u.force),
                   *(hdr(_LOAD_ACTION_WORDS[k], u.force if k == "lateral" else u.length) for k in keys)),
                  tuple(rows), numeric=tuple(range(3 + len(keys))),
                  caption=("An eccentric load applies the moment ", Em("P e"), " at its station (the eccentricity "
                           "of one axis replaces the one for every plane); these act in the second-order and "
                           "nonlinear analyses of the imperfect column, not in the elastic critical loads.",))]


def _lateral_spec(case: Case) -> tuple[Any, str] | None:
    """The lateral actions the imperfect-column analysis applies, and their path in the case."""
    if "lateral" in case.extras:
        return case.extras["lateral"], "case:extras/lateral"
    imp = case.extras.get("imperfection")
    if imp is not None and imp.loads is not None:
        return imp.loads, "case:extras/imperfection/loads"
    return None


def lateral_blocks(case: Case, u: DisplayUnits) -> list:
    """Lateral point loads, lateral loads per length and applied moments (with those of eccentric loads)."""
    found = _lateral_spec(case)
    if found is None or found[0].empty:
        return []
    spec, base = found
    rows: list[tuple] = []
    for j, (ax, a) in enumerate(spec.point):
        b = f"{base}/point/{j}/1"
        rows.append((("lateral point load",), (PLANE_WORDS.get(ax, ax),), (q(a.at, f"{b}/at", u.length),), ("—",),
                     (q(a.force, f"{b}/force", u.force),), (T("permanent" if a.permanent else "variable",
                                                             f"{b}/permanent"),)))
    for j, (ax, a) in enumerate(spec.distributed):
        b = f"{base}/distributed/{j}/1"
        top: tuple = (" to ", q(a.q_top, f"{b}/q_top", u.line_load)) if a.q_top is not None else ()
        rows.append((("lateral load per length",), (PLANE_WORDS.get(ax, ax),),
                     (q(a.bottom, f"{b}/bottom", u.length), " – ", q(a.top, f"{b}/top", u.length)), ("—",),
                     (q(a.q_bottom, f"{b}/q_bottom", u.line_load), *top, f" {unit_label(u.line_load)}"),
                     (T("permanent" if a.permanent else "variable", f"{b}/permanent"),)))
    for j, (ax, a) in enumerate(spec.moments):
        b = f"{base}/moments/{j}/1"
        rows.append((("applied moment",), (PLANE_WORDS.get(ax, ax),), (q(a.at, f"{b}/at", u.length),),
                     (q(a.moment, f"{b}/moment", u.moment),), ("—",),
                     (T("permanent" if a.permanent else "variable", f"{b}/permanent"),)))
    return [Heading(3, "Lateral actions"),
            Table((("Kind",), ("Plane",), hdr("At / from – to", u.length), hdr("Moment", u.moment),
                   (f"Force [{unit_label(u.force)}] or load per length",), ("Part",)), tuple(rows),
                  numeric=(2, 3, 4),
                  caption=("Lateral actions of the imperfect-column analysis, from its [lateral] table and the "
                           "loads above (an applied moment of an eccentric load is ", Em("P e"), "). Variable "
                           "actions grow with the load factor; permanent ones are held.",))]


def imperfection_blocks(case: Case, u: DisplayUnits) -> list:
    """The initial bow, residual stress and the settings of the imperfect-column analysis."""
    spec: Any = case.extras.get("imperfection")
    if spec is None:
        return []
    b = "case:extras/imperfection"
    imp = spec.imperfection
    rows: list[tuple] = [(("Shape of the bow",), (T(imp.shape, f"{b}/imperfection/shape"),), ())]
    if imp.amplitude is not None:
        rows.append((("Bow amplitude",), (q(imp.amplitude, f"{b}/imperfection/amplitude", u.length),),
                     (unit_label(u.length),)))
    if imp.ratio is not None:
        rows.append((("Bow ratio ", Em("n"), " (bow = ", Em("L"), " / ", Em("n"), ")"),
                     (q(imp.ratio, f"{b}/imperfection/ratio", "", 4),), ()))
    for k, (at, off) in enumerate(imp.offsets):
        rows.append((("Measured offset at ", q(at, f"{b}/imperfection/offsets/{k}/0", u.length), " ",
                      unit_label(u.length)), (q(off, f"{b}/imperfection/offsets/{k}/1", u.length),),
                     (unit_label(u.length),)))
    rows += [
        (("Planes with a bow",), (T(spec.axis, f"{b}/axis"),), ()),
        (("Residual stress at the flange tips, as a fraction of ", Em("f"), Sub("y")),
         (q(spec.residual_stress, f"{b}/residual_stress", "", 3),), ()),
        (("Hardening modulus after yield, as a fraction of ", Em("E")), (q(spec.hardening, f"{b}/hardening", "", 3),),
         ()),
        (("Analyses",), (T(spec.analysis, f"{b}/analysis"),), ()),
        (("Path-following method",), (T(spec.method, f"{b}/method"),), ()),
        (("Largest number of path steps",), (Q(spec.steps, f"{b}/steps", "", 6),), ()),
        (("Relative tolerance of the nonlinear path",), (q(spec.tolerance, f"{b}/tolerance", "", 2),), ()),
        (("Fibres across a section",), (Q(spec.fibres, f"{b}/fibres", "", 6),), ()),
        (("Least number of elements",), (Q(spec.elements, f"{b}/elements", "", 6),), ()),
    ]
    for plane, W in spec.W.items():
        rows.append((("Elastic section modulus ", Em("W"), ", ", PLANE_WORDS.get(plane, plane)),
                     (q(W, f"{b}/W/{plane}", u.section_modulus),), (unit_label(u.section_modulus),)))
    return [Heading(3, "Imperfection and residual stress"),
            Table((("Item",), ("Value",), ("Unit",)), tuple(rows), numeric=(1,)),
            Para(("The bow is stress-free; the residual stress follows the linear flange pattern of rolled I "
                  "sections in the nonlinear fibre analysis only.",))]
