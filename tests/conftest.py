"""Shared fixtures and helpers for the test-suite."""

from __future__ import annotations

import contextlib
import io
import logging
import math
import os
import sys
import traceback
import warnings
from dataclasses import dataclass
from pathlib import Path

import pytest

os.environ.setdefault("MPLBACKEND", "Agg")
# The suite runs in parallel workers (``-n`` in pyproject.toml), one per core: one BLAS thread each keeps the
# workers from oversubscribing the cores.  Set before numpy is first imported.
for _var in ("OPENBLAS_NUM_THREADS", "OMP_NUM_THREADS", "MKL_NUM_THREADS"):
    os.environ.setdefault(_var, "1")

from fea import RIGID, Column, PointLoad, Restraint, Segment  # noqa: E402

ROOT = Path(__file__).resolve().parents[1]

#: Demo steel column used across tests (invented values, for tests only).
E_STEEL = 210e9
I_DEMO = 8.0e-6
L_DEMO = 4.0


def euler_load(E: float, I: float, L: float) -> float:
    """P_e = pi^2 E I / L^2 (Euler, 1744; Timoshenko & Gere, Theory of Elastic Stability, eq. 2-3)."""
    return math.pi**2 * E * I / L**2


def one_segment(L=L_DEMO, E=E_STEEL, I=I_DEMO, base=(RIGID, 0.0), top=(RIGID, 0.0), P=1.0, **kw) -> Column:
    """Uniform column with (lateral, rotation) springs at base and top and a load P at the top."""
    return Column(
        segments=(Segment(L, E, I, **kw),),
        restraints=(Restraint(0.0, *base), Restraint(L, *top)),
        point_loads=(PointLoad(L, P),),
    )


@pytest.fixture
def pinned_column() -> Column:
    return one_segment()


# -- the command, run in this interpreter ----------------------------------------------------------

@dataclass(frozen=True)
class Run:
    """What a run of the command gave: the fields of ``subprocess.CompletedProcess`` the tests read."""

    returncode: int
    stdout: str
    stderr: str


def run_cli(*args: str, cwd: Path | str = ROOT) -> Run:
    """Run ``stanchion ARGS`` through ``fea.cli.main`` in this interpreter, as a new process would.

    About six times faster than a new interpreter per run.  What a process gives for free is
    reproduced: the working folder is ``cwd``; standard output and error are captured; logging
    starts unconfigured, so the command's own set-up sends it to the captured error stream;
    warnings are written there too; ``SystemExit`` (argparse's ``--help``, ``--version`` and
    usage errors) gives the exit status; an escaping exception prints its traceback and gives
    status 1, as the interpreter does; figures left open are closed, as at process exit.
    A handful of tests still start a real process (tests/test_cli.py, ``test_real_process_*``).
    """
    from fea.cli import main

    out, err = io.StringIO(), io.StringIO()
    root = logging.getLogger()
    saved_handlers, saved_level = root.handlers[:], root.level
    here = os.getcwd()
    code: object = 0
    try:
        os.chdir(cwd)
        root.handlers.clear()
        with contextlib.redirect_stdout(out), contextlib.redirect_stderr(err), warnings.catch_warnings():
            warnings.simplefilter("default")
            warnings.showwarning = _warning_to_stderr
            try:
                code = main(list(args))
            except SystemExit as exc:
                code = exc.code
            except Exception:
                traceback.print_exc(file=sys.stderr)
                code = 1
    finally:
        for h in root.handlers:
            if h not in saved_handlers:
                h.close()
        root.handlers[:] = saved_handlers
        root.setLevel(saved_level)
        os.chdir(here)
        if "matplotlib.pyplot" in sys.modules:
            sys.modules["matplotlib.pyplot"].close("all")
    if code is None:
        code = 0
    elif not isinstance(code, int):  # sys.exit("message"): the message goes to standard error, status 1
        err.write(f"{code}\n")
        code = 1
    return Run(code, out.getvalue(), err.getvalue())


def _warning_to_stderr(message, category, filename, lineno, file=None, line=None) -> None:
    sys.stderr.write(warnings.formatwarning(message, category, filename, lineno, line))
