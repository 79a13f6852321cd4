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
    """(figure, caption) of the utilisation chart."""
    from ..plot.design import plot_utilisation

    ax = plot_utilisation(result)
    return [(ax.figure, "Utilisation of every check; the dashed line marks a utilisation of one.")]
