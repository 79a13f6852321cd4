"""``stanchion report CASE``: write the calculation record of a case (HTML, optionally Markdown).

Everything is computed before anything is written, and every file is written
atomically, so an error leaves no half-written report behind.
"""

from __future__ import annotations

import argparse
import dataclasses
import datetime
import warnings
from pathlib import Path

from ..errors import FeaError
from .common import EXIT_FAILED_CHECK, EXIT_OK
from .outputs import OutputPlan, add_no_clobber

NAME = "report"
HELP = "write the calculation record of a case: one self-contained HTML file, optionally Markdown"


def _date(text: str) -> str:
    try:
        return datetime.date.fromisoformat(text).isoformat()
    except ValueError:
        raise argparse.ArgumentTypeError(f"expected a date as YYYY-MM-DD, got {text!r}") from None


def add_arguments(p: argparse.ArgumentParser) -> None:
    p.add_argument("case", help="case file (TOML), see cases/README.md")
    p.add_argument("-o", "--output", metavar="FILE.html",
                   help="where to write the HTML record (default: the case file's name with .html, in the "
                        "current folder)")
    p.add_argument("--markdown", metavar="FILE.md",
                   help="also write the record as Markdown, with its figures as SVG files beside it "
                        "(FILE-sketch.svg, FILE-modes.svg, ...)")
    p.add_argument("--units", metavar="FORCE,LENGTH",
                   help="display units, e.g. 'kN,m' or 'N,mm' (default: the case's [units], else kN,m)")
    p.add_argument("--modes", type=int, metavar="N", help="number of modes (default: the case's, else 3)")
    p.add_argument("--only-buckling", action="store_true",
                   help="leave out the optional analyses the case declares (imperfection, design)")
    p.add_argument("--date", type=_date, metavar="YYYY-MM-DD",
                   help="date printed on the record (default: the case's [record] date, else today)")
    fields = p.add_argument_group("identification of the record",
                                  "printed at the head of the record; each overrides the same field of the "
                                  "case's [record] table")
    for option, dest, what in _RECORD_OPTIONS:
        fields.add_argument(option, dest=dest, type=_field(option), metavar="TEXT", help=what)
    p.add_argument("--no-case-file", action="store_true",
                   help="leave out the appendix that prints the case file verbatim")
    add_no_clobber(p)


#: Options of the identification fields: (option, field of [record], help).
_RECORD_OPTIONS = (("--project", "project", "project name"), ("--job", "job", "job number"),
                   ("--prepared-by", "prepared_by", "who prepared the calculation"),
                   ("--checked-by", "checked_by", "who checked it"), ("--revision", "revision", "revision"))


def _field(option: str):
    def check(text: str) -> str:
        from ..errors import CaseError
        from ..io.record_input import record_text

        try:
            return record_text(text, option)
        except CaseError as exc:
            raise argparse.ArgumentTypeError(f"{exc.message}, got {text[:40]!r}") from None

    return check


def _display(text: str):
    from ..units import DisplayUnits

    parts = [s.strip() for s in text.split(",")]
    if len(parts) != 2:
        raise FeaError(f"--units: expected FORCE,LENGTH such as 'kN,m' or 'N,mm', got {text!r}")
    try:
        return DisplayUnits.from_names(length=parts[1], force=parts[0])
    except FeaError as exc:
        raise FeaError(f"--units: {text!r}: {exc}") from None


def _check_target(plan: OutputPlan, path: Path, suffix: str, option: str) -> None:
    if path.suffix.lower() != suffix:
        raise FeaError(f"{option}: {str(path)!r} should end in {suffix}")
    plan.check(path, option)


def run(args: argparse.Namespace) -> int:
    from ..io.limits import MAX_CASE_BYTES, read_limited
    from ..pipeline import ANALYSES, REPORT_PARTS, parse_case, run_case
    from ..report import build_markdown, build_report, report_figures

    raw = read_limited(Path(args.case), MAX_CASE_BYTES, "", "case file")
    case = parse_case(raw, source=args.case)  # the text printed in the appendix is the text analysed
    out = Path(args.output) if args.output else Path(Path(args.case).stem + ".html")
    plan = OutputPlan([args.case], no_clobber=args.no_clobber)
    _check_target(plan, out, ".html", "-o")
    md = Path(args.markdown) if args.markdown else None
    if md is not None:
        _check_target(plan, md, ".md", "--markdown")
    if args.modes is not None and not 1 <= args.modes <= 50:
        raise FeaError(f"--modes: expected a whole number from 1 to 50, got {args.modes}")
    if args.units:
        case = dataclasses.replace(case, display=_display(args.units))
    skip = tuple(a.name for a in ANALYSES) if args.only_buckling else ()
    with warnings.catch_warnings(record=True) as caught:
        warnings.simplefilter("always")
        res = run_case(case, n_modes=args.modes, skip=skip)
    raised = list(dict.fromkeys(f"{w.category.__name__}: {w.message}" for w in caught))
    figures = report_figures(res)
    record = {dest: getattr(args, dest) for _, dest, _ in _RECORD_OPTIONS if getattr(args, dest)}
    text = None if args.no_case_file else raw.decode("utf-8").removeprefix("\ufeff")
    common = dict(parts=REPORT_PARTS, warnings=raised, date=args.date, record=record, case_text=text)
    html_text = build_report(res, figures=figures, **common)
    if md is not None:
        links = {name: f"{md.stem}-{name}.svg" for name in figures}
        for name, svg in figures.items():
            plan.add(md.with_name(links[name]), _standalone_svg(svg), "--markdown")
        plan.add(md, build_markdown(res, figures=figures, figure_files=links, **common), "--markdown")
    plan.add(out, html_text, "-o")
    plan.write()
    print(f"wrote {out}" + (f" and {md}" if md is not None else ""))
    from ..io.run_warnings import fails_run, run_notices

    design = res.extras.get("design")
    ok = (design is None or design.verdict == "passes") and not fails_run(run_notices(res))
    return EXIT_OK if ok else EXIT_FAILED_CHECK


def _standalone_svg(svg: str) -> str:
    """An inline SVG element as a file of its own."""
    return '<?xml version="1.0" encoding="utf-8"?>\n' + svg + "\n"
