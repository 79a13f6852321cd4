"""Lint (ruff) of the whole code base and type-checking (mypy) of the computing core pass.

Both tools are in the ``test`` extra (``pip install -e ".[test]"``); their settings live in
pyproject.toml ([tool.ruff], [tool.mypy], which also lists the core modules mypy checks).
"""

from __future__ import annotations

import subprocess
import sys
from pathlib import Path

ROOT = Path(__file__).resolve().parents[1]


def _run(*args: str) -> subprocess.CompletedProcess:
    return subprocess.run([sys.executable, "-m", *args], cwd=ROOT, capture_output=True, text=True, timeout=600)


def test_ruff_finds_nothing():
    out = _run("ruff", "check", "--no-fix", "--output-format", "concise", "fea", "tests", "benchmarks")
    assert out.returncode == 0, f"ruff check fea tests benchmarks:\n{out.stdout}{out.stderr}"


def test_mypy_passes_on_the_core():
    out = _run("mypy")
    assert out.returncode == 0, f"mypy (files listed in pyproject.toml):\n{out.stdout}{out.stderr}"
