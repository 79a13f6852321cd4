"""The bending-moment diagrams of the member checks with bending (matplotlib; imported only when plotting).

:func:`plot_moments` draws, for every bending plane, the moments the checks take along the height, the column
upright: the first-order diagram (lateral actions with the imperfections as equivalent forces) beside the
second-order one (EN 1993-1-1: with the member imperfections of the second-order route, and the second-order
sway moments of the 6.3.3 route where a plane is sway-sensitive; AISC 360: the direct analysis), the largest
value of each marked and labelled with its value and height, and the segment ends as thin lines.  Units are
``(label, SI value of one unit)`` pairs, e.g. ``("kN*m", 1e3)``.
"""

from __future__ import annotations

from typing import TYPE_CHECKING, Any

import numpy as np

if TYPE_CHECKING:
    from matplotlib.figure import Figure

    from ..design.bending_result import BendingResult

__all__ = ["plot_moments", "moment_curves"]

INK = "#222222"
C_ACT = "#8a8a8a"
C_FIRST = "#1f5fa8"
C_SWAY = "#2e8b57"
C_SECOND = "#c4572a"


def moment_curves(b: "BendingResult", axis: str) -> list[tuple[str, object, str, str]]:
    """The diagrams drawn for plane ``axis``: (label, whole-column diagram, colour, line style), those that
    exist, first-order before second-order."""
    out: list[tuple[str, object, str, str]] = []
    member = b.actions.get("member")
    second = b.actions.get("second-order")
    direct = b.actions.get("direct-analysis")
    if member is not None:
        p = member.plane(axis)
        out.append(("lateral actions alone, first order", p.actions, C_ACT, ":"))
        out.append(("first order, with the sway imperfection where the plane sways (6.3.3 route)", p.first_order,
                    C_FIRST, "-"))
        if p.sways:
            out.append(("second order, sway imperfection, no bow (6.3.3 route)", p.second_order, C_SWAY, "--"))
    if second is not None:
        p = second.plane(axis)
        out.append(("second order with the member imperfections (second-order route)", p.second_order, C_SECOND,
                    "-"))
    if direct is not None:
        p = direct.plane(axis)
        out.append(("lateral actions alone, first order", p.actions, C_ACT, ":"))
        out.append(("first order with notional loads", p.first_order, C_FIRST, "-"))
        out.append(("second order, direct analysis (0.8 tau_b EI)", p.second_order, C_SECOND, "-"))
    return [c for c in out if c[1] is not None]


def plot_moments(b: "BendingResult", *, length_unit=("m", 1.0), moment_unit=("kN*m", 1e3), title: str = "",
                 segment_bounds: tuple[float, ...] = ()) -> "Figure":
    """First- and second-order bending moments of every plane along the height (see the module notes).

    Parameters
    ----------
    b : the member checks with bending of a case (its ``actions``)
    length_unit, moment_unit : (label, SI value of one unit)
    title : figure title
    segment_bounds : heights of the segment ends [m], drawn as thin lines

    Returns
    -------
    matplotlib.figure.Figure
    """
    from matplotlib.figure import Figure

    lu, ls = length_unit
    mu, ms = moment_unit
    mu_label = mu.replace("*", "·")
    axes_names = [p.axis for p in next(iter(b.actions.values())).planes] if b.actions else []
    fig = Figure(figsize=(3.6 * max(len(axes_names), 1) + 0.6, 5.4), constrained_layout=True)
    if not axes_names:
        ax = fig.add_subplot()
        ax.text(0.5, 0.5, "no design actions", ha="center", va="center", transform=ax.transAxes)
        ax.set_axis_off()
        return fig
    axs = fig.subplots(1, len(axes_names), sharey=True, squeeze=False)[0]
    handles: dict[str, Any] = {}
    for ax, axis in zip(axs, axes_names):
        curves = moment_curves(b, axis)
        top = 0.0
        for n, (label, d, colour, style) in enumerate(curves):
            x = np.asarray(d.x) / ls  # type: ignore[attr-defined]
            M = np.asarray(d.M) / ms  # type: ignore[attr-defined]
            top = max(top, float(x.max()))
            (h,) = ax.plot(M, x, style, color=colour, lw=1.7 if style == "-" else 1.3)
            handles.setdefault(label, h)
            k = int(np.argmax(np.abs(M)))
            if abs(M[k]) > 0:
                ax.plot([M[k]], [x[k]], "o", color=colour, ms=5, mfc="white", mew=1.5)
                right = M[k] < 0  # the label towards the middle of the panel, inside it
                low = x[k] <= 0.5 * float(x.max())  # labels stack away from the nearer end of the column
                dy = (6 + 22 * n) if low else -(6 + 22 * n)
                ax.annotate(f"{M[k]:.3g} {mu_label} at {x[k]:.4g} {lu}", (M[k], x[k]), textcoords="offset points",
                            xytext=(30 if right else -30, dy), ha="left" if right else "right",
                            va="bottom" if low else "top", color=colour, fontsize=7.5,
                            bbox=dict(boxstyle="round,pad=0.15", fc="white", ec="none", alpha=0.9),
                            arrowprops=dict(arrowstyle="-", color=colour, lw=0.6))
        ax.axvline(0.0, color=INK, lw=0.8)
        for h in segment_bounds:
            ax.axhline(h / ls, color="0.8", lw=0.6, zorder=0)
        peak = max((float(np.abs(np.asarray(d.M)).max()) / ms for _, d, _, _ in curves), default=0.0)  # type: ignore[attr-defined]
        if peak > 0:
            ax.set_xlim(-1.6 * peak, 1.6 * peak)
        else:
            ax.set_xlim(-1.0, 1.0)
            ax.text(0.5, 0.5, "no bending moment in this plane", transform=ax.transAxes, ha="center", va="center",
                    fontsize=8, color=INK, bbox=dict(boxstyle="round,pad=0.3", fc="white", ec="0.8"))
        ax.set_ylim(0.0, top if top > 0 else 1.0)
        ax.set_title(f"{axis} axis", fontsize=9)
        ax.set_xlabel(f"bending moment [{mu_label}]", fontsize=8.5)
        ax.tick_params(labelsize=8)
        ax.grid(True, color="0.9", lw=0.5)
    axs[0].set_ylabel(f"height [{lu}]", fontsize=8.5)
    fig.legend(list(handles.values()), list(handles), loc="outside lower center", ncol=1, fontsize=7.5, frameon=False)
    fig.suptitle(title or f"Moments of the member checks with bending ({b.standard})", fontsize=10)
    return fig
