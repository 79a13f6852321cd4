"""Writing files completely or not at all, one file or several together."""

from __future__ import annotations

import os
import tempfile
from pathlib import Path
from typing import Callable, Union

__all__ = ["write_atomic", "write_all", "creation_mode", "Data"]

#: What a file is made of: text (written as UTF-8), bytes, or a function that writes the file whose
#: name it is given (a figure's ``savefig``).
Data = Union[str, bytes, Callable[[str], None]]


def creation_mode() -> int:
    """The mode a new regular file gets under the process's umask (``0o666 & ~umask``)."""
    mask = os.umask(0o022)
    os.umask(mask)
    return 0o666 & ~mask


def _folder(target: Path) -> Path:
    return target.parent if str(target.parent) else Path(".")


def _write_temp(target: Path, data: Data, mode: int) -> str:
    """``data`` in a new hidden temporary file beside ``target``, with ``mode``; its name."""
    fd, tmp = tempfile.mkstemp(prefix=f".{target.stem}-", suffix=target.suffix, dir=str(_folder(target)))
    try:
        if callable(data):
            os.close(fd)
            data(tmp)
        else:
            with os.fdopen(fd, "wb") as fh:
                fh.write(data.encode("utf-8") if isinstance(data, str) else data)
        os.chmod(tmp, mode)  # mkstemp creates 0600; the final file follows the umask like any other
    except BaseException:
        Path(tmp).unlink(missing_ok=True)
        raise
    return tmp


def write_all(items: list[tuple[Path, Data]]) -> list[Path]:
    """Write every ``(path, data)`` to a temporary file in its folder, then move them all into place.

    Nothing is moved until every temporary file is complete, so an error or an
    interrupt while writing leaves every target as it was and no temporary file
    behind.  An existing target that is not a regular file is never replaced.
    """
    mode = creation_mode()
    temps: list[str] = []
    try:
        for path, data in items:
            temps.append(_write_temp(Path(path), data, mode))
        for path, _ in items:
            if os.path.lexists(path) and not os.path.isfile(path):
                raise IsADirectoryError(f"{path} exists and is not a regular file")
        for (path, _), tmp in zip(items, temps):
            os.replace(tmp, path)
    finally:
        for tmp in temps:
            Path(tmp).unlink(missing_ok=True)
    return [Path(p) for p, _ in items]


def write_atomic(path: str | Path, data: Data) -> Path:
    """Write ``data`` to ``path`` through a temporary file in the same folder and a rename.

    ``data`` is text (written as UTF-8), bytes, or a function that writes the
    temporary file whose name it is given (a figure's ``savefig``).  On any
    error the temporary file is removed and the target is left as it was.  The
    file gets the mode the umask gives new files.
    """
    return write_all([(Path(path), data)])[0]
