"""What the restraint-study commands (sweep, brace, sensitivity, bounds) share.

Reading the case into a :class:`~fea.study.target.StudyCase` with the function
that rebuilds it from a changed document, the lowest load factor of the case
as given (a study exits 1 when it is below 1), the shared options, the
progress bar, and writing and printing the outputs.
"""

from __future__ import annotations

import argparse
import json
import sys
import time
from typing import TYPE_CHECKING, Callable

from ..errors import FeaError
from .common import EXIT_FAILED_CHECK, EXIT_OK
from .outputs import OutputPlan, add_no_clobber, check_plot, figure_writer

if TYPE_CHECKING:
    from ..model.case import Case
    from ..study.spec import StudySpec
    from ..study.target import StudyCase

__all__ = ["rebuild_case", "study_from_text", "load_study", "add_common", "check_plot", "jobs", "Progress",
           "finish", "plan_outputs", "case_load_factors"]


def rebuild_case(document: dict) -> Case:
    """A case document (plain data) -> the parsed case, with every table of the pipeline.

    Module-level so that the worker processes of a sweep can receive it.
    """
    from ..pipeline import rebuild_case as rebuild

    return rebuild(document)


def study_from_text(text: str, source: str = "") -> StudyCase:
    """A study case from case-file text."""
    from ..pipeline import parse_case
    from ..study.target import StudyCase

    return StudyCase(parse_case(text, source=source), rebuild_case)


def load_study(args: argparse.Namespace) -> tuple[StudyCase, StudySpec]:
    """The study case of ``args.case`` and its ``[study]`` settings (defaults when absent)."""
    from ..pipeline import load_case
    from ..study.spec import StudySpec
    from ..study.target import StudyCase

    case = load_case(args.case)
    return StudyCase(case, rebuild_case), case.extras.get("study") or StudySpec()


def case_load_factors(study: StudyCase) -> dict[str, float | None]:
    """The lowest load factor of every plane of the case as given.

    A plane that is a mechanism, or that its permanent loads alone buckle, has 0 (as a sweep point has);
    a plane that cannot be solved for another reason has None (the study itself says why, or fails).
    """
    from ..errors import ModelError
    from ..solve.eigen import buckling

    out: dict[str, float | None] = {}
    for axis, col in study.case.planes:
        try:
            out[axis] = buckling(col, n_modes=1, tol=study.case.tolerance, axis=axis).load_factor
        except ModelError as exc:
            out[axis] = 0.0 if exc.field == "restraints" or "permanent loads alone" in exc.message else None
        except FeaError:
            out[axis] = None
    return out


def add_common(p: argparse.ArgumentParser, csv: bool = False, plot: bool = False) -> None:
    """The case argument and the output options of a study command."""
    p.add_argument("case", help="case file (TOML); may declare a [study] table (docs/studies.md)")
    p.add_argument("--json", nargs="?", const="-", metavar="FILE",
                   help="write the JSON result (SI) to FILE, or to standard output instead of the summary")
    if csv:
        p.add_argument("--csv", metavar="FILE", help="write the table (SI, units in the header) to FILE")
    if plot:
        p.add_argument("--plot", metavar="FILE", action="append", default=[],
                       help="draw the chart to FILE (.png, .svg or .pdf); may be repeated")
    add_no_clobber(p)


def plan_outputs(args: argparse.Namespace) -> OutputPlan:
    """Every output file of the command checked, before the study runs."""
    plan = OutputPlan([args.case], no_clobber=args.no_clobber)
    if getattr(args, "json", None) and args.json != "-":
        plan.check(args.json, "--json")
    if getattr(args, "csv", None):
        plan.check(args.csv, "--csv")
    for f in getattr(args, "plot", None) or []:
        plan.check(f, "--plot")
    return plan


def jobs(args: argparse.Namespace, spec: StudySpec) -> int:
    """Worker processes: ``--jobs``, else the case's ``study.jobs``, else every CPU."""
    from ..study.sweep import default_jobs

    j = args.jobs if getattr(args, "jobs", None) else (spec.jobs or default_jobs())
    if j < 1:
        raise FeaError(f"--jobs: expected a whole number >= 1, got {j}")
    return j


class Progress:
    """A one-line progress bar on standard error, drawn only when it is a terminal."""

    def __init__(self, label: str) -> None:
        self.label = label
        self.on = sys.stderr.isatty()
        self.t0 = time.perf_counter()

    def __call__(self, done: int, total: int) -> None:
        if not self.on or total <= 0:
            return
        w = 30
        f = done / total
        sys.stderr.write(f"\r{self.label} [{'#' * int(w * f):<{w}}] {done}/{total} "
                         f"{time.perf_counter() - self.t0:5.1f} s")
        if done >= total:
            sys.stderr.write("\n")
        sys.stderr.flush()


def finish(args: argparse.Namespace, plan: OutputPlan, data: dict, lines: Callable[[], list[str]],
           csv: str | None = None, figure=None) -> int:
    """Write the JSON (and CSV, and the chart to every ``--plot`` file) all together, then print the JSON or
    the summary.

    Exit status 1 when the JSON carries a run warning of level "warning" (the case as given buckles under
    its case loads); points of the study's range below load factor 1 are marked but leave it at 0.
    """
    if getattr(args, "json", None) and args.json != "-":
        plan.add(args.json, json.dumps(data, indent=1, allow_nan=False) + "\n", "--json")
    if csv is not None and getattr(args, "csv", None):
        plan.add(args.csv, csv, "--csv")
    for f in getattr(args, "plot", None) or []:
        plan.add(f, figure_writer(figure), "--plot")
    plan.write()
    status = EXIT_FAILED_CHECK if any(w.get("level") == "warning" for w in data.get("warnings", ())) else EXIT_OK
    if args.json == "-":
        print(json.dumps(data, indent=1, allow_nan=False))
        return status
    for line in lines():
        print(line)
    return status
