"""``stanchion init FILE``: write a commented case-file template to start from."""

from __future__ import annotations

import argparse
import os
from pathlib import Path

from ..errors import FeaError
from .common import EXIT_OK
from .outputs import OutputPlan, add_no_clobber

NAME = "init"
HELP = "write a commented case-file template"
DESCRIPTION = "Write a commented template case file to start from."


def add_arguments(i: argparse.ArgumentParser) -> None:
    i.add_argument("file", help="where to write the template (.toml)")
    i.add_argument("--force", action="store_true", help="overwrite an existing file")
    add_no_clobber(i)


def run(args: argparse.Namespace) -> int:
    from ..io.template import TEMPLATE

    p = Path(args.file)
    if os.path.lexists(p) and os.path.isfile(p) and not args.force and not args.no_clobber:
        raise FeaError(f"{args.file!r} already exists (use --force to overwrite)")
    if p.suffix.lower() != ".toml":
        raise FeaError(f"{args.file!r}: a case file should end in .toml")
    plan = OutputPlan([], no_clobber=args.no_clobber or not args.force)
    plan.add(p, TEMPLATE)
    plan.write()
    print(f"wrote {p}: edit it, then run `stanchion check {p}`")
    return EXIT_OK
