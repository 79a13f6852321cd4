"""The ``stanchion`` command (also ``python -m fea``)."""

from __future__ import annotations

import argparse
import sys

from . import __version__


def main(argv: list[str] | None = None) -> int:
    parser = argparse.ArgumentParser(
        prog="stanchion",
        description="Buckling and design checks of single compression members with partial restraints.",
    )
    parser.add_argument("--version", action="version", version=f"stanchion {__version__}")
    parser.parse_args(argv)
    parser.print_help()
    return 0


if __name__ == "__main__":  # pragma: no cover
    sys.exit(main())
