"""``stanchion sensitivity CASE``: d(load factor)/d(stiffness) of every spring, and which matters most."""

from __future__ import annotations

import argparse

from .study_common import add_common

NAME = "sensitivity"
HELP = "which restraint matters most: d(load factor)/d(stiffness) of every spring"


def add_arguments(p: argparse.ArgumentParser) -> None:
    add_common(p)
    p.add_argument("--no-check", action="store_true", help="skip the finite-difference check")


def run(args: argparse.Namespace) -> int:
    from ..io.study_output import sensitivity_dict, sensitivity_lines
    from ..study.run import case_sensitivities
    from ..version import version
    from .study_common import case_load_factors, finish, load_study, plan_outputs

    study, _spec = load_study(args)
    plan = plan_outputs(args)
    cs = case_sensitivities(study, check=not args.no_check)
    lams = case_load_factors(study)
    return finish(args, plan, sensitivity_dict(study, cs, version(), lams), lambda: sensitivity_lines(study, cs, lams))
