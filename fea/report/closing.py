"""The closing part of the report: warnings raised during the run, limitations and the caution."""

from __future__ import annotations

from ..cautions import CAUTION, LIMITATIONS
from ..io.run_warnings import run_warnings
from ..results import CaseResults
from .document import Bullets, Heading, Note, Para, Part, T

__all__ = ["closing_part"]


def closing_part(warnings: list[str], res: CaseResults | None = None) -> Part:
    """The warnings (verbatim; then the run's keyed warnings, ``json:warnings/<n>/text``), the limitations of the
    tool and its caution (``json:cautions/<n>``)."""
    blocks: list = [Heading(3, "Warnings raised during the run")]
    keyed = run_warnings(res) if res is not None else []
    if warnings or keyed:
        blocks.append(Bullets(tuple((T(w, f"run:warnings/{i}"),) for i, w in enumerate(warnings))
                              + tuple(("WARNING" if w["level"] == "warning" else "CHECK", " (",
                                       T(w["key"], f"json:warnings/{i}/key"), "): ",
                                       T(w["text"], f"json:warnings/{i}/text"))
                                      for i, w in enumerate(keyed))))
    else:
        blocks.append(Para(("None.",)))
    blocks.append(Heading(3, "Limitations"))
    blocks.append(Bullets(tuple((T(c, f"json:cautions/{i}"),) for i, c in enumerate(LIMITATIONS, start=1))
                          + (("The report shows the results of the run; it neither recomputes nor checks them.",),)))
    blocks.append(Heading(3, "Caution"))
    blocks.append(Note((T(CAUTION, "json:cautions/0"),)))
    return Part("closing", "Warnings, limitations and cautions", blocks)
