"""Charts of a reliability run: the histogram of the strengths and their cumulative distribution.

Consumes a :class:`fea.batch.reliability.ReliabilityResult`; never recomputes physics.  Drawn in greys (they
read in black and white): the mean dashed, the characteristic fractile solid with its confidence interval
shaded, the design load as a heavy line with the failure side hatched.  matplotlib is imported inside the
functions; save with :func:`fea.plot.save_figure`.
"""

from __future__ import annotations

import numpy as np

from ..cautions import CAUTION
from .reliability_input import STRENGTHS

__all__ = ["plot_histogram", "plot_cdf"]

_FS = 8.5


def _name(res) -> str:
    return STRENGTHS[res.spec.strength].split(" (")[0]


def _finish(fig, title: str) -> None:
    fig.suptitle(title, fontsize=10.5)
    fig.supxlabel(CAUTION, fontsize=6, color="0.35", x=0.01, ha="left", wrap=True)


def _marks(ax, res, y_text: float, transform) -> None:
    """Mean, fractile with its interval, design load with the failure side hatched."""
    m, f = res.moments, res.fractile
    if f.lower is not None and f.upper is not None:
        ax.axvspan(f.lower, f.upper, color="0.85", lw=0, zorder=0,
                   label=f"{f.confidence:.0%} interval of the {f.p:g} fractile")
    ax.axvline(f.value, color="black", lw=1.2, label=f"{f.p:g} fractile {f.value:.3g}")
    ax.axvline(m.mean, color="black", lw=1.0, ls="--", label=f"mean {m.mean:.3g}")
    if res.design_load is not None:
        lo = ax.get_xlim()[0]
        ax.axvspan(lo, res.design_load, facecolor="none", edgecolor="0.55", hatch="//", lw=0, zorder=0,
                   label="failure: strength below the design load")
        ax.axvline(res.design_load, color="black", lw=2.2,
                   label=f"design load factor {res.design_load:.3g}" + (
                       f" (pf {res.failure.pf:.2g})" if res.failure is not None else ""))
        ax.set_xlim(left=lo)


def plot_histogram(res, title: str = ""):
    """Histogram of the samples' strengths (load factors)."""
    from matplotlib.figure import Figure

    x = np.asarray(res.strengths, dtype=float)
    fig = Figure(figsize=(7.0, 4.4))
    ax = fig.add_axes((0.10, 0.20, 0.86, 0.68))
    bins = int(np.clip(np.sqrt(x.size) * 1.5, 10, 60)) if x.size > 1 else 1
    ax.hist(x, bins=bins, color="0.55", edgecolor="white", lw=0.5, label=f"{x.size} samples")
    lo = min(x.min(), res.design_load) if res.design_load is not None else x.min()
    span = max(x.max() - lo, 1e-12 * max(1.0, abs(x.max())))
    ax.set_xlim(lo - 0.05 * span, x.max() + 0.05 * span)
    _marks(ax, res, 0.95, ax.transAxes)
    ax.set_xlabel(f"{_name(res)} [-] (multiplies the variable loads of the case)", fontsize=_FS)
    ax.set_ylabel("number of samples", fontsize=_FS)
    from matplotlib.ticker import MaxNLocator

    ax.yaxis.set_major_locator(MaxNLocator(integer=True))
    ax.tick_params(labelsize=8)
    ax.legend(fontsize=7, frameon=False, loc="upper right")
    ax.spines[["top", "right"]].set_visible(False)
    m = res.moments
    _finish(fig, f"{title}\nStrength of {m.n} samples: mean {m.mean:.3g}, COV {m.cov:.3g}".strip())
    return fig


def plot_cdf(res, title: str = ""):
    """Empirical cumulative distribution of the strengths: whole range (left) and lower tail on a logarithmic
    probability scale (right), where the probability of failure is read."""
    from matplotlib.figure import Figure

    x = np.sort(np.asarray(res.strengths, dtype=float))
    n = x.size
    p = np.arange(1, n + 1) / n
    fig = Figure(figsize=(8.4, 5.0))
    axes = (fig.add_axes((0.08, 0.33, 0.40, 0.53)), fig.add_axes((0.57, 0.33, 0.40, 0.53)))
    lo = min(x[0], res.design_load) if res.design_load is not None else x[0]
    span = max(x[-1] - lo, 1e-12 * max(1.0, abs(x[-1])))
    for k, ax in enumerate(axes):
        ax.step(x, p, where="post", color="black", lw=1.0, label="samples (empirical)")
        ax.set_xlim(lo - 0.05 * span, x[-1] + 0.05 * span)
        _marks(ax, res, 0.95, ax.transAxes)
        ax.axhline(res.fractile.p, color="0.4", lw=0.6, ls=":", label=f"fraction {res.fractile.p:g}")
        ax.set_xlabel(f"{_name(res)} [-]", fontsize=_FS)
        ax.tick_params(labelsize=8)
        ax.spines[["top", "right"]].set_visible(False)
        if k == 0:
            ax.set_ylim(0, 1.02)
            ax.set_ylabel("fraction of samples below", fontsize=_FS)
            ax.set_title("cumulative distribution", fontsize=9)
            handles, labels = ax.get_legend_handles_labels()
            fig.legend(handles, labels, loc="lower center", bbox_to_anchor=(0.5, 0.10), ncol=4, fontsize=7,
                       frameon=False)
        else:
            ax.set_yscale("log")
            ax.set_ylim(max(0.3 / n, 1e-7), 1.0)
            top = x[min(n - 1, max(0, int(0.5 * n)))]
            ax.set_xlim(lo - 0.05 * span, top)
            ax.set_title("lower tail (logarithmic scale)", fontsize=9)
    m = res.moments
    _finish(fig, f"{title}\nCumulative distribution of the strength, {m.n} samples".strip())
    return fig
