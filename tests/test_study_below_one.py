"""Load factors below one in the study commands (issue 12): marks on every table, chart and JSON, exit status.

The case as given buckling under its case loads (lowest load factor below 1) makes a study exit 1 with a
warning; points of the study's range below 1 are marked but leave the exit status alone.  Every case here is
invented test data; the numbers checked are the tool's own (no outside reference).
"""

from __future__ import annotations

import json

import numpy as np
import pytest

from fea.io.study_output import _ranges_below_one, below_one
from tests.conftest import run_cli

#: Invented: a 4 m pinned-top prop with a base rotational spring and a lateral brace at mid-height.  Under
#: 6000 kN the sweep of the base spring from 0.1 to 1000 MN*m/rad crosses load factor 1 (about 5.9 MN*m/rad);
#: the case as given (20 MN*m/rad) stays above 1.
PROP = """
title = "Prop with a base spring (invented)"
[material]
E = "210 GPa"
[[segment]]
name = "column"
length = "4.0 m"
I = "22.1e6 mm^4"
[[restraint]]
at = "base"
lateral = "rigid"
rotation = "20 MN*m/rad"
[[restraint]]
at = "top"
lateral = "rigid"
[[restraint]]
at = "2 m"
lateral = "2 MN/m"
[[load]]
at = "top"
axial = "6000 kN"
[study]
jobs = 1
[study.sweep]
[[study.sweep.parameter]]
key = "restraint[1].rotation"
from = "0.1 MN*m/rad"
to = "1000 MN*m/rad"
points = 13
scale = "log"
[study.brace]
restraints = [3]
[[study.bounds.spring]]
key = "restraint[1].rotation"
low = "0.1 MN*m/rad"
high = "10 MN*m/rad"
"""
#: the case as given buckles: base spring 0.2 MN*m/rad, lowest load factor about 0.76
BUCKLES = PROP.replace('rotation = "20 MN*m/rad"', 'rotation = "0.2 MN*m/rad"')
#: a sixth of the load: every point of every study above 1
CLEAN = PROP.replace('"6000 kN"', '"1000 kN"')

KEY = "buckles-under-case-loads"
COMMANDS = ("sweep", "brace", "sensitivity", "bounds")


def _case(tmp_path, text, name="case.toml"):
    p = tmp_path / name
    p.write_text(text, encoding="utf-8")
    return str(p)


def _json(*args):
    out = run_cli(*args, "--json")
    return out.returncode, json.loads(out.stdout)


# ---------------------------------------------------------------------------
# the case as given: exit status and run warning, every command


@pytest.mark.parametrize("command", COMMANDS)
def test_case_as_given_below_one_warns_and_exits_1(tmp_path, command):
    case = _case(tmp_path, BUCKLES)
    out = run_cli(command, case)
    assert out.returncode == 1, out.stderr
    assert out.stdout.splitlines()[1].startswith("WARNING: in-plane axis: the case as given has its lowest load "
                                                 "factor 0.76")
    assert "buckles elastically under its case loads" in out.stdout
    code, data = _json(command, case)
    assert code == 1
    assert [w["key"] for w in data["warnings"]] == [KEY]
    assert data["warnings"][0]["level"] == "warning" and data["warnings"][0]["axis"] == "in-plane"
    assert data["case_load_factors"]["in-plane"] == pytest.approx(0.7616, abs=1e-4)


@pytest.mark.parametrize("command", COMMANDS)
def test_case_as_given_above_one_exits_0_without_warning(tmp_path, command):
    case = _case(tmp_path, PROP)
    out = run_cli(command, case)
    assert out.returncode == 0, out.stderr
    assert "WARNING" not in out.stdout
    code, data = _json(command, case)
    assert code == 0 and data["warnings"] == []
    assert data["case_load_factors"]["in-plane"] > 1


@pytest.mark.parametrize("command", COMMANDS)
def test_wholly_above_one_has_no_mark(tmp_path, command):
    case = _case(tmp_path, CLEAN)
    out = run_cli(command, case)
    assert out.returncode == 0, out.stderr
    assert "< 1" not in out.stdout and "below 1" not in out.stdout and "WARNING" not in out.stdout
    code, data = _json(command, case)
    assert code == 0 and data["warnings"] == []
    assert data.get("below_one_ranges", []) == []
    assert "true" not in json.dumps({k: v for k, v in data.items() if "below_one" in k}).lower()


# ---------------------------------------------------------------------------
# points of each study below 1: marked, exit status unchanged


def test_sweep_marks_points_and_names_the_range(tmp_path):
    case = _case(tmp_path, PROP)
    out = run_cli("sweep", case, "--csv", str(tmp_path / "s.csv"))
    assert out.returncode == 0
    rows = [ln for ln in out.stdout.splitlines() if "in-plane" in ln and ln.startswith("   ")]
    assert len(rows) == 13
    marked = [ln for ln in rows if ln.endswith("  < 1")]
    assert len(marked) == 6  # 100 to 4642 kN*m/rad; 10000 kN*m/rad and above reach 1
    assert "  < 1: lowest load factor below 1: the column buckles under the case loads at that point" in out.stdout
    assert out.stdout.count("< 1: lowest load factor below 1") == 1  # the legend once
    assert ("load factor below 1 for restraint[1].rotation from 100.0 kN*m/rad to about 5889 kN*m/rad"
            in out.stdout)
    _, data = _json("sweep", case)
    lam = np.array(data["load_factor"]["governing"])
    assert data["below_one"] == (lam < 1).tolist() and sum(data["below_one"]) == 6
    assert data["below_one_ranges"] == ["load factor below 1 for restraint[1].rotation from 100.0 kN*m/rad to "
                                        "about 5889 kN*m/rad"]
    csv = (tmp_path / "s.csv").read_text(encoding="utf-8").splitlines()
    col = csv[0].split(",").index("below_one")
    assert [r.split(",")[col] for r in csv[1:]] == ["true"] * 6 + ["false"] * 7


def test_two_parameter_sweep_names_the_part_of_the_grid(tmp_path):
    case = _case(tmp_path, PROP)
    args = ("sweep", case, "--param", "restraint[1].rotation", "0.1 MN*m/rad", "1000 MN*m/rad",
            "--param", "restraint[3].lateral", "0.1 MN/m", "100 MN/m", "--scale", "log", "--points", "5")
    out = run_cli(*args)
    assert out.returncode == 0, out.stderr
    assert "load factor below 1 at " in out.stdout and " of 25 grid points, within restraint[1].rotation" in out.stdout
    _, data = _json(*args)
    lam = np.array(data["load_factor"]["governing"])
    assert np.array(data["below_one"]).shape == (5, 5)
    assert (np.array(data["below_one"]) == (lam < 1)).all() and 0 < (lam < 1).sum() < 25


def test_brace_marks_the_soft_end_of_the_curve(tmp_path):
    case = _case(tmp_path, PROP)
    out = run_cli("brace", case)
    assert out.returncode == 0
    assert "removed 0.8787 (< 1)" in out.stdout  # the brace removed, the column buckles
    assert "load factor below 1 for brace stiffness below about 997" in out.stdout
    _, data = _json("brace", case)
    lam = np.array(data["curve"]["load_factor"])
    assert data["curve"]["below_one"] == (lam < 1).tolist() and any(data["curve"]["below_one"])
    assert data["below_one"] == {"given": False, "rigid": False, "free": True}


def test_brace_below_one_even_when_rigid(tmp_path):
    case = _case(tmp_path, BUCKLES.replace('"6000 kN"', '"20000 kN"'))
    out = run_cli("brace", case)
    assert out.returncode == 1
    assert "load factor below 1 even with rigid braces" in out.stdout
    _, data = _json("brace", case)
    assert all(data["curve"]["below_one"]) and data["below_one"]["rigid"] is True


def test_sensitivity_marks_the_rows_of_a_plane_below_one(tmp_path):
    out = run_cli("sensitivity", _case(tmp_path, BUCKLES))
    rows = [ln for ln in out.stdout.splitlines() if " in-plane " in ln and ln.startswith("   ")]
    assert rows and all(ln.endswith("  < 1") for ln in rows)
    assert "(in-plane plane governs, load factor 0.7616 < 1)" in out.stdout
    _, data = _json("sensitivity", _case(tmp_path, BUCKLES))
    assert all(s["below_one"] for s in data["springs"])
    _, data = _json("sensitivity", _case(tmp_path, PROP, "prop.toml"))
    assert not any(s["below_one"] for s in data["springs"])


def test_bounds_marks_the_corners_below_one(tmp_path):
    case = _case(tmp_path, PROP)
    out = run_cli("bounds", case)
    assert out.returncode == 0  # the box reaches below 1, the case as given does not
    assert "in-plane: load factor 0.7533 to 1.060 (2 corners)  < 1" in out.stdout
    assert "load factor below 1 in the in-plane plane at 1 of 2 corners of the box" in out.stdout
    _, data = _json("bounds", case)
    assert [c["below_one"] for c in data["planes"][0]["corners"]] == [True, False]
    assert data["planes"][0]["below_one"] is True and data["below_one"] is True
    assert len(data["below_one_ranges"]) == 1


# ---------------------------------------------------------------------------
# charts


def test_sweep_chart_hatches_below_one_and_titles_the_warning(tmp_path):
    from fea.cli.study_common import study_from_text
    from fea.plot.study import BELOW_ONE_LABEL, CASE_BELOW_ONE_TITLE, plot_sweep
    from fea.study.paths import parse_key
    from fea.study.sweep import make_range, sweep

    def chart(text, case_below_one):
        study = study_from_text(text)
        r = make_range(study, parse_key("restraint[1].rotation"), 1e5, 1e9, 9, "log")
        fig = plot_sweep(sweep(study, [r]), title="t", case_below_one=case_below_one)
        ax = fig.axes[0]
        labels = [t.get_text() for t in ax.texts]
        hatched = [p for p in ax.patches if p.get_hatch()]
        crosses = [ln for ln in ax.lines if ln.get_marker() == "x"]
        return fig, labels, hatched, crosses

    fig, labels, hatched, crosses = chart(PROP, True)
    assert BELOW_ONE_LABEL in labels and hatched and crosses
    assert CASE_BELOW_ONE_TITLE in fig.get_suptitle()
    fig.savefig(tmp_path / "sweep.png")
    fig, labels, hatched, crosses = chart(CLEAN, False)
    assert BELOW_ONE_LABEL not in labels and not hatched and not crosses
    assert CASE_BELOW_ONE_TITLE not in fig.get_suptitle()


def test_chart_written_by_the_command(tmp_path):
    png = tmp_path / "brace.png"
    out = run_cli("brace", _case(tmp_path, BUCKLES), "--plot", str(png))
    assert out.returncode == 1 and png.stat().st_size > 0


# ---------------------------------------------------------------------------
# the stretches below 1


def test_ranges_below_one_interpolates_the_crossing():
    x = np.array([1.0, 2.0, 3.0, 4.0, 5.0])
    lam = np.array([0.5, 0.8, 1.2, 0.9, 1.1])
    text = lambda v: f"{v:g}"  # noqa: E731
    # 0.8 -> 1.2 between x = 2 and 3 passes 1 at 2.5; 1.2 -> 0.9 at 3 + 2/3; 0.9 -> 1.1 at 4.5
    assert _ranges_below_one(x, lam, False, text) == ["from 1 to about 2.5", "from about 3.66667 to about 4.5"]
    # on a logarithmic range the interpolation is in log10 x: halfway between 10 and 1000 is 100
    assert _ranges_below_one(np.array([10.0, 1000.0]), np.array([0.5, 1.5]), True, text) == ["from 10 to about 100"]
    assert _ranges_below_one(x, np.full(5, 0.5), False, text) == ["over the whole range"]
    assert _ranges_below_one(x, np.full(5, 2.0), False, text) == []


def test_below_one_mask():
    # a mechanism (0) buckles; a point not analysed (NaN) is not marked
    assert below_one([0.0, 0.99, 1.0, float("nan"), 2.0]).tolist() == [True, True, False, False, False]


# ---------------------------------------------------------------------------
# size reports a load factor per candidate

#: Invented: a pinned strut whose [design] load_factor 0.2 makes the design forces a fifth of the case loads,
#: so a section passes the axial checks while buckling under the case loads.
STRUT = """
title = "Pinned strut to size (invented)"
[material]
E = "210 GPa"
fy = "275 MPa"
[[segment]]
name = "strut"
length = "4.5 m"
section = { shape = "shs", b = "120 mm", t = "6 mm", r_out = "12 mm" }
[[restraint]]
at = "base"
lateral = "rigid"
[[restraint]]
at = "top"
lateral = "rigid"
[[load]]
at = "top"
axial = "2000 kN"
[design]
standard = "EN 1993-1-1"
curve_major = "c"
curve_minor = "c"
load_factor = 0.2
"""
#: two invented sections of the demo catalogue (cases/demo_catalogue.csv)
CATALOGUE = """name,shape,b [mm],h [mm],tf [mm],tw [mm],r [mm],t [mm],r_out [mm],d [mm],mass [kg/m]
DEMO-SQ 120x6,shs,120,,,,,6,12,,20.75
DEMO-SQ 150x6,shs,150,,,,,6,12,,26.40
"""


def test_size_chosen_section_below_one_warns_and_exits_1(tmp_path):
    cat = _case(tmp_path, CATALOGUE, "cat.csv")
    out = run_cli("size", _case(tmp_path, STRUT), "--catalogue", cat, "--json")
    assert out.returncode == 1, out.stderr
    data = json.loads(out.stdout)
    assert data["chosen"] == "DEMO-SQ 150x6"
    assert [c["below_one"] for c in data["candidates"]] == [True, True]
    assert [w["key"] for w in data["warnings"]] == [KEY]
    out = run_cli("size", _case(tmp_path, STRUT), "--catalogue", cat)
    assert out.returncode == 1
    assert "WARNING: with DEMO-SQ 150x6 the lowest load factor 0.5864 is below 1" in out.stdout
    assert "<- lightest passing  < 1" in out.stdout and "FAILS with it" in out.stdout


def test_size_above_one_has_no_mark(tmp_path):
    cat = _case(tmp_path, CATALOGUE, "cat.csv")
    case = _case(tmp_path, STRUT.replace('"2000 kN"', '"300 kN"').replace("load_factor = 0.2", ""))
    out = run_cli("size", case, "--catalogue", cat)
    assert out.returncode == 0, out.stdout
    assert "< 1" not in out.stdout and "WARNING" not in out.stdout
    data = json.loads(run_cli("size", case, "--catalogue", cat, "--json").stdout)
    assert data["warnings"] == [] and not any(c["below_one"] for c in data["candidates"])
