"""`stanchion explore`: the state behind the page, the saved case file and the server's security (issue 16).

Everything here runs in this process (the server on port 0 in a thread), except the two real-process tests
at the end (Ctrl-C and the idle time).  The page in a real browser is tested in test_explore_browser.py.
The reference answers are the tool's own (`fea.pipeline.run_case` on the same changed case): the explorer
must give exactly what `stanchion check` gives for the same values.
"""

from __future__ import annotations

import http.client
import json
import math
import os
import shutil
import signal
import subprocess
import sys
import time
from pathlib import Path

import numpy as np
import pytest

from fea.errors import CaseError, FeaError
from fea.explore.fast import OneSpringPlane
from fea.explore.inputs import STEPS
from fea.explore.save import save_target, saved_text
from fea.explore.server import CSP, ExploreServer
from fea.explore.state import Explorer, rebuild
from fea.pipeline import parse_case, run_case
from fea.solve.eigen import buckling
from fea.study.paths import parse_key
from fea.study.target import StudyCase
from tests.conftest import ROOT, run_cli

CASES = ROOT / "cases"
GIRTS = "study_girt_braced_column.toml"


def _explorer(name: str, folder: Path | None = None) -> Explorer:
    src = CASES / name
    if folder is not None:
        shutil.copy(src, folder / name)
        src = folder / name
    return Explorer.from_file(src)


def _library(ex: Explorer, changes: dict[str, float]):
    """The tool's own answer for the same changed values: springs on the parsed case, others through the
    document and the case-file parser, then the whole pipeline (as `stanchion check`)."""
    keys = tuple(parse_key(k) for k in changes)
    case = StudyCase(parse_case(ex.text, source=ex.source), rebuild).with_values(keys, tuple(changes.values()))
    return run_case(case)


@pytest.fixture(scope="module")
def girts() -> Explorer:
    return _explorer(GIRTS)


@pytest.fixture(scope="module")
def shed() -> Explorer:
    return _explorer("shed_column.toml")


# -- the sliders --------------------------------------------------------------------------------------------------

def test_every_uncertain_input_is_a_slider(shed):
    keys = [s.key for s in shed.sliders]
    # both springs of every [[restraint]] table, the axial load and the leaning load
    assert keys == [f"restraint[{i}].{k}" for i in range(1, 5) for k in ("lateral", "rotation")] + \
        ["load[1].axial", "leaning[1].load"]
    s = shed.by_key["restraint[4].lateral"]
    assert s.spring and s.scale == "log" and s.free_end and s.rigid_end
    assert s.initial == pytest.approx(0.8e6) and s.lo <= 0.8e6 / 100 and s.hi >= 0.8e6 * 100
    assert s.value_at(0) == 0.0 and math.isinf(s.value_at(STEPS))
    assert s.text(s.initial) == "800 kN/m" and s.text(0.0) == "free" and s.text(math.inf) == "rigid"
    # the rafter of restraint 2 adds to its rotational spring: the slider is the table's own value (free)
    top = shed.by_key["restraint[2].rotation"]
    assert top.initial == 0.0 and "restraining beams" in top.offset_note
    load = shed.by_key["load[1].axial"]
    assert load.scale == "linear" and load.lo == 0.0 and load.hi == pytest.approx(3 * 185e3)
    for s in shed.sliders:  # positions map back to themselves
        for pos in (0, 1, 317, STEPS - 1, STEPS):
            assert s.position(s.value_at(pos)) == pos


def test_foundation_and_bow_sliders():
    pile = _explorer("pile_in_soft_soil.toml")
    found = {s.key: s for s in pile.sliders if s.group == "Foundations"}
    assert set(found) == {"foundation[1].modulus_bottom", "foundation[1].modulus_top"}
    assert found["foundation[1].modulus_top"].initial == 0.0  # zero at the top: the bottom's range, from zero
    assert found["foundation[1].modulus_top"].lo > 0 and found["foundation[1].modulus_top"].free_end
    post = _explorer("crooked_post.toml")
    bow = post.by_key["imperfection.bow"]
    assert bow.dimension == "ratio" and bow.initial == 1000.0 and bow.text(bow.initial) == "L/1000"
    assert bow.parse("L/500") == 500.0 and bow.parse("250") == 250.0


def test_typed_values(shed):
    s = shed.by_key["restraint[4].lateral"]
    assert s.parse("250") == pytest.approx(250e3)           # a number in the display unit (kN/m)
    assert s.parse("0.25 MN/m") == pytest.approx(250e3)     # or a quantity with its own unit
    assert s.parse("free") == 0.0 and math.isinf(s.parse("rigid"))
    for bad in ("abc", "-5", "5 kN", ""):
        with pytest.raises(FeaError, match=r"restraint\[4\]\.lateral"):
            s.parse(bad)


# -- the results ----------------------------------------------------------------------------------------------------

def _close(a: float, b: float, rtol: float) -> bool:
    return abs(a - b) <= rtol * abs(b)


def test_one_spring_path_gives_what_check_gives(girts):
    ex = girts
    key = "restraint[3].lateral"
    ex.reset()
    ex.prepare(key)
    s = ex.by_key[key]
    for pos in (120, s.position(s.initial) + 37, 760, STEPS):
        ex.set_position(key, pos)
        out = ex.preview(key)
        assert out.error is None and out.path == "one spring"
        lib = _library(ex, {key: s.value_at(pos)})
        for r, ref in zip(out.results.buckling, lib.buckling):
            # exact on its mesh; both meshes are converged to the case tolerance 1e-6
            assert _close(r.load_factor, ref.load_factor, 1e-6), (pos, r.axis)
            for a, b in zip(r.segments, ref.segments):
                assert _close(a.effective_length_factor, b.effective_length_factor, 1e-6)
                assert a.meaningful == b.meaningful
            common = np.intersect1d(np.round(r.heights, 9), np.round(ref.heights, 9))  # the coarser mesh's nodes
            assert np.max(np.abs(np.interp(common, r.heights, r.modes[0])
                                 - np.interp(common, ref.heights, ref.modes[0]))) < 1e-5
    ex.reset()


def test_banded_path_matches_the_solver():
    # the path for planes too large for the dense decomposition, on a small plane so that it runs fast
    case = parse_case((CASES / "shed_column.toml").read_text())
    col = case.column("minor")
    plane = OneSpringPlane.build(col, 1, "lateral", 0.0, math.inf, case.tolerance, "minor", dense=False)
    assert plane.study is None
    for k in (0.0, 2e4, 8e5, 5e7, math.inf):
        ck = col.with_restraint(1, lateral=k)
        got = plane.result(ck, k)
        ref = buckling(ck, n_modes=1, tol=case.tolerance)
        assert _close(got.load_factor, ref.load_factor, 1e-6), k
        assert _close(got.segments[0].effective_length_factor, ref.segments[0].effective_length_factor, 1e-6)


def test_other_inputs_re_solve_and_the_rest_gives_every_analysis(shed):
    ex = shed
    ex.reset()
    ex.set_text("load[1].axial", "300")
    out = ex.preview("load[1].axial")
    assert out.path == "re-solve" and out.error is None
    lib = _library(ex, {"load[1].axial": 300e3})
    assert [r.load_factor for r in out.results.buckling] == pytest.approx([r.load_factor for r in lib.buckling],
                                                                          rel=1e-12)
    full = ex.full()
    assert full.path == "all analyses" and full.pending == ()
    assert [r.load_factor for r in full.results.buckling] == [r.load_factor for r in lib.buckling]
    ex.reset()
    assert ex.overrides() == () and ex.preview(None).results is ex.initial


def test_a_mechanism_is_an_error_on_the_page_not_a_crash(shed, girts):
    ex = shed
    ex.reset()
    ex.prepare("restraint[1].lateral")
    ex.set_text("restraint[1].lateral", "free")  # the base may slide: nothing holds the sway frame sideways
    out = ex.preview("restraint[1].lateral")
    assert out.results is None and "can slide sideways as a rigid body" in out.error
    ex.reset()
    assert ex.preview(None).error is None
    girts.reset()
    girts.set_text("restraint[3].lateral", "free")  # a girt table that holds nothing: the case file's own rule
    out = girts.preview("restraint[3].lateral")
    assert out.results is None and "restraint[3]: restrains nothing" in out.error
    girts.reset()


def test_pending_analyses_are_named():
    ex = _explorer("crooked_post.toml")
    key = "restraint[1].lateral"
    ex.set_position(key, 700)
    out = ex.preview(key)
    # the demo's design check takes M_cr from the thin-walled analysis: it waits for it too
    assert set(out.pending) == {"spatial", "imperfect", "design"}
    assert not {"spatial", "imperfect", "design"} & set(out.results.extras)
    assert set(ex.full().results.extras) >= {"spatial", "imperfect", "design"}


# -- saving ---------------------------------------------------------------------------------------------------------

def test_saved_case_keeps_comments_and_reads_back(tmp_path):
    ex = _explorer(GIRTS, tmp_path)
    ex.set_text("restraint[3].lateral", "250")
    ex.set_text("restraint[1].rotation", "1.5 MN*m/rad")
    text = saved_text(ex)
    original = (CASES / GIRTS).read_text()
    # every comment of the original is still there, in order
    comments = [ln.split("#", 1)[1].strip() for ln in original.splitlines() if "#" in ln]
    at = 0
    for c in comments:
        at = text.index(c, at)
    assert 'lateral = "250 kN/m"' in text and "# lower girt, estimated [explore: was 120 kN/m]" in text
    assert 'rotation = "1500 kN*m/rad"' in text
    case = parse_case(text)
    lib = _library(ex, {"restraint[3].lateral": 250e3, "restraint[1].rotation": 1.5e6})
    assert [r.load_factor for r in run_case(case).buckling] == pytest.approx(
        [r.load_factor for r in lib.buckling], rel=1e-12)


def test_save_rules(tmp_path):
    ex = _explorer(GIRTS, tmp_path)
    server = ExploreServer(ex)
    try:
        ex.set_text("restraint[4].lateral", "90")
        r = server.save({"name": "softer-girts"})
        assert r["saved"] and (tmp_path / "softer-girts.toml").is_file()
        # an existing file is replaced only when asked
        r = server.save({"name": "softer-girts.toml"})
        assert not r["saved"] and r["exists"]
        assert server.save({"name": "softer-girts.toml", "overwrite": True})["saved"]
        # the opened case file only when asked twice, with the confirmation of the first request
        before = (tmp_path / GIRTS).read_text()
        first = server.save({"name": GIRTS, "overwrite": True})
        assert not first["saved"] and first["confirm"]
        assert not server.save({"name": GIRTS, "overwrite": True, "confirm": "guess"})["saved"]
        assert (tmp_path / GIRTS).read_text() == before
        first = server.save({"name": GIRTS, "overwrite": True})
        assert server.save({"name": GIRTS, "overwrite": True, "confirm": first["confirm"]})["saved"]
        assert 'lateral = "90 kN/m"' in (tmp_path / GIRTS).read_text()
    finally:
        server.httpd.server_close()


@pytest.mark.parametrize("name", ["../x", "../../etc/passwd", "/tmp/x", "a/b", "a\\b", "..", ".hidden", "",
                                  "x\x00y", "~/x", "C:x", " "])
def test_save_names_cannot_leave_the_folder(tmp_path, name):
    case = tmp_path / "inner" / GIRTS
    case.parent.mkdir()
    shutil.copy(CASES / GIRTS, case)
    with pytest.raises(CaseError, match="name"):
        save_target(case, name)


def test_save_name_cannot_follow_a_link_out(tmp_path):
    case = tmp_path / "inner" / GIRTS
    case.parent.mkdir()
    shutil.copy(CASES / GIRTS, case)
    (case.parent / "out.toml").symlink_to(tmp_path / "outside.toml")
    with pytest.raises(CaseError, match="not a plain file"):
        save_target(case, "out.toml")
    assert save_target(case, "fine").name == "fine.toml"


# -- the server -----------------------------------------------------------------------------------------------------

@pytest.fixture(scope="module")
def server(tmp_path_factory):
    ex = _explorer(GIRTS, tmp_path_factory.mktemp("serve"))
    srv = ExploreServer(ex).start()
    yield srv
    srv.stop()


def _request(srv: ExploreServer, method: str, path: str, body: object = None, headers: dict | None = None,
             token: str | None = None):
    conn = http.client.HTTPConnection("127.0.0.1", srv.port, timeout=30)
    h = {"Host": f"127.0.0.1:{srv.port}"}
    h.update(headers or {})
    data = None
    if body is not None:
        data = body if isinstance(body, bytes) else json.dumps(body).encode()
        h.setdefault("Content-Type", "application/json")
    conn.request(method, f"/{srv.token if token is None else token}/{path}", body=data, headers=h)
    r = conn.getresponse()
    out = (r.status, dict(r.getheaders()), r.read())
    conn.close()
    return out


def test_listens_on_the_loopback_address_only(server):
    assert server.address[0] == "127.0.0.1"
    assert server.url.startswith(f"http://127.0.0.1:{server.port}/{server.token}/")
    assert len(server.token) >= 32


def test_page_and_script_are_served_with_a_strict_policy(server):
    code, headers, body = _request(server, "GET", "")
    assert code == 200 and b'<script src="app.js">' in body
    assert headers["Content-Security-Policy"] == CSP and "default-src 'none'" in CSP
    assert headers["Referrer-Policy"] == "no-referrer" and headers["Cache-Control"] == "no-store"
    for name in ("app.js", "app.css"):
        code, _, body = _request(server, "GET", name)
        assert code == 200 and b"http://" not in body and b"https://" not in body and b"//cdn" not in body
    code, _, body = _request(server, "GET", "api/state")
    data = json.loads(body)
    assert code == 200 and data["case"]["title"].startswith("Wall column with girts")
    assert data["result"]["planes"][0]["load_factor"] and "<svg" in data["result"]["figure"]


@pytest.mark.parametrize("headers,token", [
    ({}, "not-the-token"),
    ({}, ""),
    ({"Host": "evil.example"}, None),                       # DNS rebinding: a foreign name for 127.0.0.1
    ({"Host": "evil.example:80"}, None),
    ({"Origin": "http://evil.example"}, None),             # another site's page
    ({"Origin": "null"}, None),
    ({"Sec-Fetch-Site": "cross-site"}, None),
])
def test_foreign_requests_are_refused(server, headers, token):
    for method, path, body in (("GET", "", None), ("GET", "api/state", None),
                               ("POST", "api/set", {"key": "restraint[3].lateral", "pos": 10})):
        rev = server.explorer.rev
        code, _, text = _request(server, method, path, body, headers, token)
        assert code == 403 and text == b"forbidden\n"
        assert server.explorer.rev == rev  # nothing changed


def test_the_interface_rejects_bad_requests(server):
    assert _request(server, "GET", "../../etc/passwd")[0] in (403, 404)
    assert _request(server, "GET", "static/app.js")[0] == 404
    assert _request(server, "POST", "api/set", b"{}", {"Content-Type": "text/plain"})[0] == 415
    assert _request(server, "POST", "api/set", b"x" * 70000)[0] == 413
    code, _, body = _request(server, "POST", "api/set", {"key": "restraint[9].lateral", "pos": 3})
    assert code == 400 and "not a slider" in json.loads(body)["error"]
    code, _, body = _request(server, "POST", "api/save", {"name": "../escape"})
    assert code == 400 and "only a file name" in json.loads(body)["error"]
    assert not (Path(server.explorer.source).parent.parent / "escape.toml").exists()
    assert _request(server, "DELETE", "api/state")[0] == 405


def test_a_move_and_its_settle_over_http(server):
    key = "restraint[4].lateral"
    code, _, body = _request(server, "POST", "api/prepare", {"key": key})
    assert code == 200
    code, _, body = _request(server, "POST", "api/set", {"key": key, "pos": 640})
    data = json.loads(body)
    assert code == 200 and data["path"] == "one spring" and data["values"][key]["changed"]
    code, _, body = _request(server, "POST", "api/settle", {})
    full = json.loads(body)
    assert full["path"] == "all analyses" and full["rev"] == data["current_rev"]
    assert [p["load_factor"] for p in full["planes"]] == [p["load_factor"] for p in data["planes"]]
    code, _, body = _request(server, "POST", "api/reset", {})
    assert not json.loads(body)["values"][key]["changed"]


def test_idle_time_stops_the_server_cleanly():
    srv = ExploreServer(_explorer("tapered_pole.toml"), idle_timeout=0.3).start()
    t0 = time.monotonic()
    assert srv.wait(poll=0.05) == "idle"
    assert time.monotonic() - t0 < 5.0
    srv.stop()
    with pytest.raises(OSError):
        http.client.HTTPConnection("127.0.0.1", srv.port, timeout=2).request("GET", "/")


# -- the command ----------------------------------------------------------------------------------------------------

def test_command_help_and_bad_input():
    out = run_cli("explore", "--help")
    assert out.returncode == 0 and "--no-browser" in out.stdout
    out = run_cli("explore", "cases/no_such_case.toml", "--no-browser")
    assert out.returncode == 2 and out.stderr.count("\n") == 1 and "does not exist" in out.stderr
    out = run_cli("explore", "cases/shed_column.toml", "--port", "99999")
    assert out.returncode == 2


def _start(*args: str) -> tuple[subprocess.Popen, str]:
    env = {**os.environ, "PYTHONUNBUFFERED": "1"}
    proc = subprocess.Popen([sys.executable, "-m", "fea", "explore", f"cases/{GIRTS}", "--no-browser", *args],
                            cwd=ROOT, stdout=subprocess.PIPE, stderr=subprocess.PIPE, text=True, env=env)
    url = ""
    for _ in range(3):
        line = proc.stdout.readline()
        if "http://" in line:
            url = line.split()[-1]
            break
    assert url.startswith("http://127.0.0.1:"), proc.stderr.read() if proc.poll() is not None else url
    return proc, url


def test_real_process_stops_on_ctrl_c():
    proc, url = _start()
    try:
        port, token = int(url.split(":")[2].split("/")[0]), url.split("/")[3]
        conn = http.client.HTTPConnection("127.0.0.1", port, timeout=30)
        conn.request("GET", f"/{token}/api/state")
        assert conn.getresponse().status == 200
        conn.close()
        proc.send_signal(signal.SIGINT)
        _, err = proc.communicate(timeout=30)
    finally:
        proc.kill()
    assert proc.returncode == 0 and "stopped (Ctrl-C)" in err and "Traceback" not in err


def test_real_process_stops_when_idle():
    proc, _ = _start("--idle-timeout", "0.02")  # 1.2 s
    try:
        _, err = proc.communicate(timeout=60)
    finally:
        proc.kill()
    assert proc.returncode == 0 and "without a request" in err
