"""Convergence is a verdict (issue 12 item 5): a result short of its tolerance is never reported as success,
and a station a hair beside another does not stop the mesh from converging.

The columns are invented for these tests.
"""

from __future__ import annotations

import math

import pytest
from scipy.optimize import brentq

from fea.cli import main
from fea.pipeline import parse_case, run_case

E, I_MINOR, P = 210e9, 20.0e-6, 500e3

CASE = """
title = "two spans (invented)"
[units]
length = "m"
force = "kN"
[material]
E = "210 GPa"
{analysis}
[[segment]]
name = "lower"
length = "2 m"
I_major = "57.9e6 mm^4"
I_minor = "20.0e6 mm^4"
{S}
[[segment]]
name = "upper"
length = "2 m"
I_major = "57.9e6 mm^4"
I_minor = "20.0e6 mm^4"
{S}
[[restraint]]
at = "base"
lateral = "rigid"
[[restraint]]
at = "top"
lateral = "rigid"
[[restraint]]
at = "{at}"
axis = "minor"
lateral = "{lateral}"
[[load]]
at = "top"
axial = "500 kN"
"""


def _case(at: str = "1.999 m", lateral: str = "rigid", S: str = "", analysis: str = "") -> str:
    return CASE.format(at=at, lateral=lateral, S=S, analysis=analysis)


def _two_span_load_factor(a: float, b: float) -> float:
    """Lowest load factor of a column pinned at both ends and held laterally (no rotational restraint) at height a.

    Continuity of slope over the inner support of two pin-ended spans a and b, each with the end moment M:
    ``a psi(k a) + b psi(k b) = 0``, ``psi(u) = 3 (1/u - 1/tan u) / u`` (the end-rotation magnifier of a
    beam-column under an end moment; Timoshenko & Gere, Theory of Elastic Stability, 2nd ed., section 1.6
    and the three-moment equation of section 2.2 -- from memory).  The lowest root lies between the Euler
    loads of the two spans as pin-ended struts, k = pi/max(a, b) and pi/min(a, b).
    """
    def psi(u: float) -> float:
        return 3.0 * (1.0 / u - 1.0 / math.tan(u)) / u

    lo, hi = math.pi / max(a, b), math.pi / min(a, b)
    k = brentq(lambda k: a * psi(k * a) + b * psi(k * b), lo * (1 + 1e-12), hi * (1 - 1e-12), xtol=1e-15,
               rtol=1e-15)
    return k * k * E * I_MINOR / P


def test_restraint_a_millimetre_beside_a_joint_converges_to_the_exact_load_factor():
    r = run_case(parse_case(_case("1.999 m"))).plane("minor")
    assert r.converged and r.discretisation_error <= 1e-6
    exact = _two_span_load_factor(1.999, 2.001)
    assert r.load_factor == pytest.approx(exact, rel=2e-6)


def test_spring_a_millimetre_beside_a_joint_converges_between_its_neighbours():
    """A spring at 1.999 m: converged, and between the values with the spring at 1.99 m and at 2 m (the load
    factor moves smoothly with the spring's height; self-consistency, no outside value)."""
    lam = {}
    for at in ("1.99 m", "1.999 m", "2 m"):
        r = run_case(parse_case(_case(at, "2 MN/m"))).plane("minor")
        assert r.converged and r.discretisation_error <= 1e-6, at
        lam[at] = r.load_factor
    assert lam["1.99 m"] < lam["1.999 m"] < lam["2 m"]
    # the column is symmetric about 2 m, so the load factor is stationary there and falls with the square
    # of the offset: the 1 mm point keeps 1 - (1/10)^2 of the way from 1.99 m to 2 m
    frac = (lam["1.999 m"] - lam["1.99 m"]) / (lam["2 m"] - lam["1.99 m"])
    assert frac == pytest.approx(0.99, abs=1e-3)


def test_shear_flexible_column_beside_a_joint_converges():
    """Shear-flexible elements converge at order about 2: refinement goes on by length until the tolerance."""
    r = run_case(parse_case(_case("1.999 m", S='S = "50 MN"'))).plane("minor")
    assert r.converged and r.discretisation_error <= 1e-6, r.message


def test_tolerance_out_of_reach_exits_1_with_its_cause(tmp_path, capsys):
    path = tmp_path / "tight.toml"
    path.write_text(_case(analysis="[analysis]\ntolerance = 1e-12"), encoding="utf-8")
    assert main(["check", str(path)]) == 1
    out = capsys.readouterr().out
    assert "NOT CONVERGED" in out and "WARNING (not-converged)" in out
    assert "round-off" in out and "cause:" in out and "estimate" in out


def test_stations_too_close_for_double_precision_name_the_real_cause(tmp_path, capsys):
    """A spring 0.01 mm below a joint: the error names the two stations, not a near-mechanism."""
    path = tmp_path / "hair.toml"
    path.write_text(_case("1.99999 m", "2 MN/m"), encoding="utf-8")
    assert main(["check", str(path)]) == 2
    err = capsys.readouterr().err
    assert "1.99999 m and 2 m" in err and "0.01 mm apart" in err
    assert "near-mechanism" not in err and "Traceback" not in err


# -- every reported mode converged (issue 13 item 8) --------------------------------------------------------

UNIFORM = """
title = "uniform strut (invented)"
[units]
length = "m"
force = "kN"
[material]
E = "200 GPa"
[analysis]
modes = 5
[[segment]]
length = "7 m"
I = "31.0e6 mm^4"
[[restraint]]
at = "base"
lateral = "rigid"
{base}
[[restraint]]
at = "top"
{top}
[[load]]
at = "top"
axial = "250 kN"
"""


@pytest.mark.parametrize("base, top, factor", [
    # pin-ended: P_n = n^2 pi^2 E I / L^2 (Timoshenko & Gere, Theory of Elastic Stability, 2nd ed., section 2.1)
    ("", 'lateral = "rigid"', lambda n: n * n),
    # cantilever: P_n = (2n - 1)^2 pi^2 E I / (4 L^2) (Timoshenko & Gere, section 2.1)
    ('rotation = "rigid"', 'lateral = "free"\nrotation = "free"', lambda n: (2 * n - 1) ** 2 / 4),
])
def test_every_reported_mode_meets_the_tolerance_against_exact(base, top, factor):
    text = UNIFORM.format(base=base, top=top).replace('[[restraint]]\nat = "top"\nlateral = "free"\nrotation = "free"',
                                                      "")
    r = run_case(parse_case(text)).buckling[0]
    euler = math.pi ** 2 * 200e9 * 31.0e-6 / 7.0 ** 2 / 250e3
    assert len(r.load_factors) == 5 and len(r.mode_errors) == 5
    for n, (lam, est) in enumerate(zip(r.load_factors, r.mode_errors), start=1):
        exact = factor(n) * euler
        assert est <= 1e-6, n
        assert lam == pytest.approx(exact, rel=1e-6), n


def test_every_demo_case_reports_converged_load_factors():
    """Each reported load factor of each shipped case has an estimated error within its tolerance."""
    from pathlib import Path

    from fea.pipeline import ANALYSES, load_case

    skip = tuple(a.name for a in ANALYSES)
    for path in sorted((Path(__file__).resolve().parents[1] / "cases").glob("*.toml")):
        res = run_case(load_case(str(path)), skip=skip)
        for r in res.buckling:
            assert r.converged and len(r.mode_errors) == len(r.load_factors), (path.name, r.axis)
            assert all(e <= r.tolerance for e in r.mode_errors), (path.name, r.axis, list(r.mode_errors))
