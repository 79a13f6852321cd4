"""The records of a member check with bending: its input, a moment diagram, its result, and the calculator
that evaluates and records written-out formula steps.

Pure kernel (SI floats, no I/O).  Axes follow EN 1993-1-1: ``y`` is the major
axis, ``z`` the minor axis (AISC 360's ``x`` and ``y``).  The routes are in
:mod:`fea.design.bending_en` and :mod:`fea.design.bending_aisc`; the public
names are gathered in :mod:`fea.design.bending`; docs/bending.md describes them.
"""

from __future__ import annotations

import ast
import math
from dataclasses import dataclass, field
from types import MappingProxyType
from typing import Any, Mapping

from fea.errors import ModelError

from .standards.record import PASSES, Step

__all__ = ["DIAGRAMS", "SHAPES", "MomentDiagram", "BeamColumnInput", "BendingCheck", "Calc", "renamed",
           "formula_constants"]

#: Kinds of moment diagram along a segment (between the points that restrain the buckling the factor is for):
#: "end moments": linear between M at one end and psi M at the other; "uniform load" and "point load": a
#: transverse load (uniformly distributed, or one load at mid-span) with end moments M_h and psi M_h and a
#: span moment M_s; "sway": the member's ends move relative to each other (a sway buckling mode).
DIAGRAMS = ("end moments", "uniform load", "point load", "sway")
#: Section shapes the interaction factors distinguish: "I" (doubly symmetric I or H), "RHS" (rectangular or
#: square hollow), "other".
SHAPES = ("I", "RHS", "other")


def _number(name: str, value: Any) -> float:
    try:
        x = float(value)
    except (TypeError, ValueError):
        raise ModelError(name, f"{value!r} is not a number") from None
    if math.isnan(x):
        raise ModelError(name, "NaN is not a number; expected a value")
    return x


def _positive(name: str, value: Any, unit: str, infinite: bool = False) -> float:
    x = _number(name, value)
    if not (x > 0.0) or (math.isinf(x) and not infinite):
        expected = "a value > 0 (inf allowed)" if infinite else "a finite value > 0"
        raise ModelError(name, f"{x:g} {unit} is not valid; expected {expected}")
    return x


def _non_negative(name: str, value: Any, unit: str) -> float:
    x = _number(name, value)
    if not (math.isfinite(x) and x >= 0.0):
        raise ModelError(name, f"{x:g} {unit} is not valid; expected a finite value >= 0")
    return x


@dataclass(frozen=True)
class MomentDiagram:
    """The shape of the bending moment diagram about one axis along a segment.

    Attributes
    ----------
    kind : one of :data:`DIAGRAMS`
    psi : end-moment ratio [-], -1 <= psi <= 1: the smaller end moment over the larger, positive when both
        bend the member the same way (single curvature: psi = 1 is a uniform moment), negative in double
        curvature (EN 1993-1-1 Table B.3; AISC 360's M1/M2 is -psi)
    span_ratio : for "uniform load" and "point load": M_s / M_h, the moment at mid-span over the larger end
        moment, signed (positive when both have the same sense) [-]; +-inf when there are no end moments
        (a simply supported span: the default).  Not used by "end moments" and "sway".
    """

    kind: str = "end moments"
    psi: float = 1.0
    span_ratio: float = math.inf

    def __post_init__(self) -> None:
        if self.kind not in DIAGRAMS:
            raise ModelError("diagram.kind", f"{self.kind!r} is not known; expected one of {', '.join(DIAGRAMS)}")
        psi = _number("diagram.psi", self.psi)
        if not -1.0 <= psi <= 1.0:
            raise ModelError("diagram.psi", f"{psi:g} is outside [-1, 1]; expected the smaller end moment over "
                                            "the larger")
        object.__setattr__(self, "psi", psi)
        object.__setattr__(self, "span_ratio", _number("diagram.span_ratio", self.span_ratio))

    @property
    def transverse(self) -> bool:
        """Whether a transverse load acts in the span ("uniform load" or "point load")."""
        return self.kind in ("uniform load", "point load")

    @property
    def end_moments_dominate(self) -> bool:
        """|M_h| >= |M_s| (EN 1993-1-1 Table B.3 uses alpha_s = M_s / M_h), else alpha_h = M_h / M_s."""
        return abs(self.span_ratio) <= 1.0


@dataclass(frozen=True)
class BeamColumnInput:
    """One segment with axial compression and bending, for the member checks (SI units).

    The moments are the largest absolute values along the segment (first-order for the interaction routes
    of EN 1993-1-1 6.3.3 and AISC 360 with B1; second-order ones for the cross-section route and for
    AISC 360 with the direct analysis).

    Attributes
    ----------
    N_Ed : design axial compression [N], >= 0 (tension with bending is not covered)
    M_y_Ed, M_z_Ed : largest design moment about the major (y) and minor (z) axis [N m], >= 0
    A : area [m^2]
    W_pl_y, W_pl_z : plastic moduli [m^3]
    W_el_y, W_el_z : elastic moduli [m^3] (not above the plastic ones)
    fy : yield strength [Pa]
    E : elastic modulus [Pa]
    I_y, I_z : second moments of area about the major and minor axis [m^4]
    N_cr_y, N_cr_z : elastic critical forces of flexural buckling about y and z [N] (inf: the segment does
        not buckle about that axis)
    section_class : EN 1993-1-1 5.5 cross-section class, 1, 2 or 3 (class 4 is not covered); for AISC 360,
        classes 1-2 stand for a compact section
    shape : one of :data:`SHAPES`
    doubly_symmetric : whether the section is doubly symmetric (EN 1993-1-1 6.3.3 is written for such members)
    diagram_y, diagram_z : moment diagrams about y and z (for C_my, C_mz)
    diagram_LT : moment diagram about y between the points restraining lateral-torsional buckling (for C_mLT,
        k_c, C_1); None: ``diagram_y``
    N_cr_T : elastic critical force of torsional buckling [N] (inf: none)
    N_cr_TF : elastic critical force of flexural-torsional buckling [N]; None: ``N_cr_T`` (they coincide for
        a doubly symmetric section)
    M_cr : elastic critical moment of lateral-torsional buckling for the actual moment diagram [N m]; inf when
        lateral-torsional buckling cannot occur (torsional and lateral restraint, a closed section, bending
        about the minor axis only): the member is then "not susceptible to torsional deformations"
    M_cr0 : elastic critical moment for a uniform moment [N m] (EN 1993-1-1 Annex A); None: M_cr / C_1 with
        C_1 = k_c^-2 (EN 1993-1-1 Annex A, Table 6.6)
    I_w : warping constant [m^6] or None
    J : St Venant torsion constant [m^4] or None
    a_web : (A - 2 b t_f) / A of an I section (EN 1993-1-1 6.2.9.1(5)) or None (no 6.2.9.1 check)
    gamma_M0, gamma_M1 : partial factors [-] (EN 1993-1-1 6.1; recommended 1.0)
    curve_y, curve_z : EN 1993-1-1 Table 6.2 buckling curves (a0, a, b, c, d) or None
    curve_LT : EN 1993-1-1 Table 6.4 (general case) or 6.5 (rolled) lateral-torsional buckling curve
        (a, b, c, d) or None
    """

    N_Ed: float
    M_y_Ed: float
    M_z_Ed: float
    A: float
    W_pl_y: float
    W_pl_z: float
    W_el_y: float
    W_el_z: float
    fy: float
    E: float
    I_y: float
    I_z: float
    N_cr_y: float
    N_cr_z: float
    section_class: int = 1
    shape: str = "I"
    doubly_symmetric: bool = True
    diagram_y: MomentDiagram = field(default_factory=MomentDiagram)
    diagram_z: MomentDiagram = field(default_factory=MomentDiagram)
    diagram_LT: MomentDiagram | None = None
    N_cr_T: float = math.inf
    N_cr_TF: float | None = None
    M_cr: float = math.inf
    M_cr0: float | None = None
    I_w: float | None = None
    J: float | None = None
    a_web: float | None = None
    gamma_M0: float = 1.0
    gamma_M1: float = 1.0
    curve_y: str | None = None
    curve_z: str | None = None
    curve_LT: str | None = None

    def __post_init__(self) -> None:
        put = object.__setattr__
        put(self, "N_Ed", _non_negative("N_Ed", self.N_Ed, "N"))
        put(self, "M_y_Ed", _non_negative("M_y_Ed", self.M_y_Ed, "N m"))
        put(self, "M_z_Ed", _non_negative("M_z_Ed", self.M_z_Ed, "N m"))
        for name, unit in (("A", "m^2"), ("W_pl_y", "m^3"), ("W_pl_z", "m^3"), ("W_el_y", "m^3"),
                           ("W_el_z", "m^3"), ("fy", "Pa"), ("E", "Pa"), ("I_y", "m^4"), ("I_z", "m^4"),
                           ("gamma_M0", "(-)"), ("gamma_M1", "(-)")):
            put(self, name, _positive(name, getattr(self, name), unit))
        for name, unit in (("N_cr_y", "N"), ("N_cr_z", "N"), ("N_cr_T", "N"), ("M_cr", "N m")):
            put(self, name, _positive(name, getattr(self, name), unit, infinite=True))
        put(self, "N_cr_TF", self.N_cr_T if self.N_cr_TF is None
            else _positive("N_cr_TF", self.N_cr_TF, "N", infinite=True))
        if self.M_cr0 is not None:
            put(self, "M_cr0", _positive("M_cr0", self.M_cr0, "N m", infinite=True))
            if math.isinf(self.M_cr0) != math.isinf(self.M_cr):
                raise ModelError("M_cr0", f"{self.M_cr0:g} N m: give M_cr0 infinite exactly when M_cr is "
                                          f"({self.M_cr:g} N m)")
        for ax in ("y", "z"):
            el, pl = getattr(self, f"W_el_{ax}"), getattr(self, f"W_pl_{ax}")
            if el > pl * (1.0 + 1e-9):
                raise ModelError(f"W_el_{ax}", f"{el:g} m^3 exceeds the plastic modulus W_pl_{ax} = {pl:g} m^3; "
                                               "expected W_el <= W_pl")
        if self.section_class not in (1, 2, 3):
            raise ModelError("section_class", f"{self.section_class!r} is not covered; expected 1, 2 or 3 "
                                              "(class 4 sections need effective properties)")
        if self.shape not in SHAPES:
            raise ModelError("shape", f"{self.shape!r} is not known; expected one of {', '.join(SHAPES)}")
        for name in ("diagram_y", "diagram_z"):
            if not isinstance(getattr(self, name), MomentDiagram):
                raise ModelError(name, f"{getattr(self, name)!r} is not a MomentDiagram")
        if self.diagram_LT is not None and not isinstance(self.diagram_LT, MomentDiagram):
            raise ModelError("diagram_LT", f"{self.diagram_LT!r} is not a MomentDiagram")
        for name, unit in (("I_w", "m^6"), ("J", "m^4")):
            v = getattr(self, name)
            if v is not None:
                put(self, name, _non_negative(name, v, unit))
        if self.a_web is not None:
            a = _number("a_web", self.a_web)
            if not 0.0 <= a < 1.0:
                raise ModelError("a_web", f"{a:g} is outside [0, 1); expected (A - 2 b t_f) / A")
            put(self, "a_web", a)

    @property
    def plastic(self) -> bool:
        """Whether the section class uses plastic moduli (classes 1 and 2)."""
        return self.section_class in (1, 2)

    @property
    def W_y(self) -> float:
        """The major-axis modulus of the section class: W_pl,y (classes 1-2) or W_el,y (class 3) [m^3]."""
        return self.W_pl_y if self.plastic else self.W_el_y

    @property
    def W_z(self) -> float:
        """The minor-axis modulus of the section class [m^3]."""
        return self.W_pl_z if self.plastic else self.W_el_z

    @property
    def lt_diagram(self) -> MomentDiagram:
        """The moment diagram between the lateral-torsional restraints."""
        return self.diagram_y if self.diagram_LT is None else self.diagram_LT

    @property
    def susceptible(self) -> bool:
        """Whether the member is susceptible to torsional deformations (lateral-torsional buckling): M_cr is
        finite."""
        return math.isfinite(self.M_cr)


@dataclass(frozen=True)
class BendingCheck:
    """The result of one member or cross-section check with bending.

    Attributes
    ----------
    standard : "EN 1993-1-1" or "AISC 360"
    route : what was checked, e.g. "6.3.3 Annex B", "6.2 cross-section", "H1.1"
    clause : the clauses used
    utilisations : per equation (e.g. "(6.61)", "(6.62)", "(H1-1a)"), its utilisation [-]
    utilisation : the check's utilisation [-] (the largest of its equations, or as the route states)
    governing : the equation that gives ``utilisation``
    values : every number of the check by name (inputs substituted and intermediate results; SI, with the
        unit in the name: ``_N``, ``_Nm``, ``_Pa``, ``_m``, ``_m2``, ``_m3``, ``_m4``, ``_m6``)
    flags : the results of the conditions written out (name -> bool)
    labels : textual choices: curves, diagrams, branches, method
    steps : the written-out formulas in the order evaluated; each one evaluated with ``values`` gives
        ``values[step.key]`` (or ``flags[step.key]``)
    notes : limits of the route and "from memory" labels
    """

    standard: str
    route: str
    clause: str
    utilisations: Mapping[str, float]
    utilisation: float
    governing: str
    values: Mapping[str, float]
    flags: Mapping[str, bool]
    labels: Mapping[str, str]
    steps: tuple[Step, ...]
    notes: tuple[str, ...] = ()

    def __post_init__(self) -> None:
        for name in ("utilisations", "values", "flags", "labels"):
            object.__setattr__(self, name, MappingProxyType(dict(getattr(self, name))))

    @property
    def passed(self) -> bool:
        """Whether the utilisation is at most 1."""
        return bool(PASSES(utilisation=self.utilisation))

    def __getitem__(self, name: str) -> float:
        """A number of the check by name (``check["chi_y"]``)."""
        return self.values[name]


class Calc:
    """Evaluates written-out formula steps in order and records them with their numbers."""

    def __init__(self) -> None:
        self.values: dict[str, float] = {}
        self.flags: dict[str, bool] = {}
        self.labels: dict[str, str] = {}
        self.steps: list[Step] = []

    def put(self, **values: float) -> None:
        """Record input numbers (substituted in later steps)."""
        for k, v in values.items():
            self.values[k] = float(v)

    def run(self, step: Step) -> Any:
        """Evaluate ``step`` with the numbers so far, record it and its result, return the result."""
        args = {n: self.values[n] for n in step.names}
        out = step(**args)
        if isinstance(out, bool):
            self.flags[step.key] = out
        else:
            self.values[step.key] = out
        self.steps.append(step)
        return out

    def check(self, standard: str, route: str, clause: str, utilisations: Mapping[str, float],
              notes: tuple[str, ...] = (), utilisation: float | None = None,
              governing: str | None = None) -> BendingCheck:
        """The result record; by default the largest utilisation governs."""
        if governing is None:
            governing = max(utilisations, key=lambda k: utilisations[k])
        return BendingCheck(standard, route, clause, utilisations,
                            utilisations[governing] if utilisation is None else utilisation, governing,
                            self.values, self.flags, self.labels, tuple(self.steps), notes)


class _Rename(ast.NodeTransformer):
    def __init__(self, names: Mapping[str, str]) -> None:
        self.names = names

    def visit_Name(self, node: ast.Name) -> ast.Name:
        return ast.copy_location(ast.Name(self.names.get(node.id, node.id), node.ctx), node)


def renamed(step: Step, names: Mapping[str, str], ref: str | None = None) -> Step:
    """``step`` with its key and the names in its formula renamed (``names``: old -> new), and optionally
    another ``ref``: one formula, one home, applied to several axes."""
    tree = _Rename(names).visit(ast.parse(step.expr, mode="eval"))
    return Step(names.get(step.key, step.key), ast.unparse(tree), step.ref if ref is None else ref)


def formula_constants(steps: Mapping[str, Step] | Any) -> dict[str, frozenset[str]]:
    """The numbers the written-out formulas print, by published formula (``Step.ref``)."""
    out: dict[str, set[str]] = {}
    for s in (steps.values() if isinstance(steps, Mapping) else steps):
        out.setdefault(s.ref, set()).update(s.constants)
    return {k: frozenset(v) for k, v in out.items()}
