"""``stanchion init FILE``: write a commented case-file template to start from."""

from __future__ import annotations

import argparse
from pathlib import Path

from ..errors import FeaError
from .common import EXIT_OK

NAME = "init"
HELP = "write a commented case-file template"
DESCRIPTION = "Write a commented template case file to start from."


def add_arguments(i: argparse.ArgumentParser) -> None:
    i.add_argument("file", help="where to write the template (.toml)")
    i.add_argument("--force", action="store_true", help="overwrite an existing file")


def run(args: argparse.Namespace) -> int:
    from ..io.template import TEMPLATE
    from ..util.files import write_atomic

    p = Path(args.file)
    if p.exists() and not args.force:
        raise FeaError(f"{args.file!r} already exists (use --force to overwrite)")
    if p.suffix.lower() != ".toml":
        raise FeaError(f"{args.file!r}: a case file should end in .toml")
    if not p.parent.exists():
        raise FeaError(f"folder {str(p.parent)!r} does not exist")
    write_atomic(p, TEMPLATE)
    print(f"wrote {p}: edit it, then run `stanchion check {p}`")
    return EXIT_OK
