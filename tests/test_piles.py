"""Columns held by foundations alone (piles in soil), the depth of fixity, and planes solved once when identical.

The exact reference is an independent solution of the beam-column on a Winkler foundation,

    EI w'''' + N w'' + k(x) w = 0,

with free ends (``EI w'' = 0`` and the shear ``EI w''' + N w' = 0``) (Hetenyi, Beams on Elastic Foundation,
1946, chapter on beam-columns; Timoshenko & Gere, Theory of Elastic Stability, 2nd ed., section 2.10; both from
memory), integrated with ``scipy.integrate.solve_ivp`` at tight tolerance; the critical force is the lowest root
of the determinant of the free-head conditions, found by ``brentq``.
"""

from __future__ import annotations

import json
import math

import numpy as np
import pytest

from fea.errors import CaseError, FeaError
from fea.model import Column, Foundation, PointLoad, Restraint, Segment
from fea.pipeline import identical_planes, parse_case, result_json, run_case, summary
from fea.solve.eigen import buckling
from fea.solve.fixity import RULE_FACTOR, depth_of_fixity
from fea.solve.solvable import rigid_body_mechanism

# Invented demo values: a steel tube pile, soil modulus growing linearly with depth below the ground line.
E = 210e9
I = 300e-6
EI = E * I
N_H = 1.0e6  # [N/m^3]
EMBEDDED = 9.0
FREE = 4.0
P = 650e3

PILE = f"""
title = "pile held by the soil alone (invented demo)"
[material]
E = "210 GPa"
[[segment]]
name = "embedded length"
length = "{EMBEDDED} m"
I = "300e6 mm^4"
[[segment]]
name = "free length"
length = "{FREE} m"
I = "300e6 mm^4"
[[foundation]]
from = "base"
to = "{EMBEDDED} m"
modulus_bottom = "{N_H * EMBEDDED / 1e6} MN/m^2"
modulus_top = "0 MN/m^2"
[[load]]
at = "top"
axial = "650 kN"
"""


def _exact_critical_force(EI: float, ground: float, free: float, n_h: float, upper: float) -> float:
    """Lowest N with a nonzero solution of EI w'''' + N w'' + n_h (ground - x)_+ w = 0, both ends free."""
    from scipy.integrate import solve_ivp
    from scipy.optimize import brentq

    H = ground + free

    def rhs(x, y, N):
        k = n_h * (ground - x) if x < ground else 0.0
        w, w1, w2, w3 = y
        return [w1, w2, w3, -(N * w2 + k * w) / EI]

    def head(N: float) -> float:
        cols = []
        for w0, w1 in ((1.0, 0.0), (0.0, 1.0)):  # toe: w'' = 0, EI w''' + N w' = 0
            y = [w0, w1, 0.0, -N * w1 / EI]
            for a, b in ((0.0, ground), (ground, H)):  # the modulus has a kink at the ground line
                y = solve_ivp(rhs, (a, b), y, args=(N,), method="DOP853", rtol=1e-13, atol=1e-16).y[:, -1]
            cols.append((y[2], (EI * y[3] + N * y[1]) / EI))  # head: w'' and the shear, per EI
        return cols[0][0] * cols[1][1] - cols[0][1] * cols[1][0]

    grid = np.linspace(upper / 20, upper, 20)  # the next root is far above the lowest (about 8 x here)
    values = [head(N) for N in grid]
    for a, b, fa, fb in zip(grid[:-1], grid[1:], values[:-1], values[1:]):
        if fa * fb <= 0:
            return brentq(head, a, b, xtol=1e-12 * b, rtol=1e-14)
    raise AssertionError("no root below the upper bound")


# -- a pile held by the soil alone --------------------------------------------------------------------


@pytest.fixture(scope="module")
def pile():
    case = parse_case(PILE)
    return case, run_case(case)


def test_pile_without_restraint_runs_and_matches_the_exact_solution(pile):
    case, res = pile
    assert case.planes[0][1].restraints == ()
    lam = res.governing.load_factor
    # independent exact solution of the beam-column on a Winkler foundation (Hetenyi 1946; Timoshenko & Gere
    # 2.10; from memory): both ends free, the soil alone holds the pile
    N_cr = _exact_critical_force(EI, EMBEDDED, FREE, N_H, upper=2.0 * lam * P)
    assert lam == pytest.approx(N_cr / P, rel=1e-6)


def test_depth_of_fixity_is_reported_with_its_definition(pile):
    case, res = pile
    (f,) = res.extras["fixity"]
    assert f.head.startswith("free head")
    assert f.ground_line == EMBEDDED and f.free_length == pytest.approx(FREE)
    # L_e = (pi / 2) sqrt(EI / N_cr): the fixed-base cantilever with the same critical load (Euler, K = 2)
    assert f.equivalent_length == pytest.approx(math.pi / 2 * math.sqrt(EI / (res.governing.load_factor * P)),
                                                rel=1e-12)
    assert f.depth == pytest.approx(f.equivalent_length - FREE, rel=1e-12)
    data = result_json(res)
    part = data["fixity"][0]
    assert part["depth_of_fixity_m"] == pytest.approx(f.depth)
    assert part["rule_of_thumb"]["n_h_N_per_m3"] == pytest.approx(N_H)
    json.dumps(data, allow_nan=False)
    text = "\n".join(summary(res))
    assert "Depth of fixity" in text and "1.8 T" in text and "L_e" in text


@pytest.mark.parametrize("embedded_T, free_T", [(6.0, 1.0), (6.0, 2.0), (8.0, 3.0)])
def test_depth_of_fixity_of_a_long_pile_is_near_the_rule_of_thumb(embedded_T, free_T):
    # common practice: depth of fixity about 1.8 T, T = (EI / n_h)^(1/5), for long free-headed piles in soil
    # whose modulus grows linearly with depth (Davisson and Robinson, 1965, from memory); band 1.6 T to 2.0 T
    T = (EI / N_H) ** 0.2
    g, Lu = embedded_T * T, free_T * T
    col = Column(segments=(Segment(g, E, I), Segment(Lu, E, I)), foundations=(Foundation(0.0, g, N_H * g, 0.0),),
                 point_loads=(PointLoad(g + Lu, 1e5),))
    f = depth_of_fixity(col, buckling(col, n_modes=1))
    assert f is not None and f.T == pytest.approx(T) and f.long_pile
    assert f.rule_depth == pytest.approx(RULE_FACTOR * T)
    assert 1.6 * T < f.depth < 2.0 * T
    assert f.notes == ()


def test_rule_of_thumb_is_not_compared_for_a_uniform_modulus():
    col = Column(segments=(Segment(12.0, E, I),), foundations=(Foundation(0.0, 8.0, 5e6),),
                 point_loads=(PointLoad(12.0, 1e5),))
    f = depth_of_fixity(col, buckling(col, n_modes=1))
    assert f is not None and f.n_h is None and f.depth is not None
    assert any("not compared" in n for n in f.notes)


def test_depth_of_fixity_states_the_head_case_and_refuses_an_elastic_head():
    g = 9.0
    base = dict(segments=(Segment(g, E, I), Segment(4.0, E, I)), foundations=(Foundation(0.0, g, N_H * g, 0.0),),
                point_loads=(PointLoad(13.0, 1e5),))
    held = Column(restraints=(Restraint(13.0, math.inf),), **base)
    f = depth_of_fixity(held, buckling(held, n_modes=1))
    assert f.head == "head held laterally, free to rotate"
    # fixed base, pinned head: N_cr = 4.4934^2 EI / L^2 (Timoshenko & Gere 2.4, from memory)
    assert f.equivalent_length == pytest.approx(4.493409457909064 * math.sqrt(EI / f.critical_force), rel=1e-12)
    spring = Column(restraints=(Restraint(13.0, 1e6),), **base)
    f = depth_of_fixity(spring, buckling(spring, n_modes=1))
    assert f.depth is None and any("elastic spring" in n for n in f.notes)


# -- the mechanism test counts foundations ------------------------------------------------------------


def test_a_foundation_alone_resists_both_rigid_body_motions():
    col = Column(segments=(Segment(4.0, E, I),), foundations=(Foundation(0.0, 2.0, 0.0, 1e6),),
                 point_loads=(PointLoad(4.0, 1e3),))
    assert rigid_body_mechanism(col) is None


def test_a_short_foundation_is_not_a_mechanism_and_rocks_as_a_rigid_bar():
    # a 10 mm foundation is a translational spring k l and a rotational spring k l^3 / 12 about its centre; the
    # stiff column rocks on it as a rigid bar: P_cr = (k l^3 / 12) / H (equilibrium of a rigid bar on a
    # rotational spring under a load of fixed direction, derived here)
    k, l, H = 1e7, 0.01, 4.0
    col = Column(segments=(Segment(H, E, I),), foundations=(Foundation(2.0, 2.0 + l, k),),
                 point_loads=(PointLoad(H, 1.0),))
    assert rigid_body_mechanism(col) is None
    assert buckling(col, n_modes=1).load_factor == pytest.approx(k * l**3 / 12 / H, rel=1e-5)


def test_a_foundation_shorter_than_the_station_tolerance_holds_nothing():
    col = Column(segments=(Segment(4.0, E, I),), foundations=(Foundation(2.0, 2.0 + 1e-10, 1e7),),
                 point_loads=(PointLoad(4.0, 1.0),))
    assert "move as a rigid body" in rigid_body_mechanism(col)


def test_no_restraint_and_no_foundation_is_a_clear_error():
    text = PILE.split("[[foundation]]")[0] + '[[load]]\nat = "top"\naxial = "650 kN"\n'
    with pytest.raises(CaseError, match=r"no \[\[restraint\]\] and no \[\[foundation\]\] given"):
        parse_case(text)


def test_a_plane_without_restraint_or_foundation_is_named_a_mechanism():
    text = PILE.replace('I = "300e6 mm^4"', 'I_major = "300e6 mm^4"\nI_minor = "200e6 mm^4"').replace(
        'modulus_top = "0 MN/m^2"', 'modulus_top = "0 MN/m^2"\naxis = "major"')
    with pytest.raises(FeaError, match="rigid body"):
        run_case(parse_case(text))


# -- identical planes are solved once -----------------------------------------------------------------

TUBE = """
title = "round tube prop (invented demo)"
[material]
E = "210 GPa"
fy = "355 MPa"
[[segment]]
length = "3.5 m"
section = { shape = "chs", d = "168.3 mm", t = "6.3 mm" }
[[restraint]]
at = "base"
lateral = "rigid"
rotation = "2 MN*m/rad"
[[restraint]]
at = "top"
lateral = "rigid"
[[load]]
at = "top"
axial = "400 kN"
"""


def test_identical_planes_are_solved_once(monkeypatch):
    import fea.pipeline as pipeline

    calls = []
    monkeypatch.setattr(pipeline, "buckling", lambda *a, **k: calls.append(k) or buckling(*a, **k))
    case = parse_case(TUBE)
    assert identical_planes(case) == ("major", "minor")
    res = run_case(case)
    assert len(calls) == 1
    major, minor = res.buckling
    assert minor.axis == "minor" and np.array_equal(major.load_factors, minor.load_factors)
    assert res.governing_axis == "major"
    data = result_json(res)
    assert data["identical_planes"]["note"].startswith("both planes identical: analysed once")
    assert "minor axis identical to major: solved once" in data["buckling"][1]["message"]
    assert any("both planes identical: analysed once" in line for line in summary(res))


def test_planes_differing_in_a_restraint_are_solved_apart():
    case = parse_case(TUBE.replace('lateral = "rigid"\nrotation', 'lateral = "rigid"\naxis = "major"\nrotation')
                      + '[[restraint]]\nat = "base"\naxis = "minor"\nlateral = "rigid"\n')
    assert identical_planes(case) is None
    assert "identical_planes" not in result_json(run_case(case))
