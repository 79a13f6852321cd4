"""Restraint studies: brace thresholds, Winter's rule, AISC 360 Appendix 6, sensitivities, bounds, sweeps.

Every check against something outside the project names its source beside it.
"""

from __future__ import annotations

import json
import math
import tomllib
from pathlib import Path

import numpy as np
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from fea import RIGID, Column, PointLoad, Restraint, Segment, buckling
from fea.cli.study_common import rebuild_case, study_from_text
from fea.errors import CaseError
from fea.study.bounds import plane_bounds
from fea.study.brace import brace_force, brace_stiffness, winter_coefficient
from fea.study.paths import parse_key
from fea.study.sensitivity import column_sensitivities
from fea.study.sweep import make_range, sweep
from tests.conftest import Run, run_cli

ROOT = Path(__file__).resolve().parents[1]
E, I, L = 210e9, 8.0e-6, 6.0  # invented test column [Pa, m^4, m]


def braced_column(n: int, k: float = 0.0, length: float = L) -> Column:
    """Pinned column with n equally spaced lateral braces of stiffness k (invented values)."""
    rs = [Restraint(0.0, RIGID), Restraint(length, RIGID)]
    rs += [Restraint(length * j / (n + 1), k) for j in range(1, n + 1)]
    return Column((Segment(length, E, I),), tuple(rs), (PointLoad(length, 1.0),))


# ---------------------------------------------------------------------------
# brace stiffness


def test_mid_height_brace_threshold_16_pi2_EI_over_L3():
    # Derivation (symmetric mode of a pinned column with a central spring k, half-length a = L/2):
    # on 0 <= x <= a, EI w'' + P w = (k delta / 2) x, w(0) = 0, w'(a) = 0, w(a) = delta, alpha^2 = P/EI,
    # gives k = (2P/a) * alpha a / (alpha a - tan(alpha a)).  The braced (two half-wave) mode governs
    # once P reaches pi^2 EI / a^2, i.e. alpha a = pi, tan = 0: k = 2P/a = 2 pi^2 EI / a^3 = 16 pi^2 EI / L^3
    # (Timoshenko & Gere, Theory of Elastic Stability, 2nd ed., 1961, sec. 2.10, bar on an intermediate
    # elastic support).
    res = brace_stiffness(braced_column(1), [2], eps=1e-9)
    exact = 16 * math.pi**2 * E * I / L**3
    assert res.threshold == pytest.approx(exact, rel=1e-5)
    # Winter's ideal stiffness for one brace, 2P/Lb (Winter, 1960), with P the braced critical load
    P = math.pi**2 * E * I / (L / 2) ** 2
    assert res.winter_stiffness == pytest.approx(2 * P / (L / 2), rel=1e-5)
    assert res.threshold == pytest.approx(res.winter_stiffness, rel=1e-5)
    # the rigid-brace load factor is the Euler load of the half length (Euler; Timoshenko & Gere eq. 2-3)
    assert res.load_factor_rigid == pytest.approx(P, rel=1e-5)
    # below the threshold the load factor is below the rigid value; the target fraction is reached earlier
    assert res.fraction_stiffness < res.threshold
    assert res.model.load_factor([0.9 * res.threshold]) < 0.999 * res.load_factor_rigid


@pytest.mark.parametrize("n", [1, 2, 3, 4])
def test_equally_spaced_braces_against_winter_coefficients(n):
    # Winter (1960), Trans. ASCE 125: ideal stiffness of n equally spaced braces
    # 2 [1 + cos(pi / (n + 1))] P / Lb = 2, 3, 3.414, 3.618 P/Lb for n = 1..4 (from memory of the table; the
    # closed form is the one quoted in the bracing chapters of the stability literature).
    coeff = {1: 2.0, 2: 3.0, 3: 3.414, 4: 3.618}[n]
    assert winter_coefficient(n) == pytest.approx(coeff, abs=5e-4)
    res = brace_stiffness(braced_column(n), list(range(2, 2 + n)), eps=1e-9)
    Lb = L / (n + 1)
    P = res.axial_force_rigid
    tool = res.threshold * Lb / P
    # Report: the continuous column's threshold against Winter's hinged-segment coefficient.
    diff = tool / winter_coefficient(n) - 1.0
    print(f"n = {n}: tool threshold {tool:.7f} P/Lb, Winter {winter_coefficient(n):.7f} P/Lb, "
          f"relative difference {diff:+.1e}")
    # Measured: they agree to the discretisation error (about 1e-7): at P = pi^2 EI / Lb^2 every span of the
    # continuous column bends as a half sine with zero end moments, so the hinges of Winter's model cost
    # nothing at the threshold itself.
    assert abs(diff) < 1e-5
    assert res.equally_spaced


def test_aisc_360_appendix_6_point_bracing_beside_the_tool():
    # AISC 360-16, Appendix 6, Section 6.2, point (nodal) bracing of columns (from memory; source not at hand):
    # required strength P_br = 0.01 P_r (Eq. A-6-3); required stiffness beta_br = (1/phi) 8 P_r / L_br with
    # phi = 0.75 (LRFD, Eq. A-6-4a).
    col = braced_column(1, k=5e6)
    res = brace_stiffness(col, [2])
    Lb, Pr = L / 2, 1.0  # load factor 1: the case's load, 1 N
    assert res.aisc_strength == pytest.approx(0.01 * Pr)
    assert res.aisc_stiffness == pytest.approx(8 * Pr / (0.75 * Lb))
    # at the rigid-brace critical load the AISC stiffness is 8 / (0.75 * 2) = 5.33 times the tool's ideal
    # threshold: a factor 2 for the initial out-of-straightness, 2 for many braces (4 P/Lb) and 1/phi.
    ratio = res.aisc_stiffness_at_rigid / res.threshold
    print(f"AISC 360-16 App. 6 stiffness / tool threshold = {ratio:.4f} (8 / (0.75 * 2) = {8 / 1.5:.4f})")
    assert ratio == pytest.approx(8 / 1.5, rel=1e-5)


def test_brace_force_from_the_imperfect_column_analysis_is_linear_in_the_bow():
    # Linear second-order theory (Timoshenko & Gere, ch. 1): the additional deflection, hence the brace force,
    # is proportional to the initial bow at a given load.  A 0.5 P_cr load on a mid-braced column.
    col = braced_column(1, k=0.0)
    res = brace_stiffness(col, [2])
    col = Column(col.segments, col.restraints, (PointLoad(L, 0.5 * res.load_factor_rigid),))
    res = brace_stiffness(col, [2])
    f500 = brace_force(col, res, bow_ratio=500, stiffness=2 * res.threshold)
    f1000 = brace_force(col, res, bow_ratio=1000, stiffness=2 * res.threshold)
    assert f500.forces[0] > 0
    assert f500.forces[0] == pytest.approx(2 * f1000.forces[0], rel=1e-6)
    # Winter (1960) for one brace, stiffness twice ideal, P at half the braced critical load: the force is
    # a small fraction of P, of the order of 1 % for bows of L/500 (common practice: the 1 % and 2 % rules).
    assert 0.001 < f500.ratios[0] < 0.05


# ---------------------------------------------------------------------------
# sensitivities


@pytest.mark.parametrize("column", [
    Column((Segment(3.0, E, 2e-5), Segment(2.5, E, 1.2e-5), Segment(2.0, E, 8e-6)),
           (Restraint(0.0, RIGID, 1e6), Restraint(5.5, 3e6), Restraint(7.5, RIGID, 2e5)),
           (PointLoad(7.5, 1.0), PointLoad(3.0, 2.0))),
    Column((Segment(6.0, E, 2e-5),), (Restraint(0.0, RIGID, 1e3), Restraint(6.0, 3e4, 1e7)),
           (PointLoad(6.0, 1.0),)),
])
def test_sensitivities_agree_with_central_finite_differences(column):
    rows = column_sensitivities(column, check=True)
    finite = [r for r in rows if not r.rigid]
    assert finite
    for r in finite:
        # d lam/dk = phi_d^2 / phi^T G phi (first-order eigenvalue perturbation; Wilkinson 1965, ch. 2)
        assert r.derivative > 0
        assert r.fd_relative_difference < 1e-5, (r.kind, r.at, r.fd_relative_difference)
    assert all(r.derivative is None for r in rows if r.rigid)


# ---------------------------------------------------------------------------
# fixity bounds


BOX_COLUMN = Column((Segment(4.0, E, 1.5e-5), Segment(3.0, E, 9e-6)),
                    (Restraint(0.0, RIGID, 2e6), Restraint(4.0, 4e5), Restraint(7.0, 1e6, 5e5)),
                    (PointLoad(7.0, 1.0), PointLoad(4.0, 1.5)))
BOX_SPRINGS = ((0, "rotation"), (1, "lateral"), (2, "lateral"))
BOX_LOW = (2e5, 1e5, 2e5)
BOX_HIGH = (2e7, 2e6, 5e6)


@pytest.fixture(scope="module")
def box():
    return plane_bounds(BOX_COLUMN, BOX_SPRINGS, BOX_LOW, BOX_HIGH)


@settings(max_examples=40, deadline=None)
@given(t=st.tuples(*[st.floats(0.0, 1.0)] * 3))
def test_box_corners_bound_every_interior_point(box, t):
    # The load factor never decreases as a spring stiffens (K grows by a positive semi-definite term;
    # Courant-Fischer min-max, Courant & Hilbert vol. 1 ch. 1), so the all-low and all-high corners bound it.
    k = [lo * (hi / lo) ** ti for lo, hi, ti in zip(BOX_LOW, BOX_HIGH, t)]
    lam = box.load_factor(k)
    assert box.load_factor_min * (1 - 1e-10) <= lam <= box.load_factor_max * (1 + 1e-10)


def test_bounds_sit_at_the_all_low_and_all_high_corners(box):
    lam = box.corner_load_factors
    assert lam[0] == box.load_factor_min  # itertools.product: first corner all low
    assert lam[-1] == box.load_factor_max
    assert np.all(np.diff(np.sort(lam)) >= 0)
    # K bounds follow from the load-factor bounds (K falls as the load factor rises)
    assert np.all(box.K_min <= box.K_max)


# ---------------------------------------------------------------------------
# sweeps


FIXED_PINNED = """
title = "uniform column, rigid lateral top, base rotation swept (test data)"
[material]
E = "210 GPa"
[[segment]]
length = "5 m"
I = "10e6 mm^4"
[[restraint]]
at = "base"
lateral = "rigid"
rotation = "1 MN*m/rad"
[[restraint]]
at = "top"
lateral = "rigid"
[[load]]
at = "top"
axial = "100 kN"
"""


def test_base_rotation_sweep_moves_K_from_1_to_0_6992():
    # Pinned-pinned K = 1; fixed-pinned: tan(kL) = kL, kL = 4.4934, K = pi / 4.4934 = 0.6992
    # (Timoshenko & Gere, Theory of Elastic Stability, 2nd ed., 1961, sec. 2.5).
    study = study_from_text(FIXED_PINNED)
    r = make_range(study, parse_key("restraint[1].rotation"), 0.0, math.inf, 61, "log")
    res = sweep(study, [r], segments=[0])
    K = res.K["in-plane"][:, 0]
    assert K[0] == pytest.approx(1.0, rel=1e-5)
    assert K[-1] == pytest.approx(0.6992, abs=5e-5)
    assert np.all(np.diff(K) < 0)  # smooth and monotone: stiffer base, shorter effective length
    assert np.max(np.abs(np.diff(K, 2))) < 0.02
    # the spring path agrees with direct solves at a few points
    for i in (5, 30, 55):
        col = study.case.column("in-plane").with_restraint(0, rotation=float(r.values[i]))
        assert res.governing[i] == pytest.approx(buckling(col, n_modes=1).load_factor, rel=3e-6)


def test_parallel_and_serial_sweeps_are_identical():
    study = study_from_text((ROOT / "cases/study_three_segment.toml").read_text())
    r = make_range(study, parse_key("segment[2].I"), 8e-6, 16e-6, 6, "linear")
    a = sweep(study, [r], jobs=1)
    b = sweep(study, [r], jobs=2)
    assert a.method == b.method == "re-solve"
    assert np.array_equal(a.governing, b.governing)
    assert np.array_equal(a.K["in-plane"], b.K["in-plane"], equal_nan=True)
    r1 = make_range(study, parse_key("restraint[1].rotation"), 1e4, 1e8, 4, "log")
    r2 = make_range(study, parse_key("restraint[2].lateral"), 1e5, 1e9, 3, "log")
    c = sweep(study, [r1, r2], jobs=1)
    d = sweep(study, [r1, r2], jobs=2)
    assert c.method == "spring"
    assert np.array_equal(c.governing, d.governing)


def test_spring_path_agrees_with_the_re_solve_path():
    study = study_from_text((ROOT / "cases/study_three_segment.toml").read_text())
    r = make_range(study, parse_key("restraint[1].rotation"), 1e4, 1e9, 5, "log")
    a = sweep(study, [r], method="spring")
    b = sweep(study, [r], method="re-solve")
    np.testing.assert_allclose(a.governing, b.governing, rtol=3e-6)


def test_key_paths_and_document_round_trip():
    # studies rebuild changed cases from the parsed document (plain data, no TOML text): unchanged, it gives
    # back the same case
    text = (ROOT / "cases/study_fixity_chart.toml").read_text()
    case = study_from_text(text).case
    assert case.document == tomllib.loads(text)
    assert rebuild_case(dict(case.document)).planes == case.planes
    k = parse_key("segment[1].I_minor")
    assert (k.dimension, k.si_unit, k.is_spring) == ("second moment of area", "m^4", False)
    assert parse_key("restraint[2].rotation").is_spring
    for bad in ("segment.length", "segment[0].length", "restraint[1].colour", "nothing[1].x", "material[1].E"):
        with pytest.raises(CaseError):
            parse_key(bad)


# ---------------------------------------------------------------------------
# command line


def _run(*args: str) -> Run:
    # the command in this interpreter through fea.cli.main (tests/conftest.py), from the repository root
    return run_cli(*args, cwd=ROOT)


def test_cli_sweep_writes_json_and_csv(tmp_path):
    js, csv = tmp_path / "s.json", tmp_path / "s.csv"
    p = _run("sweep", "cases/study_three_segment.toml", "--param", "restraint[1].rotation", "free", "rigid",
             "--points", "9", "--scale", "log", "--jobs", "1", "--json", str(js), "--csv", str(csv))
    assert p.returncode == 0, p.stderr
    assert "Stanchion assists" in p.stdout
    data = json.loads(js.read_text())
    assert data["units"] == "SI" and data["study"] == "sweep"
    assert data["parameters"][0]["values"][0] == 0.0 and data["parameters"][0]["values"][-1] is None
    assert len(data["load_factor"]["governing"]) == 9
    lines = csv.read_text().splitlines()
    assert lines[0].startswith("restraint[1].rotation [N*m/rad],load_factor [-]")
    assert len(lines) == 10


def test_cli_brace_sensitivity_bounds_and_bad_input(tmp_path):
    js = tmp_path / "b.json"
    p = _run("brace", "cases/study_girt_braced_column.toml", "--json", str(js))
    assert p.returncode == 0, p.stderr
    data = json.loads(js.read_text())
    assert data["threshold_stiffness"] > 0 and data["winter"]["coefficient"] == pytest.approx(3.0)
    p = _run("sensitivity", "cases/study_girt_braced_column.toml")
    assert p.returncode == 0, p.stderr
    assert "which restraint matters most" in p.stdout
    p = _run("bounds", "cases/study_girt_braced_column.toml", "--json", "-")
    assert p.returncode == 0, p.stderr
    out = json.loads(p.stdout)
    assert out["load_factor_min"] <= out["load_factor_max"]
    p = _run("sweep", "cases/study_three_segment.toml", "--param", "restraint[9].rotation", "free", "rigid")
    assert p.returncode == 2
    assert p.stderr.count("\n") == 1 and "restraint[9]" in p.stderr
