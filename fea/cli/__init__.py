"""The ``stanchion`` command (also ``python -m fea``): one module per subcommand.

The only package that prints or sets the exit status.  Exit status: 0 success,
1 a design check failed, 2 bad input (one line, no traceback unless ``--debug``),
3 an internal error, 130 interrupted (Ctrl-C).  Each subcommand module has
``NAME``, ``HELP``, optionally ``DESCRIPTION``, ``add_arguments(parser)`` and
``run(args) -> exit status``; :data:`SUBCOMMANDS` lists them in the order
``--help`` shows them.

This module is kept light: everything else (the parser, the subcommands, numpy)
is imported inside :func:`main`, so that Ctrl-C at any moment, even during those
imports, ends with one line and status 130 rather than a traceback.
"""

from __future__ import annotations

import os
import sys

__all__ = ["main", "build_parser", "SUBCOMMANDS", "EXIT_OK", "EXIT_FAILED_CHECK", "EXIT_BAD_INPUT", "EXIT_INTERNAL"]


def main(argv: list[str] | None = None) -> int:
    """Run the command with ``argv`` (default: the process's arguments); the exit status."""
    one_blas_thread()
    try:
        from .app import main as run_command

        return run_command(argv)
    except KeyboardInterrupt:
        print("stanchion: interrupted", file=sys.stderr)
        return 130


#: The thread-count variables of the BLAS libraries numpy may be built on.
BLAS_THREAD_VARIABLES = ("OPENBLAS_NUM_THREADS", "OMP_NUM_THREADS", "MKL_NUM_THREADS")


def one_blas_thread() -> None:
    """Ask numpy's BLAS for one thread unless the user set a count: the command's matrices are small and
    banded, and threads only contend (measured: a case with an imperfect-column analysis ran 2 to 4 times
    slower with the default threads on a busy 2-core machine).  Takes effect only before numpy is first
    imported, i.e. in a new process; a caller that has already imported numpy keeps its own setting."""
    if "numpy" in sys.modules:
        return
    for name in BLAS_THREAD_VARIABLES:
        os.environ.setdefault(name, "1")


def __getattr__(name: str):
    if name in __all__:
        from . import app

        return getattr(app, name)
    raise AttributeError(f"module 'fea.cli' has no attribute {name!r}")
