"""Calculation report (issue 7): content traced to the JSON result, Markdown parity, the subcommand,
and the page as headless Chromium renders, screenshots and prints it."""

from __future__ import annotations

import html as html_module
import math
import re
import xml.etree.ElementTree as ET
from collections.abc import Mapping
from html.parser import HTMLParser
from pathlib import Path

import pytest

from fea.cli import main
from fea.pipeline import REPORT_PARTS as PARTS
from fea.pipeline import load_case
from fea.pipeline import result_json as result_dict
from fea.report import build_markdown, build_report
from fea.units import to_display

CASES = sorted((Path(__file__).resolve().parent.parent / "cases").glob("*.toml"))
DATE = "2026-12-01"
#: Published names with digits the report may print as they are: the hash algorithm, and the subscripts of
#: the partial factors gamma_M0, gamma_M1, gamma_M2 (EN 1993-1-1:2005 6.1).
NAMES = {"SHA-256", "M0", "M1", "M2"}
#: ... and the subscripts with digits of the member checks with bending (fea/report/design_bending.py): EN
#: 1993-1-1 6.3.2.2 lambda_LT,0, Annex A lambda_0, M_cr,0, C_1, C_my,0, C_mz,0; AISC 360 Appendix 8 M_1/M_2, B_1, P_e1.
NAMES |= {"LT,0", "0", "cr,0", "1", "my,0", "mz,0", "2", "e1"}
#: Constants of the published formulas the design part writes out, by formula (``const:<formula>``); each
#: set lists the numbers printed in the formula as the source gives it.
CONSTANTS = {
    # utilisation N_Ed / N_Rd <= 1 (common practice: every standard here)
    "check": {"1"},
    # EN 1993-1-1:2005 6.3.1.2(1) Eq. (6.49): Phi = 0.5 [1 + alpha (lambda_bar - 0.2) + lambda_bar^2],
    # chi = 1 / (Phi + sqrt(Phi^2 - lambda_bar^2)) <= 1.0; 6.3.1.2(4): no reduction for lambda_bar <= 0.2
    "EN 1993-1-1 6.3.1.2": {"0.5", "1", "0.2"},
    # EN 1993-1-1:2005 6.2.3(2) Eq. (6.7): N_u,Rd = 0.9 A_net fu / gamma_M2
    "EN 1993-1-1 6.2.3": {"0.9"},
    # AISC 360-16 E3 (E3-2) Fcr = 0.658^(Fy/Fe) Fy when Fy/Fe <= 2.25, (E3-3) Fcr = 0.877 Fe (from memory)
    "AISC 360 E3": {"0.658", "0.877", "2.25"},
    # AS 4100 6.3.3 (from memory): lambda_n = (le/r) sqrt(kf) sqrt(fy/250),
    # alpha_a = 2100 (lambda_n - 13.5) / (lambda_n^2 - 15.3 lambda_n + 2050), eta = 0.00326 (lambda - 13.5),
    # xi = ((lambda/90)^2 + 1 + eta) / (2 (lambda/90)^2), alpha_c = xi (1 - sqrt(1 - (90 / (xi lambda))^2))
    "AS 4100 6.3.3": {"250", "2100", "13.5", "15.3", "2050", "0.00326", "90", "1", "2"},
    # AS 4100 7.2 (from memory): Nt = min(Ag fy, 0.85 kt An fu), kt = 1 here
    "AS 4100 7.2": {"0.85", "1"},
    # BS 5950-1:2000 Annex C.1, C.2: lambda0 = 0.2 sqrt(pi^2 E / py), eta = a (lambda - lambda0) / 1000,
    # phi = (py + (eta + 1) pE) / 2, eta >= 0 (the 0 also as the subscript of lambda0)
    "BS 5950-1 Annex C": {"0.2", "1000", "1", "2", "0"},
    # Perry-Robertson: B = (fy + (1 + eta) sigma_e) / 2 (Timoshenko & Gere, from memory)
    "Perry-Robertson": {"1", "2"},
    # Rankine-Gordon: sigma = fc / (1 + a (L/r)^2), a written 1/n (common practice)
    "Rankine-Gordon": {"1"},
}
# The constants the written-out formulas of the member checks with bending print, with their sources beside them
# (tests/test_bending_checks.py, BENDING_CONSTANTS).
def _with_bending(constants: dict) -> dict:
    from tests.test_bending_checks import BENDING_CONSTANTS

    out = {k: set(v) for k, v in constants.items()}
    for ref, consts in BENDING_CONSTANTS.items():
        out.setdefault(ref, set()).update(consts)
    return out


CONSTANTS = _with_bending(CONSTANTS)
SUP = str.maketrans("⁰¹²³⁴⁵⁶⁷⁸⁹⁻", "0123456789-")
NUMBER = re.compile(r"^(-?\d+)(?:\.(\d+))?(?: × 10([⁻⁰¹²³⁴⁵⁶⁷⁸⁹]+))?$")


def _run(path: Path):
    from fea.pipeline import run_case

    case = load_case(path)
    res = run_case(case)
    return case, res, result_dict(res)


class _Runs(dict):
    """Each demo case run once, on first use: name -> (case, results, JSON dict, HTML)."""

    def __missing__(self, name: str):
        case, res, data = _run(next(p for p in CASES if p.stem == name))
        self[name] = value = (case, res, data, build_report(res, data, parts=PARTS, date=DATE))
        return value


@pytest.fixture(scope="module")
def runs() -> dict:
    return _Runs()


# -- parsing the page -------------------------------------------------------------------------------


class _Page(HTMLParser):
    """Collects elements carrying ``data-src`` with their text, text outside them, headings, attributes."""

    VOID = {"meta", "link", "br", "img", "input", "hr", "path", "use", "rect", "line", "circle", "polygon",
            "polyline", "stop", "ellipse"}

    def __init__(self) -> None:
        super().__init__(convert_charrefs=True)
        self.stack: list[tuple[str, dict]] = []
        self.sourced: list[dict] = []  # {"src", "u", "text", "in_svg"}
        self.loose: list[str] = []      # text with digits outside any data-src element
        self.headings: list[tuple[str, str]] = []
        self.attrs: list[tuple[str, str, str]] = []
        self._open: list[dict] = []
        self._head: list | None = None

    def handle_starttag(self, tag, attrs):
        a = dict(attrs)
        for k, v in attrs:
            self.attrs.append((tag, k, v or ""))
        if tag in self.VOID:
            return
        self.stack.append((tag, a))
        if "data-src" in a:
            rec = {"src": a["data-src"], "u": a.get("data-u", ""), "text": "",
                   "in_svg": any(t == "svg" for t, _ in self.stack[:-1])}
            self.sourced.append(rec)
            self._open.append(rec)
        if tag in ("h1", "h2", "h3", "h4"):
            self._head = [tag, ""]

    def handle_startendtag(self, tag, attrs):
        for k, v in attrs:
            self.attrs.append((tag, k, v or ""))

    def handle_endtag(self, tag):
        if tag in self.VOID:
            return
        while self.stack:
            t, a = self.stack.pop()
            if "data-src" in a:
                self._open.pop()
            if t == tag:
                break
        if self._head and tag == self._head[0]:
            self.headings.append((self._head[0], self._head[1].strip()))
            self._head = None

    def handle_data(self, data):
        tags = [t for t, _ in self.stack]
        if "head" in tags or "style" in tags or "title" in tags:
            return
        if self._head is not None:
            self._head[1] += data
        if self._open:
            for rec in self._open:
                rec["text"] += data
        elif re.search(r"[0-9]", data):
            self.loose.append(data)


def parse_page(html: str) -> _Page:
    p = _Page()
    p.feed(html)
    p.close()
    return p


def _resolve(root, path: str):
    obj = root
    for part in path.split("/"):
        if isinstance(obj, (list, tuple)):
            obj = obj[int(part)]
        elif isinstance(obj, Mapping):  # dicts and read-only views of them
            obj = obj[part]
        else:
            obj = getattr(obj, part)
    return obj


def _close(text: str, expected: float) -> bool:
    """The shown text equals ``expected`` to its last shown digit."""
    m = NUMBER.match(text.replace("\u2009", "").replace("\u2212", "-").strip())
    assert m, f"not a number as the report writes one: {text!r}"
    whole, frac, exp = m.groups()
    shown = float(f"{whole}.{frac}" if frac else whole)
    scale = 10.0 ** int(exp.translate(SUP)) if exp else 1.0
    half_ulp = 0.5 * 10.0 ** (-len(frac or "")) * scale
    return abs(shown * scale - expected) <= half_ulp * (1 + 1e-9) + 1e-300


def _check_value(text: str, value, unit: str) -> None:
    if isinstance(value, bool):
        assert text in ({"yes", "permanent"} if value else {"no", "variable"}), (text, value)
    elif value is None:
        assert text == "—"
    elif isinstance(value, str):
        assert text == value
    elif math.isinf(value):
        assert text == "rigid", (text, value)
    elif value == 0 and text == "free":
        pass
    else:
        expected = 100.0 * value if unit == "%" else (value if unit == "" else to_display(value, unit))
        assert _close(text, expected), f"shown {text!r}, the source gives {expected!r} {unit}"


def check_numbers(html: str, case, data: dict, warnings: list[str] = ()) -> int:
    """Every number on the page sits in an element naming its source, and equals that source."""
    page = parse_page(html)
    assert not page.loose, f"numbers without a source on the page: {page.loose[:5]}"
    n = 0
    for rec in page.sourced:
        kind, _, path = rec["src"].partition(":")
        text = rec["text"]
        if kind == "json":
            _check_value(text, _resolve(data, path), rec["u"])
        elif kind == "case":
            _check_value(text, _resolve(case, path), rec["u"])
        elif kind == "ord":
            assert text == path
        elif kind == "key":
            _resolve(data, path)  # the label names a key of the JSON result
        elif kind == "name":  # a published name that contains digits, e.g. of the hash algorithm
            assert text == path and text in NAMES
        elif kind == "const":  # a constant of a published formula written out in the design part
            assert text in CONSTANTS[path], f"{text!r} is not a constant of {path}"
        elif kind == "report":
            assert path == "date" and text == DATE
        elif kind == "run":
            assert text == list(warnings)[int(path.split("/")[1])]
        else:
            raise AssertionError(f"unknown source {rec['src']!r}")
        n += 1
    return n


# -- content ----------------------------------------------------------------------------------------


@pytest.mark.parametrize("path", CASES, ids=[p.stem for p in CASES])
def test_every_demo_case_gives_a_report_whose_numbers_are_the_json(runs, path):
    case, res, data, html = runs[path.stem]
    n = check_numbers(html, case, data)
    # at least the load factors and the per-segment figures of every plane are shown
    expected = sum(len(b["load_factors"]) + 7 * len(b["segments"]) for b in data["buckling"])
    assert n >= expected
    page = parse_page(html)
    titles = [t for h, t in page.headings if h == "h2"]
    assert titles[:3] == ["Inputs", "Method", "Elastic critical buckling"]
    assert titles[-1] == "Warnings, limitations and cautions"
    assert ("Design check" in titles) == ("design" in data)
    assert ("Imperfect column" in titles) == ("imperfect" in data)
    for text in data["cautions"]:  # the caution and every limitation (fea/cautions.py) appear
        assert text in html.replace("&#x27;", "'")


def test_governing_numbers_are_marked_with_their_json_keys(runs):
    case, res, data, html = runs["crane_column"]
    page = parse_page(html)
    shown = {r["src"]: r["text"] for r in page.sourced}
    assert "json:governing_load_factor" in shown
    for i, b in enumerate(data["buckling"]):
        for j in range(len(b["segments"])):
            for key in ("critical_axial_force_N", "effective_length_factor", "k_meaningful"):
                assert f"json:buckling/{i}/segments/{j}/{key}" in shown
    # display units of the case: kN and m here, so N_cr is shown in kN
    s = data["buckling"][0]["segments"][0]
    assert _close(shown["json:buckling/0/segments/0/critical_axial_force_N"], s["critical_axial_force_N"] / 1e3)


def test_millimetre_case_is_shown_in_its_own_units(runs):
    case, res, data, html = runs["mezzanine_column"]
    assert case.display.length == "mm"
    page = parse_page(html)
    top = next(r for r in page.sourced if r["src"] == "json:buckling/0/segments/1/top_m")
    assert top["u"] == "mm" and _close(top["text"], 1e3 * data["buckling"][0]["segments"][1]["top_m"])


def test_design_part_shows_formula_clause_and_utilisation(runs):
    case, res, data, html = runs["design_hall_column"]
    page = parse_page(html)
    srcs = {r["src"] for r in page.sourced}
    assert "json:design/max_utilisation" in srcs
    assert {"json:design/checks/0/clause", "json:design/checks/0/formula", "json:design/checks/0/utilisation",
            "json:design/checks/0/resistance_N"} <= srcs


def test_warnings_are_shown_verbatim(runs):
    case, res, data, _ = runs["shed_column"]
    warns = ["UserWarning: a demo warning raised at 2.5 m (invented for this test)"]
    html = build_report(res, data, {}, warnings=warns, parts=PARTS, date=DATE)
    check_numbers(html, case, data, warns)
    assert "a demo warning raised" in html


def test_report_refuses_the_json_of_another_case(runs):
    _, res, _, _ = runs["shed_column"]
    _, _, other, _ = runs["crane_column"]
    with pytest.raises(ValueError, match="case_sha256"):
        build_report(res, other, {}, parts=PARTS, date=DATE)


def test_report_reads_the_result_objects_not_the_json(runs):
    import copy

    case, res, data, _ = runs["crooked_post"]
    html = build_report(res, figures={}, parts=PARTS, date=DATE)
    check_numbers(html, case, data)  # every number is still the JSON's, at the path the report names
    doctored = copy.deepcopy(data)
    doctored["governing_load_factor"] = 99.0
    doctored["buckling"][0]["segments"][0]["effective_length_factor"] = 7.0
    doctored["imperfect"][0]["limit_load_factor"] = 42.0
    assert build_report(res, doctored, {}, parts=PARTS, date=DATE) == html
    assert (build_markdown(res, doctored, {}, parts=PARTS, date=DATE)
            == build_markdown(res, figures={}, parts=PARTS, date=DATE))


def test_report_refuses_an_analysis_it_has_no_part_for(runs):
    import dataclasses

    _, res, _, _ = runs["shed_column"]
    with pytest.raises(ValueError, match="no part for the analysis 'unheard_of'"):
        build_report(dataclasses.replace(res, extras={**res.extras, "unheard_of": object()}), figures={}, parts=PARTS,
                     date=DATE)


def test_markdown_has_the_same_numbers_in_the_same_order(runs):
    case, res, data, html = runs["crane_column"]
    md = html_module.unescape(re.sub(r"\\([\\|*_`])", r"\1", build_markdown(res, data, {}, parts=PARTS, date=DATE)))
    page = parse_page(html)
    pos = 0
    for rec in page.sourced:
        if rec["in_svg"] or rec["src"].startswith(("key:",)) or rec["text"] == "":
            continue
        if re.search(r"[0-9]", rec["text"]):
            found = md.find(rec["text"], pos)
            assert found >= 0, f"{rec['text']!r} ({rec['src']}) missing from the Markdown after offset {pos}"
            pos = found
    for _, title in parse_page(html).headings:
        assert title.split(" (")[0] in md
    assert md.startswith("# Two-stage crane column")


# -- the subcommand ---------------------------------------------------------------------------------


def test_report_subcommand_writes_html_markdown_and_figures(tmp_path, capsys):
    out, md = tmp_path / "crane.html", tmp_path / "crane.md"
    case = str(CASES[0].with_name("crane_column.toml"))
    assert main(["report", case, "-o", str(out), "--markdown", str(md), "--date", DATE]) == 0
    text = out.read_text(encoding="utf-8")
    assert text.startswith("<!DOCTYPE html>") and text.rstrip().endswith("</html>")
    assert "crane-sketch.svg" in md.read_text(encoding="utf-8")
    for name in ("crane-sketch.svg", "crane-modes.svg"):
        ET.parse(tmp_path / name)  # well-formed SVG files beside the Markdown
    assert sorted(p.name for p in tmp_path.iterdir()) == ["crane-modes.svg", "crane-sketch.svg", "crane.html",
                                                          "crane.md"]


def test_report_subcommand_bad_input_writes_nothing(tmp_path, capsys):
    case = str(CASES[0].with_name("crane_column.toml"))
    assert main(["report", case, "-o", str(tmp_path / "r.pdf")]) == 2
    assert "should end in .html" in capsys.readouterr().err
    assert main(["report", str(tmp_path / "missing.toml"), "-o", str(tmp_path / "r.html")]) == 2
    assert main(["report", case, "-o", str(tmp_path / "r.html"), "--units", "kN"]) == 2
    assert list(tmp_path.iterdir()) == []


# -- in a real browser ------------------------------------------------------------------------------

NET_SECTION = '\n[[design.segment]]\nsegment = 2\nA_net = "3800 mm^2"\n'


DESIGNS = {
    "EN 1993-1-1": 'standard = "EN 1993-1-1"\ncurve_major = "b"\ncurve_minor = "c"',
    "AISC 360 LRFD": 'standard = "AISC 360"',
    "AISC 360 ASD": 'standard = "AISC 360"\nmethod = "ASD"',
    "AS 4100": 'standard = "AS 4100"\nalpha_b_major = 0\nalpha_b_minor = -0.5',
    "BS 5950-1": 'standard = "BS 5950-1"\ncurve_major = "b"\ncurve_minor = "c"',
    "Perry-Robertson": 'standard = "Perry-Robertson"\nfactor_of_safety = 1.5',
    "Rankine-Gordon": 'standard = "Rankine-Gordon"\na = "1/7500"',
    "working-stress": 'standard = "working-stress"\nfactor_of_safety = 2.5\nsigma_allow = "140 MPa"',
}

#: Symbols each standard's written-out compression check must show (its formula lines).
SYMBOLS = {
    "EN 1993-1-1": ("<i>Φ</i>", "<i>χ</i>", "<sub>b,Rd</sub>", "<i>λ̄</i>"),
    "AISC 360 LRFD": ("<sub>e</sub>", "<sub>cr</sub>", "<i>φ</i><sub>c</sub>"),
    "AISC 360 ASD": ("<i>Ω</i><sub>c</sub>",),
    "AS 4100": ("<sub>n</sub>", "<i>α</i><sub>a</sub>", "<i>η</i>", "<i>ξ</i>", "<i>α</i><sub>c</sub>"),
    "BS 5950-1": ("<sub>E</sub>", '<i>λ</i><sub><span class="t" data-src="const:BS 5950-1 Annex C">0</span></sub>',
                  "<i>φ</i>", "<sub>c</sub>"),
    "Perry-Robertson": ("<i>σ</i><sub>e</sub>", "<i>B</i>", "FoS"),
    "Rankine-Gordon": ("<sub>c</sub> / [",),
    "working-stress": ("<sub>allow</sub>", "<sub>cr</sub>"),
}


@pytest.mark.parametrize("name", list(DESIGNS))
def test_design_checks_are_written_out_with_every_number_traced(name):
    from fea.pipeline import parse_case, run_case

    from .test_design_integration import stepped

    case = parse_case(stepped("[design]\n" + DESIGNS[name] + NET_SECTION, top="-60 kN", step="900 kN"))
    res = run_case(case)
    data = result_dict(res)
    html = build_report(res, data, {}, parts=PARTS, date=DATE)
    check_numbers(html, case, data)  # every substituted number is the JSON's (or a named constant)
    checks = data["design"]["checks"]
    assert {c["kind"] for c in checks} == {"compression", "tension"}
    # one written-out block per check, the governing one marked, and every verdict stated
    assert html.count('<div class="calc') == len(checks)
    assert html.count('<div class="calc gov">') == 1
    assert html.count("→  passes") + html.count("→  FAILS") == len(checks)
    for symbol in SYMBOLS[name]:
        assert symbol in html, symbol
    # the substituted inputs and intermediates are sourced from the check's details
    srcs = {r["src"] for r in parse_page(html).sourced}
    for n, c in enumerate(checks):
        assert f"json:design/checks/{n}/utilisation" in srcs and f"json:design/checks/{n}/resistance_N" in srcs
        if c["kind"] == "compression":
            assert f"json:design/checks/{n}/N_cr_N" in srcs
            assert f"json:design/checks/{n}/details/A_m2" in srcs
    assert "Numbers substituted" not in html and "Slenderness name" not in html
    md = build_markdown(res, data, {}, parts=PARTS, date=DATE)
    assert md.count("→  passes") + md.count("→  FAILS") == len(checks)


def test_imperfect_part_uses_engineering_wording(runs):
    case, res, data, html = runs["crooked_post"]
    for label in ("Perry-Robertson first-yield force", "Elements of the final mesh", "Elastic critical force"):
        assert label in html
    for raw in (">Perry force<", ">N elements<", ">N fibres<"):
        assert raw not in html


def test_design_part_of_a_member_not_verified_for_twisting_traces_every_number(tmp_path):
    """A tee strut the thin-walled analysis does not cover: the failure mode not covered is listed with its
    source, so the numbers in it ("segment 1", "6.3.1.4") trace to the JSON (invented case)."""
    from fea.pipeline import REPORT_PARTS, parse_case, run_case
    from fea.report import build_markdown

    text = """
title = "tee strut, not covered (invented)"
[units]
length = "m"
force = "kN"
[material]
E = "210 GPa"
fy = "355 MPa"
[[segment]]
name = "strut"
length = "2.5 m"
section = { shape = "tee", b = "150 mm", h = "150 mm", tf = "8 mm", tw = "6 mm" }
[[restraint]]
at = "base"
lateral = "rigid"
[[restraint]]
at = "top"
lateral = "rigid"
[[load]]
at = "top"
axial = "150 kN"
[[distributed_load]]
from = "base"
to = "top"
axial = "0.1 kN/m"
[design]
standard = "EN 1993-1-1"
curve = "c"
"""
    case = parse_case(text)
    res = run_case(case)
    assert res.extras["design"].verdict == "not verified" and res.extras["design"].unchecked
    data = result_dict(res)
    html = build_report(res, data, parts=PARTS, date=DATE)
    check_numbers(html, case, data)  # every number on the page names its source and equals it
    md = build_markdown(res, figures={}, parts=REPORT_PARTS, date="2026-01-01")
    assert "Failure modes not covered" in md and "flexural-torsional" in md
