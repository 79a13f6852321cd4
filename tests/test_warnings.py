"""Every warning key: raised by a case of its own, shown in the summary, the JSON and the report (issue 12 item 7).

The cases are invented for these tests.  Each test runs the command in-process through
``fea.cli.main`` (summary and JSON) and builds the Markdown report of the same run.
"""

from __future__ import annotations

import html
import json
import re
from pathlib import Path

import pytest

from fea.cli import main
from fea.notices import CHECK, KINDS, WARNING
from fea.pipeline import REPORT_PARTS, parse_case, run_case
from fea.report import build_markdown

ROOT = Path(__file__).resolve().parents[1]

BASE = """
title = "warning probe (invented)"
[units]
length = "m"
force = "kN"
[material]
name = "S355 steel"
E = "{E}"
fy = "355 MPa"
{analysis}
[[segment]]
name = "lower"
length = "{L1}"
I_major = "57.9e6 mm^4"
I_minor = "20.0e6 mm^4"
A = "7810 mm^2"
{S}
[[segment]]
name = "upper"
length = "{L2}"
I_major = "57.9e6 mm^4"
I_minor = "20.0e6 mm^4"
A = "7810 mm^2"
{S}
[[restraint]]
at = "base"
lateral = "rigid"
rotation = "{base_rot}"
{top}
{extra}
[[load]]
at = "{load_at}"
axial = "{P}"
{loads}
"""


def _case(**kw) -> str:
    v = dict(E="210 GPa", analysis="", L1="2 m", L2="2 m", S="", base_rot="5 MN*m/rad", top_lat="rigid",
             extra="", load_at="top", P="500 kN", loads="")
    v.update(kw)
    v["top"] = "" if v["top_lat"] == "free" else f'[[restraint]]\nat = "top"\nlateral = "{v["top_lat"]}"'

    return BASE.format(**v)


#: key -> a case that raises it (and a comment on how)
CASES: dict[str, str] = {
    # a 4 m column on a soft base spring, free at the top: buckles far below its 500 kN
    "buckles-under-case-loads": _case(top_lat="free", base_rot="0.3 MN*m/rad"),
    # alpha_cr below 1 on loads 2 x 500 kN while the case loads alone stay above their critical load
    "buckles-under-design-loads": _case(top_lat="free", base_rot="2 MN*m/rad", P="150 kN",
                                        loads='[design]\nstandard = "EN 1993-1-1"\ncurve_major = "a"\n'
                                              'curve_minor = "b"\nload_factor = 12\n'),
    # a tolerance below what double precision gives: refinement stops on round-off
    "not-converged": _case(analysis="[analysis]\ntolerance = 1e-12"),
    # a spring a hair from the joint at 2 m: converges, but round-off limits the estimate
    "roundoff-limited": _case(extra='[[restraint]]\nat = "1.9999 m"\naxis = "minor"\nlateral = "2 MN/m"'),
    # E typed in MPa instead of GPa
    "modulus-implausible": _case(E="210 MPa", P="5 kN"),
    "yield-strength-implausible": _case().replace('fy = "355 MPa"', 'fy = "3550 MPa"'),
    # a 40 m strut of this section: K L / r far beyond 200
    "slenderness-over-limit": _case(L1="20 m", L2="20 m", P="5 kN"),
    # the load in N where kN was meant
    "load-factor-very-high": _case(P="50 N"),
    "stations-very-close": _case(extra='[[restraint]]\nat = "1.9995 m"\naxis = "minor"\nlateral = "rigid"'),
    # rigid base (rotation and translation), a joint held rigidly, pinned top: fixed-fixed and fixed-pinned
    "idealised-support": _case(base_rot="rigid",
                               extra='[[restraint]]\nat = "2 m"\nlateral = "rigid"\nrotation = "rigid"'),
    # almost all the load enters at mid-height; the upper segment carries 1 kN
    "lightly-loaded-segment": _case(P="1 kN", loads='[[load]]\nat = "2 m"\naxial = "800 kN"'),
    # a straight imperfect column: no bow, no lateral load, no eccentricity
    "imperfect-analysis": _case(loads='[imperfection]\nbow = "0 mm"\nanalysis = "second-order"'),
    # a tolerance beyond reach: the second-order mesh stops short of it
    "imperfect-not-complete": _case(analysis="[analysis]\ntolerance = 1e-12",
                                    loads='[imperfection]\nbow = "L/300"\nanalysis = "second-order"'),
}


def test_every_kind_has_a_case_and_a_line_in_the_docs():
    assert set(CASES) == set(KINDS)
    doc = (ROOT / "docs" / "warnings.md").read_text(encoding="utf-8")
    documented = set(re.findall(r"^\| `([a-z-]+)` \| (?:warning|check) \|", doc, flags=re.M))
    assert documented == set(KINDS)
    for key, (level, meaning) in KINDS.items():
        assert level in (WARNING, CHECK) and meaning, key


@pytest.mark.parametrize("key", sorted(CASES))
def test_warning_is_raised_and_shown_everywhere(key, tmp_path, capsys):
    path = tmp_path / f"{key}.toml"
    path.write_text(CASES[key], encoding="utf-8")
    status = main(["check", str(path), "--json", str(tmp_path / "r.json")])
    text = capsys.readouterr().out
    data = json.loads((tmp_path / "r.json").read_text(encoding="utf-8"))
    found = [w for w in data["warnings"] if w["key"] == key]
    assert found, f"{key} not raised; got {[w['key'] for w in data['warnings']]}"
    level = KINDS[key][0]
    for w in found:
        assert w["level"] == level and w["text"]
        # the summary prints it with its key and level, the same sentence
        assert f"{'WARNING' if level == WARNING else 'CHECK'} ({key}): {w['text']}" in text
    # the exit status follows the level (a check-level warning leaves it to the verdict)
    if level == WARNING:
        assert status == 1
    # the report's summary box and closing part show the same sentence with its key
    res = run_case(parse_case(CASES[key]))
    md = build_markdown(res, figures={}, parts=REPORT_PARTS, date="2026-01-01")
    # Markdown and HTML escapes undone
    flat = " ".join(html.unescape(re.sub(r"\\([\\`*_{}\[\]()#+\-.!|<>~])", r"\1", md)).split())
    for w in found:
        assert flat.count(" ".join(w["text"].split())) >= 2, f"{key}: report shows it fewer than twice"
        assert f"({key})" in flat
