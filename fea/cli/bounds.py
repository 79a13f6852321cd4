"""``stanchion bounds CASE``: the lowest and highest load factor and K over ranges of uncertain springs."""

from __future__ import annotations

import argparse

from ..errors import FeaError
from .study_common import add_common

NAME = "bounds"
HELP = "lowest and highest load factor and K over ranges of uncertain springs"


def add_arguments(p: argparse.ArgumentParser) -> None:
    add_common(p)
    p.add_argument("--spring", nargs=3, action="append", metavar=("KEY", "LOW", "HIGH"), default=[],
                   help="an uncertain spring and its range, e.g. restraint[1].rotation '2 MN*m/rad' "
                        "'10 MN*m/rad'; repeat for more. Default: the case's [[study.bounds.spring]]")


def run(args: argparse.Namespace) -> int:
    from ..io.study_output import bounds_dict, bounds_lines
    from ..study.paths import parse_key
    from ..study.run import case_bounds
    from ..version import version
    from .study_common import case_load_factors, finish, load_study, plan_outputs

    study, spec = load_study(args)
    plan = plan_outputs(args)
    if args.spring:
        ranges = []
        for k, lo, hi in args.spring:
            key = parse_key(k)
            a, b = key.parse_value(lo, f"{key.text} (low)"), key.parse_value(hi, f"{key.text} (high)")
            if not a <= b:
                raise FeaError(f"--spring {key.text}: low must not exceed high")
            ranges.append((key.text, a, b))
    elif spec.bounds:
        ranges = [(b.key, b.low, b.high) for b in spec.bounds]
    else:
        raise FeaError("no uncertain spring: give --spring KEY LOW HIGH or [[study.bounds.spring]] in the case")
    cb = case_bounds(study, ranges)
    lams = case_load_factors(study)
    return finish(args, plan, bounds_dict(study, cb, version(), lams), lambda: bounds_lines(study, cb, lams))
