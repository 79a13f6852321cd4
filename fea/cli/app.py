"""The ``stanchion`` command behind :func:`fea.cli.main`: the parser and the dispatch to one module per subcommand.

The only package that prints or sets the exit status.  Exit status: 0 success,
1 a design check failed, 2 bad input (one line, no traceback unless ``--debug``),
3 an internal error.  Each subcommand module has ``NAME``, ``HELP``, optionally
``DESCRIPTION``, ``add_arguments(parser)`` and ``run(args) -> exit status``;
:data:`SUBCOMMANDS` lists them in the order ``--help`` shows them.
"""

from __future__ import annotations

import argparse
import io
import logging
import os
import signal
import sys

from ..cautions import CAUTION
from ..errors import FeaError
from . import batch, bounds, brace, check, explore, init, reliability, report, sensitivity, size, sweep
from .common import EXIT_BAD_INPUT, EXIT_BROKEN_PIPE, EXIT_FAILED_CHECK, EXIT_INTERNAL, EXIT_OK, Parser

__all__ = ["main", "build_parser", "SUBCOMMANDS", "EXIT_OK", "EXIT_FAILED_CHECK", "EXIT_BAD_INPUT", "EXIT_INTERNAL"]


#: Every subcommand, in the order of ``stanchion --help``.
SUBCOMMANDS = (
    check,
    init,
    size,
    report,
    sweep,
    brace,
    sensitivity,
    bounds,
    explore,
    batch,
    reliability,
)


def build_parser() -> argparse.ArgumentParser:
    p = Parser(
        prog="stanchion",
        description="Buckling and design checks of single compression members: partial end fixity, steps and "
                    "tapers, braces of finite stiffness, loads at several heights. " + CAUTION,
    )
    p.add_argument("--version", action=_Version, nargs=0,
                   help="show program's version number and exit")
    p.add_argument("--debug", action="store_true", help="show tracebacks and debug logging")
    sub = p.add_subparsers(dest="command", metavar="COMMAND", parser_class=Parser)
    for cmd in SUBCOMMANDS:
        sp = sub.add_parser(cmd.NAME, help=cmd.HELP, description=getattr(cmd, "DESCRIPTION", cmd.HELP))
        cmd.add_arguments(sp)
        sp.add_argument("--debug", action="store_true", default=argparse.SUPPRESS, help=argparse.SUPPRESS)
    return p


class _Version(argparse.Action):
    """``--version``: the version is looked up only when asked for (start-up time)."""

    def __call__(self, parser, namespace, values, option_string=None) -> None:
        from ..version import version

        print(f"stanchion {version()}")
        parser.exit()


def main(argv: list[str] | None = None) -> int:
    parser = build_parser()
    args = parser.parse_args(argv)
    debug = bool(getattr(args, "debug", False))
    logging.basicConfig(level=logging.DEBUG if debug else logging.WARNING, format="%(name)s: %(message)s")
    if args.command is None:
        parser.print_help()
        return EXIT_OK
    run = next(cmd.run for cmd in SUBCOMMANDS if cmd.NAME == args.command)
    try:
        with _terminate_as_exit():
            return run(args)
    except FeaError as exc:
        if debug:
            raise
        where = f"{args.case}: " if getattr(args, "case", None) else ""
        print(f"stanchion: error: {where}{exc}", file=sys.stderr)
        return EXIT_BAD_INPUT
    except KeyboardInterrupt:
        return interrupted()
    except BrokenPipeError:
        return reader_gone()
    except Exception as exc:  # pragma: no cover - a bug, not bad input
        if debug:
            raise
        print(f"stanchion: internal error: {type(exc).__name__}: {exc} (run with --debug for details)",
              file=sys.stderr)
        return EXIT_INTERNAL


def reader_gone() -> int:
    """The exit status when the reader of standard output stopped reading (``stanchion check ... | head``):
    128 + SIGPIPE, silently, as a program ended by the signal would; files the run wrote are complete."""
    try:  # the interpreter flushes standard output at exit: point it at nothing so that it cannot fail again
        os.dup2(os.open(os.devnull, os.O_WRONLY), sys.stdout.fileno())
    except (OSError, ValueError, io.UnsupportedOperation):
        pass
    return EXIT_BROKEN_PIPE


def interrupted() -> int:
    """The one line and the exit status of a run stopped by Ctrl-C."""
    print("stanchion: interrupted", file=sys.stderr)
    return 130


class _terminate_as_exit:
    """While a subcommand runs, SIGTERM unwinds like an error (temporary files removed, workers stopped) and
    ends the process with status 143, as the default action would."""

    def __enter__(self) -> None:
        self.old = None
        try:
            self.old = signal.signal(signal.SIGTERM, self._exit)
        except ValueError:  # not the main thread: leave the default
            pass

    def __exit__(self, *exc) -> None:
        if self.old is not None:
            signal.signal(signal.SIGTERM, self.old)

    @staticmethod
    def _exit(signum, frame) -> None:
        raise SystemExit(128 + signum)
