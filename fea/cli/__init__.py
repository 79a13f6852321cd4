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

import sys

__all__ = ["main", "build_parser", "SUBCOMMANDS", "EXIT_OK", "EXIT_FAILED_CHECK", "EXIT_BAD_INPUT", "EXIT_INTERNAL"]


def main(argv: list[str] | None = None) -> int:
    """Run the command with ``argv`` (default: the process's arguments); the exit status."""
    try:
        from .app import main as run_command

        return run_command(argv)
    except KeyboardInterrupt:
        print("stanchion: interrupted", file=sys.stderr)
        return 130


def __getattr__(name: str):
    if name in __all__:
        from . import app

        return getattr(app, name)
    raise AttributeError(f"module 'fea.cli' has no attribute {name!r}")
