"""The imperfect-column part of the report, read from the :class:`~fea.solve.imperfect.ImperfectResult` of each plane.

The values are those the JSON ``"imperfect"`` part holds (:mod:`fea.io.imperfect_output`),
taken from the same objects; each names its JSON path.
"""

from __future__ import annotations

from typing import TYPE_CHECKING, Any

from ..io.imperfect_output import status_words
from ..units import DisplayUnits
from ..util.numbers import finite_or_none as _num
from .blocks import Field, quantity_table, record_table
from .buckling import plane_title
from .document import Heading, Note, Para, T

if TYPE_CHECKING:
    from ..solve.imperfect import ImperfectResult
    from ..solve.imperfect_path import NonlinearPath
    from ..solve.second_order import SecondOrderResult

__all__ = ["imperfect_blocks", "imperfect_figures", "IMPERFECT_LABELS"]

#: Engineering wording of the keys of the imperfect-column part (the key still names the source of the label).
IMPERFECT_LABELS = {
    # imperfect column, per plane
    "analysis": "Analyses run",
    "status_text": "How the analysis ended",
    "success": "Completed",
    "message": "Solver message",
    "critical_load_factor": "Elastic critical load factor",
    "first_yield_load_factor": "First-yield load factor (model named below)",
    "first_yield_source": "First yield taken from",
    "first_yield_remark": "First yield above the ultimate load",
    "second_order_first_yield_load_factor": "First-yield load factor, elastic second order (no residual stress)",
    "fibre_first_yield_load_factor": "First-yield load factor, nonlinear fibre model",
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
    "first_yield_force_N": "First-yield force (model named above)",
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

_FORCE_COLUMNS = ("segment", "axial_force_N", "critical_force_N", "euler_force_N", "perry_force_N",
                  "first_yield_force_N", "limit_force_N", "note")
_FACTOR_COLUMNS = ("segment", "critical_load_factor", "euler_load_factor", "perry_load_factor",
                   "first_yield_load_factor", "limit_load_factor")


def _plane_fields(r: "ImperfectResult") -> list[Field]:
    fy, source = r.reported_first_yield
    fields: list[Field] = [
        ("analysis", r.analysis), ("status_text", status_words(r.status)), ("success", r.success),
        ("message", r.message), ("critical_load_factor", _num(r.critical_load_factor)),
        ("first_yield_load_factor", _num(fy)), ("first_yield_source", source),
        ("second_order_first_yield_load_factor", _num(r.second_order_first_yield_load_factor)),
        ("fibre_first_yield_load_factor", _num(r.fibre_first_yield_load_factor)),
        ("limit_load_factor", _num(r.limit_load_factor))]
    if r.first_yield_remark:
        fields.append(("first_yield_remark", r.first_yield_remark))
    return fields


def _bow_fields(r: "ImperfectResult") -> list[Field]:
    imp = r.imperfection
    assert imp is not None
    return [("shape", imp.shape), ("largest_bow_m", r.bow_amplitude), ("amplitude_m", _num(imp.amplitude)),
            ("ratio", _num(imp.ratio))]


def _comparison_records(r: "ImperfectResult") -> list[dict[str, Any]]:
    fy, _ = r.reported_first_yield
    return [{"segment": c.index + 1, "axial_force_N": c.axial_force, "critical_force_N": _num(c.critical_force),
             "critical_load_factor": _num(r.critical_load_factor), "euler_force_N": c.euler_force,
             "euler_load_factor": _num(c.load_factor(c.euler_force)), "perry_force_N": _num(c.perry_force),
             "perry_load_factor": _num(c.perry_load_factor), "first_yield_force_N": _num(c.force(fy)),
             "first_yield_load_factor": _num(fy), "limit_force_N": _num(c.force(r.limit_load_factor)),
             "limit_load_factor": _num(r.limit_load_factor), "note": c.note}
            for c in r.comparison]


def _second_order_fields(so: "SecondOrderResult") -> list[Field]:
    return [("n_elements", so.n_elements), ("tolerance", so.tolerance),
            ("discretisation_error", _num(so.discretisation_error)), ("converged", so.converged),
            ("first_yield_height_m", _num(so.first_yield_height)), ("message", so.message)]


def _path_fields(nl: "NonlinearPath") -> list[Field]:
    return [("limit_load_factor", _num(nl.limit_load_factor)), ("limit_accuracy", _num(nl.limit_accuracy)),
            ("first_yield_load_factor", _num(nl.first_yield_load_factor)),
            ("first_yield_height_m", _num(nl.first_yield_height)),
            ("first_yield_offset_m", _num(nl.first_yield_offset)), ("control_height_m", nl.control_height),
            ("n_elements", nl.n_elements), ("n_fibres", nl.n_fibres), ("n_steps", nl.n_steps),
            ("n_iter", nl.n_iter), ("max_residual", _num(nl.max_residual)), ("tolerance", nl.tolerance),
            ("status_text", status_words(nl.status)), ("success", nl.success), ("message", nl.message)]


def _plane_blocks(r: "ImperfectResult", p: str, u: DisplayUnits) -> list:
    """One bending plane; ``p`` is its JSON path (``imperfect/0``)."""
    labels = IMPERFECT_LABELS
    blocks: list = [Heading(3, plane_title(r.axis or "in-plane")), quantity_table(_plane_fields(r), p, u, labels)]
    if r.imperfection is not None:
        blocks += [Heading(4, "Initial bow"), quantity_table(_bow_fields(r), f"{p}/imperfection", u, labels)]
    if r.comparison:
        records = _comparison_records(r)
        blocks += [Heading(4, "Comparison per segment: axial forces"),
                   record_table(records, f"{p}/comparison", _FORCE_COLUMNS, u, labels),
                   Heading(4, "Comparison per segment: load factors"),
                   record_table(records, f"{p}/comparison", _FACTOR_COLUMNS, u, labels)]
    if r.second_order is not None:
        blocks += [Heading(4, "Second-order elastic analysis"),
                   quantity_table(_second_order_fields(r.second_order), f"{p}/second_order", u, labels)]
    if r.nonlinear is not None:
        blocks += [Heading(4, "Nonlinear path"), quantity_table(_path_fields(r.nonlinear), f"{p}/path", u, labels)]
    blocks += [Note((T(w, f"json:{p}/warnings/{k}"),), "warning") for k, w in enumerate(r.warnings)]
    return blocks


def imperfect_blocks(results: dict[str, "ImperfectResult"], u: DisplayUnits) -> list:
    """The imperfect-column part: an introduction, then every plane analysed (in the JSON's order)."""
    blocks: list = [Para(("Second-order analysis of the column with its initial bow, as set out in the case: the "
                          "elastic critical load, first yield and the ultimate (limit) load, compared per segment "
                          "with the Euler load and the Perry-Robertson first-yield load.  The headline first yield "
                          "names its model: with residual stresses it is the fibre model's (the elastic "
                          "second-order model has none, so its first yield can lie above the ultimate load).",))]
    for i, r in enumerate(results.values()):
        blocks += _plane_blocks(r, f"imperfect/{i}", u)
    return blocks


def imperfect_figures(results: dict[str, "ImperfectResult"], u: DisplayUnits) -> list:
    """(figure, caption) of every plane: the load-deflection path and, with compressed segments, the comparison."""
    from ..plot import imperfect as plots

    out = []
    for axis, r in results.items():
        out.append((plots.plot_path(r, length_unit=(u.length, u.length_si)),
                    f"Load factor against lateral deflection at the control height, {axis} axis."))
        if any(c.variable_force > 0 for c in r.comparison):
            out.append((plots.plot_comparison(r), f"Load factors compared, {axis} axis: elastic critical, "
                                                  "Euler, Perry-Robertson, first yield (each with its model) and "
                                                  "ultimate."))
    return out
