"""Re-capture the golden outputs of every demo case (run from the repository root).

The golden files pin the JSON contract and every command's text output across
internal restructuring: ``tests/test_golden.py`` compares a fresh run with them
key by key (numbers to 1e-12 relative).  Re-capture only for an intended change
of output, and say so in the commit message.

    python tests/golden/capture.py
"""

from __future__ import annotations

import contextlib
import io
import json
import os
import sys
from pathlib import Path

ROOT = Path(__file__).resolve().parents[2]
sys.path.insert(0, str(ROOT))
# one BLAS thread, as the tests run (tests/conftest.py): the summation order, and so the last digits, match
for _var in ("OPENBLAS_NUM_THREADS", "OMP_NUM_THREADS", "MKL_NUM_THREADS"):
    os.environ.setdefault(_var, "1")

from tests.golden.commands import COMMANDS  # noqa: E402


def run(argv: list[str]) -> tuple[int, str, str]:
    """Run the command in-process from the repository root: exit status, standard output and error."""
    import os

    from fea.cli import main

    out, err = io.StringIO(), io.StringIO()
    here = os.getcwd()
    os.chdir(ROOT)
    try:
        with contextlib.redirect_stdout(out), contextlib.redirect_stderr(err):
            code = main(argv)
    finally:
        os.chdir(here)
    return code, out.getvalue(), err.getvalue()


def main() -> None:
    import matplotlib

    matplotlib.use("Agg")
    out = {}
    for name, argv in COMMANDS.items():
        code, text, err = run(argv)
        out[name] = {"argv": argv, "exit": code, "stdout": text, "stderr": err}
        print(name, code)
    (ROOT / "tests" / "golden" / "outputs.json").write_text(json.dumps(out, indent=1) + "\n", encoding="utf-8")


if __name__ == "__main__":
    main()
