"""Studies as used in the field: brace P_r, no tolerance-only threshold, the case's own stiffness on the
chart, the studied plane's K in a sweep, readable chart axes, no numerical warnings, foundation moduli.

All columns here are invented test data.  Checks against outside sources name them beside the check.
"""

from __future__ import annotations

import math
import warnings

import numpy as np
import pytest

from fea import RIGID, Column, PointLoad, Restraint, Segment
from fea.cli.study_common import study_from_text
from fea.io.study_output import brace_dict, brace_lines, sweep_lines
from fea.plot.study import plot_brace, plot_sweep
from fea.solve.eigen import buckling
from fea.study.brace import brace_stiffness
from fea.study.paths import parse_key
from fea.study.run import case_bounds, case_brace, case_sensitivities
from fea.study.sweep import make_range, sweep

E, I = 210e9, 8.0e-6  # invented [Pa, m^4]

PROP = """
title = "Prop with a mid-height brace (invented)"
[material]
E = "210 GPa"
[[segment]]
length = "6 m"
I = "8e6 mm^4"
[[restraint]]
at = "base"
lateral = "rigid"
[[restraint]]
at = "top"
lateral = "rigid"
[[restraint]]
at = "2 m"
lateral = "2 MN/m"
[[load]]
at = "top"
axial = "300 kN"
"""

TWO_PLANES = """
title = "Two-plane column, girt in the minor plane (invented)"
[material]
E = "210 GPa"
[[segment]]
length = "8 m"
I_major = "12e6 mm^4"
I_minor = "4e6 mm^4"
[[restraint]]
at = "base"
lateral = "rigid"
[[restraint]]
at = "top"
lateral = "rigid"
[[restraint]]
at = "4 m"
lateral = "1 MN/m"
axis = "minor"
[[load]]
at = "top"
axial = "200 kN"
"""

# a pile with soil stiffening with depth and a rigid toe restraint (invented)
PILE = """
title = "Pile in soil (invented)"
[material]
E = "210 GPa"
[[segment]]
length = "9 m"
I = "400e6 mm^4"
[[segment]]
length = "4 m"
I = "400e6 mm^4"
[[restraint]]
at = "base"
lateral = "rigid"
[[restraint]]
at = "top"
lateral = "rigid"
[[foundation]]
from = "base"
to = "9 m"
modulus_bottom = "9 MN/m^2"
modulus_top = "0 MN/m^2"
[[load]]
at = "top"
axial = "650 kN"
"""


# ---------------------------------------------------------------------------
# brace study


def test_brace_P_r_is_the_largest_compression_next_to_the_brace():
    # 240 kN at the top, 1650 kN more entering at 3 m, below the brace at 6 m: the length above the brace
    # carries 240 kN, the braced length below it up to 1890 kN.
    col = Column((Segment(12.0, E, I),), (Restraint(0.0, RIGID), Restraint(12.0, RIGID), Restraint(6.0, 1e6)),
                 (PointLoad(12.0, 240e3), PointLoad(3.0, 1650e3)))
    res = brace_stiffness(col, [2])
    assert res.axial_force_design == pytest.approx(1890e3, rel=1e-12)
    assert res.braced_lengths == ((0.0, 12.0),)  # from the support below the brace to the one above
    assert res.axial_force_height < 3.0
    # AISC 360-16 Appendix 6, 6.2 point bracing (from memory): strength 0.01 P_r
    assert res.aisc_strength == pytest.approx(0.01 * 1890e3, rel=1e-12)


def test_no_tolerance_only_threshold_is_reported():
    study = study_from_text(PROP)
    cb = case_brace(study, [3])
    assert cb.result.threshold_kind == "tolerance"
    text = "\n".join(brace_lines(study, cb))
    assert "no threshold stiffness" in text and "set by that tolerance alone" in text
    assert "Winter, G. (1960)" in text and "Trans. ASCE 125" in text and "source not at hand" not in text
    assert "AISC 360-16 Appendix 6, 6.2" in text
    assert brace_dict(study, cb, "0")["threshold_stiffness"] is None
    assert "for 95% of the rigid-brace load factor: 4.161 MN/m" in text  # engineering units, not 4161 kN/m


def test_a_corner_threshold_is_still_reported():
    # symmetric brace at mid-height: the braced mode has a node at the brace, k = 16 pi^2 EI / L^3
    # (Timoshenko & Gere, Theory of Elastic Stability, 2nd ed., 1961, sec. 2.10)
    L = 6.0
    col = Column((Segment(L, E, I),), (Restraint(0.0, RIGID), Restraint(L, RIGID), Restraint(L / 2, 0.0)),
                 (PointLoad(L, 1.0),))
    res = brace_stiffness(col, [2], eps=1e-9)
    assert res.threshold_kind == "corner"
    assert res.threshold_reached == pytest.approx(16 * math.pi**2 * E * I / L**3, rel=1e-5)


def test_brace_chart_marks_the_case_own_stiffness():
    study = study_from_text(PROP)
    cb = case_brace(study, [3])
    fig = plot_brace(cb.result, display=study.case.display)
    ax = fig.axes[0]
    own = [ln for ln in ax.get_lines() if str(ln.get_label()).startswith("this case")]
    assert len(own) == 1
    assert own[0].get_xdata()[0] == pytest.approx(2.0)  # 2 MN/m in MN/m
    assert ax.get_xlabel() == "brace lateral stiffness [MN/m]"
    assert not any(str(ln.get_label()).startswith("threshold") for ln in ax.get_lines())


# ---------------------------------------------------------------------------
# sweeps


def test_sweep_keeps_the_studied_plane_K_when_the_other_plane_governs():
    study = study_from_text(TWO_PLANES)
    r = make_range(study, parse_key("restraint[3].lateral"), 0.1e6, 100e6, 7, "log")
    res = sweep(study, [r])
    assert res.studied_axis == "minor"
    gov = [res.axes[i] for i in res.governing_axis]
    assert "major" in gov and "minor" in gov  # a stiff girt hands the governing plane to the major axis
    lines = sweep_lines(study, res)
    rows = [ln for ln in lines if ln.startswith("   ") and ("major" in ln or "minor" in ln)
            and ln.split()[0][0].isdigit()]
    for i, row in enumerate(rows):
        assert float(row.split()[3]) == pytest.approx(res.K["minor"][i, 0], abs=6e-5)
    assert any(row.endswith("*") for row in rows)
    assert any("K: minor plane at every point" in ln for ln in lines)


def test_sweep_chart_axes_in_display_units_with_readable_labels():
    study = study_from_text(TWO_PLANES)
    r = make_range(study, parse_key("restraint[3].lateral"), 0.1e6, 100e6, 7, "log")
    fig = plot_sweep(sweep(study, [r]), display=study.case.display)
    labels = [ax.get_xlabel() for ax in fig.axes]
    assert labels == ["restraint 3 lateral stiffness [MN/m]"] * 2
    assert fig.axes[1].get_ylabel() == "effective-length factor K, minor plane [-]"
    pile = study_from_text(PILE)
    r = make_range(pile, parse_key("foundation[1].modulus_bottom"), 2e6, 20e6, 4, "linear")
    fig = plot_sweep(sweep(pile, [r]), display=pile.case.display)
    ax = fig.axes[0]
    from matplotlib.backends.backend_agg import FigureCanvasAgg

    FigureCanvasAgg(fig).draw()
    assert ax.get_xlabel() == "foundation 1 modulus at bottom [MN/m^2]"
    assert ax.xaxis.get_major_formatter().get_offset() == ""


def test_no_runtime_warning_from_sweeps_and_brace_studies():
    with warnings.catch_warnings():
        warnings.simplefilter("error")
        study = study_from_text(PROP)
        for key, a, b in (("restraint[3].lateral", 0.0, math.inf), ("restraint[1].rotation", 0.0, math.inf)):
            r = make_range(study, parse_key(key), a, b, 41, "log")
            sweep(study, [r])
        L = 6.0
        col = Column((Segment(L, E, I),), (Restraint(0.0, RIGID), Restraint(L, RIGID), Restraint(L / 2, 0.0)),
                     (PointLoad(L, 1.0),))
        from fea.solve.one_spring import SpringStudy

        SpringStudy.build(col, 2, "lateral").load_factors(np.array([0.0, 1e3, 1e6, 1e9, math.inf]))
        case_brace(study, [3])


# ---------------------------------------------------------------------------
# foundation moduli as study parameters


def _pile_lam(study, value: float) -> float:
    c = study.with_springs((parse_key("foundation[1].modulus_bottom"),), (value,))
    return buckling(c.planes[0][1], n_modes=1).load_factor


def test_bounds_over_the_soil_modulus():
    study = study_from_text(PILE)
    cb = case_bounds(study, [("foundation[1].modulus_bottom", 4.5e6, 18e6)])
    # bounds at the corners equal full re-solves at the two ends (to the mesh tolerance)
    assert cb.load_factor_min == pytest.approx(_pile_lam(study, 4.5e6), rel=1e-5)
    assert cb.load_factor_max == pytest.approx(_pile_lam(study, 18e6), rel=1e-5)
    assert cb.load_factor_min < _pile_lam(study, 9e6) < cb.load_factor_max


def test_sensitivity_to_the_soil_modulus_matches_finite_differences():
    study = study_from_text(PILE)
    cs = case_sensitivities(study)
    soil = [(t, e) for t, e in zip(cs.tables, cs.entries) if e.source == "foundation"]
    assert [(t, e.kind) for t, e in soil] == [(1, "modulus_bottom")]  # modulus_top is 0: left out
    e = soil[0][1]
    assert e.fd_relative_difference < 1e-4 and 0 < e.normalised < 1


def test_sweep_over_the_soil_modulus_spring_and_re_solve_paths_agree():
    study = study_from_text(PILE)
    r = make_range(study, parse_key("foundation[1].modulus_bottom"), 1e6, 50e6, 4, "log")
    a, b = sweep(study, [r]), sweep(study, [r], method="re-solve")
    assert a.method == "spring" and b.method == "re-solve"
    np.testing.assert_allclose(a.governing, b.governing, rtol=1e-5)
    assert np.all(np.diff(a.governing) > 0)  # stiffer soil never lowers the load factor


def test_brace_study_of_the_soil_modulus():
    study = study_from_text(PILE)
    cb = case_brace(study, [1], kind="modulus_bottom")
    r = cb.result
    assert r.load_factor_given == pytest.approx(_pile_lam(study, 9e6), rel=1e-5)
    assert r.load_factor_free < r.load_factor_given < r.load_factor_rigid
    assert r.model.load_factor([r.fraction_stiffness]) == pytest.approx(0.95 * r.load_factor_rigid, rel=1e-8)
    assert cb.force is None and "foundation" in cb.force_note


def test_foundation_key_must_name_what_the_table_gives():
    study = study_from_text(PILE)
    from fea.errors import CaseError

    with pytest.raises(CaseError, match="modulus_bottom and modulus_top"):
        study.targets(parse_key("foundation[1].modulus"))
    with pytest.raises(CaseError, match="1 \\[\\[foundation\\]\\] table"):
        study.targets(parse_key("foundation[2].modulus_top"))
