"""Result objects returned by the solvers (SI units, frozen).

Plots, tables, JSON export and reports consume these; they never recompute
physics.
"""

from __future__ import annotations

from dataclasses import dataclass, field
from typing import TYPE_CHECKING

import numpy as np

if TYPE_CHECKING:
    from .model.case import Case

__all__ = ["SegmentBuckling", "BucklingResult", "CaseResults", "K_ENERGY_SHARE_MIN", "K_AXIAL_RATIO_MIN"]

#: A segment whose share of the mode's bending energy is below this takes too
#: little part in the mode for its effective-length factor to mean anything.
K_ENERGY_SHARE_MIN = 0.01
#: A segment whose axial force is below this fraction of the column's largest
#: axial force carries too little load for its K to mean anything.
K_AXIAL_RATIO_MIN = 0.05


@dataclass(frozen=True)
class SegmentBuckling:
    """Buckling figures of one segment in the lowest mode.

    Attributes
    ----------
    index : segment number from the base (0-based)
    bottom, top : heights of the segment ends [m]
    length : [m]
    axial_force : largest axial compression in the segment at load factor 1,
        permanent plus variable [N] (negative: tension)
    critical_axial_force : the same at the critical state, permanent +
        lowest load factor x variable [N]
    I_ref : second moment of area used for K: the larger end value of a
        tapered segment [m^4]
    effective_length_factor : K = (pi / L) sqrt(E I_ref / N_cr); None when the
        segment is not in compression at the critical state
    energy_share : share of the mode's bending strain energy stored in the
        segment [-]
    meaningful : False when the segment barely takes part in the mode or
        carries little axial force (then K is not an answer to design with)
    note : why K is not meaningful, or ""
    """

    index: int
    bottom: float
    top: float
    length: float
    axial_force: float
    critical_axial_force: float
    I_ref: float
    E: float
    effective_length_factor: float | None
    energy_share: float
    meaningful: bool
    note: str = ""

    @property
    def effective_length(self) -> float | None:
        k = self.effective_length_factor
        return None if k is None else k * self.length

    @property
    def advice(self) -> str:
        """Why K is not a design value here, and what to use instead, in plain words ("" when K is meaningful).

        A segment that carries little of the load or of the bending energy is carried along in a mode of the
        whole column: its K = (pi / L) sqrt(E I / N_cr) comes out large only because its own N_cr is small
        against the column's critical state, and it says nothing about the segment's own buckling length.
        """
        if self.meaningful or self.effective_length_factor is None:
            return ""
        return (f"this segment {self.note}: it is carried along in a buckling mode of the whole column, so "
                f"its K (and K L) is not a design value; check the segment against its own N_cr instead")


@dataclass(frozen=True)
class BucklingResult:
    """Elastic critical load factors and mode shapes of one bending plane.

    Attributes
    ----------
    load_factors : (n_modes,) ascending positive load factors [-]; with
        permanent loads present they multiply the variable loads only
    heights : (n_nodes,) node heights of the final mesh [m]
    modes : (n_modes, n_nodes) lateral displacement of each mode, scaled so
        that the largest magnitude is 1 and that value is positive (of two
        extremes equal to round-off, the lower one) [-]
    rotations : (n_modes, n_nodes) section rotation of each mode on the same
        scale as ``modes`` [1/m: rad per metre of the largest displacement]
    segments : tuple of SegmentBuckling for the lowest mode, base upward
    energy_shares : (n_modes, n_segments) bending-energy share of each segment
    n_elements : number of elements of the final mesh
    refinement_levels : (levels,) lowest load factor at each mesh level tried
    discretisation_error : estimated relative error of the lowest load factor
    tolerance : requested relative tolerance
    converged : whether the estimate met the tolerance
    solver : "dense" or "sparse"
    message : plain-language status
    axis : bending plane label ("" for a single-plane study)
    warnings : plain-language warnings (e.g. accuracy limited by round-off)
    roundoff_error : estimated relative round-off error of the lowest load
        factor on the final mesh (large only for near-mechanisms)
    mode_errors : (n_modes,) estimated relative discretisation error of each
        reported load factor (the first is ``discretisation_error``); the mesh
        is refined until every one is within the tolerance
    """

    load_factors: np.ndarray
    heights: np.ndarray
    modes: np.ndarray
    rotations: np.ndarray
    segments: tuple[SegmentBuckling, ...]
    energy_shares: np.ndarray
    n_elements: int
    refinement_levels: np.ndarray
    discretisation_error: float
    tolerance: float
    converged: bool
    solver: str
    message: str = ""
    axis: str = ""
    warnings: tuple[str, ...] = field(default_factory=tuple)
    roundoff_error: float = 0.0
    mode_errors: np.ndarray = field(default_factory=lambda: np.zeros(0))

    @property
    def load_factor(self) -> float:
        """The lowest load factor."""
        return float(self.load_factors[0])

    @property
    def success(self) -> bool:
        return self.converged


@dataclass(frozen=True)
class CaseResults:
    """Everything computed for one case.

    Attributes
    ----------
    case : the case
    buckling : tuple of BucklingResult, one per bending plane, in the case's plane order
    governing_axis : the plane with the lowest load factor
    extras : results of optional analyses (imperfect, design, ...) keyed by name
    """

    case: Case
    buckling: tuple[BucklingResult, ...]
    governing_axis: str
    extras: dict = field(default_factory=dict)

    def plane(self, axis: str) -> BucklingResult:
        for r in self.buckling:
            if r.axis == axis:
                return r
        raise KeyError(axis)

    @property
    def governing(self) -> BucklingResult:
        return self.plane(self.governing_axis)
