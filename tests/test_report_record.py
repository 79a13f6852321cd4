"""The calculation record shows everything analysed (issue 13, item 6): the inputs of every demo case, the
identification fields of ``[record]`` and the command's options, the case file in an appendix, the summary's
precision, each standard's own notation, and engineering words only."""

from __future__ import annotations

import re
from pathlib import Path

import pytest

from fea.errors import CaseError
from fea.pipeline import REPORT_PARTS as PARTS
from fea.pipeline import load_case, parse_case, result_json, run_case, summary
from fea.report import build_markdown, build_report
from fea.report.document import fmt_number

from .test_report import CASES, DATE, DESIGNS, NET_SECTION, check_numbers, parse_page

ROOT = Path(__file__).resolve().parents[1]


class _Runs(dict):
    """Each demo case run once without its imperfect-column analysis (the inputs do not depend on it):
    name -> (case, results, JSON, HTML, Markdown)."""

    def __missing__(self, name: str):
        case = load_case(next(p for p in CASES if p.stem == name))
        res = run_case(case, skip=("imperfect",))
        data = result_json(res)
        self[name] = value = (case, res, data, build_report(res, data, {}, parts=PARTS, date=DATE),
                              build_markdown(res, data, {}, parts=PARTS, date=DATE))
        return value


@pytest.fixture(scope="module")
def runs() -> dict:
    return _Runs()


def _inputs(md: str) -> str:
    return md[md.index("## 1 Inputs"):md.index("## 2 Method")]


# -- inputs -----------------------------------------------------------------------------------------


@pytest.mark.parametrize("path", CASES, ids=[p.stem for p in CASES])
def test_inputs_show_eccentricities_lateral_loads_and_sections(runs, path):
    case, res, data, html, md = runs[path.stem]
    check_numbers(html, case, data)  # every number shown is traced to the case or the result
    srcs = {r["src"] for r in parse_page(html).sourced}
    inputs = _inputs(md)
    for i, info in enumerate(case.loads):
        for key in ("eccentricity", "eccentricity_major", "eccentricity_minor", "lateral"):
            if getattr(info, key) is not None:
                assert f"case:loads/{i}/{key}" in srcs, (i, key)
                assert "Eccentricities and lateral forces of the loads" in inputs
    spec = case.extras.get("lateral") or getattr(case.extras.get("imperfection"), "loads", None)
    if spec is not None and not spec.empty:
        assert "Lateral actions" in inputs
        for kind in ("point", "distributed", "moments"):
            for j, _ in enumerate(getattr(spec, kind)):
                assert any(s.startswith("case:extras/") and f"/{kind}/{j}/1/" in s for s in srcs), (kind, j)
    for i, info in enumerate(case.segments):
        if info.shape is not None:
            assert "### 1.3 Sections" in inputs
            for name in ("b", "h", "d", "t", "tf", "tw"):
                if getattr(info.shape, name, None):
                    assert f"case:segments/{i}/shape/{name}" in srcs, (i, name)
    if "imperfection" in case.extras:
        assert "Imperfection and residual stress" in inputs and "case:extras/imperfection/residual_stress" in srcs
    if "design" in case.extras:
        assert "Design parameters" in inputs and "case:extras/design/standard" in srcs
    if "study" in case.extras:
        assert "Restraint studies" in inputs


def test_the_demo_cases_exercise_every_kind_of_input(runs):
    # the cases above are not vacuous: between them they hold eccentricities, lateral loads and sections
    cases = [runs[p.stem][0] for p in CASES]
    assert any(info.eccentricity_major is not None for c in cases for info in c.loads)
    assert any("lateral" in c.extras for c in cases)
    assert sum(info.shape is not None for c in cases for info in c.segments) >= 3


def test_crooked_post_inputs_read_as_given(runs):
    case, res, data, html, md = runs["crooked_post"]
    inputs = _inputs(md)
    # invented demo data (cases/crooked_post.toml): 60 kN at 3.6 m with a 150 mm eccentricity, 1.6 kN/m wind,
    # an I section 150 x 300 x 10.7 x 7.1 with r = 15 mm, residual stress 0.3 fy, bow L/1000
    assert "| 2 | 3600 | 60.00 | 150.0 |" in inputs
    assert "*b* = 150; *h* = 300; *t*<sub>f</sub> = 10.7; *t*<sub>w</sub> = 7.1; *r* = 15" in inputs
    assert "| applied moment | major | 3600 | 9000 |" in inputs  # 60 kN x 150 mm = 9000 kN mm
    assert "0.300" in inputs and "| 1000 |" in inputs


# -- identification fields --------------------------------------------------------------------------

RECORD = '''
[record]
project = "Dock 2 canopy (invented)"
job = "J-2041"
prepared_by = "A. Engineer"
checked_by = "B. Checker"
revision = 3
date = 2026-03-01
'''


def _record_case(extra: str = RECORD) -> str:
    return (ROOT / "cases" / "shed_column.toml").read_text(encoding="utf-8") + extra


def test_record_table_fills_the_identification_rows():
    case = parse_case(_record_case())
    res = run_case(case)
    html = build_report(res, result_json(res), {}, parts=PARTS)  # no date given: the table's
    head = html[html.index('<table class="ident">'):html.index("</header>")]
    for label, value, src in (("Project", "Dock 2 canopy (invented)", "case:extras/record/project"),
                              ("Job number", "J-2041", "case:extras/record/job"),
                              ("Prepared by", "A. Engineer", "case:extras/record/prepared_by"),
                              ("Checked by", "B. Checker", "case:extras/record/checked_by"),
                              ("Revision", "3", "case:extras/record/revision"),
                              ("Date", "2026-03-01", "case:extras/record/date")):
        assert f'<th>{label}</th><td><span class="t" data-src="{src}">{value}</span>' in head, label
    # options override the table, field by field; the --date option overrides the table's date
    html = build_report(res, figures={}, parts=PARTS, date=DATE, record={"job": "J-2041/B", "revision": "4"})
    head = html[html.index('<table class="ident">'):html.index("</header>")]
    assert 'data-src="report:job">J-2041/B<' in head and 'data-src="report:revision">4<' in head
    assert 'data-src="case:extras/record/project">Dock 2 canopy' in head
    assert f'data-src="report:date">{DATE}<' in head
    with pytest.raises(ValueError, match="unknown identification field 'client'"):
        build_report(res, figures={}, parts=PARTS, record={"client": "x"})


@pytest.mark.parametrize("extra, field", [('\n[record]\nclient = "x"\n', "record.client"),
                                          ('\n[record]\ndate = "01/03/2026"\n', "record.date"),
                                          ('\n[record]\njob = ["a"]\n', "record.job"),
                                          ('\n[record]\nproject = "a\\nb"\n', "record.project")])
def test_bad_record_fields_are_refused_by_name(extra, field):
    with pytest.raises(CaseError) as err:
        parse_case(_record_case(extra))
    assert field in str(err.value)


def test_report_command_takes_the_fields_and_prints_the_case_file(tmp_path, capsys):
    from fea.cli import main

    src = tmp_path / "post.toml"
    text = _record_case()
    src.write_text(text, encoding="utf-8")
    out, md = tmp_path / "post.html", tmp_path / "post.md"
    code = main(["report", str(src), "-o", str(out), "--markdown", str(md), "--date", DATE,
                 "--project", "Quay 4 (invented)", "--checked-by", "C. Reviewer", "--prepared-by", "D. Author"])
    assert code == 0
    html = out.read_text(encoding="utf-8")
    head = html[html.index('<table class="ident">'):html.index("</header>")]
    assert 'data-src="report:project">Quay 4 (invented)<' in head
    assert 'data-src="report:checked_by">C. Reviewer<' in head and 'data-src="report:prepared_by">D. Author<' in head
    assert 'data-src="case:extras/record/job">J-2041<' in head
    # the appendix: the case file verbatim, as the last part, its text the analysed bytes
    page = parse_page(html)
    verbatim = [r for r in page.sourced if r["src"] == "file:case"]
    assert len(verbatim) == 1 and verbatim[0]["text"] == text
    assert [t for h, t in page.headings if h == "h2"][-1] == "Appendix: the case file"
    markdown = md.read_text(encoding="utf-8")
    fenced = markdown[markdown.index("```text\n") + len("```text\n"):]
    assert fenced.startswith(text.rstrip("\n") + "\n```\n")
    # the appendix can be left out; an option's text is checked like the table's
    assert main(["report", str(src), "-o", str(tmp_path / "b.html"), "--no-case-file"]) == 0
    assert "file:case" not in (tmp_path / "b.html").read_text(encoding="utf-8")
    with pytest.raises(SystemExit):
        main(["report", str(src), "-o", str(tmp_path / "c.html"), "--job", "x" * 300])
    assert not (tmp_path / "c.html").exists()


def test_appendix_fence_survives_backticks_and_refuses_another_case(runs):
    from markdown_it import MarkdownIt

    text = _record_case('\n[[load]]\nat = "top"\naxial = "0 kN"\nnote = """\n````\n# not a heading\n"""\n')
    case = parse_case(text)
    res = run_case(case)
    md = build_markdown(res, figures={}, parts=PARTS, date=DATE, case_text=text)
    rendered = MarkdownIt().render(md)
    assert "<h1>not a heading</h1>" not in rendered and "# not a heading" in rendered
    with pytest.raises(ValueError, match="SHA-256"):
        build_markdown(res, figures={}, parts=PARTS, date=DATE, case_text=text + " ")


# -- precision, notation, words ---------------------------------------------------------------------


@pytest.mark.parametrize("name", ["crane_column", "design_hall_column", "study_three_segment", "tapered_pole"])
def test_effective_length_factors_as_the_summary_prints_them(runs, name):
    case, res, data, html, md = runs[name]
    shown = {r["src"]: r["text"] for r in parse_page(html).sourced}
    lines = "\n".join(summary(res))
    n = 0
    for i, b in enumerate(data["buckling"]):
        for j, s in enumerate(b["segments"]):
            K = s["effective_length_factor"]
            if K is None:
                continue
            text = shown[f"json:buckling/{i}/segments/{j}/effective_length_factor"]
            assert text == f"{K:.3f}", (text, K)  # fea/io/summary.py prints K with :.3f
            assert f" {K:.3f} " in lines
            n += 1
    assert n >= 1
    # the other figures of the table: four significant figures, as the summary's fmt
    s0 = data["buckling"][0]["segments"][0]
    assert shown["json:buckling/0/segments/0/critical_axial_force_N"] == fmt_number(
        s0["critical_axial_force_N"] / 1e3 if case.display.force == "kN" else s0["critical_axial_force_N"], 4)


#: Each standard's own symbols in the head of the summary of the checks (the standards' notation:
#: EN 1993-1-1 6.3.1.1 N_Ed, N_b,Rd; AISC 360 E1 P_u, phi_c P_n (LRFD), P_a, P_n / Omega_c (ASD);
#: AS 4100 6.1 N*, phi N_c; BS 5950-1 4.7.4 F_c, P_c; from memory).
NOTATION = {
    "EN 1993-1-1": ("<i>N</i><sub>Ed</sub>", "<i>N</i><sub>b,Rd</sub>"),
    "AISC 360 LRFD": ("<i>P</i><sub>u</sub>", "<i>φ</i><sub>c</sub> <i>P</i><sub>n</sub>"),
    "AISC 360 ASD": ("<i>P</i><sub>a</sub>", "<i>P</i><sub>n</sub> / <i>Ω</i><sub>c</sub>"),
    "AS 4100": ("<i>N*</i>", "<i>φ</i> <i>N</i><sub>c</sub>"),
    "BS 5950-1": ("<i>F</i><sub>c</sub>", "<i>P</i><sub>c</sub>"),
    "Perry-Robertson": ("Axial load <i>N</i>", "Allowable load <i>N</i><sub>R</sub>"),
    "Rankine-Gordon": ("Axial load <i>N</i>", "Allowable load <i>N</i><sub>R</sub>"),
    "working-stress": ("Axial load at the case loads <i>N</i>", "Allowable load <i>N</i><sub>R</sub>"),
}


@pytest.mark.parametrize("name", list(DESIGNS))
def test_design_summary_in_each_standards_notation(name):
    from .test_design_integration import stepped

    case = parse_case(stepped("[design]\n" + DESIGNS[name] + NET_SECTION, top="-60 kN", step="900 kN"))
    res = run_case(case)
    html = build_report(res, figures={}, parts=PARTS, date=DATE)
    table = html[html.index("Summary of the checks"):]
    head = table[:table.index("</thead>")]
    force, resistance = NOTATION[name]
    assert force in head and resistance in head
    assert "<th></th>" not in head and "<th>Governing</th>" in head  # the marker's column has a header
    others = {s for k, v in NOTATION.items() if k != name for s in v} - set(NOTATION[name])
    assert not [s for s in others if s in head and not any(s in own for own in NOTATION[name])]


#: snake_case words: two or more lower-case words joined by underscores.
SNAKE = re.compile(r"(?<![\w./-])[a-z]{2,}(?:_[a-z0-9]+)+(?![\w/])")


def _quoted_texts(data) -> set[str]:
    """The snake_case words inside the texts the report quotes verbatim from the result (formulas as recorded,
    solver messages): the result's wording, not the report's."""
    out: set[str] = set()

    def walk(v):
        if isinstance(v, dict):
            for x in v.values():
                walk(x)
        elif isinstance(v, list):
            for x in v:
                walk(x)
        elif isinstance(v, str):
            out.update(SNAKE.findall(v))

    walk({k: v for k, v in data.items() if k not in ("case_file",)})
    return out


@pytest.mark.parametrize("path", CASES, ids=[p.stem for p in CASES])
def test_the_report_speaks_in_engineering_words(runs, path):
    case, res, data, html, md = runs[path.stem]
    text = md.replace("\\_", "_")
    text = text.replace(case.source, "")  # the case file's path
    text = re.sub(r"\]\([^)]*\)", "]", text)  # the figure files of the Markdown
    found = set(SNAKE.findall(text)) - _quoted_texts(data)
    assert not found, found
