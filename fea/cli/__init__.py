"""The ``stanchion`` command (also ``python -m fea``).

The only module that prints or exits.  Exit status: 0 success, 1 a design
check failed, 2 bad input (one line, no traceback unless ``--debug``),
3 an internal error.
"""

from __future__ import annotations

import argparse
import logging
import sys
import time
from pathlib import Path

from .. import __version__
from ..cautions import CAUTION
from ..errors import FeaError

EXIT_OK, EXIT_FAILED_CHECK, EXIT_BAD_INPUT, EXIT_INTERNAL = 0, 1, 2, 3

#: Subcommands added by later analyses: name -> (help, add_arguments(parser), run(args) -> int).
COMMANDS: dict = {}


class _Parser(argparse.ArgumentParser):
    def error(self, message: str) -> None:  # one line, exit 2
        self.exit(EXIT_BAD_INPUT, f"{self.prog}: error: {message}\n")


def _units(text: str):
    from ..units import DisplayUnits

    parts = [p.strip() for p in text.split(",")]
    if len(parts) != 2:
        raise argparse.ArgumentTypeError(f"expected FORCE,LENGTH such as 'kN,m' or 'N,mm', got {text!r}")
    try:
        return DisplayUnits.from_names(length=parts[1], force=parts[0])
    except FeaError as exc:
        raise argparse.ArgumentTypeError(f"{text!r}: {exc}") from None


def build_parser() -> argparse.ArgumentParser:
    from ..extensions import load as _load_extensions

    _load_extensions()
    p = _Parser(
        prog="stanchion",
        description="Buckling and design checks of single compression members: partial end fixity, steps and "
                    "tapers, braces of finite stiffness, loads at several heights. " + CAUTION,
    )
    p.add_argument("--version", action="version", version=f"stanchion {__version__}")
    p.add_argument("--debug", action="store_true", help="show tracebacks and debug logging")
    sub = p.add_subparsers(dest="command", metavar="COMMAND", parser_class=_Parser)

    c = sub.add_parser("check", help="analyse a case file and print a summary",
                       description="Analyse a case file: elastic critical load factors, mode shapes and the "
                                   "effective-length factor of every segment about each axis, plus any "
                                   "analysis the case declares.")
    c.add_argument("case", help="case file (TOML), see cases/README.md")
    c.add_argument("--json", nargs="?", const="-", metavar="FILE",
                   help="write the JSON result to FILE, or to standard output instead of the summary")
    c.add_argument("--plot", metavar="FILE", action="append", default=[],
                   help="draw the mode shapes to FILE (.png, .svg or .pdf; may be repeated); the figures of an "
                        "imperfect-column analysis or a design check go beside it as FILE-<name>")
    c.add_argument("--units", type=_units, metavar="FORCE,LENGTH",
                   help="display units, e.g. 'kN,m' or 'N,mm' (default: the case's [units], else kN,m)")
    c.add_argument("--modes", type=int, metavar="N", help="number of modes (default: the case's, else 3)")
    c.add_argument("--only-buckling", action="store_true",
                   help="skip the optional analyses the case declares (imperfection, design)")
    c.add_argument("--debug", action="store_true", default=argparse.SUPPRESS, help=argparse.SUPPRESS)

    i = sub.add_parser("init", help="write a commented case-file template",
                       description="Write a commented template case file to start from.")
    i.add_argument("file", help="where to write the template (.toml)")
    i.add_argument("--force", action="store_true", help="overwrite an existing file")
    i.add_argument("--debug", action="store_true", default=argparse.SUPPRESS, help=argparse.SUPPRESS)

    for name, (help_text, add_args, _run) in COMMANDS.items():
        sp = sub.add_parser(name, help=help_text, description=help_text)
        add_args(sp)
        sp.add_argument("--debug", action="store_true", default=argparse.SUPPRESS, help=argparse.SUPPRESS)
    return p


def _cmd_check(args: argparse.Namespace) -> int:
    from ..io.case import load_case
    import json

    from ..io.export import result_dict, write_text_atomic
    from ..io.summary import summary_lines
    from ..pipeline import run_case

    t0 = time.perf_counter()
    case = load_case(args.case)
    if args.modes is not None and not 1 <= args.modes <= 50:
        raise FeaError(f"--modes: expected a whole number from 1 to 50, got {args.modes}")
    for f in args.plot:
        if Path(f).suffix.lower() not in (".png", ".svg", ".pdf"):
            raise FeaError(f"--plot: {f!r} has no known extension: expected .png, .svg or .pdf")
    skip = ("imperfect", "design") if args.only_buckling else ()
    res = run_case(case, n_modes=args.modes, skip=skip)
    display = args.units or case.display
    # everything is computed before anything is written
    figures = []
    if args.plot:
        from ..plot import plot_planes

        planes = [(r.axis, case.column(r.axis), r) for r in res.buckling]
        fig = plot_planes(planes, n_modes=min(3, max(len(r.load_factors) for r in res.buckling)),
                          length_unit=(display.length, display.length_si),
                          force_unit=(display.force, display.force_si), title=case.title)
        figures.append(fig)
        from ..plot.extras import extra_figures

        extra = extra_figures(res.extras, length_unit=(display.length, display.length_si),
                              force_unit=(display.force, display.force_si),
                              stress_unit=(display.stress, display.stress_si), fy=case.fy)
    else:
        extra = {}
    data = result_dict(res)
    text = json.dumps(data, indent=2, allow_nan=False) if args.json else None
    if args.json and args.json != "-":
        write_text_atomic(args.json, text + "\n")
    for f in args.plot:
        from ..plot import save_figure

        save_figure(figures[0], f)
        p = Path(f)
        for name, fig in extra.items():
            save_figure(fig, p.with_name(f"{p.stem}-{name}{p.suffix}"))
    if args.json == "-":
        print(text)
    else:
        for line in summary_lines(res, display):
            print(line)
        logging.getLogger(__name__).debug("check took %.3f s", time.perf_counter() - t0)
    status = data.get("design", {}).get("passed", True)
    return EXIT_OK if status else EXIT_FAILED_CHECK


def _cmd_init(args: argparse.Namespace) -> int:
    from ..io.export import write_text_atomic
    from ..io.template import TEMPLATE

    p = Path(args.file)
    if p.exists() and not args.force:
        raise FeaError(f"{args.file!r} already exists (use --force to overwrite)")
    if p.suffix.lower() != ".toml":
        raise FeaError(f"{args.file!r}: a case file should end in .toml")
    if not p.parent.exists():
        raise FeaError(f"folder {str(p.parent)!r} does not exist")
    write_text_atomic(p, TEMPLATE)
    print(f"wrote {p}: edit it, then run `stanchion check {p}`")
    return EXIT_OK


def main(argv: list[str] | None = None) -> int:
    parser = build_parser()
    args = parser.parse_args(argv)
    debug = bool(getattr(args, "debug", False))
    logging.basicConfig(level=logging.DEBUG if debug else logging.WARNING, format="%(name)s: %(message)s")
    if args.command is None:
        parser.print_help()
        return EXIT_OK
    try:
        if args.command == "check":
            return _cmd_check(args)
        if args.command == "init":
            return _cmd_init(args)
        return COMMANDS[args.command][2](args)
    except FeaError as exc:
        if debug:
            raise
        where = f"{args.case}: " if getattr(args, "case", None) else ""
        print(f"stanchion: error: {where}{exc}", file=sys.stderr)
        return EXIT_BAD_INPUT
    except KeyboardInterrupt:  # pragma: no cover
        print("stanchion: interrupted", file=sys.stderr)
        return 130
    except Exception as exc:  # pragma: no cover - a bug, not bad input
        if debug:
            raise
        print(f"stanchion: internal error: {type(exc).__name__}: {exc} (run with --debug for details)",
              file=sys.stderr)
        return EXIT_INTERNAL


if __name__ == "__main__":  # pragma: no cover
    sys.exit(main())
