"""Shared fixtures and helpers for the test-suite."""

from __future__ import annotations

import math
import os

import pytest

os.environ.setdefault("MPLBACKEND", "Agg")

from fea import RIGID, Column, PointLoad, Restraint, Segment  # noqa: E402

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
