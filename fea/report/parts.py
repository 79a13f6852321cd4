"""The parts of the report, in order, and the parts of the optional analyses.

Each optional analysis of the run (``CaseResults.extras``) has one
:class:`OptionalPart`: its title, the blocks it shows and the figures drawn
for it, all read from the analysis's result object.  The parts of the
analyses are listed with the analyses in :data:`fea.pipeline.ANALYSES`, which
passes them to :func:`report_parts`.
"""

from __future__ import annotations

from dataclasses import dataclass
from typing import Any, Callable, Mapping

from ..results import CaseResults
from ..units import DisplayUnits
from .blocks import svg_of
from .buckling import buckling_part
from .closing import closing_part
from .design import design_figures, design_part_blocks
from .document import Figure, Heading, Part, Table
from .fixity import fixity_blocks, fixity_figures
from .imperfect import imperfect_blocks, imperfect_figures
from .inputs import inputs_part
from .method import method_part
from .spatial import spatial_blocks, spatial_figures

__all__ = ["OptionalPart", "FIXITY_PART", "SPATIAL_PART", "IMPERFECT_PART", "DESIGN_PART", "report_parts"]


@dataclass(frozen=True)
class OptionalPart:
    """The report part of one optional analysis.

    Attributes
    ----------
    title : heading of the part
    blocks : (result, display units) -> the blocks of the part
    figures : (result, display units) -> (matplotlib Figure or SVG text, caption) pairs
    figures_after_table : place the figures after the part's first table (beside the summary they draw)
        rather than at its end
    within : the key of a part this one is a section of (its title then a sub-heading at that part's end),
        or "" for a part of its own
    """

    title: str
    blocks: Callable[[Any, DisplayUnits], list]
    figures: Callable[[Any, DisplayUnits], list]
    figures_after_table: bool = False
    within: str = ""


#: The part of the depth of fixity (columns held by a foundation).
FIXITY_PART = OptionalPart("Depth of fixity", fixity_blocks, fixity_figures)
#: The part of the thin-walled (spatial) buckling of a case with sections in two planes.
#: A section of the elastic critical buckling part.
SPATIAL_PART = OptionalPart("Thin-walled buckling", spatial_blocks, spatial_figures, within="buckling")
#: The part of the imperfect-column analysis.
IMPERFECT_PART = OptionalPart("Imperfect column", imperfect_blocks, imperfect_figures)
#: The part of the design check.
DESIGN_PART = OptionalPart("Design check", design_part_blocks, design_figures, figures_after_table=True)


def _optional_part(name: str, spec: OptionalPart, result: Any, u: DisplayUnits, figures: bool) -> Part:
    blocks = spec.blocks(result, u)
    if figures:
        at = next((i + 1 for i, b in enumerate(blocks) if isinstance(b, Table)), len(blocks)) \
            if spec.figures_after_table else len(blocks)
        for k, (fig, caption) in enumerate(spec.figures(result, u)):
            blocks.insert(at + k, Figure(svg_of(fig), (caption,) if isinstance(caption, str) else tuple(caption),
                                         f"{name}-{k + 1}"))
    return Part(name, spec.title, blocks)


def report_parts(res: CaseResults, u: DisplayUnits, sketch: str | None, mode_figures: list, warnings: list[str],
                 optional: Mapping[str, OptionalPart], figures: bool = True) -> list[Part]:
    """All parts of the report, in order; ``optional`` gives the part of each analysis by name, in report
    order (``figures``: draw the figures of the optional parts).

    Raises
    ------
    ValueError
        The run holds the result of an analysis that has no entry in ``optional``.
    """
    unknown = [name for name in res.extras if name not in optional]
    if unknown:
        raise ValueError(f"the report has no part for the analysis {unknown[0]!r}: give its Analysis a "
                         "report part in fea/pipeline.py")
    design = res.extras.get("design")
    if design is not None:
        from ..io.design_output import design_json

        design = design_json(design)
    parts = [inputs_part(res.case, u, sketch, design), method_part(res), buckling_part(res, u, mode_figures)]
    for name, spec in optional.items():
        if name in res.extras:
            part = _optional_part(name, spec, res.extras[name], u, figures)
            host = next((p for p in parts if spec.within and p.key == spec.within), None)
            if host is None:
                parts.append(part)
            else:
                host.blocks.extend([Heading(3, part.title), *part.blocks])
    parts.append(closing_part(warnings, res))
    return parts
