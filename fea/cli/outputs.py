"""The files a command writes: checked before the computation, written all together or not at all.

Every subcommand that writes files names them to an :class:`OutputPlan` as soon
as its arguments are read (``check``), before any analysis runs, and hands it
the contents once everything is computed (``add``); ``write`` then puts every
file in place through temporary files (:func:`fea.util.files.write_all`).  An
output may overwrite an existing regular file (unless ``--no-clobber``), never
an input file of the run, a folder, a device, a pipe or a socket.
"""

from __future__ import annotations

import argparse
import os
from pathlib import Path

from ..errors import FeaError

__all__ = ["OutputPlan", "add_no_clobber", "figure_writer", "check_plot", "PLOT_SUFFIXES"]

#: The figure formats `--plot` writes.
PLOT_SUFFIXES = (".png", ".svg", ".pdf")


def check_plot(args: argparse.Namespace) -> None:
    """Every `--plot FILE` of ``args`` names a figure format (before anything is computed)."""
    for f in getattr(args, "plot", None) or []:
        if Path(f).suffix.lower() not in PLOT_SUFFIXES:
            raise FeaError(f"--plot: {f!r} has no known extension: expected .png, .svg or .pdf")


def add_no_clobber(p: argparse.ArgumentParser) -> None:
    """The ``--no-clobber`` option of a command that writes files."""
    p.add_argument("--no-clobber", action="store_true",
                   help="refuse to overwrite an existing file (by default outputs replace existing files)")


def figure_writer(fig):
    """The contents of a figure output: a function drawing ``fig`` to the file it is given."""

    def draw(tmp: str) -> None:
        from ..plot import save_figure

        save_figure(fig, tmp)

    return draw


def _same(a: Path, b: Path) -> bool:
    """Whether ``a`` and ``b`` name the same file, through links or another spelling."""
    try:
        if os.path.exists(a) and os.path.exists(b):
            return os.path.samefile(a, b)
    except OSError:
        pass
    return os.path.realpath(a) == os.path.realpath(b)


class OutputPlan:
    """The output files of one run of a command.

    Parameters
    ----------
    inputs : the files the run reads (case file, catalogue); no output may be one of them
    no_clobber : refuse every output that already exists
    """

    def __init__(self, inputs, no_clobber: bool = False) -> None:
        self.inputs = [Path(p) for p in inputs if p and p != "-"]
        self.no_clobber = bool(no_clobber)
        self._items: list[tuple[Path, object]] = []

    def check(self, path: str | os.PathLike, option: str) -> Path:
        """Refuse ``path`` now (:class:`FeaError`, exit status 2) if it cannot be written; the path."""
        target = Path(path)
        where = f"{option}: " if option else ""
        folder = target.parent if str(target.parent) else Path(".")
        if not folder.exists():
            raise FeaError(f"{where}folder {str(folder)!r} does not exist")
        if not folder.is_dir():
            raise FeaError(f"{where}{str(folder)!r} is not a folder")
        if not os.access(folder, os.W_OK | os.X_OK):
            raise FeaError(f"{where}folder {str(folder)!r} is not writable")
        for inp in self.inputs:
            if _same(target, inp):
                raise FeaError(f"{where}{str(target)!r} is an input file of this run; it is not overwritten")
        if os.path.lexists(target):
            if not os.path.isfile(target):
                raise FeaError(f"{where}{str(target)!r} exists and is not a regular file (a folder, device, pipe, "
                               "socket or a link to one); it is not replaced")
            if self.no_clobber:
                raise FeaError(f"{where}{str(target)!r} already exists (--no-clobber)")
        if any(_same(target, p) for p, _ in self._items):
            raise FeaError(f"{where}{str(target)!r} is named twice as an output of this run")
        return target

    def add(self, path: str | os.PathLike, data, option: str = "") -> None:
        """The contents of an output (text, bytes or a function writing the file it is given)."""
        target = self.check(path, option)
        self._items.append((target, data))

    def write(self) -> list[Path]:
        """Put every output in place, all or none."""
        from ..util.files import write_all

        try:
            return write_all(list(self._items))  # type: ignore[arg-type]
        except OSError as exc:
            name = exc.filename or ""
            raise FeaError(f"cannot write the outputs{f' ({name})' if name else ''}: "
                           f"{exc.strerror or exc}; no output was changed") from None
