"""Interrupts and worker processes (issue 11, item 6), with real processes, each bounded in time.

Ctrl-C at any moment gives one line and exit status 130; an interrupted parallel sweep stops at once and
leaves no worker behind; workers whose parent is killed end by themselves.  Processes are found through
/proc (Linux), without any extra package.
"""

from __future__ import annotations

import os
import signal
import subprocess
import sys
import textwrap
import time
from pathlib import Path

import pytest

from tests.conftest import ROOT

pytestmark = pytest.mark.skipif(not Path("/proc/self/stat").exists(), reason="needs /proc (Linux)")

#: A sweep long enough (minutes) to be interrupted in the middle: 60 x 60 points, each solved again.
LONG_SWEEP = [sys.executable, "-m", "fea", "sweep", "cases/study_fixity_chart.toml", "--method", "re-solve",
              "--points", "60", "--jobs", "2"]


def _stat(pid: int) -> tuple[str, int] | None:
    """(state, parent id) of a process, or None when it is gone."""
    try:
        text = Path(f"/proc/{pid}/stat").read_text()
    except (FileNotFoundError, ProcessLookupError):
        return None
    fields = text[text.rindex(")") + 2:].split()
    return fields[0], int(fields[1])


def _alive(pid: int) -> bool:
    st = _stat(pid)
    return st is not None and st[0] not in ("Z", "X")  # a zombie has ended; only its entry is left


def _children(pid: int) -> list[int]:
    out = []
    for d in os.listdir("/proc"):
        if d.isdigit():
            st = _stat(int(d))
            if st is not None and st[1] == pid and st[0] not in ("Z", "X"):
                out.append(int(d))
    return out


def _wait_for(cond, timeout: float, step: float = 0.05) -> bool:
    end = time.monotonic() + timeout
    while time.monotonic() < end:
        if cond():
            return True
        time.sleep(step)
    return cond()


def _start(args: list[str]) -> subprocess.Popen:
    # a session of its own, as a terminal's foreground job: Ctrl-C reaches every process of the group
    return subprocess.Popen(args, cwd=ROOT, stdout=subprocess.PIPE, stderr=subprocess.PIPE, text=True,
                            start_new_session=True)


def _workers(p: subprocess.Popen, n: int = 2) -> list[int]:
    assert _wait_for(lambda: len(_children(p.pid)) >= n, 30), "the sweep started no workers"
    return _children(p.pid)


def _reap(p: subprocess.Popen, pids: list[int]) -> None:
    """Leave nothing running whatever the test's outcome."""
    for pid in [p.pid, *pids]:
        try:
            os.kill(pid, signal.SIGKILL)
        except ProcessLookupError:
            pass
    p.communicate(timeout=10)


@pytest.mark.parametrize("module", ["fea.cli.app", "numpy"])
def test_ctrl_c_during_the_first_imports_is_one_line_and_130(module):
    # SIGINT arrives exactly while `module` is first imported (the heavy imports of the command)
    code = textwrap.dedent(f"""
        import os, signal, sys

        class Interrupt:
            def find_spec(self, name, path=None, target=None):
                if name == {module!r}:
                    sys.meta_path.remove(self)
                    os.kill(os.getpid(), signal.SIGINT)
                return None

        sys.meta_path.insert(0, Interrupt())
        from fea.cli import main
        sys.exit(main(["check", "cases/shed_column.toml"]))
        """)
    run = subprocess.run([sys.executable, "-c", code], cwd=ROOT, capture_output=True, text=True, timeout=60)
    assert (run.returncode, run.stderr) == (130, "stanchion: interrupted\n"), run.stderr


def test_ctrl_c_mid_run_stops_a_parallel_sweep_at_once_without_workers_left():
    p = _start(LONG_SWEEP)
    workers: list[int] = []
    try:
        workers = _workers(p)
        time.sleep(0.5)
        os.killpg(p.pid, signal.SIGINT)  # what Ctrl-C in a terminal does
        t0 = time.monotonic()
        _out, err = p.communicate(timeout=15)
        assert time.monotonic() - t0 < 5
        assert (p.returncode, err) == (130, "stanchion: interrupted\n"), err
        assert _wait_for(lambda: not any(_alive(w) for w in workers), 5), "a worker outlived the sweep"
    finally:
        if p.returncode is None:
            _reap(p, workers)


def test_workers_end_when_the_main_process_is_killed():
    p = _start(LONG_SWEEP)
    workers: list[int] = []
    try:
        workers = _workers(p)
        p.kill()  # SIGKILL: the main process can clean nothing up
        p.communicate(timeout=10)
        # the workers notice within a second (parent-death signal, or their watcher thread); the bound leaves
        # room for a loaded machine
        assert _wait_for(lambda: not any(_alive(w) for w in workers), 15), "workers ran on after the parent died"
    finally:
        _reap(p, workers)


def test_a_reader_that_stops_reading_ends_the_run_quietly_with_141():
    # `stanchion check ... --json | head`: the JSON of the crooked post (about 0.5 MB) overfills the pipe
    p = subprocess.Popen([sys.executable, "-m", "fea", "check", "cases/crooked_post.toml", "--json"], cwd=ROOT,
                         stdout=subprocess.PIPE, stderr=subprocess.PIPE)
    try:
        assert p.stdout is not None and p.stdout.read(100)
        p.stdout.close()  # the reader goes away
        err = p.stderr.read() if p.stderr is not None else b""
        assert p.wait(timeout=60) == 141
        assert err == b"", err  # no traceback, no "internal error"
    finally:
        if p.poll() is None:
            p.kill()
