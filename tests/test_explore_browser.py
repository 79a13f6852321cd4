"""The explorer's page in a real browser: headless Chromium driven by Selenium through Debian's chromedriver
(issue 16).

For two demo cases the page is loaded, a spring slider is moved to three values (two drags, one typed value),
and after each the page must show the lowest load factor of every plane and a segment's K equal to the tool's
own answer for the same value (`fea.pipeline.run_case` on the case with that spring, to 4 significant
figures), with a mode-shape drawing that changed; the browser's console must hold no error and every request
the page made must have gone to its own address on 127.0.0.1.  A case saved from the page is then checked by
`stanchion check --json` to the same numbers.

CI installs Debian's `chromium` and `chromium-driver` (.ci/run); elsewhere the test skips only when they are
absent.
"""

from __future__ import annotations

import json
import math
import os
import shutil
import time

import pytest

from fea.explore.server import ExploreServer
from fea.explore.state import Explorer, rebuild
from fea.pipeline import parse_case, run_case
from fea.study.paths import parse_key
from fea.study.target import StudyCase
from tests.conftest import ROOT, run_cli

CHROMIUM = shutil.which("chromium") or shutil.which("chromium-browser")
DRIVER = shutil.which("chromedriver") or ("/usr/bin/chromedriver" if os.path.exists("/usr/bin/chromedriver") else None)
#: Anything the browser tried to fetch from elsewhere would go to a closed loopback port and fail.
DEAD_PROXY = "http://127.0.0.1:9"


@pytest.fixture(scope="module")
def driver():
    if CHROMIUM is None or DRIVER is None:
        if os.environ.get("CI") == "true":
            pytest.fail("chromium or chromedriver is not installed: .ci/run must install Debian's chromium and "
                        "chromium-driver packages")
        pytest.skip("chromium and chromedriver (Debian packages chromium, chromium-driver) are not installed; the "
                    "explorer's browser test was not run")
    from selenium import webdriver  # the test extra (pyproject.toml)
    from selenium.webdriver.chrome.service import Service

    opts = webdriver.ChromeOptions()
    opts.binary_location = CHROMIUM
    for a in ("--headless=new", "--no-sandbox", "--disable-gpu", "--disable-dev-shm-usage", "--window-size=1400,1000",
              "--no-first-run",
              "--disable-background-networking", "--disable-component-update", "--disable-sync",
              f"--proxy-server={DEAD_PROXY}"):  # loopback is never proxied: only the page itself is reached
        opts.add_argument(a)
    opts.set_capability("goog:loggingPrefs", {"browser": "ALL"})
    d = webdriver.Chrome(service=Service(DRIVER), options=opts)
    d.set_script_timeout(60)
    yield d
    d.quit()


def _keys():
    from selenium.webdriver.common.keys import Keys

    return Keys


def _wait(d, script: str, timeout: float = 60.0):
    t0 = time.monotonic()
    while time.monotonic() - t0 < timeout:
        v = d.execute_script(script)
        if v:
            return v
        time.sleep(0.02)
    raise AssertionError(f"timed out waiting for: {script}")


def _agree(shown: str, exact: float) -> bool:
    """``shown`` is ``exact`` to 4 significant figures (half a unit in the 4th figure, and a hair for round-off
    between the two converged meshes)."""
    value = float(shown)
    unit = 10.0 ** (math.floor(math.log10(abs(exact))) - 3)
    return abs(value - exact) <= 0.5 * unit * (1 + 1e-6) + 1e-6 * abs(exact)


def _library(text: str, key: str, value: float):
    case = StudyCase(parse_case(text), rebuild).with_springs((parse_key(key),), (value,))
    return run_case(case)


MOVE = """
const [key, pos] = arguments;
const r = document.querySelector(`input[type=range][data-key="${key}"]`);
r.focus();
r.value = pos;
r.dispatchEvent(new Event("input", {bubbles: true}));
r.dispatchEvent(new Event("change", {bubbles: true}));
"""


@pytest.mark.parametrize("name,key,segment_axis", [
    ("study_girt_braced_column.toml", "restraint[3].lateral", "minor"),
    ("shed_column.toml", "restraint[1].rotation", "major"),
])
def test_explorer_page_in_headless_chromium(driver, tmp_path, name, key, segment_axis):
    shutil.copy(ROOT / "cases" / name, tmp_path / name)  # a save goes beside the case: keep it in tmp_path
    Keys = _keys()
    ex = Explorer.from_file(tmp_path / name)
    slider = ex.by_key[key]
    with ExploreServer(ex) as srv:
        d = driver
        d.get(srv.url)
        _wait(d, "return window.__explore && window.__explore.ready")
        origin = d.execute_script("return location.origin")
        assert origin == f"http://127.0.0.1:{srv.port}"
        paths = [d.find_element("id", f"mode-{a}").get_attribute("d") for a, _ in ex.case.planes]
        moves = [("drag", slider.position(slider.initial) - 180), ("drag", 845), ("typed", None)]
        for how, pos in moves:
            settled = d.execute_script("return window.__explore.settled")
            if how == "drag":
                d.execute_script(MOVE, key, pos)
                value = slider.value_at(pos)
            else:
                value = slider.initial * 0.37
                box = d.find_element("css selector", f'input[type=text][data-key="{key}"]')
                box.send_keys(Keys.CONTROL, "a")
                box.send_keys(f"{value / slider.unit_si!r}\n")
            _wait(d, f"return window.__explore.settled > {settled}")
            lib = _library(ex.text, key, value)
            for r in lib.buckling:
                shown = d.find_element("id", f"lf-{r.axis}").text
                assert _agree(shown, r.load_factor), (how, value, r.axis, shown, r.load_factor)
            K = lib.plane(segment_axis).segments[0].effective_length_factor
            shown = d.find_element("id", f"K-{segment_axis}-1").text
            assert _agree(shown, K), (how, value, shown, K)
            now = [d.find_element("id", f"mode-{a}").get_attribute("d") for a, _ in ex.case.planes]
            assert now[[a for a, _ in ex.case.planes].index(segment_axis)] != \
                paths[[a for a, _ in ex.case.planes].index(segment_axis)], "the mode shape was not redrawn"
            paths = now
        # the paths of the page: the one-spring path while dragging, every analysis at rest
        seen = d.execute_script("return window.__explore.paths")
        assert "one spring" in seen and seen[-1] == "all analyses"
        # save from the page and check the saved file with the command
        shown = {a: d.find_element("id", f"lf-{a}").text for a, _ in ex.case.planes}
        d.find_element("id", "save-name").send_keys(Keys.CONTROL, "a")
        d.find_element("id", "save-name").send_keys("explored")
        d.find_element("id", "save").click()
        _wait(d, "return document.getElementById('save-message').className === 'ok'")
        saved = tmp_path / "explored.toml"
        out = tmp_path / "explored.json"
        run = run_cli("check", str(saved), "--json", str(out))
        assert run.returncode in (0, 1), run.stderr
        data = json.loads(out.read_text())
        for b in data["buckling"]:
            assert _agree(shown[b["axis"]], b["load_factors"][0])
        assert saved.read_text().count("[explore: was") == 1
        # no console error, no request anywhere but the page's own address
        errors = [e for e in d.get_log("browser") if e["level"] == "SEVERE"]
        assert errors == []
        names = d.execute_script("return performance.getEntriesByType('resource').map(e => e.name)"
                                 ".concat(performance.getEntriesByType('navigation').map(e => e.name))")
        assert names and all(n.startswith(origin + "/") for n in names), names
