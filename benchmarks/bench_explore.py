"""Latency of `stanchion explore`: from a slider move to the redrawn numbers and mode shape, per demo case.

Run:  python benchmarks/bench_explore.py [CASE ...] [--moves N]

For every demo case (or the cases named) one restraint spring is moved (the first spring the case gives a
finite stiffness, else the first spring), N times (default 50) by two slider positions, starting a little
below the file's value.  Printed per case:

* server [ms]: median time the server spends on one move, measured in this process over the same moves:
  ``state`` the results alone (the one-spring path), ``total`` the whole request (results, figure, JSON);
* browser [ms]: median and 90th percentile of the time headless Chromium measures from the slider's
  ``input`` event to the first frame after the page has redrawn the numbers and the mode shape
  (``window.__explore.latencies``), over N moves sent one after another;
* re-solve [ms]: for comparison, the browser's median over 10 moves of an axial-load slider (a re-solve of
  the buckling of every plane, not the one-spring path).

Targets (issue 16): browser median < 50 ms for every demo case, server total < 5 ms for a single-spring
change.  The machines are shared and noisy: read the figures side by side.  Needs Debian's chromium and
chromium-driver for the browser columns (the server columns are printed without them).
"""

from __future__ import annotations

import argparse
import math
import os
import shutil
import statistics
import time
from pathlib import Path

os.environ.setdefault("OPENBLAS_NUM_THREADS", "1")  # one BLAS thread: small solves, a shared machine

from fea.explore.inputs import STEPS  # noqa: E402
from fea.explore.server import ExploreServer  # noqa: E402
from fea.explore.state import Explorer  # noqa: E402

ROOT = Path(__file__).resolve().parents[1]
MOVE = """
const [key, pos] = arguments;
const r = document.querySelector(`input[type=range][data-key="${key}"]`);
r.value = pos;
r.dispatchEvent(new Event("input", {bubbles: true}));
"""


def browser():
    chromium = shutil.which("chromium") or shutil.which("chromium-browser")
    driver = shutil.which("chromedriver")
    if not (chromium and driver):
        return None
    from selenium import webdriver
    from selenium.webdriver.chrome.service import Service

    opts = webdriver.ChromeOptions()
    opts.binary_location = chromium
    for a in ("--headless=new", "--no-sandbox", "--disable-gpu", "--disable-dev-shm-usage", "--window-size=1400,1000",
              "--no-first-run",
              "--disable-background-networking", "--disable-component-update"):
        opts.add_argument(a)
    return webdriver.Chrome(service=Service(driver), options=opts)


def _wait(d, script: str, timeout: float = 120.0):
    t0 = time.monotonic()
    while time.monotonic() - t0 < timeout:
        v = d.execute_script(script)
        if v:
            return v
        time.sleep(0.002)
    raise TimeoutError(script)


def positions(ex: Explorer, key: str, n: int) -> list[int]:
    s = ex.by_key[key]
    p0 = min(max(s.position(s.initial) - n, 1), STEPS - 2 * n - 1)
    return [p0 + 2 * i for i in range(n)]


def spring_key(ex: Explorer) -> str:
    springs = [s for s in ex.sliders if s.spring]
    finite = [s for s in springs if 0 < s.initial < math.inf]
    return (finite or springs)[0].key


def server_times(ex: Explorer, key: str, moves: list[int]) -> tuple[float, float, str]:
    import json

    srv = ExploreServer(ex)
    try:
        ex.prepare(key)
        srv.set({"key": key, "pos": moves[0]})
        state, total, paths = [], [], set()
        for pos in moves:
            t0 = time.perf_counter()
            data = srv.set({"key": key, "pos": pos})
            json.dumps(data)
            total.append(time.perf_counter() - t0)
            state.append(data["server_ms"] / 1e3)
            paths.add(data["path"])
        ex.reset()
        return 1e3 * statistics.median(state), 1e3 * statistics.median(total), "/".join(sorted(paths))
    finally:
        srv.httpd.server_close()


def browser_times(d, ex: Explorer, key: str, moves: list[int]) -> list[float]:
    with ExploreServer(ex) as srv:
        d.get(srv.url)
        _wait(d, "return window.__explore && window.__explore.ready")
        d.execute_script(f"document.querySelector('input[type=range][data-key=\"{key}\"]').focus()")  # prepares
        d.execute_script(MOVE, key, moves[0])
        _wait(d, "return window.__explore.latencies.length >= 1")
        n0 = d.execute_script("return window.__explore.latencies.length")
        for i, pos in enumerate(moves):
            d.execute_script(MOVE, key, pos)
            _wait(d, f"return window.__explore.latencies.length >= {n0 + i + 1}")
        return list(d.execute_script("return window.__explore.latencies")[n0:])


def main() -> None:
    ap = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    ap.add_argument("cases", nargs="*", help="case files (default: every case in cases/)")
    ap.add_argument("--moves", type=int, default=50, help="slider moves per case (default 50)")
    args = ap.parse_args()
    files = [Path(c) for c in args.cases] or sorted((ROOT / "cases").glob("*.toml"))
    d = browser()
    if d is None:
        print("chromium or chromedriver not found: the browser columns are left out\n")
    print(f"{'case':<34} {'slider':<22} {'server state':>12} {'server total':>12} {'browser med':>11} "
          f"{'browser p90':>11} {'re-solve':>9}  path")
    worst_browser, worst_server = 0.0, 0.0
    try:
        for f in files:
            ex = Explorer.from_file(f)
            key = spring_key(ex)
            moves = positions(ex, key, args.moves)
            state, total, path = server_times(ex, key, moves)
            worst_server = max(worst_server, total)
            med = p90 = resolve = math.nan
            if d is not None:
                lat = browser_times(d, ex, key, moves)
                med = statistics.median(lat)
                p90 = sorted(lat)[int(0.9 * (len(lat) - 1))]
                worst_browser = max(worst_browser, med)
                loads = [s.key for s in ex.sliders if s.key.startswith(("load[", "segment["))]
                if loads:
                    ex.reset()
                    resolve = statistics.median(browser_times(d, ex, loads[0], positions(ex, loads[0], 10)))
                ex.reset()
            print(f"{f.name[:34]:<34} {key:<22} {state:12.2f} {total:12.2f} {med:11.1f} {p90:11.1f} "
                  f"{resolve:9.1f}  {path}")
    finally:
        if d is not None:
            d.quit()
    print(f"\nworst median server total {worst_server:.2f} ms (target < 5 ms)", end="")
    print(f"; worst browser median {worst_browser:.1f} ms (target < 50 ms)" if d is not None else "")


if __name__ == "__main__":
    main()
