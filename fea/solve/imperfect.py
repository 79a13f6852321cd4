"""Imperfect columns, one bending plane: the second-order and nonlinear analyses and the comparison figures.

:func:`analyse_imperfect` runs the second-order elastic analysis and/or the
nonlinear path of one plane and collects the comparison figures: the elastic
critical load (eigen), each segment's Euler load ``pi^2 E I / L^2``, Perry's
first-yield load from the closed form with the same bow, this tool's first yield
and its ultimate load.  The nonlinear path itself is built in
:mod:`fea.solve.imperfect_path`; a whole case is run by :mod:`fea.solve.imperfect_case`.

References
----------
Perry, J., "On struts", The Engineer 62, 1886; Robertson, A., "The strength of
struts", ICE Selected Engineering Papers 28, 1925 (the closed form
``(N_pl - N)(N_E - N) = eta N N_E`` with ``eta = e0 A / W``).
"""

from __future__ import annotations

import logging
import math
from dataclasses import dataclass, field

import numpy as np

from ..errors import ModelError
from ..formulas import euler_load
from ..formulas import perry_root as perry_first_yield  # public name kept: (N_pl, N_E, eta) -> N
from ..model import Column
from ..model.imperfection import IMPERFECT_ANALYSIS_KINDS, Imperfection, LateralActions
from .eigen import buckling
from .imperfect_path import MIN_ELEMENTS, NonlinearPath, nonlinear_path
from .second_order import SecondOrderResult, second_order

__all__ = ["NonlinearPath", "ComparisonRow", "ImperfectResult", "ELASTIC_MODEL", "FIBRE_WITH_RS", "FIBRE_NO_RS",
           "nonlinear_path", "analyse_imperfect", "perry_first_yield", "MIN_ELEMENTS"]

logger = logging.getLogger(__name__)

#: Names of the models a first yield comes from (the JSON ``first_yield_source`` and every output use them).
ELASTIC_MODEL = "elastic second order, no residual stress"
FIBRE_WITH_RS = "fibre model with residual stress"
FIBRE_NO_RS = "fibre model, no residual stress"


@dataclass(frozen=True)
class ComparisonRow:
    """Closed-form and computed figures of one segment (axial forces in the segment) [N].

    Attributes
    ----------
    index, bottom, top, length : segment number and extent [m]
    axial_force : largest compression in the segment at load factor 1 [N]
    permanent_force, variable_force : its permanent part and its variable part
        per unit load factor [N]
    euler_force : pi^2 E I / L^2 with the segment's own length (pinned ends) [N]
    critical_force : axial force at the elastic critical load (eigen) [N]
    perry_force : Perry's first-yield force with N_E = critical_force and the
        bow amplitude of the segment, None without A, W, fy or compression [N]
    perry_load_factor : the load factor giving perry_force in this segment [-]
    bow : largest |w0| in the segment [m]
    note : how the closed form applies
    """

    index: int
    bottom: float
    top: float
    length: float
    axial_force: float
    permanent_force: float
    variable_force: float
    euler_force: float
    critical_force: float | None
    perry_force: float | None
    perry_load_factor: float | None
    bow: float
    note: str = ""

    def force(self, load_factor: float | None) -> float | None:
        """Axial compression in the segment at ``load_factor`` [N] (None passes through)."""
        if load_factor is None or not math.isfinite(load_factor):
            return None
        return self.permanent_force + load_factor * self.variable_force

    def load_factor(self, force: float | None) -> float | None:
        """Load factor giving the axial compression ``force`` in the segment [-], or None."""
        if force is None or self.variable_force <= 0:
            return None
        return (force - self.permanent_force) / self.variable_force


@dataclass(frozen=True)
class ImperfectResult:
    """Everything the imperfect-column analysis found for one bending plane.

    Attributes
    ----------
    axis : bending plane
    analysis : "second-order", "nonlinear" or "both"
    imperfection : the bow used (None: straight)
    bow_amplitude : largest |w0| [m]
    critical_load_factor : elastic critical load factor (eigen, auto-refined) [-]
    second_order : SecondOrderResult or None
    nonlinear : NonlinearPath or None
    second_order_first_yield_load_factor : second-order elastic first yield (exact
        root on the converged mesh; no residual stress) [-] or None
    fibre_first_yield_load_factor : first yield on the nonlinear path (residual
        stresses included when given) [-] or None
    limit_load_factor : ultimate load factor (peak of the nonlinear path) [-] or None
    comparison : one :class:`ComparisonRow` per segment
    status : "ok" or the nonlinear path's status when it did not end normally
        (an identifier; :data:`fea.io.imperfect_output.STATUS_WORDS` words it)
    message : one line on how the analyses ended, in plain words
    warnings : things the engineer should know
    residual_stress : whether the nonlinear (fibre) model carried residual stresses

    The headline first yield (:attr:`first_yield_load_factor`, named by
    :attr:`first_yield_source`) is the fibre model's when it carried residual
    stresses, else the second-order elastic one, else the fibre model's.
    """

    axis: str
    analysis: str
    imperfection: Imperfection | None
    bow_amplitude: float
    critical_load_factor: float
    second_order: SecondOrderResult | None
    nonlinear: NonlinearPath | None
    second_order_first_yield_load_factor: float | None
    fibre_first_yield_load_factor: float | None
    limit_load_factor: float | None
    comparison: tuple[ComparisonRow, ...]
    status: str
    message: str
    warnings: tuple[str, ...] = field(default_factory=tuple)
    residual_stress: bool = False

    @property
    def fibre_model(self) -> str:
        """The name of the nonlinear model, with or without residual stress."""
        return FIBRE_WITH_RS if self.residual_stress else FIBRE_NO_RS

    @property
    def reported_first_yield(self) -> tuple[float | None, str | None]:
        """The headline first-yield load factor and the model it comes from; (None, None) when none found one.

        With residual stress in the fibre model its first yield is the headline (the elastic model has
        none, so its first yield can lie above the ultimate load); otherwise the second-order elastic first
        yield (an exact root), else the fibre model's.
        """
        so, fib = self.second_order_first_yield_load_factor, self.fibre_first_yield_load_factor
        if fib is not None and (self.residual_stress or so is None):
            return fib, self.fibre_model
        if so is not None:
            return so, ELASTIC_MODEL
        return None, None

    @property
    def first_yield_load_factor(self) -> float | None:
        """The headline first-yield load factor [-] (see :attr:`reported_first_yield`)."""
        return self.reported_first_yield[0]

    @property
    def first_yield_source(self) -> str | None:
        """The model the headline first yield comes from."""
        return self.reported_first_yield[1]

    @property
    def first_yield_remark(self) -> str:
        """Why a first yield shown (elastic second order, Perry-Robertson) lies above the ultimate load; "" when
        none does."""
        lim, so, fib = self.limit_load_factor, self.second_order_first_yield_load_factor, \
            self.fibre_first_yield_load_factor
        if lim is None:
            return ""
        out = []
        if so is not None and so > lim * (1 + 1e-9):
            if self.residual_stress:
                why = "that model has no residual stress" + (
                    f" (with the residual stresses the fibre model first yields at load factor {fib:.4g})"
                    if fib is not None else "")
            else:
                why = ("that model is linear-elastic with small deflections, while the fibre model follows large "
                       "deflections on discrete fibres; the ultimate load governs")
            out.append(f"the elastic second-order first yield {so:.4g} lies above the ultimate load {lim:.4g} "
                       f"because {why}")
        perry = [c.perry_load_factor for c in self.comparison if c.perry_load_factor is not None]
        if perry and max(perry) > lim * (1 + 1e-9):
            out.append(f"the Perry-Robertson first yield {max(perry):.4g} lies above the ultimate load {lim:.4g} "
                       "because the closed form takes the bow alone on a uniform pin-ended member: no residual "
                       "stress, lateral loads or eccentricities")
        return "; ".join(out)

    @property
    def success(self) -> bool:
        return self.status == "ok"


# ---------------------------------------------------------------------------
# one plane, everything


def _comparison(column: Column, sections, bres, w0_heights, w0) -> tuple[ComparisonRow, ...]:
    rows = []
    lam_cr = bres.load_factor if bres is not None else math.inf
    tolx = 1e-9 * column.height
    for i, (seg, (a, b)) in enumerate(zip(column.segments, column.segment_bounds())):
        xs = np.array([a + 10 * tolx])
        Np = float(column.axial_force(xs, permanent=True)[0])
        Nv = float(column.axial_force(xs, permanent=False)[0])
        inside = (w0_heights >= a - tolx) & (w0_heights <= b + tolx)
        e0 = float(np.abs(w0[inside]).max()) if np.any(inside) else 0.0
        euler = euler_load(seg.E, seg.I_ref, seg.length)
        Ncr = Np + lam_cr * Nv if math.isfinite(lam_cr) else None
        perry = perry_lam = None
        note = ""
        s = sections[i] if sections is not None else None
        if s is None or s.W is None or s.fy is None:
            note = "no A, W and fy: Perry not evaluated"
        elif Ncr is None or Ncr <= 0:
            note = "not in compression at the critical load"
        else:
            perry = perry_first_yield(s.A * s.fy, Ncr, e0 * s.A / s.W)
            perry_lam = (perry - Np) / Nv if Nv > 0 else None
            note = ("closed form for a uniform pin-ended member with a half-sine bow; here with N_E = the "
                    "segment's critical force and e0 = its largest bow")
        rows.append(ComparisonRow(index=i, bottom=a, top=b, length=seg.length, axial_force=Np + Nv,
                                  permanent_force=Np, variable_force=Nv, euler_force=float(euler), critical_force=Ncr,
                                  perry_force=perry, perry_load_factor=perry_lam, bow=e0, note=note))
    return tuple(rows)


def analyse_imperfect(column: Column, imperfection: Imperfection | None, sections=None,
                      actions: LateralActions | None = None, *, analysis: str = "both", axis: str = "",
                      tol: float = 1e-6, path_options: dict | None = None,
                      critical=None) -> ImperfectResult:
    """Second-order and/or nonlinear analysis of one plane with the comparison figures.

    Parameters
    ----------
    column, imperfection, sections, actions : as for :func:`nonlinear_path`
    analysis : "second-order", "nonlinear" or "both"
    axis : bending-plane label
    tol : mesh tolerance of the second-order analysis and the eigen solution [-]
    path_options : keyword options passed to :func:`nonlinear_path`
    critical : the :class:`~fea.results.BucklingResult` of this plane when it is
        already known (saves solving it again)

    Returns
    -------
    ImperfectResult
    """
    if analysis not in IMPERFECT_ANALYSIS_KINDS:
        raise ModelError("imperfection.analysis", f"{analysis!r} is not an analysis; expected one of "
                                                  f"{', '.join(IMPERFECT_ANALYSIS_KINDS)}")
    actions = actions or LateralActions()
    warn: list[str] = []
    try:
        bres = critical if critical is not None else buckling(column, n_modes=1, tol=tol, axis=axis)
        lam_cr = bres.load_factor
    except ModelError as exc:
        if exc.field != "loads":
            raise
        bres, lam_cr = None, math.inf
        warn.append(f"no elastic critical load: {exc.message}")
    so = nl = None
    if analysis in ("second-order", "both"):
        so = second_order(column, imperfection, actions, sections, tol=tol, axis=axis)
        warn += list(so.warnings)
    if analysis in ("nonlinear", "both"):
        nl = nonlinear_path(column, imperfection, sections, actions, **(path_options or {}))
        if any(seg.S is not None for seg in column.segments):
            warn.append("shear flexibility S is ignored by the nonlinear (fibre) analysis")
    plane = so if so is not None else nl
    assert plane is not None  # the analysis kind was checked: one of the two ran
    w0h, w0 = plane.heights, plane.bow
    comp = _comparison(column, sections, bres, w0h, w0)
    status, msgs = "ok", []
    if so is not None:
        msgs.append(f"second order: {so.message}")
        if not so.converged:
            status = "second_order_not_converged"
    if nl is not None:
        msgs.append(f"nonlinear: {nl.message}")
        if not nl.success:
            status = nl.status
        elif nl.limit_load_factor is None:
            warn.append("the nonlinear path passed no limit point before it stopped; no ultimate load is reported")
    return ImperfectResult(
        axis=axis, analysis=analysis, imperfection=imperfection, bow_amplitude=float(np.abs(w0).max()),
        critical_load_factor=float(lam_cr), second_order=so, nonlinear=nl,
        second_order_first_yield_load_factor=None if so is None else so.first_yield_load_factor,
        fibre_first_yield_load_factor=None if nl is None else nl.first_yield_load_factor,
        limit_load_factor=None if nl is None else nl.limit_load_factor, comparison=comp, status=status,
        message="; ".join(msgs), warnings=tuple(warn), residual_stress=nl is not None and _has_residual(sections))


def _has_residual(sections) -> bool:
    """Whether any fibre section carries a residual stress."""
    return any(s.residual is not None and bool(np.any(np.asarray(s.residual) != 0)) for s in sections or ())
