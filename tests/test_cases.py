"""Every case in cases/ runs end to end, through the API and through the command.

A case whose comment block says "expected exit status: 1" (a design check that
is meant to fail) must exit with 1; every other case with 0.
"""

from __future__ import annotations

import json
import math
from pathlib import Path

import pytest

from fea.pipeline import load_case, run_case
from tests.conftest import run_cli

ROOT = Path(__file__).resolve().parents[1]
CASE_FILES = sorted((ROOT / "cases").glob("*.toml"))


def expected_exit(path: Path) -> int:
    return 1 if "expected exit status: 1" in path.read_text(encoding="utf-8").lower() else 0


def test_there_are_at_least_six_demo_cases():
    assert len(CASE_FILES) >= 6
    for p in CASE_FILES:
        head = p.read_text(encoding="utf-8").lstrip()
        assert head.startswith("#") and "demo" in head.lower()[:400], f"{p.name}: needs a demo comment block"


@pytest.mark.parametrize("path", CASE_FILES, ids=[p.stem for p in CASE_FILES])
def test_case_through_api(path):
    case = load_case(path)
    res = run_case(case)
    assert res.governing.load_factor == min(r.load_factor for r in res.buckling)
    for r in res.buckling:
        assert r.converged and r.discretisation_error <= case.tolerance
        assert all(s.critical_axial_force == pytest.approx(s.axial_force * r.load_factor, rel=1e-9)
                   for s in r.segments
                   if not any(getattr(p, "permanent", False) for p in case.column(r.axis).point_loads)
                   and not case.column(r.axis).distributed_loads)


@pytest.mark.parametrize("path", CASE_FILES, ids=[p.stem for p in CASE_FILES])
def test_case_through_command(path):
    # in this interpreter through fea.cli.main; tests/test_cli.py runs one case in a real process
    out = run_cli("check", str(path), "--json", cwd=ROOT)
    assert out.returncode == expected_exit(path), out.stderr
    data = json.loads(out.stdout)
    assert data["units"] == "SI" and data["buckling"]
    assert data["governing_axis"] in [b["axis"] for b in data["buckling"]]


# -- headline numbers that can be checked independently -----------------------------------------

def test_laced_column_headline():
    # Pinned both ends: major axis Euler P_e = pi^2 E I / L^2; minor axis with lacing shear
    # stiffness S: Engesser P_cr = P_e / (1 + P_e / S) (Timoshenko & Gere, section 2.16).
    case = load_case(ROOT / "cases" / "laced_column.toml")
    res = run_case(case)
    E, L, P = 210e9, 9.0, 900e3
    pe_major = math.pi**2 * E * 168e-6 / L**2
    pe_minor = math.pi**2 * E * 120e-6 / L**2
    assert res.plane("major").load_factor * P == pytest.approx(pe_major, rel=1e-6)
    assert res.plane("minor").load_factor * P == pytest.approx(pe_minor / (1 + pe_minor / 9.5e6), rel=1e-6)
    assert res.governing_axis == "minor"


def test_crane_column_minor_axis_bounds():
    # Minor axis: fixed base, held at the step and the top.  The lower leg's critical force lies between
    # fixed-pinned (K = 0.6992) and fixed-fixed (K = 0.5) values for its own length (Euler;
    # Timoshenko & Gere, section 2.2), depending on the restraint the upper leg gives.
    case = load_case(ROOT / "cases" / "crane_column.toml")
    r = run_case(case).plane("minor")
    low = r.segments[0]
    K = low.effective_length_factor
    assert low.meaningful
    assert 0.5 < K < 0.6992 + 1e-3
