"""Every command's output on the demo cases is unchanged by internal restructuring.

``tests/golden/outputs.json`` holds the exit status, standard output and
standard error of each command line in ``tests/golden/commands.py``, captured
before the restructuring.  JSON output is compared key by key with numbers to
1e-12 relative; text output line by line, exactly.  Re-capture with
``python tests/golden/capture.py`` only for an intended change of output.
"""

from __future__ import annotations

import json
import math
from pathlib import Path

import pytest

from tests.golden.capture import run
from tests.golden.commands import COMMANDS

GOLDEN = json.loads((Path(__file__).parent / "golden" / "outputs.json").read_text(encoding="utf-8"))
#: Keys whose values may change without changing a result (the tool's version string).
VOLATILE = {("tool", "version")}


def assert_same(new, old, path: str = "$", scale: float = 0.0) -> None:
    """JSON values equal key by key; numbers to 1e-12 relative.

    A number inside a list is compared relative to the largest magnitude in that
    list (a deflected shape's near-zero ordinates carry the round-off of the whole
    shape), and an estimated error (``*_error``, itself a small relative number
    formed as a difference) to 1e-12 absolute: both are the run-to-run round-off
    of the eigen solvers' random start vectors, not a change of result.

    Numbers read from an eigenvector (a segment's share of the mode's energy, the mode shapes) or found by a
    root search on eigenvalues (a sizing scale, a required I) are compared to 1e-9: they are reproducible
    only to about 1e-10 between BLAS thread counts (measured: up to 3e-11 for one thread against two),
    eigenvectors being less well determined than eigenvalues.

    The arrays of the imperfect-column part (deflections and moments near the limit
    load, moments by differentiation) are compared to 1e-9 of their largest value:
    four runs of the unchanged code differed by up to 4e-11 there (threaded BLAS
    summation order), so 1e-12 would test the machine, not the code.
    """
    if isinstance(old, dict):
        assert isinstance(new, dict), path
        assert list(new) == list(old), f"{path}: keys {list(new)} != {list(old)}"
        for k in old:
            if (path.rsplit(".", 1)[-1], k) in VOLATILE:
                continue
            assert_same(new[k], old[k], f"{path}.{k}", _scale_of_key(k, old[k]))
    elif isinstance(old, list):
        assert isinstance(new, list) and len(new) == len(old), f"{path}: length {len(new)} != {len(old)}"
        big = max((abs(v) for v in _numbers(old)), default=0.0) * (1e3 if path.startswith("$.imperfect") else 1.0)
        for i, (a, b) in enumerate(zip(new, old)):
            assert_same(a, b, f"{path}[{i}]", max(scale, big))
    elif isinstance(old, bool) or old is None or isinstance(old, str):
        assert new == old, f"{path}: {new!r} != {old!r}"
    else:
        assert isinstance(new, (int, float)) and not isinstance(new, bool), f"{path}: {new!r} is not a number"
        assert math.isclose(new, old, rel_tol=1e-12, abs_tol=max(1e-12 * scale, 1e-300)), f"{path}: {new!r} != {old!r}"


#: Keys of numbers read from eigenvectors or found by root search on eigenvalues (see :func:`assert_same`).
EIGENVECTOR_KEYS = {"energy_share", "shapes", "scale", "I_required_m4"}


def _scale_of_key(key: str, value) -> float:
    """The absolute scale of a key's tolerance (0: relative only)."""
    if key.endswith(("_error", "_errors")):  # error estimates: differences of nearly equal numbers
        return 1.0
    if key in EIGENVECTOR_KEYS:
        big = max((abs(v) for v in _numbers(value)), default=abs(value) if isinstance(value, (int, float)) else 0.0)
        return 1e3 * big
    return 0.0


def _numbers(value):
    """Every number inside a JSON list (recursively)."""
    if isinstance(value, list):
        for v in value:
            yield from _numbers(v)
    elif isinstance(value, (int, float)) and not isinstance(value, bool):
        yield value


def test_golden_files_cover_every_command():
    assert set(GOLDEN) == set(COMMANDS)


@pytest.mark.parametrize("name", sorted(COMMANDS))
def test_output_unchanged(name):
    old = GOLDEN[name]
    code, out, err = run(COMMANDS[name])
    assert code == old["exit"], err
    assert err == old["stderr"]
    if "--json" in COMMANDS[name] and old["exit"] in (0, 1):
        assert_same(json.loads(out), json.loads(old["stdout"]))
    else:
        assert out.splitlines() == old["stdout"].splitlines()
