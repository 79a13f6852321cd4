"""The design-check part of the report: the hand calculation of every check and the utilisation chart."""

from __future__ import annotations

from ..design.check import DesignResult
from ..units import DisplayUnits

__all__ = ["design_part_blocks", "design_figures"]


def design_part_blocks(result: DesignResult, u: DisplayUnits) -> list:
    """The written-out checks (:func:`fea.report.design_calc.design_blocks`)."""
    from ..io.design_output import design_json
    from .design_calc import design_blocks

    # The hand calculation still reads the check's values by their JSON keys: it is given the JSON "design"
    # part made from this result object (the same function writes the JSON result), not the JSON of the run.
    return design_blocks(design_json(result), u)


def design_figures(result: DesignResult, u: DisplayUnits) -> list:
    """(figure, caption) of the utilisation chart, and of the moments of the member checks with bending."""
    from ..plot.design import plot_utilisation

    ax = plot_utilisation(result)
    what = "every check, axial and with bending (one bar per segment and route)" if result.bending is not None \
        else "every check"
    out = [(ax.figure, f"Utilisation of {what}; the dashed line marks a utilisation of one.")]
    if result.bending is not None and result.bending.actions:
        from ..io.design_output import moment_unit
        from ..plot.moments import plot_moments

        fig = plot_moments(result.bending, length_unit=(u.length, u.length_si), moment_unit=moment_unit(u))
        out.append((fig, "Bending moments of the member checks with bending along the height, each plane: the "
                         "first-order diagram beside the second-order one, the largest value of each marked with "
                         "its height."))
    return out
