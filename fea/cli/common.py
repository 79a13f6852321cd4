"""What every subcommand shares: exit statuses, the one-line argument errors, display-unit options."""

from __future__ import annotations

import argparse

from ..errors import FeaError

__all__ = ["EXIT_OK", "EXIT_FAILED_CHECK", "EXIT_BAD_INPUT", "EXIT_INTERNAL", "EXIT_BROKEN_PIPE", "Parser",
           "units_argument"]

EXIT_OK, EXIT_FAILED_CHECK, EXIT_BAD_INPUT, EXIT_INTERNAL = 0, 1, 2, 3
#: The reader of standard output stopped reading (128 + SIGPIPE).
EXIT_BROKEN_PIPE = 141


class Parser(argparse.ArgumentParser):
    """An argument parser whose errors are one line and exit status 2."""

    def error(self, message: str) -> None:  # type: ignore[override]
        self.exit(EXIT_BAD_INPUT, f"{self.prog}: error: {message}\n")


def units_argument(text: str):
    """``--units FORCE,LENGTH`` -> :class:`~fea.units.DisplayUnits` (an argparse type)."""
    from ..units import DisplayUnits

    parts = [p.strip() for p in text.split(",")]
    if len(parts) != 2:
        raise argparse.ArgumentTypeError(f"expected FORCE,LENGTH such as 'kN,m' or 'N,mm', got {text!r}")
    try:
        return DisplayUnits.from_names(length=parts[1], force=parts[0])
    except FeaError as exc:
        raise argparse.ArgumentTypeError(f"{text!r}: {exc}") from None
