"""The calculation report as headless Chromium renders, screenshots and prints it (issue 7).

Kept apart from ``test_report.py`` so that the browser's runs and the report's other checks share the
test workers.
"""

from __future__ import annotations

import os
import re
import shutil
import subprocess
import tempfile
import xml.etree.ElementTree as ET
from pathlib import Path

import pytest

from tests.test_report import _Runs, parse_page


@pytest.fixture(scope="module")
def runs() -> dict:
    """Each demo case run once, on first use (as in ``test_report.py``)."""
    return _Runs()


CHROMIUM = shutil.which("chromium") or shutil.which("chromium-browser")
FLAGS = ["--headless", "--no-sandbox", "--disable-gpu", "--disable-quic", "--no-first-run",
         "--disable-background-networking", "--disable-component-update", "--disable-sync",
         "--no-pdf-header-footer", "--hide-scrollbars"]


@pytest.fixture(scope="module")
def browser():
    if CHROMIUM is None:
        if os.environ.get("CI") == "true":
            pytest.fail("chromium is not installed: .ci/run must install Debian's chromium package")
        pytest.skip("chromium is not installed on this machine (Debian package `chromium`); the browser checks "
                    "of the report were not run")
    return CHROMIUM


#: Nothing the browser sends may leave the machine: every request goes to a closed loopback port.
DEAD_PROXY = "http://127.0.0.1:9"


def _chromium(browser: str, *args: str) -> subprocess.CompletedProcess:
    with tempfile.TemporaryDirectory(prefix="stanchion-chromium-") as profile:
        return subprocess.run([browser, *FLAGS, f"--user-data-dir={profile}", f"--proxy-server={DEAD_PROXY}",
                               "--proxy-bypass-list=<-loopback>", "--enable-logging=stderr", "--v=0", *args],
                              capture_output=True, text=True, timeout=90)


def _blocked(stderr: str) -> list[str]:
    """Console lines of the page reporting a load it attempted (blocked by the policy or failed)."""
    return [line for line in stderr.splitlines() if "CONSOLE" in line and
            ("Content Security Policy" in line or "net::ERR" in line or "Failed to load" in line)]


def _pdf_pages(pdf: Path) -> list[tuple[float, float]]:
    data = pdf.read_bytes()
    boxes = re.findall(rb"/MediaBox\s*\[\s*([\d.]+)\s+([\d.]+)\s+([\d.]+)\s+([\d.]+)\s*\]", data)
    pages = len(re.findall(rb"/Type\s*/Page\b(?!s)", data))
    assert pages > 0, "no page objects found in the PDF"
    size = [(float(b[2]) - float(b[0]), float(b[3]) - float(b[1])) for b in boxes]
    return size[:pages] if len(size) >= pages else size + [size[-1]] * (pages - len(size))


@pytest.mark.parametrize("name", ["shed_column", "design_hall_column"])
def test_report_in_headless_chromium(runs, browser, tmp_path, name):
    case, res, data, html = runs[name]
    src = tmp_path / f"{name}.html"
    src.write_text(html, encoding="utf-8")
    dom = _chromium(browser, "--dump-dom", src.as_uri())
    assert dom.returncode == 0, dom.stderr[-2000:]
    png = tmp_path / f"{name}.png"
    shot = _chromium(browser, f"--screenshot={png}", "--window-size=1000,1400", src.as_uri())
    assert shot.returncode == 0 and png.read_bytes()[:8] == b"\x89PNG\r\n\x1a\n", shot.stderr[-2000:]
    assert png.stat().st_size > 20_000  # a rendered page, not a blank one
    pdfs = {}
    for paper, css in (("letter", "letter"), ("a4", "A4")):
        page_src = tmp_path / f"{name}-{paper}.html"
        page_src.write_text(html.replace("</style>", f"@page {{ size: {css}; }}</style>", 1), encoding="utf-8")
        pdfs[paper] = tmp_path / f"{name}-{paper}.pdf"
        run = _chromium(browser, f"--print-to-pdf={pdfs[paper]}", page_src.as_uri())
        assert run.returncode == 0 and pdfs[paper].exists(), run.stderr[-2000:]
    # no request leaves the file: the page's policy forbids any fetch, and the page attempted none
    assert "default-src 'none'" in html and "<script" not in html.lower()
    assert _blocked(dom.stderr) == [] and _blocked(shot.stderr) == []
    # the check above can see an attempt: the same page with one outside image reports it
    canary = tmp_path / "canary.html"
    canary.write_text(html.replace("<body>", '<body><img src="http://127.0.0.1:9/canary.png" alt="">', 1),
                      encoding="utf-8")
    control = _chromium(browser, "--dump-dom", canary.as_uri())
    assert any("canary.png" in line for line in _blocked(control.stderr)), control.stderr[-2000:]
    page = parse_page(dom.stdout)
    for tag, attr, value in page.attrs:
        if attr in ("src", "href", "xlink:href", "action", "poster", "data") and not attr.startswith("xmlns"):
            assert not re.match(r"\s*(https?:|//|file:)", value), f"<{tag} {attr}={value!r}> fetches from outside"
        assert not (tag == "img" and attr == "src" and not value.startswith("data:")), f"<img src={value!r}>"
    # every part heading is on the rendered page, and the numbers survive the browser's parsing
    titles = [t for h, t in page.headings if h == "h2"]
    expected = ["Inputs", "Method", "Elastic critical buckling", *(["Design check"] if "design" in data else []),
                "Warnings, limitations and cautions"]
    assert titles == expected
    assert [t for h, t in page.headings if h == "h1"] == [data["title"]]
    assert not page.loose
    # no broken image: every inline SVG is well-formed XML with a size, no <img> at all
    svgs = re.findall(r"<svg\b.*?</svg>", html, flags=re.S)
    assert len(svgs) >= 2 + ("design" in data)
    for svg in svgs:
        root = ET.fromstring(svg)
        assert root.get("viewBox"), "inline SVG without a viewBox"
    assert dom.stdout.count("<svg") == len(svgs) and "<img" not in dom.stdout
    # printed: one page or more per part (each part starts a page), on US letter and A4
    n_parts = dom.stdout.count('<section class="part')
    for paper, (w, h) in (("letter", (612, 792)), ("a4", (595.3, 841.9))):
        sizes = _pdf_pages(pdfs[paper])
        assert len(sizes) >= n_parts, f"{paper}: {len(sizes)} pages for {n_parts} parts"
        assert all(abs(sw - w) < 1.5 and abs(sh - h) < 1.5 for sw, sh in sizes), (paper, sizes[:2])


# -- the design part written out as a hand calculation ----------------------------------------------

#: The stepped test column of the design tests, with uplift at the top (the upper part in tension) and a
#: net section at holes in the upper part.


# -- hostile text from the case (issue 11): shown as text, never as markup ---------------------------

#: What a case's texts may try: end the style sheet, an attribute or a CDATA section, open a comment,
#: break a CSS or Markdown string with backslashes, quotes and escaped line breaks (a real line break or
#: other control character in a text is refused when the case is read).
HOSTILE = ('</style><h1 id="inj{i}">ALL CHECKS PASS</h1> "><script>alert(1)</script><b id="inj{i}b">x</b> ]]> */ '
           "--> <!-- \\ \\\" ' ` | * _ [a](http://127.0.0.1:9/x) \\n\\r<i id=\"inj{i}c\">line</i> & &amp; end{i}")


def _hostile_case() -> tuple[str, int]:
    """The design demo case with a hostile text in every text field it can carry; the number of fields."""
    import json

    text = (Path(__file__).resolve().parents[1] / "cases" / "design_hall_column.toml").read_text(encoding="utf-8")
    n = [0]

    def hostile() -> str:
        n[0] += 1
        return json.dumps(HOSTILE.format(i=n[0]))

    lines = []
    for line in text.splitlines():
        if re.match(r"(title|name)\s*=", line):
            line = f"{line.split('=')[0]}= {hostile()}"
        lines.append(line)
        if line.strip() in ("[[restraint]]", "[[load]]"):
            lines.append(f"note = {hostile()}")
    return "\n".join(lines) + "\n", n[0]


def test_hostile_case_texts_stay_text_in_chromium_and_markdown(browser, tmp_path):
    from markdown_it import MarkdownIt

    from tests.conftest import run_cli

    text, fields = _hostile_case()
    assert fields >= 8
    case = tmp_path / "hostile.toml"
    case.write_text(text, encoding="utf-8")
    run = run_cli("report", str(case), "-o", str(tmp_path / "r.html"), "--markdown", str(tmp_path / "r.md"))
    assert run.returncode in (0, 1), run.stderr
    html_text = (tmp_path / "r.html").read_text(encoding="utf-8")
    md_html = tmp_path / "md.html"
    md_html.write_text("<!DOCTYPE html><html><body>" + MarkdownIt().render((tmp_path / "r.md").read_text())
                       + "</body></html>", encoding="utf-8")
    for page, n_h1 in ((tmp_path / "r.html", 1), (md_html, 1)):
        dom = _chromium(browser, "--dump-dom", page.as_uri())
        assert dom.returncode == 0, dom.stderr[-2000:]
        out = dom.stdout
        # no element the case's texts tried to inject exists; the one heading of level 1 is the title
        tags = _start_tags(out)
        assert not [t for t in tags if t[0] == "script" or any(v.startswith("inj") for _, v in t[1])], page.name
        assert [t for t in tags if t[0] == "h1"] == [("h1", [])] * n_h1, page.name
        assert not [t for t in tags if t[0] == "a" and any(v.startswith("http") for _, v in t[1])], page.name
        parsed = parse_page(out)
        h1 = [t for h, t in parsed.headings if h == "h1"]
        assert len(h1) == 1 and "ALL CHECKS PASS" in h1[0] and "alert(1)" in h1[0] and "end1" in h1[0], h1
        # the fields the record prints (title, material, segment names) show up as text; notes are not printed
        for i in range(1, 5):
            assert f"end{i}" in out, (page.name, i)
    # the title reaches the printed page's running head as a CSS string, never as markup
    style = html_text[html_text.index("<style>") + len("<style>"):html_text.index("</style>")]
    assert "<" not in style and "ALL" in style


def _start_tags(page: str) -> list[tuple[str, list[tuple[str, str]]]]:
    """Every start tag of a page, with its attributes, as an HTML parser reads them."""
    from html.parser import HTMLParser

    class Tags(HTMLParser):
        def __init__(self) -> None:
            super().__init__()
            self.tags: list[tuple[str, list[tuple[str, str]]]] = []

        def handle_starttag(self, tag, attrs):
            self.tags.append((tag, [(k, v or "") for k, v in attrs]))

    p = Tags()
    p.feed(page)
    p.close()
    return p.tags


def test_renderers_escape_text_for_every_context():
    # through the API a text may still hold a line break: the renderers escape whatever they are given
    from fea.report.html import _css_string
    from fea.report.markdown import _esc

    css = _css_string('a</style>"\\\n*/ b')
    assert css.startswith('"') and css.endswith('"') and not any(c in css[1:-1] for c in '<>"\n')
    assert css.count("\\") == 5  # '<', '>', '"', '\\' and '*' as hexadecimal escapes; '/' kept
    md = _esc("a | b\n# c [x](y) <i> \\* & `z`")
    assert "\n" not in md and "<" not in md and "\\|" in md and "\\#" in md and "\\\\\\*" in md
