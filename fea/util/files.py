"""Writing files completely or not at all."""

from __future__ import annotations

import os
import tempfile
from pathlib import Path
from typing import Callable

__all__ = ["write_atomic"]


def write_atomic(path: str | Path, data: str | bytes | Callable[[str], None]) -> Path:
    """Write ``data`` to ``path`` through a temporary file in the same folder and a rename.

    ``data`` is text (written as UTF-8), bytes, or a function that writes the
    temporary file whose name it is given (a figure's ``savefig``).  On any
    error the temporary file is removed and the target is left as it was.
    """
    target = Path(path)
    folder = target.parent if str(target.parent) else Path(".")
    fd, tmp = tempfile.mkstemp(prefix=f".{target.stem}-", suffix=target.suffix, dir=str(folder))
    try:
        if callable(data):
            os.close(fd)
            data(tmp)
        else:
            with os.fdopen(fd, "wb") as fh:
                fh.write(data.encode("utf-8") if isinstance(data, str) else data)
        os.replace(tmp, target)
    except BaseException:
        Path(tmp).unlink(missing_ok=True)
        raise
    return target
