"""Limits on the size of what Stanchion reads, checked before any parsing or solving.

Each limit is stated once here (and listed in ``cases/README.md``); an input over a
limit is refused at once with a one-line message naming the limit.
"""

from __future__ import annotations

import math
from pathlib import Path
from typing import Iterable

from ..errors import CaseError

__all__ = ["MAX_CASE_BYTES", "MAX_CATALOGUE_BYTES", "MAX_CATALOGUE_ROWS", "MAX_SEGMENTS", "MAX_RESTRAINTS",
           "MAX_LOADS", "MAX_FOUNDATIONS", "MAX_OFFSETS", "MAX_SWEEP_POINTS", "MAX_MODES", "COUNTED_TABLES",
           "read_limited", "check_counts", "check_count", "check_sweep_points"]

#: Largest case file [bytes] (the demo cases are a few kilobytes).
MAX_CASE_BYTES = 1_000_000
#: Largest section catalogue [bytes].
MAX_CATALOGUE_BYTES = 2_000_000
#: Most sections (data rows) in a catalogue.
MAX_CATALOGUE_ROWS = 5_000
#: Most [[segment]] tables in a case.
MAX_SEGMENTS = 10_000
#: Most [[restraint]] tables in a case.
MAX_RESTRAINTS = 1_000
#: Most loads of each kind ([[load]], [[distributed_load]], [[leaning]], lateral loads of an imperfect column).
MAX_LOADS = 1_000
#: Most [[foundation]] tables in a case.
MAX_FOUNDATIONS = 1_000
#: Most stations of a measured bow (``imperfection.offsets``).
MAX_OFFSETS = 10_000
#: Most points of a sweep (all parameters together: points of one times points of the other).
MAX_SWEEP_POINTS = 10_000
#: Most buckling modes asked for (``analysis.modes``).
MAX_MODES = 50

#: Array-of-tables keys of a case file -> their limit.
COUNTED_TABLES = {"segment": MAX_SEGMENTS, "restraint": MAX_RESTRAINTS, "load": MAX_LOADS,
                  "distributed_load": MAX_LOADS, "leaning": MAX_LOADS, "foundation": MAX_FOUNDATIONS}


def read_limited(path: Path, limit: int, field: str, what: str) -> bytes:
    """The bytes of the file at ``path``, refused at once if it holds more than ``limit`` bytes.

    Reads at most ``limit + 1`` bytes, so an endless device or pipe cannot tie the tool up.  Errors name the
    file, never its content.
    """
    name = str(path)
    try:
        with open(path, "rb") as fh:
            data = fh.read(limit + 1)
    except FileNotFoundError:
        raise CaseError(field, f"{what} {name!r} does not exist") from None
    except IsADirectoryError:
        raise CaseError(field, f"{name!r} is a folder, not a {what}") from None
    except OSError as exc:
        raise CaseError(field, f"cannot read {what} {name!r}: {exc.strerror or type(exc).__name__}") from None
    if len(data) > limit:
        raise CaseError(field, f"{what} {name!r} is larger than the limit of {limit:,} bytes")
    return data


def check_count(n: int, limit: int, field: str, what: str) -> None:
    """Refuse ``n`` items of ``what`` over ``limit``."""
    if n > limit:
        raise CaseError(field, f"{n:,} {what} is more than the limit of {limit:,}")


def check_counts(doc: dict) -> None:
    """Refuse a case document whose arrays of tables exceed :data:`COUNTED_TABLES`, before any is read."""
    for key, limit in COUNTED_TABLES.items():
        value = doc.get(key)
        if isinstance(value, list):
            check_count(len(value), limit, key, f"[[{key}]] tables")


def check_sweep_points(points: Iterable[int], field: str) -> None:
    """Refuse a sweep whose parameters' points multiply to more than :data:`MAX_SWEEP_POINTS`."""
    check_count(math.prod(points), MAX_SWEEP_POINTS, field, "sweep points")
