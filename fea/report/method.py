"""The method part of the report: model, mesh and convergence, eigenproblem, K, assumptions."""

from __future__ import annotations

from ..results import CaseResults
from .blocks import yes
from .document import Bullets, Em, Heading, Para, Part, Q, Sub, T, Table, q

__all__ = ["method_part", "SOLVER_TEXT"]

#: What each eigen solver of :mod:`fea.solve.eigen` does, in words.
SOLVER_TEXT = {
    "dense": "dense symmetric-definite eigen solution (LAPACK) of the whole system",
    "sparse": "a banded Cholesky factor of the stiffness matrix driving a Lanczos iteration (ARPACK) for the "
              "lowest modes",
}


def _model(res: CaseResults) -> list:
    has_S = any(s.S is not None for _, c in res.case.planes for s in c.segments)
    return [
        Heading(3, "Model"),
        Para(("The member is modelled, separately in each bending plane, with two-node cubic beam-column elements: "
              "Hermite cubics for the lateral displacement, ",
              *(("with shear-deformable cubics in the segments where a shear stiffness ", Em("S"), " is given.")
                if has_S else ("shear deformation neglected (no shear stiffness ", Em("S"), " is given).")),
              " The geometric stiffness is the consistent one, integrated exactly for an axial force that varies "
              "linearly along an element, so distributed axial load is not lumped.")),
    ]


def _mesh(res: CaseResults) -> list:
    rows = []
    for i, b in enumerate(res.buckling):
        s = f"json:buckling/{i}"
        rows.append(((T(b.axis, f"{s}/axis"),), (Q(b.n_elements, f"{s}/n_elements", "", 6),),
                     (q(b.tolerance, f"{s}/tolerance", "", 2),),
                     (q(b.discretisation_error, f"{s}/discretisation_error", "", 2),),
                     tuple(x for k, e in enumerate(b.mode_errors[1:], start=1)
                           for x in ((", " if k > 1 else ""), q(float(e), f"{s}/mode_errors/{k}", "", 2))) or ("—",),
                     (yes(b.converged, f"{s}/converged"),), (T(b.solver, f"{s}/solver"),)))
    return [
        Heading(3, "Mesh and convergence"),
        Para(("A node is placed at every station (segment joints, restraints, load points, ends of foundations "
              "and distributed loads). Each interval is subdivided by length and the mesh is doubled until the "
              "estimated relative discretisation error of every reported load factor is below the tolerance. The "
              "estimate compares successive refinement levels.",)),
        Table((("Plane",), ("Elements",), ("Tolerance",), ("Lowest load factor",), ("Higher modes",),
               ("Converged",), ("Eigen solver",)),
              tuple(rows), numeric=(1, 2, 3, 4), caption=("Estimated relative error of the load factors of each "
                                                          "plane: the lowest, then the higher modes in order.",)),
    ]


def _eigenproblem(res: CaseResults) -> list:
    solvers = sorted({b.solver for b in res.buckling})
    return [
        Heading(3, "Eigenproblem"),
        Para(("The critical load factors ", Em("λ"), " and mode shapes ", Em("φ"), " solve ", Em("K φ = λ G φ"),
              ", with ", Em("K"), " the elastic (plus spring and foundation) stiffness and ", Em("G"),
              " the geometric stiffness of the variable loads; permanent loads enter ", Em("K"), ". Solver used: ",
              "; ".join(f"{s}: {SOLVER_TEXT.get(s, s)}" for s in solvers),
              ". Each mode is scaled so that its largest lateral displacement is one, taken positive.")),
        Heading(3, "Effective-length factors"),
        Para(("For each segment ", Em("K"), " = (π / ", Em("L"), ") √(", Em("E I"), Sub("ref"), " / ", Em("N"),
              Sub("cr"), ")", ", with ", Em("I"), Sub("ref"), " the larger end value of a tapered segment and ",
              Em("N"), Sub("cr"), " the largest compression in the segment at the critical state. ", Em("K"),
              " is flagged as not meaningful when the segment stores less than one per cent of the bending energy "
              "of the mode or carries less than five per cent of the largest axial force: such a segment takes no "
              "real part in the buckling and its ", Em("K"), " is not a value to design with.")),
    ]


def _assumptions(res: CaseResults) -> list:
    has_perm = any(any(ld.permanent for ld in c.point_loads) or any(ld.permanent for ld in c.distributed_loads)
                   for _, c in res.case.planes)
    spatial = res.extras.get("spatial")
    ran = spatial is not None and getattr(spatial, "result", None) is not None
    items = [("Flexural buckling about each principal axis separately in the planar analyses; bending about both "
              "axes and twisting together in the thin-walled analysis (with the critical buckling part).",) if ran else
             ("Planar flexural buckling only, about each principal axis separately: no torsional or "
              "flexural-torsional buckling is analysed for this case.",),
             ("All axial load is carried down the column to its base: the axial force at a height is the sum of "
              "the loads above it.",),
             ("Linear elastic material and small displacements for the critical loads.",),
             ("Restraints act exactly at their stations and are taken as given.",)]
    if has_perm:
        items.append(("With permanent loads present, the load factor multiplies the variable loads only.",))
    return [Heading(3, "Assumptions"), Bullets(tuple(items))]


def method_part(res: CaseResults) -> Part:
    """How the critical loads were found, with the mesh and convergence figures of each plane."""
    return Part("method", "Method", [*_model(res), *_mesh(res), *_eigenproblem(res), *_assumptions(res)])
