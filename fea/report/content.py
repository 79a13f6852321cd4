"""What the calculation report says: results and inputs -> a list of :class:`Part`.

Results are read from the JSON result dict of the run (the same dict that
``stanchion check --json`` writes); inputs are read from the parsed case.  No
physics is computed here: values are only converted to display units.
"""

from __future__ import annotations

import math
from dataclasses import dataclass
from typing import Any, Callable

from ..cautions import CAUTION, LIMITATIONS
from ..results import CaseResults
from ..units import DisplayUnits
from .document import Bullets, Em, Sub, Figure, Heading, Note, Para, Part, Q, T, Table, q, unit_label

__all__ = ["Units", "report_parts", "PART_FIGURES", "KNOWN_PARTS", "header_rows"]

#: Figures for optional JSON parts: part name -> f(CaseResults, JSON part, DisplayUnits) -> list of
#: (matplotlib Figure or SVG text, caption).  Overrides the built-in figures of "design" and
#: "imperfect"; registered by the modules that own a part.
PART_FIGURES: dict[str, Callable[[CaseResults, Any, DisplayUnits], list]] = {}

#: Top-level JSON keys this module renders itself; any other dict or list part is
#: rendered generically.
KNOWN_PARTS = {"units", "tool", "title", "case_file", "case_sha256", "height_m", "governing_axis",
               "governing_load_factor", "buckling", "cautions"}

SOLVER_TEXT = {
    "dense": "dense symmetric-definite eigen solution (LAPACK) of the whole system",
    "sparse": "a banded Cholesky factor of the stiffness matrix driving a Lanczos iteration (ARPACK) for the "
              "lowest modes",
}


@dataclass(frozen=True)
class Units:
    """Display units (pint unit strings) for each quantity of a report."""

    length: str
    force: str
    stress: str
    section: str

    @classmethod
    def from_display(cls, d: DisplayUnits) -> "Units":
        section = "cm" if d.length in ("m", "cm", "mm") else "in"
        return cls(d.length, d.force, d.stress, section)

    @property
    def line_load(self) -> str:
        return f"{self.force}/{self.length}"

    @property
    def lateral(self) -> str:
        return f"{self.force}/{self.length}"

    @property
    def rotational(self) -> str:
        return f"{self.force}*{self.length}/rad"

    @property
    def modulus(self) -> str:
        return f"{self.force}/{self.length}^2"

    @property
    def moment(self) -> str:
        return f"{self.force}*{self.length}"

    @property
    def area(self) -> str:
        return f"{self.section}^2"

    @property
    def inertia(self) -> str:
        return f"{self.section}^4"

    def by_suffix(self, key: str) -> tuple[str, str]:
        """(display unit, shown label) of a JSON key by its SI suffix; ("", "") for none."""
        table = (("_N_per_m", self.line_load), ("_N_m", self.moment), ("_Nm", self.moment),
                 ("_Pa", self.stress), ("_m4", self.inertia), ("_m3", f"{self.section}^3"),
                 ("_m2", self.area), ("_N", self.force), ("_m", self.length))
        for suffix, unit in table:
            if key.endswith(suffix):
                return unit, unit_label(unit)
        if key.endswith("_rad"):
            return "", "rad"
        return "", ""


def _hdr(text: str, unit: str = "") -> tuple:
    return (text,) if not unit else (text, f" [{unit_label(unit)}]")


def _spring(value: float, src: str, unit: str) -> tuple:
    if math.isinf(value):
        return (T("rigid", src),)
    if value == 0:
        return (T("free", src),)
    return (q(value, src, unit),)


def _yes(value: bool, src: str) -> T:
    return T("yes" if value else "no", src)


def header_rows(data: dict, case, date: str) -> list[tuple]:
    """The identification rows printed under the title."""
    d = case.display
    return [
        (("Case file",), (T(data["case_file"], "json:case_file"),) if data.get("case_file") else ("(given as text)",)),
        (("Hash of the case file, ", T("SHA-256", "name:SHA-256")), (T(data["case_sha256"], "json:case_sha256"),)),
        (("Program",), (T(data["tool"]["name"], "json:tool/name"), " version ",
                        T(data["tool"]["version"], "json:tool/version"))),
        (("Date of this report",), (T(date, "report:date"),)),
        (("Display units",), (f"lengths in {d.length}, forces in {d.force}, stresses in {d.stress}",)),
    ]


# ---------------------------------------------------------------------------
# inputs


def _inputs(res: CaseResults, u: Units, sketch: str | None) -> Part:
    case = res.case
    blocks: list = []
    planes = [a for a, _ in case.planes]
    col0 = case.planes[0][1]

    mat = case.material or {}
    rows = []
    if mat.get("name"):
        rows.append((("Material",), (T(mat["name"], "case:material/name"),), ()))
    rows.append((("Modulus of elasticity ", Em("E")), (q(case.E, "case:E", u.stress),), (unit_label(u.stress),)))
    if case.fy is not None:
        rows.append((("Yield strength ", Em("f"), Sub("y")), (q(case.fy, "case:fy", u.stress),),
                     (unit_label(u.stress),)))
    rows.append((("Modes computed per plane",), (Q(case.n_modes, "case:n_modes", "", 6),), ()))
    rows.append((("Relative tolerance on the lowest load factor",), (q(case.tolerance, "case:tolerance", "", 2),),
                 ()))
    rows.append((("Bending planes analysed",), (", ".join(planes),), ()))
    blocks.append(Heading(3, "Material and analysis"))
    blocks.append(Table((("Item",), ("Value",), ("Unit",)), tuple(rows), numeric=(1,)))

    # segments
    blocks.append(Heading(3, "Segments (from the base upward)"))
    header = [("No.",), ("Name",), _hdr("Bottom", u.length), _hdr("Top", u.length), _hdr("Length", u.length),
              _hdr("E", u.stress)]
    for p, a in enumerate(planes):
        header.append(_hdr(f"I {a}" if a != "in-plane" else "I", u.inertia))
    tapered = any(s.I_top is not None for _, c in case.planes for s in c.segments)
    if tapered:
        for a in planes:
            header.append(_hdr(f"I top {a}" if a != "in-plane" else "I top", u.inertia))
        header.append(("Taper exponent",))
    has_S = any(s.S is not None for _, c in case.planes for s in c.segments)
    if has_S:
        for a in planes:
            header.append(_hdr(f"S {a}" if a != "in-plane" else "S", u.force))
    header.append(_hdr("A", u.area))
    has_fy = any(si.fy is not None for si in case.segments)
    if has_fy:
        header.append(_hdr("fy", u.stress))
    rows = []
    for i, info in enumerate(case.segments):
        seg0 = col0.segments[i]
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
        rows.append(tuple(row))
    blocks.append(Table(tuple(header), tuple(rows), numeric=tuple(range(2, len(header)))))

    # restraints: one row per restraint, merged over the planes when equal
    blocks.append(Heading(3, "Restraints"))
    rrows: list[tuple[tuple, list[str]]] = []
    for p, (a, c) in enumerate(case.planes):
        for j, r in enumerate(c.restraints):
            base = f"case:planes/{p}/1/restraints/{j}"
            row = ((q(r.at, f"{base}/at", u.length),), _spring(r.lateral, f"{base}/lateral", u.lateral),
                   _spring(r.rotation, f"{base}/rotation", u.rotational))
            for prev in rrows:
                if a not in prev[1] and _same_cells(prev[0], row):
                    prev[1].append(a)
                    break
            else:
                rrows.append((row, [a]))
    rrows.sort(key=lambda e: e[0][0][0].value)
    rows = []
    for row, axes in rrows:
        ax = "both" if len(axes) == len(planes) and len(planes) > 1 else ", ".join(axes)
        rows.append((row[0], (ax,), row[1], row[2]))
    blocks.append(Table((_hdr("Height", u.length), ("Plane",), _hdr("Lateral spring", u.lateral),
                         _hdr("Rotational spring", u.rotational)), tuple(rows), numeric=(0, 2, 3),
                        caption=("Rotational restraint from a framing beam is shown as its stiffness ",
                                 Em("c E I / L"), ". Rigid restraints remove the degree of freedom.")))

    # loads
    blocks.append(Heading(3, "Axial loads (compression positive)"))
    rows = []
    for j, ld in enumerate(col0.point_loads):
        b = f"case:planes/0/1/point_loads/{j}"
        rows.append((("point",), (q(ld.at, f"{b}/at", u.length),), ("—",), (q(ld.P, f"{b}/P", u.force),), ("—",),
                     (T("permanent" if ld.permanent else "variable", f"{b}/permanent"),)))
    for j, ld in enumerate(col0.distributed_loads):
        b = f"case:planes/0/1/distributed_loads/{j}"
        rows.append((("distributed",), (q(ld.bottom, f"{b}/bottom", u.length),),
                     (q(ld.top, f"{b}/top", u.length),), ("—",), (q(ld.q, f"{b}/q", u.line_load),),
                     (T("permanent" if ld.permanent else "variable", f"{b}/permanent"),)))
    rows = [tuple(r) for r in _group(rows)]
    blocks.append(Table((("Kind",), _hdr("At / from", u.length), _hdr("To", u.length), _hdr("P", u.force),
                         _hdr("q", u.line_load), ("Part",)), tuple(rows), numeric=(1, 2, 3, 4),
                        caption=("Variable loads are multiplied by the load factor; permanent loads are held at "
                                 "their value. All axial load is carried down to the base.",)))

    extra_rows = []
    for p, (a, c) in enumerate(case.planes):
        for j, f in enumerate(c.foundations):
            b = f"case:planes/{p}/1/foundations/{j}"
            kt = f.k_top if f.k_top is not None else f.k_bottom
            extra_rows.append(((a,), (q(f.bottom, f"{b}/bottom", u.length),), (q(f.top, f"{b}/top", u.length),),
                               (q(f.k_bottom, f"{b}/k_bottom", u.modulus),),
                               (q(kt, f"{b}/{'k_top' if f.k_top is not None else 'k_bottom'}", u.modulus),)))
    if extra_rows:
        blocks.append(Heading(3, "Elastic foundation"))
        blocks.append(Table((("Plane",), _hdr("From", u.length), _hdr("To", u.length),
                             _hdr("Modulus at bottom", u.modulus), _hdr("Modulus at top", u.modulus)),
                            tuple(tuple(r) for r in extra_rows), numeric=(1, 2, 3, 4)))
    lean_rows = []
    for p, (a, c) in enumerate(case.planes):
        for j, ll in enumerate(c.leaning_loads):
            b = f"case:planes/{p}/1/leaning_loads/{j}"
            lean_rows.append(((a,), (q(ll.at, f"{b}/at", u.length),), (q(ll.P, f"{b}/P", u.force),),
                              (q(ll.height, f"{b}/height", u.length),),
                              (T("permanent" if ll.permanent else "variable", f"{b}/permanent"),)))
    if lean_rows:
        blocks.append(Heading(3, "Leaning columns"))
        blocks.append(Table((("Plane",), _hdr("At", u.length), _hdr("Gravity load", u.force),
                             _hdr("Height of leaning columns", u.length), ("Part",)), tuple(lean_rows),
                            numeric=(1, 2, 3),
                            caption=("The gravity load of pinned columns leaning on this one acts as a lateral "
                                     "spring of ", Em("−P / h"), " at its station; it adds no axial force here.")))
    if sketch:
        blocks.append(Figure(sketch, ("Sketch of the column as analysed, per bending plane (not to scale across; "
                                      "heights to scale). Segment widths show the relative second moment of area.",),
                             "sketch"))
    return Part("inputs", "Inputs", blocks)


def _same_cells(a: tuple, b: tuple) -> bool:
    def key(cell):
        return tuple(getattr(p, "text", p) for p in cell)

    return all(key(x) == key(y) for x, y in zip(a, b))


def _group(rows: list[tuple]) -> list[tuple]:
    return sorted(rows, key=lambda r: (r[1][0].value if isinstance(r[1][0], Q) else 0.0))


# ---------------------------------------------------------------------------
# method


def _method(res: CaseResults, data: dict, u: Units) -> Part:
    case = res.case
    has_S = any(s.S is not None for _, c in case.planes for s in c.segments)
    has_perm = any(ld.permanent for _, c in case.planes for ld in (*c.point_loads, *c.distributed_loads))
    blocks: list = [
        Heading(3, "Model"),
        Para(("The member is modelled, separately in each bending plane, with two-node cubic beam-column elements: "
              "Hermite cubics for the lateral displacement, ",
              *(("with shear-deformable cubics in the segments where a shear stiffness ", Em("S"), " is given.")
                if has_S else ("shear deformation neglected (no shear stiffness ", Em("S"), " is given).")),
              " The geometric stiffness is the consistent one, integrated exactly for an axial force that varies "
              "linearly along an element, so distributed axial load is not lumped.")),
        Heading(3, "Mesh and convergence"),
        Para(("A node is placed at every station (segment joints, restraints, load points, ends of foundations "
              "and distributed loads). Each interval is subdivided and the mesh is doubled until the estimated "
              "relative discretisation error of the lowest load factor is below the tolerance. The estimate "
              "compares successive refinement levels.",)),
    ]
    rows = []
    for i, b in enumerate(data["buckling"]):
        s = f"json:buckling/{i}"
        rows.append(((T(b["axis"], f"{s}/axis"),), (Q(b["n_elements"], f"{s}/n_elements", "", 6),),
                     (q(b["tolerance"], f"{s}/tolerance", "", 2),),
                     (q(b["discretisation_error"], f"{s}/discretisation_error", "", 2),),
                     (_yes(b["converged"], f"{s}/converged"),), (T(b["solver"], f"{s}/solver"),)))
    blocks.append(Table((("Plane",), ("Elements",), ("Tolerance",), ("Achieved estimate",), ("Converged",),
                         ("Eigen solver",)), tuple(rows), numeric=(1, 2, 3),
                        caption=("Relative error of the lowest load factor of each plane.",)))
    solvers = sorted({b["solver"] for b in data["buckling"]})
    blocks.append(Heading(3, "Eigenproblem"))
    blocks.append(Para(("The critical load factors ", Em("λ"), " and mode shapes ", Em("φ"), " solve ",
                        Em("K φ = λ G φ"), ", with ", Em("K"), " the elastic (plus spring and foundation) stiffness "
                        "and ", Em("G"), " the geometric stiffness of the variable loads; permanent loads enter ",
                        Em("K"), ". Solver used: ", "; ".join(f"{s}: {SOLVER_TEXT.get(s, s)}" for s in solvers),
                        ". Each mode is scaled so that its largest lateral displacement is one, taken positive.")))
    blocks.append(Heading(3, "Effective-length factors"))
    blocks.append(Para(("For each segment ", Em("K"), " = (π / ", Em("L"), ") √(", Em("E I"), Sub("ref"), " / ",
                        Em("N"), Sub("cr"), ")",
                        ", with ", Em("I"), Sub("ref"), " the larger end value of a tapered segment and ", Em("N"),
                        Sub("cr"), " the largest compression in the segment at the critical state. ",
                        Em("K"), " is flagged as not meaningful when the segment stores less than one per cent of "
                        "the bending energy of the mode or carries less than five per cent of the largest axial "
                        "force: such a segment takes no real part in the buckling and its ", Em("K"),
                        " is not a value to design with.")))
    items = [("Planar flexural buckling only, about each principal axis separately.",),
             ("All axial load is carried down the column to its base: the axial force at a height is the sum of "
              "the loads above it.",),
             ("Linear elastic material and small displacements for the critical loads.",),
             ("Restraints act exactly at their stations and are taken as given.",)]
    if has_perm:
        items.append(("With permanent loads present, the load factor multiplies the variable loads only.",))
    blocks.append(Heading(3, "Assumptions"))
    blocks.append(Bullets(tuple(items)))
    return Part("method", "Method", blocks)


# ---------------------------------------------------------------------------
# buckling results


def _buckling(res: CaseResults, data: dict, u: Units, mode_figures: list) -> Part:
    case = res.case
    blocks: list = []
    gi = next(i for i, b in enumerate(data["buckling"]) if b["axis"] == data["governing_axis"])
    if len(data["buckling"]) > 1:
        blocks.append(Para(("Governing plane: ", T(data["governing_axis"], "json:governing_axis"),
                            " axis, lowest load factor ", Em("λ"), " = ",
                            q(data["governing_load_factor"], "json:governing_load_factor"), ".")))
    else:
        blocks.append(Para(("Lowest load factor ", Em("λ"), " = ",
                            q(data["governing_load_factor"], "json:governing_load_factor"), ".")))
    for i, b in enumerate(data["buckling"]):
        s = f"json:buckling/{i}"
        axis = b["axis"]
        title = f"{axis.capitalize()} axis" if axis != "in-plane" else "In-plane"
        blocks.append(Heading(3, title + (" (governing)" if i == gi and len(data["buckling"]) > 1 else "")))
        lf = b["load_factors"]
        blocks.append(Table((("Mode",), ("Load factor λ",)),
                            tuple(((Q(k + 1, f"ord:{k + 1}", "", 6),), (q(v, f"{s}/load_factors/{k}"),))
                                  for k, v in enumerate(lf)), numeric=(0, 1)))
        rows = []
        for j, sg in enumerate(b["segments"]):
            p = f"{s}/segments/{j}"
            name = case.segments[j].name if j < len(case.segments) else ""
            K = sg["effective_length_factor"]
            rows.append(((Q(sg["index"], f"{p}/index", "", 6),), (T(name, f"case:segments/{j}/name"),),
                         (q(sg["bottom_m"], f"{p}/bottom_m", u.length), " – ", q(sg["top_m"], f"{p}/top_m", u.length)),
                         (q(sg["axial_force_N"], f"{p}/axial_force_N", u.force),),
                         (q(sg["critical_axial_force_N"], f"{p}/critical_axial_force_N", u.force),),
                         (q(K, f"{p}/effective_length_factor", "", 3),),
                         (q(sg["effective_length_m"], f"{p}/effective_length_m", u.length),),
                         (q(sg["energy_share"], f"{p}/energy_share", "%", 3),),
                         (_yes(sg["k_meaningful"], f"{p}/k_meaningful"),),
                         (T(sg["note"], f"{p}/note"),) if sg["note"] else ("",)))
        blocks.append(Table((("No.",), ("Segment",), _hdr("Extent", u.length), (Em("N"), f" [{unit_label(u.force)}]"),
                             (Em("N"), Sub("cr"), f" [{unit_label(u.force)}]"), (Em("K"),),
                             (Em("K L"), f" [{unit_label(u.length)}]"),
                             ("Energy [%]",), ("K meaningful",), ("Note",)),
                            tuple(rows), numeric=(2, 3, 4, 5, 6, 7),
                            caption=(Em("N"), ": largest compression at load factor one; ", Em("N"), Sub("cr"),
                                     ": the same at the critical state of the first mode; energy: share of the mode's bending energy.")))
        blocks.append(Para(("Status: ", T(b["message"], f"{s}/message"), ".")))
    for svg, caption in mode_figures:
        blocks.append(Figure(svg, caption, "modes"))
    return Part("buckling", "Elastic critical buckling", blocks)


# ---------------------------------------------------------------------------
# optional parts, rendered from their JSON


#: Engineering wording of the keys of the imperfect-column part (the key still names the source of the label).
KEY_LABELS = {
    # imperfect column, per plane
    "analysis": "Analyses run",
    "status": "How the analysis ended",
    "success": "Completed",
    "message": "Solver message",
    "critical_load_factor": "Elastic critical load factor",
    "first_yield_load_factor": "First-yield load factor",
    "first_yield_source": "First yield taken from",
    "second_order_first_yield_load_factor": "First-yield load factor, second-order elastic analysis",
    "fibre_first_yield_load_factor": "First-yield load factor, nonlinear fibre analysis",
    "limit_load_factor": "Ultimate (limit) load factor",
    # the initial bow
    "shape": "Shape of the bow",
    "largest_bow_m": "Largest bow",
    "amplitude_m": "Bow amplitude as given",
    "ratio": "Length-to-bow ratio (bow given as L / ratio)",
    # comparison per segment
    "segment": "Segment",
    "axial_force_N": "Axial force",
    "critical_force_N": "Elastic critical force",
    "euler_force_N": "Euler force (segment alone, pinned ends)",
    "perry_force_N": "Perry-Robertson first-yield force",
    "first_yield_force_N": "First-yield force",
    "limit_force_N": "Ultimate (limit) force",
    "euler_load_factor": "Euler load factor",
    "perry_load_factor": "Perry-Robertson first-yield load factor",
    "note": "Note",
    # second-order elastic analysis and nonlinear path
    "n_elements": "Elements of the final mesh",
    "tolerance": "Relative tolerance",
    "discretisation_error": "Estimated relative discretisation error",
    "converged": "Converged",
    "first_yield_height_m": "Height of first yield",
    "first_yield_offset_m": "Distance of the first-yielding fibre from the bending axis",
    "limit_accuracy": "Relative accuracy of the ultimate load",
    "control_height_m": "Height whose deflection is plotted (largest deflection)",
    "n_fibres": "Fibres per section",
    "n_steps": "Arc-length steps",
    "n_iter": "Equilibrium iterations, all steps",
    "max_residual": "Largest relative residual of the stored points",
}


def _label(key: str, path: str) -> T:
    if key in KEY_LABELS and path.startswith("imperfect/"):
        return T(KEY_LABELS[key], f"key:{path}")
    base = key
    for suffix in ("_N_per_m", "_N_m", "_Nm", "_Pa", "_m4", "_m3", "_m2", "_N", "_m", "_rad"):
        if key.endswith(suffix):
            base = key[: -len(suffix)]
            break
    text = base.replace("_", " ")
    return T(text[:1].upper() + text[1:], f"key:{path}")


def _scalar(value: Any) -> bool:
    return value is None or isinstance(value, (bool, int, float, str))


def _cell(key: str, value: Any, path: str, u: Units) -> tuple:
    if isinstance(value, bool):
        return (_yes(value, f"json:{path}"),)
    if value is None:
        return ("—",)
    if isinstance(value, int) and not u.by_suffix(key)[0]:
        return (Q(value, f"json:{path}", "", 6),)
    if isinstance(value, (int, float)):
        return (q(value, f"json:{path}", u.by_suffix(key)[0]),)
    return (T(str(value), f"json:{path}"),)


def generic_blocks(obj: Any, path: str, u: Units, level: int = 3) -> list:
    """Tables for an optional JSON part: scalars as (quantity, value, unit) rows, lists of records as tables."""
    blocks: list = []
    if isinstance(obj, list):
        return _list_blocks("", obj, path, u, level)
    rows = []
    for k, v in obj.items():
        p = f"{path}/{k}"
        if _scalar(v):
            rows.append(((_label(k, p),), _cell(k, v, p, u), (u.by_suffix(k)[1],)))
        elif isinstance(v, list) and all(isinstance(x, (int, float)) and not isinstance(x, bool) for x in v):
            if len(v) <= 8:
                cell: list = []
                for n, x in enumerate(v):
                    cell.extend(([", "] if n else []) + list(_cell(k, x, f"{p}/{n}", u)))
                rows.append(((_label(k, p),), tuple(cell), (u.by_suffix(k)[1],)))
            else:
                rows.append(((_label(k, p),), ("a series; see the JSON result",), (u.by_suffix(k)[1],)))
    if rows:
        blocks.append(Table((("Quantity",), ("Value",), ("Unit",)), tuple(rows), numeric=(1,)))
    for k, v in obj.items():
        p = f"{path}/{k}"
        if isinstance(v, dict):
            blocks.append(_heading(level, k, p))
            blocks.extend(generic_blocks(v, p, u, level + 1))
        elif isinstance(v, list) and v and not all(_scalar(x) for x in v):
            blocks.append(_heading(level, k, p))
            blocks.extend(_list_blocks(k, v, p, u, level + 1))
    return blocks


def _heading(level: int, key: str, path: str) -> Heading:
    return Heading(min(level, 4), _label(key, path))


def _list_blocks(key: str, items: list, path: str, u: Units, level: int) -> list:
    records = [x for x in items if isinstance(x, dict)]
    if len(records) == len(items):
        cols: list[str] = []
        for r in records:
            for k, v in r.items():
                if _scalar(v) and k not in cols:
                    cols.append(k)
        header = tuple((_label(k, f"{path}/0/{k}" if k in records[0] else f"{path}/{_first(records, k)}/{k}"),
                        f" [{u.by_suffix(k)[1]}]" if u.by_suffix(k)[1] else "") for k in cols)
        rows = tuple(tuple(_cell(k, r.get(k), f"{path}/{n}/{k}", u) if k in r else ("—",) for k in cols)
                     for n, r in enumerate(records))
        out: list = [Table(header, rows, numeric=tuple(i for i, k in enumerate(cols)
                                                         if isinstance(records[0].get(k), (int, float))))]
        for n, r in enumerate(records):
            for k, v in r.items():
                if not _scalar(v):
                    out.append(_heading(level, k, f"{path}/{n}/{k}"))
                    out.extend(generic_blocks(v, f"{path}/{n}/{k}", u, level + 1))
        return out
    return [Bullets(tuple(_cell(key, x, f"{path}/{n}", u) for n, x in enumerate(items) if _scalar(x)))]


def _first(records: list, k: str) -> int:
    return next(i for i, r in enumerate(records) if k in r)


def _svg_of(fig: Any) -> str:
    from .svg import figure_svg

    return fig if isinstance(fig, str) else figure_svg(fig)


def _rows(obj: dict, path: str, keys: tuple[str, ...], u: Units) -> list[tuple]:
    """(quantity, value, unit) rows for the ``keys`` present in ``obj``."""
    return [((_label(k, f"{path}/{k}"),), _cell(k, obj[k], f"{path}/{k}", u), (u.by_suffix(k)[1],))
            for k in keys if k in obj and _scalar(obj[k])]


def _qtable(rows: list[tuple], caption: tuple = ()) -> Table:
    return Table((("Quantity",), ("Value",), ("Unit",)), tuple(rows), caption=caption, numeric=(1,))


def _record_table(records: list[dict], path: str, cols: tuple[str, ...], u: Units, caption: tuple = ()) -> Table:
    cols = tuple(k for k in cols if any(k in r for r in records))
    header = tuple((_label(k, f"{path}/{_first(records, k)}/{k}"),
                    f" [{u.by_suffix(k)[1]}]" if u.by_suffix(k)[1] else "") for k in cols)
    rows = tuple(tuple(_cell(k, r[k], f"{path}/{n}/{k}", u) if k in r else ("—",) for k in cols)
                 for n, r in enumerate(records))
    numeric = tuple(i for i, k in enumerate(cols) if any(isinstance(r.get(k), (int, float))
                                                         and not isinstance(r.get(k), bool) for r in records))
    return Table(header, rows, caption=caption, numeric=numeric)


def _design_blocks(part: dict, u: Units) -> list:
    from .design_calc import design_blocks

    blocks = design_blocks(part, u)
    rest = {k: v for k, v in part.items() if k not in ("standard", "load_factor", "passed", "max_utilisation",
                                                       "governing", "checks", "notes", "caution")}
    if rest:
        blocks.extend(generic_blocks(rest, "design", u))
    return blocks


_IMP_KEYS = ("analysis", "status", "success", "message", "critical_load_factor", "first_yield_load_factor",
             "first_yield_source", "second_order_first_yield_load_factor", "fibre_first_yield_load_factor",
             "limit_load_factor")
_SO_KEYS = ("n_elements", "tolerance", "discretisation_error", "converged", "first_yield_height_m", "message")
_PATH_KEYS = ("limit_load_factor", "limit_accuracy", "first_yield_load_factor", "first_yield_height_m",
              "first_yield_offset_m", "control_height_m", "n_elements", "n_fibres", "n_steps", "n_iter",
              "max_residual", "tolerance", "status", "success", "message")


def _imperfect_blocks(part: list, u: Units) -> list:
    blocks: list = [Para(("Second-order analysis of the column with its initial bow, as set out in the case: the "
                          "elastic critical load, first yield and the ultimate (limit) load, compared per segment "
                          "with the Euler load and the Perry-Robertson first-yield load.",))]
    for i, r in enumerate(part):
        p = f"imperfect/{i}"
        axis = r.get("axis") or "in-plane"
        blocks.append(Heading(3, f"{axis.capitalize()} axis" if axis != "in-plane" else "In-plane"))
        blocks.append(_qtable(_rows(r, p, _IMP_KEYS, u)))
        imp = r.get("imperfection")
        if isinstance(imp, dict):
            blocks.append(Heading(4, "Initial bow"))
            blocks.append(_qtable(_rows(imp, f"{p}/imperfection", ("shape", "largest_bow_m", "amplitude_m", "ratio"),
                                        u)))
        comp = r.get("comparison") or []
        if comp:
            blocks.append(Heading(4, "Comparison per segment: axial forces"))
            blocks.append(_record_table(comp, f"{p}/comparison", ("segment", "axial_force_N", "critical_force_N",
                                                                  "euler_force_N", "perry_force_N",
                                                                  "first_yield_force_N", "limit_force_N", "note"), u))
            blocks.append(Heading(4, "Comparison per segment: load factors"))
            blocks.append(_record_table(comp, f"{p}/comparison", ("segment", "critical_load_factor",
                                                                  "euler_load_factor", "perry_load_factor",
                                                                  "first_yield_load_factor", "limit_load_factor"), u))
        so = r.get("second_order")
        if isinstance(so, dict):
            blocks.append(Heading(4, "Second-order elastic analysis"))
            blocks.append(_qtable(_rows(so, f"{p}/second_order", _SO_KEYS, u)))
        path = r.get("path")
        if isinstance(path, dict):
            blocks.append(Heading(4, "Nonlinear path"))
            blocks.append(_qtable(_rows(path, f"{p}/path", _PATH_KEYS, u)))
        for k, w in enumerate(r.get("warnings") or []):
            blocks.append(Note((T(w, f"json:{p}/warnings/{k}"),), "warning"))
    return blocks


def _default_figures(name: str, res: CaseResults, display: DisplayUnits) -> list:
    """Figures of the optional parts drawn by the plotting functions that exist for them."""
    value = res.extras.get(name)
    if value is None:
        return []
    if name == "design":
        from ..plot.design import plot_utilisation

        ax = plot_utilisation(value)
        return [(ax.figure, "Utilisation of every check; the dashed line marks a utilisation of one.")]
    if name == "imperfect":
        from ..plot import imperfect as plots

        out = []
        for axis, r in value.items():
            out.append((plots.plot_path(r, length_unit=(display.length, display.length_si)),
                        f"Load factor against lateral deflection at the control height, {axis} axis."))
            if any(c.variable_force > 0 for c in r.comparison):
                out.append((plots.plot_comparison(r), f"Load factors compared, {axis} axis: elastic critical, "
                                                      "Euler, Perry-Robertson, first yield and ultimate."))
        return out
    return []


def _optional_part(name: str, part: Any, res: CaseResults, u: Units, display: DisplayUnits, figures: bool) -> Part:
    titles = {"imperfect": "Imperfect column", "design": "Design check"}
    title = titles.get(name) or name.replace("_", " ").capitalize()
    if name == "design" and isinstance(part, dict):
        blocks = _design_blocks(part, u)
    elif name == "imperfect" and isinstance(part, list):
        blocks = _imperfect_blocks(part, u)
    else:
        blocks = generic_blocks(part, name, u)
    if figures:
        figs = PART_FIGURES[name](res, part, display) if name in PART_FIGURES else _default_figures(name, res,
                                                                                                      display)
        # the design figures sit beside the summary table they draw; other parts end with their figures
        at = next((i + 1 for i, b in enumerate(blocks) if isinstance(b, Table)), len(blocks)) \
            if name == "design" else len(blocks)
        for k, (fig, caption) in enumerate(figs):
            blocks.insert(at + k, Figure(_svg_of(fig), (caption,) if isinstance(caption, str) else tuple(caption),
                                         f"{name}-{k + 1}"))
    return Part(name, title, blocks)


# ---------------------------------------------------------------------------
# closing part


def _closing(data: dict, warnings: list[str]) -> Part:
    blocks: list = [Heading(3, "Warnings raised during the run")]
    if warnings:
        blocks.append(Bullets(tuple((T(w, f"run:warnings/{i}"),) for i, w in enumerate(warnings))))
    else:
        blocks.append(Para(("None.",)))
    cautions = data.get("cautions") or [CAUTION, *LIMITATIONS]
    blocks.append(Heading(3, "Limitations"))
    blocks.append(Bullets(tuple((T(c, f"json:cautions/{i}"),) for i, c in enumerate(cautions) if i > 0)
                          + (("The report shows the results of the run; it neither recomputes nor checks them.",),)))
    blocks.append(Heading(3, "Caution"))
    blocks.append(Note((T(cautions[0], "json:cautions/0"),)))
    return Part("closing", "Warnings, limitations and cautions", blocks)


def report_parts(res: CaseResults, data: dict, u: Units, sketch: str | None, mode_figures: list,
                 warnings: list[str], figures: bool = True) -> list[Part]:
    """All parts of the report, in order (``figures``: draw the figures of the optional parts)."""
    parts = [_inputs(res, u, sketch), _method(res, data, u), _buckling(res, data, u, mode_figures)]
    for name in ("imperfect", "design"):
        if name in data:
            parts.append(_optional_part(name, data[name], res, u, res.case.display, figures))
    for name, value in data.items():
        if name not in KNOWN_PARTS and name not in ("imperfect", "design") and isinstance(value, (dict, list)):
            parts.append(_optional_part(name, value, res, u, res.case.display, figures))
    parts.append(_closing(data, warnings))
    return parts
