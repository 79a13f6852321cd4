"""The inputs part of the report: material, segments, restraints, loads, foundations and leaning columns.

Every value is read from the parsed case (``case:`` sources, attribute paths into
:class:`~fea.model.case.Case`) and only converted to display units.
"""

from __future__ import annotations

from ..model.case import Case
from ..units import DisplayUnits
from .blocks import hdr, spring
from .document import Em, Figure, Heading, Part, Q, Sub, T, Table, q, unit_label
from .input_actions import imperfection_blocks, lateral_blocks, load_action_blocks, section_blocks
from .input_specs import design_input_blocks, study_input_blocks

__all__ = ["inputs_part"]


def _plane_label(prefix: str, axis: str) -> str:
    return f"{prefix} {axis}" if axis != "in-plane" else prefix


def _material(case: Case, u: DisplayUnits) -> list:
    mat = case.material or {}
    rows: list[tuple] = []
    if mat.get("name"):
        rows.append((("Material",), (T(mat["name"], "case:material/name"),), ()))
    rows.append((("Modulus of elasticity ", Em("E")), (q(case.E, "case:E", u.stress),), (unit_label(u.stress),)))
    if case.fy is not None:
        rows.append((("Yield strength ", Em("f"), Sub("y")), (q(case.fy, "case:fy", u.stress),),
                     (unit_label(u.stress),)))
    rows.append((("Modes computed per plane",), (Q(case.n_modes, "case:n_modes", "", 6),), ()))
    rows.append((("Relative tolerance on every reported load factor",), (q(case.tolerance, "case:tolerance", "", 2),),
                 ()))
    rows.append((("Bending planes analysed",), (", ".join(a for a, _ in case.planes),), ()))
    return [Heading(3, "Material and analysis"), Table((("Item",), ("Value",), ("Unit",)), tuple(rows), numeric=(1,))]


def _segment_columns(case: Case, u: DisplayUnits) -> tuple[list, bool, bool, bool]:
    """The header of the segment table and which optional columns it has (taper, shear stiffness, fy)."""
    planes = [a for a, _ in case.planes]
    header = [("No.",), ("Name",), hdr("Bottom", u.length), hdr("Top", u.length), hdr("Length", u.length),
              hdr("E", u.stress)]
    header += [hdr(_plane_label("I", a), u.inertia) for a in planes]
    tapered = any(s.I_top is not None for _, c in case.planes for s in c.segments)
    if tapered:
        header += [hdr(_plane_label("I top", a), u.inertia) for a in planes]
        header.append(("Taper exponent",))
    has_S = any(s.S is not None for _, c in case.planes for s in c.segments)
    if has_S:
        header += [hdr(_plane_label("S", a), u.force) for a in planes]
    header.append(hdr("A", u.area))
    has_fy = any(si.fy is not None for si in case.segments)
    if has_fy:
        header.append(hdr("fy", u.stress))
    return header, tapered, has_S, has_fy


def _segment_row(case: Case, i: int, u: DisplayUnits, tapered: bool, has_S: bool, has_fy: bool) -> tuple:
    info, seg0 = case.segments[i], case.planes[0][1].segments[i]
    row = [(Q(i + 1, f"ord:{i + 1}", "", 6),), (T(info.name, f"case:segments/{i}/name"),),
           (q(info.bottom, f"case:segments/{i}/bottom", u.length),),
           (q(info.top, f"case:segments/{i}/top", u.length),),
           (q(seg0.length, f"case:planes/0/1/segments/{i}/length", u.length),),
           (q(seg0.E, f"case:planes/0/1/segments/{i}/E", u.stress),)]
    for p, (_, c) in enumerate(case.planes):
        row.append((q(c.segments[i].I, f"case:planes/{p}/1/segments/{i}/I", u.inertia),))
    if tapered:
        for p, (_, c) in enumerate(case.planes):
            s = c.segments[i]
            row.append((q(s.I_top, f"case:planes/{p}/1/segments/{i}/I_top", u.inertia),) if s.I_top is not None
                       else ("—",))
        row.append((q(seg0.taper_exponent, f"case:planes/0/1/segments/{i}/taper_exponent", "", 3),)
                   if seg0.I_top is not None else ("—",))
    if has_S:
        for p, (_, c) in enumerate(case.planes):
            s = c.segments[i]
            row.append((q(s.S, f"case:planes/{p}/1/segments/{i}/S", u.force),) if s.S is not None else ("—",))
    row.append((q(info.A, f"case:segments/{i}/A", u.area),) if info.A is not None else ("—",))
    if has_fy:
        row.append((q(info.fy, f"case:segments/{i}/fy", u.stress),) if info.fy is not None else ("—",))
    return tuple(row)


def _segments(case: Case, u: DisplayUnits) -> list:
    header, *flags = _segment_columns(case, u)
    rows = tuple(_segment_row(case, i, u, *flags) for i in range(len(case.segments)))
    return [Heading(3, "Segments (from the base upward)"),
            Table(tuple(header), rows, numeric=tuple(range(2, len(header))))]


def _same_cells(a: tuple, b: tuple) -> bool:
    def key(cell):
        return tuple(getattr(p, "text", p) for p in cell)

    return all(key(x) == key(y) for x, y in zip(a, b))


def _restraints(case: Case, u: DisplayUnits) -> list:
    """One row per restraint, merged over the planes when equal."""
    planes = [a for a, _ in case.planes]
    merged: list[tuple[tuple, list[str]]] = []
    for p, (a, c) in enumerate(case.planes):
        for j, r in enumerate(c.restraints):
            base = f"case:planes/{p}/1/restraints/{j}"
            row = ((q(r.at, f"{base}/at", u.length),), spring(r.lateral, f"{base}/lateral", u.lateral),
                   spring(r.rotation, f"{base}/rotation", u.rotational))
            for prev in merged:
                if a not in prev[1] and _same_cells(prev[0], row):
                    prev[1].append(a)
                    break
            else:
                merged.append((row, [a]))
    merged.sort(key=lambda e: e[0][0][0].value)
    rows = []
    for row, axes in merged:
        ax = "both" if len(axes) == len(planes) and len(planes) > 1 else ", ".join(axes)
        rows.append((row[0], (ax,), row[1], row[2]))
    return [Heading(3, "Restraints"),
            Table((hdr("Height", u.length), ("Plane",), hdr("Lateral spring", u.lateral),
                   hdr("Rotational spring", u.rotational)), tuple(rows), numeric=(0, 2, 3),
                  caption=("Rotational restraint from a framing beam is shown as its stiffness ", Em("c E I / L"),
                           ". Rigid restraints remove the degree of freedom."))]


def _part_of(permanent: bool, src: str) -> T:
    return T("permanent" if permanent else "variable", src)


def _loads(case: Case, u: DisplayUnits) -> list:
    col0 = case.planes[0][1]
    rows: list[tuple] = []
    for j, ld in enumerate(col0.point_loads):
        b = f"case:planes/0/1/point_loads/{j}"
        kind = "joint load from member forces" if ld.member_forces else "point"
        rows.append(((kind,), (q(ld.at, f"{b}/at", u.length),), ("—",), (q(ld.P, f"{b}/P", u.force),), ("—",),
                     (_part_of(ld.permanent, f"{b}/permanent"),)))
    for j, dl in enumerate(col0.distributed_loads):
        b = f"case:planes/0/1/distributed_loads/{j}"
        rows.append((("distributed",), (q(dl.bottom, f"{b}/bottom", u.length),),
                     (q(dl.top, f"{b}/top", u.length),), ("—",), (q(dl.q, f"{b}/q", u.line_load),),
                     (_part_of(dl.permanent, f"{b}/permanent"),)))
    rows.sort(key=lambda r: (r[1][0].value or 0.0) if isinstance(r[1][0], Q) else 0.0)
    return [Heading(3, "Axial loads (compression positive)"),
            Table((("Kind",), hdr("At / from", u.length), hdr("To", u.length), hdr("P", u.force),
                   hdr("q", u.line_load), ("Part",)), tuple(rows), numeric=(1, 2, 3, 4),
                  caption=("Variable loads are multiplied by the load factor; permanent loads are held at "
                           "their value. All axial load is carried down to the base."
                           + (" The axial force of each segment is given in the case file (member forces); the "
                              "joint loads are their differences, N of the segment below minus N of the segment "
                              "above." if col0.member_forces_given else ""),))]


def _foundations(case: Case, u: DisplayUnits) -> list:
    rows = []
    for p, (a, c) in enumerate(case.planes):
        for j, f in enumerate(c.foundations):
            b = f"case:planes/{p}/1/foundations/{j}"
            kt = f.k_top if f.k_top is not None else f.k_bottom
            rows.append(((a,), (q(f.bottom, f"{b}/bottom", u.length),), (q(f.top, f"{b}/top", u.length),),
                         (q(f.k_bottom, f"{b}/k_bottom", u.modulus),),
                         (q(kt, f"{b}/{'k_top' if f.k_top is not None else 'k_bottom'}", u.modulus),)))
    if not rows:
        return []
    return [Heading(3, "Elastic foundation"),
            Table((("Plane",), hdr("From", u.length), hdr("To", u.length), hdr("Modulus at bottom", u.modulus),
                   hdr("Modulus at top", u.modulus)), tuple(rows), numeric=(1, 2, 3, 4))]


def _leaning(case: Case, u: DisplayUnits) -> list:
    rows = []
    for p, (a, c) in enumerate(case.planes):
        for j, ll in enumerate(c.leaning_loads):
            b = f"case:planes/{p}/1/leaning_loads/{j}"
            rows.append(((a,), (q(ll.at, f"{b}/at", u.length),), (q(ll.P, f"{b}/P", u.force),),
                         (q(ll.height, f"{b}/height", u.length),), (_part_of(ll.permanent, f"{b}/permanent"),)))
    if not rows:
        return []
    return [Heading(3, "Leaning columns"),
            Table((("Plane",), hdr("At", u.length), hdr("Gravity load", u.force),
                   hdr("Height of leaning columns", u.length), ("Part",)), tuple(rows), numeric=(1, 2, 3),
                  caption=("The gravity load of pinned columns leaning on this one acts as a lateral spring of ",
                           Em("−P / h"), " at its station; it adds no axial force here."))]


def inputs_part(case: Case, u: DisplayUnits, sketch: str | None, design: dict | None = None) -> Part:
    """The inputs as read from the case file, and the sketch of the column when one is given (``design``: the
    JSON design part of the run, for the parameters each check applied)."""
    blocks = [*_material(case, u), *_segments(case, u), *section_blocks(case, u), *_restraints(case, u),
              *_loads(case, u), *load_action_blocks(case, u), *lateral_blocks(case, u), *_foundations(case, u),
              *_leaning(case, u), *imperfection_blocks(case, u), *design_input_blocks(case, u, design),
              *study_input_blocks(case, u)]
    if sketch:
        blocks.append(Figure(sketch, ("Sketch of the column as analysed, per bending plane (not to scale across; "
                                      "heights to scale). Segment widths show the relative second moment of area.",),
                             "sketch"))
    return Part("inputs", "Inputs", blocks)
