"""Figure of the thin-walled (spatial) buckling analysis: the lowest modes as three diagrams along the height,
the two lateral displacements of the shear centre and the twist (matplotlib; imported only when plotting).

Each mode is scaled so that its largest lateral displacement is 1; the twist is drawn as the lateral movement
it gives a point at the polar radius i_0 from the shear centre (phi x i_0), on the same scale, so that a mode
that mostly twists shows it at a comparable size.  Heights in the case's display length unit.
"""

from __future__ import annotations

from typing import TYPE_CHECKING

import numpy as np

if TYPE_CHECKING:
    from matplotlib.figure import Figure

    from ..solve.spatial_case import SpatialCase

__all__ = ["plot_spatial_modes"]

#: Line styles of the modes, black-and-white friendly.
STYLES = ("-", "--", ":")


def plot_spatial_modes(spatial: SpatialCase, *, length_unit: tuple[str, float] = ("m", 1.0), n_modes: int = 3,
                       title: str = "") -> Figure:
    """Lateral displacements u (along the major axis), v (along the minor axis) and the twist of the lowest
    modes of the thin-walled analysis against height."""
    from matplotlib.figure import Figure

    r = spatial.result
    fig = Figure(figsize=(8.0, 5.6), constrained_layout=True)
    axes = fig.subplots(1, 3, sharey=True)
    if r is None:  # not covered: say so on an empty figure
        fig.suptitle(f"thin-walled analysis not run: {spatial.note}", fontsize=9)
        return fig
    label, scale = length_unit
    x = np.asarray(r.heights) / scale
    i0 = max((s.i0 for s in spatial.column.segments), default=1.0) if spatial.column is not None else 1.0
    names = ("u: lateral, along the major axis", "v: lateral, along the minor axis", "twist x i_0")
    for k in range(min(n_modes, len(r.load_factors))):
        comps = (np.asarray(r.u[k]), np.asarray(r.v[k]), np.asarray(r.phi[k]) * i0)
        big = max(float(np.max(np.abs(c))) for c in comps) or 1.0
        for ax, c in zip(axes, comps):
            ax.plot(c / big, x, STYLES[k % len(STYLES)], color="black", lw=1.6 - 0.3 * k,
                    label=f"mode {k + 1}, λ = {r.load_factors[k]:.4g}: {r.kinds[k]}")
    for ax, name in zip(axes, names):
        ax.axvline(0.0, color="#888888", lw=0.8)
        ax.set_title(name, fontsize=9)
        ax.set_xlim(-1.1, 1.1)
        ax.set_xlabel("relative displacement")
    axes[0].set_ylabel(f"height [{label}]")
    handles, labels = axes[0].get_legend_handles_labels()
    fig.legend(handles, labels, loc="outside lower center", fontsize=8, frameon=False)
    fig.suptitle((title + " — " if title else "") + "thin-walled buckling modes", fontsize=10)
    return fig
