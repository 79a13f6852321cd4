"""Writing figures to files: PNG, SVG or PDF, completely or not at all."""

from __future__ import annotations

import os
from pathlib import Path
from typing import TYPE_CHECKING

from ..errors import ModelError
from ..util.files import write_atomic

if TYPE_CHECKING:
    from matplotlib.figure import Figure

__all__ = ["save_figure"]

_FORMATS = {".png": "png", ".svg": "svg", ".pdf": "pdf"}
_METADATA = {"png": None, "svg": {"Date": None}, "pdf": {"CreationDate": None}}


def save_figure(fig: Figure, path: str | os.PathLike) -> Path:
    """Write ``fig`` to PNG (150 dpi), SVG or PDF, chosen by the file extension.

    The figure is written to a temporary file in the same folder and renamed
    into place (:func:`fea.util.files.write_atomic`), so a failure leaves no
    half-written file behind.  SVG and PDF output carry no date, so equal
    figures give equal files.

    Parameters
    ----------
    fig : matplotlib.figure.Figure
    path : str or os.PathLike
        Target file; its extension (``.png``, ``.svg`` or ``.pdf``, any case)
        selects the format.

    Returns
    -------
    pathlib.Path
        The path written.

    Raises
    ------
    ModelError
        Unknown extension or missing folder (field ``"plot"``).
    """
    target = Path(path)
    fmt = _FORMATS.get(target.suffix.lower())
    if fmt is None:
        raise ModelError("plot", f"cannot tell the file format of {target.name!r}: expected .png, .svg or .pdf")
    folder = target.parent if str(target.parent) else Path(".")
    if not folder.is_dir():
        raise ModelError("plot", f"folder {str(folder)!r} does not exist")

    def save(tmp: str) -> None:
        from matplotlib import rc_context

        with rc_context({"svg.hashsalt": "stanchion", "svg.fonttype": "path"}):
            fig.savefig(tmp, format=fmt, dpi=150, metadata=_METADATA[fmt], facecolor="white")

    return write_atomic(target, save)
