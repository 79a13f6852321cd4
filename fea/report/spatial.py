"""The thin-walled (spatial) buckling part of the report, read from the :class:`~fea.solve.spatial_case.SpatialCase`.

The values are those of the JSON ``"spatial"`` part (:mod:`fea.io.spatial_output`); each names its JSON path.
"""

from __future__ import annotations

import math
from typing import TYPE_CHECKING

from ..io.spatial_output import segment_N_cr
from ..units import DisplayUnits
from .blocks import hdr
from .document import Heading, Note, Para, Sub, T, Table, q

if TYPE_CHECKING:
    from ..solve.spatial_case import SpatialCase

__all__ = ["spatial_blocks", "spatial_figures"]


def spatial_blocks(s: "SpatialCase", u: DisplayUnits) -> list:
    """The spatial part: what was analysed, the modes, the per-segment N_cr of the lowest mode, the verdict."""
    blocks: list = [Para(("The member is analysed as one thin-walled member: bending about both axes and "
                          "twisting together (flexural, torsional and flexural-torsional modes; docs/spatial.md), "
                          "with the torsion constants of each section and the twist and warping restraints of "
                          "the case."),)]
    if not s.ran or s.result is None:
        blocks.append(Note((T(s.note, "json:spatial/note"),), "check"))
        return blocks
    r = s.result
    rows = tuple(((T(str(i + 1), f"ord:{i + 1}"),), (q(float(lam), f"json:spatial/load_factors/{i}", "", 5),),
                  (T(kind, f"json:spatial/kinds/{i}"),),
                  (q(float(e) if math.isfinite(e) else None, f"json:spatial/estimated_errors/{i}", "", 2),))
                 for i, (lam, kind, e) in enumerate(zip(r.load_factors, r.kinds, r.discretisation_errors)))
    blocks.append(Table((("Mode",), ("Load factor",), ("Kind",), ("Estimated error",)), rows, numeric=(1, 3)))
    seg_rows = tuple(((T(name, f"json:spatial/segments/{j}/name"),),
                      (q(N, f"json:spatial/segments/{j}/N_cr_N", u.force),))
                     for j, (name, N) in enumerate(zip(s.segment_names, segment_N_cr(s))))
    blocks.append(Table((("Segment",), hdr("Axial force at the lowest mode, N_cr", u.force)), seg_rows,
                        numeric=(1,)))
    kind, lam = T(s.kind, "json:spatial/kinds/0"), q(s.load_factor, "json:spatial/load_factors/0", "", 4)
    planar = (q(s.planar_load_factor, "json:spatial/planar_load_factor", "", 4), " in plane (",
              T(s.planar_axis, "json:spatial/planar_axis"), " axis).")
    if s.governs:
        blocks.append(Para(("This governs: ", kind, " buckling at load factor ", lam, " against ", *planar)))
    else:
        blocks.append(Para(("The lowest load factor, ", lam, " (", kind, "), is not below the planar analysis's ",
                            *planar)))
    blocks.append(Para(("Solution: ", T(r.message, "json:spatial/message"), ".")))
    blocks.extend(_critical_moment_blocks(s, u))
    return blocks


def _critical_moment_blocks(s: "SpatialCase", u: DisplayUnits) -> list:
    """The elastic critical moment under the case's major-axis moments (when the case has them)."""
    m = s.critical_moment
    if m is None:
        return []
    p = "json:spatial/critical_moment"
    out: list = [Heading(4, "Elastic critical moment")]
    if isinstance(m, str):
        out.append(Note((T(m, f"{p}/note"),), "check"))
        return out
    how = (" The parabola of the distributed lateral load is followed by ", T(str(m.chords), f"{p}/chords"),
           " chords between stations.") if m.chords else ()
    out.append(Para(("The member is analysed under the first-order major-axis moment diagram of the case loads "
                     "alone (its axial loads left out; moments through the shear centre, no load-height effect). "
                     "It buckles ", T(m.kind, f"{p}/kind"), " at ", q(m.load_factor, f"{p}/load_factor", "", 4),
                     " times that diagram (", T(m.senses, f"{p}/senses"), "); M", Sub("cr"),
                     " of a segment is that factor times its largest moment.", *how)))
    rows = tuple(((T(g.name, f"{p}/segments/{j}/name"),), (q(g.M_max, f"{p}/segments/{j}/M_max_Nm", u.moment),),
                  (q(g.at, f"{p}/segments/{j}/at_m", u.length),), (q(g.M_cr, f"{p}/segments/{j}/M_cr_Nm", u.moment),))
                 for j, g in enumerate(m.segments) if g.M_max > 0)
    out.append(Table((("Segment",), hdr("Largest moment", u.moment), hdr("at", u.length),
                      hdr("M_cr", u.moment)), rows, numeric=(1, 2, 3)))
    out.append(Para(("Solution: ", T(m.message, f"{p}/message"), ".")))
    return out


def spatial_figures(s: "SpatialCase", u: DisplayUnits) -> list:
    """The lowest modes of the thin-walled analysis (lateral displacements and twist against height)."""
    if not s.ran or s.result is None:
        return []
    from ..plot.spatial import plot_spatial_modes

    fig = plot_spatial_modes(s, length_unit=(u.length, u.length_si))
    return [(fig, "Thin-walled buckling: the lowest modes, lateral displacements of the shear centre and the "
                  "twist against height, each mode named by its kind")]
